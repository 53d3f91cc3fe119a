"""The app opened as the command line opens it, with the head start's child forked first, in a
process of its own (a fork belongs at the start of a process with one thread, never in a test
worker): ``python -m tests.support.head_start_app WALK CONFIG [--stop]`` prints one JSON line.

``--stop``: the child dies at once, before it writes a row (as if it had died), and is ended
and reaped before the app starts; it is made to die rather than killed from here, because on a
busy machine a child killed at once could still have written its first part. The app's own reading
waits for the child's rows (``keeping_pace``, ``HEAD_START_WAIT_S``), so the outcome is the
same on a busy machine. The line says how the walk opened: ``kept`` (the sheet kept the head
start's rows), ``same`` (the sheet's rows are those the app makes from its own reading,
``all_rows``), ``parts`` (head-start parts shown), ``code`` and ``message`` (the app's exit),
``reaped`` (no child left behind).
"""

from __future__ import annotations

import asyncio
import json
import os
import sys
from pathlib import Path


def _dies_at_once(fd: int, path: str, raw: bytes) -> None:
    """The child of ``--stop``: out before it reads the walk, no row written."""
    os._exit(1)


def main(argv: list[str]) -> int:
    from gaugewalk.tui.app.launch import start

    path, config = argv[0], Path(argv[1])
    if "--stop" in argv:
        from gaugewalk.tui.app import headstart

        headstart._child = _dies_at_once   # looked up when the child is forked
    head, make_app = start(path)   # as the command line starts the app
    if head is None:
        print(json.dumps({"head_start": False}))
        return 0
    if "--stop" in argv:
        head.stop()
    from gaugewalk.tui.app import app as app_module
    from gaugewalk.tui.app.screens.walk import WalkScreen
    from gaugewalk.tui.app.sheet.rows import all_rows
    from gaugewalk.tui.app.widgets.runsheet import RunSheet
    from tests.support.app_helpers import opened

    out: dict = {"head_start": True}
    # the app's own reading waits for the child's rows however busy the machine is, so what is
    # shown does not depend on which of the two processes is first
    app_module.HEAD_START_WAIT_S = 600.0
    head.keeping_pace = lambda wait=0.0: True   # type: ignore[method-assign]

    async def run() -> None:
        app = make_app(path, config_dir=config, head_start=head)
        async with app.run_test(size=(80, 24)) as pilot:
            await opened(app, pilot)
            screen = app.screen
            if isinstance(screen, WalkScreen) and app.session is not None:
                out["kept"] = screen.head_start_kept
                out["parts"] = len(screen._head_parts)
                out["same"] = screen.query_one(RunSheet).rows == all_rows(app.session)
            await pilot.press("ctrl+q")
        out["code"] = app.return_code
        out["message"] = app.exit_message

    asyncio.run(run())
    try:
        os.waitpid(head._pid, os.WNOHANG)
        out["reaped"] = False
    except ChildProcessError:
        out["reaped"] = True
    print(json.dumps(out))
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
