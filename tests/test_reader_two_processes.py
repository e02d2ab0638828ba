"""A large model is read by two processes (ifc_io.read_members, engine.background): the members and
warnings must be exactly those of one process reading it all, in the same order, on every real
file, the demo models and a damaged file; and if the second process fails, the first reads its half.

The split normally starts at ``PARALLEL_MIN`` elements; the real files are small, so the tests
lower the threshold to split every file."""

from __future__ import annotations

from pathlib import Path

import pytest

import ifc_io.read_members as read_members_module
from engine.background import BackgroundTask, can_fork
from helpers_models import REAL_FILES
from ifc_io import read_frame

pytestmark = pytest.mark.skipif(not can_fork(), reason="the split needs fork (Linux)")

REPO = Path(__file__).resolve().parents[1]

def _read_both(path: Path, monkeypatch) -> tuple:
    monkeypatch.setenv("JOINT_AUDIT_SERIAL", "1")
    serial = read_frame(path)
    monkeypatch.delenv("JOINT_AUDIT_SERIAL")
    monkeypatch.setattr(read_members_module, "PARALLEL_MIN", 1)
    split = read_frame(path)
    return serial, split


@pytest.mark.parametrize("name", REAL_FILES)
def test_two_processes_read_the_same_frame_as_one_from_a_real_file(shared_models, monkeypatch, name):
    serial, split = _read_both(shared_models / name, monkeypatch)
    assert split.members == serial.members
    assert split.warnings == serial.warnings
    assert split == serial


@pytest.mark.parametrize("name", ["demo-ifc4-mm.ifc", "demo-ifc2x3-ft.ifc"])
def test_two_processes_read_the_same_frame_as_one_from_the_demo(monkeypatch, name):
    serial, split = _read_both(REPO / "samples" / name, monkeypatch)
    assert len(serial.members) > 10
    assert split == serial


def test_warnings_of_both_halves_come_in_element_order_from_a_damaged_file(tmp_path, monkeypatch):
    # the second and the second-last beam lose their representation: one skipped member in each
    # half, warned in file order
    from samples.synthetic import synthetic_frame, write_synthetic_ifc

    path = tmp_path / "frame.ifc"
    write_synthetic_ifc(synthetic_frame(40), path)
    text = path.read_text()
    beams = [ln for ln in text.splitlines() if "=IFCBEAM(" in ln]
    for ln in (beams[1], beams[-2]):
        parts = ln.split(",")
        parts[6] = "$"  # Representation
        text = text.replace(ln, ",".join(parts))
    path.write_text(text)
    serial, split = _read_both(path, monkeypatch)
    assert split == serial
    assert len(serial.members) == len(synthetic_frame(40)) - 2
    skipped = [w.message for w in serial.warnings if "skipped" in w.message]
    assert len(skipped) == 2 and skipped == [w.message for w in split.warnings if "skipped" in w.message]


def test_a_failed_second_process_leaves_its_half_to_the_first(shared_models, monkeypatch):
    path = shared_models / "small-steel-frame-ifc2x3-mm.ifc"
    monkeypatch.setenv("JOINT_AUDIT_SERIAL", "1")
    serial = read_frame(path)
    monkeypatch.delenv("JOINT_AUDIT_SERIAL")
    monkeypatch.setattr(read_members_module, "PARALLEL_MIN", 1)

    def killed(self):
        self.cancel()
        raise RuntimeError("the background writer stopped with status -9")

    monkeypatch.setattr(BackgroundTask, "join", killed)
    assert read_frame(path) == serial
