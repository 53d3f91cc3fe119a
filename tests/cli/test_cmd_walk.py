"""The walk commands: new, source, add, check (table and JSON), schema."""

from __future__ import annotations

import json
import math

from gaugewalk.model.walkfile.atomic import backup_path
from gaugewalk.model.walkfile.read import load_walk
from gaugewalk.model.walkfile.schema import json_schema_text
from gaugewalk.tui.cli.main import main
from tests.support.paths import SAMPLES, SCHEMA


def test_new_creates_a_walk_and_refuses_to_write_over_one(tmp_path, capsys):
    path = tmp_path / "shed.toml"
    assert main(["new", str(path), "--name", "Shed", "--service", "120/240",
                 "--date", "2024-06-01"]) == 0
    job = load_walk(path)
    assert job.job.name == "Shed" and job.source("SVC").system == "120/240V 1ph 3w"
    before = path.read_bytes()
    assert main(["new", str(path), "--name", "Other"]) == 2
    assert "already exists" in capsys.readouterr().err
    assert path.read_bytes() == before


def test_a_walk_built_from_the_command_line_computes_the_feeder_from_its_loads(tmp_path, capsys):
    path = tmp_path / "shed.toml"
    main(["new", str(path), "--service", "120/240"])
    assert main(["source", str(path), "SP", "--kind", "panel", "--system", "120/240",
                 "--from", "SVC", "--length", "150"]) == 0
    assert main(["add", str(path), "--from", "SP", "--to", "Welder", "--length", "60+2*8",
                 "--amps", "40", "--connection", "LL"]) == 0
    assert main(["add", str(path), "--from", "SP", "--to", "Lights", "--length", "80",
                 "--va", "1200", "--connection", "LN", "--continuous", "--spread"]) == 0
    capsys.readouterr()
    assert main(["check", str(path), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    runs = {r["id"]: r for r in data["runs"]}
    assert set(runs) == {"F-SP", "R1", "R2"}
    assert runs["R1"]["length_ft"] == 76.0  # 60 + 2*8
    # the 40 A welder is on both lines; the 1200 VA of lights, 10 A at 120 V, on one of them,
    # in phase (both at the job's 0.85 power factor): 50 A on the heaviest line, not the 45 A of
    # 10,800 VA / 240 V (NEC 215.2(A)(1) asks the heaviest line)
    assert runs["F-SP"]["amps"] == 50.0
    assert math.isclose(runs["R2"]["total_drop_pct"],
                        runs["F-SP"]["voltage_drop_pct"] + runs["R2"]["voltage_drop_pct"],
                        abs_tol=2e-4)
    for key in ("id", "from", "to", "length_ft", "size", "voltage_drop_pct", "total_drop_pct",
                "ok"):
        assert key in runs["R1"]
    assert data["summary"]["runs"] == 3 and data["summary"]["all_ok"] is True
    assert "qualified, licensed" in data["caution"]


def test_add_refuses_a_mistake_and_leaves_the_file_and_its_backup_alone(tmp_path, capsys):
    path = tmp_path / "shed.toml"
    main(["new", str(path), "--service", "208Y/120"])
    before = path.read_bytes()
    for args, words in (
        (["--from", "XX", "--to", "Sign", "--length", "40", "--amps", "5"], "run R1, from"),
        (["--from", "SVC", "--to", "Sign", "--length", "4O", "--amps", "5"], "run R1, length"),
        (["--from", "SVC", "--to", "Sign", "--length", "40"], "run R1, load"),
        (["--from", "SVC", "--to", "Sign", "--length", "40", "--amps", "-5"], "load.value"),
        (["--from", "SVC", "--to", "Sign", "--length", "40", "--pf", "0.9"], "--pf needs a load"),
    ):
        assert main(["add", str(path), *args]) == 2
        err = capsys.readouterr().err
        assert words in err and str(path) in err and "Traceback" not in err
        assert len(err.strip().splitlines()) == 1
        assert path.read_bytes() == before
        assert not backup_path(path).exists()


def test_add_warns_that_comments_are_gone_and_the_backup_keeps_them(tmp_path, capsys):
    path = tmp_path / "shed.toml"
    main(["new", str(path), "--service", "208Y/120"])
    commented = "# walked in the rain\n" + path.read_text()
    path.write_text(commented)
    assert main(["add", str(path), "--from", "SVC", "--to", "Sign", "--length", "40",
                 "--amps", "5", "--connection", "LN"]) == 0
    err = capsys.readouterr().err
    assert err.startswith("warning: ") and "comment" in err
    assert backup_path(path).read_text() == commented
    assert load_walk(path).run("R1").to == "Sign"


def test_check_exits_0_on_a_passing_sample_and_1_on_the_one_with_a_known_problem(capsys):
    assert main(["check", str(SAMPLES / "retail_fitout.toml")]) == 0
    out = capsys.readouterr().out
    assert "Every run is within" in out and "qualified, licensed" in out
    assert main(["check", str(SAMPLES / "farm_workshop.toml")]) == 1
    out = capsys.readouterr().out
    assert "SVC-YARD" in out and "OVER" in out


def test_the_committed_json_schema_is_up_to_date():
    committed = SCHEMA.read_text()
    assert committed == json_schema_text(), (
        "regenerate: python -c 'from gaugewalk.model.walkfile.schema import SCHEMA_FILE, "
        "json_schema_text; SCHEMA_FILE.write_text(json_schema_text())'")


def test_the_schema_command_prints_the_schema_naming_the_file_keys(capsys):
    assert main(["schema"]) == 0
    schema = json.loads(capsys.readouterr().out)
    assert set(schema["properties"]) == {"schema", "job", "defaults", "source", "raceway",
                                         "run"}
    assert "from" in schema["$defs"]["Run"]["properties"]
