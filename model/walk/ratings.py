"""Panels, switchboards and the service against their ratings, and what a feeder is sized for.

- Loading: the design current of the heaviest line (125 % of its continuous current plus the
  rest, NEC 215.2(A)(1), 230.42(A)(1) for the service) against the bus rating (408.30: not less
  than the load) and the main device (215.3, 408.36; the service disconnect, 230.79); a main
  larger than the bus is a problem (408.36); a panel with main lugs only is protected by its
  feeder's device, which must not exceed the bus rating (408.36). ``utilisation_pct`` is the
  design current over the smaller of the two ratings given.
- Feeder basis (``Defaults.feeder_basis``, ``Run.basis``): ``load`` sizes a feeder for what it
  serves on its heaviest line; ``equipment`` sizes it to the panel it feeds (common practice):
  the device is the panel's main, else its bus rating, and the conductors are protected by it;
  the connected-load answer is kept beside it.

Public API: ``Loading``, ``loading(source, lines)``, ``lugs_bus(source)``, ``lugs_problem(source, feeder_ocpd_a)``,
``FeederRule``, ``equipment_rule(run, target)``.
"""

from typing import NamedTuple

from gaugewalk.model.walk.feeder_loads import Lines
from gaugewalk.model.walk.job import Run, Source
from gaugewalk.model.walk.vocabulary import LINE_NAMES


class Loading(NamedTuple):
    """A source's loading: the heaviest line's design current ``design_a`` [A] on ``line``,
    over ``limit_a`` (the smaller of the bus rating and the main given) [A] as a percent, and
    the problems as (field, sentence)."""

    design_a: float
    line: str
    limit_a: int | None
    utilisation_pct: float | None
    problems: tuple[tuple[str, str], ...]


def loading(source: Source, lines: Lines) -> Loading:
    """The load on ``source`` against its ratings (NEC 408.30, 408.36, 215.3; 230.42(A), 230.79
    for the service)."""
    k, design = lines.heaviest()
    line = LINE_NAMES[k]
    problems: list[tuple[str, str]] = []
    bus, main = source.rating_a, source.main_a
    if source.kind == "transformer":
        return Loading(design, line, None, None, ())
    service = source.kind == "service"
    over_bus = bus is not None and design > bus + 1e-9
    over_main = main is not None and design > main + 1e-9
    if over_bus or over_main:   # the words, only where they are said
        said = (f"its heaviest line ({line}) needs {design:.1f} A (125 % of the continuous load "
                "plus the rest")
        if over_bus:
            rule = "NEC 230.42(A), 230.79" if service else "NEC 408.30"
            problems.append(("rating_a", f"{said}, {rule}): over its {bus} A rating"))
        if over_main:
            rule = "NEC 230.79, 230.90(A)" if service else "NEC 215.3, 408.36"
            problems.append(("main_a", f"{said}, {rule}): over its {main} A main"))
    if main is not None and bus is not None and main > bus:
        problems.append(("main_a", f"its {main} A main is larger than its {bus} A bus rating "
                         "(NEC 408.36)"))
    given = [x for x in (bus, main) if x is not None]
    limit = min(given) if given else None
    util = design / limit * 100.0 if limit else None
    return Loading(design, line, limit, util, tuple(problems))


def lugs_bus(source: Source) -> int | None:
    """NEC 408.36: the bus rating [A] a panel with main lugs only holds its feeder's device to;
    None where the source has a main, is no panel or switchboard, or gives no rating."""
    if source.kind in ("panel", "switchboard") and source.main_a is None:
        return source.rating_a
    return None


def lugs_problem(source: Source, feeder_ocpd_a: int | None) -> str | None:
    """NEC 408.36: a panel with main lugs only is protected by its feeder's device, which must
    not be larger than its bus rating."""
    bus = lugs_bus(source)
    if bus is not None and feeder_ocpd_a is not None and feeder_ocpd_a > bus:
        return (f"main lugs only: its feeder's {feeder_ocpd_a} A device is larger than its "
                f"{bus} A bus rating (NEC 408.36)")
    return None


class FeederRule(NamedTuple):
    """What a feeder is sized for, when a rule other than its load sets it: the ``basis`` in
    words, the device ``ocpd_a`` [A], the least ampacity [A] with no next size up, the current
    it is sized for ``amps`` [A] (None: its load), whether the connected-load answer is kept
    beside it (``beside``), notes, problems and ``bonding``."""

    basis: str
    ocpd_a: int | None = None
    min_ampacity_a: float | None = None
    amps: float | None = None
    beside: bool = False
    notes: tuple[str, ...] = ()
    problems: tuple[str, ...] = ()
    bonding: bool = False
    """A transformer's secondary conductors ahead of their first device: a supply-side bonding
    jumper in place of the EGC, the neutral no smaller (``RunSpec.bonding_jumper``)."""


def equipment_rule(run: Run, target: Source) -> FeederRule | None:
    """The ``equipment`` basis: the feeder's device is the panel's main, else its bus rating
    (common practice); None with neither given (the problem is said by the caller)."""
    rating = target.main_a if target.main_a is not None else target.rating_a
    if rating is None:
        return None
    what = "main" if target.main_a is not None else "bus rating"
    device = run.ocpd_a if run.ocpd_a is not None else rating
    return FeederRule(f"equipment: {target.id}'s {rating} A {what}", device, None, float(rating),
                      True, (f"sized to the equipment it feeds: {target.id}'s {rating} A {what} "
                             "(common practice); the connected-load answer is beside it",))
