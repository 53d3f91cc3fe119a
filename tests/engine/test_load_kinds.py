"""Loads of a kind sized by their articles (``gaugewalk.model.engine.sizing.kinds``), each case
worked by hand beside the check: a motor branch (NEC 430.6(A)(1), 430.22, Table 430.52(C)(1),
250.122(D)(1)), an HVAC nameplate (440.4(B), 440.22), an EV charger (625.41, 625.42), a storage
water heater (422.13, 422.11(E)), a welder (630.11(A), 630.12), space heating (424.4(B)) and
resistive loads given in kW at power factor 1. Conductor ampacities are NEC 2023 Table 310.16."""

import math

import pytest

from gaugewalk.model.engine.circuits import circuit_from_volts
from gaugewalk.model.engine.contract import Equipment, RunSpec
from gaugewalk.model.engine.loads import load_amps
from gaugewalk.model.engine.sizing import evaluate
from gaugewalk.model.engine.sizing.kinds import (
    continuous_of,
    continuous_refusal,
    load_pf,
    running_amps,
)

JOB_PF = 0.85


def size(eq: Equipment, value: float | None, unit: str | None, volts: float, phases: int,
         **kw):
    """Size a run of this load the way a walk does: the kind's power factor, running current
    and continuous default."""
    circuit = circuit_from_volts(volts, phases)
    pf = load_pf(eq.kind, kw.pop("pf", None), JOB_PF)
    amps = running_amps(eq, value, unit, circuit, pf)
    return evaluate(RunSpec(circuit=circuit, amps=amps, length_ft=kw.pop("length_ft", 50.0),
                            continuous=continuous_of(eq), equipment=eq, pf=pf, **kw))


# -- motors -------------------------------------------------------------------------------------

def test_a_25_hp_460_v_motor_branch_by_hand():
    # NEC 2023 Table 430.250: 25 hp, 460 V column -> 34 A (430.6(A)(1): the table, not the
    # nameplate). 430.22: 1.25 x 34 = 42.5 A. 110.14(C)(1)(a)(4): a design B motor may use the
    # 75 C column; Table 310.16 75 C Cu: 10 AWG 35 A < 42.5, 8 AWG 50 A -> 8 AWG.
    # Table 430.52(C)(1): inverse-time breaker 250 % x 34 = 85 A, not a standard rating;
    # 430.52(C)(1)(a): next standard size up (240.6(A)) -> 90 A.
    # 250.122(D)(1): EGC by the 90 A device; Table 250.122, 100 A row -> 8 AWG Cu, not larger
    # than the 8 AWG circuit conductors (250.122(A)).
    r = size(Equipment(kind="motor", hp=25), 25, "hp", 460, 3)
    assert (r.flc_a, r.design_amps, r.size, r.ocpd_a, r.egc_size) == (34.0, 42.5, "8 AWG", 90,
                                                                       "8 AWG")
    assert r.load_kind == "motor" and r.ok
    assert "430.52" in r.kind_rule
    # NEC 2023 Table 430.251(B): 25 hp, 460 V -> 183 A locked-rotor (from memory); the
    # starting drop is worked at that current and reported beside the running drop
    assert r.locked_rotor_a == 183.0
    assert r.starting_drop_pct is not None and r.starting_drop_pct > r.voltage_drop_pct


def test_the_old_answer_for_the_25_hp_motor_entered_as_amps_is_gone():
    # Before loads had kinds, 34 A noncontinuous took a 35 A device (240.4(D) on 8 AWG at 60 C):
    # a breaker that trips on starting. As a motor of 34 A the device follows Table 430.52(C)(1)
    # with a note asking for the horsepower (430.6(A)(1)).
    r = size(Equipment(kind="motor"), 34, "A", 460, 3)
    assert r.ocpd_a == 90 and r.flc_a == 34.0
    assert any("give the horsepower" in n for n in r.notes)


@pytest.mark.parametrize(("device", "ocpd", "egc"), [
    # NEC 2023 Table 430.52(C)(1), polyphase squirrel-cage other than design B energy
    # efficient, 34 A FLC: dual-element fuse 175 % = 59.5 -> 60 A; nontime-delay fuse 300 % =
    # 102 -> 110 A (430.52(C)(1)(a)); inverse-time breaker 250 % = 85 -> 90 A; instantaneous
    # trip 800 % = 272 A, set at not more than that (no next size up).
    # EGC (Table 250.122): 60 A -> 10 AWG; 110 A -> 6 AWG, but 250.122(A) caps it at the 8 AWG
    # circuit conductors; instantaneous: read at the largest dual-element fuse, 60 A -> 10 AWG
    # (250.122(D)(1)).
    ("dual-element", 60, "10 AWG"), ("nontime-delay", 110, "8 AWG"),
    ("inverse-time", 90, "8 AWG"), ("instantaneous", 272, "10 AWG"),
])
def test_the_motor_device_follows_table_430_52_for_its_type(device, ocpd, egc):
    r = size(Equipment(kind="motor", hp=25, motor_device=device), 25, "hp", 460, 3)
    assert (r.size, r.ocpd_a, r.egc_size) == ("8 AWG", ocpd, egc)


def test_240_4_d_does_not_limit_a_motor_branch_and_the_egc_is_capped_at_the_conductors():
    # NEC 2023 Table 430.250: 5 hp, 230 V -> 15.2 A; 430.22: 1.25 x 15.2 = 19 A; Table 310.16
    # 75 C Cu (110.14(C)(1)(a)(4)): 14 AWG 20 A -> 14 AWG. Table 430.52(C)(1): 250 % x 15.2 =
    # 38 A -> 40 A. 240.4(G) sends motor branch conductors to Art. 430, so 240.4(D)'s 15 A for
    # 14 AWG does not apply. Table 250.122: 40 A -> 10 AWG, but 250.122(A): not larger than the
    # 14 AWG circuit conductors -> 14 AWG.
    r = size(Equipment(kind="motor", hp=5), 5, "hp", 230, 3)
    assert (r.flc_a, r.size, r.ocpd_a, r.egc_size) == (15.2, "14 AWG", 40, "14 AWG")
    assert r.ok and any("240.4(G)" in n for n in r.notes)


def test_a_fixed_motor_device_beyond_exception_2_is_a_problem_naming_the_section():
    # NEC 2023 430.52(C)(1)(b): an inverse-time breaker may go to 400 % of a FLC of 100 A or
    # less where the Table value will not start the motor: 4 x 34 = 136 A. 125 A is inside it
    # (a note), 150 A beyond it (a problem).
    inside = size(Equipment(kind="motor", hp=25), 25, "hp", 460, 3, ocpd_a=125)
    assert inside.ok and any("only where that rating will not carry" in n for n in inside.notes)
    beyond = size(Equipment(kind="motor", hp=25), 25, "hp", 460, 3, ocpd_a=150)
    assert any("136 A" in p and "430.52" in p for p in beyond.problems)


def test_a_single_phase_motor_reads_table_430_248():
    # NEC 2023 Table 430.248: 2 hp, 230 V -> 12 A; 430.22: 15 A; Table 310.16 60 C Cu (single
    # phase: no design letter, 110.14(C)(1)(a)): 14 AWG 15 A. Table 430.52(C)(1) single-phase,
    # inverse-time 250 % x 12 = 30 A, a standard rating.
    r = size(Equipment(kind="motor", hp=2), 2, "hp", 230, 1)
    assert (r.flc_a, r.design_amps, r.size, r.ocpd_a) == (12.0, 15.0, "14 AWG", 30)
    # NEC 2023 Table 430.251(A): 2 hp, 230 V -> 72 A locked-rotor (from memory)
    assert r.locked_rotor_a == 72.0
    # Table 430.251(A) is the single-phase table: it has no design letters (those are Table
    # 430.251(B)'s, polyphase design B, C and D; from memory), so its note names none
    lra_note = next(n for n in r.notes if "430.251(A)" in n)
    assert "design" not in lra_note


def test_the_code_letter_gives_the_locked_rotor_current_by_table_430_7_b():
    # NEC 2023 Table 430.7(B): code letter G, 5.6 to 6.29 kVA/hp; the top of the range,
    # 6.29 x 25 hp = 157.25 kVA; I = 157,250 / (sqrt(3) x 460) = 197.4 A
    r = size(Equipment(kind="motor", hp=25, code_letter="G"), 25, "hp", 460, 3)
    assert r.locked_rotor_a == pytest.approx(6.29 * 25_000 / (math.sqrt(3) * 460))


@pytest.mark.parametrize(("system_v", "phases", "rated_v"),
                         [(480, 3, 460), (240, 1, 230), (120, 1, 115), (208, 3, 208)])
def test_the_code_letter_reads_kva_per_hp_at_the_motor_rated_voltage_not_the_system(
        system_v, phases, rated_v):
    # NEC 2023 Table 430.7(B) gives kVA per horsepower at the motor's rated voltage; the headnotes
    # to Tables 430.248 and 430.250 put a 460 V motor on a 480 V system (230 V on 240 V, 115 V on
    # 120 V; 208 V its own). Code letter G, top of its range 6.29 kVA/hp, 5 hp:
    # 480 V system: 31,450 / (sqrt(3) x 460) = 39.5 A (not 37.8 A at 480 V)
    r = size(Equipment(kind="motor", hp=5, code_letter="G"), 5, "hp", system_v, phases)
    per_v = rated_v * (math.sqrt(3) if phases == 3 else 1.0)
    assert r.locked_rotor_a == pytest.approx(6.29 * 5_000 / per_v)


def test_the_starting_drop_is_said_to_be_the_run_alone():
    # Ohm's law: the locked-rotor current flows through every feeder and transformer above the
    # motor too, so the dip at its terminals is more than this run's share; the run's figure
    # says it is its own part only
    r = size(Equipment(kind="motor", hp=25), 25, "hp", 460, 3)
    start = [n for n in r.notes if n.startswith("starting drop")]
    assert len(start) == 1 and "this run alone" in start[0]
    assert "feeders" in start[0] and "transformer" in start[0]


def test_a_starting_drop_over_its_target_is_a_problem():
    # a long run of a 25 hp motor at a 2 % target: the running drop passes, starting does not
    r = size(Equipment(kind="motor", hp=25), 25, "hp", 460, 3, length_ft=400.0,
             starting_drop_pct=2.0)
    assert r.starting_drop_pct is not None and r.starting_drop_pct > 2.0
    assert any("start" in p for p in r.problems)


# -- HVAC -----------------------------------------------------------------------------------------

def test_a_rooftop_unit_mca_28_mocp_45_by_hand():
    # NEC 2023 440.4(B), 440.32: conductors at the nameplate MCA, 28 A, no further 125 %.
    # 110.14(C)(1)(a): 60 C column; Table 310.16 60 C Cu: 12 AWG 20 A < 28, 10 AWG 30 A.
    # 440.22(A): the device not above MOCP 45 A; 240.6(A) lists 45 A -> 45 A. 240.4(G): 240.4(D)
    # (30 A for 10 AWG) does not apply. Table 250.122: 45 A -> 10 AWG.
    r = size(Equipment(kind="hvac", mca_a=28, mocp_a=45), None, None, 208, 3)
    assert (r.design_amps, r.size, r.ocpd_a, r.egc_size) == (28, "10 AWG", 45, "10 AWG")
    assert r.ok and r.load_kind == "hvac"


def test_hvac_continuous_is_refused_so_the_125_percent_is_never_counted_twice():
    # the "8 AWG with --continuous": 440.4(B) MCA already holds 125 %
    assert "440.4(B)" in (continuous_refusal("hvac", None, True) or "")


def test_an_hvac_device_is_the_largest_standard_rating_not_above_mocp():
    # NEC 2023 240.6(A): 45 and 50 A are standard, 47 A is not; 440.22(A): not above 47 -> 45
    r = size(Equipment(kind="hvac", mca_a=28, mocp_a=47), None, None, 208, 3)
    assert r.ocpd_a == 45


def test_an_hvac_device_fixed_above_mocp_and_a_missing_mocp_are_problems():
    above = size(Equipment(kind="hvac", mca_a=28, mocp_a=45), None, None, 208, 3, ocpd_a=50)
    assert any("440.22" in p for p in above.problems)
    missing = size(Equipment(kind="hvac", mca_a=28), None, None, 208, 3)
    assert any("give its mocp" in p for p in missing.problems)


# -- EV chargers, water heaters, heaters ----------------------------------------------------------

def test_a_48_a_ev_charger_takes_a_60_a_device():
    # NEC 2023 625.42: continuous; 625.41, 210.19(A)(1): 1.25 x 48 = 60 A; 240.6(A): 60 A.
    # Table 310.16 60 C Cu (110.14(C)(1)(a), circuit 100 A or less): 6 AWG 55 A < 60, 4 AWG
    # 70 A. Table 250.122: 60 A -> 10 AWG.
    r = size(Equipment(kind="ev-charger"), 48, "A", 240, 1)
    assert (r.design_amps, r.ocpd_a, r.size, r.egc_size) == (60.0, 60, "4 AWG", "10 AWG")
    # a run cannot make the charger noncontinuous (625.42)
    assert "625.42" in (continuous_refusal("ev-charger", None, False) or "")


def test_a_4_5_kw_storage_water_heater_takes_10_awg_on_25_a():
    # NEC 2023 422.13: storage heater of 120 gal or less, continuous. Resistive: pf 1,
    # 4500 W / 240 V = 18.75 A; 1.25 x 18.75 = 23.44 A; Table 310.16 60 C Cu: 12 AWG 20 A <
    # 23.44, 10 AWG 30 A; device: next standard rating at or above 23.44 -> 25 A (240.6(A)),
    # within 422.11(E)(3)'s 150 % x 18.75 = 28.1 A (next standard size 30 A).
    r = size(Equipment(kind="water-heater", tank_gal=50), 4.5, "kW", 240, 1)
    assert r.amps == pytest.approx(18.75)
    assert (r.design_amps, r.size, r.ocpd_a) == (pytest.approx(23.4375), "10 AWG", 25)
    fixed = size(Equipment(kind="water-heater", tank_gal=50), 4.5, "kW", 240, 1, ocpd_a=35)
    assert any("422.11(E)" in p for p in fixed.problems)


def test_a_water_heater_of_unknown_tank_is_taken_as_422_13_and_said_so():
    r = size(Equipment(kind="water-heater"), 4.5, "kW", 240, 1)
    assert r.ocpd_a == 25 and any("tank size not given" in n for n in r.notes)


def test_a_water_heater_over_120_gal_follows_the_general_rule():
    # NEC 2023 422.13 covers 120 gal or less; a 150 gal heater is not continuous by it
    eq = Equipment(kind="water-heater", tank_gal=150)
    assert not continuous_of(eq)
    assert size(eq, 4.5, "kW", 240, 1).ocpd_a == 20  # 18.75 A -> 20 A (240.6(A))


def test_fixed_space_heating_is_continuous_at_pf_1():
    # NEC 2023 424.4(B): 125 %. 5000 W / 240 V = 20.83 A; x 1.25 = 26.04 A -> 30 A device;
    # Table 310.16 60 C Cu: 10 AWG 30 A
    r = size(Equipment(kind="heater"), 5, "kW", 240, 1)
    assert r.amps == pytest.approx(5000 / 240)
    assert (r.size, r.ocpd_a) == ("10 AWG", 30)


def test_resistive_kinds_take_pf_1_and_general_loads_keep_the_job_pf():
    # Ohm's law: P = V I for a resistance. 4.5 kW / 240 V = 18.75 A at pf 1; at the job's 0.85
    # it would be 22.06 A, 1 / 0.85 - 1 = 17.6 % high.
    c = circuit_from_volts(240, 1)
    assert load_pf("water-heater", None, JOB_PF) == 1.0
    assert load_pf("heater", None, JOB_PF) == 1.0
    assert load_pf("general", None, JOB_PF) == JOB_PF
    assert load_pf("heater", 0.95, JOB_PF) == 0.95  # the run's own word wins
    assert load_amps(4.5, "kW", c, 1.0) == pytest.approx(18.75)
    assert load_amps(4.5, "kW", c, JOB_PF) / 18.75 - 1 == pytest.approx(0.176, abs=5e-4)


# -- welders --------------------------------------------------------------------------------------

def test_a_welder_i1eff_25_i1max_50_takes_10_awg():
    # NEC 2023 630.11(A): conductors at I1eff = 25 A; Table 310.16 60 C Cu: 12 AWG 20 A < 25,
    # 10 AWG 30 A. 630.12(A): device not above 200 % x I1max = 100 A; 50 A taken (carries I1max).
    # 630.12(B): not above 200 % of the 10 AWG's 30 A = 60 A. Table 250.122: 50 A -> 10 AWG.
    r = size(Equipment(kind="welder", i1eff_a=25, i1max_a=50), None, None, 240, 1)
    assert (r.design_amps, r.size, r.ocpd_a, r.egc_size) == (25, "10 AWG", 50, "10 AWG")
    assert r.ok


def test_a_welder_by_rated_current_and_duty_cycle_reads_table_630_11_a():
    # NEC 2023 Table 630.11(A): 50 % duty cycle, nonmotor-generator multiplier 0.71 (from
    # memory); 40 A x 0.71 = 28.4 A -> 10 AWG (60 C, 30 A)
    r = size(Equipment(kind="welder", rated_a=40, duty_cycle_pct=50), None, None, 240, 1)
    assert r.design_amps == pytest.approx(28.4) and r.size == "10 AWG"


def test_a_welder_device_above_200_percent_of_i1max_is_a_problem():
    # NEC 2023 630.12(A): 2 x 50 = 100 A, a standard rating; 110 A is above it
    r = size(Equipment(kind="welder", i1eff_a=25, i1max_a=50), None, None, 240, 1, ocpd_a=110)
    assert any("630.12(A)" in p for p in r.problems)


# -- lighting, receptacles, general --------------------------------------------------------------

def test_lighting_is_continuous_unless_the_run_says_not():
    # common practice: lighting burns 3 h or more. 16 A x 1.25 = 20 A -> 12 AWG (60 C 20 A)
    assert size(Equipment(kind="lighting"), 16, "A", 277, 1).design_amps == 20.0
    assert size(Equipment(kind="lighting", continuous=False), 16, "A", 277, 1).design_amps == 16


def test_receptacles_by_yokes_are_180_va_each():
    # NEC 2023 220.14(I): 8 yokes x 180 VA = 1440 VA; / 120 V = 12 A -> 15 A, 14 AWG
    r = size(Equipment(kind="receptacle", yokes=8), None, None, 120, 1)
    assert (r.amps, r.ocpd_a, r.size) == (12.0, 15, "14 AWG")


def test_a_general_load_is_sized_as_before():
    # NEC 2023 210.20(A), 240.6(A): 24.5 A noncontinuous (5 kW at the job's pf 0.85 on 240 V)
    # -> 25 A; Table 310.16 60 C Cu 10 AWG 30 A (12 AWG 20 A is short)
    general = size(Equipment(kind="general"), 5, "kW", 240, 1)
    bare = evaluate(RunSpec(circuit=circuit_from_volts(240, 1),
                            amps=5000 / (240 * JOB_PF), length_ft=50.0))
    assert (general.size, general.ocpd_a) == (bare.size, bare.ocpd_a) == ("10 AWG", 25)
