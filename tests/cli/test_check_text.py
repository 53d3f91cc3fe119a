"""``gaugewalk check``'s table stays in line with long ids and says "1 run", not "1 runs"."""

from __future__ import annotations

from gaugewalk.tui.cli.main import main

# An invented walk: one panel, one run with a long id.
WALK = """\
schema = 1

[job]
name = "Quay kiosk"

[[source]]
id = "SVC-MAIN-NORTH"
kind = "service"
system = "120/240V 1ph 3w"

[[run]]
id = "KIOSK-COUNTER-12"
from = "SVC-MAIN-NORTH"
to = "Counter"
length = "40"
load = { value = 8, unit = "A" }
connection = "LN"
"""


def test_the_check_table_keeps_its_columns_in_line_for_long_ids_and_counts_in_words(tmp_path,
                                                                                     capsys):
    path = tmp_path / "kiosk.toml"
    path.write_text(WALK, encoding="utf-8")
    assert main(["check", str(path)]) == 0
    lines = capsys.readouterr().out.splitlines()
    assert lines[0] == "Quay kiosk: 1 run, 1 source"
    head, rule, row = lines[2], lines[3], lines[4]
    assert len(rule) == len(head) and set(rule) == {"-"}
    # every heading starts where its column starts in the row
    assert row.startswith("KIOSK-COUNTER-12 SVC-MAIN-NORTH Counter")
    assert head.index("from") == row.index("SVC-MAIN-NORTH")
    assert head.index("to") == row.index("Counter")
    assert head.index("status") == row.index("ok")


def test_check_says_which_feeders_keep_a_stated_load_below_what_their_panel_needs(capsys):
    from pathlib import Path

    farm = Path(__file__).resolve().parents[2] / "sample_walks" / "farm_workshop.toml"
    # the invented sample gives F-SHOP a 120 A demand load; the loads recorded on SHOP need
    # more on line A at connected load (NEC 215.2(A)(1), with 430.24's 25 % of the largest
    # motor): stated, never counted as a problem
    assert main(["check", str(farm)]) == 1  # SVC-YARD over its drop target, as the sample says
    out = capsys.readouterr().out
    assert "1 feeder(s) sized for a stated load below what their panel's loads need:" in out
    line = next(t for t in out.splitlines() if t.startswith("  run F-SHOP: "))
    assert "its own load (120.0 A design)" in line and "(NEC 215.2(A)(1), 430.24)" in line
    assert "1 problem(s):" in out  # still only SVC-YARD


def test_the_app_says_under_the_sheet_when_a_feeder_keeps_a_stated_load(tmp_path):
    import shutil
    from pathlib import Path

    from gaugewalk.model.session.session import WalkSession
    from gaugewalk.tui.app.sheet.rows import detail_lines

    farm = Path(__file__).resolve().parents[2] / "sample_walks" / "farm_workshop.toml"
    walk = tmp_path / "farm.toml"
    shutil.copy(farm, walk)
    session = WalkSession.open(walk)
    said = detail_lines(session, session.job.run("F-SHOP")).splitlines()[2]
    # the same figures as `check` gives: 120 A stated, 207.1 A needed on line A: 200.1 A at
    # connected load plus 430.24's 25 % of the largest motor, the 5 hp air compressor at 28 A
    # (NEC 2023 Table 430.248, 230 V column): 0.25 x 28 = 7 A
    assert said == ("ⓘ sized for its stated 120.0 A; the loads on SHOP need 207.1 A "
                    "(NEC 215.2(A)(1))")
    assert len(detail_lines(session, session.job.run("SVC-PUMP")).splitlines()) == 2


def test_check_names_what_a_feeder_feeds_in_its_load_column(capsys):
    import json
    from pathlib import Path

    sample = str(Path(__file__).parents[2] / "sample_walks" / "warehouse_dc2.toml")
    main(["check", "--json", sample])
    runs = {r["id"]: r for r in json.loads(capsys.readouterr().out)["runs"]}
    # the invented sample: F-T1 feeds transformer T1, F-L1 panel L1
    assert (runs["F-T1"]["load"], runs["F-L1"]["load"]) == ("(transformer)", "(panel)")
    main(["check", sample])
    row = next(line for line in capsys.readouterr().out.splitlines() if line.startswith("F-T1 "))
    assert "(transformer)" in row


# An invented walk: two circuits written in at the same breaker position.
TWICE = WALK.replace('connection = "LN"\n', 'connection = "LN"\nposition = 3\n') + """
[[run]]
id = "KETTLE"
from = "SVC-MAIN-NORTH"
to = "Kettle"
length = "30"
load = { value = 12, unit = "A" }
connection = "LN"
position = 3
"""


def test_a_run_whose_breaker_position_is_taken_is_not_ok_in_the_table_or_the_json(tmp_path,
                                                                                  capsys):
    import json

    path = tmp_path / "kiosk.toml"
    path.write_text(TWICE, encoding="utf-8")
    assert main(["check", "--json", str(path)]) == 1
    data = json.loads(capsys.readouterr().out)
    kettle = next(r for r in data["runs"] if r["id"] == "KETTLE")
    assert "position 3 is already taken" in kettle["problems"][0]
    assert kettle["ok"] is False and data["summary"]["failing"] == ["KETTLE"]
    assert main(["check", str(path)]) == 1
    row = next(line for line in capsys.readouterr().out.splitlines() if line.startswith("KETTLE"))
    assert row.endswith("PROBLEM")  # within its ampacity and drop, but not where it is written


def test_over_is_for_ampacity_and_drop_and_problem_for_any_other(tmp_path, capsys):
    """A run whose only problem is its device (an HVAC breaker above the nameplate maximum,
    NEC 440.22(C)) is within its ampacity and drop: PROBLEM, not OVER. A 12 AWG branch 400 ft
    long is OVER: 16 A x 2 x 400 ft x 1.98 ohm/kft (NEC Ch. 9 Table 8, 12 AWG stranded Cu,
    the DC resistance the AC figure sits near) is about 25 V, far over 3 % of 120 V."""
    walk = tmp_path / "w.toml"
    assert main(["new", str(walk), "--service", "208Y/120"]) == 0
    assert main(["add", str(walk), "--from", "SVC", "--to", "RTU", "--kind", "hvac", "--mca",
                 "20", "--mocp", "30", "--ocpd", "40", "--length", "30",
                 "--connection", "3P"]) == 0
    assert main(["add", str(walk), "--from", "SVC", "--to", "Far", "--amps", "16", "--length",
                 "400", "--size", "12 AWG", "--connection", "LN"]) == 0
    capsys.readouterr()
    assert main(["check", str(walk)]) == 1
    rows = {line.split()[0]: line.split()[-1] for line in capsys.readouterr().out.splitlines()
            if line.startswith(("R1 ", "R2 "))}
    assert rows == {"R1": "PROBLEM", "R2": "OVER"}
