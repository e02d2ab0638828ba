"""Tolerances for finding joints (DESIGN.md §5 ``[tolerances]``), all lengths in mm.

The joint finder accepts a beam end at a support when the end lies within the support's section
envelope grown by these tolerances. Defaults are set for models drawn to the usual detailing
clearances; a coordinator can widen them for loosely drawn models. Every default below is a trade rule
of thumb with no published source (``# common practice``) unless it says otherwise.

An aid to a competent engineer: the joints found must be checked against the drawings, and the
governing local code and licensed practice take precedence.
"""

from __future__ import annotations

from dataclasses import dataclass, fields
from typing import Any, Mapping

from engine.errors import ConfigError

__all__ = ["Tolerances"]


@dataclass(frozen=True)
class Tolerances:
    """Geometric tolerances of the joint finder (mm and degrees).

    - ``joint_gap_mm``: how far a beam end may stop short of its support face and still be a joint
      (DESIGN.md §5 default 50). # common practice: end clearances are 10-25 mm, 50 allows slack.
    - ``lateral_tol_mm``: how far sideways of the support's face (beyond the flange tips, or beyond the
      clear depth between the flanges on the web side) the end may sit. # common practice
    - ``bearing_tol_mm``: vertical gap (or overlap) allowed between the underside of a bearing beam and
      the top of the beam, wall or slab it bears on. # common practice
    - ``node_tol_mm``: an end within this distance of the support's axis is a node-to-node end
      (centrelines meet) rather than a detailed end. # common practice
    - ``clash_tol_mm``: a detailed end running into the support by more than this is flagged as a
      clash in the reasons. # common practice
    - ``angle_tol_deg``: members within this angle of each other are collinear (splices, continuity);
      a beam within this angle of square to its support is "square", beyond it "skewed".
      # common practice
    - ``min_frame_angle_deg``: a beam meeting a support at less than this angle is running alongside
      it, not framing into it. # common practice (skews sharper than 30 degrees are impractical)
    - ``continuity_mm``: a support is continuous through a joint when it extends at least this far
      beyond the supported beam's section on both sides. # common practice
    - ``back_to_back_mm``: two joints on opposite sides of one support closer than this along the
      support are back-to-back. # common practice
    - ``balance_ratio``: back-to-back beams whose spans and depths are within this ratio of each other
      are "similar" (the support is balanced). # common practice
    - ``ambiguity_mm``: two different candidate supports whose gaps differ by less than this are
      equally near, and the end is left unresolved rather than guessed. # common practice
    - ``end_clearance_mm``: clearance assumed between a node-to-node beam end and the girder web
      when working out copes. # common practice
    - ``cope_clearance_mm``: how far a cope runs past the tip of the flange it clears.
      # common practice
    - ``unknown_half_size_mm``: half-size assumed for a support whose section is unknown, to find
      candidates (no gap is reported then). # common practice (a 400 mm section)
    """

    joint_gap_mm: float = 50.0
    lateral_tol_mm: float = 50.0
    bearing_tol_mm: float = 25.0
    node_tol_mm: float = 10.0
    clash_tol_mm: float = 5.0
    angle_tol_deg: float = 10.0
    min_frame_angle_deg: float = 30.0
    continuity_mm: float = 100.0
    back_to_back_mm: float = 100.0
    balance_ratio: float = 1.25
    ambiguity_mm: float = 1.0
    end_clearance_mm: float = 15.0
    cope_clearance_mm: float = 10.0
    unknown_half_size_mm: float = 200.0

    def __post_init__(self) -> None:
        for f in fields(self):
            value = getattr(self, f.name)
            if isinstance(value, bool) or not isinstance(value, (int, float)):
                raise ConfigError(f"[tolerances] {f.name} must be a number, got {value!r}")
            if not value >= 0.0 or value == float("inf"):
                raise ConfigError(f"[tolerances] {f.name} must be a finite number >= 0, got {value!r}")
            object.__setattr__(self, f.name, float(value))
        if self.balance_ratio < 1.0:
            raise ConfigError(f"[tolerances] balance_ratio must be >= 1, got {self.balance_ratio}")
        if not 0.0 < self.min_frame_angle_deg <= 90.0:
            raise ConfigError("[tolerances] min_frame_angle_deg must be in (0, 90]")
        if self.angle_tol_deg >= 45.0:
            raise ConfigError("[tolerances] angle_tol_deg must be below 45")

    @classmethod
    def from_config(cls, config: Mapping[str, Any] | None) -> "Tolerances":
        """Build from the ``[tolerances]`` table of the config (or the whole config, when it has a
        ``tolerances`` key). Unknown keys and bad values raise :class:`ConfigError` naming the key."""
        if config is None:
            return cls()
        if not isinstance(config, Mapping):
            raise ConfigError(f"[tolerances] must be a table, got {type(config).__name__}")
        table = config.get("tolerances", config) if "tolerances" in config else config
        if not isinstance(table, Mapping):
            raise ConfigError(f"[tolerances] must be a table, got {type(table).__name__}")
        known = {f.name for f in fields(cls)}
        for key in table:
            if key not in known:
                raise ConfigError(
                    f"[tolerances] unknown key {key!r}; known keys: {', '.join(sorted(known))}")
        return cls(**dict(table))

    @property
    def search_pad_mm(self) -> float:
        """Distance beyond a support's section half-size within which candidates are gathered (mm)."""
        return max(self.joint_gap_mm, self.lateral_tol_mm, self.bearing_tol_mm) + self.node_tol_mm
