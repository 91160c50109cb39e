"""IAPWS-IF97 regions 1, 2 and 4: explicit, vectorized water and steam properties.

Implemented parts of the industrial formulation (IAPWS R7-97(2012)):

- region 4, the saturation line: :func:`if97_saturation_pressure` (Eq. 30) and
  :func:`if97_saturation_temperature` (Eq. 31), 273.15 K to 647.096 K;
- region 1, compressed and saturated liquid: :func:`if97_liquid_properties`
  (Eq. 7), 273.15 K to 623.15 K, p_sat(T) <= p <= 100 MPa;
- region 2, superheated and saturated vapor: :func:`if97_vapor_properties`
  (Eqs. 15 to 17), 273.15 K to 623.15 K for 0 < p <= p_sat(T), and 623.15 K to
  1073.15 K for 0 < p <= min(p_B23(T), 100 MPa), with the B23 boundary of Eq. 5.

Regions 3 (near-critical, above 623.15 K between the saturation line and B23) and
5 (above 1073.15 K) are not implemented; states there raise
:class:`~service.core.errors.OutOfRangeError` saying which region would be needed.

All inputs and outputs are SI (K, Pa, kg/m3, J/kg, J/(kg K), m/s). The energies use
the IF97 reference state, which follows the IAPWS-95 convention (R7-97(2012),
Sec. 5.1): the specific internal energy and specific entropy of saturated liquid at
the triple point are zero. Region 1 evaluated at 273.16 K and p_sat gives
u = -1.3e-7 J/kg and s = -6.2e-5 J/(kg K) (computed with this module), so IF97 and
IAPWS-95 energies can be compared and combined directly.
"""

from __future__ import annotations

from typing import Final, NamedTuple

import numpy as np
from numpy.typing import ArrayLike, NDArray

from service.core.errors import OutOfRangeError
from service.core.properties.constants import (
    CRITICAL_PRESSURE,
    CRITICAL_TEMPERATURE,
    SPECIFIC_GAS_CONSTANT_IF97,
)
from service.core.properties.if97_coefficients import (
    B23_COEFFICIENTS,
    REGION1_REDUCING_PRESSURE,
    REGION1_REDUCING_TEMPERATURE,
    REGION1_TERMS,
    REGION2_IDEAL_TERMS,
    REGION2_REDUCING_PRESSURE,
    REGION2_REDUCING_TEMPERATURE,
    REGION2_RESIDUAL_TERMS,
    SATURATION_COEFFICIENTS,
)
from service.core.properties.phase import FloatArray, PhaseProperties
from service.core.validation import (
    beyond_maximum,
    beyond_minimum,
    broadcast_pair,
    finite_array,
)

__all__ = [
    "IF97_MAXIMUM_PRESSURE",
    "IF97_MAXIMUM_TEMPERATURE",
    "IF97_MINIMUM_TEMPERATURE",
    "IF97_REGION1_MAXIMUM_TEMPERATURE",
    "IF97_SATURATION_MAXIMUM_PRESSURE",
    "IF97_SATURATION_MINIMUM_PRESSURE",
    "if97_b23_pressure",
    "if97_liquid_properties",
    "if97_liquid_speed_of_sound",
    "if97_saturation_pressure",
    "if97_saturation_temperature",
    "if97_vapor_properties",
    "if97_vapor_speed_of_sound",
]

IF97_MINIMUM_TEMPERATURE: Final = 273.15
"""Lowest temperature of regions 1, 2 and 4, K (R7-97(2012) Sec. 2)."""

IF97_REGION1_MAXIMUM_TEMPERATURE: Final = 623.15
"""Upper temperature of region 1 and of the saturation-bounded part of region 2, K."""

IF97_B23_MAXIMUM_TEMPERATURE: Final = 863.15
"""Temperature at which the B23 boundary reaches 100 MPa, K (R7-97(2012) Sec. 4)."""

IF97_MAXIMUM_TEMPERATURE: Final = 1073.15
"""Upper temperature of region 2, K (R7-97(2012) Sec. 2)."""

IF97_MAXIMUM_PRESSURE: Final = 100.0e6
"""Upper pressure of regions 1 and 2, Pa (R7-97(2012) Sec. 2)."""

_UNIT_PRESSURE: Final = 1.0e6  # Pa, p* of Eqs. 5, 6, 30 and 31

_SATURATION_TOLERANCE: Final = 1.0e-9
"""Relative tolerance on the saturation boundary of regions 1 and 2.

A pressure obtained from Eq. 31 and fed back into Eq. 30 (or the reverse) can miss
the boundary by a few units in the last place. States within this relative
distance of p_sat(T) are accepted and evaluated at the given (T, p) as they are;
nothing is clamped.
"""

_R: Final = SPECIFIC_GAS_CONSTANT_IF97

_REGION1_I = np.array([term[0] for term in REGION1_TERMS], dtype=np.float64)
_REGION1_J = np.array([term[1] for term in REGION1_TERMS], dtype=np.float64)
_REGION1_N = np.array([term[2] for term in REGION1_TERMS], dtype=np.float64)
_REGION2_J0 = np.array([term[0] for term in REGION2_IDEAL_TERMS], dtype=np.float64)
_REGION2_N0 = np.array([term[1] for term in REGION2_IDEAL_TERMS], dtype=np.float64)
_REGION2_I = np.array([term[0] for term in REGION2_RESIDUAL_TERMS], dtype=np.float64)
_REGION2_J = np.array([term[1] for term in REGION2_RESIDUAL_TERMS], dtype=np.float64)
_REGION2_N = np.array([term[2] for term in REGION2_RESIDUAL_TERMS], dtype=np.float64)


# --------------------------------------------------------------------------- input checks


def _first(mask: NDArray[np.bool_]) -> int | None:
    """Flat (C-order) index of the first True element, or None."""
    hits = np.flatnonzero(mask)
    return int(hits[0]) if hits.size else None


def _check_temperature(
    temperature: FloatArray, minimum: float, maximum: float, reason_low: str, reason_high: str
) -> None:
    index = _first(
        beyond_minimum(temperature, minimum, exclusive=False) | beyond_maximum(temperature, maximum)
    )
    if index is None:
        return
    value = float(temperature.reshape(-1)[index])
    raise OutOfRangeError(
        "temperature",
        value,
        minimum,
        maximum,
        "K",
        reason_low if value < minimum else reason_high,
        index if temperature.size > 1 else None,
    )


# --------------------------------------------------------------------------- region 4


def _saturation_pressure_unchecked(temperature: FloatArray) -> FloatArray:
    n = SATURATION_COEFFICIENTS
    theta = temperature + n[8] / (temperature - n[9])
    a = theta * theta + n[0] * theta + n[1]
    b = n[2] * theta * theta + n[3] * theta + n[4]
    c = n[5] * theta * theta + n[6] * theta + n[7]
    ratio = 2.0 * c / (-b + np.sqrt(b * b - 4.0 * a * c))
    result: FloatArray = _UNIT_PRESSURE * ratio**4
    return result


IF97_SATURATION_MINIMUM_PRESSURE: Final = float(
    _saturation_pressure_unchecked(np.asarray(IF97_MINIMUM_TEMPERATURE))
)
"""p_sat(273.15 K) from Eq. 30, Pa (611.212677 Pa; the release rounds it to 611.213 Pa)."""

IF97_SATURATION_MAXIMUM_PRESSURE: Final = max(
    CRITICAL_PRESSURE,
    float(_saturation_pressure_unchecked(np.asarray(CRITICAL_TEMPERATURE))),
)
"""Upper limit of Eq. 31, Pa: 22.064 MPa, or p_sat(647.096 K) from Eq. 30 if that
rounds higher (it does, by 3e-4 Pa), so that Eqs. 30 and 31 round-trip."""


def if97_saturation_pressure(temperature: ArrayLike) -> FloatArray:
    """Saturation pressure of water from the IAPWS-IF97 region 4 equation.

    Parameters
    ----------
    temperature : array_like
        Temperature, K, 273.15 <= T <= 647.096.

    Returns
    -------
    ndarray
        Saturation pressure, Pa, float64, same shape as ``temperature``.

    Raises
    ------
    InvalidInputError
        If an element is NaN or infinite, or the input is not numeric.
    OutOfRangeError
        If an element lies outside 273.15 K to 647.096 K.

    Notes
    -----
    Eq. 30 of the release, with theta = T/T* + n9 / (T/T* - n10)::

        A = theta**2 + n1 theta + n2
        B = n3 theta**2 + n4 theta + n5
        C = n6 theta**2 + n7 theta + n8
        p_sat / p* = [2 C / (-B + (B**2 - 4 A C)**0.5)]**4

    with T* = 1 K, p* = 1 MPa and n1..n10 from Table 34.

    References
    ----------
    IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation 1997 for
    the Thermodynamic Properties of Water and Steam, Sec. 8.1, Eq. 30, Table 34.

    Examples
    --------
    >>> float(if97_saturation_pressure(500.0))  # doctest: +ELLIPSIS
    2638897.7...
    """
    t = finite_array(temperature, "temperature")
    _check_temperature(
        t,
        IF97_MINIMUM_TEMPERATURE,
        CRITICAL_TEMPERATURE,
        "IAPWS-IF97 region 4 (saturation line) starts at 273.15 K",
        "IAPWS-IF97 region 4 (saturation line) ends at the critical temperature",
    )
    return _saturation_pressure_unchecked(t)


def if97_saturation_temperature(pressure: ArrayLike) -> FloatArray:
    """Saturation temperature of water from the IAPWS-IF97 region 4 backward equation.

    Parameters
    ----------
    pressure : array_like
        Pressure, Pa, p_sat(273.15 K) = 611.212677 <= p <= p_sat(647.096 K) =
        22.064e6 (to 3e-4 Pa).

    Returns
    -------
    ndarray
        Saturation temperature, K, float64, same shape as ``pressure``.

    Raises
    ------
    InvalidInputError
        If an element is NaN or infinite, or the input is not numeric.
    OutOfRangeError
        If an element lies outside the range above.

    Notes
    -----
    Eq. 31 of the release, with beta = (p/p*)**0.25::

        E = beta**2 + n3 beta + n6
        F = n1 beta**2 + n4 beta + n7
        G = n2 beta**2 + n5 beta + n8
        D = 2 G / (-F - (F**2 - 4 E G)**0.5)
        T_sat / T* = [n10 + D - ((n10 + D)**2 - 4 (n9 + n10 D))**0.5] / 2

    Eq. 31 is the exact algebraic inverse of Eq. 30, so the two agree to rounding.
    The release quotes the lower limit as 611.213 Pa; this function uses the
    unrounded p_sat(273.15 K) so that the pair of equations round-trips.

    References
    ----------
    IAPWS R7-97(2012), Sec. 8.2, Eq. 31, Table 34.

    Examples
    --------
    >>> float(if97_saturation_temperature(1.0e6))  # doctest: +ELLIPSIS
    453.03563...
    """
    p = finite_array(pressure, "pressure")
    index = _first((p < IF97_SATURATION_MINIMUM_PRESSURE) | (p > IF97_SATURATION_MAXIMUM_PRESSURE))
    if index is not None:
        raise OutOfRangeError(
            "pressure",
            float(p.reshape(-1)[index]),
            IF97_SATURATION_MINIMUM_PRESSURE,
            IF97_SATURATION_MAXIMUM_PRESSURE,
            "Pa",
            "IAPWS-IF97 region 4 (saturation line) spans p_sat(273.15 K) to the critical pressure",
            index,
        )
    n = SATURATION_COEFFICIENTS
    beta = (p / _UNIT_PRESSURE) ** 0.25
    e = beta * beta + n[2] * beta + n[5]
    f = n[0] * beta * beta + n[3] * beta + n[6]
    g = n[1] * beta * beta + n[4] * beta + n[7]
    d = 2.0 * g / (-f - np.sqrt(np.maximum(f * f - 4.0 * e * g, 0.0)))
    s = n[9] + d
    result: FloatArray = 0.5 * (s - np.sqrt(np.maximum(s * s - 4.0 * (n[8] + n[9] * d), 0.0)))
    return result


def if97_b23_pressure(temperature: ArrayLike) -> FloatArray:
    """Pressure on the boundary between IAPWS-IF97 regions 2 and 3.

    Parameters
    ----------
    temperature : array_like
        Temperature, K, 623.15 <= T <= 863.15.

    Returns
    -------
    ndarray
        Pressure on the B23 line, Pa (16.529 MPa at 623.15 K to 100 MPa at 863.15 K).

    Raises
    ------
    InvalidInputError
        If an element is NaN or infinite, or the input is not numeric.
    OutOfRangeError
        If an element lies outside 623.15 K to 863.15 K.

    Notes
    -----
    Eq. 5 of the release: p_B23 / p* = n1 + n2 (T/T*) + n3 (T/T*)**2 with p* = 1 MPa,
    T* = 1 K and n1..n3 from Table 1.

    References
    ----------
    IAPWS R7-97(2012), Sec. 4, Eq. 5, Table 1.

    Examples
    --------
    >>> float(if97_b23_pressure(623.15))  # doctest: +ELLIPSIS
    16529164.2...
    """
    t = finite_array(temperature, "temperature")
    _check_temperature(
        t,
        IF97_REGION1_MAXIMUM_TEMPERATURE,
        IF97_B23_MAXIMUM_TEMPERATURE,
        "the IAPWS-IF97 B23 boundary starts at 623.15 K",
        "the IAPWS-IF97 B23 boundary ends at 863.15 K (100 MPa)",
    )
    return _b23_pressure_unchecked(t)


def _b23_pressure_unchecked(temperature: FloatArray) -> FloatArray:
    n = B23_COEFFICIENTS
    result: FloatArray = _UNIT_PRESSURE * (n[0] + n[1] * temperature + n[2] * temperature**2)
    return result


class _GibbsDerivatives(NamedTuple):
    """Reduced variables and derivatives of gamma = g / (R T) at a set of states.

    For region 2, ``gamma`` and its derivatives are the sums of the ideal-gas and
    residual parts; ``residual_pi``, ``residual_pipi`` and ``residual_pitau`` hold
    the residual part alone (needed for the speed of sound). For region 1 they equal
    the total derivatives.
    """

    pi: FloatArray
    tau: FloatArray
    gamma: FloatArray
    gamma_pi: FloatArray
    gamma_tau: FloatArray
    gamma_tautau: FloatArray
    residual_pi: FloatArray
    residual_pipi: FloatArray
    residual_pitau: FloatArray


def _phase_properties(t: FloatArray, p: FloatArray, d: _GibbsDerivatives) -> PhaseProperties:
    """Table 3 / Table 12 relations of the release, common to regions 1 and 2."""
    rt = _R * t
    tau_gamma_tau = d.tau * d.gamma_tau
    return PhaseProperties(
        temperature=t,
        pressure=p,
        density=np.asarray(p / (d.pi * d.gamma_pi * rt), dtype=np.float64),
        specific_enthalpy=np.asarray(rt * tau_gamma_tau, dtype=np.float64),
        specific_internal_energy=np.asarray(
            rt * (tau_gamma_tau - d.pi * d.gamma_pi), dtype=np.float64
        ),
        specific_entropy=np.asarray(_R * (tau_gamma_tau - d.gamma), dtype=np.float64),
        specific_isobaric_heat_capacity=np.asarray(
            -_R * d.tau * d.tau * d.gamma_tautau, dtype=np.float64
        ),
    )


# --------------------------------------------------------------------------- region 1


def _region1_derivatives(temperature: FloatArray, pressure: FloatArray) -> _GibbsDerivatives:
    """Derivatives of the region 1 dimensionless Gibbs free energy (Eq. 7, Table 4)."""
    pi = pressure / REGION1_REDUCING_PRESSURE
    tau = REGION1_REDUCING_TEMPERATURE / temperature
    a = (7.1 - pi)[..., np.newaxis]  # > 1.05 in region 1
    b = (tau - 1.222)[..., np.newaxis]  # > 1.0 in region 1
    i, j, n = _REGION1_I, _REGION1_J, _REGION1_N
    a_i = a**i
    b_j = b**j
    a_i1 = a ** (i - 1.0)
    b_j1 = b ** (j - 1.0)
    gamma = np.sum(n * a_i * b_j, axis=-1)
    g_pi = -np.sum(n * i * a_i1 * b_j, axis=-1)
    g_pipi = np.sum(n * i * (i - 1.0) * a ** (i - 2.0) * b_j, axis=-1)
    g_tau = np.sum(n * j * a_i * b_j1, axis=-1)
    g_tautau = np.sum(n * j * (j - 1.0) * a_i * b ** (j - 2.0), axis=-1)
    g_pitau = -np.sum(n * i * j * a_i1 * b_j1, axis=-1)
    return _GibbsDerivatives(pi, tau, gamma, g_pi, g_tau, g_tautau, g_pi, g_pipi, g_pitau)


def _check_liquid_state(t: FloatArray, p: FloatArray) -> None:
    _check_temperature(
        t,
        IF97_MINIMUM_TEMPERATURE,
        IF97_REGION1_MAXIMUM_TEMPERATURE,
        "IAPWS-IF97 region 1 (liquid) starts at 273.15 K",
        "IAPWS-IF97 region 1 (liquid) ends at 623.15 K; liquid above it lies in "
        "region 3, which is not implemented",
    )
    p_sat = _saturation_pressure_unchecked(t)
    below = p < p_sat * (1.0 - _SATURATION_TOLERANCE)
    above = p > IF97_MAXIMUM_PRESSURE
    index = _first(below | above)
    if index is None:
        return
    value = float(p.reshape(-1)[index])
    minimum = float(p_sat.reshape(-1)[index])
    if bool(below.reshape(-1)[index]):
        reason = (
            f"IAPWS-IF97 region 1 (liquid) needs p >= p_sat(T) = {minimum:.10g} Pa at "
            f"T = {float(t.reshape(-1)[index]):.10g} K; below it the stable phase is "
            "vapor (region 2, if97_vapor_properties)"
        )
    else:
        reason = "IAPWS-IF97 region 1 (liquid) ends at 100 MPa"
    raise OutOfRangeError("pressure", value, minimum, IF97_MAXIMUM_PRESSURE, "Pa", reason, index)


def _prepare(temperature: ArrayLike, pressure: ArrayLike) -> tuple[FloatArray, FloatArray]:
    t = finite_array(temperature, "temperature")
    p = finite_array(pressure, "pressure")
    return broadcast_pair(t, p, "pressure")


def if97_liquid_properties(temperature: ArrayLike, pressure: ArrayLike) -> PhaseProperties:
    """Properties of liquid water from the IAPWS-IF97 region 1 Gibbs free energy.

    Parameters
    ----------
    temperature : array_like
        Temperature, K, 273.15 <= T <= 623.15.
    pressure : array_like
        Pressure, Pa, p_sat(T) <= p <= 100e6 (p_sat from Eq. 30; p equal to
        p_sat(T) gives saturated liquid). Broadcast against ``temperature``.

    Returns
    -------
    PhaseProperties
        Temperature, pressure, density, specific enthalpy, internal energy, entropy
        and isobaric heat capacity, SI, in the broadcast shape of the inputs.

    Raises
    ------
    InvalidInputError
        If an element is NaN or infinite, the input is not numeric, or the shapes do
        not broadcast.
    OutOfRangeError
        For the first element (flat index in the broadcast shape) outside region 1;
        the reason names the region that would be needed.

    Notes
    -----
    Eq. 7: g(p, T) / (R T) = gamma(pi, tau) = sum n_i (7.1 - pi)**I_i (tau - 1.222)**J_i
    with pi = p / 16.53 MPa, tau = 1386 K / T and R = 461.526 J/(kg K). The
    properties follow Table 3 of the release::

        v  = pi gamma_pi R T / p        h  = R T tau gamma_tau
        u  = R T (tau gamma_tau - pi gamma_pi)
        s  = R (tau gamma_tau - gamma)  cp = -R tau**2 gamma_tautau

    The reference state is that of IAPWS-95 (u = 0, s = 0 for saturated liquid at
    the triple point) to within the fit of Eq. 7.

    References
    ----------
    IAPWS R7-97(2012), Sec. 5.1, Eq. 7, Tables 2 to 4.

    Examples
    --------
    >>> state = if97_liquid_properties(300.0, 3.0e6)
    >>> round(float(state.specific_enthalpy), 1)
    115331.3
    """
    t, p = _prepare(temperature, pressure)
    _check_liquid_state(t, p)
    return _phase_properties(t, p, _region1_derivatives(t, p))


def if97_liquid_speed_of_sound(temperature: ArrayLike, pressure: ArrayLike) -> FloatArray:
    """Speed of sound in liquid water from IAPWS-IF97 region 1.

    Parameters
    ----------
    temperature : array_like
        Temperature, K, 273.15 <= T <= 623.15.
    pressure : array_like
        Pressure, Pa, p_sat(T) <= p <= 100e6.

    Returns
    -------
    ndarray
        Speed of sound, m/s, in the broadcast shape of the inputs.

    Raises
    ------
    InvalidInputError, OutOfRangeError
        As :func:`if97_liquid_properties`.

    Notes
    -----
    Table 3 of the release::

        w**2 = R T gamma_pi**2 / [(gamma_pi - tau gamma_pitau)**2 / (tau**2 gamma_tautau)
                                  - gamma_pipi]

    References
    ----------
    IAPWS R7-97(2012), Sec. 5.1, Table 3.

    Examples
    --------
    >>> round(float(if97_liquid_speed_of_sound(300.0, 3.0e6)), 3)
    1507.739
    """
    t, p = _prepare(temperature, pressure)
    _check_liquid_state(t, p)
    d = _region1_derivatives(t, p)
    denominator = (d.gamma_pi - d.tau * d.residual_pitau) ** 2 / (
        d.tau * d.tau * d.gamma_tautau
    ) - d.residual_pipi
    return np.asarray(np.sqrt(_R * t * d.gamma_pi**2 / denominator), dtype=np.float64)


# --------------------------------------------------------------------------- region 2


def _region2_derivatives(temperature: FloatArray, pressure: FloatArray) -> _GibbsDerivatives:
    """Derivatives of the region 2 dimensionless Gibbs free energy (Eqs. 15-17, Tables 13, 14)."""
    pi = pressure / REGION2_REDUCING_PRESSURE
    tau = REGION2_REDUCING_TEMPERATURE / temperature
    # ideal-gas part, Eq. 16
    t0 = tau[..., np.newaxis]
    j0, n0 = _REGION2_J0, _REGION2_N0
    gamma0 = np.log(pi) + np.sum(n0 * t0**j0, axis=-1)
    g0_tau = np.sum(n0 * j0 * t0 ** (j0 - 1.0), axis=-1)
    g0_tautau = np.sum(n0 * j0 * (j0 - 1.0) * t0 ** (j0 - 2.0), axis=-1)
    g0_pi = 1.0 / pi
    # residual part, Eq. 17
    a = pi[..., np.newaxis]  # > 0
    b = (tau - 0.5)[..., np.newaxis]  # > 0.003 for T <= 1073.15 K
    i, j, n = _REGION2_I, _REGION2_J, _REGION2_N
    a_i = a**i
    a_i1 = a ** (i - 1.0)
    b_j = b**j
    b_j1 = b ** (j - 1.0)
    gamma_r = np.sum(n * a_i * b_j, axis=-1)
    gr_pi = np.sum(n * i * a_i1 * b_j, axis=-1)
    gr_pipi = np.sum(n * i * (i - 1.0) * a ** (i - 2.0) * b_j, axis=-1)
    gr_tau = np.sum(n * a_i * j * b_j1, axis=-1)
    gr_tautau = np.sum(n * a_i * j * (j - 1.0) * b ** (j - 2.0), axis=-1)
    gr_pitau = np.sum(n * i * a_i1 * j * b_j1, axis=-1)
    return _GibbsDerivatives(
        pi,
        tau,
        gamma0 + gamma_r,
        g0_pi + gr_pi,
        g0_tau + gr_tau,
        g0_tautau + gr_tautau,
        gr_pi,
        gr_pipi,
        gr_pitau,
    )


def _check_vapor_state(t: FloatArray, p: FloatArray) -> None:
    _check_temperature(
        t,
        IF97_MINIMUM_TEMPERATURE,
        IF97_MAXIMUM_TEMPERATURE,
        "IAPWS-IF97 region 2 (vapor) starts at 273.15 K",
        "IAPWS-IF97 region 2 (vapor) ends at 1073.15 K; steam above it lies in "
        "region 5, which is not implemented",
    )
    nonpositive = _first(p <= 0.0)
    if nonpositive is not None:
        raise OutOfRangeError(
            "pressure",
            float(p.reshape(-1)[nonpositive]),
            0.0,
            None,
            "Pa",
            "IAPWS-IF97 region 2 (vapor) needs a pressure above zero",
            nonpositive,
        )
    low_t = t <= IF97_REGION1_MAXIMUM_TEMPERATURE
    limit = np.where(
        low_t,
        _saturation_pressure_unchecked(np.minimum(t, IF97_REGION1_MAXIMUM_TEMPERATURE))
        * (1.0 + _SATURATION_TOLERANCE),
        np.minimum(
            _b23_pressure_unchecked(np.maximum(t, IF97_REGION1_MAXIMUM_TEMPERATURE)),
            IF97_MAXIMUM_PRESSURE,
        ),
    )
    index = _first(p > limit)
    if index is None:
        return
    t_bad = float(t.reshape(-1)[index])
    maximum = float(limit.reshape(-1)[index])
    if t_bad <= IF97_REGION1_MAXIMUM_TEMPERATURE:
        maximum /= 1.0 + _SATURATION_TOLERANCE
        reason = (
            f"IAPWS-IF97 region 2 (vapor) needs p <= p_sat(T) = {maximum:.10g} Pa at "
            f"T = {t_bad:.10g} K; above it the stable phase is liquid "
            "(region 1, if97_liquid_properties)"
        )
    elif maximum < IF97_MAXIMUM_PRESSURE:
        reason = (
            f"IAPWS-IF97 region 2 (vapor) ends at the B23 boundary, p_B23(T) = "
            f"{maximum:.10g} Pa at T = {t_bad:.10g} K; above it lies region 3, which is "
            "not implemented"
        )
    else:
        reason = "IAPWS-IF97 region 2 (vapor) ends at 100 MPa"
    raise OutOfRangeError(
        "pressure", float(p.reshape(-1)[index]), 0.0, maximum, "Pa", reason, index
    )


def if97_vapor_properties(temperature: ArrayLike, pressure: ArrayLike) -> PhaseProperties:
    """Properties of water vapor from the IAPWS-IF97 region 2 Gibbs free energy.

    Parameters
    ----------
    temperature : array_like
        Temperature, K, 273.15 <= T <= 1073.15.
    pressure : array_like
        Pressure, Pa, broadcast against ``temperature``: 0 < p <= p_sat(T) for
        T <= 623.15 K (p equal to p_sat(T) gives saturated vapor); 0 < p <= p_B23(T)
        for 623.15 K < T <= 863.15 K; 0 < p <= 100e6 up to 1073.15 K.

    Returns
    -------
    PhaseProperties
        Temperature, pressure, density, specific enthalpy, internal energy, entropy
        and isobaric heat capacity, SI, in the broadcast shape of the inputs.

    Raises
    ------
    InvalidInputError
        If an element is NaN or infinite, the input is not numeric, or the shapes do
        not broadcast.
    OutOfRangeError
        For the first element (flat index in the broadcast shape) outside region 2;
        the reason names the region that would be needed (1, 3 or 5).

    Notes
    -----
    Eq. 15: g(p, T) / (R T) = gamma0(pi, tau) + gamma_r(pi, tau), pi = p / 1 MPa,
    tau = 540 K / T, with the ideal-gas part (Eq. 16, Table 10)
    gamma0 = ln(pi) + sum n0_i tau**J0_i and the residual part (Eq. 17, Table 11)
    gamma_r = sum n_i pi**I_i (tau - 0.5)**J_i. The properties follow Table 12::

        v  = pi (gamma0_pi + gamma_r_pi) R T / p
        h  = R T tau (gamma0_tau + gamma_r_tau)
        u  = R T [tau (gamma0_tau + gamma_r_tau) - pi (gamma0_pi + gamma_r_pi)]
        s  = R [tau (gamma0_tau + gamma_r_tau) - (gamma0 + gamma_r)]
        cp = -R tau**2 (gamma0_tautau + gamma_r_tautau)

    The reference state is that of IAPWS-95 (u = 0, s = 0 for saturated liquid at
    the triple point) to within the fit of Eqs. 7 and 15. The metastable-vapor
    variant of region 2 (Sec. 6.2) is not implemented.

    References
    ----------
    IAPWS R7-97(2012), Sec. 6.1, Eqs. 15 to 17, Tables 10 to 13; Sec. 4 (B23).

    Examples
    --------
    >>> state = if97_vapor_properties(700.0, 30.0e6)
    >>> round(float(state.specific_enthalpy), 1)
    2631494.7
    """
    t, p = _prepare(temperature, pressure)
    _check_vapor_state(t, p)
    return _phase_properties(t, p, _region2_derivatives(t, p))


def if97_vapor_speed_of_sound(temperature: ArrayLike, pressure: ArrayLike) -> FloatArray:
    """Speed of sound in water vapor from IAPWS-IF97 region 2.

    Parameters
    ----------
    temperature : array_like
        Temperature, K, 273.15 <= T <= 1073.15.
    pressure : array_like
        Pressure, Pa, within region 2 as for :func:`if97_vapor_properties`.

    Returns
    -------
    ndarray
        Speed of sound, m/s, in the broadcast shape of the inputs.

    Raises
    ------
    InvalidInputError, OutOfRangeError
        As :func:`if97_vapor_properties`.

    Notes
    -----
    Table 12 of the release, with gamma_r derivatives only where marked::

        w**2 = R T (1 + 2 pi gr_pi + pi**2 gr_pi**2)
               / [1 - pi**2 gr_pipi + (1 + pi gr_pi - tau pi gr_pitau)**2
                  / (tau**2 (gamma0_tautau + gr_tautau))]

    References
    ----------
    IAPWS R7-97(2012), Sec. 6.1, Table 12.

    Examples
    --------
    >>> round(float(if97_vapor_speed_of_sound(300.0, 3500.0)), 4)
    427.9202
    """
    t, p = _prepare(temperature, pressure)
    _check_vapor_state(t, p)
    d = _region2_derivatives(t, p)
    pi, tau = d.pi, d.tau
    gr_pi = d.residual_pi
    numerator = 1.0 + 2.0 * pi * gr_pi + pi * pi * gr_pi * gr_pi
    denominator = (1.0 - pi * pi * d.residual_pipi) + (
        1.0 + pi * gr_pi - tau * pi * d.residual_pitau
    ) ** 2 / (tau * tau * d.gamma_tautau)
    return np.asarray(np.sqrt(_R * t * numerator / denominator), dtype=np.float64)
