"""Atomic output: write to a temporary file in the target folder, then rename over the target.

A reader never sees a half-written output, and a failure leaves no partial file behind. A file that
replaces an earlier one (a re-run into the same folder, whose results.json may be the next run's
baseline) is forced to disk before the rename, so that even an operating-system crash leaves the
old file or the whole new one; a new file is not (its content is derived and is made again by
re-running, and forcing tens of megabytes to disk made large audits wait on it).
:func:`write_temps` and :func:`commit_all` do the same for a set of files: all are written to
temporary files first and renamed only when every one of them has been written, so a failure leaves
none of the new files behind.
"""

from __future__ import annotations

import os
import tempfile
from pathlib import Path
from typing import Callable, Iterable, Sequence

from engine.errors import OutputError

__all__ = ["write_atomic", "write_atomic_with", "write_temps", "write_prepared", "commit_all",
           "new_temp", "unlink_quietly", "refuse_input_overwrite", "parts_writer"]


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
    tmp = new_temp(target)
    try:
        writer(tmp)
        _durable_if_replacing(tmp, target)
        os.replace(tmp, target)
    except OSError as exc:
        _unlink(tmp)
        raise OutputError(f"cannot write {target}: {exc.strerror or exc}") from None
    except BaseException:
        _unlink(tmp)
        raise
    return target


def _bytes_writer(data: bytes | str) -> Callable[[str], None]:
    return parts_writer((data,))


def parts_writer(parts: Iterable[bytes | str], written: Callable[[int], None] | None = None
                 ) -> Callable[[str], None]:
    """A writer (for :func:`write_temps` or :func:`write_prepared`) that writes ``parts`` one after the other (text as
    UTF-8), so a large output never has to be held whole in memory. The parts are produced while
    the file is written: an error in producing them leaves no output, like any other write error.
    ``written(size)``, if given, is called after each part, once it is in the file (flushed), with
    the file's size so far: another process may read the file up to there."""

    def _write(tmp: str) -> None:
        with open(tmp, "wb") as fh:
            for part in parts:
                fh.write(part.encode("utf-8") if isinstance(part, str) else part)
                if written is not None:
                    fh.flush()
                    written(fh.tell())
            fh.flush()

    return _write


def _durable_if_replacing(tmp: str, target: str | os.PathLike[str]) -> None:
    """Force ``tmp`` to disk when it is to replace an existing ``target`` (see the module docstring)."""
    if os.path.exists(target):
        fd = os.open(tmp, os.O_RDONLY)
        try:
            os.fsync(fd)
        finally:
            os.close(fd)


def write_atomic(target: str | os.PathLike[str], data: bytes | str) -> Path:
    """Write ``data`` (bytes, or text as UTF-8) to ``target`` atomically."""
    return write_atomic_with(target, _bytes_writer(data))


def new_temp(target: str | os.PathLike[str]) -> str:
    """A new empty temporary file beside ``target`` (same folder, so the final rename is atomic),
    named ``.<target name>.<random>.part``. Raises :class:`OutputError` naming the folder."""
    t = Path(target)
    if t.is_dir():
        raise OutputError(f"cannot write {t}: a folder of that name is in the way; remove it or choose "
                          f"another --out folder")
    try:
        fd, tmp = tempfile.mkstemp(prefix=f".{t.name}.", suffix=".part", dir=t.parent)
    except OSError as exc:
        raise OutputError(f"cannot write in {t.parent}: {exc.strerror or exc}") from None
    os.close(fd)
    return tmp


def commit_all(pairs: Sequence[tuple[str, str | os.PathLike[str]]]) -> list[Path]:
    """Rename each written temporary file over its target, ``(temporary, target)`` in order. If a
    rename fails, the temporary files not yet renamed are removed, and so are the targets already
    renamed that did not exist before; the error is an :class:`OutputError`. A file that replaces
    an existing target is forced to disk first (see the module docstring)."""
    targets = [Path(t) for _, t in pairs]
    existed = [t.exists() for t in targets]
    done: list[Path] = []
    for (tmp, _), t, was in zip(pairs, targets, existed):
        if was:
            try:
                _durable_if_replacing(tmp, t)
            except OSError as exc:
                for rest, _ in pairs:
                    _unlink(rest)
                raise OutputError(f"cannot write {t}: {exc.strerror or exc}") from None
    for i, ((tmp, _), t) in enumerate(zip(pairs, targets)):
        try:
            os.replace(tmp, t)
        except OSError as exc:
            for rest, _ in pairs[i:]:
                _unlink(rest)
            for d, was in zip(done, existed):
                if not was:
                    _unlink(str(d))
            raise OutputError(f"cannot write {t}: {exc.strerror or exc}") from None
        done.append(t)
    return done


def write_temps(
    outputs: Sequence[tuple[str | os.PathLike[str], bytes | str | Callable[[str], None]]],
) -> list[tuple[str, Path]]:
    """Write each ``(target, data_or_writer)`` to a temporary file beside its target (``data``
    bytes or text, or a ``writer(tmp_path)``) and return the ``(temporary, target)`` pairs for
    :func:`commit_all`. If anything fails, the temporary files are removed and the error is an
    :class:`OutputError` (an error raised by a writer itself passes through)."""
    pairs: list[tuple[str, Path]] = []
    try:
        for t, what in outputs:
            tmp = new_temp(t)
            pairs.append((tmp, Path(t)))
            write_prepared(tmp, t, what)
    except BaseException:
        for tmp, _ in pairs:
            _unlink(tmp)
        raise
    return pairs


def write_prepared(tmp: str, target: str | os.PathLike[str], what: bytes | str | Callable[[str], None]) -> None:
    """Write ``what`` (bytes, text, or a ``writer(tmp_path)``) into the temporary file ``tmp`` made
    for ``target`` by :func:`new_temp`; an operating-system error is an :class:`OutputError` naming
    the target. The caller commits or removes ``tmp``."""
    writer = what if callable(what) else _bytes_writer(what)
    try:
        writer(tmp)
    except OSError as exc:
        raise OutputError(f"cannot write {target}: {exc.strerror or exc}") from None


def unlink_quietly(path: str | os.PathLike[str]) -> None:
    """Remove a file if it is there (a temporary file being cleaned up); never raises."""
    _unlink(str(path))


def _unlink(path: str) -> None:
    try:
        os.unlink(path)
    except OSError:
        pass
