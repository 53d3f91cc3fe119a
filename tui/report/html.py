"""The report as one self-contained HTML page: inline styles with print rules (portrait letter
or A4: every table fits the page width, sizes never broken across lines), an inline SVG one-line
diagram and bar chart, nothing fetched from the network. Every piece of user text is escaped,
its control characters shown as ``\x1b`` (``gaugewalk.model.walk.plain_text``)."""

from __future__ import annotations

import html
from collections.abc import Set as AbstractSet

from gaugewalk.model.report.content import (
    NAME_NOTES_HEADING,
    NOTES_HEADING,
    RULES_HEADING,
    RULES_INTRO,
    RUN_COLUMNS,
    RUN_WARNINGS_HEADING,
    SHARED_COLUMNS,
    STATED_LOADS_HEADING,
    Report,
)
from gaugewalk.model.walk.plain_text import shown
from gaugewalk.tui.report.oneline_svg import one_line_svg


def escape(text: str) -> str:
    """Text for the page: control characters made visible, then HTML-escaped (quotes too)."""
    return html.escape(shown(text))

_STYLE = """
body { font-family: system-ui, sans-serif; font-size: 13px; color: #111; margin: 1.5em; }
h1 { font-size: 1.5em; margin: 0 0 .4em; }
h2 { font-size: 1.15em; margin: 1.4em 0 .4em; border-bottom: 1px solid #999; }
table { border-collapse: collapse; margin: .3em 0 1em; }
th, td { border: 1px solid #bbb; padding: 2px 3px; text-align: left; vertical-align: top;
         overflow-wrap: break-word; }
th { background: #eee; overflow-wrap: normal; }
td.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
td.nw, span.nw { white-space: nowrap; }
tr.problem td { background: #fde8e8; }
tr.why td { font-size: .92em; }
.caution { border: 2px solid #a00; padding: .5em .8em; font-weight: bold; }
dl.header { display: grid; grid-template-columns: max-content auto; gap: 2px 1em; }
dl.header dt { font-weight: bold; }
dl.header dd { margin: 0; }
dl.rules { display: grid; grid-template-columns: max-content auto; gap: 3px .8em; }
dl.rules dt { font-weight: bold; }
dl.rules dt .route { display: block; font-weight: normal; }
dl.rules dd { margin: 0; }
svg text { font-family: system-ui, sans-serif; font-size: 12px; }
@media print {
  @page { size: portrait; margin: 12mm; }
  body { margin: 0; font-size: 8.5px; }
  svg text { font-size: 11px; }
  h2 { break-after: avoid; }
  thead { display: table-header-group; }
  tr, .caution, svg, dl.rules dd { break-inside: avoid; }
  th, tr.problem td { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
}
""".strip()

_NUMERIC = {"Length [ft]", "Drop [%]", "Total drop [%]", "Net [ft]", "With waste [ft]",
            "Cuts [ft]", "Offcut [ft]", "Count", "Quantity", "Breaker [A]", "Serves [kVA]",
            "Drop at bus [%]", "Conductors", "Current-carrying", "Adjustment"}
_NO_BREAK = {"Size", "EGC", "Raceway", "Trade size", "Circuit", "Rating", "Insulation", "System",
             "Kind"}
"""Columns whose cells are never broken across lines (``3/0 AWG``, ``EMT 1-1/4``); where words
follow the first comma (``EMT 3/4, rooftop: ...``), those may wrap: kept whole, they would
squeeze the other columns to a letter a line."""


def _cell(column: str, value: str) -> str:
    if column in _NUMERIC:
        return f"<td class=\"num\">{escape(value)}</td>"
    if column in _NO_BREAK:
        head, sep, rest = value.partition(", ")
        if sep:  # what follows the size (a rooftop's words, a shared raceway) may wrap
            return f"<td><span class=\"nw\">{escape(head)}</span>{escape(sep + rest)}</td>"
        return f"<td class=\"nw\">{escape(value)}</td>"
    return f"<td>{escape(value)}</td>"


def _table(columns, rows, *, problem_rows: AbstractSet[int] = frozenset(), label: str = "",
           why: dict[int, str] | None = None) -> str:
    """A table; ``why`` gives a row a line of its own under it (a run's problems)."""
    head = "".join(f"<th scope=\"col\">{escape(c)}</th>" for c in columns)
    body = []
    for i, row in enumerate(rows):
        cells = "".join(_cell(c, v) for c, v in zip(columns, row, strict=True))
        cls = " class=\"problem\"" if i in problem_rows else ""
        body.append(f"<tr{cls}>{cells}</tr>")
        if why and i in why:
            body.append(f"<tr class=\"problem why\"><td colspan=\"{len(columns)}\">"
                        f"{escape(why[i])}</td></tr>")
    if not rows:
        body.append(f"<tr><td colspan=\"{len(columns)}\">none</td></tr>")
    aria = f" aria-label=\"{escape(label)}\"" if label else ""
    return (f"<table{aria}><thead><tr>{head}</tr></thead><tbody>\n" + "\n".join(body)
            + "\n</tbody></table>")


def footage_chart_svg(report: Report, width: int = 640) -> str:
    """Horizontal bars of conductor footage (with waste) per material and size [ft]."""
    bars = report.footage
    if not bars:
        return "<p>No conductors in this walk.</p>"
    label_w, value_w, bar_h, gap = 130, 70, 18, 6
    plot_w = width - label_w - value_w
    most = max(b.with_waste_ft for b in bars) or 1
    height = len(bars) * (bar_h + gap) + gap
    parts = [
        f"<svg width=\"{width}\" height=\"{height}\" viewBox=\"0 0 {width} {height}\" role=\"img\" "
        f"aria-label=\"Conductor footage by size, with waste allowance\">",
        "<title>Conductor footage by size [ft], with waste allowance</title>",
    ]
    for i, b in enumerate(bars):
        y = gap + i * (bar_h + gap)
        w = max(1.0, plot_w * b.with_waste_ft / most)
        name = f"{b.size} {'Cu' if b.material == 'cu' else 'Al'}"
        fill = "#b5651d" if b.material == "cu" else "#8a9099"
        parts.append(
            f"<text x=\"{label_w - 6}\" y=\"{y + bar_h - 5}\" text-anchor=\"end\">"
            f"{escape(name)}</text>"
            f"<rect x=\"{label_w}\" y=\"{y}\" width=\"{w:.1f}\" height=\"{bar_h}\" fill=\"{fill}\">"
            f"<title>{escape(name)}: {b.with_waste_ft} ft</title></rect>"
            f"<text x=\"{label_w + w + 4:.1f}\" y=\"{y + bar_h - 5}\">{b.with_waste_ft} ft</text>"
        )
    parts.append("</svg>")
    return "\n".join(parts)


def render_html(report: Report) -> str:
    """The whole page as text."""
    out = [
        "<!DOCTYPE html>",
        "<html lang=\"en\">",
        "<head>",
        "<meta charset=\"utf-8\">",
        "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">",
        f"<title>{escape(report.title)}</title>",
        f"<style>\n{_STYLE}\n</style>",
        "</head>",
        "<body>",
        f"<h1>{escape(report.title)}</h1>",
        "<dl class=\"header\">",
    ]
    for label, value in report.header:
        out.append(f"<dt>{escape(label)}</dt><dd>{escape(value)}</dd>")
    out.append("</dl>")
    out.append(f"<p class=\"caution\" role=\"note\">{escape(report.caution)}</p>")

    out.append("<h2>Summary</h2>")
    out.append(_table(("Item", "Value"), report.summary, label="Summary"))
    out.append("<h2>Defaults used</h2>")
    out.append(_table(("Setting", "Value"), report.defaults, label="Defaults used"))

    if report.one_line:
        out.append("<h2>One-line diagram</h2>")
        out.append(one_line_svg(report.one_line))

    out.append("<h2>Runs</h2>")
    problem_rows = {i for i, r in enumerate(report.runs) if r.problems}
    why = {i: "Problems: " + "; ".join(r.problems) for i, r in enumerate(report.runs)
           if r.problems}
    out.append(_table(RUN_COLUMNS, [r.cells() for r in report.runs],
                      problem_rows=problem_rows, label="Runs", why=why))
    if report.run_warnings or report.stated_loads or report.name_notes:
        out.append(f"<h2>{escape(NOTES_HEADING)}</h2>")
        for heading, items in ((RUN_WARNINGS_HEADING, report.run_warnings),
                               (STATED_LOADS_HEADING, report.stated_loads),
                               (NAME_NOTES_HEADING, report.name_notes)):
            if items:
                out.append(f"<h3>{escape(heading)}</h3>")
                out.append("<ul>" + "".join(f"<li>{escape(t)}</li>" for t in items) + "</ul>")
    if report.shared:
        out.append("<h2>Shared raceways</h2>")
        out.append(_table(SHARED_COLUMNS, report.shared, label="Shared raceways"))
    if report.equipment_table[1]:
        out.append("<h2>Equipment by its article</h2>")
        out.append(_table(*report.equipment_table, label="Equipment by its article"))

    if report.sources_table[0]:
        out.append("<h2>Sources</h2>")
        out.append(f"<p>Total drop: {escape(report.drop_basis)}.</p>")
        out.append(_table(*report.sources_table, label="Sources"))
        out.append("<h2>Panel schedules</h2>")
        for sch in report.schedules:
            out.append(f"<h3>{escape(sch.title)}</h3>")
            out.append("<ul>" + "".join(f"<li>{escape(n)}</li>" for n in sch.notes) + "</ul>")
            out.append(_table(sch.columns, sch.rows, label=f"Schedule of {sch.title}"))

    out.append("<h2>Conductor footage by size</h2>")
    out.append(footage_chart_svg(report))
    out.append(_table(("Material", "Size", "Net [ft]", "With waste [ft]"),
                      [("copper" if f.material == "cu" else "aluminum", f.size,
                        f"{f.net_ft:.1f}", str(f.with_waste_ft)) for f in report.footage],
                      label="Conductor footage by size"))

    out.append("<h2>Material list</h2>")
    out.append("<h3>Order</h3>")
    out.append(_table(*report.order_table, label="Order"))
    out.append("<h3>Conductors</h3>")
    out.append(_table(*report.wire_table, label="Conductors"))
    out.append("<h3>Pull list</h3>")
    out.append(_table(*report.pull_table, label="Pull list"))
    out.append("<h3>Raceway</h3>")
    out.append(_table(*report.raceway_table, label="Raceway"))
    out.append("<h3>Fittings</h3>")
    out.append(_table(*report.fitting_table, label="Fittings"))
    if report.warnings:
        out.append("<h3>Takeoff warnings</h3>")
        out.append("<ul>" + "".join(f"<li>{escape(w)}</li>" for w in report.warnings) + "</ul>")

    out.append("<h2>Takeoff assumptions</h2>")
    out.append("<ul>" + "\n".join(f"<li>{escape(a)}</li>" for a in report.assumptions) + "</ul>")
    if report.rules:
        out.append(f"<h2>{escape(RULES_HEADING)}</h2>")
        out.append(f"<p>{escape(RULES_INTRO)}</p>")
        out.append("<dl class=\"rules\">")
        for r in report.rules:
            out.append(f"<dt>{escape(r.run_id)} <span class=\"route\">{escape(r.route)}</span></dt>"
                       "<dd>" + " ".join(f"<span>{escape(n)}.</span>" for n in r.rules)
                       + "</dd>")
        out.append("</dl>")
    out.append(f"<p class=\"caution\" role=\"note\">{escape(report.caution)}</p>")
    out.append("</body>")
    out.append("</html>")
    return "\n".join(out) + "\n"
