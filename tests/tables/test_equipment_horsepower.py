"""Horsepower as the trade writes it (decimals, fractions, mixed numbers, an optional hp)."""

from fractions import Fraction

import pytest

from gaugewalk.tables.equipment.horsepower import hp_text, parse_hp
from gaugewalk.tables.errors import TableLookupError


@pytest.mark.parametrize(
    ("text", "hp"),
    [("10", 10), ("10hp", 10), ("10 hp", 10), ("10 HP", 10), (" 10 Hp ", 10), ("10 h.p.", 10),
     ("7.5", Fraction(15, 2)), ("7.5hp", Fraction(15, 2)), (".5", Fraction(1, 2)),
     ("1/2", Fraction(1, 2)), ("3/4 hp", Fraction(3, 4)), ("1/6hp", Fraction(1, 6)),
     ("1-1/2", Fraction(3, 2)), ("1 1/2", Fraction(3, 2)), ("1 - 1/2 hp", Fraction(3, 2)),
     ("7-1/2", Fraction(15, 2)), ("7½", Fraction(15, 2)), ("7 ½ hp", Fraction(15, 2)),
     ("½", Fraction(1, 2)), ("1.5", Fraction(3, 2)), ("0.33", Fraction(1, 3)),
     ("0.333 hp", Fraction(1, 3)), ("0.17", Fraction(1, 6)), ("0.167", Fraction(1, 6)),
     ("250", 250), ("12.5", Fraction(25, 2))],
)
def test_the_trades_spellings_read_as_exact_ratings(text, hp):
    assert parse_hp(text) == hp


def test_numbers_read_as_well_as_text():
    assert parse_hp(10) == 10
    assert parse_hp(0.75) == Fraction(3, 4)
    assert parse_hp(1 / 3) == Fraction(1, 3)
    assert parse_hp(Fraction(1, 6)) == Fraction(1, 6)


def test_a_one_place_decimal_is_not_taken_for_a_third():
    # 0.3 hp is written as such, not a rounding of 1/3
    assert parse_hp("0.3") == Fraction(3, 10)


@pytest.mark.parametrize(
    "bad", ["", "hp", "ten", "-5", "0", "0 hp", "1/0", "3/2/1", "1-3/2", "1 0/4", "1--1/2", "5e3",
            True, None, float("nan"), float("inf"), -1.0, "1,5"])
def test_unreadable_or_non_positive_horsepower_is_refused_with_the_forms(bad):
    with pytest.raises(TableLookupError, match="horsepower"):
        parse_hp(bad)


def test_the_refusal_shows_the_accepted_forms():
    with pytest.raises(TableLookupError, match=r"1-1/2 or 1 1/2, with or without 'hp'"):
        parse_hp("one and a half")


@pytest.mark.parametrize(
    ("hp", "text"),
    [(Fraction(1, 6), "1/6"), (Fraction(1, 2), "1/2"), (Fraction(3, 2), "1-1/2"),
     (Fraction(15, 2), "7-1/2"), (10, "10"), (Fraction(25, 2), "12-1/2"), ("1 1/2hp", "1-1/2")],
)
def test_ratings_print_the_way_the_tables_print_them(hp, text):
    assert hp_text(hp) == text
    assert parse_hp(hp_text(hp)) == parse_hp(hp)
