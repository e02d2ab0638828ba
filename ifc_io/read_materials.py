"""Material associations → material labels, the IFC4 profile of a material profile set (usage),
its cardinal point, and the steel grade (:func:`rules.catalog.lookup_steel`).

The element's own association wins over its type's. Every material select of IFC2X3, IFC4 and
IFC4X3 is read: IfcMaterial, IfcMaterialList, layer sets and their usages, profile sets and their
usages (IFC4+), constituent sets (IFC4+).
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from engine.model import Steel
from ifc_io.read_geometry import arg
from rules.catalog import lookup_steel

__all__ = ["MaterialInfo", "material_info", "SteelResolver", "NON_STEEL_WORDS"]

NON_STEEL_WORDS = (
    "CONCRETE", "TIMBER", "WOOD", "GLULAM", "LVL", "CLT", "MASONRY", "BRICK", "BLOCKWORK",
    "ALUMIN", "GLASS", "PLASTER", "GYPSUM", "INSULATION", "CEMENT", "GROUT", "STONE", "SOIL",
    "EARTH", "SAND", "GRAVEL", "RUBBER", "PLASTIC", "TIMBR", "PINE", "OAK", "SPRUCE", "PLYWOOD",
)
"""Words that mark a material as not steel (matched in the upper-cased label)."""


@dataclass(frozen=True)
class MaterialInfo:
    """What an element's material association says: ``labels`` (material names, then IFC4
    categories), ``profile`` (the single IfcProfileDef of a material profile set, or ``None``),
    ``cardinal_point`` (of an IfcMaterialProfileSetUsage) and ``from_type`` (found on the type)."""

    labels: tuple[str, ...] = ()
    profile: object | None = None
    cardinal_point: int | None = None
    from_type: bool = False
    found: bool = False


_NO_MATERIAL = MaterialInfo()
"""What an element with no material association (own or type's) gets; shared, it is frozen."""


def _material_labels(mat) -> list[str]:
    out = []
    for attr in ("Name", "Category"):
        v = getattr(mat, attr, None)
        if v:
            out.append(str(v).strip())
    return out


def _walk(select, labels: list[str], profiles: list) -> int | None:
    """Collect labels and profiles from a material select; return a cardinal point if any."""
    if select is None:
        return None
    cls = select.is_a()
    if cls == "IfcMaterial":
        labels.extend(_material_labels(select))
    elif cls == "IfcMaterialList":
        for m in select.Materials or ():
            labels.extend(_material_labels(m))
    elif cls in ("IfcMaterialLayerSetUsage",):
        _walk(select.ForLayerSet, labels, profiles)
    elif cls == "IfcMaterialLayerSet":
        for layer in select.MaterialLayers or ():
            _walk(layer, labels, profiles)
    elif cls.startswith("IfcMaterialLayer"):
        if getattr(select, "Material", None) is not None:
            labels.extend(_material_labels(select.Material))
    elif cls.startswith("IfcMaterialProfileSetUsage"):
        _walk(select.ForProfileSet, labels, profiles)
        cp = getattr(select, "CardinalPoint", None)
        return int(cp) if cp is not None else None
    elif cls == "IfcMaterialProfileSet":
        for mp in select.MaterialProfiles or ():
            _walk(mp, labels, profiles)
        if not labels and getattr(select, "Name", None):
            labels.append(select.Name)
    elif cls.startswith("IfcMaterialProfile"):
        if getattr(select, "Material", None) is not None:
            labels.extend(_material_labels(select.Material))
        if getattr(select, "Profile", None) is not None:
            profiles.append(select.Profile)
    elif cls == "IfcMaterialConstituentSet":
        for c in select.MaterialConstituents or ():
            _walk(c, labels, profiles)
    elif cls == "IfcMaterialConstituent":
        if select.Material is not None:
            labels.extend(_material_labels(select.Material))
    return None


def _read_select(select, index) -> tuple[tuple[str, ...], tuple, int | None]:
    """(labels, profiles, cardinal point) of a material select, cached per entity; a usage's
    profile set is cached on its own, so usages that share a set cost two attribute reads."""
    key = select.id()
    hit = index.material_cache.get(key)
    if hit is not None:
        return hit
    if select.is_a().startswith("IfcMaterialProfileSetUsage"):
        labels, profiles, _ = _read_select(arg(select, 0), index)  # ForProfileSet
        cp = arg(select, 1)  # CardinalPoint
        hit = (labels, profiles, int(cp) if cp is not None else None)
    else:
        labels_l: list[str] = []
        profiles_l: list = []
        cardinal = _walk(select, labels_l, profiles_l)
        seen: set[str] = set()
        labels = tuple(x for x in labels_l if x and isinstance(x, str) and not (x in seen or seen.add(x)))
        hit = (labels, tuple(profiles_l), cardinal)
    index.material_cache[key] = hit
    return hit


def material_info(element, index) -> MaterialInfo:
    """The element's material information (its own association first, then its type's)."""
    labels: tuple[str, ...] = ()
    profiles: tuple = ()
    cardinal = None
    own = index.material.get(element.id())
    from_type = False
    if own is not None:
        labels, profiles, cardinal = _read_select(own, index)
    if not labels or not profiles:
        t = index.element_type(element)
        type_mat = index.material.get(t.id()) if t is not None else None
        if type_mat is not None:
            tl, tp, _ = _read_select(type_mat, index)
            if not labels:
                labels, from_type = tl, True
            if not profiles:
                profiles = tp
    if own is None and not (labels or profiles or from_type):
        return _NO_MATERIAL
    profile = profiles[0] if profiles and len({p.id() for p in profiles}) == 1 else None
    return MaterialInfo(labels, profile, cardinal, from_type, found=own is not None or bool(labels))


def _looks_non_steel(labels) -> bool:
    """A label that does not say steel but names concrete, timber, masonry, ...: words of five
    letters or more match anywhere (exporters run words together: 'StructuralTimber'), shorter
    ones ('LVL', 'OAK') only as whole words."""
    text = " ".join(labels).upper()
    if "STEEL" in text:
        return False
    words = set(re.findall(r"[A-Z]+", text))
    return any((w in text) if len(w) >= 5 else (w in words) for w in NON_STEEL_WORDS)


class SteelResolver:
    """Material labels → :class:`Steel`, with the configured default and an explicit map.

    ``mapping``: material label (case-insensitive, exact) → grade label, from the config, for
    names no table knows (e.g. ``"Metal - Steel - 345 MPa" = "A992"``).
    Returns ``(steel, problem)``: ``problem`` is ``None`` when a grade was found, else a
    sentence for the member's warning.
    """

    def __init__(self, default_label: str = "default", mapping: dict[str, str] | None = None) -> None:
        self.mapping = {k.strip().upper(): v for k, v in (mapping or {}).items()}
        default = lookup_steel(default_label) or lookup_steel("default")
        if default is None:  # the table lost its default row: keep going on S235 values
            default = Steel("default", 235.0, 360.0, "assumed (steel_grades.toml has no default row)")
        self.default = default
        self.default_label = default_label
        self._cache: dict[tuple[str, ...], tuple[Steel | None, str | None]] = {}

    def resolve(self, labels: tuple[str, ...]) -> tuple[Steel | None, str | None]:
        hit = self._cache.get(labels)
        if hit is not None:
            return hit
        result = self._resolve(labels)
        self._cache[labels] = result
        return result

    def _resolve(self, labels):
        for label in labels:
            mapped = self.mapping.get(label.strip().upper())
            if mapped:
                steel = lookup_steel(mapped)
                if steel is not None:
                    return steel, None
        for label in labels:
            steel = lookup_steel(label)
            if steel is not None and steel.grade != "default":
                return steel, None
        if not labels:
            return self.default, (
                f"no material is associated; steel grade {self.default.grade!r} assumed "
                f"(fy {self.default.fy:g}, fu {self.default.fu:g} MPa)"
            )
        if _looks_non_steel(labels):
            return None, f"material {labels[0]!r} is not steel; no steel grade"
        return self.default, (
            f"material {' / '.join(labels)!r} names no known steel grade; "
            f"{self.default.grade!r} assumed (fy {self.default.fy:g}, fu {self.default.fu:g} MPa)"
        )
