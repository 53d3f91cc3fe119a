"""Supply systems and load connections, resolved to the ``Circuit`` the drop formula needs.

A *system* is what the source delivers (``"208Y/120V 3ph 4w"``); a *connection* is how the load
is wired to it (``"LN"`` line-to-neutral, ``"3P"`` three-phase...). ``resolve_circuit`` checks the
system can supply the connection and gives the voltage the drop is measured against, the drop
multiplier, the conductors run and whether the neutral counts as current-carrying
(NEC 310.15(E)).

Besides wyes and the 120/240 V single-phase service: the 240/120 V three-phase 4-wire
high-leg delta (phase B, about 208 V to neutral, is marked orange, NEC 110.15, and never serves a
120 V load: line-to-neutral loads and two-leg multiwire circuits go on A and C), and the
120/208 V single-phase 3-wire system (two phases of a wye and the neutral, as apartment panels
are fed: the neutral of a multiwire circuit on it carries about the phase current).
"""

import math
import re
from typing import NamedTuple

from gaugewalk.model.engine.contract import Circuit
from gaugewalk.model.engine.vocabulary import CONNECTIONS

SQRT3 = math.sqrt(3.0)


class System(NamedTuple):
    """A supply system. ``line_to_line_v`` is the voltage between ungrounded conductors (for a
    2-wire system, between its two wires) [V]; ``line_to_neutral_v`` is None without a neutral
    [V]; ``wires`` counts the neutral."""

    id: str
    line_to_line_v: float
    line_to_neutral_v: float | None
    phases: int
    wires: int
    wye: bool = False        # its hots are phases of a wye: two of them share a neutral that
                             # carries about the phase current (NEC 310.15(E)(2))
    high_leg: bool = False   # a 4-wire delta: phase B is the high leg (NEC 110.15)

    @property
    def has_neutral(self) -> bool:
        return self.line_to_neutral_v is not None

    @property
    def hots(self) -> int:
        """Ungrounded conductors the system offers."""
        return self.wires - (1 if self.has_neutral else 0)


SYSTEMS: dict[str, System] = {
    s.id: s
    for s in (
        System("120V 1ph 2w", 120.0, 120.0, 1, 2),
        System("277V 1ph 2w", 277.0, 277.0, 1, 2),
        System("120/240V 1ph 3w", 240.0, 120.0, 1, 3),
        System("120/208V 1ph 3w", 208.0, 120.0, 1, 3, wye=True),
        System("208Y/120V 3ph 4w", 208.0, 120.0, 3, 4, wye=True),
        System("480Y/277V 3ph 4w", 480.0, 277.0, 3, 4, wye=True),
        System("240/120V 3ph 4w delta", 240.0, 120.0, 3, 4, high_leg=True),
        System("240V 3ph 3w", 240.0, None, 3, 3),
        System("480V 3ph 3w", 480.0, None, 3, 3),
    )
}


LINE_TO_NEUTRAL_VOLTS = frozenset({120.0, 127.0, 277.0, 347.0})
"""Voltages that ``circuit_from_volts`` treats as hot-and-neutral circuits [V] (common practice)."""


_DELTA_WORDS = re.compile(r"\b(?:high\s+leg|delta)\b")


class CircuitError(ValueError):
    """A system that cannot supply a connection, or a system/connection name not understood."""


_SYSTEM_RE = re.compile(
    r"^(?P<v1>\d{3})\s*(?P<y>y)?\s*(?:/\s*(?P<v2>\d{3}))?\s*v?"
    r"(?:\s*,?\s*(?P<ph>[13])\s*(?:ph|phase|p|ø|φ))?"
    r"(?:\s*,?\s*(?P<w>[234])\s*(?:w|wire))?$"
)


def parse_system(text: str) -> str:
    """Read a supply system as people write it and return its id in ``SYSTEMS``.

    Accepts ``208Y/120``, ``480y/277v``, ``120/240``, ``208/120 3ph``, ``480V 3ph 3w``,
    ``120v``, ``277 V 1ph``, ``240/120 delta`` or ``240/120 3ph`` (the high-leg delta),
    ``120/208 1ph`` (two phases of a wye), ``480Y`` (the one wye of that voltage). A bare
    ``240`` or ``480`` is ambiguous (single-phase or
    3-wire three-phase?) unless the phase count is given; ``120/240`` alone is the single-phase
    service and ``120/208`` alone the three-phase wye.

    Raises
    ------
    CircuitError
        With a sentence listing the systems gaugewalk knows.
    """
    raw = " ".join(str(text).strip().lower().replace("-", " ").split())
    if raw in (s.lower() for s in SYSTEMS):
        return next(s for s in SYSTEMS if s.lower() == raw)
    delta = bool(_DELTA_WORDS.search(raw))
    raw = " ".join(_DELTA_WORDS.sub(" ", raw).split())
    m = _SYSTEM_RE.match(raw)
    known = ", ".join(SYSTEMS)
    if not m:
        raise CircuitError(f"'{text}' is not a supply system gaugewalk knows; use one of: {known}")
    v1 = float(m["v1"])
    v2 = float(m["v2"]) if m["v2"] else None
    ph = int(m["ph"]) if m["ph"] else None
    wires = int(m["w"]) if m["w"] else None
    candidates = []
    for sys_ in SYSTEMS.values():
        ll, ln = sys_.line_to_line_v, sys_.line_to_neutral_v
        if v2 is not None:
            pair = {v1, v2}
            if sys_.hots < 2 or ln is None or pair != {ll, ln}:
                continue
        elif v1 != ll and not (sys_.hots == 1 and v1 == ln):
            continue
        if v2 is None and sys_.hots >= 2 and sys_.has_neutral and not m["y"]:
            continue  # "208" alone is not "208Y/120": the neutral (or the Y) must be written
        if (v2 is None and sys_.phases == 3 and ph is None and wires is None and not delta
                and not m["y"]):
            continue  # a bare "240" or "480" does not say three-phase (a Y does)
        if m["y"] and not (sys_.wye and sys_.phases == 3):
            continue  # a Y is a three-phase wye
        if ph is not None and sys_.phases != ph:
            continue
        if wires is not None and sys_.wires != wires:
            continue
        if delta and (sys_.wye or sys_.phases != 3):
            continue
        if sys_.high_leg and not (delta or ph == 3):
            continue  # "120/240" alone is the single-phase service
        if sys_.wye and sys_.phases == 1 and ph != 1 and wires != 3:
            continue  # "120/208" alone is the three-phase wye
        candidates.append(sys_.id)
    if len(candidates) == 1:
        return candidates[0]
    near = [s.id for s in SYSTEMS.values()
            if s.line_to_line_v == v1 and (not m["y"] or (s.wye and s.phases == 3))]
    if not candidates and near and v2 is None:
        raise CircuitError(f"'{text}' is incomplete; did you mean {' or '.join(near)}?")
    if not candidates:
        raise CircuitError(f"'{text}' is not a supply system gaugewalk knows; use one of: {known}")
    raise CircuitError(
        f"'{text}' could be {' or '.join(candidates)}; write the phases and wires (e.g. '3ph 3w')"
    )


def _system(system_id: str) -> System:
    try:
        return SYSTEMS[system_id]
    except KeyError:
        return SYSTEMS[parse_system(system_id)]


def resolve_circuit(system_id: str, connection: str, *, nonlinear: bool = False) -> Circuit:
    """Turn a system and a load connection into a ``Circuit``.

    Parameters
    ----------
    system_id : str
        A key of ``SYSTEMS`` (or text ``parse_system`` understands).
    connection : str
        A key of ``CONNECTIONS``.
    nonlinear : bool
        The load is mostly nonlinear (electronic): on a 3-phase 4-wire wye circuit the neutral
        then carries harmonic current and counts as current-carrying, NEC 310.15(E)(3).

    Notes
    -----
    Drop factor k in VD = k I Z L / 1000: 2 for single-phase two-wire (out and back), sqrt(3)
    for three-phase, 1 for a leg of a balanced multiwire circuit (percent then against the
    line-to-neutral voltage). Neutral counting follows NEC 310.15(E): (1) a neutral carrying only
    the unbalanced current of the other conductors is not counted; (2) the neutral of two phases
    and neutral of a 3-phase 4-wire wye is counted; (3) a 3-phase 4-wire wye neutral is counted
    when the major portion of the load is nonlinear.

    Raises
    ------
    CircuitError
        With a sentence when the system cannot supply the connection.
    """
    sys_ = _system(system_id)
    conn = str(connection).strip().upper()
    if conn not in CONNECTIONS:
        raise CircuitError(
            f"'{connection}' is not a load connection; use one of: {', '.join(CONNECTIONS)}"
        )
    ll, ln = sys_.line_to_line_v, sys_.line_to_neutral_v
    wye = sys_.wye
    high_leg = _HIGH_LEG_NOTE if sys_.high_leg else ()

    def need_neutral(what: str) -> None:
        if not sys_.has_neutral:
            raise CircuitError(f"{sys_.id} has no neutral, so it cannot supply a {what} load.")

    def need_two_hots(what: str) -> None:
        if sys_.hots < 2:
            raise CircuitError(
                f"{sys_.id} has one ungrounded conductor; a {what} load needs two."
            )

    def need_three_phase(what: str) -> None:
        if sys_.phases != 3:
            raise CircuitError(f"{sys_.id} is single-phase, so it cannot supply a {what} load.")

    if conn == "LN":
        need_neutral("line-to-neutral")
        return Circuit(f"{ln:g} V line-to-neutral", ln, 1, ln, 2.0, 1, True, True,
                       notes=high_leg)
    if conn == "LL":
        need_two_hots("line-to-line")
        return Circuit(f"{ll:g} V line-to-line", ll, 1, ll, 2.0, 2, False, False)
    if conn == "LLN":
        need_two_hots("line-to-line-and-neutral")
        need_neutral("line-to-line-and-neutral")
        # 310.15(E)(2): two phases and the neutral of a wye: the neutral carries about the same
        # current as the phases. On 120/240 V 1ph 3w (and A-C of a high-leg delta) it carries
        # only the unbalance: 310.15(E)(1).
        return Circuit(f"{ll:g} V line-to-line with neutral", ll, 1, ll, 2.0, 2, True, wye,
                       notes=high_leg)
    if conn in ("MW", "MW2"):
        need_neutral("multiwire")
        need_two_hots("multiwire")
        assert ln is not None  # need_neutral
        if wye and (conn == "MW2" or sys_.phases == 1):
            return Circuit(f"{ln:g} V multiwire, 2 circuits on a wye", ln, 1, 2 * ln, SQRT3, 2,
                           True, True, 30.0, _TWO_LEGS_OF_A_WYE)
        if sys_.phases == 1 or sys_.high_leg or conn == "MW2":
            return Circuit(f"{ln:g} V multiwire, 2 legs", ln, 1, ll, 1.0, 2, True, False,
                           notes=(_SIMULTANEOUS,) + high_leg)
        return Circuit(f"{ln:g} V multiwire, 3 legs", ln, 3, ll, 1.0, 3, True, nonlinear,
                       notes=(_SIMULTANEOUS,) + (() if nonlinear else _LINEAR_NEUTRAL))
    if conn == "3P":
        need_three_phase("three-phase")
        return Circuit(f"{ll:g} V 3-phase", ll, 3, ll, SQRT3, 3, False, False, notes=high_leg)
    # 3PN
    need_three_phase("three-phase 4-wire")
    need_neutral("three-phase 4-wire")
    if sys_.high_leg:
        # the neutral carries only the unbalance of the 120 V loads on A and C: 310.15(E)(1)
        return Circuit(f"{ll:g}/{ln:g} V 3-phase 4-wire delta", ll, 3, ll, SQRT3, 3, True,
                       False, notes=high_leg)
    return Circuit(f"{ll:g}Y/{ln:g} V 3-phase 4-wire", ll, 3, ll, SQRT3, 3, True, nonlinear,
                   notes=() if nonlinear else _LINEAR_NEUTRAL)


_LINEAR_NEUTRAL = (
    "NEC 310.15(E)(1): the neutral of a 4-wire wye circuit, carrying only the unbalance, is not "
    "counted as current-carrying (the loads taken as linear); where the major portion of the "
    "load is nonlinear (electronic drivers, computers) it counts (310.15(E)(3)), and four "
    "current-carrying conductors in one raceway are then adjusted to 80 %: say so in the job's "
    "settings (Nonlinear, nonlinear_loads) or on the panel (its nonlinear_loads)",)
_SIMULTANEOUS = ("NEC 210.4(B): the hots of a multiwire branch circuit are opened together "
                 "(a multipole breaker or identified handle ties)")
_TWO_LEGS_OF_A_WYE = (
    "two circuits on two phases of a wye share the neutral, which carries about the phase "
    "current and counts as current-carrying (NEC 310.15(E)(2)); the drop of a leg is "
    "sqrt(3) I Z, 30 degrees off its current (the worse leg taken)",
    _SIMULTANEOUS,
)
_HIGH_LEG_NOTE = ("NEC 110.15: phase B of the 4-wire delta is the high leg (about 208 V to "
                  "neutral), marked orange; 120 V loads go on phases A and C",)


def circuit_from_volts(volts: float, phase: int = 1) -> Circuit:
    """A circuit from a voltage and a phase count alone (for ``gaugewalk calc``).

    ``phase`` 1: a two-wire single-phase circuit at ``volts`` (a hot and a neutral at the usual
    line-to-neutral voltages 120, 127, 277 and 347 V, two hots otherwise); ``phase`` 3: a
    three-phase 3-wire circuit with ``volts`` line-to-line [V].
    """
    if not (isinstance(volts, (int, float)) and math.isfinite(volts) and volts > 0):
        raise CircuitError(f"the voltage must be a number above zero, not {volts!r}")
    v = float(volts)
    if phase == 1:
        if v in LINE_TO_NEUTRAL_VOLTS:
            return Circuit(f"{v:g} V single-phase", v, 1, v, 2.0, 1, True, True)
        return Circuit(f"{v:g} V single-phase", v, 1, v, 2.0, 2, False, False)
    if phase == 3:
        return Circuit(f"{v:g} V 3-phase", v, 3, v, SQRT3, 3, False, False)
    raise CircuitError(f"the phase count must be 1 or 3, not {phase!r}")


def current_carrying_conductors(circuit: Circuit) -> int:
    """Current-carrying conductors of one circuit set, NEC 310.15(E): every hot, plus the neutral
    when ``neutral_is_ccc``. The EGC never counts (310.15(F))."""
    return circuit.hots + (1 if circuit.neutral and circuit.neutral_is_ccc else 0)
