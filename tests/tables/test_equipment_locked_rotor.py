"""Locked-rotor currents: NEC 2023 Tables 430.251(A), 430.251(B) and the code letters of Table
430.7(B)."""

import itertools
import math

import pytest

from gaugewalk.tables.equipment.horsepower import parse_hp
from gaugewalk.tables.equipment.locked_rotor import (
    CODE_LETTERS,
    COLUMNS_430_251_A,
    COLUMNS_430_251_B,
    TABLE_430_251_A_LRA,
    TABLE_430_251_B_LRA,
    code_letter_range,
    kva_per_hp,
    locked_rotor_amps,
    locked_rotor_amps_from_code_letter,
)
from gaugewalk.tables.equipment.motors import TABLE_430_250_FLC
from gaugewalk.tables.errors import TableLookupError


@pytest.mark.parametrize(
    ("hp", "volts", "phases", "amps", "table"),
    [
        # NEC 2023 Table 430.251(A) (single-phase)
        ("1/2", 115, 1, 58.8, "Table 430.251(A)"), ("1", 120, 1, 96, "Table 430.251(A)"),
        ("5", 240, 1, 168, "Table 430.251(A)"), ("10", 208, 1, 332, "Table 430.251(A)"),
        # NEC 2023 Table 430.251(B) (polyphase Design B, C, D)
        ("25", 480, 3, 183, "Table 430.251(B)"), ("10", 460, 3, 81, "Table 430.251(B)"),
        ("10", 208, 3, 179, "Table 430.251(B)"), ("10", 200, 3, 186.3, "Table 430.251(B)"),
        ("1/2", 120, 3, 40, "Table 430.251(B)"), ("7-1/2", 230, 3, 127, "Table 430.251(B)"),
        ("100", 600, 3, 580, "Table 430.251(B)"), ("500", 460, 3, 3625, "Table 430.251(B)"),
    ],
)
def test_printed_locked_rotor_currents(hp, volts, phases, amps, table):
    found = locked_rotor_amps(hp, volts, phases)
    assert (found.amps, found.table) == (amps, table)


def test_refusals_name_the_table_and_its_choices():
    with pytest.raises(TableLookupError, match=r"Table 430.251\(A\) has no column for 200 V"):
        locked_rotor_amps(1, 200, 1)
    with pytest.raises(TableLookupError, match=r"Table 430.251\(A\) lists no 1/3 hp motor"):
        locked_rotor_amps("1/3", 120, 1)
    with pytest.raises(TableLookupError, match="no 208 V current for a 250 hp motor"):
        locked_rotor_amps(250, 208, 3)
    with pytest.raises(TableLookupError, match="phases are 1, 3"):
        locked_rotor_amps(10, 480, 2)


@pytest.mark.parametrize(("table", "columns"), [(TABLE_430_251_A_LRA, COLUMNS_430_251_A),
                                                (TABLE_430_251_B_LRA, COLUMNS_430_251_B)])
def test_locked_rotor_kva_is_the_same_in_every_voltage_column(table, columns):
    # the tables scale each row by 1/V (constant locked-rotor kVA), to the printed rounding: whole
    # amperes within half an ampere, decimals within 0.06 A; from the 230 V column, or the 460 V
    # column where 230 V has no entry (250 hp and up)
    for hp, row in table.items():
        reference = 230 if row[columns.index(230)] is not None else 460
        base = row[columns.index(reference)]
        for volts, amps in zip(columns, row, strict=True):
            if amps is None:
                continue
            expected = base * reference / volts
            assert abs(amps - expected) <= (0.5 if amps == int(amps) else 0.06), (hp, volts)


def test_locked_rotor_current_rises_with_horsepower():
    for table, columns in ((TABLE_430_251_A_LRA, COLUMNS_430_251_A),
                           (TABLE_430_251_B_LRA, COLUMNS_430_251_B)):
        assert list(table) == sorted(table)
        for i, volts in enumerate(columns):
            amps = [row[i] for row in table.values() if row[i] is not None]
            assert all(a < b for a, b in itertools.pairwise(amps)), volts


def test_design_b_locked_rotor_current_is_about_six_times_full_load():
    # NEC 2023 Tables 430.251(B) / 430.250 at 460 V: 5 to 6.5 x from 5 hp up (the usual "about
    # six times" of the trade, common practice); small motors start harder, never above 9.5 x
    for hp, row in TABLE_430_251_B_LRA.items():
        ratio = row[COLUMNS_430_251_B.index(460)] / TABLE_430_250_FLC[hp][4]
        assert 5.0 <= ratio <= 9.5, hp
        if hp >= 5:
            assert ratio <= 6.5, hp
    assert set(TABLE_430_251_B_LRA) == set(TABLE_430_250_FLC)


def test_code_letters_are_contiguous_in_steps_of_a_hundredth():
    # NEC 2023 Table 430.7(B): each letter starts one hundredth above the last one's end; I, O and
    # Q are not used; V is "22.4 and up"
    letters = list(CODE_LETTERS)
    assert "".join(letters) == "ABCDEFGHJKLMNPRSTUV"
    assert CODE_LETTERS["A"][0] == 0.0 and CODE_LETTERS["V"] == (22.4, None)
    for before, after in itertools.pairwise(letters):
        assert round(CODE_LETTERS[after][0] - CODE_LETTERS[before][1], 2) == 0.01, after


@pytest.mark.parametrize(("letter", "low", "high"),
                         # NEC 2023 Table 430.7(B)
                         [("A", 0, 3.14), ("b", 3.15, 3.54), ("G", 5.6, 6.29), ("H", 6.3, 7.09),
                          ("J", 7.1, 7.99), (" m ", 10.0, 11.19), ("U", 20.0, 22.39)])
def test_code_letter_ranges(letter, low, high):
    assert code_letter_range(letter) == (low, high)


@pytest.mark.parametrize(("hp", "letters"),
                         # the letters a public engineering chart gives as usual for three-phase
                         # motors (common practice): 1-1/2 to 2 hp L or M, 3 hp K, 5 hp J,
                         # 7-1/2 to 10 hp H, 15 hp and up G
                         [("1-1/2", "LM"), ("2", "LM"), ("3", "K"), ("5", "J"), ("7-1/2", "H"),
                          ("10", "H"), ("15", "G"), ("25", "G"), ("100", "G"), ("500", "G")])
def test_table_430_251_b_currents_fall_in_the_usual_code_letters(hp, letters):
    # two sources agree: the kVA/hp of the Table 430.251(B) current at 460 V lies in the range of
    # a letter the chart names
    amps = locked_rotor_amps(hp, 460, 3).amps
    per_hp = math.sqrt(3) * 460 * amps / 1000 / float(parse_hp(hp))
    assert any(CODE_LETTERS[x][0] <= round(per_hp, 2) <= CODE_LETTERS[x][1] for x in letters)


def test_locked_rotor_amps_from_a_code_letter_worked_by_hand():
    # 25 hp, 460 V, code G read at its top, 6.29 kVA/hp: 6.29 x 25 x 1000 / (sqrt(3) x 460)
    # = 157 250 / 796.74 = 197.4 A (hand arithmetic)
    found = locked_rotor_amps_from_code_letter("G", "25 hp", 460, 3)
    assert found.amps == pytest.approx(197.37, abs=0.01)
    assert (found.kva_per_hp, found.basis) == (6.29, "upper")
    # midpoint (5.6 + 6.29) / 2 = 5.945 kVA/hp -> 186.5 A; bottom 5.6 -> 175.7 A
    assert locked_rotor_amps_from_code_letter("g", 25, 460, 3, "midpoint").amps == \
        pytest.approx(5.945 * 25000 / (math.sqrt(3) * 460))
    assert locked_rotor_amps_from_code_letter("G", 25, 460, 3, "lower").amps == \
        pytest.approx(175.7, abs=0.05)
    # single-phase: 3 hp, 230 V, code J at 7.99: 7.99 x 3000 / 230 = 104.2 A (hand arithmetic)
    assert locked_rotor_amps_from_code_letter("J", 3, 230, 1).amps == pytest.approx(104.2, abs=0.05)


def test_the_upper_reading_is_never_below_the_table_current_for_the_usual_letter():
    # 10 hp at 460 V, letter H at its top: 7.09 x 10 000 / (sqrt(3) x 460) = 89.0 A, above the
    # 81 A of NEC Table 430.251(B)
    assert locked_rotor_amps_from_code_letter("H", 10, 460, 3).amps > \
        locked_rotor_amps(10, 460, 3).amps


def test_code_letter_refusals():
    with pytest.raises(TableLookupError, match="letters are A, B, C, D, E, F, G, H, J, K"):
        code_letter_range("I")
    with pytest.raises(TableLookupError, match="no upper bound"):
        kva_per_hp("V")
    assert kva_per_hp("V", "lower") == 22.4
    with pytest.raises(TableLookupError, match="bases are upper, midpoint, lower"):
        kva_per_hp("G", "worst")
    with pytest.raises(TableLookupError, match=r"430.7\(A\)\(7\)"):
        locked_rotor_amps_from_code_letter("L", "1/3", 115, 1)
    with pytest.raises(TableLookupError, match="1 or 3 phases"):
        locked_rotor_amps_from_code_letter("G", 10, 460, 2)
