"""The run sheet's columns (no model import: the opening screen uses them too)."""

from __future__ import annotations

from gaugewalk.tui.app.widgets.runsheet import SheetColumn

COLUMNS: tuple[SheetColumn, ...] = (
    SheetColumn("id", "Run", 8),
    SheetColumn("from", "From", 6),
    SheetColumn("to", "To", 11, grow=True),
    SheetColumn("feet", "Feet", 5, right=True),
    SheetColumn("load", "Load", 6, right=True),
    SheetColumn("size", "Size", 10),
    SheetColumn("drop", "Drop%", 5, right=True),
    SheetColumn("total", "Tot%", 5, right=True),
    SheetColumn("status", "Status", 12),
)
SORT_KEYS = ("id", "from", "to", "feet", "load", "size", "drop", "total", "status")
