"""HTTP latency and throughput on loopback, measured side by side in one run.

Run ``python bench/bench_http.py``. Starts the real server (``python -m service``)
on a free loopback port, then drives it with an async httpx client:

- median and p99 latency and requests/s at concurrency 1, 16 and 64 for ``/health``,
  a saturation lookup and a flash-freeze balance;
- a 10,000-point saturation batch over HTTP (JSON both ways) against CoolProp's
  in-process vectorized ``PropsSI`` calls for the same points and properties.

The client runs on the same two cores as the server, so absolute figures are
pessimistic; the ratios are what the goals are stated in. Every loop is bounded in
count and time and talks to 127.0.0.1 only.
"""

from __future__ import annotations

import asyncio
import os
import socket
import statistics
import subprocess
import sys
import time
from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

import httpx
import numpy as np

SECONDS_PER_SCENARIO = float(os.environ.get("TRIPOINT_BENCH_SECONDS", "4"))
CONCURRENCY = (1, 16, 64)
BATCH_POINTS = 10_000


@dataclass(frozen=True)
class Scenario:
    """One request shape to repeat."""

    name: str
    method: str
    path: str
    params: dict[str, str] | None = None
    body: dict[str, Any] | None = None


SCENARIOS = (
    Scenario("health", "GET", "/health"),
    Scenario("saturation lookup", "GET", "/v1/properties/saturation", {"temperature": "300"}),
    Scenario(
        "flash-freeze balance",
        "POST",
        "/v1/balances/flash-freeze",
        body={"initial_temperature": "20 degC", "water_mass": "1 kg"},
    ),
)


def _free_port() -> int:
    with socket.socket() as probe:
        probe.bind(("127.0.0.1", 0))
        port: int = probe.getsockname()[1]
        return port


def _start_server(port: int) -> subprocess.Popen[bytes]:
    environment = {**os.environ, "TRIPOINT_LOG_LEVEL": "warning"}
    server = subprocess.Popen(
        [sys.executable, "-m", "service", "--host", "127.0.0.1", "--port", str(port)],
        env=environment,
        stdout=subprocess.DEVNULL,
        stderr=subprocess.DEVNULL,
    )
    deadline = time.monotonic() + 30
    while time.monotonic() < deadline:
        try:
            if httpx.get(f"http://127.0.0.1:{port}/health", timeout=1).status_code == 200:
                return server
        except httpx.HTTPError:
            time.sleep(0.1)
    server.kill()
    raise RuntimeError("server did not start")


async def _load(base: str, scenario: Scenario, concurrency: int) -> tuple[list[float], int, float]:
    latencies: list[float] = []
    errors = 0
    stop = time.monotonic() + SECONDS_PER_SCENARIO
    limits = httpx.Limits(max_connections=concurrency, max_keepalive_connections=concurrency)
    async with httpx.AsyncClient(base_url=base, limits=limits, timeout=30) as client:

        async def worker() -> None:
            nonlocal errors
            while time.monotonic() < stop:
                start = time.perf_counter()
                response = await client.request(
                    scenario.method, scenario.path, params=scenario.params, json=scenario.body
                )
                latencies.append(time.perf_counter() - start)
                if response.status_code != 200:
                    errors += 1

        began = time.perf_counter()
        await asyncio.gather(*(worker() for _ in range(concurrency)))
        elapsed = time.perf_counter() - began
    return latencies, errors, elapsed


def _percentile(values: list[float], fraction: float) -> float:
    ordered = sorted(values)
    return ordered[min(len(ordered) - 1, int(fraction * len(ordered)))]


def _best(function: Callable[[], object], repeats: int) -> float:
    times = []
    for _ in range(repeats):
        start = time.perf_counter()
        function()
        times.append(time.perf_counter() - start)
    return statistics.median(times)


def _coolprop_batch(temperature: np.ndarray[Any, np.dtype[np.float64]]) -> float | None:
    try:
        from CoolProp.CoolProp import PropsSI
    except ImportError:
        return None

    def run() -> None:
        PropsSI("P", "T", temperature, "Q", 0.0, "Water")
        for quality in (0.0, 1.0):
            for output in ("D", "H", "U", "S", "C"):
                PropsSI(output, "T", temperature, "Q", quality, "Water")

    run()
    return _best(run, repeats=5)


def main() -> None:
    """Run every scenario and print the table and the ratios."""
    port = _free_port()
    server = _start_server(port)
    base = f"http://127.0.0.1:{port}"
    medians: dict[tuple[str, int], float] = {}
    try:
        print(
            f"{'scenario':24} {'conc':>4} {'median ms':>10} {'p99 ms':>8} {'req/s':>8} {'err':>4}"
        )
        for scenario in SCENARIOS:
            for concurrency in CONCURRENCY:
                latencies, errors, elapsed = asyncio.run(_load(base, scenario, concurrency))
                median = statistics.median(latencies)
                medians[(scenario.name, concurrency)] = median
                print(
                    f"{scenario.name:24}{concurrency:>10}{median * 1e3:>10.2f}"
                    f"{_percentile(latencies, 0.99) * 1e3:>10.2f}"
                    f"{len(latencies) / elapsed:>10.0f}{errors:>10}"
                )
        for concurrency in CONCURRENCY:
            ratio = medians[("saturation lookup", concurrency)] / medians[("health", concurrency)]
            print(f"lookup median / health median at concurrency {concurrency}: {ratio:.2f}")

        temperature = np.linspace(275.0, 640.0, BATCH_POINTS)
        body = {"temperature": temperature.tolist()}
        with httpx.Client(base_url=base, timeout=60) as client:
            client.post("/v1/properties/saturation", json=body).raise_for_status()
            http_batch = _best(
                lambda: client.post("/v1/properties/saturation", json=body).json(), repeats=7
            )
        coolprop = _coolprop_batch(temperature)
        print(
            f"10,000-point saturation batch over HTTP (JSON both ways): {http_batch * 1e3:.1f} ms"
        )
        if coolprop is None:
            print("CoolProp not installed: no ratio")
        else:
            print(
                f"CoolProp PropsSI, same points and properties, in-process: {coolprop * 1e3:.1f} ms"
            )
            print(f"HTTP batch / CoolProp in-process: {http_batch / coolprop:.3f}")
    finally:
        server.terminate()
        server.wait(timeout=30)


if __name__ == "__main__":
    main()
