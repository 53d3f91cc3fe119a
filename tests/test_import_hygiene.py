"""model/ and tables/ never pull in Textual or Rich; the calc command stays headless; and the
``tables`` package imported is gaugewalk's own (an HDF5 library is also called ``tables``)."""

import json
import pkgutil
import subprocess
import sys
from pathlib import Path

import pytest

import model
import tables

ROOT = Path(__file__).resolve().parents[1]


def modules_of(package) -> list[str]:
    return sorted(f"{package.__name__}.{m.name}" for m in pkgutil.iter_modules(package.__path__))


def loaded_after_import(*names: str) -> set[str]:
    code = (
        "import importlib, json, sys\n"
        f"for name in {list(names)!r}:\n"
        "    importlib.import_module(name)\n"
        "print(json.dumps(sorted(sys.modules)))\n"
    )
    done = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True,
                          check=True)
    return set(json.loads(done.stdout))


def faces(loaded: set[str]) -> set[str]:
    return {m for m in loaded if m.split(".")[0] in ("textual", "rich")}


@pytest.mark.parametrize("name", modules_of(model) + modules_of(tables))
def test_core_modules_do_not_import_textual_or_rich(name):
    assert faces(loaded_after_import(name)) == set()


def test_the_calc_command_does_not_import_textual():
    assert faces(loaded_after_import("tui.cli", "tui.cmd_calc")) == set()


def test_running_calc_does_not_import_textual():
    code = (
        "import sys, io, contextlib\n"
        "from tui.cli import main\n"
        "with contextlib.redirect_stdout(io.StringIO()):\n"
        "    rc = main(['calc', '--amps', '20', '--length', '50', '--volts', '120'])\n"
        "assert rc == 0, rc\n"
        "print(any(m.split('.')[0] in ('textual', 'rich') for m in sys.modules))\n"
    )
    done = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True,
                          check=True)
    assert done.stdout.strip() == "False"


def test_the_tables_package_is_gaugewalks_own():
    assert getattr(tables, "GAUGEWALK_TABLES", False) is True
    assert Path(tables.__file__).resolve().is_relative_to(ROOT)
