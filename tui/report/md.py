"""The report as Markdown: the same sections as the HTML page, with a text bar chart.

User text is escaped so that it cannot become markup (emphasis, links, table breaks or raw HTML),
and its control characters are shown as ``\x1b`` (``gaugewalk.model.walk.plain_text``).
"""

from __future__ import annotations

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
from gaugewalk.model.report.oneline import one_line_text
from gaugewalk.model.walk.plain_text import shown

_SPECIAL = "\\`*_[]|#<>"
_BAR_WIDTH = 40


def md_escape(text: str) -> str:
    """One line of user text, safe in a Markdown paragraph or table cell."""
    text = shown(" ".join(str(text).split()))
    out = []
    for ch in text:
        if ch == "&":
            out.append("&amp;")
        elif ch == "<":
            out.append("&lt;")
        elif ch == ">":
            out.append("&gt;")
        elif ch in _SPECIAL:
            out.append("\\" + ch)
        else:
            out.append(ch)
    return "".join(out)


def _table(columns, rows) -> list[str]:
    lines = [
        "| " + " | ".join(columns) + " |",  # our own column names, not user text
        "|" + "|".join("---" for _ in columns) + "|",
    ]
    for row in rows:
        lines.append("| " + " | ".join(md_escape(v) for v in row) + " |")
    if not rows:
        lines.append("| " + " | ".join(["none"] + [""] * (len(columns) - 1)) + " |")
    return lines


def footage_chart_text(report: Report) -> list[str]:
    """Bars of '#' scaled to the largest footage, in a code block."""
    if not report.footage:
        return ["No conductors in this walk."]
    most = max(f.with_waste_ft for f in report.footage) or 1
    names = [f"{f.size} {'Cu' if f.material == 'cu' else 'Al'}" for f in report.footage]
    pad = max(len(n) for n in names)
    lines = ["```"]
    for name, f in zip(names, report.footage, strict=True):
        bar = "#" * max(1, round(_BAR_WIDTH * f.with_waste_ft / most))
        lines.append(f"{name.rjust(pad)} | {bar} {f.with_waste_ft} ft")
    lines.append("```")
    return lines


def render_md(report: Report) -> str:
    """The whole report as Markdown text."""
    out = [f"# {md_escape(report.title)}", ""]
    for label, value in report.header:
        out.append(f"- **{md_escape(label)}:** {md_escape(value)}")
    out += ["", f"> **Caution:** {md_escape(report.caution)}", ""]
    out += ["## Summary", ""] + _table(("Item", "Value"), report.summary) + [""]
    out += ["## Defaults used", ""] + _table(("Setting", "Value"), report.defaults) + [""]
    if report.one_line:
        out += ["## One-line diagram", "", "```"]
        out += [shown(line).replace("`", "'") for line in one_line_text(report.one_line)]
        out += ["```", ""]
    out += ["## Runs", ""] + _table(RUN_COLUMNS + ("Problems",),
                                    [r.cells() + ("; ".join(r.problems),) for r in report.runs])
    out += [""]
    if report.run_warnings or report.stated_loads or report.name_notes:
        out += [f"## {NOTES_HEADING}", ""]
        for heading, items in ((RUN_WARNINGS_HEADING, report.run_warnings),
                               (STATED_LOADS_HEADING, report.stated_loads),
                               (NAME_NOTES_HEADING, report.name_notes)):
            if items:
                out += [f"### {heading}", ""] + [f"- {md_escape(t)}" for t in items] + [""]
    if report.shared:
        out += ["## Shared raceways", ""] + _table(SHARED_COLUMNS, report.shared) + [""]
    if report.equipment_table[1]:
        out += ["## Equipment by its article", ""] + _table(*report.equipment_table) + [""]
    if report.sources_table[0]:
        out += ["## Sources", "", md_escape(f"Total drop: {report.drop_basis}."), ""]
        out += _table(*report.sources_table) + [""]
        out += ["## Panel schedules", ""]
        for sch in report.schedules:
            out += [f"### {md_escape(sch.title)}", ""]
            out += [f"- {md_escape(n)}" for n in sch.notes] + [""]
            out += _table(sch.columns, sch.rows) + [""]
    out += ["## Conductor footage by size", "", "Feet to order per size, with waste allowance:", ""]
    out += footage_chart_text(report) + [""]
    out += _table(("Material", "Size", "Net [ft]", "With waste [ft]"),
                  [("copper" if f.material == "cu" else "aluminum", f.size, f"{f.net_ft:.1f}",
                    str(f.with_waste_ft)) for f in report.footage]) + [""]
    out += ["## Material list", "", "### Order", ""] + _table(*report.order_table) + [""]
    out += ["### Conductors", ""] + _table(*report.wire_table) + [""]
    out += ["### Pull list", ""] + _table(*report.pull_table) + [""]
    out += ["### Raceway", ""] + _table(*report.raceway_table) + [""]
    out += ["### Fittings", ""] + _table(*report.fitting_table) + [""]
    if report.warnings:
        out += ["### Takeoff warnings", ""] + [f"- {md_escape(w)}" for w in report.warnings] + [""]
    out += ["## Takeoff assumptions", ""] + [f"- {md_escape(a)}" for a in report.assumptions]
    if report.rules:
        out += ["", f"## {RULES_HEADING}", "", md_escape(RULES_INTRO), ""]
        for r in report.rules:
            out.append(f"- **{md_escape(r.run_id)}** {md_escape(r.route)}")
            out += [f"  - {md_escape(n)}" for n in r.rules]
    out += ["", f"> **Caution:** {md_escape(report.caution)}", ""]
    return "\n".join(out)
