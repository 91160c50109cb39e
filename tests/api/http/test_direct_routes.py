"""The GET routes served past the router (service/api/http/direct_routes.py) answer exactly
as the routed path does: the same status, headers and bytes, for good and bad input.

Two applications are built on the same settings, one with the direct routes
(``DIRECT_ROUTES``, the default) and one with none, so that every request goes through
FastAPI's router. Each request is sent to both with the same ``X-Request-ID``; the answers
may differ only in ``meta.time`` (the clock) and, where gzip-coded, in the coded length.
The metrics both count afterwards must agree too (route labels, methods, statuses).
"""

from __future__ import annotations

import re
from collections.abc import Iterator

import httpx2 as _httpx  # the HTTP client starlette's TestClient runs on
import pytest
from fastapi.testclient import TestClient
from operations_support import KEY

from service.api.app import DIRECT_ROUTES, create_app
from service.api.http.direct_routes import NotDirectError
from service.settings import Settings

_TIME = re.compile(rb"\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z")
"""``meta.time`` as answers write it (JSON and CSV alike)."""

_SAT = "/v1/properties/saturation"
_SUB = "/v1/properties/sublimation"
_MELT = "/v1/properties/melting"
_STATE = "/v1/properties/state"
_CONST = "/v1/properties/constants"

# (method, path with query, extra headers): good and bad input on every direct route.
CASES: list[tuple[str, str, dict[str, str]]] = [
    ("GET", "/health", {}),
    ("GET", "/health?verbose=1", {}),  # 422: /health takes no query parameter
    ("HEAD", "/health", {}),
    ("GET", f"{_SAT}?temperature=300", {}),
    ("GET", f"{_SAT}?temperature=25%20degC&output_units=engineering", {}),
    ("GET", f"{_SAT}?pressure=2%20kPa", {}),
    ("GET", f"{_SAT}?temperature=400&formulation=IAPWS-IF97", {}),
    ("GET", f"{_SAT}?temperature=647.0", {}),  # near the critical point: advisories
    ("GET", f"{_SAT}?temperature=300", {"accept": "text/csv"}),
    ("GET", f"{_SAT}?temperature=300", {"accept": "image/png"}),  # 406
    ("GET", f"{_SAT}?temperature=300", {"accept-encoding": "gzip"}),
    ("GET", f"{_SAT}?temperature=300", {"if-none-match": "*"}),  # 304
    ("HEAD", f"{_SAT}?temperature=300", {}),
    ("GET", f"{_SAT}?temperature=200", {}),  # 422 out of range, in K
    ("GET", f"{_SAT}?temperature=-90%20degC", {}),  # 422 out of range, in degC
    ("GET", f"{_SAT}?temperature=300&pressure=1000", {}),  # 422 both given
    ("GET", _SAT, {}),  # 422 neither given
    ("GET", f"{_SAT}?temperature=hot", {}),  # 422 unreadable
    ("GET", f"{_SAT}?temperature=nan", {}),  # 422 not finite
    ("GET", f"{_SAT}?temperature=300%20kg", {}),  # 422 wrong dimension
    ("GET", f"{_SAT}?temperature=300&color=blue", {}),  # 422 unknown parameter
    ("GET", f"{_SAT}?temperature=300&output_units=furlongs", {}),  # 422 unknown unit set
    ("GET", f"{_SAT}?temperature=300&formulation=other", {}),  # 422
    ("GET", f"{_SAT}?temperature=300&detail=full", {}),  # the statements spelled out
    ("GET", f"{_SAT}?temperature=300&detail=full", {"accept": "text/csv"}),
    ("GET", f"{_SAT}?temperature=300&detail=all", {}),  # 422 unknown detail
    ("GET", f"{_STATE}?temperature=300&pressure=101325&detail=full", {}),
    ("GET", f"{_SUB}?temperature=250", {}),
    ("GET", f"{_SUB}?pressure=100", {}),
    ("GET", f"{_SUB}?temperature=300", {}),  # 422 above the triple point
    ("GET", f"{_MELT}?temperature=270", {}),
    ("GET", f"{_MELT}?pressure=1%20MPa", {}),
    ("GET", f"{_MELT}?temperature=200", {}),  # 422
    ("GET", f"{_STATE}?temperature=300&pressure=101325", {}),
    ("GET", f"{_STATE}?temperature=260&pressure=101325&phase=liquid", {}),  # metastable
    ("GET", f"{_STATE}?temperature=300", {}),  # 422 pressure missing
    ("GET", f"{_STATE}?temperature=300&pressure=101325", {"accept": "text/csv"}),
    ("GET", _CONST, {}),
    ("GET", f"{_CONST}?output_units=engineering", {}),
    ("GET", f"{_CONST}?temperature=1", {}),  # 422 unknown parameter
    ("POST", _SAT, {}),  # not a direct route: the routed answer on both (422, no body)
]


def _without_time(body: bytes) -> bytes:
    return _TIME.sub(b"<time>", body)


def _headers(answer: _httpx.Response) -> list[tuple[str, str]]:
    """The header fields; a gzip-coded answer's length depends on its clock, so not it."""
    coded = answer.headers.get("content-encoding") == "gzip"
    return sorted(
        (name, value)
        for name, value in answer.headers.multi_items()
        if not (coded and name == "content-length")
    )


@pytest.fixture(scope="module")
def clients(settings: Settings) -> Iterator[tuple[TestClient, TestClient]]:
    with (
        TestClient(create_app(settings)) as direct,
        TestClient(create_app(settings, direct_routes=())) as routed,
    ):
        yield direct, routed


def _send(
    client: TestClient, method: str, path: str, headers: dict[str, str], number: int
) -> _httpx.Response:
    request_id = f"direct-route-case-{number}"
    sent = {"x-request-id": request_id, "accept-encoding": "identity", **headers}
    return client.request(method, path, headers=sent)


@pytest.mark.parametrize(("method", "path", "headers"), CASES, ids=lambda item: str(item))
def test_direct_answer_equals_the_routed_answer(
    clients: tuple[TestClient, TestClient], method: str, path: str, headers: dict[str, str]
) -> None:
    direct, routed = clients
    number = CASES.index((method, path, headers))
    fast = _send(direct, method, path, headers, number)
    slow = _send(routed, method, path, headers, number)
    assert fast.status_code == slow.status_code
    assert _headers(fast) == _headers(slow)
    assert _without_time(fast.content) == _without_time(slow.content)


def test_the_cases_reach_every_direct_route_and_its_errors(
    clients: tuple[TestClient, TestClient],
) -> None:
    """The table above is not vacuous: it covers each direct path, 200s and 4xx alike."""
    direct, _ = clients
    paths = {path.split("?")[0] for _, path, _ in CASES}
    assert set(DIRECT_ROUTES) <= paths
    statuses = {
        _send(direct, method, path, headers, number).status_code
        for number, (method, path, headers) in enumerate(CASES)
    }
    assert {200, 304, 406, 422} <= statuses


def _request_counts(client: TestClient) -> list[str]:
    text = client.get("/metrics").text
    return sorted(
        line
        for line in text.splitlines()
        if line.startswith(("tripoint_http_requests_total", "tripoint_http_errors_total"))
        and "/metrics" not in line
    )


def test_metrics_count_the_same_routes_and_statuses(settings: Settings) -> None:
    with (
        TestClient(create_app(settings)) as direct,
        TestClient(create_app(settings, direct_routes=())) as routed,
    ):
        for number, (method, path, headers) in enumerate(CASES):
            _send(direct, method, path, headers, number)
            _send(routed, method, path, headers, number)
        counted = _request_counts(direct)
        assert counted == _request_counts(routed)
        # Labelled with the route's template, as routing labels it.
        assert any('route="/v1/properties/saturation"' in line for line in counted)


def test_keys_guard_the_direct_routes_as_the_routed_ones(settings: Settings) -> None:
    keyed = Settings(database_url=settings.database_url, api_keys=KEY)
    cases = [
        {},
        {"authorization": "Bearer wrong-key"},
        {"authorization": f"Bearer {KEY}"},
    ]
    with (
        TestClient(create_app(keyed)) as direct,
        TestClient(create_app(keyed, direct_routes=())) as routed,
    ):
        for number, headers in enumerate(cases):
            path = f"{_SAT}?temperature=300"
            fast = _send(direct, "GET", path, headers, number)
            slow = _send(routed, "GET", path, headers, number)
            assert fast.status_code == slow.status_code
            assert _headers(fast) == _headers(slow)
            assert _without_time(fast.content) == _without_time(slow.content)
        assert [
            _send(direct, "GET", f"{_SAT}?temperature=300", h, 0).status_code for h in cases
        ] == [
            401,
            401,
            200,
        ]


@pytest.mark.parametrize(
    "path",
    [
        pytest.param("/v1/balances/flash-freeze", id="post-only"),
        pytest.param("/v1/calculations", id="synchronous-endpoint"),
        pytest.param("/v1/no-such-path", id="no-route"),
    ],
)
def test_a_path_that_cannot_be_served_directly_stops_startup(settings: Settings, path: str) -> None:
    with (
        pytest.raises(NotDirectError, match=path),
        TestClient(create_app(settings, direct_routes=[path])),
    ):
        pass
