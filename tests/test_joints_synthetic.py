"""Joint finding on synthetic frames: every end found with the kind the generator built, in both
beam-end conventions and after a round trip through IFC files in mm, feet and metres."""

from __future__ import annotations

from collections import Counter

import pytest

import ifc_io
from engine.joints import find_joints
from samples.synthetic import synthetic_frame, write_synthetic_ifc


def _expected(bx: int, by: int, storeys: int, lifts: int, cantilevers: int) -> Counter:
    nx, ny = bx + 1, by + 1
    girders, ybeams, secs = storeys * bx * ny, storeys * by * nx, storeys * 2 * bx * by
    return Counter({"column-flange": 2 * girders - cantilevers, "free-end": cantilevers,
                    "column-web": 2 * ybeams, "beam-web": 2 * secs, "splice": nx * ny * (lifts - 1)})


@pytest.mark.parametrize("convention", ["detailed", "node-to-node"])
def test_every_synthetic_joint_is_found_with_its_kind(convention):
    bx, by = 4, 3
    ms = synthetic_frame(3000, bays_x=bx, bays_y=by, convention=convention)
    storeys = max(int(m.storey.split()[-1]) for m in ms if m.role == "beam")
    lifts = len({m.start[2] for m in ms if m.role == "column"})
    cant = sum(1 for m in ms if m.role == "beam" and m.end[0] > bx * 8000.0)
    f = find_joints(ms)
    assert not f.unresolved and not f.warnings
    assert Counter(j.kind for j in f.joints) == _expected(bx, by, storeys, lifts, cant)
    # secondaries on interior girders have a back-to-back partner: 2 per bay, both sides
    b2b = sum(1 for j in f.joints if j.kind == "beam-web" and j.geometry.back_to_back)
    assert b2b == storeys * 4 * bx * (by - 1)
    tags = {m.global_id: m.tag for m in ms}
    for j in f.joints:
        if j.kind == "beam-web":
            assert tags[j.beam].startswith("S") and tags[j.support].startswith("G")
        if j.kind in ("column-flange", "column-web"):
            assert tags[j.support].startswith("C")
        if j.kind == "column-flange":
            assert tags[j.beam].startswith("G")


@pytest.mark.parametrize("convention", ["detailed", "node-to-node"])
@pytest.mark.parametrize("unit,schema", [("ft", "IFC2X3"), ("m", "IFC4")])
def test_same_joints_after_writing_and_reading_a_model_in_another_unit(tmp_path, convention, unit, schema):
    ms = synthetic_frame(300, bays_x=2, bays_y=2, convention=convention)
    path = write_synthetic_ifc(ms, tmp_path / "frame.ifc", schema=schema, length_unit=unit)
    frame = ifc_io.read_frame(str(path))
    assert frame.mm_per_unit == pytest.approx({"ft": 304.8, "m": 1000.0}[unit])
    a, b = find_joints(ms), find_joints(frame.members, frame.bearings)

    def key(f):
        return sorted((j.beam, j.end, j.support, j.kind, round(j.geometry.gap or 0.0, 1)) for j in f.joints)
    assert key(b) == key(a)
