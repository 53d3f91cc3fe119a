"""The JSON Schema of the walk file, generated from the pydantic job model, for editors that
complete and check hand-written walks.

Public API:

- ``json_schema() -> dict``; ``json_schema_text() -> str`` (the committed file's text).
- ``SCHEMA_FILE``: ``walk.schema.json`` beside this module (a test keeps it equal to
  ``json_schema_text()``).
"""

from __future__ import annotations

import json
from pathlib import Path

from gaugewalk.model.walk.job import SCHEMA_VERSION, Job

SCHEMA_FILE = Path(__file__).with_name("walk.schema.json")
"""The committed JSON Schema of the walk file (a test keeps it equal to ``json_schema()``)."""


def json_schema() -> dict:
    """JSON Schema of the walk file, generated from the pydantic model (file key names)."""
    schema = Job.model_json_schema(by_alias=True, mode="validation")
    return {
        "$schema": "https://json-schema.org/draft/2020-12/schema",
        "$id": "https://gaugewalk.invalid/walk.schema.json",
        "title": "gaugewalk walk file",
        "description": f"A site walk of electrical runs, walk file schema {SCHEMA_VERSION} (TOML).",
        **{k: v for k, v in schema.items() if k not in ("title", "description")},
    }


def json_schema_text() -> str:
    """``json_schema()`` as the text committed in ``model/walkfile/walk.schema.json``."""
    return json.dumps(json_schema(), indent=2, sort_keys=True, ensure_ascii=False) + "\n"
