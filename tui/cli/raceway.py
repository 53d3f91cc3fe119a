"""``gaugewalk raceway FILE [ID --length L ...] [--json]``: list a walk's shared raceways, or add
one.

Without an ID: every shared raceway with its runs, trade size, fill and the adjustment of
NEC 310.15(C)(1) its runs take (the walk is only read). With an ID: a ``[[raceway]]`` added,
checked with the whole walk before anything is written (the file is left as it was on a
mistake); runs join it with ``add --raceway-id ID`` or ``raceway_id`` in the file.
"""

from __future__ import annotations

import argparse
import json
import sys

from pydantic import ValidationError

from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walk.job import Raceway
from gaugewalk.model.walk.problems import Locator, problems_from_errors
from gaugewalk.tui.cli.common import (
    EXIT_INVALID,
    EXIT_LIMITS,
    EXIT_OK,
    commit,
    print_problems,
    read_job,
    writes_walk,
)
from gaugewalk.tui.cli.main import CAUTION

NAME = "raceway"
HELP = "List a walk's shared raceways (fill, adjustment), or add one that runs can share."


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", metavar="FILE", help="walk file (.toml)")
    parser.add_argument("id", metavar="ID", nargs="?",
                        help="the new raceway's id, e.g. HR1 (leave out to list them)")
    parser.add_argument("--type", dest="rtype", metavar="TYPE",
                        help="raceway type, e.g. EMT, PVC-40 (default: the job's)")
    parser.add_argument("--size", metavar="TRADE",
                        help="fix the trade size, e.g. 1-1/4 (default: sized for what is in it)")
    parser.add_argument("--length", metavar="L",
                        help="its own route length, the part the runs share, e.g. 60+15")
    parser.add_argument("--bends", type=int, help="90-degree bends along it")
    parser.add_argument("--notes", default="", help="where it goes")
    parser.add_argument("--json", action="store_true", help="print the list as JSON")


def run(args: argparse.Namespace) -> int:
    if args.id is None:
        if any(v is not None for v in (args.rtype, args.size, args.length, args.bends)) \
                or args.notes:
            print(f"{args.file}: give the new raceway's ID before its options", file=sys.stderr)
            return EXIT_INVALID
        return _list(args)
    if args.json:
        print(f"{args.file}: --json is for the list; leave out the ID", file=sys.stderr)
        return EXIT_INVALID
    return _add(args)


def _list(args: argparse.Namespace) -> int:
    job = read_job(args.file)
    if job is None:
        return EXIT_INVALID
    result = compute_job(job)
    found = [result.raceways[r.id].to_dict() for r in job.raceways if r.id in result.raceways]
    if args.json:
        sys.stdout.write(json.dumps({"file": args.file, "raceways": found, "caution": CAUTION},
                                    indent=1) + "\n")  # one write, not one per token
    elif not found:
        print(f"{job.job.name or args.file}: no shared raceways; add one with "
              f"'gaugewalk raceway {args.file} ID --length L'")
    else:
        for s in found:
            size = f"{s['trade_size']} {s['raceway']}" if s["trade_size"] else s["raceway"]
            given = " (fixed)" if s["size_given"] else ""
            print(f"{s['id']}: {size}{given}, {s['length_ft']:g} ft, runs "
                  f"{', '.join(s['runs']) or 'none'}; {s['conductors']} conductors "
                  f"{s['fill_pct']:.0f}% full (limit {s['fill_limit_pct']:g}%); "
                  f"{s['ccc']} current-carrying, adjustment {s['adjustment']:g}")
            for problem in s["problems"]:
                print(f"  problem: {problem}")
        print()
        print(CAUTION)
    return EXIT_LIMITS if any(s["problems"] for s in found) else EXIT_OK


@writes_walk("file", "gaugewalk raceway")
def _add(args: argparse.Namespace) -> int:
    job = read_job(args.file)
    if job is None:
        return EXIT_INVALID
    if job.raceway(args.id) is not None:
        print(f"{args.file}, raceway {args.id}: that id is already used", file=sys.stderr)
        return EXIT_INVALID
    if not args.length:
        print(f"{args.file}, raceway {args.id}: give its route length with --length L",
              file=sys.stderr)
        return EXIT_INVALID
    data = {"id": args.id, "type": args.rtype, "size": args.size, "length": args.length,
            "bends": args.bends, "notes": args.notes}
    try:
        raceway = Raceway.model_validate({k: v for k, v in data.items() if v is not None})
    except ValidationError as exc:
        print_problems(problems_from_errors(exc.errors(), "raceway", None, Locator(), args.file,
                                            args.id))
        return EXIT_INVALID
    job.raceways.append(raceway)
    if not commit(args.hold, job):
        return EXIT_INVALID
    size = f"trade size {raceway.size}" if raceway.size else "sized for what is in it"
    print(f"added raceway {raceway.id}: {raceway.type or job.defaults.raceway}, {size}, "
          f"{raceway.length_ft:,.1f} ft; runs join it with --raceway-id {raceway.id}")
    return EXIT_OK
