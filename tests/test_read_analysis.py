"""End reactions of physical beams read from a linked structural analysis model
(ifc_io.read_analysis.read_linked_reactions) and their use by the ``model`` demand source.

Sources of values:
- The linked models are built here with ifcopenshell.api; all forces are invented test data for the
  mechanism (not a design), written in kN to exercise the FORCEUNIT conversion: 1 kN = 1000 N (SI).
- Local axes of IfcStructuralCurveMember (x along the edge, z in the plane of x and Axis, profile
  (xp, yp) parallel to member (y, z), so z runs along an I section's web): IFC4
  IfcStructuralCurveMember, "Coordinate Systems" and "Material Profile Set Usage".
- Purpose 'ULS' / 'SLS' of load combinations: IFC4 IfcStructuralLoadGroup.Purpose.
- Point reactions on a connection have no own placement; on a member they carry an IfcVertexPoint:
  IFC4 IfcStructuralPointReaction, topology use definitions.
- The real analysis model: ../shared/models/analysis-model-building-ifc4.ifc (see its SOURCES.md).
"""

from __future__ import annotations

import copy
import math

import ifcopenshell
import ifcopenshell.api.attribute
import ifcopenshell.api.context
import ifcopenshell.api.geometry
import ifcopenshell.api.group
import ifcopenshell.api.owner
import ifcopenshell.api.root
import ifcopenshell.api.structural
import ifcopenshell.api.unit
import pytest

from engine.config import DEFAULTS
from engine.demand import resolve_demands, resolve_demands_detailed
from engine.model import Frame, Joint, JointGeometry, Member, Section, joint_id
from ifc_io.read_analysis import is_ultimate_load_group, read_linked_reactions

KN = 1000.0  # N per kN (SI)


class Linked:
    """A small IFC4 model with physical IfcBeams linked to analysis curve members (mm, kN)."""

    def __init__(self, force_prefix: str | None = "KILO", schema: str = "IFC4") -> None:
        f = ifcopenshell.file(schema=schema)
        self.f = f
        if schema == "IFC2X3":  # IFC2X3 requires an owner history on every rooted entity
            person = ifcopenshell.api.owner.add_person(f, identification="T1", family_name="Tester")
            org = ifcopenshell.api.owner.add_organisation(f, identification="INV", name="Invented Org")
            ifcopenshell.api.owner.add_person_and_organisation(f, person=person, organisation=org)
            ifcopenshell.api.owner.add_application(f)
        project = ifcopenshell.api.root.create_entity(f, ifc_class="IfcProject", name="Invented project")
        units = [ifcopenshell.api.unit.add_si_unit(f, unit_type="LENGTHUNIT", prefix="MILLI"),
                 ifcopenshell.api.unit.add_si_unit(f, unit_type="FORCEUNIT", prefix=force_prefix)]
        ifcopenshell.api.unit.assign_unit(f, units=units)
        model_ctx = ifcopenshell.api.context.add_context(f, context_type="Model")
        self.ctx = ifcopenshell.api.context.add_context(f, context_type="Model", context_identifier="Reference",
                                                        target_view="GRAPH_VIEW", parent=model_ctx)
        self.place = f.createIfcLocalPlacement(None, f.createIfcAxis2Placement3D(f.createIfcCartesianPoint((0., 0., 0.))))
        self.sam = ifcopenshell.api.structural.add_structural_analysis_model(f)
        self.sam.Name = "Gravity frame"
        if schema != "IFC2X3":  # IFC4 attribute
            self.sam.SharedPlacement = self.place.RelativePlacement
        assert project is not None

    def _topology(self, product, item, rep_type: str) -> None:
        rep = self.f.createIfcTopologyRepresentation(self.ctx, "Reference", rep_type, [item])
        ifcopenshell.api.geometry.assign_representation(self.f, product=product, representation=rep)
        product.ObjectPlacement = self.place

    def vertex(self, p):
        return self.f.createIfcVertexPoint(self.f.createIfcCartesianPoint(tuple(float(c) for c in p)))

    def beam(self, name: str, a, b, axis=(0.0, 0.0, 1.0)):
        """A physical IfcBeam and its analysis curve member from a to b (mm), linked."""
        phys = ifcopenshell.api.root.create_entity(self.f, ifc_class="IfcBeam", name=name)
        cm = ifcopenshell.api.root.create_entity(self.f, ifc_class="IfcStructuralCurveMember",
                                                 predefined_type="RIGID_JOINED_MEMBER", name=f"{name}-analysis")
        self.va, self.vb = self.vertex(a), self.vertex(b)
        self._topology(cm, self.f.createIfcEdge(self.va, self.vb), "Edge")
        if self.f.schema != "IFC2X3":
            cm.Axis = self.f.createIfcDirection(tuple(float(c) for c in axis))  # IfcStructuralCurveMember.Axis
        ifcopenshell.api.structural.assign_structural_analysis_model(self.f, products=[cm],
                                                                     structural_analysis_model=self.sam)
        ifcopenshell.api.structural.assign_product(self.f, relating_product=cm, related_object=phys)
        return phys, cm

    def node(self, name: str, p, members):
        conn = ifcopenshell.api.root.create_entity(self.f, ifc_class="IfcStructuralPointConnection", name=name)
        self._topology(conn, self.vertex(p), "Vertex")
        for m in members:
            ifcopenshell.api.structural.add_structural_member_connection(
                self.f, relating_structural_member=m, related_structural_connection=conn)
        ifcopenshell.api.structural.assign_structural_analysis_model(self.f, products=[conn],
                                                                     structural_analysis_model=self.sam)
        return conn

    def combination(self, name: str, purpose: str | None, kind: str = "LOAD_COMBINATION"):
        lg = ifcopenshell.api.structural.add_structural_load_group(self.f, name=name)
        ifcopenshell.api.attribute.edit_attributes(self.f, product=lg,
                                                   attributes={"PredefinedType": kind, "Purpose": purpose})
        rg = ifcopenshell.api.root.create_entity(self.f, ifc_class="IfcStructuralResultGroup", name=f"Results {name}")
        ifcopenshell.api.attribute.edit_attributes(self.f, product=rg, attributes={
            "TheoryType": "FIRST_ORDER_THEORY", "ResultForLoadGroup": lg, "IsLinear": True})
        return rg

    def reaction(self, item, force_kN, group=None, local: bool = False, at=None, name: str = "R"):
        """A point reaction with a single force (kN) on ``item``, in result group ``group``; ``at`` (mm)
        gives it a vertex (for a reaction on a member)."""
        load = ifcopenshell.api.structural.add_structural_load(self.f, name=name,
                                                                ifc_class="IfcStructuralLoadSingleForce")
        fx, fy, fz = force_kN
        ifcopenshell.api.structural.edit_structural_load(self.f, structural_load=load,
                                                         attributes={"ForceX": fx, "ForceY": fy, "ForceZ": fz})
        r = self.f.createIfcStructuralPointReaction(ifcopenshell.guid.new(), None, name, None, None, None, None,
                                                    load, "LOCAL_COORDS" if local else "GLOBAL_COORDS")
        self.f.createIfcRelConnectsStructuralActivity(ifcopenshell.guid.new(), None, None, None, item, r)
        if at is not None:
            self._topology(r, self.vertex(at), "Vertex")
        if group is not None:
            ifcopenshell.api.group.assign_group(self.f, products=[r], group=group)
        return r


def simple_span(purpose: str | None = "ULS"):
    """One 6 m beam along x at z = 3000 mm, pinned nodes at both ends carrying reactions of one
    combination (invented: 85.5 kN at the start, 60 kN at the end, plus axial and minor-axis parts)."""
    m = Linked()
    phys, cm = m.beam("B1", (0, 0, 3000), (6000, 0, 3000))
    n1, n2 = m.node("N1", (0, 0, 3000), [cm]), m.node("N2", (6000, 0, 3000), [cm])
    rg = m.combination("1.2G + 1.5Q", purpose)
    m.reaction(n1, (3.0, 2.0, 85.5), rg, name="R-N1")
    m.reaction(n2, (-3.0, -2.0, 60.0), rg, name="R-N2")
    return m, phys, cm, n1, n2


def test_reactions_at_both_ends_become_web_shear_in_newtons():
    m, phys, *_ = simple_span()
    out, warns = read_linked_reactions(m.f)
    assert warns == []
    V_start, text = out[(phys.GlobalId, "start")]
    assert V_start == pytest.approx(85.5 * KN)     # only the z (web) component; axial 3, minor 2 ignored
    assert out[(phys.GlobalId, "end")][0] == pytest.approx(60.0 * KN)
    assert text.startswith("load combination '1.2G + 1.5Q' (Purpose 'ULS')")
    assert "'N1'" in text and "'R-N1'" in text and "85.50 kN" in text


def test_force_unit_of_the_model_is_converted():
    m = Linked(force_prefix=None)  # newtons
    phys, cm = m.beam("B1", (0, 0, 0), (5000, 0, 0))
    n1 = m.node("N1", (0, 0, 0), [cm])
    m.reaction(n1, (0.0, 0.0, -42000.0), m.combination("ULS 1", "ULS"))
    out, _ = read_linked_reactions(m.f)
    assert out[(phys.GlobalId, "start")][0] == pytest.approx(42000.0)  # |−42 000 N|
    assert (phys.GlobalId, "end") not in out                           # nothing at the other end


def test_ultimate_combination_wins_over_a_larger_unmarked_result():
    m, phys, cm, n1, _ = simple_span()
    # invented: deliberately larger, in a result group of a plain load case, to show the ULS one wins
    m.reaction(n1, (0.0, 0.0, 120.0), m.combination("Q alone", None, kind="LOAD_CASE"), name="R-Q")
    # a second ultimate combination with a larger start reaction is the governing one of the two
    m.reaction(n1, (0.0, 0.0, 97.0), m.combination("1.35G", "ULS"), name="R-135")
    out, warns = read_linked_reactions(m.f)
    V, text = out[(phys.GlobalId, "start")]
    assert V == pytest.approx(97.0 * KN)
    assert "1.35G" in text and "largest of 2 reaction(s) of ultimate" in text
    assert warns == []


def test_without_an_ultimate_combination_the_envelope_is_taken_and_flagged():
    m, phys, cm, n1, _ = simple_span(purpose="SLS")
    m.reaction(n1, (0.0, 0.0, 70.0), m.combination("G", None, kind="LOAD_CASE"), name="R-G")
    out, warns = read_linked_reactions(m.f)
    V, text = out[(phys.GlobalId, "start")]
    assert V == pytest.approx(85.5 * KN)     # max(85.5 SLS, 70 G)
    assert "envelope" in text and "SLS" in text
    assert any("none of a load combination marked ultimate" in w.message and w.global_id == phys.GlobalId
               and "start and end" in w.message for w in warns)


def test_ultimate_is_read_from_purpose_of_a_load_combination_only():
    m = Linked()
    assert is_ultimate_load_group(m.combination("a", "ULS").ResultForLoadGroup)
    assert is_ultimate_load_group(m.combination("b", "Ultimate limit state").ResultForLoadGroup)
    assert not is_ultimate_load_group(m.combination("c", "SLS").ResultForLoadGroup)
    assert not is_ultimate_load_group(m.combination("d", None).ResultForLoadGroup)
    assert not is_ultimate_load_group(m.combination("e", "ULS", kind="LOAD_CASE").ResultForLoadGroup)


def test_web_direction_follows_the_member_axis_attribute():
    # a beam along y with its web turned horizontal along x (Axis = global x): the web shear is Fx
    m = Linked()
    phys, cm = m.beam("B2", (0, 0, 0), (0, 4000, 0), axis=(1.0, 0.0, 0.0))
    n1 = m.node("N1", (0, 0, 0), [cm])
    m.reaction(n1, (30.0, 5.0, 12.0), m.combination("ULS", "ULS"))
    out, _ = read_linked_reactions(m.f)
    assert out[(phys.GlobalId, "start")][0] == pytest.approx(30.0 * KN)


def test_local_coordinates_of_a_skewed_support_are_turned_to_global():
    m = Linked()
    phys, cm = m.beam("B3", (0, 0, 0), (6000, 0, 0))
    n1 = m.node("N1", (0, 0, 0), [cm])
    # support system rotated 90° about global x: local z = global −y, local y = global z
    f = m.f
    n1.ConditionCoordinateSystem = f.createIfcAxis2Placement3D(
        f.createIfcCartesianPoint((0., 0., 0.)), f.createIfcDirection((0., -1., 0.)), f.createIfcDirection((1., 0., 0.)))
    m.reaction(n1, (0.0, 50.0, 7.0), m.combination("ULS", "ULS"), local=True)
    out, _ = read_linked_reactions(m.f)
    # global force = 50·(local y = global z) + 7·(local z = −global y): web (global z) part 50 kN
    assert out[(phys.GlobalId, "start")][0] == pytest.approx(50.0 * KN)


def test_reaction_at_a_node_shared_with_another_member_is_not_taken_as_beam_shear():
    m, phys, cm, n1, n2 = simple_span()
    col = m.f.createIfcStructuralCurveMember(ifcopenshell.guid.new(), None, "C1", None, None, None, None,
                                             "RIGID_JOINED_MEMBER", m.f.createIfcDirection((1., 0., 0.)))
    ifcopenshell.api.structural.add_structural_member_connection(m.f, relating_structural_member=col,
                                                                 related_structural_connection=n2)
    out, warns = read_linked_reactions(m.f)
    assert (phys.GlobalId, "end") not in out
    assert (phys.GlobalId, "start") in out
    assert any(w.global_id == phys.GlobalId and "1 other analysis member" in w.message for w in warns)


def test_end_forces_on_the_member_itself_are_read_at_their_vertex():
    m = Linked()
    phys, cm = m.beam("B4", (0, 0, 0), (8000, 0, 0))
    rg = m.combination("1.2G + 1.5Q", "ULS")
    m.reaction(cm, (0.0, 0.0, 40.0), rg, local=True, at=(0, 0, 0), name="end force i")
    m.reaction(cm, (0.0, 0.0, -44.0), rg, at=(8000, 0, 0), name="end force j")
    m.reaction(cm, (0.0, 0.0, 500.0), rg, at=(4000, 0, 0), name="midspan")  # not an end: ignored
    out, warns = read_linked_reactions(m.f)
    assert out[(phys.GlobalId, "start")][0] == pytest.approx(40.0 * KN)
    assert out[(phys.GlobalId, "end")][0] == pytest.approx(44.0 * KN)
    assert "end force j" in out[(phys.GlobalId, "end")][1]
    assert warns == []


def test_member_reaction_without_a_location_is_reported_not_guessed():
    m = Linked()
    phys, cm = m.beam("B5", (0, 0, 0), (8000, 0, 0))
    m.reaction(cm, (0.0, 0.0, 40.0), m.combination("U", "ULS"), name="nowhere")
    out, warns = read_linked_reactions(m.f)
    assert out == {}
    assert any(w.global_id == phys.GlobalId and "no vertex point" in w.message for w in warns)


def test_analysis_member_drawn_backwards_is_matched_by_the_physical_axis():
    m = Linked()
    phys, cm = m.beam("B6", (6000, 0, 3000), (0, 0, 3000))   # analysis edge runs from x = 6000 to 0
    n_hi, n_lo = m.node("N-hi", (6000, 0, 3000), [cm]), m.node("N-lo", (0, 0, 3000), [cm])
    rg = m.combination("U", "ULS")
    m.reaction(n_hi, (0.0, 0.0, 75.0), rg)
    m.reaction(n_lo, (0.0, 0.0, 25.0), rg)
    sec = Section("x", "I", depth=300.0)
    physical = {phys.GlobalId: Member(phys.GlobalId, "IfcBeam", "beam", (0.0, 0.0, 3000.0), (6000.0, 0.0, 3000.0), sec)}
    plain, _ = read_linked_reactions(m.f)
    matched, _ = read_linked_reactions(m.f, members=physical)
    assert plain[(phys.GlobalId, "start")][0] == pytest.approx(75.0 * KN)     # analysis start assumed
    assert matched[(phys.GlobalId, "start")][0] == pytest.approx(25.0 * KN)   # physical start at x = 0
    assert matched[(phys.GlobalId, "end")][0] == pytest.approx(75.0 * KN)
    assert "opposite" in matched[(phys.GlobalId, "start")][1]


def test_beam_split_into_two_analysis_members_takes_reactions_at_its_outer_ends():
    m = Linked()
    phys, c1 = m.beam("B7", (0, 0, 0), (3000, 0, 0))
    c2 = ifcopenshell.api.root.create_entity(m.f, ifc_class="IfcStructuralCurveMember",
                                             predefined_type="RIGID_JOINED_MEMBER")
    m._topology(c2, m.f.createIfcEdge(m.vb, m.vertex((7000, 0, 0))), "Edge")
    c2.Axis = m.f.createIfcDirection((0., 0., 1.))
    ifcopenshell.api.structural.assign_product(m.f, relating_product=c2, related_object=phys)
    rg = m.combination("U", "ULS")
    m.reaction(m.node("A", (0, 0, 0), [c1]), (0, 0, 31.0), rg)
    m.reaction(m.node("B", (7000, 0, 0), [c2]), (0, 0, 29.0), rg)
    out, warns = read_linked_reactions(m.f)
    assert out[(phys.GlobalId, "start")][0] == pytest.approx(31.0 * KN)
    assert out[(phys.GlobalId, "end")][0] == pytest.approx(29.0 * KN)
    assert warns == []


def test_ifc2x3_member_without_axis_takes_the_web_as_vertical():
    m = Linked(schema="IFC2X3")
    phys, cm = m.beam("B8", (0, 0, 0), (5000, 0, 0))
    m.reaction(m.node("N1", (0, 0, 0), [cm]), (4.0, 9.0, 33.0), m.combination("U", "ULS"))
    out, _ = read_linked_reactions(m.f)
    V, text = out[(phys.GlobalId, "start")]
    assert V == pytest.approx(33.0 * KN) and "web taken as vertical" in text


def test_links_without_results_give_one_model_warning():
    m = Linked()
    m.beam("B9", (0, 0, 0), (5000, 0, 0))
    out, warns = read_linked_reactions(m.f)
    assert out == {} and len(warns) == 1 and "no IfcStructuralPointReaction" in warns[0].message


# --- the real analysis model ------------------------------------------------------------------


def test_real_analysis_model_carries_loads_but_no_results_so_nothing_is_read(shared_models):
    model = ifcopenshell.open(str(shared_models / "analysis-model-building-ifc4.ifc"))
    assert len(model.by_type("IfcStructuralCurveMember")) == 640
    assert len(model.by_type("IfcStructuralResultGroup")) == 0
    assert len(model.by_type("IfcStructuralReaction")) == 0
    combos = [g for g in model.by_type("IfcStructuralLoadGroup") if g.PredefinedType == "LOAD_COMBINATION"]
    assert len(combos) == 17 and not any(is_ultimate_load_group(g) for g in combos)  # no Purpose given
    assert read_linked_reactions(model) == ({}, [])


def test_real_analysis_member_with_an_added_link_and_end_forces(shared_models):
    """A horizontal member of the real model (its own edge, Axis and shared nodes), linked here to an
    added IfcBeam and given end forces of its existing combination '1.4D+1.6L' (invented values)."""
    model = ifcopenshell.open(str(shared_models / "analysis-model-building-ifc4.ifc"))
    cm = next(m for m in model.by_type("IfcStructuralCurveMember")
              if abs(m.Representation.Representations[0].Items[0].EdgeStart.VertexGeometry.Coordinates[2]
                     - m.Representation.Representations[0].Items[0].EdgeEnd.VertexGeometry.Coordinates[2]) < 1e-6)
    edge = cm.Representation.Representations[0].Items[0]
    a, b = edge.EdgeStart.VertexGeometry.Coordinates, edge.EdgeEnd.VertexGeometry.Coordinates
    phys = ifcopenshell.api.root.create_entity(model, ifc_class="IfcBeam", name="linked beam")
    ifcopenshell.api.structural.assign_product(model, relating_product=cm, related_object=phys)
    combo = next(g for g in model.by_type("IfcStructuralLoadGroup") if g.Name == "1.4D+1.6L")
    combo.Purpose = "ULS"
    rg = model.createIfcStructuralResultGroup(ifcopenshell.guid.new(), None, "results", None, None,
                                              "FIRST_ORDER_THEORY", combo, True)
    z = [float(c) for c in cm.Axis.DirectionRatios]
    x = [bi - ai for ai, bi in zip(a, b)]
    L = math.sqrt(sum(c * c for c in x))
    x = [c / L for c in x]
    zz = [zi - sum(p * q for p, q in zip(z, x)) * xi for zi, xi in zip(z, x)]
    n = math.sqrt(sum(c * c for c in zz))
    web = [c / n for c in zz]
    for where, mag in ((a, 52000.0), (b, 48000.0)):   # newtons (the file's FORCEUNIT), along the web
        load = model.createIfcStructuralLoadSingleForce("end force", *(mag * w for w in web), None, None, None)
        r = model.createIfcStructuralPointReaction(ifcopenshell.guid.new(), None, "end force", None, None,
                                                   cm.ObjectPlacement, None, load, "GLOBAL_COORDS")
        rep = model.createIfcTopologyRepresentation(cm.Representation.Representations[0].ContextOfItems,
                                                    "Reference", "Vertex",
                                                    [model.createIfcVertexPoint(model.createIfcCartesianPoint(where))])
        r.Representation = model.createIfcProductDefinitionShape(None, None, [rep])
        model.createIfcRelConnectsStructuralActivity(ifcopenshell.guid.new(), None, None, None, cm, r)
        model.createIfcRelAssignsToGroup(ifcopenshell.guid.new(), None, None, None, [r], None, rg)
    out, warns = read_linked_reactions(model)
    assert out[(phys.GlobalId, "start")][0] == pytest.approx(52000.0)
    assert out[(phys.GlobalId, "end")][0] == pytest.approx(48000.0)
    assert "1.4D+1.6L" in out[(phys.GlobalId, "start")][1]
    assert warns == []


# --- the model demand source ------------------------------------------------------------------


def _cfg(**demand):
    c = copy.deepcopy(DEFAULTS)
    c["demand"].update(demand)
    return c


def _one_beam(props=None):
    b = Member("B1", "IfcBeam", "beam", (0.0, 0.0, 3000.0), (6000.0, 0.0, 3000.0),
               Section("310UB40", "I", depth=304.0, web_thickness=6.1), properties=props or {})
    js = [Joint(joint_id("B1", e, "C1"), "B1", e, "C1", "column-flange", JointGeometry((0.0, 0.0, 3000.0)))
          for e in ("start", "end")]
    return {"B1": b}, js


REACTIONS = {("B1", "start"): (85500.0, "R-N1 at N1, result group for load combination '1.2G + 1.5Q' (ULS)")}


def test_model_source_uses_the_linked_reaction_where_the_property_is_missing():
    members, js = _one_beam()
    demands, warns = resolve_demands(js, members, _cfg(order=["model"], start_shear="Pset_X.Vstart"),
                                     reactions=REACTIONS)
    d = demands[js[0].id]
    assert d is not None and d.V == 85500.0 and d.source == "model"
    assert "1.2G + 1.5Q" in d.combination and d.detail.startswith("linked analysis model reaction")
    assert demands[js[1].id] is None       # no property, no reaction at the end
    assert any("no linked analysis model reaction" in w.message for w in warns)


def test_model_property_on_the_beam_wins_over_the_linked_reaction():
    members, js = _one_beam({"Pset_X.Vstart": 70.0})
    res = resolve_demands_detailed(js, members, _cfg(order=["model"], start_shear="Pset_X.Vstart"),
                                   n_per_force_unit=1000.0, reactions=REACTIONS)
    assert res.demands[js[0].id].V == pytest.approx(70000.0)
    assert "property" in res.demands[js[0].id].detail


def test_linked_reaction_is_used_when_no_property_is_configured():
    members, js = _one_beam()
    demands, _ = resolve_demands(js, members, _cfg(order=["model", "capacity-fraction"]), reactions=REACTIONS)
    assert demands[js[0].id].V == 85500.0 and demands[js[0].id].source == "model"


def test_frame_has_no_reactions_by_default():
    assert Frame("f.ifc", "IFC4", "MILLIMETRE", 1.0).reactions == {}
