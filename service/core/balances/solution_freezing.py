"""Initial freezing point of an aqueous solution from its water activity.

A solution whose water has activity a_w is in equilibrium with ice Ih where the
chemical potential of its water equals that of ice,

    g_liq(T, p) + R T ln a_w = g_ice(T, p),

taken at the sublimation pressure p_sub(T), where ice, solution and vapor coexist
(:func:`service.core.balances.equilibrium_paths.freezing_solution_states`). The
freezing point of a solution of given activity is the root T of
ln a_w = (g_ice - g_liq) / (R T). For an ideal (Raoult) solution of a solute
(:class:`service.core.balances.solutes.Solute`), a_w = n_w / (n_w + i n_s).

The flash-freeze balance uses these functions for the freezing onset of its
solution (and again as the solution concentrates); the evaporative-cooling balance
uses them to estimate a product's initial freezing point from its dissolved solids.
This is the approach of Heldman (1974): the freezing-point depression of the water
in a food from the molality of its soluble solids.

References
----------
IAPWS R6-95(2018) (metastable supercooled liquid); IAPWS R10-06(2009) (ice Ih);
IAPWS R14-08(2011) (sublimation pressure). Heldman, D. R. (1974), Trans. ASAE
17(1), 63-66 (from memory). Equal chemical potentials and Raoult's law: Atkins, P.
and de Paula, J., *Physical Chemistry*, 9th ed., Oxford (2010), Secs. 5.3-5.5
(from memory).
"""

from __future__ import annotations

from functools import cache
from typing import Final

import numpy as np
from numpy.typing import ArrayLike

from service.core.balances.equilibrium_paths import freezing_solution_states
from service.core.balances.solutes import Solute
from service.core.errors import NotConvergedError, OutOfRangeError
from service.core.properties.constants import (
    MOLAR_MASS,
    SPECIFIC_GAS_CONSTANT,
    TRIPLE_POINT_TEMPERATURE,
)
from service.core.properties.phase import FloatArray
from service.core.solutions.aqueous import SolutionModel
from service.core.validation import finite_array, require_within

__all__ = [
    "LOWEST_FREEZING_TEMPERATURE",
    "ice_solution_equilibrium_temperature",
    "lowest_log_water_activity",
    "model_log_water_activity",
    "solution_freezing_point",
    "solution_log_water_activity",
]

LOWEST_FREEZING_TEMPERATURE: Final = 235.0
"""K (-38.15 degC). Lowest freezing point accepted: the solution's water is metastable
IAPWS-95 liquid, which the core evaluates down to 235 K, near the homogeneous-nucleation
limit of supercooled water (below it pure water cannot stay liquid, so a supercooled-water
reference has no data; IAPWS-95 is an extrapolation below 251.2 K). A named solute's
non-ideal model ends earlier, where its unfrozen solution leaves the model's range
(sodium chloride: the eutectic near -21 degC)."""

_FUSION_GUESS: Final = 333.4e3
"""J/kg, only to start Newton's method (the linearized freezing-point depression)."""

_TOLERANCE: Final = 1e-9
"""K, the Newton step at which the iteration stops."""

_ITERATIONS: Final = 30

_MODEL_ITERATIONS: Final = 4
"""Fixed-point steps on the onset temperature of a temperature-dependent activity model."""


@cache
def lowest_log_water_activity() -> float:
    """ln a_w of the solution in equilibrium with ice at :data:`LOWEST_FREEZING_TEMPERATURE`."""
    states = freezing_solution_states(np.array([LOWEST_FREEZING_TEMPERATURE]))
    return float(states.log_water_activity[0])


def ice_solution_equilibrium_temperature(log_water_activity: ArrayLike) -> FloatArray:
    """Temperature at which a solution of given water activity is in equilibrium with ice.

    Parameters
    ----------
    log_water_activity : array_like
        ln a_w of the solution, dimensionless, from ln a_w(235 K) (about -0.41,
        see :func:`lowest_log_water_activity`) to 0 (pure water).

    Returns
    -------
    ndarray
        Freezing point, K, from 235 K to 273.16 K, of the shape of the input
        (exactly 273.16 K where ln a_w = 0).

    Raises
    ------
    InvalidInputError
        For NaN or infinite input.
    OutOfRangeError
        ``variable="water_activity"`` (value a_w), for an activity above 1 or one
        whose freezing point would fall below 235 K; the first offending element.
    NotConvergedError
        If Newton's method does not settle (not expected in the valid range).

    Notes
    -----
    Newton's method on ln a_w = (g_ice(T, p_sub) - g_liq(T, p_sub)) / (R T) with the
    Gibbs-Helmholtz slope d ln a_w / dT = (h_liq - h_ice) / (R T**2), started from
    the linearized depression T = T_t (1 + ln a_w R T_t / L_f); the iterates are kept
    at or above 235 K (the root is, by the range check).

    References
    ----------
    IAPWS R6-95(2018); IAPWS R10-06(2009); IAPWS R14-08(2011).

    Examples
    --------
    >>> round(float(ice_solution_equilibrium_temperature(np.log(0.99))), 3)
    272.123
    """
    log_activity = finite_array(log_water_activity, "log_water_activity")
    activity = np.exp(log_activity)
    lowest = lowest_log_water_activity()
    require_within(
        activity,
        "water_activity",
        float(np.exp(lowest)),
        1.0,
        "1",
        "a solution's water activity is at most 1, and its freezing point must lie at or "
        f"above {LOWEST_FREEZING_TEMPERATURE} K (the supercooled-liquid range of IAPWS-95 used "
        "for its water)",
    )
    flat = log_activity.ravel()
    result = np.full(flat.shape, TRIPLE_POINT_TEMPERATURE)
    solve = flat < 0.0
    target = flat[solve]
    if target.size == 0:
        return result.reshape(log_activity.shape)
    temperature = TRIPLE_POINT_TEMPERATURE * (
        1.0 + target * SPECIFIC_GAS_CONSTANT * TRIPLE_POINT_TEMPERATURE / _FUSION_GUESS
    )
    step = np.full_like(target, np.inf)
    for _ in range(_ITERATIONS):
        temperature = np.clip(temperature, LOWEST_FREEZING_TEMPERATURE, TRIPLE_POINT_TEMPERATURE)
        states = freezing_solution_states(temperature)
        slope = (states.liquid.specific_enthalpy - states.ice.specific_enthalpy) / (
            SPECIFIC_GAS_CONSTANT * temperature**2
        )
        step = (states.log_water_activity - target) / slope
        temperature = temperature - step
        if np.all(np.abs(step) < _TOLERANCE):
            result[solve] = temperature
            return result.reshape(log_activity.shape)
    raise NotConvergedError(
        "freezing temperature of the solution (Newton)",
        _ITERATIONS,
        float(np.max(np.abs(step))),
        int(np.count_nonzero(np.abs(step) >= _TOLERANCE)),
    )


def model_log_water_activity(model: SolutionModel, mass_fraction: ArrayLike) -> FloatArray:
    """ln a_w of a solution of a non-ideal model at its own freezing onset, dimensionless.

    Parameters
    ----------
    model : SolutionModel
        A published activity model (:mod:`service.core.solutions.aqueous`).
    mass_fraction : array_like
        w, 0 to ``model.maximum_mass_fraction``.

    Returns
    -------
    ndarray
        ln a_w(w, T_f) with T_f the freezing onset at the sublimation pressure, found by a
        fixed point on T_f = T_eq(ln a_w(w, T_f)) (the models' temperature dependence is
        weak: each step shrinks the error by a factor of order 1e-3).

    Raises
    ------
    OutOfRangeError
        ``solute.mass_fraction`` beyond the model's range.
    """
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
    temperature = np.full(fraction.shape, TRIPLE_POINT_TEMPERATURE)
    for _ in range(_MODEL_ITERATIONS):
        temperature = ice_solution_equilibrium_temperature(
            model.log_water_activity(fraction, temperature)
        )
    return model.log_water_activity(fraction, temperature)


def solution_log_water_activity(solute: Solute) -> FloatArray:
    """ln a_w of a solution of ``solute`` in water, dimensionless.

    With ``solute.activity_model`` set, the non-ideal model at the solution's freezing
    onset (:func:`model_log_water_activity`); otherwise the ideal (Raoult) solution below.

    Parameters
    ----------
    solute : Solute
        ``mass_fraction`` w = m_s / (m_w + m_s), 0 <= w < 1; ``molar_mass`` M_s,
        kg/mol, > 0; ``van_t_hoff_factor`` i >= 1. Fields may be arrays (broadcast).

    Returns
    -------
    ndarray
        ln a_w, <= 0, of the broadcast shape.

    Raises
    ------
    InvalidInputError
        For NaN or infinite fields.
    OutOfRangeError
        For a field outside its range (first offending element).

    Notes
    -----
    a_w = n_w / (n_w + i n_s) with n_w = (1 - w) / M_w, n_s = w / M_s, so
    ln a_w = -ln(1 + i w M_w / ((1 - w) M_s)).

    References
    ----------
    Raoult's law: Atkins and de Paula, *Physical Chemistry*, 9th ed. (2010), Sec. 5.3
    (from memory). M_w from IAPWS R6-95(2018).
    """
    if solute.activity_model is not None:
        return model_log_water_activity(solute.activity_model, solute.mass_fraction)
    fraction = finite_array(solute.mass_fraction, "solute.mass_fraction")
    molar_mass = finite_array(solute.molar_mass, "solute.molar_mass")
    factor = finite_array(solute.van_t_hoff_factor, "solute.van_t_hoff_factor")
    outside = ((fraction < 0.0) | (fraction >= 1.0)).ravel()
    if np.any(outside):
        index = int(np.flatnonzero(outside)[0])
        raise OutOfRangeError(
            "solute.mass_fraction",
            float(fraction.ravel()[index]),
            0.0,
            1.0,
            "1",
            "a mass fraction of the solution, which needs water: 0 <= w < 1",
            index if fraction.ndim > 0 else None,
        )
    require_within(
        molar_mass,
        "solute.molar_mass",
        0.0,
        np.inf,
        "kg/mol",
        "must be positive",
        exclusive_minimum=True,
    )
    require_within(factor, "solute.van_t_hoff_factor", 1.0, np.inf, "1", "particles per unit")
    particles_per_water_mole = factor * fraction * MOLAR_MASS / ((1.0 - fraction) * molar_mass)
    return np.asarray(-np.log1p(particles_per_water_mole), dtype=np.float64)


def solution_freezing_point(solute: Solute) -> FloatArray:
    """Initial freezing point of an ideal aqueous solution of ``solute``, K.

    Parameters
    ----------
    solute : Solute
        See :func:`solution_log_water_activity`; ``mass_fraction`` is per kg of
        solution (water + solute). Fields may be arrays.

    Returns
    -------
    ndarray
        Temperature, K, 235 K to 273.16 K, at which the solution starts to freeze.

    Raises
    ------
    InvalidInputError
        For NaN or infinite fields.
    OutOfRangeError
        For a field out of range, or ``variable="water_activity"`` for a solution so
        concentrated that it would freeze below 235 K.

    Notes
    -----
    Ideal (Raoult) activity a_w = n_w / (n_w + i n_s), then the root T of
    ln a_w = (g_ice - g_liq) / (R T) at the sublimation pressure
    (:func:`ice_solution_equilibrium_temperature`). For dilute solutions this
    reduces to the cryoscopic law dT = -R T_t**2 M_w i m / L_f (m the molality).

    References
    ----------
    Heldman (1974), Trans. ASAE 17(1), 63-66 (from memory); IAPWS R6-95(2018);
    IAPWS R10-06(2009); IAPWS R14-08(2011).

    Examples
    --------
    >>> from service.core.balances.solutes import named_solute
    >>> round(float(solution_freezing_point(named_solute("sucrose", 0.10))) - 273.15, 2)
    -0.59
    """
    return ice_solution_equilibrium_temperature(solution_log_water_activity(solute))
