"""Declaring a source on the run card in one field: kind, system and rating in any order,
with the grammar shown while the field is empty and a refusal naming what it cannot read."""

from __future__ import annotations

import tomllib

from gaugewalk.model.session.card_source import ORDER
from tests.support.app_helpers import new_app, opened, type_text
from tests.support.walks import write_walk


async def test_a_switchboard_with_its_rating_is_declared_in_one_field(tmp_path):
    path = write_walk(tmp_path)
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        await pilot.press("n", "shift+tab")
        await type_text(pilot, "SVC")
        await pilot.press("tab")
        await type_text(pilot, "SWB-2")
        await pilot.press("tab")
        await type_text(pilot, "60")
        await pilot.press("tab", "ctrl+o")  # past the load (a feeder sums what its panel
        # serves) to New panel, which To's hint names
        card = app.screen
        assert card.focused.id == "f-panel"
        assert ORDER in str(card.query_one("#card-msg").render())  # the grammar, while empty
        await type_text(pilot, "panel 208Y/120 rooftop")
        await pilot.pause()
        message = str(card.query_one("#card-msg").render())
        assert "'208Y/120 rooftop' is not a system" in message and ORDER in message
        await pilot.press("ctrl+u")
        await type_text(pilot, "208Y/120; switchboard 400A")
        await pilot.press("enter")
        await pilot.pause()
    data = tomllib.loads(path.read_text())
    assert {"id": "SWB-2", "kind": "switchboard", "system": "208Y/120V 3ph 4w",
            "rating_a": 400} in data["source"]
