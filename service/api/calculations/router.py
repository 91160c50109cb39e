"""Calculation records: fetch one by id, list them with filters and pagination."""

from __future__ import annotations

import re
from datetime import UTC, datetime
from typing import Annotated, Any

from fastapi import APIRouter, Path, Query, Request
from pydantic import BeforeValidator
from starlette.responses import Response

from service.api.calculations.renderings import media_types_of, render
from service.api.calculations.schemas import (
    KIND_DESCRIPTION,
    CalculationListPublic,
    CalculationPublic,
    RecordKind,
)
from service.api.http.csv_io import CSV_MEDIA_TYPE, CSV_RESPONSE_TYPE
from service.api.http.limits import RecordRoute
from service.api.http.negotiation import JSON_MEDIA_TYPE, choose_media_type, not_acceptable
from service.api.http.problems import FieldError, ProblemError, problem_responses
from service.api.http.record_labels import MAX_TAGS, Label, Tag
from service.api.http.recording import RecordKeeper
from service.api.http.responses import FastJSONResponse
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


def _time_text(moment: datetime) -> str:
    """ISO 8601 in UTC with ``Z``, as pydantic writes an aware time."""
    return moment.astimezone(UTC).isoformat().replace("+00:00", "Z")


def _summary(item: RecordSummary) -> dict[str, Any]:
    return {
        "calculation_id": item.calculation_id,
        "kind": item.kind,
        "created_at": _time_text(item.created_at),
        "service_version": item.service_version,
        "key_id": item.key_id,
        "label": item.label,
        "tags": list(item.tags),
        "headline": item.headline or {},
    }


def _next_link(request: Request, cursor: str) -> str:
    """The ``Link`` header of a page that has a next one (RFC 8288): this request's path
    and query with the cursor replaced, as a reference relative to the request."""
    following = request.url.include_query_params(cursor=cursor)
    target = following.path + (f"?{following.query}" if following.query else "")
    return f'<{target}>; rel="next"'


_STORED_RESPONSES: dict[int | str, dict[str, Any]] = {
    200: {
        "description": "The record as JSON by default. By `Accept`, the stored answer as its "
        "route answered it: `text/csv` for the balances, simulations and design spaces (the "
        "same columns the route sent), a plot (`image/svg+xml`, `image/png`) for a chamber "
        "simulation, a primary-drying run or design space and a sizing, drawn again from the "
        "stored numbers; `X-Calculation-ID` names the record. A type the record's kind was "
        "never answered in (a plot of a balance or sweep; CSV or a plot of a calibration) "
        "is a 406 naming the types it has.",
        "content": {
            CSV_MEDIA_TYPE: {"schema": {"type": "string"}},
            "image/svg+xml": {"schema": {"type": "string"}},
            "image/png": {"schema": {"type": "string", "format": "binary"}},
        },
    },
    **problem_responses(404, 406, 503),
}

_VARY = {"Vary": "Accept"}


@router.get(
    "/{calculation_id}",
    operation_id="get_calculation",
    response_model=CalculationPublic,
    responses=_STORED_RESPONSES,
    summary="One stored calculation: inputs, answer, versions; or its CSV or plot again",
)
def get_calculation(
    request: Request,
    calculation_id: Annotated[
        str, Path(max_length=64, description="`meta.calculation_id` of an answer.")
    ],
) -> Any:
    """The record of one balance or simulation answer: the inputs as sent, the answer as
    returned, the service and formulation versions, the time, the API key id, the label,
    tags and headline. `inputs` and `result` follow the request and answer models of the
    route named by `kind` (records stored by an older `service_version` follow that
    version's models). By `Accept`, the stored answer again as CSV or as a plot where its
    route answered so."""
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
            headers=_VARY,
        )
    accept = request.headers.get("accept")
    available = media_types_of(record.kind)
    chosen = choose_media_type(accept, available)
    if chosen is None:
        refused = not_acceptable(accept, available)
        refused.detail = f"A record of kind {record.kind}: {refused.detail}"
        refused.headers = _VARY
        raise refused
    if chosen != JSON_MEDIA_TYPE:
        try:
            body = render(record, chosen)
        except (KeyError, TypeError, ValueError):
            raise _not_renderable(record.kind, chosen, available) from None
        return Response(
            body,
            media_type=CSV_RESPONSE_TYPE if chosen == CSV_MEDIA_TYPE else chosen,
            headers={"X-Calculation-ID": record.calculation_id, **_VARY},
        )
    return FastJSONResponse(
        {
            **_summary(record.summary()),
            "formulations": record.formulations,
            "inputs": record.inputs,
            "result": record.result,
        },
        headers=_VARY,
    )


def _not_renderable(kind: str, media_type: str, available: tuple[str, ...]) -> ProblemError:
    """A stored answer of another shape (an older version's) that cannot be drawn again."""
    return ProblemError(
        406,
        "not-acceptable",
        "No acceptable media type",
        f"This record of kind {kind} was stored in a shape this version cannot render as "
        f"{media_type}; ask for {JSON_MEDIA_TYPE}.",
        [FieldError(field="Accept", message=f"cannot render {media_type}", value=media_type)],
        headers=_VARY,
    )


@router.get(
    "",
    operation_id="list_calculations",
    response_model=CalculationListPublic,
    responses={
        200: {
            "description": "One page, newest first. When there is a next page, the "
            '`Link: <...>; rel="next"` header gives its address (RFC 8288) and '
            "`next_cursor` its cursor.",
            "headers": {
                "Link": {
                    "description": 'The next page, as `<address>; rel="next"`; absent on '
                    "the last page.",
                    "schema": {"type": "string"},
                }
            },
        },
        **problem_responses(422, 503),
    },
    summary="Stored calculations, newest first, filtered and paged",
)
def list_calculations(
    request: Request,
    kind: Annotated[
        RecordKind | None, Query(description=f"Only this kind. {KIND_DESCRIPTION}")
    ] = None,
    key_id: Annotated[str | None, Query(description="Only those made with this key id.")] = None,
    label: Annotated[
        Label | None, Query(description="Only those whose request gave exactly this `label`.")
    ] = None,
    tag: Annotated[
        list[Tag] | None,
        Query(
            max_length=MAX_TAGS,
            description=f"Only those carrying this tag; repeat it (up to {MAX_TAGS} times) "
            "for the records carrying every one of them.",
        ),
    ] = None,
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
    """Summaries (id, kind, time, versions, key id, label, tags and a few key numbers of
    the answer) of stored calculations. Fetch one with
    `GET /v1/calculations/{calculation_id}` for its inputs and answer."""
    own = _own_key_only(request)
    if own is not None:
        if key_id is not None and key_id != own:
            return FastJSONResponse({"items": [], "next_cursor": None})
        key_id = own
    try:
        page = _keeper(request).store.list_records(
            kind=None if kind is None else kind.value,
            key_id=key_id,
            label=label,
            tags=tag or (),
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
    headers = {} if page.next_cursor is None else {"Link": _next_link(request, page.next_cursor)}
    return FastJSONResponse(
        {"items": [_summary(item) for item in page.items], "next_cursor": page.next_cursor},
        headers=headers,
    )
