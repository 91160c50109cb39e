"""API keys: ``Authorization: Bearer <key>`` on every ``/v1`` route when keys are set.

The check is ASGI middleware, so a router added later is covered without doing anything.
Keys are compared in constant time against every configured key (no early exit), never
logged, and never stored: a calculation record carries :func:`key_id`, a short digest.
``/health``, ``/ready``, ``/metrics``, ``/docs``, ``/redoc`` and ``/openapi.json`` stay open.
"""

from __future__ import annotations

import hashlib
import hmac
from collections.abc import Sequence
from typing import Any

from starlette.types import ASGIApp, Receive, Scope, Send

from service.api.http.problem_asgi import send_problem
from service.api.http.problems import problem_answer
from service.api.http.request_head import request_head

__all__ = ["PROTECTED_PREFIX", "ApiKeyGuard", "document_security", "is_protected", "key_id"]

PROTECTED_PREFIX = "/v1"
_SCHEME_NAME = "apiKey"
_CHALLENGE = {"WWW-Authenticate": 'Bearer realm="tripoint"'}


def key_id(key: str) -> str:
    """First 12 hex digits of the key's SHA-256: names a key in records, cannot reveal it."""
    return hashlib.sha256(key.encode()).hexdigest()[:12]


def is_protected(path: str) -> bool:
    """Whether ``path`` is under ``/v1``."""
    return path == PROTECTED_PREFIX or path.startswith(PROTECTED_PREFIX + "/")


def _bearer_token(scope: Scope) -> bytes | None:
    value = request_head(scope).authorization
    if value is None:
        return None
    scheme, _, token = value.partition(b" ")
    if scheme.lower() == b"bearer" and token.strip():
        return bytes(token.strip())
    return None


class ApiKeyGuard:
    """Refuse ``/v1`` requests without a valid key (401 problem+json).

    On success the key id is put in the request state as ``api_key_id``; with keys off it
    is None.
    """

    def __init__(self, app: ASGIApp, keys: Sequence[str]) -> None:
        self.app = app
        self._keys = [(key.encode(), key_id(key)) for key in keys]

    async def __call__(self, scope: Scope, receive: Receive, send: Send) -> None:
        if scope["type"] != "http":
            await self.app(scope, receive, send)
            return
        state = scope.setdefault("state", {})
        state["api_key_id"] = None
        if not self._keys or not is_protected(scope["path"]):
            await self.app(scope, receive, send)
            return
        token = _bearer_token(scope)
        if token is None:
            await send_problem(
                scope,
                send,
                status=401,
                slug="missing-api-key",
                title="API key required",
                detail="This route needs an API key: send 'Authorization: Bearer <key>'.",
                headers=_CHALLENGE,
            )
            return
        matched: str | None = None
        for secret, identifier in self._keys:
            # Every key is compared, whatever matched before: no timing hint of which.
            if hmac.compare_digest(token, secret):
                matched = identifier
        if matched is None:
            await send_problem(
                scope,
                send,
                status=401,
                slug="invalid-api-key",
                title="API key not accepted",
                detail="The API key sent is not one this service accepts.",
                headers=_CHALLENGE,
            )
            return
        state["api_key_id"] = matched
        await self.app(scope, receive, send)


def document_security(schema: dict[str, Any]) -> None:
    """Declare the bearer scheme and a 401 answer on every ``/v1`` operation."""
    components = schema.setdefault("components", {})
    components.setdefault("securitySchemes", {})[_SCHEME_NAME] = {
        "type": "http",
        "scheme": "bearer",
        "description": "One of the keys in TRIPOINT_API_KEYS, as 'Authorization: Bearer <key>'.",
    }
    for path, operations in schema.get("paths", {}).items():
        if not is_protected(path):
            for operation in operations.values():
                operation["security"] = []  # open: no key needed (OpenAPI 3.1 Sec. 4.8.10)
            continue
        for operation in operations.values():
            operation["security"] = [{_SCHEME_NAME: []}]
            operation.setdefault("responses", {}).setdefault(
                "401", problem_answer("Missing or wrong API key.")
            )
