"""`joint-audit demo` / `joint-audit audit` end to end on the demo model: the statuses the demo
generator intended, every output written and valid, the input untouched, write-back lossless and
idempotent, baseline marks after a change to the model."""

from __future__ import annotations

import hashlib
import io
import json
import zipfile
from pathlib import Path

import ifcopenshell
import ifcopenshell.validate
import pytest
from lxml import etree

from engine.cli import main
from ifc_io.write_psets import read_joint_psets

SAMPLES = Path(__file__).resolve().parents[1] / "samples"

TRUTH = json.loads((SAMPLES / "demo-truth.json").read_text())
BCF_XSD = Path(__file__).resolve().parents[2] / "shared" / "schemas" / "bcf" / "2.1"


def _sha(p: Path) -> str:
    return hashlib.sha256(p.read_bytes()).hexdigest()


def _audit(model: Path, out: Path, *extra: str) -> int:
    return main(["audit", str(model), "--config", str(SAMPLES / "demo-config.toml"),
                 "--schedule", str(SAMPLES / "demo-schedule.csv"), "--out", str(out), *extra])


@pytest.fixture(scope="module")
def demo_run(tmp_path_factory):
    out = tmp_path_factory.mktemp("demo")
    code = main(["demo", "--out", str(out)])
    return code, out


def test_demo_statuses_are_what_the_generator_intended(demo_run):
    code, out = demo_run
    doc = json.loads((out / "audit" / "results.json").read_text())
    expected = {(t["beam"], t["end"]): t["expected_status"] for t in TRUTH["joints"]}
    got = {(j["beam"], j["end"]): j["status"] for j in doc["joints"]}
    assert got == expected
    assert doc["summary"] == {"joints": 119, "pass": 16, "fail": 3, "needs-design": 96, "incomplete": 0,
                              "not-checked": 4}
    assert code == 1  # some joints fail or need design


@pytest.mark.parametrize("name", [TRUTH["files"]["ifc2x3"]])
def test_feet_and_pound_force_file_gives_the_same_statuses(name, tmp_path):
    assert _audit(SAMPLES / name, tmp_path) == 1
    doc = json.loads((tmp_path / "results.json").read_text())
    expected = {(t["beam"], t["end"]): t["expected_status"] for t in TRUTH["joints"]}
    assert {(j["beam"], j["end"]): j["status"] for j in doc["joints"]} == expected
    assert doc["model"]["length_unit"] == "FOOT"


def test_all_outputs_are_written_and_valid(demo_run):
    _, out = demo_run
    a = out / "audit"
    names = sorted(p.name for p in a.iterdir())
    assert names == ["connections.csv", "demo-ifc4-mm.audited.ifc", "issues.bcf", "issues.html", "results.json"]
    html = (a / "issues.html").read_text()
    assert html.count('<article class="issue"') == 3  # the 3 failures, each with its drawings
    assert html.count('<tr class="issue"') == 96  # the joints that need design, a table row each
    assert "aid to a competent structural engineer" in html
    assert html.count("<svg") >= 2 * 3
    doc = json.loads((a / "results.json").read_text())
    nd_storeys = {j["storey"] for j in doc["joints"] if j["status"] == "needs-design"}
    assert len(nd_storeys) >= 2
    z = zipfile.ZipFile(io.BytesIO((a / "issues.bcf").read_bytes()))
    markup = etree.XMLSchema(etree.parse(str(BCF_XSD / "markup.xsd")))
    visinfo = etree.XMLSchema(etree.parse(str(BCF_XSD / "visinfo.xsd")))
    topics = [n for n in z.namelist() if n.endswith("markup.bcf")]
    assert len(topics) == 3 + len(nd_storeys)  # a topic per failure, one per storey for those needing design
    for n in z.namelist():
        if n.endswith("markup.bcf"):
            assert markup.validate(etree.fromstring(z.read(n))), markup.error_log.last_error
        elif n.endswith(".bcfv"):
            assert visinfo.validate(etree.fromstring(z.read(n))), visinfo.error_log.last_error
        elif n.endswith(".png"):
            assert z.read(n).startswith(b"\x89PNG")
    rows = (a / "connections.csv").read_text().strip().splitlines()
    assert len(rows) == 1 + 119


def test_audited_copy_is_lossless_typed_and_schema_valid(demo_run):
    _, out = demo_run
    src = ifcopenshell.open(str(out / "demo-ifc4-mm.ifc"))
    dst = ifcopenshell.open(str(out / "audit" / "demo-ifc4-mm.audited.ifc"))
    for e in src:  # every input entity is still there, same class and attributes
        d = dst.by_id(e.id())
        assert d.is_a() == e.is_a()
        assert [str(v) for v in d] == [str(v) for v in e]
    logger = ifcopenshell.validate.json_logger()
    ifcopenshell.validate.validate(dst, logger)
    assert logger.statements == []
    fail = next(t for t in TRUTH["joints"] if t["expected_status"] == "fail")
    pset = read_joint_psets(dst, dst.by_guid(fail["beam"]))["JointAudit_" + fail["end"].capitalize()]
    assert pset["Status"] == "fail" and pset["DesignCode"] == "as4100"
    assert pset["EndShear"] == pytest.approx(fail["model_shear_kN"] * 1e3)
    assert pset["Utilisation"] > 1.0


def test_rerun_on_the_audited_model_replaces_the_property_sets(demo_run, tmp_path):
    _, out = demo_run
    audited = out / "audit" / "demo-ifc4-mm.audited.ifc"
    before = _sha(audited)
    _audit(audited, tmp_path)
    assert _sha(audited) == before  # the input is never written
    again = ifcopenshell.open(str(tmp_path / "demo-ifc4-mm.audited.audited.ifc"))
    first = ifcopenshell.open(str(audited))
    names = lambda f: sorted(r.RelatingPropertyDefinition.Name for r in f.by_type("IfcRelDefinesByProperties")
                             if r.RelatingPropertyDefinition.Name.startswith("JointAudit_"))
    assert names(again) == names(first) and len(names(first)) == 119 - 4  # not-checked joints get no set
    assert len(list(again)) == len(list(first))


def test_baseline_marks_after_a_change_to_the_model(demo_run, tmp_path):
    _, out = demo_run
    base = out / "audit" / "results.json"
    model = ifcopenshell.open(str(out / "demo-ifc4-mm.ifc"))
    # change 1: an adequate plate's beam gets ten times its end shear -> a new failure
    adequate = next(t for t in TRUTH["joints"] if t["intended"] == "adequate" and t["end"] == "start")
    beam = model.by_guid(adequate["beam"])
    for rel in beam.IsDefinedBy:
        if rel.is_a("IfcRelDefinesByProperties") and rel.RelatingPropertyDefinition.Name == "Demo_Analysis":
            for p in rel.RelatingPropertyDefinition.HasProperties:
                if p.Name == "StartShear":
                    p.NominalValue = model.create_entity("IfcForceMeasure", p.NominalValue.wrappedValue * 10)
    # change 2: a beam whose ends both need design is deleted -> its issues are resolved by removal
    gone = next(t["beam"] for t in TRUTH["joints"] if t["expected_status"] == "needs-design"
                and sum(1 for u in TRUTH["joints"] if u["beam"] == t["beam"] and u["expected_status"] == "needs-design") == 2)
    model.remove(model.by_guid(gone))
    changed = tmp_path / "changed.ifc"
    model.write(str(changed))
    assert _audit(changed, tmp_path / "out", "--baseline", str(base)) == 1
    doc = json.loads((tmp_path / "out" / "results.json").read_text())
    by = {(j["beam"], j["end"]): j for j in doc["joints"]}
    assert by[(adequate["beam"], "start")]["status"] == "fail"
    assert by[(adequate["beam"], "start")]["baseline"] == "new"
    still = [t for t in TRUTH["joints"] if t["expected_status"] == "fail"]
    assert all(by[(t["beam"], t["end"])]["baseline"] == "open" for t in still)
    assert sorted(r["beam"] for r in doc["baseline_removed"]) == [gone, gone]
    passing = [j for j in doc["joints"] if j["status"] == "pass"]
    assert passing and all(j["baseline"] is None for j in passing)
    html = (tmp_path / "out" / "issues.html").read_text()
    assert "Resolved since the baseline" in html


def test_per_joint_topics_on_request_give_every_issue_its_own_bcf_topic(tmp_path):
    assert _audit(SAMPLES / "demo-ifc4-mm.ifc", tmp_path, "--needs-design-topics", "per-joint") == 1
    z = zipfile.ZipFile(io.BytesIO((tmp_path / "issues.bcf").read_bytes()))
    doc = json.loads((tmp_path / "results.json").read_text())
    issues = [j for j in doc["joints"] if j["status"] in ("fail", "needs-design", "incomplete")]
    assert len([n for n in z.namelist() if n.endswith("markup.bcf")]) == len(issues) == 99
