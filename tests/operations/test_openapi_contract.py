"""The OpenAPI document's own facts and the answer ids (OpenAPI 3.1.0: Sec. 4.8.1 info,
4.8.5 servers, 4.8.22 tags, 4.8.10 security requirement; RFC 9562 for the uuid format).

Only stored answers carry a calculation id, which must lead to the record; every answer
carries its request id, the one in the X-Request-ID header.
"""

from __future__ import annotations

from pathlib import Path
from typing import Any

from fastapi.testclient import TestClient
from operations_support import KEY, running_client

from service.api.app import create_app
from service.api.http.contract import TAGS


def _operations(spec: dict[str, Any]) -> list[tuple[str, str, dict[str, Any]]]:
    return [
        (path, method, operation)
        for path, methods in spec["paths"].items()
        for method, operation in methods.items()
        if isinstance(operation, dict) and "responses" in operation
    ]


def test_servers_contact_license_and_every_used_tag_declared() -> None:
    spec = create_app().openapi()
    assert spec["servers"] == [{"url": "/", "description": spec["servers"][0]["description"]}]
    assert spec["info"]["contact"]["name"] and spec["info"]["license"]["name"]
    declared = {tag["name"]: tag["description"] for tag in spec["tags"]}
    assert all(declared.values())
    used = {tag for _, _, operation in _operations(spec) for tag in operation.get("tags", [])}
    assert used == set(declared) == {name for name, _ in TAGS}


def test_with_keys_on_open_routes_say_so_and_v1_routes_need_the_bearer(tmp_path: Path) -> None:
    with running_client(tmp_path, api_keys=[KEY]) as client:
        spec = client.get("/openapi.json").json()
    for path, method, operation in _operations(spec):
        if path.startswith("/v1"):
            assert operation["security"] == [{"apiKey": []}], path
            assert "401" in operation["responses"], (path, method)
        else:
            assert operation["security"] == [], (path, method)


def test_meta_ids_have_their_formats() -> None:
    spec = create_app().openapi()
    meta = spec["components"]["schemas"]["Meta"]["properties"]
    assert meta["calculation_id"]["format"] == "uuid"
    assert meta["time"]["format"] == "date-time"
    assert "request_id" in meta


def test_only_stored_answers_carry_a_calculation_id_and_it_leads_to_the_record(
    client: TestClient,
) -> None:
    lookup = client.get("/v1/properties/saturation", params={"temperature": 300})
    assert "calculation_id" not in lookup.json()["meta"]
    assert lookup.json()["meta"]["request_id"] == lookup.headers["x-request-id"]
    balance = client.post("/v1/balances/flash-freeze", json={"initial_temperature": 293.15})
    meta = balance.json()["meta"]
    assert meta["request_id"] == balance.headers["x-request-id"]
    stored = client.get(f"/v1/calculations/{meta['calculation_id']}")
    assert stored.status_code == 200
    assert stored.json()["result"]["meta"]["calculation_id"] == meta["calculation_id"]
