"""Equipment checks in the simulation answer: units, the pump's water-vapor tolerance input,
and the evaporative-cooling balance's final-pressure volume flow beside its mean.

Wiring checks: the values are checked in tests/core/simulation/test_equipment_checks.py.
"""

from __future__ import annotations

import copy
import json
from typing import Any

import pytest
from fastapi.testclient import TestClient

from service.api.http.examples import default_examples_folder


def _example(name: str) -> dict[str, Any]:
    request: dict[str, Any] = json.loads((default_examples_folder() / name).read_text())["request"]
    return copy.deepcopy(request)


def test_checks_in_engineering_units_with_tolerance(client: TestClient) -> None:
    body = _example("chamber-bread-rack-vacuum-cooler.json")
    body["pump"]["water_vapor_tolerance"] = "2 kg/h"
    answer = client.post("/v1/simulations/vacuum-chamber", json=body)
    assert answer.status_code == 200, answer.text
    checks = answer.json()["checks"]
    assert checks["peak_pump_inlet_volume_flow"]["unit"] == "m3/h"
    assert checks["peak_pump_inlet_volume_flow"]["value"] == pytest.approx(
        300.0 * (1 - 2.0 / 1013.0), rel=1e-9
    )
    assert checks["end_pump_inlet_volume_flow"]["unit"] == "m3/h"
    assert checks["pump_water_vapor_tolerance"] == {"value": pytest.approx(2.0), "unit": "kg/h"}
    assert checks["water_vapor_tolerance_exceeded"] is (
        checks["peak_pump_vapor_mass_flow"]["value"] > 2.0
    )
    assert checks["trap_ice_capacity"]["value"] == pytest.approx(5.0)
    assert checks["trap_ice_capacity_exceeded"] is (checks["trap_ice"]["value"] > 5.0)
    assert checks["peak_trap_load"]["unit"] == "kW"
    assert checks["trap_limited_time"]["unit"] == "s"


def test_checks_without_trap_or_tolerance(client: TestClient) -> None:
    body = _example("chamber-bread-rack-vacuum-cooler.json")
    del body["condenser"]
    checks = client.post("/v1/simulations/vacuum-chamber", json=body).json()["checks"]
    assert checks["peak_trap_load"] is None and checks["trap_limited_time"] is None
    assert checks["water_vapor_tolerance_exceeded"] is None


def test_water_vapor_tolerance_refused_when_not_positive(client: TestClient) -> None:
    body = _example("chamber-bread-rack-vacuum-cooler.json")
    body["pump"]["water_vapor_tolerance"] = "0 kg/h"
    response = client.post("/v1/simulations/vacuum-chamber", json=body)
    assert response.status_code == 422
    assert response.json()["errors"][0]["field"] == "pump.water_vapor_tolerance"


def test_evaporative_cooling_final_volume_flow_beside_mean(client: TestClient) -> None:
    body = _example("evaporative-cooling-bakery-rolls.json")
    body.setdefault("cooling_time", "25 min")
    answer = client.post("/v1/balances/evaporative-cooling", json=body)
    assert answer.status_code == 200, answer.text
    result = answer.json()
    final, mean = result["final_vapor_volume_flow"], result["mean_vapor_volume_flow"]
    assert final["unit"] == mean["unit"]
    assert final["value"] > mean["value"]
