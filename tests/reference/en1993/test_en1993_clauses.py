"""Each EN 1993 check's formula against the clause computed by hand (arithmetic in the comments).

Clauses: EN 1993-1-8:2005 (+AC:2009), EN 1993-1-1:2005; practice SCI P358 / MSB05 (SCI/CTICM
"Steel Buildings in Europe, Multi-Storey Steel Buildings, Part 5: Joint Design").
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest

from engine.model import BoltSpec, Cope, Demand, FinPlate, Joint, JointGeometry, Member, Section, Steel, Weld
from rules import en1993_checks as ck
from rules.en1993 import EN1993

RS = EN1993()
S275 = Steel("S275", 275.0, 430.0)
R3 = math.sqrt(3.0)


def by_name(checks, name):
    hits = [c for c in checks if c.name == name]
    assert len(hits) == 1, f"{name!r} not once in {[c.name for c in checks]}"
    return hits[0]


def single_line_plate(**kw) -> FinPlate:
    """4 × M20 8.8 in one line, p = 70, e1 = 40, e2 = 40, plate 290 × 10 S275, a = 50."""
    base = dict(thickness=10.0, depth=290.0, width=90.0, steel=S275, bolts=BoltSpec("M20", 20.0, "8.8"),
                rows=4, lines=1, pitch=70.0, gauge=0.0, plate_end_edge=40.0, plate_side_edge=40.0,
                beam_end_edge=40.0, beam_top_edge=90.0, a=50.0, weld=Weld(8.0, "S275"))
    base.update(kw)
    return FinPlate(**base)


def ub(**kw) -> Member:
    """A 457 × 191 × 67 UB-like section (invented dimensions for the test, S275)."""
    sec = dict(name="TEST-UB", kind="I", depth=453.4, width=189.9, web_thickness=8.5, flange_thickness=12.7,
               root_radius=10.2, area=8550.0)
    sec.update(kw)
    return Member("B", "IfcBeam", "beam", (0, 0, 0), (6000, 0, 0), Section(**sec), S275)


def column() -> Member:
    sec = Section("TEST-UC", "I", depth=254.1, width=254.6, web_thickness=8.6, flange_thickness=14.2, root_radius=12.7, area=9310.0)
    return Member("C", "IfcColumn", "column", (0, 0, 0), (0, 0, 3000), sec, S275)


def joint(stiffness="flexible", kind="column-flange", copes=()) -> Joint:
    return Joint("J", "B", "end", "C", kind, JointGeometry((0, 0, 0), copes=tuple(copes)), stiffness=stiffness)


# ------------------------------------------------------------------------- code factors

def test_F_v_Rd_table_3_4():
    # Table 3.4: α_v f_ub A / γ_M2 = 0.6·800·245/1.25 = 94 080 N; two planes double it
    assert ck.F_v_Rd(0.6, 800, 245, 1.25) == pytest.approx(94_080.0)
    assert ck.F_v_Rd(0.6, 800, 245, 1.25, 2) == pytest.approx(188_160.0)


@pytest.mark.parametrize("Lj,d,beta", [
    (280, 20, 1.0),                       # L_j ≤ 15 d = 300: no reduction
    (400, 20, 1 - (400 - 300) / 4000),    # 3.8 eq. (3.5): 1 − (400 − 300)/(200·20) = 0.975
    (2000, 20, 0.75),                     # 1 − 1700/4000 = 0.575 → lower limit 0.75
])
def test_beta_Lf_clause_3_8(Lj, d, beta):
    assert ck.beta_Lf(Lj, d) == pytest.approx(beta)


def test_k1_and_alpha_d_table_3_4():
    # edge bolts: k1 = min(2.8 e2/d0 − 1.7, 1.4 p2/d0 − 1.7, 2.5) = min(2.8·50/22 − 1.7 = 4.664,
    # 1.4·60/22 − 1.7 = 2.118, 2.5) = 2.118
    assert ck.k1_factor(50, 60, 22) == pytest.approx(1.4 * 60 / 22 - 1.7)
    # single line, no p2: min(2.8·30/22 − 1.7 = 2.118, 2.5)
    assert ck.k1_factor(30, None, 22) == pytest.approx(2.8 * 30 / 22 - 1.7)
    # α_d = min(e1/3d0, p1/3d0 − 1/4) = min(40/66 = 0.606, 70/66 − 0.25 = 0.811)
    assert ck.alpha_d_factor(40, 70, 22) == pytest.approx(40 / 66)
    assert ck.alpha_d_factor(math.inf, 70, 22) == pytest.approx(70 / 66 - 0.25)


def test_F_w_Rd_clause_4_5_3_3():
    # f_vw,d = f_u/√3/(β_w γ_M2) = 430/1.7321/(0.85·1.25) = 233.6 MPa; × a = 5 mm → 1168 N/mm
    assert ck.F_w_Rd(430, 0.85, 5.0, 1.25) == pytest.approx(430 / R3 / (0.85 * 1.25) * 5.0)
    assert ck.F_w_Rd(430, 0.85, 5.0, 1.25) == pytest.approx(1168.0, abs=0.5)


def test_V_eff_2_Rd_clause_3_10_2():
    # 0.5·430·800/1.25 + 275·2000/(√3·1.0) = 137 600 + 317 543 = 455 143 N
    assert ck.V_eff_2_Rd(430, 275, 800, 2000, 1.0, 1.25) == pytest.approx(137_600 + 275 * 2000 / R3)


def test_f_p_LT_bs5950_annex_b():
    # BS 5950-1 Annex B.2.1, p_y = 275, λ_LT = 38.25, E = 205000, α_LT = 7:
    # λ_L0 = 0.4·√(π²·205000/275) = 34.31; η = 7(38.25 − 34.31)/1000 = 0.0276;
    # M_E = π²·205000/38.25² = 1382.9; φ = (275 + 1.0276·1382.9)/2 = 848.0;
    # p_b = 1382.9·275/(848.0 + √(848.0² − 1382.9·275)) = 265.9 MPa
    assert ck.f_p_LT(38.25, 275.0) == pytest.approx(265.9, abs=0.3)
    # below λ_L0 the strength is p_y
    assert ck.f_p_LT(20.0, 275.0) == pytest.approx(275.0)


# ------------------------------------------------------------------------- bolt checks

def test_bolt_shear_eccentric_single_line_matches_sci_formula():
    # hinge at support face, V = 200 kN, z = a = 50 mm, 4 bolts at 70:
    # elastic: Σy² = 2(35² + 105²) = 24 500 mm², M = 200e3·50 = 1e7 N·mm,
    # top bolt F_x = 1e7·105/24500 = 42 857 N, F_y = 50 000 N, |F| = 65 854 N ≤ 94 080 N.
    # SCI P358: β = 6z/(n(n+1)p1) = 300/1400 = 0.2143, V_Rd = 4·94.08/√(1 + (4β)²) = 285.7 kN.
    checks = RS.check_fin_plate(joint(), Demand(200e3), single_line_plate(), ub(), column())
    c = by_name(checks, "bolt shear [hinge at support face]")
    assert c.demand == pytest.approx(math.hypot(42_857.14, 50_000.0), rel=1e-5)
    assert c.capacity == pytest.approx(94_080.0)
    assert 200e3 / c.utilisation == pytest.approx(4 * 94_080 / math.sqrt(1 + (4 * 300 / 1400) ** 2), rel=1e-6)


def test_bolt_shear_hinge_at_bolt_line_is_direct_shear():
    # stiff support: bolts carry V only → 200e3/4 = 50 000 N per bolt
    checks = RS.check_fin_plate(joint("stiff"), Demand(200e3), single_line_plate(), ub(), column())
    assert by_name(checks, "bolt shear [hinge at bolt line]").demand == pytest.approx(50_000.0)


def test_bolt_shear_long_joint_reduction():
    # 12 rows at 70: L_j = 770 mm > 15·20 = 300 → β_Lf = 1 − 470/4000 = 0.8825
    plate = single_line_plate(rows=12, depth=850.0)
    checks = RS.check_fin_plate(joint("stiff"), Demand(100e3), plate, ub(depth=1000.0), column())
    assert by_name(checks, "bolt shear [hinge at bolt line]").capacity == pytest.approx(0.8825 * 94_080.0)


def test_bearing_on_plate_components_by_hand():
    # plate, vertical: α_b = min(40/66, 70/66 − 0.25, 800/430, 1) = 0.6061; k1 = min(2.8·40/22 − 1.7
    # = 3.391, 2.5) = 2.5 → F_b,ver = 2.5·0.6061·430·20·10/1.25 = 104 242 N.
    # horizontal: α_b = min(40/66, 1) = 0.6061 (single line); k1 = min(2.8·40/22 − 1.7, 1.4·70/22 − 1.7
    # = 2.755, 2.5) = 2.5 → F_b,hor = 104 242 N. Top bolt (F_x = 42 857, F_y = 50 000):
    # √((50000/104242)² + (42857/104242)²) = 0.6318.
    checks = RS.check_fin_plate(joint(), Demand(200e3), single_line_plate(), ub(), column())
    c = by_name(checks, "bolt bearing on plate [hinge at support face]")
    Fb = 2.5 * (40 / 66) * 430 * 20 * 10 / 1.25
    assert c.utilisation == pytest.approx(math.hypot(50_000 / Fb, 42_857.14 / Fb), rel=1e-5)


def test_tear_out_in_plate_bottom_bolt_by_hand():
    # hinge at bolt line: every bolt pushes the plate straight down (50 kN). Bottom bolt: edge
    # 40 mm below → α_b = 40/66; the others run into the hole 70 below: 70/66 − 0.25 = 0.811.
    # k1 of the vertical direction (perpendicular edge e2 = 40: 2.8·40/22 − 1.7 = 3.39 → 2.5) → F = 2.5·0.6061·430·20·10/1.25 = 104 242 N; util 0.4797.
    checks = RS.check_fin_plate(joint("stiff"), Demand(200e3), single_line_plate(), ub(), column())
    c = by_name(checks, "bolt tear-out in plate [hinge at bolt line]")
    assert c.capacity == pytest.approx(2.5 * (40 / 66) * 430 * 200 / 1.25, rel=1e-9)
    assert c.demand == pytest.approx(50_000.0)


def test_tear_out_fails_for_short_edge_along_the_force():
    # a bottom edge of 22 mm (1.0 d0): α_b = 22/66 = 0.333, k1 (vertical force, side edge 40) = 2.5,
    # F = 2.5·0.333·430·200/1.25 = 57 333 N; 100 kN per bolt fails
    plate = single_line_plate(depth=272.0)   # bottom edge = 272 − 40 − 210 = 22 mm
    checks = RS.check_fin_plate(joint("stiff"), Demand(400e3), plate, ub(), column())
    c = by_name(checks, "bolt tear-out in plate [hinge at bolt line]")
    assert c.capacity == pytest.approx(2.5 * (22 / 66) * 430 * 200 / 1.25)
    assert not c.passed


def test_bearing_on_beam_web_by_hand():
    # web t_w = 8.5, S275 f_u = 430 (MSB05 3.2.1.3 p. 5-24): vertical α_b = min(e1,b/3d0 = 90/66 = 1.36,
    # 70/66 − 0.25 = 0.811, 800/430, 1) = 0.811, k1 = min(2.8 e2,b/d0 − 1.7 = 2.8·40/22 − 1.7 = 3.39, 2.5) = 2.5
    # → F_b,ver = 2.5·0.8106·430·20·8.5/1.25 = 118 506 N; hinge at bolts, 50 kN/bolt → 0.4219
    checks = RS.check_fin_plate(joint("stiff"), Demand(200e3), single_line_plate(), ub(), column())
    c = by_name(checks, "bolt bearing on beam web [hinge at bolt line]")
    Fbv = 2.5 * (70 / 66 - 0.25) * 430 * 20 * 8.5 / 1.25
    assert c.capacity == pytest.approx(Fbv, rel=1e-9)


# ------------------------------------------------------------------------- plate checks

def test_plate_shear_checks_by_hand():
    # gross (SCI 1.27): 290·10·275/(1.27·√3) = 362 556 N; net: (290 − 4·22)·10 = 2020 mm²,
    # 2020·430/(√3·1.25) = 401 190 N; block: A_nt = 10(40 − 11) = 290, A_nv = 10(290 − 40 − 3.5·22)
    # = 1730, 0.5·430·290/1.25 + 275·1730/√3 = 49 880 + 274 674 = 324 554 N
    checks = RS.check_fin_plate(joint(), Demand(200e3), single_line_plate(), ub(), column())
    assert by_name(checks, "plate shear yield").capacity == pytest.approx(290 * 10 * 275 / (1.27 * R3))
    assert by_name(checks, "plate shear rupture").capacity == pytest.approx(2020 * 430 / (R3 * 1.25))
    assert by_name(checks, "plate block shear").capacity == pytest.approx(0.5 * 430 * 290 / 1.25 + 275 * 1730 / R3)


def test_plate_bending_sections_by_hand():
    # hinge at support face: M at the bolt line = V a = 200e3·50 = 1e7 N·mm on the net section:
    # I = 10·290³/12 − Σ(10·22³/12 + 10·22·y²), y = ±35, ±105 → 20 323 333 − (4·8873 + 220·24500)
    # = 20 323 333 − 5 425 493 = 14 897 840; W = I/145 = 102 744 mm³; M_Rd = W·275 = 28.25 kNm
    checks = RS.check_fin_plate(joint(), Demand(200e3), single_line_plate(), ub(), column())
    c = by_name(checks, "plate bending [hinge at support face]")
    I = 10 * 290**3 / 12 - (4 * 10 * 22**3 / 12 + 10 * 22 * 2 * (35**2 + 105**2))
    assert c.demand == pytest.approx(1e7)
    assert c.capacity == pytest.approx(I / 145 * 275)
    # hinge at bolt line: weld section gross, M = V z_c = 1e7; W = 10·290²/6 = 140 167 mm³
    cs = by_name(RS.check_fin_plate(joint("stiff"), Demand(200e3), single_line_plate(), ub(), column()),
                 "plate bending [hinge at bolt line]")
    assert "weld" in cs.note and cs.capacity == pytest.approx(10 * 290**2 / 6 * 275)


def test_plate_ltb_only_for_long_plates_and_by_hand():
    # short: z = 50 ≤ 10/0.15 = 66.7 → no LTB check
    names = [c.name for c in RS.check_fin_plate(joint("stiff"), Demand(200e3), single_line_plate(), ub(), column())]
    assert not any("lateral-torsional" in n for n in names)
    # long: a = 100 → λ_LT = 2.8√(100·290/(1.5·100)) = 38.93; p_b from Annex B; M_Rd = min(W p_b/0.6, W f_y)
    plate = single_line_plate(a=100.0, width=140.0, beam_end_edge=40.0)
    c = by_name(RS.check_fin_plate(joint("stiff"), Demand(200e3), plate, ub(), column()),
                "plate lateral-torsional buckling [hinge at bolt line]")
    lam = 2.8 * math.sqrt(100 * 290 / 150)
    W = 10 * 290**2 / 6
    assert c.capacity == pytest.approx(min(W * ck.f_p_LT(lam, 275) / 0.6, W * 275))
    assert c.demand == pytest.approx(200e3 * 100)


# ------------------------------------------------------------------------- weld checks

def test_weld_by_hand_both_hinges():
    # 8 mm legs both sides, a = 5.657, l_eff = 290 − 2a = 278.69 mm, F_w,Rd = 233.6·5.657 = 1321.8 N/mm
    # hinge at bolts: f_v = 200e3/(2·278.69) = 358.8, f_m = 6·1e7/(2·278.69²) = 386.3 N/mm,
    # resultant 527.2 → util 0.3989; hinge at support: f_v only → 0.2715
    a = 8 / math.sqrt(2)
    l = 290 - 2 * a
    Fw = 430 / R3 / (0.85 * 1.25) * a
    ch = RS.check_fin_plate(joint("flexible"), Demand(200e3), single_line_plate(), ub(), column(), "envelope")
    cb = by_name(ch, "weld [hinge at bolt line]")
    cs = by_name(ch, "weld [hinge at support face]")
    assert cb.utilisation == pytest.approx(math.hypot(200e3 / (2 * l), 6 * 1e7 / (2 * l * l)) / Fw, rel=1e-9)
    assert cs.utilisation == pytest.approx(200e3 / (2 * l) / Fw, rel=1e-9)
    assert cb.demand == 200e3 and cb.capacity == pytest.approx(200e3 / cb.utilisation)


def test_weld_stronger_than_plate_by_hand():
    # S275: a ≥ 275·0.85·1.25/(√2·430)·10 = 4.805 mm; 6 mm legs → a = 4.243 mm fails, 8 mm passes
    c = by_name(RS.check_fin_plate(joint(), Demand(100e3), single_line_plate(weld=Weld(6.0, "S275")), ub(), column()),
                "weld stronger than plate")
    assert c.demand == pytest.approx(275 * 0.85 * 1.25 / (math.sqrt(2) * 430) * 10)
    assert c.capacity == pytest.approx(6 / math.sqrt(2))
    assert not c.passed
    single = single_line_plate(weld=Weld(8.0, "S275", both_sides=False))
    assert not by_name(RS.check_fin_plate(joint(), Demand(100e3), single, ub(), column()), "weld stronger than plate").passed


# ------------------------------------------------------------------------- beam web checks

def test_beam_web_shear_unnotched_by_hand():
    # A_v = A − 2 b t_f + (t_w + 2r) t_f = 8550 − 2·189.9·12.7 + (8.5 + 20.4)·12.7 = 4093.5 mm²
    # ≥ h_w t_w = (453.4 − 25.4)·8.5 = 3638 → V = 4093.5·275/√3 = 649 925 N;
    # net: 4093.5 − 4·22·8.5 = 3345.5 mm², 3345.5·430/(√3·1.25) = 664 458 N
    checks = RS.check_fin_plate(joint(), Demand(200e3), single_line_plate(), ub(), column())
    Av = 8550 - 2 * 189.9 * 12.7 + (8.5 + 20.4) * 12.7
    assert by_name(checks, "beam web shear").capacity == pytest.approx(Av * 275 / R3)
    assert by_name(checks, "beam web shear rupture").capacity == pytest.approx((Av - 4 * 22 * 8.5) * 430 / (R3 * 1.25))
    assert not any(c.name == "beam web block shear" for c in checks)  # un-notched: no free top edge


def test_coped_web_block_shear_and_section_bending_by_hand():
    # top cope 40 deep × 120 long. Block: A_nt = 8.5(40 − 11) = 246.5, A_nv = 8.5(90 + 210 − 3.5·22)
    # = 1895.5 → 0.5·430·246.5/1.25 + 275·1895.5/√3 = 42 398 + 300 953 = 343 351 N.
    # Single-notched A_v = 8.5(453.4 − 40 − 12.7) + (8.5 + 20.4)·12.7/2 = 3406.0 + 183.5 = 3589.5 mm².
    # Tee at the cope end: flange 189.9 × 12.7 at the bottom, web 8.5 from 12.7 to 413.4:
    # A = 2411.7 + 3406.0 = 5817.7; ȳ = (2411.7·6.35 + 3406.0·213.05)/5817.7 = 127.37;
    # I = 189.9·12.7³/12 + 2411.7·121.02² + 8.5·400.7³/12 + 3406.0·85.68² = 106.04e6 mm⁴;
    # W = I/(413.4 − 127.37) = 370 700 mm³. Cope end at x = (50 − 40) + 120 = 130; hinge at the
    # support face → M = 200e3·130 = 2.6e7 N·mm vs W·275 = 101.9 kNm.
    j = joint(copes=[Cope("top", 40.0, 120.0)])
    checks = RS.check_fin_plate(j, Demand(200e3), single_line_plate(), ub(), column())
    bs = by_name(checks, "beam web block shear")
    assert bs.capacity == pytest.approx(0.5 * 430 * 246.5 / 1.25 + 275 * 1895.5 / R3)
    Av = 8.5 * (453.4 - 40 - 12.7) + (8.5 + 20.4) * 12.7 / 2
    assert by_name(checks, "beam web shear").capacity == pytest.approx(Av * 275 / R3)
    cb = by_name(checks, "coped section bending [hinge at support face]")
    rects = [(189.9, 0.0, 12.7), (8.5, 12.7, 413.4)]
    A = sum(b * (t - u) for b, u, t in rects)
    yc = sum(b * (t - u) * (t + u) / 2 for b, u, t in rects) / A
    I = sum(b * (t - u) ** 3 / 12 + b * (t - u) * ((t + u) / 2 - yc) ** 2 for b, u, t in rects)
    assert cb.demand == pytest.approx(2.6e7)
    assert cb.capacity == pytest.approx(I / (413.4 - yc) * 275, rel=1e-9)
    assert cb.capacity == pytest.approx(101.9e6, rel=0.002)


# ------------------------------------------------------------------------- support and detailing

def test_support_local_shear_and_punching_by_hand():
    # column flange t = 14.2 S275: V/2 = 100 kN ≤ 290·14.2·275/√3 = 653 830 N;
    # punching: t_p ≤ 14.2·430/(275·1.25) = 17.76 mm
    checks = RS.check_fin_plate(joint(), Demand(200e3), single_line_plate(), ub(), column())
    ls = by_name(checks, "support local shear")
    assert ls.demand == pytest.approx(100e3) and ls.capacity == pytest.approx(290 * 14.2 * 275 / R3)
    ps = by_name(checks, "support punching shear")
    assert ps.demand == 10.0 and ps.capacity == pytest.approx(14.2 * 430 / (275 * 1.25))
    # supporting beam web 8.6 mm, 12 mm plate: limit 8.6·430/(275·1.25) = 10.76 < 12 → fails
    ps2 = by_name(RS.check_fin_plate(joint(kind="column-web"), Demand(50e3), single_line_plate(thickness=12.0), ub(), column()),
                  "support punching shear")
    assert ps2.capacity == pytest.approx(8.6 * 430 / (275 * 1.25)) and not ps2.passed


def test_detailing_limits_by_hand():
    # Table 3.3 with d0 = 22: p1 ≥ 48.4; p1 ≤ min(14·8.5, 200) = 119; e ≥ 26.4 (plate 40, web 40);
    # SCI: e ≥ 2d = 40; e ≤ 4 t + 40; h_p ≥ 0.6·453.4 = 272.0; min(t_p, t_w) = 8.5 ≤ 0.5·20 = 10; gap 50 − 40 = 10 ≥ 10
    checks = RS.check_fin_plate(joint(), Demand(200e3), single_line_plate(), ub(), column())
    assert by_name(checks, "bolt pitch minimum").demand == pytest.approx(48.4)
    assert by_name(checks, "bolt pitch maximum").capacity == pytest.approx(119.0)
    assert by_name(checks, "edge distance minimum (plate)").demand == pytest.approx(26.4)
    assert by_name(checks, "edge distance minimum (beam web)").capacity == pytest.approx(40.0)
    assert by_name(checks, "edge distance for ductility (plate)").demand == pytest.approx(40.0)
    assert by_name(checks, "plate depth to beam depth").demand == pytest.approx(0.6 * 453.4)
    assert by_name(checks, "plate thickness for rotation").demand == pytest.approx(8.5)
    assert by_name(checks, "clearance to support").capacity == pytest.approx(10.0)
    # 4t + 40: plate 40/80 = 0.50, web 40/(4·8.5 + 40 = 74) = 0.54 governs
    assert by_name(checks, "edge distance maximum").capacity == pytest.approx(4 * 8.5 + 40)
    assert not any(c.name.startswith("bolt gauge") for c in checks)  # single line
    # 4t + 40 applies only to exposed steel
    assert not any(c.name == "edge distance maximum"
                   for c in EN1993(exposed=False).check_fin_plate(joint(), Demand(200e3), single_line_plate(), ub(), column()))


def test_clear_web_depth_by_hand():
    # web top y = −40 + 90 = 50; clear zone top = 50 − 12.7 − 10.2 = 27.1 mm above the plate top;
    # bottom y = 50 − 453.4 = −403.4, clear bottom = −403.4 + 22.9 = −380.5;
    # need = max(0 + 380.5, 27.1 + 290) = 380.5 ≤ 407.6
    c = by_name(RS.check_fin_plate(joint(), Demand(200e3), single_line_plate(), ub(), column()),
                "bolt group within clear web depth")
    assert c.demand == pytest.approx(380.5) and c.capacity == pytest.approx(407.6) and c.passed
    # plate top above the root radius (beam top edge 50 → top 10 mm, clear top −12.9) fails
    c2 = by_name(RS.check_fin_plate(joint(), Demand(200e3), single_line_plate(beam_top_edge=50.0), ub(), column()),
                 "bolt group within clear web depth")
    assert not c2.passed


def test_detailing_failures_detected():
    bad = single_line_plate(pitch=45.0, plate_end_edge=25.0, depth=25 + 135 + 25, thickness=15.0, a=45.0)
    checks = RS.check_fin_plate(joint(), Demand(50e3), bad, ub(), column())
    for name in ("bolt pitch minimum", "edge distance minimum (plate)", "plate depth to beam depth",
                 "clearance to support"):
        assert not by_name(checks, name).passed, name
    # rotation capacity needs the plate or the web thin: 15 mm plate on a 12 mm web fails (0.5·20 = 10)
    thick = by_name(RS.check_fin_plate(joint(), Demand(50e3), single_line_plate(thickness=15.0), ub(web_thickness=12.0), column()),
                    "plate thickness for rotation")
    assert thick.demand == 12.0 and not thick.passed
