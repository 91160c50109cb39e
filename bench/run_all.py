"""Run every benchmark in this folder and write docs/benchmarks.md (``make bench``).

Each benchmark prints its own ratios, measured side by side against its references in
one run. Nothing here asserts a time; the numbers are for reading. The HTTP benches use
Debian's ``wrk`` as load generator: when it is missing and this runs as root on a
Debian-like system, it is installed with ``apt-get install wrk``; otherwise they fall
back to an async httpx client (which shares the cores with the server).

``--no-write`` prints without touching docs/benchmarks.md.
"""

from __future__ import annotations

import os
import shutil
import subprocess
import sys
import time
from datetime import UTC, datetime
from pathlib import Path

_FOLDER = Path(__file__).resolve().parent
_DOCUMENT = _FOLDER.parent / "docs" / "benchmarks.md"

_PREAMBLE = """# Benchmarks

Measured by `make bench` (which runs `.venv/bin/python bench/run_all.py`); this file is
written by that command. Every figure is a ratio or a comparison measured side by side in
the same run, because the machines are noisy: compare the columns of one table, not the
tables of two runs. The HTTP benches start the real server (`python -m service`, one
worker process) on 127.0.0.1 and drive it with Debian's `wrk` (`make bench` installs it
with `apt-get install wrk` when missing and run as root; without it they fall back to an
async httpx client, which competes with the server for the same cores).

Goals (from the issues):

- saturation states: >= 1 million per second per core on 10,000-point arrays, against the
  iapws package (IAPWS-95 and IF97, per point) and CoolProp's vectorized calls;
- one integrated flash-freeze in-process <= 1 ms, against the same integration done
  naively on iapws calls;
- HTTP: a saturation lookup's median latency <= 1.3 x `/health`'s at the same
  concurrency; a 10,000-point saturation batch over HTTP (JSON both ways) <= 0.5 x
  CoolProp's in-process vector call for the same points and properties;
- load: 64 concurrent clients for 60 s, 0 errors, server memory flat;
- request path (server CPU per request, one keep-alive connection): `/health` <= 2 x a
  bare Starlette route; a one-point saturation lookup <= 1.5 x a raw ASGI floor (query,
  core lookup, orjson); a 10,000-point JSON batch <= 1.3 x the in-process core call plus
  orjson;
- answer size (bytes, not time): a one-temperature saturation lookup <= 1.5 kB by default;
  a 1,000-row saturation CSV answer <= 300 kB, its statements stated once.

Each script prints "meets" or "MISSES" beside its goal.
"""


def _ensure_wrk() -> None:
    if shutil.which("wrk") or not shutil.which("apt-get"):
        return
    if hasattr(os, "geteuid") and os.geteuid() != 0:
        print("wrk is not installed (apt-get install wrk): HTTP benches use httpx", flush=True)
        return
    print("installing wrk (apt-get install wrk) for the HTTP benches", flush=True)
    subprocess.run(
        ["apt-get", "install", "-y", "-qq", "wrk"],
        check=False,
        env={**os.environ, "DEBIAN_FRONTEND": "noninteractive"},
        stdout=subprocess.DEVNULL,
    )


def _run(script: Path) -> tuple[int, str, float]:
    """Run one bench, echoing its output; return exit code, output and seconds."""
    started = time.perf_counter()
    process = subprocess.Popen(
        [sys.executable, str(script)],
        stdout=subprocess.PIPE,
        stderr=subprocess.STDOUT,
        text=True,
        cwd=_FOLDER.parent,
    )
    assert process.stdout is not None
    lines = []
    for line in process.stdout:
        print(line, end="", flush=True)
        lines.append(line)
    return process.wait(), "".join(lines), time.perf_counter() - started


def main() -> int:
    """Run ``bench_*.py`` in sorted order, write the document; return the worst exit code."""
    _ensure_wrk()
    sys.path.insert(0, str(_FOLDER))
    from loopback import machine_description

    sections = []
    worst = 0
    for script in sorted(_FOLDER.glob("bench_*.py")):
        print(f"\n=== {script.name} ===", flush=True)
        code, output, seconds = _run(script)
        worst = max(worst, code)
        status = "" if code == 0 else f" (exit status {code})"
        sections.append(
            f"## {script.name}{status}\n\n{_first_paragraph(script)}\n\n"
            f"Run alone: `.venv/bin/python bench/{script.name}` ({seconds:.0f} s here).\n\n"
            f"```text\n{output.rstrip()}\n```\n"
        )
    if "--no-write" not in sys.argv:
        moment = datetime.now(UTC).strftime("%Y-%m-%d %H:%M UTC")
        _DOCUMENT.parent.mkdir(parents=True, exist_ok=True)
        _DOCUMENT.write_text(
            f"{_PREAMBLE}\n## Machine and run\n\n- command: `make bench`\n- run: {moment}\n"
            f"{machine_description()}\n\n" + "\n".join(sections)
        )
        print(f"\nwrote {_DOCUMENT}")
    return worst


def _first_paragraph(script: Path) -> str:
    """The first paragraph of the script's docstring, as its description."""
    text = script.read_text()
    quote = text.find('"""')
    body = text[quote + 3 : text.find('"""', quote + 3)]
    return body.strip().split("\n\n")[0].replace("\n", " ")


if __name__ == "__main__":
    raise SystemExit(main())
