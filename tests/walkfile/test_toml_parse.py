"""The walk reader's TOML parser (``model/walkfile/toml_parse.py``) against ``tomllib``, the
reference (Python's standard library, TOML 1.0): the same data on every sample, golden and
synthetic walk, the same message on malformed walks, and on mutated and random text either the
same data or the same refusal."""

from __future__ import annotations

import math
import tomllib

import pytest
from hypothesis import example, given
from hypothesis import strategies as st
from packaging.markers import Marker
from packaging.requirements import Requirement

from gaugewalk.model.walkfile import toml_parse
from gaugewalk.model.walkfile.read import check_walk_text
from gaugewalk.model.walkfile.toml_parse import parse_toml
from tests.support.paths import GOLDEN, REPO, SAMPLES
from tests.support.synthetic_walk import synthetic_walk_text

WALKS = sorted(SAMPLES.glob("*.toml")) + sorted(GOLDEN.glob("*.toml"))


def typed(value):
    """The data with every value's type beside it (``1`` and ``1.0`` and ``True`` differ; a
    float by its exact bits; NaN by itself, as toml++ drops the sign of ``-nan``). Table keys
    compare as a set: toml++ gives them sorted (the module docstring says why that is harmless)."""
    if isinstance(value, dict):
        return ("table", sorted((k, typed(v)) for k, v in value.items()))
    if isinstance(value, list):
        return ("array", [typed(v) for v in value])
    if isinstance(value, float):
        return ("float", "nan" if math.isnan(value) else value.hex())
    tz = getattr(value, "tzinfo", None)
    return (type(value).__name__, value, type(tz).__name__, tz and value.utcoffset())


def reference(text: str):
    """``("data", typed data)`` or ``("refused", message)`` from tomllib."""
    try:
        return ("data", typed(tomllib.loads(text)))
    except tomllib.TOMLDecodeError as exc:
        return ("refused", str(exc))
    except RecursionError:
        return ("refused", "nested too deep")


def ours(text: str):
    try:
        return ("data", typed(parse_toml(text)))
    except tomllib.TOMLDecodeError as exc:
        return ("refused", str(exc))
    except RecursionError:
        return ("refused", "nested too deep")


def test_the_compiled_parser_is_used_wherever_the_dependency_installs_it():
    needed = next(Requirement(r) for r in tomllib.loads((REPO / "pyproject.toml").read_text())
                  ["project"]["dependencies"] if r.startswith("pytomlpp"))
    assert needed.marker is not None
    expected = "pytomlpp" if Marker(str(needed.marker)).evaluate() else None
    assert toml_parse.COMPILED == expected


@pytest.mark.parametrize("path", WALKS, ids=lambda p: p.name)
def test_every_sample_and_golden_walk_reads_the_same_as_with_tomllib(path):
    text = path.read_text(encoding="utf-8")
    assert ours(text) == reference(text)
    assert ours(text)[0] == "data"


def test_a_synthetic_walk_of_600_runs_reads_the_same_as_with_tomllib():
    text = synthetic_walk_text(600)
    assert ours(text) == reference(text) and ours(text)[0] == "data"


def malformed(text: str) -> list[tuple[str, str, int]]:
    """(what, text, the line [1-based] the message must name), each made from a walk's text."""
    lines = text.splitlines()
    k = next(i for i, t in enumerate(lines) if t.strip() == "[[run]]")
    id_line = next(i for i in range(k, len(lines)) if lines[i].startswith("id = "))
    length_line = next(i for i in range(k, len(lines)) if lines[i].startswith("length = "))
    cases = []

    def case(what: str, at: int, new: list[str], bad: int = 0) -> None:
        """Line ``at`` (0-based) replaced by ``new``, whose line ``bad`` is the one wrong."""
        out = list(lines)
        out[at:at + 1] = new
        cases.append((what, "\n".join(out) + "\n", at + bad + 1))

    case("unterminated string", id_line, [lines[id_line].rstrip('"')])
    case("duplicate key", id_line + 1, [lines[id_line], lines[id_line + 1]])  # names the 2nd
    case("unquoted text", length_line, ["length = 85ft"])
    case("bad date", id_line, [lines[id_line], "measured_on = 2024-13-40"], 1)
    case("table defined twice", k + 1, ["[job]", lines[k + 1]])
    case("newline in an inline table (TOML 1.1)", length_line,
         [lines[length_line], "load = { value = 5,", '  unit = "A" }'], 1)
    case("escape \\e (TOML 1.1)", id_line, [lines[id_line], 'notes = "\\e"'], 1)
    case("time without seconds (TOML 1.1)", id_line, [lines[id_line], "notes = 07:32"], 1)
    return cases


@pytest.mark.parametrize("what,text,line", malformed(synthetic_walk_text(40)),
                         ids=lambda v: v if isinstance(v, str) and len(v) < 60 else "")
def test_a_malformed_walk_gets_tomllibs_message_naming_its_line(what, text, line, monkeypatch):
    _, problems = check_walk_text(text, "walk.toml")
    monkeypatch.setattr(toml_parse, "_compiled", None)  # tomllib alone
    _, alone = check_walk_text(text, "walk.toml")
    assert [str(p) for p in problems] == [str(p) for p in alone]
    assert [p.line for p in problems] == [line], what


def test_a_byte_order_mark_is_refused_as_tomllib_refuses_it():
    text = "\ufeff" + (SAMPLES / "warehouse_dc2.toml").read_text(encoding="utf-8")
    assert ours(text) == reference(text) and ours(text)[0] == "refused"


@pytest.mark.parametrize("depth", [300, 1000, 100_000])
def test_nesting_toml_plus_plus_refuses_is_left_to_tomllib(depth):
    text = "x = " + "[" * depth + "1" + "]" * depth + "\n"
    assert ours(text) == reference(text)


# -- mutated and random text -------------------------------------------------------------------

SAMPLE_LINES = [line for path in WALKS
                for line in path.read_text(encoding="utf-8").splitlines(keepends=True)]
TOKENS = (list("[]{}=,.\"'#\n\\ \t\r") + [
    "a", "b", "1", "-0", "1.5", "1e5", "11e340", "true", "inf", "-nan", "0x1F", "0o7", "0b1",
    "1_000", "9223372036854775808", "1979-05-27", "07:32:00", "07:32", "07:32:00.5", "Z",
    "+01:00", "T", "1979-05-27T07:32:00Z", "1979-05-27 07:32:00+05:30",
    "1979-05-27T07:32:00.123456789", '"""', "'''", "\\u0041", "\\U0001F600", "\\e", "\\t",
    "\x00", "\x7f", "\ufeff", "\ud800", "é", "[[run]]", "[job]", "a.b", "{a=1}", "{a=1,\n}",
    "a = ", "\nb = ", "\n[a.b]\n",
])


@given(start=st.integers(0, len(SAMPLE_LINES) - 1), size=st.integers(1, 40),
       edits=st.lists(st.tuples(st.floats(0, 1), st.sampled_from(["insert", "delete", "swap"]),
                                st.sampled_from(TOKENS)), min_size=1, max_size=3))
def test_a_mutated_walk_reads_or_is_refused_the_same_as_with_tomllib(start, size, edits):
    text = "".join(SAMPLE_LINES[start:start + size])
    for where, how, token in edits:
        at = int(where * len(text))
        if how == "insert":
            text = text[:at] + token + text[at:]
        elif how == "delete":
            text = text[:at] + text[at + len(token):]
        else:
            text = text[:at] + token + text[at + 1:]
    assert ours(text) == reference(text)


@given(st.lists(st.sampled_from(TOKENS), max_size=30).map("".join))
@example("a = -nan\n")
@example("\ufeffa = 1\n")
@example("a = 9223372036854775808\n")
@example('a = "\ud800"\n')
def test_random_toml_reads_or_is_refused_the_same_as_with_tomllib(text):
    assert ours(text) == reference(text)
