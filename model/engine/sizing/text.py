"""Numbers as the engine's sentences write them: amps (``20 A``, ``24.5 A``) and percents
(``2.35%``)."""

from __future__ import annotations


def amps_text(x: float) -> str:
    """Amps for a sentence: ``20 A``, ``24.5 A``."""
    r = round(x, 1)
    return f"{r:g} A" if abs(r) < 1e6 else f"{r:.0f} A"


def pct_text(x: float) -> str:
    """A percent for a sentence: ``2.35%``."""
    return f"{x:.2f}%"
