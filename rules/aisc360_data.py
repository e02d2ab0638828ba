"""Units and data tables of the aisc360 rule set (ANSI/AISC 360-16, AISC Manual 15th ed.).

The tables in ``rules/data/aisc360_*.toml`` hold the values as AISC publishes them (in, in², ksi).
This module is the **one place** where they are converted to the internal units (mm, mm², MPa):
``1 in = 25.4 mm`` and ``1 ksi = 6.894757 MPa``, both exact to the precision the published values
carry.

An aid to a competent engineer: results must be checked, and the governing local code and licensed
practice take precedence.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import lru_cache

from engine.errors import RuleSetError
from rules.tables import load_table

__all__ = [
    "MM_PER_IN",
    "MPA_PER_KSI",
    "N_PER_KIP",
    "inch",
    "ksi",
    "BoltData",
    "bolt_size",
    "bolt_sizes",
    "bolt_group",
    "Fnv",
    "steel_strengths",
    "electrode_FEXX",
    "factors",
    "materials",
    "bolts",
    "min_fillet_leg",
    "parse_size",
]

MM_PER_IN = 25.4
"""Millimetres per inch (exact)."""
MPA_PER_KSI = 6.894757
"""MPa per ksi."""
N_PER_KIP = 4448.222
"""Newtons per kip (for reports and tests that compare with published kip values)."""


def inch(v: float) -> float:
    """Inches to mm."""
    return float(v) * MM_PER_IN


def ksi(v: float) -> float:
    """ksi to MPa."""
    return float(v) * MPA_PER_KSI


def bolts() -> dict:
    """The raw bolt table (AISC 360-16 Tables J3.2-J3.5, Manual Table 7-1), US units."""
    return load_table("aisc360_bolts")


def materials() -> dict:
    """The raw materials table (Manual Tables 2-3/2-4, AISC 360-16 Tables J2.4/J2.5), US units."""
    return load_table("aisc360_materials")


def factors() -> dict:
    """The raw factors/practice table (AISC 360-16, Manual Parts 9 and 10, ASCE/SEI 7-16)."""
    return load_table("aisc360_factors")


@dataclass(frozen=True)
class BoltData:
    """One bolt size in internal units (mm, mm²)."""

    size: str
    d: float
    Ab: float
    hole_std: float
    hole_ovs: float
    hole_ssl_width: float
    hole_ssl_length: float
    hole_lsl_length: float
    edge_min: float
    C2_ovs: float
    C2_ssl: float

    def hole(self, kind: str) -> tuple[float, float]:
        """``(vertical width, horizontal length)`` of the hole in mm for hole ``kind``
        (``standard``, ``oversize``, ``short-slot``, ``long-slot``; slots horizontal, i.e. transverse
        to the vertical shear, as single-plate practice details them)."""
        if kind == "standard":
            return self.hole_std, self.hole_std
        if kind == "oversize":
            return self.hole_ovs, self.hole_ovs
        if kind == "short-slot":
            return self.hole_ssl_width, self.hole_ssl_length
        if kind == "long-slot":
            return self.hole_ssl_width, self.hole_lsl_length
        raise RuleSetError(
            f"hole type {kind!r} is not one of standard, oversize, short-slot, long-slot (AISC 360-16 Table J3.3)"
        )


def parse_size(size: str) -> str:
    """Normalise a bolt size as the trade writes it (``"3/4"``, ``'3/4"'``, ``"3/4 in"``,
    ``"1-1/8"``, ``"1"``) to the table key."""
    s = str(size).strip().lower().replace("in.", "").replace("in", "").replace('"', "").strip()
    s = s.replace(" ", "-") if " " in s and "/" in s else s.replace(" ", "")
    return s


def bolt_sizes() -> list[str]:
    """The bolt sizes in the table, as the trade writes them."""
    return list(bolts()["sizes"].keys())


@lru_cache(maxsize=None)
def bolt_size(size: str) -> BoltData:
    """Bolt data for ``size`` in mm / mm²; RuleSetError listing the valid sizes otherwise."""
    key = parse_size(size)
    table = bolts()["sizes"]
    if key not in table:
        raise RuleSetError(
            f"bolt size {size!r} is not in the AISC 360 table; valid sizes: {', '.join(table)} (inches)"
        )
    row = table[key]
    return BoltData(
        size=key,
        d=inch(row["d"]),
        Ab=row["Ab"] * MM_PER_IN**2,
        hole_std=inch(row["hole_std"]),
        hole_ovs=inch(row["hole_ovs"]),
        hole_ssl_width=inch(row["hole_ssl_width"]),
        hole_ssl_length=inch(row["hole_ssl_length"]),
        hole_lsl_length=inch(row["hole_lsl_length"]),
        edge_min=inch(row["edge_min"]),
        C2_ovs=inch(row["C2_ovs"]),
        C2_ssl=inch(row["C2_ssl"]),
    )


def bolt_group(grade: str) -> str:
    """AISC 360-16 Table J3.2 bolt group (``"A"`` or ``"B"``) for a grade as the standards name it."""
    g = " ".join(str(grade).replace("-", " ").split()).upper()
    # a trailing thread-condition letter ("A325-N", "A490 X") is not part of the grade
    parts = g.split()
    if len(parts) > 1 and parts[-1] in ("N", "X", "SC"):
        g = " ".join(parts[:-1])
    groups = bolts()["groups"]
    for name, row in groups.items():
        if g in {" ".join(x.replace("-", " ").split()).upper() for x in row["grades"]}:
            return name
    valid = sorted({x for row in groups.values() for x in row["grades"]})
    raise RuleSetError(f"bolt grade {grade!r} is not known to AISC 360-16 Table J3.2; valid grades: {', '.join(valid)}")


def Fnv(grade: str, threads_in_shear_plane: bool = True) -> float:
    """Nominal shear stress Fnv (MPa), AISC 360-16 Table J3.2: thread condition N when the threads
    are in the shear plane, X when excluded."""
    row = bolts()["groups"][bolt_group(grade)]
    return ksi(row["Fnv_N"] if threads_in_shear_plane else row["Fnv_X"])


def _match(name: str, table: dict, what: str, clause: str) -> dict:
    norm = lambda s: " ".join(str(s).replace("-", " ").replace(".", "").split()).upper()  # noqa: E731
    for key, row in table.items():
        if norm(name) == norm(key) or norm(name) in {norm(a) for a in row.get("aliases", [])}:
            return row
    raise RuleSetError(f"{what} {name!r} is not in {clause}; valid: {', '.join(table)}")


def steel_strengths(grade: str) -> tuple[float, float]:
    """``(Fy, Fu)`` in MPa of a steel grade (AISC Manual 15th ed. Tables 2-3 / 2-4)."""
    row = _match(grade, materials()["steels"], "steel grade", "AISC Manual Tables 2-3/2-4")
    return ksi(row["Fy"]), ksi(row["Fu"])


def electrode_FEXX(electrode: str) -> float:
    """Electrode classification strength FEXX in MPa (AISC 360-16 Table J2.5)."""
    row = _match(electrode, materials()["electrodes"], "electrode", "AISC 360-16 Table J2.5")
    return ksi(row["FEXX"])


def min_fillet_leg(t_thinner_mm: float) -> float:
    """Minimum fillet weld leg (mm) for the thinner part joined (mm), AISC 360-16 Table J2.4."""
    t_in = t_thinner_mm / MM_PER_IN
    for t_max, w in materials()["weld"]["min_size"]:
        if t_in <= t_max + 1e-9:
            return inch(w)
    return math.inf  # pragma: no cover - last row has an unbounded thickness
