"""NEC 2023 (NFPA 70) Chapter 9 Table 8, Conductor Properties.

Per size: area [cmil], stranding, overall diameter [in] and area [in^2] for stranded and (where the
table lists it) solid conductors, and DC resistance at 75 C [ohm/kft] for uncoated copper, coated
(tinned) copper and aluminum. Table 8 lists solid conductors for 18 AWG through 8 AWG only.

Typed from the 2023 edition; these columns have been unchanged since at least the 2011 edition.
Provenance: the uncoated-copper and aluminum resistances of 14 AWG - 600 kcmil agree with a
published reproduction of the table; everything else (700 kcmil and up, diameters, stranding,
mm^2, the coated column) is from memory. The tests cross-check all of it against the ASTM B258
gauge formula, IACS resistivity with the stranding increment, and each row's own diameters.

Temperature: NEC Ch. 9 Table 8 note 2, R2 = R1 [1 + alpha (T2 - 75)], alpha per ``ALPHA``.
"""

from typing import NamedTuple

from gaugewalk.tables.conductor.sizes import SIZES, canonical
from gaugewalk.tables.errors import TableLookupError, choices

ALPHA: dict[str, float] = {"cu": 0.00323, "al": 0.00330}
"""Temperature coefficient [1/C] at 75 C, NEC Ch. 9 Table 8 note 2."""

MATERIALS = ("cu", "al")


class Wire(NamedTuple):
    """One form of a conductor in Table 8 (solid or stranded)."""

    strands: int            # 1 for solid
    strand_dia_in: float | None  # [in] diameter of each strand; None for solid
    dia_in: float           # [in] overall diameter
    area_in2: float         # [in^2] overall area
    r_cu: float             # [ohm/kft] uncoated copper at 75 C
    r_cu_coated: float      # [ohm/kft] coated copper at 75 C
    r_al: float             # [ohm/kft] aluminum at 75 C


class Table8Row(NamedTuple):
    size: str
    area_mm2: float          # [mm^2]
    cmil: float              # [cmil] circular mils
    stranded: Wire
    solid: Wire | None       # None where Table 8 lists no solid conductor


def _row(size, mm2, cmil, stranded, solid=None):
    return Table8Row(size, mm2, cmil, Wire(*stranded), Wire(1, None, *solid) if solid else None)


# NEC 2023 Ch. 9 Table 8. Columns: size, area [mm^2], area [cmil],
#   stranded (strands, strand dia [in], overall dia [in], overall area [in^2],
#             R Cu uncoated, R Cu coated, R Al [ohm/kft at 75 C]),
#   solid (overall dia [in], overall area [in^2], R Cu uncoated, R Cu coated, R Al).
# The coated-copper column is from memory throughout; it is not used by the calculations.
TABLE_8: dict[str, Table8Row] = {r.size: r for r in (
    _row("18 AWG", 0.823, 1620, (7, 0.015, 0.046, 0.002, 7.95, 8.45, 13.1),
         (0.040, 0.001, 7.77, 8.08, 12.8)),
    _row("16 AWG", 1.31, 2580, (7, 0.019, 0.058, 0.003, 4.99, 5.29, 8.21),
         (0.051, 0.002, 4.89, 5.08, 8.05)),
    _row("14 AWG", 2.08, 4110, (7, 0.024, 0.073, 0.004, 3.14, 3.26, 5.17),
         (0.064, 0.003, 3.07, 3.19, 5.06)),
    # 12 AWG stranded overall area 0.006 in^2 as printed (pi/4 * 0.092^2 = 0.0066); from memory.
    _row("12 AWG", 3.31, 6530, (7, 0.030, 0.092, 0.006, 1.98, 2.05, 3.25),
         (0.081, 0.005, 1.93, 2.01, 3.18)),
    _row("10 AWG", 5.261, 10380, (7, 0.038, 0.116, 0.011, 1.24, 1.29, 2.04),
         (0.102, 0.008, 1.21, 1.26, 2.00)),
    _row("8 AWG", 8.367, 16510, (7, 0.049, 0.146, 0.017, 0.778, 0.809, 1.28),
         (0.128, 0.013, 0.764, 0.786, 1.26)),
    _row("6 AWG", 13.30, 26240, (7, 0.061, 0.184, 0.027, 0.491, 0.510, 0.808)),
    _row("4 AWG", 21.15, 41740, (7, 0.077, 0.232, 0.042, 0.308, 0.321, 0.508)),
    _row("3 AWG", 26.67, 52620, (7, 0.087, 0.260, 0.053, 0.245, 0.254, 0.403)),
    _row("2 AWG", 33.62, 66360, (7, 0.097, 0.292, 0.067, 0.194, 0.201, 0.319)),
    _row("1 AWG", 42.41, 83690, (19, 0.066, 0.332, 0.087, 0.154, 0.160, 0.253)),
    _row("1/0 AWG", 53.49, 105600, (19, 0.074, 0.372, 0.109, 0.122, 0.127, 0.201)),
    _row("2/0 AWG", 67.43, 133100, (19, 0.084, 0.418, 0.137, 0.0967, 0.101, 0.159)),
    _row("3/0 AWG", 85.01, 167800, (19, 0.094, 0.470, 0.173, 0.0766, 0.0797, 0.126)),
    _row("4/0 AWG", 107.2, 211600, (19, 0.106, 0.528, 0.219, 0.0608, 0.0626, 0.100)),
    _row("250 kcmil", 127, 250000, (37, 0.082, 0.575, 0.260, 0.0515, 0.0535, 0.0847)),
    _row("300 kcmil", 152, 300000, (37, 0.090, 0.630, 0.312, 0.0429, 0.0446, 0.0707)),
    _row("350 kcmil", 177, 350000, (37, 0.097, 0.681, 0.364, 0.0367, 0.0382, 0.0605)),
    _row("400 kcmil", 203, 400000, (37, 0.104, 0.728, 0.416, 0.0321, 0.0331, 0.0529)),
    _row("500 kcmil", 253, 500000, (37, 0.116, 0.813, 0.519, 0.0258, 0.0265, 0.0424)),
    _row("600 kcmil", 304, 600000, (61, 0.099, 0.893, 0.626, 0.0214, 0.0223, 0.0353)),
    # 700 kcmil and up: from memory.
    _row("700 kcmil", 355, 700000, (61, 0.107, 0.964, 0.730, 0.0184, 0.0189, 0.0303)),
    _row("750 kcmil", 380, 750000, (61, 0.111, 0.998, 0.782, 0.0171, 0.0176, 0.0282)),
    _row("800 kcmil", 405, 800000, (61, 0.114, 1.030, 0.834, 0.0161, 0.0166, 0.0265)),
    _row("900 kcmil", 456, 900000, (61, 0.122, 1.094, 0.940, 0.0143, 0.0147, 0.0235)),
    _row("1000 kcmil", 507, 1000000, (61, 0.128, 1.152, 1.042, 0.0129, 0.0132, 0.0212)),
    _row("1250 kcmil", 633, 1250000, (91, 0.117, 1.289, 1.305, 0.0103, 0.0106, 0.0169)),
    _row("1500 kcmil", 760, 1500000, (91, 0.128, 1.412, 1.566, 0.00858, 0.00883, 0.0141)),
    _row("1750 kcmil", 887, 1750000, (127, 0.117, 1.526, 1.829, 0.00735, 0.00756, 0.0121)),
    _row("2000 kcmil", 1013, 2000000, (127, 0.126, 1.632, 2.092, 0.00643, 0.00662, 0.0106)),
)}

SOLID_SIZES: tuple[str, ...] = tuple(s for s in SIZES if TABLE_8[s].solid is not None)


def row(size: str) -> Table8Row:
    """The Table 8 row for a size (any spelling ``parse_size`` accepts)."""
    return TABLE_8[canonical(size)]


def _wire(size: str, stranded: bool) -> Wire:
    r = row(size)
    if stranded:
        return r.stranded
    if r.solid is None:
        raise TableLookupError(
            f"NEC Ch. 9 Table 8 lists no solid {r.size} conductor; solid sizes are "
            f"{choices(SOLID_SIZES)}")
    return r.solid


def _material(material: str) -> str:
    if material not in MATERIALS:
        raise TableLookupError(f"no conductor material '{material}'; materials are cu, al")
    return material


def circular_mils(size: str) -> float:
    """Conductor area [cmil], NEC Ch. 9 Table 8."""
    return float(row(size).cmil)


def dc_resistance(size: str, material: str, *, stranded: bool = True, temp_c: float = 75.0,
                  coated: bool = False) -> float:
    """DC resistance [ohm/kft] of uncoated copper (``"cu"``) or aluminum (``"al"``) at ``temp_c``.

    NEC Ch. 9 Table 8 gives the value at 75 C; note 2 corrects it: R2 = R1 [1 + alpha (T2 - 75)].
    ``coated=True`` reads the coated (tinned) copper column instead (copper only).
    """
    wire = _wire(size, stranded)
    material = _material(material)
    if coated and material != "cu":
        raise TableLookupError("Table 8 lists coated conductors for copper only")
    r75 = (wire.r_cu_coated if coated else wire.r_cu) if material == "cu" else wire.r_al
    return r75 * (1.0 + ALPHA[material] * (temp_c - 75.0))


def bare_area_in2(size: str, stranded: bool = True) -> float:
    """Overall area [in^2] of a bare conductor, NEC Ch. 9 Table 8 (for a bare EGC in conduit fill,
    Chapter 9 note 3)."""
    return _wire(size, stranded).area_in2


def diameter_in(size: str, stranded: bool = True) -> float:
    """Overall diameter [in] of a bare conductor, NEC Ch. 9 Table 8."""
    return _wire(size, stranded).dia_in
