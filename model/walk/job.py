"""The walk: a job header, the defaults every run inherits, the sources and the runs.

Public API (other modules code against these names):

- ``Job``: ``schema`` (file format version), ``job`` (``JobHeader``), ``defaults`` (``Defaults``),
  ``sources`` (list of ``Source``, ``[[source]]`` in the file), ``runs`` (list of ``Run``,
  ``[[run]]`` in the file), ``raceways`` (list of ``Raceway``, ``[[raceway]]``). Lookups:
  ``job.source(id)``, ``job.run(id)``, ``job.raceway(id)``, ``job.runs_in(raceway_id)``,
  ``job.is_feeder(run)``,
  ``job.feeder_of(source_id)``, ``job.runs_from(source_id)``, ``job.next_run_id(prefix)``,
  ``job.effective(run, name)`` (a per-run override or the job default).
- ``JobHeader``: name, site, walked_on, walked_by, notes.
- ``Defaults``: conductor material, insulation, raceway, terminal temperature, ambient, drop
  targets (branch, feeder, total, motor starting), drop method, power factor, conductor
  temperature, slack per end, waste allowance, colour scheme, whether the drop carries through
  transformers, the feeder basis.
- ``Source``: id, kind (``service`` | ``switchboard`` | ``panel`` | ``transformer``), system (for a
  transformer: its secondary), name, kva, rating_a (bus), main_a, spaces, the transformer's
  impedance_pct, protection and secondary_ocpd_a, notes. What feeds a source is the run whose
  ``to`` is the source's id (a service is fed by the utility).
- ``Run``: id, ``from_`` (``from`` in the file), to, length (as typed) and ``length_ft``, segments,
  load (``Load``: value, unit, pf, kind and the nameplate values of its kind), continuous (None:
  as the kind says), distributed, connection, position, phase, sets, size, ocpd_a, basis,
  per-run overrides of the defaults (None: inherit), bends, measured_on, notes.
- ``Raceway``: a raceway several runs share (``[[raceway]]`` in the file): id, type (None: the
  job's raceway), size (trade size; None: sized for what is in it), length (its own route
  length), bends, notes. A run names the one it is in with ``raceway_id`` (for the raceway's
  length), or a segment does (for the segment's length); ``shared_ids(run)`` lists them. The
  shared raceway is worked out by ``gaugewalk.model.walk.raceways``.
- ``SCHEMA_VERSION``, ``OVERRIDABLE`` (run fields that fall back to defaults). The words the
  fields accept are in ``gaugewalk.model.engine.vocabulary`` and ``gaugewalk.model.walk.vocabulary``.
- ``new_walk(name=..., site=..., walked_by=..., walked_on=..., service_system=...) -> Job``.

Edit a run by assignment (``run.length = "90+12"``): runs validate on assignment, so ``length_ft``
follows. The structure is checked here field by field; references, cycles and what a system can
supply are checked by ``gaugewalk.model.walk.checks``.
"""



import re
import warnings
from datetime import date
from functools import lru_cache
from typing import Annotated

from pydantic import (
    AfterValidator,
    BaseModel,
    BeforeValidator,
    ConfigDict,
    Field,
    PrivateAttr,
    ValidationInfo,
    field_validator,
    model_validator,
)

from gaugewalk.model.engine.circuits import CircuitError, parse_system
from gaugewalk.model.engine.lengths import MAX_LENGTH_CHARS, LengthError
from gaugewalk.model.engine.lengths import parse_length as _parse_length
from gaugewalk.model.engine.sizing.kinds import continuous_refusal, kind_continuous
from gaugewalk.model.engine.vocabulary import (
    CODE_LETTERS,
    MAX_SETS,
    MIN_SETS,
    MOTOR_KINDS,
    NAMEPLATE_KEYS,
    Connection,
    LoadKind,
    LoadUnit,
    Material,
    Method,
    MotorDesign,
    MotorDevice,
    TerminalTemp,
    WelderType,
)
from gaugewalk.model.walk.plain_text import no_control
from gaugewalk.model.walk.pydantic_plugins import spare_the_loader
from gaugewalk.model.walk.vocabulary import (
    MAX_POSITION,
    Demand,
    FeederBasis,
    Phase,
    Protection,
    SourceKind,
)
from gaugewalk.tables.conductor.ampacity import parse_insulation
from gaugewalk.tables.conductor.sizes import parse_size
from gaugewalk.tables.equipment.horsepower import hp_text, parse_hp
from gaugewalk.tables.equipment.motors import horsepowers
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.raceway.fill import TRADE_SIZES, parse_raceway, trade_sizes
from gaugewalk.tables.raceway.install import PULL_EVERY_FT

SCHEMA_VERSION = 1
"""Version of the walk file format written by this code (the ``schema`` key)."""


_ID_RE = re.compile(r"^[A-Za-z0-9][A-Za-z0-9 ._/#()+-]{0,39}$")
_ID_HELP = (
    "an id is 1 to 40 characters: letters, digits, space and . _ - / # ( ) +, "
    "starting with a letter or digit"
)

_LENGTH_SCHEMA = {"type": ["string", "number"], "minLength": 1, "maxLength": MAX_LENGTH_CHARS}
"""A length in the JSON Schema: text, or a bare number of feet (``length = 85``), of 1 to
``MAX_LENGTH_CHARS`` characters. The length grammar refuses text outside those bounds with its
own message, so they are not checked again after it (pydantic would check them one run at a
time in Python, where they could never fail)."""



@lru_cache(maxsize=8192)
def parse_length(text: str) -> float:
    """``gaugewalk.model.engine.lengths.parse_length`` remembered: a walk repeats the same lengths, and each is
    read by the field check and again for ``length_ft`` [ft]. Errors are not remembered."""
    return _parse_length(text)


def _check_id(value: str) -> str:
    if not isinstance(value, str) or not _ID_RE.match(value) or value != value.strip():
        raise ValueError(f"'{value}' is not a usable id: {_ID_HELP}")
    return value


_SOURCES_BUILT = [0]
"""Counts the ids validated on sources (each source built, each id assigned): a ``Job``'s
lookup that finds no source answers from its index only while this has not moved."""
_RUNS_BUILT = [0]
"""The same for runs: building a run (as the run card does) leaves the source lookups alone."""
_IDS_RENAMED = [0]
"""Counts ids assigned in place on a source or run (``source.id = ...``): every lookup index
of every ``Job`` is rebuilt after one, since the first item of an id may then stand elsewhere."""


def _source_id(value: str) -> str:
    value = _check_id(value)
    _SOURCES_BUILT[0] += 1
    return value


def _run_id(value: str) -> str:
    value = _check_id(value)
    _RUNS_BUILT[0] += 1
    return value


def _noting_renames(self, name: str, value) -> None:
    """``__setattr__`` of ``Source`` and ``Run``: an id assigned in place is counted in
    ``_IDS_RENAMED`` before pydantic validates and sets it."""
    if name == "id":
        _IDS_RENAMED[0] += 1
    _Strict.__setattr__(self, name, value)


def _no_items() -> list:
    """A fresh empty list, the default of a field that lists tables. A Python function rather than
    ``list``: pydantic reads the signature of every default factory, and a builtin's comes from
    parsing its text signature (about 1.5 ms at import, paid by every command that reads a walk)."""
    return []


spare_the_loader()  # before the first model is built: see its module


class _Strict(BaseModel):
    # The docstring under each field describes it in the JSON Schema; they are read from the
    # source only when a schema is made (gaugewalk.model.walkfile.schema), not here as each model
    # is built: pydantic's use_attribute_docstrings took half the time of importing this module.
    model_config = ConfigDict(extra="forbid", populate_by_name=True, validate_assignment=True)


# ``defer_build=True`` (below on ``PutUp``, ``Load``, ``Segment``, ``Raceway`` and ``Job``): pydantic
# builds the model's own validator and serializer when one is first used (validating, assigning,
# dumping, a JSON Schema), not as the class is made. A reader never uses these on their own:
# ``Job`` is put together with ``model_construct`` from parts validated one by one; ``PutUp``,
# ``Load`` and ``Segment`` are validated inside ``Defaults`` and ``Run``; ``Raceway`` only where a
# walk has shared raceways. Every check is the same; ``gaugewalk check`` skips their builds (about
# 7 M instructions, 1 ms).


def _canonical(parse, value):
    if value is None:
        return None
    try:
        return parse(value)
    except TableLookupError as exc:
        raise ValueError(str(exc)) from None


def _known(parse):
    """A validator giving the table's own name for what was typed (``#12`` -> ``12 AWG``)."""
    return AfterValidator(lambda value: _canonical(parse, value))


OneLine = Annotated[str, AfterValidator(no_control)]
"""A name, a place, a label: one line of plain text, control characters refused
(``gaugewalk.model.walk.plain_text``). Notes keep them, shown escaped."""

SizeName = Annotated[str, _known(parse_size)]
"""A conductor size as Table 310.16 names it (``12 AWG``, ``250 kcmil``)."""
InsulationName = Annotated[str, _known(parse_insulation)]
"""An insulation type as NEC Table 310.4(1) names it (``THHN/THWN-2``)."""
RacewayName = Annotated[str, _known(parse_raceway)]
"""A raceway type as NEC Ch. 9 Table 4 names it (``EMT``, ``PVC-40``)."""


class JobHeader(_Strict):
    """Who walked what, where and when."""

    name: OneLine = ""
    """Job name as the crew knows it."""
    site: OneLine = ""
    """Site address or description."""
    walked_on: date | None = None
    """Date of the walk."""
    walked_by: OneLine = ""
    """Who walked it."""
    notes: str = ""
    """Anything the crew should know about the job."""


class PutUp(_Strict, defer_build=True):
    """A box or reel the supplier sells conductor sizes in, for the takeoff's order."""

    label: OneLine = Field(min_length=1, max_length=40)
    """What the order calls it, e.g. ``500 ft box``."""
    length_ft: int = Field(gt=0, le=100_000)
    """Conductor on one box or reel [ft]."""
    sizes: list[str] = Field(min_length=1)
    """Sizes sold this way, e.g. ``["12 AWG", "10 AWG"]``."""

    @field_validator("sizes")
    @classmethod
    def _known_sizes(cls, value: list[str]) -> list[str]:
        return [_canonical(parse_size, v) for v in value]


class Defaults(_Strict):
    """What every run inherits unless it says otherwise.

    Drop targets follow the informational notes to NEC 210.19 (branch circuits, 3 %) and 215.2
    (feeders, 3 %; feeder plus branch circuit, 5 %): recommendations, not requirements, unless the
    jurisdiction or an energy code adopts them.
    """

    material: Material = "cu"
    """Conductor material: ``cu`` or ``al``."""
    insulation: InsulationName = "THHN/THWN-2"
    """Insulation type (NEC Table 310.4(1) names)."""
    raceway: RacewayName = "EMT"
    """Raceway type (NEC Ch. 9 Table 4 names)."""
    terminal_temp: TerminalTemp | None = None
    """Terminal rating [C]; None: NEC 110.14(C)(1) by circuit rating and size."""
    ambient_c: float = Field(30.0, ge=-40.0, le=90.0)
    """Ambient temperature [C] (NEC 310.15(B)(1))."""
    branch_drop_pct: float = Field(3.0, gt=0.0, le=20.0)
    """Drop target for a branch circuit [%] (informational note to NEC 210.19)."""
    feeder_drop_pct: float = Field(3.0, gt=0.0, le=20.0)
    """Drop target for a feeder [%] (informational note to NEC 215.2)."""
    total_drop_pct: float = Field(5.0, gt=0.0, le=25.0)
    """Drop target from the service to the load [%] (informational note to NEC 215.2)."""
    method: Method = "ac"
    """Drop method: ``dc`` (Ch. 9 Table 8 R), ``kfactor`` or ``ac`` (Ch. 9 Table 9)."""
    pf: float = Field(0.85, gt=0.0, le=1.0)
    """Power factor for loads that do not give one."""
    conductor_temp_c: float = Field(75.0, ge=20.0, le=150.0)
    """Conductor temperature for resistance [C] (Ch. 9 Table 8 note 2)."""
    starting_drop_pct: float = Field(15.0, gt=0.0, le=50.0)
    """Drop target while a motor starts [%], at its locked-rotor current (common practice:
    about 10 to 15 %; no code rule sets one)."""
    min_size: SizeName | None = None
    """Smallest conductor the job allows for power, e.g. ``12 AWG`` (a job specification; common
    practice on commercial work); None: the smallest the rules allow. Upsizing to it enlarges the
    EGC in proportion (NEC 250.122(B))."""
    slack_per_end_ft: float = Field(2.0, ge=0.0, le=50.0)
    """Wire left at each end for terminations [ft] (common practice), for the takeoff."""
    waste_pct: float = Field(5.0, ge=0.0, le=100.0)
    """Allowance on each conductor cut for measuring and pulling [%] (common practice), for the
    takeoff."""
    pull_every_ft: float = Field(PULL_EVERY_FT, ge=0.0, le=10_000.0)
    """A pull point (conduit body or pull box) on a long run at least this often [ft] (common
    practice: about every 100 ft); 0: only where bends need one (NEC 358.26 and kin)."""
    max_plausible_length_ft: float = Field(3000.0, gt=0.0, le=1e6)
    """A run longer than this [ft] is warned about, never refused: about the length of the
    largest factory and warehouse buildings (common practice); raise it for a long site feeder."""
    colour_scheme: str = "common"
    """Conductor colours for the takeoff. ``common``: black/red/blue on 120/240 V and 208Y/120 V,
    brown/orange/yellow on 480Y/277 V and 480 V, white or grey neutrals, green EGC (common
    practice; only the neutral and EGC colours are code rules, NEC 200.6 and 250.119)."""
    putups: list[PutUp] | None = None
    """Boxes and reels the takeoff orders in; None: 500 ft boxes for 14-10 AWG and 1,000 and
    2,500 ft reels (common practice, ``gaugewalk.tables.order.putups``)."""
    drop_through_transformers: bool = True
    """The drop from the service carries through a transformer, its own drop at its load
    included (IEEE Std 141 approximation); false: the drop restarts at 0 % on each secondary
    (as when the taps make up the drop upstream)."""
    nonlinear_loads: bool = False
    """The major portion of the load on 3-phase 4-wire wye circuits is nonlinear (electronic
    drivers, computers, LED lighting): their neutral counts as current-carrying (NEC
    310.15(E)(3)), four current-carrying conductors in a raceway are adjusted (310.15(C)(1)),
    and a feeder's neutral is full size (220.61(C)(2): no reduction for that load; common
    practice). False: the loads taken as linear, which each such circuit says in its notes."""
    feeder_basis: FeederBasis = "load"
    """What a feeder is sized for: ``load`` (the heaviest line of what it serves, NEC
    215.2(A)(1)) or ``equipment`` (the main device, else the bus rating, of the panel it feeds;
    common practice); a feeder's ``basis`` overrides it."""
    demand: Demand = "connected"
    """The load a feeder is sized for: ``connected`` (every load at 100 %) or ``nec-220``
    (receptacles below it per NEC 220.44, and of heating and cooling below it only the larger,
    NEC 220.60; each application in the feeder's notes). A feeder given its own load keeps it."""



class Load(_Strict, defer_build=True):
    """A load as the walker wrote it: a value and a unit (a power factor for watts), what kind of
    load it is, and the nameplate values its kind reads (``gaugewalk.model.engine.sizing.kinds``).

    A load in ``hp`` is a motor (``kind`` may be left out) or a fire pump (``kind = "fire-pump"``). HVAC equipment given its ``mca``, a
    welder its ``i1eff`` or ``rated_a``, receptacles their ``yokes`` may leave ``value`` and
    ``unit`` out; every other load gives both."""

    value: float | None = Field(None, gt=0.0, le=1e7)
    """The load in ``unit`` (a motor's horsepower in ``hp``)."""
    unit: LoadUnit | None = None
    """``A``, ``VA``, ``kVA``, ``W``, ``kW`` or ``hp``."""
    pf: float | None = Field(None, gt=0.0, le=1.0)
    """Power factor; None: the job default (1 for a water heater or space heater). Used for
    W/kW and the AC drop method."""
    kind: LoadKind = "general"
    """What the load is: ``general``, ``motor``, ``fire-pump``, ``hvac``, ``ev-charger``, ``water-heater``,
    ``heater``, ``welder``, ``lighting`` or ``receptacle``; each brings its article's rules."""
    motor_device: MotorDevice | None = None
    """Motor branch short-circuit and ground-fault device (NEC Table 430.52(C)(1)):
    ``inverse-time`` (None), ``dual-element``, ``nontime-delay`` or ``instantaneous``."""
    code_letter: str | None = Field(None, min_length=1, max_length=1)
    """Motor nameplate locked-rotor code letter, A to V (NEC Table 430.7(B)), for the starting
    drop (and a fire pump's device); None: Table 430.251(A)/(B) by horsepower."""
    lra: float | None = Field(None, gt=0.0, le=60_000.0)
    """Motor nameplate locked-rotor current [A], where it states one: taken before the code
    letter and the tables (a motor's starting drop; a fire pump's device, NEC
    695.4(B)(2)(a)(1))."""
    design: MotorDesign | None = None
    """Motor NEMA design letter ``B`` (None), ``C`` or ``D``."""
    mca: float | None = Field(None, gt=0.0, le=6000.0)
    """HVAC nameplate minimum circuit ampacity [A] (NEC 440.4(B))."""
    mocp: float | None = Field(None, gt=0.0, le=6000.0)
    """HVAC nameplate maximum overcurrent protection [A] (NEC 440.4(B), 440.22)."""
    i1eff: float | None = Field(None, gt=0.0, le=6000.0)
    """Welder effective primary current from its rating plate [A] (NEC 630.11(A))."""
    i1max: float | None = Field(None, gt=0.0, le=6000.0)
    """Welder maximum primary current from its rating plate [A] (NEC 630.12(A))."""
    rated_a: float | None = Field(None, gt=0.0, le=6000.0)
    """Welder rated primary current [A], where I1eff is not given (NEC 630.11(A))."""
    duty_cycle_pct: float | None = Field(None, gt=0.0, le=100.0)
    """Welder duty cycle [%] (NEC Table 630.11(A)); None with ``rated_a``: 100 % taken."""
    welder_type: WelderType | None = None
    """``nonmotor`` (None: transformer or rectifier) or ``motor-generator`` (Table 630.11(A))."""
    tank_gal: float | None = Field(None, gt=0.0, le=10_000.0)
    """Water heater storage [gal]: 120 or less is continuous (NEC 422.13); None: taken so."""
    yokes: int | None = Field(None, ge=1, le=1000)
    """Receptacle yokes on the circuit, 180 VA each (NEC 220.14(I))."""

    @model_validator(mode="before")
    @classmethod
    def _hp_is_a_motor(cls, data):
        if isinstance(data, dict) and data.get("unit") == "hp" and "kind" not in data:
            data = {**data, "kind": "motor"}
        return data

    @field_validator("kind")
    @classmethod
    def _kind_fits_unit(cls, value: str, info: ValidationInfo) -> str:
        if info.data.get("unit") == "hp" and value not in MOTOR_KINDS:
            raise ValueError(f"a load in hp is a motor, not {value}: set kind = \"motor\" (or "
                             f"\"fire-pump\") or give the load in A, VA or W")
        return value

    @field_validator(*NAMEPLATE_KEYS)
    @classmethod
    def _key_of_kind(cls, value, info: ValidationInfo):
        kinds = NAMEPLATE_KEYS[str(info.field_name)]
        kind = info.data.get("kind")
        if value is not None and kind is not None and kind not in kinds:
            raise ValueError(f"{info.field_name} is for a load of kind {' or '.join(kinds)}; this "
                             f"load is {kind}")
        if info.field_name == "code_letter" and value is not None:
            letter = value.strip().upper()
            if letter not in CODE_LETTERS:
                raise ValueError(f"'{value}' is not a code letter of NEC Table 430.7(B); the "
                                 f"letters are {', '.join(CODE_LETTERS)}")
            return letter
        return value

    @model_validator(mode="after")
    def _value_and_unit(self) -> "Load":
        if (self.value is None) != (self.unit is None):
            raise ValueError("give the load's value and its unit together, e.g. 16A or 10hp")
        if self.value is None and not self._nameplate_stands_in():
            raise ValueError(_LOAD_NEEDED.get(self.kind, "the load needs a value and a unit "
                                              "(16A, 1.8kVA, 5kW)"))
        if self.unit == "hp":
            try:
                hp = parse_hp(self.value)
            except TableLookupError as exc:
                raise ValueError(str(exc)) from None
            if hp not in _MOTOR_RATINGS:
                raise ValueError(f"{hp_text(hp)} hp is not a rating of NEC Tables 430.248 and "
                                 f"430.250; they list {', '.join(hp_text(h) for h in sorted(_MOTOR_RATINGS))} hp")
        return self

    def _nameplate_stands_in(self) -> bool:
        return ((self.kind == "hvac" and self.mca is not None)
                or (self.kind == "welder" and (self.i1eff is not None or self.rated_a is not None))
                or (self.kind == "receptacle" and self.yokes is not None))


_LOAD_NEEDED = {
    "hvac": "give the load, or the nameplate's mca (and mocp)",
    "welder": "give the load, or the rating plate's i1eff (and i1max), or rated_a",
    "receptacle": "give the load, or the number of yokes (180 VA each, NEC 220.14(I))",
}
_MOTOR_RATINGS = frozenset(horsepowers(1)) | frozenset(horsepowers(3))
"""[hp] the ratings of NEC Tables 430.248 and 430.250."""


def _length_text(value):
    if isinstance(value, bool):
        return value
    if isinstance(value, int):
        return str(value)
    if isinstance(value, float):
        return str(int(value)) if value.is_integer() else repr(value)
    return value


def _readable_length(value: str) -> str:
    try:
        parse_length(value)
    except LengthError as exc:
        raise ValueError(f"the length '{value}' cannot be read {exc}") from None
    return value


LengthText = Annotated[
    str,
    BeforeValidator(_length_text),
    AfterValidator(_readable_length),
    Field(json_schema_extra=_LENGTH_SCHEMA),
]
"""A route length as typed (``85+12+2*6``; a bare number is kept as its text), which the length
grammar of ``gaugewalk.model.engine.lengths`` must read."""


class Segment(_Strict, defer_build=True):
    """One stretch of a run's route, with a note on where it goes."""

    length: LengthText
    """Length as typed (same grammar as the run's length)."""
    note: OneLine = ""
    """Where this stretch goes."""
    raceway_id: str | None = None
    """Id of the shared raceway (``[[raceway]]``) this stretch runs in; None: the run's own."""

    @field_validator("raceway_id")
    @classmethod
    def _raceway_is_id(cls, value: str | None) -> str | None:
        return None if value is None else _check_id(value)


class Source(_Strict):
    """Something that feeds runs: the service, a switchboard, a panel or a transformer.

    A transformer starts a new system: ``system`` is its secondary; the drop from the service
    carries through it, or restarts on its secondary (``Defaults.drop_through_transformers``).
    """

    id: str
    """Short id the runs refer to, e.g. ``MDP``, ``LP-2``, ``T1``."""
    kind: SourceKind
    """``service``, ``switchboard``, ``panel`` or ``transformer``."""
    system: str
    """Supply system at this source's bus, e.g. ``208Y/120V 3ph 4w`` (transformer: secondary)."""
    name: OneLine = ""
    """Name on the equipment or drawings."""
    kva: float | None = Field(None, gt=0.0, le=1e5)
    """Transformer rating [kVA]."""
    rating_a: int | None = Field(None, gt=0, le=10000)
    """Bus rating [A] (NEC 408.30)."""
    main_a: int | None = Field(None, gt=0, le=10000)
    """Main device rating [A]; None: main lugs only (NEC 408.36: the panel is then protected by
    its feeder's device)."""
    spaces: int | None = Field(None, ge=1, le=MAX_POSITION)
    """Breaker positions (spaces) it has; None: not given, so no position is checked against the
    end."""
    impedance_pct: float | None = Field(None, gt=0.0, le=25.0)
    """Transformer nameplate impedance [%]; None: a typical value, stated as assumed."""
    protection: Protection = "primary"
    """Transformer protection by NEC Table 450.3(B): ``primary`` (primary only) or ``both``
    (primary and secondary)."""
    secondary_ocpd_a: int | None = Field(None, gt=0, le=10000)
    """Transformer secondary device at the transformer [A]; None: the secondary conductors end in
    the main of the panel they feed (NEC 240.21(C))."""
    nonlinear_loads: bool | None = None
    """The major portion of the load it serves is nonlinear (electronic drivers, computers, LED
    lighting), as ``Defaults.nonlinear_loads`` says for the whole job, for its runs and the
    feeder into it (NEC 310.15(E)(3), 220.61(C)(2)); false: linear; None: the job's setting."""
    notes: str = ""
    """Where it is, what it looks like."""

    @field_validator("id")
    @classmethod
    def _usable_id(cls, value: str) -> str:
        return _source_id(value)

    __setattr__ = _noting_renames

    @model_validator(mode="after")
    def _transformer_keys(self) -> "Source":
        if self.kind != "transformer":
            given = [k for k in ("impedance_pct", "secondary_ocpd_a") if getattr(self, k)
                     is not None]
            if self.protection != "primary":
                given.append("protection")
            if given:
                verb = "belongs" if len(given) == 1 else "belong"
                raise ValueError(f"{' and '.join(given)} {verb} to a transformer, not a "
                                 f"{self.kind}")
        return self

    @field_validator("system")
    @classmethod
    def _known_system(cls, value: str) -> str:
        try:
            return parse_system(value)
        except CircuitError as exc:
            raise ValueError(str(exc)) from None


def _trade_size(value: str | None) -> str | None:
    """A trade size as NEC Ch. 9 Table 4 writes it (``1-1/4``; ``1 1/4`` and ``1-1/4"`` read)."""
    if value is None:
        return None
    key = str(value).strip().replace('"', "").replace(" ", "-")
    if key not in TRADE_SIZES:
        raise ValueError(f"no trade size '{value}'; trade sizes are {', '.join(TRADE_SIZES)}")
    return key


class Raceway(_Strict, defer_build=True):
    """A raceway several runs share for part or all of their route: its fill is checked for
    every conductor in it (NEC Ch. 9 Tables 1, 4, 5), every run in it is adjusted for the
    current-carrying conductors in it (310.15(C)(1)), and the takeoff counts it once."""

    id: str
    """Short id the runs name in ``raceway_id``, e.g. ``HR-1``."""
    type: RacewayName | None = None
    """Raceway type (NEC Ch. 9 Table 4 names); None: the job default."""
    size: Annotated[str | None, AfterValidator(_trade_size)] = None
    """Trade size fixed by the user, e.g. ``1-1/4``; None: the smallest that holds what is in it."""
    length: LengthText
    """Its own route length, the part the runs share [ft unless a unit is given]."""
    bends: int | None = Field(None, ge=0, le=100)
    """90-degree bends along it (elbows and pull points for the takeoff)."""
    notes: str = ""
    """Where it goes."""

    _length_ft: float = PrivateAttr(default=0.0)

    @field_validator("id")
    @classmethod
    def _usable_id(cls, value: str) -> str:
        return _check_id(value)

    @model_validator(mode="after")
    def _size_made(self) -> "Raceway":
        if self.type is not None and self.size is not None and \
                self.size not in trade_sizes(self.type):
            raise ValueError(f"{self.type} is not made in trade size {self.size}; its sizes are "
                             f"{', '.join(trade_sizes(self.type))}")
        self.__pydantic_private__["_length_ft"] = parse_length(self.length)
        return self

    @property
    def length_ft(self) -> float:
        """Route length of the shared raceway [ft], read from ``length``."""
        return self.__pydantic_private__["_length_ft"]


class Run(_Strict):
    """One run of conductors from a source to a panel (a feeder) or to a load (a branch)."""

    id: str
    """Short id, e.g. ``R12`` or ``F-LP2``."""
    from_: str = Field(alias="from")
    """Id of the source the run starts at."""
    to: OneLine = Field(min_length=1, max_length=120)
    """A source id of this job (the run is then its feeder) or the load's name."""
    length: LengthText
    """One-way route length as typed: ``85+12+2*6``, ``36m+8ft`` [ft unless a unit is given]."""
    segments: list[Segment] = Field(default_factory=_no_items)
    """Optional stretches of the route with notes; they must add up to ``length``."""
    load: Load | None = None
    """The load; required on a branch, optional on a feeder (default: what its panel serves)."""
    continuous: bool | None = None
    """Load runs 3 h or more: sized at 125 % (NEC 210.19(A)(1), 215.2(A)(1)); None: as the
    load's kind says (EV chargers, water heaters and space heating continuous by their article,
    lighting by common practice, other loads not)."""
    distributed: bool = False
    """Load spread evenly along the run rather than at its end (drop taken at half length)."""
    connection: Connection | None = None
    """How the load is wired to the source's system; None: every hot and the neutral it offers
    (a feeder to a transformer: the hots only)."""
    position: int | None = Field(None, ge=1, le=MAX_POSITION)
    """Breaker position (circuit number) in its source; a k-pole circuit at p takes p, p+2, ...
    (same side). None: placed to balance the lines."""
    phase: Phase | None = None
    """The line or lines it lands on (``A``, ``B``, ``C``, ``AB``, ``BC``, ``CA``, ``ABC``), when
    no position says so; None: from the position, else placed."""
    sets: int = Field(1, ge=MIN_SETS, le=MAX_SETS)
    """Conductors in parallel per phase (NEC 310.10(G))."""
    size: SizeName | None = None
    """Conductor size fixed by the user, e.g. ``3/0 AWG``; None: picked."""
    ocpd_a: int | None = Field(None, gt=0, le=6000)
    """Breaker or fuse rating fixed by the user [A]; None: next standard rating (NEC 240.6(A))."""
    basis: FeederBasis | None = None
    """A feeder's sizing basis (``load`` or ``equipment``); None: the job's ``feeder_basis``."""
    material: Material | None = None
    """Conductor material; None: the job default."""
    insulation: InsulationName | None = None
    """Insulation type; None: the job default."""
    raceway: RacewayName | None = None
    """Raceway type; None: the job default."""
    terminal_temp: TerminalTemp | None = None
    """Terminal rating [C]; None: the job default."""
    ambient_c: float | None = Field(None, ge=-40.0, le=90.0)
    """Ambient temperature [C]; None: the job default."""
    rooftop: bool = False
    """The raceway or cable runs in direct sunlight on a rooftop less than 7/8 in (23 mm) above
    it: 33 C is added to the ambient (NEC 310.15(B)(2); XHHW-2 excepted)."""
    conductor_temp_c: float | None = Field(None, ge=20.0, le=150.0)
    """Conductor temperature for resistance [C]; None: the job default."""
    method: Method | None = None
    """Drop method; None: the job default."""
    max_drop_pct: float | None = Field(None, gt=0.0, le=20.0)
    """Drop target for this run [%]; None: the job's branch or feeder target."""
    bends: int | None = Field(None, ge=0, le=100)
    """90-degree bends along the route (elbows for the takeoff); in a shared raceway, those of
    the run's own part."""
    raceway_id: str | None = None
    """Id of the shared raceway (``[[raceway]]``) the run is in, for that raceway's length; the
    rest of its route is in a raceway of its own (or in the shared raceways its segments name).
    None: its own raceway all the way, but for segments that name one."""
    measured_on: date | None = None
    """When the length was last measured."""
    notes: str = ""
    """Anything about the run."""

    _length_ft: float = PrivateAttr(default=0.0)

    @field_validator("id")
    @classmethod
    def _usable_id(cls, value: str) -> str:
        return _run_id(value)

    @field_validator("from_")
    @classmethod
    def _from_is_id(cls, value: str) -> str:
        return _check_id(value)

    __setattr__ = _noting_renames

    @field_validator("continuous")
    @classmethod
    def _continuous_fits_kind(cls, value: bool | None, info: ValidationInfo) -> bool | None:
        """Refused where the load's article says otherwise; kept as None where it is what the
        kind says anyway (a default, left out of the file)."""
        if value is None:
            return None
        load = info.data.get("load")
        kind, tank = ("general", None) if not isinstance(load, Load) else (load.kind,
                                                                            load.tank_gal)
        refusal = continuous_refusal(kind, tank, value)
        if refusal is not None:
            raise ValueError(refusal)
        return None if value == kind_continuous(kind, tank) else value

    @field_validator("raceway_id")
    @classmethod
    def _raceway_is_id(cls, value: str | None) -> str | None:
        return None if value is None else _check_id(value)

    @model_validator(mode="after")
    def _feet(self) -> "Run":
        feet = parse_length(self.length)
        if self.segments:
            total = sum(parse_length(s.length) for s in self.segments)
            if abs(total - feet) > 0.05:
                raise ValueError(
                    f"the length is {feet:.1f} ft but its segments add up to {total:.1f} ft"
                )
        self.__pydantic_private__["_length_ft"] = feet  # as self._length_ft = feet, direct
        return self

    @property
    def length_ft(self) -> float:
        """One-way route length [ft], read from ``length``."""
        return self.__pydantic_private__["_length_ft"]  # direct: this is read in hot loops


def shared_ids(run: Run) -> tuple[str, ...]:
    """Ids of the shared raceways a run is in: its own ``raceway_id``, then those its segments
    name, each once."""
    if not run.segments:
        return (run.raceway_id,) if run.raceway_id is not None else ()
    ids = [run.raceway_id] if run.raceway_id is not None else []
    ids += [s.raceway_id for s in run.segments if s.raceway_id is not None]
    return tuple(dict.fromkeys(ids))


def _run_private_init(self: Run, context, /) -> None:
    """Run's private attributes set up as pydantic's generic ``init_private_attributes`` would
    (``{"_length_ft": 0.0}``), without its loop over defaults: that loop was a quarter of the
    time a run takes to validate, and a walk validates thousands."""
    if getattr(self, "__pydantic_private__", None) is None:
        object.__setattr__(self, "__pydantic_private__", {"_length_ft": 0.0})


if set(Run.__private_attributes__) != {"_length_ft"}:  # keep _run_private_init in step
    raise TypeError("Run's private attributes changed: update _run_private_init")
Run.model_post_init = _run_private_init


_STALE = object()


class _IdIndex:
    """Where each id first stands in one list of a walk (``Job.sources`` or ``Job.runs``),
    built in one pass and then kept without another while its answers still hold:

    - the list is the same object, of the same length (an item added or removed is noticed);
    - no id was assigned in place since (``_IDS_RENAMED``);
    - a found id is checked against the item now at its place, so an item put in place of
      another of the same id (a run stored from the run card, a change undone, a copy with
      a position written) is the one returned, and one of another id makes the index stale;
    - an id not found answers None only while no item of the list's kind was built since
      (``built``: ``_SOURCES_BUILT`` or ``_RUNS_BUILT``): the item may be new.

    An item of another id put in place of one (``runs[i] = other``) is noticed only by a lookup
    of the id it replaced, or of its own id when not found and built since; code that does that
    calls ``Job.reindex``, so no answer depends on which lookup comes first. ``find`` returns
    the item, None, or ``_STALE`` when the index must be built again."""

    __slots__ = ("items", "length", "built", "renamed", "at")

    def __init__(self, items: list, built: int) -> None:
        self.items = items
        self.length = len(items)
        self.built = built
        self.renamed = _IDS_RENAMED[0]
        ids = [item.id for item in items]
        # the first position of each id: later positions are written first and overwritten
        self.at = dict(zip(reversed(ids), range(len(ids) - 1, -1, -1), strict=True))

    def find(self, items: list, key: str, built: int):
        if items is not self.items or len(items) != self.length or \
                self.renamed != _IDS_RENAMED[0]:
            return _STALE
        i = self.at.get(key)
        if i is None:
            return None if built == self.built else _STALE
        item = items[i]
        return item if item.id == key else _STALE


OVERRIDABLE: dict[str, str] = {
    "material": "material",
    "insulation": "insulation",
    "raceway": "raceway",
    "terminal_temp": "terminal_temp",
    "ambient_c": "ambient_c",
    "conductor_temp_c": "conductor_temp_c",
    "method": "method",
}
"""Run field -> the ``Defaults`` field it falls back to when None."""


with warnings.catch_warnings():
    # ``schema`` is the file's format-version key; it shadows pydantic's deprecated classmethod.
    warnings.filterwarnings("ignore", message='Field name "schema"', category=UserWarning)

    class Job(_Strict, defer_build=True):
        """A whole walk: header, defaults, sources and runs."""

        schema: int = Field(SCHEMA_VERSION, ge=0)
        """Walk file format version."""
        job: JobHeader = Field(default_factory=JobHeader)
        """Who walked what, where and when."""
        defaults: Defaults = Field(default_factory=Defaults)
        """What every run inherits unless it says otherwise."""
        sources: list[Source] = Field(default_factory=_no_items, alias="source")
        """Service, switchboards, panels and transformers (``[[source]]``)."""
        runs: list[Run] = Field(default_factory=_no_items, alias="run")
        """Every run walked (``[[run]]``)."""
        raceways: list[Raceway] = Field(default_factory=_no_items, alias="raceway")
        """Raceways several runs share (``[[raceway]]``)."""

        _source_index: _IdIndex | None = PrivateAttr(default=None)
        _run_index: _IdIndex | None = PrivateAttr(default=None)

        def __eq__(self, other: object) -> bool:  # the lookup indexes are not part of the walk
            return type(other) is type(self) and self.__dict__ == other.__dict__

        __hash__ = None

        # -- lookups -------------------------------------------------------------------------
        # Each list has an index of where each id first stands, which follows edits on its own
        # (``_IdIndex``); the private attributes are read directly, as ``Run.length_ft`` is:
        # ``self._run_index`` goes through pydantic's ``__getattr__``, and a computation looks
        # ids up thousands of times.
        def reindex(self) -> None:
            """Forget the lookup indexes: call after putting an item into ``sources`` or
            ``runs`` in place of one of another id, or reordering a list in place. Items
            added or removed, ids assigned in place and items put in place of one of the same
            id are noticed on their own (``_IdIndex``)."""
            private = self.__pydantic_private__
            private["_source_index"] = private["_run_index"] = None

        def source(self, source_id: str) -> Source | None:
            """The first source with this id, or None."""
            private = self.__pydantic_private__
            index = private["_source_index"]
            if index is not None:
                found = index.find(self.sources, source_id, _SOURCES_BUILT[0])
                if found is not _STALE:
                    return found
            index = private["_source_index"] = _IdIndex(self.sources, _SOURCES_BUILT[0])
            return index.find(self.sources, source_id, _SOURCES_BUILT[0])

        def run(self, run_id: str) -> Run | None:
            """The first run with this id, or None."""
            private = self.__pydantic_private__
            index = private["_run_index"]
            if index is not None:
                found = index.find(self.runs, run_id, _RUNS_BUILT[0])
                if found is not _STALE:
                    return found
            index = private["_run_index"] = _IdIndex(self.runs, _RUNS_BUILT[0])
            return index.find(self.runs, run_id, _RUNS_BUILT[0])

        def run_position(self, run_id: str) -> int | None:
            """Where the first run with this id stands in ``runs``, or None."""
            if self.run(run_id) is None:
                return None
            return self.__pydantic_private__["_run_index"].at[run_id]  # checked by ``run``

        def raceway(self, raceway_id: str) -> Raceway | None:
            """The shared raceway with this id, or None (a walk has few: no index)."""
            return next((r for r in self.raceways if r.id == raceway_id), None)

        def runs_in(self, raceway_id: str) -> list[Run]:
            """Runs in the shared raceway ``raceway_id`` (by the run or one of its segments), in
            file order."""
            return [r for r in self.runs if raceway_id in shared_ids(r)]

        def is_feeder(self, run: Run) -> bool:
            """True when the run ends at a source of this job (it feeds that source)."""
            return self.source(run.to) is not None

        def feeder_of(self, source_id: str) -> Run | None:
            """The run feeding this source, or None (a service is fed by the utility)."""
            for r in self.runs:
                if r.to == source_id:
                    return r
            return None

        def runs_from(self, source_id: str) -> list[Run]:
            """Runs leaving this source, in file order."""
            return [r for r in self.runs if r.from_ == source_id]

        def effective(self, run: Run, name: str):
            """A run's own value for an overridable field, or the job default."""
            value = getattr(run, name)
            return getattr(self.defaults, OVERRIDABLE[name]) if value is None else value

        def next_run_id(self, prefix: str = "R") -> str:
            """The next free id ``prefix`` + number, one past the highest already used."""
            pattern = re.compile(re.escape(prefix) + r"(\d+)$")
            used = {r.id for r in self.runs}
            highest = 0
            for rid in used:
                m = pattern.match(rid)
                if m:
                    highest = max(highest, int(m.group(1)))
            n = highest + 1
            while f"{prefix}{n}" in used:
                n += 1
            return f"{prefix}{n}"


def new_walk(
    *,
    name: str = "",
    site: str = "",
    walked_by: str = "",
    walked_on: date | None = None,
    service_system: str | None = None,
    service_id: str = "SVC",
) -> Job:
    """A fresh walk; with ``service_system`` it starts with the service as its first source."""
    sources = []
    if service_system:
        sources.append(Source(id=service_id, kind="service", system=service_system, name="Service"))
    return Job(
        job=JobHeader(name=name, site=site, walked_by=walked_by, walked_on=walked_on),
        sources=sources,
    )
