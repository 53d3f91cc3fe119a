"""A feeder above a run whose load cannot be read (a motor the tables do not list at its
voltage) must not be sized as if that load were not there without saying so: NEC 215.2(A)(1)
sizes a feeder for the load it serves. Every walk here is invented."""

from __future__ import annotations

from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walk.job import Load
from gaugewalk.model.walk.recompute import recompute_run
from tests.support.walks import make_job, run_table, source_table

Y480 = "480Y/277V 3ph 4w"


def _job():
    """SVC -> F1 -> SWB -> F2 -> MCC; on MCC a 10 hp three-phase motor and a 2 hp single-phase
    motor wired line to line at 480 V."""
    return make_job("unread", sources=[source_table("SVC", "service", Y480),
                                       source_table("SWB", "switchboard", Y480),
                                       source_table("MCC", "panel", Y480)],
                    runs=[run_table("F1", "SVC", "SWB", "20"),
                          run_table("F2", "SWB", "MCC", "40"),
                          run_table("M1", "MCC", "Pump", "40", load={"value": 10, "unit": "hp"},
                                    connection="3P"),
                          run_table("M2", "MCC", "Saw", "40", load={"value": 2, "unit": "hp"},
                                    connection="LL")])


def test_a_feeder_says_which_loads_below_it_it_could_not_read():
    result = compute_job(_job())
    # NEC 2023 Table 430.248 (single-phase) has columns 115, 200, 208 and 230 V only, so a
    # single-phase motor on 480 V has no full-load current to read: the run itself says so
    assert "M2" not in result.runs
    assert any(p.id == "M2" and "430.248" in p.message for p in result.problems)
    # the feeders above it carry only M1 (NEC 2023 Table 430.250, 10 hp, 460 V: 14 A) and say
    # that M2 is left out of their load, rather than passing as within limits
    for fid in ("F2", "F1"):
        feeder = result.runs[fid]
        assert feeder.amps == 14.0
        assert any("M2" in p and "left out" in p for p in feeder.problems), fid
        assert not feeder.ok


def test_the_feeder_problem_clears_when_the_run_is_fixed_and_an_edit_matches_a_full_compute():
    job = _job()
    result = compute_job(job)
    # NEC 2023 Table 430.250, 2 hp three-phase, 460 V column: 3.4 A
    job.run("M2").load = Load(value=2, unit="hp", kind="motor")
    job.run("M2").connection = "3P"
    result = recompute_run(job, result, "M2")
    full = compute_job(job)
    for fid in ("F1", "F2"):
        assert not any("left out" in p for p in result.runs[fid].problems)
        assert result.runs[fid].amps == full.runs[fid].amps == 14.0 + 3.4
    # and back: the edit that makes it unreadable again brings the problem back on both
    job.run("M2").connection = "LL"
    result = recompute_run(job, result, "M2")
    for fid in ("F1", "F2"):
        assert any("M2" in p and "left out" in p for p in result.runs[fid].problems), fid
        assert result.runs[fid].problems == compute_job(job).runs[fid].problems
