"""Fixtures shared by the command-line tests."""

from __future__ import annotations

import pytest

from gaugewalk.tui.cli.main import main


@pytest.fixture
def shop(tmp_path, capsys):
    """A new walk made by ``gaugewalk new`` on a 480Y/277 V service (its output read away)."""
    path = tmp_path / "shop.toml"
    assert main(["new", str(path), "--service", "480Y/277"]) == 0
    capsys.readouterr()
    return path
