"""Tributary floor-load take-down through the frame: beam end reactions from area loads (DESIGN.md §4.3).

An aid to a competent engineer, not a structural analysis: a gravity take-down of simply supported
beams gives design end shears for simple connections only. Results must be checked, and the governing
local code and licensed practice take precedence.

Method, per storey that has an area load (``[[demand.area_loads]]``):

1. **Plan.** Every beam axis is projected to plan. A beam end that the joint finder put on a column is
   moved to the column's axis (at the beam's level); an end on a beam is moved onto that beam's plan
   axis (supports first, in the order of the support graph), so the bays close even where the modelled
   axes stop short of the supports. Units: mm.
2. **Panels.** The plan lines are noded (``shapely.unary_union`` on a 1 mm grid, so every beam is split
   where another meets it) and ``shapely.polygonize`` forms the floor panels: every closed bay
   bounded by beams. Openings are not known to the tool and are loaded as floor (conservative).
3. **Load paths.** A panel whose aspect ratio (long/short side of its minimum rotated rectangle) is
   at least 2 spans **one way**: its load goes to the sides running along the long direction (within
   45°), each point to the nearest such side, so each long-edge beam of a rectangle carries half the
   panel width. Otherwise it spans **two ways**: each point goes to the nearest side, which in a
   rectangle is the 45° line pattern (trapezoids on the long sides, triangles on the short sides) and
   in any convex panel its angle-bisector partition. Each region is split along the side between the
   beam segments that form it. The load of a point is taken to the side perpendicular to it, so a
   region of area A and centroid c loads its beam with q·A at the projection of c on the beam axis,
   which gives the simply supported reactions exactly (they are linear in the load position). Convex
   panels are partitioned exactly (half-plane clipping); a non-convex panel or one with a hole is
   partitioned on a grid of about 4000 points (nearest segment), scaled to its exact area.
4. **Loads.** Area loads G = ``dead_kPa``, Q = ``live_kPa`` (1 kPa = 1e-3 N/mm²) on plan area; beam
   self-weight (in G) = ``Section.area`` × 7850 kg/m³ × 9.81 m/s² over the beam's true length, at
   mid-span. The entry for a storey is the one whose ``storey`` equals its name, else the first
   whose glob (``fnmatch``, case-sensitive) matches it.
5. **Reactions.** Each beam is simply supported between its end supports:
   R_start = Σ W (1 − x/L), R_end = Σ W x/L for every load resultant W at x along the plan span L.
   A beam with one free end (a cantilever, joint kind ``free-end``) takes its whole load to the
   supported end and the free end has V = 0. G and Q reactions are kept apart; the reactions of a
   beam carried by a beam become point loads on the girder where it meets it, in topological order of
   the "is supported by" graph (networkx ``DiGraph``, edge beam → supporting beam, from every joint
   with a support except splices). A column or any non-beam support ends the load path.
   Beams joined end to end by ``splice`` joints (a girder modelled in pieces, split at a node) are
   one continuous simply supported span between the outer ends of the line of pieces; the splice
   ends get the shear in that span at the splice, with the dead load everywhere and the live load
   placed on the side that gives the largest shear (influence line of shear).
6. **Combination.** At each end V* = max(dead·G + live·Q, dead_only·G) with the factors of the rule
   set's ultimate combination (``RuleSet.ultimate_combination()``, passed in as a plain dict).

Limits. All beams of one storey are taken as one floor (a mezzanine modelled in the same storey is
merged with it in plan). Continuity over supports, two-way slab coefficients, point and line loads
other than carried beams, and pattern loading (except for the shear at splices) are not modelled. Beams are loaded by the plan areas
they bound, so edge beams carry only the floor inside the bays they close: slab overhangs
beyond the edge beams, façades and other line loads are not included and must be added by the
engineer.

What is not resolved is reported, never looped on or guessed: a cycle in the support graph (every
beam on it and every beam carrying load from it has no take-down, with the reason), a beam end with
no joint, a beam free at both ends, a beam on a storey with no area load.
"""

from __future__ import annotations

import fnmatch
import math
from collections import defaultdict, deque
from dataclasses import dataclass
from typing import Iterable, Mapping, Sequence

import networkx as nx
import numpy as np
import shapely
from shapely.geometry.polygon import orient

from engine.errors import ConfigError, RuleSetError
from engine.model import DataWarning, Joint, Member, Section

__all__ = [
    "STEEL_DENSITY_KG_M3",
    "GRAVITY_M_S2",
    "ONE_WAY_ASPECT",
    "AreaLoad",
    "Combination",
    "Panel",
    "TakeDown",
    "parse_area_loads",
    "area_load_for",
    "parse_combination",
    "self_weight_n_per_mm",
    "simple_reactions",
    "take_down",
]

STEEL_DENSITY_KG_M3 = 7850.0
"""Density of steel, kg/m³ (AS 4100:2020 cl. 2.2.4; EN 1993-1-1 uses the same value) # from memory."""
GRAVITY_M_S2 = 9.81
"""Acceleration due to gravity used for self-weight, m/s² (standard gravity 9.80665, rounded)."""
ONE_WAY_ASPECT = 2.0
"""Panels with long/short side ratio at least this span one way # common practice."""

_GRID_MM = 1.0          # noding precision of the plan lines
_EDGE_TOL_MM = 5.0      # a panel edge belongs to a beam whose plan axis is this close to its midpoint
_GRID_POINTS = 4000     # sampling points for a non-convex panel
_KPA = 1e-3             # N/mm² per kPa


# --------------------------------------------------------------------------------------------------
# Inputs


@dataclass(frozen=True)
class AreaLoad:
    """Unfactored floor loads for the storeys matching ``storey`` (a name or an ``fnmatch`` glob), kPa.
    ``key`` is where it came from (``demand.area_loads[i]``), for messages."""

    storey: str
    dead_kPa: float
    live_kPa: float
    key: str = ""


@dataclass(frozen=True)
class Combination:
    """An ultimate gravity combination: design load = max(dead·G + live·Q, dead_only·G, and each
    alternative's dead·G + live·Q) — the alternatives serve pairs such as EN 1990 eq. 6.10a/6.10b."""

    name: str
    dead: float
    live: float
    dead_only: float
    source: str
    alternatives: tuple[tuple[float, float, str], ...] = ()

    @property
    def label(self) -> str:
        """``"<name> (<source>)"``, e.g. ``"1.2G + 1.5Q (AS/NZS 1170.0 4.2.2)"``."""
        if not self.source or self.source.split(" ")[0] in self.name:
            return self.name  # the name already cites the standard
        return f"{self.name} ({self.source})"

    def combine(self, G: float, Q: float) -> tuple[float, str]:
        """Design value (N) of an effect with unfactored parts G and Q, and which case governs."""
        cases = [(self.dead * G + self.live * Q, f"{self.dead:g}G + {self.live:g}Q")]
        cases += [(d * G + q * Q, f"{d:g}G + {q:g}Q ({n})" if n else f"{d:g}G + {q:g}Q") for d, q, n in self.alternatives]
        cases.append((self.dead_only * G, f"{self.dead_only:g}G"))
        best = cases[0]
        for c in cases[1:]:
            if c[0] > best[0]:
                best = c
        return best


def parse_area_loads(entries: Iterable[object], where: str = "config") -> list[AreaLoad]:
    """Validate ``demand.area_loads`` entries (tables with ``storey``, ``dead_kPa``, ``live_kPa``).

    ``storey`` is required; ``dead_kPa``/``live_kPa`` default to 0 but one must be given; both must be
    finite and not negative. Two entries with the same ``storey`` text are an error. Raises
    :class:`ConfigError` naming ``where`` and the key, e.g. ``demand.area_loads[1].live_kPa``.
    """
    out: list[AreaLoad] = []
    seen: dict[str, str] = {}
    for i, entry in enumerate(entries):
        key = f"demand.area_loads[{i}]"
        if not isinstance(entry, Mapping):
            raise ConfigError(f"{where}: '{key}' must be a table with storey, dead_kPa, live_kPa")
        for k in entry:
            if k not in ("storey", "dead_kPa", "live_kPa"):
                raise ConfigError(f"{where}: unknown key '{key}.{k}' (valid: storey, dead_kPa, live_kPa)")
        storey = entry.get("storey")
        if not isinstance(storey, str) or not storey.strip():
            raise ConfigError(f"{where}: '{key}.storey' is missing or empty; give a storey name or a "
                              f"glob such as \"*\"")
        if "dead_kPa" not in entry and "live_kPa" not in entry:
            raise ConfigError(f"{where}: '{key}' gives neither dead_kPa nor live_kPa")
        vals = []
        for k in ("dead_kPa", "live_kPa"):
            v = entry.get(k, 0.0)
            if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v):
                raise ConfigError(f"{where}: '{key}.{k}' must be a number, not {v!r}")
            if v < 0:
                raise ConfigError(f"{where}: '{key}.{k}' is {v}; it must not be negative")
            vals.append(float(v))
        if storey in seen:
            raise ConfigError(f"{where}: '{key}.storey' {storey!r} is already given by '{seen[storey]}'")
        seen[storey] = key
        out.append(AreaLoad(storey=storey, dead_kPa=vals[0], live_kPa=vals[1], key=key))
    return out


def area_load_for(storey: str, loads: Sequence[AreaLoad]) -> AreaLoad | None:
    """The entry for ``storey``: an exact name match first, else the first glob that matches."""
    for a in loads:
        if a.storey == storey:
            return a
    for a in loads:
        if fnmatch.fnmatchcase(storey, a.storey):
            return a
    return None


def parse_combination(combination: Mapping[str, object]) -> Combination:
    """Validate a rule set's ultimate combination dict ``{"name","dead","live","dead_only","source"}``.

    ``dead`` and ``live`` are required, ``dead_only`` defaults to 0 (no dead-only case). Raises
    :class:`RuleSetError` naming the key.
    """
    if not isinstance(combination, Mapping):
        raise RuleSetError(f"ultimate combination must be a dict, not {type(combination).__name__}")
    factors = {}
    for k in ("dead", "live", "dead_only"):
        v = combination.get(k, 0.0 if k == "dead_only" else None)
        if v is None:
            raise RuleSetError(f"ultimate combination: key '{k}' is missing (got {sorted(combination)})")
        if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v) or v < 0:
            raise RuleSetError(f"ultimate combination: '{k}' must be a number >= 0, not {v!r}")
        factors[k] = float(v)
    name = combination.get("name") or f"{factors['dead']:g}G + {factors['live']:g}Q"
    source = combination.get("source") or ""
    alts = []
    for i, alt in enumerate(combination.get("alternatives") or ()):
        try:
            d, q = float(alt["dead"]), float(alt["live"])
        except (KeyError, TypeError, ValueError):
            raise RuleSetError(f"ultimate combination: alternatives[{i}] needs numbers 'dead' and 'live'") from None
        if not (math.isfinite(d) and math.isfinite(q) and d >= 0 and q >= 0):
            raise RuleSetError(f"ultimate combination: alternatives[{i}] factors must be numbers >= 0")
        alts.append((d, q, str(alt.get("name", ""))))
    return Combination(name=str(name), source=str(source), alternatives=tuple(alts), **factors)


def self_weight_n_per_mm(section: Section) -> float | None:
    """Self-weight of a member (N/mm) = area (mm²) × 7850 kg/m³ × 9.81 m/s² × 1e-9, or ``None`` if
    the area is unknown. (kg/m³ × m/s² = N/m³; × 1e-9 m³/mm³ → N/mm³; × mm² → N/mm.)"""
    if section.area is None or not section.area > 0:
        return None
    return section.area * STEEL_DENSITY_KG_M3 * GRAVITY_M_S2 * 1e-9


# --------------------------------------------------------------------------------------------------
# Outputs


@dataclass(frozen=True)
class Panel:
    """A floor panel found in plan, for reports. ``coords`` is the outer ring (plan, mm, CCW);
    ``span`` is ``"one-way"`` or ``"two-way"``; ``area`` in mm²; ``beams`` the GlobalIds loaded by it;
    ``method`` ``"exact"`` (convex, half-plane partition) or ``"grid"`` (sampled)."""

    storey: str
    coords: tuple[tuple[float, float], ...]
    span: str
    aspect: float
    area: float
    beams: tuple[str, ...]
    method: str


@dataclass(frozen=True)
class TakeDown:
    """Result of :func:`take_down`.

    ``reactions[(GlobalId, end)] = (V_N, detail)``: the design end shear (N) for every resolved beam
    end and a breakdown in words. ``unfactored[(GlobalId, end)] = (G_N, Q_N)``. ``unresolved`` gives
    the reason for every beam end without a take-down. ``panels`` lists the floor panels.
    """

    reactions: dict[tuple[str, str], tuple[float, str]]
    unfactored: dict[tuple[str, str], tuple[float, float]]
    unresolved: dict[tuple[str, str], str]
    warnings: tuple[DataWarning, ...]
    panels: tuple[Panel, ...]
    combination: str


# --------------------------------------------------------------------------------------------------
# Mechanics


def simple_reactions(L: float, x: np.ndarray, W: np.ndarray) -> tuple[float, float]:
    """End reactions (N) of a simply supported span ``L`` (mm) under resultants ``W`` (N) at ``x``
    (mm from the start): R_start = Σ W(1 − x/L), R_end = Σ W x/L (statics). ``x`` is clipped to
    [0, L]."""
    if W.size == 0:
        return 0.0, 0.0
    xi = np.clip(x, 0.0, L)
    r_end = float(np.sum(W * xi) / L)
    return float(np.sum(W)) - r_end, r_end


def _cycles(g: nx.DiGraph) -> list[list[str]]:
    """The strongly connected parts of ``g`` that are cycles (size > 1, or a self-loop), sorted."""
    out = []
    for comp in nx.strongly_connected_components(g):
        if len(comp) > 1 or any(g.has_edge(n, n) for n in comp):
            out.append(sorted(comp))
    return sorted(out)


def _area_centroid(p: np.ndarray) -> tuple[float, np.ndarray]:
    """Area (mm²) and centroid of a simple polygon given CCW as an (n, 2) array (shoelace)."""
    if len(p) < 3:
        return 0.0, np.zeros(2)
    x, y = p[:, 0], p[:, 1]
    xn, yn = np.roll(x, -1), np.roll(y, -1)
    cross = x * yn - xn * y
    a = 0.5 * float(np.sum(cross))
    if abs(a) < 1e-9:
        return 0.0, np.zeros(2)
    cx = float(np.sum((x + xn) * cross)) / (6.0 * a)
    cy = float(np.sum((y + yn) * cross)) / (6.0 * a)
    return abs(a), np.array([cx, cy])


def _clip(poly: np.ndarray, a: np.ndarray, c: float) -> np.ndarray:
    """Convex polygon ``poly`` (n, 2) intersected with the half-plane a·p <= c (Sutherland–Hodgman)."""
    n = len(poly)
    if n == 0:
        return poly
    s = poly @ a - c
    out: list[np.ndarray] = []
    for i in range(n):
        k = (i + 1) % n
        if s[i] <= 0.0:
            out.append(poly[i])
        if (s[i] < 0.0 < s[k]) or (s[k] < 0.0 < s[i]):
            t = s[i] / (s[i] - s[k])
            out.append(poly[i] + t * (poly[k] - poly[i]))
    return np.array(out, dtype=float).reshape(-1, 2)


@dataclass(frozen=True)
class _Edge:
    a: np.ndarray       # plan, local coords (panel centred)
    b: np.ndarray
    beam: int | None    # index into the storey's beam list


def _sides(edges: list[_Edge]) -> list[list[int]]:
    """Group consecutive collinear edges of a closed ring into sides (lists of edge indices)."""
    n = len(edges)
    dirs = [(e.b - e.a) / max(np.linalg.norm(e.b - e.a), 1e-12) for e in edges]
    corner = []
    for i in range(n):
        d0, d1 = dirs[i - 1], dirs[i]
        cr = d0[0] * d1[1] - d0[1] * d1[0]
        corner.append(not (abs(cr) < math.sin(math.radians(1.0)) and float(d0 @ d1) > 0.0))
    if not any(corner):
        return [list(range(n))]
    start = corner.index(True)
    sides: list[list[int]] = []
    for k in range(n):
        i = (start + k) % n
        if corner[i]:
            sides.append([i])
        else:
            sides[-1].append(i)
    return sides


def _panel_regions(
    ring: np.ndarray, holes: list[np.ndarray], edges: list[_Edge], hole_edges: list[_Edge],
    long_dir: np.ndarray, one_way: bool,
) -> tuple[list[tuple[int, float, np.ndarray, np.ndarray, np.ndarray]], str]:
    """Split a panel (local coords) into the regions its edges carry.

    Returns ``[(edge index, area mm², centroid, edge a, edge b)]`` (edge index into
    ``edges + hole_edges``) and the method (``"exact"`` or ``"grid"``).
    """
    all_edges = edges + hole_edges

    def along(e: _Edge) -> bool:
        d = e.b - e.a
        ln = np.linalg.norm(d)
        return ln > 0 and abs(float(d @ long_dir)) / ln >= math.cos(math.radians(45.0)) - 1e-9

    sides = _sides(edges)
    side_dirs = []
    for s in sides:
        a, b = edges[s[0]].a, edges[s[-1]].b
        side_dirs.append((b - a) / max(np.linalg.norm(b - a), 1e-12))
    convex = not holes and len(sides) >= 3 and all(
        side_dirs[i - 1][0] * side_dirs[i][1] - side_dirs[i - 1][1] * side_dirs[i][0] > -1e-9
        for i in range(len(sides)))
    if convex:
        cand = [k for k, s in enumerate(sides) if not one_way or along(_Edge(edges[s[0]].a, edges[s[-1]].b, None))]
        if not cand:
            cand = list(range(len(sides)))
        normals = [np.array([-d[1], d[0]]) for d in side_dirs]  # inward for a CCW ring
        origins = [edges[s[0]].a for s in sides]
        out = []
        for k in cand:
            face = ring.copy()
            ne, pe = normals[k], origins[k]
            for f in cand:
                if f == k:
                    continue
                a = ne - normals[f]
                if float(np.linalg.norm(a)) < 1e-9:
                    continue
                face = _clip(face, a, float(ne @ pe - normals[f] @ origins[f]))
            d = side_dirs[k]
            idx = sides[k]
            for m, ei in enumerate(idx):
                piece = face
                e = edges[ei]
                if m > 0:
                    piece = _clip(piece, -d, float(-(d @ e.a)))
                if m < len(idx) - 1:
                    piece = _clip(piece, d, float(d @ e.b))
                area, cen = _area_centroid(piece)
                if area > 0.0:
                    out.append((ei, area, cen, e.a, e.b))
        return out, "exact"
    # grid method: nearest candidate segment, projected perpendicular onto it
    cand = [i for i, e in enumerate(all_edges) if not one_way or along(e)] or list(range(len(all_edges)))
    poly = shapely.Polygon(ring, holes)
    area = poly.area
    minx, miny, maxx, maxy = poly.bounds
    h = max(math.sqrt(area / _GRID_POINTS), math.sqrt((maxx - minx) * (maxy - miny) / (50 * _GRID_POINTS)))
    xs = np.arange(minx + h / 2, maxx, h)
    ys = np.arange(miny + h / 2, maxy, h)
    gx, gy = np.meshgrid(xs, ys)
    px, py = gx.ravel(), gy.ravel()
    inside = shapely.contains_xy(poly, px, py)
    pts = np.column_stack([px[inside], py[inside]])
    if len(pts) == 0:
        return [], "grid"
    A = np.array([all_edges[i].a for i in cand])
    B = np.array([all_edges[i].b for i in cand])
    AB = B - A
    den = np.maximum(np.einsum("ij,ij->i", AB, AB), 1e-12)
    t = np.clip(((pts[:, None, :] - A[None]) * AB[None]).sum(-1) / den[None], 0.0, 1.0)
    foot = A[None] + t[..., None] * AB[None]
    dist = np.linalg.norm(pts[:, None, :] - foot, axis=-1)
    near = np.argmin(dist, axis=1)
    w = area / len(pts)
    out = []
    for c in np.unique(near):
        sel = pts[near == c]
        i = cand[int(c)]
        out.append((i, w * len(sel), sel.mean(axis=0), all_edges[i].a, all_edges[i].b))
    return out, "grid"


# --------------------------------------------------------------------------------------------------
# The take-down


_OTHER = {"start": "end", "end": "start"}


@dataclass(frozen=True)
class _Piece:
    """A beam as a piece of a (possibly spliced) span: chain id, offset of its plan start along the
    chain (mm), whether it runs the chain's way, its plan length (mm)."""

    chain: str
    offset: float
    forward: bool
    length: float

    def to_chain(self, x: np.ndarray | float) -> np.ndarray | float:
        """Chain coordinate of a point ``x`` mm from the piece's own (plan) start."""
        return self.offset + (x if self.forward else self.length - x)


def _snap(plan: dict[str, list[np.ndarray]], mem: Mapping[str, Member], g: str, k: int,
          supports: list[str]) -> None:
    """Move end ``k`` of beam ``g`` in plan onto its first support that is a member: onto a beam's
    plan axis (nearest point), or onto a column's axis at the level of the beam end."""
    m = mem[g]
    pt3 = m.start if k == 0 else m.end
    for s in supports:
        sm = mem.get(s)
        if sm is None:
            continue
        if sm.role == "beam" and s in plan:
            a, b = plan[s]
            ab = b - a
            den = float(ab @ ab)
            t = 0.0 if den == 0 else min(1.0, max(0.0, float((plan[g][k] - a) @ ab) / den))
            plan[g][k] = a + t * ab
        else:
            z0, z1 = sm.start[2], sm.end[2]
            t = 0.0 if abs(z1 - z0) < 1e-9 else min(1.0, max(0.0, (pt3[2] - z0) / (z1 - z0)))
            plan[g][k] = np.array([sm.start[0] + t * (sm.end[0] - sm.start[0]),
                                   sm.start[1] + t * (sm.end[1] - sm.start[1])])
        return


def take_down(
    members: Mapping[str, Member] | Iterable[Member],
    joints: Sequence[Joint],
    area_loads: Iterable[object],
    combination: Mapping[str, object],
    *,
    self_weight: bool = True,
) -> TakeDown:
    """Beam end reactions (N) from the floor area loads, self-weight and the reactions of carried beams.

    ``members``: the frame's members (a mapping by GlobalId or an iterable); only role ``beam`` is
    taken down, columns (any non-beam member) end the load path. ``joints``: every beam end and its
    support; a joint of kind ``splice`` joins two beams into one continuous span (a girder split at a
    node), supported at the outer ends of the line of pieces, whose splice ends get the
    shear in the span at the splice. ``area_loads``: the ``demand.area_loads`` entries (tables or
    :class:`AreaLoad`). ``combination``: the rule set's ultimate combination dict. Method in the
    module docstring.
    """
    mem = dict(members) if isinstance(members, Mapping) else {m.global_id: m for m in members}
    entries = list(area_loads)
    loads = entries if all(isinstance(a, AreaLoad) for a in entries) else parse_area_loads(entries)
    comb = parse_combination(combination)
    warnings: list[DataWarning] = []
    reactions: dict[tuple[str, str], tuple[float, str]] = {}
    unfactored: dict[tuple[str, str], tuple[float, float]] = {}
    unresolved: dict[tuple[str, str], str] = {}
    panels: list[Panel] = []

    beams = sorted(g for g, m in mem.items() if m.role == "beam")
    beam_set = set(beams)
    if not loads:
        warnings.append(DataWarning("no floor area loads are configured (demand.area_loads); no "
                                    "tributary take-down", None, "demand"))
        for g in beams:
            for end in ("start", "end"):
                unresolved[(g, end)] = "no floor area loads configured (demand.area_loads)"
        return TakeDown(reactions, unfactored, unresolved, tuple(warnings), (), comb.label)

    # --- what each end bears on: carrying supports, splice partners, or nothing (free)
    carry: dict[tuple[str, str], list[str]] = defaultdict(list)
    spliced: dict[tuple[str, str], list[str]] = defaultdict(list)
    seen: set[tuple[str, str]] = set()
    for j in joints:
        if j.beam not in beam_set or j.end not in ("start", "end"):
            continue
        key = (j.beam, j.end)
        seen.add(key)
        if j.support is None or j.kind == "free-end":
            continue
        target = spliced[key] if j.kind == "splice" else carry[key]
        if j.support not in target:
            target.append(j.support)
    plan: dict[str, list[np.ndarray]] = {g: [np.array(mem[g].start[:2], float),
                                             np.array(mem[g].end[:2], float)] for g in beams}
    blocked: dict[str, str] = {}
    links: set[frozenset[tuple[str, str]]] = set()
    for (g, e), partners in sorted(spliced.items()):
        if carry.get((g, e)):
            continue  # supported and spliced: the support governs the end
        for p in partners:
            if p not in beam_set:
                blocked[g] = f"its {e} end is spliced to {p}, which is not a beam among the members"
                continue
            k = 0 if e == "start" else 1
            ep = "start" if (np.linalg.norm(plan[p][0] - plan[g][k])
                             <= np.linalg.norm(plan[p][1] - plan[g][k])) else "end"
            if carry.get((p, ep)):
                carry[(g, e)] = list(carry[(p, ep)])  # continues onto a supported end: same support
            else:
                links.add(frozenset({(g, e), (p, ep)}))
    linked: dict[tuple[str, str], list[tuple[str, str]]] = defaultdict(list)
    for ln in links:
        a, b = sorted(ln)
        linked[a].append(b)
        linked[b].append(a)

    # --- plan positions, supports first (beam-level carrying graph; cycles last)
    bgraph = nx.DiGraph()
    bgraph.add_nodes_from(beams)
    bgraph.add_edges_from((g, s) for (g, _), sup in carry.items() for s in sup if s in beam_set)
    b_cyc = {n for c in _cycles(bgraph) for n in c}
    b_order = list(nx.topological_sort(bgraph.subgraph([n for n in beams if n not in b_cyc])))
    for g in list(reversed(b_order)) + sorted(b_cyc):
        for k, e in enumerate(("start", "end")):
            if carry.get((g, e)):
                _snap(plan, mem, g, k, carry[(g, e)])
    plen = {g: float(np.linalg.norm(plan[g][1] - plan[g][0])) for g in beams}

    # --- chains of spliced beams (a single beam is a chain of one)
    pieces: dict[str, _Piece] = {}
    chains: dict[str, list[str]] = {}
    outer: dict[str, tuple[tuple[str, str], tuple[str, str]]] = {}
    sgraph = nx.Graph()
    sgraph.add_nodes_from(beams)
    sgraph.add_edges_from((a[0], b[0]) for a, b in (sorted(ln) for ln in links))
    for comp in sorted((sorted(c) for c in nx.connected_components(sgraph)), key=lambda c: c[0]):
        cid = comp[0]
        n_links = sum(len(linked[(g, e)]) for g in comp for e in ("start", "end")) // 2
        if any(len(linked[(g, e)]) > 1 for g in comp for e in ("start", "end")) or n_links != len(comp) - 1:
            why = f"the spliced beams {' + '.join(mem[g].label for g in comp)} do not form one line"
            warnings.append(DataWarning(why + "; they are not taken down", cid, "demand"))
            for g in comp:  # each stays a chain of its own, blocked
                blocked.setdefault(g, why)
                pieces[g] = _Piece(g, 0.0, True, plen[g])
                chains[g] = [g]
                outer[g] = ((g, "start"), (g, "end"))
            continue
        first = next(g for g in comp if not (linked[(g, "start")] and linked[(g, "end")]))
        cur, cur_in = first, ("end" if linked[(first, "start")] else "start")
        order_c: list[str] = []
        off = 0.0
        while True:
            pieces[cur] = _Piece(cid, off, cur_in == "start", plen[cur])
            order_c.append(cur)
            off += plen[cur]
            nxt = linked[(cur, _OTHER[cur_in])]
            if not nxt:
                outer[cid] = ((first, "end" if linked[(first, "start")] else "start"), (cur, _OTHER[cur_in]))
                break
            cur, cur_in = nxt[0]
        chains[cid] = order_c
    label = {cid: " + ".join(mem[g].label for g in gs) for cid, gs in chains.items()}

    # --- per-chain checks: storey loads, spans, joints at the outer ends
    storey_load: dict[str, AreaLoad | None] = {}
    for g in beams:
        st = mem[g].storey
        if st not in storey_load:
            storey_load[st] = area_load_for(st, loads)
            if storey_load[st] is None:
                warnings.append(DataWarning(
                    f"storey {st or '(no storey)'!r} matches no demand.area_loads entry; its beams get no "
                    f"tributary take-down", None, "demand"))
        if storey_load[st] is None:
            blocked.setdefault(g, f"no demand.area_loads entry for storey {st or '(no storey)'!r}")
        elif plen[g] < 1.0:
            blocked.setdefault(g, "the beam has no length in plan (vertical, or both ends on one support)")
            warnings.append(DataWarning("beam has no length in plan; not taken down", g, "demand"))
    free_end: dict[str, str | None] = {}
    for cid, (o_start, o_end) in outer.items():
        why = next((blocked[g] for g in chains[cid] if g in blocked), None)
        if why is None:
            missing = [f"{mem[g].label} {e}" for g, e in (o_start, o_end) if (g, e) not in seen]
            free = [w for w, o in (("start", o_start), ("end", o_end)) if not carry.get(o)]
            if missing:
                why = f"no joint found at the end(s) {', '.join(missing)}"
                warnings.append(DataWarning(f"no joint at {', '.join(missing)}; the reactions of "
                                            f"{label[cid]} are not taken down", cid, "demand"))
            elif len(free) == 2:
                why = "the beam is supported at neither end"
                warnings.append(DataWarning(f"{label[cid]} is free at both ends (unsupported); its load "
                                            f"is not taken down", cid, "demand"))
            else:
                free_end[cid] = free[0] if free else None
        if why is not None:
            for g in chains[cid]:
                blocked.setdefault(g, why)
        for g, e in (o_start, o_end):
            sup = carry.get((g, e), [])
            if len(sup) > 1:
                warnings.append(DataWarning(
                    f"the {e} end bears on {len(sup)} supports ({', '.join(sup)}); the whole reaction is "
                    f"passed to each (conservative)", g, "demand"))
            for s in sup:
                if s not in mem:
                    warnings.append(DataWarning(f"the {e} end's support {s} is not among the members; "
                                                f"the load path ends there", g, "demand"))

    # --- the support graph of chains, its cycles and the take-down order
    graph = nx.DiGraph()
    graph.add_nodes_from(sorted(chains))
    for cid, ends in outer.items():
        for g, e in ends:
            for s in carry.get((g, e), []):
                if s in pieces:
                    graph.add_edge(cid, pieces[s].chain)
    cycles = _cycles(graph)
    on_cycle = {n for c in cycles for n in c}
    for comp in cycles:
        ring = [u for u, _ in nx.find_cycle(graph.subgraph(comp))]
        k = ring.index(min(ring))
        ring = ring[k:] + ring[:k]  # start at the smallest GlobalId, for stable messages
        path = " → ".join(label[c] for c in ring + ring[:1])
        warnings.append(DataWarning(
            f"cycle in the support graph ({path}): these beams support each other, so their "
            f"reactions cannot be taken down", ring[0], "demand"))
        for c in comp:
            for g in chains[c]:
                blocked.setdefault(g, f"the beam is on a support cycle ({path})")
    order = list(nx.topological_sort(graph.subgraph([n for n in graph if n not in on_cycle])))
    # a blocked chain passes its blocking down the load path, to the chains that carry it (one BFS)
    cblock = {cid: next(blocked[g] for g in gs if g in blocked)
              for cid, gs in chains.items() if any(g in blocked for g in gs)}
    root = {c: (label[c], why) for c, why in cblock.items()}
    queue = deque(sorted(cblock))
    while queue:
        c = queue.popleft()
        for d in graph.successors(c):
            if d not in cblock:
                lab, why = root[c]
                cblock[d] = f"it carries {label[c]}, whose reactions are unknown ({lab}: {why})"
                root[d] = root[c]
                queue.append(d)
    for cid, why in cblock.items():
        for g in chains[cid]:
            blocked.setdefault(g, why)

    # --- floor panels per storey → load resultants on beams (x along the plan axis, area mm²)
    floor: dict[str, list[tuple[float, float]]] = defaultdict(list)   # beam → [(x, area)]
    n_panels: dict[str, int] = defaultdict(int)
    by_storey: dict[str, list[str]] = defaultdict(list)
    for g in beams:
        if storey_load.get(mem[g].storey) is not None and plen[g] >= 1.0:
            by_storey[mem[g].storey].append(g)
    for st in sorted(by_storey):
        _storey_panels(st, by_storey[st], plan, floor, n_panels, panels, warnings)

    # --- reactions, chain by chain, in the order of the support graph
    point: dict[str, list[tuple[float, float, float, str]]] = defaultdict(list)  # (X, G, Q, from)
    for cid in order:
        if cid in cblock:
            continue
        gs = chains[cid]
        L = sum(pieces[g].length for g in gs)
        xs, Gs, Qs, notes = [], [], [], []
        area_total, n_pan = 0.0, 0
        for g in gs:
            m, pc = mem[g], pieces[g]
            al = storey_load[m.storey]
            assert al is not None
            fx = np.array([x for x, _ in floor[g]], float)
            fA = np.array([A for _, A in floor[g]], float)
            xs.append(np.asarray(pc.to_chain(fx), float))
            Gs.append(fA * al.dead_kPa * _KPA)
            Qs.append(fA * al.live_kPa * _KPA)
            area_total += float(fA.sum())
            n_pan += n_panels[g]
            if not n_panels[g]:
                warnings.append(DataWarning(f"beam bounds no floor panel on storey {m.storey!r}; its "
                                            f"take-down has self-weight and carried beams only", g, "demand"))
            if self_weight:
                w = self_weight_n_per_mm(m.section)
                if w is None:
                    warnings.append(DataWarning("section area unknown: self-weight not included in the "
                                                "take-down", g, "demand"))
                    notes.append(f"self-weight of {m.label} not included (section area unknown)")
                else:
                    xs.append(np.array([pc.offset + pc.length / 2.0]))
                    Gs.append(np.array([w * m.length]))
                    Qs.append(np.array([0.0]))
                    notes.append(f"self-weight {w:.3f} kN/m over {m.length / 1e3:.3f} m")
        als = sorted({(storey_load[mem[g].storey].key, storey_load[mem[g].storey].storey,  # type: ignore[union-attr]
                       storey_load[mem[g].storey].dead_kPa, storey_load[mem[g].storey].live_kPa)  # type: ignore[union-attr]
                      for g in gs})
        loads_txt = ", ".join(f"G {d:g} + Q {q:g} kPa ({k} storey {s!r})" for k, s, d, q in als)
        notes.insert(0, f"floor {area_total / 1e6:.2f} m² (bounds {n_pan} panel(s)) at {loads_txt}"
                     if n_pan else "bounds no floor panel")
        if point[cid]:
            xs.append(np.array([p[0] for p in point[cid]]))
            Gs.append(np.array([p[1] for p in point[cid]]))
            Qs.append(np.array([p[2] for p in point[cid]]))
            notes.append("reactions of " + ", ".join(sorted({p[3] for p in point[cid]})))
        X, G, Q = np.concatenate(xs), np.concatenate(Gs), np.concatenate(Qs)
        X = np.clip(X, 0.0, L)
        fe = free_end[cid]
        if fe is None:
            (gs0, ge0), (qs0, qe0) = simple_reactions(L, X, G), simple_reactions(L, X, Q)
        elif fe == "start":
            gs0, ge0, qs0, qe0 = 0.0, float(G.sum()), 0.0, float(Q.sum())
        else:
            gs0, ge0, qs0, qe0 = float(G.sum()), 0.0, float(Q.sum()), 0.0
        span = f"span {L / 1e3:.3f} m" + (f" ({label[cid]}, spliced)" if len(gs) > 1 else "")
        tail = "; ".join(notes)
        results: dict[tuple[str, str], tuple[float, float, str]] = {}
        for (g, e), Ge, Qe, w_end in ((outer[cid][0], gs0, qs0, "start"), (outer[cid][1], ge0, qe0, "end")):
            if fe == w_end:
                results[(g, e)] = (0.0, 0.0, "free end (cantilever): V = 0; the whole load of the beam "
                                             "goes to its supported end")
            else:
                results[(g, e)] = (Ge, Qe, span + (" (cantilever, whole load)" if fe else ""))
        for (g, e), (Ge, Qe, txt) in results.items():
            V, case = comb.combine(Ge, Qe)
            unfactored[(g, e)] = (Ge, Qe)
            detail = txt if txt.startswith("free end") else (
                f"G {Ge / 1e3:.2f} kN + Q {Qe / 1e3:.2f} kN unfactored; {case} = {V / 1e3:.2f} kN "
                f"governs; {txt}; {tail}")
            reactions[(g, e)] = (V, detail)
        # shear in the span at each splice (the section between two pieces)
        for a, b in zip(gs[:-1], gs[1:]):
            V, VG, VQ, case = _section_shear(pieces[b].offset, L, X, G, Q, fe, comb)
            txt = (f"shear in the continuous span {label[cid]} at the splice of {mem[a].label} and "
                   f"{mem[b].label}, {pieces[b].offset / 1e3:.3f} m from its start (live load placed "
                   f"for the largest shear); {span}")
            detail = (f"G {VG / 1e3:.2f} kN + Q {VQ / 1e3:.2f} kN unfactored; {case} = {V / 1e3:.2f} kN "
                      f"governs; {txt}; {tail}")
            for key in ((a, "end" if pieces[a].forward else "start"), (b, "start" if pieces[b].forward else "end")):
                unfactored[key] = (VG, VQ)
                reactions[key] = (V, detail)
        # the reactions at the outer ends load the beams that carry them
        for (g, e), Ge, Qe in ((outer[cid][0], gs0, qs0), (outer[cid][1], ge0, qe0)):
            k = 0 if e == "start" else 1
            for s in carry.get((g, e), []):
                if s not in pieces or s not in plan:
                    continue  # a column or other non-beam support ends the chain
                sa, sb = plan[s]
                su = sb - sa
                Ls = float(np.linalg.norm(su))
                x = 0.0 if Ls == 0 else float((plan[g][k] - sa) @ su) / Ls
                point[pieces[s].chain].append((float(pieces[s].to_chain(x)), Ge, Qe, mem[g].label))
    for g in beams:
        if g in blocked:
            for e in ("start", "end"):
                unresolved[(g, e)] = blocked[g]
    return TakeDown(reactions, unfactored, unresolved, tuple(warnings), tuple(panels), comb.label)


def _section_shear(xs: float, L: float, X: np.ndarray, G: np.ndarray, Q: np.ndarray, free: str | None,
                   comb: Combination) -> tuple[float, float, float, str]:
    """Design shear (N) at the section ``xs`` (mm from the start) of a span ``L`` with loads ``G``,
    ``Q`` (N) at ``X``: the dead load everywhere, the live load placed where it gives the largest
    shear of each sign (the influence line of shear for a simply supported span: 1 − X/L for a load
    beyond the section, −X/L for one before it; a load at the section counts on both sides). For a
    cantilever (``free`` end) the shear is the load between the section and the free end.
    Returns (V*, |V_G|, V_Q used, the governing case)."""
    if free is None:
        pos = np.where(X >= xs, 1.0 - X / L, 0.0)
        neg = np.where(X <= xs, X / L, 0.0)
        VG = float(G @ pos - G @ neg)
        Qp, Qn = float(Q @ pos), float(Q @ neg)
    else:
        side = X <= xs if free == "start" else X >= xs
        VG, Qp, Qn = float(G[side].sum()), float(Q[side].sum()), 0.0
    factor_sets = [(comb.dead, comb.live, "")] + list(comb.alternatives)
    cases = [(abs(d * VG + q * Qp), Qp, f"{d:g}G + {q:g}Q") for d, q, _ in factor_sets]
    cases += [(abs(d * VG - q * Qn), Qn, f"{d:g}G + {q:g}Q") for d, q, _ in factor_sets]
    cases.append((abs(comb.dead_only * VG), 0.0, f"{comb.dead_only:g}G"))
    V, VQ, case = max(cases, key=lambda c: c[0])
    return V, abs(VG), VQ, case


def _storey_panels(st: str, gids: list[str], plan: dict[str, list[np.ndarray]],
                   floor: dict[str, list[tuple[float, float]]], n_panels: dict[str, int],
                   panels: list[Panel], warnings: list[DataWarning]) -> None:
    """Form the floor panels of one storey from the beams ``gids`` (sorted) and add each region's
    (x along the beam's plan axis from its start, area) to ``floor``; append to ``panels``."""
    lines = shapely.linestrings([np.vstack(plan[g]) for g in gids])
    noded = shapely.get_parts(shapely.unary_union(lines, grid_size=_GRID_MM))
    polys = [orient(p, 1.0) for p in shapely.get_parts(shapely.polygonize(noded)) if p.area > 1.0]
    if not polys:
        return
    tree = shapely.STRtree(lines)
    origins = np.array([plan[g][0] for g in gids])
    units = np.array([(plan[g][1] - plan[g][0]) / np.linalg.norm(plan[g][1] - plan[g][0]) for g in gids])
    # every ring edge of every panel, attributed to the nearest parallel beam axis (one query)
    rings: list[tuple[int, int, np.ndarray]] = []
    for pi, p in enumerate(polys):
        rings.append((pi, 0, np.asarray(p.exterior.coords)[:-1, :2]))
        for hi, r in enumerate(p.interiors):
            rings.append((pi, hi + 1, np.asarray(r.coords)[:-1, :2]))
    seg_a = np.vstack([r[2] for r in rings])
    seg_b = np.vstack([np.roll(r[2], -1, axis=0) for r in rings])
    mids = shapely.points((seg_a + seg_b) / 2.0)
    pair = tree.query(mids, predicate="dwithin", distance=_EDGE_TOL_MM)
    owner = np.full(len(seg_a), -1)
    if pair.size:
        d = shapely.distance(mids[pair[0]], lines[pair[1]])
        sd = seg_b[pair[0]] - seg_a[pair[0]]
        sd = sd / np.maximum(np.linalg.norm(sd, axis=1), 1e-12)[:, None]
        par = np.abs(sd[:, 0] * units[pair[1], 1] - sd[:, 1] * units[pair[1], 0]) < 0.05
        score = d + np.where(par, 0.0, 1e6)
        # nearest parallel axis first, ties to the smaller GlobalId (gids are sorted)
        idx = np.lexsort((pair[1], score, pair[0]))
        q_sorted = pair[0][idx]
        first = np.ones(len(idx), bool)
        first[1:] = q_sorted[1:] != q_sorted[:-1]
        owner[q_sorted[first]] = pair[1][idx][first]

    def edge(i: int, c0: np.ndarray) -> _Edge:
        return _Edge(seg_a[i] - c0, seg_b[i] - c0, int(owner[i]) if owner[i] >= 0 else None)

    pos = 0
    ring_edges: dict[tuple[int, int], list[int]] = {}
    for pi, ri, r in rings:
        ring_edges[(pi, ri)] = list(range(pos, pos + len(r)))
        pos += len(r)
    def ring_edges_of(pi: int) -> list[list[int]]:
        return [ring_edges[(pi, ri)] for ri in range(len(polys[pi].interiors) + 1)]

    for pi, p in enumerate(polys):
        c0 = np.asarray(p.centroid.coords)[0]
        ext = np.asarray(p.exterior.coords)[:-1, :2] - c0
        holes = [np.asarray(r.coords)[:-1, :2] - c0 for r in p.interiors]
        edges = [edge(i, c0) for i in ring_edges[(pi, 0)]]
        hole_edges = [edge(i, c0) for ri in range(1, len(holes) + 1) for i in ring_edges[(pi, ri)]]
        env = np.asarray(shapely.oriented_envelope(p).exterior.coords)[:4, :2]
        s1, s2 = env[1] - env[0], env[2] - env[1]
        l1, l2 = float(np.linalg.norm(s1)), float(np.linalg.norm(s2))
        long_dir = (s1 / l1) if l1 >= l2 else (s2 / l2)
        aspect = max(l1, l2) / max(min(l1, l2), 1e-9)
        one_way = aspect >= ONE_WAY_ASPECT - 1e-9
        regions, method = _panel_regions(ext, holes, edges, hole_edges, long_dir, one_way)
        all_edges = edges + hole_edges
        carried: set[str] = set()
        lost = 0.0
        for ei, area, cen, ea, eb in regions:
            bi = all_edges[ei].beam
            if bi is None:
                lost += area
                continue
            g = gids[bi]
            o, u = origins[bi], units[bi]
            xa, xb = sorted((float((ea + c0 - o) @ u), float((eb + c0 - o) @ u)))
            x = min(max(float((cen + c0 - o) @ u), xa), xb)
            floor[g].append((x, area))
            carried.add(g)
        for g in {gids[int(owner[i])] for ring in ring_edges_of(pi) for i in ring if owner[i] >= 0}:
            n_panels[g] += 1  # panels the beam bounds (whether or not the panel's load goes to it)
        if lost > 1.0:
            warnings.append(DataWarning(
                f"storey {st!r}: {lost / 1e6:.2f} m² of a floor panel lies against an edge that is on no "
                f"beam; that load is not taken down", None, "demand"))
        panels.append(Panel(storey=st, coords=tuple((float(a), float(b)) for a, b in ext + c0),
                            span="one-way" if one_way else "two-way", aspect=aspect,
                            area=float(p.area), beams=tuple(sorted(carried)), method=method))
