"""Raceways in sunlight just above a roof: NEC 2023 310.15(B)(2) adds 33 C to the outdoor
temperature before the ambient correction; XHHW-2 is excepted. Through the engine, the walk file,
the command line, the run card and the report."""

from __future__ import annotations

import json

import pytest

from gaugewalk.model.engine.circuits import circuit_from_volts
from gaugewalk.model.engine.contract import RunSpec
from gaugewalk.model.engine.sizing import evaluate
from gaugewalk.model.session.card_form import CardForm
from gaugewalk.model.session.session import WalkSession
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.tables.conductor.ampacity import ambient_factor, rooftop_ambient
from gaugewalk.tui.cli import report as cmd_report
from gaugewalk.tui.cli.main import main
from tests.support.golden import gaugewalk
from tests.support.walks import panel_walk, run_table, write_walk

C480_3 = circuit_from_volts(480, 3)


def test_the_rooftop_adder_is_33_c_and_xhhw_2_takes_none():
    # NEC 2023 310.15(B)(2): 33 C (60 F) added where the raceway is less than 23 mm (7/8 in)
    # above the roof; its exception for Type XHHW-2
    assert rooftop_ambient(30.0, "THHN/THWN-2")[0] == 63.0
    assert rooftop_ambient(38.0, "THHN")[0] == 71.0
    assert rooftop_ambient(30.0, "XHHW-2")[0] == 30.0
    # NEC 2023 Table 310.15(B)(1)(1), row 61-65 C (from memory): 75 C 0.47, 90 C 0.65
    assert (ambient_factor(63.0, 75), ambient_factor(63.0, 90)) == (0.47, 0.65)


def test_a_rooftop_run_takes_the_next_size_where_the_corrected_ampacity_falls_short():
    # 50 A at 480 V three-phase, 60 C terminals (NEC 110.14(C)(1)(a), 50 A circuit).
    # NEC 2023 Table 310.16 Cu: 6 AWG 55 A at 60 C, 75 A at 90 C; 4 AWG 70 A at 60 C, 95 A at
    # 90 C. On the roof at 63 C: 6 AWG 75 x 0.65 = 48.75 A < 50 A; 4 AWG 95 x 0.65 = 61.75 A.
    ground = evaluate(RunSpec(circuit=C480_3, amps=50.0, length_ft=60.0))
    roof = evaluate(RunSpec(circuit=C480_3, amps=50.0, length_ft=60.0, rooftop=True))
    xhhw = evaluate(RunSpec(circuit=C480_3, amps=50.0, length_ft=60.0, rooftop=True,
                            insulation="XHHW-2"))
    assert (ground.size, roof.size, xhhw.size) == ("6 AWG", "4 AWG", "6 AWG")
    assert roof.ampacity_a == pytest.approx(61.75)
    assert any(n.startswith("NEC 310.15(B)(2): rooftop") and "63 C ambient" in n
               for n in roof.notes)
    assert any("XHHW-2 takes no rooftop adder" in n for n in xhhw.notes)


def _walk(tmp_path):
    return write_walk(tmp_path, panel_walk(
        "Roof", run_table("R1", "LP1", "Condenser", "60", load=(50, "A"), connection="3P")))


def test_the_walk_the_command_line_and_the_report_carry_the_mark(tmp_path, capsys):
    walk = tmp_path / "roof.toml"
    walk.write_text(panel_walk("Roof"), encoding="utf-8")
    assert main(["add", str(walk), "--from", "LP1", "--to", "Condenser", "--length", "60",
                 "--amps", "50", "--connection", "3P", "--rooftop"]) == 0
    assert load_walk(walk).runs[-1].rooftop is True
    assert "rooftop = true" in walk.read_text(encoding="utf-8")
    capsys.readouterr()
    main(["check", "--json", str(walk)])
    entry = json.loads(capsys.readouterr().out)["runs"][-1]
    assert entry["rooftop"] is True
    assert main(["calc", "--amps", "50", "--length", "60", "--volts", "480", "--phase", "3",
                 "--rooftop", "--json"]) == 0
    calc = json.loads(capsys.readouterr().out)
    assert calc["inputs"]["rooftop"] is True and calc["size"] == "4 AWG"
    out = tmp_path / "roof.md"
    assert gaugewalk(cmd_report, [str(walk), "-o", str(out)]) == 0
    assert "rooftop: +33 C ambient (NEC 310.15(B)(2))" in out.read_text(encoding="utf-8")


def test_the_run_card_marks_a_run_rooftop_and_an_edit_keeps_it(tmp_path):
    session = WalkSession.open(_walk(tmp_path))
    form = CardForm(session)
    form.start()
    for key, text in (("to", "Condenser 2"), ("length", "60"), ("load", "50A"),
                      ("circuit", "3P"), ("rooftop", "yes")):
        form.type(key, text)
    checked = form.check()
    assert checked.errors == {} and checked.run is not None and checked.run.rooftop is True
    assert checked.hints["rooftop"] == "+33C 310.15(B)(2)"
    session.put_run(checked.run)
    assert session.result_for(checked.run.id).size == "4 AWG"
    edit = CardForm(session, run_id=checked.run.id)
    edit.start()
    assert edit.values["rooftop"] == "yes"
    edit.type("length", "70")
    assert edit.check().run.rooftop is True
    session.job.defaults.insulation = "XHHW-2"  # NEC 310.15(B)(2) Exception
    assert edit.check().hints["rooftop"] == "XHHW-2: no adder"
