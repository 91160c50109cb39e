"""Every request example in openapi_examples/ is sent and answers as documented."""

from __future__ import annotations

import pytest
from fastapi.testclient import TestClient

from service.api.http.examples import RequestExample, default_examples_folder, load_examples

EXAMPLES = load_examples(default_examples_folder())


def _path_of(client: TestClient, operation_id: str) -> tuple[str, str]:
    schema = client.get("/openapi.json").json()
    for path, methods in schema["paths"].items():
        for method, operation in methods.items():
            if operation.get("operationId") == operation_id:
                return method, path
    raise AssertionError(f"no operation {operation_id}")


def test_examples_exist() -> None:
    assert len(EXAMPLES) >= 5


@pytest.mark.parametrize("example", EXAMPLES, ids=[example.name for example in EXAMPLES])
def test_example_answers_as_documented(client: TestClient, example: RequestExample) -> None:
    method, path = _path_of(client, example.operation_id)
    response = client.request(method.upper(), path, json=example.request)
    assert response.status_code == example.expected_status, response.text
    if example.expected_status >= 400:
        assert response.headers["content-type"].startswith("application/problem+json")


@pytest.mark.parametrize("example", EXAMPLES, ids=[example.name for example in EXAMPLES])
def test_example_is_in_openapi(client: TestClient, example: RequestExample) -> None:
    method, path = _path_of(client, example.operation_id)
    schema = client.get("/openapi.json").json()
    body = schema["paths"][path][method]["requestBody"]["content"]["application/json"]
    assert example.name in body["examples"]
