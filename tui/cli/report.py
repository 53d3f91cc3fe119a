"""``gaugewalk report FILE -o OUT.html`` (or ``OUT.md``): a printable report of a walk.

The format follows the extension of OUT. The walk file itself (and its backup) is never written
over; an existing OUT is kept unless ``--replace`` is given. The file is written atomically.
"""

from __future__ import annotations

import argparse
import os
from pathlib import Path

from gaugewalk.model.report.content import build_report
from gaugewalk.model.walkfile.atomic import atomic_write
from gaugewalk.tui.cli.main import UsageError
from gaugewalk.tui.cli.takeoff import load_computed

NAME = "report"
HELP = "Write a printable report of a walk (HTML or Markdown, by the extension of -o)."

FORMATS = {".html": "html", ".htm": "html", ".md": "md", ".markdown": "md"}


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", metavar="FILE", help="walk file (.toml)")
    parser.add_argument("-o", "--output", metavar="OUT", required=True,
                        help="report file to write: .html or .md")
    parser.add_argument("--replace", action="store_true",
                        help="write over OUT if it already exists (never over the walk file)")
    parser.add_argument("--brief", action="store_true",
                        help="leave out the last section, the rules applied to each run (a "
                             "printout for ordering)")


def _same_file(a: Path, b: Path) -> bool:
    try:
        return a.resolve() == b.resolve() or (a.exists() and b.exists() and os.path.samefile(a, b))
    except OSError:
        return False


def check_output(walk: str, out: str, replace: bool) -> str:
    """The report format for ``out``, or a ``UsageError`` if writing there would lose anything."""
    from gaugewalk.model.walkfile.atomic import backup_path

    out_path, walk_path = Path(out), Path(walk)
    for protected in (walk_path, backup_path(walk_path)):
        if _same_file(out_path, protected):
            raise UsageError(f"{out}: that is the walk file or its backup; "
                             "choose another name for the report")
    fmt = FORMATS.get(out_path.suffix.lower())
    if fmt is None:
        raise UsageError(
            f"{out}: unknown report type '{out_path.suffix or '(none)'}'; use .html or .md")
    if out_path.is_dir():
        raise UsageError(f"{out}: this is a folder; give a file name for the report")
    if out_path.exists() and not replace:
        raise UsageError(f"{out}: already exists; add --replace to write over it")
    if not out_path.parent.is_dir():
        raise UsageError(f"{out}: the folder {out_path.parent} does not exist")
    return fmt


def render(fmt: str, report) -> str:
    if fmt == "html":
        from gaugewalk.tui.report.html import render_html
        return render_html(report)
    from gaugewalk.tui.report.md import render_md
    return render_md(report)


def run_errors_of(job_result) -> dict[str, str]:
    """Why each run that could not be sized failed: {run id: message}."""
    errors: dict[str, str] = {}
    for problem in job_result.problems:
        if problem.about == "run":
            rid = problem.id
            if rid not in job_result.runs:
                errors[rid] = (f"{errors[rid]}; {problem.message}" if rid in errors
                               else problem.message)
    return errors


def run(args: argparse.Namespace) -> int:
    fmt = check_output(args.file, args.output, args.replace)
    job, result, takeoff = load_computed(args.file)
    report = build_report(job, result.runs, takeoff, file_name=Path(args.file).name,
                          run_errors=run_errors_of(result), job_result=result,
                          with_rules=not args.brief)
    try:
        atomic_write(Path(args.output), render(fmt, report).encode("utf-8"), keep_backup=False)
    except OSError as exc:
        raise UsageError(f"{args.output}: cannot be written: {exc.strerror or exc}") from None
    return 0
