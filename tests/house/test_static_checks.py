"""The static checks configured in pyproject.toml pass: ruff (lint), mypy (types) and
import-linter (the layers of DEVELOPERS.md). They run as tests so that the README's one test
command, and so CI, runs them beside the rest of the suite; each prints the tool's own report
when it fails."""

import subprocess
import sys
from pathlib import Path

from tests.support.paths import REPO

BIN = Path(sys.executable).parent


def _run(*argv: str | Path) -> subprocess.CompletedProcess:
    return subprocess.run([str(a) for a in argv], cwd=REPO, capture_output=True, text=True,
                          check=False)


def test_ruff_finds_nothing_to_fix():
    done = _run(sys.executable, "-m", "ruff", "check", "--no-cache", ".")
    assert done.returncode == 0, done.stdout + done.stderr


def test_mypy_finds_no_type_errors():
    done = _run(sys.executable, "-m", "mypy")
    assert done.returncode == 0, done.stdout + done.stderr


def test_every_import_contract_is_kept():
    done = _run(BIN / "lint-imports", "--no-cache")
    assert done.returncode == 0, done.stdout + done.stderr
    assert "0 broken" in done.stdout
