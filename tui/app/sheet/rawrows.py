"""The runs as written in the file, read by the walk reader's own TOML parser
(``gaugewalk.model.walkfile.toml_parse``: the compiled one where installed, else ``tomllib``) and
nothing else: shown the moment the app starts, while the walk is checked and sized in the
background (which needs the model and takes longer).

Nothing here decides anything: a file that turns out to be invalid is still refused by
``gaugewalk.model.walkfile.read`` a moment later, with its message.
"""

from __future__ import annotations

import math
from pathlib import Path

from gaugewalk.model.walk.plain_text import shown
from gaugewalk.model.walkfile.toml_parse import parse_toml
from gaugewalk.tui.app.sheet.shape import SheetRow

SIZING = "… sizing"


def _feet(text: object) -> str:
    from gaugewalk.model.engine.lengths import (  # stdlib only, quick to import
        LengthError,
        parse_length,
    )

    try:
        ft = parse_length(str(text))
    except LengthError:
        return "?"
    if not math.isfinite(ft):
        return "?"
    return f"{ft:,.0f}" if ft >= 100 else f"{ft:.1f}".rstrip("0").rstrip(".")


def _load(raw: object, fed: str | None) -> str:
    """The load as written, or for a feeder the kind of source it feeds (``fed``), as the
    sized row shows it (``rows.load_text``)."""
    if isinstance(raw, dict) and isinstance(raw.get("value"), (int, float)):
        return f"{raw['value']:g}{raw.get('unit', '')}"
    return fed or ""


def raw_rows(path: str | Path, max_bytes: int = 4 * 1024 * 1024,
             text: str | None = None) -> list[SheetRow] | None:
    """Rows for the run sheet straight from the file (or from ``text``, the file's text read
    already), or None if it cannot be read that way. Files over ``max_bytes`` (about 25,000
    runs) are left to the background reader alone, so the parse never holds up the first paint
    for long [bytes]."""
    try:
        if text is None:
            p = Path(path)
            if p.stat().st_size > max_bytes:
                return None
            text = p.read_text(encoding="utf-8-sig")
        elif len(text) > max_bytes:
            return None
        data = parse_toml(text)
    except (OSError, ValueError, RecursionError):  # the real reader says what is wrong
        return None
    runs = data.get("run")
    sources = data.get("source")
    if not isinstance(runs, list):
        return None
    fed_kinds = ({s.get("id"): shown(str(s.get("kind") or "panel")) for s in sources
                  if isinstance(s, dict)}
                 if isinstance(sources, list) else {})
    rows = []
    for r in runs:
        if not isinstance(r, dict):
            return None
        # not checked yet: shown as plain text, control characters escaped (plain_text)
        rid, frm, to = (shown(str(r.get(k, ""))) for k in ("id", "from", "to"))
        cells = (rid, frm, to, _feet(r.get("length", "")), _load(r.get("load"), fed_kinds.get(to)),
                 "", "", "", "", "", SIZING)
        rows.append(SheetRow(rid, cells, False, {}, "", frm))
    return rows
