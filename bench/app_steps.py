"""The app figures, each measured in a fresh process through Textual's Pilot (``--child bare`` and
``--child app``): start to first paint, keys to repaint, and storing a run from the run card.

"First paint" is the moment the run sheet draws its first row of the walk; "sized" the moment it
first draws a row with its computed result (the app sizes the runs in the background after the
first paint, and the status column says so meanwhile). The app process starts as the command
line starts it (``tui/app/launch.py``): the head start's child is forked before Textual is
imported (with the collector held off), and sizes the walk on another processor meanwhile
(``gaugewalk.tui.app.headstart``); its largest resident set is reported beside the app's.

Storing a run: the run under the cursor is opened on the run card (``e``), its load retyped key by
key, and Enter pressed. The step runs from Enter to the later of two moments: the run sheet drawing
that run's row with the new load, and the walk file in place on disk with it (the last
``os.replace`` onto the walk, and any ``fsync`` after it). Meanwhile a heartbeat task on the event
loop records the longest interval in which the loop ran nothing else: a stall over 1/60 s is a
frame the screen could not draw.
"""

from __future__ import annotations

import asyncio
import os
import statistics
import time
from pathlib import Path
from typing import Any

from bench.timing import maxrss_mb
from bench.walks import deepest_branch

FRAME_S = 1 / 60
"""One frame at 60 frames a second [s]; a longer stall of the event loop drops a frame."""

HEARTBEAT_S = 0.001
"""The heartbeat's sleep [s]; a stall is a wake-up later than this."""


def child_bare(t0: float) -> dict:
    """A bare Textual app: process start of this step to its first paint."""
    from textual.app import App
    from textual.widget import Widget

    marks: dict[str, float] = {}

    class Mark(Widget):
        def render(self) -> str:
            marks.setdefault("paint", time.perf_counter())
            return "a bare Textual app"

    class Bare(App):
        def compose(self):
            yield Mark()

    async def main() -> None:
        app = Bare()
        async with app.run_test(size=(100, 30)):
            while "paint" not in marks:
                await asyncio.sleep(0.001)

    asyncio.run(main())
    return {"first_paint_s": marks["paint"] - t0}


class Heartbeat:
    """The event loop's longest stall while ``on``: a task that sleeps ``HEARTBEAT_S`` and
    records how late it wakes."""

    def __init__(self) -> None:
        self.on = False
        self.longest = 0.0       # [s]
        self.dropped = 0         # stalls over FRAME_S
        self._task: asyncio.Task | None = None

    def start(self) -> None:
        self._task = asyncio.get_running_loop().create_task(self._beat())

    async def _beat(self) -> None:
        last = time.perf_counter()
        while True:
            await asyncio.sleep(HEARTBEAT_S)
            now = time.perf_counter()
            if self.on:
                stall = now - last - HEARTBEAT_S
                self.longest = max(self.longest, stall)
                self.dropped += stall > FRAME_S
            last = now

    def stop(self) -> None:
        if self._task is not None:
            self._task.cancel()


class DiskWatch:
    """When a file was last put in place: wraps ``os.replace``, ``os.rename`` and ``os.link``
    (however the project writes atomically) and ``os.fsync``, in every thread of this process."""

    def __init__(self, path: Path) -> None:
        self.path = Path(path).resolve()
        self.placed: float | None = None   # end of the last call that put the file in place
        self.synced: float | None = None   # end of the last fsync after it
        for name in ("replace", "rename", "link"):
            setattr(os, name, self._wrap_move(getattr(os, name)))
        os.fsync = self._wrap_fsync(os.fsync)

    def _wrap_move(self, move):
        def wrapped(src, dst, *args, **kwargs):
            out = move(src, dst, *args, **kwargs)
            if isinstance(dst, (str, os.PathLike)) and Path(dst).resolve() == self.path:
                self.placed = time.perf_counter()
                self.synced = None
            return out
        return wrapped

    def _wrap_fsync(self, fsync):
        def wrapped(fd):
            out = fsync(fd)
            if self.placed is not None:
                self.synced = time.perf_counter()
            return out
        return wrapped

    def reset(self) -> None:
        self.placed = self.synced = None

    @property
    def done(self) -> float | None:
        if self.placed is None:
            return None
        return max(self.placed, self.synced or 0.0)


def child_app(t0: float, path: Path, config: Path, keys: bool, stores: int) -> dict:
    """The walk app on ``path``: first paint; with ``keys`` scrolling and filtering; with
    ``stores`` that many runs stored from the run card. Started as the command line starts it
    (``gaugewalk.tui.app.launch.start``): the head start's child forked first, then the app
    imported."""
    from gaugewalk.tui.app.launch import start

    head_start, make_app = start(str(path))
    from textual.app import App

    from gaugewalk.tui.app.widgets.runsheet import RunSheet

    disk = DiskWatch(path)
    marks: dict[str, float] = {}
    wanted: dict[str, tuple[str, str]] = {}   # mark -> (run id, text its row must show)
    original = RunSheet.render_line

    def render_line(self, y):
        strip = original(self, y)
        now = time.perf_counter()
        marks.setdefault("render_after_key", now)
        pos = round(self.scroll_offset.y) + y
        if pos < len(self.view):
            marks.setdefault("rows", now)
            row = self.rows[self.view[pos]]
            if row.cells[-1] != "… sizing":
                marks.setdefault("sized", now)
            for mark, (key, text) in wanted.items():
                if row.key == key and text in strip.text:
                    marks.setdefault(mark, now)
        return strip

    RunSheet.render_line = render_line  # type: ignore[method-assign]  # timed, line by line

    # every frame the app composes (in a headless run it is composed, not written)
    probes: dict[str, object] = {}
    original_display = App._display

    def display(self, screen, renderable):
        if renderable is not None:
            now = time.perf_counter()
            for mark, probe in list(probes.items()):
                if probe():
                    marks.setdefault(mark, now)
                    del probes[mark]
        return original_display(self, screen, renderable)

    App._display = display  # type: ignore[method-assign]  # every frame composed, timed
    latencies: dict[str, list[float]] = {"scroll": [], "filter": [], "card": [], "typing": []}
    keyed: list[tuple[str, float]] = []

    async def timed(pilot, kind: str, key: str) -> None:
        """Key posted -> the run sheet's next repaint; for a key that does not repaint the
        sheet (focus moves to the find box...), key posted -> its handlers done."""
        await pilot.pause()
        marks.pop("render_after_key", None)
        t = time.perf_counter()
        await pilot.press(key)  # returns once the screen has handled the key
        handled = time.perf_counter()
        while "render_after_key" not in marks and time.perf_counter() - handled < 0.5:
            await asyncio.sleep(0.001)
        end = marks.get("render_after_key", handled)
        latencies[kind].append((end - t) * 1000.0)
        keyed.append((key, round((end - t) * 1000.0, 1)))

    async def until(mark: str, since: float, limit: float = 60.0) -> float:
        while mark not in marks:
            if time.perf_counter() - since > limit:
                raise RuntimeError(f"the app never reached '{mark}' within {limit:.0f} s")
            await asyncio.sleep(0.001)
        return marks[mark]

    async def key_to_frame(pilot, key: str, probe, kind: str) -> None:
        """Key posted -> the first frame composed once ``probe()`` holds (what the key does is
        on the screen)."""
        marks.pop("frame", None)
        probes["frame"] = probe
        t = time.perf_counter()
        await pilot.press(key)
        ms = (await until("frame", t) - t) * 1000.0
        latencies[kind].append(ms)
        keyed.append((key, round(ms, 1)))

    async def store_runs(app, pilot, heart: Heartbeat) -> dict:
        """Open the deepest branch run on the run card ``stores`` times, retype its load key by
        key and store it with Enter."""
        job = app.session.job
        target = deepest_branch(job)
        values = [target.load.value * 1.5, target.load.value]
        walk = app.screen
        sheet = walk.query_one(RunSheet)
        steps = []
        stalls: dict[str, list[float]] = {"open": [], "typing": [], "store": [], "cycle": []}

        def phase(name: str) -> None:
            stalls[name].append(heart.longest * 1000.0)
            heart.longest = 0.0

        for i in range(stores):
            text = f"{values[i % 2]:g}{target.load.unit}"
            if not sheet.move_to(target.id):
                raise RuntimeError(f"the run sheet has no row {target.id}")
            await pilot.pause()
            heart.longest = 0.0
            heart.on = True
            await key_to_frame(pilot, "e", lambda: app.screen is not walk, "card")
            phase("open")
            card = app.screen
            field = card.query_one("#f-load")
            # down: the load field, its text selected so typing replaces it
            await key_to_frame(pilot, "down", lambda f=field, c=card: c.focused is f, "typing")
            for k, ch in enumerate(text):
                await key_to_frame(pilot, ch, lambda f=field, v=text[: k + 1]: f.value == v,
                                   "typing")
            await pilot.pause()
            phase("typing")
            wanted["stored"] = (target.id, text)
            marks.pop("stored", None)
            disk.reset()
            t = time.perf_counter()
            await pilot.press("enter")
            shown = await until("stored", t)
            while disk.done is None:
                if time.perf_counter() - t > 60:
                    raise RuntimeError("storing the run did not write the walk file in 60 s")
                await asyncio.sleep(0.001)
            await pilot.pause()  # a save in a worker may still fsync after the rename
            steps.append((max(shown, disk.done) - t) * 1000.0)
            heart.on = False
            phase("store")
            stalls["cycle"].append(max(stalls[k][-1] for k in ("open", "typing", "store")))
            del wanted["stored"]
            if app.screen is not walk:
                raise RuntimeError("the run card stayed open after Enter (the run was not stored)")
        # what is on disk is what was stored last
        import tomllib

        data = tomllib.loads(path.read_text(encoding="utf-8"))
        on_disk = next(r for r in data["run"] if r["id"] == target.id)["load"]["value"]
        if abs(on_disk - values[(stores - 1) % 2]) > 1e-9:
            raise RuntimeError(f"the walk file holds load {on_disk} for {target.id}, "
                               "not the stored value")
        return {
            "app_edit_ms": min(steps), "app_edit_median_ms": statistics.median(steps),
            "app_edit_worst_ms": max(steps), "app_edit_run": target.id,
            "edit_stall_ms": min(stalls["cycle"]), "edit_stall_worst_ms": max(stalls["cycle"]),
            "open_stall_ms": min(stalls["open"]), "typing_stall_ms": min(stalls["typing"]),
            "store_stall_ms": min(stalls["store"]), "frames_dropped": heart.dropped,
            "worst_card_ms": max(latencies["card"]), "worst_typing_ms": max(latencies["typing"]),
        }

    async def main() -> dict:
        app = make_app(str(path), config_dir=config, head_start=head_start)
        heart = Heartbeat()
        async with app.run_test(size=(100, 30)) as pilot:
            heart.start()
            while "sized" not in marks:
                if app.return_code is not None:
                    raise RuntimeError(app.exit_message or "the app closed")
                await asyncio.sleep(0.001)
            out: dict[str, Any] = {"first_paint_s": marks["rows"] - t0,
                                   "sized_paint_s": marks["sized"] - t0}
            while app.session is None or app.session.busy:
                await asyncio.sleep(0.005)
            out["runs_shown"] = len(app.screen.query_one(RunSheet).rows)
            if keys:
                await pilot.pause()
                for key in ["down"] * 20 + ["pagedown"] * 20 + ["end", "up", "pageup", "home"]:
                    await timed(pilot, "scroll", key)
                await timed(pilot, "filter", "slash")
                for key in "dock":
                    await timed(pilot, "filter", key)
                for key in ["backspace"] * 4 + ["enter", "exclamation_mark", "exclamation_mark",
                                                 "f", "f", "escape"]:
                    await timed(pilot, "filter", key)
                out["worst_scroll_ms"] = max(latencies["scroll"])
                out["worst_filter_ms"] = max(latencies["filter"])
                out["keys_ms"] = keyed
            if stores:
                out.update(await store_runs(app, pilot, heart))
            heart.stop()
            out["peak_mb"] = maxrss_mb()
            # the head start's child, ended (and waited for) once it sent its rows
            out["head_start_mb"] = maxrss_mb(children=True) if head_start is not None else 0.0
        return out

    return asyncio.run(main())

