"""Supercooling and nucleation in the chamber simulation, consistent with the flash-freeze
balance: the water stays liquid below its freezing point down to the nucleation temperature,
then recalesces at once and adiabatically to its freezing line.

Independent reference: the ice that recalescence forms from water supercooled to T_n,
x = (h_liquid(T_n) - h_liquid(T_t)) / (h_ice(T_t) - h_liquid(T_t)) per kg of water, with
iapws 1.5.5 (IAPWS95 for the metastable liquid at its saturation pressure, _Ice for
IAPWS R10-06 ice at the triple point).
"""

from __future__ import annotations

from dataclasses import replace

import numpy as np
import pytest
from iapws import IAPWS95
from iapws._iapws import _Ice
from scipy.optimize import brentq

from service.core.balances import named_solute
from service.core.errors import OutOfRangeError
from service.core.simulation import Chamber, Product, Pump, VacuumChamberCase
from service.core.simulation.vacuum_chamber import simulate_vacuum_chamber

TRIPLE_T, TRIPLE_P = 273.16, 611.657e-6  # K, MPa

CASE = VacuumChamberCase(
    chamber=Chamber(free_volume=0.5, initial_pressure=101325.0, temperature=293.15),
    pump=Pump(nominal_speed=0.05, ultimate_pressure=10.0),
    product=Product(mass=1.0, initial_temperature=283.15),
    end_time=1800.0,
    series_points=400,
)


_FLUID = IAPWS95()


def _liquid_enthalpy(temperature: float, pressure: float = 500.0) -> float:
    """J/kg of (metastable) liquid water at T and p (Pa) from iapws' IAPWS-95 Helmholtz
    function: the pressure's effect, v dp of about 0.5 J/kg here, is below the tolerance."""
    density = brentq(
        lambda rho: _FLUID._Helmholtz(rho, temperature)["P"] - pressure / 1e3,  # kPa
        980.0,
        1005.0,
        xtol=1e-12,
    )
    return float(_FLUID._Helmholtz(density, temperature)["h"]) * 1e3


@pytest.mark.parametrize("nucleation", [270.15, 268.15, 263.15])
def test_recalescence_forms_the_ice_the_energy_balance_says(nucleation: float) -> None:
    result = simulate_vacuum_chamber(
        replace(CASE, product=replace(CASE.product, nucleation_temperature=nucleation))
    )
    event = next(e for e in result.events if e.name == "freezing-starts")
    assert "nucleates" in event.detail
    # After the jump the product sits on its freezing line (pure water: the triple point).
    assert float(event.state.product_temperature[0]) == pytest.approx(TRIPLE_T, abs=1e-6)
    water_left = 1.0 - float(event.state.evaporated_mass[0])
    ice = _Ice(TRIPLE_T, TRIPLE_P)["h"] * 1e3
    share = (_liquid_enthalpy(nucleation) - _liquid_enthalpy(TRIPLE_T)) / (
        ice - _liquid_enthalpy(TRIPLE_T)
    )
    assert float(event.state.ice_fraction[0]) == pytest.approx(water_left * share, rel=1e-4)
    # Before it the product was liquid below its freezing point, down to T_n.
    before = result.series.time < event.time
    assert np.all(result.series.ice_fraction[before] == 0.0)
    assert float(np.min(result.series.product_temperature[before])) < TRIPLE_T - 0.5
    assert float(np.min(result.series.product_temperature[before])) >= nucleation - 1e-6
    assert abs(result.balance.relative_energy_residual) < 1e-9
    assert abs(result.balance.relative_mass_residual) < 1e-12


def test_supercooling_delays_freezing_and_ends_frozen_alike() -> None:
    plain = simulate_vacuum_chamber(CASE)
    cooled = simulate_vacuum_chamber(
        replace(CASE, product=replace(CASE.product, nucleation_temperature=266.15))
    )
    plain_start, cooled_start = (
        next(e.time for e in r.events if e.name == "freezing-starts") for r in (plain, cooled)
    )
    assert cooled_start > plain_start
    assert cooled.summary.ice_mass == pytest.approx(plain.summary.ice_mass, rel=1e-3)


def test_a_supercooled_solution_recalesces_to_its_freezing_onset() -> None:
    product = Product(
        mass=1.0,
        initial_temperature=283.15,
        water_fraction=0.9,
        solute=replace(named_solute("sucrose", 0.10), activity_model=None),
        nucleation_temperature=266.15,
    )
    result = simulate_vacuum_chamber(replace(CASE, product=product))
    event = next(e for e in result.events if e.name == "freezing-starts")
    assert float(event.state.ice_fraction[0]) > 0.0
    assert float(event.state.product_temperature[0]) > 266.15 + 4.0  # near -0.6 degC onset


@pytest.mark.parametrize("nucleation", [240.0, 273.16, 275.0])
def test_a_nucleation_temperature_outside_its_range_is_refused(nucleation: float) -> None:
    with pytest.raises(OutOfRangeError) as caught:
        simulate_vacuum_chamber(
            replace(CASE, product=replace(CASE.product, nucleation_temperature=nucleation))
        )
    assert caught.value.variable == "product.nucleation_temperature"
