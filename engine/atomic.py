"""Atomic output: write to a temporary file in the target folder, then rename over the target.

A reader never sees a half-written output, and a failure leaves no partial file behind.
"""

from __future__ import annotations

import os
import tempfile
from pathlib import Path
from typing import Callable

from engine.errors import OutputError

__all__ = ["write_atomic", "write_atomic_with", "refuse_input_overwrite"]


def refuse_input_overwrite(target: str | os.PathLike[str], inputs: list[str | os.PathLike[str]]) -> None:
    """Raise :class:`OutputError` if ``target`` is (or links to) one of the ``inputs``."""
    t = Path(target)
    for src in inputs:
        s = Path(src)
        try:
            same = t.exists() and s.exists() and os.path.samefile(t, s)
        except OSError:
            same = False
        if same or t.resolve() == s.resolve():
            raise OutputError(f"refusing to write {t}: it is the input file {s}; choose another --out folder")


def write_atomic_with(target: str | os.PathLike[str], writer: Callable[[str], None]) -> Path:
    """Call ``writer(tmp_path)`` to produce the file, then rename it to ``target`` atomically."""
    target = Path(target)
    folder = target.parent
    try:
        fd, tmp = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".part", dir=folder)
    except OSError as exc:
        raise OutputError(f"cannot write in {folder}: {exc.strerror or exc}") from None
    os.close(fd)
    try:
        writer(tmp)
        os.replace(tmp, target)
    except OSError as exc:
        _unlink(tmp)
        raise OutputError(f"cannot write {target}: {exc.strerror or exc}") from None
    except BaseException:
        _unlink(tmp)
        raise
    return target


def write_atomic(target: str | os.PathLike[str], data: bytes | str) -> Path:
    """Write ``data`` (bytes, or text as UTF-8) to ``target`` atomically."""
    payload = data.encode("utf-8") if isinstance(data, str) else data

    def _write(tmp: str) -> None:
        with open(tmp, "wb") as fh:
            fh.write(payload)
            fh.flush()
            os.fsync(fh.fileno())

    return write_atomic_with(target, _write)


def _unlink(path: str) -> None:
    try:
        os.unlink(path)
    except OSError:
        pass
