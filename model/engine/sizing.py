"""Size one run: ``evaluate(RunSpec) -> RunResult``.

The phase conductor is the smallest size (14 AWG Cu, 12 AWG Al and up; NEC 2023) that meets

1. ampacity: the terminal-column ampacity, unadjusted, is at least the noncontinuous load plus
   125% of the continuous load (NEC 210.19(A)(1)(a), 215.2(A)(1)(a), 110.14(C)(1)); the
   insulation-column ampacity after the ambient (310.15(B)(1)) and bundling (310.15(C)(1))
   corrections is at least the load (210.19(A)(1)(b), 215.2(A)(1)(b));
2. the overcurrent device protects it: device at most the conductor's ampacity, or the next
   standard rating up to 800 A (240.4(B), (C)), and within the small-conductor limits of
   240.4(D);
3. the voltage-drop targets: this run's drop and the drop from the service (informational notes
   to 210.19(A) and 215.2(A); recommendations, made binding here as the job's targets).

Terminals (110.14(C)(1)) are taken by the circuit rating: 60 C for a device of 100 A or less,
75 C above; equipment marked otherwise (75 C lugs on a small breaker, or lugs marked for 14-1 AWG
on a larger one) is given with ``RunSpec.terminal_temp``.

Then the EGC (Table 250.122 with 250.122(B) and (F)) and the raceway trade size (Ch. 9 Tables 1,
4 and 5). Pure: no I/O. Table lookups are cached per material, column and drop method so that
thousands of runs evaluate quickly.
"""

from __future__ import annotations

import math
from bisect import bisect_left
from dataclasses import MISSING, dataclass, fields
from functools import lru_cache

from gaugewalk.model.engine.drop import conductor_z, effective_z, temperature_corrected
from gaugewalk.model.engine.contract import RunResult, RunSpec
from gaugewalk.model.engine.circuits import current_carrying_conductors
from gaugewalk.tables.conductor import ampacity as t_amp
from gaugewalk.tables.conductor import properties as t_cond
from gaugewalk.tables.protection import egc as t_egc
from gaugewalk.tables.conductor import impedance as t_imp
from gaugewalk.tables.protection import ocpd as t_ocpd
from gaugewalk.tables.raceway import fill as t_race
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.conductor.sizes import SIZES, canonical, parse_size, size_index

START_SIZE = {"cu": "14 AWG", "al": "12 AWG"}
"""Smallest size used for power circuits [AWG]: 14 AWG copper, 12 AWG aluminum (Table 310.16
lists no smaller aluminum; 18 and 16 AWG copper are for control and fixture wiring)."""

PARALLEL_MIN_SIZE = "1/0 AWG"
"""NEC 310.10(G)(1): conductors in parallel are 1/0 AWG and larger."""

FAMILY_REPRESENTATIVE = {"steel": "EMT", "pvc": "PVC-40", "aluminum": "ARMC"}
"""Raceway type used for conduit fill when only a family is given (common practice: EMT is the
usual steel raceway indoors, Schedule 40 the usual PVC; rigid for aluminum)."""

MAT = {"cu": "Cu", "al": "Al"}
_EPS = 1e-9


class SizingError(ValueError):
    """A run that cannot be evaluated at all: the message names the field and why."""


# ---------------------------------------------------------------------------------------------
# cached table columns


@dataclass(frozen=True)
class _MaterialTable:
    sizes: tuple[str, ...]                          # START_SIZE .. 2000 kcmil
    cmil: tuple[float, ...]                         # [cmil]
    amp: dict[int, tuple[float | None, ...]]        # column [C] -> ampacity [A]
    small_max: tuple[int | None, ...]               # 240.4(D) [A]
    parallel_ok: tuple[bool, ...]                   # 310.10(G)


@lru_cache(maxsize=None)
def _material_table(material: str) -> _MaterialTable:
    sizes = SIZES[SIZES.index(START_SIZE[material]):]
    return _MaterialTable(
        sizes=sizes,
        cmil=tuple(t_cond.circular_mils(s) for s in sizes),
        amp={c: tuple(t_amp.ampacity(s, material, c) for s in sizes) for c in t_amp.COLUMNS},
        small_max=tuple(t_ocpd.small_conductor_max_ocpd(s, material) for s in sizes),
        parallel_ok=tuple(SIZES.index(s) >= SIZES.index(PARALLEL_MIN_SIZE) for s in sizes),
    )


@dataclass(frozen=True)
class _AmpacityColumns:
    first: int                               # first size usable (310.10(G) for parallel sets)
    term_total: tuple[float, ...]            # [A] terminal-column ampacity x sets, unadjusted
    corrected_total: tuple[float, ...]       # [A] insulation column x corrections x sets
    allowable_total: tuple[float, ...]       # [A] the smaller of the two
    protect_limit: tuple[float, ...]         # [A] largest device permitted (240.4(B)-(D))
    device_limit: tuple[float, ...]          # [A] the same by 240.4(B), (C) alone


@lru_cache(maxsize=4096)
def _ampacity_columns(material: str, ins_col: int, term_col: int, factor: float,
                      sets: int) -> _AmpacityColumns:
    tab = _material_table(material)
    term, corr, allow, prot, dev = [], [], [], [], []
    first = None
    for i, _size in enumerate(tab.sizes):
        ia, ta = tab.amp[ins_col][i], tab.amp[term_col][i]
        if ia is None or ta is None:
            term.append(-1.0), corr.append(-1.0), allow.append(-1.0), prot.append(-1.0)
            dev.append(-1.0)
            continue
        if first is None and (sets == 1 or tab.parallel_ok[i]):
            first = i
        corrected = ia * factor * sets
        allowable = min(ia * factor, ta) * sets
        limit = _protect_limit(allowable)
        dev.append(limit)
        if tab.small_max[i] is not None:
            limit = min(limit, float(tab.small_max[i]))
        term.append(ta * sets), corr.append(corrected), allow.append(allowable)
        prot.append(limit)
    return _AmpacityColumns(first if first is not None else len(tab.sizes), tuple(term),
                            tuple(corr), tuple(allow), tuple(prot), tuple(dev))


@lru_cache(maxsize=256)
def _rx_table(material: str, method: str, family: str, temp_c: float,
              stranded: bool) -> tuple[tuple[float, float] | None, ...]:
    """(R at ``temp_c``, XL) per conductor [ohm/kft] for each size; XL is 0 for the DC and
    K-factor methods; None where the method's table lacks the size."""
    out: list[tuple[float, float] | None] = []
    for s in _material_table(material).sizes:
        try:
            if method == "ac":
                r = temperature_corrected(t_imp.ac_resistance(s, material, family),
                                          t_cond.ALPHA[material], temp_c)
                out.append((r, t_imp.reactance(s, family)))
            else:
                out.append((conductor_z(s, material, method, temp_c=temp_c, stranded=stranded),
                            0.0))
        except TableLookupError:
            out.append(None)
    return tuple(out)


@lru_cache(maxsize=4096)
def _z_table(material: str, method: str, family: str, pf: float, temp_c: float,
             stranded: bool) -> tuple[float | None, ...]:
    """Impedance per conductor [ohm/kft] for each size (``gaugewalk.model.engine.drop.conductor_z``, from cached
    R and XL columns); None where the method's table lacks the size."""
    rx = _rx_table(material, method, family, temp_c, stranded)
    if method != "ac":
        return tuple(None if v is None else v[0] for v in rx)
    return tuple(None if v is None else effective_z(v[0], v[1], pf) for v in rx)


@lru_cache(maxsize=256)
def _insulation(text: str) -> tuple[str, int]:
    canon = t_amp.parse_insulation(text)
    return canon, t_amp.insulation_rating(canon)


@lru_cache(maxsize=None)
def _cmil(size: str) -> float:
    return t_cond.circular_mils(size)


@lru_cache(maxsize=256)
def resolve_raceway(text: str) -> tuple[str, str, str | None]:
    """A raceway type or family name -> ``(type, family, note)``.

    A family (``steel``, ``pvc``, ``aluminum``) is filled as its representative type
    (``FAMILY_REPRESENTATIVE``) and the note says so. Raises ``TableLookupError`` for names
    neither table knows.
    """
    key = str(text).strip().lower()
    if key in FAMILY_REPRESENTATIVE:
        rtype = t_race.parse_raceway(FAMILY_REPRESENTATIVE[key])
        return rtype, key, f"raceway family '{key}': conduit fill figured for {rtype}"
    try:
        rtype = t_race.parse_raceway(text)
    except TableLookupError as exc:
        raise TableLookupError(f"{exc}; families are {', '.join(FAMILY_REPRESENTATIVE)}") from None
    return rtype, t_race.raceway_family(rtype), None


@lru_cache(maxsize=256)
def _raceway_sizes(rtype: str) -> tuple[tuple[str, float], ...]:
    return tuple((ts, t_race.internal_area_in2(rtype, ts)) for ts in t_race.trade_sizes(rtype))


@lru_cache(maxsize=4096)
def _insulated_area(size: str, insulation: str) -> float:
    return t_race.insulated_area_in2(size, insulation)


@lru_cache(maxsize=4096)
def _bare_area(size: str, stranded: bool) -> float:
    return t_cond.bare_area_in2(size, stranded)


# ---------------------------------------------------------------------------------------------
# helpers


def _a(x: float) -> str:
    """Amps for a sentence: ``20 A``, ``24.5 A``."""
    r = round(x, 1)
    return f"{r:g} A" if abs(r) < 1e6 else f"{r:.0f} A"


def _pct(x: float) -> str:
    return f"{x:.2f}%"


def _bad_positive(v: object) -> bool:
    return v.__class__ not in (int, float) or not (0 < v < math.inf)


_NUMBER = (int, float)
_METHODS = ("dc", "kfactor", "ac")


@lru_cache(maxsize=256)
def _size_known(text: str) -> bool:
    try:
        parse_size(text)
    except TableLookupError:
        return False
    return True


def _check_spec(spec: RunSpec) -> None:
    """Refuse a spec the engine cannot evaluate, naming the field.

    One combined test passes the usual valid spec; anything it does not pass goes through the
    field-by-field checks, in the same order, which name the field."""
    a, ln, m, t = spec.amps, spec.length_ft, spec.max_drop_pct, spec.max_total_drop_pct
    v = spec.circuit.volts
    ca, tt, ccc, ms, oc = (spec.continuous_amps, spec.terminal_temp, spec.ccc, spec.min_size,
                           spec.ocpd_a)
    if (a.__class__ in _NUMBER and 0 < a < math.inf
            and ln.__class__ in _NUMBER and 0 < ln < math.inf
            and m.__class__ in _NUMBER and 0 < m < math.inf
            and t.__class__ in _NUMBER and 0 < t < math.inf
            and v.__class__ in _NUMBER and 0 < v < math.inf
            and 0 < spec.pf <= 1
            and spec.sets.__class__ is int and 1 <= spec.sets <= 20
            and spec.material in START_SIZE and spec.method in _METHODS
            and (tt is None or tt in t_amp.COLUMNS)
            and (ccc is None or (ccc.__class__ is int and ccc >= 1))
            and (ca is None or 0 <= ca <= a)
            and 0 <= spec.upstream_drop_pct < math.inf
            and -40 <= spec.conductor_temp_c <= 250
            and (ms is None or (ms.__class__ is str and _size_known(ms)))
            and (oc is None or (oc.__class__ is int and oc > 0))):
        return
    _check_spec_fields(spec)


def _check_spec_fields(spec: RunSpec) -> None:
    """The field-by-field checks of ``_check_spec``: raise naming the first bad field."""
    for name in ("amps", "length_ft", "max_drop_pct", "max_total_drop_pct"):
        v = getattr(spec, name)
        if _bad_positive(v):
            raise SizingError(f"{name} must be a number above zero, not {v!r}")
    if _bad_positive(spec.circuit.volts):
        raise SizingError(f"circuit.volts must be a number above zero, not {spec.circuit.volts!r}")
    if not (0 < spec.pf <= 1):
        raise SizingError(f"pf must be above 0 and at most 1, not {spec.pf!r}")
    if spec.sets.__class__ is not int or not 1 <= spec.sets <= 20:
        raise SizingError(f"sets must be a whole number from 1 to 20, not {spec.sets!r}")
    if spec.material not in START_SIZE:
        raise SizingError(f"material must be cu or al, not {spec.material!r}")
    if spec.method not in ("dc", "kfactor", "ac"):
        raise SizingError(f"method must be dc, kfactor or ac, not {spec.method!r}")
    if spec.terminal_temp is not None and spec.terminal_temp not in t_amp.COLUMNS:
        raise SizingError(f"terminal_temp must be 60, 75 or 90, not {spec.terminal_temp!r}")
    if spec.ccc is not None and (spec.ccc.__class__ is not int or spec.ccc < 1):
        raise SizingError(f"ccc must be a whole number of 1 or more, not {spec.ccc!r}")
    if spec.continuous_amps is not None and not (0 <= spec.continuous_amps <= spec.amps):
        raise SizingError(
            f"continuous_amps must be between 0 and the load ({spec.amps:g} A), "
            f"not {spec.continuous_amps!r}")
    if not (0 <= spec.upstream_drop_pct < math.inf):
        raise SizingError(f"upstream_drop_pct must be zero or more, not {spec.upstream_drop_pct!r}")
    if not (-40 <= spec.conductor_temp_c <= 250):
        raise SizingError(
            f"conductor_temp_c must be from -40 to 250 C, not {spec.conductor_temp_c!r}")
    if spec.min_size is not None:
        try:
            parse_size(spec.min_size)
        except TableLookupError as exc:
            raise SizingError(f"min_size: {exc}") from None
    if spec.ocpd_a is not None and (spec.ocpd_a.__class__ is not int or spec.ocpd_a <= 0):
        raise SizingError(f"ocpd_a must be a whole number of amperes, not {spec.ocpd_a!r}")


_RATINGS = t_ocpd.STANDARD_RATINGS


def _next_rating(amps: float) -> int:
    """NEC 240.6(A) next standard rating at or above ``amps`` (bisect over the table)."""
    i = bisect_left(_RATINGS, amps)
    if i == len(_RATINGS):
        return t_ocpd.next_standard_rating(amps)  # raises with the table's message
    return _RATINGS[i]


_ambient = lru_cache(maxsize=1024)(t_amp.ambient_factor)
_ccc_factor = lru_cache(maxsize=256)(t_amp.ccc_factor)
_egc_table = lru_cache(maxsize=1024)(t_egc.egc_size)
_fill_limit = lru_cache(maxsize=64)(t_race.fill_limit_pct)


def _smallest_at_least(cmil_needed: float, material: str) -> str:
    tab = _material_table(material)
    for s, c in zip(tab.sizes, tab.cmil):
        if c >= cmil_needed * (1 - 1e-9):
            return s
    return tab.sizes[-1]


# ---------------------------------------------------------------------------------------------
# the engine


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
    _check_spec(spec)
    try:
        return _evaluate(spec)
    except TableLookupError as exc:
        raise SizingError(str(exc)) from None


@lru_cache(maxsize=4096)
def _currents(amps: float, cont: float, ocpd_a: int | None) -> tuple[float, int, tuple, tuple]:
    """Design current [A] (NEC 210.19(A)(1), 215.2(A)(1)) and the device [A] (240.6(A)), with
    their notes and problems; cached per load, continuous share and given device."""
    notes: list[str] = []
    problems: list[str] = []
    design = amps - cont + 1.25 * cont
    if cont > 0:
        rest = f"{_a(amps - cont)} + " if amps - cont > _EPS else ""
        notes.append(f"NEC 210.19(A)(1), 215.2(A)(1): {rest}125% of {_a(cont)} continuous = "
                     f"{_a(design)}")
    if ocpd_a is not None:
        ocpd = ocpd_a
        if ocpd + _EPS < design:
            problems.append(f"the {ocpd} A device is below the {_a(design)} the circuit needs "
                            f"(NEC 210.20(A), 215.3)")
    else:
        ocpd = _next_rating(design)
        notes.append(f"NEC 240.6(A): {ocpd} A device, the next standard rating at or above "
                     f"{_a(design)}")
    return design, ocpd, tuple(notes), tuple(problems)


@dataclass(frozen=True)
class _Setting:
    """What follows from the device, the insulation and the installation, the same for every
    run that shares them: columns, corrections, ampacity and impedance tables, raceway."""
    insulation: str
    ins_col: int                     # [C]
    term_col: int                    # [C]
    factor: float                    # ambient x bundling
    cols: _AmpacityColumns
    z: tuple[float | None, ...]      # [ohm/kft]
    rtype: str
    family: str
    notes: tuple[str, ...]


@lru_cache(maxsize=4096)
def _setting(material: str, insulation_text: str, terminal_temp: int | None, ocpd: int,
             ambient_c: float, n_ccc: int, raceway: str, method: str, pf: float,
             conductor_temp_c: float, stranded: bool, sets: int, distributed: bool) -> _Setting:
    """Terminal column (NEC 110.14(C)(1)), corrections (310.15(B)(1), (C)(1)), the raceway and
    the impedance column of one installation; cached so that runs alike share the work."""
    notes: list[str] = []
    insulation, ins_col = _insulation(insulation_text)
    if terminal_temp is not None:
        term_col = terminal_temp
        term_why = "terminals as given"
    elif ocpd <= 100:
        term_col, term_why = 60, f"circuit rated {ocpd} A, 100 A or less"
    else:
        term_col, term_why = 75, f"circuit rated {ocpd} A, over 100 A"
    if term_col > ins_col:
        term_col, term_why = ins_col, f"{insulation} is rated {ins_col} C"
    notes.append(f"NEC 110.14(C)(1): {term_col} C terminal column ({term_why})")
    amb = _ambient(ambient_c, ins_col)
    adj = _ccc_factor(n_ccc)
    if amb != 1.0:
        notes.append(f"NEC 310.15(B)(1)(1): {ambient_c:g} C ambient, factor {amb:g} on the "
                     f"{ins_col} C column")
    if adj != 1.0:
        notes.append(f"NEC 310.15(C)(1): {n_ccc} current-carrying conductors, factor {adj:g}")
    factor = amb * adj
    rtype, family, race_note = resolve_raceway(raceway)
    if race_note:
        notes.append(race_note)
    z = _z_table(material, method, family, pf, conductor_temp_c, stranded)
    if distributed:
        notes.append("load spread along the run: whole load at half the length (common practice)")
    cols = _ampacity_columns(material, ins_col, term_col, factor, sets)
    return _Setting(insulation, ins_col, term_col, factor, cols, z, rtype, family, tuple(notes))


@lru_cache(maxsize=8192)
def _egc_and_raceway(i: int, ocpd: int, base_i: int | None, sets: int, material: str,
                     egc_mat: str, egc: bool, egc_bare: bool, insulation: str, rtype: str,
                     hots: int, neutral: int) -> tuple:
    """EGC (NEC Table 250.122 with 250.122(A), (B) and (F)) and raceway trade size (Ch. 9 Table
    1) for the picked size index ``i``: ``(egc_size, n_egc, raceway_size, fill_pct, notes,
    problems)``. Depends on neither length nor load, so it is cached."""
    tab = _material_table(material)
    size = tab.sizes[i]
    notes: list[str] = []
    problems: list[str] = []
    egc_size = None
    if egc:
        egc_size = table_egc = _egc_table(ocpd, egc_mat)
        notes.append(f"NEC Table 250.122: {table_egc} {MAT[egc_mat]} EGC for a {ocpd} A device")
        if base_i is not None and i > base_i:
            # NEC 250.122(B): the baseline is the smallest size with ampacity for the installation
            # (after the 310.15(B)/(C) corrections and the device rules), so upsizing forced by the
            # corrections does not count; upsizing for drop does.
            ratio = tab.cmil[i] / tab.cmil[base_i]
            bigger = _smallest_at_least(_cmil(egc_size) * ratio, egc_mat)
            if _cmil(bigger) > _cmil(egc_size):
                notes.append(f"NEC 250.122(B): EGC {egc_size} increased to {bigger} in proportion "
                             f"to the phase conductors ({tab.sizes[base_i]} to {size}, "
                             f"x{ratio:.3f} circular mils)")
                egc_size = bigger
        if _cmil(egc_size) > tab.cmil[i]:
            notes.append(f"NEC 250.122(A): EGC limited to the phase conductor size {size}")
            egc_size = size
        if sets > 1:
            notes.append(f"NEC 250.122(F): a full {egc_size} EGC in each of the {sets} raceways")

    n_egc = 1 if egc_size else 0
    count = hots + neutral + n_egc
    fill_limit = _fill_limit(count)
    raceway_size = None
    fill_pct = 0.0
    per = f" per raceway ({sets} raceways)" if sets > 1 else ""
    try:
        area = (hots + neutral) * _insulated_area(size, insulation)
        if egc_size:
            area += (_bare_area(egc_size, True) if egc_bare
                     else _insulated_area(egc_size, insulation))
    except TableLookupError as exc:
        area = None
        problems.append(f"raceway not sized: {exc}")
    if area is not None:
        for ts, internal in _raceway_sizes(rtype):
            if area <= internal * fill_limit / 100.0 + _EPS:
                raceway_size, fill_pct = ts, 100.0 * area / internal
                break
        if raceway_size is None:
            largest_ts, largest = _raceway_sizes(rtype)[-1]
            fill_pct = 100.0 * area / largest
            problems.append(f"no {rtype} trade size holds {count} conductors{per} "
                            f"({area:.3f} in2) within the {fill_limit:g}% fill of NEC Ch. 9 "
                            f"Table 1; {largest_ts} would be {fill_pct:.0f}% full")
        else:
            notes.append(f"NEC Ch. 9 Table 1: {count} conductors{per}, {fill_pct:.0f}% of trade "
                         f"size {raceway_size} {rtype} (limit {fill_limit:g}%)")
    return egc_size, n_egc, raceway_size, fill_pct, tuple(notes), tuple(problems)


def _evaluate(spec: RunSpec, *, hint: bool = True) -> RunResult:
    """``hint``: when nothing fits, look for a number of parallel sets that would (off while
    looking, so the search is one pass over 2..12 sets, not a tree of searches)."""
    circuit = spec.circuit
    material = spec.material
    mat = MAT[material]
    tab = _material_table(material)
    sets = spec.sets
    amps = float(spec.amps)

    # --- currents and device ---------------------------------------------------------------
    if spec.continuous_amps is not None:
        cont = float(spec.continuous_amps)
    else:
        cont = amps if spec.continuous else 0.0
    design, ocpd, cur_notes, cur_problems = _currents(amps, cont, spec.ocpd_a)
    notes: list[str] = list(cur_notes)
    problems: list[str] = list(cur_problems)

    # --- columns, corrections, raceway, impedance ----------------------------------------------
    n_ccc = spec.ccc if spec.ccc is not None else current_carrying_conductors(circuit)
    st = _setting(material, spec.insulation, spec.terminal_temp, ocpd, spec.ambient_c, n_ccc,
                  spec.raceway, spec.method, float(spec.pf), float(spec.conductor_temp_c),
                  bool(spec.stranded), sets, bool(spec.distributed))
    notes.extend(st.notes)
    ins_col, term_col = st.ins_col, st.term_col
    ins_amps = tab.amp[ins_col]
    term_amps = tab.amp[term_col]

    # --- drop -------------------------------------------------------------------------------
    z = st.z
    length = spec.length_ft / 2.0 if spec.distributed else spec.length_ft
    k_drop = circuit.drop_factor * amps * length / 1000.0 / sets
    pct_per_volt = 100.0 / circuit.volts
    drop_limit = spec.max_drop_pct
    total_room = spec.max_total_drop_pct - spec.upstream_drop_pct
    limit_pct = min(drop_limit, total_room)

    cols = st.cols
    n = len(tab.sizes)
    min_amp_i = ocpd_i = pick_i = None
    term_tot, corr_tot, protect = cols.term_total, cols.corrected_total, cols.protect_limit
    floor_i = _floor_index(spec.min_size, tab.sizes)
    for i in range(cols.first, n):
        if term_tot[i] + _EPS < design or corr_tot[i] + _EPS < amps:
            continue
        if min_amp_i is None:
            min_amp_i = i
        if protect[i] < ocpd:
            continue
        if ocpd_i is None:
            ocpd_i = i
        zi = z[i]
        if i >= floor_i and zi is not None and k_drop * zi * pct_per_volt <= limit_pct + _EPS:
            pick_i = i
            break

    # --- the size -----------------------------------------------------------------------------
    if spec.size is not None:
        size = canonical(spec.size)
        if size not in tab.sizes:
            raise SizingError(f"size {size} is not used for {mat} power conductors; the smallest "
                              f"is {START_SIZE[material]}")
        i = tab.sizes.index(size)
        governed_by = "fixed size"
        if i < floor_i:
            problems.append(f"{size} {mat} is below the job's minimum size, {tab.sizes[floor_i]}")
    elif pick_i is not None:
        i = pick_i
        if pick_i == floor_i and ocpd_i is not None and floor_i > ocpd_i:
            governed_by = "minimum size"
            notes.append(f"job minimum size {tab.sizes[floor_i]} {mat} (job specification)")
        elif pick_i == min_amp_i:
            governed_by = "ampacity"
        elif pick_i == ocpd_i:
            governed_by = "overcurrent device"
        else:
            governed_by = "voltage drop"
    else:
        # Nothing works: show the largest size the method covers, with its failures.
        i = max(j for j in range(n) if z[j] is not None and term_amps[j] is not None)
        size = tab.sizes[i]
        governed_by = "voltage drop" if ocpd_i is not None else "ampacity"
        problems.append(
            f"no single {mat} size up to {size} meets the ampacity, device and voltage-drop "
            f"limits with {sets} set{'s' if sets > 1 else ''}"
            f"{_parallel_hint(spec) if hint else ''}")
    size = tab.sizes[i]

    # --- the chosen size in detail ------------------------------------------------------------
    ia, ta = ins_amps[i], term_amps[i]
    if ia is None or ta is None:
        raise SizingError(f"Table 310.16 has no {mat} {size} in the {ins_col} or {term_col} C "
                          f"column")
    # the same products as the cached columns: ia * factor * sets, ta * sets,
    # min(ia * factor, ta) * sets and _protect_limit of the last
    corrected_total = corr_tot[i]
    term_total = term_tot[i]
    allowable_total = cols.allowable_total[i]
    protect_limit = cols.device_limit[i]
    sm = tab.small_max[i]
    if sm is not None:
        protect_limit = min(protect_limit, sm)
        if ocpd <= sm and (governed_by == "overcurrent device" or spec.size is not None):
            notes.append(f"NEC 240.4(D): {size} {mat} limited to {sm} A")

    if sets > 1:
        if not tab.parallel_ok[i]:
            problems.append(f"NEC 310.10(G): conductors in parallel must be {PARALLEL_MIN_SIZE} "
                            f"or larger; {size} is smaller")
        else:
            notes.append(f"NEC 310.10(G): {sets} sets in parallel, {_a(allowable_total / sets)} "
                         f"each")

    # drop with the method's table, or Table 8 DC resistance where Table 9 lacks the size
    zi = z[i]
    method_used = spec.method
    if zi is None:
        zi = _z_table(material, "dc", st.family, 1.0, float(spec.conductor_temp_c),
                      bool(spec.stranded))[i]
        if zi is None:
            raise SizingError(f"NEC Ch. 9 Table 8 lists no solid {mat} {size}; solid conductors "
                              f"are listed up to {t_cond.SOLID_SIZES[-1]}")
        method_used = "dc"
        notes.append(f"NEC Ch. 9 Table 9 lists no {mat} {size}: drop from Table 8 DC resistance, "
                     f"reactance left out")
    vd_v = k_drop * zi
    vd_pct = vd_v * pct_per_volt
    total_pct = spec.upstream_drop_pct + vd_pct

    if spec.size is not None or pick_i is None:
        if term_total + _EPS < design:
            problems.append(
                f"{size} {mat} is good for {_a(term_total)} at the {term_col} C terminals; the "
                f"circuit needs {_a(design)} (NEC 110.14(C)(1), 210.19(A)(1))")
        if corrected_total + _EPS < amps:
            problems.append(f"{size} {mat} carries {_a(corrected_total)} after corrections; the "
                            f"load needs {_a(amps)}")
        if ocpd > protect_limit:
            if sm is not None and ocpd > sm:
                problems.append(f"NEC 240.4(D) limits {size} {mat} to a {sm} A device; the device "
                                f"is {ocpd} A")
            else:
                problems.append(f"a {ocpd} A device does not protect {size} {mat} "
                                f"({_a(allowable_total)}) (NEC 240.4)")
        if vd_pct > drop_limit + _EPS:
            problems.append(f"voltage drop {_pct(vd_pct)} is over this run's "
                            f"{spec.max_drop_pct:g}% target")
        if total_pct > spec.max_total_drop_pct + _EPS:
            problems.append(f"drop from the service {_pct(total_pct)} is over the "
                            f"{spec.max_total_drop_pct:g}% target")
    if governed_by == "voltage drop":
        base = tab.sizes[ocpd_i] if ocpd_i is not None else tab.sizes[min_amp_i or 0]
        notes.append(f"upsized from {base} for voltage drop ({_pct(vd_pct)} of "
                     f"{circuit.volts:g} V)")

    # --- EGC and raceway ------------------------------------------------------------------------
    hots = circuit.hots
    neutral = 1 if circuit.neutral else 0
    egc_size, n_egc, raceway_size, fill_pct, er_notes, er_problems = _egc_and_raceway(
        i, ocpd, ocpd_i if ocpd_i is not None else min_amp_i, sets, material,
        spec.egc_material or material, bool(spec.egc), bool(spec.egc_bare), st.insulation,
        st.rtype, hots, neutral)
    notes.extend(er_notes)
    problems.extend(er_problems)

    margins = {
        "ampacity_a": allowable_total - amps,
        "terminal_a": term_total - design,
        "corrected_a": corrected_total - amps,
        "ocpd_a": protect_limit - ocpd,
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
    values["required_ampacity_a"] = amps
    values["ampacity_a"] = allowable_total
    values["min_ampacity_size"] = tab.sizes[min_amp_i] if min_amp_i is not None else tab.sizes[-1]
    values["ocpd_a"] = ocpd
    values["voltage_drop_v"] = vd_v
    values["voltage_drop_pct"] = vd_pct
    values["total_drop_pct"] = total_pct
    values["egc_size"] = egc_size
    values["neutral_size"] = size if neutral else None
    values["raceway"] = st.rtype
    values["raceway_size"] = raceway_size
    values["raceway_fill_pct"] = fill_pct
    values["governed_by"] = governed_by
    values["margins"] = margins
    values["conductors"] = {"hot": hots, "neutral": neutral, "egc": n_egc}
    values["problems"] = tuple(problems)
    values["notes"] = tuple(notes)
    _set_attr(result, "__dict__", values)
    return result


_new_object = object.__new__
_set_attr = object.__setattr__
_RESULT_TEMPLATE = {f.name: None if f.default is MISSING else f.default for f in fields(RunResult)}


def _floor_index(min_size: str | None, sizes: tuple[str, ...]) -> int:
    """Index in ``sizes`` of the job's minimum size (0 without one, or below the table)."""
    if min_size is None:
        return 0
    size = parse_size(min_size)
    if size in sizes:
        return sizes.index(size)
    return 0 if size_index(size) < size_index(sizes[0]) else len(sizes)


def _protect_limit(allowable_a: float) -> float:
    """Largest device that protects a conductor of ``allowable_a`` [A]: the next standard rating
    up to 800 A (NEC 240.4(B)), the ampacity itself above (240.4(C))."""
    nxt = _next_rating(allowable_a) if allowable_a <= _RATINGS[-1] else allowable_a
    return float(nxt) if nxt <= 800 else allowable_a


def _protects(ocpd: int, allowable_a: float) -> bool:
    return ocpd <= allowable_a + _EPS or ocpd <= _protect_limit(allowable_a)


def _parallel_hint(spec: RunSpec) -> str:
    """'; 3 sets in parallel would' when more sets make the run work."""
    from dataclasses import replace

    if spec.size is not None:
        return ""
    for sets in range(spec.sets + 1, 13):
        try:
            r = _evaluate(replace(spec, sets=sets), hint=False)
        except (TableLookupError, SizingError):
            return ""
        if r.ok:
            return f"; {sets} sets of {r.size} in parallel would (NEC 310.10(G))"
    return ""
