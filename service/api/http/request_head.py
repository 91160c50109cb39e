"""The request header fields the middlewares read, parsed once per request.

Every middleware of the request path reads one or two header fields (``Accept``,
``Accept-Encoding``, ``Authorization``, ``Content-Length``...). Scanning the header list in
each of them cost one pass per layer; :func:`request_head` makes one pass, keeps the result
in the request state and hands the same :class:`RequestHead` to every later reader. The
result is tied to the header list it was read from: a layer that rewrites the headers of an
inner call (the CSV adapter) gets a fresh reading for that call.

Where a field is sent twice, each reader keeps the rule it always had: the first value, and
the last for ``Content-Length`` (the digits one) and for ``Accept`` and ``If-None-Match`` as
the entity tag reads them (:attr:`RequestHead.last_accept`).
"""

from __future__ import annotations

from dataclasses import dataclass

from starlette.types import Scope

__all__ = ["RequestHead", "request_head"]

_STATE_KEY = "tripoint_request_head"


@dataclass(slots=True)
class RequestHead:
    """The header fields tripoint's middlewares use, as sent (latin-1 text)."""

    accept: str | None = None
    """First ``Accept`` (negotiation, CSV choice)."""
    last_accept: bytes = b""
    """Last ``Accept`` as bytes (the entity tag's media type when nothing was negotiated)."""
    accept_encoding: str | None = None
    authorization: bytes | None = None
    content_length: int | None = None
    """The last ``Content-Length`` made of digits only."""
    content_type: str | None = None
    if_none_match: str | None = None
    """Last ``If-None-Match``."""
    request_id: str | None = None
    """First ``X-Request-ID``, as sent (the observation checks it)."""


def _read(headers: list[tuple[bytes, bytes]]) -> RequestHead:
    head = RequestHead()
    for name, value in headers:
        if name == b"accept":
            if head.accept is None:
                head.accept = bytes(value).decode("latin-1")
            head.last_accept = bytes(value)
        elif name == b"accept-encoding":
            if head.accept_encoding is None:
                head.accept_encoding = bytes(value).decode("latin-1")
        elif name == b"authorization":
            if head.authorization is None:
                head.authorization = bytes(value)
        elif name == b"content-length":
            if value.isdigit():
                head.content_length = int(value)
        elif name == b"content-type":
            if head.content_type is None:
                head.content_type = bytes(value).decode("latin-1")
        elif name == b"if-none-match":
            head.if_none_match = bytes(value).decode("latin-1")
        elif name == b"x-request-id" and head.request_id is None:
            head.request_id = bytes(value).decode("latin-1")
    return head


def request_head(scope: Scope) -> RequestHead:
    """The request's header fields, read on first use and kept in the request state."""
    headers = scope.get("headers", [])
    state = scope.get("state")
    if state is None:
        state = scope["state"] = {}
    cached = state.get(_STATE_KEY)
    if cached is not None and cached[0] is headers:
        head: RequestHead = cached[1]
        return head
    head = _read(headers)
    state[_STATE_KEY] = (headers, head)
    return head
