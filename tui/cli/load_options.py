"""The load options ``calc`` and ``add`` share: the load itself (``--amps``, ``--va``, ``--kva``,
``--watts``, ``--kw``, ``--hp``), its power factor, its kind (``--kind``) and the nameplate
values the kind reads (``--mca``, ``--mocp``, ``--motor-device``, ``--code-letter``,
``--design``, ``--lra``, ``--i1eff``, ``--i1max``, ``--rated-amps``, ``--duty-cycle``,
``--welder-type``, ``--tank-gal``, ``--yokes``). Not a command: no ``NAME``.

``load_table(args)`` gives the walk file's ``[run.load]`` keys (``add`` validates them with the
walk model); ``equipment(args)`` the engine's ``Equipment`` for ``calc``, which never imports the
walk model. Both refuse a nameplate option its kind does not read, naming the option.
"""

from __future__ import annotations

import argparse
import math

from gaugewalk.model.engine.contract import Equipment
from gaugewalk.model.engine.vocabulary import (
    CODE_LETTERS,
    LOAD_KINDS,
    MOTOR_DESIGNS,
    MOTOR_DEVICES,
    MOTOR_KINDS,
    NAMEPLATE_KEYS,
    WELDER_TYPES,
    LoadKind,
)
from gaugewalk.tables.equipment.horsepower import FORMS, parse_hp
from gaugewalk.tables.errors import TableLookupError

LOADS: tuple[tuple[str, str], ...] = (("amps", "A"), ("va", "VA"), ("kva", "kVA"),
                                      ("watts", "W"), ("kw", "kW"), ("hp", "hp"))
"""Load options and the unit each gives."""

NAMEPLATE_OPTIONS: dict[str, str] = {
    "mca": "--mca", "mocp": "--mocp", "motor_device": "--motor-device",
    "code_letter": "--code-letter", "design": "--design", "lra": "--lra", "i1eff": "--i1eff",
    "i1max": "--i1max", "rated_a": "--rated-amps", "duty_cycle_pct": "--duty-cycle",
    "welder_type": "--welder-type", "tank_gal": "--tank-gal", "yokes": "--yokes",
}
"""Walk file key -> the option that gives it."""


def _positive(high: float | None = None, checked: bool = True):
    """A number option; ``checked`` False leaves the range to the walk model, whose message
    names the file, the run and the field."""
    def convert(text: str) -> float:
        try:
            value = float(text)
        except ValueError:
            raise argparse.ArgumentTypeError(f"'{text}' is not a number") from None
        if not checked:
            return value
        if not math.isfinite(value):
            raise argparse.ArgumentTypeError(f"'{text}' is not a finite number")
        if value <= 0:
            raise argparse.ArgumentTypeError(f"must be above 0, not {text}")
        if high is not None and value > high:
            raise argparse.ArgumentTypeError(f"must be at most {high:g}, not {text}")
        return value
    return convert


def _hp(text: str) -> float:
    try:
        return float(parse_hp(text))
    except TableLookupError:
        raise argparse.ArgumentTypeError(f"'{text}' is not a horsepower; write {FORMS}") from None


def _letter(text: str) -> str:
    letter = text.strip().upper()
    if letter not in CODE_LETTERS:
        raise argparse.ArgumentTypeError(f"'{text}' is not a code letter of NEC Table 430.7(B) "
                                         f"({', '.join(CODE_LETTERS)})")
    return letter


def _yokes(text: str) -> int:
    try:
        value = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"'{text}' is not a whole number") from None
    if not 1 <= value <= 1000:
        raise argparse.ArgumentTypeError(f"must be from 1 to 1000, not {text}")
    return value


def add_load_options(parser: argparse.ArgumentParser, *, checked: bool = True) -> None:
    """The load, its kind and nameplate options (the power factor is each command's own).
    ``checked`` False: numbers are read but their range is left to the walk model (``add``)."""
    load = parser.add_argument_group("load (one of; HVAC, welders and receptacles may give "
                                     "their nameplate or yokes instead)")
    which = load.add_mutually_exclusive_group()
    which.add_argument("--amps", type=_positive(1e7, checked), metavar="A",
                       help="load current [A]")
    which.add_argument("--va", type=_positive(1e7, checked), metavar="VA",
                       help="load in volt-amperes")
    which.add_argument("--kva", type=_positive(1e7, checked), metavar="KVA",
                       help="load in kilovolt-amperes")
    which.add_argument("--watts", type=_positive(1e7, checked), metavar="W",
                       help="load in watts (turned into VA by --pf)")
    which.add_argument("--kw", type=_positive(1e7, checked), metavar="KW",
                       help="load in kilowatts (turned into kVA by --pf)")
    which.add_argument("--hp", type=_hp, metavar="HP",
                       help="a motor's horsepower: 10, 7.5, 1/2, 1-1/2 (NEC Tables 430.248, "
                       "430.250); implies --kind motor unless --kind fire-pump")
    kind = parser.add_argument_group("the load's kind and nameplate")
    kind.add_argument("--kind", choices=tuple(LOAD_KINDS), metavar="KIND",
                      help="what the load is: " + ", ".join(LOAD_KINDS) + " (default general; "
                      "motor with --hp; fire-pump: NEC Article 695)")
    kind.add_argument("--mca", type=_positive(6000, checked), metavar="A",
                      help="hvac: nameplate minimum circuit ampacity [A] (NEC 440.4(B))")
    kind.add_argument("--mocp", type=_positive(6000, checked), metavar="A",
                      help="hvac: nameplate maximum overcurrent protection [A] (NEC 440.22)")
    kind.add_argument("--motor-device", choices=tuple(MOTOR_DEVICES), metavar="TYPE",
                      help="motor: branch device, " + ", ".join(MOTOR_DEVICES)
                      + " (default inverse-time; NEC Table 430.52(C)(1))")
    kind.add_argument("--code-letter", type=_letter, metavar="L",
                      help="motor, fire-pump: nameplate locked-rotor code letter A-V (NEC "
                      "Table 430.7(B))")
    kind.add_argument("--design", choices=MOTOR_DESIGNS,
                      help="motor, fire-pump: NEMA design letter (default B)")
    kind.add_argument("--lra", type=_positive(60_000, checked), metavar="A",
                      help="motor, fire-pump: nameplate locked-rotor current [A], taken before "
                      "the code letter and Table 430.251 (a fire pump's device carries it, NEC "
                      "695.4(B)(2)(a)(1))")
    kind.add_argument("--i1eff", type=_positive(6000, checked), metavar="A",
                      help="welder: rating plate I1eff [A] (NEC 630.11(A))")
    kind.add_argument("--i1max", type=_positive(6000, checked), metavar="A",
                      help="welder: rating plate I1max [A] (NEC 630.12(A))")
    kind.add_argument("--rated-amps", dest="rated_a", type=_positive(6000, checked),
                      metavar="A",
                      help="welder: rated primary current [A], where I1eff is not given")
    kind.add_argument("--duty-cycle", dest="duty_cycle_pct", type=_positive(100, checked),
                      metavar="PCT",
                      help="welder: duty cycle [%%] (NEC Table 630.11(A); default 100)")
    kind.add_argument("--welder-type", choices=tuple(WELDER_TYPES),
                      help="welder: nonmotor (default) or motor-generator")
    kind.add_argument("--tank-gal", type=_positive(10_000, checked), metavar="GAL",
                      help="water-heater: storage [gal]; 120 or less is continuous (NEC 422.13)")
    kind.add_argument("--yokes", type=_yokes, metavar="N",
                      help="receptacle: yokes on the circuit, 180 VA each (NEC 220.14(I))")


def given_load(args: argparse.Namespace) -> tuple[float, str] | None:
    """The load option given, as (value, unit), or None."""
    for option, unit in LOADS:
        value = getattr(args, option, None)
        if value is not None:
            return value, unit
    return None


def kind_of(args: argparse.Namespace) -> LoadKind:
    """The load's kind: ``--kind``, else motor for ``--hp``, else general."""
    if args.kind is not None:
        return args.kind
    return "motor" if args.hp is not None else "general"


def kind_refusal(args: argparse.Namespace) -> str | None:
    """Why the options do not fit the kind, naming the option, or None."""
    kind = kind_of(args)
    if args.hp is not None and kind not in MOTOR_KINDS:
        return f"argument --hp: a load in hp is a motor (or a fire-pump), not --kind {kind}"
    for key, option in NAMEPLATE_OPTIONS.items():
        if getattr(args, key, None) is not None and kind not in NAMEPLATE_KEYS[key]:
            return (f"argument {option}: is for --kind {' or '.join(NAMEPLATE_KEYS[key])}, not "
                    f"{kind}")
    return None


def load_table(args: argparse.Namespace) -> dict | None:
    """The walk file's ``[run.load]`` from the options (None: no load and no nameplate given);
    the walk model checks it."""
    table: dict = {}
    given = given_load(args)
    if given is not None:
        table["value"], table["unit"] = given
    if args.pf is not None:
        table["pf"] = args.pf
    kind = kind_of(args)
    if kind != "general":
        table["kind"] = kind
    for key in NAMEPLATE_OPTIONS:
        value = getattr(args, key, None)
        if value is not None:
            table[key] = value
    return table or None


def equipment(args: argparse.Namespace, continuous: bool | None) -> Equipment | None:
    """The engine's ``Equipment`` from the options (None: a general load); call
    ``kind_refusal`` first."""
    kind = kind_of(args)
    if kind == "general":
        return None
    return Equipment(
        kind=kind, hp=args.hp, motor_device=args.motor_device or "inverse-time",
        code_letter=args.code_letter, design=args.design or "B", mca_a=args.mca,
        mocp_a=args.mocp, i1eff_a=args.i1eff, i1max_a=args.i1max, rated_a=args.rated_a,
        duty_cycle_pct=args.duty_cycle_pct, welder_type=args.welder_type or "nonmotor",
        tank_gal=args.tank_gal, yokes=args.yokes, continuous=continuous, lra_a=args.lra)
