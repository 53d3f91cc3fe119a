"""The length grammar, fuzzed: it accepts exactly what its docstring documents, with the value
the terms add up to, and rejects everything else with a LengthError, in time linear in the input.

The oracle is a regular expression written here from the grammar in ``model/engine/lengths.py``'s
docstring (not from its code), so a parser that drifts from its documentation fails.
"""

from __future__ import annotations

import re
import time

import pytest
from hypothesis import example, given
from hypothesis import strategies as st

import gaugewalk.model.engine.lengths as lengths
from gaugewalk.model.engine.lengths import MAX_LENGTH_CHARS, LengthError, parse_length

# -- the documented grammar as a regular expression ---------------------------------------------

_SPACE = "[" + "".join(re.escape(chr(c)) for c in range(0x110000) if chr(c).isspace()) + "]*"


def _ci(word: str) -> str:
    """A unit word in any case (ASCII case only)."""
    return "".join(f"[{c.lower()}{c.upper()}]" for c in word)


_WORD_END = r"(?![A-Za-z])"
_FEET = "(?:" + "|".join(_ci(w) + _WORD_END for w in ("feet", "foot", "ft")) + "|'|’)"
# a unit word may be glued to the multiplication x: 12ftx2
_FEET_X = ("(?:" + "|".join(_ci(w) + r"(?=[xX]" + _WORD_END + ")" for w in ("feet", "foot", "ft"))
           + ")")
_INCH_WORDS = ("inches", "inch", "in")
_METRE_WORDS = ("metres", "metre", "meters", "meter", "m")
_UNIT_END = f"(?:{_WORD_END}|(?=[xX]{_WORD_END}))"
_INCH = "(?:" + "|".join(_ci(w) + _UNIT_END for w in _INCH_WORDS) + '|"|”)'
_METRE = "(?:" + "|".join(_ci(w) + _UNIT_END for w in _METRE_WORDS) + ")"
_NUM = r"(?:[0-9]+\.?[0-9]*|\.[0-9]+)"
_TIMES = r"(?:\*|×|[xX]" + _WORD_END + ")"
_S = _SPACE
_QTY = (f"{_NUM}{_S}(?:(?:{_FEET}|{_FEET_X})(?:{_S}{_NUM}{_S}{_INCH})?|{_INCH}|{_METRE})?")
_TERM = f"(?:{_NUM}{_S}{_TIMES}{_S}{_QTY}|{_QTY}(?:{_S}{_TIMES}{_S}{_NUM})?)"
DOCUMENTED = re.compile(f"{_S}{_TERM}(?:{_S}[+-]{_S}{_TERM})*{_S}")


def documented(text: str) -> bool:
    """True when the text is a length by the grammar: the shape, at most 12 digits a number
    and at most ``MAX_LENGTH_CHARS`` characters (counts and the total being above zero are
    checked apart)."""
    if len(text) > MAX_LENGTH_CHARS or not DOCUMENTED.fullmatch(text):
        return False
    return all(len(run.replace(".", "")) <= 12 for run in re.findall(r"[0-9.]+", text))


# -- generated lengths with their value ---------------------------------------------------------

FT_UNITS = {"": 1.0, "ft": 1.0, "foot": 1.0, "feet": 1.0, "'": 1.0, "’": 1.0}
OTHER_UNITS = {"m": 1 / 0.3048, "metre": 1 / 0.3048, "metres": 1 / 0.3048, "meter": 1 / 0.3048,
               "meters": 1 / 0.3048, "in": 1 / 12, "inch": 1 / 12, "inches": 1 / 12,
               '"': 1 / 12, "”": 1 / 12}
INCH_UNITS = ("in", "inch", "inches", '"', "”")
spaces = st.sampled_from(["", "", "", " ", "  ", "\t", "\u00a0"])
numbers = st.one_of(
    st.integers(0, 99999).map(lambda n: (str(n), float(n))),
    st.tuples(st.integers(0, 9999), st.integers(0, 999)).map(
        lambda p: (f"{p[0]}.{p[1]}", float(f"{p[0]}.{p[1]}"))),
    st.integers(1, 999).map(lambda n: (f".{n}", float(f".{n}"))),
)
counts = st.integers(1, 99).map(lambda n: (str(n), float(n)))


def _case(word: str, upper: bool) -> str:
    return word.upper() if upper else word


@st.composite
def quantities(draw):
    text, value = draw(numbers)
    s = draw(spaces)
    if draw(st.booleans()):
        unit = draw(st.sampled_from(sorted(FT_UNITS)))
        out, feet = text + (s + _case(unit, draw(st.booleans())) if unit else ""), value
        if unit and draw(st.booleans()):
            inches, inch_value = draw(numbers)
            out += draw(spaces) + inches + draw(spaces) + _case(draw(st.sampled_from(INCH_UNITS)),
                                                                draw(st.booleans()))
            feet += inch_value / 12
        return out, feet, unit != "" and unit not in ("'", "’")
    unit = draw(st.sampled_from(sorted(OTHER_UNITS)))
    return text + s + _case(unit, draw(st.booleans())), value * OTHER_UNITS[unit], unit[0].isalpha()


@st.composite
def terms(draw):
    qty, feet, ends_in_letter = draw(quantities())
    form = draw(st.sampled_from(["plain", "count first", "count last"]))
    # "0*3" reads as a count of zero (the grammar takes a bare number before the sign as the
    # count), which is refused: a zero length is not multiplied
    if form == "plain" or feet == 0:
        return qty, feet
    count, n = draw(counts)
    sign = draw(st.sampled_from(["*", "×", "x", "X"]))
    if form == "count first":
        return count + draw(spaces) + sign + draw(spaces) + qty, n * feet
    gap = draw(spaces)
    if sign in "xX" and not gap and not ends_in_letter:
        gap = " "  # "12'x2" is fine, but keep a plain number's x apart from nothing else
    return qty + gap + sign + draw(spaces) + count, n * feet


@st.composite
def lengths_with_values(draw):
    first, total = draw(terms())
    text = draw(spaces) + first
    for _ in range(draw(st.integers(0, 5))):
        sign = draw(st.sampled_from("++-"))
        term, feet = draw(terms())
        text += draw(spaces) + sign + draw(spaces) + term
        total += feet if sign == "+" else -feet
    return text + draw(spaces), total


@pytest.mark.slow
@given(lengths_with_values())
@example(("85+12+2*6", 109.0))
@example(("36m+8ft", 36 / 0.3048 + 8))
@example(("12'6\"", 12.5))
@example(("150-12", 138.0))
@example(("12ftx2", 24.0))
def test_documented_lengths_are_accepted_with_the_value_of_their_terms(case):
    text, total = case
    assert documented(text), text
    if len(text) > MAX_LENGTH_CHARS:
        with pytest.raises(LengthError):
            parse_length(text)
        return
    if total <= 1e-9:
        with pytest.raises(LengthError, match="above zero"):
            parse_length(text)
        return
    assert parse_length(text) == pytest.approx(total, rel=1e-9, abs=1e-9)


GRAMMAR_CHARS = "0123456789.+-*x×X'\"’”fteminchsroFTM \t"
near_lengths = st.text(st.sampled_from(GRAMMAR_CHARS), max_size=30)
anything = st.text(max_size=60)


@pytest.mark.slow
@given(st.one_of(near_lengths, anything, st.builds(lambda a, b: a + b, near_lengths, anything)))
@example("1.2.3")
@example("12 ft 6")
@example("2*3*4")
@example("2ft*3ft")
@example("0*5")
@example("5mm")
@example("ｆｔ")
@example("12ftä")
@example("１２")
@example("12\u3000ft")
@example("")
def test_anything_else_is_rejected_with_a_length_error(text):
    ok = documented(text)
    try:
        value = parse_length(text)
    except LengthError as exc:
        assert isinstance(str(exc), str) and str(exc)
        if ok:  # grammatical, so the only reasons left are zero counts and totals
            assert "above zero" in exc.reason, (text, exc.reason)
        return
    assert ok, f"accepted {text!r} ({value} ft), which the documented grammar does not allow"
    assert value > 0 and value == value and value != float("inf")


def test_input_past_the_cap_is_refused_at_once_however_long():
    long = "12+" * 33_334  # 100,002 characters
    started = time.process_time()  # CPU time: a busy machine does not stretch it
    with pytest.raises(LengthError, match=f"longer than {MAX_LENGTH_CHARS}"):
        parse_length(long)
    assert time.process_time() - started < 1.0  # generous: a cap check, not a parse


def _time_parse(text: str) -> float:
    """Least CPU time of five parses [s] (CPU time and the least of five, so other work on the
    machine disturbs it little)."""
    best = float("inf")
    for _ in range(5):
        started = time.process_time()
        try:
            parse_length(text)
        except LengthError:
            pass
        best = min(best, time.process_time() - started)
    return best


@pytest.mark.slow
@pytest.mark.parametrize("unit", ["12+", "2*6ft+", "12'6\"-", "1 ", "x", "ft"])
def test_parse_time_grows_linearly_with_the_input(monkeypatch, unit):
    """With the cap lifted, ten times the input takes about ten times as long. Allowed up to 40x:
    loose, for a busy machine, yet quadratic growth would give about 100x."""
    monkeypatch.setattr(lengths, "MAX_LENGTH_CHARS", 10 ** 7)
    small = unit * 4_000 + "1"
    big = unit * 40_000 + "1"
    t_small, t_big = _time_parse(small), _time_parse(big)
    assert t_big < 40 * max(t_small, 1e-3), (unit, t_small, t_big)
