"""The first screen and the new-walk questions take keys in order, at once (``keyorder``): a
burst that starts a new walk, names its file and answers the questions makes the walk typed."""

from __future__ import annotations

import tomllib

import pytest

from gaugewalk.tui.app.recent import RecentWalks
from gaugewalk.tui.app.screens.walk import WalkScreen
from tests.support.app_helpers import burst, new_app, opened, settle, type_keys

# n: a new walk; its file; Enter; the job's name over the proposed one, Tab, the service id,
# Tab, the system (each answer is selected on entering it, so typing replaces it), Enter
KEYS = ["n", *"yard-shed", "enter", *"Yard shed", "tab", *"MDP", "tab", *"480Y/277", "enter"]


@pytest.mark.parametrize("fast", [False, True], ids=["slowly", "in-a-burst"])
async def test_a_new_walk_typed_from_the_first_screen_is_made_as_typed(tmp_path, monkeypatch,
                                                                        fast):
    monkeypatch.chdir(tmp_path)
    config = tmp_path / "cfg"
    RecentWalks.load(config).mark_caution_seen()
    app = new_app(None, config)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(app, pilot)
        await type_keys(app, pilot, KEYS, fast=fast)
        await opened(app, pilot)
        assert isinstance(app.screen, WalkScreen)
    data = tomllib.loads((tmp_path / "yard-shed.toml").read_text())
    assert data["job"]["name"] == "Yard shed"
    assert [(s["id"], s["kind"], s["system"]) for s in data["source"]] == [
        ("MDP", "service", "480Y/277V 3ph 4w")]


async def test_the_keys_after_the_list_moves_land_in_the_new_walks_file_box(tmp_path,
                                                                             monkeypatch):
    """Down, Up and n act at once, so the letters right behind n go into the file box."""
    monkeypatch.chdir(tmp_path)
    config = tmp_path / "cfg"
    recent = RecentWalks.load(config)
    recent.mark_caution_seen()
    app = new_app(None, config)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(app, pilot)
        await burst(app, pilot, ["down", "up", "n", *"mill"])
        assert app.screen.query_one("#start-path").value == "mill"
        assert app.screen.focused.id == "start-path"
