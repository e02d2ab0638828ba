"""Each aisc360 check function against its clause of ANSI/AISC 360-16 or the AISC Manual 15th ed.,
computed by hand in the comments (US units converted: 1 in. = 25.4 mm, 1 ksi = 6.894757 MPa,
1 kip = 4448.222 N)."""

from __future__ import annotations

import math

import numpy as np
import pytest

from aisc360_example import IN, KIP, KSI
from rules import aisc360_checks as ck
from rules import aisc360_data as data

E = 29000 * KSI
KIPIN = KIP * IN   # N·mm per kip-in.


def test_make_check_utilisation_and_pass():
    c = ck.make_check("x", "J0", 50.0, 100.0, "N")
    assert (c.utilisation, c.passed, c.incomplete) == (0.5, True, False)
    c = ck.make_check("x", "J0", 101.0, 100.0, "N")
    assert c.utilisation == pytest.approx(1.01) and not c.passed


def test_phi_rn_shear_eq_J3_1_with_long_joint_reduction():
    # J3.6: 0.75 × 54 ksi × 0.4418 in² = 17.89 kips; long joint (Table J3.2 [b]) × 0.833 = 14.90 kips
    Ab = 0.4418 * IN**2
    assert ck.phi_rn_shear(54 * KSI, Ab) / KIP == pytest.approx(17.893, abs=1e-3)
    assert ck.phi_rn_shear(54 * KSI, Ab, 1, 0.75, 0.833) / KIP == pytest.approx(14.905, abs=1e-3)


def test_long_joint_reduction_applied_beyond_38_inches():
    from aisc360_example import beam, by_name, column, demand, joint, plate
    from rules.aisc360 import AISC360

    # 12 bolts at 3.5 in.: pattern length 11 × 3.5 = 38.5 in. > 38 in. -> Fnv × 0.833
    p = plate(rows=12, pitch=3.5 * IN, depth=41.0 * IN)
    c = by_name(AISC360().check_fin_plate(joint(), demand(), p, beam(), column()), "bolt shear [hinge at bolt line]")
    assert "long joint" in c.note
    assert "φrn = 66.3 kN" in c.note   # 17.89 × 0.833 = 14.90 kips = 66.3 kN


def test_bearing_and_tearout_eq_J3_6a_J3_6c():
    # 7/8 in. bolt, 1/2 in. plate, Fu = 65 ksi: bearing 0.75 × 2.4 × 0.875 × 0.5 × 65 = 51.19 kips
    assert ck.phi_rn_bearing(0.875 * IN, 0.5 * IN, 65 * KSI) / KIP == pytest.approx(51.19, abs=0.01)
    # tear-out lc = 2.03 in.: 0.75 × 1.2 × 2.03 × 0.5 × 65 = 59.38 kips; negative lc -> 0
    assert float(ck.phi_rn_tearout(2.03 * IN, 0.5 * IN, 65 * KSI)) / KIP == pytest.approx(59.38, abs=0.01)
    assert float(ck.phi_rn_tearout(-3.0, 10.0, 400.0)) == 0.0


def test_clear_distance_to_edge_and_to_next_hole():
    # two bolts on a vertical line 75 mm apart, 40 mm above the bottom edge, holes 22 mm, force down:
    # lower bolt: edge 40 − 11 = 29 mm; upper bolt: next hole 75 − 22 = 53 mm
    xy = np.array([[50.0, -100.0], [50.0, -175.0]])
    rect = (0.0, 100.0, -215.0, 0.0)
    lc = ck.clear_distance_along(xy, np.array([[0.0, -1.0], [0.0, -1.0]]), rect, 22.0, 22.0)
    assert lc == pytest.approx([53.0, 29.0])
    # horizontal force on a horizontally slotted hole (length 30): edge 50 − 15 = 35 mm
    lc = ck.clear_distance_along(xy[:1], np.array([[1.0, 0.0]]), rect, 22.0, 30.0)
    assert lc == pytest.approx([35.0])


def test_group_efficiency_C_over_n():
    # Manual Part 7 ICR: (C/n) Σ φrn,i. 4 bolts 11.0, 17.9, 17.9, 17.9 kips at C = 3.6:
    # (3.6/4)(11.0 + 3 × 17.9) = 0.9 × 64.7 = 58.23 kips
    c = ck.bearing_group("b", "J3.10", 50 * KIP, 3.6, np.array([11.0, 17.9, 17.9, 17.9]) * KIP)
    assert c.capacity / KIP == pytest.approx(58.23)
    # equal bolts -> C × φrn
    assert ck.bearing_group("b", "J3.10", 1.0, 2.5, np.full(3, 10.0)).capacity == pytest.approx(25.0)


def test_bolt_shear_group_is_C_times_phi_rn_and_fails_when_short():
    c = ck.bolt_shear_group("bolt shear", 70 * KIP, 3.5, 17.9 * KIP)
    assert c.capacity / KIP == pytest.approx(62.65) and not c.passed
    assert ck.bolt_shear_group("bolt shear", 1.0, 0.0, 1.0).incomplete


def test_shear_yield_and_rupture_eq_J4_3_J4_4():
    # II.A-17B plate PL1/2 × 14-1/2, Fy = 50: 1.0 × 0.6 × 50 × 7.25 = 217.5 kips (Design Examples II.A-17B
    # prints 218 # from memory)
    assert ck.shear_yield("y", 0, 14.5 * 0.5 * IN**2, 50 * KSI).capacity / KIP == pytest.approx(217.5)
    # rupture: Anv = (14.5 − 5 × 1.0) × 0.5 = 4.75 in²; 0.75 × 0.6 × 65 × 4.75 = 138.9 kips (II.A-17B: 139 # from memory)
    assert ck.shear_rupture("r", 0, 4.75 * IN**2, 65 * KSI).capacity / KIP == pytest.approx(138.94, abs=0.01)
    assert ck.shear_rupture("r", 0, -1.0, 400.0).incomplete


def test_block_shear_eq_J4_5_both_paths():
    # Agv = 10, Anv = 7, Ant = 1 in², Fy 36, Fu 58, Ubs 1:
    # rupture 0.6·58·7 + 58·1 = 301.6; yield 0.6·36·10 + 58 = 274.0 -> φRn = 0.75 × 274.0 = 205.5 kips
    c = ck.block_shear("bs", 0, 10 * IN**2, 7 * IN**2, 1 * IN**2, 36 * KSI, 58 * KSI, 1.0)
    assert c.capacity / KIP == pytest.approx(205.5) and "yielding" in c.note
    # Anv = 4: rupture 0.6·58·4 + 29 (Ubs 0.5) = 168.2 < 0.6·36·10 + 29 = 245 -> 0.75 × 168.2 = 126.15
    c = ck.block_shear("bs", 0, 10 * IN**2, 4 * IN**2, 1 * IN**2, 36 * KSI, 58 * KSI, 0.5)
    assert c.capacity / KIP == pytest.approx(126.15) and "rupture" in c.note


def test_tension_eq_J4_1_J4_2():
    # 0.9 × 50 × 7.25 = 326.25 kips; 0.75 × 65 × 4.75 = 231.6 kips (II.A-17B: 326 / 232 # from memory)
    assert ck.tension_yield("t", 0, 7.25 * IN**2, 50 * KSI).capacity / KIP == pytest.approx(326.25)
    assert ck.tension_rupture("t", 0, 4.75 * IN**2, 65 * KSI).capacity / KIP == pytest.approx(231.56, abs=0.01)


def test_plate_plastic_modulus_and_net_modulus():
    # PL 1/2 × 14-1/2: Z = 0.5 × 14.5² / 4 = 26.28 in³ -> 0.9 × 50 × 26.28 = 1183 kip-in.
    Z = ck.Z_rect(0.5 * IN, 14.5 * IN)
    assert Z / IN**3 == pytest.approx(26.28, abs=0.01)
    assert ck.plate_bending("b", 0, Z, 50 * KSI).capacity / KIPIN == pytest.approx(1182.7, abs=0.1)
    # net: 5 holes 1.0 in. at 0, ±3, ±6 in.: Znet = 26.28 − 0.5 × 1.0 × (3 + 3 + 6 + 6) = 17.28 in³
    y = np.array([-6.0, -3.0, 0.0, 3.0, 6.0]) * IN
    Zn = ck.Z_net_rect(0.5 * IN, 14.5 * IN, y, 1.0 * IN)
    assert Zn / IN**3 == pytest.approx(17.28, abs=0.01)
    # rupture 0.75 × 65 × 17.28 = 842.5 kip-in. governs over yielding
    c = ck.plate_bending("b", 100 * KIPIN, Z, 50 * KSI, Zn, 65 * KSI)
    assert c.capacity / KIPIN == pytest.approx(842.5, abs=0.2)


def test_plate_ltb_F11_three_regimes():
    t, d, Fy = 0.5 * IN, 12.0 * IN, 50 * KSI
    # S = 0.5 × 12² / 6 = 12 in³, Z = 0.5 × 12² / 4 = 18 in³, My = 600, Mp = 900 kip-in.
    # Lb = 1 in.: Lb d/t² = 1 × 12 / 0.25 = 48 > 0.08 × 29000/50 = 46.4 -> F11-2:
    # Mn = [1.52 − 0.274 × 48 × 50/29000] × 50 × 12 = (1.52 − 0.02268) × 600 = 898.4 kip-in. ≤ Mp = 900
    c = ck.plate_ltb_F11("l", 0, 1.0 * IN, d, t, Fy, E)
    assert c.capacity / KIPIN == pytest.approx(0.9 * 898.4, abs=0.1)
    # Lb = 0.5 in.: 24 ≤ 46.4 -> Mp = 50 × 18 = 900 kip-in. (≤ 1.6 My = 960)
    c = ck.plate_ltb_F11("l", 0, 0.5 * IN, d, t, Fy, E)
    assert c.capacity / KIPIN == pytest.approx(0.9 * 900, abs=0.05)
    # Lb = 30 in.: 1440 > 1.9 × 580 = 1102 -> Fcr = 1.9 × 29000 / 1440 = 38.26 ksi, Mn = 38.26 × 12 = 459.2
    c = ck.plate_ltb_F11("l", 0, 30.0 * IN, d, t, Fy, E)
    assert c.capacity / KIPIN == pytest.approx(0.9 * 459.17, abs=0.1)


def test_shear_flexure_interaction_eq_10_5():
    # (60/218)² + (188/1180)² = 0.0757 + 0.0254 = 0.1011
    c = ck.shear_flexure_interaction("i", 60.0, 188.0, 218.0, 1180.0)
    assert c.demand == pytest.approx(0.10113, abs=1e-4) and c.passed


def test_web_shear_G2_1_rolled_and_slender():
    # W16×50: h/tw = 37.4 ≤ 2.24 √(29000/50) = 53.9 -> φVn = 1.0 × 0.6 × 50 × 16.3 × 0.38 = 185.8 kips
    c = ck.web_shear_G2("w", 0, 16.3 * IN, 0.38 * IN, 14.2 * IN, 50 * KSI, E)
    assert c.capacity / KIP == pytest.approx(185.82, abs=0.01)
    # slender: h/tw = 100 > 53.9, kv = 5.34: 1.10 √(5.34 × 580) = 61.2 < 100 -> Cv1 = 0.612, φ = 0.9
    c = ck.web_shear_G2("w", 0, 20.0 * IN, 0.19 * IN, 19.0 * IN, 50 * KSI, E)
    Cv1 = 1.10 * math.sqrt(5.34 * 29000 / 50) / 100.0
    assert c.capacity / KIP == pytest.approx(0.9 * 0.6 * 50 * 20.0 * 0.19 * Cv1, rel=1e-6)


def test_coped_section_modulus_tee_and_rectangle():
    # rectangle (double cope): tw ho²/6 = 0.38 × 12² / 6 = 9.12 in³
    assert ck.coped_Snet(12 * IN, 0.38 * IN, None, None, True) / IN**3 == pytest.approx(9.12)
    # tee ho = 14, tw = 0.38, bf = 7.07, tf = 0.63: web 0.38 × 13.37 = 5.081 in² at 6.685 from the top;
    # flange 4.454 in² at 13.685 -> ybar = (33.97 + 60.95)/9.535 = 9.955 in.
    # I = 0.38·13.37³/12 + 5.081(9.955 − 6.685)² + 7.07·0.63³/12 + 4.454(13.685 − 9.955)²
    #   = 75.69 + 54.33 + 0.147 + 61.97 = 192.1 in⁴ -> S(top) = 192.1 / 9.955 = 19.30 in³
    S = ck.coped_Snet(14 * IN, 0.38 * IN, 7.07 * IN, 0.63 * IN, False)
    assert S / IN**3 == pytest.approx(19.30, abs=0.02)
    assert ck.coped_Snet(14 * IN, 0.38 * IN, None, 0.63 * IN, False) is None


def test_coped_Fcr_lambda_Q():
    f = data.factors()["coped"]
    # ho = 14, c = 6, tw = 0.38, Fy = 50: λ = 14 √50 / (10 × 0.38 √(475 + 280 (14/6)²))
    #   = 98.99 / (3.8 × √(475 + 1524.4)) = 98.99 / (3.8 × 44.72) = 0.5826 ≤ 0.7 -> Q = 1
    Fcr, lam = ck.coped_Fcr(14 * IN, 6 * IN, 0.38 * IN, 50 * KSI, f)
    assert lam == pytest.approx(0.5826, abs=1e-3) and Fcr == pytest.approx(50 * KSI)
    # tw = 0.25: λ = 98.99 / (2.5 × 44.72) = 0.8854 -> Q = 1.34 − 0.486 × 0.8854 = 0.9097
    Fcr, lam = ck.coped_Fcr(14 * IN, 6 * IN, 0.25 * IN, 50 * KSI, f)
    assert Fcr / KSI == pytest.approx(50 * (1.34 - 0.486 * lam)) and lam == pytest.approx(0.8854, abs=1e-3)
    # tw = 0.15: λ = 1.4757 > 1.41 -> Q = 1.30 / λ² = 0.597
    Fcr, lam = ck.coped_Fcr(14 * IN, 6 * IN, 0.15 * IN, 50 * KSI, f)
    assert Fcr / KSI == pytest.approx(50 * 1.30 / lam**2) and lam == pytest.approx(1.4757, abs=1e-3)


def test_coped_section_bending_and_missing_flange():
    # φMn = 0.9 × 50 × 19.30 = 868.5 kip-in.
    c = ck.coped_section_bending("c", 100 * KIPIN, 19.30 * IN**3, 50 * KSI)
    assert c.capacity / KIPIN == pytest.approx(868.5, abs=0.1)
    assert ck.coped_section_bending("c", 1.0, None, 345.0).incomplete


def test_line_weld_elastic_vector_method():
    # two lines L = 300 mm, V = 120 kN, M = 9 kN·m: fv = 120000/600 = 200 N/mm;
    # fm = 6 × 9e6 / (2 × 300²) = 300 N/mm -> f = √(200² + 300²) = 360.6 N/mm
    assert ck.line_weld_peak(120e3, 0.0, 9e6, 300.0, 2) == pytest.approx(360.555, abs=1e-3)


def test_weld_strength_eq_J2_3():
    # 3/16 in. E70 both sides, L = 11.5 in., V only: 2 × 11.5 × 3 × 1.392 = 96.05 kips
    # (II.A-17A: 2(1.392)(3)(11.5) = 96.0 kips # from memory)
    c = ck.weld_strength("w", 49.6 * KIP, 0.0, 0.0, 11.5 * IN, 3 / 16 * IN, 70 * KSI, 2)
    assert c.capacity / KIP == pytest.approx(96.05, abs=0.03)
    # with moment the capacity drops: M = V × 3 in.: f/V per in. = √((1/23)² + (6·3/(2·11.5²))²)
    f_per_kip = math.hypot(1 / 23, 18 / (2 * 11.5**2))
    c = ck.weld_strength("w", 49.6 * KIP, 0.0, 49.6 * 3 * KIPIN, 11.5 * IN, 3 / 16 * IN, 70 * KSI, 2)
    assert c.capacity / KIP == pytest.approx(3 * 1.392 / f_per_kip, rel=1e-3)


def test_weld_stronger_than_plate_five_eighths_rule():
    # 1/2 in. plate -> 5/16 in. required (II.A-17B: 5/16-in. fillets both sides, ≥ 5/8 tp # from memory)
    c = ck.weld_stronger_than_plate("w", 5 / 16 * IN, 0.5 * IN, 0.625, True)
    assert c.demand / IN == pytest.approx(0.3125) and c.passed
    assert not ck.weld_stronger_than_plate("w", 1 / 4 * IN, 0.5 * IN, 0.625, True).passed
    assert not ck.weld_stronger_than_plate("w", 1.0 * IN, 0.5 * IN, 0.625, False).passed


def test_minimum_fillet_table_J2_4():
    # Table J2.4: t ≤ 1/4 -> 1/8; ≤ 1/2 -> 3/16; ≤ 3/4 -> 1/4; > 3/4 -> 5/16 in. # from memory
    # (the first row found by search: AISC Design Examples V14.0, Example J.1, scribd 361764042)
    assert data.min_fillet_leg(0.25 * IN) == pytest.approx(0.125 * IN)
    assert data.min_fillet_leg(0.5 * IN) == pytest.approx(0.1875 * IN)
    assert data.min_fillet_leg(0.6 * IN) == pytest.approx(0.25 * IN)
    assert data.min_fillet_leg(1.0 * IN) == pytest.approx(0.3125 * IN)


def test_support_local_shear_matches_manual_tmin_3_09_D_over_Fu():
    # Manual Part 9: tmin = 3.09 D / Fu for D sixteenths E70 both sides of the plate. With D = 4,
    # Fu = 65: tmin = 0.190 in. A support of exactly tmin ruptures together with the weld:
    # weld 2 × 1.392 × 4 = 11.14 kips/in. vs support 2 lines × 0.75 × 0.6 × 65 × 0.190 = 11.14 kips/in.
    t = 3.09 * 4 / 65 * IN
    f_peak = 1.392 * 4 * KIP / IN          # per weld line at its capacity
    c = ck.support_local_shear("s", 100.0, f_peak, t, 65 * KSI, False, 300.0, 2)
    assert c.utilisation == pytest.approx(1.0, abs=2e-3)
    both = ck.support_local_shear("s", 100.0, f_peak, t, 65 * KSI, True, 300.0, 2)
    assert both.utilisation == pytest.approx(2.0, abs=4e-3)   # 6.19 D / Fu when both sides
    assert ck.support_local_shear("s", 1.0, 1.0, 0.0, 400.0, False, 1.0, 2).incomplete


def test_moment_only_coefficient_crawford_kulak():
    # 3 bolts at 0, ±3 in.: C' = 2 × 3 × (1 − e^(−3.4))^0.55 = 6 × 0.98151 = 5.889 in.
    xy = np.array([[0.0, 0.0], [0.0, 3.0], [0.0, -3.0]]) * IN
    expect = 2 * 3 * (1 - math.exp(-3.4)) ** 0.55
    assert ck.moment_only_coefficient(xy) / IN == pytest.approx(expect, rel=1e-9)
    assert expect == pytest.approx(5.889, abs=1e-3)
    # cross-check with the engine's ICR solver at a very large eccentricity: C·e -> C'
    from engine.boltgroup import icr_coefficient

    e = 2000.0 * IN
    assert icr_coefficient(xy, e) * e / IN == pytest.approx(expect, rel=2e-2)


def test_tmax_extended_manual_part_10():
    # 3/4 Group A-N, n = 3 at 3 in., plate d = 9 in., Fy = 36:
    # Mmax = (54 / 0.9)(0.4418)(5.889) = 156.1 kip-in.; tmax = 6 × 156.1 / (36 × 81) = 0.3212 in.
    tmax = ck.tmax_extended(54 * KSI, 0.4418 * IN**2, 5.889 * IN, 36 * KSI, 9 * IN)
    assert tmax / IN == pytest.approx(6 * (60 * 0.4418 * 5.889) / (36 * 81), rel=1e-6)
    assert tmax / IN == pytest.approx(0.3212, abs=1e-4)


def test_unit_conversion_is_exact():
    assert data.inch(1.0) == 25.4 and data.ksi(1.0) == 6.894757
