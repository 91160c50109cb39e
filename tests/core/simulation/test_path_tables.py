"""Path tables and the product state against the equilibrium states they come from.

Source: the balances' equilibrium paths (service.core.balances.equilibrium_paths, i.e.
IAPWS R6-95(2018), R10-06(2009), R14-08(2011) as implemented in the core and checked
against the releases in tests/reference/); the tables must reproduce them.
"""

from __future__ import annotations

import numpy as np
import pytest

from service.core.balances.equilibrium_paths import (
    freezing_solution_states,
    ice_vapor_states,
    liquid_vapor_states,
)
from service.core.simulation.path_tables import path_tables
from service.core.simulation.product_state import ProductThermodynamics


def test_liquid_table_matches_equilibrium_states() -> None:
    temperature = np.linspace(243.2, 373.1, 157)
    states = liquid_vapor_states(temperature)
    table = np.array([path_tables().liquid.values(t) for t in temperature])
    np.testing.assert_allclose(table[:, 0], states.condensed.specific_enthalpy, atol=1e-5)
    np.testing.assert_allclose(np.exp(table[:, 1]), states.pressure, rtol=1e-9)
    np.testing.assert_allclose(table[:, 2], states.vapor.specific_enthalpy, rtol=1e-12)


def test_ice_and_solution_tables_match_equilibrium_states() -> None:
    temperature = np.linspace(173.2, 273.16, 131)
    states = ice_vapor_states(temperature)
    table = np.array([path_tables().ice.values(t) for t in temperature])
    np.testing.assert_allclose(table[:, 0], states.condensed.specific_enthalpy, atol=1e-5)
    np.testing.assert_allclose(np.exp(table[:, 1]), states.pressure, rtol=1e-9)
    solution = freezing_solution_states(temperature[temperature > 243.2])
    fitted = [path_tables().solution.values(t)[0] for t in solution.temperature]
    np.testing.assert_allclose(fitted, solution.log_water_activity, atol=1e-11)


@pytest.mark.parametrize(
    ("solute_constant", "temperature"),
    [(None, 330.0), (None, 250.0), (0.05, 300.0), (0.05, 265.0)],
    ids=["pure-liquid", "pure-ice", "solution-liquid", "solution-freezing"],
)
def test_state_inverts_the_energy(solute_constant: float | None, temperature: float) -> None:
    # Round trip: energy at T (built from the path tables), then T from the energy.
    thermodynamics = ProductThermodynamics((500.0, 0.1, 0.0), solute_constant)
    water = 1.0
    liquid = path_tables().liquid.values(temperature)
    sensible, _ = thermodynamics.sensible(temperature)
    if solute_constant is not None and temperature < 273.16:
        log_a = path_tables().solution.values(temperature)[0]
        unfrozen = solute_constant / np.expm1(-log_a)
        ice = path_tables().ice.values(temperature)
        energy = water * ice[0] + unfrozen * (liquid[0] - ice[0]) + sensible
        expected_ice = water - unfrozen
    elif temperature < 273.16:
        energy = water * path_tables().ice.values(temperature)[0] + sensible
        expected_ice = water
    else:
        energy = water * liquid[0] + sensible
        expected_ice = 0.0
    state = thermodynamics.state(energy, water, 280.0)
    assert state.temperature == pytest.approx(temperature, abs=1e-8)
    assert state.ice_mass == pytest.approx(expected_ice, abs=1e-9)


def test_plateau_of_pure_water() -> None:
    # Between all-liquid and all-ice energies at 273.16 K the temperature stays at the
    # triple point and the ice grows linearly (definition of the plateau).
    thermodynamics = ProductThermodynamics((0.0, 0.0, 0.0), None)
    liquid, ice = thermodynamics.triple_point_energies(2.0)
    state = thermodynamics.state(0.25 * liquid + 0.75 * ice, 2.0, 300.0)
    assert state.temperature == 273.16
    assert state.ice_mass == pytest.approx(1.5, rel=1e-12)
    assert state.equilibrium_pressure == 611.657
