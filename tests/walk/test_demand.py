"""Demand factors as a job setting (``[defaults] demand``), worked by hand: receptacles per NEC
220.44 (Table 220.44), noncoincident heating and cooling per NEC 220.60; ``connected`` (the
default) leaves every figure as it was. Every walk here is invented."""

from __future__ import annotations

import math

import pytest

from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walk.job import Load
from gaugewalk.model.walk.recompute import recompute_run
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.model.walkfile.write import dumps_walk
from gaugewalk.tables.demand import receptacle_demand_va
from tests.support.paths import SAMPLES
from tests.support.walks import make_job, run_table, source_table

SQRT3 = math.sqrt(3.0)
Y208 = "208Y/120V 3ph 4w"


def _job(demand, *runs, below=()):
    """Service SVC -> feeder F1 -> panel LP1 (208Y/120 V), then ``runs``; ``below``: runs of a
    panel LP2 fed from LP1 by feeder F2."""
    sources = [source_table("SVC", "service"), source_table("LP1", "panel", Y208)]
    extra = []
    if below:
        sources.append(source_table("LP2", "panel", Y208))
        extra = [run_table("F2", "LP1", "LP2", "30"), *below]
    return make_job("demand", defaults={"demand": demand}, sources=sources,
                    runs=[run_table("F1", "SVC", "LP1", "20"), *runs, *extra])


def _receptacles(n, panel="LP1", prefix="R"):
    return [run_table(f"{prefix}{i}", panel, f"Receptacles {i}", "40",
                      load={"value": 1440, "unit": "VA", "kind": "receptacle"}, connection="LN")
            for i in range(n)]


def test_table_220_44_takes_the_first_10_kva_at_100_and_the_rest_at_half():
    # NEC 2023 Table 220.44: first 10 kVA or less at 100 %, remainder over 10 kVA at 50 %
    assert receptacle_demand_va(8_000.0) == pytest.approx(8_000.0)
    assert receptacle_demand_va(10_000.0) == pytest.approx(10_000.0)
    assert receptacle_demand_va(43_200.0) == pytest.approx(10_000.0 + 0.5 * 33_200.0)  # 26.6 kVA


def test_thirty_receptacle_circuits_of_1440_va_count_26_6_kva_on_the_feeder():
    connected = compute_job(_job("connected", *_receptacles(30)))
    demand = compute_job(_job("nec-220", *_receptacles(30)))
    # 30 x 1,440 VA = 43.2 kVA, ten circuits a line: 14,400 VA / 120 V = 120 A on each line
    assert connected.feeder_amps["F1"] == pytest.approx(120.0)
    assert connected.feeders["F1"].demand == ()
    # NEC 2023 Table 220.44: 10 + 0.5 x 33.2 = 26.6 kVA; each line keeps its third:
    # 26,600 / 3 / 120 V = 73.9 A
    assert demand.feeder_amps["F1"] == pytest.approx(26_600.0 / 3 / 120.0)
    (step,) = demand.feeders["F1"].demand
    assert step.section == "NEC 220.44"
    assert (step.connected_va, step.demand_va) == pytest.approx((43_200.0, 26_600.0))
    assert any(n.startswith("NEC 220.44") and "26.6 kVA counted" in n
               for n in demand.runs["F1"].notes)
    # the panel's own loading stays the connected load (only the feeder takes the factor)
    assert demand.lines["LP1"].phase_amps == pytest.approx((120.0, 120.0, 120.0))


def test_ten_kva_of_receptacles_or_less_takes_no_factor_and_no_note():
    # 6 x 1,440 = 8.64 kVA, within the first 10 kVA at 100 % (NEC 2023 Table 220.44)
    result = compute_job(_job("nec-220", *_receptacles(6)))
    assert result.feeders["F1"].demand == ()
    assert not any("220.44" in n for n in result.runs["F1"].notes)
    assert result.feeder_amps["F1"] == pytest.approx(2 * 1440 / 120.0)


def test_the_10_kva_step_is_taken_once_on_all_the_receptacles_below_a_feeder():
    # 12 circuits on LP1 and 12 on LP2 below it: F2 sees 17.28 kVA, F1 sees 34.56 kVA
    result = compute_job(_job("nec-220", *_receptacles(12),
                              below=_receptacles(12, "LP2", "S")))
    # NEC 2023 Table 220.44: F2 10 + 0.5 x 7.28 = 13.64 kVA, four circuits a line:
    # 5,760 VA x 13.64 / 17.28 / 120 V
    assert result.feeder_amps["F2"] == pytest.approx(5_760 * 13_640 / 17_280 / 120.0)
    # F1: 10 + 0.5 x 24.56 = 22.28 kVA (not 13.64 + 8.64 + ...: the first 10 kVA once)
    (step,) = result.feeders["F1"].demand
    assert step.demand_va == pytest.approx(22_280.0)
    assert result.feeder_amps["F1"] == pytest.approx(11_520 * 22_280 / 34_560 / 120.0)


def _heat_and_cool(heater_kw=10.0):
    return [run_table("H1", "LP1", "Unit heaters", "40",
                      load={"value": heater_kw, "unit": "kW", "kind": "heater"}, connection="3P"),
            run_table("RTU1", "LP1", "Rooftop unit", "60",
                      load={"value": 8, "unit": "kW", "kind": "hvac", "pf": 1.0, "mca": 28,
                            "mocp": 40}, connection="3P")]


def test_heating_and_cooling_below_a_feeder_count_only_the_larger():
    connected = compute_job(_job("connected", *_heat_and_cool()))
    demand = compute_job(_job("nec-220", *_heat_and_cool()))
    heat = 10_000 / (SQRT3 * 208)     # 27.8 A, continuous (NEC 424.4(B))
    cool = 8_000 / (SQRT3 * 208)      # 22.2 A
    assert connected.feeder_amps["F1"] == pytest.approx(heat + cool)
    # NEC 2023 220.60: the smaller of the noncoincident loads (cooling, 8 kW) is left out
    assert demand.feeder_amps["F1"] == pytest.approx(heat)
    (step,) = demand.feeders["F1"].demand
    assert (step.section, step.group, step.connected_va) == ("NEC 220.60", "cooling",
                                                             pytest.approx(8_000.0))
    assert any("cooling (8.0 kVA) left out" in n for n in demand.runs["F1"].notes)
    # the heaters are continuous: 125 % of 27.8 A = 34.7 A -> 35 A (NEC 215.3, 240.6(A))
    assert demand.runs["F1"].design_amps == pytest.approx(1.25 * heat, abs=0.05)
    assert demand.runs["F1"].ocpd_a == 35


def test_the_smaller_heating_group_is_the_one_left_out():
    result = compute_job(_job("nec-220", *_heat_and_cool(heater_kw=5.0)))
    (step,) = result.feeders["F1"].demand
    # NEC 2023 220.60: 5 kW of heating against 8 kW of cooling: the heating is left out
    assert (step.group, step.connected_va) == ("heating", pytest.approx(5_000.0))
    assert result.feeder_amps["F1"] == pytest.approx(8_000 / (SQRT3 * 208))


def test_heating_alone_takes_no_220_60_step():
    result = compute_job(_job("nec-220", _heat_and_cool()[0]))
    assert result.feeders["F1"].demand == ()
    assert result.feeder_amps["F1"] == pytest.approx(10_000 / (SQRT3 * 208))


def test_a_feeder_given_its_own_load_keeps_it():
    job = _job("nec-220", *_receptacles(30))
    job.runs[0].load = job.runs[1].load.model_copy(update={"value": 20_000, "kind": "general"})
    result = compute_job(job)
    assert result.feeders["F1"].demand == ()
    assert result.feeder_amps["F1"] == pytest.approx(20_000 / (SQRT3 * 208))


@pytest.mark.parametrize("name", ["retail_fitout", "farm_workshop", "warehouse_dc2"])
def test_connected_gives_the_figures_of_a_walk_without_the_setting(name):
    job = load_walk(SAMPLES / f"{name}.toml")
    assert job.defaults.demand == "connected"
    before = compute_job(job)
    text = dumps_walk(job)
    assert "demand =" not in text   # an old walk is written back without the new key
    job.defaults.demand = "nec-220"
    after = compute_job(job)
    # the line sums and placements are the same either way: only feeders take a factor
    for sid, lines in before.lines.items():
        assert after.lines[sid].total == pytest.approx(lines.total)
    assert after.placements == before.placements
    # a feeder without a step is sized exactly as before; one with a step for less load
    for rid, amps in before.feeder_amps.items():
        if after.feeders.get(rid) is not None and after.feeders[rid].demand:
            assert after.feeder_amps[rid] < amps
        else:
            assert after.feeder_amps[rid] == amps
            a, b = after.runs[rid], before.runs[rid]   # the drop above it may have changed
            assert (a.size, a.sets, a.ocpd_a, a.voltage_drop_pct) == (b.size, b.sets, b.ocpd_a,
                                                                      b.voltage_drop_pct)


def test_recompute_after_changing_a_load_kind_gives_what_a_full_compute_gives():
    job = _job("nec-220", *_receptacles(12), *_heat_and_cool(),
               below=_receptacles(12, "LP2", "S"))
    result = compute_job(job)
    for rid, load in (("S3", Load(value=9, unit="kW", kind="heater")),
                      ("R0", Load(value=1440, unit="VA")),
                      ("H1", Load(value=2, unit="kW", kind="heater")),
                      ("S4", Load(value=14, unit="kVA", kind="receptacle"))):
        job.run(rid).load = load
        result = recompute_run(job, result, rid)
        full = compute_job(job)
        assert result.feeder_amps == pytest.approx(full.feeder_amps), rid
        assert result.feeders == full.feeders, rid
        assert {k: v.notes for k, v in result.runs.items()} == {
            k: v.notes for k, v in full.runs.items()}, rid
