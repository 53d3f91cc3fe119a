"""The ``raceway`` command and ``add --raceway-id``: shared raceways added, listed (text and
JSON) and reported by ``check --json``, with mistakes named and nothing written."""

from __future__ import annotations

import json

import pytest

from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.tui.cli.main import main


@pytest.fixture
def walk(tmp_path, capsys):
    path = tmp_path / "shop.toml"
    main(["new", str(path), "--service", "208Y/120"])
    main(["source", str(path), "LP1", "--kind", "panel", "--system", "208Y/120", "--from", "SVC",
          "--length", "40"])
    capsys.readouterr()
    return path


def test_a_raceway_is_added_and_three_multiwire_circuits_join_it(walk, capsys):
    assert main(["raceway", str(walk), "HR1", "--type", "emt", "--length", "50+10",
                 "--bends", "2"]) == 0
    assert "added raceway HR1: EMT" in capsys.readouterr().out
    for i in (1, 2, 3):
        assert main(["add", str(walk), "--from", "LP1", "--to", f"Heater {i}", "--length", "80",
                     "--amps", "16", "--connection", "3PN", "--size", "12 AWG",
                     "--raceway-id", "HR1"]) == 0
    job = load_walk(walk)
    assert [r.id for r in job.runs_in("HR1")] == ["R1", "R2", "R3"]
    capsys.readouterr()
    assert main(["raceway", str(walk), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    shared = data["raceways"][0]
    # three 3-phase 4-wire circuits: 9 CCC (neutrals not counted, NEC 310.15(E)(1)),
    # 70 % by Table 310.15(C)(1); 15 conductors of 12 AWG THHN, 0.1995 in2 (Ch. 9 Table 5) in
    # 3/4 EMT, 0.533 in2 (Table 4): 37.4 %
    assert (shared["id"], shared["ccc"], shared["adjustment"]) == ("HR1", 9, 0.7)
    assert (shared["trade_size"], shared["fill_pct"]) == ("3/4", 37.4)
    assert shared["length_ft"] == 60.0 and shared["runs"] == ["R1", "R2", "R3"]
    assert main(["check", str(walk), "--json"]) == 0
    checked = json.loads(capsys.readouterr().out)
    assert checked["raceways"][0]["fill_pct"] == 37.4
    assert {r["id"]: r["raceway_id"] for r in checked["runs"]}["R2"] == "HR1"
    assert main(["raceway", str(walk)]) == 0
    assert "HR1: 3/4 EMT, 60 ft, runs R1, R2, R3" in capsys.readouterr().out


def test_a_fixed_size_overfilled_makes_the_list_and_check_exit_1(walk, capsys):
    main(["raceway", str(walk), "HR1", "--size", "1/2", "--length", "60"])
    for i in (1, 2, 3):
        main(["add", str(walk), "--from", "LP1", "--to", f"Heater {i}", "--length", "80",
              "--amps", "16", "--connection", "3PN", "--size", "12 AWG", "--raceway-id", "HR1"])
    capsys.readouterr()
    assert main(["raceway", str(walk)]) == 1
    assert "problem: 15 conductors (0.200 in2) fill 66% of trade size 1/2 EMT" in \
        capsys.readouterr().out
    assert main(["check", str(walk)]) == 1
    assert "raceway HR1: 15 conductors" in capsys.readouterr().out


@pytest.mark.parametrize("argv, words", [
    (["HR1", "--length", "60", "--size", "7"], "raceway HR1, size: no trade size '7'"),
    (["HR1", "--type", "ENT", "--size", "3", "--length", "9"], "ENT is not made in trade size 3"),
    (["HR1"], "give its route length with --length L"),
    (["HR1", "--length", "6O"], "raceway HR1, length: the length '6O' cannot be read"),
    (["--length", "60"], "give the new raceway's ID before its options"),
])
def test_a_mistake_is_named_and_nothing_is_written(walk, capsys, argv, words):
    before = walk.read_bytes()
    assert main(["raceway", str(walk), *argv]) == 2
    assert words in capsys.readouterr().err
    assert walk.read_bytes() == before


def test_a_run_naming_a_raceway_the_walk_lacks_is_refused(walk, capsys):
    before = walk.read_bytes()
    assert main(["add", str(walk), "--from", "LP1", "--to", "Sign", "--length", "30",
                 "--amps", "5", "--raceway-id", "HR7"]) == 2
    assert "raceway_id: there is no shared raceway 'HR7'" in capsys.readouterr().err
    assert walk.read_bytes() == before


def test_a_repeated_raceway_id_is_refused(walk, capsys):
    main(["raceway", str(walk), "HR1", "--length", "60"])
    before = walk.read_bytes()
    assert main(["raceway", str(walk), "HR1", "--length", "20"]) == 2
    assert "raceway HR1: that id is already used" in capsys.readouterr().err
    assert walk.read_bytes() == before
