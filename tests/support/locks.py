"""Other openers of a walk, for the lock tests: a live process, a dead one, and a lock file
naming either (the holder is "dana" with the app, on this computer unless told otherwise)."""

from __future__ import annotations

import socket
import subprocess
import sys
from datetime import datetime, timezone

from gaugewalk.model.walkfile.lock import LockHolder, lock_path


def live_process() -> subprocess.Popen:
    """A process of our own that stays alive until killed: stands in for another opener."""
    return subprocess.Popen([sys.executable, "-c", "import time; time.sleep(60)"])


def dead_pid() -> int:
    """The process id of a process that has ended."""
    proc = subprocess.Popen([sys.executable, "-c", "pass"])
    proc.wait()
    return proc.pid


def write_lock(walk, pid: int, host: str | None = None, since: str | None = None) -> LockHolder:
    """Put a lock beside ``walk`` as the app of process ``pid`` would, written ``since`` (default:
    now; a lock written before its process started names a reused process id)."""
    if since is None:
        since = datetime.now(timezone.utc).replace(microsecond=0).isoformat()
    holder = LockHolder("dana", host or socket.gethostname(), pid, since, "gaugewalk app")
    lock_path(walk).write_text(holder.to_json())
    return holder
