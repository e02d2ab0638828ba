"""Modelled fin plates (IfcPlate + IfcMechanicalFastener in an IfcElementAssembly) are recovered
from both demo files exactly as the generator built them (samples/demo-truth.json)."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

import ifc_io
from engine.config import load_config
from engine.connections import bolt_grade_from_label, bolt_size_label, read_grid, recover_fin_plates
from engine.evaluate import FIN_PLATE_KINDS
from engine.joints import find_joints
from engine.model import Weld
from engine.tolerances import Tolerances
from ifc_io.library import read_frame_with_connections
from rules.catalog import lookup_steel

SAMPLES = Path(__file__).resolve().parents[1] / "samples"

TRUTH = json.loads((SAMPLES / "demo-truth.json").read_text())
FILES = [TRUTH["files"]["ifc4"], TRUTH["files"]["ifc2x3"]]


@pytest.fixture(scope="module", params=FILES)
def recovered(request):
    cfg = load_config(SAMPLES / "demo-config.toml")
    frame = read_frame_with_connections(ifc_io.open_model(SAMPLES / request.param), cfg)
    members = {m.global_id: m for m in frame.members}
    finding = find_joints(frame.members, frame.bearings, frame.connections, tolerances=Tolerances.from_config(cfg["tolerances"]))
    shear = [j for j in finding.joints if j.kind in FIN_PLATE_KINDS]
    choices, warnings = recover_fin_plates(frame.parts, shear, members, steel_lookup=lookup_steel,
                                           default_weld=Weld(6.0, "E48XX"), default_plate_grade="250")
    by_end = {(j.beam, j.end): choices.get(j.id) for j in shear}
    return by_end, warnings


def test_every_modelled_fin_plate_is_recovered_with_its_layout(recovered):
    by_end, _ = recovered
    expected = [t for t in TRUTH["joints"] if t["connection"]]
    assert len(expected) == 12
    for t in expected:
        c = t["connection"]
        got = by_end[(t["beam"], t["end"])]
        assert got is not None and got.plate is not None, (c["mark"], got)
        p = got.plate
        assert (p.rows, p.lines) == (c["rows"], c["lines"]), c["mark"]
        assert p.bolts.size == c["bolts"]["size"] and p.bolts.grade == c["bolts"]["grade"], c["mark"]
        assert p.bolts.diameter == pytest.approx(c["bolts"]["diameter"], abs=0.01)
        assert p.steel.grade == c["plate"]["grade"] or c["plate"]["grade"] in p.steel.grade, c["mark"]
        for key, truth_value in [("thickness", c["plate"]["thickness"]), ("depth", c["plate"]["depth"]),
                                 ("width", c["plate"]["width"]), ("pitch", c["pitch"]), ("gauge", c["gauge"]),
                                 ("plate_end_edge", c["plate_end_edge"]), ("plate_side_edge", c["plate_side_edge"]),
                                 ("beam_end_edge", c["beam_end_edge"]), ("beam_top_edge", c["beam_top_edge"]),
                                 ("a", c["a"])]:
            # within 0.01 mm: the feet file stores lengths as decimals of a foot
            assert getattr(p, key) == pytest.approx(truth_value, abs=0.01), (c["mark"], key)
        assert (p.weld.leg, p.weld.electrode) == (pytest.approx(c["weld"]["leg"], abs=0.01), c["weld"]["electrode"]), c["mark"]
        assert p.source == "modelled"


def test_joints_without_a_modelled_plate_get_none(recovered):
    by_end, _ = recovered
    for t in TRUTH["joints"]:
        if not t["connection"] and (t["beam"], t["end"]) in by_end:
            assert by_end[(t["beam"], t["end"])] is None, t["beam_tag"]


@pytest.mark.parametrize("labels, grade", [(("8.8",), "8.8"), (("Bolt M20 8.8/S",), "8.8"), (("ASTM A325",), "A325"),
                                           (("10.9 HV",), "10.9"), (("steel",), None), (("M20 18.8",), None)])
def test_bolt_grade_is_read_from_material_or_name(labels, grade):
    assert bolt_grade_from_label(*labels) == grade


@pytest.mark.parametrize("d, label", [(20.0, "M20"), (24.0, "M24"), (19.05, "3/4"), (22.225, "7/8"), (25.4, "1")])
def test_bolt_size_label(d, label):
    assert bolt_size_label(d) == label


def test_grid_levels_and_regular_spacing():
    levels, spacing = read_grid([35.0, 105.0, 175.0, 35.2, 105.1, 174.9])
    assert len(levels) == 3 and spacing == pytest.approx(70.0, abs=0.2)
    assert read_grid([35.0, 105.0, 200.0])[1] is None  # irregular
    assert read_grid([60.0, 60.3])[1] == 0.0


def test_weld_comes_from_a_weld_fastener_then_the_plate_then_the_default():
    from engine.connections import _weld_from
    from engine.model import ConnectionPart

    plate = ConnectionPart("P", "IfcPlate", "plate", properties={"Fab.WeldLeg": 8.0, "Fab.WeldElectrode": "E48XX"})
    weld = ConnectionPart("W", "IfcFastener", "fastener", predefined_type="WELD",
                          properties={"Pset_Weld.Size": 10.0, "Pset_Weld.Electrode": "E70XX"})
    other = ConnectionPart("F", "IfcFastener", "fastener", predefined_type="ANCHORBOLT",
                           properties={"X.Size": 3.0, "X.Electrode": "no"})
    assert _weld_from(plate, [other, weld]) == Weld(10.0, "E70XX", True)
    assert _weld_from(plate, [other]) == Weld(8.0, "E48XX", True)
    assert _weld_from(ConnectionPart("P", "IfcPlate", "plate"), [other]) is None
