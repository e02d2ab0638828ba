"""Giving memory back to the operating system on large models (GNU C library only; elsewhere these
do nothing).

The joint finder's numpy scratch arrays (the grid, every candidate pair) are tens of megabytes on a
20k-member model. By default the C library serves arrays of up to 32 MB from its heap once a larger
one has been freed, and a freed block in the middle of the heap stays in the process: the finder's
scratch would then stay in the audit's memory for the rest of the run. Two settings avoid that:
large blocks are always mapped on their own (given back as soon as they are freed), and once the
finder is done the heap's free pages are given back.
"""

from __future__ import annotations

import ctypes
import ctypes.util
import sys

__all__ = ["map_large_blocks_apart", "give_back_free_memory"]

_M_MMAP_THRESHOLD = -3  # mallopt parameter (glibc malloc.h)
_LIBC = None


def _libc():
    global _LIBC
    if _LIBC is None:
        _LIBC = False
        if sys.platform.startswith("linux"):
            try:
                lib = ctypes.CDLL(ctypes.util.find_library("c") or "libc.so.6")
                if hasattr(lib, "mallopt") and hasattr(lib, "malloc_trim"):
                    _LIBC = lib
            except OSError:
                pass
    return _LIBC


def map_large_blocks_apart(threshold: int = 1 << 20) -> bool:
    """Serve every block of ``threshold`` bytes or more (1 MiB) by its own memory mapping, for the
    rest of the process (it also stops the C library raising that threshold by itself). Returns
    whether the setting was made. For a command-line run, not for a host program's process."""
    lib = _libc()
    return bool(lib and lib.mallopt(_M_MMAP_THRESHOLD, int(threshold)))


def give_back_free_memory() -> bool:
    """Give the heap's free pages back to the operating system (``malloc_trim``); a few
    milliseconds. Returns whether anything could be given back."""
    lib = _libc()
    return bool(lib and lib.malloc_trim(0))
