"""Cut lists: runs' conductor cuts packed into boxes and reels, worked by hand and checked for
the properties every packing must have (``gaugewalk.model.walk.takeoff.packing``)."""

from __future__ import annotations

from collections import Counter

import pytest
from hypothesis import given
from hypothesis import strategies as st

from gaugewalk.model.walk.takeoff.lines import Cut
from gaugewalk.model.walk.takeoff.packing import l2_bound, pack_cuts
from gaugewalk.tables.order.putups import CUT_LABEL, DEFAULT_PUTUPS, PutUp, putups_for

# Default put-ups (common practice): 12 AWG in 500 ft boxes and 1,000 / 2,500 ft reels;
# 3/0 AWG on 1,000 / 2,500 ft reels and cut to length by the supplier.
P12 = putups_for("12 AWG", DEFAULT_PUTUPS)
P30 = putups_for("3/0 AWG", DEFAULT_PUTUPS)


def cuts(*feet: int) -> list[Cut]:
    return [Cut(f"R{i + 1}", 1, ft) for i, ft in enumerate(feet)]


def shape(packing) -> list[tuple[str, list[int]]]:
    return [(p.label, sorted((c.ft for c in p.cuts), reverse=True)) for p in packing.pieces]


# --- worked by hand ------------------------------------------------------------------------

def test_two_short_cuts_share_one_box():
    # 300 + 150 = 450 ft fits a 500 ft box: one piece, 500 - 450 = 50 ft over; no packing can do
    # better (fewest pieces ceil(450 / 2,500) = 1; least offcut 500 - 450 = 50)
    p = pack_cuts(cuts(300, 150), P12, cut_to_length=False)
    assert shape(p) == [("500 ft box", [300, 150])]
    assert (p.offcut_ft, p.lower_bound_count, p.lower_bound_offcut_ft) == (50, 1, 50)


def test_two_long_cuts_take_two_reels_rather_than_one_big_one():
    # 600 + 600: a box holds neither. Two 1,000 ft reels leave 2 x 400 = 800 ft; one 2,500 ft
    # reel leaves 1,300 ft. Least offcut first: two reels.
    p = pack_cuts(cuts(600, 600), P12, cut_to_length=False)
    assert shape(p) == [("1,000 ft reel", [600]), ("1,000 ft reel", [600])]
    assert p.offcut_ft == 800
    # bounds: ceil(1,200 / 2,500) = 1 piece; as one length 1,200 ft needs 1,000 + 500 = 1,500,
    # so at least 300 ft over
    assert (p.lower_bound_count, p.lower_bound_offcut_ft) == (1, 300)


def test_cuts_that_do_not_split_evenly_are_packed_with_the_least_offcut():
    # 400, 400, 400, 300 = 1,500 ft. 1,000 + 500: the box takes one cut, the reel must take the
    # other three (1,100 or 1,200 ft): no. Two 1,000 ft reels: {400, 400} and {400, 300},
    # 200 + 300 = 500 ft over. One 2,500 ft reel: 1,000 ft over. Best: two reels, 500 ft.
    p = pack_cuts(cuts(400, 400, 400, 300), P12, cut_to_length=False)
    assert shape(p) == [("1,000 ft reel", [400, 400]), ("1,000 ft reel", [400, 300])]
    assert (p.offcut_ft, len(p.pieces)) == (500, 2)
    assert p.method == "exact search"


def test_a_small_need_of_a_large_size_is_cut_to_length():
    # 23 ft of 3/0 AWG: shorter than its shortest reel (1,000 ft), and the supplier cuts the size
    # (common practice): 23 ft cut to length, nothing over, instead of a 1,000 ft reel
    p = pack_cuts(cuts(23), P30, cut_to_length=True)
    assert shape(p) == [(CUT_LABEL, [23])]
    assert (p.pieces[0].length_ft, p.offcut_ft) == (23, 0)


def test_a_size_the_supplier_does_not_cut_goes_in_the_smallest_put_up_that_holds_it():
    p = pack_cuts(cuts(23), P12, cut_to_length=False)
    assert shape(p) == [("500 ft box", [23])]
    assert p.offcut_ft == 477


def test_a_reel_is_bought_for_most_and_the_rest_cut_to_length():
    # 340, 340, 340, 180 = 1,200 ft of 3/0, more than a 1,000 ft reel. Best reel fill:
    # 340 + 340 + 180 = 860 (140 ft over); the other 340 ft, less than a reel, cut to length.
    # A 2,500 ft reel would leave 1,300 ft.
    p = pack_cuts(cuts(340, 340, 340, 180), P30, cut_to_length=True)
    assert shape(p) == [("1,000 ft reel", [340, 340, 180]), (CUT_LABEL, [340])]
    assert (p.offcut_ft, len(p.pieces)) == (140, 2)


def test_a_cut_longer_than_every_put_up_is_cut_to_length_on_its_own():
    p = pack_cuts(cuts(2600, 200), P12, cut_to_length=False)
    assert shape(p) == [("500 ft box", [200]), (CUT_LABEL, [2600])]
    assert [c.ft for c in p.too_long] == [2600]
    assert p.lower_bound_count == 2


def test_no_put_up_listed_cuts_everything_to_length_in_one_piece():
    p = pack_cuts(cuts(120, 80), (), cut_to_length=False)
    assert shape(p) == [(CUT_LABEL, [120, 80])]
    assert (p.pieces[0].length_ft, p.offcut_ft, p.lower_bound_count) == (200, 0, 1)


def test_order_lines_count_pieces_per_put_up_with_their_offcut():
    p = pack_cuts(cuts(400, 400, 400, 300), P12, cut_to_length=False)
    [line] = p.order()
    assert (line.label, line.length_ft, line.count, line.offcut_ft) == ("1,000 ft reel", 1000, 2,
                                                                        500)


def test_the_same_cuts_pack_the_same_way_every_time():
    feet = [71, 49, 130, 88, 71, 240, 12, 300, 55, 49, 71, 160, 95, 33]
    first = pack_cuts(cuts(*feet), P12, cut_to_length=False)
    assert all(pack_cuts(cuts(*feet), P12, cut_to_length=False) == first for _ in range(3))


@pytest.mark.parametrize(("sizes", "capacity", "bound"), [
    # Martello and Toth's L2 (Knapsack Problems, 1990, sec. 8.3.1), worked by hand:
    # three items over half the bin need three bins, though the total (180) fits in two
    ([60, 60, 60], 100, 3),
    # alpha = 30: J1 = {80} (> 70), J2 = {} , J3 = {40, 40, 30}; 110 - 0 -> +2 bins: 3
    ([80, 40, 40, 30], 100, 3),
    # the plain bound ceil(250 / 100) = 3 where nothing is over half
    ([50, 50, 50, 50, 50], 100, 3),
    ([], 100, 0),
])
def test_l2_bound_worked_by_hand(sizes, capacity, bound):
    assert l2_bound(sizes, capacity) == bound


# --- properties ---------------------------------------------------------------------------

LENGTH_SETS = [(500, 1000, 2500), (1000, 2500), (250, 300, 1000), (500,), (300, 1000, 1500)]


@st.composite
def groups(draw, max_cuts: int = 40):
    lengths = draw(st.sampled_from(LENGTH_SETS))
    feet = draw(st.lists(st.integers(1, int(max(lengths) * 1.2)), min_size=1, max_size=max_cuts))
    cut = draw(st.booleans())
    putups = tuple(PutUp(f"{n} ft", n, ("12 AWG",)) for n in lengths)
    return cuts(*feet), putups, cut


@given(groups())
def test_every_packing_places_each_cut_once_and_overfills_nothing(group):
    given_cuts, putups, cut = group
    p = pack_cuts(given_cuts, putups, cut)
    placed = [c for piece in p.pieces for c in piece.cuts]
    assert Counter(placed) == Counter(given_cuts)                 # every cut placed once
    longest = max(u.length_ft for u in putups)
    for piece in p.pieces:
        assert piece.cuts                                         # no empty piece is bought
        if piece.cut_to_length:
            assert piece.used_ft == piece.length_ft               # a cut length has no offcut
        else:
            assert piece.used_ft <= piece.length_ft               # nothing overfilled
            assert piece.length_ft in {u.length_ft for u in putups}
    # pieces cut to length other than a single cut longer than every put-up
    remainders = [q for q in p.pieces
                  if q.cut_to_length and not (len(q.cuts) == 1 and q.cuts[0].ft > longest)]
    assert len(remainders) <= (1 if cut else 0)                   # only where the supplier cuts
    for q in remainders:
        assert q.length_ft < min(u.length_ft for u in putups)     # shorter than any put-up
    # never worse than one piece per cut, never better than the lower bounds
    assert p.lower_bound_count <= len(p.pieces) <= len(given_cuts)
    assert p.offcut_ft >= p.lower_bound_offcut_ft >= 0


def _brute_force(feet: list[int], lengths: tuple[int, ...], cut: bool) -> tuple[int, int]:
    """(least offcut, then fewest pieces) over every split of the cuts into pieces, each piece the
    shortest put-up that holds it, or (where the supplier cuts) one piece cut to length shorter
    than the shortest put-up; a cut longer than every put-up is cut to length alone."""
    long_ones = [f for f in feet if f > max(lengths)]
    rest = [f for f in feet if f <= max(lengths)]

    def partitions(items):
        if not items:
            yield []
            return
        first, others = items[0], items[1:]
        for part in partitions(others):
            yield [[first]] + part
            for i in range(len(part)):
                yield part[:i] + [[first] + part[i]] + part[i + 1:]

    best = None
    for part in partitions(rest):
        sums = [sum(b) for b in part]
        if max(sums, default=0) > max(lengths):
            continue
        for cut_block in [None] + (list(range(len(part))) if cut else []):
            if cut_block is not None and sums[cut_block] >= min(lengths):
                continue
            offcut = sum(min(n for n in lengths if n >= s) - s
                         for i, s in enumerate(sums) if i != cut_block)
            key = (offcut, len(part) + len(long_ones))
            best = key if best is None or key < best else best
    return best if best is not None else (0, len(long_ones))


@given(groups(max_cuts=6))
def test_small_groups_match_a_brute_force_search(group):
    given_cuts, putups, cut = group
    p = pack_cuts(given_cuts, putups, cut)
    lengths = tuple(u.length_ft for u in putups)
    fits = [c for c in given_cuts if c.ft <= max(lengths)]
    assert p.method == ("exact search" if fits else "nothing to pack")
    assert (p.offcut_ft, len(p.pieces)) == _brute_force([c.ft for c in given_cuts], lengths, cut)


def test_a_large_group_stays_within_a_few_pieces_of_its_bound():
    # 400 branch-circuit cuts of 40 to 199 ft (invented), 12 AWG put-ups
    feet = [40 + (i * 37) % 160 for i in range(400)]
    p = pack_cuts(cuts(*feet), P12, cut_to_length=False)
    assert sum(feet) == sum(piece.used_ft for piece in p.pieces)
    assert len(p.pieces) <= p.lower_bound_count + 2
    # offcut within one shortest put-up of the bound
    assert p.offcut_ft <= p.lower_bound_offcut_ft + 500
