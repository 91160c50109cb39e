"""Ice Ih from the IAPWS R10-06(2009) Gibbs function.

The specific Gibbs energy of ice Ih is (R10-06 eq. (1))::

    g(T, p) = g0(p) - s0 Tt tau
              + Tt Re sum_{k=1,2} r_k [ (t_k - tau) ln(t_k - tau)
                                        + (t_k + tau) ln(t_k + tau)
                                        - 2 t_k ln t_k - tau**2 / t_k ]

with tau = T / Tt, pi = p / pt, pi0 = p0 / pt,
g0(p) = sum_{k=0..4} g0k (pi - pi0)**k, r1 constant and
r2(p) = sum_{k=0..2} r2k (pi - pi0)**k. The complex terms are evaluated in
numpy complex arithmetic and only their real parts are kept.

Because ``g00`` and ``s0`` of the 2009 revision are fixed so that ice and
IAPWS-95 liquid water coexist at the triple point, energies and entropies here
share the IAPWS-95 reference state (u = s = 0 for saturated liquid at the triple
point); there is no offset to apply.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from service.core.properties.ice_coefficients import (
    ICE_GIBBS_CONSTANT_COEFFICIENTS,
    ICE_MAXIMUM_PRESSURE,
    ICE_MAXIMUM_TEMPERATURE,
    ICE_NORMAL_PRESSURE,
    ICE_R1,
    ICE_R2_COEFFICIENTS,
    ICE_REDUCING_PRESSURE,
    ICE_REDUCING_TEMPERATURE,
    ICE_RESIDUAL_ENTROPY,
    ICE_T1,
    ICE_T2,
)
from service.core.properties.phase import FloatArray, PhaseProperties
from service.core.validation import broadcast_pair, finite_array, require_within

__all__ = [
    "IceGibbsDerivatives",
    "ice_gibbs_derivatives",
    "ice_properties",
]

_RANGE_REASON = (
    "IAPWS R10-06(2009) ice Ih is evaluated for 0 K < T <= 273.16 K and 0 Pa < p <= 210 MPa"
)


@dataclass(frozen=True)
class IceGibbsDerivatives:
    """Specific Gibbs energy of ice Ih and its partial derivatives up to order two.

    Attributes
    ----------
    temperature : ndarray
        K.
    pressure : ndarray
        Pa.
    gibbs_energy : ndarray
        g, J/kg.
    temperature_derivative : ndarray
        (dg/dT)_p, J/(kg K).
    pressure_derivative : ndarray
        (dg/dp)_T, m3/kg (the specific volume).
    second_temperature_derivative : ndarray
        (d2g/dT2)_p, J/(kg K2).
    mixed_derivative : ndarray
        d2g/(dT dp), m3/(kg K).
    second_pressure_derivative : ndarray
        (d2g/dp2)_T, m3/(kg Pa).
    """

    temperature: FloatArray
    pressure: FloatArray
    gibbs_energy: FloatArray
    temperature_derivative: FloatArray
    pressure_derivative: FloatArray
    second_temperature_derivative: FloatArray
    mixed_derivative: FloatArray
    second_pressure_derivative: FloatArray


def _validated_state(temperature: ArrayLike, pressure: ArrayLike) -> tuple[FloatArray, FloatArray]:
    temperature_array, pressure_array = broadcast_pair(
        finite_array(temperature, "temperature"), finite_array(pressure, "pressure"), "pressure"
    )
    require_within(
        temperature_array,
        "temperature",
        0.0,
        ICE_MAXIMUM_TEMPERATURE,
        "K",
        _RANGE_REASON,
        exclusive_minimum=True,
    )
    require_within(
        pressure_array,
        "pressure",
        0.0,
        ICE_MAXIMUM_PRESSURE,
        "Pa",
        _RANGE_REASON,
        exclusive_minimum=True,
    )
    return temperature_array, pressure_array


def _log_terms(
    t: complex, tau: FloatArray
) -> tuple[NDArray[np.complex128], NDArray[np.complex128], NDArray[np.complex128]]:
    """Bracket of eq. (1) for one ``t_k`` and its first two derivatives in tau.

    Returns ``(B, dB/dtau, d2B/dtau2)`` with
    B = (t - tau) ln(t - tau) + (t + tau) ln(t + tau) - 2 t ln t - tau**2 / t.
    ``t`` has a non-zero imaginary part, so no logarithm argument is ever zero
    and tau -> 0 is regular (B, dB/dtau -> 0).
    """
    minus = t - tau
    plus = t + tau
    log_minus = np.log(minus)
    log_plus = np.log(plus)
    value = minus * log_minus + plus * log_plus - 2.0 * t * np.log(t) - tau * tau / t
    first = log_plus - log_minus - 2.0 * tau / t
    # 1/(t - tau) + 1/(t + tau) - 2/t, written without cancellation as tau -> 0.
    tau_squared = tau * tau
    second = 2.0 * tau_squared / (t * (t * t - tau_squared))
    return value, first, second


def _gibbs_derivatives(temperature: FloatArray, pressure: FloatArray) -> IceGibbsDerivatives:
    """Evaluate eq. (1) and its derivatives without validating inputs."""
    tt = ICE_REDUCING_TEMPERATURE
    pt = ICE_REDUCING_PRESSURE
    tau = temperature / tt
    dpi = (pressure - ICE_NORMAL_PRESSURE) / pt

    g0c = ICE_GIBBS_CONSTANT_COEFFICIENTS
    g0 = g0c[0] + dpi * (g0c[1] + dpi * (g0c[2] + dpi * (g0c[3] + dpi * g0c[4])))
    g0_p = (g0c[1] + dpi * (2.0 * g0c[2] + dpi * (3.0 * g0c[3] + dpi * 4.0 * g0c[4]))) / pt
    g0_pp = (2.0 * g0c[2] + dpi * (6.0 * g0c[3] + dpi * 12.0 * g0c[4])) / (pt * pt)

    r2c = ICE_R2_COEFFICIENTS
    r2 = r2c[0] + dpi * (r2c[1] + dpi * r2c[2])
    r2_p = (r2c[1] + 2.0 * dpi * r2c[2]) / pt
    r2_pp = 2.0 * r2c[2] / (pt * pt)

    b1, b1_tau, b1_tautau = _log_terms(ICE_T1, tau)
    b2, b2_tau, b2_tautau = _log_terms(ICE_T2, tau)

    gibbs = g0 - ICE_RESIDUAL_ENTROPY * temperature + tt * np.real(ICE_R1 * b1 + r2 * b2)
    g_t = -ICE_RESIDUAL_ENTROPY + np.real(ICE_R1 * b1_tau + r2 * b2_tau)
    g_p = g0_p + tt * np.real(r2_p * b2)
    g_tt = np.real(ICE_R1 * b1_tautau + r2 * b2_tautau) / tt
    g_tp = np.real(r2_p * b2_tau)
    g_pp = g0_pp + tt * np.real(r2_pp * b2)

    return IceGibbsDerivatives(
        temperature=temperature,
        pressure=pressure,
        gibbs_energy=np.asarray(gibbs, dtype=np.float64),
        temperature_derivative=np.asarray(g_t, dtype=np.float64),
        pressure_derivative=np.asarray(g_p, dtype=np.float64),
        second_temperature_derivative=np.asarray(g_tt, dtype=np.float64),
        mixed_derivative=np.asarray(g_tp, dtype=np.float64),
        second_pressure_derivative=np.asarray(g_pp, dtype=np.float64),
    )


def ice_gibbs_derivatives(temperature: ArrayLike, pressure: ArrayLike) -> IceGibbsDerivatives:
    """Specific Gibbs energy of ice Ih and its derivatives, IAPWS R10-06(2009).

    Parameters
    ----------
    temperature : array_like
        Temperature, K, 0 < T <= 273.16 K.
    pressure : array_like
        Pressure, Pa, 0 < p <= 210 MPa. Broadcast against ``temperature``.

    Returns
    -------
    IceGibbsDerivatives
        g and its first and second partial derivatives in T and p (SI), arrays of
        the broadcast shape.

    Raises
    ------
    InvalidInputError
        For NaN or infinite input, or shapes that do not broadcast.
    OutOfRangeError
        For a state outside the rectangle above (first offending element named).

    Notes
    -----
    Eq. (1) of the release, see the module docstring; derivatives are taken
    analytically, e.g. (dg/dT)_p = -s0 + Re sum_k r_k [ln(t_k + tau) - ln(t_k - tau)
    - 2 tau / t_k].

    The release states validity over the whole region of stable existence of ice
    Ih, bounded by T <= 273.16 K, p <= 210 MPa and the melting and sublimation
    curves. States in the rectangle but beyond those curves (metastable ice) are
    evaluated as the release's physically reasonable extrapolation; no error and
    no warning is raised for them. T = 0 K is excluded by the range check only;
    the function is regular there, and it stays free of floating-point warnings
    for any T > 0.

    References
    ----------
    IAPWS R10-06(2009), Revised Release on the Equation of State 2006 for H2O
    Ice Ih, eq. (1), Tables 1-3.

    Examples
    --------
    >>> derivatives = ice_gibbs_derivatives(273.16, 611.657)
    >>> round(float(derivatives.gibbs_energy), 6)
    0.611784
    """
    temperature_array, pressure_array = _validated_state(temperature, pressure)
    return _gibbs_derivatives(temperature_array, pressure_array)


def ice_properties(temperature: ArrayLike, pressure: ArrayLike) -> PhaseProperties:
    """Thermodynamic properties of ice Ih, IAPWS R10-06(2009).

    Parameters
    ----------
    temperature : array_like
        Temperature, K, 0 < T <= 273.16 K.
    pressure : array_like
        Pressure, Pa, 0 < p <= 210 MPa. Broadcast against ``temperature``.

    Returns
    -------
    PhaseProperties
        Density (kg/m3), specific enthalpy and internal energy (J/kg), specific
        entropy and isobaric heat capacity (J/(kg K)), on the IAPWS-95 reference
        state.

    Raises
    ------
    InvalidInputError
        For NaN or infinite input, or shapes that do not broadcast.
    OutOfRangeError
        For a state outside 0 < T <= 273.16 K, 0 < p <= 210 MPa.

    Notes
    -----
    From the Gibbs function g(T, p) of eq. (1) (relations of R10-06 Table 3):
    rho = 1 / g_p, s = -g_T, h = g - T g_T, u = g - T g_T - p g_p,
    c_p = -T g_TT. Metastable states inside the rectangle are extrapolated
    without warning; see :func:`ice_gibbs_derivatives`.

    References
    ----------
    IAPWS R10-06(2009), Revised Release on the Equation of State 2006 for H2O
    Ice Ih, eq. (1) and Table 3.

    Examples
    --------
    >>> ice = ice_properties(100.0, 100e6)
    >>> round(float(ice.density), 6)
    941.678203
    """
    derivatives = ice_gibbs_derivatives(temperature, pressure)
    t = derivatives.temperature
    p = derivatives.pressure
    g = derivatives.gibbs_energy
    g_t = derivatives.temperature_derivative
    g_p = derivatives.pressure_derivative
    enthalpy = np.asarray(g - t * g_t, dtype=np.float64)
    return PhaseProperties(
        temperature=t,
        pressure=p,
        density=np.asarray(1.0 / g_p, dtype=np.float64),
        specific_enthalpy=enthalpy,
        specific_internal_energy=np.asarray(enthalpy - p * g_p, dtype=np.float64),
        specific_entropy=np.asarray(-g_t, dtype=np.float64),
        specific_isobaric_heat_capacity=np.asarray(
            -t * derivatives.second_temperature_derivative, dtype=np.float64
        ),
    )
