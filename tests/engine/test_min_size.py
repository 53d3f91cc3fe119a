"""A job's minimum conductor size: a floor on the pick that enlarges the EGC in proportion."""

import json

import pytest

from gaugewalk.model.engine.circuits import circuit_from_volts
from gaugewalk.model.engine.contract import RunSpec
from gaugewalk.model.engine.sizing import SizingError, evaluate
from gaugewalk.tui.cli.main import main
from tests.support.walks import run_table, source_table, walk_text

CIRCUIT_120 = circuit_from_volts(120, 1)


def test_without_a_floor_a_9_amp_branch_circuit_takes_14_awg():
    # NEC 2023 Table 310.16: 14 AWG Cu, 60 C column, 15 A; 240.4(D)(3) limits it to a 15 A device.
    r = evaluate(RunSpec(circuit=CIRCUIT_120, amps=9, length_ft=40))
    assert (r.size, r.ocpd_a, r.egc_size, r.governed_by) == ("14 AWG", 15, "14 AWG", "ampacity")


def test_a_12_awg_floor_governs_and_the_egc_grows_in_proportion():
    # Job specification of 12 AWG minimum (common practice on commercial work).
    # NEC 2023 Table 250.122: a 15 A device needs a 14 AWG Cu EGC. NEC 250.122(B): phase
    # conductors upsized 14 -> 12 AWG for a reason other than 310.15(B)/(C) corrections, so the
    # EGC grows by 6530/4110 = 1.589 (Ch. 9 Table 8 areas): 4110 x 1.589 = 6530 cmil -> 12 AWG.
    r = evaluate(RunSpec(circuit=CIRCUIT_120, amps=9, length_ft=40, min_size="12"))
    assert (r.size, r.ocpd_a, r.egc_size, r.governed_by) == ("12 AWG", 15, "12 AWG", "minimum size")
    assert any("250.122(B)" in n for n in r.notes)


def test_a_floor_below_what_the_load_needs_changes_nothing():
    # 40 A at the 60 C terminal column needs 8 AWG Cu (NEC 2023 Table 310.16, 110.14(C)(1)).
    r = evaluate(RunSpec(circuit=CIRCUIT_120, amps=40, length_ft=20, min_size="12 AWG"))
    assert (r.size, r.governed_by) == ("8 AWG", "ampacity")


def test_a_fixed_size_below_the_floor_is_a_problem():
    r = evaluate(RunSpec(circuit=CIRCUIT_120, amps=9, length_ft=40, min_size="12", size="14"))
    assert r.problems == ("14 AWG Cu is below the job's minimum size, 12 AWG",)


def test_an_unknown_floor_is_refused_naming_the_field():
    with pytest.raises(SizingError, match="min_size"):
        evaluate(RunSpec(circuit=CIRCUIT_120, amps=9, length_ft=40, min_size="13"))


def test_calc_takes_min_size(capsys):
    assert main(["calc", "--amps", "9", "--length", "40", "--volts", "120", "--min-size", "12",
                 "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert (out["size"], out["egc_size"]) == ("12 AWG", "12 AWG")


def test_a_walk_default_min_size_reaches_every_run(tmp_path):
    walk = tmp_path / "floor.toml"
    walk.write_text(walk_text(
        "Floor check (test walk)", defaults={"min_size": "12"},
        sources=[source_table("P1", "service", "120/240V 1ph 3w")],
        runs=[run_table("R1", "P1", "Lights", "40", load=(9, "A"), connection="LN")],
    ))
    from gaugewalk.model.walk.compute import compute_job
    from gaugewalk.model.walkfile.read import load_walk

    result = compute_job(load_walk(walk)).runs["R1"]
    assert (result.size, result.egc_size) == ("12 AWG", "12 AWG")
