"""Design-code rule sets, discovered through the entry-point group ``joint_audit.rules``.

>>> import rules
>>> rs = rules.load("as4100")           # doctest: +SKIP
>>> rs.bolt_shear_capacity("M20", "8.8")  # doctest: +SKIP

An aid to a competent engineer: results must be checked, and the governing local code and licensed
practice take precedence.
"""

from __future__ import annotations

import inspect
from importlib import metadata
from typing import Callable, Iterable

from engine.errors import RuleSetError
from rules.base import CONTRACT_METHODS, RuleSet

__all__ = ["ENTRY_POINT_GROUP", "RuleSet", "available", "load", "validate"]

ENTRY_POINT_GROUP = "joint_audit.rules"

EntryPointSource = Callable[[], Iterable[metadata.EntryPoint]]


def _installed_entry_points() -> list[metadata.EntryPoint]:
    return list(metadata.entry_points(group=ENTRY_POINT_GROUP))


def available(entry_points: EntryPointSource | None = None) -> list[str]:
    """Ids of the installed rule sets, sorted (duplicates listed once)."""
    eps = (entry_points or _installed_entry_points)()
    return sorted({ep.name for ep in eps})


def validate(obj: object, name: str) -> RuleSet:
    """Check that ``obj`` (a RuleSet subclass or instance) fits the contract; return an instance.

    Raises :class:`RuleSetError` naming the offending definition.
    """
    cls = obj if isinstance(obj, type) else type(obj)
    if not (isinstance(cls, type) and issubclass(cls, RuleSet)):
        raise RuleSetError(f"rule set {name!r}: {obj!r} is not a rules.base.RuleSet subclass")
    if inspect.isabstract(cls):
        missing = sorted(getattr(cls, "__abstractmethods__", ()))
        raise RuleSetError(f"rule set {name!r}: {cls.__qualname__} does not implement {', '.join(missing)}")
    if getattr(cls, "code_id", None) != name:
        raise RuleSetError(
            f"rule set {name!r}: {cls.__qualname__}.code_id is {getattr(cls, 'code_id', None)!r}, "
            f"it must equal its entry-point name"
        )
    for meth in CONTRACT_METHODS:
        want = inspect.signature(getattr(RuleSet, meth))
        got = inspect.signature(getattr(cls, meth))
        want_params = [p.name for p in want.parameters.values()]
        got_params = [p.name for p in got.parameters.values()]
        if got_params[: len(want_params)] != want_params or any(
            p.default is inspect.Parameter.empty for p in list(got.parameters.values())[len(want_params):]
        ):
            raise RuleSetError(
                f"rule set {name!r}: {cls.__qualname__}.{meth}{got} does not fit the contract "
                f"RuleSet.{meth}{want}"
            )
    return obj if not isinstance(obj, type) else cls()


def load(code_id: str, entry_points: EntryPointSource | None = None) -> RuleSet:
    """Load, validate and return the rule set registered as ``code_id``.

    ``entry_points`` replaces the installed entry points (used by tests to fake discovery).
    Raises :class:`RuleSetError` when no such rule set is installed, or it does not fit the
    contract.
    """
    eps = [ep for ep in (entry_points or _installed_entry_points)() if ep.name == code_id]
    if not eps:
        names = ", ".join(available(entry_points)) or "none"
        raise RuleSetError(f"no rule set {code_id!r} is installed (installed: {names})")
    if len({ep.value for ep in eps}) > 1:
        import warnings

        warnings.warn(
            f"rule set {code_id!r} is registered more than once ({', '.join(ep.value for ep in eps)}); "
            f"using {eps[0].value}",
            stacklevel=2,
        )
    try:
        obj = eps[0].load()
    except Exception as exc:  # a plug-in that fails to import is a rule-set error, not a crash
        raise RuleSetError(f"rule set {code_id!r} ({eps[0].value}) failed to load: {exc}") from exc
    return validate(obj, code_id)
