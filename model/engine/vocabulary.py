"""The words and limits of one run, in one place: the pydantic fields of the job model, the
engine's spec checks, the command line's choices, the run card's and the trial screen's checks
all read them from here.

Public API (each a ``Literal`` type and its values, in the order they are offered):

- ``Material``, ``MATERIALS``: conductor materials, ``cu`` and ``al`` (NEC Table 310.16 columns).
- ``Method``, ``METHODS``: voltage-drop methods with a line on each (``dc``: Ch. 9 Table 8;
  ``kfactor``; ``ac``: Ch. 9 Table 9 note 2).
- ``TerminalTemp``, ``TERMINAL_TEMPS``: terminal ratings [C] (NEC 110.14(C)(1)).
- ``Connection``, ``CONNECTIONS``: how a load is wired to its source's system, with a line on
  each (``gaugewalk.model.engine.circuits.resolve_circuit``).
- ``LoadUnit``, ``LOAD_UNITS``: load units and their multiplier to A, VA or W (``hp``: a motor's
  horsepower, turned into amps by NEC Tables 430.248 and 430.250, not by a multiplier).
- ``LoadKind``, ``LOAD_KINDS``: what a load is, with a line on each; each kind brings the rules
  of its article (``gaugewalk.model.engine.sizing.kinds``). ``RESISTIVE_KINDS`` take power factor
  1 unless the run gives one; ``CONTINUOUS_KINDS`` are continuous by their article;
  ``MOTOR_KINDS`` are motors by horsepower (a fire pump is one, with Article 695's rules).
- ``MotorDevice``, ``MOTOR_DEVICES``: the motor branch short-circuit and ground-fault device
  types of NEC Table 430.52(C)(1); ``MotorDesign``, ``MOTOR_DESIGNS`` (NEMA design letters the
  locked-rotor table covers); ``CODE_LETTERS`` (Table 430.7(B)).
- ``WelderType``, ``WELDER_TYPES``: the two columns of NEC Table 630.11(A).
- ``NAMEPLATE_KEYS``: each nameplate key of a load and the kinds that read it.
- ``MIN_SETS``, ``MAX_SETS``, ``SETS_WORDS``: conductors in parallel per phase (NEC 310.10(G));
  more than 20 sets is beyond any feeder a walk records (common practice).
- ``or_words(values)``: ``"cu or al"``, ``"dc, kfactor or ac"``.
"""

from __future__ import annotations

from typing import Literal, get_args

from gaugewalk.tables.equipment import locked_rotor as _locked_rotor

Material = Literal["cu", "al"]
MATERIALS: tuple[Material, ...] = get_args(Material)

Method = Literal["dc", "kfactor", "ac"]
METHODS: dict[Method, str] = {
    "dc": "DC resistance, NEC Ch. 9 Table 8",
    "kfactor": "K-factor, VD = k K I L / cmil (K 12.9 Cu, 21.2 Al)",
    "ac": "AC effective impedance, NEC Ch. 9 Table 9 note 2",
}

TerminalTemp = Literal[60, 75, 90]
TERMINAL_TEMPS: tuple[TerminalTemp, ...] = get_args(TerminalTemp)

Connection = Literal["LN", "LL", "LLN", "MW", "MW2", "3P", "3PN"]
CONNECTIONS: dict[Connection, str] = {
    "LN": "single-phase line-to-neutral (one hot and the neutral)",
    "LL": "single-phase line-to-line (two hots)",
    "LLN": "line-to-line with a neutral (two hots and the neutral; drop taken as line-to-line)",
    "MW": "balanced multiwire (hots sharing one neutral that carries no current)",
    "MW2": "two-circuit multiwire on a wye (two hots and the neutral, which carries about the "
           "phase current)",
    "3P": "three-phase 3-wire",
    "3PN": "three-phase 4-wire (three hots and the neutral)",
}

LoadUnit = Literal["A", "VA", "kVA", "W", "kW", "hp"]
LOAD_UNITS: dict[str, float] = {"A": 1.0, "VA": 1.0, "kVA": 1000.0, "W": 1.0, "kW": 1000.0,
                                "hp": 1.0}
"""Load units and their multiplier to the base unit (A, VA or W; ``hp`` is read from the motor
tables instead)."""
POWER_UNITS = ("A", "VA", "kVA", "W", "kW")
"""The units a load of any kind may be given in (``hp`` is for motors)."""

LoadKind = Literal["general", "motor", "fire-pump", "hvac", "ev-charger", "water-heater", "heater",
                   "welder", "lighting", "receptacle"]
LOAD_KINDS: dict[LoadKind, str] = {
    "general": "any load no article of its own covers (NEC 210.19(A), 210.20(A), 215.2, 215.3)",
    "motor": "a motor by horsepower (NEC 430.6(A)(1), 430.22, 430.52, 250.122(D)(1))",
    "fire-pump": "a fire pump motor: device carries its locked-rotor current, its own drop "
                 "limits (NEC 695.4(B)(2), 695.6(C), 695.7)",
    "hvac": "air-conditioning or refrigerating equipment by its nameplate MCA and MOCP "
            "(NEC 440.4(B), 440.22)",
    "ev-charger": "electric vehicle supply equipment, a continuous load (NEC 625.41, 625.42)",
    "water-heater": "a storage water heater, continuous at 120 gal or less (NEC 422.13)",
    "heater": "fixed electric space heating or another resistive heater, continuous "
              "(NEC 424.4(B))",
    "welder": "an arc welder by its rating plate (NEC 630.11, 630.12)",
    "lighting": "lighting, continuous unless the run says not (common practice)",
    "receptacle": "general-purpose receptacles, 180 VA per yoke where counted (NEC 220.14(I))",
}
RESISTIVE_KINDS: tuple[LoadKind, ...] = ("water-heater", "heater")
"""Kinds whose load is resistance heating: power factor 1 unless the run gives one."""
CONTINUOUS_KINDS: tuple[LoadKind, ...] = ("ev-charger", "water-heater", "heater")
"""Kinds their article makes continuous (NEC 625.42, 422.13, 424.4(B)): a run may not say
otherwise (a water heater over 120 gal excepted, ``gaugewalk.model.engine.sizing.kinds``)."""

MotorDevice = Literal["inverse-time", "dual-element", "nontime-delay", "instantaneous"]
MOTOR_DEVICES: dict[MotorDevice, str] = {
    "inverse-time": "inverse time circuit breaker (250 % of full-load current)",
    "dual-element": "dual-element (time-delay) fuse (175 %)",
    "nontime-delay": "nontime-delay fuse (300 %)",
    "instantaneous": "instantaneous-trip breaker in a listed combination controller (800 %)",
}
"""Motor branch short-circuit and ground-fault devices, NEC Table 430.52(C)(1) columns."""

MotorDesign = Literal["B", "C", "D"]
MOTOR_DESIGNS: tuple[MotorDesign, ...] = get_args(MotorDesign)
"""NEMA design letters of the polyphase locked-rotor table (NEC Table 430.251(B)); a motor with
one of them may use the 75 C column (NEC 110.14(C)(1)(a)(4))."""

CODE_LETTERS: tuple[str, ...] = tuple(_locked_rotor.CODE_LETTERS)
"""Locked-rotor indicating code letters, NEC Table 430.7(B) (I, O and Q are not used)."""

MOTOR_KINDS: tuple[LoadKind, ...] = ("motor", "fire-pump")
"""Kinds that are a motor by horsepower (NEC Tables 430.248, 430.250): a load in hp is one of
them (``motor`` unless it says ``fire-pump``), and each reads a motor's nameplate (code letter,
design letter, locked-rotor current)."""

NAMEPLATE_KEYS: dict[str, tuple[LoadKind, ...]] = {
    "motor_device": ("motor",), "code_letter": MOTOR_KINDS, "design": MOTOR_KINDS,
    "lra": MOTOR_KINDS,
    "mca": ("hvac",), "mocp": ("hvac",),
    "i1eff": ("welder",), "i1max": ("welder",), "rated_a": ("welder",),
    "duty_cycle_pct": ("welder",), "welder_type": ("welder",),
    "tank_gal": ("water-heater",), "yokes": ("receptacle",),
}
"""The nameplate keys of a run's load (the walk file's ``[run.load]`` names) and the kinds that
read each."""

WelderType = Literal["nonmotor", "motor-generator"]
WELDER_TYPES: dict[WelderType, str] = {
    "nonmotor": "transformer or rectifier welder (Table 630.11(A) nonmotor-generator column)",
    "motor-generator": "motor-generator welder (Table 630.11(A) motor-generator column)",
}

MIN_SETS = 1
MAX_SETS = 20
SETS_WORDS = f"a whole number from {MIN_SETS} to {MAX_SETS}"

for _literal, _values in ((Method, METHODS), (Connection, CONNECTIONS), (LoadUnit, LOAD_UNITS),
                         (LoadKind, LOAD_KINDS), (MotorDevice, MOTOR_DEVICES),
                         (WelderType, WELDER_TYPES)):
    if get_args(_literal) != tuple(_values):  # keep each Literal and its table in step
        raise TypeError(f"{_literal} and its table differ: {tuple(_values)}")


def or_words(values) -> str:
    """The values as a choice in words: ``cu or al``, ``dc, kfactor or ac``."""
    words = [str(v) for v in values]
    return words[0] if len(words) == 1 else ", ".join(words[:-1]) + " or " + words[-1]
