"""Benchmark: calibrating the chamber model to a 60-minute log read every 10 s (goal < 5 s).

The log is invented: a 2 m3 produce cooler with 120 kg of leafy greens (95 % water), a
400 m3/h pump running at 0.85 of its nameplate, a -5 degC cold trap, an air leak of
1.5 Pa*m3/s and 400 W of heat gain, simulated for an hour and sampled every 10 s
(361 chamber pressures, 2 % noise, and 361 product temperatures, 0.1 K noise). The fit
estimates the leak rate, the pump speed factor, the heat gain and the product mass from
a start 20 to 30 % off. Reported: the median wall time of 3 fits (one core: the
simulation is single-threaded; set OMP_NUM_THREADS=1 for numpy's linear algebra), the
model runs per fit and the time per model run, for scale. Not a test; run alone with
``.venv/bin/python bench/bench_calibration.py``.
"""

from __future__ import annotations

import statistics
import time
from dataclasses import replace

import numpy as np

from service.core.calibration import (
    EstimatedParameter,
    MeasuredRun,
    MeasuredSeries,
    calibrate_vacuum_chamber,
)
from service.core.simulation import (
    Chamber,
    Condenser,
    HeatGainRate,
    Product,
    Pump,
    VacuumChamberCase,
    simulate_vacuum_chamber,
)

GOAL_SECONDS = 5.0
NAMEPLATE_SPEED = 400.0 / 3600.0

TRUE_CASE = VacuumChamberCase(
    chamber=Chamber(free_volume=2.0, initial_pressure=101325.0, temperature=288.15, leak_rate=1.5),
    pump=Pump(nominal_speed=0.85 * NAMEPLATE_SPEED, ultimate_pressure=50.0),
    condenser=Condenser(surface_temperature=268.15, vapor_conductance=1.0),
    product=Product(
        mass=120.0, initial_temperature=293.15, water_fraction=0.95, solids_specific_heat=1500.0
    ),
    heat_gain=HeatGainRate(power=400.0),
    end_time=3600.0,
    series_points=361,
)

START_CASE = replace(
    TRUE_CASE,
    chamber=replace(TRUE_CASE.chamber, leak_rate=2.0),
    pump=replace(TRUE_CASE.pump, nominal_speed=NAMEPLATE_SPEED),
    product=replace(TRUE_CASE.product, mass=150.0),
    heat_gain=HeatGainRate(power=300.0),
)

PARAMETERS = (
    EstimatedParameter("chamber.leak_rate", 0.1, 20.0),
    EstimatedParameter("pump.speed_scale", 0.5, 1.5),
    EstimatedParameter("heat_gain.power", 0.0, 2000.0),
    EstimatedParameter("product.mass", 50.0, 300.0),
)


def _log() -> MeasuredRun:
    series = simulate_vacuum_chamber(TRUE_CASE).series
    on_grid = np.isclose(np.mod(series.time + 1e-9, 10.0), 0.0, atol=1e-6)
    time_s = series.time[on_grid]
    rng = np.random.default_rng(2026)
    pressure = series.total_pressure[on_grid] * np.exp(0.02 * rng.standard_normal(time_s.size))
    temperature = series.product_temperature[on_grid] + 0.1 * rng.standard_normal(time_s.size)
    return MeasuredRun(
        (
            MeasuredSeries("total_pressure", time_s, pressure, relative_uncertainty=0.02),
            MeasuredSeries("product_temperature", time_s, temperature, absolute_uncertainty=0.1),
        )
    )


def main() -> None:
    run = _log()
    readings = sum(item.time.size for item in run.series)
    simulate_vacuum_chamber(START_CASE)  # fits the path tables once per process
    times = []
    result = None
    for _ in range(3):
        start = time.perf_counter()
        result = calibrate_vacuum_chamber(START_CASE, run, PARAMETERS)
        times.append(time.perf_counter() - start)
    assert result is not None
    median = statistics.median(times)
    verdict = "met" if median < GOAL_SECONDS else "MISSED"
    print(
        f"60-minute log, 10 s readings ({readings} readings, 4 fields): {median:6.2f} s "
        f"per fit (goal < {GOAL_SECONDS:g} s: {verdict})"
    )
    print(
        f"model runs per fit: {result.simulations}; {1e3 * median / result.simulations:6.1f} "
        "ms per run"
    )
    for estimate in result.estimates:
        print(
            f"  {estimate.path:22s} {estimate.value:10.4g} {estimate.unit:8s} "
            f"[{estimate.interval_lower:.4g}, {estimate.interval_upper:.4g}]"
        )
    raise SystemExit(0 if median < GOAL_SECONDS else 1)


if __name__ == "__main__":
    main()
