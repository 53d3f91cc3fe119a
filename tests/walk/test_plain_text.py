"""The one rule for outside text (``model/walk/plain_text.py``): what is a control character,
how it is refused and how it is shown."""

from __future__ import annotations

import re
import unicodedata

import pytest
from hypothesis import given
from hypothesis import strategies as st

from gaugewalk.model.walk.plain_text import (
    CONTROL_CHARS,
    first_control,
    no_control,
    shown,
    shown_lines,
)
from gaugewalk.model.walk.problems import Problem


def test_the_control_characters_are_unicode_cc_the_separators_and_the_bidi_overrides():
    # Unicode category Cc is exactly C0, DEL and C1 (the Unicode Standard, ch. 23.1)
    cc = {chr(c) for c in range(0x110000) if unicodedata.category(chr(c)) == "Cc"}
    bidi = {chr(c) for c in (*range(0x202A, 0x202F), *range(0x2066, 0x206A))}
    assert CONTROL_CHARS == cc | bidi | {"\u2028", "\u2029"}


@given(st.text(st.characters(exclude_categories=["Cs"])))
def test_shown_text_holds_no_control_character_and_plain_text_is_left_alone(text):
    for out in (shown(text), shown_lines(text)):
        assert first_control(out.replace("\n", "").replace("\t", "").replace("\r\n", "")) is None \
            or out is shown_lines(text)
    assert first_control(shown(text)) is None
    lines = shown_lines(text)
    assert first_control(lines.replace("\r\n", "").replace("\n", "").replace("\t", "")) is None
    if first_control(text) is None:
        assert shown(text) is text and shown_lines(text) is text


def test_escapes_read_as_python_would_write_them():
    assert shown("a\x1b]0;x\x07b\n\u202e") == "a\\x1b]0;x\\x07b\\n\\u202e"
    assert shown_lines("one\r\ntwo\n\tthree\rfour\x9b") == "one\r\ntwo\n\tthree\\rfour\\x9b"


@pytest.mark.parametrize("char, words", [("\x1b", "ESC (U+001B)"), ("\n", "a line break (U+000A)"),
                                         ("\u202e", "RIGHT-TO-LEFT OVERRIDE (U+202E)")])
def test_a_refusal_names_the_character(char, words):
    with pytest.raises(ValueError, match="holds " + re.escape(words)):
        no_control(f"Pump{char}")
    assert no_control("Pump [b] ✓") == "Pump [b] ✓"


def test_a_problem_never_echoes_a_control_character_even_in_the_file_name():
    p = Problem("w\x1b[2J.toml", 3, "run", "R1", "to", "holds \x07 here")
    assert first_control(str(p)) is None and first_control(p.brief()) is None
    assert str(p) == "w\\x1b[2J.toml line 3, run R1, to: holds \\x07 here"
