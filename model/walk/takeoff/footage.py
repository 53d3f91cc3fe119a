"""Conductor footage: each run's conductors by material, insulation, size, function and colour.

Footage of a run is (route length + slack at each end) x conductors x parallel sets, where the
conductors are every ungrounded conductor, the neutral where the circuit has one, and the EGC at
its own size (NEC 250.122(F): each parallel raceway carries its own EGC).
"""

from __future__ import annotations

import math
from typing import Sequence

from gaugewalk.model.walk.takeoff.lines import Cut, RunMaterial, TakeoffError
from gaugewalk.tables.order import colours as colour_table

#: A conductor line's key: (material, insulation, size, function, colour).
WireKey = tuple[str, str, str, str, str]

FUNCTION_ORDER = {"phase": 0, "neutral": 1, "EGC": 2}


def conductor_footage(length_ft: float, slack_per_end_ft: float, conductors: int, sets: int) -> float:
    """(length + slack at each end) x conductors x parallel sets [ft]."""
    return (length_ft + 2.0 * slack_per_end_ft) * conductors * sets


def with_waste(net_ft: float, waste_pct: float) -> int:
    """``net_ft`` [ft] plus ``waste_pct`` [%], rounded up to whole feet."""
    # round before ceil so 100 ft + 10 % is 110 ft, not 111 ft from binary fractions
    return math.ceil(round(net_ft * (1.0 + waste_pct / 100.0), 6))


def phase_colours_for(scheme: colour_table.ColourScheme, hots: int, neutral: bool) -> tuple[str, ...]:
    """Colours of a circuit's ungrounded conductors, taken in phase order A, B, C.

    On a high-leg delta a circuit with a neutral and fewer than three hots uses A and C: the
    high leg (B, orange, NEC 110.15) is not used for line-to-neutral loads (common practice:
    it is about 208 V to neutral)."""
    if hots > len(scheme.phases):
        raise TakeoffError(
            f"{hots} ungrounded conductors but the {scheme.label} scheme has "
            f"{len(scheme.phases)} phase colours"
        )
    order = list(range(len(scheme.phases)))
    if scheme.key == "240/120 delta" and neutral and hots < 3:
        order = [0, 2, 1]
    return tuple(scheme.phases[i] for i in order[:hots])


def colours_of_lines(scheme: colour_table.ColourScheme, lines: tuple[int, ...]) -> tuple[str, ...]:
    """Colours of a circuit's ungrounded conductors by the lines they land on in the source
    (0 = A, 1 = B, 2 = C), in pole order: the phase each conductor is, its colour in the scheme."""
    return tuple(scheme.phase_colour(k) for k in lines)


def conductors_of(run: RunMaterial) -> list[tuple[WireKey, int]]:
    """The conductors of one set of ``run``: (line key, count) for each."""
    out: list[tuple[WireKey, int]] = []

    def add(material: str, size: str, function: str, colour: str) -> None:
        insulation = "bare" if colour == "bare" else run.insulation
        out.append(((material, insulation, size, function, colour), 1))

    for colour in run.phase_colours:
        add(run.material, run.size, "phase", colour)
    if run.neutral_size is not None:
        add(run.material, run.neutral_size, "neutral", run.neutral_colour)
    if run.egc_size is not None:
        add(run.egc_material or run.material, run.egc_size, "EGC", run.egc_colour)
    return out


def wire_footage(runs: Sequence[RunMaterial], slack_per_end_ft: float, waste_pct: float
                 ) -> tuple[dict[WireKey, float], dict[WireKey, list[Cut]]]:
    """Net footage per conductor line [ft] and its cuts, one per run and parallel set, in walk
    order. A cut is the route length plus slack at each end plus the waste allowance, rounded up
    to whole feet (the allowance covers measuring and pulling; offcut is counted apart)."""
    net: dict[WireKey, float] = {}
    cuts: dict[WireKey, list[Cut]] = {}
    for run in runs:
        if run.length_ft < 0 or run.sets < 1:
            raise TakeoffError(f"run {run.run_id}: length and sets must be positive")
        one = run.length_ft + 2.0 * slack_per_end_ft
        ft = with_waste(one, waste_pct)
        for key, n in conductors_of(run):
            net[key] = net.get(key, 0.0) + one * n * run.sets
            line = cuts.setdefault(key, [])
            if ft > 0:
                line += [Cut(run.run_id, s, ft) for s in range(1, run.sets + 1) for _ in range(n)]
    return net, cuts
