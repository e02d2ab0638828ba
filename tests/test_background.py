"""engine.background: work run in a forked child (Linux) or in this process reports its result and
its errors the same way, and a cancelled task leaves nothing running."""

from __future__ import annotations

import os
import time
from pathlib import Path

import pytest

from engine.background import BackgroundTask, can_fork
from engine.errors import ConfigError, OutputError

MODES = [False] + ([True] if can_fork() else [])


@pytest.mark.parametrize("fork", MODES)
def test_task_writes_its_file_and_join_returns(tmp_path, fork):
    target = tmp_path / "out.txt"
    task = BackgroundTask(lambda: target.write_text("written"), fork=fork)
    task.join()
    assert target.read_text() == "written"


@pytest.mark.parametrize("fork", MODES)
def test_an_error_a_user_can_act_on_comes_back_as_an_output_error(tmp_path, fork):
    def fail():
        raise ConfigError("the thing is wrong; fix the thing")

    task = BackgroundTask(fail, fork=fork)
    with pytest.raises((OutputError, ConfigError), match="fix the thing"):
        task.join()


@pytest.mark.parametrize("fork", MODES)
def test_a_disk_error_names_the_file(tmp_path, fork):
    missing = tmp_path / "no-such-folder" / "x.txt"
    task = BackgroundTask(lambda: missing.write_text("x"), fork=fork)
    with pytest.raises(OutputError, match="no-such-folder"):
        task.join()


@pytest.mark.skipif(not can_fork(), reason="no fork here")
def test_a_bug_in_the_child_is_a_runtime_error_not_a_user_error():
    task = BackgroundTask(lambda: 1 / 0, fork=True)
    with pytest.raises(RuntimeError, match="ZeroDivisionError"):
        task.join()


@pytest.mark.skipif(not can_fork(), reason="no fork here")
def test_cancel_stops_a_running_child(tmp_path):
    marker = tmp_path / "late.txt"

    def slow():
        time.sleep(30)
        marker.write_text("should never be written")

    t0 = time.perf_counter()
    task = BackgroundTask(slow, fork=True)
    pid = task._pid
    task.cancel()
    assert time.perf_counter() - t0 < 10
    with pytest.raises(ChildProcessError):
        os.waitpid(pid, os.WNOHANG)  # reaped: no such child any more
    assert not marker.exists()
    task.join()  # nothing left to wait for


def test_serial_environment_variable_turns_forking_off(monkeypatch):
    monkeypatch.setenv("JOINT_AUDIT_SERIAL", "1")
    assert not can_fork()
    seen = []
    BackgroundTask(lambda: seen.append(os.getpid())).join()
    assert seen == [os.getpid()]  # ran here, in this process


def test_cycle_collection_is_paused_inside_and_restored_after():
    import gc

    from engine.gc_pause import cycle_collection_paused

    assert gc.isenabled()
    with cycle_collection_paused():
        assert not gc.isenabled()
        with cycle_collection_paused():  # nested: still paused after the inner block
            pass
        assert not gc.isenabled()
    assert gc.isenabled()
    gc.disable()
    try:
        with cycle_collection_paused():
            pass
        assert not gc.isenabled()  # a host program that had it off keeps it off
    finally:
        gc.enable()


@pytest.mark.parametrize("fork", MODES)
def test_a_task_asked_for_its_value_returns_it_from_join(fork):
    task = BackgroundTask(lambda: ([1, 2.5, "three"], {"k": (None, True)}), fork=fork, returns=True)
    assert task.join() == ([1, 2.5, "three"], {"k": (None, True)})


@pytest.mark.skipif(not can_fork(), reason="no fork here")
def test_a_value_that_cannot_be_pickled_is_an_error_not_half_a_value():
    task = BackgroundTask(lambda: (lambda: None), fork=True, returns=True)
    with pytest.raises(RuntimeError, match="pickle"):
        task.join()
