"""The frame's connectivity graph (networkx) and "is supported by" helpers for the load take-down.

Nodes are GlobalIds (members, and walls/slabs that carry beams) with the attributes named by the
``NODE_*`` constants. Each joint with a support is one edge ``beam → support`` of a
:class:`networkx.MultiDiGraph`, keyed by the joint id, with the attributes named by the ``EDGE_*``
constants. An edge "carries" (``EDGE_CARRIES``) when load passes along it from the supported member to
the support: every support joint (a beam on a column cap included) and a column splice (upper column
onto lower), but not a brace end
or a collinear beam-to-beam splice (which would make each half "support" the other).

An aid to a competent engineer: the graph reflects the model as drawn and must be checked; the
governing local code and licensed practice take precedence.
"""

from __future__ import annotations

from typing import Iterable, Sequence

import networkx as nx

from engine.errors import BadInputError
from engine.model import Bearing, Joint, Member

__all__ = [
    "EDGE_END", "EDGE_KIND", "EDGE_GEOMETRY", "EDGE_STIFFNESS", "EDGE_REASONS", "EDGE_JOINT_ID",
    "EDGE_SOURCE", "EDGE_CARRIES",
    "NODE_ROLE", "NODE_IFC_CLASS", "NODE_LABEL", "NODE_STOREY", "NODE_SECTION", "NODE_LENGTH",
    "NODE_FREE_ENDS",
    "SupportCycleError", "build_graph", "supports_of", "supported_by", "support_cycles",
    "support_order",
]

EDGE_END = "end"
EDGE_KIND = "kind"
EDGE_GEOMETRY = "geometry"
EDGE_STIFFNESS = "stiffness"
EDGE_REASONS = "reasons"
EDGE_JOINT_ID = "joint_id"
EDGE_SOURCE = "source"
EDGE_CARRIES = "carries"

NODE_ROLE = "role"
NODE_IFC_CLASS = "ifc_class"
NODE_LABEL = "label"
NODE_STOREY = "storey"
NODE_SECTION = "section"
NODE_LENGTH = "length_mm"
NODE_FREE_ENDS = "free_ends"


class SupportCycleError(BadInputError):
    """The "is supported by" relation has a cycle (A carried by B carried by ... A).

    ``cycles`` lists each cycle as a list of GlobalIds."""

    def __init__(self, cycles: list[list[str]]):
        self.cycles = cycles
        shown = "; ".join(" → ".join(c + c[:1]) for c in cycles[:3])
        more = f" (and {len(cycles) - 3} more)" if len(cycles) > 3 else ""
        super().__init__(f"members support each other in a cycle: {shown}{more}; check the joints of "
                         "these members in the model")


def _carries(joint: Joint, roles: dict[str, str]) -> bool:
    if joint.support is None or joint.kind == "free-end" or roles.get(joint.beam) == "brace":
        return False
    if joint.kind == "splice":
        return roles.get(joint.beam) == "column"
    return True


def build_graph(members: Sequence[Member], joints: Iterable[Joint],
                bearings: Sequence[Bearing] = ()) -> nx.MultiDiGraph:
    """Members (and bearings that carry a joint) as nodes, joints with a support as edges.

    Member nodes go in at once (``add_nodes_from``, then their attributes); then the joints in
    order: a free end is recorded on its member's node, a bearing gets its node the first time it
    carries a joint, and each joint with a support is one edge keyed by the joint id.
    """
    g = nx.MultiDiGraph()
    roles: dict[str, str] = {m.global_id: m.role for m in members}
    g.add_nodes_from([m.global_id for m in members])
    nodes = g.nodes
    for m in members:
        nodes[m.global_id].update({NODE_ROLE: m.role, NODE_IFC_CLASS: m.ifc_class, NODE_LABEL: m.label,
                                   NODE_STOREY: m.storey, NODE_SECTION: m.section.name,
                                   NODE_LENGTH: m.length, NODE_FREE_ENDS: ()})
    by_id = {b.global_id: b for b in bearings}
    present = set(roles)          # the graph's nodes so far
    add_edge = g.add_edge
    for j in joints:
        support = j.support
        if support is None:
            if j.beam in present:
                attrs = nodes[j.beam]
                attrs[NODE_FREE_ENDS] = attrs[NODE_FREE_ENDS] + (j.end,)
            continue
        if support not in present:
            b = by_id.get(support)
            g.add_node(support, **{NODE_ROLE: "bearing", NODE_IFC_CLASS: b.ifc_class if b else "",
                                   NODE_LABEL: (b.name if b else "") or support,
                                   NODE_STOREY: b.storey if b else "", NODE_SECTION: "",
                                   NODE_LENGTH: None, NODE_FREE_ENDS: ()})
            present.add(support)
        add_edge(j.beam, support, j.id, **{
            EDGE_END: j.end, EDGE_KIND: j.kind, EDGE_GEOMETRY: j.geometry, EDGE_STIFFNESS: j.stiffness,
            EDGE_REASONS: j.reasons, EDGE_JOINT_ID: j.id, EDGE_SOURCE: j.source,
            EDGE_CARRIES: _carries(j, roles)})
        present.add(j.beam)
    return g


def _carrying(graph: nx.MultiDiGraph) -> nx.DiGraph:
    d = nx.DiGraph()
    d.add_nodes_from(graph.nodes)
    d.add_edges_from((u, v) for u, v, c in graph.edges(data=EDGE_CARRIES) if c)
    return d


def supports_of(graph: nx.MultiDiGraph, global_id: str) -> list[str]:
    """GlobalIds of what carries ``global_id`` (its supports), sorted."""
    return sorted({v for _, v, c in graph.out_edges(global_id, data=EDGE_CARRIES) if c})


def supported_by(graph: nx.MultiDiGraph, global_id: str) -> list[str]:
    """GlobalIds of the members ``global_id`` carries, sorted."""
    return sorted({u for u, _, c in graph.in_edges(global_id, data=EDGE_CARRIES) if c})


def support_cycles(graph: nx.MultiDiGraph) -> list[list[str]]:
    """Every cycle of mutual support (strongly connected groups of two or more, or self-loops)."""
    d = _carrying(graph)
    out = [sorted(c) for c in nx.strongly_connected_components(d) if len(c) > 1]
    out += [[n] for n in d.nodes if d.has_edge(n, n)]
    return sorted(out)


def support_order(graph: nx.MultiDiGraph, *, on_cycle: str = "raise") -> list[str]:
    """Members in load take-down order: every member comes before the members that carry it.

    Ties are broken by GlobalId so the order is deterministic. ``on_cycle="raise"`` raises
    :class:`SupportCycleError` naming the cycles; ``on_cycle="skip"`` leaves the members of a cycle
    (and whatever they carry onto) out of the order instead — the caller reports them with
    :func:`support_cycles`.
    """
    if on_cycle not in ("raise", "skip"):
        raise ValueError("on_cycle must be 'raise' or 'skip'")
    d = _carrying(graph)
    cycles = support_cycles(graph)
    if cycles:
        if on_cycle == "raise":
            raise SupportCycleError(cycles)
        bad = {n for c in cycles for n in c}
        bad |= {a for n in bad for a in nx.descendants(d, n)}
        d.remove_nodes_from(bad)
    return list(nx.lexicographical_topological_sort(d))
