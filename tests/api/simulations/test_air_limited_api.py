"""POST /v1/simulations/vacuum-chamber with kinetic evaporation through the air: the
characteristic size as a number or with a unit, its range errors, a sweep of it, and the
answer's assumptions and warnings. Wiring checks; the model is checked in
tests/core/simulation/test_air_limited_evaporation.py against handbook values."""

from __future__ import annotations

from typing import Any

import pytest
from fastapi.testclient import TestClient

PATH = "/v1/simulations/vacuum-chamber"

BODY: dict[str, Any] = {
    "chamber": {
        "free_volume": "500 L",
        "initial_pressure": "1013.25 mbar",
        "temperature": "20 degC",
    },
    "pump": {"nominal_speed": "180 m3/h", "ultimate_pressure": "10 Pa"},
    "product": {
        "mass": "2 kg",
        "initial_temperature": "20 degC",
        "evaporation": "kinetic",
        "exposed_area": "0.2 m2",
        "evaporation_coefficient": 0.05,
    },
    "end_time": "20 min",
    "target_temperature": "5 degC",
    "series_points": 30,
}


def _product(**change: Any) -> dict[str, Any]:
    return {**BODY, "product": {**BODY["product"], **change}}


def test_size_with_a_unit_equals_the_number_in_metres(client: TestClient) -> None:
    with_unit = client.post(PATH, json=_product(characteristic_size="15 cm"))
    plain = client.post(PATH, json=_product(characteristic_size=0.15))
    assert with_unit.status_code == plain.status_code == 200, with_unit.text
    rate = with_unit.json()["series"]["evaporation_rate"]["values"][0]
    assert rate > 0.0
    assert rate == pytest.approx(plain.json()["series"]["evaporation_rate"]["values"][0], rel=1e-12)
    answer = with_unit.json()
    assumptions = " ".join(answer["assumptions"])
    assert "Fuller, Schettler and Giddings" in assumptions
    assert "Properties of Gases and Liquids, 5th ed." in assumptions
    assert "Churchill" in assumptions and "6th ed." in assumptions
    assert "L = 0.15 m" in assumptions
    assert any("Poling" in reference for reference in answer["model_references"])
    codes = {warning["code"] for warning in answer["warnings"]}
    assert "air-limited-evaporation" in codes


def test_default_size_is_stated(client: TestClient) -> None:
    response = client.post(PATH, json=BODY)
    assert response.status_code == 200, response.text
    assert "L = 0.1 m (default)" in " ".join(response.json()["assumptions"])


def test_a_smaller_item_evaporates_faster_at_the_start(client: TestClient) -> None:
    # k_c = Sh D / L: at 1 atm a smaller sphere has the larger coefficient.
    small = client.post(PATH, json=_product(characteristic_size="2 cm")).json()
    large = client.post(PATH, json=_product(characteristic_size="50 cm")).json()
    assert (
        small["series"]["evaporation_rate"]["values"][0]
        > large["series"]["evaporation_rate"]["values"][0]
    )


@pytest.mark.parametrize(
    ("size", "sent"),
    [
        pytest.param("5 m", "5 m", id="too-large"),
        pytest.param("0.5 mm", "0.5 mm", id="too-small"),
        pytest.param(-0.1, "-0.1 m", id="negative"),
    ],
)
def test_size_out_of_range_is_a_problem_naming_the_field(
    client: TestClient, size: Any, sent: str
) -> None:
    response = client.post(PATH, json=_product(characteristic_size=size))
    assert response.status_code == 422, response.text
    assert response.headers["content-type"].startswith("application/problem+json")
    problem = response.json()
    assert problem["errors"][0]["field"] == "product.characteristic_size"
    error = problem["errors"][0]
    # the value as sent and the valid range (1 mm to 3 m) in the message
    assert sent in error["message"] and "valid range" in error["message"]
    assert "3" in error["message"] and "1" in error["message"]


def test_size_with_a_wrong_unit_is_a_problem(client: TestClient) -> None:
    response = client.post(PATH, json=_product(characteristic_size="2 kg"))
    assert response.status_code == 422, response.text
    assert response.json()["errors"][0]["field"] == "product.characteristic_size"


def test_size_may_be_swept(client: TestClient) -> None:
    response = client.post(
        PATH, json=_product(characteristic_size={"values": [5, 30], "unit": "cm"})
    )
    assert response.status_code == 200, response.text
    answer = response.json()
    swept = answer["inputs"]["product.characteristic_size"]
    assert swept["values"] == pytest.approx([0.05, 0.30])
    assert swept["unit"] == "m"
