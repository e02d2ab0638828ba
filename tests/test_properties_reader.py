"""Property-based test (hypothesis) of the reader on damaged files: real models' STEP text with
random mutations (a line dropped, a number changed, an entity name changed, a reference pointed
elsewhere, a string replaced, the file truncated). ``ifc_io.open_model`` + ``ifc_io.read_frame``
either return a :class:`engine.model.Frame` or raise a project error (a ``JointAuditError``
subclass) — never another exception type (and never a crash of the interpreter: IfcOpenShell's
positional accessor used to be handed ``None`` for a dangling reference). A second test runs the
whole ``audit`` on mutated files: exit 0, 1 or 2, never an internal error.

Deterministic: ``derandomize=True`` and a modest ``max_examples``.
"""

from __future__ import annotations

import math
import re
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from engine.errors import JointAuditError
from engine.model import Frame
from ifc_io import open_model, read_frame

SAMPLES = Path(__file__).resolve().parents[1] / "samples"

_NUMBER = re.compile(rb"(?<![#\w.])-?\d+\.\d*(?:E[-+]?\d+)?|(?<=[(,])-?\d+(?=[,)])")
_ENTITY = re.compile(rb"=\s*(IFC[A-Z0-9]+)\(")
_REF = re.compile(rb"#\d+")
_STRING = re.compile(rb"'[^']*'")

NUMBERS = [b"0.", b"-0.", b"1.E300", b"-1.E300", b"1.E-300", b"123456789012.", b"7", b"-3", b"0", b"1.E400",
           b"$", b"*", b".T.", b"'text'", b"()"]
ENTITIES = [b"IFCBEAM", b"IFCCOLUMN", b"IFCCARTESIANPOINT", b"IFCDIRECTION", b"IFCPOLYLINE", b"IFCSIUNIT",
            b"IFCPROJECT", b"IFCWALL", b"IFCPLATE", b"IFCNOSUCHTHING", b"IFCRELAGGREGATES", b"IFCLOCALPLACEMENT"]
STRINGS = [b"$", b"*", b"''", b"'\\X2\\0007\\X0\\'", b"'" + b"x" * 5000 + b"'", b"#1", b"3.5", b".BEAM."]


def _data_lines(text: bytes) -> list[int]:
    """Start offsets of the lines of the DATA section that hold an entity instance."""
    return [m.start() + 1 for m in re.finditer(rb"\n#\d+\s*=", text)]


KINDS = ("drop line", "number", "entity", "reference", "string", "truncate")
plans = st.lists(st.tuples(st.sampled_from(KINDS), st.integers(0, 10 ** 6), st.integers(0, 10 ** 6)),
                 min_size=1, max_size=3)
"""A mutation plan: up to three (kind, where, what) steps; ``where`` and ``what`` pick, modulo the
number of candidates, the place in the file and the replacement."""


def mutate(text: bytes, plan) -> bytes:
    """``text`` with the plan's mutations applied in turn."""
    for kind, where, what in plan:
        if kind == "drop line":
            starts = _data_lines(text)
            if starts:
                s = starts[where % len(starts)]
                text = text[:s] + text[text.find(b"\n", s) + 1:]
            continue
        if kind == "truncate":
            text = text[: where % (len(text) + 1)]
            continue
        pattern, choices = {
            "number": (_NUMBER, NUMBERS),
            "entity": (_ENTITY, ENTITIES),
            "reference": (_REF, None),
            "string": (_STRING, STRINGS),
        }[kind]
        hits = list(pattern.finditer(text))
        if not hits:
            continue
        m = hits[where % len(hits)]
        if kind == "entity":
            new = b"=" + choices[what % len(choices)] + b"("
        elif kind == "reference":
            new = b"#" + str(what % 10 ** (1 + where % 6)).encode()
        else:
            new = choices[what % len(choices)]
        text = text[: m.start()] + new + text[m.end():]
    return text


def _read_or_refuse(path: Path) -> None:
    try:
        model = open_model(path)
        frame = read_frame(model)
    except JointAuditError as exc:
        assert str(exc) and "\n" not in str(exc)
        return
    assert isinstance(frame, Frame)
    for m in frame.members:
        assert all(math.isfinite(c) for c in m.start + m.end), m.global_id
        assert math.dist(m.start, m.end) > 0


SETTINGS = dict(derandomize=True, deadline=None,
                suppress_health_check=[HealthCheck.too_slow])


@pytest.mark.parametrize("name, examples", [
    ("beam-cardinal-points-ifc4x3.ifc", 120),
    ("small-steel-frame-ifc2x3-mm.ifc", 25),
    ("demo-ifc4-mm.ifc", 25),
], ids=["cardinal-points-ifc4x3", "small-frame-ifc2x3", "demo-ifc4"])
def test_mutated_model_reads_to_a_frame_or_a_project_error(name, examples, tmp_path_factory, shared_models):
    path = SAMPLES / name if name.startswith("demo") else shared_models / name
    original = path.read_bytes()
    work = tmp_path_factory.mktemp("mutated") / path.name

    @settings(max_examples=examples, **SETTINGS)
    @given(plan=plans)
    def check(plan) -> None:
        work.write_bytes(mutate(original, plan))
        _read_or_refuse(work)

    check()
    assert path.read_bytes() == original


@pytest.mark.parametrize("name, examples", [("demo-ifc4-mm.ifc", 30), ("beam-parametric-cross-section-ifc4x3.ifc", 20)],
                         ids=["demo-ifc4", "parametric-ifc4x3"])
def test_mutated_model_audits_to_exit_0_1_or_2_never_an_internal_error(name, examples, tmp_path_factory,
                                                                        shared_models, capsys):
    """The whole pipeline on mutated files: what the reader lets through (names that are numbers
    or references, GlobalIds that are missing, property values that are entities, ...) must not
    crash the joints, checks or writers; a refusal is one line and writes nothing."""
    from engine.cli import main

    original = (SAMPLES / name if name.startswith("demo") else shared_models / name).read_bytes()
    root = tmp_path_factory.mktemp("mutated-cli")
    work = root / name
    runs = iter(range(10 ** 6))

    @settings(max_examples=examples, **SETTINGS)
    @given(plan=plans)
    def check(plan) -> None:
        work.write_bytes(mutate(original, plan))
        out = root / f"out{next(runs)}"
        code = main(["audit", str(work), "--out", str(out)])
        stdout, stderr = capsys.readouterr()
        assert code in (0, 1, 2), stderr
        if code == 2:
            assert stderr.count("\n") == 1 and not out.exists()
        else:
            assert stderr == "" and (out / "results.json").is_file()

    check()
