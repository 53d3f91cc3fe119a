"""NEC Ch. 9 Table 8 (gaugewalk.tables.conductor.properties) against the AWG definition, reference
libraries and the physics of resistivity."""

import itertools
import math

import pytest
from fluids.piping import t_from_gauge
from pint import UnitRegistry

from gaugewalk.tables.conductor.properties import (
    ALPHA,
    SOLID_SIZES,
    TABLE_8,
    bare_area_in2,
    circular_mils,
    dc_resistance,
    diameter_in,
)
from gaugewalk.tables.conductor.sizes import SIZES, is_awg
from gaugewalk.tables.errors import TableLookupError

UNITS: UnitRegistry = UnitRegistry()

AWG_SIZES = [s for s in SIZES if is_awg(s)]
KCMIL_SIZES = [s for s in SIZES if not is_awg(s)]


def gauge_number(size: str) -> int:
    """ASTM B258 gauge number: 1/0 .. 4/0 are 0, -1, -2, -3."""
    n = size.split()[0]
    return 1 - int(n.split("/")[0]) if "/" in n else int(n)


def fluids_gauge(size: str) -> float:
    """fluids encodes 1/0 as 0, and 2/0, 3/0, 4/0 as 0.5, 0.33, 0.25 (its AWG_gauges list)."""
    n = size.split()[0]
    return {"1/0": 0.0, "2/0": 0.5, "3/0": 0.33, "4/0": 0.25}[n] if "/" in n else float(n)


@pytest.mark.parametrize("size", AWG_SIZES)
def test_awg_areas_match_the_astm_b258_diameter_formula(size):
    # ASTM B258: d = 0.005 in * 92 ** ((36 - n) / 39); area [cmil] = (1000 d [in])^2.
    # Table 8 rounds areas to about 4 significant figures.
    d = 0.005 * 92 ** ((36 - gauge_number(size)) / 39)
    assert circular_mils(size) == pytest.approx((1000 * d) ** 2, rel=0.01)


@pytest.mark.parametrize("size", AWG_SIZES)
def test_awg_areas_match_the_fluids_wire_gauge_schedule(size):
    # fluids 1.3.1 fluids.piping.t_from_gauge(schedule="AWG"): diameter [m] (4 significant
    # figures); pint converts the diameter to inches and the area to circular mils.
    d = UNITS.Quantity(t_from_gauge(fluids_gauge(size), SI=True, schedule="AWG"), "m")
    area = (math.pi / 4 * d**2).to("circular_mil")  # 1 cmil = pi/4 mil^2
    assert circular_mils(size) == pytest.approx(area.magnitude, rel=0.01)


@pytest.mark.parametrize("size", KCMIL_SIZES)
def test_kcmil_sizes_are_their_own_area(size):
    # NEC Ch. 9 Table 8: 250 kcmil = 250,000 cmil (kcmil is a thousand circular mils, pint "kcmil")
    value = int(size.split()[0])
    assert circular_mils(size) == UNITS.Quantity(value, "kcmil").to("circular_mil").magnitude


@pytest.mark.parametrize("size", SIZES)
def test_metric_areas_agree_with_circular_mils_converted_by_pint(size):
    # NEC Ch. 9 Table 8 gives mm^2 beside cmil; pint: 1 circular_mil = 5.067e-4 mm^2
    mm2 = UNITS.Quantity(circular_mils(size), "circular_mil").to("mm**2").magnitude
    assert TABLE_8[size].area_mm2 == pytest.approx(mm2, rel=0.005)


@pytest.mark.parametrize("size", SIZES)
def test_overall_areas_are_pi_over_4_of_the_diameter_within_the_table_rounding(size):
    # NEC Ch. 9 Table 8 columns "overall diameter" and "overall area" (3 decimals, in^2).
    # 12 AWG stranded is printed 0.006 although pi/4 * 0.092^2 = 0.0066 (from memory).
    for wire in (TABLE_8[size].stranded, TABLE_8[size].solid):
        if wire is None:
            continue
        computed = math.pi / 4 * wire.dia_in**2
        assert wire.area_in2 == pytest.approx(computed, rel=0.005, abs=0.0007)


@pytest.mark.parametrize("size", SIZES)
def test_strands_fill_the_conductor_area(size):
    # Concentric-lay stranding (ASTM B8): strands * d_strand^2 [mil^2 = cmil] is the area, within
    # the rounding of the strand diameter to 0.001 in.
    wire = TABLE_8[size].stranded
    total = wire.strands * (1000 * wire.strand_dia_in) ** 2
    tolerance = 2 * 0.0005 / wire.strand_dia_in + 0.01
    assert total == pytest.approx(circular_mils(size), rel=tolerance)
    assert wire.strands in (7, 19, 37, 61, 91, 127)  # concentric counts 1+6k (common practice)


# IACS (International Annealed Copper Standard, IEC 60028 / ASTM B193): 100 % conductivity is
# 0.15328 ohm g/m^2, i.e. 10.371 ohm cmil/ft at 20 C, with alpha20 = 0.00393 /C (from memory).
# EC aluminum (ASTM B230/B609, 1350 alloy) is 61 % IACS with alpha20 = 0.00403 /C (from memory).
RHO20 = {"cu": 10.371, "al": 10.371 / 0.61}
ALPHA20 = {"cu": 0.00393, "al": 0.00403}


def physics_r75(size: str, material: str) -> float:
    """R = rho L / A at 75 C [ohm/kft] for a solid round wire."""
    rho75 = RHO20[material] * (1 + ALPHA20[material] * (75 - 20))
    return rho75 * 1000 / circular_mils(size)


@pytest.mark.parametrize("material", ["cu", "al"])
@pytest.mark.parametrize("size", SOLID_SIZES)
def test_solid_resistance_matches_resistivity_times_length_over_area(size, material):
    assert dc_resistance(size, material, stranded=False) == pytest.approx(
        physics_r75(size, material), rel=0.006)


@pytest.mark.parametrize("material", ["cu", "al"])
@pytest.mark.parametrize("size", SIZES)
def test_stranded_resistance_is_the_solid_value_plus_the_stranding_increment(size, material):
    # ASTM B8: the lay of the strands makes them about 1-3 % longer than the conductor
    # (Table 8 uses about 2 %).
    ratio = dc_resistance(size, material) / physics_r75(size, material)
    assert 1.01 <= ratio <= 1.03


@pytest.mark.parametrize("size", SIZES)
def test_coated_copper_is_a_few_percent_above_uncoated(size):
    # NEC Ch. 9 Table 8: the tin coating conducts less than the copper it replaces (from memory)
    ratio = dc_resistance(size, "cu", coated=True) / dc_resistance(size, "cu")
    assert 1.01 <= ratio <= 1.07


def test_resistance_and_area_are_monotonic_in_size():
    # NEC Ch. 9 Table 8: larger conductors have more area and less resistance
    for small, large in itertools.pairwise(SIZES):
        assert circular_mils(large) > circular_mils(small)
        assert diameter_in(large) > diameter_in(small)
        assert bare_area_in2(large) >= bare_area_in2(small)
        for material in ("cu", "al"):
            assert dc_resistance(large, material) < dc_resistance(small, material)


def test_temperature_correction_follows_table_8_note_2():
    # NEC Ch. 9 Table 8 note 2: R2 = R1 [1 + alpha (T2 - 75)], alpha Cu 0.00323, Al 0.00330
    assert ALPHA == {"cu": 0.00323, "al": 0.00330}
    assert dc_resistance("12 AWG", "cu", temp_c=20) == pytest.approx(1.98 * (1 - 0.00323 * 55))
    assert dc_resistance("4/0", "al", temp_c=90) == pytest.approx(0.100 * (1 + 0.00330 * 15))
    assert dc_resistance("12 AWG", "cu", temp_c=75) == 1.98


def test_spot_values_of_table_8():
    # NEC 2023 Ch. 9 Table 8 (checked against a printed reproduction for 14 AWG - 600 kcmil)
    assert dc_resistance("14", "cu", stranded=False) == 3.07
    assert dc_resistance("12", "cu") == 1.98
    assert dc_resistance("4/0", "cu") == 0.0608
    assert dc_resistance("500", "al") == 0.0424
    assert circular_mils("1/0") == 105600


def test_solid_conductors_beyond_8_awg_are_refused_with_the_listed_sizes():
    # NEC Ch. 9 Table 8 lists solid conductors for 18 AWG through 8 AWG only
    assert SOLID_SIZES == ("18 AWG", "16 AWG", "14 AWG", "12 AWG", "10 AWG", "8 AWG")
    with pytest.raises(TableLookupError, match="solid sizes are 18 AWG, .*8 AWG"):
        dc_resistance("6 AWG", "cu", stranded=False)
    with pytest.raises(TableLookupError, match="materials are cu, al"):
        dc_resistance("6 AWG", "steel")
