"""Request examples kept as files in ``openapi_examples/`` and fed into the OpenAPI document.

Each file is one JSON object::

    {"operation_id": "...", "summary": "...", "description": "...",
     "request": {...}, "expected_status": 200}

A refused example (``expected_status`` 4xx) also holds the problem document it answers,
``"response": {...}``; it is shown among that status's response examples, not as a request
example of the success path, with the request it answers quoted in its description.

Tests send every file to its operation and check the status (and a refused example's
problem document), so the examples in the documentation are known to work.
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
    response: dict[str, Any] | None = None
    """The problem document a refused example answers (None for a success example)."""

    @property
    def refused(self) -> bool:
        """Whether the example shows a refusal (a 4xx answer)."""
        return self.expected_status >= 400


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
                response=data.get("response"),
            )
        )
    return examples


def add_examples_to_openapi(schema: dict[str, Any], examples: list[RequestExample]) -> None:
    """Attach each success example to its operation's JSON request body in ``schema``, and
    each refused one to the operation's response of its status."""
    operations: dict[str, dict[str, Any]] = {}
    for methods in schema.get("paths", {}).values():
        for operation in methods.values():
            if isinstance(operation, dict) and "operationId" in operation:
                operations[operation["operationId"]] = operation
    for example in examples:
        operation = operations.get(example.operation_id)
        if operation is None or "requestBody" not in operation:
            continue
        if example.refused:
            _add_refused(operation, example)
            continue
        content = operation["requestBody"]["content"].setdefault("application/json", {})
        content.setdefault("examples", {})[example.name] = {
            "summary": example.summary,
            "description": example.description,
            "value": example.request,
        }


def _add_refused(operation: dict[str, Any], example: RequestExample) -> None:
    response = operation.setdefault("responses", {}).setdefault(
        str(example.expected_status), {"description": "Refused."}
    )
    content = response.setdefault("content", {}).setdefault("application/problem+json", {})
    request = orjson.dumps(example.request).decode()
    content.setdefault("examples", {})[example.name] = {
        "summary": example.summary,
        "description": f"{example.description}\n\nRequest body: `{request}`",
        "value": example.response,
    }
