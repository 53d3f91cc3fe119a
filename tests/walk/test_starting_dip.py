"""A motor's starting dip at its terminals from the service (``gaugewalk.model.walk.starting``),
worked by hand: Ohm's law on each feeder at the locked-rotor current, the IEEE Std 141
approximation through a transformer (%R cos + %X sin at the starting power factor), the bus's
running drop and the motor's own run. Every walk here is invented."""

from __future__ import annotations

import math

import pytest

from gaugewalk.model.engine.drop import table9_rx
from gaugewalk.model.walk.compute import compute_job
from tests.support.walks import make_job, run_table, source_table

Y480 = "480Y/277V 3ph 4w"
Y208 = "208Y/120V 3ph 4w"
PF, SIN = 0.4, math.sqrt(1 - 0.4 ** 2)   # starting power factor (common practice)


def _behind_transformer(*motors, defaults=None, kva=75, **t1):
    """SVC 480Y/277 -F1 2 AWG, 100 ft-> T1 (kva, 5 %Z) -F2 4/0 AWG, 10 ft-> LP1 208Y/120."""
    return make_job("dip", defaults=defaults, sources=[
        source_table("SVC", "service", Y480),
        source_table("T1", "transformer", Y208, kva=kva, impedance_pct=5.0, **t1),
        source_table("LP1", "panel", Y208, rating_a=400, main_a=400),
    ], runs=[
        run_table("F1", "SVC", "T1", "100", size="2 AWG", ocpd_a=125),
        run_table("F2", "T1", "LP1", "10", size="4/0 AWG"),
        *motors,
    ])


def _ohms(size: str, feet: float) -> float:
    """One copper conductor in steel (EMT) at the starting power factor [ohm]: NEC Ch. 9
    Table 9 R and XL (as the tables module reads them), R cos + X sin."""
    r, x = table9_rx(size, "cu", "steel")
    return (r * PF + x * SIN) * feet / 1000.0


def test_a_25_hp_motor_behind_a_75_kva_transformer_dips_through_every_part_above_it():
    job = _behind_transformer(run_table("M1", "LP1", "Compressor", "60",
                                        load={"value": 25, "unit": "hp"}, connection="3P"))
    result = compute_job(job)
    m1 = result.runs["M1"]
    # NEC 2023 Table 430.251(B), 25 hp, 208 V column: 404 A locked-rotor
    assert m1.locked_rotor_a == pytest.approx(404.0)
    dip = result.start_dips["M1"]
    start_kva = math.sqrt(3) * 208 * 404 / 1000          # 145.55 kVA while it starts
    # F2, on the motor's voltage: sqrt(3) I Z L / V (Ohm's law, three-phase)
    f2 = 100 * math.sqrt(3) * 404 * _ohms("4/0 AWG", 10) / 208
    # T1: IEEE Std 141 approximation, %Z 5 split by the X/R the walk took (1.8, typical of
    # 75 kVA units, common practice): (S / S_rated) (%R cos + %X sin)
    r_pct = 5.0 / math.hypot(1, 1.8)
    t1 = start_kva / 75 * (r_pct * PF + 1.8 * r_pct * SIN)
    assert t1 == pytest.approx(9.66, abs=0.01)
    # F1, above the transformer: the starting kVA over the 480 V lines
    i_primary = start_kva * 1000 / (math.sqrt(3) * 480)   # 175 A
    f1 = 100 * math.sqrt(3) * i_primary * _ohms("2 AWG", 100) / 480
    assert dip.above_pct == pytest.approx(f1 + t1 + f2, rel=1e-6)
    assert dip.bus_pct == pytest.approx(result.source_drop_pct["LP1"])
    assert dip.run_pct == pytest.approx(m1.starting_drop_pct)
    assert dip.total_pct == pytest.approx(dip.bus_pct + f1 + t1 + f2 + m1.starting_drop_pct,
                                          rel=1e-6)
    # over the job's 15 % starting target though the run alone (about 3 %) is well within it:
    # a problem of the run, and the note names every part
    assert m1.starting_drop_pct < 15 < dip.total_pct
    said = [p.message for p in result.run_problems("M1")]
    assert any("starting dip from the service" in m and "15% starting target" in m for m in said)
    assert not result.ok
    for part in ("F1 ", "T1 ", "F2 ", "stiff", "404 A locked-rotor"):
        assert part in dip.note
    assert dip.note in result.walk_notes("M1")


def test_a_larger_transformer_brings_the_same_motor_within_the_target():
    job = _behind_transformer(run_table("M1", "LP1", "Compressor", "60",
                                        load={"value": 25, "unit": "hp"}, connection="3P"),
                              kva=150)
    result = compute_job(job)
    dip = result.start_dips["M1"]
    # (S / S_rated) (%R cos + %X sin), IEEE Std 141 approximation, with the X/R the walk took
    # for a 150 kVA unit (typical, common practice)
    x_r = result.transformers["T1"].x_r
    start_kva = math.sqrt(3) * 208 * 404 / 1000
    r_pct = 5.0 / math.hypot(1, x_r)
    t1 = start_kva / 150 * (r_pct * PF + x_r * r_pct * SIN)
    assert f"T1 {t1:.2f}%" in dip.note
    assert dip.total_pct < 15 and dip.problem is None
    assert not result.run_problems("M1") or all(
        "starting dip" not in p.message for p in result.run_problems("M1"))


def test_a_line_to_neutral_motor_loads_one_of_the_three_windings_and_its_neutral_carries_it():
    job = _behind_transformer(run_table("M2", "LP1", "Sump pump", "40",
                                        load={"value": 1, "unit": "hp"}, connection="LN"))
    result = compute_job(job)
    m2 = result.runs["M2"]
    # NEC 2023 Table 430.251(A), 1 hp single-phase, 115 V column: 96 A (from memory)
    lra = m2.locked_rotor_a
    assert lra == pytest.approx(96.0)
    dip = result.start_dips["M2"]
    # one 25 kVA phase winding of the 75 kVA unit carries 120 V x 96 A = 11.5 kVA: 3 x S/S_rated
    r_pct = 5.0 / math.hypot(1, 1.8)
    t1 = 3 * (120 * lra / 1000) / 75 * (r_pct * PF + 1.8 * r_pct * SIN)
    # F2 on the motor's own circuit: hot and neutral both carry it, 2 I Z L / 120 V
    f2 = 100 * 2 * lra * _ohms("4/0 AWG", 10) / 120
    i_primary = 120 * lra / (math.sqrt(3) * 480)
    f1 = 100 * math.sqrt(3) * i_primary * _ohms("2 AWG", 100) / 480
    assert dip.above_pct == pytest.approx(f1 + t1 + f2, rel=1e-6)


def test_a_motor_on_the_service_bus_has_nothing_above_it_but_a_stiff_utility():
    job = make_job("svc", sources=[source_table("SVC", "service", Y480)], runs=[
        run_table("M1", "SVC", "Pump", "150", load={"value": 10, "unit": "hp"},
                  connection="3P")])
    result = compute_job(job)
    dip = result.start_dips["M1"]
    assert dip.above_pct == 0.0 and dip.bus_pct == 0.0
    assert dip.total_pct == pytest.approx(result.runs["M1"].starting_drop_pct)
    assert "nothing between it and the service" in dip.note


def test_a_transformer_without_its_kva_leaves_the_dip_unworked_and_says_why():
    job = _behind_transformer(run_table("M1", "LP1", "Compressor", "60",
                                        load={"value": 5, "unit": "hp"}, connection="3P"))
    job.source("T1").kva = None
    result = compute_job(job)
    dip = result.start_dips["M1"]
    assert dip.total_pct is None and "not worked" in dip.note and "T1 has no kVA" in dip.note


def test_a_motor_whose_run_alone_is_over_the_target_is_said_once():
    job = _behind_transformer(run_table("M1", "LP1", "Compressor", "900",
                                        load={"value": 25, "unit": "hp"}, connection="3P",
                                        size="4/0 AWG"))
    result = compute_job(job)
    said = [p.message for p in result.run_problems("M1")]
    assert result.runs["M1"].starting_drop_pct > 15
    assert sum("starting" in m for m in said) == 1   # the engine's, on the run alone


def test_an_edit_in_place_gives_the_dips_a_full_computation_gives():
    from gaugewalk.model.walk.job import Load
    from gaugewalk.model.walk.recompute import recompute_run

    job = _behind_transformer(
        run_table("M1", "LP1", "Compressor", "60", load={"value": 25, "unit": "hp"},
                  connection="3P"),
        run_table("M2", "LP1", "Sump pump", "40", load={"value": 1, "unit": "hp"},
                  connection="LN"))
    result = compute_job(job)
    edits = [("M1", "load", Load(value=10, unit="hp", kind="motor")),
             ("F2", "length", "40"), ("F2", "size", "2/0 AWG"), ("M2", "length", "90"),
             ("F1", "length", "300")]
    for rid, name, value in edits:
        setattr(job.run(rid), name, value)
        result = recompute_run(job, result, rid)
        full = compute_job(job)
        assert result.start_dips == full.start_dips, (rid, name)
        assert result.problems == full.problems, (rid, name)


def _walk_file(tmp_path):
    """The 25 hp walk written as a walk file, with M1's dip."""
    from gaugewalk.model.walkfile.write import dumps_walk

    job = _behind_transformer(run_table("M1", "LP1", "Compressor", "60",
                                        load={"value": 25, "unit": "hp"}, connection="3P"))
    path = tmp_path / "dip.toml"
    path.write_text(dumps_walk(job), encoding="utf-8")
    return path, compute_job(job).start_dips["M1"]


def test_check_json_and_the_report_carry_the_dip_its_note_and_its_problem(tmp_path, capsys):
    import json

    from gaugewalk.tui.cli.main import main

    path, dip = _walk_file(tmp_path)
    assert main(["check", str(path), "--json"]) == 1   # a run over a target
    m1 = {r["id"]: r for r in json.loads(capsys.readouterr().out)["runs"]}["M1"]
    assert m1["starting_dip_pct"] == pytest.approx(round(dip.total_pct, 4))
    assert dip.note in m1["notes"] and dip.problem in m1["problems"] and m1["ok"] is False
    out = tmp_path / "dip.md"
    assert main(["report", str(path), "-o", str(out)]) == 0
    text = out.read_text()
    section = text.split("## Equipment by its article", 1)[1].split("\n## ", 1)[0]
    assert "Starting dip from the service" in section and f"| {dip.total_pct:.2f} |" in section
    assert "starting dip at the motor from the service" in text.split("Rules applied", 1)[1]


def test_the_run_card_previews_the_dip_of_a_motor_it_is_typing(tmp_path):
    from gaugewalk.model.session.card_form import CardForm
    from gaugewalk.model.session.session import WalkSession

    path, dip = _walk_file(tmp_path)
    session = WalkSession.open(path)
    form = CardForm(session)
    form.start()
    for key, text in (("from", "LP1"), ("to", "Compressor 2"), ("length", "60"),
                      ("load", "25hp"), ("circuit", "3P")):
        form.type(key, text)
    checked = form.check()
    assert checked.errors == {}
    # the same motor on the same bus as M1: the same dip, as a preview (nothing stored)
    assert checked.dip is not None
    assert checked.dip.total_pct == pytest.approx(dip.total_pct, rel=1e-9)
    assert checked.dip.problem is not None
