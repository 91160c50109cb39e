"""Validators and freshness for the deterministic GET lookups, as pure ASGI middleware.

A GET lookup's answer is a function of the service version, the path, the query and the
negotiated media type alone. Each such 200 answer carries

- ``ETag``: a weak entity tag (RFC 9110 §8.8.3) made from exactly those inputs. Weak,
  because two answers to one query are the same in content but not byte for byte (each
  carries its own ``meta.time`` and ids); a cache compares them weakly (§8.8.3.2).
- ``Cache-Control: public, max-age=3600`` (RFC 9111 §5.2.2.9, §5.2.2.1), or ``private``
  in place of ``public`` when API keys are on, so that a shared cache never hands a keyed
  answer to a client without a key (RFC 9111 §3.5).

A request whose ``If-None-Match`` names the tag (§13.1.2, weak comparison) is answered
304 with the same validator and freshness headers and no body (§15.4.5), before anything is
computed; ``If-None-Match: *`` is answered 304 when the lookup answers 200.
"""

from __future__ import annotations

import hashlib
import re
from collections.abc import Callable
from typing import Any

from starlette.types import ASGIApp, Message, Receive, Scope, Send

from service.api.http.negotiation import CHOSEN_MEDIA_TYPE
from service.api.http.request_head import request_head

__all__ = [
    "MAX_AGE_SECONDS",
    "Validators",
    "document_caching",
    "entity_tag",
    "if_none_match_hits",
]

MAX_AGE_SECONDS = 3600
"""How long a lookup answer stays fresh in a cache."""

_TAG = re.compile(r'(?:W/)?"([^"]*)"')


def entity_tag(version: str, path: str, query: bytes, media_type: str) -> str:
    """The weak entity tag of a lookup answer: ``W/"<32 hex digits>"``."""
    digest = hashlib.blake2b(digest_size=16)
    for part in (version.encode(), path.encode(), query, media_type.encode()):
        digest.update(len(part).to_bytes(4, "big"))
        digest.update(part)
    return f'W/"{digest.hexdigest()}"'


def if_none_match_hits(header: str, tag: str) -> bool:
    """Whether an ``If-None-Match`` list names ``tag`` (weak comparison, RFC 9110 §8.8.3.2:
    the opaque parts are equal, ``W/`` ignored on either side)."""
    wanted = _TAG.fullmatch(tag)
    assert wanted is not None
    return any(found == wanted.group(1) for found in _TAG.findall(header))


class Validators:
    """``ETag``, ``Cache-Control`` and 304 for GET requests to the lookup paths.

    Parameters
    ----------
    version
        The service version (a new release makes new tags).
    cacheable
        Whether a request path is a deterministic lookup.
    shared
        Whether shared caches may store the answers (``public``); False when API keys
        are on (``private``).
    """

    def __init__(
        self, app: ASGIApp, version: str, cacheable: Callable[[str], bool], shared: bool
    ) -> None:
        self.app = app
        self.version = version
        self.cacheable = cacheable
        scope_word = "public" if shared else "private"
        self.cache_control = f"{scope_word}, max-age={MAX_AGE_SECONDS}"
        self._cache_control = self.cache_control.encode()

    async def __call__(self, scope: Scope, receive: Receive, send: Send) -> None:
        if (
            scope["type"] != "http"
            or scope.get("method") != "GET"
            or not self.cacheable(scope["path"])
        ):
            await self.app(scope, receive, send)
            return
        head = request_head(scope)
        accept = head.last_accept
        condition = head.if_none_match
        media_type = scope.get("state", {}).get(CHOSEN_MEDIA_TYPE) or accept.decode("latin-1")
        tag = entity_tag(self.version, scope["path"], scope.get("query_string", b""), media_type)
        fields = [(b"etag", tag.encode()), (b"cache-control", self._cache_control)]
        if (
            condition is not None
            and condition.strip() != "*"
            and if_none_match_hits(condition, tag)
        ):
            await _not_modified(send, fields)
            return
        any_match = condition is not None and condition.strip() == "*"
        unchanged = False

        async def validated(message: Message) -> None:
            nonlocal unchanged
            if unchanged:
                return  # the 200 body of an If-None-Match: * request, answered 304
            if message["type"] == "http.response.start" and message["status"] == 200:
                if any_match:
                    unchanged = True
                    await _not_modified(send, fields)
                    return
                message["headers"] = [*message.get("headers", []), *fields]
            await send(message)

        await self.app(scope, receive, validated)


async def _not_modified(send: Send, fields: list[tuple[bytes, bytes]]) -> None:
    """RFC 9110 §15.4.5: 304 with the validator and freshness headers, no body. ``Vary``
    is added by the negotiation outside; a compressed 200 would vary on the coding too."""
    headers = [*fields, (b"vary", b"Accept-Encoding")]
    await send({"type": "http.response.start", "status": 304, "headers": headers})
    await send({"type": "http.response.body", "body": b""})


def document_caching(schema: dict[str, Any], cacheable: Callable[[str], bool]) -> None:
    """Declare the ``ETag`` and ``Cache-Control`` headers and the 304 answer on the GET
    lookups' operations."""
    for path, operations in schema.get("paths", {}).items():
        operation = operations.get("get")
        if operation is None or not cacheable(path):
            continue
        responses = operation.setdefault("responses", {})
        ok = responses.get("200")
        if ok is not None:
            ok.setdefault("headers", {}).update(
                {
                    "ETag": {
                        "description": "Weak entity tag of this answer; send it back in "
                        "`If-None-Match` to get 304 while it is current.",
                        "schema": {"type": "string"},
                    },
                    "Cache-Control": {
                        "description": f"`public, max-age={MAX_AGE_SECONDS}` (`private` "
                        "when API keys are on).",
                        "schema": {"type": "string"},
                    },
                }
            )
        responses.setdefault(
            "304",
            {"description": "Not modified: the `If-None-Match` tag is current; no body."},
        )
