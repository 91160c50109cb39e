"""HTTP method and negotiation semantics around every route, as pure ASGI middleware.

- ``Vary: Accept`` on every answer of a path whose content is negotiated (more than one
  media type: JSON, CSV, SVG, PNG), errors included (RFC 9110 §12.5.5), and 406 before the
  route runs when the client accepts none of them (§12.5.1, §15.5.7). The chosen type is
  left in the request state (:data:`negotiation.CHOSEN_MEDIA_TYPE`) for the CSV adapter.
- ``HEAD`` on every ``GET`` route: the ``GET`` answer's status and headers, no body
  (§9.3.2).
- 405 with an ``Allow`` header listing every method the path takes, over all its routes
  (§15.5.6; the property paths take GET and POST), as a problem document.

The routes are read once from the application (:class:`RouteTable`), on first use.
"""

from __future__ import annotations

import re
from collections.abc import Callable, Iterable, Sequence
from dataclasses import dataclass
from typing import Any

import orjson
from fastapi.datastructures import DefaultPlaceholder
from fastapi.routing import APIRoute, iter_route_contexts
from starlette.routing import BaseRoute
from starlette.types import ASGIApp, Message, Receive, Scope, Send

from service.api.http.negotiation import CHOSEN_MEDIA_TYPE, choose_media_type, not_acceptable
from service.api.http.problems import (
    PROBLEM_MEDIA_TYPE,
    FieldError,
    ProblemError,
    make_problem,
    problem_answer,
    problem_body,
    status_description,
)
from service.api.http.request_head import request_head

__all__ = ["HttpSemantics", "PathInfo", "RouteTable", "document_negotiation"]


@dataclass(frozen=True)
class PathInfo:
    """What the routes of one path take and answer, all methods together."""

    template: str
    """The path template (``/v1/calculations/{calculation_id}``), as metrics label it."""
    methods: frozenset[str]
    media_types: tuple[str, ...]
    """Media types the path answers in, its default (JSON) first."""

    @property
    def negotiated(self) -> bool:
        """Whether the answer's media type depends on ``Accept``."""
        return len(self.media_types) > 1

    @property
    def allow(self) -> str:
        """The ``Allow`` header value: every method, ``HEAD`` wherever ``GET`` is."""
        methods = set(self.methods)
        if "GET" in methods:
            methods.add("HEAD")
        return ", ".join(sorted(methods))


@dataclass(frozen=True)
class _Route:
    regex: re.Pattern[str]
    info: PathInfo


def _answer_types(route: BaseRoute, template: str, speaks_csv: Callable[[str], bool]) -> list[str]:
    if not isinstance(route, APIRoute):
        return []
    answer = route.responses.get(200) or route.responses.get("200") or {}
    response_class = route.response_class
    if isinstance(response_class, DefaultPlaceholder):
        response_class = response_class.value
    default = getattr(response_class, "media_type", None)  # None: a bare Response
    types = [*([default] if default else []), *answer.get("content", {})]
    if speaks_csv(template):
        types.append("text/csv")
    return types


def _merge(template: str, parts: Iterable[tuple[Iterable[str], Iterable[str]]]) -> PathInfo:
    methods: set[str] = set()
    media_types: list[str] = []
    for route_methods, route_types in parts:
        methods.update(route_methods)
        media_types += [kind for kind in route_types if kind not in media_types]
    if "text/csv" in media_types:  # a CSV route's default stays JSON
        media_types.remove("text/csv")
        media_types.append("text/csv")
    return PathInfo(template, frozenset(methods), tuple(media_types))


class RouteTable:
    """The application's paths, their methods and media types, built on first use.

    Parameters
    ----------
    routes
        Returns the application's routes (called once, when the table is first needed,
        so that every router is included by then).
    speaks_csv
        Whether a path template speaks CSV (the CSV routes of ``app.py``).
    """

    def __init__(
        self, routes: Callable[[], Sequence[BaseRoute]], speaks_csv: Callable[[str], bool]
    ) -> None:
        self._routes = routes
        self._speaks_csv = speaks_csv
        self._exact: dict[str, PathInfo] | None = None
        self._patterns: tuple[_Route, ...] = ()

    def _build(self) -> dict[str, PathInfo]:
        by_template: dict[str, list[tuple[Iterable[str], Iterable[str]]]] = {}
        regexes: dict[str, re.Pattern[str]] = {}
        for context in iter_route_contexts(self._routes()):
            template, methods = context.path_format, context.methods
            regex = getattr(context, "path_regex", None)
            if not template or methods is None or regex is None:
                continue  # a mount (the docs assets): no methods of its own
            types = _answer_types(context.original_route, template, self._speaks_csv)
            by_template.setdefault(template, []).append((methods, types))
            regexes[template] = regex
        infos = {template: _merge(template, parts) for template, parts in by_template.items()}
        self._patterns = tuple(_Route(regexes[t], info) for t, info in infos.items())
        self._exact = {t: info for t, info in infos.items() if "{" not in t}
        return self._exact

    def exact(self, path: str) -> PathInfo | None:
        """The path's routes when it is a template without parameters (a dict look-up)."""
        exact = self._exact if self._exact is not None else self._build()
        return exact.get(path)

    def resolve(self, path: str) -> PathInfo | None:
        """The routes matching ``path``, parameters included (a scan: for the rare cases)."""
        found = self.exact(path)
        if found is not None:
            return found
        for route in self._patterns:
            if route.regex.match(path):
                return route.info
        return None


def _problem_messages(
    scope: Scope, error: ProblemError, headers: dict[str, str]
) -> tuple[Message, Message]:
    problem = make_problem(error.status, error.slug, error.title, error.detail, error.errors)
    body = orjson.dumps(problem_body(problem, scope.get("path")))
    raw = [
        (b"content-type", PROBLEM_MEDIA_TYPE.encode()),
        (b"content-length", str(len(body)).encode()),
        *((name.lower().encode(), value.encode()) for name, value in headers.items()),
    ]
    return (
        {"type": "http.response.start", "status": error.status, "headers": raw},
        {"type": "http.response.body", "body": body},
    )


def _method_not_allowed(method: str, info: PathInfo) -> ProblemError:
    return ProblemError(
        405,
        "method-not-allowed",
        "Method not allowed",
        f"{method} is not a method of this path; it takes {info.allow}.",
        [FieldError(field="method", message=f"allowed: {info.allow}", value=method)],
    )


class HttpSemantics:
    """Vary and 406 for negotiated paths, HEAD for GET routes, 405 with a full ``Allow``."""

    def __init__(self, app: ASGIApp, table: RouteTable) -> None:
        self.app = app
        self.table = table

    async def __call__(self, scope: Scope, receive: Receive, send: Send) -> None:
        if scope["type"] != "http":
            await self.app(scope, receive, send)
            return
        path: str = scope["path"]
        method: str = scope["method"]
        head = method == "HEAD"
        info = self.table.resolve(path) if head else self.table.exact(path)
        negotiated = info is not None and info.negotiated
        replaced = False
        body_sent = False

        async def emit(message: Message) -> None:
            nonlocal body_sent
            if head and message["type"] == "http.response.body":
                if body_sent:
                    return
                body_sent = True
                message = {"type": "http.response.body", "body": b"", "more_body": False}
            await send(message)

        async def answer(message: Message) -> None:
            nonlocal replaced
            if replaced:
                return  # the route's own 405 body, replaced below
            if message["type"] == "http.response.start":
                if message["status"] == 405:
                    found = self.table.resolve(path)
                    if found is not None:
                        replaced = True
                        headers = {"Allow": found.allow}
                        if negotiated:
                            headers["Vary"] = "Accept"
                        start, body = _problem_messages(
                            scope, _method_not_allowed(method, found), headers
                        )
                        await emit(start)
                        await emit(body)
                        return
                if negotiated:
                    _add_vary_accept(message)
            await emit(message)

        takes = info is not None and (method in info.methods or (head and "GET" in info.methods))
        if negotiated and takes and info is not None:
            accept = request_head(scope).accept
            chosen = choose_media_type(accept, info.media_types)
            if chosen is None:
                start, body = _problem_messages(
                    scope, not_acceptable(accept, info.media_types), {"Vary": "Accept"}
                )
                await emit(start)
                await emit(body)
                return
            scope.setdefault("state", {})[CHOSEN_MEDIA_TYPE] = chosen
        if head and info is not None and "GET" in info.methods and "HEAD" not in info.methods:
            # Answered as GET, sent without its body (§9.3.2). A copy: the server reads the
            # method from its own scope to know that a HEAD answer has no body.
            inner = {**scope, "method": "GET"}
            try:
                await self.app(inner, receive, answer)
            finally:
                if "route" in inner:
                    scope["route"] = inner["route"]  # the route label of metrics and logs
            return
        await self.app(scope, receive, answer)


def _add_vary_accept(start: Message) -> None:
    """Add ``Accept`` to the answer's ``Vary`` (kept as one field, RFC 9110 §12.5.5)."""
    headers = list(start.get("headers", []))
    for position, (name, value) in enumerate(headers):
        if name.lower() == b"vary":
            if b"accept" not in {part.strip().lower() for part in bytes(value).split(b",")}:
                headers[position] = (name, bytes(value) + b", Accept")
            break
    else:
        headers.append((b"vary", b"Accept"))
    start["headers"] = headers


_BINARY_MEDIA = ("image/png",)


def document_negotiation(schema: dict[str, Any]) -> None:
    """Declare the 406 answer on every operation whose 200 answer has more than one media
    type, and say in its 200 answer how to choose one (run after the CSV content types are
    added).

    The choice is the ``Accept`` request header (OpenAPI 3.1 Sec. 4.8.12: a header
    parameter named ``Accept`` is ignored, so the media types are listed as the response's
    content, and the description names the header). Binary answers are declared as
    ``type: string, format: binary``, which client generators read as a file.
    """
    for operations in schema.get("paths", {}).values():
        for operation in operations.values():
            responses = operation.get("responses", {})
            answer = responses.get("200", {})
            content = answer.get("content", {})
            if len(content) > 1:
                responses.setdefault("406", problem_answer(status_description(406)))
                for media in _BINARY_MEDIA:
                    if media in content:
                        content[media]["schema"] = {"type": "string", "format": "binary"}
                listed = ", ".join(f"`{media}`" for media in content)
                answer["description"] = (
                    f"{answer.get('description', '').rstrip('.')}. Media type chosen by the "
                    f"`Accept` request header: {listed} (the first is the default); an `Accept` "
                    "admitting none of them answers 406."
                ).removeprefix("Successful Response. ")
