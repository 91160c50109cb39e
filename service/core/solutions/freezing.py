"""Freezing of an aqueous solution of a named solute: onset, ice fraction, brine, enthalpy.

Ice Ih is in equilibrium with the water of a solution where their chemical potentials are
equal, g_liq(T, p) + R T ln a_w = g_ice(T, p), so at each temperature below the melting point
the unfrozen solution has the water activity

    ln a_w,ice(T, p) = (g_ice(T, p) - g_liq(T, p)) / (R T)

(g_liq from IAPWS-95, metastable supercooled liquid; g_ice from R10-06). With the activity
model of :mod:`service.core.solutions.aqueous`, the freezing onset of a solution of mass
fraction w_0 is the root T of ln a_w(w_0, T) = ln a_w,ice(T, p), and at a colder T the
unfrozen solution has the mass fraction w_b with ln a_w(w_b, T) = ln a_w,ice(T, p). The
solute stays in the unfrozen phase, so per kg of the whole mixture the ice is
1 - w_0 / w_b.

Enthalpy per kg of mixture, with water and ice on the IAPWS-95 reference state and the
dissolved solute's sensible heat from 273.16 K (heat of dilution neglected):

    h = w_0 c_s (T - 273.16 K) + (1 - w_0 - w_ice) h_liq(T, p) + w_ice h_ice(T, p).

Lowest temperature: the freezing point of the solution at its model's highest mass fraction
(the unfrozen phase must stay in the model's range), and never below 235 K, where the
core's IAPWS-95 supercooled-liquid branch ends.

References
----------
IAPWS R6-95(2018); IAPWS R10-06(2009). Equality of chemical potentials: Atkins, P. and de
Paula, J., *Physical Chemistry*, 9th ed. (2010), Sec. 5.5 (from memory).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike, NDArray

from service.core.errors import NotConvergedError, OutOfRangeError
from service.core.properties.constants import SPECIFIC_GAS_CONSTANT, TRIPLE_POINT_TEMPERATURE
from service.core.properties.helmholtz import fluid_properties_at
from service.core.properties.ice import ice_properties
from service.core.properties.phase import FloatArray
from service.core.solutions.aqueous import SolutionModel
from service.core.validation import finite_array, require_within

__all__ = [
    "LIQUID_FLOOR_TEMPERATURE",
    "SolutionFreezing",
    "ice_log_water_activity",
    "lowest_temperature",
    "solute_freezing_point",
    "solution_freezing",
    "unfrozen_mass_fraction",
]

LIQUID_FLOOR_TEMPERATURE: Final = 235.0
"""K. Lowest temperature of the supercooled-water reference (the core's IAPWS-95 liquid
branch, near the homogeneous-nucleation limit of water)."""

_NORMAL_PRESSURE: Final = 101325.0
_ITERATIONS: Final = 40
_TOLERANCE: Final = 1e-9
_ABOVE_TRIPLE_POINT: Final = 1e-4
"""K: how far above 273.16 K a freezing point may want to go and still be taken as 273.16 K
(below the triple-point pressure; at 0 Pa pure water melts 4.5e-5 K above it)."""


def capped_freezing_step(
    temperature: FloatArray, step: FloatArray, tolerance: float
) -> tuple[FloatArray, bool]:
    """One Newton step on a freezing line, capped at 273.16 K; (new T, all converged).

    Below the triple-point pressure (611.657 Pa) the melting point of (nearly) pure water
    lies up to 4.5e-5 K above 273.16 K (dT/dp about -7.4e-8 K/Pa), where R10-06 ice is not
    evaluated: the cap is the answer there, at most 4.5e-5 K low. An element has converged
    when its step is below ``tolerance`` K or it wants to go less than 1e-4 K past the cap.
    """
    wanted = temperature - step
    capped = np.minimum(wanted, TRIPLE_POINT_TEMPERATURE)
    settled = (np.abs(step) < tolerance) | (
        (wanted > TRIPLE_POINT_TEMPERATURE)
        & (wanted - TRIPLE_POINT_TEMPERATURE < _ABOVE_TRIPLE_POINT)
    )
    return np.asarray(capped, dtype=np.float64), bool(np.all(settled))


def ice_log_water_activity(temperature: FloatArray, pressure: FloatArray) -> FloatArray:
    """ln a_w of water in equilibrium with ice Ih at (T, p), dimensionless (T <= 273.16 K)."""
    liquid = fluid_properties_at(temperature, pressure, phase="liquid")
    ice = ice_properties(temperature, pressure)
    gibbs_liquid = liquid.specific_enthalpy - temperature * liquid.specific_entropy
    gibbs_ice = ice.specific_enthalpy - temperature * ice.specific_entropy
    return np.asarray(
        (gibbs_ice - gibbs_liquid) / (SPECIFIC_GAS_CONSTANT * temperature), dtype=np.float64
    )


def _melting_temperature(pressure: FloatArray) -> FloatArray:
    """Melting point of ice at p (Newton on g_liq = g_ice), K."""
    return _onset(None, np.zeros_like(pressure), pressure)


def _onset(
    model: SolutionModel | None, mass_fraction: FloatArray, pressure: FloatArray
) -> FloatArray:
    """Newton on ln a_w(w, T) = ln a_w,ice(T, p) for T; 1-D validated inputs."""
    temperature = np.full(mass_fraction.shape, TRIPLE_POINT_TEMPERATURE - 1e-3)
    step = np.full_like(temperature, np.inf)
    delta = 1e-4
    for _ in range(_ITERATIONS):
        if model is None:
            solution = np.zeros_like(temperature)
            solution_slope = np.zeros_like(temperature)
        else:
            solution = model.log_water_activity(mass_fraction, temperature)
            solution_slope = (
                model.log_water_activity(mass_fraction, temperature + delta) - solution
            ) / delta
        liquid = fluid_properties_at(temperature, pressure, phase="liquid")
        ice = ice_properties(temperature, pressure)
        gibbs_difference = (
            ice.specific_enthalpy
            - temperature * ice.specific_entropy
            - liquid.specific_enthalpy
            + temperature * liquid.specific_entropy
        )
        target = gibbs_difference / (SPECIFIC_GAS_CONSTANT * temperature)
        # Gibbs-Helmholtz: d(dg / (R T))/dT = -(h_ice - h_liq) / (R T**2)
        target_slope = (liquid.specific_enthalpy - ice.specific_enthalpy) / (
            SPECIFIC_GAS_CONSTANT * temperature**2
        )
        step = (solution - target) / (solution_slope - target_slope)
        capped, settled = capped_freezing_step(temperature, step, _TOLERANCE)
        temperature = np.maximum(capped, LIQUID_FLOOR_TEMPERATURE)
        if settled:
            return np.asarray(temperature, dtype=np.float64)
    raise NotConvergedError(
        "freezing point of the solution (Newton)",
        _ITERATIONS,
        float(np.max(np.abs(step))),
        int(np.count_nonzero(np.abs(step) >= _TOLERANCE)),
    )


def _validated_fraction(model: SolutionModel, mass_fraction: ArrayLike) -> FloatArray:
    fraction = finite_array(mass_fraction, "solute.mass_fraction")
    require_within(
        fraction,
        "solute.mass_fraction",
        0.0,
        model.maximum_mass_fraction,
        "1",
        f"{model.name}: the {model.model} model is taken to w = {model.maximum_mass_fraction}"
        + (" (the ice-hydrohalite eutectic)" if model.name == "sodium chloride" else ""),
    )
    return fraction


def _validated_pressure(pressure: ArrayLike) -> FloatArray:
    value = finite_array(pressure, "pressure")
    require_within(value, "pressure", 0.0, 1.0e8, "Pa", "0 < p <= 100 MPa", exclusive_minimum=True)
    return value


def solute_freezing_point(
    model: SolutionModel, mass_fraction: ArrayLike, pressure: ArrayLike = _NORMAL_PRESSURE
) -> FloatArray:
    """Initial freezing point of a solution of a named solute, K.

    Parameters
    ----------
    model : SolutionModel
        From :func:`service.core.solutions.aqueous.solution_model`.
    mass_fraction : array_like
        Solute mass / solution mass, 0 to the model's ``maximum_mass_fraction``.
    pressure : array_like
        Pa, 0 < p <= 100 MPa (default 101325 Pa); broadcast with the mass fraction.

    Returns
    -------
    ndarray
        K; the melting point of ice at ``pressure`` for w = 0.

    Raises
    ------
    InvalidInputError
        NaN or infinite input.
    OutOfRangeError
        ``solute.mass_fraction`` beyond the model's range, or a pressure out of range.

    Notes
    -----
    Newton's method on ln a_w(w, T) = ln a_w,ice(T, p), slope from the Gibbs-Helmholtz
    relation (h_liq - h_ice) / (R T**2) and a finite difference of the model.

    References
    ----------
    IAPWS R6-95(2018); IAPWS R10-06(2009); the model's own source (``model.source``).

    Examples
    --------
    >>> from service.core.solutions.aqueous import solution_model
    >>> round(float(solute_freezing_point(solution_model("sodium chloride"), 0.035)) - 273.15, 2)
    -2.11
    """
    fraction = _validated_fraction(model, mass_fraction)
    fraction, pressure_array = np.broadcast_arrays(fraction, _validated_pressure(pressure))
    shape = fraction.shape
    return _onset(model, fraction.ravel(), pressure_array.ravel()).reshape(shape)


def _unfrozen(model: SolutionModel, temperature: FloatArray, target: FloatArray) -> FloatArray:
    """The unfrozen solution's mass fraction at ln a_w = target."""
    return model.mass_fraction_at_log_activity(target, temperature)


def lowest_temperature(model: SolutionModel, pressure: ArrayLike = _NORMAL_PRESSURE) -> FloatArray:
    """Lowest temperature at which the unfrozen phase stays in the model's range, K.

    The freezing point of the solution at the model's highest mass fraction (for sodium
    chloride, the eutectic), not below :data:`LIQUID_FLOOR_TEMPERATURE`.
    """
    pressure_array = np.atleast_1d(_validated_pressure(pressure)).ravel()
    top = np.full(pressure_array.shape, model.maximum_mass_fraction)
    return _onset(model, top, pressure_array)


def unfrozen_mass_fraction(
    model: SolutionModel, temperature: ArrayLike, pressure: ArrayLike = _NORMAL_PRESSURE
) -> FloatArray:
    """Solute mass fraction of the solution in equilibrium with ice at T, dimensionless.

    Parameters
    ----------
    model : SolutionModel
        The solute's activity model.
    temperature : array_like
        K, from :func:`lowest_temperature` up to the melting point of ice at ``pressure``.
    pressure : array_like
        Pa (default 101325 Pa).

    Returns
    -------
    ndarray
        w_b, 0 at the melting point.

    Raises
    ------
    OutOfRangeError
        ``temperature`` outside the range above (first offending element).
    """
    t = finite_array(temperature, "temperature")
    t, p = np.broadcast_arrays(t, _validated_pressure(pressure))
    shape = t.shape
    t, p = np.array(t, dtype=np.float64).ravel(), np.array(p, dtype=np.float64).ravel()
    _require_temperature(model, t, p, frozen=np.ones(t.shape, dtype=bool))
    return _unfrozen(model, t, ice_log_water_activity(t, p)).reshape(shape)


def _require_temperature(
    model: SolutionModel, temperature: FloatArray, pressure: FloatArray, frozen: NDArray[np.bool_]
) -> None:
    require_within(
        temperature,
        "temperature",
        LIQUID_FLOOR_TEMPERATURE,
        373.15,
        "K",
        "235 K (the supercooled-water reference's end) to 373.15 K",
    )
    lowest = _onset(model, np.full(temperature.shape, model.maximum_mass_fraction), pressure)
    melting = _melting_temperature(pressure)
    bad = frozen & ((temperature < lowest) | (temperature > melting))
    if np.any(bad):
        index = int(np.flatnonzero(bad)[0])
        raise OutOfRangeError(
            variable="temperature",
            value=float(temperature[index]),
            minimum=float(lowest[index]),
            maximum=float(melting[index]),
            unit="K",
            reason=(
                f"{model.name}: below this temperature the unfrozen solution would exceed "
                f"w = {model.maximum_mass_fraction}, the end of the {model.model} model's range"
                + (
                    " (the eutectic: the rest crystallizes)"
                    if model.name == "sodium chloride"
                    else ""
                )
            ),
            index=index if temperature.size > 1 else None,
        )


@dataclass(frozen=True)
class SolutionFreezing:
    """Ice and unfrozen solution of a solution of a named solute (SI arrays).

    Attributes
    ----------
    temperature, pressure : ndarray
        K, Pa.
    mass_fraction : ndarray
        Solute per kg of the whole mixture (as given).
    freezing_temperature : ndarray
        K, freezing onset.
    ice_mass_fraction : ndarray
        kg of ice per kg of mixture.
    unfrozen_water_fraction : ndarray
        kg of liquid water per kg of mixture.
    unfrozen_mass_fraction : ndarray
        Solute mass fraction of the unfrozen solution.
    specific_enthalpy : ndarray
        J/kg of mixture (see the module docstring).
    log_water_activity : ndarray
        ln a_w of the unfrozen solution.
    """

    temperature: FloatArray
    pressure: FloatArray
    mass_fraction: FloatArray
    freezing_temperature: FloatArray
    ice_mass_fraction: FloatArray
    unfrozen_water_fraction: FloatArray
    unfrozen_mass_fraction: FloatArray
    specific_enthalpy: FloatArray
    log_water_activity: FloatArray


def solution_freezing(
    model: SolutionModel,
    mass_fraction: ArrayLike,
    temperature: ArrayLike,
    pressure: ArrayLike = _NORMAL_PRESSURE,
) -> SolutionFreezing:
    """Ice fraction, unfrozen solution and enthalpy of a solution at given temperatures.

    Parameters
    ----------
    model : SolutionModel
        The solute's activity model.
    mass_fraction : array_like
        Solute mass fraction of the whole, 0 to the model's maximum.
    temperature : array_like
        K, 235 K to 373.15 K; where ice forms, not below :func:`lowest_temperature`.
    pressure : array_like
        Pa, 0 < p <= 100 MPa (default 101325 Pa). The inputs broadcast.

    Returns
    -------
    SolutionFreezing

    Raises
    ------
    InvalidInputError
        NaN or infinite input.
    OutOfRangeError
        An input out of range (first offending element named).

    References
    ----------
    IAPWS R6-95(2018); IAPWS R10-06(2009); ``model.source``.

    Examples
    --------
    >>> from service.core.solutions.aqueous import solution_model
    >>> result = solution_freezing(solution_model("sodium chloride"), 0.035, 270.65)
    >>> round(float(result.ice_mass_fraction), 3)
    0.15
    """
    fraction = _validated_fraction(model, mass_fraction)
    t = finite_array(temperature, "temperature")
    fraction, t, p = (
        np.array(a, dtype=np.float64).ravel()
        for a in np.broadcast_arrays(fraction, t, _validated_pressure(pressure))
    )
    shape = np.broadcast_shapes(np.shape(mass_fraction), np.shape(temperature), np.shape(pressure))
    onset = _onset(model, fraction, p)
    frozen = t < onset
    _require_temperature(model, t, p, frozen)
    brine = fraction.copy()
    if np.any(frozen):
        brine[frozen] = _unfrozen(model, t[frozen], ice_log_water_activity(t[frozen], p[frozen]))
    ice_fraction = np.where(frozen, 1.0 - fraction / np.where(brine > 0, brine, 1.0), 0.0)
    ice_fraction = np.where(frozen & (fraction == 0.0), 1.0, ice_fraction)
    brine = np.where(fraction == 0.0, 0.0, brine)
    water = 1.0 - fraction - ice_fraction
    liquid = fluid_properties_at(t, p, phase="liquid")
    ice_t = np.minimum(t, TRIPLE_POINT_TEMPERATURE)
    ice = ice_properties(ice_t, p)
    enthalpy = (
        fraction * model.specific_heat * (t - TRIPLE_POINT_TEMPERATURE)
        + water * liquid.specific_enthalpy
        + ice_fraction * ice.specific_enthalpy
    )
    log_activity = model.log_water_activity(brine, t)
    return SolutionFreezing(
        temperature=t.reshape(shape),
        pressure=p.reshape(shape),
        mass_fraction=fraction.reshape(shape),
        freezing_temperature=onset.reshape(shape),
        ice_mass_fraction=np.asarray(ice_fraction).reshape(shape),
        unfrozen_water_fraction=np.asarray(water).reshape(shape),
        unfrozen_mass_fraction=brine.reshape(shape),
        specific_enthalpy=np.asarray(enthalpy, dtype=np.float64).reshape(shape),
        log_water_activity=np.asarray(log_activity).reshape(shape),
    )
