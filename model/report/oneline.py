"""What the one-line diagram says: the supply tree from each service down, every bus with its
rating and the drop at it, every feeder with its conductors, length and device, and the worst
branch run per bus. The report draws it as a picture (``gaugewalk.tui.report.html``); the app and
the Markdown report show it as text (``one_line_text``).

Public API: ``Bus``; ``one_line(job, job_result) -> tuple[Bus, ...]`` (depth first, in file
order); ``one_line_text(buses) -> list[str]``; ``rating_text(source)``; ``feeder_text(run,
result)``.
"""

from __future__ import annotations

from dataclasses import dataclass

from gaugewalk.model.engine.contract import RunResult
from gaugewalk.model.walk.graph import SupplyGraph
from gaugewalk.model.walk.job import Job, Run, Source

_EPS = 1e-9


@dataclass(frozen=True)
class Bus:
    """One source of the supply tree, as the diagram shows it."""

    id: str
    kind: str                   # service | switchboard | panel | transformer
    name: str
    system: str                 # at its bus (a transformer: its secondary)
    rating: str                 # "225 A", "75 kVA", "" when the walk gives none
    depth: int                  # 0 for a service (or a source nothing feeds)
    parent: str | None          # the source its feeder comes from
    feeder: str                 # "F-LP1: 3/0 AWG Cu, 120 ft, 200 A"; "" for a top source
    drop_pct: float | None      # [%] at its bus, from the service or the last transformer
    worst_run: str | None       # the branch run with the largest total drop from this bus
    worst_pct: float | None     # [%] its total drop
    over: bool                  # the worst branch is over the total drop target

    @property
    def drop_words(self) -> str:
        if self.drop_pct is None:
            return "drop not known"
        return f"drop at bus {self.drop_pct:.2f}%"

    @property
    def worst_words(self) -> str:
        if self.worst_run is None or self.worst_pct is None:
            return "no branch runs"
        over = " OVER the total target" if self.over else ""
        return f"worst branch {self.worst_run}: {self.worst_pct:.2f}%{over}"


def rating_text(source: Source) -> str:
    """A source's rating as the diagram and the source list show it: ``75 kVA``, ``225 A``."""
    parts = []
    if source.kva is not None:
        parts.append(f"{source.kva:g} kVA")
    if source.rating_a is not None:
        parts.append(f"{source.rating_a} A")
    return ", ".join(parts)


def feeder_text(run: Run, result: RunResult | None) -> str:
    """``F-LP1: 2 x 3/0 AWG Cu, 120 ft, 200 A`` (``not sized`` when it could not be)."""
    if result is None:
        return f"{run.id}: not sized, {run.length_ft:,.0f} ft"
    mat = "Cu" if result.material == "cu" else "Al"
    sets = f"{result.sets} x " if result.sets > 1 else ""
    return (f"{run.id}: {sets}{result.size} {mat}, {run.length_ft:,.0f} ft, "
            f"{result.ocpd_a} A")


def one_line(job: Job, job_result) -> tuple[Bus, ...]:
    """Every source of ``job`` (a computed walk: ``job_result`` from ``compute_job``) in the
    order the tree is drawn: each top source, then depth first the sources its feeders feed."""
    graph = SupplyGraph(job)
    total_target = job.defaults.total_drop_pct
    out: list[Bus] = []
    seen: set[str] = set()

    def visit(sid: str, depth: int, parent: str | None) -> None:
        if sid in seen:
            return
        seen.add(sid)
        source = graph.sources[sid]
        feeder = graph.feeder.get(sid) if parent is not None else None
        worst_run, worst_pct = None, None
        for r in graph.children[sid]:
            if graph.feeder.get(r.to) is r:
                continue
            total = job_result.run_total_drop_pct.get(r.id)
            if total is not None and (worst_pct is None or total > worst_pct):
                worst_run, worst_pct = r.id, total
        out.append(Bus(
            sid, source.kind, source.name, source.system, rating_text(source), depth, parent,
            feeder_text(feeder, job_result.runs.get(feeder.id)) if feeder is not None else "",
            job_result.source_drop_pct.get(sid), worst_run, worst_pct,
            worst_pct is not None and worst_pct > total_target + _EPS,
        ))
        for r in graph.children[sid]:
            if r.to in graph.sources and graph.feeder.get(r.to) is r:
                visit(r.to, depth + 1, sid)

    for root in graph.roots():
        visit(root.id, 0, None)
    for sid in graph.sources:  # in a loop of feeders: shown at the top, unconnected
        visit(sid, 0, None)
    return tuple(out)


def one_line_text(buses: tuple[Bus, ...]) -> list[str]:
    """The diagram as indented text lines, one bus and its feeder per line."""
    lines = []
    for bus in buses:
        indent = "    " * bus.depth
        lead = "└─ " if bus.depth else ""
        rating = f" {bus.rating}" if bus.rating else ""
        fed = f"  via {bus.feeder}" if bus.feeder else ""
        lines.append(f"{indent}{lead}{bus.id} ({bus.kind}{rating}, {bus.system}){fed}")
        lines.append(f"{indent}{'   ' if bus.depth else ''}   {bus.drop_words}; "
                     f"{bus.worst_words}")
    return lines
