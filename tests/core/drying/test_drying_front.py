"""The quasi-steady front balance of primary drying against a derivation written here.

The balance (M. J. Pikal, M. L. Roy, S. Shah, J. Pharm. Sci. 73(9), 1224-1237 (1984) for
the vial heat transfer; M. J. Pikal, J. Parenter. Sci. Technol. 39(3), 115-139 (1985) for
the dried-layer resistance) is written out again below and solved with scipy's brentq on
the iapws package's sublimation pressure (R14-08) and enthalpies (R10-06 ice, IAPWS-95
vapor), a library independent of the core.
"""

from __future__ import annotations

import warnings

import numpy as np
import pytest
from iapws import IAPWS95
from iapws._iapws import _Ice, _Sublimation_Pressure
from scipy.optimize import brentq

from service.core.drying import (
    STATUS_FRONT_AT_TRIPLE_POINT,
    STATUS_NO_DRIVING_FORCE,
    STATUS_SUBLIMATING,
    DriedLayerResistance,
    SublimationFront,
    VialHeatTransfer,
    latent_heat_of_sublimation,
    solve_sublimation_front,
)
from service.core.errors import OutOfRangeError
from service.core.properties.sublimation import sublimation_by_temperature

# An invented 10 mL tubing vial in a laboratory dryer (demo constants of the usual size).
HEAT = VialHeatTransfer(contact=11.5, gas_conduction=0.28, gas_conduction_saturation=0.0035)
RESISTANCE = DriedLayerResistance(
    at_zero_thickness=6.7e4, thickness_coefficient=7.7e7, thickness_saturation=120.0
)
VIAL_AREA = 3.8e-4  # m2, outer bottom
PRODUCT_AREA = 3.1e-4  # m2, inner
CONDUCTIVITY = 2.4  # W/(m K)


def _solve(
    shelf: float | np.ndarray, pressure: float | np.ndarray, dried: float, frozen: float
) -> SublimationFront:
    return solve_sublimation_front(
        shelf,
        pressure,
        dried,
        frozen,
        heat_transfer=HEAT,
        resistance=RESISTANCE,
        heat_transfer_area=VIAL_AREA,
        product_area=PRODUCT_AREA,
        frozen_conductivity=CONDUCTIVITY,
    )


def _iapws_latent_heat(temperature: float) -> float:
    """iapws 1.5.5: IAPWS95 vapor minus _Ice at the R14-08 pressure, J/kg.

    The vapor is taken at (T, density), the density found here by iterating on iapws's own
    pressure from the ideal-gas value: iapws's (T, P) solve lands on wrong densities below
    about 230 K (seen with iapws 1.5.5 at 225 K: 6.1e-3 kg/m3 against 4.8e-5 kg/m3)."""
    pressure_mpa = _Sublimation_Pressure(temperature)
    density = pressure_mpa * 1e6 / (461.51805 * temperature)
    with warnings.catch_warnings():
        warnings.filterwarnings("ignore", message="Using extrapolated values", category=UserWarning)
        for _ in range(4):
            vapor = IAPWS95(T=temperature, rho=density)
            density *= pressure_mpa / vapor.P
        vapor = IAPWS95(T=temperature, rho=density)
    return float((vapor.h - _Ice(temperature, pressure_mpa)["h"]) * 1e3)


def _independent_front(shelf: float, pressure: float, dried: float, frozen: float) -> float:
    """The balance written out again: shelf -> vial bottom -> frozen layer -> front, heat
    = latent heat x (p_ice - P_c) A_p / R_p; solved by brentq on iapws properties."""
    kv = 11.5 + 0.28 * pressure / (1.0 + 0.0035 * pressure)
    rp = 6.7e4 + 7.7e7 * dried / (1.0 + 120.0 * dried)
    resistance_heat = 1.0 / (VIAL_AREA * kv) + frozen / (PRODUCT_AREA * CONDUCTIVITY)

    def residual(front: float) -> float:
        heat = (shelf - front) / resistance_heat
        vapor_pressure = _Sublimation_Pressure(front) * 1e6
        rate = PRODUCT_AREA * (vapor_pressure - pressure) / rp
        return float(heat - _iapws_latent_heat(front) * rate)

    frost_point = brentq(lambda t: _Sublimation_Pressure(t) * 1e6 - pressure, 190.0, 273.16)
    return float(brentq(residual, frost_point, min(shelf, 273.16), xtol=1e-12, rtol=1e-15))


CASES = [
    # shelf K, chamber Pa, dried m, frozen m
    pytest.param(258.15, 10.0, 0.002, 0.008, id="-15C-10Pa-2mm"),
    pytest.param(233.15, 5.0, 0.0, 0.010, id="-40C-5Pa-start"),
    pytest.param(273.15, 20.0, 0.009, 0.001, id="0C-20Pa-late"),
    pytest.param(293.15, 30.0, 0.005, 0.005, id="+20C-30Pa-half"),
]


@pytest.mark.parametrize(("shelf", "pressure", "dried", "frozen"), CASES)
def test_front_temperature_matches_independent_solution(
    shelf: float, pressure: float, dried: float, frozen: float
) -> None:
    """Same root as the balance solved here with the iapws package (latent heats agree
    to about 1e-9 relative, which moves the root by far less than 1e-6 K)."""
    front = _solve(shelf, pressure, dried, frozen)
    expected = _independent_front(shelf, pressure, dried, frozen)
    assert float(front.front_temperature) == pytest.approx(expected, abs=1e-6)
    assert int(front.status) == STATUS_SUBLIMATING


@pytest.mark.parametrize(("shelf", "pressure", "dried", "frozen"), CASES)
def test_heat_in_equals_sublimation_enthalpy_times_rate(
    shelf: float, pressure: float, dried: float, frozen: float
) -> None:
    """Heat in through the vial bottom, A_v K_v (T_shelf - T_bottom), computed here from the
    answer's bottom temperature, equals the enthalpy of sublimation (the core's exact R10-06 /
    IAPWS-95 value at the answer's front temperature) times the mass rate
    A_p (p_ice(T_front) - P_c) / R_p (p_ice from iapws), to 1e-9 relative."""
    front = _solve(shelf, pressure, dried, frozen)
    t_front = float(front.front_temperature)
    t_bottom = float(front.bottom_temperature)
    kv = 11.5 + 0.28 * pressure / (1.0 + 0.0035 * pressure)
    rp = 6.7e4 + 7.7e7 * dried / (1.0 + 120.0 * dried)
    heat_in = VIAL_AREA * kv * (shelf - t_bottom)
    rate = PRODUCT_AREA * (_Sublimation_Pressure(t_front) * 1e6 - pressure) / rp
    latent = float(sublimation_by_temperature(t_front).latent_heat_of_sublimation)
    assert heat_in == pytest.approx(latent * rate, rel=1e-9)
    assert float(front.heat_flow) == pytest.approx(heat_in, rel=1e-12)
    assert float(front.sublimation_rate) == pytest.approx(rate, rel=1e-9)
    # conduction through the frozen layer: T_bottom - T_front = Q L / (A_p k)
    assert t_bottom - t_front == pytest.approx(
        heat_in * frozen / (PRODUCT_AREA * CONDUCTIVITY), rel=1e-9, abs=1e-12
    )


def test_latent_heat_table_equals_exact_core_value() -> None:
    """The tabulated enthalpy of sublimation equals the exact R10-06 / IAPWS-95 difference
    to 1e-12 relative over the model's range."""
    temperatures = np.linspace(190.0, 273.16, 777)
    exact = sublimation_by_temperature(temperatures).latent_heat_of_sublimation
    np.testing.assert_allclose(latent_heat_of_sublimation(temperatures), exact, rtol=1e-12)


def test_latent_heat_is_not_a_constant() -> None:
    """The enthalpy of sublimation varies by kJ/kg over the range: it has a maximum near
    240 K, where c_p of the ice passes that of the vapor (about 2838.4 kJ/kg at 250 K,
    2835.6 kJ/kg at 210 K, 2834.4 kJ/kg at the triple point: core R10-06 / IAPWS-95)."""
    values = latent_heat_of_sublimation(np.array([210.0, 250.0, 273.16]))
    assert values[1] > values[0] + 2.0e3
    assert values[1] > values[2] + 3.0e3
    assert values[0] == pytest.approx(_iapws_latent_heat(210.0), rel=1e-9)
    assert values[1] == pytest.approx(_iapws_latent_heat(250.0), rel=1e-9)


def test_vectorized_grid_equals_point_solves() -> None:
    shelf = np.array([[240.0], [260.0], [280.0]])
    pressure = np.array([[5.0, 15.0, 25.0]])
    grid = _solve(shelf, pressure, 0.004, 0.006)
    for i in range(3):
        for j in range(3):
            point = _solve(float(shelf[i, 0]), float(pressure[0, j]), 0.004, 0.006)
            assert float(grid.front_temperature[i, j]) == pytest.approx(
                float(point.front_temperature),
                abs=1e-9,
            )


def test_no_driving_force_when_chamber_is_above_the_ice_vapor_pressure() -> None:
    """At -40 degC the ice's vapor pressure is about 12.8 Pa (R14-08): 20 Pa stops it."""
    front = _solve(233.15, 20.0, 0.0, 0.01)
    assert int(front.status) == STATUS_NO_DRIVING_FORCE
    assert float(front.sublimation_rate) == 0.0
    assert float(front.heat_flow) == 0.0


def test_front_at_triple_point_is_flagged() -> None:
    """A hot shelf, a high chamber pressure and a resistant cake: the heat arriving (about
    7 W) exceeds what sublimation at the triple point can take (about 2.7 W): it would melt."""
    heat = VialHeatTransfer(200.0, 1.0, 0.0)
    front = solve_sublimation_front(
        390.0,
        300.0,
        0.0,
        0.01,
        heat_transfer=heat,
        resistance=DriedLayerResistance(1.0e5, 0.0, 0.0),
        heat_transfer_area=VIAL_AREA,
        product_area=PRODUCT_AREA,
        frozen_conductivity=CONDUCTIVITY,
    )
    assert int(front.status) == STATUS_FRONT_AT_TRIPLE_POINT
    assert float(front.front_temperature) == 273.16


@pytest.mark.parametrize(
    ("arguments", "field"),
    [
        ((150.0, 10.0, 0.0, 0.01), "shelf_temperature"),
        ((250.0, 700.0, 0.0, 0.01), "chamber_pressure"),
        ((250.0, 10.0, -0.001, 0.01), "dried_thickness"),
    ],
    ids=["cold-shelf", "pressure-above-triple-point", "negative-thickness"],
)
def test_out_of_range_inputs_name_the_variable(
    arguments: tuple[float, float, float, float], field: str
) -> None:
    with pytest.raises(OutOfRangeError) as raised:
        _solve(*arguments)
    assert raised.value.variable == field


def test_rate_rises_with_shelf_temperature_and_falls_with_resistance() -> None:
    warm = _solve(268.15, 10.0, 0.002, 0.008)
    cold = _solve(248.15, 10.0, 0.002, 0.008)
    late = _solve(268.15, 10.0, 0.008, 0.002)
    assert float(warm.sublimation_rate) > float(cold.sublimation_rate)
    assert float(late.sublimation_rate) < float(warm.sublimation_rate)
    assert float(late.front_temperature) > float(warm.front_temperature)
