"""The rules a run was sized by, on every face: ``calc``, ``check --json``, the report (HTML and
Markdown) and the app's Why screen (w); and a load in watts whose power factor the walk does not
give states the factor it was taken at (S = P / pf, the power triangle)."""

from __future__ import annotations

import json
import math

import pytest

from gaugewalk.tui.cli.main import main
from tests.support.app_helpers import new_app, opened, shown
from tests.support.paths import SAMPLES

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


@pytest.fixture
def kitchen(tmp_path, capsys):
    path = tmp_path / "kitchen.toml"
    assert main(["new", str(path), "--service", "208Y/120"]) == 0
    for argv in (["--to", "Oven", "--kw", "10", "--connection", "3P"],
                 ["--to", "Range", "--kw", "10", "--connection", "3P", "--pf", "1"],
                 ["--to", "Hood fan", "--hp", "3", "--connection", "3P"]):
        assert main(["add", str(path), "--from", "SVC", "--length", "30", *argv]) == 0
    capsys.readouterr()
    return path


def test_check_json_lists_each_runs_rules(kitchen, capsys):
    assert main(["check", str(kitchen), "--json"]) == 0
    runs = {r["id"]: r for r in json.loads(capsys.readouterr().out)["runs"]}
    oven, rng, fan = runs["R1"], runs["R2"], runs["R3"]
    assert oven["amps"] == pytest.approx(AT_PF_085, abs=1e-3)
    assert oven["notes"][0].startswith(TAKEN + ", the job's, as the load gives none")
    assert rng["amps"] == pytest.approx(AT_PF_1, abs=1e-3)
    assert not any("taken at power factor" in n for n in rng["notes"])
    # NEC 2023 Table 430.250: 3 hp, 208 V column, 10.6 A; Table 430.52(C)(1): 250 % inverse time
    assert any(n.startswith("NEC Table 430.250: 3 hp, 208 V column, 10.6 A") for n in fan["notes"])
    assert any("Table 430.52(C)(1)" in n for n in fan["notes"])


def test_the_report_lists_the_rules_of_every_run(kitchen, tmp_path, capsys):
    md, html = tmp_path / "k.md", tmp_path / "k.html"
    assert main(["report", str(kitchen), "-o", str(md)]) == 0
    assert main(["report", str(kitchen), "-o", str(html)]) == 0
    text = md.read_text()
    section = text.split("## Rules applied to each run", 1)[1].split("\n## ", 1)[0]
    assert "- **R1** SVC → Oven\n  - " + TAKEN in section
    assert "- **R3** SVC → Hood fan" in section and "Table 430.250" in section
    page = html.read_text()
    assert '<dl class="rules">' in page
    assert "<dt>R1 <span class=\"route\">SVC → Oven</span></dt><dd><span>" + TAKEN in page
    # --brief: a printout for ordering, the same report without the rules
    brief = tmp_path / "brief.md"
    assert main(["report", str(kitchen), "-o", str(brief), "--brief"]) == 0
    start = text.index("\n\n## Rules applied to each run")
    end = text.index("\n\n> **Caution:**", start)
    assert brief.read_text() == text[:start] + text[end:]


def test_a_feeder_lists_its_basis_first(tmp_path, capsys):
    out = tmp_path / "s.md"
    assert main(["report", str(SAMPLES / "warehouse_dc2.toml"), "-o", str(out)]) == 0
    section = out.read_text().split("## Rules applied to each run", 1)[1]
    first_feeder = section.split("- **F-H1**", 1)[1].split("\n")[1]
    assert first_feeder.startswith("  - sized for ")


async def test_w_shows_the_rules_of_the_run_under_the_cursor(kitchen, tmp_path):
    app = new_app(kitchen, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        await pilot.press("w")   # the cursor starts on the first run, R1
        await pilot.pause()
        text = shown(app, "#rules-text")
        assert "Why: R1" in text and "SVC → Oven" in text
        assert TAKEN in " ".join(text.split())
        await pilot.press("escape")
        await pilot.pause()
        assert not app.screen.query("#rules-text")
        await pilot.press("down", "down", "w")
        await pilot.pause()
        text = " ".join(shown(app, "#rules-text").split())
        assert "Why: R3" in text and "NEC Table 430.250: 3 hp, 208 V column, 10.6 A" in text
