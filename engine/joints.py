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

import math
from collections import defaultdict
from dataclasses import dataclass, field
from typing import TYPE_CHECKING, Any, Sequence

import numpy as np

from engine.gc_pause import cycle_collection_paused
from engine.memory import give_back_free_memory
from engine.joint_geometry import (MemberArrays, angle_between_deg, copes_for_web_joints,
                                   pair_metrics, tops_and_bottoms)
from engine.model import (Bearing, Cope, DataWarning, ExplicitConnection, Joint, JointGeometry, Member,
                          joint_id)
from engine.spatial import SegmentGrid, points_in_boxes
from engine.stiffness import (POLICIES, SupportFacts, apply_policy, classify, classify_batch,
                              relative_stiffness_batch)
from engine.errors import ConfigError
from engine.tolerances import Tolerances

if TYPE_CHECKING:  # networkx is loaded only when a graph is built (engine.graph)
    import networkx as nx

__all__ = ["UnresolvedEnd", "JointFinding", "find_joints", "joint_rows"]

# candidate codes and their priority (lower wins)
_NONE, _COL_FACE, _COL_CAP, _BEAM_WEB, _BEAM_OVER, _SPLICE, _END_MEET, _LANDS, _WALL = range(9)
_PRIORITY = {_COL_FACE: 1, _COL_CAP: 1, _BEAM_WEB: 2, _BEAM_OVER: 2, _SPLICE: 3, _END_MEET: 4,
             _WALL: 5, _LANDS: 6}
_PRIO_TABLE = np.array([_PRIORITY.get(c, 99) for c in range(9)], dtype=np.int64)
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
    :mod:`engine.graph`; built the first time it is asked for (the audit itself does not need it,
    and on large frames it costs time and memory), from ``graph_source`` = (members, joints,
    bearings), or given ready-made.
    """

    joints: tuple[Joint, ...]
    unresolved: tuple[UnresolvedEnd, ...]
    warnings: tuple[DataWarning, ...]
    graph_source: tuple = field(default=((), (), ()), repr=False)
    _graph: list = field(default_factory=list, repr=False)

    @property
    def graph(self) -> nx.MultiDiGraph:
        """The networkx graph of members and joints (:mod:`engine.graph`), built once on first use."""
        if not self._graph:
            from engine.graph import build_graph  # networkx is loaded only when the graph is asked for

            self._graph.append(build_graph(*self.graph_source))
        return self._graph[0]

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
    # building tens of thousands of small frozen records: the cyclic collector's full passes would
    # otherwise grow with the heap and make the time per member climb with model size
    with cycle_collection_paused():
        return _find_joints(members, bearings, explicit, tolerances, policy)


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
        return JointFinding((), (), tuple(warnings), ((), (), tuple(bearings)))
    arr = MemberArrays.from_members(members, tol)
    index = {gid: i for i, gid in enumerate(arr.ids)}
    unresolved: list[UnresolvedEnd] = []

    # ---- ends
    has_ends = np.isin(arr.role, (_BEAM, _BRACE, _COLUMN))
    for i in np.flatnonzero(has_ends & ~arr.valid_axis & (arr.role != _COLUMN)).tolist():
        for k in (0, 1):
            unresolved.append(UnresolvedEnd(members[i].global_id, _ENDS[k],
                                            "axis unknown (zero length or not finite): "
                                            "the end cannot be located"))
    em = np.repeat(np.flatnonzero(has_ends & arr.valid_axis), 2)
    ek = np.tile(np.array([0, 1], dtype=np.int64), len(em) // 2)
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
    # the pair tests run on runs of candidate pairs, each run's kept pairs taken at once: the tests'
    # dozens of intermediate arrays then never exist for every candidate together (tens of MB on a
    # large model); every test is row by row, so the kept pairs are the same
    fields = tuple(_Pairs.__dataclass_fields__)
    runs = []
    for i in range(0, max(len(q), 1), _PAIR_RUN):
        part = _classify_pairs(arr, em, ek, q[i:i + _PAIR_RUN], s_full[i:i + _PAIR_RUN], dist[i:i + _PAIR_RUN], tol)
        ok = part.code != _NONE
        runs.append([getattr(part, f)[ok] for f in fields])
    pr = _Pairs(*(np.concatenate([r[k] for r in runs]) for k in range(len(fields))))
    # the grid and every candidate pair (many times the pairs kept) are done with: freed now, not
    # held through the making of the joints, where the finder's memory peaks
    del grid, q, si, dist, s_full, keep, runs, part, ok
    give_back_free_memory()  # engine.memory: the scratch of the pair tests leaves the process

    # continuation map: (member, end) -> members continuing collinear from that end
    cont: dict[tuple[int, int], set[int]] = defaultdict(set)
    spl = np.flatnonzero(pr.code == _SPLICE)
    spl_s = pr.s[spl]
    spl_ks = np.where(pr.t[spl] <= arr.length[spl_s] / 2.0, 0, 1)
    for m, k, s, ks in zip(em[pr.e[spl]].tolist(), ek[pr.e[spl]].tolist(), spl_s.tolist(),
                           spl_ks.tolist()):
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
    # Most ends have one candidate of the best kind and no explicit relation: those (and column ends,
    # which only take a splice) are decided for all ends at once; the rest go through _select.
    order = np.lexsort((pr.score, pr.e))
    n_end = len(em)
    counts = np.bincount(pr.e, minlength=n_end)
    first = np.cumsum(counts) - counts
    prio_of = _PRIO_TABLE[pr.code]
    role_e = arr.role[em]
    exp_ids = set(exp_any) | {x for x, _ in exp_end}
    explicit_e = (np.fromiter((g in exp_ids for g in arr.ids), dtype=bool, count=len(arr.ids))[em]
                  if exp_ids else np.zeros(n_end, dtype=bool))
    spl_m = em[pr.e[spl]]
    chain_keys = np.sort(np.r_[np.minimum(spl_m, spl_s) * len(members) + np.maximum(spl_m, spl_s)])
    row_of, via_of = _quick_rows(arr, em, ek, pr, prio_of, order, first, counts, explicit_e,
                                 chain_keys)

    choices: dict[int, _Choice] = {}
    no_candidate: list[int] = []
    pending_meets: list[tuple[int, int, str]] = []   # end meets the end of another beam
    forced: list[tuple[int, int, str]] = []   # explicit pairs the geometry did not find
    first_l, counts_l, order_l = first.tolist(), counts.tolist(), order.tolist()
    for e_idx in np.flatnonzero((row_of < 0) & (role_e != _COLUMN)).tolist():
        m = int(em[e_idx])
        role = arr.role[m]
        gid, endname = arr.ids[m], _ENDS[int(ek[e_idx])]
        rows = order_l[first_l[e_idx]:first_l[e_idx] + counts_l[e_idx]]
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

    def choice_at(e: int) -> "_Choice | None":
        """The choice made for end ``e`` (-1: no such end), from either path."""
        if e < 0:
            return None
        if e in choices:
            return choices[e]
        return _Choice(e, row=int(row_of[e])) if row_of[e] >= 0 else None

    # an end meeting the end of another beam: a web joint near that beam's end when that end is
    # carried by something else; a corner of two beams carrying only each other stays unresolved
    end_of = np.full((len(members), 2), -1, dtype=np.int64)
    end_of[em, ek] = np.arange(n_end)
    for e_idx, r, reason in pending_meets:
        m, s_m = int(em[e_idx]), int(pr.s[r])
        ks = 0 if pr.t[r] <= arr.length[s_m] / 2.0 else 1
        other = choice_at(int(end_of[s_m, ks]))
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
    supported_members = {int(em[c.e]) for c in choices.values()} | set(em[row_of >= 0].tolist())
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

    for e_idx, ch in choices.items():
        if ch.row is not None:
            row_of[e_idx] = ch.row
    joints, joint_e = _build_joints(arr, members, bearings, em, ek, pr, row_of, via_of, choices, cont,
                                    tol, policy)
    if len(index) != len(members):
        # duplicate GlobalIds: order by the last member carrying the id, as the index does
        last = np.array([index[g] for g in arr.ids], dtype=np.int64)
        key = last[em[joint_e]] * 2 + ek[joint_e]
        joints = [joints[i] for i in np.argsort(key, kind="stable").tolist()]
    unresolved.sort(key=lambda u: (index.get(u.beam, -1), _ENDS.index(u.end) if u.end in _ENDS else 2))
    return JointFinding(tuple(joints), tuple(unresolved), tuple(warnings),
                        (tuple(members), tuple(joints), tuple(bearings)))


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


def _quick_rows(arr: MemberArrays, em: np.ndarray, ek: np.ndarray, pr: _Pairs, prio_of: np.ndarray,
                order: np.ndarray, first: np.ndarray, counts: np.ndarray, explicit_e: np.ndarray,
                chain_keys: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """The chosen candidate row per end where no per-end logic is needed, else -1, and the member
    that makes the support continuous (``via``), else -1 (arrays over ends).

    ``order`` sorts the candidate rows by end, then score; ``first``/``counts`` give each end's slice
    of it; ``chain_keys`` are the sorted keys ``min * n + max`` of the member pairs joined by a splice
    (collinear segments of one member). Decided here, as :func:`_select` would:

    - a column's lower end takes its nearest splice (its other candidates are not joints);
    - a beam or brace end with no explicit relation and no end-meets-end candidate (or one, but a
      column of the best kind), whose candidates of the best kind are one support, or two segments
      of one member (one chain): the single support; of a chain, the lower segment when the support
      is a column (the upper one is ``via``), else the nearer (then by GlobalId). A beam landing on
      a brace is left to :func:`_select`, as is every other end.
    """
    n_end = len(em)
    row = np.full(n_end, -1, dtype=np.int64)
    via = np.full(n_end, -1, dtype=np.int64)
    if len(order) == 0:
        return row, via
    es = pr.e[order]
    code_s = pr.code[order]
    p_s = prio_of[order]
    has = counts > 0
    best = np.full(n_end, 99, dtype=np.int64)
    best[has] = np.minimum.reduceat(p_s, first[has])
    is_best = p_s == best[es]
    n_best = np.bincount(es[is_best], minlength=n_end)
    meet = np.bincount(es[code_s == _END_MEET], minlength=n_end) > 0
    role_e = arr.role[em]
    # end-meets-end candidates matter only where, promoted to girder-web candidates, they could
    # join the best group (not where a column is the best kind)
    plain = (((role_e == _BEAM) | (role_e == _BRACE)) & ~explicit_e
             & (~meet | (best < _PRIORITY[_BEAM_WEB]))
             & ~((role_e == _BEAM) & (best == _PRIORITY[_LANDS])))
    # the first two best rows of each end, in score order
    pos = np.flatnonzero(is_best)
    ends_b, at = _first_of_runs(es[pos])
    r0 = np.full(n_end, -1, dtype=np.int64)
    r1 = np.full(n_end, -1, dtype=np.int64)
    r0[ends_b] = order[pos[at]]
    two = ends_b[n_best[ends_b] == 2]
    r1[two] = order[pos[at[n_best[ends_b] == 2] + 1]]
    one = plain & (n_best == 1)
    row[one] = r0[one]
    # two best rows on two segments of one member
    e2 = np.flatnonzero(plain & (n_best == 2))
    if len(e2) and len(chain_keys):
        a, b = r0[e2], r1[e2]
        sa, sb = pr.s[a], pr.s[b]
        key = np.minimum(sa, sb) * len(arr.ids) + np.maximum(sa, sb)
        hit = np.searchsorted(chain_keys, key)
        chained = chain_keys[np.minimum(hit, len(chain_keys) - 1)] == key
        e2, a, b, sa, sb = e2[chained], a[chained], b[chained], sa[chained], sb[chained]
        col = (pr.code[a] == _COL_FACE) | (arr.role[sa] == _COLUMN)
        z = np.minimum(arr.c0[:, 2], arr.c1[:, 2])
        ka = np.where(col, z[sa], pr.score[a])
        kb = np.where(col, z[sb], pr.score[b])
        b_first = kb < ka
        tie = np.flatnonzero(kb == ka)
        ids = arr.ids
        b_first[tie] = [ids[y] < ids[x] for x, y in zip(sa[tie].tolist(), sb[tie].tolist())]
        row[e2] = np.where(b_first, b, a)
        via[e2] = np.where(b_first, sa, sb)
    # column ends: the lower end on a splice
    sp = np.flatnonzero(code_s == _SPLICE)
    ends_sp, first_sp = _first_of_runs(es[sp])
    col_row = np.full(n_end, -1, dtype=np.int64)
    col_row[ends_sp] = order[sp[first_sp]]
    z0, z1 = arr.c0[em, 2], arr.c1[em, 2]
    lower = np.where(ek == 0, z0 <= z1, z1 < z0)
    col_end = (role_e == _COLUMN) & lower
    row[col_end] = col_row[col_end]
    return row, via


def _first_of_runs(sorted_values: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Distinct values of a sorted array and the index where each first occurs."""
    at = np.flatnonzero(np.r_[True, sorted_values[1:] != sorted_values[:-1]]) if len(sorted_values) \
        else np.zeros(0, dtype=np.int64)
    return sorted_values[at], at


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

# joint kinds by candidate code (column faces: flange or web from the pair), as codes into _KIND_NAMES
_KIND_NAMES = (None, "column-flange", "column-web", "unknown", "beam-web", "beam-over", "splice")
_K_NONE, _K_FLANGE, _K_WEB, _K_UNKNOWN, _K_BEAM_WEB, _K_OVER, _K_SPLICE = range(7)
_KIND_CODE = np.array([_K_NONE, _K_FLANGE, _K_UNKNOWN, _K_BEAM_WEB, _K_OVER, _K_SPLICE, _K_BEAM_WEB,
                       _K_UNKNOWN, _K_NONE], dtype=np.int64)   # indexed by candidate code
_CONT_CODES = (_COL_FACE, _BEAM_WEB, _END_MEET, _BEAM_OVER)


def _fmt(x: float) -> str:
    return f"{x:.0f}"


@dataclass(frozen=True)
class _JointFacts:
    """Per-joint facts of the ends with a member support (arrays/lists over those joints, mm)."""

    sel: np.ndarray               # end index of each joint
    rows: np.ndarray              # candidate row of each joint
    s: np.ndarray                 # support member
    kind: list[str | None]
    angle: np.ndarray
    gap: np.ndarray
    tos: np.ndarray               # NaN: not assessed
    copes: dict[int, tuple[Cope, ...]]
    cont: list[bool | None]       # support continuous through the joint (None: not assessed)
    via: list[str | None]
    h_before: np.ndarray          # support length either side, where continuity is assessed
    h_after: np.ndarray
    partner: dict[int, int]       # joint -> back-to-back joint (positions in these lists)
    cont_kind: np.ndarray         # continuity assessed (h_before, h_after meaningful)


def _joint_facts(arr: MemberArrays, em: np.ndarray, ek: np.ndarray, pr: _Pairs, row_of: np.ndarray,
                 via_of: np.ndarray, choices: dict[int, _Choice], cont: dict[tuple[int, int], set[int]],
                 tol: Tolerances) -> _JointFacts:
    """Geometry, continuity and back-to-back partners of every joint on a member, vectorised.

    Continuity (mm): the support extends at least ``continuity_mm`` beyond the beam's section on both
    sides, or a collinear member continues it on the short side. Back-to-back: same support, same
    face family, opposite sides, within ``back_to_back_mm`` along the support (nearest first).
    """
    sel = np.flatnonzero(row_of >= 0)
    rows = row_of[sel]
    b, s = em[sel], pr.s[rows]
    codes = pr.code[rows]
    gaps = pr.gap[rows]
    angle = angle_between_deg(arr, b, s)
    web_rows = np.flatnonzero((codes == _BEAM_WEB) | (codes == _END_MEET))
    tos = np.full(len(sel), np.nan)
    copes: dict[int, tuple[Cope, ...]] = {}
    if len(web_rows):
        tw, cw = copes_for_web_joints(arr, b[web_rows], ek[sel[web_rows]], s[web_rows],
                                      gaps[web_rows], tol)
        tos[web_rows] = tw
        copes = {i: c for i, c in zip(web_rows.tolist(), cw) if c}
    over_rows = np.flatnonzero(codes == _BEAM_OVER)
    if len(over_rows):
        bo, so = b[over_rows], s[over_rows]
        ec = arr.end_point(bo, ek[sel[over_rows]])
        top_b, _ = tops_and_bottoms(arr, bo, ec)
        t = np.einsum("ij,ij->i", ec - arr.c0[so], arr.a[so])
        foot = arr.c0[so] + t[:, None] * arr.a[so]
        top_s, _ = tops_and_bottoms(arr, so, foot)
        tos[over_rows] = top_b - top_s

    # continuity along the support: room either side of the beam's section, else a continuation
    L = arr.length[s]
    lo, hi = pr.lo[rows], pr.hi[rows]
    ext_a = np.maximum(hi - lo, 0.0) / 2.0
    is_col = codes == _COL_FACE
    pos = np.where(is_col, (lo + hi) / 2.0, pr.t[rows])
    cont_kind = np.isin(codes, _CONT_CODES)
    k_before = np.where(~is_col | (arr.a[s, 2] >= 0.0), 0, 1)   # t = 0 side, or column bottom
    room_b = pos - ext_a >= tol.continuity_mm
    room_a = L - pos - ext_a >= tol.continuity_mm
    need_b, need_a = cont_kind & ~room_b, cont_kind & ~room_a
    nb = _first_continuation(cont, arr.ids, s, k_before, need_b)
    na = _first_continuation(cont, arr.ids, s, 1 - k_before, need_a)
    use_b = need_b & (nb >= 0)
    use_a = need_a & (na >= 0)
    before_ok = room_b | use_b
    after_ok = room_a | use_a
    h_before = np.where(use_b, pos + arr.length[nb], pos)
    h_after = np.where(use_a, (L - pos) + arr.length[na], L - pos)

    ids = arr.ids
    via: list[str | None] = [None] * len(sel)
    ch_via = np.zeros(len(sel), dtype=bool)
    via_sel = via_of[sel]
    for i in np.flatnonzero(via_sel >= 0).tolist():
        if ids[int(via_sel[i])]:
            via[i] = ids[int(via_sel[i])]
            ch_via[i] = True
    if choices:
        at = np.full(len(row_of), -1, dtype=np.int64)
        at[sel] = np.arange(len(sel))
        for e_idx, ch in choices.items():
            if ch.via and at[e_idx] >= 0:
                i = int(at[e_idx])
                via[i] = ch.via
                ch_via[i] = True
    for i in np.flatnonzero(cont_kind & (use_b | use_a | ch_via)).tolist():
        v = via[i]
        if use_b[i]:
            v = v or ids[int(nb[i])]
        if use_a[i]:
            v = v or ids[int(na[i])]
        via[i] = v
    cont_flag = np.where(ch_via, True, before_ok & after_ok)
    cont_kind_l = cont_kind.tolist()
    cont_l = [c if k else None for c, k in zip(cont_flag.tolist(), cont_kind_l)]
    via = [v if k else None for v, k in zip(via, cont_kind_l)]

    kind_code = np.where(is_col, np.where(pr.flange[rows], _K_FLANGE, _K_WEB), _KIND_CODE[codes])
    kind_code[arr.role[b] == _BRACE] = _K_UNKNOWN
    partner = _back_to_back(kind_code, s, pos, pr.side[rows], tol)
    return _JointFacts(sel, rows, s, [_KIND_NAMES[k] for k in kind_code.tolist()],
                       angle, gaps, tos, copes, cont_l, via, h_before, h_after, partner, cont_kind)


def _first_continuation(cont: dict[tuple[int, int], set[int]], ids: Sequence[str], m: np.ndarray,
                        k: np.ndarray, need: np.ndarray) -> np.ndarray:
    """For each (member ``m``, end ``k``) where ``need``: the member continuing collinear from that
    end, the first by GlobalId; -1 where there is none or it is not needed."""
    out = np.full(len(m), -1, dtype=np.int64)
    at = np.flatnonzero(need)
    if not len(at) or not cont:
        return out
    seen: dict[tuple[int, int], int] = {}
    found = []
    for key in zip(m[at].tolist(), k[at].tolist()):
        v = seen.get(key)
        if v is None:
            nbrs = cont.get(key)
            v = seen[key] = min(nbrs, key=ids.__getitem__) if nbrs else -1
        found.append(v)
    out[at] = found
    return out


def _back_to_back(kind_code: np.ndarray, s: np.ndarray, pos: np.ndarray, side: np.ndarray,
                  tol: Tolerances) -> dict[int, int]:
    """Back-to-back pairs among joints (positions in the arrays): same support ``s``, same face
    family, ``side`` of opposite sign, ``pos`` (mm along the support) within ``back_to_back_mm``.

    Per (support, family), in order along the support, each joint not yet paired takes the nearest
    unpaired joint on the other side (the first such on a tie).
    """
    idx = np.flatnonzero(np.isin(kind_code, (_K_FLANGE, _K_WEB, _K_BEAM_WEB)))
    partner: dict[int, int] = {}
    if len(idx) < 2:
        return partner
    idx = idx[np.lexsort((idx, pos[idx], kind_code[idx], s[idx]))]
    grp = s[idx] * 8 + kind_code[idx]
    cut = np.flatnonzero(grp[1:] != grp[:-1]) + 1
    starts = np.r_[0, cut]
    stops = np.r_[cut, len(idx)]
    size = stops - starts
    lim = tol.back_to_back_mm
    # two joints on a support (the usual case): a pair when on opposite sides and close enough
    two = starts[size == 2]
    x, y = idx[two], idx[two + 1]
    pair = (side[x] * side[y] < 0) & (np.abs(pos[x] - pos[y]) <= lim)
    for u, v in zip(x[pair].tolist(), y[pair].tolist()):
        partner[u], partner[v] = v, u
    big = np.flatnonzero(size > 2)
    if not len(big):
        return partner
    idx_l, pos_l, side_l = idx.tolist(), pos.tolist(), side.tolist()
    for a0, a1 in zip(starts[big].tolist(), stops[big].tolist()):
        lst = idx_l[a0:a1]
        for x in lst:
            if x in partner:
                continue
            best, best_d = None, None
            px, sx = pos_l[x], side_l[x]
            for y in lst:
                if y == x or y in partner or sx * side_l[y] >= 0:
                    continue
                dd = abs(px - pos_l[y])
                if dd <= lim and (best_d is None or dd < best_d):
                    best, best_d = y, dd
            if best is not None:
                partner[x], partner[best] = best, x
    return partner


def _partner_facts(arr: MemberArrays, members: list[Member], em: np.ndarray, f: _JointFacts,
                   b_l: np.ndarray, labels: list[str], tol: Tolerances
                   ) -> tuple[list[str | None], list[float | None], list[bool | None]]:
    """Per joint: the back-to-back beam's label, the span ratio (longer / shorter) and whether the
    two are similar (span and depth within ``balance_ratio``); ``None`` without a partner."""
    n = len(f.sel)
    p_label: list[str | None] = [None] * n
    p_ratio: list[float | None] = [None] * n
    p_similar: list[bool | None] = [None] * n
    if not f.partner:
        return p_label, p_ratio, p_similar
    # valid axes only here: lengths finite and > 0
    me = np.fromiter(f.partner.keys(), dtype=np.int64, count=len(f.partner))
    other = np.fromiter(f.partner.values(), dtype=np.int64, count=len(f.partner))
    la, lb = arr.length[em[f.sel[me]]], arr.length[em[f.sel[other]]]
    spans = (np.maximum(la, lb) / np.minimum(la, lb)).tolist()
    depth_l = [m.section.depth for m in members]
    dr_of: dict[tuple[float | None, float | None], float] = {}
    br = tol.balance_ratio
    b_me, b_other = b_l[me].tolist(), b_l[other].tolist()
    for i, bi, bp, ratio in zip(me.tolist(), b_me, b_other, spans):
        p_label[i] = labels[bp]
        p_ratio[i] = ratio
        d1, d2 = depth_l[bi], depth_l[bp]
        dr = dr_of.get((d1, d2))
        if dr is None:
            dr = dr_of[(d1, d2)] = _ratio(d1, d2) if d1 and d2 else 1.0
        p_similar[i] = ratio <= br and dr <= br
    return p_label, p_ratio, p_similar


_RUN = 4096  # joints made at a time by _build_joints
_PAIR_RUN = 65536  # candidate pairs tested at a time by _find_joints


def _build_joints(arr: MemberArrays, members: list[Member], bearings: list[Bearing], em: np.ndarray,
                  ek: np.ndarray, pr: _Pairs, row_of: np.ndarray, via_of: np.ndarray,
                  choices: dict[int, _Choice],
                  cont: dict[tuple[int, int], set[int]], tol: Tolerances, policy: str
                  ) -> tuple[list[Joint], np.ndarray]:
    """The joints of every chosen end, in end order, and the end index of each."""
    f = _joint_facts(arr, em, ek, pr, row_of, via_of, choices, cont, tol)
    ids = arr.ids
    n = len(f.sel)
    # per joint: beam member, end (0/1), support member — numpy here, Python lists a run at a time
    b_a, k_a, s_a = em[f.sel], ek[f.sel], f.s
    labels = [m.label for m in members]
    length_l = arr.length.tolist()
    jid = [joint_id(ids[bi], _ENDS[k], ids[si]) for bi, k, si in zip(b_a.tolist(), k_a.tolist(), s_a.tolist())]

    p_label, p_ratio, p_similar = _partner_facts(arr, members, em, f, b_a, labels, tol)

    is_i_l = arr.is_i.tolist()
    role_l = arr.role.tolist()
    source = ["geometry"] * n
    notes: dict[int, list[str]] = {}  # joint -> the model's relation and notes, in reason order
    if choices:
        at = {e: i for i, e in enumerate(f.sel.tolist())}
        for e_idx, ch in choices.items():
            i = at.get(e_idx)
            if i is None:
                continue
            source[i] = ch.source
            notes[i] = ch.notes
        del at
    via_at = {i for i, (v, c) in enumerate(zip(f.via, f.cont)) if v and c}
    gidx = {g: m for m, g in enumerate(ids)} if via_at else {}
    partner_id: list[str | None] = [None] * n
    for i, pi in f.partner.items():
        partner_id[i] = jid[pi]
    copes: list[tuple[Cope, ...]] = [()] * n
    for i, cp in f.copes.items():
        copes[i] = cp

    # one string object per distinct reason text: most texts recur from joint to joint (a third are
    # distinct on a synthetic 20k frame), and every later stage keeps them
    texts: dict[str, str] = {}
    share = texts.setdefault
    joints: list[Joint] = []
    # The joints are made a run at a time: the per-joint lists of a stage (facts, verdicts, reason
    # texts, locations) then live for one run, not for all joints at once, which set the finder's
    # peak memory.
    for c0 in range(0, n, _RUN):
        c1 = min(n, c0 + _RUN)
        part = slice(c0, c1)
        b_p, k_p, s_p = b_a[part].tolist(), k_a[part].tolist(), s_a[part].tolist()
        kind_p = f.kind[part]
        unk = [k == "unknown" for k in kind_p]
        sup_p = [labels[si] for si in s_p]
        ck = f.cont_kind[part].tolist()
        hb_p = [h if k else None for h, k in zip(f.h_before[part].tolist(), ck)]
        ha_p = [h if k else None for h, k in zip(f.h_after[part].tolist(), ck)]
        angle_p, gap_p, tos_p = f.angle[part].tolist(), f.gap[part].tolist(), f.tos[part].tolist()
        inferred_p = pr.inferred[f.rows[part]].tolist()
        ratios = relative_stiffness_batch(kind_p, [members[bi].section for bi in b_p],
                                          [members[si].section for si in s_p],
                                          [length_l[bi] for bi in b_p], hb_p, ha_p)
        verdicts = classify_batch(
            kind_p, sup_p, [None if u else c for u, c in zip(unk, f.cont[part])],
            [None if u else p for u, p in zip(unk, p_label[part])],
            [None if u else p for u, p in zip(unk, p_similar[part])],
            [None if u else p for u, p in zip(unk, p_ratio[part])],
            [True if u else not inf for u, inf in zip(unk, inferred_p)],
            [True if u else is_i_l[si] for u, si in zip(unk, s_p)], ratios, policy)
        # reasons: what the end meets, then the model's relation and notes, continuity, partner, copes
        rows = f.rows[part]
        reasons_p = _kind_reasons_all(
            pr.code[rows].tolist(), kind_p, pr.flange[rows].tolist(), inferred_p, pr.node[rows].tolist(),
            pr.at_tips[rows].tolist(), pr.sd[rows].tolist(), [role_l[bi] == _BRACE for bi in b_p], gap_p,
            angle_p, sup_p, [members[si].role for si in s_p], tol)
        loc_p = arr.end_point(em[f.sel[part]], ek[f.sel[part]], centroid=False).tolist()
        for j in range(c1 - c0):
            i = c0 + j
            rsn = reasons_p[j]
            if kind_p[j] == "column-web":
                rsn += _web_clearance(members[b_p[j]], members[s_p[j]], is_i_l[s_p[j]])
            if i in notes:
                if source[i] != "geometry":
                    rsn.insert(0, f"from the model's {source[i]}")
                rsn += notes[i]
            if i in via_at:
                rsn.append(f"{sup_p[j]} continues through the joint as {labels[gidx[f.via[i]]]}")
            if partner_id[i] is not None:
                rsn.append(f"back-to-back with {p_label[i]} on the other side (joint {partner_id[i]}, "
                           f"span ratio {p_ratio[i]:.2f})")
            for c in copes[i]:
                rsn.append(f"{c.where} cope {c.depth:.0f} deep × {c.length:.0f} long required "
                           f"to clear the flange of {sup_p[j]}")
            st, rs = verdicts[j]
            tos = tos_p[j]
            joints.append(Joint(jid[i], ids[b_p[j]], _ENDS[k_p[j]], ids[s_p[j]], kind_p[j],
                                JointGeometry(tuple(loc_p[j]), angle_p[j], gap_p[j], None if tos != tos else tos,
                                              copes[i], f.cont[i], partner_id[i]),
                                st, tuple([share(r, r) for r in rsn] + [share(r, r) for r in rs]), source[i]))
    if all(ch.row is not None for ch in choices.values()):
        return joints, f.sel
    joint_at: dict[int, Joint] = {}  # the ends without a member support: free ends, walls
    free: tuple[str, tuple[str, ...]] | None = None
    for e_idx, ch in choices.items():
        if ch.row is not None:
            continue
        m = int(em[e_idx])
        gid, endname = ids[m], _ENDS[int(ek[e_idx])]
        loc = tuple(arr.end_point(em[[e_idx]], ek[[e_idx]], centroid=False)[0].tolist())
        if ch.wall is None:  # free end
            if free is None:
                free = apply_policy(classify(SupportFacts(kind="free-end")), policy)
            joint_at[e_idx] = Joint(joint_id(gid, endname, None), gid, endname, None, "free-end",
                                    JointGeometry(location=loc), free[0], tuple(ch.notes) + free[1],
                                    "geometry")
            continue
        bb = bearings[ch.wall]
        label = bb.name or bb.global_id
        what = {"bears on top of": f"bearing length {_fmt(-ch.wall_gap)} mm",
                "is embedded in": f"embedded {_fmt(-ch.wall_gap)} mm"}.get(
            ch.wall_mode, f"gap {_fmt(ch.wall_gap)} mm")
        reasons = [f"{ch.wall_mode} {bb.ifc_class} {label} ({what})"]
        if ch.source != "geometry":
            reasons.append(f"from the model's {ch.source}")
        st, rs = apply_policy(classify(SupportFacts(kind="wall", support_label=label)), policy)
        joint_at[e_idx] = Joint(joint_id(gid, endname, bb.global_id), gid, endname, bb.global_id,
                                "wall", JointGeometry(location=loc, gap=float(ch.wall_gap)), st,
                                tuple(reasons) + rs, ch.source)
    # merged into the member joints in end order (an end is one or the other: row_of < 0 for these)
    extra = np.array(sorted(joint_at), dtype=np.int64)
    member_ends = f.sel
    if np.isin(extra, member_ends).any():  # not expected: the wall or free end replaces the member joint
        keep = ~np.isin(member_ends, extra)
        joints = [jt for jt, k in zip(joints, keep.tolist()) if k]
        member_ends = member_ends[keep]
    ends = np.concatenate([member_ends, extra])
    order = np.argsort(ends, kind="stable")
    every = joints + [joint_at[e] for e in extra.tolist()]
    return [every[i] for i in order.tolist()], ends[order]


def _ratio(a: float | None, b: float | None) -> float:
    if not a or not b:
        return float("inf")
    return max(a, b) / min(a, b)


def _kind_reasons_all(code: list[int], kind: list[str | None], flange: list[bool], inferred: list[bool],
                      node: list[bool], at_tips: list[bool], sd: list[float], brace: list[bool],
                      gap: list[float], angle: list[float], sup: list[str], sup_role: list[str],
                      tol: Tolerances) -> list[list[str]]:
    """Per joint (lists of equal length), the reasons saying what the end meets and how: gaps and
    the signed distance ``sd`` from the support's axis in mm, angles in degrees; ``sup`` the
    support's label, ``sup_role`` its role."""
    out: list[list[str]] = []
    node_tol, clash_tol, angle_tol = tol.node_tol_mm, tol.clash_tol_mm, tol.angle_tol_deg
    short: dict[float, str] = {}    # the most common text, formatted once per distinct gap
    for c, k, fl, inf, nd, tips, d, br, g, ang, sp, role in zip(code, kind, flange, inferred, node,
                                                               at_tips, sd, brace, gap, angle, sup,
                                                               sup_role):
        r: list[str] = []
        if c == _COL_FACE:
            face = "flange" if k == "column-flange" or fl else "web"
            how = ("arrives along the column's web direction" if face == "flange" else
                   "arrives square to the column's web")
            if inf:
                how = "column orientation not in the model; face inferred from the end's distance"
            r.append(f"frames into the {face} of column {sp} ({how})")
        elif c == _BEAM_WEB or c == _END_MEET:
            r.append(f"frames into the web of girder {sp}")
        elif c == _BEAM_OVER:
            r.append(f"bears on the top flange of {sp} (underside {g:+.0f} mm from its top)")
        elif c == _SPLICE:
            r.append(f"collinear with {sp}, end to end (gap {g:.0f} mm): the member continues "
                     "(splice, or a member split at a node)")
        elif c == _COL_CAP:
            r.append(f"bears on the cap of column {sp} (top of column): cap-plate joint, not a "
                     "fin plate — type not checked")
        elif c == _LANDS:
            r.append(f"lands on {sp} (role {role})")
        if br:
            r.append("brace end: gusset connection, not a fin-plate joint — recognised, type not checked")
        if c == _COL_FACE or c == _BEAM_WEB or c == _END_MEET:
            if nd:
                r.append("axes meet (node-to-node model)")
            elif tips:
                r.append(f"end {g:.0f} mm from the web face, stopping at the flange tips of "
                         f"{sp}: an extended (long) fin plate or a cope and longer beam is needed")
            elif d < -node_tol:
                r.append(f"end runs {-d:.0f} mm past the axis of {sp} (the beam overruns "
                         "its support: check the model)")
            elif g < -clash_tol:
                r.append(f"end runs {-g:.0f} mm into the support face (clash in the model?)")
            else:
                text = short.get(g) if g != 0.0 else None   # (0.0 and -0.0 print differently)
                if text is None:
                    text = short[g] = f"end {g:.0f} mm short of the support face (detailed model)"
                r.append(text)
            skew = abs(90.0 - ang)
            if skew > angle_tol:
                r.append(f"skewed: {skew:.0f}° off square to the support")
        out.append(r)
    return out


def _web_clearance(beam: Member, sup: Member, sup_is_i: bool) -> list[str]:
    """A column-web joint whose beam flange is wider than the clear depth between the column's
    flanges (mm): the flanges must be cut back."""
    if sup.section.depth and beam.section.width and sup_is_i:
        clear = sup.section.depth - 2.0 * (sup.section.flange_thickness or 0.0)
        if beam.section.width > clear:
            return [f"beam flange ({beam.section.width:.0f} mm) wider than the clear depth between the "
                    f"column flanges ({clear:.0f} mm): flanges must be cut back"]
    return []


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
