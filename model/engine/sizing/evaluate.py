"""``evaluate(RunSpec) -> RunResult``: one run sized, rule by rule, in the order the rules
apply: the spec checked (``spec``), the design current and device (``currents``, or the load
kind's rule, ``kinds``), the installation's columns (``columns``), the conductor picked
(``pick``), its drop (``gaugewalk.model.engine.drop``; a motor's starting drop too), then the
EGC (``egc``) and the raceway (``raceway``).

In two parts, so that runs alike share the first: ``prepare`` (what neither the run's length
nor the drop up to its source enters: the currents and device, the columns, the sizes rules 1, 2,
4 and 6 of ``pick`` allow) and ``finish`` (the drop scan of rule 3, the size chosen, its drop and
what quotes it; what follows from each size picked, kept in the preparation). ``evaluate`` does
both for one run; ``evaluate_picked`` given a table of preparations (a walk's computation keeps
one) prepares each kind of run once.

Pure: no I/O. The work runs share (the device, the columns, the EGC and the raceway of a size)
is cached by table keys too, so thousands of runs evaluate quickly.
"""

import math
from collections.abc import Callable
from dataclasses import MISSING, fields
from functools import lru_cache
from operator import itemgetter
from typing import NamedTuple

from gaugewalk.model.engine.circuits import current_carrying_conductors
from gaugewalk.model.engine.contract import Equipment, RunResult, RunSpec, with_fields
from gaugewalk.model.engine.drop import (
    INTERPOLATED_SIZES,
    drop_length_ft,
    drop_volts,
    shifted_z,
)
from gaugewalk.model.engine.sizing.columns import (
    MAT,
    Setting,
    material_table,
    rx_of,
    setting,
    z_table,
)
from gaugewalk.model.engine.sizing.currents import (
    BY_ARTICLE,
    GENERAL,
    PROTECTED,
    WELDER_CONDUCTORS,
    Currents,
    motor_feeder,
)
from gaugewalk.model.engine.sizing.egc import bonding_jumper_for, egc_for
from gaugewalk.model.engine.sizing.kinds import STARTING_PF, locked_rotor, rule_for
from gaugewalk.model.engine.sizing.neutral import neutral_for
from gaugewalk.model.engine.sizing.pick import (
    Candidates,
    candidates,
    choose,
    drop_limit,
    drop_scan,
    size_problems,
)
from gaugewalk.model.engine.sizing.raceway import raceway_fill, resolve_raceway
from gaugewalk.model.engine.sizing.spec import SizingError, check_run_drop, check_spec
from gaugewalk.model.engine.sizing.text import amps_text, pct_text
from gaugewalk.model.engine.vocabulary import MOTOR_KINDS
from gaugewalk.tables.conductor import properties as t_cond
from gaugewalk.tables.conductor.ampacity import rooftop_ambient
from gaugewalk.tables.errors import TableLookupError


def evaluate(spec: RunSpec) -> RunResult:
    """Size the conductors, device, EGC and raceway of one run.

    Parameters
    ----------
    spec : RunSpec
        The run; see ``gaugewalk.model.engine.contract``.

    Returns
    -------
    RunResult
        The size picked (or the size fixed by the user), with ``problems`` naming every
        constraint it fails and ``notes`` naming the rules applied.

    Raises
    ------
    SizingError
        A spec that cannot be evaluated (zero or negative load or length, an insulation or
        raceway no table knows, an ambient the insulation is not permitted at...).
    """
    check_spec(spec)
    try:
        return _evaluate_pick(spec, True)[0]
    except TableLookupError as exc:
        raise SizingError(str(exc)) from None


def evaluate_picked(spec: RunSpec,
                    prepared: dict[tuple, "Prepared"] | None = None) -> tuple[RunResult, float]:
    """``evaluate``, with the least drop [%] of the smaller sizes it passed over for their drop
    alone (rules 1, 2 and 4 allowed them; ``pick.drop_scan``), infinity where it passed over
    none: any drop limit below that picks the same size again, which is how
    ``gaugewalk.model.walk.recompute`` tells that a run's size stays when the drop up to its
    source falls. The drop of a size does not depend on that upstream drop.

    ``prepared``: what the runs of one computation share, by their specs but for the length and
    the drop up to the source (``prepare``, and what each size picked gives); a run whose spec is
    already there is only finished (``finish``), its length and upstream drop checked. The
    result is the same as without it (``tests/engine/test_prepared.py``); the caller keeps it for
    one computation of specs of one kind (a walk's, from its validated models: the key compares
    fields by value, so a spec giving ``sets=2.0`` would meet the entry of ``sets=2``)."""
    if prepared is None:
        check_spec(spec)
        try:
            return _evaluate_pick(spec, True)
        except TableLookupError as exc:
            raise SizingError(str(exc)) from None
    return finish_prepared(prepared_for(spec, prepared), spec)


def prepared_for(spec: RunSpec, prepared: dict[tuple, "Prepared"]) -> "Prepared":
    """The preparation of ``spec`` in ``prepared`` (``evaluate_picked``), made there (the spec
    checked) the first time a spec equal to it but for its length and upstream drop comes.
    Raises ``SizingError``."""
    key = _prepared_key(spec.__dict__)
    prep = prepared.get(key)
    if prep is None:
        check_spec(spec)
        try:
            prep = prepared[key] = prepare(spec)
        except TableLookupError as exc:
            raise SizingError(str(exc)) from None
    return prep


def finish_prepared(prep: "Prepared", spec: RunSpec) -> tuple[RunResult, float]:
    """``evaluate_picked`` of ``spec`` from its preparation (``prepared_for``): its length and
    upstream drop checked, then ``finish``. Raises ``SizingError``."""
    check_run_drop(spec)
    try:
        return finish(prep, spec)
    except TableLookupError as exc:
        raise SizingError(str(exc)) from None


_prepared_key = itemgetter(*(f.name for f in fields(RunSpec)
                             if f.name not in ("length_ft", "upstream_drop_pct")))
"""The key of ``evaluate_picked``'s ``prepared``: every field of a spec's ``__dict__`` but the
length and the drop up to its source, which ``prepare`` does not read."""


@lru_cache(maxsize=8192)
def _egc_and_raceway(i: int, ocpd: int, base_i: int | None, sets: int, material: str,
                     egc_mat: str, egc: bool, egc_bare: bool, insulation: str, rtype: str,
                     hots: int, neutral: int, bonding: bool = False) -> tuple:
    """EGC (``egc.egc_for``; ``bonding``: the supply-side bonding jumper,
    ``egc.bonding_jumper_for``) and raceway (``raceway.raceway_fill``) for the picked size index
    ``i``: ``(egc_size, n_egc, raceway_size, fill_pct, notes, problems)``. Depends on neither
    length nor load, so it is cached."""
    egc_size: str | None
    notes: tuple[str, ...]
    if not egc:
        egc_size, notes = None, ()
    elif bonding:
        egc_size, notes = bonding_jumper_for(i, sets, material, egc_mat)
    else:
        egc_size, notes = egc_for(i, ocpd, base_i, sets, material, egc_mat)
    raceway_size, fill_pct, race_notes, problems = raceway_fill(
        material_table(material).sizes[i], egc_size, egc_bare, insulation, rtype, hots, neutral,
        sets)
    return (egc_size, 1 if egc_size else 0, raceway_size, fill_pct, notes + race_notes,
            problems)


_new_object = object.__new__
_set_attr = object.__setattr__
_RESULT_TEMPLATE = {f.name: None if f.default is MISSING else f.default for f in fields(RunResult)}


def _evaluate(spec: RunSpec, *, hint: bool = True) -> RunResult:
    """``hint``: when nothing fits, look for a number of parallel sets that would (off while
    looking, so the search is one pass over 2..12 sets, not a tree of searches)."""
    return _evaluate_pick(spec, hint)[0]


def _evaluate_pick(spec: RunSpec, hint: bool) -> tuple[RunResult, float]:
    """``_evaluate``, with the least drop of the sizes passed over (``evaluate_picked``): the run
    prepared on its own (``prepare``) and finished (``finish``)."""
    return finish(prepare(spec), spec, hint)


class Prepared:
    """What sizing a run takes that depends neither on its length nor on the drop up to its
    source (``prepare``): the same for every run whose spec is otherwise equal. ``parts`` holds
    what follows from each size picked by the rules (``_Part``), made once for all of them, and
    from the size a run's own target asks where the total target is left to upstream (keyed by
    that size and the drop up to the source, which its problem quotes)."""

    __slots__ = ("amps", "drop_amps", "cur", "need", "notes", "problems", "st", "protect",
                 "cand", "pct_per_volt", "parts")

    def __init__(self, amps: float, cur: Currents, need: float, notes: tuple[str, ...],
                 st: Setting, protect: tuple[float, ...] | None, cand: Candidates,
                 pct_per_volt: float) -> None:
        self.amps = amps                  # [A] the load
        # [A] the current the running drop is taken at (a fire pump's 115 %, NEC 695.7(B))
        self.drop_amps = amps if cur.drop_amps_a is None else cur.drop_amps_a
        self.cur = cur                    # the design current and device (the load's rule)
        self.need = need                  # [A] what the conductors carry after corrections
        self.notes = notes                # the circuit's, the rule's and the columns' notes
        self.problems = cur.problems
        self.st = st                      # the columns (``columns.setting``)
        self.protect = protect            # [A] the device each size permits; None: 240.4
        self.cand = cand                  # rules 1, 2, 4 and 6 (``pick.candidates``)
        self.pct_per_volt = pct_per_volt  # [%/V]
        self.parts: dict[int | tuple[int, float], _Part] = {}


def prepare(spec: RunSpec) -> Prepared:
    """The part of a run's sizing its length and the drop up to its source do not enter: the
    design current and device (``currents``, or the load kind's rule, ``kinds``), the columns
    (``columns.setting``; the rooftop adder of 310.15(B)(2)), the device limits each size is
    held to, and the sizes rules 1, 2, 4 and 6 allow (``pick.candidates``)."""
    circuit = spec.circuit
    material = spec.material
    amps = float(spec.amps)

    # --- currents and device (the load's rule) ---------------------------------------------
    if spec.continuous_amps is not None:
        cont = float(spec.continuous_amps)
    else:
        cont = amps if spec.continuous else 0.0
    eq = spec.equipment
    if eq is None and spec.motor_feeder_max_a is not None:  # NEC 430.62(A), 240.4(G)
        cur = motor_feeder(amps, cont, spec.ocpd_a, float(spec.motor_feeder_max_a), spec.lugs_bus_a)
    elif eq is None:
        cur = GENERAL.currents(amps, cont, spec.ocpd_a)
    else:
        cur = rule_for(eq, circuit.volts, circuit.phases).currents(amps, cont, spec.ocpd_a)
    design, ocpd = cur.design_a, cur.ocpd_a
    need = amps if cur.corrected_a is None else cur.corrected_a
    notes: list[str] = [*circuit.notes, *spec.load_notes, *cur.notes]

    # --- columns, corrections, raceway, impedance ----------------------------------------------
    n_ccc = spec.ccc if spec.ccc is not None else current_carrying_conductors(circuit)
    terminal_temp, terminal_why = spec.terminal_temp, None
    if terminal_temp is None and cur.terminal_col is not None:
        terminal_temp, terminal_why = cur.terminal_col, cur.terminal_why
    ambient = spec.ambient_c
    if spec.rooftop:  # NEC 310.15(B)(2)
        ambient, said = rooftop_ambient(ambient, spec.insulation)
        notes.append(said)
    st = setting(material, spec.insulation, terminal_temp, ocpd, ambient, n_ccc,
                 spec.raceway, spec.method, float(spec.pf), float(spec.conductor_temp_c),
                 bool(spec.stranded), spec.sets, bool(spec.distributed), circuit.drop_angle_deg,
                 terminal_why)
    notes.extend(st.notes)
    protection = cur.protection
    if protection == PROTECTED:
        protect = None
    elif protection == BY_ARTICLE:
        protect = (math.inf,) * len(st.z)
    else:  # WELDER_CONDUCTORS, NEC 630.12(B)
        protect = tuple(2.0 * a for a in st.cols.allowable_total)
    cand = candidates(spec, material_table(material), st, design, need, ocpd, protect)
    return Prepared(amps, cur, need, tuple(notes), st, protect, cand, 100.0 / circuit.volts)


class _Part(NamedTuple):
    """What follows from the size a run is given, for every length: the result's fields but
    the drop's (``values``, ``conductors``; its notes and problems there the whole where none
    quotes the drop), its notes and problems around those that quote it (``notes_a``, then
    those, then ``notes_b``; ``problems_a``, ..., ``problems_b``), and what the drop figures
    read."""

    i: int                             # the size's index in the material's table
    governed_by: str
    z: float                           # [ohm/kft] the size's impedance for the drop method
    start_z: float | None              # [ohm/kft] the same while a motor starts; None: not worked
    upsized: tuple[str, str] | None    # the words of the note of a size upsized for its drop,
                                       # before and after the drop; None: not upsized for it
    quotes_drop: bool                  # a note quotes the run's drop (upsized or starting)
    values: dict                       # RunResult's fields, the drop's not yet set
    conductors: dict[str, int]
    notes_a: tuple[str, ...]
    notes_b: tuple[str, ...]
    problems_a: tuple[str, ...]
    problems_b: tuple[str, ...]
    term_total: float                  # [A] the size's terminal-column ampacity, all sets
    corrected_total: float             # [A] its insulation-column ampacity corrected, all sets
    allowable_total: float             # [A] the smaller
    protect_limit: float               # [A] the largest device it permits
    small_max: int | None              # [A] its 240.4(D) limit
    margins: tuple[float, float, float, float]   # [A] ampacity, terminal, corrected, device


def finish(prep: Prepared, spec: RunSpec, hint: bool = True) -> tuple[RunResult, float]:
    """The run sized from its ``prep`` (``prepare`` of ``spec``, or of any spec equal to it but
    for ``length_ft`` and ``upstream_drop_pct``): the drop scan of rule 3
    (``pick.drop_scan``), the size chosen (``pick.choose``), its drop (a motor's starting drop
    too), and what a drop target quotes. Returns ``(result, the least drop [%] of the smaller
    sizes passed over for their drop alone)`` (``evaluate_picked``). ``hint``: when nothing
    fits, look for a number of parallel sets that would (off while looking, so the search is one
    pass over 2..12 sets, not a tree of searches)."""
    circuit = spec.circuit
    # VD = k I z L / 1000 / sets is linear in z: the drop per ohm/kft, once for the run
    volts_per_z = drop_volts(circuit.drop_factor, prep.drop_amps, 1.0,
                             drop_length_ft(spec.length_ft, spec.distributed), spec.sets)
    pct_per_volt = prep.pct_per_volt
    pick_i, passed, own_i = drop_scan(prep.cand.sizes, volts_per_z, pct_per_volt, spec)
    fixed = spec.size is not None
    if fixed or pick_i is not None:
        # the size the rules pick, or the fixed size: what follows is the same for every run
        key = -1 if fixed or pick_i is None else pick_i
        part = prep.parts.get(key)
        if part is None:
            part = prep.parts[key] = _part(prep, spec, pick_i, None, None)
    elif own_i is not None:
        # the own target's size, with a problem quoting the drop up to the source: the same for
        # every run alike on one bus
        own_key = (own_i, spec.upstream_drop_pct)
        part = prep.parts.get(own_key)
        if part is None:
            part = prep.parts[own_key] = _part(prep, spec, None, own_i, None)
    else:
        # none fits (a hint of parallel sets reads the length): this run's own
        part = _part(prep, spec, None, own_i, _parallel_hint if hint else None)

    vd_v = volts_per_z * part.z
    vd_pct = vd_v * pct_per_volt
    total_pct = spec.upstream_drop_pct + vd_pct
    values = part.values.copy()
    if fixed or pick_i is None or part.quotes_drop:
        # the notes and problems that quote this run's drop, between the part's
        notes: list[str] = []
        problems: list[str] = []
        if fixed or pick_i is None:
            st = prep.st
            cur = prep.cur
            eq = spec.equipment
            size_problems(values["size"], spec.material, st.term_col, cur.design_a, prep.need,
                          cur.ocpd_a, part.term_total, part.corrected_total,
                          part.allowable_total, part.protect_limit, part.small_max, vd_pct,
                          total_pct, spec.max_drop_pct, spec.max_total_drop_pct, problems,
                          cur.rule if eq is not None and eq.kind != "general" and cur.rule
                          else "NEC 110.14(C)(1), 210.19(A)(1)",
                          "NEC 630.12(B)" if cur.protection == WELDER_CONDUCTORS
                          else "NEC 240.4")
        if part.start_z is not None:
            values["starting_drop_pct"] = _starting_drop(spec, values["locked_rotor_a"],
                                                         part.start_z, notes, problems)
        if part.upsized is not None:
            notes.append(part.upsized[0] + pct_text(vd_pct) + part.upsized[1])
        if notes:
            values["notes"] = part.notes_a + tuple(notes) + part.notes_b
        if problems:
            values["problems"] = part.problems_a + tuple(problems) + part.problems_b

    amp_margin, terminal_margin, corrected_margin, device_margin = part.margins
    # Built without the per-field object.__setattr__ of a frozen dataclass's __init__ (a third
    # of the engine's time per run): a copy of the part's fields, with the drop's set
    result = _new_object(RunResult)
    values["voltage_drop_v"] = vd_v
    values["voltage_drop_pct"] = vd_pct
    values["total_drop_pct"] = total_pct
    values["margins"] = {
        "ampacity_a": amp_margin,
        "terminal_a": terminal_margin,
        "corrected_a": corrected_margin,
        "ocpd_a": device_margin,
        "drop_pct": spec.max_drop_pct - vd_pct,
        "total_drop_pct": spec.max_total_drop_pct - total_pct,
    }
    values["conductors"] = part.conductors.copy()
    _set_attr(result, "__dict__", values)
    return result, passed


def _part(prep: Prepared, spec: RunSpec, pick_i: int | None, own_i: int | None,
          hint: Callable[[RunSpec, tuple[float | None, ...]], str] | None) -> _Part:
    """What follows from the size ``pick.choose`` gives (``pick_i`` the size rule 3 picked,
    ``own_i`` the first meeting the run's own target): its ampacities and device limits, its
    impedance (Ch. 9 Table 9, or Table 8 DC resistance where Table 9 lacks the size), a motor's
    locked-rotor current and starting impedance, the EGC, the raceway and the neutral."""
    material = spec.material
    tab = material_table(material)
    sets = spec.sets
    st, cur = prep.st, prep.cur
    design, ocpd = cur.design_a, cur.ocpd_a
    notes = list(prep.notes)
    problems = list(prep.problems)
    protect = prep.protect
    cand = prep.cand
    i, governed_by, sm = choose(spec, tab, st, cand, ocpd, pick_i, own_i, hint, notes, problems,
                                cur.protection == PROTECTED)
    size = tab.sizes[i]
    mat = MAT[material]
    ins_col, term_col = st.ins_col, st.term_col
    cols = st.cols
    if tab.amp[ins_col][i] is None or tab.amp[term_col][i] is None:
        raise SizingError(f"Table 310.16 has no {mat} {size} in the {ins_col} or {term_col} C "
                          f"column")
    corrected_total = cols.corrected_total[i]
    term_total = cols.term_total[i]
    allowable_total = cols.allowable_total[i]
    if protect is None:
        protect_limit = cols.device_limit[i]
        if sm is not None:
            protect_limit = min(protect_limit, sm)
        device_margin = protect_limit - ocpd
    else:
        protect_limit = protect[i]
        device_max = cur.device_max_a if cur.device_max_a is not None else protect_limit
        if cur.protection == WELDER_CONDUCTORS:
            device_max = min(device_max, protect_limit)
        device_margin = device_max - ocpd if math.isfinite(device_max) else 0.0

    # drop with the method's table, or Table 8 DC resistance where Table 9 lacks the size
    zi = st.z[i]
    method_used = spec.method
    if zi is None:
        zi = z_table(material, "dc", st.family, 1.0, float(spec.conductor_temp_c),
                     bool(spec.stranded), spec.circuit.drop_angle_deg)[i]
        if zi is None:
            raise SizingError(f"NEC Ch. 9 Table 8 lists no solid {mat} {size}; solid conductors "
                              f"are listed up to {t_cond.SOLID_SIZES[-1]}")
        method_used = "dc"
        notes.append(f"NEC Ch. 9 Table 9 lists no {mat} {size}: drop from Table 8 DC resistance, "
                     f"reactance left out")
    elif method_used == "ac" and size in INTERPOLATED_SIZES:
        lo, hi = INTERPOLATED_SIZES[size]
        notes.append(f"NEC Ch. 9 Table 9 lists no {mat} {size}: its AC resistance (Table 8 DC "
                     f"resistance x the AC/DC ratio) and reactance interpolated in circular mils "
                     f"between {lo} and {hi}")

    # --- a motor starting --------------------------------------------------------------------
    eq = spec.equipment
    lra = start_z = None
    if eq is not None and eq.kind in MOTOR_KINDS:
        lra, start_z = _starting(spec, eq, i, st.family, st.z, notes)
    notes_a, problems_a = tuple(notes), tuple(problems)

    # --- EGC and raceway ------------------------------------------------------------------------
    circuit = spec.circuit
    hots = circuit.hots
    neutral = 1 if circuit.neutral else 0
    egc_size, n_egc, raceway_size, fill_pct, er_notes, er_problems = _egc_and_raceway(
        i, cur.egc_basis_a or ocpd, cand.ocpd_i if cand.ocpd_i is not None else cand.min_amp_i,
        sets, material, spec.egc_material or material, bool(spec.egc), bool(spec.egc_bare),
        st.insulation, st.rtype, hots, neutral, spec.bonding_jumper)
    notes_b: tuple[str, ...] = er_notes
    neutral_size = size if neutral else None
    if neutral and spec.neutral_amps is not None:
        neutral_size, n_notes = neutral_for(
            i, float(spec.neutral_amps), egc_size, material, cols, tab,
            circuit.phases == 3 and circuit.neutral_is_ccc)   # 310.15(E)(3): nonlinear loads
        notes_b += n_notes

    amps = prep.amps
    values = _RESULT_TEMPLATE.copy()
    values["size"] = size
    values["sets"] = sets
    values["material"] = material
    values["method"] = method_used
    values["amps"] = amps
    values["design_amps"] = design
    values["required_ampacity_a"] = prep.need
    values["ampacity_a"] = allowable_total
    values["min_ampacity_size"] = (tab.sizes[cand.min_amp_i] if cand.min_amp_i is not None
                                   else tab.sizes[-1])
    values["ocpd_a"] = ocpd
    values["egc_size"] = egc_size
    values["neutral_size"] = neutral_size
    values["raceway"] = st.rtype
    values["raceway_size"] = raceway_size
    values["raceway_fill_pct"] = fill_pct
    values["governed_by"] = governed_by
    values["problems"] = problems_a + er_problems
    values["notes"] = notes_a + notes_b
    if eq is not None:
        values["load_kind"] = eq.kind
        values["flc_a"] = cur.flc_a
        values["locked_rotor_a"] = lra
    values["kind_rule"] = cur.rule
    upsized = None
    if governed_by == "voltage drop":
        base = tab.sizes[cand.ocpd_i if cand.ocpd_i is not None else cand.min_amp_i or 0]
        upsized = (f"upsized from {base} for voltage drop (",
                   f" of {circuit.volts:g} V)")   # the drop's percent between (``pct_text``)
    return _Part(i, governed_by, zi, start_z, upsized,
                 upsized is not None or start_z is not None, values,
                 {"hot": hots, "neutral": neutral, "egc": n_egc}, notes_a, notes_b, problems_a,
                 er_problems, term_total,
                 corrected_total, allowable_total, protect_limit, sm,
                 (allowable_total - amps, term_total - design, corrected_total - amps,
                  device_margin))


def _starting(spec: RunSpec, eq: Equipment, i: int, family: str, z: tuple,
              notes: list[str]) -> tuple[float | None, float | None]:
    """A motor's locked-rotor current (``kinds.locked_rotor``) and the impedance of the size at
    index ``i`` while it starts: the same conductor at the starting power factor
    (``kinds.STARTING_PF``; the DC and K-factor methods have no reactance and take R)
    [ohm/kft]: ``(locked-rotor amps, impedance)``, each None where it cannot be read (no
    starting drop is then worked)."""
    circuit = spec.circuit
    lra, why = locked_rotor(eq, circuit.volts, circuit.phases)
    if eq.kind != "fire-pump":   # a fire pump's rule said it, with its device
        notes.append(why)
    if lra is None:
        return None, None
    zs = _starting_z(spec, family, i, circuit.drop_angle_deg)
    return lra, (z[i] if zs is None else zs)


def _starting_z(spec: RunSpec, family: str, i: int, shift_deg: float) -> float | None:
    """One conductor of the size at index ``i`` at the starting power factor
    (``kinds.STARTING_PF``) [ohm/kft]; the DC and K-factor methods have no reactance and take R
    (as ``columns.z_table``). None where the method's table lacks the size."""
    rx = rx_of(spec.material, spec.method, family, float(spec.conductor_temp_c),
               bool(spec.stranded), i)
    if rx is None:
        return None
    if spec.method == "ac":
        return shifted_z(rx[0], rx[1], STARTING_PF, shift_deg)
    return rx[0] * math.cos(math.radians(shift_deg))


def starting_impedance(spec: RunSpec, size: str) -> float | None:
    """One conductor of ``size`` on the run ``spec`` describes (its material, drop method,
    raceway and temperature) while a motor it supplies starts [ohm/kft]: what a feeder adds to
    the dip at a motor below it (``gaugewalk.model.walk.starting``). None where the method's
    table lacks the size."""
    family = resolve_raceway(spec.raceway)[1]
    sizes = material_table(spec.material).sizes
    if size not in sizes:
        return None
    return _starting_z(spec, family, sizes.index(size), 0.0)


def _starting_drop(spec: RunSpec, lra: float, zs: float, notes: list[str],
                   problems: list[str]) -> float:
    """The drop on this run while a motor starts [%], at its locked-rotor current ``lra`` [A]
    on the starting impedance ``zs`` [ohm/kft] (``_starting``), against the job's starting
    target. The feeders and transformers above add their own part of the dip at the motor,
    which a walk works (``gaugewalk.model.walk.starting``)."""
    circuit = spec.circuit
    vd = drop_volts(circuit.drop_factor, lra, zs, drop_length_ft(spec.length_ft, spec.distributed),
                    spec.sets)
    pct = 100.0 * vd / circuit.volts
    how = (f"at power factor {STARTING_PF:g} (common practice)" if spec.method == "ac"
           else "on resistance alone (the drop method has no reactance)")
    eq = spec.equipment
    why = ("NEC 695.7(A): at the fire pump controller's line terminals, not more than 15% below "
           "normal while the motor starts" if eq is not None and eq.kind == "fire-pump"
           else "common practice: 10 to 15%")
    notes.append(f"starting drop {pct_text(pct)} ({vd:.1f} V) at {amps_text(lra)} locked-rotor, "
                 f"{how}, on this run alone (in a walk, the starting dip from the service adds "
                 f"the feeders and any transformer above it); target "
                 f"{spec.starting_drop_pct:g}% ({why})")
    if pct > spec.starting_drop_pct + 1e-9:
        problems.append(f"the motor starting drop {pct_text(pct)} on this run is over the "
                        f"{spec.starting_drop_pct:g}% starting target (a larger size, or a "
                        f"reduced-voltage start, brings it down)")
    return pct


def _parallel_hint(spec: RunSpec, z: tuple[float | None, ...]) -> str:
    """'; 3 sets in parallel would' when more sets make the run work. ``z``: the impedance
    column of the run [ohm/kft] (the same for any number of sets)."""
    if spec.size is not None:
        return ""
    if spec.upstream_drop_pct >= spec.max_total_drop_pct:
        return ""  # the drop up to the source takes the whole total target: no sets would do
    # A number of sets whose drop on the lowest impedance of the column is over the limit
    # cannot be picked (``pick_conductor`` asks the drop of the size it picks to be within the
    # limit), so its evaluation is not ok; it is left out. Such an evaluation raises only where
    # the run's own does after this hint (the device's EGC, the column's last size), so the
    # hint is the same as evaluating every number of sets.
    z_min = min(v for v in z if v is not None)
    circuit = spec.circuit
    amps, length = float(spec.amps), drop_length_ft(spec.length_ft, spec.distributed)
    pct_per_volt = 100.0 / circuit.volts
    limit = drop_limit(spec)
    for sets in range(spec.sets + 1, 13):
        if (drop_volts(circuit.drop_factor, amps, 1.0, length, sets) * z_min * pct_per_volt
                > limit):
            continue
        try:
            r = _evaluate(with_fields(spec, sets=sets), hint=False)
        except (TableLookupError, SizingError):
            return ""
        if r.ok:
            return f"; {sets} sets of {r.size} in parallel would (NEC 310.10(G))"
    return ""
