"""The job and its computation. ``job`` (the pydantic model) with its ``vocabulary``,
``problems`` (the one shape of a problem), ``checks`` (what needs more than one table), ``graph``
(the supply graph), ``equipment`` (a run's load as its kind reads it), ``phases`` (where each
run lands in its panel), ``feeder_loads`` (what each
source's lines carry), ``ratings`` (panels and the service against their bus and main),
``transformers`` (Table 450.3(B), 240.21(C), the drop through them), ``schedule`` (panel
schedules and the sources list), ``chain`` (drops along a chain),
``compute`` (the whole walk) and ``recompute`` (after one edit), ``merge`` and ``takeoff``."""
