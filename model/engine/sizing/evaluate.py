"""``evaluate(RunSpec) -> RunResult``: one run sized, rule by rule, in the order the rules
apply: the spec checked (``spec``), the design current and device (``currents``, or the load
kind's rule, ``kinds``), the installation's columns (``columns``), the conductor picked
(``pick``), its drop (``gaugewalk.model.engine.drop``; a motor's starting drop too), then the
EGC (``egc``) and the raceway (``raceway``).

Pure: no I/O. The work runs share (the device, the columns, the EGC and the raceway of a size)
is cached, so thousands of runs evaluate quickly.
"""

from __future__ import annotations

import math
from dataclasses import MISSING, fields
from functools import lru_cache

from gaugewalk.model.engine.circuits import current_carrying_conductors
from gaugewalk.model.engine.contract import Equipment, RunResult, RunSpec, with_fields
from gaugewalk.model.engine.drop import (
    INTERPOLATED_SIZES,
    drop_length_ft,
    drop_volts,
    shifted_z,
)
from gaugewalk.model.engine.sizing.columns import MAT, material_table, rx_of, setting, z_table
from gaugewalk.model.engine.sizing.currents import (
    BY_ARTICLE,
    GENERAL,
    PROTECTED,
    WELDER_CONDUCTORS,
    motor_feeder,
)
from gaugewalk.model.engine.sizing.egc import egc_for
from gaugewalk.model.engine.sizing.kinds import STARTING_PF, locked_rotor, rule_for
from gaugewalk.model.engine.sizing.neutral import neutral_for
from gaugewalk.model.engine.sizing.pick import drop_limit, pick_conductor, size_problems
from gaugewalk.model.engine.sizing.raceway import raceway_fill
from gaugewalk.model.engine.sizing.spec import SizingError, check_spec
from gaugewalk.model.engine.sizing.text import amps_text, pct_text
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


def evaluate_picked(spec: RunSpec) -> tuple[RunResult, float]:
    """``evaluate``, with the least drop [%] of the smaller sizes it passed over for their drop
    alone (rules 1, 2 and 4 allowed them; ``pick.pick_conductor``), infinity where it passed
    over none: any drop limit below that picks the same size again, which is how
    ``gaugewalk.model.walk.recompute`` tells that a run's size stays when the drop up to its
    source falls. The drop of a size does not depend on that upstream drop."""
    check_spec(spec)
    try:
        return _evaluate_pick(spec, True)
    except TableLookupError as exc:
        raise SizingError(str(exc)) from None


@lru_cache(maxsize=8192)
def _egc_and_raceway(i: int, ocpd: int, base_i: int | None, sets: int, material: str,
                     egc_mat: str, egc: bool, egc_bare: bool, insulation: str, rtype: str,
                     hots: int, neutral: int) -> tuple:
    """EGC (``egc.egc_for``) and raceway (``raceway.raceway_fill``) for the picked size index
    ``i``: ``(egc_size, n_egc, raceway_size, fill_pct, notes, problems)``. Depends on neither
    length nor load, so it is cached."""
    egc_size, notes = egc_for(i, ocpd, base_i, sets, material, egc_mat) if egc else (None, ())
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
    """``_evaluate``, with the least drop of the sizes passed over (``evaluate_picked``)."""
    circuit = spec.circuit
    material = spec.material
    tab = material_table(material)
    sets = spec.sets
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
    notes: list[str] = [*circuit.notes, *cur.notes]
    problems: list[str] = [*cur.problems]

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
                 bool(spec.stranded), sets, bool(spec.distributed), circuit.drop_angle_deg,
                 terminal_why)
    notes.extend(st.notes)
    ins_col, term_col = st.ins_col, st.term_col
    cols = st.cols
    z = st.z
    protection = cur.protection
    if protection == PROTECTED:
        protect = None
    elif protection == BY_ARTICLE:
        protect = (math.inf,) * len(z)
    else:  # WELDER_CONDUCTORS, NEC 630.12(B)
        protect = tuple(2.0 * a for a in cols.allowable_total)

    # --- the conductor -------------------------------------------------------------------------
    # VD = k I z L / 1000 / sets is linear in z: the drop per ohm/kft, once for the run
    volts_per_z = drop_volts(circuit.drop_factor, amps, 1.0,
                             drop_length_ft(spec.length_ft, spec.distributed), sets)
    pct_per_volt = 100.0 / circuit.volts
    i, governed_by, min_amp_i, ocpd_i, pick_i, sm, passed = pick_conductor(
        spec, tab, st, design, need, ocpd, volts_per_z, pct_per_volt,
        _parallel_hint if hint else None, notes, problems, protect, protection == PROTECTED)
    size = tab.sizes[i]
    mat = MAT[material]
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
        if protection == WELDER_CONDUCTORS:
            device_max = min(device_max, protect_limit)
        device_margin = device_max - ocpd if math.isfinite(device_max) else 0.0

    # drop with the method's table, or Table 8 DC resistance where Table 9 lacks the size
    zi = z[i]
    method_used = spec.method
    if zi is None:
        zi = z_table(material, "dc", st.family, 1.0, float(spec.conductor_temp_c),
                     bool(spec.stranded), circuit.drop_angle_deg)[i]
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
    vd_v = volts_per_z * zi
    vd_pct = vd_v * pct_per_volt
    total_pct = spec.upstream_drop_pct + vd_pct

    if spec.size is not None or pick_i is None:
        size_problems(size, material, term_col, design, need, ocpd, term_total, corrected_total,
                      allowable_total, protect_limit, sm, vd_pct, total_pct, spec.max_drop_pct,
                      spec.max_total_drop_pct, problems,
                      cur.rule if eq is not None and eq.kind != "general" and cur.rule
                      else "NEC 110.14(C)(1), 210.19(A)(1)",
                      "NEC 630.12(B)" if protection == WELDER_CONDUCTORS else "NEC 240.4")

    # --- a motor starting --------------------------------------------------------------------
    lra = start_pct = None
    if eq is not None and eq.kind == "motor":
        lra, start_pct = _starting(spec, eq, i, st.family, z, notes, problems)
    if governed_by == "voltage drop":
        base = tab.sizes[ocpd_i] if ocpd_i is not None else tab.sizes[min_amp_i or 0]
        notes.append(f"upsized from {base} for voltage drop ({pct_text(vd_pct)} of "
                     f"{circuit.volts:g} V)")

    # --- EGC and raceway ------------------------------------------------------------------------
    hots = circuit.hots
    neutral = 1 if circuit.neutral else 0
    egc_size, n_egc, raceway_size, fill_pct, er_notes, er_problems = _egc_and_raceway(
        i, cur.egc_basis_a or ocpd, ocpd_i if ocpd_i is not None else min_amp_i, sets, material,
        spec.egc_material or material, bool(spec.egc), bool(spec.egc_bare), st.insulation,
        st.rtype, hots, neutral)
    notes.extend(er_notes)
    problems.extend(er_problems)
    neutral_size = size if neutral else None
    if neutral and spec.neutral_amps is not None:
        neutral_size, n_notes = neutral_for(i, float(spec.neutral_amps), egc_size, material,
                                            cols, tab)
        notes.extend(n_notes)

    margins = {
        "ampacity_a": allowable_total - amps,
        "terminal_a": term_total - design,
        "corrected_a": corrected_total - amps,
        "ocpd_a": device_margin,
        "drop_pct": spec.max_drop_pct - vd_pct,
        "total_drop_pct": spec.max_total_drop_pct - total_pct,
    }
    # Built without the per-field object.__setattr__ of a frozen dataclass's __init__ (a third
    # of the engine's time per run): every field of RunResult is set, in field order, into a copy
    # of a dict that holds them all (a copy and item sets cost half a dict display of 23 keys).
    result = _new_object(RunResult)
    values = _RESULT_TEMPLATE.copy()
    values["size"] = size
    values["sets"] = sets
    values["material"] = material
    values["method"] = method_used
    values["amps"] = amps
    values["design_amps"] = design
    values["required_ampacity_a"] = need
    values["ampacity_a"] = allowable_total
    values["min_ampacity_size"] = tab.sizes[min_amp_i] if min_amp_i is not None else tab.sizes[-1]
    values["ocpd_a"] = ocpd
    values["voltage_drop_v"] = vd_v
    values["voltage_drop_pct"] = vd_pct
    values["total_drop_pct"] = total_pct
    values["egc_size"] = egc_size
    values["neutral_size"] = neutral_size
    values["raceway"] = st.rtype
    values["raceway_size"] = raceway_size
    values["raceway_fill_pct"] = fill_pct
    values["governed_by"] = governed_by
    values["margins"] = margins
    values["conductors"] = {"hot": hots, "neutral": neutral, "egc": n_egc}
    values["problems"] = tuple(problems)
    values["notes"] = tuple(notes)
    if eq is not None:
        values["load_kind"] = eq.kind
        values["flc_a"] = cur.flc_a
        values["locked_rotor_a"] = lra
        values["starting_drop_pct"] = start_pct
    values["kind_rule"] = cur.rule
    _set_attr(result, "__dict__", values)
    return result, passed


def _starting(spec: RunSpec, eq: Equipment, i: int, family: str, z: tuple,
              notes: list[str], problems: list[str]) -> tuple[float | None, float | None]:
    """The drop while a motor starts [%], at its locked-rotor current (``kinds.locked_rotor``)
    and the same conductor impedance at the starting power factor (``kinds.STARTING_PF``; the
    DC and K-factor methods have no reactance and take R), against the job's starting target:
    ``(locked-rotor amps, drop %)``, None where no locked-rotor current can be read."""
    circuit = spec.circuit
    lra, why = locked_rotor(eq, circuit.volts, circuit.phases)
    notes.append(why)
    if lra is None:
        return None, None
    zs = z[i]
    if spec.method == "ac":
        rx = rx_of(spec.material, "ac", family, float(spec.conductor_temp_c),
                   bool(spec.stranded), i)
        if rx is not None:
            zs = shifted_z(rx[0], rx[1], STARTING_PF, circuit.drop_angle_deg)
    if zs is None:
        return lra, None
    vd = drop_volts(circuit.drop_factor, lra, zs, drop_length_ft(spec.length_ft, spec.distributed),
                    spec.sets)
    pct = 100.0 * vd / circuit.volts
    how = (f"at power factor {STARTING_PF:g} (common practice)" if spec.method == "ac"
           else "on resistance alone (the drop method has no reactance)")
    notes.append(f"starting drop {pct_text(pct)} ({vd:.1f} V) at {amps_text(lra)} locked-rotor, "
                 f"{how}; target {spec.starting_drop_pct:g}% (common practice: 10 to 15%)")
    if pct > spec.starting_drop_pct + 1e-9:
        problems.append(f"the motor starting drop {pct_text(pct)} is over the "
                        f"{spec.starting_drop_pct:g}% starting target (a larger size, or a "
                        f"reduced-voltage start, brings it down)")
    return lra, pct


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
