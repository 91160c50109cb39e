"""Evaporative cooling: the product's freezing point given, estimated from its dissolved
solids, or assumed (pure water).

Sources named per case: the freezing-point depression of a 10 % sucrose solution, about
0.6 K (CRC Handbook of Chemistry and Physics, "Concentrative properties of aqueous
solutions", from memory); strawberries from ASHRAE Handbook - Refrigeration (2006), ch. 9,
Table 3 (water 90.95 %, protein 0.67 %, fat 0.30 %, carbohydrate 7.68 % of which fiber
2.0 %, ash 0.40 %, initial freezing point -0.8 degC; from memory) with total sugars
4.89 g per 100 g (USDA FoodData Central, strawberries, raw; from memory). Other cases check
the wiring against the shared solution model (service.core.balances.solution_freezing).
"""

from __future__ import annotations

from dataclasses import replace

import numpy as np
import pytest

from service.core.balances import (
    Composition,
    DissolvedSolids,
    named_dissolved_solids,
    named_solute,
    solution_freezing_point,
)
from service.core.balances.evaporative_cooling import (
    ESTIMATED_FREEZING_POINT_METHOD,
    EvaporativeCoolingCase,
    evaporative_cooling,
)
from service.core.balances.solution_freezing import LOWEST_FREEZING_TEMPERATURE
from service.core.errors import InvalidInputError, OutOfRangeError, UnsupportedStateError
from service.core.properties.constants import TRIPLE_POINT_TEMPERATURE

# ASHRAE Handbook - Refrigeration (2006), ch. 9, Table 3, strawberries (from memory)
STRAWBERRIES = Composition(
    water=0.9095, protein=0.0067, fat=0.0030, carbohydrate=0.0568, fiber=0.0200, ash=0.0040
)
STRAWBERRY_FREEZING_POINT = 273.15 - 0.8  # K, same table (from memory)
# USDA FoodData Central, strawberries, raw: total sugars 4.89 g/100 g (from memory);
# glucose and fructose dominate and share the molar mass 180.156 g/mol
STRAWBERRY_SUGARS = named_dissolved_solids("glucose", 0.0489)


def _strawberries(**changes: object) -> EvaporativeCoolingCase:
    fields: dict[str, object] = {
        "product_mass": 1.0,
        "initial_temperature": 293.15,
        "final_temperature": 274.15,
        "composition": STRAWBERRIES,
        "dissolved_solids": STRAWBERRY_SUGARS,
    }
    fields.update(changes)
    return EvaporativeCoolingCase(**fields)  # type: ignore[arg-type]


def test_estimate_is_the_solution_model_of_the_products_water() -> None:
    # the solids form a solution of w = x_s / (x_w + x_s) with the product's water
    result = evaporative_cooling(_strawberries())
    fraction = 0.0489 / (0.9095 + 0.0489)
    expected = float(solution_freezing_point(named_solute("glucose", fraction)))
    assert float(result.freezing_point) == pytest.approx(expected, abs=1e-9)
    assert result.freezing_point_basis == "estimated from dissolved solids"
    assert f"{ESTIMATED_FREEZING_POINT_METHOD}." in result.assumptions
    assert "freezing-point-assumed" not in [w.code for w in result.warnings]


def test_sugar_only_estimate_lies_just_above_the_measured_freezing_point() -> None:
    # ASHRAE (2006) ch. 9 Table 3: strawberries freeze at -0.8 degC (from memory). The sugars
    # alone (USDA, from memory) give about -0.55 degC: the fruit's acids and salts, left
    # out, depress it further. Expect the estimate above the measured value, within 0.4 K.
    estimate = float(evaporative_cooling(_strawberries()).freezing_point)
    assert STRAWBERRY_FREEZING_POINT < estimate < STRAWBERRY_FREEZING_POINT + 0.4


def test_ten_percent_sucrose_product_freezes_like_the_solution() -> None:
    # CRC Handbook, concentrative properties, 10 % sucrose: depression about 0.6 K (from
    # memory); the ideal-solution model meets it within 0.1 K
    syrup = Composition(water=0.9, carbohydrate=0.1)
    result = evaporative_cooling(
        _strawberries(composition=syrup, dissolved_solids=named_dissolved_solids("sucrose", 0.1))
    )
    assert TRIPLE_POINT_TEMPERATURE - float(result.freezing_point) == pytest.approx(0.6, abs=0.1)


def test_dissolved_solids_change_only_the_freezing_point() -> None:
    # they are part of the composition's non-water mass: no mass or heat capacity of their own
    estimated = evaporative_cooling(_strawberries())
    given = evaporative_cooling(
        _strawberries(dissolved_solids=None, freezing_point=float(estimated.freezing_point))
    )
    assert float(estimated.evaporated_mass) == float(given.evaporated_mass)
    assert float(estimated.start_pressure) == float(given.start_pressure)


def test_final_temperature_below_the_estimate_is_refused() -> None:
    estimate = float(evaporative_cooling(_strawberries()).freezing_point)
    evaporative_cooling(_strawberries(final_temperature=estimate + 1e-6))
    with pytest.raises(UnsupportedStateError) as caught:
        evaporative_cooling(_strawberries(final_temperature=estimate - 1e-3))
    assert caught.value.variable == "final_temperature"
    assert caught.value.extra["freezing_point"] == pytest.approx(estimate, abs=1e-9)
    assert caught.value.extra["freezing_point_basis"] == "estimated from dissolved solids"
    assert "flash-freeze" in str(caught.value)
    assert "estimated" in str(caught.value)


def test_initial_temperature_below_the_estimate_is_refused() -> None:
    with pytest.raises(OutOfRangeError) as caught:
        evaporative_cooling(_strawberries(initial_temperature=272.5, final_temperature=272.4))
    assert caught.value.variable == "initial_temperature"


def test_given_freezing_point_wins() -> None:
    result = evaporative_cooling(_strawberries(freezing_point=STRAWBERRY_FREEZING_POINT))
    assert float(result.freezing_point) == STRAWBERRY_FREEZING_POINT
    assert result.freezing_point_basis == "given"
    assert any("given freezing point is used" in item for item in result.assumptions)


def test_without_data_pure_water_is_assumed_with_a_warning() -> None:
    result = evaporative_cooling(_strawberries(dissolved_solids=None))
    assert float(result.freezing_point) == TRIPLE_POINT_TEMPERATURE
    assert result.freezing_point_basis == "pure water (no data)"
    assert "freezing-point-assumed" in [w.code for w in result.warnings]


def test_sweep_of_the_dissolved_fraction() -> None:
    result = evaporative_cooling(
        _strawberries(
            dissolved_solids=named_dissolved_solids("glucose", np.array([0.0, 0.03, 0.06]))
        )
    )
    assert result.freezing_point.shape == (3,)
    assert float(result.freezing_point[0]) == TRIPLE_POINT_TEMPERATURE
    assert np.all(np.diff(result.freezing_point) < 0.0)


def test_named_salt_beyond_its_eutectic_is_refused() -> None:
    # the non-ideal (Pitzer) model of a named salt ends at the eutectic, w = 0.233 of the
    # product's water
    brine = Composition(water=0.5, ash=0.5)
    with pytest.raises(OutOfRangeError) as caught:
        evaporative_cooling(
            _strawberries(
                composition=brine,
                dissolved_solids=named_dissolved_solids("sodium chloride", 0.4),
                final_temperature=280.0,
            )
        )
    assert caught.value.variable == "dissolved_solids.mass_fraction"
    assert caught.value.maximum == pytest.approx(0.5 * 0.233 / (1.0 - 0.233))
    assert "eutectic" in caught.value.reason


def test_largest_accepted_fraction_freezes_at_the_lowest_temperature() -> None:
    # the range in the error is the fraction whose ideal solution freezes at the floor
    brine = Composition(water=0.5, ash=0.5)
    ideal_salt = replace(named_dissolved_solids("sodium chloride", 0.4), activity_model=None)
    with pytest.raises(OutOfRangeError) as caught:
        evaporative_cooling(
            _strawberries(composition=brine, dissolved_solids=ideal_salt, final_temperature=280.0)
        )
    assert caught.value.variable == "dissolved_solids.mass_fraction"
    largest = caught.value.maximum
    assert largest is not None and 0.0 < largest < 0.4
    # the same ideal solution as a solute of NaCl's molar mass without the named range
    edge = replace(named_solute("sodium chloride", largest / (0.5 + largest)), activity_model=None)
    assert float(solution_freezing_point(edge)) == pytest.approx(
        LOWEST_FREEZING_TEMPERATURE, abs=1e-6
    )


@pytest.mark.parametrize(
    ("changes", "error", "variable"),
    [
        pytest.param(
            {"composition": None, "specific_heat": 3900.0},
            InvalidInputError,
            "dissolved_solids",
            id="without-composition",
        ),
        pytest.param(
            {"dissolved_solids": named_dissolved_solids("glucose", 0.10)},
            OutOfRangeError,
            "dissolved_solids.mass_fraction",
            id="water-plus-solids-above-one",
        ),
        pytest.param(
            {"dissolved_solids": named_dissolved_solids("glucose", -0.01)},
            OutOfRangeError,
            "dissolved_solids.mass_fraction",
            id="negative-fraction",
        ),
        pytest.param(
            {"dissolved_solids": named_dissolved_solids("glucose", float("nan"))},
            InvalidInputError,
            "dissolved_solids.mass_fraction",
            id="nan-fraction",
        ),
        pytest.param(
            {"dissolved_solids": DissolvedSolids(0.04, 1e-4)},
            OutOfRangeError,
            "dissolved_solids.molar_mass",
            id="molar-mass-too-small",
        ),
        pytest.param(
            {"dissolved_solids": DissolvedSolids(0.04, 0.1, 11.0)},
            OutOfRangeError,
            "dissolved_solids.van_t_hoff_factor",
            id="factor-above-ten",
        ),
    ],
)
def test_invalid_dissolved_solids_are_refused(
    changes: dict[str, object], error: type[Exception], variable: str
) -> None:
    with pytest.raises(error) as caught:
        evaporative_cooling(_strawberries(**changes))
    assert getattr(caught.value, "variable", None) == variable


def test_unknown_named_solute_is_refused() -> None:
    with pytest.raises(InvalidInputError) as caught:
        named_dissolved_solids("honey", 0.05)
    assert caught.value.variable == "dissolved_solids.name"


def test_composition_naming_its_sugars_takes_the_food_estimate() -> None:
    # USDA strawberry sugars (fructose 2.44, glucose 1.99, sucrose 0.47 g/100 g; from
    # memory) named in the composition: the balance's range check takes the ice-fraction
    # lookup's food estimate (Ross's rule; against ASHRAE Table 3 in
    # tests/reference/test_food_freezing_points.py), and the energy still closes.
    from service.core.solutions.food_freezing_point import estimate_food_freezing_point

    named = replace(
        STRAWBERRIES,
        dissolved_solutes=(("fructose", 0.0244), ("glucose", 0.0199), ("sucrose", 0.0047)),
    )
    result = evaporative_cooling(_strawberries(composition=named, dissolved_solids=None))
    assert result.freezing_point_basis == "estimated from composition solutes"
    expected = estimate_food_freezing_point(named).temperature
    assert float(result.freezing_point) == pytest.approx(expected, abs=1e-12)
    assert abs(float(result.relative_energy_residual)) < 1e-9
    with pytest.raises(UnsupportedStateError):
        evaporative_cooling(
            _strawberries(composition=named, dissolved_solids=None, final_temperature=272.0)
        )
    with pytest.raises(InvalidInputError) as caught:
        evaporative_cooling(_strawberries(composition=named))
    assert caught.value.variable == "dissolved_solids"
