"""The title line at the top of a screen, whose new title costs no layout pass.

Textual's ``Header`` sets a changed title with a layout pass over the whole screen, though the
title's box never changes size; the app changes the title on every run stored (saved or not) and
every run card opened, which made each of them lay out the screen anew (several milliseconds on
the run card's 80-odd widgets).
"""

from __future__ import annotations

from textual.app import ComposeResult
from textual.widgets import Header
from textual.widgets._header import HeaderTitle


class _FixedTitle(HeaderTitle):
    """The title text in its fixed box: a new text is repainted, never laid out."""

    def update(self, content="", *, layout: bool = False) -> None:
        super().update(content, layout=False)


class TitleLine(Header):
    """A ``Header`` whose title changes repaint the title only."""

    def compose(self) -> ComposeResult:
        for widget in super().compose():
            yield _FixedTitle() if type(widget) is HeaderTitle else widget
