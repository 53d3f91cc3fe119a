"""The run sheet's column and row as plain data, with no Textual: the rows are made where
Textual is not imported (``sheet.rows`` in the head start's child process, ``sheet.rawrows``
before the first paint) and drawn by ``widgets.runsheet``."""

from __future__ import annotations

from dataclasses import dataclass, field


@dataclass(frozen=True)
class SheetColumn:
    """One column: key, heading, width [cells], right-aligned or not; a ``grow`` column takes
    the room a wider terminal gives."""

    key: str
    title: str
    width: int
    right: bool = False
    grow: bool = False


@dataclass
class SheetRow:
    """One row of the sheet.

    ``cells`` are formatted strings in column order; ``flag`` marks a row that fails a limit
    (drawn in the warning style, but the words are in the cells too); ``sort`` holds the raw
    values used for sorting by column key; ``search`` is the lower-case text the filter matches.
    """

    key: str
    cells: tuple[str, ...]
    flag: bool = False
    sort: dict[str, object] = field(default_factory=dict)
    search: str = ""
    group: str = ""
