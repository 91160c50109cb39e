"""Reference servers for the request-path bench: what a request costs without tripoint.

``python bench/floor_servers.py --kind starlette|asgi --host 127.0.0.1 --port N`` runs, on
the same uvicorn options as ``python -m service`` (one worker, no access log):

- ``starlette``: a bare Starlette app, ``GET /health`` answering ``{"status": "ok"}`` by
  ``JSONResponse`` (what any route of the framework costs);
- ``asgi``: a raw ASGI callable that reads ``temperature`` (K) from the query string, calls
  the core's one-point saturation lookup and writes the states with orjson; ``/health`` as
  above (the floor of a saturation lookup: parsing, physics and serialization only).

Bench use only.
"""

from __future__ import annotations

import argparse
from typing import Any
from urllib.parse import parse_qs

import orjson
import uvicorn
from starlette.applications import Starlette
from starlette.requests import Request
from starlette.responses import JSONResponse
from starlette.routing import Route

from service.core.properties.lookups import saturation_point_lookup

_HEALTH = orjson.dumps({"status": "ok"})
_HEADERS = [(b"content-type", b"application/json")]


def starlette_app() -> Starlette:
    """A bare Starlette application with one JSON route."""

    async def health(request: Request) -> JSONResponse:
        return JSONResponse({"status": "ok"})

    return Starlette(routes=[Route("/health", health)])


async def asgi_floor(scope: dict[str, Any], receive: Any, send: Any) -> None:
    """Raw ASGI: query -> core saturation lookup -> orjson; nothing else."""
    if scope["type"] != "http":
        return
    if scope["path"] == "/health":
        body = _HEALTH
    else:
        query = parse_qs(scope["query_string"].decode("latin-1"))
        point = saturation_point_lookup(temperature=float(query["temperature"][0])).states
        body = orjson.dumps(
            {
                "temperature": {"value": point.temperature, "unit": "K"},
                "pressure": {"value": point.pressure, "unit": "Pa"},
                "liquid_density": {"value": point.liquid.density, "unit": "kg/m3"},
                "vapor_density": {"value": point.vapor.density, "unit": "kg/m3"},
                "latent_heat": {"value": point.latent_heat_of_vaporization, "unit": "J/kg"},
            }
        )
    await send({"type": "http.response.start", "status": 200, "headers": _HEADERS})
    await send({"type": "http.response.body", "body": body})


def main() -> None:
    """Run the chosen reference app on uvicorn as ``python -m service`` runs tripoint."""
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("--kind", choices=("starlette", "asgi"), required=True)
    parser.add_argument("--host", default="127.0.0.1")
    parser.add_argument("--port", type=int, required=True)
    arguments = parser.parse_args()
    app: Any = starlette_app() if arguments.kind == "starlette" else asgi_floor
    uvicorn.run(
        app, host=arguments.host, port=arguments.port, log_level="warning", access_log=False
    )


if __name__ == "__main__":
    main()
