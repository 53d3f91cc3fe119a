"""The run card: record or edit one run at walking pace, with the answer live beside it.

The form itself (fields, what is filled in, every check, the run and its live answer) is
``gaugewalk.model.session.card_form``; this screen lays it out, takes the keys (in order, see
``gaugewalk.tui.app.keyorder``) and shows the result. Enter stores the run and starts the
next one; a run with an invalid field is not stored.
"""

from __future__ import annotations

import asyncio
from datetime import date

from textual import events, on
from textual.app import ComposeResult
from textual.containers import Horizontal, Vertical
from textual.geometry import Size
from textual.screen import Screen
from textual.suggester import Suggester
from textual.widget import Widget
from textual.widgets import Input, Label, Static

from gaugewalk.model.session.card_form import (
    FIELD_KEYS,
    FIELDS,
    FIRST_MORE,
    LOAD_KEYS,
    MAIN_KEYS,
    CardCheck,
    CardForm,
    choices,
    complete,
    label,
    placeholder,
    shown,
)
from gaugewalk.model.session.card_source import GRAMMAR as SOURCE_GRAMMAR
from gaugewalk.model.session.session import WalkSession
from gaugewalk.tui.app.keyorder import TypedInOrder
from gaugewalk.tui.app.keys import bindings_for
from gaugewalk.tui.app.plain import escape
from gaugewalk.tui.app.sheet.rows import size_text
from gaugewalk.tui.app.widgets.keyfooter import KeyFooter
from gaugewalk.tui.app.widgets.titleline import TitleLine


class CardInput(Input):
    """A card field. Moving into it selects its text (so typing replaces what the card
    proposed) when the focus moves, not when its Focus event arrives (``keyorder``)."""

    # its size is fixed (``.card-input`` in app.tcss): no scrollbar comes and goes as its text
    # grows past its width, which would lay the whole card out again
    DEFAULT_CSS = "CardInput { overflow: hidden hidden; }"

    def __init__(self, *args, **kwargs) -> None:
        super().__init__(*args, select_on_focus=False, **kwargs)

    def _watch_value(self, value: str) -> None:
        """As ``Input`` does, less the layout pass over the whole card it asks for whenever the
        width of its text changes (its scrolling width, ``virtual_size``): a card field's size is
        fixed (``.card-input`` in app.tcss), so that pass would only clamp the field's own
        scrolling, done here (``_scroll_update``, as that pass does for a scrolling widget). It
        was most of a typed key's cost, and of every open of the card for another run."""
        width = Size(self.content_width, 1)
        if self.virtual_size != width:
            self.set_reactive(Widget.virtual_size, width)
            self._scroll_update(width)
        super()._watch_value(value)   # its virtual size already set: no layout asked for

    def show_text(self, value: str) -> None:
        """Put in a text the card filled in itself (not typed): no completion is offered for it
        (one is as the person types), so an open of the card does not gather the names of every
        run of the walk (a few milliseconds at thousands of runs) to complete what it filled in."""
        suggester, self.suggester = self.suggester, None
        try:
            self.value = value
        finally:
            self.suggester = suggester


class FieldSuggest(Suggester):
    """The completion a card field shows: the first of what it completes from that starts
    with its text (any case), the same one Tab takes (``RunCard.take_completion``)."""

    def __init__(self, card: "RunCard", key: str) -> None:
        super().__init__(use_cache=False, case_sensitive=False)   # the lists change per open
        self._card = card
        self._key = key

    async def get_suggestion(self, value: str) -> str | None:
        return complete(value, self._card.completions(self._key))


class Note(Widget):
    """Markup text of a fixed-size box: changing it repaints the box only (no layout pass,
    which would cost a few milliseconds on every keystroke)."""

    def __init__(self, text: str = "", **kwargs) -> None:
        super().__init__(**kwargs)
        self._text = text

    def update(self, text: str) -> None:
        if text != self._text:
            self._text = text
            self.refresh()

    def render(self) -> str:
        return self._text


class RunCard(TypedInOrder, Screen):
    """Record a new run (``run_id`` None) or edit one.

    One card serves a walk screen for every run it opens (``open_for`` before each push):
    its widgets are built once, ahead of the first open while the app waits for a key
    (``build_ahead``) or else on the first open, and each open only fills them in again, which
    costs a fraction of building the screen anew."""

    BINDINGS = bindings_for("card")

    def __init__(self, session: WalkSession, run_id: str | None = None) -> None:
        super().__init__()
        self.session = session
        # what the widgets show now, so an unchanged text costs no repaint (kept across opens)
        self._hints: dict[str, tuple[str, bool]] = {}
        self._answer_text = ""
        self._said: tuple[str, bool] | None = None
        self._built = False   # mounted once: a later open fills the widgets in on resume
        self._restyle = False  # the theme changed since the card was last shown
        self._rehearsal = 0          # the next step of ``rehearse``
        self._rehearsed = False      # laid out and drawn once (ahead, or by an open)
        self.open_for(run_id)

    def open_for(self, run_id: str | None) -> None:
        """Make this card a fresh one for ``run_id`` (None: a new run), to be pushed next: keys
        typed meanwhile wait (``typing_ready``) until its fields are filled in and focused."""
        self.run_id = run_id
        self.form = CardForm(self.session, run_id)
        self.checked = CardCheck()
        self._checked_for: tuple | None = None   # what ``checked`` was made from
        self.stored: list[str] = []
        self._seen: dict[str, str] = {}  # each field's text as the card last handled it
        self._sticky: str | None = None
        self._last_main = "to"
        self._choices: dict[str, list[str]] | None = None   # ``completions``, once asked for
        self._opening = True
        self.typing_ready.clear()

    @property
    def errors(self) -> dict[str, str]:
        return self.checked.errors

    @property
    def soft(self) -> set[str]:
        return self.checked.soft

    # ----- layout -----------------------------------------------------------------------
    def compose(self) -> ComposeResult:
        yield TitleLine()
        keys = set(choices(self.session))   # the fields that complete from a list
        with Horizontal(id="card-body"):
            with Vertical(id="card-fields"):
                for f in FIELDS:
                    if f.key == FIRST_MORE:
                        yield Static("─ more (ctrl+o) ─", classes="card-rule")
                    with Horizontal(classes="card-row" + (" card-main" if f.main else ""),
                                    id=f"row-{f.key}"):
                        yield Label(f.label, classes="card-label")
                        yield CardInput(
                            placeholder=f.placeholder, id=f"f-{f.key}", compact=True,
                            suggester=FieldSuggest(self, f.key) if f.key in keys else None,
                            classes="card-input",
                        )
                        yield Note("", id=f"h-{f.key}", classes="card-hint")
            with Vertical(id="card-answer"):
                yield Note("", id="answer")
        yield Note("", id="card-msg")
        yield KeyFooter()

    def build_ahead(self) -> None:
        """Build the card's widgets now without showing it (its walk screen does this while the
        app waits for a key), so its first open only fills them in, as every later one does.
        Textual builds a screen when it is first pushed; registering it with the app is that
        same first step (``App._get_screen``), taken early. Opening the card while it is being
        built is safe: keys typed meanwhile wait for its first field (``typing_ready``)."""
        if not self.is_running and self not in self.app._registry:
            self.app._register(self.app, self)

    def rehearse(self) -> bool:
        """One step of a rehearsal of the first open while the built card is not shown, each a
        few milliseconds: lay it out for the app's size (as ``Screen._on_screen_resume`` does on
        an open), fill it in as a new card (its fields sized by that layout) and build its key
        line, lay it out again until nothing asks for a layout, and draw it, the drawing thrown
        away. That first open then finds
        its rows shown or hidden, its layout and its widgets' drawings made, as every later open
        does. Nothing is focused, typed or said; the open fills it in again for its run. True
        when there is nothing left to rehearse (done, or the card was opened meanwhile)."""
        if self._rehearsed or self.is_current:
            return True
        if not self.is_mounted:
            return False
        step = self._rehearsal
        self._rehearsal += 1
        if step == 1:
            if self.form.start() is not None:
                self._show_values()
                self.recheck()
            self.query_one(KeyFooter).show_keys_ahead()
        elif step == 0 or (step < 6 and (self._layout_required or self._layout_widgets)):
            # laid out until nothing asks for it again (a layout makes some widgets ask once
            # more, the keys of the key line as they get their size)
            self._refresh_layout(self.app.size)
            self._layout_required = False   # what was asked for until now: done
        else:
            self._compositor.render_strips()
            # Textual's update timer of a screen starts its clock when it is first resumed and
            # ticks one period (1/60 s) after that: started here, unseen (it waits paused for
            # the open), the first open is drawn on its first turn, as every later one is
            timer = self._update_timer
            timer.resume()
            timer.pause()
            self._rehearsed = True
        return self._rehearsed

    @property
    def rehearsed(self) -> bool:
        """Laid out and drawn once, by ``rehearse`` or by an open."""
        return self._rehearsed

    def on_mount(self) -> None:
        self._built = True
        self.app.theme_changed_signal.subscribe(self, self._theme_changed)
        if self.is_current:   # opened (built ahead, it is filled in when it opens: resume)
            self._start()

    def _theme_changed(self, _theme: object) -> None:
        self._restyle = True

    def on_screen_resume(self, event: events.ScreenResume) -> None:
        """Opened again (the first open starts on mount): filled in for its run. Its widgets
        keep the styles they were given unless the theme changed while it was away, so Textual
        is spared styling every widget of the card anew on each open."""
        if not self._restyle:
            event.refresh_styles = False
        self._restyle = False
        if self._built and self._opening:
            self._start()

    def completions(self, key: str) -> list[str]:
        """What field ``key`` completes from, as the walk is now: worked out once an open, on
        the first key that needs it (the names of every run take a few milliseconds to gather
        on a big walk)."""
        if self._choices is None:
            self._choices = choices(self.session)
        return self._choices.get(key, [])

    def _start(self) -> None:
        """Fill the card in for the run it was opened for and give its first field the focus
        (keys typed meanwhile are then taken, in order)."""
        self._opening = False
        self._rehearsed = True   # shown: laid out and drawn by Textual
        focus = self.form.start()
        if focus is None:  # the run to edit is gone
            self.typing_ready.set()
            self.dismiss()
            return
        self._show_values()
        if self.form.restored:
            self._sticky = "Your unstored card is back. Enter stores it; Esc keeps it for later."
        self._update_title()
        self.recheck()
        if focus == "to" and not self.form.restored:
            like = " ^r: like the last run." if self.form.last_run() is not None else ""
            self._sticky = (f"From {self.form.values['from']} (shift+tab changes it). "
                            f"Type where the run goes.{like}")
        self.start_typing(self._input(focus))

    def _input(self, key: str) -> CardInput:
        return self.query_one(f"#f-{key}", CardInput)

    def _focus_field(self, key: str) -> None:
        """Focus a field with its text selected, so typing replaces it."""
        self.move_to(self._input(key))

    def field_entered(self, field: Input) -> None:
        field.select_all()
        key = (field.id or "")[2:]
        if key in MAIN_KEYS:
            self._last_main = key  # where ctrl+o comes back to
        self._message_for_focus()

    def values(self) -> dict[str, str]:
        return dict(self.form.values)

    def _show(self, key: str, value: str) -> None:
        """Show a text the form put in a field (not typed by the person)."""
        self._seen[key] = value
        self._input(key).show_text(value)

    def _show_values(self) -> None:
        for k in FIELD_KEYS:
            self._show(k, self.form.values[k])
        self._propose_to()

    def _propose_to(self) -> None:
        """Show in the empty To what Tab takes there: the last run's name stepped on."""
        proposed = self.form.proposed_to()
        placeholder = next(f.placeholder for f in FIELDS if f.key == "to")
        self._input("to").placeholder = f"Tab: {proposed}" if proposed else placeholder

    def _update_title(self) -> None:
        if self.run_id is not None:
            self.app.sub_title = f"Run card: editing {self.run_id}"
        else:
            n = len(self.stored)
            extra = f" ({n} stored this time)" if n else ""
            self.app.sub_title = f"Run card: new run{extra}"

    # ----- live checking ----------------------------------------------------------------
    @on(Input.Changed, ".card-input")
    def _changed(self, event: Input.Changed) -> None:
        """A change made neither by a key (``field_typed`` saw those) nor by the card. One that
        arrives while the card is opened again (a late message of the last open, whose text the
        fields still hold until they are filled in) is no text for the run it opens for."""
        if self._opening:
            return
        if event.value == event.input.value:  # not a late message about text since replaced
            self.field_typed(event.input)

    def field_typed(self, field: Input) -> None:
        """A key changed ``field``: it now holds what the person typed (called at once, in the
        order of the keys, by ``keyorder``)."""
        key = (field.id or "")[2:]
        if field.value == self._seen.get(key):
            return  # the card's own change (a stored card, a completion already handled)
        self._seen[key] = field.value
        for k, value in self.form.type(key, field.value).items():
            self._show(k, value)
        if key == "from":
            self._propose_to()
        if self.run_id is None:
            self.session.keep_draft(self.form.draft())
        self._sticky = None
        self.recheck()

    def _show_fields(self) -> None:
        """Show the fields the load's kind needs (the nameplate only for a kind that reads one),
        with the hint the kind gives."""
        values = self.form.values
        for key in LOAD_KEYS:
            row = self.query_one(f"#row-{key}")
            want = shown(key, values)
            if row.display != want:
                row.display = want
            field = self._input(key)
            hint = placeholder(key, values)
            if field.placeholder != hint:
                field.placeholder = hint

    def recheck(self, store_tried: bool = False) -> None:
        """Check every field, build the run if possible, size it and show it all."""
        self._show_fields()
        checked = self.checked = self.form.check(store_tried)
        self._checked_for = self._check_inputs()
        for k in FIELD_KEYS:
            if k in checked.soft:
                shown = ("needed", False)
            elif k in checked.errors:
                shown = ("✗ " + checked.errors[k], True)
            else:
                shown = (checked.hints.get(k, ""), False)
            if self._hints.get(k) == shown:
                continue  # redrawing costs a layout pass; skip what did not change
            self._hints[k] = shown
            text, bad = shown
            hint = self.query_one(f"#h-{k}", Note)
            hint.update(escape(text))
            hint.set_class(bad, "bad")
            self._input(k).set_class(bad, "-invalid")
        self._show_answer(checked)
        self._message_for_focus()

    def _check_inputs(self) -> tuple:
        """What a check of the card depends on: its texts, the walk (``WalkSession.version``)
        and the day (a new or re-measured length is dated today)."""
        return tuple(self.form.values.items()), self.session.version, date.today()

    def _checked_clean(self) -> bool:
        """The last check found nothing wrong and nothing it depends on changed since: checking
        again, as Enter would, finds the same run sized the same (a field left empty counts as
        wrong when Enter is pressed, but a clean check has none)."""
        checked = self.checked
        return (checked.run is not None and not checked.errors
                and self._checked_for == self._check_inputs())

    def _show_answer(self, checked: CardCheck) -> None:
        run, res = checked.run, checked.result
        lines = ["[b]Answer[/b] (live)"]
        c = checked.circuit
        if c is not None:  # always in words: a circuit nobody chose never hides
            conn = checked.connection or "every hot"
            phase = " 3-phase" if c.phases == 3 else ""
            poles = f"{c.hots} pole" + ("s" if c.hots > 1 else "") + (" + neutral" if c.neutral else "")
            lines += [f"Circuit   [b]{escape(conn)}: {c.volts:g} V{phase}[/b]", f"          {poles}"]
        if run is None or res is None:
            lines.append("")
            if run is not None and checked.cannot:
                lines.append("[b]Cannot size it yet:[/b]")
                lines.append(escape(checked.cannot))
                lines.append("")
                lines.append("It can still be stored.")
            else:
                lines.append("Fill from, to, length and load;")
                lines.append("the size appears here.")
            if self.errors:
                lines.append("")
                hard = [k for k in self.errors if k not in self.soft]
                if hard:
                    lines.append(f"[b]✗ {len(hard)} field(s) to fix[/b]")
                else:
                    lines.append(f"{len(self.errors)} field(s) still needed")
        else:
            st = self.session.status(run, res)
            own, total = self.session.targets(run)
            race = f"{res.raceway_size} {res.raceway}" if res.raceway_size else f"no {res.raceway} fits"
            lines += [
                f"Size      [b]{escape(size_text(res))}[/b]",
                f"Governs   {escape(res.governed_by)}",
                f"Run drop  [b]{res.voltage_drop_pct:.2f}%[/b] (max {own:g})",
                f"From svc  [b]{res.total_drop_pct:.2f}%[/b] (max {total:g})",
                f"Amps      {res.amps:.1f} A, sized {res.design_amps:.1f}",
                *([f"Kind      {escape(res.load_kind)}: {escape(res.kind_rule)}"]
                  if res.load_kind != "general" else []),
                *([f"Start     {res.starting_drop_pct:.2f}% at {res.locked_rotor_a or 0:.0f} A"]
                  if res.starting_drop_pct is not None else []),
                *([f"Start dip {checked.dip.short} from svc"]
                  if checked.dip is not None else []),
                f"EGC       {escape(res.egc_size or 'none')}",
                f"Raceway   {escape(race)}",
                f"OCPD      {res.ocpd_a} A",
                "",
                ("[b]✓ meets its targets[/b]" if not st.flag else f"[b]{escape(st.words)}[/b]"),
            ]
            said = list(st.problems)
            if checked.dip is not None and checked.dip.problem:
                said.append(checked.dip.problem)
            for p in said[:3]:
                lines.append("• " + escape(p))
            for said in checked.taken:  # taken as given: the card could say otherwise
                lines.append("ⓘ " + escape(said))
        lines.append("")
        lines.append("[dim]Estimates for planning; see F2.[/dim]")
        text = "\n".join(lines)
        if text != self._answer_text:
            self._answer_text = text
            self.query_one("#answer", Note).update(text)

    def _message_for_focus(self) -> None:
        if self._sticky:
            self._say(self._sticky, bad=self._sticky.startswith("Not stored"))
            return
        focused = self.focused
        key = (focused.id or "")[2:] if isinstance(focused, Input) else ""
        hard = [k for k in self.errors if k not in self.soft]
        if key in self.errors and key not in self.soft:
            self._say(f"{label(key)}: {self.errors[key]}", bad=True)
        elif key == "panel" and not self.form.values["panel"].strip():
            self._say(f"{label(key)}: {SOURCE_GRAMMAR}")
        elif hard:
            k = hard[0]
            self._say(f"{len(hard)} to fix — {label(k)}: {self.errors[k]}", bad=True)
        elif self.errors:
            needed = ", ".join(label(k) for k in self.errors)
            self._say(f"Still needed: {needed}. Tab moves on; Enter stores when all is there.")
        elif self.run_id is not None:
            self._say("Enter stores the change (ctrl+z on the walk screen undoes it); Esc leaves it.")
        else:
            self._say("Enter stores this run and starts the next.")

    def _say(self, text: str, bad: bool = False) -> None:
        if self._said == (text, bad):
            return
        self._said = (text, bad)
        msg = self.query_one("#card-msg", Note)
        msg.update(("✗ " if bad else "") + escape(text))
        msg.set_class(bad, "bad")

    def on_descendant_focus(self) -> None:
        if self.is_mounted:
            self._message_for_focus()

    # ----- keys -------------------------------------------------------------------------
    def take_completion(self, field: Input) -> None:
        """Accept the completion shown in ``field`` (a source or a name already in the walk),
        worked out now from the same list the field suggests from (the field's own suggestion
        arrives later, and may not have arrived when Tab is typed right behind)."""
        key = (field.id or "")[2:]
        if key == "to" and not field.value:
            suggestion = self.form.proposed_to()
        else:
            suggestion = complete(field.value, self.completions(key))
        if suggestion and field.cursor_at_end and suggestion != field.value:
            field.value = suggestion
            field.cursor_position = len(suggestion)
            self.field_typed(field)

    def action_next_field(self, take_completion: bool = True) -> None:
        focused = self.focused
        if take_completion and isinstance(focused, Input):
            self.take_completion(focused)
        self.focus_next()

    def action_prev_field(self) -> None:
        self.focus_previous()

    def action_toggle_more(self) -> None:
        """ctrl+o: from a main field to the other fields, and back to the main field left."""
        focused = self.focused
        key = (focused.id or "")[2:] if isinstance(focused, Input) else ""
        self._focus_field("panel" if key in MAIN_KEYS else self._last_main)

    async def action_store(self) -> None:
        if self.session.busy:
            self._sticky = "Not stored yet — the walk is still being sized; press Enter again in a moment."
            self._message_for_focus()
            return
        self._sticky = None
        if not self._checked_clean():
            self.recheck(store_tried=True)
        checked = self.checked
        if checked.errors or checked.run is None:
            first = next(iter(checked.errors), None)
            if first:
                self._sticky = f"Not stored — {label(first)}: {checked.errors[first]}"
                self._focus_field(first)
                self._message_for_focus()
            return
        run = checked.run
        refusal = self.session.put_run(run, replaces=self.run_id, new_source=checked.new_source)
        if refusal:
            self._sticky = f"Not stored — {refusal}"
            self._message_for_focus()
            return
        self.session.keep_draft(None)
        # the event loop runs once between the store (the recompute) and what shows it (the
        # walk screen's rows, or this card again), so a frame waiting meanwhile is drawn; the
        # keys typed behind Enter wait in the app's queue until this action is done
        await asyncio.sleep(0)
        state = self.session.state
        if self.run_id is None:
            # the card stays: its title says how the save went (a card that closes leaves that
            # to the walk screen, which sets the title as it comes back: one repaint, not two)
            self.app.refresh_title()
        if self.session.saves_behind:
            pass  # the app says how the save went once it is written (WalkApp.SavedBehind)
        elif not state.saved:
            self.notify(f"Stored {run.id} but NOT SAVED: {state.message}", severity="error", timeout=10)
        elif state.notice:
            self.notify(str(state.notice), timeout=10)
        if self.run_id is not None:
            self.notify(f"Stored {run.id}.")
            self.dismiss()
            return
        self.stored.append(run.id)
        next_from = self.form.next_card(run, checked.new_source)
        self._show_values()
        self._update_title()
        self._sticky = (
            f"Stored {run.id} ({run.from_} → {run.to}). Next from {next_from}; "
            "^r: like it."
        )
        self.recheck()
        self._focus_field("to")

    def action_like_last(self) -> None:
        """ctrl+r: this new card like the last run, its To stepped on, typing on in Length."""
        run = self.form.last_run() if self.run_id is None else None
        if run is None:
            self._sticky = ("ctrl+r makes a new run like the last one; "
                            + ("this card edits a run." if self.run_id else "there is none yet."))
            self._message_for_focus()
            return
        focus = self.form.like(run)
        self._show_values()
        self.session.keep_draft(self.form.draft())
        to = self.form.values["to"]
        self._sticky = (f"Like {run.id}: to {to}. Type its length; Enter stores it."
                        if to != run.to else
                        f"Like {run.id}, to the same name (shift+tab to change it). Type its "
                        "length; Enter stores it.")
        self.recheck()
        self._focus_field(focus)

    def action_close_card(self) -> None:
        if self.run_id is None:
            self.session.keep_draft(self.form.draft())
            if self.session.draft:
                self.notify("The unstored run is kept: n brings it back.")
        self.app.refresh_title()
        self.dismiss()


