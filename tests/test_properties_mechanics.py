"""Property-based tests (hypothesis) of the bolt-group mechanics and of the fin-plate capacities.

* Elastic method: the bolt forces are in equilibrium with the applied load for any pattern and any
  load — they sum to (Px, Py) and their moment about the centroid is Mz (statics; the method's own
  definition, e.g. Salmon & Johnson, *Steel Structures*, the vector method of eccentric shear —
  here checked by summing the forces, not by re-deriving them).
* Instantaneous centre of rotation (Crawford & Kulak 1971): C never exceeds the bolt count and
  equals it for a concentric load; C does not rise as the eccentricity grows; adding a row of bolts
  never lowers C.
* ``rules.load("as4100").check_fin_plate`` on a real joint of the demo model: a thicker plate never
  lowers a plate capacity, an added row of bolts (plate deepened by one pitch) never lowers the end
  shear a bolt-group check allows (V* / utilisation).

Deterministic: ``derandomize=True`` and a modest ``max_examples``.
"""

from __future__ import annotations

import dataclasses
from pathlib import Path

import ifcopenshell
import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

import rules
from engine.boltgroup import elastic_bolt_forces, elastic_coefficient, icr_coefficient
from ifc_io.library import audit_model

SAMPLES = Path(__file__).resolve().parents[1] / "samples"
FAST = settings(derandomize=True, max_examples=60, deadline=None,
                suppress_health_check=[HealthCheck.too_slow])
SLOW = settings(derandomize=True, max_examples=25, deadline=None,
                suppress_health_check=[HealthCheck.too_slow, HealthCheck.function_scoped_fixture])

coord = st.floats(min_value=-400.0, max_value=400.0, allow_nan=False, allow_infinity=False)
load = st.floats(min_value=-5e5, max_value=5e5, allow_nan=False, allow_infinity=False)


@st.composite
def patterns(draw, min_bolts: int = 2, max_bolts: int = 12):
    """Arbitrary bolt patterns: distinct points at least 20 mm apart (real holes do not overlap)."""
    n = draw(st.integers(min_bolts, max_bolts))
    pts: list[tuple[float, float]] = []
    for _ in range(n):
        p = (draw(coord), draw(coord))
        if all(np.hypot(p[0] - q[0], p[1] - q[1]) >= 20.0 for q in pts):
            pts.append(p)
    if len(pts) < min_bolts:
        pts = [(0.0, 0.0), (0.0, 70.0)]
    return np.array(pts)


def grid(rows: int, lines: int, pitch: float, gauge: float) -> np.ndarray:
    """A rectangular pattern: ``rows`` down each of ``lines`` vertical lines."""
    return np.array([(j * gauge, -i * pitch) for i in range(rows) for j in range(lines)], dtype=float)


# --------------------------------------------------------------------------------------------
# elastic method


@FAST
@given(xy=patterns(), px=load, py=load, mz=st.floats(min_value=-2e8, max_value=2e8))
def test_elastic_bolt_forces_are_in_equilibrium_with_the_load(xy, px, py, mz):
    f = elastic_bolt_forces(xy, px, py, mz)
    assert f.shape == xy.shape
    scale = abs(px) + abs(py) + 1.0
    np.testing.assert_allclose(f.sum(axis=0), [px, py], rtol=1e-9, atol=1e-9 * scale)
    d = xy - xy.mean(axis=0)
    moment = float((d[:, 0] * f[:, 1] - d[:, 1] * f[:, 0]).sum())
    assert moment == pytest.approx(mz, rel=1e-9, abs=1e-9 * (abs(mz) + scale * 400.0))


@FAST
@given(xy=patterns(), e=st.floats(min_value=0.0, max_value=500.0))
def test_elastic_coefficient_lies_between_zero_and_the_bolt_count(xy, e):
    c = elastic_coefficient(xy, e)
    assert 0.0 < c <= len(xy) * (1 + 1e-12)
    if e == 0.0:
        assert c == pytest.approx(len(xy))


# --------------------------------------------------------------------------------------------
# instantaneous centre of rotation

layouts = st.tuples(st.integers(1, 8), st.integers(1, 2), st.sampled_from([60.0, 70.0, 75.0, 90.0]),
                    st.sampled_from([60.0, 70.0, 90.0]))


@FAST
@given(layout=layouts, e1=st.floats(0.0, 400.0), de=st.floats(1.0, 300.0))
def test_icr_coefficient_does_not_rise_as_the_eccentricity_grows(layout, e1, de):
    rows, lines, pitch, gauge = layout
    xy = grid(rows, lines, pitch, gauge)
    if len(xy) < 2:
        xy = grid(2, 1, pitch, gauge)
    c1, c2 = icr_coefficient(xy, e1), icr_coefficient(xy, e1 + de)
    assert c2 <= c1 * (1 + 1e-6) + 1e-9
    assert 0.0 < c2 <= len(xy) * (1 + 1e-9)


@FAST
@given(layout=layouts)
def test_icr_coefficient_equals_the_bolt_count_for_a_concentric_load(layout):
    xy = grid(*layout)
    assert icr_coefficient(xy, 0.0) == pytest.approx(len(xy), rel=1e-9)


@FAST
@given(layout=layouts, e=st.floats(0.0, 400.0))
def test_adding_a_row_of_bolts_never_lowers_the_icr_coefficient(layout, e):
    rows, lines, pitch, gauge = layout
    rows = max(rows, 3 - lines)  # at least two bolts: a single bolt carries no moment
    c_now = icr_coefficient(grid(rows, lines, pitch, gauge), e)
    c_more = icr_coefficient(grid(rows + 1, lines, pitch, gauge), e)
    assert c_more >= c_now * (1 - 1e-6)


# --------------------------------------------------------------------------------------------
# AS 4100 fin-plate capacities on a real joint of the demo model


@pytest.fixture(scope="module")
def demo_joint():
    """A joint of the demo model with its modelled fin plate, demand, beam and support."""
    model = ifcopenshell.open(str(SAMPLES / "demo-ifc4-mm.ifc"))
    outcome = audit_model(model, config_file=SAMPLES / "demo-config.toml",
                          schedules=[SAMPLES / "demo-schedule.csv"], run_date="2026-01-01T00:00:00+00:00")
    found = [r for r in outcome.results if r.connection is not None and r.demand is not None
             and r.connection.lines == 1]
    assert found, "the demo model has modelled single-line fin plates"
    r = found[0]
    support = outcome.members.get(r.joint.support) if r.joint.support else None
    return r.joint, r.demand, r.connection, outcome.members[r.joint.beam], support


def _capacities(joint, demand, plate, beam, support, policy) -> dict[str, float]:
    """Each complete check's capacity, in the check's own terms (a bolt check: the most loaded
    bolt's resistance)."""
    checks = rules.load("as4100").check_fin_plate(joint, demand, plate, beam, support, policy)
    return {c.name: c.capacity for c in checks if not c.incomplete}


def _shear_capacities(joint, demand, plate, beam, support, policy) -> dict[str, float]:
    """Each complete check as the end shear the joint carries by it: V* / utilisation. For a bolt
    check this is the group's capacity (the worst bolt's resistance reached), which is what more
    bolts must not lower — the worst bolt's own resistance may fall as its force turns."""
    checks = rules.load("as4100").check_fin_plate(joint, demand, plate, beam, support, policy)
    return {c.name: demand.V / c.utilisation for c in checks if not c.incomplete and c.utilisation > 0}


PLATE_CHECKS = ("bolt bearing on plate", "bolt tear-out in plate", "plate shear yield", "plate shear rupture",
                "plate block shear", "plate bending", "plate lateral-torsional buckling", "plate tension (tie)")
GROUP_CHECKS = ("bolt shear", "bolt bearing on plate", "bolt tear-out in plate", "bolt bearing on beam web",
                "bolt tear-out in beam web", "plate shear yield", "plate shear rupture", "plate block shear",
                "plate bending", "beam web block shear")


def _compare(before: dict[str, float], after: dict[str, float], prefixes) -> int:
    compared = 0
    for name, cap in before.items():
        if name.startswith(prefixes) and name in after:
            assert after[name] >= cap * (1 - 1e-9), f"{name}: {cap} -> {after[name]}"
            compared += 1
    return compared


@SLOW
@given(t1=st.sampled_from([6.0, 8.0, 10.0, 12.0, 16.0]), dt=st.sampled_from([1.0, 2.0, 4.0, 8.0]),
       policy=st.sampled_from(["conservative", "classified", "envelope"]),
       v_kN=st.floats(20.0, 400.0))
def test_a_thicker_plate_never_lowers_a_plate_capacity(demo_joint, t1, dt, policy, v_kN):
    joint, demand, plate, beam, support = demo_joint
    demand = dataclasses.replace(demand, V=v_kN * 1e3)
    thin = _capacities(joint, demand, dataclasses.replace(plate, thickness=t1), beam, support, policy)
    thick = _capacities(joint, demand, dataclasses.replace(plate, thickness=t1 + dt), beam, support, policy)
    assert _compare(thin, thick, PLATE_CHECKS) >= 5


@SLOW
@given(rows=st.integers(2, 6), pitch=st.sampled_from([60.0, 70.0, 80.0]),
       policy=st.sampled_from(["conservative", "classified", "envelope"]), v_kN=st.floats(20.0, 400.0))
def test_an_added_row_of_bolts_never_lowers_a_bolt_group_capacity(demo_joint, rows, pitch, policy, v_kN):
    joint, demand, plate, beam, support = demo_joint
    demand = dataclasses.replace(demand, V=v_kN * 1e3)

    def layout(n: int):
        return dataclasses.replace(plate, rows=n, pitch=pitch, depth=2 * plate.plate_end_edge + (n - 1) * pitch)

    now = _shear_capacities(joint, demand, layout(rows), beam, support, policy)
    more = _shear_capacities(joint, demand, layout(rows + 1), beam, support, policy)
    assert _compare(now, more, GROUP_CHECKS) >= 6
