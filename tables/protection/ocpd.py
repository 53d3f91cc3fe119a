"""Overcurrent device ratings: NEC 2023 240.6(A) standard ratings and the 240.4(D) limits for
small conductors.

240.6(A) (Table 240.6(A) in the 2017 and later editions) lists the standard ratings for fuses and
inverse time circuit breakers, and adds 1, 3, 6 and 601 A as standard ratings for fuses only.
10 A: in the 2014 edition it was one of the additional fuse-only ratings; from the 2017 edition it
is the first entry of Table 240.6(A) for breakers and fuses alike (from memory).
``next_standard_rating`` picks from 15 A up, the ratings a general-purpose circuit breaker comes
in.
"""

from __future__ import annotations

from gaugewalk.tables.conductor.sizes import canonical
from gaugewalk.tables.errors import TableLookupError

STANDARD_RATINGS: tuple[int, ...] = (
    15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225, 250,
    300, 350, 400, 450, 500, 600, 700, 800, 1000, 1200, 1600, 2000, 2500, 3000, 4000, 5000, 6000,
)
"""[A] NEC 240.6(A) standard ratings for fuses and inverse time circuit breakers, 15 A and up."""

SMALL_RATINGS: tuple[int, ...] = (10,)
"""[A] the 10 A rating (Table 240.6(A) since the 2017 edition; fuse-only before, from memory)."""

FUSE_ONLY: tuple[int, ...] = (1, 3, 6, 601)
"""[A] additional standard ratings for fuses only, NEC 2023 240.6(A)."""

ALL_RATINGS: tuple[int, ...] = tuple(sorted(STANDARD_RATINGS + SMALL_RATINGS + FUSE_ONLY))


def _amps(amps: float) -> float:
    if isinstance(amps, bool) or not isinstance(amps, (int, float)) or not amps > 0:
        raise TableLookupError(f"a current must be a positive number of amperes, not {amps!r}")
    return float(amps)


def next_standard_rating(amps: float) -> int:
    """Smallest standard rating [A] at or above ``amps`` [A], from ``STANDARD_RATINGS``
    (NEC 240.6(A)). Raises ``TableLookupError`` above 6000 A."""
    a = _amps(amps)
    for rating in STANDARD_RATINGS:
        if rating >= a:
            return rating
    raise TableLookupError(f"no standard rating at or above {a:g} A; the largest in NEC 240.6(A) "
                           f"is {STANDARD_RATINGS[-1]} A")


def next_rating_down(amps: float) -> int | None:
    """Largest standard rating [A] at or below ``amps`` [A] (NEC 240.6(A), 15 A and up), or None
    below 15 A."""
    a = _amps(amps)
    below = [r for r in STANDARD_RATINGS if r <= a]
    return below[-1] if below else None


def is_standard_rating(amps: float, fuse: bool = False) -> bool:
    """True if ``amps`` is a 240.6(A) standard rating (``fuse=True`` adds the fuse-only ones)."""
    return amps in (ALL_RATINGS if fuse else STANDARD_RATINGS + SMALL_RATINGS)


# NEC 2023 240.4(D): maximum overcurrent protection [A] for small conductors, unless 240.4(E) or
# (G) permits otherwise. Keys (size, material). 14-10 AWG copper and 12-10 AWG aluminum have been
# in 240.4(D) since the 2002 edition at least; 18 and 16 AWG copper (7 A and 10 A, with the
# conditions of 240.4(D)(1) and (D)(2)) were added in the 2008 edition. Edition history from memory.
SMALL_CONDUCTOR_MAX_OCPD: dict[tuple[str, str], int] = {
    ("18 AWG", "cu"): 7,
    ("16 AWG", "cu"): 10,
    ("14 AWG", "cu"): 15,
    ("12 AWG", "al"): 15,
    ("12 AWG", "cu"): 20,
    ("10 AWG", "al"): 25,
    ("10 AWG", "cu"): 30,
}


def small_conductor_max_ocpd(size: str, material: str) -> int | None:
    """Largest overcurrent device [A] NEC 240.4(D) allows on a small conductor, or None where
    240.4(D) sets no limit (8 AWG and larger). ``material`` is ``"cu"`` or ``"al"``."""
    if material not in ("cu", "al"):
        raise TableLookupError(f"no conductor material '{material}'; materials are cu, al")
    return SMALL_CONDUCTOR_MAX_OCPD.get((canonical(size), material))
