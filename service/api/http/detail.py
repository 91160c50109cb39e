"""How much of its statements an answer spells out: ``?detail=compact`` (default) or ``full``.

A compact answer cites its reference state, property sources and uncertainty statements
by id, with the numbers (relative or absolute uncertainty, coverage factor) beside the
id; ``GET /v1/sources`` holds the texts. ``?detail=full`` on any route that answers an
envelope (GET or POST, JSON or CSV) spells the texts out in the answer as well.

The query parameter is read once per request by the route class
(:class:`service.api.http.strict_query.StrictQueryRoute`), before anything copies the
context, and held in a context variable that :func:`service.api.http.envelope.envelope`
reads: the worker thread of a synchronous route sees the same value.
"""

from __future__ import annotations

from contextvars import ContextVar
from enum import StrEnum
from typing import Any, Final

__all__ = [
    "DETAIL_PARAMETER",
    "Detail",
    "begin_detail",
    "current_detail",
    "detail_parameter",
    "invalid_detail",
]

DETAIL_PARAMETER: Final = "detail"


class Detail(StrEnum):
    """How much of its statements an answer spells out."""

    COMPACT = "compact"
    FULL = "full"


_DETAIL: ContextVar[Detail] = ContextVar("tripoint_answer_detail", default=Detail.COMPACT)

_DESCRIPTION: Final = (
    "How much of its statements the answer spells out. `compact` (default): the reference "
    "state, property sources and uncertainty statements by id (`GET /v1/sources` resolves "
    "every id), each uncertainty with its numbers and coverage factor; `full`: the same "
    "entries with their full texts (titles, scopes, statements, sections). Given in the "
    "query string for GET and POST alike, also with a CSV body."
)


def begin_detail(value: str | None) -> bool:
    """Set the detail of the request running in this context; ``False`` if ``value`` is
    not one of the choices (the detail is then compact)."""
    if value is None:
        _DETAIL.set(Detail.COMPACT)
        return True
    try:
        _DETAIL.set(Detail(value))
    except ValueError:
        _DETAIL.set(Detail.COMPACT)
        return False
    return True


def current_detail() -> Detail:
    """The detail asked by the request running in this context (compact outside one)."""
    return _DETAIL.get()


def detail_parameter() -> dict[str, Any]:
    """The OpenAPI query parameter ``detail``."""
    return {
        "name": DETAIL_PARAMETER,
        "in": "query",
        "required": False,
        "description": _DESCRIPTION,
        "schema": {
            "type": "string",
            "enum": [item.value for item in Detail],
            "default": Detail.COMPACT.value,
            "description": _DESCRIPTION,
        },
    }


def invalid_detail(value: str) -> dict[str, Any]:
    """The validation error (FastAPI's shape) for a ``detail`` outside the choices."""
    return {
        "type": "enum",
        "loc": ("query", DETAIL_PARAMETER),
        "msg": "Input should be 'compact' or 'full'",
        "input": value,
        "ctx": {"expected": "'compact' or 'full'"},
    }
