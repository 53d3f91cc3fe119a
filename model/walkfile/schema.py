"""The JSON Schema of the walk file, generated from the pydantic job model, for editors that
complete and check hand-written walks.

Public API:

- ``json_schema() -> dict``; ``json_schema_text() -> str`` (the committed file's text).
- ``SCHEMA_FILE``: ``walk.schema.json`` beside this module (a test keeps it equal to
  ``json_schema_text()``).
"""

from __future__ import annotations

import ast
import inspect
import json
import textwrap
from pathlib import Path

from pydantic import BaseModel
from pydantic.json_schema import GenerateJsonSchema, JsonRef

from gaugewalk.model.walk.job import SCHEMA_VERSION, Job

SCHEMA_FILE = Path(__file__).with_name("walk.schema.json")
"""The committed JSON Schema of the walk file (a test keeps it equal to ``json_schema()``)."""


def json_schema() -> dict:
    """JSON Schema of the walk file, generated from the pydantic model (file key names)."""
    schema = Job.model_json_schema(by_alias=True, mode="validation",
                                   schema_generator=_DescribedFields)
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


def attribute_docstrings(cls: type) -> dict[str, str]:
    """{field name: the docstring written under it} for the fields ``cls`` itself declares."""
    try:
        tree = ast.parse(textwrap.dedent(inspect.getsource(cls)))
    except (OSError, TypeError):  # no source (a frozen or generated class)
        return {}
    found: dict[str, str] = {}
    body = tree.body[0].body if tree.body and isinstance(tree.body[0], ast.ClassDef) else []
    for field, after in zip(body, body[1:], strict=False):
        if (isinstance(field, ast.AnnAssign) and isinstance(field.target, ast.Name)
                and isinstance(after, ast.Expr) and isinstance(after.value, ast.Constant)
                and isinstance(after.value.value, str)):
            found[field.target.id] = inspect.cleandoc(after.value.value)
    return found


class _DescribedFields(GenerateJsonSchema):
    """Pydantic's schema with each field described by the docstring under it, read from the source
    here, when a schema is made, rather than as each model is built (pydantic's
    ``use_attribute_docstrings``: half the time of importing the job model, paid by every command
    and by the app's start)."""

    def model_schema(self, schema):
        json_schema = super().model_schema(schema)
        cls: type[BaseModel] = schema["cls"]
        properties = json_schema.get("properties", {})
        docs: dict[str, str] = {}
        for base in reversed(cls.__mro__):  # a subclass's docstring wins, as for its fields
            if isinstance(base, type) and issubclass(base, BaseModel) and base is not BaseModel:
                docs.update(attribute_docstrings(base))
        for name, field in cls.model_fields.items():
            key = field.alias or name
            doc = docs.get(name)
            if doc is None or key not in properties or "description" in properties[key]:
                continue
            ref = properties[key].get("$ref")
            if ref is not None:  # pydantic leaves out what the referenced schema already says
                target = self.get_schema_from_definitions(JsonRef(ref)) or {}
                if target.get("description") == doc:
                    continue
            properties[key]["description"] = doc
        return json_schema
