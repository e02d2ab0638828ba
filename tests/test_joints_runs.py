"""The joint finder works a run at a time (engine.joints._RUN joints, _PAIR_RUN candidate pairs,
engine.spatial._BUILD_RUN segments, to bound its peak memory): the joints must not depend on
where the runs are cut. Checked on the demo model and on
synthetic frames of both modelling conventions, cut into runs of 1, 7 and the default."""

from __future__ import annotations

from pathlib import Path

import pytest

import engine.joints as joints_module
from engine.joints import find_joints
from ifc_io import read_frame
from samples.synthetic import synthetic_frame

DEMO = Path(__file__).resolve().parents[1] / "samples" / "demo-ifc4-mm.ifc"


def _finding(members, bearings=(), explicit=(), policy="conservative"):
    f = find_joints(members, bearings, explicit, policy=policy)
    return f.joints, f.unresolved, f.warnings


@pytest.mark.parametrize("run", [1, 7])
@pytest.mark.parametrize("policy", ["conservative", "envelope"])
def test_joints_of_the_demo_do_not_depend_on_the_run_length(monkeypatch, run, policy):
    frame = read_frame(DEMO)
    whole = _finding(frame.members, frame.bearings, frame.connections, policy)
    monkeypatch.setattr(joints_module, "_RUN", run)
    assert _finding(frame.members, frame.bearings, frame.connections, policy) == whole
    assert len(whole[0]) > 100


@pytest.mark.parametrize("convention", ["detailed", "node-to-node"])
def test_joints_of_a_synthetic_frame_do_not_depend_on_the_run_length(monkeypatch, convention):
    members = synthetic_frame(600, convention=convention)
    whole = _finding(members)
    monkeypatch.setattr(joints_module, "_RUN", 7)
    monkeypatch.setattr(joints_module, "_PAIR_RUN", 5)  # candidate pairs tested a few at a time too
    assert _finding(members) == whole
    assert len(whole[0]) > 500


def test_the_grid_does_not_depend_on_how_many_segments_are_sampled_at_a_time(monkeypatch):
    import numpy as np

    import engine.spatial as spatial

    rng = np.random.default_rng(3)
    a = rng.uniform(0, 30000, (500, 3))
    b = a + rng.normal(0, 4000, (500, 3))
    whole = spatial.SegmentGrid.build(a, b, 700.0)
    monkeypatch.setattr(spatial, "_BUILD_RUN", 3)
    runs = spatial.SegmentGrid.build(a, b, 700.0)
    for name in ("keys", "starts", "items"):
        assert np.array_equal(getattr(whole, name), getattr(runs, name))
