"""The supply graph of a walk: which source feeds which, and the runs leaving each source.

A run whose ``to`` names a source of the job is that source's feeder; a service is fed by the
utility. The graph is built once per walk (one pass over the runs) and walked by everything that
follows the supply: the whole-walk computation (top-down for drops, bottom-up for feeder loads),
the cross-checks (two feeders, loops), the session (what lies downstream of a run) and the app's
supply tree.

Public API:

- ``SupplyGraph(job)``: ``sources`` {id: Source} (the first of a repeated id), ``children``
  {source id: runs leaving it, in file order}, ``feeds`` {source id: every run from a source of
  the job into it, in file order}, ``feeder`` {source id: the run that carries its supply (the
  first of ``feeds`` that does not end where it starts)}, ``orphans`` (runs from no source of the
  job), ``order`` (source ids from the top, each before the sources it feeds), ``unreached``
  (sources no chain of feeders reaches from a top: they are in a loop), ``position``
  {run id: index of its first run in the file}, ``transformers`` (the ids of the transformer
  sources); these four are worked out when first read.
- ``roots()``, ``is_feeder(run)``, ``runs_below(source_id)``, ``sources_below(source_id,
  follow)``, ``feeder_loops()``; ``shape()`` and ``fits(job, run, shape)`` for the incremental
  recomputation.
"""

from __future__ import annotations

from collections.abc import Callable, Iterator
from functools import cached_property

from gaugewalk.model.walk.job import Job, Run, Source


class SupplyGraph:
    """Sources, feeders and runs per source of one walk, with the order from the top."""

    def __init__(self, job: Job) -> None:
        self.job = job
        sources: dict[str, Source] = {}
        for s in job.sources:
            sources.setdefault(s.id, s)
        self.sources = sources
        feeder: dict[str, Run] = {}
        feeds: dict[str, list[Run]] = {}
        children: dict[str, list[Run]] = {sid: [] for sid in sources}
        orphans: list[Run] = []
        for r in job.runs:
            f = r.from_
            below = children.get(f)
            if below is None:
                orphans.append(r)
                continue
            below.append(r)
            t = r.to
            if t in sources:
                claims = feeds.get(t)
                if claims is None:
                    feeds[t] = [r]
                else:
                    claims.append(r)
                if t not in feeder and t != f:
                    feeder[t] = r
        self.feeder = feeder
        self.feeds = feeds
        self.children = children
        self.orphans = orphans
        # for the incremental path: the objects this graph was built from, to tell whether it
        # still fits the walk after an edit
        self.runs = list(job.runs)
        self._sources_built = list(job.sources)

    @cached_property
    def order(self) -> list[str]:
        """Source ids from the top, each before the sources it feeds (depth first, in file
        order); a source in a loop of feeders is not reached (``unreached``)."""
        order: list[str] = []
        seen: set[str] = set()
        feeder = self.feeder
        # the sources each source feeds, in file order of their feeders (``feeder`` was filled
        # in file order): a pass over the feeders, not over every run
        fed: dict[str, list[str]] = {}
        for target, r in feeder.items():
            fed.setdefault(r.from_, []).append(target)
        stack = [sid for sid in self.sources if sid not in feeder]
        stack.reverse()
        while stack:
            sid = stack.pop()
            if sid in seen:
                continue
            seen.add(sid)
            order.append(sid)
            stack.extend(reversed(fed.get(sid, ())))
        return order

    @cached_property
    def unreached(self) -> list[str]:
        """Sources no chain of feeders reaches from a top: they are in a loop."""
        reached = set(self.order)
        return [sid for sid in self.sources if sid not in reached]

    @cached_property
    def transformers(self) -> frozenset[str]:
        """Ids of the transformers among the sources (a run from one is on its secondary)."""
        return frozenset(sid for sid, s in self.sources.items() if s.kind == "transformer")

    @cached_property
    def position(self) -> dict[str, int]:
        """{run id: index of its first run in the file}."""
        ids = [r.id for r in self.runs]
        # the first index of each id: later indexes are written first and overwritten
        return dict(zip(reversed(ids), range(len(ids) - 1, -1, -1), strict=True))

    # -- reading the graph ---------------------------------------------------------------------
    def roots(self) -> list[Source]:
        """Sources nothing feeds (the services, and any source whose feeder is missing), in file
        order."""
        return [s for sid, s in self.sources.items() if sid not in self.feeder]

    def is_feeder(self, run: Run) -> bool:
        """True when ``run`` carries the supply of the source it ends at."""
        return self.feeder.get(run.to) is run

    def runs_below(self, source_id: str) -> list[Run]:
        """Every run fed through ``source_id``: its own runs, then depth first through the sources
        they feed (the last feeder's source first)."""
        children = self.children
        return [r for sid in self._down(source_id, _every) for r in children[sid]]

    def sources_below(self, source_id: str, follow: Callable[[Source], bool]) -> list[Source]:
        """``source_id`` and every source below it that ``follow`` lets the walk go on into."""
        sources = self.sources
        return [sources[sid] for sid in self._down(source_id, follow)]

    def _down(self, source_id: str, follow: Callable[[Source], bool]) -> Iterator[str]:
        """Source ids from ``source_id`` down, depth first, each once, going on into a source
        below only where ``follow(source)``."""
        sources, children = self.sources, self.children
        stack = [source_id]
        seen: set[str] = set()
        while stack:
            sid = stack.pop()
            if sid in seen or sid not in sources:
                continue
            seen.add(sid)
            yield sid
            for r in children[sid]:
                dest = sources.get(r.to)
                if dest is not None and follow(dest):
                    stack.append(r.to)

    def feeder_loops(self) -> list[tuple[list[str], Run]]:
        """Each loop of feeders once: (source ids round the loop, its first id again at the end;
        the run closing it), following each source up its first claimed feeder."""
        first = {sid: claims[0] for sid, claims in self.feeds.items()}
        reported: set[str] = set()
        out: list[tuple[list[str], Run]] = []
        for s in self.job.sources:
            chain: list[str] = []
            current = s.id
            while current in first and current not in chain:
                chain.append(current)
                current = first[current].from_
            if current in chain and not reported.intersection(chain):
                loop = chain[chain.index(current):] + [current]
                reported.update(loop)
                out.append((loop, first[current]))
        return out

    # -- the incremental path ------------------------------------------------------------------
    def shape(self) -> tuple:
        """What the graph depends on: every run's (id, from, to) and source's (id, kind, system)."""
        return tuple([(r.id, r.from_, r.to) for r in self.job.runs]
                     + [(s.id, s.kind, s.system) for s in self.job.sources])

    def fits(self, job: Job, run: Run, shape: tuple) -> bool:
        """True when ``job`` is the walk this was built from, with at most ``run`` put in place
        of the run of the same id (same ``from`` and ``to``; it is then patched in), every other
        run and source the same object (or, where not, one equal to it: the same fields, so the
        same results), and no source re-pointed or re-kinded. Costs a comparison of the lists in
        C, object by object (identical objects are not compared further), instead of rebuilding
        the graph."""
        i = self.position.get(run.id)
        if (job is not self.job or i is None or len(job.runs) != len(self.runs)
                or job.runs[i] is not run or shape[i] != (run.id, run.from_, run.to)):
            return False
        old = self.runs[i]
        self.runs[i] = run
        if job.runs != self.runs or job.sources != self._sources_built:
            self.runs[i] = old
            return False
        if shape[len(self.runs):] != tuple((s.id, s.kind, s.system) for s in job.sources):
            self.runs[i] = old
            return False
        if old is not run:
            for table in (self.children.get(run.from_, []), self.feeds.get(run.to, [])):
                for k, r in enumerate(table):
                    if r is old:
                        table[k] = run
            if self.feeder.get(run.to) is old:
                self.feeder[run.to] = run
        return True


def _every(source: Source) -> bool:
    return True
