"""Overcurrent device ratings (NEC 240.6(A), 240.4(D)) and EGC sizes (NEC Table 250.122)."""

import itertools

import pytest

from gaugewalk.tables.conductor.sizes import size_index
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.protection.egc import EGC_TABLE, egc_printed, egc_size
from gaugewalk.tables.protection.ocpd import (
    ALL_RATINGS,
    FUSE_ONLY,
    STANDARD_RATINGS,
    is_standard_rating,
    next_rating_down,
    next_standard_rating,
    small_conductor_max_ocpd,
)


def test_standard_ratings_are_those_of_240_6_a():
    # NEC 2023 240.6(A) / Table 240.6(A), 15 A and up
    assert STANDARD_RATINGS == (
        15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225, 250,
        300, 350, 400, 450, 500, 600, 700, 800, 1000, 1200, 1600, 2000, 2500, 3000, 4000, 5000,
        6000)
    # NEC 2023 240.6(A): additional standard ratings for fuses
    assert FUSE_ONLY == (1, 3, 6, 601)
    assert 10 in ALL_RATINGS and ALL_RATINGS == tuple(sorted(ALL_RATINGS))
    assert is_standard_rating(601, fuse=True) and not is_standard_rating(601)
    assert not is_standard_rating(55)


@pytest.mark.parametrize(
    ("amps", "rating"),
    # NEC 240.6(A): the next standard rating at or above the current
    [(0.5, 15), (15, 15), (15.01, 20), (46, 50), (51, 60), (101, 110), (112.5, 125), (126, 150),
     (226, 250), (401, 450), (601, 700), (801, 1000), (1001, 1200), (1201, 1600), (5001, 6000)],
)
def test_next_standard_rating_rounds_up(amps, rating):
    assert next_standard_rating(amps) == rating


def test_next_rating_down_and_the_ends_of_the_list():
    assert next_rating_down(99) == 90 and next_rating_down(100) == 100
    assert next_rating_down(14) is None
    with pytest.raises(TableLookupError, match="largest in NEC 240.6"):
        next_standard_rating(6001)
    with pytest.raises(TableLookupError):
        next_standard_rating(0)


@pytest.mark.parametrize(
    ("size", "material", "limit"),
    # NEC 2023 240.4(D)(1)-(7)
    [("18 AWG", "cu", 7), ("16 AWG", "cu", 10), ("14 AWG", "cu", 15), ("12 AWG", "al", 15),
     ("12 AWG", "cu", 20), ("10 AWG", "al", 25), ("10 AWG", "cu", 30), ("8 AWG", "cu", None),
     ("8 AWG", "al", None), ("4/0", "cu", None)],
)
def test_small_conductor_limits_of_240_4_d(size, material, limit):
    assert small_conductor_max_ocpd(size, material) == limit


@pytest.mark.parametrize(
    ("ocpd", "cu", "al"),
    # NEC 2023 Table 250.122 rows (aluminum at 4000 A per the 2020/2023 editions)
    [(15, "14 AWG", "12 AWG"), (20, "12 AWG", "10 AWG"), (30, "10 AWG", "8 AWG"),
     (60, "10 AWG", "8 AWG"), (100, "8 AWG", "6 AWG"), (200, "6 AWG", "4 AWG"),
     (225, "4 AWG", "2 AWG"), (400, "3 AWG", "1 AWG"), (600, "1 AWG", "2/0 AWG"),
     (800, "1/0 AWG", "3/0 AWG"), (1000, "2/0 AWG", "4/0 AWG"), (1200, "3/0 AWG", "250 kcmil"),
     (1600, "4/0 AWG", "350 kcmil"), (2000, "250 kcmil", "400 kcmil"),
     (2500, "350 kcmil", "600 kcmil"), (3000, "400 kcmil", "600 kcmil"),
     (4000, "500 kcmil", "750 kcmil"), (5000, "700 kcmil", "1200 kcmil"),
     (6000, "800 kcmil", "1200 kcmil")],
)
def test_egc_rows_of_table_250_122(ocpd, cu, al):
    assert egc_printed(ocpd, "cu") == cu
    assert egc_printed(ocpd, "al") == al


def test_egc_size_is_always_a_table_8_size():
    # NEC Table 250.122 prints 1200 kcmil aluminum at 5000/6000 A; Ch. 9 Table 8 goes 1000, 1250
    assert egc_size(5000, "al") == "1250 kcmil" and egc_size(6000, "al") == "1250 kcmil"
    assert egc_size(6000, "cu") == "800 kcmil"
    for rating, _, _ in EGC_TABLE:
        for material in ("cu", "al"):
            size_index(egc_size(rating, material))  # raises if not a Table 8 size


def test_a_device_between_rows_takes_the_next_row_up():
    # NEC Table 250.122 heading: "not exceeding"
    assert egc_size(61, "cu") == "8 AWG"
    assert egc_size(201, "al") == "2 AWG"


def test_egc_sizes_never_shrink_as_the_rating_grows():
    # NEC Table 250.122 structure; aluminum never smaller than copper
    rows = [(r, egc_size(r, "cu"), egc_size(r, "al")) for r, _, _ in EGC_TABLE]
    for (r1, cu1, al1), (r2, cu2, al2) in itertools.pairwise(rows):
        assert r2 > r1
        assert size_index(cu2) >= size_index(cu1) and size_index(al2) >= size_index(al1)
    for _, cu, al in rows:
        assert size_index(al) >= size_index(cu)
    # every row rating is a standard rating of 240.6(A)
    assert all(r in STANDARD_RATINGS for r, _, _ in EGC_TABLE)


def test_egc_lookup_refuses_bad_input():
    with pytest.raises(TableLookupError, match="ends at 6000 A"):
        egc_size(6001, "cu")
    with pytest.raises(TableLookupError, match="materials are cu, al"):
        egc_size(20, "gold")
    with pytest.raises(TableLookupError):
        egc_size(-5, "cu")
