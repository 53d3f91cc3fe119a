"""The run card is built once and opened again for every later run: each open shows the run it
was opened for and nothing of the last, the keys typed right behind the key that opens it land in
it (in a burst as slowly), a theme changed while it was away is on it, and the key lines show
the keys of the screen they are on."""

from __future__ import annotations

import tomllib

from textual.widgets._footer import FooterKey

from gaugewalk.tui.app.screens.card import RunCard
from gaugewalk.tui.app.screens.walk import WalkScreen
from gaugewalk.tui.app.widgets.runsheet import RunSheet
from tests.support.app_helpers import burst, new_app, opened, screen_text, settle, type_keys
from tests.support.walks import write_walk

# two new runs, each on a card opened again with n after Esc closed the last
NEW_RUNS = (["n", *"Sheeter", "tab", *"45", "tab", *"8A", "enter", "escape"]
            + ["n", *"Oven", "tab", *"60", "tab", *"30A", "enter", "escape"])
# R1 edited on the same card (typing starts in Length, its text selected), then one more new run
EDIT_THEN_NEW = ["e", *"77", "enter", "n", *"Mixer", "tab", *"20", "tab", *"5A", "enter",
                 "escape"]


async def _record(tmp_path, name: str, fast: bool) -> list[tuple]:
    folder = tmp_path / name
    folder.mkdir()
    path = write_walk(folder)
    app = new_app(path, folder / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await type_keys(app, pilot, NEW_RUNS, fast=fast)
        await settle(app, pilot)
        assert isinstance(app.screen, WalkScreen)
        assert app.screen.query_one(RunSheet).move_to("R1")
        await type_keys(app, pilot, EDIT_THEN_NEW, fast=fast)
        await settle(app, pilot)
        assert isinstance(app.screen, WalkScreen)
    runs = tomllib.loads(path.read_text())["run"][1:]
    return [(r["id"], r["to"], r["length"], r["load"]) for r in runs]


async def test_keys_typed_right_behind_the_key_that_opens_the_card_again_land_in_it(tmp_path):
    expected = [
        ("R1", "Proofer", "77", {"value": 16, "unit": "A"}),
        ("R2", "Sheeter", "45", {"value": 8, "unit": "A"}),
        ("R3", "Oven", "60", {"value": 30, "unit": "A"}),
        ("R4", "Mixer", "20", {"value": 5, "unit": "A"}),
    ]
    assert await _record(tmp_path, "slow", fast=False) == expected
    assert await _record(tmp_path, "burst", fast=True) == expected


async def test_a_card_opened_again_shows_the_run_it_was_opened_for_and_nothing_of_the_last(
        tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        sheet = app.screen.query_one(RunSheet)
        assert sheet.move_to("R1")
        await pilot.press("e")
        await pilot.pause()
        card = app.screen
        assert isinstance(card, RunCard) and card.run_id == "R1"
        await pilot.press("down", *"x")   # a load that is wrong: the card says so
        await pilot.pause()
        assert "not a load" in str(card.query_one("#card-msg").render())
        assert "not a load" in str(card.query_one("#h-load").render())
        assert card.query_one("#f-load").has_class("-invalid")
        await pilot.press("escape")
        await pilot.pause()
        assert sheet.move_to("F1")
        await pilot.press("e")
        await pilot.pause()
        assert app.screen is card and card.run_id == "F1"   # the same card, for the feeder
        assert card.query_one("#f-to").value == "LP1" and card.values()["to"] == "LP1"
        assert card.focused is card.query_one("#f-length")
        assert card.focused.selected_text == "40"
        assert not card.errors
        assert "not a load" not in str(card.query_one("#card-msg").render())
        assert "not a load" not in str(card.query_one("#h-load").render())
        assert not card.query_one("#f-load").has_class("-invalid")
        assert app.sub_title == "Run card: editing F1"
        assert "Run card: editing F1" in screen_text(app).splitlines()[0]   # the title line
        await pilot.press("escape")
        await pilot.pause()
        await pilot.press("n")   # a new run on it: the fields of a fresh card
        await pilot.pause()
        assert app.screen is card and card.run_id is None and card.stored == []
        assert card.query_one("#f-to").value == "" and card.focused is card.query_one("#f-to")
        assert card.values()["from"] == "LP1"   # the last run's source
    assert tomllib.loads((tmp_path / "walk.toml").read_text())["run"][1]["load"]["value"] == 16


async def test_a_theme_changed_while_the_card_was_closed_is_on_it_when_it_opens_again(tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        await pilot.pause()
        card = app.screen
        field = card.query_one("#f-to")
        before = field.styles.background
        await pilot.press("escape")
        await pilot.pause()
        await pilot.press("f3")   # the other look, while the card is closed
        await pilot.pause()
        await pilot.press("n")
        await pilot.pause()
        assert app.screen is card
        assert field.styles.background != before
        assert field.styles.background == app.screen.query_one("#f-length").styles.background


def _footer_keys(screen) -> list[str]:
    return [key.key for key in screen.query(FooterKey)]


async def test_the_key_lines_show_the_keys_of_their_screen_after_the_card_comes_and_goes(tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        walk = app.screen
        walk_keys = _footer_keys(walk)
        assert "n" in walk_keys
        for _ in range(2):
            await pilot.press("n")
            await pilot.pause()
            card = app.screen
            assert isinstance(card, RunCard)
            card_keys = _footer_keys(card)
            assert card_keys and card_keys != walk_keys and "n" not in card_keys
            await pilot.press("tab", "tab")   # moving between fields keeps the card's keys
            await pilot.pause()
            assert _footer_keys(card) == card_keys
            await pilot.press("escape")
            await pilot.pause()
            assert app.screen is walk and _footer_keys(walk) == walk_keys


async def test_enter_stores_the_run_its_last_check_sized_and_checks_again_what_changed_since(
        tmp_path, monkeypatch):
    """Enter right after a clean check stores that check's run without sizing it again; a field
    changed since (here by the form itself, not a key) is checked again first."""
    from gaugewalk.model.session.card_form import CardForm

    checks: list[str] = []
    check = CardForm.check

    def counted(self, store_tried=False):
        checks.append(self.values["length"])
        return check(self, store_tried)

    monkeypatch.setattr(CardForm, "check", counted)
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        assert app.screen.query_one(RunSheet).move_to("R1")
        await pilot.press("e", *"60")   # R1's length, typed over
        await pilot.pause()
        card = app.screen
        assert isinstance(card, RunCard) and card.run_id == "R1" and checks[-1] == "60"
        before = len(checks)
        await pilot.press("enter")
        await settle(app, pilot)
        assert len(checks) == before   # stored as checked
        assert isinstance(app.screen, WalkScreen)
        assert [r.length for r in app.session.job.runs] == ["40", "60"]
        await pilot.press("e", *"70")
        await pilot.pause()
        card.form.values["length"] = "75"   # changed since the last check
        before = len(checks)
        await pilot.press("enter")
        await settle(app, pilot)
        assert checks[before:] == ["75"]
    assert tomllib.loads(path.read_text())["run"][1]["length"] == "75"


async def _card_built_ahead(app, pilot) -> RunCard:
    """Wait until the walk screen has built its run card and rehearsed its first open (it does
    while the app waits for a key); a few seconds at most."""
    walk = app.screen
    assert isinstance(walk, WalkScreen)
    for _ in range(300):
        if walk.card_ready:
            break
        await pilot.pause(0.01)
    assert walk.card_ready, "the run card was not built while the app waited for a key"
    assert walk._card is not None
    return walk._card


async def test_the_card_is_built_while_the_app_waits_and_its_first_open_shows_the_run(tmp_path):
    path = write_walk(tmp_path)
    text = path.read_text()
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        walk, title = app.screen, app.sub_title
        card = await _card_built_ahead(app, pilot)
        # built unseen: nothing shown, said, kept or saved for it
        assert app.screen is walk and app.sub_title == title and card.stored == []
        assert app.session.draft is None and path.read_text() == text
        assert not list(tmp_path.glob("*draft*")) and not list(tmp_path.glob(".*draft*"))
        ahead = _footer_keys(card)   # its key line built too, with the card's own keys
        assert "escape" in ahead and "n" not in ahead
        assert walk.query_one(RunSheet).move_to("R1")
        await burst(app, pilot, ["e", *"77"])   # typed right behind the key that opens it
        assert app.screen is card and card.run_id == "R1"
        assert card.query_one("#f-to").value == "Proofer"
        assert card.focused is card.query_one("#f-length")
        assert card.query_one("#f-length").value == "77"
        assert app.sub_title == "Run card: editing R1"
        assert _footer_keys(card) == ahead
        await type_keys(app, pilot, ["enter"], fast=False)
        await settle(app, pilot)
        assert app.screen is walk
    assert tomllib.loads(path.read_text())["run"][1]["length"] == "77"


async def test_keys_typed_behind_the_key_that_opens_a_card_still_being_built_land_in_it(
        tmp_path, monkeypatch):
    from gaugewalk.tui.app.screens import walk as walk_screen

    monkeypatch.setattr(walk_screen, "CARD_AHEAD_S", 3600.0)   # built ahead only when told here
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        walk = app.screen
        assert isinstance(walk, WalkScreen) and walk._card is None
        walk._card_ahead()   # the first step: the card's widgets start being built, unseen
        card = walk._card
        assert card is not None and not card.is_mounted and app.screen is walk
        await burst(app, pilot, ["n", *"Sheeter", "tab", *"45", "tab", *"8A", "enter", "escape"])
        await settle(app, pilot)
        assert app.screen is walk and card.rehearsed
    runs = tomllib.loads(path.read_text())["run"]
    assert [(r["to"], r["length"], r["load"]) for r in runs[2:]] == [
        ("Sheeter", "45", {"value": 8, "unit": "A"})]


async def test_a_card_field_keeps_the_end_of_a_long_text_in_view_and_scrolls_back(tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        await pilot.pause()
        card = app.screen
        field = card.query_one("#f-to")
        assert card.focused is field
        long = "Walk-in freezer evaporator"   # wider than the field (17 columns)
        await type_keys(app, pilot, list(long), fast=True)
        assert field.value == long
        shown_text = str(field.render_line(0).text)
        assert field.scroll_x > 0 and "evaporator" in shown_text and "Walk" not in shown_text
        await type_keys(app, pilot, ["up", "down", *"Oven"], fast=False)   # back in: replaced
        assert field.value == "Oven" and field.scroll_x == 0
        assert "Oven" in str(field.render_line(0).text)


async def test_a_theme_changed_while_the_card_was_open_is_on_the_walk_screen_when_it_closes(
        tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        walk = app.screen
        before = walk.styles.background
        await pilot.press("n")
        await pilot.pause()
        card = app.screen
        await pilot.press("escape")   # and back, the theme as it was: the styles as they were
        await pilot.pause()
        assert app.screen is walk and walk.styles.background == before
        await pilot.press("n")
        await pilot.pause()
        await pilot.press("f3")   # the other look, while the card is open
        await pilot.pause()
        await pilot.press("escape")
        await pilot.pause()
        assert app.screen is walk
        assert walk.styles.background != before
        assert walk.styles.background == card.styles.background   # both in the new look


async def test_a_card_offers_no_completion_for_what_it_filled_in_and_one_as_keys_come(tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")   # From filled in with LP1, the source of the last run
        await settle(app, pilot)
        card = app.screen
        assert isinstance(card, RunCard) and card.values()["from"] == "LP1"
        # nothing typed yet: the walk's names were not gathered to complete the card's own text
        assert card._choices is None and card._input("from")._suggestion == ""
        await pilot.press(*"Pro")
        await settle(app, pilot)
        assert card._input("to")._suggestion == "Proofer"   # R1 goes to the Proofer


async def test_the_card_built_ahead_has_its_frame_clock_started_and_waits_paused(
        tmp_path, monkeypatch):
    # A screen's update timer starts its clock at its first resume and draws one period (1/60 s)
    # after it; a card whose clock first starts when it opens waits that long for its first
    # paint. The rehearsal starts it unseen and leaves it paused for the open.
    from textual.timer import Timer

    resumed: list[object] = []
    resume = Timer.resume

    def noted(timer: Timer) -> None:
        if timer.name == "screen_update":
            resumed.append(timer._target())
        resume(timer)

    monkeypatch.setattr(Timer, "resume", noted)
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        walk = app.screen
        card = await _card_built_ahead(app, pilot)
        assert app.screen is walk and card in resumed   # started, never shown
        assert not card._update_timer._active.is_set()    # and paused until it opens
