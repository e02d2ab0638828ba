"""Benchmark: the frame reader against a bare IfcOpenShell open and write of the same file.

Run from the repository root::

    python3 benchmarks/bench_reader.py [--sizes 5000 20000] [--repeat 3] [--file MODEL.ifc ...]

For each synthetic frame (``samples.synthetic``, written to a temporary IFC4 file) and each
``--file`` given, prints: members, file size, seconds for ``ifcopenshell.open``, for
``ifc_io.read_frame`` on the open model, and for ``model.write``; µs per member for the read;
and the read time as a fraction of open + write. Best of ``--repeat``. The reader's budget in the
pipeline target (20k members read and written in at most 2 × a bare open + write) is this
fraction staying well under 1.
"""

from __future__ import annotations

import argparse
import sys
import tempfile
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

import ifcopenshell  # noqa: E402

import ifc_io  # noqa: E402


def _best(fn, repeat: int):
    best, out = float("inf"), None
    for _ in range(max(1, repeat)):
        t0 = time.perf_counter()
        out = fn()
        best = min(best, time.perf_counter() - t0)
    return best, out


def measure(path: Path, repeat: int) -> str:
    t_open, model = _best(lambda: ifcopenshell.open(str(path)), repeat)
    t_read, frame = _best(lambda: ifc_io.read_frame(model), repeat)
    with tempfile.TemporaryDirectory() as tmp:
        t_write, _ = _best(lambda: model.write(str(Path(tmp) / "out.ifc")), repeat)
    n = max(1, len(frame.members))
    mb = path.stat().st_size / 1e6
    return (f"{path.name[:28]:<28} {len(frame.members):>8} {mb:>7.1f} {t_open:>7.2f} {t_read:>7.2f} "
            f"{t_write:>7.2f} {1e6 * t_read / n:>9.1f} {t_read / (t_open + t_write):>9.2f}")


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--sizes", type=int, nargs="*", default=[5000, 20000])
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--file", type=Path, nargs="*", default=[])
    args = ap.parse_args(argv)
    print(f"{'model':<28} {'members':>8} {'MB':>7} {'open s':>7} {'read s':>7} {'write s':>7} "
          f"{'µs/memb':>9} {'read/(o+w)':>9}")
    for path in args.file:
        print(measure(path, args.repeat))
    if args.sizes:
        from samples.synthetic import synthetic_frame, write_synthetic_ifc

        for n in args.sizes:
            with tempfile.TemporaryDirectory() as tmp:
                path = write_synthetic_ifc(synthetic_frame(n), Path(tmp) / f"synthetic-{n}.ifc")
                print(measure(path, args.repeat))
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
