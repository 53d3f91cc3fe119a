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
    if app.session is not None:
        app.session.settle()  # every change on disk (the app saves behind the editing)
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


def screen_text(app) -> str:
    """What the terminal shows now, as plain lines, rendered the way the app writes it; fails if
    any piece of text would send a control character to the terminal (text from a walk or a lock
    must be shown escaped, ``gaugewalk.model.walk.plain_text``)."""
    from gaugewalk.model.walk.plain_text import CONTROL_CHARS

    update = app.screen._compositor.render_full_update()
    lines = []
    for chops in update.strips:
        line = ""
        for strip in chops:
            for segment in strip:
                if segment.control:
                    continue
                raw = sorted({c for c in segment.text if c in CONTROL_CHARS})
                assert not raw, f"control characters {raw!r} sent raw in {segment.text!r}"
                line += segment.text
        lines.append(line)
    return "\n".join(lines)


CHARACTERS = {"tab": "\t", "enter": "\r", "backspace": "\x08", "escape": "\x1b",
              "shift+tab": None, "down": None, "up": None, "ctrl+o": "\x0f", "ctrl+r": "\x12"}
"""The character a terminal sends with each named key that is not printable itself."""


def key_event(key: str):
    """The ``Key`` event a terminal's key makes (``"a"``, ``" "``, ``"tab"``, ``"ctrl+r"``)."""
    from textual import events

    if len(key) == 1:
        return events.Key(KEY_NAMES.get(key, key), key)
    return events.Key(key, CHARACTERS.get(key, key))


async def burst(app, pilot, keys) -> None:
    """Put every key of ``keys`` in the app's queue before the first is handled (a paste, a
    fast typist), then wait until they are handled and the walk's work is done."""
    driver = app._driver
    assert driver is not None  # run_test gives the app its headless driver
    for key in keys:
        driver.send_message(key_event(key))
    await pilot.pause(0.3)
    await app.workers.wait_for_complete()
    await pilot.pause()


async def type_keys(app, pilot, keys, *, fast: bool) -> None:
    """Type ``keys`` in one burst (``fast``) or as a slow typist does, each handled before the
    next; the burst tests compare what the two store."""
    if fast:
        await burst(app, pilot, keys)
        return
    for key in keys:
        await pilot.press(key)
        await pilot.pause()
