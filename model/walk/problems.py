"""The one shape of a problem found in a walk, and where it stands in the file.

Public API:

- ``Problem(file, line, about, id, field, message, number=None)``: what it is about (``ABOUT``:
  the whole ``file``, the ``job`` header, the ``defaults``, a ``source`` or a ``run``, or a
  command-line ``option``), the id of that source or run (the option's name), the field, and
  one sentence. ``str(problem)`` is one line a foreman reads:
  ``shop.toml line 42, run R12, length: the length '8O' cannot be read ...``; ``where`` is its
  middle part (``run R12``), for showing only, never for reading back.
- ``Locator(text)``: finds the line of the N-th ``[[run]]`` / ``[[source]]`` table and of a key
  in it, in the TOML text as written.
- ``problems_from_errors(errors, table, index, locator, file, id=None, ...)``: pydantic errors
  of one table as Problems with their lines.
- ``clip(text)``: text from a file made safe for one line (control characters escaped, long
  words and runs of spaces shortened): the one way problems echo user text.
"""

import re
from collections.abc import Mapping, Sequence
from typing import Any, NamedTuple

from gaugewalk.model.walk.plain_text import shown

ABOUT = ("file", "job", "defaults", "source", "raceway", "run", "option")
"""What a problem can be about: the file as a whole, the ``[job]`` or ``[defaults]`` table, one
``[[source]]``, ``[[raceway]]`` or ``[[run]]`` (named by ``Problem.id``), or a command-line
option."""


class Problem(NamedTuple):
    """One thing wrong with a walk, and where."""

    file: str
    line: int | None
    about: str          # one of ABOUT
    id: str | None      # the source's or run's id (the option's name); None for file, job, defaults
    field: str | None   # "length", "load.value", None for the whole table
    message: str
    number: int | None = None   # 1-based place of a [[source]] or [[run]] with no usable id

    @property
    def where(self) -> str:
        """``run R12``, ``source LP1``, ``run number 3``, ``defaults``, ``job``, ``file``; an
        option is named as typed (``--service``)."""
        if self.about == "option":
            return self.id or ""
        if self.id is not None:
            return f"{self.about} {self.id}"
        if self.number is not None:
            return f"{self.about} number {self.number}"
        return self.about

    def brief(self) -> str:
        """The problem without its file and field: ``run R12: the run starts at ...``."""
        return f"{clip(self.where)}: {clip(self.message)}"

    def is_about(self, about: str, ids) -> bool:
        """True when the problem is about a ``source`` or ``run`` whose id is in ``ids``."""
        return self.about == about and self.id in ids

    def __str__(self) -> str:
        parts = []
        head = shown(self.file) if self.file else "walk"
        if self.line is not None:
            head += f" line {self.line}"
        parts.append(head)
        where = self.where
        if where:
            parts.append(clip(where))
        if self.field:
            parts.append(clip(self.field))
        return ", ".join(parts) + ": " + clip(self.message)

    def to_dict(self) -> dict:
        return {
            "file": self.file, "line": self.line, "where": self.where, "about": self.about,
            "id": self.id, "field": self.field, "message": self.message,
        }


# The patterns of this module are compiled where a problem is first reported (``re`` keeps them
# compiled after that): a walk with no problem never needs them, and compiling them at import
# cost every command that reads a walk about 0.2 ms.
_LONG_WORD = r"\S{61,}|\s{61,}"


def clip(text: str) -> str:
    """Keep a problem on one readable line: control characters and line breaks in an echoed
    value are shown escaped (``\\n``, ``gaugewalk.model.walk.plain_text.shown``), and any word
    or gap over 60 characters (a pasted id or value, a run of spaces) is shortened."""
    text = shown(text)
    return re.sub(_LONG_WORD, lambda m: f"{m.group(0)[:40]}…({len(m.group(0)):,} characters)", text)


# -- locating tables and keys in the text ------------------------------------------------------
_HEADER = r"^\s*(\[\[?)\s*([A-Za-z0-9_.\"' -]+?)\s*(\]\]?)\s*(#.*)?$"
_KEY = r"^\s*(\"[^\"]*\"|'[^']*'|[A-Za-z0-9_-]+)\s*(\.|=)"


class Locator:
    """Line numbers (1-based) of tables and keys in a walk file's text."""

    def __init__(self, text: str = "") -> None:
        self._tables: dict[tuple[str, int | None], int] = {}
        self._keys: dict[tuple[str, int | None], dict[str, int]] = {}
        counts: dict[str, int] = {}
        current: tuple[str, int | None] = ("", None)
        self._keys[current] = {}
        in_multiline: str | None = None
        header_re, key_re = re.compile(_HEADER), re.compile(_KEY)
        for number, line in enumerate(text.splitlines(), start=1):
            if in_multiline:
                if line.count(in_multiline) % 2 == 1:
                    in_multiline = None
                continue
            header = header_re.match(line)
            if header and header.group(1) == header.group(3)[::-1].replace("]", "["):
                name = header.group(2).strip().strip("\"'")
                base, _, sub = name.partition(".")
                if header.group(1) == "[[" and not sub:
                    index = counts.get(base, 0)
                    counts[base] = index + 1
                    current = (base, index)
                    self._tables[current] = number
                    self._keys.setdefault(current, {})
                elif sub and base in counts:  # [run.load] under the latest [[run]]
                    current = (base, counts[base] - 1)
                    self._keys[current].setdefault(sub.split(".")[0], number)
                else:
                    current = (name, None)
                    self._tables.setdefault(current, number)
                    self._keys.setdefault(current, {})
                continue
            key = key_re.match(line)
            if key:
                self._keys[current].setdefault(key.group(1).strip("\"'"), number)
                for quote in ('"""', "'''"):
                    if line.count(quote) % 2 == 1:
                        in_multiline = quote

    def table_line(self, table: str, index: int | None = None) -> int | None:
        """Line of ``[table]`` or of the ``index``-th ``[[table]]`` (0-based), or None."""
        return self._tables.get((table, index))

    def key_line(self, table: str, index: int | None, key: str) -> int | None:
        """Line of ``key`` in that table (top-level keys: ``table=""``), else the table's line."""
        found = self._keys.get((table, index), {}).get(key)
        return found if found is not None else self.table_line(table, index)


# -- pydantic errors -> problems ---------------------------------------------------------------

_FIELD_NAMES = {"from_": "from"}


def _friendly(error: Mapping[str, Any]) -> str:
    kind = error.get("type", "")
    ctx = error.get("ctx") or {}
    value = error.get("input")
    given = repr(value) if isinstance(value, str) else str(value)
    if kind == "missing":
        return "is missing"
    if kind == "extra_forbidden":
        return "is not a key gaugewalk knows (check the spelling)"
    if kind in ("greater_than", "greater_than_equal", "less_than", "less_than_equal"):
        words = {"greater_than": "above", "greater_than_equal": "at least",
                 "less_than": "below", "less_than_equal": "at most"}[kind]
        limit = next(iter(ctx.values()), "")
        if isinstance(limit, float):
            limit = f"{limit:g}"
        return f"must be {words} {limit}, not {given}"
    if kind in ("float_parsing", "float_type", "int_parsing", "int_type", "int_from_float"):
        whole = "a whole number" if kind.startswith("int") else "a number"
        return f"must be {whole}, not {given}"
    if kind == "literal_error":
        return f"must be {ctx.get('expected', 'one of the listed values')}, not {given}"
    if kind in ("string_type",):
        return f"must be text in quotes, not {given}"
    if kind in ("bool_type", "bool_parsing"):
        return f"must be true or false, not {given}"
    if kind.startswith("date"):
        return f"must be a date such as 2024-05-02, not {given}"
    if kind in ("model_type", "model_attributes_type", "dict_type"):
        return f"must be a table of keys, not {given}"
    if kind == "list_type":
        return f"must be a list, not {given}"
    if kind in ("string_too_short",):
        return "must not be empty"
    if kind in ("string_too_long",):
        return f"is too long (at most {ctx.get('max_length')} characters)"
    message = str(error.get("msg", "is not valid"))
    return message.removeprefix("Value error, ")


def problems_from_errors(
    errors: Sequence[Mapping[str, Any]],
    table: str,
    index: int | None,
    locator: Locator,
    file: str,
    id: str | None = None,
    *,
    number: int | None = None,
    about: str | None = None,
) -> list[Problem]:
    """Turn pydantic ``errors()`` for one table of the file into Problems with lines: about
    ``table`` (or ``about``, for an ``option``), the table's ``id`` or, without a usable id,
    its ``number`` (1-based)."""
    about = about or table
    out = []
    for error in errors:
        loc = [_FIELD_NAMES.get(str(p), str(p)) for p in error.get("loc", ())]
        field = ".".join(loc) or None
        message = _friendly(error)
        if field is None and "segments" in message:
            field = "segments"
        line = locator.key_line(table, index, loc[0] if loc else (field or ""))
        if field is None or error.get("type") in ("value_error", "assertion_error"):
            sentence = message
        else:
            sentence = f"'{field.split('.')[-1]}' {message}"
        out.append(Problem(file, line, about, id, field, sentence, number))
    return out
