"""Kill a process that is writing a walk (SIGKILL at a random moment) and check what is left.

Used by ``tests/walkfile/test_durability_kills.py`` (a few hundred trials) and
``bench/soak_saves.py`` (as many as asked). Processes are forked from the test process, which has
the model imported already, so a trial costs milliseconds, not an interpreter start;
``spawn=True`` runs the real command line in a fresh interpreter instead (slower, for the soak).

The walks are invented: "Quarry Road bottling plant", a 208Y/120 V service, two panels and a few
dozen branch runs.

Public API:

- ``walk_versions(count, runs=40) -> list[Job]``: distinct walks; version k differs from k+1.
- ``SaveKillTrials(folder, versions)``: ``.run(trials, rng, max_delay_s)`` kills a child that
  saves version after version with ``save_walk``; returns a ``KillReport``.
- ``CommandKillTrials(folder, argv_for, setup)``: the same for one command run
  (``gaugewalk add``/``merge``) killed part way; the file must be the old or the new content.
- ``KillReport``: ``trials``, ``torn`` (list of what was wrong), ``mid_save`` (kills that left a
  temporary file, i.e. landed inside a save), ``finished`` (the child finished before the kill).
"""

from __future__ import annotations

import os
import random
import signal
import subprocess
import sys
import time
from dataclasses import dataclass, field
from pathlib import Path

from gaugewalk.model.walk.job import Job
from gaugewalk.model.walkfile.atomic import backup_path
from gaugewalk.model.walkfile.read import loads_walk
from gaugewalk.model.walkfile.write import dumps_walk, save_walk
from tests.support.paths import REPO
from tests.support.walks import make_job, run_table, source_table

_LOADS = ("Filler conveyor", "Capper", "Labeller", "Case packer", "Palletiser", "Rinse pump",
          "Bottle warmer", "Lab bench", "Break room", "Office lights", "Dock door", "Compressor")


def walk_versions(count: int, runs: int = 40) -> list[Job]:
    """``count`` invented walks; version k has its own job notes and run lengths, so no two
    neighbours are equal. Each is a valid walk."""
    out = []
    for k in range(count):
        sources = [
            source_table("SVC", "service", name="Service"),
            source_table("LP1", "panel", name="Filling hall"),
            source_table("LP2", "panel", name="Warehouse"),
        ]
        items = [run_table("F1", "SVC", "LP1", f"{60 + k}+12"),
                 run_table("F2", "SVC", "LP2", f"{140 + k}")]
        for i in range(runs):
            items.append(run_table(
                f"R{i + 1}", "LP1" if i % 2 else "LP2",
                f"{_LOADS[i % len(_LOADS)]} {i // len(_LOADS) + 1}",
                f"{30 + (i * 7 + k) % 90}+2*{6 + i % 4}",
                load=(4 + (i * 3 + k) % 16, "A"), notes=f"walked in pass {k}, stop {i}",
            ))
        out.append(make_job("Quarry Road bottling plant", notes=f"version {k}", sources=sources,
                            runs=items))
    return out


@dataclass
class KillReport:
    trials: int = 0
    torn: list[str] = field(default_factory=list)
    mid_save: int = 0
    finished: int = 0
    new_content: int = 0
    delays_s: list[float] = field(default_factory=list)

    def line(self, what: str) -> str:
        return (f"{what}: {self.trials} kills, {len(self.torn)} torn or wrong, {self.mid_save} "
                f"landed inside a save (temp file left), {self.new_content} left the new content, "
                f"{self.finished} finished before the kill")


def _leftovers(folder: Path, name: str) -> list[Path]:
    """Temporary files a save leaves when killed part way (``.NAME.*.tmp`` / ``.bak``)."""
    return [p for p in folder.iterdir()
            if p.name.startswith(f".{name}.") and p.name.endswith((".tmp", ".bak"))]


def _read(path: Path) -> bytes | None:
    try:
        return path.read_bytes()
    except FileNotFoundError:
        return None


def _kill(pid: int) -> None:
    try:
        os.kill(pid, signal.SIGKILL)
    except ProcessLookupError:
        pass


RUNNING = (0).to_bytes(8, "little")
"""What a save child writes to its pipe before its first save (versions reported are 2 and up)."""


class SaveKillTrials:
    """A child saves versions k+1, k+2, ... of the walk in a loop and writes each finished k to a
    pipe; it is killed after a random delay counted from its first turn (a marker it writes
    first). After the kill, with d the last version reported: the file is version d or d+1 and
    parses to that Job; the backup is version d-1 or d (d when the file is d+1) and parses."""

    def __init__(self, folder: Path, versions: list[Job]) -> None:
        self.folder = Path(folder)
        self.path = self.folder / "walk.toml"
        self.jobs = versions
        self.texts = [dumps_walk(j).encode("utf-8") for j in versions]
        self.n = len(versions)
        save_walk(self.jobs[0], self.path)
        save_walk(self.jobs[1], self.path)
        self.current = 1  # the file holds version 1, its backup version 0

    def _child(self, start: int, fd: int) -> None:
        try:
            os.write(fd, RUNNING)  # the parent's random delay starts once the child runs
            k = start
            while True:
                k += 1
                save_walk(self.jobs[k % self.n], self.path)
                os.write(fd, k.to_bytes(8, "little"))
        finally:
            os._exit(3)

    def _check(self, d: int, report: KillReport) -> None:
        file = _read(self.path)
        back = _read(backup_path(self.path))
        here, nxt, prev = (self.texts[(d + i) % self.n] for i in (0, 1, -1))
        if file == nxt:
            ok_back = back == here
            self.current = d + 1
        elif file == here:
            ok_back = back in (prev, here)
            self.current = d
        else:
            report.torn.append(f"trial {report.trials}: walk.toml is neither version {d} nor "
                               f"{d + 1} ({'missing' if file is None else f'{len(file)} bytes'})")
            return
        if not ok_back:
            report.torn.append(f"trial {report.trials}: walk.toml~ is not a whole earlier "
                               f"version ({'missing' if back is None else f'{len(back)} bytes'})")
        # whole means it reads back as a walk, equal to the version it claims to be
        if loads_walk(file.decode("utf-8"), self.path) != self.jobs[self.current % self.n]:
            report.torn.append(f"trial {report.trials}: walk.toml does not read back equal")
        if back is not None:
            loads_walk(back.decode("utf-8"), backup_path(self.path))

    def run(self, trials: int, rng: random.Random, max_delay_s: float = 0.03) -> KillReport:
        report = KillReport()
        for _ in range(trials):
            for left in _leftovers(self.folder, self.path.name):
                left.unlink()
            start = self.current
            r, w = os.pipe()
            pid = os.fork()
            if pid == 0:
                os.close(r)
                self._child(start, w)
            os.close(w)
            # on a busy machine a forked child may wait tens of milliseconds for its first turn;
            # timed from the fork, the kills would then mostly land before any save began
            data = os.read(r, len(RUNNING))
            delay = rng.uniform(0.0, max_delay_s)
            report.delays_s.append(delay)
            time.sleep(delay)
            _kill(pid)
            os.waitpid(pid, 0)
            data = data[len(RUNNING):]
            while chunk := os.read(r, 4096):
                data += chunk
            os.close(r)
            whole = len(data) // 8 * 8
            done = [int.from_bytes(data[i:i + 8], "little") for i in range(0, whole, 8)]
            d = done[-1] if done else start
            report.trials += 1
            if _leftovers(self.folder, self.path.name):
                report.mid_save += 1
            self._check(d, report)
        return report


class CommandKillTrials:
    """Run one command that rewrites ``target`` (``gaugewalk add``, ``merge``) and kill it part
    way. Before each trial ``target`` holds ``old`` and its backup ``old_backup``; after it,
    ``target`` must hold ``old`` or ``new`` (what a finished run writes, found by running it to
    the end first) and the backup must be whole: ``old`` when the file is ``new``.

    The kills come in turn in three kinds, each at a random moment: anywhere in the run (timed
    from three runs to the end), in the last quarter of the time before the rename that puts the
    new file in place (aimed at the save), and after that rename is seen, within what the run
    has left (its lock release and its message). The third kind is timed from the rename
    itself, not from the clock, so a slower machine still gives kills on both sides of it."""

    def __init__(self, folder: Path, target: Path, argv: list[str], old: bytes,
                 old_backup: bytes, *, spawn: bool = False) -> None:
        self.folder = Path(folder)
        self.target = Path(target)
        self.argv = argv
        self.old = old
        self.old_backup = old_backup
        self.spawn = spawn
        times, replaced_at = [], []
        for _ in range(3):
            before = self._reset()
            started = time.perf_counter()
            child = self._start()
            seen = self._watch(child, before, started, stop_at_rename=False)
            times.append(time.perf_counter() - started)
            if seen is not None:
                replaced_at.append(seen)
            status = self._wait(child)
            if status != 0:
                break
        self.duration_s = sorted(times)[len(times) // 2]
        self.replaced_at_s = sorted(replaced_at)[len(replaced_at) // 2] if replaced_at else None
        if status != 0:
            raise RuntimeError(f"{' '.join(argv)} did not succeed on the untouched walk ({status})")
        new = _read(self.target)
        if new is None or new == old:
            raise RuntimeError(f"{' '.join(argv)} did not change {self.target.name}")
        self.new = new

    def _reset(self) -> int:
        """Put the old file and backup back; return the file's inode."""
        for left in _leftovers(self.folder, self.target.name):
            left.unlink()
        # a save killed between its two renames leaves the file and its backup as one inode
        # (hard links): unlink first, so writing one does not write the other
        for path, data in ((self.target, self.old), (backup_path(self.target), self.old_backup)):
            path.unlink(missing_ok=True)
            path.write_bytes(data)
        return os.stat(self.target).st_ino

    def _start(self) -> int | subprocess.Popen:
        if self.spawn:
            return subprocess.Popen([sys.executable, "-m", "gaugewalk.tui.cli.main", *self.argv],
                                    cwd=REPO, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
        pid = os.fork()
        if pid == 0:
            code = 3
            try:
                devnull = os.open(os.devnull, os.O_WRONLY)
                os.dup2(devnull, 1)
                os.dup2(devnull, 2)
                from gaugewalk.tui.cli.main import main

                code = main(list(self.argv))
            finally:
                os._exit(code)
        return pid

    def _wait(self, child) -> int:
        if isinstance(child, subprocess.Popen):
            return child.wait()
        _, status = os.waitpid(child, 0)
        return os.waitstatus_to_exitcode(status)

    def _ended(self, child) -> bool:
        """Whether the child has ended (it is not reaped: ``_wait`` gives its status)."""
        if isinstance(child, subprocess.Popen):
            return child.poll() is not None
        return os.waitid(os.P_PID, child, os.WEXITED | os.WNOHANG | os.WNOWAIT) is not None

    def _watch(self, child, before: int, started: float, *, stop_at_rename: bool) -> float | None:
        """Poll until the child ends (or, with ``stop_at_rename``, until the new file is in
        place); return when the rename was seen [s after ``started``], None if it was not."""
        seen = None
        while True:
            if seen is None:
                try:
                    if os.stat(self.target).st_ino != before:
                        seen = time.perf_counter() - started
                        if stop_at_rename:
                            return seen
                except FileNotFoundError:
                    pass
            if self._ended(child):
                return seen
            time.sleep(0.0002)

    def run(self, trials: int, rng: random.Random) -> KillReport:
        report = KillReport()
        for n in range(trials):
            before = self._reset()
            started = time.perf_counter()
            child = self._start()
            replaced = self.replaced_at_s
            if replaced is not None and n % 3 == 2:  # after the rename, within what is left
                self._watch(child, before, started, stop_at_rename=True)
                delay = rng.uniform(0.0, max(self.duration_s - replaced, 0.0))
            elif replaced is not None and n % 3 == 1:  # aimed at the save: the last quarter
                delay = replaced * rng.uniform(0.75, 1.0)  # of the time before the rename
            else:  # anywhere in the run, or just after it
                delay = rng.uniform(0.0, self.duration_s * 1.1)
            time.sleep(delay)
            report.delays_s.append(time.perf_counter() - started)
            pid = child.pid if isinstance(child, subprocess.Popen) else child
            _kill(pid)
            status = self._wait(child)
            report.trials += 1
            if status == 0:
                report.finished += 1
            if _leftovers(self.folder, self.target.name):
                report.mid_save += 1
            file = _read(self.target)
            back = _read(backup_path(self.target))
            if file == self.new:
                report.new_content += 1
                if back != self.old:
                    report.torn.append(f"trial {report.trials}: new file but the backup is not "
                                       "the old file")
            elif file == self.old:
                if back not in (self.old, self.old_backup):
                    report.torn.append(f"trial {report.trials}: old file but the backup is "
                                       "neither the old file nor the old backup")
            else:
                size = "missing" if file is None else f"{len(file)} bytes"
                report.torn.append(f"trial {report.trials}: {self.target.name} is neither the "
                                   f"old nor the new content ({size}, exit {status})")
                continue
            kept = self.new if file == self.new else self.old  # what the file holds
            loads_walk(kept.decode("utf-8"), self.target)
            if back is not None:
                loads_walk(back.decode("utf-8"), backup_path(self.target))
        return report
