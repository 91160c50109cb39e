"""Inputs as practitioners type them: units, spellings, boundaries, gauge and negative
pressures, temperatures below absolute zero; each row with its expected outcome.

Conversion factors behind the accepted rows: NIST SP 811 (2008 edition), Appendix B.8
(1 torr = 101325/760 Pa, 1 mmHg = 133.322387415 Pa, 1 psi = 6894.757 Pa, 1 bar =
1e5 Pa) and B.9 (degC and degF to K). A micron of mercury is 1e-3 mmHg (the vacuum
trade's "micron"; NIST SP 811 B.8 gives the millimetre of mercury). The range bounds are
the service's documented ones (saturation: 273.16 K to 647.096 K, IAPWS R6-95(2018)
triple and critical points; sublimation: down to 50 K, IAPWS R14-08(2011)).
"""

from __future__ import annotations

import copy
import json
from collections.abc import Iterator
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import pytest
from fastapi.testclient import TestClient

from service.api.app import create_app
from service.settings import Settings

_EXAMPLES = Path(__file__).resolve().parents[2] / "openapi_examples"
_SAT = "/v1/properties/saturation"
_SUB = "/v1/properties/sublimation"
_FLASH = "/v1/balances/flash-freeze"
_EVAP = "/v1/balances/evaporative-cooling"
_CHAMBER = "/v1/simulations/vacuum-chamber"
_MTORR = 101325.0 / 760.0 / 1000.0  # Pa, NIST SP 811 B.8
_MICRON = 133.322387415e-3  # Pa, 1e-3 mmHg


def _example(name: str) -> dict[str, Any]:
    request: dict[str, Any] = json.loads((_EXAMPLES / f"{name}.json").read_text())["request"]
    return request


def _with(name: str, **changes: Any) -> dict[str, Any]:
    body = copy.deepcopy(_example(name))
    for dotted, value in changes.items():
        node = body
        *parents, last = dotted.split("__")
        for part in parents:
            node = node[part]
        if value is None:
            node.pop(last, None)
        else:
            node[last] = value
    return body


@dataclass(frozen=True)
class Typed:
    """One input as typed and what must come back."""

    name: str
    route: str
    status: int
    fragment: str = ""  # in the problem's detail (4xx) or checked by `expect` (200)
    query: dict[str, str] = field(default_factory=dict)
    body: Any = None
    field: str | None = None  # the field a 4xx must name
    expect: tuple[str, float] | None = None  # (dotted answer path, value) for a 200


def _sat(temperature: str, status: int = 200, fragment: str = "", **extra: Any) -> Typed:
    return Typed(
        f"saturation {temperature}",
        _SAT,
        status,
        fragment,
        query={"temperature": temperature},
        field=None if status == 200 else "temperature",
        **extra,
    )


def _sat_p(pressure: str, status: int = 200, fragment: str = "", **extra: Any) -> Typed:
    return Typed(
        f"saturation at {pressure}",
        _SAT,
        status,
        fragment,
        query={"pressure": pressure},
        field=None if status == 200 else "pressure",
        **extra,
    )


def _sub_p(pressure: str, status: int = 200, fragment: str = "", **extra: Any) -> Typed:
    return Typed(
        f"sublimation at {pressure}",
        _SUB,
        status,
        fragment,
        query={"pressure": pressure},
        field=None if status == 200 else "pressure",
        **extra,
    )


CASES = [
    # Temperatures: spellings and boundaries in degC, degF and K.
    _sat("25 degC", expect=("temperature.value", 298.15)),
    _sat("77 degF", expect=("temperature.value", 298.15)),
    _sat("298.15 K", expect=("temperature.value", 298.15)),
    _sat("25 °C", expect=("temperature.value", 298.15)),
    _sat("25 deg C", expect=("temperature.value", 298.15)),
    _sat("25 ℃", expect=("temperature.value", 298.15)),
    _sat("536.67 degR", expect=("temperature.value", 298.15)),
    _sat("0.01 degC", expect=("temperature.value", 273.16)),  # the lower bound, in degC
    _sat("32.018 degF", expect=("temperature.value", 273.16)),  # the lower bound, in degF
    _sat("273.16 K", expect=("temperature.value", 273.16)),
    _sat("373.946 degC", expect=("temperature.value", 647.096)),  # the upper bound
    _sat("25 C", 422, "write degC"),
    _sat("77 F", 422, "write degF"),
    _sat("-5 degC", 422, "-5 degC (268.15 K) is outside the valid range [0.01, 373.946] degC"),
    _sat("20 degF", 422, "20 degF"),
    _sat("-300 degC", 422, "below absolute zero"),
    _sat("-500 degF", 422, "below absolute zero"),
    _sat("-3 K", 422, "below absolute zero"),
    _sat("300 delta_degC", 422, "is a temperature difference"),
    # Pressures: vacuum units and their spellings.
    _sub_p("100 mTorr", expect=("pressure.value", 100 * _MTORR)),
    _sub_p("150 mtorr", expect=("pressure.value", 150 * _MTORR)),
    _sub_p("0.1 Torr", expect=("pressure.value", 100 * _MTORR)),
    _sub_p("0.1 torr", expect=("pressure.value", 100 * _MTORR)),
    _sub_p("200 micron", expect=("pressure.value", 200 * _MICRON)),
    _sub_p("200 microns", expect=("pressure.value", 200 * _MICRON)),
    _sub_p("200 µmHg", expect=("pressure.value", 200 * _MICRON)),
    _sub_p("200 umHg", expect=("pressure.value", 200 * _MICRON)),
    _sub_p("0.2 mmHg", expect=("pressure.value", 200 * _MICRON)),
    _sub_p("2 mbar", expect=("pressure.value", 200.0)),
    _sub_p("2 mBar", expect=("pressure.value", 200.0)),
    _sat_p("1.2 bara", expect=("pressure.value", 1.2e5)),
    _sat_p("1.2 bar", expect=("pressure.value", 1.2e5)),
    _sat_p("14.7 psia", expect=("pressure.value", 14.7 * 6894.757293168)),
    _sat_p("101.325 kPa", expect=("pressure.value", 101325.0)),
    # Gauge and negative pressures.
    _sat_p("-0.95 barg", 422, "tripoint takes absolute pressures"),
    _sat_p("1 psig", 422, "tripoint takes absolute pressures"),
    _sat_p("5 kPag", 422, "gauge pressure"),
    _sat_p("-95 kPa", 422, "a negative pressure looks like a gauge reading"),
    _sat_p("-95 kPa", 422, "-95 kPa (-95000 Pa)"),
    _sat_p("5000 psi", 422, "5000 psi (34473786"),
    # Balances and simulation: documented bounds met in the caller's unit.
    Typed(
        "flash-freeze ideal sucrose to its -38.15 degC floor",
        _FLASH,
        200,
        body=_with(
            "flash-freeze-brine-slurry-tank",
            solute={"name": "sucrose", "mass_fraction": "10 %", "model": "ideal"},
            final_ice_temperature="-38.15 degC",  # 235 K, the solution floor
        ),
    ),
    Typed(
        "flash-freeze ideal sucrose to its floor written as -36.67 degF",
        _FLASH,
        200,
        body=_with(
            "flash-freeze-brine-slurry-tank",
            solute={"name": "sucrose", "mass_fraction": "10 %", "model": "ideal"},
            final_ice_temperature="-36.67 degF",
        ),
    ),
    Typed(
        "flash-freeze ideal sucrose nucleating just above a -38.15 degC end",
        _FLASH,
        200,
        body=_with(
            "flash-freeze-brine-slurry-tank",
            solute={"name": "sucrose", "mass_fraction": "10 %", "model": "ideal"},
            nucleation_temperature="-38 degC",
            final_ice_temperature="-38.15 degC",
        ),
    ),
    Typed(
        "flash-freeze trap at -100 degC",
        _FLASH,
        200,
        body=_with("flash-freeze-vial-tray-pulldown", trap_temperature="-100 degC"),
    ),
    Typed(
        "flash-freeze trap at -148 degF",
        _FLASH,
        200,
        body=_with("flash-freeze-vial-tray-pulldown", trap_temperature="-148 degF"),
    ),
    Typed(
        "flash-freeze trap colder than -100 degC",
        _FLASH,
        422,
        "-101 degC (172.15 K)",
        body=_with("flash-freeze-vial-tray-pulldown", trap_temperature="-101 degC"),
        field="trap_temperature",
    ),
    Typed(
        "evaporative cooling, freezing point -30 degC",
        _EVAP,
        200,
        body=_with(
            "evaporative-cooling-strawberries-sugars",
            dissolved_solids=None,
            freezing_point="-30 degC",
        ),
    ),
    Typed(
        "chamber at -30 degC with a -100 degC condenser",
        _CHAMBER,
        200,
        body=_with(
            "chamber-bread-rack-vacuum-cooler",
            chamber__temperature="-30 degC",
            condenser__surface_temperature="-100 degC",
            end_time="5 min",
        ),
    ),
    Typed(
        "chamber starting at 0 bar shows the open bound",
        _CHAMBER,
        422,
        "is outside the valid range (0, 2] bar ((0, 200000] Pa)",
        body=_with("chamber-bread-rack-vacuum-cooler", chamber__initial_pressure="0 bar"),
        field="chamber.initial_pressure",
    ),
    Typed(
        "chamber in mTorr",
        _CHAMBER,
        200,
        body=_with(
            "chamber-bread-rack-vacuum-cooler",
            chamber__initial_pressure="760000 mTorr",
            pump__ultimate_pressure="1500 micron",
            end_time="5 min",
        ),
    ),
    Typed(
        "water fraction as a bare 95 has no unit '1' in the message",
        _CHAMBER,
        422,
        "product.water_fraction = 95 is outside the valid range (0, 1]: mass fraction",
        body=_with("chamber-bread-rack-vacuum-cooler", product__water_fraction=95),
        field="product.water_fraction",
    ),
    Typed(
        "water fraction in percent answers in percent",
        _CHAMBER,
        422,
        "120 % (1.2) is outside the valid range (0, 100] %",
        body=_with("chamber-bread-rack-vacuum-cooler", product__water_fraction="120 %"),
        field="product.water_fraction",
    ),
    Typed(
        "chamber gauge pressure",
        _CHAMBER,
        422,
        "tripoint takes absolute pressures",
        body=_with("chamber-bread-rack-vacuum-cooler", chamber__initial_pressure="0 barg"),
        field="chamber.initial_pressure",
    ),
]


@pytest.fixture(scope="module")
def client(tmp_path_factory: pytest.TempPathFactory) -> Iterator[TestClient]:
    database = tmp_path_factory.mktemp("typed") / "records.db"
    with TestClient(create_app(Settings(database_url=f"sqlite:///{database}"))) as test_client:
        yield test_client


def _at(answer: dict[str, Any], dotted: str) -> Any:
    node: Any = answer
    for part in dotted.split("."):
        node = node[part]
    return node[0] if isinstance(node, list) else node


def test_there_are_at_least_forty_rows() -> None:
    assert len(CASES) >= 40
    assert len({case.name for case in CASES}) == len(CASES) - 1  # "-95 kPa" is asked twice


@pytest.mark.parametrize("case", CASES, ids=[f"{i:02d} {c.name}" for i, c in enumerate(CASES)])
def test_input_as_typed(client: TestClient, case: Typed) -> None:
    if case.body is None:
        response = client.get(case.route, params=case.query)
    else:
        response = client.post(case.route, json=case.body)
    assert response.status_code == case.status, response.text
    if case.status == 200:
        if case.expect is not None:
            path, expected = case.expect
            # lookups answer the state in SI by default
            assert _at(response.json(), path) == pytest.approx(expected, rel=1e-12)
        return
    assert response.headers["content-type"].startswith("application/problem+json")
    problem = response.json()
    assert case.fragment in problem["detail"], problem["detail"]
    assert case.field in [error["field"] for error in problem["errors"]]
