"""Send a problem document straight from ASGI middleware (before routing)."""

from __future__ import annotations

import orjson
from starlette.types import Scope, Send

from service.api.http.problems import PROBLEM_MEDIA_TYPE, FieldError, make_problem, problem_body

__all__ = ["send_problem"]


async def send_problem(
    scope: Scope,
    send: Send,
    *,
    status: int,
    slug: str,
    title: str,
    detail: str,
    errors: list[FieldError] | None = None,
    headers: dict[str, str] | None = None,
) -> None:
    """Answer with an RFC 9457 document built as the exception handlers build theirs."""
    problem = make_problem(status, slug, title, detail, errors)
    body = orjson.dumps(problem_body(problem, scope.get("path")))
    raw_headers = [
        (b"content-type", PROBLEM_MEDIA_TYPE.encode()),
        (b"content-length", str(len(body)).encode()),
    ]
    raw_headers += [
        (name.lower().encode(), value.encode()) for name, value in (headers or {}).items()
    ]
    await send({"type": "http.response.start", "status": status, "headers": raw_headers})
    await send({"type": "http.response.body", "body": body})
