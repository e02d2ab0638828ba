"""The connection schedule: standard fin plates assigned to joints by GlobalId, Tag, section or depth.

A schedule is a CSV (header row) or TOML (``[[connection]]`` tables) file. Each entry has a ``match``
and a ``value``:

* ``globalid`` — the beam's IFC GlobalId (exact);
* ``tag`` — the beam's Tag (exact, case-sensitive);
* ``name`` — the beam's Name (exact);
* ``section`` — the beam's section designation; shell-style wildcards allowed (``310UB*``);
* ``depth`` — a range of beam depth in mm, ``"300-460"`` (inclusive).

and ``end`` = ``start``, ``end`` or ``both``. When several entries match a joint the most specific
wins (globalid, then tag, then name, then section, then depth); among equals, the first in the file.
The fin plate itself: ``plate_thickness, plate_depth, plate_width, bolt_size, bolt_grade, rows,
lines, pitch, gauge, plate_end_edge, plate_side_edge, beam_end_edge, beam_top_edge, a, weld_leg,
weld_electrode`` (mm), optional ``plate_grade``, ``threads_in_shear_plane`` (true/false),
``hole`` (standard, oversize, short-slot, long-slot), ``weld_both_sides`` (true/false).

Errors name the file, the line (CSV) or entry (TOML) and the problem.

An aid to a competent engineer: results must be checked; local codes and licensed practice take
precedence.
"""

from __future__ import annotations

import csv
import fnmatch
import io
import re
import tomllib
from dataclasses import dataclass
from pathlib import Path
from typing import Any, Callable, Mapping, Sequence

from engine.errors import BadInputError
from engine.model import BoltSpec, FinPlate, Joint, Member, Steel, Weld

__all__ = ["ScheduleEntry", "ConnectionSchedule", "read_connection_schedule", "bolt_diameter_mm", "MATCH_KINDS"]

MATCH_KINDS = ("globalid", "tag", "name", "section", "depth")
_NUM = ("plate_thickness", "plate_depth", "plate_width", "pitch", "gauge", "plate_end_edge",
        "plate_side_edge", "beam_end_edge", "beam_top_edge", "a", "weld_leg")
_INT = ("rows", "lines")
_STR = ("bolt_size", "bolt_grade", "weld_electrode")
_OPTIONAL = ("plate_grade", "threads_in_shear_plane", "hole", "weld_both_sides", "note")
REQUIRED = ("match", "value", "end") + _NUM + _INT + _STR
_HOLES = ("standard", "oversize", "short-slot", "long-slot")
_INCH = re.compile(r"^(?:(\d+)[- ])?(\d+)/(\d+)$|^(\d+(?:\.\d+)?)$")
_POSITIVE = ("plate_thickness", "plate_depth", "plate_width")
MAX_DIMENSION_MM = 10_000.0
"""No fin plate dimension, pitch, gauge or edge distance exceeds this (10 m): a larger value is a
unit or typing error."""
MAX_ROWS, MAX_LINES = 100, 10
"""Bolt rows and lines a schedule entry may give (far beyond any fin plate; the bound keeps a
typing error from building a bolt group of millions of bolts)."""
MAX_BOLT_DIAMETER_MM = 100.0
"""Largest nominal bolt diameter accepted (structural bolts stop well below it)."""


def bolt_diameter_mm(size: str) -> float:
    """Nominal bolt diameter in mm from the size as the trade writes it: ``"M20"`` → 20,
    ``"3/4"`` → 19.05, ``"1-1/8"`` → 28.575, ``"1"`` → 25.4. Raises :class:`BadInputError`."""
    s = size.strip()
    d: float | None = None
    if s[:1] in ("M", "m"):
        if re.fullmatch(r"\d+(?:\.\d+)?", s[1:].strip()):
            d = float(s[1:])
    else:
        m = _INCH.match(s.replace('"', "").replace("in", "").strip())
        if m:
            if m.group(4):
                d = float(m.group(4)) * 25.4
            elif float(m.group(3)) > 0:
                whole = float(m.group(1) or 0)
                d = (whole + float(m.group(2)) / float(m.group(3))) * 25.4
    if d is None:
        raise BadInputError(f"bolt size {size!r} is not a metric size like 'M20' or an inch size like '3/4'")
    if not 0.0 < d <= MAX_BOLT_DIAMETER_MM:
        raise BadInputError(f"bolt size {size!r} gives a diameter of {d:g} mm; it must be more than 0 and "
                            f"at most {MAX_BOLT_DIAMETER_MM:g} mm")
    return d


@dataclass(frozen=True)
class ScheduleEntry:
    """One schedule row: what it matches and the fin plate it assigns (grade labels unresolved)."""

    match: str
    value: str
    end: str
    fields: Mapping[str, Any]
    where: str

    def matches(self, beam: Member, end: str) -> bool:
        if self.end not in ("both", end):
            return False
        if self.match == "globalid":
            return beam.global_id == self.value
        if self.match == "tag":
            return beam.tag == self.value
        if self.match == "name":
            return beam.name == self.value
        if self.match == "section":
            return fnmatch.fnmatchcase(beam.section.name.replace(" ", ""), self.value.replace(" ", ""))
        lo, hi = _depth_range(self.value, self.where)
        return beam.section.depth is not None and lo <= beam.section.depth <= hi

    def fin_plate(self, steel_lookup: Callable[[str], Steel | None], default_plate_grade: str) -> FinPlate:
        f = self.fields
        grade = f.get("plate_grade") or default_plate_grade
        steel = steel_lookup(grade)
        if steel is None:
            raise BadInputError(f"{self.where}: plate grade {grade!r} is not a steel grade joint-audit knows")
        return FinPlate(
            thickness=f["plate_thickness"], depth=f["plate_depth"], width=f["plate_width"], steel=steel,
            bolts=BoltSpec(size=f["bolt_size"], diameter=bolt_diameter_mm(f["bolt_size"]), grade=f["bolt_grade"],
                           threads_in_shear_plane=f.get("threads_in_shear_plane", True), hole=f.get("hole", "standard")),
            rows=f["rows"], lines=f["lines"], pitch=f["pitch"], gauge=f["gauge"],
            plate_end_edge=f["plate_end_edge"], plate_side_edge=f["plate_side_edge"],
            beam_end_edge=f["beam_end_edge"], beam_top_edge=f["beam_top_edge"], a=f["a"],
            weld=Weld(leg=f["weld_leg"], electrode=f["weld_electrode"], both_sides=f.get("weld_both_sides", True)),
            source="scheduled",
        )


def _depth_range(value: str, where: str) -> tuple[float, float]:
    m = re.fullmatch(r"\s*(\d+(?:\.\d+)?)\s*-\s*(\d+(?:\.\d+)?)\s*", value)
    if not m:
        raise BadInputError(f"{where}: depth range {value!r} must look like '300-460' (mm)")
    lo, hi = float(m.group(1)), float(m.group(2))
    if lo > hi:
        raise BadInputError(f"{where}: depth range {value!r} runs backwards")
    return lo, hi


_SPECIFICITY = {k: i for i, k in enumerate(MATCH_KINDS)}


@dataclass(frozen=True)
class ConnectionSchedule:
    """A parsed connection schedule; :meth:`lookup` finds the entry for a joint."""

    entries: tuple[ScheduleEntry, ...]
    file: str = ""

    def lookup(self, joint: Joint, beam: Member) -> ScheduleEntry | None:
        best: ScheduleEntry | None = None
        for e in self.entries:
            if e.matches(beam, joint.end) and (best is None or _SPECIFICITY[e.match] < _SPECIFICITY[best.match]):
                best = e
        return best


def _bool(v: Any, where: str, key: str) -> bool:
    if isinstance(v, bool):
        return v
    s = str(v).strip().lower()
    if s in ("true", "yes", "1"):
        return True
    if s in ("false", "no", "0"):
        return False
    raise BadInputError(f"{where}: '{key}' must be true or false, not {v!r}")


def _entry(raw: Mapping[str, Any], where: str) -> ScheduleEntry:
    known = set(REQUIRED) | set(_OPTIONAL)
    unknown = sorted(k for k in raw if k not in known)
    if unknown:
        raise BadInputError(f"{where}: unknown column '{unknown[0]}' (the columns are {', '.join(REQUIRED + _OPTIONAL)})")
    missing = [k for k in REQUIRED if raw.get(k) in (None, "")]
    if missing:
        raise BadInputError(f"{where}: '{missing[0]}' is missing")
    match = str(raw["match"]).strip().lower()
    if match not in MATCH_KINDS:
        raise BadInputError(f"{where}: match {raw['match']!r} must be one of {', '.join(MATCH_KINDS)}")
    end = str(raw["end"]).strip().lower()
    if end not in ("start", "end", "both"):
        raise BadInputError(f"{where}: end {raw['end']!r} must be start, end or both")
    fields: dict[str, Any] = {}
    for k in _NUM:
        try:
            fields[k] = float(raw[k])
        except (TypeError, ValueError):
            raise BadInputError(f"{where}: '{k}' must be a number in mm, not {raw[k]!r}") from None
        if not fields[k] >= 0 or fields[k] == float("inf"):
            raise BadInputError(f"{where}: '{k}' must be a finite number >= 0, not {raw[k]!r}")
        if fields[k] > MAX_DIMENSION_MM:
            raise BadInputError(f"{where}: '{k}' is {fields[k]:g} mm, more than {MAX_DIMENSION_MM:g} mm "
                                f"(a unit or typing error?)")
        if k in _POSITIVE and fields[k] == 0:
            raise BadInputError(f"{where}: '{k}' must be more than 0 mm")
    for k, most in zip(_INT, (MAX_ROWS, MAX_LINES)):
        try:
            fields[k] = int(str(raw[k]).strip())
        except ValueError:
            raise BadInputError(f"{where}: '{k}' must be a whole number, not {raw[k]!r}") from None
        if fields[k] < 1:
            raise BadInputError(f"{where}: '{k}' must be at least 1")
        if fields[k] > most:
            raise BadInputError(f"{where}: '{k}' is {fields[k]}; a fin plate has at most {most}")
    for k, n in (("pitch", "rows"), ("gauge", "lines")):
        if fields[n] > 1 and fields[k] <= 0:
            raise BadInputError(f"{where}: '{k}' must be more than 0 mm when there is more than one of '{n}'")
    for k in _STR:
        fields[k] = str(raw[k]).strip()
    try:
        bolt_diameter_mm(fields["bolt_size"])
    except BadInputError as exc:
        raise BadInputError(f"{where}: {exc}") from None
    if raw.get("plate_grade") not in (None, ""):
        fields["plate_grade"] = str(raw["plate_grade"]).strip()
    for k in ("threads_in_shear_plane", "weld_both_sides"):
        if raw.get(k) not in (None, ""):
            fields[k] = _bool(raw[k], where, k)
    if raw.get("hole") not in (None, ""):
        hole = str(raw["hole"]).strip().lower()
        if hole not in _HOLES:
            raise BadInputError(f"{where}: hole {raw['hole']!r} must be one of {', '.join(_HOLES)}")
        fields["hole"] = hole
    entry = ScheduleEntry(match, str(raw["value"]).strip(), end, fields, where)
    if match == "depth":
        _depth_range(entry.value, where)
    return entry


def read_connection_schedule(path: str | Path) -> ConnectionSchedule:
    """Parse a connection schedule (``.csv`` or ``.toml``). Raises :class:`BadInputError` naming the
    file, the line or entry, and the problem."""
    p = Path(path)
    if not p.is_file():
        raise BadInputError(f"schedule {p} does not exist or is not a file")
    try:
        text = p.read_text(encoding="utf-8-sig")
    except UnicodeDecodeError:
        raise BadInputError(f"schedule {p} is not a UTF-8 text file") from None
    entries: list[ScheduleEntry] = []
    if p.suffix.lower() == ".toml":
        try:
            data = tomllib.loads(text)
        except tomllib.TOMLDecodeError as exc:
            raise BadInputError(f"schedule {p}: not valid TOML ({exc})") from None
        except RecursionError:
            raise BadInputError(f"schedule {p}: not valid TOML (nested too deeply)") from None
        rows = data.get("connection")
        if not isinstance(rows, list) or set(data) - {"connection"}:
            raise BadInputError(f"schedule {p}: expected only [[connection]] tables")
        for i, raw in enumerate(rows):
            entries.append(_entry(raw, f"{p} [[connection]] #{i + 1}"))
    elif p.suffix.lower() == ".csv":
        reader = csv.DictReader(io.StringIO(text))
        if not reader.fieldnames:
            raise BadInputError(f"schedule {p}: empty file (expected a header row)")
        for raw in reader:
            where = f"{p} line {reader.line_num}"
            if None in raw:
                raise BadInputError(f"{where}: more values than header columns")
            entries.append(_entry({k.strip(): v for k, v in raw.items()}, where))
    else:
        raise BadInputError(f"schedule {p}: use a .csv or .toml file")
    return ConnectionSchedule(tuple(entries), str(p))
