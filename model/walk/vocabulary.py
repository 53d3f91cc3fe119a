"""The words of the walk, in one place: the job model's fields and the command line's choices
read them from here (the words of one run are in ``gaugewalk.model.engine.vocabulary``).

Public API:

- ``SourceKind``, ``SOURCE_KINDS``: what feeds runs: the ``service`` (fed by the utility), a
  ``switchboard``, a ``panel`` or a ``transformer`` (which starts a new system).
"""

from __future__ import annotations

from typing import Literal, get_args

SourceKind = Literal["service", "switchboard", "panel", "transformer"]
SOURCE_KINDS: tuple[SourceKind, ...] = get_args(SourceKind)
