"""Helpers shared by the walk subcommands (``new``, ``add``, ``check``, ``merge``, ``schema``):
reading a walk for a command, and printing problems one line each on stderr."""

from __future__ import annotations

import functools
import sys

from gaugewalk.model.walk.checks import Problem
from gaugewalk.model.walk.job import Job
from gaugewalk.model.walkfile.store import WalkFileError, load_walk

EXIT_OK = 0
EXIT_LIMITS = 1      # computed, but some run misses its limits (or a merge has conflicts)
EXIT_INVALID = 2     # the file cannot be read or is invalid; nothing was written


def writes_walk(path_arg: str, tool: str):
    """Decorate a command's ``run(args)`` that writes the walk named by ``args.<path_arg>``: take
    the walk's lock first (refused with exit 2 and who holds it when the app or another command
    has it; a stale lock of a dead process is cleared with a note), give the command
    ``args.expected`` (the file's fingerprint before reading, for ``save_walk(expected=...)``), and
    turn a refused or failed save into one line on stderr and exit 2."""
    from gaugewalk.model.walkfile.lock import LockError, WalkLocked, acquire_lock
    from gaugewalk.model.walkfile.store import ChangedOnDisk, WalkFileError, fingerprint

    def wrap(run):
        @functools.wraps(run)
        def locked_run(args) -> int:
            path = getattr(args, path_arg)
            try:
                lock = acquire_lock(path, tool=tool)
            except WalkLocked as exc:
                print(f"{exc.message}; not changed", file=sys.stderr)
                return EXIT_INVALID
            except LockError as exc:
                print(str(exc), file=sys.stderr)
                return EXIT_INVALID
            with lock:
                if lock.message:
                    print(f"note: {lock.message}", file=sys.stderr)
                try:
                    args.expected = fingerprint(path)
                except IsADirectoryError:
                    args.expected = None  # the command itself says it is a folder
                except OSError as exc:
                    print(f"{path}: cannot be read: {exc.strerror or exc}", file=sys.stderr)
                    return EXIT_INVALID
                try:
                    return run(args)
                except ChangedOnDisk as exc:
                    print(str(exc), file=sys.stderr)
                except WalkFileError as exc:
                    print_problems(exc.problems)
                except OSError as exc:
                    print(f"{path}: not saved, the file is as it was: {exc.strerror or exc}",
                          file=sys.stderr)
                return EXIT_INVALID

        return locked_run

    return wrap


def save_checked(job: Job, path: str, expected, refusal: str | None = None) -> bool:
    """Check the walk as it would be written and save it; False, with the problems printed (and
    ``refusal`` after them), if it would not be a valid walk. Nothing is written then, and the
    problems carry no line numbers: they would point into text that is not on disk."""
    from gaugewalk.model.walkfile.store import check_walk_text, dumps_walk, save_walk

    _, problems = check_walk_text(dumps_walk(job), path)
    if problems:
        print_problems([p.__class__(p.file, None, p.where, p.field, p.message) for p in problems])
        if refusal:
            print(refusal, file=sys.stderr)
        return False
    notice = save_walk(job, path, expected=expected)
    if notice is not None:
        print(f"warning: {notice.message}", file=sys.stderr)
    return True


def print_problems(problems: list[Problem] | list[str]) -> None:
    for problem in problems:
        print(str(problem), file=sys.stderr)


def read_job(path: str) -> Job | None:
    """The walk, or None after printing why it cannot be used."""
    try:
        return load_walk(path)
    except WalkFileError as exc:
        print_problems(exc.problems)
        return None
