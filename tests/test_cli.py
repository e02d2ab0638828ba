"""The command line: help shows the cautions; bad input ends with exit 2 and one clear line."""

from __future__ import annotations

import json
import os
import subprocess
import sys
from pathlib import Path

import pytest

from engine.cli import main

REPO = Path(__file__).resolve().parents[1]


def run(argv, capsys):
    code = main(argv)
    out, err = capsys.readouterr()
    return code, out, err


def test_help_shows_the_cautions_and_the_commands(capsys):
    with pytest.raises(SystemExit) as info:
        main(["--help"])
    out = capsys.readouterr().out
    assert info.value.code == 0
    assert "aid to a competent structural engineer" in out
    assert "licensed professional practice" in out
    for command in ("inspect", "demo", "rules"):
        assert command in out


def test_subcommand_help_shows_the_cautions(capsys):
    with pytest.raises(SystemExit):
        main(["inspect", "--help"])
    assert "aid to a competent structural engineer" in capsys.readouterr().out


def test_usage_error_is_one_line_and_exit_2(capsys):
    with pytest.raises(SystemExit) as info:
        main(["inspect"])
    err = capsys.readouterr().err
    assert info.value.code == 2
    assert err.count("\n") == 1 and "MODEL.ifc" in err


def _bad_inputs(tmp_path: Path, shared: Path) -> dict[str, Path]:
    empty = tmp_path / "empty.ifc"
    empty.write_bytes(b"")
    text = tmp_path / "notes.ifc"
    text.write_text("These are meeting notes, not a model.\n")
    whole = (shared / "small-steel-frame-ifc2x3-mm.ifc").read_bytes()
    truncated = tmp_path / "truncated.ifc"
    truncated.write_bytes(whole[: len(whole) // 2])
    unknown = tmp_path / "unknown-schema.ifc"
    unknown.write_bytes(whole.replace(b"FILE_SCHEMA(('IFC2X3'))", b"FILE_SCHEMA(('IFC9X9'))", 1))
    assert b"IFC9X9" in unknown.read_bytes()
    folder = tmp_path / "a-folder.ifc"
    folder.mkdir()
    return {
        "missing": tmp_path / "no-such-model.ifc",
        "directory": folder,
        "empty": empty,
        "plain text": text,
        "truncated": truncated,
        "unknown schema": unknown,
    }


@pytest.mark.parametrize("case", ["missing", "directory", "empty", "plain text", "truncated", "unknown schema"])
def test_bad_model_ends_with_exit_2_one_line_and_nothing_written(case, tmp_path, shared_models, capsys):
    bad = _bad_inputs(tmp_path, shared_models)[case]
    before = sorted(p.name for p in tmp_path.iterdir())
    code, out, err = run(["inspect", str(bad)], capsys)
    assert code == 2, err
    assert err.startswith("joint-audit: error: ") and err.count("\n") == 1, err
    assert "Traceback" not in err
    assert out == ""
    assert sorted(p.name for p in tmp_path.iterdir()) == before


def test_inspect_reports_schema_units_and_counts_as_json(shared_models, capsys):
    code, out, err = run(["inspect", str(shared_models / "small-steel-frame-ifc2x3-mm.ifc"), "--json"], capsys)
    assert code == 0, err
    data = json.loads(out)
    # counts read independently with ifcopenshell's by_type in tests/test_reader_*.py; SOURCES.md
    # describes this file as 12 beams and 9 columns
    assert data["schema"] == "IFC2X3"
    assert data["length_unit"] == "MILLIMETRE"
    assert data["members_by_role"]["beam"] == 12
    assert data["members_by_role"]["column"] == 9
    assert "aid to a competent" in data["caution"]


def test_console_script_runs_as_a_process_without_traceback(tmp_path):
    env = dict(os.environ)
    env.pop("JOINT_AUDIT_DEBUG", None)
    res = subprocess.run(
        [sys.executable, "-m", "engine.cli", "inspect", str(tmp_path / "missing.ifc")],
        cwd=REPO, capture_output=True, text=True, env=env,
    )
    assert res.returncode == 2
    assert res.stderr.count("\n") == 1 and "Traceback" not in res.stderr


def test_demo_runs_as_a_process_from_another_folder(tmp_path):
    # as a user runs it: from a folder of their own, the installed package found the way the
    # installation put it (building the demo goes through IfcOpenShell's API, which can put a folder
    # with a "rules" package of its own on sys.path: the rule sets must still be ours)
    env = {k: v for k, v in os.environ.items() if k not in ("JOINT_AUDIT_DEBUG", "PYTHONPATH")}
    res = subprocess.run([sys.executable, "-m", "engine.cli", "demo", "--out", str(tmp_path / "demo")],
                         cwd=tmp_path, capture_output=True, text=True, env=env, timeout=300)
    assert res.returncode == 1, res.stderr  # the demo has failing joints and joints that need design
    assert res.stderr == ""
    assert (tmp_path / "demo" / "audit" / "results.json").is_file()
