"""The phase conductor: the smallest size that carries the load, is protected by the device and
meets the drop targets, no smaller than the job's minimum; or the size the user fixed, with
every rule it fails named.

1. ampacity: the terminal-column ampacity, unadjusted, is at least the design current (NEC
   210.19(A)(1)(a), 215.2(A)(1)(a), 110.14(C)(1)); the insulation-column ampacity after the
   corrections is at least the load (210.19(A)(1)(b), 215.2(A)(1)(b));
2. the device protects it: at most the conductor's ampacity, or the next standard rating up to
   800 A (240.4(B), (C)), and within the small-conductor limits of 240.4(D);
3. the drop targets: this run's drop and the drop from the service (informational notes to
   210.19(A) and 215.2(A); recommendations, made binding here as the job's targets). For the
   total target a run is taken up to ``UPSIZE_FOR_TOTAL`` sizes over what its own target asks;
   where the drop up to the source leaves less than that (or than any size) drops, the cure is
   upstream: the run keeps the size its own target asks, and a problem says so;
4. the job's minimum size (a job specification; common practice);
5. conductors in parallel are 1/0 AWG and larger (310.10(G));
6. where a rule of the walk asks it (``RunSpec.min_ampacity_a``), an ampacity of at least that
   much, the allowable ampacity (the smaller of the terminal column and the corrected
   insulation column) with no next size up: transformer secondary conductors are not below the
   device they end in (240.21(C), where 240.4(B) does not apply).

Public API: the pick in three steps, so that what does not depend on a run's length or on the
drop up to its source is worked out once for every run alike
(``gaugewalk.model.engine.sizing.evaluate.prepare``): ``candidates`` (rules 1, 2, 4 and 6: the
smallest size index meeting rule 1, rules 1-2, and the sizes rule 3 is tried on, as
``Candidates``), ``drop_scan`` (rule 3 on them, for one length and one drop up to the source:
the size index picked, the least drop [%] of the sizes passed over for rule 3 alone, so that a
looser limit below it is known to pick the same size, and the first size meeting the run's own
target), ``choose`` (the size and what governed it, with the notes and problems of the choice);
``drop_limit`` (rule 3's limit [%]); ``size_problems``; ``floor_index``.
"""

import math
from collections.abc import Callable
from typing import NamedTuple

from gaugewalk.model.engine.contract import RunSpec
from gaugewalk.model.engine.sizing.columns import (
    MAT,
    PARALLEL_MIN_SIZE,
    START_SIZE,
    MaterialTable,
    Setting,
)
from gaugewalk.model.engine.sizing.spec import SizingError
from gaugewalk.model.engine.sizing.text import amps_text, pct_text
from gaugewalk.tables.conductor.sizes import canonical, parse_size, size_index

_EPS = 1e-9

UPSIZE_FOR_TOTAL = 2
"""Sizes over the one its own drop target asks that a run is taken up to so that the drop from the
service stays within the total target; past that the drop is cured where it is lost, upstream
(common practice: a 9 A branch is not run in 2/0 AWG because its panel's bus is at 4.9 %)."""

class Candidates(NamedTuple):
    """What rules 1, 2, 4 and 6 leave for rule 3, for every length: ``floor_i`` the job's
    minimum size index, ``min_amp_i`` the smallest size index meeting rule 1 (and 6), ``ocpd_i``
    rules 1-2 (None: no size), and ``sizes`` the (index, impedance [ohm/kft]) of each size
    meeting rules 1, 2, 4 and 6 that the drop method covers, smallest first."""

    floor_i: int
    min_amp_i: int | None
    ocpd_i: int | None
    sizes: tuple[tuple[int, float], ...]


def floor_index(min_size: str | None, sizes: tuple[str, ...]) -> int:
    """Index in ``sizes`` of the job's minimum size (0 without one, or below the table)."""
    if min_size is None:
        return 0
    size = parse_size(min_size)
    if size in sizes:
        return sizes.index(size)
    return 0 if size_index(size) < size_index(sizes[0]) else len(sizes)


def drop_limit(spec: RunSpec) -> float:
    """The largest drop a size may have to be picked [%]: the run's target and what the total
    target leaves after the drop up to its source (rule 3), the smaller, with a tolerance."""
    return min(spec.max_drop_pct, spec.max_total_drop_pct - spec.upstream_drop_pct) + _EPS


def candidates(spec: RunSpec, tab: MaterialTable, st: Setting, design: float, amps: float,
               ocpd: int, protect: tuple[float, ...] | None = None) -> Candidates:
    """Rules 1, 2, 4 and 6 over the sizes of the run's columns (``st``: ``columns.setting``):
    ``design`` the design current [A], ``amps`` what the conductors must carry after the
    corrections [A] (the load, or what the load's kind asks), ``ocpd`` the device [A];
    ``protect`` the largest device each size permits [A] (default the 240.4(B)-(D) limits; a
    load kind's article may set others, ``currents.Currents.protection``). None of it depends on
    the run's length or the drop up to its source."""
    cols, z = st.cols, st.z
    floor_i = floor_index(spec.min_size, tab.sizes)
    min_amp_i = ocpd_i = None
    term_tot, corr_tot = cols.term_total, cols.corrected_total
    if protect is None:
        protect = cols.protect_limit
    mina = spec.min_ampacity_a
    allow_tot = cols.allowable_total
    found: list[tuple[int, float]] = []
    for i in range(cols.first, len(z)):
        if term_tot[i] + _EPS < design or corr_tot[i] + _EPS < amps:
            continue
        if mina is not None and allow_tot[i] + _EPS < mina:
            continue
        if min_amp_i is None:
            min_amp_i = i
        if protect[i] < ocpd:
            continue
        if ocpd_i is None:
            ocpd_i = i
        zi = z[i]
        if i >= floor_i and zi is not None:
            found.append((i, zi))
    return Candidates(floor_i, min_amp_i, ocpd_i, tuple(found))


def drop_scan(sizes: tuple[tuple[int, float], ...], volts_per_ohm_kft: float,
              pct_per_volt: float, spec: RunSpec) -> tuple[int | None, float, int | None]:
    """Rule 3 on the ``sizes`` rules 1, 2, 4 and 6 left (``Candidates.sizes``), for a run whose
    drop is ``volts_per_ohm_kft`` [V] per ohm/kft of conductor impedance and ``pct_per_volt``
    [%/V]: ``(the first size index within the limit, the least drop [%] of the sizes before
    it, infinity where none, the first of those within the run's own target)``; None for the
    index where no size is within the limit (``drop_limit`` of ``spec``), or where the first that
    is lies more than ``UPSIZE_FOR_TOTAL`` sizes over the first within the run's own target."""
    limit = drop_limit(spec)
    own = spec.max_drop_pct + _EPS   # this run's own target: the limit, unless the total is
    passed = math.inf   # the least drop of a size meeting rules 1, 2 and 4 but not the limit
    own_i = None   # the first size passed over that meets the run's own target
    for i, zi in sizes:
        pct = volts_per_ohm_kft * zi * pct_per_volt
        if pct <= limit:
            if own_i is not None and i > own_i + UPSIZE_FOR_TOTAL:
                return None, passed, own_i   # the total asks too much of this run: upstream
            return i, passed, own_i
        if pct < passed:
            passed = pct
        if own_i is None and pct <= own:
            own_i = i
    return None, passed, own_i


def choose(spec: RunSpec, tab: MaterialTable, st: Setting, cand: Candidates, ocpd: int,
           pick_i: int | None, own_i: int | None,
           hint: Callable[[RunSpec, tuple[float | None, ...]], str] | None, notes: list[str],
           problems: list[str], small_rule: bool = True) -> tuple[int, str, int | None]:
    """The phase conductor of the run: the size the user fixed (``spec.size``), else the
    smallest meeting rules 1 to 4 (``pick_i`` of ``drop_scan``), else, where the total target is
    what no size meets because of the drop up to the source, the size the run's own target asks
    (``own_i``), else (nothing meets them all) the largest the drop method covers, with a
    problem saying so and ``hint(spec, z)`` (how many sets in parallel would; ``z`` the
    impedance column). ``ocpd`` is the device [A]; ``small_rule`` False where 240.4(D) does not apply (240.4(G)).
    Returns ``(size index, governed by, the 240.4(D) limit of the size [A] or None)``; the notes
    and problems of the choice, of 240.4(D) and of 310.10(G) are added to ``notes`` and
    ``problems``. Only the last two cases read the run's length and upstream drop."""
    material, sets = spec.material, spec.sets
    cols, z = st.cols, st.z
    mat = MAT[material]
    sizes = tab.sizes
    floor_i, min_amp_i, ocpd_i = cand.floor_i, cand.min_amp_i, cand.ocpd_i
    mina = spec.min_ampacity_a
    if spec.size is not None:
        size = canonical(spec.size)
        if size not in sizes:
            raise SizingError(f"size {size} is not used for {mat} power conductors; the smallest "
                              f"is {START_SIZE[material]}")
        i = sizes.index(size)
        governed_by = "fixed size"
        if i < floor_i:
            problems.append(f"{size} {mat} is below the job's minimum size, {sizes[floor_i]}")
    elif pick_i is not None:
        i = pick_i
        governed_by = _governed(i, floor_i, min_amp_i, ocpd_i, sizes, mat, notes)
    elif own_i is not None:
        # The total target is what no size meets, because of the drop up to the source: a
        # larger conductor here cannot cure that, so the run keeps the size its own target asks
        i = own_i
        governed_by = _governed(i, floor_i, min_amp_i, ocpd_i, sizes, mat, notes)
        problems.append(_upstream_words(spec))  # no parallel-sets hint: 1000 kcmil sets on a
        # 40 A branch would meet it, but the cure is upstream
    else:
        # Nothing works: show the largest size the method covers, with its failures.
        term_amps = tab.amp[st.term_col]
        i = max(j for j in range(len(z)) if z[j] is not None and term_amps[j] is not None)
        governed_by = "voltage drop" if ocpd_i is not None else "ampacity"
        problems.append(
            f"no single {mat} size up to {sizes[i]} meets the ampacity, device and voltage-drop "
            f"limits with {sets} set{'s' if sets > 1 else ''}{hint(spec, z) if hint else ''}")

    if mina is not None and (spec.size is not None or pick_i is None) \
            and cols.allowable_total[i] + _EPS < mina:
        problems.append(f"{sizes[i]} {mat} carries {amps_text(cols.allowable_total[i])}; these "
                        f"conductors need at least {amps_text(mina)} (no next size up)")

    # 240.4(D) and 310.10(G) for the size
    sm = tab.small_max[i] if small_rule else None
    if sm is not None and ocpd <= sm and (governed_by == "overcurrent device"
                                          or spec.size is not None):
        notes.append(f"NEC 240.4(D): {sizes[i]} {mat} limited to {sm} A")
    if sets > 1:
        if not tab.parallel_ok[i]:
            problems.append(f"NEC 310.10(G): conductors in parallel must be {PARALLEL_MIN_SIZE} "
                            f"or larger; {sizes[i]} is smaller")
        else:
            notes.append(f"NEC 310.10(G): {sets} sets in parallel, "
                         f"{amps_text(cols.allowable_total[i] / sets)} each")
    return i, governed_by, sm


def _governed(i: int, floor_i: int, min_amp_i: int | None, ocpd_i: int | None,
              sizes: tuple[str, ...], mat: str, notes: list[str]) -> str:
    """What decided the size at index ``i`` picked by rules 1-4 (the floor's note added)."""
    if i == floor_i and ocpd_i is not None and floor_i > ocpd_i:
        notes.append(f"job minimum size {sizes[floor_i]} {mat} (job specification)")
        return "minimum size"
    if i == min_amp_i:
        return "ampacity"
    if i == ocpd_i:
        return "overcurrent device"
    return "voltage drop"


def _upstream_words(spec: RunSpec) -> str:
    """Why the run is sized for its own drop target only: the drop up to its source."""
    total, up = spec.max_total_drop_pct, spec.upstream_drop_pct
    if up >= total:
        said = f"already takes the whole {total:g}% total target"
    else:
        said = (f"leaves {pct_text(total - up)} of the {total:g}% total target, less than this "
                f"run drops on any size within {UPSIZE_FOR_TOTAL} sizes "
                "of the one its own target asks (common practice: the drop is cured where it is "
                "lost)")
    return (f"the drop up to its source, {pct_text(up)}, {said}: sized for its own "
            f"{spec.max_drop_pct:g}% target; the drop has to come down upstream")


def size_problems(size: str, material: str, term_col: int, design: float, amps: float,
                  ocpd: int, term_total: float, corrected_total: float, allowable_total: float,
                  protect_limit: float, small_max: float | None, vd_pct: float,
                  total_pct: float, max_drop_pct: float, max_total_drop_pct: float,
                  problems: list[str], need_rule: str = "NEC 110.14(C)(1), 210.19(A)(1)",
                  protect_rule: str = "NEC 240.4") -> None:
    """Every rule a size not picked by them (fixed by the user, or the largest when nothing
    fits) fails: ampacity (1), the device (2), the drop targets (3). ``need_rule`` and
    ``protect_rule`` cite the rules of the load's kind."""
    mat = MAT[material]
    if term_total + _EPS < design:
        problems.append(
            f"{size} {mat} is good for {amps_text(term_total)} at the {term_col} C terminals; the "
            f"circuit needs {amps_text(design)} ({need_rule})")
    if corrected_total + _EPS < amps:
        problems.append(f"{size} {mat} carries {amps_text(corrected_total)} after corrections; "
                        f"the load needs {amps_text(amps)}")
    if ocpd > protect_limit:
        if small_max is not None and ocpd > small_max:
            problems.append(f"NEC 240.4(D) limits {size} {mat} to a {small_max} A device; the "
                            f"device is {ocpd} A")
        else:
            problems.append(f"a {ocpd} A device does not protect {size} {mat} "
                            f"({amps_text(allowable_total)}) ({protect_rule})")
    if vd_pct > max_drop_pct + _EPS:
        problems.append(f"voltage drop {pct_text(vd_pct)} is over this run's "
                        f"{max_drop_pct:g}% target")
    if total_pct > max_total_drop_pct + _EPS:
        problems.append(f"drop from the service {pct_text(total_pct)} is over the "
                        f"{max_total_drop_pct:g}% target")
