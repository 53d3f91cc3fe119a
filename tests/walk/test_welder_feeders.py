"""A feeder of several arc welders: NEC 630.11(B) lets its conductors take the welders' currents
at group factors; gaugewalk sums them at 100 % and says so. Every walk here is invented."""

from __future__ import annotations

import math

import pytest

from gaugewalk.model.walk.compute import compute_job
from tests.support.walks import make_job, run_table, source_table

Y480 = "480Y/277V 3ph 4w"


def _welder(rid, phase, **load):
    return run_table(rid, "WP", f"Welder {rid}", "40", connection="LL", phase=phase,
                     load={"kind": "welder", **load})


def _job(*welders):
    return make_job("welders", sources=[source_table("SVC", "service", Y480),
                                        source_table("WP", "panel", Y480)],
                    runs=[run_table("F1", "SVC", "WP", "30"), *welders])


def test_a_feeder_of_welders_sums_them_at_100_percent_and_says_630_11_b_is_not_taken():
    job = _job(_welder("W1", "AB", rated_a=60, duty_cycle_pct=40),
               _welder("W2", "BC", i1eff=32, i1max=60))
    result = compute_job(job)
    # NEC 2023 630.11(A), Table 630.11(A): 60 A x 0.63 (40 %, nonmotor) = 37.8 A; I1eff 32 A
    assert result.runs["W1"].design_amps == pytest.approx(37.8)
    assert result.runs["W2"].design_amps == pytest.approx(32.0)
    # line B carries both, at the same power factor 120 degrees apart (Kirchhoff: I_BC - I_AB):
    # sqrt(37.8^2 + 32^2 + 37.8 x 32) = 60.5 A, each welder at 100 % (no group factor)
    f1 = result.runs["F1"]
    assert f1.amps == pytest.approx(math.sqrt(37.8**2 + 32**2 + 37.8 * 32), rel=1e-6)
    assert any("630.11(B)" in n and "100 %" in n and "not taken" in n for n in f1.notes)


def test_a_feeder_of_one_welder_has_no_group_note():
    result = compute_job(_job(_welder("W1", "AB", i1eff=32, i1max=60)))
    assert not any("630.11(B)" in n for n in result.runs["F1"].notes)


def test_an_edit_that_leaves_one_welder_drops_the_note_as_a_full_compute_does():
    from gaugewalk.model.walk.job import Load
    from gaugewalk.model.walk.recompute import recompute_run

    job = _job(_welder("W1", "AB", rated_a=60, duty_cycle_pct=40),
               _welder("W2", "BC", i1eff=32, i1max=60))
    result = compute_job(job)
    job.run("W2").load = Load(value=32, unit="A")   # now a general load of the same current
    result = recompute_run(job, result, "W2")
    assert not any("630.11(B)" in n for n in result.runs["F1"].notes)
    assert result.runs["F1"].notes == compute_job(job).runs["F1"].notes
