"""Request examples kept as files in ``openapi_examples/`` and fed into the OpenAPI document.

Each file is one JSON object::

    {"operation_id": "...", "summary": "...", "description": "...",
     "request": {...}, "expected_status": 200}

Tests send every file to its operation and check the status, so the examples in
the documentation are known to work.
"""

from __future__ import annotations

from dataclasses import dataclass
from pathlib import Path
from typing import Any

import orjson

__all__ = ["RequestExample", "add_examples_to_openapi", "default_examples_folder", "load_examples"]


@dataclass(frozen=True)
class RequestExample:
    """One example request, read from a file."""

    name: str
    operation_id: str
    summary: str
    description: str
    request: dict[str, Any]
    expected_status: int


def default_examples_folder() -> Path:
    """``openapi_examples/`` at the top of the source tree."""
    return Path(__file__).resolve().parents[3] / "openapi_examples"


def load_examples(folder: Path) -> list[RequestExample]:
    """Read every ``*.json`` example in ``folder`` (sorted by file name)."""
    examples = []
    for path in sorted(folder.glob("*.json")):
        data = orjson.loads(path.read_bytes())
        examples.append(
            RequestExample(
                name=path.stem,
                operation_id=data["operation_id"],
                summary=data["summary"],
                description=data.get("description", ""),
                request=data["request"],
                expected_status=int(data.get("expected_status", 200)),
            )
        )
    return examples


def add_examples_to_openapi(schema: dict[str, Any], examples: list[RequestExample]) -> None:
    """Attach each example to its operation's JSON request body in ``schema``."""
    operations: dict[str, dict[str, Any]] = {}
    for methods in schema.get("paths", {}).values():
        for operation in methods.values():
            if isinstance(operation, dict) and "operationId" in operation:
                operations[operation["operationId"]] = operation
    for example in examples:
        operation = operations.get(example.operation_id)
        if operation is None or "requestBody" not in operation:
            continue
        content = operation["requestBody"]["content"].setdefault("application/json", {})
        content.setdefault("examples", {})[example.name] = {
            "summary": example.summary,
            "description": example.description,
            "value": example.request,
        }
