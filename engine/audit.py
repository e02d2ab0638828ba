"""The audit pipeline on a read frame: joints → demands → connections → checks → results document.

Code-neutral and ifcopenshell-free: it takes the :class:`engine.model.Frame` the reader produced,
the configuration, a rule set, and optional schedules, and returns plain results. Writing outputs
(IFC copy, HTML, BCF, JSON, CSV) is the caller's job (the CLI, or :mod:`ifc_io.library` for an open
model).

An aid to a competent engineer: results must be checked; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import cached_property, partial
from typing import Any, Callable, Mapping

from engine.connection_schedule import ConnectionSchedule
from engine.memory import give_back_free_memory
from engine.evaluate import FIN_PLATE_KINDS, ConnectionChoice, evaluate_joints
from engine.config import plate_grade as configured_plate_grade, weld_electrode
from engine.model import DataWarning, Frame, JointResult, Member, Steel, Weld

__all__ = ["AuditOutcome", "run_audit", "find_frame_joints", "Progress"]

Progress = Callable[[str, int, int], None]
"""``progress(stage, done, total)`` — called as work advances (the CLI draws a bar on a terminal)."""


@dataclass(frozen=True)
class AuditOutcome:
    """Everything one audit produced: per-joint results, the results document (:attr:`doc`), the
    joint finding (with its graph), the members by GlobalId, and every warning of every stage.

    ``document(stream=False)`` makes the results document (:func:`engine.results.results_document`
    with this run's arguments); ``stream=True`` gives it with one-pass ``joints`` and ``warnings``,
    for writers that go through them once (the command line: a large model's document is then
    never held whole)."""

    results: tuple[JointResult, ...]
    finding: Any
    members: Mapping[str, Member]
    warnings: tuple[DataWarning, ...]
    frame: Frame
    document: Callable[..., dict[str, Any]] = field(repr=False, compare=False)

    @cached_property
    def doc(self) -> dict[str, Any]:
        """The results document, made on first use and kept."""
        return self.document()


def _quiet(stage: str, done: int, total: int) -> None:
    return None


def choose_connections(
    finding,
    frame: Frame,
    members: Mapping[str, Member],
    schedule: ConnectionSchedule | None,
    steel_lookup: Callable[[str], Steel | None],
    config: Mapping[str, Any],
) -> tuple[dict[str, ConnectionChoice], list[DataWarning]]:
    """For each fin-plate joint: the modelled connection if parts are found at it, else the
    schedule's, else none (the joint then needs design)."""
    from engine.connections import recover_fin_plates

    shear_joints = [j for j in finding.joints if j.kind in FIN_PLATE_KINDS]
    c = config["connections"]
    weld = Weld(c["weld_leg_mm"], weld_electrode(config), c["both_sides"])
    plate_grade = configured_plate_grade(config)
    modelled, warnings = recover_fin_plates(
        frame.parts, shear_joints, members, steel_lookup=steel_lookup, default_weld=weld,
        default_plate_grade=plate_grade,
    )
    choices: dict[str, ConnectionChoice] = {}
    for j in shear_joints:
        if j.id in modelled:
            choices[j.id] = modelled[j.id]
            continue
        if schedule is not None:
            entry = schedule.lookup(j, members[j.beam])
            if entry is not None:
                plate = entry.fin_plate(steel_lookup, plate_grade)
                choices[j.id] = ConnectionChoice(plate, "scheduled", note=f"from {entry.where}")
                continue
        choices[j.id] = ConnectionChoice(None, "", note="no connection modelled or scheduled")
    return choices, warnings


def find_frame_joints(frame: Frame, config: Mapping[str, Any]):
    """Every joint of ``frame`` (``engine.joints.find_joints``) with the configured tolerances and
    support policy."""
    from engine.joints import find_joints
    from engine.tolerances import Tolerances

    return find_joints(frame.members, frame.bearings, frame.connections,
                       tolerances=Tolerances.from_config(config.get("tolerances", {})),
                       policy=config["support"]["policy"])


def _propose(finding, demands, choices, members, ruleset, policy, space, progress, skip_beams=frozenset()):
    from engine.design import propose_fin_plate

    todo = [j for j in finding.joints if j.id in choices and choices[j.id].plate is None
            and not choices[j.id].missing and demands.get(j.id) is not None and j.beam not in skip_beams]
    out = dict(choices)
    for i, j in enumerate(todo):
        prop = propose_fin_plate(j, demands[j.id], members[j.beam], members.get(j.support) if j.support else None,
                                 ruleset, policy, space)
        if prop.plate is not None:
            out[j.id] = ConnectionChoice(prop.plate, "proposed", note=f"proposed by --design: {prop.reason}; not in the model")
        else:
            out[j.id] = ConnectionChoice(None, "", note=f"--design found no fin plate: {prop.reason}")
        progress("design", i + 1, len(todo))
    return out


def run_audit(
    frame: Frame,
    config: Mapping[str, Any],
    ruleset,
    *,
    steel_lookup: Callable[[str], Steel | None],
    demand_schedule=None,
    connection_schedule: ConnectionSchedule | None = None,
    baseline: Mapping[str, Mapping[str, Any]] | None = None,
    run_date: str = "",
    progress: Progress = _quiet,
    design_space=None,
) -> AuditOutcome:
    """Run the audit stages on ``frame`` and return the results (nothing is written).

    With ``design_space`` (an :class:`engine.design.DesignSpace`) every shear joint that has an end
    shear but no modelled or scheduled connection gets the lightest passing proposal, or stays
    ``needs-design`` with the reason none was found."""
    from engine.demand import resolve_demands
    from engine.results import baseline_marks, results_document

    policy = config["support"]["policy"]
    progress("joints", 0, 1)
    finding = find_frame_joints(frame, config)
    give_back_free_memory()  # the finder's scratch (engine.memory)
    progress("joints", 1, 1)
    members = {m.global_id: m for m in frame.members}
    warnings: list[DataWarning] = list(frame.warnings) + list(finding.warnings)

    progress("demand", 0, 1)
    web_shear = getattr(ruleset, "web_shear_capacity", None)
    demands, demand_warnings = resolve_demands(
        finding.joints, members, dict(config), n_per_force_unit=frame.n_per_force_unit,
        schedule=demand_schedule, combination=ruleset.ultimate_combination(), web_shear_capacity=web_shear,
        reactions=frame.reactions,
    )
    warnings += demand_warnings
    progress("demand", 1, 1)

    choices, conn_warnings = choose_connections(finding, frame, members, connection_schedule, steel_lookup, config)
    warnings += conn_warnings
    # beams with a free end: their supported end is a cantilever root, not a fin-plate joint
    cantilevers = frozenset(j.beam for j in finding.joints if j.kind == "free-end")
    if design_space is not None:
        choices = _propose(finding, demands, choices, members, ruleset, policy, design_space, progress, cantilevers)

    results: list[JointResult] = []
    total = len(finding.joints)
    step = max(1, total // 100)
    for i, j in enumerate(finding.joints):
        results.extend(evaluate_joints([j], demands, choices, members, ruleset, policy, cantilevers=cantilevers))
        if i % step == 0:
            progress("checks", i, total)
    progress("checks", total, total)

    marks, removed = (None, [])
    if baseline is not None:
        marks, removed = baseline_marks(results, baseline)
    document = partial(
        results_document,
        results, frame, members, code=config["code"], code_title=getattr(ruleset, "title", ""),
        baseline=marks, removed=removed, run_date=run_date, config=config, warnings=warnings,
        baseline_was={jid: str(j.get("status")) for jid, j in baseline.items()} if baseline is not None else None,
    )
    return AuditOutcome(tuple(results), finding, members, tuple(warnings), frame, document)
