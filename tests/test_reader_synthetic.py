"""The frame reader on small models built here, one feature at a time, under IFC2X3, IFC4 and
IFC4X3: units (SI prefixes, feet, inches, kip), connection parts, roles, the representation
fallbacks and the warnings for bad elements. Expected values follow from the entities the
test writes (no other source is needed)."""

from __future__ import annotations

import ifcopenshell
import ifcopenshell.guid
import pytest

from ifc_io import read_frame
from ifc_io.units import force_scale_to_n, length_scale_to_mm

SCHEMAS = ["IFC2X3", "IFC4", "IFC4X3"]


class Builder:
    """A minimal spatial structure in one schema, and helpers to add framing to it."""

    def __init__(self, schema="IFC4", length_unit=None, force_unit=None):
        self.f = ifcopenshell.file(schema=schema)
        self.schema = schema
        c = self.f.create_entity
        self.origin = self.pt(0.0, 0.0, 0.0)
        self.wcs = c("IfcAxis2Placement3D", Location=self.origin)
        ctx = c("IfcGeometricRepresentationContext", ContextType="Model", CoordinateSpaceDimension=3,
                Precision=1e-5, WorldCoordinateSystem=self.wcs)
        self.body_ctx = ctx
        units = []
        if length_unit is not None:
            units.append(length_unit(self))
        if force_unit is not None:
            units.append(force_unit(self))
        ua = c("IfcUnitAssignment", Units=units) if units else None
        self.project = c("IfcProject", GlobalId=self.gid(), Name="P", RepresentationContexts=[ctx],
                         UnitsInContext=ua)
        site_pl = c("IfcLocalPlacement", RelativePlacement=self.wcs)
        self.site = c("IfcSite", GlobalId=self.gid(), Name="Site", ObjectPlacement=site_pl)
        self.storey_pl = c("IfcLocalPlacement", PlacementRelTo=site_pl,
                           RelativePlacement=c("IfcAxis2Placement3D", Location=self.pt(0.0, 0.0, 100.0)))
        self.storey = c("IfcBuildingStorey", GlobalId=self.gid(), Name="Level 1", ObjectPlacement=self.storey_pl)
        c("IfcRelAggregates", GlobalId=self.gid(), RelatingObject=self.project, RelatedObjects=[self.site])
        c("IfcRelAggregates", GlobalId=self.gid(), RelatingObject=self.site, RelatedObjects=[self.storey])
        self.contained = []

    # -- primitives ----------------------------------------------------------------------------
    def gid(self):
        return ifcopenshell.guid.new()

    def pt(self, *xyz):
        return self.f.create_entity("IfcCartesianPoint", Coordinates=[float(v) for v in xyz])

    def dir(self, *xyz):
        return self.f.create_entity("IfcDirection", DirectionRatios=[float(v) for v in xyz])

    def a2p(self, loc=(0, 0, 0), z=None, x=None):
        return self.f.create_entity("IfcAxis2Placement3D", Location=self.pt(*loc),
                                    Axis=self.dir(*z) if z else None, RefDirection=self.dir(*x) if x else None)

    def placement(self, loc=(0, 0, 0), z=None, x=None, rel=None):
        return self.f.create_entity("IfcLocalPlacement", PlacementRelTo=rel or self.storey_pl,
                                    RelativePlacement=self.a2p(loc, z, x))

    def shape(self, *reps):
        return self.f.create_entity("IfcProductDefinitionShape", Representations=list(reps))

    def rep(self, ident, rtype, items):
        return self.f.create_entity("IfcShapeRepresentation", ContextOfItems=self.body_ctx,
                                    RepresentationIdentifier=ident, RepresentationType=rtype, Items=list(items))

    def i_profile(self, name="IPE300", b=150.0, d=300.0, tw=7.1, tf=10.7, r=15.0):
        pos = None  # IFC4 profiles may omit their Position; IFC2X3 requires it
        if self.schema == "IFC2X3":
            pos = self.f.create_entity("IfcAxis2Placement2D", Location=self.pt(0.0, 0.0))
        return self.f.create_entity("IfcIShapeProfileDef", ProfileType="AREA", ProfileName=name, Position=pos,
                                    OverallWidth=b, OverallDepth=d, WebThickness=tw, FlangeThickness=tf,
                                    FilletRadius=r)

    def rect_profile(self, name, x, y, at=(0.0, 0.0)):
        pos = self.f.create_entity("IfcAxis2Placement2D", Location=self.pt(*at))
        return self.f.create_entity("IfcRectangleProfileDef", ProfileType="AREA", ProfileName=name,
                                    Position=pos, XDim=float(x), YDim=float(y))

    def extrusion(self, profile, depth, loc=(0, 0, 0), z=None, x=None, direction=(0, 0, 1)):
        return self.f.create_entity("IfcExtrudedAreaSolid", SweptArea=profile, Position=self.a2p(loc, z, x),
                                    ExtrudedDirection=self.dir(*direction), Depth=float(depth))

    def polyline(self, *pts):
        return self.f.create_entity("IfcPolyline", Points=[self.pt(*p) for p in pts])

    def material(self, name, element):
        mat = self.f.create_entity("IfcMaterial", Name=name)
        self.f.create_entity("IfcRelAssociatesMaterial", GlobalId=self.gid(), RelatedObjects=[element],
                             RelatingMaterial=mat)
        return mat

    def element(self, cls, name="", placement=None, shape=None, **kw):
        e = self.f.create_entity(cls, GlobalId=self.gid(), Name=name, ObjectPlacement=placement,
                                 Representation=shape, **kw)
        self.contained.append(e)
        return e

    def beam_along_x(self, length, loc=(0, 0, 0), cls="IfcBeam", profile=None, axis=True, **kw):
        """A member whose local z runs along world +X: Axis (0,0,0)->(0,0,L), body extruded L."""
        pl = self.placement(loc, z=(1, 0, 0), x=(0, 1, 0))
        prof = profile or self.i_profile()
        reps = [self.rep("Body", "SweptSolid", [self.extrusion(prof, length)])]
        if axis:
            reps.insert(0, self.rep("Axis", "Curve3D", [self.polyline((0, 0, 0), (0, 0, length))]))
        return self.element(cls, kw.pop("name", "B"), pl, self.shape(*reps), **kw)

    def finish(self, tmp_path, name="m.ifc"):
        self.f.create_entity("IfcRelContainedInSpatialStructure", GlobalId=self.gid(),
                             RelatedElements=self.contained, RelatingStructure=self.storey)
        path = tmp_path / name
        self.f.write(str(path))
        return path


def si(prefix, name, utype="LENGTHUNIT"):
    def make(b):
        kw = {"UnitType": utype, "Name": name}
        if prefix:
            kw["Prefix"] = prefix
        return b.f.create_entity("IfcSIUnit", **kw)
    return make


def conversion(name, value, base_prefix, base_name, utype="LENGTHUNIT", measure="IfcLengthMeasure"):
    def make(b):
        base = si(base_prefix, base_name, utype)(b)
        mwu = b.f.create_entity("IfcMeasureWithUnit", ValueComponent=b.f.create_entity(measure, value),
                                UnitComponent=base)
        dims = b.f.create_entity("IfcDimensionalExponents", 1, 0, 0, 0, 0, 0, 0)
        return b.f.create_entity("IfcConversionBasedUnit", Dimensions=dims, UnitType=utype, Name=name,
                                 ConversionFactor=mwu)
    return make


# ---------------------------------------------------------------------------------------------
# Units
# ---------------------------------------------------------------------------------------------


@pytest.mark.parametrize("schema", SCHEMAS)
@pytest.mark.parametrize("unit, name, factor", [
    (si("MILLI", "METRE"), "MILLIMETRE", 1.0),
    (si(None, "METRE"), "METRE", 1000.0),
    (si("CENTI", "METRE"), "CENTIMETRE", 10.0),
    (conversion("FOOT", 0.3048, None, "METRE"), "FOOT", 304.8),
    (conversion("inch", 25.4, "MILLI", "METRE"), "INCH", 25.4),
])
def test_length_units_convert_to_mm_at_the_boundary(tmp_path, schema, unit, name, factor):
    b = Builder(schema, length_unit=unit)
    b.beam_along_x(10.0, loc=(1.0, 2.0, 0.0), profile=b.rect_profile("R", 0.5, 1.0))
    path = b.finish(tmp_path)
    model = ifcopenshell.open(str(path))
    got_name, got = length_scale_to_mm(model)
    assert got_name == name and got == pytest.approx(factor)
    f = read_frame(path)
    assert f.length_unit == name and f.mm_per_unit == pytest.approx(factor)
    m = f.members[0]
    # the storey sits at z = 100 units; the beam starts at (1, 2, 0) in it and runs 10 units along +X
    assert m.start == pytest.approx((1.0 * factor, 2.0 * factor, 100.0 * factor))
    assert m.length == pytest.approx(10.0 * factor)
    assert m.section.depth == pytest.approx(1.0 * factor) and m.section.width == pytest.approx(0.5 * factor)


@pytest.mark.parametrize("schema", SCHEMAS)
def test_force_units(tmp_path, schema):
    b = Builder(schema, length_unit=si("MILLI", "METRE"), force_unit=si("KILO", "NEWTON", "FORCEUNIT"))
    f = read_frame(b.finish(tmp_path))
    assert (f.force_unit, f.n_per_force_unit) == ("KILONEWTON", 1000.0)
    b = Builder(schema, length_unit=conversion("FOOT", 0.3048, None, "METRE"),
                force_unit=conversion("KIP", 4448.2216152605, None, "NEWTON", "FORCEUNIT", "IfcReal"))
    model = ifcopenshell.open(str(b.finish(tmp_path, "kip.ifc")))
    name, n = force_scale_to_n(model)
    assert name == "KIP" and n == pytest.approx(4448.2216152605, rel=1e-12)


def test_missing_units_are_assumed_si_with_warnings(tmp_path):
    f = read_frame(Builder("IFC4").finish(tmp_path))
    assert (f.length_unit, f.mm_per_unit, f.force_unit, f.n_per_force_unit) == ("METRE", 1000.0, "NEWTON", 1.0)
    messages = " ".join(w.message for w in f.warnings)
    assert "no length unit" in messages and "no force unit" in messages


# ---------------------------------------------------------------------------------------------
# Members: roles, sections, steel, fallbacks, warnings
# ---------------------------------------------------------------------------------------------


@pytest.mark.parametrize("schema", SCHEMAS)
def test_member_roles(tmp_path, schema):
    b = Builder(schema, length_unit=si("MILLI", "METRE"))
    beam = b.beam_along_x(5000.0, name="beam")
    col = b.element("IfcColumn", "col", b.placement((0, 0, 0)), b.shape(
        b.rep("Axis", "Curve3D", [b.polyline((0, 0, 0), (0, 0, 3000))])))

    def member(name, end, **kw):
        return b.element("IfcMember", name, b.placement((0, 0, 0)), b.shape(
            b.rep("Axis", "Curve3D", [b.polyline((0, 0, 0), end)])), **kw)

    flat = member("flat", (4000, 0, 300))            # 4.3° from horizontal -> beam
    upright = member("upright", (100, 0, 3000))      # 1.9° from vertical -> other
    diagonal = member("diagonal", (3000, 0, 3000))   # 45° -> brace
    typed = {}
    if schema != "IFC2X3":
        typed["brace"] = member("declared brace", (4000, 0, 0), PredefinedType="BRACE")
        typed["post"] = member("declared post", (4000, 0, 0), PredefinedType="POST")
    f = read_frame(b.finish(tmp_path))
    role = {m.global_id: m.role for m in f.members}
    assert role[beam.GlobalId] == "beam" and role[col.GlobalId] == "column"
    assert role[flat.GlobalId] == "beam"
    assert role[upright.GlobalId] == "other"
    assert role[diagonal.GlobalId] == "brace"
    if typed:
        assert role[typed["brace"].GlobalId] == "brace"
        assert role[typed["post"].GlobalId] == "column"
        assert {m.predefined_type for m in f.members if m.global_id == typed["brace"].GlobalId} == {"BRACE"}


@pytest.mark.parametrize("schema", SCHEMAS)
def test_bad_elements_become_warnings_with_their_global_id(tmp_path, schema):
    b = Builder(schema, length_unit=si("MILLI", "METRE"))
    good = b.beam_along_x(3000.0, name="good")
    bare = b.element("IfcBeam", "no representation", b.placement())
    zero = b.element("IfcBeam", "zero", b.placement(), b.shape(
        b.rep("Axis", "Curve3D", [b.polyline((0, 0, 0), (0, 0, 0))])))
    nothing = b.element("IfcColumn", "annotation only", b.placement(), b.shape(
        b.rep("Annotation", "Annotation2D", [b.polyline((0, 0), (1, 1))])))
    f = read_frame(b.finish(tmp_path))
    assert [m.global_id for m in f.members] == [good.GlobalId]
    by_id = {w.global_id: w.message for w in f.warnings if w.global_id}
    assert "axis not found" in by_id[bare.GlobalId] and "no representation" in by_id[bare.GlobalId]
    assert "zero-length axis" in by_id[zero.GlobalId]
    assert "axis not found" in by_id[nothing.GlobalId]
    # the good member has no material: the default grade, with a warning
    assert f.members[0].steel.grade == "default" and "no material" in by_id[good.GlobalId]


@pytest.mark.parametrize("schema", SCHEMAS)
def test_sections_from_names_and_unknown_sections(tmp_path, schema):
    b = Builder(schema, length_unit=si("MILLI", "METRE"))
    outline = b.f.create_entity("IfcArbitraryClosedProfileDef", ProfileType="AREA", ProfileName="HE 200 A",
                                OuterCurve=b.polyline((-100, -95), (100, -95), (100, 95), (-100, 95), (-100, -95)))
    named = b.beam_along_x(4000.0, profile=outline, name="named")
    anon = b.f.create_entity("IfcArbitraryClosedProfileDef", ProfileType="AREA", ProfileName="custom",
                             OuterCurve=b.polyline((-50, -50), (50, -50), (50, 50), (-50, 50), (-50, -50)))
    by_name = b.beam_along_x(4000.0, profile=anon, name="W12x26")   # the element's Name names it
    unknown = b.beam_along_x(4000.0, profile=b.f.create_entity(
        "IfcArbitraryClosedProfileDef", ProfileType="AREA", ProfileName="mystery",
        OuterCurve=b.polyline((-5, -5), (5, -5), (5, 5), (-5, -5))), name="odd one")
    f = read_frame(b.finish(tmp_path))
    sec = {m.global_id: m.section for m in f.members}
    assert sec[named.GlobalId].source == "catalog:sections_en" and sec[named.GlobalId].depth == 190
    assert sec[by_name.GlobalId].source == "catalog:sections_us"
    assert sec[unknown.GlobalId].kind == "unknown" and sec[unknown.GlobalId].name == "mystery"
    warned = [w.message for w in f.warnings if w.global_id == unknown.GlobalId]
    assert any("section unknown" in w and "'mystery'" in w and "odd one" in w for w in warned)


@pytest.mark.parametrize("schema", SCHEMAS)
def test_steel_grades_default_and_map(tmp_path, schema):
    b = Builder(schema, length_unit=si("MILLI", "METRE"))
    s355 = b.beam_along_x(3000.0, name="a")
    b.material("Steel S355J2", s355)
    a992 = b.beam_along_x(3000.0, name="b")
    b.material("ASTM A992", a992)
    odd = b.beam_along_x(3000.0, name="c")
    b.material("Metal - Steel - 345 MPa", odd)
    conc = b.beam_along_x(3000.0, name="d")
    b.material("Concrete C32/40", conc)
    path = b.finish(tmp_path)

    f = read_frame(path, default_steel="Grade 300")
    grade = {m.global_id: (m.steel.grade if m.steel else None) for m in f.members}
    assert grade[s355.GlobalId] == "S355" and grade[a992.GlobalId] == "A992"
    assert grade[odd.GlobalId] == "AS/NZS 3679.1-300"  # the default asked for, with a warning
    assert grade[conc.GlobalId] is None
    assert any(w.global_id == odd.GlobalId and "no known steel grade" in w.message for w in f.warnings)
    assert any(w.global_id == conc.GlobalId and "not steel" in w.message for w in f.warnings)

    config = {"code": "aisc360", "materials": {"default_grade": "", "map": {"Metal - Steel - 345 MPa": "A992"}}}
    f = read_frame(path, config=config)
    grade = {m.global_id: m.steel.grade for m in f.members if m.steel}
    assert grade[odd.GlobalId] == "A992"
    assert not any(w.global_id == odd.GlobalId for w in f.warnings)
    f = read_frame(path, config={"code": "en1993"})  # the code's usual member grade
    assert {m.steel.grade for m in f.members if m.global_id == odd.GlobalId} == {"S355"}


def test_body_only_member_with_cardinal_point_reports_the_reference_line(tmp_path):
    """IFC4: a profile set usage with cardinal point 8 (top middle) and a body whose profile is
    placed 150 below the solid origin: the axis is the top line, not the centroid line."""
    b = Builder("IFC4", length_unit=si("MILLI", "METRE"))
    prof = b.i_profile()
    pl = b.placement((0, 0, 3000), z=(1, 0, 0), x=(0, 1, 0))
    body = b.rep("Body", "SweptSolid", [b.extrusion(prof, 6000, loc=(0, -150, 0))])
    beam = b.element("IfcBeam", "top", pl, b.shape(body))
    mat = b.f.create_entity("IfcMaterial", Name="S275")
    pset = b.f.create_entity("IfcMaterialProfileSet", MaterialProfiles=[
        b.f.create_entity("IfcMaterialProfile", Material=mat, Profile=prof)])
    usage = b.f.create_entity("IfcMaterialProfileSetUsage", ForProfileSet=pset, CardinalPoint=8)
    b.f.create_entity("IfcRelAssociatesMaterial", GlobalId=b.gid(), RelatedObjects=[beam], RelatingMaterial=usage)
    f = read_frame(b.finish(tmp_path))
    m = f.members[0]
    assert m.axis_source == "body" and m.cardinal_point == 8
    # placement x is world +Y, so the profile's y (web) is world z = ... local y = z × x
    # = (1,0,0) × (0,1,0) = (0,0,1); the solid sits 150 below: centroid line at z = 100+3000-150.
    # The cardinal point puts the axis 150 above the centroid again: z = 3100.
    assert m.start == pytest.approx((0.0, 0.0, 3100.0)) and m.end == pytest.approx((6000.0, 0.0, 3100.0))
    assert m.axis_offset == (0.0, 150.0)
    assert m.web_dir == pytest.approx((0.0, 0.0, 1.0))
    assert m.steel.grade == "S275"


@pytest.mark.parametrize("schema", SCHEMAS)
def test_axis_through_type_representation_maps_and_mapped_items(tmp_path, schema):
    b = Builder(schema, length_unit=si("MILLI", "METRE"))
    c = b.f.create_entity
    prof = b.i_profile("310UB40.4", 165, 304, 6.1, 10.2, 11.4)
    body = b.rep("Body", "SweptSolid", [b.extrusion(prof, 2000)])
    # map origin 500 up the map's z; occurrence mapped through a target shifted 1000 in x
    rmap = c("IfcRepresentationMap", MappingOrigin=b.a2p((0, 0, 500)), MappedRepresentation=body)
    target = c("IfcCartesianTransformationOperator3D", LocalOrigin=b.pt(1000, 0, 0), Scale=1.0)
    mapped = c("IfcMappedItem", MappingSource=rmap, MappingTarget=target)
    col = b.element("IfcColumn", "mapped", b.placement((10, 20, 0)),
                    b.shape(b.rep("Body", "MappedRepresentation", [mapped])))
    # a second column with no representation of its own: the type's representation map is used
    ctype = c("IfcColumnType", GlobalId=b.gid(), Name="UC type", RepresentationMaps=[rmap],
              PredefinedType="COLUMN")
    bare = b.element("IfcColumn", "typed", b.placement((0, 5000, 0)))
    c("IfcRelDefinesByType", GlobalId=b.gid(), RelatedObjects=[bare], RelatingType=ctype)
    f = read_frame(b.finish(tmp_path))
    got = {m.global_id: m for m in f.members}
    m = got[col.GlobalId]
    # placement (10, 20, 100) + target (1000, 0, 0) + origin (0, 0, 500): start (1010, 20, 600)
    assert m.start == pytest.approx((1010.0, 20.0, 600.0)) and m.end == pytest.approx((1010.0, 20.0, 2600.0))
    t = got[bare.GlobalId]
    assert t.start == pytest.approx((0.0, 5000.0, 600.0)) and t.length == pytest.approx(2000.0)
    assert t.section.name == "310UB40.4" and t.section.kind == "I"


def test_brep_only_member_uses_its_vertices(tmp_path):
    b = Builder("IFC4", length_unit=si("MILLI", "METRE"))
    c = b.f.create_entity
    pts = [(x, y, z) for x in (0, 4000) for y in (-50, 50) for z in (-100, 100)]
    face_set = c("IfcTriangulatedFaceSet", Coordinates=c("IfcCartesianPointList3D", CoordList=pts),
                 CoordIndex=[(1, 2, 3)])
    beam = b.element("IfcBeam", "brep", b.placement((0, 0, 0)), b.shape(b.rep("Body", "Tessellation", [face_set])))
    f = read_frame(b.finish(tmp_path))
    m = f.members[0]
    assert m.length == pytest.approx(4000.0)
    assert m.start[1:] == pytest.approx((0.0, 100.0)) and {round(m.start[0]), round(m.end[0])} == {0, 4000}
    assert any(w.global_id == beam.GlobalId and "principal direction" in w.message for w in f.warnings)


def test_requested_properties_are_read(tmp_path):
    b = Builder("IFC4", length_unit=si("MILLI", "METRE"))
    beam = b.beam_along_x(3000.0)
    c = b.f.create_entity
    prop = c("IfcPropertySingleValue", Name="StartShear", NominalValue=c("IfcForceMeasure", 85.0))
    pset = c("IfcPropertySet", GlobalId=b.gid(), Name="Analysis", HasProperties=[prop])
    c("IfcRelDefinesByProperties", GlobalId=b.gid(), RelatedObjects=[beam], RelatingPropertyDefinition=pset)
    f = read_frame(b.finish(tmp_path), config={"demand": {"start_shear": "Analysis.StartShear", "end_shear": ""}})
    assert f.members[0].properties == {"Analysis.StartShear": 85.0}


# ---------------------------------------------------------------------------------------------
# Connection parts
# ---------------------------------------------------------------------------------------------


@pytest.mark.parametrize("schema", SCHEMAS)
def test_connection_parts(tmp_path, schema):
    b = Builder(schema, length_unit=si("MILLI", "METRE"))
    c = b.f.create_entity
    beam = b.beam_along_x(6000.0, name="B1")
    column = b.element("IfcColumn", "C1", b.placement((-200, 0, -3000)), b.shape(
        b.rep("Axis", "Curve3D", [b.polyline((0, 0, 0), (0, 0, 6000))])))
    # a 10 mm fin plate, 100 wide (along x) and 250 deep (vertical): a 100 x 250 rectangle in the
    # plate's xz plane extruded 10 along y
    plate_shape = b.shape(b.rep("Body", "SweptSolid", [
        b.extrusion(b.rect_profile("PL10", 100, 250, at=(50, -125)), 10, z=(0, 1, 0), x=(1, 0, 0))]))
    plate = b.element("IfcPlate", "PL10", b.placement((-100, -5, 0)), plate_shape, Tag="p1")
    b.material("AS/NZS 3678-250", plate)
    bolt_shape = b.shape(b.rep("Body", "SweptSolid", [
        b.extrusion(c("IfcCircleProfileDef", ProfileType="AREA", Radius=10.0), 60, z=(0, 1, 0), x=(1, 0, 0))]))
    bolt = b.element("IfcMechanicalFastener", "M20", b.placement((-50, -30, 0)), bolt_shape,
                     NominalDiameter=20.0, NominalLength=60.0)
    other = b.element("IfcFastener", "weld")
    accessory = b.element("IfcDiscreteAccessory", "shim", b.placement((0, 0, 0)))
    assembly = b.element("IfcElementAssembly", "joint 1", b.placement((0, 0, 0)))
    c("IfcRelAggregates", GlobalId=b.gid(), RelatingObject=assembly, RelatedObjects=[beam, plate, bolt])
    c("IfcRelConnectsElements", GlobalId=b.gid(), RelatingElement=plate, RelatedElement=column)
    f = read_frame(b.finish(tmp_path))

    parts = {p.global_id: p for p in f.parts}
    assert len(parts) == 5  # the IFC2X3 bolt (a subtype of IfcFastener there) is read once
    assert f.counts_by_class["IfcMechanicalFastener"] == 1
    assert f.counts_by_class["IfcFastener"] == (2 if schema == "IFC2X3" else 1)
    p = parts[plate.GlobalId]
    assert p.kind == "plate" and p.tag == "p1" and p.material == "AS/NZS 3678-250"
    assert p.dims["thickness"] == pytest.approx(10.0)
    assert p.dims["depth"] == pytest.approx(250.0) and p.dims["width"] == pytest.approx(100.0)
    assert (p.dims["normal_x"], abs(p.dims["normal_y"]), p.dims["normal_z"]) == pytest.approx((0.0, 1.0, 0.0))
    # centre: placement (-100, -5, 100) + the profile centre (50, -125) in the solid's (x, y),
    # where the solid's x = world +x and y = z × x = (0,1,0) × (1,0,0) = world -z: (50, 0, 125),
    # + half the extrusion, 5 along the solid's z = world +y
    assert (p.dims["centre_x"], p.dims["centre_y"], p.dims["centre_z"]) == pytest.approx((-50.0, 0.0, 225.0))
    assert p.origin == pytest.approx((-100.0, -5.0, 100.0))
    assert p.assembly == assembly.GlobalId
    assert column.GlobalId in p.hosts and beam.GlobalId in p.hosts
    bt = parts[bolt.GlobalId]
    assert bt.kind == "bolt" and bt.nominal_diameter == 20.0 and bt.nominal_length == 60.0
    assert bt.dims["diameter"] == 20.0 and bt.dims["length"] == 60.0
    assert (bt.dims["axis_x"], bt.dims["axis_y"], bt.dims["axis_z"]) == pytest.approx((0.0, 1.0, 0.0))
    assert bt.assembly == assembly.GlobalId and beam.GlobalId in bt.hosts
    assert parts[other.GlobalId].kind == "fastener"
    assert parts[accessory.GlobalId].kind == "accessory"
    a = parts[assembly.GlobalId]
    assert a.kind == "assembly" and a.hosts == (beam.GlobalId,) and a.assembly is None
    assert all(x.storey == "Level 1" for x in f.parts)


@pytest.mark.parametrize("schema", SCHEMAS)
def test_walls_and_slabs_are_bearings(tmp_path, schema):
    b = Builder(schema, length_unit=si("MILLI", "METRE"))
    # the wall's profile is placed by its own Position (2000, 0), the slab's solid by its Position
    wall_body = b.rep("Body", "SweptSolid", [b.extrusion(b.rect_profile("W", 4000, 200, at=(2000, 0)), 3000)])
    wall = b.element("IfcWall", "wall", b.placement((0, 0, 0)), b.shape(wall_body))
    slab_body = b.rep("Body", "SweptSolid", [b.extrusion(b.rect_profile("S", 6000, 6000), 200,
                                                         loc=(0, 0, -200))])
    slab = b.element("IfcSlab", "slab", b.placement((3000, 3000, 3000)), b.shape(slab_body))
    f = read_frame(b.finish(tmp_path))
    box = {x.global_id: x for x in f.bearings}
    assert box[wall.GlobalId].bbox_min == pytest.approx((0.0, -100.0, 100.0))
    assert box[wall.GlobalId].bbox_max == pytest.approx((4000.0, 100.0, 3100.0))
    assert box[slab.GlobalId].bbox_min == pytest.approx((0.0, 0.0, 2900.0))
    assert box[slab.GlobalId].bbox_max == pytest.approx((6000.0, 6000.0, 3100.0))
    assert box[slab.GlobalId].storey == "Level 1"


def test_a_body_nothing_else_reads_is_tessellated_as_a_last_resort(tmp_path):
    """A CSG block is neither an Axis, a swept solid nor a vertex list: only then does the reader
    ask IfcOpenShell's geometry kernel for the body, and says so."""
    b = Builder("IFC4", length_unit=si("MILLI", "METRE"))
    c = b.f.create_entity
    block = c("IfcBlock", Position=b.a2p((0, -100, -150)), XLength=4000.0, YLength=200.0, ZLength=300.0)
    csg = c("IfcCsgSolid", TreeRootExpression=block)
    beam = b.element("IfcBeam", "block", b.placement((1000, 0, 0)), b.shape(b.rep("Body", "CSG", [csg])))
    f = read_frame(b.finish(tmp_path))
    (m,) = f.members
    assert m.length == pytest.approx(4000.0, abs=1.0)
    assert sorted([m.start[0], m.end[0]]) == pytest.approx([1000.0, 5000.0], abs=1.0)
    assert m.start[1:] == pytest.approx((0.0, 100.0), abs=1.0)  # the block's centre line, storey at z 100
    assert any(w.global_id == beam.GlobalId and "tessellating" in w.message for w in f.warnings)


def test_web_direction_from_the_placement_when_there_is_no_body(tmp_path):
    b = Builder("IFC4", length_unit=si("MILLI", "METRE"))
    # local z along world +X, local x = RefDirection world +Y: local y = z × x = world +Z
    along_z = b.element("IfcBeam", "z", b.placement((0, 0, 0), z=(1, 0, 0), x=(0, 1, 0)), b.shape(
        b.rep("Axis", "Curve3D", [b.polyline((0, 0, 0), (0, 0, 5000))])))
    # axis along local x (world +Y after a 90° turn about z): web along local z = world +Z
    along_x = b.element("IfcBeam", "x", b.placement((0, 0, 0), z=(0, 0, 1), x=(0, 1, 0)), b.shape(
        b.rep("Axis", "Curve2D", [b.polyline((0, 0), (5000, 0))])))
    skew = b.element("IfcBeam", "skew", b.placement((0, 0, 0)), b.shape(
        b.rep("Axis", "Curve3D", [b.polyline((0, 0, 0), (3000, 4000, 0))])))
    f = read_frame(b.finish(tmp_path))
    got = {m.global_id: m for m in f.members}
    assert got[along_z.GlobalId].web_dir == pytest.approx((0.0, 0.0, 1.0))
    assert got[along_z.GlobalId].end == pytest.approx((5000.0, 0.0, 100.0))
    assert got[along_x.GlobalId].web_dir == pytest.approx((0.0, 0.0, 1.0))
    assert got[along_x.GlobalId].end == pytest.approx((0.0, 5000.0, 100.0))
    assert got[skew.GlobalId].web_dir is None
