"""Load: 64 concurrent clients for 60 s on loopback; errors and the server's memory.

Run ``python bench/bench_load.py``. Starts the real server (``python -m service``, one
worker, records in a temporary SQLite file), warms it for 5 s, then drives it for
``TRIPOINT_LOAD_SECONDS`` (default 60) from 64 keep-alive connections with a mix of
requests sent round robin: ``/health``, GET saturation and state lookups at varying
temperatures, a 100-point POST saturation batch, and flash-freeze and
evaporative-cooling balances (each stores a calculation record). Meanwhile it samples the
server's resident memory (``VmRSS`` in /proc/<pid>/status) once a second.

Goals: 0 errors (any status >= 400, timeout or broken connection); memory flat (the
last sample within 10 % of the first taken under load).
"""

from __future__ import annotations

import os
import threading
import time

from loopback import Request, drive, load_generator, resident_memory_kib, running_server

CONNECTIONS = 64
SECONDS = float(os.environ.get("TRIPOINT_LOAD_SECONDS", "60"))
FLAT_TOLERANCE = 0.10


def _mix() -> list[Request]:
    shapes: list[Request] = []
    for step in range(40):
        celsius = 1.0 + 2.0 * step
        shapes += [
            Request("GET", "/health"),
            Request("GET", f"/v1/properties/saturation?temperature={celsius:g}%20degC"),
            Request(
                "GET",
                f"/v1/properties/state?temperature={celsius:g}%20degC&pressure=101.325%20kPa",
            ),
            Request(
                "POST",
                "/v1/properties/saturation",
                {
                    "temperature": {
                        "values": [celsius + 0.5 * k for k in range(100)],
                        "unit": "degC",
                    }
                },
            ),
            Request(
                "POST",
                "/v1/balances/flash-freeze",
                {"initial_temperature": f"{celsius:g} degC", "water_mass": "0.5 kg"},
            ),
            Request(
                "POST",
                "/v1/balances/evaporative-cooling",
                {
                    "product_mass": "100 kg",
                    "initial_temperature": f"{celsius + 5:g} degC",
                    "final_temperature": "1 degC",
                    "specific_heat": "3.9 kJ/(kg*K)",
                },
            ),
        ]
    return shapes


def main() -> None:
    """Warm up, load for SECONDS while sampling memory, print the verdicts."""
    mix = _mix()
    with running_server() as server:
        print(f"load generator: {load_generator()}; {CONNECTIONS} connections; {SECONDS:g} s")
        warm = drive(server.base_url, mix, concurrency=CONNECTIONS, seconds=5)
        samples: list[tuple[float, int]] = []
        done = threading.Event()

        def sample() -> None:
            began = time.monotonic()
            while not done.is_set():
                samples.append((time.monotonic() - began, resident_memory_kib(server.pid)))
                done.wait(1.0)

        sampler = threading.Thread(target=sample, daemon=True)
        sampler.start()
        result = drive(server.base_url, mix, concurrency=CONNECTIONS, seconds=SECONDS)
        done.set()
        sampler.join()
    start, end = samples[0][1], samples[-1][1]
    peak = max(kib for _, kib in samples)
    growth = (end - start) / start
    print(f"warm-up: {warm.requests} requests, {warm.errors} errors")
    print(
        f"requests: {result.requests} in {result.seconds:.1f} s ({result.per_second:.0f}/s); "
        f"median {result.median * 1e3:.1f} ms, p99 {result.p99 * 1e3:.1f} ms"
    )
    print(f"errors: {result.errors} ({'meets' if result.errors == 0 else 'MISSES'} goal 0)")
    print(
        f"server RSS: start {start / 1024:.1f} MiB, end {end / 1024:.1f} MiB, "
        f"max {peak / 1024:.1f} MiB over {len(samples)} samples; growth {growth:+.1%} "
        f"({'flat' if abs(growth) <= FLAT_TOLERANCE else 'NOT flat'}, "
        f"tolerance {FLAT_TOLERANCE:.0%})"
    )


if __name__ == "__main__":
    main()
