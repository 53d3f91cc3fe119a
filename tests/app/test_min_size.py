"""The job's smallest conductor size is set from the job settings screen and reaches every run."""

from __future__ import annotations

import tomllib

from tests.support.app_helpers import new_app, opened, sheet_cells, type_text
from tests.support.walks import write_walk


async def test_a_smallest_size_set_in_job_settings_resizes_the_feeder_and_is_saved(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        # The feeder carries one 16 A load at 120 V, on one line: 16 A, a 20 A device and
        # 12 AWG Cu (NEC 2023 Table 310.16, 14 AWG carries only 15 A at 60 C).
        assert "12 Cu" in sheet_cells(app)["F1"]
        await pilot.press("j")
        app.screen.query_one("#s-min_size").focus()
        await type_text(pilot, "8")
        await pilot.press("enter")
        await pilot.pause()
        assert "8 Cu" in sheet_cells(app)["F1"]
        assert tomllib.loads(path.read_text())["defaults"]["min_size"] == "8 AWG"
