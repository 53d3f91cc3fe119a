"""The app's other screens and manners: keys, cautions, quitting, opening, marking, views,
job settings, trial changes, themes."""

from __future__ import annotations

import tomllib

import pytest

from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.tui.app.keys import KEYS
from gaugewalk.tui.app.recent import RecentWalks
from gaugewalk.tui.app.screens.info import AboutScreen, AskScreen, KeyGuideScreen
from gaugewalk.tui.app.screens.walk import WalkScreen
from gaugewalk.tui.app.widgets.runsheet import RunSheet
from gaugewalk.tui.cli.main import CAUTION
from tests.support.app_helpers import new_app, opened, settle, sheet_cells, shown, type_text
from tests.support.walks import (
    SMALL_WALK,
    run_table,
    source_table,
    tables_text,
    walk_text,
    write_walk,
)

# A second branch whose fixed 14 AWG conductor is far short of its 40 A load:
# NEC 2023 Table 310.16, 14 AWG Cu at 75 C carries 20 A.
TWO_PROBLEMS = SMALL_WALK + tables_text("run", [
    run_table("R2", "LP1", "Deck oven", "10", load=(40, "A"), connection="LL", size="14 AWG"),
    run_table("R3", "SVC", "Sign", "20", load=(2, "A"), connection="LN"),
])


async def test_footer_and_key_guide_are_made_from_the_same_key_table(tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        active = app.screen.active_bindings
        for k in KEYS:
            if k.where in ("walk", "app") and k.footer:
                assert active[k.key].binding.description == k.label
                assert active[k.key].binding.show
        await pilot.press("f1")
        assert isinstance(app.screen, KeyGuideScreen)
        guide = " ".join(shown(app, "#guide-text").split())  # long lines are wrapped
        for k in KEYS:
            assert k.help in guide
        await pilot.press("escape")
        assert isinstance(app.screen, WalkScreen)


async def test_the_caution_is_shown_at_first_start_and_on_the_about_screen(tmp_path):
    path = write_walk(tmp_path)
    config = tmp_path / "cfg"
    app = new_app(path, config)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(app, pilot)
        assert isinstance(app.screen, AboutScreen)
        assert CAUTION in shown(app, "#about-caution")
        await pilot.press("enter")
        assert isinstance(app.screen, WalkScreen)
    assert RecentWalks.load(config).caution_seen
    again = new_app(path, config)
    async with again.run_test(size=(80, 24)) as pilot:
        await settle(again, pilot)
        assert isinstance(again.screen, WalkScreen)  # not at every start
        await pilot.press("f2")
        assert isinstance(again.screen, AboutScreen)
        assert CAUTION in shown(again, "#about-caution")


async def test_quit_leaves_at_once_when_all_is_saved(tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("ctrl+q")
        await pilot.pause()
        assert app.return_code == 0


async def test_quit_keeps_a_typed_run_card_for_next_time_without_asking(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        await type_text(pilot, "Freezer")
        await pilot.press("ctrl+q")  # from the open card: nothing is lost, so no question
        await pilot.pause()
        assert app.return_code == 0
    again = new_app(path, tmp_path / "cfg")
    async with again.run_test(size=(80, 24)) as pilot:
        await opened(again, pilot)
        await pilot.press("n")  # the card comes back
        assert again.screen.values()["to"] == "Freezer"


async def test_a_missing_walk_is_created_only_after_asking(tmp_path):
    path = tmp_path / "new-site.toml"
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(app, pilot)
        assert "There is no walk at" in shown(app, "#newwalk-head")
        assert not path.exists()
        await pilot.press("enter")
        await opened(app, pilot)
        assert isinstance(app.screen, WalkScreen)
    data = tomllib.loads(path.read_text())
    assert data["job"]["name"] == "new-site"
    assert data["source"] == [{"id": "SVC", "kind": "service", "system": "208Y/120V 3ph 4w",
                               "name": "Service"}]


async def test_declining_to_create_a_missing_walk_writes_nothing(tmp_path):
    path = tmp_path / "nowhere.toml"
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(app, pilot)
        await pilot.press("escape")
        await pilot.pause()
    assert app.return_code == 0
    assert not path.exists()


async def test_a_broken_walk_file_ends_with_status_2_and_a_message_naming_the_file(tmp_path):
    path = write_walk(tmp_path, 'schema = 1\n[[run]]\nid = "R1"\nfrom = "LP9"\n', "broken.toml")
    before = path.read_bytes()
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(app, pilot)
    assert app.return_code == 2
    assert app.exit_message.startswith("gaugewalk: ") and "broken.toml" in app.exit_message
    assert "\n" not in app.exit_message
    assert path.read_bytes() == before


async def test_runs_failing_a_limit_are_marked_with_a_symbol_and_words_and_can_be_filtered(
        tmp_path):
    app = new_app(write_walk(tmp_path, TWO_PROBLEMS), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        cells = sheet_cells(app)
        # R1: 5.28 % over its 3 % branch target (NEC Ch. 9 Table 8 arithmetic in test_app_recording)
        assert cells["R1"][-1] == "▲ drop"
        # R2: 14 AWG Cu carries 20 A at 75 C (Table 310.16), the load is 40 A
        assert cells["R2"][-1] == "✗ amps"
        assert cells["R3"][-1] == "✓ ok"
        await pilot.press("exclamation_mark")  # problems only
        assert set(sheet_cells(app)) == {"R1", "R2"}
        await pilot.press("escape")
        await pilot.press("f")  # by source: SVC first
        assert set(sheet_cells(app)) == {"F1", "R3"}
        await pilot.press("f")  # then LP1
        assert set(sheet_cells(app)) == {"R1", "R2"}
        await pilot.press("escape", "slash")
        await type_text(pilot, "oven")
        assert set(sheet_cells(app)) == {"R2"}
        await pilot.press("enter")
        assert isinstance(app.screen.focused, RunSheet)
        assert "showing 1" in shown(app, "#view-bar")


async def test_sorting_by_drop_puts_the_worst_run_last_and_reverse_first(tmp_path):
    app = new_app(write_walk(tmp_path, TWO_PROBLEMS), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        sheet = app.screen.query_one(RunSheet)
        await pilot.press(*["s"] * 9)  # id, from, to, feet, load, circuit, device, size, drop
        assert sheet.sort_key == "drop"
        assert sheet.visible_keys()[-1] == "R1"
        await pilot.press("r")
        assert sheet.visible_keys()[0] == "R1"


async def test_the_supply_tree_shows_the_cumulative_drop_at_every_node(tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("2")
        tree = app.screen.query_one("#tree")
        s = app.session
        f1, r1 = s.result_for("F1"), s.result_for("R1")
        # percent drops in series add up: service -> F1 -> LP1 bus -> R1 -> load
        assert r1.total_drop_pct == pytest.approx(f1.voltage_drop_pct + r1.voltage_drop_pct,
                                                  abs=1e-6)
        labels = {}
        for node in _walk_tree(tree.root):
            if node.data:
                labels[node.data[1]] = str(node.label)
        assert "SVC at bus 0.00%" in labels["SVC"]
        assert f"at bus {f1.total_drop_pct:.2f}%" in labels["F1"]  # the LP1 node, fed by F1
        assert f"total {r1.total_drop_pct:.2f}%" in labels["R1"]
        assert "▲ over drop" in labels["R1"]


def _walk_tree(node):
    yield node
    for child in node.children:
        yield from _walk_tree(child)


async def test_job_settings_recompute_every_run_and_can_be_undone(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        assert sheet_cells(app)["R1"][-1] == "▲ drop"
        await pilot.press("j")
        field = app.screen.query_one("#s-branch_drop_pct")
        field.focus()
        await pilot.press("ctrl+a", "ctrl+k")  # clear the field
        await type_text(pilot, "6")
        await pilot.press("enter")
        await settle(app, pilot)
        assert isinstance(app.screen, WalkScreen)
        # 5.28 % is within a 6 % branch target; with the feeder's drop it is over the 5 % total
        assert sheet_cells(app)["R1"][-1] == "▲ total"
        assert tomllib.loads(path.read_text())["defaults"]["branch_drop_pct"] == 6
        await pilot.press("ctrl+z")
        await settle(app, pilot)
        assert sheet_cells(app)["R1"][-1] == "▲ drop"
        assert "branch_drop_pct" not in tomllib.loads(path.read_text())["defaults"]


async def test_job_settings_refuse_an_impossible_value_with_the_field_named(tmp_path):
    path = write_walk(tmp_path)
    before = path.read_bytes()
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("j")
        app.screen.query_one("#s-pf").focus()
        await pilot.press("ctrl+a", "ctrl+k")
        await type_text(pilot, "1.7")
        await pilot.press("enter")
        await pilot.pause()
        assert "Not stored" in shown(app, "#job-msg") and "Power factor" in shown(app, "#job-msg")
    assert path.read_bytes() == before


async def test_a_trial_change_shows_its_effect_and_changes_nothing_until_kept(tmp_path):
    path = write_walk(tmp_path)
    before = path.read_bytes()
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("down", "t")
        app.screen.query_one("#t-size").focus()
        await pilot.press("ctrl+a", "ctrl+k")
        await type_text(pilot, "10")
        await pilot.pause()
        compare = shown(app, "#trial-compare")
        # NEC 2023 Ch. 9 Table 8: 10 AWG stranded Cu 1.24 ohm/kft;
        # 2 * 16 A * 1.24 * 100 ft / 1000 = 3.968 V = 3.31 % of 120 V
        assert "5.28%" in compare and "3.31%" in compare
        assert path.read_bytes() == before
        await pilot.press("escape")
        assert path.read_bytes() == before
        await pilot.press("t")
        app.screen.query_one("#t-size").focus()
        await pilot.press("ctrl+a", "ctrl+k")
        await type_text(pilot, "10")
        await pilot.press("ctrl+s")
        await pilot.pause()
        assert isinstance(app.screen, WalkScreen)
        assert sheet_cells(app)["R1"][8] == "3.31"
    assert 'size = "10 AWG"' in path.read_text()


async def test_a_trial_change_on_a_feeder_reports_the_runs_downstream(tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("t")  # F1, the feeder to LP1
        app.screen.query_one("#t-material").focus()
        await pilot.press("ctrl+a", "ctrl+k")
        await type_text(pilot, "al")
        await pilot.pause()
        compare = shown(app, "#trial-compare")
        assert "Downstream of LP1: 1 runs" in compare
        assert "Al" in compare


async def test_no_color_and_the_light_look_keep_every_state_in_words(tmp_path, monkeypatch):
    monkeypatch.setenv("NO_COLOR", "1")
    app = new_app(write_walk(tmp_path, TWO_PROBLEMS), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        assert app.no_color
        await pilot.press("f3")
        assert app.theme == "textual-light"
        assert sheet_cells(app)["R2"][-1] == "✗ amps"
        assert "✓ saved" in app.title


async def test_started_without_a_file_enter_reopens_the_walk_used_last(tmp_path):
    config = tmp_path / "cfg"
    path = write_walk(tmp_path)
    recent = RecentWalks.load(config)
    recent.remember(path)
    recent.mark_caution_seen()
    app = new_app(None, config)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(app, pilot)
        await pilot.press("enter")  # the walk used last is highlighted, not "start a new walk"
        await settle(app, pilot)
        assert isinstance(app.screen, WalkScreen)
        assert app.session.path == path.resolve()


async def test_a_walk_held_by_another_gaugewalk_opens_read_only_and_is_not_written(tmp_path):
    from gaugewalk.model.walkfile.lock import acquire_lock

    path = write_walk(tmp_path)
    before = path.read_bytes()
    with acquire_lock(path, "another gaugewalk"):  # this process stands in for the other one
        app = new_app(path, tmp_path / "cfg")
        async with app.run_test(size=(80, 24)) as pilot:
            await opened(app, pilot)
            assert app.session.read_only and "read-only" in app.title
            await pilot.press("down", "delete", "n")
            assert isinstance(app.screen, WalkScreen)
            assert "R1" in sheet_cells(app)
    assert path.read_bytes() == before


async def test_a_walk_changed_on_disk_by_someone_else_is_not_overwritten(tmp_path, monkeypatch):
    # the clash is on saving the delete: the screen's look at the disk every few seconds must
    # not take the change in first, whenever a busy machine lets its timer fire
    monkeypatch.setattr("gaugewalk.tui.app.screens.walk.DISK_LOOK_S", 3600.0)
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        theirs = path.read_text().replace('length = "100"', 'length = "104"')  # R1 re-measured
        path.write_text(theirs)
        await pilot.press("down", "delete")   # and R1 deleted here: a clash
        await settle(app, pilot)
        assert "NOT SAVED" in app.title
        assert path.read_text() == theirs
        await pilot.press("ctrl+q")           # the unsaved delete is kept whole beside the walk
        await pilot.pause()
    kept = app.session.state.kept
    assert kept is not None and "R1" not in {r.id for r in load_walk(kept).runs}
    assert str(kept) in app.exit_message and path.read_text() == theirs


async def test_a_feeder_whose_panel_still_feeds_runs_cannot_be_deleted(tmp_path):
    path = write_walk(tmp_path)
    before = path.read_bytes()
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("delete")  # F1 feeds LP1, which feeds R1
        await pilot.pause()
        assert "F1" in sheet_cells(app)
        await pilot.press("down", "delete", "up", "delete")  # R1 first, then F1 may go
        assert isinstance(app.screen, AskScreen)
        await pilot.press("y")
        await pilot.pause()
        assert sheet_cells(app) == {}
    data = tomllib.loads(path.read_text())
    assert "run" not in data and [s["id"] for s in data["source"]] == ["SVC"]
    assert before != path.read_bytes()


def test_a_folder_given_as_the_walk_is_refused_on_one_line_with_status_2(tmp_path, capsys):
    from gaugewalk.tui.app.launch import open_app

    assert open_app(str(tmp_path)) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "is a folder" in err


def test_the_opening_screen_lists_the_runs_as_written_before_they_are_sized(tmp_path):
    from gaugewalk.tui.app.sheet.rawrows import SIZING, raw_rows

    rows = raw_rows(write_walk(tmp_path))
    assert [r.key for r in rows] == ["F1", "R1"]
    assert rows[0].cells[:5] == ("F1", "SVC", "LP1", "40", "panel")
    assert rows[1].cells[3:5] == ("100", "16A") and rows[1].cells[-1] == SIZING
    assert raw_rows(write_walk(tmp_path, "not = [toml", "junk.toml")) is None
    assert raw_rows(write_walk(tmp_path, "x = " + "[" * 5000 + "]" * 5000, "deep.toml")) is None


async def test_a_new_walk_can_be_started_from_the_first_screen(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)
    config = tmp_path / "cfg"
    recent = RecentWalks.load(config)
    recent.mark_caution_seen()
    app = new_app(None, config)
    async with app.run_test(size=(80, 24)) as pilot:
        await settle(app, pilot)
        await pilot.press("enter")  # "start a new walk"
        await type_text(pilot, "mill-annex")
        await pilot.press("enter")  # the file name; then the walk's name and service
        await pilot.pause()
        await pilot.press("enter")
        await opened(app, pilot)
        assert isinstance(app.screen, WalkScreen)
    assert (tmp_path / "mill-annex.toml").exists()
    assert str((tmp_path / "mill-annex.toml").resolve()) in RecentWalks.load(config).paths


async def test_a_walk_with_comments_is_warned_about_before_the_first_save(tmp_path):
    path = write_walk(tmp_path, "# measured by the night crew\n" + SMALL_WALK)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        said = [n.message for n in app._notifications]
        assert any("1 comment line" in m and "walk.toml~" in m for m in said)
    assert path.read_text().startswith("# measured by the night crew")  # nothing saved yet


# An invented shop: a 480Y/277 V service, a step-down transformer and a 208Y/120 V panel.
WITH_TRANSFORMER = walk_text(
    "Kiln Row pottery",
    sources=[source_table("SVC", "service", "480Y/277V 3ph 4w"),
             source_table("T1", "transformer", kva=30), source_table("LP1", "panel")],
    runs=[run_table("F1", "SVC", "T1", "60"), run_table("F2", "T1", "LP1", "10"),
          run_table("R1", "LP1", "Kiln", "50", load=(24, "A"), connection="LL")],
)


async def test_a_feeder_says_what_it_feeds_in_the_load_column_before_and_after_sizing(tmp_path):
    from gaugewalk.tui.app.sheet.rawrows import raw_rows

    path = write_walk(tmp_path, WITH_TRANSFORMER)
    raw = {r.key: r.cells[4] for r in raw_rows(path)}
    assert (raw["F1"], raw["F2"]) == ("transformer", "panel")
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        cells = sheet_cells(app)
        assert (cells["F1"][4], cells["F2"][4], cells["R1"][4]) == ("transformer", "panel", "24A")


async def test_a_transformer_secondary_can_be_tried_at_another_voltage_with_its_panels(tmp_path):
    path = write_walk(tmp_path, WITH_TRANSFORMER)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("t")  # on F1, the feeder to T1
        app.screen.query_one("#t-system").focus()
        await pilot.press("ctrl+a", "ctrl+k")
        await type_text(pilot, "120/240")
        await pilot.pause()
        compare = shown(app, "#trial-compare")
        assert "Downstream of T1 (at 120/240V 1ph 3w)" in compare
        r1_before = app.session.result_for("R1")
        await pilot.press("ctrl+s")
        await pilot.pause()
        r1_after = app.session.result_for("R1")
        # the kiln's line-to-line circuit is now 240 V instead of 208 V: the same 24 A drops a
        # smaller share of a higher voltage through the same size (Ohm's law, percent of V)
        assert r1_after.size == r1_before.size
        assert r1_after.voltage_drop_pct == pytest.approx(r1_before.voltage_drop_pct * 208 / 240,
                                                          rel=1e-6)
    data = tomllib.loads(path.read_text())
    systems = {s["id"]: s["system"] for s in data["source"]}
    assert systems == {"SVC": "480Y/277V 3ph 4w", "T1": "120/240V 1ph 3w", "LP1": "120/240V 1ph 3w"}


async def test_job_settings_say_whether_the_total_drop_carries_through_transformers(tmp_path):
    path = write_walk(tmp_path, WITH_TRANSFORMER)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        carried = app.session.result_for("R1").total_drop_pct
        for text in ("perhaps", "no"):
            if not app.screen.query("#s-drop_through_transformers"):
                await pilot.press("j")
            field = app.screen.query_one("#s-drop_through_transformers")
            assert field.value in ("yes", "perhaps")
            field.focus()
            await pilot.press("ctrl+a", "ctrl+k")
            await type_text(pilot, text)
            await pilot.press("enter")
            await settle(app, pilot)
            if text == "perhaps":
                said = shown(app, "#job-msg")
                assert "Not stored" in said and "yes or no" in said
        assert isinstance(app.screen, WalkScreen)
        # restarted at the secondary: the kiln's total is the drop of F2 and its own run alone
        r1, f2 = app.session.result_for("R1"), app.session.result_for("F2")
        assert r1.total_drop_pct == pytest.approx(f2.voltage_drop_pct + r1.voltage_drop_pct)
        assert r1.total_drop_pct < carried
    assert tomllib.loads(path.read_text())["defaults"]["drop_through_transformers"] is False


async def test_unknown_raceway_and_insulation_names_are_refused_at_their_fields(tmp_path):
    path = write_walk(tmp_path)
    before = path.read_bytes()
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        await type_text(pilot, "Mixer\t40\t12A")
        app.screen.query_one("#f-raceway").focus()
        await type_text(pilot, "garden hose")
        await pilot.press("enter")
        await pilot.pause()
        # NEC Ch. 9 Table 4 names the raceway types
        assert "Not stored — Raceway: no raceway type 'garden hose'" in shown(app, "#card-msg")
        await pilot.press("escape", "j")
        app.screen.query_one("#s-insulation").focus()
        await pilot.press("ctrl+a", "ctrl+k")
        await type_text(pilot, "paper")
        await pilot.press("enter")
        await pilot.pause()
        # NEC Table 310.4(1) names the insulation types
        assert "Not stored — Insulation: no insulation type 'paper'" in shown(app, "#job-msg")
    assert path.read_bytes() == before


async def test_enter_on_a_branch_run_in_the_supply_tree_opens_it_for_editing(tmp_path):
    from gaugewalk.tui.app.screens.card import RunCard

    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("2")
        tree = app.screen.query_one("#tree")
        r1 = next(n for n in _walk_tree(tree.root) if n.data == ("run", "R1"))
        r1.parent.expand()  # LP1's branch runs are folded at first
        await pilot.pause()
        tree.move_cursor(r1)
        await pilot.press("enter")
        assert isinstance(app.screen, RunCard) and app.screen.run_id == "R1"


async def test_the_card_takes_a_motor_by_horsepower_and_an_hvac_nameplate(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(100, 40)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        await type_text(pilot, "Pump\t100\t10hp")
        app.screen.query_one("#f-circuit").focus()
        await pilot.press("ctrl+a", "ctrl+k")
        await type_text(pilot, "3P")
        await pilot.pause()
        assert app.screen.query_one("#f-kind").value == "motor"  # a load in hp is a motor
        assert app.screen.query_one("#row-plate").display  # its device and code letter
        # NEC 2023 Table 430.250, 208 V: 10 hp -> 30.8 A; Table 430.52(C)(1): 250 % -> 80 A
        answer = shown(app, "#answer")
        assert "Kind      motor" in answer and "OCPD      80 A" in answer
        await pilot.press("enter")
        await settle(app, pilot)
        assert "Stored R2" in shown(app, "#card-msg")  # the card starts the next run
        await type_text(pilot, "RTU-1\t50\t")
        app.screen.query_one("#f-kind").focus()
        await type_text(pilot, "hvac")
        app.screen.query_one("#f-plate").focus()
        await type_text(pilot, "mca 28 mocp 45")
        app.screen.query_one("#f-circuit").focus()
        await pilot.press("ctrl+a", "ctrl+k")
        await type_text(pilot, "3P")
        await pilot.pause()
        # NEC 440.4(B), 440.22(A): 10 AWG on 45 A
        assert "OCPD      45 A" in shown(app, "#answer")
        await pilot.press("enter")
        await settle(app, pilot)
    runs = {r["to"]: r for r in tomllib.loads(path.read_text())["run"]}
    assert runs["Pump"]["load"] == {"value": 10, "unit": "hp", "kind": "motor"}
    assert runs["RTU-1"]["load"] == {"kind": "hvac", "mca": 28, "mocp": 45}


async def test_job_settings_take_demand_factors_and_refuse_an_unknown_word(tmp_path):
    receptacles = [run_table(f"R{i}", "LP1", f"Receptacles {i}", "40", connection="LN",
                             load={"value": 1440, "unit": "VA", "kind": "receptacle"})
                   for i in range(30)]
    path = write_walk(tmp_path, walk_text(
        "demand", sources=[source_table("SVC", "service"), source_table("LP1", "panel")],
        runs=[run_table("F1", "SVC", "LP1", "20"), *receptacles]))
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        for word in ("coincident", "nec-220"):
            if not app.screen.query("#s-demand"):
                await pilot.press("j")
            field = app.screen.query_one("#s-demand")
            assert field.value in ("connected", "coincident")
            field.focus()
            await pilot.press("ctrl+a", "ctrl+k")
            await type_text(pilot, word)
            await pilot.press("enter")
            await pilot.pause()
            if word == "coincident":
                assert "Not stored" in shown(app, "#job-msg")
                assert "Feeder load" in shown(app, "#job-msg")
                assert "demand" not in tomllib.loads(path.read_text()).get("defaults", {})
        assert isinstance(app.screen, WalkScreen)
        assert tomllib.loads(path.read_text())["defaults"]["demand"] == "nec-220"
        # NEC 2023 Table 220.44: 43.2 kVA of receptacles count 26.6 kVA: 73.9 A a line on F1
        assert app.session.result_for("F1").amps == pytest.approx(26_600 / 3 / 120)
