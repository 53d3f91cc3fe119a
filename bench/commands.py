"""The headless commands as the user runs them: whole processes, start to exit, each beside a
baseline process taken in turn with it.

- ``gaugewalk calc`` sizing one run (the README's example); baseline: a bare ``python -c pass``.
- ``gaugewalk check`` of the sample walk (385 runs); baseline: a process that only parses the
  same file with ``tomllib``.
- With ``--instructions`` (where valgrind is installed), for information: the instructions
  ``check`` and its baseline execute under valgrind's callgrind, one process each with
  ``PYTHONHASHSEED=0``: a count that does not move with the machine's load, as wall-clock times
  do (``instruction_figures``).
- For information: a process that imports pydantic and builds one model, as the walk model does
  (pydantic's plugin loader spared as ``job.py`` spares it): what ``check`` pays before any code of
  ours, in the same ratio to the same baseline; and a process that only imports the walk model
  (``gaugewalk.model.walk.job``: its pydantic classes built, no file read), what ``check`` pays
  before it reads a byte of the walk.
"""

from __future__ import annotations

import os
import re
import shutil
import subprocess
import sys
from pathlib import Path

from bench.timing import process_best

PYDANTIC_FLOOR = (
    "from gaugewalk.model.engine.collector import collector_held\n"
    "with collector_held(freeze=True):\n"
    "    from gaugewalk.model.walk.pydantic_plugins import spare_the_loader\n"
    "    spare_the_loader()\n"
    "    import pydantic\n"
    "    class One(pydantic.BaseModel):\n"
    "        a: int\n"
    "    One(a=1)\n")
"""pydantic imported and one model built and used, the walk model's way (its plugin loader
spared, the collector held as ``check`` holds it while it imports: without that, the collector's
passes over pydantic's import would be counted here and not in ``check``)."""

WALK_MODEL = (
    "from gaugewalk.model.engine.collector import collector_held\n"
    "with collector_held(freeze=True):\n"
    "    import gaugewalk.model.walk.job\n")
"""The walk model imported as ``check`` imports its modules (the collector held,
``gaugewalk.tui.cli.main``)."""

PARSE_ONLY = "import sys, tomllib\nwith open(sys.argv[1], 'rb') as f: tomllib.load(f)"
"""``check``'s baseline: a process that only parses the walk with tomllib (``python -c``)."""

CALC_ARGS = ("calc", "--amps", "40", "--length", "120+35+2*12", "--volts", "240", "--continuous")


def _gaugewalk() -> list[str]:
    """The installed ``gaugewalk`` command beside this interpreter, as the user starts it."""
    script = Path(sys.executable).parent / "gaugewalk"
    if script.exists():
        return [str(script)]
    return [sys.executable, "-m", "gaugewalk.tui.cli.main"]


def command_figures(sample: Path, starts: int) -> dict:
    """Best wall time [s] of each command and its baseline, ``starts`` rounds interleaved."""
    cli = _gaugewalk()
    commands = {
        "python": [sys.executable, "-c", "pass"],
        "calc": [*cli, *CALC_ARGS],
        "parse": [sys.executable, "-c", PARSE_ONLY, str(sample)],
        "check": [*cli, "check", str(sample)],
        "pydantic": [sys.executable, "-c", PYDANTIC_FLOOR],
        "model": [sys.executable, "-c", WALK_MODEL],
    }
    # check exits 1 when a run is over its limits: still a whole check, timed as one
    best = process_best(commands, starts, ok={"check": (0, 1)})
    return {
        "python_s": best["python"], "calc_s": best["calc"],
        "check_parse_s": best["parse"], "check_s": best["check"],
        "pydantic_floor_s": best["pydantic"], "walk_model_s": best["model"],
    }


_COLLECTED = re.compile(r"^==\d+== Collected : (\d+)\s*$", re.MULTILINE)


def collected_instructions(report: str) -> int | None:
    """The instructions callgrind says it collected (``==PID== Collected : N`` in its standard
    error), or None where it says none."""
    found = _COLLECTED.search(report)
    return int(found.group(1)) if found else None


def instruction_figures(sample: Path) -> dict:
    """The instructions ``gaugewalk check`` of ``sample`` and its baseline (a process only
    parsing it with tomllib) execute under valgrind's callgrind (``check_instructions``,
    ``parse_instructions``); empty where valgrind is not installed or says nothing."""
    valgrind = shutil.which("valgrind")
    if valgrind is None:
        return {}
    commands = {
        "check_instructions": [*_gaugewalk(), "check", str(sample)],
        "parse_instructions": [sys.executable, "-c", PARSE_ONLY, str(sample)],
    }
    out = {}
    for key, command in commands.items():
        done = subprocess.run([valgrind, "--tool=callgrind", "--callgrind-out-file=/dev/null",
                               *command], capture_output=True, text=True,
                              env={**os.environ, "PYTHONHASHSEED": "0"}, check=False)
        count = collected_instructions(done.stderr)
        if count is None:
            return {}
        out[key] = count
    return out
