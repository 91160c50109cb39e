"""Faults: the record store going away mid-run and coming back; SIGTERM with a request in flight.

Record store: the app talks to the real PostgreSQL server (127.0.0.1:5432, database
``test``; ``TRIPOINT_TEST_POSTGRES_URL`` points elsewhere) through a TCP proxy that the
test cuts and restores, so the machine's server itself is never stopped. While cut,
answers say ``record-not-stored`` (policy ``warn``) or are 503 (policy ``fail``), and
``/ready`` is 503; once restored, records are stored again and every record committed
before the cut is still there. Without PostgreSQL these tests skip, except under
``CI=true``, where they fail.

SIGTERM: ``python -m service`` in a subprocess receives SIGTERM while a flash-freeze
sweep request is in flight (its body half sent); the request completes with a full 200
answer and the process then exits (uvicorn ends by re-raising SIGTERM, status -15).
"""

from __future__ import annotations

import contextlib
import json
import os
import signal
import socket
import subprocess
import sys
import threading
import time
import urllib.error
import urllib.request
from collections.abc import Iterator
from pathlib import Path
from typing import Any

import pytest
from fastapi.testclient import TestClient
from server_support import POSTGRES_URL, free_port
from server_support import postgres_schema as shared_postgres_schema

from service.api.app import create_app
from service.records import RecordStore
from service.settings import Settings

_BALANCE = "/v1/balances/flash-freeze"


class CuttableProxy:
    """A loopback TCP proxy to ``target`` that can be cut (refuse and drop) and restored."""

    def __init__(self, target: tuple[str, int]) -> None:
        self.target = target
        self._lock = threading.Lock()
        self._sockets: set[socket.socket] = set()
        self._listener: socket.socket | None = None
        probe = socket.socket()
        probe.bind(("127.0.0.1", 0))
        self.port: int = probe.getsockname()[1]
        probe.close()
        self.restore()

    def restore(self) -> None:
        """Listen again on the same port and forward new connections."""
        listener = socket.socket()
        listener.setsockopt(socket.SOL_SOCKET, socket.SO_REUSEADDR, 1)
        listener.bind(("127.0.0.1", self.port))
        listener.listen(16)
        self._listener = listener
        threading.Thread(target=self._accept, args=(listener,), daemon=True).start()

    def cut(self) -> None:
        """Stop listening (new connections are refused) and drop every open connection."""
        with self._lock:
            listener, self._listener = self._listener, None
            sockets, self._sockets = self._sockets, set()
        if listener is not None:
            # shutdown() first: a bare close() leaves the socket listening while the accept
            # thread still blocks on it.
            with contextlib.suppress(OSError):
                listener.shutdown(socket.SHUT_RDWR)
            listener.close()
        for item in sockets:
            with contextlib.suppress(OSError):
                item.shutdown(socket.SHUT_RDWR)
            item.close()

    def _accept(self, listener: socket.socket) -> None:
        while True:
            try:
                client, _ = listener.accept()
            except OSError:
                return  # closed by cut()
            try:
                upstream = socket.create_connection(self.target, timeout=5)
            except OSError:
                client.close()
                continue
            upstream.settimeout(None)
            with self._lock:
                self._sockets |= {client, upstream}
            for source, sink in ((client, upstream), (upstream, client)):
                threading.Thread(target=self._pump, args=(source, sink), daemon=True).start()

    def _pump(self, source: socket.socket, sink: socket.socket) -> None:
        try:
            while chunk := source.recv(65536):
                sink.sendall(chunk)
        except OSError:
            pass
        finally:
            with contextlib.suppress(OSError):
                sink.shutdown(socket.SHUT_WR)


@pytest.fixture
def postgres_schema() -> Iterator[str]:
    """A fresh schema in the test database, dropped afterwards."""
    with shared_postgres_schema("tripoint_faults") as schema:
        yield schema


def _through(proxy: CuttableProxy) -> str:
    host_and_port = POSTGRES_URL.split("@", 1)[1].split("/", 1)
    return POSTGRES_URL.replace(host_and_port[0], f"127.0.0.1:{proxy.port}", 1)


def _target() -> tuple[str, int]:
    host, _, port = POSTGRES_URL.split("@", 1)[1].split("/", 1)[0].partition(":")
    return host, int(port or 5432)


def _balance(client: TestClient, celsius: float) -> Any:
    return client.post(_BALANCE, json={"initial_temperature": f"{celsius} degC"})


def _codes(answer: dict[str, Any]) -> list[str]:
    return [warning["code"] for warning in answer["warnings"]]


@pytest.mark.parametrize("policy", ["warn", "fail"])
def test_store_cut_mid_run_then_restored_loses_no_committed_record(
    tmp_path: Path, postgres_schema: str, policy: str
) -> None:
    proxy = CuttableProxy(_target())
    store = RecordStore(_through(proxy), schema=postgres_schema)
    settings = Settings(
        database_url=f"sqlite:///{tmp_path / 'unused.sqlite3'}", store_failure_policy=policy
    )
    try:
        with TestClient(create_app(settings, store=store)) as client:
            before = [_balance(client, celsius).json() for celsius in (20, 30)]
            assert all(_codes(answer) == [] for answer in before)

            proxy.cut()
            during = _balance(client, 40)
            ready_during = client.get("/ready")
            read_during = client.get(f"/v1/calculations/{before[0]['meta']['calculation_id']}")

            proxy.restore()
            after = _balance(client, 50).json()
            ready_after = client.get("/ready")
            fetched = [
                client.get(f"/v1/calculations/{answer['meta']['calculation_id']}")
                for answer in (*before, after)
            ]
            listed = client.get("/v1/calculations", params={"kind": "balances.flash_freeze"})
    finally:
        proxy.cut()
        store.close()

    if policy == "warn":
        assert during.status_code == 200
        assert _codes(during.json()) == ["record-not-stored"]
        not_stored = during.json()["meta"]["calculation_id"]
    else:
        assert during.status_code == 503
        assert during.headers["content-type"].startswith("application/problem+json")
        assert during.json()["type"].endswith("record-not-stored")
        not_stored = None
    assert ready_during.status_code == 503
    assert read_during.status_code == 503
    assert _codes(after) == []
    assert ready_after.status_code == 200
    assert [response.status_code for response in fetched] == [200, 200, 200]
    stored = {item["calculation_id"] for item in listed.json()["items"]}
    expected = {answer["meta"]["calculation_id"] for answer in (*before, after)}
    assert stored == expected
    assert not_stored not in stored


# -- SIGTERM --------------------------------------------------------------------------------


@pytest.fixture
def live_server(tmp_path: Path) -> Iterator[tuple[subprocess.Popen[bytes], int]]:
    port = free_port()
    environment = {
        **os.environ,
        "TRIPOINT_DATABASE_URL": f"sqlite:///{tmp_path / 'records.sqlite3'}",
        "TRIPOINT_LOG_LEVEL": "warning",
    }
    environment.pop("PROMETHEUS_MULTIPROC_DIR", None)
    process = subprocess.Popen(
        [sys.executable, "-m", "service", "--host", "127.0.0.1", "--port", str(port)],
        env=environment,
        stdout=subprocess.DEVNULL,
        stderr=subprocess.DEVNULL,
    )
    try:
        deadline = time.monotonic() + 90
        while True:
            try:
                with urllib.request.urlopen(f"http://127.0.0.1:{port}/health", timeout=2):
                    break
            except (urllib.error.URLError, OSError):
                if process.poll() is not None or time.monotonic() > deadline:
                    pytest.fail("the server did not start")
                time.sleep(0.2)
        yield process, port
    finally:
        if process.poll() is None:
            process.kill()
        process.wait(timeout=30)


def _read_response(connection: socket.socket) -> tuple[int, bytes]:
    """Read one HTTP/1.1 response with a Content-Length (what uvicorn sends here)."""
    connection.settimeout(60)
    data = b""
    while b"\r\n\r\n" not in data:
        chunk = connection.recv(65536)
        if not chunk:
            raise ConnectionError(f"connection closed after {data[:200]!r}")
        data += chunk
    head, _, body = data.partition(b"\r\n\r\n")
    lines = head.decode("latin-1").split("\r\n")
    status = int(lines[0].split()[1])
    headers = dict(line.split(": ", 1) for line in lines[1:])
    length = int({name.lower(): value for name, value in headers.items()}["content-length"])
    while len(body) < length:
        chunk = connection.recv(65536)
        if not chunk:
            raise ConnectionError("connection closed mid-body")
        body += chunk
    return status, body


def test_sigterm_lets_an_in_flight_request_finish(
    live_server: tuple[subprocess.Popen[bytes], int],
) -> None:
    process, port = live_server
    temperatures = [5.0 + 0.25 * step for step in range(300)]
    body = json.dumps({"initial_temperature": {"values": temperatures, "unit": "degC"}}).encode()
    head = (
        f"POST {_BALANCE} HTTP/1.1\r\nHost: 127.0.0.1:{port}\r\n"
        f"Content-Type: application/json\r\nContent-Length: {len(body)}\r\n\r\n"
    ).encode()
    with socket.create_connection(("127.0.0.1", port), timeout=10) as connection:
        connection.sendall(head + body[: len(body) // 2])
        time.sleep(0.5)  # the server has the headers: the request is in flight
        process.send_signal(signal.SIGTERM)
        time.sleep(0.5)
        assert process.poll() is None, "the server exited with a request in flight"
        connection.sendall(body[len(body) // 2 :])
        status, answer = _read_response(connection)
    assert status == 200
    assert len(json.loads(answer)["evaporated_mass"]["values"]) == len(temperatures)
    # uvicorn re-raises the signal once its graceful shutdown is done.
    assert process.wait(timeout=40) in (0, -signal.SIGTERM)
