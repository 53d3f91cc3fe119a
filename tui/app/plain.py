"""The app's side of the one rule for outside text (``gaugewalk.model.walk.plain_text``): text
from a walk, a lock file, a file name or the system is shown as text, never as markup, a link or
an action, and its control characters are shown escaped.

- ``escape(text)``: the text to put inside markup of our own (``f"[b]{escape(name)}[/b]"``):
  control characters made visible, every ``[`` escaped. (Textual's own ``escape`` leaves
  ``[$accent]``, ``[B]`` and ``[ b]`` as markup; escaping every bracket leaves none, which a test
  checks over random text.)
- ``plain(text)``: a ``Content`` that is never read as markup, for a widget or a title.

Notifications are plain by construction: ``WalkApp.notify`` passes every message through
``shown_lines`` with ``markup=False``.
"""

from __future__ import annotations

from textual.content import Content

from gaugewalk.model.walk.plain_text import shown_lines


def escape(text: str) -> str:
    """``text`` for a markup string: control characters escaped, no ``[`` left to open a tag.
    A backslash at the end would escape the tag written after it: a zero-width space (shown as
    nothing) keeps them apart."""
    out = shown_lines(str(text)).replace("[", "\\[")
    return out + "\u200b" if out.endswith("\\") else out


def plain(text: str) -> Content:
    """``text`` as content that is never markup, its control characters escaped."""
    return Content(shown_lines(str(text)))
