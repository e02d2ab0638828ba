"""joint-audit mechanics and pipeline: code-agnostic, never imports ifcopenshell.

An aid to a competent engineer: results must be checked, and the governing local code and licensed
practice take precedence.
"""

__version__ = "0.1.0"
