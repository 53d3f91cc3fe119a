"""A walk file's TOML text to data, as ``tomllib`` reads it, about four times faster where the
compiled parser is installed.

Public API:

- ``parse_toml(text) -> dict``: the data ``tomllib.loads(text)`` gives; raises what it raises
  (``tomllib.TOMLDecodeError`` with its message, line and column; ``RecursionError`` for nesting
  too deep for it).
- ``COMPILED``: the name of the compiled parser in use, or None (``tomllib`` alone).

``tomllib`` (TOML 1.0) is the reference. ``pytomlpp`` (toml++, C++, TOML 1.0) reads first, and its
data is used only when it reads the text without error; text it refuses is read again by
``tomllib``, so every message is ``tomllib``'s own, and text only ``tomllib`` reads (an integer
past 64 bits, text that cannot be UTF-8) is read all the same. Where no wheel of it is published
(the dependency's markers in ``pyproject.toml``) ``tomllib`` reads alone.

What toml++ reads differently, and how it is kept out: a byte-order mark at the start (toml++
skips it, ``tomllib`` refuses it): such text goes to ``tomllib``. Two differences reach no walk:
toml++ gives a table's keys in sorted order rather than the file's (the reader matches keys by
name; only problems about several unknown keys on one line come in another order), and reads
``-nan`` as ``nan`` (every field refuses a NaN, and Python prints both as ``nan``). toml++ refuses
inline arrays and tables nested past 256 levels, which ``tomllib`` then reads or refuses itself.
``tests/walkfile/test_toml_parse.py`` holds the two to the same data and messages on every sample
and golden walk, on malformed walks and on mutated and random text.
"""

from __future__ import annotations

from types import ModuleType
from typing import Any

_compiled: ModuleType | None
try:
    import pytomlpp as _compiled
except ImportError:  # no wheel for this platform or Python: tomllib alone
    _compiled = None

COMPILED: str | None = None if _compiled is None else "pytomlpp"

_BOM = "\ufeff"


def parse_toml(text: str) -> dict[str, Any]:
    """``tomllib.loads(text)``, read by the compiled parser where it reads the text alike."""
    if _compiled is not None and not text.startswith(_BOM):
        try:
            return _compiled.loads(text)
        except Exception:  # whatever it refuses, tomllib reads or says why
            pass
    import tomllib  # imported only here: a walk the compiled parser reads never needs it

    return tomllib.loads(text)
