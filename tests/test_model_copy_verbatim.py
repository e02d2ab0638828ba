"""The audited copy of a model: when the model holds no earlier results and parsed cleanly, the
copy is the input file's own text, byte for byte, with the property sets inserted before the end
of its DATA section (ifc_io.write_psets_text.copy_input_verbatim); otherwise IfcOpenShell writes
the model. Checked on real files from other authoring tools (shared/models, see SOURCES.md)."""

from __future__ import annotations

import os
import re
from pathlib import Path

import ifcopenshell
import pytest

from engine.cli import main
from ifc_io.write_psets import read_joint_psets
from ifc_io.write_psets_text import copy_input_verbatim

ADDED = re.compile(rb"#\d+=IFC(PROPERTYSINGLEVALUE|PROPERTYSET|RELDEFINESBYPROPERTIES)\(")


def _audit(model: Path, out: Path) -> Path:
    assert main(["audit", str(model), "--out", str(out)]) in (0, 1)
    return out / f"{model.stem}.audited.ifc"


@pytest.mark.parametrize("name", ["small-steel-frame-ifc2x3-mm.ifc", "simple-frame-ifc4-m.ifc"])
def test_the_copy_keeps_the_input_text_and_only_adds_the_property_sets(shared_models, tmp_path, name):
    src = shared_models / name
    copy = _audit(src, tmp_path / "out")
    a, b = src.read_bytes(), copy.read_bytes()
    end = a.rfind(b"ENDSEC;")
    assert b.startswith(a[:end]) and b.endswith(a[end:])  # every byte of the input, in place
    added = b[end:len(b) - (len(a) - end)].splitlines()
    assert added and all(ADDED.match(line) for line in added), added[:3]
    model = ifcopenshell.open(str(copy))
    rels = [r for r in model.by_type("IfcRelDefinesByProperties")
            if (r.RelatingPropertyDefinition.Name or "").startswith("JointAudit_")]
    assert rels and len({r.RelatingPropertyDefinition.GlobalId for r in rels}) == len(rels)
    pset = read_joint_psets(model, rels[0].RelatedObjects[0])[rels[0].RelatingPropertyDefinition.Name]
    assert pset["Status"] in ("pass", "fail", "needs-design", "incomplete")  # read back as typed values


def test_a_model_with_earlier_results_is_written_out_without_them(shared_models, tmp_path):
    first = _audit(shared_models / "small-steel-frame-ifc2x3-mm.ifc", tmp_path / "one")
    second = _audit(first, tmp_path / "two")
    count = lambda p: len(re.findall(rb"IFCPROPERTYSET\('[^']*',#?\d*\$?,'JointAudit_", p.read_bytes()))
    assert count(second) == count(first) > 0  # replaced, not duplicated
    assert not second.read_bytes().startswith(first.read_bytes()[:first.read_bytes().rfind(b"ENDSEC;")])


def test_a_file_changed_since_it_was_opened_is_not_copied(shared_models, tmp_path):
    src = tmp_path / "m.ifc"
    src.write_bytes((shared_models / "simple-frame-ifc4-m.ifc").read_bytes())
    opened = os.stat(src)
    os.utime(src, ns=(opened.st_atime_ns, opened.st_mtime_ns + 1_000_000_000))
    target = tmp_path / "copy.ifc"
    target.write_bytes(b"")
    assert copy_input_verbatim(src, target, opened) is False
    assert target.read_bytes() == b""


def test_a_file_whose_end_is_not_plain_is_not_copied(shared_models, tmp_path):
    src = tmp_path / "m.ifc"
    text = (shared_models / "simple-frame-ifc4-m.ifc").read_bytes().rstrip()
    src.write_bytes(text + b"\n/* ENDSEC; a comment after the end */\n")
    target = tmp_path / "copy.ifc"
    target.write_bytes(b"")
    assert copy_input_verbatim(src, target, os.stat(src)) is False
    assert target.read_bytes() == b""
    plain = tmp_path / "plain.ifc"
    plain.write_bytes(text + b"\n")
    assert copy_input_verbatim(plain, target, os.stat(plain)) is True
    assert target.read_bytes() == plain.read_bytes()


def test_a_damaged_file_is_written_out_by_ifcopenshell_not_copied(tmp_path):
    from samples.synthetic import synthetic_frame, write_synthetic_ifc

    src = tmp_path / "frame.ifc"
    write_synthetic_ifc(synthetic_frame(40), src)
    text = src.read_text()
    line = next(ln for ln in text.splitlines() if "=IFCCARTESIANPOINT(" in ln)
    src.write_text(text.replace(line, line.split("=")[0] + "=IFCCARTESIANPOINT((0.,0.,0.)", 1))  # unterminated
    copy = _audit(src, tmp_path / "out")
    assert b"=IFCCARTESIANPOINT((0.,0.,0.)\n" not in copy.read_bytes()
