"""A fire pump through every headless face: ``calc --kind fire-pump``, ``add``, ``check`` (its
table and ``--json``) and the report's rules. The figures are the hand-worked cases of
tests/engine/test_fire_pump.py (NEC 2023 Table 430.250 65 A; Table 430.251(B) 363 A, from
memory; 695.4(B)(2)(a)(1) and 240.6(A) 400 A; 695.6(C) 81.25 A, Table 310.16 4 AWG Cu)."""

from __future__ import annotations

import json

from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.model.walkfile.write import dumps_walk
from gaugewalk.tui.cli.main import main


def test_calc_sizes_a_fire_pump_by_article_695(capsys):
    assert main(["calc", "--kind", "fire-pump", "--hp", "50", "--volts", "480", "--phase", "3",
                 "--length", "100", "--json"]) == 0
    d = json.loads(capsys.readouterr().out)
    assert (d["load_kind"], d["flc_a"], d["design_amps"], d["locked_rotor_a"], d["ocpd_a"],
            d["size"]) == ("fire-pump", 65.0, 81.25, 363.0, 400, "4 AWG")
    # NEC 695.7: 5 % running (own and from the service), 15 % starting, whatever the defaults
    inputs = d["inputs"]
    assert (inputs["max_drop_pct"], inputs["max_total_drop_pct"],
            inputs["starting_drop_pct"]) == (5.0, 5.0, 15.0)
    assert d["ok"] and any("695.7(B)" in n for n in d["notes"])
    # a plain motor keeps calc's own defaults (3 %, informational note to NEC 210.19)
    assert main(["calc", "--hp", "50", "--volts", "480", "--phase", "3", "--length", "100",
                 "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["inputs"]["max_drop_pct"] == 3.0


def test_calc_takes_a_stated_locked_rotor_current(capsys):
    # 695.4(B)(2)(a)(1), 240.6(A): 290 A -> 300 A
    assert main(["calc", "--kind", "fire-pump", "--hp", "40", "--lra", "290", "--volts", "480",
                 "--phase", "3", "--length", "100", "--json"]) == 0
    d = json.loads(capsys.readouterr().out)
    assert (d["locked_rotor_a"], d["ocpd_a"]) == (290.0, 300)
    assert d["inputs"]["load"]["lra"] == 290.0


def test_calc_refuses_an_lra_for_a_general_load(capsys):
    assert main(["calc", "--amps", "20", "--lra", "100", "--volts", "480", "--length",
                 "50"]) == 2
    err = capsys.readouterr().err
    assert "argument --lra: is for --kind motor or fire-pump, not general" in err
    assert "Traceback" not in err


def test_add_check_and_report_carry_the_fire_pump(shop, tmp_path, capsys):
    assert main(["add", str(shop), "--from", "SVC", "--to", "Fire pump 1", "--length", "100",
                 "--hp", "50", "--kind", "fire-pump", "--lra", "363"]) == 0
    assert main(["add", str(shop), "--from", "SVC", "--to", "Fire pump 2", "--length", "100",
                 "--hp", "50"]) == 0   # a motor, by the name a fire pump: a problem
    capsys.readouterr()
    job = load_walk(shop)
    fp = job.run("R1")
    assert (fp.load.kind, fp.load.unit, fp.load.lra, fp.connection) == ("fire-pump", "hp", 363,
                                                                        "3P")
    assert dumps_walk(load_walk(shop)) == shop.read_text()

    assert main(["check", str(shop), "--json"]) == 1
    runs = {r["id"]: r for r in json.loads(capsys.readouterr().out)["runs"]}
    r1, r2 = runs["R1"], runs["R2"]
    assert (r1["load_kind"], r1["ocpd_a"], r1["size"], r1["problems"]) == (
        "fire-pump", 400, "4 AWG", [])
    assert any("230.82(5)" in n for n in r1["notes"])
    assert r1["load"] == "50 hp"
    assert any("reads as a fire pump" in p for p in r2["problems"])

    assert main(["check", str(shop)]) == 1
    out = capsys.readouterr().out
    assert "reads as a fire pump" in out

    report = tmp_path / "shop.md"
    assert main(["report", str(shop), "-o", str(report)]) == 0
    text = report.read_text()
    section = text.split("## Equipment by its article", 1)[1].split("\n## ", 1)[0]
    assert "| R1 | fire-pump | 50 hp fire pump, LRA 363 A (65 A full-load) | 81.2 | 400 |" in (
        section)
    assert "Fire pump drop targets" in text and "695.7(B)" in text
    assert "695.4(B)(2)(a)(1)" in text   # the rules applied, at the end
