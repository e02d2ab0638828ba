"""Contributors: read the house rules at the top of DEVELOPERS.md before writing code.

Plain data types shared by every stage of joint-audit (DESIGN.md §3).

Internal units everywhere: **mm, N, N·mm, MPa** (and mm², mm⁴ for section properties). Field names
carry their unit only when it is not one of these. Readers convert at the boundary; reports convert
for display (kN, kN·m).

Everything here is a frozen dataclass of plain Python values (floats, strings, tuples, small dicts),
so the mechanics and rule sets run and test without a model and without ifcopenshell.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Literal, Mapping

__all__ = [
    "Vec3",
    "ROLES",
    "SECTION_KINDS",
    "JOINT_KINDS",
    "STATUSES",
    "DataWarning",
    "Section",
    "Steel",
    "Member",
    "Bearing",
    "ConnectionPart",
    "ExplicitConnection",
    "Frame",
    "Cope",
    "JointGeometry",
    "Joint",
    "Demand",
    "BoltSpec",
    "Weld",
    "FinPlate",
    "Check",
    "JointResult",
    "joint_id",
]

Vec3 = tuple[float, float, float]
"""A point or direction in world coordinates, mm for points, unit length for directions."""

Role = Literal["beam", "column", "brace", "other"]
ROLES: tuple[str, ...] = ("beam", "column", "brace", "other")

SectionKind = Literal["I", "channel", "angle", "tee", "RHS", "CHS", "other", "unknown"]
SECTION_KINDS: tuple[str, ...] = ("I", "channel", "angle", "tee", "RHS", "CHS", "other", "unknown")

JointKind = Literal[
    "column-flange", "column-web", "beam-web", "beam-over", "wall", "free-end", "splice", "unknown"
]
JOINT_KINDS: tuple[str, ...] = (
    "column-flange", "column-web", "beam-web", "beam-over", "wall", "free-end", "splice", "unknown",
)

Status = Literal["pass", "fail", "needs-design", "incomplete", "not-checked"]
STATUSES: tuple[str, ...] = ("pass", "fail", "needs-design", "incomplete", "not-checked")


@dataclass(frozen=True)
class DataWarning:
    """A problem with one element or one input that did not stop the run.

    ``global_id`` is the IFC GlobalId of the element concerned, or ``None`` for a model-wide problem.
    """

    message: str
    global_id: str | None = None
    stage: str = "read"

    def __str__(self) -> str:
        return f"{self.global_id}: {self.message}" if self.global_id else self.message


@dataclass(frozen=True)
class Section:
    """A member cross-section. Dimensions in mm, area in mm², second moments in mm⁴.

    ``kind`` is one of :data:`SECTION_KINDS`. For an I or channel, ``depth`` is the overall depth,
    ``width`` the flange width, ``web_thickness``/``flange_thickness`` the plate thicknesses and
    ``root_radius`` the web-flange fillet. Hollow sections use ``depth``/``width``/``web_thickness``
    for height, width and wall thickness (CHS: ``depth`` = outside diameter). Unknown values are
    ``None``. ``source`` is ``"ifc-parametric"``, ``"catalog:<table>"`` or ``"unknown"``.
    """

    name: str
    kind: str = "unknown"
    depth: float | None = None
    width: float | None = None
    web_thickness: float | None = None
    flange_thickness: float | None = None
    root_radius: float | None = None
    area: float | None = None
    I_major: float | None = None
    I_minor: float | None = None
    source: str = "unknown"

    @property
    def known(self) -> bool:
        """True when the section's kind and overall depth are known."""
        return self.kind != "unknown" and self.depth is not None

    @property
    def clear_web_depth(self) -> float | None:
        """Depth between flanges less root radii (mm), for an I or channel; else ``None``."""
        if self.kind not in ("I", "channel") or None in (self.depth, self.flange_thickness):
            return None
        r = self.root_radius or 0.0
        return self.depth - 2.0 * self.flange_thickness - 2.0 * r  # type: ignore[operator]

    @property
    def mass_per_m_kg(self) -> float | None:
        """Mass per metre (kg/m) from the area and steel density 7850 kg/m³ (common practice)."""
        return None if self.area is None else self.area * 7850e-6


@dataclass(frozen=True)
class Steel:
    """A steel material: grade label as the standard names it, yield and tensile strength in MPa.

    ``fy``/``fu`` are the values for the thickness the table was read at (see ``source``); rule sets
    that make strength thickness-dependent look the grade up again for the plate in question.
    """

    grade: str
    fy: float
    fu: float
    source: str = "default"


@dataclass(frozen=True, slots=True)
class Member:
    """A linear structural member read from the model.

    ``start``/``end`` are the world coordinates (mm) of the member's axis as modelled (the reference
    line the ``Axis`` representation or the swept solid gives). ``web_dir`` is the world direction of
    the section's local y axis (along the web of an I section, usually vertical for a beam), or
    ``None`` when the model does not tell. ``axis_offset`` is where the axis sits relative to the
    section's centroid, in the section's local (x, y) in mm, when the model tells (cardinal point or
    profile offset); ``None`` if unknown. ``axis_source`` says where the axis came from:
    ``"axis"``, ``"body"`` or ``"placement"``.
    """

    global_id: str
    ifc_class: str
    role: str
    start: Vec3
    end: Vec3
    section: Section
    steel: Steel | None = None
    name: str = ""
    tag: str = ""
    storey: str = ""
    predefined_type: str = ""
    web_dir: Vec3 | None = None
    cardinal_point: int | None = None
    axis_offset: tuple[float, float] | None = None
    axis_source: str = "axis"
    properties: Mapping[str, object] = field(default_factory=dict)

    @property
    def length(self) -> float:
        """Axis length in mm."""
        return sum((b - a) ** 2 for a, b in zip(self.start, self.end)) ** 0.5

    @property
    def label(self) -> str:
        """A short human label: Tag, else Name, else GlobalId."""
        return self.tag or self.name or self.global_id


@dataclass(frozen=True)
class Bearing:
    """A non-steel element a beam can bear on or be embedded in (wall, slab, footing).

    ``bbox_min``/``bbox_max`` are the world axis-aligned bounds of its body in mm.
    """

    global_id: str
    ifc_class: str
    name: str
    bbox_min: Vec3
    bbox_max: Vec3
    storey: str = ""


@dataclass(frozen=True)
class ConnectionPart:
    """A modelled connection part (plate, bolt, other fastener, accessory, assembly), uninterpreted.

    ``kind`` is ``"plate"``, ``"bolt"``, ``"fastener"``, ``"accessory"`` or ``"assembly"``.
    ``origin`` and ``x_dir``/``y_dir``/``z_dir`` are the part's world placement (mm, unit vectors).
    ``dims`` holds key dimensions in mm as the model gives them (e.g. ``thickness``, ``width``,
    ``depth`` for a plate; ``length`` for a bolt). ``assembly`` is the GlobalId of the
    IfcElementAssembly it is part of, ``hosts`` the GlobalIds of members it is related to.
    ``properties`` holds the part's single-value properties as ``{"Pset.Property": value}`` (length
    measures in mm) for plates and non-bolt fasteners, where weld sizes and grades are often kept.
    """

    global_id: str
    ifc_class: str
    kind: str
    name: str = ""
    tag: str = ""
    predefined_type: str = ""
    origin: Vec3 = (0.0, 0.0, 0.0)
    x_dir: Vec3 = (1.0, 0.0, 0.0)
    y_dir: Vec3 = (0.0, 1.0, 0.0)
    z_dir: Vec3 = (0.0, 0.0, 1.0)
    dims: Mapping[str, float] = field(default_factory=dict)
    nominal_diameter: float | None = None
    nominal_length: float | None = None
    material: str = ""
    assembly: str | None = None
    hosts: tuple[str, ...] = ()
    storey: str = ""
    properties: Mapping[str, object] = field(default_factory=dict)


@dataclass(frozen=True)
class ExplicitConnection:
    """A connectivity relationship authored in the model between two elements.

    ``relating``/``related`` are GlobalIds; ``relating_end``/``related_end`` are ``"start"``,
    ``"end"``, ``"along"`` or ``""`` when the relationship does not say. ``source`` names the IFC
    relationship class (or ``"structural-analysis"`` for one derived from a linked analysis model).
    """

    relating: str
    related: str
    source: str
    relating_end: str = ""
    related_end: str = ""


@dataclass(frozen=True)
class Frame:
    """Everything the reader takes out of one model, in mm."""

    file: str
    schema: str
    length_unit: str
    mm_per_unit: float
    force_unit: str = "NEWTON"
    n_per_force_unit: float = 1.0
    members: tuple[Member, ...] = ()
    bearings: tuple[Bearing, ...] = ()
    parts: tuple[ConnectionPart, ...] = ()
    connections: tuple[ExplicitConnection, ...] = ()
    warnings: tuple[DataWarning, ...] = ()
    counts_by_class: Mapping[str, int] = field(default_factory=dict)
    reactions: Mapping[tuple[str, str], tuple[float, str]] = field(default_factory=dict)
    """End reactions from a linked structural analysis model: ``(beam GlobalId, "start" | "end")`` →
    ``(V in N, text naming the reaction and its load combination)``; empty when there is none."""


@dataclass(frozen=True, slots=True)
class Cope:
    """A cope (notch) of the supported beam's flange and web: ``where`` is ``"top"`` or ``"bottom"``;
    ``depth`` and ``length`` in mm."""

    where: str
    depth: float
    length: float


@dataclass(frozen=True, slots=True)
class JointGeometry:
    """Geometry of a joint, mm and degrees.

    ``angle_deg``: angle between the supported member's axis and the support's axis.
    ``gap``: distance from the beam end to the support face (negative when the end runs past it).
    ``tos_diff``: top of supported steel minus top of supporting steel (mm); ``copes``: the copes it
    requires. ``support_continuous``: whether the support runs on through the joint (column
    continuous past a floor, girder continuing either side), ``None`` if not known.
    ``back_to_back``: the id of the joint on the other side of the same support at the same point.
    ``location``: world point of the joint (mm).
    """

    location: Vec3
    angle_deg: float | None = None
    gap: float | None = None
    tos_diff: float | None = None
    copes: tuple[Cope, ...] = ()
    support_continuous: bool | None = None
    back_to_back: str | None = None


@dataclass(frozen=True, slots=True)
class Joint:
    """One end of a supported member and what supports it.

    ``id`` is stable across runs and revisions (:func:`joint_id`). ``end`` is ``"start"`` or
    ``"end"``. ``support`` is the supporting element's GlobalId or ``None`` (free end). ``kind`` is one
    of :data:`JOINT_KINDS`. ``stiffness`` is ``"stiff"`` or ``"flexible"``; ``reasons`` say why, in
    words a reviewer can check.
    """

    id: str
    beam: str
    end: str
    support: str | None
    kind: str
    geometry: JointGeometry
    stiffness: str = "flexible"
    reasons: tuple[str, ...] = ()
    source: str = "geometry"


@dataclass(frozen=True, slots=True)
class Demand:
    """Design actions at a joint: end shear ``V`` and tie/axial force ``N`` in N.

    ``source`` is ``"model"``, ``"schedule"``, ``"tributary"`` or ``"capacity-fraction"``;
    ``combination`` names the load combination (e.g. ``"1.2G + 1.5Q (AS/NZS 1170.0 4.2.2)"``).
    ``detail`` says where the numbers came from in words a reviewer can follow (the property, the
    schedule file and line, the take-down breakdown), ``""`` when nothing more is known.
    """

    V: float
    N: float = 0.0
    source: str = ""
    combination: str = ""
    detail: str = ""


@dataclass(frozen=True)
class BoltSpec:
    """Bolts of a connection: ``size`` as the trade writes it ("M20", "3/4"), ``diameter`` in mm,
    ``grade`` as the standard names it ("8.8", "A325"), ``hole`` (``"standard"``, ``"oversize"``,
    ``"short-slot"``, ``"long-slot"``) with ``hole_diameter`` in mm."""

    size: str
    diameter: float
    grade: str
    threads_in_shear_plane: bool = True
    hole: str = "standard"
    hole_diameter: float | None = None


@dataclass(frozen=True)
class Weld:
    """Fillet weld of plate to support: ``leg`` in mm, ``electrode`` as the standard names it
    ("E48XX", "E70XX", or a fu class), ``both_sides``."""

    leg: float
    electrode: str
    both_sides: bool = True


@dataclass(frozen=True)
class FinPlate:
    """A bolted single plate welded to the support and bolted to the beam web. mm throughout.

    Layout: ``rows`` bolts down each line at ``pitch``; ``lines`` vertical lines at ``gauge``.
    ``plate_end_edge``: vertical edge distance from top/bottom plate edge to the outer bolt;
    ``plate_side_edge``: horizontal edge distance from the plate's free edge to the outer line.
    ``beam_end_edge``: horizontal distance from the beam end to the nearest bolt line;
    ``beam_top_edge``: vertical distance from the top of the beam (or the cope) to the top bolt.
    ``a``: distance from the support face to the (first) bolt line; ``source``: ``"modelled"``,
    ``"scheduled"`` or ``"proposed"``.
    """

    thickness: float
    depth: float
    width: float
    steel: Steel
    bolts: BoltSpec
    rows: int
    lines: int
    pitch: float
    gauge: float
    plate_end_edge: float
    plate_side_edge: float
    beam_end_edge: float
    beam_top_edge: float
    a: float
    weld: Weld
    source: str = "modelled"

    @property
    def n_bolts(self) -> int:
        return self.rows * self.lines


@dataclass(frozen=True, slots=True)
class Check:
    """One design check: ``demand`` and ``capacity`` in ``unit`` (N, N·mm, mm, MPa or "-"),
    ``utilisation`` = demand / capacity (or the check's own ratio for detailing limits).

    ``incomplete`` marks a check whose inputs are missing or outside its validity range; it then
    does not pass, and ``note`` says what is missing and names the clause.
    """

    name: str
    clause: str
    demand: float
    capacity: float
    unit: str
    utilisation: float
    passed: bool
    note: str = ""
    incomplete: bool = False


@dataclass(frozen=True, slots=True)
class JointResult:
    """The outcome for one joint: ``status`` is one of :data:`STATUSES`; ``missing`` lists what data
    was missing when the status is ``"incomplete"``."""

    joint: Joint
    demand: Demand | None
    connection: FinPlate | None
    checks: tuple[Check, ...]
    governing: str | None
    utilisation: float | None
    status: str
    missing: tuple[str, ...] = ()
    note: str = ""


def joint_id(beam_global_id: str, end: str, support_global_id: str | None) -> str:
    """A joint id stable across runs and model revisions, derived only from the beam GlobalId, the
    end and the support GlobalId: ``"J-" + first 12 hex digits of sha1(beam|end|support)``."""
    import hashlib

    key = f"{beam_global_id}|{end}|{support_global_id or '-'}".encode()
    return "J-" + hashlib.sha1(key).hexdigest()[:12]
