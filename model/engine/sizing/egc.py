"""The equipment grounding conductor of a run: NEC Table 250.122 by the device rating,
increased in proportion when the phase conductors were upsized (250.122(B)), never larger than
the phase conductors (250.122(A)), and a full one in each raceway of parallel sets (250.122(F)).

A transformer's secondary conductors ahead of their first device are on the supply side of
every device: the wire run with them is the supply-side bonding jumper of the separately derived
system, sized by Table 250.102(C)(1) from the ungrounded conductors in its raceway (250.30(A)(2),
250.102(C)(2)), not by Table 250.122 (``bonding_jumper_for``).

Public API: ``egc_for(i, ocpd, base_i, sets, material, egc_material) -> (size, notes)``,
``bonding_jumper_for(i, sets, material, egc_material) -> (size, notes)``.
"""

from __future__ import annotations

from functools import lru_cache

from gaugewalk.model.engine.sizing.columns import MAT, cmil, material_table
from gaugewalk.tables.protection import egc as t_egc
from gaugewalk.tables.protection.bonding import bonding_jumper_size

_egc_table = lru_cache(maxsize=1024)(t_egc.egc_size)


def _smallest_at_least(cmil_needed: float, material: str) -> str:
    """The smallest size of ``material`` with at least ``cmil_needed`` circular mils."""
    tab = material_table(material)
    for s, c in zip(tab.sizes, tab.cmil, strict=True):
        if c >= cmil_needed * (1 - 1e-9):
            return s
    return tab.sizes[-1]


def egc_for(i: int, ocpd: int, base_i: int | None, sets: int, material: str,
            egc_mat: str) -> tuple[str, tuple[str, ...]]:
    """The EGC for phase conductors of size index ``i`` (in ``material_table(material)``) on a
    device of ``ocpd`` [A]; ``base_i`` is the smallest size with ampacity for the installation
    and the device, from which an upsizing is measured. Returns ``(size, notes)``."""
    tab = material_table(material)
    size = tab.sizes[i]
    notes: list[str] = []
    egc_size = table_egc = _egc_table(ocpd, egc_mat)
    notes.append(f"NEC Table 250.122: {table_egc} {MAT[egc_mat]} EGC for a {ocpd} A device")
    if base_i is not None and i > base_i:
        # NEC 250.122(B): the baseline is the smallest size with ampacity for the installation
        # (after the 310.15(B)/(C) corrections and the device rules), so upsizing forced by the
        # corrections does not count; upsizing for drop does.
        ratio = tab.cmil[i] / tab.cmil[base_i]
        bigger = _smallest_at_least(cmil(egc_size) * ratio, egc_mat)
        if cmil(bigger) > cmil(egc_size):
            notes.append(f"NEC 250.122(B): EGC {egc_size} increased to {bigger} in proportion "
                         f"to the phase conductors ({tab.sizes[base_i]} to {size}, "
                         f"x{ratio:.3f} circular mils)")
            egc_size = bigger
    if cmil(egc_size) > tab.cmil[i]:
        notes.append(f"NEC 250.122(A): EGC limited to the phase conductor size {size}")
        egc_size = size
    if sets > 1:
        notes.append(f"NEC 250.122(F): a full {egc_size} EGC in each of the {sets} raceways")
    return egc_size, tuple(notes)


def bonding_jumper_for(i: int, sets: int, material: str,
                       egc_mat: str) -> tuple[str, tuple[str, ...]]:
    """The supply-side bonding jumper run with a transformer's secondary conductors of size
    index ``i`` (in ``material_table(material)``) ahead of their first device: NEC Table
    250.102(C)(1) by the ungrounded conductors in each raceway (250.30(A)(2), 250.102(C)(2)).
    Returns ``(size, notes)``; the notes say the neutral is held to it too (250.30(A)(3))."""
    size = material_table(material).sizes[i]
    jumper = bonding_jumper_size(size, material, egc_mat)
    each = f" in each of the {sets} raceways (250.102(C)(2))" if sets > 1 else ""
    return jumper, (
        f"NEC 250.30(A)(2), Table 250.102(C)(1): secondary conductors ahead of their first "
        f"device carry a supply-side bonding jumper, {jumper} {MAT[egc_mat]} for {size} "
        f"{MAT[material]}{each}, in place of a Table 250.122 EGC",
        "NEC 250.30(A)(3): the neutral not smaller than Table 250.102(C)(1), taken so (the "
        "system bonding jumper at the first disconnecting means); at the transformer it may be "
        "smaller",)
