"""The EN 1993 rule set as a plug-in: registry, contract, hinge handling, incomplete inputs, errors."""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

import rules
from engine.errors import RuleSetError
from engine.model import BoltSpec, Demand, Section, Steel
from rules.base import RuleSet
from rules.en1993 import EN1993, _bolt_forces

RS = EN1993()


def names(checks):
    return [c.name for c in checks]


def test_registry_loads_en1993():
    rs = rules.load("en1993")
    assert isinstance(rs, RuleSet) and isinstance(rs, EN1993)
    assert rs.code_id == "en1993" and "EN 1993-1-8" in rs.title


def test_check_list_and_sources():
    listed = {n for n, _ in RS.check_list()}
    for required in ("bolt shear", "bolt bearing on plate", "bolt tear-out in plate", "bolt bearing on beam web",
                     "bolt tear-out in beam web", "plate shear yield", "plate shear rupture", "plate block shear",
                     "plate bending", "plate lateral-torsional buckling", "beam web shear", "beam web block shear",
                     "coped section bending", "weld", "weld stronger than plate", "support local shear",
                     "bolt pitch minimum", "bolt pitch maximum", "bolt gauge minimum", "edge distance minimum (plate)",
                     "edge distance minimum (beam web)", "edge distance maximum", "plate depth to beam depth",
                     "bolt group within clear web depth", "plate thickness for rotation", "clearance to support"):
        assert required in listed
    assert any("Table 3.4" in s for s in RS.data_sources())


def test_every_check_name_is_listed(example_plate, example_beam, example_column, example_joint):
    listed = {n for n, _ in RS.check_list()}
    checks = RS.check_fin_plate(example_joint, Demand(350e3, 100e3), example_plate, example_beam, example_column, "envelope")
    for c in checks:
        assert c.name.split(" [")[0] in listed, c.name
        assert c.clause and c.unit in ("N", "N·mm", "mm", "-")
        if not c.incomplete:
            assert c.utilisation == pytest.approx(c.demand / c.capacity) or c.capacity == math.inf


def test_hinge_positions_and_suffixes(example_plate, example_beam, example_column, example_joint, example_demand):
    flex = RS.check_fin_plate(example_joint, example_demand, example_plate, example_beam, example_column, "conservative")
    assert "bolt shear [hinge at support face]" in names(flex)
    assert not any("[hinge at bolt line]" in n for n in names(flex))
    stiff = dataclasses.replace(example_joint, stiffness="stiff")
    st = RS.check_fin_plate(stiff, example_demand, example_plate, example_beam, example_column, "classified")
    assert "bolt shear [hinge at bolt line]" in names(st) and not any("support face]" in n for n in names(st))
    env = RS.check_fin_plate(stiff, example_demand, example_plate, example_beam, example_column, "envelope")
    for base in ("bolt shear", "weld", "plate bending", "bolt bearing on plate"):
        assert names(env).count(base + " [hinge at bolt line]") == 1
        assert names(env).count(base + " [hinge at support face]") == 1
    for plain in ("plate shear yield", "beam web shear", "weld stronger than plate", "bolt pitch minimum"):
        assert names(env).count(plain) == 1
    # bolts carry more with the hinge at the support face
    by = {c.name: c for c in env}
    assert by["bolt shear [hinge at support face]"].demand > by["bolt shear [hinge at bolt line]"].demand


def test_example_passes_and_overload_fails(example_plate, example_beam, example_column, example_joint, example_demand):
    ok = RS.check_fin_plate(example_joint, example_demand, example_plate, example_beam, example_column, "envelope")
    strength = [c for c in ok if c.unit in ("N", "N·mm")]
    assert all(c.passed for c in strength), [c.name for c in strength if not c.passed]
    over = RS.check_fin_plate(example_joint, Demand(700e3), example_plate, example_beam, example_column)
    failed = {c.name for c in over if not c.passed}
    assert "bolt shear [hinge at support face]" in failed and "plate shear yield" in failed


def test_tie_checks_only_with_tie_force(example_plate, example_beam, example_column, example_joint, example_demand):
    assert not any(n.startswith("tie:") for n in names(
        RS.check_fin_plate(example_joint, example_demand, example_plate, example_beam, example_column)))
    with_tie = names(RS.check_fin_plate(example_joint, Demand(350e3, 200e3), example_plate, example_beam, example_column))
    assert {"tie: bolt shear", "tie: bolt bearing on plate", "tie: plate tension",
            "tie: bolt bearing on beam web", "tie: beam web tension"} <= set(with_tie)


def test_missing_inputs_give_incomplete_checks_not_exceptions(example_plate, example_beam, example_column, example_joint, example_demand):
    no_web = dataclasses.replace(example_beam, section=dataclasses.replace(example_beam.section, web_thickness=None))
    checks = RS.check_fin_plate(example_joint, example_demand, example_plate, no_web, example_column)
    inc = {c.name for c in checks if c.incomplete}
    assert {"beam web shear", "bolt bearing on beam web [hinge at support face]"} <= inc
    assert all(not c.passed for c in checks if c.incomplete)
    assert all("EN 1993" in c.note or "SCI" in c.note or "MSB05" in c.note for c in checks if c.incomplete)
    # no support member
    checks = RS.check_fin_plate(example_joint, example_demand, example_plate, example_beam, None)
    assert next(c for c in checks if c.name == "support local shear").incomplete
    # unknown steel on the beam
    no_steel = dataclasses.replace(example_beam, steel=None)
    assert next(c for c in RS.check_fin_plate(example_joint, example_demand, example_plate, no_steel, example_column)
                if c.name == "beam web shear").incomplete
    # oversize holes: bearing outside the covered range
    over = dataclasses.replace(example_plate, bolts=BoltSpec("M20", 20.0, "8.8", hole="oversize"))
    assert next(c for c in RS.check_fin_plate(example_joint, example_demand, over, example_beam, example_column)
                if c.name.startswith("bolt bearing on plate")).incomplete
    # plate thicker than the steel table (80 mm)
    thick = dataclasses.replace(example_plate, thickness=90.0)
    assert next(c for c in RS.check_fin_plate(example_joint, example_demand, thick, example_beam, example_column)
                if c.name == "plate shear yield").incomplete
    # bolt size not in the table
    odd = dataclasses.replace(example_plate, bolts=BoltSpec("M21", 21.0, "8.8"))
    checks = RS.check_fin_plate(example_joint, example_demand, odd, example_beam, example_column)
    assert checks and all(c.incomplete for c in checks) and "M20" in checks[0].note


def test_capacity_functions_raise_rule_set_errors_with_valid_values():
    with pytest.raises(RuleSetError, match="M20"):
        RS.bolt_shear_capacity("M21", "8.8")
    with pytest.raises(RuleSetError, match="10.9"):
        RS.bolt_shear_capacity("M20", "A325")
    with pytest.raises(RuleSetError, match="S275"):
        RS.fillet_weld_capacity(6.0, "E70XX")
    with pytest.raises(RuleSetError):
        RS.fillet_weld_capacity(-1.0, "S275")
    assert RS.bolt_shear_capacity("20", "grade 8.8") == RS.bolt_shear_capacity("M20", "8.8")


def test_ultimate_combination_en1990():
    # EN 1990 6.10 with Table A1.2(B) recommended values: 1.35 G + 1.5 Q
    c = RS.ultimate_combination()
    assert (c["dead"], c["live"], c["dead_only"]) == (1.35, 1.5, 1.35) and "6.10" in c["source"]
    ab = EN1993(combination="6.10ab").ultimate_combination()
    # 6.10b: ξ γ_G = 0.85·1.35 = 1.1475; 6.10a: 1.35 G + 0.7·1.5 Q = 1.05 Q
    assert ab["dead"] == pytest.approx(1.1475) and ab["live"] == 1.5 and ab["dead_only"] == 1.35
    assert ab["alternatives"][0]["live"] == pytest.approx(1.05)
    with pytest.raises(RuleSetError):
        EN1993(combination="6.11")


def test_elastic_bolt_forces_follow_the_load():
    # the mechanics layer returns forces in the direction of the applied load: they sum to (Px, Py)
    # and their moment about the centroid is Mz (the bearing/tear-out directions rely on it)
    xy = np.array([[50.0, -40.0], [110.0, -40.0], [50.0, -110.0], [110.0, -110.0]])
    F = _bolt_forces(xy, 1e3, -350e3, 2.8e7)
    assert F.sum(axis=0) == pytest.approx([1e3, -350e3])
    r = xy - xy.mean(axis=0)
    assert float(np.sum(r[:, 0] * F[:, 1] - r[:, 1] * F[:, 0])) == pytest.approx(2.8e7)


def test_thickness_dependent_strength():
    from rules import en1993_data as data

    # EN 1993-1-1:2005+AC:2009 Table 3.1: S355 t ≤ 40: 355/490; 40 < t ≤ 80: 335/470
    assert data.steel_strength(Steel("S355J2", 355, 470), 20.0)[:2] == (355.0, 490.0)
    assert data.steel_strength(Steel("S355J2", 355, 470), 50.0)[:2] == (335.0, 470.0)
    assert data.steel_strength(Steel("S355J2", 355, 470), 90.0) is None
    fy, fu, note = data.steel_strength(Steel("Grade 350", 350, 450), 10.0)
    assert (fy, fu) == (350.0, 450.0) and "not tabulated" in note


def test_layout_outside_validity_is_incomplete(example_plate, example_beam, example_column, example_joint, example_demand):
    # bolts below the plate's bottom edge: 40 + 4·70 = 320 > 300 mm plate
    short = dataclasses.replace(example_plate, depth=300.0)
    checks = RS.check_fin_plate(example_joint, example_demand, short, example_beam, example_column)
    assert checks and all(c.incomplete and not c.passed for c in checks)
    assert "outside" in checks[0].note
    none = dataclasses.replace(example_plate, rows=0)
    assert all(c.incomplete for c in RS.check_fin_plate(example_joint, example_demand, none, example_beam, example_column))


def test_uplift_gives_same_magnitudes(example_plate, example_beam, example_column, example_joint):
    down = {c.name: c for c in RS.check_fin_plate(example_joint, Demand(200e3), example_plate, example_beam, example_column)}
    up = {c.name: c for c in RS.check_fin_plate(example_joint, Demand(-200e3), example_plate, example_beam, example_column)}
    for name in ("bolt shear [hinge at support face]", "bolt bearing on plate [hinge at support face]",
                 "plate shear yield", "weld [hinge at support face]"):
        assert up[name].demand == pytest.approx(down[name].demand)
        assert up[name].utilisation == pytest.approx(down[name].utilisation)
