"""Warnings about values a walk may hold but that are unlikely to be what the walker meant: said,
never refused.

- A run longer than ``Defaults.max_plausible_length_ft`` (3,000 ft unless the walk says
  otherwise: about the length of the largest factory and warehouse buildings, common practice)
  is more likely a slip of the keyboard (``9999999``, a metre length typed as feet) than a
  route; a longer site feeder is real, and the walk can raise the setting.

- A feeder given its own load (a demand load worked out elsewhere) keeps it, even where the
  loads recorded on its panel need more (NEC 215.2(A)(1)): the walker stated it, so it is said
  as an assumption to check, not counted as a problem.

Public API: ``long_length(feet, defaults) -> str | None`` (the warning for one length),
``implausible(job) -> list[Problem]`` (every warning of a walk, about its runs) and
``stated_loads(result) -> list[tuple[str, str]]`` (the feeders kept at a stated load below what
their panel's loads need: run id and the basis that says so).
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from gaugewalk.model.walk.job import Defaults, Job
from gaugewalk.model.walk.problems import Problem

if TYPE_CHECKING:
    from gaugewalk.model.walk.compute import JobResult


def long_length(feet: float, defaults: Defaults) -> str | None:
    """The warning for a route of ``feet`` [ft], or None when it is plausible."""
    limit = defaults.max_plausible_length_ft
    if feet <= limit:
        return None
    return (f"{feet:,.0f} ft is longer than a run in a building usually is (over {limit:,.0f} ft, "
            "[defaults] max_plausible_length_ft); check the length")


def implausible(job: Job, file: str = "") -> list[Problem]:
    """Every warning of the walk, one ``Problem`` (about a run, field ``length``) each."""
    out = []
    for run in job.runs:
        said = long_length(run.length_ft, job.defaults)
        if said is not None:
            out.append(Problem(file, None, "run", run.id, "length", said))
    return out


def stated_loads(result: JobResult) -> list[tuple[str, str]]:
    """Feeders sized for the load the walk gives them where the loads recorded on their panel
    need more (NEC 215.2(A)(1)), as (run id, the basis in words), in the order computed."""
    return [(rid, f.basis) for rid, f in result.feeders.items() if f.served_a is not None]
