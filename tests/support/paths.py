"""Where the repository's files are, for tests that read them."""

from pathlib import Path

REPO = Path(__file__).resolve().parents[2]
SAMPLES = REPO / "sample_walks"
GOLDEN = REPO / "tests" / "golden"
SCHEMA = REPO / "model" / "walkfile" / "walk.schema.json"
