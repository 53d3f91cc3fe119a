"""Compiled TOML parsers measured against ``tomllib`` on walk files; run by hand, never by the
suite.

    python -m bench.toml_parsers --runs 5000 [--repeat 9] [--json]

None of these parsers is a dependency of gaugewalk: install the ones to compare into the venv
first (``pip install rtoml pytomlpp toml-rs tomli``); a parser that is not installed is listed as
such. For each parser, on the synthetic walk of ``--runs`` runs and on every walk in
``sample_walks/``:

- parse time, best of ``--repeat`` interleaved with ``tomllib`` on the same text, and the ratio;
- whether it reads the same data as ``tomllib`` (values and their Python types);
- its import time in a fresh process (best of several, less a bare ``python -c pass``);
- what its error says for a few malformed files made from the sample walk (an unterminated
  string, a duplicate key, a bad value, a bad date, a table defined twice, each on a known line),
  and whether the line and column our messages name (``model/walkfile/read._syntax_problem``)
  can be read from it.
"""

from __future__ import annotations

import argparse
import functools
import importlib
import json
import re
import subprocess
import sys
from pathlib import Path

from bench.timing import interleaved, process_best

ROOT = Path(__file__).resolve().parent.parent

# name -> (module, keyword arguments of its loads, how its error text gives line and column)
PARSERS: dict[str, tuple[str, dict, str]] = {
    "tomllib": ("tomllib", {}, r"\(at line (\d+), column (\d+)\)"),
    # tomllib is tomli's pure-Python code of Python 3.11 (TOML 1.0); tomli's wheels for CPython
    # are compiled with mypyc, and tomli 2.3 and later read TOML 1.1
    "tomli (mypyc-compiled)": ("tomli", {}, r"\(at line (\d+), column (\d+)\)"),
    "rtoml (Rust)": ("rtoml", {}, r"at line (\d+) column (\d+)"),
    "toml-rs (Rust)": ("toml_rs", {}, r"at line (\d+), column (\d+)"),
    "toml-rs, TOML 1.0": ("toml_rs", {"toml_version": "1.0.0"}, r"at line (\d+), column (\d+)"),
    "pytomlpp (C++)": ("pytomlpp", {}, r"at line (\d+), column (\d+)"),
}

NEWER_SYNTAX = {
    "newline in an inline table": "a = {x = 1,\n y = 2}\n",
    "escape \\e": 'a = "\\e"\n',
    "time without seconds": "a = 07:32\n",
}
"""TOML 1.1 that tomllib (TOML 1.0) refuses: a parser that reads it would accept walk files that
gaugewalk reads today with a syntax message, and that other TOML 1.0 tools cannot read."""


def _malformed(sample: str) -> list[tuple[str, str, int]]:
    """(what, text, the line [1-based] a message should name) made from a walk's text."""
    lines = sample.splitlines()
    runs = [i for i, t in enumerate(lines) if t.strip() == "[[run]]"]
    k = runs[len(runs) // 2]           # a run table in the middle of the file
    id_line = next(i for i in range(k, len(lines)) if lines[i].startswith("id = "))
    length_line = next(i for i in range(k, len(lines)) if lines[i].startswith("length = "))
    date_line = next((i for i, t in enumerate(lines) if t.startswith("walked_on = ")), None)
    cases = []

    def case(what: str, at: int, new: str | list[str]) -> None:
        out = list(lines)
        out[at:at + 1] = [new] if isinstance(new, str) else new
        cases.append((what, "\n".join(out) + "\n", at + 1))

    case("unterminated string", id_line, lines[id_line].rstrip('"'))
    case("duplicate key", id_line + 1, [lines[id_line], lines[id_line + 1]])
    case("bad value (unquoted text)", length_line, "length = 85ft")
    if date_line is not None:
        case("bad date", date_line, "walked_on = 2024-13-40")
    case("table defined twice", k + 1, ["[job]", lines[k + 1]])
    return cases


def _import_times(modules: list[str], starts: int) -> dict[str, float]:
    """Import time [ms] of each module in a fresh process, less a bare interpreter start."""
    cmds = {"bare": [sys.executable, "-c", "pass"]}
    cmds.update({m: [sys.executable, "-c", f"import {m}"] for m in modules})
    best = process_best(cmds, starts)
    return {m: (best[m] - best["bare"]) * 1000.0 for m in modules}


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m bench.toml_parsers",
                                     description=__doc__.split("\n")[0])
    parser.add_argument("--runs", type=int, default=5000, help="runs in the synthetic walk")
    parser.add_argument("--repeat", type=int, default=9, help="timed repeats of each parse")
    parser.add_argument("--starts", type=int, default=7, help="processes for each import time")
    parser.add_argument("--json", action="store_true", help="end with one JSON object")
    args = parser.parse_args(argv)

    import tomllib

    from tests.support.synthetic_walk import synthetic_walk_text

    walks = {f"synthetic {args.runs:,} runs": synthetic_walk_text(args.runs)}
    for p in sorted((ROOT / "sample_walks").glob("*.toml")):
        walks[p.name] = p.read_text(encoding="utf-8")
    reference = {name: tomllib.loads(text) for name, text in walks.items()}

    loaded = {}   # label -> its loads
    version = {}
    for label, (module, kwargs, _) in PARSERS.items():
        try:
            m = importlib.import_module(module)
        except ImportError:
            print(f"{label}: not installed (pip install it into the venv to compare)")
            continue
        loaded[label] = functools.partial(m.loads, **kwargs)
        version[label] = getattr(m, "__version__", "") or _dist_version(module)

    out: dict = {"parsers": {}}
    print(f"parse time against tomllib, best of {args.repeat} interleaved (ratio: lower is faster)")
    for walk, text in walks.items():
        fns = {label: (lambda f=f, t=text: f(t)) for label, f in loaded.items()}
        best = interleaved(fns, args.repeat)
        base = best["tomllib"][0]
        print(f"  {walk} ({len(text) / 1024:,.0f} KiB):")
        for label, f in loaded.items():
            data = f(text)
            same = data == reference[walk] and _types(data) == _types(reference[walk])
            ms = best[label][0]
            entry = out["parsers"].setdefault(label, {"version": version[label], "walks": {}})
            entry["walks"][walk] = {"parse_ms": ms, "ratio": ms / base, "same_data": same}
            print(f"    {label:<24} {ms:8.2f} ms  {ms / base:5.2f}x  same data as tomllib: "
                  f"{'yes' if same else 'NO'}")

    modules = sorted({PARSERS[label][0] for label in loaded})
    imports = _import_times(modules, args.starts)
    print(f"import time in a fresh process, less a bare start (best of {args.starts}):")
    for label in loaded:
        ms = imports[PARSERS[label][0]]
        out["parsers"][label]["import_ms"] = ms
        print(f"  {label:<24} {ms:6.1f} ms")

    sample = walks.get("warehouse_dc2.toml") or next(iter(walks.values()))
    print("errors on malformed walks (the line the message should name; what each parser says):")
    for what, text, line in _malformed(sample):
        print(f"  {what}, line {line}:")
        for label, f in loaded.items():
            pattern = PARSERS[label][2]
            try:
                f(text)
            except Exception as exc:  # each parser has its own error class
                said = str(exc)
                found = re.search(pattern, said)
                got = (int(found.group(1)), int(found.group(2))) if found else None
                if hasattr(exc, "lineno"):  # as tomllib's error has from Python 3.14 on
                    attrs = (exc.lineno, getattr(exc, "colno", None))
                    if got is not None and attrs != got:
                        print(f"    {label}: text says {got}, attributes say {attrs}")
                verdict = ("line and column" if got and got[0] == line
                           else f"WRONG LINE {got[0]}" if got else "NO LINE")
                first = " ".join(said.split())
            else:
                got, verdict, first = None, "NO ERROR RAISED", ""
            out["parsers"][label].setdefault("errors", {})[what] = {
                "line": line, "said": got, "verdict": verdict}
            print(f"    {label:<24} {verdict:<16} {first[:110]}")
    print("the error's class; lineno and colno attributes (tomllib has them from Python 3.14 on):")
    for label, f in loaded.items():
        try:
            f("a = \n")
        except Exception as exc:
            names = [a for a in ("lineno", "colno") if hasattr(exc, a)]
            bases = [c.__name__ for c in type(exc).__mro__[1:3]]
            print(f"  {label:<24} {type(exc).__name__} ({', '.join(bases)}); attributes: "
                  f"{', '.join(names) or 'none'}")
            out["parsers"][label]["error_attributes"] = names
    print("TOML 1.1 syntax that tomllib (TOML 1.0) refuses:")
    for what, text in NEWER_SYNTAX.items():
        answers = []
        for label, f in loaded.items():
            try:
                f(text)
            except Exception:  # each parser has its own error class
                answers.append(f"{label}: refuses")
            else:
                answers.append(f"{label}: READS IT")
            reads = answers[-1].endswith("READS IT")
            out["parsers"][label].setdefault("toml_1_1", {})[what] = reads
        print(f"  {what}: " + "; ".join(answers))
    if args.json:
        print(json.dumps(out))
    return 0


def _types(value) -> object:
    """The shape of parsed data with every leaf replaced by its type name."""
    if isinstance(value, dict):
        return {k: _types(v) for k, v in value.items()}
    if isinstance(value, list):
        return [_types(v) for v in value]
    return type(value).__name__


def _dist_version(module: str) -> str:
    done = subprocess.run([sys.executable, "-m", "pip", "show", module.replace("_", "-")],
                          capture_output=True, text=True)
    found = re.search(r"^Version: (\S+)", done.stdout, re.M)
    return found.group(1) if found else ""


if __name__ == "__main__":
    sys.exit(main())
