"""Problems found in a walk, each with where it is: file, line, run or source, field.

Public API:

- ``Problem(file, line, where, field, message)``; ``str(problem)`` is one line a foreman reads:
  ``shop.toml line 42, run R12, length: the length '8O' cannot be read ...``.
- ``Locator(text)``: finds the line of the N-th ``[[run]]`` / ``[[source]]`` table and of a key
  in it, in the TOML text as written.
- ``problems_from_errors(errors, table, index, locator, file, where)``: pydantic errors as Problems.
- ``check_references(job, locator, file, skip_sources, skip_runs)``: duplicate ids, dangling
  references, cycles, feeders and what each system can supply.
- ``default_connection(system_id, to_transformer)`` and ``connection_of(job, run)``.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from gaugewalk.model.walk.job import Job, Run
from gaugewalk.model.engine.circuits import SYSTEMS, CircuitError, resolve_circuit


@dataclass(frozen=True)
class Problem:
    """One thing wrong with a walk, and where."""

    file: str
    line: int | None
    where: str          # "run R12", "source LP1", "defaults", "job", "file"
    field: str | None   # "length", "load.value", None for the whole table
    message: str

    def __str__(self) -> str:
        parts = []
        head = self.file or "walk"
        if self.line is not None:
            head += f" line {self.line}"
        parts.append(head)
        if self.where:
            parts.append(_clip(self.where))
        if self.field:
            parts.append(_clip(self.field))
        return ", ".join(parts) + ": " + _clip(self.message)

    def to_dict(self) -> dict:
        return {
            "file": self.file, "line": self.line, "where": self.where,
            "field": self.field, "message": self.message,
        }


_LONG_WORD = re.compile(r"\S{61,}|\s{61,}")


_CONTROL = {c: repr(chr(c))[1:-1] for c in (*range(32), 127, 0x85, 0x2028, 0x2029)}


def _clip(text: str) -> str:
    """Keep a problem on one readable line: control characters and line breaks in an echoed
    value are shown escaped (``\\n``), and any word or gap over 60 characters (a pasted id or
    value, a run of spaces) is shortened."""
    text = text.translate(_CONTROL)
    return _LONG_WORD.sub(lambda m: f"{m.group(0)[:40]}…({len(m.group(0)):,} characters)", text)


# -- locating tables and keys in the text ------------------------------------------------------

_HEADER_RE = re.compile(r"^\s*(\[\[?)\s*([A-Za-z0-9_.\"' -]+?)\s*(\]\]?)\s*(#.*)?$")
_KEY_RE = re.compile(r"^\s*(\"[^\"]*\"|'[^']*'|[A-Za-z0-9_-]+)\s*(\.|=)")


class Locator:
    """Line numbers (1-based) of tables and keys in a walk file's text."""

    def __init__(self, text: str = "") -> None:
        self._tables: dict[tuple[str, int | None], int] = {}
        self._keys: dict[tuple[str, int | None], dict[str, int]] = {}
        counts: dict[str, int] = {}
        current: tuple[str, int | None] = ("", None)
        self._keys[current] = {}
        in_multiline: str | None = None
        for number, line in enumerate(text.splitlines(), start=1):
            if in_multiline:
                if line.count(in_multiline) % 2 == 1:
                    in_multiline = None
                continue
            header = _HEADER_RE.match(line)
            if header and header.group(1) == header.group(3)[::-1].replace("]", "["):
                name = header.group(2).strip().strip("\"'")
                base, _, sub = name.partition(".")
                if header.group(1) == "[[" and not sub:
                    index = counts.get(base, 0)
                    counts[base] = index + 1
                    current = (base, index)
                    self._tables[current] = number
                    self._keys.setdefault(current, {})
                elif sub and base in counts:  # [run.load] under the latest [[run]]
                    current = (base, counts[base] - 1)
                    self._keys[current].setdefault(sub.split(".")[0], number)
                else:
                    current = (name, None)
                    self._tables.setdefault(current, number)
                    self._keys.setdefault(current, {})
                continue
            key = _KEY_RE.match(line)
            if key:
                self._keys[current].setdefault(key.group(1).strip("\"'"), number)
                for quote in ('"""', "'''"):
                    if line.count(quote) % 2 == 1:
                        in_multiline = quote

    def table_line(self, table: str, index: int | None = None) -> int | None:
        """Line of ``[table]`` or of the ``index``-th ``[[table]]`` (0-based), or None."""
        return self._tables.get((table, index))

    def key_line(self, table: str, index: int | None, key: str) -> int | None:
        """Line of ``key`` in that table (top-level keys: ``table=""``), else the table's line."""
        found = self._keys.get((table, index), {}).get(key)
        return found if found is not None else self.table_line(table, index)


# -- pydantic errors -> problems ---------------------------------------------------------------

_FIELD_NAMES = {"from_": "from"}


def _friendly(error: dict) -> str:
    kind = error.get("type", "")
    ctx = error.get("ctx") or {}
    value = error.get("input")
    shown = repr(value) if isinstance(value, str) else str(value)
    if kind == "missing":
        return "is missing"
    if kind == "extra_forbidden":
        return "is not a key gaugewalk knows (check the spelling)"
    if kind in ("greater_than", "greater_than_equal", "less_than", "less_than_equal"):
        words = {"greater_than": "above", "greater_than_equal": "at least",
                 "less_than": "below", "less_than_equal": "at most"}[kind]
        limit = next(iter(ctx.values()), "")
        if isinstance(limit, float):
            limit = f"{limit:g}"
        return f"must be {words} {limit}, not {shown}"
    if kind in ("float_parsing", "float_type", "int_parsing", "int_type", "int_from_float"):
        whole = "a whole number" if kind.startswith("int") else "a number"
        return f"must be {whole}, not {shown}"
    if kind == "literal_error":
        return f"must be {ctx.get('expected', 'one of the listed values')}, not {shown}"
    if kind in ("string_type",):
        return f"must be text in quotes, not {shown}"
    if kind in ("bool_type", "bool_parsing"):
        return f"must be true or false, not {shown}"
    if kind.startswith("date"):
        return f"must be a date such as 2024-05-02, not {shown}"
    if kind in ("model_type", "model_attributes_type", "dict_type"):
        return f"must be a table of keys, not {shown}"
    if kind == "list_type":
        return f"must be a list, not {shown}"
    if kind in ("string_too_short",):
        return "must not be empty"
    if kind in ("string_too_long",):
        return f"is too long (at most {ctx.get('max_length')} characters)"
    message = str(error.get("msg", "is not valid"))
    return message.removeprefix("Value error, ")


def problems_from_errors(
    errors: list[dict],
    table: str,
    index: int | None,
    locator: Locator,
    file: str,
    where: str,
) -> list[Problem]:
    """Turn pydantic ``errors()`` for one table of the file into Problems with lines."""
    out = []
    for error in errors:
        loc = [_FIELD_NAMES.get(str(p), str(p)) for p in error.get("loc", ())]
        field = ".".join(loc) or None
        message = _friendly(error)
        if field is None and "segments" in message:
            field = "segments"
        line = locator.key_line(table, index, loc[0] if loc else (field or ""))
        if field is None or error.get("type") in ("value_error", "assertion_error"):
            sentence = message
        else:
            sentence = f"'{field.split('.')[-1]}' {message}"
        out.append(Problem(file, line, where, field, sentence))
    return out


# -- references, cycles, systems ---------------------------------------------------------------

_FULL_CONNECTION = {(3, True): "3PN", (3, False): "3P", (1, True): "LLN", (1, False): "LL"}


def default_connection(system_id: str, to_transformer: bool = False) -> str:
    """The connection a run uses when it names none: every hot the system offers and its
    neutral; a transformer primary takes the hots only (common practice)."""
    system = SYSTEMS[system_id]
    if system.hots == 1:
        return "LN"
    if to_transformer:
        return "3P" if system.phases == 3 else "LL"
    return _FULL_CONNECTION[(system.phases, system.has_neutral)]


def connection_of(job: Job, run: Run) -> str | None:
    """The run's connection, or its default from the source's system; None if the source is
    unknown."""
    if run.connection is not None:
        return run.connection
    source = job.source(run.from_)
    if source is None:
        return None
    target = job.source(run.to)
    return default_connection(source.system, target is not None and target.kind == "transformer")


def _delivers(circuit, system_id: str) -> bool:
    """True when a feeder's circuit brings the destination's system (same phases, voltage,
    neutral)."""
    system = SYSTEMS[system_id]
    return (
        circuit.phases == system.phases
        and abs(circuit.line_volts - system.line_to_line_v) < 0.5
        and circuit.neutral == system.has_neutral
        and (system.has_neutral or circuit.hots == system.hots)
    )


def check_references(
    job: Job,
    locator: Locator,
    file: str,
    skip_sources: set[str] = frozenset(),
    skip_runs: set[str] = frozenset(),
    failed_targets: set[str] = frozenset(),
) -> list[Problem]:
    """Everything that needs more than one table: duplicate ids, a run from a source that does not
    exist, sources without a feeder or with two, a chain that loops, a connection the source's
    system cannot supply, a feeder that does not deliver its panel's system, a branch without a
    load. ``skip_*`` are ids of tables that already failed, and ``failed_targets`` the ``to`` of runs
that failed, so one mistake is reported once."""
    problems: list[Problem] = []
    source_index = {id(s): i for i, s in enumerate(job.sources)}
    run_index = {id(r): i for i, r in enumerate(job.runs)}

    def at_run(run: Run, field: str | None, message: str) -> None:
        i = run_index[id(run)]
        line = locator.key_line("run", i, field) if field else locator.table_line("run", i)
        problems.append(Problem(file, line, f"run {run.id}", field, message))

    def at_source(source, field: str | None, message: str) -> None:
        i = source_index[id(source)]
        line = locator.key_line("source", i, field) if field else locator.table_line("source", i)
        problems.append(Problem(file, line, f"source {source.id}", field, message))

    seen: dict[str, int] = {}
    for i, s in enumerate(job.sources):
        if s.id in seen:
            at_source(s, "id", f"the id '{s.id}' is used by another source too "
                      f"(line {locator.table_line('source', seen[s.id])}); ids must differ")
        else:
            seen[s.id] = i
    seen_runs: dict[str, int] = {}
    for i, r in enumerate(job.runs):
        if r.id in seen_runs:
            at_run(r, "id", f"the id '{r.id}' is used by another run too "
                   f"(line {locator.table_line('run', seen_runs[r.id])}); ids must differ")
        else:
            seen_runs[r.id] = i

    sources = {s.id: s for s in reversed(job.sources)}  # first one wins
    feeders: dict[str, Run] = {}
    for r in job.runs:
        if r.to in sources and r.from_ in sources:
            if r.to in feeders:
                at_run(r, "to", f"source {r.to} is already fed by run {feeders[r.to].id}; "
                       "a source has one feeder (use 'sets' for conductors in parallel)")
            else:
                feeders[r.to] = r

    for s in job.sources:
        if s.id in skip_sources:
            continue
        if s.kind == "service":
            if s.id in feeders:
                at_source(s, "kind", f"a service is fed by the utility, but run "
                          f"{feeders[s.id].id} feeds it; make it a panel or switchboard")
        elif s.id not in feeders and s.id not in failed_targets:
            at_source(s, None, f"nothing feeds this {s.kind}; add a run to it from its source, "
                      "or make it the service")

    # cycles: follow each source up its feeders
    reported: set[str] = set()
    for s in job.sources:
        chain: list[str] = []
        current = s.id
        while current in feeders and current not in chain:
            chain.append(current)
            current = feeders[current].from_
        if current in chain and not reported.intersection(chain):
            loop = chain[chain.index(current):] + [current]
            reported.update(loop)
            at_run(feeders[current], "from",
                   "the feeders go round in a loop: " + " <- ".join(loop)
                   + "; one of them must come from another source")

    circuits: dict[tuple[str, str | None], object] = {}  # Circuit or the CircuitError
    for r in job.runs:
        if r.id in skip_runs:
            continue
        source = sources.get(r.from_)
        if source is None:
            if r.from_ not in skip_sources:
                at_run(r, "from", f"the run starts at '{r.from_}', which is not a source of this "
                       "job; add the source or correct the id")
            continue
        if r.from_ == r.to:
            at_run(r, "to", "the run ends where it starts")
            continue
        target = sources.get(r.to)
        if source.id in skip_sources or (target is not None and target.id in skip_sources):
            continue
        connection = connection_of(job, r)
        circuit = circuits.get((source.system, connection))
        if circuit is None:  # a walk has few systems and connections: resolve each pair once
            try:
                circuit = resolve_circuit(source.system, connection)
            except CircuitError as exc:
                circuit = exc
            circuits[(source.system, connection)] = circuit
        if isinstance(circuit, CircuitError):
            at_run(r, "connection" if r.connection else "from",
                   f"{connection} from source {source.id}: {circuit}")
            continue
        if target is None:
            if r.to in skip_sources:
                continue
            if r.load is None:
                at_run(r, "load", "the run has no load; give it in A, VA, kVA, W or kW")
        elif target.kind != "transformer" and not _delivers(circuit, target.system):
            at_run(r, "connection" if r.connection else "to",
                   f"this feeder from {source.id} ({source.system}, {connection}) cannot bring "
                   f"{target.id}'s system {target.system}; only a transformer changes the "
                   "system")
    return problems
