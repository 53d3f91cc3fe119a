"""A walk reached through a link, owned by someone else or made read-only (issue 15): saved
through the link to the file it names, its lock, draft and backup beside that file, the two
names blocking each other; owner and mode kept; a read-only walk refused, never replaced."""

from __future__ import annotations

import contextlib
import io
import os
import stat

import pytest

from gaugewalk.model.session.hold import WalkHold
from gaugewalk.model.session.session import WalkSession
from gaugewalk.model.walkfile.atomic import atomic_write, backup_path
from gaugewalk.model.walkfile.drafts import draft_path
from gaugewalk.model.walkfile.lock import WalkLocked, lock_path
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.tui.app.recent import RecentWalks
from gaugewalk.tui.cli.main import main
from tests.support.walks import SMALL_WALK, make_run, write_walk


def _cli(argv: list[str]) -> tuple[int, str, str]:
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        code = main(argv)
    return code, out.getvalue(), err.getvalue()


def _add(walk, to="Mixer") -> list[str]:
    return ["add", str(walk), "--from", "LP1", "--to", to, "--length", "40", "--amps", "8"]


@pytest.fixture
def linked(tmp_path):
    """``jobs/shop.toml`` (the real walk) and ``desk/shop.toml`` (a symbolic link to it)."""
    (tmp_path / "jobs").mkdir()
    (tmp_path / "desk").mkdir()
    real = write_walk(tmp_path / "jobs", SMALL_WALK, "shop.toml")
    link = tmp_path / "desk" / "shop.toml"
    link.symlink_to(real)
    return real, link


def test_a_save_through_a_link_reaches_the_file_it_names_and_keeps_the_link(linked):
    real, link = linked
    code, out, err = _cli(_add(link))
    assert code == 0, err
    assert link.is_symlink() and os.readlink(link) == str(real)
    assert load_walk(real).runs[-1].to == "Mixer"
    back = backup_path(real)  # beside the real file, a plain file with the previous walk
    assert back.is_file() and not back.is_symlink() and back.read_text() == SMALL_WALK
    assert not backup_path(link).exists() and not os.path.lexists(backup_path(link))


def test_two_names_for_one_walk_block_each_other(linked):
    real, link = linked
    with WalkHold(link, "gaugewalk app") as app:
        app.take_lock()
        assert app.path == real and lock_path(real).exists()
        before = real.read_bytes()
        code, out, err = _cli(_add(real))
        assert code == 2 and "gaugewalk app" in err
        assert real.read_bytes() == before
    with WalkHold(real, "gaugewalk app") as app:
        app.take_lock()
        with pytest.raises(WalkLocked):
            WalkHold(link).take_lock()


def test_the_app_keeps_its_draft_beside_the_real_file_and_remembers_the_link(linked, tmp_path):
    real, link = linked
    session = WalkSession.open(link)
    assert session.take_lock() is None
    session.keep_draft({"to": "Kettle", "length": "12"})
    assert draft_path(real).exists() and not os.path.lexists(draft_path(link))
    session.put_run(make_run("R2", "LP1", "Kettle", "12", load=(8, "A"), connection="LN"))
    assert session.state.saved and link.is_symlink()
    assert load_walk(real).run("R2") is not None
    session.release_lock()
    recent = RecentWalks.load(tmp_path / "cfg")
    recent.remember(link)
    assert recent.paths == [str(link)]  # what the person opened, not where it leads


def test_a_walk_with_two_hard_links_is_written_so_both_names_see_it(tmp_path):
    real = write_walk(tmp_path, SMALL_WALK, "shop.toml")
    other = tmp_path / "copy-for-sync.toml"
    os.link(real, other)
    code, out, err = _cli(_add(real))
    assert code == 0, err
    assert os.stat(real).st_ino == os.stat(other).st_ino  # still one file with two names
    assert load_walk(other).runs[-1].to == "Mixer"
    back = backup_path(real)
    assert back.read_text() == SMALL_WALK and os.stat(back).st_ino != os.stat(real).st_ino
    assert [p.name for p in tmp_path.iterdir() if p.name.endswith(".tmp")] == []


def test_the_mode_of_a_walk_survives_a_save(tmp_path):
    walk = write_walk(tmp_path, SMALL_WALK, "shop.toml")
    os.chmod(walk, 0o640)
    assert _cli(_add(walk))[0] == 0
    assert stat.S_IMODE(os.stat(walk).st_mode) == 0o640


@pytest.mark.skipif(not hasattr(os, "geteuid") or os.geteuid() != 0, reason="needs root")
def test_a_save_as_root_leaves_a_colleagues_walk_theirs(tmp_path):
    walk = write_walk(tmp_path, SMALL_WALK, "shop.toml")
    os.chown(walk, 1234, 2345)
    assert _cli(_add(walk))[0] == 0
    info = os.stat(walk)
    assert (info.st_uid, info.st_gid) == (1234, 2345)
    back = os.stat(backup_path(walk))
    assert (back.st_uid, back.st_gid) == (1234, 2345)
    atomic_write(walk, b"schema = 1\n")  # every write through the one writer keeps them
    assert (os.stat(walk).st_uid, os.stat(walk).st_gid) == (1234, 2345)


def test_a_read_only_walk_is_refused_never_replaced(tmp_path):
    walk = write_walk(tmp_path, SMALL_WALK, "shop.toml")
    os.chmod(walk, 0o444)
    inode = os.stat(walk).st_ino
    code, out, err = _cli(_add(walk))
    assert code == 2
    assert ("the walk is read-only (-r--r--r--); gaugewalk does not replace a read-only walk: "
            "make it writable (chmod u+w shop.toml) to save it") in err
    assert walk.read_text() == SMALL_WALK and os.stat(walk).st_ino == inode
    assert not backup_path(walk).exists()
    session = WalkSession.open(walk)
    said = session.take_lock()
    assert said is not None and said.startswith("Read-only: shop.toml: the walk is read-only")
    assert session.read_only and not lock_path(walk).exists()
