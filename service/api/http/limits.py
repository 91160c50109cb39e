"""Request limits: body size (413) around the routes, computation time (503) in the
routes' class, and the batch-size check (413) that the routes which count points or cases
call.
"""

from __future__ import annotations

import asyncio
import functools
import inspect
import logging
from collections.abc import Callable, Coroutine
from typing import Any, TypeVar

from fastapi import Request, Response
from starlette.types import ASGIApp, Message, Receive, Scope, Send

from service.api.http.admission import ComputationSlots
from service.api.http.problem_asgi import send_problem
from service.api.http.problems import FieldError, Problem, ProblemError, problem_answer
from service.api.http.request_head import request_head
from service.api.http.strict_query import StrictQueryRoute
from service.core.deadline import DeadlineExceededError, set_deadline

__all__ = [
    "BodySizeLimit",
    "RecordRoute",
    "TimeLimitExceededError",
    "TimeLimitedRoute",
    "check_batch_size",
    "computation_slots",
    "document_time_limit",
    "run_within_limit",
]

_log = logging.getLogger("tripoint.limits")
_Result = TypeVar("_Result")
_TIME_LIMIT_ANSWER = (
    "Computation longer than TRIPOINT_MAX_REQUEST_SECONDS, or the calculation record "
    "could not be stored (TRIPOINT_STORE_FAILURE_POLICY=fail)."
)


def check_batch_size(count: int, limit: int, *, noun: str, setting: str) -> None:
    """Raise a 413 problem when a request asks for more than ``limit`` points or cases.

    ``noun`` names what is counted (``points``, ``cases``); ``setting`` is the environment
    variable that sets ``limit``.
    """
    if count > limit:
        raise ProblemError(
            413,
            "too-many-points",
            "Batch too large",
            f"The request asks for {count} {noun}; the limit is {limit} (setting {setting}).",
            [FieldError(field="values", message="too many points", value=count, maximum=limit)],
        )


class BodySizeLimit:
    """Answer 413 (problem+json) when a request body exceeds ``max_bytes``.

    A declared ``Content-Length`` above the limit is refused before reading; the server
    holds a client to the length it declared. A body without one (chunked) is read here,
    up to the limit, before the route sees it, so it cannot slip past.
    """

    def __init__(self, app: ASGIApp, max_bytes: int) -> None:
        self.app = app
        self.max_bytes = max_bytes

    async def __call__(self, scope: Scope, receive: Receive, send: Send) -> None:
        if scope["type"] != "http":
            await self.app(scope, receive, send)
            return
        declared = request_head(scope).content_length
        if declared is not None:
            if declared > self.max_bytes:
                await self._refuse(scope, send, declared)
                return
            await self.app(scope, receive, send)
            return
        if scope.get("method") in ("GET", "HEAD", "OPTIONS", "DELETE"):
            await self.app(scope, receive, send)
            return
        body = bytearray()
        while True:
            message = await receive()
            if message["type"] == "http.disconnect":
                return
            body += message.get("body", b"")
            if len(body) > self.max_bytes:
                await self._refuse(scope, send, len(body))
                return
            if not message.get("more_body", False):
                break
        replayed = False

        async def replay() -> Message:
            nonlocal replayed
            if replayed:
                return await receive()
            replayed = True
            return {"type": "http.request", "body": bytes(body), "more_body": False}

        await self.app(scope, replay, send)

    async def _refuse(self, scope: Scope, send: Send, size: int) -> None:
        await send_problem(
            scope,
            send,
            status=413,
            slug="body-too-large",
            title="Request body too large",
            detail=(
                f"The request body ({size} bytes or more) exceeds the limit of "
                f"{self.max_bytes} bytes (setting TRIPOINT_MAX_BODY_BYTES)."
            ),
            errors=[
                FieldError(
                    field="body",
                    message="too large",
                    value=size,
                    unit="byte",
                    maximum=self.max_bytes,
                )
            ],
        )


class TimeLimitExceededError(ProblemError):
    """The 503 answer of a computation that ran past ``TRIPOINT_MAX_REQUEST_SECONDS``."""

    def __init__(self, seconds: float) -> None:
        super().__init__(
            503,
            "time-limit",
            "Computation took too long",
            f"The computation did not finish within {seconds:g} s (setting "
            "TRIPOINT_MAX_REQUEST_SECONDS). Ask for fewer points, or retry later.",
            headers={"Retry-After": "1"},
        )


async def run_within_limit(
    work: Coroutine[Any, Any, _Result],
    *,
    seconds: float,
    pending: set[asyncio.Task[Any]],
    path: str,
) -> _Result:
    """Await ``work`` as a task of its own for at most ``seconds``.

    Past the limit the task goes on (a computation in a worker thread cannot be stopped
    from outside; its result is discarded), is kept in ``pending`` so that shutdown can
    wait for it, and :class:`TimeLimitExceededError` is raised at once.
    """
    task = asyncio.ensure_future(work)
    done, _ = await asyncio.wait({task}, timeout=seconds)
    if done:
        return task.result()
    pending.add(task)
    task.add_done_callback(functools.partial(_forget, pending))
    _log.warning(
        "computation time limit reached",
        extra={"fields": {"path": path, "limit_seconds": seconds}},
    )
    raise TimeLimitExceededError(seconds)


class TimeLimitedRoute(StrictQueryRoute):
    """A route whose synchronous endpoint answers 503 (problem+json) past the time limit.

    FastAPI runs a synchronous endpoint in a worker thread. Here the whole handler (body,
    validation, endpoint, response) runs within :func:`run_within_limit`, with
    ``TRIPOINT_MAX_REQUEST_SECONDS`` and ``app.state.pending_computations``.

    An ``async`` endpoint runs on the event loop, where no timer fires while it computes:
    the limit could never interrupt it, and a task, a future and a timer per request would
    cost about 15 microseconds for nothing (profiled). Such endpoints (the one-point GET
    lookups) are kept short by what they accept, and are not wrapped (:attr:`limited`).
    A CSV request that runs a route once per row is held to the limit as a whole by
    :class:`service.api.http.csv_io.CsvAdapter`.
    """

    def __init__(self, path: str, endpoint: Callable[..., Any], **options: Any) -> None:
        if not inspect.iscoroutinefunction(endpoint):
            # The route that can answer 503 says so; document_time_limit adds the seconds.
            responses = dict(options.get("responses") or {})
            responses.setdefault(503, {"model": Problem, **problem_answer(_TIME_LIMIT_ANSWER)})
            options["responses"] = responses
        super().__init__(path, endpoint, **options)

    takes_slot = True
    """Whether a call holds one of the computation slots (:mod:`admission`)."""

    @property
    def limited(self) -> bool:
        """Whether this route is held to the time limit (its endpoint is synchronous)."""
        return not inspect.iscoroutinefunction(self.endpoint)

    def inner_handler(self) -> Callable[[Request], Coroutine[Any, Any, Response]]:
        handler = super().inner_handler()
        if not self.limited:
            return handler

        async def limited(request: Request) -> Response:
            if self.takes_slot:
                slots = computation_slots(request.app)
                await slots.acquire()  # 503 with Retry-After when busy
                work = slots.run(handler(request))
            else:
                work = handler(request)
            # The core's loops stop at the same limit (before the task copies the context).
            set_deadline(request.app.state.settings.max_request_seconds)
            return await run_within_limit(
                work,
                seconds=request.app.state.settings.max_request_seconds,
                pending=request.app.state.pending_computations,
                path=request.url.path,
            )

        return limited


class RecordRoute(TimeLimitedRoute):
    """A time-limited route that reads the record store and takes no computation slot."""

    takes_slot = False


def computation_slots(app: Any) -> ComputationSlots:
    """The app's computation slots, made for the running event loop on first use."""
    loop = asyncio.get_running_loop()
    state = app.state
    if getattr(state, "computation_slots_loop", None) is not loop:
        settings = state.settings
        state.computation_slots = ComputationSlots(
            settings.max_concurrent_computations,
            settings.max_queued_computations,
            settings.queue_wait_seconds,
        )
        state.computation_slots_loop = loop
    slots: ComputationSlots = state.computation_slots
    return slots


def _forget(pending: set[asyncio.Task[Any]], task: asyncio.Task[Any]) -> None:
    pending.discard(task)
    if task.cancelled():
        return
    error = task.exception()
    if isinstance(error, DeadlineExceededError):
        _log.info("abandoned computation stopped at its deadline")
    elif error is not None:
        _log.error("abandoned computation failed", exc_info=error)


def document_time_limit(schema: dict[str, Any], seconds: float) -> None:
    """Put the limit's seconds into the 503 answer the time-limited routes declare."""
    for operations in schema.get("paths", {}).values():
        for operation in operations.values():
            answer = operation.get("responses", {}).get("503")
            if answer is not None and answer.get("description") == _TIME_LIMIT_ANSWER:
                answer["description"] = _TIME_LIMIT_ANSWER.replace(
                    "TRIPOINT_MAX_REQUEST_SECONDS",
                    f"{seconds:g} s (TRIPOINT_MAX_REQUEST_SECONDS)",
                    1,
                )
