"""Motor full-load currents, NEC 2023 Tables 430.247 (dc), 430.248 (single-phase ac) and 430.250
(three-phase ac), and the voltage column a system reads.

430.6(A)(1): conductor ampacities and the ratings of the branch short-circuit and ground-fault
device are taken from these tables (by horsepower and voltage), not from the nameplate; the
nameplate current sets the separate overload protection (430.32). Motors built for low speeds
(1200 rpm or less) or high torques, and multispeed motors, use the nameplate current instead
(430.6(A)(1)); that choice belongs to the rule code.

Voltage columns. The tables' headnotes: the voltages listed are rated motor voltages, and the
currents listed are permitted for system voltage ranges of 110 to 120 and 220 to 240 V (Table
430.248), and 110 to 120, 220 to 240, 440 to 480 and 550 to 600 V (Table 430.250). So a 120 V
system reads the 115 V column, 240 V the 230 V column, 480 V the 460 V column and 600 V the
575 V column; a 208 V or 200 V system reads its own column (``voltage_column``). The 208 and
200 V columns are the 230 V currents increased by 10 and 15 percent (a note said so in older
editions, from memory; the tests check that the columns follow it). Table 430.247 (dc) lists
armature voltage ratings with no system range, so a dc lookup needs one of them exactly.

Omitted on purpose: the 2300 V columns of Table 430.250 (medium-voltage motors, Part XI of
Article 430, outside this tool) and Table 430.249 (two-phase motors).

Sources. Typed from memory, then checked cell by cell against reprints of the same tables in the
1999, 2008 and 2017 editions (the values have not changed since; an equipment maker's 2017 reprint
of Table 430.250, a 1999 reprint of Tables 430-148 and 430-150, the 2008 text of Tables 430.247,
430.248 and 430.250); no 2023 reprint was at hand. The synchronous-motor columns of Table 430.250
(unity power factor; 90 and 80 percent power factor multiply by 1.1 and 1.25) are from the same
reprints.
"""

from __future__ import annotations

from fractions import Fraction

from gaugewalk.tables.equipment.hp_tables import (
    MotorCurrent,
    checked_volts,
    keyed_by_hp,
    read_current,
    row_hp,
)
from gaugewalk.tables.errors import TableLookupError, choices

TABLE_430_247 = "Table 430.247"
TABLE_430_248 = "Table 430.248"
TABLE_430_250 = "Table 430.250"
TABLE_430_250_SYNC = "Table 430.250 (synchronous, unity power factor)"

_: None = None  # no entry in the printed table

# NEC 2023 Table 430.248, full-load current [A], single-phase ac motors.
COLUMNS_430_248: tuple[int, ...] = (115, 200, 208, 230)
_ROWS_430_248: tuple[tuple[str, float, float, float, float], ...] = (
    ("1/6", 4.4, 2.5, 2.4, 2.2),
    ("1/4", 5.8, 3.3, 3.2, 2.9),
    ("1/3", 7.2, 4.1, 4.0, 3.6),
    ("1/2", 9.8, 5.6, 5.4, 4.9),
    ("3/4", 13.8, 7.9, 7.6, 6.9),
    ("1", 16, 9.2, 8.8, 8.0),
    ("1-1/2", 20, 11.5, 11.0, 10),
    ("2", 24, 13.8, 13.2, 12),
    ("3", 34, 19.6, 18.7, 17),
    ("5", 56, 32.2, 30.8, 28),
    ("7-1/2", 80, 46.0, 44.0, 40),
    ("10", 100, 57.5, 55.0, 50),
)

# NEC 2023 Table 430.250, full-load current [A], three-phase ac motors, induction type squirrel
# cage and wound rotor (the 2300 V column left out, see the module docstring).
COLUMNS_430_250: tuple[int, ...] = (115, 200, 208, 230, 460, 575)
_ROWS_430_250: tuple[tuple, ...] = (
    ("1/2", 4.4, 2.5, 2.4, 2.2, 1.1, 0.9),
    ("3/4", 6.4, 3.7, 3.5, 3.2, 1.6, 1.3),
    ("1", 8.4, 4.8, 4.6, 4.2, 2.1, 1.7),
    ("1-1/2", 12.0, 6.9, 6.6, 6.0, 3.0, 2.4),
    ("2", 13.6, 7.8, 7.5, 6.8, 3.4, 2.7),
    ("3", _, 11.0, 10.6, 9.6, 4.8, 3.9),
    ("5", _, 17.5, 16.7, 15.2, 7.6, 6.1),
    ("7-1/2", _, 25.3, 24.2, 22, 11, 9),
    ("10", _, 32.2, 30.8, 28, 14, 11),
    ("15", _, 48.3, 46.2, 42, 21, 17),
    ("20", _, 62.1, 59.4, 54, 27, 22),
    ("25", _, 78.2, 74.8, 68, 34, 27),
    ("30", _, 92, 88, 80, 40, 32),
    ("40", _, 120, 114, 104, 52, 41),
    ("50", _, 150, 143, 130, 65, 52),
    ("60", _, 177, 169, 154, 77, 62),
    ("75", _, 221, 211, 192, 96, 77),
    ("100", _, 285, 273, 248, 124, 99),
    ("125", _, 359, 343, 312, 156, 125),
    ("150", _, 414, 396, 360, 180, 144),
    ("200", _, 552, 528, 480, 240, 192),
    ("250", _, _, _, _, 302, 242),
    ("300", _, _, _, _, 361, 289),
    ("350", _, _, _, _, 414, 336),
    ("400", _, _, _, _, 477, 382),
    ("450", _, _, _, _, 515, 412),
    ("500", _, _, _, _, 590, 472),
)

# NEC 2023 Table 430.250, synchronous type, unity power factor [A] (2300 V column left out).
COLUMNS_430_250_SYNC: tuple[int, ...] = (230, 460, 575)
_ROWS_430_250_SYNC: tuple[tuple[str, int, int, int], ...] = (
    ("25", 53, 26, 21),
    ("30", 63, 32, 26),
    ("40", 83, 41, 33),
    ("50", 104, 52, 42),
    ("60", 123, 61, 49),
    ("75", 155, 78, 62),
    ("100", 202, 101, 81),
    ("125", 253, 126, 101),
    ("150", 302, 151, 121),
    ("200", 400, 201, 161),
)

SYNC_POWER_FACTOR_MULTIPLIERS: dict[float, float] = {1.0: 1.0, 0.9: 1.1, 0.8: 1.25}
"""Table 430.250 footnote: for 90 and 80 percent power factor the synchronous figures are
multiplied by 1.1 and 1.25."""

# NEC 2023 Table 430.247, full-load current [A], dc motors, by armature voltage rating.
COLUMNS_430_247: tuple[int, ...] = (90, 120, 180, 240, 500, 550)
_ROWS_430_247: tuple[tuple, ...] = (
    ("1/4", 4.0, 3.1, 2.0, 1.6, _, _),
    ("1/3", 5.2, 4.1, 2.6, 2.0, _, _),
    ("1/2", 6.8, 5.4, 3.4, 2.7, _, _),
    ("3/4", 9.6, 7.6, 4.8, 3.8, _, _),
    ("1", 12.2, 9.5, 6.1, 4.7, _, _),
    ("1-1/2", _, 13.2, 8.3, 6.6, _, _),
    ("2", _, 17, 10.8, 8.5, _, _),
    ("3", _, 25, 16, 12.2, _, _),
    ("5", _, 40, 27, 20, _, _),
    ("7-1/2", _, 58, _, 29, 13.6, 12.2),
    ("10", _, 76, _, 38, 18, 16),
    ("15", _, _, _, 55, 27, 24),
    ("20", _, _, _, 72, 34, 31),
    ("25", _, _, _, 89, 43, 38),
    ("30", _, _, _, 106, 51, 46),
    ("40", _, _, _, 140, 67, 61),
    ("50", _, _, _, 173, 83, 75),
    ("60", _, _, _, 206, 99, 90),
    ("75", _, _, _, 255, 123, 111),
    ("100", _, _, _, 341, 164, 148),
    ("125", _, _, _, 425, 205, 185),
    ("150", _, _, _, 506, 246, 222),
    ("200", _, _, _, 675, 330, 294),
)

TABLE_430_248_FLC = keyed_by_hp(_ROWS_430_248)
"""hp -> full-load current [A] in the columns ``COLUMNS_430_248``."""
TABLE_430_250_FLC = keyed_by_hp(_ROWS_430_250)
"""hp -> full-load current [A] in the columns ``COLUMNS_430_250`` (None: no entry)."""
TABLE_430_250_SYNC_FLC = keyed_by_hp(_ROWS_430_250_SYNC)
"""hp -> synchronous-motor full-load current [A] at unity power factor, ``COLUMNS_430_250_SYNC``."""
TABLE_430_247_FLC = keyed_by_hp(_ROWS_430_247)
"""hp -> dc full-load current [A] in the columns ``COLUMNS_430_247`` (None: no entry)."""

# System voltage ranges the headnotes of Tables 430.248 and 430.250 permit for each column [V].
_SYSTEM_RANGES: dict[int, tuple[float, float]] = {
    115: (110, 120), 200: (200, 200), 208: (208, 208), 230: (220, 240), 460: (440, 480),
    575: (550, 600),
}


def _phases(phases: int) -> int:
    if phases not in (1, 3) or isinstance(phases, bool):
        raise TableLookupError(f"no motor tables for {phases!r} phases; ac motor phases are 1, 3 "
                               f"(dc motors: dc_motor_flc)")
    return phases


def _ranges_text(columns: tuple[int, ...]) -> str:
    parts = []
    for col in columns:
        low, high = _SYSTEM_RANGES[col]
        parts.append(f"{col} V ({low:g}-{high:g} V systems)" if low != high else f"{col} V")
    return ", ".join(parts)


def voltage_column(volts: float, columns: tuple[int, ...], table: str) -> int:
    """The column [V] of a motor table that a system or rated voltage ``volts`` [V] reads, by the
    system voltage ranges of the headnotes to Tables 430.248 and 430.250 (120 V -> 115, 240 V ->
    230, 480 V -> 460, 600 V -> 575; 208 and 200 V their own). Raises ``TableLookupError`` naming
    the table's columns for a voltage no column covers (277 V, 347 V, 2400 V...)."""
    v = checked_volts(volts)
    for col in columns:
        low, high = _SYSTEM_RANGES[col]
        if low <= v <= high:
            return col
    raise TableLookupError(f"{table} has no column for {v:g} V; its columns are "
                           f"{_ranges_text(columns)}")


def flc_column(volts: float, phases: int) -> int:
    """The Table 430.248 (``phases=1``) or 430.250 (``phases=3``) column [V] for ``volts`` [V]."""
    if _phases(phases) == 1:
        return voltage_column(volts, COLUMNS_430_248, TABLE_430_248)
    return voltage_column(volts, COLUMNS_430_250, TABLE_430_250)


def horsepowers(phases: int) -> tuple[Fraction, ...]:
    """The horsepower rows of Table 430.248 (``phases=1``) or 430.250 (``phases=3``), smallest
    first."""
    return tuple(_flc_table(phases)[0])


def _flc_table(phases: int):
    if _phases(phases) == 1:
        return TABLE_430_248_FLC, COLUMNS_430_248, TABLE_430_248
    return TABLE_430_250_FLC, COLUMNS_430_250, TABLE_430_250


def table_hp(value, phases: int) -> Fraction:
    """A horsepower (any spelling ``parse_hp`` reads) checked against Table 430.248
    (``phases=1``) or 430.250 (``phases=3``); raises ``TableLookupError`` listing the table's
    ratings for one it does not list (``4 hp``)."""
    rows, _cols, table = _flc_table(phases)
    return row_hp(value, rows, table)


def motor_flc(hp, volts: float, phases: int) -> MotorCurrent:
    """Full-load current of an ac induction motor, NEC Table 430.248 (``phases=1``) or Table
    430.250 (``phases=3``, squirrel cage and wound rotor), by horsepower ``hp`` (any spelling
    ``parse_hp`` reads) and system or rated voltage ``volts`` [V] (column by ``voltage_column``).
    430.6(A)(1): this, not the nameplate, sizes the conductors and the branch device.

    >>> motor_flc("25 hp", 480, 3)
    MotorCurrent(amps=34.0, table='Table 430.250', column=460)
    """
    rows, columns, table = _flc_table(phases)
    return read_current(hp, volts, rows, columns, table, lambda v: flc_column(v, phases))


def synchronous_motor_flc(hp, volts: float, power_factor: float = 1.0) -> MotorCurrent:
    """Full-load current of a three-phase synchronous motor, NEC Table 430.250 (synchronous type,
    unity power factor columns 230, 460, 575 V), times 1.1 at 0.9 and 1.25 at 0.8 power factor
    (the table's footnote). ``power_factor`` must be 1.0, 0.9 or 0.8."""
    if power_factor not in SYNC_POWER_FACTOR_MULTIPLIERS or isinstance(power_factor, bool):
        raise TableLookupError(f"Table 430.250 gives synchronous currents at power factor "
                               f"{choices(SYNC_POWER_FACTOR_MULTIPLIERS)}, not {power_factor!r}")
    found = read_current(hp, volts, TABLE_430_250_SYNC_FLC, COLUMNS_430_250_SYNC,
                         TABLE_430_250_SYNC,
                    lambda v: voltage_column(v, COLUMNS_430_250_SYNC, TABLE_430_250_SYNC))
    amps = round(found.amps * SYNC_POWER_FACTOR_MULTIPLIERS[power_factor], 2)
    return MotorCurrent(amps, found.table, found.column)


def dc_motor_flc(hp, armature_volts: float) -> MotorCurrent:
    """Full-load current of a dc motor running at base speed, NEC Table 430.247, by horsepower
    and armature voltage rating [V] (exactly one of 90, 120, 180, 240, 500, 550)."""
    def column(v: float) -> int:
        v = checked_volts(v)
        if v not in COLUMNS_430_247:
            raise TableLookupError(f"{TABLE_430_247} has no column for {v:g} V; its armature "
                                   f"voltage ratings are {choices(COLUMNS_430_247)} V")
        return int(v)
    return read_current(hp, armature_volts, TABLE_430_247_FLC, COLUMNS_430_247, TABLE_430_247,
                        column)
