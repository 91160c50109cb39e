"""Responses as sent and as documented: the non-finite guard, 422 and CSV 400 in OpenAPI."""

from __future__ import annotations

from typing import Any

import numpy as np
import pytest
from fastapi.testclient import TestClient

from service.api.responses import FastJSONResponse, NonFiniteResultError

FINITE: list[tuple[str, Any]] = [
    ("nested", {"a": {"value": 1.5, "unit": "K"}, "b": [1, "x", None, True]}),
    ("long-list-with-null", {"values": [1.0] * 100 + [None]}),
    ("array", {"values": np.linspace(0.0, 1.0, 50)}),
    ("numpy-scalar", {"value": np.float64(2.0)}),
]
NON_FINITE: list[tuple[str, Any]] = [
    ("nan-deep", {"a": [{"b": {"value": float("nan")}}]}),
    ("inf-in-long-list", {"values": [1.0] * 100 + [float("inf")]}),
    ("nan-in-short-list", {"values": [1.0, float("nan")]}),
    ("inf-in-tuple", {"values": (1.0, float("-inf"))}),
    ("nan-array", {"values": np.array([1.0, np.nan])}),
    ("inf-numpy-float32", {"value": np.float32("inf")}),
    ("nan-in-mixed-long-list", {"values": [1.0] * 40 + ["x", float("nan")]}),
]


@pytest.mark.parametrize(("name", "content"), FINITE, ids=[case[0] for case in FINITE])
def test_finite_content_is_rendered(name: str, content: Any) -> None:
    assert FastJSONResponse(content).body


@pytest.mark.parametrize(("name", "content"), NON_FINITE, ids=[case[0] for case in NON_FINITE])
def test_non_finite_content_is_refused(name: str, content: Any) -> None:
    with pytest.raises(NonFiniteResultError):
        FastJSONResponse(content)


def test_every_422_is_documented_as_a_problem_document(client: TestClient) -> None:
    document = client.get("/openapi.json").json()
    answers = [
        (f"{method.upper()} {route}", operation["responses"]["422"])
        for route, methods in document["paths"].items()
        for method, operation in methods.items()
        if "422" in operation["responses"]
    ]
    assert answers
    for name, answer in answers:
        assert "application/problem+json" in answer["content"], name
        assert "HTTPValidationError" not in str(answer), name
    assert "HTTPValidationError" not in document["components"]["schemas"]


def test_csv_routes_document_their_400(client: TestClient) -> None:
    document = client.get("/openapi.json").json()
    csv_posts = [
        operation
        for methods in document["paths"].values()
        for method, operation in methods.items()
        if method == "post" and "text/csv" in operation.get("requestBody", {}).get("content", {})
    ]
    assert csv_posts
    for operation in csv_posts:
        assert "application/problem+json" in operation["responses"]["400"]["content"]
