"""IfcBeam, IfcColumn and IfcMember → :class:`engine.model.Member` (mm, world).

Per element: the axis and web direction (:mod:`ifc_io.read_axes`), the section (parametric profile
of an IFC4 material profile set usage or of the body; else the profile's name, then the type's
name, ObjectType and Name, through :func:`rules.catalog.lookup_section`; else ``unknown`` with a
warning), the steel grade (:class:`ifc_io.read_materials.SteelResolver`), storey, name, tag,
predefined type, cardinal point and requested properties. A problem with one element becomes a
warning carrying its GlobalId; an element whose axis cannot be found, or is of zero length, is
skipped with a warning.

Roles (:func:`member_role`):

* IfcBeam (and subtypes) → ``beam``; IfcColumn → ``column``, whatever their orientation.
* IfcMember by predefined type (the occurrence's, else its type's): BRACE, STRUT, TIEBAR and the
  cable types → ``brace``; POST, STUD → ``column``; PURLIN, RAFTER, STRINGER, CHORD, COLLAR,
  JOIST → ``beam``.
* Any other IfcMember by its axis: within 10° of horizontal → ``beam``; within 10° of vertical →
  ``other`` (a vertical member not declared a post, e.g. a hanger or mullion: not given the column
  role); otherwise → ``brace``.
"""

from __future__ import annotations

import math
from typing import Callable

from engine.background import BackgroundTask, can_fork
from ifc_io.read_relations import elements_once
from engine.model import Member, Section
from ifc_io.read_axes import member_axis, read_geometry, tessellated_axis
from ifc_io.read_geometry import MAX_COORDINATE_MM, arg, arg_unchecked, text_value
from ifc_io.read_materials import material_info
from ifc_io.read_profiles import cardinal_offset, profile_name, section_from_profile
from rules.catalog import lookup_section

__all__ = ["member_role", "read_members", "MIN_AXIS_LENGTH_MM", "ROLE_ANGLE_DEG", "AXIS_OFF_BODY_MM",
           "MAX_COORDINATE_MM", "MAX_AXIS_LENGTH_MM"]

MIN_AXIS_LENGTH_MM = 0.01
"""An axis shorter than this is zero-length: the member is skipped with a warning."""
ROLE_ANGLE_DEG = 10.0
"""An untyped IfcMember within this angle of horizontal is a beam, of vertical ``other``."""
AXIS_OFF_BODY_MM = 10.0
"""An Axis farther than this outside the body's section box gets a warning (it is still used)."""
MAX_AXIS_LENGTH_MM = 1e6
"""A member axis longer than this (1 km) is a modelling or unit error: skipped with a warning."""

_BRACE_TYPES = {"BRACE", "STRUT", "TIEBAR", "STAY_CABLE", "SUSPENSION_CABLE", "SUSPENDER", "CABLE"}
_COLUMN_TYPES = {"POST", "STUD"}
_BEAM_TYPES = {"PURLIN", "RAFTER", "STRINGER", "CHORD", "COLLAR", "JOIST"}
_ARBITRARY = ("IfcArbitraryClosedProfileDef", "IfcArbitraryProfileDefWithVoids", "IfcArbitraryOpenProfileDef")


def member_role(ifc_class_of, predefined_type: str, start, end) -> str:
    """The member's role (see the module docstring). ``ifc_class_of(name)`` answers whether the
    element is of an IFC class (an entity's ``is_a``)."""
    if ifc_class_of("IfcBeam"):
        return "beam"
    if ifc_class_of("IfcColumn"):
        return "column"
    p = (predefined_type or "").upper()
    if p in _BRACE_TYPES:
        return "brace"
    if p in _COLUMN_TYPES:
        return "column"
    if p in _BEAM_TYPES:
        return "beam"
    length = math.dist(start, end)
    if length == 0:
        return "other"
    elevation = math.degrees(math.asin(min(1.0, abs(float(end[2]) - float(start[2])) / length)))
    if elevation <= ROLE_ANGLE_DEG:
        return "beam"
    if elevation >= 90.0 - ROLE_ANGLE_DEG:
        return "other"
    return "brace"


def _predefined(el, index, attribute_at=None) -> str:
    """The occurrence's PredefinedType, else its type's; USERDEFINED gives the ObjectType.
    ``attribute_at(el, name)``: a faster reader of the occurrence's attribute (same result as
    ``getattr(el, name, None)``)."""
    p = attribute_at(el, "PredefinedType") if attribute_at is not None else getattr(el, "PredefinedType", None)
    if p in (None, "NOTDEFINED", "USERDEFINED"):
        t = index.element_type(el)
        tp = getattr(t, "PredefinedType", None) if t is not None else None
        if tp not in (None, "NOTDEFINED", "USERDEFINED"):
            return str(tp)
        if p == "USERDEFINED":
            return str(getattr(el, "ObjectType", None) or p)
    return str(p) if p else ""


def _name_candidates(el, index, profile) -> list[str]:
    """Strings that may name the section, most specific first, split on ':' and '|'."""
    raw = []
    if profile is not None:
        raw.append(profile_name(profile))
    t = index.element_type(el)
    if t is not None:
        raw.append(text_value(t.Name))
    raw.extend([text_value(getattr(el, "ObjectType", None)), text_value(el.Name)])
    out: list[str] = []
    for s in raw:
        s = (s or "").strip()
        if not s:
            continue
        for c in [s, *[p.strip() for p in s.replace("|", ":").split(":")]]:
            if c and c not in out:
                out.append(c)
    return out


class _MemberCaches:
    """Per-read caches: the section of each parametric profile (by entity id) and the position
    of a named attribute in each IFC class (the attribute order is fixed per class and schema,
    and one read is one schema)."""

    def __init__(self, ctx):
        self.ctx = ctx
        self.by_profile: dict[int, Section | None] = {}
        self._positions: dict[tuple[str, str], int | None] = {}

    def parametric(self, profile) -> Section | None:
        key = profile.id()
        if key not in self.by_profile:
            self.by_profile[key] = section_from_profile(profile, self.ctx.mm)
        return self.by_profile[key]

    def attribute(self, el, name: str):
        """``getattr(el, name, None)`` for an explicit attribute, read by position (IfcOpenShell's
        attribute lookup by name costs several positional reads)."""
        key = (el.is_a(), name)
        try:
            i = self._positions[key]
        except KeyError:  # where IfcOpenShell's __getattr__ reads it from: forward attributes (1)
            i = self._positions[key] = el.get_argument_index(name) if el.get_attribute_category(name) == 1 else None
        if i is None:  # not an explicit attribute of this class: IfcOpenShell's own lookup
            return getattr(el, name, None)
        return arg_unchecked(el, i)


def _section(el, info, geom, cache: _MemberCaches, ctx) -> tuple[Section, object | None, str | None]:
    """(section, profile used, problem sentence or None)."""
    profile = info.profile
    if profile is None and geom.solid is not None:
        profile = geom.solid.profile
    if profile is not None:
        sec = cache.parametric(profile)
        if sec is not None:
            return sec, profile, None
    for name in _name_candidates(el, ctx.index, profile):
        sec = lookup_section(name)
        if sec is not None:
            return sec, profile, None
    pname = profile_name(profile) if profile is not None else ""
    what = f"profile {pname!r} ({profile.is_a()})" if profile is not None else "no profile"
    return (Section(name=pname or "", kind="unknown", source="unknown"), profile,
            f"section unknown: {what} is not parametric and no name of it is in the section catalog")


def _is_arbitrary(profile) -> bool:
    return profile is not None and profile.is_a() in _ARBITRARY


def _web_along_profile_x(profile, section: Section, ctx) -> bool:
    """For an arbitrary outline: does the catalog section's depth run along the outline's x?"""
    if not _is_arbitrary(profile) or section.kind not in ("I", "channel", "tee"):
        return False
    bbox = ctx.bbox(profile)
    if bbox is None or section.depth is None or section.width is None:
        return False
    ex, ey = (bbox[2] - bbox[0]) * ctx.mm, (bbox[3] - bbox[1]) * ctx.mm
    as_is = abs(ey - section.depth) + abs(ex - section.width)
    swapped = abs(ex - section.depth) + abs(ey - section.width)
    return swapped + 1e-6 < as_is


def _profile_centre(profile, ctx) -> tuple[float, float]:
    if not _is_arbitrary(profile):
        return (0.0, 0.0)
    bbox = ctx.bbox(profile)
    if bbox is None:
        return (0.0, 0.0)
    return ((bbox[0] + bbox[2]) / 2, (bbox[1] + bbox[3]) / 2)


def _vec(v, scale: float = 1.0) -> tuple[float, float, float]:
    return (float(v[0]) * scale, float(v[1]) * scale, float(v[2]) * scale)


def _finite_within(values) -> bool:
    """Are all ``values`` finite and within :data:`MAX_COORDINATE_MM` of zero?"""
    isfinite = math.isfinite
    for c in values:
        if not (isfinite(c) and abs(c) <= MAX_COORDINATE_MM):
            return False
    return True


PARALLEL_MIN = 4000  # elements: below this, a second process costs more than it saves


def read_members(ctx, steel_resolver, properties: tuple[str, ...] = ()) -> list[Member]:
    """Every IfcBeam, IfcColumn and IfcMember with a usable axis (warnings go to ``ctx``).

    On a large model where :mod:`engine.background` forks, two child processes read the two halves
    of the elements at once and return their members and warnings: the same, in the same order, as
    one process reading them all. The short-lived objects of reading (IfcOpenShell's entity
    wrappers, intermediate geometry) then live and die in the children, so this process keeps only
    the members. If a child fails, this process reads its half itself."""
    elements = list(elements_once(ctx.index, ("IfcBeam", "IfcColumn", "IfcMember")))
    if len(elements) < PARALLEL_MIN or not can_fork():
        return _read_some(elements, ctx, steel_resolver, properties)
    before = len(ctx.warnings)
    cut = len(elements) // 2
    halves = (elements[:cut], elements[cut:])

    def _reader(part: list) -> Callable[[], tuple[list[Member], list]]:
        def _read() -> tuple[list[Member], list]:
            found = _read_some(part, ctx, steel_resolver, properties)
            return found, ctx.warnings[before:]
        return _read

    tasks = [BackgroundTask(_reader(part), returns=True) for part in halves]
    members: list[Member] = []
    for part, task in zip(halves, tasks):
        try:
            found, warned = task.join()
        except Exception:  # the child could not finish (out of memory, killed): read its half here
            found = _read_some(part, ctx, steel_resolver, properties)
        else:
            ctx.warnings.extend(warned)
        members += found
    return members


def _read_some(elements: list, ctx, steel_resolver, properties: tuple[str, ...]) -> list[Member]:
    members: list[Member] = []
    cache = _MemberCaches(ctx)
    for el in elements:
        try:
            m = _read_member(el, ctx, cache, steel_resolver, properties)
        except Exception as exc:  # one bad element never stops the read
            ctx.warn(f"{el.is_a()} could not be read ({type(exc).__name__}: {exc}); skipped",
                     getattr(el, "GlobalId", None))
            continue
        if m is not None:
            members.append(m)
    return members


def _read_member(el, ctx, cache, steel_resolver, properties) -> Member | None:
    # IfcElement attributes by position (the same in IFC2X3, IFC4, IFC4X3): GlobalId 0, Name 2, Tag 7
    get = arg_unchecked  # ``el`` comes from by_type: never None
    gid = text_value(get(el, 0))
    cls = el.is_a()
    name, tag = text_value(get(el, 2)), text_value(get(el, 7))
    label = tag or name
    who = f"{cls} {label!r}" if label else cls
    if not gid.strip():
        ctx.warn(f"{who} (#{el.id()}) has no GlobalId; member skipped (repair the model)", None)
        return None
    index = ctx.index
    try:
        geom = read_geometry(el, index, ctx.resolver)
    except ValueError as exc:  # an unresolvable placement
        ctx.warn(f"{who}: {exc}; member skipped", gid)
        return None
    info = material_info(el, index)
    section, profile, problem = _section(el, info, geom, cache, ctx)
    if problem:
        ctx.warn(f"{who}: {problem}", gid)
    if _is_arbitrary(profile):
        swap = _web_along_profile_x(profile, section, ctx)
        centre = _profile_centre(profile, ctx)
    else:
        swap, centre = False, (0.0, 0.0)
    card = None
    if info.cardinal_point is not None and section.width is not None and section.depth is not None:
        card = cardinal_offset(info.cardinal_point, section.width / ctx.mm, section.depth / ctx.mm)
    axis = member_axis(geom, profile_centre=centre, swap_web=swap, cardinal_offset=card)
    scale = ctx.mm
    if axis is None and geom.has_body:
        axis = tessellated_axis(ctx.model, el)
        if axis is not None:
            scale = 1000.0  # the kernel returns metres
    if axis is None:
        why = "it has no representation" if arg(el, 6) is None and not geom.has_body else (
            "no Axis curve, swept solid or body vertices give one")
        ctx.warn(f"{who}: axis not found ({why}); member skipped", gid)
        return None
    if axis.note:
        ctx.warn(f"{who}: {axis.note}", gid)
    start, end = _vec(axis.start, scale), _vec(axis.end, scale)
    if not _finite_within(start + end):
        ctx.warn(f"{who}: axis end coordinates are not finite or lie more than {MAX_COORDINATE_MM:g} mm "
                 f"from the origin (corrupt placement or geometry); member skipped", gid)
        return None
    length = math.dist(start, end)
    if length > MAX_AXIS_LENGTH_MM:
        ctx.warn(f"{who}: axis is {length / 1e6:.3g} km long, longer than any building member "
                 f"(a modelling or unit error); member skipped", gid)
        return None
    if length < MIN_AXIS_LENGTH_MM:
        ctx.warn(f"{who}: zero-length axis at {tuple(round(c, 1) for c in start)} mm; member skipped", gid)
        return None
    predefined = _predefined(el, index, cache.attribute)
    role = member_role(el.is_a, predefined, start, end)
    steel, steel_problem = steel_resolver.resolve(info.labels)
    if steel_problem:
        ctx.warn(f"{who}: {steel_problem}", gid)
    offset = None
    if axis.axis_offset is not None:
        offset = tuple([round(float(v) * scale, 3) + 0.0 for v in axis.axis_offset])
        if not _finite_within(offset):
            ctx.warn(f"{who}: the offset of its axis from the body is not finite or lies more than "
                     f"{MAX_COORDINATE_MM:g} mm away (corrupt placement or geometry); member skipped", gid)
            return None
        if (axis.source == "axis" and geom.solid is not None and section.width and section.depth
                and (abs(offset[0]) > section.width / 2 + AXIS_OFF_BODY_MM
                     or abs(offset[1]) > section.depth / 2 + AXIS_OFF_BODY_MM)):
            ctx.warn(f"{who}: its Axis representation lies outside the body's section "
                     f"(offset {offset[0]:.0f}, {offset[1]:.0f} mm from the profile centre); "
                     f"the Axis is used as modelled", gid)
    props: dict[str, object] = {}
    for dotted in properties:
        pset, _, prop = dotted.partition(".")
        if pset and prop:
            v = index.property_value(el, pset, prop)
            if v is not None:
                props[dotted] = v
    storey = index.storey_name(el)
    web_dir = None
    if axis.web_dir is not None:
        web_dir = _vec(axis.web_dir)
        if not all(map(math.isfinite, web_dir)):
            web_dir = None
    return Member(
        global_id=gid,
        ifc_class=cls,
        role=role,
        start=start,
        end=end,
        section=section,
        steel=steel,
        name=name,
        tag=tag,
        storey=storey,
        predefined_type=predefined,
        web_dir=web_dir,
        cardinal_point=info.cardinal_point,
        axis_offset=offset,
        axis_source=axis.source,
        properties=props,
    )
