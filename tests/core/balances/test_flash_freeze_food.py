"""Flash-freeze of a food by composition: mass and energy close, and the freezing onset and
the ice at the end are the ice-fraction lookup's food model's.

Reference: service.core.solutions.foods.food_freezing (Schwartzberg's model with the IAPWS
ice equilibrium, checked against Schwartzberg's closed form in tests/core/solutions/
test_foods.py) and service.core.solutions.freezing.ice_log_water_activity, evaluated for
the food's own freezable water after the evaporation the balance computed. The energy books
close to 1e-9 as for the other loads (tests/core/balances/test_flash_freeze_invariants.py).
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from service.core.balances import Composition
from service.core.balances.flash_freeze import FlashFreezeCase, flash_freeze
from service.core.errors import InvalidInputError
from service.core.solutions.food_freezing_point import estimate_food_freezing_point
from service.core.solutions.foods import food_freezing
from service.core.solutions.freezing import ice_log_water_activity

# invented demo foods
CARROTS = Composition(
    water=0.878, protein=0.010, fat=0.002, carbohydrate=0.071, fiber=0.030, ash=0.009
)
SHRIMP = Composition(water=0.78, protein=0.19, fat=0.01, ash=0.02)


def _case(food: Composition, onset: float | None, final: float, **extra: object) -> FlashFreezeCase:
    return FlashFreezeCase(
        initial_temperature=283.15,
        composition=food,
        product_mass=2.0,
        freezing_point=onset,
        final_ice_temperature=final,
        **extra,  # type: ignore[arg-type]
    )


@settings(max_examples=8, deadline=None)
@given(
    st.sampled_from(["carrots", "shrimp"]),
    st.floats(min_value=268.0, max_value=272.5),
    st.floats(min_value=240.0, max_value=267.0),
    st.sampled_from(["integrated", "mean-vapor-enthalpy"]),
)
def test_mass_and_energy_close(name: str, onset: float, final: float, method: str) -> None:
    food = CARROTS if name == "carrots" else SHRIMP
    result = flash_freeze(_case(food, onset, final, method=method))
    assert abs(float(result.energy_balance.relative_residual)) < 1e-9
    fractions = food.fractions()
    freezable = 2.0 * (fractions["water"] - 0.4 * fractions["protein"])
    total = float(result.evaporated_mass + result.ice_mass + result.liquid_mass)
    assert total == pytest.approx(freezable, rel=4e-16, abs=0.0)


@pytest.mark.parametrize(("food", "onset"), [(CARROTS, 271.76), (SHRIMP, 271.15)])
def test_onset_and_end_ice_are_the_food_models(food: Composition, onset: float) -> None:
    result = flash_freeze(_case(food, onset, 258.15))
    fractions = food.fractions()
    freezable = 2.0 * (fractions["water"] - 0.4 * fractions["protein"])
    bound = 2.0 * 0.4 * fractions["protein"]
    solute_ratio = float(
        np.expm1(-ice_log_water_activity(np.array([onset]), np.array([101325.0]))[0])
    )
    # onset: the food's freezable water, less what evaporated while cooling, is at the
    # activity of ice at the temperature where the cooling stage ends
    cooling = result.stages[0]
    left = freezable - float(cooling.evaporated_mass)
    expected = -np.log1p(solute_ratio * freezable / left)
    at_onset = ice_log_water_activity(
        np.atleast_1d(cooling.end_temperature), np.atleast_1d(cooling.end_pressure)
    )
    assert float(at_onset[0]) == pytest.approx(expected, rel=1e-7)
    assert float(cooling.end_temperature) < onset  # evaporation concentrates the food first
    # end: the unfrozen freezable water is the lookup's food model's at 258.15 K (its
    # effective solute sized at 101325 Pa, as here; ice at the load's pressure here)
    reference = food_freezing(food, onset, 258.15, 101325.0)
    unfrozen = 2.0 * float(reference.unfrozen_water_fraction) - bound
    assert float(result.liquid_mass) == pytest.approx(unfrozen, rel=1e-3)
    assert float(result.ice_mass) == pytest.approx(
        freezable - float(result.evaporated_mass) - unfrozen, rel=1e-3
    )


def test_estimated_freezing_point_is_used_and_said() -> None:
    named = Composition(
        water=0.878,
        protein=0.010,
        fat=0.002,
        carbohydrate=0.071,
        fiber=0.030,
        ash=0.009,
        dissolved_solutes=(("sucrose", 0.036), ("glucose", 0.006), ("fructose", 0.0055)),
    )
    estimated = flash_freeze(_case(named, None, 258.15))
    onset = estimate_food_freezing_point(named).temperature
    given_onset = flash_freeze(_case(named, onset, 258.15))
    assert float(estimated.ice_mass) == float(given_onset.ice_mass)
    assert "estimated-freezing-point" in [w.code for w in estimated.warnings]
    assert any("Ross" in text for text in estimated.assumptions)
    assert any(s.release == "Schwartzberg (1976)" for s in estimated.property_sources)


def test_food_inputs_are_checked() -> None:
    with pytest.raises(InvalidInputError) as caught:
        flash_freeze(FlashFreezeCase(initial_temperature=283.15, composition=CARROTS))
    assert caught.value.variable == "product_mass"
    with pytest.raises(InvalidInputError) as caught:
        flash_freeze(FlashFreezeCase(initial_temperature=283.15, product_mass=1.0))
    assert caught.value.variable == "product_mass"
