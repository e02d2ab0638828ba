"""Pausing Python's cyclic garbage collector while many long-lived records are built.

The audit builds millions of small objects (members, joints, results, the results document) that
live until it ends and form no reference cycles to speak of. Each automatic collection on the way
walks all of them again — its full passes grow with the heap — and frees nothing; reference
counting still frees everything else at once. Pausing the collector for such a stretch saves about a
tenth of the run on a 20k-member model.
"""

from __future__ import annotations

import gc
from contextlib import contextmanager
from typing import Iterator

__all__ = ["cycle_collection_paused"]


@contextmanager
def cycle_collection_paused() -> Iterator[None]:
    """Pause the cyclic garbage collector for the ``with`` block; restore its state after (nested
    uses are fine: only the outermost one that paused it turns it back on)."""
    was = gc.isenabled()
    gc.disable()
    try:
        yield
    finally:
        if was:
            gc.enable()
