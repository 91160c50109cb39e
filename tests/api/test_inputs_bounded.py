"""Input reading is bounded and strict; inputs a calculation cannot hold are 4xx, not 5xx.

The time bound of the long-unit test is an upper bound on refusing before any parsing
(reading a 60 KB unit with the unit library took about 30 s before the bound); it is a
correctness check with a wide margin, not a speed goal.
"""

from __future__ import annotations

import json
import time
from collections.abc import Iterator
from pathlib import Path
from typing import Any

import pytest
from fastapi.testclient import TestClient

from service.api.app import create_app
from service.settings import Settings

_EXAMPLES = Path(__file__).resolve().parents[2] / "openapi_examples"
_SAT = "/v1/properties/saturation"


def _example(name: str) -> dict[str, Any]:
    request: dict[str, Any] = json.loads((_EXAMPLES / f"{name}.json").read_text())["request"]
    return request


@pytest.fixture(scope="module")
def client(tmp_path_factory: pytest.TempPathFactory) -> Iterator[TestClient]:
    database = tmp_path_factory.mktemp("bounded") / "records.db"
    app = create_app(Settings(database_url=f"sqlite:///{database}"))
    with TestClient(app, raise_server_exceptions=False) as test_client:
        yield test_client


@pytest.mark.parametrize(
    ("temperature", "fragment"),
    [
        ("300 K#junk", "a unit holds letters"),
        ("300 K\x00", "a unit holds letters"),
        ("٣٠٠ K", "ASCII decimal number"),
        ("300 " + "K" * 70, "longer than the 64 characters"),
        ("300 " + "m/" * 30000 + "s", "longer than the 96 characters"),
        ("3e999 K", "finite"),
        ("300 delta_degC", "temperature difference"),
    ],
    ids=["comment", "nul", "arabic-digits", "long-unit", "huge-text", "overflow", "difference"],
)
def test_strict_quantity_text(client: TestClient, temperature: str, fragment: str) -> None:
    response = client.post(_SAT, json={"temperature": temperature})
    assert response.status_code == 422
    problem = response.json()
    assert fragment in problem["detail"]
    assert problem["errors"][0]["field"] == "temperature"
    assert len(response.content) < 4000  # the input is not echoed whole


def test_a_long_unit_is_refused_before_parsing(client: TestClient) -> None:
    unit = "m/" * 30000 + "s"
    started = time.perf_counter()
    response = client.post(_SAT, json={"temperature": {"value": 300, "unit": unit}})
    elapsed = time.perf_counter() - started
    assert response.status_code == 422
    assert elapsed < 0.05 * 20  # generous: well under a second on a loaded machine
    assert len(response.content) < 4000


def test_a_result_too_large_to_hold_is_422_and_stores_nothing(client: TestClient) -> None:
    before = client.get("/v1/calculations", params={"limit": 1000}).json()
    body = {**_example("flash-freeze-vial-tray-pulldown"), "water_mass": "1e300 kg"}
    with pytest.warns(RuntimeWarning):  # numpy reports the overflow it meets
        response = client.post("/v1/balances/flash-freeze", json=body)
    assert response.status_code == 422
    problem = response.json()
    assert problem["type"].endswith("result-not-finite")
    assert [error["field"] for error in problem["errors"]] == ["water_mass"]
    after = client.get("/v1/calculations", params={"limit": 1000}).json()
    assert len(after["items"]) == len(before["items"])


def test_a_degenerate_chamber_volume_is_refused(client: TestClient) -> None:
    body = _example("chamber-bread-rack-vacuum-cooler")
    body["chamber"]["free_volume"] = "1e-300 m3"
    response = client.post("/v1/simulations/vacuum-chamber", json=body)
    assert response.status_code == 422
    assert response.json()["errors"][0]["field"] == "chamber.free_volume"


def test_an_unexpected_failure_is_a_problem_document_with_the_request_id(
    tmp_path: Path,
) -> None:
    app = create_app(Settings(database_url=f"sqlite:///{tmp_path / 'records.db'}"))

    @app.get("/boom")
    def boom() -> None:
        raise RuntimeError("defect")

    with TestClient(app, raise_server_exceptions=False) as test_client:
        response = test_client.get("/boom", headers={"X-Request-ID": "trace-42"})
    assert response.status_code == 500
    assert response.headers["content-type"].startswith("application/problem+json")
    assert response.json()["request_id"] == "trace-42"
    assert response.headers["x-request-id"] == "trace-42"


@pytest.mark.parametrize(
    "moment",
    ["9999-12-31T23:59:59-12:00", "0001-01-01T00:00:00+12:00", "9999-12-31T23:59:59.999999Z"],
)
def test_a_time_at_the_end_of_representable_time_is_not_a_store_failure(
    client: TestClient, moment: str
) -> None:
    response = client.get("/v1/calculations", params={"since": moment})
    assert response.status_code in (200, 422), response.text
    if response.status_code == 422:
        assert response.json()["errors"][0]["field"] == "since"
