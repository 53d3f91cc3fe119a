"""``gaugewalk schema``: print the JSON Schema of the walk file, for editors' completion."""

from __future__ import annotations

import argparse

from gaugewalk.model.walkfile.schema import json_schema_text

NAME = "schema"
HELP = "Print the JSON Schema of walk files (for editor completion and checks)."


def add_arguments(parser: argparse.ArgumentParser) -> None:
    return None


def run(args: argparse.Namespace) -> int:
    print(json_schema_text(), end="")
    return 0
