"""Stored records of the real routes: label and tags given with the request, the headline,
the record typed by its kind, the CSV and plots drawn again from the stored answer, the
kind filter and the next-page link.

Every successful request example in ``openapi_examples/`` is sent with a label and tags;
its record must validate against the typed record model of its kind (the route's own
request and answer models).
"""

from __future__ import annotations

import uuid
from typing import Any

import pytest
from csv_support import read_csv_answer
from fastapi.testclient import TestClient
from pydantic import TypeAdapter

from service.api.calculations.schemas import STORED_MODELS, CalculationPublic, RecordKind
from service.api.http.examples import RequestExample, default_examples_folder, load_examples

_SUCCESSES = [
    example
    for example in load_examples(default_examples_folder())
    if example.expected_status == 200
]
_PATHS = {
    "post_flash_freeze": "/v1/balances/flash-freeze",
    "post_evaporative_cooling": "/v1/balances/evaporative-cooling",
    "post_vacuum_chamber_simulation": "/v1/simulations/vacuum-chamber",
    "post_primary_drying_simulation": "/v1/simulations/primary-drying",
    "post_primary_drying_design_space": "/v1/design-spaces/primary-drying",
    "post_vacuum_chamber_calibration": "/v1/calibrations/vacuum-chamber",
    "post_vacuum_chamber_sizing": "/v1/sizing/vacuum-chamber",
}
_RECORDED = [example for example in _SUCCESSES if example.operation_id in _PATHS]


def _example(name: str) -> RequestExample:
    return next(example for example in _SUCCESSES if example.name == name)


def _post(
    client: TestClient, example: RequestExample, headers: dict[str, str] | None = None, **extra: Any
) -> Any:
    response = client.post(
        _PATHS[example.operation_id], json={**example.request, **extra}, headers=headers or {}
    )
    assert response.status_code == 200, response.text
    return response


def _id_in_csv(text: str) -> str:
    """The calculation id a CSV answer names: a ``# meta.calculation_id`` statement when
    one record answers every row, else its ``calculation_id`` / ``meta.calculation_id``
    column."""
    answer = read_csv_answer(text)
    if "meta.calculation_id" in answer.statements:
        return str(answer.statements["meta.calculation_id"])
    column = next(
        name for name in answer.header if name in ("calculation_id", "meta.calculation_id")
    )
    return answer.rows[0][column]


def _varies_on_accept(response: Any) -> bool:
    return "accept" in {part.strip().lower() for part in response.headers["vary"].split(",")}


def _record(client: TestClient, calculation_id: str) -> dict[str, Any]:
    response = client.get(f"/v1/calculations/{calculation_id}")
    assert response.status_code == 200, response.text
    assert _varies_on_accept(response)
    record: dict[str, Any] = response.json()
    return record


def test_every_route_that_stores_a_record_has_an_example() -> None:
    assert {example.operation_id for example in _RECORDED} == set(_PATHS)


@pytest.mark.parametrize("example", _RECORDED, ids=[example.name for example in _RECORDED])
def test_record_is_labelled_tagged_and_typed_by_its_kind(
    client: TestClient, example: RequestExample
) -> None:
    tag = f"t-{uuid.uuid4().hex[:12]}"
    answer = _post(client, example, label="Trial run 7 (line B)", tags=[tag, "demo"]).json()
    record = _record(client, answer["meta"]["calculation_id"])
    assert record["label"] == "Trial run 7 (line B)"
    assert record["tags"] == [tag, "demo"]
    assert record["inputs"]["label"] == "Trial run 7 (line B)"
    assert record["result"] == answer
    # The record validates against the route's own request and answer models.
    typed = STORED_MODELS[RecordKind(record["kind"])].model_validate(record)
    assert typed.model_dump(mode="json", exclude_unset=True)["result"] == answer
    # ...and through the union of every kind, which picks the model by `kind`.
    assert type(TypeAdapter(CalculationPublic).validate_python(record)) is type(typed)
    # The listing finds it by its tag and by its label, and shows its headline.
    listed = client.get("/v1/calculations", params={"tag": [tag, "demo"]}).json()["items"]
    assert [item["calculation_id"] for item in listed] == [record["calculation_id"]]
    (item,) = listed
    assert item["headline"] == record["headline"]
    assert item["headline"], "every kind shows at least one key number"
    by_label = client.get(
        "/v1/calculations", params={"label": "Trial run 7 (line B)", "kind": record["kind"]}
    ).json()["items"]
    assert record["calculation_id"] in [entry["calculation_id"] for entry in by_label]


def _quantity(node: dict[str, Any]) -> dict[str, Any]:
    return {key: node[key] for key in ("value", "values", "unit") if key in node}


def test_flash_freeze_headline_is_the_answer_numbers(client: TestClient) -> None:
    example = _example("flash-freeze-vial-tray-pulldown")
    answer = _post(client, example).json()
    headline = _record(client, answer["meta"]["calculation_id"])["headline"]
    assert set(headline) == {"final_temperature", "ice_mass", "evaporated_mass", "final_pressure"}
    for name, shown in headline.items():
        assert shown == _quantity(answer[name])


def test_flash_freeze_sweep_headline_holds_every_case(client: TestClient) -> None:
    example = _example("flash-freeze-initial-temperature-sweep")
    answer = _post(client, example).json()
    headline = _record(client, answer["meta"]["calculation_id"])["headline"]
    assert headline["final_temperature"] == _quantity(answer["final_temperature"])
    assert len(headline["final_temperature"]["values"]) > 1


def test_simulation_headline_is_its_summary(client: TestClient) -> None:
    example = _example("chamber-bread-rack-vacuum-cooler")
    answer = _post(client, example).json()
    headline = _record(client, answer["meta"]["calculation_id"])["headline"]
    summary = answer["summary"]
    assert headline["end_reason"] == summary["end_reason"]
    assert headline["final_temperature"] == _quantity(summary["final_temperature"])
    assert headline["evaporated_mass"] == _quantity(summary["evaporated_mass"])
    if summary["target_time"] is None:
        assert headline["time_to_target"] is None
    else:
        assert headline["time_to_target"] == _quantity(summary["target_time"])


@pytest.mark.parametrize(
    ("field", "value"),
    [
        pytest.param("label", "", id="label-empty"),
        pytest.param("label", "x" * 101, id="label-too-long"),
        pytest.param("label", "two\nlines", id="label-control-character"),
        pytest.param("tags", ["has space"], id="tag-space"),
        pytest.param("tags", ["-leading"], id="tag-leading-dash"),
        pytest.param("tags", ["x" * 41], id="tag-too-long"),
        pytest.param("tags", [f"t{n}" for n in range(11)], id="too-many-tags"),
        pytest.param("tags", ["same", "same"], id="tag-repeated"),
        pytest.param("tags", "single", id="tags-not-a-list"),
    ],
)
def test_bad_label_or_tags_are_422_naming_the_field(
    client: TestClient, field: str, value: Any
) -> None:
    example = _example("flash-freeze-vial-tray-pulldown")
    response = client.post(_PATHS[example.operation_id], json={**example.request, field: value})
    assert response.status_code == 422, response.text
    assert response.headers["content-type"] == "application/problem+json"
    assert response.json()["errors"][0]["field"].startswith(field)


def test_wrong_kind_filter_is_422_naming_the_valid_kinds(client: TestClient) -> None:
    response = client.get("/v1/calculations", params={"kind": "flash-freeze"})
    assert response.status_code == 422
    error = response.json()["errors"][0]
    assert error["field"] == "kind"
    text = response.text
    for kind in RecordKind:
        assert kind.value in text


def test_kind_is_an_enum_of_the_stored_values_in_openapi(client: TestClient) -> None:
    schema = client.get("/openapi.json").json()
    parameters = schema["paths"]["/v1/calculations"]["get"]["parameters"]
    (kind,) = [parameter for parameter in parameters if parameter["name"] == "kind"]
    text = str(kind["schema"]) + str(schema["components"]["schemas"].get("RecordKind", {}))
    for value in RecordKind:
        assert value.value in text
    stored = schema["paths"]["/v1/calculations/{calculation_id}"]["get"]["responses"]["200"]
    json_schema = stored["content"]["application/json"]["schema"]
    assert json_schema["discriminator"]["propertyName"] == "kind"
    assert set(json_schema["discriminator"]["mapping"]) == {kind.value for kind in RecordKind}


def test_flash_freeze_record_answers_its_csv_again(client: TestClient) -> None:
    example = _example("flash-freeze-vial-tray-pulldown")
    original = _post(client, example, headers={"Accept": "text/csv"})
    calculation_id = _id_in_csv(original.text)
    again = client.get(f"/v1/calculations/{calculation_id}", headers={"Accept": "text/csv"})
    assert again.status_code == 200, again.text
    assert again.headers["content-type"] == original.headers["content-type"]
    assert again.headers["x-calculation-id"] == calculation_id
    assert _varies_on_accept(again)
    assert again.content == original.content
    # A balance never drew a plot: an image is a 406 naming what the record has.
    refused = client.get(f"/v1/calculations/{calculation_id}", headers={"Accept": "image/png"})
    assert refused.status_code == 406
    assert _varies_on_accept(refused)
    assert "text/csv" in refused.json()["detail"]
    assert "image/png" not in refused.json()["detail"].split("answers in")[1].split(";")[0]


_AGAIN = [
    ("chamber-bread-rack-vacuum-cooler", "image/svg+xml"),
    ("chamber-bread-rack-vacuum-cooler", "image/png"),
    ("chamber-bread-rack-vacuum-cooler", "text/csv"),
    # core and surface curves (interior model), the air-limited shading (kinetic mode)
    ("chamber-bread-loaves-core-temperature", "image/svg+xml"),
    ("chamber-lettuce-pallet-kinetic-evaporation", "image/svg+xml"),
    ("primary-drying-vial-batch-ramp", "image/svg+xml"),
    ("primary-drying-vial-batch-ramp", "image/png"),
    ("primary-drying-vial-batch-ramp", "text/csv"),
    ("primary-drying-design-space-vial-batch", "image/svg+xml"),
    ("primary-drying-design-space-vial-batch", "text/csv"),
    ("sizing-bakery-pump-for-five-minutes", "image/png"),
    ("sizing-bakery-pump-for-five-minutes", "image/svg+xml"),
]


@pytest.mark.parametrize(
    ("name", "media_type"), _AGAIN, ids=[f"{name}-{kind.split('/')[1]}" for name, kind in _AGAIN]
)
def test_record_answers_its_plot_or_csv_again(
    client: TestClient, name: str, media_type: str
) -> None:
    example = _example(name)
    original = _post(client, example, headers={"Accept": media_type})
    if media_type == "text/csv":
        calculation_id = _id_in_csv(original.text)
    else:
        calculation_id = original.headers["x-calculation-id"]
    again = client.get(f"/v1/calculations/{calculation_id}", headers={"Accept": media_type})
    assert again.status_code == 200, again.text
    assert again.headers["content-type"] == original.headers["content-type"]
    assert again.headers["x-calculation-id"] == calculation_id
    # Drawn again from the stored numbers: the very bytes the route sent.
    assert again.content == original.content


def test_sweep_record_has_csv_but_no_plot(client: TestClient) -> None:
    example = _example("sweep-vial-tray-pump-speeds")
    answer = _post(client, example).json()
    calculation_id = answer["meta"]["calculation_id"]
    csv = client.get(f"/v1/calculations/{calculation_id}", headers={"Accept": "text/csv"})
    assert csv.status_code == 200
    assert len(read_csv_answer(csv.text).rows) == answer["cases"]
    svg = client.get(f"/v1/calculations/{calculation_id}", headers={"Accept": "image/svg+xml"})
    assert svg.status_code == 406


def test_json_stays_the_default_and_unknown_ids_are_404_with_vary(client: TestClient) -> None:
    response = client.get(
        "/v1/calculations/00000000-0000-0000-0000-000000000000", headers={"Accept": "text/csv"}
    )
    assert response.status_code == 404
    assert _varies_on_accept(response)


def test_list_pages_carry_a_next_link(client: TestClient) -> None:
    tag = f"p-{uuid.uuid4().hex[:12]}"
    example = _example("flash-freeze-vial-tray-pulldown")
    ids = [_post(client, example, tags=[tag]).json()["meta"]["calculation_id"] for _ in range(3)]
    seen: list[str] = []
    address: str | None = f"/v1/calculations?tag={tag}&limit=2"
    pages = 0
    while address is not None:
        response = client.get(address)
        assert response.status_code == 200, response.text
        seen += [item["calculation_id"] for item in response.json()["items"]]
        pages += 1
        link = response.headers.get("link")
        if response.json()["next_cursor"] is None:
            assert link is None
            address = None
        else:
            assert link is not None and link.endswith('>; rel="next"')
            address = link[1 : link.index(">")]
            assert address.startswith("/v1/calculations?")
            assert f"tag={tag}" in address and "limit=2" in address
    assert pages == 2
    assert seen == ids[::-1]


def test_calibration_record_is_json_only(client: TestClient) -> None:
    # Its plot draws the fitted model's whole run, which the answer does not hold.
    example = _example("calibration-produce-cooler-logger")
    answer = _post(client, example).json()
    address = f"/v1/calculations/{answer['meta']['calculation_id']}"
    for media_type in ("image/svg+xml", "image/png", "text/csv"):
        refused = client.get(address, headers={"Accept": media_type})
        assert refused.status_code == 406, media_type
        assert refused.json()["errors"][0]["field"] == "Accept"
    chosen = client.get(address, headers={"Accept": "text/csv;q=0.5, application/json;q=0.1"})
    assert chosen.status_code == 200
    assert chosen.headers["content-type"].startswith("application/json")
