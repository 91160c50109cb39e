"""simulate_vacuum_chambers: the pool answers as the calling thread does, in order, and a
core error raised in a worker comes back as the same error with its fields and index."""

from __future__ import annotations

import os
import time
from dataclasses import replace

import pytest

from service.core.deadline import DeadlineExceededError, computation_deadline
from service.core.errors import OutOfRangeError, UnsupportedStateError, WorkerLostError
from service.core.simulation import Chamber, Product, Pump, VacuumChamberCase, sweeps
from service.core.simulation.sweeps import simulate_vacuum_chambers

CASE = VacuumChamberCase(
    chamber=Chamber(free_volume=0.5, initial_pressure=101325.0, temperature=293.15),
    pump=Pump(nominal_speed=0.05, ultimate_pressure=10.0),
    product=Product(mass=1.0, initial_temperature=293.15),
    end_time=600.0,
    target_temperature=278.15,
    series_points=20,
)
CASES = [replace(CASE, pump=Pump(nominal_speed=speed)) for speed in (0.03, 0.05, 0.08, 0.1)]


def test_pool_matches_serial_in_order() -> None:
    serial = simulate_vacuum_chambers(CASES, workers=1)
    pooled = simulate_vacuum_chambers(CASES, workers=2)
    assert [r.summary.target_time for r in pooled] == [r.summary.target_time for r in serial]
    assert (pooled[0].series.total_pressure == serial[0].series.total_pressure).all()


def test_bad_case_refused_before_work_with_index() -> None:
    bad = replace(CASE, chamber=replace(CASE.chamber, free_volume=-1.0))
    with pytest.raises(OutOfRangeError) as caught:
        simulate_vacuum_chambers([CASE, bad], workers=2)
    assert caught.value.index == 1 and caught.value.variable == "chamber.free_volume"


@pytest.mark.parametrize("workers", [1, 2])
def test_worker_error_comes_back_whole(workers: int) -> None:
    # the chamber starts below the warm product's vapor pressure: refused at the start
    boiling = replace(
        CASE,
        chamber=replace(CASE.chamber, initial_pressure=1000.0),
        target_temperature=None,
    )
    with pytest.raises(UnsupportedStateError) as caught:
        simulate_vacuum_chambers([CASE, boiling], workers=workers)
    assert caught.value.variable == "chamber.initial_pressure"
    assert "vapor pressure" in caught.value.detail


@pytest.mark.parametrize("workers", [1, 2])
def test_the_callers_deadline_stops_the_workers_too(workers: int) -> None:
    # A deadline already passed: every case stops at its first step, in the worker
    # processes as in the calling thread (the deadline travels with each case).
    with computation_deadline(0.0), pytest.raises(DeadlineExceededError):
        time.sleep(0.001)
        simulate_vacuum_chambers(CASES, workers=workers)
    with computation_deadline(600.0):
        assert len(simulate_vacuum_chambers(CASES, workers=workers)) == len(CASES)


def _worker_that_dies(case: VacuumChamberCase, deadline: object) -> object:
    os._exit(1)  # as a worker killed by the operating system would end


def test_a_lost_worker_is_reported_and_the_next_sweep_gets_a_fresh_pool(
    monkeypatch: pytest.MonkeyPatch,
) -> None:
    monkeypatch.setattr(sweeps, "_run", _worker_that_dies)
    with pytest.raises(WorkerLostError, match="simulation sweep"):
        simulate_vacuum_chambers(CASES, workers=2)
    monkeypatch.undo()
    assert len(simulate_vacuum_chambers(CASES, workers=2)) == len(CASES)
