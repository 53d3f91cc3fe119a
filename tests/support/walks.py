"""Small invented walks for the tests, built from a few calls instead of typed out in each module.

- ``source_table(id, kind, system=SYSTEM_208Y, **keys)`` and
  ``run_table(id, from, to, length, *, load=None, **keys)``: one ``[[source]]`` or
  ``[[run]]`` table as a dict in file order. A run's ``load`` is ``(value, unit)`` or a dict; keys
  given as None are left out, so ``**{"load": None}`` takes a key away.
- ``walk_text(name, sources=..., runs=..., defaults=...)``: the walk file as a person types it:
  ``schema = 1``, ``[job]``, ``[defaults]`` when given, the tables in the order given, a blank
  line between tables, a run's load as an inline table. ``tables_text("run", items)``: tables
  alone, to add to a walk.
- ``make_run(...)`` and ``make_job(name, ..., **header)``: the same as a validated ``Run`` and
  ``Job``.
- ``panel_walk(name, *runs, feeder_length="40", defaults=None)``: the smallest real walk, a
  208Y/120 V service ``SVC`` feeding panel ``LP1`` through feeder ``F1``, then ``runs``.
- ``SMALL_WALK`` ("Harbour Lane bakery", one 16 A branch on LP1, DC method, so the drops can be
  checked by hand from NEC Ch. 9 Table 8) and ``write_walk(folder, text, name)``.

Every walk here is invented; none describes a real job.
"""

from __future__ import annotations

import re
from collections.abc import Iterable, Mapping
from pathlib import Path
from typing import Any

import tomli_w

from gaugewalk.model.walk.job import Job, Run

SYSTEM_208Y = "208Y/120V 3ph 4w"

_BARE_KEY = re.compile(r"[A-Za-z0-9_-]+")


def _without_none(table: dict) -> dict:
    return {k: v for k, v in table.items() if v is not None}


def _value(value: Any) -> str:
    if isinstance(value, Mapping):
        return "{ " + ", ".join(f"{_key(k)} = {_value(v)}" for k, v in value.items()) + " }"
    return tomli_w.dumps({"v": value}).removeprefix("v = ").rstrip("\n")


def _key(key: str) -> str:
    if not _BARE_KEY.fullmatch(key):
        raise ValueError(f"{key!r} is not a bare TOML key")
    return key


def _key_value(key: str, value: Any) -> str:
    return f"{_key(key)} = {_value(value)}\n"


def source_table(sid: str, kind: str, system: str = SYSTEM_208Y, /, **keys: Any) -> dict:
    """One ``[[source]]``: ``id``, ``kind``, ``system``, then ``keys`` (``kva``, ``name`` ...)."""
    return _without_none({"id": sid, "kind": kind, "system": system, **keys})


def run_table(rid: str, frm: str, to: str, length: str, /, *,
              load: tuple[float, str] | Mapping | None = None, **keys: Any) -> dict:
    """One ``[[run]]``: ``id``, ``from``, ``to``, ``length``, ``load``, then ``keys``; a key in
    ``keys`` that is already there (``from``, ``to``, ``id``) takes the new value in its place."""
    if isinstance(load, tuple):
        load = {"value": load[0], "unit": load[1]}
    table = {"id": rid, "from": frm, "to": to, "length": length, "load": load}
    table.update(keys)
    return _without_none(table)


def make_run(rid: str, frm: str, to: str, length: str, /, **keys: Any) -> Run:
    return Run.model_validate(run_table(rid, frm, to, length, **keys))


def make_job(name: str | None, *, sources: Iterable[dict] = (), runs: Iterable[dict] = (),
             defaults: Mapping | None = None, **header: Any) -> Job:
    """A validated ``Job``; ``header`` adds to ``[job]`` (``notes``, ``site`` ...). With no name
    and no header the walk has no ``[job]`` table."""
    data: dict[str, Any] = {"source": list(sources), "run": list(runs)}
    if name is not None or header:
        data["job"] = _without_none({"name": name, **header})
    if defaults:
        data["defaults"] = dict(defaults)
    return Job.model_validate(data)


def walk_text(name: str, *, sources: Iterable[dict] = (), runs: Iterable[dict] = (),
              defaults: Mapping | None = None) -> str:
    text = f"schema = 1\n\n[job]\n{_key_value('name', name)}"
    if defaults:
        text += "\n[defaults]\n" + "".join(_key_value(k, v) for k, v in defaults.items())
    return text + tables_text("source", sources) + tables_text("run", runs)


def tables_text(kind: str, items: Iterable[dict]) -> str:
    """``[[kind]]`` tables, each after a blank line."""
    return "".join(f"\n[[{kind}]]\n" + "".join(_key_value(k, v) for k, v in item.items())
                   for item in items)


def panel_walk(name: str, *runs: dict, feeder_length: str = "40",
               defaults: Mapping | None = None) -> str:
    return walk_text(name, defaults=defaults,
                     sources=[source_table("SVC", "service"), source_table("LP1", "panel")],
                     runs=[run_table("F1", "SVC", "LP1", feeder_length), *runs])


SMALL_WALK = panel_walk(
    "Harbour Lane bakery",
    run_table("R1", "LP1", "Proofer", "100", load=(16, "A"), connection="LN", size="12 AWG"),
    defaults={"method": "dc"},
)


def write_walk(folder: Path, text: str = SMALL_WALK, name: str = "walk.toml") -> Path:
    path = folder / name
    path.write_text(text, encoding="utf-8")
    return path


# -- a walk and a lock someone hostile sent -------------------------------------------------------
TERMINAL_TRICKS = "\x1b]0;PWNED\x07\x1b[2J\x1b[31m\x9b2J\u202eevil\u2028\x00"
"""Control characters that would set the terminal's title, clear the screen, colour it, reorder
what it shows and break a line if they reached it raw."""
MARKUP_TRICKS = ("[@click=screen.delete_run]click[/] [link=https://example.invalid]x[/link] "
                 "[$accent]a[/] [B]b[/B] dana [/x] \\[b]")
"""Markup of every kind Textual and Rich read: an action, a link, a variable, an unclosed tag."""

HOSTILE_WALK = panel_walk(
    "Quay " + MARKUP_TRICKS,
    run_table("R1", "LP1", "Pump " + MARKUP_TRICKS[:60], "100", load=(16, "A"), connection="LN",
              notes="pump by the quay " + TERMINAL_TRICKS + "\nsecond line"),
    run_table("R2", "LP1", "[red]Mixer[/red]", "85+12", load=(1.8, "kVA"),
              segments=[{"length": "85", "note": "[@click=app.quit]q[/]"},
                        {"length": "12", "note": "up the wall"}],
              notes=MARKUP_TRICKS),
).replace('name = "Quay', 'site = "[link=https://example.invalid]dock[/link]"\n'
          'notes = ' + tomli_w.dumps({"v": TERMINAL_TRICKS}).removeprefix("v = ").strip()
          + '\nname = "Quay', 1).replace(
    'id = "LP1"\nkind = "panel"\n',
    'id = "LP1"\nkind = "panel"\nname = "Panel [@click=app.quit]q[/] dana [/x]"\n'
    'notes = "\\u001b[2Jclears the screen"\n', 1)
"""Invented: a quay-side pump and mixer whose every text field holds markup, and whose notes hold
terminal control characters (kept in the file; names cannot hold them)."""
