"""Partly frozen foods by composition (service.core.solutions.foods).

Sources named per check: Schwartzberg's ice-fraction equation x_ice = (x_w - b)(1 - t_f/t),
b = 0.4 x_protein (Schwartzberg 1976, J. Food Sci. 41:152, as given in ASHRAE Handbook -
Refrigeration (2010), ch. 19; from memory); iapws 1.5.5 (IAPWS95 for liquid water, _Ice for
R10-06 ice) for the water and ice enthalpies; the Choi and Okos (1986) polynomials integrated
numerically (scipy.integrate.quad); the core's ideal-solution freezing path (itself checked
against an iapws solve in tests/core/balances/test_solution_freezing.py).
"""

from __future__ import annotations

import numpy as np
import pytest
from iapws import IAPWS95
from iapws._iapws import _Ice
from scipy.integrate import quad

from service.core.balances.food_composition import Composition, solids_specific_heat
from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.solutions.aqueous import solution_model
from service.core.solutions.foods import food_freezing
from service.core.solutions.freezing import solute_freezing_point, solution_freezing

# Invented demo composition of a lean meat, initial freezing point -1.7 degC.
LEAN = Composition(water=0.74, protein=0.22, fat=0.03, ash=0.01)
ONSET = 271.45


def test_ice_fraction_follows_schwartzbergs_equation() -> None:
    celsius = np.array([-2.0, -3.0, -5.0, -10.0, -20.0, -30.0])
    result = food_freezing(LEAN, ONSET, celsius + 273.15)
    freezable = 0.74 - 0.4 * 0.22
    expected = freezable * (1.0 - (ONSET - 273.15) / celsius)
    # Schwartzberg linearizes ln a_w in T; the exact IAPWS equilibrium differs by 0.9 % at
    # -30 degC (measured), growing with the distance from t_f.
    np.testing.assert_allclose(result.ice_mass_fraction, expected, rtol=0.012)
    assert result.bound_water_fraction == pytest.approx(0.4 * 0.22)
    np.testing.assert_allclose(
        result.unfrozen_water_fraction + result.ice_mass_fraction, 0.74, rtol=1e-12
    )


def test_a_food_without_protein_is_the_ideal_solution_of_its_solids() -> None:
    # 10 % sucrose syrup as a "food": no bound water, one ideal solute; its ice fraction must
    # be that of the ideal sucrose solution with the same onset.
    model = solution_model("sucrose", "ideal")
    onset = float(solute_freezing_point(model, 0.10))
    syrup = Composition(water=0.90, carbohydrate=0.10)
    temperatures = np.array([272.5, 271.0, 269.0, 268.0])  # to the model's w = 0.5
    food = food_freezing(syrup, onset, temperatures)
    solution = solution_freezing(model, 0.10, temperatures)
    np.testing.assert_allclose(food.ice_mass_fraction, solution.ice_mass_fraction, atol=1e-9)


@pytest.mark.filterwarnings("ignore:Using extrapolated values:UserWarning")  # supercooled
@pytest.mark.parametrize("temperature", [283.15, 272.0, 268.15, 258.15])
def test_enthalpy_matches_iapws_water_and_ice_plus_choi_okos_solids(temperature: float) -> None:
    result = food_freezing(LEAN, ONSET, temperature)
    fractions = LEAN.fractions()
    solids, _ = quad(
        lambda t: float(solids_specific_heat(fractions, np.array(t))), 273.16, temperature
    )
    pressure = 0.101325  # MPa
    ice = float(result.ice_mass_fraction)
    liquid = IAPWS95(T=temperature, P=pressure).h * 1e3
    expected = solids + (0.74 - ice) * liquid
    if ice > 0.0:
        expected += ice * _Ice(temperature, pressure)["h"] * 1e3
    assert float(result.specific_enthalpy) == pytest.approx(expected, abs=1e-3)  # J/kg


def test_apparent_specific_heat_integrates_to_the_enthalpy_change() -> None:
    def apparent(t: float) -> float:
        return float(food_freezing(LEAN, ONSET, t).apparent_specific_heat)

    low, high = 250.0, ONSET - 1e-9
    integral, _ = quad(apparent, low, high, points=[ONSET - 0.5], limit=200)
    ends = food_freezing(LEAN, ONSET, np.array([low, high])).specific_enthalpy
    assert integral == pytest.approx(float(ends[1] - ends[0]), rel=1e-7)
    above = food_freezing(LEAN, ONSET, np.array([275.0, 285.0]))
    assert np.all(above.ice_mass_fraction == 0.0)
    assert np.all((above.apparent_specific_heat > 3000.0) & (above.apparent_specific_heat < 4000.0))


@pytest.mark.parametrize(
    ("composition", "onset", "temperature", "error", "variable"),
    [
        (LEAN, 273.5, 263.15, OutOfRangeError, "freezing_point"),
        (LEAN, 250.0, 263.15, OutOfRangeError, "freezing_point"),
        (LEAN, ONSET, 230.0, OutOfRangeError, "temperature"),
        (
            Composition(water=0.2, protein=0.8),
            ONSET,
            263.15,
            InvalidInputError,
            "composition.protein",
        ),
        (Composition(water=0.5, protein=0.1), ONSET, 263.15, InvalidInputError, "composition"),
    ],
    ids=["onset-above-triple-point", "onset-too-low", "too-cold", "all-water-bound", "sum-not-1"],
)
def test_bad_inputs_name_the_field(
    composition: Composition,
    onset: float,
    temperature: float,
    error: type[Exception],
    variable: str,
) -> None:
    with pytest.raises(error) as caught:
        food_freezing(composition, onset, temperature)
    assert getattr(caught.value, "variable", None) == variable or variable in str(caught.value)
