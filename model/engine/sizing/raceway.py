"""The raceway of a run: its type, and the smallest trade size its conductors fill within the
limit of NEC Ch. 9 Table 1 (53 % for one conductor, 31 % for two, 40 % for more), with the
insulated areas of Table 5 (bare conductors: Table 8) and the internal areas of Table 4.

Public API: ``FAMILY_REPRESENTATIVE``; ``resolve_raceway(text) -> (type, family, note)``;
``raceway_fill(size, egc_size, egc_bare, insulation, rtype, hots, neutral, sets)``.
"""

from __future__ import annotations

from functools import lru_cache

from gaugewalk.tables.conductor import properties as t_cond
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.raceway import fill as t_race

FAMILY_REPRESENTATIVE = {"steel": "EMT", "pvc": "PVC-40", "aluminum": "ARMC"}
"""Raceway type used for conduit fill when only a family is given (common practice: EMT is the
usual steel raceway indoors, Schedule 40 the usual PVC; rigid for aluminum)."""

_EPS = 1e-9


@lru_cache(maxsize=256)
def resolve_raceway(text: str) -> tuple[str, str, str | None]:
    """A raceway type or family name -> ``(type, family, note)``.

    A family (``steel``, ``pvc``, ``aluminum``) is filled as its representative type
    (``FAMILY_REPRESENTATIVE``) and the note says so. Raises ``TableLookupError`` for names
    neither table knows.
    """
    key = str(text).strip().lower()
    if key in FAMILY_REPRESENTATIVE:
        rtype = t_race.parse_raceway(FAMILY_REPRESENTATIVE[key])
        return rtype, key, f"raceway family '{key}': conduit fill figured for {rtype}"
    try:
        rtype = t_race.parse_raceway(text)
    except TableLookupError as exc:
        raise TableLookupError(f"{exc}; families are {', '.join(FAMILY_REPRESENTATIVE)}") from None
    return rtype, t_race.raceway_family(rtype), None


@lru_cache(maxsize=256)
def _raceway_sizes(rtype: str) -> tuple[tuple[str, float], ...]:
    return tuple((ts, t_race.internal_area_in2(rtype, ts)) for ts in t_race.trade_sizes(rtype))


@lru_cache(maxsize=4096)
def _insulated_area(size: str, insulation: str) -> float:
    return t_race.insulated_area_in2(size, insulation)


@lru_cache(maxsize=4096)
def _bare_area(size: str, stranded: bool) -> float:
    return t_cond.bare_area_in2(size, stranded)


_fill_limit = lru_cache(maxsize=64)(t_race.fill_limit_pct)


def raceway_fill(size: str, egc_size: str | None, egc_bare: bool, insulation: str, rtype: str,
                 hots: int, neutral: int, sets: int
                 ) -> tuple[str | None, float, tuple[str, ...], tuple[str, ...]]:
    """The smallest trade size of ``rtype`` holding the phase conductors, the neutral and the
    EGC of one set (each set in its own raceway): ``(trade size or None, fill [%], notes,
    problems)``."""
    notes: list[str] = []
    problems: list[str] = []
    count = hots + neutral + (1 if egc_size else 0)
    fill_limit = _fill_limit(count)
    raceway_size = None
    fill_pct = 0.0
    per = f" per raceway ({sets} raceways)" if sets > 1 else ""
    try:
        area = (hots + neutral) * _insulated_area(size, insulation)
        if egc_size:
            area += (_bare_area(egc_size, True) if egc_bare
                     else _insulated_area(egc_size, insulation))
    except TableLookupError as exc:
        area = None
        problems.append(f"raceway not sized: {exc}")
    if area is not None:
        for ts, internal in _raceway_sizes(rtype):
            if area <= internal * fill_limit / 100.0 + _EPS:
                raceway_size, fill_pct = ts, 100.0 * area / internal
                break
        if raceway_size is None:
            largest_ts, largest = _raceway_sizes(rtype)[-1]
            fill_pct = 100.0 * area / largest
            problems.append(f"no {rtype} trade size holds {count} conductors{per} "
                            f"({area:.3f} in2) within the {fill_limit:g}% fill of NEC Ch. 9 "
                            f"Table 1; {largest_ts} would be {fill_pct:.0f}% full")
        else:
            notes.append(f"NEC Ch. 9 Table 1: {count} conductors{per}, {fill_pct:.0f}% of trade "
                         f"size {raceway_size} {rtype} (limit {fill_limit:g}%)")
    return raceway_size, fill_pct, tuple(notes), tuple(problems)
