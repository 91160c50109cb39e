"""Server CPU per request along the request path, against a bare framework and a raw floor.

Run ``python bench/bench_request_path.py`` from the checkout (it imports that checkout's
``service``): it prints the table and the three ratios against their goals. Three servers
on loopback, one uvicorn worker each: a bare Starlette app, a raw ASGI floor that reads the
query, calls the core's saturation lookup and writes orjson (``floor_servers.py``), and
tripoint itself (``python -m service``). One keep-alive connection per server sends the
requests one after another; the figure is the server process's CPU time (user + system,
from /proc) per request, best of three runs, so the client's own cost does not count. The
three servers run at once and each run measures every row in turn, so that the machine's
load, which changes from minute to minute, touches the rows of one run alike. Scenarios:
the bare route, the floor lookup, tripoint's ``/health``, a one-point saturation lookup
(GET), a 1,000-point lookup (POST JSON) and a flash-freeze balance (POST). Beside them, in
this process: the core's 10,000-point saturation lookup plus orjson of its arrays, against
tripoint's 10,000-point POST (asked uncompressed, and once more with gzip).

Other modes, instead of the table:

- ``--profile``: a cProfile of the one-point lookup through the whole app in process,
  sorted by cumulative time (``TRIPOINT_BENCH_SORT=tottime``: by own time);
- ``--workers``: requests per second of one-point lookups from 16 connections with
  ``--workers 1`` and ``--workers 2`` (``TRIPOINT_BENCH_SECONDS`` each, default 15; wrk
  when installed, else an httpx client on the same cores).

Goals (issue: request path at the floor): ``/health`` <= 2 x the bare Starlette route; a
one-point lookup <= 1.5 x the raw ASGI floor; a 10,000-point JSON batch <= 1.3 x the
in-process core call plus orjson.
"""

from __future__ import annotations

import contextlib
import cProfile
import dataclasses
import io
import os
import pstats
import sys
import time
from collections.abc import MutableMapping, Sequence
from pathlib import Path
from typing import Any

_FOLDER = Path(__file__).resolve().parent
# This checkout's service package, whatever else the environment has installed (an editable
# install may point at another checkout); the servers started below inherit it too.
sys.path.insert(0, str(_FOLDER.parent))
os.environ["PYTHONPATH"] = os.pathsep.join(
    [str(_FOLDER.parent), *filter(None, [os.environ.get("PYTHONPATH")])]
)

import httpx  # noqa: E402
import numpy as np  # noqa: E402
import orjson  # noqa: E402
from loopback import Request, drive, running_server  # noqa: E402

_FLOOR = [sys.executable, str(_FOLDER / "floor_servers.py")]
_RUNS = 3
_TICKS = os.sysconf("SC_CLK_TCK")
_REQUESTS = int(os.environ.get("TRIPOINT_BENCH_REQUESTS", "3000"))
_WORKERS_SECONDS = float(os.environ.get("TRIPOINT_BENCH_SECONDS", "15"))

HEALTH_GOAL = 2.0
LOOKUP_GOAL = 1.5
BATCH_GOAL = 1.3

Call = tuple[str, str, dict[str, Any] | None]


def _cpu_seconds(pid: int) -> float:
    """User + system CPU seconds of a process so far (/proc/<pid>/stat, fields 14 and 15)."""
    fields = Path(f"/proc/{pid}/stat").read_text().rsplit(")", 1)[1].split()
    return (int(fields[11]) + int(fields[12])) / _TICKS


def _client(base_url: str, *, gzip: bool = False) -> httpx.Client:
    """A keep-alive client asking answers uncompressed (``Accept-Encoding: identity``)
    unless ``gzip``: the floors compress nothing, and compression is the client's choice."""
    coding = {"accept-encoding": "gzip" if gzip else "identity"}
    return httpx.Client(base_url=base_url, timeout=60, headers=coding)


def _server_cpu_per_request(
    client: httpx.Client, pid: int, calls: Sequence[Call], count: int
) -> float:
    """Server CPU seconds per request over ``count`` sequential requests (one run)."""
    before = _cpu_seconds(pid)
    for index in range(count):
        method, path, body = calls[index % len(calls)]
        client.request(method, path, json=body).raise_for_status()
    return (_cpu_seconds(pid) - before) / count


def _warm(client: httpx.Client, calls: Sequence[Call]) -> None:
    """Warm the route and its caches."""
    for method, path, body in calls[:3]:
        client.request(method, path, json=body).raise_for_status()


def _lookups(prefix: str = "") -> list[Call]:
    """One-point saturation GETs, a different temperature each time (K, plain numbers)."""
    return [
        ("GET", f"{prefix}/v1/properties/saturation?temperature={t:.2f}", None)
        for t in np.linspace(280.0, 370.0, 181)
    ]


def _batch(points: int) -> list[Call]:
    values = np.linspace(280.0, 370.0, points).round(4).tolist()
    return [("POST", "/v1/properties/saturation", {"temperature": {"values": values, "unit": "K"}})]


def _in_process_batch(points: int) -> float:
    """CPU seconds of the core's saturation lookup plus orjson of its arrays, best of 5."""
    from service.core.properties.lookups import saturation_lookup

    temperature = np.linspace(280.0, 370.0, points).round(4)
    best = float("inf")
    for _ in range(5):
        start = time.process_time()
        states = saturation_lookup(temperature=temperature).states
        orjson.dumps(
            {
                "pressure": states.pressure,
                "liquid": dataclasses.asdict(states.liquid),
                "vapor": dataclasses.asdict(states.vapor),
                "latent_heat": states.latent_heat_of_vaporization,
            },
            option=orjson.OPT_SERIALIZE_NUMPY,
        )
        best = min(best, time.process_time() - start)
    return best


def _verdict(ratio: float, goal: float) -> str:
    return "meets" if ratio <= goal else "MISSES"


def _profile() -> None:
    """cProfile of the one-point lookup through the whole app, in process: plain ASGI calls
    (no HTTP client in the profile), sorted by cumulative time."""
    import asyncio

    from service.api.app import create_app

    app = create_app()

    async def receive() -> dict[str, Any]:
        return {"type": "http.request", "body": b"", "more_body": False}

    async def send(message: MutableMapping[str, Any]) -> None:
        if message["type"] == "http.response.start" and message["status"] != 200:
            raise RuntimeError(f"status {message['status']}")

    def scope(temperature: float) -> dict[str, Any]:
        return {
            "type": "http",
            "asgi": {"version": "3.0"},
            "http_version": "1.1",
            "method": "GET",
            "scheme": "http",
            "path": "/v1/properties/saturation",
            "raw_path": b"/v1/properties/saturation",
            "query_string": f"temperature={temperature:.2f}".encode(),
            "root_path": "",
            "headers": [(b"host", b"bench"), (b"accept", b"application/json")],
            "client": ("127.0.0.1", 50000),
            "server": ("127.0.0.1", 8000),
            "state": {},
        }

    async def run(count: int) -> None:
        for index in range(count):
            await app(scope(280.0 + (index % 181) * 0.5), receive, send)

    async def main() -> None:
        async with app.router.lifespan_context(app):
            await run(100)
            profiler = cProfile.Profile()
            profiler.enable()
            await run(1000)
            profiler.disable()
            text = io.StringIO()
            order = os.environ.get("TRIPOINT_BENCH_SORT", "cumulative")
            stats = pstats.Stats(profiler, stream=text).sort_stats(order)
            stats.print_stats(40)
            print(text.getvalue())

    asyncio.run(main())


def _workers_throughput(seconds: float = _WORKERS_SECONDS) -> None:
    """Requests per second of one-point lookups from 16 keep-alive connections, for
    ``--workers 1`` and ``--workers 2`` (``loopback.drive``: wrk when installed)."""
    shapes = [Request(method, path, body) for method, path, body in _lookups()]
    rates: dict[int, float] = {}
    for workers in (1, 2):
        command = [sys.executable, "-m", "service", "--workers", str(workers)]
        with running_server(command) as server:
            drive(server.base_url, shapes, concurrency=16, seconds=2)  # every worker warm
            result = drive(server.base_url, shapes, concurrency=16, seconds=seconds)
        rates[workers] = result.per_second
        print(
            f"  --workers {workers}: {result.per_second:8.0f} requests/s, median "
            f"{result.median * 1e3:.1f} ms, p99 {result.p99 * 1e3:.1f} ms, "
            f"{result.errors} errors ({result.generator})"
        )
    print(f"--workers 2 / --workers 1 throughput: {rates[2] / rates[1]:.2f}")
    print(f"(on {os.cpu_count()} cores shared with the load generator)")


def main() -> int:
    """Measure every scenario, print the table and the three goals."""
    if "--profile" in sys.argv:
        _profile()
        return 0
    if "--workers" in sys.argv:
        _workers_throughput()
        return 0
    balance: Call = ("POST", "/v1/balances/flash-freeze", {"initial_temperature": "20 degC"})
    # (row, server, calls, requests per run, gzip): measured in turn, run after run, so that
    # a change in the machine's load between runs touches every row alike.
    scenarios: list[tuple[str, str, list[Call], int, bool]] = [
        ("bare Starlette route", "starlette", [("GET", "/health", None)], _REQUESTS, False),
        ("raw ASGI floor lookup", "asgi", _lookups(), _REQUESTS, False),
        ("tripoint /health", "tripoint", [("GET", "/health", None)], _REQUESTS, False),
        ("tripoint lookup, 1 point (GET)", "tripoint", _lookups(), _REQUESTS, False),
        ("tripoint lookup, 1,000 points (POST)", "tripoint", _batch(1000), _REQUESTS // 30, False),
        ("tripoint flash-freeze balance (POST)", "tripoint", [balance], _REQUESTS // 30, False),
        ("tripoint lookup, 10,000 points (POST)", "tripoint", _batch(10_000), 30, False),
        ("tripoint lookup, 10,000 points (POST, gzip)", "tripoint", _batch(10_000), 30, True),
    ]
    rows: dict[str, float] = {name: float("inf") for name, *_ in scenarios}
    in_process = "in-process core + orjson, 10,000 points"
    rows[in_process] = float("inf")
    with contextlib.ExitStack() as stack:
        servers = {
            "starlette": stack.enter_context(running_server([*_FLOOR, "--kind", "starlette"])),
            "asgi": stack.enter_context(running_server([*_FLOOR, "--kind", "asgi"])),
            "tripoint": stack.enter_context(running_server()),
        }
        clients = {
            (kind, gzip): stack.enter_context(_client(server.base_url, gzip=gzip))
            for kind, server in servers.items()
            for gzip in (False, True)
        }
        for _, kind, calls, _, gzip in scenarios:
            _warm(clients[kind, gzip], calls)
        for _ in range(_RUNS):
            for name, kind, calls, count, gzip in scenarios:
                seconds = _server_cpu_per_request(
                    clients[kind, gzip], servers[kind].pid, calls, max(count, 20)
                )
                rows[name] = min(rows[name], seconds)
            rows[in_process] = min(rows[in_process], _in_process_batch(10_000))
    print(
        f"server CPU per request (best of {_RUNS} runs, rows measured in turn in each run; "
        "one keep-alive connection):"
    )
    for name, seconds in rows.items():
        print(f"  {name:<42} {seconds * 1e6:12.0f} us")
    health = rows["tripoint /health"] / rows["bare Starlette route"]
    lookup = rows["tripoint lookup, 1 point (GET)"] / rows["raw ASGI floor lookup"]
    batch = (
        rows["tripoint lookup, 10,000 points (POST)"]
        / rows["in-process core + orjson, 10,000 points"]
    )
    for label, ratio, goal in (
        ("/health / bare Starlette route", health, HEALTH_GOAL),
        ("1-point lookup / raw ASGI floor", lookup, LOOKUP_GOAL),
        ("10,000-point batch / in-process core + orjson", batch, BATCH_GOAL),
    ):
        print(f"{label}: {ratio:.2f} (goal <= {goal:g}) {_verdict(ratio, goal)}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
