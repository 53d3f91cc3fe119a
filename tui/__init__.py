"""gaugewalk's terminal faces: the command line (``tui.cli``) and the Textual app (``tui.app``)."""
