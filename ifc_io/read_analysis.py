"""End reactions of physical beams from a linked IFC structural analysis model.

An aid to a competent engineer: the end shear decides whether a connection is adequate and a wrong
one is unsafe. What is read here is only what the analysis model says; check it, and the governing
local code and licensed practice take precedence.

Read for IFC2X3, IFC4 and IFC4X3 (IFC4 structural analysis domain definitions):

**Link.** A physical element (``IfcElement``, e.g. IfcBeam) is linked to the
``IfcStructuralCurveMember`` (s) that idealise it through ``IfcRelAssignsToProduct``, in either
direction (as :mod:`ifc_io.connectivity` accepts). A beam split into several analysis members is
handled when drawn as one chain (each member starting where the previous one ends): its ends are the
two member end points farthest apart.

**Reactions.** ``IfcStructuralPointReaction`` with an ``IfcStructuralLoadSingleForce`` (displacement
results are skipped), attached through ``IfcRelConnectsStructuralActivity`` either

- to an ``IfcStructuralPointConnection`` the analysis member meets through
  ``IfcRelConnectsStructuralMember`` (the support reaction of that node; no own placement, it sits at
  the connection's vertex). It is the beam's end reaction only when no other analysis member meets
  at that node; otherwise it is the whole node's reaction, and a warning says it is not used; or
- to the analysis member itself, located by its own ``IfcVertexPoint`` (the end force of the
  member).

**Which end.** The point's projection on the member axis (``IfcEdge`` start → end vertex): within
10 % of the length from an end it is at that end; between, it is an intermediate node and not an end
reaction. The analysis start/end is the physical start/end unless ``members`` (the physical axes,
world mm) are given, in which case ends are matched by position (an analysis member drawn the other
way round is then read correctly).

**Shear.** The component of the force along the member's local z axis: the local x axis runs along
the edge, z lies in the plane of x and ``IfcStructuralCurveMember.Axis`` (IFC4), and a profile's
(xp, yp) are inserted parallel to the member's (y, z) (IfcStructuralCurveMember, "Coordinate Systems"
and "Material Profile Set Usage"), so for an I section local z is the web direction: V = |F · z|.
Without ``Axis`` (IFC2X3) the web is taken as vertical (global Z made normal to the axis). Force
directions are global (the analysis model's shared placement) or, with ``LOCAL_COORDS``, local to the
item: the connection's ``ConditionCoordinateSystem`` (parallel to global if absent) or the member's
(x, y, z) (IfcStructuralActivity.GlobalOrLocal). Forces are in the model's FORCEUNIT, converted to N
with :func:`ifc_io.units.force_scale_to_n`.

**Which result.** Reactions are grouped into ``IfcStructuralResultGroup`` (IfcRelAssignsToGroup),
each ``ResultForLoadGroup`` an ``IfcStructuralLoadGroup``. A result group counts as *ultimate* when
its load group is a ``LOAD_COMBINATION`` whose ``Purpose`` says ``ULS`` or "ultimate" (the IFC
definition of Purpose names 'SLS', 'ULS', 'ALS'; the ``IfcActionTypeEnum`` of ``ActionType`` carries
no limit state, so it only counts through a USERDEFINED ``ObjectType``). At each end the largest V
over the ultimate result groups is taken; if none at that end is ultimate, the largest over every
result group there (and reactions in none) is taken and a warning says so, since that envelope may
be of unfactored load cases or serviceability combinations. The text beside each value names the
reaction, the connection or member, the result group, the load group and its Purpose.

Per-element problems are :class:`~engine.model.DataWarning` records with the GlobalId, never
exceptions. Internal units: mm, N.
"""

from __future__ import annotations

import math
import re
from collections import defaultdict
from dataclasses import dataclass
from typing import Mapping

import ifcopenshell

from engine.model import DataWarning
from ifc_io.units import force_scale_to_n

__all__ = ["read_linked_reactions", "END_FRACTION", "is_ultimate_load_group"]

END_FRACTION = 0.10
"""A point within this fraction of the member length of an end (measured along the axis) is at that
end; between, it is an intermediate node. A choice of this reader: wide enough for connections set
eccentrically off the member end (IfcRelConnectsWithEccentricity), narrow enough to leave framing
points of secondary beams out."""

_ULTIMATE = re.compile(r"\bULS\b|ultimate", re.IGNORECASE)
_STAGE = "read"

Vec = tuple[float, float, float]


def _by_type(model: ifcopenshell.file, cls: str) -> list:
    try:
        return list(model.by_type(cls))
    except RuntimeError:  # not in this schema
        return []


def _sub(a: Vec, b: Vec) -> Vec:
    return (a[0] - b[0], a[1] - b[1], a[2] - b[2])


def _dot(a: Vec, b: Vec) -> float:
    return a[0] * b[0] + a[1] * b[1] + a[2] * b[2]


def _cross(a: Vec, b: Vec) -> Vec:
    return (a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0])


def _norm(a: Vec) -> float:
    return math.sqrt(_dot(a, a))


def _unit(a: Vec) -> Vec | None:
    n = _norm(a)
    return None if n < 1e-12 else (a[0] / n, a[1] / n, a[2] / n)


def _scale(a: Vec, k: float) -> Vec:
    return (a[0] * k, a[1] * k, a[2] * k)


def _pt(cartesian) -> Vec | None:
    try:
        c = [float(v) for v in cartesian.Coordinates]
    except (AttributeError, TypeError, ValueError):
        return None
    c += [0.0] * (3 - len(c))
    return (c[0], c[1], c[2])


def _vertex_point(product) -> Vec | None:
    """Coordinates of the IfcVertexPoint in a product's topology representation."""
    rep = getattr(product, "Representation", None)
    for r in (rep.Representations if rep else None) or ():
        for item in r.Items or ():
            if item.is_a("IfcVertexPoint"):
                return _pt(item.VertexGeometry)
    return None


def _label(el) -> str:
    name = getattr(el, "Name", None)
    gid = getattr(el, "GlobalId", None) or f"#{el.id()}"
    return f"{el.is_a()} '{name}' ({gid})" if name else f"{el.is_a()} {gid}"


def is_ultimate_load_group(group) -> bool:
    """True for an IfcStructuralLoadGroup that is a LOAD_COMBINATION (or IFC2X3
    LOAD_COMBINATION_GROUP) marked as ultimate limit state by its Purpose ('ULS', "ultimate"), or by
    the ObjectType of a USERDEFINED ActionType."""
    if group is None or str(getattr(group, "PredefinedType", "")) not in ("LOAD_COMBINATION",
                                                                         "LOAD_COMBINATION_GROUP"):
        return False
    texts = [getattr(group, "Purpose", None) or ""]
    if str(getattr(group, "ActionType", "")) == "USERDEFINED":
        texts.append(getattr(group, "ObjectType", None) or "")
    return any(_ULTIMATE.search(t) for t in texts)


@dataclass(frozen=True)
class _Segment:
    """One analysis curve member: its end points and local axes in the analysis model's global
    system (model length units)."""

    item: object
    start: Vec
    end: Vec
    x: Vec
    y: Vec | None
    z: Vec | None
    web_note: str

    @property
    def length(self) -> float:
        return _norm(_sub(self.end, self.start))

    def end_of(self, p: Vec) -> str:
        """``"start"``, ``"end"`` or ``""`` (intermediate) for a point ``p``."""
        L = self.length
        t = _dot(_sub(p, self.start), self.x) / L
        if t <= END_FRACTION:
            return "start"
        if t >= 1.0 - END_FRACTION:
            return "end"
        return ""

    def point(self, end: str) -> Vec:
        return self.start if end == "start" else self.end


def _segment(member) -> tuple[_Segment | None, str]:
    rep = getattr(member, "Representation", None)
    edge = None
    for r in (rep.Representations if rep else None) or ():
        for item in r.Items or ():
            if item.is_a("IfcEdge"):
                edge = item
                break
        if edge is not None:
            break
    if edge is None:
        return None, "the analysis member has no IfcEdge topology representation"
    s = _pt(getattr(edge.EdgeStart, "VertexGeometry", None))
    e = _pt(getattr(edge.EdgeEnd, "VertexGeometry", None))
    if s is None or e is None:
        return None, "the analysis member's edge has no vertex points"
    x = _unit(_sub(e, s))
    if x is None:
        return None, "the analysis member's edge has zero length"
    axis = getattr(member, "Axis", None) if hasattr(member, "Axis") else None
    note = ""
    a = None
    if axis is not None:
        try:
            a = _unit(tuple(float(v) for v in (list(axis.DirectionRatios) + [0.0, 0.0])[:3]))
        except (TypeError, ValueError):
            a = None
        if a is None:
            note = "its Axis is not a usable direction; web taken as vertical"
    else:
        note = "no Axis (local z) given; web taken as vertical"
    if a is None:
        a = (0.0, 0.0, 1.0)
    z = _unit(_sub(a, _scale(x, _dot(a, x))))
    if z is None:
        if axis is not None and not note:
            note = "its Axis is parallel to the member; web direction unknown, whole transverse force taken"
        else:
            note = "vertical member with no usable Axis; web direction unknown, whole transverse force taken"
        return _Segment(member, s, e, x, None, None, note), ""
    return _Segment(member, s, e, x, _cross(z, x), z, note), ""


def _axes_of_placement(placement) -> tuple[Vec, Vec, Vec] | None:
    """Unit x, y, z of an IfcAxis2Placement3D (IFC defaults where omitted)."""
    if placement is None:
        return None
    try:
        zr = placement.Axis.DirectionRatios if placement.Axis else (0.0, 0.0, 1.0)
        xr = placement.RefDirection.DirectionRatios if placement.RefDirection else (1.0, 0.0, 0.0)
        z = _unit(tuple(float(v) for v in zr))
        xr = tuple(float(v) for v in xr)
    except (AttributeError, TypeError, ValueError):
        return None
    if z is None:
        return None
    x = _unit(_sub(xr, _scale(z, _dot(xr, z))))  # type: ignore[arg-type]
    if x is None:
        return None
    return x, _cross(z, x), z


def _force(reaction) -> tuple[Vec | None, str]:
    load = getattr(reaction, "AppliedLoad", None)
    if load is None:
        return None, "has no AppliedLoad"
    if not load.is_a("IfcStructuralLoadSingleForce"):
        return None, "" if load.is_a("IfcStructuralLoadSingleDisplacement") else f"has a {load.is_a()}, not a single force"
    comps = [getattr(load, k, None) for k in ("ForceX", "ForceY", "ForceZ")]
    if all(c is None for c in comps):
        return None, "has no force components"
    try:
        f = tuple(float(c) if c is not None else 0.0 for c in comps)
    except (TypeError, ValueError):
        return None, "has force components that are not numbers"
    if not all(math.isfinite(c) for c in f):
        return None, "has force components that are not finite"
    return f, ""  # type: ignore[return-value]


@dataclass(frozen=True)
class _Candidate:
    V: float  # N
    text: str
    ultimate: bool


class _Index:
    """One pass over the relationships the reactions need."""

    def __init__(self, model: ifcopenshell.file) -> None:
        self.links: dict[str, list] = defaultdict(list)  # physical GlobalId -> curve members
        self.physical: dict[str, object] = {}
        for rel in _by_type(model, "IfcRelAssignsToProduct"):
            prod = rel.RelatingProduct
            objs = list(rel.RelatedObjects or ())
            if prod is None:
                continue
            if prod.is_a("IfcStructuralCurveMember"):
                pairs = [(o, prod) for o in objs if o.is_a("IfcElement")]
            elif prod.is_a("IfcElement"):
                pairs = [(prod, o) for o in objs if o.is_a("IfcStructuralCurveMember")]
            else:
                pairs = []
            for el, sm in pairs:
                if el.GlobalId and sm not in self.links[el.GlobalId]:
                    self.links[el.GlobalId].append(sm)
                    self.physical[el.GlobalId] = el
        self.activities: dict[int, list] = defaultdict(list)  # item id -> point reactions
        for rel in _by_type(model, "IfcRelConnectsStructuralActivity"):
            item, act = rel.RelatingElement, rel.RelatedStructuralActivity
            if item is not None and act is not None and act.is_a("IfcStructuralPointReaction"):
                self.activities[item.id()].append(act)
        self.connections: dict[int, list] = defaultdict(list)  # member id -> connections
        self.members_at: dict[int, set[int]] = defaultdict(set)  # connection id -> member ids
        for rel in _by_type(model, "IfcRelConnectsStructuralMember"):
            mem, conn = rel.RelatingStructuralMember, rel.RelatedStructuralConnection
            if mem is None or conn is None:
                continue
            if conn not in self.connections[mem.id()]:
                self.connections[mem.id()].append(conn)
            self.members_at[conn.id()].add(mem.id())
        self.groups_of: dict[int, list] = defaultdict(list)  # reaction id -> result groups
        for rel in _by_type(model, "IfcRelAssignsToGroup"):
            g = rel.RelatingGroup
            if g is None or not g.is_a("IfcStructuralResultGroup"):
                continue
            for o in rel.RelatedObjects or ():
                self.groups_of[o.id()].append(g)
        self.n_reactions = len(_by_type(model, "IfcStructuralPointReaction"))


def _group_text(rg) -> tuple[str, bool]:
    """``("load combination 'X' (Purpose 'ULS'), result group 'Y'", ultimate?)`` for a result group."""
    if rg is None:
        return "no load group (reaction in no result group)", False
    lg = getattr(rg, "ResultForLoadGroup", None)
    if lg is None:
        return f"no load group named (result group '{rg.Name or rg.GlobalId}')", False
    kind = str(getattr(lg, "PredefinedType", "") or "").lower().replace("_", " ")
    if kind in ("", "notdefined", "userdefined"):
        kind = "load group"
    purpose = getattr(lg, "Purpose", None)
    desc = f"{kind} '{lg.Name or lg.GlobalId}'" + (f" (Purpose '{purpose}')" if purpose else "")
    return f"{desc}, result group '{rg.Name or rg.GlobalId}'", is_ultimate_load_group(lg)


def _world(segment: _Segment, p: Vec, mm: float) -> Vec:
    """A point of the analysis model's global system in world mm (through the member's placement)."""
    place = getattr(segment.item, "ObjectPlacement", None)
    if place is None:
        return _scale(p, mm)
    import ifcopenshell.util.placement as up

    m = up.get_local_placement(place)
    w = tuple(float(m[i][0] * p[0] + m[i][1] * p[1] + m[i][2] * p[2] + m[i][3]) for i in range(3))
    return _scale(w, mm)  # type: ignore[arg-type]


def read_linked_reactions(
    model: ifcopenshell.file,
    members: Mapping[str, object] | None = None,
) -> tuple[dict[tuple[str, str], tuple[float, str]], list[DataWarning]]:
    """End reactions of the physical elements linked to an analysis model (method in the module doc).

    ``members`` (optional): physical GlobalId → an object with ``start``/``end`` (world mm), e.g.
    :class:`engine.model.Member`; with it, analysis ends are matched to physical ends by position.

    Returns ``{(physical GlobalId, "start" | "end"): (V in N, text)}`` — V the magnitude of the shear
    in the plane of the web, the text naming the reaction, where it acts, its result group and load
    combination — and the data warnings.
    """
    warnings: list[DataWarning] = []
    if not _by_type(model, "IfcStructuralCurveMember"):
        return {}, warnings
    idx = _Index(model)
    if not idx.links:
        if idx.n_reactions:
            warnings.append(DataWarning(
                f"the model carries {idx.n_reactions} IfcStructuralPointReaction but no analysis member is "
                "linked to a physical element (IfcRelAssignsToProduct); the reactions are not used", None, _STAGE))
        return {}, warnings
    if not idx.n_reactions:
        warnings.append(DataWarning(
            f"{len(idx.links)} physical element(s) are linked to analysis members but the model carries no "
            "IfcStructuralPointReaction results; no end reactions from the analysis model", None, _STAGE))
        return {}, warnings
    try:
        force_unit, n_per_unit = force_scale_to_n(model)
    except ValueError as exc:
        force_unit, n_per_unit = "NEWTON", 1.0
        warnings.append(DataWarning(f"force unit not understood ({exc}); reactions read as newtons", None, _STAGE))
    mm = None
    if members:
        from ifc_io.units import length_scale_to_mm

        mm = length_scale_to_mm(model)[1]

    out: dict[tuple[str, str], tuple[float, str]] = {}
    envelope_used: dict[str, list[str]] = defaultdict(list)
    for gid in sorted(idx.links):
        segs: list[_Segment] = []
        for sm in idx.links[gid]:
            seg, why = _segment(sm)
            if seg is None:
                warnings.append(DataWarning(f"linked analysis member {_label(sm)}: {why}; its reactions are not "
                                            "used", gid, _STAGE))
            else:
                segs.append(seg)
        if not segs:
            continue
        ends = _chain_ends(segs)
        if ends is None:
            warnings.append(DataWarning(
                f"the {len(segs)} analysis members linked to this element do not form one chain with two "
                "ends; its reactions are not used", gid, _STAGE))
            continue
        (sa, ea), (sb, eb) = ends  # (segment, its end) at the physical start and end
        orient_note = ""
        phys = members.get(gid) if members else None
        if phys is not None and mm is not None:
            try:
                ps, pe = tuple(phys.start), tuple(phys.end)  # type: ignore[attr-defined]
                wa, wb = _world(sa, sa.point(ea), mm), _world(sb, sb.point(eb), mm)
                same = _norm(_sub(wa, ps)) + _norm(_sub(wb, pe))
                swapped = _norm(_sub(wa, pe)) + _norm(_sub(wb, ps))
                if swapped < same:
                    (sa, ea), (sb, eb) = (sb, eb), (sa, ea)
                    orient_note = "; the analysis member runs opposite to the element, ends matched by position"
            except (AttributeError, TypeError, ValueError):
                pass
        else:
            orient_note = "; the analysis member's start is taken as the element's start"
        for phys_end, seg, seg_end in (("start", sa, ea), ("end", sb, eb)):
            cands = _candidates(idx, gid, seg, seg_end, segs, n_per_unit, force_unit, warnings)
            if not cands:
                continue
            ult = [c for c in cands if c.ultimate]
            pool = ult or cands
            best = max(pool, key=lambda c: c.V)
            if ult:
                how = f"largest of {len(ult)} reaction(s) of ultimate load combinations at this end"
            else:
                how = (f"largest of {len(cands)} reaction(s) at this end, none of an ultimate load combination "
                       "(envelope over all result groups)")
                envelope_used[gid].append(phys_end)
            note = f"; {seg.web_note}" if seg.web_note else ""
            out[(gid, phys_end)] = (best.V, f"{best.text}; {how}{note}{orient_note}")
    for gid, ends_ in envelope_used.items():
        warnings.append(DataWarning(
            f"analysis reactions at the {' and '.join(ends_)} end(s), but none of a load combination marked "
            "ultimate (IfcStructuralLoadGroup LOAD_COMBINATION with Purpose 'ULS'): the largest over all result "
            "groups is used, which may be an unfactored load case or a serviceability result; check it", gid,
            _STAGE))
    return out, warnings


def _chain_ends(segs: list[_Segment]) -> tuple[tuple[_Segment, str], tuple[_Segment, str]] | None:
    """The (segment, end) at the element's start and at its end: for one segment its own start and
    end; for several, the two end points farthest apart, ordered so that the start one is an edge
    start (a consistently drawn chain), else ``None``."""
    if len(segs) == 1:
        return (segs[0], "start"), (segs[0], "end")
    pts = [(s, e) for s in segs for e in ("start", "end")]
    best, pair = -1.0, None
    for i in range(len(pts)):
        for j in range(i + 1, len(pts)):
            d = _norm(_sub(pts[i][0].point(pts[i][1]), pts[j][0].point(pts[j][1])))
            if d > best:
                best, pair = d, (pts[i], pts[j])
    assert pair is not None
    a, b = pair
    if a[1] == "start" and b[1] == "end":
        return a, b
    if a[1] == "end" and b[1] == "start":
        return b, a
    return None


def _candidates(idx: _Index, gid: str, seg: _Segment, seg_end: str, segs: list[_Segment],
                n_per_unit: float, force_unit: str, warnings: list[DataWarning]) -> list[_Candidate]:
    out: list[_Candidate] = []
    own = {s.item.id() for s in segs}
    member_label = _label(seg.item)

    def add(reaction, f_global: Vec, where: str) -> None:
        if seg.z is not None:
            v = abs(_dot(f_global, seg.z))
            comp = "|F·z|, z the member's local z (web direction)"
        else:
            v = _norm(_sub(f_global, _scale(seg.x, _dot(f_global, seg.x))))
            comp = "transverse force magnitude"
        for rg in idx.groups_of.get(reaction.id()) or [None]:
            grp, ult = _group_text(rg)
            V = v * n_per_unit
            out.append(_Candidate(V, (f"{grp}: {_label(reaction)} at {where}; V = {comp} = {v:g} "
                                      f"{force_unit} = {V / 1e3:.2f} kN"), ult))

    # reactions at point connections at this end of the member
    for conn in idx.connections.get(seg.item.id(), ()):
        if not conn.is_a("IfcStructuralPointConnection"):
            continue
        reactions = idx.activities.get(conn.id())
        if not reactions:
            continue
        p = _vertex_point(conn)
        if p is None or seg.end_of(p) != seg_end:
            continue
        others = idx.members_at.get(conn.id(), set()) - own
        if others:
            warnings.append(DataWarning(
                f"the reaction at {_label(conn)} is the support reaction of a node where {len(others)} other "
                f"analysis member(s) also meet; it is not this beam's {seg_end} end shear and is not used", gid,
                _STAGE))
            continue
        axes = _axes_of_placement(getattr(conn, "ConditionCoordinateSystem", None)) \
            if hasattr(conn, "ConditionCoordinateSystem") else None
        for r in reactions:
            f, why = _force(r)
            if f is None:
                if why:
                    warnings.append(DataWarning(f"{_label(r)} {why}; not used", gid, _STAGE))
                continue
            if str(r.GlobalOrLocal) == "LOCAL_COORDS" and axes is not None:
                x, y, z = axes
                f = tuple(f[0] * x[i] + f[1] * y[i] + f[2] * z[i] for i in range(3))  # type: ignore[assignment]
            add(r, f, f"{_label(conn)} at the {seg_end} of {member_label}")
    # point reactions on the member itself, at this end
    for r in idx.activities.get(seg.item.id(), ()):
        p = _vertex_point(r)
        if p is None:
            warnings.append(DataWarning(f"{_label(r)} on {member_label} has no vertex point saying where it acts; "
                                        "not used", gid, _STAGE))
            continue
        if seg.end_of(p) != seg_end:
            continue
        f, why = _force(r)
        if f is None:
            if why:
                warnings.append(DataWarning(f"{_label(r)} {why}; not used", gid, _STAGE))
            continue
        if str(r.GlobalOrLocal) == "LOCAL_COORDS":
            if seg.z is None:
                warnings.append(DataWarning(f"{_label(r)} is in local coordinates of {member_label}, whose "
                                            "local axes are unknown; not used", gid, _STAGE))
                continue
            x, y, z = seg.x, seg.y, seg.z
            f = tuple(f[0] * x[i] + f[1] * y[i] + f[2] * z[i] for i in range(3))  # type: ignore[assignment,index]
        add(r, f, f"the {seg_end} of {member_label}")
    return out
