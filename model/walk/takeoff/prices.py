"""The user's own unit prices, read from a small CSV file, put against the order.

The file is plain CSV, one price a line: ``item or description, unit_price[, unit]``. The first
cell is one of gaugewalk's item codes (``CU.12AWG.THHN/THWN-2.BLACK.BOX500``) or an order line's
description (``12 AWG copper THHN/THWN-2, black, 500 ft box``), matched without regard to case or
repeated blanks. A header line naming the columns may come first (``item``, ``description``,
``unit_price``, ``unit``, in any order; other columns are left alone). Blank lines and lines
starting with ``#`` are skipped. ``unit_price`` is a plain number (a leading ``$`` is allowed),
never negative. ``unit`` is optional: without it the price is per the order line's own unit;
``ft``, ``C`` (per 100 ft) and ``M`` (per 1,000 ft) price anything ordered by length, a box or a
reel by its feet; ``each`` prices anything counted (a fitting, a box, a reel); a put-up word
(``box``, ``reel``, ...) must be the line's unit.

Money is kept in decimal; each cost is rounded to cents. A file that cannot be used gets one
message naming the file and line (``PriceFileError``).
"""

from __future__ import annotations

import csv
import io
import re
from dataclasses import dataclass
from decimal import ROUND_HALF_UP, Decimal, InvalidOperation
from pathlib import Path
from typing import Sequence

from gaugewalk.model.walk.problems import clip  # the one way problems echo user text
from gaugewalk.model.walk.takeoff.lines import OrderLine
from gaugewalk.model.walk.takeoff.order import PUTUP_KINDS

#: Largest price file read [bytes].
MAX_PRICE_FILE_BYTES = 5_000_000
CENT = Decimal("0.01")

#: Units a price may be given in: name -> feet per unit (None: counted, not measured).
_LENGTH_UNITS = {"ft": 1, "c": 100, "m": 1000}
_UNIT_ALIASES = {
    "ft": "ft", "foot": "ft", "feet": "ft", "c": "c", "cft": "c", "m": "m", "mft": "m",
    "each": "each", "ea": "each", "piece": "each", "pc": "each",
    **{kind: kind for kind in PUTUP_KINDS},
}
UNITS_TEXT = "ft, C (per 100 ft), M (per 1,000 ft), each, " + ", ".join(PUTUP_KINDS)

_HEADER_NAMES = {
    "item": "item", "code": "item", "item code": "item", "item_code": "item",
    "description": "description", "item or description": "key",
    "unit_price": "price", "unit price": "price", "price": "price",
    "unit": "unit",
}


class PriceFileError(ValueError):
    """A price file gaugewalk cannot use; the message names the file and line. Text echoed from
    the file goes through ``shown``."""


def shown(text: str) -> str:
    """Text from the file as a message echoes it: one line, control characters escaped, very
    long words shortened (the rule problems with walk files follow)."""
    return clip(text)


@dataclass(frozen=True)
class Price:
    """One line of the price file."""

    key: str                # the item code or description as written
    unit_price: Decimal
    unit: str | None        # "ft", "c", "m", "each", a put-up word; None: the line's own
    line: int               # where it is in the file


@dataclass(frozen=True)
class PriceBook:
    """The prices of one file, by item code or description (case and blanks folded)."""

    name: str
    prices: dict[str, Price]

    def find(self, line: OrderLine) -> Price | None:
        return self.prices.get(fold(line.item)) or self.prices.get(fold(line.description))


@dataclass(frozen=True)
class PricedLine:
    line: OrderLine
    unit_price: Decimal | None      # per the order line's unit; None: no price
    cost: Decimal | None            # quantity x unit price, to the cent


@dataclass(frozen=True)
class PricedOrder:
    lines: tuple[PricedLine, ...]
    total_cost: Decimal             # of the priced lines
    unpriced: tuple[OrderLine, ...]


def fold(text: str) -> str:
    """How keys are compared: case folded, runs of blanks as one space, ends trimmed."""
    return re.sub(r"\s+", " ", text).strip().casefold()


def read_prices(path: str | Path) -> PriceBook:
    """Read a price file. Raises ``PriceFileError`` naming the file and line."""
    name = str(path)
    try:
        with open(path, "rb") as handle:
            data = handle.read(MAX_PRICE_FILE_BYTES + 1)
    except FileNotFoundError:
        raise PriceFileError(f"{name}: no such price file") from None
    except IsADirectoryError:
        raise PriceFileError(f"{name}: is a folder, not a price file") from None
    except OSError as exc:
        raise PriceFileError(f"{name}: cannot be read: {exc.strerror or exc}") from None
    if len(data) > MAX_PRICE_FILE_BYTES:
        raise PriceFileError(f"{name}: larger than {MAX_PRICE_FILE_BYTES:,} bytes; "
                             "not read as a price file")
    try:
        text = data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        line = data[:exc.start].count(b"\n") + 1
        raise PriceFileError(f"{name}: line {line}: not UTF-8 text") from None
    return parse_prices(text, name)


def parse_prices(text: str, name: str = "prices") -> PriceBook:
    """The prices in ``text`` (the content of a price file called ``name``)."""
    reader = csv.reader(io.StringIO(text, newline=""), strict=True)
    prices: dict[str, Price] = {}
    columns: dict[str, int] | None = None
    first = True
    try:
        for cells in reader:
            n = reader.line_num
            if not any(c.strip() for c in cells) or cells[0].lstrip().startswith("#"):
                continue
            if first:
                first = False
                columns = _header(cells, name, n)
                if columns is not None:
                    continue
            key, description, price_text, unit_text = _cells(cells, columns, name, n)
            price = Price(key or description, _price(price_text, name, n), _unit(unit_text, name, n), n)
            for k in (key, description):
                if not k:
                    continue
                seen = prices.get(fold(k))
                if seen is not None:
                    raise PriceFileError(f"{name}: line {n}: '{shown(k)}' is priced again "
                                         f"(first on line {seen.line})")
                prices[fold(k)] = price
    except csv.Error as exc:
        raise PriceFileError(f"{name}: line {reader.line_num}: {shown(str(exc))}") from None
    if not prices:
        raise PriceFileError(f"{name}: no prices in it (one a line: item or description, "
                             "unit_price[, unit])")
    return PriceBook(name, prices)


def _header(cells: list[str], name: str, n: int) -> dict[str, int] | None:
    """The columns a header line names, or None when the line is not a header."""
    named = {i: _HEADER_NAMES.get(fold(c)) for i, c in enumerate(cells)}
    if "price" not in named.values():
        return None
    columns: dict[str, int] = {}
    for i, role in named.items():
        if role is None:
            continue
        if role in columns:
            raise PriceFileError(f"{name}: line {n}: the header names the {role} column twice")
        columns[role] = i
    if not {"item", "description", "key"} & set(columns):
        raise PriceFileError(f"{name}: line {n}: the header names no item or description column")
    return columns


def _cells(cells: list[str], columns: dict[str, int] | None, name: str, n: int
           ) -> tuple[str, str, str, str]:
    """(item or key, description, price, unit) of one line, stripped."""
    cells = [c.strip() for c in cells]
    if columns is None:
        while cells and not cells[-1]:
            cells.pop()
        if not 2 <= len(cells) <= 3:
            raise PriceFileError(f"{name}: line {n}: {len(cells)} cell(s); a price line is "
                                 "item or description, unit_price[, unit]")
        key, price = cells[0], cells[1]
        unit = cells[2] if len(cells) == 3 else ""
        if not key:
            raise PriceFileError(f"{name}: line {n}: no item or description")
        return key, "", price, unit

    def cell(role: str) -> str:
        i = columns.get(role)
        return cells[i] if i is not None and i < len(cells) else ""

    key = cell("item") or cell("key")
    description = cell("description")
    if not key and not description:
        raise PriceFileError(f"{name}: line {n}: no item or description")
    return key, description, cell("price"), cell("unit")


def _price(text: str, name: str, n: int) -> Decimal:
    number = text[1:].strip() if text.startswith("$") else text
    try:
        value = Decimal(number)
    except InvalidOperation:
        value = None
    if value is None or not value.is_finite() or not number:
        raise PriceFileError(f"{name}: line {n}: unit_price '{shown(text)}' is not a number")
    if value < 0:
        raise PriceFileError(f"{name}: line {n}: unit_price {shown(text)} is negative")
    return value


def _unit(text: str, name: str, n: int) -> str | None:
    if not text:
        return None
    unit = _UNIT_ALIASES.get(text.strip().lower())
    if unit is None:
        raise PriceFileError(f"{name}: line {n}: unit '{shown(text)}' is not one of {UNITS_TEXT}")
    return unit


def _per_line_unit(price: Price, line: OrderLine, book: PriceBook) -> Decimal:
    """The price per the order line's unit. Raises ``PriceFileError`` where the units differ and
    one cannot be turned into the other."""
    if price.unit is None or price.unit == line.unit or (price.unit == "each" and line.unit != "ft"):
        return price.unit_price
    if price.unit in _LENGTH_UNITS and line.ft_per_unit is not None:
        return price.unit_price * line.ft_per_unit / _LENGTH_UNITS[price.unit]
    per = {"c": "C (100 ft)", "m": "M (1,000 ft)"}.get(price.unit, price.unit)
    ordered = {"each": "each", "ft": "by the foot"}.get(line.unit, f"by the {line.unit}")
    raise PriceFileError(
        f"{book.name}: line {price.line}: priced per {per}, but {line.item} is ordered {ordered}"
    )


def price_order(order: Sequence[OrderLine], book: PriceBook) -> PricedOrder:
    """Unit prices and costs of ``order`` from ``book``; lines with no price are listed apart."""
    lines: list[PricedLine] = []
    unpriced: list[OrderLine] = []
    total = Decimal(0)
    for line in order:
        price = book.find(line)
        if price is None:
            lines.append(PricedLine(line, None, None))
            unpriced.append(line)
            continue
        unit_price = _per_line_unit(price, line, book)
        cost = (unit_price * line.quantity).quantize(CENT, rounding=ROUND_HALF_UP)
        total += cost
        lines.append(PricedLine(line, unit_price, cost))
    return PricedOrder(tuple(lines), total, tuple(unpriced))


def money(value: Decimal | None) -> str:
    """A price or cost as text: cents, or more places where the price has them; blank for none."""
    if value is None:
        return ""
    if value == value.quantize(CENT):
        return f"{value.quantize(CENT)}"
    return f"{value.normalize():f}"
