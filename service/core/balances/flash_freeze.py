"""Flash-to-freeze balance: water (or a watery load) evaporating under vacuum until frozen.

Water at an initial temperature sits in a chamber whose vapor is removed as it
forms. It cools along its vapor-pressure curve by its own evaporation to the
freezing onset, freezes (at the triple point for pure water; progressively for
a solution), and, if asked, the ice keeps cooling by sublimation. Every stage is
integrated with properties from the core (no constant latent heat); the hand
method with one mean vapor enthalpy per stage is computed beside it.

See :mod:`service.core.balances.stages` for the stage equations.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, replace
from functools import cache, lru_cache
from typing import Final, Literal

import numpy as np
from numpy.typing import ArrayLike
from scipy.optimize import brentq

from service.core.balances.companions import Companion, checked_heat_capacity
from service.core.balances.equilibrium_paths import (
    FreezingSolutionStates,
    LiquidVaporStates,
    freezing_solution_states,
    ice_vapor_states,
    liquid_vapor_states,
)
from service.core.balances.food_composition import Composition
from service.core.balances.food_load import FoodLoad, food_load
from service.core.balances.heat_gain import (
    HEAT_GAIN_ASSUMPTION,
    HeatGain,
    solve_heat_per_evaporated_mass,
)
from service.core.balances.results import (
    EnergyBalance,
    MethodComparison,
    StageResult,
    Trajectory,
)
from service.core.balances.scalars import (
    checked_trap_temperature,
    finite_scalar,
    optional_finite_scalar,
    require_scalar_within,
)
from service.core.balances.solutes import (
    SOLUTE_MODEL_REFERENCE,
    Solute,
    liquid_water_mass_at_activity,
    water_activity,
)
from service.core.balances.solution_freezing import (
    LOWEST_FREEZING_TEMPERATURE,
    ice_solution_equilibrium_temperature,
    model_log_water_activity,
)
from service.core.balances.stages import (
    DEGREE,
    ZERO_LENGTH,
    HeatCapacity,
    StageNumbers,
    freezing_at_fixed_temperature,
    freezing_solution_stage,
    hand_freezing_solution_stage,
    hand_single_phase_stage,
    interval_of,
    merge_pieces,
    sensible_heat,
    single_phase_stage,
)
from service.core.balances.sweeps import expand_case
from service.core.deadline import check_deadline
from service.core.errors import InvalidInputError, NotConvergedError, OutOfRangeError
from service.core.properties.advisories import Advisory
from service.core.properties.constants import MOLAR_MASS, TRIPLE_POINT_TEMPERATURE
from service.core.properties.phase import FloatArray, PhaseProperties
from service.core.properties.sources import (
    IAPWS_95,
    ICE_IH,
    MELTING_AND_SUBLIMATION,
    PropertySource,
)
from service.core.solutions.aqueous import SolutionModel
from service.core.solutions.ethanol import ETHANOL_CAUTION
from service.core.solutions.food_freezing_point import estimate_food_freezing_point
from service.core.solutions.glass import FREEZE_CONCENTRATION_DATA, GLASS_SOURCE
from service.core.solutions.lookups import FOOD_SOURCE, solution_source

__all__ = [
    "FLASH_FREEZE_LIMITS",
    "FlashFreezeCase",
    "FlashFreezeResult",
    "flash_freeze",
]

Method = Literal["integrated", "mean-vapor-enthalpy"]

FLASH_FREEZE_LIMITS: Final = {
    "initial_temperature_max": 373.15,
    "final_ice_temperature_min": 173.15,
    "liquid_temperature_min": LOWEST_FREEZING_TEMPERATURE,
    "trap_temperature_min": 173.15,
    "solute_mass_fraction_max": 0.5,
    "trajectory_points_min": 50,
    "trajectory_points_max": 2000,
}
"""Validity limits of the balance (K, or dimensionless).

initial_temperature_max: the normal boiling point; a hotter load would boil before the
chamber is pumped. liquid_temperature_min: lowest supercooled or solution liquid
temperature accepted (IAPWS-95 extrapolated into the metastable liquid).
final_ice_temperature_min / trap_temperature_min: -100 degC, below any practical
condenser or shelf."""

_LOW_ACTIVITY_WARNING: Final = 0.9
"""Below this water activity the ideal-solution model is outside its reliable range."""

_FREEZING_TOLERANCE: Final = 1e-9
"""K, convergence of freezing-onset iterations."""

_MAX_COUPLING_ITERATIONS: Final = 40

_KAPPA_UPPER_BOUND: Final = 3.0e6
"""J/kg, above any latent heat on the path; the heat-gain solve bisects below it."""

FOOD_LOAD_ASSUMPTION: Final = (
    "Food by composition, by the ice-fraction lookup's model (Schwartzberg 1976, as in "
    "ASHRAE Handbook - Refrigeration; from memory): its freezable water (water less 0.4 kg "
    "per kg of protein) evaporates and freezes as an ideal solution of one effective solute "
    "sized by the initial freezing point at 101325 Pa; the bound water stays liquid, neither "
    "freezing nor evaporating; the other components take the Choi and Okos (1986) specific "
    "heats. evaporated_mass, ice_mass, liquid_mass and evaporated_fraction_of_water are of "
    "the freezable water (the bound water is not in liquid_mass). The vapor pressure over "
    "the unfrozen food is a_w p_liquid with the effective solute's a_w, the food model's."
)

_PIECE_RATIO: Final = 2.0
"""Ratio of the distances from 273.16 K of the ends of each solution-freezing piece."""


@dataclass(frozen=True)
class FlashFreezeCase:
    """Input of :func:`flash_freeze`. Any numeric field may be an array (a sweep).

    Attributes
    ----------
    initial_temperature : array_like
        K, from the freezing onset (273.16 K for pure water; the solution's freezing
        point) to 373.15 K.
    water_mass : array_like
        Initial liquid water, kg, > 0 (the solute, if any, comes on top).
    final_ice_temperature : array_like or None
        K. Pure water: after all is frozen, the ice cools by sublimation down to it
        (173.15 K to 273.16 K). Solution: end temperature of the progressive freezing
        (required; from 235 K, or the end of a named solute's model range, to below the
        freezing onset).
    method : {"integrated", "mean-vapor-enthalpy"}
        Which answer is headline; both are always computed (see ``comparison``).
    companions : tuple of Companion
        Masses that cool with the water.
    heat_gain : HeatGain or None
        Heat gained from the surroundings (adiabatic if None).
    solute : Solute or None
        Dissolved solute; the solution freezes progressively.
    nucleation_temperature : array_like or None
        K. Supercooling: the liquid cools to this temperature (below its freezing
        onset, >= 235 K) before ice nucleates.
    trap_temperature : array_like or None
        K, condenser / cold-trap temperature (173.15 K to 273.16 K) for its load.
    trajectory_points : int
        Points in the trajectory, 50 to 2000 (plus one per recalescence).
    composition : Composition or None
        A food instead of water and a solute, by the ice-fraction lookup's food model
        (:mod:`service.core.balances.food_load`): its freezable water evaporates and
        freezes, its bound water and solids cool with it; ``water_mass`` is then not used
        and the results' masses are of the freezable water.
    product_mass : array_like or None
        kg of food, > 0; required with ``composition``.
    freezing_point : array_like or None
        K, the food's initial freezing point at 101325 Pa (253.15 K to 273.16 K); omitted,
        it is estimated from the composition.
    """

    initial_temperature: ArrayLike
    water_mass: ArrayLike = 1.0
    final_ice_temperature: ArrayLike | None = None
    method: Method = "integrated"
    companions: tuple[Companion, ...] = ()
    heat_gain: HeatGain | None = None
    solute: Solute | None = None
    nucleation_temperature: ArrayLike | None = None
    trap_temperature: ArrayLike | None = None
    trajectory_points: int = 64
    composition: Composition | None = None
    product_mass: ArrayLike | None = None
    freezing_point: ArrayLike | None = None


@dataclass(frozen=True)
class FlashFreezeResult:
    """Output of :func:`flash_freeze`; arrays of the sweep shape.

    Attributes
    ----------
    method : str
        The headline method.
    evaporated_mass : ndarray
        kg of vapor removed over the whole process.
    evaporated_fraction_of_water : ndarray
        evaporated_mass / initial water mass.
    ice_mass : ndarray
        kg of ice at the end.
    liquid_mass : ndarray
        kg of liquid water left (solution: unfrozen water; pure water: 0).
    final_temperature : ndarray
        K.
    final_pressure : ndarray
        Equilibrium vapor pressure at the end, Pa.
    vapor_volume : ndarray
        Sum of the stages' vapor volumes, m3.
    condenser_load : ndarray or None
        J: enthalpy the trap removes to turn all the vapor, as it leaves the load, into
        ice at the trap temperature and the trap's sublimation pressure
        (sum of m_v (h_vapor - h_ice,trap)); transit heat and trap losses excluded.
    trap_temperature : ndarray or None
        K.
    stages : tuple of StageResult
        In order; those of the headline method.
    trajectory : Trajectory
        Of the integrated solution (always).
    comparison : MethodComparison
        Integrated and mean-vapor-enthalpy answers side by side.
    energy_balance : EnergyBalance
        Of the integrated solution.
    heat_gained : ndarray
        J.
    assumptions : tuple of str
    warnings : tuple of Advisory
    property_sources : tuple of PropertySource
    """

    method: str
    evaporated_mass: FloatArray
    evaporated_fraction_of_water: FloatArray
    ice_mass: FloatArray
    liquid_mass: FloatArray
    final_temperature: FloatArray
    final_pressure: FloatArray
    vapor_volume: FloatArray
    condenser_load: FloatArray | None
    trap_temperature: FloatArray | None
    stages: tuple[StageResult, ...]
    trajectory: Trajectory
    comparison: MethodComparison
    energy_balance: EnergyBalance
    heat_gained: FloatArray
    assumptions: tuple[str, ...]
    warnings: tuple[Advisory, ...]
    property_sources: tuple[PropertySource, ...]


@dataclass(frozen=True)
class _SoluteLoad:
    """The load's solute: ideal (Raoult) or a non-ideal model evaluated at ``model_temperature``
    (the initial freezing onset; the models' temperature dependence is weak)."""

    mass: float
    molar_mass: float
    van_t_hoff_factor: float
    model: SolutionModel | None = None
    model_temperature: float = TRIPLE_POINT_TEMPERATURE

    def log_activity(self, water_mass: FloatArray | float) -> FloatArray:
        if self.model is not None:
            fraction = self.mass / (self.mass + np.asarray(water_mass, dtype=np.float64))
            return self.model.log_water_activity(fraction, self.model_temperature)
        activity = water_activity(water_mass, self.mass, self.molar_mass, self.van_t_hoff_factor)
        return np.asarray(np.log(activity), dtype=np.float64)

    def liquid_water(self, log_activity: FloatArray) -> FloatArray:
        if self.model is not None:
            fraction = self.model.mass_fraction_at_log_activity(
                log_activity, self.model_temperature
            )
            return np.asarray(self.mass * (1.0 - fraction) / fraction, dtype=np.float64)
        return liquid_water_mass_at_activity(
            log_activity, self.mass, self.molar_mass, self.van_t_hoff_factor
        )


@dataclass(frozen=True)
class _Load:
    """A validated scalar case."""

    initial_temperature: float
    water_mass: float
    final_ice_temperature: float | None
    heat_capacity: HeatCapacity
    solute: _SoluteLoad | None
    solute_name: str | None
    freezing_onset: float
    nucleation_temperature: float | None
    trap_temperature: float | None
    heat_gain: float
    food: FoodLoad | None = None


@dataclass
class _Path:
    """Stages of one method for one case, plus the heat-gain rate used."""

    stages: list[StageNumbers]
    kappa: float

    @property
    def evaporated(self) -> float:
        return sum(stage.evaporated_mass for stage in self.stages)


# ---------------------------------------------------------------------------------------
# Validation


def _freezing_temperature(log_activity: float, index: int | None) -> float:
    """Temperature at which a solution of activity exp(log_activity) is in equilibrium with ice.

    :func:`service.core.balances.solution_freezing.ice_solution_equilibrium_temperature`,
    with its range error restated for the load's solute.
    """
    try:
        return float(ice_solution_equilibrium_temperature(log_activity))
    except OutOfRangeError as error:
        lowest = FLASH_FREEZE_LIMITS["liquid_temperature_min"]
        raise OutOfRangeError(
            "solute.mass_fraction",
            float(np.exp(log_activity)),
            None,
            None,
            "water activity",
            f"the solution's freezing point falls below {lowest} K, outside the "
            "supercooled-liquid range of the balance",
            index,
        ) from error


def _solute_load(
    solute: Solute, mass: float, molar: float, factor: float, fraction: float, index: int | None
) -> _SoluteLoad:
    """The load's solute; a non-ideal model is evaluated at the solution's freezing onset."""
    model = solute.activity_model
    if model is None:
        return _SoluteLoad(mass, molar, factor)
    try:
        log_activity = float(model_log_water_activity(model, fraction))
    except OutOfRangeError as error:
        raise replace(error, index=index) from error
    onset = _freezing_temperature(log_activity, index)
    return _SoluteLoad(mass, molar, factor, model, onset)


def _solute_sources(case: FlashFreezeCase) -> tuple[PropertySource, ...]:
    """The published model behind the solute's water activity, where it has one."""
    model = None if case.solute is None else case.solute.activity_model
    return () if model is None else (solution_source(model),)


def _lowest_final_temperature(solute: _SoluteLoad | None) -> float:
    """K: the unfrozen solution must stay within its model's range (w <= maximum)."""
    lowest = FLASH_FREEZE_LIMITS["liquid_temperature_min"]
    if solute is None or solute.model is None:
        return lowest
    top = solute.model.maximum_mass_fraction
    log_activity = solute.model.log_water_activity(top, solute.model_temperature)
    return max(lowest, float(ice_solution_equilibrium_temperature(log_activity)))


def _resolve(case: FlashFreezeCase, index: int | None) -> _Load:
    limits = FLASH_FREEZE_LIMITS
    initial = finite_scalar(case.initial_temperature, "initial_temperature")
    water = require_scalar_within(
        case.water_mass,
        "water_mass",
        0.0,
        None,
        "kg",
        "must be positive",
        index,
        exclusive_minimum=True,
    )
    companions = checked_heat_capacity(case.companions, index, specific_heat_max=1e5)
    capacity: HeatCapacity = companions
    solute: _SoluteLoad | None = None
    onset = TRIPLE_POINT_TEMPERATURE
    food: FoodLoad | None = None
    if case.composition is not None:
        if case.solute is not None:
            raise InvalidInputError("solute", "give a solute or a composition, not both")
        if case.product_mass is None:
            raise InvalidInputError(
                "product_mass", "required with a composition: the mass of the food, kg"
            )
        food = food_load(
            case.composition, case.product_mass, case.freezing_point, companions, index
        )
        water = food.freezable_water
        capacity = food.inert
        # the effective solute: n_s mol of one ideal particle (mass / molar mass = n_s)
        solute = _SoluteLoad(food.solute_moles * MOLAR_MASS, MOLAR_MASS, 1.0)
        onset = _freezing_temperature(float(solute.log_activity(water)), index)
    elif case.product_mass is not None or case.freezing_point is not None:
        raise InvalidInputError(
            "product_mass" if case.product_mass is not None else "freezing_point",
            "only with a composition (a food); for water and a solute give water_mass",
        )
    if case.solute is not None:
        fraction = finite_scalar(case.solute.mass_fraction, "solute.mass_fraction")
        molar = finite_scalar(case.solute.molar_mass, "solute.molar_mass")
        factor = finite_scalar(case.solute.van_t_hoff_factor, "solute.van_t_hoff_factor")
        specific = finite_scalar(case.solute.specific_heat, "solute.specific_heat")
        require_scalar_within(
            fraction,
            "solute.mass_fraction",
            0.0,
            limits["solute_mass_fraction_max"],
            "1",
            "ideal-solution model range",
            index,
        )
        require_scalar_within(
            molar, "solute.molar_mass", 1e-3, None, "kg/mol", "must be positive", index
        )
        require_scalar_within(
            factor, "solute.van_t_hoff_factor", 1.0, 10.0, "1", "particles per unit", index
        )
        require_scalar_within(
            specific, "solute.specific_heat", 0.0, 1e5, "J/(kg K)", "must be >= 0", index
        )
        if fraction > 0.0:
            solute_mass = fraction / (1.0 - fraction) * water
            solute = _solute_load(case.solute, solute_mass, molar, factor, fraction, index)
            capacity = companions + solute_mass * specific
            onset = _freezing_temperature(float(solute.log_activity(water)), index)
    require_scalar_within(
        initial,
        "initial_temperature",
        onset,
        limits["initial_temperature_max"],
        "K",
        "the load must start liquid, at or above its freezing onset and at most the normal "
        "boiling point",
        index,
    )
    final = optional_finite_scalar(case.final_ice_temperature, "final_ice_temperature")
    if solute is not None:
        if final is None:
            raise InvalidInputError(
                "final_ice_temperature",
                "required with a solute: a solution freezes progressively and needs an end "
                "temperature",
            )
        require_scalar_within(
            final,
            "final_ice_temperature",
            _lowest_final_temperature(solute),
            onset,
            "K",
            "a freezing solution must end below its freezing onset, within the "
            "supercooled-liquid range of IAPWS-95 used for its water and, for a named "
            "solute, where its unfrozen solution stays within the activity model's range "
            "(sodium chloride: the eutectic)",
            index,
        )
    elif final is not None:
        require_scalar_within(
            final,
            "final_ice_temperature",
            limits["final_ice_temperature_min"],
            TRIPLE_POINT_TEMPERATURE,
            "K",
            "ice cools by sublimation below the triple point",
            index,
        )
    nucleation = optional_finite_scalar(case.nucleation_temperature, "nucleation_temperature")
    if nucleation is not None:
        require_scalar_within(
            nucleation,
            "nucleation_temperature",
            limits["liquid_temperature_min"],
            onset,
            "K",
            "nucleation must happen below the freezing onset, within the supercooled-liquid range",
            index,
        )
        if solute is not None and final is not None and nucleation <= final:
            raise OutOfRangeError(
                "nucleation_temperature",
                nucleation,
                final,
                onset,
                "K",
                "nucleation must happen above the final temperature",
                index,
            )
    trap = checked_trap_temperature(case.trap_temperature, limits["trap_temperature_min"], index)
    gain = case.heat_gain.total() if case.heat_gain is not None else 0.0
    return _Load(
        initial_temperature=initial,
        water_mass=water,
        final_ice_temperature=final,
        heat_capacity=capacity,
        solute=solute,
        solute_name=None if case.solute is None else case.solute.name,
        freezing_onset=onset,
        nucleation_temperature=nucleation,
        trap_temperature=trap,
        heat_gain=gain,
        food=food,
    )


# ---------------------------------------------------------------------------------------
# Property evaluations (nodes of a stage plus its mean temperature in one call)


def _take_states(states: LiquidVaporStates, index: slice | int) -> LiquidVaporStates:
    selector = np.atleast_1d(np.arange(states.temperature.size)[index])
    return LiquidVaporStates(
        states.temperature[selector],
        states.pressure[selector],
        states.condensed.take(selector),
        states.vapor.take(selector),
    )


def _take_freezing(states: FreezingSolutionStates, index: slice | int) -> FreezingSolutionStates:
    selector = np.atleast_1d(np.arange(states.temperature.size)[index])
    return FreezingSolutionStates(
        states.temperature[selector],
        states.pressure[selector],
        states.liquid.take(selector),
        states.ice.take(selector),
        states.vapor.take(selector),
        states.log_water_activity[selector],
    )


def _with_mean(lower: float, upper: float) -> FloatArray:
    return np.append(interval_of(lower, upper).nodes, 0.5 * (lower + upper))


@lru_cache(maxsize=512)
def _pure_liquid_path(lower: float, upper: float) -> LiquidVaporStates:
    return liquid_vapor_states(_with_mean(lower, upper))


@lru_cache(maxsize=512)
def _ice_path(lower: float, upper: float) -> LiquidVaporStates:
    return ice_vapor_states(_with_mean(lower, upper))


@cache
def _triple_point_states() -> tuple[LiquidVaporStates, PhaseProperties]:
    liquid_vapor = liquid_vapor_states(np.array([TRIPLE_POINT_TEMPERATURE]))
    ice = ice_vapor_states(np.array([TRIPLE_POINT_TEMPERATURE])).condensed
    return liquid_vapor, ice


_NODES: Final = slice(0, DEGREE + 1)
_MEAN: Final = DEGREE + 1


# ---------------------------------------------------------------------------------------
# Stages


def _empty_stage(
    name: str,
    temperature: float,
    pressure: float,
    mass: float,
    ice: float,
    enthalpy: float,
    volume: float,
) -> StageNumbers:
    numbers = StageNumbers(
        name=name,
        start_temperature=temperature,
        end_temperature=temperature,
        start_pressure=pressure,
        end_pressure=pressure,
        start_mass=mass,
        end_mass=mass,
        start_ice=ice,
        end_ice=ice,
        start_enthalpy=enthalpy,
        end_enthalpy=enthalpy,
        start_volume=volume,
        end_volume=volume,
    )

    def sample(count: int) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
        return (
            np.full(count, temperature),
            np.full(count, pressure),
            np.full(count, mass),
            np.full(count, ice),
        )

    numbers.sampler = sample
    return numbers


def _liquid_stage(
    name: str,
    states: LiquidVaporStates,
    lower: float,
    upper: float,
    mass: float,
    load: _Load,
    kappa: float,
    hand: bool,
) -> StageNumbers:
    if upper - lower < ZERO_LENGTH:
        point = _take_states(states, -2)
        volume = mass / float(point.condensed.density[0])
        enthalpy = mass * float(point.condensed.specific_enthalpy[0]) + sensible_heat(
            load.heat_capacity, upper
        )
        return _empty_stage(name, upper, float(point.pressure[0]), mass, 0.0, enthalpy, volume)
    if hand:
        return hand_single_phase_stage(
            name,
            _take_states(states, DEGREE),
            _take_states(states, 0),
            _take_states(states, _MEAN),
            mass,
            load.heat_capacity,
            kappa,
        )
    return single_phase_stage(
        name,
        interval_of(lower, upper),
        _take_states(states, _NODES),
        mass,
        load.heat_capacity,
        kappa,
    )


def _ice_stage(load: _Load, mass: float, kappa: float, hand: bool) -> StageNumbers:
    assert load.final_ice_temperature is not None
    lower, upper = load.final_ice_temperature, TRIPLE_POINT_TEMPERATURE
    if upper - lower < ZERO_LENGTH:
        _, ice = _triple_point_states()
        enthalpy = mass * float(ice.specific_enthalpy[0])
        volume = mass / float(ice.density[0])
        return _empty_stage(
            "ice cooling", upper, float(ice.pressure[0]), mass, mass, enthalpy, volume
        )
    states = _ice_path(lower, upper)
    if hand:
        return hand_single_phase_stage(
            "ice cooling",
            _take_states(states, DEGREE),
            _take_states(states, 0),
            _take_states(states, _MEAN),
            mass,
            load.heat_capacity,
            kappa,
            start_ice=mass,
        )
    return single_phase_stage(
        "ice cooling",
        interval_of(lower, upper),
        _take_states(states, _NODES),
        mass,
        load.heat_capacity,
        kappa,
        start_ice=mass,
    )


def _pure_recalescence(
    supercooled_end: LiquidVaporStates, mass: float, load: _Load
) -> tuple[StageNumbers, float]:
    """Adiabatic recalescence of supercooled pure water back to the triple point.

    H_before + V_mean (p_t - p_n) = m ((1 - x) h_l,t + x h_ice,t) + C (T_t - T_t), solved
    for the ice fraction x (linear, since V_mean is linear in x).
    """
    liquid_vapor, ice = _triple_point_states()
    temperature = float(supercooled_end.temperature[0])
    pressure_before = float(supercooled_end.pressure[0])
    pressure_after = float(liquid_vapor.pressure[0])
    h_before = mass * float(supercooled_end.condensed.specific_enthalpy[0]) + sensible_heat(
        load.heat_capacity, temperature
    )
    v_before = mass / float(supercooled_end.condensed.density[0])
    h_l = float(liquid_vapor.condensed.specific_enthalpy[0])
    h_i = float(ice.specific_enthalpy[0])
    v_l = 1.0 / float(liquid_vapor.condensed.density[0])
    v_i = 1.0 / float(ice.density[0])
    jump = pressure_after - pressure_before
    fraction = (h_before + 0.5 * (v_before + mass * v_l) * jump - mass * h_l) / (
        mass * (h_i - h_l) - 0.5 * mass * (v_i - v_l) * jump
    )
    ice_mass = fraction * mass
    v_after = mass * ((1.0 - fraction) * v_l + fraction * v_i)
    numbers = StageNumbers(
        name="recalescence",
        start_temperature=temperature,
        end_temperature=TRIPLE_POINT_TEMPERATURE,
        start_pressure=pressure_before,
        end_pressure=pressure_after,
        start_mass=mass,
        end_mass=mass,
        start_ice=0.0,
        end_ice=ice_mass,
        start_enthalpy=h_before,
        end_enthalpy=mass * ((1.0 - fraction) * h_l + fraction * h_i),
        volume_pressure_integral=0.5 * (v_before + v_after) * jump,
        start_volume=v_before,
        end_volume=v_after,
    )
    return numbers, ice_mass


def _pure_path(load: _Load, kappa: float, hand: bool) -> list[StageNumbers]:
    stages: list[StageNumbers] = []
    mass = load.water_mass
    states = _pure_liquid_path(TRIPLE_POINT_TEMPERATURE, load.initial_temperature)
    cooling = _liquid_stage(
        "cooling",
        states,
        TRIPLE_POINT_TEMPERATURE,
        load.initial_temperature,
        mass,
        load,
        kappa,
        hand,
    )
    stages.append(cooling)
    mass = cooling.end_mass
    ice_mass = 0.0
    if load.nucleation_temperature is not None:
        supercooled_states = _pure_liquid_path(
            load.nucleation_temperature, TRIPLE_POINT_TEMPERATURE
        )
        supercooled = _liquid_stage(
            "supercooled cooling",
            supercooled_states,
            load.nucleation_temperature,
            TRIPLE_POINT_TEMPERATURE,
            mass,
            load,
            kappa,
            hand,
        )
        stages.append(supercooled)
        mass = supercooled.end_mass
        recalescence, ice_mass = _pure_recalescence(_take_states(supercooled_states, 0), mass, load)
        stages.append(recalescence)
    liquid_vapor, ice = _triple_point_states()
    stages.append(
        freezing_at_fixed_temperature(
            liquid_vapor.condensed,
            ice,
            liquid_vapor.vapor,
            float(liquid_vapor.pressure[0]),
            mass - ice_mass,
            ice_mass,
            kappa,
        )
    )
    mass = stages[-1].end_mass
    if load.final_ice_temperature is not None:
        stages.append(_ice_stage(load, mass, kappa, hand))
    return stages


def _solution_cooling(load: _Load, kappa: float, hand: bool) -> StageNumbers:
    """Cooling of a solution to its (evaporation-shifted) freezing onset or nucleation.

    The vapor pressure depends on the water activity, which rises in concentration as
    water evaporates, and the freezing onset depends on the concentration reached:
    both are iterated to convergence (Picard on the activity profile, fixed point on
    the onset temperature).
    """
    solute = load.solute
    assert solute is not None
    fixed_end = load.nucleation_temperature
    lower = fixed_end if fixed_end is not None else load.freezing_onset
    upper = load.initial_temperature
    initial_log_activity = float(solute.log_activity(load.water_mass))
    log_activity: FloatArray = np.full(DEGREE + 2, initial_log_activity)
    stage: StageNumbers | None = None
    for _ in range(_MAX_COUPLING_ITERATIONS):
        temperatures = _with_mean(lower, upper)
        if hand:
            end_log_activity = log_activity[0]
            log_activity = np.full(DEGREE + 2, initial_log_activity)
            log_activity[0] = end_log_activity
        states = liquid_vapor_states(temperatures, log_activity)
        stage = _liquid_stage("cooling", states, lower, upper, load.water_mass, load, kappa, hand)
        if stage.node_mass is not None:
            node_mass = np.append(stage.node_mass, 0.5 * (stage.node_mass[0] + stage.node_mass[-1]))
        else:
            node_mass = np.full(DEGREE + 2, load.water_mass)
            node_mass[0] = stage.end_mass
        new_log_activity = solute.log_activity(node_mass)
        new_lower = (
            lower
            if fixed_end is not None
            else _freezing_temperature(float(solute.log_activity(stage.end_mass)), None)
        )
        converged = (
            abs(new_lower - lower) < _FREEZING_TOLERANCE
            and float(np.max(np.abs(new_log_activity - log_activity))) < 1e-12
        )
        log_activity, lower = new_log_activity, new_lower
        if converged:
            return stage
    raise NotConvergedError(
        "freezing onset of the evaporating solution", _MAX_COUPLING_ITERATIONS, 0.0
    )


def _solution_recalescence(cooling: StageNumbers, load: _Load) -> tuple[StageNumbers, float]:
    """Adiabatic recalescence of a supercooled solution to the freezing line at T_r.

    H_before + V_mean (p(T_r) - p_n) = m_lw(T_r) h_l + (m - m_lw(T_r)) h_ice + C (T_r - T_t).
    """
    solute = load.solute
    assert solute is not None and load.nucleation_temperature is not None
    mass = cooling.end_mass
    h_before = cooling.end_enthalpy
    v_before = cooling.end_volume
    p_before = cooling.end_pressure

    def after(temperature: float) -> tuple[float, float, float, float, float]:
        states = freezing_solution_states(np.array([temperature]))
        liquid = float(solute.liquid_water(states.log_water_activity)[0])
        ice = mass - liquid
        enthalpy = (
            liquid * float(states.liquid.specific_enthalpy[0])
            + ice * float(states.ice.specific_enthalpy[0])
            + sensible_heat(load.heat_capacity, temperature)
        )
        volume = liquid / float(states.liquid.density[0]) + ice / float(states.ice.density[0])
        return enthalpy, volume, float(states.pressure[0]), ice, liquid

    def mismatch(temperature: float) -> float:
        enthalpy, volume, pressure, _, _ = after(temperature)
        return enthalpy - h_before - 0.5 * (v_before + volume) * (pressure - p_before)

    onset = _freezing_temperature(float(solute.log_activity(mass)), None)
    temperature = float(
        brentq(mismatch, load.nucleation_temperature, onset, xtol=1e-12, rtol=1e-15)
    )
    enthalpy, volume, pressure, ice, _ = after(temperature)
    numbers = StageNumbers(
        name="recalescence",
        start_temperature=load.nucleation_temperature,
        end_temperature=temperature,
        start_pressure=p_before,
        end_pressure=pressure,
        start_mass=mass,
        end_mass=mass,
        start_ice=0.0,
        end_ice=ice,
        start_enthalpy=h_before,
        end_enthalpy=enthalpy,
        volume_pressure_integral=0.5 * (v_before + volume) * (pressure - p_before),
        start_volume=v_before,
        end_volume=volume,
    )
    return numbers, temperature


def _solution_path(load: _Load, kappa: float, hand: bool) -> list[StageNumbers]:
    solute = load.solute
    assert solute is not None and load.final_ice_temperature is not None
    cooling = _solution_cooling(load, kappa, hand)
    stages = [cooling]
    mass = cooling.end_mass
    if load.nucleation_temperature is not None:
        recalescence, start = _solution_recalescence(cooling, load)
        stages.append(recalescence)
    else:
        start = cooling.end_temperature
    lower = load.final_ice_temperature
    if hand:
        states = freezing_solution_states(_with_mean(lower, start))
        liquid_water = solute.liquid_water(states.log_water_activity)
        stages.append(
            hand_freezing_solution_stage(
                _take_freezing(states, DEGREE),
                _take_freezing(states, 0),
                _take_freezing(states, _MEAN),
                min(float(liquid_water[DEGREE]), mass),
                float(liquid_water[0]),
                mass,
                load.heat_capacity,
                kappa,
            )
        )
    else:
        stages.append(_piecewise_solution_freezing(load, lower, start, mass, kappa))
    return stages


def _piecewise_solution_freezing(
    load: _Load, lower: float, start: float, mass: float, kappa: float
) -> StageNumbers:
    """Progressive freezing on pieces whose width grows with the distance from 273.16 K.

    The unfrozen water behaves like 1 / (273.16 K - T), a pole just above the onset;
    pieces with end distances in the ratio _PIECE_RATIO keep every piece's polynomial
    interpolation spectrally accurate.
    """
    solute = load.solute
    assert solute is not None
    near = TRIPLE_POINT_TEMPERATURE - start
    far = TRIPLE_POINT_TEMPERATURE - lower
    count = max(1, int(np.ceil(np.log(far / near) / np.log(_PIECE_RATIO))))
    edges = TRIPLE_POINT_TEMPERATURE - near * (far / near) ** np.linspace(0.0, 1.0, count + 1)
    edges[0], edges[-1] = start, lower
    intervals = [interval_of(edges[k + 1], edges[k]) for k in range(count)]
    states = freezing_solution_states(np.concatenate([i.nodes for i in intervals]))
    pieces: list[StageNumbers] = []
    for k, interval in enumerate(intervals):
        piece_states = _take_freezing(states, slice(k * (DEGREE + 1), (k + 1) * (DEGREE + 1)))
        liquid_water = solute.liquid_water(piece_states.log_water_activity)
        # at the onset all the water is liquid: guard the round-off of the onset solve
        liquid_water = np.minimum(liquid_water, mass)
        piece = freezing_solution_stage(
            interval, piece_states, liquid_water, mass, load.heat_capacity, kappa
        )
        pieces.append(piece)
        mass = piece.end_mass
    return merge_pieces(pieces)


def _solve_path(load: _Load, hand: bool) -> _Path:
    build: Callable[[float], list[StageNumbers]]
    if load.solute is None:

        def build(kappa: float) -> list[StageNumbers]:
            return _pure_path(load, kappa, hand)
    else:

        def build(kappa: float) -> list[StageNumbers]:
            return _solution_path(load, kappa, hand)

    kappa = solve_heat_per_evaporated_mass(
        load.heat_gain,
        lambda k: sum(stage.evaporated_mass for stage in build(k)),
        _KAPPA_UPPER_BOUND,
        load.water_mass,
    )
    return _Path(build(kappa), kappa)


# ---------------------------------------------------------------------------------------
# Assembly


@dataclass
class _CaseOutcome:
    integrated: _Path
    hand: _Path
    trajectory: tuple[FloatArray, FloatArray, FloatArray, FloatArray, FloatArray]
    residual: float
    boundary_work: float
    initial_energy: float
    final_energy: float
    condenser_load: float | None
    trap_pressure: float | None
    final_log_activity: float | None


def _trajectory(
    stages: list[StageNumbers], points: int, water_mass: float
) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray, FloatArray]:
    sampled = [i for i, stage in enumerate(stages) if stage.sampler is not None]
    share, extra = divmod(points, len(sampled))
    parts: list[tuple[FloatArray, ...]] = []
    for position, index in enumerate(sampled):
        stage = stages[index]
        assert stage.sampler is not None
        first = position == 0
        count = share + (extra if first else 1)
        temperature, pressure, water, ice = stage.sampler(count)
        if not first:
            temperature, pressure, water, ice = temperature[1:], pressure[1:], water[1:], ice[1:]
        if index > 0 and stages[index - 1].sampler is None:
            previous = stages[index - 1]
            temperature = np.insert(temperature, 0, previous.end_temperature)
            pressure = np.insert(pressure, 0, previous.end_pressure)
            water = np.insert(water, 0, previous.end_mass)
            ice = np.insert(ice, 0, previous.end_ice)
        parts.append((temperature, pressure, water, ice, np.full(temperature.size, float(index))))
    temperature, pressure, water, ice, stage_index = (
        np.concatenate(p) for p in zip(*parts, strict=True)
    )
    return (
        temperature,
        pressure,
        _without_round_off((water_mass - water) / water_mass),
        ice / water_mass,
        stage_index,
    )


_ROUND_OFF: Final = 1e-12
"""Fractions of the water smaller than this are round-off (the collocation reproduces the
stage-end masses to a few ulp) and are reported as 0, never as -2e-16."""


def _without_round_off(fraction: FloatArray) -> FloatArray:
    """``fraction`` with round-off around zero (|x| < 1e-12) set to exactly 0."""
    return np.where(np.abs(fraction) < _ROUND_OFF, 0.0, fraction)


def _solve_case(case: FlashFreezeCase, index: int | None) -> tuple[_Load, _CaseOutcome]:
    load = _resolve(case, index)
    integrated = _solve_path(load, hand=False)
    hand = _solve_path(load, hand=True)
    stages = integrated.stages
    first, last = stages[0], stages[-1]
    vapor = sum(stage.vapor_enthalpy for stage in stages)
    gained = sum(stage.heat_gained for stage in stages)
    volume_pressure = sum(stage.volume_pressure_integral for stage in stages)
    residual = first.start_enthalpy + gained + volume_pressure - last.end_enthalpy - vapor
    boundary_work = (
        last.end_pressure * last.end_volume
        - first.start_pressure * first.start_volume
        - volume_pressure
    )
    initial_energy = first.start_enthalpy - first.start_pressure * first.start_volume
    final_energy = last.end_enthalpy - last.end_pressure * last.end_volume
    condenser_load: float | None = None
    trap_pressure: float | None = None
    if load.trap_temperature is not None:
        trap = ice_vapor_states(np.array([load.trap_temperature]))
        trap_pressure = float(trap.pressure[0])
        headline = hand if case.method == "mean-vapor-enthalpy" else integrated
        condenser_load = sum(
            s.vapor_enthalpy for s in headline.stages
        ) - headline.evaporated * float(trap.condensed.specific_enthalpy[0])
    final_log_activity = None
    if load.solute is not None:
        final_log_activity = float(load.solute.log_activity(last.end_mass - last.end_ice))
    outcome = _CaseOutcome(
        integrated=integrated,
        hand=hand,
        trajectory=_trajectory(stages, case.trajectory_points, load.water_mass),
        residual=residual,
        boundary_work=boundary_work,
        initial_energy=initial_energy,
        final_energy=final_energy,
        condenser_load=condenser_load,
        trap_pressure=trap_pressure,
        final_log_activity=final_log_activity,
    )
    return load, outcome


def _assumptions(case: FlashFreezeCase) -> tuple[str, ...]:
    items = [
        "Vapor is removed as it forms: none accumulates in the chamber or returns to the load.",
        "Phases are in equilibrium at every instant: the load sits on its equilibrium line "
        "(vapor pressure of the liquid, triple point, sublimation curve, or ice-solution "
        "equilibrium) and the vapor leaves with its equilibrium enthalpy at the load temperature.",
        "Uniform temperature throughout the load and the companion masses.",
        HEAT_GAIN_ASSUMPTION
        if case.heat_gain is not None
        else "Adiabatic: no heat exchange with the surroundings.",
        "First law for the condensed contents as an open system with a moving boundary: "
        "dH = h_vapor dm + V dp (+ heat gained), condensed phases at the equilibrium vapor "
        "pressure; the work p dV against the vapor is counted exactly (reported as "
        "boundary_work, of order 1 J per kg).",
        "Pure water freezes at the triple point, 273.16 K and 611.657 Pa.",
        "Properties: IAPWS-95 for liquid and vapor (metastable extension for supercooled "
        "liquid), IAPWS R10-06 for ice Ih, IAPWS R14-08 for the sublimation pressure; one "
        "reference state (u = s = 0 for saturated liquid at the triple point).",
        f"Integrated method: each stage solved by Chebyshev-Lobatto collocation on {DEGREE + 1} "
        "nodes (spectral accuracy); the energy residual is reported.",
        "Mean-vapor-enthalpy (hand) method: one vapor enthalpy per stage at the stage's mean "
        "temperature, condensed-phase enthalpies at the stage ends, V dp neglected.",
        "evaporated_fraction_of_water = evaporated mass / initial water mass.",
        "Vapor volume: the volume the removed vapor occupies at the stage's equilibrium states, "
        "integral of dm / rho_vapor(T, p).",
        "The trajectory is that of the integrated method.",
    ]
    if case.companions:
        items.append(
            "Companion masses have constant specific heats and stay at the load temperature."
        )
    if case.solute is not None:
        model = case.solute.activity_model
        reference = SOLUTE_MODEL_REFERENCE if model is None else model.source
        items.append(
            f"Solute: {reference}. No heat of mixing; the solute stays in the "
            "unfrozen solution (no eutectic crystallization, none in the ice) and adds only "
            "m_s c_s dT. Vapor pressure over the solution from equal chemical potentials."
        )
        if case.solute.name == "ethanol":
            items.append(ETHANOL_CAUTION)
    if case.composition is not None:
        items.append(FOOD_LOAD_ASSUMPTION)
        if case.freezing_point is None:
            items.append(estimate_food_freezing_point(case.composition).statement)
    if case.nucleation_temperature is not None:
        items.append(
            "Supercooling: the liquid stays liquid down to the nucleation temperature; "
            "recalescence is then instantaneous and adiabatic with no evaporation, forming ice "
            "until the load is back on its freezing line; V dp across the jump is counted with "
            "the mean volume."
        )
    if case.trap_temperature is not None:
        items.append(
            "Condenser load: enthalpy removed to take all the vapor, as it leaves the load, to "
            "ice at the trap temperature and its sublimation pressure; heat picked up by the "
            "vapor in transit and trap losses are not included."
        )
    return tuple(items)


def _stack(values: list[float], shape: tuple[int, ...]) -> FloatArray:
    return np.asarray(values, dtype=np.float64).reshape(shape)


def _stage_results(paths: list[_Path], shape: tuple[int, ...]) -> tuple[StageResult, ...]:
    results = []
    for position, stage in enumerate(paths[0].stages):
        column = [path.stages[position] for path in paths]

        def get(attribute: str, column: list[StageNumbers] = column) -> FloatArray:
            return _stack([float(getattr(s, attribute)) for s in column], shape)

        results.append(
            StageResult(
                name=stage.name,
                start_temperature=get("start_temperature"),
                end_temperature=get("end_temperature"),
                start_pressure=get("start_pressure"),
                end_pressure=get("end_pressure"),
                evaporated_mass=get("evaporated_mass"),
                vapor_enthalpy=get("vapor_enthalpy"),
                heat_removed=get("heat_removed"),
                vapor_volume=get("vapor_volume"),
                ice_formed=get("ice_formed"),
                heat_gained=get("heat_gained"),
            )
        )
    return tuple(results)


def _warnings(
    loads: list[_Load], outcomes: list[_CaseOutcome], batch: bool
) -> tuple[Advisory, ...]:
    advisories: list[Advisory] = []

    def add(mask: list[bool], code: str, message: str) -> None:
        flags = np.asarray(mask)
        if flags.any():
            indices = (
                tuple(int(i) for i in np.flatnonzero(flags)) if batch and not flags.all() else None
            )
            advisories.append(Advisory(code, message, indices))

    add(
        [
            o.final_log_activity is not None
            and np.exp(o.final_log_activity) < _LOW_ACTIVITY_WARNING
            and load.solute is not None
            and load.solute.model is None
            and load.food is None
            for load, o in zip(loads, outcomes, strict=True)
        ],
        "solution-concentrated",
        f"The unfrozen solution ends with a water activity below {_LOW_ACTIVITY_WARNING}; the "
        "ideal-solution model is outside its reliable range.",
    )
    add(
        [load.food is not None and load.food.basis != "given" for load in loads],
        "estimated-freezing-point",
        "The food's initial freezing point is estimated from its composition (method and "
        "agreement with handbook tables in the assumptions); a measured freezing_point is "
        "better where the onset and the ice near it matter.",
    )
    sucrose = FREEZE_CONCENTRATION_DATA["sucrose"]
    add(
        [
            load.solute is not None
            and load.solute_name == "sucrose"
            and load.final_ice_temperature is not None
            and load.final_ice_temperature > sucrose.ice_melting_onset
            for load in loads
        ],
        "above-freeze-concentration-limit",
        "The freezing ends above the sucrose freeze-concentrate's ice-melting onset "
        f"T_m' = {sucrose.ice_melting_onset - 273.15:.0f} degC (glass transition T_g' = "
        f"{sucrose.glass_transition_of_freeze_concentrate - 273.15:.0f} degC; {GLASS_SOURCE}): "
        "the unfrozen phase is a viscous liquid, not a glass, and a freeze-dried product "
        "dried from here can collapse. Follow the product's validated cycle.",
    )
    add(
        [load.nucleation_temperature is not None or load.solute is not None for load in loads],
        "metastable",
        "Liquid water below 273.16 K (supercooled, or in a solution) uses the metastable "
        "extension of IAPWS-95.",
    )
    add(
        [
            o.trap_pressure is not None and o.trap_pressure >= o.integrated.stages[-1].end_pressure
            for o in outcomes
        ],
        "trap-too-warm",
        "The trap's sublimation pressure is not below the final chamber pressure: it cannot "
        "capture the vapor at the end of the process.",
    )
    add(
        [
            abs(o.residual) > 1e-9 * max(1.0, sum(s.vapor_enthalpy for s in o.integrated.stages))
            for o in outcomes
        ],
        "energy-residual",
        "The integrated energy balance closes less tightly than 1e-9 relative.",
    )
    return tuple(advisories)


def flash_freeze(case: FlashFreezeCase) -> FlashFreezeResult:
    """Flash-to-freeze balance of water (or a watery load) evaporating under vacuum.

    Parameters
    ----------
    case : FlashFreezeCase
        Initial state, options; any numeric field may be an array (a sweep).

    Returns
    -------
    FlashFreezeResult
        Headline answers of ``case.method``, both methods side by side, stages,
        trajectory, energy balance, assumptions and warnings; arrays of the sweep shape.

    Raises
    ------
    InvalidInputError
        Non-finite or malformed input, missing required fields.
    OutOfRangeError
        An input outside :data:`FLASH_FREEZE_LIMITS` or the load's freezing onset
        (``index`` names the sweep element).
    UnsupportedStateError
        A heat gain or companion load that would evaporate all the water.

    Notes
    -----
    Stage equation (condensed contents, open system, moving boundary):
    d(sum m_i h_i) + C dT = (h_vapor - kappa) dm + V dp. Pure water at the triple
    point: m_v = m_l (h_l - h_ice) / (h_v - h_ice). Cooling with one condensed phase:
    dm/dT = m (dh_c/dT - v_c dp/dT)/(h_v - h_c) + C/(h_v - h_c). See
    :mod:`service.core.balances.stages`.

    References
    ----------
    IAPWS R6-95(2018); IAPWS R10-06(2009); IAPWS R14-08(2011).

    Examples
    --------
    >>> result = flash_freeze(FlashFreezeCase(initial_temperature=293.15))
    >>> round(float(result.evaporated_fraction_of_water), 3)
    0.147
    """
    method = case.method
    if method not in ("integrated", "mean-vapor-enthalpy"):
        raise InvalidInputError("method", "must be 'integrated' or 'mean-vapor-enthalpy'", method)
    points = case.trajectory_points
    if not isinstance(points, int) or not (
        FLASH_FREEZE_LIMITS["trajectory_points_min"]
        <= points
        <= FLASH_FREEZE_LIMITS["trajectory_points_max"]
    ):
        raise InvalidInputError("trajectory_points", "must be an integer from 50 to 2000", points)
    shape, cases = expand_case(case, frozenset({"trajectory_points"}))
    batch = len(shape) > 0
    solved = []
    for i, c in enumerate(cases):
        check_deadline()  # a caller's time limit stops a long sweep between its cases
        solved.append(_solve_case(c, i if batch else None))
    loads = [load for load, _ in solved]
    outcomes = [outcome for _, outcome in solved]
    use_hand = method == "mean-vapor-enthalpy"
    headline = [o.hand if use_hand else o.integrated for o in outcomes]

    def per_case(function: Callable[[_Load, _CaseOutcome, _Path], float]) -> FloatArray:
        return _stack(
            [function(ld, o, p) for ld, o, p in zip(loads, outcomes, headline, strict=True)], shape
        )

    evaporated = per_case(lambda ld, o, p: p.evaporated)
    water = per_case(lambda ld, o, p: ld.water_mass)
    integrated_evaporated = _stack([o.integrated.evaporated for o in outcomes], shape)
    hand_evaporated = _stack([o.hand.evaporated for o in outcomes], shape)
    vapor_enthalpy = _stack(
        [sum(s.vapor_enthalpy for s in o.integrated.stages) for o in outcomes], shape
    )
    residual = _stack([o.residual for o in outcomes], shape)
    trajectories = [o.trajectory for o in outcomes]
    trajectory_shape = (*shape, trajectories[0][0].size)

    def trajectory_field(position: int) -> FloatArray:
        return np.asarray(np.stack([t[position] for t in trajectories]), dtype=np.float64).reshape(
            trajectory_shape
        )

    has_trap = case.trap_temperature is not None
    return FlashFreezeResult(
        method=method,
        evaporated_mass=evaporated,
        evaporated_fraction_of_water=evaporated / water,
        ice_mass=per_case(lambda ld, o, p: p.stages[-1].end_ice),
        liquid_mass=per_case(lambda ld, o, p: p.stages[-1].end_mass - p.stages[-1].end_ice),
        final_temperature=per_case(lambda ld, o, p: p.stages[-1].end_temperature),
        final_pressure=per_case(lambda ld, o, p: p.stages[-1].end_pressure),
        vapor_volume=per_case(lambda ld, o, p: sum(s.vapor_volume for s in p.stages)),
        condenser_load=(
            _stack([float(o.condenser_load or 0.0) for o in outcomes], shape) if has_trap else None
        ),
        trap_temperature=(
            _stack([float(ld.trap_temperature or 0.0) for ld in loads], shape) if has_trap else None
        ),
        stages=_stage_results(headline, shape),
        trajectory=Trajectory(
            temperature=trajectory_field(0),
            pressure=trajectory_field(1),
            evaporated_fraction_of_water=trajectory_field(2),
            ice_fraction=trajectory_field(3),
            liquid_fraction=_without_round_off(1.0 - trajectory_field(2) - trajectory_field(3)),
            stage=trajectory_field(4).astype(np.int64),
        ),
        comparison=MethodComparison(
            integrated_evaporated_mass=integrated_evaporated,
            mean_vapor_enthalpy_evaporated_mass=hand_evaporated,
            integrated_ice_mass=_stack([o.integrated.stages[-1].end_ice for o in outcomes], shape),
            mean_vapor_enthalpy_ice_mass=_stack(
                [o.hand.stages[-1].end_ice for o in outcomes], shape
            ),
            evaporated_mass_difference=hand_evaporated - integrated_evaporated,
            relative_difference=(hand_evaporated - integrated_evaporated) / integrated_evaporated,
        ),
        energy_balance=EnergyBalance(
            initial_energy=_stack([o.initial_energy for o in outcomes], shape),
            final_energy=_stack([o.final_energy for o in outcomes], shape),
            vapor_enthalpy=vapor_enthalpy,
            heat_gained=_stack(
                [sum(s.heat_gained for s in o.integrated.stages) for o in outcomes], shape
            ),
            boundary_work=_stack([o.boundary_work for o in outcomes], shape),
            residual=residual,
            relative_residual=residual / vapor_enthalpy,
        ),
        heat_gained=per_case(lambda ld, o, p: sum(s.heat_gained for s in p.stages)),
        assumptions=_assumptions(case),
        warnings=_warnings(loads, outcomes, batch),
        property_sources=(
            IAPWS_95,
            ICE_IH,
            MELTING_AND_SUBLIMATION,
            *_solute_sources(case),
            *((FOOD_SOURCE,) if case.composition is not None else ()),
        ),
    )
