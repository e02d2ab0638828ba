"""Drawings for the issue list: the connection elevation and the storey plan, as SVG.

The drawings are built as a short list of primitives (plain tuples) and then serialised — to SVG here
and to PNG in :mod:`engine.raster` — so the report and the BCF snapshot show the same picture.

Elevation coordinates are those of :mod:`rules.geometry` (mm): ``x`` from the support face along the
beam, ``y`` up, ``y = 0`` at the top of the plate. Plan coordinates are world x, y in mm.

An aid to a competent engineer: drawings are schematic; results must be checked; local codes and
licensed practice take precedence.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import Sequence
from xml.sax.saxutils import escape

import numpy as np

from engine.model import FinPlate, Section

__all__ = ["Prim", "elevation_prims", "plan_prims", "to_svg", "HINGE_LABEL"]

HINGE_LABEL = {"bolt-line": "hinge at bolt line", "support-face": "hinge at support face"}


@dataclass(frozen=True)
class Prim:
    """One drawing primitive. ``kind``: ``rect`` (x, y, w, h), ``circle`` (cx, cy, r), ``line``
    (x1, y1, x2, y2), ``arrow`` (x1, y1, x2, y2), ``poly`` (x1, y1, x2, y2, ...), ``text`` (x, y)
    with ``label``. ``role`` picks the style: support, beam, plate, bolt, force, hinge, note, member,
    column, mark, cope."""

    kind: str
    coords: tuple[float, ...]
    role: str
    label: str = ""


_STYLE = {
    "support": ("#d9d9d9", "#555555", 1.5),
    "beam": ("#f4f1ea", "#333333", 1.2),
    "cope": ("#ffffff", "#333333", 1.0),
    "plate": ("#c9d7e8", "#1f3b5a", 1.5),
    "bolt": ("#ffffff", "#111111", 1.2),
    "force": ("none", "#b3261e", 1.6),
    "hinge": ("#ffffff", "#7a4f00", 1.8),
    "note": ("#222222", "none", 0.0),
    "member": ("none", "#777777", 1.0),
    "column": ("#777777", "#444444", 1.0),
    "mark": ("none", "#b3261e", 2.5),
}


def elevation_prims(
    plate: FinPlate | None,
    beam: Section,
    *,
    bolt_xy: np.ndarray | None = None,
    bolt_forces: np.ndarray | None = None,
    hinge: str | None = None,
    cope: tuple[str, float, float] | None = None,
    gap: float = 10.0,
) -> list[Prim]:
    """Primitives of the connection elevation (mm). ``bolt_forces`` (n, 2) in N are drawn as arrows
    scaled so the largest is 60 mm long; ``cope`` is ``(where, depth, length)``."""
    depth = beam.depth or 300.0
    tf = beam.flange_thickness or max(depth / 30.0, 8.0)
    prims: list[Prim] = []
    if plate is not None:
        x_end = plate.a - plate.beam_end_edge
        y_top = -plate.plate_end_edge + plate.beam_top_edge
        x_far = max(plate.width, plate.a + (plate.lines - 1) * plate.gauge) + 180.0
    else:
        x_end = gap
        y_top = 40.0
        x_far = 380.0
    y_bot = y_top - depth
    # support (hatched block left of the face)
    prims.append(Prim("rect", (-40.0, y_bot - 60.0, 40.0, depth + 120.0), "support"))
    # beam web / flanges outline, with a cope where there is one
    if cope and cope[0] == "top":
        cd, cl = cope[1], cope[2]
        outline = (x_end, y_top - cd, x_end + cl, y_top - cd, x_end + cl, y_top, x_far, y_top, x_far, y_bot, x_end, y_bot)
    elif cope and cope[0] == "bottom":
        cd, cl = cope[1], cope[2]
        outline = (x_end, y_top, x_far, y_top, x_far, y_bot, x_end + cl, y_bot, x_end + cl, y_bot + cd, x_end, y_bot + cd)
    else:
        outline = (x_end, y_top, x_far, y_top, x_far, y_bot, x_end, y_bot)
    prims.append(Prim("poly", outline, "beam"))
    top_flange_x0 = x_end + (cope[2] if cope and cope[0] == "top" else 0.0)
    bot_flange_x0 = x_end + (cope[2] if cope and cope[0] == "bottom" else 0.0)
    prims.append(Prim("line", (top_flange_x0, y_top - tf, x_far, y_top - tf), "beam"))
    prims.append(Prim("line", (bot_flange_x0, y_bot + tf, x_far, y_bot + tf), "beam"))
    if plate is None:
        prims.append(Prim("text", (20.0, y_top - depth / 2.0), "note", "no connection modelled or scheduled"))
        return prims
    prims.append(Prim("rect", (0.0, -plate.depth, plate.width, plate.depth), "plate"))
    xy = bolt_xy if bolt_xy is not None else np.zeros((0, 2))
    r = (plate.bolts.hole_diameter or plate.bolts.diameter + 2.0) / 2.0
    for x, y in xy:
        prims.append(Prim("circle", (float(x), float(y), r), "bolt"))
    y_text = y_bot - 30.0
    if hinge:
        # the hinge as a dashed line across the beam at the support face or the bolt-group centroid
        hx = 0.0 if hinge == "support-face" else plate.a + (plate.lines - 1) * plate.gauge / 2.0
        prims.append(Prim("line", (hx, y_top + 20.0, hx, y_bot - 10.0), "hinge"))
        prims.append(Prim("text", (hx + 6.0, y_top + 26.0), "note", HINGE_LABEL.get(hinge, hinge)))
    if bolt_forces is not None and len(bolt_forces):
        fmax = float(np.max(np.hypot(bolt_forces[:, 0], bolt_forces[:, 1]))) or 1.0
        s = 0.8 * min(plate.pitch if plate.rows > 1 else 60.0, 60.0) / fmax  # the largest arrow spans 0.8 pitch
        for (x, y), (fx, fy) in zip(xy, bolt_forces):
            prims.append(Prim("arrow", (float(x), float(y), float(x + fx * s), float(y + fy * s)), "force"))
    prims.append(Prim("text", (0.0, y_text), "note",
                      f"plate {plate.thickness:g} x {plate.depth:g} x {plate.width:g}, {plate.n_bolts} x {plate.bolts.size} {plate.bolts.grade}"))
    if bolt_forces is not None and len(bolt_forces):
        prims.append(Prim("text", (0.0, y_text - 28.0), "note",
                          f"arrows: force on the plate from each bolt; largest {fmax / 1e3:.1f} kN"))
    return prims


def plan_prims(
    beams: Sequence[tuple[float, float, float, float]],
    columns: Sequence[tuple[float, float]],
    mark: tuple[float, float],
) -> list[Prim]:
    """Primitives of a storey plan (world mm): beam axes, columns, and a ring marking the joint."""
    prims = [Prim("line", tuple(map(float, b)), "member") for b in beams]
    span = _extent([(b[0], b[1]) for b in beams] + [(b[2], b[3]) for b in beams] + list(columns) + [mark])
    size = max(span[2] - span[0], span[3] - span[1], 1000.0)
    c = size / 80.0
    prims += [Prim("rect", (x - c, y - c, 2 * c, 2 * c), "column") for x, y in columns]
    prims.append(Prim("circle", (float(mark[0]), float(mark[1]), size / 30.0), "mark"))
    return prims


def _extent(points: Sequence[tuple[float, float]]) -> tuple[float, float, float, float]:
    if not points:
        return (0.0, 0.0, 1.0, 1.0)
    xs = [p[0] for p in points]
    ys = [p[1] for p in points]
    return (min(xs), min(ys), max(xs), max(ys))


def _bounds(prims: Sequence[Prim]) -> tuple[float, float, float, float]:
    pts: list[tuple[float, float]] = []
    for p in prims:
        c = p.coords
        if p.kind == "rect":
            pts += [(c[0], c[1]), (c[0] + c[2], c[1] + c[3])]
        elif p.kind == "circle":
            pts += [(c[0] - c[2], c[1] - c[2]), (c[0] + c[2], c[1] + c[2])]
        elif p.kind == "text":
            pts += [(c[0], c[1]), (c[0] + 6.0 * len(p.label), c[1])]
        else:
            pts += list(zip(c[0::2], c[1::2]))
    return _extent(pts)


def to_svg(prims: Sequence[Prim], *, width_px: int = 420, title: str = "", text_mm: float | None = None, uid: str = "d") -> str:
    """Serialise primitives to a self-contained SVG element (y flipped so up is up)."""
    x0, y0, x1, y1 = _bounds(prims)
    pad = 0.06 * max(x1 - x0, y1 - y0, 1.0)
    x0, y0, x1, y1 = x0 - pad, y0 - pad, x1 + pad, y1 + pad
    w, h = x1 - x0, y1 - y0
    height_px = max(int(width_px * h / w), 80)
    unit = w / width_px  # mm per pixel
    fs = text_mm or 11.0 * unit
    out = [f'<svg xmlns="http://www.w3.org/2000/svg" viewBox="{x0:.1f} {-y1:.1f} {w:.1f} {h:.1f}" '
           f'width="{width_px}" height="{height_px}" role="img">']
    if title:
        out.append(f"<title>{escape(title)}</title>")
    out.append(f'<defs><marker id="ah-{uid}" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="6" markerHeight="6" '
               'orient="auto-start-reverse"><path d="M0,0 L10,5 L0,10 z" fill="#b3261e"/></marker></defs>')
    for p in prims:
        fill, stroke, sw = _STYLE[p.role]
        sw_u = sw * unit
        c = p.coords
        common = f'fill="{fill}" stroke="{stroke}" stroke-width="{sw_u:.2f}"'
        if p.kind == "rect":
            out.append(f'<rect x="{c[0]:.1f}" y="{-(c[1] + c[3]):.1f}" width="{c[2]:.1f}" height="{c[3]:.1f}" {common}/>')
        elif p.kind == "circle":
            out.append(f'<circle cx="{c[0]:.1f}" cy="{-c[1]:.1f}" r="{c[2]:.1f}" {common}/>')
        elif p.kind == "line":
            dash = f' stroke-dasharray="{6 * unit:.1f} {4 * unit:.1f}"' if p.role == "hinge" else ""
            out.append(f'<line x1="{c[0]:.1f}" y1="{-c[1]:.1f}" x2="{c[2]:.1f}" y2="{-c[3]:.1f}" stroke="{stroke}" stroke-width="{sw_u:.2f}"{dash}/>')
        elif p.kind == "arrow":
            if math.hypot(c[2] - c[0], c[3] - c[1]) > 1e-9:
                out.append(f'<line x1="{c[0]:.1f}" y1="{-c[1]:.1f}" x2="{c[2]:.1f}" y2="{-c[3]:.1f}" stroke="{stroke}" '
                           f'stroke-width="{sw_u:.2f}" marker-end="url(#ah-{uid})"/>')
        elif p.kind == "poly":
            pts = " ".join(f"{x:.1f},{-y:.1f}" for x, y in zip(c[0::2], c[1::2]))
            out.append(f'<polygon points="{pts}" {common}/>')
        elif p.kind == "text":
            out.append(f'<text x="{c[0]:.1f}" y="{-c[1]:.1f}" font-size="{fs:.1f}" font-family="sans-serif" fill="{fill}">{escape(p.label)}</text>')
    out.append("</svg>")
    return "".join(out)
