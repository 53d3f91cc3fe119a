"""Keys typed faster than a screen opens.

Textual delivers a key to whatever had focus when the key arrived; keys typed right after the one
that opens a screen can reach the old screen, or the new one before its first field has focus,
and be lost or land in the wrong field. Screens that take typing mix in ``EarlyKeys``: such keys
are kept until the screen says which field is first (``keys_ready``), then typed into it in
order, Tab moving to the next field.
"""

from __future__ import annotations

from textual import events
from textual.widgets import Input


class EarlyKeys:
    """Mixin for a ``Screen`` whose fields should receive keys typed while it was opening."""

    AUTO_FOCUS = ""  # none: the screen focuses its own first field, then calls keys_ready

    def keys_ready(self, field: Input) -> None:
        """The screen is filled in and ``field`` takes the typing from now on."""
        self._early_field = field
        self._replay()

    def hold_enter(self) -> bool:
        """Call at the start of the screen's Enter action: True when Enter arrived before the
        keys typed ahead of it were placed; it is then kept in order and ``early_enter`` runs
        after them."""
        if getattr(self, "_early_field", None) is None or getattr(self, "_early", None):
            if not hasattr(self, "_early"):
                self._early = []
            self._early.append("\r")
            self._replay()
            return True
        return False

    def post_message(self, message) -> bool:
        # a key sent to the screen itself had no field to go to when it arrived
        if isinstance(message, events.Key) and self.focused is None:  # type: ignore[attr-defined]
            message._typed_early = True
        return super().post_message(message)  # type: ignore[misc]

    def on_key(self, event: events.Key) -> None:
        if getattr(event, "_typed_early", False) or getattr(self, "_early_field", None) is None:
            self.take_early(event)

    def take_early(self, event: events.Key) -> None:
        """Keep a printable key or Tab typed before a field could take it."""
        if not hasattr(self, "_early"):
            self._early = []
        if event.is_printable and event.character:
            self._early.append(event.character)
        elif event.key == "tab":
            self._early.append("\t")
        elif event.key == "enter" and hasattr(self, "early_enter"):
            self._early.append("\r")
        else:
            return
        event.stop()
        event.prevent_default()
        self._replay()

    def _replay(self) -> None:
        field: Input | None = getattr(self, "_early_field", None)
        early = getattr(self, "_early", [])
        if field is None or not early:
            return
        self._early = []
        inputs = [w for w in self.focus_chain if isinstance(w, Input)]  # type: ignore[attr-defined]
        for ch in early:
            if ch == "\r":  # Enter, held back by the screen's action until the keys before it
                self._early_field = field
                getattr(self, "early_enter")()
                field = self._early_field
                inputs = [w for w in self.focus_chain if isinstance(w, Input)]  # type: ignore[attr-defined]
            elif ch == "\t":
                take = getattr(self, "take_completion", None)
                if take is not None:
                    take(field)
                i = inputs.index(field) if field in inputs else -1
                field = inputs[min(i + 1, len(inputs) - 1)] if inputs else field
                field.select_all()
            else:
                if not field.selection.is_empty:
                    field.delete_selection()  # typing over selected text replaces it
                field.insert_text_at_cursor(ch)
        self._early_field = field
        field.focus()
