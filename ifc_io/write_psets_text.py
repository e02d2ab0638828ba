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

import os
import re
import shutil
from typing import Any, Iterable, Iterator, Mapping, NamedTuple

import ifcopenshell

from engine.pset_text import (PSET_STATUSES, TAIL_BYTES, append_before_end, newline_of, pset_blocks, step_real,
                              step_string)
from ifc_io.write_psets import _owner_history, iter_joint_beams, remove_all_joint_psets

__all__ = ["step_string", "step_real", "ModelCopy", "prepare_model_copy",
           "copy_input_verbatim", "append_joint_psets", "write_model_with_psets"]


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
    """The STEP lines of one property set per joint of ``doc`` whose status is in ``statuses`` (as
    :func:`ifc_io.write_psets.write_joint_psets` writes them), ids from ``first_id``, one text per set
    (:func:`engine.pset_text.pset_blocks` on the joints whose beams are in ``model``)."""
    rows = ((joint, beam.id(), joint["beam"], name) for joint, beam, name in iter_joint_beams(model, doc, statuses))
    return pset_blocks(rows, doc, first_id, model.schema, n_per_force_unit=n_per_force_unit, owner_id=owner_id,
                       counter=counter, sep=sep)




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
            fh.seek(max(0, opened.st_size - TAIL_BYTES))
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
    counter = [0]
    append_before_end(path, _pset_blocks(model, doc, first_id, n_per_force_unit=n_per_force_unit,
                                         statuses=PSET_STATUSES, owner_id=owner_id, counter=counter,
                                         sep=newline_of(path)))
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
