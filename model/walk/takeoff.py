"""The rough takeoff: conductor footage per size and colour, put-ups to order, raceway and fittings.

Conductor footage of a run is (route length + slack at each end) x conductors x parallel sets,
where the conductors are every ungrounded conductor, the neutral where the circuit has one, and
the EGC at its own size (NEC 250.122(F): each parallel raceway carries its own EGC). Lines are
grouped by material, insulation, size, function and colour; a waste allowance is added and the
result is ordered in the job's put-ups.

Raceway is counted per type and trade size from each run's raceway sizing, one raceway per
parallel set (NEC 310.10(G)(4)); sticks, couplings, connectors, supports (the xxx.30 section of
the raceway's article) and elbows (one per recorded 90-degree bend) follow from it. Every rule is
cited on the line it makes and every assumption is listed in ``Takeoff.assumptions``.

Build one with ``build_takeoff(job, job_result)``; the pure core is ``takeoff_from_runs``.
"""

from __future__ import annotations

import itertools
import math
from dataclasses import dataclass, field
from typing import Iterable, Sequence

from gaugewalk.tables.order import colours as colour_table
from gaugewalk.tables.raceway import install as raceway_install
from gaugewalk.tables.order.putups import DEFAULT_PUTUPS, SOURCE as PUTUP_SOURCE, PutUp, putups_for
from gaugewalk.tables.conductor.sizes import size_index

EGC_PARALLEL_RULE = "NEC 250.122(F)"
PARALLEL_RACEWAY_RULE = "NEC 310.10(G)(4)"
LARGE_MARKING_RULE = "NEC 200.6(B), 250.119(A), 210.5(C), 215.12(C)"

#: CSV columns of ``Takeoff.to_rows()``, in order. Quantities carry their unit in the name.
ROW_FIELDS: tuple[str, ...] = (
    "section", "item", "material", "insulation", "size", "function", "colour",
    "raceway", "trade_size", "net_ft", "waste_pct", "quantity_ft", "quantity_each",
    "left_over_ft", "basis",
)


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

    @property
    def hots(self) -> int:
        return len(self.phase_colours)


@dataclass(frozen=True)
class TakeoffSettings:
    """Job-level numbers the takeoff uses."""

    slack_per_end_ft: float = 2.0       # [ft] per conductor end (common practice)
    waste_pct: float = 5.0              # [%] offcut allowance (common practice)
    putups: tuple[PutUp, ...] = DEFAULT_PUTUPS
    connectors_per_end: int = raceway_install.CONNECTORS_PER_END
    scheme_sources: tuple[str, ...] = ()  # the colour rules the runs used, for the assumptions


# --------------------------------------------------------------------------------------------
# Outputs


@dataclass(frozen=True)
class PutUpCount:
    label: str
    length_ft: int      # [ft] of one put-up
    count: int


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
    with_waste_ft: int              # [ft] net plus waste, rounded up
    order: tuple[PutUpCount, ...]   # empty: no put-up listed for the size (cut to length)
    order_ft: int                   # [ft] what the put-ups add up to (or cut length)
    left_over_ft: int               # [ft] order_ft - with_waste_ft
    runs: tuple[str, ...]           # run ids contributing


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


@dataclass(frozen=True)
class FittingLine:
    """Couplings, connectors, supports or elbows for one raceway type and trade size."""

    item: str                       # "coupling" | "connector" | "support" | "90-degree elbow"
    raceway: str
    trade_size: str
    count: int
    basis: str                      # the rule or assumption it comes from


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

    def to_rows(self) -> list[dict[str, str | int | float]]:
        """Flat rows for a spreadsheet, columns ``ROW_FIELDS``; blank where not applicable. No
        totals rows: every row is one thing to order."""
        rows: list[dict[str, str | int | float]] = []

        def row(**values) -> None:
            rows.append({name: values.get(name, "") for name in ROW_FIELDS})

        for w in self.wire_lines:
            row(section="wire", item="conductor", material=w.material, insulation=w.insulation,
                size=w.size, function=w.function, colour=w.colour, net_ft=w.net_ft,
                waste_pct=w.waste_pct, quantity_ft=w.with_waste_ft, left_over_ft=w.left_over_ft,
                basis="(length + 2 x slack) x conductors x sets, plus waste")
            if not w.order:
                row(section="wire order", item="cut to length", material=w.material,
                    insulation=w.insulation, size=w.size, function=w.function, colour=w.colour,
                    quantity_ft=w.order_ft, quantity_each=1,
                    basis="no put-up listed for this size")
            for p in w.order:
                row(section="wire order", item=p.label, material=w.material,
                    insulation=w.insulation, size=w.size, function=w.function, colour=w.colour,
                    quantity_ft=p.length_ft * p.count, quantity_each=p.count, basis=PUTUP_SOURCE)
        for r in self.raceway_lines:
            row(section="raceway", item=r.raceway, raceway=r.raceway, trade_size=r.trade_size,
                quantity_ft=r.length_ft, quantity_each="" if r.sticks is None else r.sticks,
                basis=r.basis)
        for f in self.fitting_lines:
            row(section="fitting", item=f.item, raceway=f.raceway, trade_size=f.trade_size,
                quantity_each=f.count, basis=f.basis)
        return rows

    def to_dict(self) -> dict:
        """Everything, for JSON."""
        def wire(w: WireLine) -> dict:
            return {
                "material": w.material, "insulation": w.insulation, "size": w.size,
                "function": w.function, "colour": w.colour, "net_ft": w.net_ft,
                "waste_pct": w.waste_pct, "with_waste_ft": w.with_waste_ft,
                "order": [{"put_up": p.label, "length_ft": p.length_ft, "count": p.count}
                          for p in w.order],
                "order_ft": w.order_ft, "left_over_ft": w.left_over_ft, "runs": list(w.runs),
            }
        return {
            "wire": [wire(w) for w in self.wire_lines],
            "raceway": [
                {"raceway": r.raceway, "trade_size": r.trade_size, "length_ft": r.length_ft,
                 "sticks": r.sticks, "stick_ft": r.stick_ft, "basis": r.basis, "runs": list(r.runs)}
                for r in self.raceway_lines
            ],
            "fittings": [
                {"item": f.item, "raceway": f.raceway, "trade_size": f.trade_size,
                 "count": f.count, "basis": f.basis}
                for f in self.fitting_lines
            ],
            "footage_by_size": [
                {"material": s.material, "size": s.size, "net_ft": s.net_ft,
                 "with_waste_ft": s.with_waste_ft}
                for s in self.footage_by_size()
            ],
            "assumptions": list(self.assumptions),
            "warnings": list(self.warnings),
        }


# --------------------------------------------------------------------------------------------
# Arithmetic


def conductor_footage(length_ft: float, slack_per_end_ft: float, conductors: int, sets: int) -> float:
    """(length + slack at each end) x conductors x parallel sets [ft]."""
    return (length_ft + 2.0 * slack_per_end_ft) * conductors * sets


def _with_waste(net_ft: float, waste_pct: float) -> int:
    # round before ceil so 100 ft + 10 % is 110 ft, not 111 ft from binary fractions
    return math.ceil(round(net_ft * (1.0 + waste_pct / 100.0), 6))


def order_putups(need_ft: int, putups: Sequence[PutUp]) -> tuple[tuple[PutUpCount, ...], int]:
    """Put-ups covering ``need_ft`` [ft] with the least left over, then the fewest pieces.

    Returns the counts (largest put-up first, zero counts left out) and the total ordered [ft].
    No put-ups: nothing to count, the need is cut to length. Exact: in a best order each shorter
    put-up appears fewer than lcm(its length, longest length) / its length times, since that many
    could be swapped for fewer longest put-ups of the same total.
    """
    if need_ft <= 0:
        return (), 0
    usable = sorted({p.length_ft: p for p in putups}.values(), key=lambda p: p.length_ft)
    if not usable:
        return (), need_ft
    longest = usable[-1]
    shorter = usable[:-1]
    bounds = [
        range(min(math.ceil(need_ft / p.length_ft),
                  math.lcm(p.length_ft, longest.length_ft) // p.length_ft - 1, 50) + 1)
        for p in shorter
    ]
    best: tuple | None = None
    for counts in itertools.product(*bounds):
        got = sum(c * p.length_ft for c, p in zip(counts, shorter))
        n_long = max(0, math.ceil((need_ft - got) / longest.length_ft))
        total = got + n_long * longest.length_ft
        key = (total - need_ft, sum(counts) + n_long, tuple(reversed(counts)))
        if best is None or key < best[0]:
            best = (key, counts + (n_long,), total)
    assert best is not None
    _, counts, total = best
    chosen = tuple(
        PutUpCount(p.label, p.length_ft, c)
        for p, c in sorted(zip(usable, counts), key=lambda pc: -pc[0].length_ft)
        if c
    )
    return chosen, total


def phase_colours_for(scheme: colour_table.ColourScheme, hots: int, neutral: bool) -> tuple[str, ...]:
    """Colours of a circuit's ungrounded conductors, taken in phase order A, B, C.

    On a high-leg delta a circuit with a neutral and fewer than three hots uses A and C: the
    high leg (B, orange, NEC 110.15) is not used for line-to-neutral loads (common practice:
    it is about 208 V to neutral)."""
    if hots > len(scheme.phases):
        raise TakeoffError(
            f"{hots} ungrounded conductors but the {scheme.label} scheme has "
            f"{len(scheme.phases)} phase colours"
        )
    order = list(range(len(scheme.phases)))
    if scheme.key == "240/120 delta" and neutral and hots < 3:
        order = [0, 2, 1]
    return tuple(scheme.phases[i] for i in order[:hots])


def takeoff_from_runs(runs: Iterable[RunMaterial], settings: TakeoffSettings = TakeoffSettings()) -> Takeoff:
    """The takeoff of the given runs: the pure core of ``build_takeoff``."""
    runs = list(runs)
    slack = settings.slack_per_end_ft
    waste = settings.waste_pct
    warnings: list[str] = []

    # -- conductors ------------------------------------------------------------------------
    wire_net: dict[tuple[str, str, str, str, str], float] = {}
    wire_runs: dict[tuple[str, str, str, str, str], list[str]] = {}

    def add_wire(run: RunMaterial, material: str, size: str, function: str, colour: str, n: int) -> None:
        insulation = "bare" if colour == "bare" else run.insulation
        key = (material, insulation, size, function, colour)
        wire_net[key] = wire_net.get(key, 0.0) + conductor_footage(run.length_ft, slack, n, run.sets)
        ids = wire_runs.setdefault(key, [])
        if run.run_id not in ids:
            ids.append(run.run_id)

    for run in runs:
        if run.length_ft < 0 or run.sets < 1:
            raise TakeoffError(f"run {run.run_id}: length and sets must be positive")
        for colour in run.phase_colours:
            add_wire(run, run.material, run.size, "phase", colour, 1)
        if run.neutral_size is not None:
            add_wire(run, run.material, run.neutral_size, "neutral", run.neutral_colour, 1)
        if run.egc_size is not None:
            add_wire(run, run.egc_material or run.material, run.egc_size, "EGC", run.egc_colour, 1)

    function_order = {"phase": 0, "neutral": 1, "EGC": 2}
    first_seen = {key: i for i, key in enumerate(wire_net)}  # phase colours stay in A, B, C order
    wire_lines = []
    for key in sorted(wire_net, key=lambda k: (k[0] != "cu", k[0], size_index(k[2]), k[1],
                                               function_order[k[3]], first_seen[k])):
        material, insulation, size, function, colour = key
        net = wire_net[key]
        need = _with_waste(net, waste)
        order, order_ft = order_putups(need, putups_for(size, settings.putups))
        wire_lines.append(WireLine(
            material, insulation, size, function, colour, round(net, 1), waste, need,
            order, order_ft, order_ft - need, tuple(wire_runs[key]),
        ))

    # -- raceway and fittings --------------------------------------------------------------
    race_len: dict[tuple[str, str], float] = {}
    race_runs: dict[tuple[str, str], list[str]] = {}
    fittings: dict[tuple[str, str, str], int] = {}
    fitting_basis: dict[tuple[str, str, str], str] = {}
    families: dict[str, raceway_install.InstallRule] = {}

    def add_fitting(item: str, raceway: str, trade: str, count: int, basis: str) -> None:
        key = (item, raceway, trade)
        fittings[key] = fittings.get(key, 0) + count
        fitting_basis[key] = basis

    for run in runs:
        if run.raceway is None:
            continue
        if run.raceway_size is None:
            warnings.append(
                f"run {run.run_id}: no {run.raceway} trade size holds its conductors; "
                f"its raceway and fittings are left out of the takeoff"
            )
            continue
        try:
            rule = raceway_install.install_rule(run.raceway)
            spacing = rule.max_spacing_ft(run.raceway_size)
        except (KeyError, ValueError) as exc:
            warnings.append(f"run {run.run_id}: raceway left out: {exc.args[0]}")
            continue
        families[rule.family] = rule
        key = (run.raceway, run.raceway_size)
        race_len[key] = race_len.get(key, 0.0) + run.length_ft * run.sets
        race_runs.setdefault(key, []).append(run.run_id)
        if rule.stick_ft is not None and not rule.coupling_attached:
            add_fitting("coupling", *key,
                        raceway_install.joints_for(run.length_ft, rule.stick_ft) * run.sets,
                        f"one per joint between lengths; {rule.stick_source}")
        add_fitting("connector", *key, 2 * settings.connectors_per_end * run.sets,
                    f"{settings.connectors_per_end} per raceway end (takeoff assumption)")
        if spacing is not None:
            add_fitting("support", *key,
                        raceway_install.supports_for(run.length_ft, rule.end_ft, spacing) * run.sets,
                        f"{rule.support_source} ({spacing:g} ft at trade size {run.raceway_size})")
        if run.bends:
            add_fitting("90-degree elbow", *key, run.bends * run.sets,
                        "one per 90-degree bend recorded on the walk")
            degrees = run.bends * raceway_install.DEGREES_PER_BEND
            if degrees > raceway_install.MAX_BEND_DEGREES:
                warnings.append(
                    f"run {run.run_id}: {run.bends} bends ({degrees} degrees) exceed "
                    f"{raceway_install.MAX_BEND_DEGREES} degrees between pull points "
                    f"({rule.bends_section}) unless a pull point (box or conduit body) "
                    f"breaks the route"
                )

    def race_sort(key: tuple[str, str]) -> tuple[str, float]:
        return (key[0], raceway_install.trade_size_value(key[1]))

    raceway_lines = []
    for key in sorted(race_len, key=race_sort):
        rule = raceway_install.install_rule(key[0])
        length = round(race_len[key], 1)
        sticks = None if rule.stick_ft is None else raceway_install.sticks_for(length, rule.stick_ft)
        raceway_lines.append(RacewayLine(
            key[0], key[1], length, sticks, rule.stick_ft, rule.stick_source, tuple(race_runs[key]),
        ))
    item_order = {"coupling": 0, "connector": 1, "support": 2, "90-degree elbow": 3}
    fitting_lines = tuple(
        FittingLine(item, raceway, trade, fittings[(item, raceway, trade)],
                    fitting_basis[(item, raceway, trade)])
        for item, raceway, trade in sorted(
            fittings, key=lambda k: (race_sort((k[1], k[2])), item_order[k[0]]))
        if fittings[(item, raceway, trade)] > 0
    )

    return Takeoff(
        tuple(wire_lines), tuple(raceway_lines), fitting_lines,
        _assumptions(settings, families, any(r.sets > 1 for r in runs),
                     any(r.egc_size for r in runs), wire_lines),
        tuple(warnings), settings,
    )


def _size_span(sizes: tuple[str, ...]) -> str:
    """"14 AWG to 10 AWG" for a run of consecutive sizes, else the sizes listed."""
    from gaugewalk.tables.conductor.sizes import SIZES

    idx = sorted(size_index(s) for s in sizes)
    if len(idx) > 2 and idx == list(range(idx[0], idx[-1] + 1)):
        return f"{SIZES[idx[0]]} to {SIZES[idx[-1]]}"
    return ", ".join(SIZES[i] for i in idx)


def _assumptions(settings: TakeoffSettings, families: dict[str, raceway_install.InstallRule],
                 parallel: bool, any_egc: bool, wire_lines: list[WireLine]) -> tuple[str, ...]:
    out = [
        f"Conductor length per run = (route length + {settings.slack_per_end_ft:g} ft slack at each "
        f"end) x conductors x parallel sets; slack per end is the job's setting (common practice).",
        "Conductors counted: every ungrounded conductor, the neutral where the circuit has one, "
        "and the EGC at its own size.",
        f"Waste allowance {settings.waste_pct:g} % added to each line, rounded up to whole feet "
        f"(the job's setting).",
        "Put-ups chosen to leave the least over, then the fewest pieces; pieces are cut from any "
        "put-up of the line. Put-up lengths: "
        + (PUTUP_SOURCE if settings.putups == DEFAULT_PUTUPS else "as the job lists them")
        + ": " + "; ".join(f"{p.label} ({_size_span(p.sizes)})" for p in settings.putups) + ".",
        "Phase colours are assigned in phase order A, B, C per circuit; balance them against the "
        "panel schedule.",
    ]
    out += [f"Colour: {source}." for source in settings.scheme_sources]
    if any(size_index(w.size) >= size_index("4 AWG") for w in wire_lines):
        out.append(
            "4 AWG and larger are often stocked only in black; they may be identified by marking "
            f"at terminations ({LARGE_MARKING_RULE})."
        )
    if parallel and any_egc:
        out.append(f"Parallel sets: each raceway carries its own full-size EGC ({EGC_PARALLEL_RULE}).")
    if families:
        out.append(
            "Raceway length = route length, one raceway per parallel set "
            f"({PARALLEL_RACEWAY_RULE}); no allowance for offsets or elbows' own length."
        )
        out.append(
            f"Connectors: {settings.connectors_per_end} at each end of each raceway "
            "(the termination and one more along the way; takeoff assumption)."
        )
        out.append("Elbows: one 90-degree elbow of the raceway's trade size per bend recorded on "
                   "the walk (small EMT is often bent in the field instead).")
    for family in sorted(families):
        rule = families[family]
        sticks = (f"{rule.stick_source}" if rule.stick_ft is not None else rule.stick_source)
        coupling = (" Couplings come on the sticks, none listed loose." if rule.coupling_attached
                    else (" One coupling per joint between lengths." if rule.stick_ft else ""))
        out.append(f"{family} ({rule.article}): {sticks}.{coupling} Supports: {rule.support_source}.")
    return tuple(out)


# --------------------------------------------------------------------------------------------
# From a walk


COLOUR_SCHEMES = ("common",)
"""Colour scheme names a job may give: ``common`` picks ``gaugewalk.tables.order.colours`` by each source's
system (common practice for phases; NEC 200.6 and 250.119 for neutral and EGC)."""


def scheme_for_source_system(system_id: str) -> colour_table.ColourScheme:
    """The default colour scheme of a source's system (a ``gaugewalk.model.engine.circuits.SYSTEMS`` id)."""
    from gaugewalk.model.engine.circuits import SYSTEMS, parse_system

    system = SYSTEMS.get(system_id) or SYSTEMS[parse_system(system_id)]
    return colour_table.scheme_for_system(system.line_to_line_v, system.phases, system.has_neutral)


def settings_for(job) -> TakeoffSettings:
    """The takeoff settings of a ``gaugewalk.model.walk.job.Job``: its slack, waste and put-ups."""
    d = job.defaults
    if d.colour_scheme not in COLOUR_SCHEMES:
        raise TakeoffError(
            f"defaults, colour_scheme: no colour scheme '{d.colour_scheme}'; schemes are "
            f"{', '.join(COLOUR_SCHEMES)}"
        )
    listed = getattr(d, "putups", None)
    putups = (tuple(PutUp(p.label, p.length_ft, tuple(p.sizes)) for p in listed)
              if listed is not None else DEFAULT_PUTUPS)
    return TakeoffSettings(
        slack_per_end_ft=d.slack_per_end_ft,
        waste_pct=d.waste_pct,
        putups=putups,
    )


def materials_from_job(job, job_result) -> tuple[list[RunMaterial], list[str], tuple[str, ...]]:
    """One ``RunMaterial`` per sized run of ``job`` (a ``gaugewalk.model.walk.job.Job``) from ``job_result``
    (a ``gaugewalk.model.walk.compute.JobResult``), the warnings for runs left out, and the colour rules used."""
    materials: list[RunMaterial] = []
    left_out: list[str] = []
    schemes: dict[str, colour_table.ColourScheme] = {}
    for run in job.runs:
        result = job_result.runs.get(run.id)
        if result is None:
            left_out.append(f"run {run.id}: not sized, so left out of the takeoff")
            continue
        source = job.source(run.from_)
        try:
            scheme = scheme_for_source_system(source.system)
        except KeyError as exc:
            left_out.append(f"run {run.id}: no colours: {exc.args[0]}")
            continue
        schemes[scheme.key] = scheme
        per_set = result.conductors or {}
        has_neutral = bool(per_set.get("neutral")) and result.neutral_size is not None
        has_egc = bool(per_set.get("egc")) and result.egc_size is not None
        try:
            phases = phase_colours_for(scheme, int(per_set.get("hot", 0)), has_neutral)
        except TakeoffError as exc:
            left_out.append(f"run {run.id}: {exc}")
            continue
        materials.append(RunMaterial(
            run_id=run.id,
            length_ft=run.length_ft,
            sets=result.sets,
            material=result.material,
            insulation=job.effective(run, "insulation"),
            size=result.size,
            phase_colours=phases,
            neutral_size=result.neutral_size if has_neutral else None,
            neutral_colour=scheme.neutral or "white",
            egc_size=result.egc_size if has_egc else None,
            egc_colour=scheme.egc,
            raceway=result.raceway,
            raceway_size=result.raceway_size,
            bends=run.bends or 0,
        ))
    sources = tuple(
        f"{s.label}: {'; '.join(s.sources())}" for s in sorted(schemes.values(), key=lambda s: s.key)
    )
    return materials, left_out, sources


def build_takeoff(job, job_result) -> Takeoff:
    """The takeoff of a computed walk: ``job`` a ``gaugewalk.model.walk.job.Job``, ``job_result`` what
    ``gaugewalk.model.walk.compute.compute_job(job)`` returned. Runs that could not be sized are left out and
    named in ``warnings``. Raises ``TakeoffError`` for a job setting it cannot use."""
    settings = settings_for(job)
    materials, left_out, scheme_sources = materials_from_job(job, job_result)
    settings = TakeoffSettings(
        settings.slack_per_end_ft, settings.waste_pct, settings.putups,
        settings.connectors_per_end, scheme_sources,
    )
    takeoff = takeoff_from_runs(materials, settings)
    if left_out:
        takeoff = Takeoff(
            takeoff.wire_lines, takeoff.raceway_lines, takeoff.fitting_lines,
            takeoff.assumptions, tuple(left_out) + takeoff.warnings, settings,
        )
    return takeoff
