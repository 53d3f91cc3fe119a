"""Speed of the walk core, run by hand (never by the test suite)::

    .venv/bin/python tests/benchmarks_walk.py

Targets: ``compute_job`` on about 5,000 runs in about 100 ms (engine permitting), a one-run
edit through ``recompute_run`` in under 20 ms, loading and saving the walk in well under a second.
The walk is 13 copies of the sample warehouse (each with its own service), so every run is one a
real walk could hold.
"""

from __future__ import annotations

import importlib.util
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from model.compute import compute_job, recompute_run  # noqa: E402
from model.job import Job, Load  # noqa: E402
from model.walkfile import dumps_walk, loads_walk  # noqa: E402


def big_walk(copies: int = 13) -> Job:
    spec = importlib.util.spec_from_file_location("make_warehouse", ROOT / "sample_walks" / "make_warehouse.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    one = module.build()
    sources, runs = [], []
    for n in range(copies):
        p = f"B{n}-"
        sources += [s.model_copy(update={"id": p + s.id}) for s in one.sources]
        for r in one.runs:
            to = p + r.to if one.source(r.to) is not None else r.to
            runs.append(r.model_copy(update={"id": p + r.id, "from_": p + r.from_, "to": to}))
    return Job(job=one.job, defaults=one.defaults, sources=sources, runs=runs)


def timed(label: str, fn, repeat: int = 3):
    best = float("inf")
    out = None
    for _ in range(repeat):
        t0 = time.perf_counter()
        out = fn()
        best = min(best, time.perf_counter() - t0)
    print(f"{label:<40} {best * 1000:8.1f} ms")
    return out


def main() -> int:
    job = big_walk()
    print(f"{len(job.runs)} runs, {len(job.sources)} sources")
    result = timed("compute_job", lambda: compute_job(job))
    branch = job.run("B5-L1A-05")
    branch.length = "95"
    timed("recompute_run, branch length", lambda: recompute_run(job, result, branch.id))

    def load_edit():
        branch.load = Load(value=branch.load.value + 60, unit="VA")
        return recompute_run(job, result, branch.id)

    timed("recompute_run, branch load (chain up)", load_edit)
    text = timed("dumps_walk", lambda: dumps_walk(job))
    timed("loads_walk (parse, validate, check)", lambda: loads_walk(text), repeat=1)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
