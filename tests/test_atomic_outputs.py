"""engine.atomic: outputs are renamed into place only when written; a file that replaces an earlier
output is forced to disk before the rename (an operating-system crash then leaves the old file or
the whole new one, so an earlier results.json used as a baseline is never lost), a new file is not."""

from __future__ import annotations

import os

from engine import atomic


def _written(tmp_path, name: str, text: str) -> str:
    tmp = atomic.new_temp(tmp_path / name)
    atomic.write_prepared(tmp, tmp_path / name, text)
    return tmp


def test_replacing_an_output_forces_it_to_disk_and_a_new_one_is_not(tmp_path, monkeypatch):
    synced: list[int] = []
    real = os.fsync
    monkeypatch.setattr(atomic.os, "fsync", lambda fd: (synced.append(fd), real(fd))[1])
    (tmp_path / "old.json").write_text("earlier run")
    pairs = [(_written(tmp_path, "old.json", "new run"), tmp_path / "old.json"),
             (_written(tmp_path, "new.json", "first"), tmp_path / "new.json")]
    atomic.commit_all(pairs)
    assert len(synced) == 1  # the replacement only
    assert (tmp_path / "old.json").read_text() == "new run" and (tmp_path / "new.json").read_text() == "first"
    assert not list(tmp_path.glob("*.part"))


def test_a_written_part_is_in_the_file_when_the_callback_hears_of_it(tmp_path):
    seen: list[tuple[int, bytes]] = []
    target = tmp_path / "out.txt"

    def _written_so_far(size: int) -> None:  # another process reads up to here
        with open(tmp, "rb") as fh:
            seen.append((size, fh.read()))

    tmp = atomic.new_temp(target)
    atomic.parts_writer(["abc", b"def", "g"], written=_written_so_far)(tmp)
    assert seen == [(3, b"abc"), (6, b"abcdef"), (7, b"abcdefg")]
