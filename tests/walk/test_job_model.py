"""The pydantic walk model: lookups, defaults, edits that stay valid."""

from __future__ import annotations

import pytest
from hypothesis import given
from hypothesis import strategies as st
from pydantic import ValidationError

from gaugewalk.model.walk.job import Job, Run, Source
from tests.support.walks import make_job, run_table, source_table


def _job() -> Job:
    return make_job(
        None, defaults={"material": "al", "raceway": "pvc"},
        sources=[source_table("SVC", "service", "120/240"),
                 source_table("SP", "panel", "120/240V 1ph 3w")],
        runs=[run_table("F1", "SVC", "SP", "300"),
              run_table("R7", "SP", "Pump", "85+12+2*6", load=(10, "A"), material="cu")],
    )


def test_lookups_find_sources_runs_and_feeders():
    job = _job()
    assert job.source("SP").kind == "panel" and job.source("nope") is None
    assert job.is_feeder(job.run("F1")) and not job.is_feeder(job.run("R7"))
    assert job.feeder_of("SP").id == "F1" and job.feeder_of("SVC") is None
    assert [r.id for r in job.runs_from("SP")] == ["R7"]
    assert job.run_position("R7") == 1 and job.run_position("Pump") is None


def test_next_run_id_is_one_past_the_highest_with_that_prefix():
    job = _job()
    assert job.next_run_id("R") == "R8"
    assert job.next_run_id("F") == "F2"
    assert job.next_run_id("X") == "X1"


def test_runs_inherit_defaults_unless_they_override_them():
    job = _job()
    assert job.effective(job.run("F1"), "material") == "al"
    assert job.effective(job.run("R7"), "material") == "cu"
    assert job.effective(job.run("R7"), "raceway") == "PVC-40"  # "pvc" read as Schedule 40


def test_editing_a_length_updates_its_feet_and_a_bad_edit_is_refused():
    run = _job().run("R7")
    assert run.length_ft == pytest.approx(109.0)  # 85 + 12 + 2*6
    run.length = "30m"
    assert run.length_ft == pytest.approx(30 / 0.3048)  # 1 ft = 0.3048 m exactly
    with pytest.raises(ValidationError):
        run.length = "thirty"
    assert run.length == "30m"


def _first(items: list, item_id: str):
    """The first item of ``item_id`` found by a plain pass, what a lookup must answer."""
    return next((item for item in items if item.id == item_id), None)


def _answers_as_a_pass(job: Job, ids: tuple[str, ...]) -> None:
    for item_id in ids:
        assert job.source(item_id) is _first(job.sources, item_id), item_id
        assert job.run(item_id) is _first(job.runs, item_id), item_id


def test_a_renamed_source_or_run_is_found_under_its_new_id_and_not_its_old():
    job = _job()
    job.source("SP"), job.run("R7")  # fills the indexes
    job.sources[1].id = "SP-2"
    assert job.source("SP") is None  # the old id no longer answers
    assert job.source("SP-2").id == "SP-2"
    job.runs[1].id = "R9"
    assert job.run("R9").to == "Pump" and job.run("R7") is None
    job.runs[0].id = "R9"  # now two runs of that id: the first in the file answers
    assert job.run("R9") is job.runs[0]
    _answers_as_a_pass(job, ("SVC", "SP", "SP-2", "F1", "R7", "R9"))


def test_a_run_put_back_in_place_is_found_without_rebuilding_the_index():
    job = _job()
    old = job.run("R7")
    index = job._run_index
    new = Run.model_validate(dict(old.model_dump(by_alias=True), notes="moved pump"))  # as the card
    job.runs[1] = new
    assert job.run("R7") is new and job.run("F1") is job.runs[0]
    job.runs[1] = old  # undone: the object built before it, back in its place
    assert job.run("R7") is old
    copy = old.model_copy(update={"position": 3})  # not validated, as the place command does
    job.runs[1] = copy
    assert job.run("R7") is copy
    assert job._run_index is index  # followed each put without a pass over the runs
    assert job.run("R8") is None  # a run was built since: looked for again, then absent


def test_a_run_of_another_id_put_in_place_is_found_once_the_lookups_are_told():
    job = _job()
    job.run("R7")
    other = Run.model_validate({"id": "R8", "from": "SP", "to": "Fan", "length": "9"})
    job.runs[1] = other
    assert job.run("R7") is None  # another id where R7 stood: the index is built again
    assert job.run("R8") is other
    job.runs[1] = Run.model_validate({"id": "R9", "from": "SP", "to": "Fan", "length": "9"})
    assert job.run("R9") is job.runs[1]  # built since the index: not trusted to be absent
    older = job.runs[0].model_copy(update={"id": "F9"})  # a copy never validated
    job.runs[0] = older
    job.reindex()  # as the session does after such a change
    _answers_as_a_pass(job, ("F1", "F9", "R7", "R8"))


def test_sources_added_removed_or_replaced_are_found():
    job = _job()
    assert job.source("LP3") is None
    job.sources.append(Source(id="LP3", kind="panel", system="120/240V 1ph 3w"))
    assert job.source("LP3") is job.sources[2]
    del job.sources[0]
    assert job.source("SVC") is None and job.source("SP") is job.sources[0]
    job.sources = [Source(id="SVC", kind="service", system="120/240V 1ph 3w")]  # a new list
    assert job.source("SVC") is job.sources[0] and job.source("SP") is None
    job.sources[0] = Source(id="MDP", kind="service", system="120/240V 1ph 3w")
    assert job.source("MDP") is job.sources[0]  # built since: not trusted to be absent
    job.sources = [job.sources[0].model_copy(update={"id": "MSB"})]  # never validated
    assert job.source("MSB") is job.sources[0]  # a new list of the same length: looked again
    _answers_as_a_pass(job, ("SVC", "MDP", "MSB", "SP", "LP3"))


def test_building_a_run_leaves_the_source_index_alone():
    job = _job()
    assert job.source("nope") is None
    index = job._source_index
    Run.model_validate({"id": "R8", "from": "SP", "to": "Fan", "length": "9"})
    assert job.source("nope") is None and job._source_index is index


_IDS = ("F1", "R7", "R8", "R9")
_EDITS = st.lists(st.tuples(
    st.sampled_from(("rename", "same id", "new object", "copy", "append", "remove", "other id")),
    st.integers(0, 9), st.sampled_from(_IDS)), max_size=12)


@given(_EDITS)
def test_run_lookups_answer_as_a_pass_over_the_runs_after_any_edits(edits):
    """Every way the walk's code changes ``runs`` (the session tells the index of a run put in
    place of one of another id, ``Job.reindex``); after each edit every id is looked up."""
    job = _job()
    for kind, at, run_id in edits:
        runs = job.runs
        i = at % len(runs) if runs else None
        if kind == "rename" and i is not None:
            runs[i].id = run_id
        elif kind == "same id" and i is not None:  # as the run card stores a run
            runs[i] = Run.model_validate(runs[i].model_dump(by_alias=True))
        elif kind == "copy" and i is not None:  # as the place command writes a position
            runs[i] = runs[i].model_copy(update={"position": at + 1})
        elif kind == "new object" or kind == "append":
            new = Run.model_validate({"id": run_id, "from": "SP", "to": "Fan", "length": "9"})
            if kind == "append" or i is None:
                runs.append(new)
            else:
                replaced, runs[i] = runs[i].id, new
                if replaced != new.id:
                    job.reindex()
        elif kind == "remove" and i is not None:
            del runs[i]
        elif kind == "other id" and i is not None:  # a copy under another id, then told
            runs[i] = runs[i].model_copy(update={"id": run_id})
            job.reindex()
        for look in _IDS:
            assert job.run(look) is _first(job.runs, look), (edits, look)


def test_ids_with_line_breaks_or_leading_spaces_are_refused():
    for bad in (" R1", "R\n1", ""):
        with pytest.raises(ValidationError):
            Run.model_validate({"id": bad, "from": "SVC", "to": "x", "length": "1"})
    with pytest.raises(ValidationError):
        Source(id="LP1", kind="panel", system="415V")
