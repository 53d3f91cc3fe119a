"""Entry point from the command line: ``gaugewalk [FILE]`` opens the walk app.

Textual is imported only once the app is wanted (``open_app``), and after the head start's child
is forked (``gaugewalk.tui.app.headstart``): a fork belongs before Textual and its threads.
"""

from __future__ import annotations

import sys
from collections.abc import Callable
from pathlib import Path
from typing import TYPE_CHECKING

if TYPE_CHECKING:
    from gaugewalk.tui.app.app import WalkApp
    from gaugewalk.tui.app.headstart import HeadStart


def start(path: str | None) -> tuple[HeadStart | None, Callable[..., WalkApp]]:
    """What the app's process does first: the head start's child forked on ``path``, then
    Textual and the app imported with the collector held off and what they built left out of
    its later passes (they live until the process ends; the passes over them while they were
    built freed nothing). Returns the head start (None: none) and ``make_app``."""
    from gaugewalk.model.engine.collector import collector_held
    from gaugewalk.tui.app.headstart import HeadStart

    head_start = HeadStart.begin(path)   # sizing the walk while the app starts
    with collector_held(freeze=True):
        from gaugewalk.tui.app.app import make_app  # imports Textual
    return head_start, make_app


def open_app(path: str | None) -> int:
    """Run the app on ``path`` (None: offer recent walks and a new one); returns the exit
    status: 0 normally, 2 when the walk cannot be opened (the reason is printed on stderr)."""
    if path is not None and Path(path).expanduser().is_dir():
        print(f"gaugewalk: {path} is a folder; give a walk file (.toml)", file=sys.stderr)
        return 2
    head_start, make_app = start(path)
    app = make_app(path, head_start=head_start)
    try:
        app.run()
    finally:
        if head_start is not None:   # never left running, however the app ended
            head_start.stop()
    if app.exit_message:
        print(app.exit_message, file=sys.stderr)
    return int(app.return_code or 0)
