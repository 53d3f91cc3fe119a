"""The incremental path: after one run was edited in place, redo only what it touches.

The run itself; its source placed and summed again (``gaugewalk.model.walk.feeder_loads``: a
change of load or of place can move the other runs the tool places), and every source above it
while what its feeder carries changes, up to a feeder that gives its own load (evaluated again,
for its check against what its source carries, and not climbed past); those feeders sized again, top-down (an edit of the feeder into a transformer, which sets the rules of
everything on its secondary, computes the whole walk); then below every source whose bus drop changed, only the runs whose size
could change (with problems, pushed over the total target, or upsized for drop where the limit
on their drop loosened or is no longer met); the rest have their total drop shifted. A walk with shared raceways is computed whole. The result equals ``compute_job`` of the edited walk (tests compare
them run by run).

Public API:

- ``recompute_run(job, result, run_id) -> JobResult``: falls back to
  ``gaugewalk.model.walk.compute.compute_job`` when runs or sources were added, removed or
  re-pointed.
"""

from __future__ import annotations

from gaugewalk.model.engine.contract import RunResult, RunSpec, with_fields
from gaugewalk.model.engine.sizing.pick import drop_limit
from gaugewalk.model.walk.compute import JobResult, WalkState, compute_job
from gaugewalk.model.walk.graph import SupplyGraph
from gaugewalk.model.walk.job import Job, Run

_EPS = 1e-9


def recompute_run(job: Job, result: JobResult, run_id: str) -> JobResult:
    """Update ``result`` after run ``run_id`` was edited in place; returns the updated result.

    Redoes the run, its source's placement and sums and those above it while they change, the
    feeders whose load changed; then, below every source whose drop changed, re-evaluates only
    the runs whose size could change (``_size_stays``) and shifts the total drop of the rest. Falls back to ``compute_job`` when runs or
    sources were added, removed or re-pointed, and on a walk with shared raceways (a run's
    change moves the adjustment and fill of every run beside it). Only ``run_id`` may have changed since
    ``result`` was computed (edited in place or put in place of the run of the same id, as the
    app does).
    """
    run = job.run(run_id)
    if run is None or job.raceways or result.raceways:
        return compute_job(job)
    walk = result._walk
    if not isinstance(walk, SupplyGraph) or not walk.fits(job, run, result._shape):
        walk = SupplyGraph(job)
        if walk.shape() != result._shape:
            return compute_job(job)
        result._walk = walk
    if run.from_ not in walk.sources or run.from_ not in result.lines:
        return compute_job(job)
    target = walk.sources.get(run.to)
    if target is not None and target.kind == "transformer" and walk.feeder.get(run.to) is run:
        return compute_job(job)  # its device and circuit set the transformer's rules below it
    state = WalkState(walk, result)
    # every run whose rows this update writes: the run, the runs of each source placed again
    # and of each source whose drop is carried down (``JobResult.changed_since`` looks at them)
    touched = {run.id}
    result._touched = touched
    if state.resolve_circuit(run) is None:
        state.forget(run)
    # the run's source and the sources above it, while what their feeders carry changes
    chain: list[Run] = []
    sid = run.from_
    changed = state.sum_source(sid)
    redone = {sid}   # the sources summed again or below a feeder done again
    touched.update(r.id for r in walk.children[sid])
    while changed:
        f = walk.feeder.get(sid)
        if f is None or f.from_ not in result.lines:
            break
        chain.append(f)
        if f.load is not None:
            break  # sized for its own load: evaluated again only to weigh it against its source's
        sid = f.from_
        changed = state.sum_source(sid)
        redone.add(sid)
        touched.update(r.id for r in walk.children[sid])
    # re-evaluate top-down: the feeders whose load changed, then the run itself
    is_feeder = walk.feeder.get(run.to) is run
    dirty: list[str] = []
    for f in reversed(chain):
        state.evaluate_run(f, result.source_drop_pct.get(f.from_, 0.0))
        dirty.append(f.to)
    state.evaluate_run(run, result.source_drop_pct.get(run.from_, 0.0))
    if is_feeder:
        dirty.append(run.to)
    _refresh_below(state, dirty, skip={f.id for f in chain} | {run.id}, touched=touched,
                   redone=redone)
    state.start_dips(touched)   # the runs below every feeder done again are among them
    state.chain_problems(redone)
    state.assemble_problems()
    return result


def _refresh_below(state: WalkState, dirty: list[str], skip: set[str], touched: set[str],
                   redone: set[str]) -> None:
    """Carry new bus drops down: shift the total where the size cannot change, else
    re-evaluate the run. The runs of every source visited are added to ``touched``, and the
    source to ``redone`` (the source a feeder done again feeds is visited after it)."""
    walk, result = state.walk, state.result
    stack = list(reversed(dirty))
    while stack:
        sid = stack.pop()
        redone.add(sid)
        upstream = result.source_drop_pct.get(sid, 0.0)
        children = walk.children[sid]
        touched.update(r.id for r in children)
        for r in children:
            is_feeder = walk.feeder.get(r.to) is r
            if r.id in skip:
                continue
            old = result.runs.get(r.id)
            spec = result._specs.get(r.id)
            if old is None or spec is None:
                state.evaluate_run(r, upstream)
            elif spec.upstream_drop_pct == upstream:
                continue
            elif _size_stays(old, spec, new := with_fields(spec, upstream_drop_pct=upstream),
                             is_feeder, result._passed.get(r.id)):
                total = upstream + old.voltage_drop_pct
                margins = dict(old.margins)
                if "total_drop_pct" in margins:
                    margins["total_drop_pct"] = spec.max_total_drop_pct - total
                spec = new
                result._specs[r.id] = spec
                state.store(r, with_fields(old, total_drop_pct=total, margins=margins),
                            is_feeder, spec)
            else:
                state.evaluate_run(r, upstream, new)
            if is_feeder and r.to not in dirty:
                stack.append(r.to)


def _size_stays(old: RunResult, spec: RunSpec, new: RunSpec, is_feeder: bool,
                passed: float | None) -> bool:
    """True when the engine gives ``old`` again for ``new`` (``spec`` with another drop up to
    its source), but for the total drop: ``old`` has no problems and its size was not picked for
    the drop and stays within the total target; or (a branch) it was picked for the drop, and
    under the new limit on the drop (``pick.drop_limit``) it is the smallest size that meets it
    again: a limit no looser that it still meets (every smaller size missed the looser one), or
    a looser limit below ``passed``, the least drop of the smaller sizes its evaluation passed
    over for their drop (``evaluate_picked``; the drop of a size does not depend on the drop up
    to its source). Its notes name its own drop only, so they stay too."""
    if not old.ok or old.load_kind == "fire-pump":   # its supply notes read the walk above it
        return False
    if old.governed_by != "voltage drop":
        return new.upstream_drop_pct + old.voltage_drop_pct <= spec.max_total_drop_pct + _EPS
    if is_feeder:
        return False
    limit = drop_limit(new)
    if limit <= drop_limit(spec):
        return old.voltage_drop_pct <= limit
    return passed is not None and limit < passed
