"""Web shear capacity of the supported beam, per code (used by the capacity-fraction demand).

Each value is the clause computed by hand below; section dimensions are those of the named rolled
sections (# from memory, as in rules/data/sections_*.toml).
"""

from __future__ import annotations

import math

import pytest

import rules
from engine.model import Member, Section, Steel


def _beam(section: Section, steel: Steel) -> Member:
    return Member("B", "IfcBeam", "beam", (0, 0, 0), (6000, 0, 0), section, steel)


def test_as4100_web_shear_is_phi_0_6_fy_d_tw():
    # AS 4100 cl. 5.11.4 (stocky web) with φ = 0.9 (Table 3.4): 310UB40.4 Grade 300, d = 304,
    # tw = 6.1 mm; fy = 320 MPa for t < 11 mm (AS 4100 Table 2.1, AS/NZS 3679.1 Grade 300: found by
    # search as transcribed from AS 4100:2020 Table 2.1 and ASI DCT Vol. 1 (1999) Table T2.1, stored
    # file id 71441545365). φVvo = 0.54 fy Aw, Aw = d tw for a rolled section: ASI Handbook 1
    # (Hogan & Munter 2007) Ch 6.2, as quoted in stored file id 70998954710 (found).
    # φVv = 0.9 × 0.6 × 320 × 304 × 6.1 = 320 440 N
    b = _beam(Section("310UB40.4", "I", 304, 165, 6.1, 10.2, 11.4, 5210), Steel("300", 320, 440))
    assert rules.load("as4100").web_shear_capacity(b) == pytest.approx(0.9 * 0.6 * 320 * 304 * 6.1, rel=1e-9)
    assert rules.load("as4100").web_shear_capacity(b) == pytest.approx(320_440, rel=1e-4)


def test_en1993_web_shear_is_av_fy_over_root3():
    # EN 1993-1-1 6.2.6(2)-(3)(a): IPE 300 S355, A = 5381 mm², b = 150, tf = 10.7, tw = 7.1, r = 15
    # A_v = 5381 − 2·150·10.7 + (7.1 + 2·15)·10.7 = 2567.97 mm² (≥ h_w t_w = 278.6·7.1 = 1978)
    # V_pl,Rd = 2567.97 · 355 / (√3 · 1.0) = 526.3 kN
    b = _beam(Section("IPE300", "I", 300, 150, 7.1, 10.7, 15, 5381), Steel("S355", 355, 490))
    Av = 5381 - 2 * 150 * 10.7 + (7.1 + 2 * 15) * 10.7
    assert rules.load("en1993").web_shear_capacity(b) == pytest.approx(Av * 355 / math.sqrt(3), rel=1e-9)


def test_aisc360_web_shear_is_phi_0_6_fy_aw_cv1():
    # AISC 360-16 G2.1(a): W16x50 A992, d = 16.3 in., tw = 0.380 in.; h/tw ≤ 2.24 √(E/Fy) so
    # φv = 1.00 and Cv1 = 1.0: φVn = 0.6 · 50 ksi · 16.3 · 0.380 = 185.8 kips
    # (AISC Manual Table 3-2 lists φvVnx = 185 kips for W16x50  # from memory)
    IN, KSI = 25.4, 6.894757
    b = _beam(Section("W16X50", "I", 16.3 * IN, 7.07 * IN, 0.380 * IN, 0.630 * IN, None, 14.7 * IN**2),
              Steel("A992", 50 * KSI, 65 * KSI))
    kips = rules.load("aisc360").web_shear_capacity(b) / 4448.222
    assert kips == pytest.approx(0.6 * 50 * 16.3 * 0.380, rel=1e-6)
    assert kips == pytest.approx(185, abs=1.0)


@pytest.mark.parametrize("code", ["as4100", "en1993", "aisc360"])
def test_unknown_section_or_steel_gives_none(code):
    rs = rules.load(code)
    assert rs.web_shear_capacity(_beam(Section("mystery"), Steel("300", 320, 440))) is None
    assert rs.web_shear_capacity(Member("B", "IfcBeam", "beam", (0, 0, 0), (1, 0, 0),
                                        Section("310UB40.4", "I", 304, 165, 6.1, 10.2, 11.4, 5210), None)) is None
