"""Application factory: ``create_app(settings)`` wires routers, errors, limits and operations."""

from __future__ import annotations

import asyncio
import contextlib
import logging
from collections.abc import AsyncIterator, Collection, Sequence
from typing import Any

import anyio.to_thread
from fastapi import FastAPI
from fastapi.openapi.utils import get_openapi
from fastapi.telemetry import TelemetryConfig
from starlette.middleware.cors import CORSMiddleware

from service import __version__
from service.api.balances import router as balances
from service.api.calculations import router as calculations
from service.api.calibrations import router as calibrations
from service.api.drying import router as drying
from service.api.http.body_media import document_body_problems
from service.api.http.caching import Validators, document_caching
from service.api.http.compression import Compression
from service.api.http.contract import document_contract
from service.api.http.csv_io import CsvAdapter, CsvRoute, document_csv
from service.api.http.direct_routes import DirectRoutes
from service.api.http.docs_assets import install_offline_docs
from service.api.http.examples import (
    add_examples_to_openapi,
    default_examples_folder,
    load_examples,
)
from service.api.http.limits import BodySizeLimit, document_time_limit
from service.api.http.observability import Metrics, RequestObservation
from service.api.http.problems import document_validation_problems, install_problem_handlers
from service.api.http.quantities import read_quantity
from service.api.http.recording import RecordKeeper
from service.api.http.responses import FastJSONResponse
from service.api.http.security import ApiKeyGuard, document_security
from service.api.http.semantics import HttpSemantics, RouteTable, document_negotiation
from service.api.http.shared_enums import share_enums
from service.api.http.units import Dimension
from service.api.operations import router as operations
from service.api.properties import router as properties
from service.api.simulations import router as simulations
from service.api.sizing import router as sizing
from service.api.solutions import router as solutions
from service.api.sources import router as sources
from service.core.properties.lookups import saturation_point_lookup
from service.records import RecordStore, StoreUnavailableError
from service.settings import Settings, get_settings

__all__ = ["CSV_ROUTES", "DIRECT_ROUTES", "EXPOSED_HEADERS", "create_app"]

_log = logging.getLogger("tripoint.app")

CSV_ROUTES = (
    CsvRoute("/v1/properties/"),
    CsvRoute("/v1/balances/", one_call_per_row=True),
    CsvRoute("/v1/simulations/", one_call_per_row=True, answer_part="series"),
    CsvRoute("/v1/design-spaces/", one_call_per_row=True, answer_part="cells"),
)
"""Routes that take ``text/csv`` bodies and give ``text/csv`` answers (see csv_io)."""

DIRECT_ROUTES = (
    "/health",
    "/v1/properties/saturation",
    "/v1/properties/sublimation",
    "/v1/properties/melting",
    "/v1/properties/state",
    "/v1/properties/constants",
)
"""GET routes served past the router (see direct_routes): the liveness check and the
one-point lookups, whose computation costs less than FastAPI's routing around it."""

COMPRESSION_MINIMUM_BYTES = 1024
"""Answers this long or longer are gzip-coded for clients that accept gzip."""

LOOKUP_PREFIX = "/v1/properties/"
"""GET requests under this prefix are deterministic lookups: ETag, Cache-Control, 304."""


def _is_lookup(path: str) -> bool:
    return path.startswith(LOOKUP_PREFIX)


EXPOSED_HEADERS = ["X-Request-ID", "X-Calculation-ID", "ETag"]
"""Answer headers a browser script may read under CORS (a plot's record id among them)."""

_NO_TELEMETRY: TelemetryConfig = {"tracing": False, "metrics": False, "logs": False}

_DESCRIPTION = """
Water, ice and vapor phase-change energy calculations for vacuum cooling,
flash-freezing and sublimation, on IAPWS formulations.

Every dimensional input takes a number in its default SI unit (K, Pa, kg, J, s), a
string with a unit (`"25 degC"`, `"2 kPa"`), `{"value": x, "unit": "..."}` or, for a
batch, `{"values": [...], "unit": "..."}`. All pressures are absolute. Results come as
`{"value"|"values": ..., "unit": ...}` in the unit set chosen by `output_units`.
Errors are RFC 9457 `application/problem+json` documents naming the field, the
value and the valid range.

Property lookups also take `text/csv` bodies (one case per row, units in the header:
`temperature[degC]`) and answer in CSV for `Accept: text/csv`. When the service has API
keys, every `/v1` route needs `Authorization: Bearer <key>`.
"""


def _warm_up() -> None:
    """Build the per-process caches a first request would otherwise pay for (about 0.3 s):
    the unit registry, the saturation tables and their one-point form."""
    read_quantity("25 degC", field="temperature", dimension=Dimension.TEMPERATURE)
    saturation_point_lookup(temperature=300.0)


@contextlib.asynccontextmanager
async def _lifespan(app: FastAPI) -> AsyncIterator[None]:
    settings: Settings = app.state.settings
    keeper: RecordKeeper = app.state.records
    if settings.api_keys:
        _log.info(
            "API keys on: /v1 routes need 'Authorization: Bearer <key>'",
            extra={"fields": {"keys": len(settings.api_keys)}},
        )
    else:
        _log.warning(
            "API keys off: every /v1 route is open (set TRIPOINT_API_KEYS to require keys)"
        )
    _log.info(
        "calculation records",
        extra={
            "fields": {
                "database": keeper.store.display_url,
                "retention_days": settings.retention_days,
                "store_failure_policy": settings.store_failure_policy,
            }
        },
    )
    try:
        await anyio.to_thread.run_sync(keeper.store.ensure_schema)
    except StoreUnavailableError as error:
        # Keep serving: /ready answers 503 and each answer says it was not stored.
        _log.error("record store not ready at startup", extra={"fields": {"reason": str(error)}})
    else:
        await keeper.prune_logged()  # expired records are gone before the first request
    await anyio.to_thread.run_sync(_warm_up)
    pruning = asyncio.create_task(keeper.keep_pruning())
    try:
        yield
    finally:
        pruning.cancel()
        with contextlib.suppress(asyncio.CancelledError):
            await pruning
        pending: set[asyncio.Task[Any]] = app.state.pending_computations
        if pending:
            await asyncio.wait(set(pending), timeout=30)
        keeper.store.close()


def create_app(
    settings: Settings | None = None,
    *,
    store: RecordStore | None = None,
    csv_routes: Sequence[CsvRoute] = CSV_ROUTES,
    direct_routes: Collection[str] = DIRECT_ROUTES,
) -> FastAPI:
    """Build the ASGI application.

    Parameters
    ----------
    settings
        Settings to run with; ``None`` reads ``TRIPOINT_*`` environment variables.
    store
        Calculation-record store; ``None`` opens ``settings.database_url``.
    csv_routes
        Routes that speak CSV (tests add their own).
    direct_routes
        GET routes served past the router (tests compare the two paths with none).
    """
    settings = settings or get_settings()
    app = FastAPI(
        title="tripoint",
        version=__version__,
        description=_DESCRIPTION,
        default_response_class=FastJSONResponse,
        docs_url=None,
        redoc_url=None,
        lifespan=_lifespan,
        # The service observes itself (observability.py: Prometheus metrics, JSON logs);
        # FastAPI's own OpenTelemetry hooks would only look for providers on every request.
        telemetry=_NO_TELEMETRY,
    )
    metrics = Metrics()
    app.state.settings = settings
    app.state.metrics = metrics
    app.state.pending_computations = set()
    app.state.records = RecordKeeper(
        store or RecordStore(settings.database_url),
        policy=settings.store_failure_policy,
        retention_days=settings.retention_days,
        metrics=metrics,
    )
    install_problem_handlers(app)
    install_offline_docs(app)
    app.include_router(operations.router)
    app.include_router(properties.router)
    app.include_router(solutions.router)
    app.include_router(balances.router)
    app.include_router(simulations.router)
    app.include_router(drying.router)
    app.include_router(calibrations.router)
    app.include_router(sizing.router)
    app.include_router(calculations.router)
    app.include_router(sources.router)

    # Added inner to outer: the last one added sees the request first.
    app.add_middleware(
        DirectRoutes,
        routes=lambda: app.routes,
        paths=direct_routes,
        exception_handlers=lambda: app.exception_handlers,
    )
    app.add_middleware(
        CsvAdapter,
        routes=csv_routes,
        max_rows=settings.max_csv_rows,
        seconds=settings.max_request_seconds,
        pending=app.state.pending_computations,
    )
    app.add_middleware(BodySizeLimit, max_bytes=settings.max_body_bytes)
    app.add_middleware(
        Validators,
        version=__version__,
        cacheable=_is_lookup,
        shared=not settings.api_keys,
    )
    app.add_middleware(ApiKeyGuard, keys=[key.get_secret_value() for key in settings.api_keys])
    app.add_middleware(Compression, minimum_bytes=COMPRESSION_MINIMUM_BYTES)
    routes = RouteTable(
        lambda: app.routes,
        lambda template: any(route.matches(template) for route in csv_routes),
    )
    app.state.route_table = routes
    app.add_middleware(HttpSemantics, table=routes)
    if settings.cors_origins:
        app.add_middleware(
            CORSMiddleware,
            allow_origins=settings.cors_origins,
            allow_methods=["GET", "HEAD", "POST"],
            allow_headers=[
                "Authorization",
                "Content-Type",
                "Accept",
                "X-Request-ID",
                "If-None-Match",
            ],
            expose_headers=EXPOSED_HEADERS,
            allow_credentials=False,
            max_age=600,
        )
    app.add_middleware(RequestObservation, metrics=metrics, routes=routes)

    examples = load_examples(default_examples_folder())

    def openapi() -> dict[str, Any]:
        if app.openapi_schema is None:
            schema = get_openapi(
                title=app.title,
                version=app.version,
                description=app.description,
                routes=app.routes,
            )
            document_contract(schema)
            document_csv(schema, csv_routes)
            document_negotiation(schema)
            document_body_problems(schema)
            document_caching(schema, _is_lookup)
            document_validation_problems(schema)
            add_examples_to_openapi(schema, examples)  # after: refusals go into the 422s
            document_time_limit(schema, settings.max_request_seconds)
            if settings.api_keys:
                document_security(schema)
            share_enums(schema)
            app.openapi_schema = schema
        return app.openapi_schema

    app.openapi = openapi  # type: ignore[method-assign]
    return app
