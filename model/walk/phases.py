"""Where each run lands in its source: its lines, its breaker positions, and the placement that
balances the lines when the walk does not say.

Lines and positions (common practice, the usual panelboard numbering): odd positions on the left,
even on the right, two to a row; on a three-phase panel rows go A, B, C, A ... (positions 1-2 on
A, 3-4 on B, 5-6 on C); on a single-phase three-wire panel A, B, A ... (1-2 on A, 3-4 on B); a
two-wire source has one line. A circuit of k poles at position p takes p, p+2, ... p+2(k-1), on the
same side, so its lines follow one another: a 2-pole at 5 on a three-phase panel takes 5 (C) and
7 (A), phase CA; a 3-pole at 3 takes B, C and A.

A run's lines come from its ``position``, else from its ``phase``, else the tool places it:
largest load first, each onto the option (line, pair of lines, or rotation of three) that leaves
the heaviest line lightest, weighing each line by the sum of the design currents on it as a
panel schedule adds them, at the lowest free position for it (a longest-first greedy; common
practice). The phasor sums of that placement are compared with those of placing the same runs
in file order, each at the lowest free position, and the better is kept, so placement never
leaves the heaviest line worse than file order. "Heaviest" is the design current per line, 125 %
of the continuous current plus the noncontinuous (NEC 215.2(A)(1)), from the phasor sums of
``gaugewalk.model.walk.feeder_loads``.

Public API:

- ``line_count(system) -> int`` (1, 2 or 3) and ``line_phasors(system) -> tuple[complex, ...]``
  (unit phasors of each line's voltage to the neutral, A at 0 degrees).
- ``position_lines(position, poles, lines)``, ``position_span(position, poles)``,
  ``phase_name(lines)``.
- ``Placement(lines, positions, phase, by)``: ``by`` is ``position`` (from the file),
  ``phase`` (the file's phase, the position picked here) or ``placed`` (both picked here).
- ``PlaceItem``: one run to place (poles, the position and phase the walk gives, its share of
  the line currents for a choice of lines, its size for the greedy order).
- ``place(items, n_lines, spaces) -> PlaceOutcome``: placements, the line sums, and the
  problems (two runs on one position, a position past the spaces, a phase that disagrees).
"""

import cmath
import math
from collections.abc import Callable, Sequence
from dataclasses import field
from operator import attrgetter
from typing import NamedTuple

from gaugewalk.model.engine.circuits import SYSTEMS
from gaugewalk.model.engine.record import record
from gaugewalk.model.walk.vocabulary import LINE_NAMES, PHASES

_EPS = 1e-9

_THREE = (1 + 0j, cmath.rect(1.0, -2 * math.pi / 3), cmath.rect(1.0, 2 * math.pi / 3))


def line_count(system_id: str) -> int:
    """Lines (ungrounded conductors) a source's bus offers: 3, 2 or 1."""
    system = SYSTEMS[system_id]
    return 3 if system.phases == 3 else system.hots


def line_phasors(system_id: str) -> tuple[complex, ...]:
    """Unit phasors of each line's voltage to the neutral (to the wye's star point on a 3-wire
    system), A at 0 degrees: A, B, C at 0, -120 and +120 degrees on three phases; A and B
    opposite (0 and 180 degrees) on a single-phase three-wire system, or 120 degrees apart
    where its line-to-line voltage is sqrt(3) times the line-to-neutral (two hots of a wye)."""
    system = SYSTEMS[system_id]
    if system.phases == 3:
        return _THREE
    if system.hots == 1:
        return (1 + 0j,)
    ln = system.line_to_neutral_v or system.line_to_line_v / 2.0
    if abs(system.line_to_line_v - math.sqrt(3.0) * ln) < 1.0:
        return _THREE[:2]
    return (1 + 0j, -1 + 0j)


def position_lines(position: int, poles: int, n_lines: int) -> tuple[int, ...]:
    """Lines of a ``poles``-pole circuit at ``position`` on a source of ``n_lines`` lines."""
    start = (position - 1) // 2
    return tuple((start + k) % n_lines for k in range(poles))


def position_span(position: int, poles: int) -> tuple[int, ...]:
    """Positions a ``poles``-pole circuit at ``position`` takes: p, p+2, ..."""
    if poles == 1:
        return (position,)
    if poles == 2:
        return (position, position + 2)
    return tuple(range(position, position + 2 * poles, 2))


_PAIRS = {frozenset((0, 1)): "AB", frozenset((1, 2)): "BC", frozenset((0, 2)): "CA"}


def phase_name(lines: Sequence[int]) -> str:
    """``A``, ``AB``, ``CA``, ``ABC`` for lines in pole order (any rotation of three is ``ABC``;
    a 2-pole starting on B of a single-phase panel is ``AB``)."""
    if len(lines) == 3:
        return "ABC"
    if len(lines) == 2:
        return _PAIRS[frozenset(lines)]
    return LINE_NAMES[lines[0]]


class Placement(NamedTuple):
    """Where one run lands: ``lines`` in pole order, the ``positions`` it takes (empty when
    none was free), its ``phase`` word, and ``by`` what decided it: ``position`` (the walk),
    ``phase`` (the walk's phase, the position picked here) or ``placed`` (picked here)."""

    lines: tuple[int, ...]
    positions: tuple[int, ...]
    phase: str
    by: str


Share = Callable[[tuple[int, ...]], Sequence[tuple[int, complex, complex]]]
"""A run's current on each line for a choice of lines: (line, current, continuous part) [A],
phasors in the source's frame."""


class PlaceItem(NamedTuple):
    """One run to place. ``poles`` from its circuit; ``position`` and ``phase`` as the walk gives
    them (None: not given); ``share(lines)`` its line currents; ``size`` orders the greedy
    (largest first); ``mags`` its design current on each of its poles [A], by which the greedy
    weighs the lines; ``balanced``: every rotation of its lines loads them alike (a balanced
    three-phase load), so only the first with a free space is tried; ``each``: for a run
    without a share, whose current on each line k it takes is ``phasor * u[k]`` (a run's own
    load, unless it lies between its two lines), (``phasor`` [A, against its line's
    voltage], whether it is continuous, ``u`` the source's line phasors), worked out only for
    the lines it is placed on (the usual run, placed fastest); ``avoid``: a line it must not
    take (the high leg of a 4-wire delta, for a circuit with a neutral and fewer than three
    hots: NEC 110.15; ``HIGH_LEG``)."""

    key: str
    poles: int
    position: int | None
    phase: str | None
    share: Share | None
    size: float
    mags: tuple[float, ...]
    balanced: bool = False
    each: tuple[complex, bool, tuple[complex, ...]] | None = None
    avoid: int | None = None


HIGH_LEG = 1
"""The line of the high leg on a 4-wire delta: phase B (about 208 V to neutral on 240/120 V,
marked orange, NEC 110.15; common practice)."""
HIGH_LEG_WORDS = ("puts it on the high leg (phase B of the 4-wire delta, about 208 V to "
                  "neutral, NEC 110.15): a circuit using the neutral with fewer than three hots "
                  "goes on A and C")
"""Why a phase or position on the high leg is refused (the walk's problem, the card's error)."""


def off_high_leg(neutral: bool, hots: int) -> bool:
    """Whether a circuit on a 4-wire delta stays off its high leg (NEC 110.15): one that uses the
    neutral with fewer than three hots (its line-to-neutral part would get about 208 V)."""
    return neutral and hots < 3


def share_on(it: PlaceItem, lines: tuple[int, ...]) -> Sequence[tuple[int, complex, complex]]:
    """The line currents of ``it`` on ``lines``: (line, current, continuous part) [A, phasors],
    from its share, or from ``each``."""
    if it.share is not None:
        return it.share(lines)
    assert it.each is not None, "a run to place has a share or its current on each line"
    phasor, continuous, u = it.each
    out = []
    for k in lines:
        t = phasor * u[k]
        out.append((k, t, t if continuous else 0j))
    return out


@record()
class PlaceOutcome:
    """``placements`` {key: Placement}; ``total`` and ``continuous`` per line [A, phasors];
    ``problems`` as (key, field, sentence)."""

    placements: dict[str, Placement] = field(default_factory=dict)
    total: list[complex] = field(default_factory=list)
    continuous: list[complex] = field(default_factory=list)
    problems: list[tuple[str, str, str]] = field(default_factory=list)


def design_line(total: complex, continuous: complex) -> float:
    """A line's design current [A]: 125 % of the continuous current plus the noncontinuous,
    each as a magnitude (NEC 215.2(A)(1); adding magnitudes is the conservative choice where the
    two are not in phase)."""
    return 1.25 * abs(continuous) + abs(total - continuous)


def options(poles: int, n_lines: int) -> tuple[tuple[int, ...], ...]:
    """The choices of lines for a ``poles``-pole circuit, in the order ties are broken."""
    if n_lines == 1:
        return ((0,),)
    if poles == 1:
        return tuple((k,) for k in range(n_lines))
    if n_lines == 2:
        return ((0, 1), (1, 0))
    if poles == 2:
        return ((0, 1), (1, 2), (2, 0))
    return ((0, 1, 2), (1, 2, 0), (2, 0, 1))


class _Spaces:
    """Taken positions and where to look next, for each start line and pole count and for any
    start; positions are never freed, so each search resumes where it stopped."""

    def __init__(self, n_lines: int, spaces: int | None, taken: set[int]) -> None:
        self.n = n_lines
        self.spaces = spaces
        self.taken = set(taken)
        self._next: dict[int, int] = {}
        self._any: dict[int, int] = {}

    def _fits(self, p: int, poles: int) -> bool:
        taken = self.taken
        return p not in taken and (poles == 1 or (p + 2 not in taken
                                                   and (poles == 2 or p + 4 not in taken)))

    def first_free(self, start: int, poles: int) -> int | None:
        """The lowest position whose first pole is on line ``start`` with every pole free and
        within the spaces."""
        key = start * 4 + poles
        index = self._next.get(key, 0)
        n, spaces, taken = self.n, self.spaces, self.taken
        last = 2 * poles - 2   # the last pole's position past the first
        while True:
            p = 2 * (start + n * (index >> 1)) + 1 + (index & 1)
            if spaces is not None and p + last > spaces:
                self._next[key] = index
                return None
            if p not in taken and (poles == 1 or (p + 2 not in taken and (
                    poles == 2 or p + 4 not in taken))):   # ``_fits``, written out
                self._next[key] = index
                return p
            index += 1

    def lowest_free(self, poles: int) -> int | None:
        """The lowest position with every pole free and within the spaces, on any line."""
        p = self._any.get(poles, 1)
        spaces, taken = self.spaces, self.taken
        last = 2 * poles - 2
        while True:
            if spaces is not None and p + last > spaces:
                self._any[poles] = p
                return None
            if p not in taken and (poles == 1 or self._fits(p, poles)):
                self._any[poles] = p
                return p
            p += 1

    def take(self, position: int, poles: int) -> None:
        if poles == 1:
            self.taken.add(position)
        else:
            self.taken.update(range(position, position + 2 * poles, 2))


def _add(total: list[complex], cont: list[complex],
         share: Sequence[tuple[int, complex, complex]]) -> None:
    for k, t, c in share:
        total[k] += t
        cont[k] += c


def _heaviest(total: Sequence[complex], cont: Sequence[complex]) -> float:
    return max(design_line(t, c) for t, c in zip(total, cont, strict=True))


def place(items: Sequence[PlaceItem], n_lines: int, spaces: int | None) -> PlaceOutcome:
    """Place the runs of one source: the walk's positions, then the walk's phases at the lowest
    free positions for them, then the rest to balance the lines (see the module notes)."""
    out = PlaceOutcome(total=[0j] * n_lines, continuous=[0j] * n_lines)
    total, cont = out.total, out.continuous
    owner: dict[int, str] = {}
    rest: list[PlaceItem] = []
    off_high: list[PlaceItem] = []   # placed here, but never on the high leg
    by_phase: list[tuple[PlaceItem, tuple[int, ...]]] = []
    for it in items:
        if it.phase is None and it.position is None:   # the usual run: placed here
            (rest if it.avoid is None else off_high).append(it)
            continue
        stated = _stated_lines(it, n_lines, out.problems)
        if it.avoid is not None and stated is not None and it.avoid in stated:
            out.problems.append((it.key, "phase", f"phase {it.phase} {HIGH_LEG_WORDS}"))
        if it.position is None:
            if stated is not None:
                by_phase.append((it, stated))
            else:
                (rest if it.avoid is None else off_high).append(it)
            continue
        span = position_span(it.position, it.poles)
        lines = position_lines(it.position, it.poles, n_lines)
        if it.avoid is not None and it.avoid in lines and (stated is None
                                                           or it.avoid not in stated):
            out.problems.append((it.key, "position", f"position {it.position} "
                                 f"{HIGH_LEG_WORDS}"))
        if stated is not None and sorted(stated) != sorted(lines):
            out.problems.append((it.key, "phase", f"phase {it.phase} does not agree with "
                                 f"position {it.position}, which is on {phase_name(lines)} "
                                 f"(positions 1-2 on A, 3-4 on B{', 5-6 on C' if n_lines == 3 else ''}; "
                                 "common practice)"))
        clash = [q for q in span if q in owner]
        if clash:
            out.problems.append((it.key, "position", f"position {clash[0]} is already taken by "
                                 f"run {owner[clash[0]]}"))
        if spaces is not None and span[-1] > spaces:
            out.problems.append((it.key, "position", f"position {span[-1]} is past the "
                                 f"{spaces} spaces of its source"))
        for q in span:
            owner.setdefault(q, it.key)
        out.placements[it.key] = Placement(lines, span, phase_name(lines), "position")
        _add(total, cont, share_on(it, lines))
    free = _Spaces(n_lines, spaces, set(owner))
    for it, lines in by_phase:
        p = free.first_free(lines[0], it.poles)
        if p is None:
            out.problems.append((it.key, "position", _no_space(it.poles, lines, spaces)))
            positions: tuple[int, ...] = ()
        else:
            free.take(p, it.poles)
            positions = position_span(p, it.poles)
        out.placements[it.key] = Placement(lines, positions, phase_name(lines), "phase")
        _add(total, cont, share_on(it, lines))
    if off_high:
        _place_off_high(off_high, n_lines, free, out)
    if rest:
        _place_rest(rest, n_lines, spaces, free, out)
    return out


def _place_off_high(items: list[PlaceItem], n_lines: int, free: "_Spaces",
                    out: PlaceOutcome) -> None:
    """The runs that must stay off the high leg, largest first, each onto the lines without it
    that leave the heaviest of them lightest, at the lowest free position (before the rest,
    which then balance around them)."""
    total, cont = out.total, out.continuous
    load = [design_line(t, c) for t, c in zip(total, cont, strict=True)]
    for it in sorted(items, key=_SIZE, reverse=True):
        best = None
        best_worst = 0.0
        for lines in options(it.poles, n_lines):
            if it.avoid in lines:
                continue
            p = free.first_free(lines[0], it.poles)
            if p is None:
                continue
            new = load[:]
            for k, m in zip(lines, it.mags, strict=False):
                new[k] += m
            if best is None or max(new) < best_worst - _EPS:
                best, best_worst = (lines, p), max(new)
        if best is None:
            lines = next(o for o in options(it.poles, n_lines) if it.avoid not in o)
            out.problems.append((it.key, "position", _no_space(it.poles, lines, free.spaces)))
            positions: tuple[int, ...] = ()
        else:
            lines, p = best
            free.take(p, it.poles)
            positions = position_span(p, it.poles)
        for k, m in zip(lines, it.mags, strict=False):
            load[k] += m
        out.placements[it.key] = Placement(lines, positions, phase_name(lines), "placed")
        _add(total, cont, share_on(it, lines))


def _stated_lines(it: PlaceItem, n_lines: int,
                  problems: list[tuple[str, str, str]]) -> tuple[int, ...] | None:
    """The lines of the walk's phase, or None (none given, or one that cannot be: said)."""
    if it.phase is None:
        return None
    lines = PHASES[it.phase]
    if n_lines == 1 and lines != (0,):
        problems.append((it.key, "phase", f"its source has one line, so its phase is A, not "
                         f"{it.phase}"))
        return None
    if any(k >= n_lines for k in lines):
        problems.append((it.key, "phase", f"its source is single-phase (lines A and B), so it "
                         f"cannot be on {it.phase}"))
        return None
    if len(lines) != it.poles:
        problems.append((it.key, "phase", f"phase {it.phase} is {len(lines)} line(s), but its "
                         f"circuit takes {it.poles} pole(s)"))
        return None
    return lines


def _no_space(poles: int, lines: tuple[int, ...], spaces: int | None) -> str:
    return (f"no free {poles}-pole space on {phase_name(lines)} within the {spaces} spaces of "
            "its source")


def _place_rest(rest: list[PlaceItem], n_lines: int, spaces: int | None, free: _Spaces,
                out: PlaceOutcome) -> None:
    """The runs the walk does not place: the greedy, and file order; the better is kept."""
    base_total, base_cont = list(out.total), list(out.continuous)
    file_free = _Spaces(n_lines, spaces, free.taken)
    greedy = _greedy(rest, n_lines, free, list(base_total), list(base_cont))
    plain_worst, plain_at, plain_total, plain_cont = _file_order(
        rest, n_lines, file_free, list(base_total), list(base_cont))
    if plain_worst + _EPS < greedy[0]:
        problems: list[tuple[str, str, str]] = []
        for it, p in zip(rest, plain_at, strict=True):
            if p is None:
                lines = options(it.poles, n_lines)[0]
                problems.append((it.key, "position", _no_space(it.poles, lines, spaces)))
                out.placements[it.key] = Placement(lines, (), _name(lines), "placed")
            else:
                lines = position_lines(p, it.poles, n_lines)
                out.placements[it.key] = Placement(lines, tuple(range(p, p + 2 * it.poles, 2)),
                                                   _name(lines), "placed")
        total, cont = plain_total, plain_cont
    else:
        _, placements, total, cont, problems = greedy
        out.placements.update(placements)
    out.total[:] = total
    out.continuous[:] = cont
    out.problems.extend(problems)


def _greedy(rest: list[PlaceItem], n_lines: int, free: _Spaces, total: list[complex],
            cont: list[complex]):
    """Largest run first onto the option that leaves the heaviest line lightest. Each line's
    load is counted here as the sum of the design currents on it (125 % of the continuous
    currents plus the rest, as magnitudes: the schedule's way, cheap to weigh); the phasor sums
    of the chosen places are then added up, and ``_place_rest`` weighs them against file
    order."""
    placements: dict[str, Placement] = {}
    problems: list[tuple[str, str, str]] = []
    load = [design_line(t, c) for t, c in zip(total, cont, strict=True)]
    first_free = free.first_free
    singles = _SINGLES[n_lines]
    limited = free.spaces is not None
    lines_of = range(n_lines)
    taken, resume = free.taken, free._next
    for it in sorted(rest, key=_SIZE, reverse=True):  # stable: file order among equals
        poles = it.poles
        each = it.each
        if poles == 1 and each is not None and it.phase is None:
            # one pole: the least loaded line with a free position, the first of equals
            if limited:
                k = -1
                at_k = None   # the free position on line k, looked up once
                for j in lines_of:
                    if k < 0 or load[j] < load[k] - _EPS:
                        at_j = first_free(j, 1)
                        if at_j is None:
                            continue
                        k, at_k = j, at_j
                if k < 0:
                    problems.append((it.key, "position", _no_space(1, (0,), free.spaces)))
                    k, at = 0, ()
                else:
                    taken.add(at_k)
                    at = (at_k,)
            else:
                # the same choice without a limit on the spaces, and ``first_free(k, 1)``
                # written out (every run of a walk that places none itself comes here)
                k = 0
                if n_lines > 1:
                    if load[1] < load[0] - _EPS:
                        k = 1
                    if n_lines > 2 and load[2] < load[k] - _EPS:
                        k = 2
                index = resume.get(k * 4 + 1, 0)
                p = 2 * (k + n_lines * (index >> 1)) + 1 + (index & 1)
                while p in taken:
                    index += 1
                    p = 2 * (k + n_lines * (index >> 1)) + 1 + (index & 1)
                resume[k * 4 + 1] = index + 1   # p is taken now: the next search starts past it
                taken.add(p)
                at = (p,)
            load[k] += it.mags[0]
            phasor, continuous, u = each
            t = phasor * u[k]
            total[k] += t
            cont[k] += t if continuous else 0j
            placements[it.key] = _tuple_new(Placement, (singles[k], at, LINE_NAMES[k], "placed"))
            continue
        choices = _OPTIONS[poles][n_lines] if poles <= 3 else options(poles, n_lines)
        mags = it.mags
        best = None
        if not limited:
            # every choice has a free position: weigh the lines alone, then find the position
            # of the one chosen
            if it.balanced:
                lines = choices[0]   # every rotation loads the lines alike: the first
            else:
                best_worst = best_touched = 0.0
                for option in choices:
                    new = load[:]
                    touched = 0.0
                    for k, m in zip(option, mags, strict=False):
                        new[k] += m
                        touched += new[k]
                    worst = max(new)
                    if (best is None or worst < best_worst - _EPS
                            or (worst < best_worst + _EPS and touched < best_touched - _EPS)):
                        best = option
                        best_worst, best_touched = worst, touched
                lines = best
            best = (lines, first_free(lines[0], poles))
        elif it.balanced:
            # every rotation loads the lines alike: the first with a space will do
            for lines in choices:
                p = first_free(lines[0], poles)
                if p is not None:
                    best = (lines, p)
                    break
        else:
            best_worst = best_touched = 0.0
            for lines in choices:
                p = first_free(lines[0], poles)
                if p is None:
                    continue
                new = load[:]
                touched = 0.0
                for k, m in zip(lines, mags, strict=False):
                    new[k] += m
                    touched += new[k]
                worst = max(new)
                if (best is None or worst < best_worst - _EPS
                        or (worst < best_worst + _EPS and touched < best_touched - _EPS)):
                    best = (lines, p)
                    best_worst, best_touched = worst, touched
        if best is None:
            lines = choices[0]
            problems.append((it.key, "position", _no_space(poles, lines, free.spaces)))
            positions: tuple[int, ...] = ()
        else:
            lines, p = best
            # ``position_span`` and ``free.take``
            positions = (p, p + 2, p + 4) if poles == 3 else position_span(p, poles)
            taken.update(positions)
        for k, m in zip(lines, mags, strict=False):
            load[k] += m
        if each is not None:
            phasor, continuous, u = each
            for k in lines:
                t = phasor * u[k]
                total[k] += t
                cont[k] += t if continuous else 0j
        else:
            for k, t, c in share_on(it, lines):
                total[k] += t
                cont[k] += c
        placements[it.key] = _tuple_new(Placement, (lines, positions,
                                                    _NAMES.get(lines) or phase_name(lines),
                                                    "placed"))
    return _heaviest(total, cont), placements, total, cont, problems


_SINGLES = {1: ((0,),), 2: ((0,), (1,)), 3: ((0,), (1,), (2,))}
_OPTIONS = {poles: {n: options(poles, n) for n in (1, 2, 3)} for poles in (1, 2, 3)}
"""``options(poles, n_lines)`` of the usual circuits, looked up."""
_ROTATED = {n: {poles: tuple(tuple((start + j) % n for j in range(poles)) for start in range(n))
                for poles in (1, 2, 3)} for n in (1, 2, 3)}
"""{n_lines: {poles: the lines of a circuit whose first pole is on each line}}, looked up."""
_SIZE = attrgetter("size")
_tuple_new = tuple.__new__


def _file_order(rest: list[PlaceItem], n_lines: int, free: _Spaces, total: list[complex],
                cont: list[complex]):
    """Each run in file order at the lowest free position for its poles: the heaviest design
    current, the position of each (None: no space) and the line sums."""
    at: list[int | None] = []
    lowest_free, take = free.lowest_free, free.take
    taken, resume = free.taken, free._any
    limited = free.spaces is not None
    for it in rest:
        poles = it.poles
        if limited:
            p = lowest_free(poles)
            if p is not None:
                take(p, poles)
        else:
            # ``lowest_free`` and ``take`` written out, without a limit on the spaces
            p = resume.get(poles, 1)
            if poles == 1:
                while p in taken:
                    p += 1
                taken.add(p)
            else:
                while p in taken or p + 2 in taken or (poles > 2 and p + 4 in taken):
                    p += 1
                taken.update(position_span(p, poles))
            resume[poles] = p + 1   # p is taken now: the next search starts past it
        at.append(p)
        start = (p - 1) // 2 if p is not None else 0
        each = it.each
        if poles == 1 and each is not None:
            k = start % n_lines
            phasor, continuous, u = each
            t = phasor * u[k]
            total[k] += t
            cont[k] += t if continuous else 0j
            continue
        lines = _ROTATED[n_lines][poles][start % n_lines] if poles <= 3 else tuple(
            (start + j) % n_lines for j in range(poles))
        if each is not None:
            phasor, continuous, u = each
            for k in lines:
                t = phasor * u[k]
                total[k] += t
                cont[k] += t if continuous else 0j
        else:
            for k, t, c in share_on(it, lines):
                total[k] += t
                cont[k] += c
    return _heaviest(total, cont), at, total, cont


def _name(lines: tuple[int, ...]) -> str:
    return _NAMES.get(lines) or phase_name(lines)


_NAMES = {lines: phase_name(lines) for by_n in _ROTATED.values() for by_poles in by_n.values()
          for lines in by_poles if len(set(lines)) == len(lines)}
_NAMES.update((lines, name) for name, lines in PHASES.items())
"""Phase words of the usual line tuples, looked up before ``phase_name`` works one out."""
