"""A request head (request line and header fields) of bounded size: 431 above it.

uvicorn's httptools protocol buffers a request's header fields without limit (a 20 MB header
was read whole); :class:`BoundedHeadProtocol` counts the bytes received while a request's head
is incomplete and, past ``TRIPOINT_MAX_HEADER_BYTES``, answers ``431 Request Header Fields
Too Large`` (RFC 6585 Sec. 5) as a problem document and closes the connection, so the memory
a head can take is that limit plus one read (64 KiB). ``python -m service`` runs uvicorn with
it (``http=BoundedHeadProtocol``).
"""

from __future__ import annotations

import functools
from typing import Any

import orjson
from uvicorn.protocols.http.httptools_impl import HttpToolsProtocol

from service.settings import Settings

__all__ = ["BoundedHeadProtocol"]


@functools.cache
def _limit() -> int:
    """TRIPOINT_MAX_HEADER_BYTES, read once per process."""
    return Settings().max_header_bytes


def _answer(limit: int) -> bytes:
    detail = (
        f"The request line and header fields exceed {limit} bytes (setting "
        "TRIPOINT_MAX_HEADER_BYTES). Send shorter headers; put data in the body."
    )
    body = orjson.dumps(
        {
            "type": "urn:tripoint:problem:headers-too-large",
            "title": "Request header fields too large",
            "status": 431,
            "detail": detail,
        }
    )
    return b"".join(
        [
            b"HTTP/1.1 431 Request Header Fields Too Large\r\n",
            b"content-type: application/problem+json\r\n",
            b"content-length: " + str(len(body)).encode("ascii") + b"\r\n",
            b"connection: close\r\n\r\n",
            body,
        ]
    )


class _HeadTooLargeError(Exception):
    """Raised from a parser callback to stop parsing a refused head."""


class BoundedHeadProtocol(HttpToolsProtocol):
    """uvicorn's httptools protocol with a limit on the bytes of each request head.

    Two checks: while a head is incomplete, the bytes received for it (bounds the memory the
    parser's buffering can take); when it is complete, the request line and header fields
    themselves (a head that arrived in one read).
    """

    def __init__(self, *args: Any, **kwargs: Any) -> None:
        super().__init__(*args, **kwargs)
        self._head_open = True
        self._head_bytes = 0
        self._refused = False

    def on_message_begin(self) -> None:
        super().on_message_begin()
        self._head_open = True
        self._head_bytes = 0

    def on_headers_complete(self) -> None:
        self._head_open = False
        size = len(self.url) + sum(len(name) + len(value) + 4 for name, value in self.headers)
        if size > _limit():
            self._refuse()
            raise _HeadTooLargeError
        super().on_headers_complete()

    def data_received(self, data: bytes) -> None:
        if self._refused:
            return
        super().data_received(data)
        if self._refused or not self._head_open or self.transport.is_closing():
            return
        # Still inside a head after this read: count it (a read that also ended the head
        # closed it above, so body bytes are never counted).
        self._head_bytes += len(data)
        if self._head_bytes > _limit():
            self._refuse()

    def send_400_response(self, msg: str) -> None:
        if self._refused:  # the parser stopped at our callback: 431 is already sent
            return
        super().send_400_response(msg)

    def _refuse(self) -> None:
        limit = _limit()
        self._refused = True
        self.logger.warning("request head over %d bytes refused (431)", limit)
        self.transport.write(_answer(limit))
        self.transport.close()
