"""Merging two walkers' edits of one walk against the version both started from: nothing typed
is dropped, and only true conflicts need a side chosen."""

from __future__ import annotations

from datetime import date

from hypothesis import given
from hypothesis import strategies as st

from gaugewalk.model.walk.merge import merge_jobs
from gaugewalk.model.walkfile.read import loads_walk
from gaugewalk.model.walkfile.write import dumps_walk
from tests.support.walks import panel_walk, run_table, source_table, walk_text

START = [("R1", "Office lights", "40"), ("R2", "Copier", "55"), ("R3", "Break room", "70")]


def _walk(runs, **extra_keys) -> str:
    """A panel walk with a 10 A branch on LP1 for each (id, to, length); ``extra_keys`` adds
    keys to the run of that id (``R2={"measured_on": ...}``)."""
    return panel_walk("Tenant floor", *(
        run_table(rid, "LP1", to, length, load=(10, "A"), connection="LN",
                  **extra_keys.get(rid, {}))
        for rid, to, length in runs))


def _job(runs, **extra_keys):
    return loads_walk(_walk(runs, **extra_keys))


def _runs(job) -> dict[str, tuple[str, str]]:
    return {r.id: (r.to, r.length) for r in job.runs if r.id != "F1"}


# -- two runs that got the same id ---------------------------------------------------------------

def test_two_new_runs_with_the_same_id_are_both_kept_and_one_is_renumbered():
    base = _job(START)
    a = _job([*START, ("R4", "Server room", "30")])
    b = _job([*START, ("R4", "Kitchen", "80")])
    for prefer in (None, "a", "b"):
        merged = merge_jobs(a, b, prefer=prefer, base=base)
        assert merged.ok and not merged.conflicts
        runs = _runs(merged.job)
        assert runs["R4"] == ("Server room", "30")
        assert runs["R5"] == ("Kitchen", "80")       # one past the highest R-number in use
        assert merged.taken["renumbered"] == ["run R4 of B is now R5"]
        assert merged.renamed == {"R4": "R5"}
        assert "1 renumbered" in merged.summary()


def test_prefer_without_a_base_never_drops_the_other_sides_new_run():
    a = _job([*START[:1], ("R7", "Server room", "30")])
    b = _job([*START[:1], ("R7", "Kitchen", "80")])
    merged = merge_jobs(a, b, prefer="a")
    assert sorted(_runs(merged.job).values()) == [
        ("Kitchen", "80"), ("Office lights", "40"), ("Server room", "30")]
    assert merged.taken["renumbered"] == ["run R7 of B is now R8"]


def test_a_renumbered_run_skips_ids_the_base_used():
    # R5 was deleted by both: a renumbered run must not take its id back
    base = _job([*START, ("R5", "Old sign", "20")])
    a = _job([*START, ("R4", "Server room", "30")])
    b = _job([*START, ("R4", "Kitchen", "80")])
    merged = merge_jobs(a, b, base=base)
    assert merged.renamed == {"R4": "R6"}
    assert merged.taken["deleted in both"] == ["run R5"]


def test_two_sources_new_on_both_sides_with_one_id_are_a_conflict_never_renumbered():
    # a source's id is named by the runs it feeds: renumbering it would move them
    def with_panel(name: str):
        return loads_walk(walk_text("Tenant floor", sources=[
            source_table("SVC", "service"), source_table("LP1", "panel"),
            source_table("LP2", "panel", name=name)], runs=[
            run_table("F1", "SVC", "LP1", "40"), run_table("F2", "SVC", "LP2", "25")]))

    base = loads_walk(panel_walk("Tenant floor"))
    merged = merge_jobs(with_panel("A"), with_panel("B"), base=base)
    assert not merged.ok
    assert [str(c) for c in merged.conflicts] == ["source LP2 differs: name: A has 'A', B has 'B'"]


# -- with a common base ----------------------------------------------------------------------------

def test_a_change_on_one_side_is_taken_without_conflict_given_the_base():
    base = _job(START)
    a = _job([START[0], ("R2", "Copier", "61"), START[2]])     # A re-measured R2
    b = _job([START[0], START[1]])                              # B deleted R3
    merged = merge_jobs(a, b, base=base)
    assert merged.ok and not merged.conflicts
    assert _runs(merged.job) == {"R1": ("Office lights", "40"), "R2": ("Copier", "61")}
    assert merged.taken["changed in a"] == ["run R2"]
    assert merged.taken["deleted in b"] == ["run R3"]


def test_both_changing_one_run_each_their_own_way_is_a_true_conflict():
    base = _job(START)
    a = _job([START[0], ("R2", "Copier", "61"), START[2]])
    b = _job([START[0], ("R2", "Copier", "58"), START[2]])
    merged = merge_jobs(a, b, base=base)
    assert not merged.ok
    assert [str(c) for c in merged.conflicts] == ["run R2 differs: length: A has '61', B has '58'"]
    settled = merge_jobs(a, b, base=base, prefer="b")
    assert settled.job.run("R2").length == "58"
    assert settled.taken["conflict, took b"] == ["run R2"]


def test_both_making_the_same_change_is_no_conflict():
    base = _job(START)
    a = _job([START[0], ("R2", "Copier", "61"), START[2]])
    merged = merge_jobs(a, _job([START[0], ("R2", "Copier", "61"), START[2]]), base=base)
    assert merged.ok and merged.job.run("R2").length == "61"


def test_a_run_deleted_on_one_side_and_changed_on_the_other_is_a_conflict_that_says_so():
    base = _job(START)
    a = _job(START[:2])                                          # A deleted R3
    b = _job([START[0], START[1], ("R3", "Break room", "75")])   # B changed it
    merged = merge_jobs(a, b, base=base)
    assert [str(c) for c in merged.conflicts] == [
        "run R3 differs: the run: A has 'deleted', B has 'changed'"]
    assert merge_jobs(a, b, base=base, prefer="b").job.run("R3").length == "75"


def test_the_header_merges_key_by_key_against_the_base():
    text = _walk(START)
    base = loads_walk(text)
    a = loads_walk(text.replace('name = "Tenant floor"', 'name = "Tenant floor 3"'))
    b = loads_walk(text.replace('name = "Tenant floor"', 'name = "Tenant floor"\nsite = "Pier 4"'))
    merged = merge_jobs(a, b, base=base)
    assert merged.ok and (merged.job.job.name, merged.job.job.site) == ("Tenant floor 3", "Pier 4")
    # without the base, A's new name is a conflict: nothing tells which side changed it
    assert [c.id for c in merge_jobs(a, b).conflicts] == ["name"]


# -- without a base --------------------------------------------------------------------------------

def test_without_a_base_a_one_sided_re_measure_is_told_by_its_date_and_taken():
    a = _job(START)
    b = _job([START[0], ("R2", "Copier", "61"), START[2]],
             R2={"measured_on": date(2026, 3, 4), "bends": 3})
    for x, y, side in ((a, b, "b"), (b, a, "a")):
        merged = merge_jobs(x, y)
        assert merged.ok and not merged.conflicts
        assert merged.job.run("R2").length == "61"
        assert merged.taken[f"re-measured in {side}"] == ["run R2"]


def test_without_a_base_two_dated_re_measures_take_the_later_one():
    a = _job([START[0], ("R2", "Copier", "58")], R2={"measured_on": date(2026, 3, 1)})
    b = _job([START[0], ("R2", "Copier", "61")], R2={"measured_on": date(2026, 3, 4)})
    assert merge_jobs(a, b).job.run("R2").length == "61"


def test_without_a_base_a_change_beyond_the_route_is_still_a_conflict():
    # a run re-measured on one side AND made continuous: more than a re-measure
    a = _job(START)
    b = _job([START[0], ("R2", "Copier", "61"), START[2]],
             R2={"measured_on": date(2026, 3, 4), "continuous": True})
    merged = merge_jobs(a, b)
    assert not merged.ok and [c.id for c in merged.conflicts] == ["R2"]


# -- nothing dropped, ever -------------------------------------------------------------------------

_EDIT = st.sampled_from(["keep", "delete", "lengthen", "shorten"])


@given(st.lists(st.tuples(_EDIT, _EDIT), min_size=3, max_size=3),
       st.lists(st.sampled_from(["Kitchen", "Server room", "Sign"]), max_size=2),
       st.lists(st.sampled_from(["Kitchen", "Server room", "Sign"]), max_size=2),
       st.sampled_from(["a", "b"]))
def test_every_run_of_both_sides_is_accounted_for_and_no_new_run_is_lost(
        edits, new_a, new_b, prefer):
    def side(which: int, new: list[str]):
        runs = []
        for (rid, to, length), pair in zip(START, edits, strict=True):
            edit = pair[which]
            if edit != "delete":
                runs.append((rid, to, {"keep": length, "lengthen": "99",
                                       "shorten": "11"}[edit]))
        runs += [(f"R{4 + i}", to, "25") for i, to in enumerate(new)]
        return _job(runs)

    a, b, base = side(0, new_a), side(1, new_b), _job(START)
    merged = merge_jobs(a, b, prefer=prefer, base=base)
    labels = [label for group in merged.taken.values() for label in group]
    for job in (a, b):
        for r in job.runs:
            assert any(label.startswith(f"run {r.id}") for label in labels), r.id
    # every run new on either side is in the result, under its own id or a new one
    kept = set(_runs(merged.job).values())
    for to in (*new_a, *new_b):
        assert (to, "25") in kept, (to, merged.taken)
    assert loads_walk(dumps_walk(merged.job)) == merged.job


# -- shared raceways ------------------------------------------------------------------------------

def _with_raceways(*raceways: tuple[str, str], **extra_keys):
    """The start walk with a ``[[raceway]]`` for each (id, length); ``extra_keys`` as ``_walk``."""
    tables = "".join(f'\n[[raceway]]\nid = "{rid}"\nlength = "{length}"\n'
                     for rid, length in raceways)
    return loads_walk(_walk(START, **extra_keys) + tables)


def test_shared_raceways_merge_three_way_like_runs():
    base = _with_raceways(("HR1", "60"), ("HR9", "20"))
    a = _with_raceways(("HR1", "75"), ("HR2", "30"))                      # HR1 re-measured
    b = _with_raceways(("HR1", "60"), R2={"raceway_id": "HR1"})          # R2 joins HR1
    merged = merge_jobs(a, b, base=base)
    assert merged.ok and not merged.conflicts
    assert [(w.id, w.length) for w in merged.job.raceways] == [("HR1", "75"), ("HR2", "30")]
    assert merged.job.run("R2").raceway_id == "HR1"
    assert "raceway HR1" in merged.taken["changed in a"]
    assert "raceway HR2" in merged.taken["a only"]
    assert merged.taken["deleted in both"] == ["raceway HR9"]


def test_a_shared_raceway_changed_on_both_sides_is_a_conflict_never_renumbered():
    base = _with_raceways(("HR1", "60"))
    a = _with_raceways(("HR1", "75"))
    b = _with_raceways(("HR1", "90"))
    merged = merge_jobs(a, b, base=base)
    assert merged.job is None
    assert [str(c) for c in merged.conflicts] == [
        "raceway HR1 differs: length: A has '75', B has '90'"]
    assert not merged.taken["renumbered"]
    assert [w.length for w in merge_jobs(a, b, prefer="b", base=base).job.raceways] == ["90"]
