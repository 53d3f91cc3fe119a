"""Hostile text in the run card's fields: every reader refuses it with its own error (a sentence
shown at the field), never another exception; in the app nothing is stored or written."""

from __future__ import annotations

import math

import pytest
from hypothesis import example, given
from hypothesis import strategies as st
from pydantic import ValidationError

from gaugewalk.model.engine.circuits import CircuitError, parse_system
from gaugewalk.model.engine.lengths import LengthError, parse_length
from gaugewalk.model.engine.loads import LoadError
from gaugewalk.model.session.card_form import parse_load_text
from gaugewalk.model.walk.job import Run
from gaugewalk.tables.conductor.sizes import parse_size
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tui.app.screens.card import RunCard
from tests.support.app_helpers import new_app, opened
from tests.support.walks import write_walk

hostile = st.one_of(
    st.text(max_size=80),
    st.text(st.characters(exclude_categories=["Cs"]), min_size=200, max_size=3000),
    st.sampled_from(["nan", "NaN A", "inf", "-inf", "1e999", "1e999A", "-5", "-5A", "0A",
                     "5A pfnan", "5kW pf1e-400", "5kW pfinf", "5kW pf-1", "٣٤A", "１２", "12\n3",
                     "\x00", "\u202e21", "9" * 400, "1" * 100_000, "🙂" * 50,
                     "5 kW pf 0.9 pf 0.8"]),
)


@pytest.mark.slow
@given(hostile)
@example("5kW pf0.9")
def test_card_field_readers_refuse_hostile_text_with_their_own_error(text):
    for read, errors in ((parse_length, LengthError), (parse_load_text, LoadError),
                         (parse_size, TableLookupError), (parse_system, CircuitError)):
        try:
            value = read(text)
        except errors as exc:
            assert str(exc), read.__name__
            continue
        # what is accepted is sane: finite, positive numbers
        if read is parse_length:
            assert math.isfinite(value) and value > 0
        elif read is parse_load_text:
            amount, _, pf = value
            assert math.isfinite(amount) and amount > 0
            assert pf is None or 0 < pf <= 1


@pytest.mark.slow
@given(st.sampled_from(["id", "from", "to", "length", "size", "raceway", "insulation", "notes"]),
       hostile)
def test_a_run_built_from_hostile_text_is_valid_or_a_validation_error(field, text):
    data = {"id": "R1", "from": "LP1", "to": "Pump", "length": "10", field: text}
    try:
        run = Run.model_validate(data)
    except ValidationError as exc:
        assert exc.errors()
        return
    assert math.isfinite(run.length_ft) and run.length_ft > 0


HOSTILE_IN_THE_APP = ["nan", "inf", "-5", "1e999", "1" * 100_000, "٣٤", "\x00", "🙂" * 50,
                      "\u202e21", "12\n3"]


async def test_hostile_entries_in_the_card_are_refused_at_the_field_and_nothing_is_written(
        tmp_path):
    path = write_walk(tmp_path)
    before = path.read_bytes()
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        runs_before = len(app.session.job.runs)
        await pilot.press("n")
        await pilot.pause()
        card = app.screen
        assert isinstance(card, RunCard)
        for key in ("length", "load", "sets", "size", "circuit"):
            for text in HOSTILE_IN_THE_APP:
                card.form.values.update({"to": "Dough mixer", "length": "40", "load": "16A",
                                         key: text})
                card._show_values()
                card.recheck(store_tried=True)
                assert key in card.errors, (key, text[:20])
                await card.action_store()
                await pilot.pause()
                assert isinstance(app.screen, RunCard)
                assert len(app.session.job.runs) == runs_before
                message = str(card.query_one("#card-msg").render())
                assert message.startswith("✗") and len(message) < 400, message[:200]
    assert path.read_bytes() == before
