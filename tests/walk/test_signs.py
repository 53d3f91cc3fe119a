"""A run whose name reads as a sign or outline lighting (NEC 2023 Article 600): taken as the
outlet 600.5(A) requires at a tenant entrance, on a branch circuit of at least 20 A that supplies
no other load, and counted in its panel at no less than 1,200 VA (220.14(F)); 600.5(B) rates a
circuit supplying signs at no more than 20 A (30 A for neon tubing alone). Sections and figures
from memory. The assumption is said on the run, and a device the walk gives is kept. Every walk
here is invented."""

from __future__ import annotations

import pytest

from gaugewalk.model.session.card_form import CardForm
from gaugewalk.model.session.session import WalkSession
from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walk.vocabulary import sign_in_name
from tests.support.walks import make_job, panel_walk, run_table, source_table, write_walk

W208 = "208Y/120V 3ph 4w"


@pytest.mark.parametrize(("name", "is_sign"), [
    ("Tenant A sign", True), ("Blade sign over entrance", True), ("Storefront signage", True),
    ("MONUMENT SIGN", True), ("Outline lighting, parapet", True),
    ("Exit sign, rear door", False), ("Emergency exit signs", False), ("Traffic signal", False),
    ("Design studio lights", False), ("Sign-in kiosk", False), ("Signal horn", False)])
def test_names_that_read_as_a_sign(name, is_sign):
    assert sign_in_name(name) is is_sign


def _strip(*runs):
    """A 208Y/120 V service feeding panel LP1 (20 ft), ``runs`` on LP1."""
    return make_job("strip", sources=[source_table("SVC", "service", W208),
                                      source_table("LP1", "panel", W208, rating_a=100)],
                    runs=[run_table("F1", "SVC", "LP1", "20"), *runs])


def _sign(rid="S1", to="Tenant A sign", amps=3.0, **extra):
    return run_table(rid, "LP1", to, "55", load={"value": amps, "unit": "A"},
                     continuous=True, connection="LN", **extra)


def test_a_small_sign_gets_a_20_a_circuit_and_counts_1200_va_in_its_panel():
    result = compute_job(_strip(_sign()))
    sign = result.runs["S1"]
    # 3 A continuous: 3.75 A design; 600.5(A): a 20 A circuit, so 12 AWG Cu (240.4(D))
    assert (sign.amps, sign.ocpd_a, sign.size) == (3.0, 20, "12 AWG")
    note = next(n for n in sign.notes if "600.5(A)" in n)
    assert "'Tenant A sign' reads as a sign" in note
    assert "1,200 VA, not its 360 VA (NEC 220.14(F))" in note
    # its panel: 1,200 VA on one line at 120 V = 10 A, continuous: 12.5 A design (215.2(A)(1))
    assert result.run_va["S1"] == pytest.approx(1200.0)
    assert result.connected_va["LP1"] == pytest.approx(1200.0)
    assert result.runs["F1"].design_amps == pytest.approx(12.5)


def test_an_exit_sign_is_sized_as_its_load():
    result = compute_job(_strip(_sign(to="Exit sign, rear door")))
    sign = result.runs["S1"]
    assert (sign.ocpd_a, sign.size) == (15, "14 AWG")   # 240.6(A), 240.4(D): as any 3 A load
    assert not any("600.5" in n for n in sign.notes)
    assert result.run_va["S1"] == pytest.approx(360.0)


def test_a_device_the_walk_gives_is_kept_and_the_rule_said():
    result = compute_job(_strip(_sign(ocpd_a=15)))
    sign = result.runs["S1"]
    assert sign.ocpd_a == 15
    note = next(n for n in sign.notes if "600.5(A)" in n)
    assert "at least 20 A, not the 15 A given" in note
    assert result.run_va["S1"] == pytest.approx(1200.0)   # 220.14(F) all the same


def test_a_sign_over_20_a_is_said_to_exceed_600_5_b_and_a_large_one_counts_its_own_va():
    # 18 A continuous: 22.5 A design, a 25 A device (240.6(A)): over 600.5(B)'s 20 A
    result = compute_job(_strip(_sign(amps=18.0)))
    sign = result.runs["S1"]
    assert sign.ocpd_a == 25
    note = next(n for n in sign.notes if "600.5(B)" in n)
    assert "25 A device" in note and "neon" in note
    assert "220.14(F)" not in note   # 2,160 VA: more than 1,200 VA, counted as it is
    assert result.run_va["S1"] == pytest.approx(2160.0)


def test_the_card_shows_the_sign_circuit_before_it_is_stored(tmp_path):
    session = WalkSession.open(write_walk(tmp_path, panel_walk("strip")))
    form = CardForm(session)
    form.start()
    for key, text in (("to", "Tenant B sign"), ("length", "80"), ("load", "2.5A"),
                      ("circuit", "LN"), ("continuous", "yes")):
        form.type(key, text)
    checked = form.check()
    assert checked.errors == {} and checked.result.ocpd_a == 20
    assert any("600.5(A)" in n for n in checked.result.notes)
    # stored, the walk's computation agrees with what the card showed
    session.put_run(checked.run)
    stored = session.result.runs[checked.run.id]
    assert (stored.ocpd_a, stored.size) == (checked.result.ocpd_a, checked.result.size)
    assert stored.notes == checked.result.notes
    # and an edit in place agrees with a full computation
    assert session.result.runs == compute_job(session.job).runs


def test_the_card_takes_a_sign_as_lighting_continuous_as_lighting_is(tmp_path):
    # common practice: a sign's lamps burn 3 h and more, so the card reads the name as lighting
    # (continuous unless the run says not): 125 % of 4 A = 5 A design (NEC 210.19(A)(1))
    session = WalkSession.open(write_walk(tmp_path, panel_walk("strip")))
    form = CardForm(session)
    form.start()
    for key, text in (("to", "Tenant C sign"), ("length", "60"), ("load", "4A"),
                      ("circuit", "LN")):
        form.type(key, text)
    checked = form.check()
    assert checked.errors == {} and checked.run.load.kind == "lighting"
    assert checked.result.design_amps == pytest.approx(5.0) and checked.result.ocpd_a == 20


def test_a_sign_edited_in_place_is_updated_as_a_whole_computation(tmp_path):
    # renamed (a new name is a run re-pointed: the walk is computed whole), then its load
    # changed in place (recompute_run): its device, its panel's 1,200 VA and its note stay equal
    # to a computation of the whole walk each time
    session = WalkSession.open(write_walk(tmp_path, panel_walk(
        "strip", run_table("R1", "LP1", "Bench", "55", load=(3, "A"), connection="LN"),
        run_table("R2", "LP1", "Office lights", "40", load=(8, "A"), connection="LN"))))
    steps = (({"to": "Tenant A sign"}, 20, False), ({"load": {"value": 5, "unit": "A"}}, 20, True),
             ({"to": "Bench"}, 15, False), ({"load": {"value": 3, "unit": "A"}}, 15, True))
    for update, device, in_place in steps:
        run = session.job.run("R1")
        data = run.model_dump(by_alias=True, exclude_defaults=True) | update
        assert session.put_run(type(run).model_validate(data), replaces="R1") is None
        assert (session.changed is not None) is in_place
        full = compute_job(session.job)
        assert session.result.runs == full.runs and session.result.run_va == full.run_va
        assert session.result.runs["R1"].ocpd_a == device
