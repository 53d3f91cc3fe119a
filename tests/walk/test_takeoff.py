"""The takeoff arithmetic on runs worked by hand (the pure core, no walk file)."""

from __future__ import annotations

import itertools
import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from gaugewalk.model.walk.takeoff import (
    RunMaterial,
    TakeoffError,
    TakeoffSettings,
    conductor_footage,
    order_putups,
    phase_colours_for,
    takeoff_from_runs,
)
from gaugewalk.tables.order import colours
from gaugewalk.tables.order.putups import DEFAULT_PUTUPS, PutUp, putups_for

SETTINGS = TakeoffSettings(slack_per_end_ft=2.0, waste_pct=10.0)

# A feeder in two parallel sets and two 120 V branch circuits, all copper THHN/THWN-2.
FEEDER = RunMaterial(
    "F1", 150.0, 2, "cu", "THHN/THWN-2", "3/0 AWG", ("black", "red", "blue"),
    neutral_size="3/0 AWG", neutral_colour="white", egc_size="4 AWG", egc_colour="green",
    raceway="PVC-40", raceway_size="2", bends=3,
)
BRANCH_A = RunMaterial(
    "B1", 60.0, 1, "cu", "THHN/THWN-2", "12 AWG", ("black",), neutral_size="12 AWG",
    egc_size="12 AWG", raceway="EMT", raceway_size="1/2", bends=1,
)
BRANCH_B = RunMaterial(
    "B2", 40.0, 1, "cu", "THHN/THWN-2", "12 AWG", ("black",), neutral_size="12 AWG",
    egc_size="12 AWG", raceway="EMT", raceway_size="1/2", bends=0,
)


@pytest.fixture(scope="module")
def takeoff():
    return takeoff_from_runs([FEEDER, BRANCH_A, BRANCH_B], SETTINGS)


def _wire(takeoff, size, function, colour):
    [line] = [w for w in takeoff.wire_lines
              if (w.size, w.function, w.colour) == (size, function, colour)]
    return line


def test_footage_is_length_plus_slack_times_conductors_times_sets():
    # (150 + 2 x 2) x 4 conductors x 2 sets = 154 x 8 = 1232 ft
    assert conductor_footage(150, 2, 4, 2) == 1232


def test_branch_conductors_add_up_per_colour(takeoff):
    # B1: 60 + 2 + 2 = 64 ft; B2: 40 + 2 + 2 = 44 ft; per colour 64 + 44 = 108 ft net
    # each cut with 10 % waste, rounded up: 64 x 1.10 = 70.4 -> 71; 44 x 1.10 = 48.4 -> 49
    # 71 + 49 = 120 ft on one 500 ft box, 500 - 120 = 380 ft offcut
    for function, colour in (("phase", "black"), ("neutral", "white"), ("EGC", "green")):
        line = _wire(takeoff, "12 AWG", function, colour)
        assert line.net_ft == 108.0
        assert [(c.run_id, c.ft) for c in line.cuts] == [("B1", 71), ("B2", 49)]
        assert line.with_waste_ft == 120
        assert [(p.label, p.count, p.offcut_ft) for p in line.order] == [("500 ft box", 1, 380)]
        assert line.left_over_ft == 380
        assert line.runs == ("B1", "B2")


def test_parallel_feeder_counts_each_set(takeoff):
    # F1 per conductor: (150 + 4) x 2 sets = 308 ft net; one cut per set: 154 x 1.10 = 169.4
    # -> 170 ft, two cuts = 340 ft. 3/0 AWG is cut to length by the supplier (common practice)
    # and 340 ft is less than its shortest reel (1,000 ft): 340 ft cut, nothing left over
    for function, colour in (("phase", "black"), ("phase", "red"), ("phase", "blue"),
                             ("neutral", "white")):
        line = _wire(takeoff, "3/0 AWG", function, colour)
        assert (line.net_ft, line.with_waste_ft, line.order_ft, line.left_over_ft) == (
            308, 340, 340, 0)
        assert [(c.run_id, c.set_no, c.ft) for c in line.cuts] == [("F1", 1, 170), ("F1", 2, 170)]
        assert [(p.label, p.length_ft, p.count) for p in line.order] == [("cut to length", 340, 1)]
    # NEC 250.122(F): an EGC in each parallel raceway, at its own size: 154 x 2 = 308 ft of 4 AWG
    assert _wire(takeoff, "4 AWG", "EGC", "green").net_ft == 308


def test_footage_by_size_sums_the_colours(takeoff):
    by_size = {(s.material, s.size): (s.net_ft, s.with_waste_ft) for s in takeoff.footage_by_size()}
    # 12 AWG: 3 colours x 108 = 324 ft net, 3 x 120 = 360 ft of cuts
    # 3/0 AWG: 4 conductors x 308 = 1232 ft net, 4 x 340 = 1360 ft of cuts
    assert by_size == {("cu", "12 AWG"): (324.0, 360), ("cu", "4 AWG"): (308.0, 340),
                       ("cu", "3/0 AWG"): (1232.0, 1360)}
    assert [s.size for s in takeoff.footage_by_size()] == ["12 AWG", "4 AWG", "3/0 AWG"]


def test_raceway_per_type_and_trade_size(takeoff):
    lines = {(r.raceway, r.trade_size): r for r in takeoff.raceway_lines}
    # EMT 1/2: 60 + 40 = 100 ft = 10 sticks of 10 ft (common practice)
    assert (lines["EMT", "1/2"].length_ft, lines["EMT", "1/2"].sticks) == (100.0, 10)
    # PVC-40 2: one raceway per set (NEC 310.10(G)(4)): 150 x 2 = 300 ft = 30 sticks
    assert (lines["PVC-40", "2"].length_ft, lines["PVC-40", "2"].sticks) == (300.0, 30)


def test_fittings_worked_by_hand(takeoff):
    got = {(f.item, f.raceway, f.trade_size): f.count for f in takeoff.fitting_lines}
    assert got == {
        # EMT couplings: B1 60 ft = 6 sticks, 5 joints; B2 40 ft = 4 sticks, 3 joints -> 8
        ("coupling", "EMT", "1/2"): 8,
        # connectors: 2 per end x 2 ends x 2 raceways = 8
        ("connector", "EMT", "1/2"): 8,
        # NEC 358.30(A): 3 ft from each end, then <= 10 ft.
        # B1: 60 - 6 = 54 ft -> ceil(5.4) = 6 gaps -> 7; B2: 40 - 6 = 34 -> 4 gaps -> 5; 7 + 5 = 12
        ("support", "EMT", "1/2"): 12,
        # one elbow per recorded bend: B1 has 1
        ("90-degree elbow", "EMT", "1/2"): 1,
        # PVC couplings: 150 ft = 15 sticks, 14 joints, x 2 raceways = 28
        ("coupling", "PVC-40", "2"): 28,
        # 2 per end x 2 ends x 2 raceways = 8
        ("connector", "PVC-40", "2"): 8,
        # NEC Table 352.30, 1-1/4 to 2: 5 ft. 150 - 6 = 144 -> ceil(28.8) = 29 gaps -> 30, x 2 = 60
        ("support", "PVC-40", "2"): 60,
        # 3 bends x 2 raceways
        ("90-degree elbow", "PVC-40", "2"): 6,
        # 150 ft > 100 ft (pull point every 100 ft, common practice): 2 stretches, 1 pull point
        # per raceway, x 2 raceways; trade size 2 takes a conduit body (common practice)
        ("conduit body", "PVC-40", "2"): 2,
    }


def test_every_fitting_names_its_basis(takeoff):
    basis = {(f.item, f.raceway): f.basis for f in takeoff.fitting_lines}
    assert "NEC 358.30(A)" in basis["support", "EMT"]
    assert "Table 352.30" in basis["support", "PVC-40"]
    assert "per raceway end" in basis["connector", "EMT"]


def test_assumptions_state_slack_waste_connectors_and_rules(takeoff):
    text = "\n".join(takeoff.assumptions)
    assert "2 ft slack at each end" in text
    assert "waste allowance of 10 %" in text
    assert "Martello-Toth" in text and "cut to length" in text.lower()
    assert "2 at each end of each raceway" in text
    assert "NEC 250.122(F)" in text           # parallel EGC
    assert "NEC 310.10(G)(4)" in text         # one raceway per set
    assert "NEC 358.30(A)" in text and "Table 352.30" in text
    assert "NEC 200.6(B)" in text             # 3/0 AWG present: marking at terminations


def test_rigid_conduit_lists_no_loose_couplings():
    # NEC 344.130: RMC lengths come with a coupling attached (from memory)
    run = RunMaterial("R", 95.0, 1, "cu", "THHN/THWN-2", "10 AWG", ("black", "red"),
                      raceway="RMC", raceway_size="3/4")
    t = takeoff_from_runs([run], SETTINGS)
    items = {f.item: f.count for f in t.fitting_lines}
    assert "coupling" not in items
    # NEC Table 344.30(B)(2), 1/2-3/4: 10 ft. 95 - 6 = 89 -> 9 gaps -> 10 supports
    assert items["support"] == 10
    assert t.raceway_lines[0].sticks == 10


def test_more_than_four_bends_get_a_pull_point_and_a_warning_with_the_article():
    # NEC 358.26: at most 360 degrees of bends between pull points; 5 x 90 = 450 degrees
    run = RunMaterial("R9", 80.0, 1, "cu", "THHN/THWN-2", "12 AWG", ("black",),
                      neutral_size="12 AWG", raceway="EMT", raceway_size="1/2", bends=5)
    t = takeoff_from_runs([run], SETTINGS)
    assert any("R9" in w and "NEC 358.26" in w and "450 degrees" in w and "1 pull point" in w
               for w in t.warnings)
    assert {f.item: f.count for f in t.fitting_lines}["conduit body"] == 1


@pytest.mark.parametrize(("bends", "length", "every", "expected"), [
    # NEC 358.26 and kin: 4 quarter bends (360 degrees) between pull points
    (4, 80.0, 100.0, (0, 0)),
    (5, 80.0, 100.0, (1, 1)),
    (8, 80.0, 100.0, (1, 1)),     # 4 + 4
    (9, 80.0, 100.0, (2, 2)),     # 4 + 4 + 1
    # every 100 ft (common practice): 100 ft is one stretch, 100.5 ft two, 250 ft three
    (0, 100.0, 100.0, (0, 0)),
    (0, 100.5, 100.0, (1, 0)),
    (0, 250.0, 100.0, (2, 0)),
    # both: 3 stretches for length, 2 for bends; one set of pull points serves both
    (6, 250.0, 100.0, (2, 1)),
    # 0: no length limit
    (0, 900.0, 0.0, (0, 0)),
])
def test_pull_points_by_bends_and_by_length(bends, length, every, expected):
    from gaugewalk.model.walk.takeoff.fittings import pull_points_for

    assert pull_points_for(bends, length, every) == expected


def test_pull_points_are_conduit_bodies_up_to_trade_size_2_and_boxes_above():
    # common practice; a pull box is sized by NEC 314.28(A) for 4 AWG and larger
    def items(raceway, size):
        run = RunMaterial("R", 180.0, 1, "cu", "THHN/THWN-2", "250 kcmil", ("black", "red", "blue"),
                          raceway=raceway, raceway_size=size)
        return {f.item: f for f in takeoff_from_runs([run], SETTINGS).fitting_lines}

    assert items("EMT", "2")["conduit body"].count == 1
    box = items("EMT", "2-1/2")["pull box"]
    assert box.count == 1 and "NEC 314.28(A)" in box.basis and "NEC 358.26" in box.basis
    # HDPE is laid underground (NEC 353.10): no conduit bodies
    assert items("HDPE", "2")["pull box or handhole"].count == 1


def test_a_run_whose_conductors_fit_no_raceway_is_left_out_and_said_so():
    run = RunMaterial("R5", 80.0, 1, "cu", "THHN/THWN-2", "12 AWG", ("black",),
                      raceway="EMT", raceway_size=None)
    t = takeoff_from_runs([run], SETTINGS)
    assert t.raceway_lines == () and t.fitting_lines == ()
    assert any(w.startswith("run R5:") for w in t.warnings)
    assert t.wire_lines[0].net_ft == 84.0   # 80 + 2 + 2, the wire is still counted


def test_a_bare_egc_is_ordered_as_bare_wire():
    # NEC 250.119: an EGC may be bare
    run = RunMaterial("R", 50.0, 1, "cu", "THHN/THWN-2", "8 AWG", ("black", "red"),
                      egc_size="10 AWG", egc_colour="bare")
    [egc] = [w for w in takeoff_from_runs([run], SETTINGS).wire_lines if w.function == "EGC"]
    assert (egc.insulation, egc.colour) == ("bare", "bare")


# --- put-ups ---------------------------------------------------------------------------------

@pytest.mark.parametrize(
    ("size", "need", "expected", "total"),
    [
        # 12 AWG in 500 ft boxes and 1,000/2,500 ft reels (common practice)
        ("12 AWG", 119, [("500 ft box", 1)], 500),
        # 1,100 ft: 1,000 + 500 = 1,500 (400 over, 2 pieces) beats 3 x 500 (400 over, 3 pieces)
        ("12 AWG", 1100, [("1,000 ft reel", 1), ("500 ft box", 1)], 1500),
        ("12 AWG", 2400, [("2,500 ft reel", 1)], 2500),
        ("12 AWG", 3000, [("2,500 ft reel", 1), ("500 ft box", 1)], 3000),
        # 3,600 ft of 3/0 (reels only): 4 x 1,000 = 4,000 (400 over) beats 2,500 + 2 x 1,000
        # = 4,500 (900 over) and 2 x 2,500 = 5,000 (1,400 over)
        ("3/0 AWG", 3600, [("1,000 ft reel", 4)], 4000),
        ("3/0 AWG", 0, [], 0),
    ],
)
def test_put_ups_leave_the_least_over(size, need, expected, total):
    order, got = order_putups(need, putups_for(size, DEFAULT_PUTUPS))
    assert [(p.label, p.count) for p in order] == expected
    assert got == total


def test_a_size_with_no_put_up_is_cut_to_length():
    run = RunMaterial("R", 100.0, 1, "cu", "THHN/THWN-2", "1250 kcmil", ("black",))
    [line] = takeoff_from_runs([run], SETTINGS).wire_lines
    # (100 + 4) x 1.10 = 114.4 -> 115 ft, cut to length, nothing left over
    assert [(p.label, p.length_ft, p.count) for p in line.order] == [("cut to length", 115, 1)]
    assert (line.order_ft, line.left_over_ft) == (115, 0)


def test_waste_rounds_up_to_whole_feet_without_float_noise():
    run = RunMaterial("R", 96.0, 1, "cu", "THHN/THWN-2", "12 AWG", ("black",))
    [line] = takeoff_from_runs([run], SETTINGS).wire_lines
    # (96 + 4) x 1.10 = 110 exactly, not 111
    assert line.with_waste_ft == 110


# --- colours ---------------------------------------------------------------------------------

def test_phase_colours_go_in_order_a_b_c():
    # common practice colours; order A, B, C
    s = colours.scheme("208Y/120")
    assert phase_colours_for(s, 1, True) == ("black",)
    assert phase_colours_for(s, 2, False) == ("black", "red")
    assert phase_colours_for(s, 3, True) == ("black", "red", "blue")


def test_line_to_neutral_circuits_skip_the_high_leg():
    # NEC 110.15: the high leg (orange) is about 208 V to neutral, so 120 V circuits use A and C
    s = colours.scheme("240/120 delta")
    assert phase_colours_for(s, 1, True) == ("black",)
    assert phase_colours_for(s, 2, True) == ("black", "blue")
    assert phase_colours_for(s, 3, False) == ("black", "orange", "blue")


def test_more_hots_than_the_scheme_has_colours_is_refused():
    with pytest.raises(TakeoffError, match="2 phase colours"):
        phase_colours_for(colours.scheme("120/240"), 3, False)


def test_order_rows_are_one_per_item_with_a_unit_and_no_totals(takeoff):
    rows = takeoff.to_rows()
    assert all(tuple(r) == ("item", "description", "quantity", "unit") for r in rows)
    assert not any("total" in str(r["item"] + r["description"]).lower() for r in rows)
    assert len({r["item"] for r in rows}) == len(rows)            # each item once
    by_item = {r["item"]: r for r in rows}
    # one 500 ft box of each 12 AWG colour
    boxes = [r for r in rows if r["unit"] == "box"]
    assert [(r["item"], r["quantity"]) for r in boxes] == [
        ("CU.12AWG.THHN/THWN-2.BLACK.BOX500", 1), ("CU.12AWG.THHN/THWN-2.WHITE.BOX500", 1),
        ("CU.12AWG.THHN/THWN-2.GREEN.BOX500", 1)]
    # 3/0 AWG cut to length, by the foot: 2 cuts of 170 ft
    assert (by_item["CU.3/0AWG.THHN/THWN-2.RED.CUT"]["quantity"],
            by_item["CU.3/0AWG.THHN/THWN-2.RED.CUT"]["unit"]) == (340, "ft")
    # EMT 1/2 by the foot in whole 10 ft lengths: 100 ft; PVC-40 2: 300 ft
    assert (by_item["EMT.1/2.10FT"]["quantity"], by_item["EMT.1/2.10FT"]["unit"]) == (100, "ft")
    assert by_item["PVC-40.2.10FT"]["description"] == "PVC-40, trade size 2, 10 ft lengths"
    assert (by_item["EMT.1/2.SUPPORT"]["quantity"], by_item["EMT.1/2.SUPPORT"]["unit"]) == (
        12, "each")


# --- put-up search against brute force ---------------------------------------------------------

def _brute_force(need: int, lengths: list[int]) -> tuple[int, int] | None:
    """Least left over, then fewest pieces, by trying every count up to covering the need alone."""
    best = None
    ranges = [range(math.ceil(need / n) + 1) for n in lengths]
    for counts in itertools.product(*ranges):
        total = sum(c * n for c, n in zip(counts, lengths, strict=True))
        if total >= need:
            key = (total - need, sum(counts))
            best = key if best is None or key < best else best
    return best


@given(
    need=st.integers(min_value=1, max_value=6000),
    lengths=st.lists(st.sampled_from([250, 300, 500, 1000, 1500, 2500]), min_size=1, max_size=3,
                     unique=True),
)
def test_put_up_search_matches_brute_force(need, lengths):
    putups = tuple(PutUp(f"{n} ft", n, ("12 AWG",)) for n in lengths)
    order, total = order_putups(need, putups)
    assert total == sum(p.count * p.length_ft for p in order) >= need
    assert (total - need, sum(p.count for p in order)) == _brute_force(need, sorted(lengths))
