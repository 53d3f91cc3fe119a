"""Saves that cannot tear: processes writing a walk are SIGKILLed at random moments, and what is
left on disk is always a whole walk, the old one or the new one, with a whole backup.

The longer run is ``python -m bench.soak_saves --trials N``.
"""

from __future__ import annotations

import random

import pytest

import gaugewalk.tui.cli.main  # noqa: F401  (imported before forking, so each child starts at once)
from gaugewalk.model.walkfile.atomic import backup_path
from gaugewalk.model.walkfile.write import dumps_walk, save_walk
from tests.support.kill_harness import CommandKillTrials, SaveKillTrials, walk_versions

pytestmark = pytest.mark.slow

SAVE_TRIALS = 240
COMMAND_TRIALS = 40


@pytest.fixture(scope="module")
def versions():
    return walk_versions(6)


def test_save_walk_killed_at_random_moments_leaves_old_or_new_and_a_whole_backup(tmp_path,
                                                                                  versions):
    trials = SaveKillTrials(tmp_path, versions)
    report = trials.run(SAVE_TRIALS, random.Random(6001), max_delay_s=0.03)
    print(report.line("save_walk"))
    assert report.trials == SAVE_TRIALS
    assert report.torn == []
    # the harness must really hit saves part way, or it proves nothing
    assert report.mid_save >= SAVE_TRIALS // 20, report.line("save_walk")


def _two_walks(tmp_path, versions):
    """A: the walk as the office has it; B: the same walk with runs added on site."""
    a = versions[0].model_copy(deep=True)
    a.runs = a.runs[:30]
    b = versions[0].model_copy(deep=True)
    return a, b


def test_gaugewalk_add_killed_part_way_leaves_old_or_new_walk(tmp_path, versions):
    walk = tmp_path / "walk.toml"
    old = dumps_walk(versions[1]).encode()
    old_backup = dumps_walk(versions[0]).encode()
    argv = ["add", str(walk), "--from", "LP1", "--to", "Glue station", "--length", "85+12+2*6",
            "--amps", "12"]
    trials = CommandKillTrials(tmp_path, walk, argv, old, old_backup)
    assert b"Glue station" in trials.new
    report = trials.run(COMMAND_TRIALS, random.Random(6002))
    print(report.line("gaugewalk add"), f"(one run takes {trials.duration_s * 1000:.0f} ms)")
    assert report.trials == COMMAND_TRIALS
    assert report.torn == []
    # some kills came before the save, some after: both outcomes were seen
    assert 0 < report.new_content < COMMAND_TRIALS


def test_gaugewalk_merge_killed_part_way_leaves_old_or_new_output(tmp_path, versions):
    a, b = _two_walks(tmp_path, versions)
    pa, pb, out = tmp_path / "office.toml", tmp_path / "site.toml", tmp_path / "merged.toml"
    save_walk(a, pa)
    save_walk(b, pb)
    old = dumps_walk(versions[2]).encode()
    old_backup = dumps_walk(versions[3]).encode()
    trials = CommandKillTrials(tmp_path, out, ["merge", str(pa), str(pb), "-o", str(out)],
                               old, old_backup)
    report = trials.run(COMMAND_TRIALS, random.Random(6003))
    print(report.line("gaugewalk merge"), f"(one run takes {trials.duration_s * 1000:.0f} ms)")
    assert report.trials == COMMAND_TRIALS
    assert report.torn == []
    assert 0 < report.new_content < COMMAND_TRIALS
    # the inputs are never written by a merge
    assert pa.read_bytes() == dumps_walk(a).encode() and not backup_path(pa).exists()
