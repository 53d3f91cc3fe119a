"""Every kind of problem in a walk file: a sentence with file, line, run or source and field;
``gaugewalk check`` exits 2 and leaves the file as it was."""

from __future__ import annotations

import pytest

from gaugewalk.model.walkfile.read import WalkFileError, check_walk_text, loads_walk
from gaugewalk.tui.cli.main import main
from tests.support.walks import panel_walk, run_table

GOOD = panel_walk(
    "Problem fixture",
    run_table("R1", "LP1", "Sign", "40", load=(5, "A"), connection="LN"),
    feeder_length="60",
)
"""The walk every case edits; the expected line numbers are lines of this text:

schema (1), [job] (3), [[source]] SVC (6) and LP1 (11), [[run]] F1 (16) and R1 (22); R1's length
is on line 26, its load on 27 and its connection on 28."""

def test_the_fixture_itself_is_clean():
    assert check_walk_text(GOOD, "good.toml")[1] == []


def _one(text: str):
    job, problems = check_walk_text(text, "job.toml")
    assert problems, "expected a problem"
    return problems


def _swap(old: str, new: str):
    """An edit of the fixture: ``old`` becomes ``new``."""
    return lambda text: text.replace(old, new)


# (what is wrong, the edit, expected line, where, field, words in the message)
CASES = [
    ("toml syntax", _swap('length = "40"', 'length = "40'), 26, "file", None, "not valid TOML"),
    ("unknown key", _swap('length = "40"', 'length = "40"\ncolor = "red"'),
     27, "run R1", "color", "not a key"),
    ("bad length", _swap('length = "40"', 'length = "4O"'),
     26, "run R1", "length", "cannot be read"),
    ("negative load", _swap("value = 5", "value = -5"), 27, "run R1", "load.value", "above 0"),
    ("missing length", _swap('length = "60"\n', ""), 16, "run F1", "length", "missing"),
    ("zero sets", _swap('connection = "LN"', 'connection = "LN"\nsets = 0'),
     29, "run R1", "sets", "at least 1"),
    ("unknown kind", _swap('kind = "panel"', 'kind = "panle"'), 13, "source LP1", "kind", "panel"),
    ("unknown system", _swap('system = "208Y/120V 3ph 4w"\n\n[[run]]', 'system = "208"\n\n[[run]]'),
     14, "source LP1", "system", "208Y/120V"),
    ("unknown size", _swap('connection = "LN"', 'connection = "LN"\nsize = "5 AWG"'),
     29, "run R1", "size", "no conductor size"),
    ("unknown raceway", _swap('connection = "LN"', 'connection = "LN"\nraceway = "pipe"'),
     29, "run R1", "raceway", "no raceway type"),
    ("bad date", _swap('name = "Problem fixture"', 'name = "x"\nwalked_on = "last tuesday"'),
     5, "job", "walked_on", "date"),
    ("dangling source", _swap('from = "LP1"', 'from = "LP9"'),
     24, "run R1", "from", "not a source"),
    ("duplicate run id", _swap('id = "R1"', 'id = "F1"'),
     23, "run F1", "id", "used by another run"),
    ("duplicate source id", _swap('id = "LP1"', 'id = "SVC"'),
     12, "source SVC", "id", "used by another source"),
    ("branch without load", _swap('load = { value = 5, unit = "A" }\n', ""),
     22, "run R1", "load", "no load"),
    ("connection the system cannot supply",
     _swap('system = "208Y/120V 3ph 4w"\n\n[[', 'system = "240V 3ph 3w"\n\n[['),  # SVC and LP1
     28, "run R1", "connection", "no neutral"),
    ("feeder cannot bring the panel's system",
     _swap('system = "208Y/120V 3ph 4w"\n\n[[run]]', 'system = "480Y/277V 3ph 4w"\n\n[[run]]'),
     19, "run F1", "to", "only a transformer"),
    ("panel nothing feeds", _swap('to = "LP1"', 'to = "LP-X"\nload = { value = 1, unit = "A" }'),
     11, "source LP1", None, "nothing feeds"),
    ("service with a feeder", _swap('kind = "panel"', 'kind = "service"'),
     13, "source LP1", "kind", "fed by the utility"),
    ("segments not adding up",
     _swap('length = "60"', 'length = "60"\nsegments = [{ length = "50" }]'),
     21, "run F1", "segments", "add up to 50"),
    ("newer schema", _swap("schema = 1", "schema = 9"), 1, "file", "schema", "newer gaugewalk"),
]


@pytest.mark.parametrize("name, edit, line, where, field, words", CASES, ids=[c[0] for c in CASES])
def test_each_problem_names_its_line_place_and_field(name, edit, line, where, field, words):
    problems = _one(edit(GOOD))
    match = [p for p in problems if p.where == where and p.field == field]
    assert match, [str(p) for p in problems]
    p = match[0]
    assert words in p.message
    assert p.file == "job.toml"
    assert p.line == line, str(p)
    assert str(p).startswith(f"job.toml line {line}, {where}")


def test_a_feeder_loop_is_reported_once_with_the_chain():
    text = GOOD + """
[[source]]
id = "LP2"
kind = "panel"
system = "208Y/120V 3ph 4w"

[[run]]
id = "F2"
from = "LP2"
to = "LP3"
length = "10"

[[source]]
id = "LP3"
kind = "panel"
system = "208Y/120V 3ph 4w"

[[run]]
id = "F3"
from = "LP3"
to = "LP2"
length = "10"
"""
    loops = [p for p in _one(text) if "loop" in p.message]
    assert len(loops) == 1 and "LP2" in loops[0].message and "LP3" in loops[0].message


def test_a_source_that_failed_is_not_reported_again_through_its_runs():
    problems = _one(GOOD.replace('kind = "panel"', 'kind = "panle"'))
    assert [p.where for p in problems] == ["source LP1"]


def test_all_problems_are_reported_at_once_in_line_order():
    text = GOOD.replace('length = "40"', 'length = "4O"')
    text = text.replace('from = "LP1"', 'from = "LP1"\nsets = 0')
    text = text.replace('kind = "panel"', 'kind = "panel"\nkva = -1')
    problems = _one(text)
    assert len(problems) == 3
    assert [p.line for p in problems] == sorted(p.line for p in problems)


def test_loads_walk_raises_with_one_line_per_problem():
    with pytest.raises(WalkFileError) as err:
        loads_walk(GOOD.replace("value = 5", "value = -5").replace('"60"', '"x"'), "job.toml")
    lines = str(err.value).splitlines()
    assert len(lines) == 2 and all(line.startswith("job.toml line ") for line in lines)


@pytest.mark.parametrize("name, edit", [(c[0], c[1]) for c in CASES], ids=[c[0] for c in CASES])
def test_check_exits_2_names_the_file_and_leaves_it_untouched(tmp_path, capsys, name, edit):
    path = tmp_path / "walk.toml"
    text = edit(GOOD)
    path.write_text(text)
    before = path.read_bytes()
    assert main(["check", str(path)]) == 2
    err = capsys.readouterr().err
    assert str(path) in err and "Traceback" not in err
    assert path.read_bytes() == before
    assert sorted(p.name for p in tmp_path.iterdir()) == ["walk.toml"]


def test_check_on_a_missing_file_or_a_folder_exits_2(tmp_path, capsys):
    assert main(["check", str(tmp_path / "nope.toml")]) == 2
    assert "no such file" in capsys.readouterr().err
    assert main(["check", str(tmp_path)]) == 2
    assert "folder" in capsys.readouterr().err


def test_a_file_that_is_not_utf8_gives_its_line(tmp_path, capsys):
    path = tmp_path / "walk.toml"
    path.write_bytes(b'schema = 1\n[job]\nname = "caf\xe9"\n')
    assert main(["check", str(path)]) == 2
    assert "line 3" in capsys.readouterr().err
