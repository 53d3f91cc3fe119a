"""Warnings about values a walk may hold but that are unlikely to be what the walker meant: said,
never refused.

- A run longer than ``Defaults.max_plausible_length_ft`` (3,000 ft unless the walk says
  otherwise: about the length of the largest factory and warehouse buildings, common practice)
  is more likely a slip of the keyboard (``9999999``, a metre length typed as feet) than a
  route; a longer site feeder is real, and the walk can raise the setting.

Public API: ``long_length(feet, defaults) -> str | None`` (the warning for one length) and
``implausible(job) -> list[Problem]`` (every warning of a walk, about its runs).
"""

from __future__ import annotations

from gaugewalk.model.walk.job import Defaults, Job
from gaugewalk.model.walk.problems import Problem


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
