"""Solid conductors: NEC Ch. 9 Table 8 lists them only for the small sizes."""

import pytest

from gaugewalk.model.engine.circuits import circuit_from_volts
from gaugewalk.model.engine.contract import RunSpec
from gaugewalk.model.engine.sizing import SizingError, evaluate

CIRCUIT_120 = circuit_from_volts(120, 1)


def test_a_fixed_solid_size_table_8_does_not_list_is_refused_by_name():
    # NEC 2023 Ch. 9 Table 8: solid copper is listed for 18 AWG to 8 AWG only.
    with pytest.raises(SizingError, match="no solid Cu 4 AWG"):
        evaluate(RunSpec(circuit=CIRCUIT_120, amps=30, length_ft=50, method="dc",
                         stranded=False, size="4 AWG"))


def test_solid_12_awg_uses_the_solid_resistance_of_table_8():
    # NEC 2023 Ch. 9 Table 8: 12 AWG Cu solid 1.93 ohm/kft at 75 C (stranded 1.98).
    # 2 x 16 A x 100 ft x 1.93 / 1000 = 6.176 V.
    r = evaluate(RunSpec(circuit=CIRCUIT_120, amps=16, length_ft=100, method="dc",
                         stranded=False, size="12 AWG"))
    assert r.voltage_drop_v == pytest.approx(6.176, abs=0.001)
