"""Modelled fin plates: plates and bolts found at a beam end, recovered into a :class:`FinPlate`.

Input: the reader's :class:`engine.model.ConnectionPart` records (plates with their body box —
centre, thickness normal, ``width``/``depth``/``thickness`` — and bolts with their centre and
diameter), the shear joints, and the members. For each plate:

1. its bolts are the bolts of the same ``IfcElementAssembly``; a plate outside an assembly takes the
   bolts whose centres lie inside its outline (within 5 mm, # common practice);
2. it belongs to the shear joint whose beam end it sits at: the plate lies in the beam's web plane
   (its normal square to the beam axis, its face within ``tw/2 + t + 5 mm`` of the web centre
   plane), and its centre is within a plate width plus the joint-gap tolerance of the beam end; the
   nearest such joint wins, one plate per joint;
3. the bolts are projected into the joint's elevation (``engine.layout``: x from the support face —
   taken as the plate's edge nearest the support — along the beam; y up from the plate's top edge)
   and read as a grid: rows, lines, pitch, gauge, edge distances on the plate and on the beam, and
   the distance ``a`` from the support face to the first bolt line.

Anything that cannot be read (no bolts, a bolt pattern that is not a regular grid, no bolt diameter or
grade) makes the connection ``incomplete`` naming what is missing. Plate grade from the plate's
material (else the configured default, with a warning); weld from the plate's properties where the
model gives a leg and an electrode — a weld fastener (IfcFastener of type WELD) in the plate's
assembly, or ``WeldLeg``/``WeldElectrode``-like properties on the plate — else the configured default
(with a warning saying so).

Lengths in mm. An aid to a competent engineer: results must be checked; local codes and licensed
practice take precedence.
"""

from __future__ import annotations

import math
import re
from collections import defaultdict
from typing import Callable, Mapping, Sequence

import numpy as np

from engine.evaluate import ConnectionChoice
from engine.model import BoltSpec, ConnectionPart, DataWarning, FinPlate, Joint, Member, Steel, Weld

__all__ = ["recover_fin_plates", "bolt_grade_from_label", "bolt_size_label", "read_grid"]

_GRADE = re.compile(r"(?<![\d.])(4\.6|5\.6|8\.8|10\.9|12\.9)(?![\d])|\b(A325|A490|F3125|F1852|F2280)\b", re.I)
_INCH_SIZES = {0.5: "1/2", 0.625: "5/8", 0.75: "3/4", 0.875: "7/8", 1.0: "1", 1.125: "1-1/8", 1.25: "1-1/4"}
_ON_PLATE_TOL = 5.0  # mm, common practice: bolt centres lie within this of the plate outline
_GRID_TOL = 1.0  # mm: bolt coordinates closer than this are one row / one line


def bolt_grade_from_label(*labels: str) -> str | None:
    """The bolt grade named in any of ``labels`` ("8.8", "10.9", "A325", ...), or ``None``."""
    for label in labels:
        m = _GRADE.search(label or "")
        if m:
            return (m.group(1) or m.group(2)).upper()
    return None


def bolt_size_label(diameter_mm: float) -> str:
    """The trade's size label for a nominal diameter: whole millimetres → ``"M20"``; an inch size
    (within 0.05 mm) → ``"3/4"``."""
    inches = diameter_mm / 25.4
    for v, label in _INCH_SIZES.items():
        if abs(inches - v) * 25.4 < 0.05:
            return label
    return f"M{diameter_mm:g}"


def read_grid(values: np.ndarray) -> tuple[np.ndarray, float | None]:
    """Distinct levels of ``values`` (sorted, merged within 1 mm) and their spacing if regular
    (``None`` if the spacing varies by more than 1 mm; 0 for a single level)."""
    v = np.sort(np.asarray(values, dtype=float))
    levels = [v[0]]
    for x in v[1:]:
        if x - levels[-1] > _GRID_TOL:
            levels.append(x)
    lv = np.array(levels)
    if len(lv) == 1:
        return lv, 0.0
    d = np.diff(lv)
    return lv, float(d.mean()) if d.max() - d.min() <= _GRID_TOL else None


def _centre(p: ConnectionPart) -> np.ndarray | None:
    d = p.dims
    if all(k in d for k in ("centre_x", "centre_y", "centre_z")):
        return np.array([d["centre_x"], d["centre_y"], d["centre_z"]], dtype=float)
    return None


def _weld_from(plate: ConnectionPart, fasteners: Sequence[ConnectionPart] = ()) -> Weld | None:
    """The weld from a modelled weld fastener of the plate's assembly (an IfcFastener of predefined
    type WELD), else from the plate's own properties; ``None`` when neither gives leg and electrode."""
    for f in fasteners:
        if f.predefined_type.upper() == "WELD":
            w = _weld_from(f)
            if w is not None:
                return w
    props = getattr(plate, "properties", None) or {}
    leg = elec = None
    for k, v in props.items():
        key = k.split(".")[-1].lower()
        weldish = "weld" in key or plate.predefined_type.upper() == "WELD"
        if weldish and ("leg" in key or "size" in key) and isinstance(v, (int, float)):
            leg = float(v)
        elif weldish and ("electrode" in key or "consumable" in key) and isinstance(v, str):
            elec = v
    if leg is not None and elec:
        return Weld(leg, elec, True)
    return None


class _Frame:
    """The elevation frame of a beam end: u along the beam away from the support, v up (web), w
    normal to the web; origin at the beam's centroid end point."""

    def __init__(self, beam: Member, end: str) -> None:
        p0, p1 = np.array(beam.start, float), np.array(beam.end, float)
        a = (p1 - p0) / max(np.linalg.norm(p1 - p0), 1e-9)
        self.u = a if end == "start" else -a
        wd = np.array(beam.web_dir if beam.web_dir is not None else (0.0, 0.0, 1.0), float)
        v = wd - wd.dot(a) * a
        if np.linalg.norm(v) < 1e-6:
            v = np.array([0.0, 0.0, 1.0]) - a[2] * a
        self.v = v / max(np.linalg.norm(v), 1e-9)
        if self.v[2] < 0:
            self.v = -self.v
        self.w = np.cross(self.u, self.v)
        off = beam.axis_offset or (0.0, 0.0)
        # centroid line = axis less the offset, given in section local (x, y) with x = y × a
        shift = off[0] * np.cross(self.v, a) + off[1] * self.v
        self.origin = (p0 if end == "start" else p1) - shift

    def uvw(self, p: np.ndarray) -> np.ndarray:
        d = np.atleast_2d(p) - self.origin
        return np.column_stack([d @ self.u, d @ self.v, d @ self.w])


def _joint_end_points(joints: Sequence[Joint], members: Mapping[str, Member]) -> dict[str, _Frame]:
    return {j.id: _Frame(members[j.beam], j.end) for j in joints}


def recover_fin_plates(
    parts: Sequence[ConnectionPart],
    joints: Sequence[Joint],
    members: Mapping[str, Member],
    *,
    steel_lookup: Callable[[str], Steel | None],
    default_weld: Weld,
    default_plate_grade: str,
    reach_mm: float = 300.0,
) -> tuple[dict[str, ConnectionChoice], list[DataWarning]]:
    """Modelled fin plates by joint id, and the warnings of the recovery (see the module docstring).

    ``reach_mm`` bounds how far (mm) a plate's centre may lie from the beam end beyond its own
    half-width (# common practice: fin plates are a few hundred mm wide at most).
    """
    warnings: list[DataWarning] = []
    plates = [p for p in parts if p.kind == "plate" and _centre(p) is not None]
    bolts = [p for p in parts if p.kind == "bolt" and _centre(p) is not None]
    if not plates or not joints:
        return {}, warnings
    bolts_by_asm: dict[str, list[ConnectionPart]] = defaultdict(list)
    for b in bolts:
        if b.assembly:
            bolts_by_asm[b.assembly].append(b)
    fasteners_by_asm: dict[str, list[ConnectionPart]] = defaultdict(list)
    for f in parts:
        if f.kind == "fastener" and f.assembly:
            fasteners_by_asm[f.assembly].append(f)
    free_bolts = [b for b in bolts if not b.assembly]
    free_centres = np.array([_centre(b) for b in free_bolts]) if free_bolts else np.zeros((0, 3))

    frames = _joint_end_points(joints, members)
    # grid hash of joint end points (cell = reach), so each plate looks only at nearby joints
    cell = max(reach_mm, 100.0) * 2.0
    grid: dict[tuple[int, int, int], list[Joint]] = defaultdict(list)
    for j in joints:
        key = tuple(int(math.floor(c / cell)) for c in frames[j.id].origin)
        grid[key].append(j)  # type: ignore[index]

    claims: dict[str, tuple[float, ConnectionPart]] = {}
    for p in plates:
        c = _centre(p)
        width = float(p.dims.get("width", 0.0))
        t = float(p.dims.get("thickness", 0.0))
        normal = np.array([p.dims.get("normal_x", 0.0), p.dims.get("normal_y", 0.0), p.dims.get("normal_z", 0.0)])
        key0 = tuple(int(math.floor(v / cell)) for v in c)
        best: tuple[float, Joint] | None = None
        for dx in (-1, 0, 1):
            for dy in (-1, 0, 1):
                for dz in (-1, 0, 1):
                    for j in grid.get((key0[0] + dx, key0[1] + dy, key0[2] + dz), ()):
                        f = frames[j.id]
                        beam = members[j.beam]
                        u, v, w = f.uvw(c)[0]
                        tw = beam.section.web_thickness or 0.0
                        square = abs(float(normal @ f.u)) < 0.1 and abs(float(normal @ f.v)) < 0.1
                        in_web_plane = abs(w) <= tw / 2.0 + t + _ON_PLATE_TOL
                        near_end = -width / 2.0 - reach_mm <= u <= width / 2.0 + reach_mm
                        within_depth = abs(v) <= (beam.section.depth or 1e9) / 2.0 + _ON_PLATE_TOL
                        if square and in_web_plane and near_end and within_depth:
                            score = abs(u) + abs(w)
                            if best is None or score < best[0]:
                                best = (score, j)
        if best is None:
            warnings.append(DataWarning("plate is not at the end of any beam checked for shear; not used", p.global_id, "connections"))
            continue
        prev = claims.get(best[1].id)
        if prev is not None:
            warnings.append(DataWarning(f"two plates at one beam end ({prev[1].global_id} and {p.global_id}); "
                                        f"the nearer is used", best[1].beam, "connections"))
            if prev[0] <= best[0]:
                continue
        claims[best[1].id] = (best[0], p)

    by_id = {j.id: j for j in joints}
    out: dict[str, ConnectionChoice] = {}
    for jid, (_, p) in sorted(claims.items()):
        j = by_id[jid]
        if p.assembly:
            its_bolts = bolts_by_asm.get(p.assembly, [])
        else:
            its_bolts = _bolts_on_plate(p, free_bolts, free_centres)
        out[jid] = _recover_one(p, its_bolts, frames[jid], members[j.beam], j, steel_lookup, default_weld,
                                default_plate_grade, warnings, fasteners_by_asm.get(p.assembly or "", []))
    return out, warnings


def _bolts_on_plate(p: ConnectionPart, bolts: list[ConnectionPart], centres: np.ndarray) -> list[ConnectionPart]:
    if not bolts:
        return []
    c = _centre(p)
    n = np.array([p.dims.get("normal_x", 0.0), p.dims.get("normal_y", 0.0), p.dims.get("normal_z", 0.0)])
    d = centres - c
    off_plane = np.abs(d @ n)
    in_plane = np.linalg.norm(d - np.outer(d @ n, n), axis=1)
    half_diag = math.hypot(p.dims.get("width", 0.0), p.dims.get("depth", 0.0)) / 2.0
    near = (in_plane <= half_diag + _ON_PLATE_TOL) & (off_plane <= 200.0)
    return [b for b, ok in zip(bolts, near) if ok]


def _recover_one(p: ConnectionPart, bolts: list[ConnectionPart], f: _Frame, beam: Member, j: Joint,
                 steel_lookup: Callable[[str], Steel | None], default_weld: Weld, default_plate_grade: str,
                 warnings: list[DataWarning], fasteners: Sequence[ConnectionPart] = ()) -> ConnectionChoice:
    missing: list[str] = []
    width = float(p.dims.get("width", 0.0))
    depth = float(p.dims.get("depth", 0.0))
    t = float(p.dims.get("thickness", 0.0))
    if not (width > 0 and depth > 0 and t > 0):
        missing.append(f"plate {p.global_id} dimensions (width, depth, thickness)")
    if not bolts:
        missing.append(f"bolts of plate {p.global_id}")
        return ConnectionChoice(None, "modelled", tuple(missing), note=f"plate {p.global_id} has no bolts")
    uc, vc, _ = f.uvw(_centre(p))[0]
    x_face = uc - width / 2.0          # plate edge nearest the support = support face
    y_top = vc + depth / 2.0           # plate top edge
    centres = np.array([_centre(b) for b in bolts])
    uvw = f.uvw(centres)
    x = uvw[:, 0] - x_face
    y = uvw[:, 1] - y_top
    lines_x, gauge = read_grid(x)
    rows_y, pitch = read_grid(-y)
    n = len(bolts)
    if gauge is None or pitch is None or len(lines_x) * len(rows_y) != n:
        missing.append(f"a regular bolt grid ({n} bolts in {len(rows_y)} rows x {len(lines_x)} lines)")
    diam = [b.nominal_diameter or b.dims.get("diameter") for b in bolts]
    if any(d is None for d in diam):
        missing.append("bolt diameter")
    grade = bolt_grade_from_label(*(b.material for b in bolts), *(b.name for b in bolts), *(b.predefined_type for b in bolts))
    if grade is None:
        missing.append("bolt grade (material or name such as '8.8' or 'A325')")
    if missing:
        return ConnectionChoice(None, "modelled", tuple(missing), note=f"modelled plate {p.global_id}")
    d = float(np.median(diam))
    steel = steel_lookup(p.material) if p.material else None
    if steel is None:
        steel = steel_lookup(default_plate_grade)
        warnings.append(DataWarning(f"plate {p.global_id} grade {p.material or '(none)'} not known; "
                                    f"assumed {default_plate_grade}", beam.global_id, "connections"))
        if steel is None:
            return ConnectionChoice(None, "modelled", ("plate steel grade",), note=f"modelled plate {p.global_id}")
    weld = _weld_from(p, fasteners)
    if weld is None:
        weld = default_weld
        warnings.append(DataWarning(f"weld of plate {p.global_id} not in the model; assumed {weld.leg:g} mm "
                                    f"{weld.electrode} both sides", beam.global_id, "connections"))
    top_edge = float(rows_y[0])
    bottom_edge = float(depth - rows_y[-1])
    if abs(top_edge - bottom_edge) > _GRID_TOL:
        warnings.append(DataWarning(f"plate {p.global_id} end distances differ (top {top_edge:.0f}, bottom "
                                    f"{bottom_edge:.0f} mm); the smaller is checked", beam.global_id, "connections"))
    beam_end_x = -x_face  # the beam's end point is at u = 0 in the frame
    # top of the beam (or of a top cope) above the top bolt, measured vertically in the web plane
    beam_top_v = (beam.section.depth or 0.0) / 2.0
    cope_top = next((c.depth for c in j.geometry.copes if c.where == "top"), 0.0)
    top_bolt_v = y_top - top_edge
    beam_top_edge = beam_top_v - cope_top - top_bolt_v
    plate = FinPlate(
        thickness=round(t, 3), depth=round(depth, 3), width=round(width, 3), steel=steel,
        bolts=BoltSpec(size=bolt_size_label(d), diameter=round(d, 3), grade=grade),
        rows=len(rows_y), lines=len(lines_x), pitch=round(float(pitch), 3), gauge=round(float(gauge), 3),
        plate_end_edge=round(min(top_edge, bottom_edge), 3),
        plate_side_edge=round(float(width - lines_x[-1]), 3),
        beam_end_edge=round(float(lines_x[0] - beam_end_x), 3),
        beam_top_edge=round(float(beam_top_edge), 3),
        a=round(float(lines_x[0]), 3),
        weld=weld,
        source="modelled",
    )
    return ConnectionChoice(plate, "modelled", (), note=f"modelled plate {p.global_id}" + (f" in assembly {p.assembly}" if p.assembly else ""))
