"""The checks of the aisc360 rule set: one small pure function per limit state.

Edition followed: **ANSI/AISC 360-16** *Specification for Structural Steel Buildings* (LRFD), with
the **AISC Steel Construction Manual, 15th edition** (2017) Parts 7 (ICR method), 9 (coped beams) and
10 (single-plate shear connections). Every function takes internal units (N, mm, MPa, N·mm), gives
the clause and formula in its docstring and returns an :class:`engine.model.Check`; a check whose
inputs are missing or outside its validity range returns an *incomplete* Check naming the clause,
never an exception.

An aid to a competent engineer: results must be checked, and the governing local code and licensed
practice take precedence.
"""

from __future__ import annotations

import math

import numpy as np

from engine.model import Check
from rules.check_builders import TOL as _TOL, incomplete_check, make_check, make_max_check, make_min_check
from rules.geometry import edge_distance_along

__all__ = [
    "make_check",
    "make_min_check",
    "make_max_check",
    "incomplete_check",
    "phi_rn_shear",
    "phi_rn_bearing",
    "phi_rn_tearout",
    "clear_distance_along",
    "bolt_shear_group",
    "bearing_group",
    "shear_yield",
    "shear_rupture",
    "block_shear",
    "tension_yield",
    "tension_rupture",
    "Z_rect",
    "Z_net_rect",
    "plate_bending",
    "plate_ltb_F11",
    "shear_flexure_interaction",
    "web_shear_G2",
    "coped_Snet",
    "coped_Fcr",
    "coped_section_bending",
    "line_weld_peak",
    "weld_strength",
    "weld_stronger_than_plate",
    "weld_min_size",
    "support_local_shear",
    "moment_only_coefficient",
    "tmax_extended",
]



# ---------------------------------------------------------------------------------------------
# Check constructors
# ---------------------------------------------------------------------------------------------


# ---------------------------------------------------------------------------------------------
# Bolts: J3.6 shear, J3.10 bearing and tear-out, Manual Part 7 ICR group strength
# ---------------------------------------------------------------------------------------------


def phi_rn_shear(Fnv: float, Ab: float, shear_planes: int = 1, phi: float = 0.75, k_long: float = 1.0) -> float:
    """Design shear strength of one bolt (N), AISC 360-16 J3.6, Eq. J3-1: φRn = φ Fnv Ab per plane.

    ``Fnv`` MPa (Table J3.2), ``Ab`` nominal unthreaded body area mm², ``k_long`` = 0.833 for
    end-loaded joints longer than 38 in. (Table J3.2 footnote [b]), else 1.0.
    """
    return phi * Fnv * k_long * Ab * shear_planes


def phi_rn_bearing(d: float, t: float, Fu: float, phi: float = 0.75) -> float:
    """Design bearing strength at one bolt hole (N), AISC 360-16 J3.10(a)(1), Eq. J3-6a
    (deformation at service load a design consideration): φ 2.4 d t Fu. ``d`` bolt diameter mm,
    ``t`` ply thickness mm, ``Fu`` MPa."""
    return phi * 2.4 * d * t * Fu


def phi_rn_tearout(lc: np.ndarray | float, t: float, Fu: float, phi: float = 0.75) -> np.ndarray:
    """Design tear-out strength at bolt holes (N), AISC 360-16 J3.10(b)(1), Eq. J3-6c:
    φ 1.2 lc t Fu, ``lc`` clear distance (mm) in the direction of the force from the edge of the hole
    to the edge of the adjacent hole or of the material."""
    return phi * 1.2 * np.maximum(np.asarray(lc, dtype=float), 0.0) * t * Fu


def clear_distance_along(
    xy: np.ndarray,
    directions: np.ndarray,
    rect: tuple[float, float, float, float],
    hole_width: float,
    hole_length: float,
) -> np.ndarray:
    """Clear distance lc (mm) of AISC 360-16 J3.10 for each bolt, along its force direction.

    ``xy`` (n, 2) bolt centres, ``directions`` (n, 2) force directions on the ply, ``rect`` the ply
    as (x_min, x_max, y_min, y_max) (rules.geometry), hole ``hole_width`` vertical and
    ``hole_length`` horizontal (mm). lc is the lesser of the distance to the ply edge less half the
    hole and, for a hole lying in the path (centre within one hole size of the ray), the centre
    distance less one hole size. The hole size along a direction u is taken as
    sqrt((L·ux)² + (w·uy)²) (exact for the axes, an approximation between them).
    """
    xy = np.asarray(xy, dtype=float)
    d = np.asarray(directions, dtype=float)
    norm = np.hypot(d[:, 0], d[:, 1])
    u = np.where(norm[:, None] > 0, d / np.where(norm > 0, norm, 1.0)[:, None], np.array([0.0, -1.0]))
    size = np.hypot(hole_length * u[:, 0], hole_width * u[:, 1])
    edge = edge_distance_along(xy, u, rect) - size / 2.0
    rel = xy[None, :, :] - xy[:, None, :]  # rel[i, j] = xy[j] - xy[i]
    t = np.einsum("ijk,ik->ij", rel, u)
    perp = np.abs(rel[:, :, 0] * u[:, None, 1] - rel[:, :, 1] * u[:, None, 0])
    blocked = (t > _TOL) & (perp < size[:, None] - _TOL)
    between = np.where(blocked, t - size[:, None], np.inf)
    return np.minimum(edge, between.min(axis=1))


def bolt_shear_group(name: str, R: float, C: float, phi_rn: float, note: str = "") -> Check:
    """Bolt group shear, AISC 360-16 J3.6 with the instantaneous-centre-of-rotation method of the
    AISC Manual Part 7 (Table 7-6): φRn = C·φrn ≥ R.

    ``R`` resultant load on the group (N), ``C`` the ICR coefficient (effective number of bolts) for
    the eccentricity and load angle, ``phi_rn`` the design shear strength of one bolt (N).
    """
    clause = "AISC 360-16 J3.6, Table J3.2; Manual Part 7 ICR method (Table 7-6)"
    if not (C > 0 and phi_rn > 0):
        return incomplete_check(name, clause, "bolt group coefficient C or bolt strength not positive", "N")
    return make_check(name, clause, R, C * phi_rn, "N", note)


def bearing_group(name: str, clause: str, R: float, C: float, phi_rn_each: np.ndarray, note: str = "") -> Check:
    """Group strength from per-bolt strengths with the ICR method (AISC Manual Part 7):
    φRn = (C / n)·Σ φrn,i ≥ R, i.e. each bolt contributes its own strength at the efficiency C/n of the
    eccentric group (reduces to Σ φrn,i, J3.10, for a concentric load and to C·φrn for equal bolts).

    ``R`` N, ``C`` ICR coefficient, ``phi_rn_each`` (n,) design strength of each bolt (N).
    """
    r = np.asarray(phi_rn_each, dtype=float)
    if r.size == 0 or not C > 0:
        return incomplete_check(name, clause, "no bolts or group coefficient C not positive", "N")
    cap = C / r.size * float(r.sum())
    i = int(np.argmin(r))
    extra = f"least bolt φrn = {r[i] / 1000:.1f} kN (bolt {i + 1})"
    return make_check(name, clause, R, cap, "N", f"{note}; {extra}" if note else extra)


# ---------------------------------------------------------------------------------------------
# Connecting elements: J4.1 tension, J4.2 shear, J4.3 block shear
# ---------------------------------------------------------------------------------------------


def shear_yield(name: str, V: float, Agv: float, Fy: float, phi: float = 1.00) -> Check:
    """Shear yielding of a connecting element, AISC 360-16 J4.2(a), Eq. J4-3: φRn = φ 0.60 Fy Agv,
    φ = 1.00. ``V`` N, ``Agv`` gross shear area mm², ``Fy`` MPa."""
    clause = "AISC 360-16 J4.2(a), Eq. J4-3"
    if not (Agv > 0 and Fy > 0):
        return incomplete_check(name, clause, "gross shear area or Fy not positive", "N")
    return make_check(name, clause, V, phi * 0.60 * Fy * Agv, "N", f"Agv = {Agv:.0f} mm²")


def shear_rupture(name: str, V: float, Anv: float, Fu: float, phi: float = 0.75) -> Check:
    """Shear rupture of a connecting element, AISC 360-16 J4.2(b), Eq. J4-4: φRn = φ 0.60 Fu Anv,
    φ = 0.75. ``V`` N, ``Anv`` net shear area mm² (holes 1/16 in. larger, B4.3b), ``Fu`` MPa."""
    clause = "AISC 360-16 J4.2(b), Eq. J4-4"
    if not (Anv > 0 and Fu > 0):
        return incomplete_check(name, clause, "net shear area not positive: holes take the whole section", "N")
    return make_check(name, clause, V, phi * 0.60 * Fu * Anv, "N", f"Anv = {Anv:.0f} mm²")


def block_shear(
    name: str, V: float, Agv: float, Anv: float, Ant: float, Fy: float, Fu: float, Ubs: float, phi: float = 0.75
) -> Check:
    """Block shear rupture, AISC 360-16 J4.3, Eq. J4-5:
    Rn = 0.60 Fu Anv + Ubs Fu Ant ≤ 0.60 Fy Agv + Ubs Fu Ant, φ = 0.75.

    Areas mm² (net areas with holes 1/16 in. larger, B4.3b), ``Fy``/``Fu`` MPa, ``Ubs`` = 1.0 for a
    uniform tension stress (one line of bolts), 0.5 otherwise (Commentary Fig. C-J4.2).
    """
    clause = "AISC 360-16 J4.3, Eq. J4-5"
    if not (Agv > 0 and Anv > 0 and Ant >= 0):
        return incomplete_check(name, clause, "block shear areas not positive (edge distances too small)", "N")
    rupture = 0.60 * Fu * Anv + Ubs * Fu * Ant
    yielding = 0.60 * Fy * Agv + Ubs * Fu * Ant
    return make_check(
        name, clause, V, phi * min(rupture, yielding), "N",
        f"Agv = {Agv:.0f}, Anv = {Anv:.0f}, Ant = {Ant:.0f} mm², Ubs = {Ubs:g}; "
        + ("shear yielding path governs" if yielding < rupture else "shear rupture path governs"),
    )


def tension_yield(name: str, N: float, Ag: float, Fy: float, phi: float = 0.90) -> Check:
    """Tensile yielding of a connecting element, AISC 360-16 J4.1(a), Eq. J4-1: φ Fy Ag, φ = 0.90."""
    clause = "AISC 360-16 J4.1(a), Eq. J4-1"
    if not Ag > 0:
        return incomplete_check(name, clause, "gross area not positive", "N")
    return make_check(name, clause, N, phi * Fy * Ag, "N")


def tension_rupture(name: str, N: float, Ae: float, Fu: float, phi: float = 0.75) -> Check:
    """Tensile rupture of a connecting element, AISC 360-16 J4.1(b), Eq. J4-2: φ Fu Ae, φ = 0.75,
    Ae = An ≤ 0.85 Ag for bolted splice plates."""
    clause = "AISC 360-16 J4.1(b), Eq. J4-2"
    if not Ae > 0:
        return incomplete_check(name, clause, "net area not positive", "N")
    return make_check(name, clause, N, phi * Fu * Ae, "N")


# ---------------------------------------------------------------------------------------------
# Plate flexure: F11 rectangular bars, Manual Part 9/10
# ---------------------------------------------------------------------------------------------


def Z_rect(t: float, d: float) -> float:
    """Plastic section modulus of a t × d rectangle about its strong axis (mm³): t d² / 4."""
    return t * d * d / 4.0


def Z_net_rect(t: float, d: float, hole_y_from_centre: np.ndarray, hole: float) -> float:
    """Net plastic modulus (mm³) of a t × d plate with holes of size ``hole`` (mm, vertical,
    including the 1/16 in. allowance) centred at ``hole_y_from_centre`` (mm) in one vertical line:
    Z = t d²/4 − Σ t·hole·|yi| (holes whose centre is on the neutral axis remove nothing)."""
    y = np.abs(np.asarray(hole_y_from_centre, dtype=float))
    return Z_rect(t, d) - float(np.sum(t * hole * y))


def plate_bending(
    name: str, M: float, Z: float, Fy: float, Znet: float | None = None, Fu: float | None = None,
    phi_y: float = 0.90, phi_r: float = 0.75, where: str = "",
) -> Check:
    """Plate flexure at a section, AISC 360-16 F11.1 (yielding, Mn = Mp = Fy Z ≤ 1.6 My, φ = 0.90)
    and, where the section passes through bolt holes, flexural rupture per the Manual Part 9
    (Mn = Fu Znet, φ = 0.75). ``M`` N·mm, ``Z``/``Znet`` mm³, ``Fy``/``Fu`` MPa."""
    clause = "AISC 360-16 F11.1; Manual Part 9 (flexural rupture Mn = Fu Znet)"
    if not (Z > 0 and Fy > 0):
        return incomplete_check(name, clause, "plate section modulus or Fy not positive", "N·mm")
    cap = phi_y * Fy * Z
    note = f"{where}: φMn(yield) = {cap / 1e6:.2f} kN·m".lstrip(": ")
    if Znet is not None and Fu is not None:
        if Znet <= 0:
            return incomplete_check(name, clause, "net section modulus not positive", "N·mm")
        cap_r = phi_r * Fu * Znet
        note += f", φMn(rupture) = {cap_r / 1e6:.2f} kN·m"
        cap = min(cap, cap_r)
    return make_check(name, clause, M, cap, "N·mm", note)


def plate_ltb_F11(name: str, M: float, Lb: float, d: float, t: float, Fy: float, E: float, Cb: float = 1.0,
                  phi: float = 0.90) -> Check:
    """Lateral-torsional buckling of a rectangular bar bent about its major axis, AISC 360-16 F11.2:

    * Lb d / t² ≤ 0.08 E / Fy: no LTB (Mn = Mp = Fy Z ≤ 1.6 My), Eq. F11-1;
    * 0.08 E / Fy < Lb d / t² ≤ 1.9 E / Fy: Mn = Cb [1.52 − 0.274 (Lb d / t²) Fy / E] My ≤ Mp, Eq. F11-2;
    * Lb d / t² > 1.9 E / Fy: Mn = Fcr Sx ≤ Mp, Fcr = 1.9 E Cb / (Lb d / t²), Eqs. F11-3, F11-4.

    ``M`` N·mm, ``Lb`` unbraced length mm (the plate length from the support to the bolt line),
    ``d`` plate depth mm, ``t`` thickness mm, ``Fy``/``E`` MPa, ``Cb`` = 1.0 taken (conservative).
    """
    clause = "AISC 360-16 F11.2, Eqs. F11-1 to F11-4"
    if not (Lb >= 0 and d > 0 and t > 0 and Fy > 0):
        return incomplete_check(name, clause, "plate dimensions or Fy not positive", "N·mm")
    S = t * d * d / 6.0
    My = Fy * S
    Mp = min(Fy * Z_rect(t, d), 1.6 * My)
    r = Lb * d / (t * t)
    if r <= 0.08 * E / Fy:
        Mn, regime = Mp, "no LTB (F11-1)"
    elif r <= 1.9 * E / Fy:
        Mn, regime = min(Cb * (1.52 - 0.274 * r * Fy / E) * My, Mp), "inelastic LTB (F11-2)"
    else:
        Mn, regime = min(1.9 * E * Cb / r * S, Mp), "elastic LTB (F11-3)"
    return make_check(name, clause, M, phi * Mn, "N·mm", f"Lb·d/t² = {r:.1f}, {regime}, Cb = {Cb:g}")


def shear_flexure_interaction(name: str, V: float, M: float, Vc: float, Mc: float) -> Check:
    """Shear-flexure interaction of a single plate, AISC Manual 15th ed. Part 10, Eq. 10-5:
    (Vr / Vc)² + (Mr / Mc)² ≤ 1.0 with Vc = φ 0.60 Fy Ag (φ = 1.00) and Mc = φ Fy Z (φ = 0.90).
    ``V`` N, ``M`` N·mm; the demand is the interaction sum (unit "-")."""
    clause = "AISC Manual 15th ed. Part 10, Eq. 10-5 (after AISC 360-16 J4.2, F11)"
    if not (Vc > 0 and Mc > 0):
        return incomplete_check(name, clause, "plate shear or flexural strength not positive")
    s = (V / Vc) ** 2 + (M / Mc) ** 2
    return make_check(name, clause, s, 1.0, "-", f"V/Vc = {V / Vc:.3f}, M/Mc = {M / Mc:.3f}")


# ---------------------------------------------------------------------------------------------
# Beam web
# ---------------------------------------------------------------------------------------------


def web_shear_G2(name: str, V: float, d: float, tw: float, h: float, Fy: float, E: float) -> Check:
    """Shear strength of a rolled I-shape web, AISC 360-16 G2.1: Vn = 0.6 Fy Aw Cv1, Aw = d tw.

    (a) h/tw ≤ 2.24 √(E/Fy): Cv1 = 1.0, φv = 1.00; (b) otherwise φv = 0.90, kv = 5.34 (no
    stiffeners) and Cv1 = 1.0 for h/tw ≤ 1.10 √(kv E/Fy), else Cv1 = 1.10 √(kv E/Fy) / (h/tw).
    ``d``, ``tw``, ``h`` (clear web depth) mm; ``Fy``, ``E`` MPa.
    """
    clause = "AISC 360-16 G2.1, Eq. G2-1"
    if not (d > 0 and tw > 0 and h > 0):
        return incomplete_check(name, clause, "beam depth or web thickness unknown", "N")
    ratio = h / tw
    if ratio <= 2.24 * math.sqrt(E / Fy):
        phi, Cv1 = 1.00, 1.0
    else:
        phi, kv = 0.90, 5.34
        lim = 1.10 * math.sqrt(kv * E / Fy)
        Cv1 = 1.0 if ratio <= lim else lim / ratio
    return make_check(name, clause, V, phi * 0.6 * Fy * d * tw * Cv1, "N", f"h/tw = {ratio:.1f}, Cv1 = {Cv1:.3f}")


def coped_Snet(ho: float, tw: float, bf: float | None, tf: float | None, double: bool) -> float | None:
    """Elastic section modulus (mm³) of a coped beam's remaining section at the cope, taken at the
    coped (free) edge: a tee of web ``tw`` × (ho − tf) and flange ``bf`` × ``tf`` for a single cope,
    a ``tw`` × ``ho`` rectangle for a double cope. ``None`` when a dimension is missing."""
    if double:
        return tw * ho * ho / 6.0
    if bf is None or tf is None or tf >= ho:
        return None
    hw = ho - tf
    A_w, A_f = tw * hw, bf * tf
    # centroid from the coped edge
    y = (A_w * hw / 2.0 + A_f * (hw + tf / 2.0)) / (A_w + A_f)
    I = tw * hw**3 / 12.0 + A_w * (y - hw / 2.0) ** 2 + bf * tf**3 / 12.0 + A_f * (hw + tf / 2.0 - y) ** 2
    return I / y


def coped_Fcr(ho: float, c: float, tw: float, Fy: float, f: dict) -> tuple[float, float]:
    """Local web buckling stress of a coped beam, AISC Manual 15th ed. Part 9: Fcr = Fy Q with
    λ = ho √Fy / (10 tw √(475 + 280 (ho/c)²)) (Fy in ksi), Q = 1 for λ ≤ 0.7,
    Q = 1.34 − 0.486 λ for 0.7 < λ ≤ 1.41, Q = 1.30 / λ² for λ > 1.41. ``ho`` remaining depth mm,
    ``c`` cope length mm, ``tw`` mm, ``Fy`` MPa. Returns ``(Fcr MPa, λ)``. # from memory
    """
    from rules.aisc360_data import MPA_PER_KSI

    Fy_ksi = Fy / MPA_PER_KSI
    lam = ho * math.sqrt(Fy_ksi) / (10.0 * tw * math.sqrt(f["lambda_1"] + f["lambda_2"] * (ho / c) ** 2))
    if lam <= f["q_limit_1"]:
        Q = 1.0
    elif lam <= f["q_limit_2"]:
        Q = f["q_a"] - f["q_b"] * lam
    else:
        Q = f["q_c"] / lam**2
    return Fy * Q, lam


def coped_section_bending(name: str, M: float, Snet: float | None, Fcr: float, phi: float = 0.90,
                          note: str = "") -> Check:
    """Flexural yielding and local buckling of a coped beam at the cope, AISC Manual 15th ed.
    Part 9: φMn = φ Fcr Snet, φ = 0.90 (Fcr ≤ Fy). ``M`` = V·e (N·mm), e from the cope face to the
    hinge; ``Snet`` mm³; ``Fcr`` MPa."""
    clause = "AISC Manual 15th ed. Part 9 (coped beam flexural yielding and local buckling); AISC 360-16 F11"
    if Snet is None or not Snet > 0:
        return incomplete_check(name, clause, "flange width/thickness of the supported beam unknown", "N·mm")
    return make_check(name, clause, M, phi * Fcr * Snet, "N·mm", note)


# ---------------------------------------------------------------------------------------------
# Welds: J2.4 fillet welds; support shear rupture
# ---------------------------------------------------------------------------------------------


def line_weld_peak(V: float, N: float, M: float, L: float, n_lines: int) -> float:
    """Peak resultant force per unit length (N/mm) on each of ``n_lines`` parallel vertical fillet
    welds of length ``L`` (mm) carrying shear ``V`` (N), axial ``N`` (N) and in-plane moment ``M``
    (N·mm), elastic (vector) method: f = √((V/(nL))² + (N/(nL) + 6M/(nL²))²)."""
    fv = V / (n_lines * L)
    fh = N / (n_lines * L) + 6.0 * M / (n_lines * L * L)
    return math.hypot(fv, fh)


def weld_strength(name: str, V: float, N: float, M: float, L: float, leg: float, FEXX: float,
                  n_lines: int, phi: float = 0.75) -> Check:
    """Fillet welds of the plate to the support, AISC 360-16 J2.4, Eq. J2-3:
    φrn = φ 0.60 FEXX (w/√2) per unit length, φ = 0.75, without the directional strength increase
    (optional per J2.4(a), conservatively not used), load shared elastically (vector method).

    Demand = resultant √(V² + N²) (N); capacity = that load scaled to the peak weld stress reaching
    φrn. ``L`` weld length mm, ``leg`` mm, ``FEXX`` MPa, ``M`` N·mm at the weld.
    """
    clause = "AISC 360-16 J2.4, Eq. J2-3, Table J2.5 (elastic method, no directional increase)"
    if not (L > 0 and leg > 0 and FEXX > 0):
        return incomplete_check(name, clause, "weld length, leg or electrode strength not positive", "N")
    phi_rn = phi * 0.60 * FEXX * leg / math.sqrt(2.0)
    f = line_weld_peak(V, N, M, L, n_lines)
    R = math.hypot(V, N)
    cap = phi_rn * n_lines * L if f <= 0 else R * phi_rn / f
    return make_check(name, clause, R, cap, "N", f"peak {f:.0f} N/mm vs φrn = {phi_rn:.0f} N/mm per weld, M = {M / 1e6:.2f} kN·m")


def weld_stronger_than_plate(name: str, leg: float, tp: float, ratio: float, both_sides: bool) -> Check:
    """AISC Manual 15th ed. Part 10 single-plate practice: fillet welds on both sides of the plate
    with leg w ≥ (5/8) tp, so the weld develops the plate and plate yielding precedes weld rupture.
    ``leg``, ``tp`` mm. Demand = required leg, capacity = provided leg."""
    clause = "AISC Manual 15th ed. Part 10 (single-plate connections: weld 5/8 tp both sides)"
    if not both_sides:
        return Check(name, clause, ratio * tp, 0.0, "mm", math.inf, False,
                     "weld on one side only: single-plate practice requires fillet welds on both sides")
    return make_min_check(name, clause, ratio * tp, leg, "mm")


def weld_min_size(name: str, leg: float, w_min: float, t_thinner: float) -> Check:
    """Minimum fillet weld size, AISC 360-16 J2.2b, Table J2.4 (by the thinner part joined)."""
    return make_min_check(name, "AISC 360-16 J2.2b, Table J2.4", w_min, leg, "mm",
                          f"thinner part {t_thinner:.1f} mm")


def support_local_shear(name: str, R: float, f_peak: float, ts: float, Fu_s: float, both_sides: bool,
                        L: float, n_lines: int, phi: float = 0.75) -> Check:
    """Shear rupture of the supporting element along the welds, AISC 360-16 J4.2(b) as applied in
    the AISC Manual 15th ed. Part 9 (minimum supporting thickness tmin = 3.09 D / Fu for one
    connection, 6.19 D / Fu with connections on both sides): each weld line's peak force per length
    ``f_peak`` (N/mm) ≤ φ 0.60 Fu ts (halved when a connection on the other side shares the support).

    ``R`` resultant (N), ``ts`` support thickness mm, ``Fu_s`` MPa, ``L`` weld length mm, ``n_lines``
    weld lines. Demand R, capacity R scaled to the support rupture.
    """
    clause = "AISC 360-16 J4.2(b); AISC Manual 15th ed. Part 9 (supporting element rupture at welds)"
    if not (ts > 0 and Fu_s > 0):
        return incomplete_check(name, clause, "support thickness or Fu unknown", "N")
    cap_per_mm = phi * 0.60 * Fu_s * ts * (0.5 if both_sides else 1.0)
    cap = cap_per_mm * n_lines * L if f_peak <= 0 else R * cap_per_mm / f_peak
    note = f"peak {f_peak:.0f} N/mm vs {cap_per_mm:.0f} N/mm, ts = {ts:.1f} mm" + (
        ", connections on both sides" if both_sides else "")
    return make_check(name, clause, R, cap, "N", note)


# ---------------------------------------------------------------------------------------------
# Extended single-plate: bolt group moment capacity and maximum plate thickness
# ---------------------------------------------------------------------------------------------


def moment_only_coefficient(xy: np.ndarray, dmax_in: float = 0.34) -> float:
    """C' (mm): the ICR coefficient of a bolt group under pure moment, AISC Manual Part 7
    (Table 7-6, C' column), Crawford–Kulak load-deformation R = Rult (1 − e^(−10Δ))^0.55 with
    Δmax = 0.34 in. at the bolt farthest from the centroid: C' = Σ ri (1 − e^(−10 Δi))^0.55,
    Δi = Δmax ri / rmax (Δ in inches). ``xy`` (n, 2) mm, ``dmax_in`` in inches (Manual value)."""
    xy = np.asarray(xy, dtype=float)
    r = np.hypot(*(xy - xy.mean(axis=0)).T)
    rmax = float(r.max())
    if rmax <= 0:
        return 0.0
    delta_in = dmax_in * r / rmax
    return float(np.sum(r * (1.0 - np.exp(-10.0 * delta_in)) ** 0.55))


def tmax_extended(Fnv: float, Ab: float, C_prime: float, Fy: float, d: float, divisor: float = 0.90) -> float:
    """Maximum plate thickness of an extended single plate (mm), AISC Manual 15th ed. Part 10:
    tmax = 6 Mmax / (Fy d²), Mmax = (Fnv / 0.90) Ab C'. ``Fnv`` MPa, ``Ab`` mm², ``C'`` mm,
    ``Fy`` MPa, ``d`` plate depth mm."""
    Mmax = Fnv / divisor * Ab * C_prime
    return 6.0 * Mmax / (Fy * d * d)
