"""Read the steel frame of an IFC model into an :class:`engine.model.Frame` (mm, N).

>>> frame = read_frame("model.ifc")                                   # doctest: +SKIP
>>> frame = read_frame(open_model("model.ifc"), default_steel="S355")  # doctest: +SKIP

``read_frame`` reads IFC2X3, IFC4 and IFC4X3: units once (:mod:`ifc_io.units`), then members
(:mod:`ifc_io.read_members`), bearings (:mod:`ifc_io.read_bearings`) and connection parts
(:mod:`ifc_io.read_parts`). Problems with single elements become warnings (:class:`DataWarning`) with
their GlobalId; the reader never stops on one bad element and never tessellates geometry unless
nothing else gives a member's axis. ``Frame.connections`` is left empty (explicit connectivity
is read by :mod:`ifc_io.connectivity`).

An aid to a competent engineer: what the reader takes from a model (axes, sections, grades,
assumed defaults) must be checked, and the governing local code and licensed practice take
precedence.
"""

from __future__ import annotations

import os
from typing import Any

from engine.errors import BadInputError, UnsupportedSchemaError
from engine.model import Frame
from ifc_io.open import SUPPORTED_SCHEMAS, normalise_schema, open_model, parse_problems
from ifc_io.read_bearings import BEARING_CLASSES, read_bearings
from ifc_io.read_context import ReadContext
from ifc_io.read_materials import SteelResolver
from ifc_io.read_members import read_members
from ifc_io.read_parts import PART_CLASSES, read_parts
from ifc_io.read_relations import RelationIndex
from ifc_io.units import read_units

__all__ = ["read_frame", "COUNTED_CLASSES"]

COUNTED_CLASSES: tuple[str, ...] = (
    "IfcBeam", "IfcColumn", "IfcMember",
    *BEARING_CLASSES,
    *(c for c, _ in PART_CLASSES),
    "IfcStructuralCurveMember",
)
"""Classes whose instance counts (subtypes included, as ``by_type`` counts) go into
``Frame.counts_by_class``."""


def _default_grade(default_steel: str, config: dict | None) -> str:
    """The grade label to assume: an explicit ``default_steel``, else the config's
    ``materials.default_grade``, else the code's usual member grade, else the table's default."""
    if default_steel and default_steel != "default":
        return default_steel
    cfg = config or {}
    grade = (cfg.get("materials") or {}).get("default_grade") or ""
    if grade:
        return grade
    code = cfg.get("code")
    if code:
        try:
            from engine.config import DEFAULT_GRADE_BY_CODE

            return DEFAULT_GRADE_BY_CODE.get(code, "default")
        except ImportError:
            pass
    return "default"


def _requested_properties(config: dict | None) -> tuple[str, ...]:
    """'Pset.Property' names the config asks for on members (the demand's model shear keys and
    ``read.properties``)."""
    cfg = config or {}
    names: list[str] = []
    demand = cfg.get("demand") or {}
    for key in ("start_shear", "end_shear", "axial", "start_axial", "end_axial"):
        v = demand.get(key)
        if isinstance(v, str) and "." in v:
            names.append(v)
    for v in (cfg.get("read") or {}).get("properties", ()) or ():
        if isinstance(v, str) and "." in v:
            names.append(v)
    return tuple(dict.fromkeys(names))


def _file_name(model, fallback: str = "") -> str:
    try:
        return str(model.header.file_name.name) or fallback
    except Exception:
        return fallback


def read_frame(source: Any, *, default_steel: str = "default", config: dict | None = None) -> Frame:
    """Read a model (a path, or an already open ``ifcopenshell.file``) into a :class:`Frame`.

    ``default_steel``: the grade label assumed, with a warning, for a member whose material names
    no known steel grade (``"default"``: the config's ``materials.default_grade``, else the usual
    grade of the config's ``code``, else the table's conservative default). ``config``: the audit
    configuration (only ``materials``, ``code`` and the demand's property names are read here;
    ``materials.map``, if present, maps material labels to grade labels).

    Raises :class:`BadInputError` / :class:`UnsupportedSchemaError` for a file that cannot be
    read at all; everything wrong with single elements is a warning.
    """
    if isinstance(source, (str, os.PathLike)):
        model = open_model(source)
        file = os.fspath(source)
    elif hasattr(source, "by_type") and hasattr(source, "schema"):
        model = source
        file = _file_name(model)
    else:
        raise BadInputError(f"read_frame needs a path or an ifcopenshell.file, not {type(source).__name__}")
    schema = normalise_schema(getattr(model, "schema_identifier", None) or model.schema)
    if schema is None:
        raise UnsupportedSchemaError(
            f"model schema {model.schema!r} is not read; joint-audit reads {', '.join(SUPPORTED_SCHEMAS)}"
        )
    try:
        units = read_units(model)
    except ValueError as exc:
        raise BadInputError(f"{file or 'the model'}: its length unit cannot be converted to mm ({exc})") from exc
    except (AttributeError, TypeError) as exc:  # a damaged file: units that are not unit entities
        raise BadInputError(f"{file or 'the model'}: its unit assignment is malformed ({exc}); repair the "
                            f"model or export it again") from exc

    properties = _requested_properties(config)
    ctx = ReadContext(model=model, mm=units.mm_per_unit, index=RelationIndex(model, with_properties=bool(properties)))
    problems = parse_problems(model)
    if problems:
        shown = "; ".join(problems[:3]) + ("; ..." if len(problems) > 3 else "")
        ctx.warn(f"the file is damaged: IfcOpenShell reported {len(problems)} problem(s) while parsing it "
                 f"({shown}); what uses the damaged data is read as far as possible or skipped: check "
                 f"those elements, or repair or export the model again")
    for note in units.notes:
        ctx.warn(note)
    mapping = ((config or {}).get("materials") or {}).get("map") or {}
    steel = SteelResolver(_default_grade(default_steel, config), mapping if isinstance(mapping, dict) else {})
    if steel.default.grade == "default" and _default_grade(default_steel, config) not in ("default", ""):
        ctx.warn(f"default steel grade {_default_grade(default_steel, config)!r} is not in the grade "
                 f"table; the table's default (fy {steel.default.fy:g} MPa) is used instead")

    members = read_members(ctx, steel, properties)
    bearings = read_bearings(ctx)
    parts = read_parts(ctx)

    counts: dict[str, int] = {}
    for cls in COUNTED_CLASSES:
        try:
            counts[cls] = len(ctx.index.by_type(cls))
        except RuntimeError:
            continue
    if not members and counts.get("IfcStructuralCurveMember"):
        ctx.warn(f"the model has no physical members (IfcBeam, IfcColumn, IfcMember) but "
                 f"{counts['IfcStructuralCurveMember']} IfcStructuralCurveMember: it is an analysis "
                 f"model; nothing to audit")
    elif not any(m.role == "beam" for m in members):
        ctx.warn("the model has no beams joint-audit can read (no IfcBeam, or IfcMember used as a beam, "
                 "with an axis): there are no beam-end joints to audit")

    return Frame(
        file=file,
        schema=schema,
        length_unit=units.length_unit,
        mm_per_unit=units.mm_per_unit,
        force_unit=units.force_unit,
        n_per_force_unit=units.n_per_force_unit,
        members=tuple(members),
        bearings=tuple(bearings),
        parts=tuple(parts),
        connections=(),
        warnings=tuple(ctx.warnings),
        counts_by_class=counts,
    )
