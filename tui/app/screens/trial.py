"""Trial change: try another material, size, parallel sets or circuit (voltage) on one run or
feeder, see what it does to that run and to everything downstream, then keep it or not."""

from __future__ import annotations

from textual.app import ComposeResult
from textual.containers import Horizontal, Vertical
from textual.screen import Screen
from textual.widgets import Footer, Header, Input, Label, Static

from gaugewalk.model.engine import vocabulary as vocab
from gaugewalk.model.session.session import WalkSession, fmt_pct
from gaugewalk.model.walk.job import Run
from gaugewalk.tui.app.keyorder import TypedInOrder
from gaugewalk.tui.app.keys import bindings_for
from gaugewalk.tui.app.plain import escape
from gaugewalk.tui.app.sheet.rows import size_text

TRIAL_FIELDS = (
    ("material", "Material", vocab.or_words(vocab.MATERIALS)),
    ("size", "Size", "e.g. 4/0 or 350; blank: picked"),
    ("sets", "Sets", "conductors in parallel per phase"),
    ("circuit", "Circuit", "LN LL LLN MW 3P 3PN: the voltage; blank: all offered"),
)


class TrialScreen(TypedInOrder, Screen):
    """A what-if on one run, computed on a copy of the walk; ctrl+s keeps it."""

    BINDINGS = bindings_for("trial")

    def __init__(self, session: WalkSession, run_id: str) -> None:
        super().__init__()
        self.session = session
        self.run_id = run_id
        self.trial_run: Run | None = None
        self.trial_sources: tuple = ()
        job = session.job
        run = job.run(run_id)
        dest = job.source(run.to) if run is not None else None
        # a transformer's secondary voltage can be tried (with the panels it feeds)
        self.panel = dest if dest is not None and dest.kind == "transformer" else None

    def compose(self) -> ComposeResult:
        run = self.session.job.run(self.run_id)
        yield Header()
        yield Static(
            f"[b]Trial change on {escape(self.run_id)}[/b] ({escape(run.from_)} → {escape(run.to)}). "
            "Change a field; the walk itself is untouched until ctrl+s.", id="trial-head",
        )
        with Vertical(id="trial-fields"):
            for key, label, help_ in TRIAL_FIELDS:
                with Horizontal(classes="card-row"):
                    yield Label(label, classes="card-label")
                    yield Input(self._current(run, key), id=f"t-{key}", compact=True, classes="card-input",
                                select_on_focus=False)
                    yield Static(escape(help_), id=f"th-{key}", classes="card-hint")
            if self.panel is not None:
                with Horizontal(classes="card-row"):
                    yield Label("Secondary", classes="card-label")
                    yield Input(self.panel.system, id="t-system", compact=True, classes="card-input",
                                select_on_focus=False)
                    yield Static(escape(f"{self.panel.id} secondary and the panels on it"),
                                 id="th-system", classes="card-hint")
        yield Static("", id="trial-compare")
        yield Static("", id="trial-msg")
        yield Footer()

    def _current(self, run: Run, key: str) -> str:
        if key == "material":
            return run.material or ""
        if key == "size":
            return run.size or ""
        if key == "sets":
            return str(run.sets)
        return run.connection or ""

    def on_mount(self) -> None:
        self.app.sub_title = f"Trial change on {self.run_id}"
        first = self.query_one("#t-material", Input)
        self.recheck()
        self.start_typing(first)

    def field_typed(self, field: Input) -> None:
        self.recheck()

    def action_next_field(self) -> None:
        self.focus_next()

    def recheck(self) -> None:
        s = self.session
        run = s.job.run(self.run_id)
        values = {k: self.query_one(f"#t-{k}", Input).value.strip() for k, _, _ in TRIAL_FIELDS}
        update: dict = {}
        problem = None
        mat = values["material"].lower()
        if mat and mat not in vocab.MATERIALS:
            problem = f"Material: {vocab.or_words(vocab.MATERIALS)} (blank: the job default)"
        update["material"] = mat or None
        if values["size"]:
            from gaugewalk.tables.conductor.sizes import parse_size

            try:
                update["size"] = parse_size(values["size"])
            except Exception as exc:
                problem = f"Size: {exc}"
        else:
            update["size"] = None
        try:
            sets = int(values["sets"] or "1")
            if not vocab.MIN_SETS <= sets <= vocab.MAX_SETS:
                raise ValueError
            update["sets"] = sets
        except ValueError:
            problem = f"Sets: {vocab.SETS_WORDS}"
        circ = values["circuit"].upper()
        if circ and circ not in vocab.CONNECTIONS:
            problem = f"Circuit: one of {', '.join(vocab.CONNECTIONS)} (blank: all the source offers)"
        update["connection"] = circ or None
        self.trial_sources = ()
        if self.panel is not None:
            from gaugewalk.model.engine.circuits import CircuitError, parse_system

            text = self.query_one("#t-system", Input).value.strip()
            try:
                system = parse_system(text) if text else self.panel.system
                if system != self.panel.system:
                    self.trial_sources = tuple(
                        src.model_copy(update={"system": system})
                        for src in s.same_system_below(self.panel.id, self.panel.system)
                    )
            except CircuitError as exc:
                problem = f"Secondary: {exc}"
        msg = self.query_one("#trial-msg", Static)
        compare = self.query_one("#trial-compare", Static)
        self.trial_run = None
        if problem:
            msg.update("✗ " + escape(problem))
            compare.update("Fix the field above to see the effect.")
            return
        try:
            trial = run.model_copy(update=update)
            trial = Run.model_validate(trial.model_dump(by_alias=True))
        except Exception as exc:
            msg.update("✗ " + escape(str(exc)))
            compare.update("Fix the field above to see the effect.")
            return
        outcome = s.trial(trial, self.trial_sources)
        if outcome.problems:
            msg.update("✗ " + escape("; ".join(p.brief() for p in outcome.problems[:2])))
            compare.update("This change cannot be sized; see the message below.")
            return
        self.trial_run = trial
        msg.update("ctrl+s keeps this change · Esc leaves the walk as it was")
        self.query_one("#trial-compare", Static).update(self._compare(run, trial, outcome))

    def _compare(self, run: Run, trial: Run, outcome) -> str:
        s = self.session
        before = s.result_for(run.id)
        after = outcome.result.runs.get(run.id) if outcome.result else None
        st_b = s.status(run, before)
        st_a = s.status(trial, after, outcome.result) if after is not None else None

        def row(label, a, b):
            mark = "" if a == b else "  ←"
            return f"{label:<9}{a:>14}  {b:>14}{mark}"

        lines = [f"[b]{'':<9}{'now':>14}  {'with change':>14}[/b]"]
        if before is not None and after is not None:
            lines += [
                row("Size", size_text(before), size_text(after)),
                row("Volts", f"{before.voltage_drop_v:.1f} V drop", f"{after.voltage_drop_v:.1f} V drop"),
                row("Drop", fmt_pct(before.voltage_drop_pct) + "%", fmt_pct(after.voltage_drop_pct) + "%"),
                row("Total", fmt_pct(before.total_drop_pct) + "%", fmt_pct(after.total_drop_pct) + "%"),
                row("EGC", before.egc_size or "none", after.egc_size or "none"),
                row("Raceway", f"{before.raceway_size or '—'} {before.raceway}", f"{after.raceway_size or '—'} {after.raceway}"),
                row("Status", st_b.words, st_a.words if st_a else "—"),
            ]
        down = outcome.downstream
        if down:
            lines.append("")
            moved = ""
            if self.trial_sources:
                moved = f" (at {escape(self.trial_sources[0].system)})"
            lines.append(f"[b]Downstream of {escape(run.to)}{moved}: {len(down)} runs[/b]")
            worst_b = max((d[1] for d in down), default=0.0)
            worst_a = max((d[2] for d in down), default=0.0)
            flag_b = sum(1 for d in down if d[3])
            flag_a = sum(1 for d in down if d[4])
            lines.append(row("Worst tot", fmt_pct(worst_b) + "%", fmt_pct(worst_a) + "%"))
            lines.append(row("Flagged", str(flag_b), str(flag_a)))
        return "\n".join(escape(x) if not x.startswith("[b]") else x for x in lines)

    def action_keep(self) -> None:
        if self.trial_run is None:
            self.notify("Nothing to keep: fix the trial fields first.", severity="warning")
            return
        refusal = self.session.put_run(self.trial_run, replaces=self.run_id, sources=self.trial_sources)
        if refusal:
            self.query_one("#trial-msg", Static).update("✗ Not kept — " + escape(refusal))
            return
        st = self.session.state
        if st.saved:
            self.notify(f"Kept the change on {self.run_id} (ctrl+z undoes it).")
        else:
            self.notify(f"Kept, but NOT SAVED: {st.message}", severity="error", timeout=10)
        self.dismiss()

    def action_close_trial(self) -> None:
        self.dismiss()
