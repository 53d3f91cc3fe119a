"""Supply systems, load connections and loads turned into amps."""

import math

import pytest

from gaugewalk.model.engine.circuits import (
    CONNECTIONS,
    SYSTEMS,
    CircuitError,
    circuit_from_volts,
    current_carrying_conductors,
    parse_system,
    resolve_circuit,
)
from gaugewalk.model.engine.loads import LoadError, load_amps, parse_load


@pytest.mark.parametrize(
    ("text", "system_id"),
    [
        ("208Y/120", "208Y/120V 3ph 4w"),
        ("480y/277v", "480Y/277V 3ph 4w"),
        ("120/240", "120/240V 1ph 3w"),
        ("240/120V", "120/240V 1ph 3w"),
        ("208/120 3ph", "208Y/120V 3ph 4w"),
        ("480V 3ph 3w", "480V 3ph 3w"),
        ("240 3ph", "240V 3ph 3w"),
        ("120v", "120V 1ph 2w"),
        ("277 V 1ph", "277V 1ph 2w"),
        ("120/240V 1ph 3w", "120/240V 1ph 3w"),
    ],
)
def test_systems_are_read_from_the_ways_people_write_them(text, system_id):
    assert parse_system(text) == system_id


@pytest.mark.parametrize(("text", "words"), [
    ("240", "120/240V 1ph 3w or 240/120V 3ph 4w delta or 240V 3ph 3w"),
    ("600/347", "use one of"), ("hello", "use one of")])
def test_unknown_or_incomplete_systems_are_refused_with_the_choices(text, words):
    with pytest.raises(CircuitError, match=words):
        parse_system(text)


@pytest.mark.parametrize(("text", "system_id"), [
    ("480Y", "480Y/277V 3ph 4w"), ("208Y", "208Y/120V 3ph 4w"), ("480 y", "480Y/277V 3ph 4w")])
def test_a_y_alone_names_the_three_phase_wye_of_that_voltage(text, system_id):
    # "480Y" is how a wye system is written short (the Y: a wye, three-phase, with its
    # neutral point; common practice); it is never the 3-wire delta
    assert parse_system(text) == system_id


@pytest.mark.parametrize("text", ["240Y", "480Y 3w", "208Y 1ph"])
def test_a_y_that_names_no_wye_we_know_is_refused_without_offering_a_delta(text):
    with pytest.raises(CircuitError) as refused:
        parse_system(text)
    assert "delta" not in str(refused.value).split("use one of")[0]
    assert "3ph 3w or" not in str(refused.value)


def test_every_system_offers_the_voltages_of_its_name():
    # nominal voltages of the systems, ANSI C84.1 (from memory)
    assert SYSTEMS["208Y/120V 3ph 4w"].line_to_line_v == 208
    assert SYSTEMS["208Y/120V 3ph 4w"].line_to_neutral_v == 120
    assert SYSTEMS["480Y/277V 3ph 4w"].hots == 3
    assert SYSTEMS["120/240V 1ph 3w"].hots == 2
    assert SYSTEMS["240V 3ph 3w"].line_to_neutral_v is None
    assert SYSTEMS["120V 1ph 2w"].hots == 1


def test_three_phase_drop_factor_is_root_three_and_single_phase_is_two():
    # VD = 2 I R L / 1000 single-phase, sqrt(3) I R L / 1000 three-phase (common practice)
    assert resolve_circuit("208Y/120V 3ph 4w", "3P").drop_factor == pytest.approx(math.sqrt(3))
    assert resolve_circuit("208Y/120V 3ph 4w", "LN").drop_factor == 2.0
    assert resolve_circuit("480V 3ph 3w", "LL").volts == 480


def test_a_balanced_multiwire_leg_drops_against_line_to_neutral_with_factor_one():
    mw = resolve_circuit("120/240V 1ph 3w", "MW")
    assert (mw.volts, mw.drop_factor, mw.hots, mw.neutral, mw.line_volts) == (120, 1.0, 2, True,
                                                                              240)
    # a balanced 240 V load on 2 hots drops the same percent as the multiwire legs against 120 V
    ll = resolve_circuit("120/240V 1ph 3w", "LL")
    assert ll.drop_factor / ll.volts == pytest.approx(mw.drop_factor / mw.volts)


def test_a_range_on_120_240_drops_as_line_to_line_and_its_neutral_does_not_count():
    c = resolve_circuit("120/240V 1ph 3w", "LLN")
    assert (c.volts, c.drop_factor, c.neutral) == (240, 2.0, True)
    # NEC 2023 310.15(E)(1): a neutral carrying only the unbalanced current is not counted
    assert current_carrying_conductors(c) == 2


def test_two_phases_and_the_neutral_of_a_wye_count_three_conductors():
    # NEC 2023 310.15(E)(2)
    assert current_carrying_conductors(resolve_circuit("208Y/120V 3ph 4w", "LLN")) == 3


def test_a_wye_neutral_counts_when_the_load_is_mostly_nonlinear():
    # NEC 2023 310.15(E)(3)
    assert current_carrying_conductors(resolve_circuit("480Y/277V 3ph 4w", "3PN")) == 3
    assert current_carrying_conductors(
        resolve_circuit("480Y/277V 3ph 4w", "3PN", nonlinear=True)) == 4


@pytest.mark.parametrize(
    ("system_id", "connection", "words"),
    [
        ("120/240V 1ph 3w", "3P", "single-phase"),
        ("240V 3ph 3w", "LN", "no neutral"),
        ("480V 3ph 3w", "3PN", "no neutral"),
        ("120V 1ph 2w", "LL", "needs two"),
        ("277V 1ph 2w", "MW", "needs two"),
        ("208Y/120V 3ph 4w", "XY", "not a load connection"),
    ],
)
def test_systems_that_cannot_supply_a_connection_say_why(system_id, connection, words):
    with pytest.raises(CircuitError, match=words):
        resolve_circuit(system_id, connection)


def test_every_connection_a_system_can_supply_gives_a_consistent_circuit():
    for system_id in SYSTEMS:
        for conn in CONNECTIONS:
            try:
                c = resolve_circuit(system_id, conn)
            except CircuitError:
                continue
            assert c.hots <= SYSTEMS[system_id].hots
            system = SYSTEMS[system_id]
            assert c.volts in (system.line_to_line_v, system.line_to_neutral_v)


def test_calc_circuits_from_a_voltage_and_phase_count():
    assert circuit_from_volts(120, 1).neutral is True
    assert circuit_from_volts(240, 1).hots == 2
    three = circuit_from_volts(480, 3)
    assert (three.phases, three.hots, three.drop_factor) == (3, 3, pytest.approx(math.sqrt(3)))
    with pytest.raises(CircuitError):
        circuit_from_volts(0, 1)
    with pytest.raises(CircuitError):
        circuit_from_volts(240, 2)


@pytest.mark.parametrize(
    ("text", "parsed"),
    [("16A", (16.0, "A")), ("1.8 kVA", (1.8, "kVA")), ("5kW", (5.0, "kW")),
     ("1500 w", (1500.0, "W")), ("20 amps", (20.0, "A")), ("750va", (750.0, "VA")),
     # horsepower as the trade writes it (NEC Table 430.250 rows 10, 1-1/2, 1/2, 7-1/2 hp)
     ("10hp", (10.0, "hp")), ("1-1/2 hp", (1.5, "hp")), ("1/2HP", (0.5, "hp")),
     ("7½ hp", (7.5, "hp"))],
)
def test_loads_are_read_with_their_unit(text, parsed):
    assert parse_load(text) == parsed


@pytest.mark.parametrize(("text", "words"), [("16", "no unit"), ("0A", "above zero"),
                                              ("-3A", "not a load"),
                                              ("5 furlongs", "unknown load unit"),
                                              ("x hp", "cannot read horsepower"),
                                              ("", "not a load"), ("nan A", "not a load")])
def test_bad_loads_are_refused_with_a_reason(text, words):
    with pytest.raises(LoadError, match=words):
        parse_load(text)


def test_single_phase_amps_are_volt_amperes_over_volts():
    # Ohm's law / power triangle: I = S / V; 1800 VA at 120 V is 15 A
    assert load_amps(1.8, "kVA", circuit_from_volts(120, 1)) == pytest.approx(15.0)


def test_three_phase_amps_divide_by_root_three_times_line_volts():
    # I = S / (sqrt(3) V_LL); 45 kVA at 208 V is 124.9 A (common practice)
    assert load_amps(45, "kVA", circuit_from_volts(208, 3)) == pytest.approx(
        45000 / (math.sqrt(3) * 208))
    assert load_amps(45, "kVA", circuit_from_volts(208, 3)) == pytest.approx(124.9, abs=0.05)


def test_watts_become_volt_amperes_by_the_power_factor():
    # S = P / pf: 10 kW at pf 0.8 is 12.5 kVA; at 480 V 3-phase that is 15.04 A
    amps = load_amps(10, "kW", circuit_from_volts(480, 3), pf=0.8)
    assert amps == pytest.approx(12500 / (math.sqrt(3) * 480))


def test_amps_pass_through_and_bad_power_factors_are_refused():
    c = circuit_from_volts(240, 1)
    assert load_amps(30, "a", c) == 30
    with pytest.raises(LoadError):
        load_amps(5, "kW", c, pf=0)
    with pytest.raises(LoadError):
        load_amps(float("nan"), "A", c)
    with pytest.raises(LoadError):
        load_amps(5, "hp", c)


def test_a_multiwire_load_splits_over_its_two_hots():
    # 2400 VA balanced on 120/240 V: 10 A in each hot (S / 240 V)
    assert load_amps(2400, "VA", resolve_circuit("120/240V 1ph 3w", "MW")) == pytest.approx(10.0)


# -- the trade's other circuits: two circuits on a wye, the high-leg delta, 120/208 V 1ph 3w ------

@pytest.mark.parametrize(("text", "system_id"), [
    ("240/120 delta", "240/120V 3ph 4w delta"), ("240/120 3ph", "240/120V 3ph 4w delta"),
    ("120/208 1ph", "120/208V 1ph 3w"), ("120/208", "208Y/120V 3ph 4w"),
    ("120/240", "120/240V 1ph 3w"),
])
def test_the_high_leg_delta_and_120_208_single_phase_are_read(text, system_id):
    assert parse_system(text) == system_id


def test_two_circuits_on_a_wye_drop_root_three_i_z_thirty_degrees_off():
    # Two legs A and B of a 208Y/120 wye share the neutral; with equal currents I at the load
    # angle, the neutral carries I_A + I_B, of magnitude I (120 degrees apart). Leg A's drop is
    # I_A Z + (I_A + I_B) Z = I Z (2 + 1 at -120 deg) = I Z (1.5 - j0.866) = sqrt(3) I Z at
    # -30 deg (Kirchhoff's voltage law; phasors by hand). The neutral counts as current-carrying
    # (NEC 310.15(E)(2)); the hots open together (NEC 210.4(B)).
    c = resolve_circuit("208Y/120V 3ph 4w", "MW2")
    assert (c.volts, c.hots, c.neutral, c.neutral_is_ccc) == (120.0, 2, True, True)
    assert c.drop_factor == pytest.approx(math.sqrt(3)) and c.drop_angle_deg == 30.0
    assert current_carrying_conductors(c) == 3
    assert any("210.4(B)" in n for n in c.notes) and any("310.15(E)(2)" in n for n in c.notes)
    phasor = 2 + complex(math.cos(math.radians(-120)), math.sin(math.radians(-120)))
    assert abs(phasor) == pytest.approx(math.sqrt(3))
    assert math.degrees(math.atan2(phasor.imag, phasor.real)) == pytest.approx(-30)


def test_a_two_circuit_multiwire_on_a_wye_drops_half_again_a_balanced_one_by_dc():
    # NEC 2023 Ch. 9 Table 8: 12 AWG stranded uncoated Cu 1.98 ohm/kft at 75 C. 16 A per leg,
    # 100 ft, DC method (resistance only): the worse leg's in-phase drop is
    # sqrt(3) cos 30 deg x I R L = 1.5 x 16 x 1.98 x 0.1 = 4.752 V = 3.96 % of 120 V; a
    # balanced 120/240 V multiwire, whose neutral carries nothing, drops 1 x I R L = 3.168 V.
    from gaugewalk.model.engine.contract import RunSpec
    from gaugewalk.model.engine.sizing import evaluate

    def drop(system: str) -> float:
        c = resolve_circuit(system, "MW2")
        spec = RunSpec(circuit=c, amps=16.0, length_ft=100.0, size="12 AWG", method="dc",
                       max_drop_pct=10.0)
        return evaluate(spec).voltage_drop_v

    assert drop("208Y/120V 3ph 4w") == pytest.approx(4.752, rel=1e-3)
    assert drop("120/240V 1ph 3w") == pytest.approx(3.168, rel=1e-3)


def test_120_208_single_phase_three_wire_is_two_phases_of_a_wye():
    # its multiwire is the two-circuit multiwire on a wye; no three-phase loads
    mw = resolve_circuit("120/208V 1ph 3w", "MW")
    assert mw.drop_angle_deg == 30.0 and mw.neutral_is_ccc
    assert resolve_circuit("120/208V 1ph 3w", "LL").volts == 208.0
    with pytest.raises(CircuitError, match="single-phase"):
        resolve_circuit("120/208V 1ph 3w", "3P")


def test_the_high_leg_delta_marks_its_high_leg_and_keeps_120_v_loads_off_it():
    # NEC 110.15: on a 4-wire delta the phase with the higher voltage to ground (about 208 V,
    # 240 x sqrt(3) / 2) is marked orange; 120 V loads go between A or C and the neutral.
    assert 240 * math.sqrt(3) / 2 == pytest.approx(207.8, abs=0.05)
    ln = resolve_circuit("240/120V 3ph 4w delta", "LN")
    assert ln.volts == 120.0 and any("110.15" in n and "A and C" in n for n in ln.notes)
    three = resolve_circuit("240/120V 3ph 4w delta", "3P")
    assert three.volts == 240.0 and three.drop_factor == pytest.approx(math.sqrt(3))
    # A and C with the neutral are the 120/240 V single-phase of the centre-tapped winding: the
    # neutral carries only the unbalance (NEC 310.15(E)(1))
    mw = resolve_circuit("240/120V 3ph 4w delta", "MW")
    assert (mw.drop_factor, mw.neutral_is_ccc) == (1.0, False)
