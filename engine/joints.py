"""Find every beam-end joint of a frame and what supports it; classify each stiff or flexible.

Public entry: :func:`find_joints` (and :func:`joint_rows` for ``joint-audit inspect --joints``).

Method (all lengths mm):

1. Member axes go into a grid hash (:mod:`engine.spatial`); each beam end (and each column end, for
   splices and continuity) gathers the members whose centroid line passes within the largest section
   half-diagonal + the largest beam half-depth + the tolerances. No all-pairs loop.
2. Every (end, candidate) pair is tested, vectorised, in the candidate's section frame
   (:mod:`engine.joint_geometry`): a **column face** (flange or web, from the direction the beam
   arrives in relative to the column's section axes), a **column cap**, a **girder web**, a **beam
   below** (the beam's underside on the girder's top flange), a collinear **splice** (member continues
   end to end), an **end meeting the end** of another beam, or landing on a brace. An end is accepted at
   a face when it lies between the far face and ``joint_gap_mm`` short of the near face, within the
   lateral tolerance; that covers node-to-node models (the end at the support's axis) and detailed
   models (the end stopping short of the face by a clearance) alike. An end stopping at the flange
   tips of an I support (web side) is still a web joint, with a reason (a long fin plate or a cope
   is needed). Walls and slabs (:class:`~engine.model.Bearing` boxes) are tested by box containment:
   the end inside or within the gap of the box (embed, pocket), or the beam's underside on its top.
3. Per end: explicit relations from the model are used first; then the candidates of the best kind
   (column > girder/beam below > splice > wall); collinear segments of one physical member (a column
   split at a floor, a girder split at a node) count as one continuous support; two different supports
   equally near leave the end unresolved rather than guessed. An end meeting only the end of another
   beam is a web joint into that beam when that beam's end is carried by something else (a trimmer
   into the end of a girder); two beams meeting only each other stay unresolved.
4. Joint geometry (angle, gap, top-of-steel difference, copes, continuity, back-to-back partner) and
   the stiff/flexible classification (:mod:`engine.stiffness`) follow, then the graph
   (:mod:`engine.graph`).

Which ends are joints: both ends of every member of role ``beam``; both ends of every ``brace``,
reported as kind ``unknown`` (a brace connects by gusset, not fin plate — recognised, not checked);
the lower end of a column only where it sits on another column (``splice``). Column bases and tops are
not beam joints. Members of role ``other`` are supports only. A beam end with nothing near it is a
``free-end`` joint (a cantilever tip — a finding, not an error) when the member's other end is
supported; otherwise it is listed unresolved with the reason.

An aid to a competent engineer: the joints found must be checked against the drawings, and the
governing local code and licensed practice take precedence.
"""

from __future__ import annotations

import gc
import math
from collections import defaultdict
from dataclasses import dataclass, field
from typing import Any, Sequence

import networkx as nx
import numpy as np

from engine.graph import build_graph
from engine.joint_geometry import (MemberArrays, angle_between_deg, copes_for_web_joints,
                                   pair_metrics, tops_and_bottoms)
from engine.model import (Bearing, DataWarning, ExplicitConnection, Joint, JointGeometry, Member,
                          joint_id)
from engine.spatial import SegmentGrid, points_in_boxes
from engine.stiffness import POLICIES, SupportFacts, apply_policy, classify
from engine.errors import ConfigError
from engine.tolerances import Tolerances

__all__ = ["UnresolvedEnd", "JointFinding", "find_joints", "joint_rows"]

# candidate codes and their priority (lower wins)
_NONE, _COL_FACE, _COL_CAP, _BEAM_WEB, _BEAM_OVER, _SPLICE, _END_MEET, _LANDS, _WALL = range(9)
_PRIORITY = {_COL_FACE: 1, _COL_CAP: 1, _BEAM_WEB: 2, _BEAM_OVER: 2, _SPLICE: 3, _END_MEET: 4,
             _WALL: 5, _LANDS: 6}
_BEAM, _COLUMN, _BRACE, _OTHER = 0, 1, 2, 3
_ENDS = ("start", "end")


@dataclass(frozen=True)
class UnresolvedEnd:
    """A member end that is neither a recognisable joint nor a clear free end, with the reason."""

    beam: str
    end: str
    reason: str


@dataclass(frozen=True, eq=False)
class JointFinding:
    """The result of :func:`find_joints`.

    ``joints``: every beam and brace end that is a joint (supported, ``free-end``, ``splice``,
    ``unknown``), and column splices. ``unresolved``: ends left without a decision, with why.
    ``warnings``: e.g. an explicit relation that disagrees with the geometry. ``graph``: see
    :mod:`engine.graph`.
    """

    joints: tuple[Joint, ...]
    unresolved: tuple[UnresolvedEnd, ...]
    warnings: tuple[DataWarning, ...]
    graph: nx.MultiDiGraph = field(repr=False)

    def by_end(self) -> dict[tuple[str, str], Joint]:
        """Joints keyed by (beam GlobalId, end)."""
        return {(j.beam, j.end): j for j in self.joints}


@dataclass
class _Choice:
    e: int                      # end index
    row: int | None = None      # candidate row (member support)
    wall: int | None = None     # bearing index
    wall_gap: float | None = None
    wall_mode: str = ""
    source: str = "geometry"
    via: str | None = None      # chain partner making the support continuous
    notes: list[str] = field(default_factory=list)


# --------------------------------------------------------------------------------------------------
# candidate tests (vectorised over pairs)

@dataclass(frozen=True)
class _Pairs:
    e: np.ndarray
    s: np.ndarray
    code: np.ndarray
    gap: np.ndarray
    score: np.ndarray
    flange: np.ndarray
    inferred: np.ndarray      # column face inferred from distance (orientation unknown)
    node: np.ndarray          # node-to-node (end at the support's axis)
    side: np.ndarray          # which side of the support the beam comes from (+1/-1)
    t: np.ndarray
    lo: np.ndarray            # column: beam section bottom/top along the column from its bottom
    hi: np.ndarray
    rx: np.ndarray
    at_tips: np.ndarray       # web joint whose end stops at the support's flange tips
    sd: np.ndarray            # signed distance of the end from the support's axis, towards the beam


def _classify_pairs(arr: MemberArrays, em: np.ndarray, ek: np.ndarray, e: np.ndarray, s: np.ndarray,
                    dist: np.ndarray, tol: Tolerances, relaxed: bool = False) -> _Pairs:
    b = em[e]
    pm = pair_metrics(arr, b, ek[e], s)
    rs, rb = arr.role[s], arr.role[b]
    hd, hb, htw, L = arr.hd[s], arr.hb[s], arr.htw[s], arr.length[s]
    g = tol.joint_gap_mm
    big = 1e12 if relaxed else 1.0
    sin_ax = np.sqrt(np.clip(1.0 - pm.cos_axes ** 2, 0.0, 1.0))
    framing = np.where(rb == _BRACE, sin_ax >= math.sin(math.radians(tol.angle_tol_deg)),
                       sin_ax >= math.sin(math.radians(tol.min_frame_angle_deg)))
    collinear = pm.cos_axes >= math.cos(math.radians(tol.angle_tol_deg))

    # ---- column faces
    flange_k = np.abs(pm.uy) >= np.abs(pm.ux)
    p = np.where(flange_k, pm.ry, pm.rx)
    up = np.where(flange_k, pm.uy, pm.ux)
    sgn = np.where(np.abs(up) > 1e-9, -np.sign(up), np.where(p >= 0.0, 1.0, -1.0))
    sd_k = sgn * p
    lat_k = np.where(flange_k, np.abs(pm.rx), np.abs(pm.ry))
    # orientation unknown: normal = the beam's approach direction in the section plane
    un = np.hypot(pm.ux, pm.uy)
    un_safe = np.where(un > 1e-9, un, 1.0)
    sd_u = -(pm.rx * pm.ux + pm.ry * pm.uy) / un_safe
    lat_u = np.abs(pm.rx * pm.uy - pm.ry * pm.ux) / un_safe
    flange_u = sd_u - hd >= -tol.clash_tol_mm
    known = arr.web_known[s]
    flange = np.where(known, flange_k, flange_u)
    sd = np.where(known, sd_k, sd_u)
    lat = np.where(known, lat_k, lat_u)
    side = np.where(known, sgn, 1.0)
    f = np.where(flange, hd, htw)
    clear = np.where(arr.is_i[s], hd - arr.tf[s], hd)
    latlim = np.where(flange, hb, clear) + tol.lateral_tol_mm
    gap_c = sd - f
    pos = np.where(arr.a[s][:, 2] >= 0.0, pm.t, L - pm.t)
    lo, hi = pos - pm.ext_a, pos + pm.ext_a
    is_col = (rs == _COLUMN) & (rb != _COLUMN)
    # a beam stopping at the column's flange tips (web side) is still a web joint (long fin plate)
    at_tips_c = ~flange & arr.is_i[s] & (gap_c > g) & (sd - hb <= g)
    face_ok = (is_col & framing & (hi > -g * big) & (lo < L - tol.bearing_tol_mm)
               & ((gap_c <= g * big) | at_tips_c) & (gap_c >= -(2.0 * f + g) * big)
               & (lat <= latlim * big))
    cap_ok = (is_col & (rb == _BEAM) & (np.abs(lo - L) <= tol.bearing_tol_mm * big)
              & (np.abs(pm.rx) <= (hb + g) * big) & (np.abs(pm.ry) <= (hd + g) * big))

    # ---- girder web / beam below
    is_bm = (rs == _BEAM) & (rb != _COLUMN)
    along = (pm.t >= -g * big) & (pm.t <= L + g * big)
    yz = arr.y[s][:, 2]
    upright = np.abs(yz) >= 0.5
    ry_up = pm.ry * np.where(yz >= 0.0, 1.0, -1.0)
    bottom_rel, top_rel = ry_up - pm.ext_y, ry_up + pm.ext_y
    sgn_w = np.where(np.abs(pm.ux) > 1e-9, -np.sign(pm.ux), np.where(pm.rx >= 0.0, 1.0, -1.0))
    gap_w = sgn_w * pm.rx - htw
    over_gap = bottom_rel - hd
    over_geom = upright & (over_gap >= -tol.bearing_tol_mm)
    at_tips_w = arr.is_i[s] & (gap_w > g) & (sgn_w * pm.rx - hb <= g)
    web_ok = (is_bm & framing & along & ~over_geom & ((gap_w <= g * big) | at_tips_w)
              & (gap_w >= -(2.0 * htw + g) * big) & (top_rel > -hd * big))
    ez = g + tol.node_tol_mm
    near_end = (pm.t < ez) | (pm.t > L - ez)
    over_ok = (is_bm & framing & along & over_geom & (over_gap <= tol.bearing_tol_mm * big)
               & (np.abs(pm.rx) <= (hb + g) * big))

    # ---- collinear splice
    perp = np.linalg.norm(pm.r_perp, axis=1)
    b_hd, b_hb = arr.hd[b], arr.hb[b]
    perp_ok = perp <= tol.lateral_tol_mm + np.abs(b_hd - hd) + np.abs(b_hb - hb)
    reach = g + tol.node_tol_mm
    near0 = (pm.t <= tol.node_tol_mm) & (pm.t >= -reach) & (pm.ua > 0.0)
    near1 = (pm.t >= L - tol.node_tol_mm) & (pm.t <= L + reach) & (pm.ua < 0.0)
    same = (rs == rb) & ((rs == _BEAM) | (rs == _COLUMN))
    splice_ok = same & collinear & (near0 | near1) & perp_ok
    splice_gap = np.where(near0, -pm.t, pm.t - L)

    # ---- landing on a brace or an "other" member
    lands = ((rs == _BRACE) | (rs == _OTHER)) & (rb != _COLUMN) & (dist <= np.maximum(hd, hb) + g)

    code = np.full(len(e), _NONE, dtype=np.int64)
    gap = np.full(len(e), np.nan)
    for mask, c, gg in ((lands, _LANDS, dist), (splice_ok, _SPLICE, splice_gap),
                        (over_ok, _BEAM_OVER, over_gap), (web_ok & near_end, _END_MEET, gap_w),
                        (web_ok & ~near_end, _BEAM_WEB, gap_w), (cap_ok, _COL_CAP, lo - L),
                        (face_ok, _COL_FACE, gap_c)):
        code = np.where(mask, c, code)
        gap = np.where(mask, gg, gap)
    # column ends only take part through splices
    code = np.where((rb == _COLUMN) & (code != _SPLICE), _NONE, code)
    score = np.where(np.isin(code, (_COL_FACE, _BEAM_WEB, _END_MEET)), np.maximum(gap, 0.0),
                     np.abs(gap))
    node = np.where(code == _COL_FACE, np.abs(sd) <= tol.node_tol_mm,
                    np.abs(sgn_w * pm.rx) <= tol.node_tol_mm)
    at_tips = np.where(code == _COL_FACE, at_tips_c, at_tips_w) & np.isin(code, (_COL_FACE, _BEAM_WEB,
                                                                                _END_MEET))
    side = np.where(code == _COL_FACE, side, sgn_w)
    return _Pairs(e, s, code, gap, score, flange, ~known & (code == _COL_FACE), node, side, pm.t,
                  lo, hi, pm.rx, at_tips, np.where(code == _COL_FACE, sd, sgn_w * pm.rx))


def _relaxed_code(arr: MemberArrays, s: int, code: int) -> int:
    """Kind for an explicit pair the geometry does not confirm (by the support's role and the
    tests with the distance limits lifted)."""
    rs = arr.role[s]
    if rs == _COLUMN:
        return _COL_FACE
    if rs == _BEAM:
        return code if code in (_BEAM_WEB, _BEAM_OVER, _SPLICE) else _BEAM_WEB
    return _LANDS


# --------------------------------------------------------------------------------------------------

def find_joints(members: Sequence[Member], bearings: Sequence[Bearing] = (),
                explicit: Sequence[ExplicitConnection] = (), tolerances: Tolerances | None = None,
                policy: str = "conservative") -> "JointFinding":
    """Find every beam-end joint of the frame (see the module docstring for the method).

    ``members``: the frame's members (mm); ``bearings``: walls/slabs beams may bear on;
    ``explicit``: connectivity relations read from the model, used first where present;
    ``tolerances``: :class:`~engine.tolerances.Tolerances` (defaults when ``None``); ``policy``:
    ``conservative`` | ``classified`` | ``envelope`` (see :mod:`engine.stiffness`).
    """
    if policy not in POLICIES:
        raise ConfigError(f"[support] policy {policy!r} is not one of {', '.join(POLICIES)}")
    # building tens of thousands of small frozen records: pause the cyclic garbage collector, whose
    # full passes otherwise grow with the heap and make the time per member climb with model size
    paused = gc.isenabled()
    gc.disable()
    try:
        return _find_joints(members, bearings, explicit, tolerances, policy)
    finally:
        if paused:
            gc.enable()


def _find_joints(members: Sequence[Member], bearings: Sequence[Bearing],
                 explicit: Sequence[ExplicitConnection], tolerances: Tolerances | None,
                 policy: str) -> "JointFinding":
    tol = tolerances or Tolerances()
    members = list(members)
    bearings = list(bearings)
    warnings: list[DataWarning] = []
    seen: set[str] = set()
    for m in members:
        if m.global_id in seen:
            warnings.append(DataWarning("GlobalId used by more than one member; joints of the "
                                        "duplicates may be confused", m.global_id, "joints"))
        seen.add(m.global_id)
    if not members:
        return JointFinding((), (), tuple(warnings), build_graph([], [], bearings))
    arr = MemberArrays.from_members(members, tol)
    index = {gid: i for i, gid in enumerate(arr.ids)}
    unresolved: list[UnresolvedEnd] = []

    # ---- ends
    em_l, ek_l = [], []
    for i, m in enumerate(members):
        if arr.role[i] in (_BEAM, _BRACE, _COLUMN):
            if not arr.valid_axis[i]:
                if arr.role[i] != _COLUMN:
                    for k in (0, 1):
                        unresolved.append(UnresolvedEnd(m.global_id, _ENDS[k],
                                                        "axis unknown (zero length or not finite): "
                                                        "the end cannot be located"))
                continue
            em_l += [i, i]
            ek_l += [0, 1]
    em = np.array(em_l, dtype=np.int64)
    ek = np.array(ek_l, dtype=np.int64)
    pts = arr.end_point(em, ek) if len(em) else np.zeros((0, 3))

    # ---- grid candidates
    valid_idx = np.flatnonzero(arr.valid_axis)
    sup_diag = float(np.max(np.hypot(arr.hd[valid_idx], arr.hb[valid_idx]))) if len(valid_idx) else 0.0
    beam_ext = float(np.max(np.maximum(arr.hd[valid_idx], arr.hb[valid_idx]))) if len(valid_idx) else 0.0
    radius = sup_diag + beam_ext + 2.0 * tol.search_pad_mm
    grid = SegmentGrid.build(arr.c0[valid_idx], arr.c1[valid_idx], radius, pad_points=pts)
    q, si, dist = grid.query(pts, radius)
    s_full = valid_idx[si]
    keep = s_full != em[q]
    q, s_full, dist = q[keep], s_full[keep], dist[keep]
    pr_all = _classify_pairs(arr, em, ek, q, s_full, dist, tol)
    ok = pr_all.code != _NONE
    pr = _Pairs(*(getattr(pr_all, f)[ok] for f in _Pairs.__dataclass_fields__))

    # continuation map: (member, end) -> members continuing collinear from that end
    cont: dict[tuple[int, int], set[int]] = defaultdict(set)
    spl = np.flatnonzero(pr.code == _SPLICE)
    for r in spl:
        m, k, s = int(em[pr.e[r]]), int(ek[pr.e[r]]), int(pr.s[r])
        ks = 0 if pr.t[r] <= arr.length[s] / 2.0 else 1
        cont[(m, k)].add(s)
        cont[(s, ks)].add(m)

    def chained(s1: int, s2: int) -> bool:
        return s2 in cont.get((s1, 0), ()) or s2 in cont.get((s1, 1), ())

    # ---- walls and slabs
    wall_rows: dict[int, list[tuple[int, float, str]]] = defaultdict(list)
    if bearings and len(em):
        bmin = np.array([bb.bbox_min for bb in bearings], dtype=float).reshape(-1, 3)
        bmax = np.array([bb.bbox_max for bb in bearings], dtype=float).reshape(-1, 3)
        beam_ends = np.flatnonzero(arr.role[em] == _BEAM)
        p_b = pts[beam_ends]
        top_b, bot_b = tops_and_bottoms(arr, em[beam_ends], p_b)
        ext_z = p_b[:, 2] - bot_b
        g = tol.joint_gap_mm
        pad_lo = np.array([g, g, tol.bearing_tol_mm])
        pad_hi = np.array([g, g, tol.bearing_tol_mm + (float(ext_z.max()) if len(ext_z) else 0.0)])
        pi, bi = points_in_boxes(p_b, bmin - pad_lo, bmax + pad_hi)
        if len(pi):
            pp, lo_b, hi_b = p_b[pi], bmin[bi], bmax[bi]
            bottom = bot_b[pi]
            inside_plan = np.all((pp[:, :2] >= lo_b[:, :2] - g) & (pp[:, :2] <= hi_b[:, :2] + g), axis=1)
            embed = inside_plan & (pp[:, 2] >= lo_b[:, 2] - tol.bearing_tol_mm) & \
                (pp[:, 2] <= hi_b[:, 2] + tol.bearing_tol_mm)
            on_top = inside_plan & (np.abs(bottom - hi_b[:, 2]) <= tol.bearing_tol_mm) & ~embed
            outside = np.linalg.norm(np.maximum(np.maximum(lo_b[:, :2] - pp[:, :2],
                                                           pp[:, :2] - hi_b[:, :2]), 0.0), axis=1)
            for j in np.flatnonzero(embed | on_top):
                e_idx = int(beam_ends[pi[j]])
                if on_top[j]:
                    # gap = minus the bearing length: how far the end runs past the wall's face
                    u = arr.outward(em[[e_idx]], ek[[e_idx]])[0]
                    flat = np.array([u[0], u[1], 0.0])
                    bl = _embed_length(np.array([pp[j, 0], pp[j, 1], 0.0]), flat,
                                       np.array([lo_b[j, 0], lo_b[j, 1], -1.0]),
                                       np.array([hi_b[j, 0], hi_b[j, 1], 1.0]))
                    wall_rows[e_idx].append((int(bi[j]), -bl, "bears on top of"))
                elif outside[j] > 0.0:
                    wall_rows[e_idx].append((int(bi[j]), float(outside[j]), "stops short of"))
                else:
                    u = arr.outward(em[[e_idx]], ek[[e_idx]])[0]
                    emb = _embed_length(pp[j], u, lo_b[j], hi_b[j])
                    wall_rows[e_idx].append((int(bi[j]), -emb, "is embedded in"))

    # ---- explicit relations
    bearing_index = {bb.global_id: i for i, bb in enumerate(bearings)}
    exp_end: dict[tuple[str, str], dict[str, str]] = defaultdict(dict)
    exp_any: dict[str, dict[str, str]] = defaultdict(dict)
    for c in explicit:
        for x, ex, y in ((c.relating, c.relating_end, c.related), (c.related, c.related_end, c.relating)):
            if x not in index or (y not in index and y not in bearing_index) or x == y:
                continue
            if ex in _ENDS:
                exp_end[(x, ex)].setdefault(y, c.source)
            elif ex == "":
                exp_any[x].setdefault(y, c.source)
    used_explicit: set[tuple[str, str]] = set()

    # ---- per-end selection
    order = np.lexsort((pr.score, pr.e))
    bounds: dict[int, tuple[int, int]] = {}
    if len(order):
        es = pr.e[order]
        starts = np.flatnonzero(np.r_[True, es[1:] != es[:-1]])
        stops = np.r_[starts[1:], len(es)]
        for a0, a1 in zip(starts, stops):
            bounds[int(es[a0])] = (int(a0), int(a1))
    prio_of = np.array([_PRIORITY.get(int(c), 99) for c in pr.code])

    choices: dict[int, _Choice] = {}
    no_candidate: list[int] = []
    pending_meets: list[tuple[int, int, str]] = []   # end meets the end of another beam
    forced: list[tuple[int, int, str]] = []   # explicit pairs the geometry did not find
    for e_idx in range(len(em)):
        m = int(em[e_idx])
        role = arr.role[m]
        gid, endname = arr.ids[m], _ENDS[int(ek[e_idx])]
        a0, a1 = bounds.get(e_idx, (0, 0))
        rows = [int(r) for r in order[a0:a1]]
        if role == _COLUMN:
            col_rows = [r for r in rows if pr.code[r] == _SPLICE]
            if not col_rows or not _is_lower_end(arr, m, int(ek[e_idx])):
                continue
            choices[e_idx] = _Choice(e_idx, row=col_rows[0])
            continue
        exp = dict(exp_any.get(gid, {}))
        exp.update(exp_end.get((gid, endname), {}))
        exp_rows = [r for r in rows if arr.ids[int(pr.s[r])] in exp]
        geo = _select(rows, pr, prio_of, arr, chained, tol, role)
        if exp_rows:
            ch = _select(exp_rows, pr, prio_of, arr, chained, tol, role)
            if isinstance(ch, _Choice):
                ch.e = e_idx
                sid = arr.ids[int(pr.s[ch.row])]
                ch.source = exp[sid]
                used_explicit.add((gid, sid))
                if isinstance(geo, _Choice) and geo.row is not None and \
                        int(pr.s[geo.row]) != int(pr.s[ch.row]) and \
                        not chained(int(pr.s[geo.row]), int(pr.s[ch.row])):
                    warnings.append(DataWarning(
                        f"{endname} end: the model's {exp[sid]} names {sid} as the support, the "
                        f"geometry finds {arr.ids[int(pr.s[geo.row])]} nearer; the relation is used",
                        gid, "joints"))
                choices[e_idx] = ch
                continue
        spec = exp_end.get((gid, endname), {})
        member_spec = [y for y in spec if y in index]
        if member_spec and not exp_rows:
            y = sorted(member_spec)[0]
            forced.append((e_idx, index[y], spec[y]))
            used_explicit.add((gid, y))
            continue
        if isinstance(geo, _Choice):
            geo.e = e_idx
            choices[e_idx] = geo
            continue
        if isinstance(geo, str):
            unresolved.append(UnresolvedEnd(gid, endname, geo))
            continue
        if isinstance(geo, tuple):
            pending_meets.append((e_idx, geo[1], geo[2]))
            continue
        walls = sorted(wall_rows.get(e_idx, []), key=lambda w: (abs(w[1]), bearings[w[0]].global_id))
        if walls:
            exp_w = [w for w in walls if bearings[w[0]].global_id in exp]
            w = (exp_w or walls)[0]
            ch = _Choice(e_idx, wall=w[0], wall_gap=w[1], wall_mode=w[2])
            if exp_w:
                ch.source = exp[bearings[w[0]].global_id]
                used_explicit.add((gid, bearings[w[0]].global_id))
            choices[e_idx] = ch
            continue
        no_candidate.append(e_idx)

    # an end meeting the end of another beam: a web joint near that beam's end when that end is
    # carried by something else; a corner of two beams carrying only each other stays unresolved
    end_of = {(int(em[i]), int(ek[i])): i for i in range(len(em))}
    for e_idx, r, reason in pending_meets:
        m, s_m = int(em[e_idx]), int(pr.s[r])
        ks = 0 if pr.t[r] <= arr.length[s_m] / 2.0 else 1
        other = choices.get(end_of.get((s_m, ks), -1))
        carried = other is not None and (other.wall is not None or (
            other.row is not None and int(pr.s[other.row]) != m))
        if carried:
            pr.code[r] = _BEAM_WEB
            choices[e_idx] = _Choice(e_idx, row=r, notes=[
                f"frames into {arr.ids[s_m]} close to its end, which is carried by "
                f"{_carrier_label(arr, bearings, pr, other)}"])
        elif wall_rows.get(e_idx):
            w = sorted(wall_rows[e_idx], key=lambda w: (abs(w[1]), bearings[w[0]].global_id))[0]
            choices[e_idx] = _Choice(e_idx, wall=w[0], wall_gap=w[1], wall_mode=w[2])
        else:
            unresolved.append(UnresolvedEnd(arr.ids[m], _ENDS[int(ek[e_idx])], reason))

    # explicit pairs the geometry does not confirm: used, with a warning
    if forced:
        fe = np.array([f[0] for f in forced], dtype=np.int64)
        fs = np.array([f[1] for f in forced], dtype=np.int64)
        fd = np.linalg.norm(pts[fe] - arr.c0[fs], axis=1)
        fp_all = _classify_pairs(arr, em, ek, fe, fs, fd, tol, relaxed=True)
        base = len(pr.e)
        merged = {f: np.concatenate([getattr(pr, f), getattr(fp_all, f)])
                  for f in _Pairs.__dataclass_fields__}
        codes = merged["code"]
        for i, (e_idx, s, src) in enumerate(forced):
            codes[base + i] = _relaxed_code(arr, s, int(codes[base + i]))
        pr = _Pairs(**merged)
        for i, (e_idx, s, src) in enumerate(forced):
            gid = arr.ids[int(em[e_idx])]
            endname = _ENDS[int(ek[e_idx])]
            choices[e_idx] = _Choice(e_idx, row=base + i, source=src)
            warnings.append(DataWarning(
                f"{endname} end: the model's {src} names {arr.ids[s]} as the support, but the geometry "
                f"does not put the end at it (about {fd[i]:.0f} mm from its axis, beyond the "
                "tolerances); the relation is used", gid, "joints"))

    for c in explicit:
        for x, y in ((c.relating, c.related), (c.related, c.relating)):
            if x in index and arr.role[index[x]] in (_BEAM, _BRACE) and (y in index or y in bearing_index):
                if (x, y) not in used_explicit and (y, x) not in used_explicit:
                    warnings.append(DataWarning(
                        f"the model's {c.source} connects {x} and {y}, but no end joint between them "
                        "was found in the geometry", x, "joints"))
                    used_explicit.add((x, y))

    # ---- free ends
    supported_members = {int(em[c.e]) for c in choices.values()}
    for e_idx in no_candidate:
        m = int(em[e_idx])
        gid, endname = arr.ids[m], _ENDS[int(ek[e_idx])]
        if arr.role[m] == _BRACE:
            unresolved.append(UnresolvedEnd(gid, endname, "brace end: no member within tolerance "
                                            f"({tol.joint_gap_mm:g} mm of a face)"))
        elif m in supported_members:
            choices[e_idx] = _Choice(e_idx, notes=[
                f"free end: no member, wall or slab within {tol.joint_gap_mm:g} mm of the end; the "
                "other end is supported → cantilever tip (check it is meant to be free)"])
        else:
            unresolved.append(UnresolvedEnd(gid, endname,
                              "no support at either end within the tolerances: the member floats "
                              "(missing support, misplaced axis, or tolerances too tight)"))

    joints = _build_joints(arr, members, bearings, em, ek, pts, pr, choices, cont, tol, policy)
    joints.sort(key=lambda j: (index[j.beam], _ENDS.index(j.end)))
    unresolved.sort(key=lambda u: (index.get(u.beam, -1), _ENDS.index(u.end) if u.end in _ENDS else 2))
    graph = build_graph(members, joints, bearings)
    return JointFinding(tuple(joints), tuple(unresolved), tuple(warnings), graph)


def _carrier_label(arr: MemberArrays, bearings: list[Bearing], pr: "_Pairs", ch: "_Choice") -> str:
    if ch.wall is not None:
        return bearings[ch.wall].name or bearings[ch.wall].global_id
    return arr.ids[int(pr.s[ch.row])]


def _embed_length(p: np.ndarray, u: np.ndarray, lo: np.ndarray, hi: np.ndarray) -> float:
    """Distance from ``p`` (inside the box) back along ``-u`` to the box's boundary (mm)."""
    d = -u / max(float(np.linalg.norm(u)), 1e-12)
    ts = []
    for k in range(3):
        if abs(d[k]) > 1e-12:
            ts.append(((hi[k] if d[k] > 0 else lo[k]) - p[k]) / d[k])
    return float(max(0.0, min(ts))) if ts else 0.0


def _is_lower_end(arr: MemberArrays, m: int, k: int) -> bool:
    z0, z1 = arr.c0[m][2], arr.c1[m][2]
    return (z0 <= z1) if k == 0 else (z1 < z0)


def _select(rows: list[int], pr: _Pairs, prio_of: np.ndarray, arr: MemberArrays, chained, tol: Tolerances,
            role: int) -> "_Choice | str | None":
    """Pick the support among candidate rows of one end: a choice, an unresolved reason, or None."""
    if not rows:
        return None
    codes = {r: int(pr.code[r]) for r in rows}
    # end-meets-end with two collinear members of one girder = a web landing on a continuous girder
    meets = [r for r in rows if codes[r] == _END_MEET]
    chain_via: dict[int, str] = {}
    for r1 in meets:
        for r2 in meets:
            if r1 != r2 and chained(int(pr.s[r1]), int(pr.s[r2])):
                codes[r1] = _BEAM_WEB
                chain_via[r1] = arr.ids[int(pr.s[r2])]
    best = min(_PRIORITY[codes[r]] for r in rows)
    group = [r for r in rows if _PRIORITY[codes[r]] == best]
    if role == _BEAM and best == _PRIORITY[_LANDS]:
        s = int(pr.s[group[0]])
        return (f"lands on {arr.ids[s]} (role {_role_name(arr.role[s])}), not on a beam, column, wall or "
                "slab: check what carries this end")
    if role == _BEAM and best == _PRIORITY[_END_MEET]:
        s = int(pr.s[group[0]])
        return ("meet", group[0],
                f"meets the end of {arr.ids[s]} with no column or continuing member there: which member "
                "carries which is not clear")
    # merge collinear segments of one member into chains
    chains: list[list[int]] = []
    for r in group:
        for c in chains:
            if any(chained(int(pr.s[r]), int(pr.s[x])) for x in c):
                c.append(r)
                break
        else:
            chains.append([r])
    scored = sorted(((min(float(pr.score[x]) for x in c), c) for c in chains), key=lambda t: t[0])
    if len(scored) > 1 and scored[1][0] - scored[0][0] <= tol.ambiguity_mm:
        a, b = arr.ids[int(pr.s[scored[0][1][0]])], arr.ids[int(pr.s[scored[1][1][0]])]
        return (f"two candidate supports equally near: {a} and {b} (within {tol.ambiguity_mm:g} mm); "
                "not guessed")
    chain = scored[0][1]
    if len(chain) == 1:
        r = chain[0]
        ch = _Choice(-1, row=r, via=chain_via.get(r))
    else:
        if int(pr.code[chain[0]]) == _COL_FACE or arr.role[int(pr.s[chain[0]])] == _COLUMN:
            # the lower column carries the beam down; the upper one makes it continuous
            chain.sort(key=lambda x: (min(arr.c0[int(pr.s[x])][2], arr.c1[int(pr.s[x])][2]),
                                      arr.ids[int(pr.s[x])]))
        else:
            chain.sort(key=lambda x: (float(pr.score[x]), arr.ids[int(pr.s[x])]))
        r = chain[0]
        ch = _Choice(-1, row=r, via=arr.ids[int(pr.s[chain[1]])])
    if codes[r] != int(pr.code[r]):
        pr.code[r] = codes[r]
    return ch


def _role_name(code: int) -> str:
    return ("beam", "column", "brace", "other")[int(code)]


# --------------------------------------------------------------------------------------------------
# joints, geometry, classification

_KIND_OF = {_COL_CAP: "unknown", _BEAM_WEB: "beam-web", _BEAM_OVER: "beam-over", _SPLICE: "splice",
            _END_MEET: "beam-web", _LANDS: "unknown"}


def _fmt(x: float) -> str:
    return f"{x:.0f}"


def _build_joints(arr: MemberArrays, members: list[Member], bearings: list[Bearing], em: np.ndarray,
                  ek: np.ndarray, pts: np.ndarray, pr: _Pairs, choices: dict[int, _Choice],
                  cont: dict[tuple[int, int], set[int]], tol: Tolerances, policy: str) -> list[Joint]:
    sel = sorted(c for c in choices if choices[c].row is not None)
    rows = np.array([choices[c].row for c in sel], dtype=np.int64)
    e_of = np.array(sel, dtype=np.int64)
    b = em[e_of] if len(sel) else np.zeros(0, np.int64)
    s = pr.s[rows] if len(sel) else np.zeros(0, np.int64)
    codes = pr.code[rows] if len(sel) else np.zeros(0, np.int64)
    gaps = pr.gap[rows] if len(sel) else np.zeros(0)
    angle = angle_between_deg(arr, b, s) if len(sel) else np.zeros(0)
    web_rows = np.flatnonzero(np.isin(codes, (_BEAM_WEB, _END_MEET)))
    tos = np.full(len(sel), np.nan)
    copes: dict[int, tuple] = {}
    if len(web_rows):
        tw, cw = copes_for_web_joints(arr, b[web_rows], ek[e_of[web_rows]], s[web_rows],
                                      gaps[web_rows], tol)
        tos[web_rows] = tw
        copes = {int(i): c for i, c in zip(web_rows, cw)}
    over_rows = np.flatnonzero(codes == _BEAM_OVER)
    if len(over_rows):
        ec = arr.end_point(b[over_rows], ek[e_of[over_rows]])
        top_b, _ = tops_and_bottoms(arr, b[over_rows], ec)
        t = np.einsum("ij,ij->i", ec - arr.c0[s[over_rows]], arr.a[s[over_rows]])
        foot = arr.c0[s[over_rows]] + t[:, None] * arr.a[s[over_rows]]
        top_s, _ = tops_and_bottoms(arr, s[over_rows], foot)
        tos[over_rows] = top_b - top_s

    # continuity (vectorised facts, assembled per joint below)
    L = arr.length[s] if len(sel) else np.zeros(0)
    t = pr.t[rows] if len(sel) else np.zeros(0)
    ext_a = np.maximum(pr.hi[rows] - pr.lo[rows], 0.0) / 2.0 if len(sel) else np.zeros(0)
    is_col = (codes == _COL_FACE)
    pos = np.where(is_col, (pr.lo[rows] + pr.hi[rows]) / 2.0 if len(sel) else 0.0, t)
    room_before = pos - ext_a
    room_after = L - pos - ext_a

    ids = arr.ids
    gidx = {g: n for n, g in enumerate(ids)}
    # plain lists for the per-joint assembly (numpy scalar indexing is slow in loops)
    codes_l, s_l, b_l = codes.tolist(), s.tolist(), b.tolist()
    is_col_l, pos_l, L_l = is_col.tolist(), pos.tolist(), L.tolist()
    rb_l, ra_l = room_before.tolist(), room_after.tolist()
    flange_l = pr.flange[rows].tolist() if len(sel) else []
    side_l = pr.side[rows].tolist() if len(sel) else []
    role_l, az_l, length_l = arr.role.tolist(), arr.a[:, 2].tolist(), arr.length.tolist()
    gaps_l, angle_l, tos_l = gaps.tolist(), angle.tolist(), tos.tolist()
    rows_l = rows.tolist()
    inferred_l = pr.inferred[rows].tolist() if len(sel) else []
    is_i_l = arr.is_i.tolist()
    loc_all = arr.end_point(em, ek, centroid=False).tolist()
    info: dict[int, dict[str, Any]] = {}
    for i, e_idx in enumerate(sel):
        ch = choices[e_idx]
        code = codes_l[i]
        si, bi = s_l[i], b_l[i]
        d: dict[str, Any] = {"i": i, "code": code, "support": ids[si]}
        kind = _KIND_OF.get(code)
        if code == _COL_FACE:
            kind = "column-flange" if flange_l[i] else "column-web"
        if role_l[bi] == _BRACE:
            kind = "unknown"
        d["kind"] = kind
        # continuity along the support
        cont_flag: bool | None = None
        h_before = h_after = None
        via = ch.via
        if code in (_COL_FACE, _BEAM_WEB, _END_MEET, _BEAM_OVER):
            # which member end is "before" (t=0 side, or column bottom)
            k_before = 0 if (not is_col_l[i] or az_l[si] >= 0.0) else 1
            k_after = 1 - k_before
            before_ok = rb_l[i] >= tol.continuity_mm
            after_ok = ra_l[i] >= tol.continuity_mm
            h_before, h_after = pos_l[i], L_l[i] - pos_l[i]
            nb = sorted(cont.get((si, k_before), ()), key=lambda x: ids[x])
            na = sorted(cont.get((si, k_after), ()), key=lambda x: ids[x])
            if not before_ok and nb:
                before_ok, via = True, via or ids[nb[0]]
                h_before += length_l[nb[0]]
            if not after_ok and na:
                after_ok, via = True, via or ids[na[0]]
                h_after += length_l[na[0]]
            if ch.via:
                before_ok = after_ok = True
            cont_flag = bool(before_ok and after_ok)
        d.update(cont=cont_flag, via=via, h_before=h_before, h_after=h_after)
        info[e_idx] = d

    # back-to-back partners: same support, same face family, opposite sides, close along the support
    by_support: dict[tuple[int, str], list[int]] = defaultdict(list)
    for e_idx, d in info.items():
        if d["kind"] in ("column-flange", "column-web", "beam-web"):
            by_support[(s_l[d["i"]], d["kind"])].append(e_idx)
    partner: dict[int, int] = {}
    for (_, _), lst in by_support.items():
        if len(lst) < 2:
            continue
        lst.sort(key=lambda x: pos_l[info[x]["i"]])
        for x in lst:
            if x in partner:
                continue
            ix = info[x]["i"]
            best, best_d = None, None
            for y in lst:
                if y == x or y in partner:
                    continue
                iy = info[y]["i"]
                if side_l[ix] * side_l[iy] >= 0:
                    continue
                dd = abs(pos_l[ix] - pos_l[iy])
                if dd <= tol.back_to_back_mm and (best_d is None or dd < best_d):
                    best, best_d = y, dd
            if best is not None:
                partner[x], partner[best] = best, x

    joints: list[Joint] = []
    for e_idx in sorted(choices):
        ch = choices[e_idx]
        m = int(em[e_idx])
        gid, endname = ids[m], _ENDS[int(ek[e_idx])]
        loc = tuple(loc_all[e_idx])
        member = members[m]
        if ch.row is None and ch.wall is None:  # free end
            v_st, v_rs = apply_policy(classify(SupportFacts(kind="free-end")), policy)
            joints.append(Joint(joint_id(gid, endname, None), gid, endname, None, "free-end",
                                JointGeometry(location=loc), v_st, tuple(ch.notes) + v_rs, "geometry"))
            continue
        if ch.wall is not None:
            bb = bearings[ch.wall]
            label = bb.name or bb.global_id
            what = {"bears on top of": f"bearing length {_fmt(-ch.wall_gap)} mm",
                    "is embedded in": f"embedded {_fmt(-ch.wall_gap)} mm"}.get(
                ch.wall_mode, f"gap {_fmt(ch.wall_gap)} mm")
            reasons = [f"{ch.wall_mode} {bb.ifc_class} {label} ({what})"]
            if ch.source != "geometry":
                reasons.append(f"from the model's {ch.source}")
            st, rs = apply_policy(classify(SupportFacts(kind="wall", support_label=label)), policy)
            joints.append(Joint(joint_id(gid, endname, bb.global_id), gid, endname, bb.global_id,
                                "wall", JointGeometry(location=loc, gap=float(ch.wall_gap)), st,
                                tuple(reasons) + rs, ch.source))
            continue
        d = info[e_idx]
        i = d["i"]
        r = rows_l[i]
        si = s_l[i]
        sup = members[si]
        kind = d["kind"]
        code = d["code"]
        jid = joint_id(gid, endname, sup.global_id)
        gap = gaps_l[i]
        reasons = _kind_reasons(arr, pr, r, code, kind, m, si, member, sup, gap, angle_l[i], tol)
        if ch.source != "geometry":
            reasons.insert(0, f"from the model's {ch.source}")
        reasons += ch.notes
        if d["via"] and d["cont"]:
            reasons.append(f"{sup.label} continues through the joint as {members[gidx[d['via']]].label}")
        partner_id = partner_label = None
        similar = ratio = None
        if e_idx in partner:
            pe = partner[e_idx]
            pm_ = members[int(em[pe])]
            partner_id = joint_id(pm_.global_id, _ENDS[int(ek[pe])], sup.global_id)
            partner_label = pm_.label
            ratio = _ratio(length_l[m], length_l[int(em[pe])])
            dr = _ratio(member.section.depth, pm_.section.depth) if member.section.depth and \
                pm_.section.depth else 1.0
            similar = ratio <= tol.balance_ratio and dr <= tol.balance_ratio
            reasons.append(f"back-to-back with {pm_.label} on the other side (joint {partner_id}, span "
                           f"ratio {ratio:.2f})")
        cp = copes.get(i, ())
        for c in cp:
            reasons.append(f"{c.where} cope {c.depth:.0f} deep × {c.length:.0f} long required to clear "
                           f"the flange of {sup.label}")
        tos_v = None if math.isnan(tos_l[i]) else tos_l[i]
        geom = JointGeometry(location=loc, angle_deg=angle_l[i], gap=gap, tos_diff=tos_v,
                             copes=tuple(cp), support_continuous=d["cont"], back_to_back=partner_id)
        facts = SupportFacts(kind=kind, support_label=sup.label, continuous=d["cont"],
                             partner_label=partner_label, partner_similar=similar, span_ratio=ratio,
                             beam_section=member.section, support_section=sup.section,
                             beam_length=length_l[m], h_before=d["h_before"], h_after=d["h_after"],
                             orientation_known=not inferred_l[i],
                             support_is_i=is_i_l[si])
        if kind == "unknown":
            facts = SupportFacts(kind="unknown", support_label=sup.label)
        st, rs = apply_policy(classify(facts), policy)
        joints.append(Joint(jid, gid, endname, sup.global_id, kind, geom, st, tuple(reasons) + rs,
                            ch.source))
    return joints


def _ratio(a: float | None, b: float | None) -> float:
    if not a or not b:
        return float("inf")
    return max(a, b) / min(a, b)


def _kind_reasons(arr: MemberArrays, pr: _Pairs, r: int, code: int, kind: str, bi: int, si: int,
                  beam: Member, sup: Member, gap: float, angle: float, tol: Tolerances) -> list[str]:
    out: list[str] = []
    node = bool(pr.node[r])
    if code == _COL_FACE:
        face = "flange" if kind == "column-flange" or pr.flange[r] else "web"
        how = ("arrives along the column's web direction" if face == "flange" else
               "arrives square to the column's web")
        if pr.inferred[r]:
            how = "column orientation not in the model; face inferred from the end's distance"
        out.append(f"frames into the {face} of column {sup.label} ({how})")
    elif code in (_BEAM_WEB, _END_MEET):
        out.append(f"frames into the web of girder {sup.label}")
    elif code == _BEAM_OVER:
        out.append(f"bears on the top flange of {sup.label} (underside {gap:+.0f} mm from its top)")
    elif code == _SPLICE:
        out.append(f"collinear with {sup.label}, end to end (gap {gap:.0f} mm): the member continues "
                   "(splice, or a member split at a node)")
    elif code == _COL_CAP:
        out.append(f"bears on the cap of column {sup.label} (top of column): cap-plate joint, not a "
                   "fin plate — type not checked")
    elif code == _LANDS:
        out.append(f"lands on {sup.label} (role {sup.role})")
    if arr.role[bi] == _BRACE:
        out.append("brace end: gusset connection, not a fin-plate joint — recognised, type not checked")
    if code in (_COL_FACE, _BEAM_WEB, _END_MEET):
        if node:
            out.append("axes meet (node-to-node model)")
        elif pr.at_tips[r]:
            out.append(f"end {gap:.0f} mm from the web face, stopping at the flange tips of "
                       f"{sup.label}: an extended (long) fin plate or a cope and longer beam is needed")
        elif pr.sd[r] < -tol.node_tol_mm:
            out.append(f"end runs {-pr.sd[r]:.0f} mm past the axis of {sup.label} (the beam overruns "
                       "its support: check the model)")
        elif gap < -tol.clash_tol_mm:
            out.append(f"end runs {-gap:.0f} mm into the support face (clash in the model?)")
        else:
            out.append(f"end {gap:.0f} mm short of the support face (detailed model)")
        skew = abs(90.0 - angle)
        if skew > tol.angle_tol_deg:
            out.append(f"skewed: {skew:.0f}° off square to the support")
    if kind == "column-web" and sup.section.depth and beam.section.width and arr.is_i[si]:
        clear = sup.section.depth - 2.0 * (sup.section.flange_thickness or 0.0)
        if beam.section.width > clear:
            out.append(f"beam flange ({beam.section.width:.0f} mm) wider than the clear depth between the "
                       f"column flanges ({clear:.0f} mm): flanges must be cut back")
    return out


# --------------------------------------------------------------------------------------------------

def _r(x: float | None, nd: int = 1) -> float | None:
    return None if x is None or (isinstance(x, float) and math.isnan(x)) else round(float(x), nd)


def joint_rows(finding: JointFinding, members: Sequence[Member]) -> list[dict]:
    """Plain JSON-serialisable rows, one per joint, for ``joint-audit inspect --joints``.

    Keys: id, beam, beam_label, end, support, support_label, kind, stiffness, reasons, gap_mm,
    angle_deg, tos_diff_mm, copes (list of {where, depth_mm, length_mm}), support_continuous,
    back_to_back, source, location_mm. Lengths in mm rounded to 0.1 mm. Unresolved ends are in
    ``finding.unresolved``.
    """
    labels = {m.global_id: m.label for m in members}
    labels.update({n: d.get("label") for n, d in finding.graph.nodes(data=True)
                   if n not in labels and d.get("label")})
    out = []
    for j in finding.joints:
        g = j.geometry
        out.append({
            "id": j.id, "beam": j.beam, "beam_label": labels.get(j.beam, j.beam), "end": j.end,
            "support": j.support, "support_label": labels.get(j.support, j.support) if j.support else None,
            "kind": j.kind, "stiffness": j.stiffness, "reasons": list(j.reasons),
            "gap_mm": _r(g.gap), "angle_deg": _r(g.angle_deg), "tos_diff_mm": _r(g.tos_diff),
            "copes": [{"where": c.where, "depth_mm": _r(c.depth), "length_mm": _r(c.length)}
                      for c in g.copes],
            "support_continuous": g.support_continuous, "back_to_back": g.back_to_back,
            "source": j.source, "location_mm": [_r(v) for v in g.location],
        })
    return out
