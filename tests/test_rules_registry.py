"""The rule-set registry: discovery through (faked) entry points, validation at load time."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

import pytest

import rules
from engine.errors import RuleSetError
from engine.model import Check
from rules.base import RuleSet, hinge_positions


class DummyRules(RuleSet):
    """A firm's own rule set: one check, the bolt capacity from a fixed stress (test data only)."""

    code_id = "dummy"
    title = "Dummy rules for the registry test"

    def bolt_shear_capacity(self, size, grade, threads_in_shear_plane=True, shear_planes=1):
        d = float(size.lstrip("M"))
        return 100.0 * 3.141592653589793 * d * d / 4.0 * shear_planes

    def fillet_weld_capacity(self, leg_mm, electrode):
        return 100.0 * leg_mm

    def check_fin_plate(self, joint, demand, plate, beam, support, policy="conservative"):
        cap = self.bolt_shear_capacity(plate.bolts.size, plate.bolts.grade) * plate.n_bolts
        u = demand.V / cap
        return [Check("bolt shear", "dummy 1.1", demand.V, cap, "N", u, u <= 1.0)]

    def check_list(self):
        return [("bolt shear", "dummy 1.1")]

    def data_sources(self):
        return ["invented for the test"]

    def ultimate_combination(self):
        return {"name": "1.0G + 1.0Q", "dead": 1.0, "live": 1.0, "dead_only": 1.0, "source": "test"}


class Incomplete(RuleSet):
    code_id = "incomplete"
    title = "misses methods"

    def bolt_shear_capacity(self, size, grade, threads_in_shear_plane=True, shear_planes=1):
        return 1.0


class WrongSignature(DummyRules):
    code_id = "wrongsig"

    def bolt_shear_capacity(self, bolt, grade):  # type: ignore[override]
        return 1.0


@dataclass
class FakeEntryPoint:
    name: str
    value: str
    target: Any
    group: str = rules.ENTRY_POINT_GROUP

    def load(self) -> Any:
        if isinstance(self.target, Exception):
            raise self.target
        return self.target


def fake(*eps: FakeEntryPoint):
    return lambda: list(eps)


def test_dummy_rule_set_registered_through_a_faked_entry_point_is_loaded_and_runs():
    from engine.model import BoltSpec, Demand, FinPlate, Joint, JointGeometry, Steel, Weld, Member, Section

    source = fake(FakeEntryPoint("dummy", "firm_rules:DummyRules", DummyRules))
    assert rules.available(source) == ["dummy"]
    rs = rules.load("dummy", entry_points=source)
    assert isinstance(rs, DummyRules)
    plate = FinPlate(10, 230, 100, Steel("300", 320, 440), BoltSpec("M20", 20, "8.8"), 3, 1, 70, 0,
                     45, 50, 40, 40, 50, Weld(6, "E48XX"))
    joint = Joint("J-1", "B", "end", "C", "column-flange", JointGeometry((0, 0, 0)))
    beam = Member("B", "IfcBeam", "beam", (0, 0, 0), (6000, 0, 0), Section("310UB40.4"))
    # 3 bolts x 100 MPa x pi x 20^2 / 4 = 94 247.8 N; V = 100 kN exceeds it
    checks = rs.check_fin_plate(joint, Demand(V=100e3), plate, beam, None)
    assert checks[0].capacity == pytest.approx(94247.78, rel=1e-6)
    assert checks[0].passed is False
    assert rs.check_fin_plate(joint, Demand(V=90e3), plate, beam, None)[0].passed is True


def test_unknown_rule_set_names_the_installed_ones():
    source = fake(FakeEntryPoint("dummy", "x:y", DummyRules))
    with pytest.raises(RuleSetError, match=r"no rule set 'nope' is installed \(installed: dummy\)"):
        rules.load("nope", entry_points=source)


def test_rule_set_missing_contract_methods_is_rejected_at_load():
    source = fake(FakeEntryPoint("incomplete", "x:Incomplete", Incomplete))
    with pytest.raises(RuleSetError, match="does not implement check_fin_plate"):
        rules.load("incomplete", entry_points=source)


def test_rule_set_with_a_signature_that_does_not_fit_is_rejected_with_the_definition():
    source = fake(FakeEntryPoint("wrongsig", "x:WrongSignature", WrongSignature))
    with pytest.raises(RuleSetError, match=r"bolt_shear_capacity\(self, bolt, grade\) does not fit"):
        rules.load("wrongsig", entry_points=source)


def test_rule_set_whose_code_id_differs_from_its_entry_point_name_is_rejected():
    source = fake(FakeEntryPoint("other", "x:DummyRules", DummyRules))
    with pytest.raises(RuleSetError, match="code_id is 'dummy', it must equal its entry-point name"):
        rules.load("other", entry_points=source)


def test_object_that_is_not_a_rule_set_is_rejected():
    source = fake(FakeEntryPoint("junk", "x:junk", object()))
    with pytest.raises(RuleSetError, match="is not a rules.base.RuleSet subclass"):
        rules.load("junk", entry_points=source)


def test_plug_in_that_fails_to_import_is_a_rule_set_error():
    source = fake(FakeEntryPoint("broken", "firm:Rules", ImportError("No module named 'firm'")))
    with pytest.raises(RuleSetError, match="failed to load: No module named 'firm'"):
        rules.load("broken", entry_points=source)


def test_duplicate_registration_warns_and_uses_the_first():
    source = fake(FakeEntryPoint("dummy", "a:DummyRules", DummyRules), FakeEntryPoint("dummy", "b:Other", object()))
    with pytest.warns(UserWarning, match="registered more than once"):
        rs = rules.load("dummy", entry_points=source)
    assert isinstance(rs, DummyRules)


def test_built_in_codes_are_registered_through_the_entry_point_group():
    assert {"as4100", "en1993", "aisc360"} <= set(rules.available())


@pytest.mark.parametrize(
    "stiffness, policy, expected",
    [
        ("stiff", "conservative", ("bolt-line",)),
        ("flexible", "conservative", ("support-face",)),
        ("stiff", "classified", ("bolt-line",)),
        ("flexible", "envelope", ("bolt-line", "support-face")),
        ("stiff", "envelope", ("bolt-line", "support-face")),
    ],
)
def test_hinge_position_follows_support_stiffness_and_policy(stiffness, policy, expected):
    assert hinge_positions(stiffness, policy) == expected


def test_unknown_support_policy_is_a_config_error():
    from engine.errors import ConfigError

    with pytest.raises(ConfigError, match="support policy 'loose' is not one of"):
        hinge_positions("stiff", "loose")
