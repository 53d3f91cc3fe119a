"""``gaugewalk calc``: size one run from the command line, no walk file needed.

Prints the size, device, drop, EGC and raceway for people, or one JSON object with ``--json``.
Bad input exits with status 2 and one line naming the option. Never imports Textual.
"""

from __future__ import annotations

import argparse
import json
import math
import sys

from gaugewalk.model.engine.circuits import CircuitError, circuit_from_volts
from gaugewalk.model.engine.contract import RunSpec
from gaugewalk.model.engine.lengths import LengthError, format_length_ft, parse_length
from gaugewalk.model.engine.loads import LoadError, load_amps, pf_taken
from gaugewalk.model.engine.sizing import SizingError, evaluate, resolve_raceway
from gaugewalk.model.engine.sizing.kinds import (
    continuous_of,
    continuous_refusal,
    drop_targets,
    load_pf,
    running_amps,
)
from gaugewalk.model.engine.vocabulary import (
    MATERIALS,
    MAX_SETS,
    METHODS,
    MIN_SETS,
    TERMINAL_TEMPS,
)
from gaugewalk.tables.conductor.ampacity import (
    ambient_factor,
    insulation_rating,
    parse_insulation,
    rooftop_ambient,
)
from gaugewalk.tables.conductor.sizes import parse_size
from gaugewalk.tables.equipment.horsepower import hp_text
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tui.cli.load_options import (
    NAMEPLATE_OPTIONS,
    add_load_options,
    equipment,
    given_load,
    kind_of,
    kind_refusal,
)
from gaugewalk.tui.cli.main import CAUTION, UsageError

NAME = "calc"
HELP = "Size one run: conductor, device, voltage drop, EGC and raceway."

_MAT_WORD = {"cu": "Cu", "al": "Al"}
_BRANCH_DROP_PCT = 3.0
"""[%] the run's own drop target unless --max-drop gives one (the informational note to NEC
210.19; a fire-pump's is 695.7(B)'s 5, ``kinds.drop_targets``)."""


# ------------------------------------------------------------------ option types


def _number(low: float | None = 0.0, *, allow_equal: bool = False, high: float | None = None):
    def convert(text: str) -> float:
        try:
            value = float(text)
        except ValueError:
            raise argparse.ArgumentTypeError(f"'{text}' is not a number") from None
        if not math.isfinite(value):
            raise argparse.ArgumentTypeError(f"'{text}' is not a finite number")
        if low is not None and (value < low or (value == low and not allow_equal)):
            word = "zero or more" if allow_equal and low == 0 else f"above {low:g}"
            raise argparse.ArgumentTypeError(f"must be {word}, not {text}")
        if high is not None and value > high:
            raise argparse.ArgumentTypeError(f"must be at most {high:g}, not {text}")
        return value

    return convert


def _whole(low: int, high: int):
    def convert(text: str) -> int:
        try:
            value = int(text)
        except ValueError:
            raise argparse.ArgumentTypeError(f"'{text}' is not a whole number") from None
        if not low <= value <= high:
            raise argparse.ArgumentTypeError(f"must be from {low} to {high}, not {text}")
        return value

    return convert


def _length(text: str) -> float:
    try:
        return parse_length(text)
    except LengthError as exc:
        raise argparse.ArgumentTypeError(f"'{text}' is not a length ({exc})") from None


def _size(text: str) -> str:
    try:
        return parse_size(text)
    except TableLookupError:
        raise argparse.ArgumentTypeError(
            f"'{text}' is not a conductor size (e.g. 12, 1/0, 250 kcmil)") from None


def _raceway(text: str) -> str:
    try:
        resolve_raceway(text)
    except TableLookupError as exc:
        raise argparse.ArgumentTypeError(str(exc)) from None
    return text


def _insulation(text: str) -> str:
    try:
        return parse_insulation(text)
    except TableLookupError as exc:
        raise argparse.ArgumentTypeError(str(exc)) from None


def add_arguments(parser: argparse.ArgumentParser) -> None:
    add_load_options(parser)
    parser.add_argument("--length", type=_length, required=True, metavar="L",
                        help="one-way route length: feet by default, e.g. 120+35+2*12 or 36m+8ft")
    parser.add_argument("--volts", type=_number(), required=True, metavar="V",
                        help="circuit voltage [V] (line-to-line for three-phase)")
    parser.add_argument("--phase", type=int, choices=(1, 3), default=1,
                        help="1: single-phase two-wire; 3: three-phase three-wire (default 1)")
    parser.add_argument("--material", choices=MATERIALS, default="cu",
                        help="conductor material (default cu)")
    parser.add_argument("--size", type=_size, metavar="SIZE",
                        help="check this size instead of picking one (e.g. 10, 3/0, 350kcmil)")
    parser.add_argument("--sets", type=_whole(MIN_SETS, MAX_SETS), default=1, metavar="N",
                        help="conductors in parallel per phase (default 1)")
    parser.add_argument("--max-drop", type=_number(), metavar="PCT",
                        help="drop target for this run [%%] (default 3; a fire-pump 5, NEC "
                        "695.7(B))")
    parser.add_argument("--upstream-drop", type=_number(0.0, allow_equal=True), default=0.0,
                        metavar="PCT",
                        help="drop already taken from the service to the source [%%]")
    parser.add_argument("--max-total-drop", type=_number(), default=5.0, metavar="PCT",
                        help="drop target from the service to the load [%%] (default 5; a "
                        "fire-pump never above 5, NEC 695.7(B))")
    parser.add_argument("--method", choices=tuple(METHODS), default="ac",
                        help="drop method: ac (Table 9 impedance, default), dc (Table 8), kfactor")
    parser.add_argument("--pf", type=_number(0.0, high=1.0), metavar="PF",
                        help="power factor for the AC method and for --kw (default 0.85; 1 for "
                        "a water-heater or heater)")
    parser.add_argument("--raceway", type=_raceway, default="EMT", metavar="TYPE",
                        help="raceway type (EMT, RMC, PVC-40...) or family (steel, pvc, aluminum)")
    parser.add_argument("--insulation", type=_insulation, default="THHN/THWN-2", metavar="TYPE",
                        help="conductor insulation (default THHN/THWN-2)")
    parser.add_argument("--continuous", action=argparse.BooleanOptionalAction, default=None,
                        help="the load runs 3 hours or more (125%% for sizing; EV chargers, "
                        "water heaters and heaters are by their article, lighting by default)")
    parser.add_argument("--starting-drop", type=_number(), default=15.0, metavar="PCT",
                        help="motor starting-drop target [%%] (default 15; common practice 10 "
                        "to 15; a fire-pump 15, NEC 695.7(A))")
    parser.add_argument("--distributed", action="store_true",
                        help="the load is spread evenly along the run (drop at half length)")
    parser.add_argument("--terminal-temp", type=int, choices=TERMINAL_TEMPS,
                        help="terminal rating [C]; default by NEC 110.14(C)(1)")
    parser.add_argument("--ambient", type=_number(-40.0, allow_equal=True, high=90.0),
                        default=30.0, metavar="C", help="ambient temperature [C] (default 30)")
    parser.add_argument("--rooftop", action="store_true",
                        help="in sunlight less than 7/8 in above a roof: 33 C added to the "
                             "ambient (NEC 310.15(B)(2); XHHW-2 excepted)")
    parser.add_argument("--ccc", type=_whole(1, 200), metavar="N",
                        help="current-carrying conductors in the raceway (default: this circuit's)")
    parser.add_argument("--temp", type=_number(-40.0, allow_equal=True, high=250.0), default=75.0,
                        metavar="C", help="conductor temperature for resistance [C] (default 75)")
    parser.add_argument("--min-size", type=_size, metavar="SIZE", dest="min_size",
                        help="smallest size the job allows, e.g. 12 (a job specification); "
                        "upsizing to it enlarges the EGC in proportion (NEC 250.122(B))")
    parser.add_argument("--ocpd", type=_whole(1, 6000), metavar="A",
                        help="breaker or fuse rating [A]; default the next standard rating")
    parser.add_argument("--no-egc", action="store_true",
                        help="run no equipment grounding conductor")
    parser.add_argument("--bare-egc", action="store_true",
                        help="the EGC is bare (for conduit fill)")
    parser.add_argument("--json", action="store_true", help="print one JSON object")


# ------------------------------------------------------------------ run


def _load(args) -> tuple[float | None, str | None]:
    given = given_load(args)
    if given is not None:
        return given
    nameplate = ((args.kind == "hvac" and args.mca is not None)
                 or (args.kind == "welder" and (args.i1eff is not None or args.rated_a is not None))
                 or (args.kind == "receptacle" and args.yokes is not None))
    if not nameplate:
        raise UsageError("gaugewalk calc: one of the arguments --amps --va --kva --watts --kw "
                         "--hp is required (or, for --kind hvac, --mca and --mocp; welder, "
                         "--i1eff or --rated-amps; receptacle, --yokes)")
    return None, None


def run(args) -> int:
    refusal = kind_refusal(args)
    if refusal is not None:
        raise UsageError(f"gaugewalk calc: {refusal}")
    value, unit = _load(args)
    kind = kind_of(args)
    refusal = continuous_refusal(kind, args.tank_gal, args.continuous)
    if refusal is not None:
        raise UsageError(f"gaugewalk calc: argument --continuous: {refusal}")
    pf = load_pf(kind, args.pf, 0.85)
    eq = equipment(args, args.continuous)
    try:
        circuit = circuit_from_volts(args.volts, args.phase)
        if eq is None:
            assert value is not None and unit is not None  # a general load is given (_load)
            amps = load_amps(value, unit, circuit, pf=pf)
        else:
            amps = running_amps(eq, value, unit, circuit, pf)
    except (CircuitError, LoadError) as exc:
        raise UsageError(f"gaugewalk calc: {exc}") from None
    continuous = bool(args.continuous) if eq is None else continuous_of(eq)
    _rtype, family, _note = resolve_raceway(args.raceway)
    try:
        ambient = (rooftop_ambient(args.ambient, args.insulation)[0] if args.rooftop
                   else args.ambient)
        ambient_factor(ambient, insulation_rating(args.insulation))
    except TableLookupError as exc:
        raise UsageError(f"gaugewalk calc: argument --ambient: {exc}") from None
    max_drop, max_total, starting = drop_targets(eq, args.max_drop, _BRANCH_DROP_PCT,
                                                 args.max_total_drop, args.starting_drop)
    spec = RunSpec(
        circuit=circuit,
        amps=amps,
        length_ft=args.length,
        continuous=continuous,
        distributed=args.distributed,
        material=args.material,
        insulation=args.insulation,
        terminal_temp=args.terminal_temp,
        conductor_temp_c=args.temp,
        method=args.method,
        pf=pf,
        raceway=args.raceway,
        ambient_c=args.ambient,
        rooftop=args.rooftop,
        ccc=args.ccc,
        sets=args.sets,
        size=args.size,
        ocpd_a=args.ocpd,
        min_size=args.min_size,
        max_drop_pct=max_drop,
        upstream_drop_pct=args.upstream_drop,
        max_total_drop_pct=max_total,
        egc=not args.no_egc,
        egc_bare=args.bare_egc,
        equipment=eq,
        starting_drop_pct=starting,
        load_notes=(pf_taken(value, unit, pf, "the default (--pf)")
                    if args.pf is None and value is not None and unit is not None else ()),
    )
    try:
        result = evaluate(spec)
    except (SizingError, LoadError) as exc:
        raise UsageError(f"gaugewalk calc: {exc}") from None

    load = {"value": value, "unit": unit, "kind": kind}
    load.update({k: getattr(args, k) for k in NAMEPLATE_OPTIONS if getattr(args, k) is not None})
    inputs = {
        "load": load,
        "amps": amps,
        "length_ft": args.length,
        "volts": args.volts,
        "phase": args.phase,
        "circuit": circuit.label,
        "material": args.material,
        "insulation": args.insulation,
        "size": args.size,
        "sets": args.sets,
        "method": args.method,
        "pf": pf,
        "raceway": result.raceway,
        "raceway_family": family,
        "continuous": continuous,
        "distributed": args.distributed,
        "terminal_temp": args.terminal_temp,
        "ambient_c": args.ambient,
        "rooftop": args.rooftop,
        "ccc": args.ccc,
        "conductor_temp_c": args.temp,
        "ocpd_a": args.ocpd,
        "max_drop_pct": spec.max_drop_pct,
        "upstream_drop_pct": args.upstream_drop,
        "max_total_drop_pct": spec.max_total_drop_pct,
        "egc": not args.no_egc,
        "egc_bare": args.bare_egc,
        "starting_drop_pct": spec.starting_drop_pct,
    }
    if args.json:
        data = result.to_dict()
        data["inputs"] = inputs
        data["caution"] = CAUTION
        sys.stdout.write(json.dumps(data, indent=2) + "\n")  # one write, not one per token
        return 0
    sys.stdout.write(_text(result, spec, inputs, family))
    return 0


def _a(x: float) -> str:
    return f"{round(x, 1):g} A"


def _signed(x: float, unit: str) -> str:
    return f"{x:+.1f} {unit}" if unit == "A" else f"{x:+.2f}{unit}"


def _text(r, spec: RunSpec, inputs: dict, family: str) -> str:
    mat = _MAT_WORD[r.material]
    sets = f"{r.sets} sets in parallel" if r.sets > 1 else "1 set"
    load = inputs["load"]
    if load["unit"] is None:
        load_text = _a(r.amps) + " (from the nameplate)"
    elif load["unit"] == "A":
        load_text = _a(r.amps)
    elif load["unit"] == "hp":
        load_text = f"{hp_text(load['value'])} hp = {_a(r.amps)} full-load current"
    else:
        load_text = f"{load['value']:g} {load['unit']} = {_a(r.amps)}"
    if r.design_amps != r.amps:
        load_text += (f" (sized at {_a(r.design_amps)}: 125% of the continuous part)"
                      if r.load_kind == "general"
                      else f" (conductors sized for {_a(r.design_amps)})")
    method = METHODS[r.method]
    if r.method == "ac":
        method += f", pf {spec.pf:g}, {family} raceway"
    if r.method == "dc" or r.method == "ac":
        method += f", conductors at {spec.conductor_temp_c:g} C"
    egc = f"{r.egc_size} {_MAT_WORD[spec.egc_material or r.material]}" if r.egc_size else "none"
    race = (f"{r.raceway_size} {r.raceway}, {r.raceway_fill_pct:.0f}% full"
            if r.raceway_size else f"none of the {r.raceway} trade sizes fits")
    if r.sets > 1:
        race += f" (each of {r.sets})"
    m = r.margins
    lines = [
        ("conductors", f"{r.size} {mat} {spec.insulation}, {sets}"),
        ("load", load_text),
        ("kind", f"{r.load_kind}: {r.kind_rule}" if r.load_kind != "general" else "general"),
        ("route", f"{format_length_ft(spec.length_ft)} one way, {spec.circuit.label}"
                  + (", load spread along it" if spec.distributed else "")),
        ("ampacity", f"{_a(r.ampacity_a)} for a load of {_a(r.amps)}"),
        ("device", f"{r.ocpd_a} A"),
        ("voltage drop", f"{r.voltage_drop_v:.2f} V = {r.voltage_drop_pct:.2f}% "
                         f"(target {spec.max_drop_pct:g}%)"),
        ("from service", f"{r.total_drop_pct:.2f}% (target {spec.max_total_drop_pct:g}%)"),
        *([("starting drop", f"{r.starting_drop_pct:.2f}% at {_a(r.locked_rotor_a or 0)} "
                             f"locked-rotor (target {spec.starting_drop_pct:g}%)")]
          if r.starting_drop_pct is not None else []),
        ("drop method", method),
        ("EGC", egc),
        ("raceway", race),
        ("governed by", r.governed_by),
        ("headroom", f"ampacity {_signed(m['ampacity_a'], 'A')}, terminals "
                     f"{_signed(m['terminal_a'], 'A')}, device {_signed(m['ocpd_a'], 'A')}, "
                     f"drop {_signed(m['drop_pct'], '%')}, from service "
                     f"{_signed(m['total_drop_pct'], '%')}"),
    ]
    width = max(len(k) for k, _ in lines)
    out = [f"{k.ljust(width)}  {v}" for k, v in lines]
    if r.problems:
        out.append("")
        out.append("PROBLEMS")
        out.extend(f"  ! {p}" for p in r.problems)
    if r.notes:
        out.append("")
        out.append("rules applied")
        out.extend(f"  - {n}" for n in r.notes)
    out.append("")
    out.append(CAUTION)
    return "\n".join(out) + "\n"
