"""The media type of a request body: JSON routes refuse others with 415 (RFC 9110 §15.5.16).

A route with a JSON body takes ``application/json`` (or any ``+json`` type); the CSV
routes also take ``text/csv``, which the CSV adapter turns into JSON before the route runs.
A body sent without a ``Content-Type`` is refused the same way; a request without a body
goes on to the route, which names the missing body (422).
"""

from __future__ import annotations

from typing import Any

from starlette.requests import Request

from service.api.http.problems import (
    FieldError,
    ProblemError,
    problem_answer,
    status_description,
)

__all__ = ["check_body_media_type", "document_body_problems", "is_json_media_type"]


def is_json_media_type(content_type: str) -> bool:
    """Whether a ``Content-Type`` value is JSON: ``application/json`` or ``application/*+json``."""
    media = content_type.split(";", 1)[0].strip().lower()
    kind, _, subtype = media.partition("/")
    return kind == "application" and (subtype == "json" or subtype.endswith("+json"))


def _has_body(request: Request) -> bool:
    length = request.headers.get("content-length")
    if length is not None:
        return length.strip() != "0"
    return "transfer-encoding" in request.headers


def check_body_media_type(request: Request, taken: tuple[str, ...]) -> None:
    """Raise the 415 problem when the request's body is not JSON.

    ``taken`` lists the media types the route takes, for the problem's text.
    """
    content_type = request.headers.get("content-type")
    if content_type is None:
        if not _has_body(request):
            return
    elif is_json_media_type(content_type):
        return
    listed = ", ".join(taken)
    raise ProblemError(
        415,
        "unsupported-media-type",
        "Unsupported request media type",
        f"This route takes a body in {listed}; it was sent "
        + ("without a Content-Type." if content_type is None else f"as {content_type!r}."),
        [FieldError(field="Content-Type", message=f"send one of: {listed}", value=content_type)],
    )


def document_body_problems(schema: dict[str, Any]) -> None:
    """Declare the 400 (malformed JSON) and 415 (wrong media type) answers on every
    operation that takes a body."""
    for operations in schema.get("paths", {}).values():
        for operation in operations.values():
            if "requestBody" in operation:
                responses = operation.setdefault("responses", {})
                for status in (400, 415):
                    responses.setdefault(str(status), problem_answer(status_description(status)))
