"""Loads of a kind, in one place: each kind's defaults (continuous or not, power factor), the
current it draws running, and its article's rules for the conductors and the device (a
``currents.LoadRule`` per kind). NEC 2023 sections; the tables are ``gaugewalk.tables.equipment``.

- ``general``, ``lighting``, ``receptacle``: the general rule (``currents.GENERAL``): conductors
  at the noncontinuous load plus 125 % of the continuous (210.19(A)(1), 215.2(A)(1)), a device
  not below that (210.20(A), 215.3) that protects them (240.4). Lighting is continuous unless the
  run says not (common practice: lighting of a business burns 3 h and more). Receptacles
  counted by yokes are 180 VA each (220.14(I)); otherwise the load given.
- ``motor`` (Art. 430): the full-load current of Table 430.248 (single-phase) or 430.250
  (three-phase) by horsepower and the column of the circuit's voltage, not the nameplate
  (430.6(A)(1)); conductors at 125 % of it (430.22), on the 75 C column for a polyphase motor of
  design B, C or D (110.14(C)(1)(a)(4)); the branch short-circuit and ground-fault device at the
  Table 430.52(C)(1) percentage of its type, the next standard rating up where that is none
  (430.52(C)(1)(a)); a device fixed above that is a problem beyond the limits of
  430.52(C)(1)(b) and (C)(3). 240.4(G) sends the conductors' overload protection to Art. 430:
  240.4(B)-(D) do not apply. EGC by the device rating (250.122(D)(1); for an instantaneous-trip
  breaker, by the largest dual-element fuse 430.52(C)(1)(a) permits), never larger than the
  circuit conductors (250.122(A)). Starting: locked-rotor current from the nameplate code letter
  (Table 430.7(B), the top of its range) or Table 430.251(A)/(B), at ``STARTING_PF``.
  A motor given in amperes: that current is taken as its full-load current, and a note says
  430.6(A)(1) wants the horsepower.
- ``fire-pump`` (Art. 695; section numbers from memory): the motor's full-load current as for a
  motor (Tables 430.248/430.250 by horsepower); conductors not less than 125 % of it
  (695.6(C)), a pressure maintenance pump or accessory load on the same conductors not
  modelled (said); the device rated to carry the locked-rotor current indefinitely, the next
  standard rating up where that is none (695.4(B)(2)(a)(1), 240.6(A)): the current the
  nameplate states (``lra``), else its code letter, else Table 430.251(B) by horsepower, as a
  motor's starting drop reads it; none of them known, a problem. The conductors are protected
  against short circuit only (695.6(D), 240.4(A)), so 240.4 does not hold them to the device.
  Drop (``drop_targets``): running at 115 % of the full-load current within 5 % from the source
  (695.7(B)), starting within 15 % (695.7(A)), whatever the job's targets.
- ``hvac`` (Art. 440): conductors at the nameplate minimum circuit ampacity, which already holds
  125 % of the largest motor (440.4(B), 440.32): no further 125 %; the device the largest
  standard rating not above the nameplate maximum overcurrent protection (440.22(A), (C)); a
  device fixed above it is a problem. 240.4(G): no 240.4 limit. Without MCA and MOCP the run is
  sized as a general load and has a problem asking for them (never a guess).
- ``ev-charger`` (Art. 625): continuous (625.42); conductors and device at 125 % (210.19(A)(1),
  625.41).
- ``water-heater``: a storage heater of 120 gal or less is continuous, conductors and device at
  125 % (422.13; tank size not given: taken as 120 gal or less, and said so); a device fixed
  above 150 % of its rated current (the next standard rating up permitted), or above 20 A for
  13.3 A or less, is a problem (422.11(E)(2), (3)).
- ``heater``: fixed electric space heating, continuous: conductors and device at 125 %
  (424.4(B)).
- ``welder`` (Art. 630): conductors at the rating plate's I1eff, or the rated primary current
  times the Table 630.11(A) multiplier of its duty cycle (630.11(A)); the device not above
  200 % of I1max, or of the rated primary current (630.12(A), the next standard rating up
  permitted), picked at the next standard rating at or above that current (so it carries the
  welder at full output; common practice); the conductors protected at not more than 200 % of
  their ampacity (630.12(B)) instead of 240.4.

Water heaters and space heaters are resistance loads: power factor 1 unless the run gives one
(``RESISTIVE_KINDS``). Motors, HVAC equipment and welders follow their article, not the 125 %
continuous rule: a run may not call them continuous (``continuous_refusal``), nor an EV charger,
a water heater of 120 gal or less or a space heater noncontinuous.

Public API: ``STARTING_PF``; ``continuous_default(eq)``, ``kind_continuous(kind, tank_gal)``,
``continuous_refusal(kind, tank_gal, given)``, ``continuous_of(eq)``, ``load_pf(kind, given, default)``; ``running_amps(eq, value,
unit, circuit, pf)``; ``welder_current(eq)``; ``drop_targets(eq, own_given, own, total, starting)``; ``locked_rotor(eq, volts, phases)``;
``rule_for(eq, volts, phases)``; ``forget_loads()``; ``KindLoad`` and ``kind_load(eq, amps, ocpd_a, volts,
phases)``, what a feeder's rules need of a branch run (``gaugewalk.model.walk.equipment``);
``evse_feeder_va(va)`` (NEC 220.57).
"""

import math
from functools import lru_cache
from typing import NamedTuple

from gaugewalk.model.engine.contract import Circuit, Equipment
from gaugewalk.model.engine.loads import LoadError, load_amps
from gaugewalk.model.engine.sizing.currents import (
    BY_ARTICLE,
    GENERAL,
    WELDER_CONDUCTORS,
    Currents,
    LoadRule,
    forget_general_loads,
    next_rating,
)
from gaugewalk.model.engine.sizing.text import amps_text
from gaugewalk.model.engine.vocabulary import (
    CONTINUOUS_KINDS,
    MOTOR_DEVICES,
    MOTOR_KINDS,
    RESISTIVE_KINDS,
    LoadKind,
)
from gaugewalk.tables.equipment import locked_rotor as t_lra
from gaugewalk.tables.equipment import motor_protection as t_mp
from gaugewalk.tables.equipment import motors as t_motors
from gaugewalk.tables.equipment import welders as t_weld
from gaugewalk.tables.equipment.horsepower import hp_text
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.protection import ocpd as t_ocpd

_EPS = 1e-9

STARTING_PF = 0.4
"""Power factor of a motor's locked-rotor current, for the starting drop (common practice:
about 0.2 to 0.5 across the line, lower for larger motors; 0.4 is taken, which for the small
conductors where resistance dominates gives the larger drop of the usual range)."""

WATER_HEATER_MAX_GAL = 120.0
"""[gal] 422.13: storage water heaters of this capacity or less are continuous loads."""

SMALL_APPLIANCE_A = 13.3
"""[A] 422.11(E)(2), (3): an appliance rated at this or less on a device of at most 20 A; above
it, at most 150 % of its rated current."""

YOKE_VA = 180.0
"""[VA] 220.14(I): each single or multiple receptacle on one yoke."""

EVSE_MIN_VA = 7200.0
"""[VA] 220.57: an EV charger's load in a feeder or service calculation is 7,200 W (VA) or its
nameplate rating, the larger (from memory)."""


def evse_feeder_va(nameplate_va: float) -> float:
    """What a feeder counts of an EV charger of ``nameplate_va`` [VA] (NEC 220.57)."""
    return max(EVSE_MIN_VA, nameplate_va)

_DEVICE_KEYS = {"inverse-time": "inverse-time", "dual-element": "dual-element-fuse",
                "nontime-delay": "nontime-delay-fuse", "instantaneous": "instantaneous-trip"}
"""Run words for the motor branch device -> the columns of ``tables.equipment.motor_protection``."""
_WELDER_KEYS = {"nonmotor": "nonmotor-generator", "motor-generator": "motor-generator"}
"""Run words for the welder type -> the columns of ``tables.equipment.welders``."""

FIRE_PUMP_DROP_FLC = 1.15
"""NEC 695.7(B): the running drop of a fire pump is taken with the motor at 115 % of its
full-load current."""
FIRE_PUMP_RUNNING_DROP_PCT = 5.0
"""[%] NEC 695.7(B): at the motor terminals, not more than 5 % below the motor's rated voltage
(at ``FIRE_PUMP_DROP_FLC``): the run's own and its total drop target."""
FIRE_PUMP_STARTING_DROP_PCT = 15.0
"""[%] NEC 695.7(A): at the controller's line terminals, not more than 15 % below normal while
the motor starts: the starting target of a fire pump, whatever the job's."""
FIRE_PUMP_PROTECTION_NOTE = (
    "NEC 240.4(A), 695.6(D): a fire pump's conductors are protected against short circuit "
    "only, never overload (opening the circuit is the greater hazard), so 240.4 does not "
    "hold them to a device at their ampacity; the device above it is as 695.4(B)(2) asks")

_BY_ARTICLE_NOTE = ("NEC 240.4(G): the conductors of {what} are protected from overload as "
                    "Article {art} says, so 240.4(B)-(D) do not limit them by the device")


# -- defaults -------------------------------------------------------------------------------------

_CONTINUOUS_WHY = {"ev-charger": "NEC 625.42", "heater": "NEC 424.4(B)",
                   "water-heater": "NEC 422.13", "lighting": "common practice"}
_ARTICLE_OF = {"motor": "NEC 430.22 sizes a motor's conductors at 125% of its full-load current",
               "hvac": "NEC 440.4(B): the nameplate MCA already includes 125% of the largest "
                       "motor",
               "welder": "NEC 630.11 sizes a welder's conductors by its duty cycle",
               "fire-pump": "NEC 695.6(C) sizes a fire pump's conductors at 125% of its "
                            "full-load current"}


def _large_tank(kind: str, tank_gal: float | None) -> bool:
    return kind == "water-heater" and tank_gal is not None and tank_gal > WATER_HEATER_MAX_GAL


def continuous_default(eq: Equipment) -> tuple[bool, str]:
    """Whether a load of this kind is continuous when the run does not say, and why."""
    if kind_continuous(eq.kind, eq.tank_gal):
        return True, _CONTINUOUS_WHY[eq.kind]
    return False, ""


def kind_continuous(kind: str, tank_gal: float | None = None) -> bool:
    """Whether a load of ``kind`` (a water heater of ``tank_gal`` [gal]) is continuous when the
    run does not say."""
    return kind in _CONTINUOUS_WHY and not _large_tank(kind, tank_gal)


def continuous_by_kind(kind: str) -> bool | None:
    """What ``kind`` says of a run's ``continuous`` when the run does not: True where its
    article (or common practice, for lighting) makes it continuous (``kind_continuous``), False
    where the article sizes it by a rule of its own instead (motors, HVAC, welders), None where
    it is the person's to say."""
    if kind_continuous(kind):
        return True
    return False if kind in _ARTICLE_OF else None


def continuous_refusal(kind: LoadKind, tank_gal: float | None, given: bool | None) -> str | None:
    """Why a run's ``continuous`` cannot be ``given`` for a load of ``kind``, or None: the
    article makes EV chargers, storage water heaters of 120 gal or less and space heating
    continuous; motors, HVAC equipment and welders have their own rules instead."""
    if given is False and kind in CONTINUOUS_KINDS and not _large_tank(kind, tank_gal):
        what = {"ev-charger": "an EV charger's load", "heater": "fixed space heating",
                "water-heater": "a storage water heater of 120 gal or less"}[kind]
        return (f"{_CONTINUOUS_WHY[kind]} makes {what} continuous; leave continuous out or set "
                f"it true")
    if given is True and kind in _ARTICLE_OF:
        what = {"motor": "a motor", "hvac": "HVAC equipment", "welder": "a welder",
                "fire-pump": "a fire pump"}[kind]
        return f"continuous does not apply to {what}: {_ARTICLE_OF[kind]}; leave it out"
    return None


def continuous_of(eq: Equipment) -> bool:
    """The run's own say, else the kind's default (``continuous_default``)."""
    return eq.continuous if eq.continuous is not None else continuous_default(eq)[0]


def load_pf(kind: str, given: float | None, default: float) -> float:
    """The load's power factor: the run's, else 1 for a resistive kind (``RESISTIVE_KINDS``),
    else the job's."""
    if given is not None:
        return given
    return 1.0 if kind in RESISTIVE_KINDS else default


def drop_targets(eq: Equipment | None, own_given: float | None, own_pct: float,
                 total_pct: float, starting_pct: float) -> tuple[float, float, float]:
    """The run's drop targets [%] (its own, from the service, while a motor starts) as its kind
    holds them: ``own_given`` the run's own target where it gives one, else ``own_pct`` the
    job's; ``total_pct`` and ``starting_pct`` the job's. A fire pump: 5 % from the service
    (NEC 695.7(B); the job's total where that is lower) and its own target 5 % unless the run
    gives one (the 3 % of the informational note to 210.19 is a recommendation at the running
    load; 695.7(B) is the requirement, at 115 % of it), and 15 % while it starts whatever the
    job says (695.7(A)). Any other kind: the job's (the run's own where given)."""
    own = own_given if own_given is not None else own_pct
    if eq is None or eq.kind != "fire-pump":
        return own, total_pct, starting_pct
    return (own_given if own_given is not None else FIRE_PUMP_RUNNING_DROP_PCT,
            min(total_pct, FIRE_PUMP_RUNNING_DROP_PCT), FIRE_PUMP_STARTING_DROP_PCT)


# -- the current drawn ----------------------------------------------------------------------------

def welder_current(eq: Equipment) -> tuple[float | None, tuple[str, ...]]:
    """The current a welder's supply conductors carry by NEC 630.11(A) [A]: I1eff, or the rated
    primary current times the Table 630.11(A) multiplier (a duty cycle between rows read at the
    next row up, the larger multiplier; none given: 100 %, said so). None without either."""
    if eq.i1eff_a is not None:
        return eq.i1eff_a, (f"NEC 630.11(A): conductors at the rating plate's I1eff, "
                            f"{amps_text(eq.i1eff_a)}",)
    if eq.rated_a is None:
        return None, ()
    notes = []
    duty = eq.duty_cycle_pct
    if duty is None:
        row = 100
        notes.append("no duty cycle given: 100% taken (Table 630.11(A) multiplier 1.00, the "
                     "largest)")
    else:
        row = t_weld.next_higher_duty_cycle_row(duty)
    mult = t_weld.duty_cycle_multiplier(row, _WELDER_KEYS[eq.welder_type])
    amps = eq.rated_a * mult
    if duty is None:
        at = "100% duty cycle taken"
    elif row == duty or (duty <= 20 and row == 20):
        at = f"{duty:g}% duty cycle"
    else:
        at = f"{duty:g}% duty cycle, read at the {row}% row above it"
    notes.append(f"NEC 630.11(A), Table 630.11(A): {amps_text(eq.rated_a)} rated primary x "
                 f"{mult:.2f} ({at}, {eq.welder_type}) = {amps_text(amps)}")
    return amps, tuple(notes)


def _motor_flc(eq: Equipment, volts: float, phases: int) -> t_motors.MotorCurrent:
    try:
        return t_motors.motor_flc(eq.hp, volts, phases)
    except TableLookupError as exc:
        raise LoadError(f"motor: {exc}") from None


def running_amps(eq: Equipment, value: float | None, unit: str | None, circuit: Circuit,
                 pf: float) -> float:
    """The current the load draws running [A], which its drop is taken at and a feeder sums: a
    motor by horsepower, its Table 430.248 or 430.250 full-load current; HVAC equipment or a
    welder without a load given, the nameplate MCA or the 630.11(A) current; receptacles
    counted by yokes, 180 VA each (the larger, where a load is given too); else the load given
    (``gaugewalk.model.engine.loads.load_amps``). Raises ``LoadError`` naming what is missing."""
    if unit == "hp":
        if eq.hp is None:
            raise LoadError("motor: the horsepower is missing")
        return _motor_flc(eq, circuit.volts, circuit.phases).amps
    given = load_amps(value, unit, circuit, pf) if value is not None and unit is not None else None
    if eq.kind == "receptacle" and eq.yokes is not None:
        counted = load_amps(eq.yokes * YOKE_VA, "VA", circuit, pf)
        return counted if given is None else max(given, counted)
    if given is not None:
        return given
    if eq.kind == "hvac" and eq.mca_a is not None:
        return eq.mca_a
    if eq.kind == "welder":
        amps, _notes = welder_current(eq)
        if amps is not None:
            return amps
    raise LoadError(f"the {eq.kind} run has no load; give it in A, VA, kVA, W or kW"
                    + (" or its nameplate" if eq.kind in ("hvac", "welder") else ""))


@lru_cache(maxsize=1024)
def locked_rotor(eq: Equipment, volts: float, phases: int) -> tuple[float | None, str]:
    """A motor's locked-rotor current [A] for the starting drop (and a fire pump's device), and
    where it came from: the current the nameplate states (``lra_a``), else the
    nameplate code letter by Table 430.7(B) (the top of its range, the worst case), else Table
    430.251(A) (single-phase) or 430.251(B) (polyphase design B, C, D) by horsepower and voltage
    (a planning estimate: the code prints those tables for disconnect and controller ratings).
    The code letter's kVA/hp is read at the motor's rated voltage, the column of Table 430.248
    or 430.250 that the system voltage ``volts`` [V] reads (460 V on a 480 V system, by their
    headnotes). None, with the reason, when neither can be read."""
    if eq.lra_a is not None:
        return eq.lra_a, f"{amps_text(eq.lra_a)} locked-rotor, as the nameplate states it"
    if eq.hp is None:
        return None, "no horsepower given, so no locked-rotor current: starting drop not worked"
    try:
        if eq.code_letter is not None:
            rated = t_motors.flc_column(volts, phases)
            found = t_lra.locked_rotor_amps_from_code_letter(
                eq.code_letter, eq.hp, rated, phases, "upper" if eq.code_letter != "V" else
                "lower")
            return found.amps, (f"NEC Table 430.7(B): code letter {eq.code_letter}, "
                                f"{found.kva_per_hp:g} kVA/hp ({found.basis} end of its range) "
                                f"x {hp_text(eq.hp)} hp at its rated {rated} V = "
                                f"{amps_text(found.amps)} locked-rotor")
        lra = t_lra.locked_rotor_amps(eq.hp, volts, phases)
    except TableLookupError as exc:
        return None, f"no locked-rotor current ({exc}): starting drop not worked"
    which = "maximum" if phases == 1 else "maximum for design B, C and D"
    return lra.amps, (f"NEC {lra.table}: {hp_text(eq.hp)} hp, {lra.column} V column, "
                      f"{amps_text(lra.amps)} locked-rotor (no code letter given; the table's "
                      f"{which})")


# -- the rules ------------------------------------------------------------------------------------

def _continuous(amps: float, ocpd_a: int | None, cont_rule: str, device_rule: str,
                extra: tuple[str, ...] = ()) -> tuple[float, int, list[str], list[str]]:
    """A load its article makes continuous: conductors and device at 125 % of it."""
    design = 1.25 * amps
    notes = [f"{cont_rule}: continuous load; conductors at 125% of {amps_text(amps)} = "
             f"{amps_text(design)} (NEC 210.19(A)(1))", *extra]
    problems = []
    if ocpd_a is None:
        ocpd = next_rating(design)
        notes.append(f"{device_rule}: {ocpd} A device, not below 125% of the load (the next "
                     f"standard rating, 240.6(A))")
    else:
        ocpd = ocpd_a
        if ocpd + _EPS < design:
            problems.append(f"the {ocpd} A device is below the {amps_text(design)} ({device_rule}: "
                            f"125% of the load)")
    return design, ocpd, notes, problems


def _general_kind(eq: Equipment, volts: float, phases: int, amps: float, cont: float,
                  ocpd_a: int | None) -> Currents:
    """Lighting and receptacles: the general rule, with the kind's note."""
    base = GENERAL.currents(amps, cont, ocpd_a)
    notes: tuple[str, ...] = ()
    if eq.kind == "lighting" and eq.continuous is None:
        notes = ("lighting taken as continuous (common practice: it burns 3 h or more; the run "
                 "may say otherwise)",)
    if eq.kind == "receptacle" and eq.yokes is not None:
        notes = (f"NEC 220.14(I): {eq.yokes} yokes x 180 VA = {eq.yokes * YOKE_VA:g} VA",)
    return base._replace(notes=notes + base.notes)


def _ev(eq: Equipment, volts: float, phases: int, amps: float, cont: float,
        ocpd_a: int | None) -> Currents:
    va = amps * volts * (math.sqrt(3.0) if phases == 3 else 1.0)
    said = (f"its nameplate, {va:,.0f} VA, over the 7,200 VA least" if evse_feeder_va(va) == va
            else f"7,200 VA, the least it may count, over its {va:,.0f} VA nameplate")
    design, ocpd, notes, problems = _continuous(
        amps, ocpd_a, "NEC 625.42", "NEC 625.41", (f"NEC 220.57: its feeder counts {said}",))
    return Currents(design, ocpd, tuple(notes), tuple(problems),
                    rule="NEC 625.42, 625.41, 210.19(A)(1)")


def _heater(eq: Equipment, volts: float, phases: int, amps: float, cont: float,
            ocpd_a: int | None) -> Currents:
    design, ocpd, notes, problems = _continuous(amps, ocpd_a, "NEC 424.4(B)", "NEC 424.4(B)")
    return Currents(design, ocpd, tuple(notes), tuple(problems), rule="NEC 424.4(B)")


def _water_heater(eq: Equipment, volts: float, phases: int, amps: float, cont: float,
                  ocpd_a: int | None) -> Currents:
    if _large_tank(eq.kind, eq.tank_gal):
        base = GENERAL.currents(amps, cont, ocpd_a)
        return base._replace(notes=(f"NEC 422.13 covers storage heaters of 120 gal or less; "
                                    f"this {eq.tank_gal:g} gal one follows the general rule",)
                             + base.notes)
    extra = () if eq.tank_gal is not None else (
        "tank size not given: taken as 120 gal or less, so 422.13 applies (give tank_gal)",)
    design, ocpd, notes, problems = _continuous(amps, ocpd_a, "NEC 422.13", "NEC 422.13", extra)
    ceiling: float
    if amps <= SMALL_APPLIANCE_A:
        ceiling, why = 20.0, f"rated {amps_text(amps)}, 13.3 A or less: at most 20 A"
    else:
        most = 1.5 * amps
        ceiling = most if t_ocpd.is_standard_rating(most) else next_rating(most)
        why = (f"at most 150% of {amps_text(amps)} = {amps_text(most)}"
               + (f", the next standard rating up {ceiling:g} A" if ceiling != most else ""))
    if ocpd > ceiling + _EPS:
        problems.append(f"the {ocpd} A device is over the limit for the heater (NEC 422.11(E): "
                        f"{why})")
    return Currents(design, ocpd, tuple(notes), tuple(problems), device_max_a=ceiling,
                    rule="NEC 422.13, 422.11(E)")


def _hvac(eq: Equipment, volts: float, phases: int, amps: float, cont: float,
          ocpd_a: int | None) -> Currents:
    mca, mocp = eq.mca_a, eq.mocp_a
    notes: list[str] = []
    problems: list[str] = []
    missing = " and ".join(n for n, v in (("mca", mca), ("mocp", mocp)) if v is None)
    if missing:
        problems.append(f"air-conditioning and refrigerating equipment is sized from its "
                        f"nameplate: give its {missing} (minimum circuit ampacity, maximum "
                        f"overcurrent protection; NEC 440.4(B))")
    if mca is None:
        base = GENERAL.currents(amps, cont, ocpd_a)
        return base._replace(problems=tuple(problems) + base.problems,
                             notes=(f"sized meanwhile as a general load of {amps_text(amps)}",)
                             + base.notes)
    notes.append(f"NEC 440.4(B), 440.32: conductors at the nameplate minimum circuit ampacity, "
                 f"{amps_text(mca)} (it holds 125% of the largest motor already: no further "
                 f"125%)")
    if mocp is not None and mca > mocp + _EPS:
        problems.append(f"the nameplate MCA {amps_text(mca)} is above its MOCP "
                        f"{amps_text(mocp)}: check the nameplate")
    largest = t_ocpd.next_rating_down(mocp) if mocp is not None else None
    if ocpd_a is not None:
        ocpd = ocpd_a
        if mocp is not None and ocpd > mocp + _EPS:
            problems.append(f"the {ocpd} A device is above the nameplate maximum overcurrent "
                            f"protection, {amps_text(mocp)} (NEC 440.22(C), 440.4(B))")
    elif largest is not None:
        ocpd = largest
        notes.append(f"NEC 440.22(A), (C): {ocpd} A device, the largest standard rating (240.6(A)) "
                     f"not above the nameplate maximum, {amps_text(mocp)}")
    else:
        ocpd = next_rating(mca)
        if mocp is not None:
            problems.append(f"no standard rating of 15 A or more is at or below the nameplate "
                            f"MOCP {amps_text(mocp)}; choose the device the nameplate names")
    notes.append(_BY_ARTICLE_NOTE.format(what="air-conditioning equipment", art="440"))
    return Currents(mca, ocpd, tuple(notes), tuple(problems), corrected_a=mca,
                    protection=BY_ARTICLE, device_max_a=mocp, rule="NEC 440.4(B), 440.32, 440.22")


def _full_load(eq: Equipment, volts: float, phases: int, amps: float,
               whose: str) -> tuple[float, str]:
    """A motor's full-load current [A] and the note saying where it came from: Table 430.248
    or 430.250 by horsepower (430.6(A)(1)), else the ``amps`` given, taken as it."""
    if eq.hp is not None:
        found = _motor_flc(eq, volts, phases)
        return found.amps, (f"NEC {found.table}: {hp_text(eq.hp)} hp, {found.column} V column, "
                            f"{amps_text(found.amps)} full-load current (430.6(A)(1): the table, "
                            f"not the nameplate)")
    return amps, (f"the {amps_text(amps)} given is taken as the {whose} full-load current; NEC "
                  f"430.6(A)(1) reads it from Table 430.248 or 430.250 by horsepower (the "
                  f"nameplate only for low-speed, high-torque and multispeed motors): give "
                  f"the horsepower")


def _motor_terminals(eq: Equipment, phases: int) -> tuple[int | None, str | None]:
    """The 75 C terminal column a polyphase motor of design B, C or D may use (NEC
    110.14(C)(1)(a)(4)), with the reason; (None, None) for a single-phase motor."""
    if phases != 3:
        return None, None
    return 75, f"design {eq.design} motor, NEC 110.14(C)(1)(a)(4)"


def _motor(eq: Equipment, volts: float, phases: int, amps: float, cont: float,
           ocpd_a: int | None) -> Currents:
    flc, said = _full_load(eq, volts, phases, amps, "motor's")
    notes: list[str] = [said]
    problems: list[str] = []
    design = 1.25 * flc
    notes.append(f"NEC 430.22: conductors at 125% of {amps_text(flc)} = {amps_text(design)}")
    motor_type = "single-phase" if phases == 1 else "squirrel-cage"
    key = _DEVICE_KEYS[eq.motor_device]
    word = MOTOR_DEVICES[eq.motor_device].split(" (")[0]
    pct = t_mp.branch_device_percent(motor_type, key)
    table_a = flc * pct / 100.0
    if eq.motor_device == "instantaneous":
        allowed = float(math.floor(table_a + _EPS))
        allowed_text = (f"NEC Table 430.52(C)(1): {word} set at not more than {pct}% of "
                        f"{amps_text(flc)} = {amps_text(table_a)} (430.52(C)(3): only as part "
                        f"of a listed combination motor controller)")
    else:
        allowed = table_a if t_ocpd.is_standard_rating(round(table_a, 6)) else next_rating(table_a)
        allowed_text = (f"NEC Table 430.52(C)(1): {word} at {pct}% of {amps_text(flc)} = "
                        f"{amps_text(table_a)}"
                        + (f"; 430.52(C)(1)(a): the next standard rating up, {allowed:g} A"
                           if abs(allowed - table_a) > _EPS else ""))
    device_max = allowed
    if ocpd_a is None:
        ocpd = int(allowed)
        notes.append(allowed_text)
    else:
        ocpd = ocpd_a
        if ocpd > allowed + _EPS:
            limit = t_mp.starting_limit(key, flc, motor_type)
            ceiling = flc * limit.percent / 100.0
            device_max = ceiling
            if ocpd > ceiling + _EPS:
                problems.append(f"the {ocpd} A device is above the {limit.percent}% of "
                                f"{amps_text(flc)} = {amps_text(ceiling)} that NEC {limit.section} "
                                f"allows a {word} even where the motor will not start on the "
                                f"{allowed:g} A of Table 430.52(C)(1)")
            else:
                notes.append(f"the {ocpd} A device is above the {allowed:g} A of Table "
                             f"430.52(C)(1): NEC {limit.section} permits it, up to "
                             f"{amps_text(ceiling)}, only where that rating will not carry the "
                             f"starting current")
        elif ocpd + _EPS < flc:
            problems.append(f"the {ocpd} A device is below the motor's {amps_text(flc)} "
                            f"full-load current: it would open in normal running")
    egc_basis = None
    if eq.motor_device == "instantaneous":
        fuse_a = flc * t_mp.branch_device_percent(motor_type, "dual-element-fuse") / 100.0
        egc_basis = next_rating(fuse_a)
        notes.append(f"NEC 250.122(D)(1): for an instantaneous-trip breaker the EGC is read at "
                     f"the largest dual-element fuse 430.52(C)(1)(a) permits, {egc_basis} A")
    else:
        notes.append(f"NEC 250.122(D)(1): EGC by the motor branch device rating, {ocpd} A")
    notes.append(_BY_ARTICLE_NOTE.format(what="a motor branch circuit", art="430 (Part III "
                                         "overload protection)"))
    term, why = _motor_terminals(eq, phases)
    return Currents(design, ocpd, tuple(notes), tuple(problems), corrected_a=design,
                    protection=BY_ARTICLE, terminal_col=term, terminal_why=why,
                    egc_basis_a=egc_basis, device_max_a=device_max, flc_a=flc,
                    rule="NEC 430.6(A)(1), 430.22, Table 430.52(C)(1), 250.122(D)(1)")


def _fire_pump(eq: Equipment, volts: float, phases: int, amps: float, cont: float,
               ocpd_a: int | None) -> Currents:
    """NEC 2023 Article 695 for the run to a fire pump motor (section numbers as the module
    docstring gives them, from memory)."""
    flc, said = _full_load(eq, volts, phases, amps, "fire pump motor's")
    notes: list[str] = [said]
    problems: list[str] = []
    design = 1.25 * flc
    notes.append(f"NEC 695.6(C): conductors not less than 125% of {amps_text(flc)} = "
                 f"{amps_text(design)}; the run is taken to supply the fire pump motor alone "
                 f"(a pressure maintenance pump or accessory equipment on the same conductors "
                 f"adds to it, 695.6(C)(1): not modelled, give them as runs of their own)")
    lra, why = locked_rotor(eq, volts, phases)
    need: int | None = None
    if lra is None:
        problems.append("the fire pump's device cannot be sized: NEC 695.4(B)(2)(a)(1) rates it "
                        "to carry the motor's locked-rotor current indefinitely; give the "
                        "horsepower, the nameplate code letter or its locked-rotor current (lra)")
    else:
        notes.append(why)   # (the starting drop's notes leave it out for a fire pump)
        need = (int(round(lra)) if t_ocpd.is_standard_rating(round(lra, 6))
                else next_rating(lra))
    if ocpd_a is not None:
        ocpd = ocpd_a
        if lra is not None and ocpd + _EPS < lra:
            problems.append(f"the {ocpd} A device is below the fire pump's {amps_text(lra)} "
                            f"locked-rotor current: NEC 695.4(B)(2)(a)(1) asks it to carry that "
                            f"indefinitely ({need} A, the next standard rating up, 240.6(A))")
        elif need is not None and ocpd > need:
            notes.append(f"the {ocpd} A device is above the {need} A that NEC 695.4(B)(2)(a)(1) "
                         f"names (the locked-rotor current, or the next standard rating up)")
    elif need is not None:
        ocpd = need
        notes.append(f"NEC 695.4(B)(2)(a)(1): {ocpd} A device, rated to carry the "
                     f"{amps_text(lra or 0.0)} locked-rotor current indefinitely"
                     + ("" if ocpd == lra else " (the next standard rating up, 240.6(A))")
                     + "; a pressure maintenance pump or accessory load on it adds to that "
                       "(not modelled); the source taken as the utility's (an on-site standby "
                       "generator's device is sized otherwise, 695.4(B)(2))")
    else:
        ocpd = next_rating(design)
        notes.append(f"meanwhile the {ocpd} A of the conductors' 125% only, so the run can be "
                     f"sized: not a fire pump device")
    notes.append(FIRE_PUMP_PROTECTION_NOTE)
    drop_a = FIRE_PUMP_DROP_FLC * flc
    notes.append(f"NEC 695.7(B): running drop taken at 115% of {amps_text(flc)} = "
                 f"{amps_text(drop_a)}, against {FIRE_PUMP_RUNNING_DROP_PCT:g}% below the "
                 f"motor's rated voltage at its terminals: this run's drop plus the drop up to "
                 f"its source (worked at the feeders' own loads) within "
                 f"{FIRE_PUMP_RUNNING_DROP_PCT:g}% of the system voltage (on the safe side "
                 f"where the motor is rated below it, 460 V on 480 V), the run taken to end at "
                 f"the motor (common practice: the controller beside it)")
    term, twhy = _motor_terminals(eq, phases)
    return Currents(design, ocpd, tuple(notes), tuple(problems), corrected_a=design,
                    protection=BY_ARTICLE, terminal_col=term, terminal_why=twhy,
                    device_max_a=float(ocpd), flc_a=flc, drop_amps_a=drop_a, lra_a=lra,
                    rule="NEC 695.6(C), 695.4(B)(2)(a)(1), 695.7, 240.4(A)")


def _welder(eq: Equipment, volts: float, phases: int, amps: float, cont: float,
            ocpd_a: int | None) -> Currents:
    current, wnotes = welder_current(eq)
    if current is None:
        base = GENERAL.currents(amps, cont, ocpd_a)
        return base._replace(problems=("an arc welder is sized from its rating plate: give its "
                                       "i1eff (and i1max), or rated_a and duty_cycle_pct (NEC "
                                       "630.11(A))",) + base.problems)
    notes = list(wnotes)
    problems: list[str] = []
    basis = eq.i1max_a if eq.i1max_a is not None else eq.rated_a
    word = "I1max" if eq.i1max_a is not None else "the rated primary current"
    device_max: float | None = None
    if basis is None:
        problems.append("give the welder's i1max (or rated_a): NEC 630.12(A) limits its device "
                        "to 200% of it")
        ocpd = ocpd_a if ocpd_a is not None else next_rating(current)
    else:
        most = 2.0 * basis
        device_max = most if t_ocpd.is_standard_rating(round(most, 6)) else next_rating(most)
        if ocpd_a is None:
            ocpd = next_rating(basis)
            notes.append(f"NEC 630.12(A): {ocpd} A device, at or above {word} "
                         f"({amps_text(basis)}, so it carries the welder at full output; common "
                         f"practice) and not above 200% of it, {amps_text(most)}")
        else:
            ocpd = ocpd_a
            if ocpd > device_max + _EPS:
                problems.append(f"the {ocpd} A device is above 200% of {word}, {amps_text(most)} "
                                f"(NEC 630.12(A); the next standard rating up, "
                                f"{device_max:g} A, permitted)")
    notes.append("NEC 630.12(B), 240.4(G): the device protects the conductors at not more than "
                 "200% of their ampacity")
    return Currents(current, ocpd, tuple(notes), tuple(problems), corrected_a=current,
                    protection=WELDER_CONDUCTORS, device_max_a=device_max,
                    rule="NEC 630.11(A), 630.12")


_RULES = {"motor": _motor, "fire-pump": _fire_pump, "hvac": _hvac, "ev-charger": _ev, "water-heater": _water_heater,
          "heater": _heater, "welder": _welder, "lighting": _general_kind,
          "receptacle": _general_kind, "general": _general_kind}


class _KindRule:
    """A ``LoadRule`` bound to one load's equipment and circuit."""

    __slots__ = ("eq", "volts", "phases", "_rule")

    def __init__(self, eq: Equipment, volts: float, phases: int) -> None:
        self.eq, self.volts, self.phases = eq, volts, phases
        self._rule = _RULES[eq.kind]

    def currents(self, amps: float, continuous_a: float, ocpd_a: int | None) -> Currents:
        return _cached_currents(self._rule, self.eq, self.volts, self.phases, amps,
                                continuous_a, ocpd_a)


@lru_cache(maxsize=4096)
def _cached_currents(rule, eq: Equipment, volts: float, phases: int, amps: float, cont: float,
                     ocpd_a: int | None) -> Currents:
    try:
        return rule(eq, volts, phases, amps, cont, ocpd_a)
    except TableLookupError as exc:
        raise LoadError(f"{eq.kind}: {exc}") from None


def forget_loads() -> None:
    """Empty the caches keyed by a run's own load (each load's design current and device, by
    its kind's rule and by the general rule; a motor's locked-rotor current), so that the next
    computation is a cold one; the caches keyed by the tables stay."""
    _cached_currents.cache_clear()
    locked_rotor.cache_clear()
    forget_general_loads()


@lru_cache(maxsize=1024)
def rule_for(eq: Equipment, volts: float, phases: int) -> LoadRule:
    """The ``LoadRule`` of a load of this kind on a circuit of ``volts`` [V] and ``phases``
    (the voltage picks a motor table's column)."""
    return _KindRule(eq, volts, phases)


# -- for a feeder's rules -------------------------------------------------------------------------

class KindLoad(NamedTuple):
    """What a feeder's rules need to know of a branch run's load (NEC 430.24, 430.62, 440.33,
    630.11(B), 215.2(A)(1)): its ``kind``; ``is_motor`` (Article 430); ``running_a`` the current
    it draws running [A]; ``basis_a`` the current its branch conductors are sized from before
    any 125 % (a motor's table full-load current, the HVAC nameplate MCA, a welder's 630.11(A)
    current, else the load) [A]; ``flc_a``, ``mca_a``, ``mocp_a`` where they apply [A];
    ``branch_device_a`` the branch device its rule picks, or the one the run fixes [A];
    ``continuous`` by the kind and the run; ``lra_a`` a fire pump's locked-rotor current [A]
    (None: not a fire pump, or not known)."""

    kind: str
    is_motor: bool
    running_a: float
    basis_a: float
    flc_a: float | None
    mca_a: float | None
    mocp_a: float | None
    branch_device_a: int
    continuous: bool
    lra_a: float | None = None


def kind_load(eq: Equipment, amps: float, ocpd_a: int | None, volts: float,
              phases: int) -> KindLoad:
    """``KindLoad`` of a load of ``amps`` running [A] (``running_amps``) on a circuit of
    ``volts`` [V] and ``phases``; ``ocpd_a`` a device the run fixes [A]. Raises ``LoadError``
    for a motor the tables do not list at that voltage."""
    continuous = continuous_of(eq)
    cur = rule_for(eq, volts, phases).currents(amps, amps if continuous else 0.0, ocpd_a)
    basis = amps
    if eq.kind in MOTOR_KINDS:
        basis = cur.flc_a if cur.flc_a is not None else amps
    elif eq.kind == "hvac" and eq.mca_a is not None:
        basis = eq.mca_a
    elif eq.kind == "welder":
        current, _notes = welder_current(eq)
        basis = current if current is not None else amps
    return KindLoad(eq.kind, eq.kind in MOTOR_KINDS, amps, basis, cur.flc_a, eq.mca_a,
                    eq.mocp_a, cur.ocpd_a, continuous, cur.lra_a)
