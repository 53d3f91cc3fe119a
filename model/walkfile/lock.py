"""Who has a walk open for writing: a lock file beside the walk.

``walk.toml`` is held through ``.walk.toml.lock`` in the same folder, a small JSON file naming the
holder (user, host, process id, since when, which tool). It is created by the one atomic writer
(``gaugewalk.model.walkfile.atomic``, ``create_only``): the JSON is written to a temporary file
first and hard-linked to the lock name, which fails if a lock is already there (``O_CREAT |
O_EXCL`` is the fallback where links are not allowed), so a lock on disk is always whole. A
second opener is told who holds it; the app then opens read-only and the writing commands
refuse.

A lock whose process is gone (same host, that process id no longer runs) is stale: it is removed
with a message. A lock from another host cannot be checked from here and is honoured; the message
says how to clear it by hand. Breaking a stale lock is itself guarded by a short-lived
``.walk.toml.lock.break`` file, so two openers cannot both clear it and remove each other's fresh
lock.

Public API:

- ``acquire_lock(path, tool="gaugewalk") -> WalkLock``: raises ``WalkLocked`` (its ``holder`` is a
  ``LockHolder``) when another live process holds the walk. ``WalkLock.stale`` is the holder of a
  stale lock that was cleared (None if there was none) and ``WalkLock.message`` says so.
  ``WalkLock.release()`` (or ``with acquire_lock(...)``) removes the lock if it is still ours.
- ``lock_holder(path) -> LockHolder | None``: who holds it now (None: nobody, or a stale lock).
- ``lock_path(path)``; ``LockHolder`` with ``user, host, pid, since, tool`` and ``describe()``.
"""

from __future__ import annotations

import getpass
import json
import os
import socket
import time
from dataclasses import asdict, dataclass
from datetime import datetime, timezone
from pathlib import Path

from gaugewalk.model.walk.plain_text import shown
from gaugewalk.model.walkfile.atomic import atomic_write

LOCK_PREFIX = "."
LOCK_SUFFIX = ".lock"
BREAK_SUFFIX = ".break"
BREAK_STALE_AFTER_S = 10.0
"""A ``.break`` guard older than this [s] was left by a process killed while clearing a lock."""
UNREADABLE_GRACE_S = 5.0
"""A lock file that cannot be read yet is treated as held for this long [s] (only possible with
the ``O_EXCL`` fallback, between creating the file and writing it)."""


def lock_path(path: str | os.PathLike) -> Path:
    """``.walk.toml.lock`` beside ``walk.toml``."""
    p = Path(path)
    return p.with_name(f"{LOCK_PREFIX}{p.name}{LOCK_SUFFIX}")


def _user() -> str:
    try:
        return getpass.getuser()
    except Exception:  # no user name in the environment or the password database
        return f"uid {os.getuid()}" if hasattr(os, "getuid") else "unknown"


@dataclass(frozen=True)
class LockHolder:
    """Who holds a walk: user, host, process id, since when (ISO 8601, UTC) and which tool."""

    user: str
    host: str
    pid: int
    since: str
    tool: str = "gaugewalk"

    @classmethod
    def me(cls, tool: str) -> "LockHolder":
        now = datetime.now(timezone.utc).replace(microsecond=0).isoformat()
        return cls(_user(), socket.gethostname(), os.getpid(), now, tool)

    @classmethod
    def from_json(cls, text: str) -> "LockHolder | None":
        try:
            data = json.loads(text)
            holder = cls(str(data["user"]), str(data["host"]), int(data["pid"]),
                         str(data["since"]), str(data.get("tool", "gaugewalk")))
        except (ValueError, KeyError, TypeError):
            return None
        return holder

    def to_json(self) -> str:
        return json.dumps(asdict(self), indent=1) + "\n"

    def since_local(self) -> str:
        """``since`` in local time, ``2024-05-02 14:03``, or as stored if it cannot be read."""
        try:
            return datetime.fromisoformat(self.since).astimezone().strftime("%Y-%m-%d %H:%M")
        except ValueError:
            return self.since

    def describe(self) -> str:
        """``dana on laptop-3 (process 4121, gaugewalk app) since 2024-05-02 14:03``: text from
        a lock file, control characters shown escaped (``plain_text``)."""
        return shown(f"{self.user} on {self.host} (process {self.pid}, {self.tool}) "
                     f"since {self.since_local()}")

    def on_this_host(self) -> bool:
        return self.host == socket.gethostname()

    def is_alive(self) -> bool:
        """False only when the holder is on this host and its process is gone."""
        if not self.on_this_host():
            return True
        return _pid_alive(self.pid)


def _pid_alive(pid: int) -> bool:
    if pid <= 0:
        return False
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except PermissionError:  # exists, owned by someone else
        return True
    except OSError:
        return False
    # a zombie (killed, not yet reaped by its parent) no longer holds anything
    try:
        with open(f"/proc/{pid}/stat", "rb") as handle:
            state = handle.read().rsplit(b")", 1)[-1].split()[0]
        return state not in (b"Z", b"X")
    except (OSError, IndexError):
        return True


class WalkLocked(Exception):
    """Another live process holds the walk."""

    def __init__(self, path: Path, holder: LockHolder | None) -> None:
        self.path = Path(path)
        self.holder = holder
        super().__init__(self.message)

    @property
    def message(self) -> str:
        lock = lock_path(self.path)
        if self.holder is None:
            return (f"{self.path}: is being opened by another gaugewalk right now "
                    f"(lock file {lock.name} is being written); try again in a moment")
        extra = ""
        if not self.holder.on_this_host():
            extra = (f"; it cannot be checked from this computer: if that gaugewalk is no longer "
                     f"running, delete {lock}")
        return f"{self.path}: open in {self.holder.describe()}{extra}"


class LockError(OSError):
    """The lock file cannot be made (folder not writable, ...)."""


@dataclass
class WalkLock:
    """A held lock. Release it with ``release()`` or by leaving a ``with`` block."""

    path: Path
    holder: LockHolder
    stale: LockHolder | None = None
    _released: bool = False

    @property
    def lock_file(self) -> Path:
        return lock_path(self.path)

    @property
    def message(self) -> str | None:
        """Said once when a stale lock was cleared, else None."""
        if self.stale is None:
            return None
        return (f"{self.path.name} was left locked by {self.stale.describe()}, which is no "
                "longer running; the lock was cleared")

    def still_mine(self) -> bool:
        return _read_holder(self.lock_file)[0] == self.holder

    def release(self) -> None:
        if self._released:
            return
        self._released = True
        if self.still_mine():
            try:
                os.unlink(self.lock_file)
            except FileNotFoundError:
                pass

    def __enter__(self) -> "WalkLock":
        return self

    def __exit__(self, *exc) -> None:
        self.release()


def _read_holder(lock: Path) -> tuple[LockHolder | None, bool]:
    """(holder, exists). A lock that exists but cannot be read gives (None, True)."""
    try:
        text = lock.read_text(encoding="utf-8", errors="replace")
    except FileNotFoundError:
        return None, False
    except OSError:
        return None, True
    return LockHolder.from_json(text), True


def _create(lock: Path, holder: LockHolder) -> bool:
    """Create the lock with ``holder`` in it, whole or not at all; False if a lock is already
    there."""
    try:
        atomic_write(lock, holder.to_json().encode("utf-8"), keep_backup=False, create_only=True)
    except FileExistsError:
        return False
    return True


def _age_s(path: Path) -> float | None:
    try:
        return time.time() - path.stat().st_mtime
    except OSError:
        return None


def _clear_stale(lock: Path, seen: LockHolder) -> bool:
    """Remove ``lock`` if it still holds ``seen`` (a dead holder). Guarded so only one opener
    clears it. True when it was removed (or was already gone)."""
    guard = lock.with_name(lock.name + BREAK_SUFFIX)
    try:
        fd = os.open(guard, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o644)
    except FileExistsError:
        age = _age_s(guard)
        if age is not None and age > BREAK_STALE_AFTER_S:
            try:
                os.unlink(guard)
            except OSError:
                pass
        return False
    os.close(fd)
    try:
        now, exists = _read_holder(lock)
        if not exists:
            return True
        if now != seen:
            return False
        os.unlink(lock)
        return True
    finally:
        try:
            os.unlink(guard)
        except OSError:
            pass


def lock_holder(path: str | os.PathLike) -> LockHolder | None:
    """Who holds the walk now; None when nobody does or the holder is gone."""
    holder, exists = _read_holder(lock_path(path))
    if not exists or holder is None:
        return None
    return holder if holder.is_alive() else None


def acquire_lock(path: str | os.PathLike, tool: str = "gaugewalk", *, attempts: int = 20) -> WalkLock:
    """Take the walk at ``path`` for writing. Raises ``WalkLocked`` when another live process holds
    it, ``LockError`` when the lock cannot be written (the message names the folder)."""
    path = Path(path)
    lock = lock_path(path)
    me = LockHolder.me(tool)
    stale: LockHolder | None = None
    for _ in range(attempts):
        try:
            if _create(lock, me):
                return WalkLock(path, me, stale)
        except FileNotFoundError:
            raise LockError(f"{path}: the folder {path.parent} does not exist") from None
        except OSError as exc:
            raise LockError(f"{path}: cannot make the lock file {lock.name} in "
                            f"{path.parent}: {exc.strerror or exc}") from None
        holder, exists = _read_holder(lock)
        if not exists:
            continue  # released between our try and our look: try again
        if holder is None:
            age = _age_s(lock)
            if age is not None and age < UNREADABLE_GRACE_S:
                raise WalkLocked(path, None)
            holder = LockHolder("unknown", socket.gethostname(), -1, "an unknown time", "unreadable lock")
            if _clear_unreadable(lock):
                stale = holder
            continue
        if holder.is_alive():
            raise WalkLocked(path, holder)
        if _clear_stale(lock, holder):
            stale = holder
        else:
            time.sleep(0.01)
    holder, _ = _read_holder(lock)
    raise WalkLocked(path, holder)


def _clear_unreadable(lock: Path) -> bool:
    """Remove a lock file that has held junk for longer than the grace time."""
    guard = lock.with_name(lock.name + BREAK_SUFFIX)
    try:
        fd = os.open(guard, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o644)
    except FileExistsError:
        return False
    os.close(fd)
    try:
        holder, exists = _read_holder(lock)
        age = _age_s(lock)
        if exists and holder is None and age is not None and age >= UNREADABLE_GRACE_S:
            os.unlink(lock)
            return True
        return not exists
    finally:
        try:
            os.unlink(guard)
        except OSError:
            pass
