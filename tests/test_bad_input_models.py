"""Bad model files through `joint-audit audit`: every one ends with exit 0/1 and clear warnings in
results.json, or with exit 2 and one clear line on stderr — never a traceback, never an internal
error (exit 3), never a partial output, never a change to the input.

The variants are copies of real files (the demo IFC4 model of our invented project, and the real
small steel frame in ``shared/models``) edited in ``tmp_path`` with ifcopenshell or as STEP text.
"""

from __future__ import annotations

import collections
import hashlib
import io
import json
import random
import re
import warnings
import zipfile
from pathlib import Path

import ifcopenshell
import pytest
from lxml import etree

from engine.cli import main

SAMPLES = Path(__file__).resolve().parents[1] / "samples"
DEMO = SAMPLES / "demo-ifc4-mm.ifc"
SMALL = "small-steel-frame-ifc2x3-mm.ifc"


def _sha(p: Path) -> str:
    return hashlib.sha256(p.read_bytes()).hexdigest()


def _no_part_files(root: Path) -> None:
    left = [p for p in root.rglob("*.part")]
    assert not left, f"temporary files left behind: {left}"


def audit(capsys, tmp_path: Path, model: Path, *extra: str, out: Path | None = None):
    """Run ``audit`` in-process and check the contract that holds for every input.

    Returns ``(exit code, stdout, stderr, results document or None)``."""
    out = out or tmp_path / "out"
    inputs = [model] + [Path(a) for a in extra if Path(a).is_file()]
    before = {p: _sha(p) for p in inputs if p.is_file()}
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        code = main(["audit", str(model), "--out", str(out), *extra])
    stdout, stderr = capsys.readouterr()
    assert code in (0, 1, 2), f"exit {code}: {stderr}"
    assert "Traceback" not in stderr and "internal error" not in stderr, stderr
    numeric = [w for w in caught if issubclass(w.category, RuntimeWarning)]
    assert not numeric, f"numeric warnings escaped: {[str(w.message) for w in numeric]}"
    assert {p: _sha(p) for p in before} == before, "an input file was changed"
    _no_part_files(tmp_path)
    doc = None
    if code == 2:
        assert stderr.startswith("joint-audit: error: ") and stderr.count("\n") == 1, stderr
        assert stdout == ""
        assert not out.exists() or not any(out.iterdir()), "output written after a bad-input error"
    else:
        assert stderr == "", stderr
        doc = json.loads((out / "results.json").read_text(encoding="utf-8"))
        names = sorted(p.name for p in out.iterdir())
        assert names == sorted(["connections.csv", "issues.bcf", "issues.html", "results.json",
                                f"{model.stem}.audited.ifc"])
    return code, stdout, stderr, doc


def _messages(doc) -> list[str]:
    return [w["message"] for w in doc["warnings"]]


def _edited(src: Path, dest: Path, edit) -> Path:
    model = ifcopenshell.open(str(src))
    edit(model)
    model.write(str(dest))
    return dest


# --------------------------------------------------------------------------------------------
# not an IFC file at all


def test_empty_file_is_a_clear_error(capsys, tmp_path):
    p = tmp_path / "empty.ifc"
    p.write_bytes(b"")
    code, _, err, _ = audit(capsys, tmp_path, p)
    assert code == 2 and "empty" in err


@pytest.mark.parametrize("seed", [1, 2, 3])
def test_random_bytes_are_a_clear_error(capsys, tmp_path, seed):
    p = tmp_path / "random.ifc"
    p.write_bytes(random.Random(seed).randbytes(4096))
    code, _, err, _ = audit(capsys, tmp_path, p)
    assert code == 2 and "not an IFC file" in err


@pytest.mark.parametrize("data", [b"\x00" * 4096, b"\x89PNG\r\n\x1a\n" + bytes(range(256)) * 8,
                                  b"\xef\xbb\xbf" + bytes(range(256))])
def test_binary_data_is_a_clear_error(capsys, tmp_path, data):
    p = tmp_path / "binary.ifc"
    p.write_bytes(data)
    code, _, err, _ = audit(capsys, tmp_path, p)
    assert code == 2 and "not an IFC file" in err


def test_binary_data_section_is_read_as_an_empty_model_with_a_warning(capsys, tmp_path):
    demo = DEMO.read_bytes()
    head = demo[: demo.index(b"DATA;") + 5]
    p = tmp_path / "binary-data.ifc"
    p.write_bytes(head + b"\n" + random.Random(4).randbytes(3000) + b"\nENDSEC;\nEND-ISO-10303-21;\n")
    code, _, _, doc = audit(capsys, tmp_path, p)
    assert code in (0, 1)
    assert doc["summary"]["joints"] == 0
    assert any("no beams" in m for m in _messages(doc))


def test_binary_bytes_inside_the_data_section_are_reported_as_damage(capsys, tmp_path):
    demo = DEMO.read_bytes()
    cut = demo.index(b"\n#", len(demo) // 2) + 1
    p = tmp_path / "binary-inside.ifc"
    p.write_bytes(demo[:cut] + b"\x00\xff\xfe" * 50 + demo[cut:])
    code, _, _, doc = audit(capsys, tmp_path, p)
    assert code in (0, 1)
    assert any(m.startswith("the file is damaged") for m in _messages(doc))


def test_xml_model_with_external_entity_is_refused_and_the_entity_never_read(capsys, tmp_path):
    secret = tmp_path / "secret.txt"
    secret.write_text("KESTREL-SECRET-7731")
    p = tmp_path / "model.ifc"
    p.write_text(f'<?xml version="1.0"?>\n<!DOCTYPE ifc [<!ENTITY leak SYSTEM "file://{secret}">]>\n'
                 f"<ifcXML><name>&leak;</name></ifcXML>\n")
    code, out, err, _ = audit(capsys, tmp_path, p)
    assert code == 2 and "XML" in err
    assert "KESTREL-SECRET" not in out + err


# --------------------------------------------------------------------------------------------
# a STEP file cut short, or with a schema we do not read


@pytest.mark.parametrize("fraction", [0.002, 0.05, 0.5, 0.95, 0.9999])
def test_truncated_file_is_a_clear_error(capsys, tmp_path, shared_models, fraction):
    data = (shared_models / SMALL).read_bytes()
    p = tmp_path / "cut.ifc"
    p.write_bytes(data[: int(len(data) * fraction)])
    code, _, err, _ = audit(capsys, tmp_path, p)
    assert code == 2
    assert "truncated" in err or "FILE_SCHEMA" in err


def test_file_cut_in_the_middle_of_its_end_marker_is_a_clear_error(capsys, tmp_path):
    demo = DEMO.read_bytes()
    p = tmp_path / "cut-end.ifc"
    p.write_bytes(demo[: demo.rindex(b"END-ISO") + 7])
    code, _, err, _ = audit(capsys, tmp_path, p)
    assert code == 2 and "truncated" in err


@pytest.mark.parametrize("fraction", [0.3, 0.6])
def test_truncated_file_closed_again_reports_the_missing_entities(capsys, tmp_path, fraction):
    data = DEMO.read_bytes()
    cut = data[: int(len(data) * fraction)].rsplit(b"\n", 1)[0]
    p = tmp_path / "cut-closed.ifc"
    p.write_bytes(cut + b"\nENDSEC;\nEND-ISO-10303-21;\n")
    code, _, _, doc = audit(capsys, tmp_path, p)
    assert code in (0, 1)
    damaged = [m for m in _messages(doc) if m.startswith("the file is damaged")]
    assert damaged and "not found" in damaged[0]


@pytest.mark.parametrize("schema", ["IFC2X2_FINAL", "IFC5", "CONFIG_CONTROL_DESIGN"])
def test_unknown_schema_string_is_a_clear_error(capsys, tmp_path, schema):
    p = tmp_path / "schema.ifc"
    p.write_bytes(DEMO.read_bytes().replace(b"FILE_SCHEMA(('IFC4'))", f"FILE_SCHEMA(('{schema}'))".encode()))
    code, _, err, _ = audit(capsys, tmp_path, p)
    assert code == 2 and schema in err and "IFC2X3, IFC4, IFC4X3" in err


def test_real_number_out_of_range_is_a_clear_parse_error(capsys, tmp_path):
    text = re.sub(rb"IFCCARTESIANPOINT\(\(([-0-9.E]+),", rb"IFCCARTESIANPOINT((1.E400,", DEMO.read_bytes(), count=5)
    p = tmp_path / "overflow.ifc"
    p.write_bytes(text)
    code, _, err, _ = audit(capsys, tmp_path, p)
    assert code == 2 and "could not be parsed" in err


# --------------------------------------------------------------------------------------------
# parseable models with missing, broken or hostile content


def test_model_with_no_beams_says_there_is_nothing_to_audit(capsys, tmp_path):
    def edit(m):
        for b in m.by_type("IfcBeam"):
            m.remove(b)

    code, _, _, doc = audit(capsys, tmp_path, _edited(DEMO, tmp_path / "no-beams.ifc", edit))
    assert code == 0
    s = doc["summary"]
    assert s["pass"] == s["fail"] == s["needs-design"] == s["incomplete"] == 0  # only column splices remain
    assert all(j["kind"] == "splice" for j in doc["joints"])
    assert any("no beams" in m for m in _messages(doc))


def test_beams_without_representation_are_skipped_with_a_warning_each(capsys, tmp_path):
    gids = []

    def edit(m):
        for b in m.by_type("IfcBeam")[:4]:
            b.Representation = None
            gids.append(b.GlobalId)

    code, _, _, doc = audit(capsys, tmp_path, _edited(DEMO, tmp_path / "no-rep.ifc", edit))
    assert code in (0, 1)
    warned = {w["global_id"] for w in doc["warnings"] if "axis not found" in w["message"]}
    assert set(gids) <= warned
    assert not {j["beam"] for j in doc["joints"]} & set(gids)


def test_beams_without_profile_get_unknown_sections_with_warnings(capsys, tmp_path):
    gids = []

    def edit(m):
        for rel in m.by_type("IfcRelAssociatesMaterial"):
            m.remove(rel)
        for rel in m.by_type("IfcRelDefinesByType"):
            m.remove(rel)
        for b in m.by_type("IfcBeam")[:4]:
            b.Name, b.ObjectType = "unnamed beam", None
            body = [r for r in b.Representation.Representations if r.RepresentationIdentifier == "Body"]
            b.Representation.Representations = tuple(
                r for r in b.Representation.Representations if r.RepresentationIdentifier != "Body")
            assert body
            gids.append(b.GlobalId)

    code, _, _, doc = audit(capsys, tmp_path, _edited(DEMO, tmp_path / "no-profile.ifc", edit))
    assert code in (0, 1)
    unknown = {w["global_id"] for w in doc["warnings"] if "section unknown" in w["message"]}
    assert set(gids) <= unknown


def test_beams_without_material_get_the_default_grade_with_warnings(capsys, tmp_path):
    def edit(m):
        for rel in m.by_type("IfcRelAssociatesMaterial"):
            m.remove(rel)

    code, _, _, doc = audit(capsys, tmp_path, _edited(DEMO, tmp_path / "no-material.ifc", edit))
    assert code in (0, 1)
    assumed = [m for m in _messages(doc) if "no material is associated" in m and "assumed" in m]
    assert len(assumed) >= 59  # one per beam at least (59 IfcBeam in the demo)


def test_zero_length_beams_are_skipped_with_a_warning(capsys, tmp_path):
    gids = []

    def edit(m):
        for b in m.by_type("IfcBeam")[:3]:
            for rep in b.Representation.Representations:
                for item in rep.Items:
                    if item.is_a("IfcPolyline"):
                        item.Points = (item.Points[0], item.Points[0])
                    if item.is_a("IfcExtrudedAreaSolid"):
                        item.Depth = 1e-9
            gids.append(b.GlobalId)

    code, _, _, doc = audit(capsys, tmp_path, _edited(DEMO, tmp_path / "zero-length.ifc", edit))
    assert code in (0, 1)
    assert set(gids) <= {w["global_id"] for w in doc["warnings"] if "zero-length" in w["message"]}


@pytest.mark.parametrize("factor", [1e300, 1e20])
def test_huge_coordinates_skip_the_elements_with_warnings(capsys, tmp_path, factor):
    def edit(m):
        for p in m.by_type("IfcCartesianPoint")[::7]:
            p.Coordinates = tuple(c * factor if c else factor for c in p.Coordinates)

    code, _, _, doc = audit(capsys, tmp_path, _edited(DEMO, tmp_path / "huge.ifc", edit))
    assert code in (0, 1)
    assert any("corrupt placement or geometry" in m for m in _messages(doc))
    for j in doc["joints"]:
        assert all(v is None or abs(v) < 1e11 for v in j["location_mm"])


def test_nan_in_the_step_text_is_reported_as_damage(capsys, tmp_path):
    p = tmp_path / "nan.ifc"
    p.write_bytes(DEMO.read_bytes().replace(b"IFCCARTESIANPOINT((0.,0.,0.))", b"IFCCARTESIANPOINT((NaN,NaN,NaN))"))
    assert b"NaN" in p.read_bytes()
    code, _, _, doc = audit(capsys, tmp_path, p)
    assert code in (0, 1)
    assert any(m.startswith("the file is damaged") and "NaN" in m for m in _messages(doc))


def test_zero_direction_vectors_do_not_leak_nan_into_the_results(capsys, tmp_path):
    def edit(m):
        for d in m.by_type("IfcDirection")[::5]:
            d.DirectionRatios = tuple(0.0 for _ in d.DirectionRatios)

    code, _, _, doc = audit(capsys, tmp_path, _edited(DEMO, tmp_path / "zero-dirs.ifc", edit))
    assert code in (0, 1)
    text = (tmp_path / "out" / "results.json").read_text()
    assert "NaN" not in text and "Infinity" not in text


def test_duplicate_global_ids_are_warned_and_outputs_stay_consistent(capsys, tmp_path):
    def edit(m):
        beams = m.by_type("IfcBeam")
        for b in beams[1:5]:
            b.GlobalId = beams[0].GlobalId

    code, _, _, doc = audit(capsys, tmp_path, _edited(DEMO, tmp_path / "dup-gid.ifc", edit))
    assert code in (0, 1)
    assert any("GlobalId used by more than one member" in m for m in _messages(doc))
    ids = collections.Counter(j["id"] for j in doc["joints"])
    assert all(n == 1 for n in ids.values()), "duplicate joint ids in results.json"
    names = zipfile.ZipFile(tmp_path / "out" / "issues.bcf").namelist()
    assert len(names) == len(set(names))


def test_duplicate_entity_names_in_the_step_text_are_reported_as_damage(capsys, tmp_path):
    p = tmp_path / "dup-entity.ifc"
    p.write_bytes(DEMO.read_bytes().replace(b"\n#10=", b"\n#9=", 1))
    code, _, _, doc = audit(capsys, tmp_path, p)
    assert code in (0, 1)
    assert any(m.startswith("the file is damaged") for m in _messages(doc))


@pytest.mark.parametrize("entity", [b"IFCCARTESIANPOINT(", b"IFCPROJECT(", b"IFCSIUNIT(", b"PROFILEDEF(",
                                    b"IFCOWNERHISTORY("])
def test_dangling_references_are_reported_not_crashed_on(capsys, tmp_path, entity):
    lines = DEMO.read_bytes().split(b"\n")
    kept = [ln for ln in lines if entity not in ln]
    assert len(kept) < len(lines)
    p = tmp_path / "dangling.ifc"
    p.write_bytes(b"\n".join(kept))
    code, _, _, doc = audit(capsys, tmp_path, p)
    assert code in (0, 1)
    damaged = [m for m in _messages(doc) if m.startswith("the file is damaged")]
    assert damaged and "not found" in damaged[0]


# (a NUL is left out: IfcOpenShell itself ends a string at a NUL when it reads the file back)
NASTY = ["<script>alert('joint')</script> & ]]> \"quoted\"", "bell\x07 escape\x1b[31m tab\t vt\x0b del\x7f",
         "Ł" * 20 + "N" * 100_000]


def test_long_names_markup_and_control_characters_are_carried_safely(capsys, tmp_path):
    def edit(m):
        for i, el in enumerate(m.by_type("IfcProduct")):
            el.Name = NASTY[i % 3]
            if el.is_a("IfcBeam"):
                el.Tag = "\x01<tag>&" + (el.Tag or "") if i % 2 else None

    code, _, _, doc = audit(capsys, tmp_path, _edited(DEMO, tmp_path / "nasty-names.ifc", edit))
    assert code in (0, 1)
    out = tmp_path / "out"
    names = {j["beam_name"] for j in doc["joints"]}
    assert set(NASTY) <= names  # carried whole, the 100 000-character one included
    assert any(n.startswith("\x01<tag>&") for n in names)
    html = (out / "issues.html").read_text(encoding="utf-8")
    assert "<script>alert(" not in html and "&lt;script&gt;alert(" in html
    with zipfile.ZipFile(out / "issues.bcf") as z:
        for name in z.namelist():
            if name.endswith((".bcf", ".bcfv", ".version", ".bcfp")):
                etree.fromstring(z.read(name))  # well-formed XML despite the control characters
    copy = ifcopenshell.open(str(out / "nasty-names.audited.ifc"))
    assert len(copy.by_type("IfcBeam")) == 59
    rows = (out / "connections.csv").read_text(encoding="utf-8")
    assert rows.count("\n") >= doc["summary"]["joints"]


def test_a_bad_model_given_as_a_folder_of_the_same_name_writes_nothing(capsys, tmp_path):
    folder = tmp_path / "model.ifc"
    folder.mkdir()
    code, _, err, _ = audit(capsys, tmp_path, folder)
    assert code == 2 and "directory" in err
    assert list(io.StringIO(err)) == [err]


def test_names_and_ids_that_are_not_text_in_a_damaged_file_do_not_crash_the_writers(capsys, tmp_path):
    text = DEMO.read_bytes()
    project = re.search(rb"IFCPROJECT\('([^']*)',#5,'([^']*)'", text)
    assert project
    text = text.replace(project.group(0), b"IFCPROJECT(#1,#5,3.5")  # GlobalId a reference, Name a number
    text = re.sub(rb"(IFCBEAM\('[^']*',#5,)'[^']*'", rb"\1#1", text, count=5)  # beam Names -> a person
    text = re.sub(rb"IFCBEAM\('[^']*'", b"IFCBEAM($", text, count=2)  # two beams lose their GlobalId
    p = tmp_path / "odd-values.ifc"
    p.write_bytes(text)
    code, _, _, doc = audit(capsys, tmp_path, p)
    assert code in (0, 1)
    assert any("has no GlobalId" in m for m in _messages(doc))
    assert all(isinstance(j["beam_name"], str) for j in doc["joints"])
    with zipfile.ZipFile(tmp_path / "out" / "issues.bcf") as z:
        for name in z.namelist():
            if name.endswith((".bcf", ".bcfv", ".version", ".bcfp")):
                etree.fromstring(z.read(name))
