"""A run to equipment whose name reads as on a roof, not marked ``rooftop``: its note says the
raceway was taken off the roof's sunlit surface, where NEC 2023 310.15(B)(2) would add 33 C to
the ambient (XHHW-2 excepted), so the person can mark it. Every walk here is invented."""

from __future__ import annotations

import pytest

from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walk.vocabulary import roof_in_name
from tests.support.walks import make_job, run_table, source_table

W480 = "480Y/277V 3ph 4w"


@pytest.mark.parametrize(("name", "on_roof"), [
    ("RTU-1 rooftop unit", True), ("Roof exhaust fan EF-2", True), ("RTU3", True),
    ("RTU", True),
    ("Office rooftop unit", True), ("Proofing oven", False), ("Dock door 3", False),
    ("Virtual desk", False)])
def test_names_that_read_as_on_a_roof(name, on_roof):
    assert roof_in_name(name) is on_roof


def _job(**run_keys):
    load = {"value": 38, "unit": "A", "kind": "hvac", "mca": 38, "mocp": 50}
    return make_job("roof", sources=[source_table("SVC", "service", W480)], runs=[
        run_table("R1", "SVC", "RTU-1 rooftop unit", "85", load=load, connection="3P",
                  **run_keys)])


def test_a_rooftop_unit_not_marked_rooftop_says_the_adder_was_not_taken():
    result = compute_job(_job())
    note = next(n for n in result.runs["R1"].notes if "reads as equipment on a roof" in n)
    assert "NEC 310.15(B)(2) adds 33 C" in note and "mark the run rooftop" in note


@pytest.mark.parametrize("keys", [{"rooftop": True}, {"insulation": "XHHW-2"}])
def test_marked_rooftop_or_excepted_insulation_says_nothing_more(keys):
    result = compute_job(_job(**keys))
    assert not any("reads as equipment on a roof" in n for n in result.runs["R1"].notes)
