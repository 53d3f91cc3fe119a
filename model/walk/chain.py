"""Cumulative voltage drop along a chain of runs: service -> feeder -> panel -> branch circuit.

Percent drops of runs in series add up (each is against the nominal voltage of its own system,
so percents carry across a transformer where volts would not). At a transformer the walk either
carries the drop through, adding the transformer's own drop at its load (the default,
``Defaults.drop_through_transformers``), or restarts at 0 % on its secondary, as when the taps
make up the drop upstream (common practice where the taps are set for it). Pure functions; the
job computation walks its source tree and calls these.
"""

from __future__ import annotations

from collections.abc import Iterable, Sequence


def cumulative_drop(drops_pct: Sequence[float], *, restart_at: Iterable[int] = ()) -> list[float]:
    """Running total of percent drops along a chain, source first [%].

    Parameters
    ----------
    drops_pct : sequence of float
        Each run's own drop [%], in order from the service outward.
    restart_at : iterable of int
        Indices of runs fed from a transformer secondary: the total restarts at that run's own
        drop.

    Returns
    -------
    list of float
        ``out[i]`` is the drop from the service (or the last transformer) to the far end of run i.

    Examples
    --------
    >>> cumulative_drop([1.0, 1.5, 2.0])
    [1.0, 2.5, 4.5]
    >>> cumulative_drop([1.0, 1.5, 2.0], restart_at=[2])
    [1.0, 2.5, 2.0]
    """
    restarts = set(restart_at)
    total = 0.0
    out: list[float] = []
    for i, d in enumerate(drops_pct):
        total = d if i in restarts else total + d
        out.append(total)
    return out


def upstream_drop(parent_total_pct: float | None, *, from_transformer: bool = False) -> float:
    """Drop from the service to a run's source [%]: the parent's cumulative drop, 0 at the
    service or at a transformer secondary."""
    if parent_total_pct is None or from_transformer:
        return 0.0
    return parent_total_pct


def secondary_bus_drop(primary_total_pct: float, transformer_drop_pct: float, *,
                       through: bool) -> float:
    """Drop from the service to a transformer's secondary bus [%]: the drop at its primary
    terminals plus its own drop when the drop carries ``through`` transformers, else 0."""
    return primary_total_pct + transformer_drop_pct if through else 0.0


def within_limit(total_pct: float, limit_pct: float) -> bool:
    """True when the cumulative drop is at most the limit (the 5% of the informational notes to
    NEC 210.19 and 215.2 by default) [%]."""
    return total_pct <= limit_pct + 1e-9
