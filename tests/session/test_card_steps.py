"""A run card's proposal for a run like the last one: the last run's name stepped on
(``gaugewalk.model.session.card_steps``). Names of rows walked in order step by one (common
practice: rows, pumps and units are numbered or lettered in walking order)."""

from __future__ import annotations

import pytest

from gaugewalk.model.session.card_steps import step_name


@pytest.mark.parametrize(("name", "stepped"), [
    ("Pump 3", "Pump 4"),
    ("High bay row 1", "High bay row 2"),
    ("Sales floor troffers row 9", "Sales floor troffers row 10"),
    ("Pump 09", "Pump 10"),                       # the zeros kept: as wide as written
    ("Pump 007", "Pump 008"),
    ("RTU-1 rooftop unit", "RTU-2 rooftop unit"),  # the last number, wherever it is
    ("Line 2 conveyor 7", "Line 2 conveyor 8"),
    ("Shop lights, bays 1-2", "Shop lights, bays 3-4"),  # a range: the next as wide
    ("Racks 10-12", "Racks 13-15"),
    ("Circuits 3-1", "Circuits 3-2"),              # not a range: the last number
    ("Floor boxes A", "Floor boxes B"),            # a closing single letter
    ("Bay-c", "Bay-d"),
])
def test_the_last_number_or_closing_letter_steps_on_by_one(name, stepped):
    assert step_name(name) == stepped


@pytest.mark.parametrize("name", ["Microwave", "Wall receptacles, north", "Boxes Z", ""])
def test_a_name_with_nothing_to_step_proposes_nothing(name):
    assert step_name(name) is None


def test_a_stepped_name_already_in_the_walk_is_stepped_again_in_any_case():
    assert step_name("Pump 3", ["pump 4", "Pump 5"]) == "Pump 6"
    assert step_name("Boxes A", ["Boxes B"]) == "Boxes C"


# A k-pole circuit at position p takes p, p+2 ... (one side of the panel, common practice).
@pytest.mark.parametrize(("taken", "after", "poles", "spaces", "expected"), [
    ({1}, 1, 1, None, 3),                 # the next below on the same side
    ({1, 3, 5}, 1, 1, None, 7),           # past the positions taken
    ({1, 3, 7}, 1, 2, None, 9),           # two poles need 9 and 11 (5 and 7: 7 is taken)
    ({2}, 2, 3, None, 4),                 # the even side stays even
    ({1, 3}, 3, 1, 4, 2),                 # no room below within 4 spaces: the first free
    ({1, 2, 3, 4}, 1, 1, 4, None),        # a full panel: none
])
def test_the_next_position_is_below_the_last_on_its_side_where_the_poles_fit(
        taken, after, poles, spaces, expected):
    from gaugewalk.model.session.card_steps import next_position

    assert next_position(taken, after, poles, spaces) == expected
