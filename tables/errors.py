"""The one exception the table lookups raise."""

from __future__ import annotations


class TableLookupError(ValueError):
    """A name or value is not in a published table. The message lists the valid choices,
    e.g. "no conductor size '5 AWG'; sizes are 18 AWG, 16 AWG, ..."."""


def choices(values) -> str:
    """Join valid choices for an error message: ``"a, b, c"``."""
    return ", ".join(str(v) for v in values)
