"""Storing a run in the app: the save is written behind the editing, the run sheet redoes only
the rows the change touched and then shows what a whole rebuild shows, and a save that fails
stays said in the title and a notice."""

from __future__ import annotations

from bench.walks import deepest_branch
from gaugewalk.model.walkfile.write import dumps_walk
from gaugewalk.tui.app.screens.walk import WalkScreen
from gaugewalk.tui.app.sheet.rows import all_rows
from gaugewalk.tui.app.widgets.runsheet import RunSheet, format_line
from tests.support.app_helpers import new_app, opened, screen_text, settle, type_text
from tests.support.synthetic_walk import synthetic_walk_text


def _fresh_sheet(app, sheet: RunSheet) -> RunSheet:
    """A sheet given every row anew, with the same filter and sort as ``sheet``."""
    fresh = RunSheet(sheet.columns)
    fresh.sort_key, fresh.sort_reverse = sheet.sort_key, sheet.sort_reverse
    fresh.filter_text, fresh.filter_pred = sheet.filter_text, sheet.filter_pred
    fresh.cursor = sheet.cursor
    fresh.set_rows(all_rows(app.session), keep_key=sheet.cursor_key)
    return fresh


async def _store_load(app, pilot, run_id: str, text: str) -> None:
    sheet = app.screen.query_one(RunSheet)
    assert sheet.move_to(run_id)
    await pilot.press("e")
    await pilot.pause()
    await pilot.press("down")   # the load field, its text selected
    await type_text(pilot, text)
    await pilot.press("enter")
    await settle(app, pilot)
    assert isinstance(app.screen, WalkScreen)


async def test_a_stored_run_redoes_only_the_rows_it_changed_and_shows_the_whole_rebuilds_sheet(
        tmp_path):
    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(400), encoding="utf-8")
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        sheet = app.screen.query_one(RunSheet)
        target = deepest_branch(app.session.job)
        rows = sheet.rows
        for keys, find, text in (((), "", "40A"), (("s",) * 10, "", "3A"),
                                 (("slash",), target.from_, "25A")):
            await pilot.press(*keys)   # as it is, sorted by total drop, then filtered too
            if find:
                await type_text(pilot, find)
                await pilot.press("enter")
            await pilot.pause()
            assert sheet.sort_key == (None if not keys else "total")
            before = {row.key: row for row in sheet.rows}
            await _store_load(app, pilot, target.id, text)
            assert sheet.rows is rows   # the rows were updated in place, not all made again
            fresh = _fresh_sheet(app, sheet)
            assert sheet.rows == fresh.rows
            assert sheet.view == fresh.view and sheet.cursor_key == fresh.cursor_key
            assert sheet._longest == fresh._longest
            assert sheet.flagged == fresh.flagged == sum(row.flag for row in fresh.rows)
            drawn = screen_text(app)   # every row on screen drawn again where it changed
            for i in sheet.view[round(sheet.scroll_y):][:sheet.size.height]:
                assert format_line(sheet.columns, sheet.rows[i].cells) in drawn
            moved = {row.key for row in sheet.rows if row != before[row.key]}
            assert target.id in moved and len(moved) > 1   # the feeders above it moved too
        assert f'"{text[:-1]}' in path.read_text() or f"= {text[:-1]}" in path.read_text()


async def test_a_save_that_fails_behind_the_editing_stays_in_the_title_and_is_said(tmp_path):
    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(60), encoding="utf-8")
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        target = deepest_branch(app.session.job)
        other = app.session.job.model_copy(update={"runs": [
            r.model_copy(update={"load": r.load.model_copy(update={"value": 9})})
            if r.id == target.id else r for r in app.session.job.runs]})
        theirs = dumps_walk(other)   # someone else changed the same run's load meanwhile
        path.write_text(theirs)
        await _store_load(app, pilot, target.id, "7A")   # both changed it: a clash
        assert "NOT SAVED" in app.title
        assert any("NOT SAVED" in str(n.message) and "changed on disk" in str(n.message)
                   for n in app._notifications)
        assert path.read_text() == theirs
        sheet = app.screen.query_one(RunSheet)
        assert sheet.move_to(target.id)   # the run is stored in the walk all the same
        assert app.session.job.run(target.id).load.value == 7


async def test_a_walk_past_the_size_first_limit_shows_first_and_is_sized_behind(tmp_path,
                                                                                 monkeypatch):
    import gaugewalk.tui.app.app as app_module
    from gaugewalk.tui.app.sheet.rawrows import SIZING

    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(60), encoding="utf-8")
    monkeypatch.setattr(app_module, "SIZE_BEFORE_SHOWING", 59)   # one run too many
    shown_unsized = []
    original = WalkScreen.on_mount

    def on_mount(self) -> None:
        original(self)
        shown_unsized.append(self.query_one(RunSheet).rows[0].cells[-1] == SIZING)

    monkeypatch.setattr(WalkScreen, "on_mount", on_mount)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        sheet = app.screen.query_one(RunSheet)
        assert shown_unsized == [True]   # the walk screen came up before the sizing
        assert not app.session.busy
        assert sheet.rows == all_rows(app.session)
        assert all(row.cells[-1] != SIZING for row in sheet.rows)


async def test_a_walk_within_the_limit_comes_up_sized(tmp_path, monkeypatch):
    """The runs as written first, then, once, the walk's own rows, already sized."""
    from gaugewalk.tui.app.sheet.rawrows import SIZING

    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(60), encoding="utf-8")
    shown_first, attached = [], []
    on_mount, attach = WalkScreen.on_mount, WalkScreen.attach

    def mounted(self) -> None:
        on_mount(self)
        shown_first.append(self.query_one(RunSheet).rows[0].cells[-1])

    def attached_to(self, session) -> None:
        attach(self, session)
        attached.append(self.query_one(RunSheet).rows[0].cells[-1])

    monkeypatch.setattr(WalkScreen, "on_mount", mounted)
    monkeypatch.setattr(WalkScreen, "attach", attached_to)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        assert shown_first == [SIZING]   # one walk screen, with the runs as written
        assert len(attached) == 1 and attached[0] != SIZING


async def test_the_writer_takes_turns_with_the_event_loop_while_a_walk_is_open(tmp_path):
    import sys

    from gaugewalk.tui.app.app import SWITCH_S

    before = sys.getswitchinterval()
    sys.setswitchinterval(0.005)   # Python's own, whatever an earlier test left
    try:
        path = tmp_path / "walk.toml"
        path.write_text(synthetic_walk_text(20), encoding="utf-8")
        app = new_app(path, tmp_path / "cfg")
        async with app.run_test(size=(100, 30)) as pilot:
            await opened(app, pilot)
            assert sys.getswitchinterval() == SWITCH_S
        assert sys.getswitchinterval() == 0.005   # the process's own once the app is gone
    finally:
        sys.setswitchinterval(before)
