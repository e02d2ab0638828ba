"""Profile definitions → :class:`engine.model.Section` (mm), and cardinal points → axis offsets.

Parametric profiles give their dimensions (``source="ifc-parametric"``); area and second moments
are computed from them (I and channel with their root fillets, the fillet approximated by its
area at its centroid; hollow sections with square corners). Profiles known only by a name
(arbitrary outlines, or a parametric profile of a kind not read here) are looked up in the catalog
(:func:`rules.catalog.lookup_section`).

Section axes: ``depth`` is measured along the profile's y axis and ``width`` along x, as IFC
defines the parametric profiles; the section's web runs along profile y.
"""

from __future__ import annotations

import math

from engine.model import Section

__all__ = ["section_from_profile", "profile_name", "cardinal_offset", "i_section_properties"]

_KIND = {
    "IfcIShapeProfileDef": "I",
    "IfcAsymmetricIShapeProfileDef": "I",
    "IfcUShapeProfileDef": "channel",
    "IfcCShapeProfileDef": "channel",
    "IfcLShapeProfileDef": "angle",
    "IfcTShapeProfileDef": "tee",
    "IfcRectangleHollowProfileDef": "RHS",
    "IfcCircleHollowProfileDef": "CHS",
    "IfcRectangleProfileDef": "other",
    "IfcRoundedRectangleProfileDef": "other",
    "IfcCircleProfileDef": "other",
    "IfcEllipseProfileDef": "other",
    "IfcZShapeProfileDef": "other",
}

_FILLET_C = (10.0 - 3.0 * math.pi) / (12.0 - 3.0 * math.pi)  # fillet centroid / r from its corner


def profile_name(profile) -> str:
    """The profile's ProfileName ('' when absent); a derived profile falls back on its parent's."""
    name = getattr(profile, "ProfileName", None)
    name = name.strip() if isinstance(name, str) else ""
    if not name and profile.is_a("IfcDerivedProfileDef"):
        return profile_name(profile.ParentProfile)
    return name


def _f(profile, *names: str) -> float | None:
    for n in names:
        v = getattr(profile, n, None)
        if v is not None:
            try:
                return float(v)
            except (TypeError, ValueError):
                continue
    return None


def i_section_properties(d: float, b: float, tw: float, tf: float, r: float = 0.0) -> tuple[float, float, float]:
    """Area (mm²), major and minor second moments (mm⁴) of a doubly symmetric I with root fillets.

    Plates plus the four fillets, each taken as its area ``(1 − π/4)r²`` at its centroid
    ``0.2234 r`` from the web/flange corner (fillets' own inertia neglected).

    >>> A, Ix, Iy = i_section_properties(300, 150, 7.1, 10.7, 15)   # IPE 300
    >>> round(A), round(Ix / 1e4), round(Iy / 1e4)                  # tables: 5381 mm², 8356, 604 cm⁴
    (5381, 8356, 604)
    """
    hw = d - 2 * tf
    af = (1 - math.pi / 4) * r * r
    c = _FILLET_C * r
    area = 2 * b * tf + hw * tw + 4 * af
    ix = (b * d**3 - (b - tw) * hw**3) / 12 + 4 * af * (d / 2 - tf - c) ** 2
    iy = (2 * tf * b**3 + hw * tw**3) / 12 + 4 * af * (tw / 2 + c) ** 2
    return area, ix, iy


def _channel_properties(d, b, tw, tf, r):
    hw = d - 2 * tf
    af = (1 - math.pi / 4) * r * r
    c = _FILLET_C * r
    area = 2 * b * tf + hw * tw + 2 * af
    ix = (b * d**3 - (b - tw) * hw**3) / 12 + 2 * af * (d / 2 - tf - c) ** 2
    # minor axis about the centroid (x measured from the back of the web)
    parts = [(2 * b * tf, b / 2, 2 * tf * b**3 / 12), (hw * tw, tw / 2, hw * tw**3 / 12),
             (2 * af, tw + c, 0.0)]
    xc = sum(a * x for a, x, _ in parts) / area
    iy = sum(i0 + a * (x - xc) ** 2 for a, x, i0 in parts)
    return area, ix, iy


def section_from_profile(profile, mm: float, name: str | None = None) -> Section | None:
    """A Section from a parametric profile (dimensions × ``mm`` per model unit), or ``None`` when
    the profile carries no dimensions joint-audit reads (arbitrary outline, composite, …)."""
    if profile.is_a("IfcDerivedProfileDef"):
        base = section_from_profile(profile.ParentProfile, mm, name or profile_name(profile))
        return base
    cls = profile.is_a()
    kind = _KIND.get(cls)
    if kind is None:
        return None
    label = name or profile_name(profile) or cls
    try:
        if cls == "IfcIShapeProfileDef":
            d, b = _f(profile, "OverallDepth") * mm, _f(profile, "OverallWidth") * mm
            tw, tf = _f(profile, "WebThickness") * mm, _f(profile, "FlangeThickness") * mm
            r = (_f(profile, "FilletRadius") or 0.0) * mm
            a, ix, iy = i_section_properties(d, b, tw, tf, r)
            return Section(label, "I", d, b, tw, tf, r or None, a, ix, iy, "ifc-parametric")
        if cls == "IfcAsymmetricIShapeProfileDef":
            d = _f(profile, "OverallDepth") * mm
            bb = _f(profile, "BottomFlangeWidth", "OverallWidth") * mm
            bt = (_f(profile, "TopFlangeWidth") or bb / mm) * mm
            tw = _f(profile, "WebThickness") * mm
            tfb = _f(profile, "BottomFlangeThickness", "FlangeThickness") * mm
            tft = (_f(profile, "TopFlangeThickness") or tfb / mm) * mm
            r = (_f(profile, "BottomFlangeFilletRadius", "FilletRadius") or 0.0) * mm
            area = bb * tfb + bt * tft + (d - tfb - tft) * tw
            return Section(label, "I", d, max(bb, bt), tw, max(tfb, tft), r or None, area, None, None,
                           "ifc-parametric")
        if cls in ("IfcUShapeProfileDef",):
            d, b = _f(profile, "Depth") * mm, _f(profile, "FlangeWidth") * mm
            tw, tf = _f(profile, "WebThickness") * mm, _f(profile, "FlangeThickness") * mm
            r = (_f(profile, "FilletRadius") or 0.0) * mm
            a, ix, iy = _channel_properties(d, b, tw, tf, r)
            return Section(label, "channel", d, b, tw, tf, r or None, a, ix, iy, "ifc-parametric")
        if cls == "IfcCShapeProfileDef":
            d, b = _f(profile, "Depth") * mm, _f(profile, "Width") * mm
            t = _f(profile, "WallThickness") * mm
            return Section(label, "channel", d, b, t, t, None, None, None, None, "ifc-parametric")
        if cls == "IfcLShapeProfileDef":
            d = _f(profile, "Depth") * mm
            b = (_f(profile, "Width") or d / mm) * mm
            t = _f(profile, "Thickness") * mm
            r = (_f(profile, "FilletRadius") or 0.0) * mm
            area = (d + b - t) * t
            return Section(label, "angle", d, b, t, t, r or None, area, None, None, "ifc-parametric")
        if cls == "IfcTShapeProfileDef":
            d, b = _f(profile, "Depth") * mm, _f(profile, "FlangeWidth") * mm
            tw, tf = _f(profile, "WebThickness") * mm, _f(profile, "FlangeThickness") * mm
            r = (_f(profile, "FilletRadius") or 0.0) * mm
            area = b * tf + (d - tf) * tw
            return Section(label, "tee", d, b, tw, tf, r or None, area, None, None, "ifc-parametric")
        if cls == "IfcRectangleHollowProfileDef":
            b, d = _f(profile, "XDim") * mm, _f(profile, "YDim") * mm
            t = _f(profile, "WallThickness") * mm
            bi, di = b - 2 * t, d - 2 * t
            area = b * d - bi * di
            ix = (b * d**3 - bi * di**3) / 12
            iy = (d * b**3 - di * bi**3) / 12
            return Section(label, "RHS", d, b, t, t, _f(profile, "OuterFilletRadius") and
                           _f(profile, "OuterFilletRadius") * mm, area, ix, iy, "ifc-parametric")
        if cls == "IfcCircleHollowProfileDef":
            ro = _f(profile, "Radius") * mm
            t = _f(profile, "WallThickness") * mm
            ri = ro - t
            area = math.pi * (ro**2 - ri**2)
            i = math.pi / 4 * (ro**4 - ri**4)
            return Section(label, "CHS", 2 * ro, 2 * ro, t, t, None, area, i, i, "ifc-parametric")
        if cls in ("IfcRectangleProfileDef", "IfcRoundedRectangleProfileDef"):
            b, d = _f(profile, "XDim") * mm, _f(profile, "YDim") * mm
            return Section(label, "other", d, b, None, None, None, b * d, b * d**3 / 12, d * b**3 / 12,
                           "ifc-parametric")
        if cls == "IfcCircleProfileDef":
            r = _f(profile, "Radius") * mm
            i = math.pi / 4 * r**4
            return Section(label, "other", 2 * r, 2 * r, None, None, None, math.pi * r * r, i, i,
                           "ifc-parametric")
        if cls == "IfcEllipseProfileDef":
            a, b = _f(profile, "SemiAxis1") * mm, _f(profile, "SemiAxis2") * mm
            return Section(label, "other", 2 * b, 2 * a, None, None, None, math.pi * a * b, None, None,
                           "ifc-parametric")
        if cls == "IfcZShapeProfileDef":
            d, b = _f(profile, "Depth") * mm, _f(profile, "FlangeWidth") * mm
            tw, tf = _f(profile, "WebThickness") * mm, _f(profile, "FlangeThickness") * mm
            return Section(label, "other", d, 2 * b - tw, tw, tf, None, None, None, None, "ifc-parametric")
    except TypeError:  # a required dimension is missing ($): not parametric after all
        return None
    return None


def cardinal_offset(cardinal_point: int | None, width: float | None, depth: float | None
                    ) -> tuple[float, float] | None:
    """Where the member's axis sits relative to the section's centre, in the section's (x, y), mm,
    for an IFC cardinal point (IfcCardinalPointReference) — or ``None``.

    Read from the buildingSMART IFC4.3 sample ``beam-varying-cardinal-points`` and
    ``beam-parametric-cross-section``: "left" is +x (the profile's x axis, looking along the
    member from its start), "bottom" is −y. 10–19 (centroid / shear centre based) are taken at the
    bounding-box centre, exact for doubly symmetric sections.
    """
    if cardinal_point is None or width is None or depth is None:
        return None
    hw, hd = width / 2.0, depth / 2.0
    table = {
        1: (hw, -hd), 2: (0.0, -hd), 3: (-hw, -hd),
        4: (hw, 0.0), 5: (0.0, 0.0), 6: (-hw, 0.0),
        7: (hw, hd), 8: (0.0, hd), 9: (-hw, hd),
        10: (0.0, 0.0), 11: (0.0, -hd), 12: (hw, 0.0), 13: (-hw, 0.0), 14: (0.0, hd),
        15: (0.0, 0.0), 16: (0.0, -hd), 17: (hw, 0.0), 18: (-hw, 0.0), 19: (0.0, hd),
    }
    return table.get(int(cardinal_point))
