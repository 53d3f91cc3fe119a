"""The takeoff of a walk: ``build_takeoff(job, job_result)`` and its pure core ``takeoff_from_runs``.

Conductor lines are grouped by material, insulation, size, function and colour; a waste allowance
is added and the result is ordered in the job's put-ups (``footage``, ``packing``). Raceway and
fittings are counted per type and trade size (``fittings``). Every rule is cited on the line it
makes and every assumption is listed in ``Takeoff.assumptions``.
"""

from __future__ import annotations

import dataclasses
from typing import Iterable

from gaugewalk.model.walk.takeoff.fittings import count_raceway
from gaugewalk.model.walk.takeoff.footage import (
    FUNCTION_ORDER,
    colours_of_lines,
    phase_colours_for,
    wire_footage,
)
from gaugewalk.model.walk.takeoff.lines import (
    RunMaterial,
    SharedRacewayMaterial,
    Takeoff,
    TakeoffError,
    TakeoffSettings,
    WireLine,
)
from gaugewalk.model.walk.takeoff.order import order_lines
from gaugewalk.model.walk.takeoff.packing import EXACT_MAX_CUTS, pack_cuts
from gaugewalk.tables.conductor.sizes import size_index
from gaugewalk.tables.order import colours as colour_table
from gaugewalk.tables.order.putups import DEFAULT_PUTUPS, PutUp, putups_for
from gaugewalk.tables.order.putups import SOURCE as PUTUP_SOURCE
from gaugewalk.tables.raceway import install as raceway_install

EGC_PARALLEL_RULE = "NEC 250.122(F)"
PARALLEL_RACEWAY_RULE = "NEC 310.10(G)(4)"
LARGE_MARKING_RULE = "NEC 200.6(B), 250.119(A), 210.5(C), 215.12(C)"
DEFAULT_SETTINGS = TakeoffSettings()
"""The job defaults of a takeoff (one shared instance, read only)."""


def takeoff_from_runs(runs: Iterable[RunMaterial], settings: TakeoffSettings = DEFAULT_SETTINGS,
                      shared: Iterable[SharedRacewayMaterial] = ()) -> Takeoff:
    """The takeoff of the given runs and shared raceways: the pure core of ``build_takeoff``."""
    shared = tuple(shared)
    runs = list(runs)
    wire_net, wire_cuts = wire_footage(runs, settings.slack_per_end_ft, settings.waste_pct)
    first_seen = {key: i for i, key in enumerate(wire_net)}  # phase colours stay in A, B, C order
    wire_lines = []
    notes: list[str] = []
    for key in sorted(wire_net, key=lambda k: (k[0] != "cu", k[0], size_index(k[2]), k[1],
                                               FUNCTION_ORDER[k[3]], first_seen[k])):
        material, insulation, size, function, colour = key
        cuts = tuple(wire_cuts[key])
        putups = putups_for(size, settings.putups)
        packing = pack_cuts(cuts, putups, size in settings.cut_sizes)
        if putups and size not in settings.cut_sizes:
            longest = putups[-1]
            notes += [
                f"run {c.run_id}: its {size} {colour} {function} cut of {c.ft} ft is longer than "
                f"a {longest.label}; ordered cut to length (ask the supplier, or plan a splice)"
                for c in packing.too_long
            ]
        need = sum(c.ft for c in cuts)
        order_ft = sum(p.length_ft for p in packing.pieces)
        wire_lines.append(WireLine(
            material, insulation, size, function, colour, round(wire_net[key], 1),
            settings.waste_pct, need, packing.order(), order_ft, order_ft - need,
            tuple(dict.fromkeys(c.run_id for c in cuts)), cuts, packing.pieces,
            packing.lower_bound_count, packing.lower_bound_offcut_ft, packing.method,
        ))
    race = count_raceway(runs, settings, shared)
    return Takeoff(
        tuple(wire_lines), race.raceway_lines, race.fitting_lines,
        _assumptions(settings, race.families, any(r.sets > 1 for r in runs),
                     any(r.egc_size for r in runs), wire_lines, bool(shared)),
        tuple(notes + race.warnings), settings,
        order_lines(tuple(wire_lines), race.raceway_lines, race.fitting_lines),
    )


def _size_span(sizes: tuple[str, ...]) -> str:
    """"14 AWG to 10 AWG" for a run of consecutive sizes, else the sizes listed."""
    from gaugewalk.tables.conductor.sizes import SIZES

    idx = sorted(size_index(s) for s in sizes)
    if len(idx) > 2 and idx == list(range(idx[0], idx[-1] + 1)):
        return f"{SIZES[idx[0]]} to {SIZES[idx[-1]]}"
    return ", ".join(SIZES[i] for i in idx)


def _assumptions(settings: TakeoffSettings, families: dict[str, raceway_install.InstallRule],
                 parallel: bool, any_egc: bool, wire_lines: list[WireLine],
                 shared: bool = False) -> tuple[str, ...]:
    out = [
        f"Conductor length per run = (route length + {settings.slack_per_end_ft:g} ft slack at each "
        f"end) x conductors x parallel sets; slack per end is the job's setting (common practice).",
        "Conductors counted: every ungrounded conductor, the neutral where the circuit has one, "
        "and the EGC at its own size.",
        f"Each run's conductor is a cut, one per parallel set: route length plus slack, plus the "
        f"waste allowance of {settings.waste_pct:g} % for measuring and pulling (the job's "
        f"setting), rounded up to whole feet.",
        "Cut lists: the cuts of each size, material, insulation, colour and function are packed "
        "into put-ups to leave the least offcut, then the fewest pieces (best-fit decreasing with "
        f"a choice of put-ups; an exact search for groups of up to {EXACT_MAX_CUTS} cuts). Beside "
        "each line, the fewest pieces any packing could use (the Martello-Toth bound L2). The "
        "pull list says which runs come off which piece.",
        f"Cut to length: the supplier cuts {_size_span(settings.cut_sizes)} to the foot "
        f"({PUTUP_SOURCE.split(' (')[0]}); a remainder shorter than the size's shortest put-up is "
        "ordered cut to length rather than a box or reel, and a cut longer than every put-up is "
        "cut to length on its own.",
        "Put-up lengths: "
        + (PUTUP_SOURCE if settings.putups == DEFAULT_PUTUPS else "as the job lists them")
        + ": " + "; ".join(f"{p.label} ({_size_span(p.sizes)})" for p in settings.putups) + ".",
        "Phase colours follow the line each conductor lands on in its source (the run's position "
        "or phase as walked, else as placed to balance the lines), so the footage per colour is "
        "what will be pulled; a run not placed takes A, B, C in order.",
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
        if shared:
            out.append(
                "Shared raceways: each counted once, for its own length, with its own bends, "
                "fittings and pull points; a run in one has a raceway of its own only for the "
                "rest of its route (its length less the shared raceway's), and its recorded "
                "bends are taken to be on that part.")
        out.append(
            f"Connectors: {settings.connectors_per_end} at each end of each raceway "
            "(the termination and one more along the way; takeoff assumption)."
        )
        out.append("Elbows: one 90-degree elbow of the raceway's trade size per bend recorded on "
                   "the walk (small EMT is often bent in the field instead).")
        every = (f" and every {settings.pull_every_ft:g} ft of run (the job's setting; common "
                 "practice)" if settings.pull_every_ft > 0 else "")
        out.append(
            "Pull points: where the bends between pull points would pass "
            f"{raceway_install.MAX_BEND_DEGREES} degrees (the xxx.26 section of each raceway's "
            f"article){every}, the bends assumed shared out so one pull point serves both; "
            "conduit bodies up to trade size "
            f"{raceway_install.CONDUIT_BODY_LARGEST_TRADE_SIZE:g}, pull boxes above (common "
            "practice). Their connectors are within the two per end counted.")
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
        pull_every_ft=d.pull_every_ft,
        waste_pct=d.waste_pct,
        putups=putups,
    )


def materials_from_job(job, job_result) -> tuple[list[RunMaterial], list[str], tuple[str, ...]]:
    """One ``RunMaterial`` per sized run of ``job`` (a ``gaugewalk.model.walk.job.Job``) from ``job_result``
    (a ``gaugewalk.model.walk.compute.JobResult``), the warnings for runs left out, and the colour rules used."""
    materials: list[RunMaterial] = []
    left_out: list[str] = []
    schemes: dict[str, colour_table.ColourScheme] = {}
    system_of = {s.id: s.system for s in reversed(job.sources)}  # the first source of an id wins
    scheme_of: dict[str, colour_table.ColourScheme | str] = {}   # by system: scheme or why none
    placements = job_result.placements  # run id -> the lines it lands on in its source
    for run in job.runs:
        result = job_result.runs.get(run.id)
        if result is None:
            left_out.append(f"run {run.id}: not sized, so left out of the takeoff")
            continue
        system = system_of[run.from_]
        if system not in scheme_of:
            try:
                scheme_of[system] = scheme_for_source_system(system)
            except KeyError as exc:
                scheme_of[system] = exc.args[0]
        scheme = scheme_of[system]
        if isinstance(scheme, str):
            left_out.append(f"run {run.id}: no colours: {scheme}")
            continue
        schemes[scheme.key] = scheme
        per_set = result.conductors or {}
        has_neutral = bool(per_set.get("neutral")) and result.neutral_size is not None
        has_egc = bool(per_set.get("egc")) and result.egc_size is not None
        hots = int(per_set.get("hot", 0))
        placed = placements.get(run.id)
        try:
            if placed is not None and len(placed.lines) == hots:
                phases = colours_of_lines(scheme, placed.lines)  # the lines it lands on
            else:
                phases = phase_colours_for(scheme, hots, has_neutral)
        except (TakeoffError, ValueError) as exc:
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
            raceway_ft=_own_raceway_ft(run, job_result),
        ))
    sources = tuple(
        f"{s.label}: {'; '.join(s.sources())}" for s in sorted(schemes.values(), key=lambda s: s.key)
    )
    return materials, left_out, sources


def _own_raceway_ft(run, job_result) -> float | None:
    """The part of a run's route in a raceway of its own [ft] (``raceways.own_raceway_ft``);
    None when it is in no shared raceway."""
    if not job_result.raceways:
        return None
    from gaugewalk.model.walk.raceways import own_raceway_ft

    return own_raceway_ft(run, {k: v.length_ft for k, v in job_result.raceways.items()})


def shared_from_job(job_result) -> list[SharedRacewayMaterial]:
    """One ``SharedRacewayMaterial`` per shared raceway of a computed walk."""
    return [SharedRacewayMaterial(s.id, s.raceway, s.trade_size, s.length_ft, s.bends, s.runs)
            for s in job_result.raceways.values()]


def build_takeoff(job, job_result) -> Takeoff:
    """The takeoff of a computed walk: ``job`` a ``gaugewalk.model.walk.job.Job``, ``job_result`` what
    ``gaugewalk.model.walk.compute.compute_job(job)`` returned. Runs that could not be sized are left out and
    named in ``warnings``. Raises ``TakeoffError`` for a job setting it cannot use."""
    settings = settings_for(job)
    materials, left_out, scheme_sources = materials_from_job(job, job_result)
    settings = dataclasses.replace(settings, scheme_sources=scheme_sources)
    takeoff = takeoff_from_runs(materials, settings, shared_from_job(job_result))
    if left_out:
        takeoff = dataclasses.replace(takeoff, warnings=tuple(left_out) + takeoff.warnings)
    return takeoff
