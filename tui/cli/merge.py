"""``gaugewalk merge A B -o OUT [--base BASE] [--prefer a|b]``: merge two walks of one job.

Runs, sources and shared raceways are matched by id (``gaugewalk.model.walk.merge`` has the rules).
With the version both walks started from (``--base``, or found in git: see below) a change made on
one side only is taken; without it an item on one side only is kept, and only a dated re-measure
tells which side changed a run. Two new runs that got the same id are both kept, B's renumbered,
and the output says so. A true conflict (both sides changed one thing, each its own way) stops the
merge, all of them listed, unless ``--prefer`` picks a side for them. An existing OUT is kept as
``OUT~``.

A walk may be named as git names a file in a commit, ``REV:PATH`` (``main:walk.toml``,
``:2:walk.toml``, a stage while git reports a conflict). When one of A and B is named that way
(the other may be the file in the working tree, taken at ``HEAD``) and ``--base`` is not given,
the base is the walk in their common commit (``git merge-base``).

Git can merge a walk run by run on its own: ``gaugewalk merge --setup-git WALK...`` (run once
in the repository) marks each walk in ``.gitattributes`` and tells git the command, which is
this one with ``--git``: it writes the merge in place of git's own file, without a backup, and
on a true conflict leaves that file as it was, exits 1 and says how to settle it.
"""

from __future__ import annotations

import argparse
import os
import shlex
import subprocess
import sys
from pathlib import Path

from gaugewalk.model.walk.job import Job
from gaugewalk.model.walk.merge import MergeResult, merge_jobs
from gaugewalk.model.walkfile.read import WalkFileError, loads_walk
from gaugewalk.tui.cli.common import (
    EXIT_INVALID,
    EXIT_LIMITS,
    EXIT_OK,
    commit,
    print_problems,
    read_job,
    writes_walk,
)

NAME = "merge"
HELP = ("Merge two walk files by run, source and raceway id; conflicts stop the merge unless "
        "--prefer.")

DRIVER = "gaugewalk"
"""The name of the merge driver in git's configuration and ``.gitattributes``."""


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("walks", nargs="+", metavar="A B",
                        help="the two walks (a file, or REV:PATH in git); with --setup-git, "
                             "the walk files to mark")
    parser.add_argument("-o", "--output", metavar="OUT", help="merged walk file")
    parser.add_argument("--base", metavar="BASE",
                        help="the walk both started from (a file, or REV:PATH in git)")
    parser.add_argument("--prefer", choices=("a", "b"),
                        help="on a true conflict take this side (conflicts are still listed)")
    parser.add_argument("--setup-git", action="store_true",
                        help="have git merge these walk files run by run with gaugewalk")
    parser.add_argument("--git", metavar="PATH",
                        help="run as git's merge driver for the walk at PATH (set up by "
                             "--setup-git)")


def run(args: argparse.Namespace) -> int:
    from gaugewalk.tui.cli.main import UsageError

    if args.setup_git:
        return _setup_git(args.walks)
    if len(args.walks) != 2 or not args.output:
        raise UsageError("gaugewalk merge: give two walks and -o OUT (or --setup-git WALK...)")
    args.a, args.b = args.walks
    if args.git is not None:
        return _git_driver(args)
    return _merge_files(args)


# -- reading walks from files or from git ----------------------------------------------------------

class _Named:
    """A walk argument: a file, or ``REV:PATH`` in git."""

    def __init__(self, text: str) -> None:
        self.text = text
        self.rev: str | None = None
        self.path = text
        if not os.path.exists(text) and ":" in text:
            rev, _, path = text.rpartition(":") if text.startswith(":") else text.partition(":")
            if not rev.startswith("-") and path:
                self.rev, self.path = rev, path

    def read(self) -> Job | None:
        if self.rev is None:
            return read_job(self.text)
        try:
            text = _git("show", f"{self.rev}:{self.path}")
        except _GitError as exc:
            print(f"{self.text}: cannot be read from git: {exc}", file=sys.stderr)
            return None
        try:
            return loads_walk(text.removeprefix("\ufeff"), self.text)
        except WalkFileError as exc:
            print_problems(exc.problems)
            return None

    def at(self) -> tuple[str, str] | None:
        """(revision, path from the top of the repository) this walk stands for, if in git."""
        if self.rev is not None:
            if self.rev.startswith(":") or self.rev == "":
                return None  # a stage of the index: no commit to find a base from
            if not self.path.startswith("./"):
                return self.rev, self.path      # git reads REV:PATH from the top
            try:
                prefix = _git("rev-parse", "--show-prefix").strip()
            except _GitError:
                return None
            return self.rev, prefix + self.path[2:]
        folder = os.path.dirname(os.path.abspath(self.text))
        try:
            _git("ls-files", "--error-unmatch", "--", os.path.abspath(self.text), cwd=folder)
            prefix = _git("rev-parse", "--show-prefix", cwd=folder).strip()
        except _GitError:
            return None
        return "HEAD", prefix + os.path.basename(self.text)


class _GitError(Exception):
    pass


def _git(*argv: str, cwd: str | None = None) -> str:
    """Run git (never through a shell); its output, or ``_GitError`` with its message."""
    try:
        done = subprocess.run(["git", *argv], cwd=cwd, capture_output=True, text=True,
                              check=False, timeout=60)
    except (OSError, subprocess.TimeoutExpired) as exc:
        raise _GitError(f"git could not be run: {exc}") from None
    if done.returncode != 0:
        raise _GitError(" ".join(done.stderr.split()) or f"git {argv[0]} failed")
    return done.stdout


def _base_in_git(a: _Named, b: _Named) -> tuple[Job | None, str | None]:
    """The walk in the common commit of A and B when git holds them, and how it was found (None:
    neither was named in git, so none was looked for)."""
    if a.rev is None and b.rev is None:
        return None, None
    where_a, where_b = a.at(), b.at()
    if where_a is None or where_b is None:
        return None, "no base: both walks must be in one git repository (see --base)"
    try:
        commit = _git("merge-base", where_a[0], where_b[0]).strip()
    except _GitError as exc:
        return None, f"no base: git finds no common commit ({exc})"
    for path in dict.fromkeys((where_a[1], where_b[1])):
        try:
            text = _git("show", f"{commit}:{path}")
        except _GitError:
            continue
        try:
            return loads_walk(text.removeprefix("\ufeff"), f"{commit[:10]}:{path}"), \
                f"base: {path} as of {commit[:10]}"
        except WalkFileError:
            return None, f"no base: {path} as of {commit[:10]} is not a valid walk"
    return None, f"no base: the walk is not in the common commit {commit[:10]}"


# -- merging ---------------------------------------------------------------------------------------

def _read_three(args) -> tuple[Job, Job, Job | None, str | None] | None:
    """A, B, the base (None: none) and a line saying where the base came from; None (after
    saying why) when something asked for cannot be read."""
    a_named, b_named = _Named(args.a), _Named(args.b)
    a, b = a_named.read(), b_named.read()
    if a is None or b is None:
        return None
    if args.base is not None:
        base = _Named(args.base).read()
        return None if base is None else (a, b, base, f"base: {args.base}")
    base, said = _base_in_git(a_named, b_named)
    return a, b, base, said


def _say_result(merged: MergeResult) -> None:
    for conflict in merged.conflicts:
        print(f"conflict: {conflict}", file=sys.stderr)
    for line in merged.taken["renumbered"]:
        print(f"kept both: {line} (both sides added a run with that id)", file=sys.stderr)


@writes_walk("output", "gaugewalk merge")
def _merge_files(args: argparse.Namespace) -> int:
    read = _read_three(args)
    if read is None:
        return EXIT_INVALID
    a, b, base, said = read
    merged = merge_jobs(a, b, prefer=args.prefer, base=base)
    if said:
        print(said, file=sys.stderr)
    _say_result(merged)
    if merged.job is None:
        print(f"{len(merged.conflicts)} conflict(s); nothing written. Fix one side, or choose "
              "with --prefer a or --prefer b", file=sys.stderr)
        return EXIT_LIMITS
    if not commit(args.hold, merged.job,
                  "the merged walk would not be valid; nothing written"):
        return EXIT_INVALID
    print(f"wrote {args.output}: {merged.summary()}, {len(merged.conflicts)} conflict(s)"
          + (f" settled by --prefer {args.prefer}" if merged.conflicts else ""))
    return EXIT_OK


def _git_driver(args: argparse.Namespace) -> int:
    """git's merge driver: ``--base %O %A %B -o %A``; the merge replaces git's file %A."""
    from gaugewalk.model.session.hold import WalkHold
    from gaugewalk.model.walkfile.atomic import atomic_write
    from gaugewalk.model.walkfile.write import dumps_walk

    name = args.git
    read = _read_three(args)
    if read is None:
        print(f"{name}: not merged by gaugewalk; the file is left as this side had it",
              file=sys.stderr)
        return EXIT_INVALID
    a, b, base, _said = read
    merged = merge_jobs(a, b, prefer=args.prefer, base=base)
    _say_result(merged)
    if merged.job is None:
        path = shlex.quote(name)
        print(f"{name}: {len(merged.conflicts)} conflict(s); the file is left as this side had "
              f"it. To settle them: gaugewalk merge --base :1:{path} :2:{path} :3:{path} "
              f"-o {path} --prefer a (or b), then git add {path}", file=sys.stderr)
        return EXIT_LIMITS
    problems = WalkHold(args.output, "gaugewalk merge").refusals(merged.job)
    if problems:
        print_problems(problems)
        print(f"{name}: the merged walk would not be valid; the file is left as this side had "
              "it", file=sys.stderr)
        return EXIT_INVALID
    atomic_write(args.output, dumps_walk(merged.job).encode("utf-8"), keep_backup=False)
    print(f"{name}: merged by gaugewalk: {merged.summary()}", file=sys.stderr)
    return EXIT_OK


# -- setting git up --------------------------------------------------------------------------------

def _setup_git(walks: list[str]) -> int:
    """Mark each walk ``merge=gaugewalk`` in ``.gitattributes`` at the top of its repository and
    set the driver in that repository's configuration."""
    driver = (f"{shlex.quote(sys.executable)} -m gaugewalk.tui.cli.main merge --git '%P' "
              "--base %O %A %B -o %A")
    for walk in walks:
        folder = os.path.dirname(os.path.abspath(walk))
        try:
            top = Path(_git("rev-parse", "--show-toplevel", cwd=folder).strip())
            _git("config", f"merge.{DRIVER}.name", "gaugewalk: walks merged run by run",
                 cwd=folder)
            _git("config", f"merge.{DRIVER}.driver", driver, cwd=folder)
        except _GitError as exc:
            print(f"{walk}: not set up: {exc}", file=sys.stderr)
            return EXIT_INVALID
        pattern = os.path.relpath(os.path.abspath(walk), top).replace(os.sep, "/")
        if any(c.isspace() for c in pattern) or pattern.startswith("../"):
            print(f"{walk}: not set up: the path must be inside the repository, without blanks",
                  file=sys.stderr)
            return EXIT_INVALID
        attributes = top / ".gitattributes"
        line = f"/{pattern} merge={DRIVER}"
        try:
            old = attributes.read_text(encoding="utf-8") if attributes.exists() else ""
            if line not in old.splitlines():
                attributes.write_text(old + ("" if not old or old.endswith("\n") else "\n")
                                      + line + "\n", encoding="utf-8")
        except OSError as exc:
            print(f"{attributes}: not written: {exc.strerror or exc}", file=sys.stderr)
            return EXIT_INVALID
        print(f"{pattern}: git merges it run by run with gaugewalk (commit .gitattributes so "
              "others get the marking; each clone runs this command once for the driver)")
    return EXIT_OK
