"""The run sheet: sorting shows the top of the new order, an empty filter says so, and the
columns say each run's circuit (voltage, poles) and device."""

from __future__ import annotations

from gaugewalk.tui.app.widgets.runsheet import RunSheet
from tests.support.app_helpers import new_app, opened, settle, sheet_cells, shown, type_text
from tests.support.walks import SMALL_WALK, run_table, tables_text, write_walk


def _many_runs(n: int) -> str:
    """The invented bakery walk with ``n`` more lighting runs from LP1, each longer."""
    return SMALL_WALK + tables_text("run", [
        run_table(f"L{i}", "LP1", f"Light row {i}", f"{20 + 5 * i}", load=(6, "A"), connection="LN")
        for i in range(1, n + 1)])


async def test_sorting_puts_the_cursor_and_the_view_on_the_first_row_of_the_new_order(tmp_path):
    app = new_app(write_walk(tmp_path, _many_runs(40)), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        sheet = app.screen.query_one(RunSheet)
        await pilot.press("end")  # the last run, the view scrolled down to it
        await pilot.pause()
        assert sheet.cursor == len(sheet.view) - 1 and sheet.scroll_y > 0
        await pilot.press("r")  # reverse: the last run by id comes first
        await pilot.pause()
        assert sheet.cursor == 0 and sheet.scroll_y == 0
        assert sheet.cursor_key == sheet.visible_keys()[0]


async def test_after_a_delete_the_cursor_is_on_the_run_that_took_its_place(tmp_path):
    app = new_app(write_walk(tmp_path, _many_runs(6)), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        sheet = app.screen.query_one(RunSheet)
        keys = sheet.visible_keys()
        at = keys.index("L3")
        for _ in range(at):
            await pilot.press("down")
        await pilot.press("delete")
        await settle(app, pilot)
        assert sheet.cursor_key == "L4" and sheet.cursor == at  # not back on the first run
        await pilot.press("end", "delete")
        await settle(app, pilot)
        assert sheet.cursor_key == "L5"  # the last run gone: the new last


async def test_a_filter_that_finds_nothing_says_so_and_how_to_clear_it(tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("slash")
        await type_text(pilot, "zzz")
        await pilot.pause()
        detail = shown(app, "#detail")
        assert "No run matches the filter" in detail and "Press n" not in detail


async def test_the_sheet_shows_each_runs_circuit_and_device_and_fits_80_columns(tmp_path):
    app = new_app(write_walk(tmp_path), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        sheet = app.screen.query_one(RunSheet)
        assert sheet.virtual_size.width <= sheet.scrollable_content_region.width  # no side scroll
        cells = sheet_cells(app)
        titles = [c.title for c in sheet.columns]
        circuit, device = titles.index("Circuit"), titles.index("OCPD")
        # R1: LN on 208Y/120 V, 120 V one pole; F1: every hot and the neutral, 208 V three poles
        assert cells["R1"][circuit] == "120V 1P" and cells["F1"][circuit] == "208V 3P"
        # 16 A noncontinuous on 12 AWG: a 20 A device (NEC 240.4(D), 240.6(A))
        assert cells["R1"][device] == "20A"
        await pilot.press("down")
        assert "120 V, 1 pole and neutral" in shown(app, "#detail")


async def test_a_wide_terminal_shows_long_run_ids_whole_before_it_widens_the_to_column(tmp_path):
    long_id = "KITCHEN-LINE-RECEPTACLES-7"
    text = SMALL_WALK.replace('id = "R1"', f'id = "{long_id}"')
    app = new_app(write_walk(tmp_path, text), tmp_path / "cfg")
    async with app.run_test(size=(160, 30)) as pilot:
        await opened(app, pilot)
        sheet = app.screen.query_one(RunSheet)
        widths = {c.key: c.width for c in sheet.columns}
        assert widths["id"] >= len(long_id)
        assert sheet.virtual_size.width <= sheet.scrollable_content_region.width
        line = "".join(seg.text for seg in sheet.render_line(1))
        assert long_id in line


async def test_the_view_bar_counts_one_run_as_one_run(tmp_path):
    one = SMALL_WALK[:SMALL_WALK.index('[[run]]\nid = "R1"')]  # the feeder alone
    app = new_app(write_walk(tmp_path, one), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        assert "1 run" in shown(app, "#view-bar") and "1 runs" not in shown(app, "#view-bar")


async def test_a_sheet_line_drawn_at_once_is_the_line_cropped_and_padded(tmp_path):
    from rich.segment import Segment
    from textual.strip import Strip

    from gaugewalk.tui.app.widgets.runsheet import format_line

    app = new_app(write_walk(tmp_path, _many_runs(5)), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        sheet = app.screen.query_one(RunSheet)
        width = sheet.size.width
        for y in range(len(sheet.view) + 1):   # every row, and a blank line under them
            line = sheet.render_line(y)
            if y >= len(sheet.view):
                assert line.text.strip() == ""
                continue
            row = sheet.rows[sheet.view[y]]
            text = ("▶ " if y == sheet.cursor else "  ") + format_line(sheet.columns, row.cells)
            style = line._segments[0].style   # cursor, flagged or plain: as render_line chose
            slow = Strip([Segment(text, style)]).crop(0, width).extend_cell_length(
                width, sheet.rich_style)
            assert list(line) == list(slow) and line.cell_length == slow.cell_length == width


def test_a_row_updated_in_place_leaves_each_columns_longest_entry_as_a_whole_rebuild_does():
    from gaugewalk.tui.app.widgets.runsheet import SheetColumn, SheetRow

    columns = [SheetColumn("id", "Id", 3), SheetColumn("to", "To", 4), SheetColumn("ft", "Ft", 3)]

    def row(key: str, to: str, ft: str) -> SheetRow:
        return SheetRow(key, (key, to, ft))

    rows = [row("R1", "Pump", "12"), row("R2", "Long name here", "7"), row("R3", "Fan", "140")]
    for change in ([row("R2", "Oven", "7")],                # the longest To shrinks: counted again
                   [row("R3", "Fan", "9"), row("R1", "Sheeter line", "1200")],   # one grows
                   [row("R1", "Pump", "12")]):              # both longest shrink at once
        sheet = RunSheet(columns)
        sheet.set_rows(list(rows))
        assert sheet.update_rows(change)
        whole = RunSheet(columns)
        whole.set_rows(list(sheet.rows))
        assert sheet._longest == whole._longest
        rows = sheet.rows
    assert sheet._longest == [2, 4, 2]



async def test_a_filter_of_two_words_keeps_runs_with_both_and_the_view_scrolls_with_its_lines(
        tmp_path):
    app = new_app(write_walk(tmp_path, _many_runs(40)), tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        sheet = app.screen.query_one(RunSheet)
        lights = [f"L{i}" for i in range(1, 41)]
        await pilot.press("end")   # scrolled down to the last run
        await pilot.pause()
        assert sheet.scroll_y > 0 and sheet.virtual_size.height == len(sheet.rows)
        await pilot.press("slash")
        await type_text(pilot, "light")
        await pilot.pause()
        assert sheet.visible_keys() == lights and sheet.virtual_size.height == 40
        await type_text(pilot, " proofer")   # no run is both
        await pilot.pause()
        assert sheet.visible_keys() == [] and sheet.virtual_size.height == 0
        await pilot.press(*["backspace"] * len("light proofer"))
        await type_text(pilot, "proofer")    # one run: it fits, the view is back at the top
        await pilot.pause()
        assert sheet.visible_keys() == ["R1"] and sheet.scroll_y == 0
        await type_text(pilot, " ight")      # both words, one inside another word
        await pilot.pause()
        assert sheet.visible_keys() == []
        await pilot.press(*["backspace"] * len("proofer ight"))
        await type_text(pilot, "ight row")
        await pilot.press("enter", "exclamation_mark")   # and problems only
        await pilot.pause()
        assert sheet.visible_keys() == [k for k in lights if sheet.rows[sheet._index[k]].flag]
