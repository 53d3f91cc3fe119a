"""``gaugewalk takeoff FILE [--csv | --json]``: the rough material list of a walk.

Without an option: aligned text for people. ``--csv``: one header row, a column per attribute,
quantities in ``quantity_ft`` / ``quantity_each`` (unit in the name), no totals rows; the
assumptions, warnings and the caution follow as rows of their own ``section`` with the text in
``basis``. ``--json``: everything, nested.
"""

from __future__ import annotations

import argparse
import csv
import json
import os
import sys
from pathlib import Path

from gaugewalk.model.walk.takeoff import ROW_FIELDS, Takeoff, TakeoffError, build_takeoff
from gaugewalk.tui.cli.main import CAUTION, UsageError

NAME = "takeoff"
HELP = "List the conductors, raceway and fittings a walk needs (rough takeoff)."


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", metavar="FILE", help="walk file (.toml)")
    form = parser.add_mutually_exclusive_group()
    form.add_argument("--csv", action="store_true", help="write CSV for a spreadsheet")
    form.add_argument("--json", action="store_true", help="write JSON")


def load_computed(path: str):
    """Read, check and compute a walk: ``(job, job_result, takeoff)``. Any user mistake becomes
    a one-line ``UsageError`` naming the file (exit status 2)."""
    from gaugewalk.model.walk.compute import compute_job
    from gaugewalk.model.walkfile.store import WalkFileError, load_walk

    try:
        job = load_walk(path)
    except WalkFileError as exc:
        problems = exc.problems
        first = str(problems[0]) if problems else f"{path}: cannot be read"
        more = f" (and {len(problems) - 1} more problem(s))" if len(problems) > 1 else ""
        raise UsageError(first + more) from None
    result = compute_job(job)
    try:
        takeoff = build_takeoff(job, result)
    except TakeoffError as exc:
        raise UsageError(f"{path}: {exc}") from None
    return job, result, takeoff


def _aligned(columns: tuple[str, ...], rows: list[tuple[str, ...]], indent: str = "  ") -> list[str]:
    widths = [max([len(c)] + [len(r[i]) for r in rows]) for i, c in enumerate(columns)]

    def line(cells) -> str:
        return indent + "  ".join(cell.ljust(w) for cell, w in zip(cells, widths)).rstrip()

    return [line(columns), line(["-" * w for w in widths])] + [line(r) for r in rows]


def render_text(takeoff: Takeoff, title: str) -> str:
    """The takeoff as aligned text for a terminal."""
    from gaugewalk.model.report.content import fitting_table_of, raceway_table_of, wire_table_of

    out = [title, ""]
    for heading, (columns, rows) in (
        ("Conductors", wire_table_of(takeoff)),
        ("Raceway", raceway_table_of(takeoff)),
        ("Fittings", fitting_table_of(takeoff)),
    ):
        out.append(heading)
        out += _aligned(columns, list(rows)) if rows else ["  none"]
        out.append("")
    if takeoff.warnings:
        out.append("Warnings")
        out += [f"  - {w}" for w in takeoff.warnings]
        out.append("")
    out.append("Assumptions")
    out += [f"  - {a}" for a in takeoff.assumptions]
    out += ["", CAUTION]
    return "\n".join(out) + "\n"


def write_csv(takeoff: Takeoff, stream) -> None:
    """The takeoff rows as CSV, then one row per warning, assumption and the caution."""
    writer = csv.DictWriter(stream, fieldnames=ROW_FIELDS)
    writer.writeheader()
    for row in takeoff.to_rows():
        writer.writerow(row)
    blank = {name: "" for name in ROW_FIELDS}
    for section, texts in (("warning", takeoff.warnings), ("assumption", takeoff.assumptions),
                           ("caution", (CAUTION,))):
        for text in texts:
            writer.writerow({**blank, "section": section, "basis": text})


def run(args: argparse.Namespace) -> int:
    job, _result, takeoff = load_computed(args.file)
    try:
        _write(args, job, takeoff)
    except BrokenPipeError:  # the reader stopped early (``| head``): not an error
        sys.stdout = open(os.devnull, "w")  # noqa: SIM115 - keeps Python's exit flush quiet
    return 0


def _write(args: argparse.Namespace, job, takeoff: Takeoff) -> None:
    if args.csv:
        write_csv(takeoff, sys.stdout)
    elif args.json:
        data = {"job": job.job.name, "file": Path(args.file).name, **takeoff.to_dict(),
                "caution": CAUTION}
        sys.stdout.write(json.dumps(data, indent=2) + "\n")
    else:
        title = f"Takeoff: {job.job.name or Path(args.file).name}"
        sys.stdout.write(render_text(takeoff, title))
    sys.stdout.flush()
