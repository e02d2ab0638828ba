"""Library use: the audit on an ``ifcopenshell.file`` already open in another program (the plug-in
path), with no file round trip.

>>> import ifcopenshell, ifc_io.library
>>> model = ifcopenshell.open("frame.ifc")                            # doctest: +SKIP
>>> outcome = ifc_io.library.audit_model(model, code="as4100", write_psets=True)  # doctest: +SKIP
>>> outcome.doc["summary"]                                            # doctest: +SKIP

``write_psets=True`` writes the ``JointAudit_Start`` / ``JointAudit_End`` property sets into the open
model itself (the host program saves it when it wants to).

An aid to a competent engineer: results must be checked; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

import dataclasses
from datetime import datetime, timezone
from pathlib import Path
from typing import Any, Callable, Mapping, Sequence

import ifcopenshell

from engine.audit import AuditOutcome, Progress, run_audit
from engine.config import load_config, member_grade, merge_config, plate_grade, weld_electrode
from engine.errors import BadInputError
from engine.gc_pause import cycle_collection_paused
from engine.model import Frame

__all__ = ["audit_model", "read_frame_with_connections", "load_schedules", "now_iso"]


def now_iso() -> str:
    """The current UTC time as an ISO 8601 date-time with offset (the run's timestamp)."""
    return datetime.now(timezone.utc).replace(microsecond=0).isoformat()


def read_frame_with_connections(model: ifcopenshell.file, config: Mapping[str, Any], file_label: str = "") -> Frame:
    """The frame of ``model`` with its explicit connectivity relations."""
    from ifc_io import read_frame
    from ifc_io.connectivity import read_explicit_connections

    frame = read_frame(model, default_steel=member_grade(config), config=dict(config))
    if file_label:
        frame = dataclasses.replace(frame, file=file_label)
    from ifc_io.read_analysis import read_linked_reactions

    conns, warns = read_explicit_connections(model)
    reactions, rwarns = read_linked_reactions(model, {m.global_id: m for m in frame.members})
    return dataclasses.replace(frame, connections=tuple(conns), reactions=reactions,
                               warnings=tuple(frame.warnings) + tuple(warns) + tuple(rwarns))


def _schedule_kind(path: Path) -> str:
    """``"connection"`` or ``"demand"``, from the file's columns (CSV header) or tables (TOML)."""
    try:
        text = path.read_text(encoding="utf-8-sig")
    except (OSError, UnicodeDecodeError) as exc:
        raise BadInputError(f"schedule {path} cannot be read: {exc}") from None
    if path.suffix.lower() == ".toml":
        return "connection" if "[[connection]]" in text else "demand"
    header = text.splitlines()[0] if text else ""
    return "connection" if "plate_thickness" in header else "demand"


def load_schedules(paths: Sequence[str | Path]):
    """Read each schedule file; returns ``(demand_schedule | None, connection_schedule | None)``.
    The kind of each file is told by its columns; two files of one kind are an error."""
    from engine.connection_schedule import read_connection_schedule
    from engine.demand_schedule import read_demand_schedule

    demand = connection = None
    for raw in paths:
        p = Path(raw)
        if not p.is_file():
            raise BadInputError(f"schedule {p} does not exist or is not a file")
        if _schedule_kind(p) == "connection":
            if connection is not None:
                raise BadInputError(f"two connection schedules given ({connection.file} and {p}); merge them into one")
            connection = read_connection_schedule(p)
        else:
            if demand is not None:
                raise BadInputError(f"two demand schedules given; merge them into one ({p})")
            demand = read_demand_schedule(p)
    return demand, connection


def _header_file_name(model: ifcopenshell.file) -> str:
    """The file name the model's STEP header records, else ``"model"``."""
    try:
        return Path(str(model.header.file_name.name)).name or "model"
    except (AttributeError, RuntimeError):
        return "model"


def design_space_for(cfg: Mapping[str, Any], lookup_steel):
    """The ``--design`` candidate table of the configured code, with its plate steel and electrode."""
    from engine.design import DesignSpace
    from engine.errors import ConfigError
    from rules.tables import load_table

    table = load_table("design_space").get(cfg["code"])
    if table is None:
        raise ConfigError(f"--design has no candidate table for code {cfg['code']!r} (rules/data/design_space.toml)")
    grade = plate_grade(cfg)
    steel = lookup_steel(grade)
    if steel is None:
        raise ConfigError(f"plate grade {grade!r} for --design is not a known steel grade")
    return DesignSpace.from_table(table, weld_electrode(cfg), steel)


def audit_model(
    model: ifcopenshell.file,
    *,
    code: str | None = None,
    config: Mapping[str, Any] | None = None,
    config_file: str | Path | None = None,
    schedules: Sequence[str | Path] = (),
    baseline: Mapping[str, Mapping[str, Any]] | None = None,
    write_psets: bool = False,
    design: bool = False,
    run_date: str | None = None,
    file_label: str = "",
    progress: Progress | None = None,
    after_read: Callable[[], object] | None = None,
    make_document: bool = True,
) -> AuditOutcome:
    """Audit an open model. ``config`` (a dict of overrides) goes over ``config_file`` over the
    defaults; ``code`` over both. With ``write_psets`` the results are written into ``model`` as
    property sets. Returns the :class:`engine.audit.AuditOutcome` (results, results document,
    joints graph, warnings). ``after_read`` is called once the model has been read, before the
    audit proper (the command line starts writing the model's copy there). With ``make_document``
    (the default) the results document is made before returning (``outcome.doc``); without it, on
    first use (the command line streams it instead: ``outcome.document(stream=True)``)."""
    import rules
    from rules.catalog import lookup_steel

    cfg = load_config(config_file, dict(config) if config else None)
    if code:
        cfg = merge_config(cfg, {"code": code})
    ruleset = rules.load(cfg["code"])
    demand_schedule, connection_schedule = load_schedules(schedules)
    label = file_label or _header_file_name(model)
    kwargs: dict[str, Any] = {} if progress is None else {"progress": progress}
    if design:
        kwargs["design_space"] = design_space_for(cfg, lookup_steel)
    with cycle_collection_paused():  # restored after, whatever the host program had (engine.gc_pause)
        frame = read_frame_with_connections(model, cfg, label)
        if after_read is not None:
            after_read()
        outcome = run_audit(
            frame, cfg, ruleset, steel_lookup=lookup_steel, demand_schedule=demand_schedule,
            connection_schedule=connection_schedule, baseline=baseline, run_date=run_date or now_iso(), **kwargs,
        )
        if make_document:
            outcome.doc  # noqa: B018 - made here, with the cyclic collector paused
    if write_psets:
        from ifc_io.write_psets import write_joint_psets

        write_joint_psets(model, outcome.doc, n_per_force_unit=frame.n_per_force_unit)
    return outcome
