"""A head start on sizing the walk the app opens: a child process that reads, checks and sizes
it while the app itself starts, and hands back the run sheet's rows.

Opening a walk, the app's own start (Textual, the walk screen with the runs as written) and the
model's (pydantic, reading, checking and sizing the walk) take about as long each, and on one
interpreter they run one after the other. Forked at the very start of the process, before
Textual is imported and while the process has one thread, the child does the model's part on
another processor (at a lower priority: it never holds up the app's own start), from the same
bytes of the file the app shows as written, and sends the rows back through a pipe: first those
of the first runs (the rows on screen), then the rest. The app still reads, checks and sizes the
walk itself, for editing, and keeps the child's rows only where they equal its own
(``WalkScreen.attach``); a child that fails, is killed or cannot be started leaves the app
opening as it does without one.

Only the standard library at the top: the process imports this before anything else.
"""

from __future__ import annotations

import contextlib
import gc
import os
import pickle
import signal
import struct
import threading
from collections.abc import Iterator
from pathlib import Path
from typing import TYPE_CHECKING

if TYPE_CHECKING:
    from gaugewalk.tui.app.sheet.shape import SheetRow

FIRST_ROWS = 200
"""Rows sent before the others: the first runs, which the sheet shows first (more than the
lines of a tall terminal) [rows]."""

MAX_BYTES = 20 * 1024 * 1024
"""Largest file given a head start (the walk reader's own limit, ``MAX_WALK_BYTES``) [bytes]."""

CHILD_NICENESS = 10
"""How much lower the child's priority is than the app's: on a busy machine the app's own start
(its first paint) comes first, and the child takes what processor time is left [nice]."""

_SIZE = struct.Struct("<Q")   # each message: its length [bytes], then the pickled rows
_IMPORTED = _SIZE.pack(0)     # an empty message: the child has imported the model


class HeadStart:
    """The child sizing the walk at ``path`` from ``raw`` (the file's bytes, read once): its
    rows come from ``parts`` (in the parent, once)."""

    def __init__(self, path: str, raw: bytes, pid: int, fd: int) -> None:
        self.path = path
        self.raw = raw
        self._pid = pid
        self._fd = fd
        self._lock = threading.Lock()
        self._reaped = False
        self._imported = threading.Event()

    @classmethod
    def begin(cls, path: str | None) -> HeadStart | None:
        """Read the walk at ``path`` and fork the child that sizes it; None where there is no
        file to read, it is too big, the process already has threads (a fork would copy their
        locks mid-use), or the system cannot fork: the app then opens as without one."""
        if path is None or not hasattr(os, "fork") or threading.active_count() > 1:
            return None
        try:
            with open(Path(path).expanduser(), "rb") as handle:
                raw = handle.read(MAX_BYTES + 1)
        except OSError:
            return None   # the app says what is wrong with the path
        if len(raw) > MAX_BYTES:
            return None
        try:
            read_fd, write_fd = os.pipe()
        except OSError:
            return None
        try:
            pid = os.fork()
        except OSError:
            os.close(read_fd)
            os.close(write_fd)
            return None
        if pid == 0:   # the child: never returns
            os.close(read_fd)
            _child(write_fd, path, raw)
        os.close(write_fd)
        return cls(path, raw, pid, read_fd)

    def text(self) -> str | None:
        """The file's text as read (a byte-order mark left out), or None if it is not UTF-8."""
        try:
            return self.raw.decode("utf-8-sig")
        except UnicodeDecodeError:
            return None

    def parts(self) -> Iterator[list[SheetRow]]:
        """The rows as the child sends them: those of the first ``FIRST_ROWS`` runs, then the
        others, in the walk's order; nothing more when the child failed (a walk the reader
        refuses, anything else) or was stopped. Blocks while it waits: for a thread."""
        try:
            with os.fdopen(self._fd, "rb") as pipe:
                while True:
                    head = pipe.read(_SIZE.size)
                    if len(head) < _SIZE.size:
                        return
                    (size,) = _SIZE.unpack(head)
                    if size == 0:
                        self._imported.set()
                        continue
                    body = pipe.read(size)
                    if len(body) < size:
                        return
                    yield pickle.loads(body)  # our own child's rows, through our own pipe
        except (OSError, ValueError, EOFError, pickle.UnpicklingError):
            return
        finally:
            self._reap(wait=True)

    def keeping_pace(self, wait: float = 0.0) -> bool:
        """The child has imported the model (pydantic, the walk's models), or does within
        ``wait`` [s]: asked at the app's first paint, which comes about as long after the start
        as that import when a processor is free for the child; on a machine too busy for it,
        the child is far behind."""
        return self._imported.wait(wait)

    def stop(self) -> None:
        """The child ended if it still runs (the app is leaving): its rows are not wanted."""
        self._reap(wait=False)

    def _reap(self, wait: bool) -> None:
        with self._lock:   # the pid is ours until reaped: never a signal to another process
            if self._reaped:
                return
            if not wait:
                try:
                    os.kill(self._pid, signal.SIGKILL)
                except OSError:
                    pass
            try:
                os.waitpid(self._pid, 0)
            except ChildProcessError:
                pass
            self._reaped = True


def sized_rows(raw: bytes, path: str) -> Iterator[list[SheetRow]]:
    """The sheet's rows of the walk in ``raw`` (its file's bytes; ``path`` names it in
    messages) read, checked and sized as the app's own opening does (``WalkSession``,
    ``sheet.rows.all_rows``): those of the first ``FIRST_ROWS`` runs, then the rest. Raises
    what the reader raises for a walk it refuses."""
    _import_model()
    from gaugewalk.model.session.hold import WalkHold
    from gaugewalk.model.session.session import WalkSession
    from gaugewalk.model.walkfile.read import loads_walk
    from gaugewalk.tui.app.sheet.rows import sheet_row, source_kinds

    job = loads_walk(raw.decode("utf-8"), path)
    session = WalkSession(Path(path), job, compute=True, hold=WalkHold(path, "gaugewalk app"))
    sources = source_kinds(session)
    runs = job.runs
    yield [sheet_row(session, run, sources) for run in runs[:FIRST_ROWS]]
    yield [sheet_row(session, run, sources) for run in runs[FIRST_ROWS:]]


def _import_model() -> None:
    """What ``sized_rows`` imports: the model (most of the child's time on a small walk)."""
    import gaugewalk.model.session.session  # noqa: F401
    import gaugewalk.model.walkfile.read  # noqa: F401
    import gaugewalk.tui.app.sheet.rows  # noqa: F401


def _child(fd: int, path: str, raw: bytes) -> None:
    """The child's whole life: the rows written to ``fd``, then out at once (no cleanup of the
    parent's copied state, no output: the parent says everything)."""
    code = 1
    try:
        signal.signal(signal.SIGINT, signal.SIG_DFL)
        quiet = os.open(os.devnull, os.O_RDWR)   # the terminal is the app's: nothing of ours
        for std in (0, 1, 2):                     # (a library's warning) may reach it
            os.dup2(quiet, std)
        with contextlib.suppress(OSError):
            os.nice(CHILD_NICENESS)
        gc.disable()   # what it builds lives until it ends, a moment later
        with os.fdopen(fd, "wb") as pipe:
            _import_model()
            pipe.write(_IMPORTED)
            pipe.flush()
            for rows in sized_rows(raw, path):
                body = pickle.dumps(rows, protocol=pickle.HIGHEST_PROTOCOL)
                pipe.write(_SIZE.pack(len(body)) + body)
                pipe.flush()
        code = 0
    except BaseException:  # noqa: BLE001  # the parent reads and reports the walk itself
        pass
    finally:
        os._exit(code)
