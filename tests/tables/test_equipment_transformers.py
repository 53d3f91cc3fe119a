"""Transformers of 1000 V and less: NEC 2023 Table 450.3(B), 240.21(C)(2) and (C)(6), and the kVA
ratings and typical impedances used only as stated assumptions."""

import pytest

from gaugewalk.tables.equipment.transformers import (
    NOTES,
    SECONDARY_10_FT,
    SECONDARY_25_FT,
    SINGLE_PHASE_KVA,
    THREE_PHASE_KVA,
    TYPICAL_BASIS,
    TYPICAL_IMPEDANCE_1PH,
    TYPICAL_IMPEDANCE_3PH,
    current_band,
    min_secondary_ampacity_10ft,
    min_secondary_ampacity_25ft,
    next_standard_kva,
    rated_current,
    thermal_overload_primary_multiple,
    transformer_protection,
    typical_impedance,
)
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.protection.ocpd import next_standard_rating


@pytest.mark.parametrize(
    ("method", "winding", "amps", "percent", "band", "next_size_up"),
    # NEC 2023 Table 450.3(B)
    [("primary-only", "primary", 54.1, 125, "9 A or more", True),
     ("primary-only", "primary", 9, 125, "9 A or more", True),
     ("primary-only", "primary", 8.99, 167, "less than 9 A", False),
     ("primary-only", "primary", 2, 167, "less than 9 A", False),
     ("primary-only", "primary", 1.99, 300, "less than 2 A", False),
     ("primary-only", "secondary", 124.9, None, "9 A or more", False),
     ("primary-and-secondary", "primary", 54.1, 250, "9 A or more", False),
     ("primary-and-secondary", "primary", 5, 250, "less than 9 A", False),
     ("primary-and-secondary", "primary", 1, 250, "less than 2 A", False),
     ("primary-and-secondary", "secondary", 124.9, 125, "9 A or more", True),
     ("primary-and-secondary", "secondary", 4, 167, "less than 9 A", False),
     ("primary-and-secondary", "secondary", 1, 167, "less than 9 A", False)],
)
def test_table_450_3_b_cells(method, winding, amps, percent, band, next_size_up):
    found = transformer_protection(method, winding, amps)
    assert (found.percent, found.band, found.next_size_up) == (percent, band, next_size_up)


def test_notes_are_attached_where_the_table_prints_them():
    # NEC 2023 Table 450.3(B): note 1 on the 125 % cells, note 3 on the 250 % primary cells,
    # note 2 over the secondary columns
    assert transformer_protection("primary-only", "primary", 20).notes == (1,)
    assert transformer_protection("primary-and-secondary", "primary", 20).notes == (3,)
    assert transformer_protection("primary-and-secondary", "secondary", 20).notes == (1, 2)
    assert transformer_protection("primary-and-secondary", "secondary", 5).notes == (2,)
    assert set(NOTES) == {1, 2, 3} and "next higher standard rating" in NOTES[1]


def test_the_45_kva_transformer_of_issue_12_worked_by_hand():
    # 45 kVA, 480 V three-phase primary: 45 000 / (sqrt(3) x 480) = 54.13 A; primary-only
    # protection 125 % = 67.7 A, not a standard rating; note 1 permits 70 A (240.6(A))
    primary = rated_current(45, 480, 3)
    assert primary == pytest.approx(54.13, abs=0.01)
    limit = transformer_protection("primary-only", "primary", primary)
    assert next_standard_rating(primary * limit.percent / 100) == 70
    # the 208 V secondary: 45 000 / (sqrt(3) x 208) = 124.9 A
    assert rated_current(45, 208, 3) == pytest.approx(124.9, abs=0.05)
    # 240.21(C)(6): secondary conductors up to 25 ft need at least 70 x 480/208 / 3 = 53.8 A;
    # 240.21(C)(2)(4) (field installed, leaving the enclosure) at least 70 x 480/208 / 10 = 16.2 A
    assert min_secondary_ampacity_25ft(70, 480, 208) == pytest.approx(53.85, abs=0.01)
    assert min_secondary_ampacity_10ft(70, 480, 208) == pytest.approx(16.15, abs=0.01)


def test_single_phase_rated_current():
    # 25 kVA at 240 V single-phase: 25 000 / 240 = 104.2 A
    assert rated_current(25, 240, 1) == pytest.approx(104.17, abs=0.01)


def test_note_3_thermal_overload_multiples():
    # NEC 2023 Table 450.3(B) note 3: 6 x up to 6 % impedance, 4 x above 6 % to 10 %
    assert thermal_overload_primary_multiple(5.75) == 6
    assert thermal_overload_primary_multiple(6.0) == 6
    assert thermal_overload_primary_multiple(6.1) == 4
    assert thermal_overload_primary_multiple(10.0) == 4
    assert thermal_overload_primary_multiple(10.5) is None


def test_table_refusals_list_the_choices():
    with pytest.raises(TableLookupError, match="methods are primary-only, primary-and-secondary"):
        transformer_protection("both", "primary", 20)
    with pytest.raises(TableLookupError, match="windings are primary, secondary"):
        transformer_protection("primary-only", "tertiary", 20)
    for bad in (0, -3, float("nan"), "20", True):
        with pytest.raises(TableLookupError, match="rated current"):
            current_band(bad)
    with pytest.raises(TableLookupError, match="1 or 3 phases"):
        rated_current(45, 480, 2)


def test_secondary_conductor_rules_of_240_21_c():
    # NEC 2023 240.21(C)(2): 10 ft; 240.21(C)(6): 25 ft
    assert (SECONDARY_10_FT.section, SECONDARY_10_FT.max_length_ft) == ("240.21(C)(2)", 10)
    assert (SECONDARY_25_FT.section, SECONDARY_25_FT.max_length_ft) == ("240.21(C)(6)", 25)
    assert any("single circuit breaker" in c for c in SECONDARY_25_FT.conditions)
    assert any("10 times" in c for c in SECONDARY_10_FT.conditions)


def test_kva_lists_are_ascending_and_hold_the_usual_ratings():
    # common practice: the ratings dry-type and distribution transformers are built in
    for ratings in (THREE_PHASE_KVA, SINGLE_PHASE_KVA):
        assert list(ratings) == sorted(set(ratings))
    assert {15, 30, 45, 75, 112.5, 150, 225, 300, 500, 750, 1000} <= set(THREE_PHASE_KVA)
    assert {10, 15, 25, 37.5, 50, 75, 100, 167} <= set(SINGLE_PHASE_KVA)
    assert next_standard_kva(40, 3) == 45 and next_standard_kva(45, 3) == 45
    assert next_standard_kva(30, 1) == 37.5
    with pytest.raises(TableLookupError, match="ends at 2500 kVA"):
        next_standard_kva(3000, 3)


def test_typical_impedances_are_marked_typical_and_lie_in_their_ranges():
    for table in (TYPICAL_IMPEDANCE_3PH, TYPICAL_IMPEDANCE_1PH):
        for kva, (pct, low, high) in table.items():
            assert 1.0 <= low <= pct <= high <= 10.0, kva
    found = typical_impedance(45, 3)
    assert (found.pct, found.kva_row, found.basis) == (4.5, 45, TYPICAL_BASIS)
    assert TYPICAL_BASIS == "typical, common practice"
    # a rating between the rows is read at the common rating above it
    assert typical_impedance(40, 3).kva_row == 45
    assert set(TYPICAL_IMPEDANCE_3PH) <= set(THREE_PHASE_KVA)
    assert set(TYPICAL_IMPEDANCE_1PH) <= set(SINGLE_PHASE_KVA)


@pytest.mark.parametrize(("kva", "pct"),
                         # one maker's published typical data, 600 V class general-purpose
                         # single-phase dry-type, 150 C rise, aluminum wound
                         [(15, 4.3), (25, 3.5), (37.5, 5.8), (50, 5.1), (75, 6.9), (100, 6.1),
                          (167, 9.7)])
def test_a_published_single_phase_datasheet_lies_in_the_typical_ranges(kva, pct):
    found = typical_impedance(kva, 1)
    assert found.low_pct <= pct <= found.high_pct


def test_no_typical_impedance_outside_the_kept_rows():
    with pytest.raises(TableLookupError, match="enter the nameplate impedance"):
        typical_impedance(9, 3)
    with pytest.raises(TableLookupError, match="enter the nameplate impedance"):
        typical_impedance(250, 1)
    with pytest.raises(TableLookupError, match="1 or 3 phases"):
        typical_impedance(45, 2)

