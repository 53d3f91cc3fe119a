"""``gaugewalk add FILE --from SOURCE --to NAME --length L --amps A ...``: add one run to a walk.

The run is checked with the whole walk before anything is written; on a mistake the file is left
as it was (exit 2). The save is atomic and keeps the previous file as ``FILE~``; when the file had
comments, a warning says they are gone from the new file (the backup keeps them).
"""

from __future__ import annotations

import argparse
import sys

from pydantic import ValidationError

from gaugewalk.model.engine.circuits import resolve_circuit
from gaugewalk.model.engine.vocabulary import CONNECTIONS, MATERIALS, TERMINAL_TEMPS
from gaugewalk.model.session.card_form import circuit_words
from gaugewalk.model.walk.checks import branch_circuit_for_kind
from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walk.job import Run
from gaugewalk.model.walk.plausible import long_length
from gaugewalk.model.walk.problems import Locator, problems_from_errors
from gaugewalk.model.walk.vocabulary import PHASES
from gaugewalk.tui.cli.common import (
    EXIT_INVALID,
    EXIT_OK,
    commit,
    print_problems,
    read_job,
    writes_walk,
)
from gaugewalk.tui.cli.load_options import add_load_options, given_load, kind_refusal, load_table

NAME = "add"
HELP = "Add a run to a walk file (same length grammar as 'calc')."

def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", metavar="FILE", help="walk file (.toml)")
    parser.add_argument("--from", dest="from_", metavar="SOURCE", required=True,
                        help="id of the source the run starts at")
    parser.add_argument("--to", metavar="NAME", required=True,
                        help="a source id (the run is then its feeder) or the load's name")
    parser.add_argument("--length", metavar="L", required=True,
                        help="route length, e.g. 85+12+2*6 or 36m+8ft [ft unless a unit is given]")
    add_load_options(parser, checked=False)
    parser.add_argument("--pf", type=float, help="power factor of the load (0 to 1]")
    parser.add_argument("--id", dest="run_id", help="run id (default: the next free R-number)")
    parser.add_argument("--connection", choices=tuple(CONNECTIONS),
                        help="how the load is wired (default for a branch run: the usual circuit "
                        "for its kind of load, said when added; for a feeder: every hot and "
                        "the neutral)")
    parser.add_argument("--position", type=int, metavar="N",
                        help="breaker position (circuit number) in its source; a k-pole "
                             "circuit at N takes N, N+2, ... (default: placed to balance)")
    parser.add_argument("--phase", choices=tuple(PHASES),
                        help="the line or lines it lands on, when no position is given")
    parser.add_argument("--continuous", action=argparse.BooleanOptionalAction, default=None,
                        help="load runs 3 h or more (default: by its kind; EV chargers, water "
                        "heaters and heaters are by their article, lighting by default)")
    parser.add_argument("--spread", action="store_true",
                        help="load spread evenly along the run rather than at its end")
    parser.add_argument("--sets", type=int, help="conductors in parallel per phase")
    parser.add_argument("--size", help="fix the conductor size, e.g. '3/0 AWG'")
    parser.add_argument("--ocpd", type=int, metavar="A", help="fix the breaker or fuse [A]")
    parser.add_argument("--material", choices=MATERIALS)
    parser.add_argument("--insulation", help="e.g. THHN/THWN-2, XHHW-2")
    parser.add_argument("--raceway", help="e.g. EMT, PVC-40, RMC")
    parser.add_argument("--terminal-temp", type=int, choices=TERMINAL_TEMPS)
    parser.add_argument("--ambient", type=float, metavar="C", help="ambient temperature [C]")
    parser.add_argument("--rooftop", action="store_true", default=None,
                        help="in sunlight less than 7/8 in above a roof: 33 C added to the "
                             "ambient (NEC 310.15(B)(2); XHHW-2 excepted)")
    parser.add_argument("--max-drop", type=float, metavar="PCT",
                        help="drop target for this run [%%]")
    parser.add_argument("--bends", type=int, help="90-degree bends along the route")
    parser.add_argument("--raceway-id", metavar="ID",
                        help="the shared raceway ([[raceway]]) the run is in")
    parser.add_argument("--measured-on", metavar="YYYY-MM-DD", help="date the length was measured")
    parser.add_argument("--notes", default="", help="notes on the run")


def _run_data(args: argparse.Namespace, run_id: str, usual_circuit_on: str | None) -> dict:
    """The run's table as ``add`` writes it; a branch run that states no connection gets the
    usual circuit for its kind of load on ``usual_circuit_on`` (its source's system)."""
    data: dict = {"id": run_id, "from": args.from_, "to": args.to, "length": args.length}
    load = load_table(args)
    if load is not None:
        data["load"] = load
    if usual_circuit_on is not None:
        load = load or {}
        hp = load.get("value") if load.get("unit") == "hp" else None
        data["connection"] = branch_circuit_for_kind(usual_circuit_on, load.get("kind", "general"),
                                                     hp)
    options = {
        "connection": args.connection, "sets": args.sets, "size": args.size,
        "ocpd_a": args.ocpd, "material": args.material, "insulation": args.insulation,
        "raceway": args.raceway, "terminal_temp": args.terminal_temp, "ambient_c": args.ambient,
        "max_drop_pct": args.max_drop, "bends": args.bends, "measured_on": args.measured_on,
        "position": args.position, "phase": args.phase,
        "raceway_id": args.raceway_id, "rooftop": args.rooftop,
    }
    data.update({k: v for k, v in options.items() if v is not None})
    if args.continuous is not None:
        data["continuous"] = args.continuous
    if args.spread:
        data["distributed"] = True
    if args.notes:
        data["notes"] = args.notes
    return data


@writes_walk("file", "gaugewalk add")
def run(args: argparse.Namespace) -> int:
    job = read_job(args.file)
    if job is None:
        return EXIT_INVALID
    if args.pf is not None and given_load(args) is None:
        print(f"{args.file}: --pf needs a load (--amps, --va, --kva, --watts, --kw or --hp)",
              file=sys.stderr)
        return EXIT_INVALID
    refusal = kind_refusal(args)
    if refusal is not None:
        print(f"{args.file}: {refusal}", file=sys.stderr)
        return EXIT_INVALID
    source = job.source(args.from_)
    usual_circuit_on = (source.system if args.connection is None and source is not None
                        and job.source(args.to) is None else None)
    run_id = args.run_id or job.next_run_id("R")
    if job.run(run_id) is not None:
        print(f"{args.file}, run {run_id}: that id is already used; choose another with --id",
              file=sys.stderr)
        return EXIT_INVALID
    try:
        new = Run.model_validate(_run_data(args, run_id, usual_circuit_on))
    except ValidationError as exc:
        print_problems(problems_from_errors(exc.errors(), "run", None, Locator(), args.file,
                                            run_id))
        return EXIT_INVALID
    job.runs.append(new)
    if not commit(args.hold, job):
        return EXIT_INVALID
    result = compute_job(job)
    rr = result.runs.get(run_id)
    kind = "feeder" if job.is_feeder(new) else "branch"
    summary = f"added {kind} run {run_id}: {new.from_} -> {new.to}, {new.length_ft:,.1f} ft"
    if rr is not None:
        kind = "" if rr.load_kind == "general" else f"{rr.load_kind}, "
        summary += (f"; {kind}{rr.sets}x {rr.size} {rr.material} on {rr.ocpd_a} A, drop "
                    f"{rr.voltage_drop_pct:.2f}%, from the service {rr.total_drop_pct:.2f}%")
        if rr.starting_drop_pct is not None:
            summary += f", starting {rr.starting_drop_pct:.2f}%"
        if rr.problems:
            summary += "; " + "; ".join(rr.problems)
    placed = result.placements.get(run_id)
    if placed is not None:
        where = (f"position {'-'.join(str(p) for p in placed.positions)}"
                 if placed.positions else "no free position")
        how = {"position": "as given", "phase": "phase as given",
               "placed": "placed to balance the lines"}[placed.by]
        summary += f"; {where}, phase {placed.phase} ({how})"
    for problem in result.run_problems(run_id):
        if problem.field in ("position", "phase"):
            summary += f"; {problem.message}"
    print(summary)
    if usual_circuit_on is not None and new.connection is not None:
        words = circuit_words(resolve_circuit(usual_circuit_on, new.connection))
        print(f"  circuit {new.connection}: {words}, the usual for this kind of load; "
              "give --connection if it is wired otherwise")
    warning = long_length(new.length_ft, job.defaults)
    if warning:
        print(f"warning: {args.file}, run {run_id}, length: {warning}", file=sys.stderr)
    return EXIT_OK
