"""A source declared in one field of the run card (``gaugewalk.model.session.card_source``):
kind, system, amps and kVA in any order, and clear refusals."""

from __future__ import annotations

import pytest

from gaugewalk.model.session.card_source import ORDER, new_source_from, read_source_text


@pytest.mark.parametrize(("text", "fields"), [
    ("208Y/120", {"kind": "panel", "system": "208Y/120V 3ph 4w"}),
    ("480Y/277; switchboard 400A",
     {"kind": "switchboard", "system": "480Y/277V 3ph 4w", "rating_a": 400}),
    ("switchboard 480Y/277", {"kind": "switchboard", "system": "480Y/277V 3ph 4w"}),
    ("panel 208Y/120 225A", {"kind": "panel", "system": "208Y/120V 3ph 4w", "rating_a": 225}),
    ("225 A, 208Y/120, panel", {"kind": "panel", "system": "208Y/120V 3ph 4w", "rating_a": 225}),
    ("120/240 1ph 100a swbd",
     {"kind": "switchboard", "system": "120/240V 1ph 3w", "rating_a": 100}),
    ("xfmr 208Y/120 75kVA", {"kind": "transformer", "system": "208Y/120V 3ph 4w", "kva": 75.0}),
    ("75 kVA 208Y/120 XF", {"kind": "transformer", "system": "208Y/120V 3ph 4w", "kva": 75.0}),
    ("480V 3ph 3w, swbd", {"kind": "switchboard", "system": "480V 3ph 3w"}),
    ("panel 208Y/120 225A main 200A",
     {"kind": "panel", "system": "208Y/120V 3ph 4w", "rating_a": 225, "main_a": 200}),
    ("main 200 A; 208Y/120 225A", {"kind": "panel", "system": "208Y/120V 3ph 4w",
                                   "rating_a": 225, "main_a": 200}),
    ("208Y/120 225A mlo", {"kind": "panel", "system": "208Y/120V 3ph 4w", "rating_a": 225}),
    ("75kVA 208Y/120", {"kind": "transformer", "system": "208Y/120V 3ph 4w", "kva": 75.0}),
])
def test_kind_system_and_ratings_are_read_in_any_order(text, fields):
    assert read_source_text(text) == fields


@pytest.mark.parametrize(("text", "reason"), [
    ("", "give the system"),
    ("panel 225A", "give the system"),
    ("panel 208Y/120 225A 400A", "two ratings, 225A and 400A"),
    ("panel switchboard 208Y/120", "two kinds, panel and switchboard"),
    ("panel 208Y/120 75kVA", "a kVA rating is a transformer's"),
    ("panel 208Y/120 rooftop", "'208Y/120 rooftop' is not a system or a word of"),
    ("panel 208", "'208' is incomplete"),          # the parser says what is missing
    ("panel 208Y/120 0A", "the rating [A]"),       # the walk model's range (above 0)
    ("panel 208Y/120 main", "give the main's rating after 'main'"),
    ("panel 208Y/120 main 100A mlo", "two mains, main 100A and mlo"),
])
def test_what_the_field_cannot_read_is_refused_with_a_sentence_naming_it(text, reason):
    with pytest.raises(ValueError) as refused:
        new_source_from("LP2", text)
    assert reason in str(refused.value)


def test_a_refusal_of_an_unknown_word_repeats_the_grammar():
    with pytest.raises(ValueError, match=ORDER):
        new_source_from("LP2", "panel 208Y/120 rooftop")


def test_the_declared_source_is_a_walk_source_with_its_rating_and_main():
    source = new_source_from("SWB-1", "480Y/277; switchboard 400A main 400A")
    assert (source.id, source.kind, source.system, source.rating_a, source.main_a) == (
        "SWB-1", "switchboard", "480Y/277V 3ph 4w", 400, 400)


def test_a_panel_without_a_system_is_on_the_system_of_the_source_feeding_it():
    # a panel fed by a feeder is on its feeder's system (common practice: only a transformer
    # changes it)
    assert read_source_text("225A main 200A", "208Y/120V 3ph 4w") == {
        "kind": "panel", "system": "208Y/120V 3ph 4w", "rating_a": 225, "main_a": 200}
    assert read_source_text("swbd 800A", "480Y/277V 3ph 4w")["system"] == "480Y/277V 3ph 4w"


def test_a_transformer_always_names_its_secondary():
    with pytest.raises(ValueError, match="give the secondary system"):
        read_source_text("75kVA", "480Y/277V 3ph 4w")
    with pytest.raises(ValueError, match="give the secondary system"):
        read_source_text("xfmr", "480Y/277V 3ph 4w")
