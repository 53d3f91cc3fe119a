"""The job and its computation. ``job`` (the pydantic model) with its ``vocabulary``,
``problems`` (the one shape of a problem), ``checks`` (what needs more than one table), ``graph``
(the supply graph), ``feeder_loads`` (what each source serves), ``chain`` (drops along a chain),
``compute`` (the whole walk) and ``recompute`` (after one edit), ``merge`` and ``takeoff``."""
