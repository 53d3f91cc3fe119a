"""The app when the walk cannot be written (issue 15): ctrl+s says so plainly, ctrl+u clears a
broken lock after asking (never a live one), and quitting when the lock cannot be removed ends
cleanly, saying why."""

from __future__ import annotations

import os
from pathlib import Path

from gaugewalk.model.walkfile.lock import lock_path
from tests.support.app_helpers import new_app, opened, type_text
from tests.support.locks import live_process, write_lock
from tests.support.walks import SMALL_WALK, write_walk


def _said(app) -> list[str]:
    return [str(n.message) for n in app._notifications]


async def test_ctrl_s_in_a_read_only_app_says_nothing_was_saved(tmp_path):
    walk = write_walk(tmp_path, SMALL_WALK)
    os.chmod(walk, 0o444)
    app = new_app(walk, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        assert app.session.read_only
        await pilot.press("ctrl+s")
        await pilot.pause()
        last = _said(app)[-1]
        assert last.startswith("Nothing saved: this walk is open read-only here: walk.toml: the "
                               "walk is read-only")
        assert "Saved." not in last and "NOT SAVED" not in last
        assert "read-only" in app.title
    assert walk.read_text() == SMALL_WALK


async def test_ctrl_u_clears_a_broken_lock_after_asking_and_the_walk_opens_for_writing(tmp_path):
    walk = write_walk(tmp_path, SMALL_WALK)
    lock_path(walk).mkdir()  # a lock that is a folder
    app = new_app(walk, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        assert "is a folder" in app.session.read_only
        await pilot.press("ctrl+u")
        await pilot.pause()
        await pilot.press("n")  # leave it
        await pilot.pause()
        assert lock_path(walk).is_dir() and app.session.read_only
        await pilot.press("ctrl+u")
        await pilot.pause()
        await pilot.press("y")
        await pilot.pause()
        assert app.session.read_only is None and "The walk is open for writing" in _said(app)[-1]
        assert lock_path(walk).is_file()  # ours now
        await pilot.press("n")
        await pilot.pause()
        await type_text(pilot, "Kettle")
        await pilot.press("tab")
        await type_text(pilot, "12")
        await pilot.press("tab")
        await type_text(pilot, "8A")
        await pilot.press("enter", "escape")
        await pilot.pause()
    assert "Kettle" in walk.read_text()


async def test_ctrl_u_never_clears_a_lock_a_running_gaugewalk_holds(tmp_path):
    walk = write_walk(tmp_path, SMALL_WALK)
    other = live_process()
    try:
        write_lock(walk, other.pid)
        app = new_app(walk, tmp_path / "cfg")
        async with app.run_test(size=(100, 30)) as pilot:
            await opened(app, pilot)
            await pilot.press("ctrl+u")
            await pilot.pause()
            assert _said(app)[-1].startswith("Not cleared: the walk is open in dana")
            assert app.session.read_only
        assert lock_path(walk).exists()
    finally:
        other.kill()
        other.wait()


async def test_quitting_when_the_lock_cannot_be_removed_ends_cleanly_and_says_why(
        tmp_path, monkeypatch):
    walk = write_walk(tmp_path, SMALL_WALK)
    app = new_app(walk, tmp_path / "cfg")
    real_unlink = os.unlink

    def read_only_folder(path, *args, **kwargs):
        if Path(path) == lock_path(walk):
            raise OSError(30, "Read-only file system")
        return real_unlink(path, *args, **kwargs)

    async with app.run_test(size=(100, 30)) as pilot:
        await opened(app, pilot)
        monkeypatch.setattr(os, "unlink", read_only_folder)
        await pilot.press("ctrl+q")
        await pilot.pause()
    assert app.return_code == 0
    assert "could not be removed (Read-only file system)" in app.exit_message
    assert "next opener clears it" in app.exit_message
