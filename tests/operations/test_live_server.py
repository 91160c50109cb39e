"""The real server, as deployed: ``python -m service --workers 2`` in a subprocess.

- ``/docs`` and ``/redoc`` load in headless Chromium with every other host unreachable, and
  the endpoint list renders; the browser's network log shows the pages asked nothing of
  any other host. Under ``CI=true`` a missing browser fails instead of skipping.
- ``/metrics`` adds up both workers; logs are JSON lines carrying the request id.
"""

from __future__ import annotations

import json
import os
import shutil
import signal
import subprocess
import sys
import time
import urllib.error
import urllib.request
from collections.abc import Iterator
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import pytest
from server_support import free_port

KEY = "live-server-key-0123456789"
SATURATION_SUMMARY = "Liquid-vapor saturation at a temperature or a pressure"
_START_SECONDS = 90.0


@dataclass(frozen=True)
class LiveServer:
    origin: str
    log: Path


def _get(url: str, headers: dict[str, str] | None = None) -> tuple[int, dict[str, str], bytes]:
    request = urllib.request.Request(url, headers=headers or {})
    try:
        with urllib.request.urlopen(request, timeout=10) as response:
            return response.status, _lower(response.headers.items()), response.read()
    except urllib.error.HTTPError as error:
        return error.code, _lower(error.headers.items()), error.read()


def _lower(items: Any) -> dict[str, str]:
    return {str(name).lower(): str(value) for name, value in items}


@pytest.fixture(scope="module")
def live_server(tmp_path_factory: pytest.TempPathFactory) -> Iterator[LiveServer]:
    folder = tmp_path_factory.mktemp("live")
    port = free_port()
    log = folder / "server.log"
    environment = {
        **os.environ,
        "TRIPOINT_DATABASE_URL": f"sqlite:///{folder / 'records.sqlite3'}",
        "TRIPOINT_API_KEYS": KEY,
    }
    environment.pop("PROMETHEUS_MULTIPROC_DIR", None)
    with log.open("wb") as sink:
        process = subprocess.Popen(
            [
                sys.executable,
                "-m",
                "service",
                "--host",
                "127.0.0.1",
                "--port",
                str(port),
                "--workers",
                "2",
            ],
            stdout=sink,
            stderr=subprocess.STDOUT,
            env=environment,
            cwd=folder,
        )
    origin = f"http://127.0.0.1:{port}"
    try:
        deadline = time.monotonic() + _START_SECONDS
        while True:
            if process.poll() is not None:
                pytest.fail(f"the server exited: {log.read_text()[-2000:]}")
            try:
                if _get(origin + "/health")[0] == 200:
                    break
            except OSError:
                pass
            if time.monotonic() > deadline:
                pytest.fail(f"the server did not answer within {_START_SECONDS} s")
            time.sleep(0.2)
        yield LiveServer(origin=origin, log=log)
    finally:
        process.send_signal(signal.SIGTERM)
        try:
            process.wait(timeout=30)
        except subprocess.TimeoutExpired:
            process.kill()
            process.wait(timeout=10)


def _chromium() -> str:
    for name in ("chromium", "chromium-browser"):
        found = shutil.which(name)
        if found:
            return found
    message = "Chromium is not installed (apt-get install chromium)"
    if os.environ.get("CI") == "true":
        pytest.fail(message)
    pytest.skip(message)


def _render_offline(url: str, folder: Path) -> tuple[str, list[dict[str, Any]]]:
    """The DOM after scripts ran, and the requests the page made (from Chromium's net log)."""
    net_log = folder / "net-log.json"
    command = [
        _chromium(),
        "--headless",
        "--no-sandbox",
        "--disable-gpu",
        "--disable-background-networking",
        "--disable-component-update",
        "--no-first-run",
        "--disable-sync",
        f"--user-data-dir={folder / 'profile'}",
        # Every host but the loopback address is unreachable.
        "--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE 127.0.0.1",
        f"--log-net-log={net_log}",
        "--virtual-time-budget=20000",
        "--dump-dom",
        url,
    ]
    finished = subprocess.run(command, capture_output=True, timeout=120, check=False)
    dom = finished.stdout.decode("utf-8", "replace")
    assert dom, f"Chromium printed no DOM: {finished.stderr.decode()[-2000:]}"
    log = json.loads(net_log.read_text())
    names = {number: name for name, number in log["constants"]["logEventTypes"].items()}
    page_requests = [
        event["params"]
        for event in log["events"]
        if names.get(event["type"]) == "URL_REQUEST_START_JOB"
        and event.get("params", {}).get("initiator", "not an origin") != "not an origin"
    ]
    return dom, page_requests


@pytest.mark.parametrize(
    ("page", "asset"),
    [
        pytest.param("/docs", "/docs-assets/swagger-ui-bundle.js", id="swagger-ui"),
        pytest.param("/redoc", "/docs-assets/redoc.standalone.js", id="redoc"),
    ],
)
def test_docs_render_in_chromium_with_no_other_host(
    live_server: LiveServer, tmp_path: Path, page: str, asset: str
) -> None:
    dom, requests = _render_offline(live_server.origin + page, tmp_path)
    assert SATURATION_SUMMARY in dom, "the endpoint list rendered"
    assert "Stored calculations, newest first, filtered and paged" in dom
    urls = [str(request["url"]) for request in requests]
    assert live_server.origin + asset in urls
    assert live_server.origin + "/openapi.json" in urls
    strangers = [url for url in urls if not url.startswith(live_server.origin + "/")]
    assert strangers == [], "the page asked another host"


def test_metrics_add_up_every_worker(live_server: LiveServer) -> None:
    marker = "/v1/calculations/metrics-probe"
    for _ in range(20):
        status, _, _ = _get(live_server.origin + marker, {"Authorization": f"Bearer {KEY}"})
        assert status == 404
    _, headers, body = _get(live_server.origin + "/metrics")
    text = body.decode()
    line = next(
        line
        for line in text.splitlines()
        if line.startswith("tripoint_http_requests_total{")
        and 'route="/v1/calculations/{calculation_id}"' in line
        and 'status="404"' in line
    )
    assert float(line.rsplit(" ", 1)[1]) == 20.0
    assert headers["content-type"].startswith("text/plain")


def test_request_id_echoed_and_logged_as_json(live_server: LiveServer) -> None:
    status, headers, _ = _get(
        live_server.origin + "/v1/properties/saturation?temperature=300",
        {"X-Request-ID": "live-check-1", "Authorization": f"Bearer {KEY}"},
    )
    assert status == 200
    assert headers["x-request-id"] == "live-check-1"
    refused, _, _ = _get(live_server.origin + "/v1/properties/saturation?temperature=300")
    assert refused == 401
    deadline = time.monotonic() + 10
    while True:
        lines = [json.loads(line) for line in live_server.log.read_text().splitlines() if line]
        matching = [line for line in lines if line.get("request_id") == "live-check-1"]
        if matching or time.monotonic() > deadline:
            break
        time.sleep(0.1)
    assert matching and matching[0]["route"] == "/v1/properties/saturation"
    assert matching[0]["status"] == 200
    assert all(KEY not in json.dumps(line) for line in lines)
    assert any("API keys on" in line["message"] for line in lines)


def _raw_exchange(origin: str, head: bytes, body: bytes = b"") -> bytes:
    """Send one raw HTTP/1.1 request in 64 KiB pieces, reading as it goes (a server that
    refuses early answers and closes before the rest is sent); return what it answered."""
    import select
    import socket

    host, port = origin.removeprefix("http://").split(":")
    message = head + body
    received = b""
    with socket.create_connection((host, int(port)), timeout=10) as connection:
        for start in range(0, len(message), 65536):
            try:
                connection.sendall(message[start : start + 65536])
            except (BrokenPipeError, ConnectionResetError):
                break
            if select.select([connection], [], [], 0.01)[0]:
                break  # an early answer: stop sending, read it
        while True:
            try:
                chunk = connection.recv(65536)
            except (ConnectionResetError, TimeoutError):
                break
            if not chunk:
                break
            received += chunk
    return received


def test_a_request_head_over_the_limit_is_431_and_the_body_does_not_count(
    live_server: LiveServer,
) -> None:
    # RFC 6585 Sec. 5: 431 Request Header Fields Too Large. Default limit 32 KiB.
    def head(extra: int, more: bytes = b"") -> bytes:
        return (
            b"GET /health HTTP/1.1\r\nHost: tripoint\r\nConnection: close\r\n"
            + b"X-Padding: "
            + b"a" * extra
            + b"\r\n"
            + more
            + b"\r\n"
        )

    accepted = _raw_exchange(live_server.origin, head(30_000))
    assert accepted.startswith(b"HTTP/1.1 200"), accepted[:200]
    for size in (40_000, 2_000_000):
        refused = _raw_exchange(live_server.origin, head(size))
        assert refused.startswith(b"HTTP/1.1 431"), refused[:200]
        assert b"application/problem+json" in refused
        assert b'"status":431' in refused
    body = json.dumps({"initial_temperature": 293.15, "padding": "x" * 200_000}).encode()
    post = (
        b"POST /v1/balances/flash-freeze HTTP/1.1\r\nHost: tripoint\r\nConnection: close\r\n"
        b"Content-Type: application/json\r\nAuthorization: Bearer " + KEY.encode() + b"\r\n"
        b"Content-Length: " + str(len(body)).encode() + b"\r\n\r\n"
    )
    answered = _raw_exchange(live_server.origin, post, body)
    # A large body with a small head reaches the application (which refuses the unknown
    # field with 422): the head limit does not count body bytes.
    assert answered.startswith(b"HTTP/1.1 422"), answered[:200]


def test_head_and_gzip_over_a_real_connection(live_server: LiveServer) -> None:
    # RFC 9110 §9.3.2: HEAD gets the GET's headers and no body; on one kept-alive
    # connection the next answer must start cleanly after it (no stray body bytes).
    import gzip
    import http.client
    from urllib.parse import urlsplit

    where = urlsplit(live_server.origin)
    connection = http.client.HTTPConnection(where.hostname or "127.0.0.1", where.port, timeout=10)
    auth = {"Authorization": f"Bearer {KEY}", "Accept-Encoding": "gzip"}
    path = "/v1/properties/saturation?temperature=300"
    try:
        connection.request("HEAD", path, headers=auth)
        head = connection.getresponse()
        assert head.status == 200
        assert head.read() == b""
        assert head.getheader("content-encoding") == "gzip"
        connection.request("GET", path, headers=auth)
        got = connection.getresponse()
        body = got.read()
        assert got.status == 200
        assert got.getheader("content-encoding") == "gzip"
        assert int(got.getheader("content-length") or 0) == len(body)
        assert b'"temperature"' in gzip.decompress(body)
        assert got.getheader("etag") and got.getheader("cache-control") == "private, max-age=3600"
    finally:
        connection.close()
