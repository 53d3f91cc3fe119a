"""One open walk in the app: the job, its computed results, trial changes, undo and saving.

No Textual here, so it can be tested and timed on its own. Runs, sources and defaults are never
changed in place: every change puts new objects into the job's lists, so an undo step is just the
previous lists (copies of references, cheap even with thousands of runs). Every stored change
reaches the disk through ``gaugewalk.model.session.hold.WalkHold``, the same path the writing
commands take: at once, or, once ``save_behind`` is called (the app), by one writer thread in the
order of the changes (``gaugewalk.model.session.save_behind``) while editing goes on.
"""

from __future__ import annotations

import math
import os
from collections.abc import Callable
from dataclasses import dataclass, field
from datetime import datetime
from pathlib import Path
from typing import TYPE_CHECKING

from gaugewalk.model.engine.contract import RunResult
from gaugewalk.model.session.hold import WalkHold
from gaugewalk.model.session.save_behind import SaveBehind
from gaugewalk.model.walk.graph import SupplyGraph
from gaugewalk.model.walk.job import Defaults, Job, JobHeader, Run, Source
from gaugewalk.model.walk.merge import Side
from gaugewalk.model.walk.problems import Problem
from gaugewalk.model.walkfile.write import Written

if TYPE_CHECKING:
    from gaugewalk.model.walk.compute import JobResult
    from gaugewalk.model.walk.starting import StartDip

# Statuses shown in the run sheet: a symbol AND words, never colour alone.
STATUS_OK = "✓ ok"
STATUS_DROP = "▲ over drop"
STATUS_TOTAL = "▲ over total"
STATUS_AMPS = "✗ short amps"
STATUS_ERROR = "✗ not sized"


@dataclass
class Snapshot:
    """The walk's lists before (or after) one change, and what the change was."""

    label: str
    runs: list[Run]
    sources: list[Source]
    defaults: Defaults
    header: JobHeader
    focus: str | None = None


@dataclass
class RunStatus:
    """What is wrong with a run, in short words for the sheet and sentences for the detail."""

    words: str
    flag: bool
    problems: tuple[str, ...] = ()


@dataclass
class Preview:
    """A run sized in the context of the walk before it is stored: its result, or the problems
    (field name or None, sentence) that stop it."""

    result: RunResult | None
    problems: list[Problem] = field(default_factory=list)
    cannot_size: str | None = None   # why it cannot be sized yet (does not stop storing)
    dip: StartDip | None = None      # a motor's starting dip from the service


@dataclass
class TrialOutcome:
    """A trial change computed on a copy of the walk. ``downstream`` lists, for runs fed through
    the changed run: (run id, total drop before, after [%], flagged before, after)."""

    result: object | None
    problems: list[Problem] = field(default_factory=list)
    downstream: list[tuple[str, float, float, bool, bool]] = field(default_factory=list)


@dataclass
class _Outcome:
    """How one save in the writer thread went: ``job`` (the walk it was handed) written, or
    refused because the file changed on disk (``clash``), or failed (``failure``, why)."""

    job: Job
    notice: str | None = None
    clash: bool = False
    failure: str | None = None

    @property
    def saved(self) -> bool:
        return not self.clash and self.failure is None


@dataclass
class SaveState:
    saved: bool = True
    message: str | None = None     # why the last save failed, if it did
    notice: str | None = None      # said once after a save (e.g. comments were dropped)
    changed_outside: bool = False  # not saved because the file changed on disk (see outside.py)
    kept: Path | None = None       # where the walk that could not be saved is kept whole


class WalkSession:
    """A walk file opened for editing."""

    def __init__(self, path: Path, job: Job, *, compute: bool = True,
                 hold: WalkHold | None = None) -> None:
        self.path = Path(path)
        self.job = job
        self.result = None
        self.job_problems: list[Problem] = []   # the walk's problems about no one run
        self.state = SaveState()
        # the walk as last read or saved: an outside change is merged against it (outside.py)
        self.base = _copy(job)
        self.started = datetime.now()   # names the file an unsaved walk is kept in
        self._draft_until_saved = False  # a stored run's draft stays on disk until it is saved
        self.history: list[Snapshot] = []
        self.future: list[Snapshot] = []
        self.draft: dict[str, str] | None = None
        self.busy = False   # True while the whole walk is being sized in the background
        self.read_only: str | None = None   # why the walk cannot be changed here, if it cannot
        self.lock_refusal = None   # the WalkLocked that made it read-only, if a lock did
        # True when the cross-checks are known to find nothing in the walk as it is (a walk
        # read from its file, or one a change left so): one run put in place of another is
        # then checked on its own (checks.put_keeps_clean), not the whole walk
        self.references_clean = False
        # each recompute adds one to ``version``; ``changed``: the runs whose row it changed
        # (None: any run may have changed), for a face that shows the walk to redo only those
        self.version = 0
        self.changed: set[str] | None = None
        self._saver: SaveBehind[Job] | None = None   # set by ``save_behind``
        self._written = Written()   # each run's text as last saved (write.dumps_walk)
        self._outcomes: list[_Outcome] = []   # how the writer's saves went, for ``after_save``
        if hold is None:
            hold = WalkHold(self.path, "gaugewalk app")
            hold.note()  # what was read: a save checks it is still there
        self.hold = hold
        if compute:
            self.recompute()

    # ----- opening ----------------------------------------------------------------------
    @classmethod
    def open(cls, path: str | Path, *, compute: bool = True) -> "WalkSession":
        """Read a walk; raises ``gaugewalk.model.walkfile.read.WalkFileError`` for a bad file. With
        ``compute=False`` the runs are not sized yet (call ``recompute``)."""
        hold = WalkHold(path, "gaugewalk app")
        job = hold.read()  # noted before reading: a save in between is then caught
        session = cls(Path(path), job, compute=compute, hold=hold)
        session.references_clean = True  # read_walk refuses a walk the cross-checks find fault in
        return session

    @classmethod
    def create(
        cls, path: str | Path, name: str = "", service_id: str = "SVC",
        service_system: str | None = "208Y/120V 3ph 4w",
    ) -> "WalkSession":
        """Start a new walk at ``path`` (with its service) and write it at once."""
        from datetime import date

        from gaugewalk.model.walk.job import new_walk

        job = new_walk(
            name=name or Path(path).stem, service_system=service_system, service_id=service_id,
            walked_on=date.today(),
        )
        session = cls(Path(path), job)
        session.save()
        return session

    # ----- computing --------------------------------------------------------------------
    def recompute(self, edited: str | None = None) -> None:
        """Compute the walk again; after one run was edited in place (same from and to), only
        what that run touches."""
        from gaugewalk.model.walk.compute import compute_job
        from gaugewalk.model.walk.recompute import recompute_run

        before = self.result
        if edited is not None and before is not None:
            marks = before.marks()
            self.result = recompute_run(self.job, before, edited)
            same = self.result is before  # else it fell back to a whole computation
            self.changed = before.changed_since(marks) | {edited} if same else None
        else:
            self.result = compute_job(self.job)
            self.changed = None
        self.version += 1
        self.job_problems = [p for p in self.result.problems if p.about != "run"]

    def result_for(self, run_id: str) -> RunResult | None:
        if self.result is None:
            return None
        return self.result.runs.get(run_id)

    def source_drop(self, source_id: str) -> float | None:
        """Cumulative drop from the service to this source's bus [%], if known."""
        if self.result is None:
            return None
        return self.result.source_drop_pct.get(source_id)

    def targets(self, run: Run) -> tuple[float, float]:
        """(drop target for this run, total target) [%], as its spec holds them: a fire pump's
        by NEC 695.7(B) (``kinds.drop_targets``)."""
        d = self.job.defaults
        load = run.load
        if load is not None and load.kind == "fire-pump":
            from gaugewalk.model.engine.sizing.kinds import drop_targets
            from gaugewalk.model.walk.equipment import equipment_of

            own, total, _start = drop_targets(equipment_of(run), run.max_drop_pct,
                                              d.branch_drop_pct, d.total_drop_pct,
                                              d.starting_drop_pct)
            return own, total
        if run.max_drop_pct is not None:
            own = run.max_drop_pct
        else:
            own = d.feeder_drop_pct if self.job.is_feeder(run) else d.branch_drop_pct
        return own, d.total_drop_pct

    def status(self, run: Run, res: RunResult | None = None,
               job_result: JobResult | None = None) -> RunStatus:
        """Classify a run: short of ampacity, over its drop target, over the total, or ok.

        The walk's own problems for the run are added from ``job_result`` (a trial's), or from
        the stored walk when ``res`` is the stored result; a previewed result is judged alone,
        so a problem the edit fixes is not shown against it."""
        if self.result is None:
            return RunStatus("… sizing", False, ())
        stored = self.result_for(run.id)
        res = res if res is not None else stored
        walk = job_result if job_result is not None else (self.result if res is stored else None)
        extra = tuple(p.message for p in walk.run_problems(run.id)) if walk is not None else ()
        if res is None:
            return RunStatus(STATUS_ERROR, True, extra or ("this run could not be sized",))
        problems = tuple(res.problems) + tuple(p for p in extra if p not in res.problems)
        own, total = self.targets(run)
        if res.ampacity_a + 1e-9 < res.required_ampacity_a:
            words = STATUS_AMPS
        elif res.voltage_drop_pct > own + 1e-9:
            words = STATUS_DROP
        elif res.total_drop_pct > total + 1e-9:
            words = STATUS_TOTAL
        elif problems:
            words = "✗ " + _short(problems[0])
        else:
            return RunStatus(STATUS_OK, False, ())
        return RunStatus(words, True, problems)

    # ----- trying before storing ---------------------------------------------------------
    def _with(self, run: Run, replaces: str | None, new_source: Source | None,
              more_sources: tuple[Source, ...] = ()) -> Job:
        """A copy of the job (sharing unchanged runs) with ``run`` stored."""
        runs = list(self.job.runs)
        sources = list(self.job.sources)
        extra = ((new_source,) if new_source is not None else ()) + more_sources
        _put(runs, sources, run, replaces, extra)
        trial = self.job.model_copy(update={"runs": runs, "sources": sources})
        trial.reindex()
        return trial

    def _keeps_clean(self, run: Run, replaces: str | None, new_sources: tuple[Source, ...]) -> bool:
        """True when storing ``run`` (in place of run ``replaces``) leaves a walk the cross-checks
        find nothing in, known from the run and its ends alone; False: check the whole walk."""
        from gaugewalk.model.walk.checks import put_keeps_clean

        if not self.references_clean or new_sources:
            return False
        return put_keeps_clean(self.job, run, self.job.run(replaces) if replaces else None)

    def _reference_problems(self, trial: Job, run: Run, replaces: str | None = None,
                            new_sources: tuple[Source, ...] = ()) -> list[Problem]:
        """The cross-check problems of ``trial`` (the walk with ``run`` stored in place of run
        ``replaces`` and ``new_sources``) about ``run`` or the sources at its ends (those said
        against its ``to`` field)."""
        from gaugewalk.model.walk.checks import check_references
        from gaugewalk.model.walk.problems import Locator

        if self._keeps_clean(run, replaces, new_sources):
            return []
        out = []
        for p in check_references(trial, Locator(""), self.path.name):
            if p.is_about("run", (run.id,)):
                out.append(p)
            elif p.is_about("source", (run.to, run.from_)):
                out.append(p._replace(field="to"))
        return out

    def preview(self, run: Run, *, replaces: str | None = None,
                new_source: Source | None = None) -> Preview:
        """Size ``run`` as if stored (nothing is changed or saved).

        Problems that would make the walk file invalid (a source that does not exist, a branch
        without a load...) stop it. The run is sized alone against the drop at its source now;
        the small change its load makes to the feeders above shows once it is stored."""
        from gaugewalk.model.engine.circuits import CircuitError
        from gaugewalk.model.engine.loads import LoadError
        from gaugewalk.model.walk.compute import size_run_spec
        from gaugewalk.model.walk.starting import dip_at_motor

        trial = self._with(run, replaces, new_source)
        problems = self._reference_problems(
            trial, run, replaces, (new_source,) if new_source is not None else ())
        if problems:
            return Preview(None, problems)
        upstream = self.source_drop(run.from_) or 0.0
        try:
            res, spec = size_run_spec(trial, run, upstream, self.result)
        except CircuitError as exc:
            return Preview(None, [Problem("", None, "run", run.id, "connection", str(exc))])
        except (LoadError, ValueError) as exc:
            return Preview(None, [], cannot_size=str(exc))
        walk = self.result._walk if self.result is not None else None
        dip = (dip_at_motor(walk, self.result, run, res, spec)
               if walk is not None and run.to not in walk.sources else None)
        return Preview(res, dip=dip)

    def trial(self, run: Run, sources: tuple[Source, ...] = ()) -> TrialOutcome:
        """Compute the walk with ``run`` in place of the stored run of the same id (and
        ``sources`` in place of those of the same ids: a transformer secondary at another
        voltage, with the panels it feeds)."""
        trial = self._with(run, run.id, None, tuple(sources))
        problems = self.hold.added_problems(trial, self.job)
        if problems:
            return TrialOutcome(None, sorted(problems, key=Problem.brief))
        from gaugewalk.model.walk.compute import compute_job

        result = compute_job(trial)
        if run.id not in result.runs:
            return TrialOutcome(result, [Problem("", None, "run", run.id, None,
                                                 "this change leaves the run impossible to size")])
        down: list[tuple[str, float, float, bool, bool]] = []
        if self.job.is_feeder(run):
            for r in SupplyGraph(self.job).runs_below(run.to):
                b = self.result_for(r.id)
                a = result.runs.get(r.id)
                if b is None or a is None:
                    continue
                down.append((r.id, b.total_drop_pct, a.total_drop_pct,
                             self.status(r, b).flag, self.status(r, a, result).flag))
        return TrialOutcome(result, [], down)

    def same_system_below(self, source_id: str, system: str) -> list[Source]:
        """The source and every source below it on the same system, down to the next
        transformer: what moves together when a transformer secondary is tried at another
        voltage."""
        return SupplyGraph(self.job).sources_below(
            source_id, lambda dest: dest.kind != "transformer" and dest.system == system)

    # ----- changing ---------------------------------------------------------------------
    def _snapshot(self, label: str, focus: str | None) -> Snapshot:
        job = self.job
        return Snapshot(label, list(job.runs), list(job.sources), job.defaults, job.job, focus)

    def _restore(self, snap: Snapshot) -> None:
        self.references_clean = False  # not known for the walk as it was: the next change checks
        self.job.runs[:] = snap.runs
        self.job.sources[:] = snap.sources
        if self.job.defaults is not snap.defaults:
            self.job.defaults = snap.defaults
        if self.job.job is not snap.header:
            self.job.job = snap.header
        self._touch()

    def _job_at(self, snap: Snapshot) -> Job:
        """A copy of the job as ``snap`` holds it (sharing its runs and sources)."""
        job = self.job.model_copy(update={"runs": list(snap.runs), "sources": list(snap.sources),
                                          "defaults": snap.defaults, "job": snap.header})
        job.reindex()
        return job

    def _touch(self) -> None:
        # The lists were changed in place by slices (items of other ids where others stood):
        # the job's id lookups are forgotten (``Job.reindex``).
        self.job.reindex()

    def _commit(self, label: str, focus: str | None, change,
                edited: str | None = None, keeps_clean: bool = False) -> str | None:
        """Make a change, recompute and save. A change that would leave the walk unreadable
        (a panel nothing feeds, a run from a missing source...) is taken back and the reason
        returned; nothing is saved then. ``change()`` returns True when it kept the job's id
        lookups up to date itself. ``keeps_clean``: the change is known to leave a walk the
        cross-checks find nothing in (``_keeps_clean``), so the whole walk is not checked."""
        before = self._snapshot(label, focus)
        was_clean = self.references_clean
        if not change():  # True: the change kept the job's id lookups up to date itself
            self._touch()
        found = [] if keeps_clean else self.hold.added_problems(self.job)
        new = found
        if new:  # only what the change adds refuses it: compare with the walk before it
            new = self.hold.added_problems(self.job, self._job_at(before))
        if new:
            self._restore(before)
            self.references_clean = was_clean  # the walk is again as it was
            return "; ".join(sorted({p.brief() for p in new}))
        self.references_clean = not found
        self.history.append(before)
        self.future.clear()
        # the file holds the runs as given, nothing computed from them: saved behind (the
        # app), the disk's wait starts now and runs beside the recompute
        self._save_change()
        self.recompute(edited)
        return None

    def put_run(self, run: Run, *, replaces: str | None = None, new_source: Source | None = None,
                sources: tuple[Source, ...] = ()) -> str | None:
        """Store a new run, or put ``run`` in place of the run ``replaces``; optionally declare
        the panel the run feeds (or replace the source of that id). Returns why it was refused,
        or None."""

        label = f"edit {run.id}" if replaces else f"add {run.id}"
        old = self.job.run(replaces) if replaces else None

        def change() -> bool:
            _put(self.job.runs, self.job.sources, run, replaces,
                 ((new_source,) if new_source is not None else ()) + tuple(sources),
                 self.job.run_position(replaces) if replaces else None)
            # the id lookups follow an item added, or put in place of one of its id, on their
            # own (no pass over every run); a run stored under a new id drops them
            return old is None or old.id == run.id

        in_place = (
            old is not None and old.id == run.id and old.from_ == run.from_ and old.to == run.to
            and new_source is None and not sources
        )
        new_sources = ((new_source,) if new_source is not None else ()) + tuple(sources)
        return self._commit(label, run.id, change, edited=run.id if in_place else None,
                            keeps_clean=self._keeps_clean(run, replaces, new_sources))

    def delete_refusal(self, run_id: str) -> str | None:
        """Why a run cannot be deleted (a feeder whose panel still feeds runs), or None."""
        run = self.job.run(run_id)
        if run is None:
            return f"there is no run {run_id}"
        if self.job.is_feeder(run):
            below = self.job.runs_from(run.to)
            if below:
                return (f"{run_id} feeds {run.to}, which still feeds {len(below)} run(s); "
                        f"delete or move them first")
        return None

    def delete_run(self, run_id: str) -> str | None:
        """Delete a run; a feeder goes with the panel it fed (which feeds nothing). Returns why
        it was refused, or None."""
        refusal = self.delete_refusal(run_id)
        if refusal:
            return refusal
        run = self.job.run(run_id)
        gone_source = run.to if self.job.is_feeder(run) else None

        def change() -> None:
            self.job.runs[:] = [r for r in self.job.runs if r.id != run_id]
            if gone_source is not None:
                self.job.sources[:] = [s for s in self.job.sources if s.id != gone_source]

        return self._commit(f"delete {run_id}", run_id, change)

    def keep_positions(self) -> tuple[int, list[str], str | None]:
        """Write the positions the tool picked into every run the walk does not place, as one
        change (one undo). Returns how many, the runs with no free position, and why the change
        was refused (or None)."""
        from gaugewalk.model.walk.schedule import positions_to_keep

        if self.result is None:
            return 0, [], "the walk is not sized yet"
        positions, unplaced = positions_to_keep(self.job, self.result)
        if not positions:
            return 0, unplaced, None

        def change() -> None:
            self.job.runs[:] = [r.model_copy(update={"position": positions[r.id]})
                                if r.id in positions else r for r in self.job.runs]

        return len(positions), unplaced, self._commit("keep positions", None, change)

    def set_job(self, header: JobHeader, defaults: Defaults) -> str | None:
        """Store new job settings; every run recomputes."""

        def change() -> None:
            self.job.job = header
            self.job.defaults = defaults

        return self._commit("job settings", None, change)

    def undo(self) -> Snapshot | None:
        """Go back one change; returns what was undone (its label and run) or None."""
        return self._step(self.history, self.future)

    def redo(self) -> Snapshot | None:
        """Do again what was undone; returns it or None."""
        return self._step(self.future, self.history)

    def _step(self, source: list[Snapshot], target: list[Snapshot]) -> Snapshot | None:
        """Restore the last snapshot of ``source``, keeping the present on ``target``."""
        if not source:
            return None
        snap = source.pop()
        target.append(self._snapshot(snap.label, snap.focus))
        edited = self._only_run_changed(snap)
        self._restore(snap)
        self.recompute(edited)   # one run edited in place: only what it touches
        self._save_change()
        return snap

    def _only_run_changed(self, snap: Snapshot) -> str | None:
        """The id of the one run that differs between the walk now and ``snap`` (in the same
        place, under the same id; every other run, every source and the settings the same
        objects), or None: an undo or redo of one run's edit is then recomputed in place
        (``recompute_run`` still computes the whole walk where that run was re-pointed)."""
        job = self.job
        if (snap.defaults is not job.defaults or snap.header is not job.job
                or len(snap.sources) != len(job.sources) or len(snap.runs) != len(job.runs)
                or any(a is not b for a, b in zip(snap.sources, job.sources, strict=True))):
            return None
        found = None
        for a, b in zip(snap.runs, job.runs, strict=True):
            if a is not b:
                if found is not None or a.id != b.id:
                    return None
                found = a.id
        return found

    # ----- saving -----------------------------------------------------------------------
    # With ``save_behind`` (the app) the writer thread only writes the walk it was handed through
    # the hold and notes how it went (``_outcomes``); everything else a save leads to (a change
    # on disk merged in, a walk that cannot be saved kept whole, the draft file cleared) is done
    # on the editing thread, by ``after_save`` once the writer is idle.
    def save_behind(self, done: Callable[[], None] | None = None) -> None:
        """From now on each change is saved by one writer thread, in order, while editing goes
        on (``SaveBehind``); ``done()`` is called in that thread after each save: the face then
        calls ``after_save`` on its own thread, and ``state`` says how it went."""
        self._saver = SaveBehind(self._write_behind, done)

    def warm_save(self) -> None:
        """Write each run's text once ahead of the first save (``dumps_walk`` keeping them in
        the session's ``written``), so the first change saves as quickly as the next. Safe in
        any thread: a save meanwhile writes its own walk whole, only without the texts."""
        from gaugewalk.model.walkfile.write import dumps_walk

        dumps_walk(self._job_at(self._snapshot("", None)), self._written)

    @property
    def saves_behind(self) -> bool:
        """True once ``save_behind`` was called."""
        return self._saver is not None

    @property
    def saving(self) -> bool:
        """True while a change is waiting to be written, or written and not yet taken in by
        ``after_save`` (the file on disk is then the app's own, whatever it holds)."""
        return self._saver is not None and (self._saver.pending or bool(self._outcomes))

    @property
    def writing(self) -> bool:
        """True while the writer thread has a save still to write."""
        return self._saver is not None and self._saver.pending

    def settle(self, timeout: float | None = None) -> bool:
        """Wait until every change is written (or failed to be: see ``state``), then
        ``after_save``; False when ``timeout`` [s] ran out first."""
        done = self._saver is None or self._saver.wait(timeout)
        self.after_save()
        return done

    def _save_change(self) -> None:
        """Save after a change: now, or handed to the writer thread with a copy of the walk
        that later changes do not touch (they put new lists in)."""
        if self._saver is None or self.read_only:
            self.save()
            return
        self._saver.ask(_copy(self.job))

    def _write_behind(self, job: Job) -> None:
        """In the writer thread: write ``job`` through the hold (refused, never written over,
        when the file changed on disk) and note how it went; nothing else."""
        from gaugewalk.model.walkfile.fingerprint import ChangedOnDisk

        try:
            notice = self.hold.save(job, written=self._written)
        except ChangedOnDisk:
            self._outcomes.append(_Outcome(job, clash=True))
        except Exception as exc:  # said by ``after_save`` on the editing thread
            self._outcomes.append(_Outcome(job, failure=self._why(exc)))
        else:
            self._outcomes.append(_Outcome(job, notice=notice.message if notice else None))

    def after_save(self) -> None:
        """On the editing thread, once the writer has written every change asked for (the app
        calls it from ``done``): take in how the saves went. The last one says it: saved (the
        stored card's draft file then goes); refused because the file changed on disk (that
        change is merged in here and saved, or, when it cannot be, everything open is kept
        whole beside the walk); failed (kept whole, the draft stays)."""
        if self._saver is None or self._saver.pending or not self._outcomes:
            return
        outcomes, self._outcomes = self._outcomes, []
        notices = []
        for outcome in outcomes:
            if outcome.saved:
                self.base = outcome.job   # the walk on disk now: outside changes merge against it
                if outcome.notice:
                    notices.append(outcome.notice)
        last = outcomes[-1]
        if last.clash:
            self._take_outside(prefer=None)
        elif last.failure is not None:
            self._not_saved(last.failure)
        else:
            self._saved(" ".join(dict.fromkeys(notices)) or None, base=last.job)

    def save(self) -> bool:
        """Write the walk now (atomic, with a backup), after any change still waiting to be.
        When the file changed on disk since it was read, that change is merged in first where
        nothing clashes (``take_outside_change``). On failure the walk stays in memory, marked
        unsaved, with the reason in ``state.message``, and is kept whole in a file of its own
        (``state.kept``)."""
        from gaugewalk.model.walkfile.fingerprint import ChangedOnDisk

        if self.read_only:
            self.state = SaveState(False, f"read-only: {self.read_only}")
            return False
        if self._saver is not None:
            self._saver.ask(_copy(self.job))
            self._saver.wait()
            self.after_save()
            return self.state.saved
        try:
            notice = self.hold.save(self.job, written=self._written)
        except ChangedOnDisk:
            return self._take_outside(prefer=None)
        except Exception as exc:  # a walk the file code refuses: keep it in memory, say why
            return self._not_saved(self._why(exc))
        self._saved(notice.message if notice else None)
        return True

    def _why(self, exc: Exception) -> str:
        from gaugewalk.model.walkfile.read import WalkFileError

        if isinstance(exc, WalkFileError):
            return str(exc)
        if isinstance(exc, OSError):
            return f"cannot write {self.path}: {exc.strerror or exc}"
        return f"not saved: {exc}"

    def _saved(self, notice: str | None, base: Job | None = None) -> None:
        """Saved: ``base`` (default: the walk here, copied) is what the file now holds."""
        self.state = SaveState(True, None, notice or None)
        self.base = base if base is not None else _copy(self.job)
        if self._draft_until_saved and not self.draft:  # its run is on disk now
            self._draft_until_saved = False
            self.keep_draft(None)

    def _not_saved(self, message: str, changed_outside: bool = False) -> bool:
        from gaugewalk.model.session.outside import keep_unsaved

        kept = keep_unsaved(self.job, self.hold.path, self.started)
        if kept is not None:
            message += f". Everything open here is kept in {kept}"
        self.state = SaveState(False, message, changed_outside=changed_outside, kept=kept)
        return False

    # ----- a change on disk while the walk is open ------------------------------------------
    def changed_on_disk(self) -> bool:
        """True when the file no longer holds what this session last read or saved (cheap when
        it did not change: its size and time are looked at first). While a save of its own is
        waiting or not yet taken in (``saving``) it says False: the file is then the app's own,
        and ``after_save`` looks at any clash the writer met."""
        from gaugewalk.model.walkfile.fingerprint import fingerprint

        if self.saving:
            return False

        known = self.hold.fingerprint
        try:
            info = os.stat(self.hold.path)
        except FileNotFoundError:
            return known is not None
        except OSError:
            return False
        if known is not None and (info.st_size, info.st_mtime_ns) == (known.size, known.mtime_ns):
            return False
        now = fingerprint(self.hold.path)
        if known is not None and known.matches(now):
            self.hold.fingerprint = now   # touched, not changed
            return False
        return True

    def take_outside_change(self, prefer: Side | None = "b") -> str:
        """Take in the walk as it is on disk now: merged with the walk here against what this
        session last read or saved (runs added there and here both kept; a run both sides
        changed keeps this side with ``prefer="b"``, the other version stays in the backup
        ``NAME~``), then saved. Returns what happened, in a sentence."""
        if self._saver is not None:   # the writer idle first: the merge and its save are here
            self._saver.wait()
            for outcome in self._outcomes:
                if outcome.saved:
                    self.base = outcome.job
            self._outcomes.clear()
        self._take_outside(prefer)
        return str(self.state.notice if self.state.saved else self.state.message)

    def _take_outside(self, prefer: Side | None) -> bool:
        from gaugewalk.model.session.outside import merge_outside, read_theirs
        from gaugewalk.model.walkfile.fingerprint import ChangedOnDisk

        name = self.path.name
        theirs = read_theirs(self.hold.path)
        if theirs.job is None:
            if theirs.fingerprint is None and not os.path.lexists(self.hold.path):
                self.hold.fingerprint = None   # deleted: nothing there to keep, write it again
                said = f"{name} was deleted on disk; saved again from what is open here."
                return self._save_adopted(said)
            return self._not_saved(f"{name} changed on disk and {theirs.problem}; not saved, so "
                                   "that file is left as it is", changed_outside=True)
        merged = merge_outside(self.base, theirs.job, self.job, prefer)
        if merged.job is None:
            clash = "; ".join(str(c) for c in merged.conflicts[:3])
            more = f" and {len(merged.conflicts) - 3} more" if len(merged.conflicts) > 3 else ""
            return self._not_saved(f"{name} changed on disk since it was read, and both sides "
                                   f"changed the same thing: {clash}{more}; not saved, so "
                                   "neither is lost", changed_outside=True)
        refused = self.hold.refusals(merged.job)
        if refused:
            return self._not_saved(f"{name} changed on disk; with that change the walk here would "
                                   f"not be valid ({refused[0].brief()}); not saved",
                                   changed_outside=True)
        self._adopt(merged.job)
        self.hold.fingerprint = theirs.fingerprint
        if merged.job == theirs.job:   # nothing here that is not there: take it as it is
            self._saved(f"{name} changed on disk; reloaded it.")
            return True
        said = f"{name} changed on disk; merged with it ({merged.summary()})"
        said += "".join(f"; your run {old} is now {new} (that id was taken there)"
                        for old, new in merged.renamed.items())
        if merged.conflicts:
            said += (f"; kept yours where both changed ({len(merged.conflicts)}), theirs is in "
                     f"{name}~")
        try:
            return self._save_adopted(said + ".")
        except ChangedOnDisk:   # changed again meanwhile: leave it for the next try
            return self._not_saved(f"{name} is changing on disk; not saved", changed_outside=True)

    def _save_adopted(self, said: str) -> bool:
        from gaugewalk.model.walkfile.fingerprint import ChangedOnDisk

        try:
            notice = self.hold.save(self.job)
        except ChangedOnDisk:
            raise
        except Exception as exc:
            return self._not_saved(self._why(exc))
        self._saved(said + (f" {notice.message}" if notice else ""))
        return True

    def _adopt(self, job: Job) -> None:
        """Put ``job`` (a merge with the walk on disk) in place of the walk here; undo starts
        again from it (an older step would take back what came from disk)."""
        self.job.runs[:] = job.runs
        self.job.sources[:] = job.sources
        self.job.defaults = job.defaults
        self.job.job = job.job
        self._touch()
        self.references_clean = False   # not known for the merged walk: the next change checks
        self.history.clear()
        self.future.clear()
        self.recompute()

    @property
    def lose_on_quit(self) -> str | None:
        """What quitting now would lose, in words, or None."""
        if not self.state.saved:
            if self.state.kept is not None:
                return None   # kept whole in a file of its own: nothing is lost
            return "changes that could not be saved to " + self.path.name
        if self.draft:
            return "a run card that was not stored"
        return None

    def comment_warning(self) -> str | None:
        """Said before the first save: the file's comments will not survive a save (the backup
        beside it keeps them)."""
        from gaugewalk.model.walkfile.write import pending_notice

        if self.read_only:
            return None
        notice = pending_notice(self.hold.path)
        if notice is None:
            return None
        return (f"{self.path.name} has {notice.comment_lines} comment line(s). gaugewalk does not "
                f"keep comments when it saves; after your first change they stay only in "
                f"{notice.backup.name}.")

    # ----- who else has it open -----------------------------------------------------------
    def take_lock(self) -> str | None:
        """Hold the walk for writing. When someone else holds it the walk opens read-only;
        returns a sentence to show (who holds it, or a stale lock that was cleared), else None."""
        from gaugewalk.model.walkfile.lock import LockError, WalkLocked
        from gaugewalk.model.walkfile.write import read_only_reason

        self.lock_refusal = None
        try:
            lock = self.hold.take_lock()
        except WalkLocked as exc:
            self.read_only = exc.message
            self.lock_refusal = exc  # ctrl+u offers to clear a lock nobody holds any more
            return f"Read-only: {exc.message}"
        except LockError as exc:
            self.read_only = str(exc)
            return f"Read-only: {exc}"
        reason = read_only_reason(self.hold.path)
        if reason is not None:  # a read-only walk is never replaced: say so before any change
            self.hold.release()
            self.read_only = f"{self.path.name}: {reason}"
            return f"Read-only: {self.read_only}"
        self.read_only = None
        from gaugewalk.model.walkfile.drafts import load_draft

        said = [lock.message] if lock.message else []
        kept = load_draft(self.hold.path)  # a card typed when the app last stopped (crash recovery)
        if kept is not None and kept.run_id is None and self._typed(kept.fields):
            self.draft = kept.fields
            said.append("The run card you were typing when gaugewalk last stopped is kept: "
                        "n brings it back.")
        from gaugewalk.model.session.outside import kept_beside

        earlier = kept_beside(self.hold.path)
        if earlier:
            name = self.path.name
            said.append(f"Changes an earlier session could not save to {name} are kept in "
                        f"{earlier[-1].name}" + (f" ({len(earlier)} such files)"
                                                 if len(earlier) > 1 else "")
                        + f": 'gaugewalk merge {name} {earlier[-1].name} -o {name}' joins them "
                        "back; delete the file after.")
        return " ".join(said) or None

    def release_lock(self) -> str | None:
        """Let the walk go; returns why its lock could not be removed, if it could not."""
        return self.hold.release()

    def unlock(self, force: bool = False) -> str:
        """Clear the lock that made this walk read-only (``gaugewalk.model.walkfile.lock.
        break_lock``: never one a live process here holds; one from another computer only with
        ``force``), then take the walk for writing. Returns what happened, in a sentence."""
        from gaugewalk.model.walkfile.lock import LockError, WalkLocked, break_lock

        if self.lock_refusal is None:
            return "This walk is not held by a lock; there is nothing to clear."
        try:
            state = break_lock(self.hold.path, force=force)
        except (WalkLocked, LockError) as exc:
            return f"Not cleared: {getattr(exc, 'message', None) or exc}"
        said = self.take_lock()
        done = f"Cleared the lock ({state.describe()})."
        if self.read_only:
            return f"{done} {said}"
        return f"{done} The walk is open for writing." + (f" {said}" if said else "")

    @staticmethod
    def _typed(fields: dict[str, str]) -> bool:
        return any(fields.get(k, "").strip() for k in ("to", "length", "load", "notes", "panel"))

    def keep_draft(self, fields: dict[str, str] | None) -> None:
        """The new-run card's texts as typed (None: nothing unstored), in memory and beside the
        walk (``gaugewalk.model.walkfile.drafts``), so a crash does not lose them."""
        from gaugewalk.model.walkfile.drafts import clear_draft, save_draft

        self.draft = fields if fields and self._typed(fields) else None
        if self.read_only:
            return
        if self.draft is None and (self.saving or not self.state.saved):
            # the card's run was stored but is not on disk yet: its draft stays until it is
            self._draft_until_saved = True
            return
        self._draft_until_saved = False
        try:
            if self.draft:
                save_draft(self.hold.path, self.draft)
            else:
                clear_draft(self.hold.path)
        except OSError:
            pass  # the walk itself is saved apart; a draft is a convenience

    # ----- ids and names ----------------------------------------------------------------
    def source_ids(self) -> list[str]:
        return [s.id for s in self.job.sources]

    def known_names(self) -> list[str]:
        """Sources and every destination already in the walk, for completion."""
        seen: dict[str, None] = {}
        for s in self.job.sources:
            seen.setdefault(s.id, None)
        for r in self.job.runs:
            seen.setdefault(r.to, None)
        return list(seen)

    def previous_like(self, source_id: str | None) -> Run | None:
        """The last run from the same source (else the last run): the card copies its circuit."""
        runs = self.job.runs
        if source_id:
            for r in reversed(runs):
                if r.from_ == source_id and not self.job.is_feeder(r):
                    return r
        return runs[-1] if runs else None


def _put(runs: list[Run], sources: list[Source], run: Run, replaces: str | None,
         new_sources: tuple[Source, ...], at: int | None = None) -> None:
    """Put ``run`` in place of the run ``replaces`` (or add it), and each of ``new_sources`` in
    place of the source of its id (or add it), in the lists given. ``at``: where the run
    ``replaces`` stands in ``runs``, when known (``Job.run_position``)."""
    if at is not None:
        runs[at] = run
    else:
        _put_in(runs, run, replaces)
    for source in new_sources:
        _put_in(sources, source, source.id)


def _put_in(items: list, item, replaces: str | None) -> None:
    """Replace the item whose id is ``replaces``, or add ``item`` at the end."""
    if replaces is not None:
        for i, old in enumerate(items):
            if old.id == replaces:
                items[i] = item
                return
    items.append(item)


def _copy(job: Job) -> Job:
    """The walk as it is now, for a merge base: its own lists of the same (never changed in
    place) runs and sources, its own header and defaults."""
    return job.model_copy(update={"runs": list(job.runs), "sources": list(job.sources),
                                  "job": job.job.model_copy(),
                                  "defaults": job.defaults.model_copy()})


def _short(text: str, width: int = 12) -> str:
    return text if len(text) <= width else text[: width - 1] + "…"


def fmt_pct(value: float | None) -> str:
    if value is None or not math.isfinite(value):
        return "—"
    return f"{value:.2f}"


def fmt_ft(value: float | None) -> str:
    if value is None or not math.isfinite(value):
        return "—"
    return f"{value:,.0f}" if value >= 100 else f"{value:.1f}".rstrip("0").rstrip(".")
