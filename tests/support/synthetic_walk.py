"""A deterministic synthetic walk of any size, for the benchmarks (``bench/benchmarks.py``).

The job is invented: "Larkspur Freight Hub", a distribution centre of one or more buildings, each
with a 480Y/277 V service, 480 V panels serving 277 V lighting and 480 V motors and heaters, and
step-down transformers to 208Y/120 V feeding panels (some with a subpanel) of receptacles, 120 V
and 208 V equipment. A few runs have fixed sizes, metric or summed lengths, segments, notes,
aluminum feeders and PVC raceway, so every code path of the walk file is exercised; a few come
out over their drop target, as on a real walk.

Public API:

- ``synthetic_walk_data(n_runs, seed=7) -> dict``: the walk as the data of a schema-1 file.
- ``synthetic_walk(n_runs, seed=7) -> Job``: the same, validated.
- ``synthetic_walk_text(n_runs, seed=7) -> str``: the file text as gaugewalk writes it.

Exactly ``n_runs`` runs (feeders included). Same arguments, same walk, byte for byte.
"""

from __future__ import annotations

import random
from datetime import date, timedelta
from typing import Any

from gaugewalk.model.walk.job import Job

RUNS_PER_BUILDING = 1200
"""Runs on one service before the generator starts another building (a 480Y/277 V service of a
few thousand amperes carries about this many circuits; common practice)."""

TRANSFORMER_KVA = (45.0, 75.0, 112.5, 150.0, 225.0, 300.0, 500.0)
"""Standard three-phase dry-type transformer ratings [kVA] (common practice)."""

PANEL_RATINGS = (100, 125, 150, 200, 225, 400, 600, 800)
"""Panelboard bus and main ratings [A] (common practice)."""

_HP_KINDS = ("lighting", "lighting", "lighting", "lighting", "lighting", "lighting",
             "motor", "motor", "heater", "sign")
_LP_KINDS = ("receptacles", "receptacles", "receptacles", "receptacles", "receptacles",
             "receptacles", "equipment", "equipment", "two-pole", "three-phase")
_AREAS = ("Dock", "Rack aisle", "Mezzanine", "Cold room", "Office", "Break room", "Yard",
          "Sort line", "Charger bay", "Mechanical room", "Loading apron", "Pick module")
_LIGHTS = ("high-bay lights", "lights", "emergency lights", "exit and egress lights",
           "perimeter lights")
_MOTORS = ("conveyor drive", "exhaust fan", "rooftop unit", "dock leveller pump",
           "compressor", "air handler")
_EQUIPMENT = ("printer station", "label applicator", "vending", "microwave", "copier",
              "server rack", "scanner chargers", "coffee bar")
_TWO_POLE = ("water heater", "unit heater", "dryer", "door operator")
_THREE_PHASE = ("kitchen range", "baler", "dishwasher booster", "shop welder receptacle")
_ROUTE_NOTES = ("up the column", "along the bar joists", "across the dock ceiling",
                "down the wall", "through the mezzanine", "under the stairs")


def _length(rng: random.Random, low: int, high: int) -> tuple[str, list[dict] | None]:
    """A route length as a walker types it, sometimes with segments."""
    feet = rng.randint(low, high)
    pick = rng.random()
    if pick < 0.70:
        return str(feet), None
    if pick < 0.85:
        drops = rng.randint(1, 3)
        rise = rng.choice((6, 8, 10, 12))
        main = max(feet - drops * rise - 12, 5)
        return f"{main}+12+{drops}*{rise}", None
    if pick < 0.95:
        metres = max(feet * 3 // 10 - 3, 2)
        return f"{metres}m+{rng.randint(2, 9)}ft", None
    first = max(feet * 2 // 3, 3)
    second = max(feet - first, 2)
    notes = rng.sample(_ROUTE_NOTES, 2)
    return f"{first}+{second}", [{"length": str(first), "note": notes[0]},
                                 {"length": str(second), "note": notes[1]}]


def _kva(load_va: float) -> float:
    """Smallest standard transformer rating at or above 125 % of the load (common practice)."""
    for kva in TRANSFORMER_KVA:
        if kva * 1000.0 >= 1.25 * load_va:
            return kva
    return TRANSFORMER_KVA[-1]


class _Builder:
    def __init__(self, n_runs: int, seed: int) -> None:
        self.rng = random.Random(seed)
        self.left = n_runs
        self.runs: list[dict] = []
        self.sources: list[dict] = []
        self.run_no = 0
        self.feeder_no = 0
        self.walked = date(2024, 4, 8)
        self.panels: dict[str, tuple[dict, float]] = {}

    # ----- pieces -------------------------------------------------------------------------
    def _run(self, frm: str, to: str, length: tuple[int, int], *, feeder: bool = False,
             **fields: Any) -> dict:
        rng = self.rng
        if feeder:
            self.feeder_no += 1
            rid = f"F{self.feeder_no}"
        else:
            self.run_no += 1
            rid = f"R{self.run_no}"
        text, segments = _length(rng, *length)
        run: dict[str, Any] = {"id": rid, "from": frm, "to": to, "length": text}
        if segments:
            run["segments"] = segments
        run.update(fields)
        if rng.random() < 0.3:
            run["measured_on"] = self.walked + timedelta(days=rng.randint(0, 20))
        if rng.random() < 0.05:
            run["notes"] = rng.choice(("label faded, traced by toner", "shared raceway",
                                       "check the as-builts", "new since the last walk"))
        self.runs.append(run)
        self.left -= 1
        return run

    def _branch_hp(self, panel: str) -> float:
        """One branch on a 480Y/277 V panel; returns its apparent power [VA]."""
        rng = self.rng
        kind = rng.choice(_HP_KINDS)
        area = f"{rng.choice(_AREAS)} {rng.randint(1, 40)}"
        if kind == "lighting":
            amps = rng.choice((6, 8, 10, 12, 14, 16))
            extra: dict[str, Any] = {"distributed": True} if rng.random() < 0.4 else {}
            if rng.random() < 0.08:
                extra["size"] = "12 AWG"
            self._run(panel, f"{area} {rng.choice(_LIGHTS)}", (40, 260),
                      load={"value": amps, "unit": "A"}, continuous=True, connection="LN", **extra)
            return amps * 277.0
        if kind == "sign":
            va = rng.choice((600, 900, 1200))
            self._run(panel, f"{area} sign", (20, 120), load={"value": va, "unit": "VA"},
                      continuous=True, connection="LN")
            return float(va)
        if kind == "motor":
            kva = rng.choice((3.0, 5.0, 7.5, 10.0, 15.0, 20.0))
            name = f"{area} {rng.choice(_MOTORS)}"
            extra = {"raceway": "PVC-40"} if rng.random() < 0.15 else {}
            self._run(panel, name, (30, 300), load={"value": kva, "unit": "kVA"},
                      connection="3P", **extra)
            return kva * 1000.0
        kw = rng.choice((6.0, 9.0, 12.0, 15.0))
        self._run(panel, f"{area} duct heater", (30, 200),
                  load={"value": kw, "unit": "kW", "pf": 1.0}, continuous=True, connection="3P")
        return kw * 1000.0

    def _branch_lp(self, panel: str) -> float:
        """One branch on a 208Y/120 V panel; returns its apparent power [VA]."""
        rng = self.rng
        kind = rng.choice(_LP_KINDS)
        area = f"{rng.choice(_AREAS)} {rng.randint(1, 40)}"
        if kind == "receptacles":
            va = 180 * rng.randint(3, 9)  # 180 VA per outlet, NEC 220.14(I)
            self._run(panel, f"{area} receptacles", (25, 180), load={"value": va, "unit": "VA"},
                      connection="LN")
            return float(va)
        if kind == "equipment":
            amps = rng.choice((5, 8, 10, 12, 16))
            name = f"{area} {rng.choice(_EQUIPMENT)}"
            extra: dict[str, Any] = {"size": "10 AWG"} if rng.random() < 0.1 else {}
            self._run(panel, name, (20, 150), load={"value": amps, "unit": "A"},
                      connection="LN", **extra)
            return amps * 120.0
        if kind == "two-pole":
            kw = rng.choice((1.5, 3.0, 4.5, 5.0))
            self._run(panel, f"{area} {rng.choice(_TWO_POLE)}", (20, 160),
                      load={"value": kw, "unit": "kW", "pf": 1.0}, continuous=True,
                      connection="LL")
            return kw * 1000.0
        kva = rng.choice((5.0, 8.0, 10.0, 12.0))
        self._run(panel, f"{area} {rng.choice(_THREE_PHASE)}", (25, 150),
                  load={"value": kva, "unit": "kVA"}, connection="3P")
        return kva * 1000.0

    def _panel(self, panel: str, system: str, feeds_from: str, kind: str,
               branches: int, feeder_length: tuple[int, int]) -> float:
        source: dict[str, Any] = {"id": panel, "kind": "panel", "system": system}
        self.sources.append(source)
        self.panels[panel] = (source, 0.0)
        extra = {}
        if self.rng.random() < 0.15:
            extra = {"material": "al", "insulation": "XHHW-2"}
        self._run(feeds_from, panel, feeder_length, feeder=True, **extra)
        branch = self._branch_hp if kind == "hp" else self._branch_lp
        load = sum(branch(panel) for _ in range(branches))
        self._rate(panel, load)
        if feeds_from in self.panels:  # a subpanel: its panel serves it too
            self._rate(feeds_from, load)
        return load

    def _rate(self, panel: str, more_va: float) -> None:
        """The panel's bus and main: the smallest common rating at or above 1.5 times its
        balanced current (room for the unbalance and 125 % of continuous loads; common
        practice)."""
        source, va = self.panels[panel]
        va += more_va
        self.panels[panel] = (source, va)
        volts = 480.0 if source["system"].startswith("480") else 208.0
        need = 1.5 * va / (3 ** 0.5 * volts)
        rating = next((r for r in PANEL_RATINGS if r >= need), PANEL_RATINGS[-1])
        source["rating_a"] = source["main_a"] = rating

    # ----- the plan ------------------------------------------------------------------------
    def build(self) -> dict:
        building = 0
        while self.left > 0:
            building += 1
            self._building(building, min(self.left, RUNS_PER_BUILDING))
        return {
            "schema": 1,
            "job": {"name": "Larkspur Freight Hub (synthetic)",
                    "site": "Larkspur Freight Hub, Unit 4, Corvell Industrial Park",
                    "walked_on": self.walked, "walked_by": "benchmark generator",
                    "notes": "Generated for the benchmarks; invented job."},
            "defaults": {"branch_drop_pct": 3.0},
            "source": self.sources,
            "run": self.runs,
        }

    def _building(self, b: int, budget: int) -> None:
        rng = self.rng
        stop = self.left - budget
        svc = f"B{b}-MDP"
        self.sources.append({"id": svc, "kind": "service", "system": "480Y/277V 3ph 4w",
                             "name": f"Building {b} main distribution", "rating_a": 3000})
        hp_no = t_no = 0
        while self.left - stop >= 12:
            room = self.left - stop
            if rng.random() < 0.45:
                hp_no += 1
                n = min(rng.randint(24, 40), room - 1)
                self._panel(f"B{b}-HP{hp_no}", "480Y/277V 3ph 4w", svc, "hp", n, (40, 400))
                continue
            # a transformer and its 208Y/120 V panels, sometimes one with a subpanel
            t_no += 1
            tid = f"B{b}-T{t_no}"
            panels = min(rng.randint(1, 3), max((room - 1) // 12, 1))
            source: dict[str, Any] = {"id": tid, "kind": "transformer",
                                      "system": "208Y/120V 3ph 4w"}
            self.sources.append(source)
            self._run(svc, tid, (20, 120), feeder=True)
            load = 0.0
            for p in range(panels):
                room = self.left - stop
                if room < 2:
                    break
                lp = f"B{b}-LP{t_no}{'ABC'[p]}"
                n = min(rng.randint(20, 36), room - 1)
                if p and n > 12 and rng.random() < 0.3:
                    # a subpanel fed from the previous panel
                    prev = f"B{b}-LP{t_no}{'ABC'[p - 1]}"
                    load += self._panel(lp, "208Y/120V 3ph 4w", prev, "lp", n - 1, (20, 120))
                else:
                    # secondary conductors within 25 ft, ending in the panel's main
                    # (NEC 240.21(C)(6))
                    load += self._panel(lp, "208Y/120V 3ph 4w", tid, "lp", n, (6, 25))
            source["kva"] = _kva(load)
            source["name"] = f"Step-down {tid}"
        # what is left goes straight from the service: large equipment
        while self.left > stop:
            kva = rng.choice((30.0, 45.0, 60.0, 75.0))
            area = rng.choice(_AREAS)
            what = rng.choice(("chiller", "fire pump", "EV charger bank", "compactor"))
            self._run(svc, f"{area} {what}", (40, 300), load={"value": kva, "unit": "kVA"},
                      connection="3P")


def synthetic_walk_data(n_runs: int, seed: int = 7) -> dict:
    """The walk as the data of a schema-1 walk file, with exactly ``n_runs`` runs."""
    if n_runs < 1:
        raise ValueError("a synthetic walk needs at least one run")
    return _Builder(n_runs, seed).build()


def synthetic_walk(n_runs: int, seed: int = 7) -> Job:
    """The synthetic walk, validated as a ``Job``."""
    return Job.model_validate(synthetic_walk_data(n_runs, seed))


def synthetic_walk_text(n_runs: int, seed: int = 7) -> str:
    """The synthetic walk's file text, exactly as gaugewalk saves it."""
    from gaugewalk.model.walkfile.write import dumps_walk

    return dumps_walk(synthetic_walk(n_runs, seed))
