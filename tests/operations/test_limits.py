"""Limits answered with their own problem documents: body size 413, CSV rows 413,
computation time 503."""

from __future__ import annotations

import importlib
import inspect
import pkgutil
import time
from collections.abc import Iterator
from pathlib import Path

from fastapi.routing import APIRoute
from operations_support import NAP_SECONDS, NAPS, SLOW_RELEASE, running_client

import service.api
from service.api.http.limits import TimeLimitedRoute


def test_overrunning_computation_is_503_at_the_limit(tmp_path: Path) -> None:
    SLOW_RELEASE.clear()
    with running_client(tmp_path, max_request_seconds=0.3) as client:
        started = time.perf_counter()
        response = client.get("/v1/testing/slow")
        elapsed = time.perf_counter() - started
        # The abandoned computation goes on in its thread; let it end before shutdown.
        SLOW_RELEASE.set()
        after = client.get("/v1/properties/saturation", params={"temperature": 300})
        metrics = client.get("/metrics").text
    assert response.status_code == 503
    assert response.headers["content-type"] == "application/problem+json"
    assert response.headers["retry-after"] == "1"
    problem = response.json()
    assert problem["type"] == "urn:tripoint:problem:time-limit"
    assert "TRIPOINT_MAX_REQUEST_SECONDS" in problem["detail"]
    assert elapsed < 2.0, "the 503 comes at the limit, not when the computation ends"
    assert after.status_code == 200
    assert 'route="/v1/testing/slow",status="503"' in metrics


def test_csv_request_is_limited_as_a_whole_not_per_row(tmp_path: Path) -> None:
    # Each row's call takes NAP_SECONDS, well inside the limit; twelve of them do not.
    rows = 12
    body = "temperature[degC],note\n" + "".join(f"{20 + row},row {row}\n" for row in range(rows))
    limit = 0.3
    assert NAP_SECONDS < limit < rows * NAP_SECONDS / 2
    NAPS.clear()
    with running_client(tmp_path, max_request_seconds=limit) as client:
        started = time.perf_counter()
        response = client.post(
            "/v1/testing/nap", content=body, headers={"content-type": "text/csv"}
        )
        elapsed = time.perf_counter() - started
        time.sleep(rows * NAP_SECONDS)  # time enough for every row, were they still run
        metrics = client.get("/metrics").text
    assert response.status_code == 503
    assert response.headers["content-type"] == "application/problem+json"
    assert response.json()["type"] == "urn:tripoint:problem:time-limit"
    assert elapsed < rows * NAP_SECONDS, "the 503 comes at the limit, not after every row"
    # After its 503 the request computes no further rows (each would store a record).
    assert len(NAPS) <= round(limit / NAP_SECONDS) + 1 < rows, NAPS
    assert 'route="/v1/testing/nap",status="503"' in metrics


def test_csv_503_before_any_row_ends_is_counted_under_its_route(tmp_path: Path) -> None:
    # One row that outlasts the limit: the CSV request's own limit fires first (it started
    # first), before any route call has ended and lent its route to the request.
    limit = NAP_SECONDS / 2
    body = "temperature[degC],note\n20,only row\n"
    with running_client(tmp_path, max_request_seconds=limit) as client:
        response = client.post(
            "/v1/testing/nap", content=body, headers={"content-type": "text/csv"}
        )
        time.sleep(2 * NAP_SECONDS)  # let the abandoned row end before shutdown
        metrics = client.get("/metrics").text
    assert response.status_code == 503
    assert 'route="/v1/testing/nap",status="503"' in metrics
    assert 'route="unrouted",status="503"' not in metrics


def test_get_lookups_do_not_document_a_time_limit(tmp_path: Path) -> None:
    # GET lookups compute on the event loop and are not timed: OpenAPI must not promise a 503.
    with running_client(tmp_path) as client:
        schema = client.get("/openapi.json").json()
    assert "503" not in schema["paths"]["/v1/properties/saturation"]["get"]["responses"]
    assert "503" in schema["paths"]["/v1/balances/flash-freeze"]["post"]["responses"]


def test_fast_requests_are_untouched_by_the_time_limit(tmp_path: Path) -> None:
    with running_client(tmp_path, max_request_seconds=5) as client:
        response = client.get("/v1/properties/saturation", params={"temperature": 300})
    assert response.status_code == 200


def test_time_limit_is_documented_on_v1_routes(tmp_path: Path) -> None:
    with running_client(tmp_path, max_request_seconds=12) as client:
        schema = client.get("/openapi.json").json()
    responses = schema["paths"]["/v1/properties/saturation"]["post"]["responses"]
    assert "12 s" in responses["503"]["description"]
    assert "503" not in schema["paths"]["/health"]["get"]["responses"]


def test_body_over_the_limit_is_413(tmp_path: Path) -> None:
    with running_client(tmp_path, max_body_bytes=2048) as client:
        response = client.post(
            "/v1/properties/saturation",
            content=b"temperature[K]\n" + b"300\n" * 1000,
            headers={"content-type": "text/csv"},
        )
    assert response.status_code == 413
    assert response.json()["type"] == "urn:tripoint:problem:body-too-large"


def test_csv_rows_over_the_batch_limit_is_413(tmp_path: Path) -> None:
    with running_client(tmp_path, max_batch_points=3) as client:
        response = client.post(
            "/v1/properties/saturation",
            content="temperature[K]\n300\n301\n302\n303\n",
            headers={"content-type": "text/csv"},
        )
    assert response.status_code == 413
    assert response.json()["type"] == "urn:tripoint:problem:too-many-points"


def test_chunked_body_over_the_limit_is_413_not_400(tmp_path: Path) -> None:
    def chunks() -> Iterator[bytes]:
        yield b'{"temperature": {"values": ['
        for _ in range(1000):
            yield b"300.0,"
        yield b"300.0]}}"

    with running_client(tmp_path, max_body_bytes=2048) as client:
        response = client.post(
            "/v1/properties/saturation",
            content=chunks(),
            headers={"content-type": "application/json"},
        )
        small = client.post(
            "/v1/properties/saturation",
            content=iter([b'{"temperature": ', b"300.0}"]),
            headers={"content-type": "application/json"},
        )
    assert response.status_code == 413
    assert response.json()["type"] == "urn:tripoint:problem:body-too-large"
    assert small.status_code == 200, small.text


def _v1_routes() -> list[APIRoute]:
    """Every /v1 route of every resource package's router module (service.api.<resource>)."""
    found = []
    for package in pkgutil.iter_modules(service.api.__path__):
        if not package.ispkg:
            continue
        try:
            module = importlib.import_module(f"service.api.{package.name}.router")
        except ModuleNotFoundError:
            continue  # a shared package (http) has no router
        found += [
            route
            for route in module.router.routes
            if isinstance(route, APIRoute) and route.path.startswith("/v1/")
        ]
    return found


def test_every_v1_route_that_runs_in_a_thread_is_time_limited() -> None:
    # The limit lives in the route class: a /v1 router that forgot it would escape it.
    routes = _v1_routes()
    threaded = [route for route in routes if not inspect.iscoroutinefunction(route.endpoint)]
    assert len(threaded) >= 8
    escaped = [route.path for route in routes if not isinstance(route, TimeLimitedRoute)]
    assert escaped == []
