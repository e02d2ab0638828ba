"""End-to-end audit time and peak memory on synthetic frames, beside the floor of any tool that reads a
model and writes it back: a bare ``ifcopenshell.open`` plus a bare ``write`` of the same file.

Usage::

    python benchmarks/bench_audit.py                 # 5k, 20k and 50k members
    python benchmarks/bench_audit.py --sizes 5000 20000

Each measurement runs in a fresh Python process (so peak memory is that process's own maximum
resident set size); times are wall-clock seconds inside the process, after imports. The synthetic
frames come from ``samples.synthetic`` (detailed convention, no connections modelled: every shear
joint needs design, which is the heaviest case for the reports) and are cached in the temp folder.
"""

from __future__ import annotations

import argparse
import json
import subprocess
import sys
import tempfile
from pathlib import Path

REPO = Path(__file__).resolve().parents[1]

FLOOR = r"""
import json, resource, sys, time
import ifcopenshell
src, dst = sys.argv[1], sys.argv[2]
t0 = time.perf_counter(); f = ifcopenshell.open(src); t1 = time.perf_counter()
peak_open = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
f.write(dst); t2 = time.perf_counter()
print(json.dumps({"open_s": t1 - t0, "write_s": t2 - t1, "peak_open_mb": peak_open / 1024}))
"""

AUDIT = r"""
import json, resource, sys, time
sys.path.insert(0, sys.argv[3])
from engine.cli import main
t0 = time.perf_counter(); code = main(["audit", sys.argv[1], "--out", sys.argv[2]]); t1 = time.perf_counter()
print(json.dumps({"audit_s": t1 - t0, "exit": code, "peak_mb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024}))
sys.exit(0)  # the audit's own exit status (1: joints need design) is reported, not raised
"""


def _run(code: str, *args: str) -> dict:
    res = subprocess.run([sys.executable, "-c", code, *args], capture_output=True, text=True, cwd=REPO)
    if res.returncode not in (0,):
        raise SystemExit(f"benchmark step failed ({res.returncode}): {res.stderr.strip()[-500:]}")
    return json.loads(res.stdout.strip().splitlines()[-1])


def model_for(n: int, folder: Path) -> tuple[Path, int]:
    sys.path.insert(0, str(REPO))
    from samples.synthetic import synthetic_frame, write_synthetic_ifc

    path = folder / f"joint-audit-bench-{n}.ifc"
    members = synthetic_frame(n)
    if not path.exists():
        write_synthetic_ifc(members, path)
    return path, len(members)


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--sizes", type=int, nargs="+", default=[5000, 20000, 50000])
    ap.add_argument("--folder", type=Path, default=Path(tempfile.gettempdir()))
    args = ap.parse_args(argv)
    rows = []
    print(f"{'members':>8} {'MB':>6} {'open s':>7} {'write s':>8} {'floor s':>8} {'audit s':>8} {'ratio':>6} "
          f"{'open MB':>8} {'audit MB':>9} {'mem x':>6}")
    for n in args.sizes:
        path, count = model_for(n, args.folder)
        with tempfile.TemporaryDirectory() as tmp:
            floor = _run(FLOOR, str(path), str(Path(tmp) / "copy.ifc"))
            audit = _run(AUDIT, str(path), str(Path(tmp) / "out"), str(REPO))
        f = floor["open_s"] + floor["write_s"]
        row = {"members": count, "file_mb": path.stat().st_size / 1e6, **floor, "floor_s": f, **audit,
               "ratio": audit["audit_s"] / f, "mem_ratio": audit["peak_mb"] / floor["peak_open_mb"]}
        rows.append(row)
        print(f"{count:>8} {row['file_mb']:>6.1f} {floor['open_s']:>7.2f} {floor['write_s']:>8.2f} {f:>8.2f} "
              f"{audit['audit_s']:>8.2f} {row['ratio']:>6.1f} {floor['peak_open_mb']:>8.0f} {audit['peak_mb']:>9.0f} "
              f"{row['mem_ratio']:>6.2f}", flush=True)
    return 0


if __name__ == "__main__":
    sys.exit(main())
