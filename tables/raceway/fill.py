"""NEC 2023 Chapter 9 Tables 1, 4 and 5: conduit fill limits, raceway internal areas and the
areas of insulated conductors.

Table 4 is typed as the internal diameter [in] and the total (100 %) area [in^2] of each trade
size; the percent columns follow from Table 1. Table 5 gives approximate areas of insulated
conductors [in^2] for the common building-wire types. These tables have been stable since at
least the 2011 edition. Tables 4 and 5 are typed from memory; the tests check every area against
pi/4 * d^2 of its own diameter and every Table 5 conductor against the bare one of Table 8.
"""

import re
from typing import NamedTuple

from gaugewalk.tables.conductor.sizes import canonical
from gaugewalk.tables.errors import TableLookupError, choices

# ---------------------------------------------------------------- Table 1

FILL_LIMITS_PCT = {1: 53.0, 2: 31.0}
FILL_LIMIT_OVER_2_PCT = 40.0


def fill_limit_pct(n_conductors: int) -> float:
    """Maximum percent of a raceway's area conductors may fill, NEC Ch. 9 Table 1:
    one conductor 53 %, two 31 %, over two 40 % [%]. Cables count as conductors (note 9)."""
    if isinstance(n_conductors, bool) or not isinstance(n_conductors, int) or n_conductors < 1:
        raise TableLookupError(f"the number of conductors must be a whole number of 1 or more, "
                               f"not {n_conductors!r}")
    return FILL_LIMITS_PCT.get(n_conductors, FILL_LIMIT_OVER_2_PCT)


# ---------------------------------------------------------------- Table 4

TRADE_SIZES: tuple[str, ...] = ("1/2", "3/4", "1", "1-1/4", "1-1/2", "2", "2-1/2", "3", "3-1/2",
                                "4", "5", "6")


def _t4(*pairs: tuple[float, float]) -> dict[str, tuple[float, float]]:
    """Pairs from the smallest trade size up; a raceway made in fewer sizes lists fewer."""
    if len(pairs) > len(TRADE_SIZES):
        raise ValueError(f"Table 4 rows: {len(pairs)} values for {len(TRADE_SIZES)} trade sizes")
    return dict(zip(TRADE_SIZES[: len(pairs)], pairs, strict=True))


# NEC 2023 Ch. 9 Table 4: trade size -> (internal diameter [in], total area 100 % [in^2]).
EMT_358 = _t4((0.622, 0.304), (0.824, 0.533), (1.049, 0.864), (1.380, 1.496), (1.610, 2.036),
              (2.067, 3.356), (2.731, 5.858), (3.356, 8.846), (3.834, 11.545), (4.334, 14.753))
IMC_342 = _t4((0.660, 0.342), (0.864, 0.586), (1.105, 0.959), (1.448, 1.647), (1.683, 2.225),
              (2.150, 3.630), (2.557, 5.135), (3.176, 7.922), (3.671, 10.584), (4.166, 13.631))
RMC_344 = _t4((0.632, 0.314), (0.836, 0.549), (1.063, 0.887), (1.394, 1.526), (1.624, 2.071),
              (2.083, 3.408), (2.489, 4.866), (3.090, 7.499), (3.570, 10.010), (4.050, 12.882),
              (5.073, 20.212), (6.093, 29.158))
PVC80_352 = _t4((0.526, 0.217), (0.722, 0.409), (0.936, 0.688), (1.255, 1.237), (1.476, 1.711),
                (1.913, 2.874), (2.290, 4.119), (2.864, 6.442), (3.326, 8.688), (3.786, 11.258),
                (4.768, 17.855), (5.709, 25.598))
PVC40_352_HDPE_353 = _t4((0.602, 0.285), (0.804, 0.508), (1.029, 0.832), (1.360, 1.453),
                         (1.590, 1.986), (2.047, 3.291), (2.445, 4.695), (3.042, 7.268),
                         (3.521, 9.737), (3.998, 12.554), (5.016, 19.761), (6.031, 28.567))
ENT_362 = _t4((0.560, 0.246), (0.760, 0.454), (1.000, 0.785), (1.340, 1.410), (1.570, 1.936),
              (2.020, 3.205))
# FMC and LFMC also list trade size 3/8, which 348.20(A) and 350.20(A) limit to special uses;
# it is left out here so it is never picked for a run. FMC 3/8: (0.384, 0.116); LFMC 3/8:
# (0.494, 0.192).
FMC_348 = _t4((0.635, 0.317), (0.824, 0.533), (1.020, 0.817), (1.275, 1.277), (1.538, 1.858),
              (2.040, 3.269), (2.500, 4.909), (3.000, 7.069), (3.500, 9.621), (4.000, 12.566))
LFMC_350 = _t4((0.632, 0.314), (0.830, 0.541), (1.054, 0.873), (1.395, 1.528), (1.588, 1.981),
               (2.033, 3.246), (2.493, 4.881), (3.085, 7.475), (3.520, 9.731), (4.020, 12.692))


class RacewayType(NamedTuple):
    """A raceway type: its NEC article, its Table 9 family and its Table 4 rows."""

    name: str                 # canonical name, e.g. "PVC-40"
    label: str                # words for a report
    article: str              # NEC article, e.g. "358"
    family: str               # Table 9 family: "pvc", "aluminum" or "steel"
    # trade size -> (internal diameter [in], area [in^2])
    table4: dict[str, tuple[float, float]]


RACEWAY_TYPES: dict[str, RacewayType] = {r.name: r for r in (
    RacewayType("EMT", "electrical metallic tubing (steel)", "358", "steel", EMT_358),
    RacewayType("IMC", "intermediate metal conduit", "342", "steel", IMC_342),
    RacewayType("RMC", "rigid metal conduit (galvanized steel)", "344", "steel", RMC_344),
    RacewayType("ARMC", "rigid metal conduit (aluminum)", "344", "aluminum", RMC_344),
    RacewayType("PVC-40", "rigid PVC conduit, Schedule 40", "352", "pvc", PVC40_352_HDPE_353),
    RacewayType("PVC-80", "rigid PVC conduit, Schedule 80", "352", "pvc", PVC80_352),
    RacewayType("HDPE", "HDPE conduit", "353", "pvc", PVC40_352_HDPE_353),
    RacewayType("ENT", "electrical nonmetallic tubing", "362", "pvc", ENT_362),
    RacewayType("FMC", "flexible metal conduit (steel)", "348", "steel", FMC_348),
    RacewayType("LFMC", "liquidtight flexible metal conduit", "350", "steel", LFMC_350),
)}
"""Raceway types by canonical name. ``family`` picks the Table 9 columns: steel for the steel
raceways, aluminum for aluminum rigid conduit, pvc (nonmagnetic, no conduit losses) for the
nonmetallic ones."""

_ALIASES: dict[str, str] = {
    "emt": "EMT", "electricalmetallictubing": "EMT", "thinwall": "EMT",
    "imc": "IMC", "intermediatemetalconduit": "IMC",
    "rmc": "RMC", "rigid": "RMC", "grc": "RMC", "galvanizedrigid": "RMC", "rigidsteel": "RMC",
    "rigidmetalconduit": "RMC", "galvrigid": "RMC", "rsc": "RMC", "steelrmc": "RMC",
    "armc": "ARMC", "aluminumrmc": "ARMC", "alrmc": "ARMC", "aluminumrigid": "ARMC",
    "rigidaluminum": "ARMC", "alrigid": "ARMC", "rigidal": "ARMC", "aluminumconduit": "ARMC",
    "pvc": "PVC-40", "pvc40": "PVC-40", "pvcsch40": "PVC-40", "sch40pvc": "PVC-40",
    "sch40": "PVC-40", "rnc": "PVC-40", "rigidpvc": "PVC-40", "pvcconduit": "PVC-40",
    "pvc80": "PVC-80", "pvcsch80": "PVC-80", "sch80pvc": "PVC-80", "sch80": "PVC-80",
    "hdpe": "HDPE",
    "ent": "ENT", "electricalnonmetallictubing": "ENT",
    "fmc": "FMC", "flex": "FMC", "flexiblemetalconduit": "FMC", "greenfield": "FMC",
    "lfmc": "LFMC", "liquidtight": "LFMC", "liquidtightflexiblemetalconduit": "LFMC",
}


def _key(text: str) -> str:
    key = str(text).strip().lower()
    key = key.replace("aluminium", "aluminum").replace("schedule", "sch")
    key = key.replace("sched", "sch").replace("sch.", "sch")
    return re.sub(r"[\s\-_.]+", "", key)


def parse_raceway(text: str) -> str:
    """Canonical raceway type from a typed spelling: ``"emt"``, ``"pvc40"``, ``"pvc 40"``,
    ``"sch 80 pvc"``, ``"rigid"``, ``"GRC"``, ``"aluminum RMC"``, ``"ARMC"``... Plain ``"pvc"`` is
    Schedule 40 (common practice). Unknown names raise ``TableLookupError``."""
    key = _key(text)
    for name in RACEWAY_TYPES:
        if key == _key(name):
            return name
    if key in _ALIASES:
        return _ALIASES[key]
    raise TableLookupError(
        f"no raceway type '{str(text).strip()}'; types are {choices(RACEWAY_TYPES)}")


def raceway_family(name_or_family: str) -> str:
    """Table 9 family (``"pvc"``, ``"aluminum"``, ``"steel"``) from a raceway type or a family."""
    key = str(name_or_family).strip().lower()
    if key in ("pvc", "aluminum", "steel"):
        return key
    try:
        return RACEWAY_TYPES[parse_raceway(name_or_family)].family
    except TableLookupError:
        raise TableLookupError(
            f"no raceway type or family '{str(name_or_family).strip()}'; types are "
            f"{choices(RACEWAY_TYPES)}; families are pvc, aluminum, steel") from None


def raceway_type(raceway: str) -> RacewayType:
    """The ``RacewayType`` for a raceway name (any spelling ``parse_raceway`` accepts)."""
    return RACEWAY_TYPES[parse_raceway(raceway)]


def trade_sizes(raceway: str) -> tuple[str, ...]:
    """Trade sizes listed in NEC Ch. 9 Table 4 for a raceway type, smallest first."""
    return tuple(raceway_type(raceway).table4)


def internal_area_in2(raceway: str, trade_size: str) -> float:
    """Total (100 %) internal area [in^2] of a raceway trade size, NEC Ch. 9 Table 4."""
    rt = raceway_type(raceway)
    key = str(trade_size).strip().replace(" ", "-").replace('"', "")
    if key not in rt.table4:
        raise TableLookupError(f"no trade size '{trade_size}' of {rt.name} in NEC Ch. 9 Table 4; "
                               f"sizes are {choices(rt.table4)}")
    return rt.table4[key][1]


def internal_diameter_in(raceway: str, trade_size: str) -> float:
    """Internal diameter [in] of a raceway trade size, NEC Ch. 9 Table 4."""
    rt = raceway_type(raceway)
    internal_area_in2(raceway, trade_size)  # validates, with the message
    return rt.table4[str(trade_size).strip().replace(" ", "-").replace('"', "")][0]


# ---------------------------------------------------------------- Table 5

def _t5(sizes: str, pairs: tuple[tuple[float, float], ...]) -> dict[str, tuple[float, float]]:
    names = [canonical(s) for s in sizes.split()]
    if len(names) != len(pairs):
        raise ValueError(f"Table 5 rows: {len(names)} sizes for {len(pairs)} values")
    return dict(zip(names, pairs, strict=True))


# NEC 2023 Ch. 9 Table 5: size -> (approximate diameter [in], approximate area [in^2]).
THHN_THWN = _t5(
    "14 12 10 8 6 4 3 2 1 1/0 2/0 3/0 4/0 250 300 350 400 500 600 700 750 800 900 1000", (
        (0.111, 0.0097), (0.130, 0.0133), (0.164, 0.0211), (0.216, 0.0366), (0.254, 0.0507),
        (0.324, 0.0824), (0.352, 0.0973), (0.384, 0.1158), (0.446, 0.1562), (0.486, 0.1855),
        (0.532, 0.2223), (0.584, 0.2679), (0.642, 0.3237), (0.711, 0.3970), (0.766, 0.4608),
        (0.817, 0.5242), (0.864, 0.5863), (0.949, 0.7073), (1.051, 0.8676), (1.122, 0.9887),
        (1.156, 1.0496), (1.188, 1.1085), (1.252, 1.2311), (1.310, 1.3478)))
"""Types THHN, THWN, THWN-2 (14 AWG - 1000 kcmil)."""

XHHW = _t5(
    "14 12 10 8 6 4 3 2 1 1/0 2/0 3/0 4/0 250 300 350 400 500 600 700 750 800 900 1000 "
    "1250 1500 1750 2000", (
        (0.133, 0.0139), (0.152, 0.0181), (0.176, 0.0243), (0.236, 0.0437), (0.274, 0.0590),
        (0.322, 0.0814), (0.350, 0.0962), (0.382, 0.1146), (0.442, 0.1534), (0.482, 0.1825),
        (0.528, 0.2190), (0.580, 0.2642), (0.638, 0.3197), (0.705, 0.3904), (0.760, 0.4536),
        (0.811, 0.5166), (0.858, 0.5782), (0.943, 0.6984), (1.053, 0.8709), (1.124, 0.9923),
        (1.158, 1.0532), (1.190, 1.1122), (1.254, 1.2351), (1.312, 1.3519), (1.479, 1.7180),
        (1.602, 2.0156), (1.716, 2.3127), (1.822, 2.6073)))
"""Types XHH, XHHW, XHHW-2 (14 AWG - 2000 kcmil)."""

THW = _t5(
    "14 12 10 8 6 4 3 2 1 1/0 2/0 3/0 4/0 250 300 350 400 500 600 700 750 800 900 1000 "
    "1250 1500 1750 2000", (
        (0.133, 0.0139), (0.152, 0.0181), (0.176, 0.0243), (0.236, 0.0437), (0.304, 0.0726),
        (0.352, 0.0973), (0.380, 0.1134), (0.412, 0.1333), (0.492, 0.1901), (0.532, 0.2223),
        (0.578, 0.2624), (0.630, 0.3117), (0.688, 0.3718), (0.765, 0.4596), (0.820, 0.5281),
        (0.871, 0.5958), (0.918, 0.6619), (1.003, 0.7901), (1.113, 0.9729), (1.184, 1.1010),
        (1.218, 1.1652), (1.250, 1.2272), (1.314, 1.3561), (1.372, 1.4784), (1.539, 1.8602),
        (1.662, 2.1695), (1.776, 2.4773), (1.882, 2.7818)))
"""Types THW, THW-2, THHW (14 AWG - 2000 kcmil); TW for 14 - 8 AWG only (from memory: Table 5
lists TW with these types for 14 - 8 AWG)."""

_TABLE5_GROUPS: dict[str, tuple[str, dict[str, tuple[float, float]]]] = {
    "THHN": ("THHN/THWN/THWN-2", THHN_THWN), "THWN": ("THHN/THWN/THWN-2", THHN_THWN),
    "THWN-2": ("THHN/THWN/THWN-2", THHN_THWN), "THHN/THWN": ("THHN/THWN/THWN-2", THHN_THWN),
    "THHN/THWN-2": ("THHN/THWN/THWN-2", THHN_THWN),
    "XHHW": ("XHH/XHHW/XHHW-2", XHHW), "XHHW-2": ("XHH/XHHW/XHHW-2", XHHW),
    "XHH": ("XHH/XHHW/XHHW-2", XHHW),
    "THW": ("THW/THW-2/THHW", THW), "THW-2": ("THW/THW-2/THHW", THW),
    "THHW": ("THW/THW-2/THHW", THW),
    "TW": ("TW", {k: v for k, v in THW.items() if k in ("14 AWG", "12 AWG", "10 AWG", "8 AWG")}),
}
TABLE5_INSULATIONS: tuple[str, ...] = tuple(_TABLE5_GROUPS)


def insulated_area_in2(size: str, insulation: str) -> float:
    """Approximate area [in^2] of an insulated conductor, NEC Ch. 9 Table 5, for THHN/THWN/THWN-2,
    XHH/XHHW/XHHW-2, THW/THW-2/THHW and TW."""
    from gaugewalk.tables.conductor.ampacity import parse_insulation  # canonical insulation names
    canon = parse_insulation(insulation)
    if canon not in _TABLE5_GROUPS:
        raise TableLookupError(f"gaugewalk has no Table 5 areas for {canon}; insulations are "
                               f"{choices(TABLE5_INSULATIONS)}")
    group, rows = _TABLE5_GROUPS[canon]
    size = canonical(size)
    if size not in rows:
        raise TableLookupError(f"NEC Ch. 9 Table 5 lists no {size} {group}; sizes are "
                               f"{choices(rows)}")
    return rows[size][1]


def insulated_diameter_in(size: str, insulation: str) -> float:
    """Approximate diameter [in] of an insulated conductor, NEC Ch. 9 Table 5."""
    from gaugewalk.tables.conductor.ampacity import parse_insulation
    insulated_area_in2(size, insulation)  # validates, with the message
    return _TABLE5_GROUPS[parse_insulation(insulation)][1][canonical(size)][0]
