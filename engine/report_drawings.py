"""The drawings of the issue list and the BCF snapshots, from the audit's results.

For each failing or incomplete joint (a joint that needs design has no connection to draw: the issue
list gives it one table row): the connection elevation (plate, bolts, beam web and cope, elastic bolt forces
for the governing hinge position, the hinge marked) and the storey plan marking the joint. Plans are
drawn once per storey as an SVG ``<symbol>`` and reused by every issue on that storey, so a large
model's page stays small.

An aid to a competent engineer: drawings are schematic; results must be checked; local codes and
licensed practice take precedence.
"""

from __future__ import annotations

import re
from collections import defaultdict
from typing import Mapping, Sequence
from xml.sax.saxutils import escape

import numpy as np

from engine.boltgroup import elastic_bolt_forces
from engine.drawing import elevation_prims, plan_prims, to_svg
from engine.evaluate import ISSUE_STATUSES
from engine.layout import bolt_group_centroid_x, bolt_xy
from engine.model import JointResult, Member

__all__ = ["hinge_for", "bolt_forces_for", "elevation_for", "issue_drawings"]


def hinge_for(result: JointResult) -> str:
    """The hinge position the drawing shows: the one named by the governing check, else the one the
    support's stiffness gives."""
    gov = result.governing or ""
    if "support face" in gov:
        return "support-face"
    if "bolt line" in gov:
        return "bolt-line"
    return "bolt-line" if result.joint.stiffness == "stiff" else "support-face"


def bolt_forces_for(result: JointResult, hinge: str) -> np.ndarray | None:
    """Elastic bolt forces (n, 2) in N for the drawing: the end shear V downward acting at the hinge
    (at the support face: eccentric by the distance to the bolt-group centroid; at the bolt line:
    through the centroid)."""
    p, d = result.connection, result.demand
    if p is None or d is None:
        return None
    xy = bolt_xy(p)
    xc = bolt_group_centroid_x(p)
    moment = d.V * xc if hinge == "support-face" else 0.0  # V down at x = 0, left of the centroid: CCW
    return elastic_bolt_forces(xy, 0.0, -d.V, moment)


def elevation_for(result: JointResult, beam: Member):
    """Elevation primitives of one joint's connection."""
    hinge = hinge_for(result)
    copes = result.joint.geometry.copes
    cope = (copes[0].where, copes[0].depth, copes[0].length) if copes else None
    p = result.connection
    return elevation_prims(
        p, beam.section,
        bolt_xy=bolt_xy(p) if p is not None else None,
        bolt_forces=bolt_forces_for(result, hinge),
        hinge=hinge if p is not None else None,
        cope=cope,
        gap=result.joint.geometry.gap or 10.0,
    )


def _storey_key(storey: str) -> str:
    return "plan-" + (re.sub(r"[^A-Za-z0-9_-]", "_", storey) or "none")


def issue_drawings(
    results: Sequence[JointResult], members: Mapping[str, Member]
) -> tuple[dict[str, dict[str, str]], str]:
    """SVG drawings for every failing or incomplete joint: ``({joint id: {"elevation", "plan"}},
    symbols_html)`` where ``symbols_html`` is a hidden SVG holding one plan symbol per storey with
    such joints."""
    issues = [r for r in results if r.status in ISSUE_STATUSES and r.status != "needs-design"]
    storeys = sorted({members[r.joint.beam].storey for r in issues})
    by_storey: dict[str, list[Member]] = defaultdict(list)
    for m in members.values():
        by_storey[m.storey].append(m)
    symbols = []
    extents: dict[str, tuple[float, float, float, float]] = {}
    columns = [m for m in members.values() if m.role == "column"]
    for st in storeys:
        level = [m for m in by_storey[st] if m.role != "column"]
        beams = [(m.start[0], m.start[1], m.end[0], m.end[1]) for m in level]
        zs = sorted(max(m.start[2], m.end[2]) for m in level)
        z = zs[len(zs) // 2] if zs else 0.0
        # the columns that pass through (or stop at) this floor, wherever they are contained
        cols = [(m.start[0], m.start[1]) for m in columns
                if min(m.start[2], m.end[2]) - 1.0 <= z <= max(m.start[2], m.end[2]) + 1.0]
        prims = [p for p in plan_prims(beams, cols, (0.0, 0.0)) if p.role != "mark"]
        svg = to_svg(prims, width_px=420, uid=_storey_key(st))
        m = re.match(r'<svg [^>]*viewBox="([^"]+)"', svg)
        vb = m.group(1) if m else "0 0 1 1"
        x0, y0, w, h = (float(v) for v in vb.split())
        extents[st] = (x0, y0, w, h)
        inner = svg[svg.index(">") + 1: svg.rindex("</svg>")]
        symbols.append(f'<symbol id="{_storey_key(st)}" viewBox="{vb}">{inner}</symbol>')
    symbols_html = ('<svg xmlns="http://www.w3.org/2000/svg" style="display:none" aria-hidden="true">'
                    + "".join(symbols) + "</svg>") if symbols else ""
    out: dict[str, dict[str, str]] = {}
    for r in issues:
        beam = members[r.joint.beam]
        uid = re.sub(r"[^A-Za-z0-9_-]", "_", r.joint.id)
        elev = to_svg(elevation_for(r, beam), width_px=420, uid=uid,
                      title=f"Elevation of the connection at {beam.label} ({r.joint.end} end)")
        x0, y0, w, h = extents[beam.storey]
        mx, my = r.joint.geometry.location[0], r.joint.geometry.location[1]
        ring = max(w, h) / 30.0
        plan = (f'<svg xmlns="http://www.w3.org/2000/svg" viewBox="{x0:.1f} {y0:.1f} {w:.1f} {h:.1f}" width="420" '
                f'height="{max(int(420 * h / w), 80)}" role="img"><title>{escape("Plan of " + (beam.storey or "the storey"))}</title>'
                f'<use href="#{_storey_key(beam.storey)}" width="{w:.1f}" height="{h:.1f}" x="{x0:.1f}" y="{y0:.1f}"/>'
                f'<circle cx="{mx:.1f}" cy="{-my:.1f}" r="{ring:.1f}" fill="none" stroke="#b3261e" stroke-width="{ring / 4:.1f}"/>'
                "</svg>")
        out[r.joint.id] = {"elevation": elev, "plan": plan}
    return out, symbols_html
