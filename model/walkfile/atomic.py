"""The one atomic writer: every file gaugewalk writes (the walk, its backup, the lock, the run
card draft, a new walk, a report, the list of recent walks) reaches the disk through
``atomic_write``, so a crash at any moment leaves the old file or the new one, whole.

Public API:

- ``atomic_write(path, data, *, keep_backup=True, create_only=False)``: a temporary file in the
  same folder, flushed and fsynced, then put in place (``os.replace``, or a hard link with
  ``create_only``), then the folder fsynced.
- ``backup_path(path)``: where the previous version is kept (``walk.toml~``); ``BACKUP_SUFFIX``.
- ``LEFTOVER_AGE_S``: a temporary older than this was left by a write that was killed, and the
  next write beside it removes it.

POSIX ``rename(2)`` replaces the target atomically and ``link(2)`` fails if the target exists;
an fsync of the file before the rename and of the folder after it makes the new name durable.
"""

from __future__ import annotations

import glob
import os
import tempfile
import time
from pathlib import Path

BACKUP_SUFFIX = "~"
"""The previous version of ``walk.toml`` is kept beside it as ``walk.toml~``."""

LEFTOVER_AGE_S = 600.0
"""A temporary file of a write older than this [s] was left by a write that was killed."""


def backup_path(path: str | os.PathLike) -> Path:
    """Where the previous version of a walk file is kept: ``walk.toml~`` beside it."""
    p = Path(path)
    return p.with_name(p.name + BACKUP_SUFFIX)


def atomic_write(path: str | os.PathLike, data: bytes, *, keep_backup: bool = True,
                 create_only: bool = False) -> None:
    """Write ``data`` to ``path`` so that a crash leaves either the old or the new file whole:
    a temporary file in the same folder, flushed and fsynced, then ``os.replace``, then the folder
    fsynced. A replaced file keeps its permissions; a new one gets what the umask allows.

    With ``keep_backup`` the old file becomes ``backup_path(path)`` first. With ``create_only``
    (no backup: there is nothing to keep) the file must not exist yet (``FileExistsError``
    otherwise, even when another process creates it in the meantime: the temporary is
    hard-linked into place, never renamed over; where the file system has no hard links, the
    file is created with ``O_EXCL`` and written in place).
    """
    path = Path(path)
    folder = path.parent if str(path.parent) else Path(".")
    try:
        mode = os.stat(path).st_mode & 0o7777
        existed = True
    except FileNotFoundError:
        umask = os.umask(0)
        os.umask(umask)
        mode = 0o666 & ~umask
        existed = False
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=folder)
    staged = None
    try:
        _write_synced(fd, data)
        os.chmod(tmp, mode)
        if existed and keep_backup and not create_only:
            staged = _temp_beside(path, "bak")
            try:
                os.link(path, staged)
            except OSError:  # no hard links here: copy the bytes
                with open(path, "rb") as src:
                    _write_synced(os.open(staged, os.O_WRONLY | os.O_CREAT, 0o666), src.read())
            os.replace(staged, backup_path(path))
        if create_only:
            _create(tmp, path, data, mode)
            os.unlink(tmp)
        else:
            os.replace(tmp, path)
    except BaseException:
        for leftover in (tmp, staged):
            if leftover:
                try:
                    os.unlink(leftover)
                except OSError:
                    pass
        raise
    _fsync_dir(folder)
    _sweep_leftovers(path)


def _create(tmp: str, path: Path, data: bytes, mode: int) -> None:
    """Put the written temporary at ``path``, which must not exist: a hard link, or where links
    are not allowed, ``O_EXCL`` and the bytes written again."""
    try:
        os.link(tmp, path)
        return
    except FileExistsError:
        raise
    except OSError:
        pass  # no hard links on this file system
    _write_synced(os.open(path, os.O_WRONLY | os.O_CREAT | os.O_EXCL, mode), data)


def _write_synced(fd: int, data: bytes) -> None:
    """Write ``data`` to the open file ``fd``, flush it to the disk (fsync) and close it."""
    with os.fdopen(fd, "wb") as handle:
        handle.write(data)
        handle.flush()
        os.fsync(handle.fileno())


def _fsync_dir(folder: Path) -> None:
    try:
        fd = os.open(folder, os.O_RDONLY | getattr(os, "O_DIRECTORY", 0))
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        pass
    finally:
        os.close(fd)


def _temp_beside(path: Path, tag: str) -> str:
    fd, name = tempfile.mkstemp(prefix=f".{path.name}.", suffix=f".{tag}", dir=path.parent)
    os.close(fd)
    os.unlink(name)
    return name


def _sweep_leftovers(path: Path) -> None:
    """Remove the hidden temporaries (``.NAME.XXXX.tmp``/``.bak``) that killed writes left beside
    the file; young ones may belong to a write under way and are kept."""
    now = time.time()
    for leftover in path.parent.glob(f".{glob.escape(path.name)}.*"):
        if leftover.suffix not in (".tmp", ".bak"):
            continue
        try:
            if now - leftover.stat().st_mtime > LEFTOVER_AGE_S:
                leftover.unlink()
        except OSError:
            pass
