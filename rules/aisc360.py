"""AISC 360 rule set: bolted single-plate (fin plate, shear tab) connections, LRFD.

Edition followed: **ANSI/AISC 360-16** *Specification for Structural Steel Buildings* with the
**AISC Steel Construction Manual, 15th edition** (2017) single-plate practice (Part 10), the ICR
method for eccentrically loaded bolt groups (Part 7) and the coped-beam checks (Part 9); load
combinations per ASCE/SEI 7-16 §2.3.1. The pure check functions are in :mod:`rules.aisc360_checks`,
units and tables in :mod:`rules.aisc360_data` (``rules/data/aisc360_*.toml``).

**Hinge position and the Manual's eccentricities.** The project contract (:mod:`rules.base`) puts
the hinge of a simple connection at the bolt line for a stiff support (the bolts carry V, the plate
and the weld carry V·a) and at the support face for a flexible one (the bolts carry V and V·a,
a = support face to the bolt-group centroid, and the weld carries V). The Manual's practice is
mapped onto it as follows (never less demand than the contract asks for):

* *Conventional configuration* (Manual Part 10 dimensional limits: one vertical row of 2 to 12
  bolts, a ≤ 3-1/2 in., standard or short-slotted holes, Leh ≥ 2 db on plate and web): for the
  hinge at the bolt line (rigid support such as a column flange) the bolts carry V at the
  eccentricity of Manual Table 10-9 (e = a/2, or e = a for 6 to 12 bolts in standard holes), which
  the Manual requires even for a rigid support; for the hinge at the support face (flexible
  support such as a one-sided girder web) the bolts carry V at e = a, the full contract
  eccentricity. Plate and weld carry V·a (hinge at bolt line) or V (hinge at support face).
* *Extended configuration* (any layout outside those limits): the Manual designs the bolt group for
  e = a with the ICR method whatever the support, so both hinge positions use e = a on the bolts;
  the plate thickness is limited by tmax = 6 Mmax / (Fy d²), Mmax = (Fnv/0.90) Ab C', and the
  plate is checked for shear-flexure interaction (Manual Eq. 10-5) and buckling (F11).

Bolt shear uses the ICR coefficient C (:func:`engine.boltgroup.icr_coefficient`), as the Manual
does; bearing and tear-out use each bolt's clear distance along the direction of its elastic-method
force and the group efficiency C/n (Manual Part 7).

An aid to a competent engineer: results must be checked, and the governing local code and licensed
practice take precedence.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from engine.errors import RuleSetError
from engine.model import Check, Demand, FinPlate, Joint, Member
from rules import aisc360_checks as ck
from rules import aisc360_data as data
from rules.base import HINGE_AT_BOLTS, HINGE_AT_SUPPORT, RuleSet, hinge_positions
from rules.geometry import bolt_group_centroid_x, bolt_xy, plate_rectangle, web_region

__all__ = ["AISC360", "HINGE_SUFFIX", "Configuration", "configuration"]

HINGE_SUFFIX = {HINGE_AT_BOLTS: " [hinge at bolt line]", HINGE_AT_SUPPORT: " [hinge at support face]"}

# (name, clause) of every check this rule set can return, in report order.
_CHECKS: list[tuple[str, str]] = [
    ("bolt shear", "AISC 360-16 J3.6, Table J3.2; Manual Part 7 ICR method (Table 7-6), Part 10 Table 10-9"),
    ("bolt bearing on plate", "AISC 360-16 J3.10(a), Eq. J3-6a; Manual Part 7 (ICR)"),
    ("bolt tear-out in plate", "AISC 360-16 J3.10(b), Eq. J3-6c; Manual Part 7 (ICR)"),
    ("bolt bearing on beam web", "AISC 360-16 J3.10(a), Eq. J3-6a; Manual Part 7 (ICR)"),
    ("bolt tear-out in beam web", "AISC 360-16 J3.10(b), Eq. J3-6c; Manual Part 7 (ICR)"),
    ("bolt group strength", "AISC 360-16 J3.6, J3.10; Manual Part 7 (least of shear, bearing, tear-out per bolt)"),
    ("plate shear yield", "AISC 360-16 J4.2(a), Eq. J4-3"),
    ("plate shear rupture", "AISC 360-16 J4.2(b), Eq. J4-4"),
    ("plate block shear", "AISC 360-16 J4.3, Eq. J4-5"),
    ("plate bending", "AISC 360-16 F11.1; Manual Part 9 (flexural rupture)"),
    ("plate lateral-torsional buckling", "AISC 360-16 F11.2"),
    ("plate shear and bending interaction", "AISC Manual 15th ed. Part 10, Eq. 10-5"),
    ("plate tension yield", "AISC 360-16 J4.1(a), Eq. J4-1 (tie force N > 0)"),
    ("plate tension rupture", "AISC 360-16 J4.1(b), Eq. J4-2 (tie force N > 0)"),
    ("beam web shear", "AISC 360-16 G2.1 (uncoped) / J4.2(a) (coped)"),
    ("beam web shear rupture", "AISC 360-16 J4.2(b), Eq. J4-4"),
    ("beam web block shear", "AISC 360-16 J4.3, Eq. J4-5 (top-coped web)"),
    ("coped section bending", "AISC Manual 15th ed. Part 9 (flexural yielding and local buckling at the cope)"),
    ("weld", "AISC 360-16 J2.4, Eq. J2-3, Table J2.5"),
    ("weld stronger than plate", "AISC Manual 15th ed. Part 10 (w ≥ 5/8 tp, both sides)"),
    ("weld size minimum", "AISC 360-16 J2.2b, Table J2.4"),
    ("support local shear", "AISC 360-16 J4.2(b); AISC Manual 15th ed. Part 9"),
    ("bolt pitch minimum", "AISC 360-16 J3.3 (2-2/3 d)"),
    ("bolt pitch maximum", "AISC 360-16 J3.5(a) (24 t ≤ 12 in.)"),
    ("bolt gauge minimum", "AISC 360-16 J3.3 (2-2/3 d)"),
    ("edge distance minimum (plate)", "AISC 360-16 J3.4, Tables J3.4 and J3.5"),
    ("edge distance minimum (beam web)", "AISC 360-16 J3.4, Tables J3.4 and J3.5"),
    ("edge distance maximum", "AISC 360-16 J3.5 (12 t ≤ 6 in.)"),
    ("plate depth to beam depth", "common practice (Manual Part 10: connection length ≥ T/2)"),
    ("bolt group within clear web depth", "common practice (plate and bolts between the web fillets)"),
    ("plate thickness for rotation", "AISC Manual 15th ed. Part 10, Table 10-9 (conventional) / tmax (extended)"),
    ("clearance to support", "common practice (1/2 in. setback)"),
]
_CLAUSE = dict(_CHECKS)
_HINGED = {
    "bolt shear", "bolt bearing on plate", "bolt tear-out in plate", "bolt bearing on beam web",
    "bolt tear-out in beam web", "bolt group strength", "plate bending", "plate lateral-torsional buckling",
    "plate shear and bending interaction", "coped section bending", "weld", "support local shear",
}


@dataclass(frozen=True)
class Configuration:
    """The single-plate configuration of the AISC Manual Part 10: ``kind`` is ``"conventional"`` or
    ``"extended"``; ``e_over_a`` and ``tmax_offset`` (mm, added to db/2; ``None`` = no limit) come
    from Table 10-9 for a conventional plate; ``reasons`` say why a plate is extended."""

    kind: str
    e_over_a: float | None
    tmax_offset: float | None
    reasons: tuple[str, ...]


def configuration(plate: FinPlate, d_bolt: float) -> Configuration:
    """Classify ``plate`` per the AISC Manual 15th ed. Part 10 conventional dimensional limits
    (``d_bolt`` mm) and look its row up in Table 10-9."""
    sp = data.factors()["single_plate"]
    hole = plate.bolts.hole
    reasons = []
    if plate.lines != 1:
        reasons.append(f"{plate.lines} vertical lines of bolts (conventional: one)")
    if not sp["conventional_n_min"] <= plate.rows <= sp["conventional_n_max"]:
        reasons.append(f"{plate.rows} bolts in the row (conventional: 2 to 12)")
    if plate.a > data.inch(sp["conventional_a_max_in"]) + 1e-6:
        reasons.append(f"a = {plate.a:.0f} mm > 3-1/2 in. ({data.inch(sp['conventional_a_max_in']):.0f} mm)")
    if hole not in ("standard", "short-slot"):
        reasons.append(f"{hole} holes (conventional: standard or short-slotted)")
    leh_min = sp["conventional_leh_min_d"] * d_bolt
    if min(plate.plate_side_edge, plate.beam_end_edge) < leh_min - 1e-6:
        reasons.append(f"horizontal edge distance < 2 db = {leh_min:.0f} mm on plate or beam web")
    if reasons:
        return Configuration("extended", None, None, tuple(reasons))
    for row in data.factors()["table_10_9"]:
        if row["n_min"] <= plate.rows <= row["n_max"] and row["hole"] == hole:
            off = row["tmax_offset_in"]
            return Configuration("conventional", float(row["e_over_a"]),
                                 None if off == "none" else data.inch(off), ())
    raise RuleSetError(f"Manual Table 10-9 has no row for {plate.rows} bolts in {hole} holes")  # pragma: no cover


def _named(name: str, hinge: str | None) -> str:
    return name + (HINGE_SUFFIX[hinge] if hinge else "")


class AISC360(RuleSet):
    """ANSI/AISC 360-16 (LRFD) with the AISC Manual 15th ed. single-plate practice."""

    code_id = "aisc360"
    title = "ANSI/AISC 360-16 Specification for Structural Steel Buildings (LRFD), AISC Steel Construction Manual 15th ed."

    # -- public capacity functions -----------------------------------------------------------

    def bolt_shear_capacity(
        self, size: str, grade: str, threads_in_shear_plane: bool = True, shear_planes: int = 1
    ) -> float:
        """φRn = φ Fnv Ab (N) of one bolt, AISC 360-16 J3.6 / Table J3.2 (φ = 0.75); ``size`` in
        inches as the trade writes it ("3/4", "1-1/8"), ``grade`` "A325", "A490", "F3125 Gr A325",
        "Group A", ... Raises RuleSetError for an unknown size or grade."""
        if int(shear_planes) < 1:
            raise RuleSetError(f"shear_planes must be 1 or more, got {shear_planes!r}")
        b = data.bolt_size(size)
        phi = data.bolts()["factors"]["phi_shear"]
        return ck.phi_rn_shear(data.Fnv(grade, threads_in_shear_plane), b.Ab, int(shear_planes), phi)

    def fillet_weld_capacity(self, leg_mm: float, electrode: str) -> float:
        """φrn (N per mm of one fillet weld), AISC 360-16 J2.4 / Table J2.5:
        φ 0.60 FEXX (w/√2), φ = 0.75, no directional increase. Raises RuleSetError for an unknown
        electrode or a leg that is not positive."""
        if not leg_mm > 0:
            raise RuleSetError(f"fillet weld leg must be positive (mm), got {leg_mm!r}")
        w = data.materials()["weld"]
        return w["phi"] * w["Fnw_ratio"] * data.electrode_FEXX(electrode) * leg_mm * w["throat_ratio"]

    def check_list(self) -> list[tuple[str, str]]:
        return list(_CHECKS)

    def data_sources(self) -> list[str]:
        return [
            data.bolts()["source"]["standard"],
            data.materials()["source"]["standard"],
            data.factors()["source"]["standard"],
            data.factors()["load_combination"]["source"],
        ]

    def ultimate_combination(self) -> dict[str, object]:
        lc = data.factors()["load_combination"]
        return {"name": lc["name"], "dead": float(lc["dead"]), "live": float(lc["live"]),
                "dead_only": float(lc["dead_only"]), "source": lc["source"]}

    def web_shear_capacity(self, member: Member) -> float | None:
        """φv Vn = φv 0.6 Fy d tw Cv1 of a rolled I web (AISC 360-16 G2.1), in N; ``None`` when the
        section or steel is unknown or not in the Manual's tables."""
        s = member.section
        if s.kind not in ("I", "channel") or None in (s.depth, s.web_thickness) or member.steel is None:
            return None
        try:
            Fy = data.steel_strengths(member.steel.grade)[0]
        except RuleSetError:
            Fy = member.steel.fy
        h = s.clear_web_depth or (s.depth - 2.0 * (s.flange_thickness or 0.0))
        c = ck.web_shear_G2("beam web shear", 0.0, s.depth, s.web_thickness, h, Fy, data.ksi(data.factors()["material"]["E"]))
        return None if c.incomplete else c.capacity

    # -- the fin-plate checks ------------------------------------------------------------------

    def check_fin_plate(
        self,
        joint: Joint,
        demand: Demand,
        plate: FinPlate,
        beam: Member,
        support: Member | None,
        policy: str = "conservative",
    ) -> list[Check]:
        """Every check of the single-plate connection at ``joint`` under ``demand`` (N), for each
        hinge position of :func:`rules.base.hinge_positions`; hinge-dependent checks carry the
        hinge in their name. Bad bolt or electrode data give incomplete checks, never exceptions."""
        hinges = hinge_positions(joint.stiffness, policy)

        def all_incomplete(why: str) -> list[Check]:
            return [ck.incomplete_check(_named(n, h), c, f"{why} ({c})", "N")
                    for n, c in _CHECKS for h in (hinges if n in _HINGED else (None,))]

        if plate.rows < 1 or plate.lines < 1 or not (plate.thickness > 0 and plate.depth > 0 and plate.a >= 0):
            return all_incomplete("plate layout not usable: rows, lines, thickness and depth must be positive")
        if not (plate.steel.fy > 0 and plate.steel.fu > 0):
            return all_incomplete("plate steel strengths unknown")
        try:
            b = data.bolt_size(plate.bolts.size)
            fnv = data.Fnv(plate.bolts.grade, plate.bolts.threads_in_shear_plane)
            b.hole(plate.bolts.hole)
        except RuleSetError as exc:
            return all_incomplete(f"bolt data not usable: {exc}")
        return _FinPlateChecks(joint, demand, plate, beam, support, b, fnv).run(hinges)


class _FinPlateChecks:
    """The per-joint working of :meth:`AISC360.check_fin_plate` (geometry, demands, checks)."""

    def __init__(self, joint: Joint, demand: Demand, plate: FinPlate, beam: Member, support: Member | None,
                 b: data.BoltData, fnv: float) -> None:
        self.joint, self.demand, self.p, self.beam, self.support, self.b = joint, demand, plate, beam, support, b
        self.f = data.factors()
        self.phi = self.f["phi"]
        self.E = data.ksi(self.f["material"]["E"])
        # magnitudes for the strength checks; the signs (V > 0 downward load on the beam end, N > 0
        # tension pulling the beam away from the support) set the bolt force directions
        self.V = abs(float(demand.V))
        self.N = abs(float(demand.N))
        self.v_sign = -1.0 if demand.V < 0 else 1.0
        self.n_sign = -1.0 if demand.N < 0 else 1.0
        self.tie = float(demand.N) > 0
        self.xy = bolt_xy(plate)
        self.xc = bolt_group_centroid_x(plate)
        self.n = plate.n_bolts
        self.t = plate.thickness
        self.Fy, self.Fu = plate.steel.fy, plate.steel.fu
        self.hole_w, self.hole_l = b.hole(plate.bolts.hole)
        if plate.bolts.hole_diameter and plate.bolts.hole == "standard":
            self.hole_w = self.hole_l = float(plate.bolts.hole_diameter)
        self.allow = data.inch(self.f["bearing"]["net_hole_allowance_in"])
        self.config = configuration(plate, b.d)
        # bolt shear strength of one bolt (long joint reduction, Table J3.2 footnote [b])
        bf = data.bolts()["factors"]
        length = (plate.rows - 1) * plate.pitch
        self.k_long = bf["long_joint_factor"] if length > data.inch(bf["long_joint_length_in"]) else 1.0
        self.phi_rn_v = ck.phi_rn_shear(fnv, b.Ab, 1, bf["phi_shear"], self.k_long)
        self.fnv = fnv
        s = beam.section
        self.tw = s.web_thickness
        self.db = s.depth
        self.beam_steel = beam.steel
        copes = joint.geometry.copes
        self.cope_top = next((c for c in copes if c.where == "top"), None)
        self.cope_bot = next((c for c in copes if c.where == "bottom"), None)
        self.gap = plate.a - plate.beam_end_edge  # support face to beam end (mm)

    # -- demands per hinge ---------------------------------------------------------------------

    def e_bolts(self, hinge: str) -> float:
        """Eccentricity of the load on the bolt group (mm, towards the support)."""
        if self.config.kind == "conventional" and hinge == HINGE_AT_BOLTS:
            return self.config.e_over_a * self.p.a
        return self.xc

    def ecc_note(self, hinge: str) -> str:
        c = self.config
        if c.kind == "conventional":
            src = ("Manual Table 10-9 (rigid support)" if hinge == HINGE_AT_BOLTS
                   else "full distance a (flexible support, hinge at support face)")
            return f"conventional configuration, e = {self.e_bolts(hinge):.1f} mm per {src}"
        return f"extended configuration ({'; '.join(c.reasons)}), e = a = {self.e_bolts(hinge):.1f} mm (Manual Part 10)"

    def C(self, e: float) -> tuple[float, str]:
        """ICR coefficient for the resultant of V and N at eccentricity e (mm)."""
        angle = math.degrees(math.atan2(self.N, self.V)) if (self.V or self.N) else 0.0
        try:
            from engine.boltgroup import icr_coefficient

            return float(icr_coefficient(self.xy, -e, angle)), "ICR"
        except Exception as exc:  # noqa: BLE001 - a solver failure degrades to the elastic method
            from engine.boltgroup import elastic_coefficient

            return float(elastic_coefficient(self.xy, -e, angle)), f"elastic (ICR not available: {exc})"

    def bolt_forces(self, e: float) -> np.ndarray:
        """Elastic-method bolt forces (n, 2) in N on the plate for the hinge's eccentricity (a unit
        downward load when the joint carries no load, for the force directions)."""
        from engine.boltgroup import elastic_bolt_forces

        V, N = (self.V * self.v_sign, self.N * self.n_sign) if (self.V or self.N) else (1.0, 0.0)
        return elastic_bolt_forces(self.xy, N, -V, V * e)

    def M_plate(self, hinge: str) -> tuple[float, str]:
        """Plate moment (N·mm) at its critical section for the hinge position."""
        if hinge == HINGE_AT_BOLTS:
            return self.V * self.xc, "at the weld (gross section)"
        return self.V * self.p.a, "at the bolt line (net section)"

    # -- the checks ----------------------------------------------------------------------------

    def run(self, hinges: tuple[str, ...]) -> list[Check]:
        out: list[Check] = []
        for h in hinges:
            out += self.bolt_checks(h)
        out += [self.plate_shear_yield(), self.plate_shear_rupture(), self.plate_block_shear()]
        for h in hinges:
            out += self.plate_flexure_checks(h)
        if self.tie:
            out += self.tie_checks()
        out += self.web_checks()
        for h in hinges:
            out += self.coped_checks(h)
        for h in hinges:
            out += self.weld_checks(h)
        out += [self.weld_stronger(), self.weld_min()]
        for h in hinges:
            out.append(self.support_check(h))
        out += self.detailing()
        return out

    def bolt_checks(self, h: str) -> list[Check]:
        p, b = self.p, self.b
        e = self.e_bolts(h)
        C, method = self.C(e)
        R = math.hypot(self.V, self.N)
        note = f"{self.ecc_note(h)}; {method} C = {C:.3f}, φrn = {self.phi_rn_v / 1000:.1f} kN"
        if self.k_long < 1.0:
            note += f"; long joint: Fnv × {self.k_long}"
        out = [ck.bolt_shear_group(_named("bolt shear", h), R, C, self.phi_rn_v, note)]
        F = self.bolt_forces(e)
        phi_b = self.phi["bearing"]
        # plate: force on the plate along +F
        lc_p = ck.clear_distance_along(self.xy, F, plate_rectangle(p), self.hole_w, self.hole_l)
        br_p = np.full(self.n, ck.phi_rn_bearing(b.d, self.t, self.Fu, phi_b))
        to_p = ck.phi_rn_tearout(lc_p, self.t, self.Fu, phi_b)
        out.append(ck.bearing_group(_named("bolt bearing on plate", h), _CLAUSE["bolt bearing on plate"], R, C, br_p,
                                    f"{method} C = {C:.3f}"))
        out.append(ck.bearing_group(_named("bolt tear-out in plate", h), _CLAUSE["bolt tear-out in plate"], R, C, to_p,
                                    f"{method} C = {C:.3f}; least lc = {lc_p.min():.1f} mm"))
        per_bolt = np.minimum(np.full(self.n, self.phi_rn_v), np.minimum(br_p, to_p))
        web_ok = self.tw is not None and self.tw > 0 and self.db is not None and self.beam_steel is not None
        if web_ok:
            Fu_b = self.beam_steel.fu
            rect = web_region(p, self.web_depth())
            lc_w = ck.clear_distance_along(self.xy, -F, rect, self.hole_w, self.hole_l)
            br_w = np.full(self.n, ck.phi_rn_bearing(b.d, self.tw, Fu_b, phi_b))
            to_w = ck.phi_rn_tearout(lc_w, self.tw, Fu_b, phi_b)
            out.append(ck.bearing_group(_named("bolt bearing on beam web", h), _CLAUSE["bolt bearing on beam web"], R, C,
                                        br_w, f"{method} C = {C:.3f}"))
            out.append(ck.bearing_group(_named("bolt tear-out in beam web", h), _CLAUSE["bolt tear-out in beam web"], R,
                                        C, to_w, f"{method} C = {C:.3f}; least lc = {lc_w.min():.1f} mm"))
            per_bolt = np.minimum(per_bolt, np.minimum(br_w, to_w))
            out.append(ck.bearing_group(_named("bolt group strength", h), _CLAUSE["bolt group strength"], R, C, per_bolt,
                                        f"{method} C = {C:.3f}"))
        else:
            why = "beam web thickness, depth or steel unknown"
            for n in ("bolt bearing on beam web", "bolt tear-out in beam web", "bolt group strength"):
                out.append(ck.incomplete_check(_named(n, h), _CLAUSE[n], f"{why} ({_CLAUSE[n]})", "N"))
        return out

    def web_depth(self) -> float:
        """Depth of web below its top edge (mm): beam depth less the copes."""
        d = float(self.db or 0.0)
        return d - sum(c.depth for c in (self.cope_top, self.cope_bot) if c is not None)

    # plate ---------------------------------------------------------------------------------

    def plate_shear_yield(self) -> Check:
        return ck.shear_yield("plate shear yield", self.V, self.p.depth * self.t, self.Fy, self.phi["shear_yield"])

    def plate_shear_rupture(self) -> Check:
        Anv = (self.p.depth - self.p.rows * (self.hole_w + self.allow)) * self.t
        return ck.shear_rupture("plate shear rupture", self.V, Anv, self.Fu, self.phi["shear_rupture"])

    def plate_block_shear(self) -> Check:
        p, t = self.p, self.t
        Agv = (p.depth - p.plate_end_edge) * t
        Anv = Agv - (p.rows - 0.5) * (self.hole_w + self.allow) * t
        Ant = (p.plate_side_edge + (p.lines - 1) * p.gauge - (p.lines - 0.5) * (self.hole_l + self.allow)) * t
        Ubs = 1.0 if p.lines == 1 else 0.5
        return ck.block_shear("plate block shear", self.V, Agv, Anv, Ant, self.Fy, self.Fu, Ubs, self.phi["block_shear"])

    def plate_flexure_checks(self, h: str) -> list[Check]:
        p, t = self.p, self.t
        M, where = self.M_plate(h)
        Z = ck.Z_rect(t, p.depth)
        if h == HINGE_AT_SUPPORT:
            y = self.xy[: p.rows, 1] + p.depth / 2.0  # first line, from plate mid-depth
            Znet = ck.Z_net_rect(t, p.depth, y, self.hole_w + self.allow)
            bend = ck.plate_bending(_named("plate bending", h), M, Z, self.Fy, Znet, self.Fu,
                                    self.phi["flexure"], self.phi["flexural_rupture"], where)
        else:
            bend = ck.plate_bending(_named("plate bending", h), M, Z, self.Fy, phi_y=self.phi["flexure"], where=where)
        ltb = ck.plate_ltb_F11(_named("plate lateral-torsional buckling", h), M, p.a, p.depth, t, self.Fy, self.E,
                               1.0, self.phi["flexure"])
        Vc = self.phi["shear_yield"] * 0.60 * self.Fy * p.depth * t
        Mc = self.phi["flexure"] * self.Fy * Z
        inter = ck.shear_flexure_interaction(_named("plate shear and bending interaction", h), self.V, M, Vc, Mc)
        return [bend, ltb, inter]

    def tie_checks(self) -> list[Check]:
        p, t = self.p, self.t
        Ag = p.depth * t
        An = (p.depth - p.rows * (self.hole_w + self.allow)) * t
        return [ck.tension_yield("plate tension yield", self.N, Ag, self.Fy, self.phi["tension_yield"]),
                ck.tension_rupture("plate tension rupture", self.N, min(An, 0.85 * Ag), self.Fu,
                                   self.phi["tension_rupture"])]

    # beam web ------------------------------------------------------------------------------

    def web_checks(self) -> list[Check]:
        s = self.beam.section
        names = ("beam web shear", "beam web shear rupture")
        if self.tw is None or self.db is None or self.beam_steel is None:
            out = [ck.incomplete_check(n, _CLAUSE[n], f"beam web thickness, depth or steel unknown ({_CLAUSE[n]})", "N")
                   for n in names]
            if self.cope_top is not None:
                out.append(ck.incomplete_check("beam web block shear", _CLAUSE["beam web block shear"],
                                               "beam web thickness, depth or steel unknown", "N"))
            return out
        Fy_b, Fu_b = self.beam_steel.fy, self.beam_steel.fu
        tw, p = self.tw, self.p
        hrem = self.web_depth()
        out = []
        if self.cope_top is None and self.cope_bot is None:
            h = s.clear_web_depth or (self.db - 2.0 * (s.flange_thickness or 0.0))
            out.append(ck.web_shear_G2("beam web shear", self.V, self.db, tw, h, Fy_b, self.E))
        else:
            out.append(ck.shear_yield("beam web shear", self.V, hrem * tw, Fy_b, self.phi["shear_yield"]))
        Anv = (hrem - p.rows * (self.hole_w + self.allow)) * tw
        out.append(ck.shear_rupture("beam web shear rupture", self.V, Anv, Fu_b, self.phi["shear_rupture"]))
        if self.cope_top is not None:
            Agv = (p.beam_top_edge + (p.rows - 1) * p.pitch) * tw
            Anv_b = Agv - (p.rows - 0.5) * (self.hole_w + self.allow) * tw
            Ant = (p.beam_end_edge + (p.lines - 1) * p.gauge - (p.lines - 0.5) * (self.hole_l + self.allow)) * tw
            Ubs = 1.0 if p.lines == 1 else 0.5
            out.append(ck.block_shear("beam web block shear", self.V, Agv, Anv_b, Ant, Fy_b, Fu_b, Ubs,
                                      self.phi["block_shear"]))
        return out

    def coped_checks(self, h: str) -> list[Check]:
        out = []
        copes = [c for c in (self.cope_top, self.cope_bot) if c is not None]
        if not copes:
            return out
        name = _named("coped section bending", h)
        clause = _CLAUSE["coped section bending"]
        if self.tw is None or self.db is None or self.beam_steel is None:
            return [ck.incomplete_check(name, clause, "beam web thickness, depth or steel unknown", "N·mm")]
        s = self.beam.section
        ho = self.web_depth()
        c_len = max(c.length for c in copes)
        double = len(copes) == 2
        Snet = ck.coped_Snet(ho, self.tw, s.width, s.flange_thickness, double)
        if self.cope_top is not None:
            Fcr, lam = ck.coped_Fcr(ho, c_len, self.tw, self.beam_steel.fy, self.f["coped"])
            lam_note = f", λ = {lam:.2f}"
        else:
            Fcr, lam_note = self.beam_steel.fy, ", bottom cope only: compression flange intact, Fcr = Fy"
        e = c_len - self.p.beam_end_edge if h == HINGE_AT_BOLTS else c_len + self.gap
        e = max(e, 0.0)
        note = f"e = {e:.0f} mm from the cope face, ho = {ho:.0f} mm, Fcr = {Fcr:.0f} MPa{lam_note}"
        out.append(ck.coped_section_bending(name, self.V * e, Snet, Fcr, self.phi["flexure"], note))
        return out

    # weld and support ------------------------------------------------------------------------

    def weld_lines(self) -> int:
        return 2 if self.p.weld.both_sides else 1

    def M_weld(self, h: str) -> float:
        return self.V * self.xc if h == HINGE_AT_BOLTS else 0.0

    def weld_checks(self, h: str) -> list[Check]:
        name = _named("weld", h)
        try:
            FEXX = data.electrode_FEXX(self.p.weld.electrode)
        except RuleSetError as exc:
            return [ck.incomplete_check(name, _CLAUSE["weld"], str(exc), "N")]
        w = data.materials()["weld"]
        return [ck.weld_strength(name, self.V, self.N, self.M_weld(h), self.p.depth, self.p.weld.leg, FEXX,
                                 self.weld_lines(), w["phi"])]

    def weld_stronger(self) -> Check:
        ratio = self.f["single_plate"]["weld_to_plate_ratio"]
        return ck.weld_stronger_than_plate("weld stronger than plate", self.p.weld.leg, self.t, ratio,
                                           self.p.weld.both_sides)

    def support_thickness(self) -> tuple[float | None, str]:
        s = self.support.section if self.support is not None else None
        if s is None or not s.known:
            return None, "support or its section unknown"
        kind = self.joint.kind
        if kind == "column-flange":
            return s.flange_thickness, "column flange"
        if kind in ("column-web", "beam-web"):
            return s.web_thickness, "web"
        if s.kind in ("RHS", "CHS"):
            return s.web_thickness, "hollow-section wall"
        return s.web_thickness, "web (support face not known: web assumed)"

    def weld_min(self) -> Check:
        ts, _ = self.support_thickness()
        t_thin = min(self.t, ts) if ts else self.t
        return ck.weld_min_size("weld size minimum", self.p.weld.leg, data.min_fillet_leg(t_thin), t_thin)

    def support_check(self, h: str) -> Check:
        name = _named("support local shear", h)
        clause = _CLAUSE["support local shear"]
        ts, where = self.support_thickness()
        if ts is None or not ts > 0 or self.support is None or self.support.steel is None:
            return ck.incomplete_check(name, clause, f"{where if ts is None else 'support steel unknown'} ({clause})", "N")
        f_peak = ck.line_weld_peak(self.V, self.N, self.M_weld(h), self.p.depth, self.weld_lines())
        both = self.joint.geometry.back_to_back is not None
        c = ck.support_local_shear(name, math.hypot(self.V, self.N), f_peak, ts, self.support.steel.fu, both,
                                   self.p.depth, self.weld_lines(), self.phi["shear_rupture"])
        return Check(c.name, c.clause, c.demand, c.capacity, c.unit, c.utilisation, c.passed,
                     f"{c.note} ({where})", c.incomplete)

    # detailing -------------------------------------------------------------------------------

    def detailing(self) -> list[Check]:
        p, b, sp, spc = self.p, self.b, self.f["single_plate"], self.f["spacing"]
        out = []
        d = b.d
        min_s = spc["min_pitch_d"] * d
        out.append(ck.make_min_check("bolt pitch minimum", _CLAUSE["bolt pitch minimum"], min_s, p.pitch, "mm",
                                     f"3d = {spc['preferred_pitch_d'] * d:.0f} mm preferred"))
        t_thin = min(self.t, self.tw) if self.tw else self.t
        max_s = min(spc["max_pitch_t"] * t_thin, data.inch(spc["max_pitch_in"]))
        spacing = max(p.pitch, p.gauge) if p.lines > 1 else p.pitch
        out.append(ck.make_max_check("bolt pitch maximum", _CLAUSE["bolt pitch maximum"], spacing, max_s, "mm"))
        if p.lines > 1:
            out.append(ck.make_min_check("bolt gauge minimum", _CLAUSE["bolt gauge minimum"], min_s, p.gauge, "mm"))
        # minimum edge distances (Table J3.4 + Table J3.5 C2): slots horizontal, so C2 of a slot
        # applies to the vertical (side/end) edges, an oversize increment to every edge
        hole = p.bolts.hole
        c2_all = b.C2_ovs if hole == "oversize" else 0.0
        c2_side = {"short-slot": b.C2_ssl, "long-slot": 0.75 * d}.get(hole, 0.0)
        bottom = p.depth - p.plate_end_edge - (p.rows - 1) * p.pitch
        req_v, req_h = b.edge_min + c2_all, b.edge_min + c2_all + c2_side
        plate_edges = [(req_v, p.plate_end_edge, "top"), (req_v, bottom, "bottom"), (req_h, p.plate_side_edge, "side")]
        out.append(self._worst_min("edge distance minimum (plate)", plate_edges))
        web_edges = [(req_h, p.beam_end_edge, "beam end")]
        if self.cope_top is not None:
            web_edges.append((req_v, p.beam_top_edge, "top cope"))
        if self.cope_bot is not None and self.db is not None:
            web_edges.append((req_v, self.web_depth() - p.beam_top_edge - (p.rows - 1) * p.pitch, "bottom cope"))
        out.append(self._worst_min("edge distance minimum (beam web)", web_edges))
        # maximum edge distance J3.5: 12 t <= 6 in.
        lim_p = min(spc["max_edge_t"] * self.t, data.inch(spc["max_edge_in"]))
        maxes = [(p.plate_end_edge, lim_p, "plate top"), (bottom, lim_p, "plate bottom"), (p.plate_side_edge, lim_p, "plate side")]
        if self.tw:
            maxes.append((p.beam_end_edge, min(spc["max_edge_t"] * self.tw, data.inch(spc["max_edge_in"])), "beam end"))
        worst = max(maxes, key=lambda m: m[0] / m[1])
        out.append(ck.make_max_check("edge distance maximum", _CLAUSE["edge distance maximum"], worst[0], worst[1], "mm",
                                     worst[2]))
        out += self.depth_checks()
        out.append(self.rotation_check())
        out.append(ck.make_min_check("clearance to support", _CLAUSE["clearance to support"],
                                     data.inch(sp["setback_min_in"]), self.gap, "mm",
                                     "beam end to support face"))
        return out

    def _worst_min(self, name: str, edges: list[tuple[float, float, str]]) -> Check:
        req, prov, where = max(edges, key=lambda e: e[0] / e[1] if e[1] > 0 else math.inf)
        return ck.make_min_check(name, _CLAUSE[name], req, prov, "mm", f"governing: {where} edge")

    def depth_checks(self) -> list[Check]:
        p, s = self.p, self.beam.section
        n1, n2 = "plate depth to beam depth", "bolt group within clear web depth"
        T = s.clear_web_depth
        if T is None or self.db is None:
            why = "beam depth, flange thickness or section kind unknown"
            return [ck.incomplete_check(n1, _CLAUSE[n1], why, "mm"), ck.incomplete_check(n2, _CLAUSE[n2], why, "mm")]
        frac = self.f["single_plate"]["plate_depth_min_T"]
        out = [ck.make_min_check(n1, _CLAUSE[n1], frac * T, p.depth, "mm", f"T = {T:.0f} mm")]
        k = (self.db - T) / 2.0  # flange + root radius
        hrem = self.web_depth()
        top_lim = 0.0 if self.cope_top is not None else k
        bot_lim = 0.0 if self.cope_bot is not None else k
        # extents measured down from the web's top edge: the plate where the web is uncoped (it must
        # clear the fillet), the bolt holes where it is coped
        plate_top = p.beam_top_edge - p.plate_end_edge
        hole_top = p.beam_top_edge - self.hole_w / 2.0
        hole_bot = p.beam_top_edge + (p.rows - 1) * p.pitch + self.hole_w / 2.0
        top = hole_top if self.cope_top is not None else plate_top
        bot = hole_bot if self.cope_bot is not None else plate_top + p.depth
        avail = hrem - top_lim - bot_lim
        need = max(bot - top_lim, avail + (top_lim - top)) if top < top_lim else bot - top_lim
        out.append(ck.make_max_check(n2, _CLAUSE[n2], need, avail, "mm",
                                     "occupied depth from the top of the clear web vs clear depth"))
        return out

    def rotation_check(self) -> Check:
        name = "plate thickness for rotation"
        clause = _CLAUSE[name]
        c, p = self.config, self.p
        if c.kind == "conventional":
            if c.tmax_offset is None:
                return ck.make_max_check(name, clause + ", no limit for this row", self.t, math.inf, "mm",
                                         "Table 10-9: no thickness limit for 2-5 bolts in short-slotted holes")
            tmax = self.b.d / 2.0 + c.tmax_offset
            t_use = min(self.t, self.tw) if self.tw else self.t
            which = "beam web" if self.tw and self.tw < self.t else "plate"
            return ck.make_max_check(name, clause, t_use, tmax, "mm",
                                     f"conventional: plate or beam web ≤ db/2 {'+' if c.tmax_offset > 0 else '−'} 1/16 in.; "
                                     f"governing element: {which}")
        Cp = ck.moment_only_coefficient(self.xy, self.f["single_plate"]["crawford_kulak_dmax_in"])
        tmax = ck.tmax_extended(self.fnv, self.b.Ab, Cp, self.Fy, p.depth, self.f["single_plate"]["mmax_fnv_divisor"])
        return ck.make_max_check(name, clause, self.t, tmax, "mm",
                                 f"extended: tmax = 6 Mmax/(Fy d²), Mmax = (Fnv/0.90) Ab C', C' = {Cp:.1f} mm")
