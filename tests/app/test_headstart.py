"""The head start: a child forked at the start of the process sizes the walk while the app
starts; the sheet shows its rows only while they are the rows the app makes itself, and the app
opens as before when the child fails, is stopped or cannot start."""

from __future__ import annotations

import json
import subprocess
import sys
import threading
from types import SimpleNamespace

import pytest

from gaugewalk.model.session.session import WalkSession
from gaugewalk.model.walkfile.read import WalkFileError
from gaugewalk.tui.app.headstart import FIRST_ROWS, HeadStart, sized_rows
from gaugewalk.tui.app.screens.walk import WalkScreen
from gaugewalk.tui.app.sheet.rows import all_rows
from gaugewalk.tui.app.widgets.runsheet import RunSheet
from tests.support.app_helpers import opened
from tests.support.paths import REPO, SAMPLES
from tests.support.synthetic_walk import synthetic_walk_text

OPENING = sorted(p for p in SAMPLES.glob("*.toml"))


def _own_rows(path) -> list:
    """The rows the app makes from its own reading of ``path`` (``WalkApp._load``)."""
    session = WalkSession.open(path, compute=False)
    session.recompute()
    return all_rows(session)


def _synthetic(tmp_path, runs: int):
    path = tmp_path / f"synthetic_{runs}.toml"
    path.write_text(synthetic_walk_text(runs), encoding="utf-8")
    return path


@pytest.mark.parametrize("path", OPENING, ids=lambda p: p.name)
def test_the_head_starts_rows_are_the_rows_the_app_makes_itself(path):
    first, rest = sized_rows(path.read_bytes(), str(path))
    assert first + rest == _own_rows(path)
    assert len(first) == min(FIRST_ROWS, len(first) + len(rest))


def test_on_a_walk_longer_than_the_first_part_the_first_rows_come_first(tmp_path):
    path = _synthetic(tmp_path, FIRST_ROWS + 150)
    first, rest = sized_rows(path.read_bytes(), str(path))
    assert len(first) == FIRST_ROWS and len(rest) == 150
    assert first + rest == _own_rows(path)


def test_a_walk_the_reader_refuses_gives_the_child_no_rows(tmp_path):
    path = tmp_path / "bad.toml"
    path.write_text("schema = 1\n[job]\nname = 3\n", encoding="utf-8")
    with pytest.raises(WalkFileError):
        list(sized_rows(path.read_bytes(), str(path)))


def test_the_head_start_sizes_without_textual():
    # the child is forked before Textual is imported: what it runs must not import it
    code = ("import sys; from gaugewalk.tui.app.headstart import sized_rows; "
            f"p = {str(SAMPLES / 'warehouse_dc2.toml')!r}; "
            "n = sum(len(r) for r in sized_rows(open(p, 'rb').read(), p)); "
            "print(n, 'textual' in sys.modules, 'rich' in sys.modules)")
    done = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                          check=True)
    assert done.stdout.split() == ["385", "False", "False"]


def test_no_head_start_without_a_file_or_while_another_thread_runs(tmp_path):
    walk = _synthetic(tmp_path, 5)
    assert HeadStart.begin(None) is None
    assert HeadStart.begin(str(tmp_path / "missing.toml")) is None
    assert HeadStart.begin(str(tmp_path)) is None   # a folder
    stop = threading.Event()
    other = threading.Thread(target=stop.wait)
    other.start()
    try:   # a fork would copy the other thread's locks in whatever state they are
        assert HeadStart.begin(str(walk)) is None
    finally:
        stop.set()
        other.join()


def _opened_with_head_start(walk, config, *extra: str) -> dict:
    """The app on ``walk`` with a real head start, in a process of its own."""
    done = subprocess.run(
        [sys.executable, "-m", "tests.support.head_start_app", str(walk), str(config), *extra],
        cwd=REPO, capture_output=True, text=True, timeout=120)
    assert done.returncode == 0, done.stderr
    assert "Traceback" not in done.stderr
    return json.loads(done.stdout.strip().splitlines()[-1])


def test_the_app_keeps_the_head_starts_rows_and_leaves_no_child(tmp_path):
    walk = tmp_path / "warehouse.toml"
    walk.write_bytes((SAMPLES / "warehouse_dc2.toml").read_bytes())
    out = _opened_with_head_start(walk, tmp_path / "cfg")
    assert out == {"head_start": True, "kept": True, "parts": 2, "same": True, "code": 0,
                   "message": None, "reaped": True}


def test_a_head_start_that_died_leaves_the_app_opening_on_its_own(tmp_path):
    walk = _synthetic(tmp_path, FIRST_ROWS + 40)
    out = _opened_with_head_start(walk, tmp_path / "cfg", "--stop")
    assert out == {"head_start": True, "kept": False, "parts": 0, "same": True, "code": 0,
                   "message": None, "reaped": True}


def test_a_walk_the_reader_refuses_says_why_as_without_a_head_start(tmp_path):
    walk = tmp_path / "bad.toml"
    walk.write_text("schema = 1\n[job]\nname = 3\n", encoding="utf-8")
    out = _opened_with_head_start(walk, tmp_path / "cfg")
    assert out["code"] == 2 and out["reaped"] and "kept" not in out
    assert out["message"].startswith(f"gaugewalk: {walk} line 3")


class _Scripted(HeadStart):
    """A head start without a child: ``parts`` gives the rows it was handed."""

    def __init__(self, path: str, parts: list[list]) -> None:
        super().__init__(path, open(path, "rb").read(), pid=-1, fd=-1)
        self._parts = parts

    def parts(self):
        yield from self._parts

    def stop(self) -> None:
        pass


def test_the_app_waits_a_moment_for_a_head_start_about_to_have_imported_the_model(tmp_path):
    head = _Scripted(str(_synthetic(tmp_path, 3)), [])
    assert not head.keeping_pace()       # it has not said so
    assert not head.keeping_pace(0.01)   # nor within a moment
    said = threading.Timer(0.02, head._imported.set)
    said.start()
    try:
        assert head.keeping_pace(60.0)   # said while the app waited
    finally:
        said.join()


@pytest.mark.parametrize("altered", [False, True], ids=["same rows", "other rows"])
async def test_the_sheet_ends_with_the_apps_own_rows_whatever_the_head_start_sent(tmp_path,
                                                                                  altered):
    from gaugewalk.tui.app.app import make_app

    walk = _synthetic(tmp_path, FIRST_ROWS + 30)
    own = _own_rows(walk)
    sent = list(own)
    if altered:   # a child that sized one run otherwise than the app does
        sent[3] = sent[3]._replace(cells=sent[3].cells[:-1] + ("✓ ok?",))
    head = _Scripted(str(walk), [sent[:FIRST_ROWS], sent[FIRST_ROWS:]])
    app = make_app(str(walk), config_dir=tmp_path / "cfg", head_start=head)
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        screen = app.screen
        assert isinstance(screen, WalkScreen) and screen.attached
        assert screen.head_start_kept is not altered
        assert screen.query_one(RunSheet).rows == own


async def test_a_walk_sized_once_open_keeps_the_head_starts_rows_until_it_is(tmp_path,
                                                                           monkeypatch):
    from gaugewalk.tui.app import app as app_module
    from gaugewalk.tui.app.app import make_app
    from gaugewalk.tui.app.sheet.rawrows import SIZING

    # a walk over SIZE_BEFORE_SHOWING runs is attached before the app sizes it itself
    monkeypatch.setattr(app_module, "SIZE_BEFORE_SHOWING", 10)
    walk = _synthetic(tmp_path, FIRST_ROWS + 30)
    own = _own_rows(walk)
    at_attach = []
    attach = WalkScreen.attach

    def attached(self, session, *rows) -> None:
        attach(self, session, *rows)
        at_attach.append((session.result is None,
                          [r.cells[-1] for r in self.query_one(RunSheet).rows]))

    monkeypatch.setattr(WalkScreen, "attach", attached)
    head = _Scripted(str(walk), [own[:FIRST_ROWS], own[FIRST_ROWS:]])
    app = make_app(str(walk), config_dir=tmp_path / "cfg", head_start=head)
    async with app.run_test(size=(80, 24)) as pilot:
        await opened(app, pilot)
        (unsized, status), = at_attach
        assert unsized and SIZING not in status   # the head start's sized rows, not "sizing"
        assert app.screen.query_one(RunSheet).rows == own   # then the app's own


async def test_head_start_rows_that_come_after_an_unsized_attach_show_until_the_app_sizes(
        tmp_path, monkeypatch):
    # At tens of thousands of runs the app attaches the walk, not yet sized, before the child's
    # first rows come. Held here without timing: every walk attached unsized, and the app's own
    # sizing held until the test runs it.
    import gaugewalk.tui.app.app as app_module
    from tests.support.app_helpers import new_app

    path = _synthetic(tmp_path, 300)
    held: list[WalkSession] = []
    monkeypatch.setattr(app_module, "SIZE_BEFORE_SHOWING", 0)
    monkeypatch.setattr(app_module.WalkApp, "_size_walk",
                        lambda self, session: held.append(session))
    parts = list(sized_rows(path.read_bytes(), str(path)))
    app = new_app(path, tmp_path / "cfg")
    async with app.run_test(size=(100, 30)) as pilot:
        while not held:
            await pilot.pause(0.01)
        await opened(app, pilot)
        # the head start as the app sees it once the walk is attached: the bytes its child read
        head = SimpleNamespace(raw=b"", stop=lambda: None)
        app.head_start = head
        screen = app.screen
        assert isinstance(screen, WalkScreen) and screen.attached
        sheet = screen.query_one(RunSheet)
        assert all(row.cells[-1] == "… sizing" for row in sheet.rows)
        # rows of a child that read other bytes than the app did are not taken
        other_walk = tmp_path / "other" / path.name
        other_walk.parent.mkdir()
        other_walk.write_text(path.read_text().replace('length = "64"', 'length = "640"', 1))
        head.raw = other_walk.read_bytes()
        for part in sized_rows(head.raw, str(other_walk)):
            app._head_rows(part)
        await pilot.pause()
        assert all(row.cells[-1] == "… sizing" for row in sheet.rows)
        head.raw = path.read_bytes()
        for part in parts:
            app._head_rows(part)
        await pilot.pause()
        assert sheet.rows == parts[0] + parts[1]
        # the app's own sizing replaces them, with the same rows
        session = held[0]
        session.recompute()
        session.busy = False
        app._computed()
        await pilot.pause()
        assert sheet.rows == all_rows(session) == parts[0] + parts[1]
