"""``gaugewalk place FILE [--source ID]``: keep the tool's placement in the walk file.

Every run the walk does not place (no ``position``) is given the breaker position the tool
picked to balance its source's lines (``gaugewalk.model.walk.phases``), so the file then says
where each circuit lands; runs with a stated ``phase`` keep it, and get the position picked for
it. Runs with no free position are left as they are and listed. Checked with the whole walk and
written through the one save path; on a mistake the file is left as it was.
"""

from __future__ import annotations

import argparse
import sys

from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walk.schedule import positions_to_keep
from gaugewalk.tui.cli.common import (
    EXIT_INVALID,
    EXIT_OK,
    commit,
    read_job,
    writes_walk,
)

NAME = "place"
HELP = "Write the breaker positions the tool picked into the walk file."


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", metavar="FILE", help="walk file (.toml)")
    parser.add_argument("--source", metavar="ID", help="only the runs of this source")


@writes_walk("file", "gaugewalk place")
def run(args: argparse.Namespace) -> int:
    job = read_job(args.file)
    if job is None:
        return EXIT_INVALID
    if args.source is not None and job.source(args.source) is None:
        print(f"{args.file}: there is no source {args.source}", file=sys.stderr)
        return EXIT_INVALID
    result = compute_job(job)
    positions, unplaced = positions_to_keep(job, result, args.source)
    kept: list[str] = []
    for i, r in enumerate(job.runs):
        if r.id in positions:
            placed = result.placements[r.id]
            job.runs[i] = r.model_copy(update={"position": positions[r.id]})
            kept.append(f"{r.id} at {'-'.join(str(p) for p in placed.positions)} "
                        f"({placed.phase})")
    if not kept:
        print("every run already has its position" if not unplaced else
              "no run could be given a position")
    elif not commit(args.hold, job):
        return EXIT_INVALID
    else:
        print(f"placed {len(kept)} run(s): " + "; ".join(kept))
    if unplaced:
        print("no free position for: " + ", ".join(unplaced) + " (see 'gaugewalk check')")
    return EXIT_OK
