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
