"""Compute a whole walk: every run sized, feeder loads summed, drop carried down every chain.

Public API:

- ``compute_job(job) -> JobResult``.
- ``JobResult``: ``runs`` {run id: ``RunResult``}, ``run_total_drop_pct`` {run id: [%] from the
  service (or the last transformer) to the run's far end}, ``source_drop_pct`` {source id: [%] at
  its bus}, ``feeder_amps`` {run id: [A]} for feeders, ``connected_va`` {source id: [VA] it
  serves}, ``run_va`` {run id: [VA]}, ``problems`` (list of ``Problem``, per run and per chain),
  ``ok``, ``run_problems(run_id)``.
- ``run_spec_for(job, run, upstream_drop_pct, *, feeder_load=None) -> RunSpec``: the engine input
  with the job defaults applied and the branch or feeder drop target.
- ``WalkState``: one computation over a walk writing into a ``JobResult`` (shared with the
  incremental path, ``gaugewalk.model.walk.recompute``).

Rules: the supply graph (``gaugewalk.model.walk.graph``) is walked from the top; a feeder's load
is what its panel serves (``gaugewalk.model.walk.feeder_loads``, NEC 215.2(A)(1)); each run is
sized by the engine (``gaugewalk.model.engine.sizing``); percent drops add along a chain and
restart at a transformer secondary (``gaugewalk.model.walk.chain``).
"""

from __future__ import annotations

import gc
import math
from dataclasses import MISSING, dataclass, field, fields, replace

from gaugewalk.model.engine.circuits import CircuitError, resolve_circuit
from gaugewalk.model.engine.contract import Circuit, RunResult, RunSpec
from gaugewalk.model.engine.loads import UNITS, LoadError, load_amps
from gaugewalk.model.engine.sizing import evaluate
from gaugewalk.model.engine.vocabulary import LOAD_UNITS, or_words
from gaugewalk.model.walk.chain import upstream_drop
from gaugewalk.model.walk.checks import connection_of, default_connection, unstated_circuit_note
from gaugewalk.model.walk.equipment import load_facts
from gaugewalk.model.walk.feeder_loads import (
    SQRT3,
    FeederLoad,
    amps_of_va,
    load_of,
    sum_loads,
)
from gaugewalk.model.walk.graph import SupplyGraph
from gaugewalk.model.walk.job import Job, Run
from gaugewalk.model.walk.problems import Problem

_EPS = 1e-9


@dataclass
class JobResult:
    """Everything computed for a walk."""

    runs: dict[str, RunResult] = field(default_factory=dict)
    run_total_drop_pct: dict[str, float] = field(default_factory=dict)
    source_drop_pct: dict[str, float] = field(default_factory=dict)
    feeder_amps: dict[str, float] = field(default_factory=dict)
    connected_va: dict[str, float] = field(default_factory=dict)
    run_va: dict[str, float] = field(default_factory=dict)
    problems: list[Problem] = field(default_factory=list)
    # kept for recompute_run
    _specs: dict[str, RunSpec] = field(default_factory=dict, repr=False)
    _circuits: dict[str, Circuit] = field(default_factory=dict, repr=False)
    _loads: dict[str, FeederLoad] = field(default_factory=dict, repr=False)
    _run_loads: dict[str, FeederLoad] = field(default_factory=dict, repr=False)
    _run_problems: dict[str, list[Problem]] = field(default_factory=dict, repr=False)
    _chain_problems: list[Problem] = field(default_factory=list, repr=False)
    _shape: tuple = field(default=(), repr=False)
    _walk: SupplyGraph | None = field(default=None, repr=False, compare=False)

    @property
    def ok(self) -> bool:
        """True when every run was computed and meets its limits."""
        return not self.problems

    def run_problems(self, run_id: str) -> list[Problem]:
        """Problems of one run (its own and the engine's)."""
        return list(self._run_problems.get(run_id, ()))


def run_spec_for(
    job: Job,
    run: Run,
    upstream_drop_pct: float,
    *,
    feeder_load: FeederLoad | None = None,
    circuit: Circuit | None = None,
    is_feeder: bool | None = None,
) -> RunSpec:
    """The engine input for one run, with the job defaults applied.

    A branch uses the branch drop target, a feeder the feeder target (informational notes to
    NEC 210.19 and 215.2); both share the total target. A feeder without its own load needs
    ``feeder_load`` (what its panel serves); when it is not given it is summed here.
    Raises ``LoadError`` or ``CircuitError`` for a run that cannot be specified.
    """
    if circuit is None:
        source = job.source(run.from_)
        if source is None:
            raise CircuitError(f"the run starts at '{run.from_}', which is not a source of this job")
        circuit = resolve_circuit(source.system, connection_of(job, run))
    if is_feeder is None:
        is_feeder = job.source(run.to) is not None
    return _spec(job, run, upstream_drop_pct, circuit, is_feeder, feeder_load)


_NUMBER = (int, float)
_SPEC_TEMPLATE = {f.name: None if f.default is MISSING else f.default for f in fields(RunSpec)}
"""Every RunSpec field in order, with its default; copied and filled per run (a copy and item
sets cost half a dict display of 26 keys)."""
_new_object = object.__new__
_set_attr = object.__setattr__


def _load_amps(value: float, unit: str, circuit: Circuit, pf: float) -> float:
    """``gaugewalk.model.engine.loads.load_amps`` for the usual load (a canonical unit, a positive number, a valid
    power factor) without its unit normalising and checks; anything else goes through it."""
    if (unit.__class__ is str and unit in UNITS and value.__class__ in _NUMBER
            and 0 < value < math.inf):
        if unit == "A":
            return float(value)
        if pf.__class__ in _NUMBER and 0 < pf <= 1:
            va = value * UNITS[unit]
            if unit in ("W", "kW"):
                va /= pf
            if circuit.phases == 3:
                return va / (SQRT3 * circuit.line_volts)
            return va / circuit.line_volts
    return load_amps(value, unit, circuit, pf)


def _spec(job: Job, run: Run, upstream_drop_pct: float, circuit: Circuit, feeder: bool,
          feeder_load: FeederLoad | None) -> RunSpec:
    d = job.defaults
    pf = d.pf
    continuous_amps = None
    load = run.load
    equipment = None
    continuous = bool(run.continuous)
    if load is not None and load.kind == "general":
        if load.pf is not None:
            pf = load.pf
        amps = _load_amps(load.value, load.unit, circuit, pf)
    elif load is not None:
        facts = load_facts(run, circuit, pf)
        amps, pf, continuous, equipment = facts.amps, facts.pf, facts.continuous, facts.equipment
    elif feeder:
        if feeder_load is None:
            feeder_load = _sum_below(job, run.to)
        if feeder_load.va <= 0:
            raise LoadError(f"{run.to} serves no load yet, so its feeder cannot be sized; "
                            "add its runs or give the feeder a load")
        amps = amps_of_va(feeder_load.va, circuit)
        continuous_amps = amps_of_va(feeder_load.continuous_va, circuit)
        pf = min(1.0, max(0.05, feeder_load.watts / feeder_load.va))
    else:
        raise LoadError(f"the run has no load; give it in {or_words(LOAD_UNITS)}")
    max_drop = run.max_drop_pct
    if max_drop is None:
        max_drop = d.feeder_drop_pct if feeder else d.branch_drop_pct
    # Built without the per-field object.__setattr__ of a frozen dataclass's __init__ (the
    # larger part of this function's time): every field of RunSpec is set, in field order, those
    # not given here to RunSpec's defaults (ccc, egc, egc_material, egc_bare, stranded).
    spec = _new_object(RunSpec)
    values = _SPEC_TEMPLATE.copy()
    values["circuit"] = circuit
    values["amps"] = amps
    values["length_ft"] = run.length_ft
    values["continuous"] = continuous if continuous_amps is None else False
    values["continuous_amps"] = continuous_amps
    values["distributed"] = run.distributed
    values["material"] = run.material or d.material
    values["insulation"] = run.insulation or d.insulation
    values["terminal_temp"] = (run.terminal_temp if run.terminal_temp is not None
                               else d.terminal_temp)
    values["conductor_temp_c"] = (run.conductor_temp_c if run.conductor_temp_c is not None
                                  else d.conductor_temp_c)
    values["method"] = run.method or d.method
    values["pf"] = pf
    values["raceway"] = run.raceway or d.raceway
    values["ambient_c"] = run.ambient_c if run.ambient_c is not None else d.ambient_c
    values["sets"] = run.sets
    values["size"] = run.size
    values["ocpd_a"] = run.ocpd_a
    values["max_drop_pct"] = max_drop
    values["upstream_drop_pct"] = upstream_drop_pct
    values["max_total_drop_pct"] = d.total_drop_pct
    values["min_size"] = d.min_size
    values["equipment"] = equipment
    values["starting_drop_pct"] = d.starting_drop_pct
    _set_attr(spec, "__dict__", values)
    return spec


def _sum_below(job: Job, source_id: str) -> FeederLoad:
    """What a source serves, summed through every level below it (single use; ``compute_job``
    sums all sources in one pass)."""
    state = WalkState(SupplyGraph(job), JobResult())
    state.resolve_circuits()
    state.sum_loads()
    return state.result._loads.get(source_id, FeederLoad(0.0, 0.0, 0.0))


class WalkState:
    """One computation over a walk, writing into a JobResult."""

    def __init__(self, walk: SupplyGraph, result: JobResult) -> None:
        self.walk = walk
        self.job = walk.job
        self.result = result
        self._circuit_cache: dict[tuple[str, str], Circuit] = {}

    def fail(self, run: Run, message: str, field_name: str | None = None) -> None:
        self.result._run_problems[run.id] = [Problem("", None, "run", run.id, field_name, message)]

    def resolve_circuit(self, run: Run) -> Circuit | None:
        sources = self.walk.sources
        source = sources[run.from_]
        conn = run.connection
        if conn is None:
            target = sources.get(run.to)
            conn = default_connection(source.system, target is not None and target.kind == "transformer")
        key = (source.system, conn)
        c = self._circuit_cache.get(key)
        if c is None:
            try:
                c = resolve_circuit(source.system, conn)
            except CircuitError as exc:
                self.fail(run, str(exc), "connection")
                self.result._circuits.pop(run.id, None)
                return None
            self._circuit_cache[key] = c
        self.result._circuits[run.id] = c
        return c

    def resolve_circuits(self) -> None:
        for r in self.job.runs:
            if r.from_ in self.walk.sources:
                self.resolve_circuit(r)

    def own_load(self, run: Run) -> FeederLoad | None:
        """A run's own load as VA, continuous VA and W; None for a feeder summing its panel."""
        if run.load is None:
            return None
        circuit = self.result._circuits.get(run.id)
        if circuit is None:
            return None
        return load_of(run, circuit, self.job.defaults.pf)

    def set_run_load(self, run: Run, load: FeederLoad | None) -> None:
        res = self.result
        if load is None:
            res._run_loads.pop(run.id, None)
            res.run_va.pop(run.id, None)
        else:
            res._run_loads[run.id] = load
            res.run_va[run.id] = load.va

    def sum_loads(self) -> None:
        """Bottom-up: what each source serves [VA]."""
        res = self.result
        sum_loads(self.walk, res._circuits, self.job.defaults.pf, self.set_run_load, res._loads,
                  res.connected_va)

    def evaluate_run(self, r: Run, upstream: float) -> None:
        res = self.result
        res._run_problems.pop(r.id, None)
        circuit = res._circuits.get(r.id)
        if circuit is None:
            circuit = self.resolve_circuit(r)
            if circuit is None:
                self.forget(r)
                return
        is_feeder = self.walk.feeder.get(r.to) is r
        try:
            spec = _spec(self.job, r, upstream, circuit, is_feeder,
                         res._loads.get(r.to) if is_feeder else None)
            result = evaluate(spec)
        except (LoadError, CircuitError, ValueError) as exc:
            self.forget(r)
            self.fail(r, str(exc))
            return
        if r.connection is None and not is_feeder:
            note = unstated_circuit_note(self.job, r)
            if note is not None:
                result = replace(result, notes=(note, *result.notes))
        res._specs[r.id] = spec
        self.store(r, result, is_feeder, spec)

    def forget(self, r: Run) -> None:
        res = self.result
        for table in (res.runs, res.run_total_drop_pct, res.feeder_amps, res._specs):
            table.pop(r.id, None)

    def store(self, r: Run, result: RunResult, is_feeder: bool, spec: RunSpec) -> None:
        res = self.result
        res.runs[r.id] = result
        res.run_total_drop_pct[r.id] = result.total_drop_pct
        if result.problems:
            res._run_problems[r.id] = [Problem("", None, "run", r.id, None, m)
                                       for m in result.problems]
        else:
            res._run_problems.pop(r.id, None)
        if is_feeder:
            res.feeder_amps[r.id] = spec.amps
            target = self.walk.sources[r.to]
            res.source_drop_pct[r.to] = upstream_drop(
                result.total_drop_pct, from_transformer=target.kind == "transformer")

    def chain_problems(self) -> None:
        walk = self.walk
        found: list[Problem] = []
        for r in walk.orphans:
            found.append(Problem("", None, "run", r.id, "from", f"the run starts at "
                                 f"'{r.from_}', which is not a source of this job"))
        for sid in walk.unreached:
            found.append(Problem("", None, "source", sid, None, "this source is in a loop of "
                                 "feeders, so it cannot be followed up to the service"))
        for sid in walk.order:
            s = walk.sources[sid]
            if s.kind == "transformer" and s.kva is not None:
                va = self.result._loads[sid].va
                if va > s.kva * 1000.0 + _EPS:
                    found.append(Problem("", None, "source", sid, "kva", f"the loads below add "
                                         f"up to {va / 1000:.1f} kVA, more than the transformer's "
                                         f"{s.kva:g} kVA"))
        self.result._chain_problems = found

    def assemble_problems(self) -> None:
        res = self.result
        problems = list(res._chain_problems)
        position = self.walk.position
        if len(position) == len(self.job.runs):  # ids unique: only the runs with problems, in order
            for rid in sorted(res._run_problems, key=position.__getitem__):
                problems.extend(res._run_problems[rid])
        elif res._run_problems:
            for r in self.job.runs:
                problems.extend(res._run_problems.get(r.id, ()))
        res.problems = problems


def compute_job(job: Job) -> JobResult:
    """Size every run of the walk and carry the drop down every chain."""
    # Thousands of new results and no reference cycles among them: the cyclic collector's passes
    # over the growing heap only cost time (a quarter of it at 50,000 runs), so they wait.
    collecting = gc.isenabled()
    gc.disable()
    try:
        return _compute_job(job)
    finally:
        if collecting:
            gc.enable()


def _compute_job(job: Job) -> JobResult:
    walk = SupplyGraph(job)
    result = JobResult()
    state = WalkState(walk, result)
    state.resolve_circuits()
    state.sum_loads()
    for sid in walk.order:
        upstream = result.source_drop_pct.setdefault(sid, 0.0)
        for r in walk.children[sid]:
            state.evaluate_run(r, upstream)
    state.chain_problems()
    state.assemble_problems()
    result._shape = walk.shape()
    result._walk = walk
    return result
