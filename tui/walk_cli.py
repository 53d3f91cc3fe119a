"""Helpers shared by the walk subcommands (``new``, ``add``, ``check``, ``merge``, ``schema``):
reading a walk for a command, and printing problems one line each on stderr."""

from __future__ import annotations

import sys

from model.job import Job
from model.walk_problems import Problem
from model.walkfile import WalkFileError, load_walk

EXIT_OK = 0
EXIT_LIMITS = 1      # computed, but some run misses its limits (or a merge has conflicts)
EXIT_INVALID = 2     # the file cannot be read or is invalid; nothing was written


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
