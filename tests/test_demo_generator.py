"""The demo generator reproduces the committed demo files, and the truth file agrees with both IFCs.

The demo is invented data (our own project, grid and people); these tests check that the files are
reproducible, valid IFC, and that every fact the truth file states is really in both models, in
their own units (IFC4 mm/N, IFC2X3 ft/lbf).
"""

from __future__ import annotations

import csv
import json
import math
import tomllib
from collections import Counter
from pathlib import Path

import ifcopenshell
import ifcopenshell.util.element
import ifcopenshell.util.placement
import ifcopenshell.util.unit
import ifcopenshell.validate
import numpy as np
import pytest

from samples.generate_demo import FILES, build_demo

SAMPLES = Path(__file__).resolve().parents[1] / "samples"
MM_PER_FOOT = 304.8  # international foot, exact (NIST SP 811 App. B)
N_PER_LBF = 4.4482216152605  # pound-force, exact (NIST SP 811 App. B)


@pytest.fixture(scope="module")
def truth() -> dict:
    return json.loads((SAMPLES / FILES["truth"]).read_text(encoding="utf-8"))


@pytest.fixture(scope="module", params=["ifc4", "ifc2x3"])
def model(request) -> tuple[str, ifcopenshell.file, float]:
    """(key, opened committed file, mm per file length unit)."""
    f = ifcopenshell.open(str(SAMPLES / FILES[request.param]))
    return request.param, f, (1.0 if request.param == "ifc4" else MM_PER_FOOT)


def _world(f: ifcopenshell.file, product, local_pts, mm_per_unit: float) -> np.ndarray:
    """World coordinates (mm) of points given in the product's local frame (file units)."""
    m = ifcopenshell.util.placement.get_local_placement(product.ObjectPlacement)
    pts = np.c_[np.asarray(local_pts, dtype=float), np.ones(len(local_pts))]
    return (m @ pts.T).T[:, :3] * mm_per_unit


def _rep(product, identifier: str):
    for r in product.Representation.Representations:
        if r.RepresentationIdentifier == identifier:
            return r
    raise AssertionError(f"{product.GlobalId} has no {identifier} representation")


def test_regenerating_reproduces_the_committed_files_byte_for_byte(tmp_path):
    paths = build_demo(tmp_path)
    assert set(paths) == set(FILES)
    for key, name in FILES.items():
        assert paths[key] == tmp_path / name
        new, old = paths[key].read_bytes(), (SAMPLES / name).read_bytes()
        assert new == old, f"{name} differs from the committed file: rerun python3 -m samples.generate_demo"


def test_both_files_pass_ifcopenshell_validate_with_express_rules(model):
    key, f, _ = model
    logger = ifcopenshell.validate.json_logger()
    ifcopenshell.validate.validate(f, logger, express_rules=True)
    errors = [s for s in logger.statements if s["level"].lower() == "error"]
    assert errors == [], errors[:5]
    assert f.schema == ("IFC4" if key == "ifc4" else "IFC2X3")


def test_length_units_are_mm_and_a_foot_conversion_based_unit(model, truth):
    key, f, mm_per_unit = model
    assert ifcopenshell.util.unit.calculate_unit_scale(f) * 1000.0 == pytest.approx(mm_per_unit)
    (ua,) = f.by_type("IfcUnitAssignment")
    lengths = [u for u in ua.Units if getattr(u, "UnitType", None) == "LENGTHUNIT"]
    forces = [u for u in ua.Units if getattr(u, "UnitType", None) == "FORCEUNIT"]
    assert len(lengths) == 1 and len(forces) == 1
    if key == "ifc2x3":
        (foot,) = lengths
        assert foot.is_a("IfcConversionBasedUnit") and foot.Name == truth["length_units"]["ifc2x3"] == "FOOT"
        assert foot.ConversionFactor.ValueComponent.wrappedValue == 0.3048
        assert foot.ConversionFactor.UnitComponent.Name == "METRE"
        assert foot.ConversionFactor.UnitComponent.Prefix is None
        (lbf,) = forces
        assert lbf.is_a("IfcConversionBasedUnit") and lbf.Name == "POUND-FORCE"
        assert lbf.ConversionFactor.ValueComponent.wrappedValue == N_PER_LBF
        assert lbf.ConversionFactor.UnitComponent.Name == "NEWTON"
    else:
        (mm,) = lengths
        assert mm.is_a("IfcSIUnit") and (mm.Prefix, mm.Name) == ("MILLI", "METRE")
        assert truth["length_units"]["ifc4"] == "MILLIMETRE"
        assert forces[0].is_a("IfcSIUnit") and forces[0].Name == "NEWTON" and forces[0].Prefix is None


def test_every_truth_member_exists_with_class_tag_profile_and_material(model, truth):
    key, f, mm_per_unit = model
    for m in truth["members"]:
        el = f.by_guid(m["global_id"])
        assert el.is_a() == m["ifc_class"] and el.Tag == m["tag"] and el.Name == m["name"]
        solid = _rep(el, "Body").Items[0]
        assert solid.is_a("IfcExtrudedAreaSolid")
        prof = solid.SweptArea
        assert prof.is_a("IfcIShapeProfileDef") and prof.ProfileName == m["section"]
        dims = m["section_dims_mm"]
        for attr, k in (("OverallDepth", "depth"), ("OverallWidth", "width"),
                        ("WebThickness", "web_thickness"), ("FlangeThickness", "flange_thickness"),
                        ("FilletRadius", "root_radius")):
            assert getattr(prof, attr) * mm_per_unit == pytest.approx(dims[k], abs=1e-6)
        mat = ifcopenshell.util.element.get_material(el)
        if key == "ifc4":
            assert mat.is_a("IfcMaterialProfileSetUsage") and mat.CardinalPoint == m["cardinal_point"]
            (mp,) = mat.ForProfileSet.MaterialProfiles
            assert mp.Profile == prof and mp.Material.Name == m["material"]
        else:
            assert mat.is_a("IfcMaterial") and mat.Name == m["material"]
        assert m["material"].endswith(m["grade"])
        storey = ifcopenshell.util.element.get_container(el)
        assert storey.is_a("IfcBuildingStorey") and storey.Name == m["storey"]
        assert el.ObjectPlacement.PlacementRelTo == storey.ObjectPlacement


def test_axis_representation_and_placement_give_the_truth_end_points_and_web_direction(model, truth):
    key, f, mm_per_unit = model
    tol = 1e-6 if key == "ifc4" else 1e-3  # feet: the same points within rounding
    for m in truth["members"]:
        el = f.by_guid(m["global_id"])
        curve = _rep(el, "Axis").Items[0]
        assert curve.is_a("IfcPolyline") and len(curve.Points) == 2
        local = [p.Coordinates for p in curve.Points]
        a, b = _world(f, el, local, mm_per_unit)
        assert a == pytest.approx(m["start_mm"], abs=tol) and b == pytest.approx(m["end_mm"], abs=tol)
        mat = ifcopenshell.util.placement.get_local_placement(el.ObjectPlacement)
        assert mat[:3, 1] == pytest.approx(m["web_dir"], abs=1e-9)  # profile y = web direction
        solid = _rep(el, "Body").Items[0]
        length = math.dist(m["start_mm"], m["end_mm"])
        assert solid.Depth * mm_per_unit == pytest.approx(length, abs=tol)


def test_every_truth_joint_references_existing_elements(model, truth):
    _, f, _ = model
    members = {m["global_id"]: m for m in truth["members"]}
    bearings = {b["global_id"]: b for b in truth["bearings"]}
    keys = set()
    for j in truth["joints"]:
        assert j["beam"] in members and f.by_guid(j["beam"]).Tag == j["beam_tag"]
        assert j["end"] in ("start", "end")
        keys.add((j["beam"], j["end"]))
        if j["kind"] == "free-end":
            assert j["support"] is None
        elif j["kind"] == "wall":
            assert j["support"] in bearings and f.by_guid(j["support"]).is_a("IfcWall")
        else:
            sup = f.by_guid(j["support"])
            assert sup.Tag == j["support_tag"]
            expect = "IfcBeam" if j["kind"] in ("beam-web", "beam-over") else "IfcColumn"
            assert sup.is_a(expect)
        if j["connection"]:
            assert f.by_guid(j["connection"]["assembly"]).is_a("IfcElementAssembly")
    for j in truth["joints"]:
        b2b = j["back_to_back_with"]
        if b2b:
            assert (b2b["beam"], b2b["end"]) in keys
            other = next(o for o in truth["joints"] if (o["beam"], o["end"]) == (b2b["beam"], b2b["end"]))
            assert other["support"] == j["support"]
            assert other["back_to_back_with"] == {"beam": j["beam"], "end": j["end"]}
    # every beam built has exactly its two ends in the truth
    beams = [m["global_id"] for m in truth["members"] if m["role"] == "beam"]
    for g in beams:
        assert (g, "start") in keys and (g, "end") in keys


def test_truth_beam_ends_sit_where_the_joint_kind_and_gap_say(truth):
    members = {m["global_id"]: m for m in truth["members"]}
    for j in truth["joints"]:
        if j["kind"] not in ("column-flange", "column-web", "beam-web"):
            continue
        beam, sup = members[j["beam"]], members[j["support"]]
        end = np.array(beam["end_mm" if j["end"] == "end" else "start_mm"])
        other = np.array(beam["start_mm" if j["end"] == "end" else "end_mm"])
        into = (other - end) / np.linalg.norm(other - end)
        d = sup["section_dims_mm"]
        along_web = abs(float(np.dot(into, sup["web_dir"]))) > 0.99
        if j["kind"] == "column-flange":
            assert sup["role"] == "column" and along_web
            face = d["depth"] / 2.0
        else:
            assert not along_web or sup["role"] == "beam"
            face = d["web_thickness"] / 2.0
        # distance from the support axis to the beam end, along the beam = face + gap
        node = np.array(j["node_mm"])
        assert float(np.dot(end - node, into)) == pytest.approx(face + j["gap_mm"], abs=1e-3)
        assert j["convention"] == ("node-to-node" if beam["storey"] == "Roof" else "detailed")


def test_every_assembly_holds_one_plate_and_the_stated_bolts_at_the_support_face(model, truth):
    key, f, mm_per_unit = model
    members = {m["global_id"]: m for m in truth["members"]}
    conns = [j for j in truth["joints"] if j["connection"]]
    assert 8 <= len(conns) <= 12
    assert len(f.by_type("IfcElementAssembly")) == len(conns)
    for j in conns:
        c = j["connection"]
        asm = f.by_guid(c["assembly"])
        parts = [p for rel in asm.IsDecomposedBy for p in rel.RelatedObjects]
        plates = [p for p in parts if p.is_a("IfcPlate")]
        bolts = [p for p in parts if p.is_a("IfcMechanicalFastener")]
        assert len(plates) == 1 and len(bolts) == c["bolts"]["count"] == c["rows"] * c["lines"]
        assert len(parts) == 1 + len(bolts)
        (plate,) = plates
        solid = _rep(plate, "Body").Items[0]
        rect = solid.SweptArea
        assert rect.is_a("IfcRectangleProfileDef")
        assert solid.Depth * mm_per_unit == pytest.approx(c["plate"]["thickness"], abs=1e-6)
        assert rect.XDim * mm_per_unit == pytest.approx(c["plate"]["width"], abs=1e-6)
        assert rect.YDim * mm_per_unit == pytest.approx(c["plate"]["depth"], abs=1e-6)
        assert c["plate"]["width"] == c["a"] + (c["lines"] - 1) * c["gauge"] + c["plate_side_edge"]
        assert c["plate"]["depth"] == 2 * c["plate_end_edge"] + (c["rows"] - 1) * c["pitch"]
        assert c["beam_end_edge"] == pytest.approx(c["a"] - j["gap_mm"])
        assert ifcopenshell.util.element.get_material(plate).Name.endswith(c["plate"]["grade"])
        fab = ifcopenshell.util.element.get_psets(plate)["Demo_Fabrication"]
        assert fab["WeldLeg"] * mm_per_unit == pytest.approx(c["weld"]["leg"])
        assert fab["WeldElectrode"] == c["weld"]["electrode"]
        # The plate's top corner on the support face: its origin lies `gap` back from the beam end
        # along the beam, its x axis runs along the beam away from the support, its face on the web.
        beam = members[j["beam"]]
        end = np.array(beam["end_mm" if j["end"] == "end" else "start_mm"])
        other = np.array(beam["start_mm" if j["end"] == "end" else "end_mm"])
        into = (other - end) / np.linalg.norm(other - end)
        pm = ifcopenshell.util.placement.get_local_placement(plate.ObjectPlacement)
        origin = pm[:3, 3] * mm_per_unit
        assert float(np.dot(origin - end, into)) == pytest.approx(-j["gap_mm"], abs=1e-3)
        assert pm[:3, 0] == pytest.approx(into, abs=1e-9)
        side = float(np.dot(origin - end, pm[:3, 2]))
        assert side == pytest.approx(beam["section_dims_mm"]["web_thickness"] / 2.0, abs=1e-3)
        # Bolts: diameter, axis along the plate normal, centres at the geometry.py layout
        xy = []
        for bolt in bolts:
            assert bolt.NominalDiameter * mm_per_unit == pytest.approx(c["bolts"]["diameter"])
            assert bolt.NominalLength * mm_per_unit == pytest.approx(c["bolts"]["length"])
            assert ifcopenshell.util.element.get_material(bolt).Name == c["bolts"]["grade"]
            if key == "ifc4":
                assert bolt.PredefinedType == "BOLT"
            bm = ifcopenshell.util.placement.get_local_placement(bolt.ObjectPlacement)
            assert bm[:3, 2] == pytest.approx(pm[:3, 2], abs=1e-9)
            rel = np.linalg.inv(pm) @ bm[:, 3]
            xy.append((round(rel[0] * mm_per_unit, 3), round(rel[1] * mm_per_unit, 3)))
        expect = sorted((c["a"] + jj * c["gauge"], -(c["plate_end_edge"] + ii * c["pitch"]))
                        for ii in range(c["rows"]) for jj in range(c["lines"]))
        np.testing.assert_allclose(np.array(sorted(xy)), np.array(expect), atol=1e-3)


def test_model_shears_are_force_measures_in_the_files_force_unit(model, truth):
    key, f, _ = model
    n_per_unit = 1.0 if key == "ifc4" else N_PER_LBF
    with_shear = [j for j in truth["joints"] if j["model_shear_kN"] is not None]
    assert 0 < len({j["beam"] for j in with_shear}) <= 12
    for j in with_shear:
        el = f.by_guid(j["beam"])
        (rel,) = [r for r in el.IsDefinedBy if r.RelatingPropertyDefinition.Name == "Demo_Analysis"]
        props = {p.Name: p.NominalValue for p in rel.RelatingPropertyDefinition.HasProperties}
        v = props["StartShear" if j["end"] == "start" else "EndShear"]
        assert v.is_a("IfcForceMeasure")
        assert v.wrappedValue * n_per_unit / 1000.0 == pytest.approx(j["model_shear_kN"], rel=1e-12)
    for j in truth["joints"]:
        if j["connection"]:
            assert j["model_shear_kN"] is not None  # every modelled plate has a demand to check


def test_bearing_wall_is_concrete_with_the_truth_bounding_box(model, truth):
    _, f, mm_per_unit = model
    (b,) = truth["bearings"]
    wall = f.by_guid(b["global_id"])
    assert wall.is_a("IfcWall") and ifcopenshell.util.element.get_material(wall).Name == "Concrete"
    solid = _rep(wall, "Body").Items[0]
    pm = ifcopenshell.util.placement.get_local_placement(wall.ObjectPlacement)
    lo = pm[:3, 3] * mm_per_unit
    size = np.array([solid.SweptArea.XDim, solid.SweptArea.YDim, solid.Depth]) * mm_per_unit
    assert lo == pytest.approx(b["bbox_min_mm"], abs=1e-3)
    assert lo + size == pytest.approx(b["bbox_max_mm"], abs=1e-3)
    (j,) = [j for j in truth["joints"] if j["kind"] == "wall"]
    beam = next(m for m in truth["members"] if m["global_id"] == j["beam"])
    bottom = beam["start_mm"][2] - beam["section_dims_mm"]["depth"]  # axis at top of steel
    assert bottom == pytest.approx(b["bbox_max_mm"][2])  # the beam bears on the wall top


def test_modelled_copes_void_the_beam_at_the_right_end(model, truth):
    _, f, mm_per_unit = model
    coped = [j for j in truth["joints"] if j["cope_modelled"]]
    assert coped and len(f.by_type("IfcOpeningElement")) == len(coped)
    for j in coped:
        beam = f.by_guid(j["beam"])
        openings = [r.RelatedOpeningElement for r in beam.HasOpenings]
        ends = {o.Tag.rsplit("-", 1)[1].lower(): o for o in openings}
        op = ends[j["end"]]
        solid = _rep(op, "Body").Items[0]
        assert solid.Depth * mm_per_unit == pytest.approx(j["cope"]["length"])
        assert (solid.SweptArea.YDim * mm_per_unit) - 1.0 == pytest.approx(j["cope"]["depth"])


def test_truth_covers_every_feature_the_scenario_promises(truth):
    joints = truth["joints"]
    kinds = Counter(j["kind"] for j in joints)
    for k in ("column-flange", "column-web", "beam-web", "wall", "free-end", "splice"):
        assert kinds[k] >= 1, k
    assert {j["convention"] for j in joints} == {"detailed", "node-to-node"}
    intended = Counter(j["intended"] for j in joints)
    assert intended["too-weak"] >= 3 and intended["adequate"] >= 5 and intended["no-connection"] > 0
    web = [j for j in joints if j["kind"] == "beam-web"]
    assert any(j["back_to_back_with"] for j in web) and any(not j["back_to_back_with"] for j in web)
    assert any(j["cope"] for j in web) and any(j["cope"] is None for j in web)
    assert {j["expected_stiffness"] for j in joints} == {"stiff", "flexible"}
    (splice,) = [j for j in joints if j["kind"] == "splice"]
    members = {m["global_id"]: m for m in truth["members"]}
    up, low = members[splice["beam"]], members[splice["support"]]
    assert up["role"] == low["role"] == "column"
    assert up["start_mm"] == low["end_mm"] and up["start_mm"][2] > 8000.0  # above Level 2
    cols = [m for m in truth["members"] if m["role"] == "column"]
    assert {tuple(m["web_dir"]) for m in cols} == {(1.0, 0.0, 0.0), (0.0, 1.0, 0.0)}
    # detailed ends stop 10-15 mm short of the face; node-to-node ends run past it
    for j in joints:
        if j["convention"] == "detailed" and j["kind"] in ("column-flange", "column-web", "beam-web"):
            assert 10.0 <= j["gap_mm"] <= 15.0
        if j["convention"] == "node-to-node":
            assert j["gap_mm"] < 0.0


def test_schedule_and_config_fit_the_model(truth):
    ifc4 = ifcopenshell.open(str(SAMPLES / FILES["ifc4"]))
    with (SAMPLES / FILES["schedule"]).open(newline="", encoding="utf-8") as fh:
        rows = list(csv.DictReader(fh))
    assert list(rows[0]) == ("match,value,end,plate_thickness,plate_depth,plate_width,bolt_size,"
                             "bolt_grade,rows,lines,pitch,gauge,plate_end_edge,plate_side_edge,"
                             "beam_end_edge,beam_top_edge,a,weld_leg,weld_electrode").split(",")
    sections = {m["section"] for m in truth["members"]}
    tags = {m["tag"] for m in truth["members"]}
    for r in rows:
        assert r["match"] in ("globalid", "tag", "section") and r["end"] in ("start", "end", "both")
        if r["match"] == "globalid":
            assert ifc4.by_guid(r["value"]).is_a("IfcBeam")
        elif r["match"] == "tag":
            assert r["value"] in tags
        else:
            assert r["value"] in sections
        n, p, e = int(r["rows"]), float(r["pitch"]), float(r["plate_end_edge"])
        assert float(r["plate_depth"]) == 2 * e + (n - 1) * p
    used = {j["schedule_row"] for j in truth["joints"] if j["schedule_row"]}
    assert used == set(range(1, len(rows) + 1))  # every row covers some joint without a plate
    assert all(j["connection"] is None for j in truth["joints"] if j["schedule_row"])

    cfg = tomllib.loads((SAMPLES / FILES["config"]).read_text(encoding="utf-8"))
    assert cfg["code"] == "as4100"
    assert cfg["demand"]["start_shear"] == "Demo_Analysis.StartShear"
    assert cfg["demand"]["end_shear"] == "Demo_Analysis.EndShear"
    storeys = {s.Name for s in ifc4.by_type("IfcBuildingStorey")}
    loads = cfg["demand"]["area_loads"]
    assert loads and all(a["storey"] in storeys and a["dead_kPa"] > 0 for a in loads)
