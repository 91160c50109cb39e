"""Balances over HTTP: every success path and option, unit sets, sweeps, uncertainty, errors.

Most numeric checks compare the HTTP answer with the core called directly (source: the
core, ``service.core.balances``), which checks the wiring: units, sweeps, option mapping.
The physics has its own tests in tests/core/balances/. A few checks stand on sources
outside the project; each names its source beside the case.
"""

from __future__ import annotations

import json
import math
from typing import Any

import numpy as np
import pytest
from csv_support import read_csv_answer
from fastapi.testclient import TestClient
from iapws import IAPWS95
from iapws._iapws import _Ice
from pydantic import BaseModel

from service.api.balances.schemas import EvaporativeCoolingPublic, FlashFreezePublic
from service.core.balances import (
    Companion,
    Composition,
    EvaporativeCoolingCase,
    FlashFreezeCase,
    HeatGain,
    evaporative_cooling,
    flash_freeze,
    named_solute,
)

FLASH = "/v1/balances/flash-freeze"
EVAPORATIVE = "/v1/balances/evaporative-cooling"
LETTUCE: dict[str, Any] = {
    "product_mass": 600,
    "initial_temperature": "22 degC",
    "final_temperature": "2 degC",
    "specific_heat": "4.0 kJ/(kg*K)",
    "freezing_point": "-0.2 degC",
}
ROLLS: dict[str, Any] = {
    "product_mass": "7.2 kg",
    "initial_temperature": "95 degC",
    "final_temperature": "25 degC",
    "composition": {
        "water": 0.36,
        "protein": 0.09,
        "fat": 0.04,
        "carbohydrate": 0.47,
        "fiber": 0.025,
        "ash": 0.015,
    },
    "freezing_point": "-6 degC",
}
POUND = 0.45359237
"""kg per lb, exact by definition (international yard and pound agreement, 1959)."""


def _refuse_constant(name: str) -> float:
    raise AssertionError(f"non-finite number {name} in a response")


def _post(
    client: TestClient, path: str, body: dict[str, Any], model: type[BaseModel] | None = None
) -> dict[str, Any]:
    """POST, require 200, refuse NaN/Infinity in the text, validate against ``model``."""
    response = client.post(path, json=body)
    assert response.status_code == 200, response.text
    answer: dict[str, Any] = json.loads(response.text, parse_constant=_refuse_constant)
    if model is not None:
        model.model_validate(answer)
    return answer


def _problem(client: TestClient, path: str, body: Any, status: int = 422) -> dict[str, Any]:
    response = client.post(path, json=body)
    assert response.status_code == status, response.text
    assert response.headers["content-type"].startswith("application/problem+json")
    problem: dict[str, Any] = response.json()
    return problem


def _numbers(node: Any) -> list[float]:
    if isinstance(node, dict):
        return [number for child in node.values() for number in _numbers(child)]
    if isinstance(node, list):
        return [number for child in node for number in _numbers(child)]
    if isinstance(node, float | int) and not isinstance(node, bool):
        return [float(node)]
    return []


# -- flash-freeze: success paths -------------------------------------------------------------


def test_flash_freeze_defaults(client: TestClient) -> None:
    body = _post(client, FLASH, {"initial_temperature": "20 degC"}, FlashFreezePublic)
    # source: the core, service.core.balances.flash_freeze, called directly
    core = flash_freeze(FlashFreezeCase(initial_temperature=293.15))
    assert body["method"] == "integrated"
    assert body["evaporated_mass"] == {
        "value": pytest.approx(float(core.evaporated_mass)),
        "unit": "kg",
    }
    assert body["evaporated_fraction_of_water"]["unit"] == "1"
    assert body["ice_mass"]["value"] == pytest.approx(float(core.ice_mass))
    assert body["final_temperature"] == {"value": pytest.approx(273.16), "unit": "K"}
    assert [stage["name"] for stage in body["stages"]] == ["cooling", "freezing"]
    assert body["condenser_load"] is None
    assert body["input_uncertainty"] is None
    assert len(body["trajectory"]) == 1
    assert len(body["trajectory"][0]["temperature"]["values"]) >= 50
    assert body["meta"]["calculation_id"]
    assert any("Adiabatic" in item for item in body["assumptions"])
    assert all(math.isfinite(number) for number in _numbers(body))


def test_flash_freeze_mass_is_conserved_and_energy_closes(client: TestClient) -> None:
    # Invariants of the balance (no outside source): water in = vapor + ice + liquid, and the
    # energy books close to 1e-9 relative.
    body = _post(
        client,
        FLASH,
        {"initial_temperature": "35 degC", "water_mass": "2.5 kg", "final_ice_temperature": 250},
    )
    total = body["evaporated_mass"]["value"] + body["ice_mass"]["value"]
    assert total + body["liquid_mass"]["value"] == pytest.approx(2.5, rel=1e-12)
    assert abs(body["energy_balance"]["relative_residual"]["value"]) < 1e-9
    # integrated and hand methods agree within 2 % (the requirement)
    assert abs(body["comparison"]["relative_difference"]["value"]) < 0.02


def test_flash_freeze_from_the_triple_point_matches_latent_heats(client: TestClient) -> None:
    # Water already at the triple point only freezes: m_v / m = (h_l - h_ice) / (h_v - h_ice),
    # the triple-point latent heats of fusion and sublimation, IAPWS R6-95(2018) / R10-06(2009),
    # here evaluated with the independent iapws 1.5.5 package (IAPWS95 class and _Ice).
    liquid = IAPWS95(T=273.16, x=0)
    vapor = IAPWS95(T=273.16, x=1)
    ice = _Ice(273.16, 0.000611657)
    expected = (liquid.h - ice["h"]) / (vapor.h - ice["h"])
    body = _post(client, FLASH, {"initial_temperature": 273.16}, FlashFreezePublic)
    assert body["evaporated_fraction_of_water"]["value"] == pytest.approx(expected, rel=1e-5)
    # about 333.4 / 2834.4 = 0.1176 (triple-point latent heats, from memory)
    assert body["evaporated_fraction_of_water"]["value"] == pytest.approx(0.1176, abs=2e-4)


def test_flash_freeze_every_option(client: TestClient) -> None:
    request = {
        "initial_temperature": {"value": 25, "unit": "degC"},
        "water_mass": "0.6 kg",
        "final_ice_temperature": "-30 degC",
        "method": "mean-vapor-enthalpy",
        "companions": [
            {"name": "vials", "mass": "0.8 kg", "material": "glass (borosilicate)"},
            {"name": "tray", "mass": 1.5, "specific_heat": "0.5 kJ/(kg*K)"},
        ],
        "heat_gain": {"energy": "20 kJ"},
        "nucleation_temperature": "-6 degC",
        "trap_temperature": "-60 degC",
        "trajectory_points": 120,
    }
    body = _post(client, FLASH, request, FlashFreezePublic)
    # source: the core, called directly with the same case in SI
    core = flash_freeze(
        FlashFreezeCase(
            initial_temperature=298.15,
            water_mass=0.6,
            final_ice_temperature=243.15,
            method="mean-vapor-enthalpy",
            companions=(Companion(0.8, 835.0), Companion(1.5, 500.0)),
            heat_gain=HeatGain(energy=20e3),
            nucleation_temperature=267.15,
            trap_temperature=213.15,
            trajectory_points=120,
        )
    )
    assert body["method"] == "mean-vapor-enthalpy"
    assert body["evaporated_mass"]["value"] == pytest.approx(float(core.evaporated_mass), rel=1e-12)
    assert body["evaporated_mass"]["value"] == pytest.approx(
        body["comparison"]["mean_vapor_enthalpy_evaporated_mass"]["value"], rel=1e-12
    )
    assert body["condenser_load"]["value"] == pytest.approx(float(core.condenser_load), rel=1e-12)  # type: ignore[arg-type]
    assert body["heat_gained"]["value"] == pytest.approx(20e3, rel=1e-9)
    # An input repeated in the answer comes back in the unit it was sent in ("-60 degC").
    assert body["trap_temperature"] == {"value": -60.0, "unit": "degC"}
    assert [stage["name"] for stage in body["stages"]] == [
        "cooling",
        "supercooled cooling",
        "recalescence",
        "freezing",
        "ice cooling",
    ]
    assert len(body["trajectory"][0]["temperature"]["values"]) >= 120
    assert any("borosilicate" in item for item in body["assumptions"])
    assert {w["code"] for w in body["warnings"]} >= {"metastable"}
    # the supercooled stage has no uncertainty statement: the derived entry says so
    derived = [u for u in body["uncertainty"] if u["basis"] == "derived" and u.get("absolute")]
    assert derived[0]["statement_id"] == "balances.evaporated-mass"
    assert derived[0]["not_covered"] == ["supercooled cooling"]


def test_flash_freeze_heat_gain_as_power_equals_energy(client: TestClient) -> None:
    # 50 W for 10 min is 30 kJ (definition of the watt)
    base = {"initial_temperature": "15 degC", "water_mass": 2.0}
    by_power = _post(client, FLASH, {**base, "heat_gain": {"power": "50 W", "duration": "10 min"}})
    by_energy = _post(client, FLASH, {**base, "heat_gain": {"energy": 30e3}})
    assert by_power["evaporated_mass"]["value"] == pytest.approx(
        by_energy["evaporated_mass"]["value"], rel=1e-12
    )
    adiabatic = _post(client, FLASH, base)
    assert by_power["evaporated_mass"]["value"] > adiabatic["evaporated_mass"]["value"]


def test_flash_freeze_named_solute_equals_solute_by_molar_mass(client: TestClient) -> None:
    base = {"initial_temperature": "10 degC", "final_ice_temperature": "-3 degC"}
    named = _post(
        client,
        FLASH,
        {**base, "solute": {"name": "sucrose", "mass_fraction": "10 %", "model": "ideal"}},
        FlashFreezePublic,
    )
    by_molar_mass = _post(
        client,
        FLASH,
        {
            **base,
            "solute": {
                "mass_fraction": 0.1,
                "molar_mass": "342.297 g/mol",
                "van_t_hoff_factor": 1,
                "specific_heat": 1244,
            },
        },
    )
    # source: the core, called directly with the named solute
    core = flash_freeze(
        FlashFreezeCase(
            initial_temperature=283.15,
            final_ice_temperature=270.15,
            solute=named_solute("sucrose", 0.1, "ideal"),
        )
    )
    assert named["evaporated_mass"]["value"] == pytest.approx(
        float(core.evaporated_mass), rel=1e-12
    )
    assert by_molar_mass["evaporated_mass"]["value"] == pytest.approx(
        named["evaporated_mass"]["value"], rel=1e-9
    )
    assert named["liquid_mass"]["value"] > 0.0  # a solution keeps unfrozen water
    assert named["ice_mass"]["value"] > 0.0


def test_flash_freeze_us_units(client: TestClient) -> None:
    si = _post(client, FLASH, {"initial_temperature": 300.0, "final_ice_temperature": 255.0})
    us = _post(
        client,
        FLASH,
        {"initial_temperature": "80.33 degF", "final_ice_temperature": 255.0, "output_units": "US"},
        FlashFreezePublic,
    )
    # 80.33 degF = 300.0 K (ITS-90 definitions of degF and K)
    assert us["evaporated_mass"]["unit"] == "lb"
    assert us["evaporated_mass"]["value"] * POUND == pytest.approx(
        si["evaporated_mass"]["value"], rel=1e-5
    )
    assert us["final_temperature"]["unit"] == "degF"
    assert us["final_temperature"]["value"] == pytest.approx((255.0 - 273.15) * 1.8 + 32.0)
    assert us["final_pressure"]["unit"] == "psi"
    assert us["stages"][0]["vapor_volume"]["unit"] == "ft3"
    assert us["energy_balance"]["vapor_enthalpy"]["unit"] == "Btu"
    assert us["meta"]["output_units"] == "US"


def test_flash_freeze_engineering_units(client: TestClient) -> None:
    body = _post(
        client,
        FLASH,
        {"initial_temperature": 293.15, "output_units": "engineering", "trap_temperature": 230},
        FlashFreezePublic,
    )
    si = _post(client, FLASH, {"initial_temperature": 293.15, "trap_temperature": 230})
    assert body["final_temperature"] == {"value": pytest.approx(0.01), "unit": "degC"}
    assert body["final_pressure"]["unit"] == "kPa"
    assert body["condenser_load"]["unit"] == "kJ"
    assert body["condenser_load"]["value"] * 1e3 == pytest.approx(si["condenser_load"]["value"])
    assert body["trajectory"][0]["temperature"]["unit"] == "degC"


# -- sweeps --------------------------------------------------------------------------------


def test_flash_freeze_sweep_matches_single_calls(client: TestClient) -> None:
    temperatures = [40.0, 5.0, 20.0]
    body = _post(
        client,
        FLASH,
        {
            "initial_temperature": {"values": temperatures, "unit": "degC"},
            "final_ice_temperature": "-10 degC",
            "trap_temperature": "-40 degC",
        },
        FlashFreezePublic,
    )
    assert len(body["evaporated_mass"]["values"]) == 3
    assert len(body["trajectory"]) == 3
    for stage in body["stages"]:
        assert len(stage["evaporated_mass"]["values"]) == 3
    for position, temperature in enumerate(temperatures):
        single = _post(
            client,
            FLASH,
            {
                "initial_temperature": f"{temperature} degC",
                "final_ice_temperature": "-10 degC",
                "trap_temperature": "-40 degC",
            },
        )
        for name in ("evaporated_mass", "ice_mass", "condenser_load", "vapor_volume"):
            assert body[name]["values"][position] == pytest.approx(single[name]["value"], rel=1e-12)
        assert body["trajectory"][position] == single["trajectory"][0]
    # evaporated fraction rises with the initial temperature (the invariant)
    fractions = dict(zip(temperatures, body["evaporated_fraction_of_water"]["values"], strict=True))
    assert fractions[5.0] < fractions[20.0] < fractions[40.0]


def test_sweep_of_a_nested_field_as_plain_list(client: TestClient) -> None:
    body = _post(
        client,
        FLASH,
        {
            "initial_temperature": 293.15,
            "companions": [{"mass": [0.0, 1.0, 2.0], "material": "aluminium"}],
        },
        FlashFreezePublic,
    )
    values = body["evaporated_mass"]["values"]
    assert values[0] < values[1] < values[2]  # more tray mass, more water evaporated
    assert body["final_temperature"]["values"] == pytest.approx([273.16] * 3)


def test_evaporative_sweep_matches_single_calls(client: TestClient) -> None:
    finals = [2.0, 10.0]
    body = _post(
        client,
        EVAPORATIVE,
        {**LETTUCE, "final_temperature": {"values": finals, "unit": "degC"}},
        EvaporativeCoolingPublic,
    )
    for position, final in enumerate(finals):
        single = _post(client, EVAPORATIVE, {**LETTUCE, "final_temperature": f"{final} degC"})
        for name in ("evaporated_mass", "prewetting_water_mass", "final_pressure", "heat_removed"):
            assert body[name]["values"][position] == pytest.approx(single[name]["value"], rel=1e-12)


def test_sweep_arrays_of_different_lengths_are_refused(client: TestClient) -> None:
    problem = _problem(
        client,
        FLASH,
        {"initial_temperature": [280.0, 290.0, 300.0], "water_mass": [1.0, 2.0]},
    )
    assert problem["errors"][0]["field"] == "water_mass"


def test_sweep_error_names_the_element(client: TestClient) -> None:
    problem = _problem(
        client, FLASH, {"initial_temperature": {"values": [20, 120], "unit": "degC"}}
    )
    error = problem["errors"][0]
    assert error["field"] == "initial_temperature"
    assert error["index"] == 1
    # In the caller's unit (degC), SI beside it.
    assert (error["unit"], error["value"], error["maximum"]) == ("degC", 120.0, 100.0)
    assert error["si"]["maximum"] == pytest.approx(373.15)


def test_too_many_sweep_points_is_413(client: TestClient) -> None:
    limit = client.app.state.settings.max_sweep_cases  # type: ignore[attr-defined]
    problem = _problem(client, FLASH, {"initial_temperature": [290.0] * (limit + 1)}, status=413)
    assert problem["errors"][0]["maximum"] == limit
    assert "TRIPOINT_MAX_SWEEP_CASES" in problem["detail"]


# -- uncertainty ---------------------------------------------------------------------------


def test_input_uncertainty_is_propagated(client: TestClient) -> None:
    body = _post(
        client,
        FLASH,
        {
            "initial_temperature": {"value": 20, "unit": "degC", "uncertainty": 0.5},
            "water_mass": {"value": 2.0, "unit": "kg", "uncertainty": 0.01},
            "final_ice_temperature": {"value": -20, "unit": "degC", "uncertainty": 1.0},
        },
        FlashFreezePublic,
    )
    block = body["input_uncertainty"]
    assert "linear sensitivity" in block["method"]
    assert "central finite differences" in block["method"]
    assert [item["field"] for item in block["inputs"]] == [
        "initial_temperature",
        "water_mass",
        "final_ice_temperature",
    ]
    assert block["inputs"][0]["standard_uncertainty"] == {"value": 0.5, "unit": "K"}
    for name in (
        "evaporated_mass",
        "evaporated_fraction_of_water",
        "ice_mass",
        "final_temperature",
    ):
        assert block[name]["value"] > 0.0, name
    assert block["final_temperature"]["value"] == pytest.approx(1.0, rel=1e-6)
    # contributions combine in quadrature (GUM, JCGM 100:2008, Eq. 10, uncorrelated inputs)
    parts = [item["evaporated_mass_contribution"]["value"] for item in block["inputs"]]
    assert block["evaporated_mass"]["value"] == pytest.approx(math.hypot(*parts), rel=1e-12)
    # the water mass enters linearly: its contribution is the evaporated fraction times u(m)
    fraction = body["evaporated_fraction_of_water"]["value"]
    assert parts[1] == pytest.approx(fraction * 0.01, rel=1e-6)


def test_property_uncertainty_is_in_the_envelope(client: TestClient) -> None:
    body = _post(client, FLASH, {"initial_temperature": 300.0, "final_ice_temperature": 250.0})
    quantities = {item["quantity"] for item in body["uncertainty"]}
    assert {"enthalpy_of_vaporization", "enthalpy_of_sublimation", "evaporated_mass"} <= quantities
    derived = next(item for item in body["uncertainty"] if item["quantity"] == "evaporated_mass")
    assert derived["basis"] == "derived"
    assert 0.0 < derived["absolute"]["value"] < 1e-2 * body["evaporated_mass"]["value"]


def test_evaporative_uncertainty_in_a_sweep(client: TestClient) -> None:
    body = _post(
        client,
        EVAPORATIVE,
        {
            **LETTUCE,
            "initial_temperature": {"values": [18, 22, 26], "unit": "degC", "uncertainty": 0.3},
        },
        EvaporativeCoolingPublic,
    )
    block = body["input_uncertainty"]
    assert block["inputs"][0]["field"] == "initial_temperature"
    assert len(block["evaporated_mass"]["values"]) == 3
    assert all(value > 0.0 for value in block["evaporated_mass"]["values"])
    assert block["final_pressure"]["values"] == pytest.approx([0.0] * 3, abs=1e-9)


# -- evaporative cooling: success paths ----------------------------------------------------


def test_evaporative_lumped_against_the_core_and_the_rule_of_thumb(client: TestClient) -> None:
    body = _post(client, EVAPORATIVE, LETTUCE, EvaporativeCoolingPublic)
    # source: the core, called directly in SI
    core = evaporative_cooling(
        EvaporativeCoolingCase(
            product_mass=600.0,
            initial_temperature=295.15,
            final_temperature=275.15,
            specific_heat=4000.0,
            freezing_point=272.95,
        )
    )
    assert body["evaporated_mass"]["value"] == pytest.approx(float(core.evaporated_mass), rel=1e-12)
    # Produce loses about 1 % of its mass per 5-6 degC of vacuum cooling (common practice,
    # no source); a wide band around it: 0.13 to 0.25 % per K.
    per_kelvin = body["evaporated_fraction_of_product"]["value"] * 100.0 / 20.0
    assert 0.13 < per_kelvin < 0.25
    assert body["prewetting_water_mass"]["value"] > body["evaporated_mass"]["value"]
    assert body["warnings"] == []
    assert abs(body["comparison"]["relative_difference"]["value"]) < 0.02
    assert abs(body["energy_balance"]["relative_residual"]["value"]) < 1e-9


def test_evaporative_pressures_are_saturation_pressures(client: TestClient) -> None:
    body = _post(client, EVAPORATIVE, LETTUCE)
    # saturation pressure at 22 and 2 degC, iapws 1.5.5 IAPWS95 class (MPa -> Pa)
    assert body["start_pressure"]["value"] == pytest.approx(
        IAPWS95(T=295.15, x=0).P * 1e6, rel=1e-6
    )
    assert body["final_pressure"]["value"] == pytest.approx(
        IAPWS95(T=275.15, x=0).P * 1e6, rel=1e-6
    )


def test_evaporative_composition_companion_trap_and_flows(client: TestClient) -> None:
    request = {
        **ROLLS,
        "companions": [{"name": "rack", "mass": "12 kg", "material": "aluminium"}],
        "trap_temperature": "-30 degC",
        "cooling_time": "6 min",
        "heat_gain": {"power": "300 W", "duration": "6 min"},
    }
    body = _post(client, EVAPORATIVE, request, EvaporativeCoolingPublic)
    # source: the core, called directly in SI
    core = evaporative_cooling(
        EvaporativeCoolingCase(
            product_mass=7.2,
            initial_temperature=368.15,
            final_temperature=298.15,
            composition=Composition(0.36, 0.09, 0.04, 0.47, 0.025, 0.015),
            companions=(Companion(12.0, 903.0),),
            heat_gain=HeatGain(power=300.0, duration=360.0),
            freezing_point=267.15,
            trap_temperature=243.15,
            cooling_time=360.0,
        )
    )
    assert body["evaporated_mass"]["value"] == pytest.approx(float(core.evaporated_mass), rel=1e-12)
    assert body["condenser_load"]["value"] == pytest.approx(float(core.condenser_load), rel=1e-12)  # type: ignore[arg-type]
    assert body["mean_vapor_mass_flow"]["value"] == pytest.approx(
        body["evaporated_mass"]["value"] / 360.0, rel=1e-12
    )
    assert body["mean_vapor_volume_flow"]["value"] == pytest.approx(
        body["vapor_volume"]["value"] / 360.0, rel=1e-12
    )
    assert body["cooling_time"] == {"value": 6.0, "unit": "min"}  # as sent
    assert body["energy_balance"]["heat_gained"]["value"] == pytest.approx(108e3, rel=1e-9)
    assert any("Choi" in item for item in body["assumptions"])


def test_evaporative_engineering_flows(client: TestClient) -> None:
    body = _post(
        client,
        EVAPORATIVE,
        {**LETTUCE, "cooling_time": "25 min", "output_units": "engineering"},
        EvaporativeCoolingPublic,
    )
    assert body["mean_vapor_mass_flow"]["unit"] == "kg/h"
    assert body["mean_vapor_mass_flow"]["value"] == pytest.approx(
        body["evaporated_mass"]["value"] * 60.0 / 25.0, rel=1e-12
    )
    assert body["mean_vapor_volume_flow"]["unit"] == "m3/h"
    assert body["final_pressure"]["unit"] == "kPa"


def test_evaporative_without_freezing_point_warns(client: TestClient) -> None:
    request = {key: value for key, value in LETTUCE.items() if key != "freezing_point"}
    body = _post(client, EVAPORATIVE, request)
    assert [warning["code"] for warning in body["warnings"]] == ["freezing-point-assumed"]


def test_balance_answers_are_stored(client: TestClient) -> None:
    body = _post(client, EVAPORATIVE, LETTUCE)
    stored = client.get(f"/v1/calculations/{body['meta']['calculation_id']}")
    assert stored.status_code == 200, stored.text
    record = stored.json()
    assert record["kind"] == "balances.evaporative_cooling"
    assert record["inputs"]["initial_temperature"] == "22 degC"
    flash = _post(client, FLASH, {"initial_temperature": 290.0})
    assert client.get(f"/v1/calculations/{flash['meta']['calculation_id']}").status_code == 200


def test_csv_one_case_per_row(client: TestClient) -> None:
    text = (
        "product_mass[kg],initial_temperature[degC],final_temperature[degC],"
        "specific_heat[kJ/(kg*K)],freezing_point[degC]\n"
        "600,22,2,4.0,-0.2\n"
        "300,30,4,3.9,-0.5\n"
    )
    response = client.post(
        EVAPORATIVE, content=text, headers={"content-type": "text/csv", "accept": "text/csv"}
    )
    assert response.status_code == 200, response.text
    answer = read_csv_answer(response.text)
    rows = answer.rows
    assert len(rows) == 2
    # Statements the rows share are stated once, above the table; ids differ per row.
    assert answer.statements["reference_state"] == "iapws-triple-point-liquid"
    assert len({row["meta.calculation_id"] for row in rows}) == 2
    assert not any(name.startswith("property_sources") for name in answer.header)
    single = _post(client, EVAPORATIVE, LETTUCE)
    assert float(rows[0]["evaporated_mass[kg]"]) == pytest.approx(
        single["evaporated_mass"]["value"], rel=1e-12
    )


# -- errors --------------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("path", "body", "field"),
    [
        (FLASH, {"initial_temperature": "20 kPa"}, "initial_temperature"),
        (FLASH, {"initial_temperature": "nan degC"}, "initial_temperature"),
        (FLASH, {"initial_temperature": 293.15, "water_mass": "1 furlong"}, "water_mass"),
        (
            FLASH,
            {"initial_temperature": 293.15, "companions": [{"mass": 1, "material": "unobtainium"}]},
            "companions[0].material",
        ),
        (
            FLASH,
            {
                "initial_temperature": 293.15,
                "companions": [{"mass": 1, "material": "copper", "specific_heat": 385}],
            },
            "companions[0].specific_heat, companions[0].material",
        ),
        (
            FLASH,
            {
                "initial_temperature": 293.15,
                "final_ice_temperature": 260,
                "solute": {"name": "unobtainium", "mass_fraction": 0.1},
            },
            "solute.name",
        ),
        (
            FLASH,
            {
                "initial_temperature": 293.15,
                "final_ice_temperature": 260,
                "solute": {"name": "sucrose", "mass_fraction": 0.1, "molar_mass": 0.3},
            },
            "solute.name",
        ),
        (
            FLASH,
            {
                "initial_temperature": 293.15,
                "final_ice_temperature": 260,
                "solute": {"mass_fraction": 0.1},
            },
            "solute.molar_mass",
        ),
        (
            FLASH,
            {"initial_temperature": 293.15, "solute": {"name": "glucose", "mass_fraction": 0.1}},
            "final_ice_temperature",
        ),
        (FLASH, {"initial_temperature": 293.15, "heat_gain": {"power": 5}}, "heat_gain"),
        (FLASH, {"initial_temperature": 293.15, "water_mass": 0}, "water_mass"),
        (FLASH, {"initial_temperature": "-5 degC"}, "initial_temperature"),
        (
            FLASH,
            {"initial_temperature": 293.15, "final_ice_temperature": 100},
            "final_ice_temperature",
        ),
        (FLASH, {"initial_temperature": 293.15, "trajectory_points": 10}, "trajectory_points"),
        (FLASH, {"initial_temperature": 293.15, "method": "guess"}, "method"),
        (FLASH, {"initial_temperature": 293.15, "colour": "blue"}, "colour"),
        (FLASH, {"water_mass": 1.0}, "initial_temperature"),
        (EVAPORATIVE, {**LETTUCE, "final_temperature": "22 degC"}, "final_temperature"),
        (EVAPORATIVE, {**LETTUCE, "final_temperature": "30 degC"}, "final_temperature"),
        (EVAPORATIVE, {**LETTUCE, "composition": {"water": 0.9}}, "specific_heat, composition"),
        (
            EVAPORATIVE,
            {key: value for key, value in LETTUCE.items() if key != "specific_heat"},
            "specific_heat, composition",
        ),
        (
            EVAPORATIVE,
            {**ROLLS, "composition": {"water": 0.5, "protein": 0.1}},
            "composition",
        ),
        (EVAPORATIVE, {**LETTUCE, "cooling_time": 0}, "cooling_time"),
        (EVAPORATIVE, {**LETTUCE, "trap_temperature": "5 degC"}, "trap_temperature"),
    ],
    ids=[
        "temperature-in-pressure-unit",
        "nan-text",
        "unknown-unit",
        "unknown-material",
        "material-and-specific-heat",
        "unknown-solute",
        "named-solute-with-molar-mass",
        "solute-without-molar-mass",
        "solute-without-final-temperature",
        "power-without-duration",
        "no-water",
        "starts-frozen",
        "ice-below-range",
        "too-few-trajectory-points",
        "unknown-method",
        "unknown-field",
        "missing-initial-temperature",
        "final-equals-initial",
        "final-above-initial",
        "specific-heat-and-composition",
        "neither-specific-heat-nor-composition",
        "composition-not-summing-to-one",
        "zero-cooling-time",
        "trap-above-triple-point",
    ],
)
def test_invalid_input_is_a_problem_naming_the_field(
    client: TestClient, path: str, body: dict[str, Any], field: str
) -> None:
    problem = _problem(client, path, body)
    fields = [error["field"] for error in problem["errors"]]
    assert any(name == field or name.startswith(f"{field}.") for name in fields), fields
    assert problem["detail"]


def test_nan_literal_is_refused(client: TestClient) -> None:
    response = client.post(
        FLASH, content='{"initial_temperature": NaN}', headers={"content-type": "application/json"}
    )
    assert response.status_code == 422, response.text
    assert response.headers["content-type"].startswith("application/problem+json")


def test_final_at_or_above_initial_gives_the_range(client: TestClient) -> None:
    problem = _problem(client, EVAPORATIVE, {**LETTUCE, "final_temperature": "22 degC"})
    error = problem["errors"][0]
    assert error["maximum"] == pytest.approx(22.0)
    assert error["si"]["maximum"] == pytest.approx(295.15)
    assert "below the initial temperature" in problem["detail"]


def test_below_freezing_points_to_flash_freeze(client: TestClient) -> None:
    problem = _problem(
        client,
        EVAPORATIVE,
        {**LETTUCE, "final_temperature": {"values": [2, -1], "unit": "degC"}},
    )
    assert "/v1/balances/flash-freeze" in problem["detail"]
    error = problem["errors"][0]
    assert error["field"] == "final_temperature"
    assert error["index"] == 1
    assert error["minimum"] == pytest.approx(272.95)
    assert "/v1/balances/flash-freeze" in error["message"]


def test_openapi_documents_the_balances(client: TestClient) -> None:
    schema = client.get("/openapi.json").json()
    for path, operation_id in (
        (FLASH, "post_flash_freeze"),
        (EVAPORATIVE, "post_evaporative_cooling"),
    ):
        operation = schema["paths"][path]["post"]
        assert operation["operationId"] == operation_id
        assert {"413", "422"} <= set(operation["responses"])
        assert "text/csv" in operation["requestBody"]["content"]
        success = operation["responses"]["200"]["content"]["application/json"]["schema"]
        assert success["$ref"].endswith("Public")
    fields = schema["components"]["schemas"]["FlashFreezeCreate"]["properties"]
    assert "Default unit K" in fields["initial_temperature"]["description"]


def test_answers_hold_only_finite_numbers(client: TestClient) -> None:
    for path, body in (
        (FLASH, {"initial_temperature": [275.0, 373.15], "final_ice_temperature": 173.15}),
        (EVAPORATIVE, {**ROLLS, "output_units": "US"}),
    ):
        answer = _post(client, path, body)
        numbers = np.asarray(_numbers(answer))
        assert numbers.size > 20
        assert np.isfinite(numbers).all()


def test_flash_freeze_of_seawater_as_typed(client: TestClient) -> None:
    # A vacuum slurry tank of standard seawater: the salinity as typed in g/kg, the answer
    # equal to the core's (source: the core) and naming the seawater release.
    body = {
        "initial_temperature": "12 degC",
        "water_mass": "100 kg",
        "solute": {"name": "seawater", "mass_fraction": "35.16504 g/kg"},
        "final_ice_temperature": "-2 degC",
    }
    response = client.post("/v1/balances/flash-freeze", json=body)
    assert response.status_code == 200, response.text
    answer = response.json()
    core = flash_freeze(
        FlashFreezeCase(
            initial_temperature=285.15,
            water_mass=100.0,
            solute=named_solute("seawater", 0.03516504),
            final_ice_temperature=271.15,
        )
    )
    assert answer["ice_mass"]["value"] == pytest.approx(float(core.ice_mass), rel=1e-12)
    assert answer["ice_mass"]["value"] > 1.0
    assert any(source["release"] == "IAPWS R13-08" for source in answer["property_sources"])
    assert any("R13-08" in line for line in answer["assumptions"])
