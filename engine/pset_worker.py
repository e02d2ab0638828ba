"""The property sets and the CSV schedule of a large model written by a small separate process while
the main one writes the other outputs.

The worker is a fresh interpreter that loads only the standard library, orjson and this package's
text modules: it shares no memory with the main process, so the machine holds its few megabytes and
no second copy of the audit's records (a forked child would keep every page the main process
changes after the fork). It reads the joints from results.json as the main process writes it (each
joint's line is the results-document entry itself, so nothing is encoded twice); through its
standard input it gets length-prefixed :mod:`marshal` messages:

1. the settings: ``json`` (results.json being written), ``ifc`` and ``csv`` (the temporary files to
   write) with ``ifc_label`` and ``csv_label`` (their names for messages), ``first_id``,
   ``owner_id``, ``schema``, ``n_per_force_unit``, ``doc`` (the code, tool and run date), and
   ``copy_complete`` (the copy at ``ifc`` is already whole: the sets can go straight into it);
2. ``(size, beam ids)`` each time a piece of results.json is in the file: the file's size so far and,
   when the piece holds joint lines, the beam entity id of each (``None``: no property set);
3. ``None`` once the copy of the model at ``ifc`` is complete.

It writes the schedule and each property set's STEP text as the joints come (the text to a temporary
file beside the copy), and on ``None`` inserts the sets before the end of the copy's DATA section.
Exit status 0 when done, 2 with one line on standard error for a problem a user can act on (a full
disk), 3 for anything else. :class:`PsetFeed` is the main process's side; with
``JOINT_AUDIT_SERIAL=1`` (or where a process cannot be started) it does the same work in-process.
"""

from __future__ import annotations

import csv
import marshal
import os
import queue
import signal
import struct
import subprocess
import sys
import tempfile
import threading
from typing import Any, BinaryIO, Callable, Iterator, Mapping

import orjson

from engine.errors import JointAuditError, OutputError
from engine.pset_text import PSET_BY_END, PSET_STATUSES, append_before_end, newline_of, pset_blocks
from engine.results import SCHEDULE_COLUMNS, schedule_row

__all__ = ["PsetFeed", "run_worker"]

def run_worker(messages: Iterator[Any]) -> int:
    """Take the messages (see the module docstring; decoded) and write the schedule and the
    property sets; returns the number of sets."""
    settings = next(messages)
    target = settings["ifc"]
    ifc_label, csv_label = settings.get("ifc_label", target), settings.get("csv_label", settings["csv"])
    counter = [0]
    with _naming(csv_label):
        csv_fh = open(settings["csv"], "w", encoding="utf-8", newline="")
    with csv_fh:
        schedule = csv.writer(csv_fh, lineterminator="\n")
        with _naming(csv_label):
            schedule.writerow(SCHEDULE_COLUMNS)

        def _set_rows():
            for joint, beam_id in _joints(messages, settings["json"]):
                with _naming(csv_label):
                    schedule.writerow(schedule_row(joint))
                if beam_id is not None and joint["status"] in PSET_STATUSES:
                    yield joint, beam_id, joint["beam"], PSET_BY_END[joint["end"]]

        blocks = pset_blocks(_set_rows(), settings["doc"], settings["first_id"], settings["schema"],
                             n_per_force_unit=settings["n_per_force_unit"], owner_id=settings["owner_id"],
                             counter=counter, sep="\n")
        with _naming(ifc_label):
            if settings.get("copy_complete"):
                # the copy is there already (the input's own bytes): the sets go straight into it
                crlf = newline_of(target) == "\r\n"
                append_before_end(target, (_ended(block.encode("ascii"), crlf) for block in blocks))
            else:  # spooled until the copy is complete (None received): its line ending is known then
                with tempfile.TemporaryFile(dir=os.path.dirname(os.path.abspath(target)) or None) as spool:
                    for block in blocks:
                        spool.write(block.encode("ascii"))
                    crlf = newline_of(target) == "\r\n"
                    spool.seek(0)
                    append_before_end(target, _spooled(spool, crlf))
        with _naming(csv_label):
            csv_fh.flush()
    return counter[0]


def _ended(block: bytes, crlf: bool) -> bytes:
    # the sets' text has no line break of its own (STEP strings encode them): only line ends
    return block.replace(b"\n", b"\r\n") if crlf else block


class _naming:
    """Turn an operating-system error in the ``with`` block into an :class:`OutputError` naming
    ``label`` (the output as the user knows it, not its temporary file)."""

    def __init__(self, label: str) -> None:
        self.label = label

    def __enter__(self) -> None:
        return None

    def __exit__(self, kind, exc, tb) -> bool:
        if exc is not None and isinstance(exc, OSError):
            raise OutputError(f"cannot write {self.label}: {exc.strerror or exc}") from None
        return False


def _joints(messages: Iterator[Any], json_path: str) -> Iterator[tuple[dict[str, Any], int | None]]:
    """(joint entry, beam's entity id) for each joint line of results.json, read up to the size each
    message gives as the main process writes the file."""
    with open(json_path, "rb") as fh:
        for message in messages:
            if message is None:
                return
            size, beam_ids = message
            piece = fh.read(size - fh.tell())
            if not beam_ids:
                continue  # the head, the warnings, the closing brackets
            lines = [ln.strip().rstrip(b",") for ln in piece.split(b"\n")]
            lines = [ln for ln in lines if ln]
            if len(lines) != len(beam_ids):
                raise OutputError(f"results.json: {len(lines)} joint lines where {len(beam_ids)} were announced")
            for line, beam_id in zip(lines, beam_ids):
                yield orjson.loads(line), beam_id
    raise OutputError("the property-set writer was not told that the model copy is complete")


def _spooled(spool: BinaryIO, crlf: bool) -> Iterator[bytes]:
    while True:
        block = spool.read(1 << 22)
        if not block:
            return
        yield _ended(block, crlf)


def _frame(message: Any) -> bytes:
    """One message as sent: its length (8 bytes, little-endian), then its :mod:`marshal` bytes."""
    data = marshal.dumps(message, 4)
    return struct.pack("<Q", len(data)) + data


def _read_exact(read: Callable[[int], bytes], n: int) -> bytes | None:
    chunks, got = [], 0
    while got < n:
        block = read(n - got)
        if not block:
            if got:
                raise OutputError("the property-set writer's input ended in the middle of a message")
            return None
        chunks.append(block)
        got += len(block)
    return b"".join(chunks)


def _messages(read: Callable[[int], bytes]) -> Iterator[Any]:
    """The messages read with ``read`` (framed as :func:`_frame`), decoded, until the input ends."""
    while True:
        head = _read_exact(read, 8)
        if head is None:
            return
        body = _read_exact(read, struct.unpack("<Q", head)[0])
        if body is None:
            raise OutputError("the property-set writer's input ended in the middle of a message")
        yield marshal.loads(body)


def _drained(fd: int) -> Iterator[Any]:
    """The messages on file descriptor ``fd``, read by a thread of their own as they arrive (it
    waits for input outside the interpreter lock), so the main process never waits for this one to
    be ready for more while it formats."""
    q: queue.Queue = queue.Queue()
    done = object()

    def _reader() -> None:
        try:
            for message in _messages(lambda n: os.read(fd, min(n, 1 << 20))):
                q.put(message)
        except BaseException as exc:  # handed to the formatting thread
            q.put(exc)
        q.put(done)

    threading.Thread(target=_reader, daemon=True).start()
    while True:
        item = q.get()
        if item is done:
            return
        if isinstance(item, BaseException):
            raise item
        yield item


class PsetFeed:
    """The main process's side. Started at once (so the worker is ready when the results are);
    :meth:`begin` with the settings, :meth:`add` each results-document joint as it is made,
    :meth:`finish` once the copy of the model is complete. Errors come back from :meth:`finish` as
    :class:`OutputError` (a user can act on it) or ``RuntimeError`` (a bug)."""

    def __init__(self, *, separate: bool | None = None) -> None:
        self._batch: list[tuple] = []
        self._proc: subprocess.Popen | None = None
        self._spool: BinaryIO | None = None
        self._stopped = False  # the worker ended before it was told to: finish() says why
        self._target = "the model copy"
        if separate is None:
            separate = not os.environ.get("JOINT_AUDIT_SERIAL")
        if separate:
            root = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
            path = os.environ.get("PYTHONPATH")
            try:
                self._proc = subprocess.Popen(
                    [sys.executable, "-m", "engine.pset_worker"], stdin=subprocess.PIPE,
                    stdout=subprocess.DEVNULL, stderr=subprocess.PIPE,
                    env=dict(os.environ, PYTHONPATH=root + (os.pathsep + path if path else "")))
            except OSError:
                self._proc = None
        if self._proc is None:
            self._spool = tempfile.TemporaryFile()

    def begin(self, settings: Mapping[str, Any]) -> None:
        """Send the settings (see the module docstring); the paths are made absolute."""
        settings = dict(settings, ifc=os.path.abspath(settings["ifc"]), csv=os.path.abspath(settings["csv"]),
                        json=os.path.abspath(settings["json"]))
        self._target = settings["ifc"]
        self._send(settings)

    def add(self, beam_id: int | None) -> None:
        """The beam entity id of the next joint line of results.json (``None``: no property set)."""
        self._batch.append(beam_id)

    def written(self, size: int) -> None:
        """results.json is in its file up to ``size`` bytes; the joint lines in the piece just
        written are those :meth:`add` was told of since the last call."""
        self._send((size, self._batch))
        self._batch = []

    def _send(self, message: Any) -> None:
        data = _frame(message)
        if self._proc is not None:
            if self._stopped:
                return
            try:
                self._proc.stdin.write(data)  # type: ignore[union-attr]
            except OSError:  # the worker stopped (a broken pipe): finish() says why
                self._stopped = True
            return
        try:
            self._spool.write(data)  # type: ignore[union-attr]
        except OSError as exc:
            raise OutputError(f"cannot write {self._target}: {exc.strerror or exc}") from None

    def finish(self) -> None:
        """Send the go-ahead (results.json complete, and the copy), and wait until the schedule and
        the sets are written."""
        self._send(None)
        if self._proc is None:
            spool = self._spool
            assert spool is not None
            try:
                spool.seek(0)
                run_worker(_messages(spool.read))
            except OSError as exc:
                raise OutputError(f"cannot write {exc.filename or self._target}: {exc.strerror or exc}") from None
            finally:
                spool.close()
            return
        proc = self._proc
        try:
            proc.stdin.close()  # type: ignore[union-attr]
        except OSError:
            pass
        err = proc.stderr.read().decode("utf-8", "replace").strip()  # type: ignore[union-attr]
        code = proc.wait()
        if code == 0:
            return
        line = err.splitlines()[-1] if err else f"the property-set writer stopped with status {code}"
        if code == 2:
            raise OutputError(line)
        raise RuntimeError(f"in the property-set writer: {line}")

    def cancel(self) -> None:
        """Stop the worker (nothing is raised)."""
        if self._proc is not None:
            if self._proc.poll() is None:
                self._proc.kill()
            self._proc.wait()
        if self._spool is not None:
            self._spool.close()


def _main() -> int:
    # an interrupt at the terminal reaches every process of the group: the main process handles it
    # (and stops this one)
    signal.signal(signal.SIGINT, signal.SIG_IGN)
    try:
        run_worker(_drained(sys.stdin.fileno()))
    except JointAuditError as exc:
        sys.stderr.write(f"{exc}\n")
        return 2
    except OSError as exc:
        sys.stderr.write(f"cannot write {exc.filename or 'the outputs'}: {exc.strerror or exc}\n")
        return 2
    except Exception as exc:  # a bug: one line
        sys.stderr.write(f"{type(exc).__name__}: {exc}\n")
        return 3
    return 0


if __name__ == "__main__":
    sys.exit(_main())
