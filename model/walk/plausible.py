"""Warnings about values a walk may hold but that are unlikely to be what the walker meant: said,
never refused.

- A run longer than ``Defaults.max_plausible_length_ft`` (3,000 ft unless the walk says
  otherwise: about the length of the largest factory and warehouse buildings, common practice)
  is more likely a slip of the keyboard (``9999999``, a metre length typed as feet) than a
  route; a longer site feeder is real, and the walk can raise the setting.

- A panel or switchboard without its bus rating (``rating_a``), or a service with neither a
  rating nor a main, cannot be checked against its load (NEC 408.30; 230.42(A), 230.79) nor, with
  main lugs only, its feeder's device against its bus (408.36): said, so a missing rating never
  passes for a checked one (``unrated``).

- A feeder given its own load (a demand load worked out elsewhere) keeps it, even where the
  loads recorded on its panel need more (NEC 215.2(A)(1)): the walker stated it, so it is said
  as an assumption to check, not counted as a problem.

Public API: ``long_length(feet, defaults) -> str | None`` (the warning for one length),
``unrated(source) -> str | None`` (the warning for a source without its rating),
``implausible(job) -> list[Problem]`` (every warning of a walk, about its runs and sources) and
``stated_loads(result) -> list[tuple[str, str]]`` (the feeders kept at a stated load below what
their panel's loads need: run id and the basis that says so).
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from gaugewalk.model.walk.job import Defaults, Job, Source
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


def unrated(source: Source) -> str | None:
    """The warning for a source whose rating the walk does not give, or None."""
    if source.kind in ("panel", "switchboard") and source.rating_a is None:
        return ("its bus rating (rating_a) is not given, so its load against it (NEC 408.30)"
                + (" and its feeder's device against it (408.36, main lugs only)"
                   if source.main_a is None else "") + " are not checked; give rating_a")
    if source.kind == "service" and source.rating_a is None and source.main_a is None:
        return ("neither its rating (rating_a) nor its main (main_a) is given, so its load "
                "against them (NEC 230.42(A), 230.79) is not checked")
    return None


def implausible(job: Job, file: str = "") -> list[Problem]:
    """Every warning of the walk: one ``Problem`` for each run of an unlikely length (field
    ``length``) and each source without its rating (field ``rating_a``)."""
    out = []
    for run in job.runs:
        said = long_length(run.length_ft, job.defaults)
        if said is not None:
            out.append(Problem(file, None, "run", run.id, "length", said))
    for source in job.sources:
        said = unrated(source)
        if said is not None:
            out.append(Problem(file, None, "source", source.id, "rating_a", said))
    return out


def stated_loads(result: JobResult) -> list[tuple[str, str]]:
    """Feeders sized for the load the walk gives them where the loads recorded on their panel
    need more (NEC 215.2(A)(1)), as (run id, the basis in words), in the order computed."""
    return [(rid, f.basis) for rid, f in result.feeders.items() if f.served_a is not None]
