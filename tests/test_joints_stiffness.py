"""Stiff/flexible classification: the rules, their reasons, the policies and the relative stiffness
worked by hand."""

from __future__ import annotations

import pytest

from engine.errors import ConfigError
from engine.model import Section
from engine.stiffness import (G_STEEL, E_STEEL, SupportFacts, apply_policy, classify,
                              relative_stiffness)

GIR = Section("G", "I", 530.0, 210.0, 10.0, 16.0, 13.0)
SEC = Section("S", "I", 310.0, 165.0, 6.0, 11.0, 11.0)
COL = Section("C", "I", 310.0, 305.0, 10.0, 15.0, 16.0)


def test_continuous_column_flange_is_stiff_with_the_reason():
    v = classify(SupportFacts("column-flange", "C1", continuous=True))
    assert v.level == "stiff"
    assert "column flange, column C1 continuous through the joint → stiff" in v.reasons


def test_one_sided_girder_web_is_flexible():
    v = classify(SupportFacts("beam-web", "G1"))
    assert v.level == "flexible"
    assert any("one side only, girder free to twist → flexible" in r for r in v.reasons)


def test_balanced_girder_web_leans_stiff_and_the_policy_decides():
    v = classify(SupportFacts("beam-web", "G1", partner_label="S2", partner_similar=True, span_ratio=1.0))
    assert v.level == "lean-stiff"
    assert apply_policy(v, "conservative")[0] == "flexible"
    assert apply_policy(v, "classified")[0] == "stiff"
    st, reasons = apply_policy(v, "envelope")
    assert st == "stiff" and any("both hinge positions" in r for r in reasons)


def test_unbalanced_back_to_back_girder_web_is_flexible():
    v = classify(SupportFacts("beam-web", "G1", partner_label="S2", partner_similar=False, span_ratio=1.8))
    assert v.level == "flexible" and any("dissimilar span (ratio 1.80)" in r for r in v.reasons)


def test_column_web_of_a_continuous_column_is_stiff_at_the_column_top_it_is_not_clear():
    one = classify(SupportFacts("column-web", "C1", continuous=True))
    top_balanced = classify(SupportFacts("column-web", "C1", continuous=False, partner_label="B2",
                                         partner_similar=True, span_ratio=1.0))
    top_one = classify(SupportFacts("column-web", "C1", continuous=False))
    assert one.level == "stiff"
    assert any("held by both flanges" in r for r in one.reasons)
    assert top_balanced.level == "lean-stiff" and top_one.level == "lean-flexible"


def test_bearings_free_ends_and_unknown_types_are_flexible_walls_and_splices_stiff():
    assert classify(SupportFacts("beam-over", "G1")).level == "flexible"
    assert classify(SupportFacts("wall", "W1")).level == "stiff"
    assert classify(SupportFacts("free-end")).level == "flexible"
    assert classify(SupportFacts("unknown", "X")).level == "flexible"
    assert classify(SupportFacts("splice", "C0")).level == "stiff"


def test_girder_torsion_relative_stiffness_by_hand():
    # J = (2 b tf³ + (d - 2 tf) tw³) / 3 = (2·210·16³ + 498·10³) / 3 = 739 440 mm⁴
    j = (2 * 210 * 16 ** 3 + 498 * 10 ** 3) / 3
    assert j == pytest.approx(739_440.0)
    # k = G J (1/a + 1/b), a = b = 4000 mm
    k = G_STEEL * j * (1 / 4000 + 1 / 4000)
    # I_beam = (b d³ - (b - tw)(d - 2 tf)³) / 12 = (165·310³ - 159·288³) / 12
    ib = (165 * 310 ** 3 - 159 * 288 ** 3) / 12
    expect = k / (E_STEEL * ib / 6000)
    got = relative_stiffness(SupportFacts("beam-web", "G1", beam_section=SEC, support_section=GIR,
                                          beam_length=6000, h_before=4000, h_after=4000))
    assert got == pytest.approx(expect)
    assert got < 0.05   # an open-section girder is far softer in twist than the beam in bending


def test_slender_column_downgrades_a_flange_joint():
    tiny = Section("tiny", "I", 100.0, 100.0, 6.0, 8.0, 8.0)
    deep = Section("deep", "I", 900.0, 300.0, 16.0, 28.0, 24.0)
    v = classify(SupportFacts("column-flange", "C1", continuous=True, beam_section=deep,
                              support_section=tiny, beam_length=12000, h_before=4000, h_after=4000))
    assert v.level == "lean-flexible"
    assert any("slender" in r for r in v.reasons)


def test_unknown_policy_is_refused():
    with pytest.raises(ConfigError):
        apply_policy(classify(SupportFacts("beam-web", "G1")), "hopeful")
