"""The ``gaugewalk`` command line.

``gaugewalk SUBCOMMAND ...`` runs a headless command; ``gaugewalk [FILE]`` opens the app.
Each subcommand lives in its own module exposing ``NAME``, ``HELP``, ``add_arguments(parser)``
and ``run(args) -> int``. ``COMMANDS`` names them with their help, so ``gaugewalk --help`` lists
every command without importing one, and a command's module (with pydantic and the walk model, for
the commands that read a walk) is imported only when that command runs. Textual is imported only
when the app is opened.

What a command writes may hold text from a walk, a lock file, a file name or the system: its
output and messages pass through ``gaugewalk.model.walk.plain_text.shown_lines`` on the way out,
so no control character reaches the terminal (a line break and a tab stay what they are).
A reader that stops early (``check --json | head``) ends the command quietly.
"""

import argparse
import contextlib
import gc
import importlib
import os
import sys
from typing import NamedTuple, NoReturn


class Command(NamedTuple):
    name: str
    module: str
    help: str


# Every subcommand, in the order ``gaugewalk --help`` lists them. ``name`` and ``help`` are the
# module's NAME and HELP (tests/cli/test_main_cli.py checks that they agree).
COMMANDS: tuple[Command, ...] = (
    Command("calc", "gaugewalk.tui.cli.calc",
            "Size one run: conductor, device, voltage drop, EGC and raceway."),
    Command("new", "gaugewalk.tui.cli.new",
            "Start a new walk file (refuses to write over an existing one)."),
    Command("source", "gaugewalk.tui.cli.source",
            "Add a service, switchboard, panel or transformer to a walk file."),
    Command("add", "gaugewalk.tui.cli.add",
            "Add a run to a walk file (same length grammar as 'calc')."),
    Command("place", "gaugewalk.tui.cli.place",
            "Write the breaker positions the tool picked into the walk file."),
    Command("raceway", "gaugewalk.tui.cli.raceway",
            "List a walk's shared raceways (fill, adjustment), or add one that runs can "
            "share."),
    Command("check", "gaugewalk.tui.cli.check",
            "Check a walk file and compute every run (exit 0 all within limits, 1 not, "
            "2 invalid)."),
    Command("merge", "gaugewalk.tui.cli.merge",
            "Merge two walk files by run, source and raceway id; conflicts stop the merge unless "
            "--prefer."),
    Command("unlock", "gaugewalk.tui.cli.unlock",
            "Clear a walk's stale or broken lock (never one a running gaugewalk holds)."),
    Command("schema", "gaugewalk.tui.cli.schema",
            "Print the JSON Schema of walk files (for editor completion and checks)."),
    Command("takeoff", "gaugewalk.tui.cli.takeoff",
            "List the order, cut lists, raceway and fittings a walk needs (rough takeoff)."),
    Command("report", "gaugewalk.tui.cli.report",
            "Write a printable report of a walk (HTML or Markdown, by the extension of -o)."),
)

CAUTION = (
    "Results are estimates for planning. The installation must follow the code in force and the "
    "authority having jurisdiction, and be designed and checked by qualified, licensed people."
)


class UsageError(Exception):
    """A user mistake on the command line: printed as one line, exit status 2."""


class _Formatter(argparse.HelpFormatter):
    """argparse's help formatter, asking the terminal for its width only when it lays out a help
    or usage text. argparse makes a formatter for every option added, and each asked ``shutil``
    for the width as it was made: that import (with ``zlib``, ``bz2`` and ``lzma``) cost every
    command about 1.5 ms for help that is seldom shown. The width is worked out as
    ``argparse.HelpFormatter`` works it out (Python 3.11)."""

    def __init__(self, prog: str, indent_increment: int = 2, max_help_position: int = 24,
                 width: int | None = None) -> None:
        super().__init__(prog, indent_increment, max_help_position, width=max_help_position + 20)
        self._asked = (max_help_position, width)

    def format_help(self) -> str:
        max_help_position, width = self._asked
        if width is None:
            import shutil

            width = shutil.get_terminal_size().columns - 2
        self._width = width
        self._max_help_position = min(max_help_position,
                                      max(width - 20, self._indent_increment * 2))
        return super().format_help()


class _Parser(argparse.ArgumentParser):
    def __init__(self, *args, **kwargs) -> None:
        kwargs.setdefault("formatter_class", _Formatter)
        super().__init__(*args, **kwargs)

    def error(self, message: str) -> NoReturn:  # argparse would print usage and exit 2 itself
        raise UsageError(f"{self.prog}: {message}")


def build_parser(chosen: str | None = None) -> argparse.ArgumentParser:
    """The parser: every command listed with its help; or, with ``chosen`` a command's name, that
    command alone, its module imported, its options added and its ``run`` set (the others would
    only be listed, by a help that is not asked for: each costs its own parser)."""
    parser = _Parser(
        prog="gaugewalk",
        description="Record a site walk of electrical runs and size them. "
        "'gaugewalk FILE' opens the app on a walk; the subcommands below work headless.",
        epilog=CAUTION,
    )
    # prog given: argparse would lay out a usage line to find it (``gaugewalk``, the same)
    subparsers = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser,
                                       prog=parser.prog)
    named = [c for c in COMMANDS if c.name == chosen]
    for command in named or COMMANDS:
        sub = subparsers.add_parser(command.name, help=command.help, description=command.help,
                                    epilog=CAUTION)
        if command.name == chosen:
            module = _import_quietly(command.module)
            module.add_arguments(sub)
            sub.set_defaults(_run=module.run)
    return parser


def _import_quietly(name: str):
    """Import a command's module with the cyclic garbage collector held off, then leave what the
    import built out of the collector's passes (``gc.freeze``) until ``main`` ends: the classes,
    pydantic schemas and tables a command imports live as long as it runs, and passes over them
    while they were built cost time and freed next to nothing."""
    from gaugewalk.model.engine.collector import collector_held

    with collector_held(freeze=True):
        return importlib.import_module(name)


def main(argv: list[str] | None = None) -> int:
    """Run ``gaugewalk ARGV``; None: the process's own arguments, as the installed command and
    ``python -m`` run it, the process ending when this returns. A headless command's process
    holds the cyclic collector off for the whole command and ends at once when the command is
    done and its output flushed (``_end_now``), without the interpreter's shutdown: the
    collector's passes and that shutdown would only go over what the process is about to give
    back whole (about 25 ms of the 195 ms of a ``gaugewalk check`` once, 1.4 ms of passes
    during it). Nothing of gaugewalk's waits on a collection (no ``__del__``; locks and files are
    released by ``with`` before then). Called in process (the tests), the collector is as it
    was, and what the command's imports froze (``_import_quietly``) is given back to it."""
    program = argv is None
    argv = list(sys.argv[1:] if argv is None else argv)
    names = {command.name for command in COMMANDS}
    try:
        if argv and (argv[0] in names or argv[0] in {"-h", "--help"}):
            if program:
                gc.disable()   # the process ends with the command, never enabled again
            with _plain_output():
                try:
                    args = build_parser(argv[0]).parse_args(argv)
                    code = int(args._run(args) or 0)
                finally:
                    if not program:   # a caller that goes on (the tests) gets them back
                        gc.unfreeze()
            if program:
                _end_now(code)
            return code
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


def _end_now(code: int) -> None:
    """End a headless command's process with ``code`` once its output is flushed, without the
    interpreter's shutdown, which only takes apart every module and object the command left
    (about 3 ms of a ``gaugewalk check`` here). Nothing is left to finish by then: the commands
    write their files and release their locks inside ``with`` blocks before they return, start
    no thread and register nothing to run at exit (Textual, which does, is only imported for the
    app). A reader gone before the flush (``BrokenPipeError``) leaves the ending to ``main``."""
    sys.stdout.flush()
    sys.stderr.flush()
    os._exit(code)


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
