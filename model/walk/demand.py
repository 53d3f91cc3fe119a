"""Demand factors on a feeder (``Defaults.demand = "nec-220"``): what NEC Article 220 lets a
feeder leave out of the connected load it serves. The default, ``connected``, applies none.

- NEC 220.44 (Table 220.44): the receptacle loads below the feeder (load kind ``receptacle``)
  at 100 % for the first 10 kVA and 50 % for the rest. The factor is worked out on their
  connected VA and applied to their part of each line's current alike (each line keeps its
  share of the receptacle load).
- NEC 220.60: where fixed space heating (kind ``heater``) and cooling (kind ``hvac``, taken as
  air conditioning) both sit below the feeder, they are unlikely to run at once: only the larger
  group by connected VA counts, and the smaller is left out of every line (on a tie, cooling is
  left out).

The motor rules stay on the connected motors (NEC 430.24: the largest motor's 25 % is added
even where its HVAC group is left out, the conservative side), and a feeder into a transformer
keeps its primary device (Table 450.3(B)): no demand factor is taken there.

Public API: ``DemandStep``; ``apply_demand(feed) -> (Feed, steps)``.
"""

from typing import NamedTuple

from gaugewalk.model.walk.feeder_loads import Feed, feeder_load
from gaugewalk.tables.demand import receptacle_demand_va


class DemandStep(NamedTuple):
    """One demand factor taken on a feeder: its code ``section``, the ``group`` of loads it
    reads, their ``connected_va`` and what is counted of them, ``demand_va`` [VA], and a
    sentence (``text``)."""

    section: str
    group: str
    connected_va: float
    demand_va: float
    text: str


def _less(feed: Feed, part: Feed, x: float) -> Feed:
    """``feed`` less ``x`` times ``part`` on every line and in its load."""
    a, b = feed.load, part.load
    load = feeder_load(a.va - x * b.va, a.continuous_va - x * b.continuous_va,
                       a.watts - x * b.watts)
    return Feed(tuple(t - x * p for t, p in zip(feed.total, part.total, strict=True)),
                tuple(c - x * p for c, p in zip(feed.continuous, part.continuous, strict=True)),
                feed.frame, load, feed.kinds, feed.neutral)


def _kva(va: float) -> str:
    return f"{va / 1000:.1f} kVA"


def apply_demand(feed: Feed) -> tuple[Feed, tuple[DemandStep, ...]]:
    """The feed with NEC 220.44 and 220.60 taken (see the module docstring), and each step
    taken; the feed itself and no steps where none applies."""
    kinds = dict(feed.kinds)
    steps: list[DemandStep] = []
    rec = kinds.get("receptacle")
    if rec is not None and rec.load.va > 0:
        connected = rec.load.va
        counted = receptacle_demand_va(connected)
        if counted < connected - 1e-9:
            feed = _less(feed, rec, 1.0 - counted / connected)
            steps.append(DemandStep(
                "NEC 220.44", "receptacle", connected, counted,
                f"NEC 220.44 (Table 220.44): receptacle loads {_kva(connected)}, the first "
                f"10 kVA at 100 % and the remaining {_kva(connected - 10_000)} at 50 %: "
                f"{_kva(counted)} counted"))
    heat, cool = kinds.get("heating"), kinds.get("cooling")
    if heat is not None and cool is not None and heat.load.va > 0 and cool.load.va > 0:
        keep, drop = ((heat, cool) if heat.load.va >= cool.load.va else (cool, heat))
        kept = "heating" if keep is heat else "cooling"
        dropped = "cooling" if keep is heat else "heating"
        feed = _less(feed, drop, 1.0)
        steps.append(DemandStep(
            "NEC 220.60", dropped, drop.load.va, 0.0,
            f"NEC 220.60: noncoincident loads, {dropped} ({_kva(drop.load.va)}) left out; "
            f"only the larger, {kept} ({_kva(keep.load.va)}), counts"))
    return feed, tuple(steps)
