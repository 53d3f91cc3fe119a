"""The run sheet's column and row as plain data, with no Textual: the rows are made where
Textual is not imported (``sheet.rows`` in the head start's child process, ``sheet.rawrows``
before the first paint) and drawn by ``widgets.runsheet``. Named tuples: this is imported before
the app's first paint and by the head start's child, where a dataclass's generated methods (about
1 ms for these two, compiled when the class is made) were most of the module's import.
"""

from __future__ import annotations

from typing import NamedTuple


class SheetColumn(NamedTuple):
    """One column: key, heading, width [cells], right-aligned or not; a ``grow`` column takes
    the room a wider terminal gives."""

    key: str
    title: str
    width: int
    right: bool = False
    grow: bool = False


class SheetRow(NamedTuple):
    """One row of the sheet.

    ``cells`` are formatted strings in column order; ``flag`` marks a row that fails a limit
    (drawn in the warning style, but the words are in the cells too); ``sort`` holds the raw
    values used for sorting by column key; ``search`` is the lower-case text the filter matches.
    Never changed once made (a row that changes is made again).
    """

    key: str
    cells: tuple[str, ...]
    flag: bool = False
    sort: dict[str, object] = {}   # one empty mapping shared by the rows made without: never changed
    search: str = ""
    group: str = ""
