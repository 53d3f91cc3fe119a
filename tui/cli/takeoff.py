"""``gaugewalk takeoff FILE [--csv | --json] [--prices PRICES.csv]``: the material list of a walk.

Without an option: aligned text for people: the order, the conductor lines with their cut lists,
the pull list, raceway, fittings, warnings and assumptions. ``--csv``: the order in the shape a
supplier takes, one row per orderable item (``item``, ``description``, ``quantity``, ``unit``),
no totals rows; the warnings and the caution go to stderr. ``--json``: everything, nested.
``--prices FILE`` puts the user's unit prices against the order (unit price and cost per line, a
total and the items with no price); a price file that cannot be used stops the command (exit 2)
before anything is written.
"""

from __future__ import annotations

import argparse
import csv
import json
import sys
from pathlib import Path

from gaugewalk.model.walk.takeoff import (
    PRICED_FIELDS,
    ROW_FIELDS,
    Takeoff,
    TakeoffError,
    build_takeoff,
)
from gaugewalk.tui.cli.main import CAUTION, UsageError

NAME = "takeoff"
HELP = "List the order, cut lists, raceway and fittings a walk needs (rough takeoff)."


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", metavar="FILE", help="walk file (.toml)")
    form = parser.add_mutually_exclusive_group()
    form.add_argument("--csv", action="store_true",
                      help="write the order as CSV: item, description, quantity, unit")
    form.add_argument("--json", action="store_true", help="write JSON")
    parser.add_argument(
        "--prices", metavar="PRICES.csv",
        help="your unit prices, one a line: item or description, unit_price[, unit] "
             "(unit: ft, C, M, each, box, reel, ...); adds cost per line and a total")


def load_computed(path: str):
    """Read, check and compute a walk: ``(job, job_result, takeoff)``. Any user mistake becomes
    a one-line ``UsageError`` naming the file (exit status 2)."""
    from gaugewalk.model.walk.compute import compute_job
    from gaugewalk.model.walkfile.read import WalkFileError, load_walk

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


def _aligned(columns: tuple[str, ...], rows: list[tuple[str, ...]],
             indent: str = "  ") -> list[str]:
    widths = [max([len(c)] + [len(r[i]) for r in rows]) for i, c in enumerate(columns)]

    def line(cells) -> str:
        padded = (cell.ljust(w) for cell, w in zip(cells, widths, strict=True))
        return indent + "  ".join(padded).rstrip()

    return [line(columns), line(["-" * w for w in widths])] + [line(r) for r in rows]


def render_text(takeoff: Takeoff, title: str, priced=None, runs_per_piece: int | None = None,
                pieces_per_line: int | None = None) -> str:
    """The takeoff as aligned text for a terminal; ``priced`` adds prices and the total,
    ``runs_per_piece`` and ``pieces_per_line`` shorten the pull list (the app's footage view)."""
    from gaugewalk.model.report.content import (
        fitting_table_of,
        order_table_of,
        priced_summary,
        pull_list_of,
        raceway_table_of,
        wire_table_of,
    )

    out = [title, ""]
    columns, rows = order_table_of(takeoff, priced)
    out.append("Order")
    out += _aligned(columns, list(rows)) if rows else ["  none"]
    if priced is not None:
        out += [f"  {line}" for line in priced_summary(priced)]
    out.append("")
    columns, rows = wire_table_of(takeoff)
    out.append("Conductors: cuts, pieces ordered and the fewest any packing could use")
    out += _aligned(columns, list(rows)) if rows else ["  none"]
    out.append("")
    out.append("Pull list: which runs come off which piece (cut lengths [ft])")
    groups = pull_list_of(takeoff, runs_per_piece, pieces_per_line)
    for group in groups:
        out.append(f"  {group.conductor}")
        out += [f"    {piece}, {offcut} ft left: {runs}" if piece else f"    {runs}"
                for piece, offcut, runs in group.pieces]
    if not groups:
        out.append("  none")
    out.append("")
    for heading, (columns, rows) in (
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


def write_csv(takeoff: Takeoff, stream, priced=None) -> None:
    """The order as CSV: one header row, then one row per orderable item (``Takeoff.to_rows``)."""
    writer = csv.DictWriter(stream, fieldnames=ROW_FIELDS if priced is None else PRICED_FIELDS)
    writer.writeheader()
    writer.writerows(takeoff.to_rows(priced))


def _priced(path: str | None, takeoff: Takeoff):
    """The order priced from the file at ``path`` (None: no prices); a bad file is a
    ``UsageError`` naming its line."""
    if path is None:
        return None
    from gaugewalk.model.walk.takeoff.prices import PriceFileError, price_order, read_prices

    try:
        return price_order(takeoff.order_lines, read_prices(path))
    except PriceFileError as exc:
        raise UsageError(str(exc)) from None


def run(args: argparse.Namespace) -> int:
    job, _result, takeoff = load_computed(args.file)
    priced = _priced(args.prices, takeoff)
    _write(args, job, takeoff, priced)  # a closed pipe (``| head``): ``main`` says nothing
    return 0


def _write(args: argparse.Namespace, job, takeoff: Takeoff, priced) -> None:
    if args.csv:
        write_csv(takeoff, sys.stdout, priced)
        for warning in takeoff.warnings:
            print(f"warning: {warning}", file=sys.stderr)
        print(CAUTION, file=sys.stderr)
    elif args.json:
        data = {"job": job.job.name, "file": Path(args.file).name, **takeoff.to_dict(priced),
                "caution": CAUTION}
        sys.stdout.write(json.dumps(data, indent=2) + "\n")
    else:
        title = f"Takeoff: {job.job.name or Path(args.file).name}"
        sys.stdout.write(render_text(takeoff, title, priced))
    sys.stdout.flush()
