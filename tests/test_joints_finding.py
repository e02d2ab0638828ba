"""The joint finder on small frames built by hand (mm): kinds, gaps, both beam-end conventions,
orientation, explicit relations, free ends and unresolved ends.

Expected values are worked out by hand from the geometry in each test (face offsets = half depth on
the flange side, half web thickness on the web side).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from engine.errors import ConfigError
from engine.joints import find_joints, joint_rows
from engine.model import Bearing, ExplicitConnection, Member, Section, joint_id
from engine.tolerances import Tolerances

COL = Section("C-test", "I", 310.0, 305.0, 10.0, 15.0, 16.0)
GIR = Section("G-test", "I", 530.0, 210.0, 10.0, 16.0, 13.0)
SEC = Section("S-test", "I", 310.0, 165.0, 6.0, 11.0, 11.0)
Z = (0.0, 0.0, 1.0)


def col(gid, x, y, z0=0.0, z1=4000.0, web=(1.0, 0.0, 0.0), sec=COL):
    return Member(gid, "IfcColumn", "column", (x, y, z0), (x, y, z1), sec, tag=gid, web_dir=web)


def beam(gid, a, b, sec=GIR, web=Z, role="beam", offset=None):
    return Member(gid, "IfcBeam", role, tuple(map(float, a)), tuple(map(float, b)), sec, tag=gid,
                  web_dir=web, axis_offset=offset)


def by_end(finding):
    return {(j.beam, j.end): j for j in finding.joints}


# ---------------------------------------------------------------- column faces, both conventions

@pytest.mark.parametrize("convention,gap", [("detailed", 12.0), ("node-to-node", -155.0)])
def test_girder_arriving_along_column_web_direction_meets_the_flange(convention, gap):
    # column web along world x: flange faces at x = ±155 (depth/2); girder along x from the column
    e = 155.0 + 12.0 if convention == "detailed" else 0.0
    f = find_joints([col("C1", 0, 0), col("C2", 8000, 0),
                     beam("G1", (e, 0, 3000), (8000 - e, 0, 3000))])
    j = by_end(f)
    assert j[("G1", "start")].kind == "column-flange" and j[("G1", "start")].support == "C1"
    assert j[("G1", "end")].kind == "column-flange" and j[("G1", "end")].support == "C2"
    assert j[("G1", "start")].geometry.gap == pytest.approx(gap)
    assert j[("G1", "start")].geometry.angle_deg == pytest.approx(90.0)
    assert j[("G1", "start")].geometry.support_continuous is True
    assert j[("G1", "start")].stiffness == "stiff"
    assert not f.unresolved


@pytest.mark.parametrize("convention,gap", [("detailed", 12.0), ("node-to-node", -5.0)])
def test_beam_arriving_square_to_column_web_meets_the_web(convention, gap):
    e = 5.0 + 12.0 if convention == "detailed" else 0.0
    f = find_joints([col("C1", 0, 0), col("C2", 0, 6000),
                     beam("B1", (0, e, 3000), (0, 6000 - e, 3000), sec=SEC)])
    j = by_end(f)
    assert {j[("B1", k)].kind for k in ("start", "end")} == {"column-web"}
    assert j[("B1", "start")].geometry.gap == pytest.approx(gap)
    # the columns run on above the beam (to 4000, beam top 3155): web of a continuous column → stiff
    assert j[("B1", "start")].geometry.support_continuous is True
    assert j[("B1", "start")].stiffness == "stiff"


def test_beam_into_the_web_at_the_top_of_a_column_is_not_clearly_stiff():
    e = 5.0 + 12.0
    members = [col("C1", 0, 0, z1=3155), col("C2", 0, 6000, z1=3155),
               beam("B1", (0, e, 3000), (0, 6000 - e, 3000), sec=SEC)]
    j = by_end(find_joints(members))[("B1", "start")]
    assert j.kind == "column-web" and j.geometry.support_continuous is False
    assert j.stiffness == "flexible"
    assert any("policy conservative: not clearly stiff" in r for r in j.reasons)
    # one side only at the column top leans flexible, so "classified" keeps it flexible too
    assert by_end(find_joints(members, policy="classified"))[("B1", "start")].stiffness == "flexible"


def test_turning_the_column_swaps_flange_and_web():
    e_web = 5.0 + 12.0
    f = find_joints([col("C1", 0, 0, web=(0.0, 1.0, 0.0)), col("C2", 8000, 0, web=(0.0, 1.0, 0.0)),
                     beam("G1", (e_web, 0, 3000), (8000 - e_web, 0, 3000))])
    j = by_end(f)
    assert j[("G1", "start")].kind == "column-web"
    assert j[("G1", "start")].geometry.gap == pytest.approx(12.0)


def test_detailed_end_short_of_the_face_beyond_joint_gap_is_not_a_joint_unless_tolerance_allows():
    e = 155.0 + 60.0   # 60 mm short of the flange face
    members = [col("C1", 0, 0), col("C2", 8000, 0), beam("G1", (e, 0, 3000), (8000 - 155 - 12, 0, 3000))]
    f = find_joints(members)
    j = by_end(f)
    assert j[("G1", "start")].kind == "free-end"          # other end supported → cantilever tip
    assert j[("G1", "start")].support is None
    f2 = find_joints(members, tolerances=Tolerances(joint_gap_mm=70))
    assert by_end(f2)[("G1", "start")].kind == "column-flange"
    assert by_end(f2)[("G1", "start")].geometry.gap == pytest.approx(60.0)


def test_axis_at_top_of_steel_is_moved_to_the_centroid_before_testing():
    # axis drawn at the top of steel 3000; centroid 265 lower; the girder is still inside the column
    # height and the secondary lands square on its web with flush tops → a top cope
    e = 155.0 + 12.0
    g = beam("G1", (e, 0, 3000), (8000 - e, 0, 3000), offset=(0.0, 265.0))
    s_end = 5.0 + 12.0
    s = beam("S1", (4000, s_end, 3000), (4000, 6000 - s_end, 3000), sec=SEC, offset=(0.0, 155.0))
    g2 = beam("G2", (e, 6000, 3000), (8000 - e, 6000, 3000), offset=(0.0, 265.0))
    f = find_joints([col("C1", 0, 0), col("C2", 8000, 0), col("C3", 0, 6000), col("C4", 8000, 6000),
                     g, g2, s])
    j = by_end(f)[("S1", "start")]
    assert j.kind == "beam-web" and j.support == "G1"
    assert j.geometry.tos_diff == pytest.approx(0.0, abs=1e-6)
    # cope by hand: depth = tf + r = 16 + 13 = 29 → 30; length = (105 - 5) - 12 + 10 = 98 → 100
    # (both rounded up to 5 mm)
    assert [(c.where, c.depth, c.length) for c in j.geometry.copes] == [("top", 30.0, 100.0)]


# ---------------------------------------------------------------- beams on beams

def _bay(convention: str, shift_s: float = 0.0):
    e = 155.0 + 12.0 if convention == "detailed" else 0.0
    s_end = 5.0 + 12.0 if convention == "detailed" else 0.0
    return [col("C1", 0, 0), col("C2", 8000, 0), col("C3", 0, 6000), col("C4", 8000, 6000),
            beam("G1", (e, 0, 3000), (8000 - e, 0, 3000)),
            beam("G2", (e, 6000, 3000), (8000 - e, 6000, 3000)),
            beam("S1", (4000 + shift_s, s_end, 3000), (4000 + shift_s, 6000 - s_end, 3000), sec=SEC)]


@pytest.mark.parametrize("convention,gap", [("detailed", 12.0), ("node-to-node", -5.0)])
def test_secondary_frames_into_girder_web(convention, gap):
    f = find_joints(_bay(convention))
    j = by_end(f)
    assert j[("S1", "start")].kind == "beam-web" and j[("S1", "start")].support == "G1"
    assert j[("S1", "end")].kind == "beam-web" and j[("S1", "end")].support == "G2"
    assert j[("S1", "start")].geometry.gap == pytest.approx(gap)
    assert j[("S1", "start")].stiffness == "flexible"
    assert any("one side only, girder free to twist" in r for r in j[("S1", "start")].reasons)
    assert len(f.joints) == 2 * 3 and not f.unresolved   # 3 beams × 2 ends


def test_back_to_back_secondaries_are_partners_and_policy_decides_the_leaning():
    s_end = 5.0 + 12.0
    base = _bay("detailed") + [
        col("C5", 0, -6000), col("C6", 8000, -6000),
        beam("G0", (167, -6000, 3000), (8000 - 167, -6000, 3000)),
        beam("S0", (4000, -6000 + s_end, 3000), (4000, -s_end, 3000), sec=SEC)]
    for policy, expect in (("conservative", "flexible"), ("classified", "stiff"), ("envelope", "stiff")):
        f = find_joints(base, policy=policy)
        j = by_end(f)
        a, b = j[("S1", "start")], j[("S0", "end")]
        assert a.support == b.support == "G1"
        assert a.geometry.back_to_back == b.id and b.geometry.back_to_back == a.id
        assert a.stiffness == expect, policy
        assert any("balanced by back-to-back beam" in r for r in a.reasons)
    assert any("both hinge positions" in r for r in j[("S1", "start")].reasons)  # envelope


def test_unknown_policy_is_a_config_error():
    with pytest.raises(ConfigError, match="policy"):
        find_joints(_bay("detailed"), policy="optimistic")


def test_beam_resting_on_top_flange_is_beam_over():
    e = 155.0 + 12.0
    girder = beam("G1", (e, 0, 3000), (8000 - e, 0, 3000))            # top at 3265
    # a 310 beam whose underside sits on the girder's top: centroid at 3265 + 155
    over = beam("B9", (4000, -40, 3420), (4000, -6000, 3420), sec=SEC)
    f = find_joints([col("C1", 0, 0), col("C2", 8000, 0), girder, over])
    j = by_end(f)[("B9", "start")]
    assert j.kind == "beam-over" and j.support == "G1"
    assert j.geometry.tos_diff == pytest.approx(310.0)
    assert j.stiffness == "flexible"
    assert by_end(f)[("B9", "end")].kind == "free-end"


def test_secondary_at_two_crossing_continuous_girders_is_unresolved_not_guessed():
    g1 = beam("GX", (-4000, 0, 3000), (4000, 0, 3000))
    g2 = beam("GY", (0, -4000, 3000), (0, 4000, 3000), web=Z)
    s = beam("S1", (0, 0, 3000), (3000, 3000, 3000), sec=SEC)          # 45° into the crossing
    f = find_joints([g1, g2, s, col("CZ", 3000, 3000)])
    u = {(x.beam, x.end): x.reason for x in f.unresolved}
    assert "equally near" in u[("S1", "start")]


def test_beam_landing_on_a_brace_is_unresolved_with_the_reason():
    br = beam("BR", (0, 0, 0), (0, 3000, 3000), sec=SEC, role="brace")
    b = beam("B1", (0, 1500, 1500), (5000, 1500, 1500), sec=SEC)
    f = find_joints([br, b, col("C1", 5000 + 155 + 12, 1500, web=(1.0, 0.0, 0.0))])
    u = {(x.beam, x.end): x.reason for x in f.unresolved}
    assert "lands on BR" in u[("B1", "start")]
    # the brace's own ends land on nothing → unresolved, never dropped
    assert {("BR", "start"), ("BR", "end")} <= set(u)


def test_a_beam_with_nothing_at_either_end_is_unresolved_both_ends():
    f = find_joints([beam("B1", (0, 0, 0), (5000, 0, 0))])
    assert [(u.beam, u.end) for u in f.unresolved] == [("B1", "start"), ("B1", "end")]
    assert "either end" in f.unresolved[0].reason
    assert not f.joints


def test_zero_length_member_is_unresolved_axis_unknown():
    f = find_joints([beam("B0", (1, 1, 1), (1, 1, 1))])
    assert {u.reason.split(" (")[0] for u in f.unresolved} == {"axis unknown"}


def test_column_splice_is_a_joint_of_the_upper_column_only():
    f = find_joints([col("CL", 0, 0, 0, 4600), col("CU", 0, 0, 4600, 8200)])
    assert [(j.beam, j.end, j.support, j.kind) for j in f.joints] == [("CU", "start", "CL", "splice")]


def test_column_split_at_the_beam_level_counts_as_continuous_and_the_lower_carries():
    f = find_joints([col("CL", 0, 0, 0, 3000), col("CU", 0, 0, 3000, 6000),
                     beam("G1", (0, 0, 3000), (8000, 0, 3000)), col("C2", 8000, 0, 0, 6000)])
    j = by_end(f)[("G1", "start")]
    assert j.support == "CL" and j.kind == "column-flange"
    assert j.geometry.support_continuous is True
    assert any("continues through the joint as CU" in r for r in j.reasons)


def test_brace_ends_are_joints_of_kind_unknown():
    br = beam("BR", (155 + 12, 0, 200), (8000 - 155 - 12, 0, 3800), sec=SEC, role="brace")
    f = find_joints([col("C1", 0, 0), col("C2", 8000, 0), br])
    kinds = {(j.end, j.kind, j.support) for j in f.joints}
    assert kinds == {("start", "unknown", "C1"), ("end", "unknown", "C2")}
    assert all(any("gusset" in r for r in j.reasons) for j in f.joints)


def test_column_without_orientation_gets_the_face_from_the_distance_and_says_so():
    e = 155.0 + 12.0
    f = find_joints([col("C1", 0, 0, web=None), col("C2", 8000, 0, web=None),
                     beam("G1", (e, 0, 3000), (8000 - e, 0, 3000))])
    j = by_end(f)[("G1", "start")]
    assert j.kind == "column-flange" and j.geometry.gap == pytest.approx(12.0)
    assert any("orientation not in the model" in r for r in j.reasons)
    assert j.stiffness == "flexible"


def test_beam_embedded_in_a_wall_is_a_wall_joint():
    wall = Bearing("W1", "IfcWall", "Wall W1", (-200.0, -1000.0, 0.0), (0.0, 1000.0, 3500.0))
    f = find_joints([beam("B1", (-100, 0, 3000), (6000 - 167, 0, 3000)), col("C2", 6000, 0)], [wall])
    j = by_end(f)
    assert j[("B1", "start")].kind == "wall" and j[("B1", "start")].support == "W1"
    assert j[("B1", "start")].geometry.gap == pytest.approx(-100.0)
    assert "W1" in f.graph.nodes and f.graph.nodes["W1"]["role"] == "bearing"


# ---------------------------------------------------------------- explicit relations

def test_explicit_relation_is_used_first_and_disagreement_is_reported():
    e = 155.0 + 12.0
    members = [col("C1", 0, 0), col("C2", 8000, 0), col("CF", -3000, 0),
               beam("G1", (e, 0, 3000), (8000 - e, 0, 3000))]
    rel = ExplicitConnection("CF", "G1", "IfcRelConnectsPathElements", "along", "start")
    f = find_joints(members, explicit=[rel])
    j = by_end(f)[("G1", "start")]
    assert j.support == "CF" and j.source == "IfcRelConnectsPathElements"
    assert any("does not put the end at it" in w.message for w in f.warnings)
    agree = ExplicitConnection("C1", "G1", "IfcRelConnectsElements")
    f2 = find_joints(members, explicit=[agree])
    j2 = by_end(f2)[("G1", "start")]
    assert j2.support == "C1" and j2.source == "IfcRelConnectsElements" and not f2.warnings


# ---------------------------------------------------------------- invariance and output rows

def _transform(members, angle_deg, shift):
    c, s = math.cos(math.radians(angle_deg)), math.sin(math.radians(angle_deg))
    rot = np.array([[c, -s, 0], [s, c, 0], [0, 0, 1.0]])

    def tp(p):
        return tuple(float(v) for v in rot @ np.asarray(p) + np.asarray(shift))

    def td(d):
        return None if d is None else tuple(float(v) for v in rot @ np.asarray(d))
    return [Member(m.global_id, m.ifc_class, m.role, tp(m.start), tp(m.end), m.section, tag=m.tag,
                   web_dir=td(m.web_dir), axis_offset=m.axis_offset) for m in members]


@pytest.mark.parametrize("convention", ["detailed", "node-to-node"])
def test_results_do_not_depend_on_where_the_frame_sits_or_which_way_members_run(convention):
    base = _bay(convention)
    flipped = [Member(m.global_id, m.ifc_class, m.role, m.end, m.start, m.section, tag=m.tag,
                      web_dir=m.web_dir) if m.role == "beam" and m.global_id != "S1" else m
               for m in base]

    def summary(ms):
        f = find_joints(ms)
        return sorted((j.beam, j.support, j.kind, round(j.geometry.gap or 0, 6), j.stiffness)
                      for j in f.joints)
    ref = summary(base)
    assert summary(_transform(base, 33.0, (1.0e6, -2.5e5, 40.0))) == ref
    assert summary(flipped) == ref


def test_joint_rows_are_plain_json_rows_with_stable_ids():
    import json

    ms = _bay("detailed")
    f = find_joints(ms)
    rows = joint_rows(f, ms)
    json.dumps(rows)
    r = next(x for x in rows if x["beam"] == "S1" and x["end"] == "start")
    assert r["id"] == joint_id("S1", "start", "G1")
    assert r["support_label"] == "G1" and r["kind"] == "beam-web" and r["gap_mm"] == 12.0
    # centroids level: secondary top 3155, girder top 3265, clear of the flange (3236) → no cope
    assert r["tos_diff_mm"] == -110.0 and r["copes"] == []
    assert set(r) >= {"id", "beam", "beam_label", "end", "support", "support_label", "kind", "stiffness",
                      "reasons", "gap_mm", "angle_deg", "tos_diff_mm", "copes", "support_continuous",
                      "back_to_back"}
