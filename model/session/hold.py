"""One walk file held for writing: the one path by which a changed walk reaches the disk, for
the app's editing session and for the commands that write (``add``, ``source``, ``merge``).

In order: take the walk's lock (``gaugewalk.model.walkfile.lock``: a second writer is told who
holds it), note what the file holds before reading it (``gaugewalk.model.walkfile.fingerprint``),
read it; then for each change, refuse what would leave the walk unreadable (the cross-checks of
``gaugewalk.model.walk.checks`` that the change adds) and save atomically with a backup
(``gaugewalk.model.walkfile.write.save_walk``), refused when the file changed on disk since it was
read or the walk grew past the limits; then note what the file holds now. Nothing here prints or
shows anything: each face says the outcome in its own words.

Public API:

- ``WalkHold(path, tool)``: ``take_lock()`` (raises ``WalkLocked`` or ``LockError``),
  ``release()``, ``note()``, ``read() -> Job``, ``added_problems(job, before)`` and
  ``refusals(job, before)`` (lists of ``Problem``), ``save(job, written=None) -> SaveNotice |
  None`` (raises ``ChangedOnDisk``, ``WalkFileError`` or ``OSError``; nothing is written then).
"""

from __future__ import annotations

import os

from gaugewalk.model.walk.checks import check_references
from gaugewalk.model.walk.job import Job
from gaugewalk.model.walk.problems import Locator, Problem
from gaugewalk.model.walkfile.atomic import real_path
from gaugewalk.model.walkfile.fingerprint import Fingerprint, fingerprint
from gaugewalk.model.walkfile.lock import WalkLock, acquire_lock
from gaugewalk.model.walkfile.read import loads_walk, read_walk_text
from gaugewalk.model.walkfile.write import SaveNotice, Written, dumps_walk, save_walk


def _key(problem: Problem) -> tuple:
    return problem.about, problem.id, problem.number, problem.message


class WalkHold:
    """A walk file held for writing by ``tool`` (named in its lock)."""

    def __init__(self, path: str | os.PathLike, tool: str = "gaugewalk") -> None:
        self.file = os.fspath(path)   # as given, for messages
        # resolved once: through a symbolic link the walk is the file it names, and its lock,
        # draft and backup are beside that file (another name for it finds the same lock)
        self.path = real_path(path)
        self.tool = tool
        self.lock: WalkLock | None = None
        self.fingerprint: Fingerprint | None = None   # what the file held when it was read
        self.saved = False                             # a save reached the disk

    # -- who holds it -------------------------------------------------------------------------
    def take_lock(self) -> WalkLock:
        """Hold the walk; raises ``WalkLocked`` (another live process holds it) or
        ``LockError`` (the lock file cannot be made). ``lock.message`` says when a stale lock
        was cleared."""
        self.lock = acquire_lock(self.path, self.tool)
        return self.lock

    def release(self) -> str | None:
        """Let the walk go; returns why its lock could not be removed, if it could not."""
        lock, self.lock = self.lock, None
        return lock.release() if lock is not None else None

    def _hold_again(self) -> None:
        """A lock deleted by hand (or by a sync tool) while the walk is held is taken again
        before the next save, so another writer is stopped as before; if someone holds it by
        now, the save goes on guarded by the fingerprint (a change on disk is never written
        over)."""
        from gaugewalk.model.walkfile.lock import LockError, WalkLocked

        lock = self.lock
        if lock is None or lock.still_mine():
            return
        try:
            self.lock = acquire_lock(self.path, self.tool)
        except (WalkLocked, LockError):
            return

    def __enter__(self) -> "WalkHold":
        return self

    def __exit__(self, *exc) -> None:
        self.release()

    # -- reading --------------------------------------------------------------------------------
    def note(self) -> None:
        """Note what the file holds now, before it is read: a save in between is then caught.
        Raises ``OSError`` when it cannot be read (no file: nothing to protect)."""
        self.fingerprint = fingerprint(self.path)

    def read(self) -> Job:
        """Note the file, then read and check it; raises ``WalkFileError``."""
        self.note()
        return loads_walk(read_walk_text(self.path), self.file)

    # -- changing -------------------------------------------------------------------------------
    def added_problems(self, job: Job, before: Job | None = None) -> list[Problem]:
        """The cross-check problems of ``job`` that ``before`` (the walk before the change; None:
        nothing to compare with) did not have, in the order the checks find them, without
        lines. ``before`` is checked only when ``job`` has a problem: a walk that opened has
        none, so the usual change costs one check."""
        found = check_references(job, Locator(""), self.file)
        if not found or before is None:
            return found
        known = {_key(p) for p in check_references(before, Locator(""), self.file)}
        return [p for p in found if _key(p) not in known]

    def refusals(self, job: Job, before: Job | None = None) -> list[Problem]:
        """Why the walk cannot be written as it is: ``added_problems``, in the order they would
        stand in the written file, with no line numbers: that text is not on disk."""
        new = {_key(p) for p in self.added_problems(job, before)}
        if not new:
            return []
        # the same checks against the text as it would be written, for its order (rare path)
        found = check_references(job, Locator(""), self.file)
        placed = check_references(job, Locator(dumps_walk(job)), self.file)
        out = [p for p, q in zip(placed, found, strict=True) if _key(q) in new]
        out.sort(key=lambda p: (p.line is None, p.line or 0))
        return [p._replace(line=None) for p in out]

    def save(self, job: Job, *, allow_comment_loss: bool = True,
             written: Written | None = None) -> SaveNotice | None:
        """Write the walk (atomic, with a backup), refused with ``ChangedOnDisk`` when the file
        no longer holds what was read, ``WalkFileError`` past the limits; then note the file
        again. Returns the notice that comments were dropped, if they were. ``written``: as
        for ``gaugewalk.model.walkfile.write.dumps_walk``."""
        self._hold_again()
        notice = save_walk(job, self.path, allow_comment_loss=allow_comment_loss,
                           expected=self.fingerprint, written=written)
        self.saved = True
        self.fingerprint = fingerprint(self.path)
        return notice
