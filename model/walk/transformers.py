"""A transformer of the walk: its rated currents, its protection by NEC Table 450.3(B), the rule
its secondary conductors follow (240.21(C)), its loading and the drop through it.

- Rated currents: kVA x 1000 / V (single-phase) or / (sqrt(3) V) (three-phase), the primary at
  the voltage of the feeder into it, the secondary at its system's line-to-line voltage.
- Primary device (Table 450.3(B)): primary only, at most 125 % of the primary rated current, the
  next higher standard rating permitted where that is not one (note 1, 9 A or more); 167 % below
  9 A and 300 % below 2 A, not exceeded. With primary and secondary protection the primary may be
  up to 250 %: the device is still picked at 125 % (the usual choice), and a device the walk
  fixes is accepted up to 250 %. The secondary device is then at most 125 % of the secondary
  rated current (note 1 for 9 A or more), 167 % below 9 A: the transformer's
  ``secondary_ocpd_a``, else the main of the one panel it feeds.
- Primary conductors: protected by the primary device (240.4, with the next size up of 240.4(B)).
- Secondary conductors (240.21(C)): not protected by the primary device; they end in one device
  no larger than their ampacity, with no next size up (240.21(C), 240.4(B) does not apply):
  within 10 ft (240.21(C)(2)) their ampacity is at least the device they end in (or, main lugs
  only, the rating of the equipment they supply, which is then a problem by 408.36(B): a panel
  supplied through a transformer is protected on its secondary side, but for the secondaries of
  240.21(C)(1)) and at least the primary device x the
  primary-to-secondary voltage ratio / 10; within 25 ft (240.21(C)(6)) at least that device and
  one third of the primary device x the ratio, ending in a single device. Longer is a problem
  (the outside, industrial and feeder-tap cases, 240.21(C)(3)-(5), are not checked here). A
  secondary device at the transformer (``secondary_ocpd_a``) is taken as at its terminals: the
  conductors beyond it are a feeder it protects.
- Bonding (NEC 250.30(A)(2), (3)): secondary conductors ahead of their first device carry the
  supply-side bonding jumper, by Table 250.102(C)(1) from their size, in place of a Table
  250.122 EGC, and their neutral is held to that size too (taken with the system bonding jumper
  at the first disconnecting means; ``SecondaryRule.bonding``).
- Loading: the heaviest secondary line against the secondary rated current; over it is a
  problem.
- Drop through it (IEEE Std 141 approximation): %VD = (I / I_rated) (%R cos(phi) + %X sin(phi)),
  I the heaviest secondary line, phi the angle of the load's power factor, %R and %X from the
  nameplate %Z and an X/R typical of the size (``gaugewalk.tables.equipment.transformers``,
  assumed and said so); an unknown %Z is the typical value for the size, marked assumed.

Public API: ``TransformerInfo``; ``transformer_info(source, lines, primary, feeder, fed)``;
``primary_device(rated_a, method)``; ``secondary_rule(...)``; ``impedance_parts(z_pct, x_r)``
and ``drop_through(loading, z_pct, x_r, pf)``, the approximation above (a motor's starting dip
reads it too, ``gaugewalk.model.walk.starting``).
"""

import math
from typing import NamedTuple

from gaugewalk.model.engine.circuits import SYSTEMS
from gaugewalk.model.engine.contract import Circuit
from gaugewalk.model.engine.sizing.currents import next_rating
from gaugewalk.model.walk.feeder_loads import Lines
from gaugewalk.model.walk.job import Run, Source
from gaugewalk.tables.equipment import transformers as t_xfmr
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.protection.ocpd import ALL_RATINGS

_METHOD = {"primary": "primary-only", "both": "primary-and-secondary"}


def impedance_parts(z_pct: float, x_r: float) -> tuple[float, float]:
    """(%R, %X) of an impedance ``z_pct`` [%] with reactance ``x_r`` times its resistance."""
    r_pct = z_pct / math.hypot(1.0, x_r)
    return r_pct, r_pct * x_r


def drop_through(loading: float, z_pct: float, x_r: float, pf: float) -> float:
    """The drop through a transformer [%] carrying ``loading`` times its rated current at power
    factor ``pf``: IEEE Std 141 approximation, loading (%R cos(phi) + %X sin(phi))."""
    r_pct, x_pct = impedance_parts(z_pct, x_r)
    return loading * (r_pct * pf + x_pct * math.sqrt(max(0.0, 1 - pf * pf)))


class TransformerInfo(NamedTuple):
    """What the walk makes of one transformer; currents [A], voltages [V], percents [%]. None
    where the walk lacks what it needs (said in ``problems``)."""

    kva: float | None
    phases: int
    primary_v: float | None
    secondary_v: float
    primary_fla_a: float | None
    secondary_fla_a: float | None
    impedance_pct: float | None
    impedance_assumed: bool
    x_r: float | None
    protection: str
    primary_max_a: float | None
    primary_ocpd_a: int | None
    secondary_max_a: float | None
    secondary_ocpd_a: int | None
    load_kva: float
    load_amps: float
    utilisation_pct: float | None
    drop_pct: float
    notes: tuple[str, ...]
    problems: tuple[tuple[str, str], ...]   # (field, sentence)


def _a(x: float) -> str:
    return f"{x:.1f} A"


def primary_device(rated_a: float, method: str) -> tuple[float, int | None, str]:
    """(the most Table 450.3(B) permits [A], the device picked [A] or None when no rating fits,
    the sentence saying why) for a primary rated at ``rated_a`` [A]."""
    cell = t_xfmr.transformer_protection(_METHOD[method], "primary", rated_a)
    top = rated_a * (cell.percent or 0) / 100.0
    base = t_xfmr.transformer_protection("primary-only", "primary", rated_a)
    limit = rated_a * (base.percent or 0) / 100.0
    if base.next_size_up:
        device: int | None = next_rating(limit)
        why = (f"NEC Table 450.3(B): {base.percent} % of {_a(rated_a)} = {_a(limit)}; note 1: "
               f"next standard rating {device} A")
    else:
        below = [r for r in ALL_RATINGS if r <= limit + 1e-9]
        device = below[-1] if below else None
        why = (f"NEC Table 450.3(B): {base.percent} % of {_a(rated_a)} ({cell.band}) = "
               f"{_a(limit)}, not exceeded: {device} A" if device else
               f"NEC Table 450.3(B): {base.percent} % of {_a(rated_a)} is below every standard "
               "rating")
    if method == "both":
        why += (f"; with secondary protection the primary may be up to {cell.percent} % "
                f"({_a(top)})")
        return top, device, why
    return (max(top, float(device)) if base.next_size_up and device else top), device, why


def _secondary_max(rated_a: float) -> tuple[float, bool, int]:
    cell = t_xfmr.transformer_protection("primary-and-secondary", "secondary", rated_a)
    pct = cell.percent or 0
    top = rated_a * pct / 100.0
    return (float(next_rating(top)) if cell.next_size_up else top), cell.next_size_up, pct


def transformer_info(source: Source, lines: Lines, primary: Circuit | None, feeder: Run | None,
                     fed: list[tuple[Run, Source | None]]) -> TransformerInfo:
    """The transformer ``source`` with its secondary's line sums ``lines``, the circuit of the
    feeder into its primary (None: not fed) and that ``feeder``, and ``fed``: each run from its
    secondary with the source it feeds (None for a load)."""
    system = SYSTEMS[source.system]
    notes: list[str] = []
    problems: list[tuple[str, str]] = []
    phases = system.phases
    vs = system.line_to_line_v if system.hots > 1 else (system.line_to_neutral_v or
                                                       system.line_to_line_v)
    vp = primary.volts if primary is not None else None
    load_amps = max(lines.phase_amps, default=0.0)
    load_kva = lines.load.va / 1000.0
    kva = source.kva
    empty = TransformerInfo(kva, phases, vp, vs, None, None, source.impedance_pct, False, None,
                            source.protection, None, None, None, source.secondary_ocpd_a,
                            load_kva, load_amps, None, 0.0, (), ())
    if kva is None:
        problems.append(("kva", "its kVA is not given, so its rated currents, its protection "
                         "(NEC Table 450.3(B)) and the drop through it cannot be worked out"))
        return _with(empty, notes, problems)
    sec_fla = t_xfmr.rated_current(kva, vs, phases)
    pri_fla = t_xfmr.rated_current(kva, vp, primary.phases) if primary is not None else None
    notes.append(f"rated {kva:g} kVA: secondary {_a(sec_fla)} at {vs:g} V"
                 + (f", primary {_a(pri_fla)} at {vp:g} V" if pri_fla else ""))
    # protection
    pri_max = pri_dev = None
    if pri_fla is not None:
        pri_max, pri_dev, why = primary_device(pri_fla, source.protection)
        notes.append(why)
        if feeder is not None and feeder.ocpd_a is not None:
            pri_dev = feeder.ocpd_a
            notes.append(f"primary device fixed at {pri_dev} A on {feeder.id}")
        elif pri_dev is None:
            problems.append(("kva", why))
    sec_max = None
    sec_dev = source.secondary_ocpd_a
    if source.protection == "both":
        sec_max, up, pct = _secondary_max(sec_fla)
        if sec_dev is None:
            mains = [s.main_a for r, s in fed if s is not None and s.main_a is not None]
            if len(fed) == 1 and mains:
                sec_dev = mains[0]
                notes.append(f"NEC Table 450.3(B): the secondary device is the {sec_dev} A main "
                             f"of {fed[0][1].id}")
            else:
                problems.append(("secondary_ocpd_a", "protected on the primary and the "
                                 "secondary (NEC Table 450.3(B)), but no secondary device is "
                                 "given: give secondary_ocpd_a, or feed one panel with a main"))
        if sec_dev is not None and sec_dev > sec_max + 1e-9:
            problems.append(("secondary_ocpd_a", f"the {sec_dev} A secondary device is over "
                             f"the {sec_max:g} A NEC Table 450.3(B) permits ({pct} % of "
                             f"{_a(sec_fla)}{', note 1' if up else ''})"))
    # loading
    util = load_amps / sec_fla * 100.0
    if load_amps > sec_fla * (1 + 1e-9):
        problems.append(("kva", f"its heaviest secondary line carries {_a(load_amps)}, over its "
                         f"{_a(sec_fla)} rated current ({util:.0f} % of {kva:g} kVA; "
                         f"connected {load_kva:.1f} kVA)"))
    # impedance and drop
    z = source.impedance_pct
    assumed = False
    if z is None:
        try:
            typical = t_xfmr.typical_impedance(kva, phases)
        except TableLookupError as exc:
            problems.append(("impedance_pct", f"{exc}; the drop through it is left out"))
            return _with(TransformerInfo(
                kva, phases, vp, vs, pri_fla, sec_fla, None, False, None, source.protection,
                pri_max, pri_dev, sec_max, sec_dev, load_kva, load_amps, util, 0.0, (), ()),
                notes, problems)
        z, assumed = typical.pct, True
        notes.append(f"impedance {z:g} % assumed: typical of a {typical.kva_row:g} kVA "
                     f"dry-type unit (range {typical.low_pct:g}-{typical.high_pct:g} %, common "
                     "practice); give the nameplate impedance")
    x_r, row = t_xfmr.typical_x_r(kva, phases)
    load = lines.load
    pf = min(1.0, load.watts / load.va) if load.va > 0 else 1.0
    r_pct, x_pct = impedance_parts(z, x_r)
    drop = drop_through(load_amps / sec_fla, z, x_r, pf)
    notes.append(f"drop through it {drop:.2f} % at {_a(load_amps)} on its heaviest line, power "
                 f"factor {pf:.2f}: IEEE Std 141 approximation with %R {r_pct:.2f} and %X "
                 f"{x_pct:.2f} from %Z {z:g} and X/R {x_r:g} (assumed, typical of {row:g} kVA "
                 "units; common practice)")
    return _with(TransformerInfo(kva, phases, vp, vs, pri_fla, sec_fla, z, assumed, x_r,
                                 source.protection, pri_max, pri_dev, sec_max, sec_dev, load_kva,
                                 load_amps, util, drop, (), ()), notes, problems)


def _with(info: TransformerInfo, notes: list[str],
          problems: list[tuple[str, str]]) -> TransformerInfo:
    return info._replace(notes=tuple(notes), problems=tuple(problems))


def _primary_protects(source: Source) -> bool:
    """NEC 240.21(C)(1), 408.36(B) exception: a single-phase two-wire or a three-phase
    delta-delta three-wire secondary is protected by the primary device (the transformer's
    primary is taken as delta, as in ``gaugewalk.model.walk.feeder_loads``)."""
    system = SYSTEMS[source.system]
    return (system.phases == 1 and system.hots == 1) or (
        system.phases == 3 and not system.has_neutral)


class SecondaryRule(NamedTuple):
    """How the conductors of a run from a transformer's secondary are sized: the device they
    end in [A], the least ampacity [A] (no next size up), the basis, notes and problems."""

    ocpd_a: int | None
    min_ampacity_a: float | None
    basis: str
    notes: tuple[str, ...]
    problems: tuple[str, ...]
    bonding: bool = True
    """Ahead of their first device (no secondary device at the transformer): the wire run with
    them is the supply-side bonding jumper (NEC 250.30(A)(2), Table 250.102(C)(1))."""


def secondary_rule(run: Run, source: Source, info: TransformerInfo,
                   target: Source | None) -> SecondaryRule:
    """The 240.21(C) rule for ``run`` from transformer ``source`` (``target``: the source it
    feeds, None for a load)."""
    if source.secondary_ocpd_a is not None:
        dev = source.secondary_ocpd_a
        return SecondaryRule(dev, None, f"the transformer's {dev} A secondary device",
                             (f"NEC 240.21(C): protected by {source.id}'s {dev} A secondary "
                              "device, taken as at its terminals",), (), False)
    if target is None:
        return SecondaryRule(None, None, "its load", (), (
            f"NEC 240.21(C): conductors from {source.id}'s secondary must end in an overcurrent "
            "device; give the transformer's secondary_ocpd_a",))
    feet = run.length_ft
    device = target.main_a
    ratio = (info.primary_v or 0.0) / info.secondary_v
    pri = info.primary_ocpd_a
    notes: list[str] = []
    problems: list[str] = []
    if feet <= 10.0 + 1e-9:
        section = "240.21(C)(2)"
        if device is not None:
            need, ends = float(device), f"{target.id}'s {device} A main"
        elif target.rating_a is not None:
            need, ends = float(target.rating_a), f"{target.id}'s {target.rating_a} A rating"
            if not _primary_protects(source):
                problems.append(
                    f"NEC 408.36(B): {target.id} has main lugs only and {source.id} no "
                    "secondary device, but a panel supplied through a transformer is protected "
                    f"on its secondary side; give {target.id}'s main_a or {source.id}'s "
                    "secondary_ocpd_a")
        else:
            need, ends = 0.0, ""
            problems.append(f"NEC {section}: give {target.id}'s main_a or rating_a: the "
                            "secondary conductors' ampacity must be at least it")
        if pri is not None and ratio > 0:
            least = pri * ratio / 10.0
            notes.append(f"NEC {section}(1)(4): at least {pri} A x {ratio:.2f} / 10 = "
                         f"{_a(least)}")
            need = max(need, least)
    elif feet <= 25.0 + 1e-9:
        section = "240.21(C)(6)"
        if device is None:
            need, ends = 0.0, ""
            problems.append(f"NEC {section}: secondary conductors of {feet:.0f} ft must end in "
                            f"a single device, but {target.id} has no main (main lugs only); "
                            "give its main_a or the transformer's secondary_ocpd_a")
        else:
            need, ends = float(device), f"{target.id}'s {device} A main"
        if pri is not None and ratio > 0:
            least = pri * ratio / 3.0
            notes.append(f"NEC {section}(1): at least {pri} A x {ratio:.2f} / 3 = {_a(least)}")
            need = max(need, least)
    else:
        section = "240.21(C)"
        problems.append(f"NEC 240.21(C): secondary conductors of {feet:.0f} ft are past the 25 ft "
                        "of 240.21(C)(6); put a secondary device at the transformer "
                        "(secondary_ocpd_a) or check 240.21(C)(3)-(5)")
        need = float(device) if device is not None else 0.0
        ends = f"{target.id}'s {device} A main" if device is not None else ""
    if ends:
        notes.append(f"NEC {section}: secondary conductors ending in {ends}, ampacity at least "
                     f"{_a(need)}, no next size up (240.4(B) does not apply)")
    basis = f"secondary conductors, NEC {section}" + (f": {ends}" if ends else "")
    return SecondaryRule(device, need if need > 0 else None, basis, tuple(notes),
                         tuple(problems))
