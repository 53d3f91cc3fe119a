"""The one rule for text that comes from outside gaugewalk: walk files, lock files, drafts, other
people, file names and the system's error text.

Such text is plain text everywhere it goes (terminal, app, notifications, reports, CSV): it is
never markup, a link or an action, and never a terminal control. Here is what that means for
the characters in it:

- *Control characters* are the C0 and C1 controls and DEL (Unicode category Cc: ESC starts a
  terminal command, a newline forges a line of a table), the line and paragraph separators
  (U+2028, U+2029) and the bidirectional embeddings, overrides and isolates (U+202A-U+202E,
  U+2066-U+2069), which reorder what a terminal shows.
- Where they cannot belong (ids, names, a run's ``to``, a site, a put-up label: one line of plain
  text) they are refused with a sentence naming the character (``no_control``); the field is
  named by whoever reports it.
- Where they are kept (notes: a note may run over lines) they stay in the file as written and are
  shown escaped (``shown``): ``\\x1b``, ``\\n``, ``\\u202e``, so a person sees that they are there.
- The faces never build markup from such text: the app puts it in ``Text``/``Content`` objects or
  escapes it, and notifications are made with ``markup=False``
  (``gaugewalk.tui.app.plain``); the reports escape it for HTML and Markdown.

Public API: ``CONTROL_CHARS``, ``first_control(text)``, ``no_control(text)``, ``shown(text)``,
``shown_lines(text)``, ``describe_char(ch)``.
"""

from __future__ import annotations

import re

_BIDI = (*range(0x202A, 0x202F), *range(0x2066, 0x206A))
CONTROL_CHARS: frozenset[str] = frozenset(
    chr(c) for c in (*range(0x00, 0x20), *range(0x7F, 0xA0), 0x2028, 0x2029, *_BIDI)
)
"""Every character this rule calls a control character."""


def _one_of(chars: frozenset[str]) -> str:
    """A regular-expression class matching exactly ``chars``, written as ranges: a class of each
    character one by one took the regular-expression compiler ten times as long, at the import of
    every command."""
    codes = sorted(map(ord, chars))
    parts = []
    start = 0
    for i, code in enumerate(codes):
        if i + 1 == len(codes) or codes[i + 1] != code + 1:  # the end of a run of codes
            first, last = re.escape(chr(codes[start])), re.escape(chr(code))
            parts.append(first if start == i else f"{first}-{last}")
            start = i + 1
    return "[" + "".join(parts) + "]"


_CONTROL_RE = re.compile(_one_of(CONTROL_CHARS))
_ESCAPED = {ord(c): ("\\x%02x" % ord(c) if ord(c) < 0x100 else "\\u%04x" % ord(c))
            for c in CONTROL_CHARS}
_ESCAPED.update({ord("\n"): "\\n", ord("\t"): "\\t", ord("\r"): "\\r"})
_LINES_RE = re.compile("\r(?!\n)|" + _one_of(CONTROL_CHARS - {"\n", "\t", "\r"}))

_NAMES = {0x1B: "ESC", 0x07: "BEL", 0x00: "NUL", 0x0A: "a line break", 0x0D: "a carriage return",
          0x09: "a tab", 0x08: "a backspace", 0x7F: "DEL", 0x9B: "CSI"}


def first_control(text: str) -> str | None:
    """The first control character in ``text``, or None."""
    match = _CONTROL_RE.search(text)
    return match.group(0) if match else None


def describe_char(ch: str) -> str:
    """A control character in words: ``ESC (U+001B)``, ``a line break (U+000A)``."""
    import unicodedata  # an extension module, loaded only to name a character in a message

    code = ord(ch)
    name = _NAMES.get(code) or unicodedata.name(ch, "") or "a control character"
    return f"{name} (U+{code:04X})"


def no_control(text: str) -> str:
    """``text`` unchanged when it holds no control character; else ``ValueError`` with a sentence
    naming the character (the caller names the field). For one-line fields."""
    found = first_control(text)
    if found is not None:
        raise ValueError(
            f"holds {describe_char(found)}, a control character; this field is one line of "
            "plain text (control characters can change what a terminal shows)"
        )
    return text


def shown(text: str) -> str:
    """``text`` for one line of a terminal, the app or a report: every control character shown
    escaped (``\\x1b``, ``\\n``, ``\\u202e``); anything else unchanged."""
    if _CONTROL_RE.search(text) is None:  # the usual case: no copy
        return text
    return text.translate(_ESCAPED)


def shown_lines(text: str) -> str:
    """As ``shown``, but line breaks (``\\n``, ``\\r\\n``) and tabs stay what they are: for
    text of several lines (a note, a command's output, a notification)."""
    if _CONTROL_RE.search(text) is None:
        return text
    return _LINES_RE.sub(lambda m: m.group(0).translate(_ESCAPED), text)
