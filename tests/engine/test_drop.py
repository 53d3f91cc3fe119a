"""Voltage-drop formulas against NEC Ch. 9 Tables 8 and 9 and worked examples."""

import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from gaugewalk.model.engine.circuits import circuit_from_volts
from gaugewalk.model.engine.drop import (
    K_FACTOR,
    conductor_z,
    drop_volts,
    effective_z,
    kfactor_z,
    temperature_corrected,
    voltage_drop,
)
from gaugewalk.model.walk.chain import cumulative_drop, upstream_drop, within_limit
from gaugewalk.tables.conductor import impedance
from gaugewalk.tables.conductor import properties as conductors
from gaugewalk.tables.conductor.sizes import SIZES

POWER_SIZES_CU = SIZES[SIZES.index("14 AWG"):]
POWER_SIZES_AL = SIZES[SIZES.index("12 AWG"):]


@pytest.mark.parametrize(("material", "sizes"), [("cu", POWER_SIZES_CU), ("al", POWER_SIZES_AL)])
def test_k_factor_and_table_8_resistance_agree_within_two_percent(material, sizes):
    # K = R [ohm/kft] x cmil / 1000 is the resistance of a one-circular-mil, one-foot conductor.
    # NEC Ch. 9 Table 8 at 75 C gives K = 12.86..12.94 for copper and 21.0..21.2 for aluminum
    # across the sizes (stranding lay and rounding of the printed R), so the K-factor method
    # (K 12.9 Cu, 21.2 Al, common practice) and the DC method agree within about 1-2%.
    for size in sizes:
        dc = conductor_z(size, material, "dc")
        kf = conductor_z(size, material, "kfactor")
        assert kf == pytest.approx(dc, rel=0.02), size


def test_table_8_resistance_times_area_gives_the_k_factor_for_12_awg_copper():
    # NEC 2023 Ch. 9 Table 8: 12 AWG stranded Cu 1.98 ohm/kft, 6530 cmil -> K = 12.93
    assert 1.98 * 6530 / 1000 == pytest.approx(K_FACTOR["cu"], rel=0.003)
    # 500 kcmil Al 0.0424 ohm/kft -> K = 21.2
    assert 0.0424 * 500_000 / 1000 == pytest.approx(K_FACTOR["al"], rel=0.001)


def half_unit(printed: float) -> float:
    """Half a unit in the last place of a value printed to two significant figures."""
    return 0.5 * 10 ** (math.floor(math.log10(printed)) - 1)


@pytest.mark.parametrize("family", ["pvc", "aluminum", "steel"])
@pytest.mark.parametrize("material", ["cu", "al"])
def test_ac_method_at_085_reproduces_table_9_effective_z(material, family):
    # NEC 2023 Ch. 9 Table 9 note 2: Ze = R cos(theta) + XL sin(theta). The table's Ze column is
    # this formula at pf 0.85 from unrounded R and XL, all printed to two significant figures.
    # So Ze computed from the printed R and XL, widened by their rounding, must overlap the
    # printed Ze widened by its rounding; and it lands within 6% of it.
    sin = math.sqrt(1 - 0.85**2)
    sizes = impedance.TABLE9_SIZES if material == "cu" else impedance.TABLE9_SIZES_AL
    for size in sizes:
        r = impedance.ac_resistance(size, material, family)
        x = impedance.reactance(size, family)
        ours = conductor_z(size, material, "ac", pf=0.85, family=family)
        assert ours == pytest.approx(r * 0.85 + x * sin, rel=1e-12)
        table = impedance.table_ze_085(size, material, family)
        lo = (r - half_unit(r)) * 0.85 + (x - half_unit(x)) * sin
        hi = (r + half_unit(r)) * 0.85 + (x + half_unit(x)) * sin
        assert lo <= table + half_unit(table) and table - half_unit(table) <= hi, (size, ours,
                                                                                   table)
        assert ours == pytest.approx(table, rel=0.06), (size, ours, table)


def test_effective_z_at_unity_power_factor_is_the_resistance():
    # Table 9 note 2 with theta = 0: Ze = R
    assert effective_z(0.2, 0.05, 1.0) == pytest.approx(0.2)


def test_effective_z_by_hand_for_250_kcmil_copper_in_steel():
    # NEC 2023 Ch. 9 Table 9, 250 kcmil Cu, steel conduit: R = 0.054, XL = 0.052 ohm/kft
    # Ze = 0.054 x 0.85 + 0.052 x sqrt(1 - 0.85^2) = 0.0459 + 0.052 x 0.5268 = 0.07329
    assert effective_z(0.054, 0.052, 0.85) == pytest.approx(0.0459 + 0.052 * 0.52678, rel=1e-4)
    assert conductor_z("250 kcmil", "cu", "ac", pf=0.85, family="steel") == pytest.approx(0.07329,
                                                                                          rel=1e-3)


def test_worked_example_12_awg_copper_20_a_100_ft_at_120_v():
    # From memory (a classic handbook case), arithmetic by hand from NEC Ch. 9 Table 8:
    # VD = 2 x 20 A x 100 ft x 1.98 ohm/kft / 1000 = 7.92 V, 7.92 / 120 = 6.6 %
    circuit = circuit_from_volts(120, 1)
    d = voltage_drop(circuit, 20, 100, conductor_z("12 AWG", "cu", "dc"))
    assert d.volts == pytest.approx(7.92, abs=0.005)
    assert d.pct == pytest.approx(6.6, abs=0.005)
    # the same by K-factor: 2 x 12.9 x 20 x 100 / 6530 = 7.90 V
    k = voltage_drop(circuit, 20, 100, conductor_z("12 AWG", "cu", "kfactor"))
    assert k.volts == pytest.approx(2 * 12.9 * 20 * 100 / 6530, rel=1e-9)
    assert k.volts == pytest.approx(7.90, abs=0.005)


def test_worked_example_three_phase_3_awg_by_k_factor():
    # From memory (the usual three-phase K-factor example form), by hand:
    # VD = sqrt(3) x 12.9 x 100 A x 200 ft / 52,620 cmil = 8.49 V; 8.49 / 480 = 1.77 %
    circuit = circuit_from_volts(480, 3)
    d = voltage_drop(circuit, 100, 200, kfactor_z(12.9, conductors.circular_mils("3 AWG")))
    assert d.volts == pytest.approx(math.sqrt(3) * 12.9 * 100 * 200 / 52620, rel=1e-9)
    assert d.volts == pytest.approx(8.49, abs=0.01)
    assert d.pct == pytest.approx(1.77, abs=0.01)


def test_worked_example_ac_feeder_250_kcmil_in_steel():
    # By hand from NEC Ch. 9 Table 9 (Ze at 0.85 PF, Cu, steel: 0.073 ohm/kft... computed 0.07329):
    # VD = sqrt(3) x 200 A x 0.07329 x 300 ft / 1000 = 7.62 V; 7.62 / 480 = 1.59 %
    z = conductor_z("250 kcmil", "cu", "ac", pf=0.85, family="steel")
    d = voltage_drop(circuit_from_volts(480, 3), 200, 300, z)
    assert d.volts == pytest.approx(1.7320508 * 200 * 0.07329 * 300 / 1000, rel=1e-3)
    assert d.pct == pytest.approx(1.59, abs=0.01)


def test_resistance_follows_the_table_8_temperature_correction():
    # NEC Ch. 9 Table 8 note 2: R2 = R1 [1 + 0.00323 (T2 - 75)] for copper
    r20 = conductor_z("10 AWG", "cu", "dc", temp_c=20.0)
    assert r20 == pytest.approx(1.24 * (1 + 0.00323 * (20 - 75)), rel=1e-9)
    assert temperature_corrected(1.0, 0.00330, 90.0) == pytest.approx(1.0495)
    hot_ac = conductor_z("4 AWG", "cu", "ac", pf=1.0, family="pvc", temp_c=90.0)
    assert hot_ac == pytest.approx(0.31 * (1 + 0.00323 * 15), rel=1e-9)


def test_parallel_sets_and_distributed_loads_halve_the_drop():
    # parallel sets divide the impedance (common practice); an evenly spread load drops as the
    # whole load at half the length (common practice)
    c = circuit_from_volts(208, 3)
    one = voltage_drop(c, 400, 250, 0.05)
    assert voltage_drop(c, 400, 250, 0.05, sets=2).volts == pytest.approx(one.volts / 2)
    spread = voltage_drop(c, 400, 250, 0.05, distributed=True)
    assert spread.volts == pytest.approx(one.volts / 2)
    assert spread.length_ft == 125


def test_ac_method_needs_a_raceway_family_and_a_known_method():
    with pytest.raises(ValueError):
        conductor_z("12 AWG", "cu", "ac", family=None)
    with pytest.raises(ValueError):
        conductor_z("12 AWG", "cu", "magic")


sizes_st = st.sampled_from(impedance.TABLE9_SIZES)
methods_st = st.sampled_from(["dc", "kfactor", "ac"])
families_st = st.sampled_from(["pvc", "aluminum", "steel"])
pf_st = st.floats(min_value=0.5, max_value=1.0)


@given(methods_st, sizes_st, families_st, pf_st,
       st.floats(min_value=1, max_value=800), st.floats(min_value=1, max_value=2000),
       st.floats(min_value=1.01, max_value=3))
def test_drop_grows_with_length_and_current(method, size, family, pf, amps, length, more):
    # VD = k I Z L / 1000 is proportional to I and to L (Ohm's law)
    z = conductor_z(size, "cu", method, pf=pf, family=family)
    c = circuit_from_volts(240, 1)
    base = voltage_drop(c, amps, length, z).volts
    assert voltage_drop(c, amps * more, length, z).volts > base
    assert voltage_drop(c, amps, length * more, z).volts > base


@given(methods_st, families_st, pf_st,
       st.integers(min_value=0, max_value=len(impedance.TABLE9_SIZES) - 2))
def test_drop_falls_as_the_size_grows(method, family, pf, i):
    # a larger conductor has less resistance (NEC Ch. 9 Tables 8 and 9), so less drop
    small, big = impedance.TABLE9_SIZES[i], impedance.TABLE9_SIZES[i + 1]
    z_small = conductor_z(small, "cu", method, pf=pf, family=family)
    z_big = conductor_z(big, "cu", method, pf=pf, family=family)
    assert z_big <= z_small


@given(sizes_st, st.floats(min_value=1, max_value=500), st.floats(min_value=1, max_value=1000))
def test_three_phase_drop_is_root_three_over_two_of_single_phase(size, amps, length):
    # sqrt(3) I Z L against 2 I Z L for the same current, length and size (common practice)
    z = conductor_z(size, "cu", "dc")
    one = drop_volts(2.0, amps, z, length)
    three = voltage_drop(circuit_from_volts(480, 3), amps, length, z).volts
    assert three == pytest.approx(one * math.sqrt(3) / 2, rel=1e-12)


def test_cumulative_drop_adds_along_the_chain_and_restarts_after_a_transformer():
    # percent drops in series add (common practice); a transformer secondary starts over
    assert cumulative_drop([1.0, 1.5, 2.0]) == pytest.approx([1.0, 2.5, 4.5])
    assert cumulative_drop([1.0, 1.5, 0.5, 2.0], restart_at=[2]) == pytest.approx(
        [1.0, 2.5, 0.5, 2.5])
    assert cumulative_drop([]) == []
    assert upstream_drop(2.5) == 2.5
    assert upstream_drop(2.5, from_transformer=True) == 0.0
    assert upstream_drop(None) == 0.0
    assert within_limit(5.0, 5.0) and not within_limit(5.01, 5.0)
