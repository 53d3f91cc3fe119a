"""The takeoff's data: what it takes in (one ``RunMaterial`` per sized run, ``TakeoffSettings``)
and what it gives back (``Takeoff`` with its conductor, raceway and fitting lines)."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import NamedTuple

from gaugewalk.tables.conductor.sizes import size_index
from gaugewalk.tables.order.putups import CUT_SIZES, DEFAULT_PUTUPS, PutUp
from gaugewalk.tables.raceway import install as raceway_install

#: CSV columns of ``Takeoff.to_rows()``, in order: one row per orderable item.
ROW_FIELDS: tuple[str, ...] = ("item", "description", "quantity", "unit")
#: The same with the user's prices.
PRICED_FIELDS: tuple[str, ...] = ROW_FIELDS + ("unit_price", "cost")


class TakeoffError(ValueError):
    """A run or setting the takeoff cannot use; the message names the run and field."""


# --------------------------------------------------------------------------------------------
# Inputs


@dataclass(frozen=True)
class RunMaterial:
    """What the takeoff needs from one sized run. Counts are per parallel set."""

    run_id: str
    length_ft: float                    # [ft] one-way route length
    sets: int                           # parallel sets (NEC 310.10(G))
    material: str                       # "cu" | "al"
    insulation: str                     # e.g. "THHN/THWN-2"
    size: str                           # phase conductor size
    phase_colours: tuple[str, ...]      # one colour per ungrounded conductor
    neutral_size: str | None = None     # None: no neutral
    neutral_colour: str = "white"
    egc_size: str | None = None         # None: no EGC run
    egc_colour: str = "green"
    egc_material: str | None = None     # None: same as ``material``
    raceway: str | None = None          # raceway type; None: not in raceway
    raceway_size: str | None = None     # trade size; None: nothing fits
    bends: int = 0                      # 90-degree bends along the route
    raceway_ft: float | None = None     # [ft] its own raceway (the route less a shared
                                        # raceway's length); None: the whole route

    @property
    def hots(self) -> int:
        return len(self.phase_colours)

    @property
    def own_raceway_ft(self) -> float:
        """Length of the run's own raceway [ft]: the route, less the part in a shared one."""
        return self.length_ft if self.raceway_ft is None else self.raceway_ft


@dataclass(frozen=True)
class SharedRacewayMaterial:
    """What the takeoff needs from one shared raceway: counted once, for its own length."""

    id: str
    raceway: str                        # raceway type
    raceway_size: str | None            # trade size; None: nothing holds its conductors
    length_ft: float                    # [ft] its own route length
    bends: int = 0                      # 90-degree bends along it
    runs: tuple[str, ...] = ()          # ids of the runs in it


@dataclass(frozen=True)
class TakeoffSettings:
    """Job-level numbers the takeoff uses."""

    slack_per_end_ft: float = 2.0       # [ft] per conductor end (common practice)
    waste_pct: float = 5.0              # [%] offcut allowance (common practice)
    putups: tuple[PutUp, ...] = DEFAULT_PUTUPS
    cut_sizes: tuple[str, ...] = CUT_SIZES  # sizes the supplier cuts to length
    pull_every_ft: float = raceway_install.PULL_EVERY_FT  # [ft] pull point on long runs; 0: none
    connectors_per_end: int = raceway_install.CONNECTORS_PER_END
    scheme_sources: tuple[str, ...] = ()  # the colour rules the runs used, for the assumptions


# --------------------------------------------------------------------------------------------
# Outputs


@dataclass(frozen=True)
class PutUpCount:
    """One order line of a conductor: so many pieces of one put-up (or one length cut)."""

    label: str
    length_ft: int      # [ft] of one put-up, or of the length cut
    count: int
    offcut_ft: int = 0  # [ft] left on these pieces once their cuts are made


class Cut(NamedTuple):
    """One conductor of one run and parallel set, as it is cut from a piece."""

    run_id: str
    set_no: int         # 1 to the run's parallel sets
    ft: int             # [ft] route + slack at each end + waste allowance, rounded up


@dataclass(frozen=True)
class Piece:
    """One box, reel or length cut to length, and the cuts that come off it."""

    label: str                  # the put-up's label, or ``CUT_LABEL``
    length_ft: int              # [ft] the put-up's length, or the length cut
    cuts: tuple[Cut, ...]
    cut_to_length: bool = False

    @property
    def used_ft(self) -> int:
        """Feet cut from the piece [ft]."""
        return sum(c.ft for c in self.cuts)

    @property
    def offcut_ft(self) -> int:
        """Feet left on the piece [ft]."""
        return self.length_ft - self.used_ft


@dataclass(frozen=True)
class WireLine:
    """One conductor line of the order: a material, insulation, size, function and colour."""

    material: str
    insulation: str
    size: str
    function: str                   # "phase" | "neutral" | "EGC"
    colour: str
    net_ft: float                   # [ft] sum over runs of (length + 2 slack) x conductors x sets
    waste_pct: float                # [%]
    with_waste_ft: int              # [ft] the cuts added up: each net plus waste, rounded up
    order: tuple[PutUpCount, ...]   # pieces per put-up, then each length cut to length
    order_ft: int                   # [ft] what the pieces add up to
    left_over_ft: int               # [ft] offcut: order_ft - with_waste_ft
    runs: tuple[str, ...]           # run ids contributing
    cuts: tuple[Cut, ...] = ()      # one per run and parallel set, in walk order
    pieces: tuple[Piece, ...] = ()  # the pull list: which cuts come off which piece
    lower_bound_count: int = 0      # fewest pieces any packing of the cuts could use
    lower_bound_offcut_ft: int = 0  # [ft] least offcut any packing could leave
    packing: str = ""               # how the pieces were found


@dataclass(frozen=True)
class RacewayLine:
    """Raceway of one type and trade size."""

    raceway: str
    trade_size: str
    length_ft: float                # [ft] sum of route lengths x sets
    sticks: int | None              # whole sticks; None when sold in coils
    stick_ft: float | None
    basis: str
    runs: tuple[str, ...]
    id: str | None = None           # the shared raceway's id; None: runs' own raceways


@dataclass(frozen=True)
class FittingLine:
    """Couplings, connectors, supports, elbows or pull points for one raceway type and trade size."""

    item: str                       # "coupling", "connector", "support", "90-degree elbow",
                                    # "conduit body", "pull box", "pull box or handhole"
    raceway: str
    trade_size: str
    count: int
    basis: str                      # the rule or assumption it comes from


@dataclass(frozen=True)
class OrderLine:
    """One orderable item."""

    item: str                       # the item code
    description: str
    quantity: int                   # in ``unit``
    unit: str                       # "ft", "each", or how a put-up is sold ("box", "reel", ...)
    section: str                    # "wire", "raceway" or "fitting"
    ft_per_unit: int | None         # [ft] in one unit (a reel's length; 1 for ft); None: fittings


@dataclass(frozen=True)
class SizeFootage:
    material: str
    size: str
    net_ft: float                   # [ft]
    with_waste_ft: int              # [ft]


@dataclass(frozen=True)
class Takeoff:
    """The whole rough takeoff for a job."""

    wire_lines: tuple[WireLine, ...]
    raceway_lines: tuple[RacewayLine, ...]
    fitting_lines: tuple[FittingLine, ...]
    assumptions: tuple[str, ...]
    warnings: tuple[str, ...] = ()    # runs left out or needing attention, by run id
    settings: TakeoffSettings = field(default_factory=TakeoffSettings)
    order_lines: tuple[OrderLine, ...] = ()   # every orderable item once (``order.order_lines``)

    def footage_by_size(self) -> tuple[SizeFootage, ...]:
        """Conductor footage per material and size, smallest size first (copper before aluminum)."""
        net: dict[tuple[str, str], float] = {}
        gross: dict[tuple[str, str], int] = {}
        for line in self.wire_lines:
            key = (line.material, line.size)
            net[key] = net.get(key, 0.0) + line.net_ft
            gross[key] = gross.get(key, 0) + line.with_waste_ft
        out = [SizeFootage(mat, size, round(ft, 1), gross[(mat, size)])
               for (mat, size), ft in net.items()]
        return tuple(sorted(out, key=lambda s: (s.material != "cu", s.material, size_index(s.size))))

    def to_rows(self, priced=None) -> list[dict[str, str | int]]:
        """The order as rows for a spreadsheet, columns ``ROW_FIELDS`` (``PRICED_FIELDS`` with
        ``priced``, a ``prices.PricedOrder`` of ``order_lines``): one row per orderable item, no
        totals rows; text made safe from formula injection (``order.spreadsheet_safe``)."""
        from gaugewalk.model.walk.takeoff.order import spreadsheet_safe
        from gaugewalk.model.walk.takeoff.prices import money

        rows = []
        for i, line in enumerate(self.order_lines):
            row = {"item": line.item, "description": line.description,
                   "quantity": line.quantity, "unit": line.unit}
            if priced is not None:
                p = priced.lines[i]
                row["unit_price"] = money(p.unit_price)
                row["cost"] = money(p.cost)
            rows.append({k: spreadsheet_safe(v) for k, v in row.items()})
        return rows

    def to_dict(self, priced=None) -> dict:
        """Everything, for JSON; with ``priced`` (a ``prices.PricedOrder`` of ``order_lines``)
        the order lines carry unit prices and costs, with ``total_cost`` and ``unpriced``."""
        def wire(w: WireLine) -> dict:
            numbers = {p: i + 1 for i, p in enumerate(w.pieces)}
            piece_of = {c: numbers[p] for p in w.pieces for c in p.cuts}
            return {
                "material": w.material, "insulation": w.insulation, "size": w.size,
                "function": w.function, "colour": w.colour, "net_ft": w.net_ft,
                "waste_pct": w.waste_pct, "with_waste_ft": w.with_waste_ft,
                "order": [{"put_up": p.label, "length_ft": p.length_ft, "count": p.count,
                           "offcut_ft": p.offcut_ft} for p in w.order],
                "order_ft": w.order_ft, "left_over_ft": w.left_over_ft, "runs": list(w.runs),
                "lower_bound_count": w.lower_bound_count,
                "lower_bound_offcut_ft": w.lower_bound_offcut_ft,
                "packing": w.packing,
                "cuts": [{"run": c.run_id, "set": c.set_no, "ft": c.ft, "piece": piece_of[c]}
                         for c in w.cuts],
                "pieces": [{"piece": numbers[p], "put_up": p.label, "length_ft": p.length_ft,
                            "used_ft": p.used_ft, "offcut_ft": p.offcut_ft,
                            "cut_to_length": p.cut_to_length} for p in w.pieces],
            }

        def order(i: int, line: OrderLine) -> dict:
            out = {"item": line.item, "description": line.description,
                   "quantity": line.quantity, "unit": line.unit, "section": line.section}
            if priced is not None:
                p = priced.lines[i]
                out["unit_price"] = None if p.unit_price is None else float(p.unit_price)
                out["cost"] = None if p.cost is None else float(p.cost)
            return out

        data = {
            "wire": [wire(w) for w in self.wire_lines],
            "raceway": [
                {"raceway": r.raceway, "trade_size": r.trade_size, "length_ft": r.length_ft,
                 "sticks": r.sticks, "stick_ft": r.stick_ft, "basis": r.basis, "runs": list(r.runs),
                 "id": r.id}
                for r in self.raceway_lines
            ],
            "fittings": [
                {"item": f.item, "raceway": f.raceway, "trade_size": f.trade_size,
                 "count": f.count, "basis": f.basis}
                for f in self.fitting_lines
            ],
            "order": [order(i, line) for i, line in enumerate(self.order_lines)],
            "footage_by_size": [
                {"material": s.material, "size": s.size, "net_ft": s.net_ft,
                 "with_waste_ft": s.with_waste_ft}
                for s in self.footage_by_size()
            ],
            "assumptions": list(self.assumptions),
            "warnings": list(self.warnings),
        }
        if priced is not None:
            data["total_cost"] = float(priced.total_cost)
            data["unpriced"] = [{"item": u.item, "description": u.description}
                                for u in priced.unpriced]
        return data
