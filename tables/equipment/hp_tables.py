"""Tables keyed by horsepower (NEC Tables 430.247-430.251): building their rows and reading a cell,
shared by ``motors`` and ``locked_rotor`` so both refuse the same way."""

from fractions import Fraction
from typing import Callable, NamedTuple

from gaugewalk.tables.equipment.horsepower import hp_text, parse_hp
from gaugewalk.tables.errors import TableLookupError, choices

Rows = dict[Fraction, tuple[float | None, ...]]


class MotorCurrent(NamedTuple):
    """A current read from a motor table: ``amps`` [A], the ``table`` it came from and the
    ``column`` [V] read."""
    amps: float
    table: str
    column: int


def checked_volts(volts: float) -> float:
    """``volts`` [V] as a float, or ``TableLookupError`` if it is not a positive number."""
    if isinstance(volts, bool) or not isinstance(volts, (int, float)) or not volts > 0:
        raise TableLookupError(f"a voltage must be a positive number of volts, not {volts!r}")
    return float(volts)


def keyed_by_hp(rows) -> Rows:
    """Printed rows ``(hp text, value, value, ...)`` (None for an empty cell) keyed by exact
    horsepower, values as floats."""
    return {parse_hp(row[0]): tuple(None if v is None else float(v) for v in row[1:])
            for row in rows}


def row_hp(value, rows: Rows, table: str) -> Fraction:
    """The horsepower ``value`` (any spelling ``parse_hp`` reads) if ``table`` lists it; else
    ``TableLookupError`` listing the table's ratings."""
    hp = parse_hp(value)
    if hp not in rows:
        raise TableLookupError(f"{table} lists no {hp_text(hp)} hp motor; its ratings are "
                               f"{choices(hp_text(h) for h in rows)} hp")
    return hp


def read_current(value, volts: float, rows: Rows, columns: tuple[int, ...], table: str,
                 column_of: Callable[[float], int]) -> MotorCurrent:
    """The cell of ``table`` at horsepower ``value`` and the column ``column_of(volts)`` picks;
    an empty cell raises ``TableLookupError`` saying which ratings the column covers."""
    hp = row_hp(value, rows, table)
    col = column_of(volts)
    i = columns.index(col)
    amps = rows[hp][i]
    if amps is None:
        listed = [hp_text(h) for h, row in rows.items() if row[i] is not None]
        raise TableLookupError(f"{table} lists no {col} V current for a {hp_text(hp)} hp motor; "
                               f"its {col} V column runs {listed[0]} to {listed[-1]} hp")
    return MotorCurrent(amps, table, col)
