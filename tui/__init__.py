"""gaugewalk's terminal faces: the command line (``gaugewalk.tui.cli.main``) and the Textual app
(``gaugewalk.tui.app.app``)."""
