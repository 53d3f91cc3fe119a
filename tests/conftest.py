"""What every test shares: its own config folders, and the Hypothesis profiles.

- Each test runs with XDG folders of its own (config, state, data, cache) in a fresh temporary
  folder beside its ``tmp_path``, never inside it, so the app never reads or writes the real
  ``~/.config`` and no test sees another's recent walks or first-start caution, also when the
  suite runs in parallel. Terminal hints the app reads (``COLORFGBG``, ``NO_COLOR``) are cleared,
  so a test sees the same app whatever terminal started the suite.
- Hypothesis profiles. ``ci``, the default, tries a fixed number of examples in a fixed order
  (derandomised, no example database), so a run passes or fails the same way every time.
  ``thorough`` tries 20 times as many, at random, and keeps what fails in ``.hypothesis/`` to try
  first next time: ``HYPOTHESIS_PROFILE=thorough .venv/bin/python -m pytest -m slow`` (or
  ``--hypothesis-profile=thorough``). A test that fails there is a bug: add its example with
  ``@example`` so the ``ci`` profile tries it every time.
"""

from __future__ import annotations

import os

import pytest
from hypothesis import settings

settings.register_profile("ci", max_examples=100, derandomize=True, database=None, deadline=None,
                          print_blob=True)
settings.register_profile("thorough", max_examples=2000, deadline=None, print_blob=True)
settings.load_profile(os.environ.get("HYPOTHESIS_PROFILE", "ci"))

XDG_FOLDERS = ("XDG_CONFIG_HOME", "XDG_STATE_HOME", "XDG_DATA_HOME", "XDG_CACHE_HOME")


@pytest.fixture(autouse=True)
def _xdg_folders_of_its_own(tmp_path_factory, monkeypatch):
    base = tmp_path_factory.mktemp("xdg")
    for name in XDG_FOLDERS:  # XDG_CONFIG_HOME: .../xdg0/config
        folder = name.removeprefix("XDG_").removesuffix("_HOME").lower()
        monkeypatch.setenv(name, str(base / folder))
    for name in ("COLORFGBG", "NO_COLOR"):
        monkeypatch.delenv(name, raising=False)
