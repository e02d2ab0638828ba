"""aisc360 rule set behaviour: hinge positions and the Manual's eccentricities, configurations,
incomplete data, contract methods and the registry."""

from __future__ import annotations

import math

import pytest

import rules
from aisc360_example import IN, KIP, beam, by_name, column, demand, joint, plate
from engine.errors import RuleSetError
from engine.model import Cope, Section
from rules.aisc360 import AISC360, configuration
from rules.geometry import bolt_xy

RS = AISC360()
STANDARD_NAMES = [
    "bolt shear", "bolt bearing on plate", "bolt tear-out in plate", "bolt bearing on beam web",
    "bolt tear-out in beam web", "plate shear yield", "plate shear rupture", "plate block shear", "plate bending",
    "plate lateral-torsional buckling", "beam web shear", "beam web block shear", "coped section bending", "weld",
    "weld stronger than plate", "support local shear", "bolt pitch minimum", "bolt pitch maximum",
    "bolt gauge minimum", "edge distance minimum (plate)", "edge distance minimum (beam web)",
    "edge distance maximum", "plate depth to beam depth", "bolt group within clear web depth",
    "plate thickness for rotation", "clearance to support",
]
BL, SF = " [hinge at bolt line]", " [hinge at support face]"


def run(stiffness="stiff", policy="classified", p=None, b=None, s="column", d=None, **jkw):
    sup = column() if s == "column" else s
    return RS.check_fin_plate(joint(stiffness, **jkw), d or demand(), p or plate(), b or beam(), sup, policy)


# --- contract ---------------------------------------------------------------------------------

def test_registry_loads_and_validates_the_rule_set():
    rs = rules.load("aisc360")
    assert type(rs).__name__ == "AISC360" and "aisc360" in rules.available()


def test_check_list_covers_every_standard_name_with_a_clause():
    names = dict(RS.check_list())
    for n in STANDARD_NAMES:
        assert n in names and names[n], n


def test_data_sources_and_combination():
    src = " ".join(RS.data_sources())
    assert "AISC 360-16" in src and "J3.2" in src and "Tables 2-3, 2-4" in src and "ASCE/SEI 7-16" in src
    lc = RS.ultimate_combination()
    assert (lc["dead"], lc["live"], lc["dead_only"]) == (1.2, 1.6, 1.4)


@pytest.mark.parametrize("call", [
    lambda: RS.bolt_shear_capacity("M20", "A325"),
    lambda: RS.bolt_shear_capacity("3/4", "8.8"),
    lambda: RS.bolt_shear_capacity("3/4", "A325", True, 0),
    lambda: RS.fillet_weld_capacity(5.0, "E48XX"),
    lambda: RS.fillet_weld_capacity(0.0, "E70XX"),
])
def test_public_capacities_raise_rule_set_error_listing_valid_values(call):
    with pytest.raises(RuleSetError) as exc:
        call()
    assert "valid" in str(exc.value) or "must" in str(exc.value)


def test_trade_spellings_of_sizes_and_grades():
    ref = RS.bolt_shear_capacity("3/4", "A325")
    for size in ('3/4"', "3/4 in", " 3/4 "):
        assert RS.bolt_shear_capacity(size, "A325") == ref
    for grade in ("A325-N", "F3125 Grade A325", "Group A"):
        assert RS.bolt_shear_capacity("3/4", grade) == ref
    assert RS.bolt_shear_capacity("1-1/8", "A490") / KIP == pytest.approx(0.75 * 68 * 0.9940, abs=0.01)


# --- hinge positions --------------------------------------------------------------------------

def test_stiff_classified_checks_only_the_bolt_line_hinge():
    names = [c.name for c in run("stiff", "classified")]
    assert "bolt shear" + BL in names and not any(n.endswith(SF) for n in names)


def test_flexible_checks_only_the_support_face_hinge():
    names = [c.name for c in run("flexible", "conservative")]
    assert "bolt shear" + SF in names and not any(n.endswith(BL) for n in names)


def test_envelope_checks_both_and_hinge_free_checks_once():
    names = [c.name for c in run("stiff", "envelope")]
    for n in ("bolt shear", "plate bending", "weld", "support local shear", "bolt tear-out in plate"):
        assert names.count(n + BL) == 1 and names.count(n + SF) == 1
    for n in ("plate shear yield", "plate shear rupture", "plate block shear", "beam web shear",
              "bolt pitch minimum", "clearance to support", "plate thickness for rotation"):
        assert names.count(n) == 1
    assert len(names) == len(set(names))


def test_bolts_carry_table_10_9_eccentricity_at_bolt_line_and_full_a_at_support_face():
    from engine.boltgroup import icr_coefficient

    checks = run("stiff", "envelope")
    xy = bolt_xy(plate())
    phi_rn = RS.bolt_shear_capacity("3/4", "A325")
    # hinge at bolt line (rigid support): e = a/2 (Manual Table 10-9, 4 bolts, STD holes)
    assert by_name(checks, "bolt shear" + BL).capacity == pytest.approx(icr_coefficient(xy, -1.5 * IN) * phi_rn)
    # hinge at support face: e = a (contract: bolts carry V and V·a)
    assert by_name(checks, "bolt shear" + SF).capacity == pytest.approx(icr_coefficient(xy, -3.0 * IN) * phi_rn)
    assert by_name(checks, "bolt shear" + SF).utilisation > by_name(checks, "bolt shear" + BL).utilisation


def test_plate_and_weld_carry_V_a_only_with_the_hinge_at_the_bolt_line():
    checks = run("stiff", "envelope")
    V = demand().V
    assert by_name(checks, "plate bending" + BL).demand == pytest.approx(V * 3.0 * IN)
    assert "M = 0.00 kN·m" in by_name(checks, "weld" + SF).note
    assert f"M = {V * 3.0 * IN / 1e6:.2f} kN·m" in by_name(checks, "weld" + BL).note
    # weld carries V only at the support-face hinge: 2 × 11.5 in. × 3 × 1.392 kips/in. = 96.05 kips
    assert by_name(checks, "weld" + SF).capacity / KIP == pytest.approx(96.05, abs=0.05)
    assert by_name(checks, "weld" + BL).capacity < by_name(checks, "weld" + SF).capacity


def test_six_to_twelve_bolts_in_standard_holes_use_e_equal_a_at_both_hinges():
    p = plate(rows=7, depth=23.5 * IN)
    cfg = configuration(p, 0.75 * IN)
    assert (cfg.kind, cfg.e_over_a) == ("conventional", 1.0)
    assert cfg.tmax_offset == pytest.approx(-IN / 16)   # db/2 − 1/16 in.
    checks = RS.check_fin_plate(joint(), demand(), p, beam(Section("W24X55", "I", 23.6 * IN, 7.01 * IN,
                                                                    0.395 * IN, 0.505 * IN, 0.5 * IN)),
                                column(), "envelope")
    assert by_name(checks, "bolt shear" + BL).capacity == pytest.approx(by_name(checks, "bolt shear" + SF).capacity)


def test_extended_configuration_uses_e_equal_a_and_tmax():
    p = plate(a=9.0 * IN, width=10.5 * IN, beam_end_edge=8.5 * IN)
    cfg = configuration(p, 0.75 * IN)
    assert cfg.kind == "extended" and "3-1/2" in cfg.reasons[0]
    checks = run("stiff", "envelope", p=p)
    assert by_name(checks, "bolt shear" + BL).capacity == pytest.approx(by_name(checks, "bolt shear" + SF).capacity)
    rot = by_name(checks, "plate thickness for rotation")
    assert "extended" in rot.note
    # hand: C' (4 bolts at ±1.5, ±4.5 in.) = 2[1.5(1 − e^(−3.4/3))^0.55 + 4.5(1 − e^(−3.4))^0.55]
    #   = 2[1.5 × 0.8076 + 4.5 × 0.98151] = 2 × 5.628 = 11.26 in.;
    # Mmax = (54/0.90) × 0.4418 × 11.26 = 298.4 kip-in.; tmax = 6 × 298.4 / (36 × 11.5²) = 0.3760 in.
    c1 = 1.5 * (1 - math.exp(-3.4 / 3)) ** 0.55 + 4.5 * (1 - math.exp(-3.4)) ** 0.55
    tmax = 6 * 60 * 0.4418 * 2 * c1 / (36 * 11.5**2)
    assert rot.capacity / IN == pytest.approx(tmax, rel=1e-3) and tmax == pytest.approx(0.3760, abs=5e-4)
    assert by_name(checks, "plate lateral-torsional buckling" + BL).capacity > 0


def test_two_lines_of_bolts_are_extended_and_check_gauge():
    p = plate(lines=2, gauge=3.0 * IN, width=7.5 * IN)
    assert configuration(p, 0.75 * IN).kind == "extended"
    checks = run("stiff", "classified", p=p)
    g = by_name(checks, "bolt gauge minimum")
    assert g.demand == pytest.approx(2.6667 * 0.75 * IN) and g.passed
    assert "Ubs = 0.5" in by_name(checks, "plate block shear").note


# --- failing and incomplete results, never exceptions ----------------------------------------

def test_overloaded_connection_fails_bolt_shear():
    checks = run(d=demand(90.0))
    assert not by_name(checks, "bolt shear" + BL).passed
    assert not by_name(checks, "plate shear rupture").passed


def test_missing_beam_web_gives_incomplete_web_checks():
    b = beam(Section("UNKNOWN", "I", 16.3 * IN, None, None, None))
    checks = run(b=b)
    for n in ("bolt bearing on beam web" + BL, "bolt tear-out in beam web" + BL, "beam web shear"):
        c = by_name(checks, n)
        assert c.incomplete and not c.passed and "AISC 360-16" in c.clause
    assert by_name(checks, "plate depth to beam depth").incomplete


def test_missing_support_gives_incomplete_support_check():
    c = by_name(run(s=None), "support local shear" + BL)
    assert c.incomplete and not c.passed and "J4.2" in c.clause


def test_unknown_bolt_size_gives_incomplete_checks_not_an_exception():
    from engine.model import BoltSpec

    p = plate(bolts=BoltSpec("M20", 20.0, "8.8"))
    checks = run(p=p)
    assert checks and all(c.incomplete and not c.passed for c in checks)
    assert "valid sizes" in checks[0].note


def test_unknown_electrode_gives_incomplete_weld_check():
    from engine.model import Weld

    c = by_name(run(p=plate(weld=Weld(5.0, "E49XX"))), "weld" + BL)
    assert c.incomplete and "J2.4" in c.clause


def test_thin_girder_web_support_fails_local_shear_and_halves_with_back_to_back():
    web = Section("THIN", "I", 400.0, 150.0, 3.0, 10.0, 10.0)
    sup = column(web)
    one = by_name(run("flexible", "conservative", s=sup, kind="beam-web"), "support local shear" + SF)
    two = by_name(run("flexible", "conservative", s=sup, kind="beam-web", back_to_back="J-OTHER"),
                  "support local shear" + SF)
    assert two.utilisation == pytest.approx(2 * one.utilisation)
    assert "web" in one.note


def test_top_cope_adds_block_shear_and_coped_bending_per_hinge():
    cope = Cope("top", 1.5 * IN, 5.0 * IN)
    checks = run("stiff", "envelope", copes=(cope,))
    bs = by_name(checks, "beam web block shear")
    # Agv = (3 + 3 × 3) × 0.38 = 4.56 in²; Anv = 4.56 − 3.5 × 0.875 × 0.38 = 3.3963;
    # Ant = (2.5 − 0.4375) × 0.38 = 0.78375 in²; rupture 0.6·65·3.3963 + 65·0.78375 = 132.46 + 50.94
    # = 183.40; yield 0.6·50·4.56 + 50.94 = 187.74 -> φRn = 0.75 × 183.40 = 137.55 kips
    assert bs.capacity / KIP == pytest.approx(137.55, abs=0.02)
    bl, sf = by_name(checks, "coped section bending" + BL), by_name(checks, "coped section bending" + SF)
    V = demand().V
    assert bl.demand == pytest.approx(V * (5.0 - 2.5) * IN)     # bolt line to cope face
    assert sf.demand == pytest.approx(V * (5.0 + 0.5) * IN)     # support face to cope face
    assert by_name(checks, "edge distance minimum (beam web)").passed


def test_cope_without_flange_data_is_incomplete():
    b = beam(Section("PART", "I", 16.3 * IN, None, 0.38 * IN, None))
    c = by_name(run(b=b, copes=(Cope("top", 1.5 * IN, 5.0 * IN),)), "coped section bending" + BL)
    assert c.incomplete


def test_tie_force_adds_tension_checks_and_inclines_bolt_load():
    checks = run(d=demand(49.6, 20.0))
    assert by_name(checks, "plate tension yield").demand == pytest.approx(20.0 * KIP)
    bs = by_name(checks, "bolt shear" + BL)
    assert bs.demand == pytest.approx(math.hypot(49.6, 20.0) * KIP)
    assert "plate tension yield" not in [c.name for c in run()]


def test_detailing_limits_fail_when_violated():
    p = plate(pitch=1.9 * IN, plate_end_edge=0.9 * IN, beam_end_edge=2.9 * IN, thickness=0.5 * IN,
              depth=7.5 * IN)
    checks = run(p=p)
    assert not by_name(checks, "bolt pitch minimum").passed             # 1.9 < 2-2/3 × 0.75 = 2.0 in.
    assert not by_name(checks, "edge distance minimum (plate)").passed  # 0.9 < 1 in. (Table J3.4)
    assert not by_name(checks, "clearance to support").passed           # 3 − 2.9 = 0.1 < 1/2 in.
    # Table 10-9 is met by either element: the 1/2 in. plate exceeds db/2 + 1/16 = 7/16 in., the
    # 0.380 in. web does not, so the rotation limit passes through the web
    rot = by_name(checks, "plate thickness for rotation")
    assert rot.passed and rot.demand / IN == pytest.approx(0.380) and "beam web" in rot.note


def test_plate_too_thick_and_web_too_thick_fails_rotation():
    thick = beam(Section("W16X100", "I", 17.0 * IN, 10.4 * IN, 0.585 * IN, 0.985 * IN, 0.4 * IN))
    c = by_name(run(p=plate(thickness=0.5 * IN), b=thick), "plate thickness for rotation")
    assert not c.passed and c.demand / IN == pytest.approx(0.5)


def test_upward_shear_reverses_tear_out_directions_not_magnitudes():
    down, up = run(d=demand(49.6)), run(d=demand(-49.6))
    assert by_name(up, "bolt shear" + BL).capacity == pytest.approx(by_name(down, "bolt shear" + BL).capacity)
    assert by_name(up, "bolt shear" + BL).demand == pytest.approx(49.6 * KIP)
    # pushed up, the plate's top bolt tears towards the top edge (Lev = 1-1/4 in. above it) instead
    # of the bottom one; the plate is symmetric, so the group tear-out strength is unchanged
    assert by_name(up, "bolt tear-out in plate" + BL).capacity == pytest.approx(
        by_name(down, "bolt tear-out in plate" + BL).capacity, rel=1e-9)
    # on the uncoped web the downward-pushed bolts (upward load) tear towards the bottom flange
    assert by_name(up, "bolt tear-out in beam web" + BL).capacity != pytest.approx(
        by_name(down, "bolt tear-out in beam web" + BL).capacity)


def test_compression_does_not_add_tie_checks():
    names = [c.name for c in run(d=demand(49.6, -20.0))]
    assert "plate tension yield" not in names


def test_missing_beam_steel_gives_incomplete_web_checks():
    checks = run(b=beam(steel=None))
    assert by_name(checks, "beam web shear").incomplete
    assert by_name(checks, "bolt group strength" + BL).incomplete


def test_plate_without_bolts_gives_incomplete_checks():
    checks = run(p=plate(rows=0))
    assert checks and all(c.incomplete for c in checks) and "rows" in checks[0].note
