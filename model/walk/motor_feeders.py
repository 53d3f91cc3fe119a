"""Feeders that supply motors and HVAC equipment: what NEC 430.24, 430.62(A) and 440.33 add to
the heaviest line's load. The kinds themselves are read by ``gaugewalk.model.walk.equipment``
(and ``gaugewalk.model.engine.sizing.kinds``); this module only gathers a source's motors.

- Conductors (430.24, 440.33): the motors' full-load currents are summed per line with the
  other loads (noncontinuous: 430.24 takes them at 100 %), and 125 % of the largest motor's is
  added: on each line, up to the largest motor's current of its noncontinuous part is counted
  as continuous, and the line whose design current is then the greatest sizes the feeder
  (``heaviest_with_motor``; a line heavier before the 25 % may be lighter after it). The
  largest motor is the largest anywhere below the feeder; on a line without it this adds a
  little more than 430.24 asks (conservative).
- HVAC equipment known by its nameplate MCA alone: its rated-load current is taken as
  MCA / 1.25 (the MCA holds 125 % of the largest motor, 440.33 counts that 25 % once for the
  group; assumed, and said in the feeder's notes).
- Device (430.62(A), 430.63): not above the largest branch short-circuit and ground-fault
  device of any motor supplied plus the other loads on the heaviest line: the other motors'
  full-load currents and the rest as 215.3 counts them (125 % of the continuous). For a feeder
  of motors alone (430.62(A): "shall not be greater than") a device above that is a problem, and
  the device picked is the largest standard rating within it (and within the bus of a
  main-lugs-only panel, 408.36), protecting the 430.24 conductors by 240.4(G)
  (``gaugewalk.model.engine.sizing.currents.motor_feeder``); a feeder with other loads too
  (430.63, worded as a floor) has the figure in its notes. Either way a feeder device below
  the branch device of a motor it supplies is a problem: it would open first when that motor
  starts or faults (common practice; 430.63's floor is above it).
- A motor on an instantaneous-trip breaker (430.52(C)(3)) counts in that device figure at no
  more than the Table 430.52(C)(1) percentage of its full-load current for the feeder's own
  device type, not at its trip setting (430.62(A) Exception No. 1; from memory: the
  exception's number). The walk does not say the feeder's device type: an inverse-time breaker
  is taken (common practice for a feeder from a panel or switchboard), and the note says so.
- Motors below a transformer are the transformer's load: the feeder into its primary is sized
  by the primary device (Table 450.3(B)), and no motor group passes through it.

Public API: ``MotorGroup``, ``run_motor(run, circuit, default_pf)``, ``largest(groups)``,
``heaviest_with_motor(feed, largest_a)``,
``device_limit(group, load_amps)``, ``below_branch_device(group, ocpd_a, limit_a)``,
``notes_for(group, extra_a)``.
"""

from collections.abc import Iterable
from typing import NamedTuple

from gaugewalk.model.engine.contract import Circuit
from gaugewalk.model.engine.loads import LoadError
from gaugewalk.model.walk.equipment import HVAC_RLA_FACTOR, run_kind_load
from gaugewalk.model.walk.feeder_loads import Feed
from gaugewalk.model.walk.job import Run
from gaugewalk.tables.equipment import motor_protection as t_mp

FEEDER_DEVICE = "inverse-time"
"""The feeder device type taken for 430.62(A) Exception No. 1 (the walk does not give one):
an inverse-time breaker, as in ``gaugewalk.tables.equipment.motor_protection``."""


class MotorGroup(NamedTuple):
    """The motors a feeder supplies, as its rules need them: the ``largest_a`` motor current [A]
    (run ``largest_run``), the largest branch device ``device_a`` [A] of any of them and the
    current of the motor it protects (``device_motor_a``) [A], whether an HVAC unit's
    current was taken from its MCA (``hvac_assumed``), whether the feeder supplies motors
    and HVAC equipment alone (``only_motors``), the run of that largest device
    (``device_run``), and the runs whose instantaneous-trip breaker counts at the feeder
    device's Table 430.52(C)(1) percentage instead of its setting (``instantaneous``, each with
    the current it counts at [A]; 430.62(A) Exception No. 1), and the fire pumps among them
    whose locked-rotor current is known (``fire_pumps``: run, locked-rotor and full-load
    currents [A]; NEC 695.4(B)(2)(a)(1), ``gaugewalk.model.walk.fire_pumps``)."""

    largest_a: float
    largest_run: str
    device_a: float
    device_motor_a: float
    hvac_assumed: bool = False
    only_motors: bool = True
    device_run: str = ""
    instantaneous: tuple[tuple[str, float], ...] = ()
    fire_pumps: tuple[tuple[str, float, float], ...] = ()


def run_motor(run: Run, circuit: Circuit, default_pf: float) -> MotorGroup | None:
    """The run's motor (a fire pump too: its branch device the one that carries its
    locked-rotor current) or HVAC unit as a group of one; None for any other load (or one whose
    kind cannot be read: the run itself says why)."""
    load = run.load
    if load is None or load.kind not in ("motor", "fire-pump", "hvac"):
        return None
    try:
        kl = run_kind_load(run, circuit, default_pf)
    except LoadError:
        return None
    if kl is None:
        return None
    if kl.is_motor:
        current = kl.flc_a if kl.flc_a is not None else kl.running_a
        if load.motor_device == "instantaneous":   # NEC 430.62(A) Exception No. 1
            kind = "single-phase" if circuit.phases == 1 else "squirrel-cage"
            counted = current * t_mp.branch_device_percent(kind, FEEDER_DEVICE) / 100.0
            return MotorGroup(current, run.id, counted, current, device_run=run.id,
                              instantaneous=((run.id, counted),))
        fire = (((run.id, kl.lra_a, current),) if load.kind == "fire-pump"
                and kl.lra_a is not None else ())
        return MotorGroup(current, run.id, float(kl.branch_device_a), current,
                          device_run=run.id, fire_pumps=fire)
    if kl.mca_a is None:
        return None
    current = kl.mca_a / HVAC_RLA_FACTOR
    device = float(kl.mocp_a if kl.mocp_a is not None else kl.branch_device_a)
    return MotorGroup(current, run.id, device, current, True, device_run=run.id)


def largest(groups: Iterable[MotorGroup | None]) -> MotorGroup | None:
    """The group of several: the largest motor, and the largest branch device."""
    out: MotorGroup | None = None
    for g in groups:
        if g is None:
            continue
        if out is None:
            out = g
            continue
        big = g if g.largest_a > out.largest_a else out
        dev = g if g.device_a > out.device_a else out
        out = MotorGroup(big.largest_a, big.largest_run, dev.device_a, dev.device_motor_a,
                         out.hvac_assumed or g.hvac_assumed, out.only_motors and g.only_motors,
                         dev.device_run, out.instantaneous + g.instantaneous,
                         out.fire_pumps + g.fire_pumps)
    return out


def heaviest_with_motor(feed: Feed, largest_a: float) -> tuple[int, float, float, float]:
    """NEC 430.24 on a feeder's lines: (line, load current [A], continuous current [A], the
    largest motor's current counted at 125 % on it [A]) of the line whose design current is
    the greatest once up to ``largest_a`` [A] of its noncontinuous part is taken at 125 % (the
    load and continuous currents as ``Feed.heaviest`` reads them, 215.2(A)(1))."""
    best, out = -1.0, (0, 0.0, 0.0, 0.0)
    for k, (t, c) in enumerate(zip(feed.total, feed.continuous, strict=True)):
        cont = abs(c)
        amps = cont + abs(t - c)
        motor = min(largest_a, amps - cont)
        design = amps + 0.25 * (cont + motor)
        if design > best + 1e-9:
            best, out = design, (k, amps, cont, motor)
    return out


def device_limit(group: MotorGroup, design_a: float) -> float:
    """NEC 430.62(A), 430.63: the largest feeder device [A]: the largest branch device of any
    motor supplied plus the rest of the heaviest line's load. ``design_a`` is that line's
    design current with the motors (430.24: the largest at 125 %), so the rest is it less the
    largest motor's 25 % and the current of the motor whose device is counted."""
    return group.device_a + max(0.0, design_a - 0.25 * group.largest_a - group.device_motor_a)


def below_branch_device(group: MotorGroup, ocpd_a: int, limit_a: float) -> str:
    """The problem of a feeder device below the branch device of a motor it supplies: it would
    open before that motor's own device when the motor starts or faults (common practice);
    430.62(A) permits, and 430.63 asks, at least ``limit_a`` [A] with the other loads."""
    rule = ("NEC 430.62(A) permits up to" if group.only_motors
            else "NEC 430.63 asks not less than")
    return (f"the {ocpd_a} A feeder device is below the {group.device_a:.0f} A branch device of "
            f"{group.device_run} it supplies: it would open first when that motor starts "
            f"(common practice); {rule} {limit_a:.0f} A; give the feeder a larger device "
            "('ocpd_a') or the motor a smaller one")


_BELOW_430_63 = (
    "; the {} A device is below it: 430.63 words that figure as a floor (\"not less than\"), "
    "a wording the trade often reads as a ceiling like 430.62(A)'s, so it is taken as neither: "
    "the device is checked against what the load needs (215.3) and the largest motor branch "
    "device only; confirm the reading with the authority having jurisdiction")
"""What a 430.63 note adds where the feeder's device is below the figure (a stated reading)."""


def notes_for(group: MotorGroup, extra_a: float, limit_a: float,
              device_a: int | None = None) -> tuple[str, ...]:
    """The feeder's notes on its motors: the 125 % of the largest (430.24, 440.33), the device
    limit (430.62(A)) or, with other loads, the 430.63 figure and, where the feeder's
    ``device_a`` [A] is below it, how that figure was read; and the HVAC assumption."""
    notes = [f"NEC 430.24: 125 % of the largest motor ({group.largest_run}, "
             f"{group.largest_a:.1f} A) plus the other loads: {extra_a:.1f} A added at 25 %",
             f"NEC 430.62(A): feeder device not above {limit_a:.0f} A (the largest branch "
             f"device, {group.device_a:.0f} A, plus the other loads on the line)"
             if group.only_motors else
             f"NEC 430.63: with other loads, the motors' part per 430.62(A) plus the other loads "
             f"is {limit_a:.0f} A (the largest branch device, {group.device_a:.0f} A, plus the "
             "rest)" + (_BELOW_430_63.format(device_a) if device_a is not None
                        and device_a + 1e-9 < limit_a else "")]
    if group.instantaneous:
        pct = t_mp.branch_device_percent("squirrel-cage", FEEDER_DEVICE)
        runs = ", ".join(f"{rid} at {amps:.0f} A" for rid, amps in group.instantaneous[:4])
        more = len(group.instantaneous) - 4
        runs += f" and {more} more" if more > 0 else ""
        notes.append(f"NEC 430.62(A) Exception No. 1: an instantaneous-trip motor breaker counts "
                     f"in the feeder device's figure at the Table 430.52(C)(1) percentage of its "
                     f"full-load current for the feeder's device, not at its setting ({runs}; "
                     f"the feeder device taken as an inverse-time breaker, {pct} %; a fused "
                     f"feeder reads its fuse's column)")
    if group.hvac_assumed:
        notes.append(f"NEC 440.33: an HVAC unit known by its MCA alone is taken at MCA / "
                     f"{HVAC_RLA_FACTOR:g} as its rated-load current (assumed)")
    return tuple(notes)
