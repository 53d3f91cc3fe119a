"""A run's load as its kind reads it: the walk's ``Load`` turned into the engine's ``Equipment``,
and what follows for the run and for the feeder above it. The rules themselves are
``gaugewalk.model.engine.sizing.kinds``; this module only reads a run.

Public API:

- ``equipment_of(run) -> Equipment | None``: None for a general load with nothing more to say
  (the engine's fast path); ``run_continuous(run)``: continuous by the run or its kind.
- ``LoadFacts``; ``load_facts(run, circuit, default_pf) -> LoadFacts``: the running current
  [A], the power factor, whether it is continuous, and the equipment, as the run's sizing uses
  them. Raises ``LoadError``.
- ``feeder_share(run, circuit, default_pf) -> FeederLoad``: what the run adds to the panel it
  is on, for its feeder (NEC 215.2(A)(1)).
- ``pf_assumed(load, default_pf)``: the sentence stating the power factor a load in W or kW
  was taken at where it gives none (its kind's, else the job's), or nothing.
- ``load_short(load)`` (``16 A``, ``25 hp``, ``MCA 28 A``) and ``load_words(load)`` (the kind and
  nameplate too: ``25 hp motor, dual-element fuse``): a load in words for every face.
- ``named_duty_motor(run) -> str | None``: the note of a motor named as an elevator, crane or
  hoist, sized as continuous duty (NEC 430.22(E), 610.14, 620.13); ``named_unit_load(run)``:
  that of track or show-window lighting, counted as given (NEC 220.43);
  ``named_refrigerant_motor(run)``: a motor in horsepower named as a refrigerant
  motor-compressor, sized by Article 430 where Article 440 takes its nameplate;
  ``named_roof_run(run, insulation)``: a run to equipment named as on a roof, not marked
  rooftop (NEC 310.15(B)(2) not taken).
- ``name_says(run)``: how each of those notes opens; ``from_name(run, notes)``: the notes a
  run's name made, for the report.
- Signs (``is_sign_outlet``: a general or lighting load named as a sign): taken as the outlet
  NEC 600.5(A) requires, at ``SIGN_CIRCUIT_A`` where the run gives no device
  (``sign_outlet_device``), counted in its panel at no less than ``SIGN_OUTLET_VA``
  (``sign_outlet_va``, 220.14(F)), the assumption said (``named_sign``).
- ``run_kind_load(run, circuit, default_pf) -> KindLoad | None``: for a feeder's rules (NEC
  430.24, 430.62, 440.33, 630.11(B)): the kind, whether it is a motor, its running current,
  the current its branch is sized from (motor FLC, HVAC MCA, welder 630.11(A) current), and its
  branch device. None for a run without a load of its own.

Feeders: a motor (a fire pump too) adds its full-load current (noncontinuous: NEC 430.24 takes the motors at
100 % and the largest once more at 25 %, which ``gaugewalk.model.walk.motor_feeders`` adds);
HVAC equipment known by its MCA adds MCA / 1.25 as its rated-load current (440.33, the 25 % of
the largest unit added once the same way; assumed, and said), or its running current where a
load is given; a welder its 630.11(A) current; every other kind its running current,
continuous as its kind and the run say.
"""

from typing import NamedTuple

from gaugewalk.model.engine.contract import Circuit, Equipment
from gaugewalk.model.engine.loads import load_amps, pf_taken
from gaugewalk.model.engine.sizing.kinds import (
    KindLoad,
    continuous_of,
    evse_feeder_va,
    kind_load,
    load_pf,
    running_amps,
    welder_current,
)
from gaugewalk.model.engine.vocabulary import MOTOR_DEVICES, MOTOR_KINDS
from gaugewalk.model.walk.job import Load, Run
from gaugewalk.model.walk.vocabulary import (
    duty_in_name,
    refrigerant_in_name,
    roof_in_name,
    sign_in_name,
    unit_load_in_name,
)
from gaugewalk.tables.conductor.ampacity import ROOFTOP_ADDER_C, rooftop_excepted
from gaugewalk.tables.equipment.horsepower import hp_text

HVAC_RLA_FACTOR = 1.25
"""MCA / 1.25 taken as an HVAC unit's rated-load current when only its MCA is known (the MCA
is 125 % of its largest motor plus the rest, NEC 440.33; an assumption, stated)."""

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
        continuous=continuous, lra_a=load.lra,
    )


def equipment_of(run: Run) -> Equipment | None:
    """The engine's ``Equipment`` for the run's load; None for a general load (the general rule,
    without a kind to read)."""
    load = run.load
    if load is None or load.kind == "general":
        return None
    return _equipment(load, run.continuous)


def run_continuous(run: Run) -> bool:
    """Whether the run's load is sized as continuous: the run's own say, else its kind's."""
    eq = equipment_of(run)
    return bool(run.continuous) if eq is None else continuous_of(eq)


def pf_assumed(load: Load, default_pf: float) -> tuple[str, ...]:
    """What a load in W or kW without its own power factor was taken at (S = P / pf): the
    factor its kind gives (1 for resistance heating, which assumes nothing) else the job's
    (``loads.pf_taken``); nothing for a load that gives one or is in A, VA, kVA or hp. The
    run's notes and the run card both say it from here."""
    if load.pf is not None or load.value is None:
        return ()   # (``pf_taken`` says nothing of a load in A, VA, kVA or hp)
    return pf_taken(load.value, load.unit, load_pf(load.kind, None, default_pf), "the job's")


class LoadFacts(NamedTuple):
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


def _feeder_amps(facts: LoadFacts, given: bool) -> tuple[float, bool]:
    """The current a run adds to its panel for the feeder [A], and whether continuously;
    ``given``: the run gives a load value (not the nameplate alone)."""
    eq = facts.equipment
    if eq is None:
        return facts.amps, facts.continuous
    if eq.kind in MOTOR_KINDS:
        return facts.amps, False
    if eq.kind == "hvac" and eq.mca_a is not None:
        return (facts.amps if given else eq.mca_a / HVAC_RLA_FACTOR), False
    if eq.kind == "welder":
        current, _notes = welder_current(eq)
        return (current if current is not None else facts.amps), False
    return facts.amps, facts.continuous


def feeder_share(run: Run, circuit: Circuit, default_pf: float) -> tuple[float, float, float]:
    """What the run adds to the panel it is on: (VA, continuous VA, W) on its circuit (S = V I,
    sqrt(3) V I three-phase; W = S pf); see the module docstring for each kind."""
    facts = load_facts(run, circuit, default_pf)
    amps, continuous = _feeder_amps(facts, run.load is not None and run.load.value is not None)
    va = amps * circuit.line_volts * (1.7320508075688772 if circuit.phases == 3 else 1.0)
    if facts.equipment is not None and facts.equipment.kind == "ev-charger":
        va = evse_feeder_va(va)   # NEC 220.57: 7,200 VA or its nameplate, the larger
    return va, va if continuous else 0.0, va * facts.pf


def run_kind_load(run: Run, circuit: Circuit, default_pf: float) -> KindLoad | None:
    """``KindLoad`` of the run's own load (None without one). Raises ``LoadError`` for a motor
    the tables do not list at the circuit's voltage."""
    if run.load is None:
        return None
    facts = load_facts(run, circuit, default_pf)
    eq = facts.equipment or _equipment(run.load, run.continuous)
    return kind_load(eq, facts.amps, run.ocpd_a, circuit.volts, circuit.phases)


_KIND_WORDS = {"general": "", "motor": "motor", "fire-pump": "fire pump", "hvac": "HVAC", "ev-charger": "EV charger",
               "water-heater": "water heater", "heater": "heater", "welder": "welder",
               "lighting": "lighting", "receptacle": "receptacles"}


def _n(x: float) -> str:
    return f"{x:g}"


def load_short(load: Load) -> str:
    """The load as given, in a few characters: ``16 A``, ``4.5 kW pf 0.9``, ``25 hp``, ``1-1/2
    hp``; a load given by its nameplate alone: ``MCA 28 A``, ``I1eff 25 A``, ``rated 40 A``,
    ``8 yokes``."""
    if load.value is not None and load.unit is not None:
        text = (f"{hp_text(load.value)} hp" if load.unit == "hp"
                else f"{_n(load.value)} {load.unit}")
    elif load.mca is not None:
        text = f"MCA {_n(load.mca)} A"
    elif load.i1eff is not None:
        text = f"I1eff {_n(load.i1eff)} A"
    elif load.rated_a is not None:
        text = f"rated {_n(load.rated_a)} A"
    elif load.yokes is not None:
        text = f"{load.yokes} yokes"
    else:
        text = ""
    if load.pf is not None:
        text += f" pf {load.pf:g}"
    return text


def load_words(load: Load) -> str:
    """The load with its kind and nameplate in words: ``25 hp motor, dual-element fuse, code
    G``, ``HVAC, MCA 28 A, MOCP 45 A``, ``48 A EV charger``."""
    words = [load_short(load)]
    kind = _KIND_WORDS[load.kind]
    if kind:
        words = [f"{words[0]} {kind}".strip()]
    extra = []
    if load.kind in MOTOR_KINDS:
        if load.motor_device is not None and load.motor_device != "inverse-time":
            extra.append(MOTOR_DEVICES[load.motor_device].split(" (")[0])
        if load.code_letter is not None:
            extra.append(f"code {load.code_letter}")
        if load.design is not None and load.design != "B":
            extra.append(f"design {load.design}")
        if load.lra is not None:
            extra.append(f"LRA {_n(load.lra)} A")
    if load.mca is not None and load.value is not None:
        extra.append(f"MCA {_n(load.mca)} A")
    if load.mocp is not None:
        extra.append(f"MOCP {_n(load.mocp)} A")
    if load.i1max is not None:
        extra.append(f"I1max {_n(load.i1max)} A")
    if load.i1eff is not None and load.value is not None:
        extra.append(f"I1eff {_n(load.i1eff)} A")
    if load.rated_a is not None and (load.value is not None or load.i1eff is not None):
        extra.append(f"rated {_n(load.rated_a)} A")
    if load.duty_cycle_pct is not None:
        extra.append(f"{_n(load.duty_cycle_pct)}% duty")
    if load.welder_type == "motor-generator":
        extra.append("motor-generator")
    if load.tank_gal is not None:
        extra.append(f"{_n(load.tank_gal)} gal")
    if load.yokes is not None and load.value is not None:
        extra.append(f"{load.yokes} yokes")
    return ", ".join(words + extra)


def named_duty_motor(run: Run) -> str | None:
    """The stated assumption of a motor whose name reads as an elevator, crane or hoist
    (``vocabulary.duty_in_name``): it is sized as a continuous-duty motor, which its article and
    Table 430.22(E) may not allow; or None."""
    said = duty_in_name(run.to)
    if said is None:
        return None
    what, rule = said
    return (f"{name_says(run)} {what}: sized here as a continuous-duty motor (NEC 430.22, "
            f"125 % of the table current); {rule} (430.22(E), Table 430.22(E): up to 140 % of "
            "the nameplate current for intermittent duty, 200 % for varying duty; from memory): "
            "confirm the conductors with its duty rating and nameplate")


def name_says(run: Run) -> str:
    """How every note taken from a run's name opens (``'Blade sign' reads as``), so the report
    can list them together (``from_name``)."""
    return f"'{run.to}' reads as"


def from_name(run: Run, notes: tuple[str, ...]) -> tuple[str, ...]:
    """The notes among ``notes`` (a run's) that its name made: assumptions stated because of
    what the name says (a sign, a duty motor, equipment on a roof...)."""
    opening = name_says(run)
    return tuple(n for n in notes if n.startswith(opening))


def named_refrigerant_motor(run: Run) -> str | None:
    """The stated assumption of a motor given by its horsepower whose name reads as a
    refrigerant motor-compressor (``vocabulary.refrigerant_in_name``): sized by the Article 430
    tables, where Article 440 takes its nameplate; or None."""
    load = run.load
    if load is None or load.kind != "motor" or not refrigerant_in_name(run.to):
        return None
    return (f"{name_says(run)} a refrigerant motor-compressor: sized here as a motor of its "
            "horsepower (the Article 430 tables); NEC Article 440 sizes a hermetic "
            "motor-compressor from its nameplate's rated-load or branch-circuit selection "
            "current (440.6(A)) and the equipment's minimum circuit ampacity and maximum "
            "overcurrent device (440.4(B), 440.22): give those as an HVAC load where it is one, "
            "so its device stays within the nameplate maximum (from memory)")


def named_roof_run(run: Run, insulation: str) -> str | None:
    """The stated assumption of a run to equipment whose name reads as on a roof
    (``vocabulary.roof_in_name``) that the walk does not mark ``rooftop``: its raceway was taken
    off the roof's sunlit surface, without NEC 310.15(B)(2)'s adder; or None (marked, or its
    ``insulation``, the run's own or the job's, is excepted from the adder)."""
    if run.rooftop or rooftop_excepted(insulation) or not roof_in_name(run.to):
        return None
    return (f"{name_says(run)} equipment on a roof: its raceway is taken as not run in "
            f"sunlight less than 7/8 in above the roof; where it is, NEC 310.15(B)(2) adds "
            f"{ROOFTOP_ADDER_C} C to the ambient, which can take a larger size: mark the run "
            "rooftop")


SIGN_CIRCUIT_A = 20
"""[A] NEC 600.5(A): each commercial building and occupancy open to pedestrians has an outlet
for a sign or outline lighting at the entrance of each tenant space, on a branch circuit rated
at least 20 A that supplies no other load; 600.5(B)(1): a branch circuit supplying signs of
incandescent, fluorescent or LED lamps is rated at most 20 A (600.5(B)(2): 30 A for neon tubing
alone). Section numbers and figures from memory."""
SIGN_OUTLET_VA = 1200.0
"""[VA] NEC 220.14(F): a sign or outline lighting outlet counts at no less than 1,200 VA for each
branch circuit 600.5(A) requires (from memory)."""
_SIGN_KINDS = ("general", "lighting")
"""The load kinds a sign is given as; a run of another kind named as a sign keeps its kind's
rules."""


def is_sign_outlet(run: Run) -> bool:
    """Whether the run's load is a sign or outline lighting by its name
    (``vocabulary.sign_in_name``), taken as the outlet NEC 600.5(A) requires: an assumption its
    note states (``named_sign``)."""
    load = run.load
    return load is not None and load.kind in _SIGN_KINDS and sign_in_name(run.to)


def sign_outlet_device(run: Run, design_a: float) -> int | None:
    """The device a sign's branch circuit is taken at, ``SIGN_CIRCUIT_A`` (NEC 600.5(A)), where
    the run gives none of its own and its design current [A] fits a circuit of that rating; else
    None (the device is picked as for any load, and ``named_sign`` says what 600.5(B) allows)."""
    if run.ocpd_a is not None or design_a > SIGN_CIRCUIT_A or not is_sign_outlet(run):
        return None
    return SIGN_CIRCUIT_A


def sign_outlet_va(run: Run, va: float) -> float:
    """What a sign's run adds to its panel's load [VA]: its own, and no less than
    ``SIGN_OUTLET_VA`` (NEC 220.14(F))."""
    return max(va, SIGN_OUTLET_VA) if is_sign_outlet(run) else va


def named_sign(run: Run, ocpd_a: int, va: float) -> str | None:
    """The stated assumption of a run named as a sign (``is_sign_outlet``), given the device
    [A] it was sized with and its own load [VA]; or None."""
    if not is_sign_outlet(run):
        return None
    counted = (f"; its panel counts it at {SIGN_OUTLET_VA:,.0f} VA, not its {va:,.0f} VA "
               "(NEC 220.14(F))" if va < SIGN_OUTLET_VA else "")
    if ocpd_a > SIGN_CIRCUIT_A:
        return (f"{name_says(run)} a sign: NEC 600.5(B) rates a branch circuit supplying "
                f"signs at no more than {SIGN_CIRCUIT_A} A (30 A for neon tubing alone), and "
                f"this load takes a {ocpd_a} A device: split it, or confirm it is neon "
                f"(from memory){counted}")
    if ocpd_a < SIGN_CIRCUIT_A:
        return (f"{name_says(run)} a sign: if it is the outlet NEC 600.5(A) requires at a "
                f"tenant entrance, its branch circuit is rated at least {SIGN_CIRCUIT_A} A, not "
                f"the {ocpd_a} A given, and supplies no other load (from memory){counted}")
    other = ("" if run.ocpd_a is not None
             else "; give the run its own device where it is another sign")
    return (f"{name_says(run)} a sign: taken as the outlet NEC 600.5(A) requires at a tenant "
            f"entrance, on a branch circuit of at least {SIGN_CIRCUIT_A} A that supplies no "
            f"other load (from memory){counted}{other}")


def named_unit_load(run: Run) -> str | None:
    """The stated assumption of a load whose name reads as track or show-window lighting
    (``vocabulary.unit_load_in_name``): its feeder counts the load the run gives, where NEC
    220.43 counts it by length, which the walk does not give; or None."""
    said = unit_load_in_name(run.to)
    if said is None or run.load is None:
        return None
    what, rule = said
    return (f"{name_says(run)} {what}: {rule} (from memory); the walk gives its load "
            f"({load_short(run.load)}), not that length, so its feeder counts the load given: "
            "confirm it is not less")
