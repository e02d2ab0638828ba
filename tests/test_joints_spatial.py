"""The grid hash finds exactly the segments a brute-force distance check finds (no false negatives,
no false positives), and box containment matches a direct test."""

from __future__ import annotations

import numpy as np
import pytest

from engine.spatial import SegmentGrid, point_segment_distance, points_in_boxes


@pytest.mark.parametrize("chunk", [1, 7, 64])
def test_grid_query_in_runs_of_points_gives_the_same_pairs_in_the_same_order(chunk):
    rng = np.random.default_rng(5)
    a = rng.uniform(0, 20000, (300, 3))
    b = a + rng.normal(0, 3000, (300, 3))
    q = np.vstack([a[:80], rng.uniform(0, 20000, (120, 3))])
    grid = SegmentGrid.build(a, b, 600.0, pad_points=q)
    whole = grid.query(q, 600.0, chunk=10**9)
    runs = grid.query(q, 600.0, chunk=chunk)
    assert len(whole[0]) > 100
    for x, y in zip(whole, runs):
        assert np.array_equal(x, y)


def test_point_segment_distance_matches_hand_values():
    a = np.array([[0.0, 0.0, 0.0]] * 3)
    b = np.array([[10.0, 0.0, 0.0]] * 3)
    p = np.array([[5.0, 3.0, 4.0], [-3.0, 4.0, 0.0], [12.0, 0.0, 0.0]])
    # perpendicular foot (3-4-5), before the start (3-4-5 to the start), beyond the end
    assert point_segment_distance(p, a, b) == pytest.approx([5.0, 5.0, 2.0])


@pytest.mark.parametrize("seed", [0, 1, 2])
def test_grid_query_equals_brute_force(seed):
    rng = np.random.default_rng(seed)
    n = 300
    a = rng.uniform(0, 20000, (n, 3))
    b = a + rng.normal(0, 3000, (n, 3))
    q = np.vstack([a[:50], b[50:100], rng.uniform(0, 20000, (100, 3))])
    r = 600.0
    grid = SegmentGrid.build(a, b, r, pad_points=q)
    qi, si, d = grid.query(q, r)
    got = set(zip(qi.tolist(), si.tolist()))
    qq = np.repeat(np.arange(len(q)), n)
    ss = np.tile(np.arange(n), len(q))
    dd = point_segment_distance(q[qq], a[ss], b[ss])
    want = set(zip(qq[dd <= r].tolist(), ss[dd <= r].tolist()))
    assert got == want
    assert all((i, i) in got for i in range(100))  # an end point finds its own segment


def test_query_radius_larger_than_build_radius_is_refused():
    grid = SegmentGrid.build(np.zeros((1, 3)), np.ones((1, 3)), 100.0)
    with pytest.raises(ValueError):
        grid.query(np.zeros((1, 3)), 1000.0)


def test_points_in_boxes_matches_direct_test():
    rng = np.random.default_rng(5)
    pts = rng.uniform(0, 100, (500, 3))
    lo = rng.uniform(0, 80, (20, 3))
    hi = lo + rng.uniform(1, 30, (20, 3))
    pi, bi = points_in_boxes(pts, lo, hi)
    inside = np.all((pts[:, None, :] >= lo[None]) & (pts[:, None, :] <= hi[None]), axis=2)
    want = set(zip(*np.nonzero(inside)))
    assert set(zip(pi.tolist(), bi.tolist())) == {(int(x), int(y)) for x, y in want}
