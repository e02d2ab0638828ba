"""The plug-in path (the audit on an already open ifcopenshell.file, results written into it) and the
`inspect --joints` and `rules` commands."""

from __future__ import annotations

import json
from pathlib import Path

import ifcopenshell
import pytest

from engine.cli import main
from ifc_io.library import audit_model
from ifc_io.write_psets import read_joint_psets

SAMPLES = Path(__file__).resolve().parents[1] / "samples"
TRUTH = json.loads((SAMPLES / "demo-truth.json").read_text())


def test_audit_on_an_open_model_writes_psets_into_it_without_a_file(tmp_path):
    model = ifcopenshell.open(str(SAMPLES / "demo-ifc4-mm.ifc"))
    n_before = len(list(model))
    outcome = audit_model(model, config_file=SAMPLES / "demo-config.toml",
                          schedules=[SAMPLES / "demo-schedule.csv"], write_psets=True)
    assert outcome.doc["summary"]["joints"] == 119
    weak = next(t for t in TRUTH["joints"] if t["expected_status"] == "fail")
    sets = read_joint_psets(model, model.by_guid(weak["beam"]))
    assert sets["JointAudit_" + weak["end"].capitalize()]["Status"] == "fail"
    assert len(list(model)) > n_before
    # the same call without write_psets leaves the open model as it is
    fresh = ifcopenshell.open(str(SAMPLES / "demo-ifc4-mm.ifc"))
    n = len(list(fresh))
    audit_model(fresh, config_file=SAMPLES / "demo-config.toml", code="en1993")
    assert len(list(fresh)) == n
    assert list(tmp_path.iterdir()) == []  # nothing written to disk


def test_inspect_joints_json_lists_every_joint_with_stiffness_and_reasons(capsys):
    assert main(["inspect", str(SAMPLES / "demo-ifc2x3-ft.ifc"), "--joints", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["length_unit"] == "FOOT"
    assert len(data["joints"]) == 119 and data["unresolved"] == []
    truth = {(t["beam"], t["end"]): t for t in TRUTH["joints"]}
    for row in data["joints"]:
        t = truth[(row["beam"], row["end"])]
        assert (row["support"], row["kind"]) == (t["support"], t["kind"])
        assert row["stiffness"] in ("stiff", "flexible") and row["reasons"]
    free = [r for r in data["joints"] if r["kind"] == "free-end"]
    assert len(free) == 1 and free[0]["support"] is None


def test_inspect_joints_text_shows_the_reasons(capsys):
    assert main(["inspect", str(SAMPLES / "demo-ifc4-mm.ifc"), "--joints"]) == 0
    out = capsys.readouterr().out
    assert "joints         119" in out and "unresolved     0" in out
    assert "→ stiff" in out or "-> stiff" in out


def test_rules_command_lists_the_installed_codes_with_checks_and_sources(capsys):
    assert main(["rules", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    codes = {r["code"]: r for r in data["rule_sets"]}
    assert {"as4100", "en1993", "aisc360"} <= set(codes)
    for r in codes.values():
        names = {c["name"] for c in r["checks"]}
        assert {"bolt shear", "weld", "plate block shear"} <= names
        assert r["data_sources"] and r["ultimate_combination"]["dead"] > 1.0
    assert main(["rules"]) == 0
    assert "AS 4100" in capsys.readouterr().out


@pytest.mark.parametrize("code", ["en1993", "aisc360"])
def test_the_demo_runs_under_every_code(code, tmp_path):
    rc = main(["audit", str(SAMPLES / "demo-ifc4-mm.ifc"), "--code", code, "--config", str(SAMPLES / "demo-config.toml"),
               "--schedule", str(SAMPLES / "demo-schedule.csv"), "--out", str(tmp_path)])
    assert rc in (0, 1)
    doc = json.loads((tmp_path / "results.json").read_text())
    assert doc["code"] == code
    checked = [j for j in doc["joints"] if j["checks"]]
    assert checked and all(c["clause"] for j in checked for c in j["checks"])


def test_design_option_proposes_passing_plates_for_joints_without_one(tmp_path):
    rc = main(["audit", str(SAMPLES / "demo-ifc4-mm.ifc"), "--config", str(SAMPLES / "demo-config.toml"),
               "--schedule", str(SAMPLES / "demo-schedule.csv"), "--design", "--out", str(tmp_path)])
    doc = json.loads((tmp_path / "results.json").read_text())
    proposed = [j for j in doc["joints"] if j["connection"] and j["connection"]["source"] == "proposed"]
    assert proposed, "no fin plate proposed"
    assert all(j["status"] == "pass" and all(c["passed"] for c in j["checks"]) for j in proposed)
    assert all("proposed by --design" in j["note"] for j in proposed)
    # modelled and scheduled connections keep their own outcome: the 3 deliberately weak plates still fail
    assert doc["summary"]["fail"] == 3
    assert doc["summary"]["needs-design"] < 96  # without --design: 96
    left = [j for j in doc["joints"] if j["status"] == "needs-design"]
    assert all("--design found no fin plate" in j["note"] for j in left)
    assert rc == 1
