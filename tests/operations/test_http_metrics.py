"""Route labels on answers given before routing (401, 413, 406) and the build-info metric."""

from __future__ import annotations

import platform
from collections.abc import Iterator
from pathlib import Path

import pytest
from fastapi.testclient import TestClient
from operations_support import KEY, running_client

from service import __version__


@pytest.fixture
def client(tmp_path: Path) -> Iterator[TestClient]:
    with running_client(tmp_path, api_keys=KEY, max_body_bytes=1024) as started:
        yield started


def test_refusals_before_routing_carry_the_route_label(client: TestClient) -> None:
    auth = {"Authorization": f"Bearer {KEY}"}
    assert client.get("/v1/properties/saturation?temperature=300").status_code == 401
    big = b'{"temperature": [' + b"300.0," * 400 + b"300.0]}"
    refused = client.post(
        "/v1/properties/saturation",
        content=big,
        headers={**auth, "content-type": "application/json"},
    )
    assert refused.status_code == 413
    assert client.get("/v1/calculations/abc").status_code == 401
    assert client.get("/no/such/path/at/all").status_code == 404
    text = client.get("/metrics").text
    saturation = 'route="/v1/properties/saturation"'
    assert f'tripoint_http_errors_total{{method="GET",{saturation},status="401"}} 1.0' in text
    assert f'tripoint_http_errors_total{{method="POST",{saturation},status="413"}} 1.0' in text
    record = 'route="/v1/calculations/{calculation_id}"'
    assert f'tripoint_http_errors_total{{method="GET",{record},status="401"}} 1.0' in text
    # A path without a route stays under one label, so scanning cannot grow the metrics.
    assert 'tripoint_http_errors_total{method="GET",route="unrouted",status="404"} 1.0' in text
    assert "/no/such/path" not in text


def test_build_info_metric(client: TestClient) -> None:
    text = client.get("/metrics").text
    lines = [line for line in text.splitlines() if line.startswith("tripoint_build_info{")]
    assert len(lines) == 1
    labels, _, value = lines[0].partition("} ")
    assert value == "1.0"
    assert f'version="{__version__}"' in labels
    assert f'python="{platform.python_version()}"' in labels
