"""The ``JointAudit_Start`` / ``JointAudit_End`` property sets as IFC STEP text, without IfcOpenShell.

What the sets hold is defined here once (:func:`pset_properties`): ``ifc_io.write_psets`` creates
them as entities in an open model (the plug-in path), and the command line writes them as STEP lines
appended to the audited copy (:func:`pset_blocks`, :func:`append_before_end`, through
``ifc_io.write_psets_text``). Nothing here needs IfcOpenShell: the text is the text.

STEP strings are encoded per ISO 10303-21 (apostrophes and backslashes doubled, anything other than
printable ASCII as ``\\X2\\…\\X0\\`` / ``\\X4\\…\\X0\\``). Derived GlobalIds are the name-based
UUIDs (RFC 4122 version 5) of the beam's GlobalId and the set's name, so two runs on the same input
write the same entities.

An aid to a competent engineer: results must be checked; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

import binascii
import hashlib
import math
import os
import re
import uuid
from typing import Any, Iterable, Iterator, Mapping

from engine.errors import OutputError
from engine.memo import BoundedMemo

__all__ = ["PSET_BY_END", "PSET_NAMES", "PSET_DESCRIPTION", "PSET_STATUSES", "derived_guid", "step_string",
           "step_real", "typed_value", "pset_properties", "pset_blocks", "append_before_end", "newline_of"]

PSET_BY_END = {"start": "JointAudit_Start", "end": "JointAudit_End"}
PSET_NAMES = frozenset(PSET_BY_END.values())
PSET_DESCRIPTION = "joint-audit result for this beam end (an aid to a competent engineer; check it)"
PSET_STATUSES = ("pass", "fail", "needs-design", "incomplete")  # the joints that get a set

NAMESPACE = uuid.UUID("6b1f3c52-8d0e-4d59-9d7b-2f0a3c1e9a41")  # joint-audit's own namespace for derived ids
_NS_BYTES = NAMESPACE.bytes
_IFC64 = "0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz_$"
# standard base-64 digits → the IFC alphabet (same order of values, other characters)
_TO_IFC64 = bytes.maketrans(b"ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/",
                            _IFC64.encode("ascii"))


def derived_guid(*parts: str) -> str:
    """A GlobalId derived from ``parts``: the name-based UUID (RFC 4122 version 5, SHA-1, in our
    namespace) of ``"|".join(parts)``, in the IFC 22-character base-64 form — the same value as
    ``ifcopenshell.guid.compress(uuid.uuid5(NAMESPACE, name).hex)``, computed without building UUID
    objects (this runs twice per property set on large models).

    The IFC form writes the 128 bits as 22 six-bit digits, the first holding the top 2 bits. Two
    zero bytes in front make 144 bits, which standard base 64 writes as 24 digits with the same
    grouping; the first two are zero and are dropped, and the alphabet is translated."""
    digest = bytearray(hashlib.sha1(_NS_BYTES + "|".join(parts).encode("utf-8")).digest()[:16])
    digest[6] = (digest[6] & 0x0F) | 0x50  # version 5
    digest[8] = (digest[8] & 0x3F) | 0x80  # RFC 4122 variant
    return binascii.b2a_base64(b"\0\0" + digest, newline=False)[2:].translate(_TO_IFC64).decode("ascii")


_NOT_PLAIN = re.compile(r"[^\x20-\x7E]")
_PLAIN = re.compile(r"[0-9A-Za-z_$ .:\-]*")  # printable, and neither an apostrophe nor a backslash


def _encode_char(m: re.Match) -> str:
    o = ord(m.group())
    return f"\\X2\\{o:04X}\\X0\\" if o <= 0xFFFF else f"\\X4\\{o:08X}\\X0\\"


def step_string(text: str) -> str:
    """``text`` as a STEP string literal (ISO 10303-21 §7.3.3), quotes included: apostrophes and
    backslashes doubled, anything but printable ASCII as ``\\X2\\hhhh\\X0\\`` (or ``\\X4\\`` beyond
    the basic plane)."""
    if _PLAIN.fullmatch(text):  # ids, GlobalIds, names: nothing to double or encode
        return "'" + text + "'"
    body = text.replace("\\", "\\\\").replace("'", "''")
    if not (body.isascii() and body.isprintable()):
        body = _NOT_PLAIN.sub(_encode_char, body)
    return "'" + body + "'"


def step_real(value: float) -> str:
    """A float as a STEP real: always with a decimal point, exponent as ``E``."""
    if not math.isfinite(value):
        raise OutputError(f"cannot write a non-finite number ({value!r}) into the IFC output")
    s = repr(float(value)).upper()
    mant, _, exp = s.partition("E")
    if "." not in mant:
        mant += "."
    return mant + ("E" + exp if exp else "")


def typed_value(model_schema: str, ifc_type: str, value: Any) -> str:
    """``value`` as a typed STEP value, e.g. ``IFCLABEL('pass')`` (IFC2X3 has no IfcDateTime: a
    label there)."""
    if model_schema == "IFC2X3" and ifc_type == "IfcDateTime":
        ifc_type = "IfcLabel"
    name = ifc_type.upper()
    if isinstance(value, bool):
        return f"{name}(.{'T' if value else 'F'}.)"
    if isinstance(value, (int, float)) and ifc_type not in ("IfcLabel", "IfcText", "IfcIdentifier"):
        return f"{name}({step_real(float(value))})"
    return f"{name}({step_string(str(value))})"


def pset_properties(joint: Mapping[str, Any], doc: Mapping[str, Any], n_per_force_unit: float) -> list[tuple[str, str, Any]]:
    """(name, IFC type, value) for one joint's property set (a results-document entry), in this
    order; ``None`` values are left out. Forces in the model's force unit (``n_per_force_unit``
    newtons each)."""
    demand = joint.get("demand") or {}
    conn = joint.get("connection") or {}
    v_kn, n_kn = demand.get("V_kN"), demand.get("N_kN")
    run = doc.get("run") or {}
    props = (
        ("JointId", "IfcIdentifier", joint["id"]),
        ("Status", "IfcLabel", joint["status"]),
        ("SupportGlobalId", "IfcIdentifier", joint.get("support")),
        ("JointKind", "IfcLabel", joint.get("kind")),
        ("SupportStiffness", "IfcLabel", joint.get("stiffness")),
        ("StiffnessReasons", "IfcText", "; ".join(joint.get("stiffness_reasons") or []) or None),
        ("DesignCode", "IfcLabel", doc.get("code")),
        ("EndShear", "IfcForceMeasure", None if v_kn is None else v_kn * 1e3 / n_per_force_unit),
        ("TieForce", "IfcForceMeasure", None if n_kn is None else n_kn * 1e3 / n_per_force_unit),
        ("ShearSource", "IfcLabel", demand.get("source") or None),
        ("Connection", "IfcText", conn.get("summary")),
        ("ConnectionSource", "IfcLabel", conn.get("source")),
        ("Utilisation", "IfcRatioMeasure", joint.get("utilisation")),
        ("GoverningCheck", "IfcLabel", joint.get("governing")),
        ("Missing", "IfcText", "; ".join(joint.get("missing") or []) or None),
        ("Baseline", "IfcLabel", joint.get("baseline")),
        ("ToolVersion", "IfcLabel", f"{doc['tool']['name']} {doc['tool']['version']}"),
        ("AuditDate", "IfcDateTime", run.get("date") or None),
    )
    return [p for p in props if p[2] is not None]


# values that differ from joint to joint, not worth remembering: their encoders (as typed_value)
_UNIQUE_TYPES: dict[str, Any] = {
    "IfcText": lambda v: f"IFCTEXT({step_string(str(v))})",
    "IfcIdentifier": lambda v: f"IFCIDENTIFIER({step_string(str(v))})",
    "IfcForceMeasure": lambda v: f"IFCFORCEMEASURE({step_real(float(v))})",
    "IfcRatioMeasure": lambda v: f"IFCRATIOMEASURE({step_real(float(v))})",
}


def pset_blocks(rows: Iterable[tuple[Mapping[str, Any], int, str, str]], doc: Mapping[str, Any], first_id: int,
                schema: str, *, n_per_force_unit: float = 1.0, owner_id: int | None = None,
                counter: list[int] | None = None, sep: str = "\n") -> Iterator[str]:
    """STEP lines of one property set per row ``(joint entry, beam's entity id, beam's GlobalId,
    set name)``, ids from ``first_id``: one text per set (its properties, the set and its
    relationship, each line ended by ``sep``; a large model has half a million lines, which one at
    a time cost more than formatting them). ``doc`` gives the code, tool and run date;
    ``counter[0]`` counts the sets."""
    owner = f"#{owner_id}" if owner_id else "$"
    # text already encoded: names, and the values that repeat from joint to joint (statuses, kinds,
    # sources, the code, the tool, the date, the reasons)
    typed = BoundedMemo(lambda tv: typed_value(schema, *tv))
    prefix = BoundedMemo(lambda name: f"=IFCPROPERTYSINGLEVALUE({step_string(name)},$,")
    names = BoundedMemo(step_string)
    reason = BoundedMemo(lambda r: step_string(r)[1:-1], limit=8192)  # encoded without the quotes
    described = {name: f"{names[name]},{names[PSET_DESCRIPTION]},(" for name in PSET_BY_END.values()}
    end_line = ",$);" + sep
    # a whole line but its number, for the (name, type, value) that repeat
    tail = BoundedMemo(lambda ntv: f"{prefix[ntv[0]]}{typed[ntv[1:]]}{end_line}")
    n = first_id
    for joint, beam_id, beam_gid, pset_name in rows:
        first = n
        parts: list[str] = []
        add = parts.append
        for name, ifc_type, value in pset_properties(joint, doc, n_per_force_unit):
            if name == "StiffnessReasons":
                # STEP encoding works character by character, so the joined text encodes as the
                # join of its encoded parts; the reasons repeat from joint to joint
                add(f"#{n}{prefix[name]}IFCTEXT('{'; '.join([reason[r] for r in joint['stiffness_reasons']])}')"
                    f"{end_line}")
            elif ifc_type in _UNIQUE_TYPES:
                add(f"#{n}{prefix[name]}{_UNIQUE_TYPES[ifc_type](value)}{end_line}")
            else:
                add(f"#{n}{tail[(name, ifc_type, value)]}")
            n += 1
        members = ",".join([f"#{i}" for i in range(first, n)])
        # a derived GlobalId is made of the IFC base-64 digits only: nothing to encode
        add(f"#{n}=IFCPROPERTYSET('{derived_guid(beam_gid, pset_name)}',{owner},{described[pset_name]}"
            f"{members}));{sep}"
            f"#{n + 1}=IFCRELDEFINESBYPROPERTIES('{derived_guid(beam_gid, pset_name, 'rel')}',{owner},$,$,"
            f"(#{beam_id}),#{n});{sep}")
        n += 2
        if counter is not None:
            counter[0] += 1
        yield "".join(parts)


TAIL_BYTES = 1 << 16  # the end of the DATA section is looked for in the file's last 64 KiB


def newline_of(path: str | os.PathLike[str]) -> str:
    """The line ending a STEP file uses (``"\\r\\n"`` or ``"\\n"``), from its first 2000 bytes."""
    with open(path, "rb") as fh:
        return "\r\n" if b"\r\n" in fh.read(2000) else "\n"


def append_before_end(path: str | os.PathLike[str], texts: Iterable[str | bytes]) -> None:
    """Insert ``texts`` (STEP lines, ASCII) in place of the file's closing ``ENDSEC;`` — the end of
    its DATA section — and put the closing back after them. Raises :class:`OutputError` for a file
    with no DATA section to end."""
    with open(path, "r+b") as fh:
        size = fh.seek(0, 2)
        start = max(0, size - TAIL_BYTES)
        fh.seek(start)
        tail = fh.read()
        end = tail.rfind(b"ENDSEC;")
        if end < 0 or b"DATA;" in tail[end:]:
            raise OutputError(f"the IFC written to {path} has no DATA section to add the results to")
        closing = tail[end:]
        fh.seek(start + end)
        fh.truncate()
        batch: list[bytes] = []
        size_b = 0
        for text in texts:
            data = text if isinstance(text, bytes) else text.encode("ascii")
            batch.append(data)
            size_b += len(data)
            if size_b >= 1 << 22:
                fh.write(b"".join(batch))
                batch, size_b = [], 0
        fh.write(b"".join(batch))
        fh.write(closing)
