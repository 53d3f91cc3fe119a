"""What was being typed on the run card, kept beside the walk so a crash does not lose it.

``walk.toml`` keeps its unstored card in ``.walk.toml.draft.json``: the field texts as typed
(``{"from": "LP1", "to": "Mixer", "length": "85+1", ...}``), which run they edit (None: a new
run), and when. Written atomically (temporary file, fsync, rename), so a draft on disk is whole or
absent; cleared when the card is stored or discarded. Stored runs are never in a draft: they are
in the walk, saved at once.

Public API:

- ``draft_path(walk) -> Path``.
- ``save_draft(walk, fields, run_id=None)``; ``load_draft(walk) -> Draft | None`` (None when there
  is none or it cannot be read: a draft is a convenience, never a reason to refuse a walk);
  ``clear_draft(walk)``.
- ``Draft(fields, run_id, saved_at)``.
"""

from __future__ import annotations

import json
import os
from dataclasses import dataclass
from datetime import datetime, timezone
from pathlib import Path

from gaugewalk.model.walk.plain_text import shown
from gaugewalk.model.walkfile.atomic import atomic_write

DRAFT_SUFFIX = ".draft.json"
MAX_DRAFT_BYTES = 256 * 1024
"""A draft is a few field texts; anything bigger is not one of ours [bytes]."""
MAX_FIELD_CHARS = 10_000
"""Longest field text kept in a draft [characters]."""


def draft_path(walk: str | os.PathLike) -> Path:
    """``.walk.toml.draft.json`` beside ``walk.toml``."""
    p = Path(walk)
    return p.with_name(f".{p.name}{DRAFT_SUFFIX}")


@dataclass(frozen=True)
class Draft:
    """An unstored run card: ``fields`` (field key -> text as typed), the run it edits (None for a
    new run) and when it was last typed in (ISO 8601, UTC)."""

    fields: dict[str, str]
    run_id: str | None
    saved_at: str

    def typed(self) -> bool:
        """True when any field holds something."""
        return any(v.strip() for v in self.fields.values())


def save_draft(walk: str | os.PathLike, fields: dict[str, str], run_id: str | None = None) -> None:
    """Keep the card's texts beside the walk, atomically. Raises ``OSError`` if it cannot be
    written (the caller says so; the walk itself is unaffected)."""
    target = draft_path(walk)
    clean = {str(k): str(v)[:MAX_FIELD_CHARS] for k, v in fields.items()}
    now = datetime.now(timezone.utc).replace(microsecond=0).isoformat()
    data = json.dumps({"fields": clean, "run_id": run_id, "saved_at": now},
                      ensure_ascii=False, indent=1).encode("utf-8")
    atomic_write(target, data, keep_backup=False)


def load_draft(walk: str | os.PathLike) -> Draft | None:
    """The draft kept beside the walk, or None (none, unreadable, or not a draft)."""
    target = draft_path(walk)
    try:
        with open(target, "rb") as handle:
            raw = handle.read(MAX_DRAFT_BYTES + 1)
    except OSError:
        return None
    if len(raw) > MAX_DRAFT_BYTES:
        return None
    try:
        data = json.loads(raw.decode("utf-8"))
        fields = data["fields"]
        run_id = data.get("run_id")
        saved_at = str(data.get("saved_at", ""))
    except (ValueError, KeyError, TypeError, AttributeError):
        return None
    if not isinstance(fields, dict) or not (run_id is None or isinstance(run_id, str)):
        return None
    # typed text comes back as typed; control characters (none can be typed) are made visible
    clean = {str(k): shown(v[:MAX_FIELD_CHARS]) for k, v in fields.items() if isinstance(v, str)}
    return Draft(clean, run_id, saved_at)


def clear_draft(walk: str | os.PathLike) -> None:
    """Remove the draft (nothing happens if there is none or it cannot be removed)."""
    try:
        os.unlink(draft_path(walk))
    except OSError:
        pass
