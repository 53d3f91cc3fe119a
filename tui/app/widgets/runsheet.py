"""The run sheet: a virtualised list of runs that stays fast with thousands of rows.

Only the lines on screen are drawn (Textual's line API), so opening, scrolling, sorting and
filtering cost the same whether the walk has 40 runs or 50,000. Rows are plain tuples of
already formatted cells; the sheet keeps a view order (filtered and sorted indices) over them.
"""

from __future__ import annotations

from typing import Callable, Sequence

from rich.cells import cell_len
from rich.segment import Segment
from textual import events
from textual.binding import Binding
from textual.geometry import Size
from textual.message import Message
from textual.scroll_view import ScrollView
from textual.strip import Strip
from textual.widget import Widget

from gaugewalk.tui.app.sheet.shape import SheetColumn, SheetRow


def _fit(text: str, width: int, right: bool) -> str:
    if len(text) > width:
        return text[: max(width - 1, 0)] + "…" if width > 0 else ""
    return text.rjust(width) if right else text.ljust(width)


def format_line(columns: Sequence[SheetColumn], cells: Sequence[str]) -> str:
    """Cells fitted to their columns, separated by one space."""
    return " ".join(_fit(c, col.width, col.right) for col, c in zip(columns, cells, strict=False))


def line_width(columns: Sequence[SheetColumn]) -> int:
    """A row's width: the two-cell cursor mark, the columns and the spaces between them."""
    return 2 + sum(c.width for c in columns) + max(len(columns) - 1, 0)


def _longest_cell(rows: Sequence[SheetRow], c: int, was: int) -> int:
    """The longest entry [cells] of column ``c`` after its entry of length ``was`` (the
    longest then) changed: ``was`` while another row still has one that long (most often found
    early in the rows), else the longest counted again."""
    for r in rows:
        cells = r.cells
        if c < len(cells) and len(cells[c]) == was:
            return was
    return max((len(r.cells[c]) for r in rows if c < len(r.cells)), default=0)


MAX_FIT = 40
"""Widest a column grows to show its longest entry (an id is at most 40 characters) [cells]."""


def fit_columns(base: Sequence[SheetColumn], longest: Sequence[int], width: int) -> list[SheetColumn]:
    """The columns for a sheet ``width`` cells wide: the room beyond the base layout goes first
    to the columns whose longest entry is cut (ids, sources, in column order), then to the
    growing column(s)."""
    room = width - line_width(base)
    columns = list(base)
    for i, c in enumerate(base):
        if room <= 0:
            break
        want = min(longest[i] if i < len(longest) else 0, MAX_FIT) - c.width
        if want > 0 and not c.grow:
            add = min(want, room)
            columns[i] = c._replace(width=c.width + add)
            room -= add
    growers = [i for i, c in enumerate(base) if c.grow]
    if room > 0 and growers:
        share, extra = divmod(room, len(growers))
        for n, i in enumerate(growers):
            columns[i] = columns[i]._replace(width=columns[i].width + share + (1 if n < extra else 0))
    return columns


class SheetHeading(Widget):
    """The column headings above the sheet, with the sort column marked."""

    DEFAULT_CSS = """
    SheetHeading { height: 1; text-style: bold; }
    """

    def __init__(self, sheet: "RunSheet", **kwargs) -> None:
        super().__init__(**kwargs)
        self._sheet = sheet

    def render(self) -> str:
        sheet = self._sheet
        titles = []
        for col in sheet.columns:
            mark = ""
            if col.key == sheet.sort_key:
                mark = "▼" if sheet.sort_reverse else "▲"
            titles.append(col.title + mark)
        return "  " + format_line(sheet.columns, titles)


class RunSheet(ScrollView, can_focus=True):
    """A scrolling, filterable, sortable list of runs drawn line by line."""

    BINDINGS = [
        Binding("up", "cursor(-1)", "Up", show=False),
        Binding("down", "cursor(1)", "Down", show=False),
        Binding("pageup", "page(-1)", "Page up", show=False),
        Binding("pagedown", "page(1)", "Page down", show=False),
        Binding("home", "edge(0)", "First", show=False),
        Binding("end", "edge(1)", "Last", show=False),
    ]

    COMPONENT_CLASSES = {"runsheet--cursor", "runsheet--flag"}

    DEFAULT_CSS = """
    RunSheet { height: 1fr; }
    RunSheet > .runsheet--cursor { text-style: reverse bold; }
    RunSheet > .runsheet--flag { color: $warning; text-style: bold; }
    """

    class Highlighted(Message):
        """The cursor moved to the run ``key`` (None when the view is empty)."""

        def __init__(self, sheet: "RunSheet", key: str | None) -> None:
            super().__init__()
            self.sheet = sheet
            self.key = key

    class Chosen(Message):
        """The run ``key`` was double-clicked (Enter is the walk screen's key)."""

        def __init__(self, sheet: "RunSheet", key: str) -> None:
            super().__init__()
            self.sheet = sheet
            self.key = key

    def __init__(self, columns: Sequence[SheetColumn], **kwargs) -> None:
        super().__init__(**kwargs)
        self.columns: list[SheetColumn] = list(columns)
        self.rows: list[SheetRow] = []
        self.view: list[int] = []
        self.cursor: int = 0
        self.sort_key: str | None = None
        self.sort_reverse: bool = False
        self.filter_text: str = ""
        self.filter_pred: Callable[[SheetRow], bool] | None = None
        self._index: dict[str, int] = {}
        self._longest: list[int] = []  # each column's longest entry [cells]
        self.flagged = 0   # rows flagged (``SheetRow.flag``)

    # ----- data -------------------------------------------------------------------------
    def set_rows(self, rows: list[SheetRow], keep_key: str | None = None) -> None:
        """Replace every row; keep the cursor on ``keep_key`` (or the current run) if present."""
        if keep_key is None:
            keep_key = self.cursor_key
        self.rows = rows
        self._index = {r.key: i for i, r in enumerate(rows)}
        self.flagged = sum(1 for r in rows if r.flag)
        self._longest = [max((len(r.cells[i]) for r in rows if i < len(r.cells)), default=0)
                         for i in range(len(self.columns))]
        if self.is_mounted:
            self._fit_columns()
        self._rebuild_view(keep_key)

    def update_rows(self, changed: Sequence[SheetRow]) -> bool:
        """Put each row in place of the row of its key, the rest as they are; the columns, the
        view (filtered, sorted) and the cursor then as ``set_rows`` of the whole would leave
        them. Only the lines of the rows that changed are drawn again when the columns stay
        and the view is neither filtered nor sorted. False, changing nothing, when a key is not
        in the sheet."""
        index = self._index
        if any(row.key not in index for row in changed):
            return False
        rows, longest = self.rows, self._longest
        shrunk: set[int] = set()
        redraw: list[int] = []
        for row in changed:
            i = index[row.key]
            old = rows[i]
            rows[i] = row
            if row.cells != old.cells or row.flag != old.flag:
                redraw.append(i)
                self.flagged += row.flag - old.flag
            for c, text in enumerate(row.cells[: len(longest)]):
                n = len(text)
                if n > longest[c]:
                    longest[c] = n
                elif n < longest[c] and c < len(old.cells) and len(old.cells[c]) == longest[c]:
                    shrunk.add(c)  # it may have been the longest: count that column again
        for c in shrunk:
            longest[c] = _longest_cell(rows, c, longest[c])
        columns = self.columns
        if self.is_mounted:
            self._fit_columns()
        if self.filter_text or self.filter_pred is not None or self.sort_key:
            self._rebuild_view(self.cursor_key)  # a changed row may now match, or sort apart
        elif self.is_mounted and self.columns is columns:  # every row in order: row i, line i
            top = round(self.scroll_y)
            height = self.scrollable_content_region.height or self.size.height
            for i in redraw:
                if top <= i < top + height:
                    self.refresh_line(i)
        # else ``_fit_columns`` drew every line again
        return True

    def set_filter(self, text: str = "", pred: Callable[[SheetRow], bool] | None = None) -> None:
        self.filter_text = text.lower().strip()
        self.filter_pred = pred
        self._rebuild_view(self.cursor_key)

    def sort_by(self, key: str | None, reverse: bool = False) -> None:
        """Sort by a column; the cursor goes to the first row and the view to the top, where
        the sort put the runs just asked for (the worst, sorted in reverse)."""
        self.sort_key = key
        self.sort_reverse = reverse
        self.cursor = 0
        self._rebuild_view(None)

    def _rebuild_view(self, keep_key: str | None) -> None:
        rows = self.rows
        idx = range(len(rows))
        text = self.filter_text
        pred = self.filter_pred
        if text or pred:
            # one pass a word, each narrowing the last (a flat test a row: a few times quicker
            # than a generator of every word a row, on each key typed in the find box)
            for word in text.split():
                idx = [i for i in idx if word in rows[i].search]
            if pred is not None:
                idx = [i for i in idx if pred(rows[i])]
        view = list(idx)
        if self.sort_key:
            key = self.sort_key

            def sort_value(i: int) -> tuple:
                v = rows[i].sort.get(key)
                if v is None:
                    return (1, 0, "")
                if isinstance(v, (int, float, tuple)):
                    return (0, v, "")
                return (0, 0, str(v))

            view.sort(key=sort_value, reverse=self.sort_reverse)
        self.view = view
        self._set_virtual_size(Size(self._line_width(), len(view)))
        # a run gone (deleted, filtered out): the cursor stays where it was, on the run that
        # took its place, or the last; never back to the top, where a second Delete would land
        new_cursor = self.cursor
        if keep_key is not None and keep_key in self._index:
            try:
                new_cursor = view.index(self._index[keep_key])
            except ValueError:
                pass
        self.cursor = min(new_cursor, max(len(view) - 1, 0))
        self.refresh()
        self._scroll_cursor_into_view()
        self.post_message(self.Highlighted(self, self.cursor_key))
        heading = self._heading()
        if heading is not None:
            heading.refresh()

    def _set_virtual_size(self, size: Size) -> None:
        """The sheet's scrolling size: its line width and its number of lines in view. Textual's
        ``virtual_size`` asks for a layout pass over the whole screen on every change (most of
        the cost of a key typed in the find box: the lines in view change with each); the
        sheet's own size does not follow it (``height: 1fr``, the width of its screen), so only
        its scrolling does (``_scroll_update``, what that pass does for a scrolling widget). A
        scrollbar that comes or goes with it still asks for the layout, as it needs one."""
        if size != self.virtual_size:
            self.set_reactive(ScrollView.virtual_size, size)
            self._scroll_update(size)
            self.refresh()

    def _heading(self) -> SheetHeading | None:
        parent = self.parent
        if parent is None:
            return None
        for child in parent.children:
            if isinstance(child, SheetHeading):
                return child
        return None

    def _line_width(self) -> int:
        return line_width(self.columns)

    @property
    def cursor_key(self) -> str | None:
        if 0 <= self.cursor < len(self.view):
            return self.rows[self.view[self.cursor]].key
        return None

    def visible_keys(self) -> list[str]:
        return [self.rows[i].key for i in self.view]

    def rows_on_screen(self) -> list[str]:
        """The keys of the rows drawn now (the sheet's height from its scroll position)."""
        top = round(self.scroll_y)
        height = self.scrollable_content_region.height or self.size.height
        return [self.rows[i].key for i in self.view[top: top + max(height, 0)]]

    def move_to(self, key: str) -> bool:
        i = self._index.get(key)
        if i is None:
            return False
        try:
            pos = self.view.index(i)
        except ValueError:
            return False
        self._set_cursor(pos)
        return True

    # ----- drawing ----------------------------------------------------------------------
    def render_line(self, y: int) -> Strip:
        scroll_x, scroll_y = self.scroll_offset
        pos = scroll_y + y
        width = self.size.width
        if pos >= len(self.view):
            return Strip.blank(width, self.rich_style)
        row = self.rows[self.view[pos]]
        marker = "▶ " if pos == self.cursor else "  "
        text = marker + format_line(self.columns, row.cells)
        base = self.rich_style
        if pos == self.cursor:
            style = base + self.get_component_rich_style("runsheet--cursor")
        elif row.flag:
            style = base + self.get_component_rich_style("runsheet--flag")
        else:
            style = base
        if scroll_x == 0:  # the usual case: one strip, not one cropped and one padded
            n = cell_len(text)
            if n <= width:
                pad = [Segment(" " * (width - n), base)] if n < width else []
                return Strip([Segment(text, style), *pad], width)
        strip = Strip([Segment(text, style)]).crop(scroll_x, scroll_x + width)
        return strip.extend_cell_length(width, base)

    # ----- cursor -----------------------------------------------------------------------
    def _set_cursor(self, pos: int) -> None:
        if not self.view:
            return
        pos = max(0, min(pos, len(self.view) - 1))
        if pos == self.cursor:
            return
        old = self.cursor
        self.cursor = pos
        self.refresh_line(old)
        self.refresh_line(pos)
        self._scroll_cursor_into_view()
        self.post_message(self.Highlighted(self, self.cursor_key))

    def _scroll_cursor_into_view(self) -> None:
        height = self.scrollable_content_region.height or self.size.height
        if height <= 0:
            return
        top = round(self.scroll_y)
        if self.cursor < top:
            self.scroll_to(y=self.cursor, animate=False, immediate=True)
        elif self.cursor >= top + height:
            self.scroll_to(y=self.cursor - height + 1, animate=False, immediate=True)

    def action_cursor(self, delta: int) -> None:
        self._set_cursor(self.cursor + delta)

    def action_page(self, direction: int) -> None:
        height = max(self.scrollable_content_region.height - 1, 1)
        self._set_cursor(self.cursor + direction * height)

    def action_edge(self, end: int) -> None:
        self._set_cursor(len(self.view) - 1 if end else 0)

    def on_resize(self, event: events.Resize) -> None:
        self._fit_columns()
        self._scroll_cursor_into_view()

    def _fit_columns(self) -> None:
        """Fit the columns to the terminal's width (``fit_columns``)."""
        base = getattr(self, "_base_columns", None)
        if base is None:
            base = self._base_columns = list(self.columns)
        width = self.scrollable_content_region.width
        if width <= 0:
            return
        columns = fit_columns(base, self._longest, width)
        if columns != self.columns:
            self.columns = columns
            self._set_virtual_size(Size(self._line_width(), len(self.view)))
            self.refresh()
            heading = self._heading()
            if heading is not None:
                heading.refresh()

    async def _on_click(self, event: events.Click) -> None:
        pos = round(self.scroll_y) + event.y
        if 0 <= pos < len(self.view):
            if pos == self.cursor and event.chain >= 2:
                self.post_message(self.Chosen(self, self.rows[self.view[pos]].key))
            self._set_cursor(pos)

