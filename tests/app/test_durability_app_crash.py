"""Crash recovery: the app process is killed mid-walk (SIGKILL, as a flat battery would) and the
walk is opened again. Everything stored is there (it was saved at once), the run card that was
being typed comes back, the dead app's lock is cleared with a message, and while the first app was
alive a second one was told who held the walk and opened it read-only."""

from __future__ import annotations

import json
import os
import signal
import subprocess
import sys
import textwrap
import time
import tomllib
from pathlib import Path

import pytest

from gaugewalk.model.walkfile.drafts import Draft, clear_draft, draft_path, load_draft, save_draft
from gaugewalk.model.walkfile.lock import lock_path
from tests.support.app_helpers import new_app, opened, type_text
from tests.support.paths import REPO
from tests.support.walks import write_walk

# The app, headless, driven by keys in its own process: store one run, then type most of a second
# one and stop there (the card open, nothing stored), saying so through a marker file.
APP_SCRIPT = textwrap.dedent("""
    import asyncio, sys, time
    from pathlib import Path
    from tests.support.app_helpers import new_app, opened, type_text

    walk, config, marker = map(Path, sys.argv[1:4])

    async def main():
        app = new_app(walk, config)
        async with app.run_test(size=(80, 24)) as pilot:
            await opened(app, pilot)
            await pilot.press("n")
            await pilot.pause()
            await type_text(pilot, "Mixer")
            await pilot.press("tab")
            await type_text(pilot, "85+12+2*6")
            await pilot.press("tab")
            await type_text(pilot, "1.8kVA")
            await pilot.press("enter")
            await pilot.pause()
            await type_text(pilot, "Walk-in cooler")
            await pilot.press("tab")
            await type_text(pilot, "36m+8")
            await pilot.pause()
            marker.write_text("typed")
            while True:
                await asyncio.sleep(0.05)

    asyncio.run(main())
""")


def _start_app(walk: Path, config: Path, marker: Path) -> subprocess.Popen:
    env = dict(os.environ, XDG_CONFIG_HOME=str(config / "xdg"))
    return subprocess.Popen([sys.executable, "-c", APP_SCRIPT, str(walk), str(config), str(marker)],
                            cwd=REPO, env=env, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE)


def _wait_for(marker: Path, proc: subprocess.Popen, seconds: float = 60.0) -> None:
    deadline = time.monotonic() + seconds
    while not marker.exists():
        if proc.poll() is not None:
            said = proc.stderr.read().decode() if proc.stderr else ""
            raise AssertionError(f"the app process ended early: {said[-2000:]}")
        if time.monotonic() > deadline:
            proc.kill()
            raise AssertionError("the app process did not get to the typing in time")
        time.sleep(0.05)


@pytest.mark.slow
async def test_killed_app_loses_nothing_stored_and_offers_the_card_being_typed(tmp_path):
    walk = write_walk(tmp_path)
    marker = tmp_path / "typed"
    proc = _start_app(walk, tmp_path / "cfg1", marker)
    try:
        _wait_for(marker, proc)
        holder = json.loads(lock_path(walk).read_text())
        assert holder["pid"] == proc.pid and holder["tool"] == "gaugewalk app"
        # what was being typed is already beside the walk
        draft = load_draft(walk)
        assert draft is not None and draft.fields["to"] == "Walk-in cooler"
        assert draft.fields["length"] == "36m+8"

        # a second app while the first is alive: told who holds it, read-only, writes nothing
        before = walk.read_bytes()
        second = new_app(walk, tmp_path / "cfg2")
        async with second.run_test(size=(80, 24)) as pilot:
            await opened(second, pilot)
            assert second.session.read_only
            assert f"process {proc.pid}" in second.session.read_only
            assert "read-only" in second.title
            await pilot.press("n")
            await pilot.pause()
            assert second.screen.__class__.__name__ == "WalkScreen"  # no card to type into
        assert walk.read_bytes() == before
        assert load_draft(walk) is not None  # the holder's draft is not taken by the reader
    finally:
        proc.send_signal(signal.SIGKILL)
        proc.wait()

    # what was stored before the kill is on disk, whole
    runs = {r["to"]: r for r in tomllib.loads(walk.read_text())["run"]}
    assert runs["Mixer"]["length"] == "85+12+2*6"
    assert runs["Mixer"]["load"] == {"value": 1.8, "unit": "kVA"}
    assert "Walk-in cooler" not in runs

    # reopen: the dead app's lock is cleared with a message, the card comes back
    app = new_app(walk, tmp_path / "cfg3")
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        assert not app.session.read_only
        said = " ".join(str(n.message) for n in app._notifications)
        assert "no longer running" in said and str(proc.pid) in said
        assert "Mixer" in {r.to for r in app.session.job.runs}
        await pilot.press("n")
        await pilot.pause()
        card = app.screen
        assert card.__class__.__name__ == "RunCard"
        values = card.values()
        assert values["to"] == "Walk-in cooler" and values["length"] == "36m+8"
        # finish it: the length gets its feet, the load, Enter stores it and clears the draft
        card._focus_field("length")
        await pilot.press("end")
        await type_text(pilot, "ft")
        await pilot.press("tab")
        await type_text(pilot, "5kW")
        await pilot.press("enter")
        await pilot.pause()
        assert load_draft(walk) is None
    runs = {r["to"]: r for r in tomllib.loads(walk.read_text())["run"]}
    assert runs["Walk-in cooler"]["length"] == "36m+8ft"
    assert not lock_path(walk).exists()  # released on a normal exit


def test_a_draft_is_written_whole_and_read_back(tmp_path):
    walk = tmp_path / "shop.toml"
    fields = {"from": "LP1", "to": "Ice machine ✓ \u202e", "length": "12'6\"", "load": ""}
    save_draft(walk, fields)
    assert draft_path(walk) == tmp_path / ".shop.toml.draft.json"
    back = load_draft(walk)
    # read back as typed, but a control character (here a bidi override) made visible: a draft
    # beside a walk someone sent is text from outside (model/walk/plain_text.py)
    assert isinstance(back, Draft) and back.run_id is None
    assert back.fields == {**fields, "to": "Ice machine ✓ \\u202e"}
    assert back.typed()
    assert [p.name for p in tmp_path.iterdir()] == [".shop.toml.draft.json"]  # no temp left
    clear_draft(walk)
    assert load_draft(walk) is None
    clear_draft(walk)  # clearing twice is fine


def test_a_broken_or_foreign_draft_is_ignored_never_an_error(tmp_path):
    walk = tmp_path / "shop.toml"
    for junk in (b"", b"\xff\xfe", b"[1, 2]", b'{"fields": 3}',
                 b'{"fields": {"to": 5}, "run_id": 7}', b"{" * 100_000,
                 b'{"fields": {}}' + b" " * 300_000):
        draft_path(walk).write_bytes(junk)
        got = load_draft(walk)
        assert got is None or got.fields == {}
    draft_path(walk).unlink()
    draft_path(walk).mkdir()
    assert load_draft(walk) is None


@pytest.mark.slow
def test_a_draft_save_killed_part_way_leaves_the_old_draft_or_the_new(tmp_path):
    """SIGKILL a process saving drafts in a loop, 60 times: the draft on disk always reads back
    as one of the drafts written."""
    import random

    walk = tmp_path / "shop.toml"
    texts = [{"to": f"Bench {i}", "length": str(10 + i) * (1 + i % 50)} for i in range(10)]
    save_draft(walk, texts[0])
    rng = random.Random(60)
    for _ in range(60):
        pid = os.fork()
        if pid == 0:
            try:
                i = 0
                while True:
                    i += 1
                    save_draft(walk, texts[i % len(texts)])
            finally:
                os._exit(3)
        time.sleep(rng.uniform(0, 0.01))
        os.kill(pid, signal.SIGKILL)
        os.waitpid(pid, 0)
        got = load_draft(walk)
        assert got is not None and got.fields in texts
