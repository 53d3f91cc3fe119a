"""What a walk adds to a fire pump's own rules (NEC 2023 Article 695; the run's own rules are
``gaugewalk.model.engine.sizing.kinds``): where its run starts, the devices of the feeders
above it, and a motor whose name says it is a fire pump. Section numbers from memory.

- Supply (695.3, 230.82(5)): a fire pump is normally supplied by a service of its own or a tap
  ahead of the service disconnecting means. A run from a ``service`` source gets a note saying
  what 230.82(5) asks of such a connection (the walk does not say which side of the service
  disconnect it lands on); a run from a panel or switchboard gets a note naming the feeder that
  supplies it, or saying the walk shows none: 695.3 permits a fire pump on a feeder only in the
  arrangements it lists, so it is stated, not a problem. A transformer on the way to the
  service gets a note that 695.5 rules it (not checked here).
- Feeders above a fire pump (695.4(B)(2)): every overcurrent device in the fire pump's supply
  carries its locked-rotor current indefinitely; where the device serves other loads too, the
  figure is that plus 100 % of the rest, as 695.5(C) words it for a transformer that does. A
  feeder in the walk that supplies fire pumps (directly or through panels, not through a
  transformer, as its motors are gathered: ``gaugewalk.model.walk.motor_feeders``) is checked
  for the sum of their locked-rotor currents (all of them: the larger reading) plus the rest of
  its heaviest line's load at 100 %: a device below that is a problem (a device the code
  requires, which the walk can check), one at or above it a note. A feeder of motors alone
  whose device the tool picks within 430.62(A) is raised to the rating that carries it
  (``fire_pump_device``; said in its notes): Article 695 rules the fire pump's supply, and such
  a feeder's conductors are protected against short circuit only (240.4(G)). A feeder with
  other loads too keeps its conductors held to 240.4 by its device (240.4(A) covers the fire
  pump's circuit only), which is why a fire pump is normally fed ahead of the service
  disconnect.
- A motor whose name reads as a fire pump (``gaugewalk.model.walk.vocabulary.kind_in_name``)
  sized as a plain motor (Article 430: a 250 % breaker, 3 % / 5 % at its running current) is a
  problem on the run: that answer would be confidently wrong for life-safety equipment.

Public API: ``supply_notes(walk, run) -> tuple[str, ...]``, ``feeder_check(fire_pumps, load_a,
ocpd_a) -> (notes, problems)``, ``fire_pump_device(fire_pumps, load_a) -> int | None``,
``named_fire_pump(run) -> str | None``.
"""

from gaugewalk.model.engine.sizing.currents import next_rating
from gaugewalk.model.walk.equipment import name_says
from gaugewalk.model.walk.graph import SupplyGraph
from gaugewalk.model.walk.job import Run
from gaugewalk.model.walk.vocabulary import kind_in_name
from gaugewalk.tables.errors import TableLookupError

_EPS = 1e-9


def named_fire_pump(run: Run) -> str | None:
    """The problem of a run whose load is a plain motor while its name reads as a fire pump,
    or None."""
    if kind_in_name(run.to) != "fire-pump":
        return None
    return (f"{name_says(run)} a fire pump, but its load is sized as a plain motor (NEC "
            f"430: a device at the Table 430.52(C)(1) percentage, the drop at its running "
            f"current): a fire pump's device must carry its locked-rotor current indefinitely "
            f"(695.4(B)(2)(a)(1)) and its drop is held by 695.7; set the load's kind to "
            f"fire-pump (or rename the run if it is not one)")


def supply_notes(walk: SupplyGraph, run: Run) -> tuple[str, ...]:
    """What the walk shows of a fire pump's supply (NEC 695.3, 230.82(5), 695.5), as notes on
    its run: where it starts, the feeder above that, and any transformer on the way up."""
    source = walk.sources.get(run.from_)
    if source is None:
        return ()
    notes: list[str] = []
    if source.kind == "service":
        notes.append(
            f"starts at the service {source.id}: a fire pump is normally supplied by a service "
            f"of its own or by a tap ahead of the service disconnecting means (NEC 695.3(A)(1)); "
            f"connected on the supply side, its conductors need service equipment of their own "
            f"and are installed as service-entrance conductors (230.82(5)), with the "
            f"disconnect of 695.4(B); the walk does not say which side of {source.id}'s "
            f"disconnect this run lands on: confirm it")
    else:
        feeder = walk.feeder.get(source.id)
        where = (f"fed by feeder {feeder.id} from {feeder.from_}" if feeder is not None
                 else "whose supply the walk does not show")
        notes.append(
            f"starts at {source.kind} {source.id}, {where}, not at a service: NEC 695.3 permits "
            f"a fire pump on a feeder only in the arrangements it lists (a service or a tap "
            f"ahead of the service disconnect is the usual supply, 695.3(A)(1), 230.82(5)); "
            f"every overcurrent device in its supply must carry its locked-rotor current "
            f"indefinitely (695.4(B)(2)(a)(1))"
            + (f", checked on {feeder.id} and the feeders above it" if feeder is not None
               else ""))
    seen = {source.id}
    sid = source.id
    while True:
        feeder = walk.feeder.get(sid)
        if feeder is None or feeder.from_ in seen:
            break
        sid = feeder.from_
        seen.add(sid)
        above = walk.sources.get(sid)
        if above is None:
            break
        if above.kind == "transformer":
            notes.append(f"supplied through transformer {above.id}: NEC 695.5 rules a fire "
                         f"pump's transformer (its size and its primary device, which must "
                         f"carry the locked-rotor current); not checked here, nor the feeders "
                         f"above it")
            break
    return tuple(notes)


def fire_pump_device(fire_pumps: tuple[tuple[str, float, float], ...],
                     load_a: float) -> int | None:
    """The smallest standard rating (240.6(A)) that carries ``feeder_check``'s figure for a
    feeder with ``load_a`` on its heaviest line [A]: what a feeder of motors alone is raised to
    where 430.62(A)'s figure falls short of it (NEC 695.4(B)(2)(a)(1)); None past the table."""
    need = _need(fire_pumps, load_a)[0]
    try:
        return next_rating(need - _EPS)
    except TableLookupError:
        return None


def _need(fire_pumps: tuple[tuple[str, float, float], ...],
          load_a: float) -> tuple[float, float]:
    """(the sum of the fire pumps' locked-rotor currents plus the rest of the line's load at
    100 %, that rest) [A]."""
    rest = max(0.0, load_a - sum(f[2] for f in fire_pumps))
    return sum(f[1] for f in fire_pumps) + rest, rest


def feeder_check(fire_pumps: tuple[tuple[str, float, float], ...], load_a: float,
                 ocpd_a: int) -> tuple[tuple[str, ...], tuple[str, ...]]:
    """A feeder supplying the fire pumps ``fire_pumps`` (run id, locked-rotor current [A],
    full-load current [A] each) with ``load_a`` on its heaviest line [A], on a device of
    ``ocpd_a`` [A] (NEC 695.4(B)(2), the rest at 100 % as 695.5(C) words it):
    ``(notes, problems)``."""
    need, rest = _need(fire_pumps, load_a)
    named = ", ".join(f"{rid} {a:.0f} A" for rid, a, _flc in fire_pumps[:4])
    if len(fire_pumps) > 4:
        named += f" and {len(fire_pumps) - 4} more"
    figure = (f"the locked-rotor current of the fire pumps below it ({named}) plus the rest of "
              f"its heaviest line's load at 100 % ({rest:.1f} A): {need:.0f} A")
    try:
        bigger = f"{next_rating(need)} A, the next standard rating up, would carry it"
    except TableLookupError:
        bigger = "no standard rating of 240.6(A) carries it"
    cite = ("NEC 695.4(B)(2)(a)(1) (from memory; the other loads at 100 % as 695.5(C) words it "
            "for a transformer that serves them too)")
    if ocpd_a + _EPS >= need:
        return ((f"{cite}: this feeder's {ocpd_a} A device carries {figure}, as a device in a "
                 f"fire pump's supply must indefinitely",), ())
    return ((), (f"{cite}: a device in a fire pump's supply must carry {figure}, indefinitely; "
                 f"this feeder's {ocpd_a} A device is below it ({bigger}; its conductors would "
                 f"then need protecting from the other loads by 240.4, so a fire pump is "
                 f"normally fed ahead of the service disconnect, 695.3(A)(1), 230.82(5))",))
