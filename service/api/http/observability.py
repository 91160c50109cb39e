"""Request ids, one JSON log line per request, and Prometheus metrics.

- ``X-Request-ID``: a sane incoming value is kept, otherwise one is made; either way it is
  echoed on the response and put on every log line written while the request runs.
- Logs: one JSON object per line. The access line has the request id, method, route
  template, path, status, duration and API key id; never a header (so never a key), a
  query string or a body.
- Metrics (prometheus-client): requests and errors by route template, method and status; a
  latency histogram per route; calculations by kind and outcome; ``tripoint_build_info``
  (version, python). With several worker
  processes, set ``PROMETHEUS_MULTIPROC_DIR`` (``python -m service`` does it for you) and
  ``/metrics`` adds up every worker's numbers.
"""

from __future__ import annotations

import contextvars
import logging
import os
import platform
import re
import time
import traceback
from datetime import UTC, datetime
from typing import Any

import orjson
from prometheus_client import (
    CONTENT_TYPE_LATEST,
    CollectorRegistry,
    Counter,
    Gauge,
    Histogram,
    disable_created_metrics,
)
from prometheus_client import generate_latest as _generate_latest
from prometheus_client.multiprocess import MultiProcessCollector
from starlette.types import ASGIApp, Message, Receive, Scope, Send

from service import __version__
from service.api.http.request_head import request_head
from service.api.http.semantics import RouteTable

__all__ = [
    "MULTIPROCESS_ENVIRONMENT_VARIABLE",
    "JsonFormatter",
    "Metrics",
    "RequestObservation",
    "current_request_id",
    "logging_config",
    "route_template",
]

MULTIPROCESS_ENVIRONMENT_VARIABLE = "PROMETHEUS_MULTIPROC_DIR"
_REQUEST_ID_HEADER = b"x-request-id"
_SANE_REQUEST_ID = re.compile(r"^[A-Za-z0-9._:+/=-]{1,128}$")
_UNMATCHED = "unrouted"
_LATENCY_BUCKETS = (0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1.0, 2.5, 5.0, 10.0, 30.0, 60.0)

_MOST_CACHED_SERIES = 4096
"""Labelled request series kept at hand (routes x methods x statuses stays far below)."""

_RequestSeries = tuple[Counter, Histogram, Counter | None]

_request_id: contextvars.ContextVar[str | None] = contextvars.ContextVar(
    "tripoint_request_id", default=None
)
_access_log = logging.getLogger("tripoint.access")


def current_request_id() -> str | None:
    """The id of the request being served in this context, if any."""
    return _request_id.get()


class JsonFormatter(logging.Formatter):
    """One JSON object per line: time, level, logger, message, request id, extra fields.

    Extra fields come from ``extra={"fields": {...}}``.
    """

    def format(self, record: logging.LogRecord) -> str:
        entry: dict[str, Any] = {
            "time": datetime.fromtimestamp(record.created, UTC)
            .isoformat(timespec="milliseconds")
            .replace("+00:00", "Z"),
            "level": record.levelname.lower(),
            "logger": record.name,
            "process": record.process,
            "message": record.getMessage(),
        }
        request_id = _request_id.get()
        if request_id is not None:
            entry["request_id"] = request_id
        fields = getattr(record, "fields", None)
        if isinstance(fields, dict):
            entry.update(fields)
        if record.exc_info and record.exc_info[0] is not None:
            entry["exception"] = _bounded_exception(record.exc_info)
        for name, value in entry.items():
            if isinstance(value, str) and len(value) > _LONGEST_FIELD:
                entry[name] = f"{value[:_LONGEST_FIELD]}... ({len(value)} characters)"
        return orjson.dumps(entry, default=str).decode()


_LONGEST_FIELD = 4000
"""Characters kept of any one log field: one line stays a few KB whatever the request."""
_LONGEST_EXCEPTION_MESSAGE = 200
"""An exception message longer than this (it may hold an input) is logged by its length."""
_FRAMES = 20
"""Innermost traceback frames logged."""


def _bounded_exception(info: Any) -> str:
    """The traceback's innermost frames and the exception's type; its message only when
    short, since a message may quote what a client sent."""
    kind, error, trace = info
    frames = "".join(traceback.format_tb(trace)[-_FRAMES:])
    message = str(error)
    if len(message) > _LONGEST_EXCEPTION_MESSAGE:
        message = f"<message of {len(message)} characters not logged>"
    return f"{frames}{kind.__name__}: {message}".strip()


def logging_config(level: str) -> dict[str, Any]:
    """A ``logging.config.dictConfig`` document: everything as JSON lines on stderr.

    uvicorn's own access log is switched off; :class:`RequestObservation` writes one line
    per request instead.
    """
    upper = level.upper()
    return {
        "version": 1,
        "disable_existing_loggers": False,
        "formatters": {"json": {"()": f"{__name__}.JsonFormatter"}},
        "handlers": {
            "stderr": {
                "class": "logging.StreamHandler",
                "formatter": "json",
                "stream": "ext://sys.stderr",
            }
        },
        "loggers": {
            "tripoint": {"handlers": ["stderr"], "level": upper, "propagate": False},
            "uvicorn": {"handlers": ["stderr"], "level": upper, "propagate": False},
            "uvicorn.error": {"level": upper},
            "uvicorn.access": {"handlers": [], "level": "WARNING", "propagate": False},
        },
        "root": {"handlers": ["stderr"], "level": "WARNING"},
    }


def route_template(scope: Scope) -> str:
    """The path template of the route that served the request (``/v1/calculations/{...}``).

    Requests answered before routing without a route to name (no such path) share the
    label ``unrouted``, so scanning for URLs cannot blow up the metrics; a 401, 413 or 406
    answered before routing on a path that has a route is labelled with that route by
    :class:`RequestObservation`.
    """
    route = scope.get("route")
    path = getattr(route, "path", None)
    return path if isinstance(path, str) and path else _UNMATCHED


class Metrics:
    """The service's Prometheus metrics, in a registry of their own (one per app)."""

    def __init__(self) -> None:
        disable_created_metrics()  # type: ignore[no-untyped-call]  # no *_created series
        self.registry = CollectorRegistry()
        self.requests = Counter(
            "tripoint_http_requests",
            "HTTP requests answered, by route template, method and status.",
            ["route", "method", "status"],
            registry=self.registry,
        )
        self.errors = Counter(
            "tripoint_http_errors",
            "HTTP answers with a 4xx or 5xx status, by route template, method and status.",
            ["route", "method", "status"],
            registry=self.registry,
        )
        self.latency = Histogram(
            "tripoint_http_request_duration_seconds",
            "Time from request to the end of the answer, by route template and method.",
            ["route", "method"],
            buckets=_LATENCY_BUCKETS,
            registry=self.registry,
        )
        self.build = Gauge(
            "tripoint_build_info",
            "The service's version and the Python running it (always 1).",
            ["version", "python"],
            registry=self.registry,
            multiprocess_mode="max",
        )
        self.build.labels(__version__, platform.python_version()).set(1)
        self._series: dict[tuple[str, str, int], _RequestSeries] = {}
        self.calculations = Counter(
            "tripoint_calculations",
            "Calculations answered, by kind and whether their record was stored.",
            ["kind", "outcome"],
            registry=self.registry,
        )

    def observe_request(self, route: str, method: str, status: int, seconds: float) -> None:
        """Count one answered request."""
        key = (route, method, status)
        series = self._series.get(key)
        if series is None:
            series = self._request_series(route, method, status)
        requests, latency, errors = series
        requests.inc()
        latency.observe(seconds)
        if errors is not None:
            errors.inc()

    def _request_series(self, route: str, method: str, status: int) -> _RequestSeries:
        """The labelled series one (route, method, status) counts in, made once: looking
        them up by labels on every request cost more than counting."""
        label = str(status)
        series = (
            self.requests.labels(route, method, label),
            self.latency.labels(route, method),
            self.errors.labels(route, method, label) if status >= 400 else None,
        )
        if len(self._series) < _MOST_CACHED_SERIES:
            self._series[(route, method, status)] = series
        return series

    def count_calculation(self, kind: str, *, stored: bool) -> None:
        """Count one calculation and whether its record went into the store."""
        self.calculations.labels(kind, "stored" if stored else "not_stored").inc()

    def exposition(self) -> tuple[bytes, str]:
        """The Prometheus text and its media type; every worker's numbers when multiprocess."""
        directory = os.environ.get(MULTIPROCESS_ENVIRONMENT_VARIABLE)
        if directory:
            registry = CollectorRegistry()
            MultiProcessCollector(registry, path=directory)  # type: ignore[no-untyped-call]
            return _generate_latest(registry), CONTENT_TYPE_LATEST
        return _generate_latest(self.registry), CONTENT_TYPE_LATEST


class _RequestIds:
    """Random (version 4) UUIDs as 32 hex digits, as ``uuid.uuid4().hex`` makes them, from
    random bytes read 4 KiB at a time: one ``os.urandom`` per request cost more than the
    rest of the request's observation (profiled). A forked child starts a pool of its own,
    so two processes never hand out the same ids."""

    _BYTES = 16 * 256

    def __init__(self) -> None:
        self._pool = b""
        self._at = 0
        os.register_at_fork(after_in_child=self._forget)

    def _forget(self) -> None:
        self._pool = b""
        self._at = 0

    def __call__(self) -> str:
        at = self._at
        if at >= len(self._pool):
            self._pool = os.urandom(self._BYTES)
            at = 0
        self._at = at + 16
        value = int.from_bytes(self._pool[at : at + 16], "big")
        value = (value & _UUID_CLEARED) | _UUID_VERSION_4  # RFC 9562 Sec. 5.4: version, variant
        return f"{value:032x}"


_UUID_CLEARED = ~((0xC000 << 48) | (0xF000 << 64))
_UUID_VERSION_4 = (0x8000 << 48) | (4 << 76)
_new_request_id = _RequestIds()


def _incoming_request_id(scope: Scope) -> str | None:
    sent = request_head(scope).request_id
    if sent is None:
        return None
    text = sent.strip()
    return text if _SANE_REQUEST_ID.match(text) else None


def _set_request_id(start: Message, value: bytes) -> None:
    """Put ``X-Request-ID`` on an answer's start message as ``MutableHeaders`` would: in
    place of the first one already there (others dropped), else at the end."""
    headers = start.get("headers")
    headers = [] if headers is None else list(headers)
    start["headers"] = headers
    found = [index for index, (name, _) in enumerate(headers) if name == _REQUEST_ID_HEADER]
    if not found:
        headers.append((_REQUEST_ID_HEADER, value))
        return
    for index in reversed(found[1:]):
        del headers[index]
    headers[found[0]] = (_REQUEST_ID_HEADER, value)


class RequestObservation:
    """Outermost middleware: request id, access log line, request metrics."""

    def __init__(self, app: ASGIApp, metrics: Metrics, routes: RouteTable | None = None) -> None:
        self.app = app
        self.metrics = metrics
        self.routes = routes

    async def __call__(self, scope: Scope, receive: Receive, send: Send) -> None:
        if scope["type"] != "http":
            await self.app(scope, receive, send)
            return
        request_id = _incoming_request_id(scope) or _new_request_id()
        encoded_id = request_id.encode("latin-1")
        scope.setdefault("state", {})["request_id"] = request_id
        token = _request_id.set(request_id)
        started = time.perf_counter()
        status = 500

        async def send_with_id(message: Message) -> None:
            nonlocal status
            if message["type"] == "http.response.start":
                status = int(message["status"])
                _set_request_id(message, encoded_id)
            await send(message)

        try:
            await self.app(scope, receive, send_with_id)
        except BaseException:
            status = 500
            raise
        finally:
            seconds = time.perf_counter() - started
            route = route_template(scope)
            if route == _UNMATCHED and status != 404 and self.routes is not None:
                # Answered before routing (401, 413, 406): the path's template if it has one.
                found = self.routes.resolve(str(scope.get("path", "")))
                if found is not None:
                    route = found.template
            method = str(scope.get("method", ""))
            self.metrics.observe_request(route, method, status, seconds)
            if _access_log.isEnabledFor(logging.INFO):
                _access_log.info(
                    "request",
                    extra={
                        "fields": {
                            "request_id": request_id,
                            "method": method,
                            "route": route,
                            "path": scope.get("path"),
                            "status": status,
                            "duration_ms": round(seconds * 1000.0, 3),
                            "key_id": scope.get("state", {}).get("api_key_id"),
                        }
                    },
                )
            _request_id.reset(token)
