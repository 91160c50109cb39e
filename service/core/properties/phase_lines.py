"""Melting and sublimation curves of ice Ih, IAPWS R14-08(2011).

Both correlations were built from the phase equilibrium of IAPWS-95 fluid water
and IAPWS R10-06(2009) ice Ih, so they are consistent with those formulations
(and pass exactly through the triple point 273.16 K, 611.657 Pa).

The inverse functions solve the correlations by vectorized Newton iteration;
they raise :class:`~service.core.errors.NotConvergedError` should any element
fail to converge (not observed over the valid ranges).
"""

from __future__ import annotations

from typing import Final

import numpy as np
from numpy.typing import ArrayLike

from service.core.errors import NotConvergedError
from service.core.properties.ice_coefficients import (
    MELTING_COEFFICIENTS,
    MELTING_EXPONENTS,
    MELTING_MINIMUM_TEMPERATURE,
    PHASE_LINE_REDUCING_PRESSURE,
    PHASE_LINE_REDUCING_TEMPERATURE,
    SUBLIMATION_COEFFICIENTS,
    SUBLIMATION_EXPONENTS,
    SUBLIMATION_MINIMUM_TEMPERATURE,
)
from service.core.properties.phase import FloatArray
from service.core.validation import finite_array, require_within

__all__ = [
    "MELTING_PRESSURE_RANGE",
    "MELTING_TEMPERATURE_RANGE",
    "SUBLIMATION_PRESSURE_RANGE",
    "SUBLIMATION_TEMPERATURE_RANGE",
    "melting_pressure",
    "melting_temperature",
    "sublimation_pressure",
    "sublimation_temperature",
]

_TT: Final = PHASE_LINE_REDUCING_TEMPERATURE
_PT: Final = PHASE_LINE_REDUCING_PRESSURE

_MAXIMUM_ITERATIONS: Final = 50
_RELATIVE_STEP_TOLERANCE: Final = 1.0e-14


def _melting_pressure_unchecked(temperature: FloatArray) -> FloatArray:
    theta = temperature / _TT
    reduced = np.ones_like(theta)
    for coefficient, exponent in zip(MELTING_COEFFICIENTS, MELTING_EXPONENTS, strict=True):
        reduced += coefficient * (1.0 - theta**exponent)
    return np.asarray(_PT * reduced, dtype=np.float64)


def _melting_pressure_slope(temperature: FloatArray) -> FloatArray:
    """dp/dT of eq. (1), Pa/K (negative: ice Ih melts at lower T under pressure)."""
    theta = temperature / _TT
    slope = np.zeros_like(theta)
    for coefficient, exponent in zip(MELTING_COEFFICIENTS, MELTING_EXPONENTS, strict=True):
        slope -= coefficient * exponent * theta ** (exponent - 1.0)
    return np.asarray(_PT / _TT * slope, dtype=np.float64)


def _log_sublimation_ratio(inverse_theta: FloatArray) -> FloatArray:
    """ln(p / p_t) of eq. (6) as a function of 1/theta = T_t / T."""
    value = np.zeros_like(inverse_theta)
    for coefficient, exponent in zip(SUBLIMATION_COEFFICIENTS, SUBLIMATION_EXPONENTS, strict=True):
        value += coefficient * inverse_theta ** (1.0 - exponent)
    return np.asarray(value, dtype=np.float64)


def _log_sublimation_ratio_slope(inverse_theta: FloatArray) -> FloatArray:
    """d ln(p / p_t) / d(1/theta) of eq. (6)."""
    slope = np.zeros_like(inverse_theta)
    for coefficient, exponent in zip(SUBLIMATION_COEFFICIENTS, SUBLIMATION_EXPONENTS, strict=True):
        slope += coefficient * (1.0 - exponent) * inverse_theta ** (-exponent)
    return np.asarray(slope, dtype=np.float64)


MELTING_TEMPERATURE_RANGE: Final = (MELTING_MINIMUM_TEMPERATURE, _TT)
"""(minimum, maximum) temperature of the ice Ih melting curve, K (R14-08 eq. (1))."""

MELTING_PRESSURE_RANGE: Final = (
    _PT,
    float(_melting_pressure_unchecked(np.asarray(MELTING_MINIMUM_TEMPERATURE))),
)
"""(minimum, maximum) pressure of the ice Ih melting curve, Pa: the image of
:data:`MELTING_TEMPERATURE_RANGE` under eq. (1), from the triple point to
208.566566 MPa. Eq. (1) at 251.165 K exceeds the published ice Ih - ice III -
liquid triple-point pressure (208.566 MPa) by about 566 Pa (2.7e-6 relative);
the image is used so that the inverse covers exactly the forward range."""

SUBLIMATION_TEMPERATURE_RANGE: Final = (SUBLIMATION_MINIMUM_TEMPERATURE, _TT)
"""(minimum, maximum) temperature of the sublimation curve, K (R14-08 eq. (6))."""

SUBLIMATION_PRESSURE_RANGE: Final = (
    float(_PT * np.exp(_log_sublimation_ratio(np.asarray(_TT / SUBLIMATION_MINIMUM_TEMPERATURE)))),
    _PT,
)
"""(minimum, maximum) pressure of the sublimation curve, Pa: eq. (6) at 50 K
(about 1.93e-40 Pa) to the triple-point pressure."""

_MELTING_REASON: Final = (
    "IAPWS R14-08(2011) eq. (1), melting curve of ice Ih from 251.165 K to 273.16 K"
)
_SUBLIMATION_REASON: Final = (
    "IAPWS R14-08(2011) eq. (6), sublimation curve of ice Ih from 50 K to 273.16 K"
)


def melting_pressure(temperature: ArrayLike) -> FloatArray:
    """Pressure on the melting curve of ice Ih, IAPWS R14-08(2011).

    Parameters
    ----------
    temperature : array_like
        Temperature, K, 251.165 K <= T <= 273.16 K.

    Returns
    -------
    ndarray
        Melting pressure, Pa, same shape as ``temperature``.

    Raises
    ------
    InvalidInputError
        For NaN or infinite input.
    OutOfRangeError
        For a temperature outside the range (first offending element named).

    Notes
    -----
    Eq. (1): p / p_t = 1 + sum_{i=1..3} a_i (1 - theta**b_i), theta = T / T_t,
    T_t = 273.16 K, p_t = 611.657 Pa.

    References
    ----------
    IAPWS R14-08(2011), Revised Release on the Pressure along the Melting and
    Sublimation Curves of Ordinary Water Substance, eq. (1) and Table 1.

    Examples
    --------
    >>> round(float(melting_pressure(260.0)) / 1e6, 3)
    138.268
    """
    temperature_array = finite_array(temperature, "temperature")
    require_within(
        temperature_array, "temperature", *MELTING_TEMPERATURE_RANGE, "K", _MELTING_REASON
    )
    return _melting_pressure_unchecked(temperature_array)


def melting_temperature(pressure: ArrayLike) -> FloatArray:
    """Temperature on the melting curve of ice Ih at a given pressure (inverse of eq. (1)).

    Parameters
    ----------
    pressure : array_like
        Pressure, Pa, 611.657 Pa <= p <= 208.566566 MPa (eq. (1) at 251.165 K);
        see :data:`MELTING_PRESSURE_RANGE`.

    Returns
    -------
    ndarray
        Melting temperature, K, same shape as ``pressure``; decreases with
        pressure from 273.16 K to about 251.165 K.

    Raises
    ------
    InvalidInputError
        For NaN or infinite input.
    OutOfRangeError
        For a pressure outside the range (first offending element named).
    NotConvergedError
        If the Newton iteration fails for any element (not expected).

    Notes
    -----
    Solves p_melt(T) = p with Newton's method started at T_t. Eq. (1) is
    decreasing and concave in T, so the iterates decrease monotonically onto
    the root without overshoot; iteration stops once every relative step is
    below 1e-14. The result is the root of eq. (1) to round-off; it is limited
    to [251.165 K, 273.16 K] to remove round-off only.

    References
    ----------
    IAPWS R14-08(2011), eq. (1) and Table 1.

    Examples
    --------
    >>> round(float(melting_temperature(101325.0)), 4)
    273.1525
    """
    pressure_array = finite_array(pressure, "pressure")
    require_within(pressure_array, "pressure", *MELTING_PRESSURE_RANGE, "Pa", _MELTING_REASON)
    temperature = np.full_like(pressure_array, _TT)
    for _ in range(_MAXIMUM_ITERATIONS):
        residual = _melting_pressure_unchecked(temperature) - pressure_array
        step = residual / _melting_pressure_slope(temperature)
        temperature = temperature - step
        if np.all(np.abs(step) <= _RELATIVE_STEP_TOLERANCE * temperature):
            break
    else:
        residual = _melting_pressure_unchecked(temperature) - pressure_array
        raise NotConvergedError(
            solver="melting_temperature Newton",
            iterations=_MAXIMUM_ITERATIONS,
            residual=float(np.max(np.abs(residual / pressure_array))),
            count=int(np.count_nonzero(np.abs(step) > _RELATIVE_STEP_TOLERANCE * temperature)),
        )
    return np.asarray(np.clip(temperature, *MELTING_TEMPERATURE_RANGE), dtype=np.float64)


def sublimation_pressure(temperature: ArrayLike) -> FloatArray:
    """Pressure on the sublimation curve of ice Ih, IAPWS R14-08(2011).

    Parameters
    ----------
    temperature : array_like
        Temperature, K, 50 K <= T <= 273.16 K.

    Returns
    -------
    ndarray
        Sublimation pressure, Pa, same shape as ``temperature`` (from about
        1.93e-40 Pa at 50 K to 611.657 Pa at the triple point).

    Raises
    ------
    InvalidInputError
        For NaN or infinite input.
    OutOfRangeError
        For a temperature outside the range (first offending element named).

    Notes
    -----
    Eq. (6): ln(p / p_t) = theta**-1 sum_{i=1..3} a_i theta**b_i,
    theta = T / T_t, T_t = 273.16 K, p_t = 611.657 Pa.

    References
    ----------
    IAPWS R14-08(2011), Revised Release on the Pressure along the Melting and
    Sublimation Curves of Ordinary Water Substance, eq. (6) and Table 2.

    Examples
    --------
    >>> round(float(sublimation_pressure(230.0)), 5)
    8.94735
    """
    temperature_array = finite_array(temperature, "temperature")
    require_within(
        temperature_array, "temperature", *SUBLIMATION_TEMPERATURE_RANGE, "K", _SUBLIMATION_REASON
    )
    log_ratio = _log_sublimation_ratio(_TT / temperature_array)
    return np.asarray(_PT * np.exp(log_ratio), dtype=np.float64)


def sublimation_temperature(pressure: ArrayLike) -> FloatArray:
    """Temperature on the sublimation curve of ice Ih at a given pressure (inverse of eq. (6)).

    Parameters
    ----------
    pressure : array_like
        Pressure, Pa, p_sub(50 K) (about 1.93e-40 Pa) <= p <= 611.657 Pa; see
        :data:`SUBLIMATION_PRESSURE_RANGE`.

    Returns
    -------
    ndarray
        Sublimation temperature, K, same shape as ``pressure``.

    Raises
    ------
    InvalidInputError
        For NaN or infinite input.
    OutOfRangeError
        For a pressure outside the range (first offending element named).
    NotConvergedError
        If the Newton iteration fails for any element (not expected).

    Notes
    -----
    Solves ln(p / p_t) = sum_i a_i x**(1 - b_i) for x = T_t / T by Newton's
    method. In x the logarithm of eq. (6) is nearly linear, which makes the
    iteration converge in a few steps from a linear first guess. Iteration
    stops once every relative step is below 1e-14; the result is limited to
    [50 K, 273.16 K] to remove round-off only.

    References
    ----------
    IAPWS R14-08(2011), eq. (6) and Table 2.

    Examples
    --------
    >>> round(float(sublimation_temperature(8.94735)), 4)
    230.0
    """
    pressure_array = finite_array(pressure, "pressure")
    require_within(
        pressure_array, "pressure", *SUBLIMATION_PRESSURE_RANGE, "Pa", _SUBLIMATION_REASON
    )
    target = np.log(pressure_array / _PT)
    largest = _TT / SUBLIMATION_MINIMUM_TEMPERATURE
    # Linear first guess about the triple point (x = 1), kept inside the range.
    inverse_theta = np.clip(
        1.0 + target / _log_sublimation_ratio_slope(np.ones_like(target)), 1.0, largest
    )
    for _ in range(_MAXIMUM_ITERATIONS):
        residual = _log_sublimation_ratio(inverse_theta) - target
        step = residual / _log_sublimation_ratio_slope(inverse_theta)
        # The guard keeps every power well defined; the root itself lies in [1, largest].
        inverse_theta = np.clip(inverse_theta - step, 0.5, 2.0 * largest)
        if np.all(np.abs(step) <= _RELATIVE_STEP_TOLERANCE * inverse_theta):
            break
    else:
        residual = _log_sublimation_ratio(inverse_theta) - target
        raise NotConvergedError(
            solver="sublimation_temperature Newton",
            iterations=_MAXIMUM_ITERATIONS,
            residual=float(np.max(np.abs(residual))),
            count=int(np.count_nonzero(np.abs(step) > _RELATIVE_STEP_TOLERANCE * inverse_theta)),
        )
    temperature = _TT / inverse_theta
    return np.asarray(np.clip(temperature, *SUBLIMATION_TEMPERATURE_RANGE), dtype=np.float64)
