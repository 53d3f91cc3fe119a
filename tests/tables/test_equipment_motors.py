"""Motor full-load currents, NEC 2023 Tables 430.247, 430.248 and 430.250, and the voltage column a
system reads (the tables' headnotes)."""

import itertools
from fractions import Fraction

import pytest

from gaugewalk.tables.equipment.motors import (
    COLUMNS_430_247,
    COLUMNS_430_248,
    COLUMNS_430_250,
    TABLE_430_247_FLC,
    TABLE_430_248_FLC,
    TABLE_430_250_FLC,
    TABLE_430_250_SYNC_FLC,
    dc_motor_flc,
    flc_column,
    horsepowers,
    motor_flc,
    synchronous_motor_flc,
    table_hp,
)
from gaugewalk.tables.errors import TableLookupError


@pytest.mark.parametrize(
    ("hp", "volts", "phases", "amps", "column"),
    [
        # NEC 2023 Table 430.250 (three-phase)
        ("25", 460, 3, 34, 460), ("25 hp", 480, 3, 34, 460), ("10", 480, 3, 14, 460),
        ("15", 480, 3, 21, 460), ("10", 230, 3, 28, 230), ("10", 240, 3, 28, 230),
        ("10", 208, 3, 30.8, 208), ("10", 200, 3, 32.2, 200), ("1/2", 120, 3, 4.4, 115),
        ("1-1/2", 600, 3, 2.4, 575), ("7-1/2", 480, 3, 11, 460), ("50", 480, 3, 65, 460),
        ("100", 480, 3, 124, 460), ("100", 208, 3, 273, 208), ("200", 230, 3, 480, 230),
        ("500", 575, 3, 472, 575), ("250", 460, 3, 302, 460), ("3", 208, 3, 10.6, 208),
        # NEC 2023 Table 430.248 (single-phase)
        ("5", 230, 1, 28, 230), ("5", 240, 1, 28, 230), ("1", 115, 1, 16, 115),
        ("1 hp", 120, 1, 16, 115), ("1/6", 120, 1, 4.4, 115), ("1/3", 120, 1, 7.2, 115),
        ("0.33", 120, 1, 7.2, 115), ("3/4", 208, 1, 7.6, 208), ("10", 200, 1, 57.5, 200),
        ("2", 240, 1, 12, 230), ("7½", 230, 1, 40, 230),
    ],
)
def test_printed_full_load_currents(hp, volts, phases, amps, column):
    found = motor_flc(hp, volts, phases)
    assert found.amps == amps
    assert found.column == column
    assert found.table == ("Table 430.248" if phases == 1 else "Table 430.250")


@pytest.mark.parametrize(
    ("volts", "phases", "column"),
    # NEC 2023 Tables 430.248 and 430.250 headnotes: system ranges 110-120, 220-240, 440-480,
    # 550-600 V; 200 and 208 V read their own columns
    [(110, 1, 115), (115, 1, 115), (120, 1, 115), (200, 1, 200), (208, 1, 208), (220, 1, 230),
     (230, 1, 230), (240, 1, 230), (120, 3, 115), (208, 3, 208), (240, 3, 230), (440, 3, 460),
     (460, 3, 460), (480, 3, 460), (550, 3, 575), (575, 3, 575), (600, 3, 575), (480.0, 3, 460)],
)
def test_the_system_voltage_picks_the_column_by_the_headnote_ranges(volts, phases, column):
    assert flc_column(volts, phases) == column


@pytest.mark.parametrize(("volts", "phases"), [(277, 1), (480, 1), (347, 3), (250, 3), (2400, 3),
                                               (209, 3), (0, 3), (-480, 3), ("480", 3)])
def test_a_voltage_no_column_covers_is_refused_naming_the_columns(volts, phases):
    with pytest.raises(TableLookupError, match="column|volts"):
        flc_column(volts, phases)


def test_the_refusal_lists_the_columns_and_their_system_ranges():
    with pytest.raises(TableLookupError,
                       match=r"Table 430.248 has no column for 277 V; its columns are 115 V "
                             r"\(110-120 V systems\), 200 V, 208 V"):
        motor_flc(1, 277, 1)


def test_a_rating_the_table_does_not_list_is_refused_with_the_list():
    with pytest.raises(TableLookupError, match=r"Table 430.250 lists no 4 hp motor; its ratings "
                                               r"are 1/2, 3/4, 1, 1-1/2, 2, 3, 5, 7-1/2, 10"):
        motor_flc("4hp", 480, 3)
    with pytest.raises(TableLookupError, match="Table 430.248 lists no 15 hp"):
        table_hp(15, 1)
    assert table_hp("1 1/2 hp", 3) == Fraction(3, 2)


def test_an_empty_cell_is_refused_with_the_columns_range():
    # NEC 2023 Table 430.250: the 115 V column stops at 2 hp; 200-230 V stop at 200 hp
    with pytest.raises(TableLookupError, match="no 115 V current for a 3 hp motor; its 115 V "
                                               "column runs 1/2 to 2 hp"):
        motor_flc(3, 120, 3)
    with pytest.raises(TableLookupError, match="runs 1/2 to 200 hp"):
        motor_flc(250, 208, 3)


def test_phases_other_than_one_or_three_are_refused():
    for phases in (2, 0, True, "3"):
        with pytest.raises(TableLookupError, match="phases"):
            motor_flc(10, 480, phases)


def _column(table, columns, volts):
    i = columns.index(volts)
    return [(hp, row[i]) for hp, row in table.items() if row[i] is not None]


@pytest.mark.parametrize(("table", "columns"), [(TABLE_430_248_FLC, COLUMNS_430_248),
                                                (TABLE_430_250_FLC, COLUMNS_430_250),
                                                (TABLE_430_247_FLC, COLUMNS_430_247)])
def test_current_rises_with_horsepower_in_every_column(table, columns):
    assert list(table) == sorted(table)
    for volts in columns:
        amps = [a for _hp, a in _column(table, columns, volts)]
        assert len(amps) >= 5
        assert all(a < b for a, b in itertools.pairwise(amps)), volts


@pytest.mark.parametrize(("table", "columns"), [(TABLE_430_248_FLC, COLUMNS_430_248),
                                                (TABLE_430_250_FLC, COLUMNS_430_250)])
def test_the_115_v_column_is_twice_the_230_v_column(table, columns):
    # the same motor at half the voltage draws twice the current: the tables print exactly 2x
    for hp, row in table.items():
        if row[0] is not None:
            assert row[0] == 2 * row[columns.index(230)], hp


def test_the_460_v_column_is_half_the_230_v_column_and_575_v_four_fifths_of_460_v():
    # NEC 2023 Table 430.250: 460 V is exactly half of 230 V where both print; 575 V follows
    # 460 x 460/575 = 0.8 within the table's rounding (one decimal below 7.5 hp, whole amperes
    # from 7.5 hp) or 1.5 % (the most, at 350 hp)
    for hp, (_a115, _a200, _a208, a230, a460, a575) in TABLE_430_250_FLC.items():
        if a230 is not None:
            assert a460 == a230 / 2, hp
        rounding = 0.5 if hp >= Fraction(15, 2) else 0.1
        assert abs(a575 - 0.8 * a460) <= max(rounding, 0.015 * a575), hp


@pytest.mark.parametrize(("table", "columns"), [(TABLE_430_248_FLC, COLUMNS_430_248),
                                                (TABLE_430_250_FLC, COLUMNS_430_250)])
def test_the_208_and_200_v_columns_are_the_230_v_currents_plus_10_and_15_percent(table, columns):
    # the rule an older edition's note stated (from memory); every printed cell follows it to the
    # table's rounding (one decimal below 100 A, whole amperes above)
    for hp, row in table.items():
        a230 = row[columns.index(230)]
        if a230 is None:
            continue
        for volts, factor in ((208, 1.10), (200, 1.15)):
            printed = row[columns.index(volts)]
            tolerance = 0.051 if printed < 100 else 0.5
            assert abs(printed - a230 * factor) <= tolerance, (hp, volts)


def test_horsepower_lists_start_and_end_where_the_tables_do():
    # NEC 2023 Table 430.248: 1/6 to 10 hp; Table 430.250: 1/2 to 500 hp
    assert horsepowers(1)[0] == Fraction(1, 6) and horsepowers(1)[-1] == 10
    assert horsepowers(3)[0] == Fraction(1, 2) and horsepowers(3)[-1] == 500
    assert len(horsepowers(1)) == 12 and len(horsepowers(3)) == 27


@pytest.mark.parametrize(
    ("hp", "volts", "pf", "amps"),
    # NEC 2023 Table 430.250, synchronous type unity power factor; footnote: x1.1 at 0.9 and
    # x1.25 at 0.8 power factor
    [(25, 230, 1.0, 53), (25, 480, 1.0, 26), (100, 460, 1.0, 101), (200, 575, 1.0, 161),
     (60, 240, 1.0, 123), (100, 460, 0.9, 111.1), (100, 460, 0.8, 126.25), (50, 600, 0.8, 52.5)],
)
def test_synchronous_motor_currents(hp, volts, pf, amps):
    found = synchronous_motor_flc(hp, volts, pf)
    assert found.amps == pytest.approx(amps)
    assert found.table.startswith("Table 430.250")


def test_synchronous_columns_start_at_25_hp_and_take_only_the_printed_power_factors():
    assert min(TABLE_430_250_SYNC_FLC) == 25 and max(TABLE_430_250_SYNC_FLC) == 200
    with pytest.raises(TableLookupError, match="lists no 20 hp"):
        synchronous_motor_flc(20, 460)
    with pytest.raises(TableLookupError, match="power factor"):
        synchronous_motor_flc(100, 460, 0.85)
    with pytest.raises(TableLookupError, match="no column for 208 V"):
        synchronous_motor_flc(100, 208)
    # 460 V is half of 230 V, within one ampere of rounding
    for hp, (a230, a460, _a575) in TABLE_430_250_SYNC_FLC.items():
        assert abs(a460 - a230 / 2) <= 1, hp


@pytest.mark.parametrize(
    ("hp", "volts", "amps"),
    # NEC 2023 Table 430.247 (dc motors at base speed, by armature voltage rating)
    [("1", 90, 12.2), ("1", 240, 4.7), ("1/4", 120, 3.1), ("5", 180, 27), ("7-1/2", 500, 13.6),
     ("7-1/2", 550, 12.2), ("10", 120, 76), ("100", 240, 341), ("200", 500, 330),
     ("200", 550, 294)],
)
def test_dc_motor_currents(hp, volts, amps):
    assert dc_motor_flc(hp, volts) == (amps, "Table 430.247", volts)


def test_dc_lookups_need_a_printed_armature_voltage():
    with pytest.raises(TableLookupError, match=r"armature voltage ratings are 90, 120, 180, 240, "
                                               r"500, 550 V"):
        dc_motor_flc(1, 125)
    with pytest.raises(TableLookupError, match="no 180 V current for a 7-1/2 hp"):
        dc_motor_flc("7.5", 180)
