"""NEC 2023 Table 250.122, minimum size of equipment grounding conductors for grounding raceway
and equipment, by the rating of the automatic overcurrent device ahead of the equipment.

Editions differ on aluminum above 3000 A: the 2023 edition (and 2020) lists 750 kcmil at 4000 A
and 1200 kcmil at 5000 and 6000 A; older reprints show other values in these rows (from memory:
800 kcmil at 4000 A). The rest of the table has been stable since at least 2011.
250.122(A): the EGC need not be larger than the circuit conductors. 250.122(B): where the
ungrounded conductors are increased in size (other than for the ampacity corrections of 310.15(B)
or (C), 2020 and later), the EGC increases in proportion to circular mil area; that rule is in
``model/``.

The aluminum rows for 5000 and 6000 A print 1200 kcmil, which is not a building-wire size of
Ch. 9 Table 8; ``egc_size`` returns the next Table 8 size up (1250 kcmil) and ``egc_printed``
the table's own text.
"""

from __future__ import annotations

from gaugewalk.tables.conductor.sizes import KCMIL_NUMBERS, SIZES
from gaugewalk.tables.errors import TableLookupError

# NEC 2023 Table 250.122: (rating not exceeding [A], copper, aluminum or copper-clad aluminum).
EGC_TABLE: tuple[tuple[int, str, str], ...] = (
    (15, "14 AWG", "12 AWG"),
    (20, "12 AWG", "10 AWG"),
    (60, "10 AWG", "8 AWG"),
    (100, "8 AWG", "6 AWG"),
    (200, "6 AWG", "4 AWG"),
    (300, "4 AWG", "2 AWG"),
    (400, "3 AWG", "1 AWG"),
    (500, "2 AWG", "1/0 AWG"),
    (600, "1 AWG", "2/0 AWG"),
    (800, "1/0 AWG", "3/0 AWG"),
    (1000, "2/0 AWG", "4/0 AWG"),
    (1200, "3/0 AWG", "250 kcmil"),
    (1600, "4/0 AWG", "350 kcmil"),
    (2000, "250 kcmil", "400 kcmil"),
    (2500, "350 kcmil", "600 kcmil"),
    (3000, "400 kcmil", "600 kcmil"),
    (4000, "500 kcmil", "750 kcmil"),     # aluminum: 2020/2023 value (see module docstring)
    (5000, "700 kcmil", "1200 kcmil"),
    (6000, "800 kcmil", "1200 kcmil"),
)


def egc_size(ocpd_a: float, material: str) -> str:
    """Minimum EGC size for an overcurrent device of ``ocpd_a`` [A], NEC Table 250.122: the first
    row whose rating is at or above the device. ``material`` is ``"cu"`` or ``"al"``. Always a
    size of ``gaugewalk.tables.conductor.sizes.SIZES`` (a printed 1200 kcmil becomes 1250 kcmil)."""
    printed = egc_printed(ocpd_a, material)
    if printed in SIZES:
        return printed
    kcmil = int(printed.split()[0])
    return f"{min(k for k in KCMIL_NUMBERS if k >= kcmil)} kcmil"


def egc_printed(ocpd_a: float, material: str) -> str:
    """The EGC size as NEC Table 250.122 prints it for ``ocpd_a`` [A] (may be 1200 kcmil)."""
    if material not in ("cu", "al"):
        raise TableLookupError(f"no conductor material '{material}'; materials are cu, al")
    if isinstance(ocpd_a, bool) or not isinstance(ocpd_a, (int, float)) or not ocpd_a > 0:
        raise TableLookupError(f"an overcurrent device rating must be a positive number of "
                               f"amperes, not {ocpd_a!r}")
    for rating, cu, al in EGC_TABLE:
        if rating >= ocpd_a:
            return cu if material == "cu" else al
    raise TableLookupError(f"NEC Table 250.122 ends at {EGC_TABLE[-1][0]} A; no row for "
                           f"{ocpd_a:g} A")
