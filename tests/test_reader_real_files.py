"""The frame reader on the real public IFC files in shared/models (see its SOURCES.md).

Counts are compared with what IfcOpenShell's ``by_type`` reports for the same classes. Axis end
points and lengths are checked against values read by hand from the STEP text of each file: the
line numbers of the entities used are given beside each expected value, and the arithmetic that
takes them to world coordinates (mm) is written out in the comments.
"""

from __future__ import annotations

import math

import ifcopenshell
import pytest

from helpers_models import REAL_FILES
from ifc_io import open_model, read_frame

_FRAMES: dict[str, object] = {}


def frame_of(shared_models, name):
    if name not in _FRAMES:
        _FRAMES[name] = read_frame(shared_models / name)
    return _FRAMES[name]


def member(frame, global_id):
    hits = [m for m in frame.members if m.global_id == global_id]
    assert len(hits) == 1, f"{global_id} not read"
    return hits[0]


def close(a, b, tol=0.5):
    return all(abs(x - y) <= tol for x, y in zip(a, b))


@pytest.mark.parametrize("name", REAL_FILES)
def test_counts_match_ifcopenshell_and_every_member_is_read(shared_models, name):
    model = ifcopenshell.open(str(shared_models / name))
    frame = frame_of(shared_models, name)
    for cls in ("IfcBeam", "IfcColumn", "IfcMember"):
        assert frame.counts_by_class[cls] == len(model.by_type(cls)), cls
    expected = sum(len(model.by_type(c)) for c in ("IfcBeam", "IfcColumn", "IfcMember"))
    assert len(frame.members) == expected  # none of these files has a member without an axis
    assert len({m.global_id for m in frame.members}) == len(frame.members)
    by_class = {c: sum(1 for m in frame.members if m.ifc_class == c) for c in ("IfcBeam", "IfcColumn")}
    assert by_class["IfcBeam"] == len(model.by_type("IfcBeam"))
    assert by_class["IfcColumn"] == len(model.by_type("IfcColumn"))
    for m in frame.members:
        assert m.length > 1.0
        assert m.role in ("beam", "column", "brace", "other")
        if m.web_dir is not None:
            assert math.isclose(math.hypot(*m.web_dir), 1.0, abs_tol=1e-9)
    for w in frame.warnings:
        assert w.stage == "read"


def test_small_steel_frame_ifc2x3_body_only(shared_models):
    """Tekla IFC2X3, mm, swept solids with parametric I profiles, members inside assemblies."""
    f = frame_of(shared_models, "small-steel-frame-ifc2x3-mm.ifc")
    assert (f.schema, f.length_unit, f.mm_per_unit) == ("IFC2X3", "MILLIMETRE", 1.0)
    assert f.force_unit == "NEWTON" and any("no force unit" in w.message for w in f.warnings)
    assert f.counts_by_class["IfcBeam"] == 12 and f.counts_by_class["IfcColumn"] == 9
    assert all(m.axis_source == "body" for m in f.members)

    # Beam #889 (line 897), placement #876 (line 884): origin #874 (0, 0, 4798.3999939)
    # (line 882), Axis #9 = +Z, RefDirection #8 = +Y, relative to #852 -> #31 (identity, lines
    # 860, 39). Body #885 (line 893): Position #884 (line 892) at #883 (6000, 0, 0) with Axis
    # #882 (-1, 0, 0), extruded along its +Z by 6000. The placement's x is world +Y, so the
    # solid's origin (6000, 0, 0) is world (0, 6000, 4798.4) and its end 6000 along local -x is
    # world (0, 0, 4798.4).
    b = member(f, "1NXr_l001Grp4qDZWqE3at")
    assert b.role == "beam" and b.ifc_class == "IfcBeam"
    assert close(b.start, (0.0, 6000.0, 4798.4), 0.01)
    assert close(b.end, (0.0, 0.0, 4798.4), 0.01)
    assert b.length == pytest.approx(6000.0)
    # Solid x = RefDirection #66 (0,-1,0), y = z × x = (-1,0,0)×(0,-1,0) = (0,0,1): the web is vertical
    assert close(b.web_dir, (0.0, 0.0, 1.0), 1e-9)
    assert b.axis_offset == (0.0, 0.0)  # the profile is centred on the solid's origin
    # Section: IfcIShapeProfileDef #881 (line 889): width 142.4, depth 403.2, tw 6.8, tf 11.2, r 10.2
    s = b.section
    assert (s.kind, s.source, s.name) == ("I", "ifc-parametric", "UB406*140*46")
    assert s.depth == pytest.approx(403.2, abs=1e-3) and s.width == pytest.approx(142.4, abs=1e-3)
    assert s.web_thickness == pytest.approx(6.8, abs=1e-3)
    assert s.flange_thickness == pytest.approx(11.2, abs=1e-3)
    assert s.root_radius == pytest.approx(10.2, abs=1e-3)
    # Material #139 'STEEL/S275J0' (line 147), associated to all 21 members (#2159, line 2167)
    assert b.steel is not None and b.steel.grade == "S275"
    # The beam is in an assembly (#853) contained in storey #32 'Undefined' (line 40)
    assert b.storey == "Undefined"
    assert (b.name, b.tag) == ("BEAM", "1007")

    # Column #74 (line 82): placement #57 (line 65) identity via #34, #31; Body #70 (line 78):
    # Position #69 (line 77) at (0, 0, 5000) with Axis (0, 0, -1), depth 5000 -> (0,0,5000)->(0,0,0)
    c = member(f, "1NXr_l001Gip4qDZWqE3at")
    assert c.role == "column"
    assert close(c.start, (0.0, 0.0, 5000.0), 0.01) and close(c.end, (0.0, 0.0, 0.0), 0.01)

    # 21 element assemblies, each hosting its one member (IfcRelAggregates)
    assemblies = [p for p in f.parts if p.kind == "assembly"]
    assert len(assemblies) == 21
    hosted = {h for p in assemblies for h in p.hosts}
    assert hosted == {m.global_id for m in f.members}


def test_simple_frame_ifc4_metres_with_profile_set_usages(shared_models):
    """BlenderBIM IFC4 in metres: Axis + Body, material profile set usages (cardinal point 5)."""
    f = frame_of(shared_models, "simple-frame-ifc4-m.ifc")
    assert (f.schema, f.length_unit, f.mm_per_unit) == ("IFC4", "METRE", 1000.0)
    assert all(m.axis_source == "axis" for m in f.members)

    # Beam #9467 (line 9377): placement #9680 (line 9435) at #9676 (3.0e-9, -0.0800002, 3.0) m
    # (line 9431), Axis #9677 ~ +Y (line 9432), relative to #65 -> #59 -> #53, all at the origin
    # (lines 57, 51, 45, 41). Its Axis representation #9668 (line 9423) runs along local z from
    # ~(0, 0, 0) to ~(0, 0, 3.16) m (#9666, line 9421): world (0, -80, 3000) -> (0, 3080, 3000) mm.
    b = member(f, "23tpK3Wur7kRMIADh$O4gk")
    assert close(b.start, (0.0, -80.0, 3000.0), 0.01)
    assert close(b.end, (0.0, 3080.0, 3000.0), 0.01)
    assert b.length == pytest.approx(3160.0, abs=0.01)
    assert b.role == "beam" and b.cardinal_point == 5  # #9469 (line 9379)
    assert b.axis_offset == (0.0, 0.0)
    # HEB160 (#732, line 724) in metres: 0.16, 0.16, 0.008, 0.013, 0.015 -> mm
    s = b.section
    assert (s.name, s.kind, s.source) == ("HEB160", "I", "ifc-parametric")
    assert (s.depth, s.width, s.web_thickness, s.flange_thickness, s.root_radius) == pytest.approx(
        (160.0, 160.0, 8.0, 13.0, 15.0))
    # material 'Unknown' (#68, line 60) names no grade: the default, with a warning
    assert b.steel is not None and b.steel.grade == "default"
    assert any(w.global_id == b.global_id and "no known steel grade" in w.message for w in f.warnings)
    assert b.storey == "My Storey"

    # Column #9310 (line 9302): placement #9319 (line 9311) identity, Axis (0,0,0)->(0,0,3) m
    # (#9320, line 9312)
    c = member(f, "2vdBmRyfX6gh9ShK5Vj4nO")
    assert close(c.start, (0.0, 0.0, 0.0), 0.01) and close(c.end, (0.0, 0.0, 3000.0), 0.01)
    assert c.role == "column" and c.section.kind == "RHS"

    # The IfcMember #9986 (line 9599) lies horizontal: an untyped member within 10° of horizontal
    m = member(f, "0$ekPa6_zBWP6LhYLUBwIJ")
    assert m.ifc_class == "IfcMember" and m.role == "beam"
    assert m.section.name == "HEA100"

    # Footing #9818 (line 9504): placement #9930 (line 9543) at (-3, 0, -1) m (#9926, line 9539);
    # body #9974 (line 9587): circle r = 0.25 m (#9812, line 9498) extruded 1 m along +Z.
    footing = [x for x in f.bearings if x.global_id == "2yAfSxuGT7yOGPjJVHLGgO"][0]
    assert close(footing.bbox_min, (-3250.0, -250.0, -1000.0), 0.01)
    assert close(footing.bbox_max, (-2750.0, 250.0, 0.0), 0.01)
    assert len(f.bearings) == 4


def test_named_profiles_ifc2x3_catalog_and_mapped_columns(shared_models):
    """Revit IFC2X3: arbitrary outlines known only by name, mapped column bodies, 2D axes."""
    f = frame_of(shared_models, "named-profiles-frame-ifc2x3-mm.ifc")
    assert f.counts_by_class["IfcBeam"] == 43 and f.counts_by_class["IfcColumn"] == 42

    # Beam #2863 (line 1494): placement #2760 (line 1440) at #2757 (-38017.1393672175,
    # 97061.226445552, 360) (line 1438) relative to storey placement #143 at z = 3140 (lines 117-119)
    # and #32/#147 identity (lines 43, 122). Axis #2859 (line 1492): 2D polyline (0,0) ->
    # (5497.81684152658, 0) (#2855, line 1490) -> world z = 3140 + 360 = 3500.
    b = member(f, "0VNYAWfXv8JvIRVfOzYH1j")
    assert b.axis_source == "axis"
    assert close(b.start, (-38017.139, 97061.226, 3500.0), 0.01)
    assert close(b.end, (-38017.139 + 5497.817, 97061.226, 3500.0), 0.01)
    assert b.length == pytest.approx(5497.817, abs=0.01)
    # profile '300PFC40.1' (IfcArbitraryClosedProfileDef #2845, line 1484) -> catalog
    assert (b.section.kind, b.section.source) == ("channel", "catalog:sections_asnzs")
    assert b.section.depth == 300 and b.section.width == 90
    # the outline is drawn with its 300 mm depth along the profile's x: the web runs vertical
    assert b.web_dir is not None and abs(b.web_dir[2]) == pytest.approx(1.0)
    # the Axis is at the top of the channel: body Position z = -150 (#2846, line 1485)
    assert b.axis_offset is not None and abs(b.axis_offset[1]) == pytest.approx(150.0, abs=0.01)
    assert b.storey == "Level 2"
    # 'Metal - Steel - 345 MPa' names no grade: default with a warning
    assert b.steel.grade == "default"

    # Column #2715 (line 1420): placement #2714 (line 1419) at (-32366.8225256909,
    # 97079.026445552, 0) (line 1417) relative to #136 -> #32 (identity). Body: mapped item #2705
    # (line 1414), MappingOrigin #2691 identity (line 1406), target #220 identity (line 157),
    # solid #2679 (line 1399) at #2678 (origin, Axis +Z) extruded +Z by 3919.99999999982.
    c = member(f, "0XJflNVWr2jfrF51T8IWxV")
    assert c.axis_source == "body" and c.role == "column"
    assert close(c.start, (-32366.823, 97079.026, 0.0), 0.01)
    assert close(c.end, (-32366.823, 97079.026, 3920.0), 0.01)
    assert c.section.name == "310UC96.8" and c.section.depth == 308

    kinds = {m.section.kind for m in f.members}
    assert {"channel", "RHS", "angle", "I"} <= kinds
    shs = [m for m in f.members if m.section.name == "100x6.0SHS"]
    assert shs and all(m.section.kind == "RHS" and m.section.depth == 100 for m in shs)
    unknown = [m for m in f.members if m.section.kind == "unknown"]
    for m in unknown:  # each unknown section is named in a warning carrying the GlobalId
        assert any(w.global_id == m.global_id and "section unknown" in w.message for w in f.warnings)
    concrete = [m for m in f.members if m.steel is None]
    assert concrete and all(
        any(w.global_id == m.global_id and "not steel" in w.message for w in f.warnings) for m in concrete)
    assert len(f.bearings) == 26  # 17 walls + 9 slabs


def test_parametric_cross_sections_ifc4x3(shared_models):
    """buildingSMART sample: Axis + Body, I and T profiles, cardinal points 1-9."""
    f = frame_of(shared_models, "beam-parametric-cross-section-ifc4x3.ifc")
    assert f.schema == "IFC4X3"
    # Beam A-1 #1000: placement at the origin, local z along world +X (#1004); Axis polyline
    # (0,0,0)->(0,0,2000) (#1052, #1053): world (0,0,0)->(2000,0,0). Body Position (-55, 110, 0)
    # (#1031, "defines cardinal point 1"): the axis sits at (+55, -110) from the profile centre.
    a1 = member(f, "0juf4qyggSI8rxA20Qwnsj")
    assert close(a1.start, (0, 0, 0), 1e-6) and close(a1.end, (2000, 0, 0), 1e-6)
    assert a1.cardinal_point == 1 and a1.axis_offset == (55.0, -110.0)
    assert a1.section.kind == "I" and a1.section.depth == 220
    assert a1.steel.grade == "S275"  # IfcMaterial 'S275J2' (#113)
    tees = [m for m in f.members if m.section.kind == "tee"]
    assert len(tees) == 9 and all(m.section.name == "1/2IPE300" for m in tees)
    # every cardinal point's offset agrees with the body's profile position
    from ifc_io.read_profiles import cardinal_offset

    for m in f.members:
        want = cardinal_offset(m.cardinal_point, m.section.width, m.section.depth)
        if m.section.kind == "I" and m.cardinal_point in range(1, 10):
            assert m.axis_offset == pytest.approx(want, abs=1e-6), (m.name, m.cardinal_point)


def test_cardinal_points_ifc4x3(shared_models):
    f = frame_of(shared_models, "beam-cardinal-points-ifc4x3.ifc")
    # TopMid #210 (line 47): placement #212 Axis (0,1,0) RefDirection (-1,0,0) (lines 49-51); Axis
    # polyline (0,0,0)->(0,0,1000) (lines 52-54) -> world (0,0,0)->(0,1000,0). Cardinal point 8
    # (#219, line 56); body Position (0,-100,0) (line 61): the axis is 100 above the centre.
    top = member(f, "2YX3YEaA13qOf$B1iBgAf6")
    assert close(top.start, (0, 0, 0), 1e-6) and close(top.end, (0, 1000, 0), 1e-6)
    assert top.cardinal_point == 8 and top.axis_offset == (0.0, 100.0)
    # local x (-1,0,0), z (0,1,0) -> y = z × x = (0,0,1): web vertical
    assert close(top.web_dir, (0, 0, 1), 1e-9)
    # BotLeft #243 (line 80): placement at (500,0,0) (line 83), cardinal 1 (line 89), body
    # Position (-50, 100, 0) (line 94): axis at (+50, -100) from the centre
    bl = member(f, "17CqI$IjrDARuaYNcWcoRH")
    assert close(bl.start, (500, 0, 0), 1e-6) and close(bl.end, (500, 1000, 0), 1e-6)
    assert bl.cardinal_point == 1 and bl.axis_offset == (50.0, -100.0)
    assert {m.steel.grade for m in f.members} == {"S355"}  # IfcMaterial 'S355JR' (#200)


def test_grid_placement_ifc4x3(shared_models):
    f = frame_of(shared_models, "grid-placement-ifc4x3.ifc")
    assert f.counts_by_class["IfcColumn"] == 25
    # Column #293 (line 107) placed by IfcGridPlacement #351 (line 118) at the intersection
    # #348 (line 117) of axis E (#268, line 95: x = 3000, lines 92-93) and axis 1 (#183, line 75:
    # y = -12000, lines 72-73), in the grid's placement #280 (line 100) at (-17000, 16000, 0)
    # (#273, line 96) in storey placement #90 (identity, line 52): world (-14000, 4000, 0).
    # Body #327 (line 113): extruded +Z by 2800.
    c = member(f, "2E6Q5P3bD23h5JOtEANY6k")
    assert close(c.start, (-14000.0, 4000.0, 0.0), 1e-6)
    assert close(c.end, (-14000.0, 4000.0, 2800.0), 1e-6)
    assert c.storey == "Ground Floor"
    # Beam #2031 (line 460) at (-14000, 4000, 2800) (#2078, line 469) over that column; body
    # #2065 (line 466) at #2062 (Axis +Y, RefDirection +Z, line 465) extruded 12000 along its +Z.
    b = member(f, "0sj55LkZn33RYYV9cNp2vs")
    assert close(b.start, (-14000.0, 4000.0, 2800.0), 1e-6)
    assert close(b.end, (-14000.0, 16000.0, 2800.0), 1e-6)
    # its 200x200 profile is positioned at (-100, 0) (#2054, line 462): the line is the top edge
    assert b.axis_offset == (100.0, 0.0)
    # concrete: no steel grade, a warning for each member
    assert all(m.steel is None for m in f.members)
    columns = {(round(m.start[0]), round(m.start[1])) for m in f.members if m.role == "column"}
    assert len(columns) == 25  # 5 x 5 distinct grid intersections


def test_timber_frame_mapped_axis_and_body(shared_models):
    """Revit IFC4: Axis and Body both mapped, trimmed-line axes, timber (no steel)."""
    f = frame_of(shared_models, "timber-frame-path-connections-ifc4-mm.ifc")
    assert f.counts_by_class["IfcBeam"] == 284 and f.counts_by_class["IfcColumn"] == 19
    assert f.force_unit == "KILONEWTON" and f.n_per_force_unit == 1000.0
    # Beam #26002 (line 25768): placement #26001 (0,0,-4000) relative to #101 (0,0,4000) (lines
    # 25767, 109). Axis: mapped item #25996 of map #25986 whose MappingOrigin #25985 is at
    # (59800.588036305628, -2777.0512972414649, 3835) with Axis (-0.0697565, -0.9975641, 0) and
    # RefDirection #10 (0,0,-1) (lines 25749-25751); the trimmed line #25979 (line 25745) runs
    # from (-65,0,0) to (-65,0,3067.1998720129636) (lines 25743-25744). Local x is world -Z, so x = -65 is
    # world z = 3835 + 65 = 3900; the end is 3067.2 along the Axis direction.
    b = member(f, "3aUlNOTwrFYfO9hAmMpoFV")
    assert b.axis_source == "axis"
    d = (-0.069756473744139208, -0.99756405025982331, 0.0)
    start = (59800.588036305628, -2777.0512972414649, 3900.0)
    end = tuple(s + 3067.1998720129636 * k for s, k in zip(start, d))
    assert close(b.start, start, 1e-6) and close(b.end, end, 1e-6)
    assert b.length == pytest.approx(3067.19987, abs=1e-3)
    assert b.steel is None  # 'StructuralTimber'
    assert sum(1 for w in f.warnings if "not steel" in w.message) == len(f.members)
    assert len(f.bearings) > 200  # walls, slabs and footings, boxes read without tessellation


def test_analysis_model_has_no_physical_members(shared_models):
    f = frame_of(shared_models, "analysis-model-building-ifc4.ifc")
    assert f.members == () and f.parts == () and f.bearings == ()
    assert f.counts_by_class["IfcStructuralCurveMember"] == 640
    assert any("analysis model" in w.message for w in f.warnings)


def test_read_frame_accepts_an_open_model(shared_models):
    model = open_model(shared_models / "small-steel-frame-ifc2x3-mm.ifc")
    f = read_frame(model)
    assert len(f.members) == 21 and f.schema == "IFC2X3"
    assert f.file.endswith(".ifc")
