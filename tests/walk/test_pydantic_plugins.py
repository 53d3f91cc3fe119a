"""pydantic's plugin loader spared when no plugin is installed
(``gaugewalk.model.walk.pydantic_plugins``): the walk model is built without
``importlib.metadata``, a plugin that is installed is still loaded and used, and a walk validates
to the same answers with the stand-in as with pydantic's own loader."""

from __future__ import annotations

import json
import os
import subprocess
import sys
import zipfile

import pytest

from gaugewalk.model.walk import pydantic_plugins
from tests.support.paths import REPO, SAMPLES


def _python(code: str, cwd, extra_path=None) -> str:
    """Run ``code`` in a fresh interpreter (working folder ``cwd``); its standard output."""
    env = dict(os.environ)
    if extra_path is not None:
        env["PYTHONPATH"] = os.pathsep.join(
            p for p in (str(extra_path), env.get("PYTHONPATH", "")) if p)
    done = subprocess.run([sys.executable, "-c", code], cwd=cwd, env=env, capture_output=True,
                          text=True, check=True)
    return done.stdout


def test_the_walk_model_is_built_without_importlib_metadata(tmp_path):
    out = _python(
        "import json, sys\n"
        "from gaugewalk.model.walk.job import Run\n"
        "Run(id='R1', **{'from': 'LP1'}, to='Dock door', length='85')\n"
        "loader = sys.modules['pydantic.plugin._loader']\n"
        "print(json.dumps(['importlib.metadata' in sys.modules, getattr(loader, '__file__', None),"
        " list(loader.get_plugins())]))\n", cwd=tmp_path)
    # the stand-in, which has no file, answered for pydantic's loader: no plugins
    assert json.loads(out) == [False, None, []]


def _install_plugin(site) -> None:
    """A pydantic plugin installed as a package's entry point in ``site`` (a folder put on the
    path): it notes each model's validator made and each validation."""
    info = site / "gw_probe_plugin-1.0.dist-info"
    info.mkdir(parents=True)
    (info / "METADATA").write_text("Metadata-Version: 2.1\nName: gw-probe-plugin\nVersion: 1.0\n")
    (info / "entry_points.txt").write_text("[pydantic]\nprobe = gw_probe_plugin:plugin\n")
    (site / "gw_probe_plugin.py").write_text(
        "seen = []\n"
        "class _Handler:\n"
        "    def on_enter(self, *args, **kwargs):\n"
        "        seen.append('validated')\n"
        "class _Plugin:\n"
        "    def new_schema_validator(self, schema, schema_type, path, kind, config, settings):\n"
        "        seen.append(path.name)\n"
        "        return _Handler(), None, None\n"
        "plugin = _Plugin()\n")


def test_a_plugin_installed_is_still_loaded_and_used(tmp_path):
    _install_plugin(tmp_path / "site")
    out = _python(
        "import json, sys\n"
        "from gaugewalk.model.walk.job import Job, Run\n"
        "Run(id='R1', **{'from': 'LP1'}, to='Dock door', length='85')\n"
        "import gw_probe_plugin\n"
        "print(json.dumps(gw_probe_plugin.seen))\n"
        "Job()  # a model built on first use (defer_build) is built now\n"
        "print(json.dumps(gw_probe_plugin.seen))\n", cwd=tmp_path, extra_path=tmp_path / "site")
    first, then = (json.loads(line) for line in out.splitlines())
    assert "Run" in first  # consulted for every model built as it is made
    assert "validated" in first  # and called as the run was validated
    assert "Job" not in first and "Job" in then  # and for a model built when first used


_ANSWERS = (
    "import contextlib, io, json, sys\n"
    "if sys.argv[1] == 'real':\n"
    "    import pydantic.plugin._loader  # pydantic's own loader, before the walk model\n"
    "from gaugewalk.tui.cli.main import main\n"
    "answers = []\n"
    "for walk in sys.argv[2:]:\n"
    "    out, err = io.StringIO(), io.StringIO()\n"
    "    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):\n"
    "        code = main(['check', '--json', walk])\n"
    "    answers.append([code, out.getvalue(), err.getvalue()])\n"
    "loader = sys.modules['pydantic.plugin._loader']\n"
    "print(json.dumps([getattr(loader, '__file__', None) is None, answers]))\n"
)


def test_a_walk_validates_the_same_with_the_stand_in_as_with_pydantics_loader(tmp_path):
    bad = tmp_path / "bad.toml"
    bad.write_text('schema = 1\n[[source]]\nid = "SVC"\nkind = "service"\nsystem = "480Y/277"\n'
                   '[[run]]\nid = "R1"\nfrom = "SVC"\nto = "Pump"\nlength = "85+x"\n'
                   'load = "12 A"\nsets = 0\n[[run]]\nid = "R 2!"\nfrom = "SVC"\nto = "Fan"\n'
                   'length = 40\nload = "3 hp"\nmaterial = "silver"\n')
    walks = [str(SAMPLES / "warehouse_dc2.toml"), str(SAMPLES / "farm_workshop.toml"), str(bad)]
    spared, answers = json.loads(subprocess.run(
        [sys.executable, "-c", _ANSWERS, "spared", *walks], cwd=tmp_path, capture_output=True,
        text=True, check=True).stdout)
    real, real_answers = json.loads(subprocess.run(
        [sys.executable, "-c", _ANSWERS, "real", *walks], cwd=tmp_path, capture_output=True,
        text=True, check=True).stdout)
    assert (spared, real) == (True, False)
    assert answers == real_answers
    assert answers[2][0] == 2 and "R1" in answers[2][2] and "length" in answers[2][2]


def test_a_name_the_stand_in_lacks_is_answered_by_pydantics_own_loader(tmp_path):
    # a later pydantic asking its loader for more than get_plugins gets the real module
    out = _python(
        "import sys\n"
        "from gaugewalk.model.walk.pydantic_plugins import LOADER, spare_the_loader\n"
        "assert spare_the_loader() and sys.modules[LOADER].get_plugins() == ()\n"
        "from pydantic.plugin._loader import PYDANTIC_ENTRY_POINT_GROUP\n"
        "print(PYDANTIC_ENTRY_POINT_GROUP, sys.modules[LOADER].__file__.endswith('_loader.py'))\n",
        cwd=tmp_path)
    assert out.split() == ["pydantic", "True"]


@pytest.fixture
def only_path(monkeypatch, tmp_path):
    """``sys.path`` holding only a fresh folder, which is returned."""
    site = tmp_path / "site"
    site.mkdir()
    monkeypatch.setattr(sys, "path", [str(site)])
    return site


def test_packages_without_the_pydantic_group_hold_no_plugin(only_path):
    info = only_path / "other-2.0.dist-info"
    info.mkdir()
    (info / "entry_points.txt").write_text("[console_scripts]\npydantic = other:main\n")
    (only_path / "plain-1.0.egg-info").write_text("Name: plain\n")  # an egg-info as a file
    assert pydantic_plugins.plugins_may_be_installed() is False


@pytest.mark.parametrize("where", ["plug-1.0.dist-info", "Plug-1.0.EGG-INFO",
                                   "plug-1.0-py3.11.egg/EGG-INFO"])
def test_the_pydantic_group_is_found_wherever_importlib_metadata_looks(only_path, where):
    folder = only_path / where
    folder.mkdir(parents=True)
    (folder / "entry_points.txt").write_text("[console_scripts]\nx = y:z\n\n [ pydantic ] \n"
                                             "probe = plug:plugin\n")
    assert pydantic_plugins.plugins_may_be_installed() is True


def test_a_zip_on_the_path_or_a_zipped_egg_may_hold_a_plugin(only_path, monkeypatch):
    with zipfile.ZipFile(only_path / "plug-1.0-py3.11.egg", "w") as egg:
        egg.writestr("EGG-INFO/entry_points.txt", "[pydantic]\nprobe = plug:plugin\n")
    assert pydantic_plugins.plugins_may_be_installed() is True
    (only_path / "plug-1.0-py3.11.egg").unlink()
    assert pydantic_plugins.plugins_may_be_installed() is False
    monkeypatch.setattr(sys, "path", [str(REPO / "README.md")])  # any file on the path
    assert pydantic_plugins.plugins_may_be_installed() is True


def test_another_finder_of_distributions_may_hold_a_plugin(only_path, monkeypatch):
    class Finder:
        @staticmethod
        def find_distributions(context=None):
            return iter(())

    monkeypatch.setattr(sys, "meta_path", [*sys.meta_path, Finder()])
    assert pydantic_plugins.plugins_may_be_installed() is True
