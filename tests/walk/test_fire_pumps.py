"""A fire pump in a walk (``gaugewalk.model.walk.fire_pumps``): its drop targets, what the walk
shows of its supply (NEC 695.3, 230.82(5), 695.5), the feeders above it (695.4(B)(2)(a)(1),
the other loads at 100 % as 695.5(C) words it) and a motor named as a fire pump. Article 695's
and 230.82's section numbers from memory. Every walk here is invented."""

from __future__ import annotations

import pytest

from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walk.vocabulary import kind_in_name
from tests.support.walks import make_job, run_table, source_table

Y480 = "480Y/277V 3ph 4w"


def _fire_pump(rid="FP", frm="MCC", to="Fire pump 1", hp=50, length="100", **keys):
    return run_table(rid, frm, to, length, load={"value": hp, "unit": "hp", "kind": "fire-pump"},
                     connection="3P", **keys)


def _job(*runs, defaults=None, feeder=True):
    """Service SVC (480Y/277) -> feeder F1, 30 ft -> panel MCC, then ``runs``."""
    sources = [source_table("SVC", "service", Y480), source_table("MCC", "panel", Y480)]
    feeders = [run_table("F1", "SVC", "MCC", "30")] if feeder else []
    return make_job("fire pump", sources=sources, runs=[*feeders, *runs], defaults=defaults)


def test_a_fire_pump_run_takes_695_7s_targets_whatever_the_job_says():
    job = _job(_fire_pump(), defaults={"branch_drop_pct": 2.0, "total_drop_pct": 6.0,
                                       "starting_drop_pct": 10.0})
    result = compute_job(job)
    spec = result._specs["FP"]
    # NEC 695.7(B): 5 % from the source at 115 % of the full-load current (the job's looser
    # 6 % total and its own 2 % branch target give way); 695.7(A): 15 % while starting
    assert (spec.max_drop_pct, spec.max_total_drop_pct, spec.starting_drop_pct) == (5.0, 5.0,
                                                                                   15.0)
    # the other runs keep the job's
    assert result._specs["F1"].max_total_drop_pct == 6.0


def test_the_total_drop_of_a_fire_pump_counts_the_drop_up_to_its_source():
    result = compute_job(_job(_fire_pump()))
    fp, f1 = result.runs["FP"], result.runs["F1"]
    assert fp.total_drop_pct == pytest.approx(f1.total_drop_pct + fp.voltage_drop_pct)
    assert fp.margins["total_drop_pct"] == pytest.approx(5.0 - fp.total_drop_pct)


def test_a_fire_pump_on_a_fed_panel_says_so_and_names_its_feeder():
    result = compute_job(_job(_fire_pump()))
    notes = result.runs["FP"].notes
    # NEC 695.3: a fire pump on a feeder only in the arrangements it lists: stated, not a problem
    assert any("fed by feeder F1 from SVC" in n and "695.3" in n for n in notes)
    assert not any("695.3" in p for p in result.runs["FP"].problems)


def test_a_fire_pump_on_a_panel_the_walk_shows_no_supply_for_says_so():
    result = compute_job(_job(_fire_pump(), feeder=False))
    assert any("whose supply the walk does not show" in n for n in result.runs["FP"].notes)


def test_a_fire_pump_from_the_service_says_what_230_82_5_asks():
    result = compute_job(_job(_fire_pump(frm="SVC")))
    # NEC 230.82(5): fire pump equipment on the supply side of the service disconnect, with
    # service equipment of its own, installed as service-entrance conductors
    assert any("230.82(5)" in n and "service-entrance conductors" in n
               for n in result.runs["FP"].notes)


def test_a_fire_pump_below_a_transformer_names_695_5():
    job = make_job("fire pump", sources=[
        source_table("SVC", "service", Y480),
        source_table("T1", "transformer", "208Y/120V 3ph 4w", kva=150),
        source_table("LP1", "panel", "208Y/120V 3ph 4w")],
        runs=[run_table("F1", "SVC", "T1", "20"), run_table("F2", "T1", "LP1", "10"),
              _fire_pump(frm="LP1", hp=25)])
    result = compute_job(job)
    assert any("transformer T1" in n and "695.5" in n for n in result.runs["FP"].notes)


def test_a_feeder_whose_device_cannot_carry_the_locked_rotor_current_has_a_problem():
    # F1 supplies a 50 hp fire pump (Table 430.250 65 A; Table 430.251(B) 363 A, from memory)
    # and 40 A of other load. Its device by 215.3 and 430.63: 430.24 1.25 x 65 + 40 = 121.25 A
    # -> 125 A (240.6(A)). NEC 695.4(B)(2)(a)(1), 695.5(C): it must carry 363 + 40 = 403 A
    # indefinitely: a problem, naming the 450 A that would.
    lights = run_table("L1", "MCC", "Pump room heat", "50", load=(40, "A"), connection="3P")
    result = compute_job(_job(_fire_pump(), lights))
    f1 = result.runs["F1"]
    assert f1.ocpd_a == 125
    fire = [p for p in f1.problems if "695.4(B)(2)(a)(1)" in p]
    assert len(fire) == 1 and "403 A" in fire[0] and "450 A" in fire[0]
    # the fire pump's problem stands for the branch device's (one problem, not two)
    assert not any("branch device of FP" in p for p in f1.problems)


def test_a_feeder_of_the_fire_pump_alone_picks_a_device_that_carries_it():
    # motors alone: 430.62(A) lets the feeder device go up to the fire pump's 400 A branch
    # device, and the largest standard rating within it is picked: 400 A >= 363 A (695.4(B)(2))
    result = compute_job(_job(_fire_pump()))
    f1 = result.runs["F1"]
    assert f1.ocpd_a == 400 and not f1.problems
    assert any("695.4(B)(2)(a)(1)" in n and "carries" in n and "363 A" in n for n in f1.notes)


def test_a_fixed_feeder_device_above_the_locked_rotor_current_is_a_note():
    job = _job(_fire_pump())
    job.runs[0].ocpd_a = 400
    f1 = compute_job(job).runs["F1"]
    assert not any("695" in p for p in f1.problems)


@pytest.mark.parametrize(("to", "kind"), [
    ("Fire pump 1", "fire-pump"), ("FIRE PUMP", "fire-pump"), ("Fire-pump room", "fire-pump"),
    ("Jockey pump", None),   # a pressure maintenance pump is a motor (common practice)
    ("Firepump 2", "fire-pump"), ("Taproom lights", "lighting"),
    ("Blade sign over entrance", "lighting"), ("Exit signs, rear", "lighting"),
    ("Sign-in kiosk", None),
])
def test_the_kind_a_name_says(to, kind):
    assert kind_in_name(to) == kind


def test_a_motor_named_as_a_fire_pump_is_a_problem_not_a_silent_motor():
    motor = run_table("M1", "MCC", "Fire pump 50hp", "100", load={"value": 50, "unit": "hp"},
                      connection="3P")
    result = compute_job(_job(motor))
    m1 = result.runs["M1"]
    assert m1.load_kind == "motor"
    assert any("reads as a fire pump" in p and "fire-pump" in p for p in m1.problems)
    assert not result.ok
    # the same motor named for what a plain motor drives has no such problem
    plain = run_table("M1", "MCC", "Chiller pump", "100", load={"value": 50, "unit": "hp"},
                      connection="3P")
    assert not any("fire pump" in p for p in compute_job(_job(plain)).runs["M1"].problems)


def test_a_load_in_hp_may_say_it_is_a_fire_pump_but_no_other_kind():
    from pydantic import ValidationError

    from gaugewalk.model.walk.job import Load

    assert Load(value=50, unit="hp", kind="fire-pump").kind == "fire-pump"
    assert Load(value=50, unit="hp").kind == "motor"
    with pytest.raises(ValidationError, match="a load in hp is a motor"):
        Load(value=50, unit="hp", kind="heater")
    # the nameplate's locked-rotor current is a motor's and a fire pump's key alone
    assert Load(value=50, unit="hp", kind="fire-pump", lra=363).lra == 363
    with pytest.raises(ValidationError, match="lra is for a load of kind motor or fire-pump"):
        Load(value=16, unit="A", lra=100)


def test_the_starting_dip_from_the_service_is_held_to_695_7_a_whatever_the_job_says():
    # NEC 695.7(A): 15 % at the controller's line terminals while the motor starts; the walk's
    # dip from the service (the bus, the feeders above at the locked-rotor current, the run)
    # is held to it, not to the job's 10 %
    result = compute_job(_job(_fire_pump(), defaults={"starting_drop_pct": 10.0}))
    dip = result.start_dips["FP"]
    assert dip.target_pct == 15.0 and dip.total_pct is not None
    assert dip.total_pct == pytest.approx(dip.bus_pct + dip.above_pct + dip.run_pct)


def test_a_feeder_of_motors_alone_is_raised_past_430_62_to_carry_the_fire_pump():
    # NEC 2023 Table 430.250, 460 V: 50 hp 65 A, 75 hp 96 A. The 75 hp motor's inverse-time
    # breaker: 250 % x 96 = 240 A -> 250 A (Table 430.52(C)(1), 430.52(C)(1)(a)). The fire
    # pump's device 400 A (Table 430.251(B) 363 A, from memory; 695.4(B)(2)(a)(1)).
    # 430.62(A): 400 + 96 = 496 A -> 450 A, the largest standard rating within it (240.6(A)).
    # 695.4(B)(2)(a)(1), 695.5(C): 363 + 96 = 459 A to carry: 450 A falls short, so 500 A.
    motor = run_table("M1", "MCC", "Chiller", "60", load={"value": 75, "unit": "hp"},
                      connection="3P")
    result = compute_job(_job(_fire_pump(), motor))
    f1 = result.runs["F1"]
    assert result.runs["M1"].ocpd_a == 250
    assert result.feeders["F1"].max_ocpd_a == pytest.approx(496.0)
    assert f1.ocpd_a == 500 and not f1.problems, f1.problems
    assert any("raised to 500 A" in n and "430.62(A)" in n for n in f1.notes)
    assert any("695.4(B)(2)(a)(1)" in n and "459 A" in n and "carries" in n for n in f1.notes)
