"""Feeders, panels and transformers worked by hand: the heaviest line of the phasor sums (NEC
215.2(A)(1)), the neutral (220.61), panel ratings (408.30, 408.36), transformer protection
(Table 450.3(B)), secondary conductors (240.21(C)) and the drop through a transformer (IEEE
Std 141 approximation). Every walk here is invented."""

from __future__ import annotations

import math

import pytest

from gaugewalk.model.report.content import schedules_of
from gaugewalk.model.walk.compute import compute_job
from gaugewalk.model.walk.job import Load
from gaugewalk.model.walk.plausible import implausible
from gaugewalk.model.walk.transformers import primary_device
from tests.support.walks import make_job, run_table, source_table

SQRT3 = math.sqrt(3.0)
Y208 = "208Y/120V 3ph 4w"
Y480 = "480Y/277V 3ph 4w"


def _panel_job(*runs, panel=None, defaults=None):
    """Service SVC (208Y/120) -> feeder F1, 20 ft -> panel LP1, then ``runs`` from LP1."""
    return make_job("distribution", defaults=defaults,
                    sources=[source_table("SVC", "service"),
                             source_table("LP1", "panel", Y208, **(panel or {}))],
                    runs=[run_table("F1", "SVC", "LP1", "20"), *runs])


def test_two_16_a_circuits_put_16_a_on_a_line_not_10_7_a_on_three():
    job = _panel_job(run_table("R1", "LP1", "Bench 1", "40", load=(16, "A"), connection="LN"),
                     run_table("R2", "LP1", "Bench 2", "40", load=(16, "A"), connection="LN"))
    result = compute_job(job)
    # total VA / (sqrt(3) x 208) = 3,840 / 360.3 = 10.7 A is the balanced average; placed on two
    # lines each carries 16 A, and the feeder is sized for that (NEC 215.2(A)(1))
    assert {result.placements["R1"].phase, result.placements["R2"].phase} == {"A", "B"}
    assert result.feeder_amps["F1"] == pytest.approx(16.0)
    assert result.runs["F1"].ocpd_a == 20   # NEC 240.6(A): the next standard rating above 16 A
    assert result.lines["LP1"].phase_amps == pytest.approx((16.0, 16.0, 0.0))
    # neutral, the phasor sum of two 16 A currents 120 degrees apart: 16 A (NEC 220.61)
    assert result.lines["LP1"].neutral_amps == pytest.approx(16.0)


def test_a_balanced_panel_of_120_v_loads_gets_a_neutral_for_one_line_not_for_the_phasor_sum():
    # four 15 A, 120 V circuits on each line: 60 A on A, B and C. With all on, the phasor sum
    # on the neutral is 0 A; but NEC 2023 220.61(A) makes the feeder neutral load "the maximum
    # net calculated load between the neutral and any one ungrounded conductor": 60 A
    runs = [run_table(f"R{n}", "LP1", f"Lights {n}", "40", load=(15, "A"), connection="LN",
                      phase="ABC"[n % 3]) for n in range(12)]
    result = compute_job(_panel_job(*runs))
    assert result.lines["LP1"].phase_amps == pytest.approx((60.0, 60.0, 60.0))
    assert result.lines["LP1"].neutral_amps == pytest.approx(60.0)
    f1 = result.runs["F1"]
    assert f1.ocpd_a == 60   # NEC 240.6(A)
    # NEC 2023 Table 310.16, 60 C column (110.14(C)(1), a circuit of 100 A or less): 6 AWG Cu
    # 55 A is short of 60 A, 4 AWG Cu 70 A carries it; the neutral carries the same 60 A, so it
    # is 4 AWG too, not the 10 AWG of the EGC for a 60 A device (Table 250.122)
    assert f1.size == "4 AWG" and f1.egc_size == "10 AWG"
    assert f1.neutral_size == "4 AWG"


def test_a_feeder_neutral_taken_as_not_current_carrying_says_the_nonlinear_case():
    # NEC 2023 310.15(E)(1): a 4-wire wye feeder's neutral carrying only the unbalance is not
    # counted; 310.15(E)(3): where the major portion of the load is nonlinear (LED drivers,
    # computers) it is, and four current-carrying conductors take 80 % (Table 310.15(C)(1)).
    # The walk does not say which, so the note must
    runs = [run_table(f"R{n}", "LP1", f"Lights {n}", "40", load=(15, "A"), connection="LN",
                      phase="ABC"[n % 3]) for n in range(6)]
    f1 = compute_job(_panel_job(*runs)).runs["F1"]
    assert any("310.15(E)(3)" in n and "not counted" in n for n in f1.notes), f1.notes


def test_the_neutral_load_is_the_largest_line_to_neutral_load_on_one_line():
    # 120 V loads of 30, 20 and 10 A on A, B and C: NEC 2023 220.61(A): 30 A on the neutral
    # (the phasor sum with all three on is 17.3 A, but the 20 A and 10 A may be off)
    runs = [run_table(f"R{n}", "LP1", f"Load {n}", "40", load=(a, "A"), connection="LN",
                      phase=ph) for n, (a, ph) in enumerate(((30, "A"), (20, "B"), (10, "C")))]
    result = compute_job(_panel_job(*runs))
    assert result.lines["LP1"].neutral_amps == pytest.approx(30.0)
    # a 208 V line-to-line load is between two ungrounded conductors, none of it on the
    # neutral (NEC 220.61(A))
    runs += [run_table("R9", "LP1", "Heater", "40", load=(40, "A"), connection="LL",
                       phase="BC")]
    assert compute_job(_panel_job(*runs)).lines["LP1"].neutral_amps == pytest.approx(30.0)


def test_a_9_kw_and_a_6_kw_heater_at_208_v_load_one_line_with_62_9_a():
    job = _panel_job(
        run_table("H1", "LP1", "Heater 9 kW", "30", load={"value": 9, "unit": "kW", "pf": 1.0},
                  connection="LL", continuous=True),
        run_table("H2", "LP1", "Heater 6 kW", "30", load={"value": 6, "unit": "kW", "pf": 1.0},
                  connection="LL", continuous=True))
    result = compute_job(job)
    i9, i6 = 9000 / 208, 6000 / 208     # 43.27 A and 28.85 A (S = V I)
    # The best split puts them on two pairs sharing one line (AB and BC); on the shared line
    # the two currents are 60 degrees apart (V_AB at +30, V_BC at -90, the first reversed):
    # sqrt(43.27^2 + 28.85^2 + 43.27 x 28.85) = 62.9 A. (Total VA / (sqrt(3) x 208) = 41.6 A.)
    heaviest = math.sqrt(i9**2 + i6**2 + i9 * i6)
    assert heaviest == pytest.approx(62.87, abs=0.01)
    assert result.feeder_amps["F1"] == pytest.approx(heaviest)
    assert sorted(result.lines["LP1"].phase_amps) == pytest.approx(sorted((i9, heaviest, i6)))
    f1 = result.runs["F1"]
    assert f1.design_amps == pytest.approx(1.25 * heaviest)   # 78.6 A, NEC 215.2(A)(1)
    assert f1.ocpd_a == 80                                    # NEC 240.6(A)
    # NEC 2023 Table 310.16, 60 C column (110.14(C)(1), a circuit of 100 A or less): 4 AWG Cu
    # 70 A is short of 78.6 A; 3 AWG Cu 85 A carries it
    assert (f1.size, f1.material) == ("3 AWG", "cu")
    # no line-to-neutral load: the neutral carries nothing and is the EGC's size, Table
    # 250.122: 8 AWG Cu for an 80 A device (215.2(A)(2), 220.61)
    assert result.lines["LP1"].neutral_amps == pytest.approx(0.0, abs=1e-9)
    assert f1.neutral_size == "8 AWG" and f1.egc_size == "8 AWG"
    assert result.feeders["F1"].line in ("A", "B", "C")


def _transformer_job(secondary_ft="10", *, panel=None, transformer=None, primary=None):
    """Service 480Y/277 -> F-T1 (40 ft) -> 45 kVA T1 (208Y/120) -> F-LP1 -> panel LP1 (150 A
    main) with a 30 kVA balanced load and a 16 A receptacle circuit, all at unity power
    factor."""
    return make_job(
        "transformer", defaults={"method": "dc", "pf": 1.0},
        sources=[source_table("SVC", "service", Y480),
                 source_table("T1", "transformer", Y208, kva=45, **(transformer or {})),
                 source_table("LP1", "panel", Y208,
                              **(panel if panel is not None else {"rating_a": 225,
                                                                  "main_a": 150}))],
        runs=[run_table("F-T1", "SVC", "T1", "40", **(primary or {})),
              run_table("F-LP1", "T1", "LP1", secondary_ft),
              run_table("R1", "LP1", "Kitchen", "30", load={"value": 30, "unit": "kVA",
                                                                "pf": 1.0},
                        connection="3P"),
              run_table("R2", "LP1", "Counter", "25", load=(16, "A"), connection="LN")])


def test_a_45_kva_transformer_gets_its_450_3_b_primary_device_and_its_conductors():
    result = compute_job(_transformer_job())
    t1 = result.transformers["T1"]
    # rated currents: 45,000 / (sqrt(3) x 480) = 54.1 A; 45,000 / (sqrt(3) x 208) = 124.9 A
    assert t1.primary_fla_a == pytest.approx(54.13, abs=0.01)
    assert t1.secondary_fla_a == pytest.approx(124.91, abs=0.01)
    # NEC Table 450.3(B), primary only: 125 % x 54.1 = 67.7 A, not a standard rating; note 1:
    # the next higher standard rating, 70 A (240.6(A)); no secondary device by the table
    assert t1.primary_ocpd_a == 70 and t1.secondary_ocpd_a is None
    primary = result.runs["F-T1"]
    assert primary.ocpd_a == 70
    # NEC 240.4: the primary conductors are protected by the 70 A device. 60 C terminals (a
    # 70 A circuit, 110.14(C)(1)); Table 310.16: 6 AWG Cu 55 A (next standard rating up 60 A,
    # 240.4(B), still under 70 A); 4 AWG Cu 70 A
    assert primary.size == "4 AWG"
    assert result.feeders["F-T1"].amps == 70
    # NEC 240.21(C)(2), 10 ft: the secondary conductors end in LP1's 150 A main, so their
    # ampacity is at least 150 A, with no next size up; Table 310.16 75 C (a 150 A circuit):
    # 1 AWG Cu 130 A is short, 1/0 AWG Cu 150 A
    secondary = result.runs["F-LP1"]
    assert secondary.ocpd_a == 150 and secondary.size == "1/0 AWG"
    assert secondary.ampacity_a >= 150
    assert "240.21(C)(2)" in result.feeders["F-LP1"].basis
    # not loaded past its rating: 30,000 / (sqrt(3) x 208) + 16 = 99.3 A on the heaviest line
    assert t1.load_amps == pytest.approx(30_000 / (SQRT3 * 208) + 16)
    assert t1.utilisation_pct == pytest.approx(t1.load_amps / t1.secondary_fla_a * 100)
    assert not [p for p in result.problems if p.id in ("T1", "F-T1", "F-LP1")]


def _secondary_job(transformer=None):
    """Service 480Y/277 -> F-T1 (40 ft) -> 112.5 kVA T1 (208Y/120) -> F-LP1 (8 ft) -> LP1 with a
    400 A main, serving 30 kVA three-phase and a 16 A, 120 V circuit."""
    return make_job(
        "secondary", sources=[
            source_table("SVC", "service", Y480),
            source_table("T1", "transformer", Y208, kva=112.5, **(transformer or {})),
            source_table("LP1", "panel", Y208, rating_a=400, main_a=400)],
        runs=[run_table("F-T1", "SVC", "T1", "40"), run_table("F-LP1", "T1", "LP1", "8"),
              run_table("R1", "LP1", "Kitchen", "30", load=(30, "kVA"), connection="3P"),
              run_table("R2", "LP1", "Counter", "25", load=(16, "A"), connection="LN")])


def test_secondary_conductors_carry_a_supply_side_bonding_jumper_by_table_250_102_c_1():
    result = compute_job(_secondary_job())
    f = result.runs["F-LP1"]
    # NEC 240.21(C)(2): at least LP1's 400 A main, no next size up; Table 310.16 75 C:
    # 500 kcmil Cu 380 A is short, 600 kcmil Cu 420 A
    assert f.size == "600 kcmil" and f.ocpd_a == 400
    # the wire run with them to LP1's main is the supply-side bonding jumper of the separately
    # derived system (NEC 2023 250.30(A)(2)), sized by Table 250.102(C)(1) from the ungrounded
    # conductors: over 350 through 600 kcmil Cu -> 1/0 AWG Cu (from memory); not Table
    # 250.122's 3 AWG for a 400 A device, which is for the load side of a device
    assert f.egc_size == "1/0 AWG"
    # 250.30(A)(3): the neutral (16 A of load) not smaller than Table 250.102(C)(1) either,
    # where the system bonding jumper is at the first disconnecting means (taken so)
    assert f.neutral_size == "1/0 AWG"
    assert any("250.102(C)(1)" in n for n in f.notes)
    assert any("250.30(A)(3)" in n for n in f.notes)


def test_past_a_secondary_device_at_the_transformer_the_feeder_egc_is_table_250_122():
    # a 400 A secondary device at T1's terminals protects F-LP1 as a feeder: Table 250.122,
    # 3 AWG Cu for 400 A, and the neutral no smaller than it (215.2(A)(2))
    f = compute_job(_secondary_job({"secondary_ocpd_a": 400})).runs["F-LP1"]
    assert f.egc_size == "3 AWG" and f.neutral_size == "3 AWG"


def test_secondary_conductors_over_25_ft_or_without_a_device_to_end_in_are_problems():
    # NEC 240.21(C)(6): within 25 ft, ending in one device; 1/3 of the primary device x the
    # voltage ratio: 70 x 480 / 208 / 3 = 53.8 A, under the 150 A main that governs
    result = compute_job(_transformer_job("22"))
    assert result.runs["F-LP1"].ocpd_a == 150 and result.runs["F-LP1"].size == "1/0 AWG"
    assert "240.21(C)(6)" in result.feeders["F-LP1"].basis
    long = compute_job(_transformer_job("30"))
    assert any("past the 25 ft of 240.21(C)(6)" in p.message
               for p in long.run_problems("F-LP1"))
    lugs = compute_job(_transformer_job("22", panel={"rating_a": 225}))
    assert any("must end in a single device" in p.message for p in lugs.run_problems("F-LP1"))
    # a secondary device at the transformer protects the run beyond it (240.21(C), 240.4)
    fixed = compute_job(_transformer_job("30", transformer={"secondary_ocpd_a": 150}))
    assert not fixed.run_problems("F-LP1")
    assert fixed.runs["F-LP1"].ocpd_a == 150


def test_a_main_lugs_panel_on_a_transformer_secondary_without_a_secondary_device_is_a_problem():
    # 10 ft of secondary conductors into a 225 A main-lugs panel: 240.21(C)(2) sizes them to
    # its rating, but NEC 2023 408.36(B) wants the panel's overcurrent protection on the
    # secondary side of the transformer (the primary device protects it only for the
    # 240.21(C)(1) secondaries: single-phase two-wire, three-phase delta-delta three-wire)
    lugs = compute_job(_transformer_job("10", panel={"rating_a": 225}))
    said = [p.message for p in lugs.run_problems("F-LP1")]
    assert any("408.36(B)" in m for m in said), said
    assert not lugs.ok
    # a main on the panel, or a secondary device at the transformer, is that protection
    assert not compute_job(_transformer_job("10")).run_problems("F-LP1")
    fixed = compute_job(_transformer_job("10", panel={"rating_a": 225},
                                         transformer={"secondary_ocpd_a": 150}))
    assert not fixed.run_problems("F-LP1")


def test_the_feeder_into_a_transformer_without_a_kva_is_not_ok():
    # with no kVA, Table 450.3(B) gives no primary device (NEC 2023 450.3(B)); the feeder can
    # only be sized for the load below, which a reviewer must not read as a checked design
    job = _transformer_job()
    t1 = job.source("T1")
    job.sources[job.sources.index(t1)] = t1.model_copy(update={"kva": None})
    result = compute_job(job)
    assert any(p.where == "source T1" and "kVA is not given" in p.message
               for p in result.problems)
    said = [p.message for p in result.run_problems("F-T1")]
    assert any("Table 450.3(B)" in m and "kVA" in m for m in said), said


def test_primary_and_secondary_protection_checks_the_secondary_device():
    # NEC Table 450.3(B), primary and secondary: the secondary at most 125 % x 124.9 = 156.1 A,
    # note 1: 175 A; LP1's 150 A main is within it; a 200 A secondary device is not
    ok = compute_job(_transformer_job(transformer={"protection": "both"}))
    assert ok.transformers["T1"].secondary_ocpd_a == 150
    assert ok.transformers["T1"].secondary_max_a == 175
    assert ok.transformers["T1"].primary_max_a == pytest.approx(2.5 * 54.13, abs=0.01)
    over = compute_job(_transformer_job("30", transformer={"protection": "both",
                                                           "secondary_ocpd_a": 200}))
    assert any(p.where == "source T1" and "200 A secondary device is over the 175 A"
               in p.message for p in over.problems)


def test_a_primary_device_fixed_past_table_450_3_b_is_a_problem():
    result = compute_job(_transformer_job(primary={"ocpd_a": 90}))
    # primary only: at most 70 A (125 %, note 1)
    assert any("90 A primary device is over the 70 A" in p.message
               for p in result.run_problems("F-T1"))


@pytest.mark.parametrize(("rated", "method", "device"), [
    (54.13, "primary", 70),   # 125 % = 67.7 A, note 1: next higher standard rating
    (40.0, "primary", 50),    # 125 % = 50 A, a standard rating
    (9.0, "primary", 15),     # 125 % = 11.25 A, note 1 from 9 A: 15 A
    (6.0, "primary", 10),     # under 9 A: at most 167 % = 10.0 A, not exceeded: 10 A
    (1.5, "primary", 3),      # under 2 A: at most 300 % = 4.5 A: the 3 A fuse (240.6(A))
])
def test_primary_devices_by_table_450_3_b(rated, method, device):
    # NEC 2023 Table 450.3(B) with note 1; 240.6(A) ratings, fuses 1, 3, 6, 10 A included
    assert primary_device(rated, method)[1] == device


def test_a_100_a_panel_serving_152_7_a_is_a_problem():
    loads = [run_table(f"R{n}", "LP1", f"Unit {n}", "40", load=(kva, "kVA"), connection="3P")
             for n, kva in ((1, 20), (2, 20), (3, 15))]
    result = compute_job(_panel_job(*loads, panel={"rating_a": 100, "main_a": 100}))
    # 55,000 VA / (sqrt(3) x 208) = 152.7 A on every line, noncontinuous
    loading = result.loadings["LP1"]
    assert loading.design_a == pytest.approx(55_000 / (SQRT3 * 208))
    assert loading.design_a == pytest.approx(152.66, abs=0.01)
    assert loading.utilisation_pct == pytest.approx(152.66, abs=0.01)
    said = [p.message for p in result.problems if p.where == "source LP1"]
    assert any("NEC 408.30" in m and "over its 100 A rating" in m for m in said)
    assert any("over its 100 A main" in m for m in said)
    assert not result.ok


def test_a_main_lugs_panel_fed_by_a_larger_device_and_a_main_above_the_bus_are_problems():
    loads = [run_table("R1", "LP1", "Oven", "40", load=(30, "kVA"), connection="3P")]
    lugs = compute_job(_panel_job(*loads, panel={"rating_a": 60}))
    # 30,000 / (sqrt(3) x 208) = 83.3 A: a 90 A feeder device over a 60 A bus (NEC 408.36)
    assert lugs.runs["F1"].ocpd_a == 90
    assert any("main lugs only" in p.message and "408.36" in p.message
               for p in lugs.problems if p.where == "source LP1")
    big = compute_job(_panel_job(*loads, panel={"rating_a": 100, "main_a": 125}))
    assert any("125 A main is larger than its 100 A bus" in p.message for p in big.problems)


def test_a_panel_without_a_bus_rating_is_said_not_checked():
    # NEC 2023 408.30 (the bus against its load) and 408.36 (a main-lugs panel's feeder device
    # not above its bus) need the panel's rating: without it they cannot pass, only go unchecked
    loads = [run_table("R1", "LP1", "Oven", "40", load=(30, "kVA"), connection="3P")]
    job = _panel_job(*loads)
    said = [p.brief() for p in implausible(job)]
    assert any(w.startswith("source LP1:") and "408.30" in w and "408.36" in w for w in said)
    notes = [n for sch in schedules_of(job, compute_job(job)) if sch.title == "LP1"
             for n in sch.notes]
    assert any("bus rating not given" in n and "not checked" in n for n in notes), notes
    rated = _panel_job(*loads, panel={"rating_a": 100})
    assert not [p for p in implausible(rated) if p.where == "source LP1"]
    # the service SVC gives neither a rating nor a main: its loading is not checked either
    # (NEC 230.42(A), 230.79)
    assert [p.field for p in implausible(rated) if p.where == "source SVC"] == ["rating_a"]


def test_an_equipment_basis_sizes_the_feeder_to_the_panel_and_keeps_the_load_answer_beside():
    loads = [run_table("R1", "LP1", "Bench", "40", load=(16, "A"), connection="LN")]
    job = _panel_job(*loads, panel={"rating_a": 225, "main_a": 200},
                     defaults={"feeder_basis": "equipment"})
    result = compute_job(job)
    f1 = result.runs["F1"]
    # a 200 A device, conductors it protects: 75 C (over 100 A), 3/0 AWG Cu 200 A
    assert f1.ocpd_a == 200 and f1.size == "3/0 AWG"
    info = result.feeders["F1"]
    assert info.amps == 200 and "200 A main" in info.basis
    assert info.beside is not None and info.beside.ocpd_a == 20   # 16 A: a 20 A device
    # a per-feeder basis overrides the job's
    job.run("F1").basis = "load"
    assert compute_job(job).runs["F1"].ocpd_a == 20


def test_the_drop_carries_through_a_transformer_and_a_branch_ok_behind_a_restart_is_not():
    # a long primary feeder, the transformer and a branch near its own 3 % target: with the
    # drop restarting at the secondary the branch looks within 5 %; carried through (the
    # default) its total is over it, and with its size fixed it is flagged
    job = _transformer_job()
    job.run("F-T1").length = "600"
    job.run("R2").length = "85"
    job.run("R2").size = "10 AWG"   # 2 x 16 A x 1.24 ohm/kft x 85 ft = 3.37 V, 2.81 % of 120 V
    through = compute_job(job)
    job.defaults.drop_through_transformers = False
    restart = compute_job(job)
    t1 = through.transformers["T1"]
    up = through.run_total_drop_pct["F-T1"]
    assert restart.source_drop_pct["T1"] == 0.0
    assert through.source_drop_pct["T1"] == pytest.approx(up + t1.drop_pct)
    r2 = through.runs["R2"]
    assert r2.total_drop_pct == pytest.approx(
        up + t1.drop_pct + through.runs["F-LP1"].voltage_drop_pct + r2.voltage_drop_pct)
    assert restart.runs["R2"].ok and r2.total_drop_pct > 5.0 and not r2.ok


def _at_pf_08(job):
    job.defaults.pf = 0.8
    job.run("R1").load = Load(value=30, unit="kVA", pf=0.8)
    return job


def test_the_drop_through_a_transformer_follows_ieee_141():
    result = compute_job(_at_pf_08(_transformer_job()))
    t1 = result.transformers["T1"]
    # typical 4.5 % and X/R 1.4 for 45 kVA (assumed, common practice): %R = 4.5 / sqrt(1 +
    # 1.4^2) = 2.616 %, %X = 1.4 x 2.616 = 3.662 %. Every load at 0.8 power factor: the
    # heaviest line 30,000 / (sqrt(3) x 208) + 16 = 99.27 A of 124.91 A rated, so
    # %VD = 0.7947 x (2.616 x 0.8 + 3.662 x 0.6) = 3.409 %
    assert t1.impedance_pct == 4.5 and t1.impedance_assumed and t1.x_r == 1.4
    assert t1.load_amps == pytest.approx(99.27, abs=0.01)
    assert t1.drop_pct == pytest.approx(0.7947 * (2.616 * 0.8 + 3.662 * 0.6), rel=1e-3)
    named = compute_job(_at_pf_08(_transformer_job(transformer={"impedance_pct": 3.0})))
    assert not named.transformers["T1"].impedance_assumed
    assert named.transformers["T1"].drop_pct == pytest.approx(t1.drop_pct * 3.0 / 4.5)


def test_a_main_lugs_problem_comes_and_goes_with_an_edit_as_in_a_full_compute():
    from gaugewalk.model.walk.recompute import recompute_run

    # 30,000 / (sqrt(3) x 208) = 83.3 A: a 90 A feeder device over the 60 A bus (NEC 408.36);
    # 10,000 VA: 27.8 A, a 30 A device, within it
    job = _panel_job(run_table("R1", "LP1", "Oven", "40", load=(10, "kVA"), connection="3P"),
                     panel={"rating_a": 60})
    result = compute_job(job)
    for kva, lugs in ((30, True), (10, False)):
        job.run("R1").load = Load(value=kva, unit="kVA")
        result = recompute_run(job, result, "R1")
        said = [str(p) for p in result.problems]
        assert said == [str(p) for p in compute_job(job).problems]
        assert any("main lugs only" in m for m in said) is lugs
