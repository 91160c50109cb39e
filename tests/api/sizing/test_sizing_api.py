"""POST /v1/sizing/vacuum-chamber: the answer fed back into the simulation meets the target
and 0.95 x of it does not (pump speed, trap refrigeration capacity); units, plots, records,
errors.

The solution's unit follows the case: "1800 m3/h" in the case gives m3/h back. The loop
check goes through /v1/simulations/vacuum-chamber, so it holds the two endpoints to one
model; the model itself is checked against the pump-down law in tests/core/sizing.
"""

from __future__ import annotations

import copy
import json
from typing import Any

import pytest
from fastapi.testclient import TestClient

from service.api.http.examples import default_examples_folder

PATH = "/v1/sizing/vacuum-chamber"
SIMULATION = "/v1/simulations/vacuum-chamber"

EXAMPLE = json.loads(
    (default_examples_folder() / "sizing-bakery-pump-for-five-minutes.json").read_text()
)["request"]
TARGET_SECONDS = 300.0


def _with(case: dict[str, Any], path: str, value: dict[str, Any]) -> dict[str, Any]:
    changed = copy.deepcopy(case)
    part = changed
    *heads, name = path.split(".")
    for head in heads:
        part = part[head]
    part[name] = value
    return changed


def _time_to_target(client: TestClient, case: dict[str, Any]) -> float | None:
    body = {**case, "target_temperature": EXAMPLE["target"]["temperature"], "output_units": "SI"}
    response = client.post(SIMULATION, json=body)
    assert response.status_code == 200, response.text
    target = response.json()["summary"]["target_time"]
    return None if target is None else float(target["value"])


@pytest.mark.parametrize(
    ("find", "unit"),
    [("pump.nominal_speed", "m3/h"), ("condenser.refrigeration_capacity", "kW")],
)
def test_sizing_answer_fed_back_meets_target_and_95_percent_does_not(
    client: TestClient, find: str, unit: str
) -> None:
    response = client.post(PATH, json={**EXAMPLE, "find": find})
    assert response.status_code == 200, response.text
    answer = response.json()
    solution = answer["solution"]
    assert solution["unit"] == unit
    met = _time_to_target(client, _with(EXAMPLE["case"], find, solution))
    assert met is not None and met <= TARGET_SECONDS
    short = {"value": 0.95 * solution["value"], "unit": unit}
    missed = _time_to_target(client, _with(EXAMPLE["case"], find, short))
    assert missed is None or missed > TARGET_SECONDS
    assert answer["tolerance"]["reached"] <= answer["tolerance"]["requested"] == 1e-3
    assert answer["direction"] == "smallest"
    assert answer["simulation"]["summary"]["target_time"]["value"] <= TARGET_SECONDS
    assert answer["margin"]["factor"] == 0.9 and answer["margin"]["meets_target"] is False
    assert len(answer["design_curve"]) >= 10
    assert answer["simulations"] <= 15


def test_sizing_record_and_si_unit(client: TestClient) -> None:
    body = _with(EXAMPLE, "case.pump.nominal_speed", 0.5)  # type: ignore[arg-type]
    answer = client.post(PATH, json=body).json()
    assert answer["solution"]["unit"] == "m3/s"
    stored = client.get(f"/v1/calculations/{answer['meta']['calculation_id']}")
    assert stored.status_code == 200 and stored.json()["kind"] == "sizing.vacuum_chamber"


def test_sizing_speed_scale_is_dimensionless(client: TestClient) -> None:
    answer = client.post(PATH, json={**EXAMPLE, "find": "pump.speed_scale"}).json()
    assert answer["solution"]["unit"] == "1"
    assert 0.5 < answer["solution"]["value"] < 2.0


def test_sizing_bracket_in_its_own_unit(client: TestClient) -> None:
    body = {
        **EXAMPLE,
        "find": "condenser.refrigeration_capacity",
        "bracket": {"lower": "20 kW", "upper": "200 kW"},
        "relative_tolerance": 0.01,
    }
    answer = client.post(PATH, json=body).json()
    assert [item["value"] for item in answer["bracket"]] == pytest.approx([20.0, 200.0])
    assert answer["tolerance"]["reached"] <= 0.01


def test_sizing_schedule_target(client: TestClient) -> None:
    case = {
        **EXAMPLE["case"],
        "target_temperature": "25 degC",
        "schedule": [{"time": "3 min", "temperature": "60 degC"}],
    }
    answer = client.post(
        PATH, json={"case": case, "find": "pump.nominal_speed", "target": "schedule"}
    )
    assert answer.status_code == 200, answer.text
    assert answer.json()["simulation"]["summary"]["schedule_met"] is True


@pytest.mark.parametrize(
    ("accept", "media"), [("image/svg+xml", "image/svg+xml"), ("image/png", "image/png")]
)
def test_sizing_design_curve_plot(client: TestClient, accept: str, media: str) -> None:
    body = {**EXAMPLE, "relative_tolerance": 0.02}
    response = client.post(PATH, json=body, headers={"Accept": accept})
    assert response.status_code == 200
    assert response.headers["content-type"].startswith(media)
    assert response.headers["X-Calculation-ID"]
    assert len(response.content) > 1000


def test_sizing_no_solution_names_the_limit(client: TestClient) -> None:
    body = _with(EXAMPLE, "case.pump.ultimate_pressure", "40 mbar")  # type: ignore[arg-type]
    body["case"]["chamber"]["leak_rate"] = 0.0
    del body["case"]["condenser"]
    response = client.post(PATH, json=body)
    assert response.status_code == 422
    problem = response.json()
    assert problem["errors"][0]["field"] == "find"
    assert "ultimate pressure" in problem["detail"]


@pytest.mark.parametrize(
    ("change", "field"),
    [
        ({"find": "product.water_fraction"}, "find"),
        ({"find": "pump.colour"}, "find"),
        ({"target": {"temperature": "99 degC", "time": "5 min"}}, "target.temperature"),
        ({"target": {"temperature": "25 degC", "time": "-5 min"}}, "target.time"),
        ({"target": {"temperature": "25 kg", "time": "5 min"}}, "target.temperature"),
        ({"bracket": {"lower": "2 m3/s", "upper": "1 m3/s"}}, "bracket.upper"),
        ({"bracket": {"lower": "1 kW", "upper": "2 kW"}}, "bracket.lower"),
        ({"target": "schedule"}, "target"),
    ],
)
def test_sizing_bad_input(client: TestClient, change: dict[str, Any], field: str) -> None:
    response = client.post(PATH, json={**EXAMPLE, **change})
    assert response.status_code == 422, response.text
    assert response.json()["errors"][0]["field"] == field


def test_sizing_case_errors_name_the_case_path(client: TestClient) -> None:
    body = _with(EXAMPLE, "case.chamber.free_volume", "-1 m3")  # type: ignore[arg-type]
    response = client.post(PATH, json=body)
    assert response.status_code == 422
    assert response.json()["errors"][0]["field"] == "case.chamber.free_volume"


def test_sizing_tolerance_out_of_range_is_refused(client: TestClient) -> None:
    response = client.post(PATH, json={**EXAMPLE, "relative_tolerance": 0.5})
    assert response.status_code == 422
