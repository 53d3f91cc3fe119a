"""Speed benchmarks on a synthetic walk of N runs; run by hand, never by the test suite.

    python -m bench.benchmarks --runs 5000            # the table, PASS/MISS beside each target
    python -m bench.benchmarks --runs 5000 --json     # ... and one JSON object on the last line
    python -m bench.benchmarks --scaling              # the core figures at 500, 5,000, 50,000 runs

Every figure is measured on the real code paths with a baseline taken in the same run:

- open: ``gaugewalk.model.walkfile.store.load_walk`` (read, parse, migrate, validate, cross-check) plus
  ``gaugewalk.model.walk.compute.compute_job``; baseline: ``tomllib`` parsing the same file.
- full recompute: ``compute_job`` on the open walk.
- one-run edit: the run card's validated ``Run`` put in place of the old one, the incremental
  ``recompute_run`` (the run, the feeders above it, the bus drops and totals below them) and the
  edited run-sheet row with the sheet's count of flagged runs. The save after it is the save
  figure; printed for information: the whole app step as it is today (put_run with its atomic
  save, every sheet row rebuilt) and the footage view's rebuild from the takeoff (done only while
  that view is shown).
- save: ``gaugewalk.model.walkfile.store.dumps_walk``; baseline: ``tomli_w`` dumping the data ``tomllib`` read
  from the same file. ``save_walk`` (atomic write, fsync, backup) is printed for information.
- app start: a fresh process from before Textual is imported to the first paint of the run
  sheet on the largest walk in ``sample_walks/`` (the warehouse, 384 runs); baseline: a fresh
  process from before Textual is imported to the first paint of a bare Textual app.
- app open of the N-run walk: the same first paint, then the worst keypress-to-repaint latency
  while scrolling (down, page down, end, home) and filtering (typing in the find box, the
  problems-only and by-source filters) through Pilot.
- peak memory: the largest resident set (``ru_maxrss``) of the app process holding the N-run
  walk; the model-only open is measured in a process of its own, with ``tracemalloc`` in
  another, so the figures do not pollute each other.

"First paint" is the moment the run sheet draws its first row of the walk (id, from, to, length,
load; the app sizes the runs right after, in the background, and the status column says so); the
moment it first draws a row with its computed result ("sized") is printed beside it.
Timings are the best of ``--repeat`` interleaved runs (start-up: of ``--starts`` processes) on a
machine that may be busy with other work; ratios divide best by best. Each timed call includes the
young-generation garbage collection its result leaves pending, so holding the collector during a
step cannot hide its cost.
"""

from __future__ import annotations

import argparse
import gc
import json
import os
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent  # the repository

TARGETS = {
    "open_ratio": 2.0,       # open <= 2x tomllib parse
    "save_ratio": 1.5,       # dumps <= 1.5x tomli_w dump
    "edit_ms": 20.0,         # one-run edit to updated results and totals
    "recompute_ms": 100.0,   # full recompute
    "start_ratio": 1.5,      # app start <= 1.5x a bare Textual app
    "first_paint_s": 1.5,    # first paint of the N-run walk
    "worst_key_ms": 100.0,   # scrolling and filtering never stall: every key repainted in 0.1 s
    "peak_mb": 200.0,        # peak memory
}
TARGET_RUNS = 5000
JSON_KEYS = ("open_ratio", "save_ratio", "edit_ms", "recompute_ms", "start_ratio", "first_paint_s",
             "peak_mb")
SCALING_SIZES = (500, 5000, 50000)
LINEAR_SLACK = 1.5
"""Cost grows linearly when the cost per run at the largest size is at most this many times the
smallest cost per run at the smaller sizes."""


# ---------------------------------------------------------------------------------------------
# helpers

def _timed(fn) -> float:
    """Wall time of ``fn()`` [ms], with the young-generation garbage collection its result leaves
    pending (code that holds the collector while it allocates pays for it here, as it would in the
    app at its next allocation); the result is kept alive until then."""
    t = time.perf_counter()
    out = fn()
    gc.collect(0)
    elapsed = (time.perf_counter() - t) * 1000.0
    del out
    return elapsed


def _best(fn, repeat: int) -> tuple[float, float]:
    """(best, median) of ``_timed(fn)`` [ms]."""
    times = [_timed(fn) for _ in range(repeat)]
    return min(times), statistics.median(times)


def _interleaved(fns: dict, repeat: int) -> dict[str, tuple[float, float]]:
    """Best and median of several functions measured in turn, so a busy machine slows all alike."""
    times: dict[str, list[float]] = {k: [] for k in fns}
    for _ in range(repeat):
        for name, fn in fns.items():
            times[name].append(_timed(fn))
    return {k: (min(v), statistics.median(v)) for k, v in times.items()}


def _maxrss_mb() -> float:
    import resource

    return resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024.0  # Linux: KiB


def _sample_walk() -> Path | None:
    """The largest walk in ``sample_walks/`` (the warehouse, about 300 runs)."""
    best = None
    for p in sorted((ROOT / "sample_walks").glob("*.toml")):
        n = p.read_text(encoding="utf-8").count("[[run]]")
        if best is None or n > best[0]:
            best = (n, p)
    return best[1] if best else None


def _config_dir(tmp: Path) -> Path:
    """An app settings folder where the first-start caution was already shown (so the walk
    screen is what paints first)."""
    folder = tmp / "config"
    folder.mkdir(exist_ok=True)
    (folder / "recent.json").write_text(json.dumps({"recent": [], "caution_seen": True}))
    return folder


def _child(name: str, *args: str, timeout: float = 900.0) -> dict:
    """Run one measurement in a fresh interpreter; its last stdout line is a JSON object."""
    cmd = [sys.executable, "-m", "bench.benchmarks", "--child", name, *args]
    done = subprocess.run(cmd, cwd=ROOT, capture_output=True, text=True, timeout=timeout)
    lines = done.stdout.strip().splitlines()
    if done.returncode != 0 or not lines:
        raise RuntimeError(f"benchmark step {name} failed:\n{done.stderr[-3000:]}")
    return json.loads(lines[-1])


# ---------------------------------------------------------------------------------------------
# measurements, each run in a process of its own (``--child NAME``)

def child_core(path: Path, repeat: int) -> dict:
    """Open, recompute, one-run edit and save on the model, with their baselines."""
    import tomllib

    import tomli_w

    from gaugewalk.model.walk.compute import compute_job, recompute_run
    from gaugewalk.model.walk.job import Run
    from gaugewalk.model.walk.takeoff import build_takeoff
    from gaugewalk.model.walkfile.store import dumps_walk, load_walk, save_walk
    from gaugewalk.tui.app.sheet.rows import all_rows, sheet_row
    from gaugewalk.model.session.session import WalkSession

    def open_walk():
        job = load_walk(path)
        return job, compute_job(job)

    def parse():
        with open(path, "rb") as fh:
            return tomllib.load(fh)

    opened = _interleaved({"open": open_walk, "tomllib": parse}, repeat)
    job = load_walk(path)
    recompute = _best(lambda: compute_job(job), repeat)

    text = path.read_text(encoding="utf-8")
    data = tomllib.loads(text)
    assert dumps_walk(job) == text, "the synthetic file is not in the form gaugewalk saves"
    saved = _interleaved({"dumps": lambda: dumps_walk(job), "tomli_w": lambda: tomli_w.dumps(data)},
                         repeat)

    # one-run edit: the deepest branch (on a subpanel when there is one), its load changed so the
    # feeders above it and the drop below them move as well
    session = WalkSession(path, job)
    depth = {}

    def level(source_id: str) -> int:
        if source_id not in depth:
            feeder = job.feeder_of(source_id)
            depth[source_id] = 0 if feeder is None else 1 + level(feeder.from_)
        return depth[source_id]

    branches = [r for r in job.runs if r.load is not None and not job.is_feeder(r)]
    target = max(branches, key=lambda r: (level(r.from_), r.id))
    base = target.model_dump(by_alias=True, exclude_defaults=True)
    values = [target.load.value, target.load.value * 1.5]
    sheet = {"rows": all_rows(session)}
    sheet["index"] = {row.key: i for i, row in enumerate(sheet["rows"])}
    edits: list[float] = []

    def edit(i: int) -> None:
        raw = dict(base, load=dict(base["load"], value=values[i % 2]))
        t = time.perf_counter()
        run = Run.model_validate(raw)                      # what the run card stores
        runs = job.runs
        for k, r in enumerate(runs):                       # put in place, as the session does
            if r.id == run.id:
                runs[k] = run
                break
        job._index_cache = None
        session.result = recompute_run(job, session.result, run.id)
        sheet["rows"][sheet["index"][run.id]] = sheet_row(session, run)  # the edited row
        sum(row.flag for row in sheet["rows"])             # the sheet's count of flagged runs
        edits.append((time.perf_counter() - t) * 1000.0)

    for i in range(max(repeat, 5) * 2):
        edit(i)
    full = compute_job(job)
    same = all(
        (full.runs[k].size, round(full.runs[k].total_drop_pct, 9))
        == (session.result.runs[k].size, round(session.result.runs[k].total_drop_pct, 9))
        for k in full.runs
    ) and full.runs.keys() == session.result.runs.keys()

    # the whole app step: put_run (recompute and atomic save) and the rebuilt run sheet
    with tempfile.TemporaryDirectory() as tmp:
        copy = Path(tmp) / path.name
        copy.write_text(text, encoding="utf-8")
        app_session = WalkSession(copy, load_walk(copy))
        app_steps = []
        for i in range(max(repeat, 3)):
            raw = dict(base, load=dict(base["load"], value=values[(i + 1) % 2]))
            t = time.perf_counter()
            app_session.put_run(Run.model_validate(raw), replaces=target.id)
            sheet["rows"] = all_rows(app_session)
            app_steps.append((time.perf_counter() - t) * 1000.0)
        footage = _best(lambda: build_takeoff(app_session.job, app_session.result).footage_by_size(),
                        min(repeat, 3))
        # save_walk on its own (a changed walk, so it writes)
        save_times = []
        for i in range(repeat):
            copy.write_text(text if i % 2 else text + "\n", encoding="utf-8")
            t = time.perf_counter()
            save_walk(app_session.job, copy)
            save_times.append((time.perf_counter() - t) * 1000.0)

    return {
        "open_ms": opened["open"][0], "open_median_ms": opened["open"][1],
        "tomllib_ms": opened["tomllib"][0], "tomllib_median_ms": opened["tomllib"][1],
        "recompute_ms": recompute[0], "recompute_median_ms": recompute[1],
        "save_ms": saved["dumps"][0], "save_median_ms": saved["dumps"][1],
        "tomli_w_ms": saved["tomli_w"][0], "tomli_w_median_ms": saved["tomli_w"][1],
        "edit_ms": min(edits), "edit_median_ms": statistics.median(edits),
        "edit_worst_ms": max(edits), "edit_run": target.id, "edit_matches_full": same,
        "app_edit_ms": min(app_steps), "save_file_ms": min(save_times),
        "footage_ms": footage[0],
        "file_kb": len(text.encode("utf-8")) / 1024.0,
    }


def child_memory(path: Path) -> dict:
    """Resident set after opening and computing the walk (model only)."""
    from gaugewalk.model.walk.compute import compute_job
    from gaugewalk.model.walkfile.store import load_walk

    before = _maxrss_mb()
    job = load_walk(path)
    result = compute_job(job)
    assert len(result.runs) == len(job.runs)
    return {"model_rss_mb": _maxrss_mb(), "interpreter_rss_mb": before}


def child_tracemalloc(path: Path) -> dict:
    """Python allocations at their peak while opening and computing the walk."""
    import tracemalloc

    from gaugewalk.model.walk.compute import compute_job
    from gaugewalk.model.walkfile.store import load_walk

    tracemalloc.start()
    job = load_walk(path)
    result = compute_job(job)
    _, peak = tracemalloc.get_traced_memory()
    held, _ = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    assert len(result.runs) == len(job.runs)
    return {"traced_peak_mb": peak / 2**20, "traced_held_mb": held / 2**20}


def child_bare(t0: float) -> dict:
    """A bare Textual app: process start of this step to its first paint."""
    import asyncio

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


def child_app(t0: float, path: Path, config: Path, keys: bool) -> dict:
    """The walk app on ``path``: first paint, then (with ``keys``) scrolling and filtering."""
    import asyncio

    from gaugewalk.tui.app.app import make_app
    from gaugewalk.tui.app.widgets.runsheet import RunSheet

    marks: dict[str, float] = {}
    original = RunSheet.render_line

    def render_line(self, y):
        strip = original(self, y)
        now = time.perf_counter()
        marks.setdefault("render_after_key", now)
        pos = round(self.scroll_offset.y) + y
        if pos < len(self.view):
            marks.setdefault("rows", now)
            if self.rows[self.view[pos]].cells[-1] != "… sizing":
                marks.setdefault("sized", now)
        return strip

    RunSheet.render_line = render_line
    latencies: dict[str, list[float]] = {"scroll": [], "filter": []}
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

    async def main() -> dict:
        app = make_app(str(path), config_dir=config)
        async with app.run_test(size=(100, 30)) as pilot:
            while "sized" not in marks:
                if app.return_code is not None:
                    raise RuntimeError(app.exit_message or "the app closed")
                await asyncio.sleep(0.001)
            out = {"first_paint_s": marks["rows"] - t0, "sized_paint_s": marks["sized"] - t0}
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
                out["worst_key_ms"] = max(out["worst_scroll_ms"], out["worst_filter_ms"])
                out["keys_ms"] = keyed
            out["peak_mb"] = _maxrss_mb()
        return out

    return asyncio.run(main())


# ---------------------------------------------------------------------------------------------
# the table

def _pass(value: float | None, target: float) -> str:
    if value is None:
        return "----"
    return "PASS" if value <= target else "MISS"


def measure(n: int, repeat: int, starts: int, app: bool, tmp: Path, log) -> dict:
    from tests.support.synthetic_walk import synthetic_walk_text

    path = tmp / f"synthetic_{n}.toml"
    path.write_text(synthetic_walk_text(n), encoding="utf-8")
    log(f"  {n:,} runs: {path.stat().st_size / 1024:,.0f} KiB file; measuring the model...")
    out: dict = {"runs": n}
    out.update(_child("core", "--file", str(path), "--repeat", str(repeat)))
    out.update(_child("memory", "--file", str(path)))
    out.update(_child("tracemalloc", "--file", str(path)))
    out["open_ratio"] = out["open_ms"] / out["tomllib_ms"]
    out["save_ratio"] = out["save_ms"] / out["tomli_w_ms"]
    out["peak_mb"] = out["model_rss_mb"]
    if not app:
        return out
    config = _config_dir(tmp)
    sample = _sample_walk()
    if sample is None:  # no sample walks yet: a synthetic one of the same size
        sample = tmp / "synthetic_300.toml"
        sample.write_text(synthetic_walk_text(300), encoding="utf-8")
    out["sample_walk"] = str(sample.relative_to(ROOT) if sample.is_relative_to(ROOT) else sample)
    if sample.parent != tmp:  # the app locks and may save what it opens: work on a copy
        copy = tmp / sample.name
        copy.write_bytes(sample.read_bytes())
        sample = copy
    log(f"  app start on {out['sample_walk']} against a bare Textual app, {starts} processes each...")
    bare, start = [], []
    for _ in range(starts):
        bare.append(_child("bare")["first_paint_s"])
        start.append(_child("app", "--file", str(sample), "--config", str(config)))
    out["bare_start_s"] = min(bare)
    out["start_s"] = min(o["first_paint_s"] for o in start)
    out["start_sized_s"] = min(o["sized_paint_s"] for o in start)
    out["start_ratio"] = out["start_s"] / out["bare_start_s"]
    log(f"  app open of the {n:,}-run walk, scrolling and filtering...")
    opens = [_child("app", "--file", str(path), "--config", str(config), "--keys")
             for _ in range(max(1, starts // 2))]
    best = min(opens, key=lambda o: o["first_paint_s"])
    out["first_paint_s"] = best["first_paint_s"]
    out["sized_paint_s"] = min(o["sized_paint_s"] for o in opens)
    out["worst_scroll_ms"] = min(o["worst_scroll_ms"] for o in opens)
    out["worst_filter_ms"] = min(o["worst_filter_ms"] for o in opens)
    out["worst_key_ms"] = max(out["worst_scroll_ms"], out["worst_filter_ms"])
    out["app_rss_mb"] = max(o["peak_mb"] for o in opens)
    out["peak_mb"] = max(out["model_rss_mb"], out["app_rss_mb"])
    return out


def _cpu() -> str:
    try:
        for line in Path("/proc/cpuinfo").read_text().splitlines():
            if line.startswith("model name"):
                return line.split(":", 1)[1].strip()
    except OSError:
        pass
    return "unknown CPU"


def table(r: dict) -> str:
    n = r["runs"]
    rows = [
        ("open (load_walk + compute_job)", f"{r['open_ms']:.0f} ms",
         f"tomllib parse {r['tomllib_ms']:.0f} ms", f"{r['open_ratio']:.2f}x", "<= 2x",
         _pass(r["open_ratio"], TARGETS["open_ratio"])),
        ("full recompute (compute_job)", f"{r['recompute_ms']:.1f} ms", "", "", "<= 100 ms",
         _pass(r["recompute_ms"], TARGETS["recompute_ms"])),
        ("one-run edit to results + totals", f"{r['edit_ms']:.1f} ms",
         f"median {r['edit_median_ms']:.1f} ms", "", "<= 20 ms", _pass(r["edit_ms"], TARGETS["edit_ms"])),
        ("save (dumps_walk)", f"{r['save_ms']:.0f} ms", f"tomli_w dump {r['tomli_w_ms']:.0f} ms",
         f"{r['save_ratio']:.2f}x", "<= 1.5x", _pass(r["save_ratio"], TARGETS["save_ratio"])),
    ]
    if "start_ratio" in r:
        rows += [
            ("app start to first paint (sample walk)", f"{r['start_s']:.2f} s",
             f"bare Textual app {r['bare_start_s']:.2f} s; sized {r['start_sized_s']:.2f} s",
             f"{r['start_ratio']:.2f}x", "<= 1.5x",
             _pass(r["start_ratio"], TARGETS["start_ratio"])),
            (f"app open to first paint ({n:,} runs)", f"{r['first_paint_s']:.2f} s",
             f"sized {r['sized_paint_s']:.2f} s", "", "<= 1.5 s",
             _pass(r["first_paint_s"], TARGETS["first_paint_s"])),
            ("worst key to repaint, scrolling", f"{r['worst_scroll_ms']:.0f} ms", "", "", "<= 100 ms",
             _pass(r["worst_scroll_ms"], TARGETS["worst_key_ms"])),
            ("worst key to repaint, filtering", f"{r['worst_filter_ms']:.0f} ms", "", "", "<= 100 ms",
             _pass(r["worst_filter_ms"], TARGETS["worst_key_ms"])),
        ]
    rows.append(("peak memory (largest RSS)", f"{r['peak_mb']:.0f} MB",
                 f"model only {r['model_rss_mb']:.0f} MB", f"traced {r['traced_peak_mb']:.0f} MB",
                 "<= 200 MB", _pass(r["peak_mb"], TARGETS["peak_mb"])))
    head = ("figure", "measured", "baseline / detail", "ratio", "target", "")
    widths = [max(len(str(row[i])) for row in rows + [head]) for i in range(6)]
    lines = ["  ".join(str(c).ljust(w) for c, w in zip(head, widths)).rstrip()]
    lines.append("  ".join("-" * w for w in widths))
    lines += ["  ".join(str(c).ljust(w) for c, w in zip(row, widths)).rstrip() for row in rows]
    extra = (f"for information: whole app edit step (put_run with atomic save, rebuilt run sheet) "
             f"{r['app_edit_ms']:.0f} ms; footage view rebuilt from the takeoff (only while it is "
             f"shown) {r['footage_ms']:.0f} ms; save_walk to disk {r['save_file_ms']:.0f} ms; "
             f"incremental edit equals a full recompute: {'yes' if r['edit_matches_full'] else 'NO'}")
    return "\n".join(lines) + "\n" + extra


SCALED = ("open_ms", "tomllib_ms", "recompute_ms", "save_ms", "tomli_w_ms", "edit_ms",
          "first_paint_s", "peak_mb")


def scaling_table(results: list[dict]) -> tuple[str, dict]:
    lines = ["figure          " + "".join(f"{r['runs']:>14,}" for r in results)
             + "   per run at each size" + "   linear"]
    verdicts = {}
    for key in SCALED:
        if not all(key in r for r in results):
            continue
        vals = [r[key] for r in results]
        unit = "s" if key.endswith("_s") else ("MB" if key.endswith("_mb") else "ms")
        per = [v / r["runs"] * (1e6 if unit == "s" else 1e3) for v, r in zip(vals, results)]
        per_unit = {"s": "us", "ms": "us", "MB": "kB"}[unit]
        ok = per[-1] <= LINEAR_SLACK * min(per[:-1])
        verdicts[key] = ok
        lines.append(f"{key:<16}" + "".join(f"{v:>12.3g} {unit:<1}" for v in vals)
                     + "   " + " / ".join(f"{p:.3g}" for p in per) + f" {per_unit}"
                     + f"   {'PASS' if ok else 'MISS'}")
    return "\n".join(lines), verdicts


# ---------------------------------------------------------------------------------------------

def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m bench.benchmarks", description=__doc__.split("\n")[0])
    parser.add_argument("--runs", type=int, default=TARGET_RUNS, help="runs in the synthetic walk")
    parser.add_argument("--json", action="store_true", help="end with one JSON object")
    parser.add_argument("--scaling", action="store_true",
                        help=f"measure at {', '.join(f'{s:,}' for s in SCALING_SIZES)} runs")
    parser.add_argument("--repeat", type=int, default=5, help="timed repeats of each model step")
    parser.add_argument("--starts", type=int, default=4, help="app start-up processes per figure")
    parser.add_argument("--no-app", action="store_true", help="skip the app figures")
    parser.add_argument("--child", help=argparse.SUPPRESS)
    parser.add_argument("--file", help=argparse.SUPPRESS)
    parser.add_argument("--config", help=argparse.SUPPRESS)
    parser.add_argument("--keys", action="store_true", help=argparse.SUPPRESS)
    args = parser.parse_args(argv)

    if args.child:
        t0 = time.perf_counter()
        path = Path(args.file) if args.file else None
        if args.child == "core":
            out = child_core(path, args.repeat)
        elif args.child == "memory":
            out = child_memory(path)
        elif args.child == "tracemalloc":
            out = child_tracemalloc(path)
        elif args.child == "bare":
            out = child_bare(t0)
        elif args.child == "app":
            out = child_app(t0, path, Path(args.config), args.keys)
        else:
            parser.error(f"unknown step {args.child}")
        print(json.dumps(out))
        return 0

    if args.runs < 1:
        parser.error("--runs must be at least 1")

    def log(text: str) -> None:
        print(text, file=sys.stderr, flush=True)

    machine = f"{os.cpu_count()} cores, {_cpu()}, Python {sys.version.split()[0]}"
    print(f"gaugewalk benchmarks on {machine}")
    with tempfile.TemporaryDirectory() as tmp_name:
        tmp = Path(tmp_name)
        if args.scaling:
            results = []
            for n in SCALING_SIZES:
                results.append(measure(n, max(2, args.repeat if n <= 5000 else 2), 2,
                                       not args.no_app, tmp, log))
            text, verdicts = scaling_table(results)
            print(text)
            at_target = next(r for r in results if r["runs"] == TARGET_RUNS)
            summary = dict(at_target, scaling=results, linear=verdicts, machine=machine)
        else:
            r = measure(args.runs, args.repeat, args.starts, not args.no_app, tmp, log)
            print(f"{args.runs:,} runs (targets at {TARGET_RUNS:,})")
            print(table(r))
            summary = dict(r, machine=machine,
                           passed={k: r[k] <= t for k, t in TARGETS.items() if k in r})
    if args.json:
        for key in JSON_KEYS:  # always present; None when not measured (--no-app)
            summary.setdefault(key, None)
        print(json.dumps(summary))
    return 0


if __name__ == "__main__":
    sys.exit(main())
