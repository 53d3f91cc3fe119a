"""Job settings: the job header and the defaults every run inherits. Storing them recomputes
every run and says what moved."""

from __future__ import annotations

from textual.app import ComposeResult
from textual.containers import Horizontal, VerticalScroll
from textual.screen import Screen
from textual.widgets import Footer, Header, Input, Label, Static

from gaugewalk.model.engine import vocabulary as vocab
from gaugewalk.model.session.session import WalkSession
from gaugewalk.model.walk.job import Defaults, JobHeader
from gaugewalk.model.walk.vocabulary import DEMANDS, FEEDER_BASES
from gaugewalk.tui.app.keyorder import TypedInOrder
from gaugewalk.tui.app.keys import bindings_for
from gaugewalk.tui.app.plain import escape

# (field, label, help); header fields are prefixed "job."
SETTINGS: tuple[tuple[str, str, str], ...] = (
    ("job.name", "Job name", ""),
    ("job.site", "Site", ""),
    ("job.walked_by", "Walked by", ""),
    ("material", "Material", vocab.or_words(vocab.MATERIALS)),
    ("insulation", "Insulation", "e.g. THHN/THWN-2, XHHW-2"),
    ("raceway", "Raceway", "e.g. EMT, PVC-40, RMC"),
    ("terminal_temp", "Terminals °C", "60, 75, 90; blank: NEC 110.14(C)(1)"),
    ("ambient_c", "Ambient °C", "NEC 310.15(B)(1)"),
    ("branch_drop_pct", "Branch drop %", "210.19 note: 3"),
    ("feeder_drop_pct", "Feeder drop %", "215.2 note: 3"),
    ("total_drop_pct", "Total drop %", "215.2 note: 5"),
    ("min_size", "Smallest size", "e.g. 12 (job spec); blank: rules"),
    ("method", "Drop method", "ac, kfactor or dc"),
    ("starting_drop_pct", "Start drop %", "motors starting; 10 to 15 common practice"),
    ("drop_through_transformers", "Thru xfmr", "yes: total carries on; no: 0 % at secondary"),
    ("nonlinear_loads", "Nonlinear", "yes: 4-wire wye neutrals count (310.15(E)(3))"),
    ("feeder_basis", "Feeder basis", vocab.or_words(FEEDER_BASES) + " (215.2(A)(1); main/bus)"),
    ("demand", "Feeder load", vocab.or_words(DEMANDS) + " (220.44, 220.60)"),
    ("pf", "Power factor", "for loads without one"),
    ("conductor_temp_c", "Conductor °C", "for resistance, Ch. 9 Table 8"),
    ("slack_per_end_ft", "Slack/end ft", "for the takeoff"),
    ("waste_pct", "Waste %", "for the takeoff"),
    ("pull_every_ft", "Pull point ft", "on long runs; 0: for bends only"),
)


def _text(value) -> str:
    if value is None:
        return ""
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, float):
        return f"{value:g}"
    return str(value)


class JobSettingsScreen(TypedInOrder, Screen):
    """Edit the job's header and defaults; Enter or ctrl+s stores them, Esc leaves them."""

    BINDINGS = bindings_for("job")

    def __init__(self, session: WalkSession) -> None:
        super().__init__()
        self.session = session

    def compose(self) -> ComposeResult:
        job = self.session.job
        yield Header()
        yield Static("[b]Job settings[/b] — every run inherits these unless it says otherwise. "
                     "Enter stores and recomputes every run; Esc leaves them.", id="job-head")
        with VerticalScroll(id="job-fields"):
            for key, label, help_ in SETTINGS:
                if key.startswith("job."):
                    value = getattr(job.job, key[4:])
                else:
                    value = getattr(job.defaults, key)
                with Horizontal(classes="card-row"):
                    yield Label(label, classes="job-label")
                    wide = " job-wide" if key.startswith("job.") else ""
                    yield Input(_text(value), id="s-" + key.replace(".", "-"), compact=True,
                                classes="card-input" + wide, select_on_focus=False)
                    yield Static(escape(help_), id="sh-" + key.replace(".", "-"), classes="card-hint")
        yield Static("", id="job-msg")
        yield Footer()

    def on_mount(self) -> None:
        self.app.sub_title = "Job settings"
        self.start_typing(self.query_one("#s-job-name", Input))

    def _values(self) -> tuple[dict, dict]:
        header: dict = {}
        defaults: dict = {}
        for key, _, _ in SETTINGS:
            text = self.query_one("#s-" + key.replace(".", "-"), Input).value.strip()
            if key.startswith("job."):
                header[key[4:]] = text
            elif text == "" and key in ("terminal_temp", "min_size"):
                defaults[key] = None
            elif text != "":
                # the model reads yes/no itself, and names the field when it cannot
                text_keys = ("material", "insulation", "raceway", "method", "min_size", "demand",
                             "feeder_basis", "drop_through_transformers", "nonlinear_loads")
                defaults[key] = text if key in text_keys else _number(text)
        return header, defaults

    def action_store(self) -> None:
        header, defaults = self._values()
        msg = self.query_one("#job-msg", Static)
        for inp in self.query(Input):
            inp.remove_class("-invalid")
        from gaugewalk.model.engine.sizing import resolve_raceway
        from gaugewalk.tables.conductor.ampacity import parse_insulation

        for key, check in (("raceway", resolve_raceway), ("insulation", parse_insulation),
                           ("drop_through_transformers", _yes_or_no),
                           ("nonlinear_loads", _yes_or_no)):
            try:
                check(defaults.get(key, ""))
            except ValueError as exc:
                inp = self.query_one(f"#s-{key}", Input)
                inp.add_class("-invalid")
                self.move_to(inp)
                label = next(lab for k, lab, _ in SETTINGS if k == key)
                msg.update(f"✗ Not stored — {escape(label)}: {escape(str(exc))}")
                return
        try:
            new_defaults = Defaults.model_validate({**self.session.job.defaults.model_dump(), **defaults})
            new_header = self.session.job.job.model_copy(update=header)
            JobHeader.model_validate(new_header.model_dump())
        except Exception as exc:
            errors = exc.errors() if hasattr(exc, "errors") else []
            if errors:
                loc = str(errors[0]["loc"][0])
                key = loc if loc in defaults else "job." + loc
                try:
                    inp = self.query_one("#s-" + key.replace(".", "-"), Input)
                    inp.add_class("-invalid")
                    self.move_to(inp)
                except Exception:
                    pass
                label = next((lab for k, lab, _ in SETTINGS if k == key), loc)
                msg.update(f"✗ Not stored — {escape(label)}: {escape(str(errors[0]['msg']).removeprefix('Value error, '))}")
            else:
                msg.update(f"✗ Not stored — {escape(str(exc))}")
            return
        before = {r.id: (res.size, res.sets, self.session.status(self.session.job.run(r.id) or r).flag)
                  for r in self.session.job.runs
                  if (res := self.session.result_for(r.id)) is not None}
        refusal = self.session.set_job(new_header, new_defaults)
        if refusal:
            msg.update("✗ Not stored — " + escape(refusal))
            return
        changed = flagged = 0
        for r in self.session.job.runs:
            res = self.session.result_for(r.id)
            now = (res.size, res.sets) if res else None
            if res is None or before.get(r.id, (None, None, None))[:2] != now:
                changed += 1
            if self.session.status(r, res).flag:
                flagged += 1
        st = self.session.state
        note = f"Job settings stored; {changed} run(s) changed size, {flagged} with a problem."
        if not st.saved:
            self.notify(note + f" NOT SAVED: {st.message}", severity="error", timeout=10)
        else:
            self.notify(note, timeout=6)
        self.dismiss()

    def action_leave(self) -> None:
        self.dismiss()


def _yes_or_no(text: str) -> bool:
    from gaugewalk.model.session.card_form import yes_no

    value = yes_no(text)
    if value is None:
        raise ValueError(f"'{text}': yes or no")
    return value


def _number(text: str):
    try:
        value = float(text)
    except ValueError:
        return text  # the model names the field and refuses it
    return int(value) if value.is_integer() and "." not in text else value
