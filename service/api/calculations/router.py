"""Calculation records: fetch one by id, list them with filters and pagination."""

from __future__ import annotations

import re
from datetime import UTC, datetime
from typing import Annotated, Any

from fastapi import APIRouter, Path, Query, Request
from pydantic import BeforeValidator

from service.api.calculations.schemas import (
    CalculationListPublic,
    CalculationPublic,
    CalculationSummaryPublic,
)
from service.api.http.limits import RecordRoute
from service.api.http.problems import FieldError, ProblemError, problem_responses
from service.api.http.recording import RecordKeeper
from service.records import InvalidCursorError, RecordSummary, StoreUnavailableError

router = APIRouter(prefix="/v1/calculations", tags=["calculations"], route_class=RecordRoute)

_MAX_PAGE = 1000


def _keeper(request: Request) -> RecordKeeper:
    keeper: RecordKeeper = request.app.state.records
    return keeper


def _unavailable(error: StoreUnavailableError) -> ProblemError:
    return ProblemError(
        503,
        "records-unavailable",
        "Record store unavailable",
        "The calculation records cannot be read right now; retry later.",
        headers={"Retry-After": "5"},
    )


_PLAIN_NUMBER = re.compile(r"\s*[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?\s*")


def _iso_8601_only(value: object) -> object:
    """Refuse a bare number, which pydantic would read as a Unix timestamp."""
    if isinstance(value, int | float) or (
        isinstance(value, str) and _PLAIN_NUMBER.fullmatch(value)
    ):
        raise ValueError("expected an ISO 8601 time such as 2024-05-01T12:00:00Z, not a number")
    return value


IsoTime = Annotated[datetime, BeforeValidator(_iso_8601_only)]


def _aware(moment: datetime | None, field: str) -> datetime | None:
    """Read a time without an offset as UTC; a time UTC cannot represent is a 422."""
    if moment is None:
        return None
    if moment.tzinfo is None:
        return moment.replace(tzinfo=UTC)
    try:
        return moment.astimezone(UTC)
    except OverflowError:
        detail = f"{field} lies outside the times UTC can represent (years 1 to 9999)"
        raise ProblemError(
            422,
            "invalid-time",
            "Invalid time",
            detail,
            [FieldError(field=field, message=detail, value=moment.isoformat())],
        ) from None


def _own_key_only(request: Request) -> str | None:
    """The caller's key id when records are kept per key (setting
    TRIPOINT_RECORDS_OWN_KEY_ONLY with keys on), else None."""
    if not request.app.state.settings.records_own_key_only:
        return None
    key_id: str | None = getattr(request.state, "api_key_id", None)
    return key_id


def _summary(item: RecordSummary) -> dict[str, Any]:
    return {
        "calculation_id": item.calculation_id,
        "kind": item.kind,
        "created_at": item.created_at,
        "service_version": item.service_version,
        "key_id": item.key_id,
    }


@router.get(
    "/{calculation_id}",
    operation_id="get_calculation",
    response_model=CalculationPublic,
    responses=problem_responses(404, 503),
    summary="One stored calculation: inputs, answer, versions",
)
def get_calculation(
    request: Request,
    calculation_id: Annotated[
        str, Path(max_length=64, description="`meta.calculation_id` of an answer.")
    ],
) -> Any:
    """The record of one balance or simulation answer: the inputs as sent, the answer as
    returned, the service and formulation versions, the time and the API key id."""
    try:
        record = _keeper(request).store.get(calculation_id)
    except StoreUnavailableError as error:
        raise _unavailable(error) from None
    own = _own_key_only(request)
    if record is not None and own is not None and record.key_id != own:
        record = None  # another key's record: as if it did not exist
    if record is None:
        raise ProblemError(
            404,
            "calculation-not-found",
            "No such calculation",
            f"No calculation {calculation_id!r} is stored: the id is wrong, the record was "
            "removed after the retention period, or its answer said it was not stored.",
            [FieldError(field="calculation_id", message="not found", value=calculation_id)],
        )
    return {
        **_summary(record.summary()),
        "formulations": record.formulations,
        "inputs": record.inputs,
        "result": record.result,
    }


@router.get(
    "",
    operation_id="list_calculations",
    response_model=CalculationListPublic,
    responses=problem_responses(422, 503),
    summary="Stored calculations, newest first, filtered and paged",
)
def list_calculations(
    request: Request,
    kind: Annotated[str | None, Query(description="Only this kind.")] = None,
    key_id: Annotated[str | None, Query(description="Only those made with this key id.")] = None,
    since: Annotated[
        IsoTime | None,
        Query(description="Only those made at or after this time (ISO 8601; no offset = UTC)."),
    ] = None,
    until: Annotated[
        IsoTime | None,
        Query(description="Only those made before this time (ISO 8601; no offset = UTC)."),
    ] = None,
    limit: Annotated[int, Query(ge=1, le=_MAX_PAGE, description="Page size.")] = 100,
    cursor: Annotated[
        str | None, Query(max_length=200, description="`next_cursor` of the previous page.")
    ] = None,
) -> Any:
    """Summaries (id, kind, time, versions, key id) of stored calculations. Fetch one with
    `GET /v1/calculations/{calculation_id}` for its inputs and answer."""
    own = _own_key_only(request)
    if own is not None:
        if key_id is not None and key_id != own:
            return CalculationListPublic(items=[], next_cursor=None)
        key_id = own
    try:
        page = _keeper(request).store.list_records(
            kind=kind,
            key_id=key_id,
            since=_aware(since, "since"),
            until=_aware(until, "until"),
            limit=limit,
            cursor=cursor,
        )
    except InvalidCursorError as error:
        raise ProblemError(
            422,
            "invalid-cursor",
            "Invalid cursor",
            str(error),
            [FieldError(field="cursor", message=str(error), value=cursor)],
        ) from None
    except StoreUnavailableError as error:
        raise _unavailable(error) from None
    return CalculationListPublic(
        items=[CalculationSummaryPublic(**_summary(item)) for item in page.items],
        next_cursor=page.next_cursor,
    )
