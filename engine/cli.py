"""The ``joint-audit`` command line.

Exit status: 0 all checked joints pass (or the command succeeded), 1 some joint fails or needs
design, 2 bad input or usage (one clear line on stderr, nothing written), 3 an internal error (a bug:
one line on stderr; set ``JOINT_AUDIT_DEBUG=1`` for the traceback).

The CLI is the only part of ``engine`` that wires in the IFC side: it imports ``ifc_io`` inside the
commands that need it, so the mechanics never import ifcopenshell.
"""

from __future__ import annotations

import argparse
import dataclasses
import gc
import json
import os
import sys
from itertools import islice
from pathlib import Path
from typing import Any, Callable, Iterable, Iterator, Sequence

import orjson

from engine import __version__
from engine.cautions import CAUTION
from engine.errors import JointAuditError, OutputError

__all__ = ["main", "build_parser", "load_frame"]

_DESCRIPTION = (
    "Audit every beam-to-support connection in an IFC steel model: find the joints, classify each "
    "support stiff or flexible, and check the connections.\n\nCAUTION: " + CAUTION
)


class UsageError(JointAuditError):
    """A command line that cannot be carried out as given."""


class _Parser(argparse.ArgumentParser):
    """An argument parser whose usage errors are one line on stderr and exit status 2."""

    def error(self, message: str) -> None:  # type: ignore[override]
        self.exit(2, f"{self.prog}: error: {message} (see {self.prog} --help)\n")


def build_parser() -> argparse.ArgumentParser:
    parser = _Parser(
        prog="joint-audit",
        description=_DESCRIPTION,
        formatter_class=argparse.RawDescriptionHelpFormatter,
        epilog="Exit status: 0 all checked joints pass, 1 some joint fails or needs design, "
        "2 bad input or usage, 3 internal error.",
    )
    parser.add_argument("--version", action="version", version=f"joint-audit {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)

    p = sub.add_parser(
        "inspect",
        help="what the model holds: schema, units, members, sections, grades, warnings; --joints lists the joints",
        description="Read a model and report what joint-audit finds in it.\n\nCAUTION: " + CAUTION,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    p.add_argument("model", metavar="MODEL.ifc", help="the IFC file to read (IFC2X3, IFC4 or IFC4X3); never modified")
    p.add_argument("--joints", action="store_true", help="also find every beam-end joint with kind, stiffness and reasons")
    p.add_argument("--json", action="store_true", help="print JSON instead of text")
    p.add_argument("--config", metavar="FILE.toml", help="configuration (tolerances, support policy, default grade)")

    p = sub.add_parser(
        "audit",
        help="audit every beam-to-support joint of a model and write the results (IFC copy, HTML, BCF, JSON, CSV)",
        description="Find every joint, its support stiffness and end shear, check its connection under a design "
        "code, and write: a copy of the model with JointAudit_* property sets, an HTML issue list, a BCF file, "
        "results.json and a CSV connection schedule. The input model is never modified.\n\nCAUTION: " + CAUTION,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    p.add_argument("model", metavar="MODEL.ifc", nargs="?", help="the IFC file to audit (IFC2X3, IFC4 or IFC4X3)")
    p.add_argument("--code", help="design code rule set (as4100, en1993, aisc360 or any installed); default from config")
    p.add_argument("--config", metavar="FILE.toml", help="configuration file (see --show-config for every key)")
    p.add_argument("--schedule", metavar="FILE", action="append", default=[],
                   help="a connection schedule or a demand schedule (CSV or TOML; the kind is told from its columns); may be given twice")
    p.add_argument("--design", action="store_true",
                   help="propose the lightest passing fin plate for every joint with no connection")
    p.add_argument("--baseline", metavar="OLD/results.json", help="mark each joint new / open / resolved against an earlier run")
    p.add_argument("--out", metavar="DIR", default="joint-audit-out", help="output folder (default: %(default)s)")
    p.add_argument("--bcf-version", choices=("2.1", "3.0"), default="2.1", help="BCF version to write (default: %(default)s)")
    p.add_argument("--needs-design-topics", choices=("per-storey", "per-joint"), default="per-storey",
                   help="BCF topics for joints that need a connection designed: one per storey listing its joints, "
                   "or one per joint (default: %(default)s; failing and incomplete joints always get one each)")
    p.add_argument("--show-config", action="store_true", help="print the effective configuration as TOML and stop")

    p = sub.add_parser(
        "demo",
        help="build the bundled demo model (an invented project) and audit it",
        description="Build the demo model of our invented project into a folder and audit it.\n\nCAUTION: " + CAUTION,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    p.add_argument("--out", metavar="DIR", default="joint-audit-demo", help="output folder (default: %(default)s)")

    p = sub.add_parser(
        "rules",
        help="list the installed design-code rule sets, their checks and data sources",
        description="List the installed design-code rule sets.\n\nCAUTION: " + CAUTION,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    p.add_argument("--json", action="store_true", help="print JSON instead of text")
    return parser


def load_frame(path: str | os.PathLike[str], config: dict[str, Any]):
    """Open the model at ``path`` and read the frame, explicit connectivity and linked reactions."""
    import ifc_io
    from ifc_io.library import read_frame_with_connections

    return read_frame_with_connections(ifc_io.open_model(path), config, str(path))


def _format_joint_rows(rows: list[dict[str, Any]], unresolved: list[dict[str, Any]]) -> str:
    lines = [f"joints         {len(rows)}"]
    for r in rows:
        support = r.get("support_label") or r.get("support") or "-"
        lines.append(
            f"  {r['id']}  {r.get('beam_label') or r['beam']} [{r['end']}] -> {support}: "
            f"{r['kind']}, {r['stiffness']}"
        )
        for reason in r.get("reasons", []):
            lines.append(f"      · {reason}")
    lines.append(f"unresolved     {len(unresolved)}")
    for u in unresolved:
        lines.append(f"  {u['beam']} [{u['end']}]: {u['reason']}")
    return "\n".join(lines)


def _cmd_inspect(args: argparse.Namespace) -> int:
    from engine.config import load_config
    from engine.inspect import format_summary, summarise_frame

    config = load_config(args.config)
    frame = load_frame(args.model, config)
    summary = summarise_frame(frame)
    out: dict[str, Any] = {"tool": {"name": "joint-audit", "version": __version__}, "caution": CAUTION, **summary}
    text = format_summary(summary)
    if args.joints:
        from engine.joints import joint_rows

        from engine.audit import find_frame_joints

        finding = find_frame_joints(frame, config)
        rows = joint_rows(finding, frame.members)
        unresolved = [dataclasses.asdict(u) for u in finding.unresolved]
        out["joints"] = rows
        out["unresolved"] = unresolved
        out["joint_warnings"] = [{"global_id": w.global_id, "message": w.message} for w in finding.warnings]
        text += "\n" + _format_joint_rows(rows, unresolved)
    if args.json:
        sys.stdout.write(json.dumps(out, indent=2, sort_keys=False, default=str) + "\n")
    else:
        sys.stdout.write(f"CAUTION: {CAUTION}\n\n{text}\n")
    return 0


def _prepare_out_dir(path: str) -> Path:
    out = Path(path)
    if out.exists() and not out.is_dir():
        raise OutputError(f"output folder {out} exists and is not a folder")
    try:
        out.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        raise OutputError(f"cannot create output folder {out}: {exc.strerror or exc}") from None
    if not os.access(out, os.W_OK):
        raise OutputError(f"output folder {out} is not writable")
    return out


class _ProgressBar:
    """A one-line progress bar on a terminal (stderr); silent in pipes and CI."""

    def __init__(self) -> None:
        self.active = sys.stderr.isatty() and not os.environ.get("CI")
        self.last = ""

    def __call__(self, stage: str, done: int, total: int) -> None:
        if not self.active:
            return
        frac = 1.0 if total <= 0 else min(1.0, done / total)
        bar = "#" * int(frac * 30)
        line = f"\r{stage:8s} [{bar:<30s}] {done}/{total}"
        if line != self.last:
            sys.stderr.write(line)
            sys.stderr.flush()
            self.last = line

    def done(self) -> None:
        if self.active and self.last:
            sys.stderr.write("\r" + " " * len(self.last) + "\r")
            sys.stderr.flush()


def _run_audit(model_path: str, out_dir: str, config_file: str | None, code: str | None, schedules: list[str],
               baseline_path: str | None, bcf_version: str, design: bool = False,
               needs_design_topics: str = "per-storey") -> int:
    import ifc_io
    from ifc_io.library import audit_model
    from ifc_io.open import parse_problems
    from ifc_io.write_bcf import BcfTopics, bcf_archive
    from ifc_io.write_psets_text import copy_input_verbatim, prepare_model_copy

    from engine.atomic import (commit_all, new_temp, parts_writer, refuse_input_overwrite, unlink_quietly,
                               write_prepared, write_temps)
    from engine.background import BackgroundTask
    from engine.pset_worker import PsetFeed
    from engine.raster import to_png
    from engine.report_drawings import elevation_for, issue_drawings
    from engine.report_html import IssueList, report_parts
    from engine.results import read_baseline

    # the model and the baseline are read before anything is written
    try:
        opened = os.stat(model_path)  # to tell later that the file is still the one opened
    except OSError:
        opened = None  # open_model says what is wrong with the path
    model = ifc_io.open_model(model_path)
    baseline = read_baseline(baseline_path) if baseline_path else None
    out_created = not Path(out_dir).exists()
    out = _prepare_out_dir(out_dir)
    stem = Path(model_path).stem
    targets = {
        "ifc": out / f"{stem}.audited.ifc",
        "results": out / "results.json",
        "schedule": out / "connections.csv",
        "report": out / "issues.html",
        "bcf": out / "issues.bcf",
    }
    # All or nothing: every output goes to a temporary file, and only when all are written are they
    # renamed into place; on any error the temporary files (and an output folder made by this run)
    # are removed. The copy of the model is written while the audit runs (engine.background).
    temps: list[tuple[str, Path]] = []
    tasks: list[BackgroundTask] = []
    psets: PsetFeed | None = None
    try:
        for t in targets.values():
            refuse_input_overwrite(t, [model_path] + ([baseline_path] if baseline_path else []) + list(schedules))
        first_id, owner_id, as_read = prepare_model_copy(model)
        ifc_tmp = new_temp(targets["ifc"])
        temps.append((ifc_tmp, targets["ifc"]))
        # The copy of the model: the input file's own text when it holds no earlier results and
        # parsed cleanly (ifc_io.write_psets_text.copy_input_verbatim); else written by a child once
        # the model has been read (a large model is read by two processes: ifc_io.read_members)
        # while the audit goes on.
        verbatim = (as_read and opened is not None and not parse_problems(model)
                    and copy_input_verbatim(model_path, ifc_tmp, opened))
        bar = _ProgressBar()

        def _after_read() -> None:
            nonlocal psets
            # the property-set writer's process starts now, while the joints are found (a core is
            # free then; during the reading both are busy), and is ready by the time the results are
            psets = PsetFeed()
            if not verbatim:
                tasks.append(BackgroundTask(lambda: model.write(ifc_tmp)))

        outcome = audit_model(model, code=code, config_file=config_file, schedules=schedules, baseline=baseline,
                              file_label=Path(model_path).name, progress=bar, design=design, make_document=False,
                              after_read=_after_read)
        bar.done()
        assert psets is not None
        csv_tmp = new_temp(targets["schedule"])
        temps.append((csv_tmp, targets["schedule"]))
        # The results document is made one joint at a time, never held whole (a large model's is
        # tens of megabytes): as results.json is written, each joint also goes to the issue list and
        # the BCF topics, which keep only what they need from it, and to the writer of the property
        # sets and the CSV schedule (engine.pset_worker, a small process of its own).
        doc = outcome.document(stream=True)
        json_tmp = new_temp(targets["results"])
        temps.append((json_tmp, targets["results"]))
        psets.begin({"json": json_tmp, "ifc": ifc_tmp, "copy_complete": bool(verbatim),
                     "csv": csv_tmp, "ifc_label": str(targets["ifc"]),
                     "csv_label": str(targets["schedule"]), "first_id": first_id, "owner_id": owner_id,
                     "schema": model.schema, "n_per_force_unit": outcome.frame.n_per_force_unit,
                     "doc": {"code": doc["code"], "tool": doc["tool"], "run": doc["run"]}})
        beam_ids: dict[str, int | None] = {}

        def _to_psets(j: dict[str, Any]) -> None:
            gid = j["beam"]
            if gid not in beam_ids:
                try:
                    beam_ids[gid] = model.by_guid(gid).id()
                except RuntimeError:  # not in the model (as ifc_io.write_psets.iter_joint_beams): no set
                    beam_ids[gid] = None
            psets.add(beam_ids[gid])

        issues, topics = IssueList(str(out), str(targets["report"])), BcfTopics(needs_design_topics)
        tapped = dict(doc, joints=_tapped(doc["joints"], (issues.add, topics.add)))
        write_prepared(json_tmp, targets["results"],
                       parts_writer(_results_json(tapped, on_joint=_to_psets), written=psets.written))
        drawings, symbols = issue_drawings(outcome.results, outcome.members)
        # BCF snapshots of the connections that exist (a joint that needs design has nothing to show)
        snapshots = {r.joint.id: to_png(elevation_for(r, outcome.members[r.joint.beam]))
                     for r in outcome.results if r.joint.id in drawings and r.connection is not None}
        project = model.by_type("IfcProject")
        # a damaged file may hold something other than text in the project's GlobalId or Name
        guid, name = (project[0].GlobalId, project[0].Name) if project else (None, "")
        bcf = bcf_archive(doc, version=bcf_version, project_guid=guid if isinstance(guid, str) else None,
                          project_name=name if isinstance(name, str) else "", snapshots=snapshots,
                          needs_design=needs_design_topics, gathered=topics)
        temps += write_temps([
            (targets["report"], parts_writer(report_parts(doc, drawings, symbols, gathered=issues))),
            (targets["bcf"], bcf),
        ])
        while tasks:  # the copy, where IfcOpenShell writes it
            tasks.pop().join()
        psets.finish()  # the property sets, into the complete copy, and the schedule
        # renamed in the order results, schedule, report, BCF, and the model copy last, as before
        by_target = {str(t): (tmp, t) for tmp, t in temps}
        commit_all([by_target[str(targets[k])] for k in ("results", "schedule", "report", "bcf", "ifc")])
    except BaseException:
        for task in tasks:
            task.cancel()
        if psets is not None:
            psets.cancel()
        for tmp, _ in temps:
            unlink_quietly(tmp)
            # IfcOpenShell writes through a temporary file of its own beside the target, which a
            # stopped write leaves behind
            for left in Path(tmp).parent.glob(Path(tmp).name + ".*.tmp"):
                unlink_quietly(left)
        if out_created:
            try:
                out.rmdir()  # only when empty: nothing of this run is left in it
            except OSError:
                pass
        raise

    s = doc["summary"]
    sys.stdout.write(
        f"CAUTION: {CAUTION}\n\n{doc['model']['file']} audited to {doc['code_title'] or doc['code']}: "
        f"{s['joints']} joints — {s['pass']} pass, {s['fail']} fail, {s['needs-design']} need design, "
        f"{s['incomplete']} incomplete, {s['not-checked']} not checked\n"
    )
    for label, t in targets.items():
        sys.stdout.write(f"  {label:8s} {t}\n")
    if outcome.warnings:
        sys.stdout.write(f"  {len(outcome.warnings)} warnings (listed in results.json)\n")
    _retire(model, outcome)
    return 1 if s["fail"] or s["needs-design"] else 0


_RETIRED: list[Any] = []


def _retire(*records: Any) -> None:
    """Keep the run's records (the model, the audit outcome) past the return of the command instead
    of freeing them object by object on the way out: on a large model that is tenths of a second of
    work whose result nobody sees. The console command ends the process without it
    (:func:`_entry`); a host calling :func:`main` again frees the previous run's records then, so at
    most one run is held."""
    _RETIRED[:] = records


def _tapped(entries: Iterable[dict[str, Any]], taps: Sequence[Callable[[dict[str, Any]], None]]
            ) -> Iterator[dict[str, Any]]:
    """``entries`` one by one, each handed to every tap first (one pass feeding several writers)."""
    for entry in entries:
        for tap in taps:
            tap(entry)
        yield entry


def _results_json(doc: dict[str, Any], on_joint: Callable[[dict[str, Any]], None] | None = None
                  ) -> Iterator[bytes]:
    """results.json as UTF-8, in pieces: the document with one joint (and one warning) per line
    (readable, and fast to write for large models: the lines are encoded by orjson, the whole text
    is never held in memory). ``on_joint(entry)`` is called for the joints of each piece just
    before the piece is given out."""
    listed = ("baseline_removed", "warnings", "joints")
    head = {k: v for k, v in doc.items() if k not in listed}
    text = json.dumps(head, indent=1, ensure_ascii=False).encode("utf-8")
    yield text[:-2] + b",\n" if head else b"{\n"
    for n, key in enumerate(k for k in listed if k in doc):
        items = iter(doc[key])  # a list, or a one-pass iterator (results_document(stream=True))
        chunk = list(islice(items, _JSON_PART))
        yield (b",\n" if n else b"") + f" {json.dumps(key)}: [".encode("utf-8") + (b"\n" if chunk else b"")
        first = True
        while chunk:
            part = (b"" if first else b",\n") + b",\n".join([b"  " + _json_line(x) for x in chunk])
            if on_joint is not None and key == "joints":
                for x in chunk:
                    on_joint(x)
            yield part
            first = False
            chunk = list(islice(items, _JSON_PART))
        yield b"]" if first else b"\n ]"
    yield b"\n}\n"


_JSON_PART = 500  # lines per piece of results.json (the property-set worker reads a piece once it is written)


def _json_line(value: Any) -> bytes:
    """``value`` as one line of compact JSON (UTF-8). orjson (about ten times the standard
    library's speed on the joints of a large model) takes every value the document holds but
    integers beyond 64 bits, which only a hand-edited baseline brings in: those lines go through
    the standard library."""
    try:
        return orjson.dumps(value)
    except orjson.JSONEncodeError:
        return json.dumps(value, ensure_ascii=False, separators=(",", ":")).encode("utf-8")


def _cmd_audit(args: argparse.Namespace) -> int:
    from engine.config import dumps_toml, load_config, merge_config

    if args.show_config:
        cfg = load_config(args.config)
        if args.code:
            cfg = merge_config(cfg, {"code": args.code})
        sys.stdout.write(dumps_toml(cfg))
        return 0
    if not args.model:
        raise UsageError("audit needs MODEL.ifc (or --show-config)")
    from engine.gc_pause import cycle_collection_paused
    from engine.memory import map_large_blocks_apart

    map_large_blocks_apart()  # see engine.memory
    with cycle_collection_paused():  # see engine.gc_pause
        code = _run_audit(args.model, args.out, args.config, args.code, args.schedule, args.baseline,
                          args.bcf_version, args.design, args.needs_design_topics)
        # the run's millions of records (kept by _retire) are set aside from the collector: turned
        # back on, its first full pass would walk them all, a tenth of a second on a 20k model, to
        # free nothing (reference counting still frees them when the next run replaces them)
        gc.freeze()
    return code


def _cmd_demo(args: argparse.Namespace) -> int:
    # the rule sets first: building the demo goes through IfcOpenShell's API, which can load its
    # EXPRESS tools, and those add to sys.path a folder with a "rules" package of their own
    import rules  # noqa: F401
    import rules.catalog  # noqa: F401
    from samples.generate_demo import build_demo

    out = _prepare_out_dir(args.out)
    paths = build_demo(out)
    sys.stdout.write(f"Demo model of our invented project written to {out}:\n")
    for label, p in paths.items():
        sys.stdout.write(f"  {label:8s} {p}\n")
    sys.stdout.write("\n")
    schedules = [str(paths["schedule"])] if "schedule" in paths else []
    return _run_audit(str(paths["ifc4"]), str(out / "audit"), str(paths["config"]) if "config" in paths else None,
                      None, schedules, None, "2.1")


def _cmd_rules(args: argparse.Namespace) -> int:
    import rules

    listing = []
    for code_id in rules.available():
        rs = rules.load(code_id)
        listing.append(
            {
                "code": code_id,
                "title": rs.title,
                "checks": [{"name": n, "clause": c} for n, c in rs.check_list()],
                "data_sources": list(rs.data_sources()),
                "ultimate_combination": rs.ultimate_combination(),
            }
        )
    if args.json:
        sys.stdout.write(json.dumps({"caution": CAUTION, "rule_sets": listing}, indent=2, default=str) + "\n")
        return 0
    lines = [f"CAUTION: {CAUTION}", ""]
    for item in listing:
        lines.append(f"{item['code']}: {item['title']}")
        lines.append("  checks:")
        lines.extend(f"    - {c['name']} ({c['clause']})" for c in item["checks"])
        lines.append("  data sources:")
        lines.extend(f"    - {s}" for s in item["data_sources"])
        lines.append("")
    sys.stdout.write("\n".join(lines))
    return 0


_COMMANDS = {"inspect": _cmd_inspect, "audit": _cmd_audit, "demo": _cmd_demo, "rules": _cmd_rules}


def main(argv: Sequence[str] | None = None) -> int:
    """Run the CLI; returns the exit status (the console script exits with it)."""
    parser = build_parser()
    args = parser.parse_args(argv)
    if not args.command:
        parser.print_help()
        return 2
    try:
        return _COMMANDS[args.command](args)
    except JointAuditError as exc:
        sys.stderr.write(f"joint-audit: error: {exc}\n")
        return 2
    except KeyboardInterrupt:
        sys.stderr.write("joint-audit: interrupted\n")
        return 130
    except BrokenPipeError:
        return 0
    except Exception as exc:  # a bug: one line, no traceback unless asked for
        if os.environ.get("JOINT_AUDIT_DEBUG"):
            raise
        sys.stderr.write(
            f"joint-audit: internal error: {type(exc).__name__}: {exc} "
            f"(set JOINT_AUDIT_DEBUG=1 for details and please report it)\n"
        )
        return 3


def _entry() -> None:  # pragma: no cover - console script shim
    """The console command: :func:`main`, then the process ends at once with its status, every
    output already closed and renamed into place (the records kept by :func:`_retire` go back to
    the system with the process instead of being freed one by one)."""
    code = main()
    for stream in (sys.stdout, sys.stderr):
        try:
            stream.flush()
        except (BrokenPipeError, OSError):  # a reader that went away (as main's own BrokenPipeError)
            pass
    os._exit(code)


if __name__ == "__main__":  # pragma: no cover
    _entry()
