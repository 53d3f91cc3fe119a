"""Transformers of 1000 V and less: NEC 2023 Table 450.3(B), the secondary conductor length rules
of 240.21(C)(2) and (C)(6), and the kVA ratings and typical impedances of dry-type transformers.

Table 450.3(B), "Maximum Rating or Setting of Overcurrent Protection for Transformers 1000 Volts
and Less (as a Percentage of Transformer-Rated Current)". Two methods: primary-only protection
(primary 125 % for rated currents of 9 A or more, 167 % below 9 A, 300 % below 2 A; no secondary
device required by the table) and primary-and-secondary protection (primary up to 250 % in every
band; secondary 125 % for 9 A or more, 167 % below 9 A). Notes (summarised): (1) where 125 % is
not a standard rating of a fuse or nonadjustable breaker, the next higher standard rating is
permitted (so only in the 125 % cells); (2) the secondary device may be up to six breakers or six
sets of fuses grouped in one location, whose ratings together do not exceed one device's
allowance (with breakers and fuses mixed, the fuses' allowance); (3) a transformer with
coordinated thermal overload protection by the maker, arranged to interrupt the primary current,
may have primary protection up to 6 times its rated current at not more than 6 % impedance and
4 times at more than 6 % up to 10 %. Typed from memory and checked against a public
reproduction of the table's cells and two trade articles (note 1 only in the 125 % cells); the
table has kept this form since its 600 V limit became 1000 V (2017 edition, from memory).

240.21(C): transformer secondary conductors are not protected by the primary device (except a
single-phase two-wire or three-phase delta-delta three-wire secondary, 240.21(C)(1) with
240.4(F)), and 240.4(B) (the next size up) does not apply to them. ``SECONDARY_10_FT`` and
``SECONDARY_25_FT`` summarise the two length rules most walks meet; 240.21(C)(3) (industrial,
25 ft), (C)(4) (outside) and (C)(5) (tapped from a feeder) are not kept here. Summaries from
memory of the 2017-2023 text, in our words.

kVA ratings and impedances are not NEC data: ``THREE_PHASE_KVA`` and ``SINGLE_PHASE_KVA`` are the
ratings dry-type and distribution transformers are commonly built in (common practice), and
``typical_impedance`` gives a typical nameplate percent impedance with the range seen on general-
purpose dry-type units (common practice, from memory; one maker's published typical data for
single-phase 150 C rise units of 15 to 167 kVA, 3.5 to 9.7 %, lies inside the single-phase
ranges, and modern energy-efficient designs run toward the high end). A typical value is only for
a stated assumption where the nameplate is unknown; the nameplate always wins.
"""

import math
from typing import NamedTuple

from gaugewalk.tables.errors import TableLookupError, choices

TABLE_450_3_B = "Table 450.3(B)"

METHODS = ("primary-only", "primary-and-secondary")
"""The protection methods, the rows of Table 450.3(B)."""

WINDINGS = ("primary", "secondary")

BANDS = ("9 A or more", "less than 9 A", "less than 2 A")
"""The rated-current bands of Table 450.3(B)'s columns (the secondary has only the first two)."""

NOTES: dict[int, str] = {
    1: "where 125 percent of the rated current is not a standard rating of a fuse or "
       "nonadjustable circuit breaker, the next higher standard rating is permitted",
    2: "the secondary device may be up to six circuit breakers or six sets of fuses grouped in one "
       "location, their ratings together not above one device's allowance",
    3: "with the maker's coordinated thermal overload protection interrupting the primary, primary "
       "protection up to 6 times rated current (impedance 6 % or less) or 4 times (over 6 % to "
       "10 %) is permitted",
}
"""Table 450.3(B) notes 1-3, summarised."""

# NEC 2023 Table 450.3(B) [percent of transformer rated current]: (method, winding) ->
# band -> (percent, notes); None: not required.
TABLE_450_3_B_PERCENT: dict[tuple[str, str], dict[str, tuple[int, tuple[int, ...]]] | None] = {
    ("primary-only", "primary"): {
        "9 A or more": (125, (1,)), "less than 9 A": (167, ()), "less than 2 A": (300, ()),
    },
    ("primary-only", "secondary"): None,
    ("primary-and-secondary", "primary"): {
        "9 A or more": (250, (3,)), "less than 9 A": (250, (3,)), "less than 2 A": (250, (3,)),
    },
    ("primary-and-secondary", "secondary"): {
        "9 A or more": (125, (1, 2)), "less than 9 A": (167, (2,)),
    },
}

THERMAL_OVERLOAD_PRIMARY_MULTIPLES: tuple[tuple[float, int], ...] = ((6.0, 6), (10.0, 4))
"""Table 450.3(B) note 3: (impedance up to [%], multiple of rated current)."""


class ProtectionLimit(NamedTuple):
    """A Table 450.3(B) cell: the ``percent`` of rated current (None: no device required), the
    current ``band`` read, the ``notes`` that apply, and whether note 1's ``next_size_up`` does."""
    percent: int | None
    band: str
    notes: tuple[int, ...]
    next_size_up: bool


def _amps(amps: float, what: str) -> float:
    if isinstance(amps, bool) or not isinstance(amps, (int, float)) or not amps > 0 \
            or not math.isfinite(amps):
        raise TableLookupError(f"{what} must be a positive number of amperes, not {amps!r}")
    return float(amps)


def current_band(rated_current_a: float, winding: str = "primary") -> str:
    """The Table 450.3(B) column for a rated current [A]: ``"9 A or more"``, ``"less than 9 A"``
    or, on the primary, ``"less than 2 A"``."""
    amps = _amps(rated_current_a, "a transformer's rated current")
    if amps >= 9:
        return BANDS[0]
    if amps < 2 and winding == "primary":
        return BANDS[2]
    return BANDS[1]


def transformer_protection(method: str, winding: str, rated_current_a: float) -> ProtectionLimit:
    """The most a transformer's primary or secondary device may be, NEC Table 450.3(B) (1000 V
    and less), as a percent of the winding's rated current ``rated_current_a`` [A].

    ``method`` is one of ``METHODS``, ``winding`` one of ``WINDINGS``. Under primary-only
    protection the secondary needs no device from this table (``percent`` None); the secondary
    conductors still need protection under 240.21(C).
    """
    if method not in METHODS:
        raise TableLookupError(f"no protection method '{method}' in {TABLE_450_3_B}; methods are "
                               f"{choices(METHODS)}")
    if winding not in WINDINGS:
        raise TableLookupError(f"no winding '{winding}'; windings are {choices(WINDINGS)}")
    band = current_band(rated_current_a, winding)
    cells = TABLE_450_3_B_PERCENT[(method, winding)]
    if cells is None:
        return ProtectionLimit(None, band, (), False)
    percent, notes = cells[band]
    return ProtectionLimit(percent, band, notes, 1 in notes)


def thermal_overload_primary_multiple(impedance_pct: float) -> int | None:
    """Table 450.3(B) note 3: the multiple of rated current the primary device may reach on a
    transformer with coordinated thermal overload protection, by percent impedance; None above
    10 % (note 3 does not apply)."""
    if isinstance(impedance_pct, bool) or not isinstance(impedance_pct, (int, float)) \
            or not impedance_pct > 0:
        raise TableLookupError(f"a percent impedance must be a positive number, not "
                               f"{impedance_pct!r}")
    for up_to, multiple in THERMAL_OVERLOAD_PRIMARY_MULTIPLES:
        if impedance_pct <= up_to:
            return multiple
    return None


def rated_current(kva: float, volts: float, phases: int) -> float:
    """A winding's rated current [A] from its kVA and line-to-line voltage [V]:
    kVA x 1000 / V single-phase, / (sqrt(3) V) three-phase."""
    if phases not in (1, 3) or isinstance(phases, bool):
        raise TableLookupError(f"a transformer has 1 or 3 phases, not {phases!r}")
    kva_ = _positive(kva, "a kVA rating")
    volts_ = _positive(volts, "a voltage")
    return kva_ * 1000.0 / (volts_ if phases == 1 else math.sqrt(3) * volts_)


def _positive(value: float, what: str) -> float:
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not value > 0 \
            or not math.isfinite(value):
        raise TableLookupError(f"{what} must be a positive number, not {value!r}")
    return float(value)


# --- 240.21(C): transformer secondary conductors ------------------------------------------------

class SecondaryConductorRule(NamedTuple):
    """A 240.21(C) length rule: the ``section``, the longest run it allows ``max_length_ft`` [ft]
    and its ``conditions`` (summarised, all required)."""
    section: str
    max_length_ft: float
    conditions: tuple[str, ...]


SECONDARY_10_FT = SecondaryConductorRule(
    "240.21(C)(2)", 10.0,
    ("ampacity not less than the combined calculated loads supplied",
     "ampacity not less than the rating of the equipment containing the overcurrent device(s) "
     "supplied, or of the overcurrent device at the conductors' termination",
     "the conductors do not extend beyond the switchboard, switchgear, panelboard, disconnecting "
     "means or control devices they supply",
     "enclosed in a raceway from the transformer to the enclosure of the equipment supplied",
     "field installations leaving the enclosure or vault of the supply connection: the primary "
     "device rating times the primary-to-secondary voltage ratio is not above 10 times the "
     "conductors' ampacity"),
)
"""240.21(C)(2): secondary conductors not over 10 ft."""

SECONDARY_25_FT = SecondaryConductorRule(
    "240.21(C)(6)", 25.0,
    ("ampacity, times the secondary-to-primary voltage ratio, at least one-third of the rating "
     "of the device protecting the primary",
     "the conductors end in a single circuit breaker or a single set of fuses that limits the "
     "load current to not more than the conductors' ampacity (310.14)",
     "protected from physical damage by an approved raceway or other approved means"),
)
"""240.21(C)(6): secondary conductors not over 25 ft."""

SECONDARY_RULES: tuple[SecondaryConductorRule, ...] = (SECONDARY_10_FT, SECONDARY_25_FT)


def min_secondary_ampacity_10ft(primary_ocpd_a: float, primary_v: float,
                                secondary_v: float) -> float:
    """[A] 240.21(C)(2)(4), field installations leaving the enclosure or vault: the secondary
    conductors' ampacity is at least the primary device rating x (primary V / secondary V) / 10."""
    return (_positive(primary_ocpd_a, "a primary device rating")
            * _positive(primary_v, "a voltage") / _positive(secondary_v, "a voltage") / 10.0)


def min_secondary_ampacity_25ft(primary_ocpd_a: float, primary_v: float,
                                secondary_v: float) -> float:
    """[A] 240.21(C)(6)(1): the secondary conductors' ampacity is at least the primary device
    rating x (primary V / secondary V) / 3."""
    return (_positive(primary_ocpd_a, "a primary device rating")
            * _positive(primary_v, "a voltage") / _positive(secondary_v, "a voltage") / 3.0)


# --- kVA ratings and typical impedances (common practice, not NEC) -----------------------------

THREE_PHASE_KVA: tuple[float, ...] = (3, 6, 9, 15, 30, 45, 75, 112.5, 150, 225, 300, 500, 750,
                                      1000, 1500, 2000, 2500)
"""[kVA] three-phase ratings transformers are commonly built in (common practice); above 1000 kVA
mostly medium-voltage substation units."""

SINGLE_PHASE_KVA: tuple[float, ...] = (1, 1.5, 2, 3, 5, 7.5, 10, 15, 25, 37.5, 50, 75, 100, 167,
                                       250, 333, 500)
"""[kVA] single-phase ratings transformers are commonly built in (common practice)."""

# Typical, common practice (from memory): kVA -> (typical, low, high) percent impedance of
# general-purpose dry-type transformers, 600 V class, ventilated; 750 kVA and up the usual 5.75 %
# of substation units.
TYPICAL_IMPEDANCE_3PH: dict[float, tuple[float, float, float]] = {
    15: (3.5, 2.0, 5.5),
    30: (4.0, 2.5, 6.0),
    45: (4.5, 3.0, 6.0),
    75: (4.5, 3.0, 6.5),
    112.5: (5.0, 3.5, 7.0),
    150: (5.0, 3.5, 7.0),
    225: (5.5, 4.0, 7.5),
    300: (5.5, 4.0, 7.5),
    500: (6.0, 4.5, 8.0),
    750: (5.75, 5.0, 7.0),
    1000: (5.75, 5.0, 7.0),
    1500: (5.75, 5.0, 7.0),
    2000: (5.75, 5.0, 7.0),
    2500: (5.75, 5.0, 7.0),
}
TYPICAL_IMPEDANCE_1PH: dict[float, tuple[float, float, float]] = {
    15: (3.5, 2.5, 5.0),
    25: (3.5, 2.5, 5.0),
    37.5: (4.0, 2.5, 6.0),
    50: (4.0, 3.0, 6.0),
    75: (4.5, 3.0, 7.0),
    100: (4.5, 3.0, 7.0),
    167: (5.0, 3.5, 10.0),
}

TYPICAL_BASIS = "typical, common practice"


class TypicalImpedance(NamedTuple):
    """A typical percent impedance [%] with the ``low``-``high`` range seen on nameplates, the
    standard ``kva_row`` it was read at and its ``basis`` (always ``TYPICAL_BASIS``)."""
    pct: float
    low_pct: float
    high_pct: float
    kva_row: float
    basis: str


def _kva_list(phases: int) -> tuple[float, ...]:
    if phases not in (1, 3) or isinstance(phases, bool):
        raise TableLookupError(f"a transformer has 1 or 3 phases, not {phases!r}")
    return SINGLE_PHASE_KVA if phases == 1 else THREE_PHASE_KVA


def next_standard_kva(kva: float, phases: int) -> float:
    """The smallest common kVA rating [kVA] at or above ``kva`` (common practice lists)."""
    ratings = _kva_list(phases)
    value = _positive(kva, "a kVA rating")
    for rating in ratings:
        if rating >= value:
            return rating
    raise TableLookupError(f"no common {phases}-phase rating at or above {value:g} kVA; the "
                           f"list ends at {ratings[-1]:g} kVA")


def typical_impedance(kva: float, phases: int) -> TypicalImpedance:
    """A typical percent impedance for a transformer of ``kva`` whose nameplate is unknown, read
    at the common rating at or above it (a stated assumption, never a nameplate value). Below
    15 kVA (small encapsulated units vary too widely) and past the list it raises, asking for
    the nameplate."""
    table = TYPICAL_IMPEDANCE_1PH if phases == 1 else TYPICAL_IMPEDANCE_3PH
    _kva_list(phases)
    value = _positive(kva, "a kVA rating")
    rows = sorted(table)
    if value < rows[0] or value > rows[-1]:
        raise TableLookupError(f"no typical impedance kept for a {value:g} kVA {phases}-phase "
                               f"transformer (only {rows[0]:g} to {rows[-1]:g} kVA); enter the "
                               f"nameplate impedance")
    row = min(r for r in rows if r >= value)
    pct, low, high = table[row]
    return TypicalImpedance(pct, low, high, row, TYPICAL_BASIS)


# Typical X/R of general-purpose dry-type transformers by kVA (common practice, from memory: the
# order of the %R and %X makers publish for ventilated 600 V class units; the larger the unit, the
# more reactive its impedance). Only for splitting a nameplate %Z into %R and %X when the
# nameplate gives no more, as a stated assumption.
TYPICAL_X_R_3PH: dict[float, float] = {
    15: 1.0, 30: 1.2, 45: 1.4, 75: 1.8, 112.5: 2.1, 150: 2.5, 225: 3.0, 300: 3.4, 500: 4.2,
    750: 5.0, 1000: 5.7, 1500: 6.5, 2000: 7.0, 2500: 7.5,
}
TYPICAL_X_R_1PH: dict[float, float] = {
    15: 1.0, 25: 1.1, 37.5: 1.2, 50: 1.3, 75: 1.6, 100: 1.8, 167: 2.2,
}


def typical_x_r(kva: float, phases: int) -> tuple[float, float]:
    """(a typical X/R, the kVA row it was read at) for a transformer of ``kva``: the row at or
    above it, the first row below the list and the last above it (common practice, from memory;
    a stated assumption, never a nameplate value)."""
    table = TYPICAL_X_R_1PH if phases == 1 else TYPICAL_X_R_3PH
    _kva_list(phases)
    value = _positive(kva, "a kVA rating")
    rows = sorted(table)
    row = next((r for r in rows if r >= value), rows[-1])
    return table[row], row
