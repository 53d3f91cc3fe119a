"""Feeders that supply motors and HVAC equipment, worked by hand: NEC 430.24 (conductors),
430.62(A) (the device) and 440.33 (HVAC), on the load kinds of ``gaugewalk.model.walk.equipment``.
Every walk here is invented."""

from __future__ import annotations

import pytest

from gaugewalk.model.walk.compute import compute_job
from tests.support.walks import make_job, run_table, source_table

Y480 = "480Y/277V 3ph 4w"
Y208 = "208Y/120V 3ph 4w"


def _motors_job(*runs, defaults=None):
    """Service SVC (480Y/277) -> feeder F1, 30 ft -> panel MCC, then ``runs`` from MCC."""
    return make_job("motors", defaults=defaults,
                    sources=[source_table("SVC", "service", Y480),
                             source_table("MCC", "panel", Y480)],
                    runs=[run_table("F1", "SVC", "MCC", "30"), *runs])


def _motor(rid, hp, **keys):
    return run_table(rid, "MCC", f"Motor {rid}", "40", load={"value": hp, "unit": "hp"},
                     connection="3P", **keys)


def test_a_feeder_of_three_motors_takes_125_percent_of_the_largest_and_a_device_up_to_125_a():
    # NEC 2023 Table 430.250, 460 V column: 25 hp 34 A, 15 hp 21 A, 10 hp 14 A
    job = _motors_job(_motor("M1", 25), _motor("M2", 15), _motor("M3", 10))
    result = compute_job(job)
    f1 = result.runs["F1"]
    # 430.24: 1.25 x 34 + 21 + 14 = 42.5 + 35 = 77.5 A (not 125 % of all three: 86.25 A)
    assert f1.amps == pytest.approx(34 + 21 + 14)
    assert f1.design_amps == pytest.approx(77.5)
    assert "430.24" in result.feeders["F1"].basis
    # 430.52(C)(1): inverse-time breaker 250 % of 34 A = 85 A, next standard rating 90 A;
    # 430.62(A): the feeder device not above 90 + 21 + 14 = 125 A
    assert result.runs["M1"].ocpd_a == 90
    assert result.feeders["F1"].max_ocpd_a == pytest.approx(125.0)
    # the device picked: the largest standard rating not above 125 A (240.6(A)): 125 A; the
    # next rating over 77.5 A (80 A) would sit below M1's own 90 A breaker
    assert f1.ocpd_a == 125 and result.ok
    assert any("430.62(A)" in n and "125 A" in n for n in f1.notes)
    # 240.4(G): the device protects the 430.24 conductors of Article 430 Part V, so they are not
    # raised to 125 A: 4 AWG Cu, 85 A in the 75 C column (NEC 2023 Table 310.16; the circuit is
    # rated over 100 A, 110.14(C)(1)(b)); EGC for 125 A: 6 AWG Cu (NEC 2023 Table 250.122)
    assert f1.size == "4 AWG" and f1.ampacity_a == pytest.approx(85.0)
    assert f1.egc_size == "6 AWG"
    assert any("240.4(G)" in n for n in f1.notes)


def test_a_fixed_motor_feeder_device_within_430_62_keeps_the_430_24_conductors():
    job = _motors_job(_motor("M1", 25), _motor("M2", 15), _motor("M3", 10))
    job.runs[0].ocpd_a = 110   # within the 125 A of 430.62(A)
    result = compute_job(job)
    f1 = result.runs["F1"]
    # 240.4(G): 4 AWG Cu (85 A, NEC 2023 Table 310.16) stays on the 110 A device
    assert f1.ocpd_a == 110 and f1.size == "4 AWG" and result.ok


def test_a_main_lugs_panel_holds_the_picked_motor_feeder_device_to_its_bus():
    job = _motors_job(_motor("M1", 25), _motor("M2", 15), _motor("M3", 10))
    job.sources[1].rating_a = 100   # MCC: main lugs only, 100 A bus
    result = compute_job(job)
    f1 = result.runs["F1"]
    # NEC 408.36: the feeder's device protects the bus, so 100 A, not the 125 A of 430.62(A)
    assert f1.ocpd_a == 100 and result.ok
    assert any("408.36" in n and "100 A bus" in n for n in f1.notes)


def test_a_fixed_feeder_device_over_the_430_62_limit_is_a_problem():
    job = _motors_job(_motor("M1", 25), _motor("M2", 15), _motor("M3", 10))
    job.runs[0].ocpd_a = 150   # above the 125 A of 430.62(A)
    result = compute_job(job)
    assert any("430.62(A)" in p and "150 A" in p for p in result.runs["F1"].problems)


def test_a_motor_among_other_loads_still_adds_its_25_percent_but_sets_no_device_limit():
    job = _motors_job(_motor("M1", 25),
                      run_table("H1", "MCC", "Heater", "40", load=(20, "A"), connection="3P",
                                continuous=True))
    result = compute_job(job)
    f1 = result.runs["F1"]
    # 215.2(A)(1) and 430.24: 1.25 x 20 + 1.25 x 34 = 25 + 42.5 = 67.5 A
    assert f1.design_amps == pytest.approx(67.5)
    # 430.63 words the combined figure as a floor: said in the notes; the 70 A device picked
    # for 67.5 A is a problem only because it sits below M1's own 90 A breaker
    assert any("430.63" in n for n in f1.notes)
    assert [p for p in f1.problems] == [p for p in f1.problems if "90 A branch device" in p]
    assert len(f1.problems) == 1
    job.runs[0].ocpd_a = 90
    assert compute_job(job).ok


def test_hvac_units_known_by_mca_count_mca_over_1_25_and_the_largest_once_more_at_25_percent():
    job = _motors_job(
        run_table("U1", "MCC", "RTU-1", "40", load={"kind": "hvac", "mca": 40, "mocp": 60},
                  connection="3P"),
        run_table("U2", "MCC", "RTU-2", "40", load={"kind": "hvac", "mca": 25, "mocp": 40},
                  connection="3P"))
    result = compute_job(job)
    f1 = result.runs["F1"]
    # 440.33 with MCA alone (assumed RLA = MCA / 1.25): 32 + 20 = 52 A; + 25 % of 32 A = 60 A
    # (the sum of the MCAs, 65 A, would count the 25 % twice)
    assert f1.amps == pytest.approx(40 / 1.25 + 25 / 1.25)
    assert f1.design_amps == pytest.approx(60.0)
    assert any("440.33" in n and "assumed" in n for n in f1.notes)
    # 440.22 / 430.62(A): the largest branch device (MOCP 60 A) + 20 A = 80 A
    assert result.feeders["F1"].max_ocpd_a == pytest.approx(80.0)


def test_motors_below_a_transformer_do_not_reach_the_feeder_into_its_primary():
    job = make_job("motors", sources=[source_table("SVC", "service", Y480),
                                      source_table("T1", "transformer", Y208, kva=45),
                                      source_table("LP1", "panel", Y208)],
                   runs=[run_table("F-T1", "SVC", "T1", "10"), run_table("F-LP1", "T1", "LP1",
                                                                          "8"),
                         run_table("M1", "LP1", "Pump", "40", load={"value": 10, "unit": "hp"},
                                   connection="3P")])
    result = compute_job(job)
    # the primary feeder is sized by Table 450.3(B): 125 % of 54.1 A, next standard 70 A
    assert result.runs["F-T1"].ocpd_a == 70
    assert not any("430.24" in n for n in result.runs["F-T1"].notes)
    # the panel's feeder below the transformer takes 430.24: 125 % of 30.8 A (Table 430.250,
    # 10 hp at 208 V)
    assert result.runs["F-LP1"].design_amps >= 1.25 * 30.8 - 1e-6


def test_a_motor_edit_recomputes_its_feeder_device_as_a_full_compute_does():
    from gaugewalk.model.walk.job import Load
    from gaugewalk.model.walk.recompute import recompute_run

    job = _motors_job(_motor("M1", 25), _motor("M2", 15), _motor("M3", 10))
    result = compute_job(job)
    for rid, hp in (("M2", 40), ("M1", 5), ("M3", 60), ("M2", 15)):
        job.run(rid).load = Load(value=hp, unit="hp", kind="motor")
        result = recompute_run(job, result, rid)
        full = compute_job(job)
        assert result.runs["F1"].ocpd_a == full.runs["F1"].ocpd_a, (rid, hp)
        assert result.runs["F1"].size == full.runs["F1"].size, (rid, hp)
        assert result.feeders["F1"].max_ocpd_a == pytest.approx(full.feeders["F1"].max_ocpd_a)
    # NEC 2023 Table 430.250, 460 V: 5 hp 7.6 A, 15 hp 21 A, 60 hp 77 A; 430.52(C)(1): 250 %
    # of 77 A = 192.5 A, next standard 200 A; 430.62(A): 200 + 7.6 + 21 = 228.6 A -> 225 A
    assert result.runs["F1"].ocpd_a == 225


def test_a_feeder_device_below_a_motor_branch_device_it_supplies_is_a_problem():
    # NEC 2023 Table 430.250, 460 V: 40 hp 52 A; Table 430.52(C)(1) inverse-time breaker 250 %:
    # 130 A, next standard 150 A (430.52(C)(1) Exception No. 1)
    job = _motors_job(_motor("M1", 40),
                      run_table("H1", "MCC", "Heater", "40", load=(10, "A"), connection="3P",
                                continuous=True))
    result = compute_job(job)
    f1 = result.runs["F1"]
    assert result.runs["M1"].ocpd_a == 150
    # 430.24 and 215.2(A)(1): 1.25 x 52 + 1.25 x 10 = 77.5 A: the next standard device, 80 A,
    # would sit above a 150 A motor breaker and open first when the motor starts
    assert f1.design_amps == pytest.approx(77.5) and f1.ocpd_a == 80
    assert any("below the 150 A branch device of M1" in p and "430.63" in p
               for p in f1.problems)
    assert not result.ok
    # a device of at least the motor's own clears it
    job.runs[0].ocpd_a = 175
    assert not any("branch device" in p for p in compute_job(job).runs["F1"].problems)


def test_a_fixed_motor_feeder_device_below_the_largest_motor_breaker_is_a_problem():
    job = _motors_job(_motor("M1", 25), _motor("M2", 15), _motor("M3", 10))
    job.runs[0].ocpd_a = 80    # M1's own breaker is 90 A (250 % of 34 A, next standard)
    result = compute_job(job)
    assert any("below the 90 A branch device of M1" in p and "430.62(A)" in p
               for p in result.runs["F1"].problems)


def test_an_instantaneous_trip_motor_breaker_counts_at_the_inverse_time_percentage_on_its_feeder():
    # NEC 2023 Table 430.250, 460 V column: 25 hp 34 A, 15 hp 21 A, 10 hp 14 A
    job = _motors_job(_motor("M1", 25), _motor("M2", 15),
                      run_table("M3", "MCC", "Motor M3", "40", connection="3P",
                                load={"value": 10, "unit": "hp",
                                      "motor_device": "instantaneous"}))
    result = compute_job(job)
    # Table 430.52(C)(1): the instantaneous-trip breaker of M3 is set at up to 800 % of 14 A,
    # 112 A; M1's inverse-time breaker is 250 % of 34 A = 85 A, next standard 90 A
    assert result.runs["M3"].ocpd_a == 112 and result.runs["M1"].ocpd_a == 90
    # 430.62(A) Exception No. 1 (from memory: the exception's number): for the feeder device,
    # each instantaneous-trip breaker counts at no more than the Table 430.52(C)(1) percentage
    # of the feeder's own device type (an inverse-time breaker, 250 %): 250 % of 14 A = 35 A.
    # The largest is then M1's 90 A: 90 + 21 + 14 = 125 A (not 112 + 34 + 21 = 167 A)
    assert result.feeders["F1"].max_ocpd_a == pytest.approx(125.0)
    f1 = result.runs["F1"]
    assert f1.ocpd_a == 125 and result.ok
    assert any("Exception No. 1" in n and "M3" in n and "35 A" in n for n in f1.notes)


def test_the_line_a_motor_makes_heaviest_with_its_25_percent_sizes_the_feeder():
    # a 208Y/120 V panel: a 120 V heater of 40 A on line A (continuous, NEC 424.4(B)), and a
    # 7-1/2 hp single-phase motor line to line on B and C (NEC 2023 Table 430.248, 208 V column:
    # 44 A). Line A: 1.25 x 40 = 50 A (215.2(A)(1)); lines B and C: 44 A, and 430.24 takes the
    # largest motor at 125 %: 1.25 x 44 = 55 A. The feeder is sized for 55 A on line B, not for
    # the 50 A of line A, the heavier before the motor's 25 % was added.
    job = make_job("line", sources=[source_table("SVC", "service", Y208),
                                    source_table("LP", "panel", Y208)],
                   runs=[run_table("F1", "SVC", "LP", "20"),
                         run_table("H1", "LP", "Heater", "20", load={"kind": "heater",
                                                                      "value": 40, "unit": "A"},
                                   connection="LN", phase="A"),
                         run_table("M1", "LP", "Saw", "20", load={"value": 7.5, "unit": "hp"},
                                   connection="LL", phase="BC")])
    result = compute_job(job)
    f1 = result.runs["F1"]
    assert f1.amps == pytest.approx(44.0)
    assert f1.design_amps == pytest.approx(55.0)
    assert result.feeders["F1"].line == "B"
    assert any("430.24" in n and "44.0 A added at 25 %" in n for n in f1.notes)


def test_a_feeder_kept_at_a_stated_load_below_its_motors_430_24_current_says_so():
    from gaugewalk.model.walk.job import Load
    from gaugewalk.model.walk.plausible import stated_loads

    # NEC 2023 Table 430.250, 460 V column: 25 hp 34 A; 430.24: 1.25 x 34 = 42.5 A
    job = _motors_job(_motor("M1", 25))
    job.runs[0].load = Load(value=40, unit="A")   # more than 34 A, less than 42.5 A
    result = compute_job(job)
    assert result.runs["F1"].design_amps == pytest.approx(40.0)
    assert result.feeders["F1"].served_a == pytest.approx(42.5)
    assert [rid for rid, _ in stated_loads(result)] == ["F1"]
    # a stated load that covers 430.24's current is kept without a word
    job.runs[0].load = Load(value=43, unit="A")
    assert compute_job(job).feeders["F1"].served_a is None


def test_a_feeder_device_below_the_430_63_figure_says_how_that_figure_was_read():
    job = _motors_job(_motor("M1", 25),
                      run_table("H1", "MCC", "Heater", "40", load=(20, "A"), connection="3P",
                                continuous=True))
    job.runs[0].ocpd_a = 90
    result = compute_job(job)
    f1 = result.runs["F1"]
    # NEC 2023 Table 430.250: 25 hp, 460 V, 34 A; Table 430.52(C)(1): 250 % -> 85 A -> 90 A.
    # 430.63 (from memory: "not less than" the other loads plus the rating 430.62 permits):
    # 90 A + 125 % of the 20 A heater (215.3) = 115 A; the 90 A device is below that figure
    # a floor, not a maximum: check --json gives it as ocpd_430_63_a, max_ocpd_a is None
    assert result.feeders["F1"].ocpd_430_63_a == pytest.approx(115.0)
    assert result.feeders["F1"].max_ocpd_a is None
    note = next(n for n in f1.notes if n.startswith("NEC 430.63"))
    assert "90 A device" in note and "below" in note and "authority having jurisdiction" in note
    assert result.ok   # a stated reading, not a problem
    # a device at or above the figure has nothing more to say
    job.runs[0].ocpd_a = 125
    note = next(n for n in compute_job(job).runs["F1"].notes if n.startswith("NEC 430.63"))
    assert "below" not in note


def test_check_json_gives_430_62_as_a_maximum_and_430_63_as_a_floor(tmp_path, capsys):
    import json

    from gaugewalk.model.walkfile.write import dumps_walk
    from gaugewalk.tui.cli.main import main

    # NEC 2023 Table 430.250, 460 V, and Table 430.52(C)(1) as in the tests above: motors alone
    # -> 430.62(A)'s 125 A maximum; with a 20 A heater -> 430.63's 115 A, "not less than"
    alone = _motors_job(_motor("M1", 25), _motor("M2", 15), _motor("M3", 10))
    mixed = _motors_job(_motor("M1", 25),
                        run_table("H1", "MCC", "Heater", "40", load=(20, "A"), connection="3P",
                                  continuous=True))
    mixed.runs[0].ocpd_a = 90
    got = {}
    for name, job in (("alone", alone), ("mixed", mixed)):
        path = tmp_path / f"{name}.toml"
        path.write_text(dumps_walk(job), encoding="utf-8")
        main(["check", str(path), "--json"])
        runs = json.loads(capsys.readouterr().out)["runs"]
        got[name] = next(r for r in runs if r["id"] == "F1")
    assert (got["alone"]["max_ocpd_a"], got["alone"]["ocpd_430_63_a"]) == (125.0, None)
    assert (got["mixed"]["max_ocpd_a"], got["mixed"]["ocpd_430_63_a"]) == (None, 115.0)


@pytest.mark.parametrize(("name", "what", "rule"), [
    ("Freight elevator 2", "an elevator", "NEC 620.13"),
    ("Dock hoist", "a crane or hoist", "NEC 610.14"),
])
def test_a_motor_named_as_an_elevator_or_hoist_says_it_was_sized_as_continuous_duty(name, what,
                                                                                      rule):
    # NEC 430.22(E) and Table 430.22(E) (from memory): a motor of other than continuous duty is
    # sized from its nameplate current by its duty (intermittent up to 140 %, varying up to
    # 200 %); the walk lacks the duty, so the 125 % it took is a stated assumption
    job = _motors_job(run_table("M1", "MCC", name, "40", load={"value": 25, "unit": "hp"},
                                connection="3P"))
    result = compute_job(job)
    m1 = result.runs["M1"]
    note = next(n for n in m1.notes if n.startswith(f"'{name}' reads as {what}"))
    assert rule in note and "Table 430.22(E)" in note and "continuous-duty" in note
    assert m1.design_amps == pytest.approx(1.25 * 34)   # NEC 2023 Table 430.250, 460 V: 34 A
    # a plain motor's name says nothing of the kind
    plain = compute_job(_motors_job(_motor("M1", 25))).runs["M1"]
    assert not any("reads as" in n for n in plain.notes)


@pytest.mark.parametrize(("name", "said"), [
    ("Walk-in cooler compressor", True), ("Condensing unit CU-2", True), ("Ice machine", True),
    ("Shop air compressor", False), ("Exhaust fan 3", False)])
def test_a_motor_named_as_a_refrigerant_compressor_says_article_440_takes_its_nameplate(name,
                                                                                       said):
    # NEC 440.6(A), 440.4(B), 440.22 (from memory): a hermetic refrigerant motor-compressor is
    # sized from its nameplate (rated-load or branch-circuit selection current, the equipment's
    # MCA and maximum device), not the horsepower tables; given in hp, the walk's sizing by
    # Table 430.250 is a stated assumption
    job = _motors_job(run_table("M1", "MCC", name, "40", load={"value": 5, "unit": "hp"},
                                connection="3P"))
    m1 = compute_job(job).runs["M1"]
    notes = [n for n in m1.notes if "refrigerant motor-compressor" in n]
    assert bool(notes) is said
    if said:
        assert notes[0].startswith(f"'{name}' reads as") and "440.6(A)" in notes[0]
    assert m1.design_amps == pytest.approx(1.25 * 7.6)   # NEC 2023 Table 430.250, 460 V, 5 hp
