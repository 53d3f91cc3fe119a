"""Saving behind the editing: the writer thread writes every change in the order made, skips
only saves a newer one holds, says when a save failed, and keeps a stored card's draft until
the run is on disk; the sheet rows of the runs one change touched are all that change."""

from __future__ import annotations

import threading
import tomllib

from gaugewalk.model.session.save_behind import SaveBehind
from gaugewalk.model.session.session import WalkSession
from gaugewalk.model.walk.job import Load
from gaugewalk.model.walkfile.drafts import draft_path
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.model.walkfile.write import dumps_walk
from gaugewalk.tui.app.sheet.rows import all_rows
from tests.support.synthetic_walk import synthetic_walk_text
from tests.support.walks import make_run, write_walk


def test_saves_are_written_in_the_order_asked_and_a_waiting_one_only_gives_way_to_a_newer():
    started, gate = threading.Event(), threading.Event()
    written: list[int] = []
    finished: list[int] = []

    def write(number: int) -> None:
        if number == 1:
            started.set()
            assert gate.wait(10)  # the first save is slow: the next ones queue up behind it
        written.append(number)

    saver: SaveBehind[int] = SaveBehind(write, lambda: finished.append(len(written)))
    assert saver.ask(1) == 1
    assert started.wait(10)
    for number in range(2, 6):
        assert saver.ask(number) == number
    assert saver.pending
    gate.set()
    assert saver.wait(10)
    assert not saver.pending
    # 2, 3 and 4 waited while 1 was written; 5 holds all of them (each save is the whole walk)
    assert written == [1, 5]
    assert finished == [1, 2]
    saver.ask(6)
    assert saver.wait(10) and written == [1, 5, 6]


def test_a_save_that_raises_is_reported_and_the_next_one_still_runs():
    def write(number: int) -> None:
        if number == 1:
            raise OSError(28, "No space left on device")

    saver: SaveBehind[int] = SaveBehind(write)
    saver.ask(1)
    assert saver.wait(10)
    assert isinstance(saver.error, OSError)
    done = []
    saver._done = lambda: done.append(True)
    saver.ask(2)
    assert saver.wait(10) and done == [True]


def _edit_load(session: WalkSession, run_id: str, value: float) -> None:
    run = session.job.run(run_id)
    assert run is not None and run.load is not None
    new = run.model_copy(update={"load": Load(value=value, unit=run.load.unit)})
    assert session.put_run(new, replaces=run_id) is None


def test_a_change_is_handed_to_the_writer_before_it_is_computed(tmp_path, monkeypatch):
    # the file holds the runs as given: its save (and the disk's wait) starts first
    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(40), encoding="utf-8")
    session = WalkSession.open(path)
    session.save_behind()
    asked: list[int] = []
    recompute = session.recompute

    def noted(edited=None) -> None:
        asked.append(session._saver._asked)
        recompute(edited)

    monkeypatch.setattr(session, "recompute", noted)
    rid = next(r.id for r in session.job.runs if r.load is not None)
    _edit_load(session, rid, 7.5)
    assert asked == [1]
    assert session.settle(30) and session.state.saved
    assert load_walk(path) == session.job


def test_changes_saved_behind_reach_the_disk_in_order_and_read_back_as_the_walk(tmp_path):
    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(300), encoding="utf-8")
    session = WalkSession.open(path)
    calls = []
    session.save_behind(lambda: calls.append(session.state.saved))
    branches = [r.id for r in session.job.runs if r.load is not None][:12]
    for i, rid in enumerate(branches):
        _edit_load(session, rid, 1.0 + i)
    assert session.delete_run(branches[-1]) is None
    assert session.settle(30)
    assert session.state.saved and calls and all(calls)
    text = path.read_text(encoding="utf-8")
    assert text == dumps_walk(session.job)   # the runs' texts kept between saves change nothing
    assert load_walk(path) == session.job    # what is on disk is the walk as it is now
    data = tomllib.loads(text)
    loads = {r["id"]: r["load"]["value"] for r in data["run"] if "load" in r}
    assert [loads[rid] for rid in branches[:-1]] == [1.0 + i for i in range(len(branches) - 1)]


def test_a_failed_save_behind_stays_said_and_keeps_the_stored_cards_draft(tmp_path):
    path = write_walk(tmp_path)
    session = WalkSession.open(path)
    assert session.take_lock() is None
    session.save_behind()
    fields = {"to": "Slicer", "length": "20", "load": "4A"}
    session.keep_draft(fields)
    assert draft_path(path).exists()
    theirs = path.read_text().replace('length = "40"', 'length = "45"')
    path.write_text(theirs)   # someone else re-measured the feeder F1 meanwhile
    feeder = session.job.run("F1")
    assert session.put_run(feeder.model_copy(update={"length": "50"}), replaces="F1") is None
    run = make_run("R9", "LP1", "Slicer", "20", load=(4, "A"), connection="LN")
    assert session.put_run(run) is None
    session.keep_draft(None)   # the card stored its run
    session.settle(10)         # both sides changed F1: a clash, so not saved
    assert not session.state.saved and "changed on disk" in session.state.message
    assert session.state.changed_outside
    assert path.read_text() == theirs              # theirs is not overwritten
    assert draft_path(path).exists()               # the card comes back after a crash
    kept = session.state.kept                      # and everything open here is kept whole
    assert kept is not None and "R9" in {r.id for r in load_walk(kept).runs}
    session.release_lock()


def test_the_stored_cards_draft_goes_once_the_run_is_on_disk(tmp_path):
    path = write_walk(tmp_path)
    session = WalkSession.open(path)
    assert session.take_lock() is None
    session.save_behind()
    session.keep_draft({"to": "Slicer", "length": "20", "load": "4A"})
    run = make_run("R9", "LP1", "Slicer", "20", load=(4, "A"), connection="LN")
    assert session.put_run(run) is None
    session.keep_draft(None)
    assert session.settle(10) and session.state.saved
    assert 'id = "R9"' in path.read_text()
    assert not draft_path(path).exists()
    session.release_lock()


def test_the_rows_one_edit_changed_are_the_only_rows_that_differ_from_a_whole_rebuild(tmp_path):
    # a branch deep in the supply tree: its load moves the feeders above it, and their drop
    # moves the total drop of every run below them
    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(600), encoding="utf-8")
    session = WalkSession.open(path)
    session.save = lambda: True   # the rows only; nothing written
    from bench.walks import deepest_branch

    target = deepest_branch(session.job)
    rows = all_rows(session)
    for value in (target.load.value * 6, target.load.value * 0.5, target.load.value):
        before = {row.key: row for row in rows}
        _edit_load(session, target.id, value)
        assert session.changed is not None and target.id in session.changed
        whole = all_rows(session)
        index = {row.key: i for i, row in enumerate(rows)}
        for row in whole:
            if row.key in session.changed:
                rows[index[row.key]] = row
        assert rows == whole
        differ = {row.key for row in whole if row != before[row.key]}
        assert differ <= session.changed and len(differ) > 1   # the feeders above moved too


def test_a_change_that_is_not_one_run_in_place_says_every_row_may_have_changed(tmp_path):
    session = WalkSession.open(write_walk(tmp_path))
    version = session.version
    assert session.delete_run("R1") is None
    assert session.changed is None and session.version == version + 1


def test_texts_made_ahead_of_the_first_save_give_the_same_file(tmp_path):
    path = tmp_path / "walk.toml"
    path.write_text(synthetic_walk_text(200), encoding="utf-8")
    session = WalkSession.open(path)
    session.save_behind()
    session.warm_save()
    assert len(session._written) == len(session.job.runs) + len(session.job.sources)
    rid = next(r.id for r in session.job.runs if r.load is not None)
    _edit_load(session, rid, 9.5)
    assert session.settle(30) and session.state.saved
    assert path.read_text(encoding="utf-8") == dumps_walk(session.job)
    assert load_walk(path) == session.job


def test_a_change_on_disk_met_by_the_writer_is_merged_on_the_editing_thread_never_written_over(
        tmp_path, monkeypatch):
    import gaugewalk.model.session.outside as outside

    path = write_walk(tmp_path)
    session = WalkSession.open(path)
    assert session.take_lock() is None
    threads = []
    merge = outside.merge_outside

    def merge_here(*args, **kwargs):
        threads.append(threading.current_thread())
        return merge(*args, **kwargs)

    monkeypatch.setattr(outside, "merge_outside", merge_here)
    session.save_behind()
    path.write_text(path.read_text().replace('length = "40"', 'length = "45"'))  # F1 re-measured
    run = make_run("R9", "LP1", "Slicer", "20", load=(4, "A"), connection="LN")
    assert session.put_run(run) is None
    assert session.settle(10) and session.state.saved, session.state.message
    assert threads == [threading.current_thread()]   # the merge ran here, not in the writer
    on_disk = load_walk(path)
    assert on_disk.run("F1").length == "45" and on_disk.run("R9") is not None   # both kept
    assert session.job.run("F1").length == "45"      # the walk here took the change in
    session.release_lock()


def test_the_walk_is_not_looked_at_for_outside_changes_while_its_own_save_is_on_its_way(tmp_path):
    path = write_walk(tmp_path)
    session = WalkSession.open(path)
    assert session.take_lock() is None
    gate = threading.Event()
    save = session.hold.save

    def slow_save(job, **kwargs):
        gate.wait(10)
        return save(job, **kwargs)

    session.hold.save = slow_save
    session.save_behind()
    run = make_run("R9", "LP1", "Slicer", "20", load=(4, "A"), connection="LN")
    assert session.put_run(run) is None
    path.write_text(path.read_text().replace('length = "40"', 'length = "45"'))  # F1 re-measured
    assert session.saving and not session.changed_on_disk()   # left to the save on its way
    gate.set()
    assert session._saver.wait(10)
    assert session.saving and not session.changed_on_disk()   # its clash not yet taken in here
    session.after_save()                   # the writer met the change: merged in here, saved
    assert not session.saving and session.state.saved, session.state.message
    on_disk = load_walk(path)
    assert on_disk.run("F1").length == "45" and on_disk.run("R9") is not None
    assert not session.changed_on_disk()
    path.write_text(path.read_text().replace('length = "45"', 'length = "47"'))
    assert session.changed_on_disk()       # an outside change once nothing is on its way
    session.release_lock()
