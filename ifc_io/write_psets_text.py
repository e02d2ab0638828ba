"""Fast write-back for large models: the ``JointAudit_*`` property sets as STEP text, appended to the
written copy of the model.

Creating hundreds of thousands of entities through ifcopenshell's Python layer costs more than the
rest of the write; the same entities written as STEP lines cost almost nothing. The content is
exactly that of :func:`ifc_io.write_psets.write_joint_psets` (the same property list, types and
derived GlobalIds; ``tests/test_write_psets.py`` checks the two agree), so the plug-in path (an open
model, entities created in memory) and the command line (a file written to disk) give the same sets.

Procedure: remove any earlier ``JointAudit_*`` sets from the open model (a re-run replaces, never
duplicates), write the model to the target with ifcopenshell, then insert the new entities — numbered
after the model's largest id — before the end of its DATA section. STEP strings are encoded per ISO
10303-21 (apostrophes doubled, backslashes doubled, other than printable ASCII as ``\\X2\\…\\X0\\`` /
``\\X4\\…\\X0\\``).

An aid to a competent engineer: results must be checked; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

import math
import re
from typing import Any, Iterable, Mapping

import ifcopenshell

from engine.errors import OutputError
from ifc_io.write_psets import _guid, _owner_history, _properties, iter_joint_beams, remove_joint_psets

__all__ = ["step_string", "step_real", "joint_pset_lines", "write_model_with_psets"]

_DESCRIPTION = "joint-audit result for this beam end (an aid to a competent engineer; check it)"


_NOT_PLAIN = re.compile(r"[^\x20-\x7E]")


def _encode_char(m: re.Match) -> str:
    o = ord(m.group())
    return f"\\X2\\{o:04X}\\X0\\" if o <= 0xFFFF else f"\\X4\\{o:08X}\\X0\\"


def step_string(text: str) -> str:
    """``text`` as a STEP string literal (ISO 10303-21 §7.3.3), quotes included: apostrophes and
    backslashes doubled, anything but printable ASCII as ``\\X2\\hhhh\\X0\\`` (or ``\\X4\\`` beyond
    the basic plane)."""
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


def _typed(model_schema: str, ifc_type: str, value: Any) -> str:
    if model_schema == "IFC2X3" and ifc_type == "IfcDateTime":
        ifc_type = "IfcLabel"
    name = ifc_type.upper()
    if isinstance(value, bool):
        return f"{name}(.{'T' if value else 'F'}.)"
    if isinstance(value, (int, float)) and ifc_type not in ("IfcLabel", "IfcText", "IfcIdentifier"):
        return f"{name}({step_real(float(value))})"
    return f"{name}({step_string(str(value))})"


def joint_pset_lines(
    model: ifcopenshell.file,
    doc: Mapping[str, Any],
    first_id: int,
    *,
    n_per_force_unit: float = 1.0,
    statuses: Iterable[str] = ("pass", "fail", "needs-design", "incomplete"),
    owner_id: int | None = None,
) -> tuple[list[str], int]:
    """STEP lines of one property set per joint of ``doc`` whose status is in ``statuses`` (as
    :func:`ifc_io.write_psets.write_joint_psets` writes them), ids from ``first_id``; returns the
    lines and the number of sets."""
    owner = f"#{owner_id}" if owner_id else "$"
    schema = model.schema
    lines: list[str] = []
    n = first_id
    count = 0
    for joint, beam, pset_name in iter_joint_beams(model, doc, statuses):
        prop_ids = []
        for name, ifc_type, value in _properties(joint, doc, n_per_force_unit):
            lines.append(f"#{n}=IFCPROPERTYSINGLEVALUE({step_string(name)},$,{_typed(schema, ifc_type, value)},$);")
            prop_ids.append(n)
            n += 1
        pset_id = n
        lines.append(
            f"#{pset_id}=IFCPROPERTYSET({step_string(_guid(beam.GlobalId, pset_name))},{owner},"
            f"{step_string(pset_name)},{step_string(_DESCRIPTION)},({','.join(f'#{i}' for i in prop_ids)}));"
        )
        n += 1
        lines.append(
            f"#{n}=IFCRELDEFINESBYPROPERTIES({step_string(_guid(beam.GlobalId, pset_name, 'rel'))},{owner},$,$,"
            f"(#{beam.id()}),#{pset_id});"
        )
        n += 1
        count += 1
    return lines, count


def write_model_with_psets(
    model: ifcopenshell.file,
    doc: Mapping[str, Any],
    path: str,
    *,
    n_per_force_unit: float = 1.0,
) -> int:
    """Write ``model`` to ``path`` with the results' property sets (see the module docstring);
    returns the number of sets written. ``model`` loses its earlier ``JointAudit_*`` sets (in memory
    only; the input file is never touched)."""
    for joint in doc["joints"]:
        try:
            remove_joint_psets(model, model.by_guid(joint["beam"]))
        except RuntimeError:
            continue
    owner = _owner_history(model)
    first = int(model.get_max_id()) + 1
    lines, count = joint_pset_lines(model, doc, first, n_per_force_unit=n_per_force_unit,
                                    owner_id=owner.id() if owner is not None else None)
    model.write(path)
    with open(path, "r", encoding="ascii", newline="") as fh:
        text = fh.read()
    end = text.rfind("ENDSEC;")
    if end < 0 or text.rfind("DATA;") > end:
        raise OutputError(f"the IFC written to {path} has no DATA section to add the results to")
    nl = "\r\n" if "\r\n" in text[:2000] else "\n"
    with open(path, "w", encoding="ascii", newline="") as fh:
        fh.write(text[:end])
        if lines:
            fh.write(nl.join(lines) + nl)
        fh.write(text[end:])
    return count
