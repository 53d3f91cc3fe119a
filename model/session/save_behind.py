"""Saving behind the editing: each change's save handed to one writer thread, in order.

The app stores a run and goes on at once; the walk reaches the disk through this one writer, a
save at a time, in the order the changes were made, while the keys keep coming. A save still
waiting when a newer one is asked for is skipped: each save is of the whole walk, so the newer
holds every change the older did; nothing is lost and no older walk is ever written after a newer
one. What a save does (the atomic write through ``gaugewalk.model.session.hold``) and what it
says (failures included) is the caller's ``write``; it runs in the writer thread.

Public API:

- ``SaveBehind(write, done=None)``: ``write(job)`` saves one walk; ``done()`` is called in the
  writer thread after each save (a face schedules its repaint from it, thread-safely).
- ``ask(job) -> int``: hand over the walk as it is now (a copy no later change touches); returns
  the number of the save.
- ``pending``: True while a save is asked for and not yet written.
- ``wait(timeout=None) -> bool``: block until every save asked for is written (quitting, a save
  asked for by hand); False when ``timeout`` [s] ran out first.
- ``error``: the last exception ``write`` raised, if any (``write`` should catch what it can
  say; the writer goes on with the next save either way).
"""

from __future__ import annotations

import threading
from collections.abc import Callable
from typing import Generic, TypeVar

T = TypeVar("T")


class SaveBehind(Generic[T]):
    """One writer thread for one walk; started by the first ``ask``."""

    def __init__(self, write: Callable[[T], None], done: Callable[[], None] | None = None) -> None:
        self._write = write
        self._done = done
        self._cond = threading.Condition()
        self._next: tuple[int, T] | None = None   # the newest walk not yet taken by the writer
        self._asked = 0      # saves asked for
        self._written = 0    # the newest save written (older ones skipped count as written)
        self._thread: threading.Thread | None = None
        self.error: BaseException | None = None

    def ask(self, job: T) -> int:
        with self._cond:
            self._asked += 1
            self._next = (self._asked, job)
            if self._thread is None:
                # a daemon: the app waits for the writer before it quits (``wait``); a process
                # killed part-way leaves the old file or the new one whole (the atomic writer)
                self._thread = threading.Thread(target=self._run, name="gaugewalk-save",
                                                daemon=True)
                self._thread.start()
            self._cond.notify_all()
            return self._asked

    @property
    def pending(self) -> bool:
        with self._cond:
            return self._written < self._asked

    def wait(self, timeout: float | None = None) -> bool:
        with self._cond:
            return self._cond.wait_for(lambda: self._written >= self._asked, timeout)

    def _run(self) -> None:
        while True:
            with self._cond:
                self._cond.wait_for(lambda: self._next is not None)
                assert self._next is not None
                number, job = self._next
                self._next = None
            try:
                self._write(job)
            except Exception as exc:  # said by ``write`` when it can; the next save still runs
                self.error = exc
            finally:
                with self._cond:
                    self._written = number
                    self._cond.notify_all()
            if self._done is not None:
                self._done()
