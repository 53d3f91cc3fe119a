"""The walk file: golden text, round trips, migration, atomic saves with a backup, comments."""

from __future__ import annotations

import os
import tomllib
from datetime import date
from pathlib import Path

import pytest
from hypothesis import given
from hypothesis import strategies as st

from gaugewalk.model.walk.job import Job, Load, Run, Source, new_walk
from gaugewalk.model.walk.plain_text import CONTROL_CHARS
from gaugewalk.model.walkfile.atomic import backup_path
from gaugewalk.model.walkfile.migrate import MIGRATIONS, migrate
from gaugewalk.model.walkfile.read import WalkFileError, load_walk, loads_walk
from gaugewalk.model.walkfile.write import (
    CommentsWouldBeLost,
    Written,
    comment_lines,
    dumps_walk,
    pending_notice,
    save_walk,
)
from tests.support.paths import GOLDEN


def test_the_canonical_golden_file_is_written_back_byte_for_byte():
    text = (GOLDEN / "walk_canonical.toml").read_text()
    assert dumps_walk(loads_walk(text)) == text


def test_a_hand_edited_file_is_written_in_key_order_with_defaults_left_out_and_names_canonical():
    job = loads_walk((GOLDEN / "walk_messy_in.toml").read_text())
    assert dumps_walk(job) == (GOLDEN / "walk_messy_out.toml").read_text()


def test_the_written_file_is_toml_that_tomllib_reads_back_to_the_same_values():
    # tomllib (Python standard library) is the outside reader of the TOML we write
    job = loads_walk((GOLDEN / "walk_canonical.toml").read_text())
    data = tomllib.loads(dumps_walk(job))
    assert data["run"][1]["load"] == {"value": 11.5, "unit": "kW", "pf": 0.98}
    assert data["job"]["walked_on"] == date(2024, 3, 18)
    assert data["run"][0]["segments"][1] == {"length": "12+2*6",
                                             "note": "drop and offsets at the panel"}


def test_load_save_load_loses_nothing_and_keeps_the_length_as_typed():
    job = loads_walk((GOLDEN / "walk_canonical.toml").read_text())
    again = loads_walk(dumps_walk(job))
    assert again == job
    assert again.run("F1").length == "85+12+2*6"
    assert again.run("F1").length_ft == pytest.approx(109.0)  # 85 + 12 + 2*6
    # 36 m = 118.11 ft (1 ft = 0.3048 m exactly, international foot) + 8 ft
    assert again.run("R2").length_ft == pytest.approx(36 / 0.3048 + 8)


_text = st.text(alphabet=st.characters(blacklist_categories=["Cs"], blacklist_characters="\x00"),
                max_size=30)
_name = st.text(alphabet=st.characters(blacklist_categories=["Cs"],
                                       blacklist_characters=sorted(CONTROL_CHARS)), max_size=30)


@given(
    name=_name,  # a name is one line of plain text; notes keep control characters
    notes=_text,
    value=st.floats(min_value=0.01, max_value=1e6, allow_nan=False),
    pf=st.none() | st.floats(min_value=0.05, max_value=1.0),
    unit=st.sampled_from(["A", "VA", "kVA", "W", "kW"]),
    length=st.sampled_from(["10", "85+12+2*6", "36m+8ft", "12'6\"", "150-12"]),
    continuous=st.booleans(),
)
def test_any_job_text_and_numbers_survive_a_round_trip(name, notes, value, pf, unit, length,
                                                       continuous):
    job = new_walk(name=name, service_system="120/240V 1ph 3w")
    job.job.notes = notes
    job.runs.append(Run.model_validate({
        "id": "R1", "from": "SVC", "to": f"load {name[:10]}".strip() or "x", "length": length,
        "load": {"value": value, "unit": unit, "pf": pf}, "continuous": continuous,
        "connection": "LN", "notes": notes,
    }))
    text = dumps_walk(job)
    assert loads_walk(text) == job
    assert dumps_walk(loads_walk(text)) == text


def test_saving_twice_gives_identical_bytes_and_the_second_save_leaves_the_backup_alone(tmp_path):
    job = loads_walk((GOLDEN / "walk_canonical.toml").read_text())
    path = tmp_path / "walk.toml"
    assert save_walk(job, path) is None
    first = path.read_bytes()
    assert not backup_path(path).exists()  # nothing to back up on the first save
    job.runs[1].notes = "changed"
    save_walk(job, path)
    assert backup_path(path).read_bytes() == first
    second = path.read_bytes()
    save_walk(loads_walk(second.decode()), path)
    assert path.read_bytes() == second
    assert backup_path(path).read_bytes() == first


def test_texts_kept_from_the_last_write_give_the_whole_writes_text_making_only_new_ones(
        monkeypatch):
    import gaugewalk.model.walkfile.write as write

    job = loads_walk((GOLDEN / "walk_canonical.toml").read_text())
    written = Written()
    assert dumps_walk(job, written) == dumps_walk(job)
    made: list[str] = []
    table = write._table
    monkeypatch.setattr(write, "_table", lambda model: made.append(type(model).__name__)
                        or table(model))
    run = job.runs[1]
    changes = [
        ("one run put in place of itself", lambda: job.runs.__setitem__(
            1, run.model_copy(update={"notes": "moved"})), ["Run"]),
        ("a run added at the end", lambda: job.runs.append(
            run.model_copy(update={"id": "R-NEW"})), ["Run"]),
        ("the lists in another order", lambda: job.runs.reverse(), []),
        ("a run taken out", lambda: job.runs.pop(0), []),
        ("a source put in place", lambda: job.sources.__setitem__(
            0, job.sources[0].model_copy(update={"notes": "x"})), ["Source"]),
        ("nothing changed", lambda: None, []),
    ]
    for said, change, texts in changes:
        change()
        made.clear()
        text = dumps_walk(job, written)
        header = made[:]   # the job and its defaults are written every time
        assert text == dumps_walk(job), said
        assert [m for m in header if m in ("Run", "Source")] == texts, said
    assert len(written) == len(job.runs) + len(job.sources)


def test_the_backup_sits_beside_the_file_with_a_tilde():
    assert backup_path("/x/jobs/shop.toml") == Path("/x/jobs/shop.toml~")


def test_a_save_leaves_no_temporary_files_and_keeps_the_file_mode(tmp_path):
    path = tmp_path / "walk.toml"
    job = new_walk(name="Mode", service_system="208Y/120V 3ph 4w")
    save_walk(job, path)
    os.chmod(path, 0o640)
    job.job.site = "somewhere"
    save_walk(job, path)
    assert sorted(p.name for p in tmp_path.iterdir()) == ["walk.toml", "walk.toml~"]
    assert path.stat().st_mode & 0o777 == 0o640


def test_a_failed_write_leaves_the_old_file_whole(tmp_path, monkeypatch):
    path = tmp_path / "walk.toml"
    job = new_walk(name="Before", service_system="208Y/120V 3ph 4w")
    save_walk(job, path)
    before = path.read_bytes()

    def broken_replace(src, dst):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(os, "replace", broken_replace)
    job.job.name = "After"
    with pytest.raises(OSError):
        save_walk(job, path)
    monkeypatch.undo()
    assert path.read_bytes() == before
    assert [p.name for p in tmp_path.iterdir()] == ["walk.toml"]


def test_comments_are_counted_outside_strings_only():
    text = 'a = "x # not a comment"  # a comment\n# whole line\nb = \'#\'\nc = """\n# inside\n"""\n'
    assert comment_lines(text) == 2


def test_saving_over_a_commented_file_reports_it_and_the_backup_keeps_the_comments(tmp_path):
    path = tmp_path / "walk.toml"
    original = (GOLDEN / "walk_messy_in.toml").read_text()
    path.write_text(original)
    job = load_walk(path)
    assert pending_notice(path).comment_lines == 3
    with pytest.raises(CommentsWouldBeLost):
        save_walk(job, path, allow_comment_loss=False)
    assert path.read_text() == original  # refused: nothing written
    notice = save_walk(job, path)
    assert notice is not None and notice.comment_lines == 3
    assert "walk.toml~" in notice.message
    assert backup_path(path).read_text() == original
    assert comment_lines(path.read_text()) == 0


def test_a_schema_0_file_with_flat_load_keys_is_migrated_to_schema_1():
    # Hand-made schema 0 file: no schema key, load as flat keys, 'spread' for 'distributed'
    v0 = """
[[source]]
id = "SVC"
kind = "service"
system = "120/240V 1ph 3w"

[[run]]
id = "R1"
from = "SVC"
to = "Pump"
length = "200"
kw = 1.5
pf = 0.8
spread = false
connection = "LL"
"""
    job = loads_walk(v0)
    assert job.schema == 1
    assert job.run("R1").load == Load(value=1.5, unit="kW", pf=0.8)
    assert "schema = 1" in dumps_walk(job)
    assert sorted(MIGRATIONS) == [0]


def test_a_file_from_a_newer_gaugewalk_is_refused_with_its_schema_number():
    with pytest.raises(WalkFileError) as err:
        loads_walk("schema = 7\n", "future.toml")
    assert "schema 7" in str(err.value) and "future.toml" in str(err.value)


def test_migrate_leaves_a_current_file_alone():
    data = {"schema": 1, "run": [{"id": "R1", "load": {"value": 1, "unit": "A"}}]}
    assert migrate(dict(data)) == data


def test_new_walk_starts_with_its_service():
    job = new_walk(name="Shed", service_system="120/240", walked_on=date(2024, 6, 1))
    assert job.sources == [Source(id="SVC", kind="service", system="120/240V 1ph 3w",
                                  name="Service")]
    assert isinstance(job, Job) and job.job.walked_on == date(2024, 6, 1)
