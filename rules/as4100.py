"""AS 4100 rule set (``code_id = "as4100"``) for bolted fin-plate (web side plate) connections.

Edition followed: **AS 4100-1998 (R2016) Steel structures incorporating Amendment No. 1 (2012)**;
every clause number below is that edition's. Design model: the Australian web side plate practice
(ASI Structural Steel Connections Series, web side plate design guide): a plate shop-welded to the
support and bolted to the beam web, the hinge at the bolt line for a stiff support (bolts carry V;
plate and weld carry V·a) or at the support face for a flexible one (bolts carry V and V·a; weld
carries V). Bolt forces come from the elastic method (the usual Australian practice).

Units inside: mm, N, N·mm, MPa. Every check is a :class:`engine.model.Check`; a check whose inputs
are missing or outside its validity range is returned ``incomplete`` naming the clause, never an
exception.

**An aid to a competent engineer**: results must be checked by a competent structural engineer,
and the governing local code, the project specification and licensed practice take precedence.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import ClassVar

import numpy as np

from engine.errors import RuleSetError
from engine.model import Check, Demand, FinPlate, Joint, Member
from rules import as4100_checks as C
from rules import as4100_data as D
from rules.base import HINGE_AT_BOLTS, HINGE_AT_SUPPORT, RuleSet, hinge_positions
from rules.geometry import bolt_group_centroid_x, bolt_xy, edge_distance_along, plate_rectangle
from rules.tables import load_table

__all__ = ["AS4100", "HINGE_SUFFIX", "CHECKS"]

HINGE_SUFFIX = {
    HINGE_AT_BOLTS: " [hinge at bolt line]",
    HINGE_AT_SUPPORT: " [hinge at support face]",
}

CHECKS: tuple[tuple[str, str], ...] = (
    ("bolt shear", "AS 4100-1998 cl. 9.3.2.1 (AS 4100:2020 cl. 9.2.2.1), Table 9.3.2.1 (kr); elastic bolt group"),
    ("bolt bearing on plate", "AS 4100-1998 cl. 9.3.2.4 (AS 4100:2020 cl. 9.2.2.4): Vb = 3.2 df tp fup"),
    ("bolt tear-out in plate", "AS 4100-1998 cl. 9.3.2.4 (AS 4100:2020 cl. 9.2.2.4): Vb = ae tp fup"),
    ("bolt bearing on beam web", "AS 4100-1998 cl. 9.3.2.4 (AS 4100:2020 cl. 9.2.2.4): Vb = 3.2 df tp fup"),
    ("bolt tear-out in beam web", "AS 4100-1998 cl. 9.3.2.4 (AS 4100:2020 cl. 9.2.2.4): Vb = ae tp fup"),
    ("plate shear yield", "AS 4100 cl. 5.11.3 with Vu = 0.6 fy Aw (cl. 5.11.4): plate as a web, non-uniform shear"),
    ("plate shear rupture", "AS 4100 cl. 9.1.9 (net shear area, 0.6 fu Anv, φ = 0.75)"),
    ("plate block shear", "AS 4100 cl. 9.1.9: Rbs = 0.6 fu Anv + kbs fu Ant ≤ 0.6 fy Agv + kbs fu Ant"),
    ("plate bending", "AS 4100 cl. 5.2 (Ms = fy Ze, Ze = Z elastic), gross at weld / net at bolt line"),
    ("plate lateral-torsional buckling", "AS 4100 cl. 5.6.1.1 (rectangular plate, Iw = 0, αm = 1.0)"),
    ("beam web shear", "AS 4100 cl. 5.11.4, 5.11.5.1 (gross; coped: cl. 5.11.3); cl. 9.1.9 net shear (φ = 0.75)"),
    ("beam web block shear", "AS 4100 cl. 9.1.9 (coped web)"),
    ("coped section bending", "AS 4100 cl. 5.2 (remaining section, Table 5.2 outstand slenderness)"),
    ("weld", "AS 4100-1998 cl. 9.7.3.10 (AS 4100:2020 cl. 9.6.3.10): φvw = φ 0.6 fuw tt kr"),
    ("weld stronger than plate", "common practice: weld pair ≥ 0.9 fy tp of the plate"),
    ("support local shear", "AS 4100 cl. 5.11.4 applied to the support element (common practice)"),
    ("plate tension (tie)", "AS 4100 cl. 7.2: φNt = 0.9 min(Ag fy, 0.85 kt An fu)"),
    ("beam web tension (tie)", "AS 4100 cl. 7.2: φNt = 0.9 min(Ag fy, 0.85 kt An fu)"),
    ("bolt pitch minimum", "AS 4100 cl. 9.6.1: 2.5 df"),
    ("bolt pitch maximum", "AS 4100 cl. 9.6.3(b): min(4 tp + 100, 200) mm"),
    ("bolt gauge minimum", "AS 4100 cl. 9.6.1: 2.5 df"),
    ("bolt gauge maximum", "AS 4100 cl. 9.6.3: min(15 tp, 200) mm"),
    ("edge distance minimum (plate)", "AS 4100 cl. 9.6.2, Table 9.6.2"),
    ("edge distance minimum (beam web)", "AS 4100 cl. 9.6.2, Table 9.6.2"),
    ("edge distance maximum", "AS 4100 cl. 9.6.4: min(12 tp, 150) mm"),
    ("plate depth to beam depth", "common practice (ASI web side plate guide): dp ≥ 0.6 d"),
    ("bolt group within clear web depth", "common practice: plate between the root radii / copes"),
    ("plate thickness for rotation", "common practice (ASI web side plate guide): tp ≤ 10 mm"),
    ("clearance to support", "common practice: beam end ≥ 10 mm clear of the support face"),
)

_CLAUSE = dict(CHECKS)


@dataclass(frozen=True)
class _Material:
    fy: float
    fu: float
    note: str


@dataclass(frozen=True)
class _Beam:
    d: float
    tw: float
    tf: float | None
    bf: float | None
    r: float
    fy: float
    fu: float
    cope_top: float
    cope_bottom: float
    cope_length: float
    note: str


def _bolt_forces(xy: np.ndarray, Px: float, Py: float, Mz: float) -> np.ndarray:
    """Elastic bolt forces (n, 2) in N for loads at the pattern centroid (N, N·mm, counter-clockwise
    positive), from the shared mechanics :func:`engine.boltgroup.elastic_bolt_forces`."""
    from engine.boltgroup import elastic_bolt_forces

    return np.asarray(elastic_bolt_forces(xy, Px, Py, Mz), dtype=float)


def _dist_to_adjacent_holes(xy: np.ndarray, directions: np.ndarray, dh: float) -> np.ndarray:
    """Distance (mm) from each bolt centre, along its force direction, to the edge of the first
    other hole the ray meets (``inf`` if none): the "edge of an adjacent hole" of cl. 9.3.2.4."""
    xy = np.asarray(xy, dtype=float)
    d = np.asarray(directions, dtype=float)
    norm = np.hypot(d[:, 0], d[:, 1])
    out = np.full(len(xy), np.inf)
    ok = norm > 0
    if len(xy) < 2 or not ok.any():
        return out
    u = np.zeros_like(d)
    u[ok] = d[ok] / norm[ok, None]
    rel = xy[None, :, :] - xy[:, None, :]  # (i, j) vector from bolt i to bolt j
    along = rel[..., 0] * u[:, None, 0] + rel[..., 1] * u[:, None, 1]
    perp = np.abs(rel[..., 0] * u[:, None, 1] - rel[..., 1] * u[:, None, 0])
    rad = dh / 2.0
    hit = (along > 0) & (perp < rad) & ~np.eye(len(xy), dtype=bool) & ok[:, None]
    with np.errstate(invalid="ignore"):
        dist = np.where(hit, along - np.sqrt(np.maximum(rad**2 - perp**2, 0.0)), np.inf)
    return dist.min(axis=1)


class AS4100(RuleSet):
    """AS 4100-1998 (incl. Amdt 1 2012) checks of bolted fin-plate (web side plate) connections.

    ``plate_edge`` and ``web_edge`` name the edge preparation of AS 4100 Table 9.6.2 assumed for the
    fin plate and for the beam end / cope (the model does not say): defaults are the conservative
    "sheared or hand flame cut" for the plate and "rolled plate, machine flame cut, sawn or planed"
    for the beam end.
    """

    code_id: ClassVar[str] = "as4100"
    title: ClassVar[str] = "AS 4100-1998 (R2016) Steel structures, incl. Amendment No. 1 (2012)"

    def __init__(
        self,
        plate_edge: str = "sheared or hand flame cut",
        web_edge: str = "rolled plate, machine flame cut, sawn or planed",
    ) -> None:
        edges = D.factors()["edge_distance"]
        for edge in (plate_edge, web_edge):
            if edge not in edges:
                raise RuleSetError(
                    f"AS 4100 Table 9.6.2 has no edge type {edge!r}; use one of: {'; '.join(edges)}"
                )
        self.plate_edge = plate_edge
        self.web_edge = web_edge

    # ------------------------------------------------------------------ public capacities
    def bolt_shear_capacity(
        self, size: str, grade: str, threads_in_shear_plane: bool = True, shear_planes: int = 1
    ) -> float:
        """Design shear capacity φVf (N) of one bolt, AS 4100 cl. 9.3.2.1 with kr = 1.0:
        φVf = 0.8 × 0.62 fuf (nn Ac + nx Ao). With threads in the shear plane every plane is taken
        through the threads (nn = shear_planes), otherwise every plane through the shank."""
        if isinstance(shear_planes, bool) or not isinstance(shear_planes, int) or shear_planes < 1:
            raise RuleSetError(f"AS 4100: shear_planes must be a whole number ≥ 1, not {shear_planes!r}")
        bolt = D.bolt_data(size)
        fuf = D.bolt_fuf(grade)
        nn, nx = (shear_planes, 0) if threads_in_shear_plane else (0, shear_planes)
        return D.factors()["phi"]["bolt"] * C.Vf(fuf, bolt.Ac, bolt.Ao, nn, nx, 1.0)

    def fillet_weld_capacity(self, leg_mm: float, electrode: str) -> float:
        """Design capacity φvw (N per mm) of one equal-leg fillet weld, AS 4100 cl. 9.7.3.10:
        φ 0.6 fuw tt kr with tt = leg/√2, kr = 1.0, φ = 0.8 (SP) or 0.6 (GP, say "E48XX GP")."""
        try:
            leg = float(leg_mm)
        except (TypeError, ValueError) as exc:
            raise RuleSetError(f"AS 4100: fillet weld leg must be a number of mm, not {leg_mm!r}") from exc
        if not (leg > 0 and math.isfinite(leg)):
            raise RuleSetError(f"AS 4100: fillet weld leg must be a positive size in mm, not {leg_mm!r}")
        wm = D.weld_metal(electrode)
        return wm.phi * C.vw(wm.fuw, D.throat(leg), 1.0)

    def check_list(self) -> list[tuple[str, str]]:
        return list(CHECKS)

    def data_sources(self) -> list[str]:
        out = []
        for name in ("as4100_bolts", "as4100_steel", "as4100_factors"):
            out.append(f"rules/data/{name}.toml: {load_table(name)['source']['standard']}")
        return out

    def ultimate_combination(self) -> dict[str, object]:
        c = D.factors()["combination"]
        return {
            "name": str(c["name"]),
            "dead": float(c["dead"]),
            "live": float(c["live"]),
            "dead_only": float(c["dead_only"]),
            "source": str(c["source"]),
        }

    # ------------------------------------------------------------------ the fin-plate audit
    def web_shear_capacity(self, member: Member) -> float | None:
        """φVv = φ 0.6 fy Aw with Aw = d tw (AS 4100 cl. 5.11.4, stocky web; φ = 0.9 Table 3.4) in N,
        fy of the web thickness (AS/NZS 3679.1). ``None`` when section or steel is unknown."""
        s = member.section
        if s.kind not in ("I", "channel") or s.depth is None or s.web_thickness is None or member.steel is None:
            return None
        got = D.steel_strength(member.steel.grade, s.web_thickness, "section")
        fy = got[0] if got else member.steel.fy
        if not fy > 0:
            return None
        return D.factors()["phi"]["member"] * C.Vw_shear(fy, s.depth * s.web_thickness)

    def check_fin_plate(
        self,
        joint: Joint,
        demand: Demand,
        plate: FinPlate,
        beam: Member,
        support: Member | None,
        policy: str = "conservative",
    ) -> list[Check]:
        """Every AS 4100 check of the fin plate at ``joint`` under ``demand`` (see :data:`CHECKS`),
        hinge-dependent checks once per hinge position of :func:`rules.base.hinge_positions`."""
        hinges = hinge_positions(joint.stiffness, policy)
        bad = self._geometry_problem(plate)
        if bad:
            return [C.incomplete_check(n, c, f"{bad} ({c})") for n, c in CHECKS if not n.endswith("(tie)")]

        f = D.factors()
        pmat = self._plate_material(plate)
        if not (pmat.fy > 0 and pmat.fu > 0):
            note = f"plate steel {plate.steel.grade!r}: yield and tensile strength unknown"
            return [C.incomplete_check(n, c, f"{note} ({c})") for n, c in CHECKS if not n.endswith("(tie)")]
        bm = self._beam(beam, joint)
        sup = self._support(support, joint)
        V, vnote = self._design_shear(demand, bm)
        N = float(demand.N or 0.0)
        df = float(plate.bolts.diameter)
        dh = float(plate.bolts.hole_diameter or D.standard_hole(df))

        checks: list[Check] = []
        xy = bolt_xy(plate)
        xc = bolt_group_centroid_x(plate)
        for hinge in hinges:
            sfx = HINGE_SUFFIX[hinge]
            Mz = V * xc if hinge == HINGE_AT_SUPPORT else 0.0
            F = _bolt_forces(xy, N, -V, Mz)
            checks.append(self._bolt_shear(plate, F, sfx, vnote))
            checks.extend(self._bearing_tearout(plate, F, xy, df, dh, pmat, bm, sfx))
            checks.append(self._plate_bending(plate, V, hinge, xc, dh, pmat, sfx))
            checks.append(self._plate_ltb(plate, V, hinge, xc, pmat, sfx))
            checks.append(self._weld(plate, V, N, hinge, xc, sfx))
            if joint.geometry.copes:
                if isinstance(bm, _Beam):
                    checks.append(self._coped_bending(plate, V, hinge, xc, bm, sfx))
                else:
                    checks.append(C.incomplete_check("coped section bending" + sfx,
                                                     _CLAUSE["coped section bending"], f"{bm} (cl. 5.2)", "N·mm"))

        checks.extend(self._plate_shear(plate, V, dh, pmat))
        checks.append(self._plate_block_shear(plate, V, dh, pmat, f))
        checks.extend(self._beam_web_shear_checks(plate, V, dh, bm, f))
        checks.append(self._weld_vs_plate(plate, pmat))
        checks.append(self._support_shear(plate, V, sup))
        if N > 0:
            checks.extend(self._tie(plate, N, dh, pmat, bm))
        checks.extend(self._detailing(plate, df, bm))
        return checks

    # ------------------------------------------------------------------ inputs
    @staticmethod
    def _geometry_problem(plate: FinPlate) -> str:
        if not (plate.thickness > 0 and plate.depth > 0 and plate.width > 0):
            return "plate thickness, depth and width must be positive"
        if plate.rows < 1 or plate.lines < 1 or plate.rows * plate.lines < 2:
            return "the bolt layout needs at least two bolts (common practice for a fin plate)"
        if plate.rows > 1 and not plate.pitch > 0:
            return "bolt pitch must be positive when there is more than one row"
        if plate.lines > 1 and not plate.gauge > 0:
            return "bolt gauge must be positive when there is more than one line"
        if not (plate.a > 0 and plate.bolts.diameter > 0):
            return "distance a to the bolt line and bolt diameter must be positive"
        if plate.plate_end_edge + (plate.rows - 1) * plate.pitch >= plate.depth:
            return "the bolt rows do not fit inside the plate depth"
        return ""

    @staticmethod
    def _plate_material(plate: FinPlate) -> _Material:
        got = D.steel_strength(plate.steel.grade, plate.thickness, "plate")
        if got:
            return _Material(got[0], got[1], got[2])
        return _Material(
            float(plate.steel.fy), float(plate.steel.fu),
            f"plate grade {plate.steel.grade!r} not in AS/NZS 3678 table; given fy/fu used",
        )

    @staticmethod
    def _beam(beam: Member, joint: Joint) -> _Beam | str:
        """Resolved beam data, or a note naming what is missing (for incomplete checks)."""
        s = beam.section
        if s.kind not in ("I", "channel"):
            return f"beam section {s.name!r} is not an I or channel section (kind {s.kind!r})"
        if s.depth is None or s.web_thickness is None:
            return f"beam section {s.name!r}: depth or web thickness unknown"
        if beam.steel is None:
            return f"beam {beam.label}: steel grade unknown"
        got = D.steel_strength(beam.steel.grade, s.web_thickness, "section")
        if got:
            fy, fu, note = got
        else:
            fy, fu, note = beam.steel.fy, beam.steel.fu, f"beam grade {beam.steel.grade!r} not in table; given fy/fu"
        if not (fy > 0 and fu > 0):
            return f"beam {beam.label}: steel strengths of grade {beam.steel.grade!r} unknown"
        top = sum(c.depth for c in joint.geometry.copes if c.where == "top")
        bot = sum(c.depth for c in joint.geometry.copes if c.where == "bottom")
        length = max((c.length for c in joint.geometry.copes), default=0.0)
        return _Beam(float(s.depth), float(s.web_thickness), s.flange_thickness, s.width,
                     float(s.root_radius or 0.0), float(fy), float(fu), float(top), float(bot),
                     float(length), note)

    @staticmethod
    def _support(support: Member | None, joint: Joint) -> tuple[float, float, str] | str:
        if support is None:
            return "no supporting member (free end or non-steel support)"
        s = support.section
        if joint.kind == "column-flange":
            t = s.flange_thickness
            part = "flange"
        elif joint.kind in ("column-web", "beam-web") or s.kind in ("I", "channel"):
            t = s.web_thickness
            part = "web"
        else:
            return f"support kind {joint.kind!r} with section kind {s.kind!r} is not covered"
        if t is None:
            return f"support section {s.name!r}: {part} thickness unknown"
        if support.steel is None:
            return f"support {support.label}: steel grade unknown"
        got = D.steel_strength(support.steel.grade, t, "section")
        fy = got[0] if got else support.steel.fy
        if not fy > 0:
            return f"support {support.label}: yield stress of grade {support.steel.grade!r} unknown"
        return float(t), float(fy), f"support {part} t = {t:g} mm, fy = {fy:g} MPa"

    def _design_shear(self, demand: Demand, bm: _Beam | str) -> tuple[float, str]:
        """V* raised to the AS 4100 cl. 9.1.4(b) minimum for beam end connections."""
        f = D.factors()
        mn = f["minimum_action"]
        V = float(demand.V)
        if isinstance(bm, _Beam):
            phiVv = f["phi"]["member"] * C.Vw_shear(bm.fy, bm.d * bm.tw)
            pair = (mn["fraction_of_phiVv"] * phiVv, mn["absolute_N"])
            vmin = min(pair) if mn["rule"] == "lesser" else max(pair)
        else:  # beam capacity unknown: 40 kN bounds the "lesser" rule from above (conservative)
            vmin = mn["absolute_N"]
        if abs(V) < vmin:
            return math.copysign(vmin, V if V != 0 else 1.0), (
                f"V* = {abs(V) / 1e3:.1f} kN raised to the cl. 9.1.4(b) minimum {vmin / 1e3:.1f} kN"
            )
        return V, f"V* = {abs(V) / 1e3:.1f} kN"

    # ------------------------------------------------------------------ bolts
    def _bolt_shear(self, plate: FinPlate, F: np.ndarray, sfx: str, vnote: str) -> Check:
        name = "bolt shear" + sfx
        try:
            bolt = D.bolt_data(plate.bolts.size)
            fuf = D.bolt_fuf(plate.bolts.grade)
        except RuleSetError as exc:
            return C.incomplete_check(name, _CLAUSE["bolt shear"], f"{exc} (cl. 9.3.2.1)", "N")
        f = D.factors()
        lj_tab = load_table("as4100_bolts")["long_joint"]
        lj = (plate.rows - 1) * plate.pitch
        kr = C.kr_long_joint(lj, **lj_tab)
        nn, nx = (1, 0) if plate.bolts.threads_in_shear_plane else (0, 1)
        cap = f["phi"]["bolt"] * C.Vf(fuf, bolt.Ac, bolt.Ao, nn, nx, kr)
        mag = np.hypot(F[:, 0], F[:, 1])
        i = int(np.argmax(mag))
        thread = "threads in the shear plane (Ac)" if nn else "threads excluded (Ao)"
        return C.make_check(name, _CLAUSE["bolt shear"], float(mag[i]), cap, "N",
                            f"{vnote}; worst bolt {i + 1} of {len(mag)}; "
                            f"{bolt.size} {D.normalise_grade(plate.bolts.grade)}, "
                            f"{thread}, kr = {kr:.3f} (lj = {lj:g} mm)")

    def _bearing_tearout(self, plate, F, xy, df, dh, pmat: _Material, bm, sfx) -> list[Check]:
        f = D.factors()
        phi = f["phi"]["ply_bearing"]
        mag = np.hypot(F[:, 0], F[:, 1])
        hole_note = ""
        nonstandard = plate.bolts.hole != "standard"
        if nonstandard:
            hole_note = (f"{plate.bolts.hole} holes: cl. 9.3.2.4 is applied here for standard holes "
                         f"only; assess {plate.bolts.hole} holes separately")
        out: list[Check] = []
        plies = [("plate", plate.thickness, pmat.fu, F, plate_rectangle(plate))]
        if isinstance(bm, _Beam):
            x_end = plate.a - plate.beam_end_edge
            y_top = -plate.plate_end_edge + plate.beam_top_edge
            y_max = y_top if bm.cope_top > 0 else np.inf
            web_below_top = bm.d - bm.cope_top - bm.cope_bottom
            y_min = y_top - web_below_top if bm.cope_bottom > 0 else -np.inf
            plies.append(("beam web", bm.tw, bm.fu, -F, (x_end, np.inf, y_min, y_max)))
        for ply, tp, fup, dirs, rect in plies:
            nb, nt = f"bolt bearing on {ply}", f"bolt tear-out in {ply}"
            if nonstandard:
                out.append(C.incomplete_check(nb + sfx, _CLAUSE[nb], hole_note, "N"))
                out.append(C.incomplete_check(nt + sfx, _CLAUSE[nt], hole_note, "N"))
                continue
            capb = phi * C.Vb_bearing(df, tp, fup)
            i = int(np.argmax(mag))
            out.append(C.make_check(nb + sfx, _CLAUSE[nb], float(mag[i]), capb, "N",
                                    f"tp = {tp:g} mm, fup = {fup:g} MPa, df = {df:g} mm"))
            # snap round-off components (|Fx| ~ 1e-12 |F|) to zero so the ray stays axis-aligned
            dirs = np.where(np.abs(dirs) < 1e-9 * np.maximum(mag, 1e-300)[:, None], 0.0, dirs)
            e_edge = edge_distance_along(xy, dirs, rect)
            e_hole = _dist_to_adjacent_holes(xy, dirs, dh)
            e = np.minimum(e_edge, e_hole)
            ae = C.ae_tearout(e, dh, df)
            capt = phi * C.Vb_tearout(np.maximum(ae, 0.0), tp, fup)
            with np.errstate(divide="ignore", invalid="ignore"):
                util = np.where(capt > 0, mag / capt, np.where(mag > 0, np.inf, 0.0))
            if not np.isfinite(ae).any():
                continue  # no ply edge or hole ahead of any bolt (e.g. uncoped web pushed up): no tear-out path
            j = int(np.argmax(util))
            note = (f"worst bolt {j + 1}: ae = {float(ae[j]):.1f} mm along its force "
                    f"(to {'an adjacent hole' if e_hole[j] < e_edge[j] else 'the ply edge'}), "
                    f"tp = {tp:g} mm, fup = {fup:g} MPa")
            out.append(C.make_check(nt + sfx, _CLAUSE[nt], float(mag[j]), float(capt[j]), "N", note))
        if not isinstance(bm, _Beam):
            for nm in ("bolt bearing on beam web", "bolt tear-out in beam web"):
                out.append(C.incomplete_check(nm + sfx, _CLAUSE[nm], f"{bm} (cl. 9.3.2.4)", "N"))
        return out

    # ------------------------------------------------------------------ plate
    def _plate_shear(self, plate: FinPlate, V: float, dh: float, pm: _Material) -> list[Check]:
        f = D.factors()
        Ag = plate.depth * plate.thickness
        cap_y = f["phi"]["member"] * C.Vv_nonuniform(C.Vw_shear(pm.fy, Ag), C.RECT_SHEAR_STRESS_RATIO)
        Anv = (plate.depth - plate.rows * dh) * plate.thickness
        cap_r = f["phi"]["block_shear"] * 0.6 * pm.fu * Anv
        return [
            C.make_check("plate shear yield", _CLAUSE["plate shear yield"], abs(V), cap_y, "N",
                         f"Ag = {Ag:.0f} mm², fy = {pm.fy:g} MPa ({pm.note}), f*vm/f*va = 1.5 (rectangle)"),
            C.make_check("plate shear rupture", _CLAUSE["plate shear rupture"], abs(V), cap_r, "N",
                         f"Anv = {Anv:.0f} mm², fu = {pm.fu:g} MPa"),
        ]

    def _plate_block_shear(self, plate: FinPlate, V: float, dh: float, pm: _Material, f: dict) -> Check:
        t = plate.thickness
        Lv = plate.depth - plate.plate_end_edge
        Lt = (plate.lines - 1) * plate.gauge + plate.plate_side_edge
        Agv = Lv * t
        Anv = (Lv - (plate.rows - 0.5) * dh) * t
        Ant = (Lt - (plate.lines - 0.5) * dh) * t
        if Anv <= 0 or Ant <= 0:
            return C.incomplete_check("plate block shear", _CLAUSE["plate block shear"],
                                      "net block shear areas are not positive: the layout is outside cl. 9.1.9", "N")
        kbs = f["block_shear"]["kbs_uniform" if plate.lines == 1 else "kbs_nonuniform"]
        cap = f["phi"]["block_shear"] * C.Vbs(pm.fu, pm.fy, Anv, Agv, Ant, kbs)
        return C.make_check("plate block shear", _CLAUSE["plate block shear"], abs(V), cap, "N",
                            f"Agv = {Agv:.0f}, Anv = {Anv:.0f}, Ant = {Ant:.0f} mm², kbs = {kbs:g}")

    def _plate_moments(self, plate: FinPlate, V: float, hinge: str, xc: float) -> tuple[float, float]:
        """(moment at the weld, moment at the first bolt line), N·mm, for the hinge position."""
        if hinge == HINGE_AT_BOLTS:
            return abs(V) * xc, abs(V) * (xc - plate.a)
        return 0.0, abs(V) * plate.a

    def _plate_bending(self, plate, V, hinge, xc, dh, pm: _Material, sfx) -> Check:
        f = D.factors()
        phi = f["phi"]["member"]
        t, dp = plate.thickness, plate.depth
        M_weld, M_line = self._plate_moments(plate, V, hinge, xc)
        Zg = C.Z_rect(t, dp)
        yh = -(plate.plate_end_edge + np.arange(plate.rows) * plate.pitch) + dp / 2.0
        Zn = C.Z_net_rect(t, dp, yh, dh)
        cap_g, cap_n = phi * pm.fy * Zg, phi * pm.fy * Zn
        u_g, u_n = M_weld / cap_g, M_line / cap_n
        if u_g >= u_n:
            return C.make_check("plate bending" + sfx, _CLAUSE["plate bending"], M_weld, cap_g, "N·mm",
                                f"gross section at the weld, Z = {Zg:.0f} mm³, fy = {pm.fy:g} MPa")
        return C.make_check("plate bending" + sfx, _CLAUSE["plate bending"], M_line, cap_n, "N·mm",
                            f"net section at the first bolt line, Zn = {Zn:.0f} mm³, fy = {pm.fy:g} MPa")

    def _plate_ltb(self, plate, V, hinge, xc, pm: _Material, sfx) -> Check:
        f = D.factors()
        el = load_table("as4100_steel")["elastic"]
        M = max(self._plate_moments(plate, V, hinge, xc))
        Ms = pm.fy * C.Z_rect(plate.thickness, plate.depth)
        Le = plate.a
        Mo = C.Mo_rect(Le, plate.depth, plate.thickness, el["E"], el["G"])
        a_s = min(C.alpha_s(Ms, Mo), 1.0)
        cap = f["phi"]["member"] * a_s * Ms
        return C.make_check("plate lateral-torsional buckling" + sfx, _CLAUSE["plate lateral-torsional buckling"],
                            M, cap, "N·mm",
                            f"Le = a = {Le:g} mm, Mo = {Mo / 1e6:.1f} kN·m, αs = {a_s:.3f}, αm = 1.0")

    # ------------------------------------------------------------------ beam web
    def _beam_web_shear_checks(self, plate: FinPlate, V: float, dh: float, bm, f: dict) -> list[Check]:
        if not isinstance(bm, _Beam):
            out = [C.incomplete_check("beam web shear", _CLAUSE["beam web shear"], f"{bm} (cl. 5.11)", "N")]
            return out
        out = []
        h = bm.d - bm.cope_top - bm.cope_bottom
        if h <= 0:
            return [C.incomplete_check("beam web shear", _CLAUSE["beam web shear"], "copes remove the whole web", "N")]
        if bm.cope_top == 0 and bm.cope_bottom == 0:
            d1 = bm.d - 2.0 * (bm.tf or 0.0)
            av = C.alpha_v(d1, bm.tw, bm.fy)
            Aw = bm.d * bm.tw
            gross_note = f"Aw = d tw = {Aw:.0f} mm², αv = {av:.3f}"
            cap_y = f["phi"]["member"] * av * C.Vw_shear(bm.fy, Aw)
        else:
            # coped: non-uniform shear in what is left (cl. 5.11.3). Coped at one flange with the
            # flange known, the tee's stem below the flange carries it, f*vm/f*va from the tee's
            # elastic shear flow (as ASI Handbook 1 (2007) Ch 6.5); double coped, or the flange
            # unknown, the remaining depth as a rectangle (f*vm/f*va = 1.5)
            one_flange = (bm.cope_top > 0) != (bm.cope_bottom > 0)
            if one_flange and bm.bf is not None and bm.tf is not None:
                dw = h - bm.tf
                if dw <= 0:
                    return [C.incomplete_check("beam web shear", _CLAUSE["beam web shear"],
                                               "the cope leaves no web below the flange", "N")]
                ratio = C.tee_shear_stress_ratio(bm.bf, bm.tf, bm.tw, dw)
                shape, ratio_txt = "coped at one flange: stem Aw", f"{ratio:.2f}"
            else:
                dw, ratio, ratio_txt = h, C.RECT_SHEAR_STRESS_RATIO, "1.5"
                shape = "coped, flange unknown: Aw" if one_flange else "double coped: Aw"
            Aw = dw * bm.tw
            cap_y = f["phi"]["member"] * C.Vv_nonuniform(C.Vw_shear(bm.fy, Aw), ratio)
            gross_note = f"{shape} = {dw:g} × {bm.tw:g} = {Aw:.0f} mm², f*vm/f*va = {ratio_txt} (cl. 5.11.3)"
        Anv = (h - plate.rows * dh) * bm.tw
        cap_r = f["phi"]["block_shear"] * 0.6 * bm.fu * Anv
        if cap_y <= cap_r:
            out.append(C.make_check("beam web shear", _CLAUSE["beam web shear"], abs(V), cap_y, "N",
                                    f"gross shear yield governs: {gross_note}, fy = {bm.fy:g} MPa"))
        else:
            out.append(C.make_check("beam web shear", _CLAUSE["beam web shear"], abs(V), cap_r, "N",
                                    f"net shear at the bolt line governs: Anv = {Anv:.0f} mm², fu = {bm.fu:g} MPa"))
        if bm.cope_top > 0:
            t = bm.tw
            Lv = plate.beam_top_edge + (plate.rows - 1) * plate.pitch
            Lt = plate.beam_end_edge + (plate.lines - 1) * plate.gauge
            Agv = Lv * t
            Anv_b = (Lv - (plate.rows - 0.5) * dh) * t
            Ant = (Lt - (plate.lines - 0.5) * dh) * t
            if Anv_b <= 0 or Ant <= 0:
                out.append(C.incomplete_check("beam web block shear", _CLAUSE["beam web block shear"],
                                              "net block shear areas are not positive (cl. 9.1.9)", "N"))
            else:
                kbs = f["block_shear"]["kbs_uniform" if plate.lines == 1 else "kbs_nonuniform"]
                cap = f["phi"]["block_shear"] * C.Vbs(bm.fu, bm.fy, Anv_b, Agv, Ant, kbs)
                out.append(C.make_check("beam web block shear", _CLAUSE["beam web block shear"], abs(V), cap, "N",
                                        f"Agv = {Agv:.0f}, Anv = {Anv_b:.0f}, Ant = {Ant:.0f} mm², kbs = {kbs:g}"))
        return out

    def _coped_bending(self, plate: FinPlate, V: float, hinge: str, xc: float, bm: _Beam, sfx: str) -> Check:
        name = "coped section bending" + sfx
        clause = _CLAUSE["coped section bending"]
        lim = D.factors()["coped"]
        deepest = max(bm.cope_top, bm.cope_bottom)
        if bm.cope_length > lim["max_length_over_d"] * bm.d or deepest > lim["max_depth_over_d"] * bm.d:
            return C.incomplete_check(name, clause, "cope longer than 2d or deeper than d/2: outside the "
                                      "range of this check (cl. 5.2; assess the coped beam separately)", "N·mm")
        x_cope = plate.a - plate.beam_end_edge + bm.cope_length
        x_hinge = xc if hinge == HINGE_AT_BOLTS else 0.0
        e = max(x_cope - x_hinge, 0.0)
        M = abs(V) * e
        if bm.cope_top > 0 and bm.cope_bottom > 0:
            h = bm.d - bm.cope_top - bm.cope_bottom
            Z = C.Z_rect(bm.tw, h)
            b_out = h / 2.0
            shape = f"rectangle {bm.tw:g} × {h:g}"
        else:
            if bm.bf is None or bm.tf is None:
                return C.incomplete_check(name, clause, "flange width or thickness unknown (cl. 5.2)", "N·mm")
            h_stem = bm.d - max(bm.cope_top, bm.cope_bottom) - bm.tf
            Z, _ = C.tee_Z_min(bm.bf, bm.tf, bm.tw, h_stem)
            b_out = h_stem
            shape = f"tee, stem {h_stem:g} mm"
        lam = (b_out / bm.tw) * math.sqrt(bm.fy / 250.0)
        lam_y = float(lim["lambda_ey"])  # Table 5.2 flat outstand, max compression at the free edge, HR
        Ze = Z * min(1.0, lam_y / lam)
        cap = D.factors()["phi"]["member"] * bm.fy * Ze
        return C.make_check(name, clause, M, cap, "N·mm",
                            f"{shape}, e = {e:.0f} mm to the cope corner, λe = {lam:.1f} (λey = {lam_y:g}), "
                            f"Ze = {Ze:.0f} mm³")

    # ------------------------------------------------------------------ weld, support, tie
    def _weld(self, plate: FinPlate, V: float, N: float, hinge: str, xc: float, sfx: str) -> Check:
        name = "weld" + sfx
        try:
            wm = D.weld_metal(plate.weld.electrode)
        except RuleSetError as exc:
            return C.incomplete_check(name, _CLAUSE["weld"], f"{exc} (cl. 9.7.3.10)", "MPa")
        if not plate.weld.leg > 0:
            return C.incomplete_check(name, _CLAUSE["weld"], "fillet weld leg unknown or not positive", "MPa")
        nw = 2 if plate.weld.both_sides else 1
        Lw = plate.depth
        M = abs(V) * xc if hinge == HINGE_AT_BOLTS else 0.0
        v = abs(V) / (nw * Lw)
        n = abs(N) / (nw * Lw)
        m = 6.0 * M / (nw * Lw * Lw)
        q = math.hypot(v, n + m)
        tt = D.throat(plate.weld.leg)
        # kr < 1 of cl. 9.7.3.10 applies to welds in lap connections only: 1.0 for a fin-plate weld
        cap = wm.phi * 0.6 * wm.fuw * 1.0
        return C.make_check(name, _CLAUSE["weld"], q / tt, cap, "MPa",
                            f"{nw} × {plate.weld.leg:g} mm {wm.electrode} {wm.category}, Lw = {Lw:g} mm, "
                            f"line force {q:.0f} N/mm (v {v:.0f}, n {n:.0f}, m {m:.0f}), tt = {tt:.2f} mm")

    def _weld_vs_plate(self, plate: FinPlate, pm: _Material) -> Check:
        name = "weld stronger than plate"
        try:
            wm = D.weld_metal(plate.weld.electrode)
        except RuleSetError as exc:
            return C.incomplete_check(name, _CLAUSE[name], str(exc), "N")
        if not plate.weld.leg > 0:
            return C.incomplete_check(name, _CLAUSE[name], "fillet weld leg unknown or not positive", "N")
        nw = 2 if plate.weld.both_sides else 1
        dem = D.factors()["practice"]["weld_to_plate_phi"] * pm.fy * plate.thickness * plate.depth
        cap = nw * wm.phi * C.vw(wm.fuw, D.throat(plate.weld.leg)) * plate.depth
        return C.make_min_check(name, _CLAUSE[name], dem, cap, "N",
                                f"0.9 fy tp dp of the plate vs {nw} fillet(s) × φvw × dp")

    def _support_shear(self, plate: FinPlate, V: float, sup) -> Check:
        name = "support local shear"
        if isinstance(sup, str):
            return C.incomplete_check(name, _CLAUSE[name], f"{sup} (cl. 5.11.4)", "N")
        t, fy, note = sup
        cap = D.factors()["phi"]["member"] * C.Vw_shear(fy, t * plate.depth)
        return C.make_check(name, _CLAUSE[name], abs(V), cap, "N", f"{note}, one shear plane of length dp")

    def _tie(self, plate: FinPlate, N: float, dh: float, pm: _Material, bm) -> list[Check]:
        phi = D.factors()["phi"]["member"]
        out = []
        Ag = plate.depth * plate.thickness
        An = (plate.depth - plate.rows * dh) * plate.thickness
        cap = phi * min(Ag * pm.fy, 0.85 * 1.0 * An * pm.fu)
        out.append(C.make_check("plate tension (tie)", _CLAUSE["plate tension (tie)"], N, cap, "N",
                                f"Ag = {Ag:.0f}, An = {An:.0f} mm², kt = 1.0"))
        if isinstance(bm, _Beam):
            h = min(plate.depth, bm.d - bm.cope_top - bm.cope_bottom)
            Agw = h * bm.tw
            Anw = (h - plate.rows * dh) * bm.tw
            capw = phi * min(Agw * bm.fy, 0.85 * 1.0 * Anw * bm.fu)
            out.append(C.make_check("beam web tension (tie)", _CLAUSE["beam web tension (tie)"], N, capw, "N",
                                    f"web strip of depth {h:g} mm: Ag = {Agw:.0f}, An = {Anw:.0f} mm²"))
        else:
            out.append(C.incomplete_check("beam web tension (tie)", _CLAUSE["beam web tension (tie)"], bm, "N"))
        return out

    # ------------------------------------------------------------------ detailing
    def _detailing(self, plate: FinPlate, df: float, bm) -> list[Check]:
        f = D.factors()
        pf, ed, pr = f["pitch"], f["edge_distance"], f["practice"]
        out: list[Check] = []
        tp = plate.thickness
        t_min = min(tp, bm.tw) if isinstance(bm, _Beam) else tp
        if plate.rows > 1:
            out.append(C.make_min_check("bolt pitch minimum", _CLAUSE["bolt pitch minimum"],
                                        pf["min_factor"] * df, plate.pitch, "mm", f"2.5 df, df = {df:g} mm"))
            lim = min(pf["max_outer_line_tp"] * t_min + pf["max_outer_line_add"], pf["max_outer_line_cap"])
            out.append(C.make_max_check("bolt pitch maximum", _CLAUSE["bolt pitch maximum"], plate.pitch, lim, "mm",
                                        f"outer line in the direction of the action, tp = {t_min:g} mm"))
        if plate.lines > 1:
            out.append(C.make_min_check("bolt gauge minimum", _CLAUSE["bolt gauge minimum"],
                                        pf["min_factor"] * df, plate.gauge, "mm", f"2.5 df, df = {df:g} mm"))
            lim = min(pf["max_general_tp"] * t_min, pf["max_general_cap"])
            out.append(C.make_max_check("bolt gauge maximum", _CLAUSE["bolt gauge maximum"], plate.gauge, lim, "mm",
                                        f"tp = {t_min:g} mm"))
        bottom = plate.depth - plate.plate_end_edge - (plate.rows - 1) * plate.pitch
        plate_edges = {"top": plate.plate_end_edge, "bottom": bottom, "free side": plate.plate_side_edge}
        nonstd = plate.bolts.hole != "standard"
        hole_note = f"; {plate.bolts.hole} holes: Table 9.6.2 is for standard holes" if nonstd else ""
        name = "edge distance minimum (plate)"
        k = min(plate_edges, key=plate_edges.get)
        req = ed[self.plate_edge] * df
        chk = C.make_min_check(name, _CLAUSE[name], req, plate_edges[k], "mm",
                               f"{self.plate_edge} edge: {ed[self.plate_edge]:g} df; governing edge: {k}{hole_note}")
        out.append(_as_incomplete(chk) if nonstd else chk)
        name = "edge distance minimum (beam web)"
        if isinstance(bm, _Beam):
            web_edges = {"beam end": plate.beam_end_edge}
            if bm.cope_top > 0:
                web_edges["top cope"] = plate.beam_top_edge
            bot_web = bm.d - bm.cope_bottom - plate.beam_top_edge - bm.cope_top - (plate.rows - 1) * plate.pitch
            if bm.cope_bottom > 0:
                web_edges["bottom cope"] = bot_web
            k = min(web_edges, key=web_edges.get)
            req = ed[self.web_edge] * df
            chk = C.make_min_check(name, _CLAUSE[name], req, web_edges[k], "mm",
                                   f"{self.web_edge} edge: {ed[self.web_edge]:g} df; governing edge: {k}{hole_note}")
            out.append(_as_incomplete(chk) if nonstd else chk)
        else:
            out.append(C.incomplete_check(name, _CLAUSE[name], f"{bm} (cl. 9.6.2)", "mm"))
        # maximum edge distance, each ply with its own thickness
        name = "edge distance maximum"
        worst = None
        cands = [(v, tp, f"plate {k}") for k, v in plate_edges.items()]
        if isinstance(bm, _Beam):
            cands.append((plate.beam_end_edge, bm.tw, "beam end"))
        for v, t, where in cands:
            lim = min(pf["max_edge_tp"] * t, pf["max_edge_cap"])
            if worst is None or v / lim > worst[0] / worst[1]:
                worst = (v, lim, where, t)
        out.append(C.make_max_check(name, _CLAUSE[name], worst[0], worst[1], "mm",
                                    f"governing: {worst[2]} (t = {worst[3]:g} mm)"))
        name = "plate depth to beam depth"
        if isinstance(bm, _Beam):
            out.append(C.make_min_check(name, _CLAUSE[name], pr["min_plate_depth_ratio"] * bm.d, plate.depth, "mm",
                                        f"0.6 × d = 0.6 × {bm.d:g} mm"))
            out.append(self._within_web(plate, bm))
        else:
            out.append(C.incomplete_check(name, _CLAUSE[name], bm, "mm"))
            out.append(C.incomplete_check("bolt group within clear web depth",
                                          _CLAUSE["bolt group within clear web depth"], bm, "mm"))
        name = "plate thickness for rotation"
        out.append(C.make_max_check(name, _CLAUSE[name], tp, pr["max_plate_thickness"], "mm", ""))
        name = "clearance to support"
        out.append(C.make_min_check(name, _CLAUSE[name], pr["min_clearance"], plate.a - plate.beam_end_edge, "mm",
                                    "gap from the support face to the beam end = a − beam end distance"))
        return out

    @staticmethod
    def _within_web(plate: FinPlate, bm: _Beam) -> Check:
        """The plate must sit on flat web: below the top flange root (or the top cope) and above the
        bottom one. Depths measured down from the top of the beam, in mm."""
        name = "bolt group within clear web depth"
        tf = bm.tf or 0.0
        zone_top = bm.cope_top if bm.cope_top > 0 else tf + bm.r
        zone_bot = bm.d - bm.cope_bottom if bm.cope_bottom > 0 else bm.d - tf - bm.r
        plate_top = bm.cope_top + plate.beam_top_edge - plate.plate_end_edge
        plate_bot = plate_top + plate.depth
        cap = zone_bot - zone_top
        dem = plate_bot - zone_top
        util = dem / cap if cap > 0 else math.inf
        if plate_top < zone_top:
            util = max(util, (cap + zone_top - plate_top) / cap if cap > 0 else math.inf)
        note = (f"plate from {plate_top:g} to {plate_bot:g} mm below the top of the beam; flat web from "
                f"{zone_top:g} to {zone_bot:g} mm" + ("" if bm.tf is not None else " (flange thickness unknown)"))
        return Check(name, _CLAUSE[name], dem, cap, "mm", util, bool(util <= 1.0 + 1e-9), note)


def _as_incomplete(chk: Check) -> Check:
    return Check(chk.name, chk.clause, chk.demand, chk.capacity, chk.unit, chk.utilisation, False,
                 chk.note, incomplete=True)
