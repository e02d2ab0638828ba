"""engine.memory: the allocator settings are made where the GNU C library is present and are
harmless no-ops elsewhere; freed scratch memory really goes back to the operating system."""

from __future__ import annotations

import sys

import numpy as np
import pytest

from engine.memory import _libc, give_back_free_memory, map_large_blocks_apart


def _rss_mb() -> float:
    with open("/proc/self/statm") as fh:
        return int(fh.read().split()[1]) * 4096 / 2**20


def test_the_settings_report_whether_they_were_made():
    made = map_large_blocks_apart()
    assert isinstance(made, bool) and isinstance(give_back_free_memory(), bool)
    assert made == bool(_libc())


@pytest.mark.skipif(not sys.platform.startswith("linux") or not _libc(), reason="GNU C library only")
def test_a_large_freed_array_leaves_the_process():
    map_large_blocks_apart()
    before = _rss_mb()
    blocks = [np.ones(2_000_000) for _ in range(20)]  # 20 × 16 MB, touched
    grown = _rss_mb()
    del blocks
    give_back_free_memory()
    assert grown - before > 250
    assert _rss_mb() - before < 50
