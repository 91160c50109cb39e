"""Seawater and sea ice: the IAPWS R13-08 Gibbs function with IAPWS-95 water and R10-06 ice.

The specific Gibbs energy of seawater of absolute salinity S_A (kg of sea salt per kg of
seawater) is the sum of a pure-water part and a saline part (R13-08 eq. (1)),

    g(S_A, T, p) = g_W(T, p) + g_S(S_A, T, p),

with g_W from IAPWS-95 (:func:`service.core.properties.helmholtz.fluid_properties_at`, liquid
branch, metastable below the freezing point of pure water) and g_S the polynomial of R13-08
eq. (4) (:mod:`service.core.solutions.seawater_coefficients`). The chemical potential of the
water in seawater is mu_W = g - S_A (dg/dS_A); with x = sqrt(S_A / S_u),
S_A d/dS_A = (x / 2) d/dx, so its saline part is

    mu_W - g_W = g_u sum_jk [ -g_1jk x**2 / 2 + sum_(i>=2) (1 - i/2) g_ijk x**i ] tau**j pi**k.

Seawater is in equilibrium with ice Ih where mu_W(S_A, T, p) = g_ice(T, p) (R10-06); the
freezing temperature at a salinity and the brine salinity at a temperature are the two
readings of that one equation, solved by Newton's method. A bulk of salinity S_bulk at a
temperature below its freezing point is ice and brine: the salt stays in the brine, so the
ice mass fraction is w_ice = 1 - S_bulk / S_brine (no salt in the ice, no air).

References
----------
IAPWS R13-08 (2008), Release on the IAPWS Formulation 2008 for the Thermodynamic Properties
of Seawater, eqs. (1)-(4), Tables 1, 2 and 8. IAPWS R6-95(2018) (IAPWS-95). IAPWS
R10-06(2009) (ice Ih). IOC, SCOR and IAPSO (2010), The international thermodynamic equation
of seawater - 2010 (TEOS-10), Manual and Guides No. 56, Secs. 3.33 and 3.34 (freezing of
air-free seawater). Feistel, R. (2008), Deep-Sea Research I 55, 1639-1671 (the saline part
for 0-120 g/kg at normal pressure).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike

from service.core.errors import NotConvergedError, OutOfRangeError
from service.core.properties.constants import SPECIFIC_GAS_CONSTANT
from service.core.properties.helmholtz import fluid_properties_at
from service.core.properties.ice import ice_gibbs_derivatives
from service.core.properties.phase import FloatArray
from service.core.solutions.freezing import capped_freezing_step
from service.core.solutions.seawater_coefficients import (
    NORMAL_PRESSURE,
    REDUCING_PRESSURE,
    REDUCING_SALINITY,
    REDUCING_TEMPERATURE,
    SALINE_GIBBS_TERMS,
    ZERO_CELSIUS,
)
from service.core.validation import finite_array, require_within

__all__ = [
    "MAXIMUM_SALINITY",
    "SEAWATER_MODEL_REFERENCE",
    "SalineGibbsDerivatives",
    "SeawaterFreezing",
    "brine_salinity",
    "saline_gibbs_derivatives",
    "seawater_enthalpy",
    "seawater_freezing",
    "seawater_freezing_temperature",
    "seawater_log_water_activity",
]

SEAWATER_MODEL_REFERENCE: Final = (
    "Seawater: IAPWS R13-08 (2008) saline Gibbs function (the saline part of TEOS-10) with "
    "IAPWS-95 water and IAPWS R10-06 ice Ih; air-free seawater of reference composition; "
    "salt enthalpy and entropy referred to standard seawater (35.16504 g/kg) at 273.15 K and "
    "101325 Pa as R13-08 fixes them"
)

MAXIMUM_SALINITY: Final = 0.12
"""kg/kg. Highest absolute salinity of the saline Gibbs function's range (R13-08, Sec. 3:
0-120 g/kg at normal pressure, after Feistel 2008)."""

MAXIMUM_PRESSURE: Final = 1.0e8
"""Pa, highest pressure of R13-08 (100 MPa, validated up to 42 g/kg)."""

MAXIMUM_TEMPERATURE: Final = 353.0
"""K, highest temperature of R13-08 at normal pressure."""

_ROOM_TEMPERATURE_FREEZING_GUESS: Final = 54.0
"""K per (kg/kg): the freezing point falls about 0.054 K per g/kg; only to start Newton."""

_ITERATIONS: Final = 40
_TEMPERATURE_TOLERANCE: Final = 1e-10
_SALINITY_ROOT_TOLERANCE: Final = 1e-13

_I = np.array([row[0] for row in SALINE_GIBBS_TERMS])
_J = np.array([row[1] for row in SALINE_GIBBS_TERMS])
_K = np.array([row[2] for row in SALINE_GIBBS_TERMS])
_G = np.array([row[3] for row in SALINE_GIBBS_TERMS])
_LOG_TERM = _I == 1


@dataclass(frozen=True)
class SalineGibbsDerivatives:
    """The saline part g_S of the Gibbs function of seawater and its derivatives (SI).

    Attributes
    ----------
    gibbs_energy : ndarray
        g_S, J/kg.
    salinity_derivative : ndarray
        dg_S/dS_A, J/kg (S_A in kg/kg); NaN-free, infinite where S_A = 0 is excluded.
    temperature_derivative : ndarray
        dg_S/dT, J/(kg K).
    pressure_derivative : ndarray
        dg_S/dp, m3/kg.
    salinity_pressure_derivative : ndarray
        d2g_S/(dS_A dp), m3/kg.
    second_temperature_derivative : ndarray
        d2g_S/dT2, J/(kg K2).
    temperature_pressure_derivative : ndarray
        d2g_S/(dT dp), m3/(kg K).
    second_pressure_derivative : ndarray
        d2g_S/dp2, m3/(kg Pa).
    water_potential : ndarray
        g_S - S_A dg_S/dS_A, J/kg: the saline part of the chemical potential of water.
    """

    gibbs_energy: FloatArray
    salinity_derivative: FloatArray
    temperature_derivative: FloatArray
    pressure_derivative: FloatArray
    salinity_pressure_derivative: FloatArray
    second_temperature_derivative: FloatArray
    temperature_pressure_derivative: FloatArray
    second_pressure_derivative: FloatArray
    water_potential: FloatArray


def _falling(power: np.ndarray, order: int) -> np.ndarray:
    result = np.ones(power.shape)
    for step in range(order):
        result = result * (power - step)
    return result


def _series(
    x_part: FloatArray, tau: FloatArray, pi: FloatArray, tau_order: int, pi_order: int
) -> FloatArray:
    """sum g_ijk X_i d^a(tau**j) d^b(pi**k), scaled to SI by T_u**a p_u**b."""
    tau_powers = _falling(_J, tau_order) * tau[..., None] ** np.maximum(_J - tau_order, 0)
    pi_powers = _falling(_K, pi_order) * pi[..., None] ** np.maximum(_K - pi_order, 0)
    total = np.sum(_G * x_part * tau_powers * pi_powers, axis=-1)
    scale = REDUCING_TEMPERATURE**tau_order * REDUCING_PRESSURE**pi_order
    return np.asarray(total / scale, dtype=np.float64)


def _x_parts(x: FloatArray) -> dict[str, FloatArray]:
    """The salinity factors of each term: value, S-derivative, water potential, its x-slope."""
    xx = x[..., None]
    safe = np.where(xx > 0.0, xx, 1.0)
    log_x = np.log(safe)
    power = xx ** np.where(_LOG_TERM, 2, _I)
    inverse_power = np.where(xx > 0.0, safe ** (_I - 2.0), np.where(_I == 2, 1.0, 0.0))
    return {
        "value": np.where(_LOG_TERM, np.where(xx > 0.0, xx * xx * log_x, 0.0), power),
        "salinity": np.where(_LOG_TERM, 2.0 * log_x + 1.0, _I * inverse_power)
        / (2.0 * REDUCING_SALINITY),
        "water": np.where(_LOG_TERM, -0.5 * xx * xx, (1.0 - 0.5 * _I) * power),
        "water_slope": np.where(_LOG_TERM, -xx, (1.0 - 0.5 * _I) * _I * xx ** (_I - 1)),
    }


def _reduced(
    salinity: FloatArray, temperature: FloatArray, pressure: FloatArray
) -> tuple[FloatArray, FloatArray, FloatArray]:
    x = np.sqrt(salinity / REDUCING_SALINITY)
    tau = (temperature - ZERO_CELSIUS) / REDUCING_TEMPERATURE
    pi = (pressure - NORMAL_PRESSURE) / REDUCING_PRESSURE
    return x, tau, pi


def _saline(
    salinity: FloatArray, temperature: FloatArray, pressure: FloatArray
) -> SalineGibbsDerivatives:
    x, tau, pi = _reduced(salinity, temperature, pressure)
    parts = _x_parts(x)
    value = parts["value"]
    return SalineGibbsDerivatives(
        gibbs_energy=_series(value, tau, pi, 0, 0),
        salinity_derivative=_series(parts["salinity"], tau, pi, 0, 0),
        temperature_derivative=_series(value, tau, pi, 1, 0),
        pressure_derivative=_series(value, tau, pi, 0, 1),
        salinity_pressure_derivative=_series(parts["salinity"], tau, pi, 0, 1),
        second_temperature_derivative=_series(value, tau, pi, 2, 0),
        temperature_pressure_derivative=_series(value, tau, pi, 1, 1),
        second_pressure_derivative=_series(value, tau, pi, 0, 2),
        water_potential=_series(parts["water"], tau, pi, 0, 0),
    )


def _validated(
    salinity: ArrayLike, temperature: ArrayLike, pressure: ArrayLike, *, positive_salinity: bool
) -> tuple[FloatArray, FloatArray, FloatArray]:
    s = finite_array(salinity, "absolute_salinity")
    t = finite_array(temperature, "temperature")
    p = finite_array(pressure, "pressure")
    s, t, p = (np.array(a, dtype=np.float64) for a in np.broadcast_arrays(s, t, p))
    require_within(
        s,
        "absolute_salinity",
        0.0,
        MAXIMUM_SALINITY,
        "kg/kg",
        "IAPWS R13-08 covers absolute salinities up to 0.12 kg/kg (120 g/kg)",
        exclusive_minimum=positive_salinity,
    )
    require_within(
        p,
        "pressure",
        0.0,
        MAXIMUM_PRESSURE,
        "Pa",
        "IAPWS R13-08 covers pressures up to 100 MPa",
        exclusive_minimum=True,
    )
    return s, t, p


def saline_gibbs_derivatives(
    absolute_salinity: ArrayLike, temperature: ArrayLike, pressure: ArrayLike
) -> SalineGibbsDerivatives:
    """Saline part of the specific Gibbs energy of seawater and its derivatives, R13-08.

    Parameters
    ----------
    absolute_salinity : array_like
        S_A, kg/kg, 0 < S_A <= 0.12.
    temperature : array_like
        K, 250 K to 353 K (the release: 261 K, or the freezing point, to 353 K; colder
        brine is an extrapolation).
    pressure : array_like
        Pa, 0 < p <= 100 MPa. The three inputs broadcast.

    Returns
    -------
    SalineGibbsDerivatives
        g_S and its derivatives, arrays of the broadcast shape.

    Raises
    ------
    InvalidInputError
        NaN or infinite input, shapes that do not broadcast.
    OutOfRangeError
        An input outside the ranges above (first offending element).

    Notes
    -----
    R13-08 eq. (4), see the module docstring. d/dS_A = (1 / (2 S_u x)) d/dx.

    References
    ----------
    IAPWS R13-08 (2008), eq. (4), Tables 1 and 2.

    Examples
    --------
    >>> round(float(saline_gibbs_derivatives(0.03516504, 273.15, 101325.0).gibbs_energy), 6)
    -101.342742
    """
    s, t, p = _validated(absolute_salinity, temperature, pressure, positive_salinity=True)
    require_within(t, "temperature", 250.0, MAXIMUM_TEMPERATURE, "K", "R13-08 range")
    return _saline(s, t, p)


def _water_gibbs(temperature: FloatArray, pressure: FloatArray) -> tuple[FloatArray, FloatArray]:
    """Gibbs energy (J/kg) and entropy (J/(kg K)) of liquid water, IAPWS-95."""
    liquid = fluid_properties_at(temperature, pressure, phase="liquid")
    gibbs = liquid.specific_enthalpy - temperature * liquid.specific_entropy
    return np.asarray(gibbs, dtype=np.float64), liquid.specific_entropy


def _water_potential(
    salinity: FloatArray, temperature: FloatArray, pressure: FloatArray
) -> tuple[FloatArray, FloatArray, FloatArray]:
    """Saline part of mu_W and its slopes in T (J/(kg K)) and in x (J/kg)."""
    x, tau, pi = _reduced(salinity, temperature, pressure)
    parts = _x_parts(x)
    return (
        _series(parts["water"], tau, pi, 0, 0),
        _series(parts["water"], tau, pi, 1, 0),
        _series(parts["water_slope"], tau, pi, 0, 0),
    )


def _freezing_temperature(salinity: FloatArray, pressure: FloatArray) -> FloatArray:
    """Newton on mu_W(S, T, p) = g_ice(T, p) for T; inputs validated, 1-D."""
    temperature = 273.16 - _ROOM_TEMPERATURE_FREEZING_GUESS * salinity - 7.4e-8 * pressure
    step = np.full_like(temperature, np.inf)
    for _ in range(_ITERATIONS):
        water_gibbs, water_entropy = _water_gibbs(temperature, pressure)
        saline, saline_slope, _ = _water_potential(salinity, temperature, pressure)
        ice = ice_gibbs_derivatives(temperature, pressure)
        mismatch = water_gibbs + saline - ice.gibbs_energy
        slope = -water_entropy + saline_slope - ice.temperature_derivative
        step = mismatch / slope
        # capped at 273.16 K, where below 611.657 Pa the pure-water end of the line stops
        temperature, settled = capped_freezing_step(temperature, step, _TEMPERATURE_TOLERANCE)
        if settled:
            return temperature
    raise NotConvergedError(
        "freezing temperature of seawater (Newton)",
        _ITERATIONS,
        float(np.max(np.abs(step))),
        int(np.count_nonzero(np.abs(step) >= _TEMPERATURE_TOLERANCE)),
    )


def seawater_freezing_temperature(
    absolute_salinity: ArrayLike, pressure: ArrayLike = NORMAL_PRESSURE
) -> FloatArray:
    """Freezing temperature of air-free seawater, K, IAPWS R13-08 with R10-06 ice.

    Parameters
    ----------
    absolute_salinity : array_like
        S_A, kg/kg, 0 to 0.12 (0 gives the melting point of pure water at ``pressure``).
    pressure : array_like
        Pa, 0 < p <= 100 MPa (default 101325 Pa). Broadcast with the salinity.

    Returns
    -------
    ndarray
        K; about 271.23 K (-1.92 degC) for 35.16504 g/kg at 101325 Pa.

    Raises
    ------
    InvalidInputError
        NaN or infinite input.
    OutOfRangeError
        Salinity or pressure outside the range (first offending element).
    NotConvergedError
        If Newton's method does not settle (not expected in range).

    Notes
    -----
    The root T of g_W(T, p) + (g_S - S_A dg_S/dS_A)(S_A, T, p) = g_ice(T, p), Newton's method
    with slope -s_W + d(mu_W - g_W)/dT + s_ice.

    References
    ----------
    IAPWS R13-08 (2008); IAPWS R10-06(2009); IAPWS R6-95(2018); TEOS-10 Manual (2010),
    Sec. 3.33.

    Examples
    --------
    >>> round(float(seawater_freezing_temperature(0.03516504)) - 273.15, 4)
    -1.9191
    """
    s, _, p = _validated(absolute_salinity, 0.0, pressure, positive_salinity=False)
    shape = s.shape
    return _freezing_temperature(s.ravel(), p.ravel()).reshape(shape)


def _brine_salinity(temperature: FloatArray, pressure: FloatArray) -> FloatArray:
    """Newton in x = sqrt(S/S_u) on mu_W(S, T, p) = g_ice(T, p); T below freezing, 1-D."""
    water_gibbs, _ = _water_gibbs(temperature, pressure)
    ice = ice_gibbs_derivatives(temperature, pressure)
    target = ice.gibbs_energy - water_gibbs
    melting = _freezing_temperature(np.zeros_like(temperature), pressure)
    guess = np.maximum(melting - temperature, 1e-9) / _ROOM_TEMPERATURE_FREEZING_GUESS
    x = np.sqrt(guess / REDUCING_SALINITY)
    step = np.full_like(x, np.inf)
    for _ in range(_ITERATIONS):
        salinity = REDUCING_SALINITY * x * x
        saline, _, slope = _water_potential(salinity, temperature, pressure)
        step = (saline - target) / slope
        x = np.maximum(x - step, 0.5 * x)
        if np.all(np.abs(step) < _SALINITY_ROOT_TOLERANCE):
            return np.asarray(REDUCING_SALINITY * x * x, dtype=np.float64)
    raise NotConvergedError(
        "brine salinity of sea ice (Newton)",
        _ITERATIONS,
        float(np.max(np.abs(step))),
        int(np.count_nonzero(np.abs(step) >= _SALINITY_ROOT_TOLERANCE)),
    )


def _require_brine_in_range(temperature: FloatArray, pressure: FloatArray) -> None:
    lowest = _freezing_temperature(np.full(temperature.shape, MAXIMUM_SALINITY), pressure)
    below = temperature < lowest
    if np.any(below):
        index = int(np.flatnonzero(below)[0])
        raise OutOfRangeError(
            variable="temperature",
            value=float(temperature[index]),
            minimum=float(lowest[index]),
            maximum=MAXIMUM_TEMPERATURE,
            unit="K",
            reason=(
                "below this temperature the brine in equilibrium with ice would be saltier "
                "than 120 g/kg, beyond the range of IAPWS R13-08"
            ),
            index=index if temperature.size > 1 else None,
        )


def brine_salinity(temperature: ArrayLike, pressure: ArrayLike = NORMAL_PRESSURE) -> FloatArray:
    """Absolute salinity of brine in equilibrium with ice Ih, kg/kg.

    Parameters
    ----------
    temperature : array_like
        K, from the freezing point of 120 g/kg brine (about 266.2 K at 101325 Pa) up to
        the melting point of pure ice at ``pressure``.
    pressure : array_like
        Pa, 0 < p <= 100 MPa (default 101325 Pa).

    Returns
    -------
    ndarray
        S_A, kg/kg, 0 (at the melting point of pure water) to 0.12.

    Raises
    ------
    InvalidInputError
        NaN or infinite input.
    OutOfRangeError
        A temperature colder than the 120 g/kg freezing point, or warmer than the melting
        point of ice at that pressure; a pressure out of range.

    Notes
    -----
    Root of mu_W(S_A, T, p) = g_ice(T, p) in x = sqrt(S_A / S_u), Newton's method.

    References
    ----------
    IAPWS R13-08 (2008); IAPWS R10-06(2009); TEOS-10 Manual (2010), Sec. 3.34.

    Examples
    --------
    >>> round(float(brine_salinity(271.15)) * 1000, 3)
    36.583
    """
    _, t, p = _validated(0.0, temperature, pressure, positive_salinity=False)
    shape = t.shape
    t, p = t.ravel(), p.ravel()
    melting = _freezing_temperature(np.zeros_like(t), p)
    warm = t > melting
    if np.any(warm):
        index = int(np.flatnonzero(warm)[0])
        raise OutOfRangeError(
            "temperature",
            float(t[index]),
            0.0,
            float(melting[index]),
            "K",
            "brine and ice coexist only below the melting point of ice",
            index if t.size > 1 else None,
        )
    _require_brine_in_range(t, p)
    return _brine_salinity(t, p).reshape(shape)


def seawater_log_water_activity(absolute_salinity: ArrayLike, temperature: ArrayLike) -> FloatArray:
    """ln a_w of seawater, dimensionless: (mu_W - g_W) / (R T) at 101325 Pa.

    Parameters
    ----------
    absolute_salinity : array_like
        kg/kg, 0 to 0.12.
    temperature : array_like
        K, 250 K to 353 K.

    Returns
    -------
    ndarray
        ln a_w <= 0 (0 for pure water).

    Notes
    -----
    The water activity relative to pure liquid water at the same T and p (TEOS-10 Manual,
    Sec. 3.41); its pressure dependence is below 1e-5 between vacuum and 101325 Pa.

    References
    ----------
    IAPWS R13-08 (2008); TEOS-10 Manual (2010).
    """
    s, t, p = _validated(absolute_salinity, temperature, NORMAL_PRESSURE, positive_salinity=False)
    require_within(t, "temperature", 250.0, MAXIMUM_TEMPERATURE, "K", "R13-08 range")
    saline, _, _ = _water_potential(s, t, p)
    return np.asarray(saline / (SPECIFIC_GAS_CONSTANT * t), dtype=np.float64)


def seawater_enthalpy(
    absolute_salinity: ArrayLike, temperature: ArrayLike, pressure: ArrayLike = NORMAL_PRESSURE
) -> FloatArray:
    """Specific enthalpy of liquid seawater, J/kg, h = g - T dg/dT.

    Parameters
    ----------
    absolute_salinity : array_like
        kg/kg, 0 to 0.12.
    temperature : array_like
        K, 250 K to 353 K (below the freezing point: supercooled seawater).
    pressure : array_like
        Pa, 0 < p <= 100 MPa.

    Returns
    -------
    ndarray
        J/kg on the IAPWS-95 reference state for the water, R13-08's for the salt.

    References
    ----------
    IAPWS R13-08 (2008), Table 3; IAPWS R6-95(2018).
    """
    s, t, p = _validated(absolute_salinity, temperature, pressure, positive_salinity=False)
    require_within(t, "temperature", 250.0, MAXIMUM_TEMPERATURE, "K", "R13-08 range")
    return _seawater_enthalpy(s, t, p)


def _seawater_enthalpy(
    salinity: FloatArray, temperature: FloatArray, pressure: FloatArray
) -> FloatArray:
    liquid = fluid_properties_at(temperature, pressure, phase="liquid")
    saline = _saline(salinity, temperature, pressure)
    saline_enthalpy = saline.gibbs_energy - temperature * saline.temperature_derivative
    return np.asarray(liquid.specific_enthalpy + saline_enthalpy, dtype=np.float64)


@dataclass(frozen=True)
class SeawaterFreezing:
    """Ice and brine of a bulk of seawater at given temperatures (SI arrays).

    Attributes
    ----------
    temperature, pressure : ndarray
        K, Pa.
    absolute_salinity : ndarray
        Bulk S_A, kg of salt per kg of the whole mixture.
    freezing_temperature : ndarray
        K, the bulk's freezing onset at ``pressure``.
    ice_mass_fraction : ndarray
        kg of ice per kg of mixture, 0 above the freezing onset.
    brine_salinity : ndarray
        kg/kg of the unfrozen phase (the bulk salinity where no ice has formed).
    specific_enthalpy : ndarray
        J/kg of mixture: (1 - w) h_brine + w h_ice.
    log_water_activity : ndarray
        ln a_w of the unfrozen phase.
    """

    temperature: FloatArray
    pressure: FloatArray
    absolute_salinity: FloatArray
    freezing_temperature: FloatArray
    ice_mass_fraction: FloatArray
    brine_salinity: FloatArray
    specific_enthalpy: FloatArray
    log_water_activity: FloatArray


def seawater_freezing(
    absolute_salinity: ArrayLike, temperature: ArrayLike, pressure: ArrayLike = NORMAL_PRESSURE
) -> SeawaterFreezing:
    """Ice fraction, brine salinity and enthalpy of seawater at given temperatures.

    Parameters
    ----------
    absolute_salinity : array_like
        Bulk S_A, kg/kg, 0 < S_A <= 0.12.
    temperature : array_like
        K, from the freezing point of 120 g/kg brine at ``pressure`` (about 266.2 K at
        101325 Pa: the brine must stay in the release's range) to 353 K.
    pressure : array_like
        Pa, 0 < p <= 100 MPa (default 101325 Pa). The inputs broadcast.

    Returns
    -------
    SeawaterFreezing
        Arrays of the broadcast shape.

    Raises
    ------
    InvalidInputError
        NaN or infinite input.
    OutOfRangeError
        Salinity, temperature or pressure out of range (first offending element).

    Notes
    -----
    Below the freezing onset T_f(S_bulk), w_ice = 1 - S_bulk / S_brine(T) (salt balance, no
    salt in the ice), h = (1 - w_ice) h_SW(S_brine, T, p) + w_ice h_ice(T, p).

    References
    ----------
    IAPWS R13-08 (2008); IAPWS R10-06(2009); IAPWS R6-95(2018); TEOS-10 Manual (2010),
    Secs. 3.33-3.34 and Appendix (sea ice).

    Examples
    --------
    >>> result = seawater_freezing(0.035, 271.15)
    >>> round(float(result.ice_mass_fraction), 4)
    0.0433
    """
    s, t, p = _validated(absolute_salinity, temperature, pressure, positive_salinity=True)
    require_within(
        t,
        "temperature",
        0.0,
        MAXIMUM_TEMPERATURE,
        "K",
        "R13-08 covers up to 353 K",
        exclusive_minimum=True,
    )
    shape = s.shape
    s, t, p = s.ravel(), t.ravel(), p.ravel()
    onset = _freezing_temperature(s, p)
    frozen = t < onset
    brine = s.copy()
    if np.any(frozen):
        _require_brine_in_range(np.where(frozen, t, onset), p)
        brine[frozen] = _brine_salinity(t[frozen], p[frozen])
    ice_fraction = np.where(frozen, 1.0 - s / brine, 0.0)
    brine_enthalpy = _seawater_enthalpy(brine, t, p)
    ice_t = np.minimum(t, 273.16)
    ice = ice_gibbs_derivatives(ice_t, p)
    ice_enthalpy = ice.gibbs_energy - ice_t * ice.temperature_derivative
    enthalpy = np.where(
        frozen, (1.0 - ice_fraction) * brine_enthalpy + ice_fraction * ice_enthalpy, brine_enthalpy
    )
    saline, _, _ = _water_potential(brine, t, p)
    return SeawaterFreezing(
        temperature=t.reshape(shape),
        pressure=p.reshape(shape),
        absolute_salinity=s.reshape(shape),
        freezing_temperature=onset.reshape(shape),
        ice_mass_fraction=np.asarray(ice_fraction, dtype=np.float64).reshape(shape),
        brine_salinity=brine.reshape(shape),
        specific_enthalpy=np.asarray(enthalpy, dtype=np.float64).reshape(shape),
        log_water_activity=np.asarray(saline / (SPECIFIC_GAS_CONSTANT * t)).reshape(shape),
    )
