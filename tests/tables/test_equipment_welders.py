"""Arc welders: NEC 2023 Table 630.11(A), 630.11(B) and 630.12."""

import math

import pytest

from gaugewalk.tables.equipment.welders import (
    CONDUCTOR_DEVICE_MAX_PCT,
    GROUP_FACTORS,
    TABLE_630_11_A_MULTIPLIERS,
    WELDER_DEVICE_MAX_PCT,
    duty_cycle_multiplier,
    next_higher_duty_cycle_row,
)
from gaugewalk.tables.errors import TableLookupError


@pytest.mark.parametrize(
    ("duty", "kind", "multiplier"),
    # NEC 2023 Table 630.11(A)
    [(100, "nonmotor-generator", 1.00), (90, "nonmotor-generator", 0.95),
     (80, "motor-generator", 0.91), (60, "nonmotor-generator", 0.78),
     (50, "nonmotor-generator", 0.71), (50, "motor-generator", 0.75),
     (30, "motor-generator", 0.62), (20, "nonmotor-generator", 0.45),
     (15, "nonmotor-generator", 0.45), (10, "motor-generator", 0.55),
     (60.0, "motor-generator", 0.81)],
)
def test_printed_multipliers(duty, kind, multiplier):
    assert duty_cycle_multiplier(duty, kind) == multiplier


def test_the_nonmotor_generator_column_is_the_square_root_of_the_duty_cycle():
    # the table's own basis: sqrt(duty cycle), to two places (60 % prints 0.78 where the root is
    # 0.775, so within a hundredth)
    for duty, (nonmotor, motor) in TABLE_630_11_A_MULTIPLIERS.items():
        assert abs(nonmotor - math.sqrt(duty / 100)) < 0.01, duty
        assert motor >= nonmotor


def test_a_conductor_sized_from_the_multiplier_worked_by_hand():
    # a nonmotor-generator arc welder, 40 A rated primary current at 50 % duty cycle, no I1eff:
    # 40 x 0.71 = 28.4 A (630.11(A), a trade article's worked example); its device at most
    # 200 % of the rated primary current, 80 A (630.12(A))
    assert 40 * duty_cycle_multiplier(50) == pytest.approx(28.4)
    assert 40 * WELDER_DEVICE_MAX_PCT / 100 == 80
    assert CONDUCTOR_DEVICE_MAX_PCT == 200


def test_group_factors_of_630_11_b():
    # 100 % of the two largest, 85 % of the third, 70 % of the fourth, 60 % of the rest
    assert GROUP_FACTORS == (1.00, 1.00, 0.85, 0.70, 0.60)


def test_a_duty_cycle_between_rows_is_refused_and_the_next_higher_row_is_offered():
    with pytest.raises(TableLookupError, match=r"no row for a 35 % duty cycle; its rows are 100, "
                                               r"90, 80, 70, 60, 50, 40, 30, 20"):
        duty_cycle_multiplier(35)
    assert next_higher_duty_cycle_row(35) == 40
    assert next_higher_duty_cycle_row(12) == 20
    assert next_higher_duty_cycle_row(60) == 60
    assert duty_cycle_multiplier(next_higher_duty_cycle_row(35)) > duty_cycle_multiplier(30)


@pytest.mark.parametrize("bad", [0, -10, 101, "50", True, None])
def test_a_duty_cycle_outside_0_to_100_is_refused(bad):
    with pytest.raises(TableLookupError, match="duty cycle"):
        duty_cycle_multiplier(bad)
    with pytest.raises(TableLookupError, match="duty cycle"):
        next_higher_duty_cycle_row(bad)


def test_an_unknown_welder_kind_is_refused():
    with pytest.raises(TableLookupError, match="kinds are nonmotor-generator, motor-generator"):
        duty_cycle_multiplier(50, "inverter")
