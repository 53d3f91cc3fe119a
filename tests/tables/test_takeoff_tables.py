"""Data the takeoff leans on: colour schemes, put-ups and raceway installation rules."""

from __future__ import annotations

import pytest

from gaugewalk.tables.order import colours, putups
from gaugewalk.tables.raceway import install as raceway_install
from gaugewalk.tables.raceway.install import install_rule, joints_for, sticks_for, supports_for

# --- colours -------------------------------------------------------------------------------

def test_every_default_scheme_meets_the_identification_rules():
    # NEC 2023 200.6(A) (neutral white or gray), 200.7 (white/gray not for phases),
    # 250.119 (EGC bare, green, or green with yellow stripes)
    for scheme in colours.SCHEMES.values():
        assert colours.check_scheme(scheme) == [], scheme.key


def test_customary_phase_colours_for_the_two_wye_systems():
    # common practice: black/red/blue at 208Y/120 V, brown/orange/yellow at 480Y/277 V
    assert colours.scheme("208Y/120").phases == ("black", "red", "blue")
    assert colours.scheme("480Y/277").phases == ("brown", "orange", "yellow")
    # NEC 200.6(D): grounded conductors of two systems told apart, white for one, gray for the other
    assert colours.scheme("208Y/120").neutral == "white"
    assert colours.scheme("480Y/277").neutral == "gray"


def test_high_leg_of_a_four_wire_delta_is_orange_in_the_b_position():
    # NEC 110.15 (orange), NEC 408.3(E)(1) (B phase)
    delta = colours.scheme_for_system(240, 3, neutral=True)
    assert delta.phase_colour(1) == "orange"
    assert "110.15" in delta.phase_source


def test_single_phase_120_240_is_black_and_red_with_white_neutral():
    # common practice; neutral NEC 200.6(A)
    scheme = colours.scheme_for_system(240, 1, neutral=True)
    assert scheme.phases == ("black", "red") and scheme.neutral == "white"


def test_a_green_phase_or_red_neutral_is_reported_with_its_section():
    bad = colours.ColourScheme("x", "test system", ("green", "red"), "red", egc="blue")
    problems = " ".join(colours.check_scheme(bad))
    assert "NEC 200.6(A)" in problems  # neutral red
    assert "NEC 250.119" in problems   # EGC blue, phase green
    assert "NEC 200.7" in problems


def test_unknown_scheme_lists_the_known_ones():
    with pytest.raises(KeyError, match="208Y/120"):
        colours.scheme("600Y/347")
    with pytest.raises(KeyError, match="600 V"):
        colours.scheme_for_system(600, 3, neutral=True)


def test_asking_for_a_fourth_phase_colour_is_refused():
    with pytest.raises(ValueError, match="no phase number 4"):
        colours.scheme("208Y/120").phase_colour(3)


# --- put-ups ---------------------------------------------------------------------------------

def test_small_sizes_come_in_boxes_and_reels_large_sizes_only_on_reels():
    # common practice: 500 ft boxes for 14-10 AWG; 1,000 and 2,500 ft reels
    assert [p.length_ft for p in putups.putups_for("12 AWG")] == [500, 1000, 2500]
    assert [p.length_ft for p in putups.putups_for("4/0 AWG")] == [1000, 2500]
    assert putups.putups_for("2000 kcmil") == ()


def test_a_put_up_of_no_length_is_refused():
    with pytest.raises(ValueError, match="more than 0 ft"):
        putups.PutUp("empty", 0, ("12 AWG",))


# --- raceway installation --------------------------------------------------------------------

@pytest.mark.parametrize(
    ("raceway", "family"),
    [("EMT", "EMT"), ("PVC-40", "PVC"), ("PVC Sch 80", "PVC"), ("rmc", "RMC"),
     ("LFMC", "LFMC"), ("FMC", "FMC"), ("LFNC-B", "LFNC"), ("ARMC", "RMC"), ("rigid", "RMC"),
     ("sch 80 pvc", "PVC"), ("HDPE", "HDPE")],
)
def test_raceway_names_find_their_article(raceway, family):
    assert install_rule(raceway).family == family


def test_unknown_raceway_lists_the_known_types():
    with pytest.raises(KeyError, match="EMT, IMC"):
        install_rule("cable tray")


@pytest.mark.parametrize(
    ("raceway", "trade_size", "spacing_ft"),
    [
        ("EMT", "4", 10.0),        # NEC 358.30(A): at most every 10 ft
        ("RMC", "3/4", 10.0),      # NEC Table 344.30(B)(2), 1/2-3/4 (from memory)
        ("RMC", "1", 12.0),        # NEC Table 344.30(B)(2), 1
        ("RMC", "1-1/4", 14.0),    # NEC Table 344.30(B)(2), 1-1/4-1-1/2
        ("IMC", "2-1/2", 16.0),    # NEC 342.30(B)(2) -> Table 344.30(B)(2), 2-2-1/2
        ("RMC", "4", 20.0),        # NEC Table 344.30(B)(2), 3 and larger
        ("PVC-40", "1", 3.0),      # NEC Table 352.30, 1/2-1 (from memory)
        ("PVC-40", "2", 5.0),      # NEC Table 352.30, 1-1/4-2
        ("PVC-80", "3", 6.0),      # NEC Table 352.30, 2-1/2-3
        ("PVC-40", "4", 7.0),      # NEC Table 352.30, 3-1/2-5
        ("PVC-40", "6", 8.0),      # NEC Table 352.30, 6
        ("ENT", "1", 3.0),         # NEC 362.30(A): at most every 3 ft
        ("FMC", "3/4", 4.5),       # NEC 348.30(A): at most every 4-1/2 ft
    ],
)
def test_support_spacing_follows_the_raceway_article(raceway, trade_size, spacing_ft):
    assert install_rule(raceway).max_spacing_ft(trade_size) == spacing_ft


def test_supports_within_three_feet_of_each_end_then_every_ten():
    # NEC 358.30(A). 100 ft EMT: ends at 3 ft and 97 ft, 94 ft between -> ceil(94/10) = 10 gaps,
    # 11 supports
    assert supports_for(100, 3, 10) == 11
    # 26 ft: 20 ft between the end supports -> exactly 2 gaps of 10 ft -> 3 supports
    assert supports_for(26, 3, 10) == 3
    # 6 ft: one support in the middle is within 3 ft of both ends
    assert supports_for(6, 3, 10) == 1
    assert supports_for(0, 3, 10) == 0


def test_supports_of_pvc_at_three_feet():
    # NEC Table 352.30, 1/2-1 at 3 ft: 20 ft run, 14 ft between end supports -> ceil(14/3) = 5 gaps
    assert supports_for(20, 3, 3) == 6


def test_sticks_and_couplings_of_ten_foot_lengths():
    # common practice, 10 ft lengths: 95 ft -> 10 sticks, 9 joints; 100 ft -> 10 sticks, 9 joints
    assert (sticks_for(95, 10), joints_for(95, 10)) == (10, 9)
    assert (sticks_for(100, 10), joints_for(100, 10)) == (10, 9)
    assert (sticks_for(100.0000000001, 10), joints_for(5, 10)) == (10, 0)


def test_underground_hdpe_gets_no_supports():
    # NEC 353.10: HDPE is for underground and encased use, so no xxx.30 spacing applies
    rule = install_rule("HDPE")
    assert rule.max_spacing_ft("2") is None
    assert supports_for(100, rule.end_ft, None) == 0


def test_every_raceway_type_of_the_fill_tables_has_installation_data():
    from gaugewalk.tables.raceway.fill import RACEWAY_TYPES
    for name, kind in RACEWAY_TYPES.items():
        # the article of the installation rule is the article of the fill table row
        assert install_rule(name).article == f"NEC Article {kind.article}", name


def test_rigid_conduit_sticks_carry_their_coupling():
    # NEC 344.130 and 342.130: 10 ft lengths with a coupling attached (from memory)
    assert install_rule("RMC").coupling_attached and install_rule("IMC").coupling_attached
    assert not install_rule("EMT").coupling_attached


@pytest.mark.parametrize(("text", "value"), [("1/2", 0.5), ("3/4", 0.75), ("1", 1.0),
                                             ("1-1/4", 1.25), ("2-1/2", 2.5), ("6", 6.0)])
def test_trade_sizes_read_as_numbers(text, value):
    assert raceway_install.trade_size_value(text) == value


def test_a_garbled_trade_size_is_refused():
    with pytest.raises(ValueError, match="not a trade size"):
        raceway_install.trade_size_value("one inch")
