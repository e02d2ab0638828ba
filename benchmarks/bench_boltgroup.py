"""Throughput of the batch bolt-group forms (engine.boltgroup), groups per second.

    python benchmarks/bench_boltgroup.py [--groups-elastic N] [--groups-icr N] [--repeat R] [--check]

For each bolt count n = 4..12 it builds a batch of fin-plate-like layouts (one vertical line of n
bolts, or two lines of n/2 for even n; pitch 60-90 mm, gauge 50-80 mm), each with its own
eccentricity (20-400 mm) and load angle (-30 to +30 deg), and times

* the elastic method: ``elastic_bolt_forces_batch`` for the loads of a unit shear, and
* the ICR method: ``icr_coefficients``.

The best of ``--repeat`` runs is reported. Targets (issue "Bolt-group mechanics"): elastic
>= 100 000 groups/s, ICR >= 2 000 groups/s. ``--check`` exits with status 1 when a target is
missed.
"""

from __future__ import annotations

import argparse
import sys
import time
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from engine.boltgroup import (  # noqa: E402
    eccentric_shear_loads,
    elastic_bolt_forces_batch,
    icr_coefficients,
    icr_solve_batch,
)

ELASTIC_TARGET = 100_000.0
ICR_TARGET = 2_000.0


def layouts(n: int, G: int, rng: np.random.Generator) -> np.ndarray:
    """G fin-plate-like bolt layouts of n bolts each, mm, shape (G, n, 2)."""
    pitch = rng.uniform(60.0, 90.0, G)[:, None]
    gauge = rng.uniform(50.0, 80.0, G)[:, None]
    two_lines = (rng.random(G) < 0.5) & (n % 2 == 0)
    rows = np.where(two_lines, n // 2, n)[:, None]
    k = np.arange(n)[None, :]
    row = np.where(two_lines[:, None], k % rows, k)
    line = np.where(two_lines[:, None], k // rows, 0)
    return np.stack([40.0 + line * gauge, -(40.0 + row * pitch)], axis=-1)


def best_rate(fn, G: int, repeat: int) -> float:
    best = float("inf")
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        best = min(best, time.perf_counter() - t0)
    return G / best


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--groups-elastic", type=int, default=100_000)
    ap.add_argument("--groups-icr", type=int, default=20_000)
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--check", action="store_true", help="exit 1 if a target is missed")
    args = ap.parse_args(argv)
    rng = np.random.default_rng(2024)

    print(f"numpy {np.__version__}; elastic batch of {args.groups_elastic}, ICR batch of {args.groups_icr} groups; best of {args.repeat}")
    print(f"{'bolts':>5} {'elastic groups/s':>18} {'ICR groups/s':>14} {'ICR iterations (mean/max)':>27}")
    ok = True
    for n in range(4, 13):
        Ge, Gi = args.groups_elastic, args.groups_icr
        xy_e = layouts(n, Ge, rng)
        ex_e = rng.uniform(20.0, 400.0, Ge)
        ang_e = rng.uniform(-30.0, 30.0, Ge)
        Px, Py, Mz = eccentric_shear_loads(1.0, ex_e, ang_e)
        rate_e = best_rate(lambda: elastic_bolt_forces_batch(xy_e, Px, Py, Mz), Ge, args.repeat)

        xy_i = xy_e[:Gi]
        ex_i, ang_i = ex_e[:Gi], ang_e[:Gi]
        rate_i = best_rate(lambda: icr_coefficients(xy_i, ex_i, ang_i), Gi, args.repeat)
        it = icr_solve_batch(xy_i, *eccentric_shear_loads(1.0, ex_i, ang_i)).iterations
        flag = ""
        if rate_e < ELASTIC_TARGET or rate_i < ICR_TARGET:
            ok = False
            flag = "  below target"
        print(f"{n:>5} {rate_e:>18,.0f} {rate_i:>14,.0f} {it.mean():>20.1f} / {it.max():<4d}{flag}")
    print(f"targets: elastic >= {ELASTIC_TARGET:,.0f} groups/s, ICR >= {ICR_TARGET:,.0f} groups/s: {'met' if ok else 'MISSED'}")
    return 0 if (ok or not args.check) else 1


if __name__ == "__main__":
    raise SystemExit(main())
