"""Benchmark: a sizing answer against forward simulations; a sweep against sequential calls.

Both measured side by side in one run, through the whole application in-process
(``fastapi.testclient.TestClient``: routing, validation, JSON, the calculation record in
a temporary SQLite file), on the bakery case of ``openapi_examples/``:

- one ``POST /v1/sizing/vacuum-chamber`` for the pump speed (goal: at most 15 times one
  ``POST /v1/simulations/vacuum-chamber`` of the same case);
- one 64-case sweep of the pump speed, ``TRIPOINT_SIMULATION_WORKERS=2`` (goal: at most
  0.65 times 64 sequential calls of the simulation endpoint). The pool is started and
  warmed before timing, as it is in a running server after its first sweep.

Not a test; run alone with ``.venv/bin/python bench/bench_sizing.py``.
"""

from __future__ import annotations

import copy
import json
import os
import statistics
import tempfile
import time
from collections.abc import Callable
from pathlib import Path
from typing import Any

from fastapi.testclient import TestClient

from service.api.app import create_app
from service.settings import Settings

_EXAMPLE = (
    Path(__file__).resolve().parent.parent
    / "openapi_examples"
    / "sizing-bakery-pump-for-five-minutes.json"
)
_SIZING = "/v1/sizing/vacuum-chamber"
_SIMULATION = "/v1/simulations/vacuum-chamber"
_CASES = 64


def _median_s(function: Callable[[], object], repeats: int) -> float:
    times = []
    for _ in range(repeats):
        start = time.perf_counter()
        function()
        times.append(time.perf_counter() - start)
    return statistics.median(times)


def _ok(response: Any) -> Any:
    if response.status_code != 200:
        raise RuntimeError(f"{response.status_code}: {response.text[:300]}")
    return response


def main() -> None:
    sizing: dict[str, Any] = json.loads(_EXAMPLE.read_text())["request"]
    case: dict[str, Any] = {**sizing["case"], "target_temperature": "25 degC"}
    speeds = [1000.0 + 1500.0 * index / (_CASES - 1) for index in range(_CASES)]
    sweep = copy.deepcopy(case)
    sweep["pump"]["nominal_speed"] = {"values": speeds, "unit": "m3/h"}
    singles = []
    for speed in speeds:
        single = copy.deepcopy(case)
        single["pump"]["nominal_speed"] = f"{speed} m3/h"
        singles.append(single)
    with tempfile.TemporaryDirectory() as folder:
        settings = Settings(
            database_url=f"sqlite:///{folder}/records.sqlite3",
            simulation_workers=2,
            max_request_seconds=600.0,
        )
        with TestClient(create_app(settings)) as client:
            _ok(client.post(_SIMULATION, json=case))
            _ok(
                client.post(
                    _SIMULATION,
                    json={
                        **sweep,
                        "pump": {
                            **sweep["pump"],
                            "nominal_speed": {"values": speeds[:4], "unit": "m3/h"},
                        },
                    },
                )
            )  # warm the pool
            answer = client.post(_SIZING, json=sizing).json()
            forward = _median_s(lambda: _ok(client.post(_SIMULATION, json=case)), 15)
            sized = _median_s(lambda: _ok(client.post(_SIZING, json=sizing)), 5)
            sequential = _median_s(
                lambda: [_ok(client.post(_SIMULATION, json=body)) for body in singles], 3
            )
            swept = _median_s(lambda: _ok(client.post(_SIMULATION, json=sweep)), 3)
    sizing_ratio = sized / forward
    sweep_ratio = swept / sequential
    print(f"machine: {os.cpu_count()} logical cores (shared; ratios only)")
    print(f"one forward simulation (HTTP, in-process):    {forward * 1e3:8.1f} ms")
    print(
        f"one sizing answer ({answer['simulations']} simulations run):     {sized * 1e3:8.1f} ms"
        f"   ratio {sizing_ratio:5.2f}  (goal <= 15: {'meets' if sizing_ratio <= 15 else 'MISSES'})"
    )
    print(f"{_CASES} sequential simulation calls:             {sequential:8.2f} s")
    print(
        f"one {_CASES}-case sweep on 2 workers:             {swept:8.2f} s"
        f"    ratio {sweep_ratio:5.2f}  (goal <= 0.65: "
        f"{'meets' if sweep_ratio <= 0.65 else 'MISSES'})"
    )


if __name__ == "__main__":
    main()
