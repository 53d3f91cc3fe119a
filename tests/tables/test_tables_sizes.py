"""Conductor size names and spellings (gaugewalk.tables.conductor.sizes)."""

import pytest
from hypothesis import given
from hypothesis import strategies as st

from gaugewalk.tables.conductor.sizes import SIZES, is_awg, next_larger, parse_size, size_index
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.raceway.fill import RACEWAY_TYPES, parse_raceway


@pytest.mark.parametrize(
    ("typed", "canonical"),
    [
        ("12", "12 AWG"), ("#12", "12 AWG"), ("12 awg", "12 AWG"), ("12AWG", "12 AWG"),
        ("  12   AWG ", "12 AWG"), ("# 12", "12 AWG"), ("18", "18 AWG"), ("1", "1 AWG"),
        ("1/0", "1/0 AWG"), ("2/0 awg", "2/0 AWG"), ("#1/0", "1/0 AWG"), ("3 / 0", "3/0 AWG"),
        ("4/0AWG", "4/0 AWG"),
        # common practice: 0, 00, 000, 0000 ("one aught" .. "four aught") are 1/0 .. 4/0
        ("0", "1/0 AWG"), ("00", "2/0 AWG"), ("000", "3/0 AWG"), ("0000", "4/0 AWG"),
        ("250", "250 kcmil"), ("250kcmil", "250 kcmil"), ("250 MCM", "250 kcmil"),
        ("250 kcmil", "250 kcmil"), ("500 KCMIL", "500 kcmil"), ("2000", "2000 kcmil"),
    ],
)
def test_common_spellings_parse_to_the_canonical_size(typed, canonical):
    assert parse_size(typed) == canonical


@pytest.mark.parametrize(
    "typed",
    ["5", "5 AWG", "7", "20 AWG", "12 kcmil", "250 awg", "0250", "275 kcmil", "1/0 kcmil",
     "5/0", "00000", "abc", "", "12.5", "-4", "4/0/0", "\u0661\u0662"],
)
def test_sizes_outside_the_table_are_rejected_with_the_list_of_valid_sizes(typed):
    with pytest.raises(TableLookupError) as err:
        parse_size(typed)
    message = str(err.value)
    assert message.startswith(f"no conductor size '{typed.strip()}'")
    assert "sizes are 18 AWG, 16 AWG, 14 AWG" in message
    assert message.endswith("1750 kcmil, 2000 kcmil")


def test_the_size_list_follows_nec_chapter_9_table_8_order():
    # NEC 2023 Ch. 9 Table 8 rows: 18 AWG .. 4/0 AWG, then 250 .. 2000 kcmil
    assert len(SIZES) == 30
    assert SIZES[0] == "18 AWG" and SIZES[14] == "4/0 AWG" and SIZES[15] == "250 kcmil"
    assert SIZES[-1] == "2000 kcmil"
    assert "5 AWG" not in SIZES and "7 AWG" not in SIZES  # odd gauges above 3 are not building wire


def test_every_canonical_name_parses_to_itself():
    assert [parse_size(s) for s in SIZES] == list(SIZES)


def test_next_larger_steps_through_the_list_and_stops_at_2000_kcmil():
    assert next_larger("14") == "12 AWG"
    assert next_larger("1 AWG") == "1/0 AWG"
    assert next_larger("4/0") == "250 kcmil"
    assert next_larger("750 kcmil") == "800 kcmil"
    assert next_larger("2000 kcmil") is None


def test_size_index_and_is_awg_accept_any_spelling():
    assert size_index("#12") == size_index("12 AWG") == 3
    assert is_awg("0000") and not is_awg("250 MCM")
    with pytest.raises(TableLookupError):
        size_index("5")


@given(st.text(max_size=12))
def test_any_typed_text_gives_a_size_or_a_clear_refusal(text):
    # rule: user mistakes give a message, never a traceback of another kind
    try:
        assert parse_size(text) in SIZES
    except TableLookupError as err:
        assert "sizes are 18 AWG" in str(err)


@given(st.text(max_size=16))
def test_any_typed_text_gives_a_raceway_or_a_clear_refusal(text):
    try:
        assert parse_raceway(text) in RACEWAY_TYPES
    except TableLookupError as err:
        assert "types are EMT" in str(err)
