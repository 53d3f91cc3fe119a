"""NEC 2023 Chapter 9 Table 9, alternating-current resistance and reactance for 600 V cables,
3-phase, 60 Hz, 75 C [167 F], three single conductors in conduit. Values in ohms to neutral per
1000 ft [ohm/kft] (the table also gives ohm/km; gaugewalk uses ohm/kft).

Raceway families: ``"pvc"``, ``"aluminum"`` and ``"steel"`` conduit. PVC and aluminum conduit share
one reactance (XL) column; steel has its own. The effective Z column is for 0.85 power factor
only (Table 9 note 2: Ze = R cos(theta) + X sin(theta)); for another power factor compute it from
R and XL in ``model/``. The table runs from 14 AWG (copper) and 12 AWG (aluminum) to 1000 kcmil and
skips 700, 800 and 900 kcmil. Stable since at least the 2011 edition; checked against a printed
reproduction while typing.
"""

from __future__ import annotations

from gaugewalk.tables.conductor.sizes import canonical
from gaugewalk.tables.errors import TableLookupError, choices

RACEWAY_FAMILIES: tuple[str, ...] = ("pvc", "aluminum", "steel")

# NEC 2023 Ch. 9 Table 9 [ohm/kft]. Columns: XL (PVC and aluminum conduit), XL (steel conduit),
# R uncoated copper (PVC, aluminum, steel), R aluminum (PVC, aluminum, steel),
# Ze at 0.85 PF copper (PVC, aluminum, steel), Ze at 0.85 PF aluminum (PVC, aluminum, steel).
# None: not listed (Table 9 has no aluminum 14 AWG).
_T9 = {
    "14 AWG": (0.058, 0.073, (3.1, 3.1, 3.1), None, (2.7, 2.7, 2.7), None),
    "12 AWG": (0.054, 0.068, (2.0, 2.0, 2.0), (3.2, 3.2, 3.2), (1.7, 1.7, 1.7), (2.8, 2.8, 2.8)),
    "10 AWG": (0.050, 0.063, (1.2, 1.2, 1.2), (2.0, 2.0, 2.0), (1.1, 1.1, 1.1), (1.8, 1.8, 1.8)),
    "8 AWG": (0.052, 0.065, (0.78, 0.78, 0.78), (1.3, 1.3, 1.3), (0.69, 0.69, 0.70),
              (1.1, 1.1, 1.1)),
    "6 AWG": (0.051, 0.064, (0.49, 0.49, 0.49), (0.81, 0.81, 0.81), (0.44, 0.45, 0.45),
              (0.71, 0.72, 0.72)),
    "4 AWG": (0.048, 0.060, (0.31, 0.31, 0.31), (0.51, 0.51, 0.51), (0.29, 0.29, 0.30),
              (0.46, 0.46, 0.46)),
    "3 AWG": (0.047, 0.059, (0.25, 0.25, 0.25), (0.40, 0.41, 0.40), (0.23, 0.24, 0.24),
              (0.37, 0.37, 0.37)),
    "2 AWG": (0.045, 0.057, (0.19, 0.20, 0.20), (0.32, 0.32, 0.32), (0.19, 0.19, 0.20),
              (0.30, 0.30, 0.30)),
    "1 AWG": (0.046, 0.057, (0.15, 0.16, 0.16), (0.25, 0.26, 0.25), (0.16, 0.16, 0.16),
              (0.24, 0.24, 0.25)),
    "1/0 AWG": (0.044, 0.055, (0.12, 0.13, 0.12), (0.20, 0.21, 0.20), (0.13, 0.13, 0.13),
                (0.19, 0.20, 0.20)),
    "2/0 AWG": (0.043, 0.054, (0.10, 0.10, 0.10), (0.16, 0.16, 0.16), (0.11, 0.11, 0.11),
                (0.16, 0.16, 0.16)),
    "3/0 AWG": (0.042, 0.052, (0.077, 0.082, 0.079), (0.13, 0.13, 0.13), (0.088, 0.092, 0.094),
                (0.13, 0.13, 0.14)),
    "4/0 AWG": (0.041, 0.051, (0.062, 0.067, 0.063), (0.10, 0.11, 0.10), (0.074, 0.078, 0.080),
                (0.11, 0.11, 0.11)),
    "250 kcmil": (0.041, 0.052, (0.052, 0.057, 0.054), (0.085, 0.090, 0.086),
                  (0.066, 0.070, 0.073), (0.094, 0.098, 0.10)),
    "300 kcmil": (0.041, 0.051, (0.044, 0.049, 0.045), (0.071, 0.076, 0.072),
                  (0.059, 0.063, 0.065), (0.082, 0.086, 0.088)),
    "350 kcmil": (0.040, 0.050, (0.038, 0.043, 0.039), (0.061, 0.066, 0.063),
                  (0.053, 0.058, 0.060), (0.073, 0.077, 0.080)),
    "400 kcmil": (0.040, 0.049, (0.033, 0.038, 0.035), (0.054, 0.059, 0.055),
                  (0.049, 0.053, 0.056), (0.066, 0.071, 0.073)),
    "500 kcmil": (0.039, 0.048, (0.027, 0.032, 0.029), (0.043, 0.048, 0.045),
                  (0.043, 0.048, 0.050), (0.057, 0.061, 0.064)),
    "600 kcmil": (0.039, 0.048, (0.023, 0.028, 0.025), (0.036, 0.041, 0.038),
                  (0.040, 0.044, 0.047), (0.051, 0.055, 0.058)),
    "750 kcmil": (0.038, 0.048, (0.019, 0.024, 0.021), (0.029, 0.034, 0.031),
                  (0.036, 0.040, 0.043), (0.045, 0.049, 0.052)),
    "1000 kcmil": (0.037, 0.046, (0.015, 0.019, 0.018), (0.023, 0.027, 0.025),
                   (0.032, 0.036, 0.040), (0.039, 0.042, 0.046)),
}

TABLE9_SIZES: tuple[str, ...] = tuple(_T9)
"""Sizes in Table 9 (copper from 14 AWG; aluminum from 12 AWG; to 1000 kcmil)."""
TABLE9_SIZES_AL: tuple[str, ...] = tuple(s for s, v in _T9.items() if v[3] is not None)


def family_of(name: str) -> str:
    """A Table 9 raceway family from a family name or a raceway type (``"EMT"`` -> ``"steel"``)."""
    key = str(name).strip().lower()
    if key in RACEWAY_FAMILIES:
        return key
    from gaugewalk.tables.raceway.fill import (
        raceway_family,  # raceway types live in gaugewalk.tables.raceway.fill
    )
    return raceway_family(name)


def _lookup(size: str, material: str):
    if material not in ("cu", "al"):
        raise TableLookupError(f"no conductor material '{material}'; materials are cu, al")
    size = canonical(size)
    sizes = TABLE9_SIZES if material == "cu" else TABLE9_SIZES_AL
    if size not in sizes:
        word = "copper" if material == "cu" else "aluminum"
        raise TableLookupError(f"NEC Ch. 9 Table 9 has no {word} {size}; its {word} sizes are "
                               f"{choices(sizes)}")
    return _T9[size]


def in_table9(size: str, material: str) -> bool:
    """True if Table 9 lists this size for this material (``"cu"`` or ``"al"``)."""
    try:
        _lookup(size, material)
    except TableLookupError:
        return False
    return True


def reactance(size: str, family: str) -> float:
    """Inductive reactance XL [ohm/kft] to neutral, NEC Ch. 9 Table 9 (PVC and aluminum conduit
    share a column; steel has its own)."""
    row = _lookup(size, "cu")
    return row[1] if family_of(family) == "steel" else row[0]


def ac_resistance(size: str, material: str, family: str) -> float:
    """AC resistance [ohm/kft] at 75 C, NEC Ch. 9 Table 9 (uncoated copper or aluminum)."""
    row = _lookup(size, material)
    return row[2 if material == "cu" else 3][RACEWAY_FAMILIES.index(family_of(family))]


def table_ze_085(size: str, material: str, family: str) -> float:
    """The table's effective Z [ohm/kft] at 0.85 power factor, NEC Ch. 9 Table 9 note 2."""
    row = _lookup(size, material)
    return row[4 if material == "cu" else 5][RACEWAY_FAMILIES.index(family_of(family))]
