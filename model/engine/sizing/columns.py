"""The table columns the engine reads for a run, built once and cached so that thousands of
runs alike share the work.

- ``material_table(material)``: sizes from ``START_SIZE`` up, circular mils, Table 310.16
  ampacities per column, the small-conductor device limits of NEC 240.4(D), and whether each
  size may run in parallel (310.10(G)).
- ``ampacity_columns(material, ins_col, term_col, factor, sets)``: per size, the terminal-column
  ampacity (110.14(C)(1)), the insulation-column ampacity after corrections (310.15(B)(1),
  (C)(1)), the allowable ampacity (the smaller), and the largest device that protects it
  (240.4(B), (C), and (D)).
- ``z_table(material, method, family, pf, temp_c, stranded, shift_deg)``: impedance per
  conductor for the drop method [ohm/kft] (``gaugewalk.model.engine.drop``; Ch. 9 Tables 8 and
  9, 700-900 kcmil interpolated); ``rx_of(...)``: R and XL of one size.
- ``setting(...) -> Setting``: what follows from the device, the insulation and the
  installation: the terminal column (110.14(C)(1)), the correction factor (310.15(B)(1),
  (C)(1)), the raceway and the impedance column.
"""

import math
from functools import lru_cache
from typing import NamedTuple

from gaugewalk.model.engine.drop import (
    conductor_z,
    effective_z,
    shifted_z,
    table9_rx,
    temperature_corrected,
)
from gaugewalk.model.engine.sizing.currents import next_rating
from gaugewalk.model.engine.sizing.raceway import resolve_raceway
from gaugewalk.tables.conductor import ampacity as t_amp
from gaugewalk.tables.conductor import properties as t_cond
from gaugewalk.tables.conductor.sizes import SIZES
from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.protection import ocpd as t_ocpd

START_SIZE = {"cu": "14 AWG", "al": "12 AWG"}
"""Smallest size used for power circuits [AWG]: 14 AWG copper, 12 AWG aluminum (Table 310.16
lists no smaller aluminum; 18 and 16 AWG copper are for control and fixture wiring)."""

PARALLEL_MIN_SIZE = "1/0 AWG"
"""NEC 310.10(G)(1): conductors in parallel are 1/0 AWG and larger."""

MAT = {"cu": "Cu", "al": "Al"}

_LARGEST_RATING = t_ocpd.STANDARD_RATINGS[-1]


class MaterialTable(NamedTuple):
    sizes: tuple[str, ...]                          # START_SIZE .. 2000 kcmil
    cmil: tuple[float, ...]                         # [cmil]
    amp: dict[int, tuple[float | None, ...]]        # column [C] -> ampacity [A]
    small_max: tuple[int | None, ...]               # 240.4(D) [A]
    parallel_ok: tuple[bool, ...]                   # 310.10(G)


@lru_cache(maxsize=None)
def material_table(material: str) -> MaterialTable:
    sizes = SIZES[SIZES.index(START_SIZE[material]):]
    return MaterialTable(
        sizes=sizes,
        cmil=tuple(t_cond.circular_mils(s) for s in sizes),
        amp={c: tuple(t_amp.ampacity(s, material, c) for s in sizes) for c in t_amp.COLUMNS},
        small_max=tuple(t_ocpd.small_conductor_max_ocpd(s, material) for s in sizes),
        parallel_ok=tuple(SIZES.index(s) >= SIZES.index(PARALLEL_MIN_SIZE) for s in sizes),
    )


def protect_limit(allowable_a: float) -> float:
    """Largest device that protects a conductor of ``allowable_a`` [A]: the next standard rating
    up to 800 A (NEC 240.4(B)), the ampacity itself above (240.4(C))."""
    nxt = next_rating(allowable_a) if allowable_a <= _LARGEST_RATING else allowable_a
    return float(nxt) if nxt <= 800 else allowable_a


class AmpacityColumns(NamedTuple):
    first: int                               # first size usable (310.10(G) for parallel sets)
    term_total: tuple[float, ...]            # [A] terminal-column ampacity x sets, unadjusted
    corrected_total: tuple[float, ...]       # [A] insulation column x corrections x sets
    allowable_total: tuple[float, ...]       # [A] the smaller of the two
    protect_limit: tuple[float, ...]         # [A] largest device permitted (240.4(B)-(D))
    device_limit: tuple[float, ...]          # [A] the same by 240.4(B), (C) alone


@lru_cache(maxsize=4096)
def ampacity_columns(material: str, ins_col: int, term_col: int, factor: float,
                     sets: int) -> AmpacityColumns:
    tab = material_table(material)
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
        limit = protect_limit(allowable)
        dev.append(limit)
        if tab.small_max[i] is not None:
            limit = min(limit, float(tab.small_max[i]))
        term.append(ta * sets), corr.append(corrected), allow.append(allowable)
        prot.append(limit)
    return AmpacityColumns(first if first is not None else len(tab.sizes), tuple(term),
                           tuple(corr), tuple(allow), tuple(prot), tuple(dev))


@lru_cache(maxsize=256)
def _rx_table(material: str, method: str, family: str, temp_c: float,
              stranded: bool) -> tuple[tuple[float, float] | None, ...]:
    """(R at ``temp_c``, XL) per conductor [ohm/kft] for each size; XL is 0 for the DC and
    K-factor methods; None where the method's table lacks the size."""
    out: list[tuple[float, float] | None] = []
    for s in material_table(material).sizes:
        try:
            if method == "ac":
                r75, x = table9_rx(s, material, family)
                out.append((temperature_corrected(r75, t_cond.ALPHA[material], temp_c), x))
            else:
                out.append((conductor_z(s, material, method, temp_c=temp_c, stranded=stranded),
                            0.0))
        except TableLookupError:
            out.append(None)
    return tuple(out)


@lru_cache(maxsize=4096)
def z_table(material: str, method: str, family: str, pf: float, temp_c: float,
            stranded: bool, shift_deg: float = 0.0) -> tuple[float | None, ...]:
    """Impedance per conductor [ohm/kft] for each size (``gaugewalk.model.engine.drop.conductor_z``,
    from cached R and XL columns); None where the method's table lacks the size. ``shift_deg``:
    the drop phasor's shift from the load current (``Circuit.drop_angle_deg``; ``drop.shifted_z``,
    R cos(shift) for the methods without reactance)."""
    rx = _rx_table(material, method, family, temp_c, stranded)
    if method != "ac":
        k = math.cos(math.radians(shift_deg))
        return tuple(None if v is None else v[0] * k for v in rx)
    if shift_deg:
        return tuple(None if v is None else shifted_z(v[0], v[1], pf, shift_deg) for v in rx)
    return tuple(None if v is None else effective_z(v[0], v[1], pf) for v in rx)


def rx_of(material: str, method: str, family: str, temp_c: float, stranded: bool,
          i: int) -> tuple[float, float] | None:
    """(R at ``temp_c``, XL) [ohm/kft] of the size at index ``i`` for the drop method (XL 0 for
    the DC and K-factor methods); None where the method's table lacks the size."""
    return _rx_table(material, method, family, temp_c, stranded)[i]


@lru_cache(maxsize=256)
def _insulation(text: str) -> tuple[str, int]:
    canon = t_amp.parse_insulation(text)
    return canon, t_amp.insulation_rating(canon)


@lru_cache(maxsize=None)
def cmil(size: str) -> float:
    """Circular mils of a size (NEC Ch. 9 Table 8) [cmil]."""
    return t_cond.circular_mils(size)


_ambient = lru_cache(maxsize=1024)(t_amp.ambient_factor)
_ccc_factor = lru_cache(maxsize=256)(t_amp.ccc_factor)


class Setting(NamedTuple):
    """What follows from the device, the insulation and the installation, the same for every
    run that shares them: columns, corrections, ampacity and impedance tables, raceway."""
    insulation: str
    ins_col: int                     # [C]
    term_col: int                    # [C]
    factor: float                    # ambient x bundling
    cols: AmpacityColumns
    z: tuple[float | None, ...]      # [ohm/kft]
    rtype: str
    family: str
    notes: tuple[str, ...]


@lru_cache(maxsize=4096)
def setting(material: str, insulation_text: str, terminal_temp: int | None, ocpd: int,
            ambient_c: float, n_ccc: int, raceway: str, method: str, pf: float,
            conductor_temp_c: float, stranded: bool, sets: int, distributed: bool,
            shift_deg: float = 0.0, terminal_why: str | None = None) -> Setting:
    """Terminal column (NEC 110.14(C)(1)), corrections (310.15(B)(1), (C)(1)), the raceway and
    the impedance column of one installation; cached so that runs alike share the work.
    ``terminal_why``: the reason for a ``terminal_temp`` the load's rule set (default: "terminals
    as given")."""
    notes: list[str] = []
    insulation, ins_col = _insulation(insulation_text)
    if terminal_temp is not None:
        term_col = terminal_temp
        term_why = terminal_why or "terminals as given"
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
    z = z_table(material, method, family, pf, conductor_temp_c, stranded, shift_deg)
    if distributed:
        notes.append("load spread along the run: whole load at half the length (common practice)")
    cols = ampacity_columns(material, ins_col, term_col, factor, sets)
    return Setting(insulation, ins_col, term_col, factor, cols, z, rtype, family, tuple(notes))
