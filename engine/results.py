"""``results.json`` (the contract other tools read, DESIGN.md §5), the baseline comparison and the CSV
connection schedule.

Forces are shown in kN (``V_kN``), checks keep the unit they were computed in, converted to kN / kN·m
for display (``unit`` says which). Output is deterministic: joints in id order, keys in a fixed order,
floats rounded to a fixed number of significant figures, and the run's timestamp only in
``run.date``.

An aid to a competent engineer: results must be checked; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

import csv
import io
import json
import math
from dataclasses import asdict
from pathlib import Path
from typing import Any, Iterator, Mapping, Sequence

from engine import __version__
from engine.cautions import CAUTION
from engine.errors import BadInputError
from engine.evaluate import ISSUE_STATUSES
from engine.model import STATUSES, Check, FinPlate, Frame, JointResult, Member

__all__ = [
    "results_document",
    "check_to_display",
    "connection_summary",
    "read_baseline",
    "baseline_marks",
    "schedule_csv",
    "schedule_row",
    "SCHEDULE_COLUMNS",
]


def _r(x: float | None, sig: int = 6) -> float | None:
    if x is None:
        return None
    if not math.isfinite(x):
        return None
    if x == 0:
        return 0.0
    return float(f"{x:.{sig}g}")


_DISPLAY = {"N": ("kN", 1e-3), "N·mm": ("kN·m", 1e-6), "N/mm": ("kN/m", 1.0), "mm": ("mm", 1.0), "MPa": ("MPa", 1.0), "-": ("-", 1.0)}


def check_to_display(c: Check) -> dict[str, Any]:
    """A check as results.json writes it: forces in kN, moments in kN·m, lengths in mm."""
    unit, f = _DISPLAY.get(c.unit, (c.unit, 1.0))
    return {
        "name": c.name,
        "clause": c.clause,
        "demand": _r(c.demand * f),
        "capacity": _r(c.capacity * f),
        "unit": unit,
        "utilisation": _r(c.utilisation, 4),
        "passed": bool(c.passed),
        "incomplete": bool(c.incomplete),
        "note": c.note,
    }


def connection_summary(p: FinPlate) -> str:
    """One line naming the connection, e.g. ``"fin plate 10 x 230 x 100 Gr 300, 3 x M20 8.8 (3 rows x 1 line), 6 mm E48XX both sides"``."""
    side = "both sides" if p.weld.both_sides else "one side"
    return (
        f"fin plate {p.thickness:g} x {p.depth:g} x {p.width:g} {p.steel.grade}, "
        f"{p.n_bolts} x {p.bolts.size} {p.bolts.grade} ({p.rows} rows x {p.lines} line{'s' if p.lines > 1 else ''}), "
        f"{p.weld.leg:g} mm {p.weld.electrode} {side}"
    )


def _connection_dict(p: FinPlate | None) -> dict[str, Any] | None:
    if p is None:
        return None
    d = asdict(p)
    d["summary"] = connection_summary(p)
    d["n_bolts"] = p.n_bolts
    return d


def results_document(
    results: Sequence[JointResult],
    frame: Frame,
    members: Mapping[str, Member],
    code: str,
    code_title: str = "",
    baseline: Mapping[str, str | None] | None = None,
    removed: Sequence[dict[str, Any]] = (),
    run_date: str = "",
    config: Mapping[str, Any] | None = None,
    warnings: Sequence[Any] = (),
    baseline_was: Mapping[str, str] | None = None,
    *,
    stream: bool = False,
) -> dict[str, Any]:
    """The results.json document for one audit run. ``baseline_was`` (joint id → status in the
    baseline run) adds ``baseline_was`` to each joint resolved since then, so the BCF writer can
    close the topic the issue had (one per joint, or its storey's group of joints needing design).

    With ``stream=True`` the document's ``joints`` and ``warnings`` are one-pass iterators that
    make each entry as it is asked for, instead of lists: for writers that go through them once, so
    that a large model's document is never held whole (the command line). Everything else,
    ``summary`` included, is the same."""
    ordered = sorted(results, key=lambda r: r.joint.id)
    summary = {"joints": len(results), **{s: 0 for s in STATUSES}}
    for res in ordered:
        summary[res.status] += 1
    joints = _joint_entries(ordered, members, baseline or {}, baseline_was)
    entries = (
        {"global_id": _gid(getattr(w, "global_id", None)), "message": str(getattr(w, "message", w))}
        for w in warnings
    )
    return {
        "tool": {"name": "joint-audit", "version": __version__},
        "caution": CAUTION,
        "run": {"date": run_date},
        "model": {
            "file": Path(frame.file).name,
            "schema": frame.schema,
            "length_unit": frame.length_unit,
            "force_unit": frame.force_unit,
        },
        "code": code,
        "code_title": code_title,
        "policy": (config or {}).get("support", {}).get("policy", ""),
        "summary": summary,
        "joints": joints if stream else list(joints),
        "baseline_removed": list(removed),
        "warnings": entries if stream else list(entries),
    }


def _joint_entries(ordered: Sequence[JointResult], members: Mapping[str, Member],
                   marks: Mapping[str, str | None], baseline_was: Mapping[str, str] | None
                   ) -> Iterator[dict[str, Any]]:
    """The ``joints`` entries of the results document, one per result of ``ordered`` (in that order)."""
    who: dict[str | None, tuple[str, str, str]] = {None: ("", "", "")}  # GlobalId → (label, section, storey)

    def _who(gid: str | None) -> tuple[str, str, str]:
        if gid not in who:
            m = members.get(gid)
            who[gid] = (m.label, m.section.name, m.storey) if m else ("", "", "")
        return who[gid]

    rounded: dict[float | None, float | None] = {}  # _r of the values met so far: most recur

    def _rv(x: float | None) -> float | None:
        try:
            return rounded[x]
        except KeyError:
            v = rounded[x] = _r(x)
            return v
        except TypeError:  # not a number: _r says what
            return _r(x)

    for res in ordered:
        j = res.joint
        beam_label, beam_section, beam_storey = _who(j.beam)
        support_label, support_section, _ = _who(j.support)
        g = j.geometry
        d = res.demand
        entry = {
            "id": j.id,
            "beam": j.beam,
            "beam_name": beam_label,
            "beam_section": beam_section,
            "end": j.end,
            "support": j.support,
            "support_name": support_label,
            "support_section": support_section,
            "storey": beam_storey,
            "location_mm": [_rv(v) for v in g.location],
            "kind": j.kind,
            "stiffness": j.stiffness,
            "stiffness_reasons": list(j.reasons),
            "geometry": {
                "angle_deg": _rv(g.angle_deg),
                "gap_mm": _rv(g.gap),
                "tos_diff_mm": _rv(g.tos_diff),
                "copes": [{"where": c.where, "depth": c.depth, "length": c.length} for c in g.copes],
                "support_continuous": g.support_continuous,
                "back_to_back": g.back_to_back,
            },
            "demand": None
            if d is None
            else {
                "V_kN": _rv(d.V * 1e-3),
                "N_kN": _rv(d.N * 1e-3),
                "source": d.source,
                "combination": d.combination,
            },
            "connection": _connection_dict(res.connection),
            "checks": [check_to_display(c) for c in res.checks],
            "utilisation": _r(res.utilisation, 4),
            "governing": res.governing,
            "status": res.status,
            "missing": list(res.missing),
            "note": res.note,
            "baseline": marks.get(j.id),
        }
        if baseline_was and entry["baseline"] == "resolved":
            entry["baseline_was"] = baseline_was.get(j.id)
        yield entry


def _gid(value: Any) -> str | None:
    """A warning's GlobalId as results.json writes it: text or null (never another object)."""
    return value if isinstance(value, str) or value is None else None


def read_baseline(path: str | Path) -> dict[str, dict[str, Any]]:
    """Joints of an earlier results.json keyed by id. Raises :class:`BadInputError` naming the file."""
    p = Path(path)
    if not p.is_file():
        raise BadInputError(f"baseline {p} does not exist or is not a file")
    try:
        doc = json.loads(p.read_text(encoding="utf-8"))
    except (UnicodeDecodeError, ValueError) as exc:  # JSONDecodeError, and over-long integers
        raise BadInputError(f"baseline {p} is not a joint-audit results.json ({exc})") from None
    except RecursionError:
        raise BadInputError(f"baseline {p} is not a joint-audit results.json (nested too deeply)") from None
    except OSError as exc:
        raise BadInputError(f"baseline {p} cannot be read: {exc.strerror or exc}") from None
    if not isinstance(doc, dict) or not isinstance(doc.get("joints"), list):
        raise BadInputError(f"baseline {p} is not a joint-audit results.json (no 'joints' list)")
    out: dict[str, dict[str, Any]] = {}
    for i, j in enumerate(doc["joints"]):
        if not isinstance(j, dict) or not isinstance(j.get("id"), str) or not isinstance(j.get("status"), str):
            raise BadInputError(f"baseline {p}: joints[{i}] has no string 'id' and 'status'")
        out[j["id"]] = j
    return out


def baseline_marks(
    results: Sequence[JointResult], old: Mapping[str, Mapping[str, Any]]
) -> tuple[dict[str, str | None], list[dict[str, Any]]]:
    """Mark each joint against an earlier run: ``new`` (an issue now, not before), ``open`` (an issue
    both times), ``resolved`` (an issue before, not now), ``None`` (no issue either time). Also the
    earlier issues whose joints are gone from the model (resolved by removal)."""
    marks: dict[str, str | None] = {}
    for r in results:
        now = r.status in ISSUE_STATUSES
        before_j = old.get(r.joint.id)
        before = before_j is not None and before_j.get("status") in ISSUE_STATUSES
        marks[r.joint.id] = "open" if now and before else "new" if now else "resolved" if before else None
    current = {r.joint.id for r in results}
    removed = [
        {"id": jid, "beam": j.get("beam"), "end": j.get("end"), "support": j.get("support"), "status": j.get("status"), "baseline": "resolved"}
        for jid, j in sorted(old.items())
        if jid not in current and j.get("status") in ISSUE_STATUSES
    ]
    return marks, removed


SCHEDULE_COLUMNS = (
    "joint_id", "beam", "beam_name", "end", "support", "support_name", "storey", "kind", "stiffness",
    "V_kN", "demand_source", "connection", "utilisation", "governing", "status", "baseline",
)


def schedule_csv(doc: Mapping[str, Any]) -> str:
    """The connection schedule (one row per joint) as CSV text, from a results document."""
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(SCHEDULE_COLUMNS)
    w.writerows(schedule_row(j) for j in doc["joints"])
    return buf.getvalue()


def schedule_row(j: Mapping[str, Any]) -> list[Any]:
    """One joint's row of the connection schedule (:data:`SCHEDULE_COLUMNS`), from its results entry."""
    return [
        j["id"], j["beam"], j["beam_name"], j["end"], j["support"] or "", j["support_name"], j["storey"],
        j["kind"], j["stiffness"],
        "" if j["demand"] is None else j["demand"]["V_kN"],
        "" if j["demand"] is None else j["demand"]["source"],
        "" if j["connection"] is None else j["connection"]["summary"],
        "" if j["utilisation"] is None else j["utilisation"],
        j["governing"] or "", j["status"], j["baseline"] or "",
    ]
