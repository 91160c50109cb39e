"""Many chamber simulations at once, in parallel across processes.

The simulation is CPU-bound Python (the ODE right-hand side), so threads do not help:
:func:`simulate_vacuum_chambers` hands the cases to a process pool. The pool is made on
first use, kept for the life of the process (one per worker count) and shut down by
:mod:`concurrent.futures` at exit. Its processes are started by a fork server, not forked
from a (threaded) server process; each warms the simulation's property tables once.

Every case is validated in the calling process first, so a bad input is refused before
any work starts and names its case by ``index``. A core error raised inside a worker comes
back as the same error, with the case's index where the error has one.
"""

from __future__ import annotations

import dataclasses
import multiprocessing
import threading
from collections.abc import Sequence
from concurrent.futures import ProcessPoolExecutor
from concurrent.futures.process import BrokenProcessPool
from typing import Any, Final

from service.core.deadline import current_deadline, inherited_deadline
from service.core.errors import OutOfRangeError, TripointError, WorkerLostError
from service.core.simulation.inputs import VacuumChamberCase, validate_case
from service.core.simulation.results import VacuumChamberResult
from service.core.simulation.vacuum_chamber import simulate_vacuum_chamber

__all__ = ["simulate_vacuum_chambers"]

_POOLS: dict[int, ProcessPoolExecutor] = {}
_POOLS_LOCK: Final = threading.Lock()
_CHUNK: Final = 1


def _warm() -> None:
    """Build the per-process tables a first simulation would otherwise pay for."""
    from service.core.simulation.path_tables import path_tables

    path_tables()


def _pool(workers: int) -> ProcessPoolExecutor:
    with _POOLS_LOCK:
        pool = _POOLS.get(workers)
        if pool is None:
            context = multiprocessing.get_context("forkserver")
            pool = ProcessPoolExecutor(workers, mp_context=context, initializer=_warm)
            _POOLS[workers] = pool
        return pool


def _run(case: VacuumChamberCase, deadline: tuple[float, float] | None) -> tuple[str, Any]:
    """One simulation in a worker, under the caller's deadline; a core error travels as its
    class and fields (the errors' own pickling would lose their fields)."""
    try:
        with inherited_deadline(deadline):
            return "result", simulate_vacuum_chamber(case)
    except TripointError as error:
        fields = {item.name: getattr(error, item.name) for item in dataclasses.fields(error)}  # type: ignore[arg-type]
        return "error", (type(error), fields)


def _with_index(error: TripointError, index: int | None) -> TripointError:
    if isinstance(error, OutOfRangeError):
        return dataclasses.replace(error, index=index)
    return error


def simulate_vacuum_chambers(
    cases: Sequence[VacuumChamberCase], workers: int = 1
) -> list[VacuumChamberResult]:
    """Simulate every case, in order, on up to ``workers`` processes.

    Parameters
    ----------
    cases : sequence of VacuumChamberCase
        At least one.
    workers : int
        Processes, >= 1; 1 (or a single case) simulates in the calling thread.

    Returns
    -------
    list of VacuumChamberResult
        In the order of ``cases``.

    Raises
    ------
    InvalidInputError, OutOfRangeError, UnsupportedStateError, NotConvergedError
        As :func:`simulate_vacuum_chamber`, for the first failing case (out-of-range
        errors carry its ``index``).
    """

    def named(index: int) -> int | None:
        return index if len(cases) > 1 else None  # one case is no sweep: no element named

    for index, case in enumerate(cases):
        try:
            validate_case(case)
        except TripointError as error:
            raise _with_index(error, named(index)) from None
    if workers <= 1 or len(cases) <= 1:
        results = []
        for index, case in enumerate(cases):
            try:
                results.append(simulate_vacuum_chamber(case))
            except TripointError as error:
                raise _with_index(error, named(index)) from None
        return results
    # The workers stop at the caller's deadline too (a sweep past the time limit frees the
    # pool instead of running on).
    deadline = current_deadline()
    pool = _pool(workers)
    try:
        answers = list(pool.map(_run, cases, [deadline] * len(cases), chunksize=_CHUNK))
    except BrokenProcessPool:
        # A worker died (e.g. killed when memory ran out): this pool can take no more work.
        # Forget it so that the next sweep starts a fresh one, and say so instead of failing
        # every later sweep.
        with _POOLS_LOCK:
            if _POOLS.get(workers) is pool:
                del _POOLS[workers]
        pool.shutdown(wait=False, cancel_futures=True)
        raise WorkerLostError("simulation sweep") from None
    results = []
    for index, (kind, payload) in enumerate(answers):
        if kind == "error":
            error_type, fields = payload
            raise _with_index(error_type(**fields), index)
        results.append(payload)
    return results
