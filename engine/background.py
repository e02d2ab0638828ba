"""Work in a child process while the main process goes on (POSIX ``fork``): the copy of the model
when IfcOpenShell writes it, and the reading of a large model (``ifc_io.read_members``, whose
children return their members).

Writing the audited copy of a large model is mostly IfcOpenShell's own serialisation, which holds the
interpreter for its whole run; the rest of the audit (joints, checks, the issue list, the BCF file,
results.json) does not need that copy. On Linux the copy is therefore written by a forked child
process — which sees the model exactly as it was at the fork — while the main process goes on, so a
machine with two or more cores does both at once. Elsewhere, or with ``JOINT_AUDIT_SERIAL=1`` in the
environment, the work simply runs in the main process at the same point. The result is the same
either way: the child only writes to the temporary file it is given, and its failure comes back to
the main process as an exception when it is joined.

Nothing here knows about IFC: a task is any callable.
"""

from __future__ import annotations

import gc
import os
import pickle
import signal
import sys
from typing import Callable

from engine.errors import JointAuditError, OutputError

__all__ = ["BackgroundTask", "can_fork"]


def can_fork() -> bool:
    """True where tasks run in a forked child: Linux, unless ``JOINT_AUDIT_SERIAL`` is set."""
    return hasattr(os, "fork") and sys.platform.startswith("linux") and not os.environ.get("JOINT_AUDIT_SERIAL")


def _describe(exc: BaseException) -> tuple[bytes, str]:
    """(kind, message): ``b"E"`` for an error a user can act on (the project's own errors, and
    operating-system errors such as a full disk), ``b"X"`` for anything else (a bug)."""
    if isinstance(exc, JointAuditError):
        return b"E", str(exc)
    if isinstance(exc, OSError):
        where = f" {exc.filename}" if getattr(exc, "filename", None) else ""
        return b"E", f"cannot write{where}: {exc.strerror or exc}"
    return b"X", f"{type(exc).__name__}: {exc}"


class BackgroundTask:
    """Run ``fn()`` in a forked child process (see the module docstring), or at once in this
    process where forking is not used. :meth:`join` waits for it and raises what it raised:
    :class:`OutputError` for an error a user can act on, ``RuntimeError`` for a bug; :meth:`cancel`
    stops it. With ``returns=True`` the value ``fn()`` returns (pickled, so plain data) comes back
    from :meth:`join`; otherwise join returns ``None``."""

    def __init__(self, fn: Callable[[], object], *, fork: bool | None = None, returns: bool = False) -> None:
        self._pid: int | None = None
        self._fd: int | None = None
        self._error: BaseException | None = None
        self._value: object = None
        if not (can_fork() if fork is None else fork):
            try:
                value = fn()
                self._value = value if returns else None
            except BaseException as exc:  # kept, and raised by join() as the forked path would
                self._error = exc
            return
        sys.stdout.flush()
        sys.stderr.flush()
        read_fd, write_fd = os.pipe()
        pid = os.fork()
        if pid == 0:  # the child: do the work, report, and leave without running the parent's exit hooks
            code = 0
            try:
                os.close(read_fd)
                signal.signal(signal.SIGINT, signal.SIG_IGN)  # the main process handles an interrupt
                # no cyclic garbage collection in the child: a collection walks every object it
                # shares with the main process and so copies their pages (the child is short-lived
                # and frees everything when it ends)
                gc.disable()
                value = fn()
                if returns:  # pickled whole first: a value that cannot be pickled is an error, not half a report
                    data = memoryview(b"R" + pickle.dumps(value, protocol=pickle.HIGHEST_PROTOCOL))
                    while data:
                        data = data[os.write(write_fd, data):]
            except BaseException as exc:
                code = 1
                try:
                    kind, message = _describe(exc)
                    os.write(write_fd, kind + message.encode("utf-8", "replace")[:60000])
                except BaseException:
                    pass
            finally:
                os._exit(code)
        os.close(write_fd)
        self._pid, self._fd = pid, read_fd

    def join(self) -> object:
        """Wait for the task; raise what it raised, or return what it returned (``returns=True``)."""
        if self._pid is None:
            if self._error is not None:
                err, self._error = self._error, None
                if isinstance(err, OSError):  # as the forked path reports it
                    raise OutputError(_describe(err)[1]) from err
                raise err
            value, self._value = self._value, None
            return value
        chunks = []
        while True:
            block = os.read(self._fd, 65536)
            if not block:
                break
            chunks.append(block)
        os.close(self._fd)
        _, status = os.waitpid(self._pid, 0)
        self._pid = self._fd = None
        code = os.waitstatus_to_exitcode(status)
        report = b"".join(chunks)
        if code == 0:
            return pickle.loads(report[1:]) if report[:1] == b"R" else None
        kind, message = report[:1], report[1:].decode("utf-8", "replace")
        if kind == b"E":
            raise OutputError(message)
        if kind == b"X":
            raise RuntimeError(f"in the background writer: {message}")
        raise RuntimeError(f"the background writer stopped with status {code}")

    def cancel(self) -> None:
        """Stop the task if it is still running (nothing is raised)."""
        if self._pid is None:
            self._error = None
            return
        try:
            os.kill(self._pid, signal.SIGKILL)
        except ProcessLookupError:
            pass
        try:
            os.waitpid(self._pid, 0)
        except ChildProcessError:
            pass
        if self._fd is not None:
            os.close(self._fd)
        self._pid = self._fd = None
