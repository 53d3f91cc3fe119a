"""The run sheet's columns (no model import: the opening screen uses them too)."""

from __future__ import annotations

from gaugewalk.tui.app.sheet.shape import SheetColumn

COLUMNS: tuple[SheetColumn, ...] = (
    SheetColumn("id", "Run", 7),
    SheetColumn("from", "From", 5),
    SheetColumn("to", "To", 8, grow=True),
    SheetColumn("feet", "Feet", 5, right=True),
    SheetColumn("load", "Load", 6, right=True),
    SheetColumn("circuit", "Circuit", 7),
    SheetColumn("device", "OCPD", 5, right=True),
    SheetColumn("size", "Size", 7),
    SheetColumn("drop", "VD%", 4, right=True),
    SheetColumn("total", "Tot%", 4, right=True),
    SheetColumn("status", "Status", 9),
)
"""79 cells wide with the cursor mark at 80 columns; a wider terminal first widens the columns
whose entries are cut (ids, sources), then To."""
SORT_KEYS = tuple(c.key for c in COLUMNS)
