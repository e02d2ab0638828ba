"""Load the data tables in ``rules/data/*.toml`` (each table carries its source in the file).

Tables are read with :mod:`importlib.resources` so they work from an installed wheel.
"""

from __future__ import annotations

import tomllib
from functools import lru_cache
from importlib import resources
from typing import Any

from engine.errors import RuleSetError

__all__ = ["load_table", "table_names"]


@lru_cache(maxsize=None)
def load_table(name: str) -> dict[str, Any]:
    """Return the parsed TOML table ``rules/data/<name>.toml``.

    Raises :class:`RuleSetError` naming the file when it is missing or malformed.
    """
    ref = resources.files("rules").joinpath("data", f"{name}.toml")
    try:
        text = ref.read_text(encoding="utf-8")
    except FileNotFoundError as exc:
        raise RuleSetError(f"data table rules/data/{name}.toml is missing from the installation") from exc
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise RuleSetError(f"data table rules/data/{name}.toml is malformed: {exc}") from exc


def table_names() -> list[str]:
    """Names of all installed data tables (without ``.toml``), sorted."""
    folder = resources.files("rules").joinpath("data")
    return sorted(p.name[:-5] for p in folder.iterdir() if p.name.endswith(".toml"))
