"""Bolt groups under eccentric in-plane shear: elastic method and instantaneous centre method.

Code-neutral mechanics (numpy only) for the bolt group of a fin plate or any bolted joint loaded in
its own plane. Every function has a batch form that works on many groups (or design candidates)
at once; groups of different bolt counts are padded and masked (:func:`pad_groups`).

Conventions
-----------
* Units: mm, N, N·mm (DESIGN.md §3). Bolt coordinates may use any origin; loads are reduced to
  the **centroid of the pattern**.
* Axes: x right, y up; moments counter-clockwise positive (right-hand rule about z, out of the
  page).
* Bolt forces are **the loads the bolts carry from the applied load**: they sum to the applied
  force and their moment about the centroid is the applied moment. The force the connected part
  (plate or web) exerts on a bolt is this force; the bolt pushes back on that part with its
  opposite.
* An eccentric shear V (:func:`eccentric_shear_loads`) acts downwards for ``angle_deg = 0``; a
  positive angle tilts it towards +x: force V·(sin θ, −cos θ). Its line of action crosses the
  horizontal line through the centroid at x = x_c + e. So a downward V to the right of the bolts
  (e > 0) gives a clockwise (negative) moment Mz = −V·e·cos θ.

Methods
-------
Elastic (vector) method: each of the n bolts takes (Px, Py)/n of the direct load and, from the
moment, a force perpendicular to its radius from the centroid and proportional to it:
Mz·r_i/J with J = Σ(x_i² + y_i²) about the centroid. Exact for any pattern.

Instantaneous centre of rotation (Crawford & Kulak 1971; AISC Steel Construction Manual, Part 7):
see :mod:`engine.boltgroup_icr` for the method, the solver and the normalisation of C.

An aid to a competent engineer: results must be checked, and the governing local code and
licensed practice take precedence.
"""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike

from engine.boltgroup_common import (
    MM_PER_IN,
    as_batch,
    as_group,
    as_load_vector,
    eccentric_shear_loads,
    group_offsets,
    pad_groups,
)
from engine.boltgroup_icr import (
    DELTA_MAX_IN,
    LAMBDA,
    MU_PER_IN,
    NORMALISATIONS,
    R_AT_DELTA_MAX,
    ICRConvergenceError,
    ICRResult,
    crawford_kulak,
    icr_coefficient,
    icr_coefficients,
    icr_solve,
    icr_solve_batch,
)
from engine.errors import BadInputError

__all__ = [
    # geometry and loads
    "MM_PER_IN",
    "pad_groups",
    "centroid",
    "polar_moment",
    "eccentric_shear_loads",
    # elastic method
    "elastic_bolt_forces",
    "elastic_bolt_forces_batch",
    "elastic_coefficient",
    "elastic_coefficients",
    # instantaneous centre of rotation
    "DELTA_MAX_IN",
    "MU_PER_IN",
    "LAMBDA",
    "R_AT_DELTA_MAX",
    "NORMALISATIONS",
    "crawford_kulak",
    "ICRResult",
    "ICRConvergenceError",
    "icr_solve",
    "icr_solve_batch",
    "icr_coefficient",
    "icr_coefficients",
]


def centroid(xy_mm: ArrayLike) -> np.ndarray:
    """Centroid (x, y) of a bolt pattern, mm (all bolts of equal area)."""
    xy = as_group(xy_mm)
    return xy.mean(axis=0)


def polar_moment(xy_mm: ArrayLike) -> float:
    """Polar moment of the pattern about its centroid, J = Σ(x_i² + y_i²), mm² per unit bolt area."""
    xy = as_group(xy_mm)
    p = xy - xy.mean(axis=0)
    return float((p * p).sum())


def elastic_bolt_forces_batch(
    xy_batch, Px_N: ArrayLike, Py_N: ArrayLike, Mz_Nmm: ArrayLike, *, mask: ArrayLike | None = None
) -> np.ndarray:
    """Elastic-method bolt forces for many groups at once.

    Parameters
    ----------
    xy_batch : array_like (G, n, 2), or a sequence of (n_i, 2) arrays
        Bolt centres, mm, any origin (padded with ``mask`` for mixed bolt counts).
    Px_N, Py_N, Mz_Nmm : float or array_like (G,)
        Loads at the centroid of each pattern: N, N, N·mm (counter-clockwise positive).
    mask : array_like of bool (G, n), optional
        ``True`` for real bolts.

    Returns
    -------
    ndarray (G, n, 2)
        Force carried by each bolt, N: f_i = (Px, Py)/n + Mz/J · (−(y_i − y_c), x_i − x_c).
        Zero on padding rows.

    Raises
    ------
    BadInputError
        A group whose bolts all lie at one point (J = 0) with Mz ≠ 0: it cannot carry a moment.
    """
    xy, m = as_batch(xy_batch, mask)
    G = m.shape[0]
    Px = as_load_vector(Px_N, G, "Px_N")
    Py = as_load_vector(Py_N, G, "Py_N")
    Mz = as_load_vector(Mz_Nmm, G, "Mz_Nmm")
    _, p, n, J = group_offsets(xy, m)
    size = np.sqrt(J / n)
    scale = np.maximum(np.abs(xy).max(axis=(1, 2)), 1.0)
    nomoment = size <= 1e-12 * scale
    if np.any(nomoment & (Mz != 0)):
        raise BadInputError(
            f"bolt groups {np.flatnonzero(nomoment & (Mz != 0)).tolist()} have all their bolts at one "
            "point and cannot carry a moment Mz"
        )
    k = np.where(nomoment, 0.0, Mz / np.where(nomoment, 1.0, J))
    w = m.astype(float)
    f = np.empty_like(p)
    f[..., 0] = (Px / n)[:, None] * w - k[:, None] * p[..., 1]
    f[..., 1] = (Py / n)[:, None] * w + k[:, None] * p[..., 0]
    return f


def elastic_bolt_forces(xy_mm: ArrayLike, Px_N: float, Py_N: float, Mz_Nmm: float) -> np.ndarray:
    """Elastic-method force on every bolt of one pattern under Px, Py, Mz at its centroid.

    Parameters
    ----------
    xy_mm : array_like (n, 2)
        Bolt centres, mm, any origin.
    Px_N, Py_N : float
        Load components at the centroid, N (x right, y up).
    Mz_Nmm : float
        Moment about the centroid, N·mm, counter-clockwise positive.

    Returns
    -------
    ndarray (n, 2)
        Force carried by each bolt (x, y components), N; ``numpy.hypot`` of the columns gives the
        resultants. They sum to (Px, Py) and their moment about the centroid is Mz.

    Examples
    --------
    Two bolts 100 mm apart on a vertical line, 10 kN down at 50 mm to the right:

    >>> import numpy as np
    >>> xy = np.array([[0.0, 0.0], [0.0, 100.0]])
    >>> elastic_bolt_forces(xy, 0.0, -10e3, -10e3 * 50).round(6)
    array([[-5000., -5000.],
           [ 5000., -5000.]])
    """
    xy = as_group(xy_mm)
    return elastic_bolt_forces_batch(xy[None], Px_N, Py_N, Mz_Nmm)[0]


def elastic_coefficients(
    xy_batch, ex_mm: ArrayLike, angle_deg: ArrayLike = 0.0, *, mask: ArrayLike | None = None
) -> np.ndarray:
    """Elastic-method coefficient C = V / (largest bolt resultant) for a shear V at (ex, angle).

    The elastic counterpart of :func:`engine.boltgroup.icr_coefficients` (same geometry
    convention): the group carries C times the strength of its most loaded bolt. C = n for a
    concentric load; a group that cannot carry the moment (all bolts at one point) gives 0.

    Returns
    -------
    ndarray (G,)
    """
    xy, m = as_batch(xy_batch, mask)
    G = m.shape[0]
    ex = as_load_vector(ex_mm, G, "ex_mm")
    ang = as_load_vector(angle_deg, G, "angle_deg")
    Px, Py, Mz = eccentric_shear_loads(1.0, ex, ang)
    _, p, n, J = group_offsets(xy, m)
    nomoment = np.sqrt(J / n) <= 1e-12 * np.maximum(np.abs(xy).max(axis=(1, 2)), 1.0)
    Mz = np.where(nomoment, 0.0, Mz)
    f = elastic_bolt_forces_batch(xy, Px, Py, Mz, mask=m)
    fmax = np.hypot(f[..., 0], f[..., 1]).max(axis=1)
    C = 1.0 / fmax
    return np.where(nomoment & (eccentric_shear_loads(1.0, ex, ang)[2] != 0), 0.0, C)


def elastic_coefficient(xy_mm: ArrayLike, ex_mm: float, angle_deg: float = 0.0) -> float:
    """Elastic-method coefficient C for one pattern; see :func:`elastic_coefficients`."""
    xy = as_group(xy_mm)
    return float(elastic_coefficients(xy[None], ex_mm, angle_deg)[0])
