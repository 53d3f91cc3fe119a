"""``gaugewalk new FILE``: start a walk file. Never writes over an existing file."""

from __future__ import annotations

import argparse
import sys
from datetime import date
from pathlib import Path

from pydantic import ValidationError

from gaugewalk.model.walk.job import new_walk
from gaugewalk.model.walk.problems import Locator, problems_from_errors
from gaugewalk.model.walkfile.atomic import atomic_write
from gaugewalk.model.walkfile.write import dumps_walk
from gaugewalk.tui.cli.common import EXIT_INVALID, EXIT_OK, print_problems

NAME = "new"
HELP = "Start a new walk file (refuses to write over an existing one)."


def _date(text: str) -> date:
    try:
        return date.fromisoformat(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"'{text}' is not a date like 2024-05-02") from None


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("file", metavar="FILE", help="walk file to create (.toml)")
    parser.add_argument("--name", default="", help="job name")
    parser.add_argument("--site", default="", help="site address or description")
    parser.add_argument("--by", dest="walked_by", default="", help="who walks it")
    parser.add_argument("--date", dest="walked_on", type=_date, default=None,
                        help="date walked, YYYY-MM-DD")
    parser.add_argument("--service", metavar="SYSTEM", default=None,
                        help="start with the service as source SVC, e.g. '208Y/120' or '120/240'")


def run(args: argparse.Namespace) -> int:
    path = Path(args.file)
    if path.exists():
        print(f"{path}: already exists; 'gaugewalk new' does not write over a walk",
              file=sys.stderr)
        return EXIT_INVALID
    if not path.parent.is_dir():
        print(f"{path}: the folder {path.parent} does not exist", file=sys.stderr)
        return EXIT_INVALID
    try:
        job = new_walk(name=args.name, site=args.site, walked_by=args.walked_by,
                       walked_on=args.walked_on, service_system=args.service)
    except ValidationError as exc:
        print_problems(problems_from_errors(exc.errors(), "source", 0, Locator(), str(path),
                                            "--service", about="option"))
        return EXIT_INVALID
    try:
        atomic_write(path, dumps_walk(job).encode("utf-8"), keep_backup=False, create_only=True)
    except FileExistsError:
        print(f"{path}: already exists; 'gaugewalk new' does not write over a walk",
              file=sys.stderr)
        return EXIT_INVALID
    except OSError as exc:
        print(f"{path}: cannot write the walk: {exc.strerror or exc}", file=sys.stderr)
        return EXIT_INVALID
    service = f" with service SVC ({job.sources[0].system})" if job.sources else ""
    print(f"started {path}{service}")
    return EXIT_OK
