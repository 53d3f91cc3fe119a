"""The sample walks: valid, of the promised shape, reproducible, and computing as documented."""

from __future__ import annotations

import importlib.util

import pytest

from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.model.walkfile.write import dumps_walk
from tests.support.paths import SAMPLES


def _generator():
    spec = importlib.util.spec_from_file_location("make_warehouse", SAMPLES / "make_warehouse.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


@pytest.mark.parametrize("name, least, most", [
    ("retail_fitout.toml", 35, 60), ("farm_workshop.toml", 15, 30),
    ("warehouse_dc2.toml", 300, 1000), ("office_home_runs.toml", 30, 30),
])
def test_each_sample_loads_and_saves_back_to_the_same_bytes(name, least, most):
    path = SAMPLES / name
    job = load_walk(path)
    assert least <= len(job.runs) <= most
    assert dumps_walk(job) == path.read_text()


def test_the_committed_warehouse_is_what_its_generator_writes():
    assert dumps_walk(_generator().build()) == (SAMPLES / "warehouse_dc2.toml").read_text()


def test_the_warehouse_steps_down_to_208y120_through_its_transformers_and_passes():
    job = load_walk(SAMPLES / "warehouse_dc2.toml")
    kinds = [s.kind for s in job.sources]
    assert kinds.count("transformer") == 2 and kinds.count("panel") >= 6
    assert job.source("T1").system == "208Y/120V 3ph 4w"
    result = compute_job(job)
    assert result.ok, [str(p) for p in result.problems][:5]
    # the drop from the service carries through T1 (the default): its primary feeder's drop
    # plus its own drop at its load (IEEE Std 141 approximation)
    assert job.defaults.drop_through_transformers
    assert result.source_drop_pct["T1"] == pytest.approx(
        result.runs["F-T1"].voltage_drop_pct + result.transformers["T1"].drop_pct)
    assert result.transformers["T1"].drop_pct > 0.5
    # Table 450.3(B) primary-only: 300 kVA at 480 V is 300000 / (sqrt(3) x 480) = 360.8 A;
    # 125 % = 451.1 A, note 1 next standard rating (240.6(A)) 500 A
    assert result.transformers["T1"].primary_fla_a == pytest.approx(360.8, abs=0.05)
    assert result.transformers["T1"].primary_ocpd_a == 500
    assert result.runs["F-T1"].ocpd_a == 500
    # no branch run is taken more than two sizes over its own drop target's to make up the
    # drop of the feeders and transformers above it (pick.UPSIZE_FOR_TOTAL): the subfeeders
    # are sized for 1 % instead, as a designer would
    assert job.run("F-L1A").max_drop_pct == 1.0 and job.run("F-L2A").max_drop_pct == 1.0
    # the office subpanel's bus drop is T1's secondary plus the two feeders below it
    assert result.source_drop_pct["L1A"] == pytest.approx(
        result.source_drop_pct["T1"] + result.runs["F-L1"].voltage_drop_pct
        + result.runs["F-L1A"].voltage_drop_pct)


def test_the_retail_sample_passes_and_the_farm_has_only_its_documented_problem():
    assert compute_job(load_walk(SAMPLES / "retail_fitout.toml")).ok
    farm = load_walk(SAMPLES / "farm_workshop.toml")
    result = compute_job(farm)
    assert {p.where for p in result.problems} == {"run SVC-YARD"}
    assert "SVC-YARD" in farm.job.notes
    assert farm.run("F-SHOP").material == "al"


def test_the_office_runs_its_home_runs_in_five_shared_raceways_counted_once():
    from gaugewalk.model.walk.takeoff import build_takeoff

    job = load_walk(SAMPLES / "office_home_runs.toml")
    result = compute_job(job)
    assert result.ok, [str(p) for p in result.problems][:5]
    assert sorted(result.raceways) == ["HR1", "HR2", "HR3", "HR4", "HR5"]
    # 120 V line-to-neutral circuits: hot and neutral count (NEC 310.15(E)); 5 or 6 circuits,
    # 10 or 12 CCC: 50 % by NEC Table 310.15(C)(1) (10-20)
    assert {s.adjustment for s in result.raceways.values()} == {0.5}
    shared = [r for r in build_takeoff(job, result).raceway_lines if r.id is not None]
    assert {r.id: r.length_ft for r in shared} == {
        "HR1": 55.0, "HR2": 60.0, "HR3": 50.0, "HR4": 65.0, "HR5": 45.0}
    assert len(shared) == 5


def test_the_warehouse_fire_pump_is_tapped_at_the_service_and_its_device_carries_its_lra():
    result = compute_job(load_walk(SAMPLES / "warehouse_dc2.toml"))
    fp = result.runs["MSB-FP"]
    # NEC 2023 Table 430.7(B): code G, 6.29 kVA/hp x 50 hp / (sqrt(3) x 460 V) = 394.7 A;
    # 695.4(B)(2)(a)(1) (from memory), 240.6(A): 400 A. 695.6(C): 1.25 x 65 A (Table 430.250)
    # = 81.25 A -> 4 AWG Cu, 85 A in the 75 C column (Table 310.16)
    assert (fp.load_kind, fp.locked_rotor_a, fp.ocpd_a, fp.size) == (
        "fire-pump", pytest.approx(394.7, abs=0.05), 400, "4 AWG")
    assert fp.ok and any("230.82(5)" in n for n in fp.notes)
