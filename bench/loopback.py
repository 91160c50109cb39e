"""Shared by the HTTP benches: the real server on loopback, a load generator, the machine.

- :func:`running_server` starts ``python -m service`` (or another command) on a free
  127.0.0.1 port with its records in a temporary SQLite file, and stops it (SIGTERM)
  afterwards.
- :func:`drive` sends a fixed list of requests, round robin, from ``concurrency``
  keep-alive connections for a bounded time: with Debian's ``wrk`` when it is on the PATH
  (a C load generator that leaves the cores to the server), otherwise with an async httpx
  client (which competes with the server for the same cores: pessimistic figures).
- :func:`machine_description` says what the figures were measured on.

Everything talks to 127.0.0.1 only; every loop is bounded in count and time.
"""

from __future__ import annotations

import asyncio
import json
import os
import platform
import shutil
import socket
import statistics
import subprocess
import sys
import tempfile
import time
from collections.abc import Iterator, Sequence
from contextlib import contextmanager
from dataclasses import dataclass
from pathlib import Path
from typing import Any

import httpx
import numpy as np

__all__ = [
    "LoadResult",
    "Request",
    "Server",
    "drive",
    "load_generator",
    "machine_description",
    "resident_memory_kib",
    "running_server",
]

_START_SECONDS = 60.0


@dataclass(frozen=True)
class Request:
    """One request shape: method, path with its query string, optional JSON body."""

    method: str
    path: str
    body: dict[str, Any] | None = None


@dataclass(frozen=True)
class Server:
    """A started server: its base URL and process id."""

    base_url: str
    pid: int


@dataclass(frozen=True)
class LoadResult:
    """What one load run measured; latencies in seconds."""

    requests: int
    seconds: float
    median: float
    p99: float
    errors: int
    generator: str

    @property
    def per_second(self) -> float:
        """Requests completed per second."""
        return self.requests / self.seconds


def _free_port() -> int:
    with socket.socket() as probe:
        probe.bind(("127.0.0.1", 0))
        port: int = probe.getsockname()[1]
        return port


@contextmanager
def running_server(command: Sequence[str] | None = None, **environment: str) -> Iterator[Server]:
    """Run ``python -m service`` on loopback until the block ends; ``TRIPOINT_*`` overrides.

    ``command`` replaces ``python -m service`` (it gets ``--host`` and ``--port`` appended).
    """
    folder = Path(tempfile.mkdtemp(prefix="tripoint-bench-"))
    port = _free_port()
    settings = {
        "TRIPOINT_LOG_LEVEL": "warning",
        "TRIPOINT_DATABASE_URL": f"sqlite:///{folder / 'records.sqlite3'}",
        **environment,
    }
    process = subprocess.Popen(
        [
            *(command or [sys.executable, "-m", "service"]),
            "--host",
            "127.0.0.1",
            "--port",
            str(port),
        ],
        env={**os.environ, **settings},
        stdout=subprocess.DEVNULL,
        stderr=subprocess.DEVNULL,
    )
    base_url = f"http://127.0.0.1:{port}"
    try:
        deadline = time.monotonic() + _START_SECONDS
        while True:
            try:
                if httpx.get(f"{base_url}/health", timeout=1).status_code == 200:
                    break
            except httpx.HTTPError:
                pass
            if process.poll() is not None or time.monotonic() > deadline:
                raise RuntimeError("the server did not start")
            time.sleep(0.1)
        yield Server(base_url, process.pid)
    finally:
        process.terminate()
        try:
            process.wait(timeout=40)
        except subprocess.TimeoutExpired:
            process.kill()
            process.wait()
        shutil.rmtree(folder, ignore_errors=True)


def load_generator() -> str:
    """``"wrk"`` when Debian's wrk is on the PATH, else ``"httpx"``."""
    return "wrk" if shutil.which("wrk") else "httpx"


def drive(
    base_url: str,
    requests: Sequence[Request],
    *,
    concurrency: int,
    seconds: float,
    generator: str | None = None,
) -> LoadResult:
    """Send ``requests`` round robin from ``concurrency`` connections for ``seconds``.

    A response with a status of 400 or above, a timeout or a broken connection counts as
    an error.
    """
    chosen = generator or load_generator()
    if chosen == "wrk":
        return _drive_wrk(base_url, requests, concurrency, seconds)
    return asyncio.run(_drive_httpx(base_url, requests, concurrency, seconds))


def _lua_string(text: str) -> str:
    level = "=" * 4
    if f"]{level}]" in text:
        raise ValueError("request text contains the Lua long-bracket terminator")
    return f"[{level}[{text}]{level}]"


def _wrk_script(requests: Sequence[Request]) -> str:
    lines = ["local requests = {}"]
    for number, request in enumerate(requests, start=1):
        if request.body is None:
            lines.append(
                f"requests[{number}] = wrk.format({_lua_string(request.method)}, "
                f"{_lua_string(request.path)}, nil, nil)"
            )
        else:
            body = json.dumps(request.body, separators=(",", ":"))
            lines.append(
                f"requests[{number}] = wrk.format({_lua_string(request.method)}, "
                f"{_lua_string(request.path)}, "
                '{["Content-Type"] = "application/json"}, '
                f"{_lua_string(body)})"
            )
    lines += [
        "local counter = 0",
        "request = function()",
        "  counter = counter + 1",
        "  return requests[(counter - 1) % #requests + 1]",
        "end",
        "done = function(summary, latency, requests)",
        "  local e = summary.errors",
        '  io.write(string.format(\'RESULT {"requests": %d, "duration_us": %d, \''
        ' .. \'"errors": %d, "median_us": %f, "p99_us": %f}\\n\',',
        "    summary.requests, summary.duration,",
        "    e.connect + e.read + e.write + e.status + e.timeout,",
        "    latency:percentile(50), latency:percentile(99)))",
        "end",
    ]
    return "\n".join(lines) + "\n"


def _drive_wrk(
    base_url: str, requests: Sequence[Request], concurrency: int, seconds: float
) -> LoadResult:
    with tempfile.NamedTemporaryFile("w", suffix=".lua", delete=False) as script:
        script.write(_wrk_script(requests))
    try:
        completed = subprocess.run(
            [
                "wrk",
                "--threads",
                "1",
                "--connections",
                str(concurrency),
                "--duration",
                f"{max(1, round(seconds))}s",
                "--timeout",
                "30s",
                "--script",
                script.name,
                base_url,
            ],
            capture_output=True,
            text=True,
            check=True,
            timeout=seconds + 60,
        )
    finally:
        os.unlink(script.name)
    line = next(row for row in completed.stdout.splitlines() if row.startswith("RESULT "))
    found = json.loads(line.removeprefix("RESULT "))
    return LoadResult(
        requests=int(found["requests"]),
        seconds=found["duration_us"] / 1e6,
        median=found["median_us"] / 1e6,
        p99=found["p99_us"] / 1e6,
        errors=int(found["errors"]),
        generator="wrk 1 thread",
    )


async def _drive_httpx(
    base_url: str, requests: Sequence[Request], concurrency: int, seconds: float
) -> LoadResult:
    latencies: list[float] = []
    errors = 0
    stop = time.monotonic() + seconds
    limits = httpx.Limits(max_connections=concurrency, max_keepalive_connections=concurrency)
    async with httpx.AsyncClient(base_url=base_url, limits=limits, timeout=30) as client:

        async def worker(offset: int) -> None:
            nonlocal errors
            turn = offset
            while time.monotonic() < stop:
                shape = requests[turn % len(requests)]
                turn += 1
                start = time.perf_counter()
                try:
                    response = await client.request(shape.method, shape.path, json=shape.body)
                    failed = response.status_code >= 400
                except httpx.HTTPError:
                    failed = True
                latencies.append(time.perf_counter() - start)
                errors += failed

        began = time.perf_counter()
        await asyncio.gather(*(worker(number) for number in range(concurrency)))
        elapsed = time.perf_counter() - began
    ordered = np.sort(np.array(latencies))
    return LoadResult(
        requests=len(latencies),
        seconds=elapsed,
        median=float(statistics.median(latencies)),
        p99=float(ordered[min(ordered.size - 1, int(0.99 * ordered.size))]),
        errors=errors,
        generator="httpx async client",
    )


def resident_memory_kib(pid: int) -> int:
    """The process's resident set size (``VmRSS`` in /proc/<pid>/status), KiB."""
    for line in Path(f"/proc/{pid}/status").read_text().splitlines():
        if line.startswith("VmRSS:"):
            return int(line.split()[1])
    raise RuntimeError(f"no VmRSS for process {pid}")


def machine_description() -> str:
    """Cores, CPU model, Python, numpy and the load generator, on one line each."""
    model = "unknown"
    cpuinfo = Path("/proc/cpuinfo")
    if cpuinfo.exists():
        for line in cpuinfo.read_text().splitlines():
            if line.startswith("model name"):
                model = line.split(":", 1)[1].strip()
                break
    usable = len(os.sched_getaffinity(0)) if hasattr(os, "sched_getaffinity") else os.cpu_count()
    wrk = shutil.which("wrk")
    wrk_version = "absent (httpx fallback)"
    if wrk:
        version = subprocess.run([wrk, "--version"], capture_output=True, text=True, check=False)
        wrk_version = (version.stdout or version.stderr).splitlines()[0].split(" Copyright")[0]
    return "\n".join(
        [
            f"- cores usable (nproc): {usable}",
            f"- CPU model (/proc/cpuinfo): {model}",
            f"- OS: {platform.platform()}",
            f"- Python: {platform.python_version()} ({platform.python_implementation()})",
            f"- numpy: {np.__version__}",
            f"- load generator: {wrk_version}",
        ]
    )
