"""The ``as4100`` rule set against the published AS 4100 worked checks of ASI Handbook 1.

Source: ASI "Handbook 1: Design of structural steel connections", T.J. Hogan and S.A. Munter, 1st ed.
2007 (Australian Steel Institute), as quoted in a public engineering-notes repository read with the
search tool's read_file (stored file ids 71369308863 = Ch 5.4 rectangular components; 70998954710 =
Ch 6.2 uncoped sections, Ch 6.5 worked example 7, Ch 6.7 worked example 8). The printed pages of the
handbook itself could not be read, and no complete published AS 4100 web side plate example was found
(see tests/reference/as4100/test_as4100_worked_example.py); these are the published checks that cover
parts of a web side plate connection (the plate as a rectangular component, the coped beam end).

Published precision: 3 significant figures; a match is within half a unit of the last printed digit.
The 410UB53.7 dimensions (d 403, bf 178, tf 10.9, tw 7.6, r1 11.4 mm) are # from memory (as in
rules/data/sections_asnzs.toml); worked example 8 prints dw = 285 mm and tw = 7.6 mm itself.

Shear follows the handbook (AS 4100 cl. 5.11.3 for rectangles and coped ends). For the bending of a
coped end the rule set is deliberately more conservative than the handbook (elastic modulus and a
local-buckling reduction of the stem); those tests check that it never exceeds the published value.
"""

from __future__ import annotations

import pytest

from engine.model import Cope, Demand, Member, Section, Steel

S = " [hinge at support face]"


@pytest.fixture()
def ub410() -> Member:
    # 410UB53.7 Grade 300, fy = 320 MPa for t < 11 mm (AS 4100 Table 2.1, see test_asi_tables.py)
    return Member("BEAM-410UB54", "IfcBeam", "beam", (0.0, 0.0, 0.0), (6000.0, 0.0, 0.0),
                  Section("410UB53.7", "I", 403.0, 178.0, 7.6, 10.9, 11.4, 6890.0), Steel("300", 320.0, 440.0))


def _coped_checks(rs, make_plate, make_joint, beam, column, by_name, copes):
    j = make_joint("flexible", copes=copes)
    plate = make_plate(beam_top_edge=50.0)   # top bolt 50 mm below the (top) cope
    return by_name(rs.check_fin_plate(j, Demand(100e3), plate, beam, column, "envelope"))


# ----------------------------------------------------------------------------- agreement
def test_uncoped_web_shear_is_0_54_fy_aw_as_in_the_handbook(rs, ub410):
    # ASI Handbook 1 Ch 6.2: φVvo = 0.54 fy Aw, Aw = d tw for a rolled section whose web is stocky
    # (dp/tw ≤ 82/√(fy/250)): 0.54 × 320 × 403 × 7.6 = 529 267 N
    assert rs.web_shear_capacity(ub410) == pytest.approx(0.54 * 320 * 403 * 7.6, rel=1e-9)


# ----------------------------------------------------------------------------- shear, cl. 5.11.3 (non-uniform)
def test_double_web_coped_shear_matches_handbook_example_8(rs, make_plate, make_joint, ub410, column, by_name):
    # ASI Handbook 1 worked example 8 (Ch 6.7), 410UB53.7 double web coped, dw = 285, tw = 7.6 mm:
    # φVwd = 0.45 fy tw dw = 312 kN (AS 4100 cl. 5.11.3, non-uniform shear in a rectangle,
    # f*vm/f*va = 1.5). By hand: 0.9 × 2 × 0.6 × 320 × 285 × 7.6 / (0.9 + 1.5) = 311 904 N
    chk = _coped_checks(rs, make_plate, make_joint, ub410, column, by_name,
                        (Cope("top", 65.0, 120.0), Cope("bottom", 53.0, 120.0)))   # dw = 403 − 118 = 285
    assert chk["beam web shear"].capacity / 1e3 == pytest.approx(312.0, abs=0.5)
    assert chk["beam web shear"].capacity == pytest.approx(0.9 * 2 * 0.6 * 320 * 285 * 7.6 / 2.4, rel=1e-9)


def test_single_web_coped_shear_matches_handbook_example_7(rs, make_plate, make_joint, ub410, column, by_name):
    # ASI Handbook 1 worked example 7 (Ch 6.5): φVws = 0.9 × 2Vu/(0.9 + Qc dw/Ix) = 387 kN
    # (< 0.54 fy dw tw = 429 kN, dw = 403 − 65 − 10.9 = 327.1 mm below the flange)
    # By hand with the plain tee (flange 178 × 10.9, stem 7.6 × 327.1, root fillets left out):
    # Vu = 0.6 × 320 × 327.1 × 7.6 = 477 308 N, f*vm/f*va = 1.3167 (test below),
    # 0.9 × 2 × 477 308 / (0.9 + 1.3167) = 387 584 N: 0.15 % over the printed 387 kN, more than half a
    # unit of its last digit; the handbook's rounding of Ix and Qc in its working is the likely
    # cause (not verified), so the tolerance here is 0.2 %.
    chk = _coped_checks(rs, make_plate, make_joint, ub410, column, by_name, (Cope("top", 65.0, 120.0),))
    assert chk["beam web shear"].capacity / 1e3 == pytest.approx(387.0, rel=0.002)
    assert chk["beam web shear"].capacity == pytest.approx(387_584, rel=1e-5)


def test_tee_shear_stress_ratio_by_hand():
    # the tee of worked example 7: flange 178 × 10.9, stem 7.6 × 327.1 (mm). By hand:
    # A1 = 1940.2, A2 = 2485.96, yc = (1940.2 × 5.45 + 2485.96 × 174.45) / 4426.16 = 100.369 mm
    # I = 178 × 10.9³/12 + 1940.2 × 94.919² + 7.6 × 327.1³/12 + 2485.96 × 74.081²
    #   = 19 210 + 17 480 610 + 22 165 540 + 13 642 560 = 5.3308e7 mm⁴
    # Q = 7.6 × (338.0 − 100.369)² / 2 = 214 580 mm³; ratio = Q × 327.1 / I = 1.3167
    from rules import as4100_checks as C

    assert C.tee_shear_stress_ratio(178.0, 10.9, 7.6, 327.1) == pytest.approx(1.3167, abs=0.0005)
    # a rectangle (no flange) gives the textbook 1.5 (τmax = 1.5 V / A)
    assert C.tee_shear_stress_ratio(1e-9, 1e-9, 10.0, 300.0) == pytest.approx(1.5, rel=1e-6)


def test_plate_shear_yield_follows_the_handbook_rectangular_component_rule(rs, make_plate, make_joint, beam, column, by_name):
    # ASI Handbook 1 Ch 5.4 designs a rectangular connection component (web side plate, cleat) in
    # shear with AS 4100 cl. 5.11.3: φVv = 0.9 × 2Vu/(0.9 + 1.5) = 0.45 fy d t. (Published formula, no
    # printed value: the expected figure is the formula evaluated for this 230 × 10 Grade 250 plate,
    # fy = 260 MPa: 269 100 N.)
    chk = by_name(rs.check_fin_plate(make_joint("flexible"), Demand(150e3), make_plate(), beam, column, "envelope"))
    assert chk["plate shear yield"].capacity == pytest.approx(0.45 * 260 * 230 * 10, rel=1e-4)


# ----------------------------------------------------------------------------- bending: ours is more conservative
def test_double_web_coped_bending_is_no_more_than_handbook_example_8(rs, make_plate, make_joint, ub410, column, by_name):
    # ASI Handbook 1 worked example 8 (Ch 6.7): φMsd = 0.225 fy tw dw² = 44.4 kN·m (plastic
    # Ze = tw dw²/4, the web treated as compact). The rule set deliberately takes the elastic
    # Z = tw dw²/6 with the flat-outstand slenderness limit λey = 25 (AS 4100 Table 5.2):
    # 0.9 × 320 × 7.6 × 285²/6 × min(1, 25 / ((142.5 / 7.6) √(320/250))) = 29.6 kN·m, about 33 %
    # under the published value: conservative, never above it.
    chk = _coped_checks(rs, make_plate, make_joint, ub410, column, by_name,
                        (Cope("top", 65.0, 120.0), Cope("bottom", 53.0, 120.0)))
    cap = chk["coped section bending" + S].capacity / 1e6
    assert cap <= 44.4
    lam = (285 / 2 / 7.6) * (320 / 250) ** 0.5
    assert cap == pytest.approx(0.9 * 320 * 7.6 * 285**2 / 6 * min(1.0, 25 / lam) / 1e6, rel=1e-6)


def test_single_web_coped_bending_is_no_more_than_handbook_example_7(rs, make_plate, make_joint, ub410, column, by_name):
    # ASI Handbook 1 worked example 7 (Ch 6.5): φMss = 97.2 kN·m with Ze = min(S, 1.5 Z) of the tee,
    # local web buckling taken as not governing for short copes. The rule set reduces the tee's Z by
    # λey/λe = 25/48.7 (the stem as a flat outstand): 33.2 kN·m, conservative, never above it.
    chk = _coped_checks(rs, make_plate, make_joint, ub410, column, by_name, (Cope("top", 65.0, 120.0),))
    cap = chk["coped section bending" + S].capacity / 1e6
    assert cap <= 97.2
    assert cap == pytest.approx(33.2, abs=0.05)
