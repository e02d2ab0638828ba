"""Turn a demand and a capacity into an :class:`engine.model.Check`, the same way for every rule set.

Conventions (rules/base.py): ``utilisation = demand / capacity`` and the check passes when it is at
most 1 (within 1e-9); for a minimum limit the required minimum is the demand and the provided value
the capacity; for a maximum limit the provided value is the demand and the limit the capacity. A
capacity that is not positive gives utilisation ``inf`` and a failed check when there is a demand,
and 0 (passed) when there is none. A check that cannot be made is *incomplete* and does not pass.
"""

from __future__ import annotations

import math

from engine.model import Check

__all__ = ["TOL", "make_check", "make_min_check", "make_max_check", "incomplete_check"]

TOL = 1e-9


def make_check(name: str, clause: str, demand: float, capacity: float, unit: str, note: str = "") -> Check:
    """A capacity check: utilisation = demand / capacity, passes when ≤ 1."""
    demand, capacity = float(demand), float(capacity)
    if capacity > 0:
        util = demand / capacity
    else:
        util = math.inf if demand > 0 else 0.0
    return Check(name, clause, demand, capacity, unit, util, bool(util <= 1.0 + TOL), note)


def make_min_check(name: str, clause: str, required: float, provided: float, unit: str, note: str = "") -> Check:
    """A minimum limit: demand = the required minimum, capacity = the value provided."""
    return make_check(name, clause, required, provided, unit, note)


def make_max_check(name: str, clause: str, provided: float, limit: float, unit: str, note: str = "") -> Check:
    """A maximum limit: demand = the value provided, capacity = the limit."""
    return make_check(name, clause, provided, limit, unit, note)


def incomplete_check(name: str, clause: str, note: str, unit: str = "-") -> Check:
    """A check that cannot be made (inputs missing or outside the validity range): not passed."""
    return Check(name, clause, 0.0, 0.0, unit, 0.0, False, note, incomplete=True)
