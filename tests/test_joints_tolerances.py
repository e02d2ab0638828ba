"""Tolerances: documented defaults, config parsing and the errors a user sees."""

from __future__ import annotations

import pytest

from engine.errors import ConfigError
from engine.tolerances import Tolerances


def test_default_joint_gap_is_the_design_contract_value():
    assert Tolerances().joint_gap_mm == 50.0  # DESIGN.md §5 [tolerances] joint_gap_mm = 50


def test_from_config_reads_the_table_or_the_whole_config():
    assert Tolerances.from_config({"joint_gap_mm": 75}).joint_gap_mm == 75.0
    assert Tolerances.from_config({"tolerances": {"lateral_tol_mm": 20}}).lateral_tol_mm == 20.0
    assert Tolerances.from_config(None) == Tolerances()


@pytest.mark.parametrize("table,key", [({"joint_gap": 50}, "joint_gap"),
                                       ({"joint_gap_mm": "fifty"}, "joint_gap_mm"),
                                       ({"bearing_tol_mm": -1}, "bearing_tol_mm"),
                                       ({"node_tol_mm": True}, "node_tol_mm"),
                                       ({"balance_ratio": 0.5}, "balance_ratio")])
def test_bad_keys_and_values_raise_config_error_naming_the_key(table, key):
    with pytest.raises(ConfigError, match=key):
        Tolerances.from_config(table)
