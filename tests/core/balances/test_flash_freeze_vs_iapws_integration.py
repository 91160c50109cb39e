"""flash_freeze against an independent integration built in this test.

Independent source: iapws 1.5.5 (IAPWS95 class: its own saturation solver and
Helmholtz function; iapws._iapws._Ice for ice Ih, R10-06) with a plain scipy ODE
solver (solve_ivp, RK45) and finite-difference slopes. The balance integrated is
d(m h_liquid) = h_vapor dm + m v_liquid dp along saturation, then freezing at the
triple point with m_v = m_l (h_l - h_ice) / (h_v - h_ice).
"""

from __future__ import annotations

import numpy as np
import pytest
from iapws import IAPWS95
from iapws._iapws import _Ice
from scipy.integrate import solve_ivp

from service.core.balances import FlashFreezeCase, flash_freeze

_WATER = IAPWS95()
_TRIPLE = 273.16
_STEP = 1e-3  # K, central differences of the iapws saturation properties


def _saturated(temperature: float) -> tuple[float, float, float, float]:
    """h_liquid, h_vapor (J/kg), v_liquid (m3/kg), p (Pa) from iapws 1.5.5 IAPWS95."""
    liquid_density, vapor_density, pressure_kpa = _WATER._saturation(temperature)
    h_liquid = _WATER._Helmholtz(liquid_density, temperature)["h"] * 1e3
    h_vapor = _WATER._Helmholtz(vapor_density, temperature)["h"] * 1e3
    return h_liquid, h_vapor, 1.0 / liquid_density, pressure_kpa * 1e3


def _log_mass_slope(temperature: float, state: np.ndarray) -> list[float]:
    h_l, h_v, v_l, _p = _saturated(temperature)
    h_plus, _, _, p_plus = _saturated(temperature + _STEP)
    h_minus, _, _, p_minus = _saturated(temperature - _STEP)
    along = (h_plus - h_minus) / (2 * _STEP) - v_l * (p_plus - p_minus) / (2 * _STEP)
    return [along / (h_v - h_l)]


def _independent_evaporated_fraction(initial_temperature: float) -> float:
    solution = solve_ivp(
        _log_mass_slope, (initial_temperature, _TRIPLE + _STEP), [0.0], rtol=1e-10, atol=1e-12
    )
    # last _STEP kelvin with the slope at the triple point (keeps the differences in range)
    log_mass = float(solution.y[0, -1]) - _log_mass_slope(_TRIPLE + _STEP, np.zeros(1))[0] * _STEP
    liquid = float(np.exp(log_mass))
    h_l, h_v, _, _ = _saturated(_TRIPLE)
    h_ice = _Ice(_TRIPLE, 611.657e-6)["h"] * 1e3
    frozen_evaporated = liquid * (h_l - h_ice) / (h_v - h_ice)
    return float(1.0 - liquid + frozen_evaporated)


@pytest.mark.parametrize(
    ("initial_temperature", "tolerance"),
    [
        pytest.param(283.15, 5e-9, id="10degC"),
        pytest.param(293.15, 5e-9, id="20degC"),
        pytest.param(333.15, 5e-9, id="60degC"),
    ],
)
def test_evaporated_fraction_matches_independent_iapws_integration(
    initial_temperature: float, tolerance: float
) -> None:
    # source: independent scipy RK45 integration on iapws 1.5.5 IAPWS95 and _Ice (R10-06)
    expected = _independent_evaporated_fraction(initial_temperature)
    result = flash_freeze(FlashFreezeCase(initial_temperature=initial_temperature))
    assert float(result.evaporated_fraction_of_water) == pytest.approx(expected, rel=tolerance)
