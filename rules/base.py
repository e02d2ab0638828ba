"""The contract every design-code rule set implements.

A rule set is a subclass of :class:`RuleSet`, registered under the entry-point group
``joint_audit.rules`` (see ``pyproject.toml``; the built-in codes are registered the same way as a
firm's own). The registry (:func:`rules.load`) rejects, at load time, an object that is not a
``RuleSet``, whose ``code_id`` differs from its entry-point name, that leaves a contract method
unimplemented, or whose method signatures do not fit the contract.

Units: N, mm, MPa, N·mm throughout. Every check is a small pure function that returns a
:class:`engine.model.Check`; a failed check is a result, never an exception, and a check whose
inputs are missing or outside its validity range returns an *incomplete* ``Check`` naming the
clause.

An aid to a competent engineer: results must be checked, and the governing local code and licensed
practice take precedence.
"""

from __future__ import annotations

from abc import ABC, abstractmethod
from typing import ClassVar

from engine.model import Check, Demand, FinPlate, Joint, Member

__all__ = [
    "RuleSet",
    "HINGE_AT_BOLTS",
    "HINGE_AT_SUPPORT",
    "POLICIES",
    "hinge_positions",
    "CONTRACT_METHODS",
]

HINGE_AT_BOLTS = "bolt-line"
"""Stiff support: the hinge sits at the bolt line; bolts carry V, plate and weld carry V·a."""
HINGE_AT_SUPPORT = "support-face"
"""Flexible support: the hinge sits at the support face; bolts carry V and V·a, weld carries V."""

POLICIES: tuple[str, ...] = ("conservative", "classified", "envelope")


def hinge_positions(stiffness: str, policy: str) -> tuple[str, ...]:
    """Hinge positions to check for a joint of the given ``stiffness`` under ``policy``.

    ``envelope`` checks both; otherwise a stiff support puts the hinge at the bolt line and a
    flexible one at the support face. (Under ``conservative`` the joint finder has already
    classified every support that is not clearly stiff as flexible.)
    """
    if policy not in POLICIES:
        from engine.errors import ConfigError

        raise ConfigError(f"support policy {policy!r} is not one of {', '.join(POLICIES)}")
    if policy == "envelope":
        return (HINGE_AT_BOLTS, HINGE_AT_SUPPORT)
    return (HINGE_AT_BOLTS,) if stiffness == "stiff" else (HINGE_AT_SUPPORT,)


class RuleSet(ABC):
    """A design code's checks for bolted single-plate (fin plate) shear connections."""

    code_id: ClassVar[str]
    """Short id used on the command line, e.g. ``"as4100"``."""
    title: ClassVar[str]
    """Human title with edition, e.g. ``"AS 4100:2020 Steel structures"``."""

    @abstractmethod
    def bolt_shear_capacity(
        self, size: str, grade: str, threads_in_shear_plane: bool = True, shear_planes: int = 1
    ) -> float:
        """Design shear capacity of one bolt in N (φVf, Fv,Rd or φRn) for ``size`` as the trade
        writes it (``"M20"``, ``"3/4"``) and ``grade`` as the standard names it."""

    @abstractmethod
    def fillet_weld_capacity(self, leg_mm: float, electrode: str) -> float:
        """Design capacity of a fillet weld in N per mm of weld length (one weld, not both sides)."""

    @abstractmethod
    def check_fin_plate(
        self,
        joint: Joint,
        demand: Demand,
        plate: FinPlate,
        beam: Member,
        support: Member | None,
        policy: str = "conservative",
    ) -> list[Check]:
        """Every check of the fin-plate connection at ``joint`` under ``demand``, for each hinge
        position :func:`hinge_positions` gives (the hinge is named in the check's name)."""

    @abstractmethod
    def check_list(self) -> list[tuple[str, str]]:
        """The checks this rule set performs, as ``(name, clause)`` pairs, for ``joint-audit rules``."""

    @abstractmethod
    def data_sources(self) -> list[str]:
        """The published sources of the data tables this rule set uses (standard, edition, table)."""

    @abstractmethod
    def ultimate_combination(self) -> dict[str, object]:
        """The ultimate limit state combination for gravity load take-down:
        ``{"name": str, "dead": float, "live": float, "dead_only": float, "source": str}`` where
        the design load is ``max(dead*G + live*Q, dead_only*G)``."""


    def web_shear_capacity(self, member: Member) -> float | None:
        """Design shear capacity (N) of the member's web, for the ``capacity-fraction`` demand
        source; ``None`` when the section or steel is not known. Optional: the default says the
        rule set does not provide it."""
        return None


CONTRACT_METHODS: tuple[str, ...] = (
    "bolt_shear_capacity",
    "fillet_weld_capacity",
    "check_fin_plate",
    "check_list",
    "data_sources",
    "ultimate_combination",
)
