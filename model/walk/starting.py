"""A motor's starting dip at its terminals from the service: what the walk adds to the drop the
engine works on the motor's own run (``evaluate._starting_drop``, at its locked-rotor current).

While a motor starts, its locked-rotor current also flows through every feeder and transformer
between it and the service, and the voltage at the motor is already down by the running drop up to
its bus. The dip at the motor is taken as the sum, as percent of the motor's rated voltage:

- the bus's running drop (``JobResult.source_drop_pct``, as the job carries it through
  transformers), which counts the motor itself at its full-load current (on the safe side);
- each feeder above: the locked-rotor current through the feeder's own size, length and sets,
  at the starting power factor (``kinds.STARTING_PF``, common practice), on the motor's own
  circuit (its neutral too for a motor line-to-neutral: hot and neutral carry it) while on the
  motor's voltage; above a transformer, the motor's starting kVA spread over the feeder's lines
  (common practice: the unbalance of a single-phase motor seen through a transformer is left
  out);
- each transformer: %R and %X at the starting power factor times the motor's starting kVA over
  the transformer's (IEEE Std 141 approximation, as the running drop through it), a single-phase
  motor on a three-phase unit loading the windings it is across (3x for line-to-neutral, 2x for
  line-to-line: its current on one or two of three windings);
- the motor's own run (the engine's starting drop).

The utility's supply is taken as stiff: its impedance is not known to a walk, so the dip is at
least this. The total is held to the job's starting target (``Defaults.starting_drop_pct``;
common practice 10 to 15 %). Where a feeder or transformer above cannot be read (not sized, no
kVA), the dip is not worked and the note says which.

Public API: ``StartDip``, ``start_dip(walk, result, run) -> StartDip | None`` (a stored run),
``dip_at_motor(walk, result, run, rr, spec) -> StartDip | None`` (any run sized below a stored
walk's bus, as the run card previews it).
"""

from __future__ import annotations

import math
from typing import NamedTuple

from gaugewalk.model.engine.drop import drop_length_ft, drop_volts
from gaugewalk.model.engine.sizing.evaluate import starting_impedance
from gaugewalk.model.engine.sizing.kinds import STARTING_PF
from gaugewalk.model.engine.sizing.text import pct_text
from gaugewalk.model.walk.transformers import drop_through

_SQRT3 = math.sqrt(3.0)


class StartDip(NamedTuple):
    """A motor run's starting dip from the service [%] (None where it cannot be worked), its
    parts, the sentence the run's notes carry and, over the target, the problem."""

    total_pct: float | None
    bus_pct: float
    above_pct: float          # the feeders and transformers above, at the locked-rotor current
    run_pct: float            # the motor's own run (the engine's starting drop)
    target_pct: float         # the job's starting target
    note: str
    problem: str | None

    @property
    def short(self) -> str:
        """``4.41% (max 15)``, or ``not worked``."""
        if self.total_pct is None:
            return "not worked"
        return f"{self.total_pct:.2f}% (max {self.target_pct:g})"


def start_dip(walk, result, run) -> StartDip | None:
    """The starting dip of the motor on branch ``run`` (a walk's ``SupplyGraph``, its
    ``JobResult`` after the run was sized), or None where the run has no starting drop (not a
    motor, or its locked-rotor current unread)."""
    return dip_at_motor(walk, result, run, result.runs.get(run.id), result._specs.get(run.id))


def dip_at_motor(walk, result, run, rr, spec) -> StartDip | None:
    """``start_dip`` of ``run`` sized as ``rr`` from ``spec`` (the engine's result and input),
    below the feeders and transformers of ``walk`` and ``result``."""
    if rr is None or spec is None or rr.starting_drop_pct is None or not rr.locked_rotor_a:
        return None
    lra = rr.locked_rotor_a
    circuit = spec.circuit
    start_kva = (_SQRT3 if circuit.phases == 3 else 1.0) * circuit.volts * lra / 1000.0
    bus = result.source_drop_pct.get(run.from_, 0.0)
    target = spec.starting_drop_pct
    parts: list[str] = []
    above = 0.0
    same_level = True
    sid = run.from_
    seen: set[str] = set()
    while sid not in seen:
        seen.add(sid)
        source = walk.sources.get(sid)
        if source is None:
            break
        if source.kind == "transformer":
            pct, why = _transformer_part(result.transformers.get(sid), start_kva, circuit,
                                         same_level)
            if pct is None:
                return _unworked(rr, bus, target, f"{sid} {why}")
            above += pct
            parts.append(f"{sid} {pct_text(pct)}")
            same_level = False
        feeder = walk.feeder.get(sid)
        if feeder is None:
            break
        pct = _feeder_part(result, feeder, lra, start_kva, circuit, same_level)
        if pct is None:
            return _unworked(rr, bus, target, f"its feeder {feeder.id} is not sized")
        above += pct
        parts.append(f"{feeder.id} {pct_text(pct)}")
        sid = feeder.from_
    own = rr.starting_drop_pct
    total = bus + above + own
    above_words = (f"the feeders and transformers above at {lra:.0f} A locked-rotor "
                   f"{pct_text(above)} ({', '.join(reversed(parts))}; power factor "
                   f"{STARTING_PF:g}, common practice)" if parts
                   else "nothing between it and the service")
    note = (f"starting dip at the motor from the service {pct_text(total)}: the bus's running "
            f"drop {pct_text(bus)}, {above_words}, this run {pct_text(own)}; the utility's "
            f"supply taken as stiff (its impedance is not known), so the dip is at least this; "
            f"target {target:g}%")
    problem = None
    if total > target + 1e-9 and own <= target + 1e-9:   # over on its own: the engine says so
        problem = (f"the motor's starting dip from the service, {pct_text(total)}, is over the "
                   f"{target:g}% starting target (larger feeders, a larger or lower-impedance "
                   "transformer, or a reduced-voltage start bring it down)")
    return StartDip(total, bus, above, own, target, note, problem)


def _unworked(rr, bus: float, target: float, why: str) -> StartDip:
    return StartDip(None, bus, 0.0, rr.starting_drop_pct, target,
                    f"starting dip at the motor from the service not worked: {why}", None)


def _feeder_part(result, feeder, lra: float, start_kva: float, motor, same_level: bool
                 ) -> float | None:
    """What ``feeder`` adds to the dip [%]: on the motor's voltage, the locked-rotor current on
    the motor's own circuit; above a transformer, the starting kVA over the feeder's lines."""
    fr = result.runs.get(feeder.id)
    spec = result._specs.get(feeder.id)
    if fr is None or spec is None:
        return None
    z = starting_impedance(spec, fr.size)
    if z is None:
        return None
    length = drop_length_ft(spec.length_ft, spec.distributed)
    if same_level:
        return 100.0 * drop_volts(motor.drop_factor, lra, z, length, fr.sets) / motor.volts
    own = spec.circuit
    amps = start_kva * 1000.0 / ((_SQRT3 if own.phases == 3 else 1.0) * own.line_volts)
    return 100.0 * drop_volts(own.drop_factor, amps, z, length, fr.sets) / own.volts


def _transformer_part(info, start_kva: float, motor, same_level: bool
                      ) -> tuple[float | None, str]:
    """What a transformer adds to the dip [%] (IEEE Std 141 approximation at the starting power
    factor), or (None, why)."""
    if info is None or info.kva is None:
        return None, "has no kVA"
    if info.impedance_pct is None or info.x_r is None:
        return None, "has no impedance"
    share = 1.0
    if same_level and info.phases == 3 and motor.phases == 1:
        share = 2.0 if motor.hots == 2 else 3.0   # its current on two or one of three windings
    return drop_through(share * start_kva / info.kva, info.impedance_pct, info.x_r,
                        STARTING_PF), ""
