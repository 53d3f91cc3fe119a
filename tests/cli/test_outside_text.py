"""Text from outside on the command line (issue 15): a hostile walk, a hostile lock and a hostile
file name given to every command. Nothing they hold reaches the terminal as a control
character, nothing is refused that may be kept (notes), what cannot belong (a control character
in a name or a ``to``) is refused naming the field and line, and the walk keeps its text as
written. A reader that stops early never sees a traceback."""

from __future__ import annotations

import contextlib
import csv
import io
import os
import subprocess
import sys

import pytest
import tomli_w

from gaugewalk.model.walk.plain_text import CONTROL_CHARS
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.tui.cli.main import main
from tests.support.locks import live_process, write_lock
from tests.support.paths import REPO, SAMPLES
from tests.support.walks import (
    HOSTILE_WALK,
    MARKUP_TRICKS,
    TERMINAL_TRICKS,
    panel_walk,
    run_table,
    write_walk,
)

# what a terminal may be sent: line breaks and tabs (a CSV line ends with \r\n)
ALLOWED = {"\n", "\t", "\r"}


def _cli(argv: list[str]) -> tuple[int, str, str]:
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        code = main(argv)
    return code, out.getvalue(), err.getvalue()


def _no_raw_control(text: str) -> None:
    raw = sorted({c for c in text if c in CONTROL_CHARS - ALLOWED})
    assert not raw, f"control characters {raw!r} in {text[:300]!r}"
    assert "\r" not in text.replace("\r\n", "")  # a lone carriage return overwrites a line


def _commands(walk, tmp_path) -> list[list[str]]:
    w = str(walk)
    other = write_walk(tmp_path, panel_walk("Quay", run_table(
        "R9", "LP1", "Compressor", "30", load=(12, "A"))), "other.toml")
    return [
        ["check", w], ["check", w, "--json"],
        ["takeoff", w], ["takeoff", w, "--csv"], ["takeoff", w, "--json"],
        ["report", w, "-o", str(tmp_path / "r.md")], ["report", w, "-o", str(tmp_path / "r.html")],
        ["add", w, "--from", "LP1", "--to", "Quay light", "--length", "40", "--amps", "3"],
        ["source", w, "LP2", "--kind", "panel", "--system", "208Y/120", "--from", "SVC",
         "--length", "30"],
        ["merge", w, str(other), "-o", str(tmp_path / "merged.toml"), "--prefer", "a"],
    ]


def test_a_hostile_walk_through_every_command_sends_no_control_character(tmp_path):
    walk = write_walk(tmp_path, HOSTILE_WALK)
    for argv in _commands(walk, tmp_path):
        code, out, err = _cli(argv)
        assert code in (0, 1), (argv, err)
        _no_raw_control(out)
        _no_raw_control(err)
        assert "Traceback" not in err
        if argv[0] == "check" and "--json" not in argv:
            assert "Pump [@click=screen.del" in out  # markup shown as the text it is
    for report in ("r.md", "r.html"):
        text = (tmp_path / report).read_text()
        _no_raw_control(text)
        assert "\\x1b" in text  # the job's notes: there, escaped
    # the walk keeps its notes as written, control characters and all
    job = load_walk(walk)
    assert TERMINAL_TRICKS in job.job.notes and TERMINAL_TRICKS in job.run("R1").notes
    assert job.run("R2").to == "[red]Mixer[/red]"
    assert job.run("R1").to == "Pump " + MARKUP_TRICKS[:60]
    merged = load_walk(tmp_path / "merged.toml")
    assert merged.run("R1").notes == job.run("R1").notes


@pytest.mark.parametrize("table, key", [
    ("run", "to"), ("job", "name"), ("job", "site"), ("job", "walked_by"), ("source", "name"),
])
@pytest.mark.parametrize("char", ["\x1b", "\n", "\x07", "\x9b", "\u202e", "\u2028", "\x00"])
def test_a_control_character_where_it_cannot_belong_is_refused_naming_file_line_and_field(
        tmp_path, table, key, char):
    text = panel_walk("Quay", run_table("R1", "LP1", "Pump", "100", load=(16, "A")))
    line = f"{key} = " + tomli_w.dumps({"v": f"x{char}y"}).removeprefix("v = ")
    if table == "run":
        text = text.replace('to = "Pump"\n', line)
    elif table == "job":
        text = text.replace('name = "Quay"\n', "").replace("[job]\n", "[job]\n" + line)
    else:
        text = text.replace('kind = "panel"\n', 'kind = "panel"\n' + line)
    walk = write_walk(tmp_path, text)
    before = walk.read_bytes()
    code, out, err = _cli(["check", str(walk)])
    assert code == 2
    _no_raw_control(err)
    number = text.split("\n").index(line.rstrip("\n")) + 1
    assert err.startswith(f"{walk} line {number}, ") and f", {key}: holds " in err
    assert f"(U+{ord(char):04X})" in err and "control character" in err
    assert walk.read_bytes() == before


def test_a_control_character_in_an_added_run_is_refused_and_nothing_is_written(tmp_path):
    walk = write_walk(tmp_path, panel_walk("Quay"))
    before = walk.read_bytes()
    code, out, err = _cli(["add", str(walk), "--from", "LP1", "--to", "Pump\x1b]0;x\x07",
                           "--length", "40", "--amps", "3"])
    assert code == 2 and "to: holds ESC (U+001B)" in err
    _no_raw_control(err)
    assert walk.read_bytes() == before


def test_a_hostile_lock_holder_is_told_as_plain_text_and_nothing_changes(tmp_path):
    walk = write_walk(tmp_path, panel_walk("Quay"))
    before = walk.read_bytes()
    other = live_process()
    try:
        write_lock(walk, other.pid)
        lock = walk.with_name(".walk.toml.lock")
        lock.write_text(lock.read_text().replace('"dana"', '"dana [/x] \\u001b]0;PWNED\\u0007"'))
        code, out, err = _cli(["add", str(walk), "--from", "LP1", "--to", "Pump", "--length",
                               "40", "--amps", "3"])
    finally:
        other.kill()
        other.wait()
    assert code == 2
    _no_raw_control(err)
    assert "dana [/x] \\x1b]0;PWNED\\x07 on " in err
    assert walk.read_bytes() == before


def test_a_file_name_with_control_characters_is_shown_escaped(tmp_path):
    name = "quay\x1b]0;PWNED\x07.toml"
    walk = write_walk(tmp_path, panel_walk("Quay", run_table("R1", "LP1", "Pump", "1e999")), name)
    code, out, err = _cli(["check", str(walk)])
    assert code == 2
    _no_raw_control(err)
    assert "quay\\x1b]0;PWNED\\x07.toml line " in err


@pytest.mark.parametrize("argv", [
    ["check", str(SAMPLES / "warehouse_dc2.toml")],
    ["check", str(SAMPLES / "warehouse_dc2.toml"), "--json"],
    ["takeoff", str(SAMPLES / "warehouse_dc2.toml")],
    ["takeoff", str(SAMPLES / "warehouse_dc2.toml"), "--csv"],
    ["schema"],
    ["calc", "--amps", "40", "--length", "120", "--volts", "240", "--json"],
])
def test_a_reader_that_stops_early_gets_no_traceback(argv):
    """``gaugewalk check --json | head``: the pipe's reader is gone before the command writes
    (its end is closed here at once, so every write meets a closed pipe)."""
    read, write = os.pipe()
    proc = subprocess.Popen([sys.executable, "-m", "gaugewalk.tui.cli.main", *argv], cwd=REPO,
                            stdout=write, stderr=subprocess.PIPE)
    os.close(write)
    os.close(read)
    _, err = proc.communicate(timeout=120)
    assert "Traceback" not in err.decode(), err.decode()[-2000:]
    assert "BrokenPipe" not in err.decode()
    assert proc.returncode == 0


def test_takeoff_csv_cells_never_start_a_formula(tmp_path):
    putups = ('putups = [{ label = "=HYPERLINK(\\"http://x\\")", length_ft = 500, sizes = ['
              '"12 AWG", "10 AWG"] }, { label = "+1 reel", length_ft = 1000, sizes = ["8 AWG"] }]')
    text = panel_walk("Quay", run_table("R1", "LP1", "Pump", "100", load=(16, "A")),
                      defaults={"method": "dc"}).replace('method = "dc"', putups)
    walk = write_walk(tmp_path, text)
    code, out, err = _cli(["takeoff", str(walk), "--csv"])
    assert code == 0
    rows = list(csv.reader(io.StringIO(out)))
    assert len(rows) > 2
    for row in rows:
        for cell in row:
            assert not cell.startswith(("=", "+", "-", "@", "\t", "\r")), cell


@pytest.mark.parametrize("argv", [
    ["add", "{walk}", "--from", "LP1", "--to", "Shelf lights", "--amps", "8", "--length", "40"],
    ["source", "{walk}", "LP9", "--kind", "panel", "--system", "208Y/120", "--from", "LP1",
     "--length", "30"],
])
def test_a_change_saved_before_its_reader_stopped_is_not_reported_lost(tmp_path, argv):
    """``gaugewalk add WALK ... | head -1``: the run is saved, then the second line of the
    summary meets a closed pipe. The command said 'not saved, the file is as it was' and exit 2
    with the change on disk; it ends as a reader stopping early does, exit 0, and the walk has
    the change."""
    from tests.support.walks import write_walk

    walk = write_walk(tmp_path)
    read, write = os.pipe()
    proc = subprocess.Popen([sys.executable, "-m", "gaugewalk.tui.cli.main",
                             *(a.format(walk=walk) for a in argv)], cwd=REPO,
                            stdout=write, stderr=subprocess.PIPE)
    os.close(write)
    os.close(read)
    _, err = proc.communicate(timeout=120)
    text = err.decode()
    assert "Traceback" not in text and "not saved" not in text, text[-2000:]
    assert proc.returncode == 0
    saved = walk.read_text()
    assert ('to = "Shelf lights"' in saved) if argv[0] == "add" else ('id = "LP9"' in saved)
