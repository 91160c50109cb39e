"""Request ids, JSON log lines and Prometheus metrics."""

from __future__ import annotations

import json
import logging
from collections.abc import Iterator
from pathlib import Path

import pytest
from fastapi.testclient import TestClient
from operations_support import KEY, running_client

from service.api.http.observability import JsonFormatter, logging_config
from service.api.http.security import key_id


@pytest.fixture
def client(tmp_path: Path) -> Iterator[TestClient]:
    with running_client(tmp_path, api_keys=KEY) as started:
        yield started


def test_request_id_is_honoured_and_echoed(client: TestClient) -> None:
    response = client.get("/health", headers={"X-Request-ID": "lims-batch-42.7"})
    assert response.headers["x-request-id"] == "lims-batch-42.7"


@pytest.mark.parametrize("sent", [None, "", "has spaces", "x" * 200, "semi;colon"], ids=str)
def test_missing_or_odd_request_id_is_replaced(client: TestClient, sent: str | None) -> None:
    headers = {} if sent is None else {"X-Request-ID": sent}
    response = client.get("/health", headers=headers)
    made = response.headers["x-request-id"]
    assert made != sent
    assert len(made) == 32
    int(made, 16)


def test_problem_answers_carry_the_request_id(client: TestClient) -> None:
    refused = client.get("/v1/calculations", headers={"X-Request-ID": "abc-1"})
    assert refused.status_code == 401
    assert refused.headers["x-request-id"] == "abc-1"


def test_one_json_access_line_per_request_without_keys_or_bodies(
    client: TestClient, caplog: pytest.LogCaptureFixture
) -> None:
    formatter = JsonFormatter()
    with caplog.at_level(logging.INFO, logger="tripoint.access"):
        client.post(
            "/v1/properties/saturation",
            json={"temperature": 301.234567},
            headers={"Authorization": f"Bearer {KEY}", "X-Request-ID": "req-7"},
        )
    lines = [
        json.loads(formatter.format(record))
        for record in caplog.records
        if record.name == "tripoint.access"
    ]
    assert len(lines) == 1
    line = lines[0]
    assert line["request_id"] == "req-7"
    assert line["route"] == "/v1/properties/saturation"
    assert line["method"] == "POST"
    assert line["status"] == 200
    assert line["duration_ms"] > 0
    assert line["key_id"] == key_id(KEY)
    assert line["level"] == "info"
    text = json.dumps(line)
    assert KEY not in text
    assert "301.234567" not in text


def test_logging_config_is_valid_and_json() -> None:
    config = logging_config("info")
    assert config["formatters"]["json"]["()"].endswith("JsonFormatter")
    assert config["loggers"]["uvicorn.access"]["handlers"] == []
    record = logging.LogRecord("tripoint.x", logging.ERROR, __file__, 1, "boom %s", ("now",), None)
    try:
        raise ValueError("inner")
    except ValueError:
        import sys

        record.exc_info = sys.exc_info()
    entry = json.loads(JsonFormatter().format(record))
    assert entry["message"] == "boom now"
    assert "ValueError: inner" in entry["exception"]


def test_metrics_count_requests_errors_latency_and_calculations(client: TestClient) -> None:
    auth = {"Authorization": f"Bearer {KEY}"}
    client.get("/v1/properties/saturation", params={"temperature": 300}, headers=auth)
    client.get("/v1/properties/saturation", params={"temperature": 100}, headers=auth)
    client.get("/v1/properties/saturation", params={"temperature": 300})
    client.post("/v1/testing/recorded", json={"temperature": 300.0}, headers=auth)
    client.get("/no/such/path/12345")
    response = client.get("/metrics")
    assert response.status_code == 200
    assert response.headers["content-type"].startswith("text/plain")
    text = response.text
    route = 'route="/v1/properties/saturation"'
    assert f'tripoint_http_requests_total{{method="GET",{route},status="200"}} 1.0' in text
    assert f'tripoint_http_errors_total{{method="GET",{route},status="422"}} 1.0' in text
    # A 401 is answered before routing, but the path has a route: it is counted under it.
    assert f'tripoint_http_errors_total{{method="GET",{route},status="401"}} 1.0' in text
    assert 'route="unrouted",status="401"' not in text
    assert 'tripoint_http_requests_total{method="GET",route="unrouted",status="404"} 1.0' in text
    # Two answered by the route, one 401 before it: three under the route's label.
    assert f'tripoint_http_request_duration_seconds_count{{method="GET",{route}}} 3.0' in text
    assert 'tripoint_calculations_total{kind="testing.recorded",outcome="stored"} 1.0' in text
    assert "/no/such/path" not in text


def test_cors_off_unless_configured(tmp_path: Path) -> None:
    preflight = {
        "Origin": "https://lims.example.org",
        "Access-Control-Request-Method": "POST",
        "Access-Control-Request-Headers": "authorization,content-type",
    }
    with running_client(tmp_path) as closed:
        answer = closed.get("/health", headers={"Origin": "https://lims.example.org"})
        assert "access-control-allow-origin" not in answer.headers
    with running_client(tmp_path, cors_origins="https://lims.example.org", api_keys=KEY) as opened:
        allowed = opened.options("/v1/properties/saturation", headers=preflight)
        other = opened.options(
            "/v1/properties/saturation", headers={**preflight, "Origin": "https://evil.example"}
        )
    assert allowed.status_code == 200, "a preflight needs no key"
    assert allowed.headers["access-control-allow-origin"] == "https://lims.example.org"
    assert other.status_code == 400


def test_a_log_line_stays_small_and_carries_no_long_input() -> None:
    unit = "m/" * 4_000_000  # an 8 MB unit string, as a hostile client might send
    record = logging.LogRecord("tripoint.x", logging.ERROR, __file__, 1, "failed", (), None)
    try:
        raise ValueError(f"unknown unit {unit!r}")
    except ValueError:
        import sys

        record.exc_info = sys.exc_info()
    record.fields = {"reason": unit}
    line = JsonFormatter().format(record)
    assert len(line) < 10_000
    entry = json.loads(line)
    assert "characters not logged" in entry["exception"]
    assert entry["reason"].endswith("(8000000 characters)")
