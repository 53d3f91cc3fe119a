"""Helpers for the app tests: starting the app, typing into it, reading the sheet (the walks
they open are in ``tests.support.walks``)."""

from __future__ import annotations

from pathlib import Path

from gaugewalk.tui.app.app import WalkApp, make_app

KEY_NAMES = {
    " ": "space", "+": "plus", "*": "asterisk", "/": "slash", ".": "full_stop", "-": "minus",
    "'": "apostrophe", '"': "quotation_mark", "#": "number_sign", "(": "left_parenthesis",
    ")": "right_parenthesis",
}


def new_app(path: Path | None, config: Path) -> WalkApp:
    return make_app(str(path) if path is not None else None, config_dir=config)


async def type_text(pilot, text: str) -> None:
    """Type ``text`` key by key (one wait for the screen at the end)."""
    await pilot.press(*(KEY_NAMES.get(ch, ch) for ch in text))


async def settle(app, pilot) -> None:
    from textual.worker import WorkerCancelled

    try:
        await app.workers.wait_for_complete()
    except WorkerCancelled:  # the app ended while opening (a walk that cannot be read)
        pass
    await pilot.pause()
    await pilot.pause()


async def opened(app, pilot, *, dismiss_caution: bool = True) -> None:
    """Wait until the walk is open and sized; close the first-start caution."""
    await settle(app, pilot)
    from gaugewalk.tui.app.screens.info import AboutScreen

    if dismiss_caution and isinstance(app.screen, AboutScreen):
        await pilot.press("enter")
        await pilot.pause()


def sheet_cells(app) -> dict[str, tuple[str, ...]]:
    from gaugewalk.tui.app.widgets.runsheet import RunSheet

    sheet = app.screen.query_one(RunSheet)
    return {sheet.rows[i].key: sheet.rows[i].cells for i in sheet.view}


def shown(app, selector: str) -> str:
    """The plain text a widget of the current screen shows."""
    return str(app.screen.query_one(selector).render())
