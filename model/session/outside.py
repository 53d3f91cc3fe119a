"""When the walk open in the app changed on disk (a hand edit, a sync tool, another program):
take that change in without losing what was typed here, and keep what cannot be saved.

The walk as this session last read or saved it is the common base: the walk on disk now
("theirs") and the walk here ("mine") are merged run by run against it
(``gaugewalk.model.walk.merge``), so runs added there and runs stored here are both kept, and a
change made on one side only is taken. Nothing is written over a file gaugewalk cannot read (a
broken hand edit stays as it is), and whatever cannot be saved is written whole to a file of its
own beside the walk (or, when that folder cannot be written, in gaugewalk's state folder), which
``gaugewalk merge`` joins back.

Public API:

- ``read_theirs(path) -> Theirs``: the walk on disk now, with its fingerprint, or why it cannot
  be read (``job`` None, ``fingerprint`` None when there is no file).
- ``merge_outside(base, theirs, mine, prefer) -> MergeResult``.
- ``unsaved_path(walk, started) -> Path`` and ``keep_unsaved(job, walk, started) -> Path | None``:
  where the walk that could not be saved is kept, and writing it there.
- ``kept_beside(walk) -> list[Path]``: such files left by earlier sessions.
"""

from __future__ import annotations

import glob
import os
from dataclasses import dataclass
from datetime import datetime
from pathlib import Path

from gaugewalk.model.walk.job import Job
from gaugewalk.model.walk.merge import MergeResult, Side, merge_jobs
from gaugewalk.model.walkfile.atomic import atomic_write
from gaugewalk.model.walkfile.fingerprint import Fingerprint
from gaugewalk.model.walkfile.read import WalkFileError, loads_walk

UNSAVED_TAG = ".unsaved-"
"""``shop.toml`` that could not be saved is kept as ``shop.unsaved-20260304-0915.toml``."""


@dataclass(frozen=True)
class Theirs:
    """The walk on disk now: ``job`` (None when it cannot be read, ``problem`` says why) and the
    ``fingerprint`` of what was read (None: there is no file)."""

    job: Job | None
    fingerprint: Fingerprint | None
    problem: str | None = None


def read_theirs(path: str | os.PathLike) -> Theirs:
    """Read the walk on disk as it is now, noting exactly the bytes that were read."""
    try:
        with open(path, "rb") as handle:
            data = handle.read()
            mtime = os.fstat(handle.fileno()).st_mtime_ns
    except FileNotFoundError:
        return Theirs(None, None, "it was deleted")
    except OSError as exc:
        return Theirs(None, None, f"it cannot be read: {exc.strerror or exc}")
    fingerprint = Fingerprint.of(data, mtime)
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError:
        return Theirs(None, fingerprint, "it is no longer UTF-8 text")
    try:
        return Theirs(loads_walk(text.removeprefix("\ufeff"), path), fingerprint)
    except WalkFileError as exc:
        first = exc.problems[0] if exc.problems else None
        return Theirs(None, fingerprint, f"it is no longer a valid walk ({first})")


def merge_outside(base: Job, theirs: Job, mine: Job, prefer: Side | None) -> MergeResult:
    """Theirs (A) and mine (B) merged against ``base``; runs new on both sides with one id are
    both kept, mine renumbered; ``prefer="b"`` keeps mine where both changed one thing."""
    return merge_jobs(theirs, mine, prefer=prefer, base=base)


def unsaved_path(walk: str | os.PathLike, started: datetime, folder: Path | None = None) -> Path:
    """``shop.unsaved-20260304-0915.toml`` beside ``shop.toml`` (or in ``folder``)."""
    p = Path(walk)
    name = f"{p.stem}{UNSAVED_TAG}{started:%Y%m%d-%H%M%S}{p.suffix or '.toml'}"
    return (folder if folder is not None else p.parent) / name


def state_folder() -> Path:
    """gaugewalk's own folder for what it keeps (``$XDG_STATE_HOME/gaugewalk/unsaved``)."""
    home = os.environ.get("XDG_STATE_HOME") or os.path.join(os.path.expanduser("~"), ".local",
                                                           "state")
    return Path(home) / "gaugewalk" / "unsaved"


def keep_unsaved(job: Job, walk: str | os.PathLike, started: datetime) -> Path | None:
    """Write ``job`` whole to its own file beside the walk, or in ``state_folder()`` when that
    cannot be written; the path, or None when neither could be written."""
    from gaugewalk.model.walkfile.write import dumps_walk

    data = dumps_walk(job).encode("utf-8")
    for folder in (None, state_folder()):
        target = unsaved_path(walk, started, folder)
        try:
            target.parent.mkdir(parents=True, exist_ok=True)
            atomic_write(target, data, keep_backup=False)
        except OSError:
            continue
        return target
    return None


def kept_beside(walk: str | os.PathLike) -> list[Path]:
    """Walks kept by earlier sessions that could not save to ``walk``, oldest first."""
    p = Path(walk)
    try:
        return sorted(p.parent.glob(f"{glob.escape(p.stem)}{UNSAVED_TAG}*{p.suffix}"))
    except OSError:
        return []
