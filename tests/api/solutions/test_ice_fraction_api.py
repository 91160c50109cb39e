"""POST and GET /v1/properties/ice-fraction: success paths, CSV and every error path."""

from __future__ import annotations

from typing import Any

import gsw
import pytest
from csv_support import read_csv_answer
from fastapi.testclient import TestClient

URL = "/v1/properties/ice-fraction"


def _post(client: TestClient, body: dict[str, Any]) -> Any:
    return client.post(URL, json=body)


def test_seawater_at_minus_2_has_ice(client: TestClient) -> None:
    response = _post(
        client, {"temperature": "-2 degC", "seawater": {"absolute_salinity": "35.16504 g/kg"}}
    )
    assert response.status_code == 200, response.text
    answer = response.json()
    # TEOS-10 (gsw) freezing point of air-free standard seawater, within 0.05 K
    onset = answer["freezing_point"]["value"] - 273.15
    assert onset == pytest.approx(float(gsw.t_freezing(35.16504, 0.0, 0.0)), abs=0.05)
    assert 0.02 < answer["ice_fraction"]["value"] < 0.06
    assert answer["mixture"] == "seawater"
    assert "R13-08" in answer["model"]
    assert any(source["release"] == "IAPWS R13-08" for source in answer["property_sources"])
    total = answer["ice_fraction"]["value"] + answer["unfrozen_water"]["value"]
    brine = 1.0 - answer["ice_fraction"]["value"]
    salt = brine * answer["unfrozen_concentration"]["value"]
    assert total + salt == pytest.approx(1.0, abs=1e-12)
    assert salt == pytest.approx(0.03516504, rel=1e-12)


def test_bare_salinity_number_is_grams_per_kilogram(client: TestClient) -> None:
    bare = _post(client, {"temperature": 271.15, "seawater": {"absolute_salinity": 35.0}})
    with_unit = _post(client, {"temperature": 271.15, "seawater": {"absolute_salinity": "3.5 %"}})
    assert bare.status_code == with_unit.status_code == 200
    assert bare.json()["ice_fraction"] == with_unit.json()["ice_fraction"]


def test_brine_batch_and_sources(client: TestClient) -> None:
    response = _post(
        client,
        {
            "temperature": {"values": [-2.0, -2.5, -10.0], "unit": "degC"},
            "solute": {"name": "sodium chloride", "mass_fraction": "3.5 %"},
            "output_units": "engineering",
        },
    )
    assert response.status_code == 200, response.text
    answer = response.json()
    fractions = answer["ice_fraction"]["values"]
    assert fractions[0] == 0.0  # onset -2.11 degC (handbook -2.10 degC, from memory)
    assert 0.1 < fractions[1] < fractions[2]
    assert answer["freezing_point"]["unit"] == "degC"
    assert answer["freezing_point"]["values"][0] == pytest.approx(-2.10, abs=0.05)
    assert "Pitzer" in answer["model"]
    assert answer["vapor_pressure"]["values"][2] < answer["vapor_pressure"]["values"][0]


def test_ideal_model_is_available(client: TestClient) -> None:
    response = _post(
        client,
        {
            "temperature": "-2.2 degC",
            "solute": {"name": "sodium chloride", "mass_fraction": 0.035, "model": "ideal"},
        },
    )
    assert response.status_code == 200, response.text
    answer = response.json()
    assert "Raoult" in answer["model"]
    assert answer["ice_fraction"]["value"] == 0.0  # ideal onset -2.28 degC


def test_get_one_state(client: TestClient) -> None:
    response = client.get(
        URL, params={"temperature": "-5 degC", "solute": "glycerol", "mass_fraction": "10 %"}
    )
    assert response.status_code == 200, response.text
    answer = response.json()
    assert 0.4 < answer["ice_fraction"]["value"] < 0.7
    sea = client.get(URL, params={"temperature": "-2 degC", "absolute_salinity": "35"})
    assert sea.status_code == 200, sea.text
    assert sea.json()["ice_fraction"]["value"] > 0.0


def test_csv_batch(client: TestClient) -> None:
    body = "temperature[degC],seawater.absolute_salinity[g/kg]\n-2,35\n-3,35\n"
    response = client.post(
        URL, content=body, headers={"content-type": "text/csv", "accept": "text/csv"}
    )
    assert response.status_code == 200, response.text
    answer = read_csv_answer(response.text)
    assert len(answer.rows) == 2
    assert any(name.startswith("ice_fraction") for name in answer.header)
    # The batch's statements are stated once, above the table, not on each row.
    assert answer.statements["property_sources"][0]["id"] == "iapws-08-seawater"
    assert answer.statements["uncertainty"][0]["statement_id"] == "iapws-08-seawater.freezing-point"
    assert not any(name.startswith(("uncertainty", "meta")) for name in answer.header)


@pytest.mark.parametrize(
    ("body", "field"),
    [
        (
            {
                "temperature": "-10 degC",
                "solute": {"name": "sodium chloride", "mass_fraction": 0.26},
            },
            "solute.mass_fraction",
        ),
        (
            {
                "temperature": "-30 degC",
                "solute": {"name": "sodium chloride", "mass_fraction": 0.1},
            },
            "temperature",
        ),
        ({"temperature": "-20 degC", "seawater": {"absolute_salinity": 35}}, "temperature"),
        ({"temperature": "-2 degC", "seawater": {"absolute_salinity": 130}}, "absolute_salinity"),
        ({"temperature": "-2 degC"}, "solute, seawater"),
        (
            {
                "temperature": "-2 degC",
                "solute": {"name": "sucrose", "mass_fraction": 0.1},
                "seawater": {"absolute_salinity": 35},
            },
            "solute, seawater",
        ),
        (
            {"temperature": "-2 degC", "solute": {"name": "moon dust", "mass_fraction": 0.1}},
            "solute.name",
        ),
        (
            {
                "temperature": "-2 degC",
                "solute": {"name": "sucrose", "mass_fraction": 0.1},
                "composition": {"water": 0.8},
            },
            "composition",
        ),
        (
            {
                "temperature": {"values": [-2, -3], "unit": "degC"},
                "pressure": {"values": [1e5, 1e5, 1e5]},
                "seawater": {"absolute_salinity": 35},
            },
            "temperature: has 2 values",
        ),
        ({"temperature": "-2 parsecs", "seawater": {"absolute_salinity": 35}}, "temperature"),
        (
            {"temperature": "-2 degC", "solute": {"name": "seawater", "mass_fraction": 0.035}},
            "solute.name",
        ),
    ],
    ids=[
        "above-eutectic",
        "below-eutectic",
        "seawater-too-cold",
        "salinity-too-high",
        "no-mixture",
        "two-mixtures",
        "unknown-solute",
        "composition-not-taken",
        "batch-lengths",
        "bad-unit",
        "seawater-as-solute-points-to-seawater",
    ],
)
def test_bad_input_names_the_field(client: TestClient, body: dict[str, Any], field: str) -> None:
    response = _post(client, body)
    assert response.status_code == 422, response.text
    assert response.headers["content-type"].startswith("application/problem+json")
    assert field in response.text


def test_get_refuses_a_missing_mass_fraction(client: TestClient) -> None:
    response = client.get(URL, params={"temperature": "-2 degC", "solute": "sucrose"})
    assert response.status_code == 422
    assert "solute.mass_fraction" in response.text


def test_sucrose_answer_carries_the_freeze_concentration_limit(client: TestClient) -> None:
    response = _post(
        client, {"temperature": "-5 degC", "solute": {"name": "sucrose", "mass_fraction": 0.25}}
    )
    assert response.status_code == 200, response.text
    answer = response.json()
    limit = answer["freeze_concentration_limit"]
    assert limit["maximally_freeze_concentrated"]["concentration"]["value"] == 0.8
    assert "Gordon-Taylor" in limit["source"]
    assert "above-freeze-concentration-limit" in [w["code"] for w in answer["warnings"]]
    salt = _post(
        client, {"temperature": "-5 degC", "solute": {"name": "glycerol", "mass_fraction": 0.1}}
    )
    assert salt.json()["freeze_concentration_limit"] is None


_LEAN_FOOD = {"water": 0.74, "protein": 0.22, "fat": "3 %", "ash": 0.01}  # invented demo


def test_food_by_composition(client: TestClient) -> None:
    # The wiring against the core (source: the core), and one point against Schwartzberg's
    # equation x_ice = (x_w - 0.4 x_p)(1 - t_f/t) (ASHRAE Handbook - Refrigeration (2010),
    # ch. 19; from memory), which the exact equilibrium follows within 1.2 % to -30 degC.
    from service.core.balances.food_composition import Composition
    from service.core.solutions.foods import food_freezing

    body = {
        "temperature": {"values": [5, -10], "unit": "degC"},
        "composition": _LEAN_FOOD,
        "freezing_point": "-1.7 degC",
    }
    response = _post(client, body)
    assert response.status_code == 200, response.text
    answer = response.json()
    core = food_freezing(
        Composition(water=0.74, protein=0.22, fat=0.03, ash=0.01), 271.45, [278.15, 263.15]
    )
    assert answer["mixture"] == "food"
    assert answer["ice_fraction"]["values"] == pytest.approx(list(core.ice_mass_fraction))
    assert answer["apparent_specific_heat"]["values"] == pytest.approx(
        list(core.apparent_specific_heat)
    )
    assert answer["ice_fraction"]["values"][1] == pytest.approx(
        (0.74 - 0.4 * 0.22) * (1.0 - (-1.7) / (-10.0)), rel=0.012
    )
    assert answer["unfrozen_concentration"] is None
    assert any(s["release"] == "Schwartzberg (1976)" for s in answer["property_sources"])
    assert answer["freezing_point_basis"] == "given"


_DICED_CARROTS = {  # invented demo: a carrot-like composition with its sugars named
    "water": 0.878,
    "protein": 0.010,
    "fat": 0.002,
    "carbohydrate": 0.071,
    "fiber": 0.030,
    "ash": 0.009,
    "dissolved_solutes": {"sucrose": "3.6 %", "glucose": 0.006, "fructose": 0.0055},
}


def test_food_freezing_point_estimated_from_named_solutes(client: TestClient) -> None:
    # Wiring against the core estimate (its check against the ASHRAE food table is in
    # tests/reference/test_food_freezing_points.py) and the warning that it is estimated.
    from service.core.balances.food_composition import Composition
    from service.core.solutions.food_freezing_point import estimate_food_freezing_point

    response = _post(client, {"temperature": "-5 degC", "composition": _DICED_CARROTS})
    assert response.status_code == 200, response.text
    answer = response.json()
    core = estimate_food_freezing_point(
        Composition(
            water=0.878,
            protein=0.010,
            fat=0.002,
            carbohydrate=0.071,
            fiber=0.030,
            ash=0.009,
            dissolved_solutes=(("sucrose", 0.036), ("glucose", 0.006), ("fructose", 0.0055)),
        )
    )
    assert answer["freezing_point"]["value"] == pytest.approx(core.temperature, abs=1e-9)
    assert answer["freezing_point_basis"] == "dissolved solutes (Ross)"
    assert any(w["code"] == "estimated-freezing-point" for w in answer["warnings"])
    assert any("Ross" in text for text in answer["assumptions"])
    assert answer["ice_fraction"]["value"] > 0.5


def test_food_freezing_point_from_composition_alone(client: TestClient) -> None:
    # Pham (1996): t_F = -4.66 x_o/x_w - 46.4 x_a/x_w degC (x_o = carbohydrate + fiber), as
    # quoted in a secondary source; the lean demo food has no carbohydrate.
    response = _post(client, {"temperature": "-5 degC", "composition": _LEAN_FOOD})
    assert response.status_code == 200, response.text
    answer = response.json()
    water = 0.74 / 1.0  # the demo food's fractions sum to 1
    expected = 273.15 - 46.4 * 0.01 / water
    assert answer["freezing_point"]["value"] == pytest.approx(expected, abs=1e-9)
    assert answer["freezing_point_basis"] == "composition (Pham 1996)"


@pytest.mark.parametrize(
    ("body", "field"),
    [
        (
            {
                "temperature": "-5 degC",
                "composition": {**_LEAN_FOOD, "dissolved_solutes": {"lactose": 0.01}},
            },
            "composition.dissolved_solutes.lactose",
        ),
        (
            {
                "temperature": "-5 degC",
                "composition": {**_LEAN_FOOD, "dissolved_solutes": {"sucrose": 0.01}},
            },
            "composition.dissolved_solutes.sucrose",
        ),
        (
            {
                "temperature": "-5 degC",
                "composition": {**_LEAN_FOOD, "water": {"values": [0.7, 0.74]}},
                "freezing_point": "-1.7 degC",
            },
            "composition.water",
        ),
        (
            {
                "temperature": "-5 degC",
                "composition": _LEAN_FOOD,
                "freezing_point": "1 degC",
            },
            "freezing_point",
        ),
        (
            {
                "temperature": "-5 degC",
                "composition": _LEAN_FOOD,
                "freezing_point": "-1.7 degC",
                "seawater": {"absolute_salinity": 35},
            },
            "composition",
        ),
    ],
    ids=[
        "unknown-food-solute",
        "sugar-beyond-carbohydrate",
        "batch-fraction",
        "onset-above-melting",
        "two-mixtures",
    ],
)
def test_food_bad_input_names_the_field(
    client: TestClient, body: dict[str, Any], field: str
) -> None:
    response = _post(client, body)
    assert response.status_code == 422, response.text
    assert response.headers["content-type"].startswith("application/problem+json")
    assert field in response.json()["detail"]


def test_ethanol_names_its_model_and_the_flammable_vapor(client: TestClient) -> None:
    response = _post(
        client, {"temperature": "-10 degC", "solute": {"name": "ethanol", "mass_fraction": 0.1}}
    )
    assert response.status_code == 200, response.text
    answer = response.json()
    # Melinder's line: -4.33 degC at 10 %; the Engineering ToolBox and CRC tables are
    # checked in tests/reference/test_ethanol_freezing_points.py
    assert answer["freezing_point"]["value"] - 273.15 == pytest.approx(-4.33, abs=0.02)
    assert answer["ice_fraction"]["value"] > 0.4
    assert any(source["release"] == "Melinder (2010)" for source in answer["property_sources"])
    assert any("flammable" in text for text in answer["assumptions"])
    too_strong = _post(
        client, {"temperature": "-10 degC", "solute": {"name": "ethanol", "mass_fraction": 0.6}}
    )
    assert too_strong.status_code == 422
    assert "solute.mass_fraction" in too_strong.text
