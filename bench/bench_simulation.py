"""Benchmark: a one-hour vacuum-chamber process simulated in-process (goal <= 50 ms).

The case: 0.5 m3 chamber at 1 atm, 180 m3/h pump with a 10 Pa ultimate pressure,
1 kg of water at 20 degC, equilibrium evaporation, adiabatic: pump-down, flash point,
cooling, freezing on the triple-point plateau, and ice cooling by sublimation for the
rest of the hour. Reported beside it, for scale, the same case with kinetic evaporation
(surface flux in series with diffusion through the chamber air: one small Newton solve per
state evaluation), a condenser and a heat gain, and the flash-freeze balance of the same
water. Not a test;
run with ``.venv/bin/python bench/bench_simulation.py``.
"""

from __future__ import annotations

import statistics
import time
from collections.abc import Callable

from service.core.balances import FlashFreezeCase, flash_freeze
from service.core.simulation import (
    Chamber,
    Condenser,
    HeatGainRate,
    Product,
    Pump,
    VacuumChamberCase,
    simulate_vacuum_chamber,
)

ONE_HOUR = VacuumChamberCase(
    chamber=Chamber(free_volume=0.5, initial_pressure=101325.0, temperature=293.15),
    pump=Pump(nominal_speed=0.05, ultimate_pressure=10.0),
    product=Product(mass=1.0, initial_temperature=293.15),
    end_time=3600.0,
)

KINETIC = VacuumChamberCase(
    chamber=Chamber(free_volume=0.5, initial_pressure=101325.0, temperature=293.15, leak_rate=0.1),
    pump=Pump(nominal_speed=0.05, ultimate_pressure=10.0),
    condenser=Condenser(surface_temperature=233.15, vapor_conductance=0.2),
    product=Product(
        mass=1.0,
        initial_temperature=293.15,
        evaporation="kinetic",
        exposed_area=0.05,
        evaporation_coefficient=0.01,
    ),
    heat_gain=HeatGainRate(power=2.0),
    end_time=3600.0,
)


def _median_ms(function: Callable[[], object], repeats: int = 21) -> float:
    times = []
    for _ in range(repeats):
        start = time.perf_counter()
        function()
        times.append(time.perf_counter() - start)
    return statistics.median(times) * 1e3


def main() -> None:
    simulate_vacuum_chamber(ONE_HOUR)  # fits the path tables once per process
    result = simulate_vacuum_chamber(ONE_HOUR)
    one_hour = _median_ms(lambda: simulate_vacuum_chamber(ONE_HOUR))
    kinetic = _median_ms(lambda: simulate_vacuum_chamber(KINETIC))
    balance = _median_ms(lambda: flash_freeze(FlashFreezeCase(initial_temperature=293.15)))
    summary = result.summary
    print(
        f"one-hour simulation (equilibrium):      {one_hour:8.2f} ms  (goal <= 50 ms; "
        f"{summary.solver_steps} steps, {summary.right_hand_side_evaluations} state evaluations)"
    )
    print(f"one-hour simulation (kinetic, condenser): {kinetic:6.2f} ms")
    print(f"flash-freeze balance, same water:        {balance:8.2f} ms")
    print(f"ratio simulation / balance:              {one_hour / balance:8.1f}")


if __name__ == "__main__":
    main()
