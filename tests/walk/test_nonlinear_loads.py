"""Mostly nonlinear loads on 4-wire wye circuits, a job setting (``[defaults] nonlinear_loads``):
the neutral of a 3-phase 4-wire wye circuit counts as current-carrying (NEC 2023 310.15(E)(3))
and a feeder's neutral is full size (220.61(C)(2); common practice). Linear loads (the default)
are said so in each such circuit's notes (310.15(E)(1))."""

from __future__ import annotations

import json

from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.model.walkfile.write import dumps_walk
from gaugewalk.tui.cli.main import main

WALK = """schema = 1

[job]
name = "Nonlinear test wing"

[defaults]
ambient_c = 30
{setting}
[[source]]
id = "SVC"
kind = "service"
system = "208Y/120V 3ph 4w"
rating_a = 800

[[source]]
id = "P1"
kind = "panel"
system = "208Y/120V 3ph 4w"
rating_a = 225
main_a = 225

[[source]]
id = "P2"
kind = "panel"
system = "208Y/120V 3ph 4w"
rating_a = 100
main_a = 100

[[run]]
id = "F1"
from = "SVC"
to = "P1"
length = "10"
load = {{ value = 150, unit = "A" }}

[[run]]
id = "F2"
from = "SVC"
to = "P2"
length = "10"

[[run]]
id = "R1"
from = "P2"
to = "Computer lab outlets"
length = "40"
load = {{ value = 16, unit = "A" }}
connection = "LN"

[[run]]
id = "R2"
from = "P2"
to = "Lab kiln"
length = "40"
load = {{ value = 60, unit = "A" }}
connection = "3P"
"""


def _walk(tmp_path, nonlinear: bool | None):
    setting = "" if nonlinear is None else f"nonlinear_loads = {str(nonlinear).lower()}\n"
    path = tmp_path / "wing.toml"
    path.write_text(WALK.format(setting=setting), encoding="utf-8")
    return path


def test_a_nonlinear_feeders_neutral_counts_and_the_feeder_goes_up_a_size(tmp_path):
    linear = compute_job(load_walk(_walk(tmp_path, None)))
    # 150 A on three current-carrying conductors, 75 C terminals over 100 A (110.14(C)(1)(b)):
    # NEC 2023 Table 310.16, 1/0 AWG Cu 150 A at 75 C
    assert linear.runs["F1"].size == "1/0 AWG"
    assert any(n.startswith("NEC 310.15(E)(1)") for n in linear.runs["F1"].notes)
    nonlinear = compute_job(load_walk(_walk(tmp_path, True)))
    # four current-carrying conductors: Table 310.15(C)(1), 80 %; 1/0 AWG 170 A at 90 C x 0.8 =
    # 136 A < 150 A; 2/0 AWG 195 A x 0.8 = 156 A and 175 A at 75 C (Table 310.16)
    f1 = nonlinear.runs["F1"]
    assert f1.size == "2/0 AWG" and f1.ampacity_a == 156.0
    assert not any(n.startswith("NEC 310.15(E)(1)") for n in f1.notes)


def test_a_nonlinear_feeders_neutral_is_full_size(tmp_path):
    # F2 carries 16 A line to neutral and a 60 A three-phase load: 76 A on its heaviest line
    linear = compute_job(load_walk(_walk(tmp_path, False))).runs["F2"]
    # NEC 220.61(A): the neutral load is the 16 A on one line, so a smaller neutral than the
    # phases (not below the EGC, 215.2(A)(2))
    assert any(n.startswith("NEC 220.61(A): the neutral load is 16 A") for n in linear.notes)
    assert linear.neutral_size != linear.size
    nonlinear = compute_job(load_walk(_walk(tmp_path, True)))
    f2 = nonlinear.runs["F2"]
    assert f2.neutral_size == f2.size
    assert any(n.startswith("NEC 220.61(C)(2), 310.15(E)(3): the loads taken as nonlinear")
               for n in f2.notes)


def test_the_setting_is_kept_in_the_file_and_shown_on_every_face(tmp_path, capsys):
    path = _walk(tmp_path, True)
    job = load_walk(path)
    assert job.defaults.nonlinear_loads is True
    assert "nonlinear_loads = true" in dumps_walk(job)
    assert "nonlinear_loads" not in dumps_walk(load_walk(_walk(tmp_path, False)))  # the default
    path = _walk(tmp_path, True)
    assert main(["check", str(path), "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["nonlinear_loads"] is True
    report = tmp_path / "wing.md"
    assert main(["report", str(path), "-o", str(report)]) == 0
    assert "mostly nonlinear: neutrals counted as current-carrying (NEC 310.15(E)(3))" in (
        report.read_text())


def _panel_says(path, panel: str, said: bool):
    """The walk at ``path`` with ``panel``'s loads said nonlinear (True) or linear (False)."""
    text = path.read_text(encoding="utf-8").replace(
        f'id = "{panel}"\nkind = "panel"', f'id = "{panel}"\nkind = "panel"\n'
        f'nonlinear_loads = {str(said).lower()}')
    path.write_text(text, encoding="utf-8")
    return path


def test_one_panel_of_nonlinear_loads_changes_its_feeder_and_not_the_other(tmp_path):
    # the same figures as the job-wide setting above (NEC 2023 Table 310.16, Table
    # 310.15(C)(1), 220.61(C)(2)), for the panel that says so only
    result = compute_job(load_walk(_panel_says(_walk(tmp_path, None), "P1", True)))
    f1, f2 = result.runs["F1"], result.runs["F2"]
    assert f1.size == "2/0 AWG" and f1.ampacity_a == 156.0 and f1.neutral_size == f1.size
    assert any(n.startswith("NEC 220.61(A): the neutral load is 16 A") for n in f2.notes)
    assert f2.neutral_size != f2.size
    # the other way round: P2's feeder full size, and its note says whose setting it is
    result = compute_job(load_walk(_panel_says(_walk(tmp_path, None), "P2", True)))
    f1, f2 = result.runs["F1"], result.runs["F2"]
    assert f1.size == "1/0 AWG" and f2.neutral_size == f2.size
    assert any("the loads taken as nonlinear (the job's or its panel's setting)" in n
               for n in f2.notes)


def test_a_panel_said_linear_keeps_the_job_wide_setting_off_its_runs(tmp_path):
    result = compute_job(load_walk(_panel_says(_walk(tmp_path, True), "P2", False)))
    assert result.runs["F1"].size == "2/0 AWG"                     # the job's setting
    f2 = result.runs["F2"]                                           # its panel's
    assert any(n.startswith("NEC 220.61(A): the neutral load is 16 A") for n in f2.notes)


def test_the_panels_setting_is_kept_and_shown_on_every_face(tmp_path, capsys):
    path = _panel_says(_walk(tmp_path, None), "P1", True)
    job = load_walk(path)
    assert job.source("P1").nonlinear_loads is True and job.source("P2").nonlinear_loads is None
    kept = dumps_walk(job)   # written back in the panel's table
    assert 'id = "P1"\nkind = "panel"\nsystem = "208Y/120V 3ph 4w"' in kept
    assert kept.count("nonlinear_loads = true") == 1
    assert main(["check", str(path), "--json"]) == 0
    sources = {s["id"]: s for s in json.loads(capsys.readouterr().out)["sources"]}
    assert sources["P1"]["nonlinear_loads"] is True and sources["P2"]["nonlinear_loads"] is None
    report = tmp_path / "wing.md"
    assert main(["report", str(path), "-o", str(report)]) == 0
    schedule = report.read_text().split("### P1", 1)[1].split("###", 1)[0]
    assert "its loads mostly nonlinear" in schedule


def test_the_source_command_and_the_card_say_it(tmp_path, capsys):
    from gaugewalk.model.session.card_source import read_source_text

    path = _walk(tmp_path, None)
    assert main(["source", str(path), "P3", "--kind", "panel", "--system", "208Y/120",
                 "--nonlinear", "yes", "--from", "SVC", "--length", "20"]) == 0
    assert load_walk(path).source("P3").nonlinear_loads is True
    assert read_source_text("208Y/120 225A nonlinear")["nonlinear_loads"] is True
    assert read_source_text("linear 208Y/120")["nonlinear_loads"] is False
