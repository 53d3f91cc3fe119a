"""The walk app: one factory (``make_app``) builds it for the command line and for the tests.

The app object holds the open walk (a ``WalkSession``); the walk screen shows it in three views
(run sheet, supply tree, footage) and opens the run card, the job settings and the trial change.
"""

from __future__ import annotations

import gc
import os
import sys
import threading
from pathlib import Path
from typing import TYPE_CHECKING

from textual import events, work
from textual.app import App
from textual.message import Message

from gaugewalk.model.walk.plain_text import shown, shown_lines
from gaugewalk.tui.app.keyorder import deliver_in_order
from gaugewalk.tui.app.keys import bindings_for

if TYPE_CHECKING:  # the model (pydantic) is imported while the first screen is already up
    from textual.screen import Screen

    from gaugewalk.model.session.session import WalkSession
    from gaugewalk.tui.app.headstart import HeadStart
    from gaugewalk.tui.app.recent import RecentWalks
    from gaugewalk.tui.app.screens.walk import WalkScreen
    from gaugewalk.tui.app.sheet.shape import SheetRow


SIZE_BEFORE_SHOWING = 20_000
"""A walk of up to this many runs is sized before its rows take the place of the runs as written
(a few tenths of a second at most); a bigger one's rows come first, sized behind [runs]."""


FIRST_PAINT_WAIT_S = 2.0
"""Longest the walk's reading waits for the first paint of its runs as written [s]."""

SWITCH_S = 0.0005
"""The interpreter's switch interval once a walk is open (``sys.setswitchinterval``; Python's own
is 5 ms) [s]: how long a thread that wants the interpreter waits before the thread that has it
is asked to hand it over. The walk's writer thread (``WalkSession.save_behind``) gives the
interpreter up at each call to the disk (about fifteen in a save); with 5 ms it waited that long
to take it back after each one while the event loop was drawing the stored run, and the file
landed long after the row was shown."""

HEAD_START_WAIT_S = 0.5
"""Longest the walk's reading then waits for the head start's rows on screen, when the head start
keeps pace (``HeadStart.keeping_pace``) [s]: the reading would take turns with the event loop
that shows them (they come about 0.15 s after the first paint at 5,000 runs here; at tens of
thousands of runs, seconds). A head start far behind (a busy machine) is not waited for."""

HEAD_START_IMPORT_WAIT_S = 0.05
"""Longest the walk's reading waits, after the first paint, for the head start to say it has
imported the model (``HeadStart.keeping_pace``) [s]. With a processor free for it the child has
imported the model by about the first paint; on the sample walk the paint can come first by a
few milliseconds, and then the reading would import the model itself, taking turns with the
event loop as the head start's rows come. A child that has not imported it by then is far
behind (a busy machine), and the app reads and sizes the walk itself."""


def light_terminal() -> bool:
    """Guess a light terminal from ``COLORFGBG`` ("fg;bg", bg 7 or 15 is light)."""
    value = os.environ.get("COLORFGBG", "")
    bg = value.rsplit(";", 1)[-1] if value else ""
    return bg in {"7", "15"}


class WalkApp(App[int]):
    """gaugewalk's app. ``path`` is the walk to open (None: offer recent walks); ``head_start``
    the child sizing it since the process began (``gaugewalk.tui.app.headstart``), if any."""

    CSS_PATH = "app.tcss"
    TITLE = "gaugewalk"
    BINDINGS = bindings_for("app")
    ENABLE_COMMAND_PALETTE = False

    def __init__(self, path: str | None = None, *, config_dir: Path | None = None,
                 head_start: HeadStart | None = None) -> None:
        super().__init__()
        self.start_path = path
        self.head_start = head_start if head_start is not None and head_start.path == path else None
        self._config_dir = config_dir
        self._recent: RecentWalks | None = None   # read when first asked for (``recent``)
        self._switch_before: float | None = None   # the switch interval before ``_show``
        self.session: WalkSession | None = None
        self.exit_message: str | None = None
        self._collector_held: bool | None = None   # see _hold_collector
        self._froze = False
        self._opening: tuple[str, threading.Event] | None = None   # _walk_screen's
        self.theme = "textual-light" if light_terminal() else "textual-dark"

    @property
    def recent(self) -> RecentWalks:
        """The walks opened lately and whether the caution was shown, read when first asked for:
        opening a walk, once it is open (its JSON, the module and its atomic writer are not part
        of the first paint)."""
        if self._recent is None:
            from gaugewalk.tui.app.recent import RecentWalks

            self._recent = RecentWalks.load(self._config_dir)
        return self._recent

    async def on_event(self, event: events.Event) -> None:
        """A key or a paste for a screen of fields is applied at once, in the order it came
        (``gaugewalk.tui.app.keyorder``); everything else goes Textual's way."""
        if isinstance(event, (events.Key, events.Paste)) and not event.is_forwarded:
            if await deliver_in_order(self, event):
                return
        await super().on_event(event)

    # ----- opening ----------------------------------------------------------------------
    def get_default_screen(self) -> Screen:
        """The walk file given at the start is the first screen (its runs as written: the
        first paint is the walk screen's, with no empty screen made, drawn and replaced before
        it); otherwise Textual's empty screen, under the start screen or a message."""
        path = self.start_path
        if path is not None and Path(path).expanduser().is_file():
            return self._walk_screen(path)
        return super().get_default_screen()

    def on_mount(self) -> None:
        if self.start_path is None:
            from gaugewalk.tui.app.screens.start import StartScreen

            self.push_screen(StartScreen(self.recent.paths), self._picked)
        elif self._opening is not None:   # the walk screen is up already (``get_default_screen``)
            self._open_behind(self.start_path)
        else:
            self.open_path(self.start_path)

    def _picked(self, choice: tuple[str, str] | None) -> None:
        if choice is None:
            self.exit(0)
            return
        kind, path = choice
        if kind == "new":
            self._ask_create(path, missing=False)
        else:
            self.open_path(path)

    def open_path(self, path: str) -> None:
        p = Path(path).expanduser()
        if p.is_dir():
            self.fail_exit(f"{path} is a folder; give a walk file (.toml)")
            return
        if not p.exists():
            self._ask_create(str(p), missing=True)
            return
        self.push_screen(self._walk_screen(path))
        self._open_behind(path)

    def _walk_screen(self, path: str) -> WalkScreen:
        """The walk screen of ``path`` with its runs as written (the bytes the head start read,
        if there is one: it sends the sized rows meanwhile, ``_take_head_start``); the walk is
        read, checked and sized behind them (``_open_behind``)."""
        from gaugewalk.tui.app.screens.walk import WalkScreen
        from gaugewalk.tui.app.sheet.rawrows import raw_rows

        p = Path(path).expanduser()
        self.title = p.name
        self.sub_title = "opening…"
        self._hold_collector()
        head = self.head_start if path == self.start_path else None
        text = head.text() if head is not None else None
        shown = threading.Event()
        self._opening = (path, shown)
        return WalkScreen(None, raw_rows(p, text=text), when_shown=shown.set)

    def _open_behind(self, path: str) -> None:
        """The walk on the screen ``_walk_screen`` made read, checked and sized (``_load``),
        then attached (``_show``); the head start's rows shown meanwhile."""
        opening, self._opening = self._opening, None
        if opening is None or opening[0] != path:
            raise RuntimeError(f"no walk screen was made for {path}")   # a bug, not the user's
        shown = opening[1]
        sized = threading.Event()
        head = self.head_start if path == self.start_path else None
        if head is not None:
            self._take_head_start(head, sized)
        else:
            sized.set()
        self._load(str(Path(path).expanduser()), shown, sized, head)

    @work(thread=True, group="head-start")
    def _take_head_start(self, head: HeadStart, sized: threading.Event) -> None:
        """The head start's rows onto the walk screen as they come (a thread: it waits);
        ``sized`` is set once the last of them are painted, or the child ended without."""
        painted = False
        try:
            for rows in head.parts():
                self.call_from_thread(self._head_rows, rows)
            self.call_from_thread(self.call_after_refresh, sized.set)
            painted = True
        finally:
            if not painted:   # the app ended meanwhile
                sized.set()

    def _head_rows(self, rows: list[SheetRow]) -> None:
        from gaugewalk.tui.app.screens.walk import WalkScreen

        head = self.head_start
        for screen in self.screen_stack:
            if not isinstance(screen, WalkScreen):
                continue
            if screen.attached:   # read already (not sized yet): only rows of the bytes it read
                known = screen.session.hold.fingerprint
                if head is None or known is None or not known.holds(head.raw):
                    continue
            screen.show_head_start(rows)

    @work(thread=True, exclusive=True, group="open")
    def _load(self, path: str, shown: threading.Event, sized: threading.Event,
              head: HeadStart | None) -> None:
        # not before the runs as written are on screen (``shown``), nor the rows of a head
        # start that keeps pace (``sized``): the thread would take turns with the event loop,
        # which paints them
        shown.wait(FIRST_PAINT_WAIT_S)
        if head is not None and head.keeping_pace(HEAD_START_IMPORT_WAIT_S):
            sized.wait(HEAD_START_WAIT_S)
        from gaugewalk.model.session.session import WalkSession
        from gaugewalk.model.walkfile.read import WalkFileError

        try:
            session = WalkSession.open(path, compute=False)
        except (WalkFileError, OSError, UnicodeDecodeError) as exc:
            self.call_from_thread(self._failed, path, exc)
            return
        session.busy = True
        said = session.take_lock()
        # the runs as written are on screen meanwhile (raw_rows); a walk of up to
        # SIZE_BEFORE_SHOWING runs is sized here first, so its sheet is built once, sized
        size_first = len(session.job.runs) <= SIZE_BEFORE_SHOWING
        rows = None
        if size_first:
            from gaugewalk.tui.app.sheet.rows import all_rows  # off the event loop

            try:
                session.recompute()
            finally:
                session.busy = False
            if self.head_start is not None:   # to compare with the head start's (``attach``)
                rows = all_rows(session)
        if rows is None:
            self.call_from_thread(self._show, session)
        else:
            self.call_from_thread(self._show, session, rows)
        if said:
            self.call_from_thread(self.notify, said, severity="warning", timeout=12)
        comments = session.comment_warning()
        if comments:
            self.call_from_thread(self.notify, comments, severity="warning", timeout=15)
        if not size_first:  # sized once the walk screen is up: typing can start meanwhile
            self.call_from_thread(self.call_after_refresh, self._size_walk, session)

    @work(thread=True, exclusive=True, group="size")
    def _size_walk(self, session: WalkSession) -> None:
        try:
            session.recompute()
        finally:
            session.busy = False
        self.call_from_thread(self._computed)

    def _computed(self) -> None:
        from gaugewalk.tui.app.screens.walk import WalkScreen

        for screen in self.screen_stack:
            if isinstance(screen, WalkScreen):
                screen.reload()

    # ----- saving behind the editing ----------------------------------------------------
    class SavedBehind(Message):
        """The session's writer thread finished a save (``WalkSession.save_behind``)."""

    @work(thread=True, group="warm")
    def _warm_save(self, session: WalkSession) -> None:
        """Once the walk is on screen: the runs' texts made ahead of the first save."""
        session.warm_save()

    def _saved_behind(self) -> None:
        """Called in the writer thread: the rest happens on the app's own (post_message is
        thread-safe and never waits, so a quit waiting for the writer cannot deadlock)."""
        self.post_message(self.SavedBehind())

    def on_walk_app_saved_behind(self, _message: SavedBehind) -> None:
        """Say how the saves went once the last one asked for is done: a failure stays in the
        title until a save succeeds (and the stored card's draft stays beside the walk)."""
        s = self.session
        if s is None or s.writing:
            return  # a newer save is on its way; it will say how it went
        s.after_save()   # here, not in the writer: a change on disk is merged in on this thread
        from gaugewalk.tui.app.screens.walk import WalkScreen

        for screen in self.screen_stack:   # a change on disk taken in: the sheet shows it
            if isinstance(screen, WalkScreen) and screen.shown_version != s.version:
                screen.reload()
        self.refresh_title()
        state = s.state
        if not state.saved:
            self.notify(f"NOT SAVED: {state.message}", severity="error", timeout=10)
        elif state.notice:
            self.notify(str(state.notice), timeout=10)

    def _failed(self, path: str, exc: Exception) -> None:
        problems = getattr(exc, "problems", None)
        if problems:
            lines = [str(p) for p in problems]
            more = f" (and {len(lines) - 1} more; 'gaugewalk check {path}' lists them all)" if len(lines) > 1 else ""
            text = lines[0] + more
        else:
            text = str(exc)
        if not text.startswith(str(path)) and str(Path(path).name) not in text:
            text = f"{path}: {text}"
        self.fail_exit(text)

    def _ask_create(self, path: str, missing: bool) -> None:
        from gaugewalk.tui.app.screens.start import NewWalkScreen

        def answer(details: dict | None) -> None:
            if details is None:
                if missing:
                    self.exit(0)
                else:
                    self.on_mount()
                return
            self._create(path, details)

        self.push_screen(NewWalkScreen(path, missing=missing), answer)

    def _create(self, path: str, details: dict) -> None:
        from gaugewalk.model.session.session import WalkSession

        try:
            session = WalkSession.create(path, **details)
        except OSError as exc:
            self.fail_exit(f"cannot create {path}: {exc.strerror or exc}")
            return
        if not session.state.saved:
            self.fail_exit(str(session.state.message))
            return
        said = session.take_lock()
        if said:
            self.notify(said, severity="warning", timeout=12)
        self._show(session)

    def on_app_focus(self, event: events.AppFocus) -> None:
        """Back in the terminal: the walk may have been changed on disk meanwhile."""
        look = getattr(self.screen, "look_at_disk", None)
        if look is not None:
            look()

    def on_unmount(self) -> None:
        if self.head_start is not None:
            self.head_start.stop()
        self._release_collector()
        if self._switch_before is not None:   # the process's own again (``SWITCH_S``)
            sys.setswitchinterval(self._switch_before)
            self._switch_before = None
        if self._froze:   # a process that goes on (the tests) collects them as before
            gc.unfreeze()
            self._froze = False
        if self.session is not None:
            left = self.session.release_lock()
            if left and not self.exit_message:  # said on stderr after the app has gone
                self.exit_message = f"gaugewalk: {shown(self.session.path.name)}: {left}"

    def _show(self, session: WalkSession, rows: list[SheetRow] | None = None) -> None:
        """The walk open: attached to the walk screen that shows it as written (``rows``: its
        sheet's rows, made in the reading thread), else on a new one."""
        from gaugewalk.tui.app.screens.walk import WalkScreen

        self.session = session
        session.save_behind(self._saved_behind)  # storing a run never waits for the disk
        if self._switch_before is None:   # the writer takes turns with the event loop
            self._switch_before = sys.getswitchinterval()
            sys.setswitchinterval(SWITCH_S)
        if not session.read_only:
            self.call_after_refresh(self._warm_save, session)
        # written (and fsynced) once the walk is on screen, not before
        self.call_after_refresh(self.recent.remember, session.path)
        opening = next((s for s in self.screen_stack
                        if isinstance(s, WalkScreen) and not s.attached), None)
        if opening is not None:
            if rows is None:
                opening.attach(session)   # its rows made again in place, sized
            else:
                opening.attach(session, rows)
        else:
            self.push_screen(WalkScreen(session))
        self.refresh_title()
        if not self.recent.caution_seen:
            from gaugewalk.tui.app.screens.info import AboutScreen

            self.push_screen(AboutScreen(first_start=True))
            self.recent.mark_caution_seen()
        self._release_collector(freeze=True)

    def _hold_collector(self) -> None:
        """Hold the cyclic garbage collector off while a walk opens (its screen built, the model
        imported, the walk read, checked and sized) until it is attached (``_show``) or the app
        fails or ends: what is built then lives while the walk is open, and the collector's
        passes over it while it was built freed next to nothing (about 25 ms of the ~140 ms
        from the first paint to the sized rows on the 384-run sample walk, 40 ms at 5,000
        runs). Nothing of gaugewalk's waits on a collection (no ``__del__``)."""
        if self._collector_held is None:
            self._collector_held = gc.isenabled()
            gc.disable()

    def _release_collector(self, freeze: bool = False) -> None:
        """The collector as it was before ``_hold_collector``. With ``freeze`` (the walk is
        attached) what the opening built is left out of the collector's later passes
        (``gc.freeze``): the modules, classes, schemas and the walk live as long as the app, and
        a full pass over them (about 60-90 ms at 5,000 runs here) would otherwise stall the
        event loop now and then while the walk is edited. It opened with the collector off, so
        next to no garbage is frozen with them (about a hundred objects at 5,000 runs); the app
        gives them back to the collector when it ends (``on_unmount``)."""
        if self._collector_held is not None and freeze and not self._froze:
            gc.freeze()
            self._froze = True
        if self._collector_held:
            gc.enable()
        self._collector_held = None

    def freeze_built(self) -> None:
        """Leave what the walk screen built once the walk was attached (its sized rows, the run
        card built ahead) out of the collector's later passes, as ``_release_collector`` does
        for the opening: they live while the walk is open, and the first full pass over them
        would otherwise stall a key on the card (about 17 ms at 5,000 runs). The young
        generations are collected first, so the garbage of that building is not kept."""
        gc.collect(1)
        gc.freeze()
        self._froze = True

    def fail_exit(self, text: str) -> None:
        """Leave with status 2; ``open_app`` prints ``text`` as one line on stderr."""
        self._release_collector()
        self.exit_message = "gaugewalk: " + shown(" ".join(text.split()))
        self.exit(2, return_code=2)

    def notify(self, message: str, *, title: str = "", severity="information",
               timeout: float | None = None, markup: bool = True) -> None:
        """Every notification is plain text (``gaugewalk.model.walk.plain_text``): what it says
        may come from a walk, a lock file or the system, so it is never markup, a link or an
        action (``markup`` is ignored) and its control characters are shown escaped."""
        super().notify(shown_lines(str(message)), title=shown(title), severity=severity,
                       timeout=timeout, markup=False)

    # ----- title ------------------------------------------------------------------------
    def refresh_title(self) -> None:
        s = self.session
        if s is None:
            return
        if s.read_only:
            state = "read-only"
        else:
            state = ("✓ saved" if s.state.saved
                     else "✗ NOT SAVED: changed on disk (ctrl+s)" if s.state.changed_outside
                     else "✗ NOT SAVED (ctrl+s retries)")
        self.title = f"{shown(s.path.name)} · {state}"
        self.sub_title = shown(s.job.job.name or s.path.stem)

    # ----- app-wide actions -------------------------------------------------------------
    def action_key_guide(self) -> None:
        from gaugewalk.tui.app.screens.info import KeyGuideScreen

        if not isinstance(self.screen, KeyGuideScreen):
            self.push_screen(KeyGuideScreen())

    def action_about(self) -> None:
        from gaugewalk.tui.app.screens.info import AboutScreen

        if not isinstance(self.screen, AboutScreen):
            self.push_screen(AboutScreen())

    def action_flip_theme(self) -> None:
        self.theme = "textual-light" if self.theme == "textual-dark" else "textual-dark"

    async def action_quit(self) -> None:
        """Quit; ask only when changes could not be saved. An unstored run card is not lost:
        it is kept beside the walk as it is typed and comes back with n next time."""
        s = self.session
        if s is not None:
            s.settle()  # every change asked to be saved is written (or failed) before leaving
        if s is not None and not s.read_only and not s.state.saved:
            s.save()   # one more try: a disk with room again, a change on disk that merges
            if not s.state.saved and s.state.kept is not None:
                name = s.path.name
                self.exit_message = shown(
                    f"gaugewalk: {name} was not saved: {s.state.message}. To join it back: "
                    f"gaugewalk merge {s.path} {s.state.kept} -o {s.path}")
        lose = s.lose_on_quit if s is not None and not s.read_only and not s.state.saved else None
        if not lose:
            self.exit(0)
            return

        def answer(yes: bool | None) -> None:
            if yes:
                self.exit(0)

        from gaugewalk.tui.app.screens.info import AskScreen

        self.push_screen(AskScreen(f"Quitting now loses {lose}. Quit anyway?", "quit", "stay"), answer)


def make_app(path: str | None = None, *, config_dir: Path | None = None,
             head_start: HeadStart | None = None) -> WalkApp:
    """The one way to build the app (command line and tests alike)."""
    return WalkApp(path, config_dir=config_dir, head_start=head_start)
