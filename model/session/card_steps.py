"""What a run card proposes for a run like the last one: the last run's name stepped on.

Runs walked one after another are often the next of a row: "Pump 3" after "Pump 2", "High bay
row 2" after "High bay row 1", "Floor boxes B" after "Floor boxes A" (common practice). A card
proposes the name the last run's name steps to; the person takes it or types another.

Public API: ``step_name(name, taken=())``.
"""

from __future__ import annotations

import re
from collections.abc import Collection

_LAST_RANGE = re.compile(r"^(.*?)(\d+)([-–])(\d+)(\D*)$")
"""A name ending in a range of numbers: ``Shop lights, bays 1-2``."""
_LAST_NUMBER = re.compile(r"^(.*?)(\d+)(\D*)$")
"""A name's text before its last number, the number, and the text after it."""
_LAST_LETTER = re.compile(r"^(.*[\s\-_#])([A-Za-y])$")
"""A name ending in a single letter after a space, dash, underscore or #: ``Floor boxes A``."""


def step_name(name: str, taken: Collection[str] = ()) -> str | None:
    """``name`` with its last number stepped on by one, keeping its zeros (``Pump 09`` ->
    ``Pump 10``, ``RTU-1 roof`` -> ``RTU-2 roof``; a closing range to the next as wide: ``bays
    1-2`` -> ``bays 3-4``), else its closing single letter (``Boxes A`` -> ``Boxes B``); stepped
    again past any name in ``taken`` (any case). None when the name has neither to step."""
    used = {t.casefold() for t in taken}
    text = name.strip()
    span = _LAST_RANGE.match(text)
    if span and int(span.group(4)) > int(span.group(2)):
        head, first, dash, last, tail = span.groups()
        low, high = int(first), int(last)
        while True:
            low, high = high + 1, 2 * high + 1 - low
            stepped = f"{head}{low:0{len(first)}d}{dash}{high:0{len(last)}d}{tail}"
            if stepped.casefold() not in used:
                return stepped
    number = _LAST_NUMBER.match(text)
    if number:
        head, digits, tail = number.groups()
        n = int(digits)
        while True:
            n += 1
            stepped = f"{head}{n:0{len(digits)}d}{tail}"
            if stepped.casefold() not in used:
                return stepped
    letter = _LAST_LETTER.match(text)
    if letter:
        head, last = letter.groups()
        for code in range(ord(last) + 1, ord("z" if last.islower() else "Z") + 1):
            stepped = f"{head}{chr(code)}"
            if stepped.casefold() not in used:
                return stepped
    return None
