"""gaugewalk's job model, calculations and file I/O. Never imports Textual."""
