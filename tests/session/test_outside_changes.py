"""A walk changed on disk while it is open (a hand edit, a sync tool): what was typed here is
never lost, what was changed there is never overwritten, and saving never fails for ever."""

from __future__ import annotations

import os

import pytest

from gaugewalk.model.session.session import WalkSession
from gaugewalk.model.walkfile.drafts import draft_path
from gaugewalk.model.walkfile.read import load_walk
from tests.support.walks import make_run, run_table, tables_text, write_walk


@pytest.fixture
def session(tmp_path):
    s = WalkSession.open(write_walk(tmp_path))
    assert s.take_lock() is None
    yield s
    s.release_lock()


def _run(rid: str, to: str, length: str = "20"):
    return make_run(rid, "LP1", to, length, load=(4, "A"), connection="LN")


def _hand_add(path, rid: str, to: str, length: str = "30") -> None:
    """Someone appends a run to the file with an editor."""
    with open(path, "a", encoding="utf-8") as handle:
        handle.write(tables_text("run", [run_table(rid, "LP1", to, length, load=(6, "A"),
                                                   connection="LN")]))


def _ids_on_disk(path) -> dict[str, str]:
    return {r.id: r.to for r in load_walk(path).runs}


def test_a_run_stored_after_a_hand_edit_is_saved_with_that_edit_kept(session):
    _hand_add(session.path, "R9", "Walk-in cooler")
    assert session.changed_on_disk()
    assert session.put_run(_run("R2", "Slicer")) is None
    assert session.state.saved, session.state.message
    assert "changed on disk; merged with it" in str(session.state.notice)
    assert _ids_on_disk(session.path) == {"F1": "LP1", "R1": "Proofer", "R9": "Walk-in cooler",
                                          "R2": "Slicer"}
    assert session.job.run("R9") is not None and not session.changed_on_disk()
    # and the next store is an ordinary save
    assert session.put_run(_run("R3", "Mixer")) is None
    assert session.state.saved and session.state.notice is None
    assert set(_ids_on_disk(session.path)) == {"F1", "R1", "R9", "R2", "R3"}


def test_a_run_that_got_an_id_taken_on_disk_is_renumbered_and_told(session):
    _hand_add(session.path, "R2", "Walk-in cooler")
    assert session.put_run(_run("R2", "Slicer")) is None
    assert session.state.saved
    assert "your run R2 is now R3" in str(session.state.notice)
    assert _ids_on_disk(session.path) == {"F1": "LP1", "R1": "Proofer", "R2": "Walk-in cooler",
                                          "R3": "Slicer"}


def test_both_changing_one_run_is_not_saved_kept_whole_and_settled_on_request(session):
    path = session.path
    path.write_text(path.read_text().replace('length = "100"', 'length = "104"'))
    theirs = path.read_bytes()
    assert session.put_run(_run("R1", "Proofer", "96"), replaces="R1") is None
    state = session.state
    assert not state.saved and state.changed_outside
    assert "run R1 differs: length: A has '104', B has '96'" in state.message
    assert path.read_bytes() == theirs                       # their edit is not overwritten
    assert state.kept is not None and state.kept.parent == path.parent
    assert load_walk(state.kept).run("R1").length == "96"    # nor is what was typed here lost
    assert session.lose_on_quit is None
    # saving again does not fail for ever: asked to, this side is kept where both changed
    said = session.take_outside_change(prefer="b")
    assert session.state.saved, said
    assert "kept yours where both changed (1)" in said
    assert load_walk(path).run("R1").length == "96"
    assert (path.with_name(path.name + "~")).read_bytes() == theirs
    assert session.put_run(_run("R2", "Slicer")) is None and session.state.saved


def test_a_broken_hand_edit_is_never_written_over_and_the_runs_typed_are_kept(session):
    path = session.path
    path.write_text(path.read_text() + "\n[[run]\nid = \n")
    broken = path.read_bytes()
    assert session.put_run(_run("R2", "Slicer")) is None
    assert not session.state.saved and session.state.changed_outside
    assert "no longer a valid walk" in session.state.message
    assert path.read_bytes() == broken
    assert load_walk(session.state.kept).run("R2").to == "Slicer"
    # once the file is mended, the next store saves both
    path.write_text(broken.decode().replace("\n[[run]\nid = \n", ""))
    assert session.put_run(_run("R3", "Mixer")) is None and session.state.saved
    assert set(_ids_on_disk(path)) >= {"R2", "R3"}


def test_a_walk_deleted_on_disk_is_written_again(session):
    os.remove(session.path)
    assert session.changed_on_disk()
    assert session.put_run(_run("R2", "Slicer")) is None
    assert session.state.saved and "was deleted on disk" in str(session.state.notice)
    assert set(_ids_on_disk(session.path)) == {"F1", "R1", "R2"}


def test_a_change_on_disk_with_nothing_unsaved_here_is_taken_as_it_is(session):
    path = session.path
    _hand_add(path, "R9", "Walk-in cooler")
    text = path.read_text() + "# a comment gaugewalk would drop\n"
    path.write_text(text)
    said = session.take_outside_change(prefer=None)
    assert said.endswith("reloaded it.") and session.job.run("R9") is not None
    assert path.read_text() == text                 # nothing written: their file as they left it
    assert not session.changed_on_disk()


def test_touching_the_file_is_not_a_change(session):
    st = os.stat(session.path)
    os.utime(session.path, ns=(st.st_atime_ns, st.st_mtime_ns + 5_000_000_000))
    assert not session.changed_on_disk()


def test_a_stored_runs_draft_is_cleared_only_once_the_run_is_on_disk(session):
    path = session.path
    typed = {"from": "LP1", "to": "Slicer", "length": "20", "load": "4A"}
    session.keep_draft(typed)
    path.write_text(path.read_text().replace('length = "100"', 'length = "104"'))
    session.put_run(_run("R1", "Proofer", "96"), replaces="R1")   # not saved: a clash on disk
    session.keep_draft(None)                                        # the card moves on
    assert not session.state.saved and draft_path(path).exists()
    assert session.draft is None                                    # n starts a fresh card
    session.take_outside_change(prefer="b")
    assert session.state.saved and not draft_path(path).exists()


def test_an_unsaved_walk_goes_to_the_state_folder_when_its_own_folder_cannot_take_it(
        session, tmp_path, monkeypatch):
    import errno

    from gaugewalk.model.session import outside

    monkeypatch.setenv("XDG_STATE_HOME", str(tmp_path / "state"))
    folder = session.path.parent
    real_write = outside.atomic_write

    def full_beside_the_walk(path, data, **keys):   # the walk's own disk is full
        if os.path.dirname(path) == str(folder):
            raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))
        return real_write(path, data, **keys)

    def full(job, **keys):
        raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))

    monkeypatch.setattr(outside, "atomic_write", full_beside_the_walk)
    monkeypatch.setattr(session.hold, "save", full)
    assert session.put_run(_run("R2", "Slicer")) is None
    kept = session.state.kept
    assert not session.state.saved and kept is not None
    assert kept.parent == tmp_path / "state" / "gaugewalk" / "unsaved"
    assert load_walk(kept).run("R2").to == "Slicer"
    assert "No space left on device" in session.state.message and str(kept) in session.state.message


def test_the_next_open_says_where_an_earlier_sessions_unsaved_walk_is_kept(session):
    path = session.path
    path.write_text(path.read_text() + "\n[[run]\n")
    session.put_run(_run("R2", "Slicer"))
    kept = session.state.kept
    session.release_lock()
    path.write_text(path.read_text().replace("\n[[run]\n", ""))
    again = WalkSession.open(path)
    said = again.take_lock()
    assert f"are kept in {kept.name}: 'gaugewalk merge walk.toml {kept.name} -o walk.toml'" in said
    again.release_lock()


def test_a_lock_deleted_while_the_walk_is_open_is_taken_again_at_the_next_save(session):
    from gaugewalk.model.walkfile.lock import WalkLocked, acquire_lock, lock_path

    os.remove(lock_path(session.path))
    assert session.put_run(_run("R2", "Slicer")) is None and session.state.saved
    assert str(os.getpid()) in lock_path(session.path).read_text()
    with pytest.raises(WalkLocked):        # a second writer is stopped again
        acquire_lock(session.path, "gaugewalk add")
