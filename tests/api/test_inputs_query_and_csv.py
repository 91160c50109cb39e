"""One rule for query strings, CSV rows numbered one way, whole-request CSV options,
warnings only where they change what to do, echoed inputs as sent."""

from __future__ import annotations

import json
from collections.abc import Iterator
from pathlib import Path
from typing import Any

import pytest
from fastapi.testclient import TestClient

from service.api.app import create_app
from service.settings import Settings

_EXAMPLES = Path(__file__).resolve().parents[2] / "openapi_examples"
_CSV = {"content-type": "text/csv", "accept": "text/csv"}


def _example(name: str) -> dict[str, Any]:
    request: dict[str, Any] = json.loads((_EXAMPLES / f"{name}.json").read_text())["request"]
    return request


@pytest.fixture(scope="module")
def client(tmp_path_factory: pytest.TempPathFactory) -> Iterator[TestClient]:
    database = tmp_path_factory.mktemp("query") / "records.db"
    with TestClient(create_app(Settings(database_url=f"sqlite:///{database}"))) as test_client:
        yield test_client


@pytest.mark.parametrize(
    ("method", "path", "body"),
    [
        ("POST", "/v1/properties/saturation?output_units=engineering", {"temperature": [300]}),
        ("POST", "/v1/properties/saturation?bogus=1", {"temperature": [300]}),
        ("POST", "/v1/balances/flash-freeze?bogus=1", {"initial_temperature": 293.15}),
        ("GET", "/v1/properties/saturation?temperature=300&bogus=1", None),
        ("GET", "/v1/calculations?bogus=1", None),
        ("GET", "/health?bogus=1", None),
    ],
)
def test_unknown_query_parameters_are_refused_on_every_route(
    client: TestClient, method: str, path: str, body: Any
) -> None:
    response = client.request(method, path, json=body)
    assert response.status_code == 422
    assert response.headers["content-type"].startswith("application/problem+json")
    fields = [error["field"] for error in response.json()["errors"]]
    expected = "output_units" if "output_units" in path else "bogus"
    assert fields == [expected]


def test_csv_rows_are_numbered_from_one_in_batch_and_per_row_routes(client: TestClient) -> None:
    batch = client.post(
        "/v1/properties/saturation", content="temperature[degC]\n20\n-5\n", headers=_CSV
    ).json()
    assert batch["errors"][0]["index"] == 2
    assert "CSV row 2" in batch["detail"]
    assert "element" not in batch["detail"]
    rows = "initial_temperature[degC],water_mass[kg]\n20,1\n20,-1\n"
    per_row = client.post("/v1/balances/flash-freeze", content=rows, headers=_CSV).json()
    assert per_row["errors"][0]["index"] == 2
    assert per_row["detail"].startswith("CSV row 2:")


@pytest.mark.parametrize(
    ("path", "body"),
    [
        ("/v1/properties/saturation", "temperature[degC]\n20\n-5\n50\n"),
        (
            "/v1/balances/flash-freeze",
            "initial_temperature[degC],water_mass[kg]\n20,1\n20,-1\n30,2\n",
        ),
    ],
    ids=["batch-route", "per-row-route"],
)
def test_row_errors_include_answers_the_good_rows(client: TestClient, path: str, body: str) -> None:
    response = client.post(f"{path}?row_errors=include", content=body, headers=_CSV)
    assert response.status_code == 200, response.text
    # The statements the answered rows share come first, as # lines; then the table.
    statements = [line for line in response.text.splitlines() if line.startswith("#")]
    assert any(line.startswith("# property_sources: ") for line in statements)
    lines = [line for line in response.text.splitlines() if not line.startswith("#")]
    header = lines[0].split(",")
    assert header[-3:] == ["error.status", "error.field", "error.detail"]
    assert len(lines) == 4
    assert lines[1].endswith(",,,") and lines[3].endswith(",,,")
    assert ",422," in lines[2] and "CSV row 2" in lines[2]
    as_json = client.post(
        f"{path}?row_errors=include", content=body, headers={"content-type": "text/csv"}
    ).json()
    assert [item.get("status") for item in as_json] == [None, 422, None]


def test_csv_output_units_for_the_whole_request(client: TestClient) -> None:
    body = "temperature[degC]\n20\n50\n"
    answer = client.post(
        "/v1/properties/saturation?output_units=engineering", content=body, headers=_CSV
    )
    assert answer.status_code == 200
    table = [line for line in answer.text.splitlines() if not line.startswith("#")]
    assert table[0].startswith("temperature[degC],pressure[kPa]")
    assert '# meta.output_units: "engineering"' in answer.text.splitlines()
    refused = client.post(
        "/v1/properties/saturation?output_units=metric", content=body, headers=_CSV
    )
    assert refused.status_code == 422
    assert refused.json()["errors"][0]["field"] == "output_units"
    clash = client.post(
        "/v1/properties/saturation?output_units=US",
        content="temperature[degC],output_units\n20,SI\n",
        headers=_CSV,
    )
    assert clash.status_code == 422
    assert "output_units" in clash.json()["detail"]


def test_freezing_point_warning_only_near_freezing(client: TestClient) -> None:
    body = _example("evaporative-cooling-bakery-rolls")
    body.pop("freezing_point", None)
    body.pop("dissolved_solids", None)
    warm = client.post(
        "/v1/balances/evaporative-cooling", json={**body, "final_temperature": "25 degC"}
    )
    assert warm.status_code == 200, warm.text
    assert "freezing-point-assumed" not in [item["code"] for item in warm.json()["warnings"]]
    cold = client.post(
        "/v1/balances/evaporative-cooling", json={**body, "final_temperature": "1 degC"}
    )
    assert cold.status_code == 200, cold.text
    assert "freezing-point-assumed" in [item["code"] for item in cold.json()["warnings"]]


def test_echoed_inputs_come_back_as_sent_and_without_noise(client: TestClient) -> None:
    body = {**_example("evaporative-cooling-bakery-rolls"), "output_units": "US"}
    body["trap_temperature"] = "-30 degC"
    answer = client.post("/v1/balances/evaporative-cooling", json=body).json()
    assert answer["trap_temperature"] == {"value": -30.0, "unit": "degC"}
    lookup = client.get(
        "/v1/properties/saturation",
        params={"temperature": "273.16 K", "output_units": "engineering"},
    ).json()
    assert lookup["temperature"] == {"value": 0.01, "unit": "degC"}
