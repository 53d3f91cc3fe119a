"""The one atomic writer: every file gaugewalk writes (the walk, its backup, the lock, the run
card draft, a new walk, a report, the list of recent walks) reaches the disk through
``atomic_write``, so a crash at any moment leaves the old file or the new one, whole.

Public API:

- ``atomic_write(path, data, *, keep_backup=True, create_only=False)``: a temporary file in the
  same folder, flushed and fsynced, then put in place (``os.replace``, or a hard link with
  ``create_only``), then the folder fsynced.
- ``real_path(path)``: the file a path names, symbolic links followed (the walk code resolves a
  walk once, when it is opened, and keeps its lock, draft and backup beside the real file).

What a replaced file keeps: a write through a symbolic link lands on the file the link names
(the link stays a link); the file's permissions stay, and its owner and group too (a save made
as root over a colleague's walk leaves it theirs; as another user the group is kept where the
system allows). A file with more than one name (hard links) is written in place, after its
backup is written whole as a copy, so every name sees the new content; a crash during that write
can leave it torn, with the previous version whole in ``NAME~`` (a rename would leave the other
names with the old walk).
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


def real_path(path: str | os.PathLike) -> Path:
    """The file ``path`` names, every symbolic link followed (``os.path.realpath``); a path that
    is not a link comes back as given (a folder reached through a link is the same folder by
    either name, so what is kept beside the file is found by both)."""
    p = Path(path)
    return Path(os.path.realpath(p)) if os.path.islink(p) else p


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
    if not create_only and os.path.islink(path):
        path = real_path(path)  # write the file the link names; the link stays a link
    folder = path.parent if str(path.parent) else Path(".")
    try:
        info = os.stat(path)
        mode = info.st_mode & 0o7777
        existed = True
    except FileNotFoundError:
        info = None
        umask = os.umask(0)
        os.umask(umask)
        mode = 0o666 & ~umask
        existed = False
    if info is not None and info.st_nlink > 1 and not create_only:
        _write_in_place(path, data, info, keep_backup)
        return
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=folder)
    staged = None
    try:
        _write_synced(fd, data)
        os.chmod(tmp, mode)
        if info is not None:
            _keep_owner(tmp, info)
        if existed and keep_backup and not create_only:
            staged = _temp_beside(path, "bak")
            try:
                os.link(path, staged)
            except OSError:  # no hard links here: copy the bytes
                with open(path, "rb") as src:
                    _write_synced(os.open(staged, os.O_WRONLY | os.O_CREAT, mode), src.read())
                if info is not None:
                    _keep_owner(staged, info)
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


def _keep_owner(path: str | Path, old: os.stat_result) -> None:
    """Give ``path`` the owner and group of the file it replaces: as root, both (a save made as
    root over a colleague's walk must leave it theirs); as anyone else, the group where the
    system allows it. Nothing is raised: a new file that keeps our own owner is still whole."""
    try:
        if os.geteuid() == 0:
            if (old.st_uid, old.st_gid) != (0, 0):
                os.chown(path, old.st_uid, old.st_gid)
        elif old.st_gid != os.getegid():
            os.chown(path, -1, old.st_gid)
    except (OSError, AttributeError):  # not allowed here, or no owners on this system
        pass


def _write_in_place(path: Path, data: bytes, info: os.stat_result, keep_backup: bool) -> None:
    """Write a file that has other names (hard links) in place, so they all see the new content:
    the new bytes first whole in a temporary beside it, the previous file copied whole to its
    backup, then the file rewritten and synced, then the temporary removed."""
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=path.parent)
    try:
        _write_synced(fd, data)
        if keep_backup:
            with open(path, "rb") as src:
                old = src.read()
            staged = _temp_beside(path, "bak")
            try:
                _write_synced(os.open(staged, os.O_WRONLY | os.O_CREAT | os.O_EXCL,
                                      info.st_mode & 0o7777), old)
                _keep_owner(staged, info)
                os.replace(staged, backup_path(path))
            except BaseException:
                try:
                    os.unlink(staged)
                except OSError:
                    pass
                raise
        with open(path, "r+b") as handle:
            handle.write(data)
            handle.truncate(len(data))
            handle.flush()
            os.fsync(handle.fileno())
    finally:
        try:
            os.unlink(tmp)
        except OSError:
            pass
    _fsync_dir(path.parent)


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
