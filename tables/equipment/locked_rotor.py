"""Locked-rotor currents: NEC 2023 Tables 430.251(A) and 430.251(B), and the code letters of
Table 430.7(B).

Table 430.251(A): single-phase maximum locked-rotor current [A] by horsepower at 115, 208 and
230 V. Table 430.251(B): polyphase (two- and three-phase) Design B, C and D maximum locked-rotor
current [A] by horsepower at 115, 200, 208, 230, 460 and 575 V; its footnote says Design A motors
are not limited to a maximum starting current or locked-rotor current. The code prints both
tables "for use only with" 430.110, 440.12, 440.41 and 455.8(C) (disconnect and controller
ratings); gaugewalk uses them beside that as the starting current of a motor whose nameplate
locked-rotor current and code letter are unknown, a planning estimate the rule code must say it
makes. The tables have no system-voltage note of their own; the column is chosen the way the
full-load tables' headnotes choose it (120 V -> 115, 240 V -> 230, 480 V -> 460, 600 V -> 575),
the trade's convention.

Table 430.7(B): locked-rotor indicating code letters, kilovolt-amperes per horsepower with locked
rotor. The table prints each letter's range to two decimals (B is 3.15-3.54, C 3.55-3.99; some
third-party charts print B as 3.15-3.55) and V as "22.4 and up". 430.7(A)(7) requires the code
letter (or the locked-rotor amperes) on ac motors of 1/2 hp or more. Locked-rotor current from a
letter: I = kVA/hp x hp x 1000 / V single-phase, / (sqrt(3) V) three-phase, at the motor's rated
voltage.

Sources: Tables 430.251(A) and (B) typed from memory and checked cell by cell against a reprint of
the 2008 edition; Table 430.7(B) from memory, checked against the 2008 text and three public
charts. The values have not changed in the 2011-2023 editions as far as known (from memory).
"""

import math
from fractions import Fraction
from typing import NamedTuple

from gaugewalk.tables.equipment.horsepower import hp_text, parse_hp
from gaugewalk.tables.equipment.hp_tables import (
    MotorCurrent,
    checked_volts,
    keyed_by_hp,
    read_current,
)
from gaugewalk.tables.equipment.motors import voltage_column
from gaugewalk.tables.errors import TableLookupError, choices

TABLE_430_251_A = "Table 430.251(A)"
TABLE_430_251_B = "Table 430.251(B)"
TABLE_430_7_B = "Table 430.7(B)"

_: None = None  # no entry in the printed table

# NEC 2023 Table 430.251(A), single-phase maximum locked-rotor current [A].
COLUMNS_430_251_A: tuple[int, ...] = (115, 208, 230)
_ROWS_430_251_A: tuple[tuple[str, float, float, float], ...] = (
    ("1/2", 58.8, 32.5, 29.4),
    ("3/4", 82.8, 45.8, 41.4),
    ("1", 96, 53, 48),
    ("1-1/2", 120, 66, 60),
    ("2", 144, 80, 72),
    ("3", 204, 113, 102),
    ("5", 336, 186, 168),
    ("7-1/2", 480, 265, 240),
    ("10", 600, 332, 300),
)

# NEC 2023 Table 430.251(B), polyphase Design B, C and D maximum locked-rotor current [A].
COLUMNS_430_251_B: tuple[int, ...] = (115, 200, 208, 230, 460, 575)
_ROWS_430_251_B: tuple[tuple, ...] = (
    ("1/2", 40, 23, 22.1, 20, 10, 8),
    ("3/4", 50, 28.8, 27.6, 25, 12.5, 10),
    ("1", 60, 34.5, 33, 30, 15, 12),
    ("1-1/2", 80, 46, 44, 40, 20, 16),
    ("2", 100, 57.5, 55, 50, 25, 20),
    ("3", _, 73.6, 71, 64, 32, 25.6),
    ("5", _, 105.8, 102, 92, 46, 36.8),
    ("7-1/2", _, 146, 140, 127, 63.5, 50.8),
    ("10", _, 186.3, 179, 162, 81, 64.8),
    ("15", _, 267, 257, 232, 116, 93),
    ("20", _, 334, 321, 290, 145, 116),
    ("25", _, 420, 404, 365, 183, 146),
    ("30", _, 500, 481, 435, 218, 174),
    ("40", _, 667, 641, 580, 290, 232),
    ("50", _, 834, 802, 725, 363, 290),
    ("60", _, 1001, 962, 870, 435, 348),
    ("75", _, 1248, 1200, 1085, 543, 434),
    ("100", _, 1668, 1603, 1450, 725, 580),
    ("125", _, 2087, 2007, 1815, 908, 726),
    ("150", _, 2496, 2400, 2170, 1085, 868),
    ("200", _, 3335, 3207, 2900, 1450, 1160),
    ("250", _, _, _, _, 1825, 1460),
    ("300", _, _, _, _, 2200, 1760),
    ("350", _, _, _, _, 2550, 2040),
    ("400", _, _, _, _, 2900, 2320),
    ("450", _, _, _, _, 3250, 2600),
    ("500", _, _, _, _, 3625, 2900),
)

TABLE_430_251_A_LRA = keyed_by_hp(_ROWS_430_251_A)
"""hp -> single-phase locked-rotor current [A] in the columns ``COLUMNS_430_251_A``."""
TABLE_430_251_B_LRA = keyed_by_hp(_ROWS_430_251_B)
"""hp -> polyphase Design B, C, D locked-rotor current [A], ``COLUMNS_430_251_B`` (None: none)."""

# NEC 2023 Table 430.7(B): code letter -> kVA per horsepower with locked rotor (low, high);
# high None: "22.4 and up". The letters I, O and Q are not used.
CODE_LETTERS: dict[str, tuple[float, float | None]] = {
    "A": (0.0, 3.14),
    "B": (3.15, 3.54),
    "C": (3.55, 3.99),
    "D": (4.0, 4.49),
    "E": (4.5, 4.99),
    "F": (5.0, 5.59),
    "G": (5.6, 6.29),
    "H": (6.3, 7.09),
    "J": (7.1, 7.99),
    "K": (8.0, 8.99),
    "L": (9.0, 9.99),
    "M": (10.0, 11.19),
    "N": (11.2, 12.49),
    "P": (12.5, 13.99),
    "R": (14.0, 15.99),
    "S": (16.0, 17.99),
    "T": (18.0, 19.99),
    "U": (20.0, 22.39),
    "V": (22.4, None),
}

BASES = ("upper", "midpoint", "lower")
"""Where in a code letter's range to read: ``upper`` (the default) is the worst case for starting
voltage drop and the trade's usual reading; ``midpoint`` the likely value; ``lower`` the least."""

CODE_LETTER_MIN_HP = Fraction(1, 2)
"""[hp] 430.7(A)(7): the code letter is marked on ac motors of 1/2 hp or more."""


def locked_rotor_amps(hp, volts: float, phases: int) -> MotorCurrent:
    """Maximum locked-rotor current [A] by horsepower and voltage: NEC Table 430.251(A) for
    ``phases=1`` (columns 115, 208, 230 V) or Table 430.251(B) for ``phases=3`` (Design B, C and
    D; columns 115, 200, 208, 230, 460, 575 V). ``volts`` is the system or rated voltage [V]; 120 V
    reads 115, 240 V 230, 480 V 460 (the trade's convention, see the module docstring)."""
    if phases == 1 and not isinstance(phases, bool):
        rows, columns, table = TABLE_430_251_A_LRA, COLUMNS_430_251_A, TABLE_430_251_A
    elif phases == 3 and not isinstance(phases, bool):
        rows, columns, table = TABLE_430_251_B_LRA, COLUMNS_430_251_B, TABLE_430_251_B
    else:
        raise TableLookupError(f"no locked-rotor table for {phases!r} phases; phases are 1, 3")
    return read_current(hp, volts, rows, columns, table,
                        lambda v: voltage_column(v, columns, table))


def code_letter_range(letter: str) -> tuple[float, float | None]:
    """The kVA per horsepower range (low, high) of a Table 430.7(B) code letter; high is None for
    V ("22.4 and up"). Case-insensitive; raises ``TableLookupError`` listing the letters."""
    key = letter.strip().upper() if isinstance(letter, str) else letter
    if key not in CODE_LETTERS:
        raise TableLookupError(f"no locked-rotor code letter {letter!r} in {TABLE_430_7_B}; the "
                               f"letters are {choices(CODE_LETTERS)}")
    return CODE_LETTERS[key]


def kva_per_hp(letter: str, basis: str = "upper") -> float:
    """Locked-rotor kVA per horsepower for a code letter, read at ``basis`` (``BASES``). Letter V
    has no upper bound, so only ``basis="lower"`` reads it; the others raise."""
    if basis not in BASES:
        raise TableLookupError(f"no basis {basis!r}; bases are {choices(BASES)}")
    low, high = code_letter_range(letter)
    if basis == "lower":
        return low
    if high is None:
        raise TableLookupError(f"code letter V is '{low} and up' in {TABLE_430_7_B}: it has no "
                               f"upper bound or midpoint; use the nameplate locked-rotor current "
                               f"or basis 'lower' (at least {low} kVA/hp)")
    return high if basis == "upper" else round((low + high) / 2, 3)


class LockedRotor(NamedTuple):
    """Locked-rotor current from a code letter: ``amps`` [A], the ``kva_per_hp`` used and the
    ``basis`` it was read at."""
    amps: float
    kva_per_hp: float
    basis: str


def locked_rotor_amps_from_code_letter(letter: str, hp, volts: float, phases: int,
                                       basis: str = "upper") -> LockedRotor:
    """Locked-rotor current [A] of an ac motor from its nameplate code letter (NEC Table
    430.7(B)), horsepower and rated voltage ``volts`` [V]: kVA/hp x hp x 1000 / V (single-phase)
    or / (sqrt(3) V) (three-phase).

    The letter gives a range; ``basis="upper"`` (default) reads its top, the worst case for the
    starting voltage drop, which is how the trade reads it; ``"midpoint"`` and ``"lower"`` are
    there for a stated other choice. Motors under 1/2 hp are refused: 430.7(A)(7) requires the
    letter only from 1/2 hp, so use the nameplate locked-rotor current.
    """
    if phases not in (1, 3) or isinstance(phases, bool):
        raise TableLookupError(f"a code letter reads for 1 or 3 phases, not {phases!r}")
    hp_value = parse_hp(hp)
    if hp_value < CODE_LETTER_MIN_HP:
        raise TableLookupError(f"430.7(A)(7) marks code letters on ac motors of 1/2 hp or more, "
                               f"not {hp_text(hp_value)} hp; use the nameplate locked-rotor "
                               f"current")
    per_hp = kva_per_hp(letter, basis)
    v = checked_volts(volts)
    amps = per_hp * float(hp_value) * 1000.0 / (v if phases == 1 else math.sqrt(3) * v)
    return LockedRotor(amps, per_hp, basis)
