"""Explicit connectivity relations read from real IFC files and from a small linked analysis model
built with ifcopenshell."""

from __future__ import annotations

from collections import Counter

import ifcopenshell
import ifcopenshell.guid

from ifc_io.connectivity import read_explicit_connections


def test_path_connections_of_the_timber_frame_keep_their_ends(shared_models):
    model = ifcopenshell.open(str(shared_models / "timber-frame-path-connections-ifc4-mm.ifc"))
    conns, warnings = read_explicit_connections(model)
    assert len(conns) == 268 and not warnings   # 268 authored IfcRelConnectsPathElements (SOURCES.md)
    raw = Counter((r.RelatingConnectionType, r.RelatedConnectionType)
                  for r in model.by_type("IfcRelConnectsPathElements"))
    words = {"ATSTART": "start", "ATEND": "end", "ATPATH": "along"}
    got = Counter((c.relating_end, c.related_end) for c in conns)
    assert got == Counter({(words[a], words[b]): n for (a, b), n in raw.items()})
    assert {c.source for c in conns} == {"IfcRelConnectsPathElements"}


def test_analysis_model_without_physical_members_gives_no_connections_and_a_warning(shared_models):
    model = ifcopenshell.open(str(shared_models / "analysis-model-building-ifc4.ifc"))
    conns, warnings = read_explicit_connections(model)
    assert conns == []
    assert len(warnings) == 1 and "not linked to a physical element" in warnings[0].message


def test_file_without_relations_gives_nothing(shared_models):
    model = ifcopenshell.open(str(shared_models / "small-steel-frame-ifc2x3-mm.ifc"))
    assert read_explicit_connections(model) == ([], [])


def _linked_model():
    f = ifcopenshell.file(schema="IFC4")
    new = ifcopenshell.guid.new

    def vertex(x, y, z):
        return f.createIfcVertexPoint(f.createIfcCartesianPoint([x, y, z]))

    v_col_bot, v_node, v_far = vertex(0.0, 0.0, 0.0), vertex(0.0, 0.0, 3000.0), vertex(6000.0, 0.0, 3000.0)
    v_col_top = vertex(0.0, 0.0, 6000.0)

    def smember(name, a, b):
        edge = f.createIfcEdge(a, b)
        rep = f.createIfcProductDefinitionShape(None, None, [f.createIfcTopologyRepresentation(
            None, "Reference", "Edge", [edge])])
        return f.create_entity("IfcStructuralCurveMember", GlobalId=new(), Name=name, Representation=rep,
                               PredefinedType="RIGID_JOINED_MEMBER")

    s_col = smember("col", v_col_bot, v_col_top)
    s_beam = smember("beam", v_far, v_node)          # the beam's edge ends at the node
    node_rep = f.createIfcProductDefinitionShape(None, None, [f.createIfcTopologyRepresentation(
        None, "Reference", "Vertex", [v_node])])
    node = f.create_entity("IfcStructuralPointConnection", GlobalId=new(), Representation=node_rep)
    for sm in (s_col, s_beam):
        f.create_entity("IfcRelConnectsStructuralMember", GlobalId=new(), RelatingStructuralMember=sm,
                        RelatedStructuralConnection=node)
    col = f.create_entity("IfcColumn", GlobalId="COL" + "0" * 19)
    beam = f.create_entity("IfcBeam", GlobalId="BEAM" + "0" * 18)
    f.create_entity("IfcRelAssignsToProduct", GlobalId=new(), RelatedObjects=[s_col], RelatingProduct=col)
    f.create_entity("IfcRelAssignsToProduct", GlobalId=new(), RelatedObjects=[beam], RelatingProduct=s_beam)
    return f


def test_linked_analysis_model_connects_physical_members_with_ends():
    conns, warnings = read_explicit_connections(_linked_model())
    assert not warnings
    assert len(conns) == 1
    c = conns[0]
    ends = {c.relating: c.relating_end, c.related: c.related_end}
    assert ends == {"COL" + "0" * 19: "along", "BEAM" + "0" * 18: "end"}
    assert c.source == "structural-analysis"
