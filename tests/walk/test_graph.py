"""The supply graph: which source feeds which, walked the same way by the computation, the
checks, the session and the app's supply tree."""

from __future__ import annotations

import pytest

from gaugewalk.model.walk.graph import SupplyGraph
from gaugewalk.model.walk.job import Job, Run, Source
from gaugewalk.model.walkfile.read import load_walk
from tests.support.paths import SAMPLES


def _source_of(job: Job, run: Run) -> str:
    """The service at the top of a run's chain, found by following feeders up one by one."""
    sid = run.from_
    while (feeder := job.feeder_of(sid)) is not None:
        sid = feeder.from_
    return sid


@pytest.mark.parametrize("name", ["retail_fitout.toml", "warehouse_dc2.toml", "farm_workshop.toml"])
def test_every_run_is_below_the_service_its_chain_of_feeders_leads_to(name):
    job = load_walk(SAMPLES / name)
    graph = SupplyGraph(job)
    roots = graph.roots()
    assert roots and all(s.kind == "service" for s in roots)
    below = {s.id: {r.id for r in graph.runs_below(s.id)} for s in roots}
    for run in job.runs:
        assert run.id in below[_source_of(job, run)]
    assert sum(len(ids) for ids in below.values()) == len(job.runs)


def test_sources_come_after_the_source_that_feeds_them():
    graph = SupplyGraph(load_walk(SAMPLES / "warehouse_dc2.toml"))
    place = {sid: i for i, sid in enumerate(graph.order)}
    assert set(place) == set(graph.sources) and graph.unreached == []
    for sid, feeder in graph.feeder.items():
        assert place[feeder.from_] < place[sid]


def test_a_loop_of_feeders_is_found_once_and_its_sources_are_not_reached():
    job = Job(
        sources=[Source(id="SVC", kind="service", system="208Y/120"),
                 Source(id="LP1", kind="panel", system="208Y/120"),
                 Source(id="LP2", kind="panel", system="208Y/120")],
        runs=[Run(id="F1", **{"from": "LP2"}, to="LP1", length="20"),
              Run(id="F2", **{"from": "LP1"}, to="LP2", length="20")],
    )
    graph = SupplyGraph(job)
    assert [(loop, run.id) for loop, run in graph.feeder_loops()] == [(["LP1", "LP2", "LP1"], "F1")]
    assert graph.unreached == ["LP1", "LP2"] and [s.id for s in graph.roots()] == ["SVC"]


def test_the_graph_fits_a_walk_with_one_run_put_in_place_but_not_one_changed_elsewhere():
    """The incremental path patches the graph for the edited run; every other run must be the
    same object, or one with the same fields (the same results), else the graph is rebuilt."""
    job = load_walk(SAMPLES / "retail_fitout.toml")
    graph = SupplyGraph(job)
    shape = graph.shape()
    i = max(k for k, r in enumerate(job.runs) if r.load is not None and not graph.is_feeder(r))
    edited = Run.model_validate(dict(job.runs[i].model_dump(by_alias=True), notes="moved"))
    job.runs[i] = edited
    assert graph.fits(job, edited, shape) and graph.runs[i] is edited
    assert edited in graph.children[edited.from_]
    job.runs[0] = job.runs[0].model_copy()  # another object with the same fields
    assert graph.fits(job, edited, shape)
    job.runs[0] = Run.model_validate(dict(job.runs[0].model_dump(by_alias=True), length="999"))
    assert not graph.fits(job, edited, shape)
    job.runs[0] = graph.runs[0]
    job.sources[0] = Source.model_validate(dict(job.sources[0].model_dump(), name="renamed"))
    assert not graph.fits(job, edited, shape)
