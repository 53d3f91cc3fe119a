"""A run prepared once for every run alike and then finished (``evaluate_picked`` with a
``prepared`` table, the path a walk's computation takes) gives what the run evaluated on its own
gives, field by field: on every sample walk, on the synthetic walk, and on variants of it with
another material, other drop targets, a job minimum size, the DC method and fixed sizes."""

from __future__ import annotations

import math
from dataclasses import fields
from functools import partial

import pytest

from gaugewalk.model.engine.circuits import circuit_from_volts
from gaugewalk.model.engine.contract import Equipment, RunResult, RunSpec, with_fields
from gaugewalk.model.engine.sizing import SizingError, evaluate, evaluate_picked
from gaugewalk.model.walk import compute as compute_module
from gaugewalk.model.walk.compute import WalkState, compute_job
from gaugewalk.model.walk.job import Job
from gaugewalk.model.walkfile.read import load_walk
from tests.support.paths import SAMPLES
from tests.support.synthetic_walk import synthetic_walk_data

C480_3 = circuit_from_volts(480, 3)
C120 = circuit_from_volts(120, 1)


def _variant(n_runs: int, seed: int, defaults: dict, every: int = 0, size: str = "") -> Job:
    """The synthetic walk with ``defaults`` set, and every ``every``-th branch given ``size``."""
    data = synthetic_walk_data(n_runs, seed)
    data["defaults"] = {**data.get("defaults", {}), **defaults}
    if every:
        for k, run in enumerate(data["run"]):
            if run.get("load") is not None and k % every == 0:
                run["size"] = size
    return Job.model_validate(data)


WALKS = {
    **{path.stem: partial(load_walk, path) for path in sorted(SAMPLES.glob("*.toml"))},
    "synthetic 500 seed 7": lambda: _variant(500, 7, {}),
    "synthetic 500 seed 11": lambda: _variant(500, 11, {}),
    "synthetic 5000": lambda: _variant(5000, 7, {}),
    "aluminum, tighter drop targets": lambda: _variant(
        1500, 7, {"material": "al", "branch_drop_pct": 2.0, "total_drop_pct": 4.0}),
    "minimum size, DC method, fixed sizes": lambda: _variant(
        1500, 11, {"min_size": "10 AWG", "feeder_drop_pct": 1.5, "method": "dc",
                   "starting_drop_pct": 8.0}, every=9, size="12 AWG"),
}


def _same(fast: RunResult, plain: RunResult, where: str) -> None:
    for f in fields(RunResult):
        a, b = getattr(fast, f.name), getattr(plain, f.name)
        assert a == b and type(a) is type(b), f"{where}: {f.name} {a!r} != {b!r}"


@pytest.mark.parametrize("name", list(WALKS))
def test_each_run_prepared_once_for_all_alike_is_what_it_is_evaluated_alone(name):
    job = WALKS[name]()
    specs = compute_job(job)._specs
    assert len(specs) >= 15
    prepared: dict = {}
    for rid, spec in specs.items():
        fast, fast_passed = evaluate_picked(spec, prepared)
        plain, plain_passed = evaluate_picked(spec)
        _same(fast, plain, f"{name} {rid}")
        assert fast_passed == plain_passed
    # runs alike share one preparation: far fewer than there are runs on a large walk
    if len(specs) >= 1500:
        assert len(prepared) < len(specs) / 4


@pytest.mark.parametrize("name", ["retail_fitout", "warehouse_dc2", "synthetic 500 seed 7",
                                  "minimum size, DC method, fixed sizes"])
def test_a_walk_computed_with_its_runs_prepared_is_the_walk_computed_run_by_run(name, monkeypatch):
    job = WALKS[name]()
    warm = compute_job(job)
    branch_spec = WalkState.branch_spec

    # cold: the tables the computation keeps emptied before every run
    def cold_branch(state, r, upstream, circuit):
        state.branch_specs.clear()
        state.prepared.clear()
        return branch_spec(state, r, upstream, circuit)

    def cold_feeder(spec, prepared=None):
        prepared.clear()
        return evaluate_picked(spec, prepared)

    with monkeypatch.context() as patch:
        patch.setattr(WalkState, "branch_spec", cold_branch)
        patch.setattr(compute_module, "evaluate_picked", cold_feeder)
        cold = compute_job(job)

    # plain: every run's spec from ``_spec`` and evaluated alone, no table at all
    def plain_branch(state, r, upstream, circuit):
        return compute_module._spec(state.spec_base, state.job, r, upstream, circuit, False,
                                    None), None

    with monkeypatch.context() as patch:
        patch.setattr(WalkState, "branch_spec", plain_branch)
        patch.setattr(compute_module, "finish_prepared", lambda prep, spec: evaluate_picked(spec))
        patch.setattr(compute_module, "evaluate_picked",
                      lambda spec, prepared=None: evaluate_picked(spec))
        plain = compute_job(job)

    for other in (cold, plain):
        assert other.runs.keys() == warm.runs.keys()
        for rid in warm.runs:
            _same(warm.runs[rid], other.runs[rid], f"{name} {rid}")
        assert other._specs == warm._specs
        assert other._passed == warm._passed
        assert other.problems == warm.problems
        assert other.source_drop_pct == warm.source_drop_pct


def test_a_prepared_run_longer_or_further_down_is_sized_again_for_its_drop():
    # 120 V, 16 A: 12 AWG Cu carries it (NEC 2023 Table 310.16, 60 C column: 20 A); longer, the
    # drop target of 3 % picks larger sizes, and behind 3.5 % upstream the 5 % total leaves 1.5 %
    prepared: dict = {}
    base = RunSpec(circuit=C120, amps=16.0, length_ft=30.0)
    sizes = []
    for length_ft, upstream in ((30.0, 0.0), (120.0, 0.0), (120.0, 3.5), (400.0, 4.9),
                                (30.0, 0.0), (900.0, 0.0)):
        spec = with_fields(base, length_ft=length_ft, upstream_drop_pct=upstream)
        fast = evaluate_picked(spec, prepared)
        plain = evaluate_picked(spec)
        _same(fast[0], plain[0], f"{length_ft} ft behind {upstream} %")
        assert fast[1] == plain[1]
        sizes.append(fast[0].size)
    assert len(prepared) == 1
    assert sizes[0] == sizes[4] == "12 AWG"
    assert sizes[1] != "12 AWG" and sizes[2] != sizes[1]


def test_a_prepared_motor_run_works_each_starting_drop_and_fixed_sizes_their_problems():
    # 480 V three-phase, 25 hp: 34 A full-load (NEC 2023 Table 430.250)
    motor = Equipment(kind="motor", hp=25.0)
    prepared: dict = {}
    for size in (None, "10 AWG", "2 AWG"):
        for length_ft in (40.0, 300.0, 1200.0, 40.0):
            spec = RunSpec(circuit=C480_3, amps=34.0, length_ft=length_ft, equipment=motor,
                           size=size, starting_drop_pct=8.0)
            fast, plain = evaluate_picked(spec, prepared)[0], evaluate(spec)
            _same(fast, plain, f"{size} at {length_ft} ft")
            assert fast.starting_drop_pct is not None
    assert len(prepared) == 3


def test_a_prepared_run_refuses_a_length_or_upstream_drop_as_the_run_alone_does():
    prepared: dict = {}
    good = RunSpec(circuit=C120, amps=16.0, length_ft=30.0)
    evaluate_picked(good, prepared)
    for bad in (with_fields(good, length_ft=0.0), with_fields(good, length_ft=math.inf),
                with_fields(good, upstream_drop_pct=-1.0)):
        with pytest.raises(SizingError) as alone:
            evaluate(bad)
        with pytest.raises(SizingError) as fast:
            evaluate_picked(bad, prepared)
        assert str(fast.value) == str(alone.value)
        assert ("length_ft" in str(fast.value)) != ("upstream_drop_pct" in str(fast.value))


@pytest.mark.parametrize("changes, words", [
    ({"raceway": "no such raceway"}, "raceway"),
    # NEC 2023 Table 310.16 lists aluminum from 12 AWG: 14 AWG Al is no power conductor
    ({"material": "al", "size": "14 AWG"}, "14 AWG"),
])
def test_a_spec_that_cannot_be_sized_is_refused_every_time_it_comes(changes, words):
    prepared: dict = {}
    spec = with_fields(RunSpec(circuit=C120, amps=16.0, length_ft=30.0), **changes)
    for length_ft in (30.0, 60.0):
        spec = with_fields(spec, length_ft=length_ft)
        with pytest.raises(SizingError) as alone:
            evaluate(spec)
        with pytest.raises(SizingError) as fast:
            evaluate_picked(spec, prepared)
        assert str(fast.value) == str(alone.value)
        assert words in str(fast.value)
