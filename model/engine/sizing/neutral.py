"""A feeder's neutral sized for the current it carries: NEC 220.61(A) makes the feeder neutral
load the maximum net calculated load between the neutral and any one ungrounded conductor (the
largest line-to-neutral load on one line, ``gaugewalk.model.walk.feeder_loads``), so the neutral
may be smaller than the phase conductors where much of the load is line-to-line.

The neutral is the smallest size whose allowable ampacity (the same columns and corrections as
the phase conductors, ``columns.ampacity_columns``) carries that current, no smaller than the
EGC the feeder's device asks (NEC 215.2(A)(2), Table 250.122), no larger than the phase
conductors, and 1/0 AWG or larger in parallel sets (310.10(G)). The loads are taken as linear
unless the job says they are mostly nonlinear (``Defaults.nonlinear_loads``): then on a
four-wire wye 220.61(C) forbids the reduction and the neutral is full size; else the note says
it was taken as linear. The 70 % demand factor of 220.61(B) on the unbalance above 200 A is not
taken (conservative).

Public API: ``neutral_for(i, neutral_amps, egc_size, material, cols, tab, nonlinear=False) ->
(size, notes)``.
"""

from __future__ import annotations

from gaugewalk.model.engine.sizing.columns import MAT, AmpacityColumns, MaterialTable, cmil
from gaugewalk.model.engine.sizing.text import amps_text

_EPS = 1e-9


def neutral_for(i: int, neutral_amps: float, egc_size: str | None, material: str,
                cols: AmpacityColumns, tab: MaterialTable,
                nonlinear: bool = False) -> tuple[str, tuple[str, ...]]:
    """The neutral for phase conductors of size index ``i`` carrying ``neutral_amps`` [A];
    ``nonlinear``: the neutral of a 4-wire wye whose loads are mostly nonlinear, full size."""
    if nonlinear:
        return tab.sizes[i], (
            f"NEC 220.61(C)(2), 310.15(E)(3): the loads taken as nonlinear (the job's or its panel's setting): "
            f"the neutral full size, {tab.sizes[i]} {MAT[material]}, and counted as "
            "current-carrying (common practice: harmonics add on the neutral)",)
    floor = cmil(egc_size) if egc_size is not None else 0.0
    allow = cols.allowable_total
    for j in range(cols.first, i):
        if allow[j] + _EPS >= neutral_amps and tab.cmil[j] + _EPS >= floor:
            size = tab.sizes[j]
            return size, (
                f"NEC 220.61(A): the neutral load is {amps_text(neutral_amps)} (the largest "
                f"line-to-neutral load on one line): {size} {MAT[material]}, not below the EGC "
                "(215.2(A)(2)); loads "
                "taken as linear (220.61(C): no reduction where most are nonlinear on a "
                "4-wire wye)",)
    return tab.sizes[i], ()
