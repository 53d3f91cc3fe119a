"""Small screens: the key guide, the about page with the safety caution, and a yes/no question."""

from __future__ import annotations

import textwrap

from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Vertical, VerticalScroll
from textual.screen import ModalScreen
from textual.widgets import Static

from gaugewalk.tui.app.keys import bindings_for, guide_rows
from gaugewalk.tui.app.plain import escape

ABOUT_TEXT = (
    "gaugewalk records a site walk of electrical runs and gives back, for each run, the conductor "
    "size, voltage drop for the run and from the service, EGC, raceway size, and the footage of "
    "the whole job.\n\n"
    "Tables: NEC (NFPA 70) 2023 Table 310.16, Chapter 9 Tables 1, 4, 5, 8 and 9, Table 250.122, "
    "240.6(A). The 3% and 5% drop targets are the informational notes to 210.19 and 215.2."
)


class KeyGuideScreen(ModalScreen[None]):
    """Every key, by place, generated from the same table as the footer."""

    BINDINGS = bindings_for("info") + [Binding("f1", "dismiss", show=False)]

    def compose(self) -> ComposeResult:
        lines = ["[b]Key guide[/b]   (Esc closes)", ""]
        for title, rows in guide_rows():
            lines.append(f"[b u]{escape(title)}[/]")
            for key, text in rows:
                wrapped = textwrap.wrap(text, 58) or [""]
                lines.append(f"  [b]{escape(key):<9}[/b] {escape(wrapped[0])}")
                lines.extend(f"{'':12}{escape(more)}" for more in wrapped[1:])
            lines.append("")
        lines.append("Mouse: click a run to move to it, double-click to edit.")
        with VerticalScroll(id="guide-box", classes="info-box"):
            yield Static("\n".join(lines), id="guide-text")

    def action_dismiss(self, result=None) -> None:  # type: ignore[override]
        self.dismiss(None)


class AboutScreen(ModalScreen[None]):
    """What gaugewalk is, the tables it follows, and the safety caution."""

    BINDINGS = bindings_for("info") + [Binding("enter,f2", "dismiss", show=False)]

    def __init__(self, first_start: bool = False) -> None:
        super().__init__()
        self.first_start = first_start

    def compose(self) -> ComposeResult:
        # the command line's module (argparse) loads when the caution is shown, not at the start
        from gaugewalk.tui.cli.main import CAUTION

        head = "Welcome to gaugewalk" if self.first_start else "About gaugewalk"
        with Vertical(id="about-box", classes="info-box"):
            yield Static(f"[b]{head}[/b]", id="about-head")
            yield Static(f"[b]⚠ CAUTION[/b]  {escape(CAUTION)}", id="about-caution")
            yield Static(escape(ABOUT_TEXT), id="about-text")
            yield Static("Enter or Esc to continue · F1 lists every key", id="about-foot")

    def action_dismiss(self, result=None) -> None:  # type: ignore[override]
        self.dismiss(None)


class AskScreen(ModalScreen[bool]):
    """A yes/no question answered with y or n (Enter means the safe answer given)."""

    BINDINGS = bindings_for("ask")

    def __init__(self, question: str, yes: str = "yes", no: str = "no", enter_means: bool = False) -> None:
        super().__init__()
        self.question = question
        self.yes = yes
        self.no = no
        self.enter_means = enter_means

    def compose(self) -> ComposeResult:
        with Vertical(id="ask-box", classes="info-box"):
            yield Static(escape(self.question), id="ask-question")
            default = "y" if self.enter_means else "n"
            yield Static(
                f"[b]y[/b] {escape(self.yes)}    [b]n[/b] {escape(self.no)}    (Enter: {default})",
                id="ask-keys",
            )

    def key_enter(self) -> None:
        self.dismiss(self.enter_means)

    def action_answer(self, value: bool) -> None:
        self.dismiss(value)
