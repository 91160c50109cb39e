"""The OpenAPI document as client generators read it (OpenAPI 3.1.0, Sec. 4.8.24 Schema
Object and 4.8.23 Reference Object; JSON Schema 2020-12 for ``enum``, ``$ref``, ``oneOf``).

Each enumeration is defined once in ``components.schemas`` and referenced wherever it is
used, so a generated client has one enum type per concept; every property of every schema
and every parameter carries a description.
"""

from __future__ import annotations

from collections import Counter
from collections.abc import Iterator
from typing import Any

import pytest
from fastapi.testclient import TestClient


def _walk(node: Any, path: str = "") -> Iterator[tuple[str, dict[str, Any]]]:
    if isinstance(node, dict):
        yield path, node
        for key, value in node.items():
            yield from _walk(value, f"{path}/{key}")
    elif isinstance(node, list):
        for index, value in enumerate(node):
            yield from _walk(value, f"{path}/{index}")


def _parameters(spec: dict[str, Any]) -> Iterator[tuple[str, dict[str, Any]]]:
    for path, methods in spec["paths"].items():
        for method, operation in methods.items():
            if isinstance(operation, dict):
                for parameter in operation.get("parameters", []):
                    yield f"{method.upper()} {path} {parameter['name']}", parameter


def test_each_enumeration_is_defined_once_in_components(client: TestClient) -> None:
    spec = client.get("/openapi.json").json()
    components = spec["components"]["schemas"]
    definitions = [(where, node) for where, node in _walk(spec) if "enum" in node]
    places = {where for where, _ in definitions}
    assert places == {
        f"/components/schemas/{name}" for name in components if "enum" in components[name]
    }
    choices = Counter(tuple(node["enum"]) for _, node in definitions)
    assert [values for values, count in choices.items() if count > 1] == []
    # the concepts the lookups, balances and solutions share, one definition each
    assert components["UnitSet"]["enum"] == ["SI", "engineering", "US"]
    assert components["Formulation"]["enum"] == ["IAPWS-95", "IAPWS-IF97"]
    assert components["SolutionModel"]["enum"] == ["non-ideal", "ideal"]
    assert len(definitions) == len(choices) >= 10


def test_every_enum_valued_parameter_and_field_refers_to_the_definition(
    client: TestClient,
) -> None:
    spec = client.get("/openapi.json").json()
    components = spec["components"]["schemas"]
    enum_references = {
        f"#/components/schemas/{name}" for name, d in components.items() if "enum" in d
    }
    unit_set_parameters = []
    for where, parameter in _parameters(spec):
        schema = parameter["schema"]
        inner = [node for _, node in _walk(schema)]
        assert not any("enum" in node for node in inner), where
        if parameter["name"] == "output_units":
            unit_set_parameters.append(where)
            assert schema["$ref"] == "#/components/schemas/UnitSet", where
    assert len(unit_set_parameters) >= 6
    used = {node["$ref"] for _, node in _walk(spec) if "$ref" in node}
    assert enum_references <= used  # no orphan definitions


def test_every_schema_property_and_parameter_is_described(client: TestClient) -> None:
    spec = client.get("/openapi.json").json()
    missing = []
    for model, schema in spec["components"]["schemas"].items():
        for where, node in _walk(schema, model):
            if where.endswith("/properties") or "/not" in where:
                continue  # a map of fields (one may be called "properties"), or the refused
                # shapes of http.alternatives (constraints on fields defined beside them)
            for field, field_schema in node.get("properties", {}).items():
                if field_schema.get("description"):
                    continue
                missing.append(f"{where}.{field}")
    for where, parameter in _parameters(spec):
        if not parameter.get("description"):
            missing.append(where)
    assert missing == []


_TEXT_MEDIA = {"application/json", "text/csv", "image/svg+xml"}


def test_every_negotiated_answer_lists_its_media_types_and_how_to_choose(
    client: TestClient,
) -> None:
    spec = client.get("/openapi.json").json()
    negotiated = 0
    for path, methods in spec["paths"].items():
        for method, operation in methods.items():
            answer = operation["responses"].get("200", {})
            content = answer.get("content", {})
            if len(content) < 2:
                continue
            negotiated += 1
            where = f"{method.upper()} {path}"
            assert "`Accept`" in answer["description"], where
            assert "406" in operation["responses"], where
            assert set(content) <= _TEXT_MEDIA | {"image/png"}, where
            if "image/png" in content:
                assert content["image/png"]["schema"] == {"type": "string", "format": "binary"}
            for media in ("text/csv", "image/svg+xml"):
                if media in content:
                    assert content[media]["schema"]["type"] == "string", (where, media)
    assert negotiated >= 15


@pytest.mark.parametrize(
    ("path", "media"),
    [
        ("/v1/properties/saturation?temperature=300", "text/csv"),
        ("/v1/properties/constants", "text/csv"),
        ("/v1/properties/state?temperature=300&pressure=101325", "application/json"),
    ],
)
def test_a_listed_media_type_is_served_for_its_accept(
    client: TestClient, path: str, media: str
) -> None:
    documented = client.get("/openapi.json").json()["paths"][path.split("?")[0]]["get"]
    assert media in documented["responses"]["200"]["content"]
    response = client.get(path, headers={"Accept": media})
    assert response.status_code == 200
    assert response.headers["content-type"].startswith(media)
    assert client.get(path, headers={"Accept": "text/html"}).status_code == 406
