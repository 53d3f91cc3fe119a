"""Conductor size names: AWG 18 to 4/0, then kcmil 250 to 2000 (the sizes of NEC Ch. 9 Table 8).

Canonical spellings are ``"12 AWG"``, ``"1/0 AWG"`` and ``"250 kcmil"``. ``parse_size`` turns the
spellings people type into those names; the tables key their rows by them.
"""

from __future__ import annotations

import re

from gaugewalk.tables.errors import TableLookupError, choices

AWG_NUMBERS: tuple[str, ...] = ("18", "16", "14", "12", "10", "8", "6", "4", "3", "2", "1",
                                "1/0", "2/0", "3/0", "4/0")
KCMIL_NUMBERS: tuple[int, ...] = (250, 300, 350, 400, 500, 600, 700, 750, 800, 900, 1000,
                                  1250, 1500, 1750, 2000)

SIZES: tuple[str, ...] = tuple(f"{n} AWG" for n in AWG_NUMBERS) + tuple(
    f"{k} kcmil" for k in KCMIL_NUMBERS)
"""Every size, smallest first (NEC Ch. 9 Table 8 rows)."""

_INDEX = {size: i for i, size in enumerate(SIZES)}
_ZEROS = {"0": "1/0", "00": "2/0", "000": "3/0", "0000": "4/0"}
_PATTERN = re.compile(r"^#?\s*([0-9]+(?:/0)?)\s*(awg|ga|kcmil|mcm|kcm)?$", re.ASCII)


def _reject(text: object) -> TableLookupError:
    return TableLookupError(f"no conductor size '{text}'; sizes are {choices(SIZES)}")


def parse_size(text: str) -> str:
    """Canonical size name from a typed spelling.

    Accepts ``"12"``, ``"#12"``, ``"12 awg"``, ``"12AWG"``, ``"1/0"``, ``"#1/0"``, ``"2/0 awg"``,
    ``"0"``..``"0000"`` (1/0..4/0), ``"250"``, ``"250kcmil"``, ``"250 MCM"``, case-insensitive and
    tolerant of spaces. Anything else raises ``TableLookupError`` listing the valid sizes.
    """
    if not isinstance(text, str):
        raise _reject(text)
    cleaned = re.sub(r"\s+", " ", text.strip().lower())
    cleaned = re.sub(r"\s*/\s*", "/", cleaned)
    match = _PATTERN.match(cleaned)
    if not match:
        raise _reject(text.strip())
    number, unit = match.group(1), match.group(2)
    if number in _ZEROS:
        number = _ZEROS[number]
    if unit in (None, "awg", "ga") and number in AWG_NUMBERS:
        return f"{number} AWG"
    if unit in (None, "kcmil", "mcm", "kcm") and "/" not in number and len(number) <= 6:
        kcmil = int(number)
        if kcmil in KCMIL_NUMBERS and number == str(kcmil):
            return f"{kcmil} kcmil"
    raise _reject(text.strip())


def size_index(size: str) -> int:
    """Position of a size in ``SIZES`` (0 is 18 AWG); any spelling ``parse_size`` accepts."""
    return _INDEX[size] if size in _INDEX else _INDEX[parse_size(size)]


def next_larger(size: str) -> str | None:
    """The next larger size, or None after 2000 kcmil."""
    i = size_index(size) + 1
    return SIZES[i] if i < len(SIZES) else None


def is_awg(size: str) -> bool:
    """True for 18 AWG .. 4/0 AWG, False for the kcmil sizes."""
    return size_index(size) < len(AWG_NUMBERS)


def canonical(size: str) -> str:
    """The canonical name of ``size`` (already canonical names pass straight through)."""
    return size if size in _INDEX else parse_size(size)
