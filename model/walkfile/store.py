"""The walk on disk: a TOML file read, checked, migrated and written safely.

Public API:

- ``load_walk(path) -> Job`` and ``loads_walk(text, path="walk.toml") -> Job``: read, migrate to
  the current schema, check everything; raise ``WalkFileError`` listing every problem.
- ``check_walk_text(text, path) -> (Job | None, list[Problem])``: the same without raising, for
  ``gaugewalk check`` (the Job is None when the file cannot be built at all).
- ``dumps_walk(job) -> str``: the file text; keys in a fixed order, defaults left out, so saving
  twice gives the same bytes and a reload gives the same Job.
- ``save_walk(job, path, *, allow_comment_loss=True, expected=None) -> SaveNotice | None``: atomic
  write with a backup of the previous file at ``backup_path(path)`` (``walk.toml~``). With
  ``expected`` (the ``Fingerprint`` taken when the walk was read) it raises ``ChangedOnDisk`` and
  writes nothing if the file's content is no longer what was read. The TOML writer cannot
  keep comments: when the file on disk has comments the save returns a ``SaveNotice`` saying so
  (the backup keeps them), or, with ``allow_comment_loss=False``, raises ``CommentsWouldBeLost``
  before writing anything.
- ``comment_lines(text) -> int``: lines of the text that hold a comment.
- ``fingerprint(path) -> Fingerprint | None``: size, mtime and SHA-256 of the file now.
- ``MAX_WALK_BYTES``, ``MAX_RUNS``: the largest walk file and the most runs read or written.
- ``new_walk(name=..., site=..., walked_by=..., walked_on=..., service_system=...) -> Job``.
- ``MIGRATIONS``: ``{N: function(dict) -> dict}`` turning schema N into N+1.

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

    [[run]]
    id = "F1"
    from = "MDP"
    to = "LP1"
    length = "85+12+2*6"
    load = { value = 16, unit = "A" }
"""

from __future__ import annotations

import gc
import glob
import math
import os
import re
import tempfile
import time
import tomllib
from collections.abc import Callable
from dataclasses import dataclass
from datetime import date
from functools import lru_cache
from pathlib import Path

import tomli_w
from pydantic import BaseModel, ValidationError

from gaugewalk.model.walk.job import SCHEMA_VERSION, Defaults, Job, JobHeader, Run, Source
from gaugewalk.model.walk.checks import Locator, Problem, check_references, problems_from_errors

BACKUP_SUFFIX = "~"
"""The previous version of ``walk.toml`` is kept beside it as ``walk.toml~``."""

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


@dataclass(frozen=True)
class SaveNotice:
    """Something the person saving should know: the file had comments the new file lacks."""

    path: Path
    backup: Path
    comment_lines: int

    @property
    def message(self) -> str:
        return (
            f"{self.path.name} had {self.comment_lines} comment line(s); gaugewalk does not keep "
            f"comments when it writes the file. The previous file, comments included, is in "
            f"{self.backup.name}."
        )

    def __str__(self) -> str:
        return self.message


@dataclass(frozen=True)
class Fingerprint:
    """What a walk file held when it was read: ``size`` [bytes], ``mtime_ns`` and ``sha256``.
    Two fingerprints match when size and hash do (a touch that changes only the time is not a
    change of content)."""

    size: int
    mtime_ns: int
    sha256: str

    @classmethod
    def of(cls, data: bytes, mtime_ns: int = 0) -> "Fingerprint":
        import hashlib

        return cls(len(data), mtime_ns, hashlib.sha256(data).hexdigest())

    def matches(self, other: "Fingerprint | None") -> bool:
        return other is not None and (self.size, self.sha256) == (other.size, other.sha256)


def fingerprint(path: str | os.PathLike) -> Fingerprint | None:
    """The file's fingerprint now; None when there is no file."""
    try:
        with open(path, "rb") as handle:
            mtime = os.fstat(handle.fileno()).st_mtime_ns
            return Fingerprint.of(handle.read(), mtime)
    except FileNotFoundError:
        return None


class ChangedOnDisk(Exception):
    """Raised by ``save_walk(..., expected=...)`` when someone else changed the file since it was
    read; nothing is written."""

    def __init__(self, path: Path) -> None:
        self.path = Path(path)
        super().__init__(
            f"{self.path}: changed on disk since you opened it (another program or person saved "
            "it); not saved, so their changes are not overwritten. Open it again to see them"
        )


class CommentsWouldBeLost(Exception):
    """Raised by ``save_walk(..., allow_comment_loss=False)`` before anything is written."""

    def __init__(self, notice: SaveNotice) -> None:
        self.notice = notice
        super().__init__(
            f"{notice.path.name} has {notice.comment_lines} comment line(s) that saving would "
            "drop; save anyway to keep them only in the backup"
        )


# -- migrations --------------------------------------------------------------------------------

def _v0_to_v1(data: dict) -> dict:
    """Schema 0 (the first draft, before the file carried a ``schema`` key) wrote a run's load as
    flat keys ``amps``, ``va``, ``kva``, ``w``, ``kw`` with ``pf`` and called ``distributed``
    ``spread``. Schema 1 nests the load: ``load = { value = 16, unit = "A", pf = 0.9 }``."""
    units = {"amps": "A", "va": "VA", "kva": "kVA", "w": "W", "kw": "kW"}
    out = dict(data)
    runs = []
    for run in data.get("run", []):
        if not isinstance(run, dict):
            runs.append(run)
            continue
        run = dict(run)
        given = [k for k in units if k in run]
        if len(given) == 1 and "load" not in run:
            key = given[0]
            load = {"value": run.pop(key), "unit": units[key]}
            if "pf" in run:
                load["pf"] = run.pop("pf")
            run["load"] = load
        if "spread" in run and "distributed" not in run:
            run["distributed"] = run.pop("spread")
        runs.append(run)
    if "run" in data:
        out["run"] = runs
    out["schema"] = 1
    return out


MIGRATIONS: dict[int, Callable[[dict], dict]] = {0: _v0_to_v1}
"""``MIGRATIONS[n]`` turns the data of a schema-n file into schema n+1."""


def migrate(data: dict) -> dict:
    """Bring parsed file data up to ``SCHEMA_VERSION``, one step at a time. A file without a
    ``schema`` key is schema 0. Raises ``ValueError`` for a schema newer than this code."""
    version = data.get("schema", 0)
    if not isinstance(version, int) or isinstance(version, bool) or version < 0:
        raise ValueError(f"'schema' must be a whole number, not {version!r}")
    if version > SCHEMA_VERSION:
        raise ValueError(
            f"the file is schema {version}, written by a newer gaugewalk; this one reads up to "
            f"schema {SCHEMA_VERSION}"
        )
    while version < SCHEMA_VERSION:
        data = MIGRATIONS[version](data)
        version += 1
    return data


# -- reading -----------------------------------------------------------------------------------

_TOML_LINE_RE = re.compile(r"\(at line (\d+), column (\d+)\)")
_TOP_KEYS = ("schema", "job", "defaults", "source", "run")


def _syntax_problem(exc: tomllib.TOMLDecodeError, file: str) -> Problem:
    text = str(exc)
    match = _TOML_LINE_RE.search(text)
    line = int(match.group(1)) if match else None
    sentence = _TOML_LINE_RE.sub("", text).strip()
    column = f" (column {match.group(2)})" if match else ""
    return Problem(file, line, "file", None,
                   f"this is not valid TOML{column}: {sentence}")


def check_walk_text(text: str, path: str | os.PathLike = "walk.toml") -> tuple[Job | None, list[Problem]]:
    """Read and check a walk's text; return the Job (None when it cannot be built) and every
    problem found. Tables that fail on their own are left out of the cross-checks so one mistake
    is reported once."""
    # Tens of thousands of new tables and models and no reference cycles among them: the cyclic
    # collector's passes only cost time (a quarter of it at 50,000 runs), so they wait.
    collecting = gc.isenabled()
    gc.disable()
    try:
        return _check_walk_text(text, path)
    finally:
        if collecting:
            gc.enable()


def _check_walk_text(text: str, path: str | os.PathLike) -> tuple[Job | None, list[Problem]]:
    file = str(path)
    if len(text) > MAX_WALK_BYTES:
        return None, [Problem(file, None, "file", None, _too_big(len(text.encode("utf-8"))))]
    if not text.strip():
        return None, [Problem(file, None, "file", None,
                              "the file is empty; a walk file starts with 'schema = 1'")]
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        return None, [_syntax_problem(exc, file)]
    except RecursionError:
        return None, [Problem(file, None, "file", None,
                              "has lists or tables nested too deep to be a walk file")]
    locator = _LazyLocator(text)
    try:
        data = migrate(data)
    except ValueError as exc:
        return None, [Problem(file, locator.key_line("", None, "schema"), "file", "schema", str(exc))]

    problems: list[Problem] = []
    for key in data:
        if key not in _TOP_KEYS:
            problems.append(Problem(
                file, locator.key_line("", None, key) or locator.table_line(key), "file", key,
                f"'{key}' is not a part of a walk file; the parts are {', '.join(_TOP_KEYS)}",
            ))

    def one(model: type[BaseModel], raw, table: str, index: int | None, where: str):
        try:
            return model.model_validate(raw)
        except ValidationError as exc:
            problems.extend(problems_from_errors(exc.errors(), table, index, locator, file, where))
            return None

    header = one(JobHeader, data.get("job", {}), "job", None, "job")
    defaults = one(Defaults, data.get("defaults", {}), "defaults", None, "defaults")

    failed_targets: set[str] = set()

    def many(kind: str, model: type[BaseModel]):
        items, positions, bad = [], [], set()
        targets = failed_targets
        raw_list = data.get(kind, [])
        if not isinstance(raw_list, list):
            problems.append(Problem(file, locator.key_line("", None, kind), "file", kind,
                                    f"'{kind}' must be written as [[{kind}]] tables"))
            raw_list = []
        for i, raw in enumerate(raw_list):
            ident = raw.get("id") if isinstance(raw, dict) else None
            where = f"{kind} {ident}" if isinstance(ident, str) else f"{kind} number {i + 1}"
            item = one(model, raw, kind, i, where)
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
        return None, [Problem(file, None, "file", "run", _too_many(len(raw_runs)))]
    sources, source_positions, bad_sources = many("source", Source)
    runs, run_positions, bad_runs = many("run", Run)

    if header is None or defaults is None:
        return None, problems
    # every part was validated above; building the Job again would re-run each run's checks
    job = Job.model_construct(schema=data.get("schema", SCHEMA_VERSION), job=header,
                              defaults=defaults, sources=sources, runs=runs)
    # cross-checks see only the tables that validated; map their positions back to the file
    shifted = _Shifted(locator, source_positions, run_positions)
    problems.extend(check_references(job, shifted, file, bad_sources, bad_runs, failed_targets))
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

    def __init__(self, base: Locator, source_positions: list[int], run_positions: list[int]):
        self._base = base
        self._sources = source_positions
        self._runs = run_positions

    def _map(self, table: str, index: int | None) -> int | None:
        if index is None:
            return None
        if table == "run":
            return self._runs[index] if index < len(self._runs) else index
        if table == "source":
            return self._sources[index] if index < len(self._sources) else index
        return index

    def table_line(self, table: str, index: int | None = None) -> int | None:
        return self._base.table_line(table, self._map(table, index))

    def key_line(self, table: str, index: int | None, key: str) -> int | None:
        return self._base.key_line(table, self._map(table, index), key)


def _too_big(size: int) -> str:
    return (f"the file is {size / 1048576:.1f} MB; gaugewalk reads walk files up to "
            f"{MAX_WALK_BYTES // 1048576} MB (split the job into walks and merge what you need)")


def _too_many(runs: int) -> str:
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
                raise WalkFileError([Problem(str(p), None, "file", None, _too_big(size))])
    except FileNotFoundError:
        raise WalkFileError([Problem(str(p), None, "file", None, "there is no such file")]) from None
    except IsADirectoryError:
        raise WalkFileError([Problem(str(p), None, "file", None, "this is a folder, not a walk file")]) from None
    except OSError as exc:
        raise WalkFileError([Problem(str(p), None, "file", None, f"cannot be read: {exc.strerror}")]) from None
    try:
        return raw.decode("utf-8")
    except UnicodeDecodeError as exc:
        line = raw[: exc.start].count(b"\n") + 1
        raise WalkFileError([Problem(str(p), line, "file", None,
                                     "is not UTF-8 text; save it as UTF-8")]) from None


def load_walk(path: str | os.PathLike) -> Job:
    """Read and check a walk file. Raises ``WalkFileError`` with every problem found."""
    return loads_walk(read_walk_text(path), path)


# -- writing -----------------------------------------------------------------------------------

def _value(value) -> str:
    """One TOML value, written the same way every time."""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, int):
        return str(value)
    if isinstance(value, float):
        if not math.isfinite(value):
            raise ValueError(f"cannot write {value!r} to a walk file")
        if value.is_integer() and abs(value) < 1e15:
            return str(int(value))
        return repr(value)
    if isinstance(value, str):
        if _NEEDS_ESCAPE.search(value) is None:
            return f'"{value}"'
        return tomli_w.dumps({"v": value})[4:-1]
    if isinstance(value, date):
        return tomli_w.dumps({"v": value})[4:-1]
    if isinstance(value, _Inline):
        if not value:
            return "{}"
        return "{ " + ", ".join(f"{k} = {_value(v)}" for k, v in value) + " }"
    if isinstance(value, dict):
        if not value:
            return "{}"
        return "{ " + ", ".join(f"{_key(k)} = {_value(v)}" for k, v in value.items()) + " }"
    if isinstance(value, list):
        if not value:
            return "[]"
        if any(isinstance(v, (dict, _Inline)) for v in value):
            return "[\n" + "".join(f"    {_value(v)},\n" for v in value) + "]"
        return "[" + ", ".join(_value(v) for v in value) + "]"
    raise TypeError(f"cannot write {type(value).__name__} to a walk file")


_BARE_KEY = re.compile(r"^[A-Za-z0-9_-]+$")
_NEEDS_ESCAPE = re.compile(r'[\x00-\x08\x0a-\x1f\x7f"\\]')
"""Characters a TOML basic string escapes (tomli-w's rules); strings without them are written
as they are."""


def _key(key: str) -> str:
    return key if _BARE_KEY.match(key) else _value(key)


_PLAIN = (str, int, float, bool, date, type(None))
_UNSET = object()


@lru_cache(maxsize=None)
def _plan(cls: type[BaseModel]) -> tuple[tuple[str, str, bool, object], ...]:
    """For each field in order: (attribute, key as written, required, default)."""
    plan = []
    for name, field in cls.model_fields.items():
        if field.is_required():
            default = _UNSET
        elif field.default_factory is not None:
            default = field.default_factory()
        else:
            default = field.default
        plan.append((name, _key(field.alias or name), field.is_required(), default))
    return tuple(plan)


def _plain(model: BaseModel):
    """What ``model_dump(by_alias=True, exclude_defaults=True)`` gives for the values a walk
    holds (plain values, nested models, lists of them), as (key, value) pairs; None for anything
    else, so the caller falls back to ``model_dump``."""
    d = model.__dict__
    out = []
    for name, key, required, default in _plan(type(model)):
        value = d[name]
        if not required and value == default:
            continue
        if isinstance(value, BaseModel):
            value = _plain(value)
            if value is None:
                return None
            value = _Inline(value)
        elif isinstance(value, list):
            items = []
            for v in value:
                if isinstance(v, BaseModel):
                    v = _plain(v)
                    if v is None:
                        return None
                    v = _Inline(v)
                elif not isinstance(v, _PLAIN):
                    return None
                items.append(v)
            value = items
        elif not isinstance(value, _PLAIN):
            return None
        out.append((key, value))
    return out


class _Inline(list):
    """(key, value) pairs written as an inline table."""


def _table(model: BaseModel) -> list[str]:
    """``key = value`` lines in field order, fields at their defaults left out. Required
    fields are always written."""
    pairs = _plain(model)
    if pairs is not None:
        return [f"{key} = {_value(value)}" for key, value in pairs]
    data = model.model_dump(by_alias=True, exclude_defaults=True, mode="python")
    lines = []
    for name, field in type(model).model_fields.items():
        key = field.alias or name
        if key in data:
            value = data[key]
        elif field.is_required():
            value = getattr(model, name)
        else:
            continue
        lines.append(f"{_key(key)} = {_value(value)}")
    return lines


def dumps_walk(job: Job) -> str:
    """The walk file text for ``job``: deterministic, defaults left out."""
    out = [f"schema = {SCHEMA_VERSION}", ""]
    for name, model in (("job", job.job), ("defaults", job.defaults)):
        lines = _table(model)
        if lines:
            out += [f"[{name}]", *lines, ""]
    for source in job.sources:
        out += ["[[source]]", *_table(source), ""]
    for run in job.runs:
        out += ["[[run]]", *_table(run), ""]
    return "\n".join(out).rstrip("\n") + "\n"


_COMMENT_SCAN = re.compile(r'"""|\'\'\'|"(?:[^"\\]|\\.)*"|\'[^\']*\'|#')


def comment_lines(text: str) -> int:
    """How many lines carry a TOML comment (a ``#`` outside any string)."""
    if "#" not in text:  # the usual case, and every save asks: no line-by-line scan
        return 0
    count = 0
    in_multi: str | None = None
    for line in text.splitlines():
        found = False
        for token in _COMMENT_SCAN.finditer(line):
            t = token.group(0)
            if in_multi:
                if t == in_multi:
                    in_multi = None
                continue
            if t in ('"""', "'''"):
                in_multi = t
            elif t == "#":
                found = True
                break
        count += found
    return count


def backup_path(path: str | os.PathLike) -> Path:
    """Where the previous version of a walk file is kept: ``walk.toml~`` beside it."""
    p = Path(path)
    return p.with_name(p.name + BACKUP_SUFFIX)


def _fsync_dir(folder: Path) -> None:
    try:
        fd = os.open(folder, os.O_RDONLY | getattr(os, "O_DIRECTORY", 0))
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        pass
    finally:
        os.close(fd)


def _temp_beside(path: Path, tag: str) -> str:
    fd, name = tempfile.mkstemp(prefix=f".{path.name}.", suffix=f".{tag}", dir=path.parent)
    os.close(fd)
    os.unlink(name)
    return name


def atomic_write(path: str | os.PathLike, data: bytes, *, keep_backup: bool = True,
                 create_only: bool = False) -> None:
    """Write ``data`` to ``path`` so that a crash leaves either the old or the new file whole:
    a temporary file in the same folder, flushed and fsynced, then ``os.replace``, then the folder
    fsynced. With ``keep_backup`` the old file becomes ``backup_path(path)`` first. With
    ``create_only`` the file must not exist yet (``FileExistsError`` otherwise, even when another
    process creates it in the meantime: the temporary is hard-linked into place, never renamed
    over)."""
    path = Path(path)
    folder = path.parent if str(path.parent) else Path(".")
    try:
        mode = os.stat(path).st_mode & 0o7777
        existed = True
    except FileNotFoundError:
        umask = os.umask(0)
        os.umask(umask)
        mode = 0o666 & ~umask
        existed = False
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=folder)
    staged = None
    try:
        with os.fdopen(fd, "wb") as handle:
            handle.write(data)
            handle.flush()
            os.fsync(handle.fileno())
        os.chmod(tmp, mode)
        if existed and keep_backup:
            staged = _temp_beside(path, "bak")
            try:
                os.link(path, staged)
            except OSError:  # no hard links here: copy the bytes
                with open(path, "rb") as src, open(staged, "wb") as dst:
                    dst.write(src.read())
                    dst.flush()
                    os.fsync(dst.fileno())
            os.replace(staged, backup_path(path))
        if create_only:
            os.link(tmp, path)
            os.unlink(tmp)
        else:
            os.replace(tmp, path)
    except BaseException:
        for leftover in (tmp, staged):
            if leftover:
                try:
                    os.unlink(leftover)
                except OSError:
                    pass
        raise
    _fsync_dir(folder)
    _sweep_leftovers(path)


LEFTOVER_AGE_S = 600.0
"""A temporary file of a save older than this [s] was left by a save that was killed."""


def _sweep_leftovers(path: Path) -> None:
    """Remove the hidden temporaries (``.NAME.XXXX.tmp``/``.bak``) that killed saves left beside
    the walk; young ones may belong to a save under way and are kept."""
    now = time.time()
    for leftover in path.parent.glob(f".{glob.escape(path.name)}.*"):
        if leftover.suffix not in (".tmp", ".bak"):
            continue
        try:
            if now - leftover.stat().st_mtime > LEFTOVER_AGE_S:
                leftover.unlink()
        except OSError:
            pass


def save_walk(
    job: Job, path: str | os.PathLike, *, allow_comment_loss: bool = True,
    expected: Fingerprint | None = None,
) -> SaveNotice | None:
    """Write the walk atomically, keeping the previous file as ``walk.toml~``.

    Returns a ``SaveNotice`` when the file on disk had comments (they are not in the new file;
    the backup keeps them), else None. With ``allow_comment_loss=False`` and comments on disk,
    raises ``CommentsWouldBeLost`` and writes nothing. Saving an unchanged walk leaves the file
    and its backup alone. With ``expected`` (the fingerprint of what was read) a file whose
    content differs now raises ``ChangedOnDisk``; over ``MAX_RUNS`` or ``MAX_WALK_BYTES`` raises
    ``WalkFileError``; in both cases nothing is written.
    """
    path = Path(path)
    if len(job.runs) > MAX_RUNS:
        raise WalkFileError([Problem(str(path), None, "file", "run", _too_many(len(job.runs)))])
    text = dumps_walk(job)
    data = text.encode("utf-8")
    if len(data) > MAX_WALK_BYTES:
        raise WalkFileError([Problem(str(path), None, "file", None, _too_big(len(data)))])
    try:
        old = path.read_bytes()
    except FileNotFoundError:
        old = None
    if old == data:
        return None
    if expected is not None and not expected.matches(None if old is None else Fingerprint.of(old)):
        raise ChangedOnDisk(path)
    notice = None
    if old is not None:
        n = comment_lines(old.decode("utf-8", errors="replace"))
        if n:
            notice = SaveNotice(path, backup_path(path), n)
            if not allow_comment_loss:
                raise CommentsWouldBeLost(notice)
    atomic_write(path, data)
    return notice


def pending_notice(job_path: str | os.PathLike) -> SaveNotice | None:
    """What a save over this file would report, without saving (for a face to ask first)."""
    path = Path(job_path)
    try:
        n = comment_lines(path.read_text(encoding="utf-8", errors="replace"))
    except OSError:
        return None
    return SaveNotice(path, backup_path(path), n) if n else None


def new_walk(
    *,
    name: str = "",
    site: str = "",
    walked_by: str = "",
    walked_on: date | None = None,
    service_system: str | None = None,
    service_id: str = "SVC",
) -> Job:
    """A fresh walk; with ``service_system`` it starts with the service as its first source."""
    sources = []
    if service_system:
        sources.append(Source(id=service_id, kind="service", system=service_system, name="Service"))
    return Job(
        job=JobHeader(name=name, site=site, walked_by=walked_by, walked_on=walked_on),
        sources=sources,
    )


# -- JSON Schema -------------------------------------------------------------------------------

SCHEMA_FILE = Path(__file__).with_name("walk.schema.json")
"""The committed JSON Schema of the walk file (a test keeps it equal to ``json_schema()``)."""


def json_schema() -> dict:
    """JSON Schema of the walk file, generated from the pydantic model (file key names)."""
    schema = Job.model_json_schema(by_alias=True, mode="validation")
    return {
        "$schema": "https://json-schema.org/draft/2020-12/schema",
        "$id": "https://gaugewalk.invalid/walk.schema.json",
        "title": "gaugewalk walk file",
        "description": f"A site walk of electrical runs, walk file schema {SCHEMA_VERSION} (TOML).",
        **{k: v for k, v in schema.items() if k not in ("title", "description")},
    }


def json_schema_text() -> str:
    """``json_schema()`` as the text committed in ``model/walk.schema.json``."""
    import json

    return json.dumps(json_schema(), indent=2, sort_keys=True, ensure_ascii=False) + "\n"
