"""Units of an IFC model, converted once, at the boundary.

The reader works in the model's own length unit while it walks placements and geometry and
multiplies by :func:`length_scale_to_mm`'s factor once per point it hands out, so every length that
leaves ``ifc_io`` is in mm. Forces are reported as a factor to newtons (the model's
``FORCEUNIT``), used by later stages that read forces from property sets.

Both work for IFC2X3, IFC4 and IFC4X3: the unit entities (``IfcSIUnit``,
``IfcConversionBasedUnit``, ``IfcMeasureWithUnit``) are the same in all three.

>>> SI_PREFIX["MILLI"]
0.001
"""

from __future__ import annotations

from dataclasses import dataclass

__all__ = [
    "SI_PREFIX",
    "Units",
    "find_unit",
    "unit_scale",
    "length_scale_to_mm",
    "force_scale_to_n",
    "read_units",
]

SI_PREFIX: dict[str, float] = {
    "EXA": 1e18, "PETA": 1e15, "TERA": 1e12, "GIGA": 1e9, "MEGA": 1e6, "KILO": 1e3,
    "HECTO": 1e2, "DECA": 1e1, "DECI": 1e-1, "CENTI": 1e-2, "MILLI": 1e-3, "MICRO": 1e-6,
    "NANO": 1e-9, "PICO": 1e-12, "FEMTO": 1e-15, "ATTO": 1e-18,
}
"""IfcSIPrefix → factor (ISO 80000-1)."""

# Conversion-based units by name, SI value of one unit, for files that name a unit but give no
# (or a broken) ConversionFactor. Exact by definition (international foot/inch = 0.3048/0.0254 m;
# US survey foot = 1200/3937 m; pound-force = 4.4482216152605 N; kip = 1000 lbf).
_KNOWN_CONVERSIONS: dict[str, float] = {
    "FOOT": 0.3048, "FEET": 0.3048, "FT": 0.3048, "INCH": 0.0254, "INCHES": 0.0254, "IN": 0.0254,
    "YARD": 0.9144, "MILE": 1609.344, "US SURVEY FOOT": 1200.0 / 3937.0,
    "POUND-FORCE": 4.4482216152605, "POUNDFORCE": 4.4482216152605, "LBF": 4.4482216152605,
    "KIP": 4448.2216152605, "KIPS": 4448.2216152605, "KILOPOUND-FORCE": 4448.2216152605,
}


@dataclass(frozen=True)
class Units:
    """The length and force units of a model.

    ``mm_per_unit``: millimetres per model length unit; ``n_per_force_unit``: newtons per model
    force unit. ``notes``: model-wide remarks (a unit absent and a default assumed), for warnings.
    """

    length_unit: str
    mm_per_unit: float
    force_unit: str
    n_per_force_unit: float
    notes: tuple[str, ...] = ()


def _unit_assignment(model):
    for project in model.by_type("IfcProject"):
        ua = getattr(project, "UnitsInContext", None)
        if ua is not None:
            return ua
    uas = model.by_type("IfcUnitAssignment")
    return uas[0] if uas else None


def find_unit(model, unit_type: str):
    """The unit entity of ``unit_type`` (e.g. ``"LENGTHUNIT"``) in the project's unit assignment,
    or ``None``."""
    ua = _unit_assignment(model)
    if ua is None:
        return None
    for unit in ua.Units or ():
        if getattr(unit, "UnitType", None) == unit_type:
            return unit
    return None


def unit_scale(unit) -> tuple[str, float]:
    """``(name, factor to the SI base unit)`` of an IfcSIUnit, IfcConversionBasedUnit or
    IfcDerivedUnit-free named unit.

    >>> # IfcSIUnit(*, .LENGTHUNIT., .MILLI., .METRE.) -> ("MILLIMETRE", 0.001)
    """
    if unit.is_a("IfcSIUnit"):
        prefix = unit.Prefix or ""
        return f"{prefix}{unit.Name}", SI_PREFIX.get(prefix, 1.0)
    if unit.is_a("IfcConversionBasedUnit"):
        name = (unit.Name or "").strip().upper()
        factor = None
        cf = unit.ConversionFactor
        if cf is not None:
            try:
                value = cf.ValueComponent
                value = float(getattr(value, "wrappedValue", value))
                _, inner = unit_scale(cf.UnitComponent)
                factor = value * inner
            except Exception:  # a malformed factor: fall back on the unit's name below
                factor = None
        if not factor or factor <= 0:
            factor = _KNOWN_CONVERSIONS.get(name)
        if not factor:
            raise ValueError(f"conversion-based unit {unit.Name!r} has no usable conversion factor")
        return name, factor
    raise ValueError(f"unit {unit.is_a()} is not supported")


def length_scale_to_mm(model) -> tuple[str, float]:
    """``(unit name, mm per unit)`` of the model's length unit, e.g. ``("MILLIMETRE", 1.0)``,
    ``("METRE", 1000.0)``, ``("FOOT", 304.8)``.

    A model without a length unit is taken to be in metres (the SI unit IFC falls back on, as
    IfcOpenShell does); :func:`read_units` notes it.
    """
    unit = find_unit(model, "LENGTHUNIT")
    if unit is None:
        return "METRE", 1000.0
    name, si = unit_scale(unit)
    return name, si * 1000.0


def force_scale_to_n(model) -> tuple[str, float]:
    """``(unit name, N per unit)`` of the model's force unit; ``("NEWTON", 1.0)`` when the model
    assigns none (the SI unit; :func:`read_units` notes it)."""
    unit = find_unit(model, "FORCEUNIT")
    if unit is None:
        return "NEWTON", 1.0
    return unit_scale(unit)


def read_units(model) -> Units:
    """Both units with notes on anything assumed. Raises ``ValueError`` for a length unit that
    cannot be converted (the reader turns it into a BadInputError)."""
    notes: list[str] = []
    if find_unit(model, "LENGTHUNIT") is None:
        notes.append("the model assigns no length unit; metres assumed (the SI unit)")
    length_unit, mm = length_scale_to_mm(model)
    try:
        if find_unit(model, "FORCEUNIT") is None:
            notes.append("the model assigns no force unit; newtons assumed (the SI unit)")
        force_unit, n = force_scale_to_n(model)
    except ValueError as exc:
        notes.append(f"force unit not understood ({exc}); newtons assumed")
        force_unit, n = "NEWTON", 1.0
    return Units(length_unit, mm, force_unit, n, tuple(notes))
