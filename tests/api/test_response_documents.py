"""Responses as sent and as documented: the non-finite guard, 422 and CSV 400 in OpenAPI."""

from __future__ import annotations

import contextvars
from typing import Any

import numpy as np
import orjson
import pytest
from fastapi.testclient import TestClient

from service.api.http.detail import begin_detail
from service.api.http.envelope import envelope
from service.api.http.responses import FastJSONResponse, NonFiniteResultError
from service.api.http.units import UnitSet
from service.core.properties.lookups import ReportedUncertainty
from service.core.properties.sources import IAPWS_95

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


def _reported(relative: float | None) -> ReportedUncertainty:
    return ReportedUncertainty(
        "pressure",
        relative,
        "k = 2",
        "a statement",
        "R6-95",
        "derived",
        statement_id="iapws-95.saturation-pressure",
        coverage_factor=2.0,
    )


def test_envelope_texts_render_as_plain_json() -> None:
    # The envelope's repeated texts are pre-rendered fragments: the document sent must
    # be the plain JSON they stand for.
    def sent_at(detail: str) -> Any:
        def build() -> dict[str, Any]:
            begin_detail(detail)
            return envelope(
                unit_set=UnitSet.SI,
                assumptions=["Pure water."],
                sources=[IAPWS_95],
                uncertainties=[_reported(0.00025), _reported(None)],
                advisories=[],
            )

        # In a context of its own: the detail a request sets does not leak into other tests.
        return orjson.loads(FastJSONResponse(contextvars.copy_context().run(build)).body)

    compact = sent_at("compact")
    assert compact["assumptions"] == ["Pure water."]
    assert compact["reference_state"] == "iapws-triple-point-liquid"
    assert compact["property_sources"] == [{"id": "iapws-95", "release": IAPWS_95.release}]
    assert [item["relative"] for item in compact["uncertainty"]] == [0.00025, None]
    assert compact["uncertainty"][0]["statement_id"] == "iapws-95.saturation-pressure"
    assert "source" not in compact["uncertainty"][0]
    assert compact["meta"]["detail"] == "compact"

    full = sent_at("full")
    assert full["property_sources"][0]["formulation"] == "IAPWS-95"
    assert full["property_sources"][0]["title"] == IAPWS_95.title
    assert full["uncertainty"][0]["source"] == "R6-95"
    assert full["uncertainty"][0]["statement"] == "a statement"
    assert full["reference_state"].startswith("IAPWS convention")
    assert full["meta"]["detail"] == "full"


@pytest.mark.parametrize("bad", [float("nan"), float("inf")])
def test_non_finite_uncertainty_in_the_envelope_is_refused(bad: float) -> None:
    with pytest.raises(NonFiniteResultError):
        envelope(
            unit_set=UnitSet.SI,
            assumptions=[],
            sources=[IAPWS_95],
            uncertainties=[_reported(bad)],
            advisories=[],
        )


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
