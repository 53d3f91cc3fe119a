"""Where the focus goes on the run card and the job settings, and what moving into a field does."""

from __future__ import annotations

import pytest

from gaugewalk.tui.app.screens.card import RunCard
from gaugewalk.tui.app.screens.job import JobSettingsScreen
from tests.support.app_helpers import new_app, opened, settle, type_text
from tests.support.walks import write_walk


@pytest.mark.parametrize("moves, left",
                         [([], "f-to"), (["tab"], "f-length"), (["tab", "tab"], "f-load")])
async def test_ctrl_o_comes_back_to_the_main_field_it_left(tmp_path, moves, left):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n", *moves)
        card = app.screen
        assert card.focused.id == left
        await pilot.press("ctrl+o")
        assert card.focused.id == "f-panel"
        await pilot.press("down", "ctrl+o")  # circuit, then back
        assert card.focused.id == left


async def test_a_card_brought_back_starts_on_its_first_field_still_needed_as_a_new_card_does(
        tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        assert app.screen.focused.id == "f-to"  # a new card: From is the last run's source
        await type_text(pilot, "Freezer")
        await pilot.press("escape", "n")  # closed and kept, then brought back
        card = app.screen
        assert isinstance(card, RunCard) and card.values()["to"] == "Freezer"
        assert card.focused.id == "f-length"


async def test_job_settings_open_on_the_job_name_and_moving_on_keeps_the_next_fields_text(tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("j")
        screen = app.screen
        assert isinstance(screen, JobSettingsScreen)
        assert screen.focused.id == "s-job-name"
        await pilot.press("tab", "tab", "tab")  # site, walked by, material
        field = screen.focused
        assert field.id == "s-material" and field.selection.is_empty
        await type_text(pilot, "x")  # a stray key does not wipe the setting
        assert field.value == "cux"


async def test_job_settings_move_with_the_arrows_and_store_nonlinear_loads(tmp_path):
    # the arrows move between settings as on the run card (a walker pressed Down and typed
    # into the job's name); the nonlinear row is stored into the walk (NEC 310.15(E)(3))
    from gaugewalk.model.walkfile.read import load_walk

    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("j")
        await pilot.pause()
        screen = app.screen
        assert screen.focused.id == "s-job-name"
        await pilot.press("down", "down", "up")
        assert screen.focused.id == "s-job-site"
        screen.query_one("#s-nonlinear_loads").focus()
        await pilot.press("ctrl+u", "y", "e", "s", "enter")
        await settle(app, pilot)
        assert not isinstance(app.screen, JobSettingsScreen)
    assert load_walk(path).defaults.nonlinear_loads is True
