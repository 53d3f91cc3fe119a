"""The distribution faces of the command line: ``source`` ratings and nameplate, ``add``
positions and phases, ``place``, and the sources and schedules of ``check --json``. Every walk
here is invented."""

from __future__ import annotations

import json
import math
import tomllib

import pytest

from gaugewalk.tui.cli.main import main
from tests.support.walks import run_table, source_table, walk_text, write_walk

SQRT3 = math.sqrt(3.0)
Y208 = "208Y/120V 3ph 4w"
Y480 = "480Y/277V 3ph 4w"


def _check_json(path, capsys) -> dict:
    main(["check", "--json", str(path)])
    return json.loads(capsys.readouterr().out)


def test_source_takes_main_spaces_impedance_and_protection(tmp_path, capsys):
    path = write_walk(tmp_path, walk_text("job", sources=[source_table("SVC", "service", Y480)]))
    assert main(["source", str(path), "T1", "--kind", "transformer", "--system", "208Y/120",
                 "--kva", "45", "--impedance", "3.9", "--protection", "both", "--from", "SVC",
                 "--length", "10"]) == 0
    assert main(["source", str(path), "LP1", "--kind", "panel", "--system", "208Y/120",
                 "--rating", "225", "--main", "150", "--spaces", "42", "--from", "T1",
                 "--length", "8"]) == 0
    data = tomllib.loads(path.read_text())
    t1, lp1 = data["source"][1], data["source"][2]
    assert (t1["impedance_pct"], t1["protection"]) == (3.9, "both")
    assert (lp1["rating_a"], lp1["main_a"], lp1["spaces"]) == (225, 150, 42)
    capsys.readouterr()
    # a panel has no impedance: refused naming the source and field, the file left alone
    before = path.read_bytes()
    assert main(["source", str(path), "LP2", "--kind", "panel", "--system", "208Y/120",
                 "--impedance", "4", "--from", "LP1", "--length", "8"]) == 2
    assert "LP2" in capsys.readouterr().err
    assert path.read_bytes() == before


def test_add_takes_a_position_and_a_phase_and_says_where_the_run_landed(tmp_path, capsys):
    path = write_walk(tmp_path, walk_text(
        "job", sources=[source_table("SVC", "service"), source_table("LP1", "panel", spaces=12)],
        runs=[run_table("F1", "SVC", "LP1", "20")]))
    assert main(["add", str(path), "--from", "LP1", "--to", "Heater", "--length", "30",
                 "--kw", "4", "--connection", "LL", "--position", "5", "--id", "H1"]) == 0
    out = capsys.readouterr().out
    # a 2-pole at 5 takes 5 (C) and 7 (A): phase CA (common practice: rows A, B, C)
    assert "position 5-7, phase CA (as given)" in out
    assert main(["add", str(path), "--from", "LP1", "--to", "Lamp", "--length", "30",
                 "--amps", "5", "--connection", "LN", "--phase", "B", "--id", "L1"]) == 0
    out = capsys.readouterr().out
    assert "position 3, phase B (phase as given)" in out   # 3-4 are on B
    runs = {r["id"]: r for r in tomllib.loads(path.read_text())["run"]}
    assert runs["H1"]["position"] == 5 and runs["L1"]["phase"] == "B"
    # two runs on one position, and a position past the spaces: problems naming the run
    assert main(["add", str(path), "--from", "LP1", "--to", "Fan", "--length", "30",
                 "--amps", "3", "--connection", "LN", "--position", "7", "--id", "X1"]) == 0
    assert "position 7 is already taken by run H1" in capsys.readouterr().out
    assert main(["add", str(path), "--from", "LP1", "--to", "Sign", "--length", "30",
                 "--amps", "3", "--connection", "LN", "--position", "13", "--id", "X2"]) == 0
    assert "position 13 is past the 12 spaces" in capsys.readouterr().out
    data = _check_json(path, capsys)
    assert not data["summary"]["all_ok"]
    x2 = next(r for r in data["runs"] if r["id"] == "X2")
    assert any("past the 12 spaces" in p for p in x2["problems"])


def test_add_refuses_a_phase_that_is_not_a_phase(tmp_path, capsys):
    path = write_walk(tmp_path)
    before = path.read_bytes()
    assert main(["add", str(path), "--from", "LP1", "--to", "Lamp", "--length", "30",
                 "--amps", "5", "--phase", "D"]) == 2
    assert "--phase" in capsys.readouterr().err
    assert path.read_bytes() == before


def test_place_keeps_the_tools_positions_in_the_file(tmp_path, capsys):
    runs = [run_table(f"R{n}", "LP1", f"Load {n}", "30", load=(10 + n, "A"), connection="LN")
            for n in range(1, 5)]
    path = write_walk(tmp_path, walk_text(
        "job", sources=[source_table("SVC", "service"), source_table("LP1", "panel")],
        runs=[run_table("F1", "SVC", "LP1", "20"), *runs]))
    before = _check_json(path, capsys)
    assert main(["place", str(path)]) == 0
    assert "placed 5 run(s)" in capsys.readouterr().out   # F1 on SVC and the four on LP1
    data = tomllib.loads(path.read_text())
    positions = {r["id"]: r.get("position") for r in data["run"]}
    assert all(p is not None for p in positions.values())
    after = _check_json(path, capsys)
    # the same lines as the tool placed them, now "as walked"
    for b, a in zip(before["runs"], after["runs"], strict=True):
        assert (b["position"], b["phase"]) == (a["position"], a["phase"])
        assert a["placed_by"] == "position"
    assert before["sources"][1]["phase_amps"] == after["sources"][1]["phase_amps"]
    assert main(["place", str(path)]) == 0
    assert "every run already has its position" in capsys.readouterr().out


def test_check_json_lists_the_sources_with_their_loading_and_schedule(tmp_path, capsys):
    # 45 kVA 480 V to 208Y/120 V, 120 V loads of 30, 20 and 10 A on LP1 (a 100 A panel)
    runs = [run_table(f"R{n}", "LP1", f"Load {n}", "30", load=(a, "A"), connection="LN",
                      position=p)
            for n, (a, p) in enumerate(((30, 1), (20, 3), (10, 5)), 1)]
    path = write_walk(tmp_path, walk_text(
        "job", sources=[source_table("SVC", "service", Y480),
                        source_table("T1", "transformer", Y208, kva=45),
                        source_table("LP1", "panel", rating_a=100, main_a=100, spaces=30)],
        runs=[run_table("F-T1", "SVC", "T1", "20"), run_table("F-LP1", "T1", "LP1", "8"),
              *runs]))
    data = _check_json(path, capsys)
    assert data["drop_through_transformers"] is True
    sources = {s["id"]: s for s in data["sources"]}
    lp1, t1 = sources["LP1"], sources["T1"]
    # line currents of 120 V loads given in amps are those amps; the neutral load is the
    # largest line-to-neutral load on one line, 30 A (NEC 2023 220.61(A)), not the 17.32 A
    # phasor sum of 30, 20 and 10 A at 0, -120 and +120 degrees with all three on
    assert lp1["phase_amps"] == pytest.approx({"A": 30.0, "B": 20.0, "C": 10.0}, abs=0.01)
    assert lp1["neutral_amps"] == pytest.approx(30.0, abs=0.01)
    assert (lp1["rating_a"], lp1["main_a"]) == (100, 100)
    assert lp1["utilisation_pct"] == pytest.approx(30.0, abs=0.05)   # 30 A of 100 A
    assert lp1["load_va"] == pytest.approx(60 * 120, abs=0.1)
    rows = lp1["schedule"]["rows"]
    assert [(r["run"], r["positions"], r["phase"], r["by"]) for r in rows] == [
        ("R1", [1], "A", "position"), ("R2", [3], "B", "position"), ("R3", [5], "C", "position")]
    assert lp1["schedule"]["total_va"] == pytest.approx({"A": 3600, "B": 2400, "C": 1200})
    # 45 kVA: primary 45000 / (sqrt(3) x 480) = 54.1 A, secondary / (sqrt(3) x 208) = 124.9 A;
    # Table 450.3(B) primary only: 125 % = 67.7 A, note 1: next standard rating 70 A
    assert t1["kva"] == 45 and t1["primary_fla_a"] == pytest.approx(54.13, abs=0.01)
    assert t1["secondary_fla_a"] == pytest.approx(124.91, abs=0.01)
    assert (t1["primary_ocpd_a"], t1["secondary_ocpd_a"]) == (70, None)
    assert t1["impedance_assumed"] is True and t1["drop_pct"] > 0
    assert t1["schedule"] is None
    feeders = {r["id"]: r for r in data["runs"] if r["feeder"]}
    assert feeders["F-T1"]["amps"] == 70 and "450.3(B)" in feeders["F-T1"]["basis"]
    # the secondary conductors end in LP1's 100 A main: sized for 100 A (NEC 240.21(C))
    assert feeders["F-LP1"]["amps"] == 100 and "240.21(C)" in feeders["F-LP1"]["basis"]


def test_check_json_keeps_the_connected_load_answer_beside_an_equipment_basis(tmp_path, capsys):
    path = write_walk(tmp_path, walk_text(
        "job", defaults={"feeder_basis": "equipment"},
        sources=[source_table("SVC", "service"),
                 source_table("LP1", "panel", rating_a=225, main_a=200)],
        runs=[run_table("F1", "SVC", "LP1", "20"),
              run_table("R1", "LP1", "Bench", "40", load=(16, "A"), connection="LN")]))
    f1 = next(r for r in _check_json(path, capsys)["runs"] if r["id"] == "F1")
    # sized to LP1's 200 A main (common practice): 200 A, 3/0 AWG Cu (75 C, Table 310.16)
    assert (f1["amps"], f1["ocpd_a"], f1["size"]) == (200, 200, "3/0 AWG")
    assert "200 A main" in f1["basis"]
    # beside it, the 16 A it serves: a 20 A device (240.6(A))
    assert f1["load_answer"]["ocpd_a"] == 20 and f1["load_answer"]["amps"] == 16


def test_check_json_lists_each_demand_factor_a_feeder_takes(tmp_path, capsys):
    receptacles = [run_table(f"R{i}", "LP1", f"Receptacles {i}", "40", connection="LN",
                             load={"value": 1440, "unit": "VA", "kind": "receptacle"})
                   for i in range(30)]
    heat_and_cool = [
        run_table("H1", "LP1", "Unit heaters", "40", connection="3P",
                  load={"value": 10, "unit": "kW", "kind": "heater"}),
        run_table("RTU1", "LP1", "Rooftop unit", "60", connection="3P",
                  load={"value": 8, "unit": "kW", "kind": "hvac", "pf": 1.0, "mca": 28,
                        "mocp": 40})]
    sources = [source_table("SVC", "service"), source_table("LP1", "panel")]
    runs = [run_table("F1", "SVC", "LP1", "20"), *receptacles, *heat_and_cool]
    path = write_walk(tmp_path, walk_text("job", defaults={"demand": "nec-220"},
                                          sources=sources, runs=runs))
    data = _check_json(path, capsys)
    assert data["demand"] == "nec-220"
    f1 = next(r for r in data["runs"] if r["id"] == "F1")
    steps = {s["section"]: s for s in f1["demand"]}
    # NEC 2023 Table 220.44: 43.2 kVA -> 10 + 0.5 x 33.2 = 26.6 kVA
    assert (steps["NEC 220.44"]["connected_va"], steps["NEC 220.44"]["demand_va"]) == (
        43_200.0, 26_600.0)
    # NEC 2023 220.60: 8 kW of cooling against 10 kW of heating: the cooling is left out
    assert steps["NEC 220.60"]["group"] == "cooling" and "left out" in steps["NEC 220.60"]["note"]
    # per line: 26,600 / 3 / 120 V of receptacles + 10,000 / (sqrt 3 x 208) of heaters
    assert f1["load_amps"] == pytest.approx(26_600 / 3 / 120 + 10_000 / (SQRT3 * 208), abs=1e-3)
    assert next(r for r in data["runs"] if r["id"] == "R1")["demand"] is None
    connected = write_walk(tmp_path, walk_text("job", sources=sources, runs=runs), "old.toml")
    old = _check_json(connected, capsys)
    assert old["demand"] == "connected"
    assert next(r for r in old["runs"] if r["id"] == "F1")["demand"] == []
