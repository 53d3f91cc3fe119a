"""Merge two walks of one job, e.g. two people who walked different floors.

Public API:

- ``merge_jobs(a, b, prefer=None) -> MergeResult``: sources and runs matched by id. The same id
  with the same content is kept once; an id on one side only is taken from that side; the same id
  with different content is a ``Conflict``. Header and defaults are compared key by key the same
  way. With ``prefer="a"`` or ``"b"`` conflicts take that side (and are still listed); without
  it ``MergeResult.job`` is None while there are conflicts. Nothing is dropped silently: every
  item is accounted for in ``taken``.
- ``Conflict(kind, id, field_diffs)``, ``str()`` one line per conflict.

Order: A's sources and runs in A's order, then those only B has, in B's order.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Literal

from gaugewalk.model.walk.job import Job

Side = Literal["a", "b"]


@dataclass(frozen=True)
class Conflict:
    """One id (or header/defaults key) with different content on the two sides."""

    kind: str                    # "run", "source", "job", "defaults"
    id: str                      # run or source id, or the key for job/defaults
    fields: tuple[tuple[str, object, object], ...]  # (field, value in A, value in B)

    def __str__(self) -> str:
        diffs = "; ".join(f"{name}: A has {_show(va)}, B has {_show(vb)}"
                          for name, va, vb in self.fields)
        label = f"{self.kind} {self.id}" if self.kind in ("run", "source") else f"[{self.kind}] {self.id}"
        return f"{label} differs: {diffs}"


def _show(value: object) -> str:
    if value is None:
        return "nothing"
    if isinstance(value, dict):
        return "{" + ", ".join(f"{k} = {_show(v)}" for k, v in value.items()) + "}"
    return repr(value) if isinstance(value, str) else str(value)


@dataclass
class MergeResult:
    job: Job | None
    conflicts: list[Conflict] = field(default_factory=list)
    taken: dict[str, list[str]] = field(default_factory=dict)
    """``{"both": [...], "a only": [...], "b only": [...], "conflict, took a": [...]}`` of
    ``"run R1"`` / ``"source LP1"`` labels."""

    @property
    def ok(self) -> bool:
        return self.job is not None


def _diff(da: dict, db: dict) -> tuple[tuple[str, object, object], ...]:
    keys = list(da) + [k for k in db if k not in da]
    return tuple((k, da.get(k), db.get(k)) for k in keys if da.get(k) != db.get(k))


def _dump(model) -> dict:
    return model.model_dump(by_alias=True, exclude_defaults=True, mode="json")


def merge_jobs(a: Job, b: Job, prefer: Side | None = None) -> MergeResult:
    """Merge walk ``b`` into walk ``a``; see the module docstring."""
    conflicts: list[Conflict] = []
    taken: dict[str, list[str]] = {"both": [], "a only": [], "b only": [],
                                   "conflict, took a": [], "conflict, took b": []}

    def pick(kind: str, ident: str, item_a, item_b, diffs):
        conflicts.append(Conflict(kind, ident, diffs))
        side = prefer or "a"
        taken[f"conflict, took {side}"].append(f"{kind} {ident}")
        return item_a if side == "a" else item_b

    # header and defaults: key by key, so two sides filling different keys both count
    merged_parts = {}
    for part in ("job", "defaults"):
        da, db = _dump(getattr(a, part)), _dump(getattr(b, part))
        out = {}
        for key in list(da) + [k for k in db if k not in da]:
            if key in da and key in db and da[key] != db[key]:
                out[key] = pick(part, key, da[key], db[key], ((key, da[key], db[key]),))
            else:
                out[key] = da[key] if key in da else db[key]
        merged_parts[part] = type(getattr(a, part)).model_validate(out)

    def items(kind: str, list_a, list_b):
        by_b = {x.id: x for x in list_b}
        ids_a = {x.id for x in list_a}
        out = []
        for x in list_a:
            y = by_b.get(x.id)
            if y is None:
                taken["a only"].append(f"{kind} {x.id}")
                out.append(x)
                continue
            dx, dy = _dump(x), _dump(y)
            if dx == dy:
                taken["both"].append(f"{kind} {x.id}")
                out.append(x)
            else:
                out.append(pick(kind, x.id, x, y, _diff(dx, dy)))
        for y in list_b:
            if y.id not in ids_a:
                taken["b only"].append(f"{kind} {y.id}")
                out.append(y)
        return [item.model_copy(deep=True) for item in out]

    sources = items("source", a.sources, b.sources)
    runs = items("run", a.runs, b.runs)
    if conflicts and prefer is None:
        return MergeResult(None, conflicts, taken)
    job = Job(schema=max(a.schema, b.schema), job=merged_parts["job"],
              defaults=merged_parts["defaults"], sources=sources, runs=runs)
    return MergeResult(job, conflicts, taken)
