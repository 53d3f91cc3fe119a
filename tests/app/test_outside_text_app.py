"""Text from outside in the app (issue 15): a hostile walk shown in every view and screen, and a
hostile lock told in a notification. What they hold is shown as the text it is: no control
character reaches the terminal, no markup becomes a style, a link or an action (clicking the
notice changes nothing), the app never crashes on it, and the walk on disk is untouched."""

from __future__ import annotations

from hypothesis import given
from hypothesis import strategies as st
from textual.content import Content
from textual.widgets._toast import Toast

from gaugewalk.model.walk.plain_text import shown_lines
from gaugewalk.model.walkfile.lock import lock_path
from gaugewalk.tui.app.plain import escape
from gaugewalk.tui.app.widgets.views import SupplyTree
from tests.support.app_helpers import new_app, opened, screen_text
from tests.support.locks import dead_pid, live_process, write_lock
from tests.support.walks import HOSTILE_WALK, panel_walk, run_table, write_walk

STEPS = [  # (keys, what the screen then shows)
    ((), "Pump [@click=screen.delete_run]click[/] [link=ht"),
    (("down", "down"), "[red]Mixer[/red]"),
    (("2",), "LP1 at bus"),
    ("expand the tree", "[red]Mixer[/red]"),
    (("3",), "Takeoff"),
    (("1", "slash", "left_square_bracket", "enter"), "showing"),
    (("escape", "e"), "[red]Mixer[/red]"),
    (("escape", "t"), "Trial change on R2"),
    (("escape", "j"), "Job settings"),
    (("escape", "f1"), "Key guide"),
    (("escape", "f2"), "About gaugewalk"),
]


async def test_a_hostile_walk_in_every_view_shows_its_text_and_sends_no_control_character(
        tmp_path):
    walk = write_walk(tmp_path, HOSTILE_WALK)
    before = walk.read_bytes()
    app = new_app(walk, tmp_path / "cfg")
    async with app.run_test(size=(120, 36), notifications=True) as pilot:
        await opened(app, pilot)
        for keys, expected in STEPS:
            if keys == "expand the tree":
                app.screen.query_one(SupplyTree).root.expand_all()
            else:
                await pilot.press(*keys)
            await pilot.pause()
            text = screen_text(app)  # fails on any control character sent raw
            assert expected in text, (keys, text)
        await pilot.press("escape")
        await pilot.pause()
        # the card shows the notes' control characters escaped; the run was not changed
        await pilot.press("1", "home", "down", "e")
        await pilot.pause()
        assert app.screen.query_one("#f-notes").value.startswith("pump by the quay \\x1b]0;")
        screen_text(app)
        await pilot.press("escape")
        await pilot.pause()
    assert walk.read_bytes() == before


async def test_a_lock_holder_with_an_unclosed_tag_is_told_without_a_crash(tmp_path):
    walk = write_walk(tmp_path, panel_walk("Quay"))
    other = live_process()
    try:
        write_lock(walk, other.pid)
        lock = lock_path(walk)
        lock.write_text(lock.read_text().replace('"dana"', '"dana [/x] \\u001b]0;PWNED\\u0007"'))
        app = new_app(walk, tmp_path / "cfg")
        async with app.run_test(size=(120, 36), notifications=True) as pilot:
            await opened(app, pilot)
            assert app.session is not None and app.session.read_only
            text = screen_text(app)
            assert "dana [/x] \\x1b]0;PWNED\\x07 on" in text.replace("\n", " ") or any(
                "dana [/x] \\x1b]0;PWNED\\x07" in str(n.message)
                for n in app._notifications)
    finally:
        other.kill()
        other.wait()


async def test_clicking_a_notice_whose_lock_holder_holds_an_action_changes_nothing(tmp_path):
    walk = write_walk(tmp_path, panel_walk(
        "Quay", run_table("R1", "LP1", "Pump", "100", load=(16, "A"))))
    before = walk.read_bytes()
    write_lock(walk, dead_pid())  # stale: the app clears it, says so, and opens for writing
    lock = lock_path(walk)
    lock.write_text(lock.read_text().replace(
        '"dana"', '"[@click=screen.delete_run]dana[/] [@click=app.quit]x[/]"'))
    app = new_app(walk, tmp_path / "cfg")
    async with app.run_test(size=(120, 36), notifications=True) as pilot:
        await opened(app, pilot)
        await pilot.press("down")
        await pilot.pause()
        toasts = list(app.screen.query(Toast))
        assert toasts and any("[@click=screen.delete_run]dana[/]" in str(t.render())
                              for t in toasts)
        for toast in toasts:
            await pilot.click(toast, offset=(3, 1))
            await pilot.pause()
        assert app.is_running
        assert [r.id for r in app.session.job.runs] == ["F1", "R1"]
    assert walk.read_bytes() == before


@given(st.text(st.characters(exclude_categories=["Cs"]), max_size=40)
       | st.text(alphabet="[]\\/@$=ab \"#", max_size=30))
def test_escaped_outside_text_is_never_markup(text):
    """Every ``[`` escaped: Textual's own ``escape`` leaves ``[$accent]`` and ``[B]`` as markup."""
    content = Content.from_markup(f"[b]{escape(text)}[/b]")
    assert content.plain.removesuffix("\u200b") == shown_lines(text)
    assert [span.style for span in content.spans] == ["b"] * len(content.spans)
