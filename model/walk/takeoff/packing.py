"""Put-ups: which boxes and reels cover a length of one conductor."""

from __future__ import annotations

import itertools
import math
from typing import Sequence

from gaugewalk.model.walk.takeoff.lines import PutUpCount
from gaugewalk.tables.order.putups import PutUp


def order_putups(need_ft: int, putups: Sequence[PutUp]) -> tuple[tuple[PutUpCount, ...], int]:
    """Put-ups covering ``need_ft`` [ft] with the least left over, then the fewest pieces.

    Returns the counts (largest put-up first, zero counts left out) and the total ordered [ft].
    No put-ups: nothing to count, the need is cut to length. Exact: in a best order each shorter
    put-up appears fewer than lcm(its length, longest length) / its length times, since that many
    could be swapped for fewer longest put-ups of the same total.
    """
    if need_ft <= 0:
        return (), 0
    usable = sorted({p.length_ft: p for p in putups}.values(), key=lambda p: p.length_ft)
    if not usable:
        return (), need_ft
    longest = usable[-1]
    shorter = usable[:-1]
    bounds = [
        range(min(math.ceil(need_ft / p.length_ft),
                  math.lcm(p.length_ft, longest.length_ft) // p.length_ft - 1, 50) + 1)
        for p in shorter
    ]
    best: tuple | None = None
    for counts in itertools.product(*bounds):
        got = sum(c * p.length_ft for c, p in zip(counts, shorter))
        n_long = max(0, math.ceil((need_ft - got) / longest.length_ft))
        total = got + n_long * longest.length_ft
        key = (total - need_ft, sum(counts) + n_long, tuple(reversed(counts)))
        if best is None or key < best[0]:
            best = (key, counts + (n_long,), total)
    assert best is not None
    _, counts, total = best
    chosen = tuple(
        PutUpCount(p.label, p.length_ft, c)
        for p, c in sorted(zip(usable, counts), key=lambda pc: -pc[0].length_ft)
        if c
    )
    return chosen, total
