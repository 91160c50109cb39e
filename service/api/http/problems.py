"""RFC 9457 problem documents and the one place errors become HTTP responses."""

from __future__ import annotations

import json
import logging
import math
from typing import Any

from fastapi import FastAPI, Request
from fastapi.exceptions import RequestValidationError
from pydantic import BaseModel, Field
from starlette.exceptions import HTTPException as StarletteHTTPException

from service.api.http.responses import FastJSONResponse, NonFiniteResultError
from service.api.http.sent_units import sent_unit
from service.api.http.units import si_to_unit, si_unit_label
from service.core.deadline import DeadlineExceededError
from service.core.errors import (
    InvalidInputError,
    NotConvergedError,
    OutOfRangeError,
    UnsupportedStateError,
    WorkerLostError,
    describe_range,
    format_amount,
    range_hint,
    range_text,
    stated_reason,
)

__all__ = [
    "PROBLEM_MEDIA_TYPE",
    "FieldError",
    "Problem",
    "ProblemError",
    "SiRange",
    "document_validation_problems",
    "install_problem_handlers",
    "make_problem",
    "problem_answer",
    "problem_body",
    "problem_responses",
    "status_description",
]

PROBLEM_MEDIA_TYPE = "application/problem+json"
_log = logging.getLogger("tripoint.errors")
_TYPE_PREFIX = "urn:tripoint:problem:"
_PROBLEM_SCHEMA_REF = "#/components/schemas/Problem"
_DESCRIPTIONS = {
    400: "Malformed request (a body that is not JSON, an unreadable CSV body).",
    401: "Missing or wrong API key.",
    404: "Not found.",
    405: "Method not allowed on this path; `Allow` lists the methods it takes.",
    406: "None of the media types the route answers in is acceptable (`Accept`).",
    413: "Request too large (body or batch points).",
    415: "Unsupported request media type (`Content-Type`); the problem names the ones taken.",
    422: "Invalid or out-of-range input; the problem names the field and the valid range.",
    503: "Temporarily unavailable.",
}


class SiRange(BaseModel):
    """A refused value and its valid range in SI."""

    value: float = Field(description="The value received, in SI.")
    unit: str = Field(description="SI unit of `value`, `minimum` and `maximum`.")
    minimum: float | None = Field(None, description="Lowest valid value, SI.")
    maximum: float | None = Field(None, description="Highest valid value, SI.")


class FieldError(BaseModel):
    """One offending input."""

    field: str = Field(description="Input that is wrong, as a dotted path (e.g. `temperature`).")
    message: str = Field(description="What is wrong with it.")
    value: Any = Field(None, description="The value received (as sent, or in `unit`).")
    unit: str | None = Field(None, description="Unit of `value`, `minimum` and `maximum`.")
    minimum: float | None = Field(None, description="Lowest valid value, in `unit`.")
    maximum: float | None = Field(None, description="Highest valid value, in `unit`.")
    exclusive_minimum: bool | None = Field(
        None, description="True where `minimum` itself is outside the range (an open bound)."
    )
    index: int | None = Field(
        None,
        description="Position in a batch array (from 0), or the CSV data row (from 1, as a "
        "spreadsheet shows the rows below the header), where relevant.",
    )
    si: SiRange | None = Field(
        None, description="The same value and range in SI, where `unit` is the caller's unit."
    )


class Problem(BaseModel):
    """An RFC 9457 problem document (`application/problem+json`)."""

    type: str = Field(description="URI naming the kind of problem.")
    title: str = Field(description="Short summary of the kind of problem.")
    status: int = Field(description="HTTP status code.")
    detail: str = Field(description="What went wrong in this request.")
    instance: str | None = Field(None, description="Path of the request.")
    errors: list[FieldError] = Field(default_factory=list, description="Offending inputs.")
    request_id: str | None = Field(
        None, description="The request's id (as in `X-Request-ID`), on server errors."
    )


class ProblemError(Exception):
    """Raised by the HTTP layer to answer with a problem document."""

    def __init__(
        self,
        status: int,
        slug: str,
        title: str,
        detail: str,
        errors: list[FieldError] | None = None,
        headers: dict[str, str] | None = None,
    ) -> None:
        super().__init__(detail)
        self.status = status
        self.slug = slug
        self.title = title
        self.detail = detail
        self.errors = errors or []
        self.headers = headers


_JSON_INTEGER_RANGE = range(-(2**63), 2**64)
"""Integers the JSON renderer (orjson) writes as numbers; others are echoed as text."""


_ECHO_LENGTH = 100
"""Longest received text echoed in a problem document; longer ones are cut."""


def _encodable(text: str) -> str:
    """``text`` as UTF-8 can carry it: lone surrogates written as ``\\udXXX`` escapes."""
    try:
        text.encode("utf-8")
    except UnicodeEncodeError:
        return text.encode("utf-8", "backslashreplace").decode("utf-8")
    return text


def _finite_or_none(value: object) -> object:
    """The received value as JSON can carry it: non-finite floats and huge integers as text,
    long text cut to its first characters and its length, lone surrogates escaped."""
    if isinstance(value, str):
        if len(value) > _ECHO_LENGTH:
            value = f"{value[:_ECHO_LENGTH]}... ({len(value)} characters)"
        return _encodable(value)
    if isinstance(value, float) and not math.isfinite(value):
        return str(value)
    if isinstance(value, int) and value not in _JSON_INTEGER_RANGE:
        return str(value)
    return value


def make_problem(
    status: int, slug: str, title: str, detail: str, errors: list[FieldError] | None = None
) -> Problem:
    """A problem document of type ``urn:tripoint:problem:<slug>``."""
    return Problem(
        type=_TYPE_PREFIX + slug, title=title, status=status, detail=detail, errors=errors or []
    )


def problem_body(problem: Problem, instance: str | None) -> dict[str, Any]:
    """The JSON body of ``problem`` answered at ``instance`` (the request path).

    Received values JSON cannot carry as numbers (non-finite floats, huge integers) are
    echoed as text.
    """
    body = problem.model_dump()
    body["instance"] = instance
    body["detail"] = _encodable(body["detail"])
    if body.get("request_id") is None:
        body.pop("request_id", None)
    for error in body["errors"]:
        error["value"] = _finite_or_none(error["value"])
        error["message"] = _encodable(error["message"])
        error["field"] = _encodable(error["field"])
    return body


def _problem_content() -> dict[str, Any]:
    return {PROBLEM_MEDIA_TYPE: {"schema": {"$ref": _PROBLEM_SCHEMA_REF}}}


def problem_answer(description: str) -> dict[str, Any]:
    """An OpenAPI response object: ``description`` and a problem document as content."""
    return {"description": description, "content": _problem_content()}


def status_description(status: int) -> str:
    """The OpenAPI description the service gives answers of ``status``."""
    return _DESCRIPTIONS.get(status, "Problem")


def problem_responses(*statuses: int) -> dict[int | str, dict[str, Any]]:
    """OpenAPI ``responses=`` entries declaring the problem schema for ``statuses``."""
    return {
        status: {"model": Problem, **problem_answer(_DESCRIPTIONS.get(status, "Problem"))}
        for status in statuses
    }


def document_validation_problems(schema: dict[str, Any]) -> None:
    """Declare the 422 answers FastAPI documents by itself as the problem documents sent.

    FastAPI adds a 422 ``application/json`` ``HTTPValidationError`` response to every
    operation with parameters or a body; the service answers those with
    ``application/problem+json`` :class:`Problem` documents instead (see
    :func:`install_problem_handlers`). The unused validation-error schemas are dropped.
    """
    for operations in schema.get("paths", {}).values():
        for operation in operations.values():
            answer = operation.get("responses", {}).get("422")
            if answer is None:
                continue
            answer["content"] = _problem_content()
            if answer.get("description") == "Validation Error":
                answer["description"] = _DESCRIPTIONS[422]
    components = schema.get("components", {}).get("schemas", {})
    if "Problem" not in components:
        components["Problem"] = Problem.model_json_schema(
            ref_template="#/components/schemas/{model}"
        )
        for name, definition in components["Problem"].pop("$defs", {}).items():
            components.setdefault(name, definition)
    for name in ("HTTPValidationError", "ValidationError"):  # in this order: one refs the other
        if name in components:
            del components[name]
            if f'"#/components/schemas/{name}"' in json.dumps(schema):
                components[name] = {"type": "object"}  # still referenced: keep a stand-in


def _render(
    request: Request, problem: Problem, headers: dict[str, str] | None = None
) -> FastJSONResponse:
    return FastJSONResponse(
        problem_body(problem, request.url.path),
        status_code=problem.status,
        media_type=PROBLEM_MEDIA_TYPE,
        headers=headers,
    )


def _tidy(value: float | None) -> float | None:
    """A converted number without conversion noise (12 significant digits)."""
    return None if value is None else float(f"{value:.12g}")


def _in_sent_unit(error: OutOfRangeError) -> FieldError:
    """The field error of ``error``, in the unit the caller sent the field in, SI beside."""
    base = FieldError(
        field=error.variable,
        message=str(error),
        value=error.value,
        unit=error.unit,
        minimum=error.minimum,
        maximum=error.maximum,
        exclusive_minimum=error.exclusive_minimum or None,
        index=error.index,
    )
    sent = sent_unit(error.variable)
    if sent is None or sent.unit is None or si_unit_label(sent.dimension) != error.unit:
        return base
    unit, dimension = sent.unit.strip(), sent.dimension
    if unit == error.unit:
        return base
    value = _tidy(si_to_unit(error.value, unit, dimension))
    low = None if error.minimum is None else _tidy(si_to_unit(error.minimum, unit, dimension))
    high = None if error.maximum is None else _tidy(si_to_unit(error.maximum, unit, dimension))
    assert value is not None
    where = "" if error.index is None else f" (element {error.index})"
    si_range = range_text(error.minimum, error.maximum, error.unit, error.exclusive_minimum)
    si_value = format_amount(error.value, error.unit)
    text = (
        f"{error.variable} = {format_amount(value, unit)} ({si_value}){where}"
        f" {describe_range(low, high, unit, error.exclusive_minimum, digits=7)} ({si_range})"
    )
    reason = stated_reason(error.reason, error.minimum, error.maximum)
    if reason:
        text = f"{text}: {reason}"
    hint = range_hint(error.value, error.unit)
    if hint:
        text = f"{text}. {hint}"
    return base.model_copy(
        update={
            "message": text,
            "value": value,
            "unit": unit,
            "minimum": low,
            "maximum": high,
            "si": SiRange(
                value=error.value, unit=error.unit, minimum=error.minimum, maximum=error.maximum
            ),
        }
    )


def _from_core(error: Exception) -> Problem:
    if isinstance(error, OutOfRangeError):
        field_error = _in_sent_unit(error)
        return make_problem(
            422,
            "out-of-range",
            "Input outside the valid range",
            field_error.message,
            [field_error],
        )
    if isinstance(error, InvalidInputError | UnsupportedStateError):
        slug = "invalid-input" if isinstance(error, InvalidInputError) else "unsupported-state"
        title = (
            "Invalid input"
            if isinstance(error, InvalidInputError)
            else "State outside what tripoint models"
        )
        value = (
            error.value if isinstance(error.value, str | int | float | None) else str(error.value)
        )
        return make_problem(
            422,
            slug,
            title,
            str(error),
            [FieldError(field=error.variable, message=error.detail, value=value)],
        )
    assert isinstance(error, NotConvergedError)
    return make_problem(
        422,
        "not-converged",
        "Calculation did not converge",
        f"{error}. The inputs are likely at the edge of the formulation's range.",
    )


def _location(loc: tuple[int | str, ...]) -> str:
    parts = [str(part) for part in loc if part not in ("body", "query", "path")]
    return ".".join(parts) or "body"


def install_problem_handlers(app: FastAPI) -> None:
    """Map every error the service raises on purpose to a problem document."""

    async def on_problem(request: Request, error: Exception) -> FastJSONResponse:
        assert isinstance(error, ProblemError)
        problem = make_problem(error.status, error.slug, error.title, error.detail, error.errors)
        return _render(request, problem, error.headers)

    async def on_core(request: Request, error: Exception) -> FastJSONResponse:
        return _render(request, _from_core(error))

    async def on_validation(request: Request, error: Exception) -> FastJSONResponse:
        assert isinstance(error, RequestValidationError)
        errors = []
        for item in error.errors():
            value = item.get("input")
            if not isinstance(value, str | int | float | bool | None):
                value = None
            # A body that is not JSON at all is located at a character offset: name the body.
            location = (
                "body"
                if item.get("type") == "json_invalid"
                else _location(tuple(item.get("loc", ())))
            )
            errors.append(
                FieldError(
                    field=location,
                    message=str(item.get("msg", "invalid")),
                    value=value,
                )
            )
        if any(item.get("type") == "json_invalid" for item in error.errors()):
            # Not JSON at all: a malformed request (RFC 9110 §15.5.1), not a schema mismatch.
            where = next(item for item in error.errors() if item.get("type") == "json_invalid")
            reason = (where.get("ctx") or {}).get("error", "not JSON")
            offset = next((part for part in where.get("loc", ()) if isinstance(part, int)), None)
            at = "" if offset is None else f" at character {offset}"
            problem = make_problem(
                400,
                "malformed-json",
                "Malformed JSON body",
                f"The body is not valid JSON{at}: {reason}.",
                [FieldError(field="body", message=f"not valid JSON{at}: {reason}")],
            )
            return _render(request, problem)
        fields = ", ".join(sorted({entry.field for entry in errors}))
        problem = make_problem(
            422,
            "invalid-request",
            "Request does not match the schema",
            f"Invalid or missing field(s): {fields}.",
            errors,
        )
        return _render(request, problem)

    async def on_http(request: Request, error: Exception) -> FastJSONResponse:
        assert isinstance(error, StarletteHTTPException)
        problem = Problem(
            type="about:blank",
            title=str(error.detail),
            status=error.status_code,
            detail=str(error.detail),
            errors=[FieldError(field="body", message=str(error.detail))]
            if error.status_code in (400, 413, 415)
            else [],
        )
        return _render(request, problem, dict(error.headers) if error.headers else None)

    async def on_non_finite(request: Request, error: Exception) -> FastJSONResponse:
        problem = make_problem(
            422,
            "result-not-finite",
            "Inputs outside what the calculation can hold",
            "The inputs drive the calculation to a number that is not finite (an overflow "
            "or a division by almost nothing); check the magnitudes sent.",
            [FieldError(field="body", message="a result is not finite")],
        )
        return _render(request, problem)

    async def on_unexpected(request: Request, error: Exception) -> FastJSONResponse:
        request_id = request.scope.get("state", {}).get("request_id")
        _log.error("unexpected error", exc_info=error, extra={"fields": {"path": request.url.path}})
        problem = make_problem(
            500,
            "internal-error",
            "Internal error",
            "The service failed on this request; it is a defect. Quote the request id when "
            "reporting it.",
        )
        body = problem_body(problem, request.url.path)
        body["request_id"] = request_id
        headers = {"X-Request-ID": request_id} if request_id else None
        return FastJSONResponse(body, 500, media_type=PROBLEM_MEDIA_TYPE, headers=headers)

    async def on_deadline(request: Request, error: Exception) -> FastJSONResponse:
        assert isinstance(error, DeadlineExceededError)
        problem = make_problem(
            503,
            "time-limit",
            "Computation took too long",
            f"The computation did not finish within {error.seconds:g} s (setting "
            "TRIPOINT_MAX_REQUEST_SECONDS) and was stopped. Ask for fewer points, or retry "
            "later.",
        )
        return _render(request, problem, {"Retry-After": "1"})

    async def on_worker_lost(request: Request, error: Exception) -> FastJSONResponse:
        assert isinstance(error, WorkerLostError)
        problem = make_problem(
            503,
            "worker-lost",
            "Computation interrupted",
            f"{str(error).capitalize()} (it may have run out of memory); the workers are "
            "restarted. Retry, with fewer cases if it happens again.",
        )
        return _render(request, problem, {"Retry-After": "1"})

    app.add_exception_handler(ProblemError, on_problem)
    app.add_exception_handler(DeadlineExceededError, on_deadline)
    app.add_exception_handler(WorkerLostError, on_worker_lost)
    app.add_exception_handler(NonFiniteResultError, on_non_finite)
    app.add_exception_handler(Exception, on_unexpected)
    for kind in (OutOfRangeError, InvalidInputError, UnsupportedStateError, NotConvergedError):
        app.add_exception_handler(kind, on_core)
    app.add_exception_handler(RequestValidationError, on_validation)
    app.add_exception_handler(StarletteHTTPException, on_http)
