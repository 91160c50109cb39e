"""Benchmark: what the HTTP-semantics layers cost per request, and what gzip saves.

Measured side by side in one run, in-process, as direct ASGI calls (no socket, no
server): a stub application answering a 5.4 kB JSON body, bare and wrapped in the
layers ``create_app`` adds for the HTTP contract (``semantics.HttpSemantics``: Vary, 406,
HEAD, 405; ``caching.Validators``: ETag, Cache-Control, 304; ``compression.Compression``:
gzip), for a path with one media type (``/health``) and a negotiated GET lookup. The
figures are the minimum of 7 rounds of 5,000 calls, so machine noise only adds.

Then the sizes of real answers (the whole application through ``TestClient``) without
and with gzip: a one-temperature saturation lookup, the bakery chamber simulation as JSON
and as SVG.

Not a test; run alone with ``.venv/bin/python bench/bench_http_layers.py``.
"""

from __future__ import annotations

import asyncio
import json
import time
from pathlib import Path
from typing import Any

from fastapi.testclient import TestClient
from starlette.types import ASGIApp, Message, Receive, Scope, Send

from service import __version__
from service.api.app import create_app
from service.api.http.caching import Validators
from service.api.http.compression import Compression
from service.api.http.semantics import HttpSemantics, RouteTable

_BODY = b'{"answer": "' + b"a1b2c3d4" * 670 + b'"}'
_CHAMBER = (
    Path(__file__).resolve().parent.parent
    / "openapi_examples"
    / "chamber-bread-rack-vacuum-cooler.json"
)


async def _stub(scope: Scope, receive: Receive, send: Send) -> None:
    headers = [(b"content-type", b"application/json"), (b"content-length", b"%d" % len(_BODY))]
    await send({"type": "http.response.start", "status": 200, "headers": headers})
    await send({"type": "http.response.body", "body": _BODY})


async def _discard(message: Message) -> None:
    return None


async def _no_body() -> Message:
    return {"type": "http.request", "body": b""}


def _scope(path: str, gzip: bool) -> Scope:
    headers = [(b"accept", b"application/json")]
    if gzip:
        headers.append((b"accept-encoding", b"gzip"))
    return {
        "type": "http",
        "method": "GET",
        "path": path,
        "query_string": b"temperature=300",
        "headers": headers,
        "state": {},
    }


async def _microseconds(app: ASGIApp, path: str, gzip: bool, calls: int = 5000) -> float:
    best = float("inf")
    for _ in range(7):
        started = time.perf_counter()
        for _ in range(calls):
            await app(_scope(path, gzip), _no_body, _discard)
        best = min(best, (time.perf_counter() - started) / calls)
    return best * 1e6


def _layers(table: RouteTable, *, compress: bool) -> ASGIApp:
    inner: ASGIApp = Validators(
        _stub, __version__, lambda path: path.startswith("/v1/properties/"), shared=True
    )
    if compress:
        inner = Compression(inner)
    return HttpSemantics(inner, table)


def _sizes(client: TestClient, method: str, path: str, **options: Any) -> tuple[int, int]:
    headers = options.pop("headers", {})
    plain = client.request(
        method, path, headers={**headers, "accept-encoding": "identity"}, **options
    )
    with client.stream(
        method, path, headers={**headers, "accept-encoding": "gzip"}, **options
    ) as coded:
        packed = b"".join(coded.iter_raw())
    return len(plain.content), len(packed)


def main() -> None:
    app = create_app()
    table: RouteTable = app.state.route_table
    table.exact("/")  # read the routes before timing
    print("per request, in-process ASGI call around a stub answering 5.4 kB of JSON:")
    for path in ("/health", "/v1/properties/saturation"):
        bare = asyncio.run(_microseconds(_stub, path, gzip=False))
        layered = asyncio.run(_microseconds(_layers(table, compress=True), path, gzip=False))
        coded = asyncio.run(
            _microseconds(_layers(table, compress=True), path, gzip=True, calls=1000)
        )
        print(
            f"  {path:28s} bare {bare:6.2f} us   layers, identity {layered:6.2f} us "
            f"(+{layered - bare:5.2f})   layers, gzip {coded:6.2f} us (+{coded - bare:5.2f})"
        )
    chamber = json.loads(_CHAMBER.read_text())["request"]
    with TestClient(app) as client:
        rows = [
            (
                "saturation at one temperature",
                _sizes(client, "GET", "/v1/properties/saturation?temperature=300"),
            ),
            (
                "chamber simulation, JSON",
                _sizes(client, "POST", "/v1/simulations/vacuum-chamber", json=chamber),
            ),
            (
                "chamber simulation, SVG",
                _sizes(
                    client,
                    "POST",
                    "/v1/simulations/vacuum-chamber",
                    json=chamber,
                    headers={"accept": "image/svg+xml"},
                ),
            ),
        ]
    print("answer sizes, identity -> gzip:")
    for name, (plain, packed) in rows:
        print(f"  {name:32s} {plain:7d} B -> {packed:7d} B   ratio {packed / plain:4.2f}")


if __name__ == "__main__":
    main()
