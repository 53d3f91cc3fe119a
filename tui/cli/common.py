"""Helpers shared by the walk subcommands (``new``, ``add``, ``check``, ``merge``, ``schema``):
reading a walk for a command, holding and committing a walk it writes, and printing problems one
line each on stderr."""

from __future__ import annotations

import functools
import sys

from gaugewalk.model.walk.job import Job
from gaugewalk.model.walk.problems import Problem
from gaugewalk.model.walkfile.read import WalkFileError, load_walk

EXIT_OK = 0
EXIT_LIMITS = 1      # computed, but some run misses its limits (or a merge has conflicts)
EXIT_INVALID = 2     # the file cannot be read or is invalid; nothing was written


def writes_walk(path_arg: str, tool: str):
    """Decorate a command's ``run(args)`` that writes the walk named by ``args.<path_arg>``: hold
    the walk for writing first (``gaugewalk.model.session.hold.WalkHold``, the path the app's
    saves take too: refused with exit 2 and who holds it when the app or another command has it;
    a stale lock of a dead process is cleared with a note), note what the file holds before the
    command reads it, give the command ``args.hold`` for ``commit``, and turn a refused or failed
    save into one line on stderr and exit 2. Output closed by its reader (``| head``) after the
    save is no failure: the change is on disk (``main`` ends such a command with exit 0)."""
    from gaugewalk.model.session.hold import WalkHold
    from gaugewalk.model.walkfile.fingerprint import ChangedOnDisk
    from gaugewalk.model.walkfile.lock import LockError, WalkLocked
    from gaugewalk.model.walkfile.read import WalkFileError

    def wrap(run):
        @functools.wraps(run)
        def locked_run(args) -> int:
            path = getattr(args, path_arg)
            hold = WalkHold(path, tool)
            try:
                lock = hold.take_lock()
            except WalkLocked as exc:
                print(f"{exc.message}; not changed", file=sys.stderr)
                return EXIT_INVALID
            except LockError as exc:
                print(str(exc), file=sys.stderr)
                return EXIT_INVALID
            with hold:
                if lock.message:
                    print(f"note: {lock.message}", file=sys.stderr)
                try:
                    hold.note()
                except IsADirectoryError:
                    pass  # the command itself says it is a folder
                except OSError as exc:
                    print(f"{path}: cannot be read: {exc.strerror or exc}", file=sys.stderr)
                    return EXIT_INVALID
                args.hold = hold
                try:
                    return run(args)
                except ChangedOnDisk as exc:
                    print(str(exc), file=sys.stderr)
                except WalkFileError as exc:
                    print_problems(exc.problems)
                except BrokenPipeError:
                    if hold.saved:  # the reader of the output stopped early (``| head``)
                        raise       # after the change was saved: not an error (``main``)
                    print(f"{path}: not saved, the file is as it was: the output was closed "
                          "before the walk was saved", file=sys.stderr)
                except OSError as exc:
                    print(f"{path}: not saved, the file is as it was: {exc.strerror or exc}",
                          file=sys.stderr)
                return EXIT_INVALID

        return locked_run

    return wrap


def commit(hold, job: Job, refusal: str | None = None) -> bool:
    """Save the walk through ``hold`` (``writes_walk``'s); False, with the problems printed (and
    ``refusal`` after them), if it would not be a valid walk. Nothing is written then, and the
    problems carry no line numbers: they would point into text that is not on disk."""
    problems = hold.refusals(job)
    if not problems:
        try:
            notice = hold.save(job)
        except WalkFileError as exc:  # past the limits
            problems = exc.problems
    if problems:
        print_problems(problems)
        if refusal:
            print(refusal, file=sys.stderr)
        return False
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
