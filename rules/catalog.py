"""Section and steel-grade look-up by the names models use.

* :func:`lookup_section` — a rolled section by designation, from the tables in ``rules/data``
  (``sections_asnzs.toml``, ``sections_en.toml``, ``sections_us.toml``; each names its source),
  normalising the ways exporters write the same name ("310UB40.4", "UB 310x40.4", "IPE 300",
  "HE 200 A", "W12x26"). Hollow sections and angles whose designation spells out their dimensions
  ("100x6.0SHS", "RHS 150x50x3", "CHS 168.3x6.4", "HSS6X6X1/4", "L3-1/2X3X3/8",
  "100x100x10EA") are built from those dimensions (``source="catalog:designation"``).
* :func:`lookup_steel` — a steel grade by label ("S355", "S355JR", "Grade 300",
  "AS/NZS 3679.1-300", "300PLUS", "A992", "ASTM A572 Gr. 50", "STEEL/S275J0"), from
  ``rules/data/steel_grades.toml``; ``lookup_steel("default")`` is the configured fallback.

Plain data in, :class:`engine.model.Section` / :class:`engine.model.Steel` out; no IFC here.

An aid to a competent engineer: results must be checked, and the governing local code and licensed
practice take precedence.
"""

from __future__ import annotations

import math
import re
from fractions import Fraction
from functools import lru_cache

from engine.model import Section, Steel
from rules.tables import load_table

__all__ = [
    "SECTION_TABLES",
    "lookup_section",
    "lookup_steel",
    "section_names",
    "steel_grades",
    "normalise_section_name",
    "normalise_grade_label",
    "parse_designation",
]

SECTION_TABLES: tuple[str, ...] = ("sections_asnzs", "sections_en", "sections_us")

_IN = 25.4  # mm per inch (exact)


# --------------------------------------------------------------------------------------------
# Sections
# --------------------------------------------------------------------------------------------


def _num(s: str) -> str:
    """A number as a canonical string: '40.40' → '40.4', '82.0' → '82', '101' → '101'."""
    v = float(s)
    return f"{v:g}" if v != int(v) else str(int(v))


_AS_FAMILIES = "UB|UC|PFC|WB|WC|TFB|UBP"


def normalise_section_name(name: str) -> str | None:
    """The catalog key for a rolled I or channel designation, or ``None``.

    >>> [normalise_section_name(n) for n in ("310UB40.4", "UB 310x40.4", "ipe 300", "HE 200 A",
    ...                                     "HEA200", "W12x26", "W 12 X 26", "530UB82.0")]
    ['310UB40.4', '310UB40.4', 'IPE300', 'HEA200', 'HEA200', 'W12X26', 'W12X26', '530UB82']
    """
    s = name.strip().upper().replace("×", "X").replace("*", "X")
    s = re.sub(r"[\s_\-]+", " ", s).strip()
    compact = s.replace(" ", "")
    m = re.fullmatch(rf"(\d+)({_AS_FAMILIES})(\d+(?:\.\d+)?)?", compact)
    if m:
        return f"{int(m.group(1))}{m.group(2)}{_num(m.group(3)) if m.group(3) else ''}"
    m = re.fullmatch(rf"({_AS_FAMILIES})(\d+)X(\d+(?:\.\d+)?)", compact)
    if m:
        return f"{int(m.group(2))}{m.group(1)}{_num(m.group(3))}"
    m = re.fullmatch(r"(IPE|IPEA|IPEO|UPN|UPE|PFC|HD|HL)(\d+)", compact)
    if m:
        return f"{m.group(1)}{int(m.group(2))}"
    m = re.fullmatch(r"HE(\d+)([ABM]|AA)", compact) or re.fullmatch(r"HE([ABM]|AA)(\d+)", compact)
    if m:
        a, b = m.groups()
        size, series = (a, b) if a.isdigit() else (b, a)
        return f"HE{series}{int(size)}"
    m = re.fullmatch(r"(W|M|S|HP|C|MC)(\d+(?:\.\d+)?)X(\d+(?:\.\d+)?)", compact)
    if m:
        return f"{m.group(1)}{_num(m.group(2))}X{_num(m.group(3))}"
    return None


@lru_cache(maxsize=None)
def _section_index() -> dict[str, tuple[str, dict, dict]]:
    """key → (table name, row, table meta) over all section tables."""
    index: dict[str, tuple[str, dict, dict]] = {}
    for table in SECTION_TABLES:
        data = load_table(table)
        meta = data.get("meta", {})
        for name, row in data.get("sections", {}).items():
            key = normalise_section_name(name) or name.upper()
            index.setdefault(key, (table, row, meta))
            for alias in row.get("aliases", ()):
                index.setdefault(normalise_section_name(alias) or alias.upper(), (table, row, meta))
    return index


def section_names() -> list[str]:
    """Every catalog key, sorted."""
    return sorted(_section_index())


def _row_section(name: str, table: str, row: dict, meta: dict) -> Section:
    length = float(meta.get("length_mm", 1.0))
    area = float(meta.get("area_mm2", 1.0))
    inertia = float(meta.get("inertia_mm4", 1.0))

    def g(key, scale):
        v = row.get(key)
        return None if v is None else round(float(v) * scale, 6 if scale < 10 else 3)

    tf = g("tf", length)
    r = g("r", length)
    if r is None and row.get("k") is not None and tf is not None:  # AISC: k_des − tf ≈ fillet
        r = round(max(0.0, float(row["k"]) * length - tf), 3)
    return Section(
        name=name,
        kind=row.get("kind", "I"),
        depth=g("d", length),
        width=g("bf", length),
        web_thickness=g("tw", length),
        flange_thickness=tf,
        root_radius=r,
        area=g("A", area),
        I_major=g("Ix", inertia),
        I_minor=g("Iy", inertia),
        source=f"catalog:{table}",
    )


def _frac(s: str) -> float:
    """An imperial dimension: '3-1/2' → 3.5, '1/4' → 0.25, '.250' → 0.25, '6' → 6."""
    s = s.strip()
    if "-" in s and "/" in s:
        whole, part = s.split("-", 1)
        return float(whole) + float(Fraction(part))
    if " " in s and "/" in s:
        whole, part = s.split(" ", 1)
        return float(whole) + float(Fraction(part))
    return float(Fraction(s)) if "/" in s else float(s)


def _hollow(name: str, kind: str, d: float, b: float, t: float) -> Section:
    if kind == "CHS":
        ro, ri = d / 2, d / 2 - t
        area = math.pi * (ro**2 - ri**2)
        i = math.pi / 4 * (ro**4 - ri**4)
        return Section(name, "CHS", d, d, t, t, None, area, i, i, "catalog:designation")
    di, bi = d - 2 * t, b - 2 * t
    area = d * b - di * bi  # square corners: slightly more than a cold-formed section's
    return Section(name, "RHS", d, b, t, t, None, area, (b * d**3 - bi * di**3) / 12,
                   (d * b**3 - di * bi**3) / 12, "catalog:designation")


def _angle(name: str, d: float, b: float, t: float) -> Section:
    return Section(name, "angle", d, b, t, t, None, (d + b - t) * t, None, None, "catalog:designation")


_DIM = r"(\d+(?:\.\d+)?)"
_IMP = r"(\d+(?:-\d+/\d+)?|\d+/\d+|\.\d+|\d+\.\d+)"


def parse_designation(name: str) -> Section | None:
    """A hollow section or angle from a designation that spells out its dimensions, or ``None``.

    Metric (mm): "100x6.0SHS" (square), "100x100x6SHS", "SHS 100x100x6", "150x50x3.0RHS",
    "168.3x6.4CHS", "CHS 168.3x6.4", "100x100x10EA", "150x90x8UA", "L100x100x10".
    Imperial (inches, AISC): "HSS6X6X1/4", "HSS6.625X.280", "L3-1/2X3X3/8", "L4X4X1/2".

    >>> s = parse_designation("100x6.0SHS"); (s.kind, s.depth, s.width, s.web_thickness)
    ('RHS', 100.0, 100.0, 6.0)
    >>> s = parse_designation("L3-1/2X3X3/8"); (s.kind, round(s.depth, 1), round(s.width, 1))
    ('angle', 88.9, 76.2)
    """
    s = name.strip().upper().replace("×", "X").replace("*", "X")
    s = re.sub(r"\s*X\s*", "X", s)
    s = re.sub(r"\s+", " ", s)
    m = re.fullmatch(rf"{_DIM}X{_DIM}(?:X{_DIM})?\s*(SHS|RHS|CHS|EA|UA)", s) or None
    if m:
        a, b, c, fam = m.groups()
        return _from_metric(name, fam, a, b, c)
    m = re.fullmatch(rf"(SHS|RHS|CHS|EA|UA|L)\s*{_DIM}X{_DIM}(?:X{_DIM})?", s)
    if m:
        fam, a, b, c = m.groups()
        vals = [float(a), float(b)] + ([float(c)] if c else [])
        if fam == "L" and max(vals[:2]) < 15:  # legs under 15 mm: an imperial angle
            return _from_imperial(name, "L", a, b, c)
        if fam == "L":
            fam = "EA"
        return _from_metric(name, fam, a, b, c)
    m = re.fullmatch(rf"(HSS|L)\s*{_IMP}X{_IMP}(?:X{_IMP})?", s)
    if m:
        fam, a, b, c = m.groups()
        return _from_imperial(name, fam, a, b, c)
    return None


def _from_metric(name, fam, a, b, c) -> Section | None:
    a_, b_ = float(a), float(b)
    c_ = float(c) if c else None
    if fam == "CHS":
        return _hollow(name, "CHS", a_, a_, b_) if c_ is None else None
    if fam in ("SHS", "RHS"):
        if c_ is None:  # "100x6.0SHS": side x thickness
            return _hollow(name, "RHS", a_, a_, b_)
        return _hollow(name, "RHS", a_, b_, c_)
    if fam in ("EA", "UA"):
        if c_ is None:
            return _angle(name, a_, a_, b_)
        return _angle(name, a_, b_, c_)
    return None


def _from_imperial(name, fam, a, b, c) -> Section | None:
    a_, b_ = _frac(a) * _IN, _frac(b) * _IN
    c_ = _frac(c) * _IN if c else None
    if fam == "HSS":
        if c_ is None:  # round HSS: OD x t
            return _hollow(name, "CHS", a_, a_, b_)
        return _hollow(name, "RHS", a_, b_, c_)
    if fam == "L":
        if c_ is None:
            return None
        return _angle(name, a_, b_, c_)
    return None


def lookup_section(name: str) -> Section | None:
    """The section a designation names, or ``None`` when neither the tables nor the designation
    itself tell. ``Section.name`` is the name as given; ``source`` names the table."""
    if not name or not name.strip():
        return None
    key = normalise_section_name(name)
    if key is not None:
        hit = _section_index().get(key)
        m = re.fullmatch(r"(\d+PFC)[\d.]+", key)
        if hit is None and m:  # AS PFCs are designated without mass: "150PFC17.7" → "150PFC"
            hit = _section_index().get(m.group(1))
        if hit is not None:
            table, row, meta = hit
            return _row_section(name.strip(), table, row, meta)
    return parse_designation(name)


# --------------------------------------------------------------------------------------------
# Steel grades
# --------------------------------------------------------------------------------------------


def normalise_grade_label(label: str) -> tuple[str, ...]:
    """Tokens of a grade label: upper case, punctuation to spaces (a '.' between digits kept),
    letters and digits split apart, so "AS/NZS 3679.1-300" → ('AS', 'NZS', '3679.1', '300') and
    "S355J0" → ('S', '355', 'J', '0').

    >>> normalise_grade_label("STEEL/S275J0"), normalise_grade_label("A572 Gr.50")
    (('STEEL', 'S', '275', 'J', '0'), ('A', '572', 'GR', '50'))
    """
    s = label.upper()
    s = re.sub(r"(?<!\d)\.|\.(?!\d)", " ", s)
    s = re.sub(r"[^A-Z0-9.]+", " ", s)
    s = re.sub(r"(?<=[A-Z])(?=\d)|(?<=\d)(?=[A-Z])", " ", s)
    return tuple(s.split())


@lru_cache(maxsize=None)
def _grade_aliases() -> list[tuple[tuple[str, ...], dict]]:
    data = load_table("steel_grades")
    out: list[tuple[tuple[str, ...], dict]] = []
    for row in data.get("grade", []):
        for alias in [row["grade"], *row.get("aliases", [])]:
            toks = normalise_grade_label(alias)
            if toks:
                out.append((toks, row))
    out.sort(key=lambda t: -len(t[0]))  # the most specific alias wins
    return out


def steel_grades() -> list[dict]:
    """The rows of ``steel_grades.toml`` (grade, aliases, fy, fu, standard, table, ...)."""
    return list(load_table("steel_grades").get("grade", []))


def _contains(hay: tuple[str, ...], needle: tuple[str, ...]) -> bool:
    n = len(needle)
    return any(hay[i:i + n] == needle for i in range(len(hay) - n + 1))


def lookup_steel(label: str) -> Steel | None:
    """The steel grade a material label names, or ``None``.

    The label may carry other words ("STEEL/S275J0", "Structural steel S355JR"); the longest
    grade alias found in it wins. A bare designation ("300", "250": a row's ``exact`` list, as
    the config's ``materials.default_grade`` writes it) matches only the whole label.
    ``fy``/``fu`` are the table's values for the thinnest thickness range (see each row's
    ``t_max``); ``source`` names the standard and table.
    """
    if not label or not label.strip():
        return None
    toks = normalise_grade_label(label)
    for row in load_table("steel_grades").get("grade", []):  # bare designations: whole label only
        if any(normalise_grade_label(e) == toks for e in row.get("exact", ())):
            return _steel(row)
    for alias, row in _grade_aliases():
        if _contains(toks, alias):
            return _steel(row)
    return None


def _steel(row: dict) -> Steel:
    src = f"{row.get('standard', '')} {row.get('table', '')}".strip()
    return Steel(grade=row["grade"], fy=float(row["fy"]), fu=float(row["fu"]),
                 source=f"rules/data/steel_grades.toml: {src}" if src else "rules/data/steel_grades.toml")
