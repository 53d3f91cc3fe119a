"""The run card: record or edit one run at walking pace, with the answer live beside it.

Fields come in walking order (from, to, length, load); the rest are filled from the job defaults
and from the last run from the same source, and can be reached with Tab or ctrl+o. Every keystroke
re-checks the field (reason shown at the field) and re-sizes the run. Enter stores the run and
starts the next one; a run with an invalid field is not stored.
"""

from __future__ import annotations

from dataclasses import dataclass

from rich.markup import escape
from textual import on
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Horizontal, Vertical
from textual.screen import Screen
from textual.suggester import SuggestFromList
from textual.widget import Widget
from textual.widgets import Footer, Header, Input, Label, Static

from gaugewalk.model.walk.job import CONNECTION_NAMES, Load, Run, Source
from gaugewalk.model.engine.lengths import LengthError, parse_length
from gaugewalk.model.engine.loads import LoadError, parse_load
from gaugewalk.tui.app.keyorder import TypedInOrder
from gaugewalk.tui.app.keys import KEYS, bindings_for
from gaugewalk.model.session.session import WalkSession, fmt_ft
from gaugewalk.tui.app.sheet.rows import size_text


@dataclass(frozen=True)
class Field:
    key: str
    label: str
    placeholder: str
    main: bool = False


FIELDS: tuple[Field, ...] = (
    Field("from", "From", "source id", True),
    Field("to", "To", "load or panel", True),
    Field("length", "Length", "e.g. 85+12+2*6", True),
    Field("load", "Load", "16A 1.8kVA 5kW", True),
    Field("panel", "New panel", "system; xfmr …"),
    Field("circuit", "Circuit", "LN LL LLN MW 3P"),
    Field("continuous", "Continuous", "yes / no"),
    Field("spread", "Spread", "no: load at the end"),
    Field("sets", "Sets", "1"),
    Field("size", "Size", "blank: picked"),
    Field("material", "Material", "cu / al"),
    Field("raceway", "Raceway", "EMT, PVC-40, ..."),
    Field("id", "Run id", ""),
    Field("notes", "Notes", ""),
)
FIELD_KEYS = tuple(f.key for f in FIELDS)
COPIED_FROM_PREVIOUS = ("circuit", "continuous", "material", "raceway")
YES = {"y", "yes", "true", "1", "on"}
NO = {"", "n", "no", "false", "0", "off"}


def _yes_no(text: str) -> bool | None:
    t = text.strip().lower()
    if t in YES:
        return True
    if t in NO:
        return False
    return None


def run_to_fields(run: Run) -> dict[str, str]:
    """The card's texts for an existing run."""
    load = ""
    if run.load is not None:
        load = f"{run.load.value:g}{run.load.unit}"
        if run.load.pf is not None:
            load += f" pf{run.load.pf:g}"
    return {
        "from": run.from_,
        "to": run.to,
        "length": run.length,
        "load": load,
        "panel": "",
        "circuit": run.connection or "",
        "continuous": "yes" if run.continuous else "no",
        "spread": "yes" if run.distributed else "no",
        "sets": str(run.sets),
        "size": run.size or "",
        "material": run.material or "",
        "raceway": run.raceway or "",
        "id": run.id,
        "notes": run.notes,
    }


SOURCE_WORDS = {
    "panel": "panel", "transformer": "transformer", "xfmr": "transformer", "xf": "transformer",
    "switchboard": "switchboard", "swbd": "switchboard",
}


def new_source_from(source_id: str, text: str) -> Source:
    """A source declared from the run card: ``208Y/120``, ``xfmr 208Y/120 75kVA``,
    ``switchboard 480Y/277``. A transformer's system is its secondary. Raises ValueError with a
    sentence."""
    from gaugewalk.model.engine.circuits import CircuitError, parse_system

    words = text.split()
    kind = "panel"
    if words and words[0].lower() in SOURCE_WORDS:
        kind = SOURCE_WORDS[words.pop(0).lower()]
    kva = None
    rest = []
    for w in words:
        low = w.lower()
        if low.endswith("kva") and low[:-3].replace(".", "", 1).isdigit():
            kva = float(low[:-3])
        else:
            rest.append(w)
    if not rest:
        raise ValueError("give the new source's system, e.g. 208Y/120 (xfmr 208Y/120 for a transformer)")
    try:
        system = parse_system(" ".join(rest))
    except CircuitError as exc:
        raise ValueError(str(exc)) from None
    try:
        return Source(id=source_id, kind=kind, system=system, kva=kva)
    except Exception as exc:
        raise ValueError(_first_error(exc)) from None


def parse_load_text(text: str) -> tuple[float, str, float | None]:
    """``16A``, ``5kW pf0.9`` -> (value, unit, pf or None). Raises LoadError."""
    t = text.strip()
    pf = None
    low = t.lower()
    if " pf" in low:
        i = low.rindex(" pf")
        pf_text = t[i + 3:].strip().lstrip("=").strip()
        t = t[:i].strip()
        try:
            pf = float(pf_text)
        except ValueError:
            raise LoadError(f"'pf{pf_text}' is not a power factor; write e.g. pf0.9") from None
        if not 0 < pf <= 1:
            raise LoadError("a power factor is above 0 and at most 1")
    value, unit = parse_load(t)
    return value, unit, pf


class CardInput(Input):
    """A card field. Moving into it selects its text (so typing replaces what the card
    proposed) when the focus moves, not when its Focus event arrives (``keyorder``)."""

    def __init__(self, *args, **kwargs) -> None:
        super().__init__(*args, select_on_focus=False, **kwargs)


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
    """Record a new run (``run_id`` None) or edit one."""

    BINDINGS = bindings_for("card")

    def __init__(self, session: WalkSession, run_id: str | None = None) -> None:
        super().__init__()
        self.session = session
        self.run_id = run_id
        self.errors: dict[str, str] = {}
        self.touched: set[str] = set()
        self.stored: list[str] = []
        self._auto: dict[str, str] = {}
        self._seen: dict[str, str] = {}  # each field's text as the card last handled it
        self._candidate: Run | None = None
        self.soft: set[str] = set()
        self._hints: dict[str, tuple[str, bool]] = {}
        self._answer_text = ""
        self._said: tuple[str, bool] | None = None
        self._store_tried = False
        self._sticky: str | None = None
        self._cannot: str | None = None
        self._new_source: Source | None = None

    # ----- layout -----------------------------------------------------------------------
    def compose(self) -> ComposeResult:
        yield Header()
        self._choices = {
            "from": self.session.source_ids(),
            "to": self.session.known_names(),
            "circuit": list(CONNECTION_NAMES),
            "material": ["cu", "al"],
        }
        with Horizontal(id="card-body"):
            with Vertical(id="card-fields"):
                for f in FIELDS:
                    if f.key == "panel":
                        yield Static("─ more (ctrl+o) ─", classes="card-rule")
                    with Horizontal(classes="card-row" + (" card-main" if f.main else "")):
                        yield Label(f.label, classes="card-label")
                        choices = self._choices.get(f.key)
                        suggester = SuggestFromList(choices, case_sensitive=False) if choices else None
                        yield CardInput(
                            placeholder=f.placeholder, id=f"f-{f.key}", compact=True,
                            suggester=suggester, classes="card-input",
                        )
                        yield Note("", id=f"h-{f.key}", classes="card-hint")
            with Vertical(id="card-answer"):
                yield Note("", id="answer")
        yield Note("", id="card-msg")
        yield Footer()

    def on_mount(self) -> None:
        self._fill_start()

    def _input(self, key: str) -> Input:
        return self.query_one(f"#f-{key}", Input)

    def _focus_field(self, key: str) -> None:
        """Focus a field with its text selected, so typing replaces it."""
        self.move_to(self._input(key))

    def field_entered(self, field: Input) -> None:
        field.select_all()
        self._message_for_focus()

    def values(self) -> dict[str, str]:
        return {k: self._input(k).value for k in FIELD_KEYS}

    def _set(self, key: str, value: str) -> None:
        """Put a value in a field on the person's behalf (not counted as typed)."""
        self._auto[key] = value
        self._seen[key] = value
        self._input(key).value = value

    def _set_values(self, values: dict[str, str]) -> None:
        for k in FIELD_KEYS:
            self._set(k, values.get(k, ""))

    def _fill_start(self) -> None:
        s = self.session
        if self.run_id is not None:
            run = s.job.run(self.run_id)
            if run is None:
                self.dismiss()
                return
            self._set_values(run_to_fields(run))
            focus = "length"
        elif s.draft:
            self._set_values(s.draft)
            self.touched = {k for k, v in s.draft.items() if v}
            focus = "from"
            self._sticky = "Your unstored card is back. Enter stores it; Esc keeps it for later."
        else:
            self._set_values(self._fresh_values(None))
            focus = "to" if s.job.source(self._input("from").value) is not None else "from"
        self._update_title()
        self.recheck()
        if focus == "to":
            self._sticky = f"From {self._input('from').value} (shift+tab to change it). Type where the run goes."
        self.start_typing(self._input(focus))

    def _fresh_values(self, source_id: str | None) -> dict[str, str]:
        s = self.session
        prev = s.previous_like(source_id)
        values = {k: "" for k in FIELD_KEYS}
        values["from"] = source_id or (prev.from_ if prev else (s.source_ids()[:1] or [""])[0])
        same = s.previous_like(values["from"])
        if same is not None and same.from_ == values["from"] and not s.job.is_feeder(same):
            copied = run_to_fields(same)
            for k in COPIED_FROM_PREVIOUS:
                values[k] = copied[k]
        values["continuous"] = values["continuous"] or "no"
        values["spread"] = "no"
        values["sets"] = "1"
        values["id"] = self._next_id(same if same is not None and same.from_ == values["from"] else None)
        return values

    def _next_id(self, like: Run | None, feeder: bool = False) -> str:
        """The next free id in the style of the last run from the same source (``LP1-7`` ->
        ``LP1-8``), else ``R`` and a number (``F`` and a number for a feeder)."""
        import re

        job = self.session.job
        if feeder:
            return job.next_run_id("F")
        if like is not None:
            m = re.match(r"^(.*?)(\d+)$", like.id)
            if m and m.group(1):
                return job.next_run_id(m.group(1))
        return job.next_run_id("R")

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
        """A change made neither by a key (``field_typed`` saw those) nor by the card."""
        if event.value == event.input.value:  # not a late message about text since replaced
            self.field_typed(event.input)

    def field_typed(self, field: Input) -> None:
        """A key changed ``field``: it now holds what the person typed (called at once, in the
        order of the keys, by ``keyorder``)."""
        key = (field.id or "")[2:]
        if field.value == self._seen.get(key):
            return  # the card's own change (a stored card, a completion already handled)
        self._seen[key] = field.value
        self._auto.pop(key, None)
        self.touched.add(key)
        if self.run_id is None:
            self.session.keep_draft(self.values())
        self._sticky = None
        if key in ("from", "to", "panel") and self.run_id is None:
            self._auto_fill()
        self.recheck()

    def _auto_fill(self) -> None:
        """Fields nobody typed in follow the run: a feeder takes every hot and the neutral its
        source offers (circuit blank); a branch copies the last branch from the same source."""
        s = self.session
        v = self.values()
        source_id = v["from"].strip()
        feeder = s.job.source(v["to"].strip()) is not None or bool(v["panel"].strip())
        copied = {k: "" for k in COPIED_FROM_PREVIOUS}
        copied["continuous"] = "no"
        same = s.previous_like(source_id) if s.job.source(source_id) is not None else None
        if same is not None and same.from_ == source_id and not s.job.is_feeder(same):
            copied.update({k: run_to_fields(same)[k] for k in COPIED_FROM_PREVIOUS})
        if feeder:
            copied["circuit"] = ""
        like = same if same is not None and same.from_ == source_id else None
        copied["id"] = self._next_id(like, feeder)
        for k in (*COPIED_FROM_PREVIOUS, "id"):
            if k not in self.touched and self._input(k).value != copied[k]:
                self._set(k, copied[k])

    def recheck(self) -> None:
        """Check every field, build the run if possible and size it."""
        v = self.values()
        errors: dict[str, str] = {}
        hints: dict[str, str] = {}
        s = self.session
        job = s.job

        src = v["from"].strip()
        if not src:
            errors["from"] = "give the source the run starts at"
        elif job.source(src) is None:
            known = ", ".join(s.source_ids()[:8]) or "none yet"
            errors["from"] = f"no source '{src}' in this walk (sources: {known})"
        else:
            source = job.source(src)
            hints["from"] = f"{source.kind} {source.system.split()[0]}"

        to = v["to"].strip()
        new_panel_system = v["panel"].strip()
        dest = job.source(to) if to else None
        if not to:
            errors["to"] = "name the load or the panel the run goes to"
        elif dest is not None:
            hints["to"] = f"feeds {dest.kind} {dest.id}"
        else:
            hints["to"] = "a load; panel? ^o" if not new_panel_system else "new source"

        feet = None
        try:
            feet = parse_length(v["length"])
            hints["length"] = f"= {fmt_ft(feet)} ft"
        except LengthError as exc:
            errors["length"] = str(exc) if v["length"].strip() else "type the length along the route"

        load = None
        if v["load"].strip():
            try:
                value, unit, pf = parse_load_text(v["load"])
                load = Load(value=value, unit=unit, pf=pf)
            except LoadError as exc:
                errors["load"] = str(exc)
            except Exception as exc:  # pydantic range check
                errors["load"] = _first_error(exc)
        elif dest is None and not new_panel_system:
            errors["load"] = "a branch run needs its load (16A, 1.8kVA, 5kW)"
        else:
            hints["load"] = "what the panel serves"

        self._new_source = None
        if new_panel_system:
            if dest is not None:
                errors["panel"] = f"'{to}' is already a {dest.kind}; leave this blank"
            else:
                try:
                    self._new_source = new_source_from(to, new_panel_system)
                    src_new = self._new_source
                    hints["panel"] = f"{src_new.kind} {src_new.system}"
                except ValueError as exc:
                    errors["panel"] = str(exc)

        circuit = v["circuit"].strip().upper()
        if circuit and circuit not in ("LN", "LL", "LLN", "MW", "3P", "3PN"):
            errors["circuit"] = "one of LN, LL, LLN, MW, 3P, 3PN (blank: all the source offers)"
        elif "from" not in errors:
            hints["circuit"] = _circuit_hint(job.source(src).system, circuit, dest)
        cont = _yes_no(v["continuous"])
        if cont is None:
            errors["continuous"] = "yes or no"
        spread = _yes_no(v["spread"])
        if spread is None:
            errors["spread"] = "yes or no"
        sets = 1
        if v["sets"].strip():
            try:
                sets = int(v["sets"])
                if not 1 <= sets <= 20:
                    raise ValueError
            except ValueError:
                errors["sets"] = "a whole number from 1 to 20"
        size = None
        if v["size"].strip():
            from gaugewalk.tables.conductor.sizes import parse_size

            try:
                size = parse_size(v["size"])
                hints["size"] = f"fixed {size}"
            except Exception as exc:
                errors["size"] = str(exc)
        material = v["material"].strip().lower() or None
        if material not in (None, "cu", "al"):
            errors["material"] = "cu or al (blank: the job default)"
        if material is None:
            hints["material"] = f"job: {job.defaults.material}"
        raceway = v["raceway"].strip() or None
        if raceway is None:
            hints["raceway"] = f"job: {job.defaults.raceway}"
        else:
            from gaugewalk.model.engine.sizing import resolve_raceway

            try:
                rtype, _, _ = resolve_raceway(raceway)
                hints["raceway"] = rtype
            except ValueError as exc:
                errors["raceway"] = str(exc)
        run_id = v["id"].strip()
        if not run_id:
            errors["id"] = "every run needs an id"
        elif run_id != self.run_id and job.run(run_id) is not None:
            errors["id"] = f"'{run_id}' is taken; next free is {job.next_run_id('R')}"

        candidate = None
        if not errors:
            fields = {
                "id": run_id, "from": src, "to": to, "length": v["length"].strip(),
                "load": load, "continuous": bool(cont), "distributed": bool(spread),
                "connection": circuit or None, "sets": sets, "size": size,
                "material": material, "raceway": raceway, "notes": v["notes"].strip(),
            }
            data = self._keep_unshown(fields, hints)
            try:
                candidate = Run.model_validate(data)
            except Exception as exc:
                errors.update(_pydantic_fields(exc))
        result = None
        self._cannot = None
        if candidate is not None:
            preview = s.preview(candidate, replaces=self.run_id, new_source=self._new_source)
            result = preview.result
            self._cannot = preview.cannot_size
            for field_key, message in preview.problems:
                key = _CARD_FIELD.get(field_key or "", "to" if field_key is None else "from")
                errors.setdefault(key, message)
        self.errors = errors
        self._candidate = candidate if not errors else None
        # an empty field nobody has reached yet is "needed", not wrong
        self.soft = {
            k for k in errors
            if not v[k].strip() and k not in self.touched and not self._store_tried
        }
        for k in FIELD_KEYS:
            if k in self.soft:
                shown = ("needed", False)
            elif k in errors:
                shown = ("✗ " + errors[k], True)
            else:
                shown = (hints.get(k, ""), False)
            if self._hints.get(k) == shown:
                continue  # redrawing costs a layout pass; skip what did not change
            self._hints[k] = shown
            text, bad = shown
            hint = self.query_one(f"#h-{k}", Note)
            hint.update(escape(text))
            hint.set_class(bad, "bad")
            self._input(k).set_class(bad, "-invalid")
        self._show_answer(candidate, result, feet)
        self._message_for_focus()

    def _keep_unshown(self, fields: dict, hints: dict[str, str]) -> dict:
        """The run as the card says, keeping what the card does not show (segments, bends,
        device, overrides...) from the run being edited. A new or re-measured length is dated
        today; segments that no longer add up to a changed length are dropped (undo brings
        them back), and the length field says so."""
        from datetime import date

        original = self.session.job.run(self.run_id) if self.run_id is not None else None
        if original is None:
            return {**fields, "measured_on": date.today()}
        data = original.model_dump(by_alias=True)
        load = fields.get("load")
        fields = {**fields, "load": load.model_dump() if load is not None else None}
        data.update(fields)
        if fields["length"] != original.length:
            data["measured_on"] = date.today()
            if original.segments:
                data["segments"] = []
                hints["length"] = (hints.get("length", "") + f"; drops {len(original.segments)} segments").lstrip("; ")
        return data

    def _show_answer(self, run: Run | None, res, feet: float | None) -> None:
        lines = ["[b]Answer[/b] (live)"]
        if run is None or res is None:
            lines.append("")
            if run is not None and self._cannot:
                lines.append("[b]Cannot size it yet:[/b]")
                lines.append(escape(self._cannot))
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
                f"EGC       {escape(res.egc_size or 'none')}",
                f"Raceway   {escape(race)}",
                f"OCPD      {res.ocpd_a} A",
                "",
                ("[b]✓ meets its targets[/b]" if not st.flag else f"[b]{escape(st.words)}[/b]"),
            ]
            for p in st.problems[:3]:
                lines.append("• " + escape(p))
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
            self._say(f"{_label(key)}: {self.errors[key]}", bad=True)
        elif hard:
            k = hard[0]
            self._say(f"{len(hard)} to fix — {_label(k)}: {self.errors[k]}", bad=True)
        elif self.errors:
            needed = ", ".join(_label(k) for k in self.errors)
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
        suggestion = complete(field.value, self._choices.get(key, ()))
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
        focused = self.focused
        key = (focused.id or "")[2:] if isinstance(focused, Input) else ""
        main = [f.key for f in FIELDS if f.main]
        target = "panel" if key in main else "from"
        self._focus_field(target)

    def action_store(self) -> None:
        if self.session.busy:
            self._sticky = "Not stored yet — the walk is still being sized; press Enter again in a moment."
            self._message_for_focus()
            return
        self._store_tried = True
        self._sticky = None
        self.recheck()
        self._store_tried = False
        if self.errors or self._candidate is None:
            first = next(iter(self.errors), None)
            if first:
                self._sticky = f"Not stored — {_label(first)}: {self.errors[first]}"
                self._focus_field(first)
                self._message_for_focus()
            return
        run = self._candidate
        refusal = self.session.put_run(run, replaces=self.run_id, new_source=self._new_source)
        if refusal:
            self._sticky = f"Not stored — {refusal}"
            self._message_for_focus()
            return
        self.session.keep_draft(None)
        state = self.session.state
        self.app.refresh_title()
        if not state.saved:
            self.notify(f"Stored {run.id} but NOT SAVED: {state.message}", severity="error", timeout=10)
        elif state.notice:
            self.notify(str(state.notice), timeout=10)
        if self.run_id is not None:
            self.notify(f"Stored {run.id}.")
            self.dismiss()
            return
        self.stored.append(run.id)
        self.touched = set()
        # after declaring a panel, the runs from it usually come next
        next_from = self._new_source.id if self._new_source is not None else run.from_
        self._set_values(self._fresh_values(next_from))
        self._update_title()
        self._sticky = (
            f"Stored {run.id} ({run.from_} → {run.to}). Next run from {next_from}; "
            "shift+tab changes the source."
        )
        self.recheck()
        self._focus_field("to")

    def action_close_card(self) -> None:
        if self.run_id is None:
            v = self.values()
            typed = any(v[k].strip() for k in ("to", "length", "load", "notes", "panel"))
            self.session.keep_draft(v if typed else None)
            if typed:
                self.notify("The unstored run is kept: n brings it back.")
        self.app.refresh_title()
        self.dismiss()


_CARD_FIELD = {
    "from": "from", "to": "to", "length": "length", "load": "load", "load.value": "load",
    "load.unit": "load", "load.pf": "load", "connection": "circuit", "sets": "sets",
    "size": "size", "material": "material", "raceway": "raceway", "id": "id",
    "continuous": "continuous", "distributed": "spread", "notes": "notes",
}


def _circuit_hint(system: str, connection: str, dest) -> str:
    """What the circuit field means in volts: ``LN 120 V 1ph``; blank shows the default."""
    from gaugewalk.model.engine.circuits import CircuitError, resolve_circuit
    from gaugewalk.model.walk.checks import default_connection

    try:
        conn = connection or default_connection(system, dest is not None and dest.kind == "transformer")
        c = resolve_circuit(system, conn)
    except (CircuitError, KeyError):
        return ""
    lead = "" if connection else "all: "
    return f"{lead}{conn} {c.volts:g} V {c.phases}ph"


def complete(text: str, choices) -> str | None:
    """The first of ``choices`` that starts with ``text`` (any case), as the field suggests it."""
    low = text.casefold()
    if not low:
        return None
    return next((c for c in choices if c.casefold().startswith(low)), None)


def _label(key: str) -> str:
    for f in FIELDS:
        if f.key == key:
            return f.label
    return key


def _first_error(exc: Exception) -> str:
    errors = getattr(exc, "errors", None)
    if callable(errors):
        try:
            first = errors()[0]
            return str(first.get("msg", exc)).removeprefix("Value error, ")
        except Exception:
            pass
    return str(exc)


def _pydantic_fields(exc: Exception) -> dict[str, str]:
    out: dict[str, str] = {}
    errors = getattr(exc, "errors", None)
    if not callable(errors):
        return {"to": str(exc)}
    for e in errors():
        loc = ".".join(str(x) for x in e.get("loc", ()))
        key = _CARD_FIELD.get(loc.replace("from_", "from"), _CARD_FIELD.get(loc.split(".")[0], "notes"))
        out.setdefault(key, str(e.get("msg", "")).removeprefix("Value error, "))
    return out or {"to": str(exc)}
