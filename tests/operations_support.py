"""Helpers for the operations tests: an app with test-only routes, the PostgreSQL target.

The test routes stand in for the balance routes: they build an answer with the standard
envelope and store it with ``record_calculation``, exactly as a balance route does.
"""

from __future__ import annotations

import threading
import time
from collections.abc import Iterator
from contextlib import contextmanager
from pathlib import Path
from typing import Any

from fastapi import APIRouter, Request
from fastapi.testclient import TestClient
from server_support import POSTGRES_URL, postgres_schema

from service.api.app import CSV_ROUTES, create_app
from service.api.http.csv_io import CsvRoute
from service.api.http.envelope import envelope
from service.api.http.limits import TimeLimitedRoute
from service.api.http.models import ApiModel, QuantityInput
from service.api.http.quantities import quantity_output, read_quantity
from service.api.http.recording import record_calculation
from service.api.http.responses import FastJSONResponse
from service.api.http.units import Dimension, UnitSet
from service.core.properties.advisories import Advisory
from service.core.properties.sources import IAPWS_95
from service.records import RecordStore
from service.settings import Settings

__all__ = [
    "KEY",
    "NAPS",
    "NAP_SECONDS",
    "OTHER_KEY",
    "POSTGRES_URL",
    "SLOW_RELEASE",
    "postgres_schema",
    "running_client",
]

KEY = "test-key-0123456789abcdef"
OTHER_KEY = "another-key-abcdefghijklmnop"
SLOW_RELEASE = threading.Event()
"""Set it to let the slow test route finish."""

_router = APIRouter(prefix="/v1/testing", route_class=TimeLimitedRoute)


class RecordedCreate(ApiModel):
    """Body of the stand-in balance route."""

    temperature: QuantityInput
    note: str | None = None
    output_units: UnitSet = UnitSet.SI


@_router.post("/recorded", operation_id="testing_recorded")
def recorded(request: Request, body: RecordedCreate) -> Any:
    """Answer with the temperature and the envelope, and store the record."""
    parsed = read_quantity(body.temperature, field="temperature", dimension=Dimension.TEMPERATURE)
    advisories = []
    if body.note == "warn-first":
        advisories.append(Advisory("testing", "concerns the first case only", (0,)))
    result = {
        "temperature": quantity_output(
            parsed.si, Dimension.TEMPERATURE, body.output_units, as_array=parsed.is_array
        ),
        "note": body.note,
        **envelope(
            unit_set=body.output_units,
            assumptions=["Stand-in for a balance."],
            sources=[IAPWS_95],
            uncertainties=[],
            advisories=advisories,
        ),
    }
    return FastJSONResponse(record_calculation(request, "testing.recorded", body, result))


NAP_SECONDS = 0.1
"""How long the napping test route takes per call."""
NAPS: list[str | None] = []
"""The notes of the napping route's calls, in order (tests clear it)."""


@_router.post("/nap", operation_id="testing_nap")
def nap(body: RecordedCreate) -> Any:
    """Take NAP_SECONDS, then answer: a row of a CSV request that is slow only in sum."""
    NAPS.append(body.note)
    time.sleep(NAP_SECONDS)
    return {"note": body.note}


@_router.get("/slow", operation_id="testing_slow")
def slow() -> Any:
    """Run until released (at most 10 s): a computation that overruns its time."""
    SLOW_RELEASE.wait(10)
    return {"done": True}


@contextmanager
def running_client(
    folder: Path, *, store: RecordStore | None = None, **overrides: Any
) -> Iterator[TestClient]:
    """A started app (lifespan run) with the test routes, records in ``folder``.

    ``/v1/testing/`` speaks CSV one call per row, as the balance routes do.
    """
    settings = Settings(
        database_url=f"sqlite:///{folder / 'records.sqlite3'}",
        **overrides,
    )
    app = create_app(
        settings,
        store=store,
        csv_routes=(*CSV_ROUTES, CsvRoute("/v1/testing/", one_call_per_row=True)),
    )
    app.include_router(_router)
    with TestClient(app) as client:
        yield client
