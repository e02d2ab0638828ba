"""Joint geometry, vectorised over (beam end, candidate support) pairs. Lengths in mm, angles in degrees.

Frames. For every member the axis unit vector ``a`` runs start → end; ``y`` is the section's local y
(``Member.web_dir``: along the web of an I section, the depth direction), made square to ``a``; and
``x = y × a`` is the section's local x (the flange direction; IFC profile axes are right-handed with z
along the member). For an I section the **flanges** lie in the planes ``y = ±depth/2``, so the
flange faces are normal to local **y**; the **web** lies in the plane ``x = 0``, its faces normal to
local **x** at ``±tw/2``. A beam arriving at a column mainly along the column's ``y`` therefore meets a
flange face at ``depth/2`` from the column's axis (kind ``column-flange``); a beam arriving mainly along
the column's ``x`` meets the web face at ``tw/2``, between the flanges (``column-web``). A secondary
beam arriving square to a girder meets the girder's web face at ``tw/2`` (``beam-web``). Sections that
are not I or channel (hollow, solid, timber) have no web recess: both faces are the outer faces,
``depth/2`` and ``width/2``.

Where the model places the axis off the centroid (``Member.axis_offset``, the axis position in local
(x, y) relative to the centroid), the centroid line is the axis less that offset; all tests use the
centroid line. When ``web_dir`` is missing, a non-vertical member is assumed to have its web vertical;
a vertical member's orientation is left unknown (``web_known`` False) and the joint finder works the
face out from the distance, saying so in the reasons.

Gap. The signed distance from the beam end to the face it meets is measured along the face normal,
on the side the beam comes from: positive = the end stops short of the face (detailed model), about
``-face offset`` = the end is at the support's axis (node-to-node model).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Sequence

import numpy as np

from engine.model import Cope, Member
from engine.tolerances import Tolerances

__all__ = [
    "ROLE_CODES",
    "MemberArrays",
    "PairMetrics",
    "pair_metrics",
    "angle_between_deg",
    "tops_and_bottoms",
    "copes_for_web_joints",
    "round_up",
]

ROLE_CODES = {"beam": 0, "column": 1, "brace": 2, "other": 3}

_Z = np.array([0.0, 0.0, 1.0])


def _unit(v: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    n = np.linalg.norm(v, axis=1)
    return v / np.where(n > 0.0, n, 1.0)[:, None], n


def _num(value: float | None) -> float:
    return float("nan") if value is None else float(value)


@dataclass(frozen=True)
class MemberArrays:
    """Per-member arrays (n members) the joint finder works on. Lengths mm, directions unit."""

    ids: tuple[str, ...]
    role: np.ndarray         # ROLE_CODES
    p0: np.ndarray           # axis start (as modelled)
    p1: np.ndarray           # axis end
    c0: np.ndarray           # centroid line start
    c1: np.ndarray           # centroid line end
    a: np.ndarray            # unit axis
    y: np.ndarray            # section local y (web / depth direction)
    x: np.ndarray            # section local x (flange direction)
    length: np.ndarray
    hd: np.ndarray           # half depth (along y)
    hb: np.ndarray           # half width (along x)
    htw: np.ndarray          # half web thickness (I/channel), else half width
    tf: np.ndarray           # flange thickness (0 when unknown)
    rr: np.ndarray           # root radius (0 when unknown)
    is_i: np.ndarray         # I or channel with web and flange thickness known
    section_known: np.ndarray
    web_known: np.ndarray
    valid_axis: np.ndarray   # finite, non-zero length

    @classmethod
    def from_members(cls, members: Sequence[Member], tol: Tolerances) -> "MemberArrays":
        n = len(members)
        p0 = np.array([m.start for m in members], dtype=float).reshape(n, 3)
        p1 = np.array([m.end for m in members], dtype=float).reshape(n, 3)
        a, length = _unit(p1 - p0)
        valid = np.isfinite(p0).all(axis=1) & np.isfinite(p1).all(axis=1) & (length > 1e-6)
        a[~valid] = _Z
        wd = np.array([m.web_dir if m.web_dir is not None else (np.nan,) * 3 for m in members],
                      dtype=float).reshape(n, 3)
        web_known = np.isfinite(wd).all(axis=1)
        wd[~web_known] = 0.0
        y = wd - np.einsum("ij,ij->i", wd, a)[:, None] * a
        y, ny = _unit(y)
        web_known &= ny > 1e-6
        vertical = np.abs(a[:, 2]) > math.cos(math.radians(tol.angle_tol_deg))
        # default: web vertical for non-vertical members
        zdef = _Z[None, :] - a[:, 2:3] * a
        zdef, nz = _unit(zdef)
        fallback_x = np.cross(np.tile(_Z, (n, 1)), a)
        fallback_x = np.where(np.linalg.norm(fallback_x, axis=1)[:, None] > 1e-6, fallback_x,
                              np.tile([1.0, 0.0, 0.0], (n, 1)))
        fallback_x, _ = _unit(fallback_x)
        yv = np.cross(a, fallback_x)  # an arbitrary square direction for vertical members
        y = np.where(web_known[:, None], y, np.where((~vertical & (nz > 1e-6))[:, None], zdef, yv))
        web_known = web_known | ~vertical
        x = np.cross(y, a)

        # section dimensions (mm), read once per distinct section object, gathered per member
        sec_row: dict[int, int] = {}
        sec_of = np.array([sec_row.setdefault(id(m.section), len(sec_row)) for m in members],
                          dtype=np.int64)
        distinct = list({id(m.section): m.section for m in members}.values())
        dims = np.array([(_num(s.depth), _num(s.width), _num(s.web_thickness),
                          _num(s.flange_thickness), _num(s.root_radius)) for s in distinct],
                        dtype=float).reshape(-1, 5)[sec_of]
        depth, width, tw, tf, rr = (np.ascontiguousarray(dims[:, j]) for j in range(5))
        i_or_channel = np.array([s.kind in ("I", "channel") for s in distinct], dtype=bool)[sec_of]
        section_known = np.isfinite(depth)
        width = np.where(np.isfinite(width), width, depth)   # CHS / square unknown width
        hd = np.where(section_known, depth / 2.0, tol.unknown_half_size_mm)
        hb = np.where(np.isfinite(width), width / 2.0, tol.unknown_half_size_mm)
        is_i = i_or_channel & np.isfinite(tw) & np.isfinite(tf)
        htw = np.where(is_i, tw / 2.0, hb)
        tf0 = np.where(np.isfinite(tf), tf, 0.0)
        rr0 = np.where(np.isfinite(rr), rr, 0.0)

        off = np.array([m.axis_offset if m.axis_offset is not None else (0.0, 0.0) for m in members],
                       dtype=float).reshape(n, 2)
        shift = off[:, 0:1] * x + off[:, 1:2] * y
        c0 = p0 - shift
        c1 = p1 - shift
        role = np.array([ROLE_CODES.get(m.role, 3) for m in members], dtype=np.int64)
        return cls(tuple(m.global_id for m in members), role, p0, p1, c0, c1, a, y, x, length,
                   hd, hb, htw, tf0, rr0, is_i, section_known, web_known, valid)

    def end_point(self, m: np.ndarray, k: np.ndarray, centroid: bool = True) -> np.ndarray:
        """World point (mm) of end ``k`` (0 start, 1 end) of members ``m``."""
        s, e = (self.c0, self.c1) if centroid else (self.p0, self.p1)
        return np.where(k[:, None] == 0, s[m], e[m])

    def outward(self, m: np.ndarray, k: np.ndarray) -> np.ndarray:
        """Unit direction pointing out of the member at end ``k`` (towards what it frames into)."""
        return np.where(k[:, None] == 0, -self.a[m], self.a[m])

    def half_extent(self, m: np.ndarray, d: np.ndarray) -> np.ndarray:
        """Half extent (mm) of the section of members ``m`` along world directions ``d``."""
        return (self.hd[m] * np.abs(np.einsum("ij,ij->i", self.y[m], d))
                + self.hb[m] * np.abs(np.einsum("ij,ij->i", self.x[m], d)))


@dataclass(frozen=True)
class PairMetrics:
    """Coordinates of beam ends in their candidate supports' frames (arrays over pairs, mm).

    ``t``: along the support's axis from its centroid-line start; ``rx``/``ry``: along its local
    x/y; ``ua``/``ux``/``uy``: the beam's outward direction in the same frame; ``cos_axes``: |cos| of
    the angle between the two axes; ``ext_a``/``ext_y``: the beam section's half extent along the
    support's axis / local y.
    """

    t: np.ndarray
    rx: np.ndarray
    ry: np.ndarray
    ua: np.ndarray
    ux: np.ndarray
    uy: np.ndarray
    cos_axes: np.ndarray
    ext_a: np.ndarray
    ext_y: np.ndarray
    r_perp: np.ndarray


def pair_metrics(arr: MemberArrays, beam: np.ndarray, end: np.ndarray, sup: np.ndarray) -> PairMetrics:
    """Metrics of the ends (``beam``, ``end``) relative to members ``sup`` (arrays of equal length)."""
    ec = arr.end_point(beam, end)
    u = arr.outward(beam, end)
    r = ec - arr.c0[sup]
    A, X, Y = arr.a[sup], arr.x[sup], arr.y[sup]
    t = np.einsum("ij,ij->i", r, A)
    return PairMetrics(
        t=t,
        rx=np.einsum("ij,ij->i", r, X),
        ry=np.einsum("ij,ij->i", r, Y),
        ua=np.einsum("ij,ij->i", u, A),
        ux=np.einsum("ij,ij->i", u, X),
        uy=np.einsum("ij,ij->i", u, Y),
        cos_axes=np.abs(np.einsum("ij,ij->i", arr.a[beam], A)),
        ext_a=arr.half_extent(beam, A),
        ext_y=arr.half_extent(beam, Y),
        r_perp=r - t[:, None] * A,
    )


def angle_between_deg(arr: MemberArrays, m1: np.ndarray, m2: np.ndarray) -> np.ndarray:
    """Acute angle (degrees, 0–90) between the axes of members ``m1`` and ``m2``."""
    c = np.clip(np.abs(np.einsum("ij,ij->i", arr.a[m1], arr.a[m2])), 0.0, 1.0)
    return np.degrees(np.arccos(c))


def tops_and_bottoms(arr: MemberArrays, m: np.ndarray, points: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """World z (mm) of the top and bottom of the sections of members ``m`` at centroid ``points``."""
    ext = arr.half_extent(m, np.tile(_Z, (len(m), 1)))
    return points[:, 2] + ext, points[:, 2] - ext


def round_up(value: np.ndarray, step: float = 5.0) -> np.ndarray:
    """Round up to the next multiple of ``step`` mm (cope dimensions; # common practice)."""
    return np.ceil(np.asarray(value) / step - 1e-9) * step


def copes_for_web_joints(arr: MemberArrays, beam: np.ndarray, end: np.ndarray, sup: np.ndarray,
                         gap: np.ndarray, tol: Tolerances) -> tuple[np.ndarray, list[tuple[Cope, ...]]]:
    """Top-of-steel difference and copes for secondaries framing into a girder web (arrays over joints).

    Method (# common practice): the supported beam's flange must clear the girder's flange and root
    radius. A top cope is needed when the beam's top is above ``girder top - tf - r``; its depth is
    that excess (``tf + r`` for flush tops); a bottom cope likewise against ``girder bottom + tf + r``.
    The cope runs back from the beam end past the girder's flange tip: length = flange outstand from
    the web face (``b/2 - tw/2``) less the end gap, plus ``cope_clearance_mm``. A node-to-node end (at
    or inside the face) is taken to stop ``end_clearance_mm`` short of the face. No cope is needed
    when the end stops beyond the flange tip. Depth and length are rounded up to 5 mm. Returns
    ``tos_diff`` (beam top − girder top, mm) and the copes per joint.
    """
    ec = arr.end_point(beam, end)
    top_b, bot_b = tops_and_bottoms(arr, beam, ec)
    t = np.einsum("ij,ij->i", ec - arr.c0[sup], arr.a[sup])
    foot = arr.c0[sup] + t[:, None] * arr.a[sup]
    top_s, bot_s = tops_and_bottoms(arr, sup, foot)
    tos = top_b - top_s
    g_eff = np.where(gap >= 0.0, gap, tol.end_clearance_mm)
    outstand = arr.hb[sup] - arr.htw[sup]
    length = round_up(outstand - g_eff + tol.cope_clearance_mm)
    need_len = (g_eff < outstand) & arr.is_i[sup]
    top_excess = top_b - (top_s - arr.tf[sup] - arr.rr[sup])
    bot_excess = (bot_s + arr.tf[sup] + arr.rr[sup]) - bot_b
    top_depth = round_up(top_excess)
    bot_depth = round_up(bot_excess)
    # one (frozen) Cope per distinct size, shared by the joints that need it
    made: dict[tuple[str, float, float], Cope] = {}

    def cope(where: str, depth: float, length: float) -> Cope:
        if depth == 0.0 or length == 0.0:   # keep the sign of a zero as computed
            return Cope(where, depth, length)
        key = (where, depth, length)
        c = made.get(key)
        if c is None:
            c = made[key] = Cope(where, depth, length)
        return c

    top = (need_len & (top_excess > 0.0)).tolist()
    bot = (need_len & (bot_excess > 0.0)).tolist()
    copes: list[tuple[Cope, ...]] = []
    for t_i, b_i, td, bd, ln in zip(top, bot, top_depth.tolist(), bot_depth.tolist(), length.tolist()):
        if t_i and b_i:
            copes.append((cope("top", td, ln), cope("bottom", bd, ln)))
        elif t_i:
            copes.append((cope("top", td, ln),))
        elif b_i:
            copes.append((cope("bottom", bd, ln),))
        else:
            copes.append(())
    return tos, copes
