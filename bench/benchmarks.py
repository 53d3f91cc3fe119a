"""Speed targets of gaugewalk as ratios to baselines measured in the same run; run by hand, never by
the test suite.

    python -m bench.benchmarks --runs 5000            # the table, PASS/MISS beside each target
    python -m bench.benchmarks --runs 5000 --json     # ... and one JSON object on the last line
    python -m bench.benchmarks --scaling              # cost per run at 500, 5,000, 50,000 runs
    python -m bench.benchmarks --runs 5000 --scale 50000   # ... and the model's cost per run at
                                                           # 50,000 against 5,000 (a few minutes)

Every target divides a figure by a baseline taken in the same run on the same machine (a bare
interpreter, a bare Textual app, ``tomllib`` parsing the same walk, ``tomli_w`` writing it, one
frame at 60 frames a second), so it holds on a faster or slower machine alike; the absolute times
are printed beside them only as what this machine measured. Where each figure comes from:
``bench/commands.py`` (the headless commands as whole processes), ``bench/model_steps.py`` (open,
recompute, edit, save), ``bench/app_steps.py`` (the app through Textual's Pilot: start, keys,
storing a run from the run card, the event loop's stalls). Each group runs in a fresh process.

Timings are the best of ``--repeat`` interleaved runs (start-up: of ``--starts`` processes, the
app with the N-run walk: of half as many) on a machine that may be busy with other work; ratios
divide best by best. gaugewalk's modules are byte-compiled first, as an installed copy's are
(``bench.timing.compile_package``).
"""

from __future__ import annotations

import argparse
import json
import os
import subprocess
import sys
import tempfile
import time
from dataclasses import dataclass
from pathlib import Path

from bench.timing import ROOT, compile_package


@dataclass(frozen=True)
class Target:
    key: str       # the figure's key in the JSON line
    limit: float   # the figure passes at or below this
    figure: str    # what is measured, over what


FRAME_MS = 1000.0 / 60.0

TARGETS: tuple[Target, ...] = (
    Target("calc_ratio", 4.0, "`gaugewalk calc`, one run, whole process / bare `python -c pass`"),
    Target("check_ratio", 3.0,
           "`gaugewalk check` of the sample walk / a process only parsing it (tomllib)"),
    Target("open_ratio", 1.5, "open: load_walk + compute_job / tomllib parse"),
    Target("save_ratio", 1.0, "save: dumps_walk / tomli_w.dumps"),
    Target("recompute_ratio", 0.25, "full recompute: compute_job / tomllib parse"),
    Target("edit_ratio", 0.02, "one-run edit to results and totals / tomllib parse"),
    Target("app_edit_ratio", 0.15,
           "app: store a run, Enter to saved and repainted / tomllib parse"),
    Target("stall_frames", 1.0,
           "app: longest event-loop stall, typing and storing / one frame (1/60 s)"),
    Target("start_ratio", 1.3, "app start to first row, sample walk / bare Textual app"),
    Target("start_sized_ratio", 1.5,
           "app start to first sized row, sample walk / bare Textual app"),
    Target("sized_ratio", 2.0, "first sized row / first shown row, N runs"),
    Target("worst_key_ms", 50.0, "worst key to repaint: scrolling, filtering, run card [ms]"),
    Target("peak_mb", 200.0, "peak memory, largest resident set [MB]"),
)
TARGET_RUNS = 5000
SCALING_SIZES = (500, 5000, 50000)
LINEAR_SLACK = 1.5
"""Cost grows linearly when the cost per run at 50,000 runs is at most this many times the cost
per run at 5,000."""
SCALED = ("open_ms", "tomllib_ms", "recompute_ms", "save_ms", "tomli_w_ms", "edit_ms",
          "app_edit_ms", "first_paint_s", "sized_paint_s", "peak_mb")
MODEL_SCALED = ("open_ms", "tomllib_ms", "recompute_ms", "save_ms", "tomli_w_ms", "edit_ms")
"""The figures ``--scale`` measures at its size (and the peak memory of the model)."""
JSON_KEYS = (("open_ratio", "save_ratio", "edit_ms", "recompute_ms", "start_ratio",
              "first_paint_s", "peak_mb", "app_edit_ms", "start_sized_s", "sized_paint_s")
             + tuple(t.key for t in TARGETS))
"""Always in the JSON line (None when not measured, e.g. with ``--no-app``)."""


# ---------------------------------------------------------------------------------------------
# measuring

def _child(name: str, *args: str, timeout: float = 1800.0) -> dict:
    """Run one measurement in a fresh interpreter; its last stdout line is a JSON object."""
    cmd = [sys.executable, "-m", "bench.benchmarks", "--child", name, *args]
    done = subprocess.run(cmd, cwd=ROOT, capture_output=True, text=True, timeout=timeout)
    lines = done.stdout.strip().splitlines()
    if done.returncode != 0 or not lines:
        raise RuntimeError(f"benchmark step {name} failed:\n{done.stderr[-3000:]}")
    return json.loads(lines[-1])


def ratios(r: dict) -> None:
    """Each target's ratio from the figures measured (those present)."""
    pairs = {
        "calc_ratio": ("calc_s", "python_s"), "check_ratio": ("check_s", "check_parse_s"),
        "open_ratio": ("open_ms", "tomllib_ms"), "save_ratio": ("save_ms", "tomli_w_ms"),
        "recompute_ratio": ("recompute_ms", "tomllib_ms"), "edit_ratio": ("edit_ms", "tomllib_ms"),
        "app_edit_ratio": ("app_edit_ms", "tomllib_ms"), "start_ratio": ("start_s", "bare_start_s"),
        "start_sized_ratio": ("start_sized_s", "bare_start_s"),
        "sized_ratio": ("sized_paint_s", "first_paint_s"),
    }
    for key, (num, den) in pairs.items():
        if num in r and den in r:
            r[key] = r[num] / r[den]
    if "edit_stall_ms" in r:
        r["stall_frames"] = r["edit_stall_ms"] / FRAME_MS


def measure(n: int, repeat: int, starts: int, app: bool, stores: int, whole: bool, tmp: Path,
            log, instructions: bool = False) -> dict:
    """Every figure at ``n`` runs; ``whole`` adds those that do not depend on ``n`` (the
    headless commands and the app start on the sample walk), and with ``instructions`` the
    headless check's instruction count beside its baseline's, for information."""
    from bench.commands import command_figures, instruction_figures
    from bench.walks import SAMPLE, config_dir, sample_copy, synthetic_file

    path = synthetic_file(tmp, n)
    log(f"  {n:,} runs: {path.stat().st_size / 1024:,.0f} KiB file; the model...")
    out: dict = {"runs": n}
    out.update(_child("core", "--file", str(path), "--repeat", str(repeat)))
    out.update(_child("memory", "--file", str(path)))
    out.update(_child("tracemalloc", "--file", str(path)))
    out["peak_mb"] = out["model_rss_mb"]
    if whole:
        log(f"  headless commands on {SAMPLE.name}, {starts * 2} processes each...")
        out.update(command_figures(SAMPLE, starts * 2))
        out["sample_walk"] = str(SAMPLE.relative_to(ROOT))
        if instructions:
            log(f"  check of {SAMPLE.name} and its baseline under valgrind (callgrind)...")
            counted = instruction_figures(SAMPLE)
            if not counted:
                log("  (valgrind is not installed or counted nothing: no instruction figures)")
            out.update(counted)
    if app:
        config = config_dir(tmp)
        if whole:
            log(f"  app start on {SAMPLE.name} against a bare Textual app, "
                f"{starts} processes each...")
            sample = sample_copy(tmp)
            bare, start = [], []
            for _ in range(starts):
                bare.append(_child("bare")["first_paint_s"])
                start.append(_child("app", "--file", str(sample), "--config", str(config)))
            out["bare_start_s"] = min(bare)
            out["start_s"] = min(o["first_paint_s"] for o in start)
            out["start_sized_s"] = min(o["sized_paint_s"] for o in start)
        procs = max(1, starts // 2)
        log(f"  app on the {n:,}-run walk: scrolling, filtering, {stores} runs stored; "
            f"{procs} process(es)...")
        opens = [_child("app", "--file", str(path), "--config", str(config), "--keys",
                        "--stores", str(stores)) for _ in range(procs)]
        for key in ("first_paint_s", "sized_paint_s", "worst_scroll_ms", "worst_filter_ms",
                    "worst_card_ms", "worst_typing_ms", "app_edit_ms", "app_edit_median_ms",
                    "edit_stall_ms", "open_stall_ms", "typing_stall_ms", "store_stall_ms"):
            out[key] = min(o[key] for o in opens)
        for key in ("app_edit_worst_ms", "edit_stall_worst_ms", "frames_dropped"):
            out[key] = max(o[key] for o in opens)
        out["worst_key_ms"] = max(out["worst_scroll_ms"], out["worst_filter_ms"],
                                  out["worst_card_ms"], out["worst_typing_ms"])
        out["app_rss_mb"] = max(o["peak_mb"] for o in opens)
        out["head_start_rss_mb"] = max(o["head_start_mb"] for o in opens)
        out["peak_mb"] = max(out["model_rss_mb"], out["app_rss_mb"], out["head_start_rss_mb"])
    ratios(out)
    return out


def model_scale(at: dict, n: int, repeat: int, tmp: Path, log) -> tuple[str, dict]:
    """The model figures at ``n`` runs (the core, memory and tracemalloc steps, as ``measure``
    takes them) beside those of ``at``: the table of cost per run and, for the JSON line,
    ``{"runs", "growth" {figure: cost per run at n / at at's size}, "linear" {figure: PASS},
    "passed"}``. Memory is the model's resident set at both sizes (``at``'s peak may be the
    app's)."""
    from bench.report import scaling_table
    from bench.walks import synthetic_file

    path = synthetic_file(tmp, n)
    log(f"  {n:,} runs: {path.stat().st_size / 1024:,.0f} KiB file; the model...")
    big: dict = {"runs": n}
    big.update(_child("core", "--file", str(path), "--repeat", str(max(2, repeat // 3))))
    big.update(_child("memory", "--file", str(path)))
    big["peak_mb"] = big["model_rss_mb"]
    ratios(big)
    small = {key: at[key] for key in MODEL_SCALED if key in at}
    small.update(runs=at["runs"], peak_mb=at["model_rss_mb"])
    text, verdicts = scaling_table([small, big], LINEAR_SLACK, ref_runs=at["runs"])
    growth = {key: (big[key] / n) / (small[key] / at["runs"]) for key in verdicts}
    return text, {"runs": n, "growth": growth, "linear": verdicts,
                  "passed": all(verdicts.values()), "figures": big}


def _cpu() -> str:
    try:
        for line in Path("/proc/cpuinfo").read_text().splitlines():
            if line.startswith("model name"):
                return line.split(":", 1)[1].strip()
    except OSError:
        pass
    return "unknown CPU"


# ---------------------------------------------------------------------------------------------

def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m bench.benchmarks",
                                     description=__doc__.split("\n")[0])
    parser.add_argument("--runs", type=int, default=TARGET_RUNS, help="runs in the synthetic walk")
    parser.add_argument("--json", action="store_true", help="end with one JSON object")
    parser.add_argument("--scaling", action="store_true",
                        help=f"measure at {', '.join(f'{s:,}' for s in SCALING_SIZES)} runs")
    parser.add_argument("--repeat", type=int, default=9, help="timed repeats of each model step")
    parser.add_argument("--starts", type=int, default=4,
                        help="app start-up processes per figure (headless commands: twice as many)")
    parser.add_argument("--stores", type=int, default=4,
                        help="runs stored from the run card per app process")
    parser.add_argument("--no-app", action="store_true", help="skip the app figures")
    parser.add_argument("--instructions", action="store_true",
                        help="also count the instructions of check and its baseline under "
                             "valgrind, for information (about a minute more)")
    parser.add_argument("--scale", type=int, metavar="N",
                        help="also measure the model figures (open, recompute, edit, save, memory) "
                             "at N runs and print their cost per run against --runs, PASS within "
                             f"{LINEAR_SLACK:g}x")
    parser.add_argument("--child", help=argparse.SUPPRESS)
    parser.add_argument("--file", help=argparse.SUPPRESS)
    parser.add_argument("--config", help=argparse.SUPPRESS)
    parser.add_argument("--keys", action="store_true", help=argparse.SUPPRESS)
    args = parser.parse_args(argv)

    if args.child:
        t0 = time.perf_counter()
        out = _run_child(args, t0)
        if out is None:
            parser.error(f"unknown step {args.child}")
        print(json.dumps(out))
        return 0

    if args.runs < 1:
        parser.error("--runs must be at least 1")
    if args.scale is not None and (args.scaling or args.scale <= args.runs):
        parser.error("--scale takes a number of runs above --runs, without --scaling")
    from bench.report import scaling_table, table

    def log(text: str) -> None:
        print(text, file=sys.stderr, flush=True)

    began = time.perf_counter()
    compile_package()
    machine = f"{os.cpu_count()} cores, {_cpu()}, Python {sys.version.split()[0]}"
    print(f"gaugewalk benchmarks on {machine}")
    with tempfile.TemporaryDirectory() as tmp_name:
        tmp = Path(tmp_name)
        if args.scaling:
            results = []
            for n in SCALING_SIZES:  # 5,000 as without --scaling; fewer repeats elsewhere
                at = n == TARGET_RUNS
                repeat = args.repeat if at else (max(2, args.repeat // 3) if n < TARGET_RUNS else 2)
                results.append(measure(
                    n, repeat, args.starts if at else 2, not args.no_app, args.stores if at else 2,
                    at, Path(tempfile.mkdtemp(dir=tmp)), log, args.instructions and at))
            text, verdicts = scaling_table(results, LINEAR_SLACK)
            at_target = next(r for r in results if r["runs"] == TARGET_RUNS)
            print(table(at_target, TARGETS))
            print(text)
            summary = dict(at_target, scaling=results, linear=verdicts)
        else:
            summary = measure(args.runs, args.repeat, args.starts, not args.no_app, args.stores,
                              True, tmp, log, args.instructions)
            print(table(summary, TARGETS))
            if args.scale:
                text, scale = model_scale(summary, args.scale, args.repeat,
                                          Path(tempfile.mkdtemp(dir=tmp)), log)
                print(text)
                summary["scale"] = scale
    took = time.perf_counter() - began
    print(f"(the benchmark took {took / 60:.1f} min on this machine)")
    summary.update(
        machine=machine, took_s=took,
        targets={t.key: t.limit for t in TARGETS},
        passed={t.key: summary[t.key] <= t.limit for t in TARGETS if t.key in summary},
    )
    if args.json:
        for key in JSON_KEYS:
            summary.setdefault(key, None)
        print(json.dumps(summary))
    return 0


def _run_child(args, t0: float) -> dict | None:
    if args.child != "bare" and not args.file:
        raise SystemExit(f"--child {args.child} needs --file")
    path = Path(args.file or ".")
    if args.child in ("core", "memory", "tracemalloc"):
        from bench import model_steps

        if args.child == "core":
            return model_steps.child_core(path, args.repeat)
        return getattr(model_steps, f"child_{args.child}")(path)
    if args.child == "bare":
        from bench.app_steps import child_bare

        return child_bare(t0)
    if args.child == "app":
        from bench.app_steps import child_app

        return child_app(t0, path, Path(args.config), args.keys, args.stores if args.keys else 0)
    return None


if __name__ == "__main__":
    sys.exit(main())
