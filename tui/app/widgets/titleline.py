"""The title line at the top of a screen: the app's title and subtitle, one widget on one line.

Textual's ``Header`` is four widgets (the line, an icon, the title, a clock's space), with their
styles parsed and applied and their layout made before the walk screen's first paint, and it sets
a changed title with a layout pass over the whole screen, though the title's box never changes
size. The app changes the title on every run stored and every run card opened; this line is
repainted then, never laid out.
"""

from __future__ import annotations

from textual.content import Content
from textual.events import Mount
from textual.widget import Widget


class TitleLine(Widget):
    """The app's title and subtitle (``App.format_title``: plain text, never markup), centred on
    one line docked at the top of its screen."""

    DEFAULT_CSS = """
    TitleLine {
        dock: top;
        width: 100%;
        height: 1;
        background: $panel;
        color: $foreground;
        content-align: center middle;
        text-wrap: nowrap;
        text-overflow: ellipsis;
    }
    """

    def _on_mount(self, _event: Mount) -> None:
        self.watch(self.app, "title", self._retitle, init=False)
        self.watch(self.app, "sub_title", self._retitle, init=False)

    def _retitle(self) -> None:
        self.refresh()

    def render(self) -> Content:
        app = self.app
        return app.format_title(app.title, app.sub_title)
