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
- ``recompute_run(job, result, run_id) -> JobResult``: after one run was edited in place (same
  ``from`` and ``to``), redo that run, the feeders above it and what their drop changes below;
  falls back to ``compute_job`` when the walk's shape changed.

Rules: a feeder's load is what its panel serves, the sum of the apparent power of the runs below
it (loads in A turned into VA on their own circuit), turned back into amps on the feeder's
circuit; its continuous share likewise (NEC 215.2(A)(1)). A feeder with its own ``load`` uses
that instead. Percent drops add along a chain and restart at a transformer secondary
(``gaugewalk.model.walk.chain``). Summing VA arithmetically ignores the phase angle between loads, which can
only overstate the current (common practice).
"""

from __future__ import annotations

import gc
import math
from dataclasses import MISSING, dataclass, field, fields, replace

from gaugewalk.model.walk.chain import upstream_drop
from gaugewalk.model.walk.job import Job, Run
from gaugewalk.model.engine.loads import UNITS, LoadError, load_amps
from gaugewalk.model.engine.contract import Circuit, RunResult, RunSpec
from gaugewalk.model.engine.sizing import evaluate
from gaugewalk.model.engine.circuits import CircuitError, resolve_circuit
from gaugewalk.model.walk.checks import Problem, connection_of, default_connection

SQRT3 = math.sqrt(3.0)
_EPS = 1e-9


@dataclass(frozen=True)
class FeederLoad:
    """What a feeder carries, from the loads below it: apparent power [VA], its continuous part
    [VA] and real power [W]."""

    va: float
    continuous_va: float
    watts: float


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
    _walk: object = field(default=None, repr=False, compare=False)

    @property
    def ok(self) -> bool:
        """True when every run was computed and meets its limits."""
        return not self.problems

    def run_problems(self, run_id: str) -> list[Problem]:
        """Problems of one run (its own and the engine's)."""
        return list(self._run_problems.get(run_id, ()))


def _va_of(value: float, unit: str, circuit: Circuit, pf: float) -> float:
    """Apparent power of a load [VA]: A times the circuit's volts (times sqrt 3 on three
    phases), VA as given, W divided by the power factor."""
    if unit == "A":
        return value * circuit.line_volts * (SQRT3 if circuit.phases == 3 else 1.0)
    va = value * UNITS[unit]
    return va / pf if unit in ("W", "kW") else va


def _amps_of_va(va: float, circuit: Circuit) -> float:
    """Line current of an apparent power on a circuit [A] (S/V, S/(sqrt 3 V_LL))."""
    return va / (circuit.line_volts * (SQRT3 if circuit.phases == 3 else 1.0))


class _Walk:
    """The walk's shape, built once: sources, feeders, runs per source, order from the top."""

    def __init__(self, job: Job) -> None:
        self.job = job
        self.sources = {}
        for s in job.sources:
            self.sources.setdefault(s.id, s)
        self.feeder: dict[str, Run] = {}
        self.children: dict[str, list[Run]] = {sid: [] for sid in self.sources}
        self.orphans: list[Run] = []
        for r in job.runs:
            if r.from_ not in self.sources:
                self.orphans.append(r)
                continue
            self.children[r.from_].append(r)
            if r.to in self.sources and r.to not in self.feeder and r.to != r.from_:
                self.feeder[r.to] = r
        # sources from the top: roots are those nothing feeds
        self.order: list[str] = []
        seen: set[str] = set()
        stack = [sid for sid in self.sources if sid not in self.feeder]
        stack.reverse()
        while stack:
            sid = stack.pop()
            if sid in seen:
                continue
            seen.add(sid)
            self.order.append(sid)
            below = [r.to for r in self.children[sid] if self.feeder.get(r.to) is r]
            stack.extend(reversed(below))
        self.unreached = [sid for sid in self.sources if sid not in seen]
        # for recompute_run: the objects this walk was built from, to tell whether it still fits
        self.runs = list(job.runs)
        self.run_ids = list(map(id, self.runs))
        self.source_ids = list(map(id, job.sources))
        self.position: dict[str, int] = {}
        for i, r in enumerate(self.runs):
            self.position.setdefault(r.id, i)

    def fits(self, job: Job, run: Run, shape: tuple) -> bool:
        """True when ``job`` is the walk this was built from, with at most ``run`` put in place
        of the run of the same id (same ``from`` and ``to``; it is then patched in), every other
        run and source the same object, and no source re-pointed or re-kinded. Costs a pass in C
        over the lists instead of rebuilding the walk."""
        i = self.position.get(run.id)
        if (job is not self.job or i is None or len(job.runs) != len(self.runs)
                or job.runs[i] is not run or shape[i] != (run.id, run.from_, run.to)):
            return False
        old = self.runs[i]
        self.run_ids[i] = id(run)
        if list(map(id, job.runs)) != self.run_ids or list(map(id, job.sources)) != self.source_ids:
            self.run_ids[i] = id(old)
            return False
        if shape[len(self.runs):] != tuple((s.id, s.kind, s.system) for s in job.sources):
            return False
        if old is not run:
            self.runs[i] = run
            siblings = self.children.get(run.from_, [])
            for k, r in enumerate(siblings):
                if r is old:
                    siblings[k] = run
            if self.feeder.get(run.to) is old:
                self.feeder[run.to] = run
        return True

    def shape(self) -> tuple:
        return tuple((r.id, r.from_, r.to) for r in self.job.runs) + tuple(
            (s.id, s.kind, s.system) for s in self.job.sources)


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
    if load is not None:
        if load.pf is not None:
            pf = load.pf
        amps = _load_amps(load.value, load.unit, circuit, pf)
    elif feeder:
        if feeder_load is None:
            feeder_load = _sum_below(job, run.to)
        if feeder_load.va <= 0:
            raise LoadError(f"{run.to} serves no load yet, so its feeder cannot be sized; "
                            "add its runs or give the feeder a load")
        amps = _amps_of_va(feeder_load.va, circuit)
        continuous_amps = _amps_of_va(feeder_load.continuous_va, circuit)
        pf = min(1.0, max(0.05, feeder_load.watts / feeder_load.va))
    else:
        raise LoadError("the run has no load; give it in A, VA, kVA, W or kW")
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
    values["continuous"] = run.continuous if continuous_amps is None else False
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
    _set_attr(spec, "__dict__", values)
    return spec


def _sum_below(job: Job, source_id: str) -> FeederLoad:
    """What a source serves, summed through every level below it (single use; ``compute_job``
    sums all sources in one pass)."""
    state = _State(_Walk(job), JobResult())
    state.resolve_circuits()
    state.sum_loads()
    return state.result._loads.get(source_id, FeederLoad(0.0, 0.0, 0.0))


def _feeder_load(va: float, continuous_va: float, watts: float) -> FeederLoad:
    """``FeederLoad(va, continuous_va, watts)`` without the per-field ``object.__setattr__`` of
    a frozen dataclass's ``__init__`` (two are made per run)."""
    load = _new_object(FeederLoad)
    _set_attr(load, "__dict__", {"va": va, "continuous_va": continuous_va, "watts": watts})
    return load


def _add(a: FeederLoad, b: FeederLoad, sign: float = 1.0) -> FeederLoad:
    return _feeder_load(a.va + sign * b.va, a.continuous_va + sign * b.continuous_va,
                        a.watts + sign * b.watts)


_ZERO = FeederLoad(0.0, 0.0, 0.0)


class _State:
    """One computation over a walk, writing into a JobResult."""

    def __init__(self, walk: _Walk, result: JobResult) -> None:
        self.walk = walk
        self.job = walk.job
        self.result = result
        self._circuit_cache: dict[tuple[str, str], Circuit] = {}

    def fail(self, run: Run, message: str, field_name: str | None = None) -> None:
        self.result._run_problems[run.id] = [Problem("", None, f"run {run.id}", field_name, message)]

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
        pf = run.load.pf if run.load.pf is not None else self.job.defaults.pf
        va = _va_of(run.load.value, run.load.unit, circuit, pf)
        return _feeder_load(va, va if run.continuous else 0.0, va * pf)

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
        walk, res = self.walk, self.result
        for sid in reversed(walk.order):
            total = _ZERO
            for r in walk.children[sid]:
                load = self.own_load(r)
                if load is None and walk.feeder.get(r.to) is r:
                    load = res._loads.get(r.to)
                self.set_run_load(r, load)
                if load is not None:
                    total = _add(total, load)
            res._loads[sid] = total
            res.connected_va[sid] = total.va

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
            res._run_problems[r.id] = [Problem("", None, f"run {r.id}", None, m)
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
            found.append(Problem("", None, f"run {r.id}", "from", f"the run starts at "
                                 f"'{r.from_}', which is not a source of this job"))
        for sid in walk.unreached:
            found.append(Problem("", None, f"source {sid}", None, "this source is in a loop of "
                                 "feeders, so it cannot be followed up to the service"))
        for sid in walk.order:
            s = walk.sources[sid]
            if s.kind == "transformer" and s.kva is not None:
                va = self.result._loads[sid].va
                if va > s.kva * 1000.0 + _EPS:
                    found.append(Problem("", None, f"source {sid}", "kva", f"the loads below add "
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
    walk = _Walk(job)
    result = JobResult()
    state = _State(walk, result)
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


def recompute_run(job: Job, result: JobResult, run_id: str) -> JobResult:
    """Update ``result`` after run ``run_id`` was edited in place; returns the updated result.

    Redoes the run and, when its load changed, every feeder above it that sums its panel; then,
    below every source whose drop changed, re-evaluates only the runs whose size could change
    (upsized for drop, with problems, or pushed over the total target) and shifts the total drop
    of the rest. Falls back to ``compute_job`` when runs or sources were added, removed or
    re-pointed. Only ``run_id`` may have changed since ``result`` was computed (edited in place
    or put in place of the run of the same id, as the app does).
    """
    run = job.run(run_id)
    if run is None:
        return compute_job(job)
    walk = result._walk
    if not isinstance(walk, _Walk) or not walk.fits(job, run, result._shape):
        walk = _Walk(job)
        if walk.shape() != result._shape:
            return compute_job(job)
        result._walk = walk
    if run.from_ not in walk.sources:
        return compute_job(job)
    state = _State(walk, result)
    if state.resolve_circuit(run) is None:
        state.forget(run)
    # the run's load and the sums above it
    is_feeder = walk.feeder.get(run.to) is run
    new = state.own_load(run)
    if new is None and is_feeder:
        new = result._loads.get(run.to)
    old = result._run_loads.get(run_id)
    state.set_run_load(run, new)
    delta = _add(new or _ZERO, old or _ZERO, -1.0)
    chain: list[Run] = []
    sid = run.from_
    if delta != _ZERO:
        while True:
            total = _add(result._loads[sid], delta)
            result._loads[sid] = total
            result.connected_va[sid] = total.va
            f = walk.feeder.get(sid)
            if f is None or f.load is not None:
                break
            state.set_run_load(f, total)
            chain.append(f)
            sid = f.from_
    # re-evaluate top-down: the feeders whose load changed, then the run itself
    dirty: list[str] = []
    for f in reversed(chain):
        state.evaluate_run(f, result.source_drop_pct.get(f.from_, 0.0))
        dirty.append(f.to)
    state.evaluate_run(run, result.source_drop_pct.get(run.from_, 0.0))
    if is_feeder:
        dirty.append(run.to)
    _refresh_below(state, dirty, skip={f.id for f in chain} | {run.id})
    state.chain_problems()
    state.assemble_problems()
    return result


def _refresh_below(state: _State, dirty: list[str], skip: set[str]) -> None:
    """Carry new bus drops down: shift the total where the size cannot change, else
    re-evaluate the run."""
    walk, result = state.walk, state.result
    stack = list(reversed(dirty))
    while stack:
        sid = stack.pop()
        upstream = result.source_drop_pct.get(sid, 0.0)
        for r in walk.children[sid]:
            is_feeder = walk.feeder.get(r.to) is r
            if r.id in skip:
                continue
            old = result.runs.get(r.id)
            spec = result._specs.get(r.id)
            if old is None or spec is None:
                state.evaluate_run(r, upstream)
            elif spec.upstream_drop_pct == upstream:
                continue
            elif (old.ok and old.governed_by != "voltage drop"
                        and upstream + old.voltage_drop_pct <= spec.max_total_drop_pct + _EPS):
                total = upstream + old.voltage_drop_pct
                margins = dict(old.margins)
                if "total_drop_pct" in margins:
                    margins["total_drop_pct"] = spec.max_total_drop_pct - total
                spec = replace(spec, upstream_drop_pct=upstream)
                result._specs[r.id] = spec
                state.store(r, replace(old, total_drop_pct=total, margins=margins),
                            is_feeder, spec)
            else:
                state.evaluate_run(r, upstream)
            if is_feeder and r.to not in dirty:
                stack.append(r.to)
