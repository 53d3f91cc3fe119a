"""The design current and the overcurrent device of a run: the seam where the kind of load
decides both.

A ``LoadRule`` turns the load [A] and its continuous share [A] (and a device the user fixed, if
any) into ``Currents``: the design current the conductors must carry at their terminals, the
device rating, and the notes and problems that say why. ``GENERAL`` is the rule for loads no
article of their own covers:

- design current: the noncontinuous load plus 125 % of the continuous load (NEC 210.19(A)(1)(a)
  for branch circuits, 215.2(A)(1)(a) for feeders);
- device: the next standard rating at or above it (240.6(A)); a device the user fixed below it
  is a problem (210.20(A), 215.3). The conductor picked must then be protected by that device
  (240.4(B)-(D), in ``gaugewalk.model.engine.sizing.pick``).

A kind of load with an article of its own (motors, Art. 430; air-conditioning and refrigerating
equipment, Art. 440; electric vehicle supply equipment, Art. 625; welders, Art. 630...) is
another ``LoadRule`` (``gaugewalk.model.engine.sizing.kinds``) with its own design current and
device; where its article lets the device exceed the conductor's ampacity (240.4(G)), the rule
also says how the device limits the pick (``Currents.protection``). ``evaluate`` asks the rule
and picks the conductor from what it answers.

A feeder supplying motors alone is sized by Article 430 Part V instead (``motor_feeder``): its
device is picked from the largest the code permits for it (430.62(A)), and it protects the
conductors without 240.4's limit (240.4(G)).

Public API: ``Currents``, ``LoadRule``, ``GENERAL``, ``forget_general_loads()``,
``motor_feeder(...)``, ``design_current(amps, cont)``, ``next_rating(amps)``, the protection modes ``PROTECTED``, ``BY_ARTICLE``, ``WELDER_CONDUCTORS``.
"""

from bisect import bisect_left
from functools import lru_cache
from typing import NamedTuple, Protocol

from gaugewalk.model.engine.sizing.text import amps_text
from gaugewalk.tables.protection import ocpd as t_ocpd

_EPS = 1e-9
_RATINGS = t_ocpd.STANDARD_RATINGS


def next_rating(amps: float) -> int:
    """NEC 240.6(A) next standard rating at or above ``amps`` (bisect over the table) [A]."""
    i = bisect_left(_RATINGS, amps)
    if i == len(_RATINGS):
        return t_ocpd.next_standard_rating(amps)  # raises with the table's message
    return _RATINGS[i]


PROTECTED = "240.4"
"""The device protects the conductors: NEC 240.4(B)-(D) limit it by their ampacity."""
BY_ARTICLE = "article"
"""The device is the short-circuit and ground-fault device of an article that protects the
conductors from overload otherwise (NEC 240.4(G): Articles 430 and 440): no 240.4 limit."""
WELDER_CONDUCTORS = "630.12(B)"
"""Welder supply conductors: the device at most 200 % of their ampacity (NEC 630.12(B))."""


class Currents(NamedTuple):
    """What a load asks of its circuit: ``design_a`` the conductors must carry at their
    terminals [A], ``ocpd_a`` the device [A], with the notes and problems that say why.

    A load kind's rule may say more (None or the default: the general rule's answer):
    ``corrected_a`` what the conductors must carry after the corrections [A] (general: the load,
    210.19(A)(1)(b)); ``protection`` how the device limits the conductors (``PROTECTED``,
    ``BY_ARTICLE``, ``WELDER_CONDUCTORS``); ``terminal_col`` a terminal column [C] the article
    permits, with ``terminal_why``; ``egc_basis_a`` the rating Table 250.122 is read at [A]
    (default the device); ``device_max_a`` the most the rule permits for the device [A], for its
    margin; ``flc_a`` the motor full-load current [A]; ``rule`` the sections that sized it;
    ``drop_amps_a`` the current the running drop is taken at [A] (default the load; a fire
    pump's 115 % of its full-load current, NEC 695.7(B)); ``lra_a`` the locked-rotor current
    its device is sized to carry [A] (a fire pump, NEC 695.4(B)(2)(a)(1))."""

    design_a: float
    ocpd_a: int
    notes: tuple[str, ...]
    problems: tuple[str, ...]
    corrected_a: float | None = None
    protection: str = PROTECTED
    terminal_col: int | None = None
    terminal_why: str | None = None
    egc_basis_a: int | None = None
    device_max_a: float | None = None
    flc_a: float | None = None
    rule: str = ""
    drop_amps_a: float | None = None
    lra_a: float | None = None


class LoadRule(Protocol):
    """How a kind of load sets the design current and the device."""

    def currents(self, amps: float, continuous_a: float, ocpd_a: int | None) -> Currents:
        """``amps`` the load [A], ``continuous_a`` its continuous share [A], ``ocpd_a`` a device
        the user fixed [A] (None: the rule picks it)."""
        ...


def design_current(amps: float, cont: float) -> float:
    """NEC 210.19(A)(1), 215.2(A)(1): the noncontinuous load [A] plus 125 % of the continuous
    share ``cont`` [A] of ``amps``."""
    return amps - cont + 1.25 * cont


@lru_cache(maxsize=4096)
def _general(amps: float, cont: float, ocpd_a: int | None) -> Currents:
    """``GENERAL.currents``, cached per load, continuous share and given device."""
    notes: list[str] = []
    problems: list[str] = []
    design = design_current(amps, cont)
    if cont > 0:
        rest = f"{amps_text(amps - cont)} + " if amps - cont > _EPS else ""
        notes.append(f"NEC 210.19(A)(1), 215.2(A)(1): {rest}125% of {amps_text(cont)} continuous "
                     f"= {amps_text(design)}")
    if ocpd_a is not None:
        ocpd = ocpd_a
        if ocpd + _EPS < design:
            problems.append(f"the {ocpd} A device is below the {amps_text(design)} the circuit "
                            f"needs (NEC 210.20(A), 215.3)")
    else:
        ocpd = next_rating(design)
        notes.append(f"NEC 210.20(A), 215.3: {ocpd} A device, not below the {amps_text(design)} "
                     f"the circuit needs (the next standard rating, 240.6(A))")
    return Currents(design, ocpd, tuple(notes), tuple(problems),
                    rule="NEC 210.19(A)(1), 210.20(A) (feeders 215.2(A)(1), 215.3)")


def forget_general_loads() -> None:
    """Empty the cache of the general rule's answers (keyed by a run's load), so that the next
    computation is a cold one."""
    _general.cache_clear()


class _GeneralRule:
    """Loads no article of their own covers: NEC 210.19(A)(1), 215.2(A)(1), 210.20(A), 215.3,
    240.6(A)."""

    currents = staticmethod(_general)


GENERAL: LoadRule = _GeneralRule()


def motor_feeder(amps: float, cont: float, ocpd_a: int | None, limit_a: float,
                 bus_a: int | None) -> Currents:
    """A feeder supplying motors alone (NEC 430.24, 430.62(A), 240.4(G)). Its conductors carry
    430.24's current (``cont`` holds the largest motor's, taken at 125 %). Its device, unless the
    user fixed one, is the largest standard rating not above ``limit_a`` [A] (430.62(A): the
    largest branch device of any motor supplied plus the other motors' currents) nor above
    ``bus_a`` [A] (the bus of a main-lugs-only panel it feeds, 408.36), and never below the next
    standard rating over the design current: a feeder device smaller than a motor's own branch
    device would open first when that motor starts (common practice). As the short-circuit and
    ground-fault device of Article 430 Part V it protects the conductors from faults while the
    motors' overload devices protect them from overload, so 240.4's limit does not apply
    (240.4(G)). A device over ``limit_a`` is the caller's problem to say (it knows the motors)."""
    design = design_current(amps, cont)
    floor = next_rating(design)
    base = _general(amps, cont, ocpd_a if ocpd_a is not None else floor)
    notes = list(base.notes)
    ocpd = base.ocpd_a
    if ocpd_a is None:
        cap = limit_a if bus_a is None else min(limit_a, bus_a)
        most = t_ocpd.next_rating_down(cap + _EPS)
        if most is not None and most > floor:
            ocpd = most
            why = (f"the {limit_a:.0f} A it permits" if cap == limit_a else
                   f"the {bus_a} A bus of the main-lugs-only panel it feeds (NEC 408.36; 430.62(A) "
                   f"permits {limit_a:.0f} A)")
            notes.append(f"NEC 430.62(A): {ocpd} A feeder device, the largest standard rating not "
                         f"above {why}; a smaller one could open before the largest motor's own "
                         f"device when that motor starts (common practice)")
        else:
            notes.append(f"NEC 215.3, 430.62(A): {ocpd} A device, the next standard rating over "
                         f"the {amps_text(design)} the feeder needs (240.6(A))")
    notes.append("NEC 240.4(G), Article 430 Part V: the feeder device protects conductors sized "
                 "by 430.24 from short circuit and ground fault, the motors' overload devices "
                 "from overload; 240.4's limit does not apply")
    return Currents(design, ocpd, tuple(notes), base.problems, protection=BY_ARTICLE,
                    device_max_a=limit_a, rule="NEC 430.24, 430.62(A), 240.4(G) (a feeder of "
                    "motors)")
