"""Simulation sweeps: array inputs answered as `values` in order, JSON and CSV, limits.

The sweep's cases must answer exactly as the same cases sent one by one (same model, same
tolerances), whether the pool or the request thread computes them.
"""

from __future__ import annotations

import copy
from collections.abc import Iterator
from typing import Any

import pytest
from csv_support import read_csv_answer
from fastapi.testclient import TestClient

from service.api.app import create_app
from service.settings import Settings

PATH = "/v1/simulations/vacuum-chamber"
BODY: dict[str, Any] = {
    "chamber": {"free_volume": "500 L", "temperature": "20 degC"},
    "pump": {"nominal_speed": "180 m3/h", "ultimate_pressure": "10 Pa"},
    "product": {"mass": "1 kg", "initial_temperature": "20 degC"},
    "end_time": "20 min",
    "target_temperature": "5 degC",
    "series_points": 20,
}
SPEEDS = [120.0, 180.0, 240.0]


def _sweep() -> dict[str, Any]:
    body = copy.deepcopy(BODY)
    body["pump"]["nominal_speed"] = {"values": SPEEDS, "unit": "m3/h"}
    return body


@pytest.fixture(scope="module")
def serial_client(tmp_path_factory: pytest.TempPathFactory) -> Iterator[TestClient]:
    records = tmp_path_factory.mktemp("sweep-records") / "records.sqlite3"
    settings = Settings(
        simulation_workers=1, max_simulation_sweep_cases=4, database_url=f"sqlite:///{records}"
    )
    with TestClient(create_app(settings)) as test_client:
        yield test_client


def _single_target_times(client: TestClient) -> list[float]:
    times = []
    for speed in SPEEDS:
        body = copy.deepcopy(BODY)
        body["pump"]["nominal_speed"] = f"{speed} m3/h"
        times.append(client.post(PATH, json=body).json()["summary"]["target_time"]["value"])
    return times


@pytest.mark.parametrize("which", ["pool", "serial"])
def test_sweep_values_in_order_match_single_calls(
    client: TestClient, serial_client: TestClient, which: str
) -> None:
    used = client if which == "pool" else serial_client
    response = used.post(PATH, json=_sweep())
    assert response.status_code == 200, response.text
    answer = response.json()
    assert answer["cases"] == 3 and answer["swept"] == ["pump.nominal_speed"]
    assert answer["inputs"]["pump.nominal_speed"]["values"] == pytest.approx(
        [speed / 3600.0 for speed in SPEEDS]
    )
    times = answer["summary"]["target_time"]["values"]
    assert times == _single_target_times(client)
    assert times == sorted(times, reverse=True)
    assert answer["summary"]["end_reason"] == ["target-reached"] * 3
    assert len(answer["checks"]["peak_pump_inlet_volume_flow"]["values"]) == 3
    stored = client.get(f"/v1/calculations/{answer['meta']['calculation_id']}")
    if which == "pool":
        assert stored.json()["kind"] == "simulations.vacuum_chamber_sweep"


def test_sweep_one_value_arrays_apply_to_every_case(client: TestClient) -> None:
    body = _sweep()
    body["product"]["mass"] = {"values": [2.0], "unit": "kg"}
    answer = client.post(PATH, json=body).json()
    assert answer["cases"] == 3
    assert answer["inputs"]["product.mass"]["values"] == [2.0, 2.0, 2.0]


def test_sweep_as_csv_has_one_row_per_case(client: TestClient) -> None:
    response = client.post(PATH, json=_sweep(), headers={"Accept": "text/csv"})
    assert response.status_code == 200, response.text
    assert response.headers["content-type"].startswith("text/csv")
    rows = read_csv_answer(response.text).rows
    assert len(rows) == 3
    assert [float(row["inputs.pump.nominal_speed[m3/s]"]) for row in rows] == pytest.approx(
        [speed / 3600.0 for speed in SPEEDS]
    )
    assert all(float(row["summary.target_time[s]"]) > 0 for row in rows)


def test_sweep_above_the_limit_is_413(serial_client: TestClient) -> None:
    body = copy.deepcopy(BODY)
    body["pump"]["nominal_speed"] = [0.03, 0.04, 0.05, 0.06, 0.07]
    response = serial_client.post(PATH, json=body)
    assert response.status_code == 413
    assert "TRIPOINT_MAX_SIMULATION_SWEEP_CASES" in response.json()["detail"]


def test_sweep_bad_case_is_named_by_index(client: TestClient) -> None:
    body = copy.deepcopy(BODY)
    body["chamber"]["free_volume"] = {"values": [0.5, -1.0, 0.5], "unit": "m3"}
    response = client.post(PATH, json=body)
    assert response.status_code == 422
    error = response.json()["errors"][0]
    assert error["field"] == "chamber.free_volume" and error["index"] == 1


def test_sweep_arrays_of_different_lengths_are_refused(client: TestClient) -> None:
    body = _sweep()
    body["product"]["mass"] = [1.0, 2.0]
    response = client.post(PATH, json=body)
    assert response.status_code == 422
    assert response.json()["errors"][0]["field"] == "product.mass"
