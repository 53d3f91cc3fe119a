"""NEC 2023 Table 310.16 ampacities and the corrections of 310.15(B)(1)(1) and 310.15(C)(1).

Table 310.16: insulated conductors rated up to and including 2000 V, 60 C through 90 C, not more
than three current-carrying conductors in a raceway, cable or earth, ambient 30 C [86 F].
Columns 60, 75 and 90 C for copper and for aluminum or copper-clad aluminum. Values are the ones
printed since the 2011 edition (2020 and 2023 included); many free charts still show the older
numbers for 14 and 12 AWG and a few large sizes. 18 and 16 AWG copper appear only in the 90 C
column; aluminum starts at 12 AWG. The small-conductor limits of 240.4(D) still apply
(``gaugewalk.tables.protection.ocpd.small_conductor_max_ocpd``). Typed from memory; the cells
revised in 2011 agree with the project's trade notes, and the tests check the ambient factors
against the 310.15(B) equation they come from.

Section numbers are the 2023 edition's: the ambient table was 310.15(B)(2)(a) in 2011-2017 and
310.15(B)(1) in 2020; the adjustment for more than three conductors was 310.15(B)(3)(a) in
2011-2017 and is 310.15(C)(1) in 2020 and 2023.
"""

from __future__ import annotations

import re

from gaugewalk.tables.conductor.sizes import canonical
from gaugewalk.tables.errors import TableLookupError, choices

COLUMNS = (60, 75, 90)

# NEC 2023 Table 310.16 [A]: size -> (Cu 60, Cu 75, Cu 90, Al 60, Al 75, Al 90); None: no entry.
TABLE_310_16: dict[str, tuple[int | None, ...]] = {
    "18 AWG": (None, None, 14, None, None, None),
    "16 AWG": (None, None, 18, None, None, None),
    "14 AWG": (15, 20, 25, None, None, None),
    "12 AWG": (20, 25, 30, 15, 20, 25),
    "10 AWG": (30, 35, 40, 25, 30, 35),
    "8 AWG": (40, 50, 55, 35, 40, 45),
    "6 AWG": (55, 65, 75, 40, 50, 55),
    "4 AWG": (70, 85, 95, 55, 65, 75),
    "3 AWG": (85, 100, 115, 65, 75, 85),
    "2 AWG": (95, 115, 130, 75, 90, 100),
    "1 AWG": (110, 130, 145, 85, 100, 115),
    "1/0 AWG": (125, 150, 170, 100, 120, 135),
    "2/0 AWG": (145, 175, 195, 115, 135, 150),
    "3/0 AWG": (165, 200, 225, 130, 155, 175),
    "4/0 AWG": (195, 230, 260, 150, 180, 205),
    "250 kcmil": (215, 255, 290, 170, 205, 230),
    "300 kcmil": (240, 285, 320, 195, 230, 260),
    "350 kcmil": (260, 310, 350, 210, 250, 280),
    "400 kcmil": (280, 335, 380, 225, 270, 305),
    "500 kcmil": (320, 380, 430, 260, 310, 350),
    "600 kcmil": (350, 420, 475, 285, 340, 385),
    "700 kcmil": (385, 460, 520, 315, 375, 425),
    "750 kcmil": (400, 475, 535, 320, 385, 435),
    "800 kcmil": (410, 490, 555, 330, 395, 445),
    "900 kcmil": (435, 520, 585, 355, 425, 480),
    "1000 kcmil": (455, 545, 615, 375, 445, 500),
    "1250 kcmil": (495, 590, 665, 405, 485, 545),
    "1500 kcmil": (525, 625, 705, 435, 520, 585),
    "1750 kcmil": (545, 650, 735, 455, 545, 615),
    "2000 kcmil": (555, 665, 750, 470, 560, 630),
}


def _column(column: int) -> int:
    if column not in COLUMNS:
        raise TableLookupError(
            f"no temperature column {column} C in Table 310.16; columns are {choices(COLUMNS)}")
    return column


def ampacity(size: str, material: str, column: int) -> float | None:
    """Allowable ampacity [A] from NEC Table 310.16, or None where the table has no entry.

    ``material`` is ``"cu"`` or ``"al"`` (aluminum or copper-clad aluminum); ``column`` is the
    temperature column [C]: 60, 75 or 90.
    """
    if material not in ("cu", "al"):
        raise TableLookupError(f"no conductor material '{material}'; materials are cu, al")
    i = COLUMNS.index(_column(column)) + (0 if material == "cu" else 3)
    value = TABLE_310_16[canonical(size)][i]
    return None if value is None else float(value)


# Insulation type -> temperature rating [C] in dry and damp locations (NEC Table 310.4(1), 2023).
# Types with a lower rating in wet locations are listed in WET_TEMP.
INSULATION_TEMP: dict[str, int] = {
    "THHN/THWN-2": 90,   # dual-rated building wire, 90 C dry and wet
    "THHN/THWN": 90,     # dual-rated, 90 C dry, 75 C wet
    "THHN": 90,
    "THWN-2": 90,
    "THWN": 75,
    "THHW": 90,          # 75 C wet
    "THW-2": 90,
    "THW": 75,
    "TW": 60,
    "XHHW-2": 90,
    "XHHW": 90,          # 75 C wet
    "XHH": 90,
    "RHH": 90,
    "RHW": 75,
    "RHW-2": 90,
    "USE": 75,
    "USE-2": 90,
    "UF": 60,            # listed 60 and 75 C; ampacity is the 60 C column (NEC 340.80)
}

WET_TEMP: dict[str, int] = {"THHN/THWN": 75, "THHW": 75, "XHHW": 75}
"""Types whose wet-location rating [C] is lower than the dry one (Table 310.4(1)). THHN alone
is not for wet locations."""

_ALIASES = {
    "THHN/THWN2": "THHN/THWN-2", "THHN-THWN-2": "THHN/THWN-2", "THHN-THWN2": "THHN/THWN-2",
    "THWN-2/THHN": "THHN/THWN-2", "THHN-THWN": "THHN/THWN", "THWN/THHN": "THHN/THWN",
    "THWN2": "THWN-2", "XHHW2": "XHHW-2", "THW2": "THW-2", "RHW2": "RHW-2", "USE2": "USE-2",
    "XHWN2": "XHWN-2",
}


def parse_insulation(text: str) -> str:
    """Canonical insulation name from a typed spelling (``"thhn"``, ``"THWN-2"``, ``"xhhw"``,
    ``"thhn/thwn-2"``, ``"thhn thwn2"``). Unknown names raise ``TableLookupError``."""
    key = re.sub(r"\s*[/ ]\s*", "/", str(text).strip().upper())
    key = re.sub(r"\s+", "", key)
    if key in INSULATION_TEMP:
        return key
    if key in _ALIASES:
        return _ALIASES[key]
    raise TableLookupError(
        f"no insulation type '{str(text).strip()}'; types are {choices(INSULATION_TEMP)}")


def insulation_rating(name: str, wet: bool = False) -> int:
    """Temperature rating [C] of an insulation type (NEC Table 310.4(1)); ``wet=True`` gives the
    wet-location rating."""
    canon = parse_insulation(name)
    if wet and canon == "THHN":
        raise TableLookupError("THHN alone is not rated for wet locations (NEC Table 310.4(1))")
    return WET_TEMP.get(canon, INSULATION_TEMP[canon]) if wet else INSULATION_TEMP[canon]


# NEC 2023 Table 310.15(B)(1)(1), ambient temperature correction factors based on 30 C [86 F].
# Rows: (highest ambient of the row [C], factor for 60 C, 75 C, 90 C); None: not permitted.
AMBIENT_ROWS: tuple[tuple[int, float | None, float | None, float | None], ...] = (
    (10, 1.29, 1.20, 1.15),
    (15, 1.22, 1.15, 1.12),
    (20, 1.15, 1.11, 1.08),
    (25, 1.08, 1.05, 1.04),
    (30, 1.00, 1.00, 1.00),
    (35, 0.91, 0.94, 0.96),
    (40, 0.82, 0.88, 0.91),
    (45, 0.71, 0.82, 0.87),
    (50, 0.58, 0.75, 0.82),
    (55, 0.41, 0.67, 0.76),
    (60, None, 0.58, 0.71),
    (65, None, 0.47, 0.65),
    (70, None, 0.33, 0.58),
    (75, None, None, 0.50),
    (80, None, None, 0.41),
    (85, None, None, 0.29),
)


def ambient_factor(ambient_c: float, column: int) -> float:
    """Ambient correction factor, NEC 2023 Table 310.15(B)(1)(1) (30 C basis).

    The row is the first whose range holds ``ambient_c`` [C] (10 or less, 11-15, ..., 81-85);
    a temperature between two rows (e.g. 30.5) takes the warmer row. Raises ``TableLookupError``
    where the table has no factor: the conductor cannot be used at that ambient.
    """
    i = 1 + COLUMNS.index(_column(column))
    for row in AMBIENT_ROWS:
        if ambient_c <= row[0]:
            factor = row[i]
            break
    else:
        factor = None
    if factor is None:
        raise TableLookupError(
            f"a {column} C conductor cannot be used at {ambient_c:g} C ambient "
            f"(NEC Table 310.15(B)(1)(1) has no factor)")
    return factor


ROOFTOP_ADDER_C = 33
"""[C] NEC 2023 310.15(B)(2): added to the outdoor temperature for raceways or cables in direct
sunlight on or above a rooftop whose bottom is less than 23 mm (7/8 in) above the roof, before
the correction of Table 310.15(B)(1)(1). Type XHHW-2 is excepted (its exception)."""
ROOFTOP_EXCEPTED = frozenset({"XHHW-2"})


def rooftop_excepted(insulation: str) -> str | None:
    """The insulation's name where the exception to NEC 310.15(B)(2) spares it the rooftop
    adder, else None. ``insulation`` as typed (``parse_insulation`` reads it)."""
    name = parse_insulation(insulation)
    return name if name in ROOFTOP_EXCEPTED else None


def rooftop_ambient(ambient_c: float, insulation: str) -> tuple[float, str]:
    """The ambient [C] a rooftop run is corrected at (NEC 310.15(B)(2)), with the note saying
    so."""
    name = rooftop_excepted(insulation)
    if name is not None:
        return ambient_c, (f"NEC 310.15(B)(2) Exception: {name} takes no rooftop adder; "
                           f"{ambient_c:g} C ambient")
    hot = ambient_c + ROOFTOP_ADDER_C
    return hot, (f"NEC 310.15(B)(2): rooftop, in sunlight less than 7/8 in above the roof: "
                 f"{ROOFTOP_ADDER_C} C added to the {ambient_c:g} C outdoor temperature, "
                 f"{hot:g} C ambient")


def rooftop_words(insulation: str) -> str:
    """Said beside the raceway of a run marked ``rooftop`` (report, app)."""
    name = rooftop_excepted(insulation)
    if name is not None:
        return f"rooftop: {name}, no adder (NEC 310.15(B)(2) Exception)"
    return f"rooftop: +{ROOFTOP_ADDER_C} C ambient (NEC 310.15(B)(2))"


# NEC 2023 Table 310.15(C)(1): (highest count of the row, factor); 41 and above -> 0.35.
CCC_ROWS: tuple[tuple[int, float], ...] = (
    (3, 1.00), (6, 0.80), (9, 0.70), (20, 0.50), (30, 0.45), (40, 0.40),
)
CCC_OVER_40 = 0.35


def ccc_factor(n: int) -> float:
    """Adjustment factor for ``n`` current-carrying conductors in a raceway or cable,
    NEC 2023 Table 310.15(C)(1) (1-3: 1.00, 4-6: 0.80, ..., 41 and above: 0.35)."""
    if isinstance(n, bool) or not isinstance(n, int) or n < 1:
        raise TableLookupError(f"current-carrying conductors must be a whole number of 1 or more, "
                               f"not {n!r}")
    for top, factor in CCC_ROWS:
        if n <= top:
            return factor
    return CCC_OVER_40
