"""A run's load as its kind reads it: the walk's ``Load`` turned into the engine's ``Equipment``,
and what follows for the run and for the feeder above it. The rules themselves are
``gaugewalk.model.engine.sizing.kinds``; this module only reads a run.

Public API:

- ``equipment_of(run) -> Equipment | None``: None for a general load with nothing more to say
  (the engine's fast path).
- ``LoadFacts``; ``load_facts(run, circuit, default_pf) -> LoadFacts``: the running current
  [A], the power factor, whether it is continuous, and the equipment, as the run's sizing uses
  them. Raises ``LoadError``.
- ``feeder_share(run, circuit, default_pf) -> FeederLoad``: what the run adds to the panel it
  is on, for its feeder (NEC 215.2(A)(1)).
- ``run_kind_load(run, circuit, default_pf) -> KindLoad | None``: for a feeder's rules (NEC
  430.24, 430.62, 440.33, 630.11(B)): the kind, whether it is a motor, its running current,
  the current its branch is sized from (motor FLC, HVAC MCA, welder 630.11(A) current), and its
  branch device. None for a run without a load of its own.

Feeders: until a feeder's rules for motors (430.24) land, a motor adds its full-load current as
a continuous load, so the feeder takes 125 % of every motor (at least the 125 % of the largest
430.24 asks; conservative); HVAC equipment adds its nameplate MCA (125 % of its largest motor
included, as 440.33 counts one unit); a welder its 630.11(A) current; every other kind its
running current, continuous as its kind and the run say.
"""

from __future__ import annotations

from dataclasses import dataclass

from gaugewalk.model.engine.contract import Circuit, Equipment
from gaugewalk.model.engine.loads import load_amps
from gaugewalk.model.engine.sizing.kinds import (
    KindLoad,
    continuous_of,
    kind_load,
    load_pf,
    running_amps,
    welder_current,
)
from gaugewalk.model.walk.job import Load, Run

def _equipment(load: Load, continuous: bool | None) -> Equipment:
    return Equipment(
        kind=load.kind,
        hp=load.value if load.unit == "hp" else None,
        motor_device=load.motor_device or "inverse-time",
        code_letter=load.code_letter,
        design=load.design or "B",
        mca_a=load.mca, mocp_a=load.mocp,
        i1eff_a=load.i1eff, i1max_a=load.i1max, rated_a=load.rated_a,
        duty_cycle_pct=load.duty_cycle_pct, welder_type=load.welder_type or "nonmotor",
        tank_gal=load.tank_gal, yokes=load.yokes,
        continuous=continuous,
    )


def equipment_of(run: Run) -> Equipment | None:
    """The engine's ``Equipment`` for the run's load; None for a general load (the general rule,
    without a kind to read)."""
    load = run.load
    if load is None or load.kind == "general":
        return None
    return _equipment(load, run.continuous)


@dataclass(frozen=True)
class LoadFacts:
    """A run's load as its sizing uses it: ``amps`` running [A], ``pf``, ``continuous`` and the
    ``equipment`` (None: a general load)."""

    amps: float
    pf: float
    continuous: bool
    equipment: Equipment | None


def load_facts(run: Run, circuit: Circuit, default_pf: float) -> LoadFacts:
    """The run's own load on its circuit (the run must have one). Raises ``LoadError``."""
    load = run.load
    assert load is not None
    eq = equipment_of(run)
    pf = load_pf(load.kind, load.pf, default_pf)
    if eq is None:
        return LoadFacts(load_amps(load.value, load.unit, circuit, pf), pf, bool(run.continuous),
                         None)
    return LoadFacts(running_amps(eq, load.value, load.unit, circuit, pf), pf, continuous_of(eq),
                     eq)


def _feeder_amps(facts: LoadFacts) -> tuple[float, bool]:
    """The current a run adds to its panel for the feeder [A], and whether continuously."""
    eq = facts.equipment
    if eq is None:
        return facts.amps, facts.continuous
    if eq.kind == "motor":
        return facts.amps, True
    if eq.kind == "hvac" and eq.mca_a is not None:
        return max(facts.amps, eq.mca_a), False
    if eq.kind == "welder":
        current, _notes = welder_current(eq)
        return (current if current is not None else facts.amps), False
    return facts.amps, facts.continuous


def feeder_share(run: Run, circuit: Circuit, default_pf: float) -> tuple[float, float, float]:
    """What the run adds to the panel it is on: (VA, continuous VA, W) on its circuit (S = V I,
    sqrt(3) V I three-phase; W = S pf); see the module docstring for each kind."""
    facts = load_facts(run, circuit, default_pf)
    amps, continuous = _feeder_amps(facts)
    va = amps * circuit.line_volts * (1.7320508075688772 if circuit.phases == 3 else 1.0)
    return va, va if continuous else 0.0, va * facts.pf


def run_kind_load(run: Run, circuit: Circuit, default_pf: float) -> KindLoad | None:
    """``KindLoad`` of the run's own load (None without one). Raises ``LoadError`` for a motor
    the tables do not list at the circuit's voltage."""
    if run.load is None:
        return None
    facts = load_facts(run, circuit, default_pf)
    eq = facts.equipment or _equipment(run.load, run.continuous)
    return kind_load(eq, facts.amps, run.ocpd_a, circuit.volts, circuit.phases)
