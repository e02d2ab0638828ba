"""Modelled connection parts → :class:`engine.model.ConnectionPart` records, uninterpreted.

Classes read (each element once, by its most specific kind): IfcPlate (``plate``),
IfcMechanicalFastener (``bolt``; in IFC4 a sibling of IfcFastener, in IFC2X3 a subtype of it),
IfcFastener (``fastener``), IfcDiscreteAccessory (``accessory``), IfcElementAssembly
(``assembly``).

Per part: its object placement (origin and axes, world, mm); key dimensions (mm) in ``dims``:

* plates, fasteners, accessories — the box of the body (swept solid: profile box × depth; brep:
  the vertices' extents along the placement axes): ``thickness`` = the smallest extent, of the
  other two ``depth`` = the more vertical one and ``width`` the other; ``centre_x/y/z`` the world
  centre of that box and ``normal_x/y/z`` the thickness direction (unit);
* bolts — ``diameter`` and ``length`` (NominalDiameter / NominalLength of the occurrence or its
  type, else the body's circle profile and depth), ``centre_x/y/z`` and ``axis_x/y/z``;

``nominal_diameter``/``nominal_length`` as the model states them; ``material`` the first material
label; ``assembly`` the GlobalId of the IfcElementAssembly it is aggregated into; ``hosts`` the
GlobalIds of the elements it is related to (IfcRelConnectsElements and its realizing elements,
the host of an opening it fills, the element it is aggregated into, the members of its assembly).
"""

from __future__ import annotations

import math

from engine.model import ConnectionPart
from ifc_io.read_relations import elements_once
from ifc_io.read_axes import read_geometry, solid_corners
from ifc_io.read_geometry import IDENTITY, MAX_COORDINATE_MM, text_value, add, apply, apply_dir, column, mul, norm, scale, sub, unit
from ifc_io.read_materials import material_info

__all__ = ["PART_CLASSES", "MEMBER_CLASSES", "read_parts"]

PART_CLASSES: tuple[tuple[str, str], ...] = (
    ("IfcMechanicalFastener", "bolt"),
    ("IfcFastener", "fastener"),
    ("IfcPlate", "plate"),
    ("IfcDiscreteAccessory", "accessory"),
    ("IfcElementAssembly", "assembly"),
)
MEMBER_CLASSES: tuple[str, ...] = ("IfcBeam", "IfcColumn", "IfcMember")


def _vec(v) -> tuple[float, float, float]:
    return (float(v[0]), float(v[1]), float(v[2]))


def _is_member(el) -> bool:
    return any(el.is_a(c) for c in MEMBER_CLASSES)


def _box_dims(edges: list, centre_world, mm: float) -> dict[str, float]:
    """thickness / width / depth from three world edge vectors (model units)."""
    lengths = [norm(e) for e in edges]
    order = sorted(range(3), key=lambda i: lengths[i])
    t = order[0]
    a, b = order[1], order[2]
    za = abs(float(unit(edges[a])[2])) if lengths[a] > 0 else 0.0
    zb = abs(float(unit(edges[b])[2])) if lengths[b] > 0 else 0.0
    depth_i, width_i = (a, b) if za > zb else (b, a)
    normal = unit(edges[t]) if lengths[t] > 0 else (0.0, 0.0, 0.0)
    return {
        "thickness": lengths[t] * mm,
        "width": lengths[width_i] * mm,
        "depth": lengths[depth_i] * mm,
        "centre_x": float(centre_world[0]) * mm,
        "centre_y": float(centre_world[1]) * mm,
        "centre_z": float(centre_world[2]) * mm,
        "normal_x": float(normal[0]),
        "normal_y": float(normal[1]),
        "normal_z": float(normal[2]),
    }


def _body_dims(geom, ctx) -> dict[str, float]:
    m = geom.m_obj
    if geom.solid is not None:
        s = geom.solid
        bbox = ctx.bbox(s.profile)
        if bbox is None:
            return {}
        ms = mul(m, s.m)  # the profile box is in the solid's xy plane (Position applied)
        ex = apply_dir(ms, (bbox[2] - bbox[0], 0.0, 0.0))
        ey = apply_dir(ms, (0.0, bbox[3] - bbox[1], 0.0))
        ez = scale(apply_dir(mul(m, s.m), s.direction), s.depth)
        corners = solid_corners(s, bbox)
        centre = apply(m, corners.mean(axis=0))
        return _box_dims([ex, ey, ez], centre, ctx.mm)
    if geom.vertices is not None and len(geom.vertices):
        v = geom.vertices
        lo, hi = v.min(axis=0), v.max(axis=0)
        edges = [apply_dir(m, tuple(float(hi[i] - lo[i]) if j == i else 0.0 for j in range(3))) for i in range(3)]
        mid = tuple(float(x) for x in (lo + hi) / 2)
        return _box_dims(edges, apply(m, mid), ctx.mm)
    return {}


def _bolt_dims(part, geom, ctx) -> tuple[dict[str, float], float | None, float | None]:
    mm = ctx.mm
    nd = getattr(part, "NominalDiameter", None)
    nl = getattr(part, "NominalLength", None)
    t = ctx.index.element_type(part)
    if nd is None and t is not None:
        nd = getattr(t, "NominalDiameter", None)
    if nl is None and t is not None:
        nl = getattr(t, "NominalLength", None)
    nd = float(nd) * mm if nd is not None else None
    nl = float(nl) * mm if nl is not None else None
    dims: dict[str, float] = {}
    m = geom.m_obj
    if geom.solid is not None:
        s = geom.solid
        prof = s.profile
        r = getattr(prof, "Radius", None)
        ms = mul(m, s.m)
        axis = unit(apply_dir(ms, s.direction))
        length = norm(apply_dir(ms, s.direction)) * s.depth
        start = apply(ms, (0.0, 0.0, 0.0))
        centre = add(start, scale(axis, length / 2))
        if r is not None:
            dims["diameter"] = 2 * float(r) * mm
        dims["length"] = length * mm
        dims.update(centre_x=float(centre[0]) * mm, centre_y=float(centre[1]) * mm,
                    centre_z=float(centre[2]) * mm, axis_x=float(axis[0]), axis_y=float(axis[1]),
                    axis_z=float(axis[2]))
    elif geom.directrix is not None:
        p0, p1 = (apply(m, p) for p in geom.directrix)
        axis = unit(sub(p1, p0))
        centre = scale(add(p0, p1), 0.5)
        dims["length"] = norm(sub(p1, p0)) * mm
        dims.update(centre_x=float(centre[0]) * mm, centre_y=float(centre[1]) * mm,
                    centre_z=float(centre[2]) * mm, axis_x=float(axis[0]), axis_y=float(axis[1]),
                    axis_z=float(axis[2]))
    if nd is not None:
        dims["diameter"] = nd
    if nl is not None:
        dims["length"] = nl
    return dims, nd, nl


_LENGTH_MEASURES = ("IfcLengthMeasure", "IfcPositiveLengthMeasure", "IfcNonNegativeLengthMeasure")


def _part_properties(el, mm: float) -> dict[str, object]:
    """Single-value properties of ``el`` as ``{"Pset.Property": value}``, length measures in mm."""
    out: dict[str, object] = {}
    for rel in getattr(el, "IsDefinedBy", None) or ():
        if not rel.is_a("IfcRelDefinesByProperties"):
            continue
        pset = rel.RelatingPropertyDefinition
        if not pset.is_a("IfcPropertySet"):
            continue
        for prop in pset.HasProperties or ():
            if not prop.is_a("IfcPropertySingleValue") or prop.NominalValue is None:
                continue
            v = prop.NominalValue
            value = getattr(v, "wrappedValue", None)
            if not isinstance(value, (str, int, float, bool)):
                continue
            if v.is_a() in _LENGTH_MEASURES and isinstance(value, (int, float)):
                value = float(value) * mm
            out[f"{text_value(pset.Name)}.{text_value(prop.Name)}"] = value
    return out


def _predefined(el, index) -> str:
    p = getattr(el, "PredefinedType", None)
    if p in (None, "NOTDEFINED"):
        t = index.element_type(el)
        tp = getattr(t, "PredefinedType", None) if t is not None else None
        if tp not in (None, "NOTDEFINED"):
            p = tp
    if p == "USERDEFINED" and getattr(el, "ObjectType", None):
        return str(el.ObjectType)
    return str(p) if p else ""


def read_parts(ctx) -> list[ConnectionPart]:
    """Every connection part of the model (warnings go to ``ctx``)."""
    parts: list[ConnectionPart] = []
    for el in elements_once(ctx.index, [c for c, _ in PART_CLASSES]):
        kind = next(k for c, k in PART_CLASSES if el.is_a(c))
        try:
            part = _read_part(el, kind, ctx)
        except Exception as exc:  # one bad part never stops the read
            ctx.warn(f"{el.is_a()} could not be read ({type(exc).__name__}: {exc}); skipped",
                     getattr(el, "GlobalId", None))
            continue
        if not _plausible(part):
            ctx.warn(f"{el.is_a()}: its placement or size is not finite or lies beyond "
                     f"{MAX_COORDINATE_MM:g} mm (corrupt placement or geometry); skipped", part.global_id)
            continue
        parts.append(part)
    return parts


def _plausible(part: ConnectionPart) -> bool:
    """Are the part's placement and sizes finite numbers of a size a building can hold?"""
    values = [*part.origin, *part.x_dir, *part.y_dir, *part.z_dir, *part.dims.values()]
    values += [v for v in (part.nominal_diameter, part.nominal_length) if v is not None]
    try:
        return all(math.isfinite(float(v)) and abs(float(v)) <= MAX_COORDINATE_MM for v in values)
    except (TypeError, ValueError):
        return False


def _read_part(el, kind: str, ctx) -> ConnectionPart:
    index, mm = ctx.index, ctx.mm
    gid = text_value(el.GlobalId)
    if not gid.strip():
        raise ValueError("it has no GlobalId")
    try:
        m = ctx.resolver.matrix(el.ObjectPlacement)
    except ValueError as exc:
        ctx.warn(f"{el.is_a()} placement not resolved ({exc}); placed at the origin", gid)
        m = IDENTITY
    dims: dict[str, float] = {}
    nd = nl = None
    geom = None
    if kind != "assembly":
        try:
            geom = read_geometry(el, index, ctx.resolver)
        except ValueError:  # the placement again (warned above): the body is not located
            geom = None
    if geom is not None:
        if kind == "bolt":
            dims, nd, nl = _bolt_dims(el, geom, ctx)
        else:
            dims = _body_dims(geom, ctx)
    info = material_info(el, index)
    assembly = index.assembly_of(el)
    hosts: list[str] = []

    def add(host):
        hid = text_value(getattr(host, "GlobalId", None))
        if hid and hid != gid and hid not in hosts:
            hosts.append(hid)

    for h in index.hosts(el):
        add(h)
    group = el if kind == "assembly" else assembly
    if group is not None:
        for child in index.children.get(group.id(), ()):
            if _is_member(child):
                add(child)
    if kind == "assembly" and assembly is None:
        assembly = None
    return ConnectionPart(
        global_id=gid,
        ifc_class=el.is_a(),
        kind=kind,
        name=text_value(el.Name),
        tag=text_value(getattr(el, "Tag", None)),
        predefined_type=_predefined(el, index),
        origin=_vec(scale(column(m, 3), mm)),
        x_dir=_vec(unit(column(m, 0))),
        y_dir=_vec(unit(column(m, 1))),
        z_dir=_vec(unit(column(m, 2))),
        dims=dims,
        nominal_diameter=nd,
        nominal_length=nl,
        material=info.labels[0] if info.labels else "",
        assembly=(text_value(assembly.GlobalId) or None) if assembly is not None and assembly.id() != el.id() else None,
        hosts=tuple(hosts),
        storey=index.storey_name(el),
        properties=_part_properties(el, mm) if kind in ("plate", "fastener") else {},
    )
