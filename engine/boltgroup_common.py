"""Input handling shared by the bolt-group mechanics (:mod:`engine.boltgroup`).

Not a public module: use the names re-exported by :mod:`engine.boltgroup`. Everything here is
numpy only and works on batches: ``xy`` of shape ``(G, n, 2)`` in mm with a boolean ``mask`` of
shape ``(G, n)`` that marks the real bolts of each group (padding rows are ignored everywhere).
"""

from __future__ import annotations

from typing import Sequence

import numpy as np
from numpy.typing import ArrayLike

from engine.errors import BadInputError

__all__ = [
    "MM_PER_IN",
    "pad_groups",
    "as_group",
    "as_batch",
    "as_load_vector",
    "group_offsets",
    "eccentric_shear_loads",
]

MM_PER_IN = 25.4
"""Millimetres per inch, exact."""


def pad_groups(groups: Sequence[np.ndarray]) -> tuple[np.ndarray, np.ndarray]:
    """Stack bolt patterns of different bolt counts into one padded batch.

    Parameters
    ----------
    groups : sequence of array_like, each of shape (n_i, 2)
        Bolt centres of each group, mm.

    Returns
    -------
    xy : ndarray, shape (G, n_max, 2)
        The patterns, padded with zeros.
    mask : ndarray of bool, shape (G, n_max)
        ``True`` where a row is a real bolt.
    """
    arrays = [as_group(g, what=f"group {i}") for i, g in enumerate(groups)]
    if not arrays:
        raise BadInputError("no bolt groups given: pass at least one pattern")
    n_max = max(a.shape[0] for a in arrays)
    xy = np.zeros((len(arrays), n_max, 2))
    mask = np.zeros((len(arrays), n_max), dtype=bool)
    for i, a in enumerate(arrays):
        xy[i, : a.shape[0]] = a
        mask[i, : a.shape[0]] = True
    return xy, mask


def as_group(xy: ArrayLike, *, what: str = "bolt pattern") -> np.ndarray:
    """One bolt pattern as a float array of shape (n, 2), n >= 1, all finite."""
    a = np.asarray(xy, dtype=float)
    if a.ndim != 2 or a.shape[1] != 2 or a.shape[0] < 1:
        raise BadInputError(
            f"{what}: bolt coordinates must have shape (n, 2) with n >= 1, got {a.shape}"
        )
    if not np.all(np.isfinite(a)):
        raise BadInputError(f"{what}: bolt coordinates must be finite numbers")
    return a


def as_batch(xy_batch, mask=None) -> tuple[np.ndarray, np.ndarray]:
    """A batch of patterns as ``(xy (G, n, 2) float, mask (G, n) bool)``.

    ``xy_batch`` is an array of shape (G, n, 2) (equal bolt counts, or padded with ``mask``) or a
    sequence of (n_i, 2) arrays of any lengths, which is padded here (``mask`` must then be
    ``None``). Padding rows may hold any finite value; they are zeroed.
    """
    if not isinstance(xy_batch, np.ndarray):
        try:
            arr = np.asarray(xy_batch, dtype=float)
        except (ValueError, TypeError):  # ragged: a list of patterns of different lengths
            arr = None
        if arr is None or arr.ndim != 3:
            if mask is not None:
                raise BadInputError("a mask can only be given with a (G, n, 2) array of patterns")
            return pad_groups(list(xy_batch))
        xy_batch = arr
    xy = np.asarray(xy_batch, dtype=float)
    if xy.ndim != 3 or xy.shape[2] != 2 or xy.shape[0] < 1 or xy.shape[1] < 1:
        raise BadInputError(f"a batch of bolt patterns must have shape (G, n, 2), got {xy.shape}")
    if mask is None:
        m = np.ones(xy.shape[:2], dtype=bool)
    else:
        m = np.asarray(mask)
        if m.shape != xy.shape[:2]:
            raise BadInputError(f"mask must have shape {xy.shape[:2]}, got {m.shape}")
        m = m.astype(bool)
    empty = ~m.any(axis=1)
    if np.any(empty):
        raise BadInputError(f"bolt groups {np.flatnonzero(empty).tolist()} have no bolts")
    bad = ~np.all(np.isfinite(xy), axis=2) & m
    if np.any(bad):
        raise BadInputError(
            f"bolt groups {np.unique(np.nonzero(bad)[0]).tolist()} have non-finite bolt coordinates"
        )
    xy = np.where(m[..., None], xy, 0.0)
    return xy, m


def as_load_vector(value, G: int, name: str) -> np.ndarray:
    """A scalar or length-G load or geometry value as a finite float array of shape (G,)."""
    a = np.asarray(value, dtype=float)
    try:
        a = np.broadcast_to(a, (G,)).astype(float)
    except ValueError:
        raise BadInputError(f"{name} must be a scalar or have shape ({G},), got {np.shape(value)}") from None
    if not np.all(np.isfinite(a)):
        raise BadInputError(f"{name} must be finite")
    return a


def group_offsets(xy: np.ndarray, mask: np.ndarray):
    """Centroid (G, 2), offsets from it (G, n, 2, zero on padding), bolt count (G,), Σr² (G,)."""
    w = mask.astype(float)
    n = w.sum(axis=1)
    c = (xy * w[..., None]).sum(axis=1) / n[:, None]
    p = (xy - c[:, None, :]) * w[..., None]
    J = (p * p).sum(axis=(1, 2))
    return c, p, n, J


def eccentric_shear_loads(V_N: ArrayLike, e_mm: ArrayLike, angle_deg: ArrayLike = 0.0):
    """Loads at the centroid from a shear V at eccentricity e and angle θ from the vertical.

    Parameters
    ----------
    V_N : float or array_like
        Magnitude of the shear, N; positive acts downwards for θ = 0.
    e_mm : float or array_like
        Where the line of action crosses the horizontal through the centroid, measured from the
        centroid along +x, mm.
    angle_deg : float or array_like
        Angle of the load from the vertical, degrees; positive tilts the downward load towards +x.

    Returns
    -------
    (Px_N, Py_N, Mz_Nmm)
        Px = V sin θ, Py = −V cos θ, Mz = e·Py = −V e cos θ (counter-clockwise positive).
        Arrays broadcast from the inputs (floats for scalar inputs).

    Examples
    --------
    >>> eccentric_shear_loads(100e3, 50.0)
    (0.0, -100000.0, -5000000.0)
    """
    V = np.asarray(V_N, dtype=float)
    e = np.asarray(e_mm, dtype=float)
    th = np.radians(np.asarray(angle_deg, dtype=float))
    if not (np.all(np.isfinite(V)) and np.all(np.isfinite(e)) and np.all(np.isfinite(th))):
        raise BadInputError("V_N, e_mm and angle_deg must be finite")
    s, c = np.sin(th), np.cos(th)
    # exact zeros at multiples of 90°, so a horizontal load through (e, 0) is exactly concentric
    s = np.where(np.abs(s) < 1e-15, 0.0, s)
    c = np.where(np.abs(c) < 1e-15, 0.0, c)
    Px = V * s
    Py = -V * c
    Mz = e * Py
    Px, Py, Mz = np.broadcast_arrays(Px, Py, Mz)
    if Px.ndim == 0:
        return float(Px) + 0.0, float(Py) + 0.0, float(Mz) + 0.0
    return Px.astype(float), Py.astype(float), Mz.astype(float)
