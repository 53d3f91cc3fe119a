"""Loads of a kind end to end: ``calc`` and ``add`` with the shared load options, the walk file
keeping the kind and nameplate, ``check --json`` and the report's equipment table. The figures
are the hand-worked cases of tests/engine/test_load_kinds.py (NEC 2023 sections named there)."""

from __future__ import annotations

import json

import pytest

from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.model.walkfile.write import dumps_walk
from gaugewalk.tui.cli.main import main


def calc_json(capsys, *argv: str) -> dict:
    code = main(["calc", *argv, "--json"])
    out, err = capsys.readouterr()
    assert code == 0, err
    return json.loads(out)


def refused(capsys, *argv: str) -> str:
    assert main(list(argv)) == 2
    err = capsys.readouterr().err
    assert "Traceback" not in err
    return err


def test_calc_sizes_a_25_hp_motor_by_horsepower(capsys):
    # NEC 2023 Table 430.250 (34 A), 430.22 (42.5 A), Table 430.52(C)(1) with (C)(1)(a) (85 ->
    # 90 A), 250.122(D)(1) and Table 250.122 (8 AWG); Table 430.251(B) 183 A (from memory)
    d = calc_json(capsys, "--hp", "25", "--volts", "460", "--phase", "3", "--length", "100")
    assert (d["load_kind"], d["flc_a"], d["size"], d["ocpd_a"], d["egc_size"]) == (
        "motor", 34.0, "8 AWG", 90, "8 AWG")
    assert d["design_amps"] == 42.5 and d["locked_rotor_a"] == 183.0
    assert d["starting_drop_pct"] > d["voltage_drop_pct"] > 0
    assert d["inputs"]["load"] == {"value": 25.0, "unit": "hp", "kind": "motor"}


@pytest.mark.parametrize(("hp", "flc"), [
    # NEC 2023 Table 430.248, 230 V column: 1/2 hp 4.9 A, 1-1/2 hp 10 A
    ("1/2", 4.9), ("1-1/2", 10.0), ("1.5", 10.0),
])
def test_calc_reads_the_trades_horsepower_fractions(capsys, hp, flc):
    d = calc_json(capsys, "--hp", hp, "--volts", "230", "--length", "40")
    assert d["flc_a"] == flc


def test_calc_sizes_hvac_ev_water_heater_and_welder_as_their_articles_say(capsys):
    # NEC 440.4(B)/440.22: MCA 28, MOCP 45 -> 10 AWG on 45 A
    d = calc_json(capsys, "--kind", "hvac", "--mca", "28", "--mocp", "45", "--volts", "208",
                  "--phase", "3", "--length", "50")
    assert (d["load_kind"], d["size"], d["ocpd_a"], d["design_amps"]) == ("hvac", "10 AWG", 45, 28)
    # NEC 625.41/625.42: 48 A x 1.25 = 60 A device
    d = calc_json(capsys, "--kind", "ev-charger", "--amps", "48", "--volts", "240",
                  "--length", "50")
    assert (d["ocpd_a"], d["design_amps"]) == (60, 60.0)
    # NEC 422.13: 4.5 kW / 240 V at pf 1 = 18.75 A; x 1.25 = 23.4 A -> 10 AWG on 25 A
    d = calc_json(capsys, "--kind", "water-heater", "--kw", "4.5", "--volts", "240",
                  "--length", "50")
    assert (d["amps"], d["size"], d["ocpd_a"]) == (pytest.approx(18.75), "10 AWG", 25)
    assert d["inputs"]["pf"] == 1.0
    # NEC 630.11(A): I1eff 25 A -> 10 AWG (60 C, 30 A)
    d = calc_json(capsys, "--kind", "welder", "--i1eff", "25", "--i1max", "50", "--volts", "240",
                  "--length", "50")
    assert (d["size"], d["ocpd_a"], d["load_kind"]) == ("10 AWG", 50, "welder")


def test_lighting_is_continuous_unless_told_not(capsys):
    # common practice: lighting burns 3 h or more; 16 A x 1.25 = 20 A (NEC 210.19(A)(1))
    argv = ("--kind", "lighting", "--amps", "16", "--volts", "277", "--length", "60")
    assert calc_json(capsys, *argv)["design_amps"] == 20.0
    assert calc_json(capsys, *argv, "--no-continuous")["design_amps"] == 16.0


def test_calc_text_names_the_kind_and_the_starting_drop(capsys):
    assert main(["calc", "--hp", "25", "--volts", "460", "--phase", "3", "--length", "100"]) == 0
    out = capsys.readouterr().out
    assert "motor: NEC 430.6(A)(1)" in out and "starting drop" in out
    assert "90 A" in out


@pytest.mark.parametrize(("argv", "words"), [
    (["--hp", "25", "--kind", "hvac"], "argument --hp: a load in hp is a motor"),
    (["--amps", "20", "--mca", "28"], "argument --mca: is for --kind hvac, not general"),
    (["--kind", "hvac", "--mca", "28", "--mocp", "45", "--continuous"],
     "argument --continuous: continuous does not apply to HVAC equipment"),
    (["--kind", "ev-charger", "--amps", "48", "--no-continuous"],
     "argument --continuous: NEC 625.42 makes an EV charger's load continuous"),
    (["--hp", "2-1/3"], "Table 430.250 lists no 2-1/3 hp motor"),
    (["--hp", "lots"], "argument --hp: 'lots' is not a horsepower"),
    (["--hp", "25", "--code-letter", "I"], "code letter of NEC Table 430.7(B)"),
    (["--kind", "motor"], "one of the arguments --amps"),
])
def test_calc_refuses_options_that_do_not_fit_the_kind(capsys, argv, words):
    err = refused(capsys, "calc", *argv, "--volts", "460", "--phase", "3", "--length", "50")
    assert words in err


def test_add_takes_every_load_option_and_the_walk_keeps_them(shop, capsys):
    assert main(["add", str(shop), "--from", "SVC", "--to", "Baler", "--length", "100",
                 "--hp", "25", "--motor-device", "dual-element", "--code-letter", "G"]) == 0
    out = capsys.readouterr().out
    # NEC Table 430.52(C)(1): dual-element fuse 175 % x 34 A = 59.5 -> 60 A
    assert "motor, 1x 8 AWG cu on 60 A" in out and "starting" in out
    assert main(["add", str(shop), "--from", "SVC", "--to", "RTU-1", "--length", "50",
                 "--kind", "hvac", "--mca", "28", "--mocp", "45"]) == 0
    assert main(["add", str(shop), "--from", "SVC", "--to", "Welder", "--length", "40",
                 "--kind", "welder", "--rated-amps", "40", "--duty-cycle", "50",
                 "--connection", "LL"]) == 0
    capsys.readouterr()
    job = load_walk(shop)
    baler, rtu, welder = (job.run(r) for r in ("R1", "R2", "R3"))
    assert (baler.load.kind, baler.load.unit, baler.load.motor_device, baler.load.code_letter) == (
        "motor", "hp", "dual-element", "G")
    assert (rtu.load.kind, rtu.load.mca, rtu.load.mocp, rtu.load.value) == ("hvac", 28, 45, None)
    assert (welder.load.rated_a, welder.load.duty_cycle_pct) == (40, 50)
    text = shop.read_text()
    assert 'kind = "hvac", mca = 28' in text
    # the walk file round-trips to the same bytes
    assert dumps_walk(load_walk(shop)) == text


def test_add_refuses_a_nameplate_of_another_kind_and_leaves_the_file(shop, capsys):
    before = shop.read_bytes()
    err = refused(capsys, "add", str(shop), "--from", "SVC", "--to", "EV", "--length", "40",
                  "--amps", "48", "--kind", "ev-charger", "--mocp", "60")
    assert "--mocp" in err and str(shop) in err
    assert shop.read_bytes() == before
    # NEC 430.22 sizes a motor's conductors; the 125 % continuous rule does not apply
    err = refused(capsys, "add", str(shop), "--from", "SVC", "--to", "Fan", "--length", "40",
                  "--hp", "5", "--continuous")
    assert "run R1, continuous" in err and "430.22" in err
    assert shop.read_bytes() == before


def test_check_json_gives_the_kind_keys_per_run(shop, capsys):
    main(["add", str(shop), "--from", "SVC", "--to", "Pump", "--length", "100", "--hp", "25"])
    main(["add", str(shop), "--from", "SVC", "--to", "RTU", "--length", "50", "--kind", "hvac",
          "--mca", "28", "--mocp", "45"])
    main(["add", str(shop), "--from", "SVC", "--to", "EV", "--length", "50", "--kind",
          "ev-charger", "--amps", "48", "--connection", "LL"])
    capsys.readouterr()
    assert main(["check", str(shop), "--json"]) == 0
    runs = {r["id"]: r for r in json.loads(capsys.readouterr().out)["runs"]}
    pump, rtu, ev = runs["R1"], runs["R2"], runs["R3"]
    assert (pump["load_kind"], pump["flc_a"], pump["ocpd_a"], pump["size"]) == (
        "motor", 34.0, 90, "8 AWG")
    assert pump["locked_rotor_a"] == 183.0 and pump["starting_drop_pct"] > 0
    assert pump["load"] == "25 hp" and "430.52" in pump["kind_rule"]
    assert (rtu["load_kind"], rtu["ocpd_a"], rtu["required_ampacity_a"], rtu["load"]) == (
        "hvac", 45, 28.0, "MCA 28 A")
    assert (ev["load_kind"], ev["ocpd_a"], ev["design_amps"]) == ("ev-charger", 60, 60.0)
    assert ev["flc_a"] is None and ev["starting_drop_pct"] is None


def test_the_report_lists_each_equipment_run_with_its_rule(shop, tmp_path, capsys):
    main(["add", str(shop), "--from", "SVC", "--to", "Pump", "--length", "100", "--hp", "25"])
    main(["add", str(shop), "--from", "SVC", "--to", "Lights", "--length", "50", "--amps", "10",
          "--connection", "LN"])
    out = tmp_path / "shop.md"
    assert main(["report", str(shop), "-o", str(out)]) == 0
    text = out.read_text()
    section = text.split("## Equipment by its article", 1)[1].split("\n## ", 1)[0]
    assert "| R1 | motor | 25 hp motor (34 A full-load) | 42.5 | 90 |" in section
    assert "Table 430.52(C)(1)" in section and "| R2 |" not in section
    assert "| Motor starting drop target \\[%\\] | 15 (common practice: 10 to 15) |" in text


def test_a_walk_without_equipment_has_no_equipment_section(shop, tmp_path, capsys):
    main(["add", str(shop), "--from", "SVC", "--to", "Lights", "--length", "50", "--amps", "10",
          "--connection", "LN"])
    out = tmp_path / "shop.md"
    assert main(["report", str(shop), "-o", str(out)]) == 0
    text = out.read_text()
    assert "Equipment by its article" not in text and "starting drop" not in text
