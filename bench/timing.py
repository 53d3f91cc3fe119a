"""Timing helpers of the benchmark: best of interleaved repeats, whole processes, memory."""

from __future__ import annotations

import gc
import statistics
import subprocess
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent  # the repository


def timed(fn) -> float:
    """Wall time of ``fn()`` [ms], with the young-generation garbage collection its result leaves
    pending (code that holds the collector while it allocates pays for it here, as it would in the
    app at its next allocation); the result is kept alive until then."""
    t = time.perf_counter()
    out = fn()
    gc.collect(0)
    elapsed = (time.perf_counter() - t) * 1000.0
    del out
    return elapsed


def best(fn, repeat: int) -> tuple[float, float]:
    """(best, median) of ``timed(fn)`` [ms]."""
    times = [timed(fn) for _ in range(repeat)]
    return min(times), statistics.median(times)


def interleaved(fns: dict, repeat: int) -> dict[str, tuple[float, float]]:
    """Best and median [ms] of several functions measured in turn, so a busy machine slows all
    alike."""
    times: dict[str, list[float]] = {k: [] for k in fns}
    for _ in range(repeat):
        for name, fn in fns.items():
            times[name].append(timed(fn))
    return {k: (min(v), statistics.median(v)) for k, v in times.items()}


def process_best(commands: dict[str, list[str]], starts: int,
                 ok: dict[str, tuple[int, ...]] | None = None) -> dict[str, float]:
    """Best wall time [s] of each command run as a whole process (start to exit), the commands
    taken in turn ``starts`` times so a busy machine slows all alike. Output is discarded; a
    command that exits other than 0 (or ``ok[name]``) raises, so a broken command is never timed
    as a fast one."""
    times: dict[str, list[float]] = {k: [] for k in commands}
    for _ in range(starts):
        for name, cmd in commands.items():
            t = time.perf_counter()
            done = subprocess.run(cmd, cwd=ROOT, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE,
                                  stdin=subprocess.DEVNULL)
            times[name].append(time.perf_counter() - t)
            if done.returncode not in (ok or {}).get(name, (0,)):
                raise RuntimeError(f"{' '.join(cmd)} exited {done.returncode}:\n"
                                   f"{done.stderr.decode(errors='replace')[-2000:]}")
    return {k: min(v) for k, v in times.items()}


def compile_package() -> None:
    """Byte-compile gaugewalk's modules beside their sources, as pip does when it installs a
    wheel, so every process measured starts as an installed gaugewalk does. Without it, in an
    editable install run with ``PYTHONDONTWRITEBYTECODE`` set (or from a read-only tree), each
    process would compile every gaugewalk module it imports from source (about 20 ms for ``calc``
    here), a cost no installed copy pays after its first start."""
    import compileall

    for top in ("tables", "model", "tui"):
        if not compileall.compile_dir(ROOT / top, quiet=1):
            raise RuntimeError(f"{top}/ does not compile")


def maxrss_mb(children: bool = False) -> float:
    """The largest resident set of this process so far [MB]; with ``children``, the largest of
    its child processes ended and waited for."""
    import resource

    who = resource.RUSAGE_CHILDREN if children else resource.RUSAGE_SELF
    return resource.getrusage(who).ru_maxrss / 1024.0  # Linux: KiB
