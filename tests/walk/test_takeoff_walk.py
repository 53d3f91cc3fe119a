"""The takeoff of a small walk, worked by hand, and the ``gaugewalk takeoff`` command."""

from __future__ import annotations

import csv
import io
import json

import pytest

from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walk.takeoff import ROW_FIELDS, build_takeoff
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.tui.cli import takeoff as cmd_takeoff
from gaugewalk.tui.cli.main import CAUTION
from tests.support.golden import TAKEOFF_WALK as WALK
from tests.support.golden import check_golden, gaugewalk


@pytest.fixture(scope="module")
def computed():
    job = load_walk(WALK)
    result = compute_job(job)
    return job, result, build_takeoff(job, result)


def test_the_walk_sizes_as_the_hand_takeoff_assumes(computed):
    _, result, _ = computed
    f1, b1, b2 = result.runs["F1"], result.runs["B1"], result.runs["B2"]
    # NEC Table 250.122: 400 A device -> 3 AWG Cu EGC; 20 A -> 12 AWG Cu
    assert (f1.size, f1.sets, f1.egc_size) == ("3/0 AWG", 2, "3 AWG")
    assert (b1.size, b1.egc_size, b2.egc_size) == ("12 AWG", "12 AWG", "12 AWG")
    # NEC Ch. 9 Tables 1, 4, 5: 3 x 12 AWG THHN = 3 x 0.0133 = 0.0399 in^2 <= 40 % of 0.304 in^2
    # (1/2 EMT) = 0.122 in^2
    assert (b1.raceway, b1.raceway_size) == ("EMT", "1/2")
    # per raceway: 4 x 3/0 THHN (0.2679) + 3 AWG THHN (0.0973) = 1.1689 in^2; 40 % of 2 PVC-40
    # (3.291) = 1.316 fits, 40 % of 1-1/2 (1.986) = 0.794 does not
    assert (f1.raceway, f1.raceway_size) == ("PVC-40", "2")


def test_walk_takeoff_worked_by_hand(computed):
    _, _, takeoff = computed
    wire = {(w.size, w.function, w.colour): (w.net_ft, w.with_waste_ft, w.order_ft, w.left_over_ft)
            for w in takeoff.wire_lines}
    assert wire == {
        # B1 (60 + 2 + 2) + B2 (40 + 2 + 2) = 108 ft per conductor; 120 V circuits: one hot,
        # white neutral (NEC 200.6(A)), green EGC (NEC 250.119); cuts with 10 % waste:
        # 64 x 1.1 = 70.4 -> 71, 44 x 1.1 = 48.4 -> 49. The hots take the colour of the line the
        # tool places them on to balance LP1: B1 (16 A) on A, black; B2 (10 A) on B, red
        # (common practice colours): a 500 ft box each, 429 and 451 ft over
        ("12 AWG", "phase", "black"): (64.0, 71, 500, 429),
        ("12 AWG", "phase", "red"): (44.0, 49, 500, 451),
        ("12 AWG", "neutral", "white"): (108.0, 120, 500, 380),
        ("12 AWG", "EGC", "green"): (108.0, 120, 500, 380),
        # F1 "120+30" = 150 ft; (150 + 4) x 2 sets = 308 ft per conductor; a cut per set of
        # 154 x 1.1 = 169.4 -> 170 ft, 340 ft; the EGC is in each raceway (NEC 250.122(F)).
        # 3 AWG and 3/0 AWG are cut to length (common practice): 340 ft, nothing over
        ("3 AWG", "EGC", "green"): (308.0, 340, 340, 0),
        ("3/0 AWG", "phase", "black"): (308.0, 340, 340, 0),
        ("3/0 AWG", "phase", "red"): (308.0, 340, 340, 0),
        ("3/0 AWG", "phase", "blue"): (308.0, 340, 340, 0),
        ("3/0 AWG", "neutral", "white"): (308.0, 340, 340, 0),
    }
    race = {(r.raceway, r.trade_size): (r.length_ft, r.sticks) for r in takeoff.raceway_lines}
    # EMT 60 + 40 = 100 ft = 10 sticks; PVC 150 x 2 raceways = 300 ft = 30 sticks
    assert race == {("EMT", "1/2"): (100.0, 10), ("PVC-40", "2"): (300.0, 30)}
    fit = {(f.item, f.raceway): f.count for f in takeoff.fitting_lines}
    assert fit == {
        ("coupling", "EMT"): 8,          # (6 - 1) + (4 - 1)
        ("connector", "EMT"): 8,         # 2 per end x 2 ends x 2 raceways
        ("support", "EMT"): 12,          # NEC 358.30(A): 7 (60 ft) + 5 (40 ft)
        ("90-degree elbow", "EMT"): 1,   # B1 bends = 1
        ("coupling", "PVC-40"): 28,      # (15 - 1) x 2
        ("connector", "PVC-40"): 8,      # 2 x 2 x 2
        ("support", "PVC-40"): 60,       # NEC Table 352.30, 2 in: 5 ft; (ceil(144/5) + 1) x 2
        ("90-degree elbow", "PVC-40"): 6,  # F1 bends = 3, x 2 raceways
        # F1 150 ft: a pull point past 100 ft (common practice), x 2 raceways; trade size 2
        ("conduit body", "PVC-40"): 2,
    }
    assert takeoff.warnings == ()


def test_colour_rules_are_cited_in_the_assumptions(computed):
    text = "\n".join(computed[2].assumptions)
    assert "NEC 200.6" in text and "NEC 250.119" in text and "common practice" in text


def test_csv_is_an_order_a_supplier_takes(capsys):
    assert gaugewalk(cmd_takeoff, [str(WALK), "--csv"]) == 0
    captured = capsys.readouterr()
    out = captured.out
    rows = list(csv.reader(io.StringIO(out)))
    assert tuple(rows[0]) == ROW_FIELDS == ("item", "description", "quantity", "unit")
    assert sum(1 for r in rows if tuple(r) == ROW_FIELDS) == 1      # one header row
    assert all(len(r) == len(ROW_FIELDS) for r in rows)
    data = list(csv.DictReader(io.StringIO(out)))
    assert not any("total" in (r["item"] + r["description"]).lower() for r in data)
    assert {r["unit"] for r in data} == {"box", "ft", "each"}
    by_item = {r["item"]: r for r in data}
    # 3/0 AWG black: two cuts of (150 + 4) x 1.10 -> 170 ft, cut to length
    assert by_item["CU.3/0AWG.THHN/THWN-2.BLACK.CUT"] == {
        "item": "CU.3/0AWG.THHN/THWN-2.BLACK.CUT",
        "description": "3/0 AWG copper THHN/THWN-2, black, cut to length",
        "quantity": "340", "unit": "ft"}
    assert by_item["EMT.1/2.SUPPORT"]["quantity"] == "12"           # NEC 358.30(A)
    # the caution goes with it, on stderr, so the order stays clean
    assert CAUTION in captured.err
    check_golden("takeoff_walk.csv", out)


def test_json_carries_lines_assumptions_and_the_caution(capsys):
    assert gaugewalk(cmd_takeoff, [str(WALK), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["caution"] == CAUTION
    sizes = {(s["size"], s["with_waste_ft"]) for s in data["footage_by_size"]}
    # 12 AWG: 3 x 120; 3 AWG: 340; 3/0 AWG: 4 x 340
    assert sizes == {("12 AWG", 360), ("3 AWG", 340), ("3/0 AWG", 1360)}
    assert data["assumptions"]


def test_text_output_shows_the_order_and_the_caution(capsys):
    assert gaugewalk(cmd_takeoff, [str(WALK)]) == 0
    out = capsys.readouterr().out
    assert "1 x 500 ft box" in out and "NEC 358.30(A)" in out
    assert CAUTION in out


def test_csv_and_json_together_are_refused(capsys):
    assert gaugewalk(cmd_takeoff, [str(WALK), "--csv", "--json"]) == 2
    assert "not allowed with" in capsys.readouterr().err


def test_a_missing_walk_exits_2_with_one_line(tmp_path, capsys):
    missing = tmp_path / "nowhere.toml"
    assert gaugewalk(cmd_takeoff, [str(missing)]) == 2
    err = capsys.readouterr().err
    assert "nowhere.toml" in err and err.count("\n") == 1


def test_a_broken_walk_names_the_run_and_field(tmp_path, capsys):
    bad = tmp_path / "bad.toml"
    text = WALK.read_text(encoding="utf-8").replace('length = "60"', 'length = "sixty"')
    bad.write_text(text, encoding="utf-8")
    assert gaugewalk(cmd_takeoff, [str(bad), "--csv"]) == 2
    err = capsys.readouterr().err
    assert "run B1" in err and "length" in err and err.count("\n") == 1
    assert bad.read_text(encoding="utf-8") == text  # untouched


def test_an_unknown_colour_scheme_exits_2(tmp_path, capsys):
    odd = tmp_path / "odd.toml"
    odd.write_text(WALK.read_text(encoding="utf-8").replace(
        "waste_pct = 10.0", 'waste_pct = 10.0\ncolour_scheme = "rainbow"'), encoding="utf-8")
    assert gaugewalk(cmd_takeoff, [str(odd)]) == 2
    assert "colour_scheme" in capsys.readouterr().err


def test_put_ups_the_job_lists_are_the_ones_ordered(tmp_path):
    from gaugewalk.model.walkfile.read import loads_walk
    from gaugewalk.model.walkfile.write import dumps_walk

    text = WALK.read_text(encoding="utf-8").replace("waste_pct = 10.0", (
        "waste_pct = 10.0\n"
        'putups = [{ label = "250 ft coil", length_ft = 250, sizes = ["12", "3"] },'
        ' { label = "cut reel", length_ft = 400, sizes = ["3/0 AWG"] }]'))
    job = loads_walk(text, "listed.toml")
    assert loads_walk(dumps_walk(job)).defaults == job.defaults   # survives a save
    takeoff = build_takeoff(job, compute_job(job))
    order = {(w.size, w.colour): ([(p.label, p.count) for p in w.order], w.left_over_ft)
             for w in takeoff.wire_lines}
    # 12 AWG: B1's hot (black, line A) 71 ft and B2's (red, line B) 49 ft: one 250 ft coil
    # each, 179 and 201 ft over
    assert order["12 AWG", "black"] == ([("250 ft coil", 1)], 179)
    assert order["12 AWG", "red"] == ([("250 ft coil", 1)], 201)
    # 3 AWG, cuts 170 + 170: one on a 250 ft coil (80 ft over), the other, shorter than the
    # coil, cut to length (3 AWG is cut by the supplier, common practice)
    assert order["3 AWG", "green"] == ([("250 ft coil", 1), ("cut to length", 1)], 80)
    # 3/0 AWG: 340 ft in all is less than its 400 ft put-up: cut to length, nothing over
    assert order["3/0 AWG", "red"] == ([("cut to length", 1)], 0)
    assert any("as the job lists them" in a and "250 ft coil (12 AWG, 3 AWG)" in a
               for a in takeoff.assumptions)


def test_a_put_up_with_an_unknown_size_is_refused_with_its_field(tmp_path, capsys):
    bad = tmp_path / "bad.toml"
    bad.write_text(WALK.read_text(encoding="utf-8").replace("waste_pct = 10.0", (
        'waste_pct = 10.0\nputups = [{ label = "box", length_ft = 500, sizes = ["5 AWG"] }]')),
        encoding="utf-8")
    assert gaugewalk(cmd_takeoff, [str(bad)]) == 2
    err = capsys.readouterr().err
    assert "putups" in err and "5 AWG" in err and err.count("\n") == 1


def test_the_pull_point_spacing_is_a_job_setting(tmp_path, capsys):
    from gaugewalk.model.walkfile.read import loads_walk

    def conduit_bodies(setting: str) -> int:
        text = WALK.read_text(encoding="utf-8").replace("waste_pct = 10.0",
                                                        f"waste_pct = 10.0\n{setting}")
        job = loads_walk(text, "pulls.toml")
        t = build_takeoff(job, compute_job(job))
        return sum(f.count for f in t.fitting_lines if f.item == "conduit body")

    # F1 is 150 ft in two raceways, 3 bends (within NEC 352.26's 360 degrees)
    assert conduit_bodies("") == 2                       # default 100 ft: one each
    assert conduit_bodies("pull_every_ft = 60") == 4     # 150 / 60 -> 3 stretches, 2 each
    assert conduit_bodies("pull_every_ft = 0") == 0      # bends only
    bad = tmp_path / "bad.toml"
    bad.write_text(WALK.read_text(encoding="utf-8").replace(
        "waste_pct = 10.0", "waste_pct = 10.0\npull_every_ft = -5"), encoding="utf-8")
    assert gaugewalk(cmd_takeoff, [str(bad)]) == 2
    err = capsys.readouterr().err
    assert "pull_every_ft" in err and err.count("\n") == 1


def test_the_pull_list_names_every_run_or_says_how_many_are_left_out(computed):
    _, _, takeoff = computed
    full = cmd_takeoff.render_text(takeoff, "t")
    # 12 AWG black: B1 (60 + 4) x 1.10 -> 71 ft and B2 (40 + 4) x 1.10 -> 49 ft off box 1
    assert "    1: 500 ft box, 380 ft left: B1 71, B2 49" in full
    assert "F1 (set 1) 170, F1 (set 2) 170" in full             # parallel sets named
    short = cmd_takeoff.render_text(takeoff, "t", runs_per_piece=1, pieces_per_line=1)
    assert "    1: 500 ft box, 380 ft left: B1 71, and 1 more" in short
