"""Vacuum (evaporative) cooling of a moist product by its own evaporation.

A product at an initial temperature is cooled to a final temperature (above its
freezing point) by evaporating part of its water under vacuum. The water is
liquid water with IAPWS-95 properties on its vapor-pressure curve; the rest of the
product is either

- a lumped specific heat ``c`` per kilogram of current product mass (the product's
  sensible heat is M c dT; each kilogram evaporated takes h_vapor - h_liquid), or
- a composition: water plus protein, fat, carbohydrate, fiber and ash with the
  Choi and Okos (1986) specific heats (:mod:`service.core.balances.food_composition`).

Equations
---------
Lumped:       (M c + C) dT = (h_v - kappa - h_l) dM
Composition:  (m_w (dh_l/dT - v_l dp/dT) + M_s c_s(T) + C) dT = (h_v - kappa - h_l) dm_w
Both are linear in the evaporating mass and are solved on Chebyshev-Lobatto nodes
as in :mod:`service.core.balances.stages`. C is the companions' heat capacity and
kappa the heat gained per kilogram evaporated (:mod:`service.core.balances.heat_gain`).

Freezing point
--------------
The final temperature must stay at or above the product's initial freezing point:
given; or, for a composition with dissolved solids, estimated as the freezing point of
an ideal solution of those solids in the product's water
(:func:`service.core.balances.solution_freezing.solution_freezing_point`, the model the
flash-freeze balance uses for its solutions); or, for a composition naming its dissolved
solutes, by the food estimate of
:func:`service.core.solutions.food_freezing_point.estimate_food_freezing_point` (Ross's
rule, as the ice-fraction lookup); or, with none of these, pure water's 273.16 K.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from typing import Final, Literal

import numpy as np
from numpy.typing import ArrayLike

from service.core.balances.companions import Companion, checked_heat_capacity
from service.core.balances.equilibrium_paths import ice_vapor_states, liquid_vapor_states
from service.core.balances.food_composition import (
    CHOI_OKOS_REFERENCE,
    Composition,
    solids_specific_heat,
)
from service.core.balances.heat_gain import (
    HEAT_GAIN_ASSUMPTION,
    HeatGain,
    solve_heat_per_evaporated_mass,
)
from service.core.balances.scalars import (
    checked_trap_temperature,
    finite_scalar,
    optional_finite_scalar,
    require_scalar_within,
)
from service.core.balances.solutes import DissolvedSolids, Solute
from service.core.balances.solution_freezing import (
    LOWEST_FREEZING_TEMPERATURE,
    lowest_log_water_activity,
    solution_freezing_point,
)
from service.core.balances.stages import DEGREE, interval_of, solve_linear_mass
from service.core.balances.sweeps import expand_case
from service.core.deadline import check_deadline
from service.core.errors import InvalidInputError, OutOfRangeError, UnsupportedStateError
from service.core.properties.advisories import Advisory
from service.core.properties.constants import MOLAR_MASS, TRIPLE_POINT_TEMPERATURE
from service.core.properties.phase import FloatArray
from service.core.properties.sources import (
    IAPWS_95,
    ICE_IH,
    MELTING_AND_SUBLIMATION,
    PropertySource,
)
from service.core.solutions.aqueous import solution_model
from service.core.solutions.food_freezing_point import (
    dissolved_fractions,
    estimate_food_freezing_point,
)
from service.core.solutions.freezing import ice_log_water_activity
from service.core.solutions.lookups import solution_source

__all__ = [
    "ESTIMATED_FREEZING_POINT_METHOD",
    "EVAPORATIVE_COOLING_LIMITS",
    "EvaporativeCoolingCase",
    "EvaporativeCoolingResult",
    "FreezingPointBasis",
    "evaporative_cooling",
]

FreezingPointBasis = Literal[
    "given",
    "estimated from dissolved solids",
    "estimated from composition solutes",
    "pure water (no data)",
]
"""Where the freezing point of the range check came from."""

ESTIMATED_FREEZING_POINT_METHOD: Final = (
    "Initial freezing point estimated from the dissolved solids: ideal-solution (Raoult) "
    "water activity, ice\u2013solution equilibrium from IAPWS-95 and IAPWS R10-06 Gibbs "
    "energies (the approach of Heldman 1974, from memory)"
)

EVAPORATIVE_COOLING_LIMITS: Final = {
    "initial_temperature_max": 373.15,
    "freezing_point_min": LOWEST_FREEZING_TEMPERATURE,
    "trap_temperature_min": 173.15,
    "dissolved_solids_molar_mass_min": 1e-3,
    "dissolved_solids_van_t_hoff_factor_max": 10.0,
}
"""K, or kg/mol and 1 for the dissolved solids. The initial temperature is at most the
normal boiling point; a product freezing point below 235 K is outside the
supercooled-liquid range used for its water."""

_FRACTION_SLACK: Final = 1e-9
"""Round-off allowed in water + dissolved solids <= 1 (mass fractions)."""

_KAPPA_UPPER_BOUND: Final = 3.0e6
_SUM_WARNING: Final = 1e-9


@dataclass(frozen=True)
class EvaporativeCoolingCase:
    """Input of :func:`evaporative_cooling`. Any numeric field may be an array (a sweep).

    Attributes
    ----------
    product_mass : array_like
        kg, > 0.
    initial_temperature, final_temperature : array_like
        K; final < initial <= 373.15 K, final >= the product's freezing point.
    specific_heat : array_like or None
        Lumped product specific heat, J/(kg K), > 0; exclusive with ``composition``.
    composition : Composition or None
        Mass fractions; exclusive with ``specific_heat``.
    companions : tuple of Companion
    heat_gain : HeatGain or None
    freezing_point : array_like or None
        Product's initial freezing point, K (235 K to 273.16 K). If None, it is
        estimated from ``dissolved_solids``; with neither, pure water's 273.16 K is
        used, with a warning.
    dissolved_solids : DissolvedSolids or None
        Solids dissolved in the product's water, mass fraction per kg of PRODUCT
        (requires ``composition``, whose water fraction gives the water they are
        dissolved in; water + dissolved solids <= 1). Used to estimate the freezing
        point when ``freezing_point`` is None; they add no mass or heat capacity (they
        are part of the composition's non-water fractions).
    trap_temperature : array_like or None
        Condenser / cold-trap temperature, K (173.15 K to 273.16 K).
    cooling_time : array_like or None
        s, > 0; gives mean vapor mass and volume flows.
    """

    product_mass: ArrayLike
    initial_temperature: ArrayLike
    final_temperature: ArrayLike
    specific_heat: ArrayLike | None = None
    composition: Composition | None = None
    companions: tuple[Companion, ...] = ()
    heat_gain: HeatGain | None = None
    freezing_point: ArrayLike | None = None
    trap_temperature: ArrayLike | None = None
    cooling_time: ArrayLike | None = None
    dissolved_solids: DissolvedSolids | None = None


@dataclass(frozen=True)
class EvaporativeCoolingResult:
    """Output of :func:`evaporative_cooling`; arrays of the sweep shape.

    Attributes
    ----------
    evaporated_mass : ndarray
        kg (integrated method).
    evaporated_fraction_of_product : ndarray
        evaporated_mass / initial product mass.
    mean_vapor_enthalpy_evaporated_mass : ndarray
        kg, hand method (one vapor enthalpy at the mean temperature).
    relative_difference : ndarray
        (hand - integrated) / integrated.
    prewetting_water_mass : ndarray
        kg of water to add beforehand so that the product ends at its initial mass.
    start_pressure : ndarray
        Pa, saturation pressure of water at the initial temperature: flashing starts
        when the chamber reaches it.
    final_pressure : ndarray
        Pa, saturation pressure at the final temperature: the set point.
    heat_removed : ndarray
        J, latent heat carried off, integral of (h_vapor - h_liquid) dm.
    sensible_heat_released : ndarray
        J, sensible heat given up by product and companions.
    heat_gained : ndarray
        J.
    vapor_enthalpy : ndarray
        J, integral of h_vapor dm (IAPWS reference).
    vapor_volume : ndarray
        m3, integral of dm / rho_vapor at the saturation states.
    condenser_load : ndarray or None
        J, vapor enthalpy minus the enthalpy of the same mass of ice at the trap
        temperature and its sublimation pressure.
    mean_vapor_mass_flow : ndarray or None
        kg/s, evaporated_mass / cooling_time.
    mean_vapor_volume_flow : ndarray or None
        m3/s, vapor_volume / cooling_time.
    final_vapor_volume_flow : ndarray or None
        m3/s, mean_vapor_mass_flow / rho_vapor(final): the mean mass flow as saturated
        vapor at the final pressure and temperature, the volume flow the vapor takes at
        the end of the cooling (the mean understates it: it averages over the pressures
        from the flash point down).
    energy_residual : ndarray
        J, sensible_heat_released + heat_gained - latent heat carried, the latter computed
        with the evaporation rate from differentiating the solution (integration error).
    relative_energy_residual : ndarray
        energy_residual / heat_removed.
    freezing_point : ndarray
        K, the one used for the range check.
    freezing_point_basis : str
        Where ``freezing_point`` came from (one for the whole sweep): ``"given"``,
        ``"estimated from dissolved solids"``, ``"estimated from composition solutes"`` or
        ``"pure water (no data)"``.
    assumptions, warnings, property_sources
    """

    evaporated_mass: FloatArray
    evaporated_fraction_of_product: FloatArray
    mean_vapor_enthalpy_evaporated_mass: FloatArray
    relative_difference: FloatArray
    prewetting_water_mass: FloatArray
    start_pressure: FloatArray
    final_pressure: FloatArray
    heat_removed: FloatArray
    sensible_heat_released: FloatArray
    heat_gained: FloatArray
    vapor_enthalpy: FloatArray
    vapor_volume: FloatArray
    condenser_load: FloatArray | None
    mean_vapor_mass_flow: FloatArray | None
    mean_vapor_volume_flow: FloatArray | None
    energy_residual: FloatArray
    relative_energy_residual: FloatArray
    freezing_point: FloatArray
    freezing_point_basis: FreezingPointBasis
    assumptions: tuple[str, ...]
    warnings: tuple[Advisory, ...]
    property_sources: tuple[PropertySource, ...]
    final_vapor_volume_flow: FloatArray | None = None


@dataclass
class _Numbers:
    evaporated: float
    hand_evaporated: float
    prewetting: float
    start_pressure: float
    final_pressure: float
    heat_removed: float
    sensible: float
    heat_gained: float
    vapor_enthalpy: float
    vapor_volume: float
    condenser_load: float | None
    mass_flow: float | None
    volume_flow: float | None
    final_volume_flow: float | None
    freezing_point: float
    residual: float
    composition_rescaled: bool


FREEZING_POINT_WARNING_BAND: Final = 3.0
"""K above 273.16 K below which a final temperature draws the freezing-point-assumed
warning (common practice, no source: fresh foods begin to freeze between about -0.5 and
-3 degC)."""


def _freezing_point_basis(case: EvaporativeCoolingCase) -> FreezingPointBasis:
    if case.freezing_point is not None:
        return "given"
    if case.dissolved_solids is not None:
        return "estimated from dissolved solids"
    if case.composition is not None and case.composition.dissolved_solutes:
        return "estimated from composition solutes"
    return "pure water (no data)"


def _dissolved_solids(case: EvaporativeCoolingCase, index: int | None) -> Solute | None:
    """The validated dissolved solids as a solute of the product's water, or None."""
    solids = case.dissolved_solids
    if solids is None:
        return None
    if case.composition is None:
        raise InvalidInputError(
            "dissolved_solids",
            "needs composition: the product's water fraction gives the water the solids are "
            "dissolved in (with specific_heat, give freezing_point instead)",
        )
    limits = EVAPORATIVE_COOLING_LIMITS
    water = case.composition.fractions()["water"]
    fraction = finite_scalar(solids.mass_fraction, "dissolved_solids.mass_fraction")
    molar = finite_scalar(solids.molar_mass, "dissolved_solids.molar_mass")
    factor = finite_scalar(solids.van_t_hoff_factor, "dissolved_solids.van_t_hoff_factor")
    if not 0.0 <= fraction <= 1.0 - water + _FRACTION_SLACK:
        raise OutOfRangeError(
            "dissolved_solids.mass_fraction",
            fraction,
            0.0,
            1.0 - water,
            "1",
            "kg per kg of product; the dissolved solids are part of the non-water mass, so "
            f"water ({water:.6g}) + dissolved solids must not exceed 1",
            index,
        )
    require_scalar_within(
        molar,
        "dissolved_solids.molar_mass",
        limits["dissolved_solids_molar_mass_min"],
        None,
        "kg/mol",
        "effective molar mass of the dissolved solids",
        index,
    )
    require_scalar_within(
        factor,
        "dissolved_solids.van_t_hoff_factor",
        1.0,
        limits["dissolved_solids_van_t_hoff_factor_max"],
        "1",
        "particles per dissolved formula unit",
        index,
    )
    return solids.in_solution(water)


def _estimated_freezing_point(
    case: EvaporativeCoolingCase, solute: Solute, index: int | None
) -> float:
    """Freezing point of the solution of the dissolved solids in the product's water (the
    named solute's non-ideal model, else the ideal solution)."""
    try:
        return float(solution_freezing_point(solute))
    except OutOfRangeError as error:
        model = solute.activity_model
        if error.variable == "solute.mass_fraction" and model is not None:
            assert case.dissolved_solids is not None and case.composition is not None
            water = case.composition.fractions()["water"]
            top = model.maximum_mass_fraction
            raise OutOfRangeError(
                "dissolved_solids.mass_fraction",
                float(np.asarray(case.dissolved_solids.mass_fraction)),
                0.0,
                water * top / (1.0 - top),
                "1",
                error.reason,
                index,
            ) from error
        if error.variable != "water_activity":
            raise
        assert case.dissolved_solids is not None and case.composition is not None
        water = case.composition.fractions()["water"]
        molar = float(np.asarray(solute.molar_mass))
        factor = float(np.asarray(solute.van_t_hoff_factor))
        # a_w(235 K) = n_w / (n_w + i n_s): largest solids-to-water mass ratio
        ratio = float(np.expm1(-lowest_log_water_activity())) * molar / (factor * MOLAR_MASS)
        raise OutOfRangeError(
            "dissolved_solids.mass_fraction",
            float(np.asarray(case.dissolved_solids.mass_fraction)),
            0.0,
            water * ratio,
            "1",
            f"the estimated freezing point falls below {LOWEST_FREEZING_TEMPERATURE} K, "
            "outside the supercooled-liquid range of IAPWS-95 used for the product's water",
            index,
        ) from error


def _composition_solute_sources(
    case: EvaporativeCoolingCase, basis: FreezingPointBasis
) -> tuple[PropertySource, ...]:
    """The activity models behind a freezing point estimated from the composition's solutes."""
    if basis != "estimated from composition solutes" or case.composition is None:
        return ()
    found: list[PropertySource] = []
    for name in dissolved_fractions(case.composition):
        source = solution_source(solution_model(name))
        if source not in found:
            found.append(source)
    return tuple(found)


def _freezing_point(case: EvaporativeCoolingCase, index: int | None) -> float:
    """K: given, else estimated from the dissolved solids or the composition's named
    solutes, else pure water's 273.16 K."""
    limits = EVAPORATIVE_COOLING_LIMITS
    given = optional_finite_scalar(case.freezing_point, "freezing_point")
    solute = _dissolved_solids(case, index)
    if case.composition is not None and case.composition.dissolved_solutes:
        if solute is not None:
            raise InvalidInputError(
                "dissolved_solids",
                "give dissolved_solids or composition.dissolved_solutes, not both",
            )
        if given is not None:
            dissolved_fractions(case.composition)  # checked, not used
        else:
            return estimate_food_freezing_point(case.composition).temperature
    if given is not None:
        return require_scalar_within(
            given,
            "freezing_point",
            limits["freezing_point_min"],
            TRIPLE_POINT_TEMPERATURE,
            "K",
            "a product's initial freezing point lies at or below pure water's",
            index,
        )
    if solute is not None:
        return _estimated_freezing_point(case, solute, index)
    return TRIPLE_POINT_TEMPERATURE


def _solve_scalar(case: EvaporativeCoolingCase, index: int | None) -> _Numbers:
    limits = EVAPORATIVE_COOLING_LIMITS
    mass = finite_scalar(case.product_mass, "product_mass")
    initial = finite_scalar(case.initial_temperature, "initial_temperature")
    final = finite_scalar(case.final_temperature, "final_temperature")
    require_scalar_within(
        mass, "product_mass", 0.0, None, "kg", "must be positive", index, exclusive_minimum=True
    )
    freezing = _freezing_point(case, index)
    if not freezing <= initial <= limits["initial_temperature_max"]:
        raise OutOfRangeError(
            "initial_temperature",
            initial,
            freezing,
            limits["initial_temperature_max"],
            "K",
            "the product starts unfrozen and at most at the normal boiling point",
            index,
        )
    if final >= initial:
        raise OutOfRangeError(
            "final_temperature",
            final,
            freezing,
            initial,
            "K",
            "evaporative cooling needs a final temperature below the initial temperature",
            index,
        )
    if final < freezing:
        basis = _freezing_point_basis(case)
        estimated = (
            " (estimated from its dissolved solids)" if basis.startswith("estimated") else ""
        )
        raise UnsupportedStateError(
            "final_temperature",
            f"{final:.6g} K is below the product's initial freezing point {freezing:.6g} K"
            f"{estimated}: the product would start to freeze; use the flash-freeze "
            "calculation for cooling into freezing",
            final,
            {"freezing_point": freezing, "freezing_point_basis": basis, "index": index},
        )
    if (case.specific_heat is None) == (case.composition is None):
        raise InvalidInputError("specific_heat", "give exactly one of specific_heat or composition")
    companions = checked_heat_capacity(case.companions, index)
    gain = case.heat_gain.total() if case.heat_gain is not None else 0.0

    lower, upper = final, initial
    interval = interval_of(lower, upper)
    temperatures = np.append(interval.nodes, 0.5 * (lower + upper))
    states = liquid_vapor_states(temperatures)
    nodes = slice(0, DEGREE + 1)
    h_l = states.condensed.specific_enthalpy[nodes]
    h_v = states.vapor.specific_enthalpy[nodes]
    v_l = 1.0 / states.condensed.density[nodes]
    pressure = states.pressure[nodes]
    water_along = interval.derivative(h_l) - v_l * interval.derivative(pressure)
    rescaled = False
    if case.composition is not None:
        fractions = case.composition.fractions()
        raw_total = sum(float(np.asarray(getattr(case.composition, k))) for k in fractions)
        rescaled = abs(raw_total - 1.0) > _SUM_WARNING
        start_mass = fractions["water"] * mass
        per_mass = water_along
        extra = companions + mass * solids_specific_heat(fractions, interval.nodes)
        hand_released_per_mass = float(h_l[-1] - h_l[0])
        hand_extra = float(interval.integral(extra))
    else:
        assert case.specific_heat is not None
        specific = require_scalar_within(
            case.specific_heat,
            "specific_heat",
            0.0,
            1e4,
            "J/(kg K)",
            "must be positive",
            index,
            exclusive_minimum=True,
        )
        start_mass = mass
        per_mass = np.full_like(h_l, specific)
        extra = np.full_like(h_l, companions)
        hand_released_per_mass = specific * (upper - lower)
        hand_extra = companions * (upper - lower)

    def integrate(kappa: float) -> tuple[FloatArray, FloatArray]:
        denominator = h_v - kappa - h_l
        if np.any(denominator <= 0.0):
            raise UnsupportedStateError(
                "heat_gain", "the heat gained per kilogram evaporated reaches the latent heat"
            )
        a = per_mass / denominator
        b = extra / denominator
        current = solve_linear_mass(interval, a, b, start_mass)
        if np.any(current <= 0.0):
            raise UnsupportedStateError(
                "product_mass", "all the product's water would evaporate before the end"
            )
        return current, a * current + b

    kappa = solve_heat_per_evaporated_mass(
        gain, lambda k: start_mass - float(integrate(k)[0][0]), _KAPPA_UPPER_BOUND, start_mass
    )
    current, rate = integrate(kappa)
    evaporated = start_mass - float(current[0])
    heat_removed = float(interval.integral((h_v - h_l) * rate))
    sensible = float(interval.integral(current * per_mass + extra))
    # independent check: latent heat with the rate from differentiating the solution
    residual = (
        sensible
        + kappa * evaporated
        - float(interval.integral((h_v - h_l) * interval.derivative(current)))
    )
    vapor_enthalpy = float(interval.integral(h_v * rate))
    vapor_volume = float(interval.integral(rate / states.vapor.density[nodes]))

    mean_vapor = float(states.vapor.specific_enthalpy[-1])
    hand_kappa = solve_heat_per_evaporated_mass(
        gain,
        lambda k: (
            (start_mass * hand_released_per_mass + hand_extra) / (mean_vapor - k - float(h_l[0]))
        ),
        float(mean_vapor - h_l[0]) * 0.999,
        start_mass,
    )
    hand = (start_mass * hand_released_per_mass + hand_extra) / (
        mean_vapor - hand_kappa - float(h_l[0])
    )

    # free water cooled over the same interval: fraction f of itself evaporates
    free_exponent = interval.integral(water_along / (h_v - kappa - h_l))
    free_fraction = -float(np.expm1(-free_exponent))
    prewetting = evaporated / (1.0 - free_fraction)

    condenser_load = None
    trap = checked_trap_temperature(case.trap_temperature, limits["trap_temperature_min"], index)
    if trap is not None:
        trap_ice = ice_vapor_states(np.array([trap])).condensed.specific_enthalpy[0]
        condenser_load = vapor_enthalpy - evaporated * float(trap_ice)
    time = optional_finite_scalar(case.cooling_time, "cooling_time")
    if time is not None:
        require_scalar_within(
            time, "cooling_time", 0.0, None, "s", "must be positive", index, exclusive_minimum=True
        )
    return _Numbers(
        evaporated=evaporated,
        hand_evaporated=hand,
        prewetting=prewetting,
        start_pressure=float(pressure[-1]),
        final_pressure=float(pressure[0]),
        heat_removed=heat_removed,
        sensible=sensible,
        heat_gained=kappa * evaporated,
        vapor_enthalpy=vapor_enthalpy,
        vapor_volume=vapor_volume,
        condenser_load=condenser_load,
        mass_flow=None if time is None else evaporated / time,
        volume_flow=None if time is None else vapor_volume / time,
        final_volume_flow=None
        if time is None
        else evaporated / time / float(states.vapor.density[nodes][0]),
        freezing_point=freezing,
        residual=residual,
        composition_rescaled=rescaled,
    )


def _assumptions(case: EvaporativeCoolingCase) -> tuple[str, ...]:
    items = [
        "Vapor is removed as it forms; the product and its water are in equilibrium with the "
        "vapor at every instant, at one uniform temperature.",
        HEAT_GAIN_ASSUMPTION
        if case.heat_gain is not None
        else "Adiabatic: no heat exchange with the surroundings.",
        "The evaporating water is liquid water with IAPWS-95 properties at its saturation "
        "pressure (water activity 1 for the vapor pressure and the pressures reported).",
        "Flashing starts when the chamber reaches the saturation pressure at the initial "
        "temperature; the final set point is the saturation pressure at the final temperature.",
        "evaporated_fraction_of_product = evaporated mass / initial product mass.",
        "Pre-wetting water: free water added at the initial temperature that stays on the "
        "product, cools with it and evaporates; each kilogram evaporates a fraction f of "
        "itself to cool itself, so the water to add is m_evaporated / (1 - f), heat gain per "
        "kilogram evaporated unchanged.",
        "Vapor volume: integral of dm / rho_vapor at the saturation states.",
        "Hand method: one vapor enthalpy at the mean temperature, product heat capacity at its "
        "initial mass.",
        f"Integration: Chebyshev-Lobatto collocation on {DEGREE + 1} nodes.",
    ]
    if case.composition is not None:
        items.append(
            "Composition model: water as IAPWS-95 liquid; the other components with the "
            f"specific heats of {CHOI_OKOS_REFERENCE}, mass-weighted."
        )
    else:
        items.append(
            "Lumped model: the product's sensible heat is its current mass times the given "
            "specific heat; each kilogram evaporated takes h_vapor - h_liquid (IAPWS-95)."
        )
    basis = _freezing_point_basis(case)
    if basis == "estimated from dissolved solids":
        items.append(f"{ESTIMATED_FREEZING_POINT_METHOD}.")
        items.append(
            "The dissolved solids are treated as one effective solute in all of the product's "
            "water (none bound), and set only the freezing point: the vapor pressures, the "
            "start-of-flashing pressure and the set point are pure water's. Over the solution "
            "they would be lower by the factor a_w (ideal solution); that lowering is not "
            "applied."
        )
    elif basis == "estimated from composition solutes":
        assert case.composition is not None
        onset = estimate_food_freezing_point(case.composition)
        activity = float(
            np.exp(ice_log_water_activity(np.array([onset.temperature]), np.array([101325.0])))[0]
        )
        items.append(onset.statement)
        items.append(
            "The composition's named solutes set only the freezing point: the vapor "
            "pressures, the start-of-flashing pressure and the set point are pure water's. "
            f"Over the food's water they would be lower by its water activity, {activity:.4f} "
            "at the freezing onset by the food model (the activity of ice there) and nearer 1 "
            "above it; that lowering is not applied."
        )
    elif basis == "given" and case.dissolved_solids is not None:
        items.append(
            "The given freezing point is used as is; the dissolved solids are checked but not "
            "used to estimate it."
        )
    if case.companions:
        items.append("Companion masses have constant specific heats and follow the product.")
    if case.trap_temperature is not None:
        items.append(
            "Condenser load: enthalpy removed to take the vapor to ice at the trap temperature; "
            "transit heat and trap losses excluded."
        )
    return tuple(items)


def evaporative_cooling(case: EvaporativeCoolingCase) -> EvaporativeCoolingResult:
    """Evaporative (vacuum) cooling of a moist product from one temperature to another.

    Parameters
    ----------
    case : EvaporativeCoolingCase
        Any numeric field may be an array (a sweep).

    Returns
    -------
    EvaporativeCoolingResult
        Arrays of the sweep shape.

    Raises
    ------
    InvalidInputError
        Malformed input, both / neither of specific_heat and composition, or dissolved
        solids without a composition.
    OutOfRangeError
        A final temperature at or above the initial one, or another input out of range
        (dissolved solids: water + dissolved solids above 1, or so many that the
        estimated freezing point falls below 235 K).
    UnsupportedStateError
        A final temperature below the product's freezing point (use the flash-freeze
        calculation), or a heat gain that would evaporate all the water.

    Notes
    -----
    Lumped: (M c + C) dT = (h_v - h_l) dM; composition: (m_w T ds_l/dT + M_s c_s + C) dT =
    (h_v - h_l) dm_w; see the module docstring. Estimated freezing point (dissolved solids
    x_s per kg of product, water x_w): the solids form a solution of mass fraction
    w = x_s / (x_w + x_s), a_w = n_w / (n_w + i n_s), and the freezing point is the root of
    ln a_w = (g_ice - g_liq) / (R T) at the sublimation pressure.

    References
    ----------
    IAPWS R6-95(2018); Choi and Okos (1986) for the component specific heats; IAPWS
    R10-06(2009) and R14-08(2011) with Heldman (1974) for the estimated freezing point.

    Examples
    --------
    >>> result = evaporative_cooling(EvaporativeCoolingCase(
    ...     product_mass=1.0, initial_temperature=298.15, final_temperature=275.15,
    ...     specific_heat=4000.0))
    >>> round(float(result.evaporated_fraction_of_product), 4)
    0.0366
    """
    shape, cases = expand_case(case)
    batch = len(shape) > 0
    numbers = []
    for i, c in enumerate(cases):
        check_deadline()  # a caller's time limit stops a long sweep between its cases
        numbers.append(_solve_scalar(c, i if batch else None))

    def stack(function: Callable[[_Numbers], float]) -> FloatArray:
        return np.asarray([function(n) for n in numbers], dtype=np.float64).reshape(shape)

    masses = np.asarray(
        [float(np.asarray(c.product_mass)) for c in cases], dtype=np.float64
    ).reshape(shape)
    evaporated = stack(lambda n: n.evaporated)
    hand = stack(lambda n: n.hand_evaporated)
    residual = stack(lambda n: n.residual)
    heat_removed = stack(lambda n: n.heat_removed)
    warnings: list[Advisory] = []

    def flag(mask: list[bool], code: str, message: str) -> None:
        flags = np.asarray(mask)
        if flags.any():
            indices = (
                tuple(int(i) for i in np.flatnonzero(flags)) if batch and not flags.all() else None
            )
            warnings.append(Advisory(code, message, indices))

    basis = _freezing_point_basis(case)
    solids_model = None if case.dissolved_solids is None else case.dissolved_solids.activity_model
    # Only where the assumption can change the answer: a final temperature within
    # FREEZING_POINT_WARNING_BAND of pure water's freezing point, where a real product's
    # lower freezing point decides whether it freezes.
    near_freezing = [
        float(np.asarray(c.final_temperature))
        < TRIPLE_POINT_TEMPERATURE + FREEZING_POINT_WARNING_BAND
        for c in cases
    ]
    flag(
        [basis == "pure water (no data)" and near for near in near_freezing],
        "freezing-point-assumed",
        "No product freezing point given and no dissolved solids to estimate it: pure "
        "water's 273.16 K was used for the range check; real products freeze lower (often "
        "-0.5 to -2 degC), which matters this close to freezing: give freezing_point.",
    )
    flag(
        [n.composition_rescaled for n in numbers],
        "composition-rescaled",
        "The composition's mass fractions did not sum to 1 and were rescaled.",
    )
    return EvaporativeCoolingResult(
        evaporated_mass=evaporated,
        evaporated_fraction_of_product=evaporated / masses,
        mean_vapor_enthalpy_evaporated_mass=hand,
        relative_difference=(hand - evaporated) / evaporated,
        prewetting_water_mass=stack(lambda n: n.prewetting),
        start_pressure=stack(lambda n: n.start_pressure),
        final_pressure=stack(lambda n: n.final_pressure),
        heat_removed=heat_removed,
        sensible_heat_released=stack(lambda n: n.sensible),
        heat_gained=stack(lambda n: n.heat_gained),
        vapor_enthalpy=stack(lambda n: n.vapor_enthalpy),
        vapor_volume=stack(lambda n: n.vapor_volume),
        condenser_load=(
            stack(lambda n: float(n.condenser_load or 0.0))
            if case.trap_temperature is not None
            else None
        ),
        mean_vapor_mass_flow=(
            stack(lambda n: float(n.mass_flow or 0.0)) if case.cooling_time is not None else None
        ),
        mean_vapor_volume_flow=(
            stack(lambda n: float(n.volume_flow or 0.0)) if case.cooling_time is not None else None
        ),
        final_vapor_volume_flow=(
            stack(lambda n: float(n.final_volume_flow or 0.0))
            if case.cooling_time is not None
            else None
        ),
        energy_residual=residual,
        relative_energy_residual=residual / heat_removed,
        freezing_point=stack(lambda n: n.freezing_point),
        freezing_point_basis=basis,
        assumptions=_assumptions(case),
        warnings=tuple(warnings),
        property_sources=(
            IAPWS_95,
            ICE_IH,
            MELTING_AND_SUBLIMATION,
            *(() if solids_model is None else (solution_source(solids_model),)),
            *_composition_solute_sources(case, basis),
        ),
    )
