"""Arc welders: NEC 2023 Table 630.11(A) duty-cycle multipliers, the group factors of 630.11(B) and
the protection limits of 630.12.

630.11(A): the supply conductors of one arc welder have an ampacity of at least the I1eff on the
rating plate; where I1eff is not given, at least the rated primary current times the Table
630.11(A) multiplier for the welder's duty cycle. 630.11(B): conductors supplying a group of
welders, at least 100 % of the two largest welders' currents (each by 630.11(A)), plus 85 % of the
third, 70 % of the fourth and 60 % of all the others.

630.12(A): each welder has overcurrent protection rated or set at not more than 200 % of I1max,
or of the rated primary current where I1max is not given. 630.12(B): conductors supplying one or
more welders are protected at not more than 200 % of their ampacity. 630.12: where these values
are not a standard rating (240.6(A)), or the device opens needlessly, the next higher standard
rating or setting is permitted.

The nonmotor-generator column is the square root of the duty cycle to two places (60 % prints
0.78 where the root is 0.775; the tests check every row within 0.01); the motor-generator column
is larger for the same duty cycle.

Sources: typed from memory and checked against the 2008 text of 630.11 and 630.12 and a trade
article's worked example (40 A at 50 % duty cycle, nonmotor-generator: 40 x 0.71 = 28.4 A). The
Article 630 wording quoted above is a summary. Resistance welders (630.31, with a table of their
own) are not here.
"""

from __future__ import annotations

from gaugewalk.tables.errors import TableLookupError, choices

TABLE_630_11_A = "Table 630.11(A)"

KINDS = ("nonmotor-generator", "motor-generator")
"""The welder kinds of Table 630.11(A)'s two columns."""

# NEC 2023 Table 630.11(A): duty cycle [%] -> (nonmotor-generator, motor-generator) multiplier.
# The last row is "20 or less".
TABLE_630_11_A_MULTIPLIERS: dict[int, tuple[float, float]] = {
    100: (1.00, 1.00),
    90: (0.95, 0.96),
    80: (0.89, 0.91),
    70: (0.84, 0.86),
    60: (0.78, 0.81),
    50: (0.71, 0.75),
    40: (0.63, 0.69),
    30: (0.55, 0.62),
    20: (0.45, 0.55),
}

GROUP_FACTORS: tuple[float, ...] = (1.00, 1.00, 0.85, 0.70, 0.60)
"""630.11(B): factors for the largest, second, third, fourth and every further welder's current."""

WELDER_DEVICE_MAX_PCT = 200
"""[%] 630.12(A): of I1max (or the rated primary current where I1max is not given)."""

CONDUCTOR_DEVICE_MAX_PCT = 200
"""[%] 630.12(B): of the supply conductors' ampacity."""


def duty_cycle_multiplier(duty_cycle_pct: float, kind: str = "nonmotor-generator") -> float:
    """The NEC Table 630.11(A) multiplier for an arc welder's duty cycle [%] (100, 90, ... 30,
    or 20 and less) and ``kind`` (``KINDS``). A duty cycle between the printed rows is refused,
    listing them: reading it at the next higher row gives the larger (conservative) multiplier,
    a choice for the rule code to state."""
    if kind not in KINDS:
        raise TableLookupError(f"no welder kind '{kind}' in {TABLE_630_11_A}; kinds are "
                               f"{choices(KINDS)}")
    if isinstance(duty_cycle_pct, bool) or not isinstance(duty_cycle_pct, (int, float)) \
            or not 0 < duty_cycle_pct <= 100:
        raise TableLookupError(f"a duty cycle is a percentage above 0 and at most 100, not "
                               f"{duty_cycle_pct!r}")
    row = 20 if duty_cycle_pct <= 20 else duty_cycle_pct
    if row not in TABLE_630_11_A_MULTIPLIERS:
        raise TableLookupError(f"{TABLE_630_11_A} has no row for a {duty_cycle_pct:g} % duty "
                               f"cycle; its rows are {choices(TABLE_630_11_A_MULTIPLIERS)} "
                               f"(the last is 20 or less)")
    return TABLE_630_11_A_MULTIPLIERS[int(row)][KINDS.index(kind)]


def next_higher_duty_cycle_row(duty_cycle_pct: float) -> int:
    """The Table 630.11(A) row [%] at or above a duty cycle [%]: 20 for 20 % and less, else the
    next printed step up (35 -> 40). Reading that row takes the larger multiplier."""
    if isinstance(duty_cycle_pct, bool) or not isinstance(duty_cycle_pct, (int, float)) \
            or not 0 < duty_cycle_pct <= 100:
        raise TableLookupError(f"a duty cycle is a percentage above 0 and at most 100, not "
                               f"{duty_cycle_pct!r}")
    return min(row for row in TABLE_630_11_A_MULTIPLIERS if row >= max(duty_cycle_pct, 20))
