"""Benchmark: joint finding on synthetic frames of 5k, 10k, 20k and 40k members.

Run from the repository root::

    python3 benchmarks/bench_joints.py [--sizes 5000 10000 20000 40000] [--convention detailed]
                                       [--repeat 1] [--via-ifc]

Prints a table: members, joints found, unresolved ends, seconds (best of ``--repeat``) and µs per
member for :func:`engine.joints.find_joints` (graph building and classification included), plus the
time the generator took. Target: time per member roughly flat; 20k members in under 10 s.
With ``--via-ifc`` each frame is also written to a temporary IFC4 file and the table gains the time
to read it back (``ifc_io.read_frame``) — the end-to-end figure.
"""

from __future__ import annotations

import argparse
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from engine.joints import find_joints  # noqa: E402
from samples.synthetic import synthetic_frame  # noqa: E402


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--sizes", type=int, nargs="+", default=[5000, 10000, 20000, 40000])
    ap.add_argument("--convention", choices=["detailed", "node-to-node", "both"], default="both")
    ap.add_argument("--repeat", type=int, default=1)
    ap.add_argument("--via-ifc", action="store_true", help="also write, read back and time an IFC file")
    args = ap.parse_args(argv)
    conventions = ["detailed", "node-to-node"] if args.convention == "both" else [args.convention]
    print(f"{'convention':<13} {'members':>8} {'joints':>8} {'unres.':>6} {'gen s':>7} {'find s':>7} "
          f"{'µs/member':>10}" + (f" {'read s':>7} {'read µs/m':>10}" if args.via_ifc else ""))
    for conv in conventions:
        for n in args.sizes:
            t0 = time.perf_counter()
            members = synthetic_frame(n, convention=conv)
            gen = time.perf_counter() - t0
            best = float("inf")
            finding = None
            for _ in range(max(1, args.repeat)):
                t0 = time.perf_counter()
                finding = find_joints(members)
                best = min(best, time.perf_counter() - t0)
            assert finding is not None
            extra = ""
            if args.via_ifc:
                extra = _read_back(members)
            print(f"{conv:<13} {len(members):>8} {len(finding.joints):>8} {len(finding.unresolved):>6} "
                  f"{gen:>7.2f} {best:>7.2f} {1e6 * best / len(members):>10.1f}{extra}")
    return 0


def _read_back(members) -> str:
    import tempfile

    import ifc_io
    from samples.synthetic import write_synthetic_ifc

    with tempfile.TemporaryDirectory() as tmp:
        path = write_synthetic_ifc(members, Path(tmp) / "synthetic.ifc")
        t0 = time.perf_counter()
        frame = ifc_io.read_frame(str(path))
        dt = time.perf_counter() - t0
    if len(frame.members) != len(members):
        raise SystemExit(f"read back {len(frame.members)} of {len(members)} members")
    return f" {dt:>7.2f} {1e6 * dt / len(members):>10.1f}"


if __name__ == "__main__":
    raise SystemExit(main())
