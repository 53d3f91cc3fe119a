"""The pydantic walk model: lookups, defaults, edits that stay valid."""

from __future__ import annotations

import pytest
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


def test_a_renamed_source_is_found_under_its_new_id():
    job = _job()
    job.source("SP")  # fills the index
    job.sources[1].id = "SP-2"
    assert job.source("SP") is None  # the old id no longer answers
    assert job.source("SP-2").id == "SP-2"
    job.runs[1].id = "R9"
    job.reindex()  # a lookup of the new id alone needs the index rebuilt
    assert job.run("R9").to == "Pump"


def test_a_run_put_in_place_of_one_of_its_id_is_found_without_rebuilding_the_lookups():
    job = _job()
    old = job.run("R7")
    new = old.model_copy(update={"notes": "moved pump"})
    job.runs[1] = new
    job.replaced_run(old, new)
    assert job.run("R7") is new and job._index_cache is not None  # patched, not dropped
    other = Run.model_validate({"id": "R8", "from": "SP", "to": "Fan", "length": "9"})
    job.runs[1] = other  # another id: the lookups are dropped and rebuilt
    job.replaced_run(new, other)
    assert job.run("R8") is other and job.run("R7") is None


def test_ids_with_line_breaks_or_leading_spaces_are_refused():
    for bad in (" R1", "R\n1", ""):
        with pytest.raises(ValidationError):
            Run.model_validate({"id": bad, "from": "SVC", "to": "x", "length": "1"})
    with pytest.raises(ValidationError):
        Source(id="LP1", kind="panel", system="415V")
