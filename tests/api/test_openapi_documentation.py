"""The OpenAPI document describes every request field, and names the unit of every quantity."""

from __future__ import annotations

from typing import Any

from fastapi.testclient import TestClient

_QUANTITY_SHAPES = {"#/components/schemas/QuantityValue", "#/components/schemas/QuantityValues"}


def _references(spec: dict[str, Any]) -> set[str]:
    found = set()
    stack: list[Any] = [spec]
    while stack:
        item = stack.pop()
        if isinstance(item, dict):
            if "$ref" in item:
                found.add(item["$ref"])
            stack.extend(item.values())
        elif isinstance(item, list):
            stack.extend(item)
    return found


def _request_fields(schema: dict[str, Any]) -> list[tuple[str, str, dict[str, Any]]]:
    """Every (model, field, spec) reachable from the JSON request bodies."""
    components = schema["components"]["schemas"]
    queue = []
    for methods in schema["paths"].values():
        for operation in methods.values():
            body = operation.get("requestBody", {}).get("content", {}).get("application/json")
            if body:
                queue += sorted(_references(body["schema"]))
    seen: set[str] = set()
    fields = []
    while queue:
        reference = queue.pop()
        if reference in seen or reference in _QUANTITY_SHAPES:
            continue
        seen.add(reference)
        name = reference.rsplit("/", 1)[-1]
        for field, spec in components[name].get("properties", {}).items():
            fields.append((name, field, spec))
            queue += sorted(_references(spec))
    return fields


def test_every_request_field_is_described(client: TestClient) -> None:
    fields = _request_fields(client.get("/openapi.json").json())
    models = {model for model, _, _ in fields}
    assert {"SaturationCreate", "FlashFreezeCreate", "VacuumChamberSimulationCreate"} <= models
    missing = [f"{model}.{field}" for model, field, spec in fields if not spec.get("description")]
    assert missing == []


def test_every_quantity_field_names_its_unit(client: TestClient) -> None:
    fields = _request_fields(client.get("/openapi.json").json())
    quantities = [(m, f, s) for m, f, s in fields if _references(s) & _QUANTITY_SHAPES]
    assert len(quantities) > 30
    silent = [
        f"{model}.{field}"
        for model, field, spec in quantities
        if "unit" not in spec.get("description", "").lower()
        and "fraction" not in spec.get("description", "").lower()
    ]
    assert silent == []


def test_every_get_query_parameter_is_documented(client: TestClient) -> None:
    # The GET lookups read their query with one model each (service.api.http.query); OpenAPI
    # must still list every parameter, described, with its schema.
    schema = client.get("/openapi.json").json()
    saturation = schema["paths"]["/v1/properties/saturation"]["get"]["parameters"]
    assert {item["name"] for item in saturation} == {
        "temperature",
        "pressure",
        "formulation",
        "output_units",
        "detail",
    }
    # `detail` is documented on every route that answers the envelope, GET and POST alike.
    posted = schema["paths"]["/v1/balances/flash-freeze"]["post"]["parameters"]
    assert [item["name"] for item in posted] == ["detail"]
    # one shared enumeration, referenced (service.api.http.shared_enums)
    assert posted[0]["schema"]["$ref"] == "#/components/schemas/Detail"
    assert schema["components"]["schemas"]["Detail"]["enum"] == ["compact", "full"]
    state = schema["paths"]["/v1/properties/state"]["get"]["parameters"]
    assert {item["name"] for item in state if item["required"]} == {"temperature", "pressure"}
    for path, methods in schema["paths"].items():
        for parameter in methods.get("get", {}).get("parameters", []):
            assert parameter["in"] in ("query", "path"), (path, parameter)
            assert parameter.get("description"), (path, parameter["name"])
            # a model's own definitions are inlined: OpenAPI has no "#/$defs/..." to point at
            assert "#/$defs/" not in str(parameter["schema"]), (path, parameter["name"])
