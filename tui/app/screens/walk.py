"""The walk screen: the run sheet, the supply tree and the footage tally of one open walk.

It is on screen from the app's first paint: the runs as written (``sheet.rawrows``) while the walk
is read, checked and sized behind it, then, once the session is attached (``attach``), the sized
rows in place of those. So this module imports no model at the top (the model loads behind the
first paint), and the views other than the run sheet are made when first shown.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Callable

from textual import events, on
from textual.app import ComposeResult
from textual.containers import ScrollableContainer
from textual.screen import Screen
from textual.widget import Widget
from textual.widgets import Input, Static

from gaugewalk.tui.app.keyorder import BoundInOrder
from gaugewalk.tui.app.keys import bindings_for
from gaugewalk.tui.app.plain import escape
from gaugewalk.tui.app.sheet.columns import COLUMNS, SORT_KEYS
from gaugewalk.tui.app.widgets.runsheet import RunSheet, SheetHeading, SheetRow
from gaugewalk.tui.app.widgets.titleline import TitleLine

if TYPE_CHECKING:  # the model loads behind the first paint
    from gaugewalk.model.session.session import WalkSession
    from gaugewalk.tui.app.screens.card import RunCard
    from gaugewalk.tui.app.widgets.views import SupplyTree

VIEWS = ("runs", "tree", "footage", "boards")
RUN_VIEW = ("#sheet-heading", "#sheet", "#detail")
"""The widgets of the run sheet's view (the other views are one widget each, ``#tree``...)."""


# actions of keys that open another screen (priority bindings in gaugewalk.tui.app.keys)
_OPENERS = {"new_run", "edit_run", "choose", "trial", "job_settings"}
VIEW_TITLES = {"runs": "1 Runs", "tree": "2 Supply tree", "footage": "3 Footage",
               "boards": "4 Boards"}
DISK_LOOK_S = 2.0
"""How often the walk screen looks whether its file changed on disk [s]."""
FINISH_AFTER_S = 0.25
"""Longest the key line and the find box wait for the sized rows after the walk screen is up
(``WalkScreen._finish_soon``) [s]."""
CARD_AHEAD_S = 0.05
"""How long the app must have waited for a key before the run card is built ahead of its first
open, each step of it (``WalkScreen._card_ahead``) [s]."""


class WalkScreen(BoundInOrder, Screen):
    """One open walk; ``session`` None while it is being opened (``rows``: the runs as written,
    shown meanwhile; ``when_shown`` is called once they are on screen), then ``attach``."""

    BINDINGS = bindings_for("walk")

    def __init__(self, session: WalkSession | None, rows: list[SheetRow] | None = None,
                 when_shown: Callable[[], None] | None = None) -> None:
        super().__init__()
        self._session = session
        self._raw_rows = rows
        self._when_shown = when_shown
        self.view = "runs"
        self.problems_only = False
        self.source_filter: str | None = None
        self._tree_stale = True
        self._footage_stale = True
        self._boards_stale = True
        self._told_outside = False   # a change on disk was said (once) while changes here wait
        self._shown = -1   # the session's ``version`` the sheet shows
        self._bar_text: str | None = None   # the view bar's text now
        self._card: RunCard | None = None   # the run card, once made (``open_card``, ``_card_ahead``)
        self._card_ahead_on = False   # a step of building the card ahead is waiting
        self._restyle = False   # the theme changed while another screen was on top
        self._sheet_up = False   # the runs as written are in the sheet (``on_mount``)
        self._head_parts: list[list[SheetRow]] = []   # the head start's rows come so far
        self._head: list[SheetRow] | None = None   # all of them, once shown as the sheet
        self._finishing = False   # the key line and the find box are asked for (``_finish_soon``)
        self.head_start_kept = False   # attached with the head start's rows (equal to its own)

    def compose(self) -> ComposeResult:
        yield TitleLine()
        yield Static("", id="view-bar")
        # the find box and the key line come after the first sized rows (``_finish_soon``)
        # the run sheet's view: the screen's own children, not in containers (two widgets
        # fewer to mount, style and lay out before the first paint: about 3 ms of it here)
        sheet = RunSheet(COLUMNS, id="sheet")
        yield SheetHeading(sheet, id="sheet-heading")
        yield sheet
        yield Static("", id="detail")
        # the other views are made when first shown (``action_show_view``)

    def on_mount(self) -> None:
        if self._session is None:
            self.query_one(RunSheet).set_rows(self._raw_rows or [])
            self._sheet_up = True
            self._bar()
            self.query_one("#detail", Static).update(
                "Reading, checking and sizing the walk; the runs are shown as written meanwhile.",
                layout=False)
            if self._head_parts:   # the head start's rows came before the screen was up
                self._show_head_parts()
            if self._when_shown is not None:
                self.call_after_refresh(self._when_shown)
        else:
            self.reload()
        self._raw_rows = None
        self.set_focus(self.query_one(RunSheet))
        self.set_interval(DISK_LOOK_S, self.look_at_disk)
        self.app.theme_changed_signal.subscribe(self, self._theme_changed)
        if self._session is None:   # opening: once its sized rows are shown, or in a moment
            self.set_timer(FINISH_AFTER_S, self._finish_soon)
        else:
            self._finish_soon()

    def _finish_soon(self) -> None:
        """``_finish`` once the screen is painted, the first time it is asked: when the sheet
        shows the head start's sized rows or the walk is attached (the walk's keys work from
        then), or ``FINISH_AFTER_S`` after the screen came up, whichever is first."""
        if not self._finishing:
            self._finishing = True
            self.call_after_refresh(self._finish)

    async def _finish(self) -> None:
        """What the first paints do without: the key line (its keys follow the focus; they are
        made after it is mounted) and the find box. Built between the runs as written and the
        sized rows, they held the sized rows back by their building (about 15 ms here)."""
        from gaugewalk.tui.app.widgets.keyfooter import KeyFooter

        if self.is_attached and not self.query(KeyFooter):
            await self.mount(KeyFooter())
            self.refresh_bindings()   # its keys made now: the focus moved before it was there
        if self.is_attached:   # not when the app ended meanwhile (a walk that cannot be read)
            await self._find_box()

    def _theme_changed(self, _theme: object) -> None:
        self._restyle = True

    async def _find_box(self) -> Input:
        """The find box (hidden until ``/``), mounted once the first paint is made: it is not
        part of that paint."""
        found = self.query("#find")
        if found:
            return found.first(Input)
        find = Input(placeholder="find runs: type words, Enter to go back to the list", id="find",
                     compact=True)
        find.display = False
        await self.mount(find, before="#sheet-heading")
        return find

    def _find_text(self) -> str:
        found = self.query("#find")
        return found.first(Input).value if found else ""

    @property
    def session(self) -> WalkSession:
        """The open walk (only once attached: every use of it waits for ``attach``, as the
        walk's keys do, ``check_action``)."""
        if self._session is None:
            raise RuntimeError("the walk screen has no session yet")
        return self._session

    @property
    def attached(self) -> bool:
        """The walk is open here (not only its runs as written)."""
        return self._session is not None

    def show_head_start(self, rows: list[SheetRow]) -> None:
        """Sized rows from the head start (``gaugewalk.tui.app.headstart``) while the walk is
        being opened: the first part in place of the same runs as written, the second with them
        as the whole sheet. Also once the walk is attached but not yet sized (a walk of more than
        ``SIZE_BEFORE_SHOWING`` runs is attached first, and at tens of thousands of runs that
        comes before the child's rows): its own sizing replaces them (``reload``). Not once the
        walk is sized (its own rows are shown then)."""
        s = self._session
        if s is not None and s.result is not None:
            return
        self._head_parts.append(rows)
        if self._sheet_up:   # else mounting shows them, after the runs as written
            self._show_head_parts()
            if len(self._head_parts) == 1:
                self._paint_now()

    def _paint_now(self) -> None:
        """What changed on this screen painted now rather than at its next frame: Textual paints
        a changed screen on a timer at 60 frames a second, so the first sized rows waited up to
        1/60 s (most often about 10 ms here) after they were in the sheet, for nothing else to
        do. What that frame would do is done here (``Screen._on_timer_update``: the layout if
        one is asked for, then the changed widgets drawn); the frame then finds nothing left.
        Not while another screen is over this one (the key guide): nothing of this is shown.
        A Textual without that method (it is Textual's own) leaves the paint to the frame."""
        frame = getattr(self, "_on_timer_update", None)
        if frame is not None and self.is_current:
            frame()

    def _show_head_parts(self) -> None:
        """The head start's rows come so far onto the sheet (``show_head_start``)."""
        sheet = self.query_one(RunSheet)
        parts = self._head_parts
        s = self._session
        if len(parts) >= 2:   # (attached: of the very bytes it read, ``WalkApp._head_rows``)
            self._head = parts[0] + parts[1]
            sheet.set_rows(self._head)
            self._bar()
            self._finish_soon()
        elif not sheet.update_rows(parts[0]):
            return   # not the runs as written: they all come with the second part
        if s is None:   # the walk's keys still wait for it, and the sheet looks ready: say so
            self.query_one("#detail", Static).update(
                "Sized; the walk is being read for editing, its keys work in a moment.",
                layout=False)

    def attach(self, session: WalkSession, rows: list[SheetRow] | None = None) -> None:
        """The walk read and checked (and, up to ``SIZE_BEFORE_SHOWING`` runs, sized): its rows
        take the place of the runs as written, and its keys work. ``rows``, its sheet's rows
        made already (``all_rows``), replace the sheet's, unless those are the head start's and
        equal to them; a walk not sized yet keeps the head start's rows until it is. Otherwise, when the runs as written are the walk's runs in order, the
        rows on screen are made first and painted, and every row right after that paint
        (``reload``); else every row at once."""
        self._session = session
        sheet = self.query_one(RunSheet)
        on_screen = sheet.rows_on_screen()
        if rows is not None:
            self.head_start_kept = sheet.rows is self._head and self._head == rows
            if not self.head_start_kept:   # no head start, a part of it, or other rows
                sheet.set_rows(rows)
            self._head = None
            self._shown = session.version
            self.reload()
        elif self._head is not None and session.result is None:
            # a walk sized once it is open (over SIZE_BEFORE_SHOWING runs): the head start's
            # sized rows stay until the app's own sizing replaces them (``reload``)
            self._shown = session.version
            self.reload()
        elif (on_screen and len(on_screen) < len(sheet.rows)
                and sheet.visible_keys() == [run.id for run in session.job.runs]):
            from gaugewalk.tui.app.sheet.rows import changed_rows

            sheet.update_rows(changed_rows(session, set(on_screen)))
            self._bar()
            self._detail(sheet.cursor_key)
            self.app.refresh_title()
            self.call_after_refresh(self.reload)
        else:
            self.reload()
        self.refresh_bindings()
        self._finish_soon()

    def on_screen_resume(self, event: events.ScreenResume) -> None:
        """Back from another screen (the run card, most often): its widgets keep the styles they
        were given unless the theme changed meanwhile, so Textual is spared styling every widget
        of the walk screen anew (a few milliseconds of each run stored from the card); the sheet
        shows what changed (``reload``)."""
        if not self._restyle:
            event.refresh_styles = False
        self._restyle = False
        if self._session is None:
            return
        self.reload()
        self.look_at_disk()

    def look_at_disk(self) -> None:
        """Now and then, and on coming back to this screen: a walk changed on disk is taken in at
        once when nothing here waits to be saved; otherwise it is said once, with the key. Not
        while a save of the app's own is on its way (``WalkSession.saving``): that is no outside
        change, and a clash the writer meets is taken in by ``after_save``."""
        s = self._session
        if (s is None or s.read_only or s.busy or s.saving or self.app.screen is not self
                or not s.changed_on_disk()):
            return
        if s.state.saved:
            said = s.take_outside_change(prefer=None)
            self.reload()
            self.notify(said, severity="information" if s.state.saved else "error", timeout=10)
        elif not self._told_outside:
            self._told_outside = True
            self.notify(f"{s.path.name} changed on disk. ctrl+s takes that change in and puts "
                        "your unsaved changes on top.", severity="warning", timeout=12)

    def check_action(self, action: str, parameters: tuple[object, ...]) -> bool | None:
        """The keys that open a screen are priority bindings (so the keys typed right after
        them reach the new screen in order); while the find box has focus they are letters.
        Until the walk is attached none of its keys work (the app's keys do)."""
        if self._session is None:
            return False
        if action in _OPENERS and isinstance(self.focused, Input):
            return False
        return True

    # ----- refreshing -------------------------------------------------------------------
    @property
    def shown_version(self) -> int:
        """The session's ``version`` the sheet shows."""
        return self._shown

    def reload(self, focus: str | None = None) -> None:
        """Show the session's walk as it is now: after one change that says which runs it
        touched (``WalkSession.changed``), only their rows are made again; after any other,
        every row (results can move anywhere); after none, none. ``focus``: the run the cursor
        goes to (an undo's or redo's)."""
        from gaugewalk.tui.app.sheet.rows import all_rows, changed_rows

        sheet = self.query_one(RunSheet)
        session = self.session
        if self._shown == session.version and focus is None:
            pass
        elif (self._shown == session.version - 1 and session.changed is not None
              and sheet.update_rows(changed_rows(session, session.changed))):
            if focus is not None:   # an undo or redo of one run's edit: the cursor to it
                sheet.move_to(focus)
        else:
            sheet.set_rows(all_rows(session), keep_key=focus)
        self._shown = session.version
        if self._card is None and not session.busy and not session.read_only:
            self._card_ahead_soon()
        self._tree_stale = True
        self._footage_stale = True
        self._boards_stale = True
        if self.view != "runs":
            self._refresh_view()
        self._bar()
        self._detail(sheet.cursor_key)
        self.app.refresh_title()

    def _bar(self) -> None:
        sheet = self.query_one(RunSheet)
        parts = []
        for v in VIEWS:
            t = VIEW_TITLES[v]
            parts.append(f"[reverse b] {t} [/]" if v == self.view else f" {t} ")
        total = len(sheet.rows)
        flagged = sheet.flagged
        info = f"{total} run" if total == 1 else f"{total} runs"
        if flagged:
            info += f", ▲ {flagged} with a problem"
        filt = []
        if self.source_filter:
            filt.append(f"from {self.source_filter}")
        if self.problems_only:
            filt.append("problems only")
        if sheet.filter_text:
            filt.append(f"'{sheet.filter_text}'")
        if filt:
            info += f" · showing {len(sheet.view)}: " + ", ".join(filt)
        text = "".join(parts) + "  " + escape(info)
        if text != self._bar_text:   # the same text is not drawn again
            self._bar_text = text
            # a fixed height (app.tcss): a new text needs no layout pass over the screen
            self.query_one("#view-bar", Static).update(text, layout=False)

    def _detail(self, key: str | None) -> None:
        if self._session is None:
            return
        from gaugewalk.tui.app.sheet.rows import detail_lines

        run = self.session.job.run(key) if key else None
        self.query_one("#detail", Static).update(escape(detail_lines(self.session, run)), layout=False)

    def _refresh_view(self) -> None:
        from gaugewalk.tui.app.widgets.views import boards_text, footage_text

        if self.view == "tree" and self._tree_stale:
            self._tree().build(self.session)
            self._tree_stale = False
        elif self.view == "footage" and self._footage_stale:
            width = max(self.size.width - 2, 40)
            self.query_one("#footage-text", Static).update(footage_text(self.session, width))
            self._footage_stale = False
        elif self.view == "boards" and self._boards_stale:
            self.query_one("#boards-text", Static).update(boards_text(self.session))
            self._boards_stale = False

    @staticmethod
    def _make_view(view: str) -> Widget:
        """The widget of a view other than the run sheet, made the first time it is shown (only
        the run sheet is on screen at the start)."""
        from gaugewalk.tui.app.widgets.views import SupplyTree

        if view == "tree":
            return SupplyTree(id="tree")
        return ScrollableContainer(Static("", id=f"{view}-text"), id=view, can_focus=True)

    def _tree(self) -> SupplyTree:
        from gaugewalk.tui.app.widgets.views import SupplyTree

        return self.query_one("#tree", SupplyTree)

    @on(RunSheet.Highlighted)
    def _highlighted(self, event: RunSheet.Highlighted) -> None:
        self._detail(event.key)

    def on_tree_node_selected(self, event) -> None:
        """A click on a branch run in the supply tree edits it (a source node opens or folds)."""
        data = event.node.data
        if data and data[0] == "run" and not event.node.allow_expand:
            self.open_card(data[1])

    def action_choose(self) -> None:
        """Enter: edit the run under the cursor; on a source in the supply tree, open or fold it.
        A priority key (like n and e), so the card opens before the keys typed after it are
        taken, and they go into the card."""
        if self.view == "tree":
            tree = self._tree()
            node = tree.cursor_node
            if node is None:
                return
            data = node.data
            if data and data[0] == "run" and not node.allow_expand:
                self.open_card(data[1])
            else:
                tree.action_select_cursor()
            return
        if self.view == "runs":
            key = self.query_one(RunSheet).cursor_key
            if key is not None:
                self.open_card(key)

    @on(RunSheet.Chosen)
    def _chosen(self, event: RunSheet.Chosen) -> None:
        if self._session is not None:   # a double click on the runs as written waits too
            self.open_card(event.key)

    # ----- views ------------------------------------------------------------------------
    async def action_show_view(self, view: str) -> None:
        if view != "runs" and not self.query(f"#{view}"):
            made = self._make_view(view)
            made.display = False   # until ``_switch`` shows it
            await self.mount(made)
        self._switch(view)

    def _switch(self, view: str) -> None:
        """Show ``view`` and hide the others (its widget is mounted: the run sheet's always
        are, the others once ``action_show_view`` made them)."""
        self.view = view
        for widget in RUN_VIEW:
            self.query_one(widget).display = view == "runs"
        for other in VIEWS[1:]:
            for widget in self.query(f"#{other}"):
                widget.display = other == view
        self._refresh_view()
        target = {"runs": "#sheet", "tree": "#tree", "footage": "#footage",
                  "boards": "#boards"}[view]
        self.set_focus(self.query_one(target))  # now: the keys behind find it (keyorder)
        self._bar()

    async def action_next_view(self) -> None:
        await self.action_show_view(VIEWS[(VIEWS.index(self.view) + 1) % len(VIEWS)])

    # ----- filtering and sorting --------------------------------------------------------
    def _apply_filter(self) -> None:
        sheet = self.query_one(RunSheet)
        src = self.source_filter
        problems = self.problems_only

        def pred(row: SheetRow) -> bool:
            if src is not None and row.group != src:
                return False
            if problems and not row.flag:
                return False
            return True

        sheet.set_filter(self._find_text(), pred if (src or problems) else None)
        self._bar()

    async def action_find(self) -> None:
        if self.view != "runs":
            self._switch("runs")
        find = await self._find_box()
        find.display = True
        self.set_focus(find)

    @on(Input.Changed, "#find")
    def _find_changed(self) -> None:
        self._apply_filter()

    @on(Input.Submitted, "#find")
    def _find_done(self) -> None:
        find = self.query_one("#find", Input)
        if not find.value:
            find.display = False
        self.set_focus(self.query_one(RunSheet))

    def action_toggle_problems(self) -> None:
        self.problems_only = not self.problems_only
        self._to_runs()
        self._apply_filter()

    def action_cycle_source(self) -> None:
        ids = self.session.source_ids()
        if not ids:
            return
        if self.source_filter not in ids:
            self.source_filter = ids[0]
        else:
            i = ids.index(self.source_filter) + 1
            self.source_filter = ids[i] if i < len(ids) else None
        self._to_runs()
        self._apply_filter()

    def action_clear_filters(self) -> None:
        found = self.query("#find")
        if found:
            find = found.first(Input)
            if find.has_focus and find.value:
                find.value = ""
                return
            find.value = ""
            find.display = False
        self.problems_only = False
        self.source_filter = None
        self._apply_filter()
        if self.view == "runs":
            self.set_focus(self.query_one(RunSheet))

    def action_cycle_sort(self) -> None:
        sheet = self.query_one(RunSheet)
        current = sheet.sort_key
        nxt = SORT_KEYS[0] if current is None else (
            SORT_KEYS[SORT_KEYS.index(current) + 1] if SORT_KEYS.index(current) + 1 < len(SORT_KEYS) else None
        )
        sheet.sort_by(nxt, sheet.sort_reverse)
        self._to_runs()
        self._bar()

    def action_reverse_sort(self) -> None:
        sheet = self.query_one(RunSheet)
        sheet.sort_by(sheet.sort_key or "id", not sheet.sort_reverse)
        self._to_runs()

    def _to_runs(self) -> None:
        if self.view != "runs":
            self._switch("runs")

    # ----- changing runs ----------------------------------------------------------------
    def _current_run_id(self) -> str | None:
        if self.view == "tree":
            node = self._tree().cursor_node
            if node is not None and node.data and node.data[0] == "run":
                return node.data[1]
            return None
        return self.query_one(RunSheet).cursor_key

    def _busy(self) -> bool:
        if self.session.read_only:
            self.notify(f"This walk is open read-only here: {self.session.read_only}", severity="warning", timeout=8)
            return True
        if self.session.busy:
            self.notify("Still sizing the walk; try again in a moment.", severity="warning")
            return True
        return False

    def action_new_run(self) -> None:
        self.open_card(None)

    def action_edit_run(self) -> None:
        key = self._current_run_id()
        if key is None:
            self.notify("No run selected to edit.", severity="warning")
            return
        self.open_card(key)

    def _new_card(self, run_id: str | None) -> RunCard:
        """The run card, made (not yet built) and kept (installed) to be opened again for every
        later run."""
        from gaugewalk.tui.app.screens.card import RunCard

        card = self._card = RunCard(self.session, run_id)
        self.app.install_screen(card, f"run-card-{id(card)}")
        return card

    def open_card(self, run_id: str | None) -> None:
        """Open the run card; it opens even while the walk is still being sized (typing can
        start at once; storing waits for the sizing)."""
        if self.session.read_only:
            self._busy()
            return
        card = self._card
        if card is None or card.session is not self.session:
            card = self._new_card(run_id)
        else:
            card.open_for(run_id)
        self.app.push_screen(card)

    # ----- the run card built ahead -----------------------------------------------------
    @property
    def card_ready(self) -> bool:
        """The run card is built and its first open rehearsed (ahead, or by an open)."""
        return self._card is not None and self._card.is_mounted and self._card.rehearsed

    def _card_ahead_soon(self) -> None:
        if not self._card_ahead_on:
            self._card_ahead_on = True
            self.set_timer(CARD_AHEAD_S, self._card_ahead)

    def _waiting_for_a_key(self) -> bool:
        """Nothing for the app to do: this screen is shown and no key or other event waits in
        the app's queue."""
        return self.app.screen is self and self.app._message_queue.empty()

    def _card_ahead(self) -> None:
        """Build the run card before it is first opened, one step each time the app waits for a
        key (after the sized rows are on screen): its widgets, then a rehearsal of its first open
(``RunCard.rehearse``: filled in, laid out and drawn, unseen). Building them
        at the first open made that key the slowest of all (about 100 ms at 5,000 runs against
        about 20 ms for every later open); a key that comes while a step runs waits for that
        step only. Then what the opening built is left out of the collector's passes, as the
        app does once the walk is attached (``WalkApp._release_collector``)."""
        self._card_ahead_on = False
        session = self._session
        if session is None or session.read_only:
            return
        card = self._card
        if card is not None and card.is_current:
            return   # opened meanwhile: its first open built it
        if not self._waiting_for_a_key() or (card is not None and not card.is_mounted):
            self._card_ahead_soon()
            return
        if card is None or card.session is not session:
            self._new_card(None).build_ahead()
            self._card_ahead_soon()
            return
        if not card.rehearse():
            self._card_ahead_soon()
            return
        self.app.freeze_built()

    def action_delete_run(self) -> None:
        if self._busy():
            return
        key = self._current_run_id()
        if key is None:
            return
        refusal = self.session.delete_refusal(key)
        if refusal:
            self.notify(f"Not deleted: {refusal}.", severity="warning", timeout=8)
            return
        job = self.session.job
        run = job.run(key)
        if run is not None and job.is_feeder(run):
            msg = f"Delete feeder {key} and the panel {run.to} it feeds (nothing runs from it yet)?"

            def answer(yes: bool | None) -> None:
                if yes:
                    self._delete(key)

            from gaugewalk.tui.app.screens.info import AskScreen

            self.app.push_screen(AskScreen(msg, "delete both", "keep"), answer)
            return
        self._delete(key)

    def _delete(self, key: str) -> None:
        refusal = self.session.delete_run(key)
        if refusal:
            self.notify(f"Not deleted: {refusal}.", severity="warning", timeout=8)
            return
        self.reload()
        self._said_saved(f"Deleted {key} (ctrl+z brings it back).")

    def action_keep_positions(self) -> None:
        if self._busy():
            return
        count, unplaced, refusal = self.session.keep_positions()
        if refusal:
            self.notify(f"Positions not kept: {refusal}.", severity="warning", timeout=8)
            return
        if not count:
            self.notify("Every run already has its position." if not unplaced
                        else "No free position for: " + ", ".join(unplaced))
            return
        self.reload()
        self._said_saved(f"Kept the positions of {count} run(s)."
                         + (f" No free position for: {', '.join(unplaced)}." if unplaced else ""))

    def action_undo(self) -> None:
        if self._busy():
            return
        snap = self.session.undo()
        if snap is None:
            self.notify("Nothing to undo.")
            return
        self.reload(focus=snap.focus)
        self._said_saved(f"Undid: {snap.label}.")

    def action_redo(self) -> None:
        if self._busy():
            return
        snap = self.session.redo()
        if snap is None:
            self.notify("Nothing to redo.")
            return
        self.reload(focus=snap.focus)
        self._said_saved(f"Redid: {snap.label}.")

    def action_save_now(self) -> None:
        if self.session.read_only:
            self.notify(f"Nothing saved: this walk is open read-only here: {self.session.read_only}",
                        severity="warning", timeout=8)
            return
        saved = self.session.save()
        self.app.refresh_title()
        if saved:
            self._said_saved("Saved.")
        elif self.session.state.changed_outside:
            self._offer_outside_change()
        else:
            self.notify(f"Not saved: {self.session.state.message}", severity="error", timeout=10)

    def _offer_outside_change(self) -> None:
        """ctrl+s after the walk changed on disk in a way that clashes with changes here: offer
        to take that change in with this side's changes on top (theirs stays in NAME~)."""
        session = self.session
        name = session.path.name
        question = (f"{session.state.message}.\n\nTake {name} as it is on disk now and put your "
                    f"unsaved changes on top? Where both changed the same thing, yours is kept "
                    f"and theirs stays in {name}~.")

        def answer(yes: bool | None) -> None:
            if not yes:
                return
            said = session.take_outside_change(prefer="b")
            self._told_outside = not session.state.saved
            self.reload()
            self.notify(said, severity="information" if session.state.saved else "error",
                        timeout=12)

        from gaugewalk.tui.app.screens.info import AskScreen

        self.app.push_screen(AskScreen(question, "take it in, mine on top", "not now"), answer)

    def action_unlock(self) -> None:
        """ctrl+u: clear the stale or broken lock that made the walk read-only, after asking;
        never a lock a running gaugewalk on this computer holds."""
        from gaugewalk.model.walkfile.lock import inspect_lock

        session = self.session
        if session.lock_refusal is None:
            why = f" It is read-only because {session.read_only}" if session.read_only else ""
            self.notify("No lock holds this walk here; there is nothing to clear." + why,
                        severity="warning", timeout=8)
            return
        state = inspect_lock(session.hold.path)
        if state.kind == "held":
            self.notify(f"Not cleared: the walk is {state.describe()}; close it there first.",
                        severity="warning", timeout=10)
            return
        what = state.describe() if state.kind != "none" else "the lock is gone already"
        question = (f"Clear this lock and take the walk for writing? {what}. "
                    "Only if no gaugewalk has this walk open.")

        def answer(yes: bool | None) -> None:
            if not yes:
                return
            said = session.unlock(force=state.kind == "elsewhere")
            self.notify(said, severity="warning" if session.read_only else "information",
                        timeout=10)
            self.reload()

        from gaugewalk.tui.app.screens.info import AskScreen

        self.app.push_screen(AskScreen(question, "clear it", "leave it"), answer)

    def _said_saved(self, text: str) -> None:
        st = self.session.state
        if not st.saved:
            self.notify(f"{text} NOT SAVED: {st.message}", severity="error", timeout=8)
        else:
            self.notify(text + (f" {st.notice}" if st.notice else ""))

    def action_why(self) -> None:
        key = self._current_run_id()
        if key is None:
            self.notify("Move to a run first; w shows the rules it was sized by.", severity="warning")
            return
        from gaugewalk.tui.app.screens.rules import RulesScreen

        self.app.push_screen(RulesScreen(self.session, key))

    def action_trial(self) -> None:
        if self._busy():
            return
        key = self._current_run_id()
        if key is None:
            self.notify("Move to a run first; the trial change works on one run or feeder.", severity="warning")
            return
        from gaugewalk.tui.app.screens.trial import TrialScreen

        self.app.push_screen(TrialScreen(self.session, key))

    def action_job_settings(self) -> None:
        if self._busy():
            return
        from gaugewalk.tui.app.screens.job import JobSettingsScreen

        self.app.push_screen(JobSettingsScreen(self.session))
