"""Equilibrium states along the paths a load follows while it flashes.

Three paths, each evaluated at an array of temperatures in one vectorized call:

- liquid in equilibrium with its vapor (pure water on the saturation curve, or
  supercooled water, or the water of a solution of given activity);
- ice in equilibrium with its vapor (the sublimation curve);
- a freezing solution: ice, unfrozen solution and vapor together, where the
  water activity is fixed by temperature alone.

All properties share the IAPWS reference state, so differences of enthalpies
between phases are latent heats.

Equations
---------
Vapor over a liquid of water activity a_w: the chemical potential of water is
the same in both phases, g_vap(T, p) = g_liq(T, p) + R T ln a_w, solved for p by
Newton's method in ln p (derivative p (v_vap - v_liq)). With a_w = 1 and
T >= 273.16 K this is the saturation curve, taken from
:func:`service.core.properties.saturation.saturation_by_temperature` directly.

Ice with solution: g_liq(T, p) + R T ln a_w = g_ice(T, p), so
ln a_w = (g_ice - g_liq) / (R T) at the sublimation pressure p_sub(T), where the
vapor is in equilibrium with the ice (and so with the solution).

References
----------
IAPWS R6-95(2018) (liquid and vapor, including metastable supercooled liquid);
IAPWS R10-06(2009) (ice Ih); IAPWS R14-08(2011) (sublimation pressure).
Equality of chemical potentials and the ideal-solution chemical potential
mu = mu* + R T ln a_w: e.g. Atkins, P. and de Paula, J., *Physical Chemistry*,
9th ed., Oxford (2010), Sec. 5.3 (from memory).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np

from service.core.errors import NotConvergedError
from service.core.properties.constants import (
    SPECIFIC_GAS_CONSTANT,
    TRIPLE_POINT_PRESSURE,
    TRIPLE_POINT_TEMPERATURE,
)
from service.core.properties.helmholtz import fluid_properties_at
from service.core.properties.phase import FloatArray, PhaseProperties
from service.core.properties.saturation import saturation_by_temperature
from service.core.properties.sublimation import sublimation_by_temperature

__all__ = [
    "FreezingSolutionStates",
    "LiquidVaporStates",
    "freezing_solution_states",
    "ice_vapor_states",
    "liquid_vapor_states",
]

_LATENT_HEAT_GUESS: Final = 2.5e6
"""J/kg, only to start Newton's method from the triple point (Clausius-Clapeyron)."""

_NEWTON_TOLERANCE: Final = 1e-12
"""Relative change of pressure at which the vapor-pressure iteration stops."""

_NEWTON_ITERATIONS: Final = 12


@dataclass(frozen=True)
class LiquidVaporStates:
    """Condensed phase and vapor in equilibrium at an array of temperatures.

    Attributes
    ----------
    temperature : ndarray
        K.
    pressure : ndarray
        Equilibrium vapor pressure, Pa.
    condensed : PhaseProperties
        The phase the vapor leaves (liquid water, or ice on the sublimation curve).
    vapor : PhaseProperties
        Water vapor at (temperature, pressure).
    """

    temperature: FloatArray
    pressure: FloatArray
    condensed: PhaseProperties
    vapor: PhaseProperties


@dataclass(frozen=True)
class FreezingSolutionStates:
    """Ice, unfrozen solution and vapor in equilibrium (freezing of a solution).

    Attributes
    ----------
    temperature : ndarray
        K.
    pressure : ndarray
        Sublimation pressure of ice, Pa (the vapor is in equilibrium with ice).
    liquid : PhaseProperties
        Water in the solution (ideal solution: pure liquid water properties),
        at (temperature, pressure); metastable below 273.16 K.
    ice : PhaseProperties
        Ice Ih at (temperature, pressure).
    vapor : PhaseProperties
        Water vapor at (temperature, pressure).
    log_water_activity : ndarray
        ln a_w of the solution in equilibrium with ice, dimensionless.
    """

    temperature: FloatArray
    pressure: FloatArray
    liquid: PhaseProperties
    ice: PhaseProperties
    vapor: PhaseProperties
    log_water_activity: FloatArray


def _gibbs_energy(phase: PhaseProperties) -> FloatArray:
    return np.asarray(
        phase.specific_enthalpy - phase.temperature * phase.specific_entropy, dtype=np.float64
    )


def _vapor_pressure_by_newton(
    temperature: FloatArray, log_water_activity: FloatArray
) -> LiquidVaporStates:
    """Solve g_vap(T, p) = g_liq(T, p) + R T ln a_w for p, Newton in ln p."""
    inverse = 1.0 / temperature - 1.0 / TRIPLE_POINT_TEMPERATURE
    log_pressure = (
        np.log(TRIPLE_POINT_PRESSURE)
        - _LATENT_HEAT_GUESS / SPECIFIC_GAS_CONSTANT * inverse
        + log_water_activity
    )
    offset = SPECIFIC_GAS_CONSTANT * temperature * log_water_activity
    step = np.full_like(temperature, np.inf)
    for _ in range(_NEWTON_ITERATIONS):
        pressure = np.exp(log_pressure)
        liquid = fluid_properties_at(temperature, pressure, phase="liquid")
        vapor = fluid_properties_at(temperature, pressure, phase="vapor")
        mismatch = _gibbs_energy(vapor) - _gibbs_energy(liquid) - offset
        slope = pressure * (1.0 / vapor.density - 1.0 / liquid.density)
        step = mismatch / slope
        log_pressure = log_pressure - step
        if np.all(np.abs(step) < _NEWTON_TOLERANCE):
            break
    else:
        raise NotConvergedError(
            solver="vapor pressure over liquid water (Newton in ln p)",
            iterations=_NEWTON_ITERATIONS,
            residual=float(np.max(np.abs(step))),
            count=int(np.count_nonzero(np.abs(step) >= _NEWTON_TOLERANCE)),
        )
    pressure = np.exp(log_pressure)
    liquid = fluid_properties_at(temperature, pressure, phase="liquid")
    vapor = fluid_properties_at(temperature, pressure, phase="vapor")
    return LiquidVaporStates(temperature, pressure, liquid, vapor)


def liquid_vapor_states(
    temperature: FloatArray, log_water_activity: FloatArray | float = 0.0
) -> LiquidVaporStates:
    """Liquid water (pure or in a solution) and its vapor in equilibrium.

    Parameters
    ----------
    temperature : ndarray
        K, 1-D. Below 273.16 K the liquid is supercooled (metastable IAPWS-95).
    log_water_activity : ndarray or float
        ln a_w of the liquid, <= 0; 0 for pure water.

    Returns
    -------
    LiquidVaporStates
        Pressure, liquid and vapor at each temperature.
    """
    temperature = np.asarray(temperature, dtype=np.float64)
    log_activity = np.broadcast_to(
        np.asarray(log_water_activity, dtype=np.float64), temperature.shape
    )
    if np.all(log_activity == 0.0) and np.all(temperature >= TRIPLE_POINT_TEMPERATURE):
        states = saturation_by_temperature(temperature)
        return LiquidVaporStates(temperature, states.pressure, states.liquid, states.vapor)
    return _vapor_pressure_by_newton(temperature, np.array(log_activity))


def ice_vapor_states(temperature: FloatArray) -> LiquidVaporStates:
    """Ice Ih and vapor on the sublimation curve, IAPWS R14-08 / R10-06 / R6-95."""
    states = sublimation_by_temperature(np.asarray(temperature, dtype=np.float64))
    return LiquidVaporStates(states.temperature, states.pressure, states.ice, states.vapor)


def freezing_solution_states(temperature: FloatArray) -> FreezingSolutionStates:
    """Ice, solution water and vapor in equilibrium at temperatures below 273.16 K."""
    sublimation = sublimation_by_temperature(np.asarray(temperature, dtype=np.float64))
    liquid = fluid_properties_at(sublimation.temperature, sublimation.pressure, phase="liquid")
    log_activity = (_gibbs_energy(sublimation.ice) - _gibbs_energy(liquid)) / (
        SPECIFIC_GAS_CONSTANT * sublimation.temperature
    )
    return FreezingSolutionStates(
        temperature=sublimation.temperature,
        pressure=sublimation.pressure,
        liquid=liquid,
        ice=sublimation.ice,
        vapor=sublimation.vapor,
        log_water_activity=np.asarray(log_activity, dtype=np.float64),
    )
