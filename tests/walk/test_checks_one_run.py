"""``put_keeps_clean``: a run put in place of another (or added) is checked on its own only when
that is enough. On randomized edits of a clean walk, whenever it says the walk stays clean the
whole-walk ``check_references`` finds nothing; and the session that stores edits with it refuses
and keeps exactly what a session checking the whole walk every time does."""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st

from gaugewalk.model.engine.vocabulary import CONNECTIONS
from gaugewalk.model.session.session import WalkSession
from gaugewalk.model.walk.checks import check_references, put_keeps_clean
from gaugewalk.model.walk.job import Job, Run
from gaugewalk.model.walk.problems import Locator
from gaugewalk.model.walkfile.write import dumps_walk
from tests.support.synthetic_walk import synthetic_walk

WALK = synthetic_walk(200)
RUN_IDS = [r.id for r in WALK.runs]
SOURCE_IDS = [s.id for s in WALK.sources]
FEEDERS = [i for i, r in enumerate(WALK.runs) if WALK.is_feeder(r)]


def problems(job: Job) -> list:
    return check_references(job, Locator(""), "walk.toml")


def put(job: Job, run: Run, old: Run | None) -> Job:
    """A copy of ``job`` with ``run`` in place of ``old`` (or added at the end)."""
    runs = list(job.runs)
    if old is None:
        runs.append(run)
    else:
        runs[runs.index(old)] = run
    return job.model_copy(update={"runs": runs})


@st.composite
def edits(draw) -> tuple[Run | None, Run]:
    """(the run replaced or None, the run put): a stored run with its id, ends, load and
    connection each perhaps changed to another's (a source's id, a run's, or one of neither)."""
    index = draw(st.one_of(st.sampled_from(FEEDERS), st.integers(-1, len(RUN_IDS) - 1)))
    old = WALK.runs[index] if index >= 0 else None
    base = (old or WALK.runs[draw(st.integers(0, len(RUN_IDS) - 1))]).model_dump(
        by_alias=True, exclude_none=True)
    names = st.sampled_from(RUN_IDS + SOURCE_IDS + ["Spare", "NEW-1"])
    if old is None or draw(st.booleans()):
        base["id"] = draw(names)
    if draw(st.booleans()):
        base["from"] = draw(names)
    if draw(st.booleans()):
        base["to"] = draw(names)
    if draw(st.booleans()):
        base["connection"] = draw(st.sampled_from([None, *CONNECTIONS]))
    if draw(st.booleans()):
        base["load"] = draw(st.sampled_from([None, {"value": 16, "unit": "A"},
                                             {"value": 40, "unit": "kVA"}]))
    return old, Run.model_validate({k: v for k, v in base.items() if v is not None})


def test_the_walk_edited_is_clean_to_begin_with():
    assert problems(WALK) == []
    assert len(SOURCE_IDS) >= 8 and any(s.kind == "transformer" for s in WALK.sources)


@given(edits())
def test_whenever_one_run_is_enough_to_check_the_whole_walk_finds_nothing(edit):
    old, run = edit
    if put_keeps_clean(WALK, run, old):
        assert problems(put(WALK, run, old)) == []


@pytest.mark.parametrize("old", WALK.runs, ids=lambda r: r.id)
def test_a_new_load_or_length_is_checked_on_its_own(old):
    changes = {"length": "12+3"} if old.load is None else {"load": {"value": 3, "unit": "A"}}
    run = Run.model_validate({**old.model_dump(by_alias=True, exclude_none=True), **changes})
    assert put_keeps_clean(WALK, run, old)


@pytest.fixture(scope="module")
def walk_file(tmp_path_factory):
    path = tmp_path_factory.mktemp("walk") / "walk.toml"
    path.write_text(dumps_walk(WALK), encoding="utf-8")
    return path


def opened(path) -> WalkSession:
    session = WalkSession.open(path)
    session.save = lambda: True  # type: ignore[method-assign]  # compared in memory only
    return session


@given(st.lists(edits(), min_size=1, max_size=4))
def test_a_session_stores_and_refuses_as_one_checking_the_whole_walk_each_time(walk_file, steps):
    quick, whole = opened(walk_file), opened(walk_file)
    for old, run in steps:
        replaces = old.id if old is not None else None
        whole.references_clean = False  # every change checks the whole walk
        assert quick.put_run(run, replaces=replaces) == whole.put_run(run, replaces=replaces)
        assert quick.job.runs == whole.job.runs
        assert quick.references_clean == (problems(quick.job) == [])


def test_a_feeder_re_pointed_below_its_own_panel_is_a_loop_the_whole_walk_check_finds():
    up, down = next((a, b) for a in WALK.runs for b in WALK.runs
                    if WALK.is_feeder(a) and WALK.is_feeder(b) and b.from_ == a.to)
    looped = up.model_copy(update={"from_": down.to})  # A fed from B, which A feeds
    assert not put_keeps_clean(WALK, looped, up)
    assert any("loop" in p.message for p in problems(put(WALK, looped, up)))
