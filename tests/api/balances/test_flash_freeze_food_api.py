"""POST /v1/balances/flash-freeze with a food composition: success and error paths.

Reference: the core balance with the same food (service.core.balances.flash_freeze, its
food path checked against the ice-fraction lookup's food model in
tests/core/balances/test_flash_freeze_food.py).
"""

from __future__ import annotations

from typing import Any

import pytest
from fastapi.testclient import TestClient

from service.core.balances import Composition
from service.core.balances.flash_freeze import FlashFreezeCase, flash_freeze

URL = "/v1/balances/flash-freeze"
SHRIMP: dict[str, Any] = {"water": 0.78, "protein": 0.19, "fat": 0.01, "ash": 0.02}  # demo
BODY: dict[str, Any] = {
    "initial_temperature": "8 degC",
    "composition": SHRIMP,
    "product_mass": "25 kg",
    "freezing_point": "-2 degC",
    "final_ice_temperature": "-18 degC",
}


def test_food_flash_freeze_matches_the_core(client: TestClient) -> None:
    response = client.post(URL, json=BODY)
    assert response.status_code == 200, response.text
    answer = response.json()
    core = flash_freeze(
        FlashFreezeCase(
            initial_temperature=281.15,
            composition=Composition(**SHRIMP),
            product_mass=25.0,
            freezing_point=271.15,
            final_ice_temperature=255.15,
        )
    )
    assert answer["ice_mass"]["value"] == pytest.approx(float(core.ice_mass), rel=1e-12)
    assert answer["evaporated_mass"]["value"] == pytest.approx(
        float(core.evaporated_mass), rel=1e-12
    )
    assert abs(answer["energy_balance"]["relative_residual"]["value"]) < 1e-9
    assert any(s["release"] == "Schwartzberg (1976)" for s in answer["property_sources"])
    assert any("freezable water" in text for text in answer["assumptions"])


def test_food_freezing_point_estimated_when_omitted(client: TestClient) -> None:
    body = {key: value for key, value in BODY.items() if key != "freezing_point"}
    response = client.post(URL, json=body)
    assert response.status_code == 200, response.text
    codes = [warning["code"] for warning in response.json()["warnings"]]
    assert "estimated-freezing-point" in codes


@pytest.mark.parametrize(
    ("change", "field"),
    [
        ({"water_mass": 2.0}, "water_mass"),
        ({"solute": {"name": "sucrose", "mass_fraction": 0.1}}, "solute"),
        ({"product_mass": None}, "product_mass"),
        ({"freezing_point": "1 degC"}, "freezing_point"),
        ({"composition": {**SHRIMP, "protein": 0.9, "water": 0.07}}, "composition"),
    ],
    ids=["water-mass", "solute-too", "no-product-mass", "onset-above-melting", "bad-sum"],
)
def test_food_errors_name_the_field(client: TestClient, change: dict[str, Any], field: str) -> None:
    body = {**BODY, **change}
    body = {key: value for key, value in body.items() if value is not None}
    response = client.post(URL, json=body)
    assert response.status_code == 422, response.text
    assert field in response.text
