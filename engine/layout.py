"""Fin-plate layout geometry shared by every rule set and the drawings (code-neutral, numpy).

Coordinates of the connection elevation, in mm, looking at the plate face:

* ``x`` is horizontal, measured from the **support face** along the supported beam (positive away
  from the support); ``y`` is vertical, positive **up**, with ``y = 0`` at the **top edge of the
  plate**.
* Bolt ``(i, j)`` (row ``i`` from the top, line ``j`` from the support) sits at
  ``x = a + j·gauge``, ``y = −(plate_end_edge + i·pitch)``.
* The plate occupies ``0 ≤ x ≤ width``, ``−depth ≤ y ≤ 0``.
* The beam web (seen in the same elevation) starts at the beam end, ``x = a − beam_end_edge``, and its
  top (top of steel, or the bottom of a top cope) is at ``y = −plate_end_edge + beam_top_edge``.

A downward end shear V is carried from the beam web through the bolts into the plate: each bolt
pushes the **plate** in the direction of its force and the **beam web** in the opposite direction, so
tear-out (end distance in the direction of the force) is measured along ``+F`` on the plate and
along ``−F`` on the web.
"""

from __future__ import annotations

import numpy as np

from engine.model import FinPlate

__all__ = [
    "bolt_xy",
    "bolt_group_centroid_x",
    "plate_rectangle",
    "web_region",
    "edge_distance_along",
]


def bolt_xy(plate: FinPlate) -> np.ndarray:
    """Bolt centres (n, 2) in mm in the elevation coordinates above, row-major (row, then line)."""
    i, j = np.meshgrid(np.arange(plate.rows), np.arange(plate.lines), indexing="ij")
    x = plate.a + j.ravel() * plate.gauge
    y = -(plate.plate_end_edge + i.ravel() * plate.pitch)
    return np.column_stack([x, y]).astype(float)


def bolt_group_centroid_x(plate: FinPlate) -> float:
    """Distance (mm) from the support face to the centroid of the bolt group: a + (lines−1)·gauge/2."""
    return plate.a + (plate.lines - 1) * plate.gauge / 2.0


def plate_rectangle(plate: FinPlate) -> tuple[float, float, float, float]:
    """The plate as ``(x_min, x_max, y_min, y_max)`` in mm."""
    return (0.0, float(plate.width), -float(plate.depth), 0.0)


def web_region(plate: FinPlate, web_depth_below_top: float) -> tuple[float, float, float, float]:
    """The supported beam's web as ``(x_min, x_max, y_min, y_max)`` in mm; ``x_max`` is infinite.

    ``web_depth_below_top`` is the depth of web below its top (overall depth, or depth less the cope)
    in mm.
    """
    y_top = -plate.plate_end_edge + plate.beam_top_edge
    return (plate.a - plate.beam_end_edge, np.inf, y_top - web_depth_below_top, y_top)


def edge_distance_along(
    xy: np.ndarray, directions: np.ndarray, rect: tuple[float, float, float, float]
) -> np.ndarray:
    """Distance (mm) from each point to the edge of ``rect`` along its direction (vectorised).

    ``xy`` (n, 2) points inside the rectangle, ``directions`` (n, 2) force directions (any length;
    a zero vector gives ``inf``). Returns (n,) distances along the ray to the first edge it meets.
    """
    xy = np.asarray(xy, dtype=float)
    d = np.asarray(directions, dtype=float)
    norm = np.hypot(d[:, 0], d[:, 1])
    with np.errstate(divide="ignore", invalid="ignore"):
        u = d / norm[:, None]
        lo = np.array([rect[0], rect[2]])
        hi = np.array([rect[1], rect[3]])
        t_hi = np.where(u > 0, (hi - xy) / u, np.inf)
        t_lo = np.where(u < 0, (lo - xy) / u, np.inf)
    t = np.minimum(t_hi, t_lo).min(axis=1)
    t[~(norm > 0)] = np.inf
    return t
