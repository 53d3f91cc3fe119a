"""The order: one line per thing a supplier sells, with an item code of gaugewalk's own.

Item codes are built from the line's attributes, so the same item has the same code on every job
(a price list keyed by them keeps working). Fields are joined by dots:

- conductor on a put-up: material, size, insulation, colour, put-up kind and length:
  ``CU.12AWG.THHN/THWN-2.BLACK.BOX500`` (ordered by the box, reel, coil or spool);
- conductor cut to length: the same ending in ``CUT`` (ordered by the foot);
- raceway: type, trade size and the length it is sold in: ``EMT.1/2.10FT`` or ``FMC.3/4.COIL``
  (ordered by the foot);
- fittings: type, trade size and the fitting: ``EMT.1/2.COUPLING`` (ordered each).

Descriptions say the same in words and carry no job quantities, so they too can key a price list.
"""

from __future__ import annotations

import math
import re

from gaugewalk.model.walk.takeoff.lines import FittingLine, OrderLine, RacewayLine, WireLine
from gaugewalk.tables.order.putups import CUT_LABEL

MATERIAL_NAMES = {"cu": "copper", "al": "aluminum"}

#: Words in a put-up's label that name how it is sold (the order's unit); otherwise "each".
PUTUP_KINDS: tuple[str, ...] = ("box", "reel", "coil", "spool", "carton", "pail")

_FITTING_CODES = {
    "coupling": "COUPLING", "connector": "CONNECTOR", "support": "SUPPORT",
    "90-degree elbow": "ELBOW90", "conduit body": "CONDUIT-BODY", "pull box": "PULL-BOX",
    "pull box or handhole": "PULL-BOX-OR-HANDHOLE",
}
_FITTING_WORDS = {"support": "support (strap or hanger)"}

#: Characters that make a spreadsheet read a cell as a formula (or that hide one before it).
FORMULA_STARTS = ("=", "+", "-", "@", "\t", "\r")


def spreadsheet_safe(value):
    """A cell a spreadsheet shows as text: text starting with ``= + - @``, a tab or a carriage
    return gets a leading apostrophe, so it is never read as a formula. Numbers pass as they are."""
    if isinstance(value, str) and value.startswith(FORMULA_STARTS):
        return "'" + value
    return value


def _code(text: str) -> str:
    """Upper case, blanks to hyphens, dots (the field separator) to hyphens."""
    return re.sub(r"[\s.]+", "-", text.strip()).upper()


def size_code(size: str) -> str:
    """``12 AWG`` -> ``12AWG``, ``1/0 AWG`` -> ``1/0AWG``, ``250 kcmil`` -> ``250KCMIL``."""
    return size.replace(" ", "").upper()


def putup_unit(label: str) -> str:
    """How a put-up is sold, from a word in its label: box, reel, coil, ...; else each."""
    words = re.findall(r"[a-z]+", label.lower())
    for kind in PUTUP_KINDS:
        if kind in words:
            return kind
    return "each"


def _conductor(w: WireLine) -> str:
    material = MATERIAL_NAMES.get(w.material, w.material)
    if w.insulation == "bare":
        return f"{w.size} bare {material}"
    return f"{w.size} {material} {w.insulation}, {w.colour}"


def wire_order(w: WireLine) -> list[OrderLine]:
    """The order lines of one conductor line: one per put-up, one for what is cut to length."""
    base = ".".join((w.material.upper(), size_code(w.size), _code(w.insulation), _code(w.colour)))
    out: list[OrderLine] = []
    cut_ft = 0
    for p in w.order:
        if p.label == CUT_LABEL:
            cut_ft += p.length_ft * p.count
            continue
        unit = putup_unit(p.label)
        kind = "PUTUP" if unit == "each" else unit.upper()
        out.append(OrderLine(f"{base}.{kind}{p.length_ft}", f"{_conductor(w)}, {p.label}",
                             p.count, unit, "wire", p.length_ft))
    if cut_ft:
        out.append(OrderLine(f"{base}.CUT", f"{_conductor(w)}, {CUT_LABEL}", cut_ft, "ft",
                             "wire", 1))
    return out


def raceway_order(r: RacewayLine) -> OrderLine:
    """The order line of one raceway type and trade size, by the foot."""
    head = f"{_code(r.raceway)}.{_code(r.trade_size)}"
    if r.sticks is None or r.stick_ft is None:
        return OrderLine(f"{head}.COIL", f"{r.raceway}, trade size {r.trade_size}, in coils",
                         math.ceil(round(r.length_ft, 6)), "ft", "raceway", 1)
    stick = f"{r.stick_ft:g}"
    return OrderLine(f"{head}.{stick}FT", f"{r.raceway}, trade size {r.trade_size}, {stick} ft lengths",
                     math.ceil(round(r.sticks * r.stick_ft, 6)), "ft", "raceway", 1)


def fitting_order(f: FittingLine) -> OrderLine:
    """The order line of one fitting for one raceway type and trade size, each."""
    code = _FITTING_CODES.get(f.item, _code(f.item))
    words = _FITTING_WORDS.get(f.item, f.item)
    return OrderLine(f"{_code(f.raceway)}.{_code(f.trade_size)}.{code}",
                     f"{words}, {f.raceway} trade size {f.trade_size}", f.count, "each",
                     "fitting", None)


def order_lines(wire: tuple[WireLine, ...], raceway: tuple[RacewayLine, ...],
                fittings: tuple[FittingLine, ...]) -> tuple[OrderLine, ...]:
    """Every orderable item once: conductors, raceway, fittings, in the takeoff's order. Lines
    that come to the same item code are added together."""
    merged: dict[str, OrderLine] = {}
    lines = [line for w in wire for line in wire_order(w)]
    lines += [raceway_order(r) for r in raceway]
    lines += [fitting_order(f) for f in fittings]
    for line in lines:
        seen = merged.get(line.item)
        merged[line.item] = line if seen is None else OrderLine(
            seen.item, seen.description, seen.quantity + line.quantity, seen.unit, seen.section,
            seen.ft_per_unit)
    return tuple(merged.values())
