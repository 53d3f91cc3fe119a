"""The engine's own check of a ``RunSpec``: a spec it cannot evaluate is refused with the field
named, before any table is read.

Public API: ``SizingError``; ``check_spec(spec)``; ``check_run_drop(spec)`` (the two fields a
spec prepared once for many runs leaves out: ``length_ft``, ``upstream_drop_pct``). The words
and limits come from ``gaugewalk.model.engine.vocabulary`` (materials, methods, terminal
ratings, sets).
"""

from __future__ import annotations

import math
from functools import lru_cache

from gaugewalk.model.engine.contract import RunSpec
from gaugewalk.model.engine.vocabulary import (
    MATERIALS,
    MAX_SETS,
    METHODS,
    MIN_SETS,
    SETS_WORDS,
    TERMINAL_TEMPS,
    or_words,
)
from gaugewalk.tables.conductor.sizes import parse_size
from gaugewalk.tables.errors import TableLookupError

_NUMBER = (int, float)


class SizingError(ValueError):
    """A run that cannot be evaluated at all: the message names the field and why."""


def _bad_positive(v: object) -> bool:
    return v.__class__ not in _NUMBER or not (0 < v < math.inf)


@lru_cache(maxsize=256)
def _size_known(text: str) -> bool:
    try:
        parse_size(text)
    except TableLookupError:
        return False
    return True


def check_spec(spec: RunSpec) -> None:
    """Refuse a spec the engine cannot evaluate, naming the field.

    One combined test passes the usual valid spec; anything it does not pass goes through the
    field-by-field checks, in the same order, which name the field."""
    a, ln, m, t = spec.amps, spec.length_ft, spec.max_drop_pct, spec.max_total_drop_pct
    v = spec.circuit.volts
    ca, tt, ccc, ms, oc = (spec.continuous_amps, spec.terminal_temp, spec.ccc, spec.min_size,
                           spec.ocpd_a)
    if (a.__class__ in _NUMBER and 0 < a < math.inf
            and ln.__class__ in _NUMBER and 0 < ln < math.inf
            and m.__class__ in _NUMBER and 0 < m < math.inf
            and t.__class__ in _NUMBER and 0 < t < math.inf
            and v.__class__ in _NUMBER and 0 < v < math.inf
            and 0 < spec.pf <= 1
            and spec.sets.__class__ is int and MIN_SETS <= spec.sets <= MAX_SETS
            and spec.material in MATERIALS and spec.method in METHODS
            and (tt is None or tt in TERMINAL_TEMPS)
            and (ccc is None or (ccc.__class__ is int and ccc >= 1))
            and (ca is None or 0 <= ca <= a)
            and 0 <= spec.upstream_drop_pct < math.inf
            and -40 <= spec.conductor_temp_c <= 250
            and (ms is None or (ms.__class__ is str and _size_known(ms)))
            and (oc is None or (oc.__class__ is int and oc > 0))
            and spec.min_ampacity_a is None and spec.neutral_amps is None
            and spec.motor_feeder_max_a is None and spec.lugs_bus_a is None):
        return
    _check_spec_fields(spec)


def check_run_drop(spec: RunSpec) -> None:
    """``check_spec`` for a spec whose other fields passed it already, in a spec equal to it
    but for ``length_ft`` and ``upstream_drop_pct`` (``evaluate.evaluate_picked``): those two
    checked, the first bad field named as ``check_spec`` names it."""
    ln, up = spec.length_ft, spec.upstream_drop_pct
    if not (ln.__class__ in _NUMBER and 0 < ln < math.inf and 0 <= up < math.inf):
        _check_spec_fields(spec)


def _check_spec_fields(spec: RunSpec) -> None:
    """The field-by-field checks of ``check_spec``: raise naming the first bad field."""
    for name in ("amps", "length_ft", "max_drop_pct", "max_total_drop_pct"):
        v = getattr(spec, name)
        if _bad_positive(v):
            raise SizingError(f"{name} must be a number above zero, not {v!r}")
    if _bad_positive(spec.circuit.volts):
        raise SizingError(f"circuit.volts must be a number above zero, not {spec.circuit.volts!r}")
    if not (0 < spec.pf <= 1):
        raise SizingError(f"pf must be above 0 and at most 1, not {spec.pf!r}")
    if spec.sets.__class__ is not int or not MIN_SETS <= spec.sets <= MAX_SETS:
        raise SizingError(f"sets must be {SETS_WORDS}, not {spec.sets!r}")
    if spec.material not in MATERIALS:
        raise SizingError(f"material must be {or_words(MATERIALS)}, not {spec.material!r}")
    if spec.method not in METHODS:
        raise SizingError(f"method must be {or_words(METHODS)}, not {spec.method!r}")
    if spec.terminal_temp is not None and spec.terminal_temp not in TERMINAL_TEMPS:
        raise SizingError(
            f"terminal_temp must be {or_words(TERMINAL_TEMPS)}, not {spec.terminal_temp!r}")
    if spec.ccc is not None and (spec.ccc.__class__ is not int or spec.ccc < 1):
        raise SizingError(f"ccc must be a whole number of 1 or more, not {spec.ccc!r}")
    if spec.continuous_amps is not None and not (0 <= spec.continuous_amps <= spec.amps):
        raise SizingError(
            f"continuous_amps must be between 0 and the load ({spec.amps:g} A), "
            f"not {spec.continuous_amps!r}")
    if not (0 <= spec.upstream_drop_pct < math.inf):
        raise SizingError(f"upstream_drop_pct must be zero or more, not {spec.upstream_drop_pct!r}")
    if not (-40 <= spec.conductor_temp_c <= 250):
        raise SizingError(
            f"conductor_temp_c must be from -40 to 250 C, not {spec.conductor_temp_c!r}")
    if spec.min_size is not None:
        try:
            parse_size(spec.min_size)
        except TableLookupError as exc:
            raise SizingError(f"min_size: {exc}") from None
    if spec.ocpd_a is not None and (spec.ocpd_a.__class__ is not int or spec.ocpd_a <= 0):
        raise SizingError(f"ocpd_a must be a whole number of amperes, not {spec.ocpd_a!r}")
    na = spec.neutral_amps
    if na is not None and (na.__class__ not in _NUMBER or not 0 <= na < math.inf):
        raise SizingError(f"neutral_amps must be a number of zero or more, not {na!r}")
    mina = spec.min_ampacity_a
    if mina is not None and _bad_positive(mina):
        raise SizingError(f"min_ampacity_a must be a number above zero, not {mina!r}")
    mfm = spec.motor_feeder_max_a
    if mfm is not None and _bad_positive(mfm):
        raise SizingError(f"motor_feeder_max_a must be a number above zero, not {mfm!r}")
    bus = spec.lugs_bus_a
    if bus is not None and (bus.__class__ is not int or bus <= 0):
        raise SizingError(f"lugs_bus_a must be a whole number of amperes, not {bus!r}")
