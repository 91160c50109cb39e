"""Benchmark: how many bytes an answer takes, compact (the default) and with ``detail=full``.

Goals (issue 14, not timed tests):

- a one-temperature saturation lookup (``GET /v1/properties/saturation?temperature=20
  degC``) <= 1.5 kB (1,536 B) by default;
- a 1,000-row saturation CSV answer (a CSV body of 1,000 temperatures, ``Accept:
  text/csv``) <= 300 kB (300,000 B), its statements stated once, not per row.

Sizes are of the body as sent, without and with gzip (``Accept-Encoding: gzip``; the
service codes answers of 1 kB or more); the goal is judged on the uncoded body, which is
what a client without gzip receives (the gzip verdict is printed beside it). The whole
application runs in-process through ``TestClient`` with records in a temporary SQLite
file. Not a test; run alone with ``.venv/bin/python bench/bench_answer_size.py``.
"""

from __future__ import annotations

import sys
import tempfile
from pathlib import Path
from typing import Any

from fastapi.testclient import TestClient

# This checkout's service package, whatever else the environment has installed (an editable
# install may point at another checkout), as in bench_request_path.
sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from service.api.app import create_app
from service.settings import Settings

_LOOKUP_GOAL = 1536
_CSV_GOAL = 300_000
_ROWS = 1000


def _sizes(client: TestClient, method: str, path: str, **options: Any) -> tuple[int, int]:
    """Bytes of the body without and with gzip."""
    headers = dict(options.pop("headers", {}))
    plain = client.request(
        method, path, headers={**headers, "accept-encoding": "identity"}, **options
    )
    assert plain.status_code == 200, plain.text[:300]
    coded = client.request(method, path, headers={**headers, "accept-encoding": "gzip"}, **options)
    # httpx decodes gzip; the coded size is what came over the wire.
    wire = int(coded.headers.get("content-length", len(coded.content)))
    return len(plain.content), wire


def _verdict(size: int, goal: int) -> str:
    return "meets" if size <= goal else "MISSES"


def main() -> None:
    folder = Path(tempfile.mkdtemp(prefix="tripoint-bench-"))
    settings = Settings(database_url=f"sqlite:///{folder / 'records.sqlite3'}")
    temperatures = [0.01 + 0.0999 * index for index in range(_ROWS)]
    table = "temperature[degC]\n" + "\n".join(f"{value:.4f}" for value in temperatures) + "\n"
    csv_headers = {"content-type": "text/csv", "accept": "text/csv"}
    with TestClient(create_app(settings)) as client:
        lookup = "/v1/properties/saturation?temperature=20%20degC"
        rows = [
            ("saturation at 20 degC, compact", _sizes(client, "GET", lookup), _LOOKUP_GOAL),
            (
                "saturation at 20 degC, detail=full",
                _sizes(client, "GET", lookup + "&detail=full"),
                None,
            ),
            (
                f"{_ROWS}-row saturation CSV, compact",
                _sizes(
                    client, "POST", "/v1/properties/saturation", content=table, headers=csv_headers
                ),
                _CSV_GOAL,
            ),
            (
                f"{_ROWS}-row saturation CSV, detail=full",
                _sizes(
                    client,
                    "POST",
                    "/v1/properties/saturation?detail=full",
                    content=table,
                    headers=csv_headers,
                ),
                None,
            ),
            (
                f"{_ROWS}-point saturation batch, JSON, compact",
                _sizes(
                    client,
                    "POST",
                    "/v1/properties/saturation",
                    json={"temperature": {"values": temperatures, "unit": "degC"}},
                ),
                None,
            ),
            ("GET /v1/sources (every statement)", _sizes(client, "GET", "/v1/sources"), None),
        ]
    print("answer sizes (body bytes; identity -> gzip):")
    for name, (plain, packed), goal in rows:
        verdict = (
            ""
            if goal is None
            else f"   goal <= {goal} B: {_verdict(plain, goal)} (gzip: {_verdict(packed, goal)})"
        )
        print(f"  {name:44s} {plain:9d} B -> {packed:8d} B{verdict}")


if __name__ == "__main__":
    main()
