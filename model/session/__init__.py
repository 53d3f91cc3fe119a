"""An open walk being changed, headless. ``session`` (the app's walk: results, status, trial
changes, undo) and ``hold`` (the walk held for writing: the one path a change takes to the
disk, for the app and for ``add``, ``source`` and ``merge``)."""
