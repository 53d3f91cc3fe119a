"""The words of the walk, in one place: the job model's fields and the command line's choices
read them from here (the words of one run are in ``gaugewalk.model.engine.vocabulary``).

Public API:

- ``SourceKind``, ``SOURCE_KINDS``: what feeds runs: the ``service`` (fed by the utility), a
  ``switchboard``, a ``panel`` or a ``transformer`` (which starts a new system).
- ``Phase``, ``PHASES``: the line or lines a run lands on in its source, with the lines of each
  (``A``, ``B``, ``C``, ``AB``, ``BC``, ``CA``, ``ABC``; lines counted from 0 for A).
- ``LINE_NAMES``: the names of a source's lines, A to C.
- ``MAX_POSITION``: the highest breaker position a walk takes (common practice: panelboards have
  up to 84 spaces; a switchboard's distribution sections more).
- ``FeederBasis``, ``FEEDER_BASES``: what a feeder is sized for: the ``load`` it serves, or the
  ``equipment`` it feeds (its main device or bus rating; common practice).
- ``Demand``, ``DEMANDS``: the load a feeder is sized for: the ``connected`` load, or with the
  demand factors of NEC Article 220 (``nec-220``: 220.44 receptacles, 220.60 noncoincident
  heating and cooling).
- ``kind_in_name(name)``: the kind of load a run's name says (``Fire pump 1``, ``Taproom
  lights``), for the run card and the walk's check of a motor named as a fire pump;
  ``duty_in_name(name)``: a motor named as an elevator, crane or hoist (not continuous duty);
  ``unit_load_in_name(name)``: lighting a feeder counts by its length (NEC 220.43), with
  ``may_count_by_length(name)`` its cheap first look; ``sign_in_name(name)``: a sign or outline
  lighting (NEC Article 600; not an exit sign), with ``may_be_sign(name)`` its cheap first look;
  ``refrigerant_in_name(name)``: a motor named as a refrigerant motor-compressor (Article 440);
  ``roof_in_name(name)``: equipment on a roof, with ``may_be_on_roof(name)`` its cheap first look.
- ``Protection``, ``PROTECTIONS``: a transformer's protection by NEC Table 450.3(B): on the
  ``primary`` only, or on the primary and the secondary (``both``).
"""

from __future__ import annotations

import re
from functools import lru_cache
from typing import Literal, get_args

from gaugewalk.model.engine.vocabulary import LoadKind

SourceKind = Literal["service", "switchboard", "panel", "transformer"]
SOURCE_KINDS: tuple[SourceKind, ...] = get_args(SourceKind)

Phase = Literal["A", "B", "C", "AB", "BC", "CA", "ABC"]
PHASES: dict[Phase, tuple[int, ...]] = {
    "A": (0,), "B": (1,), "C": (2,), "AB": (0, 1), "BC": (1, 2), "CA": (2, 0), "ABC": (0, 1, 2),
}
"""Each phase word and its lines (0 for A, 1 for B, 2 for C), in pole order."""

LINE_NAMES = ("A", "B", "C")

MAX_POSITION = 200

FeederBasis = Literal["load", "equipment"]
FEEDER_BASES: dict[FeederBasis, str] = {
    "load": "the load it serves, on its heaviest line (NEC 215.2(A)(1))",
    "equipment": "the equipment it feeds: its main device, else its bus rating (common practice)",
}

Demand = Literal["connected", "nec-220"]
DEMANDS: dict[Demand, str] = {
    "connected": "the connected load (no demand factors)",
    "nec-220": "with demand factors: receptacles per NEC 220.44, noncoincident heating and "
               "cooling per NEC 220.60",
}

Protection = Literal["primary", "both"]
PROTECTIONS: dict[Protection, str] = {
    "primary": "primary only (NEC Table 450.3(B), primary 125 %)",
    "both": "primary and secondary (NEC Table 450.3(B), primary up to 250 %, secondary 125 %)",
}

for _literal, _values in ((Phase, PHASES), (FeederBasis, FEEDER_BASES),
                          (Demand, DEMANDS), (Protection, PROTECTIONS)):
    if get_args(_literal) != tuple(_values):  # keep each Literal and its table in step
        raise TypeError(f"{_literal} and its table differ: {tuple(_values)}")


_NAME_KINDS: tuple[tuple[str, LoadKind], ...] = (
    (r"\bfire[ -]?pumps?\b", "fire-pump"),
    (r"\bwater[ -]?heaters?\b", "water-heater"),
    (r"\bheaters?\b", "heater"),
    (r"\bev[ -]?chargers?\b|\bevse\b|\bev charging\b", "ev-charger"),
    (r"\blights?\b|\blighting\b|\bluminaires?\b|\bsigns?\b(?![ -]in\b)|\bsignage\b",
     "lighting"),
)
"""Words of a load's name that say its kind where the article decides more than its current
(a fire pump by Article 695; continuous by 422.13, 424.4(B), 625.42, or lighting by common
practice: a sign's lamps, an exit sign's too, are lighting), in the order tried."""


@lru_cache(maxsize=1)
def _name_patterns() -> tuple[tuple[re.Pattern[str], LoadKind], ...]:
    """``_NAME_KINDS`` compiled on first use (a ``check`` of a walk without a motor never
    compiles them)."""
    return tuple((re.compile(words), kind) for words, kind in _NAME_KINDS)


def kind_in_name(name: str) -> LoadKind | None:
    """The kind a load's name says (``Taproom lights`` is lighting, ``Unit heater 3`` a heater,
    ``Fire pump 1`` a fire pump), or None."""
    low = name.lower()
    return next((kind for words, kind in _name_patterns() if words.search(low)), None)


DUTY_NAMES: tuple[tuple[str, str, str], ...] = (
    (r"\belevators?\b|\bescalators?\b|\bdumbwaiters?\b|\bwheelchair lifts?\b", "an elevator",
     "NEC 620.13 sizes an elevator's conductors from its motor's nameplate current and duty"),
    (r"\bcranes?\b|\bhoists?\b|\bmonorails?\b", "a crane or hoist",
     "NEC 610.14 sizes a crane's or hoist's conductors by its motors' short-time ratings"),
)
"""Words of a motor's name that say it is not continuous duty (NEC 430.22(E)): (the words, what
they name, the article that sizes it; section numbers from memory)."""


_SEPARATORS = "-,/()._:;&'+\u2019\u2013\u2014\u00b7"
"""The punctuation taken as spaces between a name's words (hyphens, commas, slashes, brackets,
full stops, colons, ampersands, apostrophes, dashes, middle dots)."""


def _words(name: str) -> list[str]:
    """The words of a name, lowered, split at white space and ``_SEPARATORS`` (no regular
    expression: their compiler is Python code, run when a pattern is first made)."""
    low = name.lower()
    for c in _SEPARATORS:
        if c in low:
            low = low.replace(c, " ")
    return low.split()


def may_be_on_roof(name: str) -> bool:
    """A cheap first look for ``roof_in_name``: the name holds 'oof', 'OOF', 'RTU' or 'rtu'."""
    return "oof" in name or "OOF" in name or "RTU" in name or "rtu" in name


def roof_in_name(name: str) -> bool:
    """Whether a load's name reads as equipment on a roof, its run perhaps across the roof
    (``RTU-1 rooftop unit``, ``Roof exhaust fan 2``, ``RTU3``)."""
    if not may_be_on_roof(name):
        return False
    return any(w.startswith("roof") or w in ("rtu", "rtus")
               or (w.startswith("rtu") and w[3:].isdigit()) for w in _words(name))


_REFRIGERANT_PAIRS = frozenset({("condensing", "unit"), ("condensing", "units"),
                                 ("ice", "machine"), ("ice", "machines"), ("in", "cooler"),
                                 ("in", "freezer"), ("walkin", "cooler"),
                                 ("walkin", "freezer")})
_COMPRESSED = frozenset({"cooler", "coolers", "freezer", "freezers", "refrigerant", "reach",
                         "in"})
"""Words of a motor's name that read as a refrigerant motor-compressor or the equipment around
one: a pair in a row (``Condensing unit CU-2``, ``Walk-in cooler``), a chiller or refrigeration,
or a compressor after one of ``_COMPRESSED`` (``Freezer compressor``); never an air
compressor."""


def refrigerant_in_name(name: str) -> bool:
    """Whether a motor's name reads as a refrigerant motor-compressor (NEC Article 440), not an
    air compressor."""
    words = _words(name)
    if "air" in words:   # an air compressor, compressed air
        return False
    for i, w in enumerate(words):
        if w.startswith(("refrigerat", "chiller")):
            return True
        if i and ((words[i - 1], w) in _REFRIGERANT_PAIRS
                  or (w.startswith("compressor") and words[i - 1] in _COMPRESSED)):
            return True
    return False


UNIT_LOAD_NAMES: tuple[tuple[str, str, str], ...] = (
    (r"\btrack[ -]?light", "track lighting",
     "NEC 220.43(B) has a feeder count track lighting at 150 VA for every 2 ft of track"),
    (r"\bshow[ -]?windows?\b", "show-window lighting",
     "NEC 220.43(A) has a feeder count show-window lighting at 200 VA per foot of window"),
)
"""Words of a load's name for which Article 220 sets a feeder's load by length, not by what is
connected: (the words, what they name, the rule; section numbers from memory)."""


def may_say_more(name: str) -> bool:
    """One first look for the rules a branch run's name may call for beside its kind's and a
    sign's: lighting counted by length (``may_count_by_length``) or equipment on a roof
    (``may_be_on_roof``)."""
    return may_count_by_length(name) or may_be_on_roof(name)


def may_count_by_length(name: str) -> bool:
    """A cheap first look for ``unit_load_in_name``: the name holds 'track' or 'window' in any
    case (most names do not, and are not lowered or searched)."""
    return "rack" in name or "indow" in name


def unit_load_in_name(name: str) -> tuple[str, str] | None:
    """(what it names, the rule) where a load's name reads as lighting a feeder counts by its
    length (``Track lighting, front wall``), or None."""
    return _said_in(name, UNIT_LOAD_NAMES) if may_count_by_length(name) else None


_NOT_A_SIGN_OUTLET = frozenset({"exit", "egress", "emergency"})
"""Words that make a sign one of another article (exit signs: egress lighting, NEC 700)."""


def may_be_sign(name: str) -> bool:
    """A cheap first look for ``sign_in_name``: the name holds 'ign', 'IGN' or 'utline'."""
    return "ign" in name or "IGN" in name or "utline" in name


@lru_cache(maxsize=16384)
def sign_in_name(name: str) -> bool:
    """Whether a load's name reads as a sign or outline lighting (NEC Article 600: ``Blade sign
    over entrance``, ``Storefront signage``, ``Outline lighting, parapet``), not an exit or
    emergency sign, nor a sign-in desk. Cached by the name: a sign's run asks it at each step of
    its computation (its load in the panel, its spec, its note)."""
    if not may_be_sign(name):
        return False
    words = _words(name)
    if _NOT_A_SIGN_OUTLET.intersection(words):
        return False
    for i, w in enumerate(words):
        if w in ("sign", "signs", "signage") and not (
                w == "sign" and i + 1 < len(words) and words[i + 1] == "in"):
            return True
        if w == "outline" and i + 1 < len(words) and words[i + 1] == "lighting":
            return True
    return False


def duty_in_name(name: str) -> tuple[str, str] | None:
    """(what it names, the article's rule) where a motor's name reads as equipment of a duty
    other than continuous (``Freight elevator 2``, ``Dock hoist``), or None."""
    return _said_in(name, DUTY_NAMES)


@lru_cache(maxsize=None)
def _compiled(table: tuple[tuple[str, str, str], ...]
              ) -> tuple[tuple[re.Pattern[str], str, str], ...]:
    """A table of (words, what, rule) with its words compiled, on first use."""
    return tuple((re.compile(words), what, rule) for words, what, rule in table)


def _said_in(name: str, table: tuple[tuple[str, str, str], ...]) -> tuple[str, str] | None:
    """(what, rule) of the first row of ``table`` whose words the name holds, or None."""
    low = name.lower()
    return next(((what, rule) for words, what, rule in _compiled(table) if words.search(low)),
                None)
