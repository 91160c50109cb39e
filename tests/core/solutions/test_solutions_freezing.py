"""Freezing of named-solute solutions: balances, monotonicity, ranges and errors."""

from __future__ import annotations

import numpy as np
import pytest

from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.ice import ice_properties
from service.core.solutions.aqueous import NAMED_SOLUTION_MODELS, solution_model
from service.core.solutions.freezing import (
    lowest_temperature,
    solute_freezing_point,
    solution_freezing,
    unfrozen_mass_fraction,
)


@pytest.mark.parametrize("name", sorted(NAMED_SOLUTION_MODELS))
def test_mass_closes_and_ice_grows_as_it_cools(name: str) -> None:
    model = solution_model(name)
    onset = float(solute_freezing_point(model, 0.05))
    floor = float(lowest_temperature(model)[0])
    temperature = np.linspace(onset - 0.01, floor + 0.01, 25)
    result = solution_freezing(model, 0.05, temperature)
    total = result.ice_mass_fraction + result.unfrozen_water_fraction + result.mass_fraction
    np.testing.assert_allclose(total, 1.0, atol=1e-12)
    assert np.all(np.diff(result.ice_mass_fraction) > 0.0)
    # solute balance: the solute sits in the unfrozen solution
    solution_mass = result.unfrozen_water_fraction + result.mass_fraction
    np.testing.assert_allclose(
        result.mass_fraction / solution_mass, result.unfrozen_mass_fraction, rtol=1e-12
    )
    # the unfrozen solution is at the ice's activity: its own freezing point is T
    again = solute_freezing_point(model, result.unfrozen_mass_fraction)
    np.testing.assert_allclose(again, temperature, atol=1e-6)
    assert np.all(np.diff(result.specific_enthalpy) < 0.0)


def test_no_ice_above_the_onset_and_enthalpy_of_the_liquid() -> None:
    model = solution_model("sucrose")
    result = solution_freezing(model, 0.2, [275.0, 300.0])
    np.testing.assert_array_equal(result.ice_mass_fraction, [0.0, 0.0])
    np.testing.assert_allclose(result.unfrozen_water_fraction, 0.8)
    assert result.specific_enthalpy[1] > result.specific_enthalpy[0]


def test_brine_of_3_5_percent_at_minus_2_5_has_ice() -> None:
    model = solution_model("sodium chloride")
    result = solution_freezing(model, 0.035, 273.15 - 2.5)
    assert 0.1 < float(result.ice_mass_fraction) < 0.2
    # no ice at -2 degC: the onset is -2.11 degC (handbook -2.10 degC, from memory)
    assert float(solution_freezing(model, 0.035, 271.15).ice_mass_fraction) == 0.0


def test_latent_heat_in_the_enthalpy_step() -> None:
    # Freezing the last bit of pure water: h jumps by the ice's latent heat per kg of ice.
    model = solution_model("glycerol")
    cold = solution_freezing(model, 0.1, 265.0)
    ice = ice_properties(265.0, 101325.0)
    assert float(cold.specific_enthalpy) < 0.0
    assert float(cold.specific_enthalpy) > float(ice.specific_enthalpy)


def test_unfrozen_mass_fraction_rises_as_it_cools() -> None:
    model = solution_model("sodium chloride")
    fractions = unfrozen_mass_fraction(model, np.array([272.0, 268.0, 260.0]))
    assert np.all(np.diff(fractions) > 0.0)


def test_above_the_eutectic_is_refused() -> None:
    model = solution_model("sodium chloride")
    with pytest.raises(OutOfRangeError) as caught:
        solute_freezing_point(model, 0.25)
    assert caught.value.variable == "solute.mass_fraction"
    assert "eutectic" in str(caught.value)


def test_below_the_model_range_is_refused() -> None:
    model = solution_model("sodium chloride")
    with pytest.raises(OutOfRangeError) as caught:
        solution_freezing(model, 0.035, 250.0)
    assert caught.value.variable == "temperature"
    with pytest.raises(OutOfRangeError):
        unfrozen_mass_fraction(model, 274.0)
    with pytest.raises(OutOfRangeError):
        solution_freezing(model, 0.035, 230.0)


def test_unknown_names_are_refused() -> None:
    with pytest.raises(InvalidInputError) as caught:
        solution_model("brine of the moon")
    assert caught.value.variable == "solute.name"
    with pytest.raises(InvalidInputError) as caught:
        solution_model("sucrose", "regular")  # type: ignore[arg-type]
    assert caught.value.variable == "solute.model"


def test_ideal_model_is_named_and_deeper_for_brine() -> None:
    ideal = solution_model("sodium chloride", "ideal")
    assert ideal.model == "ideal"
    assert "Raoult" in ideal.source
    assert float(solute_freezing_point(ideal, 0.035)) < float(
        solute_freezing_point(solution_model("sodium chloride"), 0.035)
    )


def test_bad_numbers_are_refused() -> None:
    model = solution_model("sucrose")
    with pytest.raises(InvalidInputError):
        solution_freezing(model, float("nan"), 270.0)
    with pytest.raises(OutOfRangeError):
        solution_freezing(model, 0.1, 270.0, pressure=-1.0)


def test_freezing_points_at_vacuum_pressures() -> None:
    # Under vacuum (below the triple-point pressure, 611.657 Pa) the freezing point rises by
    # the melting line's slope, dT/dp = T (v_liquid - v_ice) / L_f, about -7.4e-8 K/Pa
    # (Clausius-Clapeyron with IAPWS-95 and R10-06 volumes and latent heat; from memory);
    # the pure-water end of the line is taken as 273.16 K (4.5e-5 K low at most).
    from service.core.solutions.aqueous import solution_model as model_of
    from service.core.solutions.freezing import solute_freezing_point as onset_of

    sucrose = model_of("sucrose")
    vacuum = float(onset_of(sucrose, 0.10, 500.0))
    atmospheric = float(onset_of(sucrose, 0.10, 101325.0))
    assert vacuum - atmospheric == pytest.approx(7.4e-8 * (101325.0 - 500.0), rel=0.05)
    assert float(onset_of(sucrose, 0.0, 500.0)) == pytest.approx(273.16, abs=5e-5)
