"""Merging two walks of one job by run and source id."""

from __future__ import annotations

from gaugewalk.model.walk.merge import merge_jobs
from gaugewalk.model.walkfile.read import load_walk, loads_walk
from gaugewalk.model.walkfile.write import dumps_walk
from gaugewalk.tui.cli.main import main
from tests.support.paths import SAMPLES
from tests.support.walks import panel_walk, run_table, source_table, tables_text

BASE = panel_walk("Two floors", feeder_length="60")


def _walk(*runs: str, extra: str = "") -> str:
    """BASE, then ``extra``, then a 10 A branch on LP1 for each ``"id|to|length"``."""
    return BASE + extra + tables_text("run", [
        run_table(rid, "LP1", to, length, load=(10, "A"), connection="LN")
        for rid, to, length in (r.split("|") for r in runs)])


def test_walks_of_different_floors_merge_with_every_run_kept_in_order():
    a = loads_walk(_walk("R1|Floor 1 lights|40", "R2|Floor 1 receptacles|55"))
    second_floor = tables_text("source", [source_table("LP2", "panel")]) + tables_text("run", [
        run_table("F2", "SVC", "LP2", "90"),
        run_table("R20", "LP2", "Floor 2 heater", "30", load=(4, "kW"), connection="LL"),
    ])
    b = loads_walk(_walk("R10|Floor 2 lights|80", extra=second_floor))
    merged = merge_jobs(a, b)
    assert merged.ok and not merged.conflicts
    assert [r.id for r in merged.job.runs] == ["F1", "R1", "R2", "F2", "R20", "R10"]
    assert [s.id for s in merged.job.sources] == ["SVC", "LP1", "LP2"]
    assert sorted(merged.taken["both"]) == ["run F1", "source LP1", "source SVC"]
    assert merged.taken["b only"] == ["source LP2", "run F2", "run R20", "run R10"]
    # the merged walk is itself a valid file
    assert loads_walk(dumps_walk(merged.job)) == merged.job


def test_the_same_id_with_different_content_is_a_conflict_that_stops_the_merge():
    a = loads_walk(_walk("R1|Floor 1 lights|40"))
    b = loads_walk(_walk("R1|Floor 1 lights|44"))
    merged = merge_jobs(a, b)
    assert merged.job is None
    assert len(merged.conflicts) == 1
    assert str(merged.conflicts[0]) == "run R1 differs: length: A has '40', B has '44'"


def test_prefer_settles_conflicts_but_still_lists_them():
    a = loads_walk(_walk("R1|Floor 1 lights|40"))
    b = loads_walk(_walk("R1|Floor 1 lights|44").replace('name = "Two floors"',
                                                         'name = "Second floor"'))
    for side, length, name in (("a", "40", "Two floors"), ("b", "44", "Second floor")):
        merged = merge_jobs(a, b, prefer=side)
        assert merged.job.run("R1").length == length
        assert merged.job.job.name == name
        assert len(merged.conflicts) == 2
        assert merged.taken[f"conflict, took {side}"] == ["job name", "run R1"]


def test_header_keys_filled_on_one_side_only_are_kept_without_conflict():
    a = loads_walk(BASE.replace('name = "Two floors"', 'name = "Two floors"\nsite = "Dock St"'))
    b = loads_walk(BASE.replace('name = "Two floors"',
                                'name = "Two floors"\nwalked_by = "K. Mbeki"'))
    merged = merge_jobs(a, b)
    assert merged.ok and merged.job.job.site == "Dock St" and merged.job.job.walked_by == "K. Mbeki"


def test_merge_command_writes_nothing_on_conflict_and_writes_with_prefer(tmp_path, capsys):
    pa, pb, out = tmp_path / "a.toml", tmp_path / "b.toml", tmp_path / "out.toml"
    pa.write_text(_walk("R1|Floor 1 lights|40"))
    pb.write_text(_walk("R1|Floor 1 lights|44", "R2|Floor 2 lights|70"))
    assert main(["merge", str(pa), str(pb), "-o", str(out)]) == 1
    err = capsys.readouterr().err
    assert "run R1 differs" in err and "nothing written" in err
    assert not out.exists()
    assert main(["merge", str(pa), str(pb), "-o", str(out), "--prefer", "b"]) == 0
    job = load_walk(out)
    assert job.run("R1").length == "44" and job.run("R2") is not None


def test_merge_command_refuses_a_result_that_is_not_a_valid_walk(tmp_path, capsys):
    # both sides feed LP1, with different run ids: the merged walk would feed it twice
    pa, pb, out = tmp_path / "a.toml", tmp_path / "b.toml", tmp_path / "out.toml"
    pa.write_text(BASE)
    pb.write_text(BASE.replace('id = "F1"', 'id = "F9"'))
    assert main(["merge", str(pa), str(pb), "-o", str(out)]) == 2
    assert "already fed by run F1" in capsys.readouterr().err
    assert not out.exists()


def test_merging_a_sample_walk_with_itself_changes_nothing(tmp_path):
    sample = SAMPLES / "retail_fitout.toml"
    job = load_walk(sample)
    merged = merge_jobs(job, load_walk(sample))
    assert merged.ok and merged.job == job and not merged.conflicts
