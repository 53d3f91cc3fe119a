"""A run like the last one in a few keys: ctrl+r makes the card like the last run (its To
stepped on, typing on in Length), and Tab in an empty To takes the last name stepped on."""

from __future__ import annotations

import tomllib

from gaugewalk.tui.app.screens.card import RunCard
from tests.support.app_helpers import new_app, opened, type_keys, type_text
from tests.support.walks import write_walk

# three light rows: the first typed in full, the second with ctrl+r and its length, the third
# with Tab taking the stepped name in To
KEYS = (["n", *"Row 1", "tab", *"40", "tab", *"8A", "down", "y", "enter"]  # Continuous below Load
        + ["ctrl+r", *"55", "enter"]
        + ["tab", *"70", "tab", *"9A", "enter", "escape"])
EXPECTED = [
    ("R2", "Row 1", "40", {"value": 8, "unit": "A"}, True),
    ("R3", "Row 2", "55", {"value": 8, "unit": "A"}, True),
    ("R4", "Row 3", "70", {"value": 9, "unit": "A"}, True),
]


async def _record(tmp_path, name: str, fast: bool) -> list[tuple]:
    folder = tmp_path / name
    folder.mkdir()
    path = write_walk(folder)
    app = new_app(path, folder / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await type_keys(app, pilot, KEYS, fast=fast)
    runs = tomllib.loads(path.read_text())["run"][2:]
    return [(r["id"], r["to"], r["length"], r["load"], r.get("continuous", False)) for r in runs]


async def test_ctrl_r_and_tab_in_to_record_the_next_rows_slowly_and_in_a_burst(tmp_path):
    assert await _record(tmp_path, "slow", fast=False) == EXPECTED
    assert await _record(tmp_path, "burst", fast=True) == EXPECTED


async def test_ctrl_r_puts_the_cursor_on_the_length_with_its_text_selected(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        card = app.screen
        assert isinstance(card, RunCard)
        await pilot.press("ctrl+r")
        await pilot.pause()
        length = card.focused
        assert length.id == "f-length" and length.selected_text == "100"
        # "Proofer" has no number to step: the card says To is the same name
        assert "Like R1, to the same name" in str(card.query_one("#card-msg").render())
        await type_text(pilot, "80")
        await pilot.press("enter")
        await pilot.pause()
    runs = tomllib.loads(path.read_text())["run"]
    # R1's fields (16 A, LN, 12 AWG fixed) under the next id, with the new length
    assert {k: runs[-1][k] for k in ("id", "to", "length", "load", "connection", "size")} == {
        "id": "R2", "to": "Proofer", "length": "80", "load": {"value": 16, "unit": "A"},
        "connection": "LN", "size": "12 AWG"}


async def test_ctrl_r_on_a_card_editing_a_run_changes_nothing_and_says_why(tmp_path):
    path = write_walk(tmp_path)
    before = path.read_bytes()
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("down", "e")
        card = app.screen
        values = card.values()
        await pilot.press("ctrl+r")
        await pilot.pause()
        assert card.values() == values
        assert "this card edits a run" in str(card.query_one("#card-msg").render())
        await pilot.press("escape")
    assert path.read_bytes() == before
