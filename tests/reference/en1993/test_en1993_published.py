"""EN 1993 rule set against published values: the fin-plate worked example of "Steel Buildings in
Europe, Multi-Storey Steel Buildings, Part 5: Joint Design" (SCI/CTICM, "MSB05"; the EN 1993 form
of the SCI P358 model), other published worked checks, and standard values.

Each value names its source beside it; "found" = read via search, "# from memory" = recalled.
The published figures are given to 3 significant figures from rounded intermediate values
(e.g. k1 = 2,12, α_b = 0,61), so they are matched within 1.5 % (stated per test).

[OB] ArcelorMittal "Orange Book" design data (BS EN 1993-1-8 with the UK National Annex,
γ_M2 = 1.25; the ArcelorMittal counterpart of the SCI/BCSA "Blue Book" tables), bolt resistance
tables read via search at orangebook.arcelormittal.com: node 45 (class 4.6 hexagon head,
non-preloaded, S355), node 46 (the same, S460), node 50 (class 8.8 hexagon head, preloaded at
SLS; shear columns), node 65 (class 8.8 countersunk, non-preloaded, S355; shear columns), node 75
(shear columns of a page whose title the excerpt did not show; class 10.9 by its values,
α_v f_ub = 500 MPa). Printed to 3 significant figures: matched within
half a unit of the last digit. The bearing tables use the EN 10025-2 product f_u the UK NA calls
for (S355: 470, S460: 540 MPa), passed explicitly below.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from rules import en1993_checks as ck
from rules import en1993_data as data
from rules.base import HINGE_AT_SUPPORT
from rules.en1993 import EN1993, _Context

RS = EN1993()


def by_name(checks, name):
    hits = [c for c in checks if c.name == name]
    assert len(hits) == 1, f"{name!r}: {[c.name for c in checks]}"
    return hits[0]


# ------------------------------------------------------------------ single-bolt and weld values

def test_m20_88_single_shear_threads_94_1_kn():
    # 0.6 · 800 · 245 / 1.25 = 94 080 N; MSB05 p. 5-41 bolt group 584 kN = 10 · 94.1 / 1.6109 (found)
    assert RS.bolt_shear_capacity("M20", "8.8") == pytest.approx(94_080.0, rel=1e-9)


def test_m20_88_double_shear_188_2_kn():
    # thestructuralengineer.info "Shear bolt connection EC3" example: F_v,Rd = 2·0.6·245·800/1.25
    # = 188.2 kN (found)
    assert RS.bolt_shear_capacity("M20", "8.8", True, 2) / 1e3 == pytest.approx(188.2, abs=0.05)


def test_m24_88_single_shear_136_kn():
    # 0.6 · 800 · 353 / 1.25 = 135 552 N; [OB] nodes 50 and 65, M24 class 8.8: F_v,Rd = 136 kN (found)
    assert RS.bolt_shear_capacity("M24", "8.8") / 1e3 == pytest.approx(136.0, abs=0.5)


@pytest.mark.parametrize(
    "size,grade,kn,kn_double",
    [
        # [OB] F_v,Rd and 2 × F_v,Rd, shear plane through the threads (found); by hand
        # α_v f_ub A_s / 1.25 with A_s 157 / 245 / 353 / 561 mm² (also the [OB] A_s column)
        ("M16", "8.8", 60.3, 121.0),   # nodes 50, 65: 0.6·800·157/1.25 = 60 288 N
        ("M20", "8.8", 94.1, 188.0),   # nodes 50, 65: 94 080 N
        ("M24", "8.8", 136.0, 271.0),  # nodes 50, 65: 135 552 N
        ("M30", "8.8", 215.0, 431.0),  # nodes 50, 65: 215 424 N
        ("M16", "4.6", 30.1, 60.3),    # nodes 45, 46: 0.6·400·157/1.25 = 30 144 N
        ("M20", "4.6", 47.0, 94.1),    # nodes 45, 46: 47 040 N
        ("M24", "4.6", 67.8, 136.0),   # nodes 45, 46: 67 776 N
        ("M30", "4.6", 108.0, 215.0),  # nodes 45, 46: 107 712 N
        ("M16", "10.9", 62.8, 126.0),  # node 75: 0.5·1000·157/1.25 = 62 800 N (α_v = 0.5 for 10.9)
        ("M20", "10.9", 98.0, 196.0),  # node 75: 98 000 N
        ("M24", "10.9", 141.0, 282.0), # node 75: 141 200 N
        ("M30", "10.9", 224.0, 449.0), # node 75: 224 400 N
    ],
)
def test_bolt_shear_matches_orange_book_tables(size, grade, kn, kn_double):
    half_unit = 0.05 if kn < 100 else 0.5
    assert RS.bolt_shear_capacity(size, grade, True) / 1e3 == pytest.approx(kn, abs=half_unit)
    half_unit = 0.05 if kn_double < 100 else 0.5
    assert RS.bolt_shear_capacity(size, grade, True, 2) / 1e3 == pytest.approx(kn_double, abs=half_unit)


def test_m20_88_shank_shear_is_table_3_4_by_hand():
    # EN 1993-1-8 Table 3.4 by hand, shear plane through the shank (α_v = 0.6, gross area A):
    # 0.6·800·314.2/1.25 = 120 653 N (no published table value found for the shank case)
    assert RS.bolt_shear_capacity("M20", "8.8", False) / 1e3 == pytest.approx(120.7, abs=0.05)


@pytest.mark.parametrize("size,e1,e2,p1,p2", [(16, 35, 25, 50, 50), (20, 40, 30, 60, 60), (24, 50, 35, 70, 70), (30, 60, 45, 85, 90)])
@pytest.mark.parametrize("f_u,t,table", [
    # [OB] node 45 (S355, f_u = 470) and node 46 (S460, f_u = 540), class 4.6 bolts, bearing
    # resistance (kN) for the tabulated minimum e1, e2, p1, p2; ply 10 and 20 mm (found)
    (470.0, 10.0, {16: 85.4, 20: 96.5, 24: 120.0, 30: 145.0}),
    (470.0, 20.0, {16: 171.0, 20: 193.0, 24: 239.0, 30: 290.0}),
    (540.0, 10.0, {16: 98.1, 20: 111.0, 24: 138.0, 30: 166.0}),
])
def test_bearing_matches_orange_book_table(size, e1, e2, p1, p2, f_u, t, table):
    # EN 1993-1-8 Table 3.4: k1 = min(2.8 e2/d0 − 1.7, 1.4 p2/d0 − 1.7, 2.5),
    # α_b = min(e1/3d0, p1/3d0 − 1/4, f_ub/f_u, 1); e.g. M20, S355, t = 10: k1 = 2.118,
    # α_b = 40/66 = 0.606, F_b,Rd = 2.118·0.606·470·20·10/1.25 = 96.5 kN
    d0 = data.bolt_data(f"M{size}", "4.6").d0
    Fb, _, _ = ck.bearing_component_resistance(size, d0, t, f_u, 400.0, e1, p1, e2, p2, 1.25)
    kn = table[size]
    assert Fb / 1e3 == pytest.approx(kn, abs=0.05 if kn < 100 else 0.5)


def test_tensile_stress_areas_match_orange_book():
    # [OB] A_s column (found): M12 84.3, M16 157, M20 245, M24 353, M30 561 mm²
    got = [data.bolt_data(s, "8.8").As for s in ("M12", "M16", "M20", "M24", "M30")]
    assert got == [84.3, 157.0, 245.0, 353.0, 561.0]


def test_bearing_example_309_6_kn():
    # thestructuralengineer.info EC3 shear-bolt example (found): M20 8.8, t = 20 mm, f_u = 430,
    # e1 = 60, e2 = 50, p1 = 100, p2 = 100 (assumed, k1 capped), d0 = 22:
    # α_b = min(60/66, 100/66 − 0.25, 800/430, 1) = 0.909 (published rounded to 0.9),
    # k1 = min(2.8·50/22 − 1.7, 2.5) = 2.5, F_b,Rd = 2.5·0.9·20·20·430/1.25 = 309.6 kN published;
    # unrounded 2.5·0.9091·20·20·430/1.25 = 312.7 kN (1.0 % above the rounded figure).
    Fb, k1, ab = ck.bearing_component_resistance(20, 22, 20, 430, 800, 60, 100, 50, 100, 1.25)
    assert k1 == pytest.approx(2.5)
    assert ab == pytest.approx(60 / 66)
    assert Fb / 1e3 == pytest.approx(309.6, rel=0.011)


def test_table_3_3_minimums_m20():
    # EN 1993-1-8 Table 3.3: 1.2 d0 = 26.4, 2.2 d0 = 48.4, 2.4 d0 = 52.8 mm for d0 = 22;
    # the same three figures in the thestructuralengineer.info EC3 example (found)
    sp = data.spacing()["minimum"]
    assert sp["e1_over_d0"] * 22 == pytest.approx(26.4)
    assert sp["p1_over_d0"] * 22 == pytest.approx(48.4)
    assert sp["p2_over_d0"] * 22 == pytest.approx(52.8)


def test_weld_per_mm_6mm_leg():
    # EN 1993-1-8 4.5.3.3: a = 6/√2 = 4.243 mm; S275 (f_u = 430, β_w = 0.85):
    # 430/√3/(0.85·1.25) · 4.243 = 233.6 · 4.243 = 991 N/mm
    assert RS.fillet_weld_capacity(6.0, "S275") == pytest.approx(430 / math.sqrt(3) / (0.85 * 1.25) * 6 / math.sqrt(2))
    # With the UK NA f_u = 410 and a = 4.2: 410/√3/(0.85·1.25)·4.2 = 936 N/mm; SCI P363 lists
    # 0.94 kN/mm for a 6 mm S275 fillet, longitudinal  # from memory
    assert ck.F_w_Rd(410, 0.85, 4.2, 1.25) / 1e3 == pytest.approx(0.94, abs=0.005)


def test_beta_w_table_4_1():
    # EN 1993-1-8 Table 4.1, also MSB05 6.4 p. 5-104 (found): 0.8, 0.85, 0.9, 1.0
    assert [data.beta_w(g) for g in ("S235", "S275", "S355", "S460")] == [0.8, 0.85, 0.9, 1.0]


@pytest.mark.parametrize("grade,fy,fu,published", [
    ("S235", 235, 360, 0.46), ("S275", 275, 430, 0.48), ("S355", 355, 510, 0.55), ("S460", 460, 550, 0.74),
])
def test_full_strength_weld_ratio_reproduces_msb05(grade, fy, fu, published):
    # MSB05 2.2.6 p. 5-11 (found): a ≥ 0.46 / 0.48 / 0.55 / 0.74 t. The expression
    # f_y β_w γ_M2/(√2 f_u γ_M0) with the f_u the guide used (S355 510, S460 550, pre-corrigendum)
    # gives e.g. S275: 275·0.85·1.25/(1.4142·430) = 0.4805.
    assert data.full_strength_ratio(fy, fu, data.beta_w(grade), 1.0, 1.25) == pytest.approx(published, abs=0.006)


# ------------------------------------------------------------------ MSB05 fin-plate worked example

def _ctx(plate, beam, col, joint, demand):
    ctx = _Context.build(RS, joint, demand, plate, beam, col)
    assert not isinstance(ctx, list)
    return ctx


def test_example_bolt_group_584_kn(example_plate, example_beam, example_column, example_joint, example_demand):
    # MSB05 p. 5-41 (sheet 4 of 13, found): V_Rd = n F_v,Rd/√((1+αn)² + (βn)²) = 584 kN,
    # V_Ed = 350 kN ≤ 584 kN. By hand: α = 80·60/214000 = 0.02243, β = 80·70·4/214000 = 0.10467,
    # 940.8/√(1.2243² + 1.0467²) = 940.8/1.6108 = 584.1 kN. Elastic bolt forces give the same.
    checks = RS.check_fin_plate(example_joint, example_demand, example_plate, example_beam, example_column)
    c = by_name(checks, "bolt shear [hinge at support face]")
    V_Rd = 350e3 / c.utilisation
    assert V_Rd / 1e3 == pytest.approx(584.0, rel=0.002)


def test_example_bearing_on_plate_89_114_605_kn(example_plate, example_beam, example_column, example_joint, example_demand):
    # MSB05 p. 5-41 (found): F_b,ver,Rd = 2.12·0.61·430·20·10/1.25 = 89 kN, F_b,hor,Rd = 114 kN,
    # group V_Rd = 605 kN. Unrounded: k1 = 1.4·60/22 − 1.7 = 2.118, α_b = 40/66 = 0.606 -> 88.3 kN;
    # k1 = 2.5, α_b = 60/66 − 0.25 = 0.659 -> 113.4 kN; V_Rd = 10/√((1.2243/88.3)² + (1.0467/113.4)²)
    # = 600 kN, 0.8 % under the published 605 kN (rounded intermediates).
    ctx = _ctx(example_plate, example_beam, example_column, example_joint, example_demand)
    Fbv, Fbh, _, _ = ctx._bearing_resistances(10.0, 430.0, ctx.e1, ctx.e2, ctx.e2, ctx.e1, 1.25)
    assert Fbv / 1e3 == pytest.approx(89.0, rel=0.01)
    assert Fbh / 1e3 == pytest.approx(114.0, rel=0.01)
    checks = RS.check_fin_plate(example_joint, example_demand, example_plate, example_beam, example_column)
    c = by_name(checks, "bolt bearing on plate [hinge at support face]")
    assert (350e3 / c.utilisation) / 1e3 == pytest.approx(605.0, rel=0.01)


def test_example_plate_shear_450_497_483_kn(example_plate, example_beam, example_column, example_joint, example_demand):
    # MSB05 p. 5-43 (sheet 6 of 13, found): gross 360·10·275/(1.27·√3·1.0) = 450 kN;
    # net (360 − 5·22)·10 = 2500 mm², 2500·430/(√3·1.25) = 497 kN;
    # block A_nt = 10(60 + 50 − 1.5·22) = 770, A_nv = 10(360 − 40 − 4.5·22) = 2210 mm²,
    # 0.5·430·770/1.25 + 275·2210/√3 = 132.4 + 350.9 = 483 kN.
    checks = RS.check_fin_plate(example_joint, example_demand, example_plate, example_beam, example_column)
    assert by_name(checks, "plate shear yield").capacity / 1e3 == pytest.approx(450.0, abs=0.5)
    assert by_name(checks, "plate shear rupture").capacity / 1e3 == pytest.approx(497.0, abs=0.5)
    assert by_name(checks, "plate block shear").capacity / 1e3 == pytest.approx(483.0, abs=0.5)
    assert all(by_name(checks, n).passed for n in ("plate shear yield", "plate shear rupture", "plate block shear"))


def test_example_web_long_plate_resistance_66_knm(example_plate, example_beam, example_column, example_joint, example_demand):
    # MSB05 p. 5-46 (sheet 9 of 13, found): F_pl,BC,Rd = min(400; 343) = 343 kN, V_BC,Ed = 0,
    # M_c,BC,Rd = 9·275·280²/6 = 32 kNm, F_pl,AB,Rd = min(143; 120) = 120 kN,
    # resistance 32 + 120·4·70·1e-3 = 66 kNm. (The sheet's demand V(z + p2/2) = 38 kNm uses
    # z = 80 where its method text, MSB05 3.2.5.3, has z_p + p2/2 = 50 + 30 = 80 mm, i.e.
    # 350·0.08 = 28 kNm, which the rule set uses.)
    checks = RS.check_fin_plate(example_joint, example_demand, example_plate, example_beam, example_column)
    c = by_name(checks, "beam web shear and bending (long fin plate) [hinge at support face]")
    assert c.capacity / 1e6 == pytest.approx(66.0, rel=0.01)
    assert c.demand / 1e6 == pytest.approx(28.0, rel=1e-6)
    assert "343 kN" in c.note and "120 kN" in c.note


def test_example_tying_129_1290_880_995_kn(example_plate, example_beam, example_column, example_joint):
    # MSB05 p. 5-48 (sheet 11 of 13, found), tying with γ_Mu = 1.1:
    # F_b,hor,u,Rd = 2.5·0.66·430·20·10/1.1 = 129 kN, F_Rd = 10·129 = 1290 kN;
    # net tension 0.9·430·2500/1.1 = 880 kN; block case 1: A_nt = 10(4·70 − 4·22) = 1920,
    # A_nv = 2·10(50 + 60 − 1.5·22) = 1540 mm², 430·1920/1.1 + 275·1540/√3 = 995 kN.
    from engine.model import Demand

    checks = RS.check_fin_plate(example_joint, Demand(350e3, 350e3), example_plate, example_beam, example_column)
    assert by_name(checks, "tie: bolt bearing on plate").capacity / 1e3 == pytest.approx(1290.0, rel=0.005)
    c = by_name(checks, "tie: plate tension")
    assert c.capacity / 1e3 == pytest.approx(880.0, abs=0.5)
    assert "block case 1 995 kN" in c.note


def test_example_web_shear_with_remembered_section(example_plate, example_beam, example_column, example_joint, example_demand):
    # MSB05 p. 5-46 quotes the beam web V_Rd,min = 953 kN (found). With IPE A 550 dimensions
    # # from memory: A_v = 11740 − 2·210·15.7 + (9 + 48)·15.7 = 6041 mm², 6041·275/√3 = 959 kN
    # (0.6 % above; the section data, not the formula, is the uncertain input).
    checks = RS.check_fin_plate(example_joint, example_demand, example_plate, example_beam, example_column)
    assert by_name(checks, "beam web shear").capacity / 1e3 == pytest.approx(953.0, rel=0.01)
