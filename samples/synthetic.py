"""Large synthetic steel frames for tests and benchmarks of the joint finder (invented data).

A regular building of our own invention: a grid of ``bays_x`` × ``bays_y`` bays (8.0 m in x, 6.0 m in
y), storeys of 3.6 m. Per floor: girders along x framing into column flanges, beams along y framing
into column webs, and two secondary beams per bay along y framing into the girder webs (back-to-back
across every interior girder). Columns have their web along world x, so the x girders arrive along
the column's web direction (flange face) and the y beams square to its web.

``convention="detailed"``: beams stop ``CLEARANCE_MM`` short of the support face, axes at the top of
steel (cardinal point "top middle", ``axis_offset = (0, depth/2)``) at floor level, columns in
two-storey lifts spliced 1.0 m above the floor. ``convention="node-to-node"``: every axis runs
node to node through the centroid at floor level, columns one storey each.

The section dimensions are generic invented I shapes, not a catalogue. Deterministic for a given
argument set (``seed`` picks section variants and which roof edge beams get a cantilever).
"""

from __future__ import annotations

import math
from pathlib import Path
from typing import Sequence

import numpy as np

from engine.model import Member, Section

__all__ = ["synthetic_frame", "synthetic_counts", "write_synthetic_ifc", "CLEARANCE_MM", "SECTIONS"]

CLEARANCE_MM = 12.0
BAY_X_MM, BAY_Y_MM, STOREY_MM = 8000.0, 6000.0, 3600.0
SECONDARIES_PER_BAY = 2
CANTILEVER_MM = 1500.0


def _i(name: str, d: float, b: float, tw: float, tf: float, r: float) -> Section:
    area = 2 * b * tf + (d - 2 * tf) * tw
    i_major = (b * d ** 3 - (b - tw) * (d - 2 * tf) ** 3) / 12.0
    i_minor = (2 * tf * b ** 3 + (d - 2 * tf) * tw ** 3) / 12.0
    return Section(name, "I", d, b, tw, tf, r, area, i_major, i_minor, "synthetic")


SECTIONS = {
    "column": (_i("SYN-C310", 310, 305, 10, 15, 16), _i("SYN-C250", 260, 255, 9, 14, 13)),
    "girder": (_i("SYN-G530", 530, 210, 10, 16, 13), _i("SYN-G460", 460, 190, 9, 15, 11)),
    "ybeam": (_i("SYN-B360", 360, 170, 8, 13, 11), _i("SYN-B410", 410, 180, 8, 13, 11)),
    "secondary": (_i("SYN-S310", 310, 165, 6.5, 11, 11), _i("SYN-S250", 250, 145, 6, 9, 9)),
}

_B64 = "0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz_$"


def _gid(n: int) -> str:
    chars = []
    for _ in range(22):
        chars.append(_B64[n % 64])
        n //= 64
    return "".join(reversed(chars))


def synthetic_counts(bays_x: int, bays_y: int, storeys: int, convention: str = "detailed") -> int:
    """Number of members :func:`synthetic_frame` makes for this grid (before cantilevers)."""
    nx, ny = bays_x + 1, bays_y + 1
    per_floor = bays_x * ny + bays_y * nx + SECONDARIES_PER_BAY * bays_x * bays_y
    lifts = storeys if convention == "node-to-node" else math.ceil(storeys / 2)
    return storeys * per_floor + nx * ny * lifts


def synthetic_frame(n_members_target: int, *, bays_x: int | None = None, bays_y: int | None = None,
                    convention: str = "detailed", seed: int = 0, cantilevers: bool = True
                    ) -> list[Member]:
    """A regular invented steel frame of about ``n_members_target`` members (mm, see module doc).

    The grid is ``bays_x`` × ``bays_y`` (chosen near-square for the target when omitted); storeys are
    added until the count reaches the target (so the result is the first whole storey count at or
    above it). With ``cantilevers``, a few roof edge beams (chosen by ``seed``) run on past the
    edge column as cantilevers with a free end.
    """
    if convention not in ("detailed", "node-to-node"):
        raise ValueError("convention must be 'detailed' or 'node-to-node'")
    if n_members_target < 1:
        raise ValueError("n_members_target must be at least 1")
    if bays_x is None or bays_y is None:
        storeys_guess = max(1, round(n_members_target ** (1.0 / 3.0) / 2.0))
        b = max(1, round(math.sqrt(n_members_target / (5.0 * storeys_guess))))
        bays_x = bays_x or b
        bays_y = bays_y or b
    storeys = 1
    while synthetic_counts(bays_x, bays_y, storeys, convention) < n_members_target:
        storeys += 1
    rng = np.random.default_rng(seed)
    detailed = convention == "detailed"
    col_sec = SECTIONS["column"][int(rng.integers(2))]
    gir_sec = SECTIONS["girder"][int(rng.integers(2))]
    yb_sec = SECTIONS["ybeam"][int(rng.integers(2))]
    sec_sec = SECTIONS["secondary"][int(rng.integers(2))]
    members: list[Member] = []
    nx, ny = bays_x + 1, bays_y + 1
    xs = [i * BAY_X_MM for i in range(nx)]
    ys = [j * BAY_Y_MM for j in range(ny)]
    counter = [0]

    def add(ifc_class: str, role: str, start, end, sec: Section, tag: str, storey: str, web_dir,
            offset) -> None:
        counter[0] += 1
        members.append(Member(
            global_id=_gid(counter[0] * 7919 + seed * 104729), ifc_class=ifc_class, role=role,
            start=tuple(float(v) for v in start), end=tuple(float(v) for v in end), section=sec,
            name=tag, tag=tag, storey=storey, web_dir=web_dir, axis_offset=offset,
            cardinal_point=8 if offset else 5))

    # columns
    if detailed:
        breaks = [0.0] + [2 * k * STOREY_MM + 1000.0 for k in range(1, math.ceil(storeys / 2))] + \
                 [storeys * STOREY_MM]
    else:
        breaks = [k * STOREY_MM for k in range(storeys + 1)]
    for i, x in enumerate(xs):
        for j, y in enumerate(ys):
            for k in range(len(breaks) - 1):
                add("IfcColumn", "column", (x, y, breaks[k]), (x, y, breaks[k + 1]), col_sec,
                    f"C{i}-{j}-{k}", f"Level {int(breaks[k] // STOREY_MM)}", (1.0, 0.0, 0.0), None)

    g_end = col_sec.depth / 2 + CLEARANCE_MM if detailed else 0.0   # girder end from column axis
    yb_end = col_sec.web_thickness / 2 + CLEARANCE_MM if detailed else 0.0
    s_end = gir_sec.web_thickness / 2 + CLEARANCE_MM if detailed else 0.0
    cant = set()
    if cantilevers:
        pick = rng.permutation(ny)[: max(1, ny // 4)]
        cant = {int(j) for j in pick}
    for lvl in range(1, storeys + 1):
        z = lvl * STOREY_MM
        storey = f"Level {lvl}"

        def off(sec: Section):
            return (0.0, sec.depth / 2.0) if detailed else None

        for j, y in enumerate(ys):
            for i in range(bays_x):
                x0, x1 = xs[i] + g_end, xs[i + 1] - g_end
                if lvl == storeys and j in cant and i == bays_x - 1:
                    x1 = xs[i + 1] + CANTILEVER_MM   # runs past the edge column: a cantilever
                    x0 = xs[i] + g_end
                add("IfcBeam", "beam", (x0, y, z), (x1, y, z), gir_sec, f"G{lvl}-{i}-{j}", storey,
                    (0.0, 0.0, 1.0), off(gir_sec))
        for i, x in enumerate(xs):
            for j in range(bays_y):
                add("IfcBeam", "beam", (x, ys[j] + yb_end, z), (x, ys[j + 1] - yb_end, z), yb_sec,
                    f"B{lvl}-{i}-{j}", storey, (0.0, 0.0, 1.0), off(yb_sec))
        for i in range(bays_x):
            for j in range(bays_y):
                for k in range(1, SECONDARIES_PER_BAY + 1):
                    x = xs[i] + BAY_X_MM * k / (SECONDARIES_PER_BAY + 1)
                    add("IfcBeam", "beam", (x, ys[j] + s_end, z), (x, ys[j + 1] - s_end, z), sec_sec,
                        f"S{lvl}-{i}-{j}-{k}", storey, (0.0, 0.0, 1.0), off(sec_sec))
    return members


def write_synthetic_ifc(members: Sequence[Member], path: str | Path, schema: str = "IFC4",
                        length_unit: str = "mm") -> Path:
    """Write ``members`` to an IFC file: each an IfcBeam/IfcColumn with a local placement (z along
    the axis, x along the section's local x), an 'Axis' polyline and a 'Body' extruded I profile.

    ``length_unit``: ``"mm"``, ``"m"`` or ``"ft"`` (a conversion-based unit), to exercise readers.
    The axis offset (top-of-steel axis) is written as the profile's position offset.
    """
    import ifcopenshell
    import ifcopenshell.guid

    scale = {"mm": 1.0, "m": 1000.0, "ft": 304.8}[length_unit]
    f = ifcopenshell.file(schema=schema)

    def pt(v):
        return f.createIfcCartesianPoint([float(c) / scale for c in v])

    def dr(v):
        return f.createIfcDirection([float(c) for c in v])

    if length_unit == "ft":
        mm = f.createIfcSIUnit(None, "LENGTHUNIT", None, "METRE")
        measure = f.create_entity("IfcMeasureWithUnit", f.create_entity("IfcLengthMeasure", 0.3048), mm)
        dims = f.createIfcDimensionalExponents(1, 0, 0, 0, 0, 0, 0)
        length = f.createIfcConversionBasedUnit(dims, "LENGTHUNIT", "FOOT", measure)
    else:
        length = f.createIfcSIUnit(None, "LENGTHUNIT", "MILLI" if length_unit == "mm" else None, "METRE")
    units = f.createIfcUnitAssignment([length, f.createIfcSIUnit(None, "PLANEANGLEUNIT", None, "RADIAN")])
    origin = f.createIfcAxis2Placement3D(pt((0, 0, 0)), None, None)
    ctx = f.createIfcGeometricRepresentationContext(None, "Model", 3, 1.0e-5, origin, None)
    body_ctx = f.createIfcGeometricRepresentationSubContext("Body", "Model", None, None, None, None,
                                                             ctx, None, "MODEL_VIEW", None)
    axis_ctx = f.createIfcGeometricRepresentationSubContext("Axis", "Model", None, None, None, None,
                                                             ctx, None, "GRAPH_VIEW", None)
    project = f.createIfcProject(ifcopenshell.guid.new(), None, "Synthetic frame", None, None, None,
                                 None, [ctx], units)
    site_pl = f.createIfcLocalPlacement(None, origin)
    site = f.createIfcSite(ifcopenshell.guid.new(), None, "Site", None, None, site_pl, None, None,
                           "ELEMENT", None, None, None, None, None)
    bldg = f.createIfcBuilding(ifcopenshell.guid.new(), None, "Building", None, None, site_pl, None, None,
                               "ELEMENT", None, None, None)
    f.createIfcRelAggregates(ifcopenshell.guid.new(), None, None, None, project, [site])
    f.createIfcRelAggregates(ifcopenshell.guid.new(), None, None, None, site, [bldg])
    storeys: dict[str, object] = {}
    contained: dict[str, list] = {}
    profiles: dict[tuple, object] = {}
    for m in members:
        if m.storey not in storeys:
            storeys[m.storey] = f.createIfcBuildingStorey(ifcopenshell.guid.new(), None, m.storey, None,
                                                          None, site_pl, None, None, "ELEMENT", None)
            contained[m.storey] = []
        a = np.subtract(m.end, m.start)
        L = float(np.linalg.norm(a))
        a = a / L
        wd = np.array(m.web_dir if m.web_dir is not None else (0.0, 0.0, 1.0))
        y = wd - wd.dot(a) * a
        y /= np.linalg.norm(y)
        x = np.cross(y, a)
        pl = f.createIfcLocalPlacement(site_pl, f.createIfcAxis2Placement3D(pt(m.start), dr(a), dr(x)))
        s = m.section
        key = (s.name, m.axis_offset)
        if key not in profiles:
            ox, oy = m.axis_offset or (0.0, 0.0)
            ppos = f.createIfcAxis2Placement2D(f.createIfcCartesianPoint([-ox / scale, -oy / scale]), None)
            profiles[key] = f.createIfcIShapeProfileDef(
                "AREA", s.name, ppos, s.width / scale, s.depth / scale, s.web_thickness / scale,
                s.flange_thickness / scale, (s.root_radius or 0.0) / scale)
        solid = f.createIfcExtrudedAreaSolid(profiles[key], None, dr((0, 0, 1)), L / scale)
        line = f.createIfcPolyline([pt((0, 0, 0)), f.createIfcCartesianPoint([0.0, 0.0, L / scale])])
        shape = f.createIfcProductDefinitionShape(None, None, [
            f.createIfcShapeRepresentation(axis_ctx, "Axis", "Curve3D", [line]),
            f.createIfcShapeRepresentation(body_ctx, "Body", "SweptSolid", [solid])])
        cls = "IfcColumn" if m.role == "column" else "IfcBeam"
        el = f.create_entity(cls, GlobalId=m.global_id, Name=m.name, ObjectPlacement=pl,
                             Representation=shape, Tag=m.tag)
        if schema != "IFC2X3":
            el.PredefinedType = "COLUMN" if cls == "IfcColumn" else "BEAM"
        contained[m.storey].append(el)
    f.createIfcRelAggregates(ifcopenshell.guid.new(), None, None, None, bldg, list(storeys.values()))
    for name, els in contained.items():
        f.createIfcRelContainedInSpatialStructure(ifcopenshell.guid.new(), None, None, None, els,
                                                  storeys[name])
    out = Path(path)
    f.write(str(out))
    return out
