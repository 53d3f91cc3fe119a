"""Keys on the walk screen, in order at any speed: a key that acts on the run under the cursor
(``e``, Enter, ``t``; bound with priority, so they act as the app takes them) finds the cursor
where the keys typed before it moved it, in the run sheet and in the supply tree."""

from __future__ import annotations

import pytest
from textual import events

from tests.support.app_helpers import new_app, opened
from tests.support.walks import write_walk

CHARACTERS = {"down": None, "up": None, "end": None, "home": None, "pagedown": None,
              "pageup": None, "2": "2", "e": "e", "enter": "\r", "t": "t"}


async def _card_after(tmp_path, name: str, keys: list[str], burst: bool) -> str | None:
    """The run the card opened on after ``keys`` (the last opens it)."""
    folder = tmp_path / name
    folder.mkdir()
    app = new_app(write_walk(folder), folder / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        driver = app._driver
        assert driver is not None
        for key in keys:
            driver.send_message(events.Key(key, CHARACTERS.get(key, key)))
            if not burst:
                await pilot.pause()
        await pilot.pause(0.3)
        return getattr(app.screen, "run_id", None)


@pytest.mark.parametrize("keys", [
    ["down", "e"],
    ["down", "down", "up", "down", "e"],
    ["end", "enter"],
    ["end", "up", "e"],
    ["2", "down", "down", "down", "e"],
])
async def test_a_burst_on_the_walk_screen_edits_the_run_the_same_keys_typed_slowly_edit(
        tmp_path, keys):
    slow = await _card_after(tmp_path, "slow", keys, burst=False)
    burst = await _card_after(tmp_path, "burst", keys, burst=True)
    assert slow is not None
    assert burst == slow


async def test_a_burst_after_slash_is_typed_into_the_find_box_not_taken_as_keys(tmp_path):
    # p is "keep positions" (it writes the walk file), t a trial, f a source filter: typed
    # right behind /, they are the text to find
    path = write_walk(tmp_path)
    before = path.read_bytes()
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        driver = app._driver
        assert driver is not None
        for key in ["slash", *"pft"]:
            driver.send_message(events.Key(key, "/" if key == "slash" else key))
        await pilot.pause(0.3)
        assert app.screen.query_one("#find").value == "pft"
        assert app.screen.source_filter is None
    assert path.read_bytes() == before
