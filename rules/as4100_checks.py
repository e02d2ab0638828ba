"""AS 4100 formulas for fin-plate (web side plate) connections, one small pure function each.

Edition followed: **AS 4100-1998 (R2016) Steel structures incorporating Amendment No. 1 (2012)**;
clause numbers are that edition's. Units: mm, mm², mm³, mm⁴, MPa, N, N·mm. The functions return
*nominal* capacities (no φ) unless the name says ``phi``; the rule set applies φ from Table 3.4.

Also: :func:`make_check` and friends, which turn a demand and a capacity into an
:class:`engine.model.Check` the same way for every check.

An aid to a competent engineer: results must be checked, and the governing local code and licensed
practice take precedence.
"""

from __future__ import annotations

import math

import numpy as np

from engine.model import Check
from rules.check_builders import incomplete_check, make_check, make_max_check, make_min_check

__all__ = [
    "make_check",
    "make_min_check",
    "make_max_check",
    "incomplete_check",
    "kr_long_joint",
    "Vf",
    "Vb_bearing",
    "Vb_tearout",
    "ae_tearout",
    "vw",
    "Vw_shear",
    "alpha_v",
    "Vbs",
    "Z_rect",
    "Z_net_rect",
    "Mo_rect",
    "alpha_s",
    "tee_Z_min",
]



# ----------------------------------------------------------------------------- Check builders
# ----------------------------------------------------------------------------- bolts
def kr_long_joint(lj: float, lj_short: float = 300.0, lj_long: float = 1300.0,
                  intercept: float = 1.075, divisor: float = 4000.0, kr_min: float = 0.75) -> float:
    """Reduction factor kr for a long bolted lap joint, AS 4100 Table 9.3.2.1.

    ``lj`` (mm) is the joint length between the first and last bolt in the direction of the force:
    lj < 300 → 1.0; 300 ≤ lj ≤ 1300 → 1.075 − lj/4000; lj > 1300 → 0.75.
    """
    if lj < lj_short:
        return 1.0
    if lj <= lj_long:
        return intercept - lj / divisor
    return kr_min


def Vf(fuf: float, Ac: float, Ao: float, nn: int, nx: int, kr: float = 1.0) -> float:
    """Nominal shear capacity of a bolt (N), AS 4100 cl. 9.3.2.1: Vf = 0.62 fuf kr (nn Ac + nx Ao).

    ``fuf`` MPa; ``Ac`` minor-diameter area and ``Ao`` plain shank area (mm²); ``nn`` shear planes
    through the threads, ``nx`` through the shank.
    """
    return 0.62 * fuf * kr * (nn * Ac + nx * Ao)


def Vb_bearing(df: float, tp: float, fup: float) -> float:
    """Nominal bearing capacity of a ply (N), AS 4100 cl. 9.3.2.4(a): Vb = 3.2 df tp fup (mm, MPa)."""
    return 3.2 * df * tp * fup


def Vb_tearout(ae: float, tp: float, fup: float) -> float:
    """Nominal tear-out capacity of a ply (N), AS 4100 cl. 9.3.2.4(b): Vb = ae tp fup (mm, MPa)."""
    return ae * tp * fup


def ae_tearout(clear_to_hole_centre: float | np.ndarray, dh: float, df: float) -> float | np.ndarray:
    """ae (mm) of AS 4100 cl. 9.3.2.4: the distance from the edge of the hole to the edge of the
    ply (the edge of an adjacent hole counts as an edge), along the force, plus half the bolt
    diameter: ``ae = e − dh/2 + df/2`` where ``e`` is measured from the hole centre.
    """
    return np.asarray(clear_to_hole_centre, dtype=float) - dh / 2.0 + df / 2.0


# ----------------------------------------------------------------------------- welds
def vw(fuw: float, tt: float, kr: float = 1.0) -> float:
    """Nominal capacity of a fillet weld per mm (N/mm), AS 4100 cl. 9.7.3.10: vw = 0.6 fuw tt kr.

    ``fuw`` MPa (Table 9.7.3.10(1)), ``tt`` design throat (mm), ``kr`` length reduction (1.0 for
    lw ≤ 1.7 m and for all welds other than in lap connections).
    """
    return 0.6 * fuw * tt * kr


# ----------------------------------------------------------------------------- members / plates
def Vw_shear(fy: float, Aw: float) -> float:
    """Nominal shear yield capacity of a web or plate (N), AS 4100 cl. 5.11.4: Vw = 0.6 fy Aw."""
    return 0.6 * fy * Aw


def Vv_nonuniform(Vu: float, fvm_over_fva: float) -> float:
    """Nominal shear capacity (N) of a web with a non-uniform shear stress distribution, AS 4100
    cl. 5.11.3: Vv = 2 Vu / (0.9 + f*vm / f*va) ≤ Vu, where ``Vu`` is the capacity under uniform shear
    (cl. 5.11.4) and f*vm / f*va the ratio of the largest to the average shear stress (1.5 for a
    rectangle in elastic bending shear; ASI Handbook 1 (2007) Ch 5.4 applies it so to plates and cleats,
    φVv = 0.45 fy d t)."""
    return min(Vu, 2.0 * Vu / (0.9 + fvm_over_fva))


RECT_SHEAR_STRESS_RATIO = 1.5
"""f*vm / f*va of a rectangle under elastic bending shear (τmax = 1.5 V / A)."""


def tee_shear_stress_ratio(bf: float, tf: float, tw: float, h_stem: float) -> float:
    """f*vm / f*va in the stem of a tee (the remaining section of a beam coped at one flange) under
    elastic bending shear: f*vm = V Q / (I tw) at the centroid, f*va = V / (h_stem tw), so the ratio
    is Q h_stem / I (dimensionless; AS 4100 cl. 5.11.3 as used in ASI Handbook 1 (2007) Ch 6.5).
    Dimensions in mm; ``h_stem`` measured from the flange's inner face."""
    yc, I = _tee_centroid_inertia(bf, tf, tw, h_stem)
    if yc >= tf:  # the centroid lies in the stem: the first moment of the stem below it
        Q = tw * (tf + h_stem - yc) ** 2 / 2.0
    else:  # in the flange: everything beyond the centroid, i.e. the stem and part of the flange
        Q = tw * h_stem * (tf + h_stem / 2.0 - yc) + bf * (tf - yc) ** 2 / 2.0
    return Q * h_stem / I


def alpha_v(d1: float, tw: float, fy: float) -> float:
    """Shear buckling factor of an unstiffened web, AS 4100 cl. 5.11.5.1:
    αv = [82 / ((d1/tw)·√(fy/250))]² ≤ 1.0 (d1 clear web depth, tw in mm, fy MPa)."""
    slender = (d1 / tw) * math.sqrt(fy / 250.0)
    return 1.0 if slender <= 82.0 else (82.0 / slender) ** 2


def Vbs(fu: float, fy: float, Anv: float, Agv: float, Ant: float, kbs: float) -> float:
    """Nominal block shear capacity (N), AS 4100 cl. 9.1.9 (Amdt 1 2012):
    Rbs = 0.6 fu Anv + kbs fu Ant ≤ 0.6 fy Agv + kbs fu Ant.

    ``Anv``/``Agv`` net/gross area in shear, ``Ant`` net area in tension (mm²); ``kbs`` 1.0 for a
    uniform tension stress, 0.5 for a non-uniform one.
    """
    return min(0.6 * fu * Anv + kbs * fu * Ant, 0.6 * fy * Agv + kbs * fu * Ant)


def Z_rect(t: float, d: float) -> float:
    """Elastic section modulus (mm³) of a rectangle t × d bent about the axis parallel to t: t d²/6."""
    return t * d * d / 6.0


def Z_net_rect(t: float, d: float, hole_y_from_centre: np.ndarray, dh: float) -> float:
    """Elastic section modulus (mm³) of a t × d plate net of holes of diameter ``dh`` centred at
    ``hole_y_from_centre`` (mm from mid-depth): (I_gross − Σ(t dh³/12 + t dh y²)) / (d/2)."""
    y = np.asarray(hole_y_from_centre, dtype=float)
    I = t * d**3 / 12.0 - float(np.sum(t * dh**3 / 12.0 + t * dh * y**2))
    return I / (d / 2.0)


def Mo_rect(Le: float, d: float, t: float, E: float = 200000.0, G: float = 80000.0) -> float:
    """Elastic lateral-torsional buckling moment (N·mm) of a rectangular plate d × t bent in its
    plane, AS 4100 cl. 5.6.1.1(a)(iii) with Iw = 0: Mo = (π/Le)·√(E Iy G J),
    Iy = d t³/12, J = d t³/3 (thin rectangle). ``Le`` effective length (mm)."""
    Iy = d * t**3 / 12.0
    J = d * t**3 / 3.0
    return (math.pi / Le) * math.sqrt(E * Iy * G * J)


def alpha_s(Ms: float, Mo: float) -> float:
    """Slenderness reduction factor, AS 4100 cl. 5.6.1.1: αs = 0.6 [√((Ms/Mo)² + 3) − Ms/Mo]."""
    r = Ms / Mo
    return 0.6 * (math.sqrt(r * r + 3.0) - r)


def tee_Z_min(bf: float, tf: float, tw: float, h_stem: float) -> tuple[float, float]:
    """Smaller elastic section modulus (mm³) and the distance from the flange's outer face to the
    centroid (mm) of a tee made of a flange bf × tf and a stem tw × h_stem (h_stem measured from the
    flange's inner face) — the remaining section of a beam coped at one flange."""
    yc, I = _tee_centroid_inertia(bf, tf, tw, h_stem)
    c = max(yc, tf + h_stem - yc)
    return I / c, yc


def _tee_centroid_inertia(bf: float, tf: float, tw: float, h_stem: float) -> tuple[float, float]:
    """Centroid (mm from the flange's outer face) and second moment of area about it (mm⁴) of a tee:
    flange bf × tf, stem tw × h_stem below the flange's inner face."""
    A1, A2 = bf * tf, tw * h_stem
    y1, y2 = tf / 2.0, tf + h_stem / 2.0
    yc = (A1 * y1 + A2 * y2) / (A1 + A2)
    return yc, bf * tf**3 / 12.0 + A1 * (yc - y1) ** 2 + tw * h_stem**3 / 12.0 + A2 * (y2 - yc) ** 2
