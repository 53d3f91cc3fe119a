"""Where runs land in their panel: breaker positions and lines by the usual panelboard numbering
(common practice), the problems of a position or phase that cannot be, the placement that
balances the lines, and the incremental recompute after edits that move runs."""

from __future__ import annotations

import cmath
import math
import random

import pytest
from hypothesis import given
from hypothesis import strategies as st

from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walk.job import Load
from gaugewalk.model.walk.phases import phase_name, position_lines, position_span
from gaugewalk.model.walk.recompute import recompute_run
from tests.support.walks import make_job, run_table, source_table

Y208 = "208Y/120V 3ph 4w"
S240 = "120/240V 1ph 3w"


@pytest.mark.parametrize(("position", "poles", "lines", "span", "phase"), [
    # common practice: odd left, even right; 1-2 on A, 3-4 on B, 5-6 on C, then A again
    (1, 1, 3, (1,), "A"), (2, 1, 3, (2,), "A"), (3, 1, 3, (3,), "B"), (6, 1, 3, (6,), "C"),
    (7, 1, 3, (7,), "A"), (1, 2, 3, (1, 3), "AB"), (5, 2, 3, (5, 7), "CA"),
    (4, 2, 3, (4, 6), "BC"), (3, 3, 3, (3, 5, 7), "ABC"), (42, 1, 3, (42,), "C"),
    # single-phase three-wire: 1-2 on A, 3-4 on B
    (1, 1, 2, (1,), "A"), (3, 1, 2, (3,), "B"), (5, 1, 2, (5,), "A"), (3, 2, 2, (3, 5), "AB"),
])
def test_positions_follow_the_usual_panelboard_numbering(position, poles, lines, span, phase):
    found = position_lines(position, poles, lines)
    assert phase_name(found) == phase
    assert position_span(position, poles) == span


def _panel(*runs, system=Y208, spaces=None):
    panel = {"spaces": spaces} if spaces else {}
    return make_job("panel", defaults={"pf": 1.0},
                    sources=[source_table("SVC", "service", system),
                             source_table("LP1", "panel", system, **panel)],
                    runs=[run_table("F1", "SVC", "LP1", "20"), *runs])


def _b(rid, amps=10, conn="LN", **keys):
    return run_table(rid, "LP1", f"Load {rid}", "30", load=(amps, "A"), connection=conn, **keys)


def test_positions_and_phases_from_the_walk_are_kept_and_shown():
    result = compute_job(_panel(_b("R1", position=5), _b("R2", 20, "LL", position=5 + 4),
                                _b("R3", phase="B"), _b("R4")))
    p = result.placements
    assert (p["R1"].phase, p["R1"].positions, p["R1"].by) == ("C", (5,), "position")
    assert (p["R2"].phase, p["R2"].positions) == ("BC", (9, 11))  # 9-10 on B, 11-12 on C
    assert (p["R3"].phase, p["R3"].by) == ("B", "phase") and p["R3"].positions == (3,)
    assert p["R4"].by == "placed" and p["R4"].positions
    assert not result.problems


@pytest.mark.parametrize(("runs", "spaces", "field", "words"), [
    ([_b("R1", position=3), _b("R2", position=3)], None, "position",
     "position 3 is already taken by run R1"),
    ([_b("R1", position=1), _b("R2", 8, "LL", position=1 + 2 - 2)], None, "position",
     "already taken by run R1"),
    ([_b("R1", 8, "LL", position=11)], 12, "position", "position 13 is past the 12 spaces"),
    ([_b("R1", position=3, phase="A")], None, "phase",
     "phase A does not agree with position 3, which is on B"),
    ([_b("R1", phase="AB")], None, "phase", "phase AB is 2 line(s), but its circuit takes 1"),
    ([_b("R1", 8, "3P"), _b("R2"), _b("R3"), _b("R4"), _b("R5")], 6, "position",
     "no free 1-pole space"),
    ([_b("R1", 8, "3P")], 4, "position", "no free 3-pole space on ABC within the 4 spaces"),
])
def test_a_position_or_phase_that_cannot_be_is_a_problem_naming_the_run_and_field(
        runs, spaces, field, words):
    result = compute_job(_panel(*runs, spaces=spaces))
    found = [p for p in result.problems if p.about == "run" and p.field == field]
    assert any(words in p.message for p in found), [str(p) for p in result.problems]


def test_a_phase_c_on_a_single_phase_panel_is_a_problem():
    result = compute_job(_panel(_b("R1", phase="C"), system=S240))
    assert any(p.field == "phase" and "single-phase" in p.message for p in result.problems)


DELTA = "240/120V 3ph 4w delta"


def test_no_circuit_using_the_neutral_is_placed_on_a_deltas_high_leg():
    # NEC 110.15: on a 240/120 V 4-wire delta, phase B (the high leg, marked orange) is about
    # 208 V to neutral: 120 V loads and 120/240 V loads with a neutral go on A and C only
    # (common practice); 240 V loads without the neutral and three-phase loads may use B
    runs = [_b(f"R{i}", 8 + i) for i in range(1, 9)] + [
        _b("R20", 12, "LLN"), _b("R21", 20, "LL"), _b("R22", 15, "3P")]
    result = compute_job(_panel(*runs, system=DELTA))
    p = result.placements
    for i in range(1, 9):
        assert p[f"R{i}"].phase in ("A", "C"), (i, p[f"R{i}"])
    assert p["R20"].phase in ("CA", "AC")
    assert p["R22"].phase == "ABC" and not result.problems
    # the sheet's positions agree with the lines (1-2 on A, 3-4 on B, 5-6 on C)
    for i in range(1, 9):
        (pos,) = p[f"R{i}"].positions
        assert position_lines(pos, 1, 3) != (1,)


@pytest.mark.parametrize(("keys", "field"), [({"phase": "B"}, "phase"),
                                             ({"position": 4}, "position")])
def test_a_120_v_circuit_the_walk_puts_on_the_high_leg_is_a_problem(keys, field):
    result = compute_job(_panel(_b("R1", **keys), system=DELTA))
    said = [q for q in result.problems if q.id == "R1" and q.field == field]
    assert said and "high leg" in said[0].message and "NEC 110.15" in said[0].message
    assert not result.ok
    # the same on a 208Y/120 V wye is fine: every phase is 120 V to neutral
    assert compute_job(_panel(_b("R1", **keys))).ok


# -- the placement's properties, against an independent sum of the same currents --------------
_U3 = (1, cmath.rect(1, -2 * math.pi / 3), cmath.rect(1, 2 * math.pi / 3))
_U2 = (1, -1)


def _currents(loads, lines_of, u):
    """Line currents [A, phasors] of ``loads`` placed on ``lines_of[i]``: a line-to-neutral or
    three-phase load at its line's angle, a line-to-line load +I / -I at the angle of the
    voltage between its lines; each lagging by its power-factor angle (Ohm's law, phasors)."""
    total = [0j] * len(u)
    cont = [0j] * len(u)
    for (conn, amps, pf, continuous), lines in zip(loads, lines_of, strict=True):
        lag = cmath.rect(amps, -math.acos(pf))
        if conn == "LL":
            d = u[lines[0]] - u[lines[1]]
            parts = [(lines[0], lag * d / abs(d)), (lines[1], -lag * d / abs(d))]
        else:
            parts = [(k, lag * u[k]) for k in lines]
        for k, x in parts:
            total[k] += x
            if continuous:
                cont[k] += x
    return total, cont


def _file_order(loads, n):
    """Each load in file order at the lowest free position that takes its poles."""
    taken: set[int] = set()
    out = []
    for conn, *_ in loads:
        poles = {"LN": 1, "LL": 2, "3P": 3}[conn]
        p = 1
        while any(q in taken for q in range(p, p + 2 * poles, 2)):
            p += 1
        taken.update(range(p, p + 2 * poles, 2))
        out.append(tuple(((p - 1) // 2 + k) % n for k in range(poles)))
    return out


def _worst(total, cont):
    # NEC 215.2(A)(1): 125 % of the continuous current plus the rest, per line
    return max(1.25 * abs(c) + abs(t - c) for t, c in zip(total, cont, strict=True))


_LOAD = st.tuples(st.sampled_from(["LN", "LN", "LL", "3P"]),
                  st.integers(min_value=1, max_value=60),
                  st.sampled_from([1.0, 0.9, 0.8]), st.booleans())


@given(loads=st.lists(_LOAD, min_size=1, max_size=12), three=st.booleans())
def test_placement_is_never_worse_than_file_order_nor_below_the_average(loads, three):
    if not three:
        loads = [ld for ld in loads if ld[0] != "3P"] or [("LN", 10, 1.0, False)]
    system, u = (Y208, _U3) if three else (S240, _U2)
    runs = [run_table(f"R{i}", "LP1", f"Load {i}", "30",
                      load={"value": amps, "unit": "A", "pf": pf}, connection=conn,
                      continuous=continuous)
            for i, (conn, amps, pf, continuous) in enumerate(loads)]
    result = compute_job(_panel(*runs, system=system))
    lines = result.lines["LP1"]
    # the heaviest line never carries less than the average: the complex power of the loads,
    # the sum of V_LN x I_line over the lines, is at most n V_LN times the heaviest line (with
    # 120 V to neutral: 207.8 V line to line on the wye, 240 V on the single-phase system)
    volts = {"LN": 120.0, "LL": 120.0 * (math.sqrt(3) if three else 2.0), "3P": 360.0}
    power = abs(sum(volts[c] * a * cmath.rect(1, math.acos(pf)) for c, a, pf, _ in loads))
    assert max(lines.phase_amps) >= power / (len(u) * 120.0) - 1e-6
    # and the placement is never worse than placing the same runs in file order
    naive = _currents(loads, _file_order(loads, len(u)), u)
    assert max(lines.design) <= _worst(*naive) + 1e-6
    # what the walk reports is the sum of the currents where it placed them
    placed = [result.placements[f"R{i}"].lines for i in range(len(loads))]
    total, cont = _currents(loads, placed, u)
    assert lines.phase_amps == pytest.approx([abs(t) for t in total], abs=1e-6)


# -- the incremental recompute after edits that move runs -------------------------------------
def _walk():
    return make_job(
        "moves", defaults={"method": "ac"},
        sources=[source_table("SVC", "service", "480Y/277V 3ph 4w"),
                 source_table("T1", "transformer", Y208, kva=75),
                 source_table("LP1", "panel", Y208, rating_a=225, main_a=200, spaces=30),
                 source_table("LP2", "panel", Y208, rating_a=100, main_a=100)],
        runs=[run_table("F-T1", "SVC", "T1", "60"),
              run_table("F-LP1", "T1", "LP1", "15"),
              run_table("F-LP2", "LP1", "LP2", "90"),
              *[run_table(f"A{i}", "LP1", f"Load A{i}", str(20 + 7 * i),
                          load=(4 + 3 * i, "A"), connection=("LN", "LL", "3P", "LN")[i % 4])
                for i in range(8)],
              *[run_table(f"B{i}", "LP2", f"Load B{i}", str(30 + 5 * i),
                          load=(6 + 2 * i, "A"), connection=("LN", "LN", "LL")[i % 3])
                for i in range(6)],
              run_table("W1", "SVC", "Yard", "120", load=(20, "A"), connection="LN")])


def _same(a, b):
    assert a.runs.keys() == b.runs.keys()
    for rid in a.runs:
        assert a.runs[rid].size == b.runs[rid].size, rid
        assert a.runs[rid].total_drop_pct == pytest.approx(b.runs[rid].total_drop_pct), rid
    assert a.placements == b.placements
    for sid in b.lines:
        assert a.lines[sid].phase_amps == pytest.approx(b.lines[sid].phase_amps), sid
    assert a.feeder_amps == pytest.approx(b.feeder_amps)
    assert a.source_drop_pct == pytest.approx(b.source_drop_pct)
    assert a.transformers["T1"].drop_pct == pytest.approx(b.transformers["T1"].drop_pct)
    assert [str(p) for p in a.problems] == [str(p) for p in b.problems]


_PHASES = {"LN": ["A", "B", "C"], "LL": ["AB", "BC", "CA"], "3P": ["ABC"]}


def test_recompute_after_edits_of_phase_position_and_load_equals_a_full_compute():
    job = _walk()
    result = compute_job(job)
    rng = random.Random(12)
    movable = [r for r in job.runs if r.load is not None and r.from_ != "SVC"]
    for _ in range(60):
        r = rng.choice(movable)
        change = rng.choice(["position", "phase", "load", "clear", "length"])
        if change == "position":
            r.position = rng.randint(1, 34)
        elif change == "phase":
            r.phase = rng.choice(_PHASES[r.connection])
        elif change == "load":
            r.load = Load(value=rng.choice([2, 8, 16, 24, 40, 70]), unit="A")
        elif change == "clear":
            r.position = None
            r.phase = None
        else:
            r.length = str(rng.randint(10, 400))
        result = recompute_run(job, result, r.id)
        _same(result, compute_job(job))
