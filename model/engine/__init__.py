"""One run, alone. ``contract`` (``RunSpec`` in, ``RunResult`` out) and its ``vocabulary``,
``lengths`` and ``loads`` (as typed), ``circuits`` (systems and connections), ``drop`` (the
drop formulas) and ``sizing`` (split by rule)."""
