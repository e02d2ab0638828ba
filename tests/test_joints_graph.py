"""The connectivity graph: nodes, edge attributes by constant name, take-down order and cycles."""

from __future__ import annotations

import pytest

from engine import graph as G
from engine.joints import find_joints
from engine.model import Joint, JointGeometry, Member, Section
from samples.synthetic import synthetic_frame

SEC = Section("S", "I", 310.0, 165.0, 6.0, 11.0, 11.0)


def test_every_supported_joint_is_one_edge_with_the_named_attributes():
    ms = synthetic_frame(300, bays_x=2, bays_y=2)
    f = find_joints(ms)
    g = f.graph
    supported = [j for j in f.joints if j.support is not None]
    assert g.number_of_edges() == len(supported)
    assert set(g.nodes) == {m.global_id for m in ms}
    j = supported[0]
    data = g.get_edge_data(j.beam, j.support, key=j.id)
    assert data[G.EDGE_JOINT_ID] == j.id and data[G.EDGE_KIND] == j.kind
    assert data[G.EDGE_END] == j.end and data[G.EDGE_STIFFNESS] == j.stiffness
    assert data[G.EDGE_GEOMETRY] is j.geometry and data[G.EDGE_REASONS] == j.reasons
    free = [j for j in f.joints if j.kind == "free-end"]
    assert free and all(j.end in g.nodes[j.beam][G.NODE_FREE_ENDS] for j in free)


def test_support_order_puts_secondaries_before_girders_before_columns():
    ms = synthetic_frame(300, bays_x=2, bays_y=2)
    f = find_joints(ms)
    order = G.support_order(f.graph)
    pos = {n: i for i, n in enumerate(order)}
    for u, v, carries in f.graph.edges(data=G.EDGE_CARRIES):
        if carries:
            assert pos[u] < pos[v]
    by_tag = {m.tag: m.global_id for m in ms}
    assert pos[by_tag["S1-0-0-1"]] < pos[by_tag["G1-0-0"]] < pos[by_tag["C0-0-0"]]
    assert G.supports_of(f.graph, by_tag["S1-0-0-1"]) == sorted([by_tag["G1-0-0"], by_tag["G1-0-1"]])


def _m(gid):
    return Member(gid, "IfcBeam", "beam", (0.0, 0.0, 0.0), (1000.0, 0.0, 0.0), SEC)


def test_mutual_support_is_reported_as_a_cycle_not_looped_on():
    geo = JointGeometry((0.0, 0.0, 0.0))
    joints = [Joint("J-a", "A", "end", "B", "beam-web", geo), Joint("J-b", "B", "start", "A", "beam-web", geo),
              Joint("J-c", "C", "end", "A", "beam-web", geo)]
    g = G.build_graph([_m("A"), _m("B"), _m("C")], joints)
    assert G.support_cycles(g) == [["A", "B"]]
    with pytest.raises(G.SupportCycleError, match="cycle") as e:
        G.support_order(g)
    assert e.value.cycles == [["A", "B"]]
    assert G.support_order(g, on_cycle="skip") == ["C"]


def test_beam_splices_do_not_carry_but_column_splices_do():
    geo = JointGeometry((0.0, 0.0, 0.0))
    col = Member("CU", "IfcColumn", "column", (0.0, 0.0, 3000.0), (0.0, 0.0, 6000.0), SEC)
    col2 = Member("CL", "IfcColumn", "column", (0.0, 0.0, 0.0), (0.0, 0.0, 3000.0), SEC)
    joints = [Joint("J-1", "A", "end", "B", "splice", geo), Joint("J-2", "B", "start", "A", "splice", geo),
              Joint("J-3", "CU", "start", "CL", "splice", geo)]
    g = G.build_graph([_m("A"), _m("B"), col, col2], joints)
    assert G.support_cycles(g) == []
    assert G.supports_of(g, "CU") == ["CL"] and G.supports_of(g, "A") == []
