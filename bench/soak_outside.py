"""The kill soak of a walk changed on disk while the app has it open, run by hand (never by the
test suite):

    python -m bench.soak_outside --trials 60 [--early]

Each trial runs the app headless in its own process on a fresh walk: it stores a run, then
someone changes the walk on disk (an editor's save: a new file renamed into place, adding a run
of their own), then the app types and stores a second run, which merges with that change; the
app is killed (SIGKILL) at a random moment from the last keystroke on (``--early``: from the
change on disk on, so also while the run is typed). After every kill: the walk
is whole, the change made on disk is in it, the first run is in it, and the second run is in the
walk, in the run card's draft or in the walk kept beside it (killed while typing: the draft
holds what was typed so far). Prints one line and exits 1 if
anything was lost.
"""

from __future__ import annotations

import argparse
import os
import random
import signal
import subprocess
import sys
import tempfile
import textwrap
import time
from pathlib import Path

from gaugewalk.model.session.outside import kept_beside
from gaugewalk.model.walkfile.drafts import load_draft
from gaugewalk.model.walkfile.read import load_walk
from tests.support.paths import REPO
from tests.support.walks import SMALL_WALK, run_table, tables_text

APP_SCRIPT = textwrap.dedent("""
    import asyncio, sys
    from pathlib import Path
    from tests.support.app_helpers import new_app, opened, type_text

    walk, config, marker, go = map(Path, sys.argv[1:5])

    async def card(pilot, to, length, load):
        await type_text(pilot, to)
        await pilot.press("tab")
        await type_text(pilot, length)
        await pilot.press("tab")
        await type_text(pilot, load)

    async def main():
        app = new_app(walk, config)
        async with app.run_test(size=(80, 24)) as pilot:
            await opened(app, pilot)
            await pilot.press("n")
            await pilot.pause()
            await card(pilot, "Mixer", "20", "4A")
            await pilot.press("enter")
            await pilot.pause()
            marker.write_text("stored")
            while not go.exists():
                await asyncio.sleep(0.01)
            await card(pilot, "Kettle", "25", "5A")
            await pilot.pause()
            marker.write_text("typed")
            await pilot.press("enter")
            await pilot.pause()
            marker.write_text("done")
            while True:
                await asyncio.sleep(0.05)

    asyncio.run(main())
""")


def _wait_for(marker: Path, text: str, proc: subprocess.Popen, limit_s: float = 60.0) -> bool:
    end = time.monotonic() + limit_s
    while time.monotonic() < end:
        if proc.poll() is not None:
            return False
        try:
            if marker.read_text() == text:
                return True
        except FileNotFoundError:
            pass
        time.sleep(0.005)
    return False


def _edit_on_disk(walk: Path) -> None:
    """An editor's save: the whole file written anew and renamed into place."""
    text = walk.read_text(encoding="utf-8") + tables_text("run", [
        run_table("H1", "LP1", "Hand-added heater", "30", load=(6, "A"), connection="LN")])
    tmp = walk.with_name(".editor-save.tmp")
    tmp.write_text(text, encoding="utf-8")
    os.replace(tmp, walk)


def trial(folder: Path, rng: random.Random, early: bool = False) -> str:
    """One kill; returns where the second run was found ("walk", "draft", "kept"), or raises
    ``AssertionError`` naming what was lost."""
    walk = folder / "walk.toml"
    walk.write_text(SMALL_WALK, encoding="utf-8")
    marker, go = folder / "marker", folder / "go"
    proc = subprocess.Popen([sys.executable, "-c", APP_SCRIPT, str(walk), str(folder / "cfg"),
                             str(marker), str(go)], cwd=REPO,
                            stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    try:
        assert _wait_for(marker, "stored", proc), "the app did not store its first run"
        _edit_on_disk(walk)
        go.write_text("go")
        if early:   # any moment while the second run is typed or stored
            time.sleep(rng.uniform(0.0, 0.8))
        else:
            assert _wait_for(marker, "typed", proc), "the app did not type its second run"
            time.sleep(rng.uniform(0.0, 0.12))
        typed = marker.read_text() in ("typed", "done")
    finally:
        proc.send_signal(signal.SIGKILL)
        proc.wait()
    job = load_walk(walk)                      # whole, or this raises
    found = {r.to for r in job.runs}
    assert "Hand-added heater" in found, "the change made on disk was overwritten"
    assert "Mixer" in found, "the first stored run was lost"
    if "Kettle" in found:
        return "walk"
    draft = load_draft(walk)
    if draft is not None and draft.fields.get("to") == "Kettle":
        return "draft"
    if any("Kettle" in {r.to for r in load_walk(k).runs} for k in kept_beside(walk)):
        return "kept"
    if not typed:   # killed while it was being typed: what was typed so far is in the draft
        so_far = draft.fields.get("to", "") if draft is not None else ""
        assert "Kettle".startswith(so_far), f"the draft holds {so_far!r}"
        return "typing (draft as far as typed)"
    raise AssertionError("the second run is nowhere: not in the walk, the draft or a kept walk")


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m bench.soak_outside", description=__doc__,
                                     formatter_class=argparse.RawDescriptionHelpFormatter)
    parser.add_argument("--trials", type=int, default=40)
    parser.add_argument("--seed", type=int, default=int(time.time()))
    parser.add_argument("--early", action="store_true",
                        help="kill at any moment from the change on disk on, while typing too")
    args = parser.parse_args(argv)
    rng = random.Random(args.seed)
    where: dict[str, int] = {}
    lost: list[str] = []
    for i in range(args.trials):
        with tempfile.TemporaryDirectory(prefix="gaugewalk-soak-") as tmp:
            try:
                kind = trial(Path(tmp), rng, args.early)
            except Exception as exc:  # noqa: BLE001  (every failure is counted and shown)
                lost.append(f"trial {i}: {exc}")
                continue
            where[kind] = where.get(kind, 0) + 1
    found = ", ".join(f"{n} in the {k}" for k, n in sorted(where.items()))
    print(f"outside change + kill: {args.trials} trials (seed {args.seed}); second run {found}; "
          f"{len(lost)} lost")
    for line in lost:
        print("  " + line)
    return 1 if lost else 0


if __name__ == "__main__":
    sys.exit(main())
