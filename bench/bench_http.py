"""HTTP latency and throughput on loopback, measured side by side in one run.

Run ``python bench/bench_http.py``. Starts the real server (``python -m service``, one
worker) on a free loopback port, then:

- drives it with ``wrk`` (Debian's C load generator; an async httpx client when wrk is
  absent) for median and p99 latency and requests/s at concurrency 1, 16 and 64 on
  ``/health``, a saturation lookup (GET, a different temperature from one request to the
  next, 199 in turn) and a flash-freeze balance (POST);
- compares the lookup's median with ``/health``'s at each concurrency (goal <= 1.3);
- splits that ratio on a second server (``reference_server.py``): ``/health``, a /v1 route
  answering a saved 4 kB saturation answer without computing, and the real lookup;
- times a 10,000-point saturation batch over HTTP (JSON both ways: the client encodes
  the request and decodes the answer, with orjson) against CoolProp's in-process
  vectorized ``PropsSI`` calls for the same points and properties (goal <= 0.5).

Server and load generator share the machine's cores; the ratios are what the goals are
stated in. ``TRIPOINT_BENCH_SECONDS`` sets the seconds per scenario (default 5).
"""

from __future__ import annotations

import os
import statistics
import sys
import tempfile
import time
from collections.abc import Callable, Sequence
from pathlib import Path
from typing import Any

import httpx
import numpy as np
import orjson
from loopback import LoadResult, Request, drive, load_generator, running_server
from reference_server import ANSWER_VARIABLE

SECONDS_PER_SCENARIO = float(os.environ.get("TRIPOINT_BENCH_SECONDS", "5"))
CONCURRENCY = (1, 16, 64)
BATCH_POINTS = 10_000
LOOKUP_GOAL = 1.3
BATCH_GOAL = 0.5

LOOKUP_TEMPERATURES = np.round(np.linspace(0.5, 99.5, 199), 1)
"""degC. The lookup scenario asks for these in turn: no two requests in a row alike."""

SCENARIOS: dict[str, list[Request]] = {
    "health": [Request("GET", "/health")],
    "saturation lookup": [
        Request("GET", f"/v1/properties/saturation?temperature={value:g}%20degC")
        for value in LOOKUP_TEMPERATURES
    ],
    "flash-freeze balance": [
        Request(
            "POST",
            "/v1/balances/flash-freeze",
            {"initial_temperature": "20 degC", "water_mass": "1 kg"},
        )
    ],
}
REFERENCE_CONCURRENCY = (1, 16)
REFERENCE_SERVER = [sys.executable, str(Path(__file__).resolve().parent / "reference_server.py")]


def _median_time(function: Callable[[], object], repeats: int) -> float:
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
    return _median_time(run, repeats=5)


def _http_batch(base_url: str, temperature: np.ndarray[Any, np.dtype[np.float64]]) -> float:
    body = orjson.dumps({"temperature": temperature.tolist()})
    headers = {"content-type": "application/json"}
    with httpx.Client(base_url=base_url, timeout=60) as client:

        def run() -> None:
            response = client.post("/v1/properties/saturation", content=body, headers=headers)
            response.raise_for_status()
            answer = orjson.loads(response.content)
            assert len(answer["liquid"]["density"]["values"]) == temperature.size

        run()
        return _median_time(run, repeats=9)


def _measure(base_url: str, name: str, shapes: Sequence[Request], concurrency: int) -> LoadResult:
    drive(base_url, shapes, concurrency=concurrency, seconds=1)  # warm up
    result = drive(base_url, shapes, concurrency=concurrency, seconds=SECONDS_PER_SCENARIO)
    _print_row(name, concurrency, result)
    return result


def _decomposition(answer: bytes) -> None:
    """Health, a fixed 4 kB /v1 answer and the real lookup, side by side on one server."""
    with tempfile.NamedTemporaryFile(suffix=".json", delete=False) as file:
        file.write(answer)
    try:
        with running_server(REFERENCE_SERVER, **{ANSWER_VARIABLE: file.name}) as server:
            print()
            print(
                "decomposition (bench/reference_server.py: the same app plus one route that "
                "answers a saved saturation answer, computing nothing)"
            )
            shapes = {
                "health": SCENARIOS["health"],
                "fixed 4 kB /v1 answer": [Request("GET", "/v1/reference/fixed-answer")],
                "saturation lookup": SCENARIOS["saturation lookup"],
            }
            for concurrency in REFERENCE_CONCURRENCY:
                measured = {
                    name: _measure(server.base_url, name, requests, concurrency).median
                    for name, requests in shapes.items()
                }
                health = measured["health"]
                print(
                    f"  concurrency {concurrency:>2}: fixed answer / health "
                    f"{measured['fixed 4 kB /v1 answer'] / health:.2f}, lookup / health "
                    f"{measured['saturation lookup'] / health:.2f}, lookup / fixed answer "
                    f"{measured['saturation lookup'] / measured['fixed 4 kB /v1 answer']:.2f}"
                )
    finally:
        os.unlink(file.name)


def _print_row(name: str, concurrency: int, result: LoadResult) -> None:
    print(
        f"{name:22} {concurrency:>4} {result.median * 1e3:>10.3f} {result.p99 * 1e3:>9.3f}"
        f" {result.per_second:>9.0f} {result.requests:>8} {result.errors:>5}"
    )


def main() -> None:
    """Run every scenario and print the table and the ratios."""
    results: dict[tuple[str, int], LoadResult] = {}
    with running_server() as server:
        print(f"load generator: {load_generator()}, {SECONDS_PER_SCENARIO:g} s per scenario")
        print(
            f"{'scenario':22} {'conc':>4} {'median ms':>10} {'p99 ms':>9} {'req/s':>9}"
            f" {'requests':>8} {'errs':>5}"
        )
        for concurrency in CONCURRENCY:
            for name, shapes in SCENARIOS.items():
                results[(name, concurrency)] = _measure(server.base_url, name, shapes, concurrency)
        print()
        for concurrency in CONCURRENCY:
            ratio = (
                results[("saturation lookup", concurrency)].median
                / results[("health", concurrency)].median
            )
            verdict = "meets" if ratio <= LOOKUP_GOAL else "MISSES"
            print(
                f"lookup median / health median, concurrency {concurrency:>2}: {ratio:.2f} "
                f"({verdict} goal <= {LOOKUP_GOAL})"
            )

        temperature = np.linspace(275.0, 640.0, BATCH_POINTS)
        http_batch = _http_batch(server.base_url, temperature)
        answer = httpx.get(server.base_url + SCENARIOS["saturation lookup"][0].path).content
    _decomposition(answer)
    coolprop = _coolprop_batch(temperature)
    print()
    print(
        f"10,000-point saturation batch over HTTP (JSON both ways), median: "
        f"{http_batch * 1e3:.1f} ms"
    )
    if coolprop is None:
        print("CoolProp not installed: no ratio")
        return
    print(
        f"CoolProp PropsSI, same points, 11 vectorized calls in-process, median: "
        f"{coolprop * 1e3:.1f} ms"
    )
    ratio = http_batch / coolprop
    verdict = "meets" if ratio <= BATCH_GOAL else "MISSES"
    print(f"HTTP batch / CoolProp in-process: {ratio:.3f} ({verdict} goal <= {BATCH_GOAL})")


if __name__ == "__main__":
    main()
