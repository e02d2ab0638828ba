"""Generate joint-audit's demo model: an invented three-storey steel-framed building.

Writes, into one folder:

* ``demo-ifc4-mm.ifc``   — IFC4, millimetres, newtons;
* ``demo-ifc2x3-ft.ifc`` — IFC2X3, feet (IfcConversionBasedUnit "FOOT"), pound-force;
* ``demo-truth.json``    — every joint the generator built, with its support, kind, expected
  stiffness, cope, modelled connection and the intended outcome;
* ``demo-config.toml``   — a joint-audit config for the demo (code "as4100", area loads per storey);
* ``demo-schedule.csv``  — a small connection schedule for some joints without a modelled plate.

Run ``python3 -m samples.generate_demo --out DIR`` or call :func:`build_demo`. The output is
byte-for-byte the same on every run (fixed GlobalIds, owner history and header time stamp).

The project, people, organisation, grid, loads, shears and connections are invented demo data,
not a design. joint-audit is an aid to a competent engineer: its results must be checked, and the
governing local code and licensed practice take precedence.
"""

from __future__ import annotations

import argparse
import csv
import io
import json
import re
import sys
from dataclasses import astuple, fields
from pathlib import Path

from samples.demo_ifc import gid, write_ifc
from samples.demo_scenario import (
    PROJECT_NAME,
    STOREYS,
    JointSpec,
    Scenario,
    ScheduleRow,
    build_scenario,
)
from samples.demo_sections import MEMBER_GRADE

__all__ = ["FILES", "build_demo", "truth_dict", "main"]

FILES: dict[str, str] = {
    "ifc4": "demo-ifc4-mm.ifc",
    "ifc2x3": "demo-ifc2x3-ft.ifc",
    "truth": "demo-truth.json",
    "config": "demo-config.toml",
    "schedule": "demo-schedule.csv",
}


def _r(v: float) -> float:
    return round(float(v), 3) + 0.0


def _member_gid(tag: str) -> str:
    return gid(f"member/{tag}")


def _element_gid(sc: Scenario, tag: str | None) -> str | None:
    if tag is None:
        return None
    if any(w.tag == tag for w in sc.walls):
        return gid(f"wall/{tag}")
    return _member_gid(tag)


def _joint_truth(sc: Scenario, j: JointSpec) -> dict:
    conn = j.connection
    return {
        "beam": _member_gid(j.beam),
        "beam_tag": j.beam,
        "end": j.end,
        "support": _element_gid(sc, j.support),
        "support_tag": j.support,
        "kind": j.kind,
        "convention": j.convention,
        "gap_mm": _r(j.gap),
        "node_mm": [_r(c) for c in j.node],
        "support_continuous": j.support_continuous,
        "expected_stiffness": j.stiffness,
        "stiffness_note": j.stiffness_note,
        "cope": j.cope,
        "cope_modelled": j.cope is not None and j.convention == "detailed",
        "back_to_back_with": None if j.back_to_back_with is None else {
            "beam": _member_gid(j.back_to_back_with[0]), "end": j.back_to_back_with[1]},
        "connection": None if conn is None else conn.as_truth(gid(f"assembly/{conn.key}")),
        "model_shear_kN": j.model_shear_kN,
        "schedule_row": j.schedule_row,
        "intended": j.intended,
        "expected_status": _expected_status(j),
        "why": j.why,
    }


def _expected_status(j) -> str:
    """The audit status the demo is built to give this joint under its config (code AS 4100,
    conservative policy, the demo schedule): adequate plates and scheduled joints pass, too-weak
    plates fail, shear joints with nothing modelled or scheduled need design, and joints that are not
    fin-plate joints (wall bearing, free end, cantilever root, splice) are not checked."""
    if j.intended == "adequate":
        return "pass"
    if j.intended == "too-weak":
        return "fail"
    if j.intended == "no-connection":
        return "pass" if j.schedule_row is not None else "needs-design"
    return "not-checked"


def truth_dict(sc: Scenario) -> dict:
    """The truth file's content (see ``samples/README.md`` for the format)."""
    members = [{
        "global_id": _member_gid(m.tag),
        "name": m.name,
        "tag": m.tag,
        "ifc_class": m.ifc_class,
        "role": m.role,
        "start_mm": [_r(c) for c in m.start],
        "end_mm": [_r(c) for c in m.end],
        "section": m.section.name,
        "section_dims_mm": m.section.as_truth(),
        "grade": MEMBER_GRADE[0],
        "material": MEMBER_GRADE[1],
        "storey": m.storey,
        "web_dir": [_r(c) for c in m.web_dir],
        "cardinal_point": m.cardinal_point,
    } for m in sc.members]
    bearings = [{
        "global_id": gid(f"wall/{w.tag}"),
        "ifc_class": "IfcWall",
        "name": w.name,
        "tag": w.tag,
        "material": "Concrete",
        "storey": w.storey,
        "bbox_min_mm": [_r(c) for c in w.bbox_min],
        "bbox_max_mm": [_r(c) for c in w.bbox_max],
    } for w in sc.walls]
    return {
        "project": PROJECT_NAME,
        "files": {"ifc4": FILES["ifc4"], "ifc2x3": FILES["ifc2x3"]},
        "length_units": {"ifc4": "MILLIMETRE", "ifc2x3": "FOOT"},
        "force_units": {"ifc4": "NEWTON", "ifc2x3": "POUND-FORCE"},
        "storeys": [{"name": n, "elevation_mm": _r(z)} for n, z in STOREYS],
        "conventions": {
            "beam_axis": "top of steel on the web centreline (cardinal point 8)",
            "column_axis": "section centroid (cardinal point 5)",
            "gap_mm": "beam end to support face along the beam; negative = the end runs past the face",
            "detailed": "Level 1 and Level 2: beams stop 10 mm off column faces, 15 mm off girder webs",
            "node-to-node": "Roof: beam ends on the support axis",
            "cope_modelled": "the cope is cut in the model by an IfcOpeningElement (IfcRelVoidsElement)",
            "schedule_row": "1-based data row of demo-schedule.csv that applies (no modelled plate)",
            "model_shear_kN": "end shear in the beam's Demo_Analysis pset at this end, kN",
        },
        "members": members,
        "bearings": bearings,
        "joints": [_joint_truth(sc, j) for j in sc.joints],
    }


def _config_text() -> str:
    return '''\
# joint-audit configuration for the bundled demo model (invented project "Kestrel Lane Depot").
# Loads are invented demo values. joint-audit is an aid to a competent engineer: results must be
# checked, and the governing local code and licensed practice take precedence.
code = "as4100"

[support]
policy = "conservative"

[demand]
order = ["model", "schedule", "tributary", "capacity-fraction"]
self_weight = true
capacity_fraction = 0.5
start_shear = "Demo_Analysis.StartShear"
end_shear = "Demo_Analysis.EndShear"

# Office floors: slab, finishes, services and partitions (invented demo value);
# live load 3.0 kPa, office floors, AS/NZS 1170.1 Table 3.1  # from memory
[[demand.area_loads]]
storey = "Level 1"
dead_kPa = 4.5
live_kPa = 3.0

# Workshop floor with light storage (invented demo values, not taken from a loading table)
[[demand.area_loads]]
storey = "Level 2"
dead_kPa = 4.5
live_kPa = 5.0

# Lightweight metal roof with services (invented demo value);
# 0.25 kPa non-trafficable roof, AS/NZS 1170.1 Table 3.2  # from memory
[[demand.area_loads]]
storey = "Roof"
dead_kPa = 0.6
live_kPa = 0.25

[tolerances]
joint_gap_mm = 50
'''


SCHEDULE_COLUMNS = [f.name for f in fields(ScheduleRow)]


def _schedule_text(sc: Scenario) -> str:
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(SCHEDULE_COLUMNS)
    for row in sc.schedule:
        values = list(astuple(row))
        if row.match == "globalid":
            values[1] = _member_gid(row.value)
        w.writerow([f"{v:g}" if isinstance(v, float) else v for v in values])
    return buf.getvalue()


_NUMBER_LIST = re.compile(r"\[\s*(-?[0-9][-0-9.e+]*(?:,\s*-?[0-9][-0-9.e+]*)*)\s*\]")


def _json_text(data: dict) -> str:
    """Indented JSON with short lists of numbers (points, directions) kept on one line."""
    text = json.dumps(data, indent=1, ensure_ascii=False)
    text = _NUMBER_LIST.sub(lambda m: "[" + ", ".join(x.strip() for x in m.group(1).split(",")) + "]", text)
    return text + "\n"


def _write_text(path: Path, text: str) -> Path:
    tmp = path.with_name(path.name + ".tmp")
    tmp.write_text(text, encoding="utf-8", newline="\n")
    tmp.replace(path)
    return path


def build_demo(out_dir: Path) -> dict[str, Path]:
    """Write the demo files into ``out_dir`` (created if needed); return their paths by key
    (``ifc4``, ``ifc2x3``, ``truth``, ``config``, ``schedule``)."""
    out_dir = Path(out_dir)
    out_dir.mkdir(parents=True, exist_ok=True)
    sc = build_scenario()
    paths = {k: out_dir / name for k, name in FILES.items()}
    write_ifc(sc, "IFC4", paths["ifc4"])
    write_ifc(sc, "IFC2X3", paths["ifc2x3"])
    _write_text(paths["truth"], _json_text(truth_dict(sc)))
    _write_text(paths["config"], _config_text())
    _write_text(paths["schedule"], _schedule_text(sc))
    return paths


def main(argv: list[str] | None = None) -> int:
    """Command line: ``python3 -m samples.generate_demo --out DIR``."""
    ap = argparse.ArgumentParser(
        prog="python3 -m samples.generate_demo",
        description="Write joint-audit's invented demo model (IFC4 mm, IFC2X3 ft), its truth file, "
                    "config and connection schedule. Demo data only: not a design.")
    ap.add_argument("--out", type=Path, default=Path(__file__).resolve().parent,
                    help="output folder (default: the samples folder)")
    args = ap.parse_args(argv)
    try:
        paths = build_demo(args.out)
    except OSError as exc:
        print(f"error: cannot write the demo into {args.out}: {exc}", file=sys.stderr)
        return 2
    for p in paths.values():
        print(p)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
