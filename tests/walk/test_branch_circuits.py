"""A branch run's circuit when the walk does not state it: the usual circuit for its kind of
load (written by the card and by ``add``), and a stated note where the file leaves it out."""

from __future__ import annotations

import json

import pytest

from gaugewalk.model.session.card_form import CardForm
from gaugewalk.model.session.session import WalkSession
from gaugewalk.model.walk.checks import branch_circuit_for_kind
from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.tui.cli.main import main
from tests.support.walks import panel_walk, run_table, write_walk

WYE_208 = "208Y/120V 3ph 4w"
WYE_480 = "480Y/277V 3ph 4w"
SPLIT_240 = "120/240V 1ph 3w"


@pytest.mark.parametrize(("system", "kind", "hp", "circuit"), [
    # common practice: receptacles, lighting and general loads on one pole and the neutral
    (WYE_208, "general", None, "LN"),
    (WYE_208, "lighting", None, "LN"),
    # common practice: 208 V chargers, water heaters, heaters and welders line to line
    (WYE_208, "ev-charger", None, "LL"),
    (WYE_208, "water-heater", None, "LL"),
    (SPLIT_240, "heater", None, "LL"),
    # common practice: motors of 1 hp and up and packaged HVAC on every hot, no neutral
    (WYE_480, "motor", 25, "3P"),
    (WYE_208, "hvac", None, "3P"),
    (SPLIT_240, "motor", 5, "LL"),
    # NEC 2023 Table 430.248 has a 115 V column for small motors, none for 277 V: a 1/3 hp motor
    # is a 120 V motor on a 208Y/120 panel, a three-phase one on a 480Y/277 panel
    (WYE_208, "motor", 1 / 3, "LN"),
    (WYE_480, "motor", 0.5, "3P"),
])
def test_the_usual_circuit_follows_the_kind_of_load(system, kind, hp, circuit):
    assert branch_circuit_for_kind(system, kind, hp) == circuit


def _walk_with(tmp_path, **keys):
    return write_walk(tmp_path, panel_walk(
        "Tannery", run_table("R1", "LP1", "Dryer", "60", load=(20, "A"), **keys)))


def test_a_branch_run_with_no_circuit_in_the_file_says_how_it_was_computed(tmp_path):
    job = load_walk(_walk_with(tmp_path))
    notes = compute_job(job).runs["R1"].notes
    assert any("circuit not stated" in n and "3PN" in n for n in notes)
    # the feeder F1 names no circuit either, and needs none: it feeds every hot of its panel
    assert not any("circuit not stated" in n for n in compute_job(job).runs["F1"].notes)


def test_a_stated_circuit_brings_no_note(tmp_path):
    job = load_walk(_walk_with(tmp_path, connection="LL"))
    assert not any("circuit not stated" in n for n in compute_job(job).runs["R1"].notes)


def test_add_writes_the_usual_circuit_for_a_charger_and_says_so(tmp_path, capsys):
    path = _walk_with(tmp_path, connection="LN")
    assert main(["add", str(path), "--from", "LP1", "--to", "Bay 4 charger", "--length", "70",
                 "--kind", "ev-charger", "--amps", "32"]) == 0
    out = capsys.readouterr().out
    assert "circuit LL: 208 V, 2 poles" in out
    run = load_walk(path).run("R2")
    assert run is not None and run.connection == "LL"
    assert main(["check", str(path), "--json"]) in (0, 1)
    runs = {r["id"]: r for r in json.loads(capsys.readouterr().out)["runs"]}
    # NEC 625.42: 125 % of 32 A = 40 A; Table 310.16 60 C column: 8 AWG Cu (40 A)
    assert runs["R2"]["ocpd_a"] == 40 and runs["R2"]["size"].startswith("8 AWG")


def test_add_keeps_a_circuit_given_on_the_command_line(tmp_path, capsys):
    path = _walk_with(tmp_path, connection="LN")
    assert main(["add", str(path), "--from", "LP1", "--to", "Heater", "--length", "30",
                 "--kind", "heater", "--kw", "3", "--connection", "3P"]) == 0
    assert "the usual for this kind" not in capsys.readouterr().out
    assert load_walk(path).run("R2").connection == "3P"


def test_the_card_gives_a_motor_after_a_lighting_run_every_hot_not_the_lights_circuit(tmp_path):
    form = CardForm(WalkSession.open(_walk_with(tmp_path, connection="LN")))
    form.start()
    form.type("to", "Chiller pump")
    form.type("length", "45")
    form.type("load", "10hp")
    # common practice: a 10 hp motor on a 208Y/120 panel is three-phase
    assert form.values["circuit"] == "3P"
    checked = form.check()
    assert checked.errors == {} and checked.run.connection == "3P"
