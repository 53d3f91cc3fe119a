"""Shared raceways: the adjustment of NEC 310.15(C)(1) for every current-carrying conductor in
one raceway (neutrals by 310.15(E), EGCs never), its fill for every conductor in it (NEC Ch. 9
Tables 1, 4, 5), and the walk file's ``[[raceway]]`` tables read, checked and written back."""

from __future__ import annotations

import pytest

from gaugewalk.model.walk.compute import compute_job, run_spec_for
from gaugewalk.model.walk.recompute import recompute_run
from gaugewalk.model.walkfile.read import check_walk_text, loads_walk
from gaugewalk.model.walkfile.write import dumps_walk
from tests.support.walks import panel_walk, run_table, tables_text

# NEC 2023 Ch. 9 Table 5, THHN/THWN-2 approximate areas [in2] (from memory)
THHN_12 = 0.0133
THHN_10 = 0.0211
# NEC 2023 Ch. 9 Table 4, EMT total areas [in2] (from memory)
EMT_HALF = 0.304
EMT_3_4 = 0.533


def shared_walk(runs: list[dict], raceway: dict | None = None, **kw) -> str:
    """LP1 (208Y/120 V) with ``runs`` and one shared raceway ``HR1`` (EMT, 60 ft by default)."""
    table = {"id": "HR1", "type": "EMT", "length": "60", **(raceway or {})}
    return panel_walk("Shared home runs", *runs, **kw) + tables_text("raceway", [table])


def three_phase_circuits(n: int, amps: float = 16, **keys) -> list[dict]:
    """``n`` three-phase 4-wire circuits of 12 AWG in HR1 (linear loads)."""
    keys = {"raceway_id": "HR1", **keys}
    return [run_table(f"R{i}", "LP1", f"Unit heater {i}", "40", load=(amps, "A"),
                      connection="3PN", size="12 AWG", **keys)
            for i in range(1, n + 1)]


def test_nine_current_carrying_12_awg_in_one_emt_take_70_percent_and_fill_a_3_4():
    # Three 3-phase 4-wire circuits: 3 hots each count; the neutral carries only the unbalance
    # and is not counted (NEC 310.15(E)(1)); EGCs never count (310.15(F)): 9 CCC.
    job = loads_walk(shared_walk(three_phase_circuits(3)))
    result = compute_job(job)
    shared = result.raceways["HR1"]
    assert shared.ccc == 9
    assert shared.adjustment == pytest.approx(0.70)  # NEC 2023 Table 310.15(C)(1): 7-9, 70 %
    # Fill: 3 x (3 hots + neutral) + 3 EGCs = 15 conductors of 12 AWG THHN (the EGC for a 20 A
    # device is 12 AWG, NEC Table 250.122), 15 x 0.0133 = 0.1995 in2. Ch. 9 Table 1: over two
    # conductors, 40 %: 1/2 EMT holds 0.1216 in2 (too little), 3/4 EMT 0.2132 in2.
    assert shared.conductors == 15
    assert shared.area_in2 == pytest.approx(15 * THHN_12)
    assert 15 * THHN_12 > 0.40 * EMT_HALF and 15 * THHN_12 <= 0.40 * EMT_3_4
    assert shared.trade_size == "3/4"
    assert shared.fill_pct == pytest.approx(100 * 15 * THHN_12 / EMT_3_4)
    assert shared.fill_limit_pct == 40.0
    # every run in it is adjusted: 12 AWG Cu 90 C column 30 A x 0.70 = 21 A, limited by the 60 C
    # terminals to 20 A (NEC Table 310.16, 110.14(C)(1))
    for rid in ("R1", "R2", "R3"):
        run = result.runs[rid]
        assert any("310.15(C)(1): 9 current-carrying conductors, factor 0.7" in n
                   for n in run.notes)
        assert run.ampacity_a == pytest.approx(20.0)
    assert result.ok


def test_a_fixed_trade_size_too_small_is_a_problem_naming_the_raceway():
    job = loads_walk(shared_walk(three_phase_circuits(3), {"size": "1/2"}))
    result = compute_job(job)
    shared = result.raceways["HR1"]
    # 0.1995 in2 in 1/2 EMT (0.304 in2) is 65.6 %, over the 40 % of Ch. 9 Table 1
    assert shared.fill_pct == pytest.approx(100 * 15 * THHN_12 / EMT_HALF)
    problems = [p for p in result.problems if p.about == "raceway"]
    assert len(problems) == 1 and problems[0].id == "HR1" and problems[0].field == "size"
    assert "66% of trade size 1/2 EMT" in problems[0].message
    assert "trade size 3/4 would hold them" in problems[0].message
    assert "raceway HR1" in str(problems[0])


def test_a_neutral_of_two_phases_of_a_wye_counts_and_runs_are_resized_for_it():
    # 208Y/120 V two hots and the neutral: the neutral carries about the phase current and counts
    # (NEC 310.15(E)(2)): 3 CCC per circuit. Six circuits: 18 CCC, Table 310.15(C)(1) 10-20: 50 %.
    def ovens(**keys) -> list[dict]:
        return [run_table(f"R{i}", "LP1", f"Oven {i}", "20", load=(18, "A"), connection="LLN",
                          **keys) for i in range(1, 7)]

    alone = compute_job(loads_walk(panel_walk("alone", *ovens())))
    # alone: 3 CCC, no adjustment; 12 AWG (60 C column 20 A >= 18 A), NEC Table 310.16
    assert alone.runs["R1"].size == "12 AWG"
    result = compute_job(loads_walk(shared_walk(ovens(raceway_id="HR1"))))
    assert result.raceways["HR1"].ccc == 18
    assert result.raceways["HR1"].adjustment == pytest.approx(0.50)
    # shared: 12 AWG 90 C 30 A x 0.5 = 15 A < 18 A; 10 AWG 40 A x 0.5 = 20 A >= 18 A
    assert result.runs["R1"].size == "10 AWG"
    assert result.runs["R1"].ampacity_a == pytest.approx(20.0)


def test_a_120_240_neutral_carrying_only_the_unbalance_is_not_counted():
    # 120/240 V 1ph 3w, two hots and the neutral: the neutral carries only the unbalance
    # (NEC 310.15(E)(1)): 2 CCC per circuit; two circuits: 4 CCC, Table 310.15(C)(1) 4-6: 80 %
    text = shared_walk([run_table(f"R{i}", "LP1", f"Dryer {i}", "30", load=(20, "A"),
                                  connection="LLN", raceway_id="HR1") for i in (1, 2)])
    text = text.replace("208Y/120V 3ph 4w", "120/240V 1ph 3w")
    result = compute_job(loads_walk(text))
    assert result.raceways["HR1"].ccc == 4
    assert result.raceways["HR1"].adjustment == pytest.approx(0.80)


def test_three_or_fewer_current_carrying_conductors_take_no_adjustment():
    result = compute_job(loads_walk(shared_walk(three_phase_circuits(1))))
    assert result.raceways["HR1"].ccc == 3
    assert result.raceways["HR1"].adjustment == 1.0  # NEC Table 310.15(C)(1): 1-3 not listed
    assert not any("310.15(C)(1)" in n for n in result.runs["R1"].notes)


def test_the_run_card_preview_sizes_a_run_with_the_raceway_it_names():
    job = loads_walk(shared_walk(three_phase_circuits(3)))
    spec = run_spec_for(job, job.run("R1"), 0.0)
    assert spec.ccc == 9


def test_an_edit_on_a_walk_with_shared_raceways_equals_a_full_compute():
    job = loads_walk(shared_walk(three_phase_circuits(3)))
    result = compute_job(job)
    job.run("R2").load = job.run("R2").load.model_copy(update={"value": 19.0})
    again = recompute_run(job, result, "R2")
    full = compute_job(job)
    assert again.runs == full.runs and again.raceways == full.raceways


def test_a_raceway_no_run_names_and_without_a_size_is_a_problem():
    text = panel_walk("empty", run_table("R1", "LP1", "Sign", "30", load=(5, "A"))) + \
        tables_text("raceway", [{"id": "SPARE", "length": "40"}])
    result = compute_job(loads_walk(text))
    assert [p.id for p in result.problems if p.about == "raceway"] == ["SPARE"]


def test_an_unknown_raceway_id_names_the_run_field_and_line():
    text = shared_walk(three_phase_circuits(1, raceway_id="HR9"))
    job, problems = check_walk_text(text, "shop.toml")
    assert len(problems) == 1
    p = problems[0]
    assert (p.about, p.id, p.field) == ("run", "R1", "raceway_id")
    assert text.splitlines()[p.line - 1].startswith("raceway_id")
    assert "no shared raceway 'HR9'" in p.message


def test_a_repeated_raceway_id_and_a_size_its_type_is_not_made_in_are_named():
    text = shared_walk(three_phase_circuits(1)) + tables_text(
        "raceway", [{"id": "HR1", "length": "10"}, {"id": "HR2", "type": "ENT", "size": "3",
                                                   "length": "10"}])
    _, problems = check_walk_text(text, "shop.toml")
    words = sorted((p.about, p.id, p.field, p.message[:30]) for p in problems)
    assert words[0][:3] == ("raceway", "HR1", "id")
    assert words[1][:2] == ("raceway", "HR2") and "ENT is not made in trade size 3" in \
        [p.message for p in problems if p.id == "HR2"][0]


def test_raceways_are_written_back_as_read():
    job = loads_walk(shared_walk(three_phase_circuits(2), {"size": "1 1/4", "bends": 2,
                                                           "notes": "up the wall"}))
    text = dumps_walk(job)
    assert "[[raceway]]\nid = \"HR1\"\ntype = \"EMT\"\nsize = \"1-1/4\"" in text
    assert loads_walk(text) == job


# -- the takeoff ---------------------------------------------------------------------------------

def nine_home_runs(raceway: dict | None = None, length: str = "70") -> str:
    """Nine 120 V circuits (18 CCC) home in HR1 (60 ft of EMT), each 70 ft from LP1."""
    return shared_walk([run_table(f"R{i}", "LP1", f"Lights {i}", length, load=(10, "A"),
                                  connection="LN", raceway_id="HR1") for i in range(1, 10)],
                       raceway)


def test_the_takeoff_counts_a_shared_raceway_once_for_its_own_length():
    from gaugewalk.model.walk.takeoff import build_takeoff

    job = loads_walk(nine_home_runs())
    result = compute_job(job)
    takeoff = build_takeoff(job, result)
    shared = [r for r in takeoff.raceway_lines if r.id == "HR1"]
    assert len(shared) == 1
    assert shared[0].length_ft == 60.0
    assert shared[0].trade_size == result.raceways["HR1"].trade_size
    assert shared[0].sticks == 6  # 60 ft in 10 ft lengths of EMT (common practice)
    assert shared[0].runs == tuple(f"R{i}" for i in range(1, 10))
    # each run keeps its own raceway for the rest of its route: 9 x (70 - 60) ft, beside the
    # feeder F1's 40 ft
    own = [r for r in takeoff.raceway_lines if r.id is None]
    assert sum(r.length_ft for r in own) == pytest.approx(9 * 10.0 + 40.0)
    data = takeoff.to_dict()
    assert [r["id"] for r in data["raceway"] if r["id"]] == ["HR1"]
    # the conductors still run the whole route: 70 ft + 2 x 2 ft slack, per conductor; the nine
    # hots are placed three to a line, black, red and blue (common practice colours)
    hots = [w for w in takeoff.wire_lines if w.function == "phase" and "F1" not in w.runs]
    assert sum(w.net_ft for w in hots) == pytest.approx(9 * 74.0)
    assert sorted(len(w.runs) for w in hots) == [3, 3, 3]


def test_runs_wholly_in_a_shared_raceway_have_no_raceway_of_their_own():
    from gaugewalk.model.walk.takeoff import build_takeoff

    job = loads_walk(nine_home_runs(length="50"))
    takeoff = build_takeoff(job, compute_job(job))
    branch = [r for r in takeoff.raceway_lines if r.id is None and "R1" in r.runs]
    assert branch == []
    # connectors: 2 per end of the feeder's raceway and of HR1 only (the takeoff's assumption)
    connectors = sum(f.count for f in takeoff.fitting_lines if f.item == "connector")
    assert connectors == 2 * 2 * 2


def test_a_shared_raceways_bends_give_its_elbows_and_pull_points():
    from gaugewalk.model.walk.takeoff import build_takeoff

    job = loads_walk(nine_home_runs({"bends": 5}))
    result = compute_job(job)
    trade = result.raceways["HR1"].trade_size
    takeoff = build_takeoff(job, result)
    fittings = {(f.item, f.trade_size): f.count for f in takeoff.fitting_lines}
    assert fittings[("90-degree elbow", trade)] == 5
    # five quarter bends are 450 degrees: over the 360 of NEC 358.26, one pull point between
    assert fittings[("conduit body", trade)] == 1
    assert any(w.startswith("raceway HR1: 5 bends") for w in takeoff.warnings)


# -- a segment in a shared raceway ---------------------------------------------------------------

def test_a_segment_puts_part_of_a_run_in_a_shared_raceway_and_the_fullest_one_adjusts_it():
    segments = [{"length": "20", "note": "down the wall", "raceway_id": "HR2"},
                {"length": "50", "note": "home along the corridor", "raceway_id": "HR1"}]
    runs = [run_table(f"R{i}", "LP1", f"Desk {i}", "60", load=(10, "A"), connection="LN",
                      raceway_id="HR1") for i in (1, 2, 3)]
    runs.append(run_table("R4", "LP1", "Copier", "75", load=(12, "A"), connection="LN",
                          segments=segments[:1] + [{"length": "5"}] + segments[1:]))
    text = shared_walk(runs, {"length": "50"}) + tables_text(
        "raceway", [{"id": "HR2", "type": "EMT", "length": "20"}])
    job = loads_walk(text)
    result = compute_job(job)
    # HR1: four 120 V circuits, hot and neutral each (NEC 310.15(E)): 8 CCC, 70 %
    # (Table 310.15(C)(1)); HR2 holds R4 alone: 2 CCC, no adjustment
    assert result.raceways["HR1"].runs == ("R1", "R2", "R3", "R4")
    assert (result.raceways["HR1"].ccc, result.raceways["HR2"].ccc) == (8, 2)
    assert any("310.15(C)(1): 8 current-carrying conductors, factor 0.7" in n
               for n in result.runs["R4"].notes)
    from gaugewalk.model.walk.takeoff import build_takeoff

    takeoff = build_takeoff(job, result)
    lengths = {r.id: r.length_ft for r in takeoff.raceway_lines if r.id}
    assert lengths == {"HR1": 50.0, "HR2": 20.0}
    from gaugewalk.model.walk.raceways import own_raceway_ft

    # R4's own raceway is only the 5 ft between its two shared stretches (75 - 20 - 50); the
    # others' the 10 ft past HR1 (60 - 50)
    assert own_raceway_ft(job.run("R4"), {"HR1": 50.0, "HR2": 20.0}) == 5.0
    assert own_raceway_ft(job.run("R1"), {"HR1": 50.0, "HR2": 20.0}) == 10.0


def test_a_segment_naming_a_raceway_the_walk_lacks_is_named():
    runs = [run_table("R1", "LP1", "Desk", "60", load=(10, "A"),
                      segments=[{"length": "60", "raceway_id": "HR8"}])]
    _, problems = check_walk_text(shared_walk(runs), "shop.toml")
    assert [(p.id, p.field) for p in problems] == [("R1", "segments")]
    assert "segment 1: there is no shared raceway 'HR8'" in problems[0].message


# -- colours from phases -------------------------------------------------------------------------

def test_each_conductors_colour_follows_the_line_its_run_lands_on():
    from gaugewalk.model.walk.takeoff import build_takeoff

    # 208Y/120 V panel, one-pole circuits at positions 1, 3, 5 and 2: rows A, B, C, so 1 and 2
    # on A, 3 on B, 5 on C (the usual panelboard numbering, common practice); colours
    # black/red/blue for A/B/C on 208Y/120 V (common practice, gaugewalk.tables.order.colours)
    runs = [run_table(rid, "LP1", f"Desk {rid}", length, load=(8, "A"), connection="LN",
                      position=position)
            for rid, length, position in (("R1", "50", 1), ("R2", "60", 3), ("R3", "70", 5),
                                          ("R4", "40", 2))]
    job = loads_walk(panel_walk("Phased", *runs))
    result = compute_job(job)
    takeoff = build_takeoff(job, result)
    branch = [w for w in takeoff.wire_lines if w.function == "phase" and "F1" not in w.runs]
    assert {w.colour: w.runs for w in branch} == {
        "black": ("R1", "R4"), "red": ("R2",), "blue": ("R3",)}
    # footage per colour: (route + 2 x 2 ft slack) per conductor (the job's slack, common practice)
    net = {w.colour: w.net_ft for w in branch}
    assert net == {"black": (50 + 4) + (40 + 4), "red": 60 + 4, "blue": 70 + 4}
    assert any("follow the line each conductor lands on" in a for a in takeoff.assumptions)
