"""Reading a walk file: the text read within the limits, parsed, migrated, validated table by
table and cross-checked, with every problem named by file, line, table and field.

Public API:

- ``load_walk(path) -> Job`` and ``loads_walk(text, path="walk.toml") -> Job``: read, migrate to
  the current schema, check everything; raise ``WalkFileError`` listing every problem.
- ``check_walk_text(text, path) -> (Job | None, list[Problem])``: the same without raising, for
  ``gaugewalk check`` (the Job is None when the file cannot be built at all).
- ``read_walk_text(path) -> str``: the file's text, or ``WalkFileError`` (missing, a folder,
  over the size limit, not UTF-8).
- ``MAX_WALK_BYTES``, ``MAX_RUNS``: the largest walk file and the most runs read or written;
  ``too_big(size)`` and ``too_many(runs)`` say so in words.
- ``WalkFileError``: a walk that cannot be used; ``problems`` lists every reason.

File layout (schema 1)::

    schema = 1

    [job]
    name = "..."

    [defaults]          # only what differs from the shipped defaults
    material = "al"

    [[source]]
    id = "MDP"
    kind = "service"
    system = "480Y/277V 3ph 4w"

    [[raceway]]         # shared by the runs that name it in raceway_id
    id = "HR1"
    type = "EMT"
    length = "60+15"

    [[run]]
    id = "F1"
    from = "MDP"
    to = "LP1"
    length = "85+12+2*6"
    load = { value = 16, unit = "A" }
"""

from __future__ import annotations

import os
import re
from pathlib import Path

from pydantic import BaseModel, ValidationError

from gaugewalk.model.engine.collector import collector_held
from gaugewalk.model.walk.checks import check_references
from gaugewalk.model.walk.job import (
    SCHEMA_VERSION,
    Defaults,
    Job,
    JobHeader,
    Raceway,
    Run,
    Source,
)
from gaugewalk.model.walk.problems import Locator, Problem, problems_from_errors
from gaugewalk.model.walkfile.migrate import migrate
from gaugewalk.model.walkfile.toml_parse import parse_toml

MAX_WALK_BYTES = 20 * 1024 * 1024
"""Largest walk file read or written [bytes] (20 MiB: 50,000 runs of about 400 bytes each)."""
MAX_RUNS = 50_000
"""Most runs in one walk: ten times the 5,000-run walk the app is built to scroll; reading and
checking takes about 0.12 ms a run (about 6 s at the limit on a 2-core laptop)."""


class WalkFileError(Exception):
    """A walk file that cannot be used; ``problems`` lists every reason with its place."""

    def __init__(self, problems: list[Problem]) -> None:
        self.problems = list(problems)
        super().__init__(str(self))

    def __str__(self) -> str:
        return "\n".join(str(p) for p in self.problems)


_TOML_LINE = r"\(at line (\d+), column (\d+)\)"  # compiled only for a file that is not TOML
_TOP_KEYS = ("schema", "job", "defaults", "source", "raceway", "run")


def _syntax_problem(exc: ValueError, file: str) -> Problem:
    """A ``tomllib.TOMLDecodeError`` as one problem, with its line."""
    text = str(exc)
    toml_line = re.compile(_TOML_LINE)
    match = toml_line.search(text)
    line = int(match.group(1)) if match else None
    sentence = toml_line.sub("", text).strip()
    column = f" (column {match.group(2)})" if match else ""
    return Problem(file, line, "file", None, None, f"this is not valid TOML{column}: {sentence}")


def check_walk_text(text: str, path: str | os.PathLike = "walk.toml"
                    ) -> tuple[Job | None, list[Problem]]:
    """Read and check a walk's text; return the Job (None when it cannot be built) and every
    problem found. Tables that fail on their own are left out of the cross-checks so one mistake
    is reported once."""
    with collector_held():  # tens of thousands of new tables and models, no cycles among them
        return _check_walk_text(text, path)


BOM = "\ufeff"
"""A UTF-8 byte-order mark, which some editors put at the start of a file: read past, and not
written back (gaugewalk writes UTF-8 without one)."""


def _check_walk_text(text: str, path: str | os.PathLike) -> tuple[Job | None, list[Problem]]:
    file = str(path)
    text = text.removeprefix(BOM)
    if len(text) > MAX_WALK_BYTES:
        return None, [Problem(file, None, "file", None, None, too_big(len(text.encode("utf-8"))))]
    if not text.strip():
        return None, [Problem(file, None, "file", None, None,
                              "the file is empty; a walk file starts with 'schema = 1'")]
    try:
        data = parse_toml(text)
    except RecursionError:
        return None, [Problem(file, None, "file", None, None,
                              "has lists or tables nested too deep to be a walk file")]
    except ValueError as exc:  # tomllib is imported only for text it was asked to read
        import tomllib

        if not isinstance(exc, tomllib.TOMLDecodeError):
            raise
        return None, [_syntax_problem(exc, file)]
    locator = _LazyLocator(text)
    try:
        data = migrate(data)
    except ValueError as exc:
        return None, [Problem(file, locator.key_line("", None, "schema"), "file", None, "schema",
                              str(exc))]

    problems: list[Problem] = []
    for key in data:
        if key not in _TOP_KEYS:
            problems.append(Problem(
                file, locator.key_line("", None, key) or locator.table_line(key), "file", None, key,
                f"'{key}' is not a part of a walk file; the parts are {', '.join(_TOP_KEYS)}",
            ))

    def one(model: type[BaseModel], raw, table: str, index: int | None,
            ident: str | None = None, number: int | None = None):
        try:
            return model.model_validate(raw, strict=True)  # "2" is not 2, "yes" not true
        except ValidationError as exc:
            problems.extend(problems_from_errors(exc.errors(), table, index, locator, file, ident,
                                                 number=number))
            return None

    header = one(JobHeader, data.get("job", {}), "job", None)
    defaults = one(Defaults, data.get("defaults", {}), "defaults", None)

    failed_targets: set[str] = set()

    def many(kind: str, model: type[BaseModel]):
        items, positions, bad = [], [], set()
        targets = failed_targets
        raw_list = data.get(kind, [])
        if not isinstance(raw_list, list):
            problems.append(Problem(file, locator.key_line("", None, kind), "file", None, kind,
                                    f"'{kind}' must be written as [[{kind}]] tables"))
            raw_list = []
        for i, raw in enumerate(raw_list):
            ident = raw.get("id") if isinstance(raw, dict) else None
            if isinstance(ident, str):
                item = one(model, raw, kind, i, ident)
            else:
                item = one(model, raw, kind, i, None, i + 1)
            if item is None:
                if isinstance(ident, str):
                    bad.add(ident)
                if isinstance(raw, dict) and isinstance(raw.get("to"), str):
                    targets.add(raw["to"])
            else:
                items.append(item)
                positions.append(i)
        return items, positions, bad

    raw_runs = data.get("run", [])
    if isinstance(raw_runs, list) and len(raw_runs) > MAX_RUNS:
        return None, [Problem(file, None, "file", None, "run", too_many(len(raw_runs)))]
    sources, source_positions, bad_sources = many("source", Source)
    runs, run_positions, bad_runs = many("run", Run)
    raceways, raceway_positions, bad_raceways = many("raceway", Raceway)

    if header is None or defaults is None:
        return None, problems
    # every part was validated above; building the Job again would re-run each run's checks
    job = Job.model_construct(schema=data.get("schema", SCHEMA_VERSION), job=header,
                              defaults=defaults, sources=sources, runs=runs, raceways=raceways)
    # cross-checks see only the tables that validated; map their positions back to the file
    shifted = _Shifted(locator, source_positions, run_positions, raceway_positions)
    problems.extend(check_references(job, shifted, file, bad_sources, bad_runs, failed_targets,
                                     bad_raceways))
    problems.sort(key=lambda p: (p.line is None, p.line or 0))
    return job, problems


class _LazyLocator(Locator):
    """A Locator that reads the text for line numbers only when a problem first asks for one: a
    clean file never does, and reading a big file's lines costs as much as validating it."""

    def __init__(self, text: str) -> None:
        self._text: str | None = text

    def _ready(self) -> None:
        if self._text is not None:
            text, self._text = self._text, None
            Locator.__init__(self, text)

    def table_line(self, table: str, index: int | None = None) -> int | None:
        self._ready()
        return Locator.table_line(self, table, index)

    def key_line(self, table: str, index: int | None, key: str) -> int | None:
        self._ready()
        return Locator.key_line(self, table, index, key)


class _Shifted(Locator):
    """A Locator whose run/source indices count only the tables that validated."""

    def __init__(self, base: Locator, source_positions: list[int], run_positions: list[int],
                 raceway_positions: list[int]):
        self._base = base
        self._sources = source_positions
        self._runs = run_positions
        self._raceways = raceway_positions

    def _map(self, table: str, index: int | None) -> int | None:
        if index is None:
            return None
        if table == "run":
            return self._runs[index] if index < len(self._runs) else index
        if table == "source":
            return self._sources[index] if index < len(self._sources) else index
        if table == "raceway":
            return self._raceways[index] if index < len(self._raceways) else index
        return index

    def table_line(self, table: str, index: int | None = None) -> int | None:
        return self._base.table_line(table, self._map(table, index))

    def key_line(self, table: str, index: int | None, key: str) -> int | None:
        return self._base.key_line(table, self._map(table, index), key)


def too_big(size: int) -> str:
    return (f"the file is {size / 1048576:.1f} MB; gaugewalk reads walk files up to "
            f"{MAX_WALK_BYTES // 1048576} MB (split the job into walks and merge what you need)")


def too_many(runs: int) -> str:
    return (f"the walk has {runs:,} runs; gaugewalk takes at most {MAX_RUNS:,} runs in one walk "
            "(split the job into walks)")


def loads_walk(text: str, path: str | os.PathLike = "walk.toml") -> Job:
    """Read a walk from its text; ``path`` is only for messages. Raises ``WalkFileError``."""
    job, problems = check_walk_text(text, path)
    if problems or job is None:
        raise WalkFileError(problems)
    return job


def read_walk_text(path: str | os.PathLike) -> str:
    """The file's text; a missing or unreadable file raises ``WalkFileError``."""
    p = Path(path)
    try:
        with open(p, "rb") as handle:
            raw = handle.read(MAX_WALK_BYTES + 1)
            if len(raw) > MAX_WALK_BYTES:
                size = os.fstat(handle.fileno()).st_size
                raise WalkFileError([_about_file(p, too_big(size))])
    except FileNotFoundError:
        raise WalkFileError([_about_file(p, "there is no such file")]) from None
    except IsADirectoryError:
        raise WalkFileError([_about_file(p, "this is a folder, not a walk file")]) from None
    except OSError as exc:
        raise WalkFileError([_about_file(p, f"cannot be read: {exc.strerror}")]) from None
    try:
        return raw.decode("utf-8")
    except UnicodeDecodeError as exc:
        line = raw[: exc.start].count(b"\n") + 1
        raise WalkFileError([Problem(str(p), line, "file", None, None,
                                     "is not UTF-8 text; save it as UTF-8")]) from None


def _about_file(path: Path, message: str) -> Problem:
    return Problem(str(path), None, "file", None, None, message)


def load_walk(path: str | os.PathLike) -> Job:
    """Read and check a walk file. Raises ``WalkFileError`` with every problem found."""
    return loads_walk(read_walk_text(path), path)


