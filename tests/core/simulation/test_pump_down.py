"""Chamber gas balances against closed-form vacuum-technology results.

The product starts warm (its vapor pressure far below the chamber pressure during the
checks) with equilibrium evaporation, so nothing evaporates before the flash point and
the chamber holds dry air only: the air balance alone is checked.

Source for every closed form here: the pump-down law V dp/dt = Q - S_eff p of a well-mixed
chamber, standard vacuum-technology result (e.g. O'Hanlon, A User's Guide to Vacuum
Technology, 3rd ed., Wiley (2003); from memory), solved analytically.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from service.core.simulation import Chamber, Product, Pump, VacuumChamberCase
from service.core.simulation.pump import PumpingSpeed
from service.core.simulation.vacuum_chamber import simulate_vacuum_chamber

VOLUME = 0.4  # m3
P0 = 1.0e5  # Pa
PRODUCT = Product(mass=0.5, initial_temperature=280.0)  # vapor pressure about 991 Pa


def _series(pump: Pump, leak: float = 0.0, end: float = 60.0) -> tuple[np.ndarray, np.ndarray]:
    result = simulate_vacuum_chamber(
        VacuumChamberCase(
            chamber=Chamber(
                free_volume=VOLUME, initial_pressure=P0, temperature=293.15, leak_rate=leak
            ),
            pump=pump,
            product=PRODUCT,
            end_time=end,
            series_points=61,
        )
    )
    series = result.series
    assert float(series.vapor_pressure.max()) == 0.0  # dry until the flash point
    return series.time, series.total_pressure


def test_empty_chamber_pump_down_is_exponential() -> None:
    # p(t) = p0 exp(-S t / V): standard vacuum-technology result.
    speed = 0.02
    time, pressure = _series(Pump(nominal_speed=speed), end=60.0)
    expected = P0 * np.exp(-speed * time / VOLUME)
    np.testing.assert_allclose(pressure, expected, rtol=2e-7)


def test_pump_down_towards_ultimate_pressure() -> None:
    # V dp/dt = -S (1 - p_u/p) p  =>  p(t) = p_u + (p0 - p_u) exp(-S t / V).
    speed, ultimate = 0.02, 2000.0
    time, pressure = _series(Pump(nominal_speed=speed, ultimate_pressure=ultimate), end=60.0)
    expected = ultimate + (P0 - ultimate) * np.exp(-speed * time / VOLUME)
    np.testing.assert_allclose(pressure, expected, rtol=2e-7)


def test_leak_only_pressure_rises_at_q_over_v() -> None:
    # No pumping (speed curve of zeros): V dp/dt = Q, p = p0 + Q t / V.
    leak = 50.0  # Pa m3/s
    pump = Pump(nominal_speed=1.0, speed_curve_pressures=(1.0, 1e6), speed_curve_speeds=(0.0, 0.0))
    time, pressure = _series(pump, leak=leak, end=100.0)
    np.testing.assert_allclose(pressure, P0 + leak * time / VOLUME, rtol=1e-9)


def test_leak_with_pump_tends_to_q_over_s() -> None:
    # p(t) = Q/S + (p0 - Q/S) exp(-S t / V) -> Q/S (steady state above the flash point).
    leak, speed = 100.0, 0.01  # Q/S = 10 kPa
    time, pressure = _series(Pump(nominal_speed=speed), leak=leak, end=1500.0)
    steady = leak / speed
    expected = steady + (P0 - steady) * np.exp(-speed * time / VOLUME)
    np.testing.assert_allclose(pressure, expected, rtol=2e-7)
    assert pressure[-1] == pytest.approx(steady, rel=1e-6)


def test_flash_time_of_dry_pump_down() -> None:
    # Flash point when P0 exp(-S t/V) = p_sat(20 degC) = 2339.3 Pa: t = V/S ln(P0/p_sat).
    # Saturation pressure at 293.15 K: 2339.3 Pa, IAPWS R6-95(2018) (iapws 1.5.5 IAPWS95 class
    # gives 2.3393 kPa).
    speed = 0.05
    result = simulate_vacuum_chamber(
        VacuumChamberCase(
            chamber=Chamber(free_volume=VOLUME, initial_pressure=P0, temperature=293.15),
            pump=Pump(nominal_speed=speed),
            product=Product(mass=0.5, initial_temperature=293.15),
            end_time=60.0,
        )
    )
    flash = result.summary.flash_time
    assert flash is not None
    saturation = float(result.events[0].state.product_vapor_pressure[0])
    assert saturation == pytest.approx(2339.3, rel=2e-5)
    assert flash == pytest.approx(VOLUME / speed * math.log(P0 / saturation), rel=1e-7)


@pytest.mark.parametrize(
    ("pressure", "expected"),
    [(1.0, 0.01), (10.0, 0.01), (100.0, 0.025), (1000.0, 0.04), (1e5, 0.04)],
    ids=["below-curve", "first-point", "log-midpoint", "last-point", "above-curve"],
)
def test_speed_curve_interpolates_in_log_pressure(pressure: float, expected: float) -> None:
    # Linear in ln p between (10 Pa, 0.01) and (1000 Pa, 0.04): the midpoint in ln p is
    # 100 Pa -> 0.025 m3/s (definition of the model); constant beyond the ends.
    speed = PumpingSpeed(
        Pump(
            nominal_speed=1.0, speed_curve_pressures=(10.0, 1000.0), speed_curve_speeds=(0.01, 0.04)
        )
    )
    assert speed(pressure) == pytest.approx(expected, rel=1e-12)
