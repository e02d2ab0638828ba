"""Instantaneous centre of rotation (ICR) method for bolt groups in eccentric in-plane shear.

The public names are re-exported by :mod:`engine.boltgroup`; import them from there.

Method
------
Crawford & Kulak (1971), as used for the AISC Steel Construction Manual, Part 7, Tables 7-6 to
7-14 ("Coefficients C for Eccentrically Loaded Bolt Groups"):

* At the ultimate load the connected part rotates about an instantaneous centre O. Each bolt
  deforms perpendicular to the line from O to it, by an amount proportional to its distance r_i:
  Δ_i = Δmax · r_i / r_max, with Δmax = 0.34 in at the bolt farthest from O.
* Each bolt resists with R_i = R_ult (1 − e^(−10 Δ_i))^0.55 (Δ in inches), perpendicular to r_i.
* O is where the bolt forces are in equilibrium with the applied load: their resultant is equal
  and opposite to the load and lies on its line of action. The group capacity is then
  P_u = Σ R_i r_i / l (l = lever arm of the load about O), and C = P_u / R_ult.

Because every Δ_i is a fixed fraction of Δmax given by the ratio r_i / r_max, C depends on the
*shape* of the pattern and on e / (size) only: scaling a pattern and its eccentricity together
leaves C unchanged, and no mm-to-inch conversion enters C (the reported bolt deformations Δ_i are
in inches, 0.34 in at the farthest bolt). The AISC tables for s = 3 in and s = 6 in are two views
of the same function.

Normalisation of C. With ``normalisation="ultimate"`` (default) C = P_u / R_ult, the definition of
the AISC tables as the Manual describes them (the published values themselves are not yet in the
tests: ``tests/reference/boltgroup`` checks C against an independent solution): the farthest bolt carries
R(0.34 in) = 0.9815 R_ult, so C tends to 0.9815 n as e → 0. A concentrically loaded group
(e = 0, to 1e-9 of the group's radius of gyration) gets C = n exactly: every bolt carries its full
strength, as the AISC rule R_n = n r_n for a concentric group. So C has a 1.85 % step at e = 0,
the one in AISC practice. With ``normalisation="delta-max"`` C = P_u / R(Δmax), which is continuous
and tends to n as e → 0 (about 1.9 % above the tables).

Solver
------
The unknown is the rigid-body motion of the part, written as a displacement field
d(p) = t + ω k × p in a frame in which the load acts along +y' on the line x' = e' (e' = signed
perpendicular distance of the load line from the centroid, in units of the group's radius of
gyration L = sqrt(Σr²/n)). Its ICR is the point where d = 0. The field is normalised so that it
stays finite for every eccentricity, including the concentric limit (pure translation) and the
pure moment (pure rotation):

* |e'| ≤ 1: unknowns (ω, t_x) with t_y = 1 − ω e' (unit displacement along the load line);
* |e'| > 1: unknowns (t_x, t_y) with ω = sign(e') (unit rotation).

Two residuals (force across the load and moment about the load line, both scaled to O(1)) are
driven to zero by a Levenberg–Marquardt-damped Newton iteration with an analytic Jacobian,
vectorised over all groups (converged groups drop out of the active set). The start is the
elastic centre of rotation, J/(n·e) = L²/e from the centroid on the far side of the load (exact
for e = 0: the concentric group needs no iteration). Each iteration tries the full step and the
step shortened by λ = 0.55 and keeps the better: when the ICR closes in on a bolt (a bolt at the
centroid under a large e) the residual behaves like |t|^0.55, on which a full Newton step
overshoots and the shortened one lands. Groups that stall are restarted from other starts.
The capacity is taken from the virtual-work identity P · d_load = Σ R_i |d_i|, in which an error
in the ICR's position is divided by the load's lever arm; so it stays exact at very large e,
where the ICR sits almost on a bolt and the force residual can only reach about 1e-6 (such a
solve is accepted once the capacity has stopped changing, to 1e-12). In tests on 60 000 random
patterns of 2 to 12 bolts, e from 1e-4 to 1e4 times L and any angle, every group converged, in
at most 18 iterations (3.5 on average).

Sign conventions: x right, y up, moments counter-clockwise positive. Bolt forces are reported as
the loads the bolts carry from the applied load (they sum to the applied load); the ICR and the
bolt forces are in the coordinates the pattern was given in.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike

from engine.boltgroup_common import as_batch, as_group, as_load_vector, eccentric_shear_loads, group_offsets
from engine.errors import BadInputError, JointAuditError

__all__ = [
    "DELTA_MAX_IN",
    "MU_PER_IN",
    "LAMBDA",
    "R_AT_DELTA_MAX",
    "NORMALISATIONS",
    "ICRConvergenceError",
    "ICRResult",
    "crawford_kulak",
    "icr_solve",
    "icr_solve_batch",
    "icr_coefficient",
    "icr_coefficients",
]

DELTA_MAX_IN = 0.34
"""Deformation of the bolt farthest from the ICR at the ultimate load, inches (Crawford & Kulak)."""
MU_PER_IN = 10.0
"""Crawford–Kulak regression coefficient μ, 1/in."""
LAMBDA = 0.55
"""Crawford–Kulak regression exponent λ."""
R_AT_DELTA_MAX = float((-np.expm1(-MU_PER_IN * DELTA_MAX_IN)) ** LAMBDA)
"""R(Δmax) / R_ult = (1 − e^(−3.4))^0.55 ≈ 0.98150."""

NORMALISATIONS = ("ultimate", "delta-max")

_CONCENTRIC_TOL = 1e-9  # |e| / L below which the load is treated as concentric
_TOL = 1e-12  # residual tolerance (scaled residuals are O(1))
_TOL_ACCEPT = 1e-8  # a stalled solve below this is accepted (see module notes)
_TOL_STALL = 1e-6  # ... and up to this if its capacity has stopped changing (ICR on a bolt)
_MAX_ITER = 100
_LAM_MAX = 1e12


class ICRConvergenceError(JointAuditError, ArithmeticError):
    """The ICR iteration did not find the instantaneous centre for some bolt group."""


def crawford_kulak(delta_in: ArrayLike):
    """Bolt force per unit ultimate strength, R/R_ult = (1 − e^(−10 Δ))^0.55, Δ in inches.

    Crawford & Kulak (1971); AISC Steel Construction Manual, Part 7 (Eq. 7-1 in the 13th to
    16th editions). Negative deformations are not defined and raise.
    """
    d = np.asarray(delta_in, dtype=float)
    if np.any(d < 0) or not np.all(np.isfinite(d)):
        raise BadInputError("bolt deformation Δ must be finite and ≥ 0 (inches)")
    r = (-np.expm1(-MU_PER_IN * d)) ** LAMBDA
    return float(r) if r.ndim == 0 else r


def _f(delta):
    return (-np.expm1(-MU_PER_IN * delta)) ** LAMBDA


def _fprime(delta):
    d = np.maximum(delta, 1e-12)
    return LAMBDA * (-np.expm1(-MU_PER_IN * d)) ** (LAMBDA - 1.0) * MU_PER_IN * np.exp(-MU_PER_IN * d)


@dataclass(frozen=True)
class ICRResult:
    """The ICR solution of one bolt group (scalars) or of a batch (arrays with a leading G axis).

    Forces and moments are per unit single-bolt strength (the one C is normalised by, see
    ``normalisation``): multiply by the bolt's strength in N to get N and N·mm.

    Attributes
    ----------
    C : float or ndarray (G,)
        Ultimate resultant force of the group / single-bolt strength, for a load on the given
        line of action. 0 for a pure moment.
    moment_mm : float or ndarray (G,)
        Ultimate moment of the load about the pattern's centroid / single-bolt strength, mm
        (counter-clockwise positive). For a pure moment this is the group's moment capacity.
    icr_mm : ndarray (2,) or (G, 2)
        The instantaneous centre, in the coordinates of the pattern, mm; NaN for a pure
        translation (concentric load).
    bolt_forces : ndarray (n, 2) or (G, n, 2)
        Load carried by each bolt at the ultimate load (components, same unit as C); they sum to
        C times the unit load direction. Zero on padding rows.
    deformation_in : ndarray (n,) or (G, n)
        Bolt deformations Δ_i, inches (Δmax = 0.34 at the farthest bolt).
    converged : bool or ndarray (G,)
    iterations : int or ndarray (G,)
    normalisation : str
        ``"ultimate"`` (C = P_u/R_ult, as the AISC tables define it) or ``"delta-max"`` (C = P_u/R(Δmax)).
    """

    C: np.ndarray
    moment_mm: np.ndarray
    icr_mm: np.ndarray
    bolt_forces: np.ndarray
    deformation_in: np.ndarray
    converged: np.ndarray
    iterations: np.ndarray
    normalisation: str

    @property
    def bolt_resultants(self) -> np.ndarray:
        """Magnitude of each bolt's force, same unit as C."""
        return np.hypot(self.bolt_forces[..., 0], self.bolt_forces[..., 1])

    def _one(self, g: int) -> "ICRResult":
        return ICRResult(
            C=float(self.C[g]),
            moment_mm=float(self.moment_mm[g]),
            icr_mm=self.icr_mm[g],
            bolt_forces=self.bolt_forces[g],
            deformation_in=self.deformation_in[g],
            converged=bool(self.converged[g]),
            iterations=int(self.iterations[g]),
            normalisation=self.normalisation,
        )


# --------------------------------------------------------------------------------------------
# The solver, in the load frame (load along +y' on x' = e), lengths in units of L.
# --------------------------------------------------------------------------------------------


class _Frame:
    """Bolt geometry of the groups being solved, in the normalised load frame."""

    def __init__(self, x, y, w, e):
        self.x, self.y, self.w, self.e = x, y, w, e
        self.n = w.sum(axis=1)
        ae = np.abs(e)
        finite = np.isfinite(e)
        self.small = ae <= 1.0  # regime A: unknowns (ω, t_x); else regime B: (t_x, t_y)
        self.sign = np.where(e >= 0, 1.0, -1.0)
        self.alpha = np.where(finite, 1.0 / (1.0 + np.where(finite, ae, 0.0)), 0.0)
        self.beta = np.where(finite, e / (1.0 + np.where(finite, ae, 0.0)), self.sign)

    def take(self, idx):
        f = _Frame.__new__(_Frame)
        for k in ("x", "y", "w", "e", "n", "small", "sign", "alpha", "beta"):
            setattr(f, k, getattr(self, k)[idx])
        return f

    def motion(self, u1, u2):
        """(t_x, t_y, ω) from the unknowns."""
        e_fin = np.where(self.small, self.e, 0.0)
        tx = np.where(self.small, u2, u1)
        ty = np.where(self.small, 1.0 - u1 * e_fin, u2)
        om = np.where(self.small, u1, self.sign)
        return tx, ty, om

    def start(self):
        """The elastic centre of rotation: O = (−1/e, 0) in units of L, exact for e = 0."""
        e_fin = np.where(self.small, self.e, 0.0)
        u1 = np.where(self.small, e_fin / (1.0 + e_fin**2), 0.0)
        inv = np.where(self.small, 0.0, 1.0 / np.where(self.small, 1.0, np.abs(self.e)))
        u2 = np.where(self.small, 0.0, inv)
        return u1, u2


def _evaluate(fr: _Frame, u1, u2, jacobian: bool = True):
    """Scaled residuals (G, 2), Jacobian (G, 2, 2) and the work Σ R_i s_i (G,) at the unknowns."""
    x, y, w = fr.x, fr.y, fr.w
    tx, ty, om = fr.motion(u1, u2)
    dx = tx[:, None] - om[:, None] * y
    dy = ty[:, None] + om[:, None] * x
    s = np.hypot(dx, dy) * w
    G = s.shape[0]
    rows = np.arange(G)
    k = np.argmax(s, axis=1)
    sm = s[rows, k]
    sm = np.where(sm > 0, sm, 1.0)
    delta = DELTA_MAX_IN * s / sm[:, None]
    R = _f(delta) * w
    pos = s > 0
    s_safe = np.where(pos, s, 1.0)
    ux = np.where(pos, dx / s_safe, 0.0)
    uy = np.where(pos, dy / s_safe, 0.0)
    Fx = -R * ux  # resisting force of each bolt on the part
    Fy = -R * uy
    a = fr.alpha[:, None]
    b = fr.beta[:, None]
    n = fr.n
    r = np.empty((G, 2))
    r[:, 0] = Fx.sum(axis=1) / n
    r[:, 1] = (a * (x * Fy - y * Fx) - b * Fy).sum(axis=1) / n
    work = (R * s).sum(axis=1)
    if not jacobian:
        return r, None, work
    # ∂d/∂u for each unknown: regime A u1 = ω (with t_y = 1 − ω e), u2 = t_x; regime B (t_x, t_y).
    small = fr.small[:, None]
    e_fin = np.where(fr.small, fr.e, 0.0)[:, None]
    g1x = np.where(small, -y, 1.0)
    g1y = np.where(small, x - e_fin, 0.0)
    g2x = np.where(small, 1.0, 0.0) + 0.0 * x
    g2y = np.where(small, 0.0, 1.0) + 0.0 * x
    fp = _fprime(delta) * w
    s_clip = np.maximum(s, 1e-9 * sm[:, None])
    uxk = ux[rows, k][:, None]
    uyk = uy[rows, k][:, None]
    J = np.empty((G, 2, 2))
    for col, (gx, gy) in enumerate(((g1x, g1y), (g2x, g2y))):
        ds = ux * gx + uy * gy
        dsm = uxk * gx[rows, k][:, None] + uyk * gy[rows, k][:, None]
        dD = DELTA_MAX_IN * (ds - s * dsm / sm[:, None]) / sm[:, None]
        dR = fp * dD
        dux = (gx - ux * ds) / s_clip * w
        duy = (gy - uy * ds) / s_clip * w
        dFx = -dR * ux - R * dux
        dFy = -dR * uy - R * duy
        J[:, 0, col] = dFx.sum(axis=1) / n
        J[:, 1, col] = (a * (x * dFy - y * dFx) - b * dFy).sum(axis=1) / n
    return r, J, work


def _capacity(fr: _Frame, u1, u2, work):
    """Capacity implied by the motion, by virtual work: P = Σ R s / d_load (M for a pure moment)."""
    _, ty, om = fr.motion(u1, u2)
    finite = np.isfinite(fr.e)
    e_fin = np.where(finite, fr.e, 0.0)
    d_load = np.where(fr.small, 1.0, np.where(finite, ty + om * e_fin, om))
    return work / d_load


def _lm(fr: _Frame, u1, u2):
    """Levenberg–Marquardt-damped Newton from (u1, u2).

    Returns u1, u2, the residual |r|∞, the iteration count and a flag for groups that stalled
    (no further descent) with the capacity stationary to 1e-12 and |r|∞ ≤ 1e-6: the case of an
    ICR that sits almost exactly on a bolt at very large e, where the virtual-work capacity is
    exact long before the force residual can reach the tolerance.
    """
    G = u1.shape[0]
    r, J, work = _evaluate(fr, u1, u2)
    cap = _capacity(fr, u1, u2, work)
    dcap = np.full(G, np.inf)
    res = np.max(np.abs(r), axis=1)
    lam = np.full(G, 1e-10)
    iters = np.zeros(G, dtype=int)
    active = np.flatnonzero(res > _TOL)
    for _ in range(_MAX_ITER):
        if active.size == 0:
            break
        Ja, ra = J[active], r[active]
        A = np.einsum("gki,gkj->gij", Ja, Ja)
        g = np.einsum("gki,gk->gi", Ja, ra)
        la = lam[active]
        a00 = A[:, 0, 0] * (1.0 + la) + 1e-300
        a11 = A[:, 1, 1] * (1.0 + la) + 1e-300
        a01 = A[:, 0, 1]
        det = a00 * a11 - a01 * a01
        det = np.where(det != 0, det, 1e-300)
        s1 = -(a11 * g[:, 0] - a01 * g[:, 1]) / det
        s2 = -(-a01 * g[:, 0] + a00 * g[:, 1]) / det
        # Two candidates: the full step, and the step shortened by λ = 0.55. Near a bolt that sits
        # on the ICR the residual behaves like |t|^0.55 and the full Newton step overshoots to
        # −0.82 t; the shortened step lands on the root there.
        na = active.size
        c1 = np.concatenate([u1[active] + s1, u1[active] + LAMBDA * s1])
        c2 = np.concatenate([u2[active] + s2, u2[active] + LAMBDA * s2])
        sub = fr.take(np.concatenate([active, active]))
        rc, Jc, wc = _evaluate(sub, c1, c2)
        capc = _capacity(sub, c1, c2, wc)
        nc = np.einsum("gk,gk->g", rc, rc)
        nc = np.where(np.isfinite(nc), nc, np.inf)
        pick = np.where(nc[na:] < nc[:na], na + np.arange(na), np.arange(na))
        n1, n2, rn, Jn, capn = c1[pick], c2[pick], rc[pick], Jc[pick], capc[pick]
        old = np.einsum("gk,gk->g", ra, ra)
        new = nc[pick]
        ok = np.isfinite(new) & (new < old)
        acc = active[ok]
        u1[acc], u2[acc] = n1[ok], n2[ok]
        r[acc], J[acc] = rn[ok], Jn[ok]
        dcap[acc] = np.abs(capn[ok] - cap[acc]) / np.maximum(np.abs(capn[ok]), 1e-300)
        cap[acc] = capn[ok]
        lam[acc] = np.maximum(lam[acc] * 0.1, 1e-14)
        rej = active[~ok]
        lam[rej] *= 10.0
        iters[active] += 1
        res[acc] = np.max(np.abs(rn[ok]), axis=1)
        stationary = (dcap[active] <= 1e-12) & (res[active] <= _TOL_STALL)
        active = active[(res[active] > _TOL) & (lam[active] < _LAM_MAX) & ~stationary]
    stalled_ok = (res > _TOL) & (dcap <= 1e-12) & (res <= _TOL_STALL)
    return u1, u2, res, iters, stalled_ok


def _solve_frame(fr: _Frame):
    """Solve every group of the frame; restarts the ones that stall. Returns u1, u2, ok, iterations."""
    u1, u2 = fr.start()
    u1, u2, res, iters, st = _lm(fr, u1.copy(), u2.copy())
    ok = (res <= _TOL_ACCEPT) | st
    bad = np.flatnonzero(~ok)
    for scale in (0.5, 2.0, 0.1, 10.0, -1.0):
        if bad.size == 0:
            break
        sub = fr.take(bad)
        a1, a2 = sub.start()
        # scale the start's distance of the ICR from the centroid (or move it sideways)
        if scale > 0:
            a1 = np.where(sub.small, a1 / scale, a1)
            a2 = np.where(sub.small, a2, a2 / scale)
        else:
            a1 = np.where(sub.small, a1, 0.5)
            a2 = np.where(sub.small, 0.5, a2)
        b1, b2, bres, bit, bst = _lm(sub, a1, a2)
        bok = (bres <= _TOL_ACCEPT) | bst
        better = bok | (bres < res[bad])
        idx = bad[better]
        u1[idx], u2[idx], res[idx], ok[idx] = b1[better], b2[better], bres[better], bok[better]
        iters[bad] += bit
        bad = np.flatnonzero(~ok)
    return u1, u2, ok, iters


# --------------------------------------------------------------------------------------------
# Public functions
# --------------------------------------------------------------------------------------------


def _check_normalisation(normalisation: str) -> float:
    if normalisation not in NORMALISATIONS:
        raise BadInputError(f"normalisation must be one of {NORMALISATIONS}, got {normalisation!r}")
    return 1.0 if normalisation == "ultimate" else R_AT_DELTA_MAX


def icr_solve_batch(
    xy_batch,
    Px_N: ArrayLike,
    Py_N: ArrayLike,
    Mz_Nmm: ArrayLike,
    *,
    mask: ArrayLike | None = None,
    normalisation: str = "ultimate",
) -> ICRResult:
    """ICR solution for many bolt groups at once.

    Parameters
    ----------
    xy_batch : array_like (G, n, 2), or a sequence of (n_i, 2) arrays
        Bolt centres, mm, any origin. Groups of different bolt counts: pad and pass ``mask``, or
        pass a list of arrays.
    Px_N, Py_N, Mz_Nmm : float or array_like (G,)
        The applied load reduced to the centroid of each pattern (x right, y up, N; moment
        counter-clockwise positive, N·mm). Only the line of action matters: the result is the
        capacity for a load on that line, per unit single-bolt strength. A pure moment
        (Px = Py = 0) gives C = 0 and the moment capacity in ``moment_mm``.
    mask : array_like of bool (G, n), optional
        ``True`` for real bolts when ``xy_batch`` is padded.
    normalisation : {"ultimate", "delta-max"}
        See the module notes: ``"ultimate"`` is the AISC tables' definition C = P_u / R_ult.

    Returns
    -------
    ICRResult
        Arrays with a leading axis of length G. Groups that did not converge have
        ``converged = False`` (this function does not raise for them).

    Notes
    -----
    Cost is O(G·n) per iteration, typically 3 to 8 iterations; see
    ``benchmarks/bench_boltgroup.py``. A single bolt, or bolts all at one point, carries no
    moment: C = n for a concentric load and 0 otherwise.
    """
    norm = _check_normalisation(normalisation)
    xy, m = as_batch(xy_batch, mask)
    G, nb = m.shape
    Px = as_load_vector(Px_N, G, "Px_N")
    Py = as_load_vector(Py_N, G, "Py_N")
    Mz = as_load_vector(Mz_Nmm, G, "Mz_Nmm")
    c, p, n, J = group_offsets(xy, m)
    P = np.hypot(Px, Py)
    if np.any((P == 0) & (Mz == 0)):
        raise BadInputError(
            f"bolt groups {np.flatnonzero((P == 0) & (Mz == 0)).tolist()} have no load: "
            "give Px, Py or Mz"
        )
    L = np.sqrt(J / n)  # radius of gyration of the pattern, mm
    # load frame: rotate so that the load direction u becomes +y'
    has_force = P > 0
    ux = np.where(has_force, Px / np.where(has_force, P, 1.0), 0.0)
    uy = np.where(has_force, Py / np.where(has_force, P, 1.0), 1.0)
    with np.errstate(divide="ignore", invalid="ignore"):
        e = np.where(has_force, Mz / np.where(has_force, P, 1.0), np.sign(Mz) * np.inf)
        e_n = np.where(L > 0, e / np.where(L > 0, L, 1.0), np.where(e == 0, 0.0, np.sign(e) * np.inf))
    qx = uy[:, None] * p[..., 0] - ux[:, None] * p[..., 1]
    qy = ux[:, None] * p[..., 0] + uy[:, None] * p[..., 1]
    Ls = np.where(L > 0, L, 1.0)[:, None]
    qx, qy = qx / Ls, qy / Ls

    C = np.zeros(G)
    M = np.zeros(G)
    icr = np.full((G, 2), np.nan)
    f_frame = np.zeros((G, nb, 2))
    deform = np.zeros((G, nb))
    conv = np.ones(G, dtype=bool)
    iters = np.zeros(G, dtype=int)

    degenerate = L <= 1e-12 * np.maximum(1.0, np.abs(c).max(axis=1))  # one bolt, or all at one point
    concentric = has_force & (np.abs(e_n) <= _CONCENTRIC_TOL)
    # concentric: C = n exactly (see module notes); each bolt at full strength along the load
    conc = concentric | (degenerate & has_force & (e == 0))
    C[conc] = n[conc]
    f_frame[conc, :, 1] = m[conc].astype(float)
    deform[conc] = DELTA_MAX_IN * m[conc]
    # degenerate groups with a moment: no capacity (C = 0, M = 0), nothing to solve
    solve = ~conc & ~degenerate
    idx = np.flatnonzero(solve)
    if idx.size:
        w = m[idx].astype(float)
        fr = _Frame(qx[idx], qy[idx], w, e_n[idx])
        u1, u2, ok, it = _solve_frame(fr)
        r, _, work = _evaluate(fr, u1, u2, jacobian=False)
        tx, ty, om = fr.motion(u1, u2)
        finite = np.isfinite(fr.e)
        e_fin = np.where(finite, fr.e, 0.0)
        # virtual work: P·d_load = Σ R s, with d_load = t_y + ω e along the load line
        d_load = ty + om * e_fin
        P_u = np.where(fr.small, work, np.where(finite, work / np.where(finite, d_load, 1.0), 0.0))
        with np.errstate(divide="ignore", invalid="ignore"):
            M_u = np.where(fr.small, work * e_fin, work / (om + np.where(finite, ty / np.where(finite, fr.e, 1.0), 0.0)))
        C[idx] = P_u / norm
        M[idx] = M_u * L[idx] / norm
        # bolt loads (the part pushes each bolt along its motion), deformations, ICR
        dx = tx[:, None] - om[:, None] * fr.y
        dy = ty[:, None] + om[:, None] * fr.x
        s = np.hypot(dx, dy) * w
        sm = s.max(axis=1)
        delta = DELTA_MAX_IN * s / sm[:, None]
        R = _f(delta) * w
        pos = s > 0
        s_safe = np.where(pos, s, 1.0)
        f_frame[idx, :, 0] = np.where(pos, R * dx / s_safe, 0.0) / norm
        f_frame[idx, :, 1] = np.where(pos, R * dy / s_safe, 0.0) / norm
        deform[idx] = delta
        with np.errstate(divide="ignore", invalid="ignore"):
            ox = np.where(om != 0, -ty / om, np.nan)
            oy = np.where(om != 0, tx / om, np.nan)
        icr_frame = np.stack([ox, oy], axis=1) * L[idx, None]
        # back to the pattern's frame: p = Rᵀ q, Rᵀ = [[u_y, u_x], [−u_x, u_y]]
        uxi, uyi = ux[idx], uy[idx]
        icr[idx, 0] = uyi * icr_frame[:, 0] + uxi * icr_frame[:, 1] + c[idx, 0]
        icr[idx, 1] = -uxi * icr_frame[:, 0] + uyi * icr_frame[:, 1] + c[idx, 1]
        conv[idx] = ok
        iters[idx] = it
    forces = np.empty_like(f_frame)
    forces[..., 0] = uy[:, None] * f_frame[..., 0] + ux[:, None] * f_frame[..., 1]
    forces[..., 1] = -ux[:, None] * f_frame[..., 0] + uy[:, None] * f_frame[..., 1]
    forces *= m[..., None]
    M = np.where(conc, 0.0, M)
    return ICRResult(
        C=C,
        moment_mm=M,
        icr_mm=icr,
        bolt_forces=forces,
        deformation_in=deform * m,
        converged=conv,
        iterations=iters,
        normalisation=normalisation,
    )


def icr_solve(
    xy_mm: ArrayLike, Px_N: float, Py_N: float, Mz_Nmm: float, *, normalisation: str = "ultimate"
) -> ICRResult:
    """ICR solution for one bolt group; see :func:`icr_solve_batch` (result fields are scalars)."""
    xy = as_group(xy_mm)
    res = icr_solve_batch(xy[None], Px_N, Py_N, Mz_Nmm, normalisation=normalisation)
    return res._one(0)


def icr_coefficients(
    xy_batch,
    ex_mm: ArrayLike,
    angle_deg: ArrayLike = 0.0,
    *,
    mask: ArrayLike | None = None,
    normalisation: str = "ultimate",
) -> np.ndarray:
    """Coefficients C for many bolt groups (or design candidates) at once.

    Parameters
    ----------
    xy_batch : array_like (G, n, 2), or a sequence of (n_i, 2) arrays
        Bolt centres, mm, any origin.
    ex_mm : float or array_like (G,)
        Eccentricity: the load's line of action crosses the horizontal line through the
        pattern's centroid at x = x_centroid + ex (mm).
    angle_deg : float or array_like (G,)
        Angle of the load from the vertical (y) axis, degrees, positive tilting the load's
        (downward) direction towards +x. For patterns symmetric about the horizontal axis,
        ±angle give the same C.
    mask : array_like of bool (G, n), optional
    normalisation : {"ultimate", "delta-max"}

    Returns
    -------
    ndarray (G,)
        C = group capacity / single-bolt capacity (AISC Manual Part 7 definition).

    Raises
    ------
    ICRConvergenceError
        If the instantaneous centre was not found for some group (not seen in testing).
    """
    xy, m = as_batch(xy_batch, mask)
    G = m.shape[0]
    ex = as_load_vector(ex_mm, G, "ex_mm")
    ang = as_load_vector(angle_deg, G, "angle_deg")
    Px, Py, Mz = eccentric_shear_loads(1.0, ex, ang)
    res = icr_solve_batch(xy, Px, Py, Mz, mask=m, normalisation=normalisation)
    if not np.all(res.converged):
        bad = np.flatnonzero(~res.converged).tolist()
        raise ICRConvergenceError(
            f"the instantaneous centre was not found for bolt groups {bad[:20]}"
            f"{' …' if len(bad) > 20 else ''}; check the patterns for coincident bolts"
        )
    return res.C


def icr_coefficient(
    xy_mm: ArrayLike, ex_mm: float, angle_deg: float = 0.0, *, normalisation: str = "ultimate"
) -> float:
    """Coefficient C = group capacity / single-bolt capacity by the ICR method, for one group.

    Parameters
    ----------
    xy_mm : array_like (n, 2)
        Bolt centres, mm, any origin.
    ex_mm : float
        Eccentricity of the load from the pattern's centroid, measured along x, mm.
    angle_deg : float
        Angle of the load from the vertical (y) axis, degrees.
    normalisation : {"ultimate", "delta-max"}
        ``"ultimate"``: C = P_u/R_ult, as the AISC Manual tables (C = n for e = 0).

    Examples
    --------
    Six bolts in one vertical line at 3 in. pitch: concentric load, and a load 6 in. from the line
    (C between the elastic coefficient and n):

    >>> import numpy as np
    >>> xy = np.column_stack([np.zeros(6), 76.2 * np.arange(6)])
    >>> 2.5 < icr_coefficient(xy, 6 * 25.4) < 6.0
    True
    >>> icr_coefficient(xy, 0.0)
    6.0
    """
    xy = as_group(xy_mm)
    return float(icr_coefficients(xy[None], ex_mm, angle_deg, normalisation=normalisation)[0])
