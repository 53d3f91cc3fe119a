"""The walks the benchmark measures on, and where in them it edits."""

from __future__ import annotations

import json
from pathlib import Path

from bench.timing import ROOT

SAMPLE = ROOT / "sample_walks" / "warehouse_dc2.toml"
"""The largest sample walk (385 runs): the headless commands and the app start are measured on
it."""


def synthetic_file(folder: Path, n_runs: int) -> Path:
    """The synthetic walk of ``n_runs`` runs (``tests/support/synthetic_walk.py``) written in
    ``folder``."""
    from tests.support.synthetic_walk import synthetic_walk_text

    path = folder / f"synthetic_{n_runs}.toml"
    path.write_text(synthetic_walk_text(n_runs), encoding="utf-8")
    return path


def sample_copy(folder: Path) -> Path:
    """A copy of the sample walk (the app locks and may save what it opens)."""
    copy = folder / SAMPLE.name
    copy.write_bytes(SAMPLE.read_bytes())
    return copy


def config_dir(folder: Path) -> Path:
    """An app settings folder where the first-start caution was already shown (so the walk
    screen is what paints first)."""
    config = folder / "config"
    config.mkdir(exist_ok=True)
    (config / "recent.json").write_text(json.dumps({"recent": [], "caution_seen": True}))
    return config


def deepest_branch(job):
    """The branch run deepest in the supply tree (on a subpanel when there is one): changing
    its load moves the feeders above it and the drops below them."""
    depth: dict[str, int] = {}

    def level(source_id: str) -> int:
        if source_id not in depth:
            feeder = job.feeder_of(source_id)
            depth[source_id] = 0 if feeder is None else 1 + level(feeder.from_)
        return depth[source_id]

    branches = [r for r in job.runs if r.load is not None and not job.is_feeder(r)]
    return max(branches, key=lambda r: (level(r.from_), r.id))
