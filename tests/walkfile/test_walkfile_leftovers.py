"""A save killed part way leaves a hidden temporary; the next save sweeps old ones away."""

import os
import time

from gaugewalk.model.walkfile.atomic import LEFTOVER_AGE_S
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.model.walkfile.write import save_walk
from tests.support.walks import source_table, walk_text

WALK = walk_text("Sweep check (test walk)",
                 sources=[source_table("SVC", "service", "120/240V 1ph 3w")])


def test_old_leftovers_of_killed_saves_are_removed_and_young_ones_kept(tmp_path):
    walk = tmp_path / "shop.toml"
    walk.write_text(WALK)
    old_tmp = tmp_path / ".shop.toml.abc123.tmp"
    old_bak = tmp_path / ".shop.toml.def456.bak"
    young = tmp_path / ".shop.toml.ghi789.tmp"
    other = tmp_path / ".other.toml.jkl012.tmp"
    for leftover in (old_tmp, old_bak, young, other):
        leftover.write_text("half a walk")
    long_ago = time.time() - LEFTOVER_AGE_S - 60
    for leftover in (old_tmp, old_bak, other):
        os.utime(leftover, (long_ago, long_ago))

    job = load_walk(walk)
    job.job.notes = "changed so that the save writes"
    save_walk(job, walk)

    assert not old_tmp.exists() and not old_bak.exists()
    assert young.exists(), "a young temporary may belong to a save under way"
    assert other.exists(), "another walk's files are not ours to remove"
    assert load_walk(walk).job.notes == "changed so that the save writes"
