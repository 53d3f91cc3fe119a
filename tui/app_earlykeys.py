"""Keys typed faster than a screen opens.

Textual delivers a key to whatever had focus when the key arrived; keys typed right after the one
that opens a screen can reach the old screen, or the new one before any field has focus, and be
lost. Screens that take typing mix in ``EarlyKeys``: such keys are kept and given to the field
that gets focus.
"""

from __future__ import annotations

from textual import events
from textual.widgets import Input


class EarlyKeys:
    """Mixin for a ``Screen`` whose fields should receive keys typed while it was opening."""

    _early: list[str]

    def on_key(self, event: events.Key) -> None:
        if self.focused is None:  # type: ignore[attr-defined]
            self.take_early(event)

    def take_early(self, event: events.Key) -> None:
        """Keep a printable key or Tab typed before a field could take it."""
        if not hasattr(self, "_early"):
            self._early = []
        if event.is_printable and event.character:
            self._early.append(event.character)
        elif event.key == "tab":
            self._early.append("\t")
        else:
            return
        event.stop()
        event.prevent_default()
        self.call_after_refresh(self._replay)  # type: ignore[attr-defined]

    def _replay(self) -> None:
        early = getattr(self, "_early", [])
        if not early:
            return
        if not isinstance(self.focused, Input):  # type: ignore[attr-defined]
            self.call_after_refresh(self._replay)  # type: ignore[attr-defined]
            return
        keys, self._early = early, []
        for ch in keys:
            focused = self.focused  # type: ignore[attr-defined]
            if ch == "\t":
                next_field = getattr(self, "action_next_field", None)
                if next_field is not None:
                    next_field()
                else:
                    self.focus_next()  # type: ignore[attr-defined]
            elif isinstance(focused, Input):
                if not focused.selection.is_empty:
                    focused.delete_selection()  # typing over selected text replaces it
                focused.insert_text_at_cursor(ch)
