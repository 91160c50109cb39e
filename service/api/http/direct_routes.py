"""The hot GET routes served straight from ASGI, past the router and the dependency solver.

A one-point lookup or a ``/health`` check costs little to compute; what FastAPI does
around such a route (matching the path against every route of every included router,
solving an empty dependency graph, two exit stacks, a second exception wrapper) cost more
than the lookup itself (profiled: about half of a one-point saturation lookup's time in
process). :class:`DirectRoutes`, the innermost middleware, answers a ``GET`` to a listed
path by doing what the routed path does, and nothing else:

- the scope gets the route, its endpoint and empty path parameters, as routing gives
  them (metrics and logs label the request with the route's template);
- :func:`~service.api.http.strict_query.begin_checked_request`, the check every
  :class:`~service.api.http.strict_query.StrictQueryRoute` runs (unit notes, 422 for an
  undeclared query parameter);
- the route's own endpoint, called with the request, whose answer is sent as it is;
- errors mapped by the application's own exception handlers through Starlette's
  :class:`~starlette.middleware.exceptions.ExceptionMiddleware`, as on the routed path;
  an error with no handler there (a defect) goes on up to the 500 handler, as it would.

Only routes that can be served so are taken: ``GET``, a path without parameters, a
:class:`StrictQueryRoute` whose ``async`` endpoint takes nothing or the request alone, no
dependencies. A listed path that does not qualify is refused when the table is built, and
an endpoint that answers anything but a :class:`~starlette.responses.Response` is a defect
(``TypeError``), since FastAPI would have serialized it through the response model.
Every other request goes on to the application, untouched.
"""

from __future__ import annotations

import inspect
from collections.abc import Callable, Collection, Mapping, Sequence
from dataclasses import dataclass
from typing import Any

from fastapi.routing import iter_route_contexts
from starlette._utils import get_route_path
from starlette.middleware.exceptions import ExceptionMiddleware
from starlette.requests import Request
from starlette.responses import Response
from starlette.routing import BaseRoute
from starlette.types import ASGIApp, Receive, Scope, Send

from service.api.http.strict_query import StrictQueryRoute, begin_checked_request

__all__ = ["DirectRoutes", "NotDirectError"]


class NotDirectError(TypeError):
    """A path listed for direct serving whose route cannot be served directly."""


@dataclass(frozen=True)
class _Direct:
    route: StrictQueryRoute
    app: ASGIApp
    """The endpoint's ASGI form, inside the application's exception handling."""


def _takes_request_only(route: StrictQueryRoute) -> bool:
    """Whether the endpoint's parameters are at most the request (nothing to solve)."""
    dependant = route.dependant
    return not (
        dependant.path_params
        or dependant.query_params
        or dependant.header_params
        or dependant.cookie_params
        or dependant.body_params
        or dependant.dependencies
        or dependant.websocket_param_name
        or dependant.http_connection_param_name
        or dependant.response_param_name
        or dependant.background_tasks_param_name
        or dependant.security_scopes_param_name
        or route.dependencies
    )


def _endpoint_app(route: StrictQueryRoute, declared: frozenset[str]) -> ASGIApp:
    endpoint = route.endpoint
    takes_request = route.dependant.request_param_name is not None
    takes_detail = route.answers_envelope

    async def run(scope: Scope, receive: Receive, send: Send) -> None:
        request = Request(scope, receive, send)
        begin_checked_request(request, declared, takes_body=False, takes_detail=takes_detail)
        answer = await (endpoint(request) if takes_request else endpoint())
        if not isinstance(answer, Response):
            raise TypeError(f"{route.path}: a direct route's endpoint must return a Response")
        await answer(scope, receive, send)

    return run


class DirectRoutes:
    """Serve ``GET`` requests to ``paths`` without the router (innermost middleware).

    Parameters
    ----------
    routes
        Returns the application's routes (called once, at startup or on the first request,
        when every router is included).
    paths
        The route paths served directly.
    exception_handlers
        Returns the application's exception handlers (``app.exception_handlers``).
    """

    def __init__(
        self,
        app: ASGIApp,
        routes: Callable[[], Sequence[BaseRoute]],
        paths: Collection[str],
        exception_handlers: Callable[[], Mapping[Any, Any]],
    ) -> None:
        self.app = app
        self._routes = routes
        self._paths = frozenset(paths)
        self._exception_handlers = exception_handlers
        self._table: dict[str, _Direct] | None = None

    def _build(self) -> dict[str, _Direct]:
        handlers = {
            key: handler
            for key, handler in self._exception_handlers().items()
            if key not in (500, Exception)  # the 500 handler sits outside, as Starlette has it
        }
        table: dict[str, _Direct] = {}
        for context in iter_route_contexts(self._routes()):
            route = context.original_route
            path = context.path_format
            if path not in self._paths or "GET" not in (context.methods or ()):
                continue
            if (
                not isinstance(route, StrictQueryRoute)
                or "{" in path
                or not inspect.iscoroutinefunction(route.endpoint)
                or not _takes_request_only(route)
            ):
                raise NotDirectError(f"GET {path} cannot be served directly")
            app = ExceptionMiddleware(_endpoint_app(route, route.declared_query), handlers=handlers)
            table[path] = _Direct(route, app)
        missing = self._paths - table.keys()
        if missing:
            raise NotDirectError(f"no GET route for {', '.join(sorted(missing))}")
        self._table = table
        return table

    async def __call__(self, scope: Scope, receive: Receive, send: Send) -> None:
        if scope["type"] == "lifespan" and self._table is None:
            self._build()  # at startup, so that a path that does not qualify stops it
        elif scope["type"] == "http" and scope["method"] == "GET":
            table = self._table if self._table is not None else self._build()
            direct = table.get(get_route_path(scope))
            if direct is not None:
                route = direct.route
                scope["endpoint"] = route.endpoint
                scope["path_params"] = {}
                scope["route"] = route
                await direct.app(scope, receive, send)
                return
        await self.app(scope, receive, send)
