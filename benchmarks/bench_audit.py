"""End-to-end audit time and peak memory on synthetic frames, beside the floor of any tool that reads a
model and writes it back: a bare ``ifcopenshell.open`` plus a bare ``write`` of the same file.

Usage::

    python benchmarks/bench_audit.py                 # 5k, 20k and 50k members
    python benchmarks/bench_audit.py --sizes 5000 20000

Ratios are printed to two decimals; a ratio is the audit's time over the floor's, both from the same
run of this script.

Each measurement runs in a fresh Python process (so peak memory is that process's own maximum
resident set size); times are wall-clock seconds inside the process, after imports (ifcopenshell for
the floor; the audit's own modules for the audit). On Linux the audit reads a large model with two
child processes and writes the property sets and the CSV schedule in a forked child while it writes
the other outputs (``engine.background``): the children's largest peak resident set is printed too
("child MB"). It counts the pages a child shares with the main process (copy on write), so main +
child would overstate what they use together; "tree MB" is the peak, sampled every 20 ms in a second,
untimed run, of the proportional set size of the audit's process and its children together (shared
pages split between them: what the machine actually gives the audit). "mem x" is the main process's
peak over the bare open's, "tree x" the tree's. The synthetic frames come from ``samples.synthetic``
(detailed convention, no connections modelled: every shear joint needs design, which is the heaviest
case for the reports) and are cached in the temp folder.
"""

from __future__ import annotations

import argparse
import json
import os
import subprocess
import sys
import tempfile
import time
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
# the modules the audit uses are imported before the clock starts, as the floor imports ifcopenshell
# before its clock: both columns time the work on the model, not the interpreter loading code
import ifc_io, ifc_io.library, ifc_io.write_bcf, ifc_io.write_psets_text, rules, rules.as4100  # noqa: F401
import engine.report_html, engine.report_drawings, engine.raster, engine.results, engine.background  # noqa: F401
import engine.atomic, engine.joints, engine.demand, engine.demand_schedule, engine.connections  # noqa: F401
import ifc_io.connectivity, ifc_io.read_analysis, importlib.readers, importlib.resources.readers, engine.pset_worker  # noqa: F401
# (networkx, shapely and Pillow are not imported here: an audit without a take-down, a graph or a
# drawn connection does not load them, and importing them would add their memory to the audit's)
loaded = set(sys.modules)
t0 = time.perf_counter(); code = main(["audit", sys.argv[1], "--out", sys.argv[2]]); t1 = time.perf_counter()
late = sorted(m for m in set(sys.modules) - loaded if not m.startswith("_"))
print(json.dumps({"audit_s": t1 - t0, "exit": code, "imported_in_run": late, "peak_mb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
                  "child_peak_mb": resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss / 1024}))
sys.exit(0)  # the audit's own exit status (1: joints need design) is reported, not raised
"""


def _pss_kb(pid: int) -> int:
    """Proportional set size (kB) of ``pid`` and its descendants: shared pages are split between
    the processes sharing them, so the sum is what the tree uses together (Linux /proc)."""
    total = 0
    try:
        with open(f"/proc/{pid}/smaps_rollup") as fh:
            for line in fh:
                if line.startswith("Pss:"):
                    total += int(line.split()[1])
                    break
        for task in os.listdir(f"/proc/{pid}/task"):
            with open(f"/proc/{pid}/task/{task}/children") as fh:
                total += sum(_pss_kb(int(c)) for c in fh.read().split())
    except (OSError, ValueError):
        pass
    return total


def _run(code: str, *args: str, sample: bool = False) -> dict:
    """Run ``code`` in a fresh interpreter; its last stdout line is JSON. With ``sample``, the
    process tree's proportional set size is sampled every 20 ms and its peak added (``tree_pss_mb``)."""
    proc = subprocess.Popen([sys.executable, "-c", code, *args], stdout=subprocess.PIPE, stderr=subprocess.PIPE,
                            text=True, cwd=REPO)
    peak = 0
    if sample and os.path.exists(f"/proc/{proc.pid}/smaps_rollup"):
        while proc.poll() is None:
            peak = max(peak, _pss_kb(proc.pid))
            time.sleep(0.02)
    out, err = proc.communicate()
    if proc.returncode not in (0,):
        raise SystemExit(f"benchmark step failed ({proc.returncode}): {err.strip()[-500:]}")
    res = json.loads(out.strip().splitlines()[-1])
    if sample:
        res["tree_pss_mb"] = peak / 1024
    return res


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
          f"{'open MB':>8} {'audit MB':>9} {'child MB':>9} {'tree MB':>8} {'mem x':>6} {'tree x':>7}")
    for n in args.sizes:
        path, count = model_for(n, args.folder)
        with tempfile.TemporaryDirectory() as tmp:
            floor = _run(FLOOR, str(path), str(Path(tmp) / "copy.ifc"))
            audit = _run(AUDIT, str(path), str(Path(tmp) / "out"), str(REPO))
            # memory in a second run: sampling the tree's memory costs CPU the timed run should not lose
            audit["tree_pss_mb"] = _run(AUDIT, str(path), str(Path(tmp) / "out2"), str(REPO), sample=True)["tree_pss_mb"]
        f = floor["open_s"] + floor["write_s"]
        row = {"members": count, "file_mb": path.stat().st_size / 1e6, **floor, "floor_s": f, **audit,
               "ratio": audit["audit_s"] / f, "mem_ratio": audit["peak_mb"] / floor["peak_open_mb"],
               "tree_ratio": audit["tree_pss_mb"] / floor["peak_open_mb"]}
        rows.append(row)
        print(f"{count:>8} {row['file_mb']:>6.1f} {floor['open_s']:>7.2f} {floor['write_s']:>8.2f} {f:>8.2f} "
              f"{audit['audit_s']:>8.2f} {row['ratio']:>6.2f} {floor['peak_open_mb']:>8.0f} {audit['peak_mb']:>9.0f} "
              f"{audit['child_peak_mb']:>9.0f} {audit['tree_pss_mb']:>8.0f} {row['mem_ratio']:>6.2f} "
              f"{row['tree_ratio']:>7.2f}", flush=True)
        if audit["imported_in_run"]:  # module loading inside the clock: add them to AUDIT's imports
            print(f"    (modules first imported inside the timed run: {', '.join(audit['imported_in_run'])})")
    return 0


if __name__ == "__main__":
    sys.exit(main())
