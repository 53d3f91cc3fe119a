"""Writing a walk file: the text (``dumps_walk``) and the save that keeps the previous file.

Public API:

- ``dumps_walk(job, written=None) -> str``: the file text; keys in a fixed order, defaults left
  out, so saving twice gives the same bytes and a reload gives the same Job. ``written`` (a
  ``Written`` the caller keeps) spares writing again the runs written last time.
- ``save_walk(job, path, *, allow_comment_loss=True, expected=None, written=None)
  -> SaveNotice | None``: an
  atomic write (``gaugewalk.model.walkfile.atomic``) with a backup of the previous file at
  ``backup_path(path)`` (``walk.toml~``). With ``expected`` (the ``Fingerprint`` taken when the
  walk was read) it raises ``ChangedOnDisk`` and writes nothing if the file's content is no
  longer what was read. Over ``MAX_RUNS`` or ``MAX_WALK_BYTES`` it raises ``WalkFileError``
  and writes nothing, so a file it writes always opens again. The TOML writer cannot keep
  comments: when the file on disk has comments the save returns a ``SaveNotice`` saying so (the
  backup keeps them), or, with ``allow_comment_loss=False``, raises ``CommentsWouldBeLost``
  before writing anything.
- ``pending_notice(path)``: what a save over the file would report, without saving.
- ``read_only_reason(path) -> str | None``: why a walk file must not be replaced (its mode
  gives nobody write permission, or this user cannot write it); ``ReadOnlyWalk`` (a
  ``PermissionError``) is what ``save_walk`` raises then, writing nothing.
- ``comment_lines(text) -> int``: lines of the text that hold a comment.
"""

from __future__ import annotations

import errno
import math
import os
import re
import stat
from dataclasses import dataclass
from datetime import date
from functools import lru_cache
from itertools import compress, count, islice
from operator import is_not
from pathlib import Path

import tomli_w
from pydantic import BaseModel

from gaugewalk.model.walk.job import SCHEMA_VERSION, Job
from gaugewalk.model.walk.plain_text import shown
from gaugewalk.model.walk.problems import Problem
from gaugewalk.model.walkfile.atomic import atomic_write, backup_path
from gaugewalk.model.walkfile.fingerprint import ChangedOnDisk, Fingerprint
from gaugewalk.model.walkfile.read import MAX_RUNS, MAX_WALK_BYTES, WalkFileError, too_big, too_many


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


def read_only_reason(path: str | os.PathLike) -> str | None:
    """Why the walk file at ``path`` must not be replaced, or None (no file, or writable). A
    file whose mode gives nobody write permission (``chmod 444``) is read-only even for root:
    someone made it so on purpose."""
    try:
        mode = os.stat(path).st_mode
    except OSError:
        return None
    if mode & 0o222 and os.access(path, os.W_OK):
        return None
    return (f"the walk is read-only ({stat.filemode(mode)}); gaugewalk does not replace a "
            f"read-only walk: make it writable (chmod u+w {shown(Path(path).name)}) to save it")


class ReadOnlyWalk(PermissionError):
    """Raised by ``save_walk`` over a read-only walk; nothing is written."""

    def __init__(self, path: Path, reason: str) -> None:
        super().__init__(errno.EACCES, reason, str(path))


class CommentsWouldBeLost(Exception):
    """Raised by ``save_walk(..., allow_comment_loss=False)`` before anything is written."""

    def __init__(self, notice: SaveNotice) -> None:
        self.notice = notice
        super().__init__(
            f"{notice.path.name} has {notice.comment_lines} comment line(s) that saving would "
            "drop; save anyway to keep them only in the backup"
        )


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
        default = (_UNSET if field.is_required()
                   else field.get_default(call_default_factory=True))
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


class Written:
    """Each source's, raceway's and run's text as last written, section by section, beside the
    very objects they were written from (a ``dumps_walk`` of the same lists again makes only
    the text of an object that is not the one in its place then). Replaced whole by each
    ``dumps_walk`` (one assignment), so a save in another thread meanwhile never sees half of
    it."""

    __slots__ = ("sections",)

    def __init__(self) -> None:
        self.sections: dict[str, tuple[list[BaseModel], list[str]]] = {}

    def __len__(self) -> int:
        return sum(len(items) for items, _texts in self.sections.values())


def _item_text(heading: str, item: BaseModel) -> str:
    return "\n".join([heading, *_table(item), ""])


def _texts(heading: str, items: list[BaseModel],
           before: tuple[list[BaseModel], list[str]] | None) -> list[str]:
    """The text of each of ``items`` (ending in a blank line), those written ``before`` taken
    from there: where the list is as it was but for one object put in place of another (a run
    stored), only that one's text is made, with no pass over the others in Python; otherwise
    each is looked up by object."""
    if before is None:
        return [_item_text(heading, item) for item in items]
    old_items, old_texts = before
    if len(old_items) == len(items):
        moved = list(islice(compress(count(), map(is_not, items, old_items)), 2))
        if len(moved) < 2:
            texts = list(old_texts)
            for i in moved:
                texts[i] = _item_text(heading, items[i])
            return texts
    # the old objects are alive (held in ``before``): an id names one of them only
    by_id = {id(item): text for item, text in zip(old_items, old_texts, strict=True)}
    return [by_id.get(id(item)) or _item_text(heading, item) for item in items]


def dumps_walk(job: Job, written: Written | None = None) -> str:
    """The walk file text for ``job``: deterministic, defaults left out.

    With ``written`` (what an earlier call left in it) a source, raceway or run that is the very
    object written then is not written again: its text is taken from there. Only for a caller
    whose sources and runs are never changed in place once written (the editing session puts
    new objects in its lists); ``written`` is left holding this walk's texts."""
    out = [f"schema = {SCHEMA_VERSION}", ""]
    for name, model in (("job", job.job), ("defaults", job.defaults)):
        lines = _table(model)
        if lines:
            out += [f"[{name}]", *lines, ""]
    if written is None:
        for source in job.sources:
            out += ["[[source]]", *_table(source), ""]
        for raceway in job.raceways:
            out += ["[[raceway]]", *_table(raceway), ""]
        for run in job.runs:
            out += ["[[run]]", *_table(run), ""]
        return "\n".join(out).rstrip("\n") + "\n"
    parts = ["\n".join(out)]  # "\n".join(a + b) == "\n".join(a) + "\n" + "\n".join(b)
    before = written.sections
    sections: dict[str, tuple[list[BaseModel], list[str]]] = {}
    listed: tuple[tuple[str, list[BaseModel]], ...] = (
        ("[[source]]", list(job.sources)), ("[[raceway]]", list(job.raceways)),
        ("[[run]]", list(job.runs)))
    for heading, items in listed:
        texts = _texts(heading, items, before.get(heading))
        sections[heading] = (items, texts)
        parts += texts
    written.sections = sections
    return "\n".join(parts).rstrip("\n") + "\n"


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


def save_walk(
    job: Job, path: str | os.PathLike, *, allow_comment_loss: bool = True,
    expected: Fingerprint | None = None, written: Written | None = None,
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
        raise WalkFileError([Problem(str(path), None, "file", None, "run",
                                     too_many(len(job.runs)))])
    text = dumps_walk(job, written)
    data = text.encode("utf-8")
    if len(data) > MAX_WALK_BYTES:
        raise WalkFileError([Problem(str(path), None, "file", None, None, too_big(len(data)))])
    try:
        old = path.read_bytes()
    except FileNotFoundError:
        old = None
    if old == data:
        return None
    if old is not None:
        reason = read_only_reason(path)
        if reason is not None:
            raise ReadOnlyWalk(path, reason)
    if expected is not None and not expected.holds(old):
        raise ChangedOnDisk(path)
    notice = None
    if old is not None:
        # no ``#`` byte: no comment, and no decoding of the whole file to find none
        n = comment_lines(old.decode("utf-8", errors="replace")) if b"#" in old else 0
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
