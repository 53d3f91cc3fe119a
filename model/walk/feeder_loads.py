"""What each source serves: the loads below it summed up the supply graph, for its feeder.

A feeder's load is what its panel serves, the sum of the apparent power of the runs below it
(loads in A turned into VA on their own circuit), turned back into amps on the feeder's circuit;
its continuous share likewise (NEC 215.2(A)(1)). A feeder with its own ``load`` uses that
instead. Summing VA arithmetically ignores the phase angle between loads, which can only
overstate the current (common practice). Single-phase S = V I, three-phase S = sqrt(3) V_LL I.

Public API:

- ``FeederLoad(va, continuous_va, watts)`` [VA, VA, W]; ``ZERO``; ``add(a, b, sign=1.0)``.
- ``va_of(value, unit, circuit, pf)`` [VA]; ``amps_of_va(va, circuit)`` [A].
- ``load_of(run, circuit, default_pf)``: a run's own load, or None (a feeder summing its panel);
  a load of a kind (motor, HVAC...) as ``gaugewalk.model.walk.equipment.feeder_share`` reads it.
- ``sum_loads(graph, circuits, default_pf, set_run_load, loads, connected_va)``: bottom-up over
  the graph.
- ``carry_up(graph, source_id, delta, loads, connected_va, set_run_load)``: a change of load at
  one source added to it and to every source above it whose feeder sums its panel.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass

from gaugewalk.model.engine.contract import Circuit
from gaugewalk.model.engine.loads import UNITS, LoadError
from gaugewalk.model.walk.equipment import feeder_share
from gaugewalk.model.walk.graph import SupplyGraph
from gaugewalk.model.walk.job import Run

SQRT3 = math.sqrt(3.0)


@dataclass(frozen=True)
class FeederLoad:
    """What a feeder carries, from the loads below it: apparent power [VA], its continuous part
    [VA] and real power [W]."""

    va: float
    continuous_va: float
    watts: float


_new_object = object.__new__
_set_attr = object.__setattr__


def feeder_load(va: float, continuous_va: float, watts: float) -> FeederLoad:
    """``FeederLoad(va, continuous_va, watts)`` without the per-field ``object.__setattr__`` of
    a frozen dataclass's ``__init__`` (two are made per run)."""
    load = _new_object(FeederLoad)
    _set_attr(load, "__dict__", {"va": va, "continuous_va": continuous_va, "watts": watts})
    return load


def add(a: FeederLoad, b: FeederLoad, sign: float = 1.0) -> FeederLoad:
    """``a + sign * b``, field by field."""
    return feeder_load(a.va + sign * b.va, a.continuous_va + sign * b.continuous_va,
                       a.watts + sign * b.watts)


ZERO = FeederLoad(0.0, 0.0, 0.0)


def va_of(value: float, unit: str, circuit: Circuit, pf: float) -> float:
    """Apparent power of a load [VA]: A times the circuit's volts (times sqrt 3 on three
    phases), VA as given, W divided by the power factor."""
    if unit == "A":
        return value * circuit.line_volts * (SQRT3 if circuit.phases == 3 else 1.0)
    va = value * UNITS[unit]
    return va / pf if unit in ("W", "kW") else va


def amps_of_va(va: float, circuit: Circuit) -> float:
    """Line current of an apparent power on a circuit [A] (S/V, S/(sqrt 3 V_LL))."""
    return va / (circuit.line_volts * (SQRT3 if circuit.phases == 3 else 1.0))


def load_of(run: Run, circuit: Circuit, default_pf: float) -> FeederLoad | None:
    """A run's own load as VA, continuous VA and W on its circuit; None when it gives none (or
    its kind cannot be read on the circuit: the run itself says why). A load of a kind other
    than general is read by ``gaugewalk.model.walk.equipment.feeder_share``."""
    load = run.load
    if load is None:
        return None
    if load.kind != "general":
        try:
            return feeder_load(*feeder_share(run, circuit, default_pf))
        except LoadError:
            return None
    pf = load.pf if load.pf is not None else default_pf
    va = va_of(load.value, load.unit, circuit, pf)
    return feeder_load(va, va if run.continuous else 0.0, va * pf)


def sum_loads(graph: SupplyGraph, circuits: dict[str, Circuit], default_pf: float,
              set_run_load: Callable[[Run, FeederLoad | None], None],
              loads: dict[str, FeederLoad], connected_va: dict[str, float]) -> None:
    """Bottom-up: what each source serves [VA], into ``loads`` and ``connected_va``; each run's
    load (its own on its circuit from ``circuits``, or for a feeder without one what its panel
    serves) to ``set_run_load``."""
    feeder, children = graph.feeder, graph.children
    for sid in reversed(graph.order):
        total = ZERO
        for r in children[sid]:
            circuit = circuits.get(r.id) if r.load is not None else None
            load = None if circuit is None else load_of(r, circuit, default_pf)
            if load is None and feeder.get(r.to) is r:
                load = loads.get(r.to)
            set_run_load(r, load)
            if load is not None:
                total = add(total, load)
        loads[sid] = total
        connected_va[sid] = total.va


def carry_up(graph: SupplyGraph, source_id: str, delta: FeederLoad,
             loads: dict[str, FeederLoad], connected_va: dict[str, float],
             set_run_load: Callable[[Run, FeederLoad | None], None]) -> list[Run]:
    """Add ``delta`` to what ``source_id`` serves and to every source above it, up to the first
    feeder that gives its own load; returns the feeders whose load changed, lowest first."""
    chain: list[Run] = []
    sid = source_id
    while True:
        total = add(loads[sid], delta)
        loads[sid] = total
        connected_va[sid] = total.va
        f = graph.feeder.get(sid)
        if f is None or f.load is not None:
            return chain
        set_run_load(f, total)
        chain.append(f)
        sid = f.from_
