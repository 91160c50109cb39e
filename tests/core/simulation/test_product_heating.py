"""Heat from the chamber into the product: wall radiation and shelf contact.

The product (1 kg of water) sits in a chamber whose pump barely moves (the chamber stays near
1 atm, far above the product's vapor pressure: nothing evaporates in the equilibrium mode), so
it only warms. Independent reference written here: the time to warm from T_0 to T_1 is
t = integral m c_p(T) / Q(T) dT, with c_p of saturated liquid water from iapws 1.5.5 (IAPWS95)
and Q from the Stefan-Boltzmann law for a small grey body in a large enclosure (Incropera
et al., Fundamentals of Heat and Mass Transfer, 6th ed. (2007), eq. 1.7; from memory;
sigma = 5.670374419e-8 W/(m2 K4), CODATA 2018, exact) or Newton's law for contact.
"""

from __future__ import annotations

import numpy as np
import pytest
from iapws import IAPWS95
from scipy.integrate import quad

from service.core.errors import OutOfRangeError
from service.core.simulation import Chamber, HeatGainRate, Product, Pump, VacuumChamberCase
from service.core.simulation.vacuum_chamber import simulate_vacuum_chamber

SIGMA = 5.670374419e-8  # W/(m2 K4), CODATA 2018
START, END = 280.0, 300.0  # K


def _case(gain: HeatGainRate) -> VacuumChamberCase:
    return VacuumChamberCase(
        chamber=Chamber(free_volume=1.0, initial_pressure=101325.0, temperature=293.15),
        pump=Pump(nominal_speed=1e-9),
        product=Product(mass=1.0, initial_temperature=START),
        heat_gain=gain,
        end_time=20_000.0,
        series_points=2001,
    )


def _specific_heat(temperature: float) -> float:
    return float(IAPWS95(T=temperature, x=0).cp) * 1e3  # J/(kg K)


def _time_to(series_time: np.ndarray, temperature: np.ndarray, target: float) -> float:
    return float(np.interp(target, temperature, series_time))


@pytest.mark.parametrize(
    ("gain", "rate"),
    [
        (
            HeatGainRate(radiating_area=0.5, emissivity=0.9, wall_temperature=330.0),
            lambda t: SIGMA * 0.9 * 0.5 * (330.0**4 - t**4),
        ),
        (
            HeatGainRate(contact_coefficient=20.0, contact_area=0.05, shelf_temperature=320.0),
            lambda t: 20.0 * 0.05 * (320.0 - t),
        ),
    ],
    ids=["wall-radiation", "shelf-contact"],
)
def test_warming_time_matches_the_integral_of_heat_capacity_over_heat_flow(
    gain: HeatGainRate, rate: object
) -> None:
    assert callable(rate)
    result = simulate_vacuum_chamber(_case(gain))
    series = result.series
    assert float(series.evaporated_mass[-1]) == pytest.approx(0.0, abs=1e-12)
    # The heat flow the simulation reports is the law's at its own temperature.
    np.testing.assert_allclose(
        series.heat_gain_rate,
        [rate(float(t)) for t in series.product_temperature],
        rtol=1e-9,
    )
    expected, _ = quad(lambda t: _specific_heat(t) / rate(t), START, END)
    simulated = _time_to(series.time, series.product_temperature, END)
    assert simulated == pytest.approx(expected, rel=2e-4)  # series interpolation, 2001 points


def test_terms_add_up_with_the_older_ones() -> None:
    # Power, conductance, radiation and contact together: Q at t = 0 is their sum.
    gain = HeatGainRate(
        power=5.0,
        conductance=2.0,
        surroundings_temperature=290.0,
        radiating_area=0.2,
        emissivity=0.8,
        wall_temperature=310.0,
        contact_coefficient=10.0,
        contact_area=0.1,
        shelf_temperature=250.0,
    )
    result = simulate_vacuum_chamber(_case(gain))
    expected = (
        5.0
        + 2.0 * (290.0 - START)
        + SIGMA * 0.8 * 0.2 * (310.0**4 - START**4)
        + 10.0 * 0.1 * (250.0 - START)
    )
    assert float(result.series.heat_gain_rate[0]) == pytest.approx(expected, rel=1e-12)
    assert any("Wall radiation" in line and "CODATA 2018" in line for line in result.assumptions)
    assert any("shelf or tray contact" in line.lower() for line in result.assumptions)


@pytest.mark.parametrize(
    ("gain", "field"),
    [
        (HeatGainRate(radiating_area=0.5, emissivity=0.0), "heat_gain.emissivity"),
        (HeatGainRate(radiating_area=0.5, emissivity=1.2), "heat_gain.emissivity"),
        (HeatGainRate(radiating_area=-1.0), "heat_gain.radiating_area"),
        (HeatGainRate(contact_coefficient=-5.0), "heat_gain.contact_coefficient"),
        (HeatGainRate(contact_area=-0.1), "heat_gain.contact_area"),
        (HeatGainRate(wall_temperature=100.0), "heat_gain.wall_temperature"),
        (HeatGainRate(shelf_temperature=600.0), "heat_gain.shelf_temperature"),
    ],
    ids=["eps-0", "eps-above-1", "area", "coefficient", "contact-area", "wall", "shelf"],
)
def test_out_of_range_heat_terms_name_their_field(gain: HeatGainRate, field: str) -> None:
    with pytest.raises(OutOfRangeError) as caught:
        simulate_vacuum_chamber(_case(gain))
    assert caught.value.variable == field
