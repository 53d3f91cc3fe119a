"""The model figures, each group measured in a fresh process (``--child core``, ``memory``,
``tracemalloc``), with the baselines they are divided by measured beside them.

- open: ``load_walk`` (read, parse, migrate, validate, cross-check) plus ``compute_job``;
  baseline: ``tomllib`` parsing the same file.
- full recompute: ``compute_job`` on the open walk.
- one-run edit: the run card's validated ``Run`` stored with ``WalkSession.put_run`` in place of
  the old one (its checks, the incremental recompute of the run, the feeders above it and the drops
  below them) and the edited run-sheet row with the sheet's count of flagged runs moved by that
  row, as the sheet keeps it (``RunSheet.flagged``); the save that
  follows in the app is left out here (it is the save figure) and checked not to happen.
- save: ``dumps_walk``; baseline: ``tomli_w`` dumping the data ``tomllib`` read from the same file.
- open and full recompute are cold: the caches keyed by a run's own inputs (a load's design
  current and device, ``gaugewalk.model.engine.sizing.forget_loads``; a length's text,
  ``gaugewalk.model.walk.job.parse_length``; whether a name reads as a sign,
  ``gaugewalk.model.walk.vocabulary.sign_in_name``) are emptied inside each timed repeat, so a
  repeat of the same walk gains nothing from the one before; the caches keyed by the tables stay
  warm.
- for information: ``put_run`` with its save to disk, every run-sheet row rebuilt, ``save_walk``
  on its own, and the footage view's rebuild from the takeoff.
"""

from __future__ import annotations

import statistics
import tempfile
import time
from pathlib import Path

from bench.timing import best, interleaved, maxrss_mb
from bench.walks import deepest_branch


def child_core(path: Path, repeat: int) -> dict:
    """Open, recompute, one-run edit and save on the model, with their baselines."""
    import tomllib

    import tomli_w

    from gaugewalk.model.engine.sizing import forget_loads
    from gaugewalk.model.session.session import WalkSession
    from gaugewalk.model.walk.compute import JobResult, compute_job
    from gaugewalk.model.walk.job import Run, parse_length
    from gaugewalk.model.walk.takeoff import build_takeoff
    from gaugewalk.model.walk.vocabulary import sign_in_name
    from gaugewalk.model.walkfile.read import load_walk
    from gaugewalk.model.walkfile.write import dumps_walk, save_walk
    from gaugewalk.tui.app.sheet.rows import all_rows, sheet_row

    def cold() -> None:
        forget_loads()
        parse_length.cache_clear()
        sign_in_name.cache_clear()

    def open_walk():
        cold()
        job = load_walk(path)
        return job, compute_job(job)

    def recompute_cold():
        cold()
        return compute_job(job)

    def parse():
        with open(path, "rb") as fh:
            return tomllib.load(fh)

    opened = interleaved({"open": open_walk, "tomllib": parse}, repeat)
    job = load_walk(path)
    recompute = best(recompute_cold, repeat)

    raw_text = path.read_bytes()
    text = raw_text.decode("utf-8")
    data = tomllib.loads(text)
    assert dumps_walk(job) == text, "the synthetic file is not in the form gaugewalk saves"
    saved = interleaved({"dumps": lambda: dumps_walk(job), "tomli_w": lambda: tomli_w.dumps(data)},
                        repeat)

    # one-run edit: the deepest branch, its load changed so the feeders above it and the drop
    # below them move as well
    session = WalkSession(path, job)
    session.save = lambda: True  # type: ignore[method-assign]  # the save is its own figure
    target = deepest_branch(job)
    base = target.model_dump(by_alias=True, exclude_defaults=True)
    values = [target.load.value, target.load.value * 1.5]
    rows = all_rows(session)
    index = {row.key: i for i, row in enumerate(rows)}
    flagged = sum(row.flag for row in rows)
    edits: list[float] = []
    for i in range(max(repeat, 5) * 2):
        raw = dict(base, load=dict(base["load"], value=values[i % 2]))
        t = time.perf_counter()
        run = Run.model_validate(raw)                          # what the run card stores
        refusal = session.put_run(run, replaces=target.id)
        row = sheet_row(session, run)                           # the edited row
        old = rows[index[run.id]]
        rows[index[run.id]] = row
        flagged += row.flag - old.flag                          # the sheet's count of flagged
        #                                                         runs, kept as the sheet keeps it
        edits.append((time.perf_counter() - t) * 1000.0)
        if refusal:
            raise RuntimeError(f"the one-run edit was refused: {refusal}")
    if path.read_bytes() != raw_text:
        raise RuntimeError("the one-run edit wrote the walk file: put_run no longer saves through "
                           "WalkSession.save, so this figure would hold a save; measure it apart")
    full = compute_job(job)
    # WalkSession.result has no annotation yet (model/session), so mypy takes it for None
    edited: JobResult = session.result  # type: ignore[assignment]
    same = full.runs.keys() == edited.runs.keys() and all(
        (full.runs[k].size, round(full.runs[k].total_drop_pct, 9))
        == (edited.runs[k].size, round(edited.runs[k].total_drop_pct, 9))
        for k in full.runs
    )

    # for information: put_run with its save to disk, the rebuilt run sheet, save_walk alone
    with tempfile.TemporaryDirectory() as tmp:
        copy = Path(tmp) / path.name
        copy.write_text(text, encoding="utf-8")
        disk_session = WalkSession(copy, load_walk(copy))
        stores = []
        for i in range(max(repeat, 3)):
            raw = dict(base, load=dict(base["load"], value=values[(i + 1) % 2]))
            run = Run.model_validate(raw)
            t = time.perf_counter()
            disk_session.put_run(run, replaces=target.id)
            stores.append((time.perf_counter() - t) * 1000.0)
            if not disk_session.state.saved:
                raise RuntimeError(f"put_run did not save: {disk_session.state.message}")
        sheet = best(lambda: all_rows(disk_session), repeat)
        footage = best(
            lambda: build_takeoff(disk_session.job, disk_session.result).footage_by_size(),
            min(repeat, 3))
        save_times = []
        for i in range(repeat):  # a changed file each time, so it writes
            copy.write_text(text if i % 2 else text + "\n", encoding="utf-8")
            t = time.perf_counter()
            save_walk(disk_session.job, copy)
            save_times.append((time.perf_counter() - t) * 1000.0)

    return {
        "open_ms": opened["open"][0], "open_median_ms": opened["open"][1],
        "tomllib_ms": opened["tomllib"][0], "tomllib_median_ms": opened["tomllib"][1],
        "recompute_ms": recompute[0], "recompute_median_ms": recompute[1],
        "save_ms": saved["dumps"][0], "save_median_ms": saved["dumps"][1],
        "tomli_w_ms": saved["tomli_w"][0], "tomli_w_median_ms": saved["tomli_w"][1],
        "edit_ms": min(edits), "edit_median_ms": statistics.median(edits),
        "edit_worst_ms": max(edits), "edit_run": target.id, "edit_matches_full": same,
        "put_run_saved_ms": min(stores), "sheet_rows_ms": sheet[0],
        "save_file_ms": min(save_times), "footage_ms": footage[0],
        "file_kb": len(raw_text) / 1024.0,
    }


def child_memory(path: Path) -> dict:
    """Resident set after opening and computing the walk (model only)."""
    from gaugewalk.model.walk.compute import compute_job
    from gaugewalk.model.walkfile.read import load_walk

    before = maxrss_mb()
    job = load_walk(path)
    result = compute_job(job)
    assert len(result.runs) == len(job.runs)
    return {"model_rss_mb": maxrss_mb(), "interpreter_rss_mb": before}


def child_tracemalloc(path: Path) -> dict:
    """Python allocations at their peak while opening and computing the walk."""
    import tracemalloc

    from gaugewalk.model.walk.compute import compute_job
    from gaugewalk.model.walkfile.read import load_walk

    tracemalloc.start()
    job = load_walk(path)
    result = compute_job(job)
    _, peak = tracemalloc.get_traced_memory()
    held, _ = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    assert len(result.runs) == len(job.runs)
    return {"traced_peak_mb": peak / 2**20, "traced_held_mb": held / 2**20}
