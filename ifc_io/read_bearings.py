"""Walls, slabs and footings → :class:`engine.model.Bearing` (world axis-aligned boxes, mm).

The box comes from the body without tessellation: every extruded area solid's profile box swept
along its extrusion (through boolean clippings, whose first operand is taken, and mapped items),
else the vertices of breps and face sets, else the ``Box`` representation; then the object
placement. An element with none of these is skipped with a warning.
"""

from __future__ import annotations

import numpy as np

from ifc_io.read_relations import elements_once
from engine.model import Bearing
from ifc_io.read_axes import read_geometry, solid_corners
from ifc_io.read_geometry import MAX_COORDINATE_MM, apply, text_value

__all__ = ["BEARING_CLASSES", "read_bearings", "world_box"]

BEARING_CLASSES: tuple[str, ...] = ("IfcWall", "IfcSlab", "IfcFooting")


def world_box(el, ctx) -> tuple[np.ndarray, np.ndarray] | None:
    """World (model units) min and max corner of an element's body, or ``None``."""
    geom = read_geometry(el, ctx.index, ctx.resolver)
    pts = []
    for s in geom.solids:
        bbox = ctx.bbox(s.profile)
        if bbox is not None:
            pts.extend(solid_corners(s, bbox))
    if not pts and geom.vertices is not None:
        pts.extend(geom.vertices)
    if not pts and geom.directrix is not None:
        pts.extend(geom.directrix)
    if not pts:
        return None
    world = np.asarray([apply(geom.m_obj, p) for p in pts], dtype=float)
    return world.min(axis=0), world.max(axis=0)


def read_bearings(ctx) -> list[Bearing]:
    out: list[Bearing] = []
    mm = ctx.mm
    for el in elements_once(ctx.index, BEARING_CLASSES):
        gid = text_value(el.GlobalId)
        if not gid.strip():
            ctx.warn(f"{el.is_a()} #{el.id()} has no GlobalId; not used as a bearing", None)
            continue
        try:
            box = world_box(el, ctx)
        except Exception as exc:  # one bad element never stops the read
            ctx.warn(f"{el.is_a()} body could not be read ({type(exc).__name__}: {exc}); "
                     f"not used as a bearing", gid)
            continue
        if box is None:
            ctx.warn(f"{el.is_a()} has no swept solid, brep or box to bound it; not used as a bearing", gid)
            continue
        lo, hi = box
        if not (np.all(np.isfinite(lo)) and np.all(np.isfinite(hi))
                and max(np.abs(lo).max(), np.abs(hi).max()) * mm <= MAX_COORDINATE_MM):
            ctx.warn(f"{el.is_a()}: its body is not finite or lies beyond {MAX_COORDINATE_MM:g} mm from "
                     f"the origin (corrupt placement or geometry); not used as a bearing", gid)
            continue
        out.append(Bearing(
            global_id=gid,
            ifc_class=el.is_a(),
            name=text_value(el.Name),
            bbox_min=tuple(float(x) * mm for x in lo),
            bbox_max=tuple(float(x) * mm for x in hi),
            storey=ctx.index.storey_name(el),
        ))
    return out
