"""Loads written in amps, volt-amperes or watts, turned into line current [A]; and motors written
in horsepower (``10hp``, ``1-1/2 hp``), whose current is read from NEC Tables 430.248 and 430.250
by ``gaugewalk.model.engine.sizing.kinds.running_amps``, not converted here.

Single-phase: I = S / V; three-phase: I = S / (sqrt(3) V_LL), with S the apparent power [VA] and
V the circuit's ``line_volts``. Real power converts to apparent power by the power factor:
S = P / pf (Ohm's law and the power triangle).
"""

from __future__ import annotations

import math
import re

from gaugewalk.model.engine.contract import Circuit
from gaugewalk.model.engine.vocabulary import LOAD_UNITS, or_words
from gaugewalk.tables.equipment.horsepower import parse_hp
from gaugewalk.tables.errors import TableLookupError

UNITS = LOAD_UNITS
"""Load units and their multiplier to the base unit (A, VA or W)."""

_UNIT_ALIASES = {
    "a": "A", "amp": "A", "amps": "A", "ampere": "A", "amperes": "A",
    "va": "VA", "kva": "kVA",
    "w": "W", "watt": "W", "watts": "W", "kw": "kW", "kilowatt": "kW", "kilowatts": "kW",
    "hp": "hp", "horsepower": "hp",
}
_HP_RE = re.compile(r"^(.*?)\s*(?:hp|h\.p\.|horsepower)\s*$", re.IGNORECASE)
_LOAD_RE = re.compile(r"^\s*(\d+(?:\.\d*)?|\.\d+)\s*([A-Za-z]+)\s*$")
MAX_LOAD_CHARS = 40


class LoadError(ValueError):
    """A load that cannot be read or turned into amps."""


def normalize_unit(unit: str) -> str:
    """``"kva"`` -> ``"kVA"``, ``"amps"`` -> ``"A"``; raises ``LoadError`` for anything else."""
    key = str(unit).strip().lower()
    if key not in _UNIT_ALIASES:
        raise LoadError(f"unknown load unit '{unit}'; use {or_words(UNITS)}")
    return _UNIT_ALIASES[key]


def parse_load(text: str) -> tuple[float, str]:
    """Read ``"16A"``, ``"1.8 kVA"``, ``"5kW"``, ``"1500 w"``, ``"10hp"``, ``"1-1/2 hp"`` into
    ``(value, unit)`` with the unit one of ``UNITS``. A bare number is not accepted: the unit must
    be written. Horsepower takes the trade's fractions (``1/2``, ``1-1/2``, ``7½``;
    ``gaugewalk.tables.equipment.horsepower.parse_hp``).

    Raises
    ------
    LoadError
        Not a positive number followed by a known unit.
    """
    raw = str(text)
    if len(raw) > MAX_LOAD_CHARS:
        raise LoadError(f"a load is at most {MAX_LOAD_CHARS} characters")
    hp = _HP_RE.match(raw)
    if hp is not None and hp.group(1).strip():
        try:
            return float(parse_hp(hp.group(1))), "hp"
        except TableLookupError as exc:
            raise LoadError(f"'{raw.strip()}': {exc}") from None
    m = _LOAD_RE.match(raw)
    if not m:
        if re.fullmatch(r"\s*[\d.]+\s*", raw):
            raise LoadError(f"'{raw.strip()}' has no unit; write it as e.g. 16A, 1.8kVA or 5kW")
        raise LoadError(f"'{raw.strip()}' is not a load; write it as e.g. 16A, 1.8kVA or 5kW")
    value = float(m.group(1))
    unit = normalize_unit(m.group(2))
    if value <= 0:
        raise LoadError(f"'{raw.strip()}': a load must be above zero")
    return value, unit


REAL_POWER_UNITS = ("W", "kW")
"""Units of real power: a load in them becomes apparent power through its power factor."""


def pf_taken(value: float, unit: str, pf: float, whose: str) -> tuple[str, ...]:
    """The stated assumption of a load in watts whose power factor the run does not give
    (S = P / pf), ``whose`` naming where the factor came from; none where nothing was assumed
    (another unit, or power factor 1, which changes nothing)."""
    unit = normalize_unit(unit)
    if unit not in REAL_POWER_UNITS or pf >= 1.0:
        return ()
    kva = value * UNITS[unit] / pf / 1000.0
    return (f"{value:g} {unit} taken at power factor {pf:g}, {whose}, as the load gives none: "
            f"{kva:.2f} kVA; give its own power factor where it is known (pf 1 for a resistance "
            f"load)",)


def load_amps(value: float, unit: str, circuit: Circuit, pf: float = 1.0) -> float:
    """Line current of a load [A].

    Parameters
    ----------
    value : float
        The load in ``unit``; finite and above zero.
    unit : str
        ``A``, ``VA``, ``kVA``, ``W`` or ``kW`` (any case).
    circuit : Circuit
        Gives ``phases`` and ``line_volts`` [V].
    pf : float
        Power factor (0, 1], used only to turn W/kW into VA.

    Returns
    -------
    float
        Current in each ungrounded conductor [A]: S/V single-phase, S/(sqrt(3) V_LL) three-phase.
    """
    unit = normalize_unit(unit)
    if unit == "hp":
        raise LoadError("a load in hp is a motor: its current is read from NEC Tables 430.248 "
                        "and 430.250, not converted")
    if not (isinstance(value, (int, float)) and math.isfinite(value) and value > 0):
        raise LoadError(f"a load must be a number above zero, not {value!r}")
    if unit == "A":
        return float(value)
    if not (isinstance(pf, (int, float)) and math.isfinite(pf) and 0 < pf <= 1):
        raise LoadError(f"the power factor must be above 0 and at most 1, not {pf!r}")
    va = value * UNITS[unit]
    if unit in REAL_POWER_UNITS:
        va /= pf
    if circuit.phases == 3:
        return va / (math.sqrt(3.0) * circuit.line_volts)
    return va / circuit.line_volts
