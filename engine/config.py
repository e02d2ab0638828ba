"""The audit configuration (TOML): defaults, loading and validation (DESIGN.md §5).

Every key is optional. Unknown keys and wrong types are errors (:class:`ConfigError`) that name the
file and the key, so a typo never silently falls back to a default. ``joint-audit audit
--show-config`` prints the effective configuration.
"""

from __future__ import annotations

import copy
import tomllib
from pathlib import Path
from typing import Any, Mapping

from engine.errors import ConfigError

__all__ = ["DEFAULTS", "DEFAULT_GRADE_BY_CODE", "DEFAULT_PLATE_GRADE_BY_CODE", "DEFAULT_ELECTRODE_BY_CODE",
           "member_grade", "plate_grade", "weld_electrode", "load_config", "merge_config", "dumps_toml"]

DEFAULTS: dict[str, Any] = {
    "code": "as4100",
    "support": {"policy": "conservative"},
    "demand": {
        "order": ["model", "schedule", "tributary", "capacity-fraction"],
        "self_weight": True,
        "capacity_fraction": 0.5,
        "start_shear": "",
        "end_shear": "",
        "area_loads": [],
        "tie_kN": 0.0,
    },
    "materials": {"default_grade": "", "plate_grade": ""},
    "connections": {"weld_leg_mm": 6.0, "weld_electrode": "", "both_sides": True},
    "tolerances": {},  # filled from engine.tolerances.Tolerances below (joint_gap_mm = 50, ...)
}
"""Built-in defaults. ``materials.default_grade = ""`` means the code's usual member grade
(:data:`DEFAULT_GRADE_BY_CODE`), ``materials.plate_grade = ""`` the code's usual plate grade
(:data:`DEFAULT_PLATE_GRADE_BY_CODE`); ``connections.weld_*`` is the weld assumed for a modelled
plate whose weld the model does not describe (``weld_electrode = ""``: the code's usual electrode,
:data:`DEFAULT_ELECTRODE_BY_CODE`)."""

def _tolerance_defaults() -> dict[str, float]:
    from dataclasses import fields

    from engine.tolerances import Tolerances

    return {f.name: float(f.default) for f in fields(Tolerances)}


DEFAULTS["tolerances"] = _tolerance_defaults()

DEFAULT_GRADE_BY_CODE: dict[str, str] = {"as4100": "300", "en1993": "S355", "aisc360": "A992"}
"""Steel grade assumed, with a warning, for members whose material the model does not name."""

DEFAULT_PLATE_GRADE_BY_CODE: dict[str, str] = {"as4100": "250", "en1993": "S275", "aisc360": "A36"}
"""Plate grade assumed for scheduled or proposed plates with no grade of their own."""

DEFAULT_ELECTRODE_BY_CODE: dict[str, str] = {"as4100": "E48XX", "en1993": "S275", "aisc360": "E70XX"}
"""Weld electrode assumed where the model does not say (EN 1993-1-8 4.5.3.3 works from the parent
metal's fu and βw, so the EN entry names the weaker parent grade)."""

MAX_TOLERANCE_MM = 10_000.0
"""Largest joint tolerance in mm a config may set (10 m; the defaults are tens of mm)."""
MAX_WELD_LEG_MM = 100.0
"""Largest assumed fillet weld leg a config may set."""

def member_grade(cfg: Mapping[str, Any]) -> str:
    """Grade assumed for members the model gives none: ``materials.default_grade``, else the code's
    usual grade (:data:`DEFAULT_GRADE_BY_CODE`), else ``"default"``."""
    return cfg["materials"]["default_grade"] or DEFAULT_GRADE_BY_CODE.get(cfg["code"], "default")


def plate_grade(cfg: Mapping[str, Any]) -> str:
    """Plate grade for scheduled or proposed plates: ``materials.plate_grade``, else the code's usual
    plate grade (:data:`DEFAULT_PLATE_GRADE_BY_CODE`)."""
    return cfg["materials"]["plate_grade"] or DEFAULT_PLATE_GRADE_BY_CODE.get(cfg["code"], "")


def weld_electrode(cfg: Mapping[str, Any]) -> str:
    """Electrode assumed where the model gives none: ``connections.weld_electrode``, else the code's
    usual electrode (:data:`DEFAULT_ELECTRODE_BY_CODE`)."""
    return cfg["connections"]["weld_electrode"] or DEFAULT_ELECTRODE_BY_CODE.get(cfg["code"], "")


_AREA_LOAD_KEYS = {"storey": str, "dead_kPa": (int, float), "live_kPa": (int, float)}
_DEMAND_SOURCES = ("model", "schedule", "tributary", "capacity-fraction")
_POLICIES = ("conservative", "classified", "envelope")


def _check_types(data: dict[str, Any], ref: dict[str, Any], where: str, path: str) -> None:
    for key, value in data.items():
        dotted = f"{path}{key}"
        if key not in ref:
            valid = ", ".join(sorted(ref))
            raise ConfigError(f"{where}: unknown key '{dotted}' (valid keys here: {valid})")
        want = ref[key]
        if isinstance(want, dict):
            if not isinstance(value, dict):
                raise ConfigError(f"{where}: '{dotted}' must be a table [{dotted}]")
            _check_types(value, want, where, dotted + ".")
        elif isinstance(want, bool):
            if not isinstance(value, bool):
                raise ConfigError(f"{where}: '{dotted}' must be true or false, not {value!r}")
        elif isinstance(want, (int, float)):
            if isinstance(value, bool) or not isinstance(value, (int, float)):
                raise ConfigError(f"{where}: '{dotted}' must be a number, not {value!r}")
        elif isinstance(want, str):
            if not isinstance(value, str):
                raise ConfigError(f"{where}: '{dotted}' must be a string, not {value!r}")
        elif isinstance(want, list):
            if not isinstance(value, list):
                raise ConfigError(f"{where}: '{dotted}' must be a list, not {value!r}")


def _validate(cfg: dict[str, Any], where: str) -> None:
    if cfg["support"]["policy"] not in _POLICIES:
        raise ConfigError(
            f"{where}: 'support.policy' is {cfg['support']['policy']!r}; use one of {', '.join(_POLICIES)}"
        )
    for item in cfg["demand"]["order"]:
        if item not in _DEMAND_SOURCES:
            raise ConfigError(
                f"{where}: 'demand.order' has {item!r}; the sources are {', '.join(_DEMAND_SOURCES)}"
            )
    frac = cfg["demand"]["capacity_fraction"]
    if not 0.0 < frac <= 1.0:
        raise ConfigError(f"{where}: 'demand.capacity_fraction' is {frac}; it must be in (0, 1]")
    for key, value in cfg["tolerances"].items():
        if value < 0:
            raise ConfigError(f"{where}: 'tolerances.{key}' must not be negative")
        if key.endswith("_mm") and value > MAX_TOLERANCE_MM:
            raise ConfigError(f"{where}: 'tolerances.{key}' is {value:g} mm; a joint tolerance must be at most "
                              f"{MAX_TOLERANCE_MM:g} mm (beyond it unrelated members would be joined)")
    if not isinstance(cfg["demand"]["order"], list) or not cfg["demand"]["order"]:
        raise ConfigError(f"{where}: 'demand.order' is empty; name at least one source of the end shear "
                          f"({', '.join(_DEMAND_SOURCES)})")
    leg = cfg["connections"]["weld_leg_mm"]
    if not 0.0 < leg <= MAX_WELD_LEG_MM:
        raise ConfigError(f"{where}: 'connections.weld_leg_mm' is {leg}; it must be more than 0 and at most "
                          f"{MAX_WELD_LEG_MM:g} mm")
    for i, entry in enumerate(cfg["demand"]["area_loads"]):
        key = f"demand.area_loads[{i}]"
        if not isinstance(entry, dict):
            raise ConfigError(f"{where}: '{key}' must be a table with storey, dead_kPa, live_kPa")
        for k, v in entry.items():
            if k not in _AREA_LOAD_KEYS:
                raise ConfigError(f"{where}: unknown key '{key}.{k}' (valid: storey, dead_kPa, live_kPa)")
            if not isinstance(v, _AREA_LOAD_KEYS[k]) or isinstance(v, bool):
                raise ConfigError(f"{where}: '{key}.{k}' has the wrong type ({v!r})")
        for k in ("dead_kPa", "live_kPa"):
            if entry.get(k, 0.0) < 0:
                raise ConfigError(f"{where}: '{key}.{k}' must not be negative")


def merge_config(base: dict[str, Any], override: dict[str, Any]) -> dict[str, Any]:
    """A new config: ``override``'s values over ``base``'s, table by table (lists are replaced)."""
    out = copy.deepcopy(base)
    for key, value in override.items():
        if isinstance(value, dict) and isinstance(out.get(key), dict):
            out[key] = merge_config(out[key], value)
        else:
            out[key] = copy.deepcopy(value)
    return out


def load_config(path: str | Path | None = None, overrides: dict[str, Any] | None = None) -> dict[str, Any]:
    """The effective configuration: defaults, then the TOML file at ``path``, then ``overrides``.

    Raises :class:`ConfigError` naming the file, the key (or TOML line) and the problem.
    """
    cfg = copy.deepcopy(DEFAULTS)
    if path is not None:
        p = Path(path)
        where = str(p)
        if not p.is_file():
            raise ConfigError(f"config file {where} does not exist or is not a file")
        try:
            data = tomllib.loads(p.read_text(encoding="utf-8"))
        except UnicodeDecodeError:
            raise ConfigError(f"{where}: not a UTF-8 text file") from None
        except tomllib.TOMLDecodeError as exc:
            raise ConfigError(f"{where}: not valid TOML ({exc})") from None
        except RecursionError:
            raise ConfigError(f"{where}: not valid TOML (nested too deeply)") from None
        except OSError as exc:
            raise ConfigError(f"{where}: cannot be read ({exc.strerror or exc})") from None
        _check_types(data, DEFAULTS, where, "")
        cfg = merge_config(cfg, data)
    if overrides:
        _check_types(overrides, DEFAULTS, "command line", "")
        cfg = merge_config(cfg, overrides)
    _validate(cfg, str(path) if path is not None else "config")
    return cfg


def _toml_value(v: Any) -> str:
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, (int, float)):
        return repr(v)
    if isinstance(v, str):
        return '"' + v.replace("\\", "\\\\").replace('"', '\\"') + '"'
    if isinstance(v, list):
        return "[" + ", ".join(_toml_value(x) for x in v) + "]"
    raise TypeError(type(v))


def dumps_toml(cfg: dict[str, Any]) -> str:
    """The configuration as TOML text (for ``--show-config``); round-trips through :func:`load_config`."""
    lines: list[str] = []
    tables: list[tuple[str, dict[str, Any]]] = []
    for key, value in cfg.items():
        if isinstance(value, dict):
            tables.append((key, value))
        else:
            lines.append(f"{key} = {_toml_value(value)}")
    for name, table in tables:
        lines.append("")
        lines.append(f"[{name}]")
        arrays: list[tuple[str, list[dict[str, Any]]]] = []
        for key, value in table.items():
            if isinstance(value, list) and value and all(isinstance(x, dict) for x in value):
                arrays.append((key, value))
            else:
                lines.append(f"{key} = {_toml_value(value)}")
        for key, items in arrays:
            for item in items:
                lines.append("")
                lines.append(f"[[{name}.{key}]]")
                lines.extend(f"{k} = {_toml_value(v)}" for k, v in item.items())
    return "\n".join(lines) + "\n"
