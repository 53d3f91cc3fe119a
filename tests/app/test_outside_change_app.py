"""The app while its walk is changed on disk (issue 15): the change is taken in, a store after
it saves both, ctrl+s settles a clash instead of failing for ever, a stored run's draft stays
until the run is on disk, and quitting never loses what was typed."""

from __future__ import annotations

from gaugewalk.model.walkfile.drafts import load_draft
from gaugewalk.model.walkfile.read import load_walk
from tests.support.app_helpers import new_app, opened, settle, shown, type_text
from tests.support.walks import SMALL_WALK, run_table, tables_text, write_walk


def _said(app) -> list[str]:
    return [str(n.message) for n in app._notifications]


def _hand_add(path, rid: str, to: str) -> None:
    with open(path, "a", encoding="utf-8") as handle:
        handle.write(tables_text("run", [run_table(rid, "LP1", to, "30", load=(6, "A"),
                                                   connection="LN")]))


async def _store_new_run(app, pilot, to: str, length: str = "20", load: str = "4A") -> None:
    await pilot.press("n")
    await pilot.pause()
    await type_text(pilot, to)
    await pilot.press("tab")
    await type_text(pilot, length)
    await pilot.press("tab")
    await type_text(pilot, load)
    await pilot.press("enter")
    await pilot.pause()
    await pilot.press("escape")
    await pilot.pause()


async def test_a_change_on_disk_is_taken_in_when_nothing_here_waits(tmp_path):
    walk = write_walk(tmp_path, SMALL_WALK)
    app = new_app(walk, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        _hand_add(walk, "R9", "Walk-in cooler")
        app.screen.look_at_disk()    # what the timer does every few seconds
        await pilot.pause()
        assert app.session.job.run("R9") is not None
        assert _said(app)[-1] == "walk.toml changed on disk; reloaded it."
        assert "✓ saved" in app.title


async def test_coming_back_to_the_terminal_looks_at_the_disk(tmp_path):
    from textual import events

    walk = write_walk(tmp_path, SMALL_WALK)
    app = new_app(walk, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        _hand_add(walk, "R9", "Walk-in cooler")
        app.post_message(events.AppFocus())
        await pilot.pause()
        assert app.session.job.run("R9") is not None


async def test_a_run_stored_after_a_change_on_disk_is_saved_with_it(tmp_path):
    walk = write_walk(tmp_path, SMALL_WALK)
    app = new_app(walk, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        _hand_add(walk, "R2", "Walk-in cooler")     # and the run typed next will be R2 too
        await _store_new_run(app, pilot, "Slicer")
        assert "✓ saved" in app.title, _said(app)
        assert any("your run R2 is now R3" in s for s in _said(app))
    assert {r.id: r.to for r in load_walk(walk).runs} == {
        "F1": "LP1", "R1": "Proofer", "R2": "Walk-in cooler", "R3": "Slicer"}


async def test_ctrl_s_after_a_clash_offers_to_take_the_change_in_and_then_saves(tmp_path):
    walk = write_walk(tmp_path, SMALL_WALK)
    app = new_app(walk, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        walk.write_text(walk.read_text().replace('"Harbour Lane bakery"', '"Bakery, phase 2"'))
        theirs = walk.read_text()
        app.session.set_job(app.session.job.job.model_copy(update={"name": "Bakery (ours)"}),
                            app.session.job.defaults)   # as the job settings store it
        await settle(app, pilot)   # the save, behind the editing, meets the clash
        assert "NOT SAVED: changed on disk (ctrl+s)" in app.title
        assert walk.read_text() == theirs
        await pilot.press("ctrl+s")
        await pilot.pause()
        assert app.screen.__class__.__name__ == "AskScreen"
        await pilot.press("n")                        # not now: nothing written
        await pilot.pause()
        assert walk.read_text() == theirs
        await pilot.press("ctrl+s")
        await pilot.pause()
        await pilot.press("y")
        await pilot.pause()
        assert "✓ saved" in app.title, _said(app)
        assert "kept yours where both changed (1)" in _said(app)[-1]
    assert load_walk(walk).job.name == "Bakery (ours)"
    assert (tmp_path / "walk.toml~").read_text() == theirs


async def test_quitting_with_changes_that_cannot_be_saved_keeps_them_and_says_where(tmp_path):
    walk = write_walk(tmp_path, SMALL_WALK)
    app = new_app(walk, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        walk.write_text(walk.read_text() + "\n[[run]\n")   # a hand edit, half done
        broken = walk.read_text()
        await _store_new_run(app, pilot, "Slicer")
        assert "NOT SAVED" in app.title
        assert load_draft(walk) is not None           # the stored run is not on disk yet
        await pilot.press("ctrl+q")
        await pilot.pause()
    assert app.return_code == 0
    assert walk.read_text() == broken
    kept = app.session.state.kept
    assert kept is not None and load_walk(kept).run("R2").to == "Slicer"
    assert f"gaugewalk merge {walk} {kept} -o {walk}" in app.exit_message


async def test_the_clash_question_shows_walk_text_as_text_never_markup(tmp_path):
    # a name someone typed on disk, and one typed here, that would be markup and a click action
    walk = write_walk(tmp_path, SMALL_WALK)
    app = new_app(walk, tmp_path / "cfg")
    async with app.run_test(size=(160, 40)) as pilot:
        await opened(app, pilot)
        walk.write_text(walk.read_text().replace('"Harbour Lane bakery"',
                                                 '"[@click=app.quit]theirs[/] [b]x"'))
        app.session.set_job(app.session.job.job.model_copy(update={"name": "[red]mine"}),
                            app.session.job.defaults)
        await pilot.press("ctrl+s")
        await pilot.pause()
        assert app.screen.__class__.__name__ == "AskScreen"
        question = " ".join(shown(app, "#ask-question").split())
        assert "'[@click=app.quit]theirs[/] [b]x'" in question and "'[red]mine'" in question
        await pilot.press("n")
        await pilot.pause()
        assert app.is_running
