"""``gaugewalk source FILE ID --kind panel --system 208Y/120``: add a source to a walk.

Anything but the service needs its feeder, added with it: ``--from`` (the source upstream) and
``--length``; more feeder options can be set later by editing the run.
Checked with the whole walk before anything is written; the file is left as it was on a mistake.
"""

from __future__ import annotations

import argparse
import sys

from pydantic import ValidationError

from gaugewalk.model.walk.job import Run, Source
from gaugewalk.model.walk.problems import Locator, problems_from_errors
from gaugewalk.model.walk.vocabulary import PROTECTIONS, SOURCE_KINDS
from gaugewalk.tui.cli.common import (
    EXIT_INVALID,
    EXIT_OK,
    commit,
    print_problems,
    read_job,
    writes_walk,
)

NAME = "source"
HELP = "Add a service, switchboard, panel or transformer to a walk file."


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", metavar="FILE", help="walk file (.toml)")
    parser.add_argument("id", metavar="ID", help="the source's id, e.g. LP2")
    parser.add_argument("--kind", required=True, choices=SOURCE_KINDS)
    parser.add_argument("--system", required=True,
                        help="supply system at its bus (transformer: secondary), e.g. 208Y/120")
    parser.add_argument("--name", default="", help="name on the equipment")
    parser.add_argument("--kva", type=float, help="transformer rating [kVA]")
    parser.add_argument("--rating", type=int, metavar="A", help="bus rating [A]")
    parser.add_argument("--main", type=int, metavar="A",
                        help="main device [A] (none: main lugs only)")
    parser.add_argument("--spaces", type=int, metavar="N", help="breaker positions it has")
    parser.add_argument("--impedance", type=float, metavar="PCT",
                        help="transformer nameplate impedance [%%] (none: a typical value, "
                             "stated as assumed)")
    parser.add_argument("--protection", choices=tuple(PROTECTIONS),
                        help="transformer protection by NEC Table 450.3(B): primary only "
                             "(default) or primary and secondary")
    parser.add_argument("--secondary-ocpd", type=int, metavar="A",
                        help="transformer secondary device at the transformer [A]")
    parser.add_argument("--nonlinear", choices=("yes", "no"),
                        help="its loads are mostly nonlinear, or linear (default: the job's "
                             "setting; NEC 310.15(E)(3))")
    parser.add_argument("--notes", default="")
    parser.add_argument("--from", dest="from_", metavar="SOURCE",
                        help="the source feeding it (needed for all but the service)")
    parser.add_argument("--length", metavar="L", help="the feeder's route length")
    parser.add_argument("--feeder-id", metavar="ID", help="the feeder run's id (default F-<ID>)")
    parser.add_argument("--size", help="fix the feeder's conductor size")
    parser.add_argument("--sets", type=int, help="feeder conductors in parallel per phase")


@writes_walk("file", "gaugewalk source")
def run(args: argparse.Namespace) -> int:
    job = read_job(args.file)
    if job is None:
        return EXIT_INVALID
    if job.source(args.id) is not None:
        print(f"{args.file}, source {args.id}: that id is already used", file=sys.stderr)
        return EXIT_INVALID
    data = {"id": args.id, "kind": args.kind, "system": args.system, "name": args.name,
            "kva": args.kva, "rating_a": args.rating, "notes": args.notes}
    for key, value in (("main_a", args.main), ("spaces", args.spaces),
                       ("impedance_pct", args.impedance), ("protection", args.protection),
                       ("secondary_ocpd_a", args.secondary_ocpd),
                       ("nonlinear_loads", None if args.nonlinear is None
                        else args.nonlinear == "yes")):
        if value is not None:
            data[key] = value
    try:
        source = Source.model_validate(data)
    except ValidationError as exc:
        print_problems(problems_from_errors(exc.errors(), "source", None, Locator(), args.file,
                                            args.id))
        return EXIT_INVALID
    job.sources.append(source)
    if source.kind != "service":
        if not args.from_ or not args.length:
            print(f"{args.file}, source {args.id}: a {source.kind} needs its feeder: give --from "
                  "SOURCE and --length L", file=sys.stderr)
            return EXIT_INVALID
        feeder_id = args.feeder_id or f"F-{args.id}"
        if job.run(feeder_id) is not None:
            print(f"{args.file}, run {feeder_id}: that id is already used; choose another with "
                  "--feeder-id", file=sys.stderr)
            return EXIT_INVALID
        feeder = {"id": feeder_id, "from": args.from_, "to": args.id, "length": args.length}
        if args.size:
            feeder["size"] = args.size
        if args.sets:
            feeder["sets"] = args.sets
        try:
            job.runs.append(Run.model_validate(feeder))
        except ValidationError as exc:
            print_problems(problems_from_errors(exc.errors(), "run", None, Locator(), args.file,
                                                feeder_id))
            return EXIT_INVALID
    if not commit(args.hold, job):
        return EXIT_INVALID
    fed = f", fed by run {job.runs[-1].id}" if source.kind != "service" else ""
    print(f"added {source.kind} {source.id} ({source.system}){fed}")
    return EXIT_OK
