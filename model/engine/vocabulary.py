"""The words and limits of one run, in one place: the pydantic fields of the job model, the
engine's spec checks, the command line's choices, the run card's and the trial screen's checks
all read them from here.

Public API (each a ``Literal`` type and its values, in the order they are offered):

- ``Material``, ``MATERIALS``: conductor materials, ``cu`` and ``al`` (NEC Table 310.16 columns).
- ``Method``, ``METHODS``: voltage-drop methods with a line on each (``dc``: Ch. 9 Table 8;
  ``kfactor``; ``ac``: Ch. 9 Table 9 note 2).
- ``TerminalTemp``, ``TERMINAL_TEMPS``: terminal ratings [C] (NEC 110.14(C)(1)).
- ``Connection``, ``CONNECTIONS``: how a load is wired to its source's system, with a line on
  each (``gaugewalk.model.engine.circuits.resolve_circuit``).
- ``LoadUnit``, ``LOAD_UNITS``: load units and their multiplier to A, VA or W.
- ``MIN_SETS``, ``MAX_SETS``, ``SETS_WORDS``: conductors in parallel per phase (NEC 310.10(G));
  more than 20 sets is beyond any feeder a walk records (common practice).
- ``or_words(values)``: ``"cu or al"``, ``"dc, kfactor or ac"``.
"""

from __future__ import annotations

from typing import Literal, get_args

Material = Literal["cu", "al"]
MATERIALS: tuple[Material, ...] = get_args(Material)

Method = Literal["dc", "kfactor", "ac"]
METHODS: dict[Method, str] = {
    "dc": "DC resistance, NEC Ch. 9 Table 8",
    "kfactor": "K-factor, VD = k K I L / cmil (K 12.9 Cu, 21.2 Al)",
    "ac": "AC effective impedance, NEC Ch. 9 Table 9 note 2",
}

TerminalTemp = Literal[60, 75, 90]
TERMINAL_TEMPS: tuple[TerminalTemp, ...] = get_args(TerminalTemp)

Connection = Literal["LN", "LL", "LLN", "MW", "3P", "3PN"]
CONNECTIONS: dict[Connection, str] = {
    "LN": "single-phase line-to-neutral (one hot and the neutral)",
    "LL": "single-phase line-to-line (two hots)",
    "LLN": "line-to-line with a neutral (two hots and the neutral; drop taken as line-to-line)",
    "MW": "balanced multiwire (hots sharing one neutral that carries no current)",
    "3P": "three-phase 3-wire",
    "3PN": "three-phase 4-wire (three hots and the neutral)",
}

LoadUnit = Literal["A", "VA", "kVA", "W", "kW"]
LOAD_UNITS: dict[str, float] = {"A": 1.0, "VA": 1.0, "kVA": 1000.0, "W": 1.0, "kW": 1000.0}
"""Load units and their multiplier to the base unit (A, VA or W)."""

MIN_SETS = 1
MAX_SETS = 20
SETS_WORDS = f"a whole number from {MIN_SETS} to {MAX_SETS}"

for _literal, _values in ((Method, METHODS), (Connection, CONNECTIONS), (LoadUnit, LOAD_UNITS)):
    if get_args(_literal) != tuple(_values):  # keep each Literal and its table in step
        raise TypeError(f"{_literal} and its table differ: {tuple(_values)}")


def or_words(values) -> str:
    """The values as a choice in words: ``cu or al``, ``dc, kfactor or ac``."""
    words = [str(v) for v in values]
    return words[0] if len(words) == 1 else ", ".join(words[:-1]) + " or " + words[-1]
