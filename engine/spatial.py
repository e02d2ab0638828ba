"""Spatial index for the joint finder: a uniform grid hash of member axes (mm), numpy-vectorised.

Method. Each axis segment is sampled at a spacing of half the cell size ``c`` and registered in every
cell a sample falls in. A query point within radius ``r`` of a segment has a segment point ``p`` with
``|p - q| <= r`` and a sample ``s`` with ``|s - p| <= c/4``, so ``s`` lies within ``r + c/4`` of ``q``;
with ``c >= 4r/3`` that is at most one cell away in every axis, so looking in the 27 cells around the
query's cell finds every segment within ``r`` (no false negatives). Candidates are then filtered by
exact point-to-segment distance. Building is O(total length / c), a query batch O(queries × local
density); there is no all-pairs loop.

``points_in_boxes`` finds which points lie in axis-aligned boxes (walls, slabs) by sorting the points
on x once and cutting each box's x-range with a binary search.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

__all__ = ["SegmentGrid", "points_in_boxes", "point_segment_distance"]

_OFFSETS = np.array([(i, j, k) for i in (-1, 0, 1) for j in (-1, 0, 1) for k in (-1, 0, 1)],
                    dtype=np.int64)
_STEPS = np.array([-1, 0, 1], dtype=np.int64)
_BUILD_RUN = 4096  # segments sampled at a time by SegmentGrid.build


def point_segment_distance(p: np.ndarray, a: np.ndarray, b: np.ndarray) -> np.ndarray:
    """Distance (mm) from points ``p`` to segments ``a``–``b``, row by row (arrays of shape (n, 3))."""
    ab = b - a
    denom = np.einsum("ij,ij->i", ab, ab)
    t = np.einsum("ij,ij->i", p - a, ab) / np.where(denom > 0.0, denom, 1.0)
    t = np.clip(t, 0.0, 1.0)
    foot = a + ab * t[:, None]
    return np.linalg.norm(p - foot, axis=1)


@dataclass(frozen=True)
class SegmentGrid:
    """A grid hash of line segments (mm). Build with :meth:`build`, query with :meth:`query`."""

    cell: float
    origin: np.ndarray
    dims: tuple[int, int, int]
    keys: np.ndarray       # sorted unique cell keys
    starts: np.ndarray     # CSR offsets into ``items`` per key (len(keys) + 1)
    items: np.ndarray      # segment indices, grouped by key
    a: np.ndarray
    b: np.ndarray

    @classmethod
    def build(cls, a: np.ndarray, b: np.ndarray, radius: float, pad_points: np.ndarray | None = None
              ) -> "SegmentGrid":
        """Index segments ``a[i]``–``b[i]`` (arrays (n, 3), mm) for queries of up to ``radius`` mm.

        ``pad_points`` are extra points (the later queries) that the grid's extent must cover.
        """
        a = np.asarray(a, dtype=float).reshape(-1, 3)
        b = np.asarray(b, dtype=float).reshape(-1, 3)
        cell = max(4.0 * float(radius) / 3.0, 1.0)
        pts = [a, b] if pad_points is None else [a, b, np.asarray(pad_points, float).reshape(-1, 3)]
        allp = np.vstack(pts) if len(a) or pad_points is not None else np.zeros((1, 3))
        if len(allp) == 0:
            allp = np.zeros((1, 3))
        origin = allp.min(axis=0) - 2.0 * cell
        span = allp.max(axis=0) - origin + 2.0 * cell
        dims = tuple(int(x) for x in np.ceil(span / cell).astype(np.int64) + 1)
        if len(a) == 0:
            return cls(cell, origin, dims, np.zeros(0, np.int64), np.zeros(1, np.int64),
                       np.zeros(0, np.int64), a, b)
        spacing = cell / 2.0
        n = np.int64(len(a))
        # the samples of a run of segments at a time: all at once they are many times the index
        # (the joint finder's peak memory on a large model); the (cell, segment) pairs are the same
        runs = []
        for c0 in range(0, len(a), _BUILD_RUN):
            a_r, b_r = a[c0:c0 + _BUILD_RUN], b[c0:c0 + _BUILD_RUN]
            n_samples = np.ceil(np.linalg.norm(b_r - a_r, axis=1) / spacing).astype(np.int64) + 1
            seg = np.repeat(np.arange(len(a_r), dtype=np.int64), n_samples)
            first = np.repeat(np.cumsum(n_samples) - n_samples, n_samples)
            k = np.arange(len(seg), dtype=np.int64) - first
            frac = k / np.maximum(n_samples[seg] - 1, 1)
            samples = a_r[seg] + (b_r[seg] - a_r[seg]) * frac[:, None]
            keys = cls._key(np.floor((samples - origin) / cell).astype(np.int64), dims)
            runs.append(_sorted_unique(keys * n + (seg + c0)))
        pair = _sorted_unique(np.concatenate(runs))
        keys = pair // np.int64(len(a))
        items = pair % np.int64(len(a))
        first_idx = np.flatnonzero(np.r_[True, keys[1:] != keys[:-1]])
        starts = np.append(first_idx, len(keys)).astype(np.int64)
        return cls(cell, origin, dims, keys[first_idx], starts, items, a, b)

    @staticmethod
    def _key(ijk: np.ndarray, dims: tuple[int, int, int]) -> np.ndarray:
        return (ijk[:, 0] * dims[1] + ijk[:, 1]) * dims[2] + ijk[:, 2]

    def query(self, points: np.ndarray, radius: float, chunk: int = 8192) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        """Pairs (point index, segment index, distance mm) with distance ≤ ``radius``.

        ``radius`` must not exceed the radius the grid was built for. Pairs are sorted by point index,
        then segment index. Points sharing a cell share its 27-cell neighbourhood: the neighbourhood
        is looked up once per occupied query cell, then handed to each point in it. The points go
        through in runs of ``chunk``: the candidate pairs before the distance test are many times
        the pairs kept, and held for all points at once they set the joint finder's peak memory.
        """
        if radius > 0.75 * self.cell + 1e-9:
            raise ValueError(f"query radius {radius} mm exceeds the grid's build radius")
        points = np.asarray(points, dtype=float).reshape(-1, 3)
        if len(points) > chunk:
            parts = [self.query(points[i:i + chunk], radius, chunk) for i in range(0, len(points), chunk)]
            return (np.concatenate([q + i for (q, _, _), i in zip(parts, range(0, len(points), chunk))]),
                    np.concatenate([p[1] for p in parts]), np.concatenate([p[2] for p in parts]))
        return self._query(points, radius)

    def _query(self, points: np.ndarray, radius: float) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        empty = (np.zeros(0, np.int64), np.zeros(0, np.int64), np.zeros(0))
        if len(points) == 0 or len(self.items) == 0:
            return empty
        dims = np.array(self.dims, dtype=np.int64)
        ijk = np.floor((points - self.origin) / self.cell).astype(np.int64)
        # points more than one cell outside the grid have no cell to look in
        near = np.flatnonzero(np.all((ijk >= -1) & (ijk <= dims), axis=1))
        if len(near) == 0:
            return empty
        # group the points by cell (a key over the grid grown by one cell each side: no aliasing)
        g = ijk[near] + 1
        gkey = (g[:, 0] * (dims[1] + 2) + g[:, 1]) * (dims[2] + 2) + g[:, 2]
        by_cell = np.argsort(gkey, kind="stable")
        gk = gkey[by_cell]
        new = np.r_[True, gk[1:] != gk[:-1]]
        cell_of = np.empty(len(near), dtype=np.int64)
        cell_of[by_cell] = np.cumsum(new) - 1
        cell_ijk = ijk[near][by_cell[new]]
        # neighbourhood of each occupied query cell → (cell, segment) pairs, each once, sorted
        # neighbour (i+di, j+dj, k+dk) is inside the grid when each coordinate is; its key is the
        # cell's key plus the offset's key (the key is linear in i, j, k)
        inside = [(cell_ijk[:, ax, None] + _STEPS[None, :] >= 0)
                  & (cell_ijk[:, ax, None] + _STEPS[None, :] < dims[ax]) for ax in range(3)]
        valid = (inside[0][:, _OFFSETS[:, 0] + 1] & inside[1][:, _OFFSETS[:, 1] + 1]
                 & inside[2][:, _OFFSETS[:, 2] + 1]).ravel()
        koff = self._key(_OFFSETS, self.dims)
        nkeys = (self._key(cell_ijk, self.dims)[:, None] + koff[None, :]).ravel()[valid]
        cidx = np.repeat(np.arange(len(cell_ijk), dtype=np.int64), len(_OFFSETS))[valid]
        pos = np.searchsorted(self.keys, nkeys)
        pos_c = np.minimum(pos, len(self.keys) - 1)
        hit = self.keys[pos_c] == nkeys
        cidx, pos_c = cidx[hit], pos_c[hit]
        lo, hi = self.starts[pos_c], self.starts[pos_c + 1]
        counts = hi - lo
        if counts.sum() == 0:
            return empty
        n_seg = np.int64(len(self.a))
        c_rep = np.repeat(cidx, counts)
        s_rep = self.items[np.repeat(lo, counts) + _ramp(counts)]
        cpair = _sorted_unique(c_rep * n_seg + s_rep)
        cseg = cpair % n_seg
        per_cell = np.bincount(cpair // n_seg, minlength=len(cell_ijk))
        cstart = np.cumsum(per_cell) - per_cell
        # each point (in index order) takes its cell's segments (in segment order)
        n_pt = per_cell[cell_of]
        q = np.repeat(near, n_pt)
        s = cseg[np.repeat(cstart[cell_of], n_pt) + _ramp(n_pt)]
        d = point_segment_distance(points[q], self.a[s], self.b[s])
        keep = d <= radius
        return q[keep], s[keep], d[keep]


def _ramp(counts: np.ndarray) -> np.ndarray:
    """0, 1, ..., c-1 for each count c, concatenated."""
    return np.arange(int(counts.sum()), dtype=np.int64) - np.repeat(np.cumsum(counts) - counts, counts)


def _sorted_unique(x: np.ndarray) -> np.ndarray:
    """Sorted distinct values of an integer array (sort, then drop repeats)."""
    x = np.sort(x)
    return x[np.r_[True, x[1:] != x[:-1]]] if len(x) else x


def points_in_boxes(points: np.ndarray, box_min: np.ndarray, box_max: np.ndarray
                    ) -> tuple[np.ndarray, np.ndarray]:
    """Pairs (point index, box index) of points inside (or on) axis-aligned boxes (mm).

    Points are sorted on x once; each box cuts its x-range by binary search, then filters y and z.
    """
    points = np.asarray(points, dtype=float).reshape(-1, 3)
    box_min = np.asarray(box_min, dtype=float).reshape(-1, 3)
    box_max = np.asarray(box_max, dtype=float).reshape(-1, 3)
    if len(points) == 0 or len(box_min) == 0:
        return np.zeros(0, np.int64), np.zeros(0, np.int64)
    order = np.argsort(points[:, 0], kind="stable")
    xs = points[order, 0]
    lo = np.searchsorted(xs, box_min[:, 0], side="left")
    hi = np.searchsorted(xs, box_max[:, 0], side="right")
    counts = np.maximum(hi - lo, 0)
    if counts.sum() == 0:
        return np.zeros(0, np.int64), np.zeros(0, np.int64)
    box = np.repeat(np.arange(len(box_min), dtype=np.int64), counts)
    offs = np.arange(counts.sum(), dtype=np.int64) - np.repeat(np.cumsum(counts) - counts, counts)
    pt = order[np.repeat(lo, counts) + offs]
    p = points[pt]
    inside = np.all((p >= box_min[box]) & (p <= box_max[box]), axis=1)
    pt, box = pt[inside], box[inside]
    srt = np.lexsort((box, pt))
    return pt[srt].astype(np.int64), box[srt]
