"""Evaporative cooling over HTTP with `dissolved_solids`: the freezing point estimated,
reported with its basis, and the 422 problems of bad dissolved solids.

Numeric checks compare the HTTP answer with the core called directly (source: the core,
``service.core.balances``), which checks the wiring; the physics of the estimate has its
own tests in tests/core/balances/test_solution_freezing.py and
tests/reference/test_solution_freezing_points.py. Strawberry composition: ASHRAE Handbook -
Refrigeration (2006), ch. 9, Table 3 (from memory); sugars 4.89 g/100 g: USDA FoodData
Central, strawberries, raw (from memory).
"""

from __future__ import annotations

from typing import Any

import pytest
from fastapi.testclient import TestClient

from service.api.balances.schemas import EvaporativeCoolingPublic
from service.core.balances import (
    Composition,
    EvaporativeCoolingCase,
    evaporative_cooling,
    named_dissolved_solids,
    named_solute,
    solution_freezing_point,
)

EVAPORATIVE = "/v1/balances/evaporative-cooling"
FLASH = "/v1/balances/flash-freeze"
COMPOSITION: dict[str, Any] = {
    "water": 0.9095,
    "protein": 0.0067,
    "fat": 0.0030,
    "carbohydrate": 0.0568,
    "fiber": 0.0200,
    "ash": 0.0040,
}
STRAWBERRIES: dict[str, Any] = {
    "product_mass": "400 kg",
    "initial_temperature": "20 degC",
    "final_temperature": "1 degC",
    "composition": COMPOSITION,
    "dissolved_solids": {"name": "glucose", "mass_fraction": "4.89 %"},
}


def _post(client: TestClient, body: dict[str, Any]) -> dict[str, Any]:
    response = client.post(EVAPORATIVE, json=body)
    assert response.status_code == 200, response.text
    answer: dict[str, Any] = response.json()
    EvaporativeCoolingPublic.model_validate(answer)
    return answer


def _problem(client: TestClient, body: dict[str, Any]) -> dict[str, Any]:
    response = client.post(EVAPORATIVE, json=body)
    assert response.status_code == 422, response.text
    assert response.headers["content-type"].startswith("application/problem+json")
    problem: dict[str, Any] = response.json()
    return problem


def _core(**changes: Any) -> float:
    fields: dict[str, Any] = {
        "product_mass": 400.0,
        "initial_temperature": 293.15,
        "final_temperature": 274.15,
        "composition": Composition(**COMPOSITION),
        "dissolved_solids": named_dissolved_solids("glucose", 0.0489),
    }
    fields.update(changes)
    return float(evaporative_cooling(EvaporativeCoolingCase(**fields)).freezing_point)


def test_estimated_freezing_point_and_its_basis(client: TestClient) -> None:
    body = _post(client, STRAWBERRIES)
    assert body["freezing_point_basis"] == "estimated from dissolved solids"
    assert body["freezing_point"]["value"] == pytest.approx(_core(), abs=1e-9)
    assert body["freezing_point"]["unit"] == "K"
    assert any("Heldman 1974" in item for item in body["assumptions"])
    assert "freezing-point-assumed" not in [warning["code"] for warning in body["warnings"]]


def test_named_solute_equals_its_molar_mass(client: TestClient) -> None:
    named = _post(client, STRAWBERRIES)
    by_molar_mass = _post(
        client,
        {
            **STRAWBERRIES,
            "dissolved_solids": {
                "mass_fraction": 0.0489,
                "molar_mass": "180.156 g/mol",
                "van_t_hoff_factor": 1,
            },
        },
    )
    # the named solute takes its non-ideal (Norrish) model; by molar mass it is ideal
    fraction = 0.0489 / (0.0489 + COMPOSITION["water"])
    ideal = float(solution_freezing_point(named_solute("glucose", fraction, "ideal")))
    norrish = float(solution_freezing_point(named_solute("glucose", fraction)))
    assert by_molar_mass["freezing_point"]["value"] == pytest.approx(ideal, abs=1e-9)
    assert named["freezing_point"]["value"] == pytest.approx(norrish, abs=1e-9)


def test_basis_given_and_pure_water(client: TestClient) -> None:
    given = _post(client, {**STRAWBERRIES, "freezing_point": "-0.8 degC"})
    assert given["freezing_point_basis"] == "given"
    assert given["freezing_point"]["value"] == pytest.approx(272.35)
    without = {key: value for key, value in STRAWBERRIES.items() if key != "dissolved_solids"}
    assumed = _post(client, without)
    assert assumed["freezing_point_basis"] == "pure water (no data)"
    assert "freezing-point-assumed" in [warning["code"] for warning in assumed["warnings"]]


def test_sweep_of_the_dissolved_fraction(client: TestClient) -> None:
    body = _post(
        client,
        {
            **STRAWBERRIES,
            "dissolved_solids": {"name": "glucose", "mass_fraction": [0.02, 0.0489]},
        },
    )
    values = body["freezing_point"]["values"]
    assert values[1] == pytest.approx(_core(), abs=1e-9)
    assert values[0] > values[1]


def test_uncertain_dissolved_fraction_is_accepted(client: TestClient) -> None:
    # the solids set only the freezing point: they add nothing to the evaporated mass
    body = _post(
        client,
        {
            **STRAWBERRIES,
            "dissolved_solids": {
                "name": "glucose",
                "mass_fraction": {"value": 0.0489, "unit": "1", "uncertainty": 0.005},
            },
        },
    )
    inputs = body["input_uncertainty"]["inputs"]
    assert [item["field"] for item in inputs] == ["dissolved_solids.mass_fraction"]
    assert inputs[0]["evaporated_mass_contribution"]["value"] == 0.0


def test_below_the_estimated_freezing_point_points_to_flash_freeze(client: TestClient) -> None:
    problem = _problem(client, {**STRAWBERRIES, "final_temperature": "-0.7 degC"})
    assert FLASH in problem["detail"]
    assert "estimated" in problem["detail"]
    error = problem["errors"][0]
    assert error["field"] == "final_temperature"
    assert error["minimum"] == pytest.approx(_core(), abs=1e-9)
    assert FLASH in error["message"]


@pytest.mark.parametrize(
    ("dissolved", "changes", "field"),
    [
        pytest.param(
            {"name": "honey", "mass_fraction": 0.05}, {}, "dissolved_solids.name", id="unknown-name"
        ),
        pytest.param(
            {"name": "glucose", "mass_fraction": 0.05, "molar_mass": 0.18},
            {},
            "dissolved_solids.name",
            id="named-with-molar-mass",
        ),
        pytest.param(
            {"mass_fraction": 0.05}, {}, "dissolved_solids.molar_mass", id="neither-name-nor-molar"
        ),
        pytest.param(
            {"name": "glucose", "mass_fraction": -0.01},
            {},
            "dissolved_solids.mass_fraction",
            id="negative-fraction",
        ),
        pytest.param(
            {"name": "glucose", "mass_fraction": "12 %"},
            {},
            "dissolved_solids.mass_fraction",
            id="water-plus-solids-above-one",
        ),
        pytest.param(
            {"name": "sodium chloride", "mass_fraction": 0.4},
            {"composition": {"water": 0.5, "ash": 0.5}},
            "dissolved_solids.mass_fraction",
            id="freezing-below-243K",
        ),
        pytest.param(
            {"mass_fraction": 0.05, "molar_mass": "0.1 g/mol"},
            {},
            "dissolved_solids.molar_mass",
            id="molar-mass-too-small",
        ),
        pytest.param(
            {"mass_fraction": 0.05, "molar_mass": 0.1, "van_t_hoff_factor": 0.5},
            {},
            "dissolved_solids.van_t_hoff_factor",
            id="factor-below-one",
        ),
        pytest.param(
            {"name": "glucose", "mass_fraction": 0.05},
            {"composition": None, "specific_heat": "3.9 kJ/(kg*K)"},
            "dissolved_solids",
            id="without-composition",
        ),
        pytest.param(
            {"name": "glucose", "mass_fraction": "5 kg"},
            {},
            "dissolved_solids.mass_fraction",
            id="fraction-with-a-mass-unit",
        ),
    ],
)
def test_bad_dissolved_solids_are_named(
    client: TestClient, dissolved: dict[str, Any], changes: dict[str, Any], field: str
) -> None:
    body = {**STRAWBERRIES, "dissolved_solids": dissolved, **changes}
    body = {key: value for key, value in body.items() if value is not None}
    problem = _problem(client, body)
    assert [error["field"] for error in problem["errors"]] == [field]
    assert problem["detail"]


def test_range_of_the_dissolved_fraction_is_in_the_problem(client: TestClient) -> None:
    problem = _problem(
        client, {**STRAWBERRIES, "dissolved_solids": {"name": "glucose", "mass_fraction": 0.1}}
    )
    error = problem["errors"][0]
    assert error["minimum"] == 0.0
    assert error["maximum"] == pytest.approx(1.0 - 0.9095)


def test_sweep_error_names_the_element(client: TestClient) -> None:
    problem = _problem(
        client,
        {**STRAWBERRIES, "dissolved_solids": {"name": "glucose", "mass_fraction": [0.03, 0.2]}},
    )
    error = problem["errors"][0]
    assert error["field"] == "dissolved_solids.mass_fraction"
    assert error["index"] == 1


def test_openapi_documents_dissolved_solids(client: TestClient) -> None:
    schemas = client.get("/openapi.json").json()["components"]["schemas"]
    request = schemas["EvaporativeCoolingCreate"]["properties"]
    assert "dissolved_solids" in request
    solids = schemas["DissolvedSolidsInput"]["properties"]
    assert "per kg of product" in solids["mass_fraction"]["description"]
    assert "kg/mol" in solids["molar_mass"]["description"]
    response = schemas["EvaporativeCoolingPublic"]["properties"]
    basis = response["freezing_point_basis"]["$ref"].rsplit("/", 1)[-1]  # a shared enum
    assert set(schemas[basis]["enum"]) == {
        "given",
        "estimated from dissolved solids",
        "estimated from composition solutes",
        "pure water (no data)",
    }


def test_freezing_point_from_the_compositions_named_solutes(client: TestClient) -> None:
    # The balance's range check takes the ice-fraction lookup's food estimate (Ross's rule
    # over the named solutes; checked against the ASHRAE food table in
    # tests/reference/test_food_freezing_points.py): the same value, through both routes.
    from service.core.solutions.food_freezing_point import estimate_food_freezing_point

    sugars = {"fructose": 0.0244, "glucose": 0.0199, "sucrose": 0.0047}
    composition = {**COMPOSITION, "dissolved_solutes": sugars}
    body = {key: value for key, value in STRAWBERRIES.items() if key != "dissolved_solids"}
    answer = _post(client, {**body, "composition": composition})
    assert answer["freezing_point_basis"] == "estimated from composition solutes"
    expected = estimate_food_freezing_point(
        Composition(**COMPOSITION, dissolved_solutes=tuple(sugars.items()))
    ).temperature
    assert answer["freezing_point"]["value"] == pytest.approx(expected, abs=1e-9)
    assert any("Ross" in text for text in answer["assumptions"])
    assert any(s["release"].startswith("Norrish") for s in answer["property_sources"])
    lookup = client.post(
        "/v1/properties/ice-fraction", json={"temperature": 275.0, "composition": composition}
    ).json()
    assert lookup["freezing_point"]["value"] == pytest.approx(expected, abs=1e-9)
    both = client.post(
        "/v1/balances/evaporative-cooling",
        json={**STRAWBERRIES, "composition": composition},
    )
    assert both.status_code == 422
    assert "dissolved_solids" in both.text
