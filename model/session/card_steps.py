"""What a run card proposes for a run like the last one: the last run's name stepped on.

Runs walked one after another are often the next of a row: "Pump 3" after "Pump 2", "High bay
row 2" after "High bay row 1", "Floor boxes B" after "Floor boxes A" (common practice). A card
proposes the name the last run's name steps to; the person takes it or types another.

A run like the last one also lands in the next breaker position: on the same side, below the
last run's (a walk's circuits are numbered down one side as it goes, common practice), the first
where its poles fit among the positions taken.

Public API: ``step_name(name, taken=())``, ``next_position(taken, after, poles, spaces)``.
"""

from __future__ import annotations

import re
from collections.abc import Collection

from gaugewalk.model.walk.phases import position_span
from gaugewalk.model.walk.vocabulary import MAX_POSITION

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


def next_position(taken: Collection[int], after: int, poles: int,
                  spaces: int | None = None) -> int | None:
    """The first position below ``after`` on its side (``after`` + 2, + 4 ...) where a
    ``poles``-pole circuit fits (it takes p, p+2 ...; ``phases.position_span``) among the
    positions ``taken`` and within ``spaces``; else the first that fits from position 1; None
    when none fits."""
    limit = min(spaces or MAX_POSITION, MAX_POSITION)

    def fits(p: int) -> bool:
        return all(q <= limit and q not in taken for q in position_span(p, poles))

    below = range(after + 2, limit + 1, 2)
    return next((p for p in below if fits(p)), next((p for p in range(1, limit + 1) if fits(p)), None))
