"""A demand schedule: design end shears (and optional tie forces) for named beam ends, from a file.

An aid to a competent engineer: the tool takes the scheduled numbers as given; the engineer who
wrote the schedule is responsible for them, results must be checked, and the governing local code
and licensed practice take precedence.

Two formats, chosen by the file's suffix:

* **CSV** (``.csv``, comma- or semicolon-separated, UTF-8, an optional byte-order mark). The first
  non-blank line is the header. Columns, in any order, names case-insensitive:

  ``beam``  (required) the beam's IFC GlobalId, Tag or Name;
  ``end``   (required) ``start``, ``end`` or ``both``;
  ``V_kN``  (required) design end shear V* in kN;
  ``N_kN``  (optional) design tie/axial force N* in kN;
  ``combination``, ``note`` (optional) free text carried into the results.

  Blank lines and lines whose first cell starts with ``#`` are skipped.

* **TOML** (``.toml``): an array of tables ``[[demand]]`` with the same keys, numbers as numbers::

      [[demand]]
      beam = "B12"
      end = "both"
      V_kN = 85.0
      N_kN = 30.0

Values are magnitudes: a negative shear or axial force (an analysis sign convention) is taken as
its absolute value. kN are converted to N on reading.

Matching (:meth:`DemandSchedule.match`). A row's ``beam`` key is compared with every beam's GlobalId
first; if no GlobalId equals it, with every Tag; if no Tag does, with every Name (exact, after
trimming spaces). The key applies to every beam matched at the first level that matches (a Tag or
Name shared by several beams applies to each of them, with a warning). For one beam end, a row
matched by GlobalId beats one matched by Tag, which beats one matched by Name; at the same level a
row for that end beats a ``both`` row of another key. A row that matches no beam is a
:class:`~engine.model.DataWarning`.

Errors (:class:`~engine.errors.BadInputError`) name the file, the line and the problem: an unknown
or missing column, an unknown end, a value that is not a finite number, a duplicate key (the same
beam key and end twice, or ``both`` together with ``start``/``end`` for the same key).
"""

from __future__ import annotations

import csv
import io
import math
import re
import tomllib
from dataclasses import dataclass
from pathlib import Path
from typing import Iterable

from engine.errors import BadInputError
from engine.model import DataWarning, Member

__all__ = ["ScheduleRow", "DemandSchedule", "read_demand_schedule", "parse_demand_csv",
           "parse_demand_toml", "ENDS", "COLUMNS"]

ENDS: tuple[str, ...] = ("start", "end", "both")
"""The values the ``end`` column takes."""

COLUMNS: tuple[str, ...] = ("beam", "end", "V_kN", "N_kN", "combination", "note")
"""The columns (CSV) or keys (TOML) a demand schedule may have."""

_REQUIRED = ("beam", "end", "V_kN")
_CANON = {c.lower(): c for c in COLUMNS}
_LEVELS = ("GlobalId", "Tag", "Name")


@dataclass(frozen=True)
class ScheduleRow:
    """One row of a demand schedule. ``V``/``N`` in N (``N`` is ``None`` when not given);
    ``line`` is the 1-based line of the file the row came from."""

    key: str
    end: str
    V: float
    N: float | None
    line: int
    combination: str = ""
    note: str = ""


@dataclass(frozen=True)
class DemandSchedule:
    """The rows of one demand schedule file (``path`` as given, for messages)."""

    path: str
    rows: tuple[ScheduleRow, ...]

    def match(self, members: Iterable[Member]) -> tuple[dict[tuple[str, str], ScheduleRow], list[DataWarning]]:
        """Which row applies to each beam end: ``{(GlobalId, "start"|"end"): row}``, and warnings
        for rows that match no beam or match several beams by a shared Tag or Name.

        Matching rules are in the module docstring. Only members with role ``beam`` are matched.
        """
        by_level: list[dict[str, list[str]]] = [{}, {}, {}]
        for m in members:
            if m.role != "beam":
                continue
            for level, value in enumerate((m.global_id, m.tag, m.name)):
                value = (value or "").strip()
                if value:
                    by_level[level].setdefault(value, []).append(m.global_id)
        chosen: dict[tuple[str, str], tuple[tuple[int, int], ScheduleRow]] = {}
        warnings: list[DataWarning] = []
        for row in self.rows:
            hit_level, gids = None, []
            for level in range(3):
                gids = by_level[level].get(row.key, [])
                if gids:
                    hit_level = level
                    break
            if hit_level is None:
                warnings.append(DataWarning(
                    f"{self.path} line {row.line}: beam {row.key!r} matches no beam's GlobalId, Tag or "
                    f"Name; the row is not used", None, "demand"))
                continue
            gids = sorted(set(gids))
            if len(gids) > 1:
                warnings.append(DataWarning(
                    f"{self.path} line {row.line}: beam {row.key!r} matches {len(gids)} beams by "
                    f"{_LEVELS[hit_level]}; the row is applied to each of them", None, "demand"))
            ends = ("start", "end") if row.end == "both" else (row.end,)
            rank = (hit_level, 1 if row.end == "both" else 0)
            for gid in gids:
                for end in ends:
                    prev = chosen.get((gid, end))
                    if prev is None or rank < prev[0]:
                        chosen[(gid, end)] = (rank, row)
        return {k: v[1] for k, v in chosen.items()}, warnings


def read_demand_schedule(path: str | Path) -> DemandSchedule:
    """Read a demand schedule from a ``.csv`` or ``.toml`` file (format in the module docstring).

    Raises :class:`BadInputError` naming the file, the line and the problem.
    """
    p = Path(path)
    where = str(path)
    if not p.is_file():
        raise BadInputError(f"demand schedule {where} does not exist or is not a file")
    suffix = p.suffix.lower()
    if suffix not in (".csv", ".toml"):
        raise BadInputError(f"demand schedule {where}: unknown format {p.suffix!r}; use a .csv or .toml file")
    try:
        text = p.read_text(encoding="utf-8-sig")
    except UnicodeDecodeError:
        raise BadInputError(f"demand schedule {where}: not a UTF-8 text file") from None
    rows = parse_demand_csv(text, where) if suffix == ".csv" else parse_demand_toml(text, where)
    return DemandSchedule(path=where, rows=tuple(rows))


def parse_demand_csv(text: str, where: str) -> list[ScheduleRow]:
    """Rows of a CSV demand schedule held in ``text``; ``where`` names the file in messages."""
    first = next((ln for ln in text.splitlines() if ln.strip() and not ln.lstrip().startswith("#")), "")
    delimiter = ";" if first.count(";") > first.count(",") else ","
    reader = csv.reader(io.StringIO(text), delimiter=delimiter)
    header: list[str] | None = None
    raw: list[tuple[int, dict[str, str]]] = []
    header_line = 0
    for cells in reader:
        line = reader.line_num
        if not any(c.strip() for c in cells) or cells[0].lstrip().startswith("#"):
            continue
        if header is None:
            header = []
            for c in cells:
                name = c.strip()
                canon = _CANON.get(name.lower())
                if canon is None:
                    raise BadInputError(
                        f"{where} line {line}: unknown column {name!r} (columns: {', '.join(COLUMNS)})")
                if canon in header:
                    raise BadInputError(f"{where} line {line}: column {canon!r} appears twice")
                header.append(canon)
            missing = [c for c in _REQUIRED if c not in header]
            if missing:
                raise BadInputError(f"{where} line {line}: missing column(s) {', '.join(missing)} "
                                    f"(required: {', '.join(_REQUIRED)})")
            header_line = line
            continue
        if len(cells) > len(header) and any(c.strip() for c in cells[len(header):]):
            raise BadInputError(f"{where} line {line}: {len(cells)} cells but the header on line "
                                f"{header_line} names {len(header)} columns")
        values = {name: (cells[i].strip() if i < len(cells) else "") for i, name in enumerate(header)}
        raw.append((line, values))
    if header is None:
        raise BadInputError(f"{where}: empty demand schedule (no header line)")
    return _rows(raw, where)


_TOML_HEADER = re.compile(r"^\s*\[\[\s*demand\s*\]\]")


def parse_demand_toml(text: str, where: str) -> list[ScheduleRow]:
    """Rows of a TOML demand schedule (``[[demand]]`` tables) held in ``text``."""
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise BadInputError(f"{where}: not valid TOML ({exc})") from None
    except RecursionError:
        raise BadInputError(f"{where}: not valid TOML (nested too deeply)") from None
    for key in data:
        if key != "demand":
            raise BadInputError(f"{where}: unknown key {key!r} (a demand schedule holds [[demand]] tables)")
    entries = data.get("demand", [])
    if not isinstance(entries, list) or not all(isinstance(e, dict) for e in entries):
        raise BadInputError(f"{where}: 'demand' must be an array of tables, written [[demand]]")
    header_lines = [i + 1 for i, ln in enumerate(text.splitlines()) if _TOML_HEADER.match(ln)]
    raw: list[tuple[int, dict[str, str]]] = []
    for i, entry in enumerate(entries):
        line = header_lines[i] if i < len(header_lines) else 0
        values: dict[str, str] = {}
        for k, v in entry.items():
            canon = _CANON.get(k.lower())
            if canon is None:
                raise BadInputError(f"{where} line {line}: unknown key {k!r} in [[demand]] "
                                    f"(keys: {', '.join(COLUMNS)})")
            if canon in ("V_kN", "N_kN"):
                if isinstance(v, bool) or not isinstance(v, (int, float)):
                    raise BadInputError(f"{where} line {line}: {canon} must be a number, not {v!r}")
                values[canon] = repr(float(v))
            else:
                if not isinstance(v, str):
                    raise BadInputError(f"{where} line {line}: {canon} must be a string, not {v!r}")
                values[canon] = v.strip()
        missing = [c for c in _REQUIRED if c not in values]
        if missing:
            raise BadInputError(f"{where} line {line}: [[demand]] lacks {', '.join(missing)}")
        raw.append((line, values))
    return _rows(raw, where)


def _number(text: str, column: str, where: str, line: int) -> float:
    try:
        value = float(text)
    except ValueError:
        raise BadInputError(f"{where} line {line}: {column} {text!r} is not a number") from None
    if not math.isfinite(value) or not math.isfinite(value * 1e3):
        raise BadInputError(f"{where} line {line}: {column} {text!r} is not a finite number of kN")
    return abs(value)


def _rows(raw: list[tuple[int, dict[str, str]]], where: str) -> list[ScheduleRow]:
    rows: list[ScheduleRow] = []
    seen: dict[tuple[str, str], int] = {}
    for line, v in raw:
        key = v.get("beam", "").strip()
        if not key:
            raise BadInputError(f"{where} line {line}: the beam key is empty (give a GlobalId, Tag or Name)")
        end = v.get("end", "").strip().lower()
        if end not in ENDS:
            raise BadInputError(f"{where} line {line}: unknown end {v.get('end', '')!r} "
                                f"(use {', '.join(ENDS)})")
        if not v.get("V_kN", "").strip():
            raise BadInputError(f"{where} line {line}: V_kN is empty")
        V = _number(v["V_kN"], "V_kN", where, line) * 1e3
        n_text = v.get("N_kN", "").strip()
        N = _number(n_text, "N_kN", where, line) * 1e3 if n_text else None
        clashes = [(key, end)] if end != "both" else []
        clashes += [(key, "both")] if end != "both" else [(key, "both"), (key, "start"), (key, "end")]
        for c in clashes:
            if c in seen:
                raise BadInputError(
                    f"{where} line {line}: duplicate key: beam {key!r} end {end!r} is already given "
                    f"on line {seen[c]} (end {c[1]!r})")
        seen[(key, end)] = line
        rows.append(ScheduleRow(key=key, end=end, V=V, N=N, line=line,
                                combination=v.get("combination", ""), note=v.get("note", "")))
    return rows
