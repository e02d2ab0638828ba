"""EN 1993-1-8 rule set for bolted fin-plate (single plate) shear connections.

Code: EN 1993-1-8:2005 (+AC:2009) Design of joints and EN 1993-1-1:2005 General rules, recommended
values of the partial factors (National Annexes may differ). Practice for simple joints: SCI P358
"Joints in Steel Construction: Simple Joints to Eurocode 3" (SCI/BCSA 2011, reprinted 2014), as set
out in "Steel Buildings in Europe, Multi-Storey Steel Buildings, Part 5: Joint Design" (SCI/CTICM,
"MSB05"), chapter 3 (fin plates). Loads: EN 1990:2002 6.4.3.2, eq. (6.10) (or 6.10a/b).

How the hinge position is used (rules.base): with the hinge at the bolt line (stiff support) the
bolts carry V and the plate and weld carry V·z_c (z_c = support face to bolt-group centroid); with
the hinge at the support face (flexible support) the bolts carry V and V·z_c, the weld V only, and
the plate the moment V·a at its first bolt line. SCI P358 itself designs the bolts for V·z and the
weld as full strength; the ``envelope`` policy reproduces that.

Bolt bearing for the inclined bolt forces of an eccentric group is checked by components (EN
1993-1-8 Table 3.4 note 3, as SCI P358 Check 2 / MSB05 3.2.1.2 do): each bolt's vertical and
horizontal force against the bearing resistances in those directions, with the interaction
(F_v/F_b,ver)² + (F_h/F_b,hor)² ≤ 1. Tear-out is checked in addition along each bolt's own force
direction (end distance and hole spacing measured along the force).

Bolt forces come from the elastic method (engine.boltgroup.elastic_bolt_forces), which is what
SCI P358 Check 2 uses (its α, β expression is the elastic corner-bolt force); the instantaneous-
centre method is not part of this code's practice and is not used. Cope lengths are measured from
the beam end. Tying (Demand.N > 0) is checked as its own situation (SCI P358 Checks 11-12, γ_Mu),
not combined with the end shear.

An aid to a competent engineer: results must be checked, and the governing local code (including
the National Annex) and licensed practice take precedence.
"""

from __future__ import annotations

import math
from typing import ClassVar

import numpy as np

from engine.errors import RuleSetError
from engine.model import Check, Demand, FinPlate, Joint, Member, Section
from rules import en1993_checks as ck
from rules import en1993_data as data
from rules.base import HINGE_AT_BOLTS, HINGE_AT_SUPPORT, RuleSet, hinge_positions
from rules.tables import load_table

__all__ = ["EN1993", "HINGE_SUFFIX"]

HINGE_SUFFIX = {HINGE_AT_BOLTS: " [hinge at bolt line]", HINGE_AT_SUPPORT: " [hinge at support face]"}

_CHECKS: list[tuple[str, str]] = [
    ("bolt shear", "EN 1993-1-8 Table 3.4, 3.8; SCI P358 Check 2 (elastic bolt group)"),
    ("bolt bearing on plate", "EN 1993-1-8 Table 3.4 (components); SCI P358 Check 2"),
    ("bolt tear-out in plate", "EN 1993-1-8 Table 3.4 (α_d along the force)"),
    ("bolt bearing on beam web", "EN 1993-1-8 Table 3.4 (components); SCI P358 Check 2"),
    ("bolt tear-out in beam web", "EN 1993-1-8 Table 3.4 (α_d along the force)"),
    ("plate shear yield", "EN 1993-1-1 6.2.6; SCI P358 Check 3 (factor 1.27)"),
    ("plate shear rupture", "EN 1993-1-1 6.2.6, EN 1993-1-8 3.10; SCI P358 Check 3"),
    ("plate block shear", "EN 1993-1-8:2005 3.10.2(3); SCI P358 Check 3"),
    ("plate bending", "EN 1993-1-1 6.2.5 (W_el); SCI P358 Check 4"),
    ("plate lateral-torsional buckling", "SCI P358 Check 5; MSB05 3.2.4 (long fin plates only)"),
    ("beam web shear", "EN 1993-1-1 6.2.6 (A_v incl. notches, MSB05 3.2.5.1)"),
    ("beam web shear rupture", "EN 1993-1-1 6.2.6, EN 1993-1-8 3.10; MSB05 3.2.5.1"),
    ("beam web block shear", "EN 1993-1-8:2005 3.10.2(3); MSB05 3.2.5.1 (top-notched web only)"),
    ("beam web shear and bending (long fin plate)", "SCI P358 Check 6; MSB05 3.2.5.3 (hinge at support face, long fin plate)"),
    ("coped section bending", "EN 1993-1-1 6.2.5, 6.2.8 (notched section, W_el)"),
    ("weld", "EN 1993-1-8 4.5.3.3 (simplified method)"),
    ("weld stronger than plate", "SCI P358 Check 8; MSB05 2.2.6"),
    ("support local shear", "SCI P358 Check 10"),
    ("support punching shear", "SCI P358 Check 10"),
    ("bolt pitch minimum", "EN 1993-1-8 Table 3.3"),
    ("bolt pitch maximum", "EN 1993-1-8 Table 3.3"),
    ("bolt gauge minimum", "EN 1993-1-8 Table 3.3; SCI P358 recommended details"),
    ("bolt gauge maximum", "EN 1993-1-8 Table 3.3"),
    ("edge distance minimum (plate)", "EN 1993-1-8 Table 3.3"),
    ("edge distance minimum (beam web)", "EN 1993-1-8 Table 3.3"),
    ("edge distance for ductility (plate)", "SCI P358 recommended details (MSB05 3.1)"),
    ("edge distance for ductility (beam web)", "SCI P358 recommended details (MSB05 3.1)"),
    ("edge distance maximum", "EN 1993-1-8 Table 3.3 (steel exposed to the weather)"),
    ("plate depth to beam depth", "SCI P358 recommended details (MSB05 3.1)"),
    ("bolt group within clear web depth", "SCI P358 recommended details (MSB05 3.1)"),
    ("plate thickness for rotation", "SCI P358 recommended details (MSB05 3.1)"),
    ("clearance to support", "SCI P358 recommended details (10 mm gap, common practice)"),
    ("tie: bolt shear", "EN 1993-1-8 Table 3.4; SCI P358 Check 11"),
    ("tie: bolt bearing on plate", "EN 1993-1-8 Table 3.4 (γ_Mu); SCI P358 Check 11"),
    ("tie: plate tension", "EN 1993-1-1 6.2.3, EN 1993-1-8 3.10.2 (γ_Mu); SCI P358 Check 11"),
    ("tie: bolt bearing on beam web", "EN 1993-1-8 Table 3.4 (γ_Mu); SCI P358 Check 12"),
    ("tie: beam web tension", "EN 1993-1-1 6.2.3 (γ_Mu); SCI P358 Check 12"),
]

_HINGE_DEPENDENT = {
    "bolt shear", "bolt bearing on plate", "bolt tear-out in plate", "bolt bearing on beam web",
    "bolt tear-out in beam web", "plate bending", "plate lateral-torsional buckling",
    "coped section bending", "weld", "beam web shear and bending (long fin plate)",
}


def _bolt_forces(xy: np.ndarray, Px: float, Py: float, Mz: float) -> np.ndarray:
    """Elastic bolt forces (n, 2) in N for loads Px, Py (N) and Mz (N·mm, counter-clockwise) at
    the group's centroid, from the mechanics layer (engine.boltgroup, elastic method)."""
    from engine.boltgroup import elastic_bolt_forces

    return np.asarray(elastic_bolt_forces(xy, Px, Py, Mz), dtype=float)


def _section_thickness_for_support(joint: Joint, section: Section) -> tuple[float | None, str]:
    """The thickness of the supporting element the plate is welded to (mm) and what it is."""
    if joint.kind == "column-flange":
        return section.flange_thickness, "column flange"
    if joint.kind in ("column-web", "beam-web"):
        return section.web_thickness, "web"
    if section.kind in ("RHS", "CHS"):
        return section.web_thickness, "wall"
    return section.web_thickness, "web"


class EN1993(RuleSet):
    """EN 1993-1-8 fin-plate checks with the SCI P358 simple-joint practice.

    ``combination``: ``"6.10"`` (default) or ``"6.10ab"`` (EN 1990 6.10a/6.10b); ``exposed``:
    apply the EN 1993-1-8 Table 3.3 maximum edge distance for steel exposed to the weather
    (default from ``en1993_spacing.toml``).
    """

    code_id: ClassVar[str] = "en1993"
    title: ClassVar[str] = "EN 1993-1-8:2005 Design of joints (recommended values) with SCI P358 simple-joint practice"

    def __init__(self, combination: str | None = None, exposed: bool | None = None) -> None:
        comb = load_table("en1993_factors")["combination"]
        self.combination = combination or comb["default"]
        if self.combination not in ("6.10", "6.10ab"):
            raise RuleSetError(f"EN 1993: load combination {self.combination!r} is not one of 6.10, 6.10ab")
        self.exposed = bool(data.spacing()["maximum"]["exposed_default"] if exposed is None else exposed)

    # ---------------------------------------------------------------------------- public API

    def bolt_shear_capacity(self, size: str, grade: str, threads_in_shear_plane: bool = True, shear_planes: int = 1) -> float:
        """F_v,Rd (N) of one bolt, EN 1993-1-8 Table 3.4, γ_M2 from en1993_factors.toml."""
        if int(shear_planes) < 1:
            raise RuleSetError(f"EN 1993: shear_planes must be 1 or more, not {shear_planes!r}")
        b = data.bolt_data(size, grade)
        g = data.factors()["gamma_M2"]
        if threads_in_shear_plane:
            return ck.F_v_Rd(b.alpha_v_threads, b.fub, b.As, g, shear_planes)
        return ck.F_v_Rd(b.alpha_v_shank, b.fub, b.A, g, shear_planes)

    def fillet_weld_capacity(self, leg_mm: float, electrode: str) -> float:
        """F_w,Rd (N per mm) of one equal-leg fillet weld of leg ``leg_mm``, EN 1993-1-8 4.5.3.3.

        ``electrode`` names the steel grade of the weaker part joined ("S275"), whose f_u
        (t ≤ 40 mm) and β_w (Table 4.1) the simplified method uses; matching electrodes assumed
        (EN 1993-1-8 4.2(2)).
        """
        if not (leg_mm > 0.0):
            raise RuleSetError(f"EN 1993: fillet weld leg must be positive, not {leg_mm!r}")
        bw = data.beta_w(electrode)
        fu = data.steel_strength(_grade_steel(electrode), 0.0)
        assert fu is not None
        return ck.F_w_Rd(fu[1], bw, data.throat_from_leg(leg_mm), data.factors()["gamma_M2"])

    def check_list(self) -> list[tuple[str, str]]:
        return list(_CHECKS)

    def data_sources(self) -> list[str]:
        return [
            "EN 1993-1-8:2005 Table 2.1 and EN 1993-1-1:2005 6.1: partial factors γ_M0, γ_M1, γ_M2 (recommended values)",
            "EN 1993-1-8:2005 Table 3.1: bolt classes f_yb, f_ub; Table 3.4: α_v",
            "EN ISO 898-1: tensile stress areas A_s; EN 1090-2 Table 11: normal hole clearances",
            "EN 1993-1-1:2005 Table 3.1: f_y, f_u of S235, S275, S355 (S420, S460) by thickness",
            "EN 1993-1-8:2005 Table 4.1: correlation factor β_w",
            "EN 1993-1-8:2005 Table 3.3: minimum and maximum end/edge distances and spacings",
            "EN 1990:2002 6.4.3.2 eq. (6.10), (6.10a), (6.10b), Table A1.2(B): γ_G = 1.35, γ_Q = 1.5, ξ = 0.85, ψ_0 = 0.7",
            "SCI P358 (SCI/BCSA 2011) fin plate Checks 1-12, as in SCI/CTICM 'Steel Buildings in Europe, "
            "Multi-Storey Steel Buildings, Part 5: Joint Design', ch. 3 and 2.2.6",
            "BS 5950-1:2000 Annex B.2.1 / Table 17: lateral-torsional buckling strength of long fin plates",
        ]

    def ultimate_combination(self) -> dict[str, object]:
        c = load_table("en1993_factors")["combination"]
        gG, gQ = float(c["gamma_G"]), float(c["gamma_Q"])
        if self.combination == "6.10":
            return {"name": "1.35G + 1.5Q (EN 1990 eq. 6.10)", "dead": gG, "live": gQ, "dead_only": gG,
                    "source": "EN 1990:2002 6.4.3.2 eq. (6.10), Table A1.2(B) recommended values"}
        xi, psi0 = float(c["xi"]), float(c["psi_0"])
        return {
            "name": f"max(1.35G + {gQ * psi0:.2f}Q (6.10a), {xi * gG:.4g}G + 1.5Q (6.10b))",
            "dead": xi * gG, "live": gQ, "dead_only": gG,
            "alternatives": [{"name": "6.10a", "dead": gG, "live": psi0 * gQ}],
            "source": "EN 1990:2002 6.4.3.2 eq. (6.10a)/(6.10b), Table A1.2(B) recommended values; "
                      "'dead'/'live' give 6.10b, 'alternatives' 6.10a, the design load is the larger",
        }

    # ---------------------------------------------------------------------------- the checks

    def web_shear_capacity(self, member: Member) -> float | None:
        """V_pl,Rd = A_v f_y / (√3 γ_M0) of the member's web (EN 1993-1-1 6.2.6(2), A_v per
        6.2.6(3)(a)) in N, f_y for the web thickness (EN 1993-1-1 Table 3.1). ``None`` when the
        section or steel is unknown."""
        s = member.section
        Av = _shear_area(s) if s.kind in ("I", "channel") else None
        got = data.steel_strength(member.steel, s.web_thickness) if Av is not None else None
        if Av is None or got is None:
            return None
        return ck.V_pl_Rd(Av, got[0], data.factors()["gamma_M0"])

    def check_fin_plate(self, joint: Joint, demand: Demand, plate: FinPlate, beam: Member,
                        support: Member | None, policy: str = "conservative") -> list[Check]:
        """Every check of the fin plate at ``joint`` (see the module docstring and check_list)."""
        hinges = hinge_positions(joint.stiffness, policy)
        ctx = _Context.build(self, joint, demand, plate, beam, support)
        if isinstance(ctx, list):       # inputs unusable: incomplete checks naming why
            return ctx
        out: list[Check] = []
        for hinge in hinges:
            out.extend(ctx.hinge_checks(hinge))
        out.extend(ctx.plain_checks())
        if demand.N > 0.0:
            out.extend(ctx.tie_checks())
        return out


def _layout_problem(plate: FinPlate) -> str:
    """Why the fin-plate layout is outside what the checks cover, or "" when it is usable."""
    if plate.rows < 1 or plate.lines < 1:
        return f"{plate.rows} rows × {plate.lines} lines: at least one bolt is needed"
    if min(plate.thickness, plate.depth, plate.width) <= 0.0:
        return "plate thickness, depth and width must be positive"
    if (plate.rows > 1 and plate.pitch <= 0.0) or (plate.lines > 1 and plate.gauge <= 0.0):
        return "pitch and gauge must be positive"
    bottom = plate.depth - plate.plate_end_edge - (plate.rows - 1) * plate.pitch
    right = plate.width - plate.a - (plate.lines - 1) * plate.gauge
    if min(plate.plate_end_edge, bottom, plate.a, right, plate.beam_end_edge, plate.beam_top_edge) <= 0.0:
        return "a bolt lies on or outside the plate or beam-web edges"
    return ""


def _all_incomplete(why: str) -> list[Check]:
    """Every non-tying check, incomplete, when the connection data cannot be used at all."""
    return [ck.incomplete_check(name, clause, why) for name, clause in _CHECKS if not name.startswith("tie:")]


def _grade_steel(grade: str):
    from engine.model import Steel

    return Steel(grade=grade, fy=0.0, fu=0.0, source="rule set")


def _shear_area(sec) -> float | None:
    """A_v of a rolled I or channel, EN 1993-1-1 6.2.6(3)(a): A − 2 b t_f + (t_w + 2r) t_f but not
    less than η h_w t_w (η = 1.0); h_w t_w when the area is unknown (conservative). mm²."""
    tw, h = sec.web_thickness, sec.depth
    if tw is None or h is None:
        return None
    hw = h - 2.0 * (sec.flange_thickness or 0.0)
    if sec.area is not None and sec.width is not None and sec.flange_thickness is not None:
        tf, r = sec.flange_thickness, sec.root_radius or 0.0
        return max(sec.area - 2.0 * sec.width * tf + (tw + 2.0 * r) * tf, hw * tw)
    return hw * tw


class _Context:
    """Geometry and material of one fin plate, derived once; the check methods use it."""

    def __init__(self) -> None:  # filled by build()
        pass

    @classmethod
    def build(cls, rs: EN1993, joint: Joint, demand: Demand, plate: FinPlate, beam: Member,
              support: Member | None) -> "_Context | list[Check]":
        from rules.geometry import bolt_group_centroid_x, bolt_xy, plate_rectangle, web_region

        c = cls()
        c.rs, c.joint, c.demand, c.plate, c.beam, c.support = rs, joint, demand, plate, beam, support
        c.f = data.factors()
        c.practice = data.practice()
        c.V_signed = float(demand.V)      # + downward load on the beam end; sign sets bolt-force directions
        c.V = abs(c.V_signed)
        c.N = max(float(demand.N), 0.0)
        bad = _layout_problem(plate)
        if bad:
            return _all_incomplete(bad)
        try:
            c.bolt = data.bolt_data(plate.bolts.size, plate.bolts.grade)
        except RuleSetError as exc:
            return _all_incomplete(str(exc))
        c.d = c.bolt.d
        c.d0 = float(plate.bolts.hole_diameter or c.bolt.d0)
        if plate.bolts.threads_in_shear_plane:
            c.Fv = ck.F_v_Rd(c.bolt.alpha_v_threads, c.bolt.fub, c.bolt.As, c.f["gamma_M2"])
        else:
            c.Fv = ck.F_v_Rd(c.bolt.alpha_v_shank, c.bolt.fub, c.bolt.A, c.f["gamma_M2"])
        c.tp = float(plate.thickness)
        c.hp = float(plate.depth)
        c.n1, c.n2 = int(plate.rows), int(plate.lines)
        c.p1 = float(plate.pitch) if c.n1 > 1 else None
        c.p2 = float(plate.gauge) if c.n2 > 1 else None
        pl = data.steel_strength(plate.steel, c.tp)
        c.plate_strength = pl  # (fy, fu, note) or None
        sec = beam.section
        c.sec = sec
        c.tw = sec.web_thickness
        bs = data.steel_strength(beam.steel, c.tw) if c.tw is not None else None
        c.beam_strength = bs
        c.xy = bolt_xy(plate)
        c.xc = bolt_group_centroid_x(plate)
        c.rect_plate = plate_rectangle(plate)
        c.cope_top = max((cp.depth for cp in joint.geometry.copes if cp.where == "top"), default=0.0)
        c.cope_bot = max((cp.depth for cp in joint.geometry.copes if cp.where == "bottom"), default=0.0)
        c.hb = sec.depth
        if c.hb is not None:
            c.rect_web = web_region(plate, c.hb - c.cope_top - c.cope_bot)
        else:
            c.rect_web = None
        # distances
        c.e1_top = float(plate.plate_end_edge)
        c.e1_bot = c.hp - c.e1_top - (c.n1 - 1) * float(plate.pitch)
        c.e1 = min(c.e1_top, c.e1_bot)
        c.e2 = float(plate.plate_side_edge)
        c.e2b = float(plate.beam_end_edge)
        c.e1b = float(plate.beam_top_edge)
        c.hole_ok = plate.bolts.hole == "standard"
        return c

    # ------------------------------------------------------------------ helpers

    def _name(self, base: str, hinge: str | None) -> str:
        return base + (HINGE_SUFFIX[hinge] if hinge else "")

    def _bolt_loads(self, hinge: str, V: float, N: float = 0.0) -> np.ndarray:
        """Forces (n, 2) the bolts push the plate with (N); the web receives the opposite."""
        Mz = V * self.xc if hinge == HINGE_AT_SUPPORT else 0.0
        return _bolt_forces(self.xy, N, -V, Mz)

    # ------------------------------------------------------------------ hinge-dependent checks

    def hinge_checks(self, hinge: str) -> list[Check]:
        out: list[Check] = []
        F = self._bolt_loads(hinge, self.V_signed)
        out.append(self.bolt_shear(hinge, F))
        out.extend(self.bearing_plate(hinge, F))
        out.extend(self.bearing_web(hinge, F))
        out.append(self.plate_bending(hinge))
        ltb = self.plate_ltb(hinge)
        if ltb is not None:
            out.append(ltb)
        if hinge == HINGE_AT_SUPPORT:
            w = self.web_long_plate(hinge)
            if w is not None:
                out.append(w)
        out.extend(self.coped_bending(hinge))
        out.append(self.weld(hinge))
        return out

    def bolt_shear(self, hinge: str, F: np.ndarray) -> Check:
        Lj = (self.n1 - 1) * float(self.plate.pitch)
        return ck.check_bolt_shear(self._name("bolt shear", hinge), F, self.Fv, ck.beta_Lf(Lj, self.d))

    def _bearing_resistances(self, t: float, fu: float, e_end_v: float, e_edge_v: float,
                             e_end_h: float, e_edge_h: float, gamma: float) -> tuple[float, float, float, float]:
        """(F_b,ver, F_b,hor, k1_ver, k1_hor) per bolt for a part of thickness t (mm) and f_u (MPa)."""
        Fbv, k1v, _ = ck.bearing_component_resistance(self.d, self.d0, t, fu, self.bolt.fub,
                                                      e_end_v, self.p1, e_edge_v, self.p2, gamma)
        Fbh, k1h, _ = ck.bearing_component_resistance(self.d, self.d0, t, fu, self.bolt.fub,
                                                      e_end_h, self.p2, e_edge_h, self.p1, gamma)
        return Fbv, Fbh, k1v, k1h

    def bearing_plate(self, hinge: str, F: np.ndarray) -> list[Check]:
        nb, nt = self._name("bolt bearing on plate", hinge), self._name("bolt tear-out in plate", hinge)
        cb, ct = "EN 1993-1-8 Table 3.4 (components); SCI P358 Check 2", "EN 1993-1-8 Table 3.4 (α_d along the force)"
        if self.plate_strength is None:
            why = f"plate steel {self.plate.steel.grade!r} at t = {self.tp:g} mm outside EN 1993-1-1 Table 3.1"
            return [ck.incomplete_check(nb, cb, why), ck.incomplete_check(nt, ct, why)]
        if not self.hole_ok:
            why = f"{self.plate.bolts.hole} holes: only normal round holes are covered"
            return [ck.incomplete_check(nb, cb, why), ck.incomplete_check(nt, ct, why)]
        fu = self.plate_strength[1]
        g = self.f["gamma_M2"]
        Fbv, Fbh, k1v, k1h = self._bearing_resistances(self.tp, fu, self.e1, self.e2, self.e2, self.e1, g)
        return [
            ck.check_bearing_components(nb, cb, F, Fbv, Fbh),
            ck.check_tear_out(nt, ct, self.xy, F, self.rect_plate, self.d, self.d0, self.tp, fu, self.bolt.fub, k1v, k1h, g),
        ]

    def bearing_web(self, hinge: str, F: np.ndarray) -> list[Check]:
        nb, nt = self._name("bolt bearing on beam web", hinge), self._name("bolt tear-out in beam web", hinge)
        cb, ct = "EN 1993-1-8 Table 3.4 (components); SCI P358 Check 2", "EN 1993-1-8 Table 3.4 (α_d along the force)"
        why = self._web_missing()
        if why:
            return [ck.incomplete_check(nb, cb, why), ck.incomplete_check(nt, ct, why)]
        if not self.hole_ok:
            why = f"{self.plate.bolts.hole} holes: only normal round holes are covered"
            return [ck.incomplete_check(nb, cb, why), ck.incomplete_check(nt, ct, why)]
        fu = self.beam_strength[1]
        g = self.f["gamma_M2"]
        tw = float(self.tw)
        # MSB05 3.2.1.3 (p. 5-24): e1,b, the vertical end distance to the top of the web (or notch),
        # enters α_b for F_b,ver and k1 for F_b,hor; e2,b, the beam end distance, the other two
        e_top = self.e1b
        Fbv, Fbh, k1v, k1h = self._bearing_resistances(tw, fu, e_top, self.e2b, self.e2b, e_top, g)
        return [
            ck.check_bearing_components(nb, cb, -F, Fbv, Fbh),
            ck.check_tear_out(nt, ct, self.xy, -F, self.rect_web, self.d, self.d0, tw, fu, self.bolt.fub, k1v, k1h, g),
        ]

    def _web_missing(self) -> str:
        if self.tw is None or self.hb is None:
            return f"beam section {self.sec.name!r}: web thickness or depth unknown"
        if self.beam_strength is None:
            return "beam steel unknown or outside EN 1993-1-1 Table 3.1"
        return ""

    def plate_bending(self, hinge: str) -> Check:
        name = self._name("plate bending", hinge)
        clause = "EN 1993-1-1 6.2.5 (W_el); SCI P358 Check 4"
        if self.plate_strength is None:
            return ck.incomplete_check(name, clause, "plate steel outside EN 1993-1-1 Table 3.1", "N·mm")
        a = float(self.plate.a)
        x_h = self.xc if hinge == HINGE_AT_BOLTS else 0.0
        W_gross = self.tp * self.hp**2 / 6.0
        hole_y = self.xy[: self.n1, 1] + self.hp / 2.0
        W_net = ck.rect_section_modulus_net(self.hp, self.tp, hole_y, self.d0)
        sections = [("at the weld (gross)", self.V * abs(0.0 - x_h), W_gross),
                    ("at the first bolt line (net)", self.V * abs(a - x_h), W_net)]
        return ck.check_bending(name, clause, sections, self.plate_strength[0], self.f["gamma_M0"])

    def plate_ltb(self, hinge: str) -> Check | None:
        """Only for a long fin plate (z > t_p/0.15); z the lever arm of the plate moment."""
        if self.plate_strength is None:
            return ck.incomplete_check(self._name("plate lateral-torsional buckling", hinge),
                                       "SCI P358 Check 5", "plate steel outside EN 1993-1-1 Table 3.1", "N·mm")
        z = self.xc if hinge == HINGE_AT_BOLTS else float(self.plate.a)
        if z <= self.tp * float(self.practice["long_plate_z_over_tp"]):
            return None
        return ck.check_plate_ltb(self._name("plate lateral-torsional buckling", hinge), self.V * z, z,
                                  float(self.plate.a), self.hp, self.tp, self.plate_strength[0],
                                  self.f["gamma_M0"], self.f["gamma_M1"], self.practice["ltb"],
                                  float(self.practice["ltb_strength_factor"]))

    # beam web shear area (EN 1993-1-1 6.2.6(3)a, MSB05 3.2.5.1 for notched webs)
    def web_shear_area(self) -> tuple[float | None, str]:
        s = self.sec
        tw, h = self.tw, self.hb
        if tw is None or h is None:
            return None, "web thickness or depth unknown"
        if self.cope_top > 0.0 and self.cope_bot > 0.0:
            return tw * (h - self.cope_top - self.cope_bot), "double-notched: A_v = t_w h_remaining"
        if self.cope_top > 0.0 or self.cope_bot > 0.0:
            if s.flange_thickness is None:
                return None, "flange thickness unknown (notched web)"
            tf = s.flange_thickness
            r = s.root_radius or 0.0
            dc = max(self.cope_top, self.cope_bot)
            return tw * (h - dc - tf) + (tw + 2.0 * r) * tf / 2.0, "single-notched: A_v = A_Tee − b t_f + (t_w + 2r) t_f/2"
        if s.area is not None and s.width is not None and s.flange_thickness is not None:
            return _shear_area(s), "A_v = A − 2 b t_f + (t_w + 2r) t_f ≥ η h_w t_w (η = 1.0)"
        return _shear_area(s), "A_v = h_w t_w (section area unknown; conservative)"

    def web_shear_resistances(self) -> tuple[float, float] | None:
        Av, _ = self.web_shear_area()
        if Av is None or self.beam_strength is None:
            return None
        fy, fu, _ = self.beam_strength
        Vg = ck.V_pl_Rd(Av, fy, self.f["gamma_M0"])
        Vn = ck.V_net_Rd(Av - self.n1 * self.d0 * float(self.tw), fu, self.f["gamma_M2"])
        return Vg, Vn

    def web_long_plate(self, hinge: str) -> Check | None:
        """MSB05 3.2.5.3 / SCI P358 Check 6: web section ABCD round the bolt group resists the group
        moment for a long fin plate, un-notched beam (applies when the bolts carry V·z)."""
        if self.xc <= self.tp * float(self.practice["long_plate_z_over_tp"]):
            return None
        name = self._name("beam web shear and bending (long fin plate)", hinge)
        clause = "SCI P358 Check 6; MSB05 3.2.5.3"
        why = self._web_missing()
        if why:
            return ck.incomplete_check(name, clause, why, "N·mm")
        if self.cope_top > 0.0 or self.cope_bot > 0.0 or self.n1 < 2 or self.n2 > 2:
            return ck.incomplete_check(name, clause, "given for un-notched webs with 2+ rows in 1 or 2 lines only", "N·mm")
        fy, fu, _ = self.beam_strength
        tw = float(self.tw)
        g0, g2 = self.f["gamma_M0"], self.f["gamma_M2"]
        L = (self.n1 - 1) * float(self.plate.pitch)
        r3 = math.sqrt(3.0)
        F_BC = min(tw * L * fy / (r3 * g0), tw * (L - (self.n1 - 1) * self.d0) * fu / (r3 * g2))
        if self.n2 == 1:
            F_AB = min(tw * self.e2b * fy / (r3 * g0), tw * (self.e2b - self.d0 / 2.0) * fu / (r3 * g2))
        else:
            p2 = float(self.plate.gauge)
            F_AB = min(tw * (self.e2b + p2) * fy / (r3 * g0), tw * (self.e2b + p2 - 1.5 * self.d0) * fu / (r3 * g2))
        res = self.web_shear_resistances()
        V_min = min(res) if res else 0.0
        V_BC = max(self.V - (V_min - F_BC), 0.0)
        if V_BC <= 0.5 * F_BC:
            Mc = tw * fy * L**2 / (6.0 * g0)
        else:
            Mc = tw * fy * L**2 / (4.0 * g0) * (1.0 - (2.0 * V_BC / F_BC - 1.0) ** 2)
        cap = Mc + F_AB * L
        M = self.V * self.xc
        return ck.strength_check(name, clause, M, cap, "N·mm",
                                 f"M_Ed = V (z_p + (n2−1) p2/2); M_c,BC,Rd = {Mc / 1e6:.1f} kN·m, F_pl,AB,Rd = {F_AB / 1e3:.0f} kN, "
                                 f"F_pl,BC,Rd = {F_BC / 1e3:.0f} kN")

    def coped_bending(self, hinge: str) -> list[Check]:
        copes = self.joint.geometry.copes
        if not copes:
            return []
        name = self._name("coped section bending", hinge)
        clause = "EN 1993-1-1 6.2.5, 6.2.8 (notched section, W_el)"
        s = self.sec
        if None in (s.depth, s.web_thickness, s.flange_thickness, s.width) or self.beam_strength is None:
            return [ck.incomplete_check(name, clause, "beam depth, width, web or flange thickness, or steel unknown", "N·mm")]
        h, tw, tf, b = float(s.depth), float(s.web_thickness), float(s.flange_thickness), float(s.width)
        fy = self.beam_strength[0]
        x_end = float(self.plate.a) - self.e2b
        x_h = self.xc if hinge == HINGE_AT_BOLTS else 0.0
        worst: Check | None = None
        for cp in copes:
            x_c = x_end + cp.length
            top = max((c.depth for c in copes if c.where == "top" and c.length >= cp.length - 1e-9), default=0.0)
            bot = max((c.depth for c in copes if c.where == "bottom" and c.length >= cp.length - 1e-9), default=0.0)
            rects: list[tuple[float, float, float]] = []
            y_web_bot = bot if bot > 0.0 else tf
            y_web_top = h - top if top > 0.0 else h - tf
            if bot <= 0.0:
                rects.append((b, 0.0, tf))
            if top <= 0.0:
                rects.append((b, h - tf, h))
            if y_web_top <= y_web_bot:
                return [ck.incomplete_check(name, clause, "copes leave no web", "N·mm")]
            rects.append((tw, y_web_bot, y_web_top))
            _, W = ck.section_elastic_modulus(rects)
            Mc = ck.M_el_Rd(W, fy, self.f["gamma_M0"])
            Vpl = ck.V_pl_Rd(tw * (y_web_top - y_web_bot), fy, self.f["gamma_M0"])
            rho = (2.0 * self.V / Vpl - 1.0) ** 2 if self.V > 0.5 * Vpl else 0.0
            M = self.V * max(x_c - x_h, 0.0)
            c = ck.strength_check(name, clause, M, Mc * (1.0 - rho), "N·mm",
                                  f"section at the end of the {cp.where} cope ({cp.length:g} mm), W_el = {W:.0f} mm³, ρ = {rho:.2f}")
            if worst is None or c.utilisation > worst.utilisation:
                worst = c
        return [worst] if worst else []

    def weld(self, hinge: str) -> Check:
        name = self._name("weld", hinge)
        w = self.plate.weld
        grade = self._weld_grade()
        try:
            bw = data.beta_w(grade)
        except RuleSetError as exc:
            return ck.incomplete_check(name, "EN 1993-1-8 4.5.3.3", str(exc))
        st = data.steel_strength(_grade_steel(grade), min(self.tp, self._support_t() or self.tp))
        if st is None:
            return ck.incomplete_check(name, "EN 1993-1-8 4.5.3.3", "weld parts outside EN 1993-1-1 Table 3.1")
        a = data.throat_from_leg(w.leg)
        Fw = ck.F_w_Rd(st[1], bw, a, self.f["gamma_M2"])
        l_eff = self.hp - 2.0 * a
        M = self.V * self.xc if hinge == HINGE_AT_BOLTS else 0.0
        return ck.check_weld_group(name, self.V, M, 0.0, l_eff, 2 if w.both_sides else 1, Fw,
                                   f"{grade}, a = {a:.1f} mm, l_eff = h_p − 2a (EN 1993-1-8 4.5.1)")

    def _support_t(self) -> float | None:
        if self.support is None:
            return None
        t, _ = _section_thickness_for_support(self.joint, self.support.section)
        return t

    def _weld_grade(self) -> str:
        """The weaker of the plate and support grades (f_u), used with matching electrodes."""
        grades = [self.plate.steel.grade]
        if self.support is not None and self.support.steel is not None:
            grades.append(self.support.steel.grade)
        best, best_fu = grades[0], math.inf
        for g in grades:
            try:
                fu = data.steel_strength(_grade_steel(g), 0.0)
                data.beta_w(g)
            except RuleSetError:
                continue
            if fu is not None and fu[1] < best_fu:
                best, best_fu = g, fu[1]
        return best

    # ------------------------------------------------------------------ hinge-independent checks

    def plain_checks(self) -> list[Check]:
        out: list[Check] = []
        out.extend(self.plate_shear())
        out.extend(self.web_shear())
        out.extend(self.weld_full_strength())
        out.extend(self.support_checks())
        out.extend(self.detailing())
        return out

    def plate_shear(self) -> list[Check]:
        if self.plate_strength is None:
            why = f"plate steel {self.plate.steel.grade!r} at t = {self.tp:g} mm outside EN 1993-1-1 Table 3.1"
            return [ck.incomplete_check(n, c, why) for n, c in _CHECKS[5:8]]
        fy, fu, _ = self.plate_strength
        g0, g2 = self.f["gamma_M0"], self.f["gamma_M2"]
        A_nt = self.tp * (self.e2 + (self.n2 - 1) * float(self.plate.gauge) - (self.n2 - 0.5) * self.d0)
        A_nv = self.tp * (self.hp - self.e1_top - (self.n1 - 0.5) * self.d0)
        return [
            ck.check_plate_shear_yield(self.V, self.hp, self.tp, fy, g0, float(self.practice["gross_shear_reduction"])),
            ck.check_plate_shear_rupture(self.V, self.hp, self.tp, self.n1, self.d0, fu, g2),
            ck.check_block_tearing("plate block shear", "EN 1993-1-8:2005 3.10.2(3); SCI P358 Check 3",
                                   self.V, A_nt, A_nv, fu, fy, g0, g2),
        ]

    def web_shear(self) -> list[Check]:
        out: list[Check] = []
        why = self._web_missing()
        Av, how = self.web_shear_area()
        if why or Av is None:
            why = why or how
            out.append(ck.incomplete_check("beam web shear", "EN 1993-1-1 6.2.6", why))
            out.append(ck.incomplete_check("beam web shear rupture", "EN 1993-1-1 6.2.6, EN 1993-1-8 3.10", why))
            if self.cope_top > 0.0:
                out.append(ck.incomplete_check("beam web block shear", "EN 1993-1-8:2005 3.10.2(3)", why))
            return out
        fy, fu, _ = self.beam_strength
        tw = float(self.tw)
        g0, g2 = self.f["gamma_M0"], self.f["gamma_M2"]
        out.append(ck.strength_check("beam web shear", "EN 1993-1-1 6.2.6; MSB05 3.2.5.1", self.V,
                                     ck.V_pl_Rd(Av, fy, g0), "N", f"{how}; A_v = {Av:.0f} mm²"))
        A_net = Av - self.n1 * self.d0 * tw
        out.append(ck.strength_check("beam web shear rupture", "EN 1993-1-1 6.2.6, EN 1993-1-8 3.10; MSB05 3.2.5.1",
                                     self.V, ck.V_net_Rd(A_net, fu, g2), "N", f"A_v,net = {A_net:.0f} mm²"))
        if self.cope_top > 0.0:
            A_nt = tw * (self.e2b + (self.n2 - 1) * float(self.plate.gauge) - (self.n2 - 0.5) * self.d0)
            A_nv = tw * (self.e1b + (self.n1 - 1) * float(self.plate.pitch) - (self.n1 - 0.5) * self.d0)
            out.append(ck.check_block_tearing("beam web block shear", "EN 1993-1-8:2005 3.10.2(3); MSB05 3.2.5.1",
                                              self.V, A_nt, A_nv, fu, fy, g0, g2))
        return out

    def weld_full_strength(self) -> list[Check]:
        grade = self.plate.steel.grade
        name, clause = "weld stronger than plate", "SCI P358 Check 8; MSB05 2.2.6"
        try:
            bw = data.beta_w(grade)
        except RuleSetError as exc:
            return [ck.incomplete_check(name, clause, str(exc), "mm")]
        if self.plate_strength is None:
            return [ck.incomplete_check(name, clause, "plate steel outside EN 1993-1-1 Table 3.1", "mm")]
        fy, fu, _ = self.plate_strength
        ratio = data.full_strength_ratio(fy, fu, bw, self.f["gamma_M0"], self.f["gamma_M2"])
        w = self.plate.weld
        return [ck.check_weld_full_strength(data.throat_from_leg(w.leg), self.tp, ratio, grade, w.both_sides)]

    def support_checks(self) -> list[Check]:
        # both expressions recalled from SCI P358 Check 10 (not found in the searched sources)  # from memory
        n1, c1 = "support local shear", "SCI P358 Check 10"
        n2, c2 = "support punching shear", "SCI P358 Check 10"
        if self.support is None:
            return [ck.incomplete_check(n1, c1, "no supporting member"), ck.incomplete_check(n2, c2, "no supporting member", "mm")]
        t, what = _section_thickness_for_support(self.joint, self.support.section)
        st = data.steel_strength(self.support.steel, t) if t is not None else None
        if t is None or st is None or self.plate_strength is None:
            why = f"support {self.support.label}: {what} thickness or steel unknown"
            return [ck.incomplete_check(n1, c1, why), ck.incomplete_check(n2, c2, why, "mm")]
        fy_s, fu_s, _ = st
        cap = self.hp * t * fy_s / (math.sqrt(3.0) * self.f["gamma_M0"])
        limit = t * fu_s / (self.plate_strength[0] * self.f["gamma_M2"])
        return [
            ck.strength_check(n1, c1, self.V / 2.0, cap, "N", f"V/2 on the {what}: A_v = h_p t = {self.hp * t:.0f} mm² (expression recalled, verify)"),
            ck.maximum_check(n2, c2, self.tp, limit, "mm", f"t_p ≤ t f_u,s/(f_y,p γ_M2), {what} t = {t:g} mm (expression recalled, verify)"),
        ]

    def detailing(self) -> list[Check]:
        sp = data.spacing()
        mn, mx = sp["minimum"], sp["maximum"]
        pr = self.practice
        out: list[Check] = []
        d0, d = self.d0, self.d
        t_thin = min(self.tp, float(self.tw)) if self.tw is not None else self.tp
        spmax = min(mx["spacing_t_factor"] * t_thin, mx["spacing_cap_mm"])
        if self.n1 > 1:
            p1 = float(self.plate.pitch)
            out.append(ck.minimum_check("bolt pitch minimum", "EN 1993-1-8 Table 3.3", mn["p1_over_d0"] * d0, p1, "mm", "p1 ≥ 2.2 d0"))
            out.append(ck.maximum_check("bolt pitch maximum", "EN 1993-1-8 Table 3.3", p1, spmax, "mm", "p1 ≤ min(14 t, 200 mm)"))
        if self.n2 > 1:
            p2 = float(self.plate.gauge)
            req = max(mn["p2_over_d0"] * d0, float(pr["gauge_to_bolt_d_min"]) * d)
            out.append(ck.minimum_check("bolt gauge minimum", "EN 1993-1-8 Table 3.3; SCI P358 recommended details", req, p2, "mm",
                                        "p2 ≥ max(2.4 d0 (Table 3.3), 2.5 d (MSB05 3.1))"))
            out.append(ck.maximum_check("bolt gauge maximum", "EN 1993-1-8 Table 3.3", p2, spmax, "mm", "p2 ≤ min(14 t, 200 mm)"))
        e_plate = min(self.e1, self.e2)
        out.append(ck.minimum_check("edge distance minimum (plate)", "EN 1993-1-8 Table 3.3", mn["e1_over_d0"] * d0, e_plate, "mm",
                                    f"min(e1 = {self.e1:g}, e2 = {self.e2:g}) ≥ 1.2 d0"))
        out.append(ck.minimum_check("edge distance for ductility (plate)", "SCI P358 recommended details (MSB05 3.1)",
                                    float(pr["edge_distance_to_bolt_d_min"]) * d, e_plate, "mm", "all end and edge distances ≥ 2 d"))
        web_edges = [self.e2b]
        if self.cope_top > 0.0:
            web_edges.append(self.e1b)
        if self.cope_bot > 0.0 and self.rect_web is not None:
            web_edges.append(float(self.xy[:, 1].min() - self.rect_web[2]))
        e_web = min(web_edges)
        out.append(ck.minimum_check("edge distance minimum (beam web)", "EN 1993-1-8 Table 3.3", mn["e1_over_d0"] * d0, e_web, "mm",
                                    "beam end distance" + (" and cope edges" if len(web_edges) > 1 else "")))
        out.append(ck.minimum_check("edge distance for ductility (beam web)", "SCI P358 recommended details (MSB05 3.1)",
                                    float(pr["edge_distance_to_bolt_d_min"]) * d, e_web, "mm", "all end and edge distances ≥ 2 d"))
        if self.rs.exposed:
            lim_p = mx["edge_t_factor"] * self.tp + mx["edge_add_mm"]
            cands = [(max(self.e1, self.e2) / lim_p, max(self.e1, self.e2), lim_p, "plate e1, e2 ≤ 4 t_p + 40 mm")]
            if self.tw is not None:
                lim_w = mx["edge_t_factor"] * float(self.tw) + mx["edge_add_mm"]
                cands.append((self.e2b / lim_w, self.e2b, lim_w, "beam web end distance ≤ 4 t_w + 40 mm"))
            _, e_max, lim, what = max(cands)
            out.append(ck.maximum_check("edge distance maximum", "EN 1993-1-8 Table 3.3", e_max, lim, "mm",
                                        what + " (steel exposed to the weather)"))
        if self.hb is not None:
            out.append(ck.minimum_check("plate depth to beam depth", "SCI P358 recommended details (MSB05 3.1)",
                                        float(pr["plate_depth_to_beam_depth_min"]) * self.hb, self.hp, "mm", "h_p ≥ 0.6 h_b"))
            out.append(self.clear_web())
        else:
            out.append(ck.incomplete_check("plate depth to beam depth", "SCI P358 recommended details", "beam depth unknown", "mm"))
            out.append(ck.incomplete_check("bolt group within clear web depth", "SCI P358 recommended details", "beam depth unknown", "mm"))
        t_rot = min(self.tp, float(self.tw)) if self.tw is not None else self.tp
        out.append(ck.maximum_check("plate thickness for rotation", "SCI P358 recommended details (MSB05 3.1)", t_rot,
                                    float(pr["plate_thickness_to_bolt_d_max"]) * d, "mm",
                                    "min(t_p, t_w) ≤ 0.5 d (8.8 bolts)" + ("" if self.bolt.grade == "8.8" else
                                                                          f"; SCI P358 details assume 8.8 bolts, not {self.bolt.grade}")))
        gap = float(self.plate.a) - self.e2b
        out.append(ck.minimum_check("clearance to support", "SCI P358 recommended details (10 mm gap, common practice)",
                                    float(pr["gap_min"]), gap, "mm", "gap between beam end and support face"))
        return out

    def clear_web(self) -> Check:
        """The plate (which carries the bolt group) lies between the root radii of the web, or the
        notch, with the top clearance t_f + r (MSB05 3.1 item 15)."""
        name, clause = "bolt group within clear web depth", "SCI P358 recommended details (MSB05 3.1)"
        s = self.sec
        if s.flange_thickness is None and (self.cope_top <= 0.0 or self.cope_bot <= 0.0):
            return ck.incomplete_check(name, clause, "flange thickness unknown", "mm")
        tf = s.flange_thickness or 0.0
        r = s.root_radius or 0.0
        x0, x1, yb, yt = self.rect_web
        y_clear_top = yt if self.cope_top > 0.0 else yt - tf - r
        y_clear_bot = yb if self.cope_bot > 0.0 else yb + tf + r
        need = max(0.0 - y_clear_bot, y_clear_top + self.hp)
        return ck.maximum_check(name, clause, need, y_clear_top - y_clear_bot, "mm",
                                f"plate top {y_clear_top:.0f} mm below the clear zone top, clear depth {y_clear_top - y_clear_bot:.0f} mm")

    # ------------------------------------------------------------------ tying (N > 0)

    def tie_checks(self) -> list[Check]:
        """Structural-integrity tying checks (SCI P358 Checks 11 and 12, MSB05 3.3), N alone."""
        out: list[Check] = []
        N = self.N
        gu = self.f["gamma_Mu"]
        n = self.n1 * self.n2
        out.append(ck.strength_check("tie: bolt shear", "EN 1993-1-8 Table 3.4; SCI P358 Check 11", N, n * self.Fv, "N",
                                     "n F_v,Rd with γ_M2 (conservative)"))
        if self.plate_strength is not None and self.hole_ok:
            fy, fu, _ = self.plate_strength
            Fbh, _, _ = ck.bearing_component_resistance(self.d, self.d0, self.tp, fu, self.bolt.fub, self.e2, self.p2,
                                                        self.e1, self.p1, gu)
            out.append(ck.strength_check("tie: bolt bearing on plate", "EN 1993-1-8 Table 3.4 (γ_Mu); SCI P358 Check 11",
                                         N, n * Fbh, "N", f"F_b,hor,u,Rd = {Fbh / 1e3:.1f} kN"))
            A_net = self.tp * (self.hp - self.n1 * self.d0)
            F_n = 0.9 * fu * A_net / gu
            p1 = float(self.plate.pitch)
            p2 = float(self.plate.gauge)
            A_nt1 = self.tp * ((self.n1 - 1) * p1 - (self.n1 - 1) * self.d0)
            A_nv1 = 2.0 * self.tp * (self.e2 + (self.n2 - 1) * p2 - (self.n2 - 0.5) * self.d0)
            A_nt2 = self.tp * (self.e1_top + (self.n1 - 1) * p1 - (self.n1 - 0.5) * self.d0)
            A_nv2 = A_nv1 / 2.0
            r3 = math.sqrt(3.0)
            F_b1 = fu * A_nt1 / gu + fy * A_nv1 / (r3 * self.f["gamma_M0"])
            F_b2 = fu * A_nt2 / gu + fy * A_nv2 / (r3 * self.f["gamma_M0"])
            out.append(ck.strength_check("tie: plate tension", "EN 1993-1-1 6.2.3, EN 1993-1-8 3.10.2 (γ_Mu); SCI P358 Check 11",
                                         N, min(F_n, F_b1, F_b2), "N",
                                         f"net section {F_n / 1e3:.0f} kN, block case 1 {F_b1 / 1e3:.0f} kN, case 2 {F_b2 / 1e3:.0f} kN"))
        else:
            out.append(ck.incomplete_check("tie: bolt bearing on plate", "EN 1993-1-8 Table 3.4", "plate steel or hole type not covered"))
            out.append(ck.incomplete_check("tie: plate tension", "EN 1993-1-1 6.2.3", "plate steel not covered"))
        why = self._web_missing()
        if why or not self.hole_ok:
            out.append(ck.incomplete_check("tie: bolt bearing on beam web", "EN 1993-1-8 Table 3.4", why or "hole type not covered"))
            out.append(ck.incomplete_check("tie: beam web tension", "EN 1993-1-1 6.2.3", why or "hole type not covered"))
            return out
        fy, fu, _ = self.beam_strength
        tw = float(self.tw)
        e_top = self.e1b
        Fbh, _, _ = ck.bearing_component_resistance(self.d, self.d0, tw, fu, self.bolt.fub, self.e2b, self.p2, e_top, self.p1, gu)
        out.append(ck.strength_check("tie: bolt bearing on beam web", "EN 1993-1-8 Table 3.4 (γ_Mu); SCI P358 Check 12",
                                     N, n * Fbh, "N", f"F_b,hor,u,Rd = {Fbh / 1e3:.1f} kN"))
        A_net = tw * (self.hp - self.n1 * self.d0)   # web strip as deep as the plate (SCI P358 Check 12)  # from memory
        out.append(ck.strength_check("tie: beam web tension", "EN 1993-1-1 6.2.3 (γ_Mu); SCI P358 Check 12", N,
                                     0.9 * fu * A_net / gu, "N", "web strip of the plate's depth, net of holes (expression recalled, verify)"))
        return out
