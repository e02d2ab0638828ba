"""A bounded memo: a value computed once per distinct key, for texts that repeat many times in a
large output (escaped names, encoded property values). Bounded, so keys that never repeat (ids,
GlobalIds) do not pile up: past the limit, values are computed but no longer kept."""

from __future__ import annotations

from typing import Callable, Hashable

__all__ = ["BoundedMemo"]


class BoundedMemo(dict):
    """``memo[key]`` is ``fn(key)``, computed on first use and kept while fewer than ``limit`` keys
    are kept."""

    def __init__(self, fn: Callable[[Hashable], object], limit: int = 4096) -> None:
        super().__init__()
        self.fn, self.limit = fn, limit

    def __missing__(self, key):
        value = self.fn(key)
        if len(self) < self.limit:
            self[key] = value
        return value
