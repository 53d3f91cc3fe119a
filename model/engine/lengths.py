"""Route lengths as people write them on a walk: ``120+35+2*12``, ``36m+8ft``, ``85 + 12 + 2*6``.

The text is tokenized by hand and read by a small recursive-descent parser; it is never evaluated.
Grammar (spaces allowed between tokens)::

    length   := term (("+" | "-") term)*
    term     := [count TIMES] quantity | quantity [TIMES count]
    quantity := NUMBER [unit] | NUMBER feet-unit NUMBER inch-unit    e.g. 12, 12ft, 36 m, 12'6"
    count    := NUMBER (a plain number: how many times the quantity repeats)
    TIMES    := "*" | "x" | "×"
    unit     := ft | foot | feet | ' | m | metre(s) | meter(s) | in | inch(es) | "

A number without a unit is in feet. ``-`` subtracts a term (``150-12`` for a piece that is not
pulled); the total must stay above zero. Parsing is one left-to-right pass: time is linear in the
input, whose length is capped at ``MAX_LENGTH_CHARS``.
"""

import math
import re
from typing import NamedTuple

MAX_LENGTH_CHARS = 200
"""Longest length text accepted [characters]."""

FEET_PER_METRE = 1.0 / 0.3048
"""International foot: 1 ft = 0.3048 m exactly [ft/m]."""

_UNIT_FEET: dict[str, float] = {
    "ft": 1.0, "foot": 1.0, "feet": 1.0, "'": 1.0, "’": 1.0,
    "m": FEET_PER_METRE, "metre": FEET_PER_METRE, "metres": FEET_PER_METRE,
    "meter": FEET_PER_METRE, "meters": FEET_PER_METRE,
    "in": 1.0 / 12.0, "inch": 1.0 / 12.0, "inches": 1.0 / 12.0, '"': 1.0 / 12.0, "”": 1.0 / 12.0,
}
_INCH_UNITS = frozenset({"in", "inch", "inches", '"', "”"})
_TIMES = frozenset({"*", "x", "×"})
_MAX_DIGITS = 12
_DIGITS = frozenset("0123456789.")
_PLAIN_SUM = re.compile(r"[0-9]{1,12}(?:\*[0-9]{1,12})?(?:\+[0-9]{1,12}(?:\*[0-9]{1,12})?)*")
"""Whole numbers of feet added, a term perhaps multiplied (``85+12+2*6``): most lengths on a walk."""


class LengthError(ValueError):
    """A length that cannot be read. ``position`` is the 0-based character index, ``reason`` a
    sentence; ``str()`` gives both."""

    def __init__(self, text: str, position: int, reason: str) -> None:
        self.text = text
        self.position = position
        self.reason = reason
        where = f"at character {position + 1}" if text else "in an empty length"
        super().__init__(f"{where}: {reason}" if text else reason)


class _Token(NamedTuple):
    """One token, immutable; a tuple rather than a frozen dataclass, whose every field is set
    through ``object.__setattr__`` (a third of the time a length took to read)."""

    kind: str      # "num", "unit", "op", "times", "end"
    text: str
    pos: int
    value: float = 0.0


def _tokenize(text: str) -> list[_Token]:
    tokens: list[_Token] = []
    i, n = 0, len(text)
    while i < n:
        ch = text[i]
        if ch.isspace():
            i += 1
            continue
        if ch in _DIGITS:
            start = i
            while i < n and text[i] in _DIGITS:
                i += 1
            raw = text[start:i]
            if raw.count(".") > 1 or raw == ".":
                raise LengthError(text, start, f"'{raw}' is not a number")
            if len(raw.replace(".", "")) > _MAX_DIGITS:
                raise LengthError(text, start, f"'{raw}' has too many digits")
            tokens.append(_Token("num", raw, start, float(raw)))
            continue
        if ch in "+-":
            tokens.append(_Token("op", ch, i))
            i += 1
            continue
        if ch in "*×":
            tokens.append(_Token("times", ch, i))
            i += 1
            continue
        if ch in "'\"’”":
            tokens.append(_Token("unit", ch, i))
            i += 1
            continue
        if ch.isalpha():
            start = i
            while i < n and text[i].isalpha() and text[i].isascii():
                i += 1
            if i == start:  # a non-ASCII letter
                raise LengthError(text, start, f"unexpected '{ch}'")
            word = text[start:i].lower()
            if word == "x":
                tokens.append(_Token("times", word, start))
            elif word in _UNIT_FEET:
                tokens.append(_Token("unit", word, start))
            elif word.endswith("x") and word[:-1] in _UNIT_FEET:  # 12ftx2
                tokens.append(_Token("unit", word[:-1], start))
                tokens.append(_Token("times", "x", i - 1))
            elif not tokens or tokens[-1].kind != "num":
                raise LengthError(text, start, f"expected a number, found '{text[start:i]}'")
            else:
                raise LengthError(
                    text, start, f"unknown unit '{text[start:i]}' (use ft, ', m, in or \")"
                )
            continue
        raise LengthError(text, i, f"unexpected '{ch}'")
    tokens.append(_Token("end", "", n))
    return tokens


class _Parser:
    def __init__(self, text: str, tokens: list[_Token]) -> None:
        self.text = text
        self.tokens = tokens
        self.i = 0

    def peek(self) -> _Token:
        return self.tokens[self.i]

    def take(self) -> _Token:
        tok = self.tokens[self.i]
        self.i += 1
        return tok

    def fail(self, tok: _Token, reason: str) -> LengthError:
        return LengthError(self.text, tok.pos, reason)

    def length(self) -> float:
        total = self.term()
        while self.peek().kind == "op":
            sign = 1.0 if self.take().text == "+" else -1.0
            total += sign * self.term()
        tok = self.peek()
        if tok.kind != "end":
            raise self.fail(tok, f"expected '+', '-' or the end, found '{tok.text}'")
        return total

    def term(self) -> float:
        tok = self.peek()
        if tok.kind != "num":
            found = f"'{tok.text}'" if tok.text else "the end"
            raise self.fail(tok, f"expected a number, found {found}")
        first = self.take()
        if self.peek().kind == "times":  # count * quantity
            self.take()
            if self.peek().kind != "num":
                raise self.fail(self.peek(), "expected a length after the multiplication sign")
            count = first.value
            value = self.quantity(self.take())
        else:
            value = self.quantity(first)
            count = 1.0
            if self.peek().kind == "times":  # quantity * count
                self.take()
                tok = self.peek()
                if tok.kind != "num":
                    raise self.fail(tok, "expected a count after the multiplication sign")
                count = self.take().value
                if self.peek().kind == "unit":
                    raise self.fail(self.peek(), "only one side of a multiplication has a unit")
        if count <= 0:
            raise self.fail(first, "a count must be above zero")
        if self.peek().kind == "times":
            raise self.fail(self.peek(), "one multiplication per term")
        return count * value

    def quantity(self, number: _Token) -> float:
        unit = "ft"
        written = self.peek().kind == "unit"
        if written:
            unit = self.take().text
        feet = number.value * _UNIT_FEET[unit]
        # 12'6": feet then inches, written together; the feet unit must be written, so a stray
        # space in "12 6in" is refused rather than read as 12 ft 6 in
        if written and unit in ("'", "’", "ft", "foot", "feet") and self.peek().kind == "num":
            nxt = self.tokens[self.i + 1]
            if nxt.kind == "unit" and nxt.text in _INCH_UNITS:
                inches = self.take()
                self.take()
                feet += inches.value / 12.0
        return feet


def parse_length(text: str) -> float:
    """Read a route length and return it in feet [ft].

    Parameters
    ----------
    text : str
        Terms joined by ``+`` or ``-``; each term a number with an optional unit (feet when
        absent), optionally multiplied by a count: ``120+35+2*12``, ``36m+8ft``, ``12'6"``.

    Returns
    -------
    float
        The total [ft], finite and above zero.

    Raises
    ------
    LengthError
        Empty, too long, junk, unknown unit, or a total that is not above zero; the message names
        the character position and the reason.
    """
    if not isinstance(text, str):
        raise LengthError("", 0, "a length must be text")
    if len(text) > MAX_LENGTH_CHARS:
        raise LengthError(text, MAX_LENGTH_CHARS, f"longer than {MAX_LENGTH_CHARS} characters")
    if not text.strip():
        raise LengthError("", 0, "the length is empty")
    if _PLAIN_SUM.fullmatch(text) is not None:
        total = _plain_sum(text)
        if total is not None:
            return total
    total = _Parser(text, _tokenize(text)).length()
    if not math.isfinite(total):
        raise LengthError(text, 0, "the length is not a finite number")
    if total <= 0:
        raise LengthError(text, 0, f"the total is {format_length_ft(total)}; a length must be above zero")
    return total


def _plain_sum(text: str) -> float | None:
    """A length of the ``_PLAIN_SUM`` form read as the parser reads it, the same float (the same
    products and sums, left to right); None where the parser is left to give its message (a count
    of zero, a total not above zero)."""
    total = 0.0
    for term in text.split("+"):
        count, times, quantity = term.partition("*")
        if times:
            a, b = float(count), float(quantity)
            if a == 0.0 or b == 0.0:
                return None
            total += a * b
        else:
            total += float(term)
    return total if total > 0.0 else None


def format_length_ft(ft: float) -> str:
    """Show a length in feet for people: ``135 ft``, ``142.1 ft`` (0.1 ft resolution) [ft]."""
    if not math.isfinite(ft):
        return f"{ft} ft"
    rounded = round(ft, 1)
    if rounded == int(rounded):
        return f"{int(rounded):,} ft"
    return f"{rounded:,.1f} ft"
