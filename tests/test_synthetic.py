"""The synthetic frame generator: sizes, determinism, both conventions, and the IFC it writes."""

from __future__ import annotations

from collections import Counter

import ifcopenshell
import pytest

from samples.synthetic import (CLEARANCE_MM, SECTIONS, synthetic_counts, synthetic_frame,
                               write_synthetic_ifc)


@pytest.mark.parametrize("target", [1000, 5000, 40000])
def test_member_count_reaches_the_target_by_whole_storeys(target):
    ms = synthetic_frame(target)
    assert target <= len(ms) < target * 1.35
    assert len({m.global_id for m in ms}) == len(ms)
    assert all(len(m.global_id) == 22 for m in ms[:50])


def test_counts_follow_the_grid():
    ms = synthetic_frame(1, bays_x=3, bays_y=2, cantilevers=False)
    roles = Counter(m.role for m in ms)
    # one storey: 12 columns, 3·3 girders + 2·4 y-beams + 2·3·2 secondaries = 9 + 8 + 12 = 29 beams
    assert roles == {"column": 12, "beam": 29}
    assert len(ms) == synthetic_counts(3, 2, 1)


def test_same_arguments_give_the_same_frame_and_seed_changes_it():
    a = synthetic_frame(2000, seed=3)
    assert a == synthetic_frame(2000, seed=3)
    assert [m.global_id for m in a] != [m.global_id for m in synthetic_frame(2000, seed=4)]


def test_detailed_beams_stop_short_of_the_face_node_to_node_run_to_the_axis():
    d = {m.tag: m for m in synthetic_frame(1, bays_x=1, bays_y=1, cantilevers=False)}
    n = {m.tag: m for m in synthetic_frame(1, bays_x=1, bays_y=1, convention="node-to-node",
                                           cantilevers=False)}
    col = d["C0-0-0"].section
    assert d["G1-0-0"].start[0] == pytest.approx(col.depth / 2 + CLEARANCE_MM)
    assert d["B1-0-0"].start[1] == pytest.approx(col.web_thickness / 2 + CLEARANCE_MM)
    assert d["G1-0-0"].axis_offset == (0.0, d["G1-0-0"].section.depth / 2)
    assert n["G1-0-0"].start[0] == 0.0 and n["G1-0-0"].axis_offset is None
    with pytest.raises(ValueError):
        synthetic_frame(10, convention="sloppy")


@pytest.mark.parametrize("unit,schema,scale", [("mm", "IFC4", 1.0), ("ft", "IFC2X3", 304.8)])
def test_written_ifc_has_every_member_in_the_asked_unit(tmp_path, unit, schema, scale):
    ms = synthetic_frame(1, bays_x=1, bays_y=1, cantilevers=False)
    path = write_synthetic_ifc(ms, tmp_path / f"f-{unit}.ifc", schema=schema, length_unit=unit)
    f = ifcopenshell.open(str(path))
    assert f.schema == schema
    assert len(f.by_type("IfcBeam")) + len(f.by_type("IfcColumn")) == len(ms)
    prof = f.by_type("IfcIShapeProfileDef")[0]
    assert {round(prof.OverallDepth * scale, 6)} <= {s.depth for v in SECTIONS.values() for s in v}
    el = f.by_guid(ms[0].global_id)
    assert el.Name == ms[0].name
