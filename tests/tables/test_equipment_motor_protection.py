"""Motor branch short-circuit and ground-fault devices: NEC 2023 Table 430.52(C)(1) and the limits
of 430.52(C)(1)(b) and 430.52(C)(3)."""

import pytest

from gaugewalk.tables.equipment.motor_protection import (
    DEVICES,
    MOTOR_TYPES,
    TABLE_430_52_PERCENT,
    branch_device_percent,
    instantaneous_evaluation_threshold,
    starting_limit,
)
from gaugewalk.tables.equipment.motors import motor_flc
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.protection.ocpd import next_standard_rating


@pytest.mark.parametrize(
    ("motor_type", "device", "percent"),
    # NEC 2023 Table 430.52(C)(1)
    [("single-phase", "inverse-time", 250), ("single-phase", "dual-element-fuse", 175),
     ("single-phase", "nontime-delay-fuse", 300), ("single-phase", "instantaneous-trip", 800),
     ("squirrel-cage", "inverse-time", 250), ("squirrel-cage", "instantaneous-trip", 800),
     ("design-b-energy-efficient", "instantaneous-trip", 1100),
     ("design-b-energy-efficient", "inverse-time", 250), ("synchronous", "dual-element-fuse", 175),
     ("wound-rotor", "nontime-delay-fuse", 150), ("wound-rotor", "inverse-time", 150),
     ("wound-rotor", "instantaneous-trip", 800), ("dc", "instantaneous-trip", 250),
     ("dc", "inverse-time", 150), ("dc", "dual-element-fuse", 150)],
)
def test_printed_percentages(motor_type, device, percent):
    assert branch_device_percent(motor_type, device) == percent


def test_the_table_has_every_row_and_column_and_the_rows_that_share_values_share_them():
    assert set(TABLE_430_52_PERCENT) == set(MOTOR_TYPES)
    assert list(DEVICES) == ["nontime-delay-fuse", "dual-element-fuse", "instantaneous-trip",
                             "inverse-time"]
    # single-phase, squirrel-cage and synchronous motors print the same row
    assert TABLE_430_52_PERCENT["single-phase"] == TABLE_430_52_PERCENT["squirrel-cage"] == \
        TABLE_430_52_PERCENT["synchronous"] == (300, 175, 800, 250)
    # the time-delay fuse never gets more than the nontime-delay fuse or the inverse time breaker
    for row in TABLE_430_52_PERCENT.values():
        assert row[1] <= row[0] and row[1] <= row[3]


def test_the_25_hp_460_v_motor_branch_worked_by_hand():
    # NEC 2023 Table 430.250: 25 hp at 460 V = 34 A; Table 430.52(C)(1): inverse time 250 %
    # -> 85 A, not a 240.6(A) standard rating; 430.52(C)(1)(a) permits the next one up, 90 A
    flc = motor_flc(25, 480, 3).amps
    limit = flc * branch_device_percent("squirrel-cage", "inverse-time") / 100
    assert limit == 85.0
    assert next_standard_rating(limit) == 90
    # dual-element fuse: 175 % of 34 = 59.5 A -> 60 A
    assert next_standard_rating(flc * branch_device_percent("squirrel-cage",
                                                            "dual-element-fuse") / 100) == 60


@pytest.mark.parametrize(
    ("device", "flc", "motor_type", "fuse_rating", "percent", "section"),
    # NEC 2023 430.52(C)(1)(b)(1)-(4) and 430.52(C)(3)
    [("nontime-delay-fuse", 34, "squirrel-cage", None, 400, "430.52(C)(1)(b)(1)"),
     ("nontime-delay-fuse", 34, "squirrel-cage", 600, 400, "430.52(C)(1)(b)(1)"),
     ("nontime-delay-fuse", 240, "squirrel-cage", 800, 300, "430.52(C)(1)(b)(4)"),
     ("dual-element-fuse", 34, "squirrel-cage", None, 225, "430.52(C)(1)(b)(2)"),
     ("dual-element-fuse", 240, "squirrel-cage", 800, 225, "430.52(C)(1)(b)(2)"),
     ("inverse-time", 100, "squirrel-cage", None, 400, "430.52(C)(1)(b)(3)"),
     ("inverse-time", 100.1, "squirrel-cage", None, 300, "430.52(C)(1)(b)(3)"),
     ("inverse-time", 124, "wound-rotor", None, 300, "430.52(C)(1)(b)(3)"),
     ("instantaneous-trip", 34, "squirrel-cage", None, 1300, "430.52(C)(3)"),
     ("instantaneous-trip", 34, "design-b-energy-efficient", None, 1700, "430.52(C)(3)")],
)
def test_starting_current_limits(device, flc, motor_type, fuse_rating, percent, section):
    assert starting_limit(device, flc, motor_type, fuse_rating) == (percent, section)


def test_the_limits_are_above_the_table_values_they_relax():
    for motor_type in MOTOR_TYPES:
        for device in DEVICES:
            assert starting_limit(device, 50, motor_type).percent >= \
                branch_device_percent(motor_type, device)


def test_instantaneous_settings_needing_an_engineering_evaluation():
    # NEC 2023 430.52(C)(3): above 800 % (1100 % for Design B energy-efficient)
    assert instantaneous_evaluation_threshold("squirrel-cage") == 800
    assert instantaneous_evaluation_threshold("design-b-energy-efficient") == 1100


def test_unknown_names_are_refused_with_the_choices():
    with pytest.raises(TableLookupError, match=r"devices are nontime-delay-fuse, "
                                               r"dual-element-fuse, instantaneous-trip"):
        branch_device_percent("squirrel-cage", "breaker")
    with pytest.raises(TableLookupError, match="types are single-phase, squirrel-cage"):
        branch_device_percent("design-e", "inverse-time")
    with pytest.raises(TableLookupError, match="full-load current"):
        starting_limit("inverse-time", 0)
