"""results.json contract and the baseline comparison (new / open / resolved)."""

from __future__ import annotations

import json

import pytest

from helpers_results import doc, members, result
from engine.errors import BadInputError
from engine.results import baseline_marks, read_baseline, schedule_csv

B, C, B2, B3 = "2O2Fr$t4X7Zf8NOew3FLOH", "1kTvXnbbzCWw8lcMd1dR4o", "0uA7yfWrz4wBs1xbFHhyKq", "3Bv2$yTq1E9fK0w9vYc2Lm"


def test_results_document_has_the_contract_keys():
    d = doc([result(B, C, "fail")], members(B, C))
    assert set(d) >= {"tool", "model", "code", "summary", "joints"}
    assert d["summary"] == {"joints": 1, "pass": 0, "fail": 1, "needs-design": 0, "incomplete": 0, "not-checked": 0}
    j = d["joints"][0]
    for key in ("id", "beam", "end", "support", "kind", "stiffness", "stiffness_reasons", "demand", "connection",
                "checks", "utilisation", "governing", "status", "baseline"):
        assert key in j
    assert j["demand"] == {"V_kN": 120.0, "N_kN": 0.0, "source": "schedule", "combination": "1.2G + 1.5Q"}
    assert j["checks"][0] == {"name": "bolt shear", "clause": "AS 4100 9.3.2.1", "demand": 120.0, "capacity": 100.0,
                              "unit": "kN", "utilisation": 1.2, "passed": False, "incomplete": False, "note": ""}
    assert j["checks"][1]["unit"] == "kN·m" and j["checks"][1]["demand"] == 5.0
    json.dumps(d)  # serialisable


def test_baseline_marks_new_open_and_resolved(tmp_path):
    mem = {**members(B, C), **members(B2, C, "B2"), **members(B3, C, "B3")}
    old = doc([result(B, C, "fail"), result(B2, C, "fail"), result(B3, C, "fail")], mem)
    path = tmp_path / "results.json"
    path.write_text(json.dumps(old))
    # now: B still fails (open), B2 passes (resolved), B3's joint is gone (resolved by removal),
    # and B's other end is a new failure
    now = [result(B, C, "fail"), result(B2, C, "pass"), result(B, C, "fail", end="end")]
    marks, removed = baseline_marks(now, read_baseline(path))
    by_beam_end = {(r.joint.beam, r.joint.end): marks[r.joint.id] for r in now}
    assert by_beam_end == {(B, "start"): "open", (B2, "start"): "resolved", (B, "end"): "new"}
    assert [r["beam"] for r in removed] == [B3]


@pytest.mark.parametrize("text, match", [("{", "is not a joint-audit results.json"),
                                         ('{"joints": 3}', "no 'joints' list"),
                                         ('{"joints": [{"id": 1}]}', r"joints\[0\] has no string 'id'")])
def test_malformed_baseline_is_a_clear_error(tmp_path, text, match):
    p = tmp_path / "old.json"
    p.write_text(text)
    with pytest.raises(BadInputError, match=match):
        read_baseline(p)


def test_schedule_csv_has_one_row_per_joint():
    mem = {**members(B, C), **members(B2, C, "B2")}
    csv_text = schedule_csv(doc([result(B, C, "fail"), result(B2, C, "needs-design")], mem))
    lines = csv_text.strip().splitlines()
    assert lines[0].startswith("joint_id,beam,beam_name,end,support")
    assert len(lines) == 3
    assert "fin plate 10 x 230 x 110 250, 3 x M20 8.8 (3 rows x 1 line), 6 mm E48XX both sides" in csv_text
