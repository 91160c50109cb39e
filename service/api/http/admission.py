"""Admission control: a bounded number of computations at once, a bounded queue.

Balances, simulations, batches and CSV requests are CPU-bound. Running more of them at once
than there are cores only makes each slower, and an unbounded backlog makes every client
wait. :class:`ComputationSlots` lets ``max_concurrent_computations`` run, lets at most
``max_queued_computations`` wait up to ``queue_wait_seconds`` for a slot, and answers the
rest at once with 503 and ``Retry-After``. A slot is given back when the computation really
ends (a computation abandoned at the time limit still holds its slot until the core's
deadline check stops it), so the slots count the work the CPU is doing. Light lookups
(the asynchronous GET routes) and ``/health``, ``/ready``, ``/metrics`` never take a slot.
"""

from __future__ import annotations

import asyncio
from collections.abc import Awaitable
from typing import TypeVar

from service.api.http.problems import ProblemError

__all__ = ["ComputationSlots", "ServiceBusyError"]

_Result = TypeVar("_Result")


class ServiceBusyError(ProblemError):
    """503: every computation slot is busy and the queue is full or the wait ran out."""

    def __init__(self, detail: str) -> None:
        super().__init__(
            503,
            "busy",
            "Service busy",
            detail,
            headers={"Retry-After": "2"},
        )


class ComputationSlots:
    """At most ``capacity`` computations at once, ``queue`` waiting, ``wait`` seconds each."""

    def __init__(self, capacity: int, queue: int, wait: float) -> None:
        self.capacity = capacity
        self.queue = queue
        self.wait = wait
        self._free = asyncio.Semaphore(capacity)
        self._waiting = 0

    @property
    def waiting(self) -> int:
        """Computations waiting for a slot now."""
        return self._waiting

    async def acquire(self) -> None:
        """Take a slot, waiting in the bounded queue.

        Raises
        ------
        ServiceBusyError
            The queue is full, or no slot came free within the wait.
        """
        if not self._free.locked():
            await self._free.acquire()
            return
        if self._waiting >= self.queue:
            raise ServiceBusyError(
                f"All {self.capacity} computation slots are busy and {self._waiting} "
                "requests wait already (settings TRIPOINT_MAX_CONCURRENT_COMPUTATIONS, "
                "TRIPOINT_MAX_QUEUED_COMPUTATIONS). Retry shortly."
            )
        self._waiting += 1
        try:
            await asyncio.wait_for(self._free.acquire(), timeout=self.wait)
        except TimeoutError:
            raise ServiceBusyError(
                f"No computation slot came free within {self.wait:g} s (setting "
                "TRIPOINT_QUEUE_WAIT_SECONDS). Retry shortly."
            ) from None
        finally:
            self._waiting -= 1

    def release(self) -> None:
        """Give a slot back."""
        self._free.release()

    async def run(self, work: Awaitable[_Result]) -> _Result:
        """Await ``work`` holding a slot taken beforehand (see :meth:`acquire`)."""
        try:
            return await work
        finally:
            self.release()
