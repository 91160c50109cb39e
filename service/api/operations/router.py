"""Liveness, readiness and metrics: what a load balancer and Prometheus ask."""

from __future__ import annotations

import functools
import logging

import anyio
import anyio.to_thread
import orjson
from fastapi import APIRouter, Request
from starlette.responses import Response

from service import __version__
from service.api.http.problems import ProblemError, problem_responses
from service.api.http.recording import RecordKeeper
from service.api.http.strict_query import StrictQueryRoute
from service.api.operations.schemas import HealthPublic, ReadyPublic
from service.records import StoreUnavailableError

router = APIRouter(tags=["operations"], route_class=StrictQueryRoute)

_READY_TIMEOUT_SECONDS = 5.0
_log = logging.getLogger("tripoint.ready")


@functools.cache
def _health_body() -> bytes:
    """The liveness answer, rendered once: it never changes while the process runs."""
    answer = HealthPublic(status="ok", service_version=__version__)
    return orjson.dumps(answer.model_dump(mode="json", by_alias=True))


@router.get("/health", operation_id="get_health", response_model=HealthPublic)
async def get_health() -> Response:
    """Liveness: the process is up and answering. Never needs a key."""
    return Response(content=_health_body(), media_type="application/json")


def _check(keeper: RecordKeeper) -> int:
    keeper.store.ping()
    return keeper.store.schema_version()


@router.get(
    "/ready",
    operation_id="get_ready",
    response_model=ReadyPublic,
    responses=problem_responses(503),
    summary="Readiness: the calculation record store is reachable",
)
async def get_ready(request: Request) -> ReadyPublic:
    """200 when the record store answers and its tables are in place, else 503.
    Never needs a key."""
    keeper: RecordKeeper = request.app.state.records
    reason = ""
    version = 0
    try:
        with anyio.fail_after(_READY_TIMEOUT_SECONDS):
            version = await anyio.to_thread.run_sync(_check, keeper, abandon_on_cancel=True)
    except StoreUnavailableError as error:
        reason = str(error)
    except TimeoutError:
        reason = f"no answer within {_READY_TIMEOUT_SECONDS:g} s"
    if reason:
        _log.warning("not ready", extra={"fields": {"reason": reason}})
        raise ProblemError(
            503,
            "not-ready",
            "Not ready",
            "The calculation record store is not reachable; see the service log.",
            headers={"Retry-After": "5"},
        )
    return ReadyPublic(
        status="ready",
        service_version=__version__,
        records_schema_version=version,
    )


@router.get(
    "/metrics",
    operation_id="get_metrics",
    summary="Prometheus metrics",
    response_class=Response,
    responses={200: {"content": {"text/plain": {}}, "description": "Prometheus text format."}},
)
async def get_metrics(request: Request) -> Response:
    """Requests, errors and latency per route, calculations by kind, in the Prometheus text
    format. Open without a key: it carries counts, never inputs or answers."""
    content, media_type = request.app.state.metrics.exposition()
    return Response(content=content, media_type=media_type)
