"""A food as a freezing load of the balances, by the ice-fraction lookup's food model.

The food model of :mod:`service.core.solutions.foods` (Schwartzberg's bound water and one
ideal effective solute in the freezable water, sized by the initial freezing point T_f)
maps onto the balances' ideal-solution path exactly:

- the load's water is the food's freezable water, m_f = M (x_w - 0.4 x_protein): it
  evaporates and freezes;
- its solute is the effective solute, n_s = m_f (1/a(T_f) - 1) / M_w moles of one ideal
  particle (a(T_f) the activity of ice at T_f and 101325 Pa), so that the unfrozen
  freezable water at T is n_s M_w a(T) / (1 - a(T)), the food model's, however much water
  has evaporated;
- the bound water m_b = 0.4 x_protein M stays liquid, neither freezing nor evaporating
  (held by the protein), with the enthalpy of IAPWS-95 liquid at 101325 Pa;
- the non-water components take the Choi and Okos (1986) specific heats, integrated
  exactly (:mod:`service.core.balances.food_composition`).

The bound water and solids are the load's temperature-dependent inert heat
(:class:`service.core.balances.stages.InertHeat`), so the enthalpy of the food at a
temperature is that of :func:`service.core.solutions.foods.food_freezing` (up to the bound
water's pressure, 101325 Pa here against the load's vapor pressure: below 1e-6 relative).

References
----------
Schwartzberg (1976), J. Food Sci. 41, 152; Choi and Okos (1986); IAPWS R6-95(2018),
R10-06(2009). See :mod:`service.core.solutions.foods`.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike

from service.core.balances.food_composition import (
    Composition,
    solids_sensible_enthalpy,
    solids_specific_heat,
)
from service.core.balances.scalars import finite_scalar, require_scalar_within
from service.core.balances.stages import InertHeat
from service.core.errors import InvalidInputError
from service.core.properties.constants import MOLAR_MASS, TRIPLE_POINT_TEMPERATURE
from service.core.properties.helmholtz import fluid_properties_at
from service.core.properties.phase import FloatArray
from service.core.solutions.food_freezing_point import (
    LOWEST_FOOD_FREEZING_POINT,
    FreezingPointBasis,
    estimate_food_freezing_point,
)
from service.core.solutions.foods import BOUND_WATER_PER_PROTEIN
from service.core.solutions.freezing import ice_log_water_activity

__all__ = ["FoodLoad", "food_load"]

_REFERENCE_PRESSURE: Final = 101325.0


@dataclass(frozen=True)
class FoodLoad:
    """A food as the balances' load (SI scalars).

    Attributes
    ----------
    freezable_water : float
        kg, the water that evaporates and freezes.
    bound_water : float
        kg, liquid throughout.
    solute_moles : float
        mol of the ideal effective solute.
    freezing_point : float
        K, the initial freezing point the solute is sized by.
    basis : str
        ``"given"`` or how it was estimated.
    statement : str
        The estimate's method and agreement (empty when given).
    inert : InertHeat
        The bound water and solids' heat (companions' constant part added by the caller).
    """

    freezable_water: float
    bound_water: float
    solute_moles: float
    freezing_point: float
    basis: FreezingPointBasis
    statement: str
    inert: InertHeat


def food_load(
    composition: Composition,
    product_mass: ArrayLike,
    freezing_point: ArrayLike | None,
    constant_heat_capacity: float,
    index: int | None = None,
) -> FoodLoad:
    """The food's freezable and bound water, effective solute and inert heat.

    Parameters
    ----------
    composition : Composition
        Proximate composition (and its named dissolved solutes, for the estimate).
    product_mass : array_like
        kg of food, > 0 (a scalar of a sweep's case).
    freezing_point : array_like or None
        K, 253.15 K to 273.16 K; None: estimated from the composition
        (:func:`service.core.solutions.food_freezing_point.estimate_food_freezing_point`).
    constant_heat_capacity : float
        J/K of what else cools with the food (companions).
    index : int or None
        The sweep position, for errors.

    Raises
    ------
    InvalidInputError
        A bad composition, or protein that binds all the water.
    OutOfRangeError
        ``product_mass`` or ``freezing_point`` out of range.
    """
    mass = require_scalar_within(
        finite_scalar(product_mass, "product_mass"),
        "product_mass",
        0.0,
        None,
        "kg",
        "must be positive",
        index,
        exclusive_minimum=True,
    )
    fractions = composition.fractions()
    water = fractions["water"]
    bound_fraction = min(BOUND_WATER_PER_PROTEIN * fractions["protein"], water)
    if water - bound_fraction <= 0.0:
        raise InvalidInputError(
            "composition.protein",
            f"binds all the water ({BOUND_WATER_PER_PROTEIN:g} kg per kg of protein): "
            "nothing can freeze",
            fractions["protein"],
        )
    if freezing_point is None:
        estimate = estimate_food_freezing_point(composition)
        onset, basis, statement = estimate.temperature, estimate.basis, estimate.statement
    else:
        onset = require_scalar_within(
            finite_scalar(freezing_point, "freezing_point"),
            "freezing_point",
            LOWEST_FOOD_FREEZING_POINT,
            TRIPLE_POINT_TEMPERATURE,
            "K",
            "a food's initial freezing point, -20 degC to the triple point",
            index,
        )
        basis, statement = "given", ""
    freezable = mass * (water - bound_fraction)
    bound = mass * bound_fraction
    log_activity = float(
        ice_log_water_activity(np.array([onset]), np.array([_REFERENCE_PRESSURE]))[0]
    )
    moles = freezable / MOLAR_MASS * float(np.expm1(-log_activity))
    reference = float(_bound_enthalpy(np.array([TRIPLE_POINT_TEMPERATURE]))[0])

    def capacity(temperature: FloatArray) -> FloatArray:
        liquid = fluid_properties_at(
            temperature, np.full(np.shape(temperature), _REFERENCE_PRESSURE), phase="liquid"
        )
        return np.asarray(
            bound * liquid.specific_isobaric_heat_capacity
            + mass * solids_specific_heat(fractions, temperature),
            dtype=np.float64,
        )

    def enthalpy(temperature: FloatArray) -> FloatArray:
        return np.asarray(
            bound * (_bound_enthalpy(temperature) - reference)
            + mass * solids_sensible_enthalpy(fractions, temperature, TRIPLE_POINT_TEMPERATURE),
            dtype=np.float64,
        )

    return FoodLoad(
        freezable_water=freezable,
        bound_water=bound,
        solute_moles=moles,
        freezing_point=onset,
        basis=basis,
        statement=statement,
        inert=InertHeat(constant_heat_capacity, capacity, enthalpy),
    )


def _bound_enthalpy(temperature: FloatArray) -> FloatArray:
    liquid = fluid_properties_at(
        temperature, np.full(np.shape(temperature), _REFERENCE_PRESSURE), phase="liquid"
    )
    return np.asarray(liquid.specific_enthalpy, dtype=np.float64)
