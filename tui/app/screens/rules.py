"""The rules a run was sized by: each code section applied, in order, and what was taken as given
where the walk does not say (``gaugewalk.model.report.content.rules_applied``, the list the
report prints too)."""

from __future__ import annotations

import textwrap

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import VerticalScroll
from textual.screen import ModalScreen
from textual.widgets import Static

from gaugewalk.model.session.session import WalkSession
from gaugewalk.tui.app.keys import bindings_for
from gaugewalk.tui.app.plain import escape

WIDTH = 70
"""Columns the sentences are wrapped to (the box is ``.info-box``, 76 wide)."""


def rules_text(session: WalkSession, run_id: str) -> str:
    """The screen's text (Rich markup; everything from the walk escaped)."""
    from gaugewalk.model.report.content import rules_applied

    run = session.job.run(run_id)
    if run is None:
        return f"Run {escape(run_id)} is no longer in the walk."
    lines = [f"[b]Why: {escape(run.id)}[/b]  {escape(run.from_)} → {escape(run.to)}   (Esc closes)",
             ""]
    res = session.result_for(run.id)
    if res is None:
        st = session.status(run)
        lines.append("Not sized: " + escape("; ".join(st.problems) or "the walk is still sizing"))
    else:
        st = session.status(run, res)
        for p in st.problems:
            lines += _bullet("✗ ", p)
        if st.problems:
            lines.append("")
        feeder = session.result.feeders.get(run.id) if session.result is not None else None
        more = session.result.walk_notes(run.id) if session.result is not None else ()
        for note in rules_applied(res, feeder, more):
            lines += _bullet("• ", note)
    lines += ["", "[dim]Estimates for planning; see F2.[/dim]"]
    return "\n".join(lines)


def _bullet(mark: str, text: str) -> list[str]:
    wrapped = textwrap.wrap(text, WIDTH - len(mark)) or [""]
    return [escape(mark + wrapped[0])] + [escape(" " * len(mark) + more) for more in wrapped[1:]]


class RulesScreen(ModalScreen[None]):
    """One run's rules, scrolled with the arrows or page keys; Esc, q or w closes."""

    BINDINGS = bindings_for("info") + [Binding("w", "dismiss", show=False)]

    def __init__(self, session: WalkSession, run_id: str) -> None:
        super().__init__()
        self.session = session
        self.run_id = run_id

    def compose(self) -> ComposeResult:
        with VerticalScroll(id="rules-box", classes="info-box"):
            yield Static(rules_text(self.session, self.run_id), id="rules-text")

    def action_dismiss(self, result=None) -> None:  # type: ignore[override]
        self.dismiss(None)
