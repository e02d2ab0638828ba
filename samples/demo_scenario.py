"""The invented demo building as plain data (world coordinates in mm, forces in kN where named).

Project "Kestrel Lane Depot" (invented): a three-storey steel-framed workshop-and-office block on an
invented grid A–D (x: 0, 7200, 14400, 21600 mm) × 1–3 (y: 0, 8400, 16800 mm). Floors: Ground 0,
Level 1 +4200, Level 2 +8000, Roof +11800 (mm). Every name, person and organisation here is
invented; the loads, shears and connections are demo data, not a design.

Everything the IFC writer (``samples.demo_ifc``) and the truth file need is computed here once, in
mm, so both IFC files (mm and feet) describe the same building and the truth applies to both.

Conventions used by the generator:

* Beams are placed with their axis at **top of steel, web centreline** (cardinal point 8, "top
  centre"); columns with their axis on the section centroid (cardinal point 5).
* Level 1 and Level 2 beams are **detailed**: they stop short of the support face by a clearance
  (10 mm from a column face, 15 mm from a girder web face). Roof beams run **node to node**: their
  ends lie on the support's axis.
* Columns A*, D* have their web along world x; columns B*, C* along world y. So a beam along the
  web direction meets a flange, a beam across it meets the web.

This module only describes a demo; joint-audit's results on it are an aid to a competent engineer,
must be checked, and local codes and licensed practice take precedence.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field

from samples.demo_sections import BOLT_GRADE, PLATE_GRADE, SectionDims, section

__all__ = [
    "PROJECT_NAME",
    "GRID_X",
    "GRID_Y",
    "STOREYS",
    "MemberSpec",
    "WallSpec",
    "FinPlateSpec",
    "JointSpec",
    "ScheduleRow",
    "Scenario",
    "build_scenario",
]

PROJECT_NAME = "Kestrel Lane Depot - workshop and offices (invented demo project)"
SITE_NAME = "Kestrel Lane site (invented)"
BUILDING_NAME = "Block K (invented)"

GRID_X: dict[str, float] = {"A": 0.0, "B": 7200.0, "C": 14400.0, "D": 21600.0}
GRID_Y: dict[str, float] = {"1": 0.0, "2": 8400.0, "3": 16800.0}
STOREYS: tuple[tuple[str, float], ...] = (
    ("Ground", 0.0),
    ("Level 1", 4200.0),
    ("Level 2", 8000.0),
    ("Roof", 11800.0),
)
LEVEL_Z = dict(STOREYS)

COLUMN_CLEARANCE = 10.0
"""Detailed beams stop this far (mm) short of a column flange or web face."""
GIRDER_CLEARANCE = 15.0
"""Detailed secondaries stop this far (mm) short of the girder web face."""
SPLICE_ABOVE_FLOOR = 600.0
"""Height (mm) of the column splice above Level 2."""
LEVEL2_SETDOWN = 100.0
"""The Level 2 secondaries are set down by this much (mm) (an invented set-down slab zone)."""
COPE_CLEARANCE = 10.0  # common practice: cope runs ~10 mm past the supporting flange tip

UP = (0.0, 0.0, 1.0)


def _sub(a, b):
    return (a[0] - b[0], a[1] - b[1], a[2] - b[2])


def _add(a, b):
    return (a[0] + b[0], a[1] + b[1], a[2] + b[2])


def _mul(a, s):
    return (a[0] * s, a[1] * s, a[2] * s)


def _dot(a, b):
    return a[0] * b[0] + a[1] * b[1] + a[2] * b[2]


def _cross(a, b):
    return (a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0])


def _unit(a):
    n = math.sqrt(_dot(a, a))
    return (a[0] / n, a[1] / n, a[2] / n)


def _clean(v: tuple[float, ...]) -> tuple[float, ...]:
    """Round to 1e-6 mm and turn -0.0 into 0.0 so every run writes identical numbers."""
    return tuple(round(x, 6) + 0.0 for x in v)


def _ceil5(x: float) -> float:
    """Round up to the next 5 mm (common practice for cope and bolt-length dimensions)."""
    return 5.0 * math.ceil(x / 5.0 - 1e-9)


@dataclass(frozen=True)
class MemberSpec:
    """A beam or column: axis ``start``/``end`` in world mm, ``web_dir`` the profile's local y."""

    tag: str
    name: str
    ifc_class: str
    role: str
    start: tuple[float, float, float]
    end: tuple[float, float, float]
    section: SectionDims
    storey: str
    web_dir: tuple[float, float, float]
    cardinal_point: int

    @property
    def length(self) -> float:
        """Axis length (mm)."""
        d = _sub(self.end, self.start)
        return math.sqrt(_dot(d, d))

    @property
    def direction(self) -> tuple[float, float, float]:
        """Unit vector from start to end."""
        return _unit(_sub(self.end, self.start))


@dataclass(frozen=True)
class WallSpec:
    """A concrete wall given by its world bounding box (mm)."""

    tag: str
    name: str
    bbox_min: tuple[float, float, float]
    bbox_max: tuple[float, float, float]
    storey: str


@dataclass(frozen=True)
class FinPlateSpec:
    """A modelled fin plate with its bolts, in the layout terms of ``rules/geometry.py`` (mm).

    ``origin`` is the world point of the plate's top edge on the support face, on the face of the
    plate that touches the beam web; ``x_dir`` runs along the beam away from the support, ``y_dir``
    is up, ``z_dir`` is the plate's outward normal (plate occupies ``0 ≤ z ≤ thickness``, the beam
    web ``−tw ≤ z ≤ 0``).
    """

    key: str
    beam: str
    end: str
    thickness: float
    bolt_size: str
    bolt_diameter: float
    rows: int
    lines: int
    pitch: float
    gauge: float
    plate_end_edge: float
    plate_side_edge: float
    a: float
    gap: float
    top_offset: float
    weld_leg: float
    weld_electrode: str
    beam_web_thickness: float
    origin: tuple[float, float, float]
    x_dir: tuple[float, float, float]
    z_dir: tuple[float, float, float]
    intended: str
    why: str

    @property
    def depth(self) -> float:
        """Plate depth (mm): two end edges plus (rows − 1) pitches."""
        return 2.0 * self.plate_end_edge + (self.rows - 1) * self.pitch

    @property
    def width(self) -> float:
        """Plate width (mm): a + (lines − 1)·gauge + side edge."""
        return self.a + (self.lines - 1) * self.gauge + self.plate_side_edge

    @property
    def beam_end_edge(self) -> float:
        """Beam end to the nearest bolt line (mm): a − gap."""
        return self.a - self.gap

    @property
    def beam_top_edge(self) -> float:
        """Top of the beam (or of the cope) to the top bolt (mm)."""
        return self.plate_end_edge + self.top_offset

    @property
    def bolt_count(self) -> int:
        return self.rows * self.lines

    @property
    def bolt_length(self) -> float:
        """Nominal bolt length (mm): grip + nut, washer and thread allowance, rounded up to 5 mm."""
        allowance = {16.0: 25.0, 20.0: 30.0, 24.0: 35.0}[self.bolt_diameter]  # common practice
        return _ceil5(self.thickness + self.beam_web_thickness + allowance)

    def bolt_local_xy(self) -> list[tuple[float, float]]:
        """Bolt centres (x, y) in the plate's local frame (mm), row-major as ``bolt_xy``."""
        return [
            (self.a + j * self.gauge, -(self.plate_end_edge + i * self.pitch))
            for i in range(self.rows)
            for j in range(self.lines)
        ]

    def as_truth(self, assembly_gid: str) -> dict:
        """The ``connection`` object of a truth joint."""
        return {
            "assembly": assembly_gid,
            "mark": self.key,
            "plate": {
                "thickness": self.thickness,
                "depth": self.depth,
                "width": self.width,
                "grade": PLATE_GRADE[0],
            },
            "bolts": {
                "size": self.bolt_size,
                "diameter": self.bolt_diameter,
                "grade": BOLT_GRADE[0],
                "category": BOLT_GRADE[1],
                "count": self.bolt_count,
                "length": self.bolt_length,
            },
            "rows": self.rows,
            "lines": self.lines,
            "pitch": self.pitch,
            "gauge": self.gauge,
            "plate_end_edge": self.plate_end_edge,
            "plate_side_edge": self.plate_side_edge,
            "beam_end_edge": self.beam_end_edge,
            "beam_top_edge": self.beam_top_edge,
            "a": self.a,
            "weld": {"leg": self.weld_leg, "electrode": self.weld_electrode},
        }


@dataclass(frozen=True)
class JointSpec:
    """One beam end the generator built and what supports it (see the truth file format)."""

    beam: str
    end: str
    support: str | None
    kind: str
    convention: str
    gap: float
    node: tuple[float, float, float]
    into: tuple[float, float, float]
    support_continuous: bool | None
    stiffness: str = "flexible"
    stiffness_note: str = ""
    cope: dict | None = None
    back_to_back_with: tuple[str, str] | None = None
    connection: FinPlateSpec | None = None
    intended: str = "no-connection"
    why: str = ""
    model_shear_kN: float | None = None
    schedule_row: int | None = None


@dataclass(frozen=True)
class ScheduleRow:
    """One row of the demo connection schedule (mm; ``end`` is start, end or both)."""

    match: str
    value: str
    end: str
    plate_thickness: float
    plate_depth: float
    plate_width: float
    bolt_size: str
    bolt_grade: str
    rows: int
    lines: int
    pitch: float
    gauge: float
    plate_end_edge: float
    plate_side_edge: float
    beam_end_edge: float
    beam_top_edge: float
    a: float
    weld_leg: float
    weld_electrode: str


@dataclass
class Scenario:
    """The whole demo: members, walls, joints, fin plates, model shears and the schedule."""

    members: list[MemberSpec] = field(default_factory=list)
    walls: list[WallSpec] = field(default_factory=list)
    joints: list[JointSpec] = field(default_factory=list)
    model_shears_kN: dict[str, tuple[float, float]] = field(default_factory=dict)
    schedule: list[ScheduleRow] = field(default_factory=list)

    def member(self, tag: str) -> MemberSpec:
        for m in self.members:
            if m.tag == tag:
                return m
        raise KeyError(tag)

    @property
    def fin_plates(self) -> list[FinPlateSpec]:
        return [j.connection for j in self.joints if j.connection is not None]


# ---------------------------------------------------------------------------------------------
# The frame


def _column_sections(grid: str) -> str:
    return "310UC96.8" if grid in ("B2", "C2") else "250UC89.5"


def _columns() -> list[MemberSpec]:
    cols: list[MemberSpec] = []
    top = LEVEL_Z["Roof"]
    for gx, x in GRID_X.items():
        for gy, y in GRID_Y.items():
            grid = gx + gy
            web = (1.0, 0.0, 0.0) if gx in ("A", "D") else (0.0, 1.0, 0.0)
            if grid == "C2":
                zs = LEVEL_Z["Level 2"] + SPLICE_ABOVE_FLOOR
                cols.append(MemberSpec(
                    "C-C2-L", "Column C2 lower lift (Ground to splice above Level 2)", "IfcColumn",
                    "column", (x, y, 0.0), (x, y, zs), section("310UC118"), "Ground", web, 5))
                cols.append(MemberSpec(
                    "C-C2-U", "Column C2 upper lift (top storey, splice to Roof)", "IfcColumn",
                    "column", (x, y, zs), (x, y, top), section("310UC96.8"), "Level 2", web, 5))
                continue
            cols.append(MemberSpec(
                f"C-{grid}", f"Column {grid} (Ground to Roof)", "IfcColumn", "column",
                (x, y, 0.0), (x, y, top), section(_column_sections(grid)), "Ground", web, 5))
    return cols


# (tag suffix, kind, node start, node end, support start, support end, section by level)
def _floor_beams(level: str) -> list[tuple[str, str, tuple, tuple, tuple, tuple, str]]:
    """Beams of one level as (tag, name, node_start, node_end, sup_start, sup_end, section).

    Nodes are (x, y) in mm at the support axes; supports are ("col", grid) or ("gir", tag).
    """
    roof = level == "Roof"
    p = level.replace("Level ", "L") if not roof else "R"
    gx, gy = GRID_X, GRID_Y
    out = []
    for line in "ABCD":
        if roof:
            sec = "410UB53.7" if line in "BC" else "360UB50.7"
        else:
            sec = "460UB74.6" if line in "BC" else "410UB53.7"
        for a, b in (("1", "2"), ("2", "3")):
            out.append((f"{p}-G-{line}{a}{b}", f"Girder {line}/{a}-{b} {level}",
                        (gx[line], gy[a]), (gx[line], gy[b]),
                        ("col", f"{line}{a}"), ("col", f"{line}{b}"), sec))
    for row in "123":
        if roof:
            sec = "360UB50.7"
        else:
            sec = "410UB53.7" if row == "2" else "360UB50.7"
        for a, b in (("A", "B"), ("B", "C"), ("C", "D")):
            out.append((f"{p}-B-{row}{a}{b}", f"Beam {row}/{a}-{b} {level}",
                        (gx[a], gy[row]), (gx[b], gy[row]),
                        ("col", f"{a}{row}"), ("col", f"{b}{row}"), sec))
    ymid = (gy["1"] + gy["2"]) / 2.0
    sec = "250UB31.4" if roof else "310UB40.4"
    for a, b in (("A", "B"), ("B", "C")):
        out.append((f"{p}-S-{a}{b}", f"Secondary {a}-{b} at 1-2 midspan {level}",
                    (gx[a], ymid), (gx[b], ymid),
                    ("gir", f"{p}-G-{a}12"), ("gir", f"{p}-G-{b}12"), sec))
    return out


def _column_at(cols: list[MemberSpec], grid: str, z: float) -> MemberSpec:
    """The column lift at ``grid`` whose axis spans level ``z`` (the lower lift at a splice)."""
    cands = [c for c in cols if c.tag in (f"C-{grid}", f"C-{grid}-L", f"C-{grid}-U")]
    for c in cands:
        if c.start[2] - 1e-6 <= z <= c.end[2] + 1e-6 and (c.end[2] > z + 1e-6 or c is cands[-1]):
            return c
    raise LookupError(f"no column at {grid} spanning z={z}")


@dataclass
class _End:
    """Working record of one beam end while the frame is laid out."""

    support: str | None
    kind: str
    gap: float
    node: tuple[float, float, float]
    point: tuple[float, float, float]
    continuous: bool | None
    into: tuple[float, float, float] = (0.0, 0.0, 0.0)


def _face_offset(sup: MemberSpec, into: tuple[float, float, float]) -> tuple[str, float]:
    """Kind of face met and its distance (mm) from the support axis, for a beam whose direction
    pointing away from the support is ``into``."""
    if sup.role == "column":
        along_web = abs(_dot(into, sup.web_dir)) > 0.99
        return ("column-flange", sup.section.d / 2.0) if along_web else ("column-web", sup.section.tw / 2.0)
    return "beam-web", sup.section.tw / 2.0


def build_scenario() -> Scenario:
    """Lay out the invented building and return it as a :class:`Scenario` (deterministic)."""
    sc = Scenario()
    cols = _columns()
    sc.members.extend(cols)
    by_tag: dict[str, MemberSpec] = {c.tag: c for c in cols}
    ends: dict[tuple[str, str], _End] = {}

    for level in ("Level 1", "Level 2", "Roof"):
        z_level = LEVEL_Z[level]
        detailed = level != "Roof"
        for tag, name, n0, n1, s0, s1, sec_name in _floor_beams(level):
            sec = section(sec_name)
            z = z_level - (LEVEL2_SETDOWN if (level == "Level 2" and "-S-" in tag) else 0.0)
            p0 = (n0[0], n0[1], z)
            p1 = (n1[0], n1[1], z)
            d = _unit(_sub(p1, p0))
            pts = []
            recs = []
            for node, sup_ref, into in ((p0, s0, d), (p1, s1, _mul(d, -1.0))):
                kind_ref, ref = sup_ref
                sup = _column_at(cols, ref, z) if kind_ref == "col" else by_tag[ref]
                kind, face = _face_offset(sup, into)
                if kind == "column-web":
                    cs = sup.section
                    if sec.bf > cs.d - 2.0 * cs.tf - 2.0 * cs.r:
                        raise ValueError(f"{tag}: flange {sec.bf} mm does not fit between the "
                                         f"flanges of {sup.tag}")
                clearance = (COLUMN_CLEARANCE if kind_ref == "col" else GIRDER_CLEARANCE)
                if detailed:
                    gap = clearance
                    pt = _add(node, _mul(into, face + clearance))
                else:
                    gap = -face
                    pt = node
                if kind_ref == "col":
                    continuous = sup.end[2] > z + 1.0 and sup.start[2] < z - 1.0
                else:
                    continuous = True  # secondaries land at girder midspan
                pts.append(_clean(pt))
                recs.append(_End(sup.tag, kind, gap, _clean(node), _clean(pt), continuous, _clean(into)))
            m = MemberSpec(tag, name, "IfcBeam", "beam", pts[0], pts[1], sec, level,
                           (0.0, 0.0, 1.0), 8)
            sc.members.append(m)
            by_tag[tag] = m
            ends[(tag, "start")], ends[(tag, "end")] = recs

    # The cantilever at D3, Level 1: along +x from the column flange, free end 1800 mm from grid D.
    z1 = LEVEL_Z["Level 1"]
    d3 = by_tag["C-D3"]
    sec = section("360UB50.7")
    node = (GRID_X["D"], GRID_Y["3"], z1)
    p0 = _clean((node[0] + d3.section.d / 2.0 + COLUMN_CLEARANCE, node[1], z1))
    p1 = _clean((GRID_X["D"] + 1800.0, GRID_Y["3"], z1))
    sc.members.append(MemberSpec("L1-CANT-D3", "Cantilever canopy beam at D3 Level 1", "IfcBeam",
                                 "beam", p0, p1, sec, "Level 1", (0.0, 0.0, 1.0), 8))
    ends[("L1-CANT-D3", "start")] = _End("C-D3", "column-flange", COLUMN_CLEARANCE, node, p0, True,
                                             (1.0, 0.0, 0.0))
    ends[("L1-CANT-D3", "end")] = _End(None, "free-end", 0.0, p1, p1, None)

    # A beam from D1 bearing 150 mm onto a 200 mm concrete wall at x = 24000..24200 (Level 1).
    sec = section("360UB50.7")
    wall_top = z1 - sec.d
    wall = WallSpec("W-E1", "Concrete dock wall E1 (bearing wall)",
                    (24000.0, -1500.0, 0.0), (24200.0, 1500.0, wall_top), "Ground")
    sc.walls.append(wall)
    d1 = by_tag["C-D1"]
    node = (GRID_X["D"], GRID_Y["1"], z1)
    p0 = _clean((node[0] + d1.section.d / 2.0 + COLUMN_CLEARANCE, node[1], z1))
    p1 = _clean((wall.bbox_min[0] + 150.0, GRID_Y["1"], z1))
    sc.members.append(MemberSpec("L1-W-D1", "Dock beam D1 to wall E1 Level 1", "IfcBeam", "beam",
                                 p0, p1, sec, "Level 1", (0.0, 0.0, 1.0), 8))
    ends[("L1-W-D1", "start")] = _End("C-D1", "column-flange", COLUMN_CLEARANCE, node, p0, True,
                                          (1.0, 0.0, 0.0))
    ends[("L1-W-D1", "end")] = _End(wall.tag, "wall", -150.0, p1, p1, None)

    sc.model_shears_kN = _model_shears()
    plates = _fin_plate_layouts()
    schedule = _schedule(by_tag)
    sc.schedule = schedule

    # Joints: beams first in member order, then the splice.
    for m in sc.members:
        if m.role != "beam":
            continue
        for end in ("start", "end"):
            e = ends[(m.tag, end)]
            into = m.direction if end == "start" else _mul(m.direction, -1.0)
            sc.joints.append(_joint(sc, by_tag, m, end, e, _clean(into), plates, ends))
    lower, upper = by_tag["C-C2-L"], by_tag["C-C2-U"]
    sc.joints.append(JointSpec(
        beam=upper.tag, end="start", support=lower.tag, kind="splice", convention="detailed",
        gap=0.0, node=upper.start, into=(0.0, 0.0, 1.0), support_continuous=False,
        stiffness="stiff", stiffness_note="upper column lift bears on the lower lift",
        intended="not-a-fin-plate-joint",
        why="column splice 600 mm above Level 2: a splice, not a beam end connection"))
    return sc


def _back_to_back(sc_ends: dict, tag: str, end: str) -> tuple[str, str] | None:
    """The other beam end landing on the same support at the same node from the opposite side."""
    me = sc_ends[(tag, end)]
    if me.support is None:
        return None
    for (t2, e2), other in sc_ends.items():
        if (t2, e2) == (tag, end) or other.support != me.support:
            continue
        if max(abs(a - b) for a, b in zip(other.node[:2], me.node[:2])) > 1.0:
            continue
        if abs(other.node[2] - me.node[2]) > 1.0:
            continue
        if _dot(me.into, other.into) < -0.99:
            return (t2, e2)
    return None


def _joint(sc: Scenario, by_tag: dict, m: MemberSpec, end: str, e: _End, into,
           plates: dict, ends: dict) -> JointSpec:
    convention = "node-to-node" if m.storey == "Roof" else "detailed"
    b2b = _back_to_back(ends, m.tag, end) if e.kind in ("column-flange", "column-web", "beam-web") else None
    cope = None
    if e.kind == "column-flange":
        stiff = "stiff" if e.continuous else "flexible"
        note = ("column flange face, column continuous through the joint" if e.continuous else
                "column flange face at the top of the column (column stops here): not clearly stiff")
    elif e.kind == "column-web":
        stiff = "stiff" if e.continuous else "flexible"
        note = ("column web between the flanges of a column continuous through the joint"
                if e.continuous else
                "column web at the top of the column (column stops here): not clearly stiff")
    elif e.kind == "beam-web":
        g = by_tag[e.support]
        balanced = False
        if b2b is not None:
            o = by_tag[b2b[0]]
            balanced = (o.section.name == m.section.name and abs(o.length - m.length) < 0.01 * m.length)
        stiff = "stiff" if balanced else "flexible"
        note = ("girder web with a balanced back-to-back pair (same section, same span): "
                "the two reactions do not twist the girder" if balanced else
                "girder web loaded from one side only: the girder can twist")
        drop = g.start[2] - m.start[2]
        need = g.section.tf + g.section.r - drop
        # bottom flange of the secondary below the top of the girder's bottom flange (+ root)
        need_bottom = g.section.tf + g.section.r - (g.section.d - drop - m.section.d)
        if need > 0 or need_bottom > 0:
            gap_det = e.gap if convention == "detailed" else GIRDER_CLEARANCE
            length = (g.section.bf - g.section.tw) / 2.0 - gap_det + COPE_CLEARANCE
            where, depth = ("top", need) if need > 0 else ("bottom", need_bottom)
            cope = {"where": where, "depth": _ceil5(depth), "length": _ceil5(length)}
    elif e.kind == "wall":
        stiff, note = "stiff", "beam bears on top of a concrete wall"
    else:
        stiff, note = "flexible", "free end: no support"

    shear = sc.model_shears_kN.get(m.tag)
    model_shear = None if shear is None else (shear[0] if end == "start" else shear[1])
    fp_key = plates.get((m.tag, end))
    conn: FinPlateSpec | None = None
    if fp_key is not None:
        conn = _place_fin_plate(fp_key, m, end, e, into, cope)
        intended, why = conn.intended, conn.why
    elif e.kind in ("wall", "free-end"):
        intended = "not-a-fin-plate-joint"
        why = ("beam end bears on a wall: a bearing, not a fin plate" if e.kind == "wall"
               else "free end of a cantilever: nothing to connect")
    elif m.tag == "L1-CANT-D3":
        intended = "not-a-fin-plate-joint"
        why = "root of a cantilever needs a moment connection; a fin plate is a simple (pinned) connection"
    else:
        intended = "no-connection"
        why = "no connection modelled at this end"
    row = None
    if conn is None and intended == "no-connection":
        row = _schedule_row_for(sc.schedule, m, end)
        if row is not None:
            why = f"no connection modelled; connection schedule row {row} applies"
    return JointSpec(
        beam=m.tag, end=end, support=e.support, kind=e.kind, convention=convention, gap=e.gap,
        node=e.node, into=into, support_continuous=e.continuous, stiffness=stiff,
        stiffness_note=note, cope=cope, back_to_back_with=b2b, connection=conn,
        intended=intended, why=why, model_shear_kN=model_shear, schedule_row=row)


# ---------------------------------------------------------------------------------------------
# Loads and connections (invented demo values)


def _model_shears() -> dict[str, tuple[float, float]]:
    """End shears (kN) put into the beams' ``Demo_Analysis`` property set (start, end)."""
    return {
        "L1-G-B12": (180.0, 180.0),
        "L1-S-AB": (70.0, 70.0),
        "L1-S-BC": (70.0, 70.0),
        "L1-B-2AB": (90.0, 90.0),
        "L1-B-2BC": (90.0, 90.0),
        "L1-W-D1": (40.0, 40.0),
        "L2-G-C12": (220.0, 220.0),
        "L2-B-1CD": (50.0, 50.0),
        "L2-G-D12": (90.0, 90.0),
        "L2-S-BC": (60.0, 60.0),
    }


# key: (beam tag, end) -> layout parameters of the fin plate modelled there
_STD = dict(thickness=10.0, bolt_size="M20", bolt_diameter=20.0, rows=3, lines=1, pitch=70.0,
            gauge=0.0, plate_end_edge=35.0, plate_side_edge=45.0, a=60.0, top_offset=50.0,
            weld_leg=8.0, weld_electrode="E48XX", intended="adequate")
# 8 mm fillet welds both sides for 10 mm Grade 250 plates, so the welds are stronger than the plate
# (common practice); plates at least 0.6 x the beam depth deep (common practice)


def _fin_plate_layouts() -> dict[tuple[str, str], dict]:
    """The twelve modelled fin plates: layout parameters (mm) and intended outcome."""
    std_sec = dict(_STD, top_offset=20.0)
    fp = {
        ("L1-G-B12", "start"): dict(
            _STD, thickness=8.0, bolt_size="M16", bolt_diameter=16.0, rows=2, pitch=60.0, weld_leg=6.0,
            plate_end_edge=30.0, plate_side_edge=40.0, top_offset=60.0, intended="too-weak",
            why="2 x M16 on an 8 mm plate at the end of a long-span girder with 180 kN end shear"),
        ("L1-G-B12", "end"): dict(
            _STD, rows=4, why="4 x M20 8.8/S, 10 mm plate, for 180 kN"),
        ("L1-S-AB", "start"): dict(std_sec, why="3 x M20 8.8/S, 10 mm plate, for 70 kN"),
        ("L1-S-AB", "end"): dict(std_sec, why="3 x M20 8.8/S, 10 mm plate, for 70 kN"),
        ("L1-S-BC", "start"): dict(std_sec, why="3 x M20 8.8/S, 10 mm plate, for 70 kN"),
        ("L1-B-2AB", "start"): dict(_STD, rows=4, why="4 x M20 8.8/S, 10 mm plate, for 90 kN"),
        ("L1-B-2BC", "start"): dict(_STD, rows=4, why="4 x M20 8.8/S, 10 mm plate, for 90 kN"),
        ("L1-W-D1", "start"): dict(_STD, plate_end_edge=40.0, why="3 x M20 8.8/S, 10 mm plate, for 40 kN"),
        ("L2-G-C12", "end"): dict(
            _STD, thickness=6.0, weld_leg=6.0, intended="too-weak",
            why="6 mm plate and 3 x M20 for 220 kN: plate shear and bolt group overloaded"),
        ("L2-B-1CD", "end"): dict(
            _STD, plate_end_edge=22.0, plate_side_edge=22.0, a=COLUMN_CLEARANCE + 22.0,
            intended="too-weak",
            why="edge distances of 22 mm for M20 bolts on the plate and the beam web: below the "
                "minimum edge distance (strength is otherwise ample for 50 kN)"),
        ("L2-G-D12", "start"): dict(_STD, rows=4, why="4 x M20 8.8/S, 10 mm plate, for 90 kN"),
        ("L2-S-BC", "start"): dict(_STD, why="3 x M20 8.8/S, 10 mm plate, for 60 kN (set-down beam, no cope)"),
    }
    for i, k in enumerate(fp, 1):
        fp[k] = dict(fp[k], key=f"FP-{i:02d}")
    return fp


def _place_fin_plate(p: dict, m: MemberSpec, end: str, e: _End, into, cope: dict | None) -> FinPlateSpec:
    """Put the fin plate of layout ``p`` at beam ``m``'s ``end`` (world mm)."""
    face_pt = _sub(e.point, _mul(into, e.gap))
    n = _unit(_cross(into, UP))
    drop = (cope["depth"] if cope else 0.0) + p["top_offset"]
    origin = _clean(_add(_add(face_pt, _mul(n, m.section.tw / 2.0)), (0.0, 0.0, -drop)))
    spec = FinPlateSpec(
        key=p["key"], beam=m.tag, end=end, thickness=p["thickness"], bolt_size=p["bolt_size"],
        bolt_diameter=p["bolt_diameter"], rows=p["rows"], lines=p["lines"], pitch=p["pitch"],
        gauge=p["gauge"], plate_end_edge=p["plate_end_edge"], plate_side_edge=p["plate_side_edge"],
        a=p["a"], gap=e.gap, top_offset=p["top_offset"], weld_leg=p["weld_leg"],
        weld_electrode=p["weld_electrode"], beam_web_thickness=m.section.tw, origin=origin,
        x_dir=_clean(into), z_dir=_clean(n), intended=p["intended"], why=p["why"])
    # The plate must sit on the web clear of the bottom flange root.
    bottom = drop + spec.depth
    if bottom > m.section.d - m.section.tf - m.section.r + 1e-6:
        raise ValueError(f"{spec.key}: plate runs into the bottom flange of {m.tag}")
    if drop < m.section.tf + m.section.r - 1e-6 and cope is None:
        raise ValueError(f"{spec.key}: plate runs into the top flange of {m.tag}")
    return spec


def _schedule(by_tag: dict) -> list[ScheduleRow]:
    """A small connection schedule for joints without a modelled plate (mm)."""
    def row(match, value, end, t, rows, a, gap, top_edge, pe=35.0, ps=45.0):
        depth = 2 * pe + (rows - 1) * 70.0
        return ScheduleRow(match, value, end, t, depth, a + ps, "M20", BOLT_GRADE[0], rows, 1, 70.0,
                           0.0, pe, ps, a - gap, top_edge, a, 8.0, "E48XX")

    return [
        row("tag", "L2-G-B12", "both", 10.0, 4, 60.0, COLUMN_CLEARANCE, 85.0),
        row("globalid", "L1-B-1AB", "start", 10.0, 4, 60.0, COLUMN_CLEARANCE, 85.0),
        row("section", "310UB40.4", "both", 10.0, 3, 60.0, GIRDER_CLEARANCE, 70.0),
    ]


def _schedule_row_for(schedule: list[ScheduleRow], m: MemberSpec, end: str) -> int | None:
    """1-based number of the first schedule row that applies to ``m``'s ``end``, else None.

    Rows are matched by globalid, tag or section; ``value`` of a globalid row holds the member tag
    here and is turned into the GlobalId when the CSV is written.
    """
    for i, r in enumerate(schedule, 1):
        if r.end not in ("both", end):
            continue
        if r.match in ("tag", "globalid") and r.value == m.tag:
            return i
        if r.match == "section" and r.value == m.section.name:
            return i
    return None

