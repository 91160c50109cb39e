"""Benchmark: one integrated pure-water flash-freeze in-process (goal <= 1 ms).

Compared with the same balance integrated naively on iapws 1.5.5 calls (scipy RK45 on
IAPWS95 saturation states, finite-difference slopes). Not a test; run with
``.venv/bin/python bench/bench_balances.py``.
"""

from __future__ import annotations

import time

import numpy as np
from iapws import IAPWS95
from iapws._iapws import _Ice
from scipy.integrate import solve_ivp

from service.core.balances import FlashFreezeCase, flash_freeze
from service.core.balances.evaporative_cooling import EvaporativeCoolingCase, evaporative_cooling

_WATER = IAPWS95()
_TRIPLE = 273.16
_STEP = 1e-3


def _saturated(temperature: float) -> tuple[float, float, float, float]:
    liquid_density, vapor_density, pressure_kpa = _WATER._saturation(temperature)
    h_liquid = _WATER._Helmholtz(liquid_density, temperature)["h"] * 1e3
    h_vapor = _WATER._Helmholtz(vapor_density, temperature)["h"] * 1e3
    return h_liquid, h_vapor, 1.0 / liquid_density, pressure_kpa * 1e3


def _slope(temperature: float, state: np.ndarray) -> list[float]:
    h_l, h_v, v_l, _p = _saturated(temperature)
    h_plus, _, _, p_plus = _saturated(temperature + _STEP)
    h_minus, _, _, p_minus = _saturated(temperature - _STEP)
    along = (h_plus - h_minus) / (2 * _STEP) - v_l * (p_plus - p_minus) / (2 * _STEP)
    return [along / (h_v - h_l)]


def naive_flash_freeze(initial_temperature: float) -> float:
    """Evaporated fraction by RK45 on iapws calls."""
    solution = solve_ivp(_slope, (initial_temperature, _TRIPLE + _STEP), [0.0], rtol=1e-10)
    liquid = float(np.exp(solution.y[0, -1] - _slope(_TRIPLE + _STEP, np.zeros(1))[0] * _STEP))
    h_l, h_v, _, _ = _saturated(_TRIPLE)
    h_ice = _Ice(_TRIPLE, 611.657e-6)["h"] * 1e3
    return float(1.0 - liquid + liquid * (h_l - h_ice) / (h_v - h_ice))


def _time_per_call(function: object, arguments: list[float]) -> float:
    start = time.perf_counter()
    for argument in arguments:
        function(argument)  # type: ignore[operator]
    return (time.perf_counter() - start) / len(arguments)


def main() -> None:
    flash_freeze(FlashFreezeCase(initial_temperature=300.0))  # builds the saturation tables
    temperatures = list(np.linspace(275.0, 360.0, 200))  # distinct: no cache hits

    def core(temperature: float) -> None:
        flash_freeze(FlashFreezeCase(initial_temperature=temperature))

    core_time = _time_per_call(core, temperatures)
    naive_time = _time_per_call(naive_flash_freeze, temperatures[:3])
    sweep_start = time.perf_counter()
    flash_freeze(FlashFreezeCase(initial_temperature=np.linspace(275.5, 360.5, 100)))
    sweep_time = (time.perf_counter() - sweep_start) / 100

    def cooling(temperature: float) -> None:
        evaporative_cooling(
            EvaporativeCoolingCase(
                product_mass=1.0,
                initial_temperature=temperature,
                final_temperature=275.15,
                specific_heat=3900.0,
            )
        )

    cooling_time = _time_per_call(cooling, temperatures[10:110])
    print(f"flash_freeze, integrated, one case in-process: {core_time * 1e3:.3f} ms (goal 1 ms)")
    print(f"flash_freeze, 100-case sweep, per case:        {sweep_time * 1e3:.3f} ms")
    print(f"evaporative_cooling, one case:                 {cooling_time * 1e3:.3f} ms")
    print(f"naive RK45 on iapws 1.5.5 calls, one case:     {naive_time * 1e3:.1f} ms")
    print(f"ratio naive / core:                            {naive_time / core_time:.0f}")


if __name__ == "__main__":
    main()
