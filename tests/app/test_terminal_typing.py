"""The real app in a real terminal: keys typed in bursts into tmux while other processes keep the
processor busy end up in the walk file exactly as typed (issue: keys sent within about 80 ms of
Tab, Down, ctrl+o or Enter used to land in the wrong field).

Each test runs its own tmux server (``tmux -L`` with a name of its own), so the tests can run in
parallel. Skipped where tmux is not installed (``.ci/run`` installs it where it can).
"""

from __future__ import annotations

import os
import shlex
import shutil
import subprocess
import sys
import time
import tomllib
import uuid
from pathlib import Path

import pytest

from tests.support.walks import write_walk

pytestmark = [
    pytest.mark.skipif(
        shutil.which("tmux") is None,
        reason="tmux is not installed: this test types into the app in a real terminal "
        "(apt-get install -y tmux)",
    ),
    pytest.mark.slow,  # the app started and typed into under load, three times
]

# The keys of a foreman recording three runs, as tmux names them: Tab, Down, Up, shift+Tab
# (BTab), ctrl+o there and back, Backspace, a completion taken with Tab, Enter storing and
# starting the next card, and ctrl+q at the end.
KEYS = (
    ["n", *"Sheeter", "Tab", *"45", "Down", *"8A", "C-o", "Down", *"LL", "C-o", "Enter"]
    + [*"Ovem", "BSpace", "n", "Tab", *"600", "BSpace", "Tab", *"30A", "Up", "Up", "BTab",
       "Down", "Down", "Down", "Enter"]
    + [*"pro", "Tab", *"12+3", "Tab", *"2kW", "Space", *"pf0.9", "Enter", "C-q"]
)
EXPECTED = [  # (id, to, length, load, circuit) after the two runs of the invented walk
    ("R2", "Sheeter", "45", {"value": 8, "unit": "A"}, "LL"),
    ("R3", "Oven", "60", {"value": 30, "unit": "A"}, "LL"),
    ("R4", "Proofer", "12+3", {"value": 2, "unit": "kW", "pf": 0.9}, "LL"),
]
LIMIT_S = 90  # longest wait for the app to reach a state; only a hang reaches it [s]


class Pane:
    """One tmux server of our own with one 80x24 pane."""

    def __init__(self, command: str) -> None:
        self.socket = f"gw-keys-{os.getpid()}-{uuid.uuid4().hex[:8]}"
        self._tmux("new-session", "-d", "-s", "main", "-x", "80", "-y", "24", command)

    def _tmux(self, *args: str) -> str:
        done = subprocess.run(["tmux", "-L", self.socket, "-f", "/dev/null", *args],
                              capture_output=True, text=True, check=True)
        return done.stdout

    def keys(self, *keys: str) -> None:
        self._tmux("send-keys", "-t", "main", *keys)

    def screen(self) -> str:
        return self._tmux("capture-pane", "-p", "-t", "main")

    def wait_for(self, text: str, absent: str | None = None) -> None:
        end = time.monotonic() + LIMIT_S
        shown = ""
        while time.monotonic() < end:
            shown = self.screen()
            if text in shown and (absent is None or absent not in shown):
                return
            time.sleep(0.1)
        raise AssertionError(f"{text!r} did not appear within {LIMIT_S} s; "
                             f"the pane shows:\n{shown}")

    def close(self) -> None:
        subprocess.run(["tmux", "-L", self.socket, "kill-server"], capture_output=True)


def _busy_processes() -> list[subprocess.Popen]:
    """One process spinning on each processor (each stops by itself after two minutes)."""
    spin = "import time\nend = time.time() + 120\nwhile time.time() < end: pass\n"
    return [subprocess.Popen([sys.executable, "-c", spin]) for _ in range(os.cpu_count() or 2)]


@pytest.mark.parametrize("gap_ms", [0, 20, 50])
def test_keys_typed_in_a_real_terminal_under_load_reach_the_file_as_typed(tmp_path: Path,
                                                                           gap_ms: int):
    path = write_walk(tmp_path)
    env = f"XDG_CONFIG_HOME={shlex.quote(str(tmp_path / 'xdg'))} TERM=xterm-256color"
    app = f"{shlex.quote(sys.executable)} -m gaugewalk.tui.cli.main {shlex.quote(str(path))}"
    shell = f"cd {shlex.quote(str(tmp_path))} && env {env} {app}; echo \"[ended $?]\"; sleep 60"
    pane = Pane(shell)
    busy = _busy_processes()
    try:
        pane.wait_for("CAUTION")  # the first start shows the caution
        pane.keys("Enter")
        pane.wait_for("✓ ok", absent="sizing")  # the walk is open and sized
        if gap_ms == 0:
            pane.keys(*KEYS)  # one write: every key at once
        else:
            for key in KEYS:
                pane.keys(key)
                time.sleep(gap_ms / 1000)
        pane.wait_for("[ended 0]")
    finally:
        for proc in busy:
            proc.kill()
            proc.wait()
        pane.close()
    runs = tomllib.loads(path.read_text(encoding="utf-8"))["run"]
    got = [(r["id"], r["to"], r["length"], r.get("load"), r.get("connection")) for r in runs[2:]]
    assert got == EXPECTED
