"""Placements, transforms and curve end points, read straight from the IFC entities (no tessellation).

Everything here works in the model's own length unit; callers scale to mm once. A transform is
an affine 3×4 matrix held as a flat tuple of 12 floats, row by row
(``(xx, yx, zx, tx, xy, yy, zy, ty, xz, yz, zz, tz)``: the columns are the local x, y, z axes and
the origin in the parent's coordinates); points and directions are 3-tuples. Plain tuples are
several times faster than small numpy arrays for the few operations each element needs, which
matters on models of tens of thousands of members; :func:`to_numpy` gives a 4×4 array.

* :func:`axis2placement` — IfcAxis2Placement3D/2D → matrix (the IFC base-axis rules: a missing
  Axis is +Z, a missing RefDirection +X, RefDirection made orthogonal to Axis).
* :func:`transform_operator` — IfcCartesianTransformationOperator2D/3D (uniform and non-uniform)
  → matrix, by the IFC ``IfcBaseAxis`` rules.
* :class:`PlacementResolver` — IfcLocalPlacement chains and IfcGridPlacement (virtual grid
  intersections resolved on the grid's axes), cached per placement entity.
* :func:`curve_end_points` — start and end point of the curves an ``Axis`` representation uses
  (IfcPolyline, IfcIndexedPolyCurve, IfcTrimmedCurve of IfcLine, IfcCompositeCurve, curve sets).
* :func:`profile_bbox` — the 2D bounding box of a profile definition in its own coordinates.
* :func:`iter_items` — a representation's items with the transform of the IfcMappedItems they sit
  in (MappingTarget ∘ MappingOrigin), recursively.
"""

from __future__ import annotations

import math
from typing import Iterator, NoReturn

import numpy as np

__all__ = [
    "MAX_COORDINATE_MM",
    "text_value",
    "IDENTITY",
    "Mat",
    "mul",
    "column",
    "to_numpy",
    "add",
    "sub",
    "scale",
    "dot",
    "cross",
    "norm",
    "unit",
    "axis2placement",
    "transform_operator",
    "PlacementResolver",
    "curve_end_points",
    "profile_bbox",
    "iter_items",
    "apply",
    "apply_dir",
    "arg",
    "arg_unchecked",
    "point",
]

Mat = tuple  # 12 floats, see the module docstring
IDENTITY: Mat = (1.0, 0.0, 0.0, 0.0, 0.0, 1.0, 0.0, 0.0, 0.0, 0.0, 1.0, 0.0)

MAX_COORDINATE_MM = 1e11
"""A point farther than this from the model's origin (100 000 km, beyond any coordinate on Earth)
is corrupt data: the readers skip the element with a warning."""


def text_value(value) -> str:
    """A string attribute (Name, Tag, GlobalId, ...) as text; ``""`` where a damaged file holds
    something else there (a number, a reference to another entity)."""
    return value if isinstance(value, str) else ""


def mul(a: Mat, b: Mat) -> Mat:
    """The transform ``a ∘ b`` (apply ``b`` first)."""
    if b is IDENTITY:
        return a
    if a is IDENTITY:
        return b
    a0, a1, a2, a3, a4, a5, a6, a7, a8, a9, a10, a11 = a
    b0, b1, b2, b3, b4, b5, b6, b7, b8, b9, b10, b11 = b
    return (
        a0 * b0 + a1 * b4 + a2 * b8, a0 * b1 + a1 * b5 + a2 * b9, a0 * b2 + a1 * b6 + a2 * b10,
        a0 * b3 + a1 * b7 + a2 * b11 + a3,
        a4 * b0 + a5 * b4 + a6 * b8, a4 * b1 + a5 * b5 + a6 * b9, a4 * b2 + a5 * b6 + a6 * b10,
        a4 * b3 + a5 * b7 + a6 * b11 + a7,
        a8 * b0 + a9 * b4 + a10 * b8, a8 * b1 + a9 * b5 + a10 * b9, a8 * b2 + a9 * b6 + a10 * b10,
        a8 * b3 + a9 * b7 + a10 * b11 + a11,
    )


def apply(m: Mat, p) -> tuple[float, float, float]:
    """Transform the point ``p`` (2 or 3 coordinates) by ``m``."""
    if len(p) == 3:  # :func:`_xyz`, written out for the usual case
        x, y, z = float(p[0]), float(p[1]), float(p[2])
    else:
        x, y, z = _xyz(p)
    return (m[0] * x + m[1] * y + m[2] * z + m[3],
            m[4] * x + m[5] * y + m[6] * z + m[7],
            m[8] * x + m[9] * y + m[10] * z + m[11])


def apply_dir(m: Mat, d) -> tuple[float, float, float]:
    """Transform the direction ``d`` by the linear part of ``m`` (not normalised)."""
    if len(d) == 3:  # :func:`_xyz`, written out for the usual case
        x, y, z = float(d[0]), float(d[1]), float(d[2])
    else:
        x, y, z = _xyz(d)
    return (m[0] * x + m[1] * y + m[2] * z,
            m[4] * x + m[5] * y + m[6] * z,
            m[8] * x + m[9] * y + m[10] * z)


def column(m: Mat, j: int) -> tuple[float, float, float]:
    """Column ``j`` of ``m``: 0, 1, 2 the local x, y, z axes, 3 the origin."""
    return (m[j], m[4 + j], m[8 + j])


def to_numpy(m: Mat) -> np.ndarray:
    """``m`` as a 4×4 numpy array."""
    return np.array((m[0:4], m[4:8], m[8:12], (0.0, 0.0, 0.0, 1.0)), dtype=float)


def add(a, b):
    return (a[0] + b[0], a[1] + b[1], a[2] + b[2])


def sub(a, b):
    return (a[0] - b[0], a[1] - b[1], a[2] - b[2])


def scale(a, k: float):
    return (a[0] * k, a[1] * k, a[2] * k)


def dot(a, b) -> float:
    return a[0] * b[0] + a[1] * b[1] + a[2] * b[2]


def cross(a, b):
    return (a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0])


def norm(a) -> float:
    return math.sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2])


def _missing(i: int) -> NoReturn:
    """What :func:`arg` raises for attribute ``i`` of a missing entity (``None``)."""
    raise TypeError(f"attribute {i} of a missing entity (a reference to an entity that is not in the file)")


def _make_arg():
    """Positional attribute access, several times faster than ``entity.Name`` (IfcOpenShell's
    ``__getattr__`` looks the name up on every call). Used only for attributes whose position is
    the same in IFC2X3, IFC4 and IFC4X3. Returns ``(arg, arg_unchecked)``."""
    try:
        import ifcopenshell

        getter = getattr(ifcopenshell.entity_instance, "get_argument", None)
        if getter is not None:  # IfcOpenShell 0.8.1+: the wrapper's own accessor

            def arg(entity, i: int, _get=getter):
                # the wrapper crashes the interpreter (segmentation fault) when given None, which is
                # what a reference to an entity missing from a damaged file reads as
                if entity is None:
                    _missing(i)
                return _get(entity, i)

            return arg, getter
    except ImportError:  # pragma: no cover - ifc_io always has ifcopenshell
        pass
    return (lambda e, i: e[i]), (lambda e, i: e[i])


arg, arg_unchecked = _make_arg()
"""``arg(entity, i)``: the i-th attribute of ``entity`` (a missing entity, ``None``, raises
TypeError). ``arg_unchecked(entity, i)``: the same without the ``None`` test, for the hot paths,
only where ``entity`` is known not to be ``None`` (IfcOpenShell crashes the interpreter on it)."""
_get = arg_unchecked


def unit(v) -> tuple[float, float, float]:
    """``v`` as a unit-length 3-tuple (a zero vector is returned as zeros)."""
    x, y, z = float(v[0]), float(v[1]), float(v[2])
    n = math.sqrt(x * x + y * y + z * z)
    return (x / n, y / n, z / n) if n > 0 else (0.0, 0.0, 0.0)


def _xyz(coords) -> tuple[float, float, float]:
    if len(coords) == 3:
        return (float(coords[0]), float(coords[1]), float(coords[2]))
    c = tuple(float(x) for x in coords)
    return (c + (0.0, 0.0, 0.0))[:3]


def _dir_ratios(direction) -> tuple[float, float, float] | None:
    if direction is None:
        return None
    return _xyz(arg(direction, 0))  # IfcDirection.DirectionRatios


def point(p) -> tuple[float, float, float]:
    """An IfcCartesianPoint's coordinates as three floats (2D points get z = 0)."""
    if p is None:
        _missing(0)
    c = _get(p, 0)  # IfcCartesianPoint.Coordinates
    if len(c) == 3:  # :func:`_xyz`, written out for the usual case
        return (float(c[0]), float(c[1]), float(c[2]))
    return _xyz(c)


def _unit3(v) -> tuple[float, float, float] | None:
    n = math.sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2])
    return (v[0] / n, v[1] / n, v[2] / n) if n > 0 else None


def _frame(z, x):
    """Right-handed orthonormal (x, y, z) from an axis ``z`` and a reference direction ``x``
    (plain tuples). A reference direction parallel to the axis (undefined in IFC) is replaced
    by the nearest world axis. (:func:`_unit3` written out: this runs once per placement.)"""
    n = math.sqrt(z[0] * z[0] + z[1] * z[1] + z[2] * z[2])
    zz = (z[0] / n, z[1] / n, z[2] / n) if n > 0 else (0.0, 0.0, 1.0)
    z0, z1, z2 = zz
    xx = None
    for cand in (x, (1.0, 0.0, 0.0) if abs(z0) < 0.9 else (0.0, 1.0, 0.0)):
        d = cand[0] * z0 + cand[1] * z1 + cand[2] * z2
        p0, p1, p2 = cand[0] - d * z0, cand[1] - d * z1, cand[2] - d * z2
        n = math.sqrt(p0 * p0 + p1 * p1 + p2 * p2)
        if n > 1e-9:
            xx = (p0 / n, p1 / n, p2 / n)
            break
    yy = (z1 * xx[2] - z2 * xx[1], z2 * xx[0] - z0 * xx[2], z0 * xx[1] - z1 * xx[0])
    return xx, yy, zz


def _matrix(x, y, z, loc) -> Mat:
    return (x[0], y[0], z[0], loc[0], x[1], y[1], z[1], loc[1], x[2], y[2], z[2], loc[2])


def axis2placement(placement) -> Mat:
    """Matrix of an IfcAxis2Placement3D or IfcAxis2Placement2D (``None`` → identity)."""
    if placement is None:
        return IDENTITY
    cls = placement.is_a()
    if cls == "IfcAxis2Placement3D":  # (Location, Axis, RefDirection) in every schema
        location, axis, ref = _get(placement, 0), _get(placement, 1), _get(placement, 2)
        loc = _xyz(_get(location, 0)) if location is not None else (0.0, 0.0, 0.0)
        if axis is None and ref is None:
            return _matrix((1.0, 0.0, 0.0), (0.0, 1.0, 0.0), (0.0, 0.0, 1.0), loc)
        z = _xyz(_get(axis, 0)) if axis is not None else (0.0, 0.0, 1.0)  # DirectionRatios
        x = _xyz(_get(ref, 0)) if ref is not None else (1.0, 0.0, 0.0)
        x, y, z = _frame(z, x)
        return (x[0], y[0], z[0], loc[0], x[1], y[1], z[1], loc[1], x[2], y[2], z[2], loc[2])  # _matrix
    if cls == "IfcAxis2Placement2D":  # (Location, RefDirection)
        location = _get(placement, 0)
        loc = point(location) if location is not None else (0.0, 0.0, 0.0)
        ref = _dir_ratios(_get(placement, 1)) or (1.0, 0.0, 0.0)
        x = _unit3((ref[0], ref[1], 0.0)) or (1.0, 0.0, 0.0)
        return _matrix(x, (-x[1], x[0], 0.0), (0.0, 0.0, 1.0), (loc[0], loc[1], 0.0))
    raise ValueError(f"{cls} is not an axis placement")


def transform_operator(op) -> Mat:
    """Matrix of an IfcCartesianTransformationOperator2D/3D (and the non-uniform subtypes).

    Axes follow IFC's ``IfcBaseAxis``/``IfcBaseAxis2``: Axis3 (default +Z), Axis1 made
    orthogonal to it (default +X), Axis2 orthogonal to both (default +Y); the scale factors
    multiply the columns.
    """
    if op is None:
        return IDENTITY
    origin = _xyz(op.LocalOrigin.Coordinates) if op.LocalOrigin is not None else (0.0, 0.0, 0.0)
    scale = float(op.Scale) if op.Scale is not None else 1.0
    scale2 = getattr(op, "Scale2", None)
    scale3 = getattr(op, "Scale3", None)
    sx = scale
    sy = float(scale2) if scale2 is not None else scale
    sz = float(scale3) if scale3 is not None else scale
    a1 = _dir_ratios(op.Axis1)
    a2 = _dir_ratios(op.Axis2)
    a3 = _dir_ratios(getattr(op, "Axis3", None))
    if a1 is None and a2 is None and a3 is None:
        x, y, z = (1.0, 0.0, 0.0), (0.0, 1.0, 0.0), (0.0, 0.0, 1.0)
    else:
        z = _unit3(a3) if a3 is not None else (0.0, 0.0, 1.0)
        x, _, z = _frame(z, a1 if a1 is not None else (1.0, 0.0, 0.0))
        v2 = a2 if a2 is not None else (0.0, 1.0, 0.0)
        d1 = v2[0] * z[0] + v2[1] * z[1] + v2[2] * z[2]
        d2 = v2[0] * x[0] + v2[1] * x[1] + v2[2] * x[2]
        y = _unit3(tuple(v2[i] - d1 * z[i] - d2 * x[i] for i in range(3))) or (
            z[1] * x[2] - z[2] * x[1], z[2] * x[0] - z[0] * x[2], z[0] * x[1] - z[1] * x[0])
    return _matrix(tuple(c * sx for c in x), tuple(c * sy for c in y), tuple(c * sz for c in z), origin)


# --------------------------------------------------------------------------------------------
# Curves
# --------------------------------------------------------------------------------------------


def _line_point(line, t: float):
    pnt = point(line.Pnt)
    vec = line.Dir
    d = scale(unit(_xyz(vec.Orientation.DirectionRatios)), float(vec.Magnitude))
    return add(pnt, scale(d, t))


def _trim_point(curve, trims):
    basis = curve.BasisCurve
    cart = next((t for t in trims if hasattr(t, "is_a") and t.is_a("IfcCartesianPoint")), None)
    param = next((t for t in trims if not (hasattr(t, "is_a") and t.is_a("IfcCartesianPoint"))), None)
    prefer_param = curve.MasterRepresentation == "PARAMETER" and param is not None
    if cart is not None and not prefer_param:
        return point(cart)
    if param is not None and basis.is_a("IfcLine"):
        value = float(getattr(param, "wrappedValue", param))
        return _line_point(basis, value)
    if cart is not None:
        return point(cart)
    return None


def curve_end_points(curve):
    """Start and end point of a curve in its own coordinates, or ``None`` when not understood.

    A curved axis (arc segments) is reduced to its chord between the two end points.
    """
    if curve.is_a() == "IfcPolyline":
        pts = arg(curve, 0)  # Points
        if len(pts) < 2:
            return None
        return point(pts[0]), point(pts[-1])
    if curve.is_a("IfcIndexedPolyCurve"):
        coords = curve.Points.CoordList
        if len(coords) < 2:
            return None
        first, last = 0, len(coords) - 1
        segments = curve.Segments
        if segments:
            try:
                first = int(segments[0].wrappedValue[0]) - 1
                last = int(segments[-1].wrappedValue[-1]) - 1
            except Exception:
                first, last = 0, len(coords) - 1
        return _xyz(coords[first]), _xyz(coords[last])
    if curve.is_a("IfcTrimmedCurve"):
        p1 = _trim_point(curve, curve.Trim1 or ())
        p2 = _trim_point(curve, curve.Trim2 or ())
        if p1 is None or p2 is None:
            return None
        return p1, p2
    if curve.is_a("IfcCompositeCurve"):
        segs = curve.Segments
        if not segs:
            return None
        a = curve_end_points(segs[0].ParentCurve)
        b = curve_end_points(segs[-1].ParentCurve)
        if a is None or b is None:
            return None
        start = a[0] if getattr(segs[0], "SameSense", True) is not False else a[1]
        end = b[1] if getattr(segs[-1], "SameSense", True) is not False else b[0]
        return start, end
    if curve.is_a("IfcGeometricCurveSet") or curve.is_a("IfcGeometricSet"):
        for element in curve.Elements or ():
            if element.is_a("IfcCurve"):
                r = curve_end_points(element)
                if r is not None:
                    return r
        return None
    if curve.is_a("IfcOffsetCurve3D") or curve.is_a("IfcOffsetCurve2D"):
        return None
    return None


def _curve_points(curve, out: list) -> bool:
    """Append a curve's defining points (for a bounding box); arcs add their circle's box."""
    if curve.is_a("IfcPolyline"):
        out.extend(_xyz(p.Coordinates) for p in curve.Points)
        return True
    if curve.is_a("IfcIndexedPolyCurve"):
        out.extend(_xyz(c) for c in curve.Points.CoordList)
        return True
    if curve.is_a("IfcCompositeCurve"):
        ok = True
        for seg in curve.Segments or ():
            ok = _curve_points(seg.ParentCurve, out) and ok
        return ok
    if curve.is_a("IfcTrimmedCurve"):
        basis = curve.BasisCurve
        if basis.is_a("IfcCircle") or basis.is_a("IfcEllipse"):
            return _curve_points(basis, out)
        ends = curve_end_points(curve)
        if ends is None:
            return False
        out.extend(tuple(p) for p in ends)
        return True
    if curve.is_a("IfcCircle") or curve.is_a("IfcEllipse"):
        m = axis2placement(curve.Position)
        rx = float(getattr(curve, "Radius", None) or getattr(curve, "SemiAxis1", 0.0))
        ry = float(getattr(curve, "Radius", None) or getattr(curve, "SemiAxis2", 0.0))
        for sx, sy in ((-1, -1), (1, -1), (1, 1), (-1, 1)):
            out.append(tuple(apply(m, (sx * rx, sy * ry, 0.0))))
        return True
    return False


def profile_bbox(profile) -> tuple[float, float, float, float] | None:
    """``(xmin, ymin, xmax, ymax)`` of a profile in its own coordinates (its Position applied),
    model length units; ``None`` when the profile is not understood. Parametric profiles use
    their overall dimensions (a box around the shape). Callers cache per profile."""
    return _profile_bbox(profile)


def _box(m: Mat, hx: float, hy: float, cx: float = 0.0, cy: float = 0.0):
    pts = [apply(m, (cx + sx * hx, cy + sy * hy, 0.0)) for sx, sy in ((-1, -1), (1, -1), (1, 1), (-1, 1))]
    xs = [p[0] for p in pts]
    ys = [p[1] for p in pts]
    return (min(xs), min(ys), max(xs), max(ys))


def _profile_bbox(profile):
    pos = getattr(profile, "Position", None)
    m = axis2placement(pos) if pos is not None else IDENTITY
    cls = profile.is_a()
    try:
        if cls in ("IfcRectangleProfileDef", "IfcRectangleHollowProfileDef", "IfcRoundedRectangleProfileDef"):
            return _box(m, float(profile.XDim) / 2, float(profile.YDim) / 2)
        if cls in ("IfcCircleProfileDef", "IfcCircleHollowProfileDef"):
            r = float(profile.Radius)
            return _box(m, r, r)
        if cls == "IfcEllipseProfileDef":
            return _box(m, float(profile.SemiAxis1), float(profile.SemiAxis2))
        if cls == "IfcIShapeProfileDef":
            return _box(m, float(profile.OverallWidth) / 2, float(profile.OverallDepth) / 2)
        if cls == "IfcAsymmetricIShapeProfileDef":
            w = max(float(getattr(profile, "BottomFlangeWidth", None) or getattr(profile, "OverallWidth", 0) or 0),
                    float(profile.TopFlangeWidth or 0))
            return _box(m, w / 2, float(profile.OverallDepth) / 2)
        if cls in ("IfcUShapeProfileDef", "IfcTShapeProfileDef"):
            return _box(m, float(profile.FlangeWidth) / 2, float(profile.Depth) / 2)
        if cls == "IfcLShapeProfileDef":
            w = float(profile.Width) if profile.Width is not None else float(profile.Depth)
            return _box(m, w / 2, float(profile.Depth) / 2)
        if cls == "IfcCShapeProfileDef":
            return _box(m, float(profile.Width) / 2, float(profile.Depth) / 2)
        if cls == "IfcZShapeProfileDef":
            return _box(m, float(profile.FlangeWidth) - float(profile.WebThickness) / 2, float(profile.Depth) / 2)
        if cls in ("IfcArbitraryClosedProfileDef", "IfcArbitraryProfileDefWithVoids"):
            pts: list = []
            if not _curve_points(profile.OuterCurve, pts) or not pts:
                return None
            xs = [p[0] for p in pts]
            ys = [p[1] for p in pts]
            return (min(xs), min(ys), max(xs), max(ys))
        if cls == "IfcDerivedProfileDef":
            parent = profile_bbox(profile.ParentProfile)
            if parent is None:
                return None
            op = transform_operator(profile.Operator)
            return _box(op, (parent[2] - parent[0]) / 2, (parent[3] - parent[1]) / 2,
                        (parent[0] + parent[2]) / 2, (parent[1] + parent[3]) / 2)
        if cls == "IfcCompositeProfileDef":
            boxes = [profile_bbox(p) for p in profile.Profiles]
            boxes = [b for b in boxes if b is not None]
            if not boxes:
                return None
            return (min(b[0] for b in boxes), min(b[1] for b in boxes),
                    max(b[2] for b in boxes), max(b[3] for b in boxes))
    except (TypeError, AttributeError, ValueError):
        return None
    return None


# --------------------------------------------------------------------------------------------
# Representation items, through mapped items
# --------------------------------------------------------------------------------------------


def iter_items(representation, m: Mat = IDENTITY, depth: int = 0) -> Iterator[tuple[object, Mat]]:
    """Yield ``(item, matrix)`` for every item of a shape representation, descending into
    IfcMappedItems: ``matrix`` takes the item's coordinates into the representation's (object)
    coordinates, ``MappingTarget ∘ MappingOrigin``."""
    if depth > 8:
        return
    for item in representation.Items or ():
        if item.is_a("IfcMappedItem"):
            source = item.MappingSource
            mm = mul(mul(m, transform_operator(item.MappingTarget)), axis2placement(source.MappingOrigin))
            yield from iter_items(source.MappedRepresentation, mm, depth + 1)
        else:
            yield item, m


# --------------------------------------------------------------------------------------------
# Object placements
# --------------------------------------------------------------------------------------------


class PlacementResolver:
    """World matrices of object placements, cached per placement entity id.

    Handles IfcLocalPlacement (any depth of PlacementRelTo), IfcGridPlacement (the virtual grid
    intersection found on the two grid axes' curves, with their offsets, in the grid's own
    placement; PlacementRefDirection as a direction or as a second intersection) and IFC4X3
    IfcLinearPlacement when it carries its CartesianPosition. Anything else raises ValueError.
    """

    def __init__(self) -> None:
        self._cache: dict[int, Mat] = {}
        self._a2p: dict[int, Mat] = {}
        self._ops: dict[int, Mat] = {}
        self.profiles: dict[int, tuple[Mat, object]] = {}  # profile placements (read_axes)

    def a2p(self, placement) -> Mat:
        """:func:`axis2placement`, cached per entity."""
        if placement is None:
            return IDENTITY
        key = placement.id()
        m = self._a2p.get(key)
        if m is None:
            m = axis2placement(placement)
            if key:
                self._a2p[key] = m
        return m

    def op(self, operator) -> Mat:
        """:func:`transform_operator`, cached per entity."""
        if operator is None:
            return IDENTITY
        key = operator.id()
        m = self._ops.get(key)
        if m is None:
            m = transform_operator(operator)
            if key:
                self._ops[key] = m
        return m

    def iter_items(self, representation, m: Mat = IDENTITY, depth: int = 0):
        """:func:`iter_items` with the cached transforms."""
        if depth > 8:
            return
        for item in arg(representation, 3) or ():  # IfcShapeRepresentation.Items
            if item.is_a() == "IfcMappedItem":
                source = item.MappingSource
                mm = mul(mul(m, self.op(item.MappingTarget)), self.a2p(source.MappingOrigin))
                yield from self.iter_items(source.MappedRepresentation, mm, depth + 1)
            else:
                yield item, m

    def item_pairs(self, representation, m: Mat = IDENTITY):
        """:meth:`iter_items`, returning a tuple straight away for the usual representation of one
        item that is not a mapped item (cheaper than starting a generator for it)."""
        items = arg(representation, 3)  # IfcShapeRepresentation.Items
        if type(items) is tuple and len(items) == 1 and items[0].is_a() != "IfcMappedItem":
            return ((items[0], m),)
        return self.iter_items(representation, m)

    def matrix(self, placement, _depth: int = 0) -> Mat:
        """World matrix of an object placement (``None`` → identity); ValueError when it cannot be
        resolved."""
        if placement is None:
            return IDENTITY
        pid = placement.id()
        hit = self._cache.get(pid)
        if hit is not None:
            return hit
        if _depth > 64:
            raise ValueError("placement chain is circular or deeper than 64 levels")
        cls = placement.is_a()
        if cls == "IfcLocalPlacement":  # (PlacementRelTo, RelativePlacement)
            parent = _get(placement, 0)
            pm = IDENTITY if parent is None else (self._cache.get(parent.id()) or self.matrix(parent, _depth + 1))
            relative = _get(placement, 1)
            if relative is None:
                rm = IDENTITY
            else:
                key = relative.id()
                rm = self._a2p.get(key)
                if rm is None:  # :meth:`a2p`, inlined
                    rm = axis2placement(relative)
                    if key:
                        self._a2p[key] = rm
            m = mul(pm, rm)
        elif placement.is_a("IfcGridPlacement"):
            m = self._grid_placement(placement, _depth)
        elif placement.is_a("IfcLinearPlacement"):
            cart = getattr(placement, "CartesianPosition", None)
            if cart is None:
                raise ValueError("IfcLinearPlacement without CartesianPosition is not resolved")
            parent = self.matrix(getattr(placement, "PlacementRelTo", None), _depth + 1)
            m = mul(parent, axis2placement(cart))
        else:
            raise ValueError(f"{cls} is not a supported object placement")
        self._cache[pid] = m
        return m

    # -- grids ----------------------------------------------------------------------------
    def _grid(self, axis):
        for attr in ("PartOfU", "PartOfV", "PartOfW"):
            grids = getattr(axis, attr, None) or ()
            for g in grids:
                return g
        return None

    @staticmethod
    def _axis_line(axis):
        ends = curve_end_points(axis.AxisCurve)
        if ends is None:
            raise ValueError(f"grid axis {axis.AxisTag!r} has a curve that is not understood")
        p0, p1 = ends
        d = unit(sub(p1, p0))
        if axis.SameSense is False:
            d = scale(d, -1.0)
        return (p0[0], p0[1]), (d[0], d[1])

    def _intersection(self, vgi):
        axes = vgi.IntersectingAxes
        if len(axes) < 2:
            raise ValueError("virtual grid intersection names fewer than two axes")
        offsets = [float(o) for o in (vgi.OffsetDistances or ())] + [0.0, 0.0, 0.0]
        lines = []
        for axis, off in zip(axes[:2], offsets[:2]):
            p, d = self._axis_line(axis)
            # the offset axis lies to the left of the axis direction
            lines.append(((p[0] - off * d[1], p[1] + off * d[0]), d))
        (p1, d1), (p2, d2) = lines
        det = d1[0] * (-d2[1]) - d1[1] * (-d2[0])
        if abs(det) < 1e-12:
            raise ValueError(f"grid axes {axes[0].AxisTag!r} and {axes[1].AxisTag!r} are parallel")
        rx, ry = p2[0] - p1[0], p2[1] - p1[1]
        t = (rx * (-d2[1]) - ry * (-d2[0])) / det
        return (p1[0] + t * d1[0], p1[1] + t * d1[1], offsets[2]), self._grid(axes[0])

    def _grid_placement(self, placement, depth: int) -> Mat:
        location, grid = self._intersection(placement.PlacementLocation)
        if grid is None:
            raise ValueError("grid axis belongs to no IfcGrid")
        grid_m = self.matrix(grid.ObjectPlacement, depth + 1)
        x = (1.0, 0.0, 0.0)
        ref = placement.PlacementRefDirection
        if ref is not None:
            if ref.is_a("IfcDirection"):
                x = _xyz(ref.DirectionRatios)
            elif ref.is_a("IfcVirtualGridIntersection"):
                other, _ = self._intersection(ref)
                x = sub(other, location)
        x = unit((x[0], x[1], 0.0))
        if x == (0.0, 0.0, 0.0):
            x = (1.0, 0.0, 0.0)
        return mul(grid_m, _matrix(x, (-x[1], x[0], 0.0), (0.0, 0.0, 1.0), location))
