"""The rough takeoff: conductor footage per size and colour in put-ups, raceway and fittings.

Rooms: ``lines`` (what goes in and comes out), ``footage`` (conductors per run), ``packing``
(put-ups), ``fittings`` (raceway, couplings, connectors, supports, elbows) and ``build`` (the
takeoff of a computed walk). Build one with ``build_takeoff(job, job_result)``; the pure core is
``takeoff_from_runs``. The names below are the public ones.
"""

from gaugewalk.model.walk.takeoff.build import (
    COLOUR_SCHEMES, build_takeoff, materials_from_job, scheme_for_source_system, settings_for,
    takeoff_from_runs,
)
from gaugewalk.model.walk.takeoff.footage import conductor_footage, phase_colours_for
from gaugewalk.model.walk.takeoff.lines import (
    ROW_FIELDS, FittingLine, PutUpCount, RacewayLine, RunMaterial, SizeFootage, Takeoff,
    TakeoffError, TakeoffSettings, WireLine,
)
from gaugewalk.model.walk.takeoff.packing import order_putups

__all__ = [
    "COLOUR_SCHEMES", "ROW_FIELDS", "FittingLine", "PutUpCount", "RacewayLine", "RunMaterial",
    "SizeFootage", "Takeoff", "TakeoffError", "TakeoffSettings", "WireLine", "build_takeoff",
    "conductor_footage", "materials_from_job", "order_putups", "phase_colours_for",
    "scheme_for_source_system", "settings_for", "takeoff_from_runs",
]
