"""Default put-ups: the lengths building wire is sold in, per conductor size, and the sizes a
supplier cuts to length.

Common practice (supplier catalogues vary; a job lists its own put-ups): 500 ft boxes for the
small branch-circuit sizes, 1,000 ft and 2,500 ft reels for them and for the larger sizes; the
feeder sizes, 8 AWG and larger, are also cut to the foot from the supplier's own reels, so a need
shorter than a reel need not buy the reel. These are defaults, not code. Lengths in [ft].
"""

from __future__ import annotations

from dataclasses import dataclass

SOURCE = "common practice (supplier put-ups vary; the job may list its own)"

#: Branch-circuit sizes commonly sold in 500 ft boxes (common practice).
SMALL_SIZES: tuple[str, ...] = ("14 AWG", "12 AWG", "10 AWG")
#: Sizes commonly sold on 1,000 ft and 2,500 ft reels (common practice).
REEL_SIZES: tuple[str, ...] = (
    "14 AWG", "12 AWG", "10 AWG", "8 AWG", "6 AWG", "4 AWG", "3 AWG", "2 AWG", "1 AWG",
    "1/0 AWG", "2/0 AWG", "3/0 AWG", "4/0 AWG",
    "250 kcmil", "300 kcmil", "350 kcmil", "400 kcmil", "500 kcmil", "600 kcmil",
    "700 kcmil", "750 kcmil", "800 kcmil", "900 kcmil", "1000 kcmil",
)

#: Sizes a supplier cuts to length from its own reels (common practice: counter cuts of feeder
#: sizes are routine; 14-10 AWG are sold by the box or reel). Sizes larger than 1000 kcmil are
#: listed too: no put-up is listed for them, so they are always cut to length.
CUT_SIZES: tuple[str, ...] = REEL_SIZES[REEL_SIZES.index("8 AWG"):] + (
    "1250 kcmil", "1500 kcmil", "1750 kcmil", "2000 kcmil",
)
#: What an order calls a length cut from the supplier's reel.
CUT_LABEL = "cut to length"


@dataclass(frozen=True)
class PutUp:
    """One way a size is sold: a box or reel of ``length_ft`` [ft], for the sizes listed."""

    label: str                  # e.g. "500 ft box"
    length_ft: int              # [ft]
    sizes: tuple[str, ...]      # conductor sizes it is sold in, e.g. ("12 AWG", "10 AWG")

    def __post_init__(self) -> None:
        if self.length_ft <= 0:
            raise ValueError(f"put-up {self.label!r}: length must be more than 0 ft")


DEFAULT_PUTUPS: tuple[PutUp, ...] = (
    PutUp("500 ft box", 500, SMALL_SIZES),
    PutUp("1,000 ft reel", 1000, REEL_SIZES),
    PutUp("2,500 ft reel", 2500, REEL_SIZES),
)


def putups_for(size: str, putups: tuple[PutUp, ...] = DEFAULT_PUTUPS) -> tuple[PutUp, ...]:
    """The put-ups that ``size`` is sold in, shortest first."""
    return tuple(sorted((p for p in putups if size in p.sizes), key=lambda p: p.length_ft))
