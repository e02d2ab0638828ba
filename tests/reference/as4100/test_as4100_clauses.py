"""Each AS 4100 formula of the ``as4100`` rule set against the clause computed by hand.

Edition: AS 4100-1998 (R2016) Steel structures incl. Amendment No. 1 (2012); clause numbers of that
edition (the 2020 edition numbers the bolt clauses 9.2.2.x and the fillet weld clause 9.6.3.10).
Arithmetic is written out in each test; the clause is named beside it.
"""

from __future__ import annotations

import math
from dataclasses import replace

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import rules
from engine.errors import ConfigError, RuleSetError
from engine.model import (BoltSpec, Cope, Demand, FinPlate, Joint, JointGeometry, Member, Section, Steel,
                          Weld)
from rules import as4100_checks as C
from rules.as4100 import AS4100, CHECKS

SFX_B = " [hinge at bolt line]"
SFX_S = " [hinge at support face]"


# ----------------------------------------------------------------------------- registry / contract
def test_registry_loads_as4100_through_its_entry_point():
    rs = rules.load("as4100")
    assert isinstance(rs, AS4100)
    assert rs.code_id == "as4100"
    assert "AS 4100" in rs.title and "1998" in rs.title


def test_data_sources_name_each_table_and_its_standard(rs):
    src = rs.data_sources()
    assert len(src) == 3
    assert any("Table 9.3.1" in s for s in src)
    assert any("AS/NZS 3678" in s for s in src)
    assert any("1170.0" in s for s in src)


def test_ultimate_combination_is_as_nzs_1170_0_4_2_2(rs):
    c = rs.ultimate_combination()
    # AS/NZS 1170.0:2002 cl. 4.2.2: (a) 1.35G, (b) 1.2G + 1.5Q
    assert (c["dead"], c["live"], c["dead_only"]) == (1.2, 1.5, 1.35)
    assert "1170.0" in c["source"] and "4.2.2" in c["source"]


def test_check_list_has_every_shared_check_name(rs):
    names = {n for n, _ in rs.check_list()}
    shared = {
        "bolt shear", "bolt bearing on plate", "bolt tear-out in plate", "bolt bearing on beam web",
        "bolt tear-out in beam web", "plate shear yield", "plate shear rupture", "plate block shear",
        "plate bending", "plate lateral-torsional buckling", "beam web shear", "beam web block shear",
        "coped section bending", "weld", "weld stronger than plate", "support local shear",
        "bolt pitch minimum", "bolt pitch maximum", "bolt gauge minimum", "edge distance minimum (plate)",
        "edge distance minimum (beam web)", "edge distance maximum", "plate depth to beam depth",
        "bolt group within clear web depth", "plate thickness for rotation", "clearance to support",
    }
    assert shared <= names
    assert all(clause for _, clause in rs.check_list())


# ----------------------------------------------------------------------------- cl. 9.3.2.1 bolt shear
def test_bolt_shear_threads_included_uses_core_area(rs):
    # cl. 9.3.2.1: φVf = 0.8 × 0.62 × fuf × kr × nn Ac; M20 8.8/S: fuf = 830, Ac = 225 mm²
    assert rs.bolt_shear_capacity("M20", "8.8/S", True) == pytest.approx(0.8 * 0.62 * 830 * 225)


def test_bolt_shear_threads_excluded_uses_shank_area(rs):
    # cl. 9.3.2.1: nx Ao; M24 8.8: Ao = 452 mm²
    assert rs.bolt_shear_capacity("M24", "8.8", False) == pytest.approx(0.8 * 0.62 * 830 * 452)


def test_bolt_shear_double_shear_doubles_the_planes(rs):
    one = rs.bolt_shear_capacity("M16", "4.6/S", True, 1)
    assert rs.bolt_shear_capacity("M16", "4.6/S", True, 2) == pytest.approx(2 * one)
    assert one == pytest.approx(0.8 * 0.62 * 400 * 144)  # 4.6: fuf = 400 MPa (Table 9.3.1)


@pytest.mark.parametrize("lj, kr", [
    (0.0, 1.0), (299.9, 1.0),              # Table 9.3.2.1: lj < 300 mm -> 1.0
    (300.0, 1.075 - 300 / 4000),           # = 1.0 at the kink
    (700.0, 1.075 - 700 / 4000),           # = 0.9
    (1300.0, 1.075 - 1300 / 4000),         # = 0.75 at the other kink
    (1300.1, 0.75), (2000.0, 0.75),
])
def test_long_joint_reduction_kr_table_9_3_2_1(lj, kr):
    assert C.kr_long_joint(lj) == pytest.approx(kr)


def test_bolt_shear_check_uses_kr_for_a_long_bolt_line(rs, make_plate, make_joint, beam, column, by_name):
    # 6 rows at 80 pitch: lj = 400 mm -> kr = 1.075 - 400/4000 = 0.975
    plate = make_plate(rows=6, pitch=80.0, depth=490.0)
    chk = by_name(rs.check_fin_plate(make_joint("stiff"), Demand(100e3), plate, beam, column, "classified"))
    assert chk["bolt shear" + SFX_B].capacity == pytest.approx(0.8 * 0.62 * 830 * 0.975 * 225)


@pytest.mark.parametrize("size, grade, match", [
    ("M21", "8.8/S", "M12"), ("3/4", "8.8/S", "M20"), ("M20", "10.9", "8.8/S"), ("M20", "A325", "4.6/S"),
])
def test_bolt_shear_capacity_rejects_unknown_sizes_and_grades(rs, size, grade, match):
    with pytest.raises(RuleSetError, match=match):
        rs.bolt_shear_capacity(size, grade)


def test_bolt_shear_capacity_rejects_bad_shear_plane_counts(rs):
    with pytest.raises(RuleSetError, match="shear_planes"):
        rs.bolt_shear_capacity("M20", "8.8/S", True, 0)


# ----------------------------------------------------------------------------- cl. 9.3.2.4 bearing
def test_ply_bearing_and_tear_out_formulas():
    # cl. 9.3.2.4: Vb = 3.2 df tp fup, and Vb = ae tp fup
    assert C.Vb_bearing(20, 10, 410) == pytest.approx(3.2 * 20 * 10 * 410)
    assert C.Vb_tearout(34.0, 10, 410) == pytest.approx(34.0 * 10 * 410)


def test_ae_is_hole_edge_to_ply_edge_plus_half_the_bolt_diameter():
    # cl. 9.3.2.4 definition: e = 35 mm to the hole centre, dh = 22, df = 20 -> ae = 35 - 11 + 10 = 34
    assert float(C.ae_tearout(35.0, 22.0, 20.0)) == pytest.approx(34.0)


def test_tear_out_in_plate_governs_at_the_bottom_bolt_for_a_stiff_support(
        rs, make_plate, make_joint, beam, column, by_name):
    # hinge at bolt line: each bolt takes V/3 straight down; on the plate the bottom bolt tears out
    # towards the bottom edge: e = 230 - 45 - 2*70 = 45 -> ae = 45 - 11 + 10 = 44 mm
    chk = by_name(rs.check_fin_plate(make_joint("stiff"), Demand(150e3), make_plate(), beam, column, "classified"))
    c = chk["bolt tear-out in plate" + SFX_B]
    assert c.demand == pytest.approx(150e3 / 3)
    assert c.capacity == pytest.approx(0.9 * 44.0 * 10 * 410)
    # on the web the bolts push up: the top bolt has the top flange above it (no tear-out path); bolt 2
    # tears towards hole 1: e = 70 - 11 = 59 to the hole edge -> ae = 59 - 11 + 10 = 58 mm
    w = chk["bolt tear-out in beam web" + SFX_B]
    assert w.capacity == pytest.approx(0.9 * 58.0 * 6.1 * 440)


def test_tear_out_can_fail_with_a_short_end_distance(rs, make_plate, make_joint, beam, column, by_name):
    # bottom edge 25 mm: ae = 25 - 11 + 10 = 24 mm -> φVb = 0.9 × 24 × 10 × 410 = 88.6 kN < 100 kN
    plate = make_plate(depth=210.0)
    chk = by_name(rs.check_fin_plate(make_joint("stiff"), Demand(300e3), plate, beam, column, "classified"))
    c = chk["bolt tear-out in plate" + SFX_B]
    assert c.capacity == pytest.approx(0.9 * 24 * 10 * 410)
    assert not c.passed


# ----------------------------------------------------------------------------- cl. 9.7.3.10 welds
def test_fillet_weld_capacity_sp_and_gp(rs):
    # cl. 9.7.3.10: φvw = φ 0.6 fuw tt kr; tt = 6/√2; E48XX fuw = 480; SP φ = 0.8, GP φ = 0.6
    tt = 6 / math.sqrt(2)
    assert rs.fillet_weld_capacity(6, "E48XX") == pytest.approx(0.8 * 0.6 * 480 * tt)
    assert rs.fillet_weld_capacity(6, "E48XX GP") == pytest.approx(0.6 * 0.6 * 480 * tt)
    assert rs.fillet_weld_capacity(6, "E41XX SP") == pytest.approx(0.8 * 0.6 * 410 * tt)


@pytest.mark.parametrize("leg, electrode, match", [
    (6, "E70XX", "E48XX"), (0, "E48XX", "positive"), (-3, "E48XX", "positive"), ("six", "E48XX", "number"),
])
def test_fillet_weld_capacity_rejects_bad_input(rs, leg, electrode, match):
    with pytest.raises(RuleSetError, match=match):
        rs.fillet_weld_capacity(leg, electrode)


def test_weld_check_adds_the_moment_for_a_stiff_support(rs, make_plate, make_joint, beam, column, by_name):
    # two 8 mm fillets, Lw = 230: v = 150000/(2·230) = 326.09 N/mm;
    # M = V·a = 150000 × 60 = 9.0e6 N·mm -> m = 6M/(2 Lw²) = 510.40 N/mm; q = √(v² + m²)
    v = 150e3 / (2 * 230)
    m = 6 * 150e3 * 60 / (2 * 230**2)
    q = math.hypot(v, m)
    chk = by_name(rs.check_fin_plate(make_joint("stiff"), Demand(150e3), make_plate(), beam, column, "envelope"))
    assert chk["weld" + SFX_B].demand == pytest.approx(q / (8 / math.sqrt(2)))
    assert chk["weld" + SFX_S].demand == pytest.approx(v / (8 / math.sqrt(2)))
    assert chk["weld" + SFX_B].capacity == pytest.approx(0.8 * 0.6 * 480)


# ----------------------------------------------------------------------------- cl. 5.11, 5.2, 5.6, 9.1.9
def test_web_shear_yield_and_buckling_factor():
    # cl. 5.11.4: Vw = 0.6 fy Aw; cl. 5.11.5.1: αv = (82 / ((d1/tw)√(fy/250)))² when > 82
    assert C.Vw_shear(320, 304 * 6.1) == pytest.approx(0.6 * 320 * 304 * 6.1)
    assert C.alpha_v(283.6, 6.1, 320) == 1.0                          # 46.5 × 1.131 = 52.6 ≤ 82
    assert C.alpha_v(1000, 6, 250) == pytest.approx((82 / (1000 / 6)) ** 2)  # = 0.2421


def test_block_shear_takes_the_lesser_shear_term():
    # cl. 9.1.9: Rbs = 0.6 fu Anv + kbs fu Ant ≤ 0.6 fy Agv + kbs fu Ant
    assert C.Vbs(410, 260, 1300, 1850, 240, 1.0) == pytest.approx(min(0.6 * 410 * 1300, 0.6 * 260 * 1850) + 410 * 240)
    assert C.Vbs(410, 260, 1800, 1850, 240, 0.5) == pytest.approx(0.6 * 260 * 1850 + 0.5 * 410 * 240)


def test_net_section_modulus_of_a_plate_with_three_holes():
    # 10 × 230 plate, 22 mm holes at +70, 0, -70 mm from mid-depth:
    # I = 10·230³/12 − 3·10·22³/12 − 2·10·22·70² = 10 139 166.7 − 26 620 − 2 156 000 = 7 956 546.7 mm⁴
    I = 10 * 230**3 / 12 - 3 * 10 * 22**3 / 12 - 2 * 10 * 22 * 70**2
    assert C.Z_net_rect(10, 230, np.array([70.0, 0.0, -70.0]), 22) == pytest.approx(I / 115)


def test_plate_buckling_moment_and_alpha_s():
    # cl. 5.6.1.1 with Iw = 0: Mo = (π/Le)√(E Iy G J); Iy = d t³/12, J = d t³/3
    Iy, J = 230 * 10**3 / 12, 230 * 10**3 / 3
    assert C.Mo_rect(600, 230, 10) == pytest.approx(math.pi / 600 * math.sqrt(200e3 * Iy * 80e3 * J))
    # αs = 0.6(√((Ms/Mo)² + 3) − Ms/Mo): Ms/Mo = 1 -> 0.6 × (2 − 1) = 0.6
    assert C.alpha_s(1.0, 1.0) == pytest.approx(0.6)


def test_long_thin_plate_fails_lateral_torsional_buckling(rs, make_plate, make_joint, beam, column, by_name):
    # 6 mm plate, a = 400 mm: Mo = π/400 √(2e5·(230·216/12)·8e4·(230·216/3)) = 32.5 kN·m,
    # Ms = 280 × 6·230²/6 = 14.8 kN·m (t ≤ 8 mm: fy 280) -> αs = 0.6(√(0.456²+3) − 0.456) = 0.800
    plate = make_plate(thickness=6.0, a=400.0, beam_end_edge=40.0, width=435.0)
    chk = by_name(rs.check_fin_plate(make_joint("stiff"), Demand(40e3), plate, beam, column, "classified"))
    Ms = 280 * 6 * 230**2 / 6
    Mo = math.pi / 400 * math.sqrt(200e3 * (230 * 6**3 / 12) * 80e3 * (230 * 6**3 / 3))
    a_s = 0.6 * (math.sqrt((Ms / Mo) ** 2 + 3) - Ms / Mo)
    c = chk["plate lateral-torsional buckling" + SFX_B]
    assert c.capacity == pytest.approx(0.9 * a_s * Ms)
    assert c.demand == pytest.approx(40e3 * 400)
    assert not c.passed


# ----------------------------------------------------------------------------- hinge positions
def test_envelope_lists_hinge_dependent_checks_once_per_hinge(rs, make_plate, make_joint, beam, column, demand150):
    checks = rs.check_fin_plate(make_joint("flexible"), demand150, make_plate(), beam, column, "envelope")
    names = [c.name for c in checks]
    for base in ("bolt shear", "bolt bearing on plate", "plate bending", "weld"):
        assert names.count(base + SFX_B) == 1 and names.count(base + SFX_S) == 1
    for base in ("plate shear yield", "plate block shear", "beam web shear", "bolt pitch minimum"):
        assert names.count(base) == 1
    assert len(names) == len(set(names))


def test_classified_stiff_support_checks_the_bolt_line_hinge_only(rs, make_plate, make_joint, beam, column, demand150):
    names = [c.name for c in rs.check_fin_plate(make_joint("stiff"), demand150, make_plate(), beam, column, "classified")]
    assert "bolt shear" + SFX_B in names and "bolt shear" + SFX_S not in names


def test_flexible_support_puts_the_moment_on_the_bolts(rs, make_plate, make_joint, beam, column, demand150, by_name):
    # hinge at support face: Mz = V·a = 150e3 × 60 = 9e6 N·mm; J = 2 × 70² = 9800 mm²;
    # top bolt: (9e6 × 70 / 9800, −50000) = (64 286, −50 000) -> |F| = 81 441 N
    chk = by_name(rs.check_fin_plate(make_joint("flexible"), demand150, make_plate(), beam, column))
    assert chk["bolt shear" + SFX_S].demand == pytest.approx(math.hypot(9e6 * 70 / 9800, 50e3))


def test_unknown_policy_is_a_config_error(rs, make_plate, make_joint, beam, column, demand150):
    with pytest.raises(ConfigError, match="policy"):
        rs.check_fin_plate(make_joint(), demand150, make_plate(), beam, column, "optimistic")


# ----------------------------------------------------------------------------- cl. 9.1.4 minimum action
def test_small_shear_is_raised_to_the_9_1_4_minimum(rs, make_plate, make_joint, beam, column, by_name):
    # φVv of 310UB40.4 = 0.9 × 0.6 × 320 × 304 × 6.1 = 320.4 kN; 0.15 φVv = 48.1 kN; lesser with 40 kN = 40 kN
    chk = by_name(rs.check_fin_plate(make_joint("stiff"), Demand(10e3), make_plate(), beam, column, "classified"))
    assert chk["plate shear yield"].demand == pytest.approx(40e3)
    assert chk["bolt shear" + SFX_B].demand == pytest.approx(40e3 / 3)
    assert "9.1.4" in chk["bolt shear" + SFX_B].note


# ----------------------------------------------------------------------------- failures are results
def test_overloaded_connection_fails_bolt_shear_without_raising(rs, make_plate, make_joint, beam, column, by_name):
    chk = by_name(rs.check_fin_plate(make_joint("stiff"), Demand(400e3), make_plate(), beam, column, "classified"))
    c = chk["bolt shear" + SFX_B]
    assert c.demand == pytest.approx(400e3 / 3) and not c.passed and c.utilisation > 1


@pytest.mark.parametrize("field, value, check, passed", [
    ("pitch", 45.0, "bolt pitch minimum", False),              # 9.6.1: 2.5 × 20 = 50 > 45
    ("plate_side_edge", 30.0, "edge distance minimum (plate)", False),  # Table 9.6.2: 1.75 × 20 = 35 > 30
    ("thickness", 12.0, "plate thickness for rotation", False),        # practice: ≤ 10 mm
    ("beam_end_edge", 55.0, "clearance to support", False),    # gap 60 − 55 = 5 < 10 mm
    ("depth", 160.0, "plate depth to beam depth", False),      # 0.6 × 304 = 182.4 > 160
])
def test_detailing_limits_fail_when_violated(rs, make_plate, make_joint, beam, column, by_name, field, value, check, passed):
    kw = {field: value}
    if field == "depth":
        kw.update(plate_end_edge=10.0)  # keep three rows inside the shorter plate: 10 + 140 + 10
    if field == "pitch":
        kw.update(depth=180.0)
    chk = by_name(rs.check_fin_plate(make_joint("stiff"), Demand(50e3), make_plate(**kw), beam, column, "classified"))
    assert chk[check].passed is passed


def test_pitch_maximum_is_4tp_plus_100_for_the_outer_line(rs, make_plate, make_joint, beam, column, by_name):
    # cl. 9.6.3(b): min(4 × 6.1 + 100, 200) = 124.4 mm for the 6.1 mm web
    chk = by_name(rs.check_fin_plate(make_joint("stiff"), Demand(50e3), make_plate(), beam, column, "classified"))
    assert chk["bolt pitch maximum"].capacity == pytest.approx(4 * 6.1 + 100)


def test_plate_above_the_root_radius_fails_the_clear_web_check(rs, make_plate, make_joint, beam, column, by_name):
    # top bolt 60 below the top of steel: plate top 60 − 45 = 15 mm < tf + r = 21.6 mm
    chk = by_name(rs.check_fin_plate(make_joint("stiff"), Demand(50e3), make_plate(beam_top_edge=60.0), beam, column, "classified"))
    assert not chk["bolt group within clear web depth"].passed


# ----------------------------------------------------------------------------- incomplete, not exceptions
def test_missing_web_thickness_makes_beam_checks_incomplete(rs, make_plate, make_joint, beam, column, demand150, by_name):
    b = replace(beam, section=replace(beam.section, web_thickness=None))
    chk = by_name(rs.check_fin_plate(make_joint(), demand150, make_plate(), b, column))
    for n in ("beam web shear", "bolt bearing on beam web" + SFX_S, "edge distance minimum (beam web)"):
        assert chk[n].incomplete and not chk[n].passed
        assert "web thickness" in chk[n].note
    assert not chk["plate shear yield"].incomplete


def test_missing_support_makes_support_shear_incomplete(rs, make_plate, make_joint, beam, demand150, by_name):
    chk = by_name(rs.check_fin_plate(make_joint(), demand150, make_plate(), beam, None))
    assert chk["support local shear"].incomplete and "5.11.4" in chk["support local shear"].note


def test_unknown_bolt_size_makes_bolt_shear_incomplete(rs, make_plate, make_joint, beam, column, demand150, by_name):
    plate = make_plate(bolts=BoltSpec("M21", 21.0, "8.8/S"))
    chk = by_name(rs.check_fin_plate(make_joint(), demand150, plate, beam, column))
    c = chk["bolt shear" + SFX_S]
    assert c.incomplete and not c.passed and "9.3.2.1" in c.note
    assert not chk["plate shear yield"].incomplete


def test_slotted_holes_make_bearing_incomplete(rs, make_plate, make_joint, beam, column, demand150, by_name):
    plate = make_plate(bolts=BoltSpec("M20", 20.0, "8.8/S", True, "short-slot", 22.0))
    chk = by_name(rs.check_fin_plate(make_joint(), demand150, plate, beam, column))
    assert chk["bolt bearing on plate" + SFX_S].incomplete
    assert chk["edge distance minimum (plate)"].incomplete


def test_impossible_layout_returns_incomplete_checks(rs, make_plate, make_joint, beam, column, demand150):
    checks = rs.check_fin_plate(make_joint(), demand150, make_plate(rows=1), beam, column)
    assert checks and all(c.incomplete and not c.passed for c in checks)
    assert "two bolts" in checks[0].note


def test_unknown_electrode_makes_weld_checks_incomplete(rs, make_plate, make_joint, beam, column, demand150, by_name):
    chk = by_name(rs.check_fin_plate(make_joint(), demand150, make_plate(weld=Weld(8.0, "E70XX")), beam, column))
    assert chk["weld" + SFX_S].incomplete and chk["weld stronger than plate"].incomplete


def test_cope_outside_the_validity_range_is_incomplete(rs, make_plate, make_joint, beam, column, demand150, by_name):
    j = make_joint(copes=(Cope("top", 40.0, 700.0),))  # longer than 2d = 608 mm
    chk = by_name(rs.check_fin_plate(j, demand150, make_plate(beam_top_edge=50.0), beam, column))
    assert chk["coped section bending" + SFX_S].incomplete


def test_unknown_plate_grade_uses_the_given_strengths(rs, make_plate, make_joint, beam, column, demand150, by_name):
    plate = make_plate(steel=Steel("S275", 275.0, 430.0))
    chk = by_name(rs.check_fin_plate(make_joint(), demand150, plate, beam, column))
    # cl. 5.11.3 with Vu = 0.6 fy Ag (cl. 5.11.4), f*vm/f*va = 1.5: 0.9 × 2 × 0.6 × 275 × 2300 / 2.4
    assert chk["plate shear yield"].capacity == pytest.approx(0.9 * 2 * 0.6 * 275 * 230 * 10 / (0.9 + 1.5))
    assert "not in AS/NZS 3678" in chk["plate shear yield"].note


# ----------------------------------------------------------------------------- tie force
def test_tie_force_adds_tension_checks_and_loads_the_bolts(rs, make_plate, make_joint, beam, column, by_name):
    chk = by_name(rs.check_fin_plate(make_joint("stiff"), Demand(100e3, 60e3), make_plate(), beam, column, "classified"))
    # bolt: (60e3/3, −100e3/3) -> |F| = 38 873 N
    assert chk["bolt shear" + SFX_B].demand == pytest.approx(math.hypot(20e3, 100e3 / 3))
    # cl. 7.2: φNt = 0.9 min(Ag fy, 0.85 kt An fu) = 0.9 min(2300 × 260, 0.85 × 1640 × 410)
    assert chk["plate tension (tie)"].capacity == pytest.approx(0.9 * min(2300 * 260, 0.85 * 1640 * 410))
    assert "beam web tension (tie)" in chk


def test_every_check_has_a_clause_and_a_unit(rs, make_plate, make_joint, beam, column, demand150):
    for c in rs.check_fin_plate(make_joint(), demand150, make_plate(), beam, column, "envelope"):
        assert c.clause and c.unit in ("N", "N·mm", "mm", "MPa", "-")
        assert math.isfinite(c.utilisation)


def test_edge_type_option_must_be_in_table_9_6_2():
    with pytest.raises(RuleSetError, match="Table 9.6.2"):
        AS4100(plate_edge="laser cut")
    assert dict(CHECKS)["edge distance minimum (plate)"].endswith("Table 9.6.2")


# ----------------------------------------------------------------------------- robustness
@settings(max_examples=60, deadline=None, derandomize=True)
@given(rows=st.integers(2, 8), lines=st.integers(1, 2), pitch=st.floats(50, 100), gauge=st.floats(50, 90),
       a=st.floats(45, 150), V=st.floats(1e3, 800e3), N=st.floats(0, 150e3),
       cope=st.sampled_from([(), (Cope("top", 40.0, 120.0),), (Cope("top", 30.0, 90.0), Cope("bottom", 30.0, 90.0))]))
def test_any_reasonable_layout_gives_finite_consistent_checks(rows, lines, pitch, gauge, a, V, N, cope):
    beam = Member("B", "IfcBeam", "beam", (0, 0, 0), (6000, 0, 0),
                  Section("530UB92.4", "I", 533.0, 209.0, 10.2, 15.6, 14.0, 11800.0), Steel("300", 320, 440))
    col = Member("C", "IfcColumn", "column", (0, 0, 0), (0, 0, 4000),
                 Section("310UC118", "I", 315.0, 307.0, 11.9, 18.7, 16.5, 15000.0), Steel("300", 300, 440))
    depth = 40 + (rows - 1) * pitch + 40
    plate = FinPlate(10.0, depth, a + (lines - 1) * gauge + 40, Steel("250", 260, 410), BoltSpec("M20", 20, "8.8/S"),
                     rows, lines, pitch, gauge, 40.0, 40.0, 40.0, 60.0, a, Weld(8.0, "E48XX"))
    j = Joint("J", "B", "end", "C", "column-flange", JointGeometry((0, 0, 0), copes=cope), "flexible")
    checks = AS4100().check_fin_plate(j, Demand(V, N), plate, beam, col, "envelope")
    names = [c.name for c in checks]
    assert len(names) == len(set(names))
    for c in checks:
        assert math.isfinite(c.demand) and math.isfinite(c.capacity)
        if not c.incomplete:
            assert c.passed == (c.utilisation <= 1.0 + 1e-9), c.name


@settings(max_examples=30, deadline=None, derandomize=True)
@given(V=st.floats(60e3, 600e3), k=st.floats(1.1, 3.0))
def test_bolt_shear_demand_scales_with_the_end_shear(V, k):
    beam = Member("B", "IfcBeam", "beam", (0, 0, 0), (6000, 0, 0),
                  Section("310UB40.4", "I", 304.0, 165.0, 6.1, 10.2, 11.4, 5210.0), Steel("300", 320, 440))
    plate = FinPlate(10.0, 230.0, 95.0, Steel("250", 260, 410), BoltSpec("M20", 20, "8.8/S"),
                     3, 1, 70.0, 0.0, 45.0, 35.0, 40.0, 80.0, 60.0, Weld(8.0, "E48XX"))
    j = Joint("J", "B", "end", None, "column-flange", JointGeometry((0, 0, 0)), "flexible")
    rs = AS4100()
    c1 = {c.name: c for c in rs.check_fin_plate(j, Demand(V), plate, beam, None)}
    c2 = {c.name: c for c in rs.check_fin_plate(j, Demand(k * V), plate, beam, None)}
    n = "bolt shear" + SFX_S
    assert c2[n].demand == pytest.approx(k * c1[n].demand)
    assert c2[n].capacity == pytest.approx(c1[n].capacity)


def test_unknown_steel_strengths_are_incomplete_not_infinite(rs, make_plate, make_joint, beam, column, demand150, by_name):
    checks = rs.check_fin_plate(make_joint(), demand150, make_plate(steel=Steel("mystery", 0.0, 0.0)), beam, column)
    assert checks and all(c.incomplete for c in checks)
    b = replace(beam, steel=Steel("mystery", 0.0, 0.0))
    chk = by_name(rs.check_fin_plate(make_joint(), demand150, make_plate(), b, column))
    assert chk["beam web shear"].incomplete and not chk["plate shear yield"].incomplete


def test_two_bolt_lines_block_shear_and_moments(rs, make_plate, make_joint, beam, column, by_name):
    # 3 rows × 2 lines, gauge 60, a = 60 to the first line: centroid at 60 + 30 = 90 mm
    plate = make_plate(lines=2, gauge=60.0, width=155.0)
    chk = by_name(rs.check_fin_plate(make_joint("stiff"), Demand(200e3), plate, beam, column, "envelope"))
    # cl. 9.1.9, plate: shear plane along line 1 from the top bolt down, 185 mm: Agv = 1850,
    # Anv = (185 − 2.5 × 22) × 10 = 1300; tension plane to the free edge 60 + 35 = 95 mm:
    # Ant = (95 − 1.5 × 22) × 10 = 620; kbs = 0.5 (two lines, non-uniform tension)
    Rbs = min(0.6 * 410 * 1300, 0.6 * 260 * 1850) + 0.5 * 410 * 620
    assert chk["plate block shear"].capacity == pytest.approx(0.75 * Rbs)
    # bolt line hinge: M at the weld = V × 90 = 18.0e6 N·mm (gross), at line 1 = V × 30 (net)
    assert chk["plate bending" + SFX_B].demand == pytest.approx(200e3 * 90)
    # support face hinge: M at line 1 = V × a = 12.0e6 on the net section
    assert chk["plate bending" + SFX_S].demand == pytest.approx(200e3 * 60)
    # gauge limits: 2.5 df = 50 ≤ 60; cl. 9.6.3: min(15 × 6.1, 200) = 91.5
    assert (chk["bolt gauge minimum"].demand, chk["bolt gauge maximum"].capacity) == (50.0, pytest.approx(91.5))
    # support face hinge bolt forces: J = 6 × 30² + 4 × 70² = 25 000 mm², Mz = V × 90 = 18e6;
    # corner bolt (30, 70) from the centroid: (−18e6·70/25000, −200e3/6 + 18e6·30/25000)
    Fx, Fy = -18e6 * 70 / 25000, -200e3 / 6 + 18e6 * 30 / 25000
    Fx2, Fy2 = -18e6 * 70 / 25000, -200e3 / 6 - 18e6 * 30 / 25000   # corner (−30, 70)
    assert chk["bolt shear" + SFX_S].demand == pytest.approx(max(math.hypot(Fx, Fy), math.hypot(Fx2, Fy2)))
