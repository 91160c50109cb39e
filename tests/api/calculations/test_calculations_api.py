"""Calculation records over HTTP: stored with each answer, fetched, listed, paged; a
failed write is never silent."""

from __future__ import annotations

from pathlib import Path
from typing import Any

import pytest
from fastapi.testclient import TestClient
from operations_support import KEY, POSTGRES_URL, postgres_schema, running_client

from service.api.http.security import key_id
from service.records import SCHEMA_VERSION, RecordStore

AUTH = {"Authorization": f"Bearer {KEY}"}


def _recorded(
    client: TestClient, body: dict[str, Any], headers: dict[str, str] | None = None
) -> dict[str, Any]:
    response = client.post("/v1/testing/recorded", json=body, headers=headers or {})
    assert response.status_code == 200, response.text
    answer: dict[str, Any] = response.json()
    return answer


def test_answer_is_stored_with_inputs_as_sent(tmp_path: Path) -> None:
    body = {"temperature": "95 degC", "note": "batch 7", "output_units": "engineering"}
    with running_client(tmp_path) as client:
        answer = _recorded(client, body)
        calculation_id = answer["meta"]["calculation_id"]
        response = client.get(f"/v1/calculations/{calculation_id}")
    assert response.status_code == 200, response.text
    record = response.json()
    assert record["calculation_id"] == calculation_id
    assert record["kind"] == "testing.recorded"
    assert record["inputs"] == body
    assert record["result"] == answer
    assert record["service_version"] == answer["meta"]["service_version"]
    assert record["formulations"] == [{"formulation": "IAPWS-95", "release": "IAPWS R6-95(2018)"}]
    assert record["key_id"] is None
    assert record["created_at"].startswith(answer["meta"]["time"][:19])
    assert not [w for w in answer["warnings"] if w["code"] == "record-not-stored"]


def test_record_carries_the_key_id_never_the_key(tmp_path: Path) -> None:
    with running_client(tmp_path, api_keys=KEY) as client:
        answer = _recorded(client, {"temperature": 300.0}, AUTH)
        record = client.get(
            f"/v1/calculations/{answer['meta']['calculation_id']}", headers=AUTH
        ).json()
        database = (tmp_path / "records.sqlite3").read_bytes()
    assert record["key_id"] == key_id(KEY)
    assert len(record["key_id"]) == 12
    assert KEY.encode() not in database


def test_record_of_a_kind_this_version_does_not_type_is_json_only(tmp_path: Path) -> None:
    with running_client(tmp_path) as client:
        answer = _recorded(client, {"temperature": 300.0})
        address = f"/v1/calculations/{answer['meta']['calculation_id']}"
        as_json = client.get(address)
        as_csv = client.get(address, headers={"Accept": "text/csv"})
    assert as_json.status_code == 200
    assert as_json.json()["kind"] == "testing.recorded"
    assert as_csv.status_code == 406
    assert "testing.recorded" in as_csv.json()["detail"]


def test_unknown_calculation_is_404(tmp_path: Path) -> None:
    with running_client(tmp_path) as client:
        response = client.get("/v1/calculations/00000000-0000-0000-0000-000000000000")
    assert response.status_code == 404
    assert response.headers["content-type"] == "application/problem+json"
    assert response.json()["errors"][0]["field"] == "calculation_id"


def test_listing_filters_and_pages(tmp_path: Path) -> None:
    with running_client(tmp_path) as client:
        ids = [
            _recorded(client, {"temperature": 280.0 + step})["meta"]["calculation_id"]
            for step in range(5)
        ]
        first = client.get("/v1/calculations", params={"limit": 2}).json()
        second = client.get(
            "/v1/calculations", params={"limit": 2, "cursor": first["next_cursor"]}
        ).json()
        third = client.get(
            "/v1/calculations", params={"limit": 2, "cursor": second["next_cursor"]}
        ).json()
        none_of_kind = client.get(
            "/v1/calculations", params={"kind": "balances.flash_freeze"}
        ).json()
        future = client.get("/v1/calculations", params={"since": "2999-01-01T00:00:00"}).json()
        past = client.get("/v1/calculations", params={"until": "2000-01-01T00:00:00Z"}).json()
    listed = [item["calculation_id"] for page in (first, second, third) for item in page["items"]]
    assert sorted(listed) == sorted(ids)
    assert third["next_cursor"] is None
    assert set(first["items"][0]) == {
        "calculation_id",
        "kind",
        "created_at",
        "service_version",
        "key_id",
        "label",
        "tags",
        "headline",
    }
    # The stand-in route gives no headline, and its body model no label or tags.
    assert first["items"][0]["label"] is None
    assert first["items"][0]["tags"] == []
    assert first["items"][0]["headline"] == {}
    assert none_of_kind["items"] == []
    assert future["items"] == []
    assert past["items"] == []


@pytest.mark.parametrize(
    ("params", "field"),
    [
        pytest.param({"cursor": "garbage"}, "cursor", id="cursor"),
        pytest.param({"limit": 0}, "limit", id="limit-zero"),
        pytest.param({"limit": 5000}, "limit", id="limit-too-big"),
        pytest.param({"since": "yesterday"}, "since", id="since-not-a-time"),
        pytest.param({"kind": "balances.other"}, "kind", id="kind-unknown"),
        pytest.param({"label": ""}, "label", id="label-empty"),
        pytest.param({"tag": "not a tag"}, "tag", id="tag-with-space"),
        pytest.param({"tag": [f"t{n}" for n in range(11)]}, "tag", id="too-many-tags"),
    ],
)
def test_bad_listing_parameters_are_422(tmp_path: Path, params: dict[str, Any], field: str) -> None:
    with running_client(tmp_path) as client:
        response = client.get("/v1/calculations", params=params)
    assert response.status_code == 422
    assert response.json()["errors"][0]["field"].split(".")[0] == field  # tag.0: the first


class _BrokenStore(RecordStore):
    """Reads work; every write fails, as on a full disk."""

    def add(self, record: Any) -> None:
        from service.records import StoreUnavailableError

        raise StoreUnavailableError("disk I/O error")


def test_failed_write_warns_under_policy_warn(tmp_path: Path) -> None:
    store = _BrokenStore(f"sqlite:///{tmp_path / 'broken.sqlite3'}")
    with running_client(tmp_path, store=store, store_failure_policy="warn") as client:
        answer = _recorded(client, {"temperature": 300.0})
        fetched = client.get(f"/v1/calculations/{answer['meta']['calculation_id']}")
        metrics = client.get("/metrics").text
    codes = [warning["code"] for warning in answer["warnings"]]
    assert codes == ["record-not-stored"]
    assert "NOT stored" in answer["warnings"][0]["message"]
    assert fetched.status_code == 404
    counted = 'tripoint_calculations_total{kind="testing.recorded",outcome="not_stored"} 1.0'
    assert counted in metrics


def test_failed_write_is_503_under_policy_fail(tmp_path: Path) -> None:
    store = _BrokenStore(f"sqlite:///{tmp_path / 'broken.sqlite3'}")
    with running_client(tmp_path, store=store, store_failure_policy="fail") as client:
        response = client.post("/v1/testing/recorded", json={"temperature": 300.0})
    assert response.status_code == 503
    assert response.headers["content-type"] == "application/problem+json"
    problem = response.json()
    assert problem["type"].endswith("record-not-stored")
    assert "temperature" not in problem


def test_unreachable_store_answers_with_warning_and_not_ready(tmp_path: Path) -> None:
    down = RecordStore("postgresql://postgres@127.0.0.1:1/none")
    with running_client(tmp_path, store=down) as client:
        answer = _recorded(client, {"temperature": 300.0})
        ready = client.get("/ready")
        listing = client.get("/v1/calculations")
        health = client.get("/health")
    assert [w["code"] for w in answer["warnings"]] == ["record-not-stored"]
    assert ready.status_code == 503
    assert ready.json()["type"].endswith("not-ready")
    assert "127.0.0.1:1" not in ready.text
    assert listing.status_code == 503
    assert health.status_code == 200


def test_ready_when_store_answers(tmp_path: Path) -> None:
    with running_client(tmp_path) as client:
        response = client.get("/ready")
    assert response.status_code == 200
    assert response.json()["status"] == "ready"
    assert response.json()["records_schema_version"] == SCHEMA_VERSION == 2


def test_records_on_postgresql_through_the_api(tmp_path: Path) -> None:
    with postgres_schema() as schema:
        store = RecordStore(POSTGRES_URL, schema=schema)
        with running_client(tmp_path, store=store) as client:
            answer = _recorded(client, {"temperature": {"values": [280.0, 290.0], "unit": "K"}})
            record = client.get(f"/v1/calculations/{answer['meta']['calculation_id']}").json()
            ready = client.get("/ready")
        store.drop_tables()
    assert ready.status_code == 200
    assert record["inputs"] == {"temperature": {"values": [280.0, 290.0], "unit": "K"}}
    assert record["result"]["temperature"]["values"] == [280.0, 290.0]


def test_retention_prunes_old_records_at_startup(tmp_path: Path) -> None:
    from datetime import UTC, datetime, timedelta

    from service.records import CalculationRecord

    seed = RecordStore(f"sqlite:///{tmp_path / 'records.sqlite3'}")
    old = CalculationRecord(
        "old-record",
        "testing.recorded",
        datetime.now(UTC) - timedelta(days=40),
        {},
        {},
        "0.0.1",
        [],
        None,
    )
    seed.add(old)
    seed.close()
    with running_client(tmp_path, retention_days=30) as client:
        gone = client.get("/v1/calculations/old-record")
    assert gone.status_code == 404
