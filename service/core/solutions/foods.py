"""Partly frozen foods from their composition: ice fraction, enthalpy, apparent specific heat.

Model (Schwartzberg's: bound water and one ideal effective solute). Of the food's water
x_w, the bound part x_b = 0.4 x_protein never freezes; the freezable rest x_f = x_w - x_b
holds the food's dissolved solids as one ideal effective solute, sized so that the food
starts to freeze at its initial freezing point T_f (a measured or tabulated input). Ice Ih
is in equilibrium with the unfrozen freezable water where its activity is
a(T) = exp((g_ice - g_liq) / (R T)) (IAPWS-95 metastable liquid, R10-06 ice; see
:func:`service.core.solutions.freezing.ice_log_water_activity`). Raoult's law for the
freezable water and the effective solute (n_s / n_w = 1 / a - 1) gives, per kg of food,

    unfrozen freezable water = x_f (1/a(T_f) - 1) / (1/a(T) - 1),
    ice = x_f - unfrozen freezable water          (T < T_f; 0 above).

Near T_f this is Schwartzberg's x_ice = x_f (1 - t_f / t) (t in degC), which linearizes
ln a in T; here ln a is the exact IAPWS difference of Gibbs energies.

Enthalpy per kg of food, water and ice on the IAPWS-95 reference state and the non-water
components by the Choi and Okos (1986) specific heats from 273.16 K:

    h = h_solids(T) + (x_w - x_ice) h_liq(T, p) + x_ice h_ice(T, p),

and the apparent specific heat c_a = dh/dT at constant p, in closed form:

    c_a = c_solids + (x_w - x_ice) c_p,liq + x_ice c_p,ice + (h_liq - h_ice) d(x_ice)/dT.

Assumptions: the bound water behaves as liquid water in the enthalpy and holds no solute;
the solids add no heat of solution; the food is homogeneous and at one temperature.

References
----------
Schwartzberg, H. G. (1976), Effective heat capacities for the freezing and thawing of food,
J. Food Sci. 41(1), 152-156, with b = 0.4 x_protein for the bound water, as given in ASHRAE
Handbook - Refrigeration (2010), ch. 19, Thermal properties of foods (from memory). Choi, Y.
and Okos, M. R. (1986) (see :mod:`service.core.balances.food_composition`). IAPWS
R6-95(2018), R10-06(2009).
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
from service.core.errors import InvalidInputError
from service.core.properties.constants import SPECIFIC_GAS_CONSTANT, TRIPLE_POINT_TEMPERATURE
from service.core.properties.helmholtz import fluid_properties_at
from service.core.properties.ice import ice_properties
from service.core.properties.phase import FloatArray
from service.core.solutions.freezing import LIQUID_FLOOR_TEMPERATURE, ice_log_water_activity
from service.core.validation import finite_array, require_within

__all__ = [
    "BOUND_WATER_PER_PROTEIN",
    "FOOD_MODEL_REFERENCE",
    "FoodFreezing",
    "food_freezing",
]

BOUND_WATER_PER_PROTEIN: Final = 0.4
"""kg of unfreezable (bound) water per kg of protein (Schwartzberg 1976, as given in ASHRAE
Handbook - Refrigeration (2010), ch. 19; from memory)."""

FOOD_MODEL_REFERENCE: Final = (
    "Food by composition: Schwartzberg's model (Schwartzberg 1976, J. Food Sci. 41:152; "
    "bound water 0.4 x_protein, as in ASHRAE Handbook - Refrigeration (2010), ch. 19; from "
    "memory) with the food's initial freezing point as input, ice equilibrium from IAPWS-95 "
    "and R10-06, non-water components by Choi and Okos (1986); 235 K to 373.15 K"
)

_MAXIMUM_TEMPERATURE: Final = 373.15
_LOWEST_FREEZING_POINT: Final = 253.15
"""K: the lowest initial freezing point taken (-20 degC; foods freeze from about -0.5 to
-5 degC, sugar-rich or salted ones lower)."""


@dataclass(frozen=True)
class FoodFreezing:
    """Ice and unfrozen water of a food at given temperatures (SI arrays of one shape).

    Attributes
    ----------
    temperature, pressure : ndarray
        K, Pa.
    freezing_temperature : ndarray
        K, the initial freezing point (as given).
    ice_mass_fraction : ndarray
        kg of ice per kg of food.
    unfrozen_water_fraction : ndarray
        kg of liquid water (bound water included) per kg of food.
    bound_water_fraction : float
        kg of bound (unfreezable) water per kg of food.
    specific_enthalpy : ndarray
        J/kg of food (see the module docstring).
    apparent_specific_heat : ndarray
        J/(kg K), dh/dT at constant pressure.
    log_water_activity : ndarray
        ln a of the unfrozen freezable water.
    """

    temperature: FloatArray
    pressure: FloatArray
    freezing_temperature: FloatArray
    ice_mass_fraction: FloatArray
    unfrozen_water_fraction: FloatArray
    bound_water_fraction: float
    specific_enthalpy: FloatArray
    apparent_specific_heat: FloatArray
    log_water_activity: FloatArray


def _freezable_water(fractions: dict[str, float]) -> tuple[float, float]:
    water = fractions["water"]
    bound = min(BOUND_WATER_PER_PROTEIN * fractions["protein"], water)
    if water - bound <= 0.0:
        raise InvalidInputError(
            "composition.protein",
            f"binds all the water ({BOUND_WATER_PER_PROTEIN:g} kg per kg of protein): "
            "nothing can freeze",
            fractions["protein"],
        )
    return water - bound, bound


def food_freezing(
    composition: Composition,
    freezing_point: ArrayLike,
    temperature: ArrayLike,
    pressure: ArrayLike = 101325.0,
) -> FoodFreezing:
    """Ice fraction, enthalpy and apparent specific heat of a food at given temperatures.

    Parameters
    ----------
    composition : Composition
        Proximate composition (mass fractions; water > 0).
    freezing_point : array_like
        K, the food's initial freezing point, 253.15 K to 273.16 K (from a measurement or a
        handbook table).
    temperature : array_like
        K, 235 K to 373.15 K.
    pressure : array_like
        Pa, 0 < p <= 100 MPa (default 101325 Pa). The inputs broadcast.

    Returns
    -------
    FoodFreezing

    Raises
    ------
    InvalidInputError
        A bad composition, or protein that binds all the water; NaN input.
    OutOfRangeError
        An input out of range (the variable named).

    References
    ----------
    Schwartzberg (1976); ASHRAE Handbook - Refrigeration (2010), ch. 19; Choi and Okos
    (1986); IAPWS R6-95(2018), R10-06(2009). See the module docstring.

    Examples
    --------
    >>> lean = Composition(water=0.74, protein=0.22, fat=0.03, ash=0.01)
    >>> result = food_freezing(lean, 271.45, 263.15)
    >>> round(float(result.ice_mass_fraction), 3)
    0.546
    """
    fractions = composition.fractions()
    freezable, bound = _freezable_water(fractions)
    onset = finite_array(freezing_point, "freezing_point")
    require_within(
        onset,
        "freezing_point",
        _LOWEST_FREEZING_POINT,
        TRIPLE_POINT_TEMPERATURE,
        "K",
        "a food's initial freezing point, -20 degC to the triple point",
    )
    t = finite_array(temperature, "temperature")
    require_within(
        t,
        "temperature",
        LIQUID_FLOOR_TEMPERATURE,
        _MAXIMUM_TEMPERATURE,
        "K",
        "the supercooled-water reference ends at 235 K",
    )
    p = finite_array(pressure, "pressure")
    require_within(p, "pressure", 0.0, 1e8, "Pa", "up to 100 MPa", exclusive_minimum=True)
    shape = np.broadcast_shapes(onset.shape, t.shape, p.shape)
    onset, t, p = (
        np.array(np.broadcast_to(a, shape), dtype=np.float64).ravel() for a in (onset, t, p)
    )
    frozen = t < onset
    ice_t = np.minimum(t, TRIPLE_POINT_TEMPERATURE)
    # Solute size from the onset: expm1(-ln a(T_f)) = 1/a_f - 1 = n_s / n_w.
    solute_ratio = np.expm1(-ice_log_water_activity(onset, p))
    log_activity = np.where(
        frozen, ice_log_water_activity(ice_t, p), np.log1p(-solute_ratio / (1.0 + solute_ratio))
    )
    excess = np.expm1(-log_activity)  # 1/a - 1 > 0 where frozen
    unfrozen_freezable = np.where(
        frozen, freezable * solute_ratio / np.where(frozen, excess, 1.0), freezable
    )
    ice = freezable - unfrozen_freezable
    liquid = fluid_properties_at(t, p, phase="liquid")
    solid = ice_properties(ice_t, p)
    water = fractions["water"] - ice
    enthalpy = (
        solids_sensible_enthalpy(fractions, t, TRIPLE_POINT_TEMPERATURE)
        + water * liquid.specific_enthalpy
        + ice * solid.specific_enthalpy
    )
    # d(ice)/dT = x_f (n_s/n_w at T_f) (1/a) (d ln a/dT) / (1/a - 1)**2, with the
    # Gibbs-Helmholtz slope d ln a/dT = (h_liq - h_ice) / (R T**2).
    latent = liquid.specific_enthalpy - solid.specific_enthalpy
    slope = latent / (SPECIFIC_GAS_CONSTANT * t**2)
    safe = np.where(frozen, excess, 1.0)
    ice_slope = np.where(frozen, freezable * solute_ratio * (1.0 + safe) * slope / safe**2, 0.0)
    apparent = (
        solids_specific_heat(fractions, t)
        + water * liquid.specific_isobaric_heat_capacity
        + ice * solid.specific_isobaric_heat_capacity
        + latent * ice_slope
    )
    return FoodFreezing(
        temperature=t.reshape(shape),
        pressure=p.reshape(shape),
        freezing_temperature=onset.reshape(shape),
        ice_mass_fraction=np.asarray(ice, dtype=np.float64).reshape(shape),
        unfrozen_water_fraction=np.asarray(water, dtype=np.float64).reshape(shape),
        bound_water_fraction=bound,
        specific_enthalpy=np.asarray(enthalpy, dtype=np.float64).reshape(shape),
        apparent_specific_heat=np.asarray(apparent, dtype=np.float64).reshape(shape),
        log_water_activity=np.asarray(log_activity, dtype=np.float64).reshape(shape),
    )
