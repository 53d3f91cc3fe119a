"""``gaugewalk check FILE [--json]``: read a walk, check it, compute every run.

Exit status: 0 every run meets its limits; 1 some run does not (or cannot be sized); 2 the file
cannot be read or is invalid (each problem on stderr with file, line, run or source, field). The
file is only read, never written.
"""

from __future__ import annotations

import argparse
import sys
from typing import Any

from gaugewalk.model.walk.compute import JobResult, compute_job
from gaugewalk.model.walk.equipment import load_short
from gaugewalk.model.walk.job import Job
from gaugewalk.model.walk.plain_text import shown
from gaugewalk.model.walk.plausible import implausible, stated_loads
from gaugewalk.model.walkfile.read import WalkFileError, check_walk_text, read_walk_text
from gaugewalk.tui.cli.common import EXIT_INVALID, EXIT_LIMITS, EXIT_OK, print_problems
from gaugewalk.tui.cli.main import CAUTION

NAME = "check"
HELP = "Check a walk file and compute every run (exit 0 all within limits, 1 not, 2 invalid)."


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", metavar="FILE", help="walk file (.toml)")
    parser.add_argument("--json", action="store_true", help="print the results as JSON")


def _load_text(run, job: Job) -> str:
    """The load as given, or for a feeder the kind of source it feeds: ``(transformer)``."""
    if run.load is None:
        fed = job.source(run.to)
        return f"({fed.kind if fed is not None else 'panel'})"
    return load_short(run.load)


def results_json(path: str, job: Job, result: JobResult) -> dict:
    """The machine-readable results of ``check --json``."""
    from gaugewalk.model.walk.schedule import drop_basis, source_entry  # only --json shows them

    runs: list[dict[str, Any]] = []
    for r in job.runs:
        rr = result.runs.get(r.id)
        entry = {
            "id": r.id, "from": r.from_, "to": r.to, "feeder": job.is_feeder(r),
            "length": r.length, "length_ft": round(r.length_ft, 3), "load": _load_text(r, job),
            "load_kind": r.load.kind if r.load is not None else "general",
            "amps": None, "required_ampacity_a": None, "design_amps": None, "size": None,
            "sets": r.sets, "material": None, "ocpd_a": None,
            "egc_size": None, "raceway": None, "raceway_size": None, "raceway_id": r.raceway_id,
            "voltage_drop_pct": None, "total_drop_pct": None, "governed_by": None,
            "flc_a": None, "locked_rotor_a": None, "starting_drop_pct": None,
            "starting_dip_pct": None, "kind_rule": None,
            "ok": False, "problems": [p.message for p in result.run_problems(r.id)],
            "notes": [],
        }
        if r.rooftop:  # given only where set, as the file keeps it
            entry["rooftop"] = True   # NEC 310.15(B)(2): 33 C added to the ambient
        feeder = result.feeders.get(r.id)
        entry["basis"] = feeder.basis if feeder is not None else None
        entry["demand"] = None if feeder is None else [   # Defaults.demand: NEC 220.44, 220.60
            {"section": s.section, "group": s.group, "connected_va": round(s.connected_va, 1),
             "demand_va": round(s.demand_va, 1), "note": s.text} for s in feeder.demand]
        placed = result.placements.get(r.id)
        entry["position"] = list(placed.positions) if placed is not None else None
        entry["phase"] = placed.phase if placed is not None else None
        entry["placed_by"] = placed.by if placed is not None else None
        if rr is not None:
            dip = result.start_dips.get(r.id)
            entry.update({
                "amps": round(rr.amps, 3), "required_ampacity_a": round(rr.required_ampacity_a, 3),
                "design_amps": round(rr.design_amps, 3), "size": rr.size, "sets": rr.sets,
                "material": rr.material, "ocpd_a": rr.ocpd_a, "egc_size": rr.egc_size,
                "raceway": rr.raceway, "raceway_size": rr.raceway_size,
                "voltage_drop_pct": round(rr.voltage_drop_pct, 4),
                "total_drop_pct": round(rr.total_drop_pct, 4),
                "governed_by": rr.governed_by, "flc_a": rr.flc_a,
                "locked_rotor_a": _round(rr.locked_rotor_a, 1),
                "starting_drop_pct": _round(rr.starting_drop_pct),
                # the dip at the motor from the service (gaugewalk.model.walk.starting)
                "starting_dip_pct": _round(dip.total_pct if dip is not None else None),
                "kind_rule": rr.kind_rule,
                # a problem of its place in its panel (a position taken twice) is one too
                "ok": rr.ok and not entry["problems"],
                # the rules applied and what was taken as given (as calc lists them)
                "notes": list(rr.notes) + list(result.walk_notes(r.id)),
            })
            if feeder is not None:  # the current it is sized for, by its basis
                entry["amps"] = round(feeder.amps, 3)
                entry["load_amps"] = round(feeder.load_amps, 3)
                # NEC 430.62(A): the largest device for motors alone; 430.63: with other
                # loads, the figure the device is "not less than" (never both)
                entry["max_ocpd_a"] = _round(feeder.max_ocpd_a, 1)
                entry["ocpd_430_63_a"] = _round(feeder.ocpd_430_63_a, 1)
                beside = feeder.beside   # the connected-load answer beside an equipment basis
                entry["load_answer"] = None if beside is None else {
                    "amps": round(beside.amps, 3), "size": beside.size, "sets": beside.sets,
                    "ocpd_a": beside.ocpd_a, "voltage_drop_pct": round(beside.voltage_drop_pct, 4)}
        runs.append(entry)
    sources = [source_entry(job, result, s.id) for s in job.sources]
    raceways = [shared.to_dict() for shared in result.raceways.values()]
    failing = [e["id"] for e in runs if not e["ok"]]
    totals = [e["total_drop_pct"] for e in runs if e["total_drop_pct"] is not None]
    worst = max(runs, key=lambda e: e["total_drop_pct"] or -1.0, default=None)
    return {
        "file": path,
        "job": job.job.name,
        "runs": runs,
        "sources": sources,
        "drop_through_transformers": job.defaults.drop_through_transformers,
        "nonlinear_loads": job.defaults.nonlinear_loads,
        "drop_basis": drop_basis(job),
        "raceways": raceways,
        "demand": job.defaults.demand,
        "summary": {
            "runs": len(runs),
            "ok": len(runs) - len(failing),
            "failing": failing,
            "max_total_drop_pct": max(totals) if totals else None,
            "worst_run": worst["id"] if worst and worst["total_drop_pct"] is not None else None,
            "problems": [str(p) for p in result.problems],
            "warnings": [p.brief() for p in implausible(job)],
            "all_ok": result.ok,
        },
        "caution": CAUTION,
    }


def _round(value: float | None, places: int = 4) -> float | None:
    return None if value is None else round(value, places)


def _plural(n: int, word: str) -> str:
    return f"{n} {word}" if n == 1 else f"{n} {word}s"


_ROW = "%-*s %-*s %-24s %7s %13s %14s %6s %6s  %s"
"""A row of the table: run and from as wide as given, then to, ft, load, size, drop%, total%
and status (every cell text)."""


def _table(path: str, job: Job, result: JobResult) -> str:
    """One line per run, the id and source columns as wide as their longest entry."""
    rows = []
    for r in job.runs:
        rr = result.runs.get(r.id)
        to = r.to if len(r.to) <= 24 else r.to[:23] + "~"
        if rr is None:
            size, vd, tot, status = "-", "-", "-", "NOT SIZED"
        else:
            size = f"{rr.sets}x{rr.size}" if rr.sets > 1 else rr.size
            vd, tot = f"{rr.voltage_drop_pct:.2f}", f"{rr.total_drop_pct:.2f}"
            # OVER: short of ampacity or over a drop target; PROBLEM: any other, listed below
            # the table (data missing, its device, its breaker position)
            status = ("OVER" if not rr.within_limits else
                      "PROBLEM" if not rr.ok or result.run_problems(r.id) else "ok")
        rows.append((r.id, r.from_, to, f"{r.length_ft:.1f}", _load_text(r, job), size, vd, tot,
                     status))
    wid = max([len("run"), *(len(row[0]) for row in rows)])
    wfrom = max([len("from"), *(len(row[1]) for row in rows)])

    def line(cells) -> str:
        # %-formatting lays out the nine columns in one pass (the same text as an f-string of
        # nine format specs, in a third of the time: a walk has thousands of rows)
        i, f, to, ft, load, size, vd, tot, status = cells
        return _ROW % (wid, i, wfrom, f, to, ft, load, size, vd, tot, status)

    head = line(("run", "from", "to", "ft", "load", "size", "drop%", "total%", "status"))
    counts = f"{_plural(len(job.runs), 'run')}, {_plural(len(job.sources), 'source')}"
    title = f"{job.job.name or shown(path)}: {counts}"
    lines = [title, "", head, "-" * len(head)] + [line(row) for row in rows]
    lines.append("")
    if result.raceways:
        lines += [_shared_line(s) for s in result.raceways.values()] + [""]
    if result.problems:
        lines.append(f"{len(result.problems)} problem(s):")
        lines += [f"  {p.brief()}" for p in result.problems]
    else:
        lines.append("Every run is within its ampacity and drop targets.")
    stated = stated_loads(result)
    if stated:  # an assumption stated, not a problem: the person gave the feeder its load
        lines.append("")
        lines.append(f"{len(stated)} feeder(s) sized for a stated load below what their "
                     "panel's loads need:")
        lines += [f"  run {shown(rid)}: {shown(basis)}" for rid, basis in stated]
    warnings = implausible(job)
    if warnings:  # said, never counted against the walk (the exit status)
        lines.append("")
        lines.append(f"{len(warnings)} warning(s):")
        lines += [f"  {p.brief()}" for p in warnings]
    lines += ["", CAUTION]
    return "\n".join(lines)


def _shared_line(s) -> str:
    """One line per shared raceway: its size, fill and the adjustment its runs take."""
    size = f"{s.trade_size} {s.raceway}" if s.trade_size else f"{s.raceway}, no size holds it"
    return (f"raceway {s.id}: {size}, {len(s.runs)} runs, {s.conductors} conductors "
            f"{s.fill_pct:.0f}% full (limit {s.fill_limit_pct:g}%), {s.ccc} current-carrying, "
            f"adjustment {s.adjustment:g}")


def run(args: argparse.Namespace) -> int:
    try:
        text = read_walk_text(args.file)
    except WalkFileError as exc:
        print_problems(exc.problems)
        return EXIT_INVALID
    job, problems = check_walk_text(text, args.file)
    if problems or job is None:
        print_problems(problems)
        return EXIT_INVALID
    result = compute_job(job)
    if args.json:
        import json  # only --json writes it

        # one write: json.dump would hand the stream every token, each passing shown_lines
        sys.stdout.write(json.dumps(results_json(args.file, job, result), indent=1) + "\n")
    else:
        print(_table(args.file, job, result))
    return EXIT_OK if result.ok else EXIT_LIMITS
