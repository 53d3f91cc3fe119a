"""Who has a walk open for writing: a lock file beside the walk.

``walk.toml`` is held through ``.walk.toml.lock`` in the same folder, a small JSON file naming the
holder (user, host, process id, since when, which tool). It is created by the one atomic writer
(``gaugewalk.model.walkfile.atomic``, ``create_only``): the JSON is written to a temporary file
first and hard-linked to the lock name, which fails if a lock is already there (``O_CREAT |
O_EXCL`` is the fallback where links are not allowed), so a lock on disk is always whole. A
second opener is told who holds it; the app then opens read-only and the writing commands
refuse.

Every state a lock can be found in, and what becomes of it (``LockState``, ``inspect_lock``):

- *held*: a live process on this computer holds it: honoured, and the opener is told who.
- *elsewhere*: it names another computer, which cannot be checked from here: honoured; the
  message says to clear it with ``gaugewalk unlock WALK --force`` once that gaugewalk is closed.
- *dead* (its process is gone) and *reused* (its process id now belongs to a process that
  started after the lock was written: the process start time in ``/proc`` tells): stale, cleared
  with a message.
- *junk* (a file that holds no lock): treated as held for ``UNREADABLE_GRACE_S`` (a lock being
  written by the ``O_EXCL`` fallback), then cleared with a message.
- *broken*: a symbolic link (gaugewalk never makes one; one that leads nowhere can never be
  replaced), a folder, or a file that cannot be read: gaugewalk cannot tell who holds the walk,
  so it refuses, saying what the lock is and how to clear it (``gaugewalk unlock WALK``; the
  app's key does the same).

Breaking a stale lock is itself guarded by a short-lived ``.walk.toml.lock.break`` file, so two
openers cannot both clear it and remove each other's fresh lock.

Public API:

- ``acquire_lock(path, tool="gaugewalk") -> WalkLock``: raises ``WalkLocked`` (its ``holder`` is a
  ``LockHolder`` or None, its ``state`` a ``LockState``) when the walk cannot be taken.
  ``WalkLock.stale`` is the holder of a stale lock that was cleared (None if there was none) and
  ``WalkLock.message`` says so. ``WalkLock.release()`` (or ``with acquire_lock(...)``) removes
  the lock if it is still ours; ``still_mine()``.
- ``inspect_lock(path) -> LockState``: the state of the walk's lock now, in words
  (``describe()``) with how to clear it (``remedy``).
- ``break_lock(path, force=False) -> LockState``: remove a stale or broken lock (and, with
  ``force``, one from another computer); raises ``WalkLocked`` for a lock a live process holds.
- ``lock_holder(path) -> LockHolder | None``: who holds it now (None: nobody, or a stale lock).
- ``lock_path(path)``; ``LockHolder`` with ``user, host, pid, since, tool``, ``describe()`` and
  ``gone()`` (why its process no longer holds anything, or None).
- ``UNLOCK_COMMAND``: the command that clears a lock, as the messages give it.
"""

from __future__ import annotations

import getpass
import json
import os
import socket
import stat
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

    def gone(self) -> str | None:
        """Why this holder no longer holds anything (on this host: its process has ended, or its
        process id now belongs to a process that started after the lock was written), or None
        when it may still hold it (alive, or on another host)."""
        if not self.on_this_host():
            return None
        if not _pid_alive(self.pid):
            return "which is no longer running"
        started = _process_start(self.pid)
        since = _timestamp(self.since)
        if started is not None and since is not None and started > since + START_SLACK_S:
            when = datetime.fromtimestamp(started).strftime("%Y-%m-%d %H:%M")
            return (f"which is no longer running (process {self.pid} is now another program, "
                    f"started {when}, after the lock was written)")
        return None

    def is_alive(self) -> bool:
        """False only when the holder is on this host and its process is gone."""
        return self.gone() is None


START_SLACK_S = 2.0
"""A process that started more than this [s] after its lock was written cannot have written it:
its process id was reused (the lock's time has whole seconds; /proc's boot time too)."""


def _timestamp(text: str) -> float | None:
    """An ISO 8601 time as seconds since the epoch, or None."""
    try:
        stamp = datetime.fromisoformat(text)
    except (TypeError, ValueError):
        return None
    if stamp.tzinfo is None:
        stamp = stamp.replace(tzinfo=timezone.utc)
    return stamp.timestamp()


def _process_start(pid: int) -> float | None:
    """When process ``pid`` started [s since the epoch], from Linux's /proc (the 22nd field of
    /proc/PID/stat, in clock ticks after boot, and the boot time in /proc/stat); None where
    there is no /proc."""
    try:
        with open(f"/proc/{pid}/stat", "rb") as handle:
            fields = handle.read().rsplit(b")", 1)[-1].split()
        ticks = int(fields[19])
        with open("/proc/stat", "rb") as handle:
            boot = next(int(line.split()[1]) for line in handle if line.startswith(b"btime "))
        return boot + ticks / os.sysconf("SC_CLK_TCK")
    except (OSError, ValueError, IndexError, StopIteration):
        return None


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


UNLOCK_COMMAND = "gaugewalk unlock"


class WalkLocked(Exception):
    """The walk cannot be taken: another live process holds it, or its lock is broken (``state``
    says which)."""

    def __init__(self, path: Path, holder: LockHolder | None,
                 state: LockState | None = None) -> None:
        self.path = Path(path)
        self.holder = holder
        self.state = state
        super().__init__(self.message)

    @property
    def message(self) -> str:
        where = shown(str(self.path))
        if self.state is not None and self.state.kind in BROKEN:
            return f"{where}: {self.state.describe()}; {self.state.remedy}"
        if self.holder is None:
            lock = lock_path(self.path)
            return (f"{where}: is being opened by another gaugewalk right now "
                    f"(lock file {shown(lock.name)} is being written); try again in a moment")
        extra = ""
        if not self.holder.on_this_host():
            extra = (f"; it cannot be checked from this computer: once that gaugewalk is closed, "
                     f"clear it with: {UNLOCK_COMMAND} --force {where}")
        return f"{where}: open in {self.holder.describe()}{extra}"


class LockError(OSError):
    """The lock file cannot be made (folder not writable, ...)."""


@dataclass
class WalkLock:
    """A held lock. Release it with ``release()`` or by leaving a ``with`` block."""

    path: Path
    holder: LockHolder
    stale: LockHolder | None = None
    why: str = "which is no longer running"   # why the stale lock was stale
    _released: bool = False

    @property
    def lock_file(self) -> Path:
        return lock_path(self.path)

    @property
    def message(self) -> str | None:
        """Said once when a stale lock was cleared, else None."""
        if self.stale is None:
            return None
        return (f"{shown(self.path.name)} was left locked by {self.stale.describe()}, "
                f"{self.why}; the lock was cleared")

    def still_mine(self) -> bool:
        return _read_holder(self.lock_file)[0] == self.holder

    def release(self) -> str | None:
        """Remove the lock if it is still ours. Returns None, or why it could not be removed (a
        folder turned read-only): it then names a process that is ending, and the next opener
        clears it as stale. Never raises."""
        if self._released:
            return None
        self._released = True
        try:
            if self.still_mine():
                os.unlink(self.lock_file)
        except FileNotFoundError:
            pass
        except OSError as exc:
            return (f"the lock {shown(self.lock_file.name)} could not be removed "
                    f"({exc.strerror or exc}); it names this process, which is ending, so the "
                    "next opener clears it")
        return None

    def __enter__(self) -> "WalkLock":
        return self

    def __exit__(self, *exc) -> None:
        self.release()


def _read_holder(lock: Path) -> tuple[LockHolder | None, bool]:
    """(holder, exists). A lock that exists but cannot be read gives (None, True)."""
    try:
        text = lock.read_text(encoding="utf-8", errors="replace")
    except FileNotFoundError:
        return None, os.path.lexists(lock)
    except OSError:
        return None, True
    return LockHolder.from_json(text), True


BROKEN = ("symlink", "folder", "unreadable")
"""Lock states gaugewalk cannot read a holder from, and never clears on its own."""


@dataclass(frozen=True)
class LockState:
    """What is at a walk's lock path now. ``kind``: ``none``, ``held`` (a live process on this
    computer), ``elsewhere`` (another computer), ``dead`` or ``reused`` (stale), ``junk`` (a
    file holding no lock), or a broken lock: ``symlink``, ``folder``, ``unreadable``."""

    path: Path                      # the walk
    kind: str
    holder: LockHolder | None = None
    why: str = ""                   # for a stale lock: why its holder is gone
    detail: str = ""                # for a broken one: what the system said

    @property
    def lock(self) -> Path:
        return lock_path(self.path)

    def describe(self) -> str:
        """What the lock is, in a sentence a foreman reads."""
        name = shown(self.lock.name)
        holder = self.holder.describe() if self.holder is not None else ""
        return {
            "none": f"{name}: no lock; nobody has the walk open for writing",
            "held": f"open in {holder}",
            "elsewhere": f"open in {holder}, on another computer (it cannot be checked from here)",
            "dead": f"left locked by {holder}, {self.why}",
            "reused": f"left locked by {holder}, {self.why}",
            "junk": f"its lock file {name} holds no lock (a gaugewalk stopped while writing it?)",
            "symlink": f"its lock {name} is a symbolic link, which gaugewalk never makes "
                       f"(leading to {shown(self.detail)})",
            "folder": f"its lock {name} is a folder, not a lock file",
            "unreadable": f"its lock {name} cannot be read ({shown(self.detail)}), so who "
                          "holds the walk cannot be told",
        }[self.kind]

    @property
    def remedy(self) -> str:
        """How to clear it, or "" when there is nothing to clear by hand."""
        walk = shown(str(self.path))
        if self.kind in BROKEN:
            return (f"if no gaugewalk has the walk open, clear it with: {UNLOCK_COMMAND} {walk} "
                    "(or the app's key ctrl+u)")
        if self.kind == "elsewhere":
            return f"once that gaugewalk is closed, clear it with: {UNLOCK_COMMAND} --force {walk}"
        if self.kind in ("dead", "reused", "junk"):
            return f"the next opener clears it, or: {UNLOCK_COMMAND} {walk}"
        return ""


def inspect_lock(path: str | os.PathLike) -> LockState:
    """The state of the walk's lock now (``LockState``)."""
    path = Path(path)
    lock = lock_path(path)
    try:
        info = os.lstat(lock)
    except FileNotFoundError:
        return LockState(path, "none")
    except OSError as exc:
        return LockState(path, "unreadable", detail=exc.strerror or str(exc))
    if stat.S_ISLNK(info.st_mode):
        try:
            target = os.readlink(lock)
        except OSError:
            target = "?"
        return LockState(path, "symlink", detail=target)
    if stat.S_ISDIR(info.st_mode):
        return LockState(path, "folder")
    if not stat.S_ISREG(info.st_mode):  # a pipe would make the read below wait for ever
        return LockState(path, "unreadable", detail="it is a device, pipe or socket, not a file")
    try:
        text = lock.read_text(encoding="utf-8", errors="replace")
    except FileNotFoundError:
        return LockState(path, "none")
    except OSError as exc:
        return LockState(path, "unreadable", detail=exc.strerror or str(exc))
    holder = LockHolder.from_json(text)
    if holder is None:
        return LockState(path, "junk")
    if not holder.on_this_host():
        return LockState(path, "elsewhere", holder)
    why = holder.gone()
    if why is None:
        return LockState(path, "held", holder)
    return LockState(path, "reused" if "another program" in why else "dead", holder, why)


def break_lock(path: str | os.PathLike, *, force: bool = False) -> LockState:
    """Remove the walk's lock when it is stale or broken (with ``force``, also one from another
    computer, which cannot be checked); returns the state it was in. Raises ``WalkLocked`` for a
    lock a live process on this computer holds (and, without ``force``, one from another), and
    ``LockError`` when it cannot be removed."""
    state = inspect_lock(path)
    if state.kind == "held" or (state.kind == "elsewhere" and not force):
        raise WalkLocked(Path(path), state.holder, state)
    if state.kind == "none":
        return state
    lock = state.lock
    try:
        if state.kind == "folder":
            os.rmdir(lock)  # only an empty one: a folder with files in it is not ours to delete
        else:
            os.unlink(lock)
    except FileNotFoundError:
        pass
    except OSError as exc:
        raise LockError(f"{shown(str(path))}: cannot remove {shown(lock.name)}: "
                        f"{exc.strerror or exc}") from None
    return state


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
    it or its lock is broken, ``LockError`` when the lock cannot be written (the message names
    the folder)."""
    path = Path(path)
    lock = lock_path(path)
    me = LockHolder.me(tool)
    stale: LockHolder | None = None
    why = ""
    for _ in range(attempts):
        try:
            if _create(lock, me):
                return WalkLock(path, me, stale, why or "which is no longer running")
        except FileNotFoundError:
            raise LockError(f"{shown(str(path))}: the folder {shown(str(path.parent))} does not "
                            "exist") from None
        except FileExistsError:  # a lock that is not a file (a folder, a link to nowhere)
            pass
        except OSError as exc:
            raise LockError(f"{shown(str(path))}: cannot make the lock file {shown(lock.name)} in "
                            f"{shown(str(path.parent))}: {exc.strerror or exc}") from None
        state = inspect_lock(path)
        if state.kind == "none":
            continue  # released between our try and our look: try again
        if state.kind in BROKEN:
            raise WalkLocked(path, None, state)
        if state.kind == "junk":
            age = _age_s(lock)
            if age is not None and age < UNREADABLE_GRACE_S:
                raise WalkLocked(path, None)
            if _clear_unreadable(lock):
                stale = LockHolder("nobody", socket.gethostname(), -1, "an unknown time",
                                   "a lock file holding no lock")
                why = "which held no lock data"
            continue
        holder = state.holder
        assert holder is not None
        if state.kind in ("held", "elsewhere"):
            raise WalkLocked(path, holder, state)
        if _clear_stale(lock, holder):
            stale, why = holder, state.why
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
