"""Fast write-back for large models: the ``JointAudit_*`` property sets as STEP text, appended to the
written copy of the model.

Creating hundreds of thousands of entities through ifcopenshell's Python layer costs more than the
rest of the write; the same entities written as STEP lines cost almost nothing. The content is
exactly that of :func:`ifc_io.write_psets.write_joint_psets` (the same property list, types and
derived GlobalIds; ``tests/test_write_psets.py`` checks the two agree), so the plug-in path (an open
model, entities created in memory) and the command line (a file written to disk) give the same sets.

Procedure: remove every earlier ``JointAudit_*`` set from the open model (a re-run replaces, never
duplicates, and leaves no stale result), write the model to the target with ifcopenshell — or, when
nothing had to be removed or added and the input parsed cleanly, copy the input file's own bytes
(:func:`copy_input_verbatim`: the same model, its text kept as the authoring tool wrote it) — then
insert the new entities — numbered after the model's largest id — before the end of its DATA section. The
command line writes the model while the audit runs (:mod:`engine.background`) and adds the sets
afterwards, so the steps are separate functions. STEP strings are encoded per ISO
10303-21 (apostrophes doubled, backslashes doubled, other than printable ASCII as ``\\X2\\…\\X0\\`` /
``\\X4\\…\\X0\\``).

An aid to a competent engineer: results must be checked; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

import math
import os
import re
import shutil
from typing import Any, Iterable, Iterator, Mapping, NamedTuple

import ifcopenshell

from engine.errors import OutputError
from engine.memo import BoundedMemo
from ifc_io.write_psets import (PSET_BY_END, _guid, _owner_history, _properties, iter_joint_beams,
                                remove_all_joint_psets)

__all__ = ["step_string", "step_real", "iter_joint_pset_lines", "ModelCopy", "prepare_model_copy",
           "copy_input_verbatim", "append_joint_psets", "write_model_with_psets"]

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


def iter_joint_pset_lines(
    model: ifcopenshell.file,
    doc: Mapping[str, Any],
    first_id: int,
    *,
    n_per_force_unit: float = 1.0,
    statuses: Iterable[str] = ("pass", "fail", "needs-design", "incomplete"),
    owner_id: int | None = None,
    counter: list[int] | None = None,
) -> Iterator[str]:
    """STEP lines of one property set per joint of ``doc`` whose status is in ``statuses`` (as
    :func:`ifc_io.write_psets.write_joint_psets` writes them), ids from ``first_id``, one after the
    other; ``counter[0]`` counts the sets."""
    for block in _pset_blocks(model, doc, first_id, n_per_force_unit=n_per_force_unit, statuses=statuses,
                              owner_id=owner_id, counter=counter, sep="\n"):
        yield from block.splitlines()


def _pset_blocks(
    model: ifcopenshell.file,
    doc: Mapping[str, Any],
    first_id: int,
    *,
    n_per_force_unit: float,
    statuses: Iterable[str],
    owner_id: int | None,
    counter: list[int] | None,
    sep: str,
) -> Iterator[str]:
    """The lines of :func:`iter_joint_pset_lines`, one text per property set (its properties, the
    set and its relationship, each line ended by ``sep``): a large model has half a million lines,
    which one at a time cost more than formatting them."""
    owner = f"#{owner_id}" if owner_id else "$"
    schema = model.schema
    # text already encoded: names, and the values that repeat from joint to joint (statuses, kinds,
    # sources, the code, the tool, the date, the reasons)
    typed = BoundedMemo(lambda tv: _typed(schema, *tv))
    prefix = BoundedMemo(lambda name: f"=IFCPROPERTYSINGLEVALUE({step_string(name)},$,")
    names = BoundedMemo(step_string)
    reason = BoundedMemo(lambda r: step_string(r)[1:-1], limit=65536)  # encoded without the quotes
    described = {name: f"{names[name]},{names[_DESCRIPTION]},(" for name in PSET_BY_END.values()}
    end_line = ",$);" + sep
    # a whole line but its number, for the (name, type, value) that repeat
    tail = BoundedMemo(lambda ntv: f"{prefix[ntv[0]]}{typed[ntv[1:]]}{end_line}")
    n = first_id
    for joint, beam, pset_name in iter_joint_beams(model, doc, statuses):
        first = n
        parts: list[str] = []
        add = parts.append
        for name, ifc_type, value in _properties(joint, doc, n_per_force_unit):
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
        gid = joint["beam"]  # the beam's GlobalId: iter_joint_beams found the beam by it
        members = ",".join([f"#{i}" for i in range(first, n)])
        add(f"#{n}=IFCPROPERTYSET({step_string(_guid(gid, pset_name))},{owner},{described[pset_name]}{members}));{sep}"
            f"#{n + 1}=IFCRELDEFINESBYPROPERTIES({step_string(_guid(gid, pset_name, 'rel'))},{owner},$,$,"
            f"(#{beam.id()}),#{n});{sep}")
        n += 2
        if counter is not None:
            counter[0] += 1
        yield "".join(parts)


# values that differ from joint to joint, not worth remembering: their encoders (as _typed)
_UNIQUE_TYPES: dict[str, Any] = {
    "IfcText": lambda v: f"IFCTEXT({step_string(str(v))})",
    "IfcIdentifier": lambda v: f"IFCIDENTIFIER({step_string(str(v))})",
    "IfcForceMeasure": lambda v: f"IFCFORCEMEASURE({step_real(float(v))})",
    "IfcRatioMeasure": lambda v: f"IFCRATIOMEASURE({step_real(float(v))})",
}


_TAIL = 1 << 16  # the end of the DATA section is looked for in the file's last 64 KiB


class ModelCopy(NamedTuple):
    """What :func:`prepare_model_copy` found: the first free entity id, the owner history's id
    (``None`` in IFC4 and later), and whether the model in memory is still exactly what was read
    (nothing removed, nothing added), so that the input file's own text can serve as the copy."""

    first_id: int
    owner_id: int | None
    as_read: bool


def prepare_model_copy(model: ifcopenshell.file) -> ModelCopy:
    """Get ``model`` (in memory; the input file is never touched) ready to be written as the audited
    copy: every earlier ``JointAudit_*`` set is removed — from every element, so a beam end that is no
    longer a joint, or no longer checked, keeps no stale result — and IFC2X3's owner history is added
    if the model has none."""
    last = int(model.get_max_id())
    removed = remove_all_joint_psets(model)
    owner = _owner_history(model)
    after = int(model.get_max_id())
    return ModelCopy(after + 1, owner.id() if owner is not None else None, removed == 0 and after == last)


_PLAIN_END = re.compile(rb"ENDSEC;[ \t\r\n]*END-ISO-10303-21;[ \t\r\n]*\Z")


def copy_input_verbatim(source: str | os.PathLike[str], target: str | os.PathLike[str],
                        opened: os.stat_result) -> bool:
    """Copy the input file's bytes to ``target`` as the audited copy's text (the property sets are
    then appended by :func:`append_joint_psets`), when that gives the same model as writing it out:
    the caller has checked that the model is as read (:attr:`ModelCopy.as_read`) and parsed without
    problems; here, the file must still be the one opened (``opened``: its ``os.stat`` taken before
    opening; same size and modification time, before and after the copy) and end in a plain
    ``ENDSEC; END-ISO-10303-21;``. Returns ``False``, with ``target`` left as it was, when any of
    this does not hold: the caller then writes the model with IfcOpenShell.

    The copy keeps the authoring tool's text byte for byte (numbers as written, entity order,
    header) and costs a file copy instead of a serialisation of every entity."""
    def same(st: os.stat_result) -> bool:
        return (st.st_size, st.st_mtime_ns, st.st_ino) == (opened.st_size, opened.st_mtime_ns, opened.st_ino)

    try:
        if not same(os.stat(source)):
            return False
        with open(source, "rb") as fh:
            fh.seek(max(0, opened.st_size - _TAIL))
            tail = fh.read()
        end = tail.rfind(b"ENDSEC;")
        if end < 0 or not _PLAIN_END.match(tail, end):
            return False
        shutil.copyfile(source, target)
        if same(os.stat(source)):
            return True
    except OSError:
        pass
    try:  # back to the empty temporary file the caller made
        with open(target, "wb"):
            pass
    except OSError:
        pass
    return False


def append_joint_psets(
    model: ifcopenshell.file,
    doc: Mapping[str, Any],
    path: str,
    first_id: int,
    owner_id: int | None,
    *,
    n_per_force_unit: float = 1.0,
) -> int:
    """Add the results' property sets to the model file already written at ``path`` (from ``model``
    after :func:`prepare_model_copy`, which gave ``first_id`` and ``owner_id``); returns the number
    of sets. The new lines go in place of the file's closing ``ENDSEC;`` and are streamed to disk in
    batches: neither the written model nor the property sets are ever held whole in memory."""
    with open(path, "r+b") as fh:
        head = fh.read(2000)
        nl = b"\r\n" if b"\r\n" in head else b"\n"
        size = fh.seek(0, 2)
        start = max(0, size - _TAIL)
        fh.seek(start)
        tail = fh.read()
        end = tail.rfind(b"ENDSEC;")
        if end < 0 or b"DATA;" in tail[end:]:
            raise OutputError(f"the IFC written to {path} has no DATA section to add the results to")
        closing = tail[end:]
        fh.seek(start + end)
        fh.truncate()
        counter = [0]
        batch: list[str] = []
        for block in _pset_blocks(model, doc, first_id, n_per_force_unit=n_per_force_unit,
                                  statuses=("pass", "fail", "needs-design", "incomplete"), owner_id=owner_id,
                                  counter=counter, sep=nl.decode("ascii")):
            batch.append(block)
            if len(batch) >= 2000:
                fh.write("".join(batch).encode("ascii"))
                batch = []
        if batch:
            fh.write("".join(batch).encode("ascii"))
        fh.write(closing)
    return counter[0]


def write_model_with_psets(
    model: ifcopenshell.file,
    doc: Mapping[str, Any],
    path: str,
    *,
    n_per_force_unit: float = 1.0,
) -> int:
    """Write ``model`` to ``path`` with the results' property sets (see the module docstring):
    :func:`prepare_model_copy`, IfcOpenShell's write, :func:`append_joint_psets`. Returns the number
    of sets written. ``model`` loses its earlier ``JointAudit_*`` sets (in memory only; the input
    file is never touched)."""
    first, owner, _ = prepare_model_copy(model)
    model.write(path)
    return append_joint_psets(model, doc, path, first, owner, n_per_force_unit=n_per_force_unit)
