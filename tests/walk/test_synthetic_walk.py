"""The benchmark walk generator makes valid walks, the same ones every time."""

from __future__ import annotations

from collections import Counter

import pytest

from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walkfile.read import check_walk_text
from gaugewalk.model.walkfile.write import dumps_walk
from tests.support.synthetic_walk import TRANSFORMER_KVA, synthetic_walk, synthetic_walk_text


def test_the_same_size_and_seed_give_the_same_bytes_and_another_seed_another_walk():
    assert synthetic_walk_text(150) == synthetic_walk_text(150)
    assert synthetic_walk_text(150, seed=8) != synthetic_walk_text(150)


@pytest.mark.parametrize("n", [1, 2, 11, 13, 150, 1300])
def test_the_walk_has_exactly_the_runs_asked_for_and_the_file_checks_clean(n):
    text = synthetic_walk_text(n)
    job, problems = check_walk_text(text, "synthetic.toml")
    assert problems == []
    assert len(job.runs) == n
    assert dumps_walk(job) == text  # already in the form gaugewalk saves


def test_the_walk_has_services_feeders_transformers_and_panels_in_a_realistic_mix():
    job = synthetic_walk(1300)
    kinds = Counter(s.kind for s in job.sources)
    assert kinds["service"] == 2  # 1300 runs: two buildings of at most 1200
    assert kinds["transformer"] >= 3 and kinds["panel"] >= 10
    feeders = [r for r in job.runs if job.is_feeder(r)]
    assert len(feeders) == kinds["transformer"] + kinds["panel"]  # every source but a service
    subpanels = [r for r in feeders if job.source(r.from_).kind == "panel"]
    assert subpanels, "some panels are fed from another panel"
    assert any(r.segments for r in job.runs) and any("m+" in r.length for r in job.runs)


def test_every_run_is_sized_and_a_few_miss_their_drop_target_as_on_a_real_walk():
    job = synthetic_walk(1300)
    result = compute_job(job)
    assert len(result.runs) == len(job.runs)
    missed = [rid for rid, res in result.runs.items() if not res.ok]
    # about 5 %: the branches of the subpanels deepest below a transformer, which are taken at
    # most two sizes over their own target for the total (pick.UPSIZE_FOR_TOTAL)
    assert 0 < len(missed) < 0.08 * len(job.runs)


def test_each_transformer_is_the_smallest_standard_rating_above_125_percent_of_its_load():
    job = synthetic_walk(1300)
    result = compute_job(job)
    for s in job.sources:
        if s.kind != "transformer":
            continue
        load_kva = result.connected_va[s.id] / 1000.0
        assert s.kva in TRANSFORMER_KVA
        assert s.kva >= 1.25 * load_kva - 1e-9  # 125 % sizing: common practice
        smaller = [k for k in TRANSFORMER_KVA if k < s.kva]
        assert not smaller or smaller[-1] < 1.25 * load_kva or s.kva == TRANSFORMER_KVA[-1]
