"""The project's error hierarchy.

Every error raised on purpose by joint-audit derives from :class:`JointAuditError`. The CLI turns
any of them into one line on stderr and exit status 2. Messages say what is wrong and what the user
can do about it. A failed design check is a *result* (a ``Check`` with ``passed=False``), never an
exception.
"""

from __future__ import annotations

__all__ = [
    "JointAuditError",
    "BadInputError",
    "UnsupportedSchemaError",
    "MissingDataError",
    "ConfigError",
    "RuleSetError",
    "OutputError",
]


class JointAuditError(Exception):
    """Base class of every error joint-audit raises on purpose."""


class BadInputError(JointAuditError, ValueError):
    """An input file (model, schedule, baseline) cannot be used as given."""


class UnsupportedSchemaError(BadInputError):
    """The model is written in a schema joint-audit does not read (IFC2X3, IFC4, IFC4X3 are read)."""


class MissingDataError(JointAuditError, LookupError):
    """Data needed for a step is not in the model, the config or the tables."""


class ConfigError(BadInputError):
    """A configuration file or option is malformed or has an invalid value."""


class RuleSetError(JointAuditError):
    """A design-code rule set is missing, malformed or does not fit the rule-set contract."""


class OutputError(JointAuditError, OSError):
    """An output cannot be written (folder not writable, would overwrite the input, ...)."""
