"""NEC 2023 Table 250.102(C)(1), "Grounded Conductor, Main Bonding Jumper, System Bonding
Jumper, and Supply-Side Bonding Jumper for Alternating-Current Systems": the least size of those
conductors by the size of the largest ungrounded conductor (or the equivalent area of parallel
conductors) they serve.

Rows by the largest ungrounded conductor, copper / aluminum or copper-clad aluminum, to the
jumper, copper / aluminum: 2 AWG or smaller / 1/0 or smaller: 8 AWG / 6 AWG; 1 or 1/0 / 2/0 or
3/0: 6 / 4; 2/0 or 3/0 / 4/0 or 250 kcmil: 4 / 2; over 3/0 through 350 kcmil / over 250 through
500 kcmil: 2 / 1/0; over 350 through 600 / over 500 through 900: 1/0 / 3/0; over 600 through
1100 / over 900 through 1750: 2/0 / 4/0; larger: at least 12.5 % of the area of the largest
ungrounded conductor (a note of the table), not required larger than it. Typed from memory; the
rows have been the same since the table was split from Table 250.66 (2014 edition, from
memory). Where the jumper and the ungrounded conductors are of different materials, the table's
note reads the row for ungrounded conductors of the jumper's material with the same ampacity;
``bonding_jumper_size`` reads the row of the ungrounded conductors' own material (the same row
for the sizes of one ampacity in nearly every case; from memory).

Where parallel conductors run in several raceways, each raceway's supply-side bonding jumper is
sized by the ungrounded conductors in that raceway (250.102(C)(2)), and each raceway's grounded
conductor likewise (250.30(A)(3)(c)), not below 1/0 AWG: the caller passes one set's size.
"""

from __future__ import annotations

from gaugewalk.tables.conductor.properties import circular_mils
from gaugewalk.tables.conductor.sizes import SIZES, canonical
from gaugewalk.tables.errors import TableLookupError

TABLE_250_102_C_1 = "Table 250.102(C)(1)"

# (largest ungrounded conductor up to [cmil], copper row; aluminum row) -> (jumper Cu, Al)
_CU_ROWS: tuple[tuple[float, str, str], ...] = (
    (66_360, "8 AWG", "6 AWG"),           # 2 AWG or smaller
    (105_600, "6 AWG", "4 AWG"),          # 1 or 1/0 AWG
    (167_800, "4 AWG", "2 AWG"),          # 2/0 or 3/0 AWG
    (350_000, "2 AWG", "1/0 AWG"),        # over 3/0 AWG through 350 kcmil
    (600_000, "1/0 AWG", "3/0 AWG"),      # over 350 through 600 kcmil
    (1_100_000, "2/0 AWG", "4/0 AWG"),    # over 600 through 1100 kcmil
)
_AL_ROWS: tuple[tuple[float, str, str], ...] = (
    (105_600, "8 AWG", "6 AWG"),          # 1/0 AWG or smaller
    (167_800, "6 AWG", "4 AWG"),          # 2/0 or 3/0 AWG
    (250_000, "4 AWG", "2 AWG"),          # 4/0 AWG or 250 kcmil
    (500_000, "2 AWG", "1/0 AWG"),        # over 250 through 500 kcmil
    (900_000, "1/0 AWG", "3/0 AWG"),      # over 500 through 900 kcmil
    (1_750_000, "2/0 AWG", "4/0 AWG"),    # over 900 through 1750 kcmil
)
BEYOND_PCT = 12.5
"""[%] of the largest ungrounded conductor's area, past the last row (the table's note)."""


def bonding_jumper_size(ungrounded: str, material: str, jumper_material: str) -> str:
    """The least grounded conductor or bonding jumper of ``jumper_material`` (``"cu"`` or
    ``"al"``) for a largest ungrounded conductor ``ungrounded`` of ``material``, NEC 2023
    Table 250.102(C)(1) (see the module notes). Raises ``TableLookupError``."""
    for m in (material, jumper_material):
        if m not in ("cu", "al"):
            raise TableLookupError(f"no conductor material '{m}'; materials are cu, al")
    size = canonical(ungrounded)
    area = circular_mils(size)
    for top, cu, al in _CU_ROWS if material == "cu" else _AL_ROWS:
        if area <= top:
            return cu if jumper_material == "cu" else al
    need = area * BEYOND_PCT / 100.0
    for s in SIZES:
        if circular_mils(s) >= need:
            return s if circular_mils(s) <= area else size
    return size
