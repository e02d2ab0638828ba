"""Less common joint situations: split members in node-to-node models, ends meeting ends, flange-tip
ends, column caps, wall bearings. Expected values worked by hand from each test's geometry (mm)."""

from __future__ import annotations

import pytest

from engine.joints import find_joints
from engine.model import Bearing, Member, Section

COL = Section("C-test", "I", 310.0, 305.0, 10.0, 15.0, 16.0)
GIR = Section("G-test", "I", 530.0, 210.0, 10.0, 16.0, 13.0)
SEC = Section("S-test", "I", 310.0, 165.0, 6.0, 11.0, 11.0)
Z = (0.0, 0.0, 1.0)


def col(gid, x, y, z0=0.0, z1=4000.0):
    return Member(gid, "IfcColumn", "column", (x, y, z0), (x, y, z1), COL, tag=gid, web_dir=(1.0, 0.0, 0.0))


def beam(gid, a, b, sec=GIR):
    return Member(gid, "IfcBeam", "beam", tuple(map(float, a)), tuple(map(float, b)), sec, tag=gid, web_dir=Z)


def by_end(f):
    return {(j.beam, j.end): j for j in f.joints}


def test_secondary_at_a_node_of_a_split_girder_frames_into_a_continuous_girder():
    # node-to-node: the girder is two members meeting at x = 4000, where the secondary lands
    ms = [col("C1", 0, 0), col("C2", 8000, 0),
          beam("GA", (0, 0, 3000), (4000, 0, 3000)), beam("GB", (4000, 0, 3000), (8000, 0, 3000)),
          beam("S1", (4000, 0, 3000), (4000, 6000, 3000), sec=SEC), col("C3", 4000, 6000)]
    f = find_joints(ms)
    j = by_end(f)
    s = j[("S1", "start")]
    assert s.kind == "beam-web" and s.support in ("GA", "GB")
    assert s.geometry.support_continuous is True
    # the two girder halves meet end to end: a splice each way, carrying no load in the take-down
    assert j[("GA", "end")].kind == "splice" and j[("GA", "end")].support == "GB"
    assert j[("GB", "start")].kind == "splice" and j[("GB", "start")].support == "GA"
    assert not f.unresolved


def test_trimmer_into_the_end_of_a_girder_carried_by_a_column_is_a_web_joint():
    e = 155.0 + 12.0
    ms = [col("C1", 0, 0), col("C2", 8000, 0), beam("G1", (e, 0, 3000), (8000 - e, 0, 3000)),
          # the trimmer lands 30 mm from the girder's end, 17 mm off its web face
          beam("T1", (8000 - e - 30, 17, 3000), (8000 - e - 30, 5000, 3000), sec=SEC),
          col("C3", 8000 - e - 30, 5000 + 5 + 12)]
    f = find_joints(ms)
    t = by_end(f)[("T1", "start")]
    assert t.kind == "beam-web" and t.support == "G1" and t.geometry.gap == pytest.approx(12.0)
    assert any("close to its end, which is carried by C2" in r for r in t.reasons)


def test_two_beams_meeting_corner_to_corner_with_nothing_else_stay_unresolved():
    ms = [beam("A", (0, 0, 3000), (5000, 0, 3000)), beam("B", (0, 0, 3000), (0, 5000, 3000)),
          col("CA", 5000 + 155 + 12, 0), col("CB", 0, 5000 + 5 + 12)]
    f = find_joints(ms)
    u = {(x.beam, x.end): x.reason for x in f.unresolved}
    assert set(u) == {("A", "start"), ("B", "start")}
    assert all("meets the end of" in r for r in u.values())


def test_secondary_stopping_at_the_girder_flange_tips_is_a_web_joint_needing_a_long_plate():
    e = 155.0 + 12.0
    tip = 105.0 + 10.0      # 10 mm beyond the girder's flange tips: 110 mm from its web face
    ms = [col("C1", 0, 0), col("C2", 8000, 0), col("C3", 0, 6000), col("C4", 8000, 6000),
          beam("G1", (e, 0, 3000), (8000 - e, 0, 3000)), beam("G2", (e, 6000, 3000), (8000 - e, 6000, 3000)),
          beam("S1", (4000, tip, 3000), (4000, 6000 - tip, 3000), sec=SEC)]
    j = by_end(find_joints(ms))[("S1", "start")]
    assert j.kind == "beam-web" and j.geometry.gap == pytest.approx(110.0)
    assert any("flange tips" in r for r in j.reasons)
    assert j.geometry.copes == ()   # stops beyond the flange: no cope


def test_beam_sitting_on_a_column_cap_is_recognised_not_checked():
    # column top at 3000; beam underside on it (centroid 3000 + 265)
    ms = [col("C1", 0, 0, z1=3000), col("C2", 8000, 0, z1=3000),
          beam("G1", (0, 0, 3265), (8000, 0, 3265))]
    f = find_joints(ms)
    kinds = {(j.end, j.kind, j.support) for j in f.joints}
    assert kinds == {("start", "unknown", "C1"), ("end", "unknown", "C2")}
    assert all(any("cap of column" in r for r in j.reasons) for j in f.joints)
    assert f.graph.number_of_edges() == 2


def test_beam_bearing_on_top_of_a_wall_reports_the_bearing_length():
    wall = Bearing("W1", "IfcWall", "Wall W1", (5000.0, -1500.0, 0.0), (5200.0, 1500.0, 2845.0))
    # 310 beam, underside on the wall top (centroid 2845 + 155 = 3000), end 150 mm past the face
    ms = [col("C0", -167, 0), beam("B1", (0, 0, 3000), (5150, 0, 3000), sec=SEC)]
    j = by_end(find_joints(ms, [wall]))[("B1", "end")]
    assert j.kind == "wall" and j.support == "W1"
    assert j.geometry.gap == pytest.approx(-150.0)
    assert j.stiffness == "stiff"
    assert any("bearing length 150 mm" in r for r in j.reasons)
