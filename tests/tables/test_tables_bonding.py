"""NEC 2023 Table 250.102(C)(1): the grounded conductor, main, system and supply-side bonding
jumper by the largest ungrounded conductor (values from memory, checked against the rows the
table has printed since the 2014 edition; common practice reads it like Table 250.66)."""

import pytest

from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.protection.bonding import bonding_jumper_size


@pytest.mark.parametrize(("ungrounded", "material", "jumper_material", "jumper"), [
    ("2 AWG", "cu", "cu", "8 AWG"),        # 2 AWG or smaller: 8 Cu / 6 Al (from memory)
    ("12 AWG", "cu", "cu", "8 AWG"),
    ("1 AWG", "cu", "cu", "6 AWG"),        # 1 or 1/0 Cu: 6 Cu / 4 Al
    ("1/0 AWG", "cu", "al", "4 AWG"),
    ("3/0 AWG", "cu", "cu", "4 AWG"),      # 2/0 or 3/0 Cu: 4 Cu / 2 Al
    ("4/0 AWG", "cu", "cu", "2 AWG"),      # over 3/0 through 350 kcmil Cu: 2 Cu / 1/0 Al
    ("350 kcmil", "cu", "al", "1/0 AWG"),
    ("500 kcmil", "cu", "cu", "1/0 AWG"),  # over 350 through 600 kcmil Cu: 1/0 Cu / 3/0 Al
    ("600 kcmil", "cu", "cu", "1/0 AWG"),
    ("750 kcmil", "cu", "cu", "2/0 AWG"),  # over 600 through 1100 kcmil Cu: 2/0 Cu / 4/0 Al
    ("1/0 AWG", "al", "al", "6 AWG"),      # aluminum rows: 1/0 or smaller: 8 Cu / 6 Al
    ("250 kcmil", "al", "al", "2 AWG"),    # 4/0 or 250 Al: 4 Cu / 2 Al
    ("500 kcmil", "al", "cu", "2 AWG"),    # over 250 through 500 Al: 2 Cu / 1/0 Al
    ("900 kcmil", "al", "al", "3/0 AWG"),  # over 500 through 900 Al: 1/0 Cu / 3/0 Al
])
def test_table_250_102_c_1_rows(ungrounded, material, jumper_material, jumper):
    assert bonding_jumper_size(ungrounded, material, jumper_material) == jumper


def test_above_1100_kcmil_copper_the_jumper_is_12_5_percent_of_the_area():
    # 1250 kcmil x 12.5 % = 156.25 kcmil: 3/0 AWG (167.8 kcmil, NEC Ch. 9 Table 8) is the
    # smallest copper size with that area (2/0 AWG is 133.1 kcmil)
    assert bonding_jumper_size("1250 kcmil", "cu", "cu") == "3/0 AWG"


def test_an_unknown_size_or_material_is_refused_with_the_choices():
    with pytest.raises(TableLookupError, match="materials are cu, al"):
        bonding_jumper_size("1/0 AWG", "fe", "cu")
    with pytest.raises(TableLookupError):
        bonding_jumper_size("7 AWG", "cu", "cu")
