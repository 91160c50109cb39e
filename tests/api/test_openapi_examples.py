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
        documented = example.response
        assert documented is not None, f"{example.name}: a refused example shows its answer"
        answer = response.json()
        for key in ("type", "title", "status", "instance"):
            assert answer[key] == documented[key], key
        assert [item["field"] for item in answer["errors"]] == [
            item["field"] for item in documented["errors"]
        ]


@pytest.mark.parametrize("example", EXAMPLES, ids=[example.name for example in EXAMPLES])
def test_example_is_in_openapi(client: TestClient, example: RequestExample) -> None:
    method, path = _path_of(client, example.operation_id)
    schema = client.get("/openapi.json").json()
    operation = schema["paths"][path][method]
    body = operation["requestBody"]["content"]["application/json"]
    if example.refused:
        # a refusal is an example of the refusing response, not of the success path
        assert example.name not in body.get("examples", {})
        response = operation["responses"][str(example.expected_status)]
        shown = response["content"]["application/problem+json"]["examples"][example.name]
        assert shown["value"] == example.response
        assert '"' in shown["description"]  # the request body it answers is quoted
    else:
        assert example.name in body["examples"]


def test_success_paths_show_no_refused_example(client: TestClient) -> None:
    schema = client.get("/openapi.json").json()
    for path, methods in schema["paths"].items():
        for method, operation in methods.items():
            body = operation.get("requestBody", {}).get("content", {}).get("application/json")
            for name in (body or {}).get("examples", {}):
                assert not name.endswith("-refused"), (method, path, name)
