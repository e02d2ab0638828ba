"""ICR coefficients C for eccentrically loaded bolt groups, against reference values.

What C is. C = P_u / R_ult: the ultimate load of the group on the given line of action divided by
the ultimate strength of one bolt, by the instantaneous centre of rotation method of Crawford and
Kulak as used for the AISC Steel Construction Manual, Part 7, tables of C: each bolt deforms
perpendicular to its radius from the instantaneous centre O by Delta_i = 0.34 in. x r_i / r_max
and resists with R_i = R_ult (1 - e^(-10 Delta_i))^0.55. Because every Delta_i is the fixed
fraction r_i / r_max of 0.34 in., C depends only on the shape of the pattern and on e / (size),
and not on the unit of length.

Normalisation. The farthest bolt carries R(0.34 in.) = (1 - e^(-3.4))^0.55 R_ult = 0.98150 R_ult,
so with C = P_u / R_ult (the engine's default, normalisation="ultimate") C tends to 0.9815 n as
e -> 0 (the engine returns n exactly for e = 0, as the AISC rule R_n = n r_n for a concentric
group). C = P_u / R(Delta_max) (normalisation="delta-max") is 1 / 0.9815 = 1.9 % higher
throughout. The AISC tables define C as P_u / R_ult (not re-read on a printed page for this
file).

Where the reference values come from. No published value of C is used here: comparisons with
published tables of C belong in ``test_icr_published_tables.py`` (same folder). Two searches for
printed values (AISC Manual Part 7 Tables 7-6 to 7-14 and the AISC Design Examples; Kulak, Fisher
and Struik's Guide; Segui, McCormac, Salmon and Johnson; the CISC Handbook; course notes and solved
problems) found no page on which a printed C could be read, so that file holds, for now, only a
value recalled from memory and marked so. Every reference value below is an INDEPENDENT
CALCULATION made in this file, not a published value:
``_independent_icr`` finds the instantaneous centre by a plain two-dimensional search (sign-change
bracketing on a log-polar grid, then repeated halving of a square window), from equilibrium of
the bolt forces with the load written out directly. It shares no code with the engine (which
solves for the rigid-body motion in a load frame by damped Newton iteration and takes the
capacity from virtual work) and uses the constants 0.34 in., 10 and 0.55 as literals.
C = 2 R(0.34) d / (e + s^2/4e) for two bolts is also checked by hand. While this file was written
the search was checked against the engine on 400 random patterns of 2 to 12 bolts, loads at any
angle, with the load's perpendicular distance from the centroid at least 0.1 times the radius of
gyration (true of all cases here): they agreed to 2e-13. Nearer to concentric the centre can lie
too far out for the grid, so each test also asserts that the search reached equilibrium.

Tolerance. The search resolves the centre to about 1e-12 of the group's size and the engine
converges to 1e-12, so engine and reference are compared to 1e-6 relative (far tighter than the
2 % the issue asks). A published value, when one is added, should be compared within 2 % or half
a unit in its last printed digit, whichever is larger (a C printed as 0.88 stands for 0.875 to
0.885).

Geometry is given in inches (the unit the Crawford-Kulak curve is written in) and converted to mm
(x 25.4) for the engine; one case is metric.
"""

from __future__ import annotations

import math
from functools import lru_cache

import numpy as np
import pytest

from engine.boltgroup import (
    R_AT_DELTA_MAX,
    eccentric_shear_loads,
    icr_coefficient,
    icr_coefficients,
    icr_solve,
)

IN = 25.4  # mm per inch


# ---------------------------------------------------------------------------------------------
# The independent calculation
# ---------------------------------------------------------------------------------------------


def _equilibrium(xy, e, angle_deg):
    """Equilibrium residuals of a trial instantaneous centre O = (ox, oy) (arrays), for the unit
    load of direction u = (sin a, -cos a) whose line crosses the horizontal through the centroid
    at x = e (coordinates relative to the centroid, any unit).

    The part turns about O in the sense of the load's moment about O. Bolt i, at distance d_i
    from O, deforms by 0.34 d_i / d_max (in.) and pushes back on the part with
    R_i = (1 - e^(-10 Delta_i))^0.55 (per unit R_ult), perpendicular to its radius, against the
    motion. Moment about O gives the load P = sum(R_i d_i) / (lever of the load about O); the
    bolt forces, reversed, must then add up to P u: f_across and f_along (both per sum(R_i)) are
    the two components of their difference, across and along the load.
    """
    p = np.asarray(xy, float)
    p = p - p.mean(axis=0)
    a = math.radians(angle_deg)
    ux, uy = math.sin(a), -math.cos(a)

    def residuals(ox, oy):
        rx = p[:, 0][None, :] - ox[:, None]
        ry = p[:, 1][None, :] - oy[:, None]
        d = np.hypot(rx, ry)
        delta = 0.34 * d / d.max(axis=1, keepdims=True)
        R = (1.0 - np.exp(-10.0 * delta)) ** 0.55
        lever = (e - ox) * uy + oy * ux  # moment of the unit load about O, counter-clockwise
        turn = np.sign(lever)[:, None]
        dd = np.where(d > 0, d, 1.0)
        # sum of the forces the part exerts on the bolts (= the load they carry)
        gx = (turn * R * -ry / dd).sum(axis=1)
        gy = (turn * R * rx / dd).sum(axis=1)
        with np.errstate(divide="ignore", invalid="ignore"):
            P = (R * d).sum(axis=1) / np.abs(lever)
        S = R.sum(axis=1)
        f_across = (gx * uy - gy * ux) / S
        f_along = (gx * ux + gy * uy - P) / S
        return f_across, f_along, P, lever, delta

    L = math.sqrt((p * p).sum() / len(p))  # radius of gyration of the pattern
    return residuals, L


@lru_cache(maxsize=None)
def _independent_icr(xy_key, e, angle_deg):
    """C, instantaneous centre (relative to the centroid), residual and bolt deformations (in.)
    by brute-force search. ``xy_key`` is a tuple of (x, y) pairs."""
    residuals, L = _equilibrium(np.array(xy_key), e, angle_deg)
    # 1. bracket: a log-polar grid about the centroid, radii 1e-3 L to 1e4 L; keep the cells in
    #    which both residuals change sign while the load's lever about O keeps its sign
    lr = np.linspace(math.log(1e-3 * L), math.log(1e4 * L), 241)
    ph = np.linspace(-math.pi, math.pi, 361)[:-1]
    LR, PH = np.meshgrid(lr, ph, indexing="ij")
    X, Y = np.exp(LR) * np.cos(PH), np.exp(LR) * np.sin(PH)
    f1, f2, _, lever, _ = residuals(X.ravel(), Y.ravel())
    f1, f2, lever = f1.reshape(X.shape), f2.reshape(X.shape), lever.reshape(X.shape)

    def corners(v):
        w = np.roll(v, -1, axis=1)
        return np.stack([v[:-1], v[1:], w[:-1], w[1:]])

    s1, s2, sl = corners(np.sign(f1)), corners(np.sign(f2)), corners(np.sign(lever))
    cells = (s1.min(0) < s1.max(0)) & (s2.min(0) < s2.max(0)) & (sl.min(0) == sl.max(0))
    cells &= np.all(np.isfinite(corners(f2)), axis=0)
    # 2. refine the bracketed cells, those with the smallest residuals first: a 21 x 21 window
    #    about the best point, halved 40 times; stop at the first that reaches equilibrium
    ii, jj = np.nonzero(cells)
    order = np.argsort((np.abs(f1) + np.abs(f2))[ii, jj], kind="stable")
    best = (math.inf, None, None, None)
    for i, j in zip(ii[order], jj[order]):
        rho = math.exp(0.5 * (lr[i] + lr[i + 1]))
        phi = ph[j] + 0.5 * (ph[1] - ph[0])
        cx, cy = rho * math.cos(phi), rho * math.sin(phi)
        half = 2.0 * rho * max(lr[1] - lr[0], ph[1] - ph[0])
        for _ in range(40):
            g = np.linspace(-half, half, 21)
            XX, YY = np.meshgrid(cx + g, cy + g)
            XX, YY = XX.ravel(), YY.ravel()
            a1, a2, P, _, delta = residuals(XX, YY)
            r = np.hypot(a1, a2)
            r = np.where(np.isfinite(r), r, np.inf)
            k = int(np.argmin(r))
            cx, cy = XX[k], YY[k]
            half /= 2.0
        if r[k] < best[0]:
            best = (float(r[k]), float(P[k]), (float(cx), float(cy)), delta[k].copy())
        if best[0] < 1e-12:
            break
    residual, C, centre, delta = best
    return C, centre, residual, delta, L


def _ref(xy, e, angle):
    return _independent_icr(tuple(map(tuple, np.asarray(xy, float))), float(e), float(angle))


# ---------------------------------------------------------------------------------------------
# Cases: (name, bolt centres in., ex in. from the centroid, angle of the load from vertical, deg)
# ---------------------------------------------------------------------------------------------


def vertical_row(n: int, pitch: float, x: float = 0.0) -> np.ndarray:
    return np.column_stack([np.full(n, x), -np.arange(n) * pitch])


def two_rows(n: int, pitch: float, gauge: float) -> np.ndarray:
    return np.vstack([vertical_row(n, pitch), vertical_row(n, pitch, gauge)])


L_SHAPE = np.array([[0.0, 0.0], [0.0, -3.0], [0.0, -6.0], [3.0, -6.0], [6.0, -6.0]])

CASES = [
    # single vertical line, vertical load (cf. AISC Manual Table 7-6 layout: s = 3 in.)
    ("row3-s3-e4", vertical_row(3, 3.0), 4.0, 0.0),
    ("row6-s3-e6", vertical_row(6, 3.0), 6.0, 0.0),
    ("row8-s3-e2", vertical_row(8, 3.0), 2.0, 0.0),  # small e: centre far from the bolts
    ("row12-s3-e16", vertical_row(12, 3.0), 16.0, 0.0),
    # single vertical line, inclined load
    ("row4-s3-e3-a45", vertical_row(4, 3.0), 3.0, 45.0),
    ("row5-p70mm-e150mm-a15", vertical_row(5, 70.0 / IN), 150.0 / IN, 15.0),  # metric fin plate
    # two vertical lines (cf. Table 7-7/7-8 layouts), vertical and inclined loads
    ("2x4-s3-g3-e8", two_rows(4, 3.0, 3.0), 8.0, 0.0),
    ("2x5-s3-g5.5-e10-a30", two_rows(5, 3.0, 5.5), 10.0, 30.0),
    ("2x3-s3-g3-e6-a75", two_rows(3, 3.0, 3.0), 6.0, 75.0),
    # an irregular pattern, load on either side
    ("L5-e7-a60", L_SHAPE, 7.0, 60.0),
    ("L5-e-5-a-20", L_SHAPE, -5.0, -20.0),
]
IDS = [c[0] for c in CASES]


@pytest.mark.parametrize("name,xy,e,angle", CASES, ids=IDS)
def test_icr_coefficient_matches_independent_calculation(name, xy, e, angle):
    # reference: independent calculation (_independent_icr, this file), not a published value
    C_ref, _, residual, _, _ = _ref(xy, e, angle)
    assert residual < 1e-9  # the search found an equilibrium position, not a near miss
    C = icr_coefficient(xy * IN, e * IN, angle)
    assert C == pytest.approx(C_ref, rel=1e-6)
    assert 0.0 < C < len(xy)


@pytest.mark.parametrize("name,xy,e,angle", CASES, ids=IDS)
def test_icr_centre_and_deformations_match_independent_calculation(name, xy, e, angle):
    # reference: independent calculation (_independent_icr, this file)
    _, centre_ref, _, delta_ref, L = _ref(xy, e, angle)
    c = xy.mean(axis=0)
    res = icr_solve(xy * IN, *eccentric_shear_loads(1.0, e * IN, angle))
    assert res.converged
    np.testing.assert_allclose(res.icr_mm / IN - c, centre_ref, atol=1e-6 * L)
    # Delta_i = 0.34 in. x r_i / r_max: 0.34 in. at the bolt farthest from the centre
    np.testing.assert_allclose(res.deformation_in, delta_ref, atol=1e-9)
    assert res.deformation_in.max() == pytest.approx(0.34, abs=1e-12)


def test_two_bolts_closed_form():
    # Reference by hand (independent calculation): two bolts at y = +-s/2, vertical load at e.
    # Both bolts are at the same distance d from the centre, which lies on the horizontal axis at
    # r0 behind the centroid, so both carry R(0.34 in.). Vertical equilibrium 2 R r0/d = P and
    # moment 2 R d = P (e + r0) give r0 (e + r0) = d^2 = r0^2 + s^2/4, so r0 = s^2/(4e) and
    # C = 2 R(0.34) d / (e + r0).
    R = (1.0 - math.exp(-3.4)) ** 0.55
    for s, e in [(3.0, 3.0), (3.0, 1.0), (80.0 / IN, 200.0 / IN)]:
        r0 = s * s / (4.0 * e)
        d = math.hypot(r0, s / 2.0)
        C_hand = 2.0 * R * d / (e + r0)
        xy = vertical_row(2, s)
        assert _ref(xy, e, 0.0)[0] == pytest.approx(C_hand, rel=1e-9)
        assert icr_coefficient(xy * IN, e * IN) == pytest.approx(C_hand, rel=1e-9)
        res = icr_solve(xy * IN, *eccentric_shear_loads(1.0, e * IN))
        assert res.icr_mm[0] / IN == pytest.approx(-r0, abs=1e-9)


def test_batch_and_normalisation():
    groups = [xy * IN for _, xy, _, _ in CASES]
    ex = np.array([e * IN for _, _, e, _ in CASES])
    ang = np.array([a for _, _, _, a in CASES])
    C = icr_coefficients(groups, ex, ang)
    ref = np.array([_ref(xy, e, a)[0] for _, xy, e, a in CASES])  # independent calculation
    np.testing.assert_allclose(C, ref, rtol=1e-6)
    # C = P_u/R(Delta_max) is C = P_u/R_ult divided by R(0.34 in.)/R_ult = (1 - e^-3.4)^0.55
    assert R_AT_DELTA_MAX == pytest.approx((1.0 - math.exp(-3.4)) ** 0.55, rel=1e-15)
    assert R_AT_DELTA_MAX == pytest.approx(0.98150, abs=5e-6)
    C_dm = icr_coefficients(groups, ex, ang, normalisation="delta-max")
    np.testing.assert_allclose(C_dm, C / R_AT_DELTA_MAX, rtol=1e-12)
    assert np.all(C_dm / C > 1.018)


def test_same_function_at_six_inch_pitch():
    # C depends on the pattern's shape and e/size only: a 6-in. pitch with the lever doubled
    # gives the 3-in. value (the Manual's s = 3 in. and s = 6 in. blocks are two views of one
    # function). Reference: independent calculation at s = 3 in.
    for name in ("row6-s3-e6", "row8-s3-e2", "2x5-s3-g5.5-e10-a30"):
        _, xy, e, angle = CASES[IDS.index(name)]
        C_ref = _ref(xy, e, angle)[0]
        assert icr_coefficient(2.0 * xy * IN, 2.0 * e * IN, angle) == pytest.approx(C_ref, rel=1e-6)


def test_load_given_at_the_centroid_of_a_moved_pattern():
    # The inclined two-line case described by its load reduced to the centroid, with the pattern
    # moved away from the origin: same C as the independent calculation.
    _, xy, e, angle = CASES[IDS.index("2x5-s3-g5.5-e10-a30")]
    C_ref = _ref(xy, e, angle)[0]
    a = math.radians(angle)
    Px, Py = math.sin(a), -math.cos(a)
    Mz = -(e * IN) * math.cos(a)  # moment of the unit load about the centroid (ccw +)
    res = icr_solve(xy * IN + [1000.0, 2000.0], Px, Py, Mz)
    assert res.C == pytest.approx(C_ref, rel=1e-6)
    # the bolt loads add up to C times the load and balance its moment about the centroid
    c = (xy * IN + [1000.0, 2000.0]).mean(axis=0)
    f = res.bolt_forces
    np.testing.assert_allclose(f.sum(axis=0), [res.C * Px, res.C * Py], atol=1e-9)
    r = xy * IN + [1000.0, 2000.0] - c
    assert (r[:, 0] * f[:, 1] - r[:, 1] * f[:, 0]).sum() == pytest.approx(res.C * Mz, rel=1e-9)
