"""``gaugewalk calc`` through ``gaugewalk.tui.cli.main.main``: output, JSON, exit codes and
one-line errors."""

import json
import math

import pytest

from gaugewalk.tui.cli.main import CAUTION, COMMANDS, main


def run_json(capsys, *argv):
    code = main(["calc", *argv, "--json"])
    out, err = capsys.readouterr()
    assert code == 0, err
    return json.loads(out)


def test_calc_is_a_registered_command():
    assert ("calc", "gaugewalk.tui.cli.calc") in {(c.name, c.module) for c in COMMANDS}


def test_json_has_the_answer_and_the_inputs_as_understood(capsys):
    data = run_json(capsys, "--amps", "40", "--length", "10", "--volts", "240")
    for key in ("size", "voltage_drop_v", "voltage_drop_pct", "ampacity_a", "ocpd_a", "egc_size",
                "raceway_size", "governed_by", "method", "inputs", "problems", "notes", "ok"):
        assert key in data
    # NEC 2023 Table 310.16, 60 C Cu (110.14(C)(1) for a 40 A circuit): 8 AWG = 40 A
    assert (data["size"], data["ocpd_a"], data["governed_by"]) == ("8 AWG", 40, "ampacity")
    assert data["inputs"]["length_ft"] == 10 and data["inputs"]["volts"] == 240
    assert data["caution"] == CAUTION


def test_length_expressions_and_metres_are_understood(capsys):
    data = run_json(capsys, "--amps", "20", "--length", "36m+8ft", "--volts", "120")
    # 36 m / 0.3048 m per ft + 8 ft = 126.11 ft (international foot)
    assert data["inputs"]["length_ft"] == pytest.approx(36 / 0.3048 + 8)


def test_a_dc_drop_by_hand_through_the_command_line(capsys):
    # NEC Ch. 9 Table 8: 12 AWG Cu 1.98 ohm/kft; 2 x 16 A x 50 ft x 1.98 / 1000 = 3.168 V
    data = run_json(capsys, "--amps", "16", "--length", "50", "--volts", "120", "--size", "12",
                    "--method", "dc")
    assert data["voltage_drop_v"] == pytest.approx(3.168, rel=1e-9)
    assert data["voltage_drop_pct"] == pytest.approx(2.64, rel=1e-9)
    assert data["governed_by"] == "fixed size" and data["method"] == "dc"


def test_kva_on_three_phase_becomes_amps(capsys):
    # I = S / (sqrt(3) V): 45,000 / (1.732 x 208) = 124.9 A
    data = run_json(capsys, "--kva", "45", "--length", "50", "--volts", "208", "--phase", "3")
    assert data["amps"] == pytest.approx(45000 / (math.sqrt(3) * 208))


def test_kw_uses_the_power_factor(capsys):
    # S = P / pf: 4 kW / 0.8 = 5 kVA; 5000 / 240 = 20.83 A
    data = run_json(capsys, "--kw", "4", "--pf", "0.8", "--length", "30", "--volts", "240")
    assert data["amps"] == pytest.approx(5000 / 240)


def test_a_raceway_family_is_accepted(capsys):
    data = run_json(capsys, "--amps", "30", "--length", "40", "--volts", "240", "--raceway", "pvc")
    assert data["raceway"] == "PVC-40" and data["inputs"]["raceway_family"] == "pvc"


def test_text_output_shows_the_answer_the_governing_limit_and_the_caution(capsys):
    code = main(["calc", "--amps", "40", "--length", "120+35+2*12", "--volts", "240"])
    out, err = capsys.readouterr()
    assert code == 0 and err == ""
    assert "governed by" in out and "voltage drop" in out
    assert "179 ft" in out  # 120 + 35 + 24
    assert CAUTION in out
    assert "Traceback" not in out


def test_a_failing_fixed_size_lists_its_problems(capsys):
    code = main(["calc", "--amps", "30", "--length", "200", "--volts", "120", "--size", "12"])
    out, _ = capsys.readouterr()
    assert code == 0
    assert "PROBLEMS" in out and "240.4(D)" in out


@pytest.mark.parametrize(
    ("argv", "option", "words"),
    [
        (["--amps", "0", "--length", "10", "--volts", "120"], "--amps", "above 0"),
        (["--amps", "-4", "--length", "10", "--volts", "120"], "--amps", "above 0"),
        (["--amps", "nan", "--length", "10", "--volts", "120"], "--amps", "finite"),
        (["--amps", "ten", "--length", "10", "--volts", "120"], "--amps", "not a number"),
        (["--amps", "10", "--length", "0", "--volts", "120"], "--length", "above zero"),
        (["--amps", "10", "--length", "-5", "--volts", "120"], "--length", "not a length"),
        (["--amps", "10", "--length", "nan", "--volts", "120"], "--length", "not a length"),
        (["--amps", "10", "--length", "12 yd", "--volts", "120"], "--length", "unknown unit"),
        (["--amps", "10", "--length", "10", "--volts", "120", "--size", "5"], "--size",
         "not a conductor size"),
        (["--amps", "10", "--length", "10", "--volts", "120", "--raceway", "hose"], "--raceway",
         "no raceway type"),
        (["--amps", "10", "--length", "10", "--volts", "0"], "--volts", "above 0"),
        (["--amps", "10", "--length", "10", "--volts", "120", "--pf", "1.5"], "--pf", "at most 1"),
        (["--amps", "10", "--length", "10", "--volts", "120", "--phase", "2"], "--phase",
         "invalid"),
        (["--amps", "10", "--length", "10", "--volts", "120", "--insulation", "PAPER"],
         "--insulation", "no insulation type"),
        (["--amps", "10", "--length", "10", "--volts", "120", "--ambient", "80", "--insulation",
          "TW"], "--ambient", "cannot be used"),
        (["--length", "10", "--volts", "120"], "--amps", "required"),
        (["--amps", "10", "--kw", "2", "--length", "10", "--volts", "120"], "--kw", "not allowed"),
    ],
)
def test_bad_input_exits_2_with_one_line_naming_the_option(capsys, argv, option, words):
    code = main(["calc", *argv])
    out, err = capsys.readouterr()
    assert code == 2
    assert out == ""
    lines = err.strip().splitlines()
    assert len(lines) == 1
    assert option in lines[0] and words in lines[0]
    assert "Traceback" not in err
