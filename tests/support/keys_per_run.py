"""Keys per run: a sample walk recorded on the run card by keys, and the keys each run took.

```
.venv/bin/python -m tests.support.keys_per_run [WALK] [--plain]
```

The walk (``sample_walks/retail_fitout.toml`` unless given) keeps its job, defaults, sources and
feeders; its branch runs are taken out and typed back, in the walk's order, into the real app
(Textual's Pilot, 80x24). For each run a typist who reads the card plans the fewest keys from
what the card shows: the card as it stands, or ``ctrl+r`` first (a card like the last run), a
load that states its circuit (``32.5A 3P``) or the circuit typed in its own field. Each field
that differs is reached the shortest way (Tab or Down, Up or shift+Tab, ctrl+o), typed over
(entering a field selects its text; Backspace empties it), with Tab's completion in From and To
where a shorter prefix gives the name (an empty To: the name ``ctrl+r`` would step to). The
plan uses the card's own form (``gaugewalk.model.session.card_form``) to see what the card
fills in after each field. The keys are then typed, and every stored run must equal the
sample's on the card's fields; the run id is taken as the card suggests it, and the notes
and bends (not what this measures) are left out. ``--plain`` plans without ``ctrl+r`` and the
proposed To, as the card was before them.

A run *like the last one* is the next of a row: it differs from the run before it in the walk
only in its length and its To, which is the last To stepped on ("row 2" after "row 1", "boxes B"
after "boxes A"). Every other run is a *new kind*.
"""

from __future__ import annotations

import argparse
import asyncio
import statistics
import sys
import tempfile
import tomllib
from collections import deque
from dataclasses import dataclass, field
from pathlib import Path

from gaugewalk.model.session.card_form import (
    FIELD_KEYS,
    MAIN_KEYS,
    CardForm,
    complete,
    run_to_fields,
    shown,
    yes_no,
)
from gaugewalk.model.session.card_steps import step_name
from gaugewalk.model.walk.job import Run
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.model.walkfile.write import dumps_walk

SAMPLE = Path(__file__).resolve().parents[2] / "sample_walks" / "retail_fitout.toml"
COMPARED = ("from", "to", "length", "load", "continuous", "distributed", "connection", "sets",
            "size", "material", "raceway")
"""The run's fields the card records and the stored run is compared on (walk file names)."""
TYPED = ("from", "to", "length", "load", "kind", "circuit", "continuous", "spread", "sets",
         "size", "material", "raceway")
"""The card's fields the typist fills in (the id is taken as suggested; notes left out)."""
YES_NO = ("continuous", "spread")
LIKE_LAST_TARGET = 12
"""Most keys for a run like the last one (the issue's target)."""
NEW_KIND_TARGET = 35
"""Most keys, on average, for a run of a new kind (the issue's target)."""


@dataclass
class Recorded:
    """One run typed: the sample run, the keys, and whether it is like the run before it."""

    run: Run
    keys: list[str]
    like_last: bool


@dataclass
class Tally:
    runs: list[Recorded] = field(default_factory=list)

    def counts(self, like_last: bool) -> list[int]:
        return [len(r.keys) for r in self.runs if r.like_last == like_last]

    def lines(self) -> list[str]:
        out = [f"{'run':8} {'kind':9} keys  to / keys typed"]
        for r in self.runs:
            kind = "like last" if r.like_last else "new kind"
            out.append(f"{r.run.id:8} {kind:9} {len(r.keys):4}  {r.run.to}")
            out.append(f"{'':24}{' '.join(r.keys)}")
        same, new = self.counts(True), self.counts(False)
        out.append("")
        out.append(f"all {len(self.runs)} runs: {sum(same) + sum(new)} keys, "
                   f"{(sum(same) + sum(new)) / len(self.runs):.1f} a run")
        if same:
            out.append(f"like the last one ({len(same)}): at most {max(same)}, mean "
                       f"{statistics.mean(same):.1f} (target: at most {LIKE_LAST_TARGET})")
        if new:
            out.append(f"a new kind ({len(new)}): mean {statistics.mean(new):.1f}, median "
                       f"{statistics.median(new):g}, at most {max(new)} (target: "
                       f"{NEW_KIND_TARGET} on average)")
        return out


def card_texts(run: Run) -> dict[str, str]:
    """What the typist wants each card field to say for ``run``."""
    texts = run_to_fields(run)
    texts["circuit"] = run.connection or ""
    for key in YES_NO:  # the card takes y and n
        texts[key] = texts[key][:1]
    return {k: texts[k] for k in TYPED}


def _same(key: str, shown: str, wanted: str) -> bool:
    if key in YES_NO:
        return yes_no(shown) == yes_no(wanted)
    if key in ("material", "circuit", "size", "raceway", "sets"):
        return shown.strip().casefold() == wanted.strip().casefold()
    return shown == wanted


def _moves(values: dict[str, str], start: str, last_main: str,
           goal: str) -> tuple[list[str], str]:
    """The fewest keys from field ``start`` to ``goal`` among the fields the card shows for
    ``values`` (Down and Up wrap round the card; ctrl+o goes from a main field to the other
    fields and back to the main field left), and the main field ctrl+o returns to afterwards."""
    order = [k for k in FIELD_KEYS if shown(k, values)]
    n = len(order)
    seen = {(start, last_main)}
    queue: deque[tuple[str, str, list[str]]] = deque([(start, last_main, [])])
    while queue:
        here, main, path = queue.popleft()
        if here == goal:
            return path, main
        i = order.index(here)
        steps = (("down", order[(i + 1) % n]), ("up", order[(i - 1) % n]),
                 ("ctrl+o", "panel" if here in MAIN_KEYS else main))
        for key, there in steps:
            state = (there, there if there in MAIN_KEYS else main)
            if state not in seen:
                seen.add(state)
                queue.append((*state, [*path, key]))
    raise AssertionError(f"no way from {start} to {goal}")


def _field_keys(text: str) -> list[str]:
    return list(text) if text else ["backspace"]


def plan(card, wanted: dict[str, str], like: str | None, plain: bool) -> list[str] | None:
    """The keys that make ``card`` (a new-run card on screen) say ``wanted``, ending in Enter;
    ``like``: with ctrl+r ``"first"`` or ``"after to"`` (To typed first, which ctrl+r keeps).
    None when the plan cannot get there."""
    form = CardForm(card.session)
    form.values, form.typed = dict(card.form.values), set(card.form.typed)
    form.last_stored = card.form.last_stored
    here = (card.focused.id or "")[2:]
    main = card._last_main
    keys: list[str] = []
    last = form.last_run()
    if like is not None and last is None:
        return None
    for _ in range(3 * len(TYPED)):
        todo = [k for k in TYPED if not _same(k, form.values[k], wanted[k])]
        if last is not None and (like == "first" or (like == "after to" and "to" not in todo)):
            keys.append("ctrl+r")
            here = main = form.like(last)
            like = None
            continue
        if not todo:
            return [*keys, "enter"]
        goal = "to" if like == "after to" else min(
            todo, key=lambda k: len(_moves(form.values, here, main, k)[0]))
        moves, main = _moves(form.values, here, main, goal)
        keys += moves
        here = goal
        text = wanted[goal]
        typed = _field_keys(text)
        options = card.completions(goal)
        for end in range(0 if goal == "to" and not plain else 1, len(text)):
            prefix = text[:end]
            taken = form.proposed_to() if goal == "to" and not prefix else complete(prefix, options)
            if taken == text:
                if end + 1 < len(typed):
                    typed = [*prefix, "tab"]
                break
        form.type(goal, text)
        keys += typed
        if typed[-1] == "tab":
            order = [k for k in FIELD_KEYS if shown(k, form.values)]
            here = order[(order.index(goal) + 1) % len(order)]
            main = here if here in MAIN_KEYS else main
    return None


def load_variants(run: Run, wanted: dict[str, str]) -> list[dict[str, str]]:
    """The card texts with the load as written, and with the load stating its circuit's poles
    (``32.5A 3P``), which the card's circuit then follows."""
    poles = {"LN": "1P", "LL": "2P", "3P": "3P"}.get(run.connection or "")
    out = [wanted]
    if poles and wanted["load"]:
        value, _, pf = wanted["load"].partition(" pf")
        out.append({**wanted, "load": f"{value} {poles}" + (f" pf{pf}" if pf else "")})
    return out


def best_plan(card, run: Run, plain: bool) -> list[str]:
    plans = [p for wanted in load_variants(run, card_texts(run))
             for like in ((None,) if plain else (None, "first", "after to"))
             if (p := plan(card, wanted, like, plain)) is not None]
    if not plans:
        raise AssertionError(f"no keys make the card say {run.id}")
    return min(plans, key=len)


def start_walk(sample: Path, folder: Path) -> tuple[Path, list[Run]]:
    """The sample with its branch runs taken out, written in ``folder``; and those runs."""
    job = load_walk(sample)
    branch = [r for r in job.runs if not job.is_feeder(r)]
    feeders = [r for r in job.runs if job.is_feeder(r)]
    path = folder / sample.name
    path.write_text(dumps_walk(job.model_copy(update={"runs": feeders})), encoding="utf-8")
    return path, branch


def _compared(run: Run) -> dict:
    data = run.model_dump(by_alias=True)
    return {k: data[k] for k in COMPARED}


async def record(sample: Path = SAMPLE, plain: bool = False) -> Tally:
    """Type the sample's branch runs into the app; check what is stored; count the keys."""
    from gaugewalk.tui.app.screens.card import RunCard
    from tests.support.app_helpers import burst, new_app, opened

    tally = Tally()
    with tempfile.TemporaryDirectory() as tmp:
        path, runs = start_walk(sample, Path(tmp))
        app = new_app(path, Path(tmp) / "cfg")
        async with app.run_test(size=(80, 24)) as pilot:
            await opened(app, pilot)
            await burst(app, pilot, ["n"])
            session = app.session
            assert session is not None  # opened
            previous: Run | None = None
            for run in runs:
                card = app.screen
                assert isinstance(card, RunCard), f"the card closed before {run.id}"
                keys = best_plan(card, run, plain)
                stored = len(session.job.runs)
                await burst(app, pilot, keys)
                job = session.job
                assert len(job.runs) == stored + 1, (
                    f"{run.id} not stored with {keys}: {card.query_one('#card-msg').render()}")
                got = _compared(job.runs[-1])
                assert got == _compared(run), f"{run.id} stored as {got}, typed with {keys}"
                like_last = previous is not None and run.to == step_name(previous.to) and all(
                    getattr(previous, k) == getattr(run, k) for k in
                    ("from_", "load", "continuous", "distributed", "connection", "sets", "size",
                     "material", "raceway"))
                tally.runs.append(Recorded(run, (["n"] if previous is None else []) + keys,
                                           like_last))
                previous = run
            await burst(app, pilot, ["escape"])
        stored_text = tomllib.loads(path.read_text(encoding="utf-8"))
        assert len(stored_text["run"]) == len(load_walk(sample).runs)
    return tally


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("walk", nargs="?", default=str(SAMPLE))
    parser.add_argument("--plain", action="store_true",
                        help="without ctrl+r and the proposed To (the card before them)")
    args = parser.parse_args(argv)
    tally = asyncio.run(record(Path(args.walk), args.plain))
    print("\n".join(tally.lines()))
    return 0


if __name__ == "__main__":
    sys.exit(main())
