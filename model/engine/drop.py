"""Voltage-drop formulas: DC resistance, K-factor and AC effective impedance.

Every method reduces to an impedance per length of one conductor, ``z`` [ohm/kft], and the one
formula

    VD = k * I * z * L / 1000 / sets

with ``k`` the circuit's drop factor (2 single-phase, sqrt(3) three-phase, 1 for a leg of a
balanced multiwire circuit), ``I`` the load current [A], ``L`` the one-way length [ft] and
``sets`` the conductors in parallel per phase. A load spread evenly along the run drops as the
whole load at half the length.

References
----------
NFPA 70 (NEC) 2023, Chapter 9 Table 8 (DC resistance at 75 C, with its note 2 temperature
correction) and Table 9 (AC resistance and reactance at 75 C, 60 Hz, with note 2:
Ze = R cos(theta) + XL sin(theta)).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from gaugewalk.model.engine.contract import Circuit
from gaugewalk.model.engine.vocabulary import METHODS
from gaugewalk.tables.conductor import impedance
from gaugewalk.tables.conductor import properties as conductors

K_FACTOR: dict[str, float] = {"cu": 12.9, "al": 21.2}
"""Resistivity constants K [ohm-cmil/ft] at 75 C for the K-factor method (common practice:
uncoated copper and aluminum near 75 C operating temperature)."""



@dataclass(frozen=True)
class Drop:
    """A computed drop: ``volts`` [V], ``pct`` [%] of the circuit voltage, ``z_ohm_per_kft``
    the impedance per conductor used [ohm/kft], ``length_ft`` the length the formula used [ft]."""

    volts: float
    pct: float
    z_ohm_per_kft: float
    length_ft: float


def effective_z(r_ohm_per_kft: float, x_ohm_per_kft: float, pf: float) -> float:
    """Effective impedance of a conductor at a lagging power factor [ohm/kft].

    Notes
    -----
    Ze = R cos(theta) + XL sin(theta), theta = arccos(pf); NEC Ch. 9 Table 9 note 2. At pf 1 this
    is R; Table 9's "effective Z at 0.85 PF" column is this formula at pf 0.85.
    """
    if not (0.0 < pf <= 1.0):
        raise ValueError(f"power factor must be above 0 and at most 1, not {pf}")
    return r_ohm_per_kft * pf + x_ohm_per_kft * math.sqrt(max(0.0, 1.0 - pf * pf))


def kfactor_z(k_ohm_cmil_per_ft: float, cmil: float) -> float:
    """Resistance per conductor from the K-factor [ohm/kft]: R = K * 1000 / cmil."""
    return k_ohm_cmil_per_ft * 1000.0 / cmil


def temperature_corrected(r75_ohm_per_kft: float, alpha_per_c: float, temp_c: float) -> float:
    """Resistance at ``temp_c`` from the 75 C value [ohm/kft]: R2 = R1 [1 + alpha (T2 - 75)],
    NEC Ch. 9 Table 8 note 2 (alpha 0.00323 Cu, 0.00330 Al)."""
    return r75_ohm_per_kft * (1.0 + alpha_per_c * (temp_c - 75.0))


def drop_volts(drop_factor: float, amps: float, z_ohm_per_kft: float, length_ft: float,
               sets: int = 1) -> float:
    """VD = k I z L / 1000 / sets [V]. Parallel sets share the current, dividing the drop. The
    drop is linear in z: the sizing engine takes it once per run at z = 1 ohm/kft and scales it
    by each size's impedance."""
    return drop_factor * amps * z_ohm_per_kft * length_ft / 1000.0 / sets


def drop_length_ft(length_ft: float, distributed: bool = False) -> float:
    """The length the drop formula uses [ft]: the run's, or half of it for a load spread evenly
    along the run (the whole load at half the length; common practice)."""
    return length_ft / 2.0 if distributed else length_ft


def voltage_drop(circuit: Circuit, amps: float, length_ft: float, z_ohm_per_kft: float, *,
                 sets: int = 1, distributed: bool = False) -> Drop:
    """Drop of a run in volts and percent of ``circuit.volts``.

    Parameters
    ----------
    circuit : Circuit
        Gives the drop factor ``k`` and the voltage the percent is against [V].
    amps : float
        Load current, all sets together [A].
    length_ft : float
        One-way length [ft].
    z_ohm_per_kft : float
        Impedance of one conductor from ``conductor_z`` [ohm/kft].
    sets : int
        Conductors in parallel per phase.
    distributed : bool
        Load spread evenly along the run: the whole load at half the length (common practice).
    """
    length = drop_length_ft(length_ft, distributed)
    volts = drop_volts(circuit.drop_factor, amps, z_ohm_per_kft, length, sets)
    return Drop(volts, 100.0 * volts / circuit.volts, z_ohm_per_kft, length)


def conductor_z(size: str, material: str, method: str, *, pf: float = 0.85,
                family: str | None = None, temp_c: float = 75.0, stranded: bool = True) -> float:
    """Impedance of one conductor for a drop method [ohm/kft].

    Parameters
    ----------
    size, material : str
        Conductor size name and ``"cu"``/``"al"``.
    method : str
        ``"dc"``: Ch. 9 Table 8 DC resistance corrected to ``temp_c``; ``"kfactor"``:
        K * 1000 / cmil with K from ``K_FACTOR`` (fixed at 75 C); ``"ac"``: Table 9 R and XL for
        the raceway ``family``, R corrected to ``temp_c`` with Table 8 note 2's alpha, combined
        at ``pf`` by ``effective_z``.
    temp_c : float
        Conductor temperature [C].

    Raises
    ------
    gaugewalk.tables.errors.TableLookupError
        A size outside the table the method needs (Table 9 covers 14 AWG Cu / 12 AWG Al to
        1000 kcmil and skips 700, 800 and 900 kcmil).
    """
    if method == "dc":
        return conductors.dc_resistance(size, material, stranded=stranded, temp_c=temp_c)
    if method == "kfactor":
        return kfactor_z(K_FACTOR[material], conductors.circular_mils(size))
    if method == "ac":
        if family is None:
            raise ValueError("the AC method needs the raceway family (steel, pvc or aluminum)")
        r = temperature_corrected(impedance.ac_resistance(size, material, family),
                                  conductors.ALPHA[material], temp_c)
        return effective_z(r, impedance.reactance(size, family), pf)
    raise ValueError(f"unknown drop method '{method}'; use {', '.join(METHODS)}")

