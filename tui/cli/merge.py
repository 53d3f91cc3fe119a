"""``gaugewalk merge A B -o OUT [--prefer a|b]``: merge two walks of one job.

Runs and sources are matched by id. The same id with different content is a conflict: they are
all listed and nothing is written unless ``--prefer`` picks a side. Every run and source of both
files ends up in OUT (the side taken for each conflict is listed). An existing OUT is kept as
``OUT~``.
"""

from __future__ import annotations

import argparse
import sys

from gaugewalk.model.walk.merge import merge_jobs
from gaugewalk.tui.cli.common import (
    EXIT_INVALID,
    EXIT_LIMITS,
    EXIT_OK,
    commit,
    read_job,
    writes_walk,
)

NAME = "merge"
HELP = "Merge two walk files by run and source id; conflicts stop the merge unless --prefer."


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("a", metavar="A", help="first walk file")
    parser.add_argument("b", metavar="B", help="second walk file")
    parser.add_argument("-o", "--output", metavar="OUT", required=True, help="merged walk file")
    parser.add_argument("--prefer", choices=("a", "b"),
                        help="on a conflict take this side (conflicts are still listed)")


@writes_walk("output", "gaugewalk merge")
def run(args: argparse.Namespace) -> int:
    a = read_job(args.a)
    b = read_job(args.b)
    if a is None or b is None:
        return EXIT_INVALID
    merged = merge_jobs(a, b, prefer=args.prefer)
    for conflict in merged.conflicts:
        print(f"conflict: {conflict}", file=sys.stderr)
    if merged.job is None:
        print(f"{len(merged.conflicts)} conflict(s); nothing written. Fix one side, or choose "
              "with --prefer a or --prefer b", file=sys.stderr)
        return EXIT_LIMITS
    if not commit(args.hold, merged.job,
                  "the merged walk would not be valid; nothing written"):
        return EXIT_INVALID
    t = merged.taken
    print(f"wrote {args.output}: {len(t['both'])} in both, {len(t['a only'])} from A only, "
          f"{len(t['b only'])} from B only, {len(merged.conflicts)} conflict(s)"
          + (f" settled by --prefer {args.prefer}" if merged.conflicts else ""))
    return EXIT_OK
