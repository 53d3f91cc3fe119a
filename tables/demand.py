"""Demand factors of NEC 2023 Article 220 for feeders and services.

- ``RECEPTACLE_STEPS``: NEC Table 220.44, non-dwelling receptacle loads: the first 10 kVA (or
  less) at 100 %, the remainder over 10 kVA at 50 % [(VA up to, factor)].
- ``receptacle_demand_va(connected_va)``: Table 220.44 applied to a receptacle load [VA].
"""

from __future__ import annotations

import math

RECEPTACLE_STEPS: tuple[tuple[float, float], ...] = ((10_000.0, 1.00), (math.inf, 0.50))
"""NEC 2023 Table 220.44: (the receptacle load up to [VA], the factor on that part)."""


def receptacle_demand_va(connected_va: float) -> float:
    """The receptacle load after NEC Table 220.44 [VA]: each part of ``connected_va`` [VA] at the
    factor of its step."""
    out, below = 0.0, 0.0
    for upto, factor in RECEPTACLE_STEPS:
        part = min(connected_va, upto) - below
        if part <= 0:
            break
        out += part * factor
        below = upto
    return out
