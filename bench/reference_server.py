"""The service with one reference route more, for the HTTP bench's decomposition.

``python bench/reference_server.py --host 127.0.0.1 --port N`` runs the application that
``python -m service`` runs (``create_app()``, uvicorn with the same options, one worker)
with ``GET /v1/reference/fixed-answer`` added: it answers the bytes of the file named by
``BENCH_FIXED_ANSWER_FILE`` (a saturation answer the real service gave) through the
same middleware, router and response machinery, and computes nothing. Its latency beside
``/health``'s is what routing, the /v1 middleware and a 4 kB answer cost; the real lookup
beside it is what reading the query, the computation and shaping the answer cost.

Bench use only: the route is not part of the service.
"""

from __future__ import annotations

import argparse
import os
from pathlib import Path

import uvicorn
from fastapi.routing import APIRouter
from starlette.responses import Response

from service.api.app import create_app
from service.api.http.limits import TimeLimitedRoute
from service.api.http.observability import logging_config

ANSWER_VARIABLE = "BENCH_FIXED_ANSWER_FILE"
"""Names the file whose bytes the reference route answers."""


def main() -> None:
    """Build the app, add the reference route, run uvicorn as ``python -m service`` does."""
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("--host", default="127.0.0.1")
    parser.add_argument("--port", type=int, required=True)
    arguments = parser.parse_args()
    body = Path(os.environ[ANSWER_VARIABLE]).read_bytes()
    router = APIRouter(prefix="/v1/reference", route_class=TimeLimitedRoute)

    @router.get("/fixed-answer", include_in_schema=False)
    async def fixed_answer() -> Response:
        return Response(body, media_type="application/json")

    app = create_app()
    app.include_router(router)
    level = os.environ.get("TRIPOINT_LOG_LEVEL", "warning")
    uvicorn.run(
        app,
        host=arguments.host,
        port=arguments.port,
        log_level=level,
        log_config=logging_config(level),
        access_log=False,
        timeout_graceful_shutdown=30,
    )


if __name__ == "__main__":
    main()
