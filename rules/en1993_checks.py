"""EN 1993-1-8 / EN 1993-1-1 resistances and checks for bolted fin plates, one small pure function each.

Code factors (``F_v_Rd``, ``k1``, ``alpha_b``, ``F_b_Rd``, ``beta_Lf``, ``F_w_Rd``, ``V_eff_2_Rd``,
...) return floats in N, N/mm, N·mm or dimensionless; ``check_*`` functions return an
:class:`engine.model.Check`. Internal units: N, mm, MPa, N·mm. The simple-joint practice
(SCI P358 "Joints in Steel Construction: Simple Joints to Eurocode 3", SCI/BCSA 2011, as also set
out in "Steel Buildings in Europe, Multi-Storey Steel Buildings, Part 5: Joint Design", SCI/CTICM,
abbreviated MSB05 here) is named where it is used.

Clause numbers refer to EN 1993-1-8:2005 (+AC:2009) and EN 1993-1-1:2005 unless stated.

An aid to a competent engineer: results must be checked, and the governing local code (including
the National Annex) and licensed practice take precedence.
"""

from __future__ import annotations

import math

import numpy as np

from engine.model import Check

__all__ = [
    "strength_check",
    "minimum_check",
    "maximum_check",
    "incomplete_check",
    "F_v_Rd",
    "beta_Lf",
    "k1_factor",
    "alpha_d_factor",
    "F_b_Rd",
    "bearing_component_resistance",
    "F_w_Rd",
    "V_eff_2_Rd",
    "V_pl_Rd",
    "V_net_Rd",
    "M_el_Rd",
    "lambda_LT_plate",
    "f_p_LT",
    "rect_section_modulus_net",
    "section_elastic_modulus",
    "check_bolt_shear",
    "check_bearing_components",
    "check_tear_out",
    "check_plate_shear_yield",
    "check_plate_shear_rupture",
    "check_block_tearing",
    "check_bending",
    "check_plate_ltb",
    "check_weld_group",
    "check_weld_full_strength",
]

_TOL = 1e-9


# ----------------------------------------------------------------------------------------- Checks

def strength_check(name: str, clause: str, demand: float, capacity: float, unit: str, note: str = "") -> Check:
    """A resistance check: utilisation = demand / capacity, passes when ≤ 1."""
    demand = float(demand)
    capacity = float(capacity)
    if capacity <= 0.0:
        return Check(name, clause, demand, capacity, unit, math.inf, False, (note + "; " if note else "") + "no resistance")
    util = demand / capacity if math.isfinite(capacity) else 0.0
    return Check(name, clause, demand, capacity, unit, util, util <= 1.0 + _TOL, note)


def minimum_check(name: str, clause: str, required: float, provided: float, unit: str, note: str = "") -> Check:
    """A minimum limit: ``demand`` = required minimum, ``capacity`` = provided, utilisation = min/provided."""
    required = float(required)
    provided = float(provided)
    util = math.inf if provided <= 0.0 else required / provided
    return Check(name, clause, required, provided, unit, util, util <= 1.0 + _TOL, note)


def maximum_check(name: str, clause: str, provided: float, limit: float, unit: str, note: str = "") -> Check:
    """A maximum limit: ``demand`` = provided, ``capacity`` = limit, utilisation = provided/limit."""
    provided = float(provided)
    limit = float(limit)
    util = math.inf if limit <= 0.0 else provided / limit
    return Check(name, clause, provided, limit, unit, util, util <= 1.0 + _TOL, note)


def incomplete_check(name: str, clause: str, note: str, unit: str = "N") -> Check:
    """A check that could not be made (inputs missing or outside the validity range)."""
    return Check(name, clause, 0.0, 0.0, unit, 0.0, False, f"{note} ({clause})", incomplete=True)


# ----------------------------------------------------------------------------------- Code factors

def F_v_Rd(alpha_v: float, f_ub: float, A: float, gamma_M2: float, shear_planes: int = 1) -> float:
    """Shear resistance per bolt, EN 1993-1-8 Table 3.4: F_v,Rd = α_v f_ub A / γ_M2 per shear plane (N).

    ``alpha_v`` (-) 0.6 or 0.5 per class and thread position; ``f_ub`` (MPa); ``A`` (mm²) the
    tensile stress area A_s when the shear plane passes through the threads, else the gross area;
    ``shear_planes`` ≥ 1.
    """
    return float(alpha_v) * float(f_ub) * float(A) / float(gamma_M2) * int(shear_planes)


def beta_Lf(L_j: float, d: float) -> float:
    """Long-joint reduction, EN 1993-1-8 3.8(1) eq. (3.5): β_Lf = 1 − (L_j − 15 d)/(200 d),
    0.75 ≤ β_Lf ≤ 1.0; ``L_j`` (mm) distance between the centres of the end bolts in the direction
    of force transfer, ``d`` (mm) bolt diameter. β_Lf = 1 when L_j ≤ 15 d."""
    if L_j <= 15.0 * d:
        return 1.0
    return float(min(1.0, max(0.75, 1.0 - (L_j - 15.0 * d) / (200.0 * d))))


def k1_factor(e2: float, p2: float | None, d0: float) -> float:
    """k1 of EN 1993-1-8 Table 3.4 (perpendicular to the load): min(2.8 e2/d0 − 1.7, 1.4 p2/d0 − 1.7,
    2.5). ``e2`` (mm) edge distance perpendicular to the load (``inf`` for none, i.e. an inner bolt),
    ``p2`` (mm) spacing perpendicular to the load or ``None`` for a single row."""
    terms = [2.5]
    if math.isfinite(e2):
        terms.append(2.8 * e2 / d0 - 1.7)
    if p2 is not None:
        terms.append(1.4 * p2 / d0 - 1.7)
    return float(min(terms))


def alpha_d_factor(e1: float, p1: float | None, d0: float) -> float:
    """α_d of EN 1993-1-8 Table 3.4 (in the direction of the load): min(e1/(3 d0), p1/(3 d0) − 1/4)
    over end and inner bolts; ``e1`` (mm) end distance (``inf`` if none), ``p1`` (mm) spacing or
    ``None`` for a single bolt in that direction."""
    terms = [math.inf]
    if math.isfinite(e1):
        terms.append(e1 / (3.0 * d0))
    if p1 is not None:
        terms.append(p1 / (3.0 * d0) - 0.25)
    return float(min(terms))


def F_b_Rd(k1: float, alpha_b: float, f_u: float, d: float, t: float, gamma_M2: float) -> float:
    """Bearing resistance per bolt, EN 1993-1-8 Table 3.4: F_b,Rd = k1 α_b f_u d t / γ_M2 (N);
    ``f_u`` (MPa) of the plate, ``d`` bolt diameter and ``t`` plate thickness (mm)."""
    return max(0.0, float(k1)) * max(0.0, float(alpha_b)) * float(f_u) * float(d) * float(t) / float(gamma_M2)


def bearing_component_resistance(
    d: float, d0: float, t: float, f_u: float, f_ub: float,
    e_end: float, p_along: float | None, e_edge: float, p_across: float | None, gamma: float,
) -> tuple[float, float, float]:
    """Bearing resistance of the bolts of a group in one direction (SCI P358 / MSB05 3.2.1.2):
    EN 1993-1-8 Table 3.4 with α_b = min(α_d, f_ub/f_u, 1.0) and k1, each taken as the least over
    end/edge and inner bolts. Returns (F_b,Rd in N, k1, α_b). Distances in mm (``inf`` = no edge,
    ``None`` = single bolt in that direction)."""
    ab = min(alpha_d_factor(e_end, p_along, d0), f_ub / f_u, 1.0)
    k1 = k1_factor(e_edge, p_across, d0)
    return F_b_Rd(k1, ab, f_u, d, t, gamma), k1, ab


def F_w_Rd(f_u: float, beta_w: float, a: float, gamma_M2: float) -> float:
    """Fillet weld resistance per unit length, simplified method EN 1993-1-8 4.5.3.3:
    F_w,Rd = f_vw,d a, f_vw,d = (f_u/√3)/(β_w γ_M2) (N/mm); ``f_u`` (MPa) of the weaker part,
    ``a`` (mm) effective throat."""
    return float(f_u) / math.sqrt(3.0) / (float(beta_w) * float(gamma_M2)) * float(a)


def V_eff_2_Rd(f_u: float, f_y: float, A_nt: float, A_nv: float, gamma_M0: float, gamma_M2: float) -> float:
    """Block tearing, eccentric loading, EN 1993-1-8:2005 3.10.2(3) eq. (3.10):
    V_eff,2,Rd = 0.5 f_u A_nt/γ_M2 + (1/√3) f_y A_nv/γ_M0 (N); areas in mm², strengths in MPa."""
    return 0.5 * f_u * max(A_nt, 0.0) / gamma_M2 + f_y * max(A_nv, 0.0) / (math.sqrt(3.0) * gamma_M0)


def V_pl_Rd(A_v: float, f_y: float, gamma_M0: float) -> float:
    """Plastic shear resistance, EN 1993-1-1 6.2.6(2) eq. (6.18): A_v f_y/(√3 γ_M0) (N)."""
    return float(A_v) * float(f_y) / (math.sqrt(3.0) * float(gamma_M0))


def V_net_Rd(A_v_net: float, f_u: float, gamma_M2: float) -> float:
    """Net-section shear rupture (MSB05 3.2.2.2 / EN 1993-1-1 6.2.6 with 3.10): A_v,net f_u/(√3 γ_M2) (N)."""
    return max(float(A_v_net), 0.0) * float(f_u) / (math.sqrt(3.0) * float(gamma_M2))


def M_el_Rd(W_el: float, f_y: float, gamma_M0: float) -> float:
    """Elastic bending resistance, EN 1993-1-1 6.2.5(2) eq. (6.14) for Class 3: W_el f_y/γ_M0 (N·mm)."""
    return float(W_el) * float(f_y) / float(gamma_M0)


def lambda_LT_plate(z_p: float, h_p: float, t_p: float, constant: float = 2.8) -> float:
    """Slenderness of a fin plate for lateral-torsional buckling, MSB05 3.2.4 (SCI P358 Check 5):
    λ_LT = 2.8 (z_p h_p / (1.5 t_p²))^0.5; ``z_p`` (mm) support face to first bolt line."""
    return constant * math.sqrt(z_p * h_p / (1.5 * t_p**2))


def f_p_LT(lambda_LT: float, p_y: float, E: float = 205000.0, alpha_LT: float = 7.0, lambda_L0_factor: float = 0.4) -> float:
    """Lateral-torsional buckling strength (MPa) from BS 5950-1:2000 Annex B.2.1 (the expressions
    behind its Table 17, which MSB05 3.2.4 / SCI P358 use for fin plates):
    λ_L0 = 0.4 (π² E/p_y)^0.5, η_LT = α_LT (λ_LT − λ_L0)/1000 ≥ 0, M_E = π² E/λ_LT²,
    φ_LT = (p_y + (η_LT + 1) M_E)/2, p_b = M_E p_y/(φ_LT + (φ_LT² − M_E p_y)^0.5) ≤ p_y.  # from memory
    """
    if lambda_LT <= 0.0:
        return float(p_y)
    lam0 = lambda_L0_factor * math.sqrt(math.pi**2 * E / p_y)
    eta = max(0.0, alpha_LT * (lambda_LT - lam0) / 1000.0)
    M_E = math.pi**2 * E / lambda_LT**2
    phi = (p_y + (eta + 1.0) * M_E) / 2.0
    return float(min(p_y, M_E * p_y / (phi + math.sqrt(max(phi**2 - M_E * p_y, 0.0)))))


def rect_section_modulus_net(h: float, t: float, hole_y: np.ndarray, d0: float) -> float:
    """Elastic modulus (mm³) of a plate h × t bent in its plane, less holes of diameter d0 centred at
    ``hole_y`` (mm, measured from the plate's mid-depth); neutral axis kept at mid-depth."""
    I = t * h**3 / 12.0
    y = np.asarray(hole_y, dtype=float)
    I -= float(np.sum(t * d0**3 / 12.0 + t * d0 * y**2))
    return I / (h / 2.0)


def section_elastic_modulus(rects: list[tuple[float, float, float]]) -> tuple[float, float]:
    """(A mm², W_el,min mm³) of a section made of rectangles ``(width, y_bottom, y_top)``."""
    A = sum(b * (yt - yb) for b, yb, yt in rects)
    if A <= 0.0:
        return 0.0, 0.0
    yc = sum(b * (yt - yb) * (yt + yb) / 2.0 for b, yb, yt in rects) / A
    I = sum(b * (yt - yb) ** 3 / 12.0 + b * (yt - yb) * ((yt + yb) / 2.0 - yc) ** 2 for b, yb, yt in rects)
    ytop = max(yt for _, _, yt in rects)
    ybot = min(yb for _, yb, _ in rects)
    return A, I / max(ytop - yc, yc - ybot)


# --------------------------------------------------------------------------------- Bolt checks

def check_bolt_shear(name: str, forces: np.ndarray, Fv_Rd: float, beta_lf: float, note: str = "") -> Check:
    """Bolt shear, EN 1993-1-8 Table 3.4 and 3.8: max_i |F_i| ≤ β_Lf F_v,Rd.

    ``forces`` (n, 2) bolt forces (N) from the elastic bolt-group analysis (SCI P358 Check 2 uses
    the elastic method: V_Rd = n F_v,Rd / √((1 + α n)² + (β n)²)); ``Fv_Rd`` (N) per bolt.
    """
    mag = np.hypot(forces[:, 0], forces[:, 1])
    i = int(np.argmax(mag))
    cap = beta_lf * Fv_Rd
    extra = f"bolt {i + 1} of {len(mag)}; F_v,Rd = {Fv_Rd / 1e3:.1f} kN, β_Lf = {beta_lf:.3f}"
    return strength_check(name, "EN 1993-1-8 Table 3.4, 3.8", float(mag[i]), cap, "N", "; ".join(p for p in (extra, note) if p))


def check_bearing_components(name: str, clause: str, forces: np.ndarray, Fb_ver: float, Fb_hor: float, note: str = "") -> Check:
    """Bearing of an eccentrically loaded group checked by components (EN 1993-1-8 Table 3.4 note 3;
    SCI P358 Check 2 / MSB05 3.2.1.2): per bolt (F_y/F_b,ver,Rd)² + (F_x/F_b,hor,Rd)² ≤ 1.

    ``forces`` (n, 2) in N, resistances in N. ``demand`` is the resultant on the governing bolt and
    ``capacity`` its resistance along that resultant, so utilisation = the interaction's square root.
    """
    if Fb_ver <= 0.0 or Fb_hor <= 0.0:
        return strength_check(name, clause, float(np.max(np.hypot(forces[:, 0], forces[:, 1]))), 0.0, "N", note)
    u = np.sqrt((forces[:, 1] / Fb_ver) ** 2 + (forces[:, 0] / Fb_hor) ** 2)
    i = int(np.argmax(u))
    mag = float(np.hypot(*forces[i]))
    cap = mag / float(u[i]) if u[i] > 0.0 else min(Fb_ver, Fb_hor)
    extra = f"bolt {i + 1}; F_b,ver,Rd = {Fb_ver / 1e3:.1f} kN, F_b,hor,Rd = {Fb_hor / 1e3:.1f} kN"
    return strength_check(name, clause, mag, cap, "N", "; ".join(p for p in (extra, note) if p))


def _spacing_along(xy: np.ndarray, u: np.ndarray, d0: float) -> np.ndarray:
    """For each bolt, distance (mm) along its unit direction ``u`` to the next bolt whose centre lies
    within d0 of that ray (the hole the tear-out path runs into), ``inf`` if none."""
    rel = xy[None, :, :] - xy[:, None, :]                    # (i, j, 2): from bolt i to bolt j
    along = np.einsum("ijk,ik->ij", rel, u)
    perp = np.abs(rel[..., 0] * u[:, None, 1] - rel[..., 1] * u[:, None, 0])
    ok = (along > _TOL) & (perp < d0)
    return np.where(ok, along, np.inf).min(axis=1)


def check_tear_out(
    name: str, clause: str, xy: np.ndarray, forces: np.ndarray, rect: tuple[float, float, float, float],
    d: float, d0: float, t: float, f_u: float, f_ub: float, k1_ver: float, k1_hor: float, gamma_M2: float,
) -> Check:
    """Tear-out of each bolt along the direction of its force (EN 1993-1-8 Table 3.4 α_d with e1 and
    p1 measured along the force, the resultant-direction reading of note 3; common practice for
    inclined bolt forces):

    F_b,Rd,i = k1 α_b,i f_u d t/γ_M2, α_b,i = min(e_F,i/(3 d0), p_F,i/(3 d0) − 1/4, f_ub/f_u, 1),
    e_F,i = distance along F_i to the edge of ``rect`` (``rules.geometry.edge_distance_along``),
    p_F,i = distance along F_i to the next hole in the path. ``forces`` are the forces the bolts
    push this part with (N); k1 (perpendicular to the force) is that of the principal direction
    nearer the bolt's force: ``k1_ver`` for |F_y| ≥ |F_x| (vertical load, horizontal edges and
    spacing), else ``k1_hor``.
    """
    from rules.geometry import edge_distance_along

    mag = np.hypot(forces[:, 0], forces[:, 1])
    if not np.any(mag > 0.0):
        return strength_check(name, clause, 0.0, F_b_Rd(min(k1_ver, k1_hor), min(f_ub / f_u, 1.0), f_u, d, t, gamma_M2),
                              "N", "no bolt force")
    k1 = np.where(np.abs(forces[:, 1]) >= np.abs(forces[:, 0]), k1_ver, k1_hor)
    u = np.divide(forces, np.where(mag > 0.0, mag, 1.0)[:, None])
    e = edge_distance_along(xy, forces, rect)
    p = _spacing_along(xy, u, d0)
    ad = np.minimum(e / (3.0 * d0), np.where(np.isfinite(p), p / (3.0 * d0) - 0.25, np.inf))
    ab = np.minimum(np.minimum(ad, f_ub / f_u), 1.0)
    Fb = np.maximum(k1, 0.0) * np.maximum(ab, 0.0) * f_u * d * t / gamma_M2
    with np.errstate(divide="ignore", invalid="ignore"):
        util = np.where(mag > 0.0, mag / np.where(Fb > 0.0, Fb, 1e-300), 0.0)
    i = int(np.argmax(util))
    note = f"bolt {i + 1}; end distance along the force {e[i]:.1f} mm, α_b = {ab[i]:.3f}, k1 = {k1[i]:.2f}"
    return strength_check(name, clause, float(mag[i]), float(Fb[i]), "N", note)


# -------------------------------------------------------------------------------- Plate checks

def check_plate_shear_yield(V: float, h_p: float, t_p: float, f_y: float, gamma_M0: float, reduction: float = 1.27) -> Check:
    """Fin plate gross-section shear, EN 1993-1-1 6.2.6 with the SCI P358 / MSB05 3.2.2.1 factor 1.27
    for the coexisting nominal bending: V_Rd,g = h_p t_p f_y/(1.27 √3 γ_M0) (N). mm, MPa."""
    cap = h_p * t_p * f_y / (reduction * math.sqrt(3.0) * gamma_M0)
    return strength_check("plate shear yield", "EN 1993-1-1 6.2.6; SCI P358 Check 3 (factor 1.27)", V, cap, "N",
                          f"A_v = {h_p * t_p:.0f} mm², f_y = {f_y:g} MPa")


def check_plate_shear_rupture(V: float, h_p: float, t_p: float, n_rows: int, d0: float, f_u: float, gamma_M2: float) -> Check:
    """Fin plate net-section shear, MSB05 3.2.2.2 / SCI P358 Check 3: A_v,net = t_p (h_p − n1 d0),
    V_Rd,n = A_v,net f_u/(√3 γ_M2) (N). mm, MPa."""
    A = t_p * (h_p - n_rows * d0)
    return strength_check("plate shear rupture", "EN 1993-1-1 6.2.6, EN 1993-1-8 3.10; SCI P358 Check 3", V,
                          V_net_Rd(A, f_u, gamma_M2), "N", f"A_v,net = {A:.0f} mm²")


def check_block_tearing(name: str, clause: str, V: float, A_nt: float, A_nv: float, f_u: float, f_y: float,
                        gamma_M0: float, gamma_M2: float) -> Check:
    """Block tearing, EN 1993-1-8:2005 3.10.2(3) (eccentric): V_eff,2,Rd with the areas (mm²) given."""
    if A_nv <= 0.0:
        return incomplete_check(name, clause, "block-tearing shear area is not positive: geometry outside the clause's range")
    return strength_check(name, clause, V, V_eff_2_Rd(f_u, f_y, A_nt, A_nv, gamma_M0, gamma_M2), "N",
                          f"A_nt = {A_nt:.0f} mm², A_nv = {A_nv:.0f} mm²")


def check_bending(name: str, clause: str, sections: list[tuple[str, float, float]], f_y: float, gamma_M0: float) -> Check:
    """Elastic bending of plate sections, EN 1993-1-1 6.2.5 (Class 3, W_el): each section is
    ``(label, M_Ed N·mm, W_el mm³)``; the governing one is reported."""
    best: Check | None = None
    for label, M, W in sections:
        c = strength_check(name, clause, abs(M), M_el_Rd(W, f_y, gamma_M0), "N·mm", f"section {label}, W_el = {W:.0f} mm³")
        if best is None or c.utilisation > best.utilisation:
            best = c
    assert best is not None
    return best


def check_plate_ltb(name: str, M: float, z: float, z_p: float, h_p: float, t_p: float, f_y: float,
                    gamma_M0: float, gamma_M1: float, ltb: dict[str, float], strength_factor: float = 0.6) -> Check:
    """Lateral-torsional buckling of a long fin plate (z > t_p/0.15), MSB05 3.2.4 / SCI P358 Check 5:
    M_Ed ≤ min(W_el f_p,LT/(0.6 γ_M1), W_el f_y/γ_M0), W_el = t_p h_p²/6, f_p,LT from λ_LT (see
    :func:`f_p_LT`). ``M`` (N·mm) the plate moment for the hinge in use, ``z`` its lever arm (mm)."""
    W = t_p * h_p**2 / 6.0
    lam = lambda_LT_plate(z_p, h_p, t_p, ltb.get("lambda_LT_constant", 2.8))
    fp = f_p_LT(lam, f_y, ltb.get("E", 205000.0), ltb.get("alpha_LT", 7.0), ltb.get("lambda_L0_factor", 0.4))
    cap = min(W * fp / (strength_factor * gamma_M1), W * f_y / gamma_M0)
    return strength_check(name, "SCI P358 Check 5; MSB05 3.2.4 (f_p,LT per BS 5950-1 Table 17)", abs(M), cap,
                          "N·mm", f"long fin plate: z = {z:.0f} mm > t_p/0.15 = {t_p / 0.15:.0f} mm; λ_LT = {lam:.1f}, f_p,LT = {fp:.0f} MPa")


# --------------------------------------------------------------------------------- Weld checks

def check_weld_group(name: str, V: float, M: float, N: float, l_eff: float, n_welds: int, Fw_Rd: float, note: str = "") -> Check:
    """Fillet welds along the plate's depth, simplified method EN 1993-1-8 4.5.3.3: the resultant per
    unit length of weld, √(f_v² + (f_m + f_n)²) with f_v = V/(n l), f_m = 6 M/(n l²), f_n = N/(n l),
    must not exceed F_w,Rd (N/mm). V, N in N, M in N·mm, l_eff in mm. Reported as end shear:
    ``demand`` = V, ``capacity`` = V / utilisation (the end shear the welds carry at this eccentricity)."""
    if l_eff <= 0.0 or Fw_Rd <= 0.0:
        return incomplete_check(name, "EN 1993-1-8 4.5.3.3", "effective weld length or throat not positive")

    def util(v: float, m: float, n: float) -> float:
        fv = v / (n_welds * l_eff)
        fm = 6.0 * m / (n_welds * l_eff**2)
        fn = n / (n_welds * l_eff)
        return math.hypot(fv, fm + fn) / Fw_Rd

    u = util(V, M, N)
    if V > 0.0 and u > 0.0:
        cap = V / u
    else:
        u1 = util(1.0, (M / V) if V else 0.0, 0.0)
        cap = 1.0 / u1
    fv = V / (n_welds * l_eff)
    fm = 6.0 * M / (n_welds * l_eff**2)
    extra = f"{n_welds} welds × l_eff {l_eff:.0f} mm; f_v = {fv:.0f}, f_m = {fm:.0f} N/mm; F_w,Rd = {Fw_Rd:.0f} N/mm"
    c = strength_check(name, "EN 1993-1-8 4.5.3.3", V, cap, "N", "; ".join(p for p in (extra, note) if p))
    return Check(c.name, c.clause, c.demand, c.capacity, c.unit, u, u <= 1.0 + _TOL, c.note)


def check_weld_full_strength(a: float, t_p: float, ratio: float, grade: str, both_sides: bool) -> Check:
    """Full-strength fillet welds (SCI P358 Check 8 / MSB05 2.2.6): throat a ≥ ratio × t_p on both
    sides of the plate (published ratios 0.46 S235, 0.48 S275, 0.55 S355, 0.74 S460; ``ratio`` from
    :func:`rules.en1993_data.full_strength_ratio`). mm."""
    req = ratio * t_p
    note = f"{grade}: a ≥ {ratio:.3f} t_p"
    if not both_sides:
        return Check("weld stronger than plate", "SCI P358 Check 8; MSB05 2.2.6", req, a, "mm", math.inf, False,
                     note + "; single-sided weld cannot be full strength")
    return minimum_check("weld stronger than plate", "SCI P358 Check 8; MSB05 2.2.6", req, a, "mm", note)
