"""Write ``warehouse_dc2.toml``: an invented mid-size warehouse walk with a few hundred runs.

Invented job: distribution centre "DC-2" for Pellham Logistics, 1800 Quarry Flats Road, Tessaly.
480Y/277 V service into a main switchboard (with the sprinkler system's fire pump tapped ahead
of its disconnect); three 480Y/277 V distribution panels (high-bay
lighting on 277 V, dock doors, chargers and unit heaters on 480 V); two step-down transformers to
208Y/120 V, each feeding a panel and subpanels for the offices, the break room and the docks.
The transformers carry their nameplate impedance and primary-only protection (NEC Table
450.3(B)); the drop from the service carries through them (the job default).

Deterministic: a seeded ``random.Random`` picks lengths and loads, so running it twice writes the
same bytes (a test checks the committed file against a fresh run). Run from the repository root::

    python sample_walks/make_warehouse.py
"""

from __future__ import annotations

import random
import sys
from datetime import date
from pathlib import Path

if __package__ in (None, ""):
    sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from gaugewalk.model.walk.job import Defaults, Job, JobHeader, Run, Source  # noqa: E402
from gaugewalk.model.walkfile.write import dumps_walk  # noqa: E402

OUT = Path(__file__).with_name("warehouse_dc2.toml")
WALKED = date(2024, 9, 10)


def build() -> Job:
    rng = random.Random(20240910)
    sources = [
        Source(id="MSB", kind="service", system="480Y/277V 3ph 4w", name="Main switchboard",
               rating_a=2000, notes="Electrical room 101, north wall"),
        Source(id="H1", kind="panel", system="480Y/277V 3ph 4w", name="Lighting panel H1",
               rating_a=400, notes="Column line C-4, aisle 3"),
        Source(id="H2", kind="panel", system="480Y/277V 3ph 4w", name="Lighting panel H2",
               rating_a=400, notes="Column line C-14, aisle 11"),
        Source(id="H3", kind="panel", system="480Y/277V 3ph 4w", name="Dock and mechanical H3",
               rating_a=600, notes="Dock wall, between doors 12 and 13"),
        Source(id="T1", kind="transformer", system="208Y/120V 3ph 4w", kva=300,
               impedance_pct=4.6, name="Office transformer",
               notes="Electrical room 101, on the pad"),
        Source(id="L1", kind="panel", system="208Y/120V 3ph 4w", name="Office panel L1",
               rating_a=600, main_a=600, spaces=84, notes="Electrical room 101"),
        Source(id="L1A", kind="panel", system="208Y/120V 3ph 4w", name="Office subpanel L1A",
               rating_a=225, notes="Office corridor, by the copy room"),
        Source(id="L1B", kind="panel", system="208Y/120V 3ph 4w", name="Break room subpanel L1B",
               rating_a=100, notes="Break room, behind the door"),
        Source(id="T2", kind="transformer", system="208Y/120V 3ph 4w", kva=150,
               impedance_pct=3.5, name="Dock transformer", notes="Dock wall, beside H3"),
        Source(id="L2", kind="panel", system="208Y/120V 3ph 4w", name="Dock panel L2",
               rating_a=225, main_a=225, notes="Dock wall, beside T2"),
        Source(id="L2A", kind="panel", system="208Y/120V 3ph 4w", name="Shipping office L2A",
               rating_a=100, notes="Shipping office mezzanine"),
    ]
    runs: list[Run] = []

    def add(rid, frm, to, length, load=None, plate=None, **kw):
        """A run; ``load`` is (value, unit[, pf]), ``plate`` the load's kind and nameplate
        (``{"kind": "hvac", "mca": 28, "mocp": 45}``), either or both."""
        data = {"id": rid, "from": frm, "to": to, "length": length, **kw}
        if load is not None or plate is not None:
            data["load"] = dict(plate or {})
        if load is not None:
            data["load"].update({"value": load[0], "unit": load[1],
                                 **({"pf": load[2]} if len(load) > 2 else {})})
        runs.append(Run.model_validate(data))

    def route(base: int, spread: int) -> str:
        """A length as a walker writes it: the main stretch plus the drops and offsets."""
        main = base + rng.randint(0, spread)
        drop = rng.choice([8, 10, 12, 14])
        return f"{main}+{drop}+2*{rng.choice([3, 4, 6])}"

    # feeders
    add("F-H1", "MSB", "H1", "260+18+2*6", material="al", raceway="EMT", bends=4,
        measured_on=WALKED.isoformat())
    add("F-H2", "MSB", "H2", "520+18+2*6", material="al", raceway="EMT", bends=5,
        measured_on=WALKED.isoformat())
    add("F-H3", "MSB", "H3", "340+14+2*8", material="al", raceway="EMT", bends=4, sets=2,
        measured_on=WALKED.isoformat(), max_drop_pct=1.5,
        notes="Sized for 1.5 %: the dock transformer and its panels hang below it")
    add("F-T1", "MSB", "T1", "24", bends=2, notes="Primary, 480 V 3-wire")
    add("F-L1", "T1", "L1", "18", bends=2, sets=2, notes="Secondary, 208Y/120 V, two sets")
    add("F-L1A", "L1", "L1A", "95+10", bends=3, max_drop_pct=1.0,
        notes="Sized for 1 % so the office circuits keep their share of the total drop")
    add("F-L1B", "L1", "L1B", "140+10", bends=3, max_drop_pct=1.0,
        notes="Sized for 1 % so the break room circuits keep their share of the total drop")
    add("F-T2", "H3", "T2", "12", bends=2, notes="Primary, 480 V 3-wire")
    add("F-L2", "T2", "L2", "10", bends=1)
    add("F-L2A", "L2", "L2A", "65+16", bends=3, max_drop_pct=1.0,
        notes="Up to the mezzanine; sized for 1 % so the office circuits keep their share")

    # high-bay LED lighting, 277 V, fixtures spread along each aisle
    for panel, first, count, reach in (("H1", 1, 72, 40), ("H2", 101, 72, 40)):
        for n in range(count):
            fixtures = rng.choice([10, 12, 14, 16])
            watts = fixtures * rng.choice([150, 165, 180])
            aisle = n // 4 + 1
            add(f"{panel}-{first + n:03d}", panel, f"High-bay row {aisle}{'ABCD'[n % 4]}",
                route(reach + 10 * (n % 12), 60), load=(watts, "W", 0.95), continuous=True,
                distributed=True, connection="LN", bends=rng.randint(2, 6))
    # H3: dock doors, levelers, chargers, unit heaters, exhaust
    for door in range(1, 25):
        add(f"H3-D{door:02d}", "H3", f"Dock door {door} operator",
            route(20 + 12 * abs(door - 12), 20), load=(1, "hp"), connection="3P", bends=3)
    for n in range(1, 13):
        add(f"H3-C{n:02d}", "H3", f"Forklift charger {n}", route(60 + 6 * n, 40),
            load=(rng.choice([12, 14, 16]), "A"), connection="3P", continuous=True, bends=4)
    for n in range(1, 11):
        add(f"H3-UH{n:02d}", "H3", f"Unit heater UH-{n}", route(80 + 25 * n, 40),
            load=(rng.choice([5, 7.5, 10]), "kW"), plate={"kind": "heater"}, connection="3P",
            bends=4)
    for n in range(1, 7):
        add(f"H3-EF{n}", "H3", f"Roof exhaust fan EF-{n}", route(120 + 40 * n, 30),
            load=(2, "hp"), connection="3P", bends=5)
    add("H3-CMP", "H3", "Air compressor", "45+12", load=(20, "hp"), connection="3P", bends=3)
    add("H3-BAL", "H3", "Cardboard baler", "150+12+2*6", load=(25, "hp"),
        plate={"motor_device": "dual-element"}, connection="3P", bends=4)

    # L1 office panel: lighting, receptacles, HVAC
    for n in range(1, 25):
        add(f"L1-{n:02d}", "L1", f"Office lighting zone {n}", route(40 + 5 * n, 30),
            load=(rng.choice([900, 1100, 1300]), "VA"), continuous=True, distributed=True,
            connection="LN", bends=rng.randint(2, 5))
    for n in range(1, 31):
        add(f"L1-R{n:02d}", "L1", f"Office receptacles {n}", route(35 + 4 * n, 30),
            load=(rng.choice([6, 8, 10]) * 180, "VA"), distributed=True, connection="LN",
            bends=rng.randint(2, 5))
    for n in range(1, 4):
        length = route(90 + 20 * n, 20)
        mca = rng.choice([28, 32, 38])
        add(f"L1-RTU{n}", "L1", f"Office rooftop unit RTU-{n}", length,
            plate={"kind": "hvac", "mca": mca, "mocp": {28: 45, 32: 50, 38: 60}[mca]},
            connection="3P", bends=6)
    add("L1-WH", "L1", "Water heater", "60+10", load=(4.5, "kW"),
        plate={"kind": "water-heater", "tank_gal": 50}, connection="LL", bends=3)
    add("L1-EXT", "L1", "Parking lot poles", "380+40+2*6", load=(2400, "W", 0.95), connection="LN",
        continuous=True, distributed=True, bends=4, raceway="PVC-40",
        notes="Underground to 6 poles along the lot")
    add("L1-SIGN", "L1", "Monument sign", "410+12", load=(5, "A"), connection="LN",
        continuous=True, raceway="PVC-40", bends=4)
    # L1A offices
    for n in range(1, 31):
        add(f"L1A-{n:02d}", "L1A", f"Office {100 + n} receptacles", route(25 + 3 * n, 20),
            load=(rng.choice([4, 6, 8]) * 180, "VA"), distributed=True, connection="LN",
            bends=rng.randint(2, 4))
    for n in range(1, 7):
        add(f"L1A-IT{n}", "L1A", f"IT rack {n} receptacle", route(30, 15), load=(16, "A"),
            connection="LN", continuous=True, bends=3)
    # L1B break room
    for what, load, conn, cont in (
        ("Refrigerator 1", (6, "A"), "LN", False), ("Refrigerator 2", (6, "A"), "LN", False),
        ("Microwave 1", (1500, "W", 1.0), "LN", False),
        ("Microwave 2", (1500, "W", 1.0), "LN", False),
        ("Coffee brewer", (1.8, "kW", 1.0), "LN", False), ("Dishwasher", (10, "A"), "LN", False),
        ("Vending machines", (12, "A"), "LN", True), ("Ice machine", (9, "A"), "LL", True),
        ("Break room lights", (800, "VA"), "LN", True),
        ("Counter receptacles A", (1440, "VA"), "LN", False),
        ("Counter receptacles B", (1440, "VA"), "LN", False),
        ("Water cooler", (4, "A"), "LN", True),
        ("TV and media", (5, "A"), "LN", False), ("Locker room lights", (600, "VA"), "LN", True),
        ("Locker room fan", (3, "A"), "LN", True), ("Washer", (12, "A"), "LN", False),
        ("Dryer", (5.6, "kW", 1.0), "LL", False),
        ("Instant water heater", (9, "kW", 1.0), "LL", False),
    ):
        rid = f"L1B-{len([r for r in runs if r.from_ == 'L1B']) + 1:02d}"
        add(rid, "L1B", what, route(15, 30), load=load, connection=conn, continuous=cont or None,
            bends=rng.randint(1, 4))
    # L2 dock panel
    for door in range(1, 25):
        add(f"L2-DL{door:02d}", "L2", f"Dock door {door} light and receptacle",
            route(20 + 12 * abs(door - 12), 20), load=(rng.choice([4, 6, 8]), "A"),
            connection="LN", bends=3)
    for door in range(1, 13):
        add(f"L2-LV{door:02d}", "L2", f"Dock leveler {door * 2 - 1}-{door * 2}",
            route(24 * abs(door - 6) + 30, 20), load=(6.5, "A"), connection="3P", bends=3)
    for n in range(1, 9):
        add(f"L2-R{n}", "L2", f"Dock wall receptacles {n}", route(30 + 30 * n, 20),
            load=(1440, "VA"), connection="LN", distributed=True, bends=3)
    # L2A shipping office
    for n in range(1, 17):
        add(f"L2A-{n:02d}", "L2A", f"Shipping desk {n}", route(15 + 3 * n, 10),
            load=(rng.choice([4, 6]) * 180, "VA"), connection="LN", distributed=True, bends=2)
    add("L2A-LT", "L2A", "Shipping office lights", "60+8", load=(1200, "VA"), connection="LN",
        continuous=True, distributed=True, bends=3)
    add("L2A-HP", "L2A", "Shipping office heat pump", "25+8",
        plate={"kind": "hvac", "mca": 18, "mocp": 30}, connection="LL", bends=3)
    # the sprinkler system's fire pump, fed from the service ahead of its disconnect
    add("MSB-FP", "MSB", "Fire pump FP-1", "85+10+2*4", load=(50, "hp"),
        plate={"kind": "fire-pump", "code_letter": "G"}, connection="3P", bends=3,
        notes="Fire pump room 104; tapped ahead of the service disconnect")

    return Job(
        job=JobHeader(
            name="Pellham Logistics DC-2 (invented sample)",
            site="1800 Quarry Flats Road, Tessaly",
            walked_on=WALKED,
            walked_by="D. Varga and M. Osei",
            notes="Invented demo walk written by sample_walks/make_warehouse.py. Aluminum "
                  "feeders from the main switchboard to H1-H3; everything else copper.",
        ),
        defaults=Defaults(ambient_c=35.0, waste_pct=7.0),
        sources=sources,
        runs=runs,
    )


def main() -> int:
    OUT.write_text(dumps_walk(build()), encoding="utf-8")
    print(f"wrote {OUT}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
