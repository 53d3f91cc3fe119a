"""How raceways go in, for a rough takeoff: lengths sold, support spacing and bend limits.

Support rules are the "Securing and Supporting" sections (xxx.30) of each raceway's article in
NFPA 70 (2023); bend limits are the "Bends - Number in One Run" sections (xxx.26): no more than
the equivalent of four quarter bends (360 degrees) between pull points. Lengths in [ft], trade
sizes as written in NEC Chapter 9 Table 4 ("1/2", "1-1/4").
"""

import math
from typing import NamedTuple

from gaugewalk.tables.errors import TableLookupError
from gaugewalk.tables.raceway.fill import parse_raceway

#: Connectors counted at each end of each raceway: the requirement of the takeoff brief
#: (common practice for a rough count: the termination plus one more, e.g. at a pull box,
#: conduit body or transition along the way). A job-level number, not code.
CONNECTORS_PER_END = 2
#: Most degrees of bends between pull points: the equivalent of four quarter bends. The same rule
#: in each raceway article's "Bends - Number in One Run" section: NEC 342.26 (IMC), 344.26 (RMC),
#: 348.26 (FMC), 350.26 (LFMC), 352.26 (PVC), 353.26 (HDPE), 356.26 (LFNC), 358.26 (EMT),
#: 362.26 (ENT); each family's section is ``InstallRule.bends_section``.
MAX_BEND_DEGREES = 360
#: Degrees per recorded bend: each bend counted as one 90-degree elbow (common practice).
DEGREES_PER_BEND = 90
#: A pull point on a long run at least this often [ft] (common practice: about every 100 ft of
#: straight run keeps the pulling tension and the pull itself manageable); the job may set its own.
PULL_EVERY_FT = 100.0
#: Largest trade size whose pull points are conduit bodies; larger raceways get pull boxes
#: (common practice: conduit bodies are stocked and used up to about trade size 2).
CONDUIT_BODY_LARGEST_TRADE_SIZE = 2.0
#: Sizing of pull boxes for conductors 4 AWG and larger.
PULL_BOX_SIZING_RULE = ("NEC 314.28(A): for conductors 4 AWG and larger, a straight-pull box at "
                        "least 8 x the trade size long, an angle pull 6 x")


class Spacing(NamedTuple):
    """Support spacing for trade sizes up to ``up_to`` (inclusive) [ft]."""

    up_to: float        # largest trade size this row covers, as a number (1-1/4 -> 1.25)
    max_ft: float       # [ft] largest distance between supports


class InstallRule(NamedTuple):
    """Installation data for one raceway family."""

    family: str                     # "EMT", "RMC", ...
    article: str                    # "NEC Article 358"
    stick_ft: float | None          # [ft] length sold; None when sold in coils
    stick_source: str
    coupling_attached: bool         # sticks ship with one coupling on (no loose couplings)
    end_ft: float                   # [ft] a support within this distance of each termination
    spacing: tuple[Spacing, ...]    # by trade size, ascending
    support_source: str             # the section(s) the end distance and spacing come from
    bends_section: str              # the xxx.26 section limiting bends between pull points
    conduit_bodies: bool = True     # pull points may be conduit bodies (False: boxes, handholes)

    def pull_point(self, trade_size: str) -> str:
        """What a pull point is at ``trade_size``: a conduit body up to
        ``CONDUIT_BODY_LARGEST_TRADE_SIZE``, a pull box above it (common practice); on raceway
        laid underground, a pull box or handhole."""
        if not self.conduit_bodies:
            return "pull box or handhole"
        if trade_size_value(trade_size) <= CONDUIT_BODY_LARGEST_TRADE_SIZE + 1e-9:
            return "conduit body"
        return "pull box"

    def max_spacing_ft(self, trade_size: str) -> float | None:
        """Largest distance between supports for ``trade_size`` [ft]; None: no supports counted."""
        value = trade_size_value(trade_size)
        if not self.spacing:
            return None
        for row in self.spacing:
            if value <= row.up_to + 1e-9:
                return row.max_ft
        raise KeyError(f"{self.family}: no support spacing for trade size {trade_size!r}")


def trade_size_value(trade_size: str) -> float:
    """Trade size designator as a number: "1-1/4" -> 1.25, "3/4" -> 0.75, "2" -> 2.0."""
    text = trade_size.strip().removesuffix('"').removesuffix(" in")
    try:
        whole, _, fraction = text.partition("-") if "-" in text else ("", "", text)
        if "/" in fraction:
            num, den = fraction.split("/")
            frac = int(num) / int(den)
        else:
            frac = float(fraction)
        return (int(whole) if whole else 0) + frac
    except (ValueError, ZeroDivisionError):
        raise ValueError(
            f"not a trade size: {trade_size!r} (expected e.g. 3/4, 1, 1-1/4)") from None


_EVERY_10 = (Spacing(float("inf"), 10.0),)
# NEC 2023 Table 344.30(B)(2) (from memory): straight RMC runs made up with threaded couplings.
_TABLE_344_30_B_2 = (
    Spacing(0.75, 10.0), Spacing(1.0, 12.0), Spacing(1.5, 14.0),
    Spacing(2.5, 16.0), Spacing(float("inf"), 20.0),
)
# NEC 2023 Table 352.30 (from memory): rigid PVC conduit.
_TABLE_352_30 = (
    Spacing(1.0, 3.0), Spacing(2.0, 5.0), Spacing(3.0, 6.0),
    Spacing(5.0, 7.0), Spacing(float("inf"), 8.0),
)

RULES: dict[str, InstallRule] = {
    rule.family: rule
    for rule in (
        InstallRule(
            "EMT", "NEC Article 358", 10.0, "10 ft lengths (common practice)", False,
            3.0, _EVERY_10,
            "NEC 358.30(A): within 3 ft of each box or termination, at most every 10 ft",
            "NEC 358.26",
        ),
        InstallRule(
            "IMC", "NEC Article 342", 10.0,
            "10 ft lengths with a coupling attached (NEC 342.130)", True,
            3.0, _TABLE_344_30_B_2,
            "NEC 342.30(A) within 3 ft of each box or termination; 342.30(B)(2) and "
            "Table 344.30(B)(2) spacing for straight runs with threaded couplings",
            "NEC 342.26",
        ),
        InstallRule(
            "RMC", "NEC Article 344", 10.0,
            "10 ft lengths with a coupling attached (NEC 344.130)", True,
            3.0, _TABLE_344_30_B_2,
            "NEC 344.30(A) within 3 ft of each box or termination; 344.30(B)(2) and "
            "Table 344.30(B)(2) spacing for straight runs with threaded couplings",
            "NEC 344.26",
        ),
        InstallRule(
            "PVC", "NEC Article 352", 10.0, "10 ft lengths (common practice)", False,
            3.0, _TABLE_352_30,
            "NEC 352.30(A) within 3 ft of each box or termination; spacing by Table 352.30",
            "NEC 352.26",
        ),
        InstallRule(
            "ENT", "NEC Article 362", 10.0,
            "10 ft lengths (common practice; ENT is also sold in coils)", False,
            3.0, (Spacing(float("inf"), 3.0),),
            "NEC 362.30(A): within 3 ft of each box or termination, at most every 3 ft",
            "NEC 362.26",
        ),
        InstallRule(
            "HDPE", "NEC Article 353", None, "sold in coils and reels (common practice)", False,
            0.0, (),
            "none counted: HDPE is installed underground or encased (NEC 353.10)",
            "NEC 353.26", conduit_bodies=False,
        ),
        InstallRule(
            "FMC", "NEC Article 348", None, "sold in coils (common practice)", False,
            1.0, (Spacing(float("inf"), 4.5),),
            "NEC 348.30(A): within 12 in of each box or termination, at most every 4-1/2 ft",
            "NEC 348.26",
        ),
        InstallRule(
            "LFMC", "NEC Article 350", None, "sold in coils (common practice)", False,
            1.0, (Spacing(float("inf"), 4.5),),
            "NEC 350.30(A): within 12 in of each box or termination, at most every 4-1/2 ft",
            "NEC 350.26",
        ),
        InstallRule(
            "LFNC", "NEC Article 356", None, "sold in coils (common practice)", False,
            1.0, (Spacing(float("inf"), 3.0),),
            "NEC 356.30(1): within 12 in of each box or termination, at most every 3 ft",
            "NEC 356.26",
        ),
    )
}

# Longest names first so "LFMC" is not read as "FMC".
_FAMILY_ORDER = sorted(RULES, key=len, reverse=True)
#: Raceway types of gaugewalk.tables.raceway.fill that share another type's article.
_SAME_ARTICLE = {"ARMC": "RMC"}  # aluminum RMC is also Article 344


def install_rule(raceway: str) -> InstallRule:
    """The rule for a raceway type such as "EMT", "PVC-40", "PVC Sch 80", "ARMC" or "rigid"."""
    try:
        name = parse_raceway(raceway)
    except TableLookupError:
        name = raceway.strip().upper().replace(" ", "")
    name = _SAME_ARTICLE.get(name, name)
    for family in _FAMILY_ORDER:
        if name.startswith(family):
            return RULES[family]
    raise KeyError(
        f"no installation data for raceway {raceway!r}; types are {', '.join(RULES)}"
    )


def supports_for(length_ft: float, end_ft: float, spacing_ft: float | None) -> int:
    """Supports for one straight raceway of ``length_ft`` [ft]: one within ``end_ft`` of each end,
    and none further than ``spacing_ft`` apart between them (the xxx.30 rules). A raceway no
    longer than twice ``end_ft`` needs one support; none for zero length or no spacing rule."""
    if length_ft <= 0 or spacing_ft is None:
        return 0
    if length_ft <= 2 * end_ft:
        return 1
    span = length_ft - 2 * end_ft
    return math.ceil(round(span / spacing_ft, 9)) + 1


def sticks_for(length_ft: float, stick_ft: float) -> int:
    """Whole sticks to cover ``length_ft`` [ft] of one raceway."""
    if length_ft <= 0:
        return 0
    return math.ceil(round(length_ft / stick_ft, 9))


def joints_for(length_ft: float, stick_ft: float) -> int:
    """Couplings joining the sticks of one raceway: one fewer than its sticks."""
    return max(0, sticks_for(length_ft, stick_ft) - 1)
