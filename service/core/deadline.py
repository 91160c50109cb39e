"""Cooperative time limits for long computations.

A caller (the HTTP layer) sets a deadline with :func:`computation_deadline`; the core's
long loops (the chamber simulation's right-hand side, balance sweeps) call
:func:`check_deadline`, which raises :class:`DeadlineExceededError` once the deadline has
passed. The deadline lives in a context variable, so a worker thread started with a copy of
the caller's context (as ``anyio.to_thread`` and ``asyncio.to_thread`` do) sees it, and a
computation abandoned at the limit stops within one loop step instead of running on.
Without a deadline set, the check costs one context-variable read.
"""

from __future__ import annotations

import time
from collections.abc import Iterator
from contextlib import contextmanager
from contextvars import ContextVar
from dataclasses import dataclass

from service.core.errors import TripointError

__all__ = [
    "DeadlineExceededError",
    "check_deadline",
    "computation_deadline",
    "current_deadline",
    "inherited_deadline",
    "set_deadline",
]

_DEADLINE: ContextVar[tuple[float, float] | None] = ContextVar(
    "tripoint_computation_deadline", default=None
)
"""(monotonic time of the deadline, seconds allowed)."""


@dataclass
class DeadlineExceededError(TripointError, TimeoutError):
    """The computation ran past the deadline its caller set."""

    seconds: float

    def __post_init__(self) -> None:
        super().__init__(str(self))

    def __str__(self) -> str:
        return f"computation stopped at its time limit of {self.seconds:g} s"


def set_deadline(seconds: float) -> None:
    """Set a deadline ``seconds`` from now for the current context (and its copies).

    An earlier deadline already set stays: a part of a request cannot outlast the whole.
    """
    current = _DEADLINE.get()
    wanted = time.monotonic() + seconds
    if current is None or wanted < current[0]:
        _DEADLINE.set((wanted, seconds))


@contextmanager
def computation_deadline(seconds: float) -> Iterator[None]:
    """Run the block with a deadline ``seconds`` from now; the previous one is restored."""
    token = _DEADLINE.set((time.monotonic() + seconds, seconds))
    try:
        yield
    finally:
        _DEADLINE.reset(token)


def current_deadline() -> tuple[float, float] | None:
    """The current deadline as (monotonic time, seconds allowed), or None; to hand to a
    worker process (see :func:`inherited_deadline`)."""
    return _DEADLINE.get()


@contextmanager
def inherited_deadline(deadline: tuple[float, float] | None) -> Iterator[None]:
    """Run the block under a deadline taken from :func:`current_deadline` in another process.

    ``time.monotonic`` is one system-wide clock on the platforms served (Linux
    ``CLOCK_MONOTONIC``), so the time carries over between processes of one machine.
    """
    token = _DEADLINE.set(deadline)
    try:
        yield
    finally:
        _DEADLINE.reset(token)


def check_deadline() -> None:
    """Raise :class:`DeadlineExceededError` if the current deadline has passed.

    Raises
    ------
    DeadlineExceededError
        With the seconds the deadline allowed, measured from when it was set.
    """
    deadline = _DEADLINE.get()
    if deadline is not None and time.monotonic() > deadline[0]:
        raise DeadlineExceededError(seconds=deadline[1])
