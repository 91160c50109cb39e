"""Property lookups over HTTP: success paths, unit sets, batches, envelope.

Numeric checks here are spot checks of the wiring; the formulations themselves are
checked against the IAPWS releases' tables in tests/reference/.
"""

from __future__ import annotations

from typing import Any

import pytest
from fastapi.testclient import TestClient

ENVELOPE_KEYS = {
    "reference_state",
    "assumptions",
    "property_sources",
    "uncertainty",
    "warnings",
    "meta",
}
PHASE_KEYS = {
    "density",
    "specific_enthalpy",
    "specific_internal_energy",
    "specific_entropy",
    "specific_isobaric_heat_capacity",
}


def _check_envelope(body: dict[str, Any]) -> None:
    assert body.keys() >= ENVELOPE_KEYS
    # Compact by default: the reference state and sources by id, resolved by /v1/sources.
    assert body["reference_state"] == "iapws-triple-point-liquid"
    assert body["property_sources"], "every answer names its formulations"
    for source in body["property_sources"]:
        assert source["release"].startswith("IAPWS")
        assert source["id"].startswith("iapws-")
    assert body["meta"]["detail"] == "compact"
    assert body["meta"]["statements"].startswith("/v1/sources?version=")
    # A lookup is not stored: no calculation id that would lead nowhere; its request id.
    assert "calculation_id" not in body["meta"]
    assert body["meta"]["request_id"]
    assert body["meta"]["service_version"]


def test_health(client: TestClient) -> None:
    response = client.get("/health")
    assert response.status_code == 200
    assert response.json()["status"] == "ok"


@pytest.mark.parametrize("output_units", ["SI", "engineering", "US"])
@pytest.mark.parametrize("temperature", ["0.01 degC", "26.85 degC", "300", "640 K", "647.096"])
def test_one_temperature_answers_as_a_one_element_batch(
    client: TestClient, temperature: str, output_units: str
) -> None:
    # A single temperature takes the core's one-state path, a list the array path:
    # the numbers and everything stated beside them must be the same, exactly.
    single = client.get(
        "/v1/properties/saturation",
        params={"temperature": temperature, "output_units": output_units},
    ).json()
    number, _, unit = temperature.partition(" ")
    batch = client.post(
        "/v1/properties/saturation",
        json={
            "temperature": {"values": [float(number)], "unit": unit or None},
            "output_units": output_units,
        },
    ).json()

    def as_batch(item: Any) -> Any:
        if isinstance(item, dict):
            if "value" in item and "unit" in item:
                return {"values": [item["value"]], "unit": item["unit"]}
            return {key: as_batch(value) for key, value in item.items() if key != "meta"}
        return item

    assert as_batch(single) == {key: value for key, value in batch.items() if key != "meta"}


def test_saturation_get_with_celsius(client: TestClient) -> None:
    # Saturation pressure of water at 100 degC: 101.418 kPa, IAPWS-95
    # (W. Wagner, A. Pruss, J. Phys. Chem. Ref. Data 31, 387 (2002), Table 13.1; from memory).
    response = client.get("/v1/properties/saturation", params={"temperature": "100 degC"})
    assert response.status_code == 200, response.text
    body = response.json()
    _check_envelope(body)
    assert body["pressure"]["unit"] == "Pa"
    assert body["pressure"]["value"] == pytest.approx(101_418, rel=2e-5)
    assert body["liquid"].keys() == PHASE_KEYS
    assert body["vapor"].keys() == PHASE_KEYS
    assert body["latent_heat_of_vaporization"]["value"] == pytest.approx(2_256_400, rel=1e-4)
    assert body["property_sources"][0]["id"] == "iapws-95"


def test_saturation_full_detail_spells_the_statements_out(client: TestClient) -> None:
    full = client.get(
        "/v1/properties/saturation", params={"temperature": "100 degC", "detail": "full"}
    ).json()
    assert "triple point" in full["reference_state"]
    assert full["property_sources"][0]["formulation"] == "IAPWS-95"
    assert "Formulation 1995" in full["property_sources"][0]["title"]
    pressure = next(item for item in full["uncertainty"] if item["quantity"] == "pressure")
    assert pressure["statement_id"] == "iapws-95.saturation-pressure"
    assert "0.025 %" in pressure["statement"]
    assert pressure["source"].startswith("IAPWS R6-95(2018)")
    assert full["meta"]["detail"] == "full"
    compact = client.get("/v1/properties/saturation", params={"temperature": "100 degC"}).json()
    assert compact["pressure"] == full["pressure"], "the detail changes the texts only"
    assert {item["statement_id"]: item["relative"] for item in compact["uncertainty"]} == {
        item["statement_id"]: item["relative"] for item in full["uncertainty"]
    }
    assert "statement" not in compact["uncertainty"][0]


def test_detail_outside_the_choices_is_a_422(client: TestClient) -> None:
    response = client.get(
        "/v1/properties/saturation", params={"temperature": "20 degC", "detail": "verbose"}
    )
    assert response.status_code == 422
    assert response.json()["errors"][0]["field"] == "detail"
    posted = client.post(
        "/v1/properties/saturation?detail=verbose", json={"temperature": "20 degC"}
    )
    assert posted.status_code == 422


def test_saturation_by_pressure_engineering_units(client: TestClient) -> None:
    response = client.get(
        "/v1/properties/saturation",
        params={"pressure": "101.325 kPa", "output_units": "engineering"},
    )
    assert response.status_code == 200, response.text
    body = response.json()
    # Normal boiling point on ITS-90: 99.974 degC (IAPWS R6-95(2018) note; from memory).
    assert body["temperature"]["unit"] == "degC"
    assert body["temperature"]["value"] == pytest.approx(99.974, abs=2e-3)
    assert body["latent_heat_of_vaporization"]["unit"] == "kJ/kg"


def test_saturation_us_units(client: TestClient) -> None:
    response = client.get(
        "/v1/properties/saturation", params={"temperature": "212 degF", "output_units": "US"}
    )
    body = response.json()
    assert body["pressure"]["unit"] == "psi"
    # 14.709 psia at 212 degF (saturation at 100 degC, 101.418 kPa, converted; from memory).
    assert body["pressure"]["value"] == pytest.approx(14.709, rel=2e-4)
    assert body["liquid"]["specific_enthalpy"]["unit"] == "Btu/lb"


def test_saturation_batch_keeps_order_and_matches_single(client: TestClient) -> None:
    temperatures = [80.0, 20.0, 50.0]
    batch = client.post(
        "/v1/properties/saturation",
        json={"temperature": {"values": temperatures, "unit": "degC"}},
    ).json()
    assert len(batch["pressure"]["values"]) == 3
    for index, value in enumerate(temperatures):
        single = client.post(
            "/v1/properties/saturation", json={"temperature": f"{value} degC"}
        ).json()
        assert batch["pressure"]["values"][index] == pytest.approx(
            single["pressure"]["value"], rel=1e-13
        )


def test_saturation_list_input(client: TestClient) -> None:
    response = client.post("/v1/properties/saturation", json={"pressure": [1000.0, 2000.0]})
    assert response.status_code == 200
    assert len(response.json()["temperature"]["values"]) == 2


def test_saturation_if97_named_in_sources(client: TestClient) -> None:
    body = client.get(
        "/v1/properties/saturation", params={"temperature": "300", "formulation": "IAPWS-IF97"}
    ).json()
    assert body["property_sources"][0]["id"] == "iapws-if97"
    # IAPWS R7-97(2012) Table 35: p_s(300 K) = 0.353658941e-2 MPa.
    assert body["pressure"]["value"] == pytest.approx(3536.58941, rel=1e-8)


def test_sublimation_get(client: TestClient) -> None:
    response = client.get("/v1/properties/sublimation", params={"temperature": "-20 degC"})
    assert response.status_code == 200, response.text
    body = response.json()
    _check_envelope(body)
    assert body["ice"].keys() == PHASE_KEYS
    formulations = {source["id"] for source in body["property_sources"]}
    assert "iapws-95" in formulations and len(formulations) == 3
    # Ice vapor pressure at -20 degC about 103.2 Pa (IAPWS R14-08 eq. 6; from memory).
    assert body["pressure"]["value"] == pytest.approx(103.24, rel=2e-3)


def test_sublimation_low_temperature_extension_is_named(client: TestClient) -> None:
    body = client.get("/v1/properties/sublimation", params={"temperature": "100 K"}).json()
    assert [warning["code"] for warning in body["warnings"]] == ["low-temperature-extension"]
    releases = [source["release"] for source in body["property_sources"]]
    assert "IAPWS Guideline (2012)" in releases
    warm = client.get("/v1/properties/sublimation", params={"temperature": "-20 degC"}).json()
    assert warm["warnings"] == []
    assert "IAPWS Guideline (2012)" not in [s["release"] for s in warm["property_sources"]]


def test_melting_get_by_pressure(client: TestClient) -> None:
    response = client.get("/v1/properties/melting", params={"pressure": "101325"})
    assert response.status_code == 200, response.text
    body = response.json()
    # Melting point of ice Ih at 101325 Pa: 273.152519 K (IAPWS R10-06(2009) Table 6 state).
    assert body["temperature"]["value"] == pytest.approx(273.152519, abs=2e-6)
    assert body["latent_heat_of_fusion"]["value"] == pytest.approx(333_600, rel=2e-3)


def test_state_stable_phases(client: TestClient) -> None:
    body = client.post(
        "/v1/properties/state",
        json={
            "temperature": {"values": [20, 5, -10, 400], "unit": "degC"},
            "pressure": {"values": [101.325, 0.5, 101.325, 25000], "unit": "kPa"},
        },
    ).json()
    assert body["phase"] == ["liquid", "vapor", "ice", "supercritical"]
    # Liquid water at 20 degC, 101.325 kPa: 998.21 kg/m3 (IAPWS-95; from memory).
    assert body["properties"]["density"]["values"][0] == pytest.approx(998.21, abs=0.01)
    _check_envelope(body)


def test_state_metastable_liquid_warns(client: TestClient) -> None:
    body = client.get(
        "/v1/properties/state",
        params={"temperature": "-10 degC", "pressure": "101325", "phase": "liquid"},
    ).json()
    assert body["phase"] == "liquid"
    assert "metastable" in [warning["code"] for warning in body["warnings"]]


def test_state_broadcast_single_pressure(client: TestClient) -> None:
    body = client.post(
        "/v1/properties/state",
        json={"temperature": {"values": [10, 20, 30], "unit": "degC"}, "pressure": "1 atm"},
    ).json()
    assert body["phase"] == ["liquid", "liquid", "liquid"]
    assert len(body["pressure"]["values"]) == 3


def test_constants(client: TestClient) -> None:
    body = client.get("/v1/properties/constants").json()
    assert body["triple_point"]["temperature"] == {"value": 273.16, "unit": "K"}
    assert body["critical_point"]["pressure"] == {"value": 22.064e6, "unit": "Pa"}
    # IAPWS R10-06(2009) / R6-95(2018): at the triple point, h_vap - h_liq = 2500.9 kJ/kg,
    # h_vap - h_ice = 2834.3 kJ/kg, melting enthalpy 333.4 kJ/kg (from memory, rounded).
    assert body["latent_heat_of_vaporization_at_triple_point"]["value"] == pytest.approx(
        2_500_900, rel=1e-4
    )
    assert body["latent_heat_of_sublimation_at_triple_point"]["value"] == pytest.approx(
        2_834_300, rel=1e-4
    )
    assert body["latent_heat_of_fusion_at_triple_point"]["value"] == pytest.approx(
        333_430, rel=2e-4
    )


def test_openapi_documents_every_lookup(client: TestClient) -> None:
    schema = client.get("/openapi.json").json()
    operations = {
        operation["operationId"]
        for methods in schema["paths"].values()
        for operation in methods.values()
    }
    for name in ("saturation", "sublimation", "melting", "state"):
        assert {f"get_{name}", f"post_{name}"} <= operations
    assert "get_constants" in operations
    problem = schema["paths"]["/v1/properties/saturation"]["post"]["responses"]["422"]
    assert "application/problem+json" in problem["content"]
    for path, methods in schema["paths"].items():
        for method, operation in methods.items():
            if path.startswith("/v1/properties/"):
                success = operation["responses"]["200"]["content"]["application/json"]
                assert success["schema"]["$ref"].endswith("Public"), (method, path)


def test_critical_point_heat_capacity_is_null_with_warning(client: TestClient) -> None:
    body = client.get("/v1/properties/saturation", params={"temperature": "647.096"}).json()
    assert body["liquid"]["specific_isobaric_heat_capacity"]["value"] is None
    assert body["liquid"]["density"]["value"] == pytest.approx(322.0, rel=1e-9)
    # Latent heat vanishes at the critical point (IAPWS R6-95(2018), critical parameters).
    assert body["latent_heat_of_vaporization"]["value"] == pytest.approx(0.0, abs=1e-6)
    codes = [warning["code"] for warning in body["warnings"]]
    assert "diverges" in codes and "near-critical-point" in codes


def test_responses_validate_against_their_models(client: TestClient) -> None:
    from service.api.http.models import Envelope
    from service.api.properties.schemas import (
        ConstantsPublic,
        MeltingPublic,
        SaturationPublic,
        StatePublic,
        SublimationPublic,
    )

    checks: list[tuple[type[Envelope], str, dict[str, str]]] = [
        (SaturationPublic, "/v1/properties/saturation", {"temperature": "20 degC"}),
        (SublimationPublic, "/v1/properties/sublimation", {"pressure": "50 Pa"}),
        (MeltingPublic, "/v1/properties/melting", {"temperature": "260"}),
        (StatePublic, "/v1/properties/state", {"temperature": "300", "pressure": "1e5"}),
        (ConstantsPublic, "/v1/properties/constants", {}),
    ]
    for model, path, params in checks:
        body = client.get(path, params=params).json()
        model.model_validate(body)


def test_query_parameter_given_twice_takes_the_last_value(client: TestClient) -> None:
    # As FastAPI's own query parameters do (and as service.api.http.query documents).
    response = client.get(
        "/v1/properties/saturation?temperature=300&output_units=US&output_units=engineering"
    )
    assert response.status_code == 200, response.text
    assert response.json()["meta"]["output_units"] == "engineering"


def test_one_temperature_out_of_range_names_no_element_as_a_batch_of_one_does(
    client: TestClient,
) -> None:
    single = client.get("/v1/properties/saturation", params={"temperature": "700"}).json()
    batch = client.post("/v1/properties/saturation", json={"temperature": [700]}).json()
    assert single["errors"][0]["field"] == batch["errors"][0]["field"] == "temperature"
    assert single["errors"][0]["index"] is batch["errors"][0]["index"] is None
    assert single["detail"] == batch["detail"]
    assert "element" not in single["detail"]
