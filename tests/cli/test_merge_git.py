"""``gaugewalk merge`` with a base: given, found in git, and as git's own merge driver, so that
two walkers committing one walk to a repository merge it run by run."""

from __future__ import annotations

import os
import shutil
import subprocess
import sys

import pytest

from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.tui.cli.main import main
from tests.support.walks import panel_walk, run_table

pytestmark = pytest.mark.skipif(shutil.which("git") is None, reason="git is not installed")

START = [("R1", "Office lights", "40"), ("R2", "Copier", "55")]


def _walk(runs) -> str:
    return panel_walk("Tenant floor", *(
        run_table(rid, "LP1", to, length, load=(10, "A"), connection="LN")
        for rid, to, length in runs))


def _git(repo, *argv: str) -> str:
    env = {**os.environ, "GIT_CONFIG_GLOBAL": os.devnull, "GIT_CONFIG_NOSYSTEM": "1"}
    done = subprocess.run(["git", "-c", "user.name=Walker", "-c", "user.email=w@example.com",
                           "-c", "init.defaultBranch=main", "-c", "commit.gpgsign=false", *argv],
                          cwd=repo, env=env, capture_output=True, text=True, check=False)
    assert done.returncode == 0 or argv[0] == "merge", done.stderr
    return done.stdout + done.stderr


@pytest.fixture
def repo(tmp_path, monkeypatch):
    """A repository with walk.toml committed on main, and a branch 'other' from that commit."""
    (tmp_path / "walk.toml").write_text(_walk(START), encoding="utf-8")
    _git(tmp_path, "init", "-q")
    _git(tmp_path, "add", "walk.toml")
    _git(tmp_path, "commit", "-q", "-m", "first walk")
    _git(tmp_path, "branch", "other")
    monkeypatch.chdir(tmp_path)
    monkeypatch.setenv("GIT_CONFIG_GLOBAL", os.devnull)
    monkeypatch.setenv("GIT_CONFIG_NOSYSTEM", "1")
    return tmp_path


def _commit_on(repo, branch: str, runs, message: str) -> None:
    _git(repo, "checkout", "-q", branch)
    (repo / "walk.toml").write_text(_walk(runs), encoding="utf-8")
    _git(repo, "commit", "-q", "-am", message)


def test_merge_with_base_takes_one_sided_changes_and_keeps_both_new_runs(tmp_path, capsys):
    pa, pb, p0, out = (tmp_path / n for n in ("a.toml", "b.toml", "base.toml", "out.toml"))
    p0.write_text(_walk(START))
    pa.write_text(_walk([START[0], ("R2", "Copier", "61"), ("R3", "Server room", "30")]))
    pb.write_text(_walk([START[0], START[1], ("R3", "Kitchen", "80")]))
    # without the base, A's re-measure of R2 cannot be told from B's and is a conflict
    assert main(["merge", str(pa), str(pb), "-o", str(out)]) == 1
    assert "run R2 differs" in capsys.readouterr().err
    assert main(["merge", "--base", str(p0), str(pa), str(pb), "-o", str(out)]) == 0
    said = capsys.readouterr()
    assert "kept both: run R3 of B is now R4" in said.err
    assert "1 renumbered" in said.out and "1 changed in a" in said.out
    job = load_walk(out)
    assert [(r.id, r.to, r.length) for r in job.runs[1:]] == [
        ("R1", "Office lights", "40"), ("R2", "Copier", "61"), ("R3", "Server room", "30"),
        ("R4", "Kitchen", "80")]


def test_the_base_is_found_in_git_when_a_walk_is_named_by_its_commit(repo, capsys):
    _commit_on(repo, "other", [START[0], ("R2", "Copier", "61")], "re-measured the copier")
    _commit_on(repo, "main", [*START, ("R3", "Kitchen", "80")], "kitchen")
    assert main(["merge", "walk.toml", "other:walk.toml", "-o", "merged.toml"]) == 0
    assert "base: walk.toml as of" in capsys.readouterr().err
    job = load_walk(repo / "merged.toml")
    assert (job.run("R2").length, job.run("R3").to) == ("61", "Kitchen")


def test_a_bad_revision_is_a_clear_message_not_a_traceback(repo, capsys):
    assert main(["merge", "walk.toml", "nosuch:walk.toml", "-o", "merged.toml"]) == 2
    err = capsys.readouterr().err
    assert "nosuch:walk.toml: cannot be read from git" in err and "Traceback" not in err


def test_git_merges_two_walkers_commits_run_by_run_once_set_up(repo):
    assert main(["merge", "--setup-git", "walk.toml"]) == 0
    assert "/walk.toml merge=gaugewalk" in (repo / ".gitattributes").read_text()
    # ran twice, the marking is not repeated
    assert main(["merge", "--setup-git", "walk.toml"]) == 0
    assert (repo / ".gitattributes").read_text().count("merge=gaugewalk") == 1
    assert sys.executable in _git(repo, "config", "merge.gaugewalk.driver")
    _git(repo, "add", ".gitattributes")
    _git(repo, "commit", "-q", "-m", "walks merge run by run")
    _git(repo, "branch", "-f", "other")
    # both walkers add a run R3, and one re-measures R2: git's line merge would conflict
    _commit_on(repo, "other", [START[0], ("R2", "Copier", "61"), ("R3", "Server room", "30")],
               "other walker")
    _commit_on(repo, "main", [*START, ("R3", "Kitchen", "80")], "this walker")
    said = _git(repo, "merge", "--no-edit", "other")
    assert "CONFLICT" not in said, said
    job = load_walk(repo / "walk.toml")
    assert {(r.id, r.to, r.length) for r in job.runs} >= {
        ("R2", "Copier", "61"), ("R3", "Kitchen", "80"), ("R4", "Server room", "30")}
    assert not list(repo.glob("*~")) and not list(repo.glob(".merge_file*"))


def test_a_true_conflict_in_git_leaves_this_sides_walk_and_says_how_to_settle(repo):
    main(["merge", "--setup-git", "walk.toml"])
    _git(repo, "add", ".gitattributes")
    _git(repo, "commit", "-q", "-m", "walks merge run by run")
    _git(repo, "branch", "-f", "other")
    _commit_on(repo, "other", [START[0], ("R2", "Copier", "61")], "other walker")
    _commit_on(repo, "main", [START[0], ("R2", "Copier", "58")], "this walker")
    said = _git(repo, "merge", "--no-edit", "other")
    assert "run R2 differs: length: A has '58', B has '61'" in said
    assert "gaugewalk merge --base :1:walk.toml :2:walk.toml :3:walk.toml -o walk.toml" in said
    assert load_walk(repo / "walk.toml").run("R2").length == "58"   # ours, still a valid walk
    # the command it gives settles it
    assert main(["merge", "--base", ":1:walk.toml", ":2:walk.toml", ":3:walk.toml",
                 "-o", "walk.toml", "--prefer", "b"]) == 0
    assert load_walk(repo / "walk.toml").run("R2").length == "61"


def test_merge_needs_two_walks_and_an_output(tmp_path, capsys):
    assert main(["merge", str(tmp_path / "a.toml")]) == 2
    assert "give two walks and -o OUT" in capsys.readouterr().err
