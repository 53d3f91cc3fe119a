"""pydantic's plugins, looked for without ``importlib.metadata`` when none is installed.

The first pydantic model built imports ``pydantic.plugin._loader``, which imports
``importlib.metadata`` (with ``email``, ``zipfile``, ``socket`` ...) and reads the entry points of
every installed package for the ``pydantic`` group: about a sixth of what ``gaugewalk check``
costs before it reads a file. gaugewalk uses no plugin; a user may have one installed (one that
traces validation, say), and it must still be loaded.

``spare_the_loader()`` looks for the ``[pydantic]`` group itself in the ``entry_points.txt`` of the
installed packages (the ``*.dist-info``, ``*.egg-info`` and ``*.egg`` folders on ``sys.path``, as
``importlib.metadata`` finds them). Only when it finds none, and nothing else could hold one (a
zip on ``sys.path``, another finder of distributions), it puts in ``sys.modules`` a stand-in for
``pydantic.plugin._loader`` whose ``get_plugins()`` answers what the real one would: no
plugins. Any other name asked of the stand-in imports the real module and answers from it, so a
pydantic that asks more of its loader gets the real one: slower, never an error. When a plugin
may be installed, or pydantic's loader is already imported, nothing is changed.

``job.py`` calls it before its first model is built (every walk model is built there), so it
runs for every entry: the command line, the app, its head start, the tests and the benchmark.
``tests/walk/test_pydantic_plugins.py`` checks that the walk model still does not import
``importlib.metadata``, that a plugin installed is still loaded and used, and that validation
gives the same answers both ways.
"""

from __future__ import annotations

import os
import re
import sys
from importlib.machinery import PathFinder
from types import ModuleType

LOADER = "pydantic.plugin._loader"
"""The module of pydantic that finds its plugins (pydantic 2)."""

_GROUP = re.compile(rb"^[ \t]*\[[ \t]*pydantic[ \t]*\][ \t]*\r?$", re.MULTILINE)
"""The ``pydantic`` entry-point group's header in an ``entry_points.txt``."""


def _may_hold_plugins(entry: str) -> bool:
    """Whether the ``sys.path`` entry may declare a ``pydantic`` entry point: a folder is read
    (``importlib.metadata`` reads ``''`` as the working folder), a file (a zip) is assumed to."""
    folder = entry or "."
    if os.path.isfile(folder):
        return True
    try:
        names = os.listdir(folder)
    except OSError:  # missing or unreadable: importlib.metadata finds nothing there either
        return False
    for name in names:
        low = name.lower()
        if low.endswith((".dist-info", ".egg-info")):
            points = os.path.join(folder, name, "entry_points.txt")
        elif low.endswith(".egg"):
            if os.path.isfile(os.path.join(folder, name)):
                return True  # a zipped egg
            points = os.path.join(folder, name, "EGG-INFO", "entry_points.txt")
        else:
            continue
        try:
            with open(points, "rb") as f:
                if _GROUP.search(f.read()):
                    return True
        except OSError:  # no entry points in this package
            continue
    return False


def plugins_may_be_installed() -> bool:
    """True unless no ``pydantic`` entry point can be installed where ``importlib.metadata``
    looks: the folders on ``sys.path``, through the standard path finder only."""
    for finder in sys.meta_path:
        if finder is not PathFinder and hasattr(finder, "find_distributions"):
            return True  # another finder may list distributions of its own
    return any(_may_hold_plugins(entry) for entry in sys.path if isinstance(entry, str))


def _no_plugins() -> tuple:
    """What ``get_plugins()`` gives with no plugin installed: none."""
    return ()


def _real_loader_attribute(name: str):
    """Any name but ``get_plugins`` asked of the stand-in: the real loader is imported in its
    place and answers."""
    if name.startswith("__"):
        raise AttributeError(name)
    import importlib

    stand_in = sys.modules.pop(LOADER, None)
    try:
        real = importlib.import_module(LOADER)
    except ImportError:
        if stand_in is not None:
            sys.modules[LOADER] = stand_in
        raise AttributeError(name) from None
    return getattr(real, name)


def spare_the_loader() -> bool:
    """Put the stand-in loader in place when no pydantic plugin can be installed; True when
    it was put in place (or already was)."""
    present = sys.modules.get(LOADER)
    if present is not None:
        return getattr(present, "get_plugins", None) is _no_plugins
    if plugins_may_be_installed():
        return False
    stand_in = ModuleType(LOADER, "Stand-in for pydantic's plugin loader: no plugin is installed "
                                  "(gaugewalk.model.walk.pydantic_plugins).")
    stand_in.get_plugins = _no_plugins  # type: ignore[attr-defined]
    stand_in.__getattr__ = _real_loader_attribute
    sys.modules[LOADER] = stand_in
    return True
