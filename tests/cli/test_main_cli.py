"""The dispatcher (``gaugewalk.tui.cli.main``): its table of commands agrees with the command
modules, ``--help`` lists them all without importing one, and a command imports only what it
needs (``calc`` neither pydantic nor the walk model)."""

from __future__ import annotations

import gc
import importlib
import json
import subprocess
import sys

import pytest

from gaugewalk.model.walkfile import toml_parse
from gaugewalk.tui.cli.main import COMMANDS, main
from tests.support.paths import REPO


def test_the_table_names_every_module_with_its_own_name_and_help():
    for command in COMMANDS:
        module = importlib.import_module(command.module)
        assert (module.NAME, module.HELP) == (command.name, command.help)
        assert callable(module.add_arguments) and callable(module.run)
    assert len({c.name for c in COMMANDS}) == len(COMMANDS)


def test_every_command_module_is_in_the_table():
    listed = {c.module for c in COMMANDS}
    modules = {"gaugewalk.tui.cli." + p.stem for p in (REPO / "tui" / "cli").glob("*.py")
               if any(line.startswith("NAME = ") for line in p.read_text().splitlines())}
    assert modules == listed


def test_help_lists_every_command_with_its_help(capsys):
    with pytest.raises(SystemExit) as done:
        main(["--help"])
    assert done.value.code == 0
    out = " ".join(capsys.readouterr().out.split())  # argparse wraps the help lines
    for command in COMMANDS:
        assert f"{command.name} {' '.join(command.help.split())}" in out


def test_each_command_shows_its_own_options(capsys):
    for command, option in (("calc", "--amps"), ("check", "--json"), ("takeoff", "--prices")):
        with pytest.raises(SystemExit) as done:
            main([command, "--help"])
        assert done.value.code == 0
        assert option in capsys.readouterr().out


def loaded_by(argv: list[str]) -> set[str]:
    """Modules a fresh interpreter has loaded after running ``gaugewalk ARGV`` (output dropped)."""
    code = (
        "import contextlib, io, sys\n"
        "from gaugewalk.tui.cli.main import main\n"
        "with contextlib.redirect_stdout(io.StringIO()):\n"
        "    try:\n"
        f"        code = main({argv!r})\n"
        "    except SystemExit as exc:\n"
        "        code = exc.code\n"
        "loaded = sorted(sys.modules)\n"
        "import json  # after the list: the command's own imports only\n"
        "print(json.dumps([code, loaded]))\n"
    )
    done = subprocess.run([sys.executable, "-c", code], cwd=REPO, capture_output=True, text=True,
                          check=True)
    code, modules = json.loads(done.stdout.splitlines()[-1])
    assert code == 0, done.stderr
    return set(modules)


def test_calc_imports_neither_pydantic_nor_the_walk_model():
    loaded = loaded_by(["calc", "--amps", "40", "--length", "120+35+2*12", "--volts", "240"])
    assert "gaugewalk.model.engine.sizing" in loaded  # it did size the run
    # the output filter every command's text passes through (stdlib only) is all it takes
    light = {"gaugewalk.model.walk", "gaugewalk.model.walk.plain_text"}
    heavy = {m for m in loaded
             if m.split(".")[0] == "pydantic" or m.startswith("gaugewalk.model.walk")} - light
    assert heavy == set()


def test_help_imports_no_command_module():
    loaded = loaded_by(["--help"])
    assert {m for m in loaded if m.startswith("gaugewalk.tui.cli.")} == {"gaugewalk.tui.cli.main"}


def test_check_loads_no_face_and_nothing_its_output_does_not_use():
    loaded = loaded_by(["check", str(REPO / "sample_walks" / "warehouse_dc2.toml")])
    assert "gaugewalk.model.walk.compute" in loaded  # it did compute the walk
    faces = {m for m in loaded if m.split(".")[0] in ("textual", "rich")}
    assert faces == set()
    unused = ("gaugewalk.tui.app", "gaugewalk.tui.report", "gaugewalk.model.report",
              "gaugewalk.model.session", "gaugewalk.model.walk.takeoff",
              "gaugewalk.model.walk.schedule")  # the schedules only for --json
    assert {m for m in loaded if m.startswith(unused)} == set()
    assert "json" not in loaded  # only --json writes it
    if toml_parse.COMPILED is not None:  # tomllib only for text the compiled parser refuses
        assert "tomllib" not in loaded


def test_a_command_run_in_process_gives_the_collector_back_what_it_froze(capsys):
    # main() from the command line leaves its objects frozen for its shutdown; a caller that goes
    # on must get them back under the cyclic collector, enabled as it was
    assert gc.get_freeze_count() == 0 and gc.isenabled()
    assert main(["calc", "--amps", "20", "--length", "50", "--volts", "120"]) == 0
    assert main(["check", str(REPO / "sample_walks" / "warehouse_dc2.toml")]) == 0
    capsys.readouterr()
    assert gc.get_freeze_count() == 0 and gc.isenabled()


def test_a_command_process_ending_at_once_leaves_its_output_and_files_whole(tmp_path):
    # a headless command's process ends with os._exit once its output is flushed (main's
    # _end_now): every byte of a large output reaches the pipe, the exit status is the
    # command's, and a file it wrote is complete on disk
    cli = [sys.executable, "-m", "gaugewalk.tui.cli.main"]
    sample = str(REPO / "sample_walks" / "warehouse_dc2.toml")
    done = subprocess.run([*cli, "check", "--json", sample], capture_output=True, text=True,
                          timeout=120)
    assert done.returncode == 0, done.stderr
    assert len(done.stdout) > 100_000   # bigger than any pipe's buffer
    assert json.loads(done.stdout)["summary"]["runs"] == 385
    walk = tmp_path / "w.toml"
    steps = [["new", str(walk), "--name", "Quick exit"],
             ["source", str(walk), "MSB", "--kind", "service", "--system", "208Y/120V 3ph 4w"],
             ["add", str(walk), "--id", "R1", "--from", "MSB", "--to", "Bench lights",
              "--length", "60", "--amps", "12"]]
    for step in steps:
        ran = subprocess.run([*cli, *step], capture_output=True, text=True, timeout=120)
        assert ran.returncode == 0, (step, ran.stdout, ran.stderr)
    checked = subprocess.run([*cli, "check", "--json", str(walk)], capture_output=True,
                             text=True, timeout=120)
    assert checked.returncode == 0, checked.stderr
    assert [r["id"] for r in json.loads(checked.stdout)["runs"]] == ["R1"]
    bad = subprocess.run([*cli, "check", str(tmp_path / "missing.toml")], capture_output=True,
                         text=True, timeout=120)
    assert bad.returncode == 2 and "missing.toml" in bad.stderr
