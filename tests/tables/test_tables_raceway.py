"""NEC Ch. 9 Tables 1, 4 and 5 and raceway names (gaugewalk.tables.raceway.fill)."""

import math

import pytest

from gaugewalk.tables.conductor.properties import bare_area_in2, diameter_in
from gaugewalk.tables.conductor.sizes import SIZES
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.raceway.fill import (
    RACEWAY_TYPES,
    TABLE5_INSULATIONS,
    TRADE_SIZES,
    fill_limit_pct,
    insulated_area_in2,
    insulated_diameter_in,
    internal_area_in2,
    internal_diameter_in,
    parse_raceway,
    raceway_family,
    trade_sizes,
)


@pytest.mark.parametrize(("n", "pct"), [(1, 53.0), (2, 31.0), (3, 40.0), (4, 40.0), (40, 40.0)])
def test_fill_limits_of_table_1(n, pct):
    # NEC 2023 Ch. 9 Table 1
    assert fill_limit_pct(n) == pct


@pytest.mark.parametrize("n", [0, -2, 1.5, True])
def test_fill_limit_needs_a_whole_positive_count(n):
    with pytest.raises(TableLookupError):
        fill_limit_pct(n)


@pytest.mark.parametrize("raceway", list(RACEWAY_TYPES))
def test_table_4_areas_are_pi_over_4_of_the_internal_diameter(raceway):
    # NEC Ch. 9 Table 4: total area 100 % = pi/4 * ID^2, printed to 3 decimals
    for trade in trade_sizes(raceway):
        d = internal_diameter_in(raceway, trade)
        assert internal_area_in2(raceway, trade) == pytest.approx(math.pi / 4 * d * d,
                                                                  abs=0.0006)


@pytest.mark.parametrize("raceway", list(RACEWAY_TYPES))
def test_trade_sizes_run_in_order_and_areas_grow(raceway):
    sizes = trade_sizes(raceway)
    assert sizes[0] == "1/2"
    assert list(sizes) == [t for t in TRADE_SIZES if t in sizes]
    areas = [internal_area_in2(raceway, t) for t in sizes]
    assert areas == sorted(areas) and len(set(areas)) == len(areas)


def test_table_4_spot_values_and_relations_between_types():
    # NEC 2023 Ch. 9 Table 4 (Articles 358, 342, 344, 352, 362)
    assert internal_area_in2("EMT", "1/2") == 0.304
    assert internal_area_in2("EMT", "3/4") == 0.533
    assert internal_area_in2("EMT", "1") == 0.864
    assert internal_area_in2("RMC", "2") == 3.408
    assert internal_area_in2("PVC-40", "2") == 3.291
    assert internal_area_in2("PVC-80", "2") == 2.874
    assert internal_area_in2("ARMC", "2") == internal_area_in2("RMC", "2")
    assert internal_area_in2("HDPE", "3") == internal_area_in2("PVC-40", "3")
    # common practice: Schedule 80 walls are thicker, so less room than Schedule 40
    for trade in trade_sizes("PVC-80"):
        assert internal_area_in2("PVC-80", trade) < internal_area_in2("PVC-40", trade)
    assert trade_sizes("EMT")[-1] == "4" and trade_sizes("RMC")[-1] == "6"
    assert trade_sizes("ENT")[-1] == "2"


def test_trade_size_spellings_and_refusals():
    assert internal_area_in2("emt", "1 1/4") == internal_area_in2("EMT", "1-1/4") == 1.496
    assert internal_area_in2("EMT", '2"') == 3.356
    with pytest.raises(TableLookupError, match="no trade size '5' of EMT.*sizes are 1/2, 3/4"):
        internal_area_in2("EMT", "5")


@pytest.mark.parametrize(
    ("typed", "name", "family"),
    # NEC articles: 358 EMT, 342 IMC, 344 RMC, 352 PVC, 353 HDPE, 362 ENT, 348 FMC, 350 LFMC;
    # Table 9 family: steel, aluminum or PVC (nonmagnetic)
    [("emt", "EMT", "steel"), ("EMT", "EMT", "steel"), ("pvc40", "PVC-40", "pvc"),
     ("PVC-40", "PVC-40", "pvc"), ("pvc 40", "PVC-40", "pvc"), ("pvc", "PVC-40", "pvc"),
     ("Schedule 40 PVC", "PVC-40", "pvc"), ("sch 80 pvc", "PVC-80", "pvc"),
     ("PVC sch. 80", "PVC-80", "pvc"), ("pvc80", "PVC-80", "pvc"), ("rigid", "RMC", "steel"),
     ("GRC", "RMC", "steel"), ("rmc", "RMC", "steel"), ("imc", "IMC", "steel"),
     ("aluminum RMC", "ARMC", "aluminum"), ("ARMC", "ARMC", "aluminum"),
     ("aluminium rigid", "ARMC", "aluminum"), ("ent", "ENT", "pvc"), ("hdpe", "HDPE", "pvc"),
     ("fmc", "FMC", "steel"), ("flex", "FMC", "steel"), ("liquidtight", "LFMC", "steel"),
     ("LFMC", "LFMC", "steel")],
)
def test_raceway_spellings(typed, name, family):
    assert parse_raceway(typed) == name
    assert raceway_family(typed) == family
    assert RACEWAY_TYPES[name].family == family


@pytest.mark.parametrize("typed", ["pvc 60", "conduit", "", "tube", "emtx"])
def test_unknown_raceways_are_refused_with_the_types(typed):
    with pytest.raises(TableLookupError) as err:
        parse_raceway(typed)
    assert str(err.value) == (f"no raceway type '{typed}'; types are EMT, IMC, RMC, ARMC, "
                              "PVC-40, PVC-80, HDPE, ENT, FMC, LFMC")


def test_family_names_pass_through_and_bad_ones_list_both_choices():
    assert [raceway_family(f) for f in ("pvc", "Aluminum", "STEEL")] == ["pvc", "aluminum",
                                                                         "steel"]
    with pytest.raises(TableLookupError, match="families are pvc, aluminum, steel"):
        raceway_family("wood")
    assert {r.article for r in RACEWAY_TYPES.values()} >= {"358", "342", "344", "352", "362"}


INSULATED_CASES = [(s, i) for i in ("THHN", "XHHW", "THW") for s in SIZES
                   if s not in ("18 AWG", "16 AWG")
                   and not (i == "THHN" and s in ("1250 kcmil", "1500 kcmil", "1750 kcmil",
                                                  "2000 kcmil"))]


@pytest.mark.parametrize(("size", "insulation"), INSULATED_CASES)
def test_table_5_areas_are_pi_over_4_of_the_diameter(size, insulation):
    # NEC Ch. 9 Table 5: approximate area = pi/4 * approximate diameter^2 (4 decimals)
    d = insulated_diameter_in(size, insulation)
    assert insulated_area_in2(size, insulation) == pytest.approx(math.pi / 4 * d * d,
                                                                 abs=0.00006)


@pytest.mark.parametrize(("size", "insulation"), INSULATED_CASES)
def test_an_insulated_conductor_is_bigger_than_the_bare_one(size, insulation):
    # NEC Ch. 9 Table 5 against Table 8: insulation adds area
    assert insulated_area_in2(size, insulation) > bare_area_in2(size)
    assert insulated_diameter_in(size, insulation) > diameter_in(size)


def test_table_5_spot_values_and_type_groups():
    # NEC 2023 Ch. 9 Table 5
    assert insulated_area_in2("12 AWG", "THHN") == 0.0133
    assert insulated_area_in2("12", "THWN-2") == 0.0133
    assert insulated_area_in2("12", "THHN/THWN-2") == 0.0133
    assert insulated_area_in2("10 AWG", "thhn") == 0.0211
    assert insulated_area_in2("4/0", "XHHW-2") == 0.3197
    assert insulated_area_in2("14", "TW") == 0.0139
    assert insulated_area_in2("500", "THW") == 0.7901
    # common practice: nylon-jacketed THHN is the slimmest of these at 14-10 AWG
    for size in ("14", "12", "10"):
        assert insulated_area_in2(size, "THHN") < insulated_area_in2(size, "XHHW")
    assert set(TABLE5_INSULATIONS) >= {"THHN", "THWN-2", "XHHW", "XHHW-2", "THW", "TW"}


def test_table_5_refusals_name_the_group_and_sizes():
    with pytest.raises(TableLookupError, match="no 16 AWG THHN/THWN/THWN-2; sizes are 14 AWG"):
        insulated_area_in2("16", "THHN")
    with pytest.raises(TableLookupError, match="no 1250 kcmil THHN"):
        insulated_area_in2("1250", "THHN")
    with pytest.raises(TableLookupError, match="no 6 AWG TW"):
        insulated_area_in2("6", "TW")
    with pytest.raises(TableLookupError, match="no Table 5 areas for RHH"):
        insulated_area_in2("6", "RHH")
