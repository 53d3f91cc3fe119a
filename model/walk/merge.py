"""Merge two walks of one job, e.g. two people who walked different floors, or the walk on disk
and the runs typed in the app since it was read.

Public API:

- ``merge_jobs(a, b, prefer=None, base=None) -> MergeResult``: sources, shared raceways and runs
  matched by id, the job header and the defaults key by key, every item accounted for in
  ``MergeResult.taken``.
- ``Conflict(kind, id, fields)``: one id (or header/defaults key) both sides changed, each its
  own way; ``str()`` says how, in one line.

The rules, for each id (and each header or defaults key):

- *With a common base* (the version both sides started from: ``merge --base``, git's merge
  base, the walk as the app read it): a side that left an item as the base had it takes the
  other side's version, a change or a deletion alike; both sides making the same change is no
  conflict; both changing it, each its own way (or one deleting what the other changed), is a
  true conflict. An item both sides deleted is listed as ``deleted in both``.
- *Without a base* nothing tells an addition from a deletion, so an item on one side only is
  kept. Two versions of a run are told apart where the walk itself tells: a run re-measured on
  one side only (the same run otherwise, with a later ``measured_on`` there) takes the
  re-measure, which is no conflict; anything else that differs is a conflict.
- *Two runs that got the same id* (new on both sides: not in the base, or no base, and going
  between different ends, ``from`` and ``to``) are two runs: both are kept, B's renumbered to
  the next free id of its kind (``R7`` -> ``R31``), and ``taken["renumbered"]`` says so. Two
  sources or raceways cannot be renumbered (runs name them): the same id new on both sides is a
  conflict.
- ``prefer="a"`` or ``"b"`` settles only true conflicts, each listed in ``conflicts`` and in
  ``taken``; without it ``MergeResult.job`` is None while there are conflicts. Nothing is
  dropped silently: every run, source and raceway of both sides is in ``taken``.

Order: A's sources, raceways and runs in A's order, then those only B has, in B's order.
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field
from typing import Literal

from gaugewalk.model.walk.job import Job, Run

Side = Literal["a", "b"]

TAKEN_KEYS = ("both", "a only", "b only", "changed in a", "changed in b", "deleted in a",
              "deleted in b", "deleted in both", "re-measured in a", "re-measured in b",
              "renumbered", "conflict, took a", "conflict, took b")
"""The groups of ``MergeResult.taken``, in the order a summary says them."""


@dataclass(frozen=True)
class Conflict:
    """One id (or header/defaults key) both sides changed, each its own way."""

    kind: str                    # "run", "source", "raceway", "job", "defaults"
    id: str                      # run or source id, or the key for job/defaults
    fields: tuple[tuple[str, object, object], ...]  # (field, value in A, value in B)

    def __str__(self) -> str:
        diffs = "; ".join(f"{name}: A has {_show(va)}, B has {_show(vb)}"
                          for name, va, vb in self.fields)
        label = (f"{self.kind} {self.id}" if self.kind in ("run", "source", "raceway")
                 else f"[{self.kind}] {self.id}")
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
    """``TAKEN_KEYS`` -> ``"run R1"`` / ``"source LP1"`` labels (``renumbered``: ``"run R7 of B
    is now R31"``)."""
    renamed: dict[str, str] = field(default_factory=dict)
    """B's run ids that were renumbered: old id -> new id."""

    @property
    def ok(self) -> bool:
        return self.job is not None

    def summary(self) -> str:
        """One line: how many of each group (``3 in both, 2 from B only, ...``)."""
        words = {"both": "in both", "a only": "from A only", "b only": "from B only"}
        parts = [f"{len(self.taken[k])} {words.get(k, k)}" for k in TAKEN_KEYS
                 if self.taken.get(k) or k in words]
        return ", ".join(parts)


def _diff(da: dict, db: dict) -> tuple[tuple[str, object, object], ...]:
    keys = list(da) + [k for k in db if k not in da]
    return tuple((k, da.get(k), db.get(k)) for k in keys if da.get(k) != db.get(k))


def _dump(model) -> dict:
    return model.model_dump(by_alias=True, exclude_defaults=True, mode="json")


_MEASURED = {"length", "segments", "bends", "measured_on"}
"""What a re-measure changes (the route), dated by ``measured_on``."""


def _remeasured(da: dict, db: dict) -> Side | None:
    """The side that re-measured a run the other left as it was (no base needed: ``measured_on``
    tells which is later), or None when the difference is anything else."""
    diffs = {name for name, _, _ in _diff(da, db)}
    if not diffs or not diffs <= _MEASURED:
        return None
    ma, mb = da.get("measured_on"), db.get("measured_on")
    if ma == mb:
        return None
    if mb is None or (ma is not None and ma > mb):
        return "a"
    return "b"


_ID_NUMBER = re.compile(r"^(.*?)(\d+)$")


def _free_id(old: str, used: set[str]) -> str:
    """The next free id of the kind of ``old``: ``R7`` -> one past the highest ``R``-number in
    use; an id without a number gets ``-2``, ``-3``..."""
    match = _ID_NUMBER.match(old)
    prefix = match.group(1) if match else old + "-"
    pattern = re.compile(re.escape(prefix) + r"(\d+)$")
    numbers = [int(m.group(1)) for u in used if (m := pattern.match(u))]
    n = max(numbers, default=1) + 1
    while f"{prefix}{n}" in used or len(f"{prefix}{n}") > 40:
        n += 1
        if len(f"{prefix}{n}") > 40:
            prefix = prefix[: 40 - len(str(n))]
    return f"{prefix}{n}"


def merge_jobs(a: Job, b: Job, prefer: Side | None = None, base: Job | None = None) -> MergeResult:
    """Merge walk ``b`` into walk ``a`` (three-way when ``base`` is given); see the module
    docstring for the rules."""
    conflicts: list[Conflict] = []
    taken: dict[str, list[str]] = {k: [] for k in TAKEN_KEYS}
    renamed: dict[str, str] = {}

    def settle(kind: str, ident: str, item_a, item_b, diffs):
        conflicts.append(Conflict(kind, ident, diffs))
        side = prefer or "a"
        taken[f"conflict, took {side}"].append(f"{kind} {ident}")
        return item_a if side == "a" else item_b

    # -- header and defaults: key by key ----------------------------------------------------
    merged_parts = {}
    for part in ("job", "defaults"):
        da, db = _dump(getattr(a, part)), _dump(getattr(b, part))
        d0 = _dump(getattr(base, part)) if base is not None else None
        out = {}
        for key in list(da) + [k for k in db if k not in da]:
            va, vb = da.get(key), db.get(key)
            if va == vb:
                value = va
            elif d0 is not None and va == d0.get(key):
                value = vb
            elif d0 is not None and vb == d0.get(key):
                value = va
            elif d0 is None and (key not in da or key not in db):
                value = va if key in da else vb
            else:
                value = settle(part, key, va, vb, ((key, va, vb),))
            if value is not None:
                out[key] = value
        merged_parts[part] = type(getattr(a, part)).model_validate(out)

    # -- sources, raceways and runs: by id ---------------------------------------------------
    def items(kind: str, list_a, list_b, list_0, used: set[str]):
        by_a = {x.id: x for x in list_a}
        by_b = {x.id: x for x in list_b}
        by_0 = {x.id: x for x in list_0} if list_0 is not None else None
        out: list = []
        extra: list = []   # B's renumbered runs, after B's own

        def one(ident: str):
            x, y = by_a.get(ident), by_b.get(ident)
            o = by_0.get(ident) if by_0 is not None else None
            label = f"{kind} {ident}"
            dx = _dump(x) if x is not None else None
            dy = _dump(y) if y is not None else None
            d0 = _dump(o) if o is not None else None
            if dx == dy:
                taken["both"].append(label)
                return x
            if by_0 is not None and o is not None:   # it was in the base
                if dx == d0:
                    taken["deleted in b" if y is None else "changed in b"].append(label)
                    return y
                if dy == d0:
                    taken["deleted in a" if x is None else "changed in a"].append(label)
                    return x
                if x is None or y is None:   # deleted on one side, changed on the other
                    return settle(kind, ident, x, y, (("the " + kind,
                                                       "deleted" if x is None else "changed",
                                                       "deleted" if y is None else "changed"),))
                return settle(kind, ident, x, y, _diff(dx, dy))
            # new on one side or both (or there is no base)
            if y is None:
                taken["a only"].append(label)
                return x
            if x is None:
                taken["b only"].append(label)
                return y
            if kind == "run" and (x.from_, x.to) != (y.from_, y.to):
                new_id = _free_id(ident, used)
                used.add(new_id)
                renamed[ident] = new_id
                taken["a only"].append(label)
                taken["renumbered"].append(f"run {ident} of B is now {new_id}")
                extra.append(y.model_copy(update={"id": new_id}))
                return x
            if by_0 is None and kind == "run":
                side = _remeasured(dx, dy)
                if side is not None:
                    taken[f"re-measured in {side}"].append(label)
                    return x if side == "a" else y
            return settle(kind, ident, x, y, _diff(dx, dy))

        for x in list_a:
            kept = one(x.id)
            if kept is not None:
                out.append(kept)
        for y in list_b:
            if y.id not in by_a:
                kept = one(y.id)
                if kept is not None:
                    out.append(kept)
        if by_0 is not None:  # deleted on both sides: nothing to keep, but say so
            for o in list_0:
                if o.id not in by_a and o.id not in by_b:
                    taken["deleted in both"].append(f"{kind} {o.id}")
        return [item.model_copy(deep=True) for item in out + extra]

    sources = items("source", a.sources, b.sources, base.sources if base else None,
                    {s.id for s in (*a.sources, *b.sources)})
    raceways = items("raceway", a.raceways, b.raceways, base.raceways if base else None,
                     {w.id for w in (*a.raceways, *b.raceways)})
    run_ids = {r.id for r in (*a.runs, *b.runs, *(base.runs if base else ()))}
    runs = items("run", a.runs, b.runs, base.runs if base else None, run_ids)
    if conflicts and prefer is None:
        return MergeResult(None, conflicts, taken, renamed)
    job = Job(schema=max(a.schema, b.schema), job=merged_parts["job"],
              defaults=merged_parts["defaults"], sources=sources, runs=runs,
              raceways=raceways)
    return MergeResult(job, conflicts, taken, renamed)


def renumbered_run(result: MergeResult, run: Run) -> Run:
    """``run`` of B as it stands in the merged walk (its id after renumbering)."""
    new = result.renamed.get(run.id)
    return run if new is None else run.model_copy(update={"id": new})
