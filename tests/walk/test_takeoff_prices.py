"""``takeoff --prices``: the user's own unit prices against the order, worked by hand, and every
way a price file can be wrong (one message naming the line, exit 2, nothing written)."""

from __future__ import annotations

import csv
import io
import json
from decimal import Decimal

import pytest

from gaugewalk.model.walk.takeoff.prices import PriceFileError, parse_prices
from gaugewalk.tui.cli import takeoff as cmd_takeoff
from tests.walk.test_takeoff_walk import WALK, gaugewalk

# Invented prices for the bakery walk (tests/golden/takeoff_walk.toml), one way of each kind:
# by item code, by description, per foot, per hundred and per thousand feet, a "$" and a comment.
PRICES = """\
# supplier quote, invented
item,unit_price,unit
CU.12AWG.THHN/THWN-2.BLACK.BOX500,89.50,box
"12 AWG copper THHN/THWN-2, white, 500 ft box",0.18,ft
CU.3/0AWG.THHN/THWN-2.BLACK.CUT,3250,M
EMT.1/2.10FT,65,C

emt.1/2.coupling,0.85
EMT.1/2.SUPPORT,$0.40,each
"""


def write(tmp_path, text: str | bytes, name: str = "prices.csv"):
    path = tmp_path / name
    (path.write_bytes if isinstance(text, bytes) else path.write_text)(text)
    return str(path)


def test_prices_worked_by_hand_in_json(tmp_path, capsys):
    assert gaugewalk(cmd_takeoff, [str(WALK), "--json", "--prices", write(tmp_path, PRICES)]) == 0
    data = json.loads(capsys.readouterr().out)
    cost = {o["item"]: (o["unit_price"], o["cost"]) for o in data["order"]}
    assert cost["CU.12AWG.THHN/THWN-2.BLACK.BOX500"] == (89.50, 89.50)      # 1 box x 89.50
    assert cost["CU.12AWG.THHN/THWN-2.WHITE.BOX500"] == (90.00, 90.00)      # 0.18 x 500 ft
    assert cost["CU.3/0AWG.THHN/THWN-2.BLACK.CUT"] == (3.25, 1105.00)       # 3,250 / 1,000 x 340
    assert cost["EMT.1/2.10FT"] == (0.65, 65.00)                             # 65 / 100 x 100 ft
    assert cost["EMT.1/2.COUPLING"] == (0.85, 6.80)                          # 8 x 0.85
    assert cost["EMT.1/2.SUPPORT"] == (0.40, 4.80)                           # 12 x 0.40
    assert cost["CU.3/0AWG.THHN/THWN-2.RED.CUT"] == (None, None)
    # 89.50 + 90.00 + 1,105.00 + 65.00 + 6.80 + 4.80 = 1,361.10
    assert data["total_cost"] == 1361.10
    assert len(data["unpriced"]) == len(data["order"]) - 6
    assert {"item": "CU.3/0AWG.THHN/THWN-2.RED.CUT",
            "description": "3/0 AWG copper THHN/THWN-2, red, cut to length"} in data["unpriced"]


def test_prices_in_csv_add_two_columns_and_no_total_row(tmp_path, capsys):
    assert gaugewalk(cmd_takeoff, [str(WALK), "--csv", "--prices", write(tmp_path, PRICES)]) == 0
    rows = list(csv.DictReader(io.StringIO(capsys.readouterr().out)))
    assert list(rows[0]) == ["item", "description", "quantity", "unit", "unit_price", "cost"]
    by_item = {r["item"]: r for r in rows}
    assert (by_item["CU.12AWG.THHN/THWN-2.WHITE.BOX500"]["unit_price"],
            by_item["CU.12AWG.THHN/THWN-2.WHITE.BOX500"]["cost"]) == ("90.00", "90.00")
    assert by_item["PVC-40.2.SUPPORT"]["cost"] == ""
    assert not any("total" in (r["item"] + r["description"]).lower() for r in rows)


def test_prices_in_text_show_the_total_and_what_has_no_price(tmp_path, capsys):
    assert gaugewalk(cmd_takeoff, [str(WALK), "--prices", write(tmp_path, PRICES)]) == 0
    out = capsys.readouterr().out
    assert "Total of the priced lines: 1,361.10" in out
    # B2's red hot (on line B) is one more item than the price file names
    assert "No price for 14 item(s)" in out and "PVC-40.2.SUPPORT" in out


def test_a_price_with_many_places_is_kept_exact():
    book = parse_prices("EMT.1/2.10FT,0.4537,ft\n")
    [price] = book.prices.values()
    assert price.unit_price == Decimal("0.4537")


@pytest.mark.parametrize(("text", "message"), [
    ("CU.X,abc\n", "line 1: unit_price 'abc' is not a number"),
    ("CU.X,nan\n", "line 1: unit_price 'nan' is not a number"),
    ("CU.X,$\n", "line 1: unit_price '$' is not a number"),
    ("a,1\nCU.X,-3\n", "line 2: unit_price -3 is negative"),
    ("CU.X,1,ft,extra\n", "line 1: 4 cell(s)"),
    ("just an item\n", "line 1: 1 cell(s)"),
    ("a,1\n,5\n", "line 2: no item or description"),
    ("a,1,pallet\n", "line 1: unit 'pallet' is not one of ft, C"),
    ("a,1\n\nA ,2\n", "line 3: 'A' is priced again (first on line 1)"),
    ('a,"1"x\n', "line 1: ',' expected after '\"'"),
    ("unit_price,unit\n3,ft\n", "line 1: the header names no item or description column"),
    ("item,price,unit_price\nx,1,2\n", "line 1: the header names the price column twice"),
    ("# only a comment\n\n", "no prices in it"),
    ("a,1\x1b[2J\n", "line 1: unit_price '1\\x1b[2J' is not a number"),
])
def test_a_malformed_price_file_names_its_line(tmp_path, capsys, text, message):
    path = write(tmp_path, text)
    assert gaugewalk(cmd_takeoff, [str(WALK), "--csv", "--prices", path]) == 2
    captured = capsys.readouterr()
    assert captured.out == ""                                  # nothing written
    assert captured.err.count("\n") == 1 and path in captured.err
    assert message in captured.err
    assert "\x1b" not in captured.err                           # no terminal control echoed


def test_each_prices_a_box_and_a_box_price_cannot_price_feet():
    from gaugewalk.model.walk.takeoff.lines import OrderLine
    from gaugewalk.model.walk.takeoff.prices import price_order

    box = OrderLine("B", "a box", 2, "box", "wire", 500)
    cut = OrderLine("C", "a cut", 40, "ft", "wire", 1)
    priced = price_order([box], parse_prices("B,80,each\n"))
    assert priced.total_cost == Decimal("160.00")                  # 2 boxes x 80
    with pytest.raises(PriceFileError,
                       match="line 1: priced per box, but C is ordered by the foot"):
        price_order([cut], parse_prices("C,80,box\n"))


def test_a_unit_that_does_not_fit_the_item_names_the_line(tmp_path, capsys):
    # couplings are ordered each; a price per foot cannot be put against them
    path = write(tmp_path, "a,1\nEMT.1/2.COUPLING,0.85,ft\n")
    assert gaugewalk(cmd_takeoff, [str(WALK), "--json", "--prices", path]) == 2
    captured = capsys.readouterr()
    assert captured.out == ""
    assert "line 2: priced per ft, but EMT.1/2.COUPLING is ordered each" in captured.err


@pytest.mark.parametrize(("content", "message"), [
    (b"a,1\n\xff\xfe,2\n", "line 2: not UTF-8 text"),
    (None, "no such price file"),
])
def test_an_unreadable_price_file_exits_2(tmp_path, capsys, content, message):
    path = write(tmp_path, content) if content is not None else str(tmp_path / "missing.csv")
    assert gaugewalk(cmd_takeoff, [str(WALK), "--prices", path]) == 2
    captured = capsys.readouterr()
    assert captured.out == "" and message in captured.err and captured.err.count("\n") == 1


def test_errors_are_a_price_file_error_with_file_and_line():
    with pytest.raises(PriceFileError, match=r"^q\.csv: line 2: "):
        parse_prices("a,1\nb,x\n", "q.csv")
