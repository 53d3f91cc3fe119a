"""The ``gaugewalk`` command line.

``gaugewalk SUBCOMMAND ...`` runs a headless command; ``gaugewalk [FILE]`` opens the app.
Each subcommand lives in its own module exposing ``NAME``, ``HELP``, ``add_arguments(parser)``
and ``run(args) -> int``. Textual is imported only when the app is opened, so headless commands
start fast.

What a command writes may hold text from a walk, a lock file, a file name or the system: its
output and messages pass through ``gaugewalk.model.walk.plain_text.shown_lines`` on the way out,
so no control character reaches the terminal (a line break and a tab stay what they are).
A reader that stops early (``check --json | head``) ends the command quietly.
"""

from __future__ import annotations

import argparse
import contextlib
import importlib
import os
import sys
from typing import NoReturn

# Subcommand modules, in the order ``gaugewalk --help`` lists them.
COMMAND_MODULES: tuple[str, ...] = (
    "gaugewalk.tui.cli.calc",
    "gaugewalk.tui.cli.new",
    "gaugewalk.tui.cli.source",
    "gaugewalk.tui.cli.add",
    "gaugewalk.tui.cli.place",
    "gaugewalk.tui.cli.check",
    "gaugewalk.tui.cli.merge",
    "gaugewalk.tui.cli.unlock",
    "gaugewalk.tui.cli.schema",
    "gaugewalk.tui.cli.takeoff",
    "gaugewalk.tui.cli.report",
)

CAUTION = (
    "Results are estimates for planning. The installation must follow the code in force and the "
    "authority having jurisdiction, and be designed and checked by qualified, licensed people."
)


class UsageError(Exception):
    """A user mistake on the command line: printed as one line, exit status 2."""


class _Parser(argparse.ArgumentParser):
    def error(self, message: str) -> NoReturn:  # argparse would print usage and exit 2 itself
        raise UsageError(f"{self.prog}: {message}")


def build_parser() -> argparse.ArgumentParser:
    parser = _Parser(
        prog="gaugewalk",
        description="Record a site walk of electrical runs and size them. "
        "'gaugewalk FILE' opens the app on a walk; the subcommands below work headless.",
        epilog=CAUTION,
    )
    subparsers = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)
    for module_name in COMMAND_MODULES:
        module = importlib.import_module(module_name)
        sub = subparsers.add_parser(module.NAME, help=module.HELP, description=module.HELP,
                                    epilog=CAUTION)
        module.add_arguments(sub)
        sub.set_defaults(_run=module.run)
    return parser


def _command_names() -> set[str]:
    return {importlib.import_module(m).NAME for m in COMMAND_MODULES}


def main(argv: list[str] | None = None) -> int:
    argv = list(sys.argv[1:] if argv is None else argv)
    try:
        if argv and (argv[0] in _command_names() or argv[0] in {"-h", "--help"}):
            with _plain_output():
                args = build_parser().parse_args(argv)
                return int(args._run(args) or 0)
        return _open_app(argv)
    except UsageError as exc:
        print(str(exc), file=sys.stderr)
        return 2
    except BrokenPipeError:  # the reader stopped early (``check --json | head``): not an error
        _quiet_stdout()
        return 0


class _PlainStream:
    """A text stream that writes ``shown_lines(text)`` to the stream it wraps."""

    def __init__(self, stream) -> None:
        self._stream = stream

    def write(self, text: str) -> int:
        from gaugewalk.model.walk.plain_text import shown_lines

        self._stream.write(shown_lines(text))
        return len(text)

    def __getattr__(self, name: str):
        return getattr(self._stream, name)


@contextlib.contextmanager
def _plain_output():
    """While a command runs, its standard output and error are plain text (see above)."""
    out, err = sys.stdout, sys.stderr
    sys.stdout, sys.stderr = _PlainStream(out), _PlainStream(err)
    try:
        yield
    finally:
        sys.stdout, sys.stderr = out, err


def _quiet_stdout() -> None:
    """Point standard output at /dev/null, so Python's flush at exit does not fail again on the
    closed pipe (the way the Python documentation gives for SIGPIPE)."""
    try:
        devnull = os.open(os.devnull, os.O_WRONLY)
        os.dup2(devnull, sys.stdout.fileno())
        os.close(devnull)
    except (OSError, ValueError):  # no real file behind sys.stdout (a test's StringIO)
        pass


def _open_app(argv: list[str]) -> int:
    if len(argv) > 1 or (argv and argv[0].startswith("-")):
        raise UsageError(
            "gaugewalk: expected a walk file or a command; try 'gaugewalk --help'"
        )
    from gaugewalk.tui.app.launch import open_app  # imports Textual: only here

    return open_app(argv[0] if argv else None)


if __name__ == "__main__":
    sys.exit(main())
