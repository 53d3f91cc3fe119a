"""The sizing engine against NEC 2023 Tables 310.16, 250.122 and Ch. 9 Tables 1, 4, 5, 8 and 9,
with the arithmetic shown."""

import math
from dataclasses import replace

import pytest
from hypothesis import given
from hypothesis import strategies as st

from gaugewalk.model.engine.circuits import circuit_from_volts, resolve_circuit
from gaugewalk.model.engine.contract import RunSpec
from gaugewalk.model.engine.drop import conductor_z
from gaugewalk.model.engine.sizing import START_SIZE, SizingError, evaluate
from gaugewalk.tables.conductor import ampacity, impedance
from gaugewalk.tables.conductor.sizes import SIZES
from gaugewalk.tables.protection import ocpd

C240 = circuit_from_volts(240, 1)
C480_3 = circuit_from_volts(480, 3)


def spec(**kw) -> RunSpec:
    kw.setdefault("circuit", C240)
    kw.setdefault("length_ft", 20.0)
    return RunSpec(**kw)


def test_40_a_noncontinuous_on_60_c_terminals_takes_8_awg_copper():
    # NEC 2023 Table 310.16, 60 C copper: 10 AWG 30 A < 40 A, 8 AWG 40 A; 110.14(C)(1)(a): 60 C
    # terminals for a 40 A circuit
    r = evaluate(spec(amps=40))
    assert (r.size, r.ocpd_a, r.ampacity_a, r.governed_by) == ("8 AWG", 40, 40.0, "ampacity")
    assert r.ok and r.min_ampacity_size == "8 AWG"


def test_100_a_continuous_needs_125_a_and_takes_1_awg_copper_at_75_c():
    # NEC 210.19(A)(1)(a)/215.2(A)(1)(a): 125% x 100 A = 125 A; 240.6(A): 125 A device;
    # 110.14(C)(1)(b): over 100 A -> 75 C column; Table 310.16 75 C Cu: 2 AWG 115 A < 125,
    # 1 AWG 130 A
    r = evaluate(spec(amps=100, continuous=True))
    assert (r.design_amps, r.ocpd_a, r.size) == (125.0, 125, "1 AWG")
    assert r.margins["terminal_a"] == pytest.approx(130 - 125)
    # Table 250.122: a 125 A device (not over 200 A) -> 6 AWG Cu
    assert r.egc_size == "6 AWG"


def test_a_partly_continuous_load_counts_only_its_continuous_share_at_125_percent():
    # NEC 210.19(A)(1)(a): 20 A + 1.25 x 20 A = 45 A -> 45 A device (240.6(A))
    r = evaluate(spec(amps=40, continuous_amps=20))
    assert r.design_amps == pytest.approx(45.0) and r.ocpd_a == 45


def test_aluminum_starts_at_12_awg_and_follows_its_own_column():
    # NEC 2023 Table 310.16, 75 C aluminum: 2 AWG 90 A < 100 A, 1 AWG 100 A
    r = evaluate(spec(amps=100, material="al", terminal_temp=75))
    assert r.size == "1 AWG" and r.material == "al"
    assert START_SIZE == {"cu": "14 AWG", "al": "12 AWG"}
    # Table 310.16 60 C Al 12 AWG is 15 A; 240.4(D) limits 12 AWG Al to 15 A
    assert evaluate(spec(amps=12, material="al")).size == "12 AWG"


def test_small_conductor_rule_pushes_25_a_on_75_c_terminals_to_10_awg():
    # Table 310.16 75 C: 12 AWG Cu 25 A would carry 25 A, but NEC 240.4(D)(5) limits 12 AWG Cu
    # to a 20 A device, so the 25 A device needs 10 AWG
    r = evaluate(spec(amps=25, terminal_temp=75))
    assert (r.size, r.governed_by, r.min_ampacity_size) == ("10 AWG", "overcurrent device",
                                                            "12 AWG")


def test_bundling_upsizes_without_growing_the_egc():
    # NEC 2023 Table 310.15(C)(1): 9 current-carrying conductors -> 0.70.
    # 10 AWG THHN: 90 C 40 A x 0.70 = 28 A < 30 A; 8 AWG: 55 x 0.70 = 38.5 A >= 30 A, and its
    # 60 C terminal ampacity 40 A >= 30 A (110.14(C)(1)). Table 250.122: 30 A device -> 10 AWG,
    # not increased: upsizing for the 310.15(C) adjustment is not an increase under
    # 250.122(B) (2023).
    r = evaluate(spec(amps=30, ccc=9))
    assert r.size == "8 AWG" and r.governed_by == "ampacity"
    assert r.ampacity_a == pytest.approx(38.5)
    assert r.egc_size == "10 AWG"


def test_hot_ambient_applies_the_insulation_column_factor():
    # NEC 2023 Table 310.15(B)(1)(1): 45 C, 90 C column -> 0.87; 8 AWG THHN 55 x 0.87 = 47.85 A
    r = evaluate(spec(amps=45, ambient_c=45, terminal_temp=75))
    # 75 C terminals: 8 AWG 50 A >= 45 A; corrected 47.85 A >= 45 A
    assert r.size == "8 AWG"
    assert r.margins["corrected_a"] == pytest.approx(55 * 0.87 - 45)


def test_a_fixed_size_reports_each_failure_in_a_sentence():
    # 12 AWG THWN (75 C): 25 A x 0.80 (4 conductors, Table 310.15(C)(1)) = 20 A < 24 A
    r = evaluate(spec(amps=24, size="12", insulation="THWN", ccc=4))
    assert r.governed_by == "fixed size" and not r.ok
    assert "12 AWG Cu carries 20 A after corrections; the load needs 24 A" in r.problems
    # 240.6(A): 25 A device for 24 A; 240.4(D)(5): 12 AWG Cu at most 20 A
    assert any("240.4(D)" in p and "20 A" in p for p in r.problems)


def test_a_fixed_size_that_works_has_no_problems():
    r = evaluate(spec(amps=16, size="10 AWG"))
    assert r.ok and r.size == "10 AWG" and r.governed_by == "fixed size"


def test_voltage_drop_upsizes_the_run_and_the_egc_in_proportion():
    # 100 A on 75 C terminals: Table 310.16 3 AWG Cu = 100 A is the ampacity minimum.
    # 480 V 3-phase, 600 ft, DC method (Table 8): 1 AWG: sqrt(3) x 100 x 600 x 0.154 / 1000 =
    # 16.00 V = 3.33 % > 3 %; 1/0: x 0.122 -> 12.68 V = 2.64 %.
    r = evaluate(spec(circuit=C480_3, amps=100, length_ft=600, terminal_temp=75, method="dc"))
    assert r.size == "1/0 AWG" and r.governed_by == "voltage drop"
    assert r.voltage_drop_v == pytest.approx(math.sqrt(3) * 100 * 600 * 0.122 / 1000, rel=1e-9)
    assert r.voltage_drop_pct == pytest.approx(2.64, abs=0.01)
    # NEC 250.122(B): Table 250.122 gives 8 AWG (16,510 cmil) for 100 A; the phase conductors
    # went from 3 AWG (52,620 cmil) to 1/0 (105,600 cmil), x 2.0068 -> 16,510 x 2.0068 =
    # 33,133 cmil; 6 AWG (26,240) is too small, so 4 AWG (41,740). Table 8 areas.
    assert 16510 * 105600 / 52620 == pytest.approx(33133, abs=1)
    assert r.egc_size == "4 AWG"


def test_a_user_upsized_conductor_also_upsizes_the_egc():
    # same arithmetic as above, with the 1/0 fixed by the user (NEC 250.122(B))
    r = evaluate(spec(circuit=C480_3, amps=100, size="1/0", terminal_temp=75))
    assert r.egc_size == "4 AWG" and r.ok


def test_egc_is_never_larger_than_the_phase_conductors():
    # NEC 250.122(A): 12 AWG on a 25 A device would need a 10 AWG EGC by Table 250.122; the EGC
    # need not be larger than the circuit conductors. (The 25 A device fails 240.4(D) anyway.)
    r = evaluate(spec(amps=24, size="12", terminal_temp=90))
    assert r.egc_size == "12 AWG"


def test_parallel_sets_share_the_load_and_must_be_1_0_or_larger():
    # NEC 310.10(G)(1): parallel conductors 1/0 AWG and larger. 600 A: 240.6(A) 600 A device;
    # 75 C: 2 sets x 350 kcmil 310 A = 620 A >= 600 A (Table 310.16); 300 kcmil 2 x 285 = 570 A
    r = evaluate(spec(circuit=C480_3, amps=600, sets=2))
    assert r.size == "350 kcmil" and r.ampacity_a == pytest.approx(620.0)
    # NEC 250.122(F): a full-size EGC per raceway: 600 A -> 1 AWG Cu (Table 250.122)
    assert r.egc_size == "1 AWG"
    small = evaluate(spec(amps=100, sets=2, size="2 AWG"))
    assert any("310.10(G)" in p for p in small.problems)


def test_a_run_no_single_size_can_carry_says_so_and_suggests_parallel_sets():
    # Table 310.16: the largest copper, 2000 kcmil at 75 C, is 665 A < 1500 A
    r = evaluate(spec(circuit=C480_3, amps=1500, length_ft=100))
    assert not r.ok
    assert "no single Cu size" in r.problems[0] and "in parallel would" in r.problems[0]


def test_conduit_fill_for_a_four_wire_feeder_with_egc():
    # 208Y/120 V 3-phase 4-wire, 80 A on 75 C terminals: 4 AWG (85 A, Table 310.16);
    # Table 250.122: 80 A -> 8 AWG EGC. NEC Ch. 9 Table 5 THHN: 4 AWG 0.0824 in2, 8 AWG 0.0366;
    # 4 x 0.0824 + 0.0366 = 0.3662 in2. Table 1: over two conductors 40 %. Table 4 EMT:
    # 1 in 0.864 x 40 % = 0.3456 < 0.3662; 1-1/4 in 1.496 x 40 % = 0.5984 -> 1-1/4, 24.5 % full.
    r = evaluate(spec(circuit=resolve_circuit("208Y/120V 3ph 4w", "3PN"), amps=80,
                      terminal_temp=75, raceway="EMT"))
    assert (r.size, r.egc_size, r.neutral_size) == ("4 AWG", "8 AWG", "4 AWG")
    assert r.conductors == {"hot": 3, "neutral": 1, "egc": 1}
    assert r.raceway_size == "1-1/4"
    assert r.raceway_fill_pct == pytest.approx(100 * 0.3662 / 1.496, rel=1e-6)


def test_a_raceway_family_is_filled_as_its_representative_type():
    r = evaluate(spec(amps=40, raceway="pvc"))
    assert r.raceway == "PVC-40"
    assert any("family 'pvc'" in n for n in r.notes)


def test_total_drop_from_the_service_can_govern():
    # 2.5 % already upstream leaves 2.5 % of the 5 % total for this run
    alone = evaluate(spec(amps=20, length_ft=90, circuit=circuit_from_volts(120, 1)))
    behind = evaluate(spec(amps=20, length_ft=90, circuit=circuit_from_volts(120, 1),
                           upstream_drop_pct=2.5))
    assert alone.voltage_drop_pct <= 3.0 and behind.voltage_drop_pct <= 2.5
    assert behind.total_drop_pct == pytest.approx(2.5 + behind.voltage_drop_pct)
    assert SIZES.index(behind.size) >= SIZES.index(alone.size)


@pytest.mark.parametrize(
    ("field", "value"),
    [("amps", 0.0), ("amps", float("nan")), ("length_ft", -5.0), ("length_ft", float("inf")),
     ("pf", 0.0), ("sets", 0), ("insulation", "PAPER"), ("raceway", "garden hose"),
     ("terminal_temp", 85), ("ambient_c", 95.0)],
)
def test_specs_that_cannot_be_evaluated_raise_a_sizing_error(field, value):
    with pytest.raises(SizingError):
        evaluate(replace(spec(amps=20), **{field: value}))


def test_700_kcmil_by_the_ac_method_lands_between_the_600_and_750_kcmil_table_9_drops():
    # NEC Ch. 9 Table 9 lists no 700, 800 or 900 kcmil. 450 A, 400 ft, 480 V 3-phase, Cu in steel
    # conduit (RMC), pf 0.85 (the job default):
    #   600 kcmil: R 0.025, XL 0.048 ohm/kft -> Ze = 0.025 x 0.85 + 0.048 x 0.5268 = 0.04654
    #   750 kcmil: R 0.021, XL 0.048         -> Ze = 0.021 x 0.85 + 0.048 x 0.5268 = 0.04314
    #   VD = sqrt(3) x 450 x Ze x 400 / 1000: 14.51 V and 13.45 V.
    # 700 kcmil by the interpolation of gaugewalk.model.engine.drop: Table 8 DC R 0.0184
    # (NEC Ch. 9 Table 8, Cu stranded 75 C) x the AC/DC ratio interpolated in circular mils
    # between 0.025/0.0214 and 0.021/0.0171 (2/3 of the way is 100 of 150 kcmil):
    #   ratio = 1.1682 + (100/150)(1.2281 - 1.1682) = 1.2082 -> R = 0.02223; XL 0.048
    #   Ze = 0.02223 x 0.85 + 0.048 x 0.5268 = 0.04418 -> VD = 13.77 V
    r = evaluate(spec(circuit=C480_3, amps=450, length_ft=400, raceway="RMC"))
    assert r.size == "700 kcmil" and r.method == "ac"
    assert any("Table 9 lists no Cu 700 kcmil" in n for n in r.notes)
    sin = math.sqrt(1 - 0.85 ** 2)
    at_600 = math.sqrt(3) * 450 * (0.025 * 0.85 + 0.048 * sin) * 400 / 1000
    at_750 = math.sqrt(3) * 450 * (0.021 * 0.85 + 0.048 * sin) * 400 / 1000
    assert at_750 < r.voltage_drop_v < at_600
    ratio = 0.025 / 0.0214 + 100 / 150 * (0.021 / 0.0171 - 0.025 / 0.0214)
    by_hand = math.sqrt(3) * 450 * (0.0184 * ratio * 0.85 + 0.048 * sin) * 400 / 1000
    assert r.voltage_drop_v == pytest.approx(by_hand, rel=1e-9)
    assert r.voltage_drop_v == pytest.approx(13.77, abs=0.01)


def test_sizes_past_table_9_fall_back_to_table_8_resistance_and_say_so():
    # NEC Ch. 9 Table 9 ends at 1000 kcmil: a fixed 1250 kcmil gets the Table 8 DC resistance
    # (0.0103 ohm/kft Cu at 75 C) and says so
    r = evaluate(spec(circuit=C480_3, amps=400, length_ft=100, size="1250 kcmil", method="ac"))
    assert r.method == "dc" and any("Table 9 lists no" in n for n in r.notes)
    assert r.voltage_drop_v == pytest.approx(math.sqrt(3) * 400 * 100 * 0.0103 / 1000, rel=1e-9)


def test_the_engine_uses_table_9_impedance_at_the_runs_power_factor():
    # NEC Ch. 9 Table 9, 4/0 Cu in PVC: R 0.062, XL 0.041 ohm/kft; pf 0.9:
    # Ze = 0.062 x 0.9 + 0.041 x sqrt(1 - 0.81) = 0.0558 + 0.01787 = 0.07367 ohm/kft;
    # VD = sqrt(3) x 200 A x 0.07367 x 250 ft / 1000 = 6.380 V
    r = evaluate(spec(circuit=C480_3, amps=200, length_ft=250, size="4/0", pf=0.9,
                      raceway="PVC-40"))
    ze = 0.062 * 0.9 + 0.041 * math.sqrt(1 - 0.81)
    assert r.voltage_drop_v == pytest.approx(math.sqrt(3) * 200 * ze * 250 / 1000, rel=1e-12)


# ------------------------------------------------------------------ properties


def independent_failures(s: RunSpec, size: str) -> list[str]:
    """The constraints ``size`` fails, computed straight from the tables (not the engine)."""
    design = s.amps * 1.25 if s.continuous else s.amps
    dev = ocpd.next_standard_rating(design)
    term = s.terminal_temp or (60 if dev <= 100 else 75)
    ins = ampacity.insulation_rating(s.insulation)
    term = min(term, ins)
    factor = ampacity.ambient_factor(s.ambient_c, ins) * ampacity.ccc_factor(
        s.ccc or s.circuit.hots + (1 if s.circuit.neutral and s.circuit.neutral_is_ccc else 0))
    fails = []
    at_terminal = ampacity.ampacity(size, s.material, term)
    at_rating = ampacity.ampacity(size, s.material, ins)
    assert at_terminal is not None and at_rating is not None, size  # a size Table 310.16 lists
    ta = at_terminal * s.sets
    corrected = at_rating * factor * s.sets
    if ta < design - 1e-9:
        fails.append("terminal")  # NEC 110.14(C)(1), 210.19(A)(1)(a)
    if corrected < s.amps - 1e-9:
        fails.append("corrected")  # NEC 210.19(A)(1)(b)
    allowable = min(ta, corrected)
    if dev > allowable and not (dev <= 800 and dev == ocpd.next_standard_rating(allowable)):
        fails.append("device")  # NEC 240.4(B)
    small = ocpd.small_conductor_max_ocpd(size, s.material)
    if small is not None and dev > small:
        fails.append("240.4(D)")
    z = conductor_z(size, s.material, s.method, pf=s.pf, family="steel")
    pct = 100 * s.circuit.drop_factor * s.amps * z * s.length_ft / 1000 / s.sets / s.circuit.volts
    if pct > s.max_drop_pct + 1e-9:
        fails.append("drop")
    return fails


circuits = st.sampled_from([C240, C480_3, circuit_from_volts(120, 1), circuit_from_volts(208, 3),
                            resolve_circuit("208Y/120V 3ph 4w", "3PN", nonlinear=True)])


@given(circuits, st.floats(min_value=1, max_value=300), st.floats(min_value=5, max_value=800),
       st.booleans(), st.sampled_from(["cu", "al"]), st.sampled_from(["dc", "kfactor", "ac"]),
       st.sampled_from([None, 60, 75]), st.sampled_from([30.0, 40.0]))
def test_the_picked_size_passes_and_the_next_smaller_fails(circuit, amps, length, continuous,
                                                           material, method, terminal, ambient):
    s = RunSpec(circuit=circuit, amps=amps, length_ft=length, continuous=continuous,
                material=material, method=method, terminal_temp=terminal, ambient_c=ambient,
                raceway="RMC")
    r = evaluate(s)
    conductor_problems = [p for p in r.problems if "raceway" not in p and "trade size" not in p]
    if conductor_problems:
        assert "no single" in conductor_problems[0]
        return
    assert independent_failures(s, r.size) == []
    i = SIZES.index(r.size)
    if method == "ac":  # Table 9 skips 700-900 kcmil: the next smaller size the method can use
        while i > 0 and not impedance.in_table9(SIZES[i - 1], material):
            i -= 1
    if SIZES.index(r.size) > SIZES.index(START_SIZE[material]) and i > 0:
        assert independent_failures(s, SIZES[i - 1]) != []


@pytest.mark.parametrize("upstream, said", [
    (5.6, "already takes the whole 5% total target"),
    (4.9, "leaves 0.10% of the 5% total target, less than this run drops on any size within "
          "2 sizes of the one its own target asks (common practice: the drop is cured where "
          "it is lost)"),
])
def test_a_run_behind_a_source_over_the_total_target_keeps_what_its_own_target_asks(upstream,
                                                                                    said):
    # Up to the source the drop is already 5.6 % (or leaves 0.1 %, which even 1000 kcmil Cu
    # exceeds: about 0.035 ohm/kft x 2 x 40 A x 0.150 kft = 0.42 V, 0.18 % of 240 V): a larger
    # conductor here cannot meet the total, so the run keeps the size its own 3 % asks instead
    # of the largest the table has. NEC Ch. 9 Table 9 (from memory), Cu at pf 0.85: 8 AWG about
    # 0.69 ohm/kft -> 2 x 40 A x 0.69 x 0.150 kft = 8.3 V, 3.5 % of 240 V (over 3 %); 6 AWG
    # about 0.44 ohm/kft -> 5.3 V, 2.2 %.
    r = evaluate(spec(amps=40, length_ft=150, upstream_drop_pct=upstream))
    assert (r.size, r.governed_by) == ("6 AWG", "voltage drop")
    assert r.voltage_drop_pct == pytest.approx(2.2, abs=0.1)
    assert r.problems[0] == (f"the drop up to its source, {upstream:.2f}%, {said}: sized for its "
                             "own 3% target; the drop has to come down upstream")
    assert f"drop from the service {upstream + r.voltage_drop_pct:.2f}% is over the 5% target" \
        in r.problems
    assert not r.ok


def test_a_run_upsized_for_its_drop_says_how_much_the_sizes_it_passed_over_drop():
    # 16 A on 240 V single-phase, 150 ft, DC method: VD = 2 x 16 A x R x 150 ft / 1000 with NEC
    # 2023 Ch. 9 Table 8 uncoated stranded copper at 75 C (from memory): 12 AWG 1.98 ohm/kft,
    # 9.50 V = 3.96 % of 240 V; 10 AWG 1.24 ohm/kft, 5.95 V = 2.48 %: 10 AWG for the 3 %
    # target, 12 AWG passed over for its drop alone (14 AWG, 15 A in the 60 C column of Table
    # 310.16, is passed over for its ampacity)
    from gaugewalk.model.engine.sizing import evaluate_picked

    r, passed = evaluate_picked(spec(amps=16, length_ft=150.0, method="dc"))
    assert (r.size, r.governed_by) == ("10 AWG", "voltage drop")
    assert passed == pytest.approx(2 * 16 * 1.98 * 150 / 1000 / 240 * 100, rel=1e-3)
    assert evaluate(spec(amps=16, length_ft=150.0, method="dc")) == r
    # a size picked for its ampacity passed over nothing for its drop
    assert evaluate_picked(spec(amps=16, length_ft=20.0, method="dc"))[1] == math.inf


@pytest.mark.parametrize("upstream, size", [(3.6, "3 AWG"), (3.8, "6 AWG")])
def test_a_run_is_taken_at_most_two_sizes_over_its_own_target_for_the_total(upstream, size):
    # 40 A at 240 V, 150 ft of Cu in steel at pf 0.85: drop % = 2 x 40 A x Z x 0.150 kft / 240 V
    # x 100 = 5 Z, with Z = R cos + X sin from NEC Ch. 9 Table 9 (as the tables module reads it).
    # Its own 3 % asks 6 AWG; 1.4 % left of the 5 % total (3.6 % upstream) is met by 3 AWG, two
    # sizes over: taken. 1.2 % left (3.8 %) needs 2 AWG, three sizes over: the cure is upstream
    # (pick.UPSIZE_FOR_TOTAL, common practice), so the run keeps 6 AWG and says so.
    from gaugewalk.model.engine.drop import table9_rx

    def pct(size: str) -> float:
        r, x = table9_rx(size, "cu", "steel")
        return 5 * (r * 0.85 + x * math.sqrt(1 - 0.85 ** 2))

    assert pct("8 AWG") > 3.0 >= pct("6 AWG")                      # its own target: 6 AWG
    assert pct("4 AWG") > 1.4 >= pct("3 AWG") and pct("3 AWG") > 1.2 >= pct("2 AWG")
    r = evaluate(spec(amps=40, length_ft=150, upstream_drop_pct=upstream))
    assert r.size == size and r.voltage_drop_pct == pytest.approx(pct(size), rel=1e-3)
    if size == "6 AWG":
        assert "the drop has to come down upstream" in r.problems[0] and not r.ok
    else:
        assert r.ok and r.governed_by == "voltage drop"
