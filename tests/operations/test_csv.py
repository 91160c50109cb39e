"""CSV for LIMS: CSV bodies in, CSV answers out, round trips against the JSON answers.

The numbers are compared with the service's own JSON answer to the same question, not
with a published table: what is tested is the CSV wiring, not the formulation.
"""

from __future__ import annotations

from collections.abc import Iterator
from pathlib import Path
from typing import Any

import pytest
from csv_support import read_csv_answer
from fastapi.testclient import TestClient
from operations_support import running_client

from service.api.http.csv_io import (
    CsvError,
    flatten_answers,
    parse_csv,
    prefers_csv,
    render_csv,
    split_statements,
)

CSV_IN = {"content-type": "text/csv"}
CSV_OUT = {"accept": "text/csv"}


@pytest.fixture
def client(tmp_path: Path) -> Iterator[TestClient]:
    with running_client(tmp_path) as started:
        yield started


def _table(text: str) -> list[dict[str, str]]:
    return read_csv_answer(text).rows


def test_csv_batch_in_csv_out_matches_json(client: TestClient) -> None:
    body = (
        "temperature[degC],output_units\r\n20,engineering\r\n60.5,engineering\r\n95,engineering\r\n"
    )
    response = client.post("/v1/properties/saturation", content=body, headers={**CSV_IN, **CSV_OUT})
    assert response.status_code == 200, response.text
    assert response.headers["content-type"].startswith("text/csv")
    answer = read_csv_answer(response.text)
    rows = answer.rows
    as_json = client.post(
        "/v1/properties/saturation",
        json={
            "temperature": {"values": [20, 60.5, 95], "unit": "degC"},
            "output_units": "engineering",
        },
    ).json()
    assert len(rows) == 3
    # The statements every row shares are stated once, above the header, as JSON.
    assert answer.statements["meta.output_units"] == "engineering"
    assert answer.statements["property_sources"] == as_json["property_sources"]
    assert answer.statements["uncertainty"] == as_json["uncertainty"]
    assert answer.statements["reference_state"] == as_json["reference_state"]
    assert answer.statements["assumptions"] == as_json["assumptions"]
    assert answer.statements["meta.statements"] == as_json["meta"]["statements"]
    assert not any(
        name.startswith(("property_sources", "uncertainty", "meta", "assumptions", "reference"))
        for name in answer.header
    ), "not repeated on every row"
    for index, row in enumerate(rows):
        # Exact: the CSV carries each float's shortest round-trip text.
        assert float(row["pressure[kPa]"]) == as_json["pressure"]["values"][index]
        assert float(row["liquid.density[kg/m3]"]) == as_json["liquid"]["density"]["values"][index]
        assert (
            float(row["latent_heat_of_vaporization[kJ/kg]"])
            == as_json["latent_heat_of_vaporization"]["values"][index]
        )
    assert [float(row["temperature[degC]"]) for row in rows] == pytest.approx(
        [20, 60.5, 95], abs=1e-9
    )
    assert answer.header[0] == "temperature[degC]", "results first, envelope after"


def test_csv_answer_can_be_sent_back_as_a_request(client: TestClient) -> None:
    first = client.post(
        "/v1/properties/saturation",
        content="pressure[kPa]\n2\n5\n",
        headers={**CSV_IN, **CSV_OUT},
    )
    rows = _table(first.text)
    temperatures = "temperature[K]\n" + "\n".join(row["temperature[K]"] for row in rows) + "\n"
    second = client.post(
        "/v1/properties/saturation", content=temperatures, headers={**CSV_IN, **CSV_OUT}
    )
    back = _table(second.text)
    # Saturation temperature of the saturation pressure gives the pressure back.
    assert [float(row["pressure[Pa]"]) for row in back] == pytest.approx([2000.0, 5000.0], rel=1e-9)


def test_csv_body_with_json_answer(client: TestClient) -> None:
    response = client.post(
        "/v1/properties/sublimation",
        content="\ufefftemperature[degC]\n-40\n-20\n",
        headers=CSV_IN,
    )
    assert response.status_code == 200, response.text
    body = response.json()
    assert body["temperature"]["unit"] == "K"
    assert body["temperature"]["values"] == pytest.approx([233.15, 253.15])


def test_json_body_with_csv_answer_and_get(client: TestClient) -> None:
    posted = client.post(
        "/v1/properties/state",
        json={"temperature": {"values": [280, 300], "unit": "K"}, "pressure": "1 atm"},
        headers=CSV_OUT,
    )
    fetched = client.get(
        "/v1/properties/melting", params={"temperature": "-5 degC"}, headers=CSV_OUT
    )
    rows = _table(posted.text)
    assert [row["phase"] for row in rows] == ["liquid", "liquid"]
    assert float(rows[0]["properties.density[kg/m3]"]) > 999
    single = _table(fetched.text)
    assert len(single) == 1
    assert float(single[0]["temperature[K]"]) == pytest.approx(268.15)


def test_unitless_columns_take_the_default_unit(client: TestClient) -> None:
    response = client.post(
        "/v1/properties/state",
        content="temperature,pressure,formulation\n300,101325,IAPWS-IF97\n350,101325,IAPWS-IF97\n",
        headers={**CSV_IN, **CSV_OUT},
    )
    assert response.status_code == 200, response.text
    answer = read_csv_answer(response.text)
    assert [float(row["temperature[K]"]) for row in answer.rows] == [300.0, 350.0]
    assert answer.statements["property_sources"][0]["id"] == "iapws-if97"


def test_per_row_route_called_once_per_row(client: TestClient) -> None:
    body = "temperature[degC],note\n20,first\n,second\n30,third\n"
    response = client.post("/v1/testing/recorded", content=body, headers={**CSV_IN, **CSV_OUT})
    assert response.status_code == 422, "row 2 has no temperature"
    assert "CSV row 2" in response.json()["detail"]
    assert response.json()["errors"][0]["index"] == 2  # data rows from 1, as in the detail

    body = "temperature[degC],note\n20,warn-first\n30,third\n"
    answer = client.post("/v1/testing/recorded", content=body, headers={**CSV_IN, **CSV_OUT})
    rows = _table(answer.text)
    assert [row["note"] for row in rows] == ["warn-first", "third"]
    assert [float(row["temperature[K]"]) for row in rows] == pytest.approx([293.15, 303.15])
    ids = [row["meta.calculation_id"] for row in rows]
    assert len(set(ids)) == 2, "one calculation record per row"
    assert rows[0]["warnings"].startswith("testing:")
    stored = client.get(f"/v1/calculations/{ids[1]}").json()
    assert stored["inputs"] == {"temperature": {"value": 30.0, "unit": "degC"}, "note": "third"}

    as_json = client.post("/v1/testing/recorded", content=body, headers=CSV_IN)
    assert [item["note"] for item in as_json.json()] == ["warn-first", "third"]


def test_batch_warnings_land_on_their_rows() -> None:
    answer = {
        "temperature": {"value": None, "values": [1.0, 2.0, 3.0], "unit": "K"},
        "warnings": [
            {"code": "metastable", "message": "m", "indices": [1]},
            {"code": "everywhere", "message": "e", "indices": None},
        ],
        "assumptions": ["a", "b", "c"],
    }
    header, rows = flatten_answers([answer])
    assert header == ["temperature[K]", "warnings", "assumptions"]
    assert [row[1] for row in rows] == [
        "everywhere: e",
        "metastable: m | everywhere: e",
        "everywhere: e",
    ]
    assert rows[0][2] == "a | b | c", "a list of the envelope is not spread over rows"
    assert render_csv(header, rows).startswith(b"temperature[K],warnings,assumptions\r\n1.0,")


@pytest.mark.parametrize(
    ("body", "status", "words"),
    [
        pytest.param(b"", 400, "empty", id="empty"),
        pytest.param(b"temperature[K]\n", 422, "no rows", id="header-only"),
        pytest.param(b"temperature[K],pressure\n300\n", 400, "row 1 has 1 cells", id="ragged"),
        pytest.param(b"temperature K\n300\n", 400, "header", id="bad-header"),
        pytest.param(b"temperature[K],temperature[degC]\n1,2\n", 400, "twice", id="duplicate"),
        pytest.param(b"temperature[K]\n300\nwarm\n", 422, "not a number", id="text-in-number"),
        pytest.param(b"temperature[K]\n300\n\xff\n", 400, "UTF-8", id="not-utf8"),
        pytest.param(b"temperature[K]\nnan\n", 422, "not a number", id="nan"),
        pytest.param(b"temperature[K]\n1e999\n", 422, "too large", id="overflow"),
        pytest.param(
            b"temperature[K],output_units\n300,SI\n310,US\n", 422, "one value", id="text-differs"
        ),
        pytest.param(b"temperature[K]\n300\n\n310\n\n", 200, "", id="blank-lines-skipped"),
    ],
)
def test_malformed_csv_is_a_problem_naming_the_cause(
    client: TestClient, body: bytes, status: int, words: str
) -> None:
    response = client.post("/v1/properties/saturation", content=body, headers=CSV_IN)
    assert response.status_code == status, response.text
    if status != 200:
        assert response.headers["content-type"] == "application/problem+json"
        assert words in response.json()["detail"]


def test_errors_stay_problem_json_when_csv_is_asked(client: TestClient) -> None:
    response = client.post(
        "/v1/properties/saturation",
        content="temperature[degC]\n500\n",
        headers={**CSV_IN, **CSV_OUT},
    )
    assert response.status_code == 422
    assert response.headers["content-type"] == "application/problem+json"


def test_csv_is_documented_in_openapi(client: TestClient) -> None:
    schema = client.get("/openapi.json").json()
    post = schema["paths"]["/v1/properties/saturation"]["post"]
    assert "text/csv" in post["requestBody"]["content"]
    assert "application/json" in post["requestBody"]["content"]
    assert "text/csv" in post["responses"]["200"]["content"]
    assert (
        "text/csv"
        in schema["paths"]["/v1/properties/saturation"]["get"]["responses"]["200"]["content"]
    )


@pytest.mark.parametrize(
    ("accept", "expected"),
    [
        pytest.param(None, False, id="none"),
        pytest.param("*/*", False, id="anything"),
        pytest.param("text/csv", True, id="csv"),
        pytest.param("text/csv, application/json", True, id="csv-first"),
        pytest.param("application/json, text/csv;q=0.5", False, id="json-preferred"),
        pytest.param("application/json;q=0.1, text/csv", True, id="csv-preferred"),
        pytest.param("text/csv;q=0", False, id="csv-refused"),
    ],
)
def test_accept_negotiation(accept: str | None, expected: bool) -> None:
    assert prefers_csv(accept) is expected


def test_parse_nests_dotted_names_and_builds_rows() -> None:
    table = parse_csv(b"food.water_fraction,food.mass[kg],mode\n0.8,12.5,fast\n0.7,,slow\n")
    bodies: list[dict[str, Any]] = table.row_bodies()
    assert bodies == [
        {"food": {"water_fraction": 0.8, "mass": {"value": 12.5, "unit": "kg"}}, "mode": "fast"},
        {"food": {"water_fraction": 0.7}, "mode": "slow"},
    ]
    with pytest.raises(CsvError, match="no value in row 2"):
        table.batch_body()


def test_balance_csv_one_case_per_row_matches_json(client: TestClient) -> None:
    body = (
        "initial_temperature[degC],water_mass[kg],final_ice_temperature[degC],output_units\n"
        "20,1,-10,engineering\n"
        "60,2.5,-20,engineering\n"
    )
    response = client.post("/v1/balances/flash-freeze", content=body, headers={**CSV_IN, **CSV_OUT})
    assert response.status_code == 200, response.text
    rows = _table(response.text)
    assert len(rows) == 2
    for row, (initial, mass, final) in zip(rows, [(20, 1, -10), (60, 2.5, -20)], strict=True):
        as_json = client.post(
            "/v1/balances/flash-freeze",
            json={
                "initial_temperature": {"value": initial, "unit": "degC"},
                "water_mass": {"value": mass, "unit": "kg"},
                "final_ice_temperature": {"value": final, "unit": "degC"},
                "output_units": "engineering",
            },
        ).json()
        assert float(row["evaporated_mass[kg]"]) == as_json["evaporated_mass"]["value"]
        assert float(row["ice_mass[kg]"]) == as_json["ice_mass"]["value"]
        assert float(row["final_temperature[degC]"]) == pytest.approx(final)
        stored = client.get(f"/v1/calculations/{row['meta.calculation_id']}")
        assert stored.status_code == 200
        assert stored.json()["kind"] == "balances.flash_freeze"
    assert rows[0]["stages.name"] == "cooling | freezing | ice cooling"
    assert len(rows[0]["stages.end_temperature[degC]"].split(" | ")) == 3


def test_shared_statements_are_stated_once_and_differing_ones_stay_columns() -> None:
    shared = {"id": "iapws-95", "release": "IAPWS R6-95(2018)"}
    answers: list[dict[str, Any]] = [
        {
            "mass": {"value": 1.0, "unit": "kg"},
            "property_sources": [shared],
            "warnings": [],
            "meta": {"service_version": "9", "calculation_id": "a"},
        },
        {"error": {"status": 422, "field": "mass", "detail": "bad"}},
        {
            "mass": {"value": 2.0, "unit": "kg"},
            "property_sources": [shared],
            "warnings": [{"code": "w", "message": "m", "indices": None}],
            "meta": {"service_version": "9", "calculation_id": "b"},
        },
    ]
    stated, remaining = split_statements(answers)
    assert stated == [("meta.service_version", "9"), ("property_sources", [shared])]
    header, rows = flatten_answers(remaining)
    assert "meta.calculation_id" in header, "differs per row: a column"
    assert "warnings" in header, "always a column: it names its rows"
    assert not any(name.startswith("property_sources") for name in header)
    text = render_csv(header, rows, statements=stated).decode()
    lines = text.splitlines()
    assert lines[0].startswith("# tripoint CSV answer.")
    assert lines[1] == '# meta.service_version: "9"'
    assert lines[2] == '# property_sources: [{"id":"iapws-95","release":"IAPWS R6-95(2018)"}]'
    assert lines[3].startswith("mass[kg],")
    read = read_csv_answer(text)
    assert read.statements["property_sources"] == [shared]
    assert [row["meta.calculation_id"] for row in read.rows] == ["a", "", "b"]


def test_a_csv_answer_is_a_valid_csv_body_again(client: TestClient) -> None:
    answer = client.post(
        "/v1/properties/saturation",
        content="temperature[degC]\n20\n30\n",
        headers={**CSV_IN, **CSV_OUT},
    )
    assert answer.text.startswith("#")
    table = parse_csv(answer.content)
    assert table.rows == 2
    assert table.columns[0].name == "temperature[K]"
    # No data cell holds the comment character, so comment="#" readers keep every row.
    data = [line for line in answer.text.splitlines() if not line.startswith("#")]
    assert len(data) == 3 and not any("#" in line for line in data)
