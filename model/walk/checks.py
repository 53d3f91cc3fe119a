"""Checks that need more than one table of a walk: ids, references, the supply graph, systems.

Public API:

- ``check_references(job, locator, file, skip_sources, skip_runs, failed_targets,
  skip_raceways)``: duplicate ids, dangling references (sources, shared raceways), sources fed
  twice or not at all, loops of feeders, connections a system cannot supply, feeders that do not
  bring their panel's system, branches without a load; each a
  ``gaugewalk.model.walk.problems.Problem`` about the run, source or raceway.
- ``default_connection(system_id, to_transformer)`` and ``connection_of(job, run)``.
"""

from __future__ import annotations

from collections.abc import Callable, Sequence

from gaugewalk.model.engine.circuits import SYSTEMS, CircuitError, resolve_circuit
from gaugewalk.model.engine.vocabulary import LOAD_UNITS, or_words
from gaugewalk.model.walk.graph import SupplyGraph
from gaugewalk.model.walk.job import Job, Raceway, Run, Source
from gaugewalk.model.walk.problems import Locator, Problem

# -- references, cycles, systems ---------------------------------------------------------------

_FULL_CONNECTION = {(3, True): "3PN", (3, False): "3P", (1, True): "LLN", (1, False): "LL"}


def nonlinear_of(job: Job, run: Run) -> bool:
    """Whether ``run``'s loads are taken as mostly nonlinear (NEC 310.15(E)(3), 220.61(C)(2)):
    ``nonlinear_said`` of the source it feeds and the one it starts at."""
    return nonlinear_said(job.source(run.to), job.source(run.from_),
                          job.defaults.nonlinear_loads)


def nonlinear_said(fed: Source | None, start: Source | None, job_says: bool) -> bool:
    """As the source a run feeds says (a feeder), else the source it starts at, else the job
    (``Source.nonlinear_loads``, ``Defaults.nonlinear_loads``)."""
    source = fed if fed is not None else start
    said = source.__dict__["nonlinear_loads"] if source is not None else None
    return job_says if said is None else said


def default_connection(system_id: str, to_transformer: bool = False) -> str:
    """The connection a run uses when it names none: every hot the system offers and its
    neutral; a transformer primary takes the hots only (common practice)."""
    system = SYSTEMS[system_id]
    if system.hots == 1:
        return "LN"
    if to_transformer:
        return "3P" if system.phases == 3 else "LL"
    return _FULL_CONNECTION[(system.phases, system.has_neutral)]


_TWO_POLE_KINDS = ("ev-charger", "water-heater", "heater", "welder")
"""Kinds wired line to line when nothing says otherwise (common practice: 208/240 V chargers,
water heaters, heaters and welders)."""

_SMALL_MOTOR_MAX_LN_V = 127.0
"""A motor under 1 hp is taken as a 115 V single-phase motor only where the system gives about
120 V to neutral (Table 430.248's 115 V column); elsewhere it takes every hot (common practice)."""


def branch_circuit_for_kind(system_id: str, kind: str = "general",
                            hp: float | None = None) -> str:
    """A branch run's circuit when nothing says otherwise, by what the load is (common
    practice; the run card and ``add`` write it into the walk and show it in words):
    lighting, receptacles and general loads take one pole and the neutral; EV chargers, water
    heaters, heaters and welders two poles; motors of 1 hp or more and HVAC equipment every
    hot without the neutral (three poles on a three-phase system), smaller motors one pole and
    the neutral where that gives about 120 V. A system with no neutral gives two poles where one was meant."""
    system = SYSTEMS[system_id]
    if system.hots == 1:
        return "LN"
    every_hot = "3P" if system.phases == 3 else "LL"
    small_motor_ln = (hp is not None and hp < 1 and system.line_to_neutral_v is not None
                      and system.line_to_neutral_v <= _SMALL_MOTOR_MAX_LN_V)
    if kind in ("hvac", "fire-pump") or (kind == "motor" and not small_motor_ln):
        return every_hot
    if kind in _TWO_POLE_KINDS or not system.has_neutral:
        return "LL"
    return "LN"


def unstated_circuit_note(system_id: str, taken: str) -> str | None:
    """What to say of a branch run whose walk states no connection and which was computed as
    ``taken`` (``default_connection``): nothing on a one-hot system, which offers one circuit."""
    if SYSTEMS[system_id].hots == 1:
        return None
    return (f"circuit not stated in the walk: computed as {taken} (every hot and the neutral of "
            "its source); state the run's connection if the load is wired otherwise")


def connection_of(job: Job, run: Run) -> str | None:
    """The run's connection, or its default from the source's system; None if the source is
    unknown."""
    if run.connection is not None:
        return run.connection
    source = job.source(run.from_)
    if source is None:
        return None
    target = job.source(run.to)
    return default_connection(source.system, target is not None and target.kind == "transformer")


def _delivers(circuit, system_id: str) -> bool:
    """True when a feeder's circuit brings the destination's system (same phases, voltage,
    neutral)."""
    system = SYSTEMS[system_id]
    return (
        circuit.phases == system.phases
        and abs(circuit.line_volts - system.line_to_line_v) < 0.5
        and circuit.neutral == system.has_neutral
        and (system.has_neutral or circuit.hots == system.hots)
    )


def check_references(
    job: Job,
    locator: Locator,
    file: str,
    skip_sources: set[str] = frozenset(),
    skip_runs: set[str] = frozenset(),
    failed_targets: set[str] = frozenset(),
    skip_raceways: set[str] = frozenset(),
) -> list[Problem]:
    """Everything that needs more than one table: duplicate ids, a run from a source that does not
    exist, sources without a feeder or with two, a chain that loops, a connection the source's
    system cannot supply, a feeder that does not deliver its panel's system, a branch without a
    load, a shared raceway named that the walk does not have. ``skip_*`` are ids of tables that already failed, and ``failed_targets`` the ``to`` of
    runs that failed, so one mistake is reported once."""
    problems: list[Problem] = []
    source_index = {id(s): i for i, s in enumerate(job.sources)}
    run_index = {id(r): i for i, r in enumerate(job.runs)}

    def at_run(run: Run, field: str | None, message: str) -> None:
        i = run_index[id(run)]
        line = locator.key_line("run", i, field) if field else locator.table_line("run", i)
        problems.append(Problem(file, line, "run", run.id, field, message))

    def at_source(source, field: str | None, message: str) -> None:
        i = source_index[id(source)]
        line = locator.key_line("source", i, field) if field else locator.table_line("source", i)
        problems.append(Problem(file, line, "source", source.id, field, message))

    raceway_index = {id(r): i for i, r in enumerate(job.raceways)}

    def at_raceway(raceway: Raceway, field: str | None, message: str) -> None:
        i = raceway_index[id(raceway)]
        line = (locator.key_line("raceway", i, field) if field
                else locator.table_line("raceway", i))
        problems.append(Problem(file, line, "raceway", raceway.id, field, message))

    tables: tuple[tuple[str, Sequence[Source | Run | Raceway], Callable], ...] = (
        ("source", job.sources, at_source), ("raceway", job.raceways, at_raceway),
        ("run", job.runs, at_run))
    for table, items, at in tables:
        seen: dict[str, int] = {}
        for i, item in enumerate(items):
            first = seen.setdefault(item.id, i)
            if first != i:
                at(item, "id", f"the id '{item.id}' is used by another {table} too "
                   f"(line {locator.table_line(table, first)}); ids must differ")

    graph = SupplyGraph(job)
    sources = graph.sources
    feeders = {sid: claims[0] for sid, claims in graph.feeds.items()}  # the first claim counts
    second = [r for claims in graph.feeds.values() if len(claims) > 1 for r in claims[1:]]
    for r in sorted(second, key=lambda r: run_index[id(r)]):
        at_run(r, "to", f"source {r.to} is already fed by run {feeders[r.to].id}; "
               "a source has one feeder (use 'sets' for conductors in parallel)")

    for s in job.sources:
        if s.id in skip_sources:
            continue
        if s.kind == "service":
            if s.id in feeders:
                at_source(s, "kind", f"a service is fed by the utility, but run "
                          f"{feeders[s.id].id} feeds it; make it a panel or switchboard")
        elif s.id not in feeders and s.id not in failed_targets:
            at_source(s, None, f"nothing feeds this {s.kind}; add a run to it from its source, "
                      "or make it the service")

    for loop, closing in graph.feeder_loops():
        at_run(closing, "from", "the feeders go round in a loop: " + " <- ".join(loop)
               + "; one of them must come from another source")

    raceway_ids = {r.id for r in job.raceways} | set(skip_raceways)
    for r in job.runs:
        if (r.raceway_id is None and not r.segments) or r.id in skip_runs:
            continue
        if r.raceway_id is not None and r.raceway_id not in raceway_ids:
            at_run(r, "raceway_id", f"there is no shared raceway '{r.raceway_id}'; add it as a "
                   "[[raceway]] table or correct the id")
        for n, seg in enumerate(r.segments, start=1):
            if seg.raceway_id is not None and seg.raceway_id not in raceway_ids:
                at_run(r, "segments", f"segment {n}: there is no shared raceway "
                       f"'{seg.raceway_id}'; add it as a [[raceway]] table or correct the id")

    circuits: dict[tuple[str, str | None], object] = {}  # Circuit or the CircuitError
    for r in job.runs:
        if r.id in skip_runs:
            continue
        source = sources.get(r.from_)
        if source is None:
            if r.from_ not in skip_sources:
                at_run(r, "from", f"the run starts at '{r.from_}', which is not a source of this "
                       "job; add the source or correct the id")
            continue
        if r.from_ == r.to:
            at_run(r, "to", "the run ends where it starts")
            continue
        target = sources.get(r.to)
        if source.id in skip_sources or (target is not None and target.id in skip_sources):
            continue
        connection = connection_of(job, r)
        circuit = circuits.get((source.system, connection))
        if circuit is None:  # a walk has few systems and connections: resolve each pair once
            try:
                circuit = resolve_circuit(source.system, connection)
            except CircuitError as exc:
                circuit = exc
            circuits[(source.system, connection)] = circuit
        if isinstance(circuit, CircuitError):
            at_run(r, "connection" if r.connection else "from",
                   f"{connection} from source {source.id}: {circuit}")
            continue
        if target is None:
            if r.to in skip_sources:
                continue
            if r.load is None:
                at_run(r, "load", f"the run has no load; give it in {or_words(LOAD_UNITS)}")
        elif target.kind != "transformer" and not _delivers(circuit, target.system):
            at_run(r, "connection" if r.connection else "to",
                   f"this feeder from {source.id} ({source.system}, {connection}) cannot bring "
                   f"{target.id}'s system {target.system}; only a transformer changes the "
                   "system")
    return problems


def _run_problem_free(job: Job, run: Run) -> bool:
    """The checks of ``check_references`` about one run alone (its source, its ends, its
    connection, the system it brings, its load) find nothing; sources looked up in ``job``."""
    source = job.source(run.from_)
    if source is None or run.from_ == run.to:
        return False
    try:
        circuit = resolve_circuit(source.system, connection_of(job, run))
    except CircuitError:
        return False
    target = job.source(run.to)
    if target is None:
        return run.load is not None
    return target.kind == "transformer" or _delivers(circuit, target.system)


def put_keeps_clean(job: Job, run: Run, old: Run | None) -> bool:
    """True when ``check_references`` finds nothing in ``job`` with ``run`` put in place of
    ``old`` (None: added at the end), the sources unchanged, given that it finds nothing in
    ``job`` now; False when it might find something (then check the whole walk).

    Only what the change can touch is looked at, in a few lookups: the run's id against the
    other runs' (ids unique now, so only a new id can repeat one), the checks about the run
    alone, and the feeder of the sources at its ends (every source but the service has exactly
    one now; a run that feeds a source, or fed one, keeps clean only as the same feeder, from the
    same source to the same source, so no source gains or loses its feeder and no loop forms).
    Every other run's checks read only the sources, which do not change."""
    if old is not None and job.run(old.id) is not old:
        return False
    if (old is None or run.id != old.id) and job.run(run.id) is not None:
        return False
    if job.source(run.to) is not None or (old is not None and job.source(old.to) is not None):
        if old is None or run.to != old.to or run.from_ != old.from_:
            return False
    return _run_problem_free(job, run)
