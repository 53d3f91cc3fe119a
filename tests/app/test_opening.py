"""Opening a walk in the app: the walk screen comes up with the runs as written, its keys wait for
the walk, and the sized rows take their place, those on screen first."""

from __future__ import annotations

import gc
import subprocess
import sys

from gaugewalk.tui.app.app import WalkApp
from gaugewalk.tui.app.screens.card import RunCard
from gaugewalk.tui.app.screens.walk import WalkScreen
from gaugewalk.tui.app.sheet.rawrows import SIZING
from gaugewalk.tui.app.sheet.rows import all_rows
from gaugewalk.tui.app.widgets.runsheet import RunSheet
from tests.support.app_helpers import new_app, opened, settle
from tests.support.synthetic_walk import synthetic_walk_text


async def test_the_rows_on_screen_are_sized_first_and_every_row_right_after(tmp_path,
                                                                             monkeypatch):
    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(60), encoding="utf-8")
    at_attach = []
    attach = WalkScreen.attach

    def attached(self, session) -> None:
        attach(self, session)
        sheet = self.query_one(RunSheet)
        at_attach.append((sheet.rows_on_screen(), [r.cells[-1] for r in sheet.rows]))

    monkeypatch.setattr(WalkScreen, "attach", attached)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        (on_screen, status), = at_attach
        assert 0 < len(on_screen) < 60
        assert all(s != SIZING for s in status[: len(on_screen)])
        assert all(s == SIZING for s in status[len(on_screen):])
        # and then every row, as a whole rebuild makes them
        assert app.screen.query_one(RunSheet).rows == all_rows(app.session)


async def test_the_walk_is_the_first_screen_with_its_title_key_line_and_find_box(tmp_path):
    from textual.widgets._footer import FooterKey

    from gaugewalk.tui.app.widgets.titleline import TitleLine

    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(12), encoding="utf-8")
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        first = app.screen_stack[0]
        assert isinstance(first, WalkScreen)   # no empty screen made and drawn before it
        await opened(app, pilot)
        assert app.screen is first and first.attached and len(app.screen_stack) == 1
        title = str(first.query_one(TitleLine).render())
        assert title.startswith("walk.toml · ✓ saved — ") and app.sub_title in title
        keys = {key.description for key in first.query(FooterKey)}
        assert {"Quit", "New run", "Edit", "Find"} <= keys
        assert len(first.query("#find")) == 1


async def test_the_walk_keys_wait_until_the_walk_is_open(tmp_path, monkeypatch):
    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(12), encoding="utf-8")
    held = []
    monkeypatch.setattr(WalkApp, "_show", lambda self, session: held.append(session))
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(app, pilot)
        screen = app.screen
        assert isinstance(screen, WalkScreen) and not screen.attached and len(held) == 1
        assert screen.query_one(RunSheet).rows[0].cells[-1] == SIZING
        await pilot.press("n")   # a new run: not yet
        await pilot.click(RunSheet, offset=(3, 0), times=2)   # nor a run double-clicked
        assert app.screen is screen
        monkeypatch.undo()
        app._show(held[0])
        await opened(app, pilot)
        assert screen.attached and app.session is held[0]
        await pilot.press("n")
        assert isinstance(app.screen, RunCard)


async def test_the_supply_tree_is_made_the_first_time_it_is_shown(tmp_path):
    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(12), encoding="utf-8")
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        assert not app.screen.query("#tree")
        await pilot.press("2")
        assert app.screen.query_one("#tree").has_focus
        await pilot.press("1")
        await pilot.press("2")
        assert len(app.screen.query("#tree")) == 1


async def test_the_collector_is_held_off_while_the_walk_opens_and_given_back(tmp_path,
                                                                          monkeypatch):
    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(12), encoding="utf-8")
    assert gc.isenabled() and gc.get_freeze_count() == 0
    held = []
    monkeypatch.setattr(WalkApp, "_show", lambda self, session: held.append(gc.isenabled()))
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(app, pilot)
        assert held == [False] and not gc.isenabled()   # read and sized with it off
    assert gc.isenabled()   # the app ended: given back all the same
    monkeypatch.undo()
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        # on again, with what the opening built left out of its passes
        assert app.screen.attached and gc.isenabled() and gc.get_freeze_count() > 0
    assert gc.get_freeze_count() == 0   # given back when the app ends
    bad = tmp_path / "bad.toml"
    bad.write_text("not = [toml", encoding="utf-8")
    app = new_app(bad, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(app, pilot)
        assert app.return_code == 2 and gc.isenabled()


def test_what_the_first_paint_imports_holds_no_model_and_no_command_line():
    # the walk screen with the runs as written: the model (pydantic) loads behind that paint
    code = ("import sys, gaugewalk.tui.app.app, gaugewalk.tui.app.screens.walk, "
            "gaugewalk.tui.app.sheet.rawrows; print(' '.join(sorted(sys.modules)))")
    loaded = set(subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                                check=True).stdout.split())
    assert "gaugewalk.tui.app.screens.walk" in loaded
    assert {m for m in loaded if m.split(".")[0] in {"pydantic", "pydantic_core", "argparse"}
            or m.startswith(("gaugewalk.model.session", "gaugewalk.model.walk.job",
                             "gaugewalk.model.engine.sizing", "gaugewalk.tui.cli",
                             "gaugewalk.tui.app.widgets.views", "gaugewalk.tui.app.sheet.rows",
                             "gaugewalk.tui.app.screens.info"))
            } == set()
