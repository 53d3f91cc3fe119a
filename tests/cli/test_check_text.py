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
