"""POST /v1/simulations/vacuum-chamber: JSON, CSV, SVG and PNG answers, records, errors.

Numeric checks here are wiring checks (the model is checked in tests/core/simulation);
the flash pressure is the saturation pressure of water at 20 degC, 2339.3 Pa, IAPWS
R6-95(2018) (iapws 1.5.5 IAPWS95 class gives 2.3393 kPa).
"""

from __future__ import annotations

import csv
import io
from typing import Any

import orjson
import pytest
from fastapi.testclient import TestClient

from service.api.http.examples import default_examples_folder, load_examples

PATH = "/v1/simulations/vacuum-chamber"

BODY: dict[str, Any] = {
    "chamber": {
        "free_volume": "500 L",
        "initial_pressure": "1013.25 mbar",
        "temperature": "20 degC",
    },
    "pump": {"nominal_speed": "180 m3/h", "ultimate_pressure": "10 Pa"},
    "product": {"mass": "1 kg", "initial_temperature": "20 degC"},
    "end_time": "20 min",
    "target_temperature": "-10 degC",
    "series_points": 50,
}


def _post(client: TestClient, body: dict[str, Any], accept: str | None = None) -> Any:
    headers = {"Accept": accept} if accept else {}
    return client.post(PATH, json=body, headers=headers)


def test_json_answer_has_events_series_summary_and_envelope(client: TestClient) -> None:
    response = _post(client, BODY)
    assert response.status_code == 200, response.text
    body = response.json()
    assert body["meta"]["calculation_id"]
    assert body["property_sources"] and body["assumptions"] and body["model_references"]
    names = [event["name"] for event in body["events"]]
    assert names == ["flash-point", "freezing-starts", "fully-frozen", "target-reached"]
    flash = body["events"][0]["state"]
    assert flash["total_pressure"]["value"] == pytest.approx(2339.3, rel=2e-5)
    series = body["series"]
    lengths = {len(quantity["values"]) for quantity in series.values()}
    assert len(lengths) == 1 and lengths.pop() >= 50
    assert body["summary"]["end_reason"] == "target-reached"
    assert abs(body["balance"]["relative_energy_residual"]["value"]) < 1e-6


def test_engineering_units(client: TestClient) -> None:
    response = _post(client, {**BODY, "output_units": "engineering"})
    body = response.json()
    assert body["series"]["product_temperature"]["unit"] == "degC"
    assert body["series"]["total_pressure"]["unit"] == "kPa"
    assert body["summary"]["final_temperature"]["value"] == pytest.approx(-10.0, abs=1e-6)


def test_record_is_stored(client: TestClient) -> None:
    body = _post(client, BODY).json()
    stored = client.get(f"/v1/calculations/{body['meta']['calculation_id']}")
    assert stored.status_code == 200
    assert stored.json()["kind"] == "simulations.vacuum_chamber"


def test_csv_answer_is_the_series(client: TestClient) -> None:
    response = _post(client, BODY, accept="text/csv")
    assert response.status_code == 200, response.text
    assert response.headers["content-type"].startswith("text/csv")
    rows = list(csv.reader(io.StringIO(response.text)))
    header, data = rows[0], rows[1:]
    # Only the series: one column per series quantity, led by the calculation id.
    assert header[:2] == ["calculation_id", "time[s]"] and "product_temperature[K]" in header
    series = _post(client, BODY).json()["series"]
    assert len(header) == 1 + len(series)
    assert len(data) == len(series["time"]["values"])
    assert len({row[0] for row in data}) == 1
    column = header.index("time[s]")
    times = [float(row[column]) for row in data]
    assert times == sorted(times) and times[0] == 0.0


@pytest.mark.parametrize(
    ("accept", "media_type", "magic"),
    [("image/svg+xml", "image/svg+xml", b"<?xml"), ("image/png", "image/png", b"\x89PNG")],
    ids=["svg", "png"],
)
def test_plot_answers(client: TestClient, accept: str, media_type: str, magic: bytes) -> None:
    response = _post(client, BODY, accept=accept)
    assert response.status_code == 200
    assert response.headers["content-type"].startswith(media_type)
    assert response.content.startswith(magic)
    calculation = response.headers["x-calculation-id"]
    assert client.get(f"/v1/calculations/{calculation}").status_code == 200


def test_json_preferred_over_plot_when_ranked_higher(client: TestClient) -> None:
    response = _post(client, BODY, accept="application/json, image/png;q=0.5")
    assert response.headers["content-type"].startswith("application/json")


def test_kinetic_with_condenser_leak_and_schedule(client: TestClient) -> None:
    body = {
        **BODY,
        "chamber": {**BODY["chamber"], "leak_rate": "1 mbar*L/s"},
        "product": {
            "mass": "2 kg",
            "initial_temperature": "35 degC",
            "water_fraction": 0.6,
            "solids_specific_heat": "1.5 kJ/(kg*K)",
            "evaporation": "kinetic",
            "exposed_area": "0.2 m2",
            "evaporation_coefficient": 0.005,
        },
        "condenser": {"surface_temperature": "-40 degC", "vapor_conductance": "0.2 m3/s"},
        "companions": [{"mass": "1 kg", "material": "aluminium"}],
        "heat_gain": {"power": "5 W", "conductance": "0.5 W/K"},
        "target_temperature": "5 degC",
        "schedule": [{"time": "2 min", "temperature": "30 degC"}],
    }
    response = _post(client, body)
    assert response.status_code == 200, response.text
    answer = response.json()
    assert len(answer["schedule"]) == 1
    assert answer["summary"]["vapor_to_condenser"]["value"] > 0.0
    assert any("aluminium" in item for item in answer["assumptions"])


@pytest.mark.parametrize(
    ("change", "field"),
    [
        ({"pump": {"ultimate_pressure": "1 Pa"}}, "pump.nominal_speed"),
        (
            {"product": {"mass": "1 kg", "initial_temperature": "20 degC", "colour": "red"}},
            "product.colour",
        ),
        ({"series_points": 3}, "series_points"),
    ],
    ids=["missing-field", "unknown-field", "too-few-points"],
)
def test_schema_errors_name_the_field(
    client: TestClient, change: dict[str, Any], field: str
) -> None:
    response = _post(client, {**BODY, **change})
    assert response.status_code == 422
    assert response.headers["content-type"].startswith("application/problem+json")
    assert field in [error["field"] for error in response.json()["errors"]]


@pytest.mark.parametrize(
    ("change", "field"),
    [
        ({"chamber": {**BODY["chamber"], "free_volume": "-1 m3"}}, "chamber.free_volume"),
        ({"pump": {"nominal_speed": "10 kg"}}, "pump.nominal_speed"),
        (
            {
                "product": {"mass": [1.0, 2.0], "initial_temperature": "20 degC"},
                "end_time": {"values": [600.0, 900.0, 1200.0], "unit": "s"},
            },
            "product.mass",
        ),
        (
            {"product": {"mass": "1 kg", "initial_temperature": "-5 degC"}},
            "product.initial_temperature",
        ),
        (
            {"condenser": {"surface_temperature": "5 degC", "vapor_conductance": 1.0}},
            "condenser.surface_temperature",
        ),
        (
            {
                "product": {
                    "mass": "1 kg",
                    "initial_temperature": "20 degC",
                    "solute": {"name": "sucrose", "mass_fraction": 0.1},
                }
            },
            "product.solute.mass_fraction",
        ),
    ],
    ids=[
        "negative-volume",
        "wrong-unit",
        "array",
        "starts-frozen",
        "warm-condenser",
        "solute-without-solids",
    ],
)
def test_core_errors_name_the_field(client: TestClient, change: dict[str, Any], field: str) -> None:
    response = _post(client, {**BODY, **change})
    assert response.status_code == 422, response.text
    problem = response.json()
    assert problem["errors"][0]["field"] == field


def test_chamber_example_is_documented_and_answers(client: TestClient) -> None:
    examples = [
        example for example in load_examples(default_examples_folder()) if "chamber" in example.name
    ]
    assert examples
    schema = client.get("/openapi.json").json()
    operation = schema["paths"][PATH]["post"]
    assert operation["operationId"] == "post_vacuum_chamber_simulation"
    assert {"image/svg+xml", "image/png"} <= set(operation["responses"]["200"]["content"])
    for example in examples:
        assert example.name in operation["requestBody"]["content"]["application/json"]["examples"]
        response = _post(client, example.request)
        assert response.status_code == example.expected_status, response.text
        assert orjson.loads(response.content)["summary"]["end_reason"] == "target-reached"


def test_answer_states_the_formulations_uncertainty(client: TestClient) -> None:
    body = _post(client, BODY).json()
    quantities = {entry["quantity"] for entry in body["uncertainty"]}
    assert {"vapor pressure (liquid)", "latent heat of vaporization"} <= quantities
    assert all(entry["relative"] and entry["relative"] > 0 for entry in body["uncertainty"])


def test_wall_radiation_and_shelf_contact_as_typed(client: TestClient) -> None:
    # A vial tray on a -40 degC shelf with 20 degC walls (source: the core with the same SI
    # case; the physics is checked in tests/core/simulation/test_product_heating.py).
    from service.core.simulation import Chamber, HeatGainRate, Product, Pump, VacuumChamberCase
    from service.core.simulation.vacuum_chamber import simulate_vacuum_chamber

    gain = {
        "radiating_area": "0.3 m2",
        "emissivity": 0.92,
        "wall_temperature": "20 degC",
        "contact_coefficient": "25 W/(m2*K)",
        "contact_area": "2500 cm2",
        "shelf_temperature": "-40 degC",
    }
    response = _post(client, {**BODY, "heat_gain": gain, "target_temperature": None})
    assert response.status_code == 200, response.text
    answer = response.json()
    core = simulate_vacuum_chamber(
        VacuumChamberCase(
            chamber=Chamber(free_volume=0.5, initial_pressure=101325.0, temperature=293.15),
            pump=Pump(nominal_speed=0.05, ultimate_pressure=10.0),
            product=Product(mass=1.0, initial_temperature=293.15),
            end_time=1200.0,
            series_points=50,
            heat_gain=HeatGainRate(
                radiating_area=0.3,
                emissivity=0.92,
                wall_temperature=293.15,
                contact_coefficient=25.0,
                contact_area=0.25,
                shelf_temperature=233.15,
            ),
        )
    )
    assert answer["summary"]["final_temperature"]["value"] == pytest.approx(
        core.summary.final_temperature, rel=1e-9
    )
    assert any("wall radiation" in line.lower() for line in answer["assumptions"])
    refused = _post(client, {**BODY, "heat_gain": {**gain, "emissivity": "0"}})
    assert refused.status_code == 422
    assert "heat_gain.emissivity" in refused.json()["detail"]


def test_supercooling_as_typed(client: TestClient) -> None:
    # A vial of water that supercools to -6 degC before it nucleates (source: the core with
    # the same SI case; the recalescence is checked in tests/core/simulation/test_supercooling.py).
    from service.core.simulation import Chamber, Product, Pump, VacuumChamberCase
    from service.core.simulation.vacuum_chamber import simulate_vacuum_chamber

    body = {
        **BODY,
        "product": {**BODY["product"], "nucleation_temperature": "-6 degC"},
        "target_temperature": None,
    }
    response = _post(client, body)
    assert response.status_code == 200, response.text
    core = simulate_vacuum_chamber(
        VacuumChamberCase(
            chamber=Chamber(free_volume=0.5, initial_pressure=101325.0, temperature=293.15),
            pump=Pump(nominal_speed=0.05, ultimate_pressure=10.0),
            product=Product(mass=1.0, initial_temperature=293.15, nucleation_temperature=267.15),
            end_time=1200.0,
            series_points=50,
        )
    )
    answer = response.json()
    start = next(e for e in answer["events"] if e["name"] == "freezing-starts")
    expected = next(e.time for e in core.events if e.name == "freezing-starts")
    assert start["time"]["value"] == pytest.approx(expected, rel=1e-9)
    assert any("recalescence" in line for line in answer["assumptions"])
    above = _post(
        client, {**body, "product": {**body["product"], "nucleation_temperature": "1 degC"}}
    )
    assert above.status_code == 422
    assert "product.nucleation_temperature" in above.json()["detail"]


def test_plot_reads_as_a_report(client: TestClient) -> None:
    # SVG text stays text (searchable), the temperature axis says °C in engineering units,
    # the title names the stored calculation, and event labels carry their times.
    body = {
        **BODY,
        "output_units": "engineering",
        "schedule": [{"time": "5 min", "temperature": "5 degC"}],
    }
    response = _post(client, body, accept="image/svg+xml")
    assert response.status_code == 200
    svg = response.text
    assert "<text" in svg
    assert "°C" in svg
    assert response.headers["x-calculation-id"] in svg
    assert ("flash " in svg and " s</text>" in svg) or "flash " in svg
    answer = _post(client, body).json()
    flash = next(e for e in answer["events"] if e["name"] == "flash-point")
    assert f"flash {flash['time']['value']:.3g} s" in svg
