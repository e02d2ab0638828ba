"""Two runs of `joint-audit audit` on the same input (the demo IFC4 model with its config and
schedule) write the same outputs, apart from the run's timestamp.

Masked before comparing, and nothing else:

* ``results.json``: the value of ``run.date``;
* ``issues.html``: the run date where it appears (the meta line under the title);
* the audited IFC: the run date inside the ``AuditDate`` property values (``IFCDATETIME('…')``) and
  the ``time_stamp`` (second field) of the STEP header's ``FILE_NAME``;
* ``issues.bcf``: the run date where it appears in the XML entries (``Header/File/Date``,
  ``Topic/CreationDate``, ``Comment/Date``) and the zip entries' modification times (set from the
  run date); entry names, their order and every byte of their contents are compared.

``connections.csv`` is compared unmasked. One pair of runs is in separate processes with different
hash seeds (so set or dict ordering that depends on the seed would show); the other is in-process
with two different run dates, so the masking is known to be exercised.
"""

from __future__ import annotations

import json
import os
import re
import subprocess
import sys
import zipfile
from pathlib import Path

import pytest

import ifc_io.library
from engine.cli import main

REPO = Path(__file__).resolve().parents[1]
SAMPLES = REPO / "samples"
MODEL = SAMPLES / "demo-ifc4-mm.ifc"
ARGS = ["--config", str(SAMPLES / "demo-config.toml"), "--schedule", str(SAMPLES / "demo-schedule.csv")]
MASK = "<RUN-DATE>"
_FILE_NAME = re.compile(r"(FILE_NAME\(\s*'(?:[^']|'')*'\s*,\s*)'[^']*'")


def _masked(out: Path) -> dict[str, object]:
    """Every output of one run, with the run's timestamp masked (see the module docstring)."""
    doc = json.loads((out / "results.json").read_text(encoding="utf-8"))
    date = doc["run"]["date"]
    assert re.fullmatch(r"\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\+00:00", date), date
    doc["run"]["date"] = MASK

    html = (out / "issues.html").read_text(encoding="utf-8")
    assert date in html
    html = html.replace(date, MASK)

    ifc = (out / "demo-ifc4-mm.audited.ifc").read_text(encoding="utf-8")
    stamped = ifc.count(f"IFCDATETIME('{date}')")
    assert stamped > 0
    assert ifc.count(date) == stamped, "the run date appears in the IFC outside AuditDate"
    ifc = ifc.replace(f"IFCDATETIME('{date}')", f"IFCDATETIME('{MASK}')")
    ifc, n = _FILE_NAME.subn(rf"\1'{MASK}'", ifc, count=1)
    assert n == 1

    entries = []
    with zipfile.ZipFile(out / "issues.bcf") as z:
        for info in z.infolist():
            data = z.read(info)
            if info.filename.endswith((".bcf", ".bcfv", ".version", ".bcfp", ".xml")):
                data = data.replace(date.encode(), MASK.encode())
            entries.append((info.filename, info.compress_type, data))
    return {
        "results.json": doc,
        "connections.csv": (out / "connections.csv").read_bytes(),
        "issues.html": html,
        "audited.ifc": ifc,
        "issues.bcf": entries,
        "files": sorted(p.name for p in out.iterdir()),
    }


def _compare(a: dict[str, object], b: dict[str, object]) -> None:
    assert a.keys() == b.keys()
    for key in a:
        if key == "issues.bcf":
            assert [e[0] for e in a[key]] == [e[0] for e in b[key]], "BCF entries differ in name or order"
            for ea, eb in zip(a[key], b[key]):
                assert ea == eb, f"BCF entry {ea[0]} differs"
        else:
            assert a[key] == b[key], f"{key} differs between the two runs"


def _process_run(out: Path, seed: str) -> None:
    env = {k: v for k, v in os.environ.items() if k != "JOINT_AUDIT_DEBUG"}
    env["PYTHONHASHSEED"] = seed
    res = subprocess.run([sys.executable, "-m", "engine.cli", "audit", str(MODEL), *ARGS, "--out", str(out)],
                         cwd=REPO, capture_output=True, text=True, env=env, timeout=300)
    assert res.returncode == 1, res.stderr  # the demo has failing joints and joints that need design
    assert res.stderr == ""


def test_two_processes_with_different_hash_seeds_write_the_same_outputs(tmp_path):
    _process_run(tmp_path / "a", "0")
    _process_run(tmp_path / "b", "4242")
    a, b = _masked(tmp_path / "a"), _masked(tmp_path / "b")
    _compare(a, b)
    assert a["results.json"]["summary"]["joints"] == 119


def test_two_runs_at_different_times_differ_only_in_the_timestamp(tmp_path, capsys, monkeypatch):
    dates = iter(["2026-03-01T10:00:00+00:00", "2027-07-15T23:59:59+00:00"])
    monkeypatch.setattr(ifc_io.library, "now_iso", lambda: next(dates))
    assert main(["audit", str(MODEL), *ARGS, "--out", str(tmp_path / "a")]) == 1
    assert main(["audit", str(MODEL), *ARGS, "--out", str(tmp_path / "b")]) == 1
    capsys.readouterr()
    raw_a = (tmp_path / "a" / "results.json").read_text()
    raw_b = (tmp_path / "b" / "results.json").read_text()
    assert raw_a != raw_b  # the runs really carry different timestamps ...
    a, b = _masked(tmp_path / "a"), _masked(tmp_path / "b")
    _compare(a, b)  # ... and that is the only difference
    with zipfile.ZipFile(tmp_path / "a" / "issues.bcf") as z:
        assert z.infolist()[0].date_time[:3] == (2026, 3, 1)


def test_masking_would_catch_a_real_difference(tmp_path, capsys):
    assert main(["audit", str(MODEL), *ARGS, "--out", str(tmp_path / "a")]) == 1
    assert main(["audit", str(MODEL), "--config", str(SAMPLES / "demo-config.toml"), "--out", str(tmp_path / "b")]) == 1
    capsys.readouterr()
    with pytest.raises(AssertionError):  # without the schedule the statuses change
        _compare(_masked(tmp_path / "a"), _masked(tmp_path / "b"))


def test_the_copy_written_in_a_child_process_equals_the_one_written_in_process(tmp_path, capsys, monkeypatch):
    # engine.background writes the model copy in a forked child on Linux; JOINT_AUDIT_SERIAL=1 does
    # it all in one process: the outputs must not depend on which
    monkeypatch.setattr(ifc_io.library, "now_iso", lambda: "2026-12-05T12:00:00+00:00")
    assert main(["audit", str(MODEL), *ARGS, "--out", str(tmp_path / "forked")]) == 1
    monkeypatch.setenv("JOINT_AUDIT_SERIAL", "1")
    assert main(["audit", str(MODEL), *ARGS, "--out", str(tmp_path / "serial")]) == 1
    capsys.readouterr()
    _compare(_masked(tmp_path / "forked"), _masked(tmp_path / "serial"))


@pytest.mark.parametrize("serial", ["", "1"])
def test_a_failed_model_copy_leaves_no_output_and_exits_2(tmp_path, capsys, monkeypatch, serial):
    # the copy is written in a forked child (or in process with JOINT_AUDIT_SERIAL=1); a full disk
    # there must end the run like any other write error: one line, exit 2, nothing left behind
    import errno

    import ifcopenshell

    import shutil

    def full_disk(*a, **k):
        raise OSError(errno.ENOSPC, "No space left on device", str(a[-1]))

    # the copy is the input's own bytes (ifc_io.write_psets_text.copy_input_verbatim); when that
    # fails, IfcOpenShell writes it: both fail here
    monkeypatch.setattr(shutil, "copyfile", full_disk)
    monkeypatch.setattr(ifcopenshell.file, "write", full_disk)
    monkeypatch.setenv("JOINT_AUDIT_SERIAL", serial)
    out = tmp_path / "out"
    assert main(["audit", str(MODEL), *ARGS, "--out", str(out)]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "No space left on device" in err
    assert not out.exists()  # the folder this run made is removed again


def test_a_re_audit_written_out_by_ifcopenshell_is_as_deterministic(tmp_path, capsys, monkeypatch):
    # a model that already holds results is written out by IfcOpenShell (the earlier sets removed),
    # not copied byte for byte: two runs, forked and in one process, still agree
    import shutil

    monkeypatch.setattr(ifc_io.library, "now_iso", lambda: "2026-12-05T12:00:00+00:00")
    assert main(["audit", str(MODEL), *ARGS, "--out", str(tmp_path / "first")]) == 1
    again = tmp_path / "in" / MODEL.name  # the audited copy, under the input's name
    again.parent.mkdir()
    shutil.copyfile(tmp_path / "first" / "demo-ifc4-mm.audited.ifc", again)
    assert main(["audit", str(again), *ARGS, "--out", str(tmp_path / "forked")]) == 1
    monkeypatch.setenv("JOINT_AUDIT_SERIAL", "1")
    assert main(["audit", str(again), *ARGS, "--out", str(tmp_path / "serial")]) == 1
    capsys.readouterr()
    forked = _masked(tmp_path / "forked")
    _compare(forked, _masked(tmp_path / "serial"))
    assert forked["audited.ifc"] != _masked(tmp_path / "first")["audited.ifc"]  # written out, not copied
    assert forked["results.json"]["joints"] == _masked(tmp_path / "first")["results.json"]["joints"]


@pytest.mark.parametrize("serial", ["", "1"])
def test_a_failing_property_set_writer_leaves_no_output_and_exits_2(tmp_path, capsys, monkeypatch, serial):
    # the schedule and the property sets are written by engine.pset_worker (a process of its own, or
    # in process with JOINT_AUDIT_SERIAL=1): its failure ends the run like any other write error
    import engine.pset_worker

    begin = engine.pset_worker.PsetFeed.begin

    def unwritable_schedule(self, settings):
        blocker = tmp_path / "a-folder"
        blocker.mkdir(exist_ok=True)
        begin(self, dict(settings, csv=str(blocker)))  # a folder where the schedule's file should be

    monkeypatch.setattr(engine.pset_worker.PsetFeed, "begin", unwritable_schedule)
    monkeypatch.setenv("JOINT_AUDIT_SERIAL", serial)
    out = tmp_path / "out"
    assert main(["audit", str(MODEL), *ARGS, "--out", str(out)]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "connections.csv" in err, err
    assert not out.exists()
