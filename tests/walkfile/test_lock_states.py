"""Every stale or broken lock a walk can be found with (issue 15): each says what it is and how to
clear it, the stale ones are cleared by the next opener, the broken ones by ``gaugewalk unlock``
(which never breaks a lock a running gaugewalk holds)."""

from __future__ import annotations

import contextlib
import io
import os
from datetime import datetime, timedelta, timezone
from pathlib import Path

import pytest

from gaugewalk.model.walkfile.lock import (
    LockError,
    WalkLocked,
    acquire_lock,
    break_lock,
    inspect_lock,
    lock_holder,
    lock_path,
)
from gaugewalk.tui.cli.main import main
from tests.support.locks import dead_pid, live_process, write_lock
from tests.support.walks import SMALL_WALK, write_walk


def _cli(argv: list[str]) -> tuple[int, str, str]:
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        code = main(argv)
    return code, out.getvalue(), err.getvalue()


@pytest.fixture
def walk(tmp_path):
    return write_walk(tmp_path, SMALL_WALK, "shop.toml")


def _add(walk) -> list[str]:
    return ["add", str(walk), "--from", "LP1", "--to", "Mixer", "--length", "40", "--amps", "8"]


def test_a_lock_whose_process_id_was_reused_is_stale_by_the_process_start_time(walk):
    """The lock was written an hour before the process now using its id started: that process
    cannot have written it."""
    other = live_process()
    try:
        hour_ago = (datetime.now(timezone.utc) - timedelta(hours=1)).replace(microsecond=0)
        write_lock(walk, other.pid, since=hour_ago.isoformat())
        state = inspect_lock(walk)
        assert state.kind == "reused" and f"process {other.pid} is now another program" in state.why
        assert lock_holder(walk) is None
        with acquire_lock(walk) as lock:
            assert lock.stale is not None and lock.stale.pid == other.pid
            assert "now another program" in lock.message and "the lock was cleared" in lock.message
    finally:
        other.kill()
        other.wait()


def test_a_lock_written_after_its_process_started_is_held(walk):
    other = live_process()
    try:
        write_lock(walk, other.pid)  # now: after the process started
        assert inspect_lock(walk).kind == "held"
        with pytest.raises(WalkLocked):
            acquire_lock(walk)
    finally:
        other.kill()
        other.wait()


def test_a_dead_holder_is_cleared_and_says_so(walk):
    write_lock(walk, dead_pid())
    assert inspect_lock(walk).kind == "dead"
    code, out, err = _cli(_add(walk))
    assert code == 0 and "no longer running; the lock was cleared" in err


@pytest.mark.parametrize("make, says", [
    (lambda lock: os.symlink("/nonexistent/gaugewalk-lock", lock),
     "is a symbolic link, which gaugewalk never makes (leading to /nonexistent/gaugewalk-lock)"),
    (lambda lock: os.mkdir(lock), "is a folder, not a lock file"),
    (lambda lock: os.mkfifo(lock), "cannot be read (it is a device, pipe or socket, not a file)"),
])
def test_a_broken_lock_refuses_saying_what_it_is_and_unlock_clears_it(walk, make, says):
    lock = lock_path(walk)
    make(lock)
    before = walk.read_bytes()
    with pytest.raises(WalkLocked) as refused:
        acquire_lock(walk)
    message = refused.value.message
    assert f"its lock .shop.toml.lock {says}" in message
    assert f"if no gaugewalk has the walk open, clear it with: gaugewalk unlock {walk}" in message
    code, out, err = _cli(_add(walk))
    assert code == 2 and says in err and "gaugewalk unlock" in err
    assert walk.read_bytes() == before
    code, out, err = _cli(["unlock", str(walk)])
    assert code == 0 and f"{walk}: cleared the lock: its lock .shop.toml.lock {says}" in out
    assert not os.path.lexists(lock)
    code, out, err = _cli(_add(walk))
    assert code == 0, err


def test_an_unreadable_lock_file_refuses_and_names_the_reason(walk, monkeypatch):
    lock = lock_path(walk)
    write_lock(walk, os.getpid())
    real = Path.read_text

    def denied(self, *args, **kwargs):
        if self == lock:
            raise PermissionError(13, "Permission denied")
        return real(self, *args, **kwargs)

    monkeypatch.setattr(Path, "read_text", denied)
    with pytest.raises(WalkLocked) as refused:
        acquire_lock(walk)
    assert "cannot be read (Permission denied)" in refused.value.message
    assert lock.exists()  # never cleared on its own: someone may hold it


def test_unlock_through_a_symlink_lock_removes_the_link_not_what_it_names(walk, tmp_path):
    precious = tmp_path / "precious.txt"
    precious.write_text("keep me")
    os.symlink(precious, lock_path(walk))
    assert inspect_lock(walk).kind == "symlink"
    break_lock(walk)
    assert precious.read_text() == "keep me" and not os.path.lexists(lock_path(walk))


def test_unlock_never_breaks_a_lock_a_running_gaugewalk_holds(walk):
    other = live_process()
    try:
        write_lock(walk, other.pid)
        code, out, err = _cli(["unlock", str(walk)])
        assert code == 2 and f"process {other.pid}" in err and "not cleared" in err
        code, out, err = _cli(["unlock", str(walk), "--force"])
        assert code == 2
        assert lock_holder(walk).pid == other.pid
    finally:
        other.kill()
        other.wait()


def test_a_lock_from_another_computer_needs_force_to_clear(walk):
    write_lock(walk, 4242, host="laptop-far-away")
    code, out, err = _cli(["unlock", str(walk)])
    assert code == 2 and f"clear it with: gaugewalk unlock --force {walk}" in err
    assert lock_path(walk).exists()
    code, out, err = _cli(["unlock", str(walk), "--force"])
    assert code == 0 and "laptop-far-away" in out and not lock_path(walk).exists()


def test_unlock_of_a_walk_nobody_holds_says_so(walk):
    code, out, err = _cli(["unlock", str(walk)])
    assert code == 0 and "not locked; nothing to clear" in out


def test_a_lock_folder_with_files_in_it_is_not_deleted(walk):
    lock = lock_path(walk)
    lock.mkdir()
    (lock / "someones-file").write_text("x")
    with pytest.raises(LockError):
        break_lock(walk)
    code, out, err = _cli(["unlock", str(walk)])
    assert code == 2 and "cannot remove .shop.toml.lock" in err
    assert (lock / "someones-file").exists()


def test_a_lock_that_cannot_be_removed_at_the_end_is_said_never_raised(walk, monkeypatch):
    lock = acquire_lock(walk)
    real_unlink = os.unlink

    def read_only_folder(path, *args, **kwargs):
        if Path(path) == lock.lock_file:
            raise OSError(30, "Read-only file system")
        return real_unlink(path, *args, **kwargs)

    monkeypatch.setattr(os, "unlink", read_only_folder)
    said = lock.release()
    assert said is not None and "Read-only file system" in said and "next opener" in said
