"""A food's initial freezing point from its composition, when no measured value is given.

Two published routes, chosen by what the composition carries:

1. **Dissolved solutes named** (``Composition.dissolved_solutes``: sucrose, glucose,
   fructose, sodium chloride, per kg of food). The solutes are dissolved in the food's
   freezable water x_f = x_w - 0.4 x_protein (Schwartzberg's bound water holds none, as in
   :mod:`service.core.solutions.foods`), and the water activity of the mixture is Ross's
   product of the binary activities, each binary at the solute's own concentration in
   that water,

       ln a_w = sum_i ln a_w,i(w_i, T),    w_i = x_i / (x_f + x_i),

   with each solute's published model (Norrish for the sugars, Pitzer for sodium
   chloride; :mod:`service.core.solutions.aqueous`). The initial freezing point is the T
   where ln a_w = ln a_w,ice(T) at 101325 Pa (IAPWS-95 and R10-06). Solubles not named
   (organic acids, potassium salts, amino acids) are not counted: the estimate is then too
   warm by their share, so name the food's main sugars and salts.
2. **Composition alone** (no solutes named): Pham's (1996) empirical equation, fitted to
   meats, fish, fruits and cheese,

       t_F = -4.66 x_o / x_w - 46.4 x_a / x_w    (degC),

   x_a the ash and x_o the components other than water, protein, fat and ash
   (carbohydrate and fiber here). It treats the ash as salts of about 80 g/mol and two
   particles and the other solids as about 400 g/mol (1.86 K kg/mol over the coefficients).

Below the initial freezing point the ice fraction follows the Schwartzberg model of
:mod:`service.core.solutions.foods` (one ideal effective solute sized by this point), so
the unfrozen food's water activity equals the ice's on the freezing line and, above it,
that of the effective solute.

Measured against the ASHRAE Handbook - Refrigeration (2006), ch. 9, Table 3 initial
freezing points (values from memory) in ``tests/reference/test_food_freezing_points.py``;
the deviations are stated in answers.

References
----------
Ross, K. D. (1975), Estimation of water activity in intermediate moisture foods, Food
Technology 29(3), 26-34 (from memory). Pham, Q. T. (1996), Prediction of calorimetric
properties and freezing time of foods from composition data, J. Food Eng. 30, 95-107 (the
equation as quoted in a secondary source found through the search tool; the paper was not
read). Schwartzberg, H. G. (1976), J. Food Sci. 41, 152-156. IAPWS R6-95(2018),
R10-06(2009).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final, Literal

import numpy as np

from service.core.balances.food_composition import Composition
from service.core.errors import InvalidInputError, NotConvergedError, OutOfRangeError
from service.core.properties.constants import SPECIFIC_GAS_CONSTANT, TRIPLE_POINT_TEMPERATURE
from service.core.properties.helmholtz import fluid_properties_at
from service.core.properties.ice import ice_properties
from service.core.solutions.aqueous import solution_model
from service.core.solutions.freezing import capped_freezing_step, ice_log_water_activity

__all__ = [
    "FOOD_SOLUTE_CLASSES",
    "LOWEST_FOOD_FREEZING_POINT",
    "FoodFreezingPoint",
    "FreezingPointBasis",
    "dissolved_fractions",
    "estimate_food_freezing_point",
]

FOOD_SOLUTE_CLASSES: Final[dict[str, str]] = {
    "sucrose": "carbohydrate",
    "glucose": "carbohydrate",
    "fructose": "carbohydrate",
    "sodium chloride": "ash",
}
"""The solutes a composition may name, and the component each is part of."""

LOWEST_FOOD_FREEZING_POINT: Final = 253.15
"""K: the lowest initial freezing point the food model takes (-20 degC)."""

_BOUND_WATER_PER_PROTEIN: Final = 0.4
_PHAM_OTHER: Final = 4.66
"""K per unit x_o / x_w (Pham 1996)."""
_PHAM_ASH: Final = 46.4
"""K per unit x_a / x_w (Pham 1996)."""
_CELSIUS_OFFSET: Final = 273.15
_NORMAL_PRESSURE: Final = 101325.0
_ITERATIONS: Final = 40
_TOLERANCE: Final = 1e-9
_DELTA: Final = 1e-4

FreezingPointBasis = Literal["given", "dissolved solutes (Ross)", "composition (Pham 1996)"]

_ROSS_STATEMENT: Final = (
    "Initial freezing point estimated from the dissolved solutes named in the composition: "
    "Ross's (1975, Food Technol. 29(3):26) product of each solute's binary water activity "
    "(Norrish for sugars, Pitzer for sodium chloride) in the freezable water (water less "
    "0.4 kg per kg of protein), ice equilibrium from IAPWS-95 and R10-06 at 101325 Pa; "
    "solubles not named (acids, potassium salts, amino acids) are not counted, so the "
    "estimate is too warm by their share. Against the ASHRAE Handbook - Refrigeration "
    "(2006) ch. 9 Table 3 initial freezing points (from memory) with USDA sugar profiles: "
    "fruits within 0.45 K, tomatoes and onions 0.5 K; carrots 1.0 K too warm (their "
    "potassium salts and acids not named)."
)
_PHAM_STATEMENT: Final = (
    "Initial freezing point estimated from the composition alone by Pham's (1996, J. Food "
    "Eng. 30:95) equation t_F = -4.66 x_o/x_w - 46.4 x_a/x_w degC (x_a ash, x_o carbohydrate "
    "and fiber), fitted to meats, fish, fruits and cheese. Against the ASHRAE Handbook - "
    "Refrigeration (2006) ch. 9 Table 3 initial freezing points (from memory): fruits and "
    "vegetables within 0.65 K (bananas 1.2 K too cold), the lean beef and cod rows 1.0 "
    "and 1.5 K too warm. Give a measured freezing_point, or name the food's sugars and "
    "salt in composition.dissolved_solutes, where it matters."
)


@dataclass(frozen=True)
class FoodFreezingPoint:
    """A food's initial freezing point and where it came from.

    Attributes
    ----------
    temperature : float
        K.
    basis : str
        ``"dissolved solutes (Ross)"`` or ``"composition (Pham 1996)"``.
    statement : str
        The method, its source and its measured agreement, as stated in answers.
    """

    temperature: float
    basis: FreezingPointBasis
    statement: str


def dissolved_fractions(composition: Composition) -> dict[str, float]:
    """The composition's dissolved solutes, kg per kg of food, validated and rescaled.

    Rescaled by the same factor as :meth:`Composition.fractions` (so they stay parts of
    the rescaled components).

    Raises
    ------
    InvalidInputError
        ``composition.dissolved_solutes.<name>`` for an unknown or repeated solute, a value
        that is not a fraction, or solutes beyond the component they belong to.
    """
    raw_total = sum(
        float(np.asarray(getattr(composition, name)))
        for name in ("water", "protein", "fat", "carbohydrate", "fiber", "ash")
    )
    fractions = composition.fractions()
    result: dict[str, float] = {}
    for name, value in composition.dissolved_solutes:
        field = f"composition.dissolved_solutes.{name}"
        if name not in FOOD_SOLUTE_CLASSES:
            known = ", ".join(sorted(FOOD_SOLUTE_CLASSES))
            raise InvalidInputError(field, f"unknown food solute {name!r}; known: {known}", name)
        if name in result:
            raise InvalidInputError(field, "named twice", name)
        number = float(value)
        if not np.isfinite(number) or not 0.0 <= number <= 1.0:
            raise InvalidInputError(field, "must be a mass fraction in [0, 1]", number)
        result[name] = number / raw_total
    for component in ("carbohydrate", "ash"):
        members = [name for name in result if FOOD_SOLUTE_CLASSES[name] == component]
        share = sum(result[name] for name in members)
        if share > fractions[component] * (1.0 + 1e-12) + 1e-15:
            raise InvalidInputError(
                f"composition.dissolved_solutes.{members[0]}",
                f"{' + '.join(members)} ({share:.6g} kg/kg) exceed the {component} they are "
                f"part of ({fractions[component]:.6g} kg/kg)",
                share,
            )
    return result


def _pham(fractions: dict[str, float]) -> float:
    other = fractions["carbohydrate"] + fractions["fiber"]
    water = fractions["water"]
    celsius = -_PHAM_OTHER * other / water - _PHAM_ASH * fractions["ash"] / water
    return _CELSIUS_OFFSET + celsius


def _ross(fractions: dict[str, float], solutes: dict[str, float]) -> float:
    freezable = fractions["water"] - _BOUND_WATER_PER_PROTEIN * fractions["protein"]
    if freezable <= 0.0:
        raise InvalidInputError(
            "composition.protein",
            "binds all the water (0.4 kg per kg of protein): nothing can freeze",
            fractions["protein"],
        )
    binaries = []
    for name, amount in solutes.items():
        model = solution_model(name)
        concentration = amount / (freezable + amount)
        if concentration > model.maximum_mass_fraction:
            most = model.maximum_mass_fraction * freezable / (1.0 - model.maximum_mass_fraction)
            raise OutOfRangeError(
                variable=f"composition.dissolved_solutes.{name}",
                value=amount,
                minimum=0.0,
                maximum=most,
                unit="1",
                reason=(
                    f"{name} in the food's freezable water would exceed w = "
                    f"{model.maximum_mass_fraction}, the end of the {model.model} model's range"
                ),
            )
        binaries.append((model, np.array([concentration])))
    pressure = np.array([_NORMAL_PRESSURE])
    temperature = np.array([TRIPLE_POINT_TEMPERATURE - 1e-3])
    step = np.array([np.inf])
    for _ in range(_ITERATIONS):
        solution = sum(
            (model.log_water_activity(w, temperature) for model, w in binaries),
            np.zeros(1),
        )
        shifted = sum(
            (model.log_water_activity(w, temperature + _DELTA) for model, w in binaries),
            np.zeros(1),
        )
        liquid = fluid_properties_at(temperature, pressure, phase="liquid")
        ice = ice_properties(temperature, pressure)
        target = ice_log_water_activity(temperature, pressure)
        target_slope = (liquid.specific_enthalpy - ice.specific_enthalpy) / (
            SPECIFIC_GAS_CONSTANT * temperature**2
        )
        step = (solution - target) / ((shifted - solution) / _DELTA - target_slope)
        capped, settled = capped_freezing_step(temperature, step, _TOLERANCE)
        temperature = np.maximum(capped, 230.0)
        if settled:
            return float(temperature[0])
    raise NotConvergedError(
        "initial freezing point of the food (Newton)", _ITERATIONS, float(abs(step[0])), 1
    )


def estimate_food_freezing_point(composition: Composition) -> FoodFreezingPoint:
    """A food's initial freezing point from its composition, K (see the module docstring).

    Parameters
    ----------
    composition : Composition
        Proximate composition; with ``dissolved_solutes`` the Ross route, without them
        Pham's equation.

    Returns
    -------
    FoodFreezingPoint

    Raises
    ------
    InvalidInputError
        A bad composition or solute list (the field named).
    OutOfRangeError
        A solute beyond its model's range in the freezable water, or an estimate below
        253.15 K, the food model's lowest initial freezing point.

    References
    ----------
    Ross (1975); Pham (1996); IAPWS R6-95(2018), R10-06(2009).

    Examples
    --------
    >>> apple = Composition(water=0.8393, protein=0.0019, fat=0.0036, carbohydrate=0.1255,
    ...                     fiber=0.027, ash=0.0026, dissolved_solutes=(("fructose", 0.059),
    ...                     ("glucose", 0.0243), ("sucrose", 0.0207)))
    >>> round(estimate_food_freezing_point(apple).temperature - 273.15, 2)
    -1.17
    """
    fractions = composition.fractions()
    solutes = dissolved_fractions(composition)
    if solutes:
        result = FoodFreezingPoint(
            temperature=_ross(fractions, solutes),
            basis="dissolved solutes (Ross)",
            statement=_ROSS_STATEMENT,
        )
    else:
        result = FoodFreezingPoint(
            temperature=_pham(fractions),
            basis="composition (Pham 1996)",
            statement=_PHAM_STATEMENT,
        )
    if result.temperature < LOWEST_FOOD_FREEZING_POINT:
        raise OutOfRangeError(
            variable="freezing_point",
            value=result.temperature,
            minimum=LOWEST_FOOD_FREEZING_POINT,
            maximum=None,
            unit="K",
            reason=(
                f"the initial freezing point estimated from the composition ({result.basis}) "
                "falls below -20 degC, the food model's lowest; give a measured one"
            ),
        )
    return result
