"""Data look-ups for the EN 1993 rule set (bolts, bolt classes, steel grades, factors).

Every number comes from ``rules/data/en1993_*.toml``; each table names its source (standard,
edition, clause or table) in its header. Internal units: mm, mm², MPa.

An aid to a competent engineer: results must be checked, and the governing local code (including
the National Annex) and licensed practice take precedence.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from engine.errors import RuleSetError
from engine.model import Steel
from rules.tables import load_table

__all__ = [
    "BoltData",
    "bolt_data",
    "bolt_class",
    "steel_strength",
    "beta_w",
    "factors",
    "practice",
    "spacing",
    "youngs_modulus",
    "valid_sizes",
    "valid_classes",
    "valid_grades",
]


@dataclass(frozen=True)
class BoltData:
    """One bolt size and class: d, d0 (mm), A (gross) and As (tensile stress area) in mm², fyb,
    fub (MPa), alpha_v for threads in the shear plane."""

    size: str
    d: float
    d0: float
    A: float
    As: float
    grade: str
    fyb: float
    fub: float
    alpha_v_threads: float
    alpha_v_shank: float


def _norm_size(size: str) -> str:
    s = str(size).strip().upper().replace(" ", "")
    if s and s[0].isdigit():
        s = "M" + s
    return s


def _norm_grade(grade: str) -> str:
    return str(grade).strip().upper().replace(" ", "").removeprefix("GRADE").removeprefix("CLASS")


def valid_sizes() -> list[str]:
    """Bolt sizes in the table, in increasing diameter."""
    sizes = load_table("en1993_bolts")["sizes"]
    return sorted(sizes, key=lambda k: sizes[k]["d"])


def valid_classes() -> list[str]:
    """Bolt property classes in the table (EN 1993-1-8 Table 3.1)."""
    return list(load_table("en1993_bolts")["classes"])


def valid_grades() -> list[str]:
    """Steel grades in the table (EN 1993-1-1 Table 3.1)."""
    return list(load_table("en1993_steel")["grades"])


def bolt_class(grade: str) -> dict[str, float]:
    """fyb, fub (MPa) and alpha_v (threads) of a bolt class; RuleSetError listing valid classes."""
    classes = load_table("en1993_bolts")["classes"]
    g = _norm_grade(grade)
    if g not in classes:
        raise RuleSetError(
            f"EN 1993: bolt class {grade!r} is not in EN 1993-1-8 Table 3.1; "
            f"use one of {', '.join(classes)}"
        )
    return classes[g]


def bolt_data(size: str, grade: str) -> BoltData:
    """Bolt data for ``size`` ("M20") and property class ``grade`` ("8.8").

    Raises :class:`RuleSetError` naming the valid sizes or classes.
    """
    table = load_table("en1993_bolts")
    s = _norm_size(size)
    if s not in table["sizes"]:
        raise RuleSetError(
            f"EN 1993: bolt size {size!r} is not tabulated; use one of {', '.join(valid_sizes())}"
        )
    row = table["sizes"][s]
    cls = bolt_class(grade)
    return BoltData(
        size=s,
        d=float(row["d"]),
        d0=float(row["d0"]),
        A=float(row["A"]),
        As=float(row["As"]),
        grade=_norm_grade(grade),
        fyb=float(cls["fyb"]),
        fub=float(cls["fub"]),
        alpha_v_threads=float(cls["alpha_v_threads"]),
        alpha_v_shank=float(table["shank"]["alpha_v"]),
    )


def _grade_key(label: str) -> str | None:
    """The table grade a label names ("S275JR", "S355 J2+N" -> "S275"/"S355"), or None."""
    lab = str(label).strip().upper().replace(" ", "")
    for g in load_table("en1993_steel")["grades"]:
        if lab.startswith(g):
            return g
    return None


def steel_strength(steel: Steel | None, thickness: float | None) -> tuple[float, float, str] | None:
    """(fy, fu, note) for ``steel`` at nominal ``thickness`` (mm), EN 1993-1-1 Table 3.1.

    A grade found in the table is looked up again by thickness; an unknown grade keeps the
    strengths the model gave (the note says so). Returns None when ``steel`` is None or the
    thickness is above the tabulated range (80 mm).
    """
    if steel is None:
        return None
    key = _grade_key(steel.grade)
    if key is None:
        return float(steel.fy), float(steel.fu), f"grade {steel.grade!r} not tabulated: model fy/fu used"
    bands = load_table("en1993_steel")["grades"][key]["bands"]
    t = 0.0 if thickness is None else float(thickness)
    for t_max, fy, fu in bands:
        if t <= t_max:
            return float(fy), float(fu), f"{key}, t = {t:g} mm: fy = {fy:g}, fu = {fu:g} MPa (EN 1993-1-1 Table 3.1)"
    return None


def beta_w(grade: str) -> float:
    """Correlation factor beta_w for fillet welds, EN 1993-1-8 Table 4.1; RuleSetError if unknown."""
    table = load_table("en1993_steel")["beta_w"]
    key = _grade_key(grade)
    if key is None or key not in table:
        raise RuleSetError(
            f"EN 1993: weld/steel grade {grade!r} has no beta_w in EN 1993-1-8 Table 4.1; "
            f"use one of {', '.join(table)}"
        )
    return float(table[key])


def full_strength_ratio(f_y: float, f_u: float, beta: float, gamma_M0: float, gamma_M2: float) -> float:
    """Throat-to-plate-thickness ratio a/t of double fillet welds that develop the plate's tension
    resistance (SCI P358 Check 8; MSB05 2.2.6; directional method EN 1993-1-8 4.5.3.2):
    a/t = f_y β_w γ_M2 / (√2 f_u γ_M0). MPa in, dimensionless out."""
    return float(f_y) * float(beta) * float(gamma_M2) / (math.sqrt(2.0) * float(f_u) * float(gamma_M0))


def factors() -> dict[str, float]:
    """Partial factors gamma_M0, gamma_M1, gamma_M2, gamma_Mu."""
    return {k: float(v) for k, v in load_table("en1993_factors")["partial_factors"].items()}


def practice() -> dict[str, object]:
    """The simple-joint practice constants (SCI P358 / MSB05)."""
    return load_table("en1993_factors")["practice"]


def spacing() -> dict[str, dict[str, float]]:
    """EN 1993-1-8 Table 3.3 factors."""
    return load_table("en1993_spacing")


def youngs_modulus() -> float:
    """E in MPa (EN 1993-1-1 3.2.6)."""
    return float(load_table("en1993_steel")["elastic"]["E"])


def throat_from_leg(leg: float) -> float:
    """Effective throat a (mm) of an equal-leg 90° fillet weld of leg s: a = s / sqrt(2)."""
    return float(leg) / math.sqrt(2.0)
