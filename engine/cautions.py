"""The safety cautions shown by the CLI, the README and every report."""

from __future__ import annotations

__all__ = ["CAUTION", "CAUTION_SHORT"]

CAUTION = (
    "joint-audit is an aid to a competent structural engineer, not a substitute for one. "
    "Connection failures hurt people: every result must be checked by a competent engineer, "
    "and the governing local code, the project's specification and licensed professional practice "
    "take precedence over anything this tool reports."
)
CAUTION_SHORT = "Aid to a competent engineer only: check every result; local codes and licensed practice take precedence."
