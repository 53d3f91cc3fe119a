"""Entry point from the command line: ``gaugewalk [FILE]`` opens the walk app.

Textual is imported only once the app is wanted (``open_app``), and after the head start's child
is forked (``gaugewalk.tui.app.headstart``): a fork belongs before Textual and its threads.
"""

from __future__ import annotations

import sys
from pathlib import Path


def open_app(path: str | None) -> int:
    """Run the app on ``path`` (None: offer recent walks and a new one); returns the exit
    status: 0 normally, 2 when the walk cannot be opened (the reason is printed on stderr)."""
    if path is not None and Path(path).expanduser().is_dir():
        print(f"gaugewalk: {path} is a folder; give a walk file (.toml)", file=sys.stderr)
        return 2
    from gaugewalk.tui.app.headstart import HeadStart

    head_start = HeadStart.begin(path)   # sizing the walk while the app starts
    from gaugewalk.tui.app.app import make_app  # imports Textual

    app = make_app(path, head_start=head_start)
    try:
        app.run()
    finally:
        if head_start is not None:   # never left running, however the app ended
            head_start.stop()
    if app.exit_message:
        print(app.exit_message, file=sys.stderr)
    return int(app.return_code or 0)
