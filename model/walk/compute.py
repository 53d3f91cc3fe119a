"""Compute a whole walk: every run placed, summed and sized, loads summed line by line up the
supply graph, drop carried down every chain.

Public API:

- ``compute_job(job) -> JobResult``.
- ``JobResult``: ``runs`` {run id: ``RunResult``}, ``run_total_drop_pct`` {run id: [%] from the
  service to the run's far end}, ``source_drop_pct`` {source id: [%] at its bus},
  ``feeder_amps`` {run id: [A] the load current on a feeder's heaviest line}, ``connected_va``
  {source id: [VA] it serves}, ``run_va`` {run id: [VA]}, ``lines`` {source id: ``Lines``, the
  phasor sums of its lines}, ``placements`` {run id: ``Placement``}, ``feeders`` {run id:
  ``FeederInfo``}, ``transformers`` {source id: ``TransformerInfo``}, ``loadings`` {source id:
  ``Loading``}, ``raceways`` {raceway id: ``SharedRaceway``} (shared raceways,
  ``gaugewalk.model.walk.raceways``), ``problems`` (list of ``Problem``, per run, per chain and
  per shared raceway), ``ok``, ``run_problems(run_id)``; ``marks()`` and ``changed_since(marks)``:
  the runs an update in place changed.
- ``FeederInfo``: what a feeder is sized for (``basis`` in words, ``amps``), its heaviest
  ``line`` and ``load_amps``, and the connected-load answer ``beside`` an equipment basis.
- ``run_spec_for(job, run, upstream_drop_pct, *, result=None) -> RunSpec`` and
  ``size_run(job, run, upstream_drop_pct, result=None) -> RunResult``: one run with the job
  defaults applied, the branch or feeder drop target and the feeder's rules.
- ``WalkState``: one computation over a walk writing into a ``JobResult`` (shared with the
  incremental path, ``gaugewalk.model.walk.recompute``).

Rules: the supply graph (``gaugewalk.model.walk.graph``) is walked from the bottom to place each
source's runs and sum its lines (``phases``, ``feeder_loads``; NEC 215.2(A)(1), 220.61), with the
transformers (``transformers``: Table 450.3(B), 240.21(C)) and the ratings (``ratings``:
408.30, 408.36); then from the top, each run sized by the engine (``gaugewalk.model.engine.sizing``)
with the drop carried down (``chain``). A run in a shared raceway is sized with the adjustment
of NEC 310.15(C)(1) for every current-carrying conductor in it, and the raceway's fill is checked
once every run is sized (``gaugewalk.model.walk.raceways``).
"""

from __future__ import annotations

import math
from collections.abc import Iterable
from dataclasses import MISSING, field, fields
from operator import itemgetter
from typing import NamedTuple

from gaugewalk.model.engine.circuits import CircuitError, resolve_circuit
from gaugewalk.model.engine.collector import collector_held
from gaugewalk.model.engine.contract import Circuit, RunResult, RunSpec, with_fields
from gaugewalk.model.engine.loads import UNITS, LoadError, load_amps
from gaugewalk.model.engine.record import record
from gaugewalk.model.engine.sizing import evaluate, evaluate_picked
from gaugewalk.model.engine.sizing.currents import design_current
from gaugewalk.model.engine.sizing.evaluate import Prepared, finish_prepared, prepared_for
from gaugewalk.model.engine.sizing.kinds import drop_targets
from gaugewalk.model.engine.vocabulary import LOAD_UNITS, MOTOR_KINDS, or_words
from gaugewalk.model.walk.chain import secondary_bus_drop
from gaugewalk.model.walk.checks import (
    connection_of,
    default_connection,
    nonlinear_of,
    nonlinear_said,
    unstated_circuit_note,
)
from gaugewalk.model.walk.demand import DemandStep, apply_demand
from gaugewalk.model.walk.equipment import (
    is_sign_outlet,
    load_facts,
    named_duty_motor,
    named_refrigerant_motor,
    named_roof_run,
    named_sign,
    named_unit_load,
    pf_assumed,
    sign_outlet_device,
)
from gaugewalk.model.walk.feeder_loads import (
    SQRT3,
    Feed,
    Lines,
    OwnLoad,
    feed_of,
    neutral_load,
    own_load,
    sum_source,
    va_of,
)
from gaugewalk.model.walk.fire_pumps import (
    feeder_check,
    fire_pump_device,
    named_fire_pump,
    supply_notes,
)
from gaugewalk.model.walk.graph import SupplyGraph
from gaugewalk.model.walk.job import Job, Run, shared_ids
from gaugewalk.model.walk.motor_feeders import (
    MotorGroup,
    below_branch_device,
    device_limit,
    heaviest_with_motor,
    largest,
    notes_for,
    run_motor,
)
from gaugewalk.model.walk.phases import Placement
from gaugewalk.model.walk.problems import Problem
from gaugewalk.model.walk.raceways import (
    SharedRaceway,
    ccc_by_raceway,
    ccc_for_run,
    raceway_ccc,
    shared_raceways,
)
from gaugewalk.model.walk.ratings import (
    FeederRule,
    Loading,
    equipment_rule,
    loading,
    lugs_bus,
    lugs_problem,
)
from gaugewalk.model.walk.starting import StartDip, start_dip
from gaugewalk.model.walk.transformers import TransformerInfo, secondary_rule, transformer_info
from gaugewalk.model.walk.vocabulary import (
    LINE_NAMES,
    may_be_on_roof,
    may_be_sign,
    may_say_more,
)

_EPS = 1e-9
_GONE = object()


class FeederInfo(NamedTuple):
    """What a feeder is sized for: ``basis`` in words, ``amps`` the current [A] (its load on
    its heaviest line, or the device or rating the basis names), ``load_amps`` [A] the load on
    its heaviest ``line`` (None for a feeder with its own load), and for an equipment basis the
    connected-load answer ``beside`` it."""

    basis: str
    amps: float
    load_amps: float
    line: str | None
    beside: RunResult | None = None
    max_ocpd_a: float | None = None   # [A] NEC 430.62(A): the largest device, a feeder of
    #                                   motors (and HVAC) alone
    demand: tuple[DemandStep, ...] = ()   # demand factors taken (Defaults.demand)
    served_a: float | None = None  # [A] design current the loads below need, where a stated
    # feeder load is smaller (NEC 215.2(A)(1)); ``basis`` says so in words
    ocpd_430_63_a: float | None = None   # [A] NEC 430.63: with other loads, the figure the
    #                                      device is "not less than" (a floor, not a maximum)


@record()
class JobResult:
    """Everything computed for a walk."""

    runs: dict[str, RunResult] = field(default_factory=dict)
    run_total_drop_pct: dict[str, float] = field(default_factory=dict)
    source_drop_pct: dict[str, float] = field(default_factory=dict)
    feeder_amps: dict[str, float] = field(default_factory=dict)
    connected_va: dict[str, float] = field(default_factory=dict)
    run_va: dict[str, float] = field(default_factory=dict)
    lines: dict[str, Lines] = field(default_factory=dict)
    placements: dict[str, Placement] = field(default_factory=dict)
    feeders: dict[str, FeederInfo] = field(default_factory=dict)
    transformers: dict[str, TransformerInfo] = field(default_factory=dict)
    loadings: dict[str, Loading] = field(default_factory=dict)
    motor_groups: dict[str, MotorGroup] = field(default_factory=dict)
    welders: dict[str, int] = field(default_factory=dict)
    """{source id: the arc welders below it, its own runs' and those of the sources it feeds}
    (only sources with any), for NEC 630.11(B)."""
    left_out: dict[str, tuple[str, ...]] = field(default_factory=dict)
    """{source id: the runs below it (its own and those of the sources it feeds) that give a
    load the computation could not read, so that what it and its feeder carry leaves them out}
    (only sources with any)."""
    raceways: dict[str, SharedRaceway] = field(default_factory=dict)
    start_dips: dict[str, StartDip] = field(default_factory=dict)
    """{run id: a motor's starting dip from the service} (``gaugewalk.model.walk.starting``;
    only runs with a starting drop)."""
    problems: list[Problem] = field(default_factory=list)
    # kept for recompute_run
    _specs: dict[str, RunSpec] = field(default_factory=dict, repr=False)
    _passed: dict[str, float] = field(default_factory=dict, repr=False)
    """{run id: the least drop [%] of the smaller sizes its evaluation passed over for their
    drop alone} (``evaluate_picked``): a looser drop limit below it keeps the size."""
    _circuits: dict[str, Circuit] = field(default_factory=dict, repr=False)
    _own: dict[str, OwnLoad | None] = field(default_factory=dict, repr=False)
    _feeds: dict[str, Feed] = field(default_factory=dict, repr=False)
    _run_problems: dict[str, list[Problem]] = field(default_factory=dict, repr=False)
    _place_problems: dict[str, list[Problem]] = field(default_factory=dict, repr=False)
    _start_problems: dict[str, list[Problem]] = field(default_factory=dict, repr=False)
    _sum_problems: dict[str, list[Problem]] = field(default_factory=dict, repr=False)
    _chain_problems: list[Problem] = field(default_factory=list, repr=False)
    _source_problems: dict[str, list[Problem]] = field(default_factory=dict, repr=False)
    """{source id: its problems in ``_chain_problems``: its sums' and its lugs'}."""
    _raceway_problems: list[Problem] = field(default_factory=list, repr=False)
    _signs: set[str] = field(default_factory=set, repr=False)
    """The runs whose load is a sign (``equipment.is_sign_outlet``), found once a run as its
    circuit is resolved (``WalkState.resolve_circuit``)."""
    _shape: tuple = field(default=(), repr=False)
    _touched: set[str] | None = field(default=None, repr=False, compare=False)
    """The runs whose rows the last update in place wrote (``recompute_run``); None: any."""
    _walk: SupplyGraph | None = field(default=None, repr=False, compare=False)
    _prepared: dict[tuple, Prepared] = field(default_factory=dict, repr=False, compare=False)
    """The preparations this result's computation made (``WalkState.prepared``), which an update
    in place (``recompute_run``) goes on using: each is keyed by every input it reads. A new
    computation starts a new result, and so with none."""
    _branch_specs: dict[tuple, tuple[dict, Prepared]] = field(default_factory=dict, repr=False,
                                                                compare=False)
    """The same for ``WalkState.branch_specs``."""

    @property
    def ok(self) -> bool:
        """True when every run was computed and meets its limits."""
        return not self.problems

    def run_problems(self, run_id: str) -> list[Problem]:
        """Problems of one run (its own, the engine's, its place in its source and a motor's
        starting dip from the service)."""
        return (list(self._run_problems.get(run_id, ()))
                + list(self._place_problems.get(run_id, ()))
                + list(self._start_problems.get(run_id, ())))

    def walk_notes(self, run_id: str) -> tuple[str, ...]:
        """What the walk says of a run beyond the engine's notes (``RunResult.notes``): a
        motor's starting dip from the service."""
        dip = self.start_dips.get(run_id)
        return (dip.note,) if dip is not None else ()

    def _row_tables(self) -> tuple[dict, ...]:
        """What a run's row in a sheet is made from, by run id: its result, its problems and
        its starting dip."""
        return (self.runs, self._run_problems, self._place_problems, self._start_problems,
                self.start_dips)

    def marks(self) -> tuple[dict, ...]:
        """What each run's result and problems are now, for ``changed_since`` after an update
        in place (``gaugewalk.model.walk.recompute``)."""
        return tuple(dict(table) for table in self._row_tables())

    def changed_since(self, marks: tuple[dict, ...]) -> set[str]:
        """The runs whose result or problems are other objects than in ``marks``: every update
        puts new ones in (never changes one in place), so the rest are as they were. After an
        update in place, only the runs it wrote (``_touched``) are looked at."""
        out: set[str] = set()
        among = self._touched
        for now, then in zip(self._row_tables(), marks, strict=True):
            if among is not None:
                out.update(k for k in among if now.get(k, _GONE) is not then.get(k, _GONE))
                continue
            out.update(k for k, v in now.items() if then.get(k) is not v)
            out.update(then.keys() - now.keys())
        return out


def run_spec_for(
    job: Job,
    run: Run,
    upstream_drop_pct: float,
    *,
    result: JobResult | None = None,
    circuit: Circuit | None = None,
    is_feeder: bool | None = None,
) -> RunSpec:
    """The engine input for one run, with the job defaults applied.

    A branch uses the branch drop target, a feeder the feeder target (informational notes to
    NEC 210.19 and 215.2); both share the total target. A feeder without its own load is sized
    for what its source's lines carry, read from ``result`` (the walk computed already) or
    summed here; a feeder's rules (a transformer's primary device, 240.21(C), the equipment
    basis) come from the same place. Raises ``LoadError`` or ``CircuitError`` for a run that
    cannot be specified. A run in a shared raceway is adjusted for every current-carrying
    conductor in it (NEC 310.15(C)(1)).
    """
    state = _state_for(job, result)
    if circuit is None:
        source = job.source(run.from_)
        if source is None:
            raise CircuitError(f"the run starts at '{run.from_}', which is not a source of this job")
        circuit = resolve_circuit(source.system, connection_of(job, run),
                                  nonlinear=nonlinear_of(job, run))
    if is_feeder is None:
        is_feeder = job.source(run.to) is not None
    rule = state.feeder_rule(run, is_feeder)
    feed = state.result._feeds.get(run.to) if is_feeder else None
    counts = [raceway_ccc(job, rid) for rid in shared_ids(run)]
    ccc = max((c for c in counts if c), default=None)
    return _spec(state.spec_base, job, run, upstream_drop_pct, circuit, is_feeder, feed, rule,
                 _motors_fed(job, state.result, run, is_feeder), ccc)


def size_run(job: Job, run: Run, upstream_drop_pct: float,
             result: JobResult | None = None) -> RunResult:
    """``run`` sized in the walk (``run_spec_for`` and the engine), with the notes and problems
    of its feeder rules. Raises ``LoadError``, ``CircuitError`` or ``ValueError``."""
    return size_run_spec(job, run, upstream_drop_pct, result)[0]


def size_run_spec(job: Job, run: Run, upstream_drop_pct: float,
                  result: JobResult | None = None) -> tuple[RunResult, RunSpec]:
    """``size_run`` with the engine input it sized (``run_spec_for``)."""
    state = _state_for(job, result)
    is_feeder = job.source(run.to) is not None
    rule = state.feeder_rule(run, is_feeder)
    spec = run_spec_for(job, run, upstream_drop_pct, result=state.result, is_feeder=is_feeder)
    sized = _with_rule(evaluate(spec), rule)
    if not is_feeder:   # what its name says, as the walk's computation adds it
        sized = state.name_words(run, sized, spec.circuit)
    return sized, spec


def _state_for(job: Job, result: JobResult | None) -> WalkState:
    """A state over ``job`` reading ``result`` (without building the supply graph: it reads
    only sources and the sums already made); without one, the walk is summed first."""
    if result is not None:
        return WalkState(None, result, job)
    state = WalkState(SupplyGraph(job), JobResult())
    state.resolve_circuits()
    state.sum_all()
    return state


_NUMBER = (int, float)
_SPEC_TEMPLATE = {f.name: None if f.default is MISSING else f.default for f in fields(RunSpec)}
"""Every RunSpec field in order, with its default (``_spec_base`` fills in a walk's defaults)."""


def _spec_base(defaults: dict) -> dict:
    """Every RunSpec field in order, with its default, and those a run takes from the job
    (``defaults``: ``Defaults.__dict__``) unless it says otherwise filled in from it; copied and
    filled per run by ``_spec``, which then sets only what is the run's own (a copy and item
    sets cost half a dict display of 26 keys)."""
    base = _SPEC_TEMPLATE.copy()
    for name in ("material", "insulation", "terminal_temp", "conductor_temp_c", "method",
                 "raceway", "ambient_c", "min_size", "starting_drop_pct"):
        base[name] = defaults[name]
    base["max_total_drop_pct"] = defaults["total_drop_pct"]
    return base
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


WELDER_GROUP_NOTE = (
    "NEC 630.11(B) permits the conductors of a feeder of several arc welders at 100 % of the two "
    "largest welders' 630.11(A) currents, 85 % of the third, 70 % of the fourth and 60 % of the "
    "rest; not taken here: each welder is summed at 100 % (the larger feeder; give the feeder "
    "'size' to use the group factors)")
"""The note of a feeder with two or more welders below it (``JobResult.welders``)."""


def _left_out_problem(source_id: str, runs: tuple[str, ...]) -> str:
    """The problem of a feeder whose source's load leaves out ``runs`` (``JobResult.left_out``):
    NEC 215.2(A)(1) sizes it for the load it serves."""
    named = ", ".join(runs[:4]) + (f" and {len(runs) - 4} more" if len(runs) > 4 else "")
    whose = "load" if len(runs) == 1 else "loads"
    one = len(runs) == 1
    return (f"the {whose} of {named} below {source_id} could not be read and {'is' if one else 'are'}"
            f" left out of this feeder's load, so its size may be too small (NEC 215.2(A)(1)): "
            f"fix {'that run' if one else 'those runs'} first")


def _motors_fed(job: Job, result: JobResult, run: Run, is_feeder: bool) -> MotorGroup | None:
    """The motors a feeder without its own load supplies (none through a transformer, whose
    primary device sizes its feeder)."""
    if not is_feeder or run.load is not None:
        return None
    target = job.source(run.to)
    if target is None or target.kind == "transformer":
        return None
    return result.motor_groups.get(run.to)


_NOT_SPEC_INPUTS = frozenset({"id", "from_", "to", "length", "segments", "connection",
                              "position", "phase", "basis", "bends", "raceway_id", "measured_on",
                              "notes", "load"})
"""The fields of a ``Run`` that ``_spec`` does not read for a branch (its length is set apart, its
connection is in its circuit, its load is read whole): ``WalkState.branch_spec`` keys the
branches alike on all the others, so a field added to ``Run`` is in that key unless named here."""
_spec_inputs = itemgetter(*(name for name in Run.model_fields if name not in _NOT_SPEC_INPUTS))


def _spec(base: dict, job: Job, run: Run, upstream_drop_pct: float, circuit: Circuit,
          feeder: bool, feed: Feed | None, rule: FeederRule | None = None,
          motors: MotorGroup | None = None, ccc: int | None = None) -> RunSpec:
    """The run's ``RunSpec``, from ``base`` (``_spec_base`` of the job's defaults). For a branch
    it reads no field of the run named in ``_NOT_SPEC_INPUTS`` but its length."""
    # fields read from the models' __dict__: attribute access on a pydantic model passes its
    # __getattr__ hook first, and this runs once per run of every computation
    d = job.defaults.__dict__
    rf = run.__dict__
    pf = d["pf"]
    continuous_amps = None
    load = rf["load"]
    equipment = None
    continuous = bool(rf["continuous"])
    if load is not None and load.kind == "general":
        if load.pf is not None:
            pf = load.pf
        amps = _load_amps(load.value, load.unit, circuit, pf)
    elif load is not None:
        facts = load_facts(run, circuit, pf)
        amps, pf, continuous, equipment = facts.amps, facts.pf, facts.continuous, facts.equipment
    elif feeder:
        if feed is None or feed.load.va <= 0:
            raise LoadError(f"{run.to} serves no load yet, so its feeder cannot be sized; "
                            "add its runs or give the feeder a load")
        if motors is not None:  # NEC 430.24: the largest motor at 125 %, on the line it loads most
            _, amps, continuous_amps, motor_a = heaviest_with_motor(feed, motors.largest_a)
            continuous_amps += motor_a
        else:
            _, _, amps, continuous_amps = feed.heaviest()
        pf = min(1.0, max(0.05, feed.load.watts / feed.load.va))
    else:
        raise LoadError(f"the run has no load; give it in {or_words(LOAD_UNITS)}")
    max_drop = rf["max_drop_pct"]
    if max_drop is None:
        max_drop = d["feeder_drop_pct"] if feeder else d["branch_drop_pct"]
    # Built without the per-field object.__setattr__ of a frozen dataclass's __init__ (the
    # larger part of this function's time): every field of RunSpec is set, in field order, those
    # not given here to the job's defaults (``base``) or RunSpec's (egc, egc_material,
    # egc_bare, stranded).
    spec = _new_object(RunSpec)
    values = base.copy()
    values["circuit"] = circuit
    values["amps"] = amps
    values["length_ft"] = run.length_ft
    values["continuous"] = continuous if continuous_amps is None else False
    values["continuous_amps"] = continuous_amps
    values["distributed"] = rf["distributed"]
    # a run's overrides, where it gives one (``OVERRIDABLE``); no word of them is empty
    if rf["material"]:
        values["material"] = rf["material"]
    if rf["insulation"]:
        values["insulation"] = rf["insulation"]
    if rf["terminal_temp"] is not None:
        values["terminal_temp"] = rf["terminal_temp"]
    if rf["conductor_temp_c"] is not None:
        values["conductor_temp_c"] = rf["conductor_temp_c"]
    if rf["method"]:
        values["method"] = rf["method"]
    values["pf"] = pf
    if rf["raceway"]:
        values["raceway"] = rf["raceway"]
    if rf["ambient_c"] is not None:
        values["ambient_c"] = rf["ambient_c"]
    values["rooftop"] = rf["rooftop"]
    values["sets"] = rf["sets"]
    values["size"] = rf["size"]
    values["ocpd_a"] = rf["ocpd_a"]
    if not feeder and load is not None and may_be_sign(rf["to"]):   # NEC 600.5(A)
        device = sign_outlet_device(run, design_current(
            amps, amps if values["continuous"] else 0.0))
        if device is not None:
            values["ocpd_a"] = device
    values["max_drop_pct"] = max_drop
    values["upstream_drop_pct"] = upstream_drop_pct
    values["equipment"] = equipment
    if equipment is not None and equipment.kind == "fire-pump":   # NEC 695.7
        (values["max_drop_pct"], values["max_total_drop_pct"],
         values["starting_drop_pct"]) = drop_targets(
            equipment, rf["max_drop_pct"], max_drop, values["max_total_drop_pct"],
            values["starting_drop_pct"])
    if load is not None:
        values["load_notes"] = pf_assumed(load, d["pf"])
    if continuous_amps is not None and circuit.neutral and feed.frame == "lines":
        values["neutral_amps"] = neutral_load(feed.neutral)   # NEC 220.61(A)
    if rule is not None:
        if rule.ocpd_a is not None:
            values["ocpd_a"] = rule.ocpd_a
        values["min_ampacity_a"] = rule.min_ampacity_a
        if rule.bonding:
            values["bonding_jumper"] = True
    values["ccc"] = ccc
    _set_attr(spec, "__dict__", values)
    return spec


def _with_rule(result: RunResult, rule: FeederRule | None) -> RunResult:
    """The result with the notes and problems of the feeder rule it was sized by."""
    if rule is None or not (rule.notes or rule.problems):
        return result
    return with_fields(result, notes=result.notes + rule.notes,
                       problems=result.problems + rule.problems)


class WalkState:
    """One computation over a walk, writing into a JobResult."""

    def __init__(self, walk: SupplyGraph | None, result: JobResult,
                 job: Job | None = None) -> None:
        self.walk = walk   # None: a state that only reads ``result`` (``run_spec_for``)
        self.job = walk.job if walk is not None else job
        self.result = result
        self._circuit_cache: dict[tuple[str, str | None, int, bool], Circuit] = {}
        self._own_cache: dict[tuple, OwnLoad | None] = {}   # (circuit key, load): its OwnLoad
        self.spec_base = _spec_base(self.job.defaults.__dict__)   # what every run's spec starts as
        self.shared_ccc: dict[str, int] = {}   # current-carrying conductors per shared raceway
        # what the runs of this computation share, by spec but for length and upstream drop
        # (``gaugewalk.model.engine.sizing.evaluate_picked``), kept with its result for the
        # updates in place that follow it (``JobResult._prepared``)
        self.prepared: dict[tuple, Prepared] = result._prepared
        self.branch_specs: dict[tuple, tuple[dict, Prepared]] = result._branch_specs

    def fail(self, run: Run, message: str, field_name: str | None = None) -> None:
        self.result._run_problems[run.id] = [Problem("", None, "run", run.id, field_name, message)]

    def resolve_circuit(self, run: Run) -> Circuit | None:
        """The run's circuit from its source's system and its connection, and its own load
        (``own_load``), stored in the result; None (and a problem) where the system cannot give
        that connection. Within one computation each distinct (system, connection) is resolved
        once, and each distinct general load on it is read once: runs alike share one
        ``OwnLoad`` (the same object), since ``own_load`` of a general load reads only its value,
        unit and power factor, whether the run is continuous, the circuit and the job's
        power factor."""
        # fields read from the models' __dict__ (as in ``_spec``): once per run
        rf = run.__dict__
        rid = rf["id"]
        sources = self.walk.sources
        start = sources[rf["from_"]]
        system = start.system
        conn = rf["connection"]
        target = sources.get(rf["to"])
        if conn is None:   # by what it feeds: a load (0), a source (1), a transformer (2)
            to = 0 if target is None else 2 if target.kind == "transformer" else 1
        else:
            to = 0
        nonlinear = nonlinear_said(target, start, self.job.defaults.nonlinear_loads)
        key = (system, conn, to, nonlinear)
        res = self.result
        c = self._circuit_cache.get(key)
        if c is None:
            unstated = False
            if conn is None:
                conn = default_connection(system, to == 2)
                unstated = to == 0  # a branch run: its circuit was the walker's to state
            try:
                c = resolve_circuit(system, conn, nonlinear=nonlinear)
            except CircuitError as exc:
                self.fail(run, str(exc), "connection")
                res._circuits.pop(rid, None)
                res._own[rid] = None
                return None
            note = unstated_circuit_note(system, conn) if unstated else None
            if note is not None:
                c = c._replace(notes=(note, *c.notes))
            self._circuit_cache[key] = c
        res._circuits[rid] = c
        load = rf["load"]
        if load is None:
            res._own[rid] = None
            res._signs.discard(rid)
            return c
        sign = may_be_sign(rf["to"]) and is_sign_outlet(run)   # NEC 600.5(A), 220.14(F)
        if sign:
            res._signs.add(rid)
        else:
            res._signs.discard(rid)
        ld = load.__dict__
        if ld["kind"] != "general":   # its kind's reading takes more of the run
            res._own[rid] = own_load(run, c, self.job.defaults.pf)
            return c
        alike = (key, ld["value"], ld["unit"], ld["pf"], rf["continuous"], sign)
        own = self._own_cache.get(alike, _GONE)
        if own is _GONE:
            own = self._own_cache[alike] = own_load(run, c, self.job.defaults.pf)
        res._own[rid] = own
        return c

    def resolve_circuits(self) -> None:
        sources = self.walk.sources
        resolve = self.resolve_circuit
        for r in self.job.runs:
            if r.__dict__["from_"] in sources:
                resolve(r)

    # -- bottom-up: placing and summing ------------------------------------------------------
    def sum_all(self) -> None:
        """Bottom-up: every source placed and summed (children before the sources above), into
        a result that holds no placement yet."""
        walk = self.walk
        fresh = len(walk.position) == len(self.job.runs)   # and no run id repeated
        for sid in reversed(walk.order):
            self.sum_source(sid, fresh)

    def sum_source(self, sid: str, fresh: bool = False) -> bool:
        """Place and sum one source's runs; its transformer and loading; what its feeder
        carries. Returns True when that changed. ``fresh``: no run of it was placed before (a
        computation from the start, every run id its own), so there is nothing to take out."""
        res, walk = self.result, self.walk
        outcome, lines = sum_source(walk, sid, res._circuits, res._own, res._feeds,
                                    self.job.defaults.demand == "nec-220")
        res.lines[sid] = lines
        res.connected_va[sid] = lines.load.va
        children = walk.children[sid]
        place_problems = res._place_problems
        placements = res.placements
        own, feeds, run_va = res._own, res._feeds, res.run_va
        feeder_of = walk.feeder
        left: list[str] = []   # runs whose load could not be read (``JobResult.left_out``)
        left_out = res.left_out
        for r in children:   # what was placed before (an update in place), and each run's VA
            rf = r.__dict__
            rid = rf["id"]
            if not fresh:
                place_problems.pop(rid, None)
                placements.pop(rid, None)
            mine = own.get(rid)
            if mine is not None:
                run_va[rid] = mine.load.va
                continue
            to = rf["to"]
            if feeder_of.get(to) is r and to in feeds:
                run_va[rid] = feeds[to].load.va
            else:
                run_va.pop(rid, None)
            if rf["load"] is not None:
                left.append(rid)
            elif feeder_of.get(to) is r and to in left_out:
                left.extend(left_out[to])
        old_left = left_out.pop(sid, ())
        if left:
            left_out[sid] = tuple(left)
        placements.update(outcome.placements)
        for rid, field_name, message in outcome.problems:
            place_problems.setdefault(rid, []).append(
                Problem("", None, "run", rid, field_name, message))
        source = walk.sources[sid]
        feeder = walk.feeder.get(sid)
        primary = res._circuits.get(feeder.id) if feeder is not None else None
        problems: list[Problem] = []
        if source.kind == "transformer":
            fed = [(r, walk.sources[r.to] if walk.feeder.get(r.to) is r else None)
                   for r in children]
            info = transformer_info(source, lines, primary, feeder, fed)
            res.transformers[sid] = info
            problems += [Problem("", None, "source", sid, f, m) for f, m in info.problems]
        feed, why = feed_of(source, lines, primary)
        if why is not None and feeder is not None:
            problems.append(Problem("", None, "run", feeder.id, "connection", why))
        ld = loading(source, lines)
        res.loadings[sid] = ld
        problems += [Problem("", None, "source", sid, f, m) for f, m in ld.problems]
        res._sum_problems[sid] = problems
        old = feeds.get(sid)
        feeds[sid] = feed
        return self.group_motors(sid) or old != feed or old_left != left_out.get(sid, ())

    def group_motors(self, sid: str) -> bool:
        """The motors ``sid`` supplies, its own runs' and those of the panels it feeds (not
        through a transformer), and the welders below it (``JobResult.welders``, through
        transformers too); returns True when either changed."""
        res, walk = self.result, self.walk
        pf = self.job.defaults.pf
        groups: list[MotorGroup | None] = []
        only = True
        circuits = res._circuits
        welders = 0
        for r in walk.children[sid]:
            rf = r.__dict__
            load = rf["load"]
            if load is not None:
                kind = load.__dict__["kind"]
                if kind not in ("motor", "fire-pump", "hvac"):
                    only = False   # a load of another kind: no motor of this run
                    if kind == "welder":
                        welders += 1
                    continue
                circuit = circuits.get(rf["id"])
                mine = run_motor(r, circuit, pf) if circuit is not None else None
                only = only and mine is not None
                groups.append(mine)
            elif walk.feeder.get(r.to) is r:
                below = (res.motor_groups.get(r.to)
                         if walk.sources[r.to].kind != "transformer" else None)
                only = only and below is not None and below.only_motors
                groups.append(below)
                welders += res.welders.get(r.to, 0)
        group = largest(groups)
        if group is not None and not only and group.only_motors:
            group = group._replace(only_motors=False)
        old = res.motor_groups.get(sid)
        if group is None:
            res.motor_groups.pop(sid, None)
        else:
            res.motor_groups[sid] = group
        old_welders = res.welders.pop(sid, 0)
        if welders:
            res.welders[sid] = welders
        return old != group or old_welders != welders

    # -- the rules a feeder is sized by ------------------------------------------------------
    def feeder_rule(self, r: Run, is_feeder: bool) -> FeederRule | None:
        """The rule sizing ``r`` other than its load: 240.21(C) for a run from a transformer's
        secondary, the primary device for a feeder into a transformer (Table 450.3(B), 240.4),
        the equipment basis; None: its load."""
        job, res = self.job, self.result
        source = job.source(r.from_)
        target = job.source(r.to) if is_feeder else None
        if source is not None and source.kind == "transformer":
            info = res.transformers.get(source.id)
            if info is None:
                return None
            sec = secondary_rule(r, source, info, target)
            if not is_feeder:
                return FeederRule(sec.basis, problems=sec.problems) if sec.problems else None
            device = r.ocpd_a if r.ocpd_a is not None else sec.ocpd_a
            return FeederRule(sec.basis, device, sec.min_ampacity_a, sec.min_ampacity_a, False,
                              sec.notes, sec.problems, sec.bonding)
        if target is None:
            return None
        if target.kind == "transformer":
            info = res.transformers.get(target.id)
            if info is None:
                return None
            if info.primary_ocpd_a is None:   # its kVA missing (said at the source too)
                return FeederRule("its load", problems=(
                    f"NEC Table 450.3(B): {target.id}'s primary device cannot be worked out "
                    f"({'its kVA is not given' if info.kva is None else 'no standard rating fits'}"
                    "); this feeder is sized only for the load below it",))
            device = info.primary_ocpd_a
            problems: tuple[str, ...] = ()
            if (r.ocpd_a is not None and info.primary_max_a is not None
                    and r.ocpd_a > info.primary_max_a + _EPS):
                problems = (f"NEC Table 450.3(B): the {r.ocpd_a} A primary device is over the "
                            f"{info.primary_max_a:.0f} A it permits for {target.id} "
                            f"({info.primary_fla_a:.1f} A rated)",)
            return FeederRule(f"transformer primary device, NEC Table 450.3(B): {device} A",
                              device, None, float(device), False,
                              (f"NEC 240.4: the primary conductors are protected by the "
                               f"{device} A primary device",), problems)
        basis = r.basis or self.job.defaults.feeder_basis
        if basis == "equipment":
            rule = equipment_rule(r, target)
            if rule is None:
                return FeederRule("its load", problems=(
                    f"sized to the equipment it feeds, but {target.id} gives neither main_a nor "
                    "rating_a; sized for its load",))
            return rule
        return None

    # -- top-down: sizing ------------------------------------------------------------------
    def evaluate_run(self, r: Run, upstream: float, moved: RunSpec | None = None) -> None:
        """Size ``r`` below a bus at ``upstream`` [%] and store it. ``moved``: for a run that
        did not change, its stored spec with only the drop up to its source made ``upstream``
        (``gaugewalk.model.walk.recompute``), taken as its spec where the run is a branch on a
        panel or service, whose spec nothing else above it enters."""
        res = self.result
        rf = r.__dict__   # the model's fields read from its __dict__, as in ``_spec``
        rid = rf["id"]
        # every way on writes the run's problems or clears them (``fail``, ``store``)
        circuit = res._circuits.get(rid)
        if circuit is None:
            circuit = self.resolve_circuit(r)
            if circuit is None:
                self.forget(r)
                return
        walk = self.walk
        is_feeder = walk.feeder.get(rf["to"]) is r
        from_transformer = rf["from_"] in walk.transformers
        if not (is_feeder or from_transformer or self.shared_ccc):
            # a branch run on a panel or service: its own load, no feeder rule, no motors fed,
            # no shared raceway (the rest of this method with all of those None)
            try:
                if moved is not None:
                    spec, prep = moved, prepared_for(moved, self.prepared)
                else:
                    spec, prep = self.branch_spec(r, upstream, circuit)
                result, passed = finish_prepared(prep, spec)
            except (LoadError, CircuitError, ValueError) as exc:
                self.forget(r)
                self.fail(r, str(exc))
                return
            kind = result.load_kind
            if (kind == "motor" or kind == "fire-pump" or rid in res._signs
                    or may_say_more(rf["to"])):
                result = self.name_words(r, result, circuit)
            res._specs[rid] = spec
            res._passed[rid] = passed
            self.store(r, result, False, spec)
            return
        feed = res._feeds.get(r.to) if is_feeder else None
        rule = self.feeder_rule(r, is_feeder) if is_feeder or from_transformer else None
        steps: tuple[DemandStep, ...] = ()
        if feed is not None and r.load is None:
            feed, steps = self.with_demand(r, feed)
        motors = _motors_fed(self.job, res, r, is_feeder)
        ccc = ccc_for_run(r, self.shared_ccc) if self.shared_ccc else None
        try:
            spec = _spec(self.spec_base, self.job, r, upstream, circuit, is_feeder, feed, rule,
                         motors, ccc)
            limit = None
            if motors is not None:   # NEC 430.62(A), 430.63, on the design current the engine
                limit = device_limit(    # takes (a feeder of motors has no load of its own)
                    motors, design_current(spec.amps, spec.continuous_amps or 0.0))
                if motors.only_motors and rule is None:  # the device picked up to it (240.4(G))
                    spec = with_fields(spec, motor_feeder_max_a=limit,
                                       lugs_bus_a=lugs_bus(self.walk.sources[r.to]))
            result, passed = evaluate_picked(spec, self.prepared)
            raised = None
            if (motors is not None and motors.fire_pumps and motors.only_motors
                    and rule is None and r.ocpd_a is None):
                # NEC 695.4(B)(2)(a)(1): the device picked within 430.62(A) may fall short
                # of the fire pumps' locked-rotor current; 695 rules the fire pump's supply
                raised = fire_pump_device(motors.fire_pumps, spec.amps)
                if raised is not None and result.ocpd_a < raised:
                    spec = with_fields(spec, ocpd_a=raised)
                    result, passed = evaluate_picked(spec, self.prepared)
                else:
                    raised = None
            beside = None
            if rule is not None and rule.beside:
                beside = evaluate(_spec(self.spec_base, self.job, r, upstream, circuit,
                                        is_feeder, feed, None, motors, ccc))
        except (LoadError, CircuitError, ValueError) as exc:
            self.forget(r)
            self.fail(r, str(exc))
            return
        result = _with_rule(result, rule)
        if steps:
            result = with_fields(result, notes=result.notes + tuple(s.text for s in steps))
        if motors is not None and limit is not None:
            extra = (heaviest_with_motor(feed, motors.largest_a)[3] if feed is not None
                     else spec.continuous_amps or 0.0)
            notes = notes_for(motors, extra, limit, result.ocpd_a)
            problems = ((f"NEC 430.62(A): the {result.ocpd_a} A feeder device is over the "
                         f"{limit:.0f} A it permits for the motors it supplies",)
                        if motors.only_motors and result.ocpd_a > limit + _EPS
                        and raised is None else ())
            if raised is not None:
                notes += (f"NEC 695.4(B)(2)(a)(1): the feeder device is raised to {raised} A, "
                          f"above the {limit:.0f} A of 430.62(A), so it carries the fire pumps' "
                          f"locked-rotor current (Article 695 rules a fire pump's supply; "
                          f"240.4(G) and 695.6(D): its conductors are protected against short "
                          f"circuit)",)
            fp_notes, fp_problems = ((), ())
            if motors.fire_pumps:   # NEC 695.4(B)(2)(a)(1)
                fp_notes, fp_problems = feeder_check(motors.fire_pumps, spec.amps,
                                                     result.ocpd_a)
            if result.ocpd_a + _EPS < motors.device_a and not (
                    fp_problems and any(f[0] == motors.device_run for f in motors.fire_pumps)):
                # (a fire pump's device the largest: its own problem says more)
                problems += (below_branch_device(motors, result.ocpd_a, limit),)
            notes += fp_notes
            problems += fp_problems
            result = with_fields(result, notes=result.notes + notes,
                                 problems=result.problems + problems)
        if is_feeder and r.load is None and res.welders.get(r.to, 0) > 1 and rule is None:
            result = with_fields(result, notes=result.notes + (WELDER_GROUP_NOTE,))
        if is_feeder and r.load is None and r.to in res.left_out:
            result = with_fields(result, problems=result.problems + (
                _left_out_problem(r.to, res.left_out[r.to]),))
        if not is_feeder:   # what its name says, as for a branch above
            result = self.name_words(r, result, circuit)
        res._specs[r.id] = spec
        res._passed[r.id] = passed
        if is_feeder:
            info = self.feeder_info(r, spec, feed, rule, beside, motors, limit)
            if r.load is not None and feed is not None and rule is None:
                need, words = _served_beyond_stated(self, r, result.design_amps, feed)
                if need is not None:
                    info = info._replace(basis=info.basis + words, served_a=need)
            res.feeders[r.id] = info._replace(demand=steps) if steps else info
        self.store(r, result, is_feeder, spec)

    def branch_spec(self, r: Run, upstream: float, circuit: Circuit) -> tuple[RunSpec, Prepared]:
        """The spec of branch ``r`` below a bus at ``upstream`` [%] (``_spec``), with its
        preparation (``prepared_for``): made once for the branches alike, those on the same
        circuit with the same load and the same say on every field ``_spec`` reads (all but
        ``_NOT_SPEC_INPUTS``), and given each one's own length and upstream drop. Raises
        ``LoadError``, ``CircuitError`` or ``ValueError`` as ``_spec`` and the engine do."""
        rf = r.__dict__
        load = rf["load"]
        key = (circuit, None if load is None else tuple(load.__dict__.values()),
               _spec_inputs(rf), rf["id"] in self.result._signs)   # a sign: NEC 600.5(A)
        alike = self.branch_specs.get(key)
        if alike is None:
            spec = _spec(self.spec_base, self.job, r, upstream, circuit, False, None)
            prep = prepared_for(spec, self.prepared)
            self.branch_specs[key] = (spec.__dict__, prep)
            return spec, prep
        values = alike[0].copy()
        values["length_ft"] = r.length_ft
        values["upstream_drop_pct"] = upstream
        spec = _new_object(RunSpec)
        _set_attr(spec, "__dict__", values)
        return spec, alike[1]

    def with_demand(self, r: Run, feed: Feed) -> tuple[Feed, tuple[DemandStep, ...]]:
        """What feeder ``r`` carries with the job's demand factors taken (``Defaults.demand``:
        NEC 220.44, 220.60), and the steps; a transformer's primary takes none."""
        if feed.kinds and self.walk.sources[r.to].kind != "transformer":
            return apply_demand(feed)
        return feed, ()

    def feeder_info(self, r: Run, spec: RunSpec, feed: Feed | None, rule: FeederRule | None,
                    beside: RunResult | None, motors: MotorGroup | None = None,
                    limit: float | None = None) -> FeederInfo:
        line = None
        if r.load is None and feed is not None:
            k, design, _, _ = feed.heaviest()
            if motors is not None:   # NEC 430.24: the line the largest motor's 25 % makes heaviest
                k = heaviest_with_motor(feed, motors.largest_a)[0]
            line = LINE_NAMES[k] if feed.frame == "lines" else "winding"
            words = (f"heaviest line {line}: {spec.amps:.1f} A, design {design:.1f} A "
                     "(NEC 215.2(A)(1))" if feed.frame == "lines" else
                     f"primary winding: {spec.amps:.1f} A, design {design:.1f} A "
                     "(NEC 215.2(A)(1))")
            if motors is not None:
                design = spec.continuous_amps * 1.25 + spec.amps - spec.continuous_amps
                words = (f"heaviest line {line}: {spec.amps:.1f} A, design {design:.1f} A with "
                         f"125 % of the largest motor (NEC 430.24)")
        else:
            words = "its own load"
        # 430.62(A) is a ceiling for motors alone; 430.63's figure with other loads is a floor
        floor = None
        if limit is not None and motors is not None and not motors.only_motors:
            limit, floor = None, limit
        if rule is not None and rule.amps is not None:
            return FeederInfo(rule.basis, rule.amps, spec.amps, line, beside, limit,
                              ocpd_430_63_a=floor)
        return FeederInfo(words, spec.amps, spec.amps, line, beside, limit, ocpd_430_63_a=floor)

    def name_words(self, r: Run, result: RunResult, circuit: Circuit) -> RunResult:
        """A branch run with what its name says beside its kind: a fire pump's or motor's
        (``motor_words``), lighting a feeder counts by its length (NEC 220.43,
        ``equipment.named_unit_load``), or a sign (NEC 600.5, 220.14(F),
        ``equipment.named_sign``; its own load on ``circuit`` in VA); and equipment on a roof
        the walk does not mark rooftop (NEC 310.15(B)(2), ``equipment.named_roof_run``)."""
        if result.load_kind in MOTOR_KINDS:
            result = self.motor_words(r, result)
        else:
            said = named_unit_load(r)
            if said is None and may_be_sign(r.to):
                said = named_sign(r, result.ocpd_a, va_of(result.amps, "A", circuit, 1.0))
            if said is not None:
                result = with_fields(result, notes=result.notes + (said,))
        if may_be_on_roof(r.to):
            roof = named_roof_run(r, self.job.effective(r, "insulation"))
            if roof is not None:
                result = with_fields(result, notes=result.notes + (roof,))
        return result

    def motor_words(self, r: Run, result: RunResult) -> RunResult:
        """A fire pump's run with what the walk shows of its supply (NEC 695.3, 230.82(5),
        695.5); a motor named as a fire pump with its problem, one named as an elevator, crane
        or hoist with the note that it was sized as continuous duty, one named as a refrigerant
        motor-compressor with the note that Article 440 takes its nameplate
        (``gaugewalk.model.walk.fire_pumps``, ``equipment.named_duty_motor``,
        ``equipment.named_refrigerant_motor``)."""
        if result.load_kind == "fire-pump":
            if self.walk is None:
                return result
            return with_fields(result, notes=result.notes + supply_notes(self.walk, r))
        problem = named_fire_pump(r)
        if problem is not None:
            return with_fields(result, problems=result.problems + (problem,))
        # an elevator, crane or hoist; a refrigerant motor-compressor: assumptions, said
        said = tuple(n for n in (named_duty_motor(r), named_refrigerant_motor(r)) if n)
        if not said:
            return result
        return with_fields(result, notes=result.notes + said)

    def forget(self, r: Run) -> None:
        res = self.result
        for table in (res.runs, res.run_total_drop_pct, res.feeder_amps, res._specs,
                      res._passed, res.feeders, res.start_dips, res._start_problems):
            table.pop(r.id, None)

    def store(self, r: Run, result: RunResult, is_feeder: bool, spec: RunSpec) -> None:
        res = self.result
        rid = r.__dict__["id"]
        res.runs[rid] = result
        res.run_total_drop_pct[rid] = result.total_drop_pct
        problems = result.problems
        if problems:
            res._run_problems[rid] = [Problem("", None, "run", rid, None, m) for m in problems]
        else:
            res._run_problems.pop(rid, None)
        if is_feeder:
            res.feeder_amps[rid] = spec.amps
            target = self.walk.sources[r.to]
            if target.kind == "transformer":
                info = res.transformers.get(r.to)
                res.source_drop_pct[r.to] = secondary_bus_drop(
                    result.total_drop_pct, info.drop_pct if info is not None else 0.0,
                    through=self.job.defaults.drop_through_transformers)
            else:
                res.source_drop_pct[r.to] = result.total_drop_pct

    def start_dips(self, among: Iterable[str] | None = None) -> None:
        """Each motor's starting dip from the service (``gaugewalk.model.walk.starting``), once
        every run above it is sized; ``among``: after an update in place, only those runs (every
        run whose feeders above were done again is among them)."""
        walk, res = self.walk, self.result
        dips, problems = res.start_dips, res._start_problems
        if among is None:   # only motors have a starting drop
            dips.clear()
            problems.clear()
            among = [rid for rid, rr in res.runs.items() if rr.starting_drop_pct is not None]
        job, runs = self.job, res.runs
        for rid in among:
            rr = runs.get(rid)
            r = job.run(rid) if rr is not None and rr.starting_drop_pct is not None else None
            dip = start_dip(walk, res, r) if r is not None else None
            if dip is None:
                dips.pop(rid, None)
                problems.pop(rid, None)
                continue
            dips[rid] = dip
            if dip.problem is None:
                problems.pop(rid, None)
            else:
                problems[rid] = [Problem("", None, "run", rid, None, dip.problem)]

    def chain_problems(self, changed: set[str] | None = None) -> None:
        """The walk's problems about its chains: runs from no source, sources in a loop, and,
        source by source from the top, those of its sums and its main lugs (NEC 408.36).
        ``changed``: after an update in place, the only sources whose sums or feeder were
        done again (``gaugewalk.model.walk.recompute``); the others' are kept."""
        walk, res = self.walk, self.result
        found: list[Problem] = []
        for r in walk.orphans:
            found.append(Problem("", None, "run", r.id, "from", f"the run starts at "
                                 f"'{r.from_}', which is not a source of this job"))
        for sid in walk.unreached:
            found.append(Problem("", None, "source", sid, None, "this source is in a loop of "
                                 "feeders, so it cannot be followed up to the service"))
        parts = res._source_problems
        if changed is None:
            parts.clear()
        for sid in (walk.order if changed is None else changed):
            mine = list(res._sum_problems.get(sid, ()))
            feeder = walk.feeder.get(sid)
            fed = res.runs.get(feeder.id) if feeder is not None else None
            why = lugs_problem(walk.sources[sid], fed.ocpd_a if fed is not None else None)
            if why is not None:
                mine.append(Problem("", None, "source", sid, "main_a", why))
            parts[sid] = mine
        for sid in walk.order:
            found.extend(parts[sid])
        res._chain_problems = found

    def count_shared(self) -> None:
        """Current-carrying conductors in each shared raceway, before any run is sized."""
        self.shared_ccc = ccc_by_raceway(self.job, self.result._circuits)

    def check_shared(self) -> None:
        """Each shared raceway's fill, once every run is sized."""
        res = self.result
        res.raceways, res._raceway_problems = shared_raceways(self.job, res.runs,
                                                              self.shared_ccc)

    def assemble_problems(self) -> None:
        res = self.result
        problems = list(res._chain_problems) + res._raceway_problems
        position = self.walk.position
        runs = res._run_problems
        placed = res._place_problems
        starts = res._start_problems
        if len(position) == len(self.job.runs):  # ids unique: only the runs with problems, in order
            for rid in sorted(set(runs) | set(placed) | set(starts), key=position.__getitem__):
                problems.extend(runs.get(rid, ()))
                problems.extend(placed.get(rid, ()))
                problems.extend(starts.get(rid, ()))
        elif runs or placed or starts:
            for r in self.job.runs:
                problems.extend(runs.get(r.id, ()))
                problems.extend(placed.get(r.id, ()))
                problems.extend(starts.get(r.id, ()))
        res.problems = problems


def compute_job(job: Job) -> JobResult:
    """Size every run of the walk and carry the drop down every chain."""
    with collector_held():  # thousands of new results, no reference cycles among them
        return _compute_job(job)


def _compute_job(job: Job) -> JobResult:
    walk = SupplyGraph(job)
    result = JobResult()
    state = WalkState(walk, result)
    state.resolve_circuits()
    state.sum_all()
    state.count_shared()
    for sid in walk.order:
        upstream = result.source_drop_pct.setdefault(sid, 0.0)
        for r in walk.children[sid]:
            state.evaluate_run(r, upstream)
    state.check_shared()
    state.start_dips()
    state.chain_problems()
    state.assemble_problems()
    result._shape = walk.shape()
    result._walk = walk
    return result


def _served_beyond_stated(state: WalkState, r: Run, design_a: float,
                          feed: Feed) -> tuple[float | None, str]:
    """A feeder given its own load is sized for it, as the person asked (a demand load worked
    out by hand, NEC 220 Parts III-IV, is the usual reason). Where the loads recorded on the
    source it feeds need more on their heaviest line (NEC 215.2(A)(1), with the job's demand
    setting; 430.24 where it supplies motors), its basis says so and states the assumption, so
    a stale figure cannot pass unseen: (that design current [A], the words); (None, "") where
    they need no more."""
    served, _ = state.with_demand(r, feed)
    k, need, _, _ = served.heaviest()
    target = state.walk.sources[r.to]
    motors = (state.result.motor_groups.get(r.to) if target.kind != "transformer" else None)
    if motors is not None:   # NEC 430.24: the largest motor at 125 %, as a feeder summing them
        k, amps, cont, motor_a = heaviest_with_motor(served, motors.largest_a)
        need = amps + 0.25 * (cont + motor_a)
    if need <= design_a + 0.05:
        return None, ""
    line = f"line {LINE_NAMES[k]}" if served.frame == "lines" else "the primary winding"
    return need, (f" ({design_a:.1f} A design), taken as a demand load worked out for {r.to}: the "
            f"loads recorded there need {need:.1f} A on {line} (NEC 215.2(A)(1)"
            f"{', 430.24' if motors is not None else ''}); remove the "
            "feeder's load to size it from them")
