"""The product and its companions as the simulation's energy function sees them.

Turns a validated :class:`~service.core.simulation.inputs.Product` (with companions) into
the water mass, the sensible-heat polynomial of everything that is not water, the
solute constant and the initial energy, and checks that the product starts unfrozen.

Non-water heat capacity
-----------------------
- lumped: (1 - w) M c_s, constant;
- composition: M sum_i x_i c_i(t) with the Choi and Okos (1986) polynomials
  (:mod:`service.core.balances.food_composition`), integrated exactly;
- companions: sum m_k c_k, constant.

The sensible heat S(tau) = integral from T_t to T of the total, a cubic in
tau = T - 273.16 K. A solute is part of the non-water mass (its heat is in the solids'
specific heat); it sets the water activity: its non-ideal model where it has one
(:mod:`service.core.simulation.solution_tables`), else the ideal solution with its van 't Hoff
factor.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from service.core.balances.companions import Companion, heat_capacity
from service.core.balances.food_composition import solids_specific_heat
from service.core.balances.scalars import require_scalar_within
from service.core.errors import InvalidInputError, OutOfRangeError
from service.core.properties.constants import MOLAR_MASS, TRIPLE_POINT_TEMPERATURE
from service.core.simulation.inputs import Product
from service.core.simulation.path_tables import LIQUID_TEMPERATURE_MIN, path_tables
from service.core.simulation.product_state import ProductThermodynamics
from service.core.simulation.solution_tables import SolutionActivity

__all__ = ["LoadModel", "load_model"]

_ONSET_TOLERANCE = 1e-10


@dataclass(frozen=True)
class LoadModel:
    """The product as the simulation integrates it.

    Attributes
    ----------
    water_mass : float
        Initial water, kg.
    solute_mass : float
        kg (0 without solute).
    freezing_onset : float
        K, initial freezing point (273.16 K for pure water).
    thermodynamics : ProductThermodynamics
    initial_energy : float
        E at the initial temperature, J.
    composition_rescaled : bool
        The composition's fractions were rescaled to sum to 1.
    solids_coefficients : tuple of float
        (c1, c2, c3) of S(tau) for the product's non-water part alone (no companions), J
        (the interior model spreads it over its nodes).
    """

    water_mass: float
    solute_mass: float
    freezing_onset: float
    thermodynamics: ProductThermodynamics
    initial_energy: float
    composition_rescaled: bool
    solids_coefficients: tuple[float, float, float] = (0.0, 0.0, 0.0)


def _solids_polynomial(product: Product) -> tuple[tuple[float, float, float], float, bool]:
    """(sensible coefficients of the solids, water mass, rescaled flag)."""
    mass = product.mass
    if product.composition is None:
        water = product.water_fraction * mass
        capacity = (mass - water) * product.solids_specific_heat
        return (capacity, 0.0, 0.0), water, False
    fractions = product.composition.fractions()
    raw = sum(float(np.asarray(getattr(product.composition, name))) for name in fractions)
    # c(tau) is a quadratic in tau: three samples give it exactly.
    samples = mass * solids_specific_heat(
        fractions, TRIPLE_POINT_TEMPERATURE + np.array([-1.0, 0.0, 1.0])
    )
    a = float(samples[1])
    b = float(0.5 * (samples[2] - samples[0]))
    c = float(0.5 * (samples[2] + samples[0]) - samples[1])
    return (a, 0.5 * b, c / 3.0), fractions["water"] * mass, abs(raw - 1.0) > 1e-9


def _solute_constant(product: Product, water: float) -> tuple[float | None, float]:
    solute = product.solute
    if solute is None:
        return None, 0.0
    model = solute.activity_model
    fraction = require_scalar_within(
        solute.mass_fraction,
        "product.solute.mass_fraction",
        0.0,
        0.5 if model is None else model.maximum_mass_fraction,
        "1",
        "ideal-solution model range"
        if model is None
        else f"{model.name}: the {model.model} model's range",
    )
    molar = require_scalar_within(
        solute.molar_mass, "product.solute.molar_mass", 1e-3, None, "kg/mol", "must be positive"
    )
    factor = require_scalar_within(
        solute.van_t_hoff_factor,
        "product.solute.van_t_hoff_factor",
        1.0,
        10.0,
        "1",
        "particles per unit",
    )
    if fraction == 0.0:
        return None, 0.0
    solute_mass = fraction / (1.0 - fraction) * water
    if solute_mass > (product.mass - water) * (1.0 + 1e-9):
        raise InvalidInputError(
            "product.solute.mass_fraction",
            f"the solute ({solute_mass:.6g} kg) is part of the non-water mass "
            f"({product.mass - water:.6g} kg) and cannot exceed it",
            fraction,
        )
    return factor * solute_mass * MOLAR_MASS / molar, solute_mass


def _freezing_onset(solute_constant: float, water: float) -> float:
    """T where ln a_w(T) of ice equilibrium equals ln(m / (m + K)) (Newton on the table)."""
    target = math.log(water / (water + solute_constant))
    table = path_tables().solution
    temperature = TRIPLE_POINT_TEMPERATURE - 100.0 * -target  # about 1.86 K per mol/kg
    for _ in range(50):
        (log_a,), (slope,) = table.values_and_slopes(temperature)
        step = (log_a - target) / slope
        temperature -= step
        if temperature < LIQUID_TEMPERATURE_MIN - 10.0:
            break
        if abs(step) < _ONSET_TOLERANCE:
            return temperature
    raise OutOfRangeError(
        "product.solute.mass_fraction",
        water / (water + solute_constant),
        None,
        None,
        "water activity",
        f"the solution's freezing point falls below {LIQUID_TEMPERATURE_MIN} K, outside "
        "the supercooled-liquid range of the model",
    )


def load_model(product: Product, companions: tuple[Companion, ...]) -> LoadModel:
    """Build the energy function of a validated product and its companions.

    Raises
    ------
    InvalidInputError
        A composition that does not sum to 1, a solute heavier than the solids.
    OutOfRangeError
        An initial temperature below the product's freezing onset.
    """
    solids, water, rescaled = _solids_polynomial(product)
    c1, c2, c3 = solids
    c1 += heat_capacity(companions)
    constant, solute_mass = _solute_constant(product, water)
    model = None if product.solute is None else product.solute.activity_model
    activity = (
        None if model is None or constant is None else SolutionActivity(model, solute_mass, water)
    )
    if activity is not None:
        constant = None  # the non-ideal tables replace the ideal constant
        onset = activity.freezing_onset
    else:
        onset = TRIPLE_POINT_TEMPERATURE if constant is None else _freezing_onset(constant, water)
    if product.initial_temperature < onset or (
        constant is None
        and activity is None
        and product.initial_temperature == TRIPLE_POINT_TEMPERATURE
    ):
        raise OutOfRangeError(
            "product.initial_temperature",
            product.initial_temperature,
            onset,
            None,
            "K",
            "the product starts unfrozen, above its freezing onset",
        )
    thermodynamics = ProductThermodynamics((c1, c2, c3), constant, activity)
    sensible, _ = thermodynamics.sensible(product.initial_temperature)
    energy = water * path_tables().liquid.values(product.initial_temperature)[0] + sensible
    return LoadModel(
        water_mass=water,
        solute_mass=solute_mass,
        freezing_onset=onset,
        thermodynamics=thermodynamics,
        initial_energy=energy,
        composition_rescaled=rescaled,
        solids_coefficients=solids,
    )
