"""Write the invented demo building (``samples.demo_scenario``) as an IFC file with ifcopenshell.api.

Two flavours from one description:

* ``IFC4`` in millimetres, force unit newton; members carry an IfcMaterialProfileSetUsage (profile
  set + cardinal point).
* ``IFC2X3`` in feet (IfcConversionBasedUnit "FOOT" = 0.3048 m), force unit pound-force
  (IfcConversionBasedUnit "POUND-FORCE" = 4.4482216152605 N, the exact definition of the pound-force
  from the international pound 0.45359237 kg and standard gravity 9.80665 m/s², NIST SP 811 App. B);
  members carry the IfcMaterial directly.

Both files use the same deterministic GlobalIds (``gid(name)``), one fixed IfcOwnerHistory and a
fixed header time stamp, so regenerating gives the same bytes.

The demo is invented data for exercising joint-audit, not a design: results of the tool are an aid
to a competent engineer, must be checked, and local codes and licensed practice take precedence.
"""

from __future__ import annotations

import uuid
from pathlib import Path

import ifcopenshell
import ifcopenshell.api.aggregate
import ifcopenshell.api.context
import ifcopenshell.api.geometry
import ifcopenshell.api.material
import ifcopenshell.api.project
import ifcopenshell.api.pset
import ifcopenshell.api.root
import ifcopenshell.api.spatial
import ifcopenshell.api.unit
import ifcopenshell.guid

from samples.demo_scenario import (
    BUILDING_NAME,
    PROJECT_NAME,
    SITE_NAME,
    STOREYS,
    FinPlateSpec,
    MemberSpec,
    Scenario,
    WallSpec,
)
from samples.demo_sections import BOLT_GRADE, MEMBER_GRADE, PLATE_GRADE, SectionDims

__all__ = ["NAMESPACE", "gid", "write_ifc", "MM_PER_FOOT", "N_PER_LBF", "TIMESTAMP", "EPOCH"]

NAMESPACE = uuid.UUID("6f3b0c1e-2d4a-5b8c-9e7f-0a1b2c3d4e5f")
"""Namespace of the demo's name-derived GlobalIds (an arbitrary fixed UUID of ours)."""

MM_PER_FOOT = 304.8  # international foot = 0.3048 m exactly (NIST SP 811 App. B)
N_PER_LBF = 4.4482216152605  # pound-force, exact by definition (NIST SP 811 App. B)
TIMESTAMP = "2026-01-15T09:00:00"
EPOCH = 1768467600  # 2026-01-15T09:00:00Z, the fixed IfcOwnerHistory CreationDate
GENERATOR = "joint-audit demo generator"


def gid(name: str) -> str:
    """A GlobalId derived only from ``name``: the 22-character compression of uuid5(NAMESPACE, name)."""
    return ifcopenshell.guid.compress(uuid.uuid5(NAMESPACE, name).hex)


class _Writer:
    """Builds one IFC file from the scenario; lengths given in mm are converted to the file unit."""

    def __init__(self, sc: Scenario, schema: str) -> None:
        self.sc = sc
        self.schema = schema
        self.feet = schema == "IFC2X3"
        self.f = ifcopenshell.api.project.create_file(version=schema)
        self.named: set[int] = set()
        self.storeys: dict[str, ifcopenshell.entity_instance] = {}
        self.storey_z: dict[str, float] = dict(STOREYS)
        self.profiles: dict[str, ifcopenshell.entity_instance] = {}
        self.profile_sets: dict[str, ifcopenshell.entity_instance] = {}
        self.materials: dict[str, ifcopenshell.entity_instance] = {}
        self.elements: dict[str, ifcopenshell.entity_instance] = {}

    # -- units and small helpers ---------------------------------------------------------------
    def L(self, mm: float) -> float:
        """A length in mm in the file's length unit."""
        return mm / MM_PER_FOOT if self.feet else float(mm)

    def F(self, kN: float) -> float:
        """A force in kN in the file's force unit."""
        return kN * 1000.0 / N_PER_LBF if self.feet else kN * 1000.0

    def pt(self, p) -> ifcopenshell.entity_instance:
        return self.f.createIfcCartesianPoint(tuple(self.L(c) for c in p))

    def direction(self, d) -> ifcopenshell.entity_instance:
        return self.f.createIfcDirection(tuple(float(c) + 0.0 for c in d))

    def a2p3d(self, origin=(0.0, 0.0, 0.0), z=None, x=None) -> ifcopenshell.entity_instance:
        return self.f.createIfcAxis2Placement3D(
            self.pt(origin), self.direction(z) if z else None, self.direction(x) if x else None)

    def placement(self, rel_to, origin=(0.0, 0.0, 0.0), z=None, x=None):
        return self.f.createIfcLocalPlacement(rel_to, self.a2p3d(origin, z, x))

    def create(self, ifc_class: str, key: str, name: str | None = None, predefined_type: str | None = None,
               **attrs) -> ifcopenshell.entity_instance:
        """A rooted entity through ifcopenshell.api with the GlobalId derived from ``key``."""
        e = ifcopenshell.api.root.create_entity(self.f, ifc_class=ifc_class, name=name,
                                                predefined_type=predefined_type)
        e.GlobalId = gid(key)
        for k, v in attrs.items():
            setattr(e, k, v)
        self.named.add(e.id())
        return e

    def contain(self, product, storey: str) -> None:
        ifcopenshell.api.spatial.assign_container(self.f, products=[product],
                                                  relating_structure=self.storeys[storey])

    def pset(self, product, name: str, props: dict) -> None:
        ps = ifcopenshell.api.pset.add_pset(self.f, product=product, name=name)
        ifcopenshell.api.pset.edit_pset(self.f, pset=ps, properties=props)

    def material(self, name: str, category: str) -> ifcopenshell.entity_instance:
        if name not in self.materials:
            m = ifcopenshell.api.material.add_material(self.f, name=name)
            if not self.feet:
                m.Category = category
            self.materials[name] = m
        return self.materials[name]

    # -- project structure ---------------------------------------------------------------------
    def header_and_owner(self) -> None:
        f = self.f
        person = f.createIfcPerson(None, "Okafor", "Imogen", None, None, None, None, None)
        if self.schema == "IFC2X3":
            person.Id = "IOKAFOR"
        else:
            person.Identification = "IOKAFOR"
        org = f.create_entity("IfcOrganization", Name="Tarrawong Structural Studio (invented)")
        pao = f.createIfcPersonAndOrganization(person, org, None)
        app = f.createIfcApplication(org, "0.1.0", GENERATOR, "joint-audit-demo")
        self.owner = f.create_entity(
            "IfcOwnerHistory", OwningUser=pao, OwningApplication=app, State="READWRITE",
            ChangeAction="ADDED", LastModifiedDate=EPOCH, LastModifyingUser=pao,
            LastModifyingApplication=app, CreationDate=EPOCH)

    def units(self) -> None:
        f = self.f
        units = []
        if self.feet:
            foot = ifcopenshell.api.unit.add_conversion_based_unit(f, name="foot")
            foot.Name = "FOOT"
            foot.ConversionFactor.ValueComponent = f.create_entity("IfcLengthMeasure", 0.3048)
            lbf = ifcopenshell.api.unit.add_conversion_based_unit(f, name="lbf")
            lbf.Name = "POUND-FORCE"
            lbf.ConversionFactor.ValueComponent = f.create_entity("IfcForceMeasure", N_PER_LBF)
            units += [foot, lbf]
        else:
            units.append(ifcopenshell.api.unit.add_si_unit(f, unit_type="LENGTHUNIT", prefix="MILLI"))
            units.append(ifcopenshell.api.unit.add_si_unit(f, unit_type="FORCEUNIT"))
        units.append(ifcopenshell.api.unit.add_si_unit(f, unit_type="AREAUNIT"))
        units.append(ifcopenshell.api.unit.add_si_unit(f, unit_type="VOLUMEUNIT"))
        units.append(ifcopenshell.api.unit.add_si_unit(f, unit_type="PLANEANGLEUNIT"))
        ifcopenshell.api.unit.assign_unit(f, units=units)
        # the API gathers the units in a set: fix their order so the bytes never depend on it
        for assignment in f.by_type("IfcUnitAssignment"):
            assignment.Units = units

    def spatial(self) -> None:
        f = self.f
        self.project = self.create("IfcProject", "project", name=PROJECT_NAME)
        self.units()
        model = ifcopenshell.api.context.add_context(f, context_type="Model")
        self.body_ctx = ifcopenshell.api.context.add_context(
            f, context_type="Model", context_identifier="Body", target_view="MODEL_VIEW", parent=model)
        self.axis_ctx = ifcopenshell.api.context.add_context(
            f, context_type="Model", context_identifier="Axis", target_view="GRAPH_VIEW", parent=model)
        site = self.create("IfcSite", "site", name=SITE_NAME)
        building = self.create("IfcBuilding", "building", name=BUILDING_NAME)
        site.ObjectPlacement = self.placement(None)
        building.ObjectPlacement = self.placement(site.ObjectPlacement)
        ifcopenshell.api.aggregate.assign_object(f, products=[site], relating_object=self.project)
        ifcopenshell.api.aggregate.assign_object(f, products=[building], relating_object=site)
        for name, z in STOREYS:
            st = self.create("IfcBuildingStorey", f"storey/{name}", name=name, Elevation=self.L(z))
            st.ObjectPlacement = self.placement(building.ObjectPlacement, (0.0, 0.0, z))
            ifcopenshell.api.aggregate.assign_object(f, products=[st], relating_object=building)
            self.storeys[name] = st
        site.CompositionType = building.CompositionType = "ELEMENT"  # mandatory in IFC2X3
        for st in self.storeys.values():
            st.CompositionType = "ELEMENT"

    # -- members ---------------------------------------------------------------------------------
    def profile(self, s: SectionDims) -> ifcopenshell.entity_instance:
        if s.name not in self.profiles:
            self.profiles[s.name] = self.f.create_entity(
                "IfcIShapeProfileDef", ProfileType="AREA", ProfileName=s.name,
                Position=self.f.createIfcAxis2Placement2D(self.f.createIfcCartesianPoint((0.0, 0.0)), None),
                OverallWidth=self.L(s.bf), OverallDepth=self.L(s.d), WebThickness=self.L(s.tw),
                FlangeThickness=self.L(s.tf), FilletRadius=self.L(s.r))
        return self.profiles[s.name]

    def assign_steel(self, el, m: MemberSpec) -> None:
        steel = self.material(MEMBER_GRADE[1], "steel")
        if self.feet:
            ifcopenshell.api.material.assign_material(self.f, products=[el], type="IfcMaterial",
                                                      material=steel)
            return
        key = m.section.name
        if key not in self.profile_sets:
            ps = ifcopenshell.api.material.add_material_set(self.f, name=key,
                                                            set_type="IfcMaterialProfileSet")
            ifcopenshell.api.material.add_profile(self.f, profile_set=ps, material=steel,
                                                  profile=self.profile(m.section), name=key)
            self.profile_sets[key] = ps
        rel = ifcopenshell.api.material.assign_material(
            self.f, products=[el], type="IfcMaterialProfileSetUsage", material=self.profile_sets[key])
        usage = rel.RelatingMaterial if hasattr(rel, "RelatingMaterial") else rel[0].RelatingMaterial
        usage.CardinalPoint = m.cardinal_point

    def member(self, m: MemberSpec) -> None:
        f = self.f
        predefined = None if self.feet else ("BEAM" if m.role == "beam" else "COLUMN")
        el = self.create(m.ifc_class, f"member/{m.tag}", name=m.name, predefined_type=predefined,
                         Tag=m.tag, ObjectType=m.section.name)
        z = m.direction
        y = m.web_dir
        x = (y[1] * z[2] - y[2] * z[1], y[2] * z[0] - y[0] * z[2], y[0] * z[1] - y[1] * z[0])
        x = tuple(round(c, 12) + 0.0 for c in x)
        sz = self.storey_z[m.storey]
        origin = (m.start[0], m.start[1], m.start[2] - sz)
        el.ObjectPlacement = self.placement(self.storeys[m.storey].ObjectPlacement, origin, z, x)
        length = m.length
        axis = f.createIfcShapeRepresentation(
            self.axis_ctx, "Axis", "Curve3D",
            [f.createIfcPolyline([self.pt((0.0, 0.0, 0.0)), self.pt((0.0, 0.0, length))])])
        # Cardinal point 8 (top centre): the profile centre lies d/2 below the axis.
        offset = (0.0, -m.section.d / 2.0, 0.0) if m.cardinal_point == 8 else (0.0, 0.0, 0.0)
        solid = f.createIfcExtrudedAreaSolid(self.profile(m.section), self.a2p3d(offset),
                                             self.direction((0.0, 0.0, 1.0)), self.L(length))
        body = f.createIfcShapeRepresentation(self.body_ctx, "Body", "SweptSolid", [solid])
        ifcopenshell.api.geometry.assign_representation(f, product=el, representation=axis)
        ifcopenshell.api.geometry.assign_representation(f, product=el, representation=body)
        self.assign_steel(el, m)
        self.contain(el, m.storey)
        for j in self.sc.joints:
            if j.beam == m.tag and j.cope is not None and j.convention == "detailed":
                self.cope(el, m, j.end, j.cope)
        shear = self.sc.model_shears_kN.get(m.tag)
        if shear is not None:
            self.pset(el, "Demo_Analysis", {
                "StartShear": f.create_entity("IfcForceMeasure", self.F(shear[0])),
                "EndShear": f.create_entity("IfcForceMeasure", self.F(shear[1])),
                "LoadCase": f.create_entity("IfcLabel", "ULS 1.2G+1.5Q (invented demo results)"),
            })
        self.elements[m.tag] = el

    def cope(self, el, m: MemberSpec, end: str, cope: dict) -> None:
        """Cut a top cope at ``end`` of beam ``m`` as an IfcOpeningElement voiding the beam (the
        beam's own Body stays a plain extrusion). Beam local frame: z along the beam, y up, axis at
        top of steel; the cutting box overshoots the flange width and the top by 1 mm."""
        f = self.f
        s = m.section
        depth, length = float(cope["depth"]), float(cope["length"])
        z0 = 0.0 if end == "start" else m.length - length
        op = self.create("IfcOpeningElement", f"cope/{m.tag}/{end}", name=f"Top cope {m.tag} {end}",
                         predefined_type=None if self.feet else "RECESS", ObjectType="COPE",
                         Tag=f"{m.tag}-COPE-{end.upper()}")
        op.ObjectPlacement = self.placement(el.ObjectPlacement)
        w = s.bf + 2.0
        prof = f.create_entity(
            "IfcRectangleProfileDef", ProfileType="AREA", ProfileName=f"cope {depth:g}x{length:g}",
            Position=f.createIfcAxis2Placement2D(
                f.createIfcCartesianPoint((0.0, self.L((1.0 - depth) / 2.0))), None),
            XDim=self.L(w), YDim=self.L(depth + 1.0))
        solid = f.createIfcExtrudedAreaSolid(prof, self.a2p3d((0.0, 0.0, z0)),
                                             self.direction((0.0, 0.0, 1.0)), self.L(length))
        ifcopenshell.api.geometry.assign_representation(
            f, product=op, representation=f.createIfcShapeRepresentation(
                self.body_ctx, "Body", "SweptSolid", [solid]))
        rel = f.create_entity("IfcRelVoidsElement", GlobalId=gid(f"voids/{m.tag}/{end}"),
                              OwnerHistory=self.owner, RelatingBuildingElement=el,
                              RelatedOpeningElement=op)
        self.named.add(rel.id())

    def wall(self, w: WallSpec) -> None:
        f = self.f
        predefined = None if self.feet else "SOLIDWALL"
        el = self.create("IfcWall", f"wall/{w.tag}", name=w.name, predefined_type=predefined, Tag=w.tag)
        sz = self.storey_z[w.storey]
        el.ObjectPlacement = self.placement(self.storeys[w.storey].ObjectPlacement,
                                            (w.bbox_min[0], w.bbox_min[1], w.bbox_min[2] - sz))
        dx, dy, dz = (w.bbox_max[i] - w.bbox_min[i] for i in range(3))
        prof = f.create_entity(
            "IfcRectangleProfileDef", ProfileType="AREA", ProfileName=f"{w.tag} footprint",
            Position=f.createIfcAxis2Placement2D(
                f.createIfcCartesianPoint((self.L(dx / 2.0), self.L(dy / 2.0))), None),
            XDim=self.L(dx), YDim=self.L(dy))
        solid = f.createIfcExtrudedAreaSolid(prof, self.a2p3d(), self.direction((0.0, 0.0, 1.0)), self.L(dz))
        body = f.createIfcShapeRepresentation(self.body_ctx, "Body", "SweptSolid", [solid])
        ifcopenshell.api.geometry.assign_representation(f, product=el, representation=body)
        ifcopenshell.api.material.assign_material(f, products=[el], type="IfcMaterial",
                                                  material=self.material("Concrete", "concrete"))
        self.contain(el, w.storey)
        self.elements[w.tag] = el

    # -- connections -----------------------------------------------------------------------------
    def fin_plate(self, p: FinPlateSpec, storey: str) -> None:
        f = self.f
        asm = self.create("IfcElementAssembly", f"assembly/{p.key}", name=f"Fin plate {p.key}",
                          predefined_type="USERDEFINED", ObjectType="FIN_PLATE",
                          AssemblyPlace="SITE", Tag=p.key,
                          Description=f"fin plate at the {p.end} of {p.beam}")
        sz = self.storey_z[storey]
        origin = (p.origin[0], p.origin[1], p.origin[2] - sz)
        asm.ObjectPlacement = self.placement(self.storeys[storey].ObjectPlacement, origin,
                                             p.z_dir, p.x_dir)
        self.contain(asm, storey)

        plate = self.create("IfcPlate", f"plate/{p.key}", name=f"{p.key} plate {p.thickness:g} mm",
                            Tag=f"{p.key}-PL")
        plate.ObjectPlacement = self.placement(asm.ObjectPlacement)
        rect = f.create_entity(
            "IfcRectangleProfileDef", ProfileType="AREA", ProfileName=f"PL{p.thickness:g}",
            Position=f.createIfcAxis2Placement2D(
                f.createIfcCartesianPoint((self.L(p.width / 2.0), self.L(-p.depth / 2.0))), None),
            XDim=self.L(p.width), YDim=self.L(p.depth))
        solid = f.createIfcExtrudedAreaSolid(rect, self.a2p3d(), self.direction((0.0, 0.0, 1.0)),
                                             self.L(p.thickness))
        ifcopenshell.api.geometry.assign_representation(
            f, product=plate, representation=f.createIfcShapeRepresentation(
                self.body_ctx, "Body", "SweptSolid", [solid]))
        ifcopenshell.api.material.assign_material(f, products=[plate], type="IfcMaterial",
                                                  material=self.material(PLATE_GRADE[1], "steel"))
        self.pset(plate, "Demo_Fabrication", {
            "WeldLeg": f.create_entity("IfcPositiveLengthMeasure", self.L(p.weld_leg)),
            "WeldElectrode": f.create_entity("IfcLabel", p.weld_electrode),
            "WeldBothSides": f.create_entity("IfcBoolean", True),
            "Grade": f.create_entity("IfcLabel", PLATE_GRADE[0]),
        })

        parts = [plate]
        circle = f.create_entity(
            "IfcCircleProfileDef", ProfileType="AREA", ProfileName=p.bolt_size,
            Position=f.createIfcAxis2Placement2D(f.createIfcCartesianPoint((0.0, 0.0)), None),
            Radius=self.L(p.bolt_diameter / 2.0))
        length = p.bolt_length
        z_mid = (p.thickness - p.beam_web_thickness) / 2.0  # centre of the grip (web + plate)
        shank = f.createIfcExtrudedAreaSolid(circle, self.a2p3d((0.0, 0.0, -length / 2.0)),
                                             self.direction((0.0, 0.0, 1.0)), self.L(length))
        shank_rep = f.createIfcShapeRepresentation(self.body_ctx, "Body", "SweptSolid", [shank])
        for i, (bx, by) in enumerate(p.bolt_local_xy(), 1):
            bolt = self.create("IfcMechanicalFastener", f"bolt/{p.key}/{i}",
                               name=f"{p.key} bolt {p.bolt_size} {BOLT_GRADE[1]}",
                               predefined_type=None if self.feet else "BOLT",
                               Tag=f"{p.key}-B{i}",
                               NominalDiameter=self.L(p.bolt_diameter), NominalLength=self.L(length))
            bolt.ObjectPlacement = self.placement(asm.ObjectPlacement, (bx, by, z_mid))
            rep = shank_rep if i == 1 else f.createIfcShapeRepresentation(
                self.body_ctx, "Body", "SweptSolid", [shank])
            ifcopenshell.api.geometry.assign_representation(f, product=bolt, representation=rep)
            ifcopenshell.api.material.assign_material(f, products=[bolt], type="IfcMaterial",
                                                      material=self.material(BOLT_GRADE[0], "steel"))
            self.pset(bolt, "Demo_Fabrication", {
                "BoltSize": f.create_entity("IfcLabel", p.bolt_size),
                "BoltCategory": f.create_entity("IfcLabel", BOLT_GRADE[1]),
            })
            parts.append(bolt)
        for part in parts:
            ifcopenshell.api.aggregate.assign_object(f, products=[part], relating_object=asm)
        self.elements[f"assembly/{p.key}"] = asm

    # -- determinism -----------------------------------------------------------------------------
    def normalise(self) -> None:
        """One owner history everywhere, name-derived GlobalIds for the API's relationships, and
        related-object lists in entity order (the API builds some of them from sets)."""
        f = self.f
        n = 0
        for e in sorted(f.by_type("IfcRoot"), key=lambda e: e.id()):
            e.OwnerHistory = self.owner
            if e.id() not in self.named:
                n += 1
                e.GlobalId = gid(f"auto/{e.is_a()}/{n}")
        for oh in list(f.by_type("IfcOwnerHistory")):
            if oh != self.owner:
                f.remove(oh)
        for rel in f.by_type("IfcRelationship"):
            for i, v in enumerate(rel):
                if isinstance(v, tuple) and v and all(isinstance(x, ifcopenshell.entity_instance) for x in v):
                    rel[i] = sorted(v, key=lambda x: x.id())

    def build(self) -> ifcopenshell.file:
        self.header_and_owner()
        self.spatial()
        for m in self.sc.members:
            self.member(m)
        for w in self.sc.walls:
            self.wall(w)
        storey_of = {m.tag: m.storey for m in self.sc.members}
        for p in self.sc.fin_plates:
            self.fin_plate(p, storey_of[p.beam])
        self.normalise()
        return self.f


def write_ifc(sc: Scenario, schema: str, path: Path) -> Path:
    """Write the scenario to ``path`` as ``schema`` ("IFC4": mm and N; "IFC2X3": feet and lbf)."""
    f = _Writer(sc, schema).build()
    h = f.header.file_name
    h.name = path.name
    h.time_stamp = TIMESTAMP
    h.author = ("Imogen Okafor (invented)",)
    h.organization = ("Tarrawong Structural Studio (invented)",)
    h.preprocessor_version = GENERATOR
    h.originating_system = GENERATOR
    h.authorization = "none"
    f.header.file_description.description = (
        "ViewDefinition [CoordinationView]" if schema == "IFC2X3" else "ViewDefinition [ReferenceView]",)
    tmp = path.with_name(path.name + ".tmp")
    f.write(str(tmp))
    tmp.replace(path)
    return path
