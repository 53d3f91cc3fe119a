"""What each source's lines carry: every load's current summed as phasors, line by line, up the
supply graph, for the feeders, the panels' loading and the transformers.

Each run's current enters its source's lines where it is placed
(``gaugewalk.model.walk.phases``), lagging its voltage by the power-factor angle: a
line-to-neutral load on its line (and back on the neutral); a line-to-line load on both lines,
+I on the first and -I on the second, at the angle of the voltage between them; a three-phase
load, and each leg of a multiwire circuit, on every line it takes at that line's angle. A feeder
carries what its panel's lines carry (rotated where its poles start on another line); a
transformer's primary carries its secondary's currents through its windings (below). The
magnitude of each line's sum is its current. So two 16 A, 120 V loads on a 208Y/120 V panel put
16 A on two lines, not 10.7 A on three (NEC 215.2(A)(1) asks the heaviest line, not the average).

The neutral load (NEC 220.61(A)) is "the maximum net calculated load between the neutral and any
one ungrounded conductor": each line's sum of the currents of the loads that return on the
neutral (those whose circuit has one: line-to-neutral loads, multiwire legs, and loads
line-to-line or three-phase with a neutral, taken in full since their line-to-neutral part is
not known; a feeder given a stated load carries its panel's), the largest of them. Not the
phasor sum of all line currents: a panel of 120 V loads balanced on its three lines has nearly
nothing on the neutral with all of them on, and the full line's current when the others are
off. A feeder carries its panel's neutral sums up
(none through a transformer: the secondary neutral ends at it). Demand factors are not taken
on them (the conservative side).

Transformers: a three-phase transformer with a four-wire (wye) secondary is taken as delta-wye
(common practice for general-purpose dry-type units): winding a of the secondary lies on A-B of
the primary, so the primary line currents are I_A = (I_a - I_c) e^{j30}/n, I_B = (I_b - I_a)
e^{j30}/n, I_C = (I_c - I_b) e^{j30}/n with n the winding ratio V_primary,LL / V_secondary,LN
(the secondary's neutral current circulates in the delta and does not reach the primary); a
three-wire secondary is taken as delta-delta (currents times V_secondary / V_primary). A
single-phase transformer's primary winding carries (I_X1 - I_X2)/2 x V_secondary,LL / V_primary
(a two-wire secondary: I x V_secondary / V_primary), on the two lines (or the line and neutral)
its feeder connects.

Public API:

- ``FeederLoad(va, continuous_va, watts)`` [VA, VA, W], ``feeder_load``, ``ZERO``, ``add``:
  connected load as arithmetic sums (the connected kVA, and the power factor a feeder's drop
  uses).
- ``OwnLoad``: a run's own load on its circuit; ``own_load(run, circuit, default_pf)`` (a load
  of a kind, motor, HVAC..., as ``gaugewalk.model.walk.equipment.feeder_share`` reads it).
- ``Lines``: a source's line sums (``total``, ``continuous`` [A, phasors], ``load``,
  ``has_neutral``) with ``phase_amps``, ``design``, ``heaviest()`` and ``neutral_amps``.
- ``Feed``: what a source's feeder carries (``total``, ``continuous``, ``frame``), with
  ``heaviest()``; ``feed_of(source, lines, primary)``.
- ``sum_source(graph, source_id, circuits, own, feeds, groups=False) -> (PlaceOutcome, Lines)``:
  one source placed and summed from its runs' own loads and the feeds of the sources it feeds;
  with ``groups``, each demand group's part too (``DEMAND_GROUPS``: receptacles, heating,
  cooling; ``Lines.kinds``, ``Feed.kinds``), for ``gaugewalk.model.walk.demand``.
"""

import cmath
import math
from collections.abc import Mapping
from typing import NamedTuple

from gaugewalk.model.engine.circuits import SYSTEMS
from gaugewalk.model.engine.contract import Circuit
from gaugewalk.model.engine.loads import UNITS, LoadError
from gaugewalk.model.walk.equipment import feeder_share, sign_outlet_va
from gaugewalk.model.walk.graph import SupplyGraph
from gaugewalk.model.walk.job import Run, Source
from gaugewalk.model.walk.phases import (
    HIGH_LEG,
    PlaceItem,
    PlaceOutcome,
    Share,
    design_line,
    line_phasors,
    off_high_leg,
    place,
    share_on,
)

SQRT3 = math.sqrt(3.0)
_SHIFT = cmath.rect(1.0, math.pi / 6)   # e^{j30}: a delta-wye secondary leads by 30 degrees


class FeederLoad(NamedTuple):
    """Connected load: apparent power [VA], its continuous part [VA] and real power [W]."""

    va: float
    continuous_va: float
    watts: float


_tuple_new = tuple.__new__


def feeder_load(va: float, continuous_va: float, watts: float) -> FeederLoad:
    """``FeederLoad(va, continuous_va, watts)`` without the keyword handling of its ``__new__``."""
    return _tuple_new(FeederLoad, (va, continuous_va, watts))


def add(a: FeederLoad, b: FeederLoad, sign: float = 1.0) -> FeederLoad:
    """``a + sign * b``, field by field."""
    return feeder_load(a.va + sign * b.va, a.continuous_va + sign * b.continuous_va,
                       a.watts + sign * b.watts)


ZERO = FeederLoad(0.0, 0.0, 0.0)


def va_of(value: float, unit: str, circuit: Circuit, pf: float) -> float:
    """Apparent power of a load [VA]: A times the circuit's volts (times sqrt 3 on three
    phases), VA as given, W divided by the power factor."""
    if unit == "A":
        return value * circuit.line_volts * (SQRT3 if circuit.phases == 3 else 1.0)
    va = value * UNITS[unit]
    return va / pf if unit in ("W", "kW") else va


class OwnLoad:
    """A run's own load on its circuit: the line current ``amps`` [A] as a phasor lagging its
    voltage by the power-factor angle (``phasor``), whether it is ``continuous``, whether it
    lies between two lines (``ll``: line-to-line) or on each line it takes (line-to-neutral,
    multiwire legs, three-phase), and its ``load`` [VA, VA, W]; for placing it, its circuit's
    ``hots``, its design current on each (``mags`` [A]: 125 % of a continuous load, NEC
    215.2(A)(1)) and its ``size`` (the current on all of them [A]), by which the largest loads
    are placed first."""

    __slots__ = ("amps", "phasor", "continuous", "ll", "load", "hots", "mags", "size", "neutral")

    def __init__(self, amps: float, phasor: complex, continuous: bool, ll: bool,
                 load: FeederLoad, hots: int, neutral: bool = False) -> None:
        self.amps = amps
        self.neutral = neutral   # its circuit has a neutral: its current returns on it
        self.phasor = phasor
        self.continuous = continuous
        self.ll = ll
        self.load = load
        self.hots = hots
        self.mags = ((1.25 if continuous else 1.0) * amps,) * hots
        self.size = amps * hots


def own_load(run: Run, circuit: Circuit, default_pf: float) -> OwnLoad | None:
    """A run's own load (None when it gives none: a feeder summing its panel; or when its kind
    cannot be read on the circuit: the run itself says why). A line-to-line load with a neutral
    (``LLN``) is taken between its two lines (its neutral current, from any 120 V parts, is not
    known). A load of a kind other than general is read by
    ``gaugewalk.model.walk.equipment.feeder_share``; a sign counts no less than 1,200 VA
    (``equipment.sign_outlet_va``, NEC 220.14(F))."""
    load = run.load
    if load is None:
        return None
    if load.kind != "general":
        try:
            va, cva, watts = feeder_share(run, circuit, default_pf)
        except LoadError:
            return None
        continuous = cva > 0.0
        pf = min(1.0, watts / va) if va > 0 else 1.0
    else:
        continuous = bool(run.continuous)
        pf = load.pf if load.pf is not None else default_pf
        va = va_of(load.value, load.unit, circuit, pf)
        watts = va * pf
    counted = sign_outlet_va(run, va)   # a sign: no less than 1,200 VA, NEC 220.14(F)
    if counted != va:
        watts *= counted / va
        va = counted
    amps = va / (circuit.line_volts * (SQRT3 if circuit.phases == 3 else 1.0))
    phasor = cmath.rect(amps, -math.acos(min(1.0, pf)))
    ll = circuit.hots == 2 and circuit.phases == 1 and circuit.drop_factor == 2.0
    return OwnLoad(amps, phasor, continuous, ll,
                   feeder_load(va, va if continuous else 0.0, watts), circuit.hots,
                   circuit.neutral)


class _BetweenShare:
    """``PlaceItem.share`` of a run's own load between its two lines (``OwnLoad.ll``) on a
    source whose lines are ``u``: +I on the first and -I on the second, at the angle of the
    voltage between them. (Any other load's current on each line it takes is its phasor at that
    line's angle: ``PlaceItem.each``.)"""

    __slots__ = ("u", "own")

    def __init__(self, u: tuple[complex, ...], own: OwnLoad) -> None:
        self.u = u
        self.own = own

    def __call__(self, lines: tuple[int, ...]) -> list[tuple[int, complex, complex]]:
        own, u = self.own, self.u
        d = u[lines[0]] - u[lines[1]]
        cur = own.phasor * d / abs(d)
        c = cur if own.continuous else 0j
        return [(lines[0], cur, c), (lines[1], -cur, -c)]


class Lines(NamedTuple):
    """What a source's lines carry [A, phasors in its frame: line A's voltage at 0 degrees],
    with the connected ``load``."""

    total: tuple[complex, ...]
    continuous: tuple[complex, ...]
    load: FeederLoad
    has_neutral: bool
    kinds: tuple[tuple[str, "Lines"], ...] = ()
    """The part of the sums from the loads of each demand group (``DEMAND_GROUPS``), below
    this source too; only when asked for (``sum_source(..., groups=True)``)."""
    neutral: tuple[complex, ...] = ()
    """Each line's sum of the currents that return on the neutral [A, phasors] (NEC 220.61(A));
    empty without a neutral."""

    @property
    def phase_amps(self) -> tuple[float, ...]:
        """Each line's current [A], before the 125 % for continuous loads."""
        return tuple(abs(t) for t in self.total)

    @property
    def design(self) -> tuple[float, ...]:
        """Each line's design current [A]: 125 % of its continuous current plus the rest
        (NEC 215.2(A)(1))."""
        return tuple(design_line(t, c) for t, c in zip(self.total, self.continuous, strict=True))

    def heaviest(self) -> tuple[int, float]:
        """(line, its design current [A]) of the line with the largest design current."""
        return _heaviest(self.total, self.continuous)

    @property
    def neutral_amps(self) -> float | None:
        """The neutral load [A]: the largest line-to-neutral load on one line (NEC 220.61(A));
        None without a neutral."""
        return neutral_load(self.neutral) if self.has_neutral else None


def neutral_load(neutral: tuple[complex, ...]) -> float:
    """NEC 220.61(A): the largest of the lines' sums of the currents returning on the neutral
    [A]; 0 where nothing does."""
    return max((abs(x) for x in neutral), default=0.0)


def _heaviest(total, continuous) -> tuple[int, float]:
    best, line = -1.0, 0
    for k, (t, c) in enumerate(zip(total, continuous, strict=True)):
        d = design_line(t, c)
        if d > best + 1e-9:
            best, line = d, k
    return line, max(best, 0.0)


class Feed(NamedTuple):
    """What a source's feeder carries [A, phasors]: per line of the feeder (``frame`` ``lines``:
    in the source's frame, to be rotated onto the lines the feeder takes upstream) or one
    winding current (``frame`` ``winding``: a single-phase transformer's primary, in phase with
    the voltage across the lines it takes)."""

    total: tuple[complex, ...]
    continuous: tuple[complex, ...]
    frame: str
    load: FeederLoad
    kinds: tuple[tuple[str, "Feed"], ...] = ()
    """The part of it from each demand group's loads (``Lines.kinds``), in the same frame."""
    neutral: tuple[complex, ...] = ()
    """Each line's current returning on the neutral (``Lines.neutral``), in the ``lines``
    frame; empty through a transformer and without a neutral."""

    def heaviest(self) -> tuple[int, float, float, float]:
        """(line, design [A], load current [A], continuous current [A]) of the feeder's
        heaviest line. The load current is the continuous plus the noncontinuous magnitude,
        so that 125 % of the one plus the other is the design current (NEC 215.2(A)(1)); it is
        the line's phasor current where the two are in phase, a little more where not."""
        k, design = _heaviest(self.total, self.continuous)
        c = abs(self.continuous[k])
        return k, design, c + abs(self.total[k] - self.continuous[k]), c


class _FeedShare:
    """``PlaceItem.share`` of a feeder carrying ``feed`` from a source whose lines are ``u``."""

    __slots__ = ("u", "feed")

    def __init__(self, u: tuple[complex, ...], feed: Feed) -> None:
        self.u = u
        self.feed = feed

    def __call__(self, lines: tuple[int, ...]) -> list[tuple[int, complex, complex]]:
        u, f = self.u, self.feed
        if f.frame == "winding":
            t, c = f.total[0], f.continuous[0]
            if len(lines) == 2:
                d = u[lines[0]] - u[lines[1]]
                w = d / abs(d)
                return [(lines[0], t * w, c * w), (lines[1], -t * w, -c * w)]
            w = u[lines[0]]
            return [(lines[0], t * w, c * w)]
        out = []
        for k, line in enumerate(lines[:len(f.total)]):
            m = u[line] * u[k].conjugate()
            out.append((line, f.total[k] * m, f.continuous[k] * m))
        return out


def feed_of(source: Source, lines: Lines, primary: Circuit | None) -> tuple[Feed, str | None]:
    """What the feeder of ``source`` carries, given its line sums and (for a transformer) the
    circuit of the feeder into its primary; with a sentence when the transformer's windings
    cannot be worked out from the walk (its load is then taken as balanced on the primary).
    Each demand group's part is carried the same way."""
    feed, why = _feed_of(source, lines, primary)
    if not lines.kinds:
        return feed, why
    kinds = tuple((g, _feed_of(source, part, primary)[0]) for g, part in lines.kinds)
    return Feed(feed.total, feed.continuous, feed.frame, feed.load, kinds, feed.neutral), why


def _feed_of(source: Source, lines: Lines, primary: Circuit | None) -> tuple[Feed, str | None]:
    if source.kind != "transformer" or primary is None:
        return Feed(lines.total, lines.continuous, "lines", lines.load, (), lines.neutral), None
    system = SYSTEMS[source.system]
    t, c = lines.total, lines.continuous
    vp = primary.line_volts
    if primary.phases == 3 and system.phases == 3:
        if system.has_neutral:
            e = _SHIFT * (system.line_to_neutral_v / vp)
            return Feed(_delta_wye(t, e), _delta_wye(c, e), "lines", lines.load), None
        r = system.line_to_line_v / vp
        return Feed(tuple(x * r for x in t), tuple(x * r for x in c), "lines", lines.load), None
    if primary.phases == 1 and system.phases == 1:
        if len(t) == 2:
            r = system.line_to_line_v / primary.volts / 2.0
            return Feed(((t[0] - t[1]) * r,), ((c[0] - c[1]) * r,), "winding", lines.load), None
        r = system.line_to_line_v / primary.volts
        return Feed((t[0] * r,), (c[0] * r,), "winding", lines.load), None
    # a single-phase transformer fed by three hots, or three-phase by fewer: not a real winding
    load = lines.load
    pf = min(1.0, load.watts / load.va) if load.va > 0 else 1.0
    lag = cmath.rect(1.0, -math.acos(pf))
    if primary.phases == 3:
        amps = load.va / (SQRT3 * vp)
        u = line_phasors(_THREE_PHASE)
        cont = load.continuous_va / (SQRT3 * vp)
        feed = Feed(tuple(amps * lag * x for x in u), tuple(cont * lag * x for x in u), "lines",
                    load)
    else:
        feed = Feed((load.va / primary.volts * lag,), (load.continuous_va / primary.volts * lag,),
                    "winding", load)
    return feed, (f"a {'three' if primary.phases == 3 else 'single'}-phase feeder cannot supply "
                  f"a {'single' if system.phases == 1 else 'three'}-phase secondary "
                  f"({source.system}); its load is taken as balanced on the primary")


_THREE_PHASE = "480Y/277V 3ph 4w"


def _delta_wye(x: tuple[complex, ...], e: complex) -> tuple[complex, ...]:
    a, b, c = x
    return ((a - c) * e, (b - a) * e, (c - b) * e)


def sum_source(graph: SupplyGraph, source_id: str, circuits: Mapping[str, Circuit],
               own: Mapping[str, OwnLoad | None], feeds: Mapping[str, Feed],
               groups: bool = False) -> tuple[PlaceOutcome, Lines]:
    """Place the runs of ``source_id`` and sum their currents line by line: each run's own load
    (``own``, from its circuit in ``circuits``), or for a feeder without one what its source
    carries (``feeds``). A run without a circuit or a load adds nothing. ``groups``: the sums
    of each demand group too (``Lines.kinds``), for the demand factors of NEC Article 220."""
    source = graph.sources[source_id]
    u = line_phasors(source.system)
    n = len(u)
    items: list[PlaceItem] = []
    whose: list[tuple[Run, OwnLoad | None]] = []   # each item's run and own load (groups)
    system = SYSTEMS[source.system]
    has_neutral = system.has_neutral
    high = HIGH_LEG if system.high_leg else None   # some circuits stay off it (off_high_leg)
    back: list[tuple[str, complex]] = []   # own loads returning on the neutral (220.61(A))
    back_fed: list[tuple[str, tuple[complex, ...]]] = []   # feeders: their panels' neutral sums
    va = cva = watts = 0.0
    feeder = graph.feeder
    for r in graph.children[source_id]:
        rf = r.__dict__   # fields read from the model's __dict__, once per run (as in compute)
        rid = rf["id"]
        mine = own.get(rid)   # a run has its own load only with its circuit
        share: Share | None
        if mine is not None:
            hots = mine.hots
            load = mine.load
            poles = (hots if hots < n else n) if n > 1 else 1
            if mine.ll and poles == 2:
                share = _BetweenShare(u, mine)
                each = None
            else:   # its current on each line it takes is its phasor at that line's angle
                each = (mine.phasor, mine.continuous, u)
                share = None
            va += load.va
            cva += load.continuous_va
            watts += load.watts
            avoid = high if high is not None and off_high_leg(mine.neutral, hots) else None
            items.append(_tuple_new(PlaceItem, (rid, poles, rf["position"], rf["phase"], share,
                                                mine.size, mine.mags, poles == n, each, avoid)))
            if has_neutral and mine.neutral:
                fed = None
                if hots > 1:   # a feeder at a stated load: its panel's own neutral sums
                    to = rf["to"]
                    fed = feeds.get(to) if feeder.get(to) is r else None
                if fed is not None and fed.frame == "lines":
                    back_fed.append((rid, fed.neutral))
                else:
                    back.append((rid, mine.phasor))
            if groups:
                whose.append((r, mine))
            continue
        circuit = circuits.get(rid)
        if circuit is None:
            continue
        to = rf["to"]
        if feeder.get(to) is r and to in feeds:
            f = feeds[to]
            share = _FeedShare(u, f)
            mags = tuple(design_line(t, c) for t, c in zip(f.total, f.continuous, strict=True))
            if f.frame == "winding":
                mags = mags * circuit.hots
            size = sum(mags)
            load = f.load
        else:
            continue
        va += load.va
        cva += load.continuous_va
        watts += load.watts
        poles = min(circuit.hots, n) if n > 1 else 1
        if has_neutral and circuit.neutral and f.neutral and f.frame == "lines":
            back_fed.append((rid, f.neutral))
        if groups:
            whose.append((r, mine))
        avoid = (high if high is not None and off_high_leg(circuit.neutral, circuit.hots)
                 else None)
        items.append(PlaceItem(rid, poles, rf["position"], rf["phase"], share, size, mags,
                               avoid=avoid))
    outcome = place(items, n, source.spaces)
    kinds = _group_sums(items, whose, outcome, feeds, u, has_neutral) if groups else ()
    neutral = _neutral_sums(back, back_fed, outcome, u) if has_neutral else ()
    lines = Lines(tuple(outcome.total), tuple(outcome.continuous), feeder_load(va, cva, watts),
                  has_neutral, kinds, neutral)
    return outcome, lines


def _neutral_sums(back: list[tuple[str, complex]], back_fed: list[tuple[str, tuple[complex, ...]]],
                  outcome: PlaceOutcome, u: tuple[complex, ...]) -> tuple[complex, ...]:
    """Each line's sum of the currents returning on the neutral [A, phasors] (``Lines.neutral``):
    from ``back``, each run's own load's phasor against the voltage of each line it takes (summed
    per line, then turned to that line's angle), and from ``back_fed``, the neutral sums a feeder
    carries up (in its panel's frame, rotated onto the lines it takes, as ``_FeedShare``)."""
    n = len(u)
    raw = [0j] * n
    placements = outcome.placements
    for rid, phasor in back:
        placed = placements.get(rid)
        if placed is not None:
            for line in placed.lines:
                raw[line] += phasor
    sums = [raw[k] * u[k] for k in range(n)]
    for rid, part in back_fed:
        placed = placements.get(rid)
        if placed is not None:
            for k, line in enumerate(placed.lines[:len(part)]):
                sums[line] += part[k] * u[line] * u[k].conjugate()
    return tuple(sums)


DEMAND_GROUPS = {"receptacle": "receptacle", "heater": "heating", "hvac": "cooling"}
"""The load kinds a demand factor reads, and the group each falls in: receptacles (NEC 220.44),
fixed space heating and air conditioning (the noncoincident loads of NEC 220.60; HVAC
equipment taken as cooling)."""


def _group_sums(items: list[PlaceItem], whose: list[tuple[Run, OwnLoad | None]],
                outcome: PlaceOutcome, feeds: Mapping[str, Feed], u: tuple[complex, ...],
                has_neutral: bool) -> tuple[tuple[str, Lines], ...]:
    """Each demand group's part of the placed sums: the runs of its kinds, and the parts the
    feeders carry up from the sources below."""
    n = len(u)
    sums: dict[str, tuple[list[complex], list[complex], list[float]]] = {}

    def add_to(group: str, share, load: FeederLoad) -> None:
        t, c, v = sums.setdefault(group, ([0j] * n, [0j] * n, [0.0, 0.0, 0.0]))
        for k, dt, dc in share:
            t[k] += dt
            c[k] += dc
        v[0] += load.va
        v[1] += load.continuous_va
        v[2] += load.watts

    for it, (r, mine) in zip(items, whose, strict=True):
        placed = outcome.placements.get(it.key)
        if placed is None or not placed.lines:
            continue
        if mine is not None:
            group = DEMAND_GROUPS.get(r.load.kind) if r.load is not None else None
            if group is None:
                continue
            add_to(group, share_on(it, placed.lines), mine.load)
            continue
        fed = feeds.get(r.to)
        for group, part in fed.kinds if fed is not None else ():
            add_to(group, _FeedShare(u, part)(placed.lines), part.load)
    return tuple((g, Lines(tuple(t), tuple(c), feeder_load(*v), has_neutral))
                 for g, (t, c, v) in sums.items())


