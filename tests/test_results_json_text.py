"""results.json as the command line writes it: parsed back it is the results document itself, one
joint per line, UTF-8 text, and values the fast encoder refuses (integers beyond 64 bits, which only
a hand-edited baseline brings in) still written."""

from __future__ import annotations

import json

from engine.cli import _results_json


def _doc() -> dict:
    return {
        "tool": {"name": "joint-audit", "version": "0"},
        "summary": {"joints": 2},
        "joints": [
            {"id": "J-1", "stiffness_reasons": ["top cope 30 deep × 90 long", "stiff ≥ 8 → flexible"],
             "location_mm": [1.5, -2.0, 1e-05], "demand": None},
            {"id": "J-2", "stiffness_reasons": ["naïve \"quoted\" \\ back\nslash"], "location_mm": [0.0, 0.0, 3e16],
             "demand": {"V_kN": 12.5}},
        ],
        "baseline_removed": [{"id": "J-9", "beam": 123456789012345678901234567890, "end": ["odd", {"x": 1}]}],
        "warnings": [],
    }


def test_results_json_parses_back_to_the_document():
    doc = _doc()
    text = b"".join(_results_json(doc)).decode("utf-8")
    assert json.loads(text) == doc


def test_results_json_writes_one_joint_per_line_as_utf8():
    raw = b"".join(_results_json(_doc()))
    lines = raw.decode("utf-8").splitlines()
    joint_lines = [ln for ln in lines if ln.startswith('  {"id":"J-')]
    assert len(joint_lines) == 3  # two joints and the removed one, each whole on its line
    assert "×" in raw.decode("utf-8") and b"\\u00d7" not in raw  # UTF-8, not escapes


def test_results_json_keeps_an_integer_beyond_64_bits_from_a_baseline():
    text = b"".join(_results_json(_doc())).decode("utf-8")
    assert json.loads(text)["baseline_removed"][0]["beam"] == 123456789012345678901234567890
