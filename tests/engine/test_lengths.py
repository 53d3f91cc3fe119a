"""The length grammar: sums, counts, units, and clear refusals."""

import math

import pint
import pytest
from hypothesis import given
from hypothesis import strategies as st

from gaugewalk.model.engine.lengths import (
    MAX_LENGTH_CHARS,
    LengthError,
    format_length_ft,
    parse_length,
)

UREG: pint.UnitRegistry = pint.UnitRegistry()


def pint_feet(text: str) -> float:
    # pint (registry reference library) converts a quantity to feet
    return UREG.Quantity(text).to("foot").magnitude


@pytest.mark.parametrize(
    ("text", "feet"),
    [
        ("120+35+2*12", 120 + 35 + 24),
        ("85 + 12 + 2*6", 85 + 12 + 12),
        ("12ft*2", 24),
        ("2x12", 24),
        ("150-12", 138),
        ("75", 75),
        ("75'", 75),
        ("3 feet", 3),
        ("0.5+.5", 1),
        ("12'6\"", 12.5),
    ],
)
def test_sums_and_counts_in_feet_add_up(text, feet):
    # arithmetic of the written expression, checked by hand
    assert parse_length(text) == pytest.approx(feet)


@pytest.mark.parametrize(
    ("text", "reference"),
    [
        ("36m+8ft", "36 m + 8 ft"),
        ("10 metres", "10 m"),
        ("2*7.5 meters", "15 m"),
        ("18 in", "18 inch"),
    ],
)
def test_metres_and_inches_convert_like_pint(text, reference):
    assert parse_length(text) == pytest.approx(pint_feet(reference), rel=1e-12)


def test_a_metre_is_exactly_0_3048_of_a_foot_inverse():
    # International yard and pound agreement (1959): 1 ft = 0.3048 m exactly
    assert parse_length("0.3048m") == pytest.approx(1.0, rel=1e-12)


@pytest.mark.parametrize(
    ("text", "position", "reason"),
    [
        ("", 0, "empty"),
        ("   ", 0, "empty"),
        ("0", 0, "above zero"),
        ("5-10", 0, "above zero"),
        ("-5", 0, "expected a number"),
        ("12 yd", 3, "unknown unit 'yd'"),
        ("abc", 0, "expected a number"),
        ("nan", 0, "expected a number"),
        ("inf", 0, "expected a number"),
        ("1e9", 1, "unknown unit 'e'"),
        ("1..2", 0, "not a number"),
        ("5+", 2, "found the end"),
        ("2*", 2, "after the multiplication"),
        ("2*3*4", 3, "one multiplication"),
        ("2m*3m", 4, "only one side"),
        ("12 (3)", 3, "unexpected '('"),
        ("__import__('os')", 0, "unexpected '_'"),
        ("1" * (MAX_LENGTH_CHARS + 1), MAX_LENGTH_CHARS, "longer than"),
    ],
)
def test_bad_lengths_say_where_and_why(text, position, reason):
    with pytest.raises(LengthError) as info:
        parse_length(text)
    assert info.value.position == position
    assert reason in str(info.value)


def test_length_error_is_a_value_error():
    assert issubclass(LengthError, ValueError)


@given(st.lists(st.integers(min_value=1, max_value=5000), min_size=1, max_size=12))
def test_any_sum_of_whole_feet_parses_to_its_total(parts):
    assert parse_length(" + ".join(str(p) for p in parts)) == sum(parts)


@given(st.text(max_size=60))
def test_arbitrary_text_is_a_positive_length_or_a_length_error(text):
    try:
        value = parse_length(text)
    except LengthError:
        return
    assert math.isfinite(value) and value > 0


def test_longest_accepted_input_still_parses():
    text = "+".join(["1"] * ((MAX_LENGTH_CHARS + 1) // 2))
    assert len(text) <= MAX_LENGTH_CHARS
    assert parse_length(text) == (MAX_LENGTH_CHARS + 1) // 2


@pytest.mark.parametrize(
    ("feet", "shown"),
    [(135.0, "135 ft"), (142.14, "142.1 ft"), (1234.0, "1,234 ft"), (0.04, "0 ft")],
)
def test_lengths_show_in_feet_to_a_tenth(feet, shown):
    assert format_length_ft(feet) == shown


def _outcome(text: str, shift: int = 0):
    try:
        return parse_length(text)
    except LengthError as exc:
        # a refusal of the whole total is placed at 0 however the text starts
        return (exc.position - shift if exc.position else 0, exc.reason)


_WHOLE = st.from_regex(r"[0-9]{1,14}", fullmatch=True)
_TERM = st.one_of(_WHOLE, st.builds(lambda a, b: f"{a}*{b}", _WHOLE, _WHOLE))
_PLAIN = st.one_of(
    st.lists(_TERM, min_size=1, max_size=6).map("+".join),  # zeros and long numbers among them
    st.text(alphabet="0123456789+*", min_size=1, max_size=40),
)


@given(_PLAIN)
def test_plain_sums_read_alike_by_the_short_path_and_the_parser(text):
    # A leading space keeps the text off the short path for whole feet (``85+12+2*6``), so the
    # tokenizer and parser read it: the value, or the refusal and its place, must be the same.
    assert _outcome(text) == _outcome(" " + text, shift=1)


@given(st.lists(st.tuples(st.integers(1, 99), st.integers(1, 99_999)), min_size=1, max_size=10))
def test_counted_whole_feet_add_up_exactly(terms):
    # worked by hand in integers: every product and sum is below 2**53, so the float is exact
    text = "+".join(f"{count}*{feet}" for count, feet in terms)
    assert parse_length(text) == sum(count * feet for count, feet in terms)
