"""Open an IFC model after checking the file ourselves.

``ifcopenshell.open`` raises various exception types for bad input, and accepts some partial files
without complaint, so :func:`open_model` checks the path, the STEP header, the schema and the end of
the file first, and turns every problem into one :class:`~engine.errors.BadInputError` (or
:class:`~engine.errors.UnsupportedSchemaError`) with a one-line message that says what to do.
"""

from __future__ import annotations

import os
import re
import weakref
from pathlib import Path

from engine.errors import BadInputError, UnsupportedSchemaError

__all__ = ["SUPPORTED_SCHEMAS", "open_model", "check_ifc_file", "normalise_schema", "parse_problems"]

SUPPORTED_SCHEMAS: tuple[str, ...] = ("IFC2X3", "IFC4", "IFC4X3")
"""The schema families joint-audit reads (IFC4X3 includes its addenda, e.g. IFC4X3_ADD2)."""

_HEAD_LIMIT = 4 * 1024 * 1024  # how far into the file the header may reach (long comment blocks)
_TAIL_BYTES = 4096
_SCHEMA_RE = re.compile(rb"FILE_SCHEMA\s*\(\s*\(\s*'([^']*)'", re.IGNORECASE)
_COMMENT_RE = re.compile(rb"/\*.*?\*/", re.DOTALL)
_END_RE = re.compile(rb"END-ISO-10303-21\s*;\s*\Z", re.IGNORECASE)
_LOG_LINE = re.compile(r"^\[(?:error|warning)\]\s*((?:\[[^\]]*\]\s*)*)(.*)$", re.IGNORECASE)
_PARSE_PROBLEMS: "weakref.WeakKeyDictionary[object, tuple[str, ...]]" = weakref.WeakKeyDictionary()


def normalise_schema(identifier: str) -> str | None:
    """The supported family of a FILE_SCHEMA identifier, or ``None``.

    >>> normalise_schema("IFC4X3_ADD2"), normalise_schema("ifc2x3"), normalise_schema("IFC2X2_FINAL")
    ('IFC4X3', 'IFC2X3', None)
    """
    s = identifier.strip().upper()
    if s == "IFC2X3" or s.startswith("IFC2X3_"):
        return "IFC2X3"
    if s.startswith("IFC4X3"):
        return "IFC4X3"
    if s == "IFC4" or re.fullmatch(r"IFC4_ADD\d(_TC\d)?", s):
        return "IFC4"
    return None


def _read_head(fh) -> bytes:
    """Bytes from the start of the file up to and including the end of the HEADER section."""
    data = b""
    while len(data) < _HEAD_LIMIT:
        chunk = fh.read(65536)
        if not chunk:
            break
        data += chunk
        if re.search(rb"\bDATA\s*;", _COMMENT_RE.sub(b"", data)):
            break
    return data


def check_ifc_file(path: str | os.PathLike) -> str:
    """Check ``path`` without parsing the model; return the supported schema family.

    Raises :class:`BadInputError` for a missing path, a directory, an empty, unreadable,
    non-STEP or truncated file, and :class:`UnsupportedSchemaError` for a schema joint-audit
    does not read.
    """
    p = Path(path)
    if not p.exists():
        raise BadInputError(f"model file not found: {p} (check the path)")
    if p.is_dir():
        raise BadInputError(f"{p} is a directory, not an IFC file (pass the .ifc file inside it)")
    try:
        size = p.stat().st_size
        if size == 0:
            raise BadInputError(f"{p} is empty (0 bytes); export the model again")
        with open(p, "rb") as fh:
            head = _read_head(fh)
            fh.seek(max(0, size - _TAIL_BYTES))
            tail = fh.read()
    except BadInputError:
        raise
    except OSError as exc:
        raise BadInputError(f"cannot read {p}: {exc.strerror or exc}") from exc

    start = head.lstrip(b"\xef\xbb\xbf \t\r\n")
    if start.startswith(b"PK\x03\x04"):
        raise BadInputError(f"{p} is a zip archive (ifcZIP?); unzip it and pass the .ifc file inside")
    if start.startswith(b"<?xml") or start.startswith(b"<"):
        raise BadInputError(f"{p} is XML (ifcXML?), not an IFC STEP file; export it as IFC-SPF (.ifc)")
    start = _COMMENT_RE.sub(b"", start).lstrip()
    if not start.upper().startswith(b"ISO-10303-21"):
        raise BadInputError(
            f"{p} is not an IFC file: it does not start with the STEP header 'ISO-10303-21;'"
        )
    m = _SCHEMA_RE.search(head)
    if m is None:
        raise BadInputError(f"{p} has no FILE_SCHEMA in its header: truncated or not an IFC file")
    identifier = m.group(1).decode("latin-1").strip()
    family = normalise_schema(identifier)
    if family is None:
        raise UnsupportedSchemaError(
            f"{p} is written in schema {identifier or '(empty)'!r}; joint-audit reads "
            f"{', '.join(SUPPORTED_SCHEMAS)}: re-export the model in one of them"
        )
    body_end = _COMMENT_RE.sub(b"", tail).rstrip()
    if not re.search(rb"\bDATA\s*;", _COMMENT_RE.sub(b"", head)) and size <= len(head):
        raise BadInputError(f"{p} is truncated: it has a header but no DATA section; export it again")
    if not _END_RE.search(body_end + b"\n" if body_end else b""):
        raise BadInputError(
            f"{p} is truncated: it does not end with 'END-ISO-10303-21;'; copy or export it again"
        )
    return family


def open_model(path: str | os.PathLike):
    """Validate ``path`` and open it with IfcOpenShell; return the ``ifcopenshell.file``.

    Raises :class:`BadInputError` (missing, directory, empty, not STEP, truncated, unparsable) or
    :class:`UnsupportedSchemaError` with a one-line actionable message.
    """
    family = check_ifc_file(path)
    import ifcopenshell

    _take_log(ifcopenshell)  # drop what was logged before this file
    try:
        model = ifcopenshell.open(str(path))
    except Exception as exc:  # IfcOpenShell raises several types (RuntimeError, IOError, its own)
        detail = str(exc).strip().splitlines()[0] if str(exc).strip() else type(exc).__name__
        _take_log(ifcopenshell)
        raise BadInputError(f"{path} could not be parsed as {family}: {detail}") from exc
    problems = _take_log(ifcopenshell)
    if problems:
        _PARSE_PROBLEMS[model] = problems
    got = normalise_schema(getattr(model, "schema_identifier", None) or model.schema)
    if got is None:
        raise UnsupportedSchemaError(
            f"{path} opened as schema {model.schema!r}; joint-audit reads {', '.join(SUPPORTED_SCHEMAS)}"
        )
    return model


def _take_log(ifcopenshell) -> tuple[str, ...]:
    """The errors and warnings IfcOpenShell logged since the last call (reading clears its log),
    without their time stamps."""
    get_log = getattr(ifcopenshell, "get_log", None)
    if get_log is None:
        return ()
    out: list[str] = []
    for line in str(get_log() or "").splitlines():
        m = _LOG_LINE.match(line.strip())
        if m and m.group(2).strip():
            out.append(m.group(2).strip())
    return tuple(out)


def parse_problems(model) -> tuple[str, ...]:
    """What IfcOpenShell reported while :func:`open_model` parsed ``model``: entities it could not
    read, references to entities that are not in the file, instance names used twice. Empty for
    a clean file or a model opened elsewhere. The parser skips what it cannot read, so a model
    with problems opens but misses data."""
    try:
        return _PARSE_PROBLEMS.get(model, ())
    except TypeError:  # not weak-referenceable: not opened here
        return ()
