"""Bad input to the reader raises the project's errors with one clear line (the CLI's exit 2)."""

from __future__ import annotations

import zipfile

import pytest

from engine.errors import BadInputError, JointAuditError, UnsupportedSchemaError
from ifc_io import open_model, read_frame

MINIMAL = """ISO-10303-21;
HEADER;
FILE_DESCRIPTION(('ViewDefinition [CoordinationView]'),'2;1');
FILE_NAME('t.ifc','2024-01-01T00:00:00',(''),(''),'','','');
FILE_SCHEMA(('{schema}'));
ENDSEC;
DATA;
#1=IFCPROJECT('0YvctVUKr0kugbFTf53O9L',$,'P',$,$,$,$,$,$);
ENDSEC;
END-ISO-10303-21;
"""


def _raises(path, error, words):
    for fn in (open_model, read_frame):
        with pytest.raises(error) as info:
            fn(path)
        msg = str(info.value)
        assert "\n" not in msg, msg
        assert isinstance(info.value, JointAuditError)
        for w in words:
            assert w in msg.lower(), msg


def test_missing_file(tmp_path):
    _raises(tmp_path / "nope.ifc", BadInputError, ["not found", "nope.ifc"])


def test_directory(tmp_path):
    _raises(tmp_path, BadInputError, ["directory"])


def test_empty_file(tmp_path):
    p = tmp_path / "empty.ifc"
    p.write_bytes(b"")
    _raises(p, BadInputError, ["empty"])


def test_plain_text(tmp_path):
    p = tmp_path / "notes.ifc"
    p.write_text("these are my notes, not a model\n", encoding="utf-8")
    _raises(p, BadInputError, ["not an ifc file", "iso-10303-21"])


def test_truncated_real_file(tmp_path, shared_models):
    data = (shared_models / "small-steel-frame-ifc2x3-mm.ifc").read_bytes()
    p = tmp_path / "half.ifc"
    p.write_bytes(data[: len(data) // 2])
    _raises(p, BadInputError, ["truncated"])


def test_truncated_in_the_header(tmp_path):
    p = tmp_path / "head.ifc"
    p.write_text("ISO-10303-21;\nHEADER;\nFILE_DESCRIPTION(('x'),'2;1');\n", encoding="utf-8")
    _raises(p, BadInputError, ["file_schema"])


@pytest.mark.parametrize("schema", ["IFC2X2_FINAL", "IFC5", "AP214", ""])
def test_unknown_schema(tmp_path, schema):
    p = tmp_path / "old.ifc"
    p.write_text(MINIMAL.format(schema=schema), encoding="utf-8")
    _raises(p, UnsupportedSchemaError, ["schema", "ifc2x3, ifc4, ifc4x3"])


def test_zip_archive(tmp_path):
    p = tmp_path / "model.ifczip"
    with zipfile.ZipFile(p, "w") as z:
        z.writestr("model.ifc", MINIMAL.format(schema="IFC4"))
    _raises(p, BadInputError, ["zip"])


def test_xml(tmp_path):
    p = tmp_path / "model.ifcxml"
    p.write_text('<?xml version="1.0"?><ifcXML/>', encoding="utf-8")
    _raises(p, BadInputError, ["xml"])


def test_unsupported_schema_is_a_bad_input_error():
    assert issubclass(UnsupportedSchemaError, BadInputError)


@pytest.mark.parametrize("schema", ["IFC2X3", "IFC4", "IFC4X3_ADD2"])
def test_minimal_valid_files_open(tmp_path, schema):
    p = tmp_path / "ok.ifc"
    p.write_text(MINIMAL.format(schema=schema), encoding="utf-8")
    model = open_model(p)
    assert model.by_type("IfcProject")
    frame = read_frame(p)
    assert frame.members == ()
    assert frame.schema == schema.split("_")[0]


def test_read_frame_rejects_other_objects():
    with pytest.raises(BadInputError, match="path or an ifcopenshell.file"):
        read_frame(42)


def test_garbage_in_the_data_section(tmp_path):
    p = tmp_path / "garbled.ifc"
    garbage = "#2=IFCNOTANENTITY(1,2,3);\n#3 garbage here (((\nENDSEC;\nEND"
    p.write_text(MINIMAL.format(schema="IFC4").replace("ENDSEC;\nEND", garbage), encoding="utf-8")
    _raises(p, BadInputError, ["could not be parsed", "garbled.ifc"])
