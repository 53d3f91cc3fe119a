"""The run card's form without a screen: what a new card holds, what follows what is typed, each
field's check, the run the texts make and its live answer."""

from __future__ import annotations

import pytest

from gaugewalk.model.session.card_form import FIELD_KEYS, CardForm, complete
from gaugewalk.model.session.session import WalkSession
from tests.support.walks import panel_walk, run_table, write_walk


@pytest.fixture
def session(tmp_path):
    return WalkSession.open(write_walk(tmp_path))


def _typed(form: CardForm, **texts: str) -> CardForm:
    for key, text in texts.items():
        form.type(key, text)
    return form


def test_a_new_card_starts_on_to_from_the_last_runs_source_with_its_circuit(session):
    form = CardForm(session)
    assert form.start() == "to"
    v = form.values
    # the invented walk's last run R1 is from LP1, LN
    assert (v["from"], v["circuit"], v["id"], v["sets"], v["continuous"]) == (
        "LP1", "LN", "R2", "1", "no")
    assert set(v) == set(FIELD_KEYS)


def test_the_texts_make_a_run_whose_live_answer_is_the_hand_worked_drop(session):
    form = CardForm(session)
    form.start()  # from LP1, circuit LN (the last run's)
    checked = _typed(form, to="Mixer", length="30+20", load="10A", size="12").check()
    assert checked.errors == {}
    assert checked.run is not None and checked.run.to == "Mixer" and checked.feet == 50
    # NEC 2023 Ch. 9 Table 8, 12 AWG stranded Cu 1.98 ohm/kft (DC method, 75 degC):
    # 2 x 10 A x 1.98 x 50 ft / 1000 = 1.98 V = 1.65 % of 120 V (line-to-neutral)
    assert checked.result.voltage_drop_pct == pytest.approx(1.65, abs=0.005)


@pytest.mark.parametrize("key, text, reason", [
    ("length", "12q", "unknown unit"),
    ("load", "16", "no unit"),
    ("sets", "21", "1 to 20"),
    ("circuit", "XY", "one of LN"),
    ("material", "gold", "cu or al"),
    ("from", "LP9", "no source 'LP9'"),
    ("id", "R1", "'R1' is taken"),
])
def test_a_wrong_field_is_named_with_its_reason_and_no_run_is_made(session, key, text, reason):
    form = CardForm(session)
    form.start()
    _typed(form, to="Mixer", length="40", load="16A")
    form.type(key, text)
    checked = form.check()
    assert reason in checked.errors[key]
    assert checked.run is None


def test_empty_fields_nobody_reached_are_needed_not_wrong_until_a_store_is_tried(session):
    form = CardForm(session)
    form.start()
    assert form.check().soft == {"to", "length", "load"}
    assert form.check(store_tried=True).soft == set()


def test_a_run_to_a_source_is_a_feeder_with_every_hot_and_an_f_id(session):
    form = CardForm(session)
    form.start()
    changed = form.type("from", "SVC")
    changed.update(form.type("to", "LP1"))
    assert form.values["circuit"] == "" and form.values["id"] == "F2"
    assert changed["id"] == "F2"


def test_fields_the_person_typed_are_not_followed(session):
    form = CardForm(session)
    form.start()
    form.type("id", "MIX-1")
    form.type("to", "LP1")  # now a feeder: the id would be F2, but it was typed
    assert form.values["id"] == "MIX-1"


def test_a_panel_declared_on_the_card_is_the_new_source_and_the_next_card_starts_from_it(session):
    form = CardForm(session)
    form.start()
    _typed(form, **{"from": "SVC", "to": "LP2", "length": "120", "panel": "208Y/120"})
    checked = form.check()
    assert checked.errors == {} and checked.new_source.id == "LP2"
    assert checked.new_source.system == "208Y/120V 3ph 4w"
    assert form.next_card(checked.run, checked.new_source) == "LP2"
    assert form.values["from"] == "LP2" and form.typed == set()


def test_a_panel_declared_by_its_rating_alone_is_on_the_system_of_the_run_s_source(session):
    # a feeder does not change the system; only a transformer does (common practice)
    form = CardForm(session)
    form.start()
    system = session.job.source("SVC").system
    _typed(form, **{"from": "SVC", "to": "LP2", "length": "120", "panel": "225A main 200A"})
    checked = form.check()
    assert checked.errors == {}
    assert (checked.new_source.system, checked.new_source.rating_a) == (system, 225)


def test_a_feeder_to_a_transformer_declared_on_the_card_is_shown_without_a_neutral(session):
    # a transformer primary takes the hots only (common practice), as the walk sizes it once
    # stored (``checks.default_connection``): the card says so before, not "and neutral"
    form = CardForm(session)
    form.start()
    _typed(form, **{"from": "SVC", "to": "T9", "length": "30", "panel": "xfmr 120/240 25kVA"})
    checked = form.check()
    assert checked.errors == {}
    assert checked.circuit is not None and not checked.circuit.neutral
    assert "neutral" not in form.check().hints["circuit"]


def test_completion_takes_the_first_name_that_starts_with_the_text_in_any_case():
    assert complete("pro", ["Panel", "Proofer", "Prover"]) == "Proofer"
    assert complete("", ["Proofer"]) is None
    assert complete("x", ["Proofer"]) is None


# An invented walk with two panels whose runs are named by their circuit positions.
TWO_PANELS = """\
schema = 1

[job]
name = "Dockside deli"

[[source]]
id = "SVC"
kind = "service"
system = "208Y/120V 3ph 4w"

[[source]]
id = "LPA"
kind = "panel"
system = "208Y/120V 3ph 4w"

[[source]]
id = "LPB"
kind = "panel"
system = "208Y/120V 3ph 4w"

[[run]]
id = "F1"
from = "SVC"
to = "LPA"
length = "40"

[[run]]
id = "F2"
from = "SVC"
to = "LPB"
length = "60"

[[run]]
id = "LPA-1"
from = "LPA"
to = "Till"
length = "30"
load = { value = 6, unit = "A" }
connection = "LN"

[[run]]
id = "LPA-9/11"
from = "LPA"
to = "Slicer"
length = "25"
load = { value = 12, unit = "A" }
connection = "LL"

[[run]]
id = "LPB-11"
from = "LPB"
to = "Fryer"
length = "20"
load = { value = 20, unit = "A" }
connection = "LL"
"""


@pytest.fixture
def panels(tmp_path):
    return WalkSession.open(write_walk(tmp_path, TWO_PANELS))


def test_an_id_ending_in_circuit_positions_steps_past_the_highest_position(panels):
    form = CardForm(panels)
    form.start()
    form.type("from", "LPA")
    assert form.values["id"] == "LPA-12"  # after LPA-9/11, not LPA-9/12 or LPA-9/11/12
    form.type("from", "LPB")
    assert form.values["id"] == "LPB-12"


def test_an_id_in_the_style_of_another_source_is_not_copied(panels):
    from gaugewalk.model.walk.job import Run

    stray = Run.model_validate({"id": "LPB-12", "from": "LPA", "to": "Mixer", "length": "10",
                                "load": {"value": 5, "unit": "A"}, "connection": "LN"})
    assert panels.put_run(stray) is None
    form = CardForm(panels)
    form.start()
    form.type("from", "LPA")
    assert not form.values["id"].startswith("LPB")


def test_a_restored_card_moved_to_another_source_takes_that_sources_ids(panels):
    form = CardForm(panels)
    form.start()
    form.type("from", "LPB")
    form.type("to", "Toaster")
    assert form.values["id"] == "LPB-12"
    panels.keep_draft(form.draft())  # the app stops here; the card is kept as texts

    again = CardForm(panels)
    assert again.start() == "length"  # the first main field still needed
    assert again.restored and again.values["to"] == "Toaster"
    again.type("from", "LPA")
    assert again.values["id"] == "LPA-12"  # the id was the card's, not typed: it follows


def test_a_restored_card_keeps_an_id_that_was_typed(panels):
    form = CardForm(panels)
    form.start()
    form.type("from", "LPB")
    form.type("to", "Toaster")
    form.type("id", "TOAST")
    panels.keep_draft(form.draft())
    again = CardForm(panels)
    again.start()
    again.type("from", "LPA")
    assert again.values["id"] == "TOAST"


def test_the_first_branch_run_from_a_new_panel_is_one_pole_and_neutral_not_every_hot(session):
    form = CardForm(session)
    form.start()
    _typed(form, **{"from": "SVC", "to": "LP2", "length": "60", "panel": "208Y/120"})
    checked = form.check()
    assert form.next_card(checked.run, checked.new_source) == "LP2"
    session.put_run(checked.run, new_source=checked.new_source)
    form.values = form.fresh("LP2")
    assert form.values["circuit"] == "LN"
    checked = _typed(form, to="Display case", length="50", load="10A", size="12").check()
    c = checked.circuit
    # 208Y/120 V: 120 V line to neutral (common practice: the wye's 208 / sqrt 3)
    assert (c.volts, c.hots, c.neutral, c.phases) == (120, 1, True, 1)
    # NEC 2023 Ch. 9 Table 8, 12 AWG stranded Cu 1.98 ohm/kft: 2 x 10 A x 1.98 x 50 ft / 1000
    # = 1.98 V = 1.65 % of 120 V (as every hot and the neutral it would have been about 0.8 %)
    assert checked.result.voltage_drop_pct == pytest.approx(1.65, abs=0.005)


@pytest.mark.parametrize("load, circuit", [
    ("16A 120V", "LN"),
    ("16A 208V", "LL"),
    ("16 A 208 V", "LL"),
    ("16A 2P", "LL"),
    ("30A 3P", "3P"),
    ("5kVA 208V 3ph", "3P"),
    ("5kW 208V pf0.9", "LL"),
    ("16A 1P", "LN"),
])
def test_a_branch_circuit_follows_the_voltage_and_poles_its_load_states(session, load, circuit):
    form = CardForm(session)
    form.start()  # from LP1, 208Y/120 V; the last run there is LN
    _typed(form, to="Oven", length="30", load=load)
    assert form.values["circuit"] == circuit
    assert form.check().errors == {}


def test_a_load_voltage_the_panel_does_not_give_is_refused_naming_what_it_gives(session):
    form = CardForm(session)
    form.start()
    _typed(form, to="Heater", length="30", load="16A 240V")
    error = form.check().errors["load"]
    assert "not 240 V" in error and "120 V" in error and "208 V" in error


def test_a_typed_circuit_that_disagrees_with_the_load_is_refused_at_the_circuit(session):
    form = CardForm(session)
    form.start()
    _typed(form, to="Heater", length="30", circuit="LN", load="16A 208V")
    assert "the load says LL" in form.check().errors["circuit"]


def test_a_panel_without_a_neutral_defaults_its_branch_runs_to_two_poles(tmp_path):
    walk = TWO_PANELS.replace('id = "LPB"\nkind = "panel"\nsystem = "208Y/120V 3ph 4w"',
                              'id = "LPB"\nkind = "panel"\nsystem = "480V 3ph 3w"')
    walk = walk.replace('system = "208Y/120V 3ph 4w"', 'system = "480V 3ph 3w"', 1)  # the service
    walk = walk.replace('connection = "LN"', 'connection = "LL"')
    walk = walk.replace('id = "LPA"\nkind = "panel"\nsystem = "208Y/120V 3ph 4w"',
                        'id = "LPA"\nkind = "panel"\nsystem = "480V 3ph 3w"')
    walk = walk[:walk.index('[[run]]\nid = "LPA-1"')]  # feeders only: nothing to copy
    session = WalkSession.open(write_walk(tmp_path, walk))
    form = CardForm(session)
    form.start()
    form.type("from", "LPB")
    assert form.values["circuit"] == "LL"
    c = _typed(form, to="Heater", length="30", load="10A").check().circuit
    assert (c.volts, c.hots, c.neutral) == (480, 2, False)


def test_an_id_written_with_leading_zeros_keeps_its_width(tmp_path):
    walk = TWO_PANELS.replace('id = "LPB-11"', 'id = "LPB-01"')
    form = CardForm(WalkSession.open(write_walk(tmp_path, walk)))
    form.start()
    form.type("from", "LPB")
    assert form.values["id"] == "LPB-02"
    form.type("from", "LPA")
    assert form.values["id"] == "LPA-12"


# -- loads of a kind: the Kind and Nameplate fields --------------------------------------------

def test_a_load_in_hp_makes_a_motor_run_sized_by_article_430(session):
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="Pump", length="100", load="10hp", circuit="3P").check()
    assert checked.errors == {} and form.values["kind"] == "motor"
    assert form.values["continuous"] == "no"  # the motor rules, not 125 % continuous
    run = checked.run
    assert run is not None and (run.load.unit, run.load.kind) == ("hp", "motor")
    # NEC 2023 Table 430.250, 208 V column: 10 hp -> 30.8 A; 430.22: 38.5 A; 75 C Cu
    # (110.14(C)(1)(a)(4)): 10 AWG 35 A < 38.5, 8 AWG 50 A; Table 430.52(C)(1): 250 % x 30.8 =
    # 77 A -> 80 A (430.52(C)(1)(a))
    r = checked.result
    assert (r.flc_a, r.size, r.ocpd_a) == (30.8, "8 AWG", 80)


def test_an_hvac_run_is_typed_by_its_nameplate_alone(session):
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="RTU-1", length="50", kind="hvac", plate="mca 28 mocp 45",
                     circuit="3P").check()
    assert checked.errors == {}
    assert (checked.run.load.mca, checked.run.load.mocp, checked.run.load.value) == (28, 45, None)
    # NEC 440.4(B), 440.22(A): 10 AWG (60 C, 30 A) on 45 A
    assert (checked.result.size, checked.result.ocpd_a) == ("10 AWG", 45)
    assert "440.22" in checked.hints["kind"]


def test_a_nameplate_typed_in_the_load_field_makes_the_load_of_its_kind(session):
    # what a walker reads off a rooftop unit's plate goes where the load goes
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="RTU-1", length="50", load="MCA 28 MOCP 45").check()
    assert checked.errors == {} and form.values["kind"] == "hvac"
    assert form.values["circuit"] == "3P"  # HVAC: every hot (the card's usual circuit)
    load = checked.run.load
    assert (load.kind, load.mca, load.mocp, load.value) == ("hvac", 28, 45, None)
    # the same answer as the Kind and Nameplate fields give: NEC 440.4(B), 440.22(A),
    # Table 310.16 60 C column, 10 AWG Cu 30 A >= 28 A, on the 45 A maximum device
    assert (checked.result.size, checked.result.ocpd_a) == ("10 AWG", 45)
    assert checked.hints["load"] == "MCA 28 A HVAC, MOCP 45 A"


@pytest.mark.parametrize("load, kind, got", [
    ("i1eff 25 i1max 50", "welder", {"i1eff": 25, "i1max": 50}),
    ("4.5kW tank 50", "water-heater", {"value": 4.5, "unit": "kW", "tank_gal": 50}),
    ("1-1/2 hp code G", "motor", {"value": 1.5, "code_letter": "G"}),
    ("yokes 8", "receptacle", {"yokes": 8}),
    # a count written before its word, as people say it (common practice)
    ("6 yokes", "receptacle", {"yokes": 6}),
    ("6 duplex", "receptacle", {"yokes": 6}),
    ("4.5kW 50 gal", "water-heater", {"value": 4.5, "unit": "kW", "tank_gal": 50}),
    ("4.5kW tank 50 gal", "water-heater", {"value": 4.5, "unit": "kW", "tank_gal": 50}),
])
def test_the_kind_follows_the_nameplate_words_in_the_load_field(session, load, kind, got):
    from gaugewalk.model.session.card_form import read_load_text, split_load

    form = CardForm(session)
    form.start()
    checked = _typed(form, to="Unit", length="40", load=load).check()
    assert form.values["kind"] == kind
    assert checked.run is not None and checked.run.load.kind == kind
    assert {k: getattr(checked.run.load, k) for k in got} == got
    # a voltage or poles typed after the nameplate stay with the load's circuit
    assert split_load("mca 38 mocp 50 480V 3P") == ("480V 3P", "mca 38 mocp 50")
    assert read_load_text("480V 3P", value_needed=False).poles == 3


def test_a_kind_the_card_filled_in_follows_a_corrected_load(session):
    form = CardForm(session)
    form.start()
    _typed(form, to="Unit", length="40", load="10hp")
    assert form.values["kind"] == "motor"
    checked = _typed(form, load="16A").check()  # a slip corrected: no motor any more
    assert form.values["kind"] == "" and checked.run.load.kind == "general"
    _typed(form, kind="heater", load="4kW")  # a kind typed by the person stays
    _typed(form, load="5kW")
    assert form.values["kind"] == "heater"


@pytest.mark.parametrize("texts, key, reason", [
    ({"load": "mca 28 mcop 45"}, "load", "'mcop' is not a nameplate word"),
    ({"load": "mca 28", "kind": "hvac", "plate": "mca 30 mocp 45"}, "plate",
     "mca is typed in Load too"),
])
def test_a_nameplate_in_the_load_field_names_its_mistake(session, texts, key, reason):
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="Unit", length="40", **texts).check()
    assert reason in checked.errors[key] and checked.run is None


def test_the_nameplate_field_shows_only_for_a_kind_that_reads_one(session):
    from gaugewalk.model.session.card_form import placeholder, shown

    assert not shown("plate", {"kind": "", "load": "16A", "plate": ""})
    assert shown("plate", {"kind": "hvac", "load": "", "plate": ""})
    assert shown("plate", {"kind": "", "load": "10hp", "plate": ""})  # a motor by its hp
    assert placeholder("plate", {"kind": "welder", "load": "", "plate": ""}) == "i1eff 25 i1max 50"
    assert placeholder("plate", {"kind": "", "load": "mca 38 mocp 50", "plate": ""}) == (
        "typed in Load")


def test_a_load_named_for_lights_or_a_heater_is_filled_in_as_that_kind(session):
    # what the walker names the load says what it is: the card fills the kind in, as for hp
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="Taproom lights", length="40", load="1800VA").check()
    assert form.values["kind"] == "lighting" and form.values["continuous"] == "yes"
    # NEC 210.19(A)(1), 210.20(A): 1800 VA / 120 V = 15 A continuous, 125 % = 18.75 A -> 20 A
    # (240.6(A)), where a load of no kind would have been given the 15 A device
    assert (checked.result.design_amps, checked.result.ocpd_a) == (18.75, 20)
    checked = _typed(form, kind="general").check()  # a kind typed by the person decides
    assert checked.run.load.kind == "general" and checked.result.ocpd_a == 15
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="Unit heater 2", length="40", load="4kW", circuit="LL").check()
    # NEC 424.4(B): continuous; a resistance load, power factor 1: 4000 VA / 208 V = 19.2 A,
    # 125 % = 24.0 A -> 25 A (240.6(A)) (the invented walk's panel is 208Y/120 V)
    assert form.values["kind"] == "heater" and checked.result.ocpd_a == 25
    assert checked.result.design_amps == pytest.approx(4000 / 208 * 1.25)
    assert not any("taken at power factor" in n for n in checked.result.notes)
    _typed(form, to="Unit 2")  # renamed: the kind the card filled in follows the name
    assert form.values["kind"] == ""


def test_a_load_named_fire_pump_is_filled_in_as_a_fire_pump_even_in_hp(session):
    # a 25 hp motor named a fire pump is one: NEC Article 695, not 430, sizes it
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="Fire pump 1", length="60", load="25hp").check()
    assert form.values["kind"] == "fire-pump" and form.values["continuous"] == "no"
    assert form.values["circuit"] == "3P"   # every hot, as a motor's
    assert checked.run.load.kind == "fire-pump" and checked.errors == {}
    # NEC 2023 Table 430.250, 208 V: 74.8 A; Table 430.251(B) 208 V: 404 A (from memory, as
    # tables/ has it); 695.4(B)(2)(a)(1), 240.6(A): 450 A
    assert (checked.result.flc_a, checked.result.ocpd_a) == (74.8, 450)
    # the nameplate's locked-rotor current, typed after the load, decides the device instead
    checked = _typed(form, load="25hp lra 380").check()
    assert checked.run.load.lra == 380 and checked.result.ocpd_a == 400
    assert form.values["kind"] == "fire-pump"
    # the person's kind decides (and the walk then says the name reads as a fire pump)
    checked = _typed(form, load="25hp", kind="motor").check()
    assert checked.run.load.kind == "motor"


def test_the_card_says_the_power_factor_a_load_in_kw_is_taken_at(session):
    # 10 kW at the job's 0.85: S = P / pf = 11.76 kVA (the power triangle), said as it is typed
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="Pizza oven", length="30", load="10kW 3P").check()
    assert checked.taken == (
        "10 kW taken at power factor 0.85, the job's, as the load gives none: 11.76 kVA; give "
        "its own power factor where it is known (pf 1 for a resistance load)",)
    assert checked.result.notes[0] == checked.taken[0]   # the run's notes say the same
    assert _typed(form, load="10kW 3P pf1").check().taken == ()
    assert _typed(form, load="30A 3P").check().taken == ()


def test_the_start_of_one_kind_is_that_kind(session):
    # typed fast, "ev" and Enter: the one kind it starts is taken, and the card says which
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="Charger", length="40", load="48A", kind="ev", circuit="LL").check()
    assert checked.errors == {} and checked.run.load.kind == "ev-charger"
    assert checked.hints["kind"].startswith("= ev-charger: NEC 625.41")
    # NEC 625.42: continuous, 125 % of 48 A = 60 A; 210.20(A): a 60 A device
    assert (checked.result.design_amps, checked.result.ocpd_a) == (60.0, 60)
    checked = _typed(form, kind="REC", load="yokes 4", circuit="").check()
    assert checked.run.load.kind == "receptacle"


def test_a_stored_run_given_another_kind_takes_that_kinds_continuous(session):
    # a 40 A load stored as general, then found to be an EV charger: NEC 625.42 makes it
    # continuous, which the card fills in (the person typed nothing there in this card)
    form = CardForm(session)
    form.start()
    run = _typed(form, to="Charger", length="40", load="40A", circuit="LL").check().run
    session.put_run(run)
    edit = CardForm(session, run.id)
    edit.start()
    assert edit.values["continuous"] == "no"
    assert edit.type("kind", "ev") == {"continuous": "yes"}
    checked = edit.check()
    # NEC 625.42: 125 % of 40 A = 50 A; 210.20(A): a 50 A device
    assert checked.errors == {} and (checked.result.design_amps, checked.result.ocpd_a) == (50, 50)
    assert edit.type("kind", "") == {"continuous": "no"}  # general again: as it was stored
    edit.type("continuous", "yes")                        # typed: it stays as typed
    assert edit.type("kind", "motor") == {} and edit.values["continuous"] == "yes"


def test_a_blank_continuous_is_what_the_kind_makes_it(session):
    # the field emptied on an EV charger's card: the run takes NEC 625.42's continuous load
    # (125 % of 32 A = 40 A design, a 40 A device by 210.20(A)), not a "no" its article refuses
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="EV charger 1", length="90", load="32A 208V", kind="ev",
                     continuous="").check()
    assert checked.errors == {}
    assert checked.run.continuous is None and checked.run.load.kind == "ev-charger"
    assert (checked.result.design_amps, checked.result.ocpd_a) == (40.0, 40)
    general = _typed(form, to="Bench", length="40", load="12A", kind="", circuit="LN",
                     continuous=" ").check()
    assert general.errors == {} and general.result.design_amps == 12.0   # not continuous


@pytest.mark.parametrize("texts, key, reason", [
    ({"kind": "blender", "load": "5A"}, "kind", "one of general, motor"),
    ({"kind": "h", "load": "5A"}, "kind", "'h' starts hvac and heater; one of general"),
    ({"kind": "hvac", "plate": "mca 28 zz 3"}, "plate", "'zz' is not a nameplate word"),
    ({"kind": "hvac", "plate": "mca"}, "plate", "needs its value"),
    ({"kind": "ev-charger", "load": "48A", "circuit": "LL", "continuous": "no"}, "continuous",
     "NEC 625.42"),
    ({"load": "10hp", "circuit": "3P", "continuous": "yes"}, "continuous", "430.22"),
    ({"kind": "motor", "load": "5A", "plate": "mca 20"}, "plate", "mca is for a load of kind hvac"),
])
def test_a_wrong_kind_or_nameplate_is_named_at_its_field(session, texts, key, reason):
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="Unit", length="40", **texts).check()
    assert reason in checked.errors[key] and checked.run is None


def test_a_run_of_a_kind_reads_back_into_the_card(session):
    from gaugewalk.model.session.card_form import read_nameplate, run_to_fields

    form = CardForm(session)
    form.start()
    checked = _typed(form, to="Baler", length="60", load="1-1/2 hp", circuit="3P",
                     plate="dual-element code G").check()
    fields = run_to_fields(checked.run)
    assert (fields["load"], fields["kind"], fields["plate"]) == ("1-1/2hp", "motor",
                                                                 "dual-element code G")
    assert read_nameplate(fields["plate"]) == {"motor_device": "dual-element", "code_letter": "G"}


def test_the_card_takes_a_breaker_position_or_a_phase_and_names_the_lines(session):
    form = CardForm(session)
    form.start()
    # a 2-pole 208 V circuit at 5 takes 5 (C) and 7 (A): CA (rows A, B, C; common practice)
    checked = _typed(form, to="Heater", length="30", load="4kW 208V", place="5").check()
    assert checked.errors == {}
    assert checked.run.position == 5 and checked.run.phase is None
    assert checked.hints["place"] == "5-7 on CA"
    checked = _typed(form, place="bc").check()
    assert checked.run.phase == "BC" and checked.run.position is None
    checked = _typed(form, place="").check()
    assert (checked.run.position, checked.run.phase) == (None, None)
    assert "balance" in checked.hints["place"]


@pytest.mark.parametrize("text", ["0", "999", "D", "5A"])
def test_a_position_or_phase_that_cannot_be_is_named(session, text):
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="Lamp", length="30", load="5A", place=text).check()
    assert "place" in checked.errors and checked.run is None


def test_a_card_like_the_last_run_copies_it_with_to_stepped_and_the_next_id(session):
    form = CardForm(session)
    form.start()
    _typed(form, to="Troffers row 1", length="62+10", load="1150VA", continuous="yes",
           spread="yes", circuit="LL", raceway="PVC-40", notes="over the racks")
    stored = form.check().run
    assert stored is not None
    session.put_run(stored)
    form.next_card(stored, None)
    assert form.proposed_to() == "Troffers row 2"
    assert form.like(form.last_run()) == "length"  # typing goes on in Length
    v = form.values
    assert (v["from"], v["to"], v["length"], v["load"], v["continuous"], v["spread"]) == (
        "LP1", "Troffers row 2", "62+10", "1150VA", "yes", "yes")
    assert (v["circuit"], v["raceway"], v["id"], v["notes"]) == ("LL", "PVC-40", "R3", "")
    form.type("length", "74+10")
    run = form.check().run
    assert run is not None and (run.id, run.to, run.length) == ("R3", "Troffers row 2", "74+10")


def test_continuous_is_copied_from_the_last_run_only_for_the_same_kind_of_load(session):
    form = CardForm(session)
    form.start()
    charger = _typed(form, to="EV bay 1", length="60", load="40A", kind="ev-charger",
                     circuit="LL").check().run
    assert charger is not None and form.values["continuous"] == "yes"  # NEC 625.42
    session.put_run(charger)
    form.next_card(charger, None)
    # a plain 16 A load typed next is not continuous because the charger was
    _typed(form, to="Counter", length="30", load="16A")
    assert form.values["continuous"] == "no"
    counter = _typed(form, continuous="yes").check().run  # the person says it is
    session.put_run(counter)
    form.next_card(counter, None)
    _typed(form, to="Counter 2", length="32", load="12A")
    assert form.values["continuous"] == "yes"  # the same kind: copied as before


def test_a_card_like_a_run_whose_name_has_nothing_to_step_keeps_the_name(session):
    form = CardForm(session)
    form.start()
    assert form.proposed_to() is None  # "Proofer" has no number or closing letter
    form.like(form.last_run())  # R1, from LP1: 16A on LN, 12 AWG fixed
    v = form.values
    assert (v["to"], v["load"], v["size"], v["circuit"], v["id"]) == (
        "Proofer", "16A", "12 AWG", "LN", "R2")


def test_a_card_made_like_the_last_run_keeps_what_was_typed_on_it_first(session):
    form = CardForm(session)
    form.start()
    form.type("to", "Walk-in cooler")
    assert form.like(form.last_run()) == "length"
    v = form.values
    assert (v["to"], v["length"], v["load"], v["size"], v["id"]) == (
        "Walk-in cooler", "100", "16A", "12 AWG", "R2")
    again = CardForm(session)
    again.start()
    again.type("to", "Walk-in cooler")
    again.type("length", "45")
    assert again.like(again.last_run()) == "load"  # the length typed is kept too
    assert (again.values["to"], again.values["length"], again.values["load"]) == (
        "Walk-in cooler", "45", "16A")


def test_a_card_like_a_run_with_a_position_takes_the_next_position_its_poles_fit(tmp_path):

    text = panel_walk("Positions", run_table("R1", "LP1", "Row 1", "40", load=(8, "A"),
                                             connection="LN", position=1),
                      run_table("R2", "LP1", "Dryer", "30", load=(20, "A"), connection="LL",
                                position=3))
    session = WalkSession.open(write_walk(tmp_path, text))
    form = CardForm(session)
    form.start()
    form.like(session.job.run("R1"))  # one pole below 1: 3 and 5 are R2's two poles
    assert (form.values["to"], form.values["place"]) == ("Row 2", "7")
    again = CardForm(session)
    again.start()
    again.like(session.job.run("R2"))  # two poles below 3: 5 is taken, 7 and 9 are free
    assert again.values["place"] == "7"
    session.put_run(again.check().run.model_copy(update={"length": "35"}))
    third = CardForm(session)
    third.start()
    third.like(session.job.run("R2"))  # 7 and 9 taken now: 11 and 13
    assert third.values["place"] == "11"


def test_the_card_puts_a_run_in_a_shared_raceway_and_sizes_it_with_its_neighbours(tmp_path):
    from tests.support.walks import panel_walk, run_table, tables_text

    # three 120 V circuits already in HR1 (6 CCC: hot and neutral of each, NEC 310.15(E));
    # the card's run makes 8: NEC Table 310.15(C)(1) 7-9, 70 %
    text = panel_walk("Shared card", *[
        run_table(f"R{i}", "LP1", f"Lights {i}", "40", load=(10, "A"), connection="LN",
                  raceway_id="HR1") for i in (1, 2, 3)]) + tables_text(
        "raceway", [{"id": "HR1", "type": "EMT", "length": "30"}])
    session = WalkSession.open(write_walk(tmp_path, text))
    form = CardForm(session)
    form.start()
    form.type("raceway_id", "HR9")
    assert "no shared raceway 'HR9'; the walk has HR1" in form.check().errors["raceway_id"]
    checked = _typed(form, to="Lights 4", length="40", load="10A", raceway_id="HR1").check()
    assert checked.errors == {}
    assert checked.run.raceway_id == "HR1"
    assert any("310.15(C)(1): 8 current-carrying conductors, factor 0.7" in n
               for n in checked.result.notes)
    assert "x0.8" in checked.hints["raceway_id"]  # what HR1 takes now: 6 CCC, 80 %


def test_a_fresh_card_shows_the_jobs_raceway_not_the_last_runs_but_ctrl_r_copies_it(tmp_path):
    # issue 13: a default never misleads; a raceway typed for one run (PVC-40 underground) must
    # not ride unseen below the line into the next card, while "like the last" copies it
    from tests.support.walks import panel_walk, run_table
    path = write_walk(tmp_path, panel_walk("Ferry terminal", run_table(
        "R1", "LP1", "Bollard light 1", "140", load=(2, "A"), connection="LN",
        raceway="PVC-40", material="al")))
    form = CardForm(WalkSession.open(path))
    form.start()
    assert (form.values["raceway"], form.values["material"]) == ("", "")
    form.like(form.session.job.run("R1"))
    assert (form.values["raceway"], form.values["material"]) == ("PVC-40", "al")


def test_the_card_refuses_a_120_v_circuit_on_a_deltas_high_leg(tmp_path):
    # NEC 110.15: phase B of a 240/120 V 4-wire delta is about 208 V to neutral
    from tests.support.walks import walk_text

    text = walk_text("shop", sources=[{"id": "SVC", "kind": "service",
                                       "system": "240/120V 3ph 4w delta"}])
    session = WalkSession.open(write_walk(tmp_path, text))
    form = CardForm(session)
    form.start()
    _typed(form, **{"from": "SVC", "to": "Bench", "length": "30", "load": "12A",
                    "circuit": "LN", "place": "3"})
    assert "high leg" in form.check().errors["place"]
    form.type("place", "B")
    assert "high leg" in form.check().errors["place"]
    form.type("place", "5")   # 5-6 on C
    assert "place" not in form.check().errors
    form.type("circuit", "LL")   # 240 V without the neutral may use B
    form.type("place", "3")
    assert "place" not in form.check().errors


def test_a_general_run_whose_name_says_a_kind_keeps_general_when_edited(session):
    # a run stored as a general load though its name reads as lighting (a sign, lights): its
    # card says 'general', so storing it again does not make it lighting (continuous, common
    # practice) behind the person's back
    form = CardForm(session)
    form.start()
    run = _typed(form, to="Shop lights", length="40", load="10A", kind="general",
                 circuit="LN").check().run
    assert run.load.kind == "general" and run.continuous is None
    session.put_run(run)
    edit = CardForm(session, run.id)
    edit.start()
    assert edit.values["kind"] == "general"
    again = edit.check()
    assert again.errors == {} and again.run.load.kind == "general"
    assert again.result.design_amps == 10.0   # not 125 %: not continuous


def test_a_kva_load_to_a_name_like_a_transformer_asks_whether_it_is_one(session):
    # 'T1' with '45kVA' typed fast in Load: a 45 kVA load it may be (sized as one), but the card
    # asks whether the kVA was meant for New panel (ctrl+o), where it makes a transformer
    form = CardForm(session)
    form.start()
    checked = _typed(form, to="T1", length="40", load="45kVA").check()
    assert checked.hints["load"] == "a transformer? ^o"
    assert "load" not in _typed(form, to="Oven 2", load="45kVA").check().hints
    assert "load" not in _typed(form, to="T1", load="16A").check().hints
