"""Conductor colour schemes: which insulation colour each conductor of a system gets.

What the code requires (NFPA 70, 2023):

- Grounded conductor (neutral): continuous white or gray outer finish, or three continuous white
  or gray stripes on other than green insulation (NEC 200.6(A) for 6 AWG and smaller). 4 AWG and
  larger may instead be identified at its terminations (NEC 200.6(B)). Where grounded conductors
  of different systems share an enclosure, each system's is told apart, for example white for one
  and gray for the other (NEC 200.6(D)).
- Equipment grounding conductor: bare, or a continuous green outer finish, or green with one or
  more yellow stripes (NEC 250.119); 4 AWG and larger may be identified at terminations
  (NEC 250.119(A)).
- Ungrounded conductors: the code fixes no colour, only that they are identified by system where
  more than one system is present (NEC 210.5(C), 215.12(C)) and are not white, gray or green
  (NEC 200.7, 250.119). The high leg of a 4-wire delta is marked orange (NEC 110.15) and is the
  B phase in panelboards (NEC 408.3(E)(1)).

The phase colours below (black/red/blue for 208Y/120 V, brown/orange/yellow for 480Y/277 V,
black/red for 120/240 V) are common practice, not code; a job may set its own.
"""

from __future__ import annotations

from dataclasses import dataclass

NEUTRAL_RULE = "NEC 200.6(A), (B)"
NEUTRAL_TWO_SYSTEMS_RULE = "NEC 200.6(D)"
EGC_RULE = "NEC 250.119"
HIGH_LEG_RULE = "NEC 110.15"
PHASE_RULE = "common practice; NEC 210.5(C) and 215.12(C) require only that the scheme be posted"

#: Finishes an insulated or bare EGC may have (NEC 250.119).
EGC_FINISHES: tuple[str, ...] = ("green", "green with yellow stripes", "bare")
#: Finishes a grounded conductor may have (NEC 200.6(A)).
NEUTRAL_FINISHES: tuple[str, ...] = ("white", "gray")


@dataclass(frozen=True)
class ColourScheme:
    """Colours for one supply system: phases A, B, C in order, the neutral and the EGC."""

    key: str                    # e.g. "208Y/120"
    label: str                  # what a person reads, e.g. "208Y/120 V 3-phase 4-wire"
    phases: tuple[str, ...]     # colour of phase A, B, C (as many as the system has)
    neutral: str | None         # None when the system has no neutral
    egc: str = "green"
    phase_source: str = PHASE_RULE

    def phase_colour(self, index: int) -> str:
        """Colour of the ``index``-th ungrounded conductor (0 = A) [-]."""
        if not 0 <= index < len(self.phases):
            raise ValueError(
                f"the {self.label} scheme has {len(self.phases)} phase colours; "
                f"no phase number {index + 1}"
            )
        return self.phases[index]

    def sources(self) -> tuple[str, ...]:
        """The rules behind this scheme's colours, for a report's assumptions."""
        cited = [f"phases {'/'.join(self.phases)}: {self.phase_source}"]
        if self.neutral is not None:
            cited.append(f"neutral {self.neutral}: {NEUTRAL_RULE}")
        cited.append(f"EGC {self.egc}: {EGC_RULE}")
        return tuple(cited)


SCHEMES: dict[str, ColourScheme] = {
    scheme.key: scheme
    for scheme in (
        # common practice; white neutral per NEC 200.6(A)
        ColourScheme("208Y/120", "208Y/120 V 3-phase 4-wire", ("black", "red", "blue"), "white"),
        # common practice; gray neutral keeps it apart from a 120 V white one (NEC 200.6(D))
        ColourScheme("480Y/277", "480Y/277 V 3-phase 4-wire", ("brown", "orange", "yellow"),
                     "gray"),
        # common practice
        ColourScheme("120/240", "120/240 V 1-phase 3-wire", ("black", "red"), "white"),
        # B phase is the high leg: orange per NEC 110.15, B position per NEC 408.3(E)(1)
        ColourScheme(
            "240/120 delta",
            "240/120 V 3-phase 4-wire delta (high leg)",
            ("black", "orange", "blue"),
            "white",
            phase_source=f"common practice; high leg orange per {HIGH_LEG_RULE}",
        ),
        # common practice for 3-wire 240 V and 480 V deltas without a neutral
        ColourScheme("240 delta", "240 V 3-phase 3-wire delta", ("black", "red", "blue"), None),
        ColourScheme("480 delta", "480 V 3-phase 3-wire delta", ("brown", "orange", "yellow"),
                     None),
    )
}


def scheme(key: str) -> ColourScheme:
    """The default scheme named ``key``; the error lists the names there are."""
    try:
        return SCHEMES[key]
    except KeyError:
        raise KeyError(
            f"no colour scheme {key!r}; schemes are {', '.join(SCHEMES)}"
        ) from None


def scheme_for_system(line_volts: float, phases: int, neutral: bool) -> ColourScheme:
    """The default scheme for a supply system by its line-to-line voltage [V], phase count and
    whether it has a neutral. A 240 V 3-phase system with a neutral is the high-leg delta."""
    volts = round(line_volts)
    if phases == 1:
        if volts in (240, 120):
            return SCHEMES["120/240"]
        if volts == 277:  # one leg of a 480Y/277 system
            return SCHEMES["480Y/277"]
        if volts == 208:  # two legs of a 208Y/120 system
            return SCHEMES["208Y/120"]
    elif phases == 3:
        if volts == 208:
            return SCHEMES["208Y/120"]
        if volts == 480:
            return SCHEMES["480Y/277" if neutral else "480 delta"]
        if volts == 240:
            return SCHEMES["240/120 delta" if neutral else "240 delta"]
    raise KeyError(
        f"no default colour scheme for a {volts} V {phases}-phase system; "
        f"schemes are {', '.join(SCHEMES)}"
    )


def check_scheme(scheme_: ColourScheme) -> list[str]:
    """Problems with a (job-edited) scheme against NEC 200.6, 200.7 and 250.119, as sentences."""
    problems: list[str] = []
    if scheme_.neutral is not None and scheme_.neutral not in NEUTRAL_FINISHES:
        problems.append(
            f"{scheme_.label}: the neutral must be white or gray (NEC 200.6(A)), "
            f"not {scheme_.neutral}"
        )
    if scheme_.egc not in EGC_FINISHES:
        problems.append(
            f"{scheme_.label}: the EGC must be green, green with yellow stripes or bare "
            f"(NEC 250.119), not {scheme_.egc}"
        )
    for colour in scheme_.phases:
        if colour in NEUTRAL_FINISHES or colour.startswith("green") or colour == "bare":
            problems.append(
                f"{scheme_.label}: a phase conductor may not be {colour} (NEC 200.7, 250.119)"
            )
    return problems
