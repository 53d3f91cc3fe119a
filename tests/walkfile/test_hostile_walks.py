"""Hostile and broken walk files: every one gives a clear message naming the file (and the line,
run or field where there is one), exit 2 on the command line, no traceback, nothing written."""

from __future__ import annotations

import contextlib
import io
import math
import os
import sys
import tomllib

import pytest
import tomli_w
from hypothesis import HealthCheck, assume, example, given, settings
from hypothesis import strategies as st

from gaugewalk.model.walkfile.atomic import backup_path
from gaugewalk.model.walkfile.read import MAX_RUNS, MAX_WALK_BYTES, WalkFileError, check_walk_text
from gaugewalk.model.walkfile.write import dumps_walk, save_walk
from gaugewalk.tui.cli.main import main
from tests.support.kill_harness import walk_versions

MAX_MESSAGE = 700
"""One problem on one line: file, line, where, field and a sentence, which may list the allowed
values (all conductor sizes) but never echoes a pasted value whole [characters]."""

BASE = tomllib.loads(dumps_walk(walk_versions(1, runs=3)[0]))


def _cli(argv: list[str]) -> tuple[int, str, str]:
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        code = main(argv)
    return code, out.getvalue(), err.getvalue()


def _assert_clear_refusal(code: int, err: str, path) -> None:
    assert code == 2
    assert "Traceback" not in err
    lines = err.strip().splitlines()
    assert lines, "no message"
    for line in lines:
        assert line.startswith(str(path)), line
        assert len(line) <= MAX_MESSAGE + len(str(path)), line[:200]


# -- values a walk file might hold --------------------------------------------------------------

odd_text = st.text(st.characters(exclude_categories=["Cs"]), max_size=60)
long_text = st.builds(lambda ch, n: ch * n, st.characters(exclude_categories=["Cs"]),
                      st.integers(1000, 20000))
hostile_values = st.one_of(
    st.just(float("nan")), st.just(float("inf")), st.just(float("-inf")),
    st.integers(-(2 ** 63), 2 ** 63 - 1), st.floats(allow_nan=True, allow_infinity=True),
    st.sampled_from([-1, 0, -0.0, 1e308, -1e308, 2 ** 63 - 1, 5e-324]),
    st.booleans(), odd_text, long_text, st.dates(),
    st.lists(st.integers(), max_size=3), st.dictionaries(odd_text, st.integers(), max_size=3),
    st.lists(st.lists(st.lists(st.booleans(), max_size=2), max_size=2), max_size=2),
)
TARGETS = (
    [("schema",)]
    + [("job", k) for k in ("name", "site", "walked_on", "walked_by", "notes", "unknown")]
    + [("defaults", k) for k in ("material", "insulation", "raceway", "terminal_temp", "ambient_c",
                                 "branch_drop_pct", "total_drop_pct", "method", "pf", "waste_pct")]
    + [("source", 0, k) for k in ("id", "kind", "system", "kva", "rating_a")]
    + [("source", 1, k) for k in ("id", "kind", "system")]
    + [("run", 0, k) for k in ("id", "from", "to", "length", "sets", "size", "ocpd_a")]
    + [("run", 2, k) for k in ("id", "from", "to", "length", "load", "connection", "sets", "size",
                               "material", "raceway", "ambient_c", "max_drop_pct", "bends",
                               "measured_on", "continuous", "segments", "notes")]
    + [("run", 2, "load", k) for k in ("value", "unit", "pf")]
    + [("job",), ("defaults",), ("source",), ("run",), ("run", 1)]
)


def _set(data: dict, where: tuple, value) -> dict:
    import copy

    out = copy.deepcopy(data)
    node = out
    for key in where[:-1]:
        if isinstance(node, dict):
            node = node.setdefault(key, {})
        elif isinstance(node, list) and isinstance(key, int) and key < len(node):
            node = node[key]
        else:
            return data  # an earlier change put a value where this one expects a table
    last = where[-1]
    if isinstance(node, dict) or (isinstance(node, list) and isinstance(last, int)
                                  and last < len(node)):
        node[last] = value
        return out
    return data


@pytest.mark.slow
@settings(suppress_health_check=[HealthCheck.too_slow])
@given(st.lists(st.tuples(st.sampled_from(TARGETS), hostile_values), min_size=1, max_size=3))
@example([(("run", 2, "load", "value"), float("nan"))])
@example([(("defaults", "ambient_c"), 10 ** 18)])
@example([(("run", 0, "length"), float("inf"))])
@example([(("source", 0, "id"), "S" * 20000)])
@example([(("schema",), " " * 1000)])
def test_hostile_values_in_a_walk_file_give_clear_messages_never_a_traceback(tmp_path_factory,
                                                                              changes):
    data = BASE
    for where, value in changes:
        data = _set(data, where, value)
    try:
        text = tomli_w.dumps(data)
    except (TypeError, ValueError):
        assume(False)  # not writable as TOML at all; binary junk is tried below
    job, problems = check_walk_text(text, "hostile.toml")
    for p in problems:
        line = str(p)
        assert line.startswith("hostile.toml"), line
        assert len(line) <= MAX_MESSAGE, line[:300]
    if job is not None and not problems:
        return  # the changes happened to be valid: nothing to refuse
    folder = tmp_path_factory.mktemp("hostile")
    path = folder / "walk.toml"
    path.write_text(text, encoding="utf-8")
    code, _, err = _cli(["check", str(path)])
    _assert_clear_refusal(code, err, path)
    code, _, err = _cli(["add", str(path), "--from", "SVC", "--to", "Pump", "--length", "10",
                         "--amps", "5"])
    _assert_clear_refusal(code, err, path)
    assert path.read_text(encoding="utf-8") == text
    assert not backup_path(path).exists()


@pytest.mark.slow
@given(st.binary(max_size=2000))
@example(b"\xff\xfe\x00\x00junk")
@example(b"schema = 1\n\x00\x01")
@example(b"")
@example(b"   \n\t\n")
def test_binary_junk_is_refused_with_the_file_named(tmp_path_factory, junk):
    try:
        _, problems = check_walk_text(junk.decode("utf-8"), "junk.toml")
        if not problems:
            return  # valid UTF-8 TOML that is a walk (e.g. "schema = 1")
    except UnicodeDecodeError:
        pass
    path = tmp_path_factory.mktemp("junk") / "walk.toml"
    path.write_bytes(junk)
    code, _, err = _cli(["check", str(path)])
    _assert_clear_refusal(code, err, path)
    code, _, err = _cli(["add", str(path), "--from", "SVC", "--to", "Pump", "--length", "10",
                         "--amps", "5"])
    _assert_clear_refusal(code, err, path)
    assert path.read_bytes() == junk and not backup_path(path).exists()


@pytest.mark.parametrize("depth", [50, 1000, 100_000])
@pytest.mark.parametrize("opener,closer", [("[", "]"), ("{a=", "}")])
def test_deep_nesting_is_refused_not_a_recursion_traceback(tmp_path, depth, opener, closer):
    path = tmp_path / "walk.toml"
    path.write_text("schema = 1\nx = " + opener * depth + "1" + closer * depth + "\n")
    code, _, err = _cli(["check", str(path)])
    _assert_clear_refusal(code, err, path)


def test_duplicate_keys_are_refused_with_their_line(tmp_path):
    path = tmp_path / "walk.toml"
    text = dumps_walk(walk_versions(1, runs=2)[0]).replace('to = "LP1"\n',
                                                           'to = "LP1"\nto = "LP2"\n', 1)
    path.write_text(text)
    code, _, err = _cli(["check", str(path)])
    _assert_clear_refusal(code, err, path)
    line = text.splitlines().index('to = "LP2"') + 1
    assert f"line {line}" in err


def test_an_empty_file_is_refused_not_read_as_an_empty_walk(tmp_path):
    path = tmp_path / "walk.toml"
    path.write_bytes(b"")
    code, _, err = _cli(["check", str(path)])
    _assert_clear_refusal(code, err, path)
    assert "empty" in err
    code, _, err = _cli(["add", str(path), "--from", "SVC", "--to", "Pump", "--length", "10",
                         "--amps", "5"])
    _assert_clear_refusal(code, err, path)
    assert path.read_bytes() == b""


def test_a_folder_instead_of_a_file_is_refused_by_every_command(tmp_path):
    folder = tmp_path / "walk.toml"
    folder.mkdir()
    good = tmp_path / "good.toml"
    save_walk(walk_versions(1, runs=2)[0], good)
    for argv in (["check", str(folder)],
                 ["add", str(folder), "--from", "SVC", "--to", "Pump", "--length", "10",
                  "--amps", "5"],
                 ["merge", str(folder), str(good), "-o", str(tmp_path / "out.toml")],
                 ["merge", str(good), str(good), "-o", str(folder)]):
        code, _, err = _cli(argv)
        _assert_clear_refusal(code, err, folder)
        assert "folder" in err or "directory" in err.lower()
    assert folder.is_dir() and list(folder.iterdir()) == []


def test_no_permission_to_write_is_a_message_and_the_walk_is_untouched(tmp_path):
    """Tests run as root, and chmod does not stop root: the command runs in a forked child that
    drops to the unprivileged user 'nobody' (uid 65534) first, so the folder's mode really stops
    it; the child also checks os.access, so the test cannot pass by accident."""
    folder = tmp_path / "readonly"
    folder.mkdir()
    path = folder / "walk.toml"
    save_walk(walk_versions(1, runs=2)[0], path)
    before = path.read_bytes()
    os.chmod(path, 0o644)
    os.chmod(folder, 0o555)
    os.chmod(tmp_path, 0o755)
    r, w = os.pipe()
    pid = os.fork()
    if pid == 0:
        code = 99
        try:
            os.close(r)
            if os.getuid() == 0:
                os.setgid(65534)
                os.setuid(65534)
            if os.access(folder, os.W_OK):
                code = 98  # the folder is writable after all: the test would prove nothing
            else:
                out = io.StringIO()
                with (contextlib.redirect_stdout(out),
                      contextlib.redirect_stderr(io.StringIO()) as err):
                    code = main(["add", str(path), "--from", "SVC", "--to", "Pump", "--length",
                                 "10", "--amps", "5"])
                os.write(w, err.getvalue().encode())
        finally:
            os._exit(code)
    os.close(w)
    _, status = os.waitpid(pid, 0)
    err = b""
    while chunk := os.read(r, 4096):
        err += chunk
    os.close(r)
    os.chmod(folder, 0o755)
    code = os.waitstatus_to_exitcode(status)
    assert code != 98, "could not make a folder the child cannot write"
    _assert_clear_refusal(code, err.decode(), path)
    assert "ermission denied" in err.decode()
    assert path.read_bytes() == before and not backup_path(path).exists()


def test_a_file_over_the_size_limit_is_refused_before_it_is_parsed(tmp_path):
    path = tmp_path / "walk.toml"
    with open(path, "wb") as handle:
        handle.write(b"schema = 1\n")
        handle.truncate(MAX_WALK_BYTES + 1)
    code, _, err = _cli(["check", str(path)])
    _assert_clear_refusal(code, err, path)
    assert "20 MB" in err


def test_more_runs_than_the_limit_are_refused_on_read_and_on_save(tmp_path):
    run = ('[[run]]\nid = "R{i}"\nfrom = "SVC"\nto = "x"\nlength = "1"\n'
           'load = {{ value = 1, unit = "A" }}\n')
    text = "schema = 1\n" + "".join(run.format(i=i) for i in range(MAX_RUNS + 1))
    assert len(text) < MAX_WALK_BYTES
    job, problems = check_walk_text(text, "big.toml")
    assert job is None and len(problems) == 1
    assert f"{MAX_RUNS + 1:,} runs" in str(problems[0]) and f"{MAX_RUNS:,}" in str(problems[0])
    # a walk grown past the limit in memory is not written
    job = walk_versions(1, runs=1)[0]
    job.runs = job.runs + [job.runs[-1]] * MAX_RUNS
    path = tmp_path / "walk.toml"
    with pytest.raises(WalkFileError, match="at most"):
        save_walk(job, path)
    assert not path.exists()


def test_the_app_says_why_a_broken_walk_cannot_open_and_writes_nothing(tmp_path):
    """The app leaves with status 2 and one line naming the file for each kind of broken file."""
    import asyncio

    from gaugewalk.tui.app.app import make_app

    cases = {
        "empty.toml": b"",
        "junk.toml": b"\xff\xfe\x00junk",
        "deep.toml": b"schema = 1\nx = " + b"[" * 5000 + b"]" * 5000 + b"\n",
        "nan.toml": dumps_walk(walk_versions(1, runs=2)[0]).replace(
            'unit = "A"', 'unit = "A", pf = nan', 1).encode(),
    }
    for name, data in cases.items():
        path = tmp_path / name
        path.write_bytes(data)

        async def run(path):
            app = make_app(str(path), config_dir=tmp_path / "cfg")
            from textual.worker import WorkerCancelled

            async with app.run_test(size=(80, 24)) as pilot:
                try:
                    await app.workers.wait_for_complete()
                except WorkerCancelled:  # the app left while opening: what we expect
                    pass
                await pilot.pause()
            return app

        app = asyncio.run(run(path))
        assert app.return_code == 2, name
        assert app.exit_message and name in app.exit_message, (name, app.exit_message)
        assert "\n" not in app.exit_message and len(app.exit_message) < 2 * MAX_MESSAGE
        assert path.read_bytes() == data and not backup_path(path).exists()
    assert math.isfinite(1.0) and sys.version_info >= (3, 11)
