"""Resolving the design actions of every joint (engine.demand.resolve_demands).

Sources of values:
- Ultimate combination 1.2G + 1.5Q / 1.35G: AS/NZS 1170.0:2002 cl. 4.2.2  # from memory
- Web shear capacity used as the rule set's callable: φVw = φ·0.6·fy·Aw, Aw = d·tw, φ = 0.9
  (AS 4100:2020 cl. 5.11.4 and Table 3.4)  # from memory; the demand module only takes the fraction.
- Capacity fraction 0.5 where no analysis is available  # common practice
- kN in the model: 1 kN = 1000 N (SI).
"""

from __future__ import annotations

import copy
import dataclasses

import pytest

from engine.config import DEFAULTS
from engine.demand import resolve_demands, resolve_demands_detailed
from engine.demand_schedule import read_demand_schedule
from engine.errors import ConfigError
from engine.model import Joint, JointGeometry, Member, Section, joint_id

AS_COMB = {"name": "1.2G + 1.5Q", "dead": 1.2, "live": 1.5, "dead_only": 1.35,
           "source": "AS/NZS 1170.0 4.2.2"}  # from memory
Z = 3000.0


def cfg(**demand):
    c = copy.deepcopy(DEFAULTS)
    c["demand"].update(demand)
    return c


def beam(gid, a, b, props=None):
    return Member(global_id=gid, ifc_class="IfcBeam", role="beam", start=(a[0], a[1], Z),
                  end=(b[0], b[1], Z), section=Section("300x7 web", "I", depth=300.0, web_thickness=7.0,
                                                        area=5000.0),
                  storey="Level 1", tag=gid, name=gid, properties=props or {})


def column(gid, x, y):
    return Member(global_id=gid, ifc_class="IfcColumn", role="column", start=(x, y, 0.0), end=(x, y, Z),
                  section=Section("col", "I", depth=250.0), storey="Level 1")


def jt(b, end, sup):
    return Joint(id=joint_id(b, end, sup), beam=b, end=end, support=sup, kind="column-flange",
                 geometry=JointGeometry((0.0, 0.0, Z)))


def bay(props_l1=None):
    """A 6 m × 3 m bay (aspect 2 → one-way) on four columns: L1, L2 the 6 m long edges, T1, T2 the
    3 m short edges."""
    ms = [column("C1", 0, 0), column("C2", 6000, 0), column("C3", 0, 3000), column("C4", 6000, 3000),
          beam("L1", (0, 0), (6000, 0), props_l1), beam("L2", (0, 3000), (6000, 3000)),
          beam("T1", (0, 0), (0, 3000)), beam("T2", (6000, 0), (6000, 3000))]
    js = [jt("L1", "start", "C1"), jt("L1", "end", "C2"), jt("L2", "start", "C3"), jt("L2", "end", "C4"),
          jt("T1", "start", "C1"), jt("T1", "end", "C3"), jt("T2", "start", "C2"), jt("T2", "end", "C4")]
    return {m.global_id: m for m in ms}, js


def web_shear(m):
    # φVw = 0.9 × 0.6 × 300 MPa × (300 × 7 mm²) = 0.9 × 0.6 × 300 × 2100 = 340 200 N  (cl. 5.11.4)
    s = m.section
    return None if s.web_thickness is None else 0.9 * 0.6 * 300.0 * s.depth * s.web_thickness


def by_joint(js, demands):
    return {(j.beam, j.end): demands[j.id] for j in js}


def test_model_property_wins_and_is_converted_from_the_model_force_unit():
    members, js = bay({"Analysis.Vstart": -45.2, "Analysis.Vend": 47.0})
    c = cfg(start_shear="Analysis.Vstart", end_shear="Analysis.Vend", capacity_fraction=0.5)
    demands, warnings = resolve_demands(js, members, c, n_per_force_unit=1000.0,
                                        web_shear_capacity=web_shear)
    d = by_joint(js, demands)
    # |−45.2 kN| × 1000 N/kN = 45 200 N; 47.0 kN → 47 000 N
    assert d[("L1", "start")].V == pytest.approx(45200.0) and d[("L1", "start")].source == "model"
    assert d[("L1", "end")].V == pytest.approx(47000.0)
    assert "Analysis.Vstart" in d[("L1", "start")].detail
    # L2 has no analysis property → falls to capacity-fraction: 0.5 × 340 200 N = 170 100 N
    assert d[("L2", "start")].source == "capacity-fraction"
    assert d[("L2", "start")].V == pytest.approx(170100.0)
    assert "common practice" in d[("L2", "start")].combination
    assert warnings == []


def test_non_numeric_model_property_is_warned_and_next_source_used():
    members, js = bay({"Analysis.Vstart": "n/a"})
    c = cfg(start_shear="Analysis.Vstart", end_shear="Analysis.Vend")
    demands, warnings = resolve_demands(js, members, c, web_shear_capacity=web_shear)
    assert by_joint(js, demands)[("L1", "start")].source == "capacity-fraction"
    assert any(w.global_id == "L1" and "'n/a', not a number" in w.message for w in warnings)


def test_schedule_comes_before_capacity_fraction_in_the_default_order(tmp_path):
    p = tmp_path / "d.csv"
    p.write_text("beam,end,V_kN,N_kN\nL1,both,85,25\nT1,start,30\n", encoding="utf-8")
    members, js = bay()
    demands, warnings = resolve_demands(js, members, cfg(), schedule=read_demand_schedule(p),
                                        web_shear_capacity=web_shear, tie_kN=75.0)
    d = by_joint(js, demands)
    assert (d[("L1", "end")].V, d[("L1", "end")].N, d[("L1", "end")].source) == (85e3, 25e3, "schedule")
    assert "d.csv line 2" in d[("L1", "end")].detail
    # T1 start: scheduled V, no N_kN on the row → the tie force 75 kN applies
    assert (d[("T1", "start")].V, d[("T1", "start")].N) == (30e3, 75e3)
    assert d[("T1", "end")].source == "capacity-fraction" and d[("T1", "end")].N == 75e3


def test_tributary_take_down_gives_the_demand_with_its_combination():
    members, js = bay()
    c = cfg(order=["tributary", "capacity-fraction"], self_weight=False,
            area_loads=[{"storey": "Level 1", "dead_kPa": 4.0, "live_kPa": 3.0}])
    demands, warnings = resolve_demands(js, members, c, combination=AS_COMB, web_shear_capacity=web_shear)
    d = by_joint(js, demands)
    # L1: one-way, half the 3 m width: 1.5 × 6 = 9 m² → 4.5 m² per end;
    #     G = 4.5 × 4 = 18 kN, Q = 4.5 × 3 = 13.5 kN; V* = 1.2·18 + 1.5·13.5 = 21.6 + 20.25 = 41.85 kN
    assert d[("L1", "start")].V == pytest.approx(41.85e3, rel=0.01)
    assert d[("L1", "start")].source == "tributary"
    assert d[("L1", "start")].combination == "1.2G + 1.5Q (AS/NZS 1170.0 4.2.2)"
    # the short edges of a one-way panel carry no floor load (self-weight off) → V = 0 from the take-down
    assert d[("T1", "end")].V == 0.0 and d[("T1", "end")].source == "tributary"


def test_no_source_gives_none_and_says_what_is_missing():
    members, js = bay()
    c = cfg(order=["model", "tributary", "capacity-fraction"])
    demands, warnings = resolve_demands(js, members, c)
    assert all(v is None for v in demands.values())
    w = next(w for w in warnings if w.global_id == "L1" and "start end" in w.message)
    assert "model: demand.start_shear is not set" in w.message
    assert "tributary: no floor area loads configured" in w.message
    assert "capacity-fraction: no web shear capacity available" in w.message
    res = resolve_demands_detailed(js, members, c)
    assert set(res.missing) == {j.id for j in js}


def test_take_down_without_a_combination_is_reported_missing():
    members, js = bay()
    c = cfg(order=["tributary"], area_loads=[{"storey": "*", "dead_kPa": 4.0}])
    res = resolve_demands_detailed(js, members, c)
    assert "no ultimate load combination" in next(iter(res.missing.values()))


def test_unknown_section_capacity_is_a_reason_not_a_crash():
    members, js = bay()
    members["L1"] = dataclasses.replace(members["L1"], section=Section("unknown"))
    res = resolve_demands_detailed(js, members, cfg(order=["capacity-fraction"]), web_shear_capacity=web_shear)
    j = next(j for j in js if j.beam == "L1")
    assert res.demands[j.id] is None and "web shear capacity unknown" in res.missing[j.id]


@pytest.mark.parametrize("demand, match", [
    ({"order": ["model", "guess"]}, r"'demand\.order' has 'guess'"),
    ({"order": ["model", "model"]}, r"'demand\.order' names a source twice"),
    ({"capacity_fraction": 1.5}, r"'demand\.capacity_fraction' is 1\.5"),
    ({"start_shear": "EndShear"}, r"'demand\.start_shear' is 'EndShear'; write it as \"PsetName\.PropertyName\""),
    ({"tie_kN": -5}, r"'demand\.tie_kN' is -5"),
    ({"area_loads": [{"storey": "L1", "live_kPa": "3"}]}, r"'demand\.area_loads\[0\]\.live_kPa' must be a number"),
])
def test_bad_demand_config_names_the_key(demand, match):
    members, js = bay()
    with pytest.raises(ConfigError, match=match):
        resolve_demands(js, members, cfg(**demand), combination=AS_COMB)
