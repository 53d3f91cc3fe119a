"""One shape of a problem: what it is about and its id, said as a foreman reads it."""

from __future__ import annotations

import pytest

from gaugewalk.model.walk.problems import Problem


@pytest.mark.parametrize("problem, said", [
    (Problem("shop.toml", 42, "run", "R12", "length", "cannot be read"),
     "shop.toml line 42, run R12, length: cannot be read"),
    (Problem("shop.toml", None, "source", "LP1", None, "nothing feeds this panel"),
     "shop.toml, source LP1: nothing feeds this panel"),
    (Problem("shop.toml", 7, "run", None, "id", "is missing", number=3),
     "shop.toml line 7, run number 3, id: is missing"),
    (Problem("shop.toml", 3, "defaults", None, "pf", "must be at most 1, not 2"),
     "shop.toml line 3, defaults, pf: must be at most 1, not 2"),
    (Problem("shop.toml", None, "file", None, None, "there is no such file"),
     "shop.toml, file: there is no such file"),
    (Problem("shop.toml", None, "option", "--service", "system", "not a system"),
     "shop.toml, --service, system: not a system"),
])
def test_a_problem_says_where_it_is_in_one_line(problem, said):
    assert str(problem) == said


def test_what_a_problem_is_about_is_read_from_its_fields_not_its_words():
    p = Problem("", None, "source", "run 7", None, "a source whose id reads like a run")
    assert p.is_about("source", ("run 7",)) and not p.is_about("run", ("7",))
    assert p.to_dict()["about"] == "source" and p.to_dict()["id"] == "run 7"
