"""The long kill soak, run by hand (never by the test suite):

    python -m bench.soak_saves --trials 5000            # save_walk, add and merge, forked
    python -m bench.soak_saves --trials 300 --spawn     # add and merge as real command lines

Kills processes writing a walk at random moments (SIGKILL) and checks after every kill that the
walk is whole, the old or the new content, and that its backup is whole. Prints one line per kind
and exits 1 if anything was torn. See ``tests/support/kill_harness.py``.
"""

from __future__ import annotations

import argparse
import random
import sys
import tempfile
import time
from pathlib import Path

import gaugewalk.tui.cli.main  # noqa: F401  (imported before forking)
from gaugewalk.model.walkfile.write import dumps_walk, save_walk
from tests.support.kill_harness import CommandKillTrials, SaveKillTrials, walk_versions


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m bench.soak_saves", description=__doc__,
                                     formatter_class=argparse.RawDescriptionHelpFormatter)
    parser.add_argument("--trials", type=int, default=2000,
                        help="kills of save_walk (default 2000)")
    parser.add_argument("--command-trials", type=int, default=None,
                        help="kills of add and of merge each (default: trials / 5)")
    parser.add_argument("--spawn", action="store_true",
                        help="run add and merge as fresh 'python -m gaugewalk.tui.cli.main' "
                             "processes")
    parser.add_argument("--runs", type=int, default=300,
                        help="runs in the walk saved (default 300)")
    parser.add_argument("--seed", type=int, default=int(time.time()))
    parser.add_argument("--folder", type=Path, default=None,
                        help="where to write (default: a temp folder)")
    args = parser.parse_args(argv)
    command_trials = (args.command_trials if args.command_trials is not None
                      else max(args.trials // 5, 1))
    rng = random.Random(args.seed)
    print(f"seed {args.seed}", flush=True)
    versions = walk_versions(6, runs=args.runs)
    torn = 0
    with tempfile.TemporaryDirectory(dir=args.folder) as tmp:
        base = Path(tmp)
        folder = base / "save"
        folder.mkdir()
        started = time.perf_counter()
        report = SaveKillTrials(folder, versions).run(args.trials, rng, max_delay_s=0.1)
        print(report.line("save_walk"), f"[{time.perf_counter() - started:.0f} s]", flush=True)
        for problem in report.torn[:20]:
            print("  ", problem)
        torn += len(report.torn)

        folder = base / "add"
        folder.mkdir()
        walk = folder / "walk.toml"
        argv = ["add", str(walk), "--from", "LP1", "--to", "Glue station", "--length",
                "85+12+2*6", "--amps", "12"]
        trials = CommandKillTrials(folder, walk, argv, dumps_walk(versions[1]).encode(),
                                   dumps_walk(versions[0]).encode(), spawn=args.spawn)
        report = trials.run(command_trials, rng)
        print(report.line("gaugewalk add"), f"(a run takes {trials.duration_s * 1000:.0f} ms)",
              flush=True)
        for problem in report.torn[:20]:
            print("  ", problem)
        torn += len(report.torn)

        folder = base / "merge"
        folder.mkdir()
        a = versions[0].model_copy(deep=True)
        a.runs = a.runs[: len(a.runs) * 2 // 3]
        pa, pb, out = folder / "office.toml", folder / "site.toml", folder / "merged.toml"
        save_walk(a, pa)
        save_walk(versions[0], pb)
        trials = CommandKillTrials(folder, out, ["merge", str(pa), str(pb), "-o", str(out)],
                                   dumps_walk(versions[2]).encode(),
                                   dumps_walk(versions[3]).encode(), spawn=args.spawn)
        report = trials.run(command_trials, rng)
        print(report.line("gaugewalk merge"),
              f"(a run takes {trials.duration_s * 1000:.0f} ms)", flush=True)
        for problem in report.torn[:20]:
            print("  ", problem)
        torn += len(report.torn)
    print("no torn walks" if not torn else f"{torn} torn or wrong")
    return 1 if torn else 0


if __name__ == "__main__":
    sys.exit(main())
