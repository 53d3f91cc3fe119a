"""A trial change that fixes a run's problem shows the run as fixed, not with the old problem."""

from __future__ import annotations

from tests.support.app_helpers import new_app, opened, shown, type_text
from tests.support.walks import write_walk


async def test_a_trial_that_fixes_the_drop_shows_ok_beside_the_old_problem(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("down", "t")
        app.screen.query_one("#t-size").focus()
        await pilot.press("ctrl+a", "ctrl+k")
        # NEC 2023 Ch. 9 Table 8: 8 AWG stranded Cu 0.778 ohm/kft (DC method, the walk's default);
        # 2 * 16 A * 0.778 * 100 ft / 1000 = 2.49 V = 2.07 % of 120 V, within the 3 % target.
        await type_text(pilot, "8")
        await pilot.pause()
        status_row = next(line for line in shown(app, "#trial-compare").splitlines()
                          if line.startswith("Status"))
        assert "over drop" in status_row and "ok" in status_row
        assert "✗" not in status_row
