"""Computing a walk: feeder loads summed across systems, drop carried down the chains."""

from __future__ import annotations

import math
import random

import pytest

from gaugewalk.model.engine.sizing import evaluate
from gaugewalk.model.walk.compute import compute_job, run_spec_for
from gaugewalk.model.walk.job import Defaults, Job, JobHeader, Load, Source
from gaugewalk.model.walk.recompute import recompute_run
from tests.support.walks import make_job, make_run, run_table, source_table

SQRT3 = math.sqrt(3.0)
# NEC 2023 Ch. 9 Table 8, uncoated stranded copper, DC resistance at 75 C [ohm/kft] (from memory)
R75 = {"12 AWG": 1.98, "8 AWG": 0.778, "6 AWG": 0.491, "4 AWG": 0.308}


def chain_job() -> Job:
    """Service 480Y/277 -> F1 -> panel HA -> F2 -> transformer T1 (208Y/120 secondary) -> F3 ->
    panel LP1 -> F4 -> panel LP2 -> branch R1; plus a 10 kVA branch on LP1 and a 277 V one on HA.
    Sizes are fixed so the drop is pure arithmetic on Table 8; DC method at 75 C; every load at
    unity power factor, so the currents on a line add as numbers where they are in phase. T1
    has a 60 A secondary device at its terminals (NEC 240.21(C) is then met by it)."""
    return Job(
        job=JobHeader(name="chain"),
        defaults=Defaults(method="dc", conductor_temp_c=75.0, pf=1.0),
        sources=[
            Source(id="SVC", kind="service", system="480Y/277V 3ph 4w"),
            Source(id="HA", kind="panel", system="480Y/277V 3ph 4w"),
            Source(id="T1", kind="transformer", system="208Y/120V 3ph 4w", kva=45,
                   secondary_ocpd_a=60),
            Source(id="LP1", kind="panel", system="208Y/120V 3ph 4w"),
            Source(id="LP2", kind="panel", system="208Y/120V 3ph 4w"),
        ],
        runs=[
            make_run("F1", "SVC", "HA", "200", size="6 AWG"),
            make_run("F2", "HA", "T1", "50", size="4 AWG"),
            make_run("F3", "T1", "LP1", "100", size="4 AWG"),
            make_run("F4", "LP1", "LP2", "150", size="8 AWG"),
            make_run("R1", "LP2", "Office receptacles", "80", load=(16, "A"), size="12 AWG",
                connection="LN"),
            make_run("R2", "LP1", "Kiln", "30", load=(10, "kVA"), size="8 AWG", connection="3P"),
            make_run("R3", "HA", "Yard lights", "120", load=(20, "A"), size="8 AWG",
                     connection="LN"),
        ],
    )


# The line currents of chain_job by hand, every load at unity power factor (phasors: line A's
# voltage at 0 degrees, B at -120, C at +120):
I_KILN = 10_000 / (SQRT3 * 208)                 # 27.76 A on each line (S = sqrt(3) V_LL I)
LP1_A = 16 + I_KILN                             # R1's 16 A placed on A, in phase with the kiln's
# T1, delta-wye, winding ratio n = 480 / 120 = 4: I_A = (I_a - I_c) e^{j30} / n; with I_a on
# 0 degrees and I_c on 120 degrees, |I_a - I_c|^2 = a^2 + b^2 + a b
T1_PRIMARY = math.sqrt(LP1_A**2 + I_KILN**2 + LP1_A * I_KILN) / 4   # 15.61 A on A and B
T1_PRIMARY_C = I_KILN * SQRT3 / 4                                   # 12.02 A on C, at +120
HA_C = T1_PRIMARY_C + 20                        # R3's 20 A at 277 V placed on C: 32.02 A


def test_feeder_loads_are_the_heaviest_line_of_the_phasor_sums_below_them():
    result = compute_job(chain_job())
    assert result.feeder_amps["F4"] == pytest.approx(16.0)        # one 16 A circuit: 16 A
    assert result.feeder_amps["F3"] == pytest.approx(LP1_A)       # 43.76 A, not 33.09 A
    assert result.lines["LP1"].phase_amps == pytest.approx((LP1_A, I_KILN, I_KILN))
    assert result.feeder_amps["F2"] == pytest.approx(T1_PRIMARY)  # 15.61 A, not 14.34 A
    assert result.lines["HA"].phase_amps == pytest.approx((T1_PRIMARY, T1_PRIMARY, HA_C))
    assert result.feeder_amps["F1"] == pytest.approx(HA_C)        # 32.02 A on C
    assert result.placements["R3"].phase == "C"                   # the lightest line for it
    # NEC 220.61: the neutral carries the unbalance: R1's 16 A below T1, R3's 20 A at HA; the
    # delta primary passes none of T1's neutral current up
    assert result.lines["LP1"].neutral_amps == pytest.approx(16.0)
    assert result.lines["HA"].neutral_amps == pytest.approx(20.0)
    assert result.connected_va["SVC"] == pytest.approx(16 * 120 + 10_000 + 20 * 277)


# T1's own drop, IEEE Std 141 approximation: 45 kVA, typical 4.5 % impedance, typical X/R 1.4
# (both assumed, common practice), so %R = 4.5 / sqrt(1 + 1.4^2) = 2.62 %; at unity power
# factor the drop is (I / I_rated) %R with I the heaviest secondary line, I_rated = 45,000 /
# (sqrt(3) 208) = 124.9 A
T1_DROP = LP1_A / (45_000 / (SQRT3 * 208)) * 4.5 / math.hypot(1.0, 1.4)   # 0.92 %


def test_cumulative_drop_through_a_transformer_and_two_panels_matches_hand_arithmetic():
    result = compute_job(chain_job())
    # VD = k I R L / 1000; k = sqrt(3) three-phase (at the heaviest line's current), 2
    # single-phase; percent of nominal volts
    d1 = SQRT3 * HA_C * R75["6 AWG"] * 200 / 1000 / 480 * 100        # 0.57 %
    d2 = SQRT3 * T1_PRIMARY * R75["4 AWG"] * 50 / 1000 / 480 * 100   # 0.09 %
    d3 = SQRT3 * LP1_A * R75["4 AWG"] * 100 / 1000 / 208 * 100       # 1.12 %
    d4 = SQRT3 * 16 * R75["8 AWG"] * 150 / 1000 / 208 * 100          # 1.56 %
    dr1 = 2 * 16 * R75["12 AWG"] * 80 / 1000 / 120 * 100              # 4.22 %
    dr3 = 2 * 20 * R75["8 AWG"] * 120 / 1000 / 277 * 100
    assert result.runs["F1"].voltage_drop_pct == pytest.approx(d1, rel=1e-3)
    assert result.source_drop_pct["HA"] == pytest.approx(d1, rel=1e-3)
    assert result.run_total_drop_pct["F2"] == pytest.approx(d1 + d2, rel=1e-3)
    assert result.run_total_drop_pct["R3"] == pytest.approx(d1 + dr3, rel=1e-3)
    # the drop carries through the transformer, its own drop at its load added (the default)
    assert result.transformers["T1"].drop_pct == pytest.approx(T1_DROP, rel=1e-3)
    assert result.source_drop_pct["T1"] == pytest.approx(d1 + d2 + T1_DROP, rel=1e-3)
    assert result.source_drop_pct["LP1"] == pytest.approx(d1 + d2 + T1_DROP + d3, rel=1e-3)
    assert result.source_drop_pct["LP2"] == pytest.approx(d1 + d2 + T1_DROP + d3 + d4, rel=1e-3)
    assert result.run_total_drop_pct["R1"] == pytest.approx(
        d1 + d2 + T1_DROP + d3 + d4 + dr1, rel=1e-3)


def test_the_drop_restarts_at_a_secondary_when_the_job_says_so():
    job = chain_job()
    job.defaults.drop_through_transformers = False
    result = compute_job(job)
    d3 = SQRT3 * LP1_A * R75["4 AWG"] * 100 / 1000 / 208 * 100
    assert result.source_drop_pct["T1"] == 0.0
    assert result.source_drop_pct["LP1"] == pytest.approx(d3, rel=1e-3)


def test_a_branch_over_its_target_makes_the_walk_not_ok_and_names_the_run():
    result = compute_job(chain_job())
    # R1: 4.22 % on its own is over the 3 % branch target (informational note to NEC 210.19)
    assert not result.runs["R1"].ok
    assert not result.ok
    assert {p.where for p in result.problems} == {"run R1"}, [str(p) for p in result.problems]
    assert result.run_problems("R1") and not result.run_problems("R2")


def test_a_feeder_with_its_own_load_uses_it_instead_of_the_sum():
    job = chain_job()
    job.run("F4").load = Load(value=60, unit="A")
    result = compute_job(job)
    assert result.feeder_amps["F4"] == 60
    # the feeder above sums what LP1 serves: F4's stated load (60 A on each line, balanced) and
    # R2's 27.76 A, in phase at unity power factor
    assert result.feeder_amps["F3"] == pytest.approx(60 + I_KILN)


def test_a_transformer_loaded_past_its_rating_is_reported_on_the_source():
    job = chain_job()
    job.source("T1").kva = 10
    result = compute_job(job)
    # 10 kVA at 208 V: 27.8 A rated; the heaviest secondary line carries 43.8 A
    assert any(p.where == "source T1" and "43.8 A, over its 27.8 A rated current" in p.message
               for p in result.problems)


def test_a_panel_serving_nothing_leaves_its_feeder_unsized_with_a_reason():
    job = chain_job()
    job.runs = [r for r in job.runs if r.id != "R1"]
    result = compute_job(job)
    assert "F4" not in result.runs
    assert any("serves no load" in p.message for p in result.run_problems("F4"))


def test_run_spec_for_applies_defaults_and_the_branch_or_feeder_target():
    job = chain_job()
    job.defaults.feeder_drop_pct = 2.0
    job.defaults.branch_drop_pct = 3.0
    feeder = run_spec_for(job, job.run("F4"), 1.0)
    branch = run_spec_for(job, job.run("R1"), 1.5)
    assert feeder.max_drop_pct == 2.0 and branch.max_drop_pct == 3.0
    assert branch.upstream_drop_pct == 1.5 and branch.method == "dc"
    assert branch.amps == 16 and branch.circuit.volts == 120
    assert feeder.amps == pytest.approx(16.0)  # LP2's heaviest line
    assert evaluate(branch).size == "12 AWG"


def _same(a, b):
    assert a.runs.keys() == b.runs.keys()
    for rid in a.runs:
        ra, rb = a.runs[rid], b.runs[rid]
        assert ra.size == rb.size, rid
        assert ra.total_drop_pct == pytest.approx(rb.total_drop_pct, abs=1e-9), rid
        assert set(ra.problems) == set(rb.problems), rid
    assert a.feeder_amps == pytest.approx(b.feeder_amps)
    assert a.source_drop_pct == pytest.approx(b.source_drop_pct)
    assert [str(p) for p in a.problems] == [str(p) for p in b.problems]


def test_recompute_after_one_edit_gives_what_a_full_compute_gives():
    job = chain_job()
    job.defaults.method = "ac"
    for r in job.runs:
        r.size = None
    result = compute_job(job)
    rng = random.Random(7)
    for _ in range(40):
        r = rng.choice(job.runs)
        change = rng.choice(["length", "load", "size", "continuous"])
        if change == "length":
            r.length = str(rng.randint(10, 900))
        elif change == "load" and r.load is not None:
            r.load = Load(value=rng.choice([2, 8, 16, 24, 40]), unit="A")
        elif change == "size":
            r.size = rng.choice([None, None, "10 AWG", "1/0 AWG"])
        else:
            r.continuous = not r.continuous
        result = recompute_run(job, result, r.id)
        _same(result, compute_job(job))


def test_recompute_falls_back_to_a_full_compute_when_a_run_is_re_pointed():
    job = chain_job()
    result = compute_job(job)
    job.run("R1").from_ = "LP1"
    _same(recompute_run(job, result, "R1"), compute_job(job))



def test_the_runs_an_edit_changed_are_found_among_those_it_wrote_as_by_a_look_at_every_run():
    from tests.support.synthetic_walk import synthetic_walk

    job = synthetic_walk(1300)
    result = compute_job(job)
    rng = random.Random(11)
    found = 0
    for _ in range(30):
        r = rng.choice(job.runs)
        if r.load is not None and rng.random() < 0.7:
            r.load = Load(value=r.load.value * rng.choice([0.5, 1.5, 3.0]), unit=r.load.unit,
                          pf=r.load.pf)
        else:
            r.length = str(rng.randint(10, 900))
        marks = result.marks()
        updated = recompute_run(job, result, r.id)
        if updated is not result:
            result = updated
            continue
        among = result.changed_since(marks)
        touched, result._touched = result._touched, None
        assert among == result.changed_since(marks)  # every run looked at
        result._touched = touched
        found += len(among) > 1
    assert found > 5


def test_recompute_after_load_changes_deep_in_the_synthetic_walk_is_exactly_a_full_compute():
    from tests.support.synthetic_walk import synthetic_walk

    job = synthetic_walk(1300, seed=11)
    result = compute_job(job)
    prepared = result._prepared   # the updates go on with the computation's preparations
    rng = random.Random(5)
    branches = [r for r in job.runs if r.load is not None and not job.is_feeder(r)]
    moved = 0   # runs picked for their drop whose drop up to the source moved
    for _ in range(24):
        r = rng.choice(branches)
        r.load = Load(value=r.load.value * rng.choice([0.4, 2.5, 6.0]), unit=r.load.unit,
                      pf=r.load.pf)
        before = dict(result._specs)
        result = recompute_run(job, result, r.id)
        full = compute_job(job)
        assert result.runs == full.runs
        assert result._specs == full._specs
        assert [str(p) for p in result.problems] == [str(p) for p in full.problems]
        moved += sum(1 for k, s in result._specs.items()
                     if k in before and before[k].upstream_drop_pct != s.upstream_drop_pct
                     and result.runs[k].governed_by == "voltage drop" and result.runs[k].ok)
    assert moved > 20
    assert result._prepared is prepared and prepared   # and a full compute starts with none
    assert compute_job(job)._prepared is not prepared


def test_a_feeder_given_its_own_load_says_what_its_panel_needs_beyond_it_also_after_an_edit():
    # three 16 A 120 V loads on a 120/240 V panel: two share a line, 32 A there (hand sum,
    # NEC 215.2(A)(1), noncontinuous); the feeder was given 20 A
    system = "120/240V 1ph 3w"
    job = make_job("Stated feeder", sources=[source_table("SVC", "service", system),
                                             source_table("LP1", "panel", system)],
                   runs=[run_table("F1", "SVC", "LP1", "40", load=(20, "A")),
                         *(run_table(f"R{i}", "LP1", f"Load {i}", "30", load=(16, "A"),
                                     connection="LN") for i in (1, 2, 3))])
    result = compute_job(job)
    basis = result.feeders["F1"].basis
    assert basis.startswith("its own load (20.0 A design)"), basis
    assert "need 32.0 A on line " in basis and "NEC 215.2(A)(1)" in basis
    # the feeder is still sized for the load it was given, as asked
    assert result.runs["F1"].design_amps == pytest.approx(20.0)
    # a branch edited smaller: the feeder is weighed again, incrementally as in full
    job.run("R3").load = Load(value=2, unit="A")
    result = recompute_run(job, result, "R3")
    full = compute_job(job)
    _same(result, full)
    assert result.feeders["F1"].basis == full.feeders["F1"].basis == "its own load"


def test_runs_picked_for_their_drop_keep_their_size_unevaluated_when_the_drop_above_falls(
        monkeypatch):
    """A run upsized for its drop keeps its size when the drop up to its source falls, unless
    a smaller size it passed over now meets the looser limit: the recompute shifts its total
    without evaluating it, and the result is still exactly a full compute's."""
    from gaugewalk.model.walk import compute as computing
    from tests.support.synthetic_walk import synthetic_walk

    job = synthetic_walk(1300, seed=11)
    result = compute_job(job)
    evaluated: list[str] = []
    real, real_finish = computing.evaluate_picked, computing.finish_prepared

    def counting(spec, prepared=None):
        evaluated.append(spec)
        return real(spec, prepared)

    def counting_finish(prep, spec):   # a branch: its spec prepared, then evaluated here
        evaluated.append(spec)
        return real_finish(prep, spec)

    monkeypatch.setattr(computing, "evaluate_picked", counting)
    monkeypatch.setattr(computing, "finish_prepared", counting_finish)
    rng = random.Random(3)
    branches = [r for r in job.runs if r.load is not None and not job.is_feeder(r)]
    kept = 0   # runs picked for their drop, upstream fallen, size kept without an evaluation
    for _ in range(16):
        r = rng.choice(branches)
        r.load = Load(value=r.load.value * 0.3, unit=r.load.unit, pf=r.load.pf)  # drops fall
        before = dict(result._specs)
        evaluated.clear()
        result = recompute_run(job, result, r.id)
        again = {id(s) for s in evaluated}
        full = compute_job(job)
        assert result.runs == full.runs
        assert result._specs == full._specs
        assert [str(p) for p in result.problems] == [str(p) for p in full.problems]
        kept += sum(1 for k, s in result._specs.items()
                    if k in before and s.upstream_drop_pct < before[k].upstream_drop_pct
                    and result.runs[k].governed_by == "voltage drop" and id(s) not in again)
    assert kept > 20


def _walks_to_share_loads_on():
    from gaugewalk.model.walkfile.read import load_walk
    from tests.support.paths import SAMPLES
    from tests.support.synthetic_walk import synthetic_walk

    walks = [(path.name, load_walk(path)) for path in sorted(SAMPLES.glob("*.toml"))]
    # runs that differ in one thing each that their own load reads (invented)
    loads = [{"value": 1500, "unit": "VA"}, {"value": 1500, "unit": "VA", "pf": 0.9},
             {"value": 1500, "unit": "W"}, {"value": 1500, "unit": "VA", "kind": "receptacle"}]
    runs = [run_table(f"R{i}{c}", "LP1", f"Load {i}", "40", load=load, continuous=c,
                      connection=conn)
            for i, load in enumerate(loads) for c in (None, False, True)
            for conn in (None, "LN", "LLN")]
    odd = make_job("Alike but for one thing", sources=[source_table("LP1", "service")],
                   runs=runs)
    return [*walks, ("alike but for one thing", odd),
            ("synthetic 1300", synthetic_walk(1300, seed=3))]


@pytest.mark.parametrize(("name", "job"), _walks_to_share_loads_on())
def test_runs_alike_share_one_own_load_equal_to_each_runs_own_read_alone(name, job):
    # a computation reads each distinct general load on each circuit once; what every run is
    # given must be what reading its own load alone gives, field by field
    from gaugewalk.model.walk.feeder_loads import OwnLoad, own_load

    result = compute_job(job)
    shared = 0
    seen: dict[int, OwnLoad] = {}
    for run in job.runs:
        if run.id not in result._own:
            continue
        mine = result._own[run.id]
        alone = own_load(run, result._circuits[run.id], job.defaults.pf)
        if alone is None:
            assert mine is None, (name, run.id)
            continue
        assert mine is not None, (name, run.id)
        for slot in OwnLoad.__slots__:
            assert getattr(mine, slot) == getattr(alone, slot), (name, run.id, slot)
        shared += id(mine) in seen
        seen[id(mine)] = mine
    if name.startswith("synthetic"):
        assert shared > 1000, "rows of alike circuits share their load"
