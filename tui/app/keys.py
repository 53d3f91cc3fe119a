"""Every key of the walk app, in one table.

The footer and the key guide are both generated from ``KEYS``, so they cannot disagree. Each
entry has an id (for remapping), the key, the action, a short label for the footer, a sentence for
the key guide and the place it works: ``"app"`` (everywhere), ``"walk"`` (the main screen) or
``"card"`` (the run card).
"""

from __future__ import annotations

from typing import NamedTuple

from textual.binding import Binding


class KeyAction(NamedTuple):
    """One key of ``KEYS`` (a named tuple: the app imports this table before its first paint, and
    a frozen dataclass's generated methods cost about as much as the rest of the module)."""

    id: str
    key: str
    action: str
    label: str
    help: str
    where: str
    footer: bool = True
    priority: bool = False
    key_display: str | None = None


PLACES = {
    "app": "Anywhere",
    "walk": "Walk screen",
    "card": "Run card (recording or editing a run)",
    "trial": "Trial change",
    "job": "Job settings",
    "start": "First screen (no walk given)",
    "newwalk": "New walk",
    "ask": "Questions",
    "info": "Key guide and about screen",
}

KEYS: tuple[KeyAction, ...] = (
    # anywhere
    KeyAction("app.quit", "ctrl+q", "quit", "Quit", "Quit; asks only if something would be lost.", "app", priority=True, key_display="^q"),
    KeyAction("app.keys", "f1", "key_guide", "Keys", "Show this key guide.", "app", key_display="F1"),
    KeyAction("app.about", "f2", "about", "About", "About gaugewalk and the safety caution.", "app", footer=False, key_display="F2"),
    KeyAction("app.theme", "f3", "flip_theme", "Light/dark", "Switch between the light and the dark look.", "app", footer=False, key_display="F3"),
    # walk screen
    KeyAction("walk.new", "n", "new_run", "New run", "Record a new run (from, to, length, load).", "walk", priority=True),
    KeyAction("walk.edit", "e", "edit_run", "Edit", "Edit the run under the cursor (Enter does the same).", "walk", priority=True),
    KeyAction("walk.choose", "enter", "choose", "Open", "Edit the run under the cursor; in the supply tree, open or fold a source.", "walk", footer=False, priority=True, key_display="Enter"),
    KeyAction("walk.delete", "delete", "delete_run", "Delete", "Delete the run under the cursor (undo brings it back).", "walk", footer=False, key_display="Del"),
    KeyAction("walk.undo", "ctrl+z", "undo", "Undo", "Undo the last run change.", "walk", key_display="^z"),
    KeyAction("walk.redo", "ctrl+y", "redo", "Redo", "Redo what was undone.", "walk", footer=False, key_display="^y"),
    KeyAction("walk.find", "slash", "find", "Find", "Filter the runs by text (id, from, to, load, size, notes).", "walk", key_display="/"),
    KeyAction("walk.problems", "exclamation_mark", "toggle_problems", "Problems", "Show only runs with a problem, or all runs again.", "walk", footer=False, key_display="!"),
    KeyAction("walk.source", "f", "cycle_source", "By source", "Show only the runs fed from one source; press again for the next.", "walk", footer=False),
    KeyAction("walk.sort", "s", "cycle_sort", "Sort", "Sort by the next column.", "walk", footer=False),
    KeyAction("walk.reverse", "r", "reverse_sort", "Reverse", "Reverse the sort order.", "walk", footer=False),
    KeyAction("walk.clear", "escape", "clear_filters", "Clear", "Clear the text, source and problem filters.", "walk", footer=False, key_display="Esc"),
    KeyAction("walk.runs", "1", "show_view('runs')", "Runs", "Run sheet: every run, sortable and filterable.", "walk", footer=False),
    KeyAction("walk.tree", "2", "show_view('tree')", "Tree", "Supply tree: service to feeders, panels and branch runs with cumulative drop.", "walk", footer=False),
    KeyAction("walk.feet", "3", "show_view('footage')", "Footage", "Footage by size and material, with a bar chart.", "walk", footer=False),
    KeyAction("walk.boards", "4", "show_view('boards')", "Boards", "Boards: the sources' ratings and loading, and every panel's schedule (positions, phases, load per line).", "walk", footer=False),
    KeyAction("walk.views", "tab", "next_view", "View", "Next view (runs, tree, footage, boards).", "walk", key_display="Tab"),
    KeyAction("walk.keep_positions", "p", "keep_positions", "Keep positions", "Write the breaker positions the tool picked into the walk file (one undo).", "walk", footer=False),
    KeyAction("walk.why", "w", "why", "Why", "The rules the run under the cursor was sized by: each code section, in order, and what was taken as given where the walk does not say.", "walk", footer=False),
    KeyAction("walk.trial", "t", "trial", "Try", "Trial change: try another material, size or voltage on the run, see the effect, keep it or not.", "walk", priority=True),
    KeyAction("walk.job", "j", "job_settings", "Job", "Job settings: the defaults every run inherits; all runs recompute.", "walk", priority=True),
    KeyAction("walk.save", "ctrl+s", "save_now", "Save", "Save again now (every change is already saved at once).", "walk", footer=False, key_display="^s"),
    KeyAction("walk.unlock", "ctrl+u", "unlock", "Unlock", "Read-only because of a stale or broken lock: clear it (asks first; never one a running gaugewalk holds) and take the walk for writing.", "walk", footer=False, key_display="^u"),
    # run card
    KeyAction("card.store", "enter", "store", "Store+next", "Store the run and start the next one.", "card", priority=True, key_display="Enter"),
    KeyAction("card.close", "escape", "close_card", "Close", "Close the card; an unstored draft is kept for the next new run.", "card", key_display="Esc"),
    KeyAction("card.next", "tab", "next_field", "Next field", "Next field; accepts the shown completion first.", "card", footer=False, key_display="Tab"),
    KeyAction("card.prev", "shift+tab", "prev_field", "Prev field", "Previous field.", "card", footer=False, key_display="S-Tab"),
    KeyAction("card.down", "down", "next_field(False)", "Down", "Next field (↓), without taking the completion.", "card", footer=False, key_display="↓"),
    KeyAction("card.up", "up", "prev_field", "Up", "Previous field (↑).", "card", footer=False, key_display="↑"),
    KeyAction("card.like", "ctrl+r", "like_last", "Like last", "A new run like the last one: its fields copied (what you typed kept), To stepped on (row 2 after row 1), the id the next free one; typing goes on in Length.", "card", key_display="^r"),
    KeyAction("card.more", "ctrl+o", "toggle_more", "More fields", "Jump to the other fields (new panel, circuit, sets, size, material...) and back.", "card", key_display="^o"),
    # trial change
    KeyAction("trial.keep", "ctrl+s", "keep", "Keep", "Keep the trial change (it can be undone).", "trial", key_display="^s"),
    KeyAction("trial.drop", "escape", "close_trial", "Discard", "Leave without changing the walk.", "trial", key_display="Esc"),
    KeyAction("trial.next", "enter", "next_field", "Next field", "Next field (the effect shows as you type).", "trial", footer=False, priority=True, key_display="Enter"),
    # job settings
    KeyAction("job.store", "ctrl+s,enter", "store", "Store", "Store the settings (Enter does the same); every run recomputes.", "job", priority=True, key_display="^s"),
    KeyAction("job.leave", "escape", "leave", "Leave unchanged", "Leave the settings as they were.", "job", key_display="Esc"),
    KeyAction("job.down", "down", "app.focus_next", "Down", "Next setting (↓), as on the run card; Tab too.", "job", footer=False, priority=True, key_display="↓"),
    KeyAction("job.up", "up", "app.focus_previous", "Up", "Previous setting (↑); shift+Tab too.", "job", footer=False, priority=True, key_display="↑"),
    # first screen and new walk
    KeyAction("start.go", "enter", "go", "Open", "Open the walk picked, or create the file named.", "start", priority=True, key_display="Enter"),
    KeyAction("start.new", "n", "new", "New walk", "Start a new walk (asks for its file).", "start"),
    KeyAction("start.quit", "escape", "leave", "Quit", "Quit (or leave the file name box).", "start", key_display="Esc"),
    KeyAction("newwalk.create", "enter", "create", "Create", "Create the walk with these answers.", "newwalk", priority=True, key_display="Enter"),
    KeyAction("newwalk.cancel", "escape", "leave", "Don't create", "Do not create the walk.", "newwalk", key_display="Esc"),
    # questions and the information screens
    KeyAction("ask.yes", "y", "answer(True)", "Yes", "Answer yes.", "ask"),
    KeyAction("ask.no", "n,escape", "answer(False)", "No", "Answer no (Esc too).", "ask", key_display="n/Esc"),
    KeyAction("info.close", "escape,q", "dismiss", "Close", "Close the key guide or the about screen.", "info", key_display="Esc/q"),
)


def bindings_for(where: str) -> list[Binding]:
    """Textual bindings for one place, from ``KEYS``."""
    return [
        Binding(
            k.key, k.action, k.label, show=k.footer, id=k.id, priority=k.priority,
            key_display=k.key_display,
        )
        for k in KEYS
        if k.where == where
    ]


def shown_key(k: KeyAction) -> str:
    return k.key_display or k.key


def guide_rows() -> list[tuple[str, list[tuple[str, str]]]]:
    """The key guide: for each place, (key, sentence) pairs."""
    out = []
    for place, title in PLACES.items():
        rows = [(shown_key(k), k.help) for k in KEYS if k.where == place]
        if rows:
            out.append((title, rows))
    return out
