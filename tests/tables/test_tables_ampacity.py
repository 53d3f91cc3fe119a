"""NEC 2023 Table 310.16 and the corrections of 310.15(B)(1)(1) and 310.15(C)(1)
(gaugewalk.tables.conductor.ampacity)."""

import math

import pytest

from gaugewalk.tables.conductor.ampacity import (
    AMBIENT_ROWS,
    INSULATION_TEMP,
    TABLE_310_16,
    ambient_factor,
    ampacity,
    ccc_factor,
    insulation_rating,
    parse_insulation,
)
from gaugewalk.tables.conductor.sizes import SIZES
from gaugewalk.tables.errors import TableLookupError


@pytest.mark.parametrize(
    ("size", "material", "column", "amps"),
    [
        # NEC 2023 Table 310.16, values a trade reader knows by heart (common practice)
        ("14 AWG", "cu", 75, 20), ("12 AWG", "cu", 75, 25), ("10 AWG", "cu", 75, 35),
        ("10 AWG", "cu", 60, 30), ("8 AWG", "cu", 75, 50), ("6 AWG", "cu", 75, 65),
        ("4 AWG", "cu", 75, 85), ("2 AWG", "cu", 75, 115), ("1/0 AWG", "cu", 75, 150),
        ("2/0 AWG", "cu", 75, 175), ("3/0 AWG", "cu", 75, 200), ("4/0 AWG", "cu", 75, 230),
        ("250 kcmil", "cu", 75, 255), ("350 kcmil", "cu", 75, 310), ("500 kcmil", "cu", 75, 380),
        ("500 kcmil", "cu", 90, 430), ("4/0 AWG", "al", 75, 180), ("250 kcmil", "al", 75, 205),
        ("350 kcmil", "al", 75, 250), ("2/0 AWG", "al", 75, 135), ("1/0 AWG", "al", 75, 120),
        ("18 AWG", "cu", 90, 14), ("16 AWG", "cu", 90, 18),
    ],
)
def test_table_310_16_spot_values(size, material, column, amps):
    assert ampacity(size, material, column) == amps


@pytest.mark.parametrize(
    ("size", "material", "column", "amps"),
    [
        # Cells that changed in the 2011 edition (trade notes; NEC 2011-2023 Table 310.16).
        ("14 AWG", "cu", 60, 15), ("12 AWG", "cu", 60, 20), ("3 AWG", "cu", 90, 115),
        ("1 AWG", "cu", 90, 145), ("600 kcmil", "cu", 60, 350), ("1500 kcmil", "cu", 60, 525),
        ("2000 kcmil", "cu", 60, 555), ("12 AWG", "al", 60, 15), ("8 AWG", "al", 60, 35),
        ("6 AWG", "al", 90, 55), ("300 kcmil", "al", 60, 195), ("300 kcmil", "al", 90, 260),
        ("700 kcmil", "al", 60, 315), ("700 kcmil", "al", 90, 425), ("800 kcmil", "al", 90, 445),
    ],
)
def test_cells_revised_in_2011_carry_the_current_values(size, material, column, amps):
    assert ampacity(size, material, column) == amps


def test_sizes_without_an_entry_return_none():
    # NEC Table 310.16: 18/16 AWG copper only at 90 C; aluminum starts at 12 AWG
    assert ampacity("18 AWG", "cu", 60) is None and ampacity("16 AWG", "cu", 75) is None
    assert ampacity("14 AWG", "al", 90) is None and ampacity("16 AWG", "al", 90) is None
    assert ampacity("12 AWG", "al", 60) == 15


def test_every_column_rises_with_size_and_with_temperature():
    # NEC Table 310.16 structure: monotonic down each column and across each row
    for material in ("cu", "al"):
        for column in (60, 75, 90):
            values = [ampacity(s, material, column) for s in SIZES]
            values = [v for v in values if v is not None]
            assert values == sorted(values) and len(set(values)) == len(values)
        for size in SIZES:
            row = [ampacity(size, material, c) for c in (60, 75, 90)]
            row = [v for v in row if v is not None]
            assert row == sorted(row)


def test_aluminum_carries_less_than_copper_of_the_same_size():
    # NEC Table 310.16: the aluminum column is about 78-85 % of copper (common practice)
    for size in SIZES:
        for column in (60, 75, 90):
            cu, al = ampacity(size, "cu", column), ampacity(size, "al", column)
            if al is not None:
                assert 0.70 <= al / cu <= 0.90


def test_unknown_column_and_material_are_refused_with_choices():
    with pytest.raises(TableLookupError, match="columns are 60, 75, 90"):
        ampacity("12", "cu", 105)
    with pytest.raises(TableLookupError, match="materials are cu, al"):
        ampacity("12", "copper", 75)
    assert len(TABLE_310_16) == len(SIZES)


def equation_310_15_b(ambient_c: float, rating_c: int) -> float:
    """NEC 2023 310.15(B), the equation behind Table 310.15(B)(1)(1):
    factor = sqrt((Tc - Ta) / (Tc - 30))."""
    return math.sqrt((rating_c - ambient_c) / (rating_c - 30))


@pytest.mark.parametrize("column", [60, 75, 90])
def test_ambient_rows_follow_the_310_15_b_equation_at_their_warm_end(column):
    # Table 310.15(B)(1)(1) is the equation evaluated at each row's highest ambient, rounded
    # to two decimals.
    for top, *factors in AMBIENT_ROWS:
        factor = factors[(60, 75, 90).index(column)]
        if factor is None:
            assert top > column - 5  # no factor only where the conductor is at or near its rating
            continue
        assert factor == pytest.approx(equation_310_15_b(top, column), abs=0.005)
        assert ambient_factor(top, column) == factor


def test_ambient_factor_picks_the_row_holding_the_temperature():
    # NEC 2023 Table 310.15(B)(1)(1) (30 C basis)
    assert ambient_factor(30, 75) == 1.00
    assert ambient_factor(31, 75) == 0.94 and ambient_factor(35, 75) == 0.94
    assert ambient_factor(30.5, 90) == 0.96   # between rows: the warmer row
    assert ambient_factor(-20, 60) == 1.29    # 10 C or less
    assert ambient_factor(43, 90) == 0.87 and ambient_factor(43, 60) == 0.71
    assert ambient_factor(85, 90) == 0.29


@pytest.mark.parametrize(("ambient", "column"), [(56, 60), (71, 75), (86, 90), (120, 90)])
def test_conductors_too_hot_for_the_ambient_are_refused(ambient, column):
    with pytest.raises(TableLookupError, match=f"{column} C conductor cannot be used at"):
        ambient_factor(ambient, column)


@pytest.mark.parametrize(
    ("n", "factor"),
    # NEC 2023 Table 310.15(C)(1)
    [(1, 1.0), (3, 1.0), (4, 0.80), (6, 0.80), (7, 0.70), (9, 0.70), (10, 0.50), (20, 0.50),
     (21, 0.45), (30, 0.45), (31, 0.40), (40, 0.40), (41, 0.35), (200, 0.35)],
)
def test_more_than_three_current_carrying_conductors_are_derated(n, factor):
    assert ccc_factor(n) == factor


@pytest.mark.parametrize("n", [0, -1, 2.5, True, "4"])
def test_conductor_counts_must_be_whole_and_positive(n):
    with pytest.raises(TableLookupError):
        ccc_factor(n)


@pytest.mark.parametrize(
    ("typed", "canonical", "rating"),
    # NEC 2023 Table 310.4(1): temperature ratings in dry locations
    [("thhn", "THHN", 90), ("THWN-2", "THWN-2", 90), ("thwn2", "THWN-2", 90),
     ("xhhw", "XHHW", 90), ("XHHW-2", "XHHW-2", 90), ("thhn/thwn-2", "THHN/THWN-2", 90),
     ("THHN THWN-2", "THHN/THWN-2", 90), ("thwn", "THWN", 75), ("thw", "THW", 75),
     ("tw", "TW", 60), (" Thhn ", "THHN", 90)],
)
def test_insulation_spellings_and_ratings(typed, canonical, rating):
    assert parse_insulation(typed) == canonical
    assert insulation_rating(typed) == rating


def test_wet_ratings_and_unknown_insulations():
    # NEC 2023 Table 310.4(1): XHHW and THHW are 75 C wet; THWN-2 stays 90 C wet
    assert insulation_rating("XHHW", wet=True) == 75
    assert insulation_rating("THHW", wet=True) == 75
    assert insulation_rating("THWN-2", wet=True) == 90
    with pytest.raises(TableLookupError, match="not rated for wet"):
        insulation_rating("THHN", wet=True)
    with pytest.raises(TableLookupError, match="types are THHN/THWN-2, "):
        parse_insulation("PTFE")
    assert INSULATION_TEMP["THHN/THWN-2"] == 90 and INSULATION_TEMP["XHHW-2"] == 90
