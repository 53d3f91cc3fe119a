"""The key line at the foot of a screen, made again only when the keys it shows change.

Textual's ``Footer`` rebuilds every key in it whenever the screen's bindings may have changed:
on each move of the focus and each time its screen comes back. On the run card that is every
field moved into; a footer rebuilt with the same keys is work with nothing to show for it.
"""

from __future__ import annotations

from textual.app import ComposeResult
from textual.screen import Screen
from textual.widgets import Footer


def shown_keys(screen: Screen) -> tuple:
    """What a footer on ``screen`` shows: each shown key, what it does and whether it acts."""
    return tuple(
        (binding.key, binding.action, binding.description, binding.group, enabled, tooltip)
        for _node, binding, enabled, tooltip in screen.active_bindings.values()
        if binding.show
    )


class KeyFooter(Footer):
    """A ``Footer`` that is rebuilt only when the keys it would show are not those it shows."""

    _showing: tuple | None = None   # the keys of the last build (None: not built with keys)

    def bindings_changed(self, screen: Screen) -> None:
        if self._showing is not None and screen is self.screen and \
                shown_keys(screen) == self._showing:
            return
        super().bindings_changed(screen)

    def show_keys_ahead(self) -> None:
        """Build the keys of its screen next, while the screen is not shown yet (a screen built
        ahead of its first open): that open then finds them built, not rebuilt after its first
        paint."""
        self._bindings_ready = True
        self.call_later(self.recompose)

    def compose(self) -> ComposeResult:
        self._showing = shown_keys(self.screen) if self._bindings_ready else None
        yield from super().compose()
