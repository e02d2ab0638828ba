"""Read the connectivity relations authored in an IFC model, for the joint finder to use first.

Read, for IFC2X3, IFC4 and IFC4X3:

- ``IfcRelConnectsElements`` (and subtypes not listed below): RelatingElement ↔ RelatedElement,
  end not stated (``""``);
- ``IfcRelConnectsPathElements``: as above, with RelatingConnectionType / RelatedConnectionType
  (IfcConnectionTypeEnum) ``ATSTART`` → ``"start"``, ``ATEND`` → ``"end"``, ``ATPATH`` → ``"along"``,
  ``NOTDEFINED`` → ``""``;
- ``IfcRelConnectsStructuralMember`` of a linked analysis model: structural members meeting at one
  IfcStructuralConnection are connected; each structural member is mapped to the physical element it
  represents through ``IfcRelAssignsToProduct`` (either direction is accepted: the physical element as
  RelatingProduct with the structural member among RelatedObjects, or the reverse). The end is found
  by comparing the connection's vertex with the member edge's start and end vertices (by entity, else
  by coordinates within 1 mm); otherwise ``"along"``. Structural members not linked to a physical
  element are counted in one warning, not used.

Per-relation problems become :class:`~engine.model.DataWarning` records, never exceptions. Only
GlobalIds and end words leave this module; the engine decides what the relations mean.

An aid to a competent engineer: results must be checked, and the governing local code and licensed
practice take precedence.
"""

from __future__ import annotations

from collections import defaultdict
from itertools import combinations

import ifcopenshell

from engine.model import DataWarning, ExplicitConnection

__all__ = ["read_explicit_connections", "CONNECTION_TYPE_ENDS"]

CONNECTION_TYPE_ENDS = {"ATSTART": "start", "ATEND": "end", "ATPATH": "along", "NOTDEFINED": ""}
_STRUCTURAL = "structural-analysis"


def _by_type(model: ifcopenshell.file, cls: str) -> list:
    try:
        return list(model.by_type(cls))
    except RuntimeError:  # class not in this schema
        return []


def _gid(el) -> str | None:
    return getattr(el, "GlobalId", None) if el is not None else None


def _length_scale_mm(model: ifcopenshell.file) -> float:
    try:
        import ifcopenshell.util.unit as uu
        return float(uu.calculate_unit_scale(model)) * 1000.0
    except Exception:  # noqa: BLE001 - a model without units: assume mm, vertex matching only
        return 1.0


def read_explicit_connections(model: ifcopenshell.file) -> tuple[list[ExplicitConnection], list[DataWarning]]:
    """Connectivity relations of ``model`` as :class:`ExplicitConnection` records (see module doc).

    Returns the connections (deduplicated, in file order) and the data warnings.
    """
    out: list[ExplicitConnection] = []
    warnings: list[DataWarning] = []
    seen: set[tuple] = set()

    def emit(c: ExplicitConnection) -> None:
        key = (c.relating, c.related, c.relating_end, c.related_end, c.source)
        if key not in seen:
            seen.add(key)
            out.append(c)

    for rel in _by_type(model, "IfcRelConnectsElements"):
        a, b = _gid(rel.RelatingElement), _gid(rel.RelatedElement)
        if not a or not b:
            warnings.append(DataWarning(f"{rel.is_a()} #{rel.id()} lacks one of its elements; ignored",
                                        _gid(rel), "connectivity"))
            continue
        ea = eb = ""
        if rel.is_a("IfcRelConnectsPathElements"):
            ta, tb = str(rel.RelatingConnectionType or ""), str(rel.RelatedConnectionType or "")
            ea, eb = CONNECTION_TYPE_ENDS.get(ta, ""), CONNECTION_TYPE_ENDS.get(tb, "")
            for t in (ta, tb):
                if t and t not in CONNECTION_TYPE_ENDS:
                    warnings.append(DataWarning(f"{rel.is_a()} #{rel.id()}: connection type {t!r} not "
                                                "known; end left unstated", _gid(rel), "connectivity"))
        emit(ExplicitConnection(a, b, rel.is_a(), ea, eb))

    s_out, s_warn = _structural(model)
    for c in s_out:
        emit(c)
    warnings += s_warn
    return out, warnings


def _physical_links(model: ifcopenshell.file) -> dict[int, list[str]]:
    """Structural item id → GlobalIds of the physical elements it represents."""
    links: dict[int, list[str]] = defaultdict(list)
    for rel in _by_type(model, "IfcRelAssignsToProduct"):
        prod = rel.RelatingProduct
        objs = list(rel.RelatedObjects or [])
        if prod is None:
            continue
        if prod.is_a("IfcStructuralItem"):
            for o in objs:
                if o.is_a("IfcElement") and _gid(o):
                    links[prod.id()].append(o.GlobalId)
        elif prod.is_a("IfcElement"):
            for o in objs:
                if o.is_a("IfcStructuralItem"):
                    links[o.id()].append(prod.GlobalId)
    return links


def _edge_vertices(member) -> tuple[object, object] | None:
    rep = getattr(member, "Representation", None)
    for r in (rep.Representations if rep else []) or []:
        for item in r.Items or []:
            if item.is_a("IfcEdge"):
                return item.EdgeStart, item.EdgeEnd
    return None


def _vertex_of(conn):
    rep = getattr(conn, "Representation", None)
    for r in (rep.Representations if rep else []) or []:
        for item in r.Items or []:
            if item.is_a("IfcVertexPoint"):
                return item
    return None


def _coords(vertex) -> tuple[float, ...] | None:
    try:
        return tuple(float(c) for c in vertex.VertexGeometry.Coordinates)
    except (AttributeError, TypeError):
        return None


def _end_at(member, vertex, tol_units: float) -> str:
    ends = _edge_vertices(member)
    if ends is None or vertex is None:
        return ""
    for name, v in zip(("start", "end"), ends):
        if v is not None and v.id() == vertex.id():
            return name
    c = _coords(vertex)
    if c is None:
        return ""
    for name, v in zip(("start", "end"), ends):
        cv = _coords(v) if v is not None else None
        if cv is not None and len(cv) == len(c) and sum((a - b) ** 2 for a, b in zip(c, cv)) <= tol_units ** 2:
            return name
    return "along"


def _structural(model: ifcopenshell.file) -> tuple[list[ExplicitConnection], list[DataWarning]]:
    rels = _by_type(model, "IfcRelConnectsStructuralMember")
    if not rels:
        return [], []
    links = _physical_links(model)
    tol_units = 1.0 / max(_length_scale_mm(model), 1e-9)   # 1 mm in model units
    at_conn: dict[int, list[tuple[object, str]]] = defaultdict(list)
    unlinked: set[int] = set()
    for rel in rels:
        mem, conn = rel.RelatingStructuralMember, rel.RelatedStructuralConnection
        if mem is None or conn is None:
            continue
        if not links.get(mem.id()):
            unlinked.add(mem.id())
            continue
        at_conn[conn.id()].append((mem, _end_at(mem, _vertex_of(conn), tol_units)))
    out: list[ExplicitConnection] = []
    for conn_id in sorted(at_conn):
        items = at_conn[conn_id]
        for (m1, e1), (m2, e2) in combinations(items, 2):
            for p1 in links[m1.id()]:
                for p2 in links[m2.id()]:
                    if p1 != p2:
                        out.append(ExplicitConnection(p1, p2, _STRUCTURAL, e1, e2))
    warnings = []
    if unlinked:
        warnings.append(DataWarning(
            f"{len(unlinked)} structural analysis member(s) are not linked to a physical element "
            "(no IfcRelAssignsToProduct); their connections are not used for the joints", None,
            "connectivity"))
    return out, warnings
