"""The walk lock: one writer at a time, told who holds it, stale locks from dead processes
cleared."""

from __future__ import annotations

import json
import os
import select
import socket
import subprocess
import sys
import time

import pytest

from gaugewalk.model.walkfile.lock import (
    WalkLocked,
    acquire_lock,
    lock_holder,
    lock_path,
)
from tests.support.locks import dead_pid, live_process, write_lock
from tests.support.paths import REPO as REPO_ROOT


def test_the_lock_file_sits_beside_the_walk_with_json_naming_the_holder(tmp_path):
    walk = tmp_path / "shop.toml"
    with acquire_lock(walk, tool="gaugewalk add") as lock:
        assert lock.lock_file == tmp_path / ".shop.toml.lock"
        data = json.loads(lock.lock_file.read_text())
        assert data["pid"] == os.getpid()
        assert data["host"] == socket.gethostname()
        assert data["tool"] == "gaugewalk add"
        assert set(data) == {"user", "host", "pid", "since", "tool"}
        assert lock.stale is None and lock.message is None
    assert not (tmp_path / ".shop.toml.lock").exists()


def test_a_second_opener_is_told_user_host_pid_and_since(tmp_path):
    walk = tmp_path / "shop.toml"
    other = live_process()
    try:
        holder = write_lock(walk, other.pid)
        with pytest.raises(WalkLocked) as caught:
            acquire_lock(walk)
        message = str(caught.value)
        assert "dana" in message and socket.gethostname() in message
        assert f"process {other.pid}" in message and f"since {holder.since_local()}" in message
        assert str(walk) in message
        assert lock_holder(walk).pid == other.pid
        # the holder's lock is untouched
        assert json.loads(lock_path(walk).read_text())["pid"] == other.pid
    finally:
        other.kill()
        other.wait()


def test_a_stale_lock_from_a_dead_process_is_cleared_with_a_message(tmp_path):
    walk = tmp_path / "shop.toml"
    dead = dead_pid()
    write_lock(walk, dead)
    assert lock_holder(walk) is None
    lock = acquire_lock(walk)
    try:
        assert lock.stale is not None and lock.stale.pid == dead
        assert "no longer running" in lock.message and "dana" in lock.message
        assert json.loads(lock.lock_file.read_text())["pid"] == os.getpid()
    finally:
        lock.release()


def test_a_lock_killed_with_its_process_is_stale_for_the_next_opener(tmp_path):
    walk = tmp_path / "shop.toml"
    code = (
        "import sys, time\n"
        "from gaugewalk.model.walkfile.lock import acquire_lock\n"
        f"acquire_lock({str(walk)!r}, tool='app')\n"
        "print('held', flush=True)\n"
        "time.sleep(60)\n"
    )
    proc = subprocess.Popen([sys.executable, "-c", code], stdout=subprocess.PIPE, text=True,
                            cwd=str(REPO_ROOT))
    try:
        assert proc.stdout.readline().strip() == "held"
        with pytest.raises(WalkLocked):
            acquire_lock(walk)
        proc.kill()
        proc.wait()
        with acquire_lock(walk) as lock:
            assert lock.stale is not None and lock.stale.pid == proc.pid
    finally:
        if proc.poll() is None:
            proc.kill()
            proc.wait()


def test_a_lock_from_another_host_is_honoured_and_says_how_to_clear_it(tmp_path):
    walk = tmp_path / "shop.toml"
    write_lock(walk, dead_pid(), host="some-other-laptop")
    with pytest.raises(WalkLocked) as caught:
        acquire_lock(walk)
    assert "some-other-laptop" in str(caught.value)
    assert f"gaugewalk unlock --force {walk}" in str(caught.value)


def test_releasing_never_removes_a_lock_that_is_no_longer_ours(tmp_path):
    walk = tmp_path / "shop.toml"
    lock = acquire_lock(walk)
    other = live_process()
    try:
        write_lock(walk, other.pid)  # someone cleared ours by hand and took it
        lock.release()
        assert lock_path(walk).exists()
        assert lock_holder(walk).pid == other.pid
    finally:
        other.kill()
        other.wait()


def test_a_half_written_lock_is_treated_as_held_then_cleared_once_old(tmp_path):
    walk = tmp_path / "shop.toml"
    lock_path(walk).write_text("")
    with pytest.raises(WalkLocked) as caught:
        acquire_lock(walk)
    assert "try again" in str(caught.value)
    old = time.time() - 60
    os.utime(lock_path(walk), (old, old))
    with acquire_lock(walk) as lock:
        assert lock.stale is not None and "held no lock data" in lock.message


def _race_for_lock(walk, ready_fd: int, go_path, done_path) -> None:
    """In a forked child: wait for the start signal, try to take the lock, and say how it went;
    the winner holds the lock until every racer has said (so no racer can come late and find it
    free, however busy the machine)."""
    while not os.path.exists(go_path):
        time.sleep(0.0005)
    try:
        lock = acquire_lock(walk)
    except WalkLocked:
        os.write(ready_fd, b"L")
        os._exit(0)
    except BaseException:
        os.write(ready_fd, b"E")
        os._exit(1)
    os.write(ready_fd, b"W")
    while not os.path.exists(done_path):
        time.sleep(0.0005)
    lock.release()
    os._exit(0)


def _read_answers(fd: int, count: int, seconds: float = 60.0) -> bytes:
    """Up to ``count`` one-byte answers from the racers (fewer if they stop answering)."""
    got = b""
    deadline = time.monotonic() + seconds
    while len(got) < count and time.monotonic() < deadline:
        if select.select([fd], [], [], 0.5)[0]:
            chunk = os.read(fd, count - len(got))
            if not chunk:
                break
            got += chunk
    return got


@pytest.mark.parametrize("stale_first", [False, True])
def test_racing_openers_get_exactly_one_lock_even_over_a_stale_one(tmp_path, stale_first):
    """Eight processes start at once (over a stale lock in the second case): exactly one wins,
    the others are told it is held; none removes the winner's lock. Repeated 6 times."""
    for round_ in range(6):
        walk = tmp_path / f"race{round_}.toml"
        go = tmp_path / f"go{round_}"
        done = tmp_path / f"done{round_}"
        if stale_first:
            write_lock(walk, dead_pid())
        r, w = os.pipe()
        pids = []
        for _ in range(8):
            pid = os.fork()
            if pid == 0:
                os.close(r)
                _race_for_lock(walk, w, go, done)
            pids.append(pid)
        os.close(w)
        go.touch()
        outcome = _read_answers(r, 8)
        done.touch()
        for pid in pids:
            os.waitpid(pid, 0)
        while chunk := os.read(r, 64):
            outcome += chunk
        os.close(r)
        assert sorted(outcome.decode()) == ["L"] * 7 + ["W"], outcome
        assert not lock_path(walk).exists()
