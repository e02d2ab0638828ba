"""Everything that touches IFC (and BCF): read the frame, read modelled connections, write results.

Depends on ``engine``'s plain data types only.

Reading:

* :func:`open_model` — check a path (missing, directory, empty, not STEP, truncated, unsupported
  schema) and open it; raises :class:`~engine.errors.BadInputError` /
  :class:`~engine.errors.UnsupportedSchemaError` with a one-line message.
* :func:`read_frame` — a path or an open ``ifcopenshell.file`` → :class:`engine.model.Frame`
  (members, bearings, connection parts, units, warnings), everything in mm.
* :mod:`ifc_io.units` — ``length_scale_to_mm(model)``, ``force_scale_to_n(model)``.

An aid to a competent engineer: results must be checked, and the governing local code and
licensed practice take precedence.
"""

from ifc_io import units
from ifc_io.open import open_model
from ifc_io.reader import read_frame

__all__ = ["open_model", "read_frame", "units"]
