"""Raceways several runs share (``[[raceway]]``): the current-carrying conductors in each, the
adjustment every run in it takes, and its fill for every conductor in it.

- Current-carrying conductors: each run's hots, and its neutral where NEC 310.15(E) counts it
  (``gaugewalk.model.engine.circuits.current_carrying_conductors``: not a neutral carrying only
  the unbalance, 310.15(E)(1); yes on two phases and the neutral of a wye, 310.15(E)(2)), times
  its parallel sets; the EGC never counts (310.15(F)).
- Adjustment: NEC Table 310.15(C)(1) for all of them, applied to every run in the raceway (the
  runs are sized with it by ``gaugewalk.model.walk.compute``).
- Fill: every conductor in it, EGCs included, at its insulated area (NEC Ch. 9 Table 5) against
  the raceway's internal area (Table 4) within the limit of Table 1; a trade size the walk fixes
  is checked, else the smallest that holds them is picked.

Each run keeps its own EGC (250.122(C) would allow one for all, sized for the largest device;
the takeoff and the fill count one per run, the larger figure).

A run is in a shared raceway by its ``raceway_id`` (for the raceway's length) or by a segment's
(for the segment's length); in several, it takes the adjustment of the fullest.

Public API: ``SharedRaceway`` (one raceway's answer, ``to_dict()``);
``ccc_by_raceway(job, circuits)``, ``run_ccc(circuit, sets)``, ``raceway_ccc(job, raceway_id)``,
``ccc_for_run(run, by_raceway)``, ``own_raceway_ft(run, raceways)``;
``shared_raceways(job, runs) -> (dict of SharedRaceway by id, list of Problem)``.
"""

from typing import NamedTuple

from gaugewalk.model.engine.circuits import (
    CircuitError,
    current_carrying_conductors,
    resolve_circuit,
)
from gaugewalk.model.engine.contract import Circuit, RunResult
from gaugewalk.model.engine.sizing.raceway import resolve_raceway
from gaugewalk.model.walk.checks import connection_of, nonlinear_of
from gaugewalk.model.walk.job import Job, Raceway, Run, parse_length, shared_ids
from gaugewalk.model.walk.problems import Problem
from gaugewalk.tables.conductor.ampacity import ccc_factor
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.raceway import fill as t_fill

_EPS = 1e-9


class SharedRaceway(NamedTuple):
    """One shared raceway worked out: what is in it, its adjustment and its fill."""

    id: str
    raceway: str                    # raceway type (NEC Ch. 9 Table 4 name)
    trade_size: str | None          # fixed or picked; None when nothing holds its conductors
    size_given: bool                # the walk fixed the trade size
    length_ft: float                # [ft] its own route length
    bends: int
    runs: tuple[str, ...]           # ids of the runs in it, in walk order
    ccc: int                        # current-carrying conductors in it (NEC 310.15(E))
    adjustment: float               # NEC Table 310.15(C)(1) factor for them
    conductors: int                 # every conductor in it, EGCs included
    area_in2: float                 # [in^2] their insulated areas added (Ch. 9 Table 5)
    fill_pct: float                 # [%] of the trade size's internal area (Table 4)
    fill_limit_pct: float           # [%] Ch. 9 Table 1 for that many conductors
    notes: tuple[str, ...] = ()
    problems: tuple[str, ...] = ()

    def to_dict(self) -> dict:
        return {
            "id": self.id, "raceway": self.raceway, "trade_size": self.trade_size,
            "size_given": self.size_given, "length_ft": self.length_ft, "bends": self.bends,
            "runs": list(self.runs), "ccc": self.ccc, "adjustment": self.adjustment,
            "conductors": self.conductors, "area_in2": round(self.area_in2, 4),
            "fill_pct": round(self.fill_pct, 1), "fill_limit_pct": self.fill_limit_pct,
            "notes": list(self.notes), "problems": list(self.problems),
        }


def run_ccc(circuit: Circuit, sets: int) -> int:
    """Current-carrying conductors one run puts in a shared raceway: those of one set
    (NEC 310.15(E)) times its parallel sets."""
    return current_carrying_conductors(circuit) * sets


def ccc_by_raceway(job: Job, circuits: dict[str, Circuit]) -> dict[str, int]:
    """Current-carrying conductors in each shared raceway, from the runs' resolved circuits
    (``circuits`` by run id; a run whose circuit could not be resolved adds none)."""
    if not job.raceways:
        return {}
    out = {r.id: 0 for r in job.raceways}
    for run in job.runs:
        if run.raceway_id is None and not run.segments:
            continue
        circuit = circuits.get(run.id)
        if circuit is None:
            continue
        for rid in shared_ids(run):
            if rid in out:
                out[rid] += run_ccc(circuit, run.sets)
    return out


def ccc_for_run(run: Run, by_raceway: dict[str, int]) -> int | None:
    """The current-carrying conductors a run is adjusted for: those of the fullest shared
    raceway it is in (NEC 310.15(C)(1) applies over the whole run); None when it is in none."""
    if run.raceway_id is None and not run.segments:
        return None
    counts = [by_raceway[rid] for rid in shared_ids(run) if by_raceway.get(rid)]
    return max(counts) if counts else None


def own_raceway_ft(run: Run, lengths: dict[str, float]) -> float | None:
    """The part of a run's route in a raceway of its own [ft]: its length less the shared
    raceway its ``raceway_id`` names (``lengths`` by id [ft]) and less its segments in shared
    raceways; None when it is in none."""
    ids = shared_ids(run)
    if not ids:
        return None
    shared = lengths.get(run.raceway_id, 0.0) if run.raceway_id is not None else 0.0
    shared += sum(parse_length(s.length) for s in run.segments
                  if s.raceway_id is not None and s.raceway_id != run.raceway_id)
    return max(0.0, run.length_ft - shared)


def raceway_ccc(job: Job, raceway_id: str) -> int | None:
    """Current-carrying conductors in one shared raceway, resolving each run's circuit here
    (for one run sized alone, as the run card does); None when the walk has no such raceway."""
    if job.raceway(raceway_id) is None:
        return None
    total = 0
    for run in job.runs_in(raceway_id):  # by the run or a segment
        source = job.source(run.from_)
        if source is None:
            continue
        try:
            circuit = resolve_circuit(source.system, connection_of(job, run),
                                      nonlinear=nonlinear_of(job, run))
        except CircuitError:
            continue
        total += run_ccc(circuit, run.sets)
    return total


def _type_of(job: Job, raceway: Raceway) -> str:
    return resolve_raceway(raceway.type or job.defaults.raceway)[0]


def shared_raceways(job: Job, results: dict[str, RunResult],
                    ccc: dict[str, int]) -> tuple[dict[str, SharedRaceway], list[Problem]]:
    """Every shared raceway of ``job`` worked out from the sized runs (``results`` by run id)
    and the current-carrying conductors in each (``ccc_by_raceway``); the problems name the
    raceway (an overfilled fixed size, nothing that holds them, a run left unsized)."""
    out: dict[str, SharedRaceway] = {}
    problems: list[Problem] = []
    if not job.raceways:  # the usual walk: nothing to go through its runs for
        return out, problems
    members: dict[str, list] = {r.id: [] for r in job.raceways}
    for run in job.runs:
        for rid in shared_ids(run):
            if rid in members:
                members[rid].append(run)
    for raceway in job.raceways:
        if raceway.id in out:  # a repeated id is a problem of the file; the first counts
            continue
        found = _one(job, raceway, members[raceway.id], results, ccc.get(raceway.id, 0))
        out[raceway.id] = found
        problems += [Problem("", None, "raceway", raceway.id, "size" if raceway.size else None,
                             message) for message in found.problems]
    return out, problems


def _one(job: Job, raceway: Raceway, runs: list, results: dict[str, RunResult],
         ccc: int) -> SharedRaceway:
    notes: list[str] = []
    problems: list[str] = []
    rtype = _type_of(job, raceway)  # both names were read as Table 4 types
    count = 0
    area = 0.0
    unsized = []
    for run in runs:
        res = results.get(run.id)
        if res is None:
            unsized.append(run.id)
            continue
        insulation = job.effective(run, "insulation")
        per_set = res.conductors or {}
        try:
            hots_neutral = int(per_set.get("hot", 0)) + int(per_set.get("neutral", 0))
            area += hots_neutral * res.sets * t_fill.insulated_area_in2(res.size, insulation)
            count += hots_neutral * res.sets
            if res.egc_size:
                area += res.sets * t_fill.insulated_area_in2(res.egc_size, insulation)
                count += res.sets
        except TableLookupError as exc:
            problems.append(f"run {run.id}: fill not checked: {exc}")
    if unsized:
        problems.append(f"run{'s' if len(unsized) > 1 else ''} {', '.join(unsized)} could not "
                        "be sized, so the fill leaves out their conductors")
    adjustment = ccc_factor(ccc) if ccc >= 1 else 1.0
    if ccc > 3:
        notes.append(f"NEC 310.15(C)(1): {ccc} current-carrying conductors, factor "
                     f"{adjustment:g} on every run in it")
    limit = t_fill.fill_limit_pct(count) if count >= 1 else t_fill.FILL_LIMIT_OVER_2_PCT
    sizes = t_fill.trade_sizes(rtype)
    trade = raceway.size
    fill_pct = 0.0
    if trade is not None:
        if trade not in t_fill.trade_sizes(rtype):
            problems.append(f"{rtype} is not made in trade size {trade}; its sizes are "
                            f"{', '.join(t_fill.trade_sizes(rtype))}")
        else:
            fill_pct = 100.0 * area / t_fill.internal_area_in2(rtype, trade)
            if fill_pct > limit + _EPS:
                fits = _smallest(rtype, area, limit)
                better = (f"; trade size {fits} would hold them" if fits
                          else f"; no {rtype} trade size holds them")
                problems.append(f"{count} conductors ({area:.3f} in2) fill {fill_pct:.0f}% of "
                                f"trade size {trade} {rtype}, over the {limit:g}% of NEC Ch. 9 "
                                f"Table 1{better}")
    elif not runs:
        problems.append("no run names this raceway and it has no size, so it cannot be sized; "
                        "give runs its id in raceway_id, or give it a size")
    elif count:
        trade = _smallest(rtype, area, limit)
        if trade is None:
            largest = sizes[-1]
            fill_pct = 100.0 * area / t_fill.internal_area_in2(rtype, largest)
            problems.append(f"no {rtype} trade size holds its {count} conductors ({area:.3f} in2) "
                            f"within the {limit:g}% fill of NEC Ch. 9 Table 1; {largest} would "
                            f"be {fill_pct:.0f}% full: split the runs between raceways")
        else:
            fill_pct = 100.0 * area / t_fill.internal_area_in2(rtype, trade)
    if trade is not None and count and fill_pct <= limit + _EPS:
        notes.append(f"NEC Ch. 9 Table 1: {count} conductors, {fill_pct:.0f}% of trade size "
                     f"{trade} {rtype} (limit {limit:g}%)")
    return SharedRaceway(
        raceway.id, rtype, trade, raceway.size is not None, raceway.length_ft, raceway.bends or 0,
        tuple(r.id for r in runs), ccc, adjustment, count, area, fill_pct, limit, tuple(notes),
        tuple(problems))


def _smallest(rtype: str, area: float, limit: float) -> str | None:
    """The smallest trade size of ``rtype`` whose ``limit`` [%] of internal area holds
    ``area`` [in^2] (NEC Ch. 9 Tables 1 and 4)."""
    for ts in t_fill.trade_sizes(rtype):
        if area <= t_fill.internal_area_in2(rtype, ts) * limit / 100.0 + _EPS:
            return ts
    return None
