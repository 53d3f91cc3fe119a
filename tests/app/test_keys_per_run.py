"""Keys per run on the run card: the retail sample's branch runs typed back by keys
(``tests.support.keys_per_run``, which also checks each stored run equals the sample's)."""

from __future__ import annotations

import statistics

import pytest

from tests.support.keys_per_run import LIKE_LAST_TARGET, NEW_KIND_TARGET, record

pytestmark = pytest.mark.slow  # forty runs typed into the app, about a minute


async def test_runs_take_the_keys_issue_13_allows_and_every_run_is_stored():
    tally = await record()
    like_last = tally.counts(True)
    assert len(like_last) >= 4  # the sample has rows: troffer rows 2 to 4, floor boxes B
    assert max(like_last) <= LIKE_LAST_TARGET, "\n".join(tally.lines())
    new_kind = tally.counts(False)
    assert statistics.mean(new_kind) <= NEW_KIND_TARGET, "\n".join(tally.lines())
