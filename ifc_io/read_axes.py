"""A linear element's geometry without tessellation: its ``Axis`` curve, its body's swept solid,
and from them the world axis, the web direction and where the axis sits in the section.

What "axis" means (``Member.start``/``end``):

* ``axis_source="axis"`` — the end points of the element's ``Axis`` representation (a polyline,
  indexed poly curve, trimmed line or composite curve, also inside mapped items), through the
  object placement. This is the modelled reference line; ``axis_offset`` is where that line sits
  relative to the body's profile centre, measured from the body when there is one, else from the
  cardinal point of an IFC4 material profile set usage.
* ``axis_source="body"`` — no Axis curve: the swept solid's reference line. For an extruded area
  solid that is ``Position`` origin → origin + ExtrudedDirection × Depth, through any mapped items
  and the object placement. When an IFC4 material profile set usage gives a cardinal point, the
  line is moved from the profile centre to that cardinal point (IFC places the profile so the
  member's reference line runs through it); otherwise the line through the solid's origin is
  reported as is (an offset profile position, e.g. a beam hung from its top, keeps the top
  line) and ``axis_offset`` records the profile's offset. Swept disk solids and other directrix
  sweeps give their directrix. As a last resort the principal direction of the body's vertices
  (faceted breps, face sets, bounding boxes — read, not tessellated) gives the line; only when
  none of these exists is the body tessellated by IfcOpenShell's geometry kernel.

``web_dir`` is the world direction of the section's local y axis (the profile's y axis, along the
web of an I section); for an arbitrary outline whose catalog section shows the web runs along the
outline's x extent (as some exporters draw channels), the two are swapped. A member with an Axis
curve but no swept solid takes it from its placement by the IFC conventions (axis along local z:
web along local y; axis along local x: web along local z); otherwise it is ``None``.

All values here are in the model's length unit; the reader scales to mm.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from ifc_io.read_geometry import (IDENTITY, Mat, PlacementResolver, add, apply, apply_dir, arg,
                                  arg_unchecked, curve_end_points, dot, norm, point, scale, sub, unit,
                                  mul)

__all__ = ["SolidInfo", "MemberGeometry", "AxisResult", "shape_representations", "read_geometry",
           "member_axis", "solid_frame", "solid_corners", "tessellated_axis"]

_BODY_IDS = ("body", "body-fallback", "", "facetation", "reference")
_BODY_RANK = {ident: i for i, ident in enumerate(_BODY_IDS)}
_SKIP_IDS = ("axis", "box", "footprint", "annotation", "profile", "surface", "clearance", "lighting",
             "cog", "finishsurface")

Vec = tuple  # (x, y, z)


@dataclass
class SolidInfo:
    """A swept area solid of the body: ``m`` its Position in object coordinates, ``direction``
    (solid coordinates, unit) and ``depth`` of the sweep, the ``profile`` and ``m_profile`` (the
    profile's own Position, and a derived profile's operator, in solid coordinates)."""

    m: Mat
    direction: Vec
    depth: float
    profile: object
    m_profile: Mat = IDENTITY

    @property
    def length(self) -> float:
        """Length of the sweep in object coordinates (depth × any mapping scale)."""
        return self.depth * norm(apply_dir(self.m, self.direction))


@dataclass
class MemberGeometry:
    """What the representations give, in object coordinates: ``axis`` end points, the longest
    ``solid`` (and all ``solids``), a sweep's ``directrix`` end points, body ``vertices``
    (fallback: brep, face set and box corners); ``m_obj`` the object placement."""

    m_obj: Mat
    axis: tuple[Vec, Vec] | None = None
    solid: SolidInfo | None = None
    directrix: tuple[Vec, Vec] | None = None
    vertices: np.ndarray | None = None
    has_body: bool = False
    solids: list = field(default_factory=list)


@dataclass
class AxisResult:
    """World axis (model units), web direction, axis offset in the section (model units)."""

    start: Vec
    end: Vec
    web_dir: Vec | None
    axis_offset: tuple[float, float] | None
    source: str
    note: str = ""
    si_units: bool = False  # True: coordinates in metres (tessellated by the kernel), not model units


def shape_representations(product, index, resolver: PlacementResolver) -> list[tuple[object, Mat]]:
    """``(IfcShapeRepresentation, matrix)`` pairs of a product: its own representations, else the
    representation maps of its type (each through its MappingOrigin)."""
    reps: list[tuple[object, Mat]] = []
    pds = arg(product, 6)  # IfcProduct.Representation
    if pds is not None:
        reps = [(r, IDENTITY) for r in arg_unchecked(pds, 2) or ()]  # .Representations
    if not reps and index is not None:
        t = index.element_type(product)
        for rm in getattr(t, "RepresentationMaps", None) or ():
            reps.append((rm.MappedRepresentation, resolver.a2p(rm.MappingOrigin)))
    return reps


def _ident(rep) -> str:
    return (arg(rep, 1) or "").strip().lower()  # IfcShapeRepresentation.RepresentationIdentifier


def _profile_matrix(profile, resolver: PlacementResolver) -> tuple[Mat, object]:
    """The profile's own placement (Position, a derived profile's operator) and the base profile,
    cached on the resolver per profile."""
    cache = resolver.profiles
    key = profile.id()
    hit = cache.get(key)
    if hit is not None:
        return hit
    m = IDENTITY
    base = profile
    for _ in range(4):
        if base.is_a("IfcDerivedProfileDef"):
            m = mul(m, resolver.op(base.Operator))
            base = base.ParentProfile
            continue
        break
    pos = getattr(base, "Position", None)
    if pos is not None:
        m = mul(m, resolver.a2p(pos))
    hit = (m, base)
    cache[key] = hit
    return hit


def _collect(item, m, resolver, solids, directrices, vertices, depth=0):
    if depth > 12:
        return
    if item.is_a() == "IfcExtrudedAreaSolid" or item.is_a("IfcExtrudedAreaSolid"):
        # (SweptArea, Position, ExtrudedDirection, Depth) in every schema
        get = arg_unchecked
        area, pos, direction, length = get(item, 0), get(item, 1), get(item, 2), get(item, 3)
        ms = mul(m, resolver.a2p(pos)) if pos is not None else m
        mp, _ = _profile_matrix(area, resolver)
        solids.append(SolidInfo(ms, unit(arg(direction, 0)), float(length), area, mp))
    elif item.is_a("IfcBooleanResult"):
        _collect(item.FirstOperand, m, resolver, solids, directrices, vertices, depth + 1)
        if item.Operator == "UNION":
            _collect(item.SecondOperand, m, resolver, solids, directrices, vertices, depth + 1)
    elif item.is_a("IfcCsgSolid"):
        _collect(item.TreeRootExpression, m, resolver, solids, directrices, vertices, depth + 1)
    elif item.is_a("IfcSweptDiskSolid"):
        ends = curve_end_points(item.Directrix)
        if ends is not None:
            directrices.append((apply(m, ends[0]), apply(m, ends[1])))
    elif item.is_a("IfcSweptAreaSolid") and hasattr(item, "Directrix"):
        # fixed-reference / surface-curve / directrix-curve sweeps: the directrix in Position
        pos = getattr(item, "Position", None)
        ms = mul(m, resolver.a2p(pos)) if pos is not None else m
        ends = curve_end_points(item.Directrix)
        if ends is not None:
            directrices.append((apply(ms, ends[0]), apply(ms, ends[1])))
    elif item.is_a("IfcManifoldSolidBrep"):  # faceted and advanced breps: their loops' vertices
        _loop_vertices(getattr(item, "Outer", None), m, vertices)
    elif item.is_a("IfcTessellatedFaceSet"):
        for c in item.Coordinates.CoordList:
            vertices.append(apply(m, c))
    elif item.is_a("IfcBoundingBox"):
        c = point(item.Corner)
        for dx in (0.0, float(item.XDim)):
            for dy in (0.0, float(item.YDim)):
                for dz in (0.0, float(item.ZDim)):
                    vertices.append(apply(m, (c[0] + dx, c[1] + dy, c[2] + dz)))
    elif item.is_a("IfcShellBasedSurfaceModel") or item.is_a("IfcFaceBasedSurfaceModel"):
        shells = getattr(item, "SbsmBoundary", None) or getattr(item, "FbsmFaces", None) or ()
        for shell in shells:
            _loop_vertices(shell, m, vertices)


def _loop_vertices(shell, m, vertices) -> None:
    """Vertices of a shell's face bounds: poly loops' polygons, edge loops' edge end points."""
    for face in getattr(shell, "CfsFaces", None) or ():
        for bound in face.Bounds or ():
            loop = bound.Bound
            polygon = getattr(loop, "Polygon", None)
            if polygon:
                for p in polygon:
                    vertices.append(apply(m, point(p)))
                continue
            for oe in getattr(loop, "EdgeList", None) or ():
                edge = getattr(oe, "EdgeElement", None) or oe
                for v in (getattr(edge, "EdgeStart", None), getattr(edge, "EdgeEnd", None)):
                    geom = getattr(v, "VertexGeometry", None)
                    if geom is not None and geom.is_a("IfcCartesianPoint"):
                        vertices.append(apply(m, point(geom)))


def read_geometry(product, index, resolver: PlacementResolver) -> MemberGeometry:
    """Read a product's placement and representations (no tessellation)."""
    geom = MemberGeometry(resolver.matrix(arg(product, 5)))  # IfcProduct.ObjectPlacement
    pds = arg_unchecked(product, 6)  # IfcProduct.Representation (``product`` read above: not None)
    own = arg_unchecked(pds, 2) if pds is not None else None  # .Representations
    if type(own) is tuple and own:  # :func:`shape_representations`, its usual case written out
        reps = [(r, IDENTITY, _ident(r)) for r in own]
    else:
        reps = [(r, m, _ident(r)) for r, m in shape_representations(product, index, resolver)]
    for rep, m0, ident in reps:
        if ident != "axis":
            continue
        for item, m in resolver.item_pairs(rep, m0):
            cls = item.is_a()
            if cls == "IfcPolyline" or item.is_a("IfcCurve") or item.is_a("IfcGeometricSet"):
                ends = curve_end_points(item)
                if ends is not None:
                    geom.axis = (apply(m, ends[0]), apply(m, ends[1]))
                    break
        if geom.axis is not None:
            break
    body_reps = [(r, m, ident) for r, m, ident in reps if ident not in _SKIP_IDS]
    if len(body_reps) > 1:  # preferred identifiers first; a stable sort keeps file order otherwise
        body_reps.sort(key=lambda rmi: _BODY_RANK.get(rmi[2], len(_BODY_IDS)))
    solids: list[SolidInfo] = []
    directrices: list = []
    vertices: list = []
    for rep, m0, _ in body_reps:
        for item, m in resolver.item_pairs(rep, m0):
            _collect(item, m, resolver, solids, directrices, vertices)
        if solids or directrices:
            break
    if not (solids or directrices or vertices):  # a Box representation as the last geometric hint
        for rep, m0, ident in reps:
            if ident == "box":
                for item, m in resolver.item_pairs(rep, m0):
                    _collect(item, m, resolver, solids, directrices, vertices)
    geom.has_body = bool(body_reps)
    geom.solids = solids
    if solids:
        geom.solid = solids[0] if len(solids) == 1 else max(solids, key=lambda s: s.length)
    if directrices:
        geom.directrix = max(directrices, key=lambda d: norm(sub(d[1], d[0])))
    if vertices and not solids:
        geom.vertices = np.asarray(vertices, dtype=float)
    return geom


def solid_frame(solid: SolidInfo, swap_web: bool = False):
    """Profile frame of a solid in object coordinates: (M_profile_in_object, sx, sy)."""
    mps = mul(solid.m, solid.m_profile)
    sx = unit((mps[0], mps[4], mps[8]))
    sy = unit((mps[1], mps[5], mps[9]))
    if swap_web:
        sx, sy = scale(sy, -1.0), sx
    return mps, sx, sy


def solid_corners(solid: SolidInfo, bbox) -> np.ndarray:
    """The 8 corners (object coordinates) of a solid's profile box swept along its extrusion.
    ``bbox`` is the profile's box in the solid's xy plane (:func:`profile_bbox`: the profile's
    own Position already applied)."""
    ext = scale(apply_dir(solid.m, solid.direction), solid.depth)
    pts = []
    for x in (bbox[0], bbox[2]):
        for y in (bbox[1], bbox[3]):
            p = apply(solid.m, (x, y, 0.0))
            pts.append(p)
            pts.append(add(p, ext))
    return np.asarray(pts, dtype=float)


def _principal_line(vertices: np.ndarray):
    if len(vertices) < 2:
        return None
    c = vertices.mean(axis=0)
    _, _, vt = np.linalg.svd(vertices - c, full_matrices=False)
    d = vt[0]
    proj = (vertices - c) @ d
    a, b = c + proj.min() * d, c + proj.max() * d
    return tuple(float(x) for x in a), tuple(float(x) for x in b)


def member_axis(geom: MemberGeometry, *, profile_centre=(0.0, 0.0), swap_web: bool = False,
                cardinal_offset: tuple[float, float] | None = None) -> AxisResult | None:
    """The world axis from what :func:`read_geometry` found (see the module docstring for what
    the axis means). ``profile_centre``: the profile's centre in its own coordinates (an arbitrary
    outline's box centre); ``cardinal_offset``: the axis position in the section from a cardinal
    point (model units). ``None`` when nothing gives an axis."""
    m_obj = geom.m_obj
    solid = geom.solid
    sx = sy = c0 = None
    if solid is not None:
        mps, sx, sy = solid_frame(solid, swap_web)
        c0 = apply(mps, (profile_centre[0], profile_centre[1], 0.0))
    web = unit(apply_dir(m_obj, sy)) if sy is not None else None

    if geom.axis is not None:
        p0, p1 = geom.axis
        offset = None
        if web is None:
            # no swept solid to say where the profile's y axis points: by the IFC conventions,
            # an axis along the object's local z has its profile in the local xy plane (web along
            # local y); an axis along local x has it in the yz plane (web along local z)
            t = unit(sub(p1, p0))
            if abs(t[2]) > 0.999:
                web = unit(apply_dir(m_obj, (0.0, 1.0, 0.0)))
            elif abs(t[0]) > 0.999:
                web = unit(apply_dir(m_obj, (0.0, 0.0, 1.0)))
        if c0 is not None:
            t = unit(sub(p1, p0))
            d = sub(p0, c0)
            d = sub(d, scale(t, dot(d, t)))
            offset = (dot(d, sx), dot(d, sy))
        elif cardinal_offset is not None:
            offset = cardinal_offset
        return AxisResult(apply(m_obj, p0), apply(m_obj, p1), web, offset, "axis")

    if solid is not None:
        ext = scale(apply_dir(solid.m, solid.direction), solid.depth)
        if cardinal_offset is not None:
            start = add(c0, add(scale(sx, cardinal_offset[0]), scale(sy, cardinal_offset[1])))
            offset = cardinal_offset
        else:
            start = (solid.m[3], solid.m[7], solid.m[11])  # the solid's Position origin
            d = sub(start, c0)
            offset = (dot(d, sx), dot(d, sy))
        return AxisResult(apply(m_obj, start), apply(m_obj, add(start, ext)), web, offset, "body")

    if geom.directrix is not None:
        p0, p1 = geom.directrix
        return AxisResult(apply(m_obj, p0), apply(m_obj, p1), None, (0.0, 0.0), "body")

    if geom.vertices is not None:
        line = _principal_line(geom.vertices)
        if line is not None:
            return AxisResult(apply(m_obj, line[0]), apply(m_obj, line[1]), None, None, "body",
                              "axis estimated from the principal direction of the body's vertices")
    return None


def tessellated_axis(model, product) -> AxisResult | None:
    """Last resort: tessellate the body with IfcOpenShell's geometry kernel (world coordinates)
    and take the principal direction of its vertices. ``None`` if the kernel fails. The kernel
    works in metres whatever the file's unit (``si_units=True``)."""
    try:
        import ifcopenshell.geom

        settings = ifcopenshell.geom.settings()
        settings.set("use-world-coords", True)
        shape = ifcopenshell.geom.create_shape(settings, product)
        verts = np.asarray(shape.geometry.verts, dtype=float).reshape(-1, 3)
    except Exception:
        return None
    line = _principal_line(verts)
    if line is None:
        return None
    return AxisResult(line[0], line[1], None, None, "body",
                      "axis estimated by tessellating the body (no Axis, swept solid or vertices)",
                      si_units=True)
