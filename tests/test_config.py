"""The configuration: defaults, validation with errors naming file and key, --show-config round trip."""

from __future__ import annotations

import pytest

from engine.config import DEFAULTS, dumps_toml, load_config
from engine.errors import ConfigError


def test_defaults_apply_when_no_file_is_given():
    cfg = load_config()
    assert cfg["code"] == "as4100"
    assert cfg["support"]["policy"] == "conservative"
    assert cfg["demand"]["order"] == ["model", "schedule", "tributary", "capacity-fraction"]
    assert cfg["demand"]["capacity_fraction"] == 0.5
    assert cfg["tolerances"]["joint_gap_mm"] == 50.0


def test_file_values_override_defaults_table_by_table(tmp_path):
    f = tmp_path / "c.toml"
    f.write_text('code = "en1993"\n[support]\npolicy = "envelope"\n[[demand.area_loads]]\nstorey = "Level *"\ndead_kPa = 4.0\nlive_kPa = 3.0\n')
    cfg = load_config(f)
    assert cfg["code"] == "en1993"
    assert cfg["support"]["policy"] == "envelope"
    assert cfg["demand"]["self_weight"] is True  # untouched default kept
    assert cfg["demand"]["area_loads"] == [{"storey": "Level *", "dead_kPa": 4.0, "live_kPa": 3.0}]


@pytest.mark.parametrize(
    "text, match",
    [
        ("[support]\npolcy = 'x'\n", r"unknown key 'support.polcy'"),
        ("[support]\npolicy = 'loose'\n", r"'support.policy' is 'loose'; use one of conservative, classified, envelope"),
        ("[demand]\ncapacity_fraction = 1.5\n", r"'demand.capacity_fraction' is 1.5"),
        ("[demand]\norder = ['model', 'guess']\n", r"'demand.order' has 'guess'"),
        ("[tolerances]\njoint_gap_mm = 'fifty'\n", r"'tolerances.joint_gap_mm' must be a number"),
        ("[[demand.area_loads]]\nstorey = 'L1'\ndead = 4\n", r"unknown key 'demand.area_loads\[0\].dead'"),
        ("[[demand.area_loads]]\nstorey = 'L1'\nlive_kPa = -3\n", r"'demand.area_loads\[0\].live_kPa' must not be negative"),
        ("code = \n", r"not valid TOML"),
        ("support = 3\n", r"'support' must be a table"),
    ],
)
def test_bad_config_names_the_file_and_the_key(tmp_path, text, match):
    f = tmp_path / "bad.toml"
    f.write_text(text)
    with pytest.raises(ConfigError, match=match) as info:
        load_config(f)
    assert str(f) in str(info.value)


def test_missing_config_file_is_a_config_error(tmp_path):
    with pytest.raises(ConfigError, match="does not exist"):
        load_config(tmp_path / "none.toml")


def test_shown_config_round_trips(tmp_path):
    cfg = load_config(overrides={"demand": {"area_loads": [{"storey": "*", "dead_kPa": 4.0, "live_kPa": 3.0}]}})
    f = tmp_path / "shown.toml"
    f.write_text(dumps_toml(cfg))
    assert load_config(f) == cfg
    assert set(DEFAULTS) == set(cfg)


def test_the_readme_config_example_is_valid_and_shows_the_defaults(tmp_path):
    from pathlib import Path

    readme = (Path(__file__).resolve().parents[1] / "README.md").read_text(encoding="utf-8")
    block = readme.split("```toml", 1)[1].split("```", 1)[0]
    f = tmp_path / "readme.toml"
    f.write_text(block)
    cfg = load_config(f)
    assert cfg == load_config()  # the README lists the defaults
