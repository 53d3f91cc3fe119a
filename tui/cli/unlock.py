"""``gaugewalk unlock FILE [--force]``: clear a walk's lock that no gaugewalk holds any more.

A lock left by a process that has ended (or whose process id now belongs to another program) is
cleared by the next opener on its own; this command also clears the locks gaugewalk cannot read
a holder from (a symbolic link, a folder, a file it cannot read) and, with ``--force``, a lock
from another computer once that gaugewalk is closed. A lock a running gaugewalk on this computer
holds is never broken (exit 2, naming who holds it). The walk itself is not touched.
"""

from __future__ import annotations

import argparse
import sys

from gaugewalk.model.walkfile.lock import LockError, WalkLocked, break_lock
from gaugewalk.tui.cli.common import EXIT_INVALID, EXIT_OK

NAME = "unlock"
HELP = "Clear a walk's stale or broken lock (never one a running gaugewalk holds)."


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", metavar="FILE", help="walk file (.toml) whose lock to clear")
    parser.add_argument("--force", action="store_true",
                        help="also clear a lock from another computer (once that gaugewalk is "
                             "closed: it cannot be checked from here)")


def run(args: argparse.Namespace) -> int:
    try:
        state = break_lock(args.file, force=args.force)
    except WalkLocked as exc:
        print(f"{exc.message}; not cleared", file=sys.stderr)
        return EXIT_INVALID
    except LockError as exc:
        print(str(exc), file=sys.stderr)
        return EXIT_INVALID
    if state.kind == "none":
        print(f"{args.file}: not locked; nothing to clear")
    else:
        print(f"{args.file}: cleared the lock: {state.describe()}")
    return EXIT_OK
