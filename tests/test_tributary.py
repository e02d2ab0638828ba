"""Tributary take-down (engine.tributary) checked against hand calculations by statics.

Sources of the values used:
- Ultimate combination 1.2G + 1.5Q and 1.35G: AS/NZS 1170.0:2002 cl. 4.2.2 (b) and (a)  # from memory
- Steel density 7850 kg/m³ (AS 4100:2020 cl. 2.2.4, from memory) and g = 9.81 m/s².
- One-way when the panel aspect ratio is >= 2; 45° lines for two-way panels  # common practice
- Reactions of a simply supported beam: R_a = Σ P (L − x)/L, R_b = Σ P x/L (statics).
- Section areas 5000 mm² and 8000 mm² are round test values, not catalogue sections.

The test frame (plan, mm; Level 1 at z = 3000; columns at the four corners):

    y=6000  C3 ───────── G2 ─────────────────── C4
            │        │      │                  │
            E1  P1   S1 P2  S2       P3        E2
            │  3×6 m │2×6 m │     4×6 m        │
    y=0     C1 ───────── G1 ─────────────────── C2
           x=0     3000   5000               9000

G1, G2 span the columns (x 0 → 9000); E1, E2 span the columns (y 0 → 6000); secondaries S1 (x = 3000)
and S2 (x = 5000) run from G1 (start) to G2 (end).
P1 3 × 6 m, aspect 2.0 → one-way onto E1 and S1 (1.5 m width each);
P2 2 × 6 m, aspect 3.0 → one-way onto S1 and S2 (1.0 m width each);
P3 4 × 6 m, aspect 1.5 → two-way: triangles on the 4 m sides (G1, G2) of area 4²/4 = 4 m²,
trapezoids on the 6 m sides (S2, E2) of area (24 − 2·4)/2 = 8 m²  (2·4 + 2·8 = 24 m² ✓).
"""

from __future__ import annotations

import numpy as np
import pytest

from engine.errors import ConfigError, RuleSetError
from engine.model import Joint, JointGeometry, Member, Section, joint_id
from engine.tributary import (
    parse_area_loads,
    parse_combination,
    self_weight_n_per_mm,
    simple_reactions,
    take_down,
)

AS_COMB = {"name": "1.2G + 1.5Q", "dead": 1.2, "live": 1.5, "dead_only": 1.35,
           "source": "AS/NZS 1170.0 4.2.2"}  # from memory
LOADS = [{"storey": "Level 1", "dead_kPa": 4.0, "live_kPa": 3.0}]
W5000 = 5000 * 7850 * 9.81e-9   # = 0.3850425 N/mm  (area × ρ × g)
W8000 = 8000 * 7850 * 9.81e-9   # = 0.616068 N/mm
Z = 3000.0


def beam(gid, a, b, area=5000.0, storey="Level 1", tag=""):
    return Member(global_id=gid, ifc_class="IfcBeam", role="beam", start=(a[0], a[1], Z),
                  end=(b[0], b[1], Z), section=Section("test", "I", depth=300.0, area=area),
                  storey=storey, tag=tag or gid, name=gid)


def column(gid, x, y):
    return Member(global_id=gid, ifc_class="IfcColumn", role="column", start=(x, y, 0.0),
                  end=(x, y, Z), section=Section("col", "I", depth=250.0, area=9000.0), storey="Level 1")


def joint(b, end, sup, kind="column-flange"):
    return Joint(id=joint_id(b, end, sup), beam=b, end=end, support=sup,
                 kind=kind if sup is not None else "free-end", geometry=JointGeometry((0.0, 0.0, Z)))


def frame(gap=0.0):
    """The frame of the module docstring; ``gap`` shortens every beam at both ends (mm), the way
    modelled axes often stop at the support face rather than its centre line."""
    g = gap
    ms = [column("C1", 0, 0), column("C2", 9000, 0), column("C3", 0, 6000), column("C4", 9000, 6000),
          beam("G1", (g, 0), (9000 - g, 0), 8000.0), beam("G2", (g, 6000), (9000 - g, 6000), 8000.0),
          beam("E1", (0, g), (0, 6000 - g)), beam("E2", (9000, g), (9000, 6000 - g)),
          beam("S1", (3000, g), (3000, 6000 - g)), beam("S2", (5000, g), (5000, 6000 - g))]
    js = [joint("G1", "start", "C1"), joint("G1", "end", "C2"), joint("G2", "start", "C3"),
          joint("G2", "end", "C4"), joint("E1", "start", "C1"), joint("E1", "end", "C3"),
          joint("E2", "start", "C2"), joint("E2", "end", "C4"),
          joint("S1", "start", "G1", "beam-web"), joint("S1", "end", "G2", "beam-web"),
          joint("S2", "start", "G1", "beam-web"), joint("S2", "end", "G2", "beam-web")]
    return {m.global_id: m for m in ms}, js


def kN(x):
    return x / 1e3


def test_panels_are_one_way_at_aspect_two_and_above_and_two_way_below():
    members, joints = frame()
    td = take_down(members, joints, LOADS, AS_COMB)
    spans = sorted((round(p.area / 1e6, 3), p.span, round(p.aspect, 3)) for p in td.panels)
    # P2 2×6 = 12 m² aspect 3; P1 3×6 = 18 m² aspect 2; P3 4×6 = 24 m² aspect 1.5
    assert spans == [(12.0, "one-way", 3.0), (18.0, "one-way", 2.0), (24.0, "two-way", 1.5)]
    assert sum(p.area for p in td.panels) == pytest.approx(54e6)  # 9 m × 6 m bay
    p3 = next(p for p in td.panels if p.span == "two-way")
    assert p3.beams == ("E2", "G1", "G2", "S2")


def test_take_down_matches_hand_calculation_with_self_weight():
    members, joints = frame()
    td = take_down(members, joints, LOADS, AS_COMB, self_weight=True)
    G_kPa, Q_kPa = 4.0, 3.0
    # S1: floor P1 1.5×6 = 9 m² + P2 1.0×6 = 6 m² = 15 m², uniform → 7.5 m² per end.
    #     G = 7.5·4 = 30 kN + self-weight 0.3850425 N/mm × 6000 mm / 2 = 1.155 kN → 31.155 kN
    #     Q = 7.5·3 = 22.5 kN;  V* = max(1.2·31.155 + 1.5·22.5, 1.35·31.155)
    #       = max(37.386 + 33.75, 42.06) = 71.136 kN
    sw5 = W5000 * 6000 / 2 / 1e3                      # 1.1551 kN
    s1_G, s1_Q = 7.5 * G_kPa + sw5, 7.5 * Q_kPa
    for end in ("start", "end"):
        G, Q = td.unfactored[("S1", end)]
        assert kN(G) == pytest.approx(s1_G, rel=0.01)
        assert kN(Q) == pytest.approx(s1_Q, rel=0.01)
        assert kN(td.reactions[("S1", end)][0]) == pytest.approx(71.136, rel=0.01)
    # S2: P2 6 m² + P3 trapezoid 8 m² = 14 m² (both symmetric about mid-span) → 7 m² per end.
    #     G = 28 + 1.155 = 29.155 kN, Q = 21 kN; V* = 1.2·29.155 + 1.5·21 = 34.986 + 31.5 = 66.486 kN
    s2_G, s2_Q = 7.0 * G_kPa + sw5, 7.0 * Q_kPa
    assert kN(td.reactions[("S2", "start")][0]) == pytest.approx(66.486, rel=0.01)
    # E1: P1 9 m² → 4.5 m² per end: G = 18 + 1.155 = 19.155, Q = 13.5 → V* = 22.986 + 20.25 = 43.236 kN
    assert kN(td.reactions[("E1", "end")][0]) == pytest.approx(43.236, rel=0.01)
    # E2: P3 trapezoid 8 m² → 4 m² per end: G = 16 + 1.155 = 17.155, Q = 12 → V* = 20.586 + 18 = 38.586 kN
    assert kN(td.reactions[("E2", "start")][0]) == pytest.approx(38.586, rel=0.01)
    # G1 (L = 9 m), loads and positions from its start (C1):
    #   S1 reaction G 31.155 / Q 22.5 at x = 3 m; S2 reaction G 29.155 / Q 21 at x = 5 m;
    #   P3 triangle 4 m² (G 16 / Q 12) centred at x = 7 m; self-weight 0.616068 × 9 = 5.5446 kN at 4.5 m.
    #   G_start = 31.155·6/9 + 29.155·4/9 + 16·2/9 + 5.5446/2
    #           = 20.770 + 12.958 + 3.556 + 2.772 = 40.056 kN
    #   G_end   = 31.155·3/9 + 29.155·5/9 + 16·7/9 + 2.772
    #           = 10.385 + 16.197 + 12.444 + 2.772 = 41.799 kN
    #   Q_start = 22.5·6/9 + 21·4/9 + 12·2/9 = 15 + 9.333 + 2.667 = 27.0 kN
    #   Q_end   = 22.5·3/9 + 21·5/9 + 12·7/9 = 7.5 + 11.667 + 9.333 = 28.5 kN
    sw8 = W8000 * 9000 / 1e3
    g1_Gs = s1_G * 6 / 9 + s2_G * 4 / 9 + 4 * G_kPa * 2 / 9 + sw8 / 2
    g1_Ge = s1_G * 3 / 9 + s2_G * 5 / 9 + 4 * G_kPa * 7 / 9 + sw8 / 2
    assert g1_Gs == pytest.approx(40.056, abs=0.01) and g1_Ge == pytest.approx(41.799, abs=0.01)
    Gs, Qs = td.unfactored[("G1", "start")]
    Ge, Qe = td.unfactored[("G1", "end")]
    assert kN(Gs) == pytest.approx(40.056, rel=0.01) and kN(Qs) == pytest.approx(27.0, rel=0.01)
    assert kN(Ge) == pytest.approx(41.799, rel=0.01) and kN(Qe) == pytest.approx(28.5, rel=0.01)
    #   V*_end = max(1.2·41.799 + 1.5·28.5, 1.35·41.799) = max(50.159 + 42.75, 56.43) = 92.909 kN
    assert kN(td.reactions[("G1", "end")][0]) == pytest.approx(92.909, rel=0.01)
    # G2 carries the mirror image (S1, S2 end reactions equal their start reactions).
    assert td.reactions[("G2", "end")][0] == pytest.approx(td.reactions[("G1", "end")][0], rel=1e-6)
    detail = td.reactions[("G1", "end")][1]
    assert "S1" in detail and "S2" in detail and "self-weight" in detail
    assert td.combination == "1.2G + 1.5Q (AS/NZS 1170.0 4.2.2)"


def test_take_down_without_self_weight_carries_floor_load_only():
    members, joints = frame()
    td = take_down(members, joints, LOADS, AS_COMB, self_weight=False)
    # S1: G = 30 kN, Q = 22.5 kN → V* = 36 + 33.75 = 69.75 kN
    assert kN(td.reactions[("S1", "start")][0]) == pytest.approx(69.75, rel=0.01)
    # G1 end: G = 30·3/9 + 28·5/9 + 16·7/9 = 10 + 15.556 + 12.444 = 38.0 kN; Q = 28.5 kN
    #   V* = 1.2·38.0 + 1.5·28.5 = 45.6 + 42.75 = 88.35 kN
    assert kN(td.unfactored[("G1", "end")][0]) == pytest.approx(38.0, rel=0.01)
    assert kN(td.reactions[("G1", "end")][0]) == pytest.approx(88.35, rel=0.01)
    # Equilibrium: the column reactions (G1, G2, E1, E2 ends) sum to the whole floor:
    #   54 m² × (1.2·4 + 1.5·3 = 9.3 kPa) = 502.2 kN
    total = sum(td.reactions[(b, e)][0] for b in ("G1", "G2", "E1", "E2") for e in ("start", "end"))
    assert kN(total) == pytest.approx(502.2, rel=1e-6)


def test_beam_axes_stopping_short_of_their_supports_still_close_the_bays():
    members, joints = frame(gap=150.0)
    td = take_down(members, joints, LOADS, AS_COMB, self_weight=False)
    assert sum(p.area for p in td.panels) == pytest.approx(54e6, rel=1e-6)
    # same floor loads as the centre-line frame: S1 69.75 kN, G1 end 88.35 kN (see above)
    assert kN(td.reactions[("S1", "end")][0]) == pytest.approx(69.75, rel=0.01)
    assert kN(td.reactions[("G1", "end")][0]) == pytest.approx(88.35, rel=0.01)


def test_free_end_of_a_cantilever_has_zero_shear_and_the_supported_end_takes_all():
    members, joints = frame()
    members["K1"] = beam("K1", (9000, 0), (9000, -2000))
    joints = joints + [joint("K1", "start", "C2"), joint("K1", "end", None)]
    td = take_down(members, joints, LOADS, AS_COMB)
    # K1 bounds no panel: self-weight 0.3850425 N/mm × 2000 mm = 770.1 N, all at the start;
    #   V* = max(1.2·770.1, 1.35·770.1) = 1.35·770.1 = 1039.6 N (dead only governs)
    assert td.reactions[("K1", "end")][0] == 0.0
    assert td.reactions[("K1", "start")][0] == pytest.approx(1.35 * W5000 * 2000, rel=1e-6)
    assert "cantilever" in td.reactions[("K1", "end")][1]
    assert any("bounds no floor panel" in w.message and w.global_id == "K1" for w in td.warnings)


def test_support_cycle_is_reported_and_not_looped_on():
    ms = [column("C1", 0, 0), column("C2", 6000, 6000), column("C3", 0, 6000),
          beam("B1", (0, 0), (6000, 0)), beam("B2", (6000, 0), (6000, 6000)),
          beam("B3", (0, 6000), (6000, 6000)), beam("S", (3000, 0), (3000, 6000)),
          beam("E", (0, 0), (0, 6000))]
    members = {m.global_id: m for m in ms}
    joints = [joint("B1", "start", "C1"), joint("B1", "end", "B2", "beam-web"),
              joint("B2", "start", "B1", "beam-web"), joint("B2", "end", "C2"),
              joint("B3", "start", "C3"), joint("B3", "end", "C2"),
              joint("S", "start", "B1", "beam-web"), joint("S", "end", "B3", "beam-web"),
              joint("E", "start", "C1"), joint("E", "end", "C3")]
    td = take_down(members, joints, [{"storey": "*", "dead_kPa": 4.0, "live_kPa": 3.0}], AS_COMB)
    cyc = [w for w in td.warnings if "cycle" in w.message]
    assert len(cyc) == 1 and "B1" in cyc[0].message and "B2" in cyc[0].message
    for key in (("B1", "start"), ("B1", "end"), ("B2", "start"), ("B2", "end")):
        assert key not in td.reactions and "cycle" in td.unresolved[key]
    # a beam carried by the cycle is still resolved; the girder B3 (on columns) too
    assert ("S", "start") in td.reactions and ("B3", "end") in td.reactions


def test_a_beam_carrying_an_unresolved_beam_is_unresolved_with_the_reason():
    members, joints = frame()
    joints = [j for j in joints if not (j.beam == "S1" and j.end == "end")]  # S1 end: no joint
    td = take_down(members, joints, LOADS, AS_COMB)
    assert "no joint" in td.unresolved[("S1", "end")]
    assert "S1" in td.unresolved[("G1", "start")]  # G1 carries S1, whose reactions are unknown
    assert ("S2", "start") in td.reactions and ("E1", "start") in td.reactions


def test_storey_without_an_area_load_gets_no_take_down_and_a_warning():
    members, joints = frame()
    td = take_down(members, joints, [{"storey": "Roof", "dead_kPa": 1.0}], AS_COMB)
    assert td.reactions == {}
    assert "Level 1" in td.unresolved[("S1", "start")]
    assert any("Level 1" in w.message for w in td.warnings)


def test_exact_storey_name_beats_a_glob_entry():
    members, joints = frame()
    loads = [{"storey": "*", "dead_kPa": 100.0, "live_kPa": 0.0},
             {"storey": "Level 1", "dead_kPa": 4.0, "live_kPa": 3.0}]
    td = take_down(members, joints, loads, AS_COMB, self_weight=False)
    assert kN(td.reactions[("S1", "start")][0]) == pytest.approx(69.75, rel=0.01)  # as above


def test_non_convex_panel_keeps_equilibrium():
    # An L-shaped bay: outer 6×6 m with the 3×3 m corner at (3..6, 3..6) cut off by beams on columns.
    pts = [(0, 0), (6000, 0), (6000, 3000), (3000, 3000), (3000, 6000), (0, 6000)]
    cols = [column(f"C{i}", x, y) for i, (x, y) in enumerate(pts)]
    bms, js = [], []
    for i in range(6):
        a, b = pts[i], pts[(i + 1) % 6]
        gid = f"B{i}"
        bms.append(beam(gid, a, b))
        js += [joint(gid, "start", f"C{i}"), joint(gid, "end", f"C{(i + 1) % 6}")]
    members = {m.global_id: m for m in cols + bms}
    td = take_down(members, js, [{"storey": "*", "dead_kPa": 5.0, "live_kPa": 0.0}],
                   {"dead": 1.0, "live": 1.0, "dead_only": 0.0}, self_weight=False)
    assert len(td.panels) == 1 and td.panels[0].method == "grid"
    # area = 36 − 9 = 27 m² (aspect of the 6×6 envelope is 1 → two-way); 27 × 5 kPa = 135 kN
    assert td.panels[0].area == pytest.approx(27e6)
    total = sum(v for v, _ in td.reactions.values())
    assert kN(total) == pytest.approx(135.0, rel=1e-6)


def test_simple_reactions_follow_statics():
    # P = 10 kN at 2 m on a 8 m span: R_a = 10·6/8 = 7.5 kN, R_b = 10·2/8 = 2.5 kN
    ra, rb = simple_reactions(8000.0, np.array([2000.0]), np.array([10e3]))
    assert (ra, rb) == pytest.approx((7.5e3, 2.5e3))


def test_self_weight_from_section_area():
    # 5210 mm² × 7850 kg/m³ × 9.81 m/s² = 0.40121 N/mm (= 0.401 kN/m); unknown area → None
    assert self_weight_n_per_mm(Section("x", "I", area=5210.0)) == pytest.approx(0.40121, rel=1e-4)
    assert self_weight_n_per_mm(Section("x")) is None


def test_dead_only_case_governs_when_live_load_is_small():
    c = parse_combination(AS_COMB)
    # G = 10, Q = 0.5: 1.2·10 + 1.5·0.5 = 12.75 < 1.35·10 = 13.5 → 1.35G governs
    v, case = c.combine(10.0, 0.5)
    assert v == pytest.approx(13.5) and case == "1.35G"


@pytest.mark.parametrize("entry, match", [
    ({"storey": "L1", "dead_kPa": -1.0}, r"demand\.area_loads\[0\]\.dead_kPa.*negative"),
    ({"storey": "L1", "dead_kPa": "4"}, r"demand\.area_loads\[0\]\.dead_kPa.*must be a number"),
    ({"dead_kPa": 4.0}, r"demand\.area_loads\[0\]\.storey.*missing"),
    ({"storey": "L1", "dead_kpa": 4.0}, r"unknown key 'demand\.area_loads\[0\]\.dead_kpa'"),
    ({"storey": "L1"}, r"demand\.area_loads\[0\].*neither dead_kPa nor live_kPa"),
])
def test_bad_area_load_entry_names_the_key(entry, match):
    with pytest.raises(ConfigError, match=match):
        parse_area_loads([entry], "job.toml")
    members, joints = frame()
    with pytest.raises(ConfigError, match=match):
        take_down(members, joints, [entry], AS_COMB)


def test_duplicate_storey_entry_is_a_config_error():
    with pytest.raises(ConfigError, match=r"job\.toml: 'demand\.area_loads\[1\]\.storey' 'L1' is already"):
        parse_area_loads([{"storey": "L1", "dead_kPa": 1.0}, {"storey": "L1", "live_kPa": 2.0}], "job.toml")


def test_bad_combination_names_the_key():
    with pytest.raises(RuleSetError, match="'live' is missing"):
        parse_combination({"dead": 1.2})
    with pytest.raises(RuleSetError, match="'dead' must be a number"):
        parse_combination({"dead": "1.2", "live": 1.5})


from hypothesis import given, settings, strategies as st  # noqa: E402


@settings(max_examples=25, deadline=None)
@given(width=st.integers(2000, 12000), depth=st.integers(2000, 12000),
       xs=st.lists(st.integers(1, 19), min_size=0, max_size=3, unique=True))
def test_column_reactions_always_sum_to_the_whole_floor_load(width, depth, xs):
    # Statics: whatever the panel shapes and spans, the four column-supported beams deliver
    # area × q to the columns (self-weight off), q = 1.2·2 + 1.5·5 = 9.9 kPa.
    ms = [column("C1", 0, 0), column("C2", width, 0), column("C3", 0, depth), column("C4", width, depth),
          beam("G1", (0, 0), (width, 0)), beam("G2", (0, depth), (width, depth)),
          beam("E1", (0, 0), (0, depth)), beam("E2", (width, 0), (width, depth))]
    js = [joint("G1", "start", "C1"), joint("G1", "end", "C2"), joint("G2", "start", "C3"),
          joint("G2", "end", "C4"), joint("E1", "start", "C1"), joint("E1", "end", "C3"),
          joint("E2", "start", "C2"), joint("E2", "end", "C4")]
    for i, k in enumerate(sorted(xs)):
        x = round(width * k / 20)
        ms.append(beam(f"S{i}", (x, 0), (x, depth)))
        js += [joint(f"S{i}", "start", "G1", "beam-web"), joint(f"S{i}", "end", "G2", "beam-web")]
    td = take_down({m.global_id: m for m in ms}, js, [{"storey": "*", "dead_kPa": 2.0, "live_kPa": 5.0}],
                   AS_COMB, self_weight=False)
    total = sum(td.reactions[(b, e)][0] for b in ("G1", "G2", "E1", "E2") for e in ("start", "end"))
    assert total == pytest.approx(width * depth * 9.9e-3, rel=1e-6)
    assert all(v >= 0 for v, _ in td.reactions.values())


def test_three_beam_support_cycle_names_the_cycle_in_order():
    # A → B → C → A (each beam's end bears on the next one): reported once, in cycle order.
    ms = [column("C0", 0, 0), column("C1", 6000, 0), column("C2", 3000, 5000),
          beam("A", (0, 0), (6000, 0)), beam("B", (6000, 0), (3000, 5000)), beam("C", (3000, 5000), (0, 0))]
    js = [joint("A", "start", "C0"), joint("A", "end", "B", "beam-web"),
          joint("B", "start", "C1"), joint("B", "end", "C", "beam-web"),
          joint("C", "start", "C2"), joint("C", "end", "A", "beam-web")]
    td = take_down({m.global_id: m for m in ms}, js, [{"storey": "*", "dead_kPa": 1.0}], AS_COMB)
    (w,) = [w for w in td.warnings if "cycle" in w.message]
    assert "A → B → C → A" in w.message
    assert td.reactions == {} and all("cycle" in r for r in td.unresolved.values())


def test_unknown_section_area_leaves_self_weight_out_with_a_warning():
    members, joints = frame()
    members["S1"] = beam("S1", (3000, 0), (3000, 6000), area=None)
    td = take_down(members, joints, LOADS, AS_COMB, self_weight=True)
    # S1 without self-weight: G 30 kN, Q 22.5 kN → 69.75 kN (as in the self-weight-off case)
    assert kN(td.reactions[("S1", "start")][0]) == pytest.approx(69.75, rel=0.01)
    assert any(w.global_id == "S1" and "self-weight not included" in w.message for w in td.warnings)


def test_girder_split_at_a_node_is_taken_down_as_one_span_with_the_shear_at_the_splice():
    # G1 of the test frame modelled as two pieces spliced at x = 4 m: G1a (0 → 4000) and G1b drawn
    # backwards (9000 → 4000). S1 frames into G1a, S2 into G1b. The column reactions must equal those
    # of the one-piece G1 (self-weight is uniform either way): start G 40.056 / Q 27.0 kN,
    # end G 41.799 / Q 28.5 kN (hand calculation in test_take_down_matches_hand_calculation...).
    members, joints = frame()
    del members["G1"]
    members["G1a"] = beam("G1a", (0, 0), (4000, 0), 8000.0)
    members["G1b"] = beam("G1b", (9000, 0), (4000, 0), 8000.0)
    joints = [j for j in joints if j.beam != "G1"]
    joints = [jt if jt.support != "G1" else joint(jt.beam, jt.end, "G1a" if jt.beam == "S1" else "G1b",
                                                   "beam-web") for jt in joints]
    joints += [joint("G1a", "start", "C1"), joint("G1a", "end", "G1b", "splice"),
               joint("G1b", "start", "C2"), joint("G1b", "end", "G1a", "splice")]
    td = take_down(members, joints, LOADS, AS_COMB, self_weight=True)
    Gs, Qs = td.unfactored[("G1a", "start")]
    Ge, Qe = td.unfactored[("G1b", "start")]
    assert kN(Gs) == pytest.approx(40.056, rel=0.01) and kN(Qs) == pytest.approx(27.0, rel=0.01)
    assert kN(Ge) == pytest.approx(41.799, rel=0.01) and kN(Qe) == pytest.approx(28.5, rel=0.01)
    # Shear at the splice, x = 4 m, L = 9 m (influence line: 1 − X/L beyond the section, −X/L before):
    #   V_G = 29.155·4/9 + 16·2/9 + 0.616068·5·(2.5/9)      (S2, P3 triangle, G1b self-weight)
    #       − 31.155·3/9 − 0.616068·4·(2/9)                  (S1, G1a self-weight)
    #       = 12.958 + 3.556 + 0.856 − 10.385 − 0.548 = 6.437 kN
    #   live placed beyond the section only: Q = 21·4/9 + 12·2/9 = 9.333 + 2.667 = 12.0 kN
    #   V* = max(1.2·6.437 + 1.5·12.0, |1.2·6.437 − 1.5·(22.5·3/9 = 7.5)|, 1.35·6.437)
    #      = max(7.724 + 18.0, 3.526, 8.690) = 25.724 kN
    v_splice = td.reactions[("G1a", "end")][0]
    assert kN(v_splice) == pytest.approx(25.724, rel=0.01)
    assert td.reactions[("G1b", "end")][0] == v_splice
    assert "splice" in td.reactions[("G1a", "end")][1]


def test_splice_group_that_is_not_one_line_is_reported():
    # three pieces spliced at one point (a "T" of splices): no single continuous span
    ms = [column("C1", 0, 0), column("C2", 6000, 0), column("C3", 3000, 3000),
          beam("P", (0, 0), (3000, 0)), beam("R", (3000, 0), (6000, 0)), beam("T", (3000, 0), (3000, 3000))]
    js = [joint("P", "start", "C1"), joint("P", "end", "R", "splice"), joint("P", "end", "T", "splice"),
          joint("R", "start", "P", "splice"), joint("R", "end", "C2"),
          joint("T", "start", "P", "splice"), joint("T", "end", "C3")]
    td = take_down({m.global_id: m for m in ms}, js, LOADS, AS_COMB)
    for b in ("P", "R", "T"):
        assert "do not form one line" in td.unresolved[(b, "start")]
    assert any("do not form one line" in w.message for w in td.warnings)


def test_take_down_of_a_frame_found_by_the_joint_finder_keeps_equilibrium():
    # The invented synthetic frame (samples/synthetic.py) run through the real joint finder, in both
    # modelling conventions. Statics: the G reactions delivered to the columns equal the floor dead
    # load (panel area × 4 kPa) plus the self-weight of every beam (area × 7850 × 9.81 × length).
    from engine.joints import find_joints
    from samples.synthetic import synthetic_frame

    for convention in ("detailed", "node-to-node"):
        ms = synthetic_frame(120, bays_x=3, bays_y=2, convention=convention)
        js = find_joints(ms, (), ()).joints
        td = take_down({m.global_id: m for m in ms}, js, [{"storey": "*", "dead_kPa": 4.0, "live_kPa": 3.0}],
                       AS_COMB)
        assert td.unresolved == {}
        # 3 × 2 bays of 8 × 6 m per floor, each split in three one-way strips by two secondaries
        floors = {p.storey for p in td.panels}
        assert len(td.panels) == 18 * len(floors) and all(p.span == "one-way" for p in td.panels)
        assert sum(p.area for p in td.panels) == pytest.approx(len(floors) * 6 * 48e6)
        cols = {m.global_id for m in ms if m.role == "column"}
        to_columns = sum(td.unfactored[(j.beam, j.end)][0] for j in js
                         if j.support in cols and (j.beam, j.end) in td.unfactored)
        sw = sum(m.section.area * 7850 * 9.81e-9 * m.length for m in ms if m.role == "beam")
        assert to_columns == pytest.approx(sum(p.area for p in td.panels) * 4e-3 + sw, rel=1e-6)


def test_alternative_combination_governs_when_larger():
    # EN 1990 eq. 6.10a/6.10b with the recommended factors (Table A1.2(B)): 6.10a = 1.35G + 1.05Q
    # (ψ0 = 0.7), 6.10b = 0.85·1.35G + 1.5Q = 1.1475G + 1.5Q. For G = 100, Q = 10 kN:
    # 6.10a = 135 + 10.5 = 145.5 kN; 6.10b = 114.75 + 15 = 129.75 kN → 6.10a governs.
    from engine.tributary import parse_combination

    comb = parse_combination({"name": "6.10b", "dead": 1.1475, "live": 1.5, "dead_only": 1.35,
                              "alternatives": [{"name": "6.10a", "dead": 1.35, "live": 1.05}]})
    V, case = comb.combine(100e3, 10e3)
    assert V == pytest.approx(145.5e3)
    assert "6.10a" in case
    # with more live load 6.10b governs: G = 100, Q = 100 → 6.10a 240, 6.10b 264.75 kN
    assert comb.combine(100e3, 100e3)[0] == pytest.approx(264.75e3)
