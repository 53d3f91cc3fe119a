"""Raceway and fittings: lengths per type and trade size, couplings, connectors, supports, elbows.

Raceway is counted per type and trade size from each run's raceway sizing, one raceway per
parallel set (NEC 310.10(G)(4)), for the part of its route outside any shared raceway; each shared
raceway is counted once, for its own length, on a line of its own that carries its id; sticks, couplings, connectors, supports (the xxx.30 section of
the raceway's article), elbows (one per recorded 90-degree bend) and pull points (conduit bodies
or pull boxes, ``pull_points_for``) follow from it.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from functools import lru_cache
from typing import Sequence

from gaugewalk.model.walk.takeoff.lines import (
    FittingLine,
    RacewayLine,
    RunMaterial,
    SharedRacewayMaterial,
    TakeoffSettings,
)
from gaugewalk.tables.raceway import install as raceway_install

ITEM_ORDER = {"coupling": 0, "connector": 1, "support": 2, "90-degree elbow": 3,
              "conduit body": 4, "pull box": 4, "pull box or handhole": 4}


@dataclass
class RacewayCount:
    """What ``count_raceway`` found: the lines, the families used and the runs left out."""

    raceway_lines: tuple[RacewayLine, ...]
    fitting_lines: tuple[FittingLine, ...]
    families: dict[str, raceway_install.InstallRule] = field(default_factory=dict)
    warnings: list[str] = field(default_factory=list)


def pull_points_for(bends: int, length_ft: float, every_ft: float) -> tuple[int, int]:
    """Pull points one raceway needs, and how many of them the bends alone need.

    Enough that no stretch between pull points (or the ends) holds more than
    ``MAX_BEND_DEGREES`` of bends, 90 degrees per recorded bend (NEC 342.26, 344.26, 348.26,
    350.26, 352.26, 353.26, 356.26, 358.26, 362.26), or is longer than ``every_ft`` [ft] (the
    job's setting, common practice; 0: no length limit). Assumes the bends can be shared out so
    that one pull point serves both limits."""
    per_stretch = raceway_install.MAX_BEND_DEGREES // raceway_install.DEGREES_PER_BEND
    by_bends = -(-bends // per_stretch) if bends > 0 else 1
    by_length = math.ceil(round(length_ft / every_ft, 9)) if every_ft > 0 and length_ft > 0 else 1
    return max(1, by_bends, by_length) - 1, max(0, by_bends - 1)


def _pull_basis(rule: raceway_install.InstallRule, kind: str, settings: TakeoffSettings) -> str:
    every = (f" or every {settings.pull_every_ft:g} ft of run (the job's setting; common practice)"
             if settings.pull_every_ft > 0 else "")
    text = (f"a pull point where the bends between pull points would pass "
            f"{raceway_install.MAX_BEND_DEGREES} degrees ({rule.bends_section}){every}; "
            f"conduit bodies up to trade size {raceway_install.CONDUIT_BODY_LARGEST_TRADE_SIZE:g}, "
            f"pull boxes above (common practice)")
    if kind != "conduit body":
        text += f"; size boxes by {raceway_install.PULL_BOX_SIZING_RULE}"
    return text


@lru_cache(maxsize=256)
def _rule_and_spacing(raceway: str, trade_size: str):
    rule = raceway_install.install_rule(raceway)
    return rule, rule.max_spacing_ft(trade_size)


def race_sort(key: tuple[str, str]) -> tuple[str, float]:
    """Sort raceway keys (type, trade size) by type, then trade size as a number."""
    return (key[0], raceway_install.trade_size_value(key[1]))


def count_raceway(runs: Sequence[RunMaterial], settings: TakeoffSettings,
                  shared: Sequence[SharedRacewayMaterial] = ()) -> RacewayCount:
    """Raceway lengths and fittings of ``runs`` (their own raceways) and of the ``shared``
    raceways (each once); those that cannot be counted are named in the warnings and left
    out."""
    race_len: dict[tuple[str, str, str | None], float] = {}
    race_runs: dict[tuple[str, str, str | None], list[str]] = {}
    fittings: dict[tuple[str, str, str], int] = {}
    fitting_basis: dict[tuple[str, str, str], str] = {}
    families: dict[str, raceway_install.InstallRule] = {}
    warnings: list[str] = []

    def add_fitting(item: str, raceway: str, trade: str, count: int, basis: str) -> None:
        key = (item, raceway, trade)
        fittings[key] = fittings.get(key, 0) + count
        fitting_basis[key] = basis

    def one_raceway(label: str, raceway: str, trade: str, length_ft: float, sets: int,
                    bends: int, shared_id: str | None, run_ids: list[str]) -> None:
        try:
            rule, spacing = _rule_and_spacing(raceway, trade)
        except (KeyError, ValueError) as exc:
            warnings.append(f"{label}: raceway left out: {exc.args[0]}")
            return
        families[rule.family] = rule
        key = (raceway, trade)
        line = (raceway, trade, shared_id)
        race_len[line] = race_len.get(line, 0.0) + length_ft * sets
        race_runs.setdefault(line, []).extend(run_ids)
        if rule.stick_ft is not None and not rule.coupling_attached:
            add_fitting("coupling", *key,
                        raceway_install.joints_for(length_ft, rule.stick_ft) * sets,
                        f"one per joint between lengths; {rule.stick_source}")
        add_fitting("connector", *key, 2 * settings.connectors_per_end * sets,
                    f"{settings.connectors_per_end} per raceway end (takeoff assumption)")
        if spacing is not None:
            add_fitting("support", *key,
                        raceway_install.supports_for(length_ft, rule.end_ft, spacing) * sets,
                        f"{rule.support_source} ({spacing:g} ft at trade size {trade})")
        if bends:
            add_fitting("90-degree elbow", *key, bends * sets,
                        "one per 90-degree bend recorded on the walk")
        points, for_bends = pull_points_for(bends, length_ft, settings.pull_every_ft)
        if points:
            kind = rule.pull_point(trade)
            add_fitting(kind, *key, points * sets, _pull_basis(rule, kind, settings))
        if for_bends:
            degrees = bends * raceway_install.DEGREES_PER_BEND
            warnings.append(
                f"{label}: {bends} bends ({degrees} degrees) pass "
                f"{raceway_install.MAX_BEND_DEGREES} degrees between pull points "
                f"({rule.bends_section}); {for_bends} pull point(s) counted, to be placed "
                f"between the bends"
            )

    for run in runs:
        if run.raceway is None or run.own_raceway_ft <= 0:
            continue
        if run.raceway_size is None:
            warnings.append(
                f"run {run.run_id}: no {run.raceway} trade size holds its conductors; "
                f"its raceway and fittings are left out of the takeoff"
            )
            continue
        one_raceway(f"run {run.run_id}", run.raceway, run.raceway_size, run.own_raceway_ft,
                    run.sets, run.bends, None, [run.run_id])
    for race in shared:
        if race.raceway_size is None:
            warnings.append(f"raceway {race.id}: no {race.raceway} trade size holds its "
                            "conductors; it and its fittings are left out of the takeoff")
            continue
        one_raceway(f"raceway {race.id}", race.raceway, race.raceway_size, race.length_ft, 1,
                    race.bends, race.id, list(race.runs))

    raceway_lines = []
    for key in sorted(race_len, key=lambda k: (*race_sort((k[0], k[1])), k[2] or "")):
        rule = raceway_install.install_rule(key[0])
        length = round(race_len[key], 1)
        sticks = None if rule.stick_ft is None else raceway_install.sticks_for(length, rule.stick_ft)
        raceway_lines.append(RacewayLine(
            key[0], key[1], length, sticks, rule.stick_ft, rule.stick_source, tuple(race_runs[key]),
            key[2],
        ))
    fitting_lines = tuple(
        FittingLine(item, raceway, trade, fittings[(item, raceway, trade)],
                    fitting_basis[(item, raceway, trade)])
        for item, raceway, trade in sorted(
            fittings, key=lambda k: (race_sort((k[1], k[2])), ITEM_ORDER[k[0]]))
        if fittings[(item, raceway, trade)] > 0
    )
    return RacewayCount(tuple(raceway_lines), fitting_lines, families, warnings)
