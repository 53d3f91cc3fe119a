"""Horsepower as the trade writes it: ``10``, ``7.5``, ``1/2``, ``1-1/2``, ``1 1/2``, ``7½``, with
or without ``hp``.

Ratings are kept as exact fractions (``Fraction(1, 3)``), so a 1/3 hp row of Table 430.248 is
found whatever the spelling. The motor tables' rows are 1/6, 1/4, 1/3, 1/2, 3/4, 1, 1-1/2, 2, 3,
5, 7-1/2 and whole numbers above; a decimal that rounds a sixth or a third (``0.33``, ``0.167``)
is read as that fraction, the only ratings decimals cannot write exactly.
"""

from __future__ import annotations

import math
import re
from fractions import Fraction

from gaugewalk.tables.errors import TableLookupError

_VULGAR = {"½": "1/2", "¼": "1/4", "¾": "3/4", "⅓": "1/3", "⅔": "2/3", "⅙": "1/6", "⅚": "5/6",
           "⅛": "1/8", "⅜": "3/8", "⅝": "5/8", "⅞": "7/8"}
_UNIT = re.compile(r"\s*(hp|h\.p\.|horsepower)$")
_DECIMAL = re.compile(r"(\d+(?:\.\d*)?|\.\d+)", re.ASCII)
_FRACTION = re.compile(r"(\d+)/(\d+)", re.ASCII)
_MIXED = re.compile(r"(\d+)(?:\s+|\s*-\s*)(\d+)/(\d+)", re.ASCII)

FORMS = "10, 7.5, 1/2, 1-1/2 or 1 1/2, with or without 'hp'"


def _refuse(value: object) -> TableLookupError:
    return TableLookupError(f"cannot read horsepower {value!r}; write it as {FORMS}")


def _snap_sixths(text: str) -> Fraction:
    """The exact value of a decimal, or the sixth it rounds (``0.33`` -> 1/3) when it has two or
    more decimal places."""
    exact = Fraction(text)
    places = len(text.partition(".")[2])
    if places >= 2:
        sixths = Fraction(round(exact * 6), 6)
        if sixths.denominator in (3, 6) and round(float(sixths), places) == float(exact):
            return sixths
    return exact


def parse_hp(value: str | int | float | Fraction) -> Fraction:
    """A horsepower rating as an exact fraction from text or a number [hp].

    Accepts decimals (``"7.5"``, ``".5"``), fractions (``"3/4"``), mixed numbers (``"1-1/2"``,
    ``"1 1/2"``, ``"7½"``), each with an optional ``hp`` (any case, spaced or not). A decimal with
    two or more places that rounds a sixth or a third reads as it (``"0.33"`` is 1/3). Zero,
    negative, and anything else raise ``TableLookupError`` showing the accepted forms. This reads
    the spelling only; ``gaugewalk.tables.equipment.motors.table_hp`` checks a rating against a
    table.
    """
    if isinstance(value, bool):
        raise _refuse(value)
    if isinstance(value, Fraction):
        hp = value
    elif isinstance(value, int):
        hp = Fraction(value)
    elif isinstance(value, float):
        if not math.isfinite(value):
            raise _refuse(value)
        hp = _snap_sixths(repr(value)) if "e" not in repr(value) else Fraction(value)
    elif isinstance(value, str):
        hp = _parse_text(value)
    else:
        raise _refuse(value)
    if hp <= 0:
        raise TableLookupError(f"a horsepower rating must be above zero, not {value!r}")
    return hp


def _parse_text(text: str) -> Fraction:
    cleaned = text.strip().lower()
    for glyph, spelled in _VULGAR.items():
        cleaned = cleaned.replace(glyph, f" {spelled}")
    cleaned = _UNIT.sub("", cleaned.strip()).strip()
    if match := _DECIMAL.fullmatch(cleaned):
        return _snap_sixths(match.group(1))
    if match := _FRACTION.fullmatch(cleaned):
        num, den = int(match.group(1)), int(match.group(2))
        if den == 0:
            raise _refuse(text)
        return Fraction(num, den)
    if match := _MIXED.fullmatch(cleaned):
        whole, num, den = (int(g) for g in match.groups())
        if den == 0 or num >= den or num == 0:
            raise _refuse(text)
        return whole + Fraction(num, den)
    raise _refuse(text)


def hp_text(hp: Fraction | int | float) -> str:
    """The rating as the tables print it: ``"1/2"``, ``"1-1/2"``, ``"10"`` (decimals otherwise)."""
    hp = parse_hp(hp)
    whole, part = divmod(hp, 1)
    if part == 0:
        return str(whole)
    if hp.denominator > 8:
        return f"{float(hp):g}"
    fraction = f"{part.numerator}/{part.denominator}"
    return fraction if whole == 0 else f"{whole}-{fraction}"
