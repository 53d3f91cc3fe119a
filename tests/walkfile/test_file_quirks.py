"""What editors and slips of the keyboard put in walk files (issue 15): a byte-order mark is read
past, quoted numbers and words for booleans are refused with the usual message, and a length no
building holds is warned about, never refused."""

from __future__ import annotations

import contextlib
import io
import json

import pytest

from gaugewalk.model.session.card_form import CardForm
from gaugewalk.model.session.session import WalkSession
from gaugewalk.model.walkfile.read import check_walk_text, load_walk
from gaugewalk.model.walkfile.write import save_walk
from gaugewalk.tui.app.sheet.rows import detail_lines
from gaugewalk.tui.cli.main import main
from tests.support.walks import SMALL_WALK, panel_walk, run_table, write_walk


def _cli(argv: list[str]) -> tuple[int, str, str]:
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        code = main(argv)
    return code, out.getvalue(), err.getvalue()


def test_a_byte_order_mark_is_read_past_and_dropped_when_gaugewalk_saves(tmp_path):
    walk = tmp_path / "walk.toml"
    walk.write_bytes(b"\xef\xbb\xbf" + SMALL_WALK.encode())  # as some editors save UTF-8
    code, out, err = _cli(["check", str(walk)])
    assert code in (0, 1) and err == "" and "Proofer" in out  # read and computed
    job = load_walk(walk)
    assert job.run("R1").to == "Proofer"
    job.runs[-1] = job.runs[-1].model_copy(update={"notes": "re-walked"})
    save_walk(job, walk)
    assert not walk.read_bytes().startswith(b"\xef\xbb\xbf")  # written without one
    assert load_walk(walk) == job


@pytest.mark.parametrize("key, value, says", [
    ("sets", '"2"', "'sets' must be a whole number, not '2'"),
    ("continuous", '"yes"', "'continuous' must be true or false, not 'yes'"),
    ("distributed", "1", "'distributed' must be true or false, not 1"),
    ("ocpd_a", "20.0", "'ocpd_a' must be a whole number, not 20.0"),
    ("bends", '"3"', "'bends' must be a whole number, not '3'"),
    ("ambient_c", '"40"', "'ambient_c' must be a number, not '40'"),
])
def test_quoted_numbers_and_words_for_booleans_are_refused_naming_line_and_field(
        tmp_path, key, value, says):
    text = panel_walk("Quay", run_table("R1", "LP1", "Pump", "100", load=(16, "A")))
    text = text.replace('to = "Pump"\n', f'to = "Pump"\n{key} = {value}\n')
    number = text.split("\n").index(f"{key} = {value}") + 1
    job, problems = check_walk_text(text, "walk.toml")
    assert [str(p) for p in problems] == [f"walk.toml line {number}, run R1, {key}: {says}"]


def test_true_numbers_and_booleans_are_still_read(tmp_path):
    text = panel_walk("Quay", run_table("R1", "LP1", "Pump", "100", load=(16, "A"), sets=2,
                                        continuous=True, ambient_c=40, bends=3))
    job, problems = check_walk_text(text, "walk.toml")
    assert problems == []
    run = job.run("R1")
    assert (run.sets, run.continuous, run.ambient_c, run.bends) == (2, True, 40.0, 3)


LONG = panel_walk("Quay", run_table("R1", "LP1", "Pump", "9999999", load=(16, "A")))


def test_a_length_no_building_holds_is_warned_about_on_the_command_line_never_refused(tmp_path):
    walk = write_walk(tmp_path, LONG)
    code, out, err = _cli(["check", str(walk)])
    assert code == 1  # the drop is far over its target; the warning does not decide the exit
    assert ("run R1: 9,999,999 ft is longer than a run in a building usually is (over 3,000 ft, "
            "[defaults] max_plausible_length_ft); check the length") in out
    code, out, err = _cli(["check", str(walk), "--json"])
    assert json.loads(out)["summary"]["warnings"][0].startswith("run R1: 9,999,999 ft")
    code, out, err = _cli(["add", str(walk), "--from", "LP1", "--to", "Yard light",
                           "--length", "5000", "--amps", "2"])
    assert code == 0
    assert "warning: " in err and "run R2, length: 5,000 ft is longer" in err
    assert load_walk(walk).run("R2").length == "5000"


def test_the_plausible_length_is_a_setting_of_the_walk(tmp_path):
    walk = write_walk(tmp_path, panel_walk(
        "Quay", run_table("R1", "LP1", "Pump", "4000", load=(16, "A")),
        defaults={"max_plausible_length_ft": 5000}))
    code, out, err = _cli(["check", str(walk)])
    assert "longer than a run" not in out   # (its panel's missing rating is warned about)


def test_the_app_warns_on_the_card_and_under_the_sheet(tmp_path):
    session = WalkSession.open(write_walk(tmp_path, LONG))
    assert "⚠ 9,999,999 ft is longer" in detail_lines(session, session.job.run("R1"))
    form = CardForm(session)
    form.start()
    form.type("to", "Mixer")
    form.type("length", "12000")
    assert form.check().hints["length"] == "= 12,000 ft ⚠ over 3,000 ft?"
    form.type("length", "120")
    assert form.check().hints["length"] == "= 120 ft"
