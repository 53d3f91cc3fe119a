"""What a printed report says, assembled from a job, its computed results and its takeoff.

The renderers (``gaugewalk.tui.report.html``, ``gaugewalk.tui.report.md``) only lay this out; every number and
sentence comes from here so that the HTML, the Markdown and the app agree.
"""

from __future__ import annotations

from dataclasses import dataclass

from gaugewalk.model.engine.circuits import CircuitError, resolve_circuit
from gaugewalk.model.engine.contract import Circuit, RunResult
from gaugewalk.model.report.oneline import Bus, one_line
from gaugewalk.model.walk.checks import connection_of
from gaugewalk.model.walk.compute import FeederInfo, JobResult
from gaugewalk.model.walk.equipment import from_name, load_words, run_continuous
from gaugewalk.model.walk.job import Job, Run, shared_ids
from gaugewalk.model.walk.plausible import implausible, stated_loads
from gaugewalk.model.walk.schedule import drop_basis, schedule_of, schedules
from gaugewalk.model.walk.starting import StartDip
from gaugewalk.model.walk.takeoff import SizeFootage, Takeoff, WireLine
from gaugewalk.model.walk.vocabulary import DEMANDS
from gaugewalk.tables.conductor.ampacity import rooftop_words
from gaugewalk.tables.order.putups import CUT_LABEL

CAUTION = (
    "Results are estimates for planning. The installation must follow the code in force and the "
    "authority having jurisdiction, and be designed and checked by qualified, licensed people."
)

MATERIAL_NAMES = {"cu": "copper", "al": "aluminum"}

#: Columns of the per-run table, in order (the problems follow each run on a line of their own).
RUN_COLUMNS: tuple[str, ...] = (
    "Run", "From", "To", "Circuit", "Breaker [A]", "Load", "Length [ft]", "Size", "EGC",
    "Raceway", "Drop [%]", "Total drop [%]", "Governed by",
)
#: Columns of the list of shared raceways, in order.
SHARED_COLUMNS: tuple[str, ...] = (
    "Shared raceway", "Trade size", "Length [ft]", "Runs", "Conductors", "Fill [%]",
    "Current-carrying", "Adjustment",
)

#: Columns of the equipment table: each run whose load is of a kind its article sizes.
EQUIPMENT_COLUMNS: tuple[str, ...] = (
    "Run", "Kind", "Load", "Conductors sized for [A]", "Device [A]", "Starting drop on the run [%]",
    "Starting dip from the service [%]", "Rule",
)


@dataclass(frozen=True)
class ReportRun:
    """One row of the per-run table, as text ready to print."""

    run_id: str
    from_: str
    to: str
    length_ft: str          # e.g. "85.0"
    length_typed: str       # what the walker typed, e.g. "85+12+2*6"
    circuit: str            # voltage and poles, e.g. "120 V 1P+N", "208 V 3P"
    breaker: str            # the device [A], e.g. "20"
    load: str               # e.g. "16 A", "4.5 kVA", "feeder: 123.4 A"
    size: str               # e.g. "3/0 AWG Cu", "2 x 3/0 AWG Cu"
    drop_pct: str
    total_drop_pct: str
    egc: str
    raceway: str            # e.g. "1-1/4 EMT"
    governed_by: str
    problems: tuple[str, ...]

    def cells(self) -> tuple[str, ...]:
        """The row's cells in ``RUN_COLUMNS`` order (``problems`` apart)."""
        return (self.run_id, self.from_, self.to, self.circuit, self.breaker, self.load,
                self.length_ft, self.size, self.egc, self.raceway, self.drop_pct,
                self.total_drop_pct, self.governed_by)


@dataclass(frozen=True)
class RunRules:
    """What one run was sized by, in the order applied: a feeder's basis, then the engine's
    notes (``RunResult.notes``: each rule with its code section, and what was taken as given
    where the walk does not say)."""

    run_id: str
    route: str              # "DP1 → Glycol chiller"
    rules: tuple[str, ...]


def rules_applied(result: RunResult, feeder: FeederInfo | None,
                  walk_notes: tuple[str, ...] = ()) -> tuple[str, ...]:
    """What a run was sized by, in the order applied: a feeder's basis (NEC 215.2(A)(1),
    430.24 ...), then ``result.notes``, then what the walk adds (``JobResult.walk_notes``: a
    motor's starting dip from the service). The report and the app's rules screen both list
    this."""
    return (((f"sized for {feeder.basis}",) if feeder is not None else ()) + tuple(result.notes)
            + walk_notes)


RULES_HEADING = "Rules applied to each run"
RULES_INTRO = ("Each run's sizing, in the order applied: the code section of each rule, and what "
               "was taken as given where the walk does not say.")


NOTES_HEADING = "Warnings and stated assumptions"
"""The section after the runs table: what is said about the walk without counting as a problem."""
RUN_WARNINGS_HEADING = "Values to check"
STATED_LOADS_HEADING = "Feeders sized for a stated load below what their panel's loads need"
NAME_NOTES_HEADING = "Taken from a run's name"
"""The assumptions a run's name made (a sign taken as the outlet 600.5(A) requires, a duty
motor, equipment on a roof...), each also among its run's rules."""


@dataclass(frozen=True)
class Report:
    title: str
    header: tuple[tuple[str, str], ...]         # (label, value): job, site, walked on/by, file
    caution: str
    defaults: tuple[tuple[str, str], ...]       # (label, value with unit)
    runs: tuple[ReportRun, ...]
    one_line: tuple[Bus, ...]                   # the supply tree, depth first
    shared: tuple[tuple[str, ...], ...]         # rows in SHARED_COLUMNS order
    summary: tuple[tuple[str, str], ...]        # (label, value): runs, runs with problems...
    footage: tuple[SizeFootage, ...]
    takeoff: Takeoff
    order_table: tuple[tuple[str, ...], tuple[tuple[str, ...], ...]]     # (columns, rows)
    wire_table: tuple[tuple[str, ...], tuple[tuple[str, ...], ...]]
    pull_table: tuple[tuple[str, ...], tuple[tuple[str, ...], ...]]
    raceway_table: tuple[tuple[str, ...], tuple[tuple[str, ...], ...]]
    equipment_table: tuple[tuple[str, ...], tuple[tuple[str, ...], ...]]  # no rows: none
    fitting_table: tuple[tuple[str, ...], tuple[tuple[str, ...], ...]]
    assumptions: tuple[str, ...]
    warnings: tuple[str, ...]
    sources_table: tuple[tuple[str, ...], tuple[tuple[str, ...], ...]] = ((), ())
    schedules: tuple[ReportSchedule, ...] = ()
    drop_basis: str = ""
    run_warnings: tuple[str, ...] = ()   # values to check (``plausible.implausible``), said only
    stated_loads: tuple[str, ...] = ()   # feeders kept at a stated load below their panel's need
    name_notes: tuple[str, ...] = ()     # what runs' names made taken (``NAME_NOTES_HEADING``)
    rules: tuple[RunRules, ...] = ()     # every sized run's rules (``RULES_HEADING``)


@dataclass(frozen=True)
class ReportSchedule:
    """One panel schedule as text: a ``title``, ``notes`` (feeder, main, loading, spaces) and
    its table (``columns``, ``rows``; the last row is the totals)."""

    title: str
    notes: tuple[str, ...]
    columns: tuple[str, ...]
    rows: tuple[tuple[str, ...], ...]


def _num(value: float, places: int = 1) -> str:
    return f"{value:.{places}f}"


def load_text(run: Run, result: RunResult | None) -> str:
    """The load as the walker gave it, or for a feeder without one, the load it serves [A]."""
    if run.load is not None:
        text = load_words(run.load)
        if result is not None and result.flc_a is not None:
            text += f" ({result.flc_a:g} A full-load)"
        if run_continuous(run):
            text += ", continuous"
        return text
    if result is not None:
        return f"{result.amps:.1f} A served"
    return ""


def equipment_row(run: Run, result: RunResult, dip: StartDip | None = None) -> tuple[str, ...]:
    """A run's row of the equipment table (``EQUIPMENT_COLUMNS``): its kind, its load with the
    nameplate, what the kind's rule sized the conductors for and the device it asked for, a
    motor's starting drop on its run and its dip from the service (``dip``), and the sections
    applied."""
    start = ("" if result.starting_drop_pct is None
             else _num(result.starting_drop_pct, 2)
             + (f" at {result.locked_rotor_a:.0f} A" if result.locked_rotor_a else ""))
    whole = ("" if dip is None else "not worked" if dip.total_pct is None
             else _num(dip.total_pct, 2))
    return (run.id, result.load_kind, load_text(run, result), _num(result.design_amps),
            str(result.ocpd_a), start, whole, result.kind_rule)


def size_text(result: RunResult) -> str:
    mat = "Cu" if result.material == "cu" else "Al"
    base = f"{result.size} {mat}"
    return f"{result.sets} x {base}" if result.sets > 1 else base


def circuit_text(circuit: Circuit | None) -> str:
    """Voltage and poles: ``120 V 1P+N``, ``208 V 3P``; "" when the circuit is not known."""
    if circuit is None:
        return ""
    return f"{circuit.volts:g} V {circuit.hots}P" + ("+N" if circuit.neutral else "")


def _circuit_of(job: Job, run: Run) -> Circuit | None:
    source = job.source(run.from_)
    connection = connection_of(job, run)
    if source is None or connection is None:
        return None
    try:
        return resolve_circuit(source.system, connection)
    except CircuitError:
        return None


def _shared(job_result) -> tuple[tuple[str, ...], ...]:
    if job_result is None:
        return ()
    return tuple(
        (f"{s.id} ({s.raceway})", s.trade_size or "none holds them", _num(s.length_ft),
         ", ".join(s.runs), str(s.conductors),
         f"{s.fill_pct:.0f} of {s.fill_limit_pct:g}", str(s.ccc), f"{s.adjustment:g}")
        for s in job_result.raceways.values())


def raceway_text(result: RunResult) -> str:
    if result.raceway_size is None:
        return f"{result.raceway}: no size fits"
    text = f"{result.raceway} {result.raceway_size}"
    return f"{text} ({result.sets} raceways)" if result.sets > 1 else text


def _defaults(job: Job) -> tuple[tuple[str, str], ...]:
    d = job.defaults
    terminal = f"{d.terminal_temp} C" if d.terminal_temp else "by NEC 110.14(C)(1)"
    return (
        ("Conductor material", MATERIAL_NAMES.get(d.material, d.material)),
        ("Insulation", d.insulation),
        ("Raceway", d.raceway),
        ("Terminal temperature", terminal),
        ("Ambient [C]", f"{d.ambient_c:g}"),
        ("Conductor temperature for resistance [C]", f"{d.conductor_temp_c:g}"),
        ("Drop method", {"dc": "DC (Ch. 9 Table 8)", "kfactor": "K factor",
                         "ac": "AC impedance (Ch. 9 Table 9)"}.get(d.method, d.method)),
        ("Power factor", f"{d.pf:g}"),
        ("Branch drop target [%]", f"{d.branch_drop_pct:g} (informational note to NEC 210.19)"),
        ("Feeder drop target [%]", f"{d.feeder_drop_pct:g} (informational note to NEC 215.2)"),
        ("Total drop target [%]", f"{d.total_drop_pct:g} (informational note to NEC 215.2)"),
        ("Drop through transformers", drop_basis(job)),
        ("Loads on 4-wire wye circuits",
         "mostly nonlinear: neutrals counted as current-carrying (NEC 310.15(E)(3)), feeder "
         "neutrals full size (220.61(C)(2))" if d.nonlinear_loads else
         "linear: neutrals carry the unbalance only, not counted (NEC 310.15(E)(1))"),
        ("Feeder basis", {"load": "the load served, heaviest line (NEC 215.2(A)(1))",
                          "equipment": "the main or bus rating of the equipment fed "
                                       "(common practice)"}[d.feeder_basis]),
        ("Feeder load", DEMANDS[d.demand]),
        ("Slack per end [ft]", f"{d.slack_per_end_ft:g}"),
        ("Waste allowance [%]", f"{d.waste_pct:g}"),
        ("Colour scheme", d.colour_scheme),
        ("Put-ups", "as the job lists them" if d.putups is not None
         else "500 ft boxes (14-10 AWG), 1,000 and 2,500 ft reels (common practice)"),
    )


def build_report(job: Job, results: dict[str, RunResult | None], takeoff: Takeoff, *,
                 file_name: str = "", run_errors: dict[str, str] | None = None,
                 job_result: JobResult | None = None, with_rules: bool = True) -> Report:
    """The report of ``job``: ``results`` maps run id to its result (None: not sized, with the
    reason in ``run_errors``); with the whole ``job_result``, the one-line diagram, the sources
    list, the panel schedules and the shared raceways too; ``with_rules``, the rules applied to
    each run (``RULES_HEADING``)."""
    run_errors = run_errors or {}
    h = job.job
    header = [("Job", h.name or "(no name)")]
    if h.site:
        header.append(("Site", h.site))
    if h.walked_on:
        header.append(("Walked on", h.walked_on.isoformat()))
    if h.walked_by:
        header.append(("Walked by", h.walked_by))
    if file_name:
        header.append(("Walk file", file_name))
    if h.notes:
        header.append(("Notes", h.notes))

    rows = []
    equipment_rows = []
    rules = []
    feeders = job_result.feeders if job_result is not None else {}
    failing = 0
    for run in job.runs:
        result = results.get(run.id)
        circuit = circuit_text(_circuit_of(job, run))
        if result is None:
            failing += 1
            rows.append(ReportRun(
                run.id, run.from_, run.to, _num(run.length_ft), run.length, circuit,
                str(run.ocpd_a or ""), load_text(run, None), "", "", "", "", "", "not sized",
                (run_errors.get(run.id, "could not be sized"),),
            ))
            continue
        # its own problems, its place in its panel's and a motor's starting dip from the service
        problems = (tuple(p.message for p in job_result.run_problems(run.id))
                    if job_result is not None else tuple(result.problems))
        dip = job_result.start_dips.get(run.id) if job_result is not None else None
        if problems:
            failing += 1
        if result.load_kind != "general":
            equipment_rows.append(equipment_row(run, result, dip))
        if with_rules:
            rules.append(RunRules(run.id, f"{run.from_} → {run.to}", rules_applied(
                result, feeders.get(run.id),
                job_result.walk_notes(run.id) if job_result is not None else ())))
        rows.append(ReportRun(
            run.id, run.from_, run.to, _num(run.length_ft), run.length, circuit,
            str(result.ocpd_a), load_text(run, result), size_text(result),
            _num(result.voltage_drop_pct, 2), _num(result.total_drop_pct, 2),
            result.egc_size or "none",
            raceway_text(result) + "".join(f", in {rid}" for rid in shared_ids(run))
            + (f", {rooftop_words(job.effective(run, 'insulation'))}" if run.rooftop else ""),
            result.governed_by,
            problems,
        ))

    summary = (
        ("Runs", str(len(job.runs))),
        ("Runs meeting every limit", str(len(job.runs) - failing)),
        ("Runs with problems", str(failing)),
        ("Conductor to order [ft]", str(sum(w.with_waste_ft for w in takeoff.wire_lines))),
        ("Offcut left on boxes and reels [ft]",
         str(sum(w.left_over_ft for w in takeoff.wire_lines))),
    )
    buses = one_line(job, job_result) if job_result is not None else ()
    return Report(
        title=f"Site walk report: {h.name}" if h.name else "Site walk report",
        header=tuple(header),
        caution=CAUTION,
        defaults=_defaults(job) + (
            (("Motor starting drop target [%]",
              f"{job.defaults.starting_drop_pct:g} (common practice: 10 to 15)"),)
            if any(r[1] == "motor" for r in equipment_rows) else ())
        + ((("Fire pump drop targets [%]",
             "5 running, at 115 % of full-load current, from the service (NEC 695.7(B)); 15 "
             "while starting (695.7(A)); whatever the job's targets"),)
           if any(r[1] == "fire-pump" for r in equipment_rows) else ()),
        runs=tuple(rows),
        one_line=buses,
        shared=_shared(job_result),
        summary=summary,
        footage=takeoff.footage_by_size(),
        takeoff=takeoff,
        order_table=order_table_of(takeoff),
        wire_table=wire_table_of(takeoff),
        pull_table=pull_table_of(takeoff),
        raceway_table=raceway_table_of(takeoff),
        equipment_table=(EQUIPMENT_COLUMNS, tuple(equipment_rows)),
        fitting_table=fitting_table_of(takeoff),
        assumptions=takeoff.assumptions,
        warnings=takeoff.warnings,
        sources_table=sources_table_of(job, job_result) if job_result is not None else ((), ()),
        schedules=schedules_of(job, job_result) if job_result is not None else (),
        drop_basis=drop_basis(job),
        run_warnings=tuple(p.brief() for p in implausible(job)),
        stated_loads=tuple(f"run {rid}: {basis}" for rid, basis in
                           (stated_loads(job_result) if job_result is not None else ())),
        rules=tuple(rules),
        name_notes=tuple(f"run {r.id}: {note}" for r in job.runs
                         if job_result is not None and r.id in job_result.runs
                         for note in from_name(r, job_result.runs[r.id].notes)),
    )


SOURCE_COLUMNS = ("Source", "Kind", "System", "Bus [A]", "Main [A]", "Load [kVA]",
                  "Per line [A]", "Neutral [A]", "Heaviest design [A]", "Loading [%]",
                  "Drop at bus [%]", "Notes")


def _amps_text(names: tuple[str, ...], amps: tuple[float, ...]) -> str:
    return " / ".join(f"{n} {a:.1f}" for n, a in zip(names, amps, strict=True))


def sources_table_of(job: Job, result: JobResult):
    """Every source with its ratings and loading as ``(columns, rows)`` of text; a
    transformer's nameplate, protection and own drop in its notes."""
    rows = []
    for s in job.sources:
        sch = schedule_of(job, result, s.id)
        info = result.transformers.get(s.id)
        notes = ""
        if s.kind == "transformer" and info is not None:
            z = f"{info.impedance_pct:g} %Z{' (assumed)' if info.impedance_assumed else ''}"
            sec = (f", secondary device {info.secondary_ocpd_a} A"
                   if info.secondary_ocpd_a is not None else "")
            notes = (f"{info.kva:g} kVA, {z}; primary {info.primary_fla_a:.1f} A, device "
                     f"{info.primary_ocpd_a} A{sec}; secondary {info.secondary_fla_a:.1f} A; "
                     f"loaded {info.utilisation_pct:.0f} %; drop in it {info.drop_pct:.2f} %")
        loading = result.loadings.get(s.id)
        drop = result.source_drop_pct.get(s.id)
        rows.append((
            s.id, s.kind, s.system, "" if s.rating_a is None else str(s.rating_a),
            "" if s.main_a is None else str(s.main_a) if s.kind != "transformer" else "",
            f"{sch.connected_va / 1000:.1f}", _amps_text(sch.lines, sch.phase_amps),
            "" if sch.neutral_amps is None else f"{sch.neutral_amps:.1f}",
            "" if loading is None else f"{loading.design_a:.1f} ({loading.line})",
            "" if sch.utilisation_pct is None else f"{sch.utilisation_pct:.0f}",
            "" if drop is None else f"{drop:.2f}", notes))
    return SOURCE_COLUMNS, tuple(rows)


def schedules_of(job: Job, result: JobResult) -> tuple[ReportSchedule, ...]:
    """Each panel's schedule as text: positions, runs, poles, phase, VA per line, totals."""
    out = []
    for sch in schedules(job, result):
        columns = ("Position", "Run", "To", "Poles", "Phase", *(f"{n} [VA]" for n in sch.lines),
                   "Placed")
        rows = [("-".join(str(p) for p in row.positions) or "no space", row.run_id, row.to,
                 str(row.poles), row.phase, *(f"{v:.0f}" if v else "" for v in row.va),
                 _PLACED[row.by]) for row in sch.rows]
        rows.append(("", "Total", "", "", "", *(f"{v:.0f}" for v in sch.total_va), ""))
        notes = [f"{sch.kind} {sch.system}; current per line "
                 f"{_amps_text(sch.lines, sch.phase_amps)} A (before the 125 % for continuous "
                 "loads)" + ("" if sch.neutral_amps is None else
                             f"; neutral {sch.neutral_amps:.1f} A (NEC 220.61)")]
        ratings = []
        if sch.rating_a is not None:
            ratings.append(f"bus {sch.rating_a} A")
        elif sch.kind in ("panel", "switchboard"):
            ratings.append("bus rating not given: NEC 408.30 and 408.36 not checked")
        ratings.append(f"main {sch.main_a} A" if sch.main_a is not None else
                       "no main device given" if sch.kind == "service" else "main lugs only")
        if sch.feeder is not None:
            ratings.append(f"fed by {sch.feeder}" + (f" on {sch.feeder_ocpd_a} A"
                                                     if sch.feeder_ocpd_a else ""))
        if sch.utilisation_pct is not None:
            ratings.append(f"loaded {sch.utilisation_pct:.0f} % (heaviest line's design "
                           "current, NEC 215.2(A)(1))")
        notes.append("; ".join(ratings))
        source = job.source(sch.source_id)
        said = source.nonlinear_loads if source is not None else None
        if said is not None and said != job.defaults.nonlinear_loads:
            notes.append("its loads mostly nonlinear: neutrals of its 4-wire wye circuits counted "
                         "as current-carrying, its feeder's neutral full size (NEC 310.15(E)(3), "
                         "220.61(C)(2))" if said else
                         "its loads taken as linear, though the job's setting says nonlinear "
                         "(NEC 310.15(E)(1))")
        fed = result.feeders.get(sch.feeder) if sch.feeder is not None else None
        if fed is not None:   # the demand factors its feeder took (Defaults.demand)
            notes.extend(f"feeder {sch.feeder}: {step.text}" for step in fed.demand)
        notes.append(f"{sch.spaces} spaces" if sch.spaces is not None else
                     "spaces not given: positions are not checked against the end of the panel")
        notes.append("VA split equally over a circuit's poles (common practice)")
        out.append(ReportSchedule(f"{sch.source_id}", tuple(notes), columns, tuple(rows)))
    return tuple(out)


_PLACED = {"position": "as walked", "phase": "phase as walked", "placed": "by the tool"}


def _order_text(w: WireLine) -> str:
    return " + ".join(f"{p.length_ft} ft {p.label}" if p.label == CUT_LABEL
                      else f"{p.count} x {p.label}" for p in w.order)


def wire_table_of(t: Takeoff):
    """The conductor lines as ``(columns, rows)`` of text (what the report and the app show).
    Cuts: each run's conductors with slack and waste; pieces: boxes, reels and lengths cut, with
    the fewest any packing could use beside them."""
    columns = ("Material", "Insulation", "Size", "Function", "Colour", "Net [ft]",
               "Cuts [ft]", "Order", "Offcut [ft]", "Pieces (fewest)")
    rows = tuple(
        (MATERIAL_NAMES.get(w.material, w.material), w.insulation, w.size, w.function, w.colour,
         _num(w.net_ft), str(w.with_waste_ft), _order_text(w), str(w.left_over_ft),
         f"{len(w.pieces)} ({w.lower_bound_count})")
        for w in t.wire_lines
    )
    return columns, rows


def raceway_table_of(t: Takeoff):
    """The raceway lines as ``(columns, rows)`` of text; a shared raceway is named by its id."""
    columns = ("Raceway", "Trade size", "Length [ft]", "Lengths", "Basis")
    rows = tuple(
        (r.raceway if r.id is None else f"{r.raceway} shared {r.id}", r.trade_size, _num(r.length_ft),
         "coils" if r.sticks is None else f"{r.sticks} x {r.stick_ft:g} ft", r.basis)
        for r in t.raceway_lines
    )
    return columns, rows


def fitting_table_of(t: Takeoff):
    """The fitting lines as ``(columns, rows)`` of text."""
    columns = ("Item", "Raceway", "Trade size", "Count", "Basis")
    rows = tuple((f.item, f.raceway, f.trade_size, str(f.count), f.basis) for f in t.fitting_lines)
    return columns, rows


def order_table_of(t: Takeoff, priced=None):
    """The order as ``(columns, rows)`` of text: one row per orderable item; with ``priced`` (a
    ``gaugewalk.model.walk.takeoff.prices.PricedOrder``) the unit price and cost of each."""
    from gaugewalk.model.walk.takeoff.prices import money

    columns: tuple[str, ...] = ("Item", "Description", "Quantity", "Unit")
    if priced is not None:
        columns += ("Unit price", "Cost")
    rows = []
    for i, line in enumerate(t.order_lines):
        row: tuple[str, ...] = (line.item, line.description, f"{line.quantity:,}", line.unit)
        if priced is not None:
            p = priced.lines[i]
            row += (money(p.unit_price) or "no price", money(p.cost))
        rows.append(row)
    return columns, tuple(rows)


def priced_summary(priced) -> tuple[str, ...]:
    """The total of a priced order and the items with no price, as sentences."""
    out = [f"Total of the priced lines: {priced.total_cost:,.2f}"]
    if priced.unpriced:
        out.append(f"No price for {len(priced.unpriced)} item(s): "
                   + "; ".join(f"{u.item} ({u.description})" for u in priced.unpriced))
    return tuple(out)


@dataclass(frozen=True)
class PullGroup:
    """The pull list of one conductor line: its pieces and the runs cut from each."""

    conductor: str                              # e.g. "12 AWG copper THHN/THWN-2, black (phase)"
    pieces: tuple[tuple[str, str, str], ...]    # (piece, offcut [ft], runs with their cuts [ft])


def _conductor_text(w: WireLine) -> str:
    material = MATERIAL_NAMES.get(w.material, w.material)
    if w.insulation == "bare":
        return f"{w.size} bare {material} ({w.function})"
    return f"{w.size} {material} {w.insulation}, {w.colour} ({w.function})"


def pull_list_of(t: Takeoff, runs_per_piece: int | None = None,
                 pieces_per_line: int | None = None) -> tuple[PullGroup, ...]:
    """Which runs come off which piece, per conductor line, pieces numbered from 1. A run in
    parallel sets names the set. ``runs_per_piece`` and ``pieces_per_line`` shorten long lists
    ("and 12 more")."""
    out = []
    for w in t.wire_lines:
        parallel = {c.run_id for c in w.cuts if c.set_no > 1}
        pieces = []
        for n, p in enumerate(w.pieces, 1):
            if pieces_per_line is not None and n > pieces_per_line:
                pieces.append(("", "", f"and {len(w.pieces) - pieces_per_line} more pieces"))
                break
            names = [f"{c.run_id}{f' (set {c.set_no})' if c.run_id in parallel else ''} {c.ft}"
                     for c in p.cuts]
            if runs_per_piece is not None and len(names) > runs_per_piece:
                names = names[:runs_per_piece] + [f"and {len(p.cuts) - runs_per_piece} more"]
            label = (f"{p.length_ft:,} ft {p.label}" if p.cut_to_length
                     else f"{p.label}")
            pieces.append((f"{n}: {label}", str(p.offcut_ft), ", ".join(names)))
        out.append(PullGroup(_conductor_text(w), tuple(pieces)))
    return tuple(out)


PULL_COLUMNS = ("Conductor", "Piece", "Offcut [ft]", "Runs and cuts [ft]")


def pull_table_of(t: Takeoff, runs_per_piece: int | None = None):
    """The pull list as ``(columns, rows)`` of text, the conductor named on its first piece."""
    rows = tuple(
        (g.conductor if i == 0 else "", piece, offcut, runs)
        for g in pull_list_of(t, runs_per_piece)
        for i, (piece, offcut, runs) in enumerate(g.pieces)
    )
    return PULL_COLUMNS, rows
