"""The README's quick start stays true: CI runs exactly the test command it shows."""

from tests.support.paths import REPO as ROOT


def _ci_command() -> str:
    lines = (ROOT / ".ci" / "run").read_text().splitlines()
    return next(line for line in lines if line.startswith("python3 -m venv .venv &&"))


def test_ci_runs_the_readme_test_command():
    command = _ci_command().replace(" -q ", " ")
    readme = (ROOT / "README.md").read_text().replace(" -q ", " ")
    assert "pytest" in command
    assert command in readme


def test_readme_quick_start_opens_a_sample_walk_that_exists():
    readme = (ROOT / "README.md").read_text()
    first = next(line for line in readme.splitlines() if ".venv/bin/gaugewalk " in line)
    walk = first.split(".venv/bin/gaugewalk ", 1)[1].strip()
    assert (ROOT / walk).is_file(), walk


def test_readme_shows_the_safety_caution():
    readme = (ROOT / "README.md").read_text()
    assert "estimates for planning" in readme
    assert "authority having jurisdiction" in readme
    assert "qualified, licensed people" in readme
