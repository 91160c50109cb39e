"""GET /v1/sources: every id an answer cites resolves there, with its full text.

The walk sends one representative request to every operation whose answer carries the
envelope (those that take `detail`): the GET lookups from the table below, the POST
routes from their openapi_examples files. What is checked is the service's own
consistency (ids cited = ids served), not a formulation; the registry's texts come from
the releases as :mod:`service.core.properties.uncertainty` states.
"""

from __future__ import annotations

from collections.abc import Iterator
from typing import Any

import pytest
from fastapi.testclient import TestClient

from service import __version__
from service.api.http.examples import default_examples_folder, load_examples
from service.core import statements

GET_REQUESTS: dict[str, list[dict[str, str]]] = {
    "get_saturation": [{"temperature": "20 degC"}, {"temperature": "640 K"}],
    "get_sublimation": [{"temperature": "-20 degC"}, {"temperature": "100 K"}],
    "get_melting": [{"pressure": "101325"}],
    "get_state": [{"temperature": "300", "pressure": "101325"}],
    "get_constants": [{}],
    "get_ice_fraction": [
        {"temperature": "-2 degC", "absolute_salinity": "35"},
        {"temperature": "-10 degC", "solute": "ethanol", "mass_fraction": "0.2"},
        {"temperature": "-5 degC", "solute": "sodium chloride", "mass_fraction": "0.035"},
        {
            "temperature": "-5 degC",
            "solute": "sodium chloride",
            "mass_fraction": "0.035",
            "model": "ideal",
        },
    ],
}
"""Representative GET requests (a state outside a statement's range among them: 640 K)."""

EXAMPLES = [
    item for item in load_examples(default_examples_folder()) if item.expected_status == 200
]


def _operations(client: TestClient) -> list[tuple[str, str, str]]:
    """(method, path, operation id) of every operation that takes `detail`."""
    schema = client.get("/openapi.json").json()
    found = []
    for path, methods in schema["paths"].items():
        for method, operation in methods.items():
            names = {item["name"] for item in operation.get("parameters", [])}
            if "detail" in names:
                found.append((method, path, operation["operationId"]))
    return found


def _cited(node: Any) -> Iterator[str]:
    """Every id an answer cites, wherever an envelope sits in it (sweeps nest answers)."""
    if isinstance(node, dict):
        if isinstance(node.get("reference_state"), str) and "meta" in node:
            yield node["reference_state"]
        for source in node.get("property_sources") or []:
            if isinstance(source, dict) and "id" in source:
                yield source["id"]
        if isinstance(node.get("statement_id"), str):
            yield node["statement_id"]
        for child in node.values():
            yield from _cited(child)
    elif isinstance(node, list):
        for child in node:
            yield from _cited(child)


def _answers(client: TestClient, detail: str) -> Iterator[tuple[str, dict[str, Any]]]:
    for method, path, operation_id in _operations(client):
        if method == "get":
            requests = GET_REQUESTS.get(operation_id)
            assert requests, f"no representative GET request for {operation_id}: add one"
            for params in requests:
                response = client.get(path, params={**params, "detail": detail})
                assert response.status_code == 200, (operation_id, response.text)
                yield operation_id, response.json()
        else:
            examples = [item for item in EXAMPLES if item.operation_id == operation_id]
            assert examples, f"no 200 example in openapi_examples/ for {operation_id}"
            response = client.post(f"{path}?detail={detail}", json=examples[0].request)
            assert response.status_code == 200, (operation_id, response.text)
            yield operation_id, response.json()


def test_every_cited_id_resolves_in_the_sources_document(client: TestClient) -> None:
    document = client.get("/v1/sources").json()
    served = {entry["id"]: entry for entry in document["statements"]}
    walked = set()
    cited_anywhere: set[str] = set()
    for operation_id, answer in _answers(client, "compact"):
        walked.add(operation_id)
        cited = set(_cited(answer))
        assert cited, f"{operation_id} cites nothing"
        assert "iapws-triple-point-liquid" in cited, operation_id
        unresolved = cited - served.keys()
        assert not unresolved, f"{operation_id} cites ids /v1/sources lacks: {unresolved}"
        assert answer["meta"]["detail"] == "compact"
        assert answer["meta"]["statements"] == f"/v1/sources?version={__version__}"
        cited_anywhere |= cited
    assert len(walked) == len(_operations(client)) >= 18, "every answering operation walked"
    for statement_id in sorted(cited_anywhere):
        one = client.get(f"/v1/sources/{statement_id}")
        assert one.status_code == 200, statement_id
        assert one.json() == served[statement_id]


def test_every_ice_fraction_example_cites_resolvable_ids(client: TestClient) -> None:
    # The solution models cite statements of their own (foods with an estimated onset,
    # seawater, sugars): every such example's ids resolve, not only the first example's.
    served = {entry["id"] for entry in client.get("/v1/sources").json()["statements"]}
    examples = [item for item in EXAMPLES if item.operation_id == "post_ice_fraction"]
    assert len(examples) >= 3
    for example in examples:
        response = client.post("/v1/properties/ice-fraction", json=example.request)
        assert response.status_code == 200, (example.name, response.text)
        cited = set(_cited(response.json()))
        assert cited and not cited - served, (example.name, cited - served)


def test_full_detail_cites_the_same_ids_with_the_registry_texts(client: TestClient) -> None:
    for operation_id, params_list in GET_REQUESTS.items():
        path = {
            "get_saturation": "/v1/properties/saturation",
            "get_sublimation": "/v1/properties/sublimation",
            "get_melting": "/v1/properties/melting",
            "get_state": "/v1/properties/state",
            "get_constants": "/v1/properties/constants",
            "get_ice_fraction": "/v1/properties/ice-fraction",
        }[operation_id]
        for params in params_list:
            compact = client.get(path, params=params).json()
            full = client.get(path, params={**params, "detail": "full"}).json()
            # Full detail states the reference state itself, its other entries by id too.
            reference = statements.statement_by_id(compact["reference_state"])
            assert reference is not None and full["reference_state"] == reference.text
            assert set(_cited(compact)) - {reference.statement_id} == set(_cited(full)) - {
                full["reference_state"]
            }, operation_id
            assert full["meta"]["detail"] == "full"
            for source in full["property_sources"]:
                entry = statements.statement_by_id(source["id"])
                assert entry is not None and entry.release == source["release"]
                assert entry.text.startswith(source["title"])
            for item in full["uncertainty"]:
                entry = statements.statement_by_id(item["statement_id"])
                assert entry is not None
                assert item["coverage_factor"] == entry.coverage_factor
                if entry.kind == "uncertainty" and entry.relative is not None:
                    assert item["statement"] == entry.text
                    assert item["relative"] == entry.relative


def test_the_document_is_versioned_and_validated(client: TestClient) -> None:
    response = client.get("/v1/sources")
    assert response.status_code == 200
    body = response.json()
    assert body["service_version"] == __version__
    assert body["content_hash"] == statements.content_hash()
    assert len(body["content_hash"]) == 64
    tag = response.headers["etag"]
    assert tag == f'W/"{body["content_hash"][:32]}"'
    assert "max-age" in response.headers["cache-control"]
    again = client.get("/v1/sources", headers={"If-None-Match": tag})
    assert again.status_code == 304
    assert again.content == b""
    assert client.get(f"/v1/sources?version={__version__}").status_code == 200
    other = client.get("/v1/sources", params={"version": "0.0.0-other"})
    assert other.status_code == 404
    assert other.json()["errors"][0]["field"] == "version"
    unknown = client.get("/v1/sources/no-such-statement")
    assert unknown.status_code == 404
    assert unknown.headers["content-type"].startswith("application/problem+json")
    assert client.get("/v1/sources", params={"kind": "x"}).status_code == 422


def test_from_memory_statements_name_their_missing_document(client: TestClient) -> None:
    body = client.get("/v1/sources").json()
    from_memory = [entry for entry in body["statements"] if entry["basis"] == "from memory"]
    for entry in from_memory:
        assert entry["missing_document"], entry["id"]
        assert entry["missing_document"] in body["missing_documents"]
    # Every property source of an answer and every uncertainty statement is in the list.
    kinds = {entry["kind"] for entry in body["statements"]}
    assert kinds == {"reference-state", "property-source", "uncertainty"}
    ids = [entry["id"] for entry in body["statements"]]
    assert len(ids) == len(set(ids))


@pytest.mark.parametrize("statement_id", ["iapws-95", "iapws-95.saturation-pressure"])
def test_one_entry_has_its_full_text(client: TestClient, statement_id: str) -> None:
    entry = client.get(f"/v1/sources/{statement_id}").json()
    assert entry["id"] == statement_id
    assert entry["release"] == "IAPWS R6-95(2018)"
    assert entry["text"]
