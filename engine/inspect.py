"""Summaries of a read frame for ``joint-audit inspect`` (plain, JSON-serialisable data).

An aid to a competent engineer: results must be checked; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

from collections import Counter
from typing import Any

from engine.model import Frame

__all__ = ["summarise_frame", "format_summary"]


def summarise_frame(frame: Frame) -> dict[str, Any]:
    """Schema, units, counts by class and role, section and grade resolution, warnings."""
    roles = Counter(m.role for m in frame.members)
    src = Counter(
        "parametric" if m.section.source.startswith("ifc") else
        "catalog" if m.section.source.startswith("catalog") else "unknown"
        for m in frame.members
    )
    grades = Counter((m.steel.grade if m.steel else "(none)") for m in frame.members)
    sections = Counter(m.section.name or "(unnamed)" for m in frame.members)
    parts = Counter(p.kind for p in frame.parts)
    return {
        "file": frame.file,
        "schema": frame.schema,
        "length_unit": frame.length_unit,
        "mm_per_unit": frame.mm_per_unit,
        "force_unit": frame.force_unit,
        "n_per_force_unit": frame.n_per_force_unit,
        "counts_by_class": dict(sorted(frame.counts_by_class.items())),
        "members": len(frame.members),
        "members_by_role": {r: roles.get(r, 0) for r in ("beam", "column", "brace", "other")},
        "sections_by_source": {k: src.get(k, 0) for k in ("parametric", "catalog", "unknown")},
        "sections": dict(sorted(sections.items())),
        "grades": dict(sorted(grades.items())),
        "bearings": len(frame.bearings),
        "connection_parts": dict(sorted(parts.items())),
        "explicit_connections": len(frame.connections),
        "warnings": [{"global_id": w.global_id, "message": w.message} for w in frame.warnings],
    }


def _counts(d: dict[str, int]) -> str:
    return ", ".join(f"{k} {v}" for k, v in d.items()) or "none"


def format_summary(s: dict[str, Any], max_warnings: int = 25) -> str:
    """Human-readable text of :func:`summarise_frame`'s result."""
    lines = [
        f"model          {s['file']}",
        f"schema         {s['schema']}",
        f"length unit    {s['length_unit']} (1 unit = {s['mm_per_unit']:g} mm)",
        f"force unit     {s['force_unit']} (1 unit = {s['n_per_force_unit']:g} N)",
        f"IFC classes    {_counts(s['counts_by_class'])}",
        f"members        {s['members']} ({_counts(s['members_by_role'])})",
        f"sections       {_counts(s['sections_by_source'])}",
        f"grades         {_counts(s['grades'])}",
        f"bearings       {s['bearings']} (walls, slabs, footings)",
        f"parts          {_counts(s['connection_parts'])}",
        f"relations      {s['explicit_connections']} explicit connectivity relations",
    ]
    warns = s["warnings"]
    lines.append(f"warnings       {len(warns)}")
    for w in warns[:max_warnings]:
        gid = f"{w['global_id']}: " if w["global_id"] else ""
        lines.append(f"  - {gid}{w['message']}")
    if len(warns) > max_warnings:
        lines.append(f"  ... and {len(warns) - max_warnings} more (use --json for all)")
    return "\n".join(lines)
