"""``gaugewalk report``: the printable HTML and Markdown reports of a walk."""

from __future__ import annotations

import math
import os
from html.parser import HTMLParser
from pathlib import Path

import pytest

from gaugewalk.tui.cli import report as cmd_report
from gaugewalk.tui.cli.main import CAUTION
from tests.support.golden import TAKEOFF_WALK as WALK
from tests.support.golden import check_golden, gaugewalk
from tests.support.walks import run_table, source_table, walk_text, write_walk


class _Page(HTMLParser):
    """Collects the text, the table cells by table label, the tags and the attributes."""

    def __init__(self) -> None:
        super().__init__(convert_charrefs=True)
        self.text: list[str] = []
        self.tags: list[str] = []
        self.attrs: list[tuple[str, str | None]] = []
        self.tables: dict[str, list[list[str]]] = {}
        self._table: str | None = None
        self._row: list[str] | None = None
        self._cell: list[str] | None = None
        self.styles: list[str] = []
        self._in_style = False

    def handle_starttag(self, tag, attrs):
        self.tags.append(tag)
        self.attrs += attrs
        if tag == "table":
            self._table = dict(attrs).get("aria-label", "")
            self.tables[self._table] = []
        elif tag == "tr" and self._table is not None:
            self._row = []
        elif tag in ("td", "th") and self._row is not None:
            self._cell = []
        elif tag == "style":
            self._in_style = True

    def handle_endtag(self, tag):
        if tag in ("td", "th") and self._cell is not None:
            self._row.append("".join(self._cell))
            self._cell = None
        elif tag == "tr" and self._row is not None:
            self.tables[self._table].append(self._row)
            self._row = None
        elif tag == "table":
            self._table = None
        elif tag == "style":
            self._in_style = False

    def handle_data(self, data):
        if self._in_style:
            self.styles.append(data)
            return
        self.text.append(data)
        if self._cell is not None:
            self._cell.append(data)


def _write(tmp_path: Path, name: str, argv_extra=()) -> tuple[int, Path]:
    out = tmp_path / name
    return gaugewalk(cmd_report, [str(WALK), "-o", str(out), *argv_extra]), out


@pytest.fixture(scope="module")
def page(tmp_path_factory):
    rc, out = _write(tmp_path_factory.mktemp("html"), "walk.html")
    assert rc == 0
    html = out.read_text(encoding="utf-8")
    parsed = _Page()
    parsed.feed(html)
    parsed.close()
    return html, parsed


def _rows(parsed: _Page, label: str) -> dict[str, dict[str, str]]:
    """Rows by their first cell; a row of one cell under a row (its problems) is that row's
    "Problems" ("" when it has none)."""
    header, *body = parsed.tables[label]
    out: dict[str, dict[str, str]] = {}
    last = None
    for row in body:
        if len(row) == 1 and last is not None:
            last["Problems"] = row[0].removeprefix("Problems: ")
            continue
        last = dict(zip(header, row, strict=True), Problems="")
        out[row[0]] = last
    return out


def test_html_report_shows_the_caution_at_top_and_bottom(page):
    _, parsed = page
    text = " ".join(" ".join(parsed.text).split())
    assert text.count(CAUTION) == 2


def test_html_runs_table_matches_hand_drop_arithmetic(page):
    _, parsed = page
    runs = _rows(parsed, "Runs")
    # NEC Ch. 9 Table 9 (from memory), 0.85 PF: Z = R cos + X sin.
    # 12 AWG Cu in steel: R 2.0, XL 0.068 ohm/kft -> Z = 2.0 x 0.85 + 0.068 x 0.5268 = 1.7358
    z12 = 2.0 * 0.85 + 0.068 * math.sqrt(1 - 0.85**2)
    # B2: 1200 VA / 120 V = 10 A; VD = 2 x 10 x 1.7358 x 40 / 1000 = 1.389 V = 1.16 % of 120 V
    assert runs["B2"]["Drop [%]"] == f"{2 * 10 * z12 * 40 / 1000 / 120 * 100:.2f}" == "1.16"
    # B1: VD = 2 x 16 x 1.7358 x 60 / 1000 = 3.333 V = 2.78 %
    assert runs["B1"]["Drop [%]"] == f"{2 * 16 * z12 * 60 / 1000 / 120 * 100:.2f}" == "2.78"
    # F1: 3/0 Cu in PVC: R 0.077, XL 0.042 ohm/kft -> Z = 0.0876 (the table's Ze column prints
    # 0.088); 300 A, 150 ft, 2 sets, 3-phase at 208 V:
    # VD = sqrt(3) x 300 x 0.0876 x 150 / 1000 / 2 = 3.41 V = 1.64 %
    z30 = 0.077 * 0.85 + 0.042 * math.sqrt(1 - 0.85**2)
    f1_pct = math.sqrt(3) * 300 * z30 * 150 / 1000 / 2 / 208 * 100
    assert runs["F1"]["Drop [%]"] == f"{f1_pct:.2f}" == "1.64"
    # B1 total from the service: 1.64 + 2.78 = 4.42 % (drops add along the chain)
    assert runs["B1"]["Total drop [%]"] == "4.42"
    assert runs["F1"]["Length [ft]"] == "150.0"           # "120+30"
    assert runs["F1"]["Size"] == "2 x 3/0 AWG Cu"
    assert runs["F1"]["EGC"] == "3 AWG"                    # NEC Table 250.122, 400 A
    assert runs["F1"]["Raceway"] == "PVC-40 2 (2 raceways)"
    assert runs["B2"]["Load"] == "1200 VA"


def test_html_material_list_has_the_hand_worked_quantities(page):
    _, parsed = page
    wire = parsed.tables["Conductors"]
    header = wire[0]
    rows = [dict(zip(header, r, strict=True)) for r in wire[1:]]
    blue = [r for r in rows if r["Size"] == "3/0 AWG" and r["Colour"] == "blue"]
    # (150 + 4) x 2 = 308; a cut per set of 154 x 1.10 = 169.4 -> 170 ft, 340 ft in all, less
    # than a 1,000 ft reel: cut to length (common practice for 3/0 AWG), nothing left over
    assert [(r["Net [ft]"], r["Cuts [ft]"], r["Order"], r["Offcut [ft]"], r["Pieces (fewest)"])
            for r in blue] == [("308.0", "340", "340 ft cut to length", "0", "1 (1)")]
    fittings = {(r[0], r[1]): r[3] for r in parsed.tables["Fittings"][1:]}
    assert fittings["support", "PVC-40"] == "60"     # NEC Table 352.30
    # offcut: white and green 2 boxes x (500 - 120) = 760 ft, B1's black hot (500 - 71) 429 ft,
    # B2's red hot on line B (500 - 49) 451 ft: 1,640 ft; the cut lengths leave none
    assert dict(parsed.tables["Summary"][1:])["Offcut left on boxes and reels [ft]"] == "1640"
    footage = {r[1]: r[3] for r in parsed.tables["Conductor footage by size"][1:]}
    assert footage == {"12 AWG": "360", "3 AWG": "340", "3/0 AWG": "1360"}


def test_html_has_a_bar_per_size_and_print_styles_and_fetches_nothing(page):
    html, parsed = page
    chart = html[html.index("<h2>Conductor footage by size</h2>"):]
    chart = chart[:chart.index("</svg>")]
    assert parsed.tags.count("svg") == 2 and chart.count("<rect") == 3
    assert "@media print" in "".join(parsed.styles)
    for tag in ("script", "link", "img", "iframe"):
        assert tag not in parsed.tags
    assert not any(name in ("src", "href") for name, _ in parsed.attrs)
    assert "http" not in html and "url(" not in html and "@import" not in html


def test_the_one_line_diagram_names_every_source_feeder_and_bus_drop(page):
    html, _ = page
    svg = html[html.index("<svg class=\"oneline\""):]
    svg = svg[:svg.index("</svg>")]
    assert "MSB service" in svg and "LP1 panel" in svg
    # the feeder with its conductors, length and device; the drop at LP1's bus is F1's 1.64 %
    # (worked by hand in test_html_runs_table_matches_hand_drop_arithmetic) and B1 is the worst
    # branch at 4.42 %
    assert "via F1: 2 x 3/0 AWG Cu, 150 ft, 400 A" in svg
    assert "drop at bus 1.64%; worst branch B1: 4.42%" in svg


def test_the_runs_table_gives_each_runs_circuit_and_breaker(page):
    _, parsed = page
    runs = _rows(parsed, "Runs")
    assert (runs["F1"]["Circuit"], runs["F1"]["Breaker [A]"]) == ("208 V 3P+N", "400")
    assert (runs["B1"]["Circuit"], runs["B1"]["Breaker [A]"]) == ("120 V 1P+N", "20")


def test_a_walk_with_a_shared_raceway_lists_it_with_its_fill_and_adjustment(tmp_path):
    walk = tmp_path / "shared.toml"
    text = WALK.read_text(encoding="utf-8").replace(
        'connection = "LN"', 'connection = "LN"\nraceway_id = "HR1"')
    walk.write_text(text + '\n[[raceway]]\nid = "HR1"\nlength = "30"\n', encoding="utf-8")
    out = tmp_path / "r.html"
    assert gaugewalk(cmd_report, [str(walk), "-o", str(out)]) == 0
    parsed = _Page()
    parsed.feed(out.read_text(encoding="utf-8"))
    shared = _rows(parsed, "Shared raceways")["HR1 (EMT)"]
    # B1 and B2, 120 V line-to-neutral: hot and neutral count (NEC 310.15(E)): 4 CCC, 80 %
    # (Table 310.15(C)(1)); 6 conductors of 12 AWG THHN, 6 x 0.0133 = 0.0798 in2 (Ch. 9 Table 5)
    # in 1/2 EMT, 0.304 in2 (Table 4): 26 % of the 40 % allowed (Table 1)
    assert shared["Runs"] == "B1, B2" and shared["Current-carrying"] == "4"
    assert shared["Adjustment"] == "0.8" and shared["Trade size"] == "1/2"
    assert shared["Fill [%]"] == "26 of 40"


def test_html_lists_defaults_and_assumptions(page):
    _, parsed = page
    defaults = dict(parsed.tables["Defaults used"][1:])
    assert defaults["Waste allowance [%]"] == "10"
    assert defaults["Slack per end [ft]"] == "2"
    text = " ".join(parsed.text)
    assert "2 at each end of each raceway" in text and "NEC 358.30(A)" in text


def test_user_text_is_escaped(tmp_path):
    walk = tmp_path / "odd.toml"
    walk.write_text(WALK.read_text(encoding="utf-8").replace(
        'to = "Oven hood fan"', 'to = "<script>alert(1)</script> & <b>fan</b>"'), encoding="utf-8")
    html_out, md_out = tmp_path / "odd.html", tmp_path / "odd.md"
    assert gaugewalk(cmd_report, [str(walk), "-o", str(html_out)]) == 0
    assert gaugewalk(cmd_report, [str(walk), "-o", str(md_out)]) == 0
    html = html_out.read_text(encoding="utf-8")
    assert "<script>" not in html and "<b>fan" not in html
    assert "&lt;script&gt;alert(1)&lt;/script&gt; &amp; &lt;b&gt;fan&lt;/b&gt;" in html
    parsed = _Page()
    parsed.feed(html)
    assert "script" not in parsed.tags
    assert _rows(parsed, "Runs")["B1"]["To"] == "<script>alert(1)</script> & <b>fan</b>"
    md = md_out.read_text(encoding="utf-8")
    assert "<script>" not in md and "&lt;script&gt;" in md


def test_a_run_with_problems_is_marked_and_says_why(tmp_path):
    walk = tmp_path / "long.toml"
    # B1 at 400 ft on a fixed 12 AWG: about 18.5 % drop, far over the 3 % target
    walk.write_text(WALK.read_text(encoding="utf-8").replace('length = "60"', 'length = "400"'),
                    encoding="utf-8")
    assert gaugewalk(cmd_report, [str(walk), "-o", str(tmp_path / "r.html")]) == 0
    parsed = _Page()
    parsed.feed((tmp_path / "r.html").read_text(encoding="utf-8"))
    b1 = _rows(parsed, "Runs")["B1"]
    assert b1["Problems"] != ""
    summary = dict(parsed.tables["Summary"][1:])
    assert summary["Runs with problems"] == "1"


def test_markdown_report_has_the_same_sections(tmp_path):
    rc, out = _write(tmp_path, "walk.md")
    assert rc == 0
    md = out.read_text(encoding="utf-8")
    assert md.count(CAUTION) == 2
    for heading in ("## Defaults used", "## One-line diagram", "## Runs", "## Sources",
                    "## Panel schedules", "## Conductor footage by size", "## Material list",
                    "## Takeoff assumptions"):
        assert heading in md
    assert ("| F1 | MSB | LP1 | 208 V 3P+N | 400 | 300 A | 150.0 | 2 x 3/0 AWG Cu | 3 AWG | "
            "PVC-40 2 (2 raceways) | 1.64 | 1.64 |") in md
    check_golden("report_walk.md", md)


def test_html_report_golden(page):
    check_golden("report_walk.html", page[0])


def test_the_walk_file_is_never_overwritten(tmp_path, capsys):
    walk = tmp_path / "walk.md"          # a walk whose name has a report extension
    walk.write_bytes(WALK.read_bytes())
    before = walk.read_bytes()
    for extra in ([], ["--replace"]):
        assert gaugewalk(cmd_report, [str(walk), "-o", str(walk), *extra]) == 2
        assert "walk file" in capsys.readouterr().err
    assert walk.read_bytes() == before


def test_an_existing_report_is_kept_unless_replace(tmp_path, capsys):
    out = tmp_path / "r.html"
    out.write_text("keep me", encoding="utf-8")
    assert gaugewalk(cmd_report, [str(WALK), "-o", str(out)]) == 2
    assert "--replace" in capsys.readouterr().err
    assert out.read_text(encoding="utf-8") == "keep me"
    assert gaugewalk(cmd_report, [str(WALK), "-o", str(out), "--replace"]) == 0
    assert out.read_text(encoding="utf-8").startswith("<!DOCTYPE html>")


@pytest.mark.parametrize(("name", "message"), [("r.pdf", "use .html or .md"),
                                               ("missing/r.html", "does not exist")])
def test_bad_output_names_exit_2_with_one_line(tmp_path, capsys, name, message):
    assert gaugewalk(cmd_report, [str(WALK), "-o", str(tmp_path / name)]) == 2
    err = capsys.readouterr().err
    assert message in err and err.count("\n") == 1
    assert list(tmp_path.iterdir()) == []  # nothing written


def test_a_bad_walk_writes_no_report(tmp_path, capsys):
    bad = tmp_path / "bad.toml"
    bad.write_text("schema = 1\n[[run]]\nid = \n", encoding="utf-8")
    assert gaugewalk(cmd_report, [str(bad), "-o", str(tmp_path / "r.html")]) == 2
    assert "bad.toml" in capsys.readouterr().err
    assert not (tmp_path / "r.html").exists()


def test_a_run_that_cannot_be_sized_is_listed_and_left_out_of_the_takeoff(tmp_path):
    walk = tmp_path / "unsized.toml"
    # 14 AWG is not an aluminum power conductor size (NEC Table 310.16 lists Al from 12 AWG)
    head, tail = WALK.read_text(encoding="utf-8").rsplit('size = "12 AWG"', 1)  # B2 is last
    walk.write_text(head + 'material = "al"\nsize = "14 AWG"' + tail, encoding="utf-8")
    out = tmp_path / "r.html"
    assert gaugewalk(cmd_report, [str(walk), "-o", str(out)]) == 0
    parsed = _Page()
    parsed.feed(out.read_text(encoding="utf-8"))
    b2 = _rows(parsed, "Runs")["B2"]
    assert b2["Governed by"] == "not sized" and "14 AWG" in b2["Problems"]
    text = " ".join(parsed.text)
    assert "run B2: not sized, so left out of the takeoff" in text
    # only B1 is left on 12 AWG: 60 + 4 = 64 ft per conductor
    footage = {r[1]: r[2] for r in parsed.tables["Conductor footage by size"][1:]}
    assert footage["12 AWG"] == f"{3 * 64:.1f}"


def test_a_new_report_gets_ordinary_file_permissions(tmp_path):
    rc, out = _write(tmp_path, "perm.html")
    assert rc == 0
    umask = os.umask(0)
    os.umask(umask)
    assert out.stat().st_mode & 0o777 == 0o666 & ~umask


def test_the_report_names_each_demand_factor_under_the_panel_its_feeder_feeds(tmp_path):
    receptacles = [run_table(f"R{i}", "LP1", f"Receptacles {i}", "40", connection="LN",
                             load={"value": 1440, "unit": "VA", "kind": "receptacle"})
                   for i in range(30)]
    walk = write_walk(tmp_path, walk_text(
        "demand", defaults={"demand": "nec-220"},
        sources=[source_table("SVC", "service"), source_table("LP1", "panel")],
        runs=[run_table("F1", "SVC", "LP1", "20"), *receptacles]))
    out = tmp_path / "walk.md"
    assert gaugewalk(cmd_report, [str(walk), "-o", str(out)]) == 0
    md = out.read_text(encoding="utf-8")
    assert "| Feeder load | with demand factors: receptacles per NEC 220.44" in md
    # NEC 2023 Table 220.44: 43.2 kVA -> 10 + 0.5 x 33.2 = 26.6 kVA
    assert ("- feeder F1: NEC 220.44 (Table 220.44): receptacle loads 43.2 kVA, the first 10 kVA "
            "at 100 % and the remaining 33.2 kVA at 50 %: 26.6 kVA counted") in md


def test_the_report_lists_stated_feeder_loads_and_values_to_check(tmp_path):
    farm = Path(__file__).resolve().parents[2] / "sample_walks" / "farm_workshop.toml"
    walk = tmp_path / "farm.toml"
    # the invented sample, with one run's length slipped to 9,999 ft (over the 3,000 ft a
    # building's run usually is: a warning, never a problem)
    text = farm.read_text(encoding="utf-8")
    assert 'length = "290+25"' in text
    walk.write_text(text.replace('length = "290+25"', 'length = "9999"', 1), encoding="utf-8")
    for name in ("r.html", "r.md"):
        assert gaugewalk(cmd_report, [str(walk), "-o", str(tmp_path / name)]) == 0
    md = (tmp_path / "r.md").read_text(encoding="utf-8")
    assert "## Warnings and stated assumptions" in md
    # F-SHOP is given 120 A as a demand load; the loads recorded on SHOP need more on line A
    # at connected load (NEC 215.2(A)(1)): said in the report as `check` says it
    stated = md.split("### Feeders sized for a stated load below what their panel's loads "
                      "need", 1)[1]
    assert stated.lstrip().startswith("- run F-SHOP: its own load (120.0 A design)")
    assert "9,999 ft is longer than a run in a building usually is" in md.split(
        "### Values to check", 1)[1]
    parsed = _Page()
    parsed.feed((tmp_path / "r.html").read_text(encoding="utf-8"))
    text_of_page = "".join(parsed.text)
    assert "Warnings and stated assumptions" in text_of_page
    assert "run F-SHOP: its own load (120.0 A design)" in text_of_page


def test_a_walk_with_nothing_to_say_has_no_warnings_section(page):
    html, _ = page
    assert "Warnings and stated assumptions" not in html


def test_a_raceway_cell_keeps_its_trade_size_whole_and_lets_the_words_after_it_wrap():
    # kept whole, a rooftop run's words squeezed the run table's other columns to a letter a
    # line on a portrait page (seen printing a walk of our own)
    from gaugewalk.tui.report.html import _cell

    assert _cell("Raceway", "EMT 1-1/4") == '<td class="nw">EMT 1-1/4</td>'
    assert _cell("Raceway", "EMT 3/4, rooftop: +33 C ambient (NEC 310.15(B)(2))") == (
        '<td><span class="nw">EMT 3/4</span>, rooftop: +33 C ambient (NEC 310.15(B)(2))</td>')


def test_what_runs_names_made_taken_is_listed_with_the_warnings(tmp_path):
    # the retail sample's blade sign (NEC 600.5(A), 220.14(F), from memory) and rooftop units
    # (310.15(B)(2)): each assumption its name made is listed once, under its own heading, as
    # well as among the run's rules
    retail = Path(__file__).resolve().parents[2] / "sample_walks" / "retail_fitout.toml"
    for name in ("r.html", "r.md"):
        assert gaugewalk(cmd_report, [str(retail), "-o", str(tmp_path / name)]) == 0
    md = (tmp_path / "r.md").read_text(encoding="utf-8")
    named = md.split("### Taken from a run's name", 1)[1].split("\n## ", 1)[0]
    items = [line for line in named.splitlines() if line.startswith("- run ")]
    assert any(i.startswith("- run LP1-M06: 'Blade sign over entrance' reads as a sign") and
               "NEC 600.5(A)" in i for i in items)
    assert any(i.startswith("- run LP1-M01: 'RTU-1 rooftop unit' reads as equipment on a roof")
               for i in items)
    assert len(items) == len(set(items))
    parsed = _Page()
    parsed.feed((tmp_path / "r.html").read_text(encoding="utf-8"))
    text_of_page = "".join(parsed.text)
    assert "Taken from a run's name" in text_of_page
    assert "run LP1-M06: 'Blade sign over entrance' reads as a sign" in text_of_page
