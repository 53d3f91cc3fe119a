"""The run card as a form, without a screen: its fields, what it fills in for the person, and
everything worked out from the texts (each field's check, the run they make, the live answer).

The app's run card (``gaugewalk.tui.app.screens.card``) lays the form out and takes the keys;
nothing here imports Textual. A new field is added here once: an entry in ``FIELDS``, a check in
``CHECKS`` (reading the text into a value, with the reason when it cannot) and its place in the
run (``_run_data``).

Public API:

- ``FIELDS``, ``FIELD_KEYS``, ``MAIN_KEYS``, ``FIRST_MORE``, ``label(key)``; ``choices(session)``: what each field completes from.
- ``CardForm(session, run_id=None)``: ``start()`` (fills the fields, says where typing starts),
  ``type(key, text)`` (the person typed; returns the fields the form filled in on their behalf),
  ``check(store_tried=False) -> CardCheck``, ``next_card(run, new_source)`` after a store;
  ``last_run()``, ``like(run)`` (a new card like a run) and ``proposed_to()`` (its name stepped).
- ``run_to_fields(run)``, ``new_source_from(id, text)``, ``parse_load_text(text)``,
  ``complete(text, choices)``.
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field
from datetime import date
from typing import TYPE_CHECKING, Callable, Iterable, cast

from gaugewalk.model.engine import vocabulary as vocab
from gaugewalk.model.engine.contract import Circuit, RunResult
from gaugewalk.model.engine.lengths import LengthError, parse_length
from gaugewalk.model.engine.loads import LoadError, parse_load
from gaugewalk.model.session.card_source import EXAMPLE as SOURCE_EXAMPLE
from gaugewalk.model.session.card_source import new_source_from
from gaugewalk.model.session.card_steps import next_position, step_name
from gaugewalk.model.session.session import WalkSession, fmt_ft
from gaugewalk.model.walk.job import Load, Run, Source
from gaugewalk.model.walk.plain_text import shown as shown_plain
from gaugewalk.model.walk.plausible import long_length
from gaugewalk.model.walk.vocabulary import kind_in_name
from gaugewalk.tables.conductor.ampacity import ROOFTOP_ADDER_C, rooftop_excepted
from gaugewalk.tables.equipment.horsepower import hp_text

if TYPE_CHECKING:   # the walk's computation is imported when a card is sized
    from gaugewalk.model.walk.starting import StartDip


@dataclass(frozen=True)
class CardField:
    """One field of the card: key, label, the hint shown while it is empty, and whether it is
    one of the main fields (typed for every run, in walking order)."""

    key: str
    label: str
    placeholder: str
    main: bool = False


FIELDS: tuple[CardField, ...] = (
    CardField("from", "From", "source id", True),
    CardField("to", "To", "load or panel", True),
    CardField("length", "Length", "e.g. 85+12+2*6", True),
    CardField("load", "Load", "16A, 5kW 208V, 10hp", True),
    CardField("continuous", "Continuous", "yes / no"),
    CardField("spread", "Spread", "no: load at the end"),
    CardField("panel", "New panel", SOURCE_EXAMPLE),
    CardField("circuit", "Circuit", "LN LL LLN MW 3P"),
    CardField("kind", "Kind", "general, motor, hvac…"),
    CardField("plate", "Nameplate", "as the kind needs"),
    CardField("place", "Position", "breaker no. or phase"),
    CardField("sets", "Sets", "1"),
    CardField("size", "Size", "blank: picked"),
    CardField("material", "Material", "cu / al"),
    CardField("raceway", "Raceway", "EMT, PVC-40, ..."),
    CardField("raceway_id", "Shared in", "raceway id; blank: own"),
    CardField("rooftop", "Rooftop", "yes: <7/8 in above a roof"),
    CardField("id", "Run id", ""),
    CardField("notes", "Notes", ""),
)
FIELD_KEYS = tuple(f.key for f in FIELDS)
MAIN_KEYS = tuple(f.key for f in FIELDS if f.main)
FIRST_MORE = next(f.key for f in FIELDS if not f.main)
"""The first of the other fields, below the main ones: Continuous, then Spread, properties of the
load typed next to it (one and two Downs from Load); ctrl+o goes to New panel, which To's hint
names."""
COPIED_FROM_PREVIOUS = ("circuit", "continuous")
"""Fields a new card copies from the last branch run from the same source. Material and raceway
are not copied: a fresh card shows the job's (a PVC-40 typed for one underground run must not ride
unseen below the line into the next); ctrl+r copies everything of the last run."""
FOLLOWING = (*COPIED_FROM_PREVIOUS, "id", "kind")
"""Fields the form fills in for the person, and keeps filling while they are not typed in."""
LOAD_KEYS = ("load", "kind", "plate")
"""The fields a run's load is read from (the load, its kind, its nameplate)."""
PLATE_PLACEHOLDERS = {
    "motor": "dual-element code G", "fire-pump": "code G (or lra 363)",
    "hvac": "mca 28 mocp 45", "welder": "i1eff 25 i1max 50",
    "water-heater": "tank 50", "receptacle": "yokes 8",
}
"""The nameplate field's hint for each kind that reads one (other kinds hide the field)."""
YES = {"y", "yes", "true", "1", "on"}
NO = {"", "n", "no", "false", "0", "off"}


def label(key: str) -> str:
    return next((f.label for f in FIELDS if f.key == key), key)


def choices(session: WalkSession) -> dict[str, list[str]]:
    """What each field completes from (Tab takes the first that starts with the text)."""
    return {
        "from": session.source_ids(),
        "to": session.known_names(),
        "kind": list(vocab.LOAD_KINDS),
        "circuit": list(vocab.CONNECTIONS),
        "material": list(vocab.MATERIALS),
        "raceway_id": [r.id for r in session.job.raceways],
    }


def _continuous_of_kind(kind: str) -> str | None:
    """The Continuous field as the card fills it in for a kind that decides it (the engine's
    ``continuous_by_kind``), None for a kind that leaves it to the person."""
    from gaugewalk.model.engine.sizing.kinds import continuous_by_kind

    said = continuous_by_kind(kind)
    return None if said is None else "yes" if said else "no"


def _kinds_starting(text: str) -> list[vocab.LoadKind]:
    """The kinds whose names start with ``text`` (stripped, lower case; none for blank)."""
    return [k for k in vocab.LOAD_KINDS if text and k.startswith(text)]


def kind_named(text: str) -> vocab.LoadKind | None:
    """The kind the Kind field names: a kind's name, or the start of exactly one, as a fast
    typist leaves it (``ev``: ev-charger, ``rec``: receptacle); None: blank, or no kind or
    several start so (``h``: hvac and heater)."""
    t = text.strip().lower()
    if t in vocab.LOAD_KINDS:
        return t
    starting = _kinds_starting(t)
    return starting[0] if len(starting) == 1 else None


def kind_in(values: dict[str, str]) -> vocab.LoadKind:
    """The load's kind as the texts say: the kind field (``kind_named``), else motor for a load
    in hp or a motor's nameplate (a fire pump where its name says so, ``kind_in_name``), else
    the kind whose nameplate words the load field holds (``mca 38 mocp 50``: hvac),
    else, for a run with a load and no new panel, the kind its name says (``kind_in_name``),
    else general (an unknown word: general, and the kind field says what is wrong)."""
    kind = values.get("kind", "").strip().lower()
    named = kind_named(kind)
    if named is not None:
        return named
    if not kind:
        text = values.get("load", "")
        try:
            if read_load_field(text).unit == "hp":
                return ("fire-pump" if kind_in_name(values.get("to", "")) == "fire-pump"
                        else "motor")
        except LoadError:
            pass
        try:
            plate_kind = nameplate_kind(read_nameplate(split_load(text)[1]))
        except ValueError:
            plate_kind = None
        if plate_kind == "motor" and kind_in_name(values.get("to", "")) == "fire-pump":
            return "fire-pump"
        if plate_kind is not None:
            return plate_kind
        if text.strip() and not values.get("panel", "").strip():
            return kind_in_name(values.get("to", "")) or "general"
    return "general"


def nameplate_kind(plate: dict[str, object]) -> vocab.LoadKind | None:
    """The one kind of load that reads every key of ``plate`` (``vocab.NAMEPLATE_KEYS``), or
    None (no key, or keys of different kinds); keys a motor and a fire pump both read
    (``code G``) are a motor's (the name may say fire pump, ``kind_in``)."""
    kinds = {kind for key in plate for kind in vocab.NAMEPLATE_KEYS[key]}
    if kinds == set(vocab.MOTOR_KINDS):
        return "motor"
    return kinds.pop() if len(kinds) == 1 else None


def shown(key: str, values: dict[str, str]) -> bool:
    """Whether the card shows field ``key`` for these texts: the nameplate only for a kind that
    reads one (or while it holds text)."""
    if key != "plate":
        return True
    return kind_in(values) in PLATE_PLACEHOLDERS or bool(values.get("plate", "").strip())


def placeholder(key: str, values: dict[str, str]) -> str:
    """The hint an empty field shows; the nameplate's follows the kind."""
    if key == "plate":
        if split_load(values.get("load", ""))[1]:
            return "typed in Load"  # not an example beside the real figures
        return PLATE_PLACEHOLDERS.get(kind_in(values), "as the kind needs")
    return next((f.placeholder for f in FIELDS if f.key == key), "")


_PLATE_WORDS: dict[str, str] = {
    "mca": "mca", "mocp": "mocp", "device": "motor_device", "code": "code_letter",
    "letter": "code_letter", "design": "design", "lra": "lra", "i1eff": "i1eff", "i1max": "i1max",
    "rated": "rated_a", "duty": "duty_cycle_pct", "type": "welder_type", "tank": "tank_gal",
    "gal": "tank_gal", "yokes": "yokes", "yoke": "yokes", "duplex": "yokes",
}
"""Nameplate words the card reads -> the walk file's ``[run.load]`` keys."""
_COUNTED_AFTER = frozenset({"yokes", "yoke", "duplex", "gal"})
"""Nameplate words people write after their number as well (``8 yokes``, ``50 gal``)."""
_PLATE_FLAGS: dict[str, tuple[str, str]] = {
    **{d: ("motor_device", d) for d in vocab.MOTOR_DEVICES},
    **{t: ("welder_type", t) for t in vocab.WELDER_TYPES},
}
"""Words that stand alone: a motor device type or a welder type."""
_PLATE_TEXT = {"mca": "mca", "mocp": "mocp", "code_letter": "code", "design": "design",
               "lra": "lra",
               "i1eff": "i1eff", "i1max": "i1max", "rated_a": "rated", "duty_cycle_pct": "duty",
               "tank_gal": "tank", "yokes": "yokes"}
"""The walk file's key -> the word ``plate_text`` writes."""
_BARE_NUMBER = re.compile(r"^\d+(?:\.\d+)?$")
_PLATE_UNITS = re.compile(r"(?<=\d)\s*(?:a|%|gal)$", re.IGNORECASE)


def split_load(text: str) -> tuple[str, str]:
    """The load field as the load and the nameplate words typed after it, as read off the
    equipment: ``mca 38 mocp 50`` -> ``("", "mca 38 mocp 50")``, ``10hp code G 3P`` ->
    ``("10hp 3P", "code G")`` (a voltage, poles, phases or power factor stay with the load);
    a field without a nameplate word is all load. A count written before its word (``8 yokes``,
    ``50 gal``) is read as the word and its count."""
    words = re.sub(r"\s*[=:]\s*", " ", text.strip()).split()
    i = 1
    while i < len(words):
        if words[i].lower() in _COUNTED_AFTER and _BARE_NUMBER.match(words[i - 1]):
            if i >= 2 and words[i - 2].lower() in _PLATE_WORDS:  # "tank 50 gal": its unit
                words[i - 1] += words.pop(i)
                continue
            words[i - 1], words[i] = words[i], words[i - 1]
        i += 1
    first = next((i for i, w in enumerate(words)
                  if w.lower() in _PLATE_WORDS or w.lower() in _PLATE_FLAGS), None)
    if first is None:
        return text, ""
    load, plate = words[:first], []
    for word in words[first:]:
        low = word.lower()
        if (_VOLTS_WORD.match(low) or _POLES_WORD.match(low) or _PHASES_WORD.match(low)
                or _PF_WORD.match(low)):
            load.append(word)
        else:
            plate.append(word)
    return " ".join(load), " ".join(plate)


def read_load_field(text: str) -> LoadText:
    """The load field's load (``read_load_text``) without the nameplate words typed after it
    (``split_load``), which let the value be left out. Raises LoadError."""
    words, plate = split_load(text)
    return read_load_text(words, value_needed=not plate)


def read_nameplate(text: str) -> dict[str, object]:
    """The nameplate field: ``mca 28 mocp 45``, ``dual-element code G design B``,
    ``i1eff 25 i1max 50``, ``rated 40 duty 50%``, ``motor-generator``, ``tank 50gal``,
    ``yokes 8`` (``=`` or ``:`` between a word and its value as the person likes) into the walk
    file's ``[run.load]`` keys. Raises ValueError naming the word it cannot read."""
    words = re.sub(r"\s*[=:]\s*", " ", text.strip()).split()
    out: dict[str, object] = {}
    i = 0
    while i < len(words):
        word = words[i].lower()
        if word in _PLATE_FLAGS:
            key, value = _PLATE_FLAGS[word]
            out[key] = value
            i += 1
            continue
        key = _PLATE_WORDS.get(word)
        if key is None:
            raise ValueError(f"'{words[i]}' is not a nameplate word; use "
                             f"{', '.join(dict.fromkeys(_PLATE_WORDS))} or a device or welder "
                             f"type")
        if i + 1 >= len(words):
            raise ValueError(f"'{words[i]}' needs its value (e.g. {words[i]} 28)")
        raw = words[i + 1]
        if key in ("code_letter", "design"):
            out[key] = raw.upper()
        elif key in ("motor_device", "welder_type"):
            out[key] = raw.lower()
        else:
            number = _PLATE_UNITS.sub("", raw)
            try:
                out[key] = int(number) if key == "yokes" else float(number)
            except ValueError:
                raise ValueError(f"'{raw}' is not a number for {words[i]}") from None
        i += 2
    return out


def plate_text(load: Load | None) -> str:
    """The nameplate field's text for a load (``read_nameplate`` reads it back)."""
    if load is None:
        return ""
    words = []
    if load.motor_device is not None:
        words.append(load.motor_device)
    if load.welder_type is not None:
        words.append(load.welder_type)
    for key, word in _PLATE_TEXT.items():
        value = getattr(load, key)
        if value is not None:
            words.append(f"{word} {value:g}" if isinstance(value, float) else f"{word} {value}")
    return " ".join(words)


def complete(text: str, options: Iterable[str]) -> str | None:
    """The first of ``options`` that starts with ``text`` (any case), or None."""
    low = text.casefold()
    if not low:
        return None
    return next((c for c in options if c.casefold().startswith(low)), None)


def yes_no(text: str) -> bool | None:
    t = text.strip().lower()
    if t in YES:
        return True
    if t in NO:
        return False
    return None


def _kind_text(run: Run) -> str:
    """The kind field's text for a stored run: its kind; blank for a general load, or
    ``general`` where its name says another kind (``kind_in_name``), which a blank field would
    take instead (``kind_in``): a run edited on the card keeps the kind it was stored with."""
    load = run.load
    if load is None:
        return ""
    if load.kind != "general":
        return load.kind
    return "general" if kind_in_name(run.to) is not None else ""


def run_to_fields(run: Run) -> dict[str, str]:
    """The card's texts for an existing run."""
    from gaugewalk.model.walk.equipment import run_continuous

    load = ""
    if run.load is not None and run.load.value is not None:
        load = (f"{hp_text(run.load.value)}hp" if run.load.unit == "hp"
                else f"{run.load.value:g}{run.load.unit}")
    if run.load is not None and run.load.pf is not None:
        load += f" pf{run.load.pf:g}"
    return {
        "from": run.from_,
        "to": run.to,
        "length": run.length,
        "load": load.strip(),
        "kind": _kind_text(run),
        "plate": plate_text(run.load),
        "panel": "",
        "circuit": run.connection or "",
        "continuous": "yes" if run_continuous(run) else "no",
        "spread": "yes" if run.distributed else "no",
        "sets": str(run.sets),
        "size": run.size or "",
        "material": run.material or "",
        "raceway": run.raceway or "",
        "place": (str(run.position) if run.position is not None else run.phase or ""),
        "raceway_id": run.raceway_id or "",
        "rooftop": "yes" if run.rooftop else "no",
        "id": run.id,
        "notes": shown_plain(run.notes),  # control characters made visible, never sent raw
    }


@dataclass(frozen=True)
class LoadText:
    """The load field read: the load, its power factor if given, and the voltage [V], poles or
    phases it states for its circuit (None where it says nothing)."""

    value: float | None
    """None where the field gives only nameplate words (``split_load``) and a circuit."""
    unit: str | None
    pf: float | None = None
    volts: float | None = None
    poles: int | None = None
    phases: int | None = None

    @property
    def states_circuit(self) -> bool:
        return self.volts is not None or self.poles is not None or self.phases is not None


_VOLTS_WORD = re.compile(r"^(\d{2,3})v$")
_POLES_WORD = re.compile(r"^([123])p(?:ole)?$")
_PHASES_WORD = re.compile(r"^([13])ph$")
_PF_WORD = re.compile(r"^pf[\d.]*$")


def read_load_text(text: str, value_needed: bool = True) -> LoadText:
    """``16A``, ``5kW pf0.9``, ``16A 208V``, ``30A 3P``, ``10kVA 480V 3ph``: the load, then in
    any order its power factor, the voltage it runs at and its poles or phases. Raises
    LoadError with a sentence. ``value_needed`` False: the voltage, poles and power factor
    alone are read too (a load given by its nameplate, ``split_load``)."""
    t = text.strip()
    pf = None
    low = t.lower()
    if " pf" in low:
        i = low.rindex(" pf")
        pf_text = t[i + 3:].strip().lstrip("=").strip()
        t = t[:i].strip()
        try:
            pf = float(pf_text)
        except ValueError:
            raise LoadError(f"'pf{pf_text}' is not a power factor; write e.g. pf0.9") from None
        if not 0 < pf <= 1:
            raise LoadError("a power factor is above 0 and at most 1")
    # "120 V", "2 pole": the number and its word belong together
    words = re.sub(r"(?<=\d)\s+(?=(?:v|p|pole|ph)\b)", "", t, flags=re.IGNORECASE).split()
    volts = poles = phases = None
    while len(words) > (1 if value_needed else 0):
        last = words[-1].lower()
        if (m := _VOLTS_WORD.match(last)) and volts is None:
            volts = float(m.group(1))
        elif (m := _POLES_WORD.match(last)) and poles is None:
            poles = int(m.group(1))
        elif (m := _PHASES_WORD.match(last)) and phases is None:
            phases = int(m.group(1))
        else:
            break
        words.pop()
    if not words and not value_needed:
        return LoadText(None, None, pf, volts, poles, phases)
    value, unit = parse_load(" ".join(words))
    return LoadText(value, unit, pf, volts, poles, phases)


def parse_load_text(text: str) -> tuple[float, str, float | None]:
    """``16A``, ``5kW pf0.9`` -> (value, unit, pf or None). Raises LoadError."""
    read = read_load_text(text)  # a value is needed: read, or LoadError
    return cast(float, read.value), cast(str, read.unit), read.pf


BRANCH_CONNECTIONS = ("LN", "LL", "3P")
"""The circuits a branch run's load can ask for by its voltage and poles, most usual first:
one pole and the neutral, two poles, three poles (a neutral with more poles is typed)."""


def circuit_for_load(system_id: str, load: LoadText) -> str:
    """The connection the voltage, poles or phases a load states asks for on ``system_id``.
    Raises ValueError naming what the system gives when none fits."""
    from gaugewalk.model.engine.circuits import CircuitError, resolve_circuit

    offered = []
    for conn in BRANCH_CONNECTIONS:
        try:
            offered.append((conn, resolve_circuit(system_id, conn)))
        except CircuitError:
            continue
    for conn, c in offered:
        if ((load.volts is None or abs(c.volts - load.volts) < 0.5)
                and (load.poles is None or c.hots == load.poles)
                and (load.phases is None or c.phases == load.phases)):
            return conn
    said = " ".join(x for x in (
        f"{load.volts:g} V" if load.volts is not None else "",
        f"{load.poles}-pole" if load.poles is not None else "",
        f"{load.phases}-phase" if load.phases is not None else "",
    ) if x)
    gives = "; ".join(circuit_words(c) for _, c in offered)
    raise ValueError(f"{system_id} gives {gives}: not {said}")


def default_branch_circuit(system_id: str, values: dict[str, str] | None = None) -> str:
    """A branch run's circuit when nothing says otherwise, by the kind of load the card's
    texts say (``branch_circuit_for_kind``: one pole and the neutral for general loads, two
    poles for chargers and heaters, every hot for motors of 1 hp or more and HVAC)."""
    from gaugewalk.model.walk.checks import branch_circuit_for_kind

    values = values or {}
    hp = None
    try:
        if values.get("load", "").strip():
            read = read_load_field(values["load"])
            hp = read.value if read.unit == "hp" else None
    except LoadError:
        hp = None
    return branch_circuit_for_kind(system_id, kind_in(values), hp)


def circuit_words(circuit) -> str:
    """A ``Circuit`` in words: ``120 V, 1 pole and neutral``, ``208 V, 3 poles, 3-phase``."""
    poles = f"{circuit.hots} pole" + ("s" if circuit.hots > 1 else "")
    neutral = " and neutral" if circuit.neutral else ""
    phase = ", 3-phase" if circuit.phases == 3 else ""
    return f"{circuit.volts:g} V, {poles}{neutral}{phase}"


@dataclass
class CardCheck:
    """What the card's texts say now: the reason each wrong field is wrong, a short note for
    each right one, the fields merely still empty (``soft``: "needed", not wrong), the run they
    make (None while anything is wrong) and its live answer."""

    errors: dict[str, str] = field(default_factory=dict)
    hints: dict[str, str] = field(default_factory=dict)
    soft: set[str] = field(default_factory=set)
    run: Run | None = None
    new_source: Source | None = None
    result: RunResult | None = None
    cannot: str | None = None   # why the run cannot be sized yet (it can still be stored)
    feet: float | None = None
    circuit: Circuit | None = None  # what the circuit field means on the source (None: unknown)
    connection: str = ""        # the circuit field's connection ("": every hot and the neutral)
    taken: tuple[str, ...] = ()  # what sizing the run took as given that the card could say
    #                              (a load in kW without its power factor: ``pf_assumed``)
    dip: StartDip | None = None   # a motor's starting dip from the service


@dataclass
class _Reading:
    """The texts being read, and what each check has made of them so far."""

    form: "CardForm"
    v: dict[str, str]
    errors: dict[str, str] = field(default_factory=dict)
    hints: dict[str, str] = field(default_factory=dict)
    got: dict[str, object] = field(default_factory=dict)

    @property
    def job(self):
        return self.form.session.job


def _check_from(r: _Reading) -> None:
    src = r.v["from"].strip()
    r.got["from"] = src
    source = r.job.source(src) if src else None
    r.got["from_source"] = source   # the later checks read its system from here
    if not src:
        r.errors["from"] = "give the source the run starts at"
    elif source is None:
        known = ", ".join(r.form.session.source_ids()[:8]) or "none yet"
        r.errors["from"] = f"no source '{src}' in this walk (sources: {known})"
    else:
        r.hints["from"] = f"{source.kind} {source.system.split()[0]}"


def _check_to(r: _Reading) -> None:
    to = r.v["to"].strip()
    dest = r.job.source(to) if to else None
    r.got["to"], r.got["dest"] = to, dest
    if not to:
        r.errors["to"] = "name the load or the panel the run goes to"
    elif dest is not None:
        r.hints["to"] = f"feeds {dest.kind} {dest.id}"
    else:
        r.hints["to"] = "a load; panel? ^o" if not r.v["panel"].strip() else "new source"


def _check_length(r: _Reading) -> None:
    try:
        feet = parse_length(r.v["length"])
        r.got["feet"] = feet
        r.hints["length"] = f"= {fmt_ft(feet)} ft"
        if long_length(feet, r.job.defaults) is not None:  # said, never refused
            r.hints["length"] += f" ⚠ over {r.job.defaults.max_plausible_length_ft:,.0f} ft?"
    except LengthError as exc:
        r.errors["length"] = str(exc) if r.v["length"].strip() else "type the length along the route"


def _check_load(r: _Reading) -> None:
    """The load field read (its voltage and poles too); the ``Load`` itself is made by
    ``_check_kind`` with the kind and the nameplate."""
    text = r.v["load"]
    r.got["load"] = None
    r.got["load_text"] = None
    words, r.got["load_plate"] = split_load(text)
    if text.strip():
        try:
            r.got["load_text"] = read_load_text(words, value_needed=not r.got["load_plate"])
        except LoadError as exc:
            r.errors["load"] = str(exc)
            return
        read = r.got["load_text"]
        if (read.unit == "kVA" and r.got.get("dest") is None and not r.v["panel"].strip()
                and _TRANSFORMER_NAME.match(r.v["to"].strip())):
            # 'T1' with '45kVA': a transformer, whose kVA goes in New panel, or a 45 kVA load
            r.hints["load"] = "a transformer? ^o"


_TRANSFORMER_NAME = re.compile(r"(?i)(?:t|tx|xf|xfmr|xfr)[ -]?\d+[a-z]?$|.*\b(?:transformer|xfmr)s?\b")
"""A run's To that reads as a transformer (``T1``, ``XFMR-2``, ``Transformer T3``): with a load
in kVA and no new panel, the card asks whether the kVA was meant for New panel."""


def _check_kind(r: _Reading) -> None:
    """The kind and the nameplate, and the ``Load`` the three fields make (each mistake named
    at its field)."""
    kind_text = r.v["kind"].strip().lower()
    kind = kind_in(r.v)
    if kind_text and kind_named(kind_text) is None:
        starting = _kinds_starting(kind_text)
        said = (f"'{kind_text}' starts {' and '.join(starting)}; " if starting else "")
        r.errors["kind"] = f"{said}one of {', '.join(vocab.LOAD_KINDS)} (blank: general)"
    else:
        words = vocab.LOAD_KINDS[kind]
        cite = max(words.rfind(" (NEC "), words.rfind(" (common"))
        sections = words[cite + 2:-1] if cite >= 0 else words
        # the kind's sections; its whole name first where only its start was typed
        r.hints["kind"] = sections if kind_text in ("", kind) else f"= {kind}: {sections}"
    try:
        plate = read_nameplate(r.v["plate"])
    except ValueError as exc:
        r.errors["plate"] = str(exc)
        plate = {}
    try:
        in_load = read_nameplate(r.got.get("load_plate", ""))
    except ValueError as exc:
        r.errors.setdefault("load", str(exc))
        in_load = {}
    twice = [_PLATE_TEXT.get(k, k) for k in plate if k in in_load]
    if twice:
        r.errors["plate"] = f"{', '.join(twice)} is typed in Load too; keep one"
    plate = {**in_load, **plate}
    read = r.got.get("load_text")
    if "load" in r.errors or "kind" in r.errors or "plate" in r.errors:
        return
    data: dict[str, object] = dict(plate)
    if read is not None:
        data.update(value=read.value, unit=read.unit, pf=read.pf)
    if kind != "general":
        data["kind"] = kind
    if read is None and not plate and kind == "general":
        if r.got.get("dest") is None and not r.v["panel"].strip():
            r.errors["load"] = "a branch run needs its load (16A, 1.8kVA, 5kW, 10hp)"
        else:
            r.hints["load"] = "what the panel serves"
        return
    try:
        load = Load.model_validate(data)
    except Exception as exc:  # pydantic: each message at its field
        for key, message in _pydantic_fields(exc, prefix="load.").items():
            r.errors.setdefault(key, message)
        return
    r.got["load"] = load
    if plate:
        from gaugewalk.model.walk.equipment import load_words

        r.hints["load" if in_load else "plate"] = load_words(load)[:40]


def _check_panel(r: _Reading) -> None:
    text = r.v["panel"].strip()
    r.got["new_source"] = None
    if not text:
        return
    dest = r.got.get("dest")
    if dest is not None:
        r.errors["panel"] = f"'{r.got['to']}' is already a {dest.kind}; leave this blank"
        return
    try:
        feeding = r.got.get("from_source")
        new = new_source_from(str(r.got["to"]), text,
                              feeding.system if feeding is not None else None)
    except ValueError as exc:
        r.errors["panel"] = str(exc)
        return
    r.got["new_source"] = new
    rating = f" {new.rating_a}A" if new.rating_a is not None else ""
    main = f" main {new.main_a}A" if new.main_a is not None else ""
    kva = f" {new.kva:g}kVA" if new.kva is not None else ""
    said = ("" if new.nonlinear_loads is None
            else " nonlinear" if new.nonlinear_loads else " linear")
    r.hints["panel"] = f"{new.kind} {new.system.split()[0]}{rating}{main}{kva}{said}"


def _check_circuit(r: _Reading) -> None:
    """The circuit as typed or filled in, its voltage and poles in words (``circuit_words``);
    wrong when the load states a voltage or poles it does not give."""
    from gaugewalk.model.engine.circuits import CircuitError, resolve_circuit
    from gaugewalk.model.walk.checks import default_connection

    circuit = r.v["circuit"].strip().upper()
    r.got["connection"] = circuit or None
    r.got["circuit"] = None
    if circuit and circuit not in vocab.CONNECTIONS:
        r.errors["circuit"] = f"one of {', '.join(vocab.CONNECTIONS)} (blank: all the source offers)"
        return
    if "from" in r.errors:
        return
    system = r.got["from_source"].system
    dest = r.got.get("dest") or r.got.get("new_source")   # a source of the walk, or declared here
    conn = circuit or default_connection(system, dest is not None and dest.kind == "transformer")
    try:
        c = resolve_circuit(system, conn)
    except CircuitError as exc:
        r.errors["circuit"] = str(exc)
        return
    r.got["circuit"] = c
    r.hints["circuit"] = ("all: " if not circuit else "") + _short_words(c)
    load = r.got.get("load_text")
    feeder = dest is not None or bool(r.v["panel"].strip())
    if load is not None and load.states_circuit and not feeder:
        try:
            wanted = circuit_for_load(system, load)
        except ValueError as exc:
            r.errors["load"] = str(exc)
            return
        if wanted != conn:
            r.errors["circuit"] = f"{conn} is {circuit_words(c)}; the load says {wanted}"


def _check_yes_no(key: str, name: str) -> Callable[[_Reading], None]:
    def check(r: _Reading) -> None:
        value = yes_no(r.v[key])
        r.got[name] = bool(value)
        if value is None:
            r.errors[key] = "yes or no"
    return check


def _check_rooftop(r: _Reading) -> None:
    """Yes or no; the hint gives what NEC 310.15(B)(2) does to the ambient (nothing for
    XHHW-2, the run's own insulation or the job's)."""
    _check_yes_no("rooftop", "rooftop")(r)
    if r.got["rooftop"]:
        run = r.job.run(r.form.run_id) if r.form.run_id is not None else None
        excepted = rooftop_excepted(r.job.effective(run, "insulation") if run is not None
                                    else r.job.defaults.insulation)
        r.hints["rooftop"] = (f"{excepted}: no adder" if excepted
                              else f"+{ROOFTOP_ADDER_C}C 310.15(B)(2)")


def _check_continuous(r: _Reading) -> None:
    """Yes or no; left blank, what the load's kind makes it (``Run.continuous`` None: an EV
    charger continuous by NEC 625.42, a general load not). The hint says what the kind makes
    it (the walk refuses what its article does not allow, at this field)."""
    _check_yes_no("continuous", "continuous")(r)
    if "continuous" in r.errors:
        return
    if not r.v["continuous"].strip():
        r.got["continuous"] = None
    from gaugewalk.model.engine.sizing.kinds import kind_continuous

    load = r.got.get("load")
    kind = load.kind if load is not None else kind_in(r.v)
    tank = load.tank_gal if load is not None else None
    if kind in ("motor", "fire-pump", "hvac", "welder"):
        r.hints["continuous"] = f"no: the {kind} rules"
    elif kind != "general" and kind_continuous(kind, tank):
        r.hints["continuous"] = f"{kind}: continuous"


def _check_sets(r: _Reading) -> None:
    r.got["sets"] = 1
    if r.v["sets"].strip():
        try:
            sets = int(r.v["sets"])
            if not vocab.MIN_SETS <= sets <= vocab.MAX_SETS:
                raise ValueError
            r.got["sets"] = sets
        except ValueError:
            r.errors["sets"] = vocab.SETS_WORDS


def _check_size(r: _Reading) -> None:
    r.got["size"] = None
    if r.v["size"].strip():
        from gaugewalk.tables.conductor.sizes import parse_size

        try:
            r.got["size"] = parse_size(r.v["size"])
            r.hints["size"] = f"fixed {r.got['size']}"
        except Exception as exc:
            r.errors["size"] = str(exc)


def _check_material(r: _Reading) -> None:
    material = r.v["material"].strip().lower() or None
    r.got["material"] = material
    if material is not None and material not in vocab.MATERIALS:
        r.errors["material"] = f"{vocab.or_words(vocab.MATERIALS)} (blank: the job default)"
    if material is None:
        r.hints["material"] = f"job: {r.job.defaults.material}"


def _check_raceway(r: _Reading) -> None:
    raceway = r.v["raceway"].strip() or None
    r.got["raceway"] = raceway
    if raceway is None:
        r.hints["raceway"] = f"job: {r.job.defaults.raceway}"
        return
    from gaugewalk.model.engine.sizing import resolve_raceway

    try:
        rtype, _, _ = resolve_raceway(raceway)
        r.hints["raceway"] = rtype
    except ValueError as exc:
        r.errors["raceway"] = str(exc)


def _check_place(r: _Reading) -> None:
    """Where the run lands in its panel: a breaker position (the circuit number), or a phase
    (``A``, ``BC``, ``ABC`` ...); blank: placed by the tool to balance the lines. The hint
    names the lines a position takes (rows A, B, C; common practice)."""
    from gaugewalk.model.engine.circuits import SYSTEMS
    from gaugewalk.model.walk.phases import (
        HIGH_LEG,
        HIGH_LEG_WORDS,
        line_count,
        off_high_leg,
        phase_name,
        position_lines,
    )
    from gaugewalk.model.walk.vocabulary import MAX_POSITION, PHASES

    def on_high_leg(lines: tuple[int, ...]) -> bool:   # NEC 110.15, as ``phases.place`` says
        circuit = r.got.get("circuit")
        return ("from" not in r.errors and isinstance(circuit, Circuit) and HIGH_LEG in lines
                and off_high_leg(circuit.neutral, circuit.hots)
                and SYSTEMS[r.got["from_source"].system].high_leg)

    text = r.v["place"].strip().upper()
    r.got["position"] = r.got["phase"] = None
    if not text:
        r.hints["place"] = "placed to balance the lines"
        return
    if text.isdigit():
        position = int(text)
        if not 1 <= position <= MAX_POSITION:
            r.errors["place"] = f"a breaker position from 1 to {MAX_POSITION}"
            return
        r.got["position"] = position
        circuit = r.got.get("circuit")
        if "from" not in r.errors and isinstance(circuit, Circuit):
            n = line_count(r.got["from_source"].system)
            poles = min(circuit.hots, n) if n > 1 else 1
            lines = position_lines(position, poles, n)
            span = "-".join(str(position + 2 * k) for k in range(poles))
            r.hints["place"] = f"{span} on {phase_name(lines)}"
            if on_high_leg(lines):
                r.errors["place"] = f"position {position} {HIGH_LEG_WORDS}"
        return
    if text not in PHASES:
        r.errors["place"] = ("a breaker position (a number) or a phase: "
                             + ", ".join(PHASES) + " (blank: placed by the tool)")
        return
    r.got["phase"] = text
    if on_high_leg(PHASES[text]):
        r.errors["place"] = f"phase {text} {HIGH_LEG_WORDS}"


def _check_raceway_id(r: _Reading) -> None:
    """A shared raceway of the walk (``[[raceway]]``), shown with what is in it now."""
    rid = r.v["raceway_id"].strip() or None
    r.got["raceway_id"] = rid
    if rid is None:
        return
    raceway = r.job.raceway(rid)
    if raceway is None:
        known = ", ".join(x.id for x in r.job.raceways)
        r.errors["raceway_id"] = (f"no shared raceway '{rid}'; the walk has {known}" if known
                                  else f"no shared raceway '{rid}'; add one with "
                                  "'gaugewalk raceway'")
        return
    shared = r.form.session.result.raceways.get(rid) if r.form.session.result else None
    if shared is not None and shared.trade_size:
        r.hints["raceway_id"] = (f"{shared.trade_size} {shared.raceway}, {shared.fill_pct:.0f}% "
                                 f"full, x{shared.adjustment:g}")
    else:
        r.hints["raceway_id"] = f"{raceway.length_ft:g} ft shared"


def _check_id(r: _Reading) -> None:
    run_id = r.v["id"].strip()
    r.got["id"] = run_id
    if not run_id:
        r.errors["id"] = "every run needs an id"
    elif run_id != r.form.run_id and r.job.run(run_id) is not None:
        r.errors["id"] = f"'{run_id}' is taken; next free is {r.job.next_run_id('R')}"


CHECKS: tuple[tuple[str, Callable[[_Reading], None]], ...] = (
    ("from", _check_from),
    ("to", _check_to),
    ("length", _check_length),
    ("load", _check_load),
    ("panel", _check_panel),
    ("kind", _check_kind),
    ("circuit", _check_circuit),
    ("continuous", _check_continuous),
    ("spread", _check_yes_no("spread", "distributed")),
    ("sets", _check_sets),
    ("size", _check_size),
    ("material", _check_material),
    ("raceway", _check_raceway),
    ("place", _check_place),
    ("raceway_id", _check_raceway_id),
    ("rooftop", _check_rooftop),
    ("id", _check_id),
)
"""Each field's check, in an order where a check may use what the earlier ones read."""


def _run_data(r: _Reading) -> dict:
    """The run's fields (walk model names) from what the checks read."""
    g = r.got
    return {
        "id": g["id"], "from": g["from"], "to": g["to"], "length": r.v["length"].strip(),
        "load": g["load"], "continuous": g["continuous"], "distributed": g["distributed"],
        "connection": g["connection"], "sets": g["sets"], "size": g["size"],
        "material": g["material"], "raceway": g["raceway"], "raceway_id": g["raceway_id"],
        "rooftop": g["rooftop"], "notes": r.v["notes"].strip(), "position": g["position"],
        "phase": g["phase"],
    }


_ID_TAIL = re.compile(r"^(.*?)(\d+(?:/\d+)*)$")
"""An id's stem and its closing numbers (``LPA-`` and ``9/11``)."""


def _next_with_stem(job, stem: str) -> str:
    """``stem`` and one past the highest number any id with that stem ends in, as many digits
    as the ids write (``LP2-09`` -> ``LP2-10``, ``LP1-M01`` -> ``LP1-M02``)."""
    used = {r.id for r in job.runs}
    highest = digits = 0
    for rid in used:
        m = _ID_TAIL.match(rid)
        if m and m.group(1) == stem:
            numbers = m.group(2).split("/")
            highest = max(highest, *(int(n) for n in numbers))
            if numbers[0].startswith("0"):
                digits = max(digits, len(numbers[0]))
    n = highest + 1
    while f"{stem}{n:0{digits}d}" in used:
        n += 1
    return f"{stem}{n:0{digits}d}"


class CardForm:
    """One run card: the texts of its fields, which of them the person typed (the others the
    form fills in and keeps following the run), and what they make. ``run_id`` None records a
    new run; else the card edits that run."""

    def __init__(self, session: WalkSession, run_id: str | None = None) -> None:
        self.session = session
        self.run_id = run_id
        self.values: dict[str, str] = {k: "" for k in FIELD_KEYS}
        self.typed: set[str] = set()
        self.restored = False  # the card came back from a draft
        self.last_stored: Run | None = None  # the run this card stored last

    # ----- filling in -------------------------------------------------------------------
    def start(self) -> str | None:
        """Fill the card: the run being edited, the unstored card kept from last time, or a new
        card. Returns the field typing starts in (None: the run to edit is gone)."""
        s = self.session
        if self.run_id is not None:
            run = s.job.run(self.run_id)
            if run is None:
                return None
            self.values = run_to_fields(run)
            return "length"
        if s.draft:
            self._restore(s.draft)
        else:
            self.values = self.fresh(None)
        return self.first_needed()

    def first_needed(self) -> str:
        """Where typing starts on a new or restored card: the first main field still empty or
        wrong (To on a fresh card, whose From is the last run's source)."""
        errors = self.check().errors
        return next((k for k in MAIN_KEYS if k in errors), "to")

    def _restore(self, draft: dict[str, str]) -> None:
        """Bring back an unstored card. The draft keeps texts only, so the fields the card
        fills in (circuit, id...) count as typed only where they differ from what it would fill
        in now; the others follow the run again (a card restored and moved to another source
        takes that source's ids)."""
        self._take_texts(draft)
        self.restored = True

    def _take_texts(self, texts: dict[str, str]) -> None:
        """Fill the card with ``texts``: a field the card fills in counts as typed only where
        it differs from what the card would fill in."""
        self.values = {k: str(texts.get(k, "")) for k in FIELD_KEYS}
        self.typed = {k for k in FIELD_KEYS if k not in FOLLOWING and self.values[k]}
        following = self._following_values(self.values)
        self.typed |= {k for k in FOLLOWING if self.values[k] != following[k]}
        self._follow()

    # ----- a run like the last one ------------------------------------------------------
    def last_run(self) -> Run | None:
        """The run a new card can be made like: the last branch run from the card's source,
        else the run this card stored last, else the walk's last run."""
        source_id = self.values["from"].strip()
        prev = self.session.previous_like(source_id or None)
        if prev is not None and prev.from_ == source_id:
            return prev
        return self.last_stored or prev

    def _next_place(self, run: Run, texts: dict[str, str]) -> str:
        """The breaker position a run like ``run`` (typed as ``texts``) takes next in its source:
        below ``run``'s on its side, where its poles fit (``card_steps.next_position``); blank
        (placed by the tool) when none fits or the circuit is not known."""
        from gaugewalk.model.engine.circuits import CircuitError, resolve_circuit
        from gaugewalk.model.walk.checks import default_connection
        from gaugewalk.model.walk.phases import position_span

        job = self.session.job
        source = job.source(texts["from"].strip())
        if source is None or run.position is None:
            return ""

        def poles(connection: str | None, to: str) -> int:
            dest = job.source(to)
            conn = connection or default_connection(
                source.system, dest is not None and dest.kind == "transformer")
            try:
                return resolve_circuit(source.system, conn).hots
            except CircuitError:
                return 1

        taken = {q for r in job.runs if r.from_ == source.id and r.position is not None
                 for q in position_span(r.position, poles(r.connection, r.to))}
        nxt = next_position(taken, run.position, poles(texts["circuit"].strip().upper() or None,
                                                       texts["to"]), source.spaces)
        return str(nxt) if nxt is not None else ""

    def proposed_to(self) -> str | None:
        """What To proposes on a new card: the name of the last run from the card's source
        stepped on ("Pump 4" after "Pump 3"; ``card_steps``), None when there is none."""
        if self.run_id is not None:
            return None
        prev = self.session.previous_like(self.values["from"].strip() or None)
        if prev is None or prev.from_ != self.values["from"].strip():
            return None
        return step_name(prev.to, self.session.known_names())

    def like(self, run: Run) -> str:
        """Make this new card like ``run``: its fields copied, To stepped on (``proposed_to``),
        the id the next free one, the notes and a new panel left out; what was typed on the
        card already is kept (a name typed first). Returns the field typing goes on in: the
        length, the one thing a run like the last one surely changes (the load when the length
        was typed already)."""
        texts = run_to_fields(run)
        texts["to"] = step_name(run.to, self.session.known_names()) or run.to
        texts["panel"] = texts["notes"] = ""
        kept = {k: self.values[k] for k in self.typed if self.values[k].strip()}
        texts.update(kept)
        if run.position is not None and "place" not in kept:
            texts["place"] = self._next_place(run, texts)
        if "id" not in kept:
            texts["id"] = self._following_values(texts)["id"]
        self._take_texts(texts)
        self.restored = False
        return next((k for k in ("length", "load") if k not in kept), "length")

    def fresh(self, source_id: str | None) -> dict[str, str]:
        """A new card's texts: from ``source_id`` (else the last run's source), with what the
        card fills in for a branch run from it (``_following_values``)."""
        s = self.session
        prev = s.previous_like(source_id)
        values = {k: "" for k in FIELD_KEYS}
        values["from"] = source_id or (prev.from_ if prev else (s.source_ids()[:1] or [""])[0])
        values["spread"] = "no"
        values["rooftop"] = "no"
        values["sets"] = "1"
        values.update(self._following_values(values))
        return values

    def next_card(self, stored: Run, new_source: Source | None) -> str:
        """After ``stored`` was stored: a new card from the same source (from the panel just
        declared, whose runs usually come next). Returns that source id."""
        next_from = new_source.id if new_source is not None else stored.from_
        self.values = self.fresh(next_from)
        self.typed = set()
        self.restored = False
        self.last_stored = stored
        return next_from

    def next_id(self, like: Run | None, feeder: bool = False) -> str:
        """The next free id in the style of the last run from the same source, else ``R`` and a
        number (``F`` and a number for a feeder).

        The style is the id's stem before its closing numbers: ``LP1-7`` -> ``LP1-8``; an id
        ending in circuit positions (``LPA-9/11``) steps past the highest number used with
        that stem (``LPA-12``). A stem naming another source (a run from LPA stored as
        ``LPB-12``) is not this source's style."""
        job = self.session.job
        if feeder:
            return job.next_run_id("F")
        if like is not None:
            m = _ID_TAIL.match(like.id)
            stem = m.group(1) if m else ""
            named = stem.rstrip(" -_./#")
            if stem and not (named != like.from_ and job.source(named) is not None):
                return _next_with_stem(job, stem)
        return job.next_run_id("R")

    def type(self, key: str, text: str) -> dict[str, str]:
        """The person typed ``text`` into ``key``. Returns the fields the form changed on their
        behalf (fields nobody typed in follow the run; on a stored run, continuous follows a
        change of kind)."""
        self.values[key] = text
        self.typed.add(key)
        if key in ("from", "to", "panel", "load", "kind") and self.run_id is None:
            return self._follow()
        if key in ("load", "kind") and "continuous" not in self.typed:
            return self._continuous_follows_kind()
        return {}

    def _continuous_follows_kind(self) -> dict[str, str]:
        """A stored run given another kind: continuous as the new kind's article says
        (``_continuous_of_kind``), else as the run had it where it was of a kind that leaves it
        to the person, else no; returns it where it changed."""
        run = self.session.job.run(self.run_id) if self.run_id is not None else None
        if run is None:
            return {}
        was = run.load.kind if run.load is not None else "general"
        kind = kind_in(self.values)
        if kind == was:
            follows = run_to_fields(run)["continuous"]
        else:
            follows = (_continuous_of_kind(kind)
                       or ("no" if _continuous_of_kind(was) is not None
                           else run_to_fields(run)["continuous"]))
        if self.values["continuous"] == follows:
            return {}
        self.values["continuous"] = follows
        return {"continuous": follows}

    def _follow(self) -> dict[str, str]:
        """Fields nobody typed in follow the run; returns those that changed."""
        following = self._following_values(self.values)
        changed = {}
        for k in FOLLOWING:
            if k not in self.typed and self.values[k] != following[k]:
                self.values[k] = changed[k] = following[k]
        return changed

    def _following_values(self, v: dict[str, str]) -> dict[str, str]:
        """What the fields the card fills in hold for the run as typed in ``v``.

        A feeder's circuit is blank: every hot and the neutral its panel needs (the walk checks
        it delivers the panel's system). A branch run's circuit is never left blank, which
        would mean every hot and the neutral of the source: it is what the load states (its
        voltage, poles or phases), else the last branch run's from the same source when it is
        the same kind of load, else the kind's usual circuit (``default_branch_circuit``); the
        card shows it in words. The
        other fields copy the last branch run from the same source. A kind the card filled in
        is not read back: it follows the load (``10hp`` corrected to ``16A`` is general again)."""
        if "kind" not in self.typed:
            v = {**v, "kind": ""}
        s = self.session
        source_id = v["from"].strip()
        source = s.job.source(source_id)
        feeder = s.job.source(v["to"].strip()) is not None or bool(v["panel"].strip())
        copied = {k: "" for k in COPIED_FROM_PREVIOUS}
        copied["continuous"] = "no"
        same = s.previous_like(source_id) if source is not None else None
        like = same if same is not None and same.from_ == source_id and not s.job.is_feeder(same) else None
        if like is not None:
            copied.update({k: run_to_fields(like)[k] for k in COPIED_FROM_PREVIOUS})
        kind = kind_in(v)
        like_kind = like.load.kind if like is not None and like.load is not None else None
        same_kind = like_kind is None or like_kind == kind
        if feeder or source is None:
            copied["circuit"] = ""
        else:
            stated = None
            try:
                load = read_load_field(v["load"]) if v["load"].strip() else None
                if load is not None and load.states_circuit:
                    stated = circuit_for_load(source.system, load)
            except (LoadError, ValueError):
                stated = None  # the load field says what is wrong
            copied["circuit"] = (stated or (copied["circuit"] if same_kind else "")
                                 or default_branch_circuit(source.system, v))
        copied["id"] = self.next_id(same if same is not None and same.from_ == source_id else None, feeder)
        typed = v.get("kind", "").strip()   # else the kind the load's hp or nameplate says
        copied["kind"] = v.get("kind", "") if typed else ("" if kind == "general" else kind)
        if not same_kind:
            copied["continuous"] = "no"  # an EV charger's continuity is its article's, not a choice
        copied["continuous"] = _continuous_of_kind(kind) or copied["continuous"]
        return copied

    def draft(self) -> dict[str, str] | None:
        """The texts to keep for later (a new card only)."""
        return dict(self.values) if self.run_id is None else None

    # ----- checking ---------------------------------------------------------------------
    def check(self, store_tried: bool = False) -> CardCheck:
        """Check every field, build the run if they allow it and size it in the walk."""
        r = _Reading(self, dict(self.values))
        for _key, check in CHECKS:
            check(r)
        out = CardCheck(feet=r.got.get("feet"), new_source=r.got.get("new_source"))
        out.circuit, out.connection = r.got.get("circuit"), r.got.get("connection") or ""
        run = None
        if not r.errors:
            data = self._keep_unshown(_run_data(r), r.hints)
            try:
                run = Run.model_validate(data)
            except Exception as exc:
                r.errors.update(_pydantic_fields(exc))
        if run is not None:
            preview = self.session.preview(run, replaces=self.run_id, new_source=out.new_source)
            out.result = preview.result
            out.cannot = preview.cannot_size
            out.dip = preview.dip
            if run.load is not None and out.result is not None:
                from gaugewalk.model.walk.equipment import pf_assumed

                out.taken = pf_assumed(run.load, self.session.job.defaults.pf)
            for p in preview.problems:
                key = _CARD_FIELD.get(p.field or "", "to" if p.field is None else "from")
                r.errors.setdefault(key, p.message)
        out.errors, out.hints = r.errors, r.hints
        out.run = run if not r.errors else None
        # an empty field nobody has reached yet is "needed", not wrong
        out.soft = {
            k for k in r.errors
            if not r.v[k].strip() and k not in self.typed and not store_tried
        }
        return out

    def _keep_unshown(self, fields: dict, hints: dict[str, str]) -> dict:
        """The run as the card says, keeping what the card does not show (segments, bends,
        device, overrides...) from the run being edited. A new or re-measured length is dated
        today; segments that no longer add up to a changed length are dropped (undo brings
        them back), and the length field says so."""
        original = self.session.job.run(self.run_id) if self.run_id is not None else None
        if original is None:
            return {**fields, "measured_on": date.today()}
        data = original.model_dump(by_alias=True)
        if fields.get("notes") == shown_plain(original.notes).strip():
            # the card shows a note's control characters escaped (``plain_text``): an untouched
            # note keeps them as the file has them
            fields = {**fields, "notes": original.notes}
        load = fields.get("load")
        fields = {**fields, "load": load.model_dump() if load is not None else None}
        data.update(fields)
        if fields["length"] != original.length:
            data["measured_on"] = date.today()
            if original.segments:
                data["segments"] = []
                hints["length"] = (hints.get("length", "") + f"; drops {len(original.segments)} segments").lstrip("; ")
        return data


_CARD_FIELD = {
    "from": "from", "to": "to", "length": "length", "load": "load", "load.value": "load",
    "load.unit": "load", "load.pf": "load", "load.kind": "kind", "connection": "circuit",
    "sets": "sets", "size": "size", "material": "material", "raceway": "raceway",
    "raceway_id": "raceway_id", "id": "id",
    "continuous": "continuous", "distributed": "spread", "notes": "notes", "rooftop": "rooftop",
    **{f"load.{key}": "plate" for key in vocab.NAMEPLATE_KEYS},
}
"""The card field each walk-model field of a run is typed in."""


def _short_words(circuit) -> str:
    """The circuit in a few characters for beside its field: ``120 V 1-pole+N``."""
    neutral = "+N" if circuit.neutral else ""
    return f"{circuit.volts:g} V {circuit.hots}-pole{neutral}"


def _first_error(exc: Exception) -> str:
    errors = getattr(exc, "errors", None)
    if callable(errors):
        try:
            first = errors()[0]
            return str(first.get("msg", exc)).removeprefix("Value error, ")
        except Exception:
            pass
    return str(exc)


def _pydantic_fields(exc: Exception, prefix: str = "") -> dict[str, str]:
    out: dict[str, str] = {}
    errors = getattr(exc, "errors", None)
    if not callable(errors):
        return {"to": str(exc)}
    for e in errors():
        loc = prefix + ".".join(str(x) for x in e.get("loc", ()))
        loc = loc.rstrip(".")
        key = _CARD_FIELD.get(loc.replace("from_", "from"), _CARD_FIELD.get(loc.split(".")[0], "notes"))
        out.setdefault(key, str(e.get("msg", "")).removeprefix("Value error, "))
    return out or {"to": str(exc)}
