"""The order a supplier takes: item codes, the CSV and its guard against formula injection,
the JSON keys scripts rely on, and an invented 30-run job that once bought a 1,000 ft reel for
each 21 ft feeder conductor."""

from __future__ import annotations

import csv
import dataclasses
import io
import json

from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walk.takeoff import (
    OrderLine,
    RunMaterial,
    TakeoffSettings,
    build_takeoff,
    spreadsheet_safe,
    takeoff_from_runs,
)
from gaugewalk.model.walk.takeoff.lines import PutUpCount, WireLine
from gaugewalk.model.walk.takeoff.order import order_lines, putup_unit, size_code
from gaugewalk.model.walkfile.read import loads_walk
from gaugewalk.tables.order.putups import CUT_SIZES
from gaugewalk.tui.cli import takeoff as cmd_takeoff
from tests.walk.test_takeoff_walk import WALK, gaugewalk

SETTINGS = TakeoffSettings(slack_per_end_ft=2.0, waste_pct=10.0)


# --- item codes and descriptions -------------------------------------------------------------

def test_item_codes_are_readable_and_the_same_for_the_same_item():
    assert size_code("12 AWG") == "12AWG" and size_code("1/0 AWG") == "1/0AWG"
    assert size_code("250 kcmil") == "250KCMIL"
    assert [putup_unit(x) for x in ("500 ft box", "1,000 ft reel", "250 ft Coil", "cut reel",
                                    "drum of 900 ft")] == ["box", "reel", "coil", "reel", "each"]
    run = RunMaterial("R", 40.0, 1, "al", "XHHW-2", "250 kcmil", ("black",),
                      egc_size="4 AWG", egc_colour="bare", raceway="EMT", raceway_size="2")
    first = takeoff_from_runs([run], SETTINGS).order_lines
    again = takeoff_from_runs([dataclasses.replace(run, run_id="Q")], SETTINGS).order_lines
    assert first == again
    codes = {line.item: line for line in first}
    # (40 + 4) x 1.10 = 48.4 -> 49 ft, cut to length (250 kcmil is cut by the supplier)
    assert codes["AL.250KCMIL.XHHW-2.BLACK.CUT"].description == \
        "250 kcmil aluminum XHHW-2, black, cut to length"
    assert (codes["AL.250KCMIL.XHHW-2.BLACK.CUT"].quantity,
            codes["AL.250KCMIL.XHHW-2.BLACK.CUT"].unit) == (49, "ft")
    # a bare EGC (NEC 250.119) says so; 4 AWG is cut by the supplier too (common practice)
    assert codes["AL.4AWG.BARE.BARE.CUT"].description == "4 AWG bare aluminum, cut to length"
    assert "EMT.2.10FT" in codes and "EMT.2.COUPLING" in codes


def test_the_same_item_from_two_lines_is_ordered_once():
    # two lines that come to one item (say a job that runs black for two functions): the
    # boxes add up on one order line
    def line(function: str) -> WireLine:
        return WireLine("cu", "THHN/THWN-2", "12 AWG", function, "black", 100.0, 5.0, 110,
                        (PutUpCount("500 ft box", 500, 1, 390),), 500, 390, ("R",))

    merged = order_lines((line("phase"), line("neutral")), (), ())
    assert [(o.item, o.quantity, o.unit) for o in merged] == [
        ("CU.12AWG.THHN/THWN-2.BLACK.BOX500", 2, "box")]


# --- CSV and formula injection ---------------------------------------------------------------

def test_spreadsheet_formula_starts_are_neutralised():
    # the characters spreadsheets read as a formula start (OWASP CSV injection guidance)
    for text in ("=SUM(A1:A9)", "+1+1", "-2+3", "@cmd", "\t=1", "\r=1"):
        assert spreadsheet_safe(text) == "'" + text
    assert spreadsheet_safe("12 AWG copper") == "12 AWG copper"
    assert spreadsheet_safe(-5) == -5          # numbers are numbers


def test_no_csv_cell_can_start_a_formula(capsys, tmp_path):
    # a hostile put-up label from the walk file reaches the description
    hostile = tmp_path / "hostile.toml"
    hostile.write_text(WALK.read_text(encoding="utf-8").replace("waste_pct = 10.0", (
        "waste_pct = 10.0\n"
        'putups = [{ label = "=HYPERLINK(\\"http://x\\") box", length_ft = 500, sizes = ["12"] },'
        ' { label = "@cmd reel", length_ft = 1000, sizes = ["3/0"] }]')), encoding="utf-8")
    assert gaugewalk(cmd_takeoff, [str(hostile), "--csv"]) == 0
    rows = list(csv.reader(io.StringIO(capsys.readouterr().out)))
    assert any("=HYPERLINK" in cell for row in rows for cell in row)
    assert not any(cell.startswith(("=", "+", "-", "@", "\t", "\r"))
                   for row in rows for cell in row)

    # and any cell the order could hold, through the CSV writer
    job = loads_walk(WALK.read_text(encoding="utf-8"), "walk.toml")
    takeoff = build_takeoff(job, compute_job(job))
    odd = dataclasses.replace(takeoff, order_lines=(
        OrderLine("=1+1", "@SUM(A1)", 3, "-each", "fitting", None),))
    out = io.StringIO()
    cmd_takeoff.write_csv(odd, out)
    assert list(csv.reader(io.StringIO(out.getvalue())))[1] == ["'=1+1", "'@SUM(A1)", "3", "'-each"]


# --- JSON --------------------------------------------------------------------------------------

def test_json_keeps_the_wire_keys_and_adds_cuts_pieces_bounds_and_the_order(capsys):
    assert gaugewalk(cmd_takeoff, [str(WALK), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    old_keys = {"material", "insulation", "size", "function", "colour", "net_ft", "waste_pct",
                "with_waste_ft", "order", "order_ft", "left_over_ft", "runs"}
    for w in data["wire"]:
        assert old_keys <= set(w)
        assert {"lower_bound_count", "cuts", "pieces"} <= set(w)
        assert all({"put_up", "length_ft", "count", "offcut_ft"} <= set(o) for o in w["order"])
        assert sum(o["offcut_ft"] for o in w["order"]) == w["left_over_ft"]
        # every cut names its run and the piece it comes off
        pieces = {p["piece"] for p in w["pieces"]}
        assert all(c["piece"] in pieces and c["run"] in w["runs"] for c in w["cuts"])
        assert sum(c["ft"] for c in w["cuts"]) == w["with_waste_ft"]
    # the neutral: B1 (60 + 4) x 1.10 -> 71, B2 (40 + 4) x 1.10 -> 49, both off box 1 (their hots
    # are on lines A and B, black and red, a line each)
    [white] = [w for w in data["wire"] if w["size"] == "12 AWG" and w["colour"] == "white"]
    assert white["cuts"] == [{"run": "B1", "set": 1, "ft": 71, "piece": 1},
                             {"run": "B2", "set": 1, "ft": 49, "piece": 1}]
    assert white["pieces"] == [{"piece": 1, "put_up": "500 ft box", "length_ft": 500,
                                "used_ft": 120, "offcut_ft": 380, "cut_to_length": False}]
    assert white["lower_bound_count"] == 1
    assert any(f["item"] == "conduit body" for f in data["fittings"])
    assert {"item", "description", "quantity", "unit"} <= set(data["order"][0])
    assert "total_cost" not in data and "unpriced" not in data


# --- the 30-run job ----------------------------------------------------------------------------

def thirty_run_walk_text() -> str:
    """An invented 30-run job: a two-storey dental clinic on a 208Y/120 V service, 26 branch
    circuits home-run in 1/2 EMT and four feeders; feeder F1 is 2 AWG and only 17 ft long."""
    text = ['schema = 1\n\n[job]\nname = "Birchgate dental clinic (invented)"\n']
    for sid, kind, amps in (("MDP", "service", 400), ("LP1", "panel", 125), ("LP2", "panel", 100),
                            ("LP2A", "panel", 60), ("MP1", "panel", 100)):
        text.append(f'[[source]]\nid = "{sid}"\nkind = "{kind}"\nsystem = "208Y/120V 3ph 4w"\n'
                    f"rating_a = {amps}\n")
    feeders = (("F1", "MDP", "LP1", 17, 'size = "2 AWG"', 1), ("F2", "MDP", "LP2", 64, "", 3),
               ("F3", "LP2", "LP2A", 38, "", 2),
               ("F4", "MDP", "MP1", 52, 'load = { value = 80, unit = "A" }', 2))
    for rid, frm, to, feet, extra, bends in feeders:
        text.append(f'[[run]]\nid = "{rid}"\nfrom = "{frm}"\nto = "{to}"\nlength = "{feet}"\n'
                    f"{extra}\nbends = {bends}\n")
    panels = ("LP1", "LP1", "LP1", "LP2", "LP2", "LP2A")
    for i in range(26):
        panel = panels[i % len(panels)]
        two_pole = i % 9 == 4
        load = '{ value = 2400, unit = "VA" }' if two_pole else '{ value = 12, unit = "A" }'
        text.append(f'[[run]]\nid = "{panel}-{i + 1}"\nfrom = "{panel}"\nto = "Room {100 + i}"\n'
                    f'length = "{30 + (i * 37) % 101}"\nload = {load}\n'
                    f'connection = "{"LL" if two_pole else "LN"}"\nbends = {i % 5}\n')
    return "\n".join(text)


def test_a_short_feeder_no_longer_buys_a_reel_per_conductor():
    job = loads_walk(thirty_run_walk_text(), "clinic.toml")
    assert len(job.runs) == 30
    takeoff = build_takeoff(job, compute_job(job))
    assert takeoff.warnings == ()
    two = [w for w in takeoff.wire_lines if w.size == "2 AWG"]
    # F1: (17 + 2 + 2) x 1.05 = 22.05 -> 23 ft per conductor, black, red and blue; 2 AWG is
    # cut to length (common practice): 23 ft each, nothing over (it was a 1,000 ft reel each,
    # 977 ft over, three times)
    assert "2 AWG" in CUT_SIZES
    assert [(w.colour, [(p.label, p.length_ft, p.count) for p in w.order], w.left_over_ft)
            for w in two] == [(c, [("cut to length", 23, 1)], 0)
                              for c in ("black", "red", "blue")]
    # its neutral load is the largest line-to-neutral load on one of LP1's lines (NEC 2023
    # 220.61(A)): five 12 A, 120 V circuits on one line, 60 A (not the 12 A phasor unbalance);
    # Table 310.16 60 C column (110.14(C)(1), a 60 A circuit): 6 AWG Cu 55 A is short, 4 AWG Cu
    # 70 A carries it, above the 8 AWG floor of its EGC (215.2(A)(2)); the takeoff orders it so
    assert any(w.size == "4 AWG" and w.colour == "white" and any(c.run_id == "F1" for c in w.cuts)
               for w in takeoff.wire_lines)
    # no line of a size the supplier cuts buys a put-up it fills less than half
    for w in takeoff.wire_lines:
        if w.size in CUT_SIZES:
            assert all(p.used_ft * 2 > p.length_ft for p in w.pieces), w
    # the whole order: at most the offcut this packing reached when written (3,543 ft), against
    # 15,883 ft when every line was ordered as its total
    assert sum(w.left_over_ft for w in takeoff.wire_lines) <= 3543
