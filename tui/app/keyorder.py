"""Every key, in order, into the field it was typed in, at any speed.

Textual passes a key to the widget that has focus when the app takes the key from its queue;
that widget handles it later, from its own queue. Three things then happen only after the keys
typed right behind are already on their way to the old field:

- a key bound on the screen (Tab, Down, ctrl+o, Enter) acts once it has bubbled up from the
  field through the queue of every container to the app;
- ``Widget.focus()`` moves the focus through the app's queue, behind the keys waiting there;
- an ``Input`` selects its text when it handles its Focus event, so a key typed into it just
  before is selected, and replaced by the next ("heeter" stored for "Sheeter").

So a fast typist, a paste or a busy processor scrambled the fields. Here the app hands every key
(and paste) meant for a screen that takes typing (``TypedInOrder``) to that screen as it takes
the key from its queue (``WalkApp.on_event``), and the screen applies it there and then to the
field focused now: a binding's action runs (focus moves with ``set_focus``, the card stores) or
the character is typed. Nothing about a key waits in another queue, so keys are applied in the
order they were typed, the same way at one key a second or a thousand. A screen that takes
typing is handed keys only once it is mounted and its first field has focus; until then they
wait, in order, in the app's queue.
"""

from __future__ import annotations

import asyncio

from textual import events
from textual.app import App
from textual.widgets import Input


class TypedInOrder:
    """Mixin for a ``Screen`` of fields (``Input``) whose keys must be applied in order.

    The screen gives its first field focus in ``on_mount`` (``start_typing``), moves focus only
    with ``move_to`` (or the focus_next/focus_previous actions), and may override
    ``field_entered`` (what moving into a field does to its text) and ``field_typed`` (a key or
    a paste changed the field's text). Its fields should be made with ``select_on_focus=False``:
    the selection is made when the focus moves, not when the field's Focus event arrives."""

    AUTO_FOCUS = ""  # none: the screen focuses its own first field (start_typing)

    def __init__(self, *args, **kwargs) -> None:
        super().__init__(*args, **kwargs)
        self.typing_ready = asyncio.Event()

    def _on_mount(self, event: events.Mount) -> None:
        # runs after the screen's own on_mount (Textual calls the handlers of every class):
        # whatever that did, keys may come now
        self.typing_ready.set()

    # ----- for the screen ---------------------------------------------------------------
    def start_typing(self, field: Input) -> None:
        """Give ``field`` the focus: keys are typed into it from now on."""
        self.move_to(field)
        self.typing_ready.set()

    def move_to(self, field: Input) -> None:
        """Move the focus to ``field`` now (not after the keys already waiting)."""
        self.set_focus(field)  # type: ignore[attr-defined]
        self.field_entered(field)

    def field_entered(self, field: Input) -> None:
        """The focus moved into ``field``: the cursor goes to the end, nothing selected, so a
        stray key never replaces what is there."""
        field.cursor_position = len(field.value)

    def field_typed(self, field: Input) -> None:
        """A key or a paste changed ``field``'s text (called at once, in order; also after a
        key whose action changed the text itself: the screen tells its own changes apart)."""

    # ----- for the app ------------------------------------------------------------------
    async def take_key(self, event: events.Key) -> bool:
        """Apply ``event`` to the field focused now, as Textual would but at once: priority
        bindings first, then a character the field takes, then the bindings from the field up to
        the screen and the app (a binding whose action does not apply passes the key on). With a
        widget other than a field focused (a list), its bindings and the screen's act at once.
        False when nothing takes the key: it then goes Textual's usual way."""
        field = self.focused  # type: ignore[attr-defined]
        app = self.app  # type: ignore[attr-defined]
        if not isinstance(field, Input):
            # a list or no focus: the key's binding acts at once (a list's Down, a screen's n),
            # so the keys behind it find the focus where it moved; a key bound to nothing goes
            # Textual's way
            if await app._check_bindings(event.key, priority=True):
                return True
            return bool(await app._check_bindings(event.key))
        before = field.value
        if await app._check_bindings(event.key, priority=True):
            pass
        elif event.is_printable and event.character:
            _type_text(field, event.character)
        elif not await app._check_bindings(event.key):
            return False
        if field.value != before:
            self.field_typed(field)
        now = self.focused  # type: ignore[attr-defined]
        if now is not field and isinstance(now, Input):
            self.field_entered(now)
        return True

    def take_paste(self, event: events.Paste) -> bool:
        """Type the first line of a paste into the field focused now, as the field would."""
        field = self.focused  # type: ignore[attr-defined]
        if not isinstance(field, Input):
            return False
        line = event.text.splitlines()[0] if event.text else ""
        if line:
            _type_text(field, line)
            self.field_typed(field)
        return True


def _type_text(field: Input, text: str) -> None:
    """What ``Input`` does with a typed key: replace the selection, or insert at the cursor."""
    selection = field.selection
    if selection.is_empty:
        field.insert_text_at_cursor(text)
    else:
        field.replace(text, *selection)


class BoundInOrder:
    """Mixin for a ``Screen`` of lists (the walk screen: its run sheet and supply tree) whose
    bound keys must act in order. Some of its keys act on the run under the cursor (``e``,
    Enter) and are bound with priority, so Textual runs them as the app takes them; the keys
    that move the cursor belong to the list and ran later, from its queue: typed fast, ``down``
    then ``e`` edited the run the cursor had left. Here every key bound along the focus chain
    acts as the app takes it. The screen moves the focus with ``set_focus`` (now, not after the
    keys waiting). With a field focused (the find box) keys go Textual's way: the field takes
    them in order from its own queue."""


async def deliver_in_order(app: App, event: events.Key | events.Paste) -> bool:
    """Hand a key or a paste taken from ``app``'s queue to the screen that takes typing, once it
    is ready; True when it was applied (else Textual routes it as usual)."""
    screen = app.screen
    while isinstance(screen, TypedInOrder) and not screen.typing_ready.is_set():
        await screen.typing_ready.wait()
        screen = app.screen
    if isinstance(screen, BoundInOrder):
        if isinstance(event, events.Paste) or isinstance(screen.focused, Input):  # type: ignore[attr-defined]
            return False
        if await app._check_bindings(event.key, priority=True):
            return True
        return bool(await app._check_bindings(event.key))
    if not isinstance(screen, TypedInOrder):
        return False
    if isinstance(event, events.Paste):
        return screen.take_paste(event)
    return await screen.take_key(event)
