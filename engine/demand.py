"""Design actions at every beam end: end shear V* and tie force N* (DESIGN.md §4 stage 3).

An aid to a competent engineer: the design actions decide whether a connection is adequate, and a
wrong one is unsafe. Every result must be checked; the governing local code and licensed practice
take precedence.

Sources, tried in the order ``config["demand"]["order"]`` gives; the first that yields a value wins:

``model``
    Analysis results stored on the beam as IFC properties, named by ``demand.start_shear`` /
    ``demand.end_shear`` as ``"PsetName.PropertyName"`` (looked up exactly, then ignoring case). The
    raw number is in the model's force unit and is multiplied by ``n_per_force_unit`` (N per model
    force unit, ``Frame.n_per_force_unit``). Sign conventions of analysis programs differ (the shear
    at the two ends of a beam usually has opposite signs), so the absolute value is used. Where the
    property gives no value, the end reaction from a linked structural analysis model is used if
    ``reactions`` has one (``Frame.reactions``, read by ``ifc_io.read_analysis``; V in N and a text
    naming the reaction and its load combination).
``schedule``
    A demand schedule (:mod:`engine.demand_schedule`) keyed by beam GlobalId, Tag or Name and end.
``tributary``
    A floor-load take-down through the frame (:mod:`engine.tributary`) with the area loads of
    ``demand.area_loads``, beam self-weight if ``demand.self_weight``, and the rule set's ultimate
    combination (``combination``, the dict of ``RuleSet.ultimate_combination()``).
``capacity-fraction``
    ``demand.capacity_fraction`` (default 0.5) times the beam's design web shear capacity given by
    the rule set's ``web_shear_capacity(member) -> N | None``; a placeholder where no analysis is
    available  # common practice. It is not a design action from loads; say so to the reviewer.

Tie force N*: the schedule's ``N_kN`` where a row gives it; otherwise ``tie_kN`` (argument, else
``demand.tie_kN`` in the config if present), otherwise 0. Every :class:`~engine.model.Demand`
records its ``source``, its ``combination`` and a ``detail`` a reviewer can follow.

Units: N (kN only in config and schedule keys named ``_kN``).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import TYPE_CHECKING, Callable, Mapping, Sequence

from engine.config import DEFAULTS
from engine.demand_schedule import DemandSchedule, ScheduleRow
from engine.errors import BadInputError, ConfigError
from engine.model import DataWarning, Demand, Joint, Member

if TYPE_CHECKING:  # the take-down (networkx, shapely) is loaded only when the config asks for it
    from engine.tributary import TakeDown

__all__ = ["SOURCES", "DemandResolution", "resolve_demands", "resolve_demands_detailed",
           "model_shear"]

SOURCES: tuple[str, ...] = ("model", "schedule", "tributary", "capacity-fraction")
"""The demand sources, by the names ``demand.order`` uses."""


@dataclass(frozen=True)
class DemandResolution:
    """The outcome of :func:`resolve_demands_detailed`: ``demands`` by joint id (``None`` where no
    source gives a value), ``missing`` by joint id the reason per source for each ``None``,
    ``warnings``, and the take-down (``None`` when it was not run) for reports of floor panels."""

    demands: dict[str, Demand | None]
    missing: dict[str, str]
    warnings: tuple[DataWarning, ...]
    take_down: TakeDown | None


def _demand_config(config: Mapping[str, object]) -> dict[str, object]:
    """``config["demand"]`` over the defaults, checked; ConfigError names the key."""
    raw = config.get("demand", {}) if isinstance(config, Mapping) else None
    if not isinstance(raw, Mapping):
        raise ConfigError("config: 'demand' must be a table [demand]")
    d = dict(DEFAULTS["demand"])
    d.update(raw)
    order = d["order"]
    if not isinstance(order, list) or not all(isinstance(s, str) for s in order):
        raise ConfigError("config: 'demand.order' must be a list of source names")
    for s in order:
        if s not in SOURCES:
            raise ConfigError(f"config: 'demand.order' has {s!r}; the sources are {', '.join(SOURCES)}")
    if len(set(order)) != len(order):
        raise ConfigError("config: 'demand.order' names a source twice")
    frac = d["capacity_fraction"]
    if isinstance(frac, bool) or not isinstance(frac, (int, float)) or not 0.0 < frac <= 1.0:
        raise ConfigError(f"config: 'demand.capacity_fraction' is {frac!r}; it must be a number in (0, 1]")
    if not isinstance(d["self_weight"], bool):
        raise ConfigError(f"config: 'demand.self_weight' must be true or false, not {d['self_weight']!r}")
    for k in ("start_shear", "end_shear"):
        v = d[k]
        if not isinstance(v, str):
            raise ConfigError(f"config: 'demand.{k}' must be a string \"PsetName.PropertyName\"")
        if v and (v.count(".") < 1 or not v.split(".", 1)[0].strip() or not v.split(".", 1)[1].strip()):
            raise ConfigError(f"config: 'demand.{k}' is {v!r}; write it as \"PsetName.PropertyName\"")
    tie = d.get("tie_kN")
    if tie is not None and (isinstance(tie, bool) or not isinstance(tie, (int, float))
                            or not math.isfinite(tie) or tie < 0):
        raise ConfigError(f"config: 'demand.tie_kN' is {tie!r}; it must be a number >= 0 (kN)")
    return d


def model_shear(member: Member, key: str, n_per_force_unit: float) -> tuple[float | None, str]:
    """The shear (N) stored on ``member`` under property ``key`` ("Pset.Prop"), as an absolute value
    converted with ``n_per_force_unit``; or ``None`` and the reason."""
    props = member.properties
    value = props.get(key)
    used = key
    if value is None:
        low = [k for k in props if k.lower() == key.lower()]
        if len(low) == 1:
            used, value = low[0], props[low[0]]
    if value is None:
        return None, f"the beam has no property {key!r}"
    if isinstance(value, bool):
        return None, f"property {used!r} is {value!r}, not a number"
    try:
        raw = float(value)  # type: ignore[arg-type]
    except (TypeError, ValueError):
        return None, f"property {used!r} is {value!r}, not a number"
    if not math.isfinite(raw):
        return None, f"property {used!r} is {value!r}, not a finite number"
    V = abs(raw) * n_per_force_unit
    return V, (f"property {used} = {raw:g} model force units × {n_per_force_unit:g} N/unit = "
               f"{V / 1e3:.2f} kN (absolute value)")


def _linked_reaction(reactions: Mapping[tuple[str, str], tuple[float, str]] | None, beam: str,
                     end: str) -> tuple[float, str] | None:
    """The linked analysis model's end reaction ``(V in N, text)``, if it is a usable number."""
    if not reactions:
        return None
    r = reactions.get((beam, end))
    if r is None:
        return None
    V = r[0]
    if isinstance(V, bool) or not isinstance(V, (int, float)) or not math.isfinite(V):
        return None
    return float(abs(V)), str(r[1])


def resolve_demands(
    joints: Sequence[Joint],
    members: Mapping[str, Member],
    config: dict,
    *,
    n_per_force_unit: float = 1.0,
    schedule: DemandSchedule | None = None,
    combination: dict | None = None,
    web_shear_capacity: Callable[[Member], float | None] | None = None,
    tie_kN: float | None = None,
    reactions: Mapping[tuple[str, str], tuple[float, str]] | None = None,
) -> tuple[dict[str, Demand | None], list[DataWarning]]:
    """The design actions of every joint, keyed by joint id, and the data warnings.

    ``config`` is the audit configuration (``engine.config.load_config``); ``n_per_force_unit``
    converts model force properties to N; ``schedule`` a read demand schedule; ``combination`` the
    rule set's ultimate combination dict; ``web_shear_capacity`` the rule set's design web shear
    capacity (N) of a beam; ``tie_kN`` a tie force for every end whose source gives none (kN);
    ``reactions`` end reactions of a linked analysis model by ``(beam GlobalId, end)`` (V in N, text),
    used by the ``model`` source where the beam's property gives no value.
    A joint no source covers maps to ``None`` and a warning (stage ``"demand"``) says, per source,
    what was missing. Method in the module docstring. Raises :class:`ConfigError` for a bad
    ``demand`` table or area-load entry.
    """
    res = resolve_demands_detailed(
        joints, members, config, n_per_force_unit=n_per_force_unit, schedule=schedule,
        combination=combination, web_shear_capacity=web_shear_capacity, tie_kN=tie_kN,
        reactions=reactions)
    warnings = list(res.warnings)
    by_id = {j.id: j for j in joints}
    for jid, reason in res.missing.items():
        j = by_id[jid]
        warnings.append(DataWarning(f"no design action for the {j.end} end (joint {jid}): {reason}",
                                    j.beam, "demand"))
    return res.demands, warnings


def resolve_demands_detailed(
    joints: Sequence[Joint],
    members: Mapping[str, Member],
    config: dict,
    *,
    n_per_force_unit: float = 1.0,
    schedule: DemandSchedule | None = None,
    combination: dict | None = None,
    web_shear_capacity: Callable[[Member], float | None] | None = None,
    tie_kN: float | None = None,
    reactions: Mapping[tuple[str, str], tuple[float, str]] | None = None,
) -> DemandResolution:
    """As :func:`resolve_demands`, with the reasons for missing demands kept apart (``missing``)
    instead of added to the warnings, and the take-down for the report."""
    d = _demand_config(config)
    if isinstance(n_per_force_unit, bool) or not isinstance(n_per_force_unit, (int, float)) \
            or not math.isfinite(n_per_force_unit) or n_per_force_unit <= 0:
        raise BadInputError(f"n_per_force_unit is {n_per_force_unit!r}; it must be a positive number "
                            f"(N per model force unit)")
    if tie_kN is None:
        tie_kN = d.get("tie_kN")  # type: ignore[assignment]
    elif isinstance(tie_kN, bool) or not isinstance(tie_kN, (int, float)) or not math.isfinite(tie_kN) \
            or tie_kN < 0:
        raise ConfigError(f"tie_kN is {tie_kN!r}; it must be a number >= 0 (kN)")
    tie_N = float(tie_kN) * 1e3 if tie_kN else 0.0
    tie_note = f"; tie force {tie_kN:g} kN (demand.tie_kN)" if tie_kN else ""
    order: list[str] = list(d["order"])  # type: ignore[arg-type]
    warnings: list[DataWarning] = []

    rows: dict[tuple[str, str], ScheduleRow] = {}
    if schedule is not None:
        if "schedule" in order:
            rows, w = schedule.match(members.values())
            warnings.extend(w)
        else:
            warnings.append(DataWarning(f"demand schedule {schedule.path} is given but 'schedule' is not "
                                        f"in demand.order; it is not used", None, "demand"))

    td: TakeDown | None = None
    td_reason = ""
    if "tributary" in order:
        raw_loads = d["area_loads"]
        if isinstance(raw_loads, (list, tuple)) and not raw_loads:
            loads = []  # nothing to take down: the take-down's module (networkx, shapely) is not loaded
        else:
            from engine.tributary import parse_area_loads

            loads = parse_area_loads(raw_loads, "config")  # type: ignore[arg-type]
        if not loads:
            td_reason = "no floor area loads configured (demand.area_loads)"
        elif combination is None:
            td_reason = "no ultimate load combination given (from the rule set)"
        else:
            from engine.tributary import take_down

            td = take_down(members, joints, loads, combination, self_weight=bool(d["self_weight"]))
            warnings.extend(td.warnings)

    frac = float(d["capacity_fraction"])  # type: ignore[arg-type]
    fraction_text = f"{frac:g} × design web shear capacity (no analysis; common practice)"
    texts: dict[tuple[float, str], str] = {}
    caps: dict[str, tuple[float | None, str]] = {}
    demands: dict[str, Demand | None] = {}
    missing: dict[str, str] = {}
    bad_props: set[tuple[str, str]] = set()

    for j in joints:
        m = members.get(j.beam)
        if m is None:
            demands[j.id] = None
            missing[j.id] = f"beam {j.beam} is not among the members"
            continue
        reasons: list[str] = []
        found: Demand | None = None
        for src in order:
            if src == "model":
                key = str(d["start_shear"] if j.end == "start" else d["end_shear"])
                V, why = None, f"demand.{j.end}_shear is not set"
                if key:
                    V, why = model_shear(m, key, float(n_per_force_unit))
                    present = not why.startswith("the beam has no property")
                    if V is None and present and (m.global_id, key) not in bad_props:  # there, but unusable
                        bad_props.add((m.global_id, key))
                        warnings.append(DataWarning(why, m.global_id, "demand"))
                if V is None:
                    linked = _linked_reaction(reactions, m.global_id, j.end)
                    if linked is None:
                        reasons.append(f"model: {why}" + ("; no linked analysis model reaction"
                                                          if reactions else ""))
                        continue
                    found = Demand(V=linked[0], N=tie_N, source="model", combination=linked[1],
                                   detail=f"linked analysis model reaction: {linked[1]}" + tie_note)
                else:
                    found = Demand(V=V, N=tie_N, source="model",
                                   combination="as in the model's analysis results",
                                   detail=why + tie_note)
            elif src == "schedule":
                if schedule is None:
                    reasons.append("schedule: no demand schedule given")
                    continue
                row = rows.get((m.global_id, j.end))
                if row is None:
                    reasons.append(f"schedule: no row in {schedule.path} for {m.label} end {j.end!r}")
                    continue
                N = row.N if row.N is not None else tie_N
                n_note = "" if row.N is not None else tie_note
                found = Demand(V=row.V, N=N, source="schedule", combination=row.combination or "as scheduled",
                               detail=(f"{schedule.path} line {row.line}: beam {row.key!r} end {row.end!r}"
                                       + (f" ({row.note})" if row.note else "") + n_note))
            elif src == "tributary":
                if td is None:
                    reasons.append(f"tributary: {td_reason}")
                    continue
                r = td.reactions.get((m.global_id, j.end))
                if r is None:
                    why = td.unresolved.get((m.global_id, j.end), "the member is not a beam in the take-down")
                    reasons.append(f"tributary: {why}")
                    continue
                found = Demand(V=r[0], N=tie_N, source="tributary", combination=td.combination,
                               detail=r[1] + tie_note)
            elif src == "capacity-fraction":
                if web_shear_capacity is None:
                    reasons.append("capacity-fraction: no web shear capacity available (rule set)")
                    continue
                if m.global_id not in caps:
                    cap = web_shear_capacity(m)
                    if cap is None:
                        caps[m.global_id] = (None, f"web shear capacity unknown for section {m.section.name!r}")
                    elif isinstance(cap, bool) or not isinstance(cap, (int, float)) \
                            or not math.isfinite(cap) or cap <= 0:
                        caps[m.global_id] = (None, f"web shear capacity {cap!r} is not a positive number")
                    else:
                        caps[m.global_id] = (float(cap), "")
                cap, why = caps[m.global_id]
                if cap is None:
                    reasons.append(f"capacity-fraction: {why}")
                    continue
                # one text object per distinct wording (beams of one section share it)
                detail = texts.setdefault(
                    (cap, m.section.name),
                    f"{frac:g} × {cap / 1e3:.1f} kN web shear capacity of {m.section.name} = "
                    f"{frac * cap / 1e3:.1f} kN" + tie_note)
                found = Demand(V=frac * cap, N=tie_N, source="capacity-fraction",
                               combination=fraction_text, detail=detail)
            if found is not None:
                break
        demands[j.id] = found
        if found is None:
            missing[j.id] = "; ".join(reasons) if reasons else "demand.order names no source"
    return DemandResolution(demands=demands, missing=missing, warnings=tuple(warnings), take_down=td)
