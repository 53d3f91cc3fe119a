"""Voltage-drop formulas: DC resistance, K-factor and AC effective impedance.

Every method reduces to an impedance per length of one conductor, ``z`` [ohm/kft], and the one
formula

    VD = k * I * z * L / 1000 / sets

with ``k`` the circuit's drop factor (2 single-phase, sqrt(3) three-phase, 1 for a leg of a
balanced multiwire circuit), ``I`` the load current [A], ``L`` the one-way length [ft] and
``sets`` the conductors in parallel per phase. A load spread evenly along the run drops as the
whole load at half the length.

Table 9 skips 700, 800 and 900 kcmil. For those ``table9_rx`` interpolates between the
neighbouring rows (600 and 750 kcmil, 750 and 1000 kcmil), linearly in circular mils: the
resistance as the size's own Table 8 DC resistance times the AC/DC ratio of the neighbours (the
ratio carries the skin and proximity effects and the raceway's, which grow smoothly with the
conductor's area), the reactance directly (it changes little and smoothly with size). The
result lies between the neighbours' printed values, as the physics requires.

A leg of a two-circuit multiwire on a wye (``Circuit.drop_angle_deg`` 30): the neutral carries
the other leg's current too, so the drop of a leg is Z (2 Ia + Ib); with Ib = Ia at 120 degrees
that is sqrt(3) Ia Z at 30 degrees from Ia, either way according to the phase order. The drop
is then sqrt(3) I (R cos(theta -+ 30) + X sin(theta -+ 30)), the worse leg of the two
(``shifted_z``); with no reactance (the DC and K-factor methods, the load taken at unity power
factor) it is sqrt(3) cos 30 = 1.5 times I R.

References
----------
NFPA 70 (NEC) 2023, Chapter 9 Table 8 (DC resistance at 75 C, with its note 2 temperature
correction) and Table 9 (AC resistance and reactance at 75 C, 60 Hz, with note 2:
Ze = R cos(theta) + XL sin(theta)).
"""

import math
from typing import NamedTuple

from gaugewalk.model.engine.contract import Circuit
from gaugewalk.model.engine.vocabulary import METHODS
from gaugewalk.tables.conductor import impedance
from gaugewalk.tables.conductor import properties as conductors
from gaugewalk.tables.conductor.sizes import canonical

K_FACTOR: dict[str, float] = {"cu": 12.9, "al": 21.2}
"""Resistivity constants K [ohm-cmil/ft] at 75 C for the K-factor method (common practice:
uncoated copper and aluminum near 75 C operating temperature)."""



class Drop(NamedTuple):
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


def shifted_z(r_ohm_per_kft: float, x_ohm_per_kft: float, pf: float, shift_deg: float) -> float:
    """Effective impedance [ohm/kft] for a drop phasor shifted ``shift_deg`` from the load
    current, the worse of the two directions: max over +-shift of R cos(theta -+ s) +
    XL sin(theta -+ s), theta = arccos(pf). ``shift_deg`` 0 is ``effective_z``."""
    if not (0.0 < pf <= 1.0):
        raise ValueError(f"power factor must be above 0 and at most 1, not {pf}")
    theta = math.acos(pf)
    s = math.radians(shift_deg)
    return max(r_ohm_per_kft * math.cos(theta - a) + x_ohm_per_kft * math.sin(theta - a)
               for a in (s, -s))


INTERPOLATED_SIZES: dict[str, tuple[str, str]] = {
    "700 kcmil": ("600 kcmil", "750 kcmil"),
    "800 kcmil": ("750 kcmil", "1000 kcmil"),
    "900 kcmil": ("750 kcmil", "1000 kcmil"),
}
"""Sizes NEC Ch. 9 Table 9 skips, and the printed rows ``table9_rx`` interpolates between."""


def table9_rx(size: str, material: str, family: str) -> tuple[float, float]:
    """AC resistance at 75 C and reactance [ohm/kft] of one conductor in a raceway ``family``,
    NEC Ch. 9 Table 9; for 700, 800 and 900 kcmil (not in the table) interpolated as the module
    docstring says. Raises ``TableLookupError`` for a size outside the table otherwise."""
    size = canonical(size)
    pair = INTERPOLATED_SIZES.get(size)
    if pair is None:
        return impedance.ac_resistance(size, material, family), impedance.reactance(size, family)
    lo, hi = pair
    frac = ((conductors.circular_mils(size) - conductors.circular_mils(lo))
            / (conductors.circular_mils(hi) - conductors.circular_mils(lo)))

    def ratio(s: str) -> float:
        return impedance.ac_resistance(s, material, family) / conductors.dc_resistance(s, material)

    r = conductors.dc_resistance(size, material) * (ratio(lo) + frac * (ratio(hi) - ratio(lo)))
    x_lo, x_hi = impedance.reactance(lo, family), impedance.reactance(hi, family)
    return r, x_lo + frac * (x_hi - x_lo)


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
        1000 kcmil; 700, 800 and 900 kcmil are interpolated, ``table9_rx``).
    """
    if method == "dc":
        return conductors.dc_resistance(size, material, stranded=stranded, temp_c=temp_c)
    if method == "kfactor":
        return kfactor_z(K_FACTOR[material], conductors.circular_mils(size))
    if method == "ac":
        if family is None:
            raise ValueError("the AC method needs the raceway family (steel, pvc or aluminum)")
        r75, x = table9_rx(size, material, family)
        r = temperature_corrected(r75, conductors.ALPHA[material], temp_c)
        return effective_z(r, x, pf)
    raise ValueError(f"unknown drop method '{method}'; use {', '.join(METHODS)}")

