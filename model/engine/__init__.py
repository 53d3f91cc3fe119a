"""One run, alone. ``contract`` (``RunSpec`` in, ``RunResult`` out) and its ``vocabulary``,
``lengths`` and ``loads`` (as typed), ``circuits`` (systems and connections), ``drop`` (the
drop formulas) and ``sizing`` (split by rule); ``collector`` (the garbage collector held off while
many objects are built: a walk read or computed, a command's modules imported)."""
