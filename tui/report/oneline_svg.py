"""The one-line diagram as an inline SVG of gaugewalk's own design: the supply tree drawn down
the page, one bus a row, each bus a box (a service with a double frame, a transformer with its
two-winding mark) joined to the bus above by its feeder, whose conductors, length and device are
written beside it. Text from the walk is escaped (its control characters shown as ``\x1b``,
``gaugewalk.model.walk.plain_text``) and shortened to fit; nothing is fetched."""

from __future__ import annotations

from html import escape

from gaugewalk.model.report.oneline import Bus
from gaugewalk.model.walk.plain_text import shown

WIDTH = 680          # [px] fits a portrait letter or A4 page with 12 mm margins (about 700 px)
ROW = 46             # [px] one bus
INDENT = 26          # [px] per level down the tree
BOX_W = 236          # [px]
BOX_H = 34           # [px]
_CHAR_PX = 6.1       # [px] a character at 11 px, for shortening text to fit


def _fit(text: str, width_px: float) -> str:
    """``text`` with its control characters shown, shortened with an ellipsis to about
    ``width_px``, then escaped."""
    text = shown(text)
    most = max(4, int(width_px / _CHAR_PX))
    if len(text) > most:
        text = text[: most - 1] + "…"
    return escape(text)


def one_line_svg(buses: tuple[Bus, ...]) -> str:
    """The diagram of ``buses`` (``gaugewalk.model.report.oneline.one_line``)."""
    if not buses:
        return "<p>No sources in this walk.</p>"
    height = len(buses) * ROW + 8
    parts = [
        f"<svg class=\"oneline\" width=\"{WIDTH}\" height=\"{height}\" "
        f"viewBox=\"0 0 {WIDTH} {height}\" role=\"img\" aria-label=\"One-line diagram\">",
        "<title>One-line diagram: sources, feeders and the drop at each bus</title>",
    ]
    row_of: dict[str, int] = {}
    for i, bus in enumerate(buses):
        row_of.setdefault(bus.id, i)
        x = 4 + bus.depth * INDENT
        y = 4 + i * ROW
        if bus.parent is not None and bus.parent in row_of:
            parent_row = row_of[bus.parent]
            px = 4 + (bus.depth - 1) * INDENT + 10
            top = 4 + parent_row * ROW + BOX_H
            mid = y + BOX_H / 2
            parts.append(f"<path d=\"M{px} {top} V{mid} H{x}\" fill=\"none\" stroke=\"#333\" "
                         f"stroke-width=\"1.5\"/>")
            parts.append(f"<circle cx=\"{px}\" cy=\"{top}\" r=\"2.5\" fill=\"#333\"/>")
        stroke = "#a00" if bus.over else "#222"
        parts.append(f"<g><title>{escape(shown(bus.id))}: {escape(shown(bus.kind))}</title>")
        parts.append(f"<rect x=\"{x}\" y=\"{y}\" width=\"{BOX_W}\" height=\"{BOX_H}\" rx=\"3\" "
                     f"fill=\"#fff\" stroke=\"{stroke}\" stroke-width=\"1.2\"/>")
        text_x = x + 6
        if bus.kind == "service":
            parts.append(f"<rect x=\"{x + 2.5}\" y=\"{y + 2.5}\" width=\"{BOX_W - 5}\" "
                         f"height=\"{BOX_H - 5}\" rx=\"2\" fill=\"none\" stroke=\"{stroke}\"/>")
        elif bus.kind == "transformer":
            cy = y + BOX_H / 2
            parts.append(f"<circle cx=\"{x + 11}\" cy=\"{cy}\" r=\"6\" fill=\"none\" "
                         f"stroke=\"#222\"/><circle cx=\"{x + 19}\" cy=\"{cy}\" r=\"6\" "
                         f"fill=\"none\" stroke=\"#222\"/>")
            text_x = x + 30
        elif bus.kind == "switchboard":
            parts.append(f"<line x1=\"{x + 4}\" y1=\"{y + 4}\" x2=\"{x + 4}\" "
                         f"y2=\"{y + BOX_H - 4}\" stroke=\"#222\" stroke-width=\"3\"/>")
            text_x = x + 10
        room = BOX_W - (text_x - x) - 4
        rating = f" {bus.rating}" if bus.rating else ""
        parts.append(f"<text x=\"{text_x}\" y=\"{y + 14}\" font-weight=\"bold\">"
                     f"{_fit(f'{bus.id} {bus.kind}{rating}', room)}</text>")
        parts.append(f"<text x=\"{text_x}\" y=\"{y + 28}\">{_fit(bus.system, room)}</text>")
        side = x + BOX_W + 8
        side_room = WIDTH - side - 2
        fed = f"via {bus.feeder}" if bus.feeder else (
            "from the utility" if bus.kind == "service" else "fed by nothing in this walk")
        parts.append(f"<text x=\"{side}\" y=\"{y + 14}\">{_fit(fed, side_room)}</text>")
        colour = " fill=\"#a00\"" if bus.over else ""
        parts.append(f"<text x=\"{side}\" y=\"{y + 28}\"{colour}>"
                     f"{_fit(f'{bus.drop_words}; {bus.worst_words}', side_room)}</text>")
        parts.append("</g>")
    parts.append("</svg>")
    return "\n".join(parts)
