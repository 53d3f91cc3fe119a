"""Panel schedules and the sources list: for every source, its positions, runs, poles, phase and
load per line, its totals, feeder, main and loading; for a transformer, its nameplate,
protection and drop. Built from a computed walk (``gaugewalk.model.walk.compute``) for
``check --json``, the report and the app alike.

A row's load is split equally over the lines its circuit takes (a two-pole 4.5 kW heater: 2250 VA
on each of its lines; common practice for a panel schedule); a feeder's row carries the
connected load of the source it feeds. The per-line currents (``phase_amps``) are the phasor
sums of ``gaugewalk.model.walk.feeder_loads``, which the VA columns only summarise.

Public API: ``ScheduleRow``, ``Schedule``, ``schedule_of(job, result, source_id)``,
``schedules(job, result)`` (all but transformers), ``positions_to_keep(job, result,
source_id=None)`` (what ``gaugewalk place`` and the app's keep key write), ``source_entry(job, result, source_id) -> dict`` (the
``check --json`` shape), ``drop_basis(job) -> str``.
"""

from __future__ import annotations

from dataclasses import dataclass

from gaugewalk.model.walk.compute import JobResult
from gaugewalk.model.walk.job import Job
from gaugewalk.model.walk.phases import line_count
from gaugewalk.model.walk.vocabulary import LINE_NAMES


@dataclass(frozen=True)
class ScheduleRow:
    """One run in its source: the ``positions`` it takes (empty: none free), its ``poles``,
    ``phase`` word, ``by`` (``position``: the walk; ``phase``: the walk's phase; ``placed``:
    picked by the tool), what it feeds (``to``), whether it is a feeder, and its ``va`` on
    each line [VA]."""

    run_id: str
    to: str
    positions: tuple[int, ...]
    poles: int
    phase: str
    by: str
    feeder: bool
    va: tuple[float, ...]


@dataclass(frozen=True)
class Schedule:
    """A source's schedule: its ``lines`` (names), ``rows`` in position order (runs without a
    free position last), ``total_va`` per line [VA], ``phase_amps`` and ``design_amps`` per
    line [A], ``neutral_amps`` [A] (None: no neutral), the feeder run and its device, the bus
    ``rating_a`` and ``main_a``, ``spaces`` (None: not given, so positions are not checked
    against the end) and the ``utilisation_pct`` of the smaller rating."""

    source_id: str
    kind: str
    system: str
    lines: tuple[str, ...]
    rows: tuple[ScheduleRow, ...]
    total_va: tuple[float, ...]
    phase_amps: tuple[float, ...]
    design_amps: tuple[float, ...]
    neutral_amps: float | None
    feeder: str | None
    feeder_ocpd_a: int | None
    rating_a: int | None
    main_a: int | None
    spaces: int | None
    utilisation_pct: float | None

    @property
    def connected_va(self) -> float:
        return sum(self.total_va)


def schedule_of(job: Job, result: JobResult, source_id: str) -> Schedule:
    """The schedule of one source of a computed walk."""
    source = job.source(source_id)
    assert source is not None, f"no source {source_id}"
    n = line_count(source.system)
    names = LINE_NAMES[:n]
    rows: list[ScheduleRow] = []
    totals = [0.0] * n
    feeder_of = {r.to: r for r in job.runs if job.source(r.to) is not None}
    for r in job.runs:
        if r.from_ != source_id:
            continue
        placed = result.placements.get(r.id)
        if placed is None:
            continue
        va = result.run_va.get(r.id, 0.0)
        share = va / len(placed.lines)
        per_line = [0.0] * n
        for k in placed.lines:
            per_line[k] += share
            totals[k] += share
        is_feeder = feeder_of.get(r.to) is r
        rows.append(ScheduleRow(r.id, r.to, placed.positions, len(placed.lines), placed.phase,
                                placed.by, is_feeder, tuple(per_line)))
    rows.sort(key=lambda row: row.positions[0] if row.positions else 10**6)
    lines = result.lines.get(source_id)
    feeder = feeder_of.get(source_id)
    fed = result.runs.get(feeder.id) if feeder is not None else None
    loading = result.loadings.get(source_id)
    return Schedule(
        source_id, source.kind, source.system, names, tuple(rows), tuple(totals),
        lines.phase_amps if lines is not None else (0.0,) * n,
        lines.design if lines is not None else (0.0,) * n,
        lines.neutral_amps if lines is not None else None,
        feeder.id if feeder is not None else None,
        fed.ocpd_a if fed is not None else None,
        source.rating_a, source.main_a, source.spaces,
        loading.utilisation_pct if loading is not None else None)


def schedules(job: Job, result: JobResult) -> list[Schedule]:
    """The schedule of every source with positions (all but transformers), in the walk's
    order."""
    return [schedule_of(job, result, s.id) for s in job.sources if s.kind != "transformer"]


def positions_to_keep(job: Job, result: JobResult, source_id: str | None = None
                      ) -> tuple[dict[str, int], list[str]]:
    """The position the tool picked for each run the walk does not place ({run id: its first
    position}), of one source or all, and the runs it found no free position for."""
    kept: dict[str, int] = {}
    unplaced: list[str] = []
    for r in job.runs:
        if r.position is not None or (source_id is not None and r.from_ != source_id):
            continue
        placed = result.placements.get(r.id)
        if placed is None:
            continue
        if placed.positions:
            kept[r.id] = placed.positions[0]
        else:
            unplaced.append(r.id)
    return kept, unplaced


def drop_basis(job: Job) -> str:
    """How the total drop is counted across transformers, in words."""
    if job.defaults.drop_through_transformers:
        return ("total drop carried from the service through each transformer, its own drop "
                "at its load included (drop_through_transformers = true)")
    return ("total drop restarted at 0 % on each transformer secondary "
            "(drop_through_transformers = false)")


def _r(value: float | None, places: int = 4) -> float | None:
    return None if value is None else round(value, places)


def source_entry(job: Job, result: JobResult, source_id: str) -> dict:
    """One source as ``check --json`` gives it: ratings, load, current per line (before the
    125 % for continuous loads), neutral, utilisation, the transformer's figures, the schedule."""
    sch = schedule_of(job, result, source_id)
    source = job.source(source_id)
    assert source is not None
    entry: dict = {
        "id": source.id, "kind": source.kind, "system": source.system,
        "rating_a": source.rating_a, "main_a": source.main_a, "spaces": source.spaces,
        # NEC 310.15(E)(3) as the source says it (None: the job's, ``nonlinear_loads`` at the top)
        "nonlinear_loads": source.nonlinear_loads,
        "load_va": round(sch.connected_va, 1),
        "connected_va": _r(result.connected_va.get(source.id)),
        "phase_amps": {name: round(a, 2) for name, a in zip(sch.lines, sch.phase_amps,
                                                            strict=True)},
        "neutral_amps": _r(sch.neutral_amps, 2),
        "utilisation_pct": _r(sch.utilisation_pct, 1),
        "drop_pct": _r(result.source_drop_pct.get(source.id)),
        "feeder": sch.feeder, "feeder_ocpd_a": sch.feeder_ocpd_a,
    }
    info = result.transformers.get(source.id)
    if source.kind == "transformer":
        entry.update({
            "kva": source.kva, "impedance_pct": info.impedance_pct if info else None,
            "impedance_assumed": info.impedance_assumed if info else None,
            "protection": source.protection,
            "primary_fla_a": _r(info.primary_fla_a, 2) if info else None,
            "secondary_fla_a": _r(info.secondary_fla_a, 2) if info else None,
            "primary_ocpd_a": info.primary_ocpd_a if info else None,
            "secondary_ocpd_a": info.secondary_ocpd_a if info else None,
            "load_kva": _r(info.load_kva, 2) if info else None,
            "drop_pct": _r(info.drop_pct) if info else None,
            "bus_drop_pct": _r(result.source_drop_pct.get(source.id)),
            "notes": list(info.notes) if info else [],
        })
    if source.kind == "transformer":  # no positions: its secondary conductors leave it whole
        entry["schedule"] = None
        return entry
    entry["schedule"] = {
        "spaces": sch.spaces,
        "spaces_note": None if sch.spaces is not None else
        "spaces not given: positions are not checked against the end of the panel",
        "rows": [{"positions": list(row.positions), "run": row.run_id, "to": row.to,
                  "poles": row.poles, "phase": row.phase, "by": row.by,
                  "feeder": row.feeder,
                  "va": {name: round(v, 1) for name, v in zip(sch.lines, row.va, strict=True)}}
                 for row in sch.rows],
        "total_va": {name: round(v, 1) for name, v in zip(sch.lines, sch.total_va, strict=True)},
    }
    return entry
