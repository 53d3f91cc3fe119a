"""model/ and tables/ never pull in Textual or Rich; the calc command stays headless; tables/
stands on the standard library alone; and gaugewalk's names never shadow another library's (an
HDF5 library is imported as ``tables``)."""

import json
import pkgutil
import subprocess
import sys
import tomllib

import gaugewalk.model
import gaugewalk.tables
from tests.support.paths import REPO as ROOT


def modules_under(package) -> list[str]:
    return sorted(m.name for m in pkgutil.walk_packages(package.__path__, package.__name__ + "."))


def loaded_after_import(*names: str, cwd=ROOT) -> set[str]:
    """Modules loaded by a fresh interpreter after importing ``names`` (together: when the union
    pulls in no face, no single one of them does)."""
    code = (
        "import importlib, json, sys\n"
        f"for name in {list(names)!r}:\n"
        "    importlib.import_module(name)\n"
        "print(json.dumps(sorted(sys.modules)))\n"
    )
    done = subprocess.run([sys.executable, "-c", code], cwd=cwd, capture_output=True, text=True,
                          check=True)
    return set(json.loads(done.stdout))


def faces(loaded: set[str]) -> set[str]:
    return {m for m in loaded if m.split(".")[0] in ("textual", "rich")}


def test_core_modules_do_not_import_textual_or_rich():
    core = modules_under(gaugewalk.model) + modules_under(gaugewalk.tables)
    assert len(core) > 20
    assert faces(loaded_after_import(*core)) == set()


def test_tables_import_only_the_standard_library():
    names = modules_under(gaugewalk.tables)
    loaded = loaded_after_import(*names)
    outside = {m.split(".")[0] for m in loaded} - set(sys.stdlib_module_names) - {"gaugewalk"}
    # the interpreter's own start-up modules (site customisation, the editable-install finder)
    outside = {m for m in outside if not m.startswith(("_", "__editable__"))}
    assert outside == set()


def test_the_calc_command_does_not_import_textual():
    assert faces(loaded_after_import("gaugewalk.tui.cli.main", "gaugewalk.tui.cli.calc")) == set()


def test_running_calc_does_not_import_textual():
    code = (
        "import sys, io, contextlib\n"
        "from gaugewalk.tui.cli.main import main\n"
        "with contextlib.redirect_stdout(io.StringIO()):\n"
        "    rc = main(['calc', '--amps', '20', '--length', '50', '--volts', '120'])\n"
        "assert rc == 0, rc\n"
        "print(any(m.split('.')[0] in ('textual', 'rich') for m in sys.modules))\n"
    )
    done = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True,
                          check=True)
    assert done.stdout.strip() == "False"


def test_gaugewalk_and_another_tables_package_live_side_by_side(tmp_path):
    # A stand-in for the HDF5 library's ``tables`` package, first on the path: both import, and
    # each is its own (run outside the repository, as an installed program runs).
    fake = tmp_path / "site" / "tables"
    fake.mkdir(parents=True)
    (fake / "__init__.py").write_text("HDF5_STAND_IN = True\n")
    code = (
        "import sys\n"
        f"sys.path.insert(0, {str(tmp_path / 'site')!r})\n"
        "import tables\n"
        "from gaugewalk.tables.conductor.ampacity import ampacity\n"
        "import gaugewalk.tables\n"
        "assert tables.HDF5_STAND_IN is True\n"
        "assert gaugewalk.tables.GAUGEWALK_TABLES is True\n"
        "print(ampacity('12 AWG', 'cu', 75))\n"
    )
    done = subprocess.run([sys.executable, "-c", code], cwd=tmp_path, capture_output=True,
                          text=True, check=False)
    assert done.returncode == 0, done.stderr
    assert float(done.stdout) == 25.0  # NEC 2023 Table 310.16, 12 AWG Cu at 75 C


def test_gaugewalk_installs_no_top_level_name_but_its_own(tmp_path):
    code = ("import importlib.util\n"
            "print([n for n in ('tables', 'model', 'tui') if importlib.util.find_spec(n)])\n")
    done = subprocess.run([sys.executable, "-c", code], cwd=tmp_path, capture_output=True,
                          text=True, check=True)
    assert done.stdout.strip() == "[]"


def test_every_package_folder_is_listed_for_installation():
    listed = set(tomllib.loads((ROOT / "pyproject.toml").read_text())["tool"]["setuptools"]
                 ["packages"])
    found = {"gaugewalk." + str(p.parent.relative_to(ROOT)).replace("/", ".")
             for top in ("tables", "model", "tui") for p in (ROOT / top).rglob("__init__.py")}
    assert found == listed
