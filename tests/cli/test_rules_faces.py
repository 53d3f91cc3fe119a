"""The rules a run was sized by, on every face: ``calc``, ``check --json``, the report (HTML and
Markdown) and the app's Why screen (w); and a load in watts whose power factor the walk does not
give states the factor it was taken at (S = P / pf, the power triangle)."""

from __future__ import annotations

import json
import math

import pytest

from gaugewalk.tui.cli.main import main

# S = P / pf and I = S / (sqrt(3) V) three-phase (the power triangle and Ohm's law), 10 kW at 208 V
AT_PF_085 = 10_000 / 0.85 / (math.sqrt(3) * 208)   # 32.66 A
AT_PF_1 = 10_000 / (math.sqrt(3) * 208)            # 27.76 A
TAKEN = "10 kW taken at power factor 0.85"


def calc_json(capsys, *argv: str) -> dict:
    assert main(["calc", *argv, "--json"]) == 0
    return json.loads(capsys.readouterr().out)


def test_calc_states_the_power_factor_a_load_in_kw_is_taken_at(capsys):
    run = calc_json(capsys, "--kw", "10", "--volts", "208", "--phase", "3", "--length", "30")
    assert run["amps"] == pytest.approx(AT_PF_085, rel=1e-9)
    assert run["notes"][0].startswith(TAKEN + ", the default (--pf), as the load gives none: "
                                      "11.76 kVA")
    given = calc_json(capsys, "--kw", "10", "--volts", "208", "--phase", "3", "--length", "30",
                      "--pf", "1")
    assert given["amps"] == pytest.approx(AT_PF_1, rel=1e-9)
    assert not any("taken at power factor" in n for n in given["notes"])
    # a heater is a resistance load: power factor 1, nothing assumed (README: loads of a kind)
    heater = calc_json(capsys, "--kw", "10", "--volts", "208", "--phase", "3", "--length", "30",
                       "--kind", "heater")
    assert heater["amps"] == pytest.approx(AT_PF_1, rel=1e-9)
    assert not any("taken at power factor" in n for n in heater["notes"])
    # amperes and volt-amperes need no power factor to become a current
    amps = calc_json(capsys, "--kva", "10", "--volts", "208", "--phase", "3", "--length", "30")
    assert not any("taken at power factor" in n for n in amps["notes"])
