"""Every key, in order, into the field it was typed in: a burst with no pause between keys stores
exactly what the same keys typed one at a time store (``gaugewalk.tui.app.keyorder``)."""

from __future__ import annotations

import tomllib

import pytest
from textual import events

from tests.support.app_helpers import new_app, opened
from tests.support.walks import write_walk

# Keys as Textual names them. Every kind of key that moves the focus or acts is in it: Tab (with
# a completion taken), Down, Up, shift+Tab, ctrl+o there and back, Backspace, Enter storing and
# starting the next card, and characters typed over a field the card filled in.
SCRIPT = (
    ["n", *"Sheeter", "tab", *"45", "down", *"8A", "ctrl+o", "down", *"LL", "ctrl+o", "enter"]
    + [*"Ovem", "backspace", "n", "tab", *"600", "backspace", "tab", *"30A", "up", "up",
       "shift+tab",
       "down", "down", "down", "enter"]
    + [*"pro", "tab", *"12+3", "tab", *"2kW pf0.9", "enter"]
)
CHARACTERS = {"tab": "\t", "enter": "\r", "backspace": "\x08", "shift+tab": None, "down": None,
              "up": None, "ctrl+o": "\x0f"}


def _event(key: str) -> events.Key:
    return events.Key(key, CHARACTERS.get(key, key))


async def _record(tmp_path, name: str, burst: bool, script: list[str] = SCRIPT) -> list[dict]:
    folder = tmp_path / name
    folder.mkdir()
    path = write_walk(folder)
    app = new_app(path, folder / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        driver = app._driver
        assert driver is not None  # run_test gives the app its headless driver
        if burst:
            for key in script:  # all in the app's queue before the first is handled
                driver.send_message(_event(key))
        else:
            for key in script:  # each key handled, and the screen redrawn, before the next
                driver.send_message(_event(key))
                await pilot.pause()
        await pilot.pause(0.3)
        await app.workers.wait_for_complete()
        await pilot.pause()
    return tomllib.loads(path.read_text())["run"]


async def test_a_burst_of_keys_stores_what_the_same_keys_typed_slowly_store(tmp_path):
    slow = await _record(tmp_path, "slow", burst=False)
    burst = await _record(tmp_path, "burst", burst=True)
    assert burst == slow
    # and it is what was typed: the card starts on To (From is LP1, as the last run), the
    # circuit typed on the first card is copied to the next ones
    got = [(r["id"], r["to"], r["length"], r.get("load"), r.get("connection")) for r in slow[2:]]
    assert got == [
        ("R2", "Sheeter", "45", {"value": 8, "unit": "A"}, "LL"),
        ("R3", "Oven", "60", {"value": 30, "unit": "A"}, "LL"),
        ("R4", "Proofer", "12+3", {"value": 2, "unit": "kW", "pf": 0.9}, "LL"),
    ]


async def test_the_keys_behind_enter_on_an_edited_run_reach_the_walk_screen_not_the_card(
        tmp_path):
    # Enter stores the run and closes the card (the store yields to the event loop before the
    # card closes); the keys typed behind it open the card again and store once more,
    # not typed into the closing card
    script = ["e", "down", *"9A", "enter", "e", "down", *"7A", "enter"]
    slow = await _record(tmp_path, "slow", burst=False, script=script)
    burst = await _record(tmp_path, "burst", burst=True, script=script)
    assert burst == slow
    assert slow[0]["load"] == {"value": 7, "unit": "A"}


@pytest.mark.parametrize("first", ["tab", "down", "shift+tab", "ctrl+o"])
async def test_the_key_right_after_a_focus_move_goes_to_the_new_field(tmp_path, first):
    """The keys right behind Tab, Down, shift+Tab or ctrl+o land in the field they move to
    (Enter storing and starting the next card is in the burst above)."""
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        await pilot.pause()
        card = app.screen
        before = card.focused.id
        for key in [first, *"xy"]:
            app._driver.send_message(_event(key))
        await pilot.pause(0.2)
        focused = card.focused
        assert focused.id != before
        assert focused.value == "xy"
