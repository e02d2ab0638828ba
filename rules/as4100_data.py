"""AS 4100 data look-ups for the ``as4100`` rule set: bolts, steel strengths, weld metal, factors.

Reads ``rules/data/as4100_bolts.toml``, ``as4100_steel.toml`` and ``as4100_factors.toml`` (each names
its source: AS 4100-1998 incl. Amdt 1 2012, AS 1275, AS/NZS 3678, AS/NZS 3679.1, AS/NZS 1170.0).
Units: mm, mm², MPa, N.

An aid to a competent engineer: results must be checked, and the governing local code and licensed
practice take precedence.
"""

from __future__ import annotations

import functools
import math
import re
from dataclasses import dataclass

from engine.errors import RuleSetError
from rules.tables import load_table

__all__ = [
    "BoltData",
    "WeldMetal",
    "bolt_data",
    "bolt_fuf",
    "normalise_grade",
    "normalise_size",
    "standard_hole",
    "steel_strength",
    "weld_metal",
    "factors",
    "bolt_sizes",
    "bolt_grades",
    "throat",
]


@dataclass(frozen=True)
class BoltData:
    """One bolt size: nominal diameter ``df`` (mm), areas ``As``, ``Ac``, ``Ao`` (mm²)."""

    size: str
    df: float
    As: float
    Ac: float
    Ao: float


@dataclass(frozen=True)
class WeldMetal:
    """Weld metal: ``fuw`` (MPa, AS 4100 Table 9.7.3.10(1)), weld category ``SP``/``GP`` and its φ."""

    electrode: str
    fuw: float
    category: str
    phi: float


def factors() -> dict:
    """The parsed ``as4100_factors.toml`` table."""
    return load_table("as4100_factors")


def bolt_sizes() -> list[str]:
    """Bolt sizes in the table, smallest first ("M12" ... "M36")."""
    sizes = load_table("as4100_bolts")["sizes"]
    return sorted(sizes, key=lambda s: sizes[s]["df"])


def bolt_grades() -> list[str]:
    """Bolt strength grade / categories in AS 4100 Table 9.3.1 ("4.6/S", "8.8/S", ...)."""
    return list(load_table("as4100_bolts")["grades"])


def normalise_size(size: str) -> str:
    """``"m20"``, ``"M20"``, ``"20"`` -> ``"M20"``. Raises :class:`RuleSetError` for an unknown size."""
    text = str(size).strip().upper().replace(" ", "")
    m = re.fullmatch(r"M?(\d+(?:\.0+)?)", text)
    key = f"M{int(float(m.group(1)))}" if m else text
    if key not in load_table("as4100_bolts")["sizes"]:
        raise RuleSetError(
            f"AS 4100: bolt size {size!r} is not in the table; use one of {', '.join(bolt_sizes())}"
        )
    return key


def normalise_grade(grade: str) -> str:
    """Map a grade as written (``"8.8"``, ``"8.8/S"``, ``"8.8/TB"``, ``"4.6"``) to a Table 9.3.1 category.

    A bare strength grade takes the snug-tight category ``/S``. Raises :class:`RuleSetError`.
    """
    text = str(grade).strip().upper().replace(" ", "")
    text = re.sub(r"^(GRADE|GR\.?|CLASS)", "", text)
    m = re.fullmatch(r"(\d+\.\d)(?:/(S|TB|TF))?(?:/(N|X))?", text)
    if m:
        key = f"{m.group(1)}/{m.group(2) or 'S'}"
        if key in load_table("as4100_bolts")["grades"]:
            return key
    raise RuleSetError(
        f"AS 4100: bolt grade {grade!r} is not in Table 9.3.1; use one of {', '.join(bolt_grades())}"
    )


def bolt_data(size: str) -> BoltData:
    """Areas and diameter of ``size`` (AS 1275 Table 4 as used by AS 4100 cl. 9.3.2.1)."""
    key = normalise_size(size)
    row = load_table("as4100_bolts")["sizes"][key]
    return BoltData(key, float(row["df"]), float(row["As"]), float(row["Ac"]), float(row["Ao"]))


def bolt_fuf(grade: str) -> float:
    """Minimum tensile strength of the bolt fuf (MPa), AS 4100 Table 9.3.1."""
    return float(load_table("as4100_bolts")["grades"][normalise_grade(grade)]["fuf"])


def standard_hole(df: float) -> float:
    """Standard hole diameter (mm) for a bolt of diameter ``df`` (mm), AS 4100 cl. 14.3.5.2."""
    h = load_table("as4100_bolts")["holes"]
    return df + (h["small_clearance"] if df <= h["limit_df"] else h["large_clearance"])


def _grade_number(label: str) -> str | None:
    m = re.search(r"(250|300|350|400|450)", str(label))
    return m.group(1) if m else None


@functools.lru_cache(maxsize=4096)
def steel_strength(label: str, thickness: float, product: str) -> tuple[float, float, str] | None:
    """``(fy, fu, source)`` in MPa for grade ``label`` at ``thickness`` (mm) of ``product``.

    ``product`` is ``"plate"`` (AS/NZS 3678) or ``"section"`` (AS/NZS 3679.1), per AS 4100 Table 2.1.
    Returns ``None`` when the grade is not in the table or the thickness is beyond its last band.
    """
    table = load_table("as4100_steel")[product]
    grade = _grade_number(label)
    if grade is None or grade not in table or not (thickness > 0):
        return None
    row = table[grade]
    for band in row["bands"]:
        if thickness < band["t_below"] if "t_below" in band else thickness <= band["t_max"]:
            return float(band["fy"]), float(row["fu"]), f"{row['standard']} Grade {grade}, t = {thickness:g} mm"
    return None


def weld_metal(electrode: str) -> WeldMetal:
    """Parse an electrode designation (``"E48XX"``, ``"E48XX SP"``, ``"E41XX/GP"``, ``"W50X"``).

    The weld category defaults to SP. Raises :class:`RuleSetError` for an unknown electrode.
    """
    f = factors()
    text = str(electrode).strip().upper()
    category = "GP" if re.search(r"\bGP\b|/GP", text) else "SP"
    m = re.match(r"(E4[18]|W[45]0)", text.replace(" ", ""))
    names = {"E41": "E41XX", "E48": "E48XX", "W40": "W40X", "W50": "W50X"}
    if not m:
        raise RuleSetError(
            f"AS 4100: electrode {electrode!r} is not in Table 9.7.3.10(1); use E41XX or E48XX "
            f"(optionally followed by SP or GP)"
        )
    name = names[m.group(1)]
    return WeldMetal(name, float(f["weld_metal"][name]), category, float(f["phi"][f"weld_{category}"]))


def throat(leg: float) -> float:
    """Design throat thickness tt (mm) of an equal-leg 90° fillet weld of leg ``leg`` (mm): leg/√2."""
    return leg / math.sqrt(2.0)
