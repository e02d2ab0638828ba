"""The frame reader against the demo generator's truth (samples/demo-truth.json), in both demo
files: the IFC4 file in millimetres and the IFC2X3 file in feet. Every member is found, its axis
end points lie within 1 mm of the truth, and its section, grade, role, storey, tag, web direction
and (IFC4) cardinal point are the ones the generator wrote. The demo is invented data; it tests
the reader, not a design."""

from __future__ import annotations

import json

import pytest

from pathlib import Path
from ifc_io import read_frame
from rules.catalog import lookup_steel

SAMPLES = Path(__file__).resolve().parents[1] / "samples"
TRUTH_PATH = SAMPLES / "demo-truth.json"

pytestmark = pytest.mark.skipif(not TRUTH_PATH.is_file(), reason="the demo files have not been generated")


@pytest.fixture(scope="module")
def truth():
    return json.loads(TRUTH_PATH.read_text(encoding="utf-8"))


@pytest.fixture(scope="module", params=["ifc4", "ifc2x3"])
def demo(request, truth):
    path = SAMPLES / truth["files"][request.param]
    return request.param, read_frame(path)


def test_units_and_schema(demo, truth):
    key, frame = demo
    assert frame.schema == {"ifc4": "IFC4", "ifc2x3": "IFC2X3"}[key]
    assert frame.length_unit == truth["length_units"][key]
    assert frame.force_unit == truth["force_units"][key]
    if key == "ifc2x3":
        assert frame.mm_per_unit == pytest.approx(304.8)
        assert frame.n_per_force_unit == pytest.approx(4.4482216152605)
    else:
        assert (frame.mm_per_unit, frame.n_per_force_unit) == (1.0, 1.0)
    assert frame.warnings == ()  # the demo is clean: nothing assumed


def test_every_member_is_found_with_its_axis(demo, truth):
    _, frame = demo
    got = {m.global_id: m for m in frame.members}
    want = {m["global_id"]: m for m in truth["members"]}
    assert set(got) == set(want)
    for gid, t in want.items():
        m = got[gid]
        assert m.start == pytest.approx(tuple(t["start_mm"]), abs=1.0), t["tag"]
        assert m.end == pytest.approx(tuple(t["end_mm"]), abs=1.0), t["tag"]
        assert (m.ifc_class, m.role, m.tag, m.name, m.storey) == (
            t["ifc_class"], t["role"], t["tag"], t["name"], t["storey"]), t["tag"]


def test_sections_grades_and_orientation(demo, truth):
    key, frame = demo
    got = {m.global_id: m for m in frame.members}
    for t in truth["members"]:
        m = got[t["global_id"]]
        s = m.section
        assert s.name == t["section"] and s.kind == "I", t["tag"]
        dims = t["section_dims_mm"]
        assert (s.depth, s.width, s.web_thickness, s.flange_thickness, s.root_radius) == pytest.approx(
            (dims["depth"], dims["width"], dims["web_thickness"], dims["flange_thickness"], dims["root_radius"]),
            abs=1e-3), t["tag"]
        want = lookup_steel(t["material"])
        assert want.grade == lookup_steel(t["grade"]).grade  # "AS/NZS 3679.1-300" and "300" agree
        assert m.steel is not None and m.steel.grade == want.grade, t["tag"]
        if t["web_dir"] is not None:
            dot = sum(a * b for a, b in zip(m.web_dir, t["web_dir"]))
            assert abs(dot) == pytest.approx(1.0, abs=1e-6), t["tag"]
        if key == "ifc4":  # profile set usages carry the cardinal point; IFC2X3 has none
            assert m.cardinal_point == t["cardinal_point"], t["tag"]


def test_bearing_wall(demo, truth):
    _, frame = demo
    got = {b.global_id: b for b in frame.bearings}
    for t in truth["bearings"]:
        b = got[t["global_id"]]
        assert b.bbox_min == pytest.approx(tuple(t["bbox_min_mm"]), abs=1.0)
        assert b.bbox_max == pytest.approx(tuple(t["bbox_max_mm"]), abs=1.0)
        assert b.storey == t["storey"]


def test_modelled_fin_plates_are_read_as_parts(demo, truth):
    _, frame = demo
    connections = [j["connection"] for j in truth["joints"] if j["connection"]]
    parts = {p.global_id: p for p in frame.parts}
    plates = [p for p in frame.parts if p.kind == "plate"]
    bolts = [p for p in frame.parts if p.kind == "bolt"]
    assert len(plates) == len(connections)
    assert len(bolts) == sum(c["bolts"]["count"] for c in connections)
    for c in connections:
        assembly = parts[c["assembly"]]
        assert assembly.kind == "assembly" and assembly.tag == c["mark"]
        mine = [p for p in frame.parts if p.assembly == c["assembly"]]
        (plate,) = [p for p in mine if p.kind == "plate"]
        assert plate.dims["thickness"] == pytest.approx(c["plate"]["thickness"], abs=1e-6)
        assert plate.dims["depth"] == pytest.approx(c["plate"]["depth"], abs=1e-6)
        assert plate.dims["width"] == pytest.approx(c["plate"]["width"], abs=1e-6)
        its_bolts = [p for p in mine if p.kind == "bolt"]
        assert len(its_bolts) == c["bolts"]["count"]
        for b in its_bolts:
            assert b.nominal_diameter == pytest.approx(c["bolts"]["diameter"], abs=1e-6)
            assert b.nominal_length == pytest.approx(c["bolts"]["length"], abs=1e-6)
