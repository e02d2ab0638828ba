"""Turn joints, demands, connections and a rule set into one result per joint (pipeline stage 5).

Status rules (DESIGN.md §3):

* ``not-checked`` — a joint whose type has no rule set yet (wall bearing, beam over, splice, unknown,
  the root of a cantilever, which needs a moment connection) or a free end; the note says which
  ("needs design, type not checked" or "free end");
* ``incomplete`` — data missing (no end shear, a modelled connection missing a dimension, a check
  whose inputs are missing or out of its validity range); ``missing`` says what;
* ``needs-design`` — a shear joint with an end shear but no connection modelled or scheduled (or, with
  ``--design``, none found);
* ``fail`` — at least one check does not pass;
* ``pass`` — every check passes.

An aid to a competent engineer: results must be checked; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Mapping, Sequence

from engine.model import Check, Demand, FinPlate, Joint, JointResult, Member

__all__ = ["FIN_PLATE_KINDS", "ConnectionChoice", "evaluate_joint", "evaluate_joints", "governing_check", "ISSUE_STATUSES"]

FIN_PLATE_KINDS: frozenset[str] = frozenset({"column-flange", "column-web", "beam-web"})
"""Joint kinds a bolted single-plate shear connection serves, and so the rule sets check."""

ISSUE_STATUSES: tuple[str, ...] = ("fail", "needs-design", "incomplete")
"""Statuses that make a joint an issue in the reports (and exit status 1 for fail/needs-design)."""


@dataclass(frozen=True)
class ConnectionChoice:
    """The connection found for a joint: ``plate`` (or ``None``), where it came from, and what is
    missing when a modelled connection could not be fully recovered."""

    plate: FinPlate | None
    source: str = ""
    missing: tuple[str, ...] = ()
    note: str = ""


def governing_check(checks: Sequence[Check]) -> Check | None:
    """The check with the highest utilisation among complete checks (first on ties), else ``None``."""
    best: Check | None = None
    for c in checks:
        if c.incomplete:
            continue
        if best is None or c.utilisation > best.utilisation:
            best = c
    return best


def evaluate_joint(
    joint: Joint,
    demand: Demand | None,
    choice: ConnectionChoice | None,
    beam: Member,
    support: Member | None,
    ruleset,
    policy: str,
    demand_missing: str = "end shear (no source in demand.order gave a value)",
    cantilever_root: bool = False,
) -> JointResult:
    """The result of one joint (see the module docstring for the status rules). ``cantilever_root``:
    the beam's other end is free, so this end must carry the cantilever's moment."""
    if joint.kind == "free-end":
        return JointResult(joint, demand, None, (), None, None, "not-checked", note="free end: no support, nothing to connect")
    if cantilever_root:
        return JointResult(
            joint, demand, choice.plate if choice else None, (), None, None, "not-checked",
            note="needs design, type not checked: the other end of this beam is free, so this is the root of "
                 "a cantilever and needs a moment connection, not a simple fin plate",
        )
    if joint.kind not in FIN_PLATE_KINDS:
        return JointResult(
            joint, demand, choice.plate if choice else None, (), None, None, "not-checked",
            note=f"needs design, type not checked ({joint.kind} joints have no rule set yet)",
        )
    if demand is None:
        return JointResult(joint, None, choice.plate if choice else None, (), None, None, "incomplete",
                           missing=(demand_missing,))
    if choice is None or (choice.plate is None and not choice.missing):
        return JointResult(joint, demand, None, (), None, None, "needs-design",
                           note=(choice.note if choice and choice.note else "no connection modelled or scheduled"))
    if choice.plate is None:
        return JointResult(joint, demand, None, (), None, None, "incomplete", missing=choice.missing, note=choice.note)
    checks = tuple(ruleset.check_fin_plate(joint, demand, choice.plate, beam, support, policy))
    gov = governing_check(checks)
    failed = [c for c in checks if not c.passed and not c.incomplete]
    incomplete = [c for c in checks if c.incomplete]
    if failed:
        status = "fail"
    elif incomplete:
        status = "incomplete"
    else:
        status = "pass"
    missing = tuple(f"{c.name} ({c.clause}): {c.note}" for c in incomplete)
    return JointResult(
        joint, demand, choice.plate, checks, gov.name if gov else None, gov.utilisation if gov else None,
        status, missing=missing, note=choice.note,
    )


def evaluate_joints(
    joints: Sequence[Joint],
    demands: Mapping[str, Demand | None],
    choices: Mapping[str, ConnectionChoice | None],
    members: Mapping[str, Member],
    ruleset,
    policy: str,
    demand_reasons: Mapping[str, str] | None = None,
    cantilevers: frozenset[str] | None = None,
) -> tuple[JointResult, ...]:
    """One :class:`JointResult` per joint, in the joints' order. ``cantilevers``: GlobalIds of beams
    with one free end (their supported end is a cantilever root)."""
    out = []
    for j in joints:
        beam = members[j.beam]
        support = members.get(j.support) if j.support else None
        reason = (demand_reasons or {}).get(j.id) or "end shear (no source in demand.order gave a value)"
        out.append(evaluate_joint(j, demands.get(j.id), choices.get(j.id), beam, support, ruleset, policy, reason,
                                  cantilever_root=j.beam in (cantilevers or ()) and j.kind != "free-end"))
    return tuple(out)
