"""Two writers on one walk: a command that writes is refused (exit 2, who holds it) while the walk
is held; a save over a file changed since it was read is refused; no order of operations loses an
update."""

from __future__ import annotations

import itertools
import os
import socket
import sys
import time

import pytest

import gaugewalk.tui.cli.main  # noqa: F401  (imported before forking)
from gaugewalk.model.walkfile.fingerprint import ChangedOnDisk, Fingerprint, fingerprint
from gaugewalk.model.walkfile.lock import lock_path
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.model.walkfile.write import dumps_walk, save_walk
from gaugewalk.tui.cli.main import main
from tests.support.kill_harness import walk_versions
from tests.support.locks import dead_pid, live_process, write_lock


@pytest.fixture
def walk(tmp_path):
    path = tmp_path / "plant.toml"
    save_walk(walk_versions(1, runs=6)[0], path)
    return path


@pytest.fixture
def other_app(walk):
    """Another live process holding the walk, as the app does while it is open."""
    proc = live_process()
    proc.holder = write_lock(walk, proc.pid)
    yield proc
    proc.kill()
    proc.wait()


def _add(walk, to: str, run_id: str | None = None) -> list[str]:
    argv = ["add", str(walk), "--from", "LP1", "--to", to, "--length", "40", "--amps", "8"]
    return argv + (["--id", run_id] if run_id else [])


def test_add_onto_a_walk_open_in_the_app_is_refused_with_who_holds_it(walk, other_app, capsys):
    before = walk.read_bytes()
    assert main(_add(walk, "Glue station")) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 1
    assert f"process {other_app.pid}" in err[0] and "dana" in err[0]
    assert socket.gethostname() in err[0] and "gaugewalk app" in err[0]
    assert f"since {other_app.holder.since_local()}" in err[0]
    assert walk.read_bytes() == before


def test_merge_onto_an_open_walk_is_refused_but_reading_it_is_fine(walk, other_app, tmp_path,
                                                                   capsys):
    site = tmp_path / "site.toml"
    save_walk(walk_versions(1, runs=8)[0], site)
    before = walk.read_bytes()
    assert main(["merge", str(site), str(walk), "-o", str(walk), "--prefer", "a"]) == 2
    assert f"process {other_app.pid}" in capsys.readouterr().err
    assert walk.read_bytes() == before
    out = tmp_path / "merged.toml"
    assert main(["merge", str(walk), str(site), "-o", str(out)]) == 0
    assert len(load_walk(out).runs) == 10


def test_a_stale_lock_left_by_a_dead_app_is_cleared_with_a_note(walk, capsys):
    write_lock(walk, dead_pid())
    assert main(_add(walk, "Glue station")) == 0
    err = capsys.readouterr().err
    assert "no longer running" in err and "cleared" in err
    assert load_walk(walk).runs[-1].to == "Glue station"
    assert not lock_path(walk).exists()


def test_a_file_changed_between_read_and_save_is_not_overwritten(walk, monkeypatch, capsys):
    """Someone saves the walk in an editor while ``add`` is working: the add is refused."""
    import gaugewalk.tui.cli.add as cmd_add

    edited = dumps_walk(walk_versions(2, runs=6)[1])
    real_read = cmd_add.read_job

    def read_then_someone_saves(path):
        job = real_read(path)
        with open(path, "w", encoding="utf-8") as handle:  # an editor writing in place
            handle.write(edited)
        return job

    monkeypatch.setattr(cmd_add, "read_job", read_then_someone_saves)
    assert main(_add(walk, "Glue station")) == 2
    err = capsys.readouterr().err.strip().splitlines()
    assert len(err) == 1 and "changed on disk since you opened it" in err[0]
    assert walk.read_text(encoding="utf-8") == edited


# -- every interleaving of two editors --------------------------------------------------------

def _interleavings():
    """Orders of A's and B's steps (read, save) that keep each editor's own order."""
    steps = [("A", "read"), ("A", "save"), ("B", "read"), ("B", "save")]
    for order in itertools.permutations(steps):
        if order.index(("A", "read")) < order.index(("A", "save")) and \
                order.index(("B", "read")) < order.index(("B", "save")):
            yield order


@pytest.mark.parametrize("order", list(_interleavings()),
                         ids=lambda o: "-".join(a + s[0] for a, s in o))
def test_no_interleaving_of_two_editors_loses_an_update(tmp_path, order):
    """A lost update is a save that replaces content its writer never read. With the fingerprint
    taken at read, every save either replaces exactly what its writer read, or is refused."""
    path = tmp_path / "walk.toml"
    base = walk_versions(1, runs=4)[0]
    save_walk(base, path)
    seen: dict[str, tuple] = {}
    outcome = {}
    for who, step in order:
        if step == "read":
            fp = fingerprint(path)
            job = load_walk(path)
            job.job.notes = f"edited by {who}"
            seen[who] = (fp, job, path.read_bytes())
        else:
            fp, job, read_bytes = seen[who]
            on_disk = path.read_bytes()
            try:
                save_walk(job, path, expected=fp)
                outcome[who] = "saved"
                assert on_disk == read_bytes, f"{who} replaced content it never read"
            except ChangedOnDisk as exc:
                outcome[who] = "refused"
                assert "changed on disk since you opened it" in str(exc)
                assert path.read_bytes() == on_disk
                assert on_disk != read_bytes
    assert "saved" in outcome.values()
    # a refusal happens exactly when the other editor saved between this one's read and save
    for who, _ in order:
        other = "B" if who == "A" else "A"
        i_read, i_save = order.index((who, "read")), order.index((who, "save"))
        other_saved_between = i_read < order.index((other, "save")) < i_save
        expect = "refused" if other_saved_between and outcome[other] == "saved" else "saved"
        assert outcome[who] == expect, (order, outcome)


def test_a_touch_that_changes_only_the_time_is_not_a_change(tmp_path):
    path = tmp_path / "walk.toml"
    versions = walk_versions(2, runs=4)
    save_walk(versions[0], path)
    fp = fingerprint(path)
    later = time.time() + 100
    os.utime(path, (later, later))
    assert fp.matches(fingerprint(path)) and fingerprint(path).mtime_ns != fp.mtime_ns
    save_walk(versions[1], path, expected=fp)
    assert load_walk(path) == versions[1]


def test_a_change_on_disk_that_keeps_the_size_is_still_a_change(tmp_path):
    path = tmp_path / "walk.toml"
    versions = walk_versions(2, runs=4)
    save_walk(versions[0], path)
    fp = fingerprint(path)
    data = path.read_bytes()
    changed = data.replace(b'id = "', b'id = "X', 1).replace(b"\n\n", b"\n", 1)
    assert len(changed) == len(data) and changed != data
    path.write_bytes(changed)
    assert not fp.matches(fingerprint(path)) and not fp.holds(changed) and fp.holds(data)
    with pytest.raises(ChangedOnDisk):
        save_walk(versions[1], path, expected=fp)
    assert path.read_bytes() == changed


def test_a_walk_deleted_since_it_was_read_is_not_silently_recreated(tmp_path):
    path = tmp_path / "walk.toml"
    versions = walk_versions(2, runs=4)
    save_walk(versions[0], path)
    fp = fingerprint(path)
    path.unlink()
    with pytest.raises(ChangedOnDisk):
        save_walk(versions[1], path, expected=fp)
    assert not path.exists()
    assert Fingerprint.of(b"x").matches(Fingerprint.of(b"x", 5))


# -- many command-line writers at once ----------------------------------------------------------

def test_twelve_adds_at_once_each_either_lands_or_is_refused_none_is_lost(walk):
    """Twelve ``add`` processes start together, five rounds: every one that says it added its
    run (exit 0) has its run in the file; every other was refused (exit 2) naming the holder."""
    for round_ in range(5):
        go = walk.parent / f"go{round_}"
        children = {}
        for i in range(12):
            name = f"Bench {round_}-{i}"
            r, w = os.pipe()
            pid = os.fork()
            if pid == 0:
                code = 3
                try:
                    os.close(r)
                    sys.stderr = os.fdopen(w, "w")  # pytest captures sys.stderr itself
                    sys.stdout = open(os.devnull, "w")
                    while not go.exists():
                        time.sleep(0.0005)
                    code = main(_add(walk, name, f"B{round_}-{i}"))
                    sys.stderr.flush()
                finally:
                    os._exit(code)
            os.close(w)
            children[pid] = (name, r)
        go.touch()
        landed, refused = set(), set()
        for pid, (name, r) in children.items():
            _, status = os.waitpid(pid, 0)
            err = b""
            while chunk := os.read(r, 4096):
                err += chunk
            os.close(r)
            code = os.waitstatus_to_exitcode(status)
            assert code in (0, 2), (code, err)
            if code == 0:
                landed.add(name)
            else:
                refused.add(name)
                text = err.decode()
                assert "open in" in text and "gaugewalk add" in text and "not changed" in text, text
        names = {r.to for r in load_walk(walk).runs}
        assert landed <= names, "a command said it added a run that is not in the file"
        assert not (refused & names)
        assert landed, "no add got through"
        assert not lock_path(walk).exists()


def test_the_app_session_does_not_overwrite_a_save_made_while_it_was_reading(walk, monkeypatch):
    """A command saves between the app reading the walk and the app noting what it read: the
    app's next save must not overwrite that command's runs (it merges them in, issue 15)."""
    import gaugewalk.model.session.hold as walkfile  # where the session reads the walk
    from gaugewalk.model.session.session import WalkSession

    theirs = walk_versions(2, runs=6)[1]
    real_read = walkfile.read_walk_text

    def read_then_someone_saves(path):
        text = real_read(path)
        save_walk(theirs, path)
        return text

    monkeypatch.setattr(walkfile, "read_walk_text", read_then_someone_saves)
    session = WalkSession.open(walk, compute=False)
    monkeypatch.setattr(walkfile, "read_walk_text", real_read)
    session.job.job.site = "Dock 4"          # a change theirs did not make: merged in
    assert session.save() is True
    assert "changed on disk; merged with it" in str(session.state.notice)
    saved = load_walk(walk)
    assert saved.runs == theirs.runs and saved.sources == theirs.sources
    assert saved.job.site == "Dock 4" and saved.job.notes == theirs.job.notes
    session.job.job.notes = "mine"           # their notes changed too: a clash, never written
    before = walk.read_bytes()
    save_walk(theirs.model_copy(update={"job": theirs.job.model_copy(
        update={"notes": "theirs again"})}), walk)
    assert session.save() is False
    assert "both sides changed the same thing" in session.state.message
    assert load_walk(walk).job.notes == "theirs again" and walk.read_bytes() != before
