"""POST /v1/simulations/vacuum-chamber with `product.interior`: core and surface temperatures
in the answer, the CSV and the plot; refusals naming the field.

Wiring checks (the model is checked against the exact conduction series in
tests/core/simulation/test_product_interior.py); the Choi and Okos conductivity of the
composition below is recomputed here from the component equations as quoted in ASHRAE
Handbook - Refrigeration (2006), ch. 9, Table 1 (coefficients from memory).
"""

from __future__ import annotations

import csv
import io
from typing import Any

import pytest
from fastapi.testclient import TestClient

PATH = "/v1/simulations/vacuum-chamber"

JOINTS: dict[str, Any] = {
    "chamber": {"free_volume": "1 m3", "initial_pressure": "1013 mbar", "temperature": "20 degC"},
    "pump": {"nominal_speed": "200 m3/h", "ultimate_pressure": "5 mbar"},
    "product": {
        "mass": "10 kg",
        "initial_temperature": "70 degC",
        "composition": {"water": 0.65, "protein": 0.25, "fat": 0.08, "ash": 0.02},
        "interior": {"geometry": "sphere", "half_thickness_or_radius": "4 cm", "nodes": 10},
    },
    "end_time": "1 h",
    "target_temperature": "40 degC",
    "schedule": [{"time": "10 min", "temperature": "65 degC"}],
    "series_points": 40,
    "output_units": "engineering",
}


def _post(client: TestClient, body: dict[str, Any], accept: str | None = None) -> Any:
    return client.post(PATH, json=body, headers={"Accept": accept} if accept else {})


def _choi_okos_conductivity(celsius: float) -> float:
    # k_i and rho_i of water, protein, fat, ash; parallel model on volume fractions.
    fractions = {"water": 0.65, "protein": 0.25, "fat": 0.08, "ash": 0.02}
    conductivity = {
        "water": 0.57109 + 1.7625e-3 * celsius - 6.7036e-6 * celsius**2,
        "protein": 0.17881 + 1.1958e-3 * celsius - 2.7178e-6 * celsius**2,
        "fat": 0.18071 - 2.7604e-4 * celsius - 1.7749e-7 * celsius**2,
        "ash": 0.32962 + 1.4011e-3 * celsius - 2.9069e-6 * celsius**2,
    }
    density = {
        "water": 997.18 + 3.1439e-3 * celsius - 3.7574e-3 * celsius**2,
        "protein": 1329.9 - 0.5184 * celsius,
        "fat": 925.59 - 0.41757 * celsius,
        "ash": 2423.8 - 0.28063 * celsius,
    }
    volumes = {name: x / density[name] for name, x in fractions.items()}
    whole = sum(volumes.values())
    return sum(volumes[name] / whole * conductivity[name] for name in fractions)


def test_answer_gives_core_and_surface_and_reads_the_core(client: TestClient) -> None:
    response = _post(client, JOINTS)
    assert response.status_code == 200, response.text
    body = response.json()
    series = body["series"]
    core = series["core_temperature"]["values"]
    surface = series["surface_temperature"]["values"]
    mean = series["product_temperature"]["values"]
    assert series["core_temperature"]["unit"] == "degC"
    assert len(core) == len(surface) == len(series["time"]["values"])
    assert all(c >= m >= s for c, m, s in zip(core[1:], mean[1:], surface[1:], strict=True))
    summary = body["summary"]
    assert summary["target_applies_to"] == "core"
    assert summary["end_reason"] == "target-reached"
    assert summary["final_core_temperature"]["value"] == pytest.approx(40.0, abs=1e-6)
    assert summary["final_surface_temperature"]["value"] < 40.0
    assert body["schedule"][0]["applies_to"] == "core"
    assert "core_temperature" in body["events"][0]["state"]
    text = " ".join(body["assumptions"])
    assert "Product interior" in text and "local food codes" in text
    assert any("Choi" in reference for reference in body["model_references"])
    # the conductivity used, from the composition at the initial temperature
    assert f"conductivity {_choi_okos_conductivity(70.0):.4g} W/(m K)" in text


def test_composition_conductivity_matches_the_component_equations() -> None:
    from service.core.simulation.product_conductivity import composition_conductivity

    fractions = {"water": 0.65, "protein": 0.25, "fat": 0.08, "ash": 0.02}
    for celsius in (0.0, 20.0, 70.0):
        assert composition_conductivity(fractions, 273.15 + celsius) == pytest.approx(
            _choi_okos_conductivity(celsius), rel=1e-12
        )


def test_lumped_answer_has_no_interior_fields(client: TestClient) -> None:
    body = {**JOINTS, "product": {**JOINTS["product"]}}
    del body["product"]["interior"]
    answer = _post(client, body).json()
    assert "core_temperature" not in answer["series"]
    assert answer["summary"]["final_core_temperature"] is None
    assert answer["summary"]["target_applies_to"] == "mean"
    assert answer["schedule"][0]["applies_to"] == "mean"


def test_csv_series_has_core_and_surface_columns(client: TestClient) -> None:
    response = _post(client, JOINTS, accept="text/csv")
    assert response.status_code == 200, response.text
    header = next(csv.reader(io.StringIO(response.text)))
    assert any(name.startswith("core_temperature") for name in header)
    assert any(name.startswith("surface_temperature") for name in header)


def test_plot_draws_core_and_surface(client: TestClient) -> None:
    response = _post(client, JOINTS, accept="image/svg+xml")
    assert response.status_code == 200
    svg = response.text
    assert ">core</text>" in svg or "core<" in svg
    assert "surface" in svg
    assert "core at 40 °C" in svg


@pytest.mark.parametrize(
    ("interior", "extra", "field"),
    [
        ({"geometry": "cube", "half_thickness_or_radius": "4 cm"}, {}, "product.interior.geometry"),
        (
            {"geometry": "sphere", "half_thickness_or_radius": "4 kg"},
            {},
            "product.interior.half_thickness_or_radius",
        ),
        (
            {"geometry": "sphere", "half_thickness_or_radius": "4 cm", "pore_venting_time": "-1 s"},
            {},
            "product.interior.pore_venting_time",
        ),
        (
            {"geometry": "sphere", "half_thickness_or_radius": "4 cm"},
            {"target_temperature": "-5 degC"},
            "target_temperature",
        ),
        (
            {"geometry": "sphere", "half_thickness_or_radius": "4 cm"},
            {"nucleation_temperature": "-5 degC"},
            "product.interior",
        ),
    ],
    ids=[
        "unknown-shape",
        "wrong-unit",
        "negative-venting",
        "target-below-freezing",
        "supercooling",
    ],
)
def test_interior_refusals_name_the_field(
    client: TestClient, interior: dict[str, Any], extra: dict[str, Any], field: str
) -> None:
    product = {**JOINTS["product"], "interior": interior}
    body = {**JOINTS, "product": product}
    if "nucleation_temperature" in extra:
        product["nucleation_temperature"] = extra["nucleation_temperature"]
    else:
        body.update(extra)
    response = _post(client, body)
    assert response.status_code == 422, response.text
    assert response.headers["content-type"].startswith("application/problem+json")
    assert field in [error["field"] for error in response.json()["errors"]]


@pytest.mark.parametrize(
    ("example", "text"),
    [
        ("chamber-bread-rack-vacuum-cooler", "trap at its refrigeration capacity"),
        ("chamber-lettuce-pallet-kinetic-evaporation", "evaporation limited by the air"),
    ],
    ids=["trap", "air"],
)
def test_plot_shades_what_limits_the_vapor_removal(
    client: TestClient, example: str, text: str
) -> None:
    # The bread rack's 6 kW trap runs at its capacity (summary: peak condenser load 6 kW);
    # the lettuce pallet's kinetic evaporation is limited by the air near 1 atm (its
    # air-limited-evaporation warning).
    import json
    from pathlib import Path

    folder = Path(__file__).resolve().parents[3] / "openapi_examples"
    request = json.loads((folder / f"{example}.json").read_text())["request"]
    answer = _post(client, request).json()
    codes = {warning["code"] for warning in answer["warnings"]}
    if "air" in text:
        assert "air-limited-evaporation" in codes
    else:
        assert answer["checks"]["trap_limited_time"]["value"] > 0.0
    svg = _post(client, request, accept="image/svg+xml").text
    assert text in svg
