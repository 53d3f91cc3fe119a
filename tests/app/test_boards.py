"""The boards view (key 4): the sources' ratings and loading and each panel's schedule, the
same text as the report's; and the supply tree's panel loading and transformer drop."""

from __future__ import annotations

import re

from gaugewalk.tui.app.widgets.views import SupplyTree
from tests.support.app_helpers import new_app, opened, shown
from tests.support.walks import run_table, source_table, walk_text, write_walk

Y208 = "208Y/120V 3ph 4w"
Y480 = "480Y/277V 3ph 4w"


async def test_the_boards_show_each_panels_positions_phases_and_loading(tmp_path):
    text = walk_text(
        "boards", sources=[source_table("SVC", "service", Y480),
                           source_table("T1", "transformer", Y208, kva=45),
                           source_table("LP1", "panel", rating_a=100, main_a=100, spaces=30)],
        runs=[run_table("F-T1", "SVC", "T1", "20"), run_table("F-LP1", "T1", "LP1", "8"),
              run_table("R1", "LP1", "Bench [b]1[/b]", "30", load=(30, "A"), connection="LN",
                        position=1),
              run_table("R2", "LP1", "Kiln", "30", load=(20, "A"), connection="LL")])
    path = write_walk(tmp_path, text)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(120, 40)) as pilot:
        await opened(app, pilot)
        await pilot.press("4")
        await pilot.pause()
        board = shown(app, "#boards-text")
        assert "Sources" in board and "Total drop: total drop carried" in board
        # R1 as walked at 1 (A); R2, a 2-pole placed by the tool on the two lighter lines
        assert re.search(r"^1 +R1 +Bench \[b\]1\[/b\] +1 +A +3600 .*as walked$", board, re.M)
        assert re.search(r"^\d+-\d+ +R2 +Kiln +2 +BC .*by the tool$", board, re.M)
        assert "main 100 A" in board and "30 spaces" in board
        # T1's primary: 45 kVA at 480 V is 54.1 A, its device 70 A (NEC Table 450.3(B))
        assert "primary 54.1 A, device 70 A" in board
        await pilot.press("2")
        await pilot.pause()
        labels = [str(node.label) for node in app.screen.query_one(SupplyTree).root.children]
        tree = " ".join(labels) + " ".join(
            str(n.label) for n in app.screen.query_one(SupplyTree).root.children[0].children)
        assert "45 kVA loaded" in tree and "drop in it" in tree


async def test_the_run_card_stores_the_breaker_position_typed_in_it(tmp_path):
    import tomllib

    from gaugewalk.tui.app.screens.card import RunCard
    from tests.support.app_helpers import type_text

    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n")
        assert isinstance(app.screen, RunCard)
        await type_text(pilot, "Mixer")
        await pilot.press("tab")
        await type_text(pilot, "40")
        await pilot.press("tab")
        await type_text(pilot, "10A")
        app.screen.query_one("#f-place").focus()
        await type_text(pilot, "4")
        await pilot.press("enter")
        await pilot.press("escape")
        await pilot.pause()
    runs = {r["to"]: r for r in tomllib.loads(path.read_text())["run"]}
    assert runs["Mixer"]["position"] == 4


async def test_p_keeps_the_tools_positions_in_the_file_as_one_undo(tmp_path):
    import tomllib

    runs = [run_table(f"R{n}", "LP1", f"Load {n}", "30", load=(10 + n, "A"), connection="LN")
            for n in range(1, 4)]
    path = write_walk(tmp_path, walk_text(
        "keep", sources=[source_table("SVC", "service"), source_table("LP1", "panel")],
        runs=[run_table("F1", "SVC", "LP1", "20"), *runs]))
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        placed = {rid: p.positions[0] for rid, p in app.session.result.placements.items()}
        await pilot.press("p")
        await pilot.pause()
        kept = {r["id"]: r.get("position") for r in tomllib.loads(path.read_text())["run"]}
        assert kept == placed   # the same positions, now in the file
        await pilot.press("ctrl+z")
        await pilot.pause()
        undone = tomllib.loads(path.read_text())["run"]
        assert all("position" not in r for r in undone)
