"""Recording runs in the app by keys: what ends up on disk, live answers, refusals, undo,
reopening."""

from __future__ import annotations

import re
import tomllib
from datetime import date

import pytest

from gaugewalk.tui.app.screens.card import RunCard
from tests.support.app_helpers import new_app, opened, settle, sheet_cells, shown, type_text
from tests.support.walks import SMALL_WALK, write_walk


async def test_a_walk_of_several_runs_typed_by_keys_ends_in_the_expected_toml(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        assert isinstance(app.screen, RunCard)
        # "from" is filled from the last run (LP1); the card starts at "to"
        await type_text(pilot, "Mixer")
        await pilot.press("tab")
        await type_text(pilot, "85+12+2*6")
        await pilot.press("tab")
        await type_text(pilot, "1.8kVA")
        await pilot.press("enter")
        await type_text(pilot, "Cooler")
        await pilot.press("tab")
        await type_text(pilot, "36m+8ft")
        await pilot.press("tab")
        await type_text(pilot, "5kW pf0.9")
        await pilot.press("enter")
        await pilot.press("escape")
        await pilot.pause()
    data = tomllib.loads(path.read_text())
    runs = {r["id"]: r for r in data["run"]}
    assert list(runs) == ["F1", "R1", "R2", "R3"]
    # circuit copied from the previous run from the same source (R1: LN); dated today
    assert runs["R2"] == {
        "id": "R2", "from": "LP1", "to": "Mixer", "length": "85+12+2*6",
        "load": {"value": 1.8, "unit": "kVA"}, "connection": "LN", "measured_on": date.today(),
    }
    assert runs["R3"] == {
        "id": "R3", "from": "LP1", "to": "Cooler", "length": "36m+8ft",
        "load": {"value": 5, "unit": "kW", "pf": 0.9}, "connection": "LN",
        "measured_on": date.today(),
    }
    # what was there before is untouched
    assert runs["R1"]["size"] == "12 AWG" and data["defaults"] == {"method": "dc"}


async def test_the_length_field_shows_its_value_in_feet_and_the_answer_is_live(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        await type_text(pilot, "Oven")
        await pilot.press("tab")
        await type_text(pilot, "85+12+2*6")
        await pilot.pause()
        # 85 + 12 + 2*6 = 109 ft
        assert "= 109 ft" in str(app.screen.query_one("#h-length").render())
        await pilot.press("tab")
        await type_text(pilot, "16A")
        await pilot.pause()
        answer = str(app.screen.query_one("#answer").render())
        for word in ("Size", "Run drop", "From svc", "Governs", "EGC", "Raceway"):
            assert word in answer


async def test_editing_a_length_updates_the_drop_and_the_footage(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        session = app.session
        # NEC 2023 Ch. 9 Table 8: 12 AWG stranded uncoated copper 1.98 ohm/kft at 75 C.
        # 120 V two-wire: VD = 2 * 16 A * 1.98 * 100 ft / 1000 = 6.336 V = 5.28 % of 120 V
        assert session.result_for("R1").voltage_drop_pct == pytest.approx(5.28, abs=0.01)
        assert sheet_cells(app)["R1"][8] == "5.28"
        await pilot.press("2")  # supply tree first, then footage: both must follow the edit
        await pilot.press("3")
        # R1: hot + neutral + EGC, all 12 AWG (Table 250.122: 20 A device -> 12 AWG Cu), each
        # (100 ft + 2 ft slack at each end, the shipped default): 3 x 104 = 312 ft; and F1,
        # carrying R1's 16 A on one line (a 20 A device, 12 AWG): 3 hots, neutral and EGC of
        # 40 + 2 + 2 ft: 5 x 44 = 220 ft; 532 ft in all
        assert re.search(r"Cu 12 AWG +532 ", shown(app, "#footage-text"))
        await pilot.press("1")
        await pilot.press("down")  # F1 -> R1
        await pilot.press("e")
        assert isinstance(app.screen, RunCard)
        assert app.screen.focused.id == "f-length"
        await type_text(pilot, "50")
        await pilot.press("enter")
        await pilot.pause()
        # half the length, half the drop (Ohm's law): 2.64 %
        assert session.result_for("R1").voltage_drop_pct == pytest.approx(2.64, abs=0.01)
        assert sheet_cells(app)["R1"][8] == "2.64"
        await pilot.press("3")
        # 3 x (50 + 2 + 2) = 162 ft, and F1's 220 ft
        assert re.search(r"Cu 12 AWG +382 ", shown(app, "#footage-text"))
    assert 'length = "50"' in path.read_text()


@pytest.mark.parametrize(
    ("field_keys", "text", "reason"),
    [
        (["shift+tab"], "85+x", "Length"),                     # not a length
        (["shift+tab", "tab"], "16", "has no unit"),            # a load without its unit
        (["shift+tab"] * 3, "LP7", "no source 'LP7'"),          # a source not in the walk
    ],
)
async def test_invalid_entries_are_refused_with_a_message_and_nothing_is_written(
        tmp_path, field_keys, text, reason):
    path = write_walk(tmp_path)
    before = path.read_bytes()
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        await type_text(pilot, "Dough sheeter")
        await pilot.press("tab")
        await type_text(pilot, "60")
        await pilot.press("tab")
        await type_text(pilot, "12A")
        # go back to the field under test (reaching a field selects its text) and replace it
        await pilot.press(*field_keys)
        await type_text(pilot, text)
        await pilot.press("enter")
        await pilot.pause()
        assert isinstance(app.screen, RunCard)  # still on the card
        message = str(app.screen.query_one("#card-msg").render())
        assert "Not stored" in message and reason in message
        hints = " ".join(str(h.render()) for h in app.screen.query(".card-hint"))
        assert "✗" in hints
    assert path.read_bytes() == before


async def test_undo_brings_back_a_deleted_run_and_redo_deletes_it_again(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        original = path.read_text()
        await pilot.press("down", "delete")
        await settle(app, pilot)
        assert "R1" not in sheet_cells(app)
        assert 'id = "R1"' not in path.read_text()
        await pilot.press("ctrl+z")
        await settle(app, pilot)
        assert "R1" in sheet_cells(app)
        assert path.read_text() == original
        await pilot.press("ctrl+y")
        await settle(app, pilot)
        assert 'id = "R1"' not in path.read_text()


async def test_undo_restores_a_run_edit(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        original = path.read_text()
        await pilot.press("down", "e")
        await type_text(pilot, "250")
        await pilot.press("enter")
        await settle(app, pilot)
        assert 'length = "250"' in path.read_text()
        await pilot.press("ctrl+z")
        await settle(app, pilot)
        assert path.read_text() == original
        assert app.session.result_for("R1").voltage_drop_pct == pytest.approx(5.28, abs=0.01)


async def test_reopening_shows_the_same_walk(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        await type_text(pilot, "Display case")
        await pilot.press("tab")
        await type_text(pilot, "42")
        await pilot.press("tab")
        await type_text(pilot, "1200W")
        await pilot.press("enter", "escape")
        await pilot.pause()
        first = sheet_cells(app)
    again = new_app(path, tmp_path / "cfg")
    async with again.run_test(size=(80, 24)) as pilot:
        await opened(again, pilot)
        assert sheet_cells(again) == first
        assert list(first) == ["F1", "R1", "R2"]


async def test_a_new_panel_can_be_declared_on_the_spot_from_the_run_card(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n", "shift+tab")
        await type_text(pilot, "SVC")
        await pilot.press("tab")
        await type_text(pilot, "LP2")
        await pilot.press("tab")
        await type_text(pilot, "120")
        await pilot.press("tab", "ctrl+o")  # past the load (a feeder sums what its panel
        # serves) to New panel, which To's hint names
        await type_text(pilot, "208Y/120")
        await pilot.press("enter")
        await pilot.pause()
    data = tomllib.loads(path.read_text())
    assert {"id": "LP2", "kind": "panel", "system": "208Y/120V 3ph 4w"} in data["source"]
    # a feeder: F ids
    assert {"id": "F2", "from": "SVC", "to": "LP2", "length": "120",
            "measured_on": date.today()} in data["run"]


async def test_to_completes_from_names_already_in_the_walk_with_tab(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        await type_text(pilot, "pro")
        await pilot.pause()
        await pilot.press("tab")
        card = app.screen
        assert card.values()["to"] == "Proofer"
        assert card.focused.id == "f-length"


async def test_editing_a_run_keeps_what_the_card_does_not_show(tmp_path):
    text = SMALL_WALK.replace('size = "12 AWG"\n',
                              'size = "12 AWG"\nbends = 3\nocpd_a = 20\nambient_c = 40.0\n')
    path = write_walk(tmp_path, text)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("down", "e", "shift+tab")  # the card opens on length; back to 'to'
        await type_text(pilot, "Proofer and rack")
        await pilot.press("enter")
        await pilot.pause()
    run = {r["id"]: r for r in tomllib.loads(path.read_text())["run"]}["R1"]
    assert run["to"] == "Proofer and rack"
    assert run["bends"] == 3 and run["ocpd_a"] == 20 and run["ambient_c"] == 40.0


async def test_keys_typed_in_one_burst_record_runs_in_order(tmp_path):
    """A fast typist (or a paste) sends n, the fields, Tab and Enter before the card has even
    opened; nothing may be lost, reordered or taken as a command on the walk screen."""
    from textual import events

    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        burst = (["n", *"Sheeter", "tab", *"45", "tab", *"8A", "enter", *"Oven", "tab", *"60",
                  "tab", *"30A", "enter"])
        names = {"tab": "\t", "enter": "\r"}
        for key in burst:
            # no waiting between keys
            app._driver.send_message(events.Key(key, names.get(key, key)))
        await pilot.pause(0.5)
        await app.workers.wait_for_complete()
        await pilot.pause()
    runs = [(r["id"], r["to"], r["length"], r.get("load"))
            for r in tomllib.loads(path.read_text())["run"]]
    assert runs[2:] == [
        ("R2", "Sheeter", "45", {"value": 8, "unit": "A"}),
        ("R3", "Oven", "60", {"value": 30, "unit": "A"}),
    ]


async def test_the_card_shows_the_circuit_in_words_beside_the_answer_as_the_load_sets_it(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        # from LP1 (208Y/120 V), as its last run R1: one pole and the neutral at 120 V
        assert "LN: 120 V" in shown(app, "#answer") and "1 pole + neutral" in shown(app, "#answer")
        await type_text(pilot, "Dough sheeter")
        await pilot.press("tab")
        await type_text(pilot, "30")
        await pilot.press("tab")
        await type_text(pilot, "20A 208V")
        await pilot.pause()
        answer = shown(app, "#answer")
        assert "LL: 208 V" in answer and "2 poles" in answer
        await pilot.press("enter")
        await pilot.pause()
    run = {r["id"]: r for r in tomllib.loads(path.read_text())["run"]}["R2"]
    assert run["connection"] == "LL" and run["load"] == {"value": 20, "unit": "A"}
