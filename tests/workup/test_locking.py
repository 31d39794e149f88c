"""Case locks: two sessions learn of each other; a dead session's lock is taken over with a note."""

from __future__ import annotations

import json
import os
import signal
import socket
import subprocess
import sys
import textwrap
from dataclasses import asdict

import pytest

from workup.locking import (
    CaseLock,
    CaseLockedError,
    LockInfo,
    current_holder,
    lock_path,
    pid_alive,
)

HOLD = textwrap.dedent(
    """
    import sys, time
    from workup.locking import CaseLock
    lock = CaseLock.acquire(sys.argv[1])
    print("held", flush=True)
    time.sleep(60)
    """
)


@pytest.fixture
def holder(tmp_path):
    """Another real process holding the lock of a case."""
    case = tmp_path / "case.yaml"
    proc = subprocess.Popen(
        [sys.executable, "-c", HOLD, str(case)], stdout=subprocess.PIPE, text=True
    )
    assert proc.stdout is not None and proc.stdout.readline().strip() == "held"
    yield case, proc
    if proc.poll() is None:
        proc.kill()
    proc.wait()


def test_lock_file_names_the_holder_and_is_removed_on_release(tmp_path):
    case = tmp_path / "case.yaml"
    with CaseLock.acquire(case) as lock:
        assert lock.path == lock_path(case) == tmp_path / ".case.yaml.lock"
        info = json.loads(lock.path.read_text())
        assert info["pid"] == os.getpid()
        assert info["host"] == socket.gethostname()
        assert info["user"] and info["since"]
        assert lock.took_over is None and lock.note is None
        assert current_holder(case) == lock.info
    assert not lock.path.exists()
    assert current_holder(case) is None
    lock.release()  # twice is harmless


def test_a_second_session_learns_who_holds_the_case(holder):
    case, proc = holder
    with pytest.raises(CaseLockedError) as err:
        CaseLock.acquire(case)
    assert err.value.holder is not None
    assert err.value.holder.pid == proc.pid
    assert f"pid {proc.pid}" in str(err.value)
    assert current_holder(case).pid == proc.pid


def test_the_lock_of_a_killed_session_is_taken_over_with_a_note(holder):
    case, proc = holder
    proc.send_signal(signal.SIGKILL)
    proc.wait()
    assert lock_path(case).exists()  # it never got to clean up
    assert current_holder(case) is None  # but the kernel dropped its lock
    with CaseLock.acquire(case) as lock:
        assert lock.took_over is not None and lock.took_over.pid == proc.pid
        assert "ended without closing" in lock.note
        assert f"pid {proc.pid}" in lock.note


def test_a_hand_made_stale_lock_file_is_taken_over(tmp_path):
    case = tmp_path / "case.yaml"
    dead = LockInfo(pid=2**22 + 12345, user="someone", host="elsewhere", since="2026-11-30T08:00")
    lock_path(case).write_text(json.dumps(asdict(dead)))
    with CaseLock.acquire(case) as lock:
        assert lock.took_over == dead
        assert "someone@elsewhere" in lock.note


def test_an_unreadable_lock_file_is_simply_reused(tmp_path):
    case = tmp_path / "case.yaml"
    lock_path(case).write_bytes(b"\x00garbage")
    with CaseLock.acquire(case) as lock:
        assert lock.took_over is None
        assert json.loads(lock.path.read_text())["pid"] == os.getpid()


def test_the_same_case_twice_in_one_process_is_refused(tmp_path):
    case = tmp_path / "case.yaml"
    with CaseLock.acquire(case), pytest.raises(CaseLockedError):
        CaseLock.acquire(case)


def test_pid_alive():
    assert pid_alive(os.getpid())
    assert not pid_alive(0)
    proc = subprocess.Popen([sys.executable, "-c", "pass"])
    proc.wait()
    assert not pid_alive(proc.pid)
