"""Golden files (``tests/golden/``) and the invented walk the takeoff and report tests share."""

from __future__ import annotations

import os

from gaugewalk.tui.cli.main import main
from tests.support.paths import GOLDEN

TAKEOFF_WALK = GOLDEN / "takeoff_walk.toml"   # invented job: a bakery fit-out, 208Y/120 V


def gaugewalk(module, argv: list[str]) -> int:
    """Run ``gaugewalk MODULE.NAME ARGV...`` through the real dispatcher
    (``gaugewalk.tui.cli.main.main``)."""
    return main([module.NAME, *argv])


def check_golden(name: str, text: str) -> None:
    """Compare with tests/golden/NAME; GAUGEWALK_UPDATE_GOLDEN=1 rewrites it (read it first)."""
    path = GOLDEN / name
    if os.environ.get("GAUGEWALK_UPDATE_GOLDEN") == "1":
        path.write_text(text, encoding="utf-8", newline="")
    assert path.exists(), f"{path} is missing; run with GAUGEWALK_UPDATE_GOLDEN=1 and read it"
    with open(path, encoding="utf-8", newline="") as handle:
        assert text == handle.read()
