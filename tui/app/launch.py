"""Entry point from the command line: ``gaugewalk [FILE]`` opens the walk app.

Imported only when the app is wanted, because it imports Textual.
"""

from __future__ import annotations

import sys
from pathlib import Path

from gaugewalk.tui.app.app import make_app


def open_app(path: str | None) -> int:
    """Run the app on ``path`` (None: offer recent walks and a new one); returns the exit
    status: 0 normally, 2 when the walk cannot be opened (the reason is printed on stderr)."""
    if path is not None and Path(path).expanduser().is_dir():
        print(f"gaugewalk: {path} is a folder; give a walk file (.toml)", file=sys.stderr)
        return 2
    app = make_app(path)
    app.run()
    if app.exit_message:
        print(app.exit_message, file=sys.stderr)
    return int(app.return_code or 0)
