"""Bad files around the model through `joint-audit audit`: an output folder that cannot be written,
malformed baseline, schedule and config files, XML with external entities where a schedule, config
or baseline is expected. Each ends with exit 2 and one clear line naming the file (or exit 0/1 with
warnings) — never a traceback, never a partial output, never a change to an input. A few run as a
separate process (``python -m engine.cli``) to prove nothing but that one line reaches stderr.
"""

from __future__ import annotations

import hashlib
import json
import os
import subprocess
import sys
import warnings
from pathlib import Path

import ifcopenshell
import pytest

from engine.cli import main

REPO = Path(__file__).resolve().parents[1]
SAMPLES = REPO / "samples"
DEMO = SAMPLES / "demo-ifc4-mm.ifc"
CONFIG = SAMPLES / "demo-config.toml"
SCHEDULE = SAMPLES / "demo-schedule.csv"
OUTPUTS = ["connections.csv", "demo-ifc4-mm.audited.ifc", "issues.bcf", "issues.html", "results.json"]
SECRET = "KESTREL-SECRET-4410"


def _sha(p: Path) -> str:
    return hashlib.sha256(p.read_bytes()).hexdigest()


def run_audit(capsys, tmp_path: Path, *args: str, out: Path | None = None, model: Path = DEMO):
    """``audit`` in-process; checks the contract every run keeps and returns (code, stdout, stderr)."""
    out = out or tmp_path / "out"
    inputs = [model, *(Path(a) for a in args if os.path.isfile(a))]
    before = {p: _sha(p) for p in inputs}
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        code = main(["audit", str(model), "--out", str(out), *args])
    stdout, stderr = capsys.readouterr()
    assert code in (0, 1, 2), f"exit {code}: {stderr}"
    assert "Traceback" not in stderr and "internal error" not in stderr, stderr
    assert not [w for w in caught if issubclass(w.category, RuntimeWarning)]
    assert {p: _sha(p) for p in before} == before, "an input file was changed"
    assert not list(tmp_path.rglob("*.part")), "temporary files left behind"
    if code == 2:
        assert stderr.startswith("joint-audit: error: ") and stderr.count("\n") == 1, stderr
        assert stdout == ""
    else:
        assert stderr == ""
    return code, stdout, stderr


def _written(out: Path) -> list[str]:
    return sorted(p.name for p in out.rglob("*") if p.is_file()) if out.exists() else []


# --------------------------------------------------------------------------------------------
# output folder


def test_out_folder_under_an_existing_file_is_a_clear_error_and_writes_nothing(capsys, tmp_path):
    blocker = tmp_path / "notes.txt"
    blocker.write_text("a file where a folder would go")
    code, _, err = run_audit(capsys, tmp_path, out=blocker / "out")
    assert code == 2 and "cannot create output folder" in err and "notes.txt" in err
    assert blocker.read_text() == "a file where a folder would go"


def test_out_folder_that_is_a_file_is_a_clear_error(capsys, tmp_path):
    blocker = tmp_path / "results"
    blocker.write_text("x")
    code, _, err = run_audit(capsys, tmp_path, out=blocker)
    assert code == 2 and "not a folder" in err
    assert blocker.read_text() == "x"


@pytest.mark.parametrize("where", ["/proc/self/joint-audit-out", "/proc/self", "/proc/version/out"])
def test_out_folder_in_proc_is_a_clear_error(capsys, tmp_path, where):
    code, _, err = run_audit(capsys, tmp_path, out=Path(where))
    assert code == 2 and where in err


def test_an_output_name_taken_by_a_folder_leaves_no_partial_output(capsys, tmp_path):
    out = tmp_path / "out"
    (out / "issues.html").mkdir(parents=True)
    code, _, err = run_audit(capsys, tmp_path, out=out)
    assert code == 2 and "issues.html" in err and "folder" in err
    assert _written(out) == []  # not results.json and connections.csv without the rest


def test_a_rerun_into_the_same_folder_replaces_every_output(capsys, tmp_path):
    out = tmp_path / "out"
    assert run_audit(capsys, tmp_path, "--config", str(CONFIG), out=out)[0] == 1
    for name in OUTPUTS:
        (out / name).write_text("stale")
    code, _, _ = run_audit(capsys, tmp_path, "--config", str(CONFIG), out=out)
    assert code == 1 and _written(out) == OUTPUTS
    assert all((out / name).read_bytes() != b"stale" for name in OUTPUTS)
    assert json.loads((out / "results.json").read_text())["summary"]["joints"] == 119


# --------------------------------------------------------------------------------------------
# baseline (an earlier results.json)

BASELINES = {
    "not json": ("baseline.json", "this is not json {"),
    "empty": ("baseline.json", ""),
    "a list": ("baseline.json", "[1, 2, 3]"),
    "no joints": ("baseline.json", '{"tool": {"name": "joint-audit"}}'),
    "joint without id": ("baseline.json", '{"joints": [{"status": "fail"}]}'),
    "joint id a number": ("baseline.json", '{"joints": [{"id": 5, "status": "fail"}]}'),
    "nested too deeply": ("baseline.json", "[" * 100_000 + "]" * 100_000),
    "integer too long": ("baseline.json", '{"joints": [{"id": "J", "status": "fail", "beam": ' + "9" * 5000 + "}]}"),
    "binary": ("baseline.json", b"\xff\xfe\x00\x01 binary"),
    "xml with an external entity": ("baseline.json", None),
}


@pytest.mark.parametrize("case", sorted(BASELINES))
def test_malformed_baseline_is_a_clear_error_naming_the_file(capsys, tmp_path, case):
    name, body = BASELINES[case]
    p = tmp_path / name
    if body is None:
        body = _xml_with_entity(tmp_path)
    p.write_bytes(body if isinstance(body, bytes) else body.encode())
    code, out, err = run_audit(capsys, tmp_path, "--baseline", str(p))
    assert code == 2 and "baseline" in err and str(p) in err
    assert SECRET not in out + err
    assert _written(tmp_path / "out") == []


def test_baseline_with_odd_but_valid_joints_is_accepted(capsys, tmp_path):
    p = tmp_path / "baseline.json"
    p.write_text(json.dumps({"joints": [{"id": "J-gone\u0007<b>", "status": "fail", "beam": {"x": [1]},
                                         "end": None, "support": 5}]}))
    code, _, _ = run_audit(capsys, tmp_path, "--baseline", str(p))
    assert code in (0, 1)
    doc = json.loads((tmp_path / "out" / "results.json").read_text())
    assert [r["id"] for r in doc["baseline_removed"]] == ["J-gone\u0007<b>"]


# --------------------------------------------------------------------------------------------
# schedules (connection and demand)

HEADER = ("match,value,end,plate_thickness,plate_depth,plate_width,bolt_size,bolt_grade,rows,lines,pitch,gauge,"
          "plate_end_edge,plate_side_edge,beam_end_edge,beam_top_edge,a,weld_leg,weld_electrode")
ROW = "section,310UB40.4,both,10,210,105,M20,8.8,3,1,70,0,35,45,45,70,60,8,E48XX"


def _conn(**fields: object) -> str:
    values = dict(zip(HEADER.split(","), ROW.split(",")))
    values.update({k: str(v) for k, v in fields.items()})
    return HEADER + "\n" + ",".join(values[c] for c in HEADER.split(",")) + "\n"


SCHEDULES = {
    "empty csv": ("s.csv", "", "empty"),
    "binary": ("s.csv", b"\xff\xfe\x00 binary", "UTF-8"),
    "unknown column": ("s.csv", "\x00\x01junk,,\n", "unknown column"),
    "plate thickness a word": ("s.csv", _conn(plate_thickness="ten"), "plate_thickness"),
    "plate thickness nan": ("s.csv", _conn(plate_thickness="nan"), "plate_thickness"),
    "plate thickness zero": ("s.csv", _conn(plate_thickness=0), "plate_thickness"),
    "pitch infinite": ("s.csv", _conn(pitch="inf"), "pitch"),
    "pitch zero with three rows": ("s.csv", _conn(pitch=0), "pitch"),
    "plate depth 1e308": ("s.csv", _conn(plate_depth="1e308"), "plate_depth"),
    "a million rows of bolts": ("s.csv", _conn(rows=100_000, lines=1000), "rows"),
    "negative rows": ("s.csv", _conn(rows=-3), "rows"),
    "bolt size M0": ("s.csv", _conn(bolt_size="M0"), "bolt size"),
    "bolt size negative": ("s.csv", _conn(bolt_size="M-20"), "bolt size"),
    "bolt size nan": ("s.csv", _conn(bolt_size="Mnan"), "bolt size"),
    "bolt size 1e308": ("s.csv", _conn(bolt_size="M1e308"), "bolt size"),
    "bad match kind": ("s.csv", _conn(match="colour"), "match"),
    "bad depth range": ("s.csv", _conn(match="depth", value="deep"), "depth range"),
    "more cells than columns": ("s.csv", _conn() + ",".join(["1"] * 25) + "\n", "more values"),
    "demand shear a word": ("d.csv", "beam,end,V_kN\nL2-G-B12,start,lots\n", "V_kN"),
    "demand shear nan": ("d.csv", "beam,end,V_kN\nL2-G-B12,start,nan\n", "V_kN"),
    "demand shear overflows in N": ("d.csv", "beam,end,V_kN\nL2-G-B12,both,1e308\n", "V_kN"),
    "demand unknown end": ("d.csv", "beam,end,V_kN\nL2-G-B12,middle,50\n", "end"),
    "demand duplicate key": ("d.csv", "beam,end,V_kN\nL2-G-B12,start,50\nL2-G-B12,both,60\n", "duplicate"),
    "toml not toml": ("d.toml", "[[demand]\nbeam = 1", "TOML"),
    "toml nested too deeply": ("d.toml", "x = " + "[" * 5000 + "]" * 5000 + "\n", "TOML"),
    "toml wrong types": ("d.toml", "[[demand]]\nbeam = 5\nend = 'start'\nV_kN = 1\n", "beam"),
    "toml infinite shear": ("d.toml", "[[demand]]\nbeam = 'x'\nend = 'start'\nV_kN = inf\n", "V_kN"),
    "toml connection incomplete": ("c.toml", "[[connection]]\nmatch = 'tag'\n", "missing"),
    "spreadsheet": ("s.xlsx", b"PK\x03\x04 not really", "csv"),
    "xml with an external entity": ("s.xml", None, ".xml"),
}


def _xml_with_entity(tmp_path: Path) -> str:
    secret = tmp_path / "secret.txt"
    secret.write_text(SECRET)
    return (f'<?xml version="1.0"?>\n<!DOCTYPE s [<!ENTITY leak SYSTEM "file://{secret}">]>\n'
            f"<schedule>&leak;</schedule>\n")


@pytest.mark.parametrize("case", sorted(SCHEDULES))
def test_malformed_schedule_is_a_clear_error_naming_the_file(capsys, tmp_path, case):
    name, body, words = SCHEDULES[case]
    p = tmp_path / name
    if body is None:
        body = _xml_with_entity(tmp_path)
    p.write_bytes(body if isinstance(body, bytes) else body.encode())
    code, out, err = run_audit(capsys, tmp_path, "--config", str(CONFIG), "--schedule", str(p))
    assert code == 2, err
    assert str(p) in err and words.lower() in err.lower(), err
    assert SECRET not in out + err
    assert _written(tmp_path / "out") == []


def test_schedule_that_is_a_folder_is_a_clear_error(capsys, tmp_path):
    code, _, err = run_audit(capsys, tmp_path, "--schedule", str(tmp_path))
    assert code == 2 and "not a file" in err


def test_schedule_with_only_a_header_is_accepted_and_changes_nothing(capsys, tmp_path):
    p = tmp_path / "s.csv"
    p.write_text(HEADER + "\n")
    code, _, _ = run_audit(capsys, tmp_path, "--config", str(CONFIG), "--schedule", str(p))
    assert code == 1
    doc = json.loads((tmp_path / "out" / "results.json").read_text())
    assert not [j for j in doc["joints"] if (j["connection"] or {}).get("source") == "scheduled"]


# --------------------------------------------------------------------------------------------
# config

CONFIGS = {
    "not toml": ("this is = not [toml", "TOML"),
    "nested too deeply": ("a = " + "[" * 5000 + "]" * 5000 + "\n", "TOML"),
    "unknown key": ("colour = 'red'\n", "colour"),
    "wrong type": ("[support]\npolicy = 5\n", "support.policy"),
    "unknown policy": ("[support]\npolicy = 'brave'\n", "support.policy"),
    "unknown code": ("code = 'nosuchcode'\n", "nosuchcode"),
    "capacity fraction nan": ("[demand]\ncapacity_fraction = nan\n", "capacity_fraction"),
    "empty demand order": ("[demand]\norder = []\n", "demand.order"),
    "demand order numbers": ("[demand]\norder = [1, 2]\n", "demand.order"),
    "joint gap nan": ("[tolerances]\njoint_gap_mm = nan\n", "joint_gap_mm"),
    "joint gap infinite": ("[tolerances]\njoint_gap_mm = inf\n", "joint_gap_mm"),
    "joint gap a million km": ("[tolerances]\njoint_gap_mm = 1e12\n", "joint_gap_mm"),
    "weld leg nan": ("[connections]\nweld_leg_mm = nan\n", "weld_leg_mm"),
    "weld leg negative": ("[connections]\nweld_leg_mm = -6\n", "weld_leg_mm"),
    "area load infinite": ("[[demand.area_loads]]\nstorey = '*'\ndead_kPa = inf\nlive_kPa = 1\n", "dead_kPa"),
    "area load not a table": ("[demand]\narea_loads = [1, 2]\n", "area_loads"),
    "shear key without a dot": ("[demand]\nstart_shear = 'nodot'\n", "start_shear"),
    "binary": (b"\xff\xfe\x00 binary", "UTF-8"),
    "xml with an external entity": (None, "TOML"),
}


@pytest.mark.parametrize("case", sorted(CONFIGS))
def test_malformed_config_is_a_clear_error(capsys, tmp_path, case):
    body, words = CONFIGS[case]
    p = tmp_path / "config.toml"
    if body is None:
        body = _xml_with_entity(tmp_path)
    p.write_bytes(body if isinstance(body, bytes) else body.encode())
    code, out, err = run_audit(capsys, tmp_path, "--config", str(p))
    assert code == 2, err
    assert words in err, err
    assert SECRET not in out + err
    assert _written(tmp_path / "out") == []


def test_malformed_config_is_refused_by_show_config_and_inspect_too(capsys, tmp_path):
    p = tmp_path / "config.toml"
    p.write_text("[tolerances]\njoint_gap_mm = 1e12\n")
    for argv in (["audit", "--show-config", "--config", str(p)], ["inspect", str(DEMO), "--joints", "--config", str(p)]):
        code = main(argv)
        _, err = capsys.readouterr()
        assert code == 2 and "joint_gap_mm" in err and err.count("\n") == 1


# --------------------------------------------------------------------------------------------
# as a separate process: only the one line reaches stderr


def _process(*argv: str) -> subprocess.CompletedProcess:
    env = {k: v for k, v in os.environ.items() if k != "JOINT_AUDIT_DEBUG"}
    return subprocess.run([sys.executable, "-m", "engine.cli", *argv], cwd=REPO, capture_output=True,
                          text=True, env=env, timeout=120)


def test_process_random_bytes_model_exits_2_with_one_line(tmp_path):
    p = tmp_path / "random.ifc"
    p.write_bytes(bytes((i * 7919) % 251 for i in range(5000)))
    res = _process("audit", str(p), "--out", str(tmp_path / "out"))
    assert res.returncode == 2 and res.stdout == ""
    assert res.stderr.count("\n") == 1 and res.stderr.startswith("joint-audit: error: ")
    assert not (tmp_path / "out").exists()


def test_process_deeply_nested_baseline_exits_2_with_one_line(tmp_path):
    p = tmp_path / "baseline.json"
    p.write_text("[" * 100_000 + "]" * 100_000)
    res = _process("audit", str(DEMO), "--baseline", str(p), "--out", str(tmp_path / "out"))
    assert res.returncode == 2 and res.stderr.count("\n") == 1 and "baseline" in res.stderr
    assert "Traceback" not in res.stderr and not (tmp_path / "out").exists()


def test_process_unwritable_out_exits_2_with_one_line(tmp_path):
    blocker = tmp_path / "file"
    blocker.write_text("x")
    res = _process("audit", str(DEMO), "--out", str(blocker / "out"))
    assert res.returncode == 2 and res.stderr.count("\n") == 1 and "output folder" in res.stderr


def test_process_damaged_model_with_hostile_names_has_a_clean_stderr(tmp_path):
    model = ifcopenshell.open(str(DEMO))
    for i, el in enumerate(model.by_type("IfcBeam")):
        el.Name = "\x07\x1b[2J<b>&" + "x" * (i * 500)
    for p in model.by_type("IfcCartesianPoint")[::9]:
        p.Coordinates = tuple(1e300 for _ in p.Coordinates)
    path = tmp_path / "hostile.ifc"
    model.write(str(path))
    lines = path.read_bytes().split(b"\n")
    path.write_bytes(b"\n".join(ln for ln in lines if b"IFCOWNERHISTORY(" not in ln))
    before = _sha(path)
    res = _process("audit", str(path), "--out", str(tmp_path / "out"))
    assert res.returncode in (0, 1), res.stderr
    assert res.stderr == ""  # no traceback, no numeric warnings, no parser chatter
    assert _sha(path) == before
    doc = json.loads((tmp_path / "out" / "results.json").read_text())
    assert any(w["message"].startswith("the file is damaged") for w in doc["warnings"])
