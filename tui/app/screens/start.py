"""The first screen when gaugewalk is started without a file: recent walks, or a new one; and
the questions a new walk starts with. Both take keys in order, at once (``keyorder``): a burst
that picks "new walk", names the file and answers the questions lands as typed."""

from __future__ import annotations

from pathlib import Path

from textual import on
from textual.app import ComposeResult
from textual.containers import Vertical
from textual.screen import Screen
from textual.widgets import Footer, Header, Input, OptionList, Static
from textual.widgets.option_list import Option

from gaugewalk.tui.app.keyorder import TypedInOrder
from gaugewalk.tui.app.keys import bindings_for
from gaugewalk.tui.app.plain import escape

NEW = "\x00new"


class StartScreen(TypedInOrder, Screen[tuple[str, str] | None]):
    """Pick a recent walk or start a new one. Dismisses with ("open", path), ("new", path) or
    None (quit)."""

    BINDINGS = bindings_for("start")

    def __init__(self, recent: list[str]) -> None:
        super().__init__()
        self.recent = recent

    def compose(self) -> ComposeResult:
        yield Header()
        with Vertical(id="start-box"):
            yield Static("[b]Open a walk[/b]  ↑↓ and Enter · n starts a new walk · Esc quits", id="start-head")
            options = [Option("＋ Start a new walk…", id=NEW)]
            for p in self.recent:
                path = Path(p)
                mark = "" if path.exists() else "  (missing)"
                options.append(Option(f"{escape(path.name)}  [dim]{escape(str(path.parent))}[/dim]{mark}", id=p))
            yield OptionList(*options, id="start-list")
            yield Static("", id="start-new-label")
            yield Input(placeholder="file for the new walk, e.g. walks/shop-3.toml", id="start-path",
                        compact=True, select_on_focus=False)
            yield Static("", id="start-msg")
        yield Footer()

    def on_mount(self) -> None:
        self.query_one("#start-path").display = False
        choices = self.query_one("#start-list", OptionList)
        if self.recent:  # Enter reopens the walk used last; n still starts a new one
            choices.highlighted = 1
        self.set_focus(choices)

    @on(OptionList.OptionSelected)
    def _chosen(self, event: OptionList.OptionSelected) -> None:
        """A click on a walk (Enter is ``action_go``, at once)."""
        self._open(event.option.id)

    def action_go(self) -> None:
        """Enter: create the file named in the box, else open what the list has picked."""
        inp = self.query_one("#start-path", Input)
        if self.focused is inp:
            self._new_path(inp.value)
            return
        choices = self.query_one("#start-list", OptionList)
        if choices.highlighted is not None:
            self._open(choices.get_option_at_index(choices.highlighted).id)

    def _open(self, oid: str | None) -> None:
        if oid == NEW:
            self.action_new()
            return
        if oid and not Path(oid).exists():
            self.query_one("#start-msg", Static).update(f"✗ {escape(oid)} is not there any more.")
            return
        self.dismiss(("open", oid))

    def action_new(self) -> None:
        self.query_one("#start-new-label", Static).update("New walk file (Enter creates it, Esc goes back):")
        inp = self.query_one("#start-path", Input)
        inp.display = True
        self.start_typing(inp)

    def _new_path(self, value: str) -> None:
        text = value.strip()
        msg = self.query_one("#start-msg", Static)
        if not text:
            msg.update("✗ type a file name for the new walk")
            return
        path = Path(text).expanduser()
        if path.suffix == "":
            path = path.with_suffix(".toml")
        if path.exists():
            msg.update(f"✗ {escape(str(path))} already exists; pick it from the list or give another name")
            return
        if not path.parent.exists():
            msg.update(f"✗ the folder {escape(str(path.parent))} does not exist")
            return
        self.dismiss(("new", str(path)))

    def action_leave(self) -> None:
        inp = self.query_one("#start-path", Input)
        if inp.display:
            inp.display = False
            self.query_one("#start-new-label", Static).update("")
            self.set_focus(self.query_one("#start-list"))
            return
        self.dismiss(None)


class NewWalkScreen(TypedInOrder, Screen[dict | None]):
    """Start a walk at ``path``: its name and the service it starts from. Dismisses with the
    answers, or None when the person would rather not create it."""

    BINDINGS = bindings_for("newwalk")

    def __init__(self, path: str, missing: bool = False) -> None:
        super().__init__()
        self.path = path
        self.missing = missing

    def compose(self) -> ComposeResult:
        from gaugewalk.model.engine.circuits import SYSTEMS

        yield Header()
        with Vertical(id="start-box"):
            head = (
                f"There is no walk at {escape(self.path)}. Start a new walk there?"
                if self.missing else f"New walk: {escape(self.path)}"
            )
            yield Static(f"[b]{head}[/b]", id="newwalk-head")
            yield Static("Job name")
            yield Input(Path(self.path).stem, id="nw-name", compact=True, select_on_focus=False)
            yield Static("Service id (runs start from it)")
            yield Input("SVC", id="nw-service", compact=True, select_on_focus=False)
            yield Static("Service system: " + escape(", ".join(SYSTEMS)))
            yield Input("208Y/120V 3ph 4w", id="nw-system", compact=True, select_on_focus=False)
            yield Static("Enter creates the walk · Esc: don't create", id="newwalk-foot")
            yield Static("", id="start-msg")
        yield Footer()

    def on_mount(self) -> None:
        self.start_typing(self.query_one("#nw-name", Input))

    def field_entered(self, field: Input) -> None:
        """Each answer is a proposal: moving into it selects it, so typing replaces it."""
        field.select_all()

    def action_create(self) -> None:
        """Enter: create the walk with these answers, or say which one is wrong."""
        from gaugewalk.model.engine.circuits import CircuitError, parse_system
        from gaugewalk.model.walk.job import Source

        msg = self.query_one("#start-msg", Static)
        try:
            system = parse_system(self.query_one("#nw-system", Input).value)
        except CircuitError as exc:
            msg.update("✗ service system: " + escape(str(exc)))
            self.move_to(self.query_one("#nw-system", Input))
            return
        service = self.query_one("#nw-service", Input).value.strip()
        try:
            Source(id=service, kind="service", system=system)
        except Exception as exc:
            errs = getattr(exc, "errors", None)
            text = errs()[0]["msg"] if callable(errs) else str(exc)
            msg.update("✗ service id: " + escape(str(text).removeprefix("Value error, ")))
            self.move_to(self.query_one("#nw-service", Input))
            return
        self.dismiss({
            "name": self.query_one("#nw-name", Input).value.strip(),
            "service_id": service,
            "service_system": system,
        })

    def action_leave(self) -> None:
        self.dismiss(None)
