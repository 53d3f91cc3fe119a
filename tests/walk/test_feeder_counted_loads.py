"""Loads a feeder counts by a rule of NEC 2023 Article 220 rather than as connected: an EV
charger at 7,200 VA or its nameplate rating, the larger (220.57, from memory; continuous by
625.42), and lighting counted by its length (220.43, from memory), said where the walk gives no
length. Every walk here is invented."""

from __future__ import annotations

import pytest

from gaugewalk.model.walk.compute import compute_job
from tests.support.walks import make_job, run_table, source_table

S240 = "120/240V 1ph 3w"


def _garage(*amps):
    """A 120/240 V service feeding panel GP (50 ft), an EV charger of each of ``amps`` on it."""
    return make_job("garage", sources=[source_table("SVC", "service", S240),
                                       source_table("GP", "panel", S240, rating_a=200)],
                    runs=[run_table("F1", "SVC", "GP", "50"),
                          *(run_table(f"EV{i}", "GP", f"Charger {i}", "30",
                                      load={"value": a, "unit": "A", "kind": "ev-charger"},
                                      connection="LL")
                            for i, a in enumerate(amps, 1))])


def test_a_small_charger_counts_7200_va_in_its_feeder_and_its_nameplate_on_its_branch():
    result = compute_job(_garage(16))
    # its branch: 16 A continuous, 125 % = 20 A (625.42, 210.19(A)(1)), a 20 A device (625.41)
    ev = result.runs["EV1"]
    assert (ev.amps, ev.design_amps, ev.ocpd_a) == (16.0, 20.0, 20)
    assert any("NEC 220.57" in n and "7,200 VA" in n and "3,840 VA" in n for n in ev.notes)
    # its feeder: 7,200 VA / 240 V = 30 A, continuous: 37.5 A design (215.2(A)(1)), 40 A device
    # (240.6(A)); NEC 2023 Table 310.16, 60 C column (110.14(C)(1)(a)): 8 AWG Cu 40 A
    f1 = result.runs["F1"]
    assert f1.amps == pytest.approx(30.0) and f1.design_amps == pytest.approx(37.5)
    assert (f1.ocpd_a, f1.size) == (40, "8 AWG")


def test_a_charger_over_7200_va_counts_its_nameplate():
    # 48 A x 240 V = 11,520 VA > 7,200 VA; two of them: 96 A on each line, 120 A design
    result = compute_job(_garage(48, 48))
    assert result.runs["F1"].amps == pytest.approx(96.0)
    assert result.runs["F1"].design_amps == pytest.approx(120.0)
    assert any("its nameplate, 11,520 VA" in n for n in result.runs["EV1"].notes)


@pytest.mark.parametrize(("name", "rule"), [("Track lighting, gallery", "NEC 220.43(B)"),
                                            ("Show window 3", "NEC 220.43(A)")])
def test_lighting_a_feeder_counts_by_length_says_the_load_given_was_counted(name, rule):
    # NEC 220.43 (from memory): track lighting at 150 VA per 2 ft of track, show windows at
    # 200 VA per foot; the walk gives the load, not the length: a stated assumption
    job = make_job("shop", sources=[source_table("SVC", "service", S240)], runs=[
        run_table("L1", "SVC", name, "40", load={"value": 900, "unit": "VA",
                                                 "kind": "lighting"}, connection="LN"),
        run_table("L2", "SVC", "Aisle lights", "40", load={"value": 900, "unit": "VA",
                                                         "kind": "lighting"}, connection="LN")])
    result = compute_job(job)
    note = next(n for n in result.runs["L1"].notes if rule in n)
    assert "900 VA" in note and "counts the load given" in note
    assert not any("220.43" in n for n in result.runs["L2"].notes)
