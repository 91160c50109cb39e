"""Bad input: every case answers 4xx application/problem+json naming the field."""

from __future__ import annotations

from typing import Any

import pytest
from fastapi.testclient import TestClient

CASES: list[tuple[str, str, str, dict[str, Any], int, str]] = [
    # id, method, path, query or body, expected status, field named
    (
        "not-a-number",
        "GET",
        "/v1/properties/saturation",
        {"temperature": "hot"},
        422,
        "temperature",
    ),
    ("nan-text", "GET", "/v1/properties/saturation", {"temperature": "nan"}, 422, "temperature"),
    ("inf-text", "GET", "/v1/properties/saturation", {"temperature": "inf K"}, 422, "temperature"),
    (
        "wrong-dimension",
        "GET",
        "/v1/properties/saturation",
        {"temperature": "3 kPa"},
        422,
        "temperature",
    ),
    (
        "below-absolute-zero",
        "GET",
        "/v1/properties/saturation",
        {"temperature": "-300 degC"},
        422,
        "temperature",
    ),
    (
        "below-triple",
        "GET",
        "/v1/properties/saturation",
        {"temperature": "-5 degC"},
        422,
        "temperature",
    ),
    (
        "above-critical",
        "GET",
        "/v1/properties/saturation",
        {"temperature": "700 K"},
        422,
        "temperature",
    ),
    (
        "negative-pressure",
        "GET",
        "/v1/properties/saturation",
        {"pressure": "-2 kPa"},
        422,
        "pressure",
    ),
    (
        "both",
        "GET",
        "/v1/properties/saturation",
        {"temperature": "300", "pressure": "3000"},
        422,
        "temperature, pressure",
    ),
    ("neither", "GET", "/v1/properties/saturation", {}, 422, "temperature, pressure"),
    (
        "bad-formulation",
        "GET",
        "/v1/properties/saturation",
        {"temperature": "300", "formulation": "steam-1967"},
        422,
        "formulation",
    ),
    (
        "bad-unit-set",
        "GET",
        "/v1/properties/saturation",
        {"temperature": "300", "output_units": "imperial"},
        422,
        "output_units",
    ),
    (
        "if97-region-3",
        "GET",
        "/v1/properties/saturation",
        {"temperature": "640", "formulation": "IAPWS-IF97"},
        422,
        "temperature",
    ),
    (
        "sublimation-above-triple",
        "GET",
        "/v1/properties/sublimation",
        {"temperature": "5 degC"},
        422,
        "temperature",
    ),
    (
        "melting-too-cold",
        "GET",
        "/v1/properties/melting",
        {"temperature": "240"},
        422,
        "temperature",
    ),
    (
        "state-too-hot",
        "GET",
        "/v1/properties/state",
        {"temperature": "2000", "pressure": "1e5"},
        422,
        "temperature",
    ),
    (
        "state-zero-pressure",
        "GET",
        "/v1/properties/state",
        {"temperature": "300", "pressure": "0"},
        422,
        "pressure",
    ),
    (
        "state-missing-pressure",
        "GET",
        "/v1/properties/state",
        {"temperature": "300"},
        422,
        "pressure",
    ),
    (
        "superheated-ice",
        "GET",
        "/v1/properties/state",
        {"temperature": "280", "pressure": "1e5", "phase": "ice"},
        422,
        "phase",
    ),
    (
        "body-nan",
        "POST",
        "/v1/properties/saturation",
        {"temperature": {"value": "NaN"}},
        422,
        "temperature",
    ),
    ("body-bool", "POST", "/v1/properties/saturation", {"temperature": True}, 422, "temperature"),
    (
        "body-empty-array",
        "POST",
        "/v1/properties/saturation",
        {"temperature": {"values": []}},
        422,
        "temperature",
    ),
    (
        "body-unknown-field",
        "POST",
        "/v1/properties/saturation",
        {"temperature": 300, "colour": "blue"},
        422,
        "colour",
    ),
    (
        "body-nested-list",
        "POST",
        "/v1/properties/saturation",
        {"temperature": [[300.0]]},
        422,
        "temperature",
    ),
    (
        "body-one-bad-element",
        "POST",
        "/v1/properties/saturation",
        {"temperature": {"values": [300, 900]}},
        422,
        "temperature",
    ),
    (
        "state-length-mismatch",
        "POST",
        "/v1/properties/state",
        {"temperature": [300, 310], "pressure": [1e5, 1e5, 1e5]},
        422,
        "pressure",
    ),
    (
        "too-many-points",
        "POST",
        "/v1/properties/saturation",
        {"temperature": [300.0] * 20_001},
        413,
        "values",
    ),
]


@pytest.mark.parametrize(
    ("method", "path", "payload", "status", "field"),
    [case[1:] for case in CASES],
    ids=[case[0] for case in CASES],
)
def test_bad_input_is_a_problem_document(
    client: TestClient, method: str, path: str, payload: dict[str, Any], status: int, field: str
) -> None:
    if method == "GET":
        response = client.get(path, params=payload)
    else:
        response = client.post(path, json=payload)
    assert response.status_code == status, response.text
    assert response.headers["content-type"].startswith("application/problem+json")
    problem = response.json()
    assert problem["status"] == status
    assert problem["title"] and problem["detail"] and problem["type"]
    named = {error["field"] for error in problem["errors"]}
    assert any(field in name for name in named), (field, named)


def test_out_of_range_names_value_and_range(client: TestClient) -> None:
    problem = client.get("/v1/properties/saturation", params={"temperature": "700 K"}).json()
    error = problem["errors"][0]
    assert error["value"] == pytest.approx(700.0)
    assert error["minimum"] == pytest.approx(273.16)
    assert error["maximum"] == pytest.approx(647.096)
    assert error["unit"] == "K"


def test_batch_error_names_the_element(client: TestClient) -> None:
    problem = client.post(
        "/v1/properties/saturation", json={"temperature": {"values": [300, 310, 900]}}
    ).json()
    assert problem["errors"][0]["index"] == 2


def test_oversize_body_is_413(client: TestClient) -> None:
    body = b'{"temperature": [' + b"300.0," * 500_000 + b"300.0]}"
    response = client.post(
        "/v1/properties/saturation", content=body, headers={"content-type": "application/json"}
    )
    assert response.status_code == 413
    assert response.headers["content-type"].startswith("application/problem+json")


def test_malformed_json_is_4xx(client: TestClient) -> None:
    response = client.post(
        "/v1/properties/saturation",
        content=b"{not json",
        headers={"content-type": "application/json"},
    )
    assert response.status_code == 400  # RFC 9110 §15.5.1: not JSON at all is malformed
    assert response.headers["content-type"].startswith("application/problem+json")
