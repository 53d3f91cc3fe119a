"""The run sheet: sorting shows the top of the new order, an empty filter says so, and the
columns say each run's circuit (voltage, poles) and device."""

from __future__ import annotations

import pytest

from tests.support.app_helpers import SMALL_WALK, new_app, opened, shown, type_text, write_walk
from gaugewalk.tui.app.widgets.runsheet import RunSheet


@pytest.fixture(autouse=True)
def _config_elsewhere(tmp_path, monkeypatch):
    monkeypatch.setenv("XDG_CONFIG_HOME", str(tmp_path / "xdg"))


def _many_runs(n: int) -> str:
    """The invented bakery walk with ``n`` more lighting runs from LP1, each longer."""
    runs = "".join(
        f'\n[[run]]\nid = "L{i}"\nfrom = "LP1"\nto = "Light row {i}"\nlength = "{20 + 5 * i}"\n'
        f'load = {{ value = 6, unit = "A" }}\nconnection = "LN"\n'
        for i in range(1, n + 1)
    )
    return SMALL_WALK + runs


async def test_sorting_puts_the_cursor_and_the_view_on_the_first_row_of_the_new_order(tmp_path):
    app = new_app(write_walk(tmp_path, _many_runs(40)), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        sheet = app.screen.query_one(RunSheet)
        await pilot.press("end")  # the last run, the view scrolled down to it
        await pilot.pause()
        assert sheet.cursor == len(sheet.view) - 1 and sheet.scroll_y > 0
        await pilot.press("r")  # reverse: the last run by id comes first
        await pilot.pause()
        assert sheet.cursor == 0 and sheet.scroll_y == 0
        assert sheet.cursor_key == sheet.visible_keys()[0]


async def test_a_filter_that_finds_nothing_says_so_and_how_to_clear_it(tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("slash")
        await type_text(pilot, "zzz")
        await pilot.pause()
        detail = shown(app, "#detail")
        assert "No run matches the filter" in detail and "Press n" not in detail
