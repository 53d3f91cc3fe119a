"""The rough takeoff: conductor footage per size and colour in put-ups, raceway and fittings.

Rooms: ``lines`` (what goes in and comes out), ``footage`` (conductors and cuts per run),
``packing`` (cut lists into put-ups), ``fittings`` (raceway, couplings, connectors, supports,
elbows, pull points), ``order`` (item codes and order lines), ``prices`` (the user's price file)
and ``build`` (the takeoff of a computed walk). Build one with ``build_takeoff(job, job_result)``; the pure core is
``takeoff_from_runs``. The names below are the public ones.
"""

from gaugewalk.model.walk.takeoff.build import (
    COLOUR_SCHEMES,
    build_takeoff,
    materials_from_job,
    scheme_for_source_system,
    settings_for,
    takeoff_from_runs,
)
from gaugewalk.model.walk.takeoff.footage import conductor_footage, phase_colours_for
from gaugewalk.model.walk.takeoff.lines import (
    PRICED_FIELDS,
    ROW_FIELDS,
    Cut,
    FittingLine,
    OrderLine,
    Piece,
    PutUpCount,
    RacewayLine,
    RunMaterial,
    SharedRacewayMaterial,
    SizeFootage,
    Takeoff,
    TakeoffError,
    TakeoffSettings,
    WireLine,
)
from gaugewalk.model.walk.takeoff.order import spreadsheet_safe
from gaugewalk.model.walk.takeoff.packing import order_putups, pack_cuts

__all__ = [
    "COLOUR_SCHEMES", "PRICED_FIELDS", "ROW_FIELDS", "Cut", "FittingLine", "OrderLine", "Piece",
    "PutUpCount", "RacewayLine", "RunMaterial", "SharedRacewayMaterial", "SizeFootage", "Takeoff",
    "TakeoffError", "TakeoffSettings", "WireLine", "build_takeoff", "conductor_footage", "materials_from_job",
    "order_putups", "pack_cuts", "phase_colours_for", "scheme_for_source_system", "settings_for",
    "spreadsheet_safe", "takeoff_from_runs",
]
