"""The initial freezing point estimated from a food's composition: consistency and errors.

References: the named-solute freezing points of service.core.solutions.freezing (held to
handbook tables in tests/reference/test_aqueous_freezing_points.py); Ross's rule
(Ross 1975, Food Technol. 29(3):26; from memory): ln a_w of a mixture is the sum of each
binary's ln a_w at the solute's own concentration in the water; Pham's (1996) equation.
"""

from __future__ import annotations

import numpy as np
import pytest

from service.core.balances.food_composition import Composition
from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.solutions.aqueous import solution_model
from service.core.solutions.food_freezing_point import estimate_food_freezing_point
from service.core.solutions.freezing import ice_log_water_activity, solute_freezing_point


def test_one_solute_without_protein_is_that_solutions_freezing_point() -> None:
    food = Composition(water=0.9, carbohydrate=0.1, dissolved_solutes=(("sucrose", 0.1),))
    expected = float(solute_freezing_point(solution_model("sucrose"), 0.1))
    assert estimate_food_freezing_point(food).temperature == pytest.approx(expected, abs=1e-7)


def test_protein_binds_water_so_the_solute_is_stronger() -> None:
    # 0.4 kg of bound water per kg of protein holds no solute: 0.05 kg of NaCl in
    # 0.85 - 0.4 * 0.1 = 0.81 kg of freezable water.
    food = Composition(
        water=0.85, protein=0.1, ash=0.05, dissolved_solutes=(("sodium chloride", 0.05),)
    )
    expected = float(solute_freezing_point(solution_model("sodium chloride"), 0.05 / 0.86))
    assert estimate_food_freezing_point(food).temperature == pytest.approx(expected, abs=1e-7)


def test_ross_rule_adds_the_binary_log_activities() -> None:
    food = Composition(
        water=0.8,
        carbohydrate=0.18,
        ash=0.02,
        dissolved_solutes=(("glucose", 0.1), ("sodium chloride", 0.02)),
    )
    onset = estimate_food_freezing_point(food).temperature
    glucose, salt = solution_model("glucose"), solution_model("sodium chloride")
    mixture = glucose.log_water_activity(0.1 / 0.9, onset) + salt.log_water_activity(
        0.02 / 0.82, onset
    )
    ice = ice_log_water_activity(np.array([onset]), np.array([101325.0]))
    assert float(mixture) == pytest.approx(float(ice[0]), abs=1e-9)
    alone = float(solute_freezing_point(glucose, 0.1 / 0.9))
    assert onset < alone


def test_pham_equation_from_composition_alone() -> None:
    food = Composition(water=0.8, protein=0.15, carbohydrate=0.03, fiber=0.01, ash=0.01)
    expected = 273.15 - 4.66 * 0.04 / 0.8 - 46.4 * 0.01 / 0.8
    assert estimate_food_freezing_point(food).temperature == pytest.approx(expected, abs=1e-12)


@pytest.mark.parametrize(
    ("food", "field"),
    [
        (
            Composition(water=0.9, carbohydrate=0.1, dissolved_solutes=(("maltose", 0.01),)),
            "composition.dissolved_solutes.maltose",
        ),
        (
            Composition(water=0.9, ash=0.1, dissolved_solutes=(("sucrose", 0.01),)),
            "composition.dissolved_solutes.sucrose",
        ),
        (
            Composition(
                water=0.9,
                carbohydrate=0.1,
                dissolved_solutes=(("glucose", 0.01), ("glucose", 0.01)),
            ),
            "composition.dissolved_solutes.glucose",
        ),
        (
            Composition(water=0.9, carbohydrate=0.1, dissolved_solutes=(("glucose", -0.01),)),
            "composition.dissolved_solutes.glucose",
        ),
    ],
    ids=["unknown", "beyond-its-component", "twice", "negative"],
)
def test_bad_solute_lists_name_the_field(food: Composition, field: str) -> None:
    with pytest.raises(InvalidInputError) as caught:
        estimate_food_freezing_point(food)
    assert caught.value.variable == field


def test_a_solute_beyond_its_model_range_is_refused() -> None:
    # 0.3 kg glucose in 0.5 kg water: w = 0.375 > 0.3, the Norrish fit's range
    food = Composition(water=0.5, carbohydrate=0.5, dissolved_solutes=(("glucose", 0.3),))
    with pytest.raises(OutOfRangeError) as caught:
        estimate_food_freezing_point(food)
    assert caught.value.variable == "composition.dissolved_solutes.glucose"


def test_an_estimate_below_minus_20_is_refused() -> None:
    # Pham: 46.4 * 0.2 / 0.4 = 23 K of depression
    food = Composition(water=0.4, protein=0.4, ash=0.2)
    with pytest.raises(OutOfRangeError) as caught:
        estimate_food_freezing_point(food)
    assert caught.value.variable == "freezing_point"
