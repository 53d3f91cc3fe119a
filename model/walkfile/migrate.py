"""Walk file schema versions: the data of an older file brought up to ``SCHEMA_VERSION``.

Public API:

- ``migrate(data) -> dict``: parsed file data of any schema this code reads, as the current
  schema; ``ValueError`` for a schema newer than this code or not a whole number.
- ``MIGRATIONS``: ``{N: function(dict) -> dict}`` turning schema N into N+1.
"""

from __future__ import annotations

from collections.abc import Callable

from gaugewalk.model.walk.job import SCHEMA_VERSION


def _v0_to_v1(data: dict) -> dict:
    """Schema 0 (the first draft, before the file carried a ``schema`` key) wrote a run's load as
    flat keys ``amps``, ``va``, ``kva``, ``w``, ``kw`` with ``pf`` and called ``distributed``
    ``spread``. Schema 1 nests the load: ``load = { value = 16, unit = "A", pf = 0.9 }``."""
    units = {"amps": "A", "va": "VA", "kva": "kVA", "w": "W", "kw": "kW"}
    out = dict(data)
    runs = []
    for run in data.get("run", []):
        if not isinstance(run, dict):
            runs.append(run)
            continue
        run = dict(run)
        given = [k for k in units if k in run]
        if len(given) == 1 and "load" not in run:
            key = given[0]
            load = {"value": run.pop(key), "unit": units[key]}
            if "pf" in run:
                load["pf"] = run.pop("pf")
            run["load"] = load
        if "spread" in run and "distributed" not in run:
            run["distributed"] = run.pop("spread")
        runs.append(run)
    if "run" in data:
        out["run"] = runs
    out["schema"] = 1
    return out


MIGRATIONS: dict[int, Callable[[dict], dict]] = {0: _v0_to_v1}
"""``MIGRATIONS[n]`` turns the data of a schema-n file into schema n+1."""


def migrate(data: dict) -> dict:
    """Bring parsed file data up to ``SCHEMA_VERSION``, one step at a time. A file without a
    ``schema`` key is schema 0. Raises ``ValueError`` for a schema newer than this code."""
    version = data.get("schema", 0)
    if not isinstance(version, int) or isinstance(version, bool) or version < 0:
        raise ValueError(f"'schema' must be a whole number, not {version!r}")
    if version > SCHEMA_VERSION:
        raise ValueError(
            f"the file is schema {version}, written by a newer gaugewalk; this one reads up to "
            f"schema {SCHEMA_VERSION}"
        )
    while version < SCHEMA_VERSION:
        data = MIGRATIONS[version](data)
        version += 1
    return data
