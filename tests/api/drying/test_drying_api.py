"""HTTP: POST /v1/simulations/primary-drying and /v1/design-spaces/primary-drying, every
success path (JSON, units, record, CSV, SVG, PNG) and every error path."""

from __future__ import annotations

import copy
import csv
import io
from typing import Any

import orjson
import pytest
from fastapi.testclient import TestClient

from service.api.http.examples import default_examples_folder

RUN = "/v1/simulations/primary-drying"
SPACE = "/v1/design-spaces/primary-drying"


def _example(name: str) -> dict[str, Any]:
    data: dict[str, Any] = orjson.loads((default_examples_folder() / f"{name}.json").read_bytes())
    request: dict[str, Any] = data["request"]
    return request


RUN_BODY = _example("primary-drying-vial-batch-ramp")
SPACE_BODY = {
    **_example("primary-drying-design-space-vial-batch"),
    "shelf_temperatures": {"minimum": "-40 degC", "maximum": "0 degC", "count": 5},
    "chamber_pressures": {"values": [5, 10, 20], "unit": "Pa"},
}


def _post(client: TestClient, path: str, body: dict[str, Any], accept: str | None = None) -> Any:
    headers = {"accept": accept} if accept else {}
    return client.post(path, json=body, headers=headers)


def _changed(body: dict[str, Any], path: str, value: Any) -> dict[str, Any]:
    """A deep copy of ``body`` with ``path`` ("load.fill_volume", "recipe.0.time") set;
    ``value`` None removes the key."""
    changed = copy.deepcopy(body)
    node: Any = changed
    *parents, last = path.split(".")
    for key in parents:
        node = node[int(key)] if isinstance(node, list) else node[key]
    if value is None:
        del node[last]
    elif isinstance(node, list):
        node[int(last)] = value
    else:
        node[last] = value
    return changed


def test_run_answers_series_events_drying_time_and_envelope(client: TestClient) -> None:
    response = _post(client, RUN, RUN_BODY)
    assert response.status_code == 200, response.text
    body = response.json()
    assert body["summary"]["end_reason"] == "dry"
    assert body["summary"]["drying_time"]["unit"] == "s"
    names = [event["name"] for event in body["events"]]
    assert names[-1] == "primary-drying-ends"
    assert "critical-temperature-exceeded" in names
    series = body["series"]
    assert series["front_temperature"]["unit"] == "degC"
    assert series["dried_layer_thickness"]["unit"] == "mm"
    assert series["dried_layer_resistance"]["unit"] == "m2*Pa*s/kg"
    count = len(series["time"]["values"])
    assert all(len(quantity["values"]) == count for quantity in series.values())
    # fill depth 3 mL / 3.5 cm2 = 8.571 mm, all dried at the end
    assert series["dried_layer_thickness"]["values"][-1] == pytest.approx(3.0 / 0.35, rel=1e-9)
    assert abs(body["ice_balance"]["relative_residual"]["value"]) < 1e-8
    assert body["equipment_rate_limit"]["unit"] == "kg/h"
    formulations = {source["id"] for source in body["property_sources"]}
    assert {"iapws-95"} <= formulations and len(formulations) == 3
    assert any("Pikal" in reference for reference in body["model_references"])
    assert any("Quasi-steady" in text for text in body["assumptions"])
    quantities = {item["quantity"] for item in body["uncertainty"]}
    assert {"vapor pressure (ice)", "latent heat of sublimation"} <= quantities


def test_run_record_is_stored(client: TestClient) -> None:
    body = _post(client, RUN, RUN_BODY).json()
    stored = client.get(f"/v1/calculations/{body['meta']['calculation_id']}")
    assert stored.status_code == 200
    assert stored.json()["kind"] == "simulations.primary_drying"


def test_run_csv_is_the_series(client: TestClient) -> None:
    response = _post(client, RUN, RUN_BODY, accept="text/csv")
    assert response.status_code == 200, response.text
    rows = list(csv.reader(io.StringIO(response.text)))
    assert rows[0][:2] == ["calculation_id", "time[s]"]
    assert "front_temperature[degC]" in rows[0]
    series = _post(client, RUN, RUN_BODY).json()["series"]
    assert len(rows) - 1 == len(series["time"]["values"])


@pytest.mark.parametrize("path", [RUN, SPACE], ids=["run", "design-space"])
@pytest.mark.parametrize(
    ("accept", "magic"),
    [("image/svg+xml", b"<?xml"), ("image/png", b"\x89PNG")],
    ids=["svg", "png"],
)
def test_plots(client: TestClient, path: str, accept: str, magic: bytes) -> None:
    body = RUN_BODY if path == RUN else SPACE_BODY
    response = _post(client, path, body, accept=accept)
    assert response.status_code == 200
    assert response.headers["content-type"].startswith(accept)
    assert response.content.startswith(magic)
    assert client.get(f"/v1/calculations/{response.headers['x-calculation-id']}").status_code == 200


def test_tray_takes_its_area_for_both(client: TestClient) -> None:
    load = {
        "container": "tray",
        "count": 4,
        "outer_area": "0.1 m2",
        "fill_mass": "1.5 kg",
        "solids_fraction": 0.1,
    }
    body = {**RUN_BODY, "load": load, "equipment_limit": None, "condenser_capacity": None}
    response = _post(client, RUN, {**body, "output_units": "SI"})
    assert response.status_code == 200, response.text
    series = response.json()["series"]
    # fill depth 1.5 kg / (1000 kg/m3 x 0.1 m2) = 15 mm
    assert series["dried_layer_thickness"]["values"][-1] == pytest.approx(0.015, rel=1e-9)


def test_design_space_answers_grid_safe_region_and_fastest(client: TestClient) -> None:
    response = _post(client, SPACE, SPACE_BODY)
    assert response.status_code == 200, response.text
    body = response.json()
    assert len(body["front_temperature"]["values"]) == 5
    assert all(len(row) == 3 for row in body["front_temperature"]["values"])
    assert body["drying_time"]["unit"] == "s"
    fastest = body["fastest"]
    assert fastest is not None
    assert body["safe"][fastest["shelf_index"]][fastest["pressure_index"]] is True
    assert fastest["front_temperature"]["value"] < -32.0
    # -40 degC shelf at 20 Pa: above the ice's vapor pressure (12.8 Pa): nothing sublimes
    assert body["status"][0][2] == "no-sublimation"
    assert body["front_temperature"]["values"][0][2] is None
    assert len(body["cells"]["status"]) == 15
    stored = client.get(f"/v1/calculations/{body['meta']['calculation_id']}")
    assert stored.json()["kind"] == "design_spaces.primary_drying"


def test_design_space_at_a_stated_thickness(client: TestClient) -> None:
    response = _post(client, SPACE, {**SPACE_BODY, "dried_layer_thickness": "2 mm"})
    assert response.status_code == 200, response.text
    body = response.json()
    assert body["drying_time"] is None
    assert body["dried_layer_thickness"] == {"value": 2.0, "unit": "mm"}
    assert body["fastest"]["drying_time"] is None


def test_design_space_csv_is_one_row_per_setting(client: TestClient) -> None:
    response = _post(client, SPACE, SPACE_BODY, accept="text/csv")
    assert response.status_code == 200, response.text
    rows = list(csv.reader(io.StringIO(response.text)))
    assert "front_temperature[degC]" in rows[0] and "safe" in rows[0]
    assert len(rows) == 1 + 15


def test_twenty_by_twenty_example_answers(client: TestClient) -> None:
    body = _example("primary-drying-design-space-vial-batch")
    response = _post(client, SPACE, body)
    assert response.status_code == 200
    grid = response.json()["front_temperature"]["values"]
    assert len(grid) == 20 and all(len(row) == 20 for row in grid)


@pytest.mark.parametrize(
    ("path", "body", "field"),
    [
        (RUN, _changed(RUN_BODY, "load.fill_mass", "3 g"), "load.fill_volume, load.fill_mass"),
        (RUN, _changed(RUN_BODY, "load.inner_area", None), "load.inner_area"),
        (RUN, _changed(RUN_BODY, "load.solids_fraction", 1.0), "load.solids_fraction"),
        (RUN, _changed(RUN_BODY, "load.fill_volume", "0 mL"), "load.fill_volume"),
        (
            RUN,
            _changed(
                _changed(RUN_BODY, "recipe.1.chamber_pressure", "20 Pa"),
                "recipe.1.shelf_temperature",
                "-40 degC",
            ),
            "recipe[0].chamber_pressure",
        ),
        (RUN, _changed(RUN_BODY, "recipe.0.time", "1 h"), "recipe[0].time"),
        (
            RUN,
            _changed(RUN_BODY, "recipe.1.shelf_temperature", "150 degC"),
            "recipe[1].shelf_temperature",
        ),
        (RUN, _changed(RUN_BODY, "critical_temperature", "5 degC"), "critical_temperature"),
        (
            RUN,
            _changed(RUN_BODY, "vial_heat_transfer.contact", "11 W/(m*K)"),
            "vial_heat_transfer.contact",
        ),
        (
            RUN,
            _changed(RUN_BODY, "dried_layer_resistance.at_zero_thickness", [1.0, 2.0]),
            "dried_layer_resistance.at_zero_thickness",
        ),
        (
            RUN,
            _changed(RUN_BODY, "equipment_limit.1.chamber_pressure", "60 mTorr"),
            "equipment_limit",
        ),
        (RUN, _changed(RUN_BODY, "condenser_capacity", "-1 kg"), "condenser_capacity"),
        (SPACE, _changed(SPACE_BODY, "dried_layer_thickness", "9 mm"), "dried_layer_thickness"),
        (
            SPACE,
            {
                **SPACE_BODY,
                "shelf_temperatures": {"values": [-45, -42], "unit": "degC"},
                "chamber_pressures": {"values": [15, 20], "unit": "Pa"},
            },
            "chamber_pressures",
        ),
        (
            SPACE,
            _changed(SPACE_BODY, "shelf_temperatures.maximum", "-50 degC"),
            "shelf_temperatures.maximum",
        ),
        (SPACE, _changed(SPACE_BODY, "shelf_temperatures", list(range(101))), "shelf_temperatures"),
        (SPACE, _changed(SPACE_BODY, "chamber_pressures", [20, 10]), "chamber_pressures"),
    ],
    ids=[
        "both-fill-volume-and-mass",
        "vial-without-inner-area",
        "no-ice-left",
        "empty-fill",
        "pressure-above-ice-vapor-pressure-throughout",
        "recipe-not-from-zero",
        "shelf-too-hot",
        "critical-above-melting",
        "wrong-unit",
        "array-where-one-value",
        "equipment-limit-does-not-cover",
        "negative-condenser",
        "thickness-beyond-fill",
        "nothing-sublimes",
        "axis-maximum-below-minimum",
        "grid-too-large",
        "pressures-not-increasing",
    ],
)
def test_errors_are_422_problems_naming_the_field(
    client: TestClient, path: str, body: dict[str, Any], field: str
) -> None:
    response = _post(client, path, body)
    assert response.status_code == 422, response.text
    assert response.headers["content-type"].startswith("application/problem+json")
    fields = [error["field"] for error in response.json()["errors"]]
    assert field in fields, fields


@pytest.mark.parametrize(
    ("body", "field"),
    [
        ({**RUN_BODY, "colour": "blue"}, "colour"),
        (_changed(RUN_BODY, "recipe", []), "recipe"),
        (_changed(RUN_BODY, "load.count", 0), "load.count"),
    ],
    ids=["unknown-field", "empty-recipe", "no-vials"],
)
def test_schema_errors_name_the_field(client: TestClient, body: dict[str, Any], field: str) -> None:
    response = _post(client, RUN, body)
    assert response.status_code == 422
    assert field in [error["field"] for error in response.json()["errors"]]
