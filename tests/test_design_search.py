"""--design: the proposal passes every check and nothing lighter in the candidate space passes
(brute force over a small space, every candidate checked in full by the rule set)."""

from __future__ import annotations

import itertools

import pytest

import rules
from engine.design import DENSITY_KG_MM3, DesignSpace, candidate_plate, propose_fin_plate
from engine.model import Demand, Joint, JointGeometry, Member, Section, Steel

BEAM = Member("B", "IfcBeam", "beam", (0, 0, 0), (7200, 0, 0),
              Section("360UB50.7", "I", 356, 171, 7.3, 11.5, 11.4, 6470), Steel("300", 320, 440), name="B1")
COL = Member("C", "IfcColumn", "column", (0, 0, -4000), (0, 0, 4000),
             Section("250UC89.5", "I", 260, 256, 10.5, 17.3, 12.7, 11400), Steel("300", 300, 440))


def _space() -> DesignSpace:
    table = {
        "bolt_sizes": ["M16", "M20"], "bolt_grade": "8.8", "plate_thicknesses": [8.0, 10.0],
        "weld_legs": [6.0, 8.0], "max_rows": 5, "max_lines": 2,
        "pitch": {"M16": 60.0, "M20": 70.0}, "edge": {"M16": 30.0, "M20": 35.0},
        "beam_end_edge": {"M16": 35.0, "M20": 40.0}, "bolt_mass_kg": {"M16": 0.15, "M20": 0.27},
        "clearance": 10.0, "top_clearance": 10.0,
    }
    return DesignSpace.from_table(table, "E48XX", Steel("250", 260, 410))


def _mass(p) -> float:
    space = _space()
    return DENSITY_KG_MM3 * (p.thickness * p.depth * p.width + p.weld.leg ** 2 * p.depth) + p.n_bolts * space.bolt_mass_kg[p.bolts.size]


def _brute_force(joint, demand, rs, policy):
    space = _space()
    passing = []
    for i, rows, lines, t, leg in itertools.product(range(2), range(2, 6), range(1, 3), (8.0, 10.0), (6.0, 8.0)):
        p = candidate_plate(space, i, rows, lines, t, leg, joint, BEAM)
        checks = rs.check_fin_plate(joint, demand, p, BEAM, COL, policy)
        if all(c.passed and not c.incomplete for c in checks):
            passing.append((_mass(p), p))
    return passing


@pytest.mark.parametrize("V_kN, stiffness", [(60.0, "stiff"), (150.0, "flexible"), (260.0, "stiff")])
def test_proposal_passes_and_nothing_lighter_passes(V_kN, stiffness):
    rs = rules.load("as4100")
    joint = Joint("J-1", "B", "start", "C", "column-flange", JointGeometry((0, 0, 0), 90.0, 10.0), stiffness)
    demand = Demand(V_kN * 1e3, 0.0, "schedule")
    prop = propose_fin_plate(joint, demand, BEAM, COL, rs, "conservative", _space())
    passing = _brute_force(joint, demand, rs, "conservative")
    if not passing:
        assert prop.plate is None and "passes" in prop.reason
        return
    assert prop.plate is not None, prop.reason
    assert all(c.passed and not c.incomplete for c in prop.checks)
    lightest = min(m for m, _ in passing)
    assert _mass(prop.plate) == pytest.approx(lightest, rel=1e-12)
    assert prop.checked <= prop.screened <= prop.candidates == 2 * 4 * 2 * 2 * 2


def test_heavier_demand_never_gets_a_lighter_plate():
    rs = rules.load("as4100")
    joint = Joint("J-1", "B", "start", "C", "column-flange", JointGeometry((0, 0, 0), 90.0, 10.0), "stiff")
    masses = []
    for V in (40e3, 80e3, 120e3, 160e3, 200e3):
        prop = propose_fin_plate(joint, Demand(V), BEAM, COL, rs, "conservative", _space())
        assert prop.plate is not None, prop.reason
        masses.append(_mass(prop.plate))
    assert masses == sorted(masses)


def test_beam_too_shallow_for_any_candidate_says_why():
    rs = rules.load("as4100")
    shallow = Member("S", "IfcBeam", "beam", (0, 0, 0), (3000, 0, 0),
                     Section("100x50", "I", 100, 50, 4.0, 5.0, 5.0, 900), Steel("300", 320, 440))
    joint = Joint("J-2", "S", "start", "C", "column-flange", JointGeometry((0, 0, 0), 90.0, 10.0), "stiff")
    prop = propose_fin_plate(joint, Demand(50e3), shallow, COL, rs, "conservative", _space())
    assert prop.plate is None
    assert "fits the clear web depth" in prop.reason
